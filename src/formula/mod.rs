//! The unit-aware formula language of rule checks and evidence sentences.
//!
//! A formula such as `flow@loaded < 0.9 * flow_set and supply_pressure -
//! load_pressure > 10 bar` is parsed ([`Parser`]), checked against the rule
//! base's names and dimensions when the rules load ([`Formula::compile`]),
//! and evaluated on readings in SI ([`Formula::evaluate`]). Numbers and
//! units are read exactly as technician input is read. [`Template`] puts
//! computed values into evidence sentences.

#![warn(missing_docs)]

mod checker;
mod environment;
mod eval;
mod expr;
#[allow(clippy::module_inception)]
mod formula;
mod formula_error;
mod function_table;
mod inputs;
mod lexer;
mod outcome;
mod parser;
mod template;
mod value;
mod value_type;

pub use checker::{Checker, Typed};
pub use environment::Environment;
pub use eval::{Evaluator, RELATIVE_TOLERANCE};
pub use expr::{BinaryOp, Expr, Literal, UnaryOp};
pub use formula::Formula;
pub use formula_error::{FormulaError, FormulaErrorKind, Span};
pub use function_table::{Builtin, Function, FunctionBody, FunctionTable, Parameter};
pub use inputs::Inputs;
pub use lexer::{Lexer, Token, TokenKind};
pub use outcome::Outcome;
pub use parser::{Parser, MAX_DEPTH, MAX_LENGTH};
pub use template::Template;
pub use value::Value;
pub use value_type::ValueType;

/// Parse `source` into a syntax tree without checking names or types.
pub fn parse(source: &str) -> Result<Expr, FormulaError> {
    Parser::parse(source)
}

#[cfg(test)]
mod properties;
#[cfg(test)]
mod testing;
