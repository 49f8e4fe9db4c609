//! Helpers for the physics unit tests and a few test-only unit factors.

pub(crate) use super::constants::{CENTISTOKES as CST, GPM, INCH, PSI};

/// Litres per minute in m³/s (exact).
pub(crate) const LPM: f64 = 1e-3 / 60.0;
/// One bar in pascals (exact).
pub(crate) const BAR: f64 = 1e5;
/// One pound-force in newtons, 0.453 592 37 · 9.806 65 (NIST SP 811 B.8, derived exact).
pub(crate) const LBF: f64 = 0.453_592_37 * 9.806_65;
/// One pound-mass in kilograms (exact).
pub(crate) const LBM: f64 = 0.453_592_37;
/// One horsepower (550 ft·lbf/s) in watts (NIST SP 811 B.8, derived exact).
pub(crate) const HP: f64 = 550.0 * 0.3048 * LBF;
/// One Btu_IT per hour in watts (NIST SP 811 B.8, derived exact).
pub(crate) const BTU_PER_HOUR: f64 = 1_055.055_852_62 / 3600.0;
/// One revolution per minute in rev/s.
pub(crate) const RPM: f64 = 1.0 / 60.0;
/// One cubic inch in m³.
pub(crate) const CUBIC_INCH: f64 = INCH * INCH * INCH;
/// One square inch in m².
pub(crate) const SQUARE_INCH: f64 = INCH * INCH;

/// Convert m³/s to gpm.
pub(crate) fn to_gpm(flow_m3_s: f64) -> f64 {
    flow_m3_s / GPM
}

/// Convert Pa to psi.
pub(crate) fn to_psi(pressure_pa: f64) -> f64 {
    pressure_pa / PSI
}

/// Assert `actual` is within `relative` of `expected` (relative to |expected|).
#[track_caller]
pub(crate) fn assert_close(actual: f64, expected: f64, relative: f64) {
    let error = ((actual - expected) / expected).abs();
    assert!(
        error <= relative,
        "expected {expected}, got {actual} (relative error {error:e} > {relative:e})"
    );
}

/// Assert `actual` rounds to `expected` printed with `decimals` decimal places,
/// i.e. lies within half a unit in the last printed digit.
#[track_caller]
pub(crate) fn assert_printed(actual: f64, expected: f64, decimals: i32) {
    let half_unit = 0.5 * 10f64.powi(-decimals);
    assert!(
        (actual - expected).abs() <= half_unit * (1.0 + 1e-9),
        "expected {expected} (±{half_unit}), got {actual}"
    );
}
