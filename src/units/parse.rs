//! Reading technician input such as `1500 psi`, `210bar`, `55 degC`,
//! `5 inHg`, `0.87` (specific gravity) into a [`Quantity`].

use super::unit::{Reference, STANDARD_ATMOSPHERE, WATER_DENSITY_60F};
use super::unit_expr::{parse_unit, UnitExpr};
use super::{Dimension, Kind, Quantity, UnitError};

/// Split a reading into its leading number and the rest (the unit text).
pub fn split_number(text: &str) -> Result<(f64, &str), UnitError> {
    let trimmed = text.trim();
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
        // NIST SP 811 B.8 factors throughout; worked unit examples of the reference sheet §1.3.
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
        // Reference sheet §1.3: 5 inHg vacuum = 16.932 kPa under atmospheric → 84.393 kPa abs.
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
