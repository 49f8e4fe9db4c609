//! Flow against supply minus load for a restrictive (2-way) compensated valve:
//! the orifice-like rise while the compensator is wide open, then the regulated
//! plateau whose droop or rise comes from the compensator's force balance.

use std::f64::consts::PI;

use super::chart_error::{ChartError, ChartResult};
use crate::physics::{bisect, circle_area, spring_preload_for_setting, Compensator, PhysicsError};

/// One bar in pascals (exact).
const BAR: f64 = 1e5;

/// The valve behind the curve: the compensator spool, its spring, the oil, and the
/// throttling edge the spool closes.
///
/// The compensator's throttling edge is a port sized to the set flow: wide open
/// (stroke 0, opening `full_opening_m`) it passes the set flow at `open_drop_pa`.
/// At a stroke s the opening is x₀ − s, so by the orifice law
/// `x₀ − s = x₀·(Q/Q_set)·√(Δp_open/Δp_c)`: the stroke follows from the flow and the
/// compensator's own drop Δp_c, and with it the spring force.
///
/// Source: derived (own model); force balance and flow force as in
/// [`Compensator::metering_drop`] (Vacca §3.8.1 momentum form); orifice law
/// Rabie 2009, eq. 2.34–2.37, p. 50.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ValveModel {
    /// Oil density, kg/m³.
    pub density_kg_m3: f64,
    /// Opening x₀ of the compensator's throttling edge with the spool at rest, m.
    pub full_opening_m: f64,
    /// Jet angle at the throttling edge, rad.
    pub jet_angle_rad: f64,
    /// Drop across the wide-open compensator at the set flow, Pa.
    pub open_drop_pa: f64,
    /// Compensator spool diameter, m (the metering drop acts on its end area).
    pub spool_diameter_m: f64,
    /// Spring rate k, N/m.
    pub spring_rate_n_m: f64,
    /// Velocity coefficient C_v of the throttling edge.
    pub velocity_coefficient: f64,
}

/// Strokes of the illustrative compensator that set the default opening: 0.5 mm at 10 bar
/// and 1.5 mm at 200 bar of compensator drop, at the set flow (assumed values).
const ILLUSTRATION_STROKES: [(f64, f64); 2] = [(10.0 * BAR, 0.5e-3), (200.0 * BAR, 1.5e-3)];

impl Default for ValveModel {
    /// An illustrative valve (assumed values, derived model): a 10 mm spool,
    /// 5 N/mm spring, 870 kg/m³ oil, C_v 0.98, 69° jet, and the opening that puts the
    /// spool at 0.5 mm of stroke at 10 bar and 1.5 mm at 200 bar of compensator drop
    /// (x₀ = 1.788 mm, Δp_open = 5.189 bar; see [`ValveModel::opening_through_strokes`]).
    fn default() -> Self {
        let [(drop_a, stroke_a), (drop_b, stroke_b)] = ILLUSTRATION_STROKES;
        let (full_opening_m, open_drop_pa) =
            ValveModel::opening_through_strokes(drop_a, stroke_a, drop_b, stroke_b);
        ValveModel {
            density_kg_m3: 870.0,
            full_opening_m,
            jet_angle_rad: 69f64.to_radians(),
            open_drop_pa,
            spool_diameter_m: 0.010,
            spring_rate_n_m: 5000.0,
            velocity_coefficient: 0.98,
        }
    }
}

impl ValveModel {
    /// The rest opening x₀ (m) and wide-open drop Δp_open (Pa) of a throttling edge
    /// that puts the spool at `stroke_a_m` at compensator drop `drop_a_pa` and at
    /// `stroke_b_m` at `drop_b_pa`, both at the set flow:
    /// from (x₀ − s)·√Δp_c = x₀·√Δp_open at both points,
    /// x₀ = (s_b·√Δp_b − s_a·√Δp_a)/(√Δp_b − √Δp_a), Δp_open = Δp_a·((x₀ − s_a)/x₀)².
    ///
    /// Source: derived (orifice law solved for the port geometry).
    pub fn opening_through_strokes(
        drop_a_pa: f64,
        stroke_a_m: f64,
        drop_b_pa: f64,
        stroke_b_m: f64,
    ) -> (f64, f64) {
        let (ra, rb) = (drop_a_pa.sqrt(), drop_b_pa.sqrt());
        let x0 = (stroke_b_m * rb - stroke_a_m * ra) / (rb - ra);
        let open = drop_a_pa * ((x0 - stroke_a_m) / x0).powi(2);
        (x0, open)
    }

