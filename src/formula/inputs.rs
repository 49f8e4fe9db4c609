//! Where evaluation finds its readings.

use std::collections::{BTreeMap, HashMap};
use std::hash::BuildHasher;

use crate::units::Quantity;

/// A source of readings, keyed `name` or `name@point` (`flow@loaded`).
pub trait Inputs {
    /// The reading called `key`, if it has been taken.
    fn reading(&self, key: &str) -> Option<Quantity>;
}

impl<S: BuildHasher> Inputs for HashMap<String, Quantity, S> {
    fn reading(&self, key: &str) -> Option<Quantity> {
        self.get(key).copied()
    }
}

impl Inputs for BTreeMap<String, Quantity> {
    fn reading(&self, key: &str) -> Option<Quantity> {
        self.get(key).copied()
    }
}

impl Inputs for [(&str, Quantity)] {
    fn reading(&self, key: &str) -> Option<Quantity> {
        self.iter().find(|(k, _)| *k == key).map(|(_, q)| *q)
    }
}
