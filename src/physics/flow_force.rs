//! Steady-state (Bernoulli) flow force on a metering spool and the jet angle it
//! depends on. The force acts to close the opening.

use super::checks::{fraction, non_negative, positive, result, within};
use super::physics_error::PhysicsResult;

/// Jet angle of a sharp-edged spool with zero radial clearance, rad (the c → 0 limit
/// of the von Mises fit, 0.3663 + 0.8373 = 1.2036 rad = 68.96°).
pub const SHARP_EDGE_JET_ANGLE: f64 = 0.3663 + 0.8373;

/// Jet velocity at the vena contracta, in m/s: v = C_v·√(2·Δp/ρ).
///
/// `velocity_coefficient` (0 < C_v ≤ 1, typically 0.97–0.99), `drop_pa` (Pa),
/// `density_kg_m3` (kg/m³).
///
/// Source: Rabie 2009, eq. 2.34–2.37, p. 50; Vacca §3.8.1 (momentum form).
pub fn jet_velocity(
    velocity_coefficient: f64,
    drop_pa: f64,
    density_kg_m3: f64,
) -> PhysicsResult<f64> {
    let cv = fraction("velocity coefficient", velocity_coefficient)?;
    let drop = non_negative("pressure drop", drop_pa, "Pa")?;
    let rho = positive("density", density_kg_m3, "kg/m³")?;
    result("jet velocity", cv * (2.0 * drop / rho).sqrt())
}

/// Steady flow force on a spool, in N: F_s = 2·C_d·C_v·A₀·Δp·cos θ, acting to close.
///
/// `area_m2` the metering opening A₀ = w·x (m²), `drop_pa` (Pa), `jet_angle_rad` θ (rad,
/// 69° ≈ 1.2043 rad for sharp edges).
///
/// Source: Merritt 1967, ch. 4 (from memory for the exact section); control-volume
/// derivation Vacca §3.8.1.
pub fn steady_flow_force(
    discharge_coefficient: f64,
    velocity_coefficient: f64,
    area_m2: f64,
    drop_pa: f64,
    jet_angle_rad: f64,
) -> PhysicsResult<f64> {
    let k = flow_force_constant(discharge_coefficient, velocity_coefficient, jet_angle_rad)?;
    let area = non_negative("opening area", area_m2, "m²")?;
    let drop = non_negative("pressure drop", drop_pa, "Pa")?;
    result("flow force", k * area * drop)
}

/// Steady flow force from the jet momentum, in N: F = ρ·Q·v_jet·cos θ.
///
/// `density_kg_m3` (kg/m³), `flow_m3_s` (m³/s), `jet_velocity_m_s` (m/s), `jet_angle_rad` (rad).
///
/// Source: Vacca §3.8.1 (momentum form).
pub fn momentum_flow_force(
    density_kg_m3: f64,
    flow_m3_s: f64,
    jet_velocity_m_s: f64,
    jet_angle_rad: f64,
) -> PhysicsResult<f64> {
    let rho = positive("density", density_kg_m3, "kg/m³")?;
    let q = non_negative("flow", flow_m3_s, "m³/s")?;
    let v = non_negative("jet velocity", jet_velocity_m_s, "m/s")?;
    let theta = jet_angle(jet_angle_rad)?;
    result("flow force", rho * q * v * theta.cos())
}

/// The flow-force gain 2·C_d·C_v·cos θ, dimensionless, so that F_s = gain·w·x·Δp
/// (0.4285 for C_d 0.61, C_v 0.98, θ 69°).
///
/// Source: derived from Merritt 1967, ch. 4 (from memory for the exact section).
pub fn flow_force_constant(
    discharge_coefficient: f64,
    velocity_coefficient: f64,
    jet_angle_rad: f64,
) -> PhysicsResult<f64> {
    let cd = fraction("discharge coefficient", discharge_coefficient)?;
    let cv = fraction("velocity coefficient", velocity_coefficient)?;
    let theta = jet_angle(jet_angle_rad)?;
    Ok(2.0 * cd * cv * theta.cos())
}

