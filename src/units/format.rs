//! Printing quantities in a unit system with sensible rounding.

use super::unit::{self, Scale};
use super::{Kind, Quantity, UnitSystem};

/// Significant digits printed for a value: enough for gauge readings and
/// worked examples, few enough to read at a glance.
const SIGNIFICANT: i32 = 4;

/// A number rounded to four significant digits, without trailing zeros and
/// without exponent notation for everyday magnitudes (`2461.5` → `2462`,
/// `103.42` → `103.4`, `0.93510` → `0.9351`).
pub fn format_number(x: f64) -> String {
    if !x.is_finite() {
        return x.to_string();
    }
    if x == 0.0 {
        return "0".to_string();
    }
    let magnitude = x.abs().log10().floor() as i32;
    if !(-6..=9).contains(&magnitude) {
        return format!("{x:.3e}");
    }
    let decimals = (SIGNIFICANT - 1 - magnitude).clamp(0, 9) as usize;
    let mut s = format!("{x:.decimals$}");
    if s.contains('.') {
        s = s.trim_end_matches('0').trim_end_matches('.').to_string();
    }
    if s == "-0" {
        s = "0".to_string();
    }
    s
}

/// The number of `unit_symbol` units in `q` (`None` for an unknown symbol).
pub fn value_in(q: Quantity, unit_symbol: &str) -> Option<f64> {
    let u = unit::find(unit_symbol)?;
    if u.dimension != q.dimension() {
        return None;
    }
    // A difference printed in °C or °F is printed as an interval.
    if !q.is_temperature_point() {
        if let (Scale::Linear { factor, .. }, unit::Reference::TemperaturePoint) =
            (u.scale, u.reference)
        {
            return Some(q.si() / factor);
        }
    }
    Some(u.from_si(q.si()))
}

/// The quantity as text in the unit its kind is printed in, e.g. `103.4 bar`.
pub fn format(q: Quantity, kind: Kind, system: UnitSystem) -> String {
    let symbol = kind.display_unit(system);
    match kind {
        Kind::Ratio => format_number(q.si()),
        Kind::Fraction => format!("{} %", format_number(q.si() * 100.0)),
        _ => match value_in(q, symbol) {
            Some(v) => format!("{} {symbol}", format_number(v)),
            None => format!("{} {}", format_number(q.si()), q.dimension()),
        },
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::parse_as;

    fn shown(text: &str, kind: Kind, system: UnitSystem) -> String {
        format(parse_as(text, kind).unwrap(), kind, system)
    }

    #[test]
    fn rounding() {
        assert_eq!(format_number(2461.5), "2462");
        assert_eq!(format_number(103.421), "103.4");
        assert_eq!(format_number(0.935_10), "0.9351");
        assert_eq!(format_number(59_370.2), "59370");
        assert_eq!(format_number(20.0), "20");
        assert_eq!(format_number(-0.000_01), "-0.00001");
        assert_eq!(format_number(1.5e-9), "1.500e-9");
    }

    #[test]
    fn worked_unit_examples() {
        // NIST SP 811 B.8 factors (derived): 1500 psi = 103.421 bar; 210 bar = 3045.79 psi.
        assert_eq!(
            shown("1500 psi", Kind::Pressure, UnitSystem::Metric),
            "103.4 bar"
        );
        assert_eq!(shown("210 bar", Kind::Pressure, UnitSystem::Us), "3046 psi");
        // 10 gpm = 37.854 L/min.
        assert_eq!(
            shown("10 gpm", Kind::Flow, UnitSystem::Metric),
            "37.85 L/min"
        );
        // 180 °F = 82.22 °C; 82 °C = 179.6 °F.
        assert_eq!(
            shown("180 degF", Kind::Temperature, UnitSystem::Metric),
            "82.22 °C"
        );
        assert_eq!(
            shown("82 degC", Kind::Temperature, UnitSystem::Us),
            "179.6 °F"
        );
        // A difference of 5 K is 9 °F of rise.
        assert_eq!(
            shown("5 K", Kind::TemperatureDifference, UnitSystem::Us),
            "9 Δ°F"
        );
        assert_eq!(shown("92 %", Kind::Fraction, UnitSystem::Us), "92 %");
    }
}
