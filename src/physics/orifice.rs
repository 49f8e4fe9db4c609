//! Turbulent flow through a sharp-edged metering orifice, its US capacity form,
//! and the Reynolds number that tells when the turbulent law stops holding.

use std::f64::consts::PI;

use super::checks::{fraction, non_negative, positive, result};
use super::constants::{GPM, INCH, PSI};
use super::physics_error::PhysicsResult;

/// Flow through an orifice, in m³/s: Q = C_d·A·√(2·Δp/ρ).
///
/// `discharge_coefficient` (dimensionless, 0 < C_d ≤ 1), `area_m2` the orifice area (m²),
/// `drop_pa` the pressure drop across it (Pa, ≥ 0), `density_kg_m3` (kg/m³).
///
/// Source: Rabie 2009, eq. 2.34–2.37, p. 50.
pub fn orifice_flow(
    discharge_coefficient: f64,
    area_m2: f64,
    drop_pa: f64,
    density_kg_m3: f64,
) -> PhysicsResult<f64> {
    let cd = fraction("discharge coefficient", discharge_coefficient)?;
    let area = positive("orifice area", area_m2, "m²")?;
    let drop = non_negative("pressure drop", drop_pa, "Pa")?;
    let rho = positive("density", density_kg_m3, "kg/m³")?;
    result("flow", cd * area * (2.0 * drop / rho).sqrt())
}

/// Pressure drop that drives `flow_m3_s` (m³/s, ≥ 0) through an orifice, in Pa:
/// Δp = (ρ/2)·(Q/(C_d·A))², the orifice equation solved for Δp.
///
/// Source: Rabie 2009, eq. 2.34–2.37, p. 50.
pub fn orifice_drop(
    discharge_coefficient: f64,
    area_m2: f64,
    flow_m3_s: f64,
    density_kg_m3: f64,
) -> PhysicsResult<f64> {
    let cd = fraction("discharge coefficient", discharge_coefficient)?;
    let area = positive("orifice area", area_m2, "m²")?;
    let flow = non_negative("flow", flow_m3_s, "m³/s")?;
    let rho = positive("density", density_kg_m3, "kg/m³")?;
    let velocity = flow / (cd * area);
    result("pressure drop", rho / 2.0 * velocity * velocity)
}

/// Orifice area that passes `flow_m3_s` (m³/s) at `drop_pa` (Pa, > 0), in m²:
/// A = Q/(C_d·√(2·Δp/ρ)), the orifice equation solved for A.
///
/// Source: Rabie 2009, eq. 2.34–2.37, p. 50.
pub fn orifice_area_for_flow(
    discharge_coefficient: f64,
    flow_m3_s: f64,
    drop_pa: f64,
    density_kg_m3: f64,
) -> PhysicsResult<f64> {
    let cd = fraction("discharge coefficient", discharge_coefficient)?;
    let flow = non_negative("flow", flow_m3_s, "m³/s")?;
    let drop = positive("pressure drop", drop_pa, "Pa")?;
    let rho = positive("density", density_kg_m3, "kg/m³")?;
    result("orifice area", flow / (cd * (2.0 * drop / rho).sqrt()))
}

/// The constant K of the US-customary orifice form `Q[gpm] = K·C_d·A[in²]·√(Δp[psi]/SG)`,
/// for a reference water density `water_density_kg_m3` (kg/m³):
/// K = (in² → m²)·√(2·psi/ρ_w)/(gpm → m³/s). Dimensionless number in gpm, in², psi.
///
/// Source: derived (exact unit factors, NIST SP 811 B.8); 37.973 for 1000 kg/m³,
/// which Esposito Ex. 8-4 rounds to 38.1.
pub fn us_orifice_constant(water_density_kg_m3: f64) -> PhysicsResult<f64> {
    let rho_w = positive("water density", water_density_kg_m3, "kg/m³")?;
    result(
        "orifice constant",
        INCH * INCH * (2.0 * PSI / rho_w).sqrt() / GPM,
    )
}

/// The water density, in kg/m³, that a given US orifice constant `constant` implies:
/// ρ_w = 2·psi·(in²/(K·gpm))², the inverse of [`us_orifice_constant`]. With it the SI
/// equation reproduces a textbook's US form (K = 38.1 gives 993.4 kg/m³).
///
/// Source: derived (exact unit factors, NIST SP 811 B.8); Esposito Ex. 8-4 for K = 38.1.
pub fn water_density_for_constant(constant: f64) -> PhysicsResult<f64> {
    let k = positive("orifice constant", constant, "")?;
    result(
        "water density",
        2.0 * PSI * (INCH * INCH / (k * GPM)).powi(2),
    )
}

