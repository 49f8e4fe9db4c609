//! Hydraulic natural frequency: the oil columns as springs against a moving mass
//! (cylinder) or a load inertia (motor).

use std::f64::consts::PI;

use super::checks::{inconsistent, non_negative, positive, result};
use super::physics_error::PhysicsResult;

/// Stiffness of one oil column, in N/m: k = β_e·A²/V, with `bulk_modulus_pa` (Pa),
/// piston area `area_m2` (m²) and the oil volume `volume_m3` (m³) up to the valve.
///
/// Source: derived (each chamber acts as a spring).
pub fn chamber_stiffness(bulk_modulus_pa: f64, area_m2: f64, volume_m3: f64) -> PhysicsResult<f64> {
    let b = positive("bulk modulus", bulk_modulus_pa, "Pa")?;
    let a = positive("piston area", area_m2, "m²")?;
    let v = positive("chamber volume", volume_m3, "m³")?;
    result("stiffness", b * a * a / v)
}

/// Oil volumes of the two chambers, in m³, with the piston at `position_m` (m) from the
/// cap end of a `stroke_m` (m) stroke: V₁ = A₁·x + V₀₁, V₂ = A₂·(S − x) + V₀₂.
/// Dead volumes (lines and valve up to each port) in m³.
///
/// Source: derived (geometry); the frequency is lowest where V₁ = V₂ (Stringer 1976).
pub fn chamber_volumes(
    cap_area_m2: f64,
    annulus_area_m2: f64,
    stroke_m: f64,
    position_m: f64,
    cap_dead_volume_m3: f64,
    rod_dead_volume_m3: f64,
) -> PhysicsResult<(f64, f64)> {
    let a1 = positive("cap area", cap_area_m2, "m²")?;
    let a2 = positive("annulus area", annulus_area_m2, "m²")?;
    let s = positive("stroke", stroke_m, "m")?;
    let x = non_negative("piston position", position_m, "m")?;
    if x > s {
        return Err(inconsistent(format!(
            "piston position {x} m is beyond the stroke {s} m"
        )));
    }
    let v01 = non_negative("cap-side dead volume", cap_dead_volume_m3, "m³")?;
    let v02 = non_negative("rod-side dead volume", rod_dead_volume_m3, "m³")?;
    Ok((a1 * x + v01, a2 * (s - x) + v02))
}

/// Undamped natural frequency, in Hz, of a stiffness `stiffness_n_m` (N/m) carrying a
/// mass `mass_kg` (kg): f_n = √(k/m)/(2π).
///
/// Source: derived (spring–mass oscillator).
pub fn natural_frequency(stiffness_n_m: f64, mass_kg: f64) -> PhysicsResult<f64> {
    let k = positive("stiffness", stiffness_n_m, "N/m")?;
    let m = positive("mass", mass_kg, "kg")?;
    result("natural frequency", (k / m).sqrt() / (2.0 * PI))
}

/// Natural frequency of a cylinder moving a mass, in Hz: k_h = β_e·(A₁²/V₁ + A₂²/V₂),
/// f_n = √(k_h/m)/(2π). Areas in m², volumes in m³ (including lines), mass in kg.
///
/// Source: derived (oil columns as parallel springs); the equal-area form
/// ω_n = √(4·β_e·A²/(V_t·m)) is Merritt 1967 (citation from memory).
pub fn cylinder_natural_frequency(
    bulk_modulus_pa: f64,
    cap_area_m2: f64,
    cap_volume_m3: f64,
    annulus_area_m2: f64,
    rod_volume_m3: f64,
    mass_kg: f64,
) -> PhysicsResult<f64> {
    let k1 = chamber_stiffness(bulk_modulus_pa, cap_area_m2, cap_volume_m3)?;
    let k2 = chamber_stiffness(bulk_modulus_pa, annulus_area_m2, rod_volume_m3)?;
    natural_frequency(result("stiffness", k1 + k2)?, mass_kg)
}

