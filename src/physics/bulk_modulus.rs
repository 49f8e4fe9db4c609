//! Effective bulk modulus of oil with entrained air and compliant lines.
//!
//! The free-air fraction is measured at atmospheric pressure and must be compressed
//! to the operating pressure before it enters the series sum; using it uncompressed
//! badly underestimates the stiffness.

use super::checks::{fraction, inconsistent, non_negative, positive, result, within};
use super::physics_error::PhysicsResult;

/// How the entrained gas is compressed.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum GasProcess {
    /// Fast compression without heat exchange: polytropic index n = 1.4.
    Adiabatic,
    /// Slow compression at constant temperature: n = 1.
    Isothermal,
}

impl GasProcess {
    /// The polytropic index n (dimensionless): 1.0 isothermal, 1.4 adiabatic.
    ///
    /// Source: derived (polytropic gas, β_g = n·p).
    pub fn polytropic_index(self) -> f64 {
        match self {
            GasProcess::Adiabatic => 1.4,
            GasProcess::Isothermal => 1.0,
        }
    }
}

/// Bulk modulus of a gas at `absolute_pressure_pa` (Pa), in Pa: β_g = n·p_abs.
///
/// Source: derived (polytropic gas); Rabie 2009, §2.2.3, eq. 2.57, p. 55.
pub fn gas_bulk_modulus(absolute_pressure_pa: f64, process: GasProcess) -> PhysicsResult<f64> {
    let p = positive("absolute pressure", absolute_pressure_pa, "Pa")?;
    Ok(process.polytropic_index() * p)
}

/// Volume fraction of free gas at `absolute_pressure_pa` (Pa), dimensionless, for an
/// oil that holds the fraction `air_fraction_at_atmosphere` (0 ≤ x₀ < 1) at
/// `atmospheric_pressure_pa` (Pa): V_g = x₀·(p_atm/p)^(1/n), fraction V_g/(V_g + 1 − x₀).
///
/// Source: derived (polytropic gas law applied to the free air).
pub fn gas_fraction_at_pressure(
    air_fraction_at_atmosphere: f64,
    atmospheric_pressure_pa: f64,
    absolute_pressure_pa: f64,
    process: GasProcess,
) -> PhysicsResult<f64> {
    let x0 = within("air fraction", air_fraction_at_atmosphere, 0.0, 1.0, "")?;
    if x0 >= 1.0 {
        return Err(inconsistent(
            "the air fraction must be below 1 (some oil must be present)",
        ));
    }
    let p_atm = positive("atmospheric pressure", atmospheric_pressure_pa, "Pa")?;
    let p = positive("absolute pressure", absolute_pressure_pa, "Pa")?;
    let gas = x0 * (p_atm / p).powf(1.0 / process.polytropic_index());
    result("gas fraction", gas / (gas + 1.0 - x0))
}

/// Bulk modulus of a thin-walled tube, in Pa: β_c ≈ E·t/D, with Young's modulus
/// `young_modulus_pa` (Pa), wall thickness `wall_m` (m) and inside diameter `diameter_m` (m).
///
/// Source: derived (hoop strain of a thin-walled tube, axial strain neglected).
pub fn tube_bulk_modulus(
    young_modulus_pa: f64,
    wall_m: f64,
    diameter_m: f64,
) -> PhysicsResult<f64> {
    let e = positive("young's modulus", young_modulus_pa, "Pa")?;
    let t = positive("wall thickness", wall_m, "m")?;
    let d = positive("inside diameter", diameter_m, "m")?;
    result("container bulk modulus", e * t / d)
}

/// What the effective bulk modulus depends on.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct BulkModulusInputs {
    /// Free (entrained) air as a volume fraction of the mixture at atmospheric pressure, 0 ≤ x₀ < 1.
    pub air_fraction_at_atmosphere: f64,
    /// Local atmospheric pressure, Pa (101 325 Pa for the standard atmosphere).
    pub atmospheric_pressure_pa: f64,
    /// Bulk modulus of the container (hose, tube), Pa; `None` for a rigid container.
    pub container_pa: Option<f64>,
    /// Operating pressure above atmospheric, Pa.
    pub gauge_pressure_pa: f64,
    /// Bulk modulus of the air-free oil, Pa (about 1.5 GPa for mineral oil).
    pub liquid_pa: f64,
    /// How the gas is compressed.
    pub process: GasProcess,
}

