//! The pressure compensator: the metering drop its spring and spool hold, how that
//! drop drifts with the compensator's own drop, the headroom it needs to regulate,
//! load-sensing pump pressure, and the start-up flow burst of an idle restrictive valve.

use super::checks::{inconsistent, non_negative, positive, result};
use super::flow_force::{jet_velocity, momentum_flow_force};
use super::physics_error::PhysicsResult;

/// A restrictive (2-way, pre-compensator) spool: the metering drop pushes on the spool
/// area, the spring pushes back and holds it open at rest.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Compensator {
    /// Jet angle at the compensator's throttling edge, rad (69° ≈ 1.2043 rad for sharp edges).
    pub jet_angle_rad: f64,
    /// Spool end area A_s that the metering drop acts on, m².
    pub spool_area_m2: f64,
    /// Spring force with the spool fully open, F₀, N.
    pub spring_preload_n: f64,
    /// Spring rate k, N/m.
    pub spring_rate_n_m: f64,
    /// Velocity coefficient C_v of the compensator's throttling edge (0.97–0.99).
    pub velocity_coefficient: f64,
}

impl Compensator {
    /// The metering drop Δp_m = p₂ − p₃ that the spool holds, in Pa:
    /// `Δp_m = [F₀ + k·s − F_flow(Δp_c)]/A_s` with F_flow = ρ·Q·C_v·√(2Δp_c/ρ)·cos θ.
    ///
    /// `stroke_m` the closing stroke s (m) at this operating point, `flow_m3_s` (m³/s),
    /// `density_kg_m3` (kg/m³), `compensator_drop_pa` Δp_c = p₁ − p₂ (Pa).
    ///
    /// Source: derived (own model; force balance on the spool, flow force per
    /// Vacca §3.8.1 momentum form).
    pub fn metering_drop(
        &self,
        stroke_m: f64,
        flow_m3_s: f64,
        density_kg_m3: f64,
        compensator_drop_pa: f64,
    ) -> PhysicsResult<f64> {
        let area = positive("spool area", self.spool_area_m2, "m²")?;
        let preload = non_negative("spring preload", self.spring_preload_n, "N")?;
        let rate = non_negative("spring rate", self.spring_rate_n_m, "N/m")?;
        let stroke = non_negative("stroke", stroke_m, "m")?;
        let flow_force = compensator_flow_force(
            flow_m3_s,
            density_kg_m3,
            self.velocity_coefficient,
            compensator_drop_pa,
            self.jet_angle_rad,
        )?;
        let net = preload + rate * stroke - flow_force;
        if net < 0.0 {
            return Err(inconsistent(format!(
                "the flow force {flow_force} N exceeds the spring force: the spool would close"
            )));
        }
        result("metering drop", net / area)
    }
}

/// Flow force on the compensator's throttling edge, in N: F = ρ·Q·C_v·√(2Δp_c/ρ)·cos θ.
///
/// Source: Vacca §3.8.1 (momentum form).
pub fn compensator_flow_force(
    flow_m3_s: f64,
    density_kg_m3: f64,
    velocity_coefficient: f64,
    compensator_drop_pa: f64,
    jet_angle_rad: f64,
) -> PhysicsResult<f64> {
    let v = jet_velocity(velocity_coefficient, compensator_drop_pa, density_kg_m3)?;
    momentum_flow_force(density_kg_m3, flow_m3_s, v, jet_angle_rad)
}

/// Spring preload, in N, that sets a metering drop `setting_pa` (Pa) on a spool of
/// area `spool_area_m2` (m²) with no flow force: F₀ = Δp·A_s.
///
/// Source: derived (force balance on the spool).
pub fn spring_preload_for_setting(setting_pa: f64, spool_area_m2: f64) -> PhysicsResult<f64> {
    let setting = non_negative("setting", setting_pa, "Pa")?;
    let area = positive("spool area", spool_area_m2, "m²")?;
    result("spring preload", setting * area)
}

/// Relative flow change, dimensionless (−0.028 for −2.8 %), when the metering drop moves
/// from `drop_before_pa` to `drop_after_pa` (Pa): Q ∝ √Δp_m, so ΔQ/Q = √(after/before) − 1.
///
/// Source: derived from Rabie 2009, eq. 2.34–2.37, p. 50.
pub fn flow_change_for_drop_change(drop_before_pa: f64, drop_after_pa: f64) -> PhysicsResult<f64> {
    let before = positive("metering drop before", drop_before_pa, "Pa")?;
    let after = non_negative("metering drop after", drop_after_pa, "Pa")?;
    result("flow change", (after / before).sqrt() - 1.0)
}

