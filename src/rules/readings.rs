//! A set of readings keyed by quantity and operating point, and the full set
//! of values a formula sees (readings, settings, nameplate data at every
//! point, and derived quantities at every point).

use std::collections::BTreeMap;

use super::formulas::Values;
use super::RuleBase;
use crate::units::{self, Quantity};

/// Readings keyed `name` or `name@point`, each parsed with its quantity's kind.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Readings {
    values: BTreeMap<String, Quantity>,
    texts: BTreeMap<String, String>,
}

/// A reading that could not be taken in: the name and why.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct ReadingError {
    /// The reading's name as given.
    pub name: String,
    /// What is wrong.
    pub message: String,
}

impl Readings {
    /// No readings.
    pub fn new() -> Self {
        Readings::default()
    }

    /// Parse `text` as the reading `name` (`name` or `name@point`), checking
    /// the name against the vocabulary and the unit against its kind.
    pub fn insert_text(
        &mut self,
        base: &RuleBase,
        name: &str,
        text: &str,
    ) -> Result<(), ReadingError> {
        let err = |message: String| ReadingError {
            name: name.to_string(),
            message,
        };
        let def = base.quantity_for_reading(name).map_err(err)?;
        let value = units::parse_as(text, def.kind).map_err(|e| err(e.to_string()))?;
        self.values.insert(name.to_string(), value);
        self.texts.insert(name.to_string(), text.trim().to_string());
        Ok(())
    }

    /// Add a value that is already parsed.
    pub fn insert(&mut self, name: &str, value: Quantity) {
        self.values.insert(name.to_string(), value);
    }

    /// The value of a reading, if given.
    pub fn get(&self, name: &str) -> Option<Quantity> {
        self.values.get(name).copied()
    }

    /// The reading as the user typed it.
    pub fn text(&self, name: &str) -> Option<&str> {
        self.texts.get(name).map(String::as_str)
    }

    /// Every reading, in name order.
    pub fn iter(&self) -> impl Iterator<Item = (&str, Quantity)> {
        self.values.iter().map(|(k, v)| (k.as_str(), *v))
    }

    /// True when nothing was read.
    pub fn is_empty(&self) -> bool {
        self.values.is_empty()
    }

    /// Whether a reading of this name (any point) was given.
    pub fn has(&self, name: &str) -> bool {
        self.values.contains_key(name)
    }
}

impl RuleBase {
    /// Every value a formula may look up, computed from the readings:
    /// the readings themselves; settings and nameplate readings under their
    /// own name and at every operating point; derived quantities untagged and
    /// at every point (at a point, an untagged name inside a derived formula
    /// reads that point's reading, or the untagged one).
    pub fn values(&self, readings: &Readings) -> Values {
        let mut values = Values::new();
        for (id, setting) in &self.settings {
            values.insert(id.clone(), setting.value);
        }
        for (name, value) in readings.iter() {
            values.insert(name.to_string(), value);
        }
        let points: Vec<String> = self.points.iter().map(|p| p.id.clone()).collect();
        let constant: Vec<(String, Quantity)> = values
            .iter()
            .filter(|(k, _)| {
                !k.contains('@') && (self.settings.contains_key(*k) || self.is_nameplate(k))
            })
            .map(|(k, v)| (k.clone(), *v))
            .collect();
        for (name, value) in &constant {
            for p in &points {
                values.entry(format!("{name}@{p}")).or_insert(*value);
            }
        }
        // One view per point, kept in step with `values` as each derived
        // quantity is added, rather than rebuilt for every derived quantity
        // and point (which made running the examples slow).
        let mut views: Vec<(String, Values)> = points
            .iter()
            .map(|p| (p.clone(), point_view(&values, p)))
            .collect();
        for derived in &self.derived {
            let id = &derived.entry.id;
            if let Some(v) = derived.formula.evaluate_quantity(&values) {
                values.insert(id.clone(), v);
                for (_, view) in &mut views {
                    view.insert(id.clone(), v);
                }
            }
            for index in 0..views.len() {
                let (point, view) = &views[index];
                let Some(v) = derived.formula.evaluate_quantity(view) else {
                    continue;
                };
                let tagged = format!("{id}@{point}");
                values.insert(tagged.clone(), v);
                for (other, (_, view)) in views.iter_mut().enumerate() {
                    view.insert(tagged.clone(), v);
                    if other == index {
                        view.insert(id.clone(), v);
                    }
                }
            }
        }
        values
    }
}

/// The values as seen at one operating point: `name@point` also answers to
/// `name`.
fn point_view(values: &Values, point: &str) -> Values {
    let mut view = values.clone();
    let suffix = format!("@{point}");
    for (key, value) in values {
        if let Some(base) = key.strip_suffix(&suffix) {
            view.insert(base.to_string(), *value);
        }
    }
    view
}
