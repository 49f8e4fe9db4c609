//! Laminar leakage past a spool or piston and leakage estimated from field readings.

use std::f64::consts::PI;

use super::checks::{non_negative, positive, result, within};
use super::physics_error::PhysicsResult;

/// Laminar leakage through a concentric annular gap, in m³/s: Q_L = π·D·c³·Δp/(12·μ·L).
///
/// `diameter_m` D of the spool (m), `clearance_m` c the radial clearance (m), `length_m`
/// L of the sealing land (m), `drop_pa` (Pa), `dynamic_viscosity_pa_s` μ (Pa·s).
///
/// Source: Rabie 2009, §2, eq. 2.19, p. 44.
pub fn annular_leakage(
    diameter_m: f64,
    clearance_m: f64,
    length_m: f64,
    drop_pa: f64,
    dynamic_viscosity_pa_s: f64,
) -> PhysicsResult<f64> {
    let d = positive("diameter", diameter_m, "m")?;
    let c = positive("radial clearance", clearance_m, "m")?;
    let l = positive("land length", length_m, "m")?;
    let drop = non_negative("pressure drop", drop_pa, "Pa")?;
    let mu = positive("dynamic viscosity", dynamic_viscosity_pa_s, "Pa·s")?;
    result("leakage", PI * d * c.powi(3) * drop / (12.0 * mu * l))
}

/// Factor by which an eccentric spool leaks more than a concentric one, dimensionless:
/// 1 + 1.5·ε², with the eccentricity ratio `eccentricity` (0 centred … 1 touching; 2.5 at 1).
///
/// Source: Rabie 2009, Fig. 2.6.
pub fn eccentricity_factor(eccentricity: f64) -> PhysicsResult<f64> {
    let e = within("eccentricity ratio", eccentricity, 0.0, 1.0, "")?;
    Ok(1.0 + 1.5 * e * e)
}

/// Leakage past a piston from its drift under a held load, in m³/s: Q = v·A, with the
/// creep speed `creep_speed_m_s` (m/s) and the loaded-side area `area_m2` (m²).
///
/// Source: drift (load-settling) method, common practice (trade literature, no single
/// published source).
pub fn drift_leakage(creep_speed_m_s: f64, area_m2: f64) -> PhysicsResult<f64> {
    let v = non_negative("creep speed", creep_speed_m_s, "m/s")?;
    let a = positive("piston area", area_m2, "m²")?;
    result("leakage", v * a)
}

/// Relative rise of case flow from no load to full load, dimensionless (0.375 for +37.5 %):
/// (Q_loaded − Q_unloaded)/Q_unloaded, flows in m³/s. The pass/fail limit belongs to the
/// rule base.
///
/// Source: motor case-flow test, common practice (trade literature, no single published source).
pub fn case_flow_rise(unloaded_flow_m3_s: f64, loaded_flow_m3_s: f64) -> PhysicsResult<f64> {
    let unloaded = positive("unloaded case flow", unloaded_flow_m3_s, "m³/s")?;
    let loaded = non_negative("loaded case flow", loaded_flow_m3_s, "m³/s")?;
    result("case flow rise", (loaded - unloaded) / unloaded)
}

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    use super::*;
    use crate::physics::density::density_at_temperature;
    use crate::physics::geometry::circle_area;
    use crate::physics::testing::*;
    use crate::physics::viscosity::{dynamic_viscosity, WaltherLine};

    const CM3_PER_MIN: f64 = 1e-6 / 60.0;

    fn gap(mu: f64) -> f64 {
        annular_leakage(0.010, 5e-6, 0.010, 100.0 * BAR, mu).unwrap()
    }

    #[test]
    fn vg46_at_40_and_60_degrees() {
        // Rabie eq. 2.19: μ 39.33 / 17.39 mPa·s → 0.499 / 1.129 cm³/min
        assert_printed(gap(39.33e-3) / CM3_PER_MIN, 0.499, 3);
        assert_printed(gap(17.39e-3) / CM3_PER_MIN, 1.129, 3);
    }

    #[test]
    fn vg46_chain_from_viscosity_and_density() {
        let line = WaltherLine::through(313.15, 46.0 * CST, 373.15, 6.8 * CST).unwrap();
        let rho = |t: f64| density_at_temperature(870.0, 288.15, t, 0.0007).unwrap();
        let mu40 = dynamic_viscosity(line.viscosity_at(313.15).unwrap(), rho(313.15)).unwrap();
        let mu60 = dynamic_viscosity(line.viscosity_at(333.15).unwrap(), rho(333.15)).unwrap();
        // Rabie eq. 2.19: 0.499 → 1.129 cm³/min, ×2.26 for +20 K
        assert_printed(gap(mu40) / CM3_PER_MIN, 0.499, 3);
        assert_printed(gap(mu60) / CM3_PER_MIN, 1.129, 3);
        assert_printed(gap(mu60) / gap(mu40), 2.26, 2);
    }

    #[test]
    fn fully_eccentric_leaks_two_and_a_half_times() {
        // Rabie Fig. 2.6: up to 2.5×
        assert_close(eccentricity_factor(1.0).unwrap(), 2.5, 1e-12);
        assert!(eccentricity_factor(1.5).is_err());
    }

    #[test]
    fn drift_of_a_held_load() {
        // common practice (trade literature, no single published source): 50 mm/min on a 100 mm bore = 392.7 cm³/min
        let q = drift_leakage(0.050 / 60.0, circle_area(0.100).unwrap()).unwrap();
        assert_printed(q / CM3_PER_MIN, 392.7, 1);
        // common practice: 1 in/min on a 4 in bore = 12.57 in³/min = 0.0544 gpm
        let q = drift_leakage(INCH / 60.0, circle_area(4.0 * INCH).unwrap()).unwrap();
        assert_printed(q * 60.0 / CUBIC_INCH, 12.57, 2);
        assert_printed(to_gpm(q), 0.0544, 4);
    }

    #[test]
    fn case_flow_from_no_load_to_full_load() {
        // common practice (trade literature, no single published source): 0.8 → 1.1 gpm = +37.5 %
        assert_close(case_flow_rise(0.8 * GPM, 1.1 * GPM).unwrap(), 0.375, 1e-12);
        assert!(case_flow_rise(0.0, 1.0).is_err());
    }

    proptest! {
        #[test]
        fn thinner_oil_leaks_more(mu in 1e-3f64..0.5, factor in 0.1f64..0.99) {
            prop_assert!(gap(mu * factor) > gap(mu));
        }

        #[test]
        fn leakage_grows_with_the_cube_of_clearance(c in 1e-6f64..5e-5) {
            let a = annular_leakage(0.01, c, 0.01, 1e7, 0.04).unwrap();
            let b = annular_leakage(0.01, 2.0 * c, 0.01, 1e7, 0.04).unwrap();
            prop_assert!((b / a - 8.0).abs() < 1e-9);
        }
    }
}
