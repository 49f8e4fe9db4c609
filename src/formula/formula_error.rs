//! Errors from compiling or evaluating a formula, each with the byte span of
//! the source text it is about.

use std::fmt;

/// A byte range `start..end` in a formula's source text.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Hash)]
pub struct Span {
    /// First byte.
    pub start: usize,
    /// One past the last byte.
    pub end: usize,
}

impl Span {
    /// The span `start..end`.
    pub fn new(start: usize, end: usize) -> Self {
        Span { start, end }
    }

    /// The smallest span covering both.
    pub fn to(self, other: Span) -> Span {
        Span::new(self.start.min(other.start), self.end.max(other.end))
    }

    /// The same span moved `offset` bytes to the right.
    pub fn shifted(self, offset: usize) -> Span {
        Span::new(self.start + offset, self.end + offset)
    }
}

/// What went wrong. Messages are lowercase with no trailing period so that
/// they can be prefixed with a location.
#[derive(Clone, Debug, PartialEq, thiserror::Error)]
#[non_exhaustive]
pub enum FormulaErrorKind {
    /// Comparisons written as a chain, `a < b < c`.
    #[error("comparisons cannot be chained: use `and`, as in `a < b and b < c`")]
    ChainedComparison,
    /// A power of a power, `a^2^3`.
    #[error("a power of a power is ambiguous: add brackets, as in `(a^2)^3`")]
    ChainedPower,
    /// A dimension exponent left the range the checker works in.
    #[error("the units of this expression are too complex (a power of a base unit exceeds {max})")]
    DimensionOverflow {
        /// The largest exponent allowed.
        max: i8,
    },
    /// A function registered twice.
    #[error("function `{name}` is already defined")]
    DuplicateFunction {
        /// The function's name.
        name: String,
    },
    /// A formula with nothing in it.
    #[error("empty formula")]
    Empty,
    /// A token that does not belong where it stands.
    #[error("expected {expected}, found {found}")]
    Expected {
        /// What would have been accepted, e.g. "`)`".
        expected: String,
        /// What was found, e.g. "`,`" or "the end of the formula".
        found: String,
    },
    /// A registered function reported that it cannot compute a result.
    #[error("`{name}` failed: {message}")]
    FunctionFailed {
        /// The function's name.
        name: String,
        /// Its explanation.
        message: String,
    },
    /// A reading whose dimension is not the one its name was declared with.
    #[error("the reading `{name}` is {found}, but it was declared as {expected}")]
    InputMismatch {
        /// The reading's name, with its operating point.
        name: String,
        /// The declared type, with an article.
        expected: String,
        /// The given value's type, with an article.
        found: String,
    },
    /// A number with a unit that is valid text but not a valid value
    /// (below absolute zero, a SUS reading under 32).
    #[error("{message}")]
    InvalidLiteral {
        /// The unit parser's explanation.
        message: String,
    },
    /// A malformed number such as `1.2.3` or `1e999`.
    #[error("malformed number `{text}`")]
    MalformedNumber {
        /// The number as written.
        text: String,
    },
    /// Arithmetic that gave NaN or infinity.
    #[error("{reason} in `{operation}`")]
    NotFinite {
        /// The operation, printed as formula text.
        operation: String,
        /// What went wrong, e.g. "division by zero".
        reason: String,
    },
    /// A type or dimension error found while checking.
    #[error("{message}")]
    Type {
        /// The explanation, e.g. "cannot compare a pressure with a flow".
        message: String,
    },
    /// A formula longer than the limit.
    #[error("formula is {len} bytes long; the limit is {max}")]
    TooLong {
        /// The formula's length in bytes.
        len: usize,
        /// The limit.
        max: usize,
    },
    /// Brackets, calls or operators nested beyond the limit.
    #[error(
        "formula is nested too deeply (more than {max} levels of brackets, operators or calls)"
    )]
    TooDeep {
        /// The limit.
        max: usize,
    },
    /// A character that starts no token.
    #[error("unexpected character `{ch}`")]
    UnexpectedChar {
        /// The character, escaped if it is invisible.
        ch: String,
    },
    /// A function name that is neither built in nor registered.
    #[error("unknown function `{name}`{}", did_you_mean(suggestion))]
    UnknownFunction {
        /// The name as written.
        name: String,
        /// The nearest known function.
        suggestion: Option<String>,
    },
    /// An operating point (`@loaded`) the rule base does not declare.
    #[error("unknown operating point `{point}`{}", did_you_mean(suggestion))]
    UnknownPoint {
        /// The point as written.
        point: String,
        /// The nearest declared point.
        suggestion: Option<String>,
    },
    /// A name the rule base does not declare.
    #[error("unknown quantity `{name}`{}", did_you_mean(suggestion))]
    UnknownQuantity {
        /// The name as written.
        name: String,
        /// The nearest declared name.
        suggestion: Option<String>,
    },
    /// A unit that is not in the catalogue.
    #[error("unknown unit `{unit}`{}", did_you_mean(suggestion))]
    UnknownUnit {
        /// The unit as written.
        unit: String,
        /// The nearest catalogue unit.
        suggestion: Option<String>,
    },
    /// An operator from another language, with ours to use instead.
    #[error("`{found}` is not an operator here: use `{instead}`")]
    UseInstead {
        /// What was written, e.g. `&&`.
        found: String,
        /// What to write, e.g. `and`.
        instead: &'static str,
    },
}

