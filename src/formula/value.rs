//! The value a formula evaluates to.

use std::fmt;

use crate::units::{format_number, Quantity};

/// A computed value: a condition's truth or a quantity in SI.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Value {
    /// The result of a condition.
    Bool(bool),
    /// A quantity in SI units.
    Quantity(Quantity),
}

impl Value {
    /// The truth value, for a condition.
    pub fn as_bool(self) -> Option<bool> {
        match self {
            Value::Bool(b) => Some(b),
            Value::Quantity(_) => None,
        }
    }

    /// The quantity, for a computed value.
    pub fn as_quantity(self) -> Option<Quantity> {
        match self {
            Value::Bool(_) => None,
            Value::Quantity(q) => Some(q),
        }
    }
}

impl fmt::Display for Value {
    /// `true`/`false`, or the SI value with its SI base units.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Value::Bool(b) => write!(f, "{b}"),
            Value::Quantity(q) if q.dimension().is_none() => f.write_str(&format_number(q.si())),
            Value::Quantity(q) => write!(f, "{} {}", format_number(q.si()), q.dimension()),
        }
    }
}
