//! Areas of round bores, rods and spool peripheries.

use std::f64::consts::PI;

use super::checks::{inconsistent, non_negative, positive};
use super::physics_error::PhysicsResult;

/// Area of a circle of diameter `diameter_m` (m), in m²: A = π·d²/4 (derived, geometry).
pub fn circle_area(diameter_m: f64) -> PhysicsResult<f64> {
    let d = positive("diameter", diameter_m, "m")?;
    Ok(PI * d * d / 4.0)
}

/// Annulus area between a bore `bore_m` (m) and a rod `rod_m` (m), in m²:
/// A_ann = π·(D² − d²)/4 (derived, geometry; Rabie 2009, Example 2.1, p. 60).
pub fn annulus_area(bore_m: f64, rod_m: f64) -> PhysicsResult<f64> {
    let bore = positive("bore", bore_m, "m")?;
    let rod = non_negative("rod diameter", rod_m, "m")?;
    if rod >= bore {
        return Err(inconsistent(format!(
            "rod diameter {rod} m must be smaller than the bore {bore} m"
        )));
    }
    Ok(PI * (bore * bore - rod * rod) / 4.0)
}

/// Diameter of the circle with area `area_m2` (m²), in m: d = √(4A/π) (derived, geometry).
pub fn equivalent_diameter(area_m2: f64) -> PhysicsResult<f64> {
    let area = positive("area", area_m2, "m²")?;
    Ok((4.0 * area / PI).sqrt())
}

/// Circumference of a spool of diameter `diameter_m` (m), in m: w = π·d, the port
/// width when the metering edge runs round the full periphery (derived, geometry).
pub fn periphery(diameter_m: f64) -> PhysicsResult<f64> {
    Ok(PI * positive("spool diameter", diameter_m, "m")?)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::constants::INCH;
    use crate::physics::testing::{assert_close, assert_printed, SQUARE_INCH};
    use crate::physics::PhysicsError;

    #[test]
    fn cylinder_areas_of_a_4_in_bore_with_a_2_5_in_rod() {
        // derived: A_cap 12.5664 in², A_ann 7.6576 in², ratio 1.6410
        let cap = circle_area(4.0 * INCH).unwrap() / SQUARE_INCH;
        let ann = annulus_area(4.0 * INCH, 2.5 * INCH).unwrap() / SQUARE_INCH;
        assert_close(cap, 12.5664, 1e-4);
        assert_close(ann, 7.6576, 1e-4);
        assert_printed(cap / ann, 1.6410, 4);
    }

    #[test]
    fn metric_100_56_cylinder() {
        // derived: A_cap 78.540 cm², A_ann 53.910 cm²
        assert_close(circle_area(0.100).unwrap() * 1e4, 78.540, 1e-4);
        assert_close(annulus_area(0.100, 0.056).unwrap() * 1e4, 53.910, 1e-4);
    }

    // Published data whose digits happen to resemble π; they are not π.
    #[allow(clippy::approx_constant)]
    #[test]
    fn two_millimetre_orifice() {
        // Rabie 2009, eq. 2.34–2.37, p. 50: A = 3.1416 mm²
        assert_close(circle_area(0.002).unwrap() * 1e6, 3.1416, 1e-4);
    }

    #[test]
    fn rod_wider_than_bore_is_an_error() {
        assert!(matches!(
            annulus_area(0.05, 0.06),
            Err(PhysicsError::Inconsistent { .. })
        ));
        assert!(matches!(
            circle_area(f64::NAN),
            Err(PhysicsError::NotFinite { .. })
        ));
        assert!(matches!(
            circle_area(0.0),
            Err(PhysicsError::NotPositive { .. })
        ));
    }
}
