//! What a formula may name: the rule base's quantities with their kinds,
//! and the operating points a reading can be tagged with (`flow@loaded`).

use std::collections::{BTreeMap, BTreeSet};

use super::value_type::ValueType;
use crate::units::Kind;

/// The names a formula is checked against.
///
/// Every quantity can be read at every declared operating point, so a rule
/// can compare `flow@loaded` with `flow@unloaded` without declaring each
/// pair.
#[derive(Clone, Debug, Default)]
pub struct Environment {
    points: BTreeSet<String>,
    quantities: BTreeMap<String, (ValueType, Option<Kind>)>,
}

impl Environment {
    /// An environment with no names.
    pub fn new() -> Self {
        Environment::default()
    }

    /// Declare a quantity of `kind`, e.g. `supply_pressure` as a pressure.
    pub fn declare(&mut self, name: &str, kind: Kind) -> &mut Self {
        self.quantities
            .insert(name.to_string(), (ValueType::of_kind(kind), Some(kind)));
        self
    }

    /// Declare a name of any type, for quantities with no [`Kind`] (or
    /// true/false observations).
    pub fn declare_type(&mut self, name: &str, value_type: ValueType) -> &mut Self {
        self.quantities.insert(name.to_string(), (value_type, None));
        self
    }

    /// Declare an operating point, e.g. `loaded`.
    pub fn declare_point(&mut self, point: &str) -> &mut Self {
        self.points.insert(point.to_string());
        self
    }

    /// The type of a declared name.
    pub fn value_type(&self, name: &str) -> Option<ValueType> {
        self.quantities.get(name).map(|(t, _)| *t)
    }

    /// The kind a name was declared with, if it was declared by kind.
    pub fn kind(&self, name: &str) -> Option<Kind> {
        self.quantities.get(name).and_then(|(_, k)| *k)
    }

    /// True when `point` is a declared operating point.
    pub fn has_point(&self, point: &str) -> bool {
        self.points.contains(point)
    }

    /// The declared names, sorted.
    pub fn names(&self) -> impl Iterator<Item = &str> {
        self.quantities.keys().map(String::as_str)
    }

    /// The declared operating points, sorted.
    pub fn points(&self) -> impl Iterator<Item = &str> {
        self.points.iter().map(String::as_str)
    }
}