    fn check(&self) -> ChartResult<()> {
        positive("density", self.density_kg_m3, "kg/m³")?;
        positive("full opening", self.full_opening_m, "m")?;
        positive("open drop", self.open_drop_pa, "Pa")?;
        positive("spool diameter", self.spool_diameter_m, "m")?;
        if !(self.spring_rate_n_m.is_finite() && self.spring_rate_n_m >= 0.0) {
            return Err(parameter(
                "spring rate",
                format!("must not be negative (got {} N/m)", self.spring_rate_n_m),
            ));
        }
        if !(self.velocity_coefficient > 0.0 && self.velocity_coefficient <= 1.0) {
            return Err(parameter(
                "velocity coefficient",
                format!(
                    "must be above 0 and at most 1 (got {})",
                    self.velocity_coefficient
                ),
            ));
        }
        if !(0.0..=PI / 2.0).contains(&self.jet_angle_rad) {
            return Err(parameter(
                "jet angle",
                format!("must be between 0 and 90° (got {} rad)", self.jet_angle_rad),
            ));
        }
        Ok(())
    }
}

/// Where the valve sits at one supply-minus-load pressure difference.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ValveState {
    /// The compensator's own drop Δp_c = p₁ − p₂, Pa.
    pub compensator_drop_pa: f64,
    /// Metered flow, m³/s.
    pub flow_m3_s: f64,
    /// Drop across the metering orifice Δp_m = p₂ − p₃, Pa.
    pub metering_drop_pa: f64,
    /// True once the compensator throttles (stroke above zero).
    pub regulating: bool,
    /// Closing stroke of the compensator spool, m.
    pub stroke_m: f64,
    /// Supply minus load, Δp_c + Δp_m, Pa.
    pub total_drop_pa: f64,
}

/// The valve characteristic: flow against supply minus load, with the healthy band.
///
/// Below the threshold the spring holds the compensator against its stop, both
/// restrictions are fixed and the valve passes Q = Q_th·√(Δp/Δp_th), like one
/// orifice. Above it the spool strokes so that the force balance
/// `Δp_m·A_s = F₀ + k·s − F_flow` holds with Q = Q_set·√(Δp_m/Δp_set) through the
/// metering orifice; the flow then follows Δp_m, which the spring rate raises and the
/// flow force lowers as the supply-minus-load difference grows.
#[derive(Clone, Debug, PartialEq)]
pub struct ValveCurve {
    band: f64,
    compensator: Compensator,
    flow_set_m3_s: f64,
    model: ValveModel,
    setting_pa: f64,
    threshold: ValveState,
}

impl ValveCurve {
    /// The curve of a valve set to `flow_set_m3_s` (m³/s) at a spring setting
    /// `setting_pa` (Pa, the metering drop the spring holds with no flow force),
    /// with `model` for the spool and the healthy band ±`band` (0.05 for ±5 %, the
    /// rule base's `regulation_band`) around the set flow.
    pub fn new(
        flow_set_m3_s: f64,
        setting_pa: f64,
        model: ValveModel,
        band: f64,
    ) -> ChartResult<ValveCurve> {
        positive("set flow", flow_set_m3_s, "m³/s")?;
        positive("spring setting", setting_pa, "Pa")?;
        if !(0.0..1.0).contains(&band) {
            return Err(parameter(
                "regulation band",
                format!(
                    "must be at least 0 and below 100 % (got {} %)",
                    band * 100.0
                ),
            ));
        }
        model.check()?;
        let area = circle_area(model.spool_diameter_m)?;
        let compensator = Compensator {
            jet_angle_rad: model.jet_angle_rad,
            spool_area_m2: area,
            spring_preload_n: spring_preload_for_setting(setting_pa, area)?,
            spring_rate_n_m: model.spring_rate_n_m,
            velocity_coefficient: model.velocity_coefficient,
        };
        let mut curve = ValveCurve {
            band,
            compensator,
            flow_set_m3_s,
            model,
            setting_pa,
            threshold: ValveState {
                compensator_drop_pa: 0.0,
                flow_m3_s: 0.0,
                metering_drop_pa: 0.0,
                regulating: false,
                stroke_m: 0.0,
                total_drop_pa: 0.0,
            },
        };
        curve.threshold = curve.solve_threshold()?;
        Ok(curve)
    }

