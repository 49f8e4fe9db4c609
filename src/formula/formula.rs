//! A compiled formula: parsed, checked against the rule base's names and
//! ready to evaluate on readings.

use std::collections::BTreeMap;
use std::fmt;

use super::checker::Checker;
use super::environment::Environment;
use super::eval::Evaluator;
use super::expr::Expr;
use super::formula_error::FormulaError;
use super::function_table::FunctionTable;
use super::inputs::Inputs;
use super::outcome::Outcome;
use super::parser::Parser;
use super::value::Value;
use super::value_type::ValueType;
use crate::units::Kind;

/// A formula that has passed every compile-time check.
#[derive(Clone, Debug)]
pub struct Formula {
    source: String,
    expr: Expr,
    value_type: ValueType,
    kind: Option<Kind>,
    inputs: BTreeMap<String, ValueType>,
    functions: FunctionTable,
}

impl Formula {
    /// Parse `source` and check every name, call, type and dimension in it.
    pub fn compile(
        source: &str,
        environment: &Environment,
        functions: &FunctionTable,
    ) -> Result<Formula, FormulaError> {
        let expr = Parser::parse(source)?;
        let mut checker = Checker::new(environment, functions);
        let typed = checker.check(&expr)?;
        let (inputs, functions) = checker.into_parts();
        Ok(Formula {
            source: source.to_string(),
            expr,
            value_type: typed.value_type,
            kind: typed.kind,
            inputs,
            functions,
        })
    }

    /// Compile a formula that must be a condition (true or false), as a
    /// rule's check is.
    pub fn compile_condition(
        source: &str,
        environment: &Environment,
        functions: &FunctionTable,
    ) -> Result<Formula, FormulaError> {
        let formula = Formula::compile(source, environment, functions)?;
        if formula.value_type != ValueType::Bool {
            let message = format!(
                "a check must be true or false, found {} (compare it with something)",
                formula.value_type.describe(formula.kind)
            );
            return Err(FormulaError::type_error(message, formula.expr.span()));
        }
        Ok(formula)
    }

    /// The text the formula was compiled from.
    pub fn source(&self) -> &str {
        &self.source
    }

    /// The syntax tree.
    pub fn expr(&self) -> &Expr {
        &self.expr
    }

    /// What the formula computes.
    pub fn value_type(&self) -> ValueType {
        self.value_type
    }

    /// The kind the result is printed as, when the formula tells (a
    /// difference of two pressures is a pressure).
    pub fn kind(&self) -> Option<Kind> {
        self.kind
    }

    /// The readings the formula reads (`name` or `name@point`), sorted.
    pub fn inputs(&self) -> impl Iterator<Item = &str> {
        self.inputs.keys().map(String::as_str)
    }

    /// Evaluate on `inputs`. A missing reading gives [`Outcome::Missing`]
    /// with every reading still needed; arithmetic that gives infinity or
    /// NaN, and readings of the wrong dimension, are errors.
    pub fn evaluate<I: Inputs + ?Sized>(&self, inputs: &I) -> Result<Outcome<Value>, FormulaError> {
        let mut evaluator = Evaluator::new(inputs, &self.inputs, &self.functions);
        match evaluator.eval(&self.expr)? {
            Some(value) => Ok(Outcome::Known(value)),
            None => Ok(Outcome::Missing(evaluator.into_missing())),
        }
    }
}

impl fmt::Display for Formula {
    /// The canonical text of the formula.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}", self.expr)
    }
}
