//! Readings with units: parse, carry the dimension, convert, print.
//!
//! Everything inside the crate is SI (`f64` in a [`Quantity`] with its
//! [`Dimension`]); units exist only at the edges, when a reading is parsed
//! and when a result is printed in the user's [`UnitSystem`]. Pressures are
//! gauge unless the unit says absolute (`psia`, `bar abs`) or vacuum (`inHg`).

mod dimension;
mod format;
mod kind;
mod parse;
mod quantity;
pub mod saybolt;
pub mod unit;
mod unit_error;
mod unit_expr;
mod unit_system;

pub use dimension::Dimension;
pub use format::{format, format_number, value_in};
pub use kind::Kind;
pub(crate) use parse::number_len;
pub use parse::{parse_as, parse_quantity, split_number, MAX_READING_LENGTH};
pub use quantity::Quantity;
pub use unit::Unit;
pub use unit_error::UnitError;
pub use unit_expr::{parse_unit, UnitExpr};
pub use unit_system::UnitSystem;

pub(crate) use crate::suggest::suggest;
