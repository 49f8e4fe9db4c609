//! Reading technician input such as `1500 psi`, `210bar`, `55 degC`,
//! `5 inHg`, `0.87` (specific gravity) into a [`Quantity`].

use super::unit::{Reference, STANDARD_ATMOSPHERE, WATER_DENSITY_60F};
use super::unit_expr::{parse_unit, UnitExpr};
use super::{Dimension, Kind, Quantity, UnitError};

/// The longest reading accepted, in bytes after trimming: far above any
/// number with its unit (`1500 psi`, `2.8 in^3/rev`), low enough that no
/// pasted text is scanned, quoted back whole or parsed as a unit.
pub const MAX_READING_LENGTH: usize = 256;

/// Split a reading into its leading number and the rest (the unit text).
pub fn split_number(text: &str) -> Result<(f64, &str), UnitError> {
    let trimmed = text.trim();
    if trimmed.len() > MAX_READING_LENGTH {
        return Err(UnitError::TooLong {
            len: trimmed.len(),
            max: MAX_READING_LENGTH,
        });
    }
    if trimmed.is_empty() {
        return Err(UnitError::Empty);
    }
    let bytes = trimmed.as_bytes();
    let mut end = 0;
    if matches!(bytes.first(), Some(b'+' | b'-')) {
        end = 1;
    }
    let digits_start = end;
    let (mantissa_len, number_len) = number_len(&trimmed[digits_start..]);
    end = digits_start + mantissa_len;
    let mantissa = &trimmed[digits_start..end];
    if bytes.get(end) == Some(&b',') && bytes.get(end + 1).is_some_and(u8::is_ascii_digit) {
        return Err(UnitError::Comma {
            text: trimmed.to_string(),
        });
    }
    if mantissa.is_empty() || mantissa == "." || mantissa.matches('.').count() > 1 {
        let word = trimmed[digits_start..].to_ascii_lowercase();
        if ["nan", "inf", "infinity"]
            .iter()
            .any(|w| word.starts_with(w))
        {
            return Err(UnitError::NonFinite {
                text: trimmed.to_string(),
            });
        }
        return Err(UnitError::NotANumber {
            text: trimmed.to_string(),
        });
    }
    end = digits_start + number_len;
    let number: f64 = trimmed[..end].parse().map_err(|_| UnitError::NotANumber {
        text: trimmed.to_string(),
    })?;
    if !number.is_finite() {
        return Err(UnitError::NonFinite {
            text: trimmed.to_string(),
        });
    }
    Ok((number, trimmed[end..].trim()))
}

/// The unsigned number at the very start of `text`: the length in bytes of
/// its mantissa (digits and points) and of the whole number (the mantissa
/// and an exponent such as `e-3`, if one follows). `5 e` has no exponent.
///
/// Readings and formulas both scan numbers with this, so that they never
/// disagree about where a number ends and its unit begins.
pub(crate) fn number_len(text: &str) -> (usize, usize) {
    let bytes = text.as_bytes();
    let mut end = 0;
    while end < bytes.len() && (bytes[end].is_ascii_digit() || bytes[end] == b'.') {
        end += 1;
    }
    let mantissa = end;
    if matches!(bytes.get(end), Some(b'e' | b'E')) {
        let mut k = end + 1;
        if matches!(bytes.get(k), Some(b'+' | b'-')) {
            k += 1;
        }
        if bytes.get(k).is_some_and(u8::is_ascii_digit) {
            while bytes.get(k).is_some_and(u8::is_ascii_digit) {
                k += 1;
            }
            end = k;
        }
    }
    (mantissa, end)
}

/// Parse a reading of any dimension. A bare number is a plain ratio; a
/// temperature in °C or °F is a point.
pub fn parse_quantity(text: &str) -> Result<Quantity, UnitError> {
    let (number, unit_text) = split_number(text)?;
    if unit_text.is_empty() {
        return Ok(Quantity::number(number));
    }
    let unit = parse_unit(unit_text, text.trim())?;
    to_quantity(text, number, &unit)
}

