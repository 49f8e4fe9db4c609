//! A machine profile: the circuit, its nameplate data and the gauges fitted.

use std::collections::BTreeMap;

use serde::Deserialize;

pub use crate::rules::Actuator;
use crate::rules::{Circuit, Placement, QuantitySource, RuleBase, Scalar};
use crate::units::{Quantity, UnitSystem};

/// One machine, as written in its YAML file.
#[derive(Clone, Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct MachineProfile {
    /// Cylinder or motor.
    pub actuator: Actuator,
    /// Circuit type.
    pub circuit: Circuit,
    /// Gauge points fitted (quantity ids).
    #[serde(default)]
    pub gauges: Vec<String>,
    /// Lowercase id, e.g. `press-4`.
    pub id: String,
    /// What the machine is.
    pub name: String,
    /// Nameplate data: quantity id → value with unit.
    #[serde(default)]
    pub nameplate: BTreeMap<String, Scalar>,
    /// Free text.
    #[serde(default)]
    pub notes: Option<String>,
    /// The oil in it.
    #[serde(default)]
    pub oil: Option<String>,
    /// Where the valve sits.
    pub placement: Placement,
    /// The plant it belongs to.
    #[serde(default)]
    pub plant: Option<String>,
    /// The pump, in words.
    #[serde(default)]
    pub pump: Option<String>,
    /// How results for this machine are printed.
    #[serde(default)]
    pub units: UnitSystem,
    /// Schema version (1).
    pub version: u32,
}

/// A nameplate value that does not fit the vocabulary.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct NameplateProblem {
    /// The nameplate key.
    pub name: String,
    /// What is wrong.
    pub message: String,
}

impl MachineProfile {
    /// The nameplate values parsed with their quantity kinds, and the problems found.
    pub fn nameplate_values(
        &self,
        base: &RuleBase,
    ) -> (BTreeMap<String, Quantity>, Vec<NameplateProblem>) {
        let mut values = BTreeMap::new();
        let mut problems = Vec::new();
        for (name, text) in &self.nameplate {
            let mut readings = crate::rules::Readings::new();
            match readings.insert_text(base, name, &text.0) {
                Ok(()) => {
                    if let Some(v) = readings.get(name) {
                        values.insert(name.clone(), v);
                    }
                }
                Err(e) => problems.push(NameplateProblem {
                    name: name.clone(),
                    message: e.message,
                }),
            }
        }
        for gauge in &self.gauges {
            if !base.quantities.contains_key(gauge) {
                problems.push(NameplateProblem {
                    name: gauge.clone(),
                    message: crate::rules::unknown(
                        "quantity",
                        gauge,
                        base.quantities.keys().map(String::as_str),
                    ),
                });
            }
        }
        (values, problems)
    }

    /// Every problem with the profile against the rule base's vocabulary:
    /// nameplate values that do not parse or fit their quantity, gauge
    /// points that are not quantities, gauge readings given as nameplate
    /// data, and quantities that belong to the other kind of actuator.
    pub fn problems(&self, base: &RuleBase) -> Vec<NameplateProblem> {
        let (_, mut problems) = self.nameplate_values(base);
        for name in self.nameplate.keys() {
            let Some(q) = base.quantities.get(name) else {
                continue;
            };
            if q.entry.source == QuantitySource::Gauge {
                problems.push(NameplateProblem {
                    name: name.clone(),
                    message: format!(
                        "`{name}` is a gauge reading, not nameplate data: give it as a reading \
                         (--reading {name}@loaded=...)"
                    ),
                });
            }
        }
        for name in self.nameplate.keys().chain(&self.gauges) {
            let owner = base.quantities.get(name).and_then(|q| q.entry.actuator);
            if let Some(owner) = owner.filter(|o| *o != self.actuator) {
                problems.push(NameplateProblem {
                    name: name.clone(),
                    message: format!(
                        "`{name}` belongs to a {} but this machine drives a {}",
                        owner.name(),
                        self.actuator.name()
                    ),
                });
            }
        }
        problems
    }
}