    /// The healthy band as a fraction (0.05 for ±5 %).
    pub fn band(&self) -> f64 {
        self.band
    }

    /// The lowest and highest healthy flow on the plateau, m³/s: Q_set·(1 ∓ band).
    pub fn band_limits(&self) -> (f64, f64) {
        (
            self.flow_set_m3_s * (1.0 - self.band),
            self.flow_set_m3_s * (1.0 + self.band),
        )
    }

    /// The set flow, m³/s.
    pub fn flow_set(&self) -> f64 {
        self.flow_set_m3_s
    }

    /// The model parameters.
    pub fn model(&self) -> &ValveModel {
        &self.model
    }

    /// The spring setting, Pa.
    pub fn setting(&self) -> f64 {
        self.setting_pa
    }

    /// The point where the compensator starts to throttle (stroke 0).
    pub fn threshold(&self) -> ValveState {
        self.threshold
    }

    /// The closing stroke, m, at which the throttling edge passes `flow_m3_s` at a
    /// compensator drop `compensator_drop_pa`: s = x₀·(1 − (Q/Q_set)·√(Δp_open/Δp_c)),
    /// held between the open stop (0) and the closed edge (x₀).
    pub fn stroke(&self, compensator_drop_pa: f64, flow_m3_s: f64) -> f64 {
        if compensator_drop_pa <= 0.0 {
            return 0.0;
        }
        let opening_share = (flow_m3_s / self.flow_set_m3_s)
            * (self.model.open_drop_pa / compensator_drop_pa).sqrt();
        (self.model.full_opening_m * (1.0 - opening_share)).clamp(0.0, self.model.full_opening_m)
    }

    /// The metering drop, Pa, the spool holds at compensator drop
    /// `compensator_drop_pa` while `flow_m3_s` passes: the stroke from
    /// [`ValveCurve::stroke`], then the force balance of [`Compensator::metering_drop`].
    pub fn held_metering_drop(&self, compensator_drop_pa: f64, flow_m3_s: f64) -> ChartResult<f64> {
        let stroke = self.stroke(compensator_drop_pa, flow_m3_s);
        Ok(self.compensator.metering_drop(
            stroke,
            flow_m3_s,
            self.model.density_kg_m3,
            compensator_drop_pa,
        )?)
    }

    /// Flow, m³/s, at a supply-minus-load difference `total_drop_pa` (Pa); zero at or
    /// below zero difference.
    pub fn flow_at(&self, total_drop_pa: f64) -> ChartResult<f64> {
        Ok(self.state_at(total_drop_pa)?.flow_m3_s)
    }

    /// The whole operating state at a supply-minus-load difference `total_drop_pa` (Pa).
    pub fn state_at(&self, total_drop_pa: f64) -> ChartResult<ValveState> {
        if !total_drop_pa.is_finite() {
            return Err(parameter(
                "supply minus load",
                format!("must be finite (got {total_drop_pa})"),
            ));
        }
        let th = self.threshold;
        if total_drop_pa <= th.total_drop_pa {
            let share = (total_drop_pa.max(0.0) / th.total_drop_pa).sqrt();
            return Ok(ValveState {
                compensator_drop_pa: th.compensator_drop_pa * share * share,
                flow_m3_s: th.flow_m3_s * share,
                metering_drop_pa: th.metering_drop_pa * share * share,
                regulating: false,
                stroke_m: 0.0,
                total_drop_pa,
            });
        }
        // Δp_c + Δp_m(Δp_c) rises with Δp_c (Δp_m moves far less than Δp_c), so the
        // compensator drop that adds up to the total is bracketed by the threshold's
        // and by the total itself.
        let residual = |dp_c: f64| match self.regulated_at(dp_c) {
            Ok(state) => state.total_drop_pa - total_drop_pa,
            Err(_) => f64::NAN,
        };
        let dp_c = bisect(residual, th.compensator_drop_pa, total_drop_pa)
            .ok_or(ChartError::NoOperatingPoint { total_drop_pa })?;
        let state = self.regulated_at(dp_c)?;
        Ok(ValveState {
            total_drop_pa,
            ..state
        })
    }

