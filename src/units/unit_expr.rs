//! Unit expressions: a catalogue unit (`bar`, `psia`, `SUS`) or a product and
//! quotient of catalogue units with integer powers (`m^3/s`, `lbf*ft`,
//! `J/(kg*K)`).
//!
//! The grammar is small enough that a hand-written recursive-descent parser
//! is shorter and gives better messages than a parser library:
//! `expr := factor (('*' | '/') factor)*`, `factor := atom ('^' int)? | '(' expr ')' ('^' int)?`.

use super::unit::{self, Reference, Scale, Unit, UNITS};
use super::{Dimension, UnitError, MAX_READING_LENGTH};

/// The deepest nesting of brackets in a unit: `J/(kg*K)` needs one.
pub const MAX_UNIT_DEPTH: usize = 4;

/// A resolved unit: how to turn a number of it into SI.
#[derive(Clone, Debug, PartialEq)]
pub struct UnitExpr {
    /// The unit as written.
    pub text: String,
    /// The dimension.
    pub dimension: Dimension,
    /// The scale to SI.
    pub scale: Scale,
    /// What zero means.
    pub reference: Reference,
}

impl UnitExpr {
    fn from_unit(text: &str, u: &Unit) -> Self {
        UnitExpr {
            text: text.to_string(),
            dimension: u.dimension,
            scale: u.scale,
            reference: u.reference,
        }
    }

    /// The SI value of `number` of this unit.
    pub fn to_si(&self, number: f64) -> f64 {
        match self.scale {
            Scale::Linear { factor, offset } => number * factor + offset,
            Scale::Saybolt => super::saybolt::cst_from_sus(number).map_or(f64::NAN, |c| c * 1e-6),
        }
    }
}

/// Resolve a unit expression, e.g. `bar`, `L/min`, `in^3/rev`, `kPa abs`.
/// `reading` is the whole text, quoted in errors.
pub fn parse_unit(unit_text: &str, reading: &str) -> Result<UnitExpr, UnitError> {
    if unit_text.len() > MAX_READING_LENGTH {
        return Err(UnitError::TooLong {
            len: unit_text.len(),
            max: MAX_READING_LENGTH,
        });
    }
    let trimmed = collapse_spaces(unit_text.trim());
    if let Some(u) = unit::find(&trimmed) {
        return Ok(UnitExpr::from_unit(&trimmed, u));
    }
    let normal = normalise(&trimmed);
    if let Some(u) = unit::find(&normal) {
        return Ok(UnitExpr::from_unit(&trimmed, u));
    }
    let mut parser = Parser {
        depth: 0,
        src: normal.as_bytes(),
        pos: 0,
        reading,
        unit_text: &trimmed,
    };
    let (dimension, factor) = parser.expr()?;
    if parser.pos != parser.src.len() {
        return Err(parser.unknown());
    }
    Ok(UnitExpr {
        text: trimmed.clone(),
        dimension,
        scale: Scale::Linear {
            factor,
            offset: 0.0,
        },
        reference: Reference::Plain,
    })
}

fn collapse_spaces(s: &str) -> String {
    s.split_whitespace().collect::<Vec<_>>().join(" ")
}

fn normalise(s: &str) -> String {
    s.replace('²', "^2")
        .replace('³', "^3")
        .replace('·', "*")
        .replace('μ', "µ")
        .replace(" / ", "/")
        .replace(" * ", "*")
}

struct Parser<'a> {
    depth: usize,
    src: &'a [u8],
    pos: usize,
    reading: &'a str,
    unit_text: &'a str,
}