/// Effective bulk modulus, in Pa, with compliances in series:
/// 1/β_e = 1/β_c + 1/β_l + (V_g/V_t)·(1/β_g), where V_g/V_t is the free-air fraction
/// compressed to the operating pressure and β_g = n·p_abs.
///
/// Source: derived (series form); the same form is in
/// Merritt 1967, ch. 2 (from memory); Rabie 2009, §2.2.3, eq. 2.57, p. 55 for the
/// gas–liquid mixture.
pub fn effective_bulk_modulus(inputs: &BulkModulusInputs) -> PhysicsResult<f64> {
    let liquid = positive("oil bulk modulus", inputs.liquid_pa, "Pa")?;
    let p_atm = positive("atmospheric pressure", inputs.atmospheric_pressure_pa, "Pa")?;
    let gauge = super::checks::finite("gauge pressure", inputs.gauge_pressure_pa)?;
    let p_abs = gauge + p_atm;
    if p_abs <= 0.0 {
        return Err(inconsistent(format!(
            "the gauge pressure {gauge} Pa is below a perfect vacuum"
        )));
    }
    let gas = gas_fraction_at_pressure(
        inputs.air_fraction_at_atmosphere,
        p_atm,
        p_abs,
        inputs.process,
    )?;
    let container = match inputs.container_pa {
        Some(b) => 1.0 / positive("container bulk modulus", b, "Pa")?,
        None => 0.0,
    };
    let compliance = container + 1.0 / liquid + gas / gas_bulk_modulus(p_abs, inputs.process)?;
    result("effective bulk modulus", 1.0 / compliance)
}