    /// `count` points (Pa, m³/s) of the curve from zero to `max_total_drop_pa`: half
    /// of them on the orifice branch, spaced by the square so that the steep start is
    /// drawn smooth, and half on the plateau.
    pub fn samples(&self, max_total_drop_pa: f64, count: usize) -> ChartResult<Vec<(f64, f64)>> {
        let th = self.threshold.total_drop_pa;
        let half = (count / 2).max(2);
        let mut drops: Vec<f64> = (0..=half)
            .map(|i| th.min(max_total_drop_pa) * (i as f64 / half as f64).powi(2))
            .collect();
        if max_total_drop_pa > th {
            drops
                .extend((1..=half).map(|i| th + (max_total_drop_pa - th) * i as f64 / half as f64));
        }
        drops
            .into_iter()
            .map(|dp| Ok((dp, self.flow_at(dp)?)))
            .collect()
    }

    /// The regulated state at compensator drop `dp_c`: the flow Q at which the
    /// metering orifice (Q = Q_set·√(Δp_m/Δp_set)) and the force balance agree.
    /// Q_set·√(Δp_m(Q)/Δp_set) − Q falls as Q rises (more flow, more flow force and
    /// a wider opening with less spring), so the root is unique and bracketed by zero
    /// and the flow at the largest spring force.
    fn regulated_at(&self, dp_c: f64) -> ChartResult<ValveState> {
        let largest_drop = (self.compensator.spring_preload_n
            + self.compensator.spring_rate_n_m * self.model.full_opening_m)
            / self.compensator.spool_area_m2;
        let q_high = 1.01 * self.metering_flow(largest_drop);
        let gap = |q: f64| match self.held_or_closed(dp_c, q) {
            Ok(dp_m) => self.metering_flow(dp_m) - q,
            Err(_) => f64::NAN,
        };
        let q = bisect(gap, 0.0, q_high).ok_or(ChartError::NoOperatingPoint {
            total_drop_pa: dp_c,
        })?;
        let dp_m = self.held_or_closed(dp_c, q)?;
        Ok(ValveState {
            compensator_drop_pa: dp_c,
            flow_m3_s: q,
            metering_drop_pa: dp_m,
            regulating: true,
            stroke_m: self.stroke(dp_c, q),
            total_drop_pa: dp_c + dp_m,
        })
    }

    /// The threshold: stroke zero, so the throttling edge is fully open and
    /// Δp_c = Δp_open·(Q/Q_set)²; the flow solves the same balance as above.
    fn solve_threshold(&self) -> ChartResult<ValveState> {
        let open_drop = |q: f64| self.model.open_drop_pa * (q / self.flow_set_m3_s).powi(2);
        let at_stop = |q: f64| -> ChartResult<f64> {
            let dp_c = open_drop(q);
            match self
                .compensator
                .metering_drop(0.0, q, self.model.density_kg_m3, dp_c)
            {
                Err(PhysicsError::Inconsistent { .. }) => Ok(0.0),
                other => Ok(other?),
            }
        };
        let gap = |q: f64| match at_stop(q) {
            Ok(dp_m) => self.metering_flow(dp_m) - q,
            Err(_) => f64::NAN,
        };
        let q =
            bisect(gap, 0.0, 1.01 * self.flow_set_m3_s).ok_or(ChartError::NoOperatingPoint {
                total_drop_pa: self.setting_pa,
            })?;
        let dp_m = at_stop(q)?;
        let dp_c = open_drop(q);
        Ok(ValveState {
            compensator_drop_pa: dp_c,
            flow_m3_s: q,
            metering_drop_pa: dp_m,
            regulating: false,
            stroke_m: 0.0,
            total_drop_pa: dp_c + dp_m,
        })
    }

    /// The held drop, or zero where the flow force would close the spool (only met
    /// while bracketing: at the operating point the spool is open).
    fn held_or_closed(&self, dp_c: f64, q: f64) -> ChartResult<f64> {
        match self.held_metering_drop(dp_c, q) {
            Err(ChartError::Physics(PhysicsError::Inconsistent { .. })) => Ok(0.0),
            other => other,
        }
    }

