//! Input and output guards shared by the physics functions.
//!
//! Each guard returns the value it checked so a formula can read
//! `let q = positive("flow", flow_m3_s, "m³/s")?;`.

use super::physics_error::{PhysicsError, PhysicsResult};

/// The value, if it is finite.
pub(crate) fn finite(name: &'static str, value: f64) -> PhysicsResult<f64> {
    if value.is_finite() {
        Ok(value)
    } else {
        Err(PhysicsError::NotFinite { name, value })
    }
}

/// The value, if it is finite and greater than zero.
pub(crate) fn positive(name: &'static str, value: f64, unit: &'static str) -> PhysicsResult<f64> {
    finite(name, value)?;
    if value > 0.0 {
        Ok(value)
    } else {
        Err(PhysicsError::NotPositive { name, value, unit })
    }
}

/// The value, if it is finite and not negative.
pub(crate) fn non_negative(
    name: &'static str,
    value: f64,
    unit: &'static str,
) -> PhysicsResult<f64> {
    finite(name, value)?;
    if value >= 0.0 {
        Ok(value)
    } else {
        Err(PhysicsError::Negative { name, value, unit })
    }
}

/// The value, if it is finite and within `min..=max`.
pub(crate) fn within(
    name: &'static str,
    value: f64,
    min: f64,
    max: f64,
    unit: &'static str,
) -> PhysicsResult<f64> {
    finite(name, value)?;
    if (min..=max).contains(&value) {
        Ok(value)
    } else {
        Err(PhysicsError::OutOfRange {
            name,
            value,
            min,
            max,
            unit,
        })
    }
}

/// A coefficient or efficiency: greater than zero and at most one.
pub(crate) fn fraction(name: &'static str, value: f64) -> PhysicsResult<f64> {
    positive(name, value, "")?;
    within(name, value, 0.0, 1.0, "")
}

/// The computed value, if it is finite (guards against overflow turning into infinity).
pub(crate) fn result(name: &'static str, value: f64) -> PhysicsResult<f64> {
    if value.is_finite() {
        Ok(value)
    } else {
        Err(PhysicsError::ResultNotFinite { name })
    }
}

/// An error for two inputs that contradict each other.
pub(crate) fn inconsistent(message: impl Into<String>) -> PhysicsError {
    PhysicsError::Inconsistent {
        message: message.into(),
    }
}