/// Bulk modulus of a gas–liquid mixture, in Pa, with the gas fraction `gas_fraction`
/// taken as given: 1/B_e = α/(n·P) + (1 − α)/B.
///
/// The fraction must be the one at `absolute_pressure_pa`; feeding in the fraction
/// measured at atmospheric pressure underestimates B_e (use [`effective_bulk_modulus`]).
///
/// Source: Rabie 2009, §2.2.3, eq. 2.57, p. 55.
pub fn mixture_bulk_modulus(
    gas_fraction: f64,
    absolute_pressure_pa: f64,
    process: GasProcess,
    liquid_pa: f64,
) -> PhysicsResult<f64> {
    let alpha = non_negative("gas fraction", gas_fraction, "")?;
    if alpha > 0.0 {
        fraction("gas fraction", alpha)?;
    }
    let p = positive("absolute pressure", absolute_pressure_pa, "Pa")?;
    let liquid = positive("oil bulk modulus", liquid_pa, "Pa")?;
    let compliance = alpha / (process.polytropic_index() * p) + (1.0 - alpha) / liquid;
    result("mixture bulk modulus", 1.0 / compliance)
}

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    use super::*;
    use crate::physics::constants::STANDARD_ATMOSPHERE;
    use crate::physics::testing::*;

    fn beta(air: f64, gauge_bar: f64, process: GasProcess) -> f64 {
        effective_bulk_modulus(&BulkModulusInputs {
            air_fraction_at_atmosphere: air,
            atmospheric_pressure_pa: STANDARD_ATMOSPHERE,
            container_pa: None,
            gauge_pressure_pa: gauge_bar * BAR,
            liquid_pa: 1.5e9,
            process,
        })
        .unwrap()
    }

    #[test]
    fn one_percent_air_at_ten_bar() {
        // derived (series form): 0.662 GPa
        assert_printed(beta(0.01, 10.0, GasProcess::Isothermal) / 1e9, 0.662, 3);
    }

    #[test]
    fn effective_bulk_modulus_table() {
        // derived (series form): β_l 1.5 GPa, p_atm 101 325 Pa, no container term
        let rows = [
            (10.0, 0.001, 0.0092, 1.333, 1.274),
            (10.0, 0.01, 0.0928, 0.662, 0.539),
            (50.0, 0.01, 0.0201, 1.416, 1.329),
            (100.0, 0.01, 0.0101, 1.478, 1.442),
            (200.0, 0.01, 0.0051, 1.494, 1.482),
        ];
        for (bar, air, percent_at_p, iso, adi) in rows {
            let p_abs = bar * BAR + STANDARD_ATMOSPHERE;
            let frac =
                gas_fraction_at_pressure(air, STANDARD_ATMOSPHERE, p_abs, GasProcess::Isothermal)
                    .unwrap();
            assert_printed(frac * 100.0, percent_at_p, 4);
            assert_printed(beta(air, bar, GasProcess::Isothermal) / 1e9, iso, 3);
            assert_printed(beta(air, bar, GasProcess::Adiabatic) / 1e9, adi, 3);
        }
    }

    #[test]
    fn rabie_law_with_the_uncompressed_fraction() {
        // Rabie 2009, §2.2.3, eq. 2.57, p. 55 with α = x₀: 0.635, 0.103, 0.382, 0.606, 0.864 GPa
        let rows = [
            (10.0, 0.001, 0.635),
            (10.0, 0.01, 0.103),
            (50.0, 0.01, 0.382),
            (100.0, 0.01, 0.606),
            (200.0, 0.01, 0.864),
        ];
        for (bar, air, gpa) in rows {
            let b = mixture_bulk_modulus(
                air,
                bar * BAR + STANDARD_ATMOSPHERE,
                GasProcess::Isothermal,
                1.5e9,
            )
            .unwrap();
            assert_printed(b / 1e9, gpa, 3);
        }
    }

    #[test]
    fn steel_tube_is_stiff() {
        // derived: E 207 GPa, t 2 mm, D 20 mm → 20.7 GPa
        let tube = tube_bulk_modulus(207e9, 0.002, 0.020).unwrap();
        assert_close(tube, 20.7e9, 1e-12);
        let with_tube = effective_bulk_modulus(&BulkModulusInputs {
            air_fraction_at_atmosphere: 0.0,
            atmospheric_pressure_pa: STANDARD_ATMOSPHERE,
            container_pa: Some(tube),
            gauge_pressure_pa: 100.0 * BAR,
            liquid_pa: 1.5e9,
            process: GasProcess::Isothermal,
        })
        .unwrap();
        assert_close(with_tube, 1.0 / (1.0 / 1.5e9 + 1.0 / 20.7e9), 1e-12);
    }

    #[test]
    fn domain_errors() {
        assert!(gas_fraction_at_pressure(1.0, 1e5, 1e6, GasProcess::Isothermal).is_err());
        assert!(gas_fraction_at_pressure(-0.1, 1e5, 1e6, GasProcess::Isothermal).is_err());
        let mut inputs = BulkModulusInputs {
            air_fraction_at_atmosphere: 0.01,
            atmospheric_pressure_pa: STANDARD_ATMOSPHERE,
            container_pa: None,
            gauge_pressure_pa: -2e5,
            liquid_pa: 1.5e9,
            process: GasProcess::Isothermal,
        };
        assert!(effective_bulk_modulus(&inputs).is_err());
        inputs.gauge_pressure_pa = 1e6;
        inputs.container_pa = Some(0.0);
        assert!(effective_bulk_modulus(&inputs).is_err());
    }

    proptest! {
        #[test]
        fn more_air_is_softer(air in 0.0f64..0.1, extra in 1e-4f64..0.05, bar in 0.0f64..300.0) {
            prop_assert!(beta(air + extra, bar, GasProcess::Isothermal) < beta(air, bar, GasProcess::Isothermal));
        }

        #[test]
        fn more_pressure_is_stiffer(air in 1e-4f64..0.1, bar in 0.0f64..300.0, extra in 1.0f64..100.0) {
            prop_assert!(beta(air, bar + extra, GasProcess::Adiabatic) > beta(air, bar, GasProcess::Adiabatic));
        }
    }
}
