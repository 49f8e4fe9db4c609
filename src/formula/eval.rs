//! Evaluating a checked formula on readings, in SI.
//!
//! A missing reading makes its part of the formula unknown rather than
//! failing: `and`, `or` and `if` still decide when the readings they have
//! settle the answer, and otherwise the readings still needed are listed.

use std::collections::{BTreeMap, BTreeSet};

use super::expr::{BinaryOp, Expr, UnaryOp};
use super::formula_error::{FormulaError, FormulaErrorKind, Span};
use super::function_table::{Builtin, FunctionTable};
use super::inputs::Inputs;
use super::value::Value;
use super::value_type::ValueType;
use crate::units::{Dimension, Quantity};

/// `==` and `!=` treat values within this fraction of the larger one as
/// equal, so that `3 bar == 43.5113 psi`-style unit round trips compare
/// equal despite binary rounding.
pub const RELATIVE_TOLERANCE: f64 = 1e-9;

/// A value, or `None` when a reading it needs is missing.
type Partial = Option<Value>;

/// Evaluates one checked formula on one set of readings.
pub struct Evaluator<'a, I: Inputs + ?Sized> {
    inputs: &'a I,
    declared: &'a BTreeMap<String, ValueType>,
    functions: &'a FunctionTable,
    missing: BTreeSet<String>,
}

impl<'a, I: Inputs + ?Sized> Evaluator<'a, I> {
    /// An evaluator reading `inputs`, which must have the `declared` types,
    /// and calling `functions`.
    pub fn new(
        inputs: &'a I,
        declared: &'a BTreeMap<String, ValueType>,
        functions: &'a FunctionTable,
    ) -> Self {
        Evaluator {
            inputs,
            declared,
            functions,
            missing: BTreeSet::new(),
        }
    }

    /// The readings found missing so far, sorted.
    pub fn into_missing(self) -> Vec<String> {
        self.missing.into_iter().collect()
    }

    /// The value of `expr`, `None` when a missing reading leaves it open.
    pub fn eval(&mut self, expr: &Expr) -> Result<Partial, FormulaError> {
        match expr {
            Expr::Binary {
                op, left, right, ..
            } => match op {
                BinaryOp::And | BinaryOp::Or => self.logic(*op, left, right),
                _ => {
                    let l = self.eval(left)?;
                    let r = self.eval(right)?;
                    match (l, r) {
                        (Some(l), Some(r)) => binary(*op, l, r, expr).map(Some),
                        _ => Ok(None),
                    }
                }
            },
            Expr::Bool { value, .. } => Ok(Some(Value::Bool(*value))),
            Expr::Call { name, args, .. } => self.call(name, args, expr),
            Expr::If {
                condition,
                then_branch,
                else_branch,
                ..
            } => match self.eval(condition)? {
                Some(c) if truth(c, condition.span())? => self.eval(then_branch),
                Some(_) => self.eval(else_branch),
                None => {
                    // Either branch may be needed once the condition is known.
                    self.note_missing(then_branch);
                    self.note_missing(else_branch);
                    Ok(None)
                }
            },
            Expr::Literal { literal, .. } => Ok(Some(Value::Quantity(literal.value))),
            Expr::Name {
                name, point, span, ..
            } => self.reading(name, point.as_deref(), *span),
            Expr::Power { base, exponent, .. } => match self.eval(base)? {
                Some(b) => power(quantity(b, expr)?, *exponent, expr).map(Some),
                None => Ok(None),
            },
            Expr::Unary { op, operand, .. } => match self.eval(operand)? {
                Some(v) => unary(*op, v, expr).map(Some),
                None => Ok(None),
            },
        }
    }

    fn reading(
        &mut self,
        name: &str,
        point: Option<&str>,
        span: Span,
    ) -> Result<Partial, FormulaError> {
        let key = match point {
            Some(point) => format!("{name}@{point}"),
            None => name.to_string(),
        };
        let Some(q) = self.inputs.reading(&key) else {
            self.missing.insert(key);
            return Ok(None);
        };
        if let Some(expected) = self.declared.get(&key) {
            let found = ValueType::of_quantity(&q);
            if found != *expected {
                let kind = FormulaErrorKind::InputMismatch {
                    name: key,
                    expected: expected.describe(None),
                    found: found.describe(None),
                };
                return Err(FormulaError::new(kind, span));
            }
        }
        Ok(Some(Value::Quantity(q)))
    }

