//! Hydraulic motor speed, flow, torque and efficiencies from displacement.
//!
//! Displacement is in m³ per revolution and shaft speed in revolutions per
//! second; a revolution is dimensionless, so D·n is a flow in m³/s.

use std::f64::consts::PI;

use super::checks::{fraction, non_negative, positive, result};
use super::physics_error::PhysicsResult;

/// Motor shaft speed, in rev/s: n = Q·η_v/D.
///
/// `flow_m3_s` supplied (m³/s), `displacement_m3_rev` (m³/rev), `volumetric_efficiency`
/// (0 < η_v ≤ 1; 1 for the theoretical speed).
///
/// Source: derived (definition of displacement); η_v as defined in ISO 4409.
pub fn motor_speed(
    flow_m3_s: f64,
    displacement_m3_rev: f64,
    volumetric_efficiency: f64,
) -> PhysicsResult<f64> {
    let flow = non_negative("flow", flow_m3_s, "m³/s")?;
    let d = positive("displacement", displacement_m3_rev, "m³/rev")?;
    let eta = fraction("volumetric efficiency", volumetric_efficiency)?;
    result("shaft speed", flow * eta / d)
}

/// Flow a motor needs to turn at `speed_rev_s` (rev/s), in m³/s: Q = n·D/η_v.
///
/// Source: derived (definition of displacement); η_v as defined in ISO 4409.
pub fn motor_flow(
    speed_rev_s: f64,
    displacement_m3_rev: f64,
    volumetric_efficiency: f64,
) -> PhysicsResult<f64> {
    let n = non_negative("shaft speed", speed_rev_s, "rev/s")?;
    let d = positive("displacement", displacement_m3_rev, "m³/rev")?;
    let eta = fraction("volumetric efficiency", volumetric_efficiency)?;
    result("flow", n * d / eta)
}

/// Motor output torque, in N·m: T = Δp·D·η_m/(2π).
///
/// `drop_pa` across the motor (Pa), `displacement_m3_rev` (m³/rev), `mechanical_efficiency`
/// (0 < η_m ≤ 1; 1 for the theoretical torque).
///
/// Source: derived (definition of displacement: work per revolution Δp·D = 2π·T).
pub fn motor_torque(
    drop_pa: f64,
    displacement_m3_rev: f64,
    mechanical_efficiency: f64,
) -> PhysicsResult<f64> {
    let drop = non_negative("pressure drop", drop_pa, "Pa")?;
    let d = positive("displacement", displacement_m3_rev, "m³/rev")?;
    let eta = fraction("mechanical efficiency", mechanical_efficiency)?;
    result("torque", drop * d * eta / (2.0 * PI))
}

/// Pressure drop a motor needs to produce `torque_n_m` (N·m), in Pa: Δp = 2π·T/(D·η_m).
///
/// Source: derived (definition of displacement).
pub fn motor_drop_for_torque(
    torque_n_m: f64,
    displacement_m3_rev: f64,
    mechanical_efficiency: f64,
) -> PhysicsResult<f64> {
    let torque = non_negative("torque", torque_n_m, "N·m")?;
    let d = positive("displacement", displacement_m3_rev, "m³/rev")?;
    let eta = fraction("mechanical efficiency", mechanical_efficiency)?;
    result("pressure drop", 2.0 * PI * torque / (d * eta))
}

/// Motor volumetric efficiency from field readings, dimensionless: η_v = n·D/Q.
///
/// Returns the ratio as measured; a value above 1 points at a wrong reading or
/// displacement rather than being clipped.
///
/// Source: definitions (ISO 4409 terms).
pub fn motor_volumetric_efficiency(
    speed_rev_s: f64,
    displacement_m3_rev: f64,
    flow_m3_s: f64,
) -> PhysicsResult<f64> {
    let n = non_negative("shaft speed", speed_rev_s, "rev/s")?;
    let d = positive("displacement", displacement_m3_rev, "m³/rev")?;
    let flow = positive("flow", flow_m3_s, "m³/s")?;
    result("volumetric efficiency", n * d / flow)
}

/// Motor mechanical (torque) efficiency from field readings, dimensionless:
/// η_m = T/(Δp·D/(2π)).
///
/// Source: definitions (ISO 4409 terms).
pub fn motor_mechanical_efficiency(
    torque_n_m: f64,
    drop_pa: f64,
    displacement_m3_rev: f64,
) -> PhysicsResult<f64> {
    let torque = non_negative("torque", torque_n_m, "N·m")?;
    let theoretical = motor_torque(
        positive("pressure drop", drop_pa, "Pa")?,
        displacement_m3_rev,
        1.0,
    )?;
    result("mechanical efficiency", torque / theoretical)
}

