//! Errors from reading a value with its unit.

/// A reading or unit that could not be understood.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum UnitError {
    /// Nothing was given.
    #[error("empty reading: expected a number and a unit, e.g. `1500 psi`")]
    Empty,
}
