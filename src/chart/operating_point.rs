//! Measured operating points: supply pressure, load pressure and flow taken at
//! one named point (`supply_pressure@loaded`, `load_pressure@loaded`, `flow@loaded`).

use std::collections::BTreeMap;

use crate::diagnosis::Diagnosis;
use crate::units::{Dimension, Kind, Quantity};

/// Reading names that make up a point, before the `@`.
const SUPPLY: &str = "supply_pressure";
const LOAD: &str = "load_pressure";
const FLOW: &str = "flow";

/// One measured operating point.
#[derive(Clone, Debug, PartialEq)]
pub struct OperatingPoint {
    /// Flow at the point (SI, m³/s).
    pub flow: Quantity,
    /// Load pressure at the point (SI, Pa).
    pub load: Quantity,
    /// The operating point's name, e.g. `loaded`.
    pub name: String,
    /// Supply pressure at the point (SI, Pa).
    pub supply: Quantity,
}

impl OperatingPoint {
    /// Supply minus load, Pa: what the valve has to work with.
    pub fn total_drop_pa(&self) -> f64 {
        self.supply.si() - self.load.si()
    }
}

/// Every point for which the readings hold a supply pressure, a load pressure and a
/// flow, in name order. Readings of the wrong dimension are left out.
pub fn points_from_readings(readings: &BTreeMap<String, Quantity>) -> Vec<OperatingPoint> {
    let mut parts: BTreeMap<&str, [Option<Quantity>; 3]> = BTreeMap::new();
    for (name, value) in readings {
        let Some((quantity, point)) = name.split_once('@') else {
            continue;
        };
        let (slot, dimension) = match quantity {
            SUPPLY => (0, Dimension::PRESSURE),
            LOAD => (1, Dimension::PRESSURE),
            FLOW => (2, Dimension::FLOW),
            _ => continue,
        };
        if value.dimension() == dimension && value.si().is_finite() && !point.is_empty() {
            parts.entry(point).or_default()[slot] = Some(*value);
        }
    }
    parts
        .into_iter()
        .filter_map(|(name, [supply, load, flow])| {
            Some(OperatingPoint {
                flow: flow?,
                load: load?,
                name: name.to_string(),
                supply: supply?,
            })
        })
        .collect()
}

/// The points among a diagnosis's readings (each carries its SI value and SI unit).
pub fn points_from_diagnosis(diagnosis: &Diagnosis) -> Vec<OperatingPoint> {
    let readings: BTreeMap<String, Quantity> = diagnosis
        .readings
        .iter()
        .filter_map(|r| {
            let kind = match r.name.split_once('@')?.0 {
                SUPPLY | LOAD => Kind::Pressure,
                FLOW => Kind::Flow,
                _ => return None,
            };
            // Trust the value only if its SI unit is the kind's.
            (r.unit_si == kind.dimension().to_string())
                .then(|| (r.name.clone(), Quantity::of(kind, r.value_si)))
        })
        .collect();
    points_from_readings(&readings)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn bar(x: f64) -> Quantity {
        Quantity::of(Kind::Pressure, x * 1e5)
    }

    fn lpm(x: f64) -> Quantity {
        Quantity::of(Kind::Flow, x / 60_000.0)
    }

    #[test]
    fn complete_points_only_in_name_order() {
        let readings: BTreeMap<String, Quantity> = [
            ("supply_pressure@unloaded", bar(150.0)),
            ("load_pressure@unloaded", bar(30.0)),
            ("flow@unloaded", lpm(20.0)),
            ("supply_pressure@loaded", bar(185.0)),
            ("load_pressure@loaded", bar(140.0)),
            ("flow@loaded", lpm(14.2)),
            // no flow at this point
            ("supply_pressure@idle", bar(120.0)),
            ("load_pressure@idle", bar(0.0)),
            // a flow reading of the wrong dimension is not a flow
            ("flow@odd", bar(3.0)),
            ("supply_pressure@odd", bar(3.0)),
            ("load_pressure@odd", bar(1.0)),
            ("spring_setting", bar(8.0)),
        ]
        .into_iter()
        .map(|(n, q)| (n.to_string(), q))
        .collect();
        let points = points_from_readings(&readings);
        let names: Vec<&str> = points.iter().map(|p| p.name.as_str()).collect();
        assert_eq!(names, ["loaded", "unloaded"]);
        assert!((points[0].total_drop_pa() - 45e5).abs() < 1e-6);
        assert_eq!(points[0].flow, lpm(14.2));
    }
}