/// Flow capacity of a valve from one reading, in m³/(s·√Pa): C = Q/√(Δp/SG).
///
/// The SI form of the needle-valve capacity `Q[gpm] = C_v·√(Δp[psi]/SG)`;
/// multiply by √psi/gpm for C_v in gpm/√psi. `flow_m3_s` (m³/s), `drop_pa` (Pa, > 0),
/// `specific_gravity` (dimensionless, > 0).
///
/// Source: Esposito Ex. 8-6 (capacity form), derived from Rabie 2009, eq. 2.34–2.37, p. 50.
pub fn valve_capacity(flow_m3_s: f64, drop_pa: f64, specific_gravity: f64) -> PhysicsResult<f64> {
    let flow = non_negative("flow", flow_m3_s, "m³/s")?;
    let drop = positive("pressure drop", drop_pa, "Pa")?;
    let sg = positive("specific gravity", specific_gravity, "")?;
    result("valve capacity", flow / (drop / sg).sqrt())
}

/// Flow through a valve of capacity `capacity` (m³/(s·√Pa)), in m³/s: Q = C·√(Δp/SG).
///
/// Source: Esposito Ex. 8-6 (capacity form), derived from Rabie 2009, eq. 2.34–2.37, p. 50.
pub fn capacity_flow(capacity: f64, drop_pa: f64, specific_gravity: f64) -> PhysicsResult<f64> {
    let c = non_negative("valve capacity", capacity, "m³/(s·√Pa)")?;
    let drop = non_negative("pressure drop", drop_pa, "Pa")?;
    let sg = positive("specific gravity", specific_gravity, "")?;
    result("flow", c * (drop / sg).sqrt())
}

/// Capacity of an orifice in m³/(s·√Pa): C = C_d·A·√(2/ρ_w), so that Q = C·√(Δp/SG).
/// `water_density_kg_m3` is the density that specific gravity refers to (kg/m³).
///
/// Source: derived from Rabie 2009, eq. 2.34–2.37, p. 50 with ρ = SG·ρ_w.
pub fn orifice_capacity(
    discharge_coefficient: f64,
    area_m2: f64,
    water_density_kg_m3: f64,
) -> PhysicsResult<f64> {
    let cd = fraction("discharge coefficient", discharge_coefficient)?;
    let area = positive("orifice area", area_m2, "m²")?;
    let rho_w = positive("water density", water_density_kg_m3, "kg/m³")?;
    result("valve capacity", cd * area * (2.0 / rho_w).sqrt())
}

/// Reynolds number, dimensionless: Re = v·d_h/ν, with `velocity_m_s` (m/s),
/// `hydraulic_diameter_m` (m) and `kinematic_viscosity_m2_s` (m²/s).
///
/// Source: Rabie 2009, §2 (definition of the Reynolds number).
pub fn reynolds_number(
    velocity_m_s: f64,
    hydraulic_diameter_m: f64,
    kinematic_viscosity_m2_s: f64,
) -> PhysicsResult<f64> {
    let v = non_negative("velocity", velocity_m_s.abs(), "m/s")?;
    let d = positive("hydraulic diameter", hydraulic_diameter_m, "m")?;
    let nu = positive("kinematic viscosity", kinematic_viscosity_m2_s, "m²/s")?;
    result("reynolds number", v * d / nu)
}

/// Reynolds number of flow `flow_m3_s` (m³/s) through a round orifice of
/// `diameter_m` (m), dimensionless: Re = 4Q/(π·d·ν).
///
/// Source: derived from Re = v·d_h/ν with v = Q/(πd²/4), d_h = d.
pub fn round_orifice_reynolds(
    flow_m3_s: f64,
    diameter_m: f64,
    kinematic_viscosity_m2_s: f64,
) -> PhysicsResult<f64> {
    let flow = non_negative("flow", flow_m3_s, "m³/s")?;
    let d = positive("orifice diameter", diameter_m, "m")?;
    let nu = positive("kinematic viscosity", kinematic_viscosity_m2_s, "m²/s")?;
    result("reynolds number", 4.0 * flow / (PI * d * nu))
}

/// Opening of a slot of port width `width_m` (m) that meters `flow_m3_s` (m³/s) at
/// `drop_pa` (Pa), in m: x = A/w with A from the orifice equation.
///
/// Source: Rabie 2009, eq. 2.34–2.37, p. 50 (A = w·x for a spool opening).
pub fn slot_opening_for_flow(
    discharge_coefficient: f64,
    width_m: f64,
    flow_m3_s: f64,
    drop_pa: f64,
    density_kg_m3: f64,
) -> PhysicsResult<f64> {
    let width = positive("port width", width_m, "m")?;
    let area = orifice_area_for_flow(discharge_coefficient, flow_m3_s, drop_pa, density_kg_m3)?;
    result("opening", area / width)
}