fn to_quantity(text: &str, number: f64, unit: &UnitExpr) -> Result<Quantity, UnitError> {
    let si = unit.to_si(number);
    if !si.is_finite() {
        return Err(UnitError::OutOfRange {
            text: text.trim().to_string(),
            reason: "a SUS reading must be at least 32 SUS".to_string(),
        });
    }
    match unit.reference {
        Reference::TemperaturePoint => {
            if si < 0.0 {
                return Err(UnitError::BelowAbsoluteZero {
                    text: text.trim().to_string(),
                });
            }
            Ok(Quantity::temperature(si))
        }
        _ => Ok(Quantity::new(si, unit.dimension)),
    }
}

/// Parse a reading that must be of `kind`: checks the dimension, reads a
/// bare number as specific gravity for a density and as a fraction for a
/// fraction, turns kelvin into a temperature point for a temperature and a
/// °C/°F reading into an interval for a temperature difference, and rejects
/// negatives where they cannot be real.
pub fn parse_as(text: &str, kind: Kind) -> Result<Quantity, UnitError> {
    let quoted = text.trim().to_string();
    let (number, unit_text) = split_number(text)?;
    let quantity = if unit_text.is_empty() || unit_text == "SG" || unit_text == "sg" {
        bare_number(&quoted, number, unit_text, kind)?
    } else {
        let unit = parse_unit(unit_text, &quoted)?;
        if unit.dimension != kind.dimension() {
            return Err(UnitError::WrongDimension {
                text: quoted,
                unit: unit.text,
                expected: kind_label(kind).to_string(),
                found: unit.dimension.name(),
                examples: kind.example_units().to_string(),
            });
        }
        match (kind, unit.reference) {
            (Kind::TemperatureDifference, Reference::TemperaturePoint) => {
                let factor = super::unit::find(unit_text.trim())
                    .and_then(|u| u.interval_factor())
                    .unwrap_or(1.0);
                Quantity::new(number * factor, Dimension::TEMPERATURE)
            }
            (Kind::Temperature, Reference::Plain) => {
                let kelvin = unit.to_si(number);
                if kelvin < 0.0 {
                    return Err(UnitError::BelowAbsoluteZero { text: quoted });
                }
                Quantity::temperature(kelvin)
            }
            _ => to_quantity(&quoted, number, &unit)?,
        }
    };
    check_sign(&quoted, quantity, kind)?;
    Ok(quantity)
}

fn bare_number(
    text: &str,
    number: f64,
    unit_text: &str,
    kind: Kind,
) -> Result<Quantity, UnitError> {
    match kind {
        Kind::Ratio | Kind::Fraction => Ok(Quantity::number(number)),
        // A bare number for a density is a specific gravity (water at 60 °F).
        Kind::Density => Ok(Quantity::new(
            number * WATER_DENSITY_60F,
            Dimension::DENSITY,
        )),
        _ if !unit_text.is_empty() => Err(UnitError::WrongDimension {
            text: text.to_string(),
            unit: unit_text.to_string(),
            expected: kind_label(kind).to_string(),
            found: "specific gravity".to_string(),
            examples: kind.example_units().to_string(),
        }),
        _ => Err(UnitError::MissingUnit {
            text: text.to_string(),
            kind: kind_label(kind).to_string(),
            examples: kind.example_units().to_string(),
        }),
    }
}

fn check_sign(text: &str, q: Quantity, kind: Kind) -> Result<(), UnitError> {
    if kind == Kind::Pressure && q.si() < -STANDARD_ATMOSPHERE {
        return Err(UnitError::BelowVacuum {
            text: text.to_string(),
        });
    }
    if !kind.allows_negative() && q.si() < 0.0 {
        return Err(UnitError::Negative {
            text: text.to_string(),
            kind: kind_label(kind).to_string(),
        });
    }
    Ok(())
}