/// Overall efficiency, dimensionless: η_o = η_v·η_m (both as measured, ≥ 0).
///
/// Source: definitions (ISO 4409 terms).
pub fn overall_efficiency(
    volumetric_efficiency: f64,
    mechanical_efficiency: f64,
) -> PhysicsResult<f64> {
    let v = non_negative("volumetric efficiency", volumetric_efficiency, "")?;
    let m = non_negative("mechanical efficiency", mechanical_efficiency, "")?;
    result("overall efficiency", v * m)
}

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    use super::*;
    use crate::physics::testing::*;
    use crate::physics::PhysicsError;

    const LBF_IN: f64 = LBF * INCH;
    const CC: f64 = 1e-6;

    #[test]
    fn small_motor_speed() {
        // derived: 0.75 in³/rev fed 6 gpm → 1848 rpm
        let n = motor_speed(6.0 * GPM, 0.75 * CUBIC_INCH, 1.0).unwrap();
        assert_close(n / RPM, 1848.0, 1e-4);
    }

    #[test]
    fn torque_of_2_5_cubic_inches_at_2000_psi() {
        // derived: 795.77 lbf·in
        let t = motor_torque(2000.0 * PSI, 2.5 * CUBIC_INCH, 1.0).unwrap();
        assert_close(t / LBF_IN, 795.77, 1e-4);
    }

    #[test]
    fn metric_motor() {
        // derived: 100 cm³, 60 L/min, η_v .95 → 570 rpm
        let n = motor_speed(60.0 * LPM, 100.0 * CC, 0.95).unwrap();
        assert_close(n / RPM, 570.0, 1e-4);
        // derived: 200 bar → 318.31 N·m
        assert_close(
            motor_torque(200.0 * BAR, 100.0 * CC, 1.0).unwrap(),
            318.31,
            1e-4,
        );
        // derived: η_m 0.92 → 292.85 N·m
        assert_close(
            motor_torque(200.0 * BAR, 100.0 * CC, 0.92).unwrap(),
            292.85,
            1e-4,
        );
        // the inverse gives the drop back
        let drop = motor_drop_for_torque(292.85, 100.0 * CC, 0.92).unwrap();
        assert_close(drop / BAR, 200.0, 1e-4);
    }

    #[test]
    fn flow_for_a_speed() {
        // derived: 3.75 in³/rev at 1500 rpm needs 24.351 gpm
        let q = motor_flow(1500.0 * RPM, 3.75 * CUBIC_INCH, 1.0).unwrap();
        assert_close(to_gpm(q), 24.351, 1e-4);
    }

    #[test]
    fn efficiencies_from_field_readings() {
        let d = 3.0 * CUBIC_INCH;
        let eta_v = motor_volumetric_efficiency(1080.0 * RPM, d, 15.0 * GPM).unwrap();
        let eta_m = motor_mechanical_efficiency(790.0 * LBF_IN, 1750.0 * PSI, d).unwrap();
        // definitions (ISO 4409 terms): η_v .9351, η_m .9455, η_o .8841
        assert_printed(eta_v, 0.9351, 4);
        assert_printed(eta_m, 0.9455, 4);
        assert_printed(overall_efficiency(eta_v, eta_m).unwrap(), 0.8841, 4);
        // definitions: n_th = 1155 rpm, T_th = 835.6 lbf·in
        assert_close(motor_speed(15.0 * GPM, d, 1.0).unwrap() / RPM, 1155.0, 1e-4);
        assert_printed(
            motor_torque(1750.0 * PSI, d, 1.0).unwrap() / LBF_IN,
            835.6,
            1,
        );
    }

    #[test]
    fn zero_displacement_is_an_error() {
        assert!(matches!(
            motor_speed(1e-3, 0.0, 1.0),
            Err(PhysicsError::NotPositive { .. })
        ));
        assert!(matches!(
            motor_torque(1e7, 1e-4, 0.0),
            Err(PhysicsError::NotPositive { .. })
        ));
        assert!(matches!(
            motor_flow(10.0, 1e-4, 1.5),
            Err(PhysicsError::OutOfRange { .. })
        ));
    }

    proptest! {
        #[test]
        fn speed_and_flow_round_trip(q in 1e-6f64..1e-2, d in 1e-6f64..1e-3, eta in 0.5f64..1.0) {
            let n = motor_speed(q, d, eta).unwrap();
            let back = motor_flow(n, d, eta).unwrap();
            prop_assert!(((back - q) / q).abs() < 1e-12);
        }

        #[test]
        fn more_drop_more_torque(p in 1e5f64..4e7, extra in 1e3f64..1e7, d in 1e-6f64..1e-3) {
            prop_assert!(motor_torque(p + extra, d, 0.9).unwrap() > motor_torque(p, d, 0.9).unwrap());
        }
    }
}
