//! Oil compressibility in a closed volume: the volume that must enter before the
//! pressure rises, and the pressure that heating builds in trapped oil.

use super::checks::{finite, non_negative, positive, result};
use super::physics_error::PhysicsResult;

/// Volume, in m³, that must enter `volume_m3` (m³) of oil to raise its pressure by
/// `pressure_rise_pa` (Pa), and that comes back out when the pressure drops:
/// ΔV = V·Δp/β_e, with `bulk_modulus_pa` the effective bulk modulus (Pa).
///
/// Source: derived (definition of bulk modulus); the lost-volume start-up lunge is
/// common practice (trade literature, no single published source).
pub fn compressed_volume(
    volume_m3: f64,
    pressure_rise_pa: f64,
    bulk_modulus_pa: f64,
) -> PhysicsResult<f64> {
    let v = non_negative("volume", volume_m3, "m³")?;
    let dp = finite("pressure rise", pressure_rise_pa)?;
    let b = positive("bulk modulus", bulk_modulus_pa, "Pa")?;
    result("compressed volume", v * dp / b)
}

/// Pressure rise, in Pa, of oil locked in a rigid volume and heated by
/// `temperature_rise_k` (K): Δp = α·B·ΔT, with the thermal expansion coefficient
/// `expansion_per_k` (1/K) and bulk modulus `bulk_modulus_pa` (Pa).
///
/// Source: derived from Rabie 2009, §2.2.4, eq. 2.81, p. 60 (ΔV = α·V·ΔT) and the
/// definition of bulk modulus.
pub fn trapped_pressure_rise(
    temperature_rise_k: f64,
    expansion_per_k: f64,
    bulk_modulus_pa: f64,
) -> PhysicsResult<f64> {
    let dt = finite("temperature rise", temperature_rise_k)?;
    let alpha = non_negative("thermal expansion coefficient", expansion_per_k, "1/K")?;
    let b = positive("bulk modulus", bulk_modulus_pa, "Pa")?;
    result("pressure rise", alpha * b * dt)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::testing::*;

    #[test]
    fn two_litres_at_100_bar() {
        // derived: 2 L, Δp 100 bar, β_e 1.0 GPa → 20 cm³
        let dv = compressed_volume(2e-3, 100.0 * BAR, 1.0e9).unwrap();
        assert_close(dv * 1e6, 20.0, 1e-12);
    }

    #[test]
    fn heated_trapped_oil() {
        // Rabie 2009, §2.2.4, eq. 2.81, p. 60 with dp/dT = α·B: 9.8, 10.5, 12.6 bar/K
        for (b, per_k) in [(1.4e9, 9.8), (1.5e9, 10.5), (1.8e9, 12.6)] {
            assert_printed(
                trapped_pressure_rise(1.0, 0.0007, b).unwrap() / BAR,
                per_k,
                1,
            );
        }
        // common practice (trade literature, no single published source):
        // 3.0e5 psi × 0.00046/°F × 50 °F = 6900 psi
        let p = trapped_pressure_rise(50.0 / 1.8, 0.00046 * 1.8, 3.0e5 * PSI).unwrap();
        assert_close(to_psi(p), 6900.0, 1e-9);
    }

    #[test]
    fn bad_inputs() {
        assert!(compressed_volume(-1.0, 1e5, 1e9).is_err());
        assert!(compressed_volume(1.0, 1e5, 0.0).is_err());
        assert!(trapped_pressure_rise(f64::INFINITY, 7e-4, 1e9).is_err());
    }
}