impl Parser<'_> {
    fn expr(&mut self) -> Result<(Dimension, f64), UnitError> {
        let (mut dim, mut factor) = self.factor()?;
        while let Some(&op) = self.src.get(self.pos) {
            if op != b'*' && op != b'/' {
                break;
            }
            self.pos += 1;
            let (d, f) = self.factor()?;
            let combined = if op == b'*' {
                factor *= f;
                dim.checked_times(d)
            } else {
                factor /= f;
                dim.checked_per(d)
            };
            dim = combined.ok_or_else(|| self.too_complex())?;
        }
        Ok((dim, factor))
    }

    fn factor(&mut self) -> Result<(Dimension, f64), UnitError> {
        let (dim, factor) = if self.src.get(self.pos) == Some(&b'(') {
            self.pos += 1;
            self.depth += 1;
            if self.depth > MAX_UNIT_DEPTH {
                return Err(self.bad(&format!(
                    "brackets in the unit are nested more than {MAX_UNIT_DEPTH} deep"
                )));
            }
            let inner = self.expr()?;
            self.depth -= 1;
            if self.src.get(self.pos) != Some(&b')') {
                return Err(self.bad("unbalanced bracket in the unit"));
            }
            self.pos += 1;
            inner
        } else {
            self.atom()?
        };
        if self.src.get(self.pos) == Some(&b'^') {
            self.pos += 1;
            let start = self.pos;
            if self.src.get(self.pos) == Some(&b'-') {
                self.pos += 1;
            }
            while self.src.get(self.pos).is_some_and(u8::is_ascii_digit) {
                self.pos += 1;
            }
            let digits = std::str::from_utf8(&self.src[start..self.pos]).unwrap_or("");
            let n: i8 = digits
                .parse()
                .ok()
                .filter(|n: &i8| (-4..=4).contains(n))
                .ok_or_else(|| self.bad("a unit power must be a whole number from -4 to 4"))?;
            let dim = dim.checked_powi(n).ok_or_else(|| self.too_complex())?;
            return Ok((dim, factor.powi(i32::from(n))));
        }
        Ok((dim, factor))
    }

    fn atom(&mut self) -> Result<(Dimension, f64), UnitError> {
        let start = self.pos;
        while self
            .src
            .get(self.pos)
            .is_some_and(|c| !matches!(c, b'*' | b'/' | b'^' | b'(' | b')'))
        {
            self.pos += 1;
        }
        let name = std::str::from_utf8(&self.src[start..self.pos]).unwrap_or("");
        if name.is_empty() {
            return Err(self.unknown());
        }
        let u = unit::find(name).ok_or_else(|| self.unknown())?;
        match (u.scale, u.reference) {
            (Scale::Saybolt, _) => Err(self.bad("SUS cannot be combined with other units")),
            (_, Reference::AbsolutePressure | Reference::Vacuum) => {
                Err(self.bad("an absolute or vacuum pressure cannot be combined with other units"))
            }
            // Inside a compound unit a temperature scale stands for its interval.
            _ => Ok((u.dimension, u.interval_factor().unwrap_or(1.0))),
        }
    }

    fn bad(&self, reason: &str) -> UnitError {
        UnitError::BadUnit {
            text: self.reading.to_string(),
            reason: reason.to_string(),
        }
    }

    fn too_complex(&self) -> UnitError {
        self.bad(&format!(
            "the unit is too complex (a power of a base unit exceeds {})",
            Dimension::MAX_EXPONENT
        ))
    }

    fn unknown(&self) -> UnitError {
        UnitError::UnknownUnit {
            text: self.reading.to_string(),
            unit: self.unit_text.to_string(),
            suggestion: crate::suggest::suggest(
                self.unit_text,
                UNITS.iter().flat_map(|u| u.spellings()),
            )
            .and_then(unit::find)
            .map(|u| u.symbol.to_string()),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn factor(text: &str) -> f64 {
        match parse_unit(text, text).unwrap().scale {
            Scale::Linear { factor, .. } => factor,
            Scale::Saybolt => panic!("non-linear"),
        }
    }

    #[test]
    fn compounds() {
        assert_eq!(parse_unit("m^3/s", "").unwrap().dimension, Dimension::FLOW);
        assert!((factor("lbf*ft") - 1.355_817_948).abs() < 1e-8);
        assert_eq!(
            parse_unit("J/(kg*K)", "").unwrap().dimension,
            Dimension::SPECIFIC_HEAT
        );
        assert_eq!(
            parse_unit("N/m^2", "").unwrap().dimension,
            Dimension::PRESSURE
        );
        // A temperature scale inside a compound is an interval: 1 degF/min = 5/9 K/min.
        assert!((factor("degF/min") - 5.0 / 9.0 / 60.0).abs() < 1e-12);
        assert_eq!(
            parse_unit("kg·m²", "").unwrap().dimension,
            Dimension::INERTIA
        );
    }

    #[test]
    fn errors() {
        assert!(matches!(
            parse_unit("kPA", "3 kPA"),
            Err(UnitError::UnknownUnit { suggestion: Some(s), .. }) if s == "kPa"
        ));
        assert!(matches!(
            parse_unit("SUS/s", "x"),
            Err(UnitError::BadUnit { .. })
        ));
        assert!(matches!(
            parse_unit("m^x", "x"),
            Err(UnitError::BadUnit { .. })
        ));
        assert!(matches!(
            parse_unit("(m", "x"),
            Err(UnitError::BadUnit { .. })
        ));
        assert!(matches!(
            parse_unit("m//s", "x"),
            Err(UnitError::UnknownUnit { .. })
        ));
    }

    #[test]
    fn brackets_nested_past_the_limit_are_refused_without_recursing() {
        assert_eq!(
            parse_unit(&nested_text(MAX_UNIT_DEPTH), "x")
                .unwrap()
                .dimension,
            Dimension::AREA
        );
        // 100 levels fit in the length limit; thousands overflowed the stack.
        for n in [MAX_UNIT_DEPTH + 1, 100] {
            assert_eq!(
                parse_unit(&nested_text(n), "1 x").map_err(|e| e.to_string()),
                Err("`1 x`: brackets in the unit are nested more than 4 deep".to_string())
            );
        }
    }

    #[test]
    fn a_unit_longer_than_a_reading_is_refused_unparsed() {
        let text = nested_text(4000);
        assert_eq!(
            parse_unit(&text, "x").map_err(|e| e.to_string()),
            Err(
                "a reading of 8003 bytes is longer than the limit of 256 bytes \
                 (expected a number and a unit, e.g. `1500 psi`)"
                    .to_string()
            )
        );
    }

    fn nested_text(n: usize) -> String {
        format!("m*{}m{}", "(".repeat(n), ")".repeat(n))
    }

    #[test]
    fn powers_beyond_the_limit_are_refused_not_wrapped() {
        // 33 metres multiplied: one past the limit (in i8 arithmetic, 128 of
        // them wrapped round to a plain number).
        for text in [
            "m^4*".repeat(8) + "m",
            format!("m^-1/{}", "m^4/".repeat(7) + "m^4"),
            format!("({})^4", "m^4*".repeat(2) + "m"),
            "m^4*".repeat(40) + "m",
        ] {
            assert_eq!(
                parse_unit(&text, "1 x").map_err(|e| e.to_string()),
                Err(
                    "`1 x`: the unit is too complex (a power of a base unit exceeds 32)"
                        .to_string()
                ),
                "{text}"
            );
        }
        let at_limit = "m^4*".repeat(7) + "m^4";
        assert_eq!(
            parse_unit(&at_limit, "1 x").unwrap().dimension,
            Dimension::new(0, 32, 0, 0)
        );
    }
}
