//! Errors from the physics functions: inputs outside a formula's domain.

/// An input outside the domain of a formula, or a result that is not a finite number.
///
/// Every physics function checks its inputs and returns one of these instead of
/// panicking or letting NaN or infinity escape.
#[derive(Clone, Debug, PartialEq, thiserror::Error)]
pub enum PhysicsError {
    /// Two inputs that contradict each other, e.g. a rod as wide as its bore.
    #[error("{message}")]
    Inconsistent {
        /// What is contradictory, lowercase, without a trailing period.
        message: String,
    },
    /// An input that must be at least zero was negative.
    #[error("{name} must not be negative (got {value} {unit})")]
    Negative {
        /// The quantity's name, e.g. `pressure drop`.
        name: &'static str,
        /// The value received, in SI units.
        value: f64,
        /// The SI unit of the value.
        unit: &'static str,
    },
    /// A root search found no solution inside the range it may search.
    #[error("no {name} satisfies the condition between {low} and {high} {unit}")]
    NoSolution {
        /// What was searched for.
        name: &'static str,
        /// Lower end of the search range, SI.
        low: f64,
        /// Upper end of the search range, SI.
        high: f64,
        /// The SI unit of the range.
        unit: &'static str,
    },
    /// An input was NaN or infinite.
    #[error("{name} must be a finite number (got {value})")]
    NotFinite {
        /// The quantity's name.
        name: &'static str,
        /// The value received.
        value: f64,
    },
    /// An input that must be strictly positive was zero or negative.
    #[error("{name} must be greater than zero (got {value} {unit})")]
    NotPositive {
        /// The quantity's name, e.g. `displacement`.
        name: &'static str,
        /// The value received, in SI units.
        value: f64,
        /// The SI unit of the value.
        unit: &'static str,
    },
    /// An input outside the range where the formula or table is defined.
    #[error("{name} must be between {min} and {max} {unit} (got {value})")]
    OutOfRange {
        /// The quantity's name.
        name: &'static str,
        /// The value received, in SI units.
        value: f64,
        /// Smallest value allowed.
        min: f64,
        /// Largest value allowed.
        max: f64,
        /// The SI unit of the value and limits.
        unit: &'static str,
    },
    /// An input below the smallest value where the formula or table is defined.
    #[error("{name} must be at least {min} {unit} (got {value})")]
    TooSmall {
        /// The quantity's name.
        name: &'static str,
        /// The value received, in SI units.
        value: f64,
        /// Smallest value allowed.
        min: f64,
        /// The SI unit of the value and limit.
        unit: &'static str,
    },
    /// A viscosity grade that ISO 3448 does not define.
    #[error("ISO VG {grade} is not a viscosity grade of ISO 3448 (grades: 2, 3, 5, 7, 10, 15, 22, 32, 46, 68, 100, 150, 220, 320, 460, 680, 1000, 1500)")]
    UnknownGrade {
        /// The grade number asked for.
        grade: u32,
    },
    /// The formula produced NaN or infinity from finite inputs (overflow).
    #[error("{name} is not a finite number for these inputs")]
    ResultNotFinite {
        /// The quantity that was being computed.
        name: &'static str,
    },
}

/// Result of a physics function.
pub type PhysicsResult<T> = Result<T, PhysicsError>;
