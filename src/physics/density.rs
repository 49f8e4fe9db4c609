//! Oil density against temperature and pressure, and specific gravity.

use super::checks::{finite, inconsistent, non_negative, positive, result};
use super::physics_error::PhysicsResult;

/// Density at `temperature_k` (K), in kg/m³, of an oil with density `reference_density_kg_m3`
/// (kg/m³) at `reference_temperature_k` (K): ρ(T) = ρ₀/(1 + α·(T − T₀)).
///
/// `expansion_per_k` is the volumetric thermal expansion coefficient α (1/K; about
/// 0.0007 /K for mineral oil).
///
/// Source: Rabie 2009, §2.2.4, eq. 2.81, p. 60 (ΔV = α·V·ΔT); density and SG are
/// quoted at 15 °C (60 °F) per ASTM D1298.
pub fn density_at_temperature(
    reference_density_kg_m3: f64,
    reference_temperature_k: f64,
    temperature_k: f64,
    expansion_per_k: f64,
) -> PhysicsResult<f64> {
    let rho0 = positive("reference density", reference_density_kg_m3, "kg/m³")?;
    let t0 = positive("reference temperature", reference_temperature_k, "K")?;
    let t = positive("temperature", temperature_k, "K")?;
    let alpha = non_negative("thermal expansion coefficient", expansion_per_k, "1/K")?;
    let swell = 1.0 + alpha * (t - t0);
    if swell <= 0.0 {
        return Err(inconsistent(
            "the temperature change shrinks the oil to nothing",
        ));
    }
    result("density", rho0 / swell)
}

/// Density at a pressure `pressure_rise_pa` (Pa) above the reference, in kg/m³:
/// ρ(p) ≈ ρ₀·(1 + Δp/B), with the secant bulk modulus `bulk_modulus_pa` (Pa).
///
/// Source: Vacca 2021, §2.5 (mineral oil about 0.7 % denser per 100 bar, B ≈ 1.43 GPa).
pub fn density_at_pressure(
    reference_density_kg_m3: f64,
    pressure_rise_pa: f64,
    bulk_modulus_pa: f64,
) -> PhysicsResult<f64> {
    let rho0 = positive("reference density", reference_density_kg_m3, "kg/m³")?;
    let dp = finite("pressure rise", pressure_rise_pa)?;
    let b = positive("bulk modulus", bulk_modulus_pa, "Pa")?;
    let rho = rho0 * (1.0 + dp / b);
    if rho <= 0.0 {
        return Err(inconsistent("the pressure drop exceeds the bulk modulus"));
    }
    result("density", rho)
}

/// Specific gravity, dimensionless: SG = ρ/ρ_w, with `density_kg_m3` and the reference
/// water density `water_density_kg_m3` (kg/m³; 999.0 at 60 °F, 1000 as a round value).
///
/// Source: ASTM D1298 (SG quoted at 15 °C / 60 °F).
pub fn specific_gravity(density_kg_m3: f64, water_density_kg_m3: f64) -> PhysicsResult<f64> {
    let rho = positive("density", density_kg_m3, "kg/m³")?;
    let rho_w = positive("water density", water_density_kg_m3, "kg/m³")?;
    result("specific gravity", rho / rho_w)
}

/// Density, in kg/m³, from a specific gravity: ρ = SG·ρ_w.
///
/// Source: ASTM D1298 (SG quoted at 15 °C / 60 °F).
pub fn density_from_specific_gravity(
    specific_gravity: f64,
    water_density_kg_m3: f64,
) -> PhysicsResult<f64> {
    let sg = positive("specific gravity", specific_gravity, "")?;
    let rho_w = positive("water density", water_density_kg_m3, "kg/m³")?;
    result("density", sg * rho_w)
}

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    use super::*;
    use crate::physics::testing::*;

    #[test]
    fn density_of_an_870_oil_when_warm() {
        let rho = |t: f64| density_at_temperature(870.0, 288.15, t + 273.15, 0.0007).unwrap();
        // Rabie 2009, §2.2.4, eq. 2.81, p. 60: 855.0, 843.4, 832.1 kg/m³
        assert_printed(rho(40.0), 855.0, 1);
        assert_printed(rho(60.0), 843.4, 1);
        assert_printed(rho(80.0), 832.1, 1);
    }

    #[test]
    fn density_under_pressure() {
        // Vacca §2.5: about 0.7 % denser per 100 bar, B ≈ 1.43 GPa
        let rho = density_at_pressure(870.0, 100.0 * BAR, 1.43e9).unwrap();
        assert_close(rho / 870.0 - 1.0, 0.007, 0.01);
    }

    #[test]
    fn specific_gravity_round_trip() {
        // ASTM D1298: SG 0.87 against 999.0 kg/m³ water
        let rho = density_from_specific_gravity(0.87, 999.0).unwrap();
        assert_close(rho, 869.13, 1e-12);
        assert_close(specific_gravity(rho, 999.0).unwrap(), 0.87, 1e-12);
        assert!(specific_gravity(-1.0, 999.0).is_err());
    }

    proptest! {
        #[test]
        fn hotter_is_lighter(t in 250.0f64..400.0, dt in 0.1f64..50.0) {
            let a = density_at_temperature(870.0, 288.15, t, 0.0007).unwrap();
            let b = density_at_temperature(870.0, 288.15, t + dt, 0.0007).unwrap();
            prop_assert!(b < a);
        }
    }
}
