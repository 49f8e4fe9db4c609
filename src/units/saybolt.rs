//! Saybolt Universal Seconds (SUS, SSU) and centistokes.
//!
//! ASTM D2161 relation at 100 °F (ν in cSt):
//! SUS = 4.6324·ν + (1.0 + 0.03264·ν) / ((3930.2 + 262.7ν + 23.97ν² + 1.646ν³)·10⁻⁵).
//! The inverse has no closed form; it is found by the secant method.
//! Source: ASTM D2161, as implemented in `chemicals` 1.5.2 (`Saybolt_universal_eq`).

/// The lowest SUS reading the relation covers (about 1.8 cSt; thinner oils
/// are not measured in SUS).
pub const MIN_SUS: f64 = 32.0;

/// SUS at 100 °F for a kinematic viscosity in cSt (ASTM D2161).
pub fn sus_from_cst(nu: f64) -> f64 {
    4.6324 * nu
        + (1.0 + 0.03264 * nu)
            / ((3930.2 + 262.7 * nu + 23.97 * nu * nu + 1.646 * nu.powi(3)) * 1e-5)
}

/// Kinematic viscosity in cSt for a SUS reading (inverse of ASTM D2161 by the
/// secant method). Returns `None` below [`MIN_SUS`] or for a non-finite input.
pub fn cst_from_sus(sus: f64) -> Option<f64> {
    if !sus.is_finite() || sus < MIN_SUS {
        return None;
    }
    // Start from the high-viscosity asymptote SUS ≈ 4.632·ν and a point beside it.
    let f = |nu: f64| sus_from_cst(nu) - sus;
    let mut x0 = (sus / 4.6324).max(1.0);
    let mut x1 = x0 * 1.05;
    for _ in 0..100 {
        let (f0, f1) = (f(x0), f(x1));
        if (f1 - f0).abs() < f64::EPSILON {
            break;
        }
        let x2 = (x1 - f1 * (x1 - x0) / (f1 - f0)).max(0.01);
        x0 = x1;
        x1 = x2;
        if (x1 - x0).abs() < 1e-12 * x1.abs() {
            break;
        }
    }
    (x1.is_finite() && x1 > 0.0).then_some(x1)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64, rel: f64) -> bool {
        ((a - b) / b).abs() <= rel
    }

    #[test]
    fn forward_table() {
        // ASTM D2161 via `chemicals` 1.5.2, viscosity_converter (Saybolt_universal_eq);
        // printed to 2 decimals, so half a unit in the last place.
        for (cst, sus) in [
            (10.0, 58.84),
            (22.0, 106.34),
            (32.0, 150.49),
            (46.0, 214.19),
            (68.0, 315.50),
            (100.0, 463.46),
        ] {
            assert!((sus_from_cst(cst) - sus).abs() <= 0.005, "{cst} cSt");
        }
    }

    #[test]
    fn inverse_table() {
        // ASTM D2161 inverse via `chemicals` 1.5.2; printed to 2 decimals.
        for (sus, cst) in [
            (60.0, 10.33),
            (80.0, 15.66),
            (150.0, 31.89),
            (180.0, 38.52),
            (215.0, 46.18),
        ] {
            let got = cst_from_sus(sus).unwrap();
            assert!((got - cst).abs() <= 0.005, "{sus} SUS gave {got}");
        }
    }

    #[test]
    fn round_trip_and_bounds() {
        for nu in [2.0, 5.0, 20.0, 46.0, 150.0, 1000.0] {
            assert!(close(cst_from_sus(sus_from_cst(nu)).unwrap(), nu, 1e-9));
        }
        assert_eq!(cst_from_sus(20.0), None);
        assert_eq!(cst_from_sus(f64::NAN), None);
    }
}