/// Natural frequency of a motor driving an inertia, in Hz: with D_m = D/(2π) (m³/rad),
/// ω_h = √(4·β_e·D_m²/(V_t·J)), half of `total_volume_m3` (m³) in each line.
/// `displacement_m3_rev` (m³/rev), `inertia_kg_m2` (kg·m²).
///
/// Source: derived (rotational analogue of the cylinder case); Merritt 1967, ch. 6 has the same
/// form (citation from memory).
pub fn motor_natural_frequency(
    bulk_modulus_pa: f64,
    displacement_m3_rev: f64,
    total_volume_m3: f64,
    inertia_kg_m2: f64,
) -> PhysicsResult<f64> {
    let b = positive("bulk modulus", bulk_modulus_pa, "Pa")?;
    let d = positive("displacement", displacement_m3_rev, "m³/rev")? / (2.0 * PI);
    let v = positive("total volume", total_volume_m3, "m³")?;
    let j = positive("inertia", inertia_kg_m2, "kg·m²")?;
    result(
        "natural frequency",
        (4.0 * b * d * d / (v * j)).sqrt() / (2.0 * PI),
    )
}

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    use super::*;
    use crate::physics::geometry::{annulus_area, circle_area};
    use crate::physics::testing::*;

    #[test]
    fn four_inch_cylinder_with_1000_lbm() {
        let a1 = circle_area(4.0 * INCH).unwrap();
        let a2 = annulus_area(4.0 * INCH, 2.5 * INCH).unwrap();
        let (v1, v2) = chamber_volumes(a1, a2, 12.0 * INCH, 6.0 * INCH, 0.0, 0.0).unwrap();
        let beta = 180_000.0 * PSI;
        let k = chamber_stiffness(beta, a1, v1).unwrap() + chamber_stiffness(beta, a2, v2).unwrap();
        // derived: k_h = 606 720 lbf/in = 1.0625e8 N/m
        assert_close(k / (LBF / INCH), 606_720.0, 1e-4);
        assert_printed(k / 1e8, 1.0625, 4);
        // derived: 77.03 Hz
        let f = cylinder_natural_frequency(beta, a1, v1, a2, v2, 1000.0 * LBM).unwrap();
        assert_printed(f, 77.03, 2);
    }

    #[test]
    fn metric_double_rod_cylinder() {
        let a = 20e-4;
        // derived: k = 2.240e7 N/m, f_n = 33.69 Hz
        let k = 2.0 * chamber_stiffness(1.4e9, a, 0.5e-3).unwrap();
        assert_close(k, 2.240e7, 1e-4);
        let f = cylinder_natural_frequency(1.4e9, a, 0.5e-3, a, 0.5e-3, 500.0).unwrap();
        assert_printed(f, 33.69, 2);
        assert_printed(f * 2.0 * PI, 211.7, 1);
    }

    #[test]
    fn motor_with_inertia() {
        // derived: 50 cm³/rev, 1 L, 0.5 kg·m², 1.2 GPa → ω_h 24.7 rad/s, 3.92 Hz
        let f = motor_natural_frequency(1.2e9, 50e-6, 1e-3, 0.5).unwrap();
        assert_printed(f, 3.92, 2);
        assert_printed(f * 2.0 * PI, 24.7, 1);
    }

    #[test]
    fn bad_geometry() {
        assert!(chamber_volumes(1e-3, 5e-4, 0.3, 0.4, 0.0, 0.0).is_err());
        assert!(natural_frequency(1e6, 0.0).is_err());
        assert!(motor_natural_frequency(1.2e9, 0.0, 1e-3, 0.5).is_err());
    }

    proptest! {
        #[test]
        fn lowest_near_equal_volumes(x in 0.01f64..0.99) {
            // Stringer 1976: for equal areas the frequency is lowest at mid-stroke
            let a = 20e-4;
            let (v1, v2) = chamber_volumes(a, a, 1.0, x, 0.0, 0.0).unwrap();
            let (m1, m2) = chamber_volumes(a, a, 1.0, 0.5, 0.0, 0.0).unwrap();
            let f = cylinder_natural_frequency(1.4e9, a, v1, a, v2, 500.0).unwrap();
            let f_mid = cylinder_natural_frequency(1.4e9, a, m1, a, m2, 500.0).unwrap();
            prop_assert!(f >= f_mid * (1.0 - 1e-12));
        }

        #[test]
        fn more_air_lower_frequency(beta in 1e8f64..2e9, drop in 0.01f64..0.9) {
            let a = 20e-4;
            let stiff = cylinder_natural_frequency(beta, a, 5e-4, a, 5e-4, 500.0).unwrap();
            let soft = cylinder_natural_frequency(beta * drop, a, 5e-4, a, 5e-4, 500.0).unwrap();
            prop_assert!(soft < stiff);
        }
    }
}
