//! Cylinder speed, flow, force balance and the pressure intensification of
//! meter-out and blocked-port conditions.

use super::checks::{finite, non_negative, positive, result};
use super::physics_error::PhysicsResult;

/// Piston speed, in m/s, for `flow_m3_s` (m³/s) into a chamber of `area_m2` (m²): v = Q/A.
///
/// Source: derived (continuity; Rabie 2009, Example 2.1, p. 60).
pub fn cylinder_speed(flow_m3_s: f64, area_m2: f64) -> PhysicsResult<f64> {
    let flow = non_negative("flow", flow_m3_s, "m³/s")?;
    let area = positive("piston area", area_m2, "m²")?;
    result("speed", flow / area)
}

/// Flow, in m³/s, that moves a piston of `area_m2` (m²) at `speed_m_s` (m/s): Q = A·v.
///
/// Source: derived (continuity; Rabie 2009, Example 2.1, p. 60).
pub fn cylinder_flow(speed_m_s: f64, area_m2: f64) -> PhysicsResult<f64> {
    let speed = non_negative("speed", speed_m_s, "m/s")?;
    let area = positive("piston area", area_m2, "m²")?;
    result("flow", speed * area)
}

/// Net force on the rod, in N, pushing out: F = p_cap·A_cap − p_rod·A_ann (no friction).
/// Pressures in Pa (gauge), areas in m².
///
/// Source: derived (force balance; Rabie 2009, Example 2.1, p. 60).
pub fn cylinder_force(
    cap_pressure_pa: f64,
    cap_area_m2: f64,
    rod_pressure_pa: f64,
    annulus_area_m2: f64,
) -> PhysicsResult<f64> {
    let p_cap = finite("cap-side pressure", cap_pressure_pa)?;
    let a_cap = positive("cap area", cap_area_m2, "m²")?;
    let p_rod = finite("rod-side pressure", rod_pressure_pa)?;
    let a_ann = positive("annulus area", annulus_area_m2, "m²")?;
    result("force", p_cap * a_cap - p_rod * a_ann)
}

/// Rod-side (back) pressure while extending with the rod side metered out, in Pa:
/// p_rod = (p_cap·A_cap − F)/A_ann.
///
/// `load_force_n` (N) is positive when it opposes extension and negative when it
/// aids it (overrunning), which raises the back pressure further. With F = 0 this
/// is the meter-out intensification p_cap·A_cap/A_ann. The result is a gauge
/// pressure and may come out negative (the annulus would cavitate).
///
/// Source: Esposito Ex. 8-6 (meter-out back pressure); force balance derived.
pub fn meter_out_back_pressure(
    cap_pressure_pa: f64,
    cap_area_m2: f64,
    annulus_area_m2: f64,
    load_force_n: f64,
) -> PhysicsResult<f64> {
    let p_cap = finite("cap-side pressure", cap_pressure_pa)?;
    let a_cap = positive("cap area", cap_area_m2, "m²")?;
    let a_ann = positive("annulus area", annulus_area_m2, "m²")?;
    let force = finite("load force", load_force_n)?;
    result("rod-side pressure", (p_cap * a_cap - force) / a_ann)
}

/// Cap-side (back) pressure while retracting with the cap side metered out, in Pa:
/// p_cap = (p_rod·A_ann − F)/A_cap.
///
/// `load_force_n` (N) is positive when it opposes retraction and negative when it
/// pulls the rod in (a suspended weight), which adds |F|/A_cap.
///
/// Source: derived (force balance; Rabie 2009, Example 2.1, p. 60).
pub fn retract_back_pressure(
    rod_pressure_pa: f64,
    annulus_area_m2: f64,
    cap_area_m2: f64,
    load_force_n: f64,
) -> PhysicsResult<f64> {
    let p_rod = finite("rod-side pressure", rod_pressure_pa)?;
    let a_ann = positive("annulus area", annulus_area_m2, "m²")?;
    let a_cap = positive("cap area", cap_area_m2, "m²")?;
    let force = finite("load force", load_force_n)?;
    result("cap-side pressure", (p_rod * a_ann - force) / a_cap)
}