/// Supply pressure, in Pa, a compensated valve needs to regulate a load at
/// `load_pressure_pa` (Pa): p_supply = p_load + Δp_set + Δp_comp,min, with the metering
/// setting `setting_pa` and the smallest drop the compensator needs `compensator_min_drop_pa`.
///
/// Source: derived (a compensator can only regulate while it has excess pressure to
/// throttle; Cetinkunt 2015, §7, Figs. 7.53–7.55).
pub fn required_supply_pressure(
    load_pressure_pa: f64,
    setting_pa: f64,
    compensator_min_drop_pa: f64,
) -> PhysicsResult<f64> {
    let load = non_negative("load pressure", load_pressure_pa, "Pa")?;
    let setting = non_negative("setting", setting_pa, "Pa")?;
    let min = non_negative("compensator minimum drop", compensator_min_drop_pa, "Pa")?;
    result("supply pressure", load + setting + min)
}

/// Regulation headroom, in Pa: (p_supply − p_load) − (Δp_set + Δp_comp,min). Negative
/// means the compensator is wide open and the flow is no longer compensated.
///
/// Source: derived (Cetinkunt 2015, §7, Figs. 7.53–7.55: with no excess pressure the
/// compensator stays wide open).
pub fn regulation_headroom(
    supply_pressure_pa: f64,
    load_pressure_pa: f64,
    setting_pa: f64,
    compensator_min_drop_pa: f64,
) -> PhysicsResult<f64> {
    let supply = non_negative("supply pressure", supply_pressure_pa, "Pa")?;
    let needed = required_supply_pressure(load_pressure_pa, setting_pa, compensator_min_drop_pa)?;
    Ok(supply - needed)
}

/// Load-sensing pump outlet pressure, in Pa: p_pump = p_LS,max + margin, with the highest
/// load pressure `highest_load_pressure_pa` (Pa) and the LS margin `margin_pa` (Pa).
///
/// Source: MobileHyd 2017, ch. 18, p. 421.
pub fn load_sensing_pump_pressure(
    highest_load_pressure_pa: f64,
    margin_pa: f64,
) -> PhysicsResult<f64> {
    let load = non_negative("highest load pressure", highest_load_pressure_pa, "Pa")?;
    let margin = non_negative("margin", margin_pa, "Pa")?;
    result("pump pressure", load + margin)
}