/// A kind's name in plain words for messages ("shaft speed", not "shaft-speed").
fn kind_label(kind: Kind) -> String {
    kind.name().replace('-', " ")
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::unit::{INCH, PSI, US_GALLON};

    fn si(text: &str, kind: Kind) -> f64 {
        parse_as(text, kind)
            .unwrap_or_else(|e| panic!("{text}: {e}"))
            .si()
    }

    fn close(a: f64, b: f64, rel: f64) -> bool {
        ((a - b) / b).abs() <= rel
    }

    #[test]
    fn the_readings_a_technician_types() {
        // NIST SP 811 B.8 factors throughout (derived).
        let cases: &[(&str, Kind, f64)] = &[
            ("1500 psi", Kind::Pressure, 1500.0 * PSI),
            ("103 bar", Kind::Pressure, 103e5),
            ("10.3 MPa", Kind::Pressure, 10.3e6),
            ("690 kPa", Kind::Pressure, 690e3),
            ("210bar", Kind::Pressure, 210e5),
            ("38 L/min", Kind::Flow, 38e-3 / 60.0),
            ("10 gpm", Kind::Flow, 10.0 * US_GALLON / 60.0),
            ("2.8 in^3/rev", Kind::Displacement, 2.8 * INCH.powi(3)),
            ("45 cc/rev", Kind::Displacement, 45e-6),
            ("1200 rpm", Kind::ShaftSpeed, 20.0),
            ("55 degC", Kind::Temperature, 328.15),
            ("131 degF", Kind::Temperature, (131.0 + 459.67) * 5.0 / 9.0),
            ("46 cSt", Kind::KinematicViscosity, 46e-6),
            ("0.25 in", Kind::Length, 0.25 * INCH),
            ("12 mm", Kind::Length, 0.012),
            ("78.5 cm^2", Kind::Area, 78.5e-4),
            ("78.5 cm²", Kind::Area, 78.5e-4),
            ("3 kW", Kind::Power, 3000.0),
            ("2.5 Hz", Kind::Frequency, 2.5),
            ("870 kg/m^3", Kind::Density, 870.0),
            ("3 %", Kind::Fraction, 0.03),
            ("3%", Kind::Fraction, 0.03),
            ("1.5e3 psi", Kind::Pressure, 1500.0 * PSI),
            ("330 K", Kind::Temperature, 330.0),
            ("5 K", Kind::TemperatureDifference, 5.0),
            ("9 dF", Kind::TemperatureDifference, 5.0),
            ("9 degF", Kind::TemperatureDifference, 5.0),
        ];
        for (text, kind, want) in cases {
            assert!(close(si(text, *kind), *want, 1e-12), "{text}");
        }
        // NIST SP 811 B.8 (derived exact): 1 hp = 745.6998715822702 W
        assert!(close(
            si("4 hp", Kind::Power),
            4.0 * 745.699_871_582_270_2,
            1e-12
        ));
    }

    #[test]
    fn vacuum_absolute_and_specific_gravity() {
        // NIST SP 811 B.8, conventional inHg (derived): 5 inHg vacuum = 16.932 kPa under atmospheric → 84.393 kPa abs.
        let vac = si("5 inHg", Kind::Pressure);
        assert!((vac + 16931.9432).abs() < 1e-3);
        assert!(((vac + STANDARD_ATMOSPHERE) - 84_393.0).abs() < 1.0);
        // 0.80 bar abs is 0.21325 bar below standard atmosphere.
        assert!((si("0.80 bar abs", Kind::Pressure) + 21_325.0).abs() < 1e-6);
        assert!(
            (si("14.7 psia", Kind::Pressure) - (14.7 * PSI - STANDARD_ATMOSPHERE)).abs() < 1e-6
        );
        // A bare density is a specific gravity against water at 60 °F.
        assert!((si("0.87", Kind::Density) - 869.13).abs() < 1e-9);
        // ASTM D2161 inverse: 215 SUS → 46.18 cSt.
        assert!((si("215 SUS", Kind::KinematicViscosity) * 1e6 - 46.18).abs() < 0.005);
    }

    #[test]
    fn generic_parse_keeps_points_apart() {
        assert!(parse_quantity("55 degC").unwrap().is_temperature_point());
        assert!(!parse_quantity("5 K").unwrap().is_temperature_point());
        assert_eq!(parse_quantity("0.92").unwrap(), Quantity::number(0.92));
    }
}

#[cfg(test)]
mod bad_input {
    use super::*;

