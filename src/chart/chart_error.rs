//! Errors from building the valve characteristic.

use crate::physics::PhysicsError;

/// A chart that cannot be drawn from the inputs given.
#[derive(Clone, Debug, PartialEq, thiserror::Error)]
pub enum ChartError {
    /// A model parameter outside the range the model can use.
    #[error("{name}: {message}")]
    Parameter {
        /// The parameter, e.g. `set flow`.
        name: &'static str,
        /// What is wrong with it, with the value.
        message: String,
    },
    /// The force balance has no operating point at this pressure difference.
    #[error(
        "the compensator model finds no operating point at {total_drop_pa} Pa of supply minus load"
    )]
    NoOperatingPoint {
        /// Supply minus load, Pa.
        total_drop_pa: f64,
    },
    /// A physics formula refused its inputs.
    #[error(transparent)]
    Physics(#[from] PhysicsError),
}

/// Result of a chart computation.
pub type ChartResult<T> = Result<T, ChartError>;