    /// Record the missing readings under `expr` without evaluating it.
    fn note_missing(&mut self, expr: &Expr) {
        match expr {
            Expr::Name { .. } => {
                let key = expr.to_string();
                if self.inputs.reading(&key).is_none() {
                    self.missing.insert(key);
                }
            }
            Expr::Binary { left, right, .. } => {
                self.note_missing(left);
                self.note_missing(right);
            }
            Expr::Call { args, .. } => args.iter().for_each(|a| self.note_missing(a)),
            Expr::If {
                condition,
                then_branch,
                else_branch,
                ..
            } => {
                self.note_missing(condition);
                self.note_missing(then_branch);
                self.note_missing(else_branch);
            }
            Expr::Power { base: inner, .. } | Expr::Unary { operand: inner, .. } => {
                self.note_missing(inner);
            }
            Expr::Bool { .. } | Expr::Literal { .. } => {}
        }
    }

    /// `and`/`or` in three-valued logic: a known `false` (for `and`) or
    /// `true` (for `or`) on either side decides, whatever the other side.
    fn logic(&mut self, op: BinaryOp, left: &Expr, right: &Expr) -> Result<Partial, FormulaError> {
        let decisive = op == BinaryOp::Or;
        let l = match self.eval(left)? {
            Some(v) => Some(truth(v, left.span())?),
            None => None,
        };
        if l == Some(decisive) {
            return Ok(Some(Value::Bool(decisive)));
        }
        let r = match self.eval(right)? {
            Some(v) => Some(truth(v, right.span())?),
            None => None,
        };
        Ok(match (l, r) {
            (_, Some(r)) if r == decisive => Some(Value::Bool(decisive)),
            (Some(_), Some(r)) => Some(Value::Bool(r)),
            _ => None,
        })
    }

    fn call(&mut self, name: &str, args: &[Expr], expr: &Expr) -> Result<Partial, FormulaError> {
        let mut values = Vec::with_capacity(args.len());
        let mut known = true;
        for arg in args {
            match self.eval(arg)? {
                Some(v) => values.push(quantity(v, arg)?),
                None => known = false,
            }
        }
        if !known {
            return Ok(None);
        }
        let result = match Builtin::from_name(name) {
            Some(builtin) => builtin_call(builtin, &values, expr)?,
            None => self.registered(name, &values, expr)?,
        };
        Ok(Some(Value::Quantity(result)))
    }

    fn registered(
        &self,
        name: &str,
        values: &[Quantity],
        expr: &Expr,
    ) -> Result<Quantity, FormulaError> {
        let Some(function) = self.functions.get(name) else {
            return Err(bug(expr, "a function that was not checked"));
        };
        let si: Vec<f64> = values.iter().map(Quantity::si).collect();
        let result = (function.body)(&si).map_err(|message| {
            let kind = FormulaErrorKind::FunctionFailed {
                name: name.to_string(),
                message,
            };
            FormulaError::new(kind, expr.span())
        })?;
        finite(Quantity::new(result, function.result), expr)
    }
}

fn truth(value: Value, span: Span) -> Result<bool, FormulaError> {
    value.as_bool().ok_or_else(|| {
        let message = "a number where true or false was checked; this is a bug";
        FormulaError::type_error(message, span)
    })
}

fn quantity(value: Value, expr: &Expr) -> Result<Quantity, FormulaError> {
    value
        .as_quantity()
        .ok_or_else(|| bug(expr, "true or false where a number was checked"))
}

fn bug(expr: &Expr, what: &str) -> FormulaError {
    FormulaError::type_error(format!("{what}; this is a bug"), expr.span())
}

/// The value, unless the arithmetic gave infinity or NaN.
fn finite(q: Quantity, expr: &Expr) -> Result<Quantity, FormulaError> {
    if q.si().is_finite() {
        return Ok(q);
    }
    let reason = if q.si().is_nan() {
        "an undefined result"
    } else {
        "a result too large to represent"
    };
    Err(not_finite(reason, expr))
}

fn not_finite(reason: &str, expr: &Expr) -> FormulaError {
    let kind = FormulaErrorKind::NotFinite {
        operation: expr.to_string(),
        reason: reason.to_string(),
    };
    FormulaError::new(kind, expr.span())
}

/// A quantity of `dimension` (a temperature point when `point`).
fn make(si: f64, dimension: Dimension, point: bool) -> Quantity {
    if point {
        Quantity::temperature(si)
    } else {
        Quantity::new(si, dimension)
    }
}