    /// Malformed readings, the kind expected, and the whole message.
    const CASES: &[(&str, Kind, &str)] = &[
        ("", Kind::Pressure, "empty reading: expected a number and a unit, e.g. `1500 psi`"),
        ("   ", Kind::Flow, "empty reading: expected a number and a unit, e.g. `1500 psi`"),
        ("psi", Kind::Pressure, "`psi` does not start with a number (expected e.g. `1500 psi`)"),
        ("abc", Kind::Pressure, "`abc` does not start with a number (expected e.g. `1500 psi`)"),
        (".", Kind::Pressure, "`.` does not start with a number (expected e.g. `1500 psi`)"),
        ("1.2.3 bar", Kind::Pressure, "`1.2.3 bar` does not start with a number (expected e.g. `1500 psi`)"),
        ("- bar", Kind::Pressure, "`- bar` does not start with a number (expected e.g. `1500 psi`)"),
        ("NaN psi", Kind::Pressure, "`NaN psi` is not a finite number"),
        ("inf bar", Kind::Pressure, "`inf bar` is not a finite number"),
        ("-infinity", Kind::Ratio, "`-infinity` is not a finite number"),
        ("1e999 psi", Kind::Pressure, "`1e999 psi` is not a finite number"),
        ("1,500 psi", Kind::Pressure, "`1,500 psi`: write decimals with a point and no thousands separator (e.g. `1500.5`)"),
        ("10,3 bar", Kind::Pressure, "`10,3 bar`: write decimals with a point and no thousands separator (e.g. `1500.5`)"),
        ("1500", Kind::Pressure, "`1500` has no unit: expected a pressure unit such as psi, bar, kPa, MPa, psia, inHg (vacuum)"),
        ("38", Kind::Flow, "`38` has no unit: expected a flow unit such as L/min, gpm, cm³/min"),
        ("55", Kind::Temperature, "`55` has no unit: expected a temperature unit such as degC, degF"),
        ("1500 psu", Kind::Pressure, "`1500 psu`: unknown unit `psu` (did you mean `psi`?)"),
        ("690 kPA", Kind::Pressure, "`690 kPA`: unknown unit `kPA` (did you mean `kPa`?)"),
        ("103 bra", Kind::Pressure, "`103 bra`: unknown unit `bra` (did you mean `bar`?)"),
        ("10 gmp", Kind::Flow, "`10 gmp`: unknown unit `gmp` (did you mean `gpm`?)"),
        ("1200 rmp", Kind::ShaftSpeed, "`1200 rmp`: unknown unit `rmp` (did you mean `rpm`?)"),
        ("46 cts", Kind::KinematicViscosity, "`46 cts`: unknown unit `cts` (did you mean `cSt`?)"),
        ("3 furlongs", Kind::Length, "`3 furlongs`: unknown unit `furlongs`"),
        ("38 L/min", Kind::Pressure, "`38 L/min`: `L/min` is a flow unit, but a pressure is expected (e.g. psi, bar, kPa, MPa, psia, inHg (vacuum))"),
        ("1500 psi", Kind::Flow, "`1500 psi`: `psi` is a pressure unit, but a flow is expected (e.g. L/min, gpm, cm³/min)"),
        ("1200 rpm", Kind::Temperature, "`1200 rpm`: `rpm` is a speed or frequency (per time) unit, but a temperature is expected (e.g. degC, degF)"),
        ("12 mm", Kind::Area, "`12 mm`: `mm` is a length unit, but a area is expected (e.g. cm^2, in^2)"),
        ("0.87", Kind::Flow, "`0.87` has no unit: expected a flow unit such as L/min, gpm, cm³/min"),
        ("0.87 SG", Kind::Pressure, "`0.87 SG`: `SG` is a specific gravity unit, but a pressure is expected (e.g. psi, bar, kPa, MPa, psia, inHg (vacuum))"),
        ("-10 L/min", Kind::Flow, "`-10 L/min`: a flow cannot be negative"),
        ("-45 cc/rev", Kind::Displacement, "`-45 cc/rev`: a displacement cannot be negative"),
        ("-3 cSt", Kind::KinematicViscosity, "`-3 cSt`: a kinematic viscosity cannot be negative"),
        ("-12 mm", Kind::Length, "`-12 mm`: a length cannot be negative"),
        ("-300 degC", Kind::Temperature, "`-300 degC` is below absolute zero"),
        ("-500 degF", Kind::Temperature, "`-500 degF` is below absolute zero"),
        ("40 inHg", Kind::Pressure, "`40 inHg` is below a perfect vacuum (more than one atmosphere under gauge zero)"),
        ("-2 bar", Kind::Pressure, "`-2 bar` is below a perfect vacuum (more than one atmosphere under gauge zero)"),
        ("20 SUS", Kind::KinematicViscosity, "`20 SUS`: a SUS reading must be at least 32 SUS"),
        ("5 SUS/s", Kind::KinematicViscosity, "`5 SUS/s`: SUS cannot be combined with other units"),
        ("3 m^x", Kind::Area, "`3 m^x`: a unit power must be a whole number from -4 to 4"),
        ("3 (m", Kind::Length, "`3 (m`: unbalanced bracket in the unit"),
        ("3 psia/s", Kind::Pressure, "`3 psia/s`: an absolute or vacuum pressure cannot be combined with other units"),
    ];