/// Reynolds number of flow `flow_m3_s` (m³/s) through a slot of port width `width_m` (m),
/// dimensionless: with v = Q/(w·x) and d_h ≈ 2x, Re = 2Q/(w·ν), independent of the opening.
///
/// Source: derived from Re = v·d_h/ν with d_h ≈ 2x for an annular spool opening.
pub fn slot_reynolds(
    flow_m3_s: f64,
    width_m: f64,
    kinematic_viscosity_m2_s: f64,
) -> PhysicsResult<f64> {
    let flow = non_negative("flow", flow_m3_s, "m³/s")?;
    let width = positive("port width", width_m, "m")?;
    let nu = positive("kinematic viscosity", kinematic_viscosity_m2_s, "m²/s")?;
    result("reynolds number", 2.0 * flow / (width * nu))
}

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    use super::*;
    use crate::physics::cylinder::{cylinder_flow, meter_out_back_pressure};
    use crate::physics::geometry::{circle_area, equivalent_diameter, periphery};
    use crate::physics::testing::*;
    use crate::physics::PhysicsError;

    #[test]
    fn two_millimetre_orifice_at_ten_bar() {
        let area = circle_area(0.002).unwrap();
        let q = orifice_flow(0.62, area, 10.0 * BAR, 870.0).unwrap();
        // Rabie eq. 2.34–2.37: 5.6034 L/min
        assert_close(q / LPM, 5.6034, 1e-4);
        // Rabie 2009, eq. 2.34–2.37, p. 50: 9.339e-5 m³/s
        assert_printed(q * 1e5, 9.339, 3);
        // Rabie 2009, eq. 2.34–2.37, p. 50: 40 bar passes 11.207 L/min, exactly 2×
        let q40 = orifice_flow(0.62, area, 40.0 * BAR, 870.0).unwrap();
        assert_close(q40 / LPM, 11.207, 1e-4);
        assert_close(q40 / q, 2.0, 1e-12);
    }

    // Published data whose digits happen to resemble π; they are not π.
    #[allow(clippy::approx_constant)]
    #[test]
    fn drop_and_area_invert_the_flow() {
        let area = circle_area(0.002).unwrap();
        // Rabie eq. 2.34–2.37 run backwards
        let drop = orifice_drop(0.62, area, 5.6034 * LPM, 870.0).unwrap();
        assert_close(drop / BAR, 10.0, 1e-4);
        let a = orifice_area_for_flow(0.62, 5.6034 * LPM, 10.0 * BAR, 870.0).unwrap();
        assert_close(a * 1e6, 3.1416, 1e-4);
    }

    #[test]
    fn us_constant() {
        // derived: K = 37.9734 for ρ_w 1000 kg/m³
        assert_close(us_orifice_constant(1000.0).unwrap(), 37.9734, 1e-4);
        // derived: 37.992 for 999.0 kg/m³
        assert_close(us_orifice_constant(999.0).unwrap(), 37.992, 1e-4);
    }

    #[test]
    fn esposito_8_4_with_the_book_constant() {
        // Esposito Ex. 8-4: C .80, D 1 in, 100 psi, SG .9, K 38.1 → 252.34 gpm.
        // The book's K = 38.1 corresponds to ρ_w = 2·psi·(in²/(K·gpm))².
        let k = 38.1;
        let rho_w = water_density_for_constant(k).unwrap();
        assert_close(us_orifice_constant(rho_w).unwrap(), k, 1e-12);
        let area = circle_area(INCH).unwrap();
        let q = orifice_flow(0.80, area, 100.0 * PSI, 0.9 * rho_w).unwrap();
        assert_close(to_gpm(q), 252.34, 1e-4);
        // Esposito Ex. 8-4 recomputed: direct SI with ρ = 0.9·999 kg/m³ gives 251.6 gpm
        let q_si = orifice_flow(0.80, area, 100.0 * PSI, 0.9 * 999.0).unwrap();
        assert_printed(to_gpm(q_si), 251.6, 1);
    }

    // Published data whose digits happen to resemble π; they are not π.
    #[allow(clippy::approx_constant)]
    #[test]
    fn esposito_8_6_meter_out_needle_valve() {
        let a_cap = 3.14 * SQUARE_INCH;
        let a_ann = a_cap - 0.79 * SQUARE_INCH;
        let p2 = meter_out_back_pressure(500.0 * PSI, a_cap, a_ann, 1000.0 * LBF).unwrap();
        // Esposito Ex. 8-6: p₂ 242.6 psi
        assert_printed(to_psi(p2), 242.6, 1);
        let q = cylinder_flow(10.0 * INCH, a_ann).unwrap();
        // Esposito Ex. 8-6: Q 6.104 gpm
        assert_printed(to_gpm(q), 6.104, 3);
        let cv = valve_capacity(q, p2, 0.9).unwrap();
        // Esposito Ex. 8-6: C_v 0.3718 gpm/√psi
        assert_printed(cv / GPM * PSI.sqrt(), 0.3718, 4);
    }

    #[test]
    fn capacity_of_an_orifice() {
        // derived: C_d 0.62, A 0.01 in² → C_v = 0.2354 gpm/√psi (K for ρ_w 1000)
        let c = orifice_capacity(0.62, 0.01 * SQUARE_INCH, 1000.0).unwrap();
        assert_printed(c / GPM * PSI.sqrt(), 0.2354, 4);
        let q = capacity_flow(c, 100.0 * PSI, 1.0).unwrap();
        assert_close(to_gpm(q), 2.354, 1e-3);
    }

    #[test]
    fn low_flow_metering_table() {
        // Rabie eq. 2.34–2.37 with Re = 4Q/(πdν)
        let rows = [
            (10.0, 6.371, 2.848, 1620.0),
            (1.0, 0.637, 0.901, 512.0),
            (0.1, 0.0637, 0.285, 162.0),
            (0.05, 0.0319, 0.201, 115.0),
        ];
        for (flow_lpm, area_mm2, d_mm, re) in rows {
            let area = orifice_area_for_flow(0.61, flow_lpm * LPM, 8.0 * BAR, 870.0).unwrap();
            assert_close(area * 1e6, area_mm2, 0.5 / (area_mm2 * 1e3).round());
            let d = equivalent_diameter(area).unwrap();
            assert_close(d * 1e3, d_mm, 0.5 / (d_mm * 1e3).round());
            let r = round_orifice_reynolds(flow_lpm * LPM, d, 46.0 * CST).unwrap();
            assert_printed(r, re, 0);
        }
    }

    #[test]
    fn micro_opening_on_a_ten_millimetre_spool() {
        // Rabie eq. 2.34–2.37: 0.1 L/min over a 10 mm spool periphery → x = 2.0 µm, Re ≈ 2.3
        let w = periphery(0.010).unwrap();
        let x = slot_opening_for_flow(0.61, w, 0.1 * LPM, 8.0 * BAR, 870.0).unwrap();
        assert_printed(x * 1e6, 2.0, 1);
        assert_printed(slot_reynolds(0.1 * LPM, w, 46.0 * CST).unwrap(), 2.3, 1);
        let v = 0.1 * LPM / (w * x);
        assert_close(
            reynolds_number(v, 2.0 * x, 46.0 * CST).unwrap(),
            slot_reynolds(0.1 * LPM, w, 46.0 * CST).unwrap(),
            1e-12,
        );
    }

    #[test]
    fn domain_errors() {
        assert!(matches!(
            orifice_flow(0.62, 1e-6, -1.0, 870.0),
            Err(PhysicsError::Negative { .. })
        ));
        assert!(matches!(
            orifice_flow(0.62, 1e-6, f64::NAN, 870.0),
            Err(PhysicsError::NotFinite { .. })
        ));
        assert!(matches!(
            orifice_flow(1.2, 1e-6, 1e5, 870.0),
            Err(PhysicsError::OutOfRange { .. })
        ));
        assert!(matches!(
            orifice_area_for_flow(0.62, 1e-4, 0.0, 870.0),
            Err(PhysicsError::NotPositive { .. })
        ));
        assert!(matches!(
            orifice_flow(0.62, 1e300, 1e300, 1e-300),
            Err(PhysicsError::ResultNotFinite { .. })
        ));
    }

    proptest! {
        #[test]
        fn more_drop_passes_more_flow(drop in 1.0f64..5e7, extra in 1.0f64..5e7, area in 1e-8f64..1e-3) {
            let q1 = orifice_flow(0.61, area, drop, 870.0).unwrap();
            let q2 = orifice_flow(0.61, area, drop + extra, 870.0).unwrap();
            prop_assert!(q2 > q1);
        }

        #[test]
        fn drop_round_trips(drop in 1.0f64..5e7, area in 1e-8f64..1e-3) {
            let q = orifice_flow(0.61, area, drop, 870.0).unwrap();
            let back = orifice_drop(0.61, area, q, 870.0).unwrap();
            prop_assert!(((back - drop) / drop).abs() < 1e-9);
        }
    }
}