fn unary(op: UnaryOp, value: Value, expr: &Expr) -> Result<Value, FormulaError> {
    match op {
        UnaryOp::Not => Ok(Value::Bool(!truth(value, expr.span())?)),
        UnaryOp::Neg => {
            let q = quantity(value, expr)?;
            Ok(Value::Quantity(Quantity::new(-q.si(), q.dimension())))
        }
    }
}

fn binary(op: BinaryOp, l: Value, r: Value, expr: &Expr) -> Result<Value, FormulaError> {
    if let (Value::Bool(a), Value::Bool(b)) = (l, r) {
        return match op {
            BinaryOp::Eq => Ok(Value::Bool(a == b)),
            BinaryOp::Ne => Ok(Value::Bool(a != b)),
            _ => Err(bug(expr, "true or false where a number was checked")),
        };
    }
    let (a, b) = (quantity(l, expr)?, quantity(r, expr)?);
    let (x, y) = (a.si(), b.si());
    let q = match op {
        BinaryOp::Add => make(
            x + y,
            a.dimension(),
            a.is_temperature_point() || b.is_temperature_point(),
        ),
        BinaryOp::Sub => make(
            x - y,
            a.dimension(),
            a.is_temperature_point() && !b.is_temperature_point(),
        ),
        BinaryOp::Mul => Quantity::new(x * y, a.dimension().times(b.dimension())),
        BinaryOp::Div if y == 0.0 => return Err(not_finite("division by zero", expr)),
        BinaryOp::Div => Quantity::new(x / y, a.dimension().per(b.dimension())),
        BinaryOp::Eq => return Ok(Value::Bool(equal(x, y))),
        BinaryOp::Ne => return Ok(Value::Bool(!equal(x, y))),
        BinaryOp::Lt => return Ok(Value::Bool(x < y)),
        BinaryOp::Le => return Ok(Value::Bool(x <= y)),
        BinaryOp::Gt => return Ok(Value::Bool(x > y)),
        BinaryOp::Ge => return Ok(Value::Bool(x >= y)),
        BinaryOp::And | BinaryOp::Or => return Err(bug(expr, "logic outside `and`/`or`")),
    };
    finite(q, expr).map(Value::Quantity)
}

/// Equal within [`RELATIVE_TOLERANCE`] of the larger magnitude.
fn equal(x: f64, y: f64) -> bool {
    x == y || (x - y).abs() <= RELATIVE_TOLERANCE * x.abs().max(y.abs())
}

fn power(base: Quantity, exponent: i8, expr: &Expr) -> Result<Value, FormulaError> {
    if base.si() == 0.0 && exponent < 0 {
        return Err(not_finite("division by zero", expr));
    }
    let q = Quantity::new(
        base.si().powi(i32::from(exponent)),
        base.dimension().powi(exponent),
    );
    finite(q, expr).map(Value::Quantity)
}

fn builtin_call(
    builtin: Builtin,
    values: &[Quantity],
    expr: &Expr,
) -> Result<Quantity, FormulaError> {
    let Some(&first) = values.first() else {
        return Err(bug(expr, "a call with no arguments"));
    };
    let point = first.is_temperature_point();
    let same = |si: f64| make(si, first.dimension(), point);
    let q = match builtin {
        Builtin::Abs => Quantity::new(first.si().abs(), first.dimension()),
        Builtin::Sqrt if first.si() < 0.0 => {
            return Err(not_finite("square root of a negative number", expr))
        }
        Builtin::Sqrt => {
            let Some(root) = first.dimension().sqrt() else {
                return Err(bug(expr, "an odd power under `sqrt`"));
            };
            Quantity::new(first.si().sqrt(), root)
        }
        Builtin::Max => same(
            values
                .iter()
                .map(Quantity::si)
                .fold(f64::NEG_INFINITY, f64::max),
        ),
        Builtin::Min => same(
            values
                .iter()
                .map(Quantity::si)
                .fold(f64::INFINITY, f64::min),
        ),
        Builtin::Clamp => {
            let [x, lo, hi] = [0, 1, 2].map(|i| values.get(i).map_or(f64::NAN, Quantity::si));
            // Not f64::clamp, which panics when lo > hi.
            if lo > hi {
                return Err(not_finite("a lower bound above the upper bound", expr));
            }
            same(x.max(lo).min(hi))
        }
    };
    finite(q, expr)
}