    #[test]
    fn a_reading_longer_than_the_limit_is_refused_unread() {
        let longest = format!("1{} psi", "0".repeat(MAX_READING_LENGTH - 5));
        assert_eq!(longest.len(), MAX_READING_LENGTH);
        assert!(parse_as(&format!("  {longest}  "), Kind::Pressure).is_ok());
        let pasted = format!("{longest}x");
        for result in [parse_as(&pasted, Kind::Pressure), parse_quantity(&pasted)] {
            assert_eq!(
                result.map_err(|e| e.to_string()),
                Err(
                    "a reading of 257 bytes is longer than the limit of 256 bytes \
                     (expected a number and a unit, e.g. `1500 psi`)"
                        .to_string()
                )
            );
        }
    }

    #[test]
    fn every_malformed_reading_gets_its_message() {
        assert!(CASES.len() >= 30);
        for (text, kind, want) in CASES {
            match parse_as(text, *kind) {
                Ok(q) => panic!("`{text}` parsed as {q:?}"),
                Err(e) => assert_eq!(e.to_string(), *want, "for `{text}`"),
            }
        }
        println!(
            "{} malformed readings rejected with their messages",
            CASES.len()
        );
    }
}

#[cfg(test)]
mod properties {
    use super::*;
    use crate::units::{format_number, unit::UNITS, value_in};
    use proptest::prelude::*;

    proptest! {
        /// Reading a value in any linear unit and printing it back in the same
        /// unit gives the number typed.
        #[test]
        fn round_trip_through_si(index in 0..UNITS.len(), x in 0.001f64..1e6) {
            let unit = &UNITS[index];
            let parsed = parse_quantity(&format!("{x} {}", unit.symbol));
            prop_assume!(parsed.is_ok());
            let back = value_in(parsed.unwrap(), unit.symbol).unwrap();
            prop_assert!(((back - x) / x).abs() < 1e-9, "{} {} came back as {}", x, unit.symbol, back);
        }

        /// psi → bar → psi and °F → °C → °F round trips.
        #[test]
        fn cross_unit_round_trip(x in -10.0f64..1e4) {
            let p = parse_as(&format!("{x} psi"), Kind::Pressure).unwrap();
            let bar = value_in(p, "bar").unwrap();
            let again = parse_as(&format!("{bar:e} bar"), Kind::Pressure).unwrap();
            prop_assert!((again.si() - p.si()).abs() <= 1e-9 * p.si().abs().max(1.0));
            let t = parse_as(&format!("{x} degF"), Kind::Temperature).unwrap();
            let c = value_in(t, "°C").unwrap();
            let t2 = parse_as(&format!("{c:e} degC"), Kind::Temperature).unwrap();
            prop_assert!((t2.si() - t.si()).abs() < 1e-9);
        }

        /// Printing never panics and never prints NaN for a finite value.
        #[test]
        fn printing_is_total(x in proptest::num::f64::NORMAL) {
            prop_assert!(!format_number(x).contains("NaN"));
        }

        /// No text makes the parser panic.
        #[test]
        fn parser_never_panics(s in "\\PC{0,24}") {
            let _ = parse_quantity(&s);
            let _ = parse_as(&s, Kind::Pressure);
        }
    }
}
