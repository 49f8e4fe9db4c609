//! Errors from reading a value with its unit. Every message quotes the text
//! that was given and says what was expected.

/// A reading or unit that could not be understood.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum UnitError {
    /// A number with a decimal comma or a thousands separator.
    #[error("`{text}`: write decimals with a point and no thousands separator (e.g. `1500.5`)")]
    Comma {
        /// The text as given.
        text: String,
    },
    /// Nothing was given.
    #[error("empty reading: expected a number and a unit, e.g. `1500 psi`")]
    Empty,
    /// A unit that cannot be used here (compound of a non-linear unit, a
    /// malformed exponent, an unbalanced bracket).
    #[error("`{text}`: {reason}")]
    BadUnit {
        /// The text as given.
        text: String,
        /// What is wrong.
        reason: String,
    },
    /// Temperature below absolute zero.
    #[error("`{text}` is below absolute zero")]
    BelowAbsoluteZero {
        /// The text as given.
        text: String,
    },
    /// Pressure below a perfect vacuum.
    #[error("`{text}` is below a perfect vacuum (more than one atmosphere under gauge zero)")]
    BelowVacuum {
        /// The text as given.
        text: String,
    },
    /// A number with no unit where a unit is needed.
    #[error("`{text}` has no unit: expected a {kind} unit such as {examples}")]
    MissingUnit {
        /// The text as given.
        text: String,
        /// The kind of quantity expected, e.g. "pressure".
        kind: String,
        /// Units that would do.
        examples: String,
    },
    /// A negative value for a quantity that cannot be negative.
    #[error("`{text}`: a {kind} cannot be negative")]
    Negative {
        /// The text as given.
        text: String,
        /// The kind of quantity, e.g. "flow".
        kind: String,
    },
    /// NaN or infinity.
    #[error("`{text}` is not a finite number")]
    NonFinite {
        /// The text as given.
        text: String,
    },
    /// The text does not start with a number.
    #[error("`{text}` does not start with a number (expected e.g. `1500 psi`)")]
    NotANumber {
        /// The text as given.
        text: String,
    },
    /// The value is outside the range the unit's scale covers.
    #[error("`{text}`: {reason}")]
    OutOfRange {
        /// The text as given.
        text: String,
        /// Why.
        reason: String,
    },
    /// A reading longer than any number with its unit; not quoted back.
    #[error("a reading of {len} bytes is longer than the limit of {max} bytes (expected a number and a unit, e.g. `1500 psi`)")]
    TooLong {
        /// Its length in bytes.
        len: usize,
        /// The limit in bytes.
        max: usize,
    },
    /// A unit that is not in the catalogue.
    #[error("`{text}`: unknown unit `{unit}`{}", suggestion.as_ref().map(|s| format!(" (did you mean `{s}`?)")).unwrap_or_default())]
    UnknownUnit {
        /// The text as given.
        text: String,
        /// The unit part.
        unit: String,
        /// The nearest known unit.
        suggestion: Option<String>,
    },
    /// A unit of the wrong dimension for this quantity.
    #[error(
        "`{text}`: `{unit}` is a {found} unit, but a {expected} is expected (e.g. {examples})"
    )]
    WrongDimension {
        /// The text as given.
        text: String,
        /// The unit part.
        unit: String,
        /// The expected kind, e.g. "pressure".
        expected: String,
        /// The dimension the unit has, e.g. "flow".
        found: String,
        /// Units that would do.
        examples: String,
    },
}