/// Pressure in a closed chamber when the other side is held at `pressure_pa` (Pa) and
/// no load acts, in Pa: p_other = p·A_this/A_other (pure area ratio).
///
/// Source: derived (force balance); the intensification hazard and its use as a
/// mid-stroke leak test are common practice (trade literature, no single published source).
pub fn blocked_port_pressure(
    pressure_pa: f64,
    pressurised_area_m2: f64,
    blocked_area_m2: f64,
) -> PhysicsResult<f64> {
    let p = finite("pressure", pressure_pa)?;
    let a_this = positive("pressurised area", pressurised_area_m2, "m²")?;
    let a_other = positive("blocked-side area", blocked_area_m2, "m²")?;
    result("blocked-side pressure", p * a_this / a_other)
}

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    use super::*;
    use crate::physics::geometry::{annulus_area, circle_area};
    use crate::physics::testing::*;

    fn four_by_two_and_a_half() -> (f64, f64) {
        (
            circle_area(4.0 * INCH).unwrap(),
            annulus_area(4.0 * INCH, 2.5 * INCH).unwrap(),
        )
    }

    #[test]
    fn speeds_of_a_4_in_cylinder_on_10_gpm() {
        let (cap, ann) = four_by_two_and_a_half();
        let minute = 60.0;
        // derived: 183.82 in/min out, 301.66 in/min in
        assert_close(
            cylinder_speed(10.0 * GPM, cap).unwrap() * minute / INCH,
            183.82,
            1e-4,
        );
        assert_close(
            cylinder_speed(10.0 * GPM, ann).unwrap() * minute / INCH,
            301.66,
            1e-4,
        );
        // derived: 3.064 in/s out
        assert_printed(cylinder_speed(10.0 * GPM, cap).unwrap() / INCH, 3.064, 3);
    }

    #[test]
    fn metric_100_56_cylinder_on_40_lpm() {
        let cap = circle_area(0.100).unwrap();
        let ann = annulus_area(0.100, 0.056).unwrap();
        // derived: 0.0849 m/s out, 0.1237 m/s in
        assert_printed(cylinder_speed(40.0 * LPM, cap).unwrap(), 0.0849, 4);
        assert_printed(cylinder_speed(40.0 * LPM, ann).unwrap(), 0.1237, 4);
    }

    #[test]
    fn intensification_with_a_port_blocked() {
        let (cap, ann) = four_by_two_and_a_half();
        // derived: 1500 psi cap, rod blocked → 2461.5 psi
        assert_close(
            to_psi(blocked_port_pressure(1500.0 * PSI, cap, ann).unwrap()),
            2461.5,
            1e-4,
        );
        // derived: rod side at 1500 psi, cap port closed → 914.1 psi
        assert_printed(
            to_psi(blocked_port_pressure(1500.0 * PSI, ann, cap).unwrap()),
            914.1,
            1,
        );
        // the meter-out form with no load gives the same
        let p = meter_out_back_pressure(1500.0 * PSI, cap, ann, 0.0).unwrap();
        assert_close(to_psi(p), 2461.5, 1e-4);
    }

    // Published data whose digits happen to resemble π; they are not π.
    #[allow(clippy::approx_constant)]
    #[test]
    fn esposito_8_6_load_cases() {
        let a_cap = 3.14 * SQUARE_INCH;
        let a_ann = a_cap - 0.79 * SQUARE_INCH;
        let p = |f: f64| to_psi(meter_out_back_pressure(500.0 * PSI, a_cap, a_ann, f).unwrap());
        // Esposito Ex. 8-6: 242.6 psi opposing, 668.1 psi with F = 0, 1093.6 psi overrunning
        assert_printed(p(1000.0 * LBF), 242.6, 1);
        assert_printed(p(0.0), 668.1, 1);
        assert_printed(p(-1000.0 * LBF), 1093.6, 1);
    }

    #[test]
    fn retraction_and_force_balance_agree() {
        let (cap, ann) = four_by_two_and_a_half();
        // derived: retracting with no load the cap side sees p_rod·A_ann/A_cap
        let p_cap = retract_back_pressure(1500.0 * PSI, ann, cap, 0.0).unwrap();
        assert_printed(to_psi(p_cap), 914.1, 1);
        // and the resulting force on the rod is zero
        let f = cylinder_force(p_cap, cap, 1500.0 * PSI, ann).unwrap();
        assert!(f.abs() < 1e-6);
    }

    proptest! {
        #[test]
        fn an_aiding_load_raises_meter_out_pressure(p in 1e5f64..3e7, load in 1.0f64..1e5) {
            let (cap, ann) = four_by_two_and_a_half();
            let neutral = meter_out_back_pressure(p, cap, ann, 0.0).unwrap();
            let aiding = meter_out_back_pressure(p, cap, ann, -load).unwrap();
            prop_assert!(aiding > neutral);
            prop_assert!(neutral > p);
        }
    }
}