    /// Flow through the metering orifice at drop `dp_m`: Q = Q_set·√(Δp_m/Δp_set).
    fn metering_flow(&self, dp_m: f64) -> f64 {
        self.flow_set_m3_s * (dp_m.max(0.0) / self.setting_pa).sqrt()
    }
}

fn positive(name: &'static str, value: f64, unit: &str) -> ChartResult<f64> {
    if value.is_finite() && value > 0.0 {
        Ok(value)
    } else {
        Err(parameter(
            name,
            format!("must be greater than zero (got {value} {unit})"),
        ))
    }
}

fn parameter(name: &'static str, message: String) -> ChartError {
    ChartError::Parameter { name, message }
}

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    use super::*;

    /// Litres per minute in m³/s (exact).
    const LPM: f64 = 1e-3 / 60.0;

    fn illustration() -> ValveCurve {
        ValveCurve::new(10.0 * LPM, 8.0 * BAR, ValveModel::default(), 0.05).unwrap()
    }

    #[track_caller]
    fn printed(actual: f64, expected: f64, decimals: i32) {
        let half = 0.5 * 10f64.powi(-decimals);
        assert!(
            (actual - expected).abs() <= half * (1.0 + 1e-9),
            "expected {expected} (±{half}), got {actual}"
        );
    }

    #[test]
    fn default_opening_reproduces_the_illustration_strokes() {
        let c = illustration();
        // derived (own model): x₀ = 1.788 mm, Δp_open = 5.189 bar
        printed(c.model().full_opening_m * 1e3, 1.788, 3);
        printed(c.model().open_drop_pa / BAR, 5.189, 3);
        // derived (own model, assumed strokes): 0.5 mm at 10 bar, 1.5 mm at 200 bar
        printed(c.stroke(10.0 * BAR, 10.0 * LPM) * 1e3, 0.5, 9);
        printed(c.stroke(200.0 * BAR, 10.0 * LPM) * 1e3, 1.5, 9);
    }

    #[test]
    fn k1_vector_from_the_chart_model() {
        let c = illustration();
        // derived (own force-balance model, flow force per Vacca §3.8.1): 8.007 → 7.565 bar at 10 L/min
        let low = c.held_metering_drop(10.0 * BAR, 10.0 * LPM).unwrap();
        let high = c.held_metering_drop(200.0 * BAR, 10.0 * LPM).unwrap();
        printed(low / BAR, 8.007, 3);
        printed(high / BAR, 7.565, 3);
        // derived: √(7.565/8.007) − 1 = −2.80 % flow
        printed(((high / low).sqrt() - 1.0) * 100.0, -2.80, 2);
    }

    #[test]
    fn the_solved_plateau_droops_a_little_less_than_at_fixed_flow() {
        // With the flow solved, the lower flow at 200 bar carries less flow force
        // than the illustration's fixed 10 L/min, so the droop is smaller but of the
        // same sign and order (derived).
        let c = illustration();
        let at = |dp_c: f64| {
            let total = dp_c + c.held_metering_drop(dp_c, 10.0 * LPM).unwrap();
            c.state_at(total).unwrap()
        };
        let (low, high) = (at(10.0 * BAR), at(200.0 * BAR));
        let droop = high.flow_m3_s / low.flow_m3_s - 1.0;
        assert!((-0.028..-0.015).contains(&droop), "{droop}");
        // every solved state satisfies the orifice law and the force balance
        for s in [low, high] {
            let q = 10.0 * LPM * (s.metering_drop_pa / (8.0 * BAR)).sqrt();
            assert!((q - s.flow_m3_s).abs() < 1e-12 * LPM, "{s:?}");
            let held = c
                .held_metering_drop(s.compensator_drop_pa, s.flow_m3_s)
                .unwrap();
            assert!((held - s.metering_drop_pa).abs() < 1e-6, "{s:?}");
            assert!((s.compensator_drop_pa + s.metering_drop_pa - s.total_drop_pa).abs() < 1e-3);
        }
    }

    #[test]
    fn orifice_branch_doubles_flow_at_four_times_the_drop() {
        let c = illustration();
        let th = c.threshold().total_drop_pa;
        // Rabie 2009, eq. 2.34–2.37: Q ∝ √Δp, so 4× the drop passes 2× the flow
        let q1 = c.flow_at(th / 8.0).unwrap();
        let q4 = c.flow_at(th / 2.0).unwrap();
        assert!((q4 / q1 - 2.0).abs() < 1e-12, "{}", q4 / q1);
        assert!(!c.state_at(th / 2.0).unwrap().regulating);
        assert_eq!(c.flow_at(0.0).unwrap(), 0.0);
        assert_eq!(c.flow_at(-5.0 * BAR).unwrap(), 0.0);
    }

    #[test]
    fn continuous_at_the_threshold() {
        let c = illustration();
        let th = c.threshold();
        // setting + wide-open drop, less the flow force at the stop (derived)
        assert!(
            th.total_drop_pa > 8.0 * BAR && th.total_drop_pa < 14.0 * BAR,
            "{th:?}"
        );
        let below = c.flow_at(th.total_drop_pa * (1.0 - 1e-9)).unwrap();
        let above = c.state_at(th.total_drop_pa * (1.0 + 1e-9)).unwrap();
        assert!(above.regulating);
        assert!((above.flow_m3_s - below).abs() < 1e-7 * th.flow_m3_s);
        assert!(
            above.stroke_m < 1e-6 * c.model().full_opening_m,
            "{above:?}"
        );
    }

    #[test]
    fn a_stiff_spring_raises_and_a_soft_spring_lets_flow_force_lower_the_plateau() {
        let stiff = ValveModel {
            spring_rate_n_m: 60_000.0,
            ..ValveModel::default()
        };
        let c = ValveCurve::new(10.0 * LPM, 8.0 * BAR, stiff, 0.05).unwrap();
        assert!(c.flow_at(200.0 * BAR).unwrap() > c.flow_at(20.0 * BAR).unwrap());
        let soft = ValveModel {
            spring_rate_n_m: 0.0,
            ..ValveModel::default()
        };
        let c = ValveCurve::new(10.0 * LPM, 8.0 * BAR, soft, 0.05).unwrap();
        assert!(c.flow_at(200.0 * BAR).unwrap() < c.flow_at(20.0 * BAR).unwrap());
    }

    #[test]
    fn band_limits_follow_the_setting_passed_in() {
        let c = ValveCurve::new(10.0 * LPM, 8.0 * BAR, ValveModel::default(), 0.02).unwrap();
        let (low, high) = c.band_limits();
        assert!((low / LPM - 9.8).abs() < 1e-12 && (high / LPM - 10.2).abs() < 1e-12);
    }

    #[test]
    fn bad_parameters_are_errors() {
        let m = ValveModel::default();
        assert!(ValveCurve::new(0.0, 8.0 * BAR, m, 0.05).is_err());
        assert!(ValveCurve::new(10.0 * LPM, f64::NAN, m, 0.05).is_err());
        assert!(ValveCurve::new(10.0 * LPM, 8.0 * BAR, m, 1.5).is_err());
        let bad = ValveModel {
            velocity_coefficient: 1.2,
            ..m
        };
        let err = ValveCurve::new(10.0 * LPM, 8.0 * BAR, bad, 0.05).unwrap_err();
        assert!(err.to_string().starts_with("velocity coefficient"), "{err}");
        assert!(illustration().state_at(f64::INFINITY).is_err());
    }

    proptest! {
        #[test]
        fn flow_never_exceeds_what_the_spring_can_hold(dp in 0.0f64..4e7) {
            let c = illustration();
            let q = c.flow_at(dp).unwrap();
            // the largest held drop is (F₀ + k·x₀)/A_s = 9.14 bar, √(9.14/8) = 1.069 (derived)
            prop_assert!((0.0..=1.07 * 10.0 * LPM).contains(&q));
        }

        #[test]
        fn the_orifice_branch_rises_with_the_drop(a in 0.0f64..1.0, b in 0.0f64..1.0) {
            let c = illustration();
            let th = c.threshold().total_drop_pa;
            let (lo, hi) = (a.min(b) * th, a.max(b) * th);
            prop_assert!(c.flow_at(lo).unwrap() <= c.flow_at(hi).unwrap());
        }
    }
}
