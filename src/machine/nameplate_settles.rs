//! What a machine's nameplate settles on its own: every derived quantity of
//! the rule base that can be computed from the nameplate data alone, before
//! any gauge is fitted.

use serde::Serialize;

use super::MachineProfile;
use crate::rules::{Readings, RuleBase};
use crate::units::{self, Quantity, UnitSystem};

/// One derived quantity computed from the nameplate.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SettledValue {
    /// Derived quantity id.
    pub id: String,
    /// Its label.
    pub label: String,
    /// The value in the unit system asked for, e.g. `78.54 cm²`.
    pub shown: String,
    /// The SI value.
    #[serde(skip)]
    pub value: Quantity,
}

/// The derived quantities the nameplate alone settles, in rule-base order,
/// printed in `system`. Nameplate values that do not parse are left out
/// (`machine check` names them).
pub fn nameplate_settles(
    profile: &MachineProfile,
    base: &RuleBase,
    system: UnitSystem,
) -> Vec<SettledValue> {
    let (nameplate, _) = profile.nameplate_values(base);
    let mut readings = Readings::new();
    for (name, value) in &nameplate {
        readings.insert(name, *value);
    }
    let values = base.values(&readings);
    base.derived
        .iter()
        .filter_map(|d| {
            let value = *values.get(&d.entry.id)?;
            Some(SettledValue {
                id: d.entry.id.clone(),
                label: d.entry.label.clone(),
                shown: units::format(value, d.kind, system),
                value,
            })
        })
        .collect()
}