/// Jet angle, in rad, for an opening `opening_m` (m) on a spool with radial clearance
/// `clearance_m` (m): θ = 0.3663 + 0.8373·(1 − exp(−h/(1.848·c))); a zero clearance
/// gives the sharp-edge limit 1.2036 rad (68.96°).
///
/// Source: von Mises fit, common practice (trade literature, no single published source).
pub fn jet_angle_for_opening(opening_m: f64, clearance_m: f64) -> PhysicsResult<f64> {
    let h = non_negative("opening", opening_m, "m")?;
    let c = non_negative("radial clearance", clearance_m, "m")?;
    if c == 0.0 {
        return Ok(SHARP_EDGE_JET_ANGLE);
    }
    result(
        "jet angle",
        0.3663 + 0.8373 * (1.0 - (-h / (1.848 * c)).exp()),
    )
}

/// A jet angle between 0 and 90° (0 to π/2 rad).
fn jet_angle(jet_angle_rad: f64) -> PhysicsResult<f64> {
    within(
        "jet angle",
        jet_angle_rad,
        0.0,
        std::f64::consts::FRAC_PI_2,
        "rad",
    )
}

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    use super::*;
    use crate::physics::geometry::periphery;
    use crate::physics::orifice::orifice_flow;
    use crate::physics::testing::*;

    fn degrees(d: f64) -> f64 {
        d.to_radians()
    }

    #[test]
    fn the_constant() {
        // derived: 2·0.61·0.98·cos 69° = 0.4285
        assert_printed(
            flow_force_constant(0.61, 0.98, degrees(69.0)).unwrap(),
            0.4285,
            4,
        );
    }

    #[test]
    fn ten_millimetre_spool_at_fifty_bar() {
        let w = periphery(0.010).unwrap();
        let area = w * 0.2e-3;
        // derived: w = 31.42 mm
        assert_printed(w * 1e3, 31.42, 2);
        let f = steady_flow_force(0.61, 0.98, area, 50.0 * BAR, degrees(69.0)).unwrap();
        // Vacca §3.8.1 (momentum form): 13.46 N
        assert_printed(f, 13.46, 2);
        // derived: shortcut 0.43·w·x·Δp = 13.51 N
        assert_printed(0.43 * area * 50.0 * BAR, 13.51, 2);
        // Vacca §3.8.1 (momentum form): Q = 24.65 L/min, v_jet = 105.1 m/s, F = 13.46 N
        let q = orifice_flow(0.61, area, 50.0 * BAR, 870.0).unwrap();
        let v = jet_velocity(0.98, 50.0 * BAR, 870.0).unwrap();
        assert_printed(q / LPM, 24.65, 2);
        assert_printed(v, 105.1, 1);
        assert_printed(
            momentum_flow_force(870.0, q, v, degrees(69.0)).unwrap(),
            13.46,
            2,
        );
    }

    #[test]
    fn jet_angle_fit() {
        // common practice (trade literature, no single published source): c → 0 gives 68.96°
        assert_printed(
            jet_angle_for_opening(1e-4, 0.0).unwrap().to_degrees(),
            68.96,
            2,
        );
        assert_printed(
            jet_angle_for_opening(1.0, 1e-9).unwrap().to_degrees(),
            68.96,
            2,
        );
        // common practice (trade literature, no single published source): h = c → 41.0°, h = 5c → 65.8°
        assert_printed(
            jet_angle_for_opening(5e-6, 5e-6).unwrap().to_degrees(),
            41.0,
            1,
        );
        assert_printed(
            jet_angle_for_opening(25e-6, 5e-6).unwrap().to_degrees(),
            65.8,
            1,
        );
    }

    #[test]
    fn bad_angle() {
        assert!(flow_force_constant(0.61, 0.98, 2.0).is_err());
        assert!(steady_flow_force(0.61, 0.98, 1e-6, -1.0, 1.2).is_err());
    }

    proptest! {
        #[test]
        fn more_drop_more_force(drop in 0.0f64..3e7, extra in 1.0f64..1e7, x in 1e-6f64..1e-3) {
            let a = steady_flow_force(0.61, 0.98, x * 0.0314, drop, 1.2).unwrap();
            let b = steady_flow_force(0.61, 0.98, x * 0.0314, drop + extra, 1.2).unwrap();
            prop_assert!(b > a);
        }
    }
}
