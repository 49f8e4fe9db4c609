//! Exact unit factors and reference states the formulas need, in SI.
//!
//! Source: NIST SP 811 (2008 ed.), App. B.8; the values here are the exact ones
//! that follow from the defining constants (1 in = 0.0254 m, 1 lb = 0.453 592 37 kg,
//! g_n = 9.806 65 m/s², 1 US gal = 231 in³).

/// Standard acceleration of gravity, m/s² (exact by definition).
pub const STANDARD_GRAVITY: f64 = 9.806_65;

/// One inch in metres (exact by definition).
pub const INCH: f64 = 0.0254;

/// One pound-force per square inch in pascals: 0.453 592 37 · 9.806 65 / 0.0254²
/// (NIST SP 811 B.8, derived exact).
pub const PSI: f64 = 0.453_592_37 * STANDARD_GRAVITY / (INCH * INCH);

/// One US gallon (231 in³) in cubic metres (NIST SP 811 B.8, exact).
pub const US_GALLON: f64 = 231.0 * INCH * INCH * INCH;

/// One US gallon per minute in m³/s (NIST SP 811 B.8, exact).
pub const GPM: f64 = US_GALLON / 60.0;

/// The standard atmosphere in pascals (NIST SP 811 B.8, exact).
pub const STANDARD_ATMOSPHERE: f64 = 101_325.0;

/// Density of water taken as the reference for specific gravity, kg/m³
/// (the round value used for the US orifice constant K = 37.973; derived).
pub const WATER_DENSITY: f64 = 1000.0;

/// One centistokes (mm²/s) in m²/s (NIST SP 811 B.8, exact).
pub const CENTISTOKES: f64 = 1e-6;

/// Offset between degrees Celsius and kelvin, K (exact by definition).
pub const CELSIUS_OFFSET: f64 = 273.15;

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::testing::assert_close;

    #[test]
    fn factors_match_nist() {
        // NIST SP 811 B.8 (derived exact)
        assert_close(PSI, 6_894.757_293_168_361, 1e-9);
        // NIST SP 811 B.8
        assert_close(US_GALLON * 1000.0, 3.785_411_784, 1e-9);
        // NIST SP 811 B.8: gpm → m³/s 6.309 019 64 E−05 (exact)
        assert_close(GPM, 6.309_019_64e-5, 1e-9);
    }
}
