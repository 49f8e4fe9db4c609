//! The readings as printed back to the technician, with sanity warnings.

use serde::Serialize;

use crate::rules::{Readings, RuleBase};
use crate::units::{self, UnitSystem};

/// Fraction of full scale above which a gauge reading earns a warning
/// (gauges read best in the middle of their range: common practice).
const NEAR_FULL_SCALE: f64 = 0.9;

/// One reading, in the chosen units.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ReadingView {
    /// `name` or `name@point`.
    pub name: String,
    /// The quantity's label.
    pub label: String,
    /// The value in the chosen unit system, e.g. `103.4 bar`.
    pub shown: String,
    /// The SI value.
    pub value_si: f64,
    /// The SI unit, e.g. `kg·m^-1·s^-2`.
    pub unit_si: String,
    /// Out of the plausible range, near full scale.
    pub warnings: Vec<String>,
}

/// Every reading, in name order.
pub fn read_all(base: &RuleBase, readings: &Readings, system: UnitSystem) -> Vec<ReadingView> {
    let full_scale = readings.get("gauge_full_scale");
    readings
        .iter()
        .filter_map(|(name, value)| {
            let q = base.quantity_for_reading(name).ok()?;
            let mut warnings = Vec::new();
            if let Some((low, high)) = q.range {
                if value.si() < low.si() || value.si() > high.si() {
                    warnings.push(format!(
                        "outside the plausible range {} to {}: check the unit and the gauge",
                        units::format(low, q.kind, system),
                        units::format(high, q.kind, system)
                    ));
                }
            }
            if q.entry.full_scale_warning {
                if let Some(fs) = full_scale.filter(|fs| fs.si() > 0.0) {
                    if value.si() > NEAR_FULL_SCALE * fs.si() && value.si() <= fs.si() {
                        warnings.push(format!(
                            "near the gauge's full scale of {}: the reading is least accurate there",
                            units::format(fs, q.kind, system)
                        ));
                    }
                }
            }
            Some(ReadingView {
                name: name.to_string(),
                label: q.entry.label.clone(),
                shown: units::format(value, q.kind, system),
                value_si: value.si(),
                unit_si: value.dimension().to_string(),
                warnings,
            })
        })
        .collect()
}