/// Transient flow peak, in m³/s, when an idle restrictive compensator (held wide open by
/// its spring) first sees the whole available drop: Q_peak ≈ Q_set·√(Δp_available/Δp_set).
///
/// `set_flow_m3_s` (m³/s), `available_drop_pa` and `setting_pa` (Pa).
///
/// Source: derived from Rabie 2009, eq. 2.34–2.37, p. 50; the start-up jump mechanism
/// is from memory.
pub fn start_up_flow_peak(
    set_flow_m3_s: f64,
    available_drop_pa: f64,
    setting_pa: f64,
) -> PhysicsResult<f64> {
    let q = non_negative("set flow", set_flow_m3_s, "m³/s")?;
    let available = non_negative("available drop", available_drop_pa, "Pa")?;
    let setting = positive("setting", setting_pa, "Pa")?;
    result("flow peak", q * (available / setting).sqrt())
}

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    use super::*;
    use crate::physics::geometry::circle_area;
    use crate::physics::testing::*;

    fn example() -> Compensator {
        let area = circle_area(0.010).unwrap();
        Compensator {
            jet_angle_rad: 69f64.to_radians(),
            spool_area_m2: area,
            spring_preload_n: spring_preload_for_setting(8.0 * BAR, area).unwrap(),
            spring_rate_n_m: 5000.0,
            velocity_coefficient: 0.98,
        }
    }

    #[test]
    fn preload_for_eight_bar() {
        // derived (own model): A_s = 78.54 mm², F₀ = 62.83 N
        assert_printed(example().spool_area_m2 * 1e6, 78.54, 2);
        assert_printed(example().spring_preload_n, 62.83, 2);
    }

    #[test]
    fn regulation_error_between_10_and_200_bar() {
        let c = example();
        let q = 10.0 * LPM;
        // derived (own model): flow force 2.44 N at 10 bar, 10.92 N at 200 bar
        let f10 = compensator_flow_force(q, 870.0, 0.98, 10.0 * BAR, c.jet_angle_rad).unwrap();
        let f200 = compensator_flow_force(q, 870.0, 0.98, 200.0 * BAR, c.jet_angle_rad).unwrap();
        assert_printed(f10, 2.44, 2);
        assert_printed(f200, 10.92, 2);
        // derived (own model): 8.007 → 7.565 bar; −2.80 % flow
        let low = c.metering_drop(0.5e-3, q, 870.0, 10.0 * BAR).unwrap();
        let high = c.metering_drop(1.5e-3, q, 870.0, 200.0 * BAR).unwrap();
        assert_printed(low / BAR, 8.007, 3);
        assert_printed(high / BAR, 7.565, 3);
        assert_printed(
            flow_change_for_drop_change(low, high).unwrap() * 100.0,
            -2.80,
            2,
        );
    }

    #[test]
    fn one_bar_on_an_eight_bar_setting() {
        // derived: ±1 bar on 8 bar → +6.07 % / −6.46 % flow
        assert_printed(
            flow_change_for_drop_change(8.0 * BAR, 9.0 * BAR).unwrap() * 100.0,
            6.07,
            2,
        );
        assert_printed(
            flow_change_for_drop_change(8.0 * BAR, 7.0 * BAR).unwrap() * 100.0,
            -6.46,
            2,
        );
    }

    #[test]
    fn headroom_and_supply() {
        // derived: 8 + 2 = 10 bar above the load
        let need = required_supply_pressure(100.0 * BAR, 8.0 * BAR, 2.0 * BAR).unwrap();
        assert_close(need / BAR, 110.0, 1e-12);
        assert_close(
            regulation_headroom(105.0 * BAR, 100.0 * BAR, 8.0 * BAR, 2.0 * BAR).unwrap() / BAR,
            -5.0,
            1e-12,
        );
    }

    #[test]
    fn load_sensing_margin() {
        // MobileHyd ch. 18, p. 421: 1000 psi load + 250 psi margin → 1250 psi; 69 + 17 → 86 bar
        assert_close(
            to_psi(load_sensing_pump_pressure(1000.0 * PSI, 250.0 * PSI).unwrap()),
            1250.0,
            1e-12,
        );
        assert_close(
            load_sensing_pump_pressure(69.0 * BAR, 17.0 * BAR).unwrap() / BAR,
            86.0,
            1e-12,
        );
    }

    #[test]
    fn start_up_burst() {
        // derived: 8 bar setting with 100 bar available → up to 3.5× the set flow
        let peak = start_up_flow_peak(10.0 * LPM, 100.0 * BAR, 8.0 * BAR).unwrap();
        assert_printed(peak / (10.0 * LPM), 3.5, 1);
    }

    #[test]
    fn a_closing_spool_is_an_error() {
        let mut c = example();
        c.spring_preload_n = 0.0;
        c.spring_rate_n_m = 0.0;
        assert!(c
            .metering_drop(0.0, 10.0 * LPM, 870.0, 100.0 * BAR)
            .is_err());
        assert!(compensator_flow_force(1e-4, 870.0, 1.5, 1e6, 1.2).is_err());
    }

    proptest! {
        #[test]
        fn flow_force_lowers_the_held_drop(dp in 1e5f64..3e7, extra in 1e5f64..1e7) {
            let c = example();
            let a = c.metering_drop(1e-3, 10.0 * LPM, 870.0, dp).unwrap();
            let b = c.metering_drop(1e-3, 10.0 * LPM, 870.0, dp + extra).unwrap();
            prop_assert!(b < a);
        }

        #[test]
        fn spring_rate_raises_the_held_drop(s in 0.0f64..2e-3, ds in 1e-5f64..1e-3) {
            let c = example();
            let a = c.metering_drop(s, 10.0 * LPM, 870.0, 50.0 * BAR).unwrap();
            let b = c.metering_drop(s + ds, 10.0 * LPM, 870.0, 50.0 * BAR).unwrap();
            prop_assert!(b > a);
        }
    }
}