fn did_you_mean(suggestion: &Option<String>) -> String {
    suggestion
        .as_ref()
        .map(|s| format!(" (did you mean `{s}`?)"))
        .unwrap_or_default()
}

/// An error in a formula: what went wrong and where in the source.
#[derive(Clone, Debug, PartialEq, thiserror::Error)]
#[error("{kind}")]
pub struct FormulaError {
    /// What went wrong.
    pub kind: FormulaErrorKind,
    /// The source bytes it is about.
    pub span: Span,
}

impl FormulaError {
    /// An error of `kind` about the bytes in `span`.
    pub fn new(kind: FormulaErrorKind, span: Span) -> Self {
        FormulaError { kind, span }
    }

    /// A type error with `message` about the bytes in `span`.
    pub fn type_error(message: impl Into<String>, span: Span) -> Self {
        FormulaError::new(
            FormulaErrorKind::Type {
                message: message.into(),
            },
            span,
        )
    }

    /// The same error with its span moved `offset` bytes to the right, for a
    /// formula embedded in a longer text.
    pub fn shifted(self, offset: usize) -> Self {
        FormulaError {
            span: self.span.shifted(offset),
            ..self
        }
    }

    /// `file:line:col: message`, where the formula `source` starts at
    /// `line` and `column` (both 1-based) of `file`. Formulas are single
    /// lines, so the column advances by one per character of `source`.
    pub fn render(&self, source: &str, file: &str, line: usize, column: usize) -> String {
        format!(
            "{file}:{line}:{}: {self}",
            column + char_offset(source, self.span.start)
        )
    }
}

/// The number of characters before byte `offset` of `source` (clamped to
/// the source, and to the character boundary at or before `offset`).
fn char_offset(source: &str, offset: usize) -> usize {
    let mut end = offset.min(source.len());
    while !source.is_char_boundary(end) {
        end -= 1;
    }
    source[..end].chars().count()
}

impl fmt::Display for Span {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}..{}", self.start, self.end)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn render_counts_characters_not_bytes() {
        let err = FormulaError::new(
            FormulaErrorKind::UnknownUnit {
                unit: "bra".to_string(),
                suggestion: Some("bar".to_string()),
            },
            Span::new(11, 14),
        );
        // `°` and `Δ` are two bytes each but one column.
        let source = "°Δ + 3 x bra";
        assert_eq!(
            err.render(source, "rules.yaml", 42, 12),
            "rules.yaml:42:21: unknown unit `bra` (did you mean `bar`?)"
        );
        let err = FormulaError {
            span: Span::new(2, 5),
            ..err
        };
        assert_eq!(
            err.render("3 bra", "r.yaml", 1, 1),
            "r.yaml:1:3: unknown unit `bra` (did you mean `bar`?)"
        );
    }

    #[test]
    fn shifting_moves_the_span() {
        let err = FormulaError::new(FormulaErrorKind::Empty, Span::new(1, 2)).shifted(10);
        assert_eq!(err.span, Span::new(11, 12));
        assert_eq!(err.to_string(), "empty formula");
    }
}
