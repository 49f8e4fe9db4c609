//! Readings with units: parse, carry the dimension, convert, print.

mod unit_error;

pub use unit_error::UnitError;
