//! Compile-time checking: every name, function, type and dimension in a
//! formula is checked against an [`Environment`] when the rule base loads,
//! so a diagnosis never stops on a malformed check.
//!
//! Temperatures are affine: a point minus a point is a difference, a point
//! plus or minus a difference is a point, and nothing else may be done with
//! a point (adding two, scaling one, comparing one with a difference).

use std::collections::BTreeMap;

use super::environment::Environment;
use super::expr::{BinaryOp, Expr, Literal, UnaryOp};
use super::formula_error::{FormulaError, FormulaErrorKind, Span};
use super::function_table::{Builtin, FunctionTable};
use super::value_type::ValueType;
use crate::units::{Dimension, Kind, UnitSystem};

/// The largest power of a base unit a checked expression may reach.
const MAX_EXPONENT: i8 = 32;

/// How to tell a user what to do with a temperature point.
const POINT_HINT: &str =
    "subtract two temperatures to get a difference, or write differences in K, dC or dF";

/// The type of a checked (sub)expression, with the kind it is printed as
/// when the formula tells (a declared name keeps its kind).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Typed {
    /// The type.
    pub value_type: ValueType,
    /// The kind, when known.
    pub kind: Option<Kind>,
}

impl Typed {
    fn new(value_type: ValueType, kind: Option<Kind>) -> Self {
        Typed { value_type, kind }
    }

    fn quantity(dimension: Dimension) -> Self {
        let value_type = ValueType::quantity(dimension);
        Typed::new(value_type, value_type.default_kind())
    }

    fn describe(self) -> String {
        self.value_type.describe(self.kind)
    }
}

/// Checks one formula, collecting the readings and functions it uses.
#[derive(Debug)]
pub struct Checker<'a> {
    environment: &'a Environment,
    functions: &'a FunctionTable,
    inputs: BTreeMap<String, ValueType>,
    used: FunctionTable,
}

impl<'a> Checker<'a> {
    /// A checker for names in `environment` and calls to `functions`.
    pub fn new(environment: &'a Environment, functions: &'a FunctionTable) -> Self {
        Checker {
            environment,
            functions,
            inputs: BTreeMap::new(),
            used: FunctionTable::new(),
        }
    }

    /// The readings the checked formula reads (`name` or `name@point`) with
    /// their types, and the registered functions it calls.
    pub fn into_parts(self) -> (BTreeMap<String, ValueType>, FunctionTable) {
        (self.inputs, self.used)
    }

    /// The type of `expr`, or the first error in it.
    pub fn check(&mut self, expr: &Expr) -> Result<Typed, FormulaError> {
        match expr {
            Expr::Binary {
                op,
                left,
                right,
                span,
            } => self.binary(*op, left, right, *span),
            Expr::Bool { .. } => Ok(Typed::new(ValueType::Bool, None)),
            Expr::Call { name, args, span } => self.call(name, args, *span),
            Expr::If {
                condition,
                then_branch,
                else_branch,
                span,
            } => self.conditional(condition, then_branch, else_branch, *span),
            Expr::Literal { literal, .. } => Ok(literal_type(literal)),
            Expr::Name { name, point, span } => self.name(name, point.as_deref(), *span),
            Expr::Power {
                base,
                exponent,
                span,
            } => self.power(base, *exponent, *span),
            Expr::Unary { op, operand, span } => self.unary(*op, operand, *span),
        }
    }

    fn name(&mut self, name: &str, point: Option<&str>, span: Span) -> Result<Typed, FormulaError> {
        let Some(value_type) = self.environment.value_type(name) else {
            let suggestion = crate::suggest::suggest(name, self.environment.names());
            let kind = FormulaErrorKind::UnknownQuantity {
                name: name.to_string(),
                suggestion: suggestion.map(str::to_string),
            };
            let name_span = Span::new(span.start, span.start + name.len());
            return Err(FormulaError::new(kind, name_span));
        };
        let key = match point {
            Some(point) if !self.environment.has_point(point) => {
                let suggestion = crate::suggest::suggest(point, self.environment.points());
                let kind = FormulaErrorKind::UnknownPoint {
                    point: point.to_string(),
                    suggestion: suggestion.map(str::to_string),
                };
                let point_span = Span::new(span.end - point.len(), span.end);
                return Err(FormulaError::new(kind, point_span));
            }
            Some(point) => format!("{name}@{point}"),
            None => name.to_string(),
        };
        self.inputs.insert(key, value_type);
        Ok(Typed::new(value_type, self.environment.kind(name)))
    }

    fn unary(&mut self, op: UnaryOp, operand: &Expr, span: Span) -> Result<Typed, FormulaError> {
        let typed = self.check(operand)?;
        match op {
            UnaryOp::Not => {
                expect_bool(typed, "`not`", operand.span())?;
                Ok(typed)
            }
            UnaryOp::Neg => {
                expect_scalable(typed, "negate", span)?;
                Ok(typed)
            }
        }
    }

    fn binary(
        &mut self,
        op: BinaryOp,
        left: &Expr,
        right: &Expr,
        span: Span,
    ) -> Result<Typed, FormulaError> {
        let l = self.check(left)?;
        let r = self.check(right)?;
        match op {
            BinaryOp::And | BinaryOp::Or => {
                let name = format!("`{}`", op.symbol());
                expect_bool(l, &name, left.span())?;
                expect_bool(r, &name, right.span())?;
                Ok(Typed::new(ValueType::Bool, None))
            }
            BinaryOp::Add | BinaryOp::Sub => sum(op, (l, left), (r, right), span),
            BinaryOp::Mul | BinaryOp::Div => product(op, (l, left), (r, right), span),
            _ => comparison(op, (l, left), (r, right), span),
        }
    }

    fn power(&mut self, base: &Expr, exponent: i8, span: Span) -> Result<Typed, FormulaError> {
        let typed = self.check(base)?;
        let dimension = expect_scalable(typed, "raise to a power", span)?;
        let dimension = checked(dimension, Dimension::NONE, |a, _| {
            i16::from(a) * i16::from(exponent)
        })
        .ok_or_else(|| overflow(span))?;
        if exponent == 1 {
            return Ok(typed);
        }
        Ok(Typed::quantity(dimension))
    }

    fn conditional(
        &mut self,
        condition: &Expr,
        then_branch: &Expr,
        else_branch: &Expr,
        span: Span,
    ) -> Result<Typed, FormulaError> {
        let c = self.check(condition)?;
        if c.value_type != ValueType::Bool {
            let message = format!(
                "the condition of `if` must be true or false, found {}",
                c.describe()
            );
            return Err(FormulaError::type_error(message, condition.span()));
        }
        let a = self.check(then_branch)?;
        let b = self.check(else_branch)?;
        if a.value_type != b.value_type {
            let message = format!(
                "the branches of `if` differ: {} and {}",
                a.describe(),
                b.describe()
            );
            return Err(FormulaError::type_error(message, span));
        }
        Ok(a)
    }

    fn call(&mut self, name: &str, args: &[Expr], span: Span) -> Result<Typed, FormulaError> {
        let name_span = Span::new(span.start, span.start + name.len());
        let mut types = Vec::with_capacity(args.len());
        for arg in args {
            types.push(self.check(arg)?);
        }
        if let Some(builtin) = Builtin::from_name(name) {
            return builtin_call(builtin, &types, args, span);
        }
        let Some(function) = self.functions.get(name) else {
            let suggestion = crate::suggest::suggest(name, self.functions.names());
            let kind = FormulaErrorKind::UnknownFunction {
                name: name.to_string(),
                suggestion: suggestion.map(str::to_string),
            };
            return Err(FormulaError::new(kind, name_span));
        };
        if types.len() != function.parameters.len() {
            let names: Vec<&str> = function
                .parameters
                .iter()
                .map(|p| p.name.as_str())
                .collect();
            return Err(arity(name, &names.join(", "), types.len(), span));
        }
        for ((typed, arg), parameter) in types.iter().zip(args).zip(&function.parameters) {
            let wanted = if parameter.temperature_point {
                Typed::new(
                    ValueType::of_kind(Kind::Temperature),
                    Some(Kind::Temperature),
                )
            } else {
                Typed::quantity(parameter.dimension)
            };
            if typed.value_type != wanted.value_type {
                let message = format!(
                    "argument `{}` of `{name}` must be {}, found {}",
                    parameter.name,
                    wanted.describe(),
                    typed.describe()
                );
                return Err(FormulaError::type_error(message, arg.span()));
            }
        }
        let result = function.result;
        if self.used.get(name).is_none() {
            // Registering a name the full table already holds cannot clash.
            self.used.register(function.clone())?;
        }
        Ok(Typed::quantity(result))
    }
}

fn literal_type(literal: &Literal) -> Typed {
    let value_type = ValueType::of_quantity(&literal.value);
    let kind = match literal.unit.as_deref() {
        None => None,
        Some("%" | "percent" | "pct") => Some(Kind::Fraction),
        Some(_) => value_type.default_kind(),
    };
    Typed::new(value_type, kind)
}

fn expect_bool(typed: Typed, what: &str, span: Span) -> Result<(), FormulaError> {
    if typed.value_type == ValueType::Bool {
        return Ok(());
    }
    let message = format!("{what} needs true/false values, found {}", typed.describe());
    Err(FormulaError::type_error(message, span))
}

/// The dimension of a value that may be scaled (multiplied, negated,
/// raised to a power): a quantity that is not a temperature point.
fn expect_scalable(typed: Typed, verb: &str, span: Span) -> Result<Dimension, FormulaError> {
    match typed.value_type {
        ValueType::Bool => Err(FormulaError::type_error(
            format!("cannot {verb} a true/false value"),
            span,
        )),
        ValueType::Quantity {
            temperature_point: true,
            ..
        } => Err(FormulaError::type_error(
            format!("cannot {verb} a temperature: {POINT_HINT}"),
            span,
        )),
        ValueType::Quantity { dimension, .. } => Ok(dimension),
    }
}

type Operand<'e> = (Typed, &'e Expr);

fn sum(op: BinaryOp, left: Operand, right: Operand, span: Span) -> Result<Typed, FormulaError> {
    let ((l, left_expr), (r, right_expr)) = (left, right);
    let verb = if op == BinaryOp::Add {
        "add"
    } else {
        "subtract"
    };
    for typed in [l, r] {
        if typed.value_type == ValueType::Bool {
            let message = format!("cannot {verb} a true/false value");
            return Err(FormulaError::type_error(message, span));
        }
    }
    let (lt, rt) = (l.value_type, r.value_type);
    let same_dimension = lt.dimension() == rt.dimension();
    let (lp, rp) = (lt.is_temperature_point(), rt.is_temperature_point());
    if same_dimension && lp && rp && op == BinaryOp::Add {
        let message = "cannot add two temperatures: write a temperature difference in K, dC or dF";
        return Err(FormulaError::type_error(message, span));
    }
    if same_dimension && !lp && rp && op == BinaryOp::Sub {
        let message = "cannot subtract a temperature from a temperature difference";
        return Err(FormulaError::type_error(message, span));
    }
    if !same_dimension {
        let message = match op {
            BinaryOp::Add => format!("cannot add {} to {}", r.describe(), l.describe()),
            _ => format!("cannot subtract {} from {}", r.describe(), l.describe()),
        };
        let hint = unit_hint((l, left_expr), (r, right_expr));
        return Err(FormulaError::type_error(message + &hint, span));
    }
    Ok(match (lp, rp) {
        (true, true) => Typed::quantity(Dimension::TEMPERATURE),
        (true, false) => l,
        (false, true) => r,
        (false, false) => Typed::new(lt, l.kind.or(r.kind)),
    })
}

fn product(op: BinaryOp, left: Operand, right: Operand, span: Span) -> Result<Typed, FormulaError> {
    let ((l, _), (r, _)) = (left, right);
    let verb = if op == BinaryOp::Mul {
        "multiply"
    } else {
        "divide"
    };
    let ld = expect_scalable(l, verb, span)?;
    let rd = expect_scalable(r, verb, span)?;
    let sign = if op == BinaryOp::Mul { 1 } else { -1 };
    let dimension =
        checked(ld, rd, |a, b| i16::from(a) + sign * i16::from(b)).ok_or_else(|| overflow(span))?;
    // Scaling by a plain number keeps the other side's kind (0.95 × a flow).
    Ok(match (ld.is_none(), rd.is_none()) {
        (false, true) => l,
        (true, false) if op == BinaryOp::Mul => r,
        _ => Typed::quantity(dimension),
    })
}

fn comparison(
    op: BinaryOp,
    left: Operand,
    right: Operand,
    span: Span,
) -> Result<Typed, FormulaError> {
    let ((l, left_expr), (r, right_expr)) = (left, right);
    let boolean = Typed::new(ValueType::Bool, None);
    let equality = matches!(op, BinaryOp::Eq | BinaryOp::Ne);
    if l.value_type == ValueType::Bool && r.value_type == ValueType::Bool {
        if equality {
            return Ok(boolean);
        }
        let message = format!(
            "cannot order true/false values with `{}` (use `==` or `!=`)",
            op.symbol()
        );
        return Err(FormulaError::type_error(message, span));
    }
    if l.value_type == r.value_type {
        return Ok(boolean);
    }
    let mut message = format!("cannot compare {} with {}", l.describe(), r.describe());
    let temperatures = [l, r]
        .iter()
        .all(|t| t.value_type.dimension() == Some(Dimension::TEMPERATURE));
    if temperatures {
        message.push_str(": write differences in K, dC or dF");
    } else {
        message.push_str(&unit_hint((l, left_expr), (r, right_expr)));
    }
    Err(FormulaError::type_error(message, span))
}

/// A hint for a bare number set against a quantity with a unit:
/// ` (write the number with a unit, e.g. `50 bar`)`.
fn unit_hint(left: Operand, right: Operand) -> String {
    let bare = |e: &Expr| match e {
        Expr::Literal { literal, .. } if literal.unit.is_none() => Some(literal.number.clone()),
        _ => None,
    };
    let (number, other) = match (bare(left.1), bare(right.1)) {
        (Some(n), None) => (n, right.0),
        (None, Some(n)) => (n, left.0),
        _ => return String::new(),
    };
    let kind = other
        .kind
        .filter(|k| ValueType::of_kind(*k) == other.value_type)
        .or_else(|| other.value_type.default_kind());
    match kind.map(|k| k.display_unit(UnitSystem::Metric)) {
        Some(unit) if !unit.is_empty() => {
            format!(" (write the number with a unit, e.g. `{number} {unit}`)")
        }
        _ => String::new(),
    }
}

fn builtin_call(
    builtin: Builtin,
    types: &[Typed],
    args: &[Expr],
    span: Span,
) -> Result<Typed, FormulaError> {
    let name = builtin.name();
    match builtin {
        Builtin::Abs | Builtin::Sqrt if types.len() != 1 => {
            Err(arity(name, "x", types.len(), span))
        }
        Builtin::Clamp if types.len() != 3 => Err(arity(name, "x, lo, hi", types.len(), span)),
        Builtin::Min | Builtin::Max if types.len() < 2 => {
            let message = format!(
                "`{name}` takes two or more arguments, found {}",
                types.len()
            );
            Err(FormulaError::type_error(message, span))
        }
        Builtin::Abs => {
            expect_scalable(types[0], "take `abs` of", args[0].span())?;
            Ok(types[0])
        }
        Builtin::Sqrt => {
            let dimension = expect_scalable(types[0], "take `sqrt` of", args[0].span())?;
            match dimension.sqrt() {
                Some(root) => Ok(Typed::quantity(root)),
                None => {
                    let message = format!("cannot take the square root of {}", types[0].describe());
                    Err(FormulaError::type_error(message, args[0].span()))
                }
            }
        }
        Builtin::Clamp | Builtin::Min | Builtin::Max => {
            let first = types[0];
            if first.value_type == ValueType::Bool {
                let message = format!("`{name}` needs quantities, found a true/false value");
                return Err(FormulaError::type_error(message, args[0].span()));
            }
            for (typed, arg) in types.iter().zip(args).skip(1) {
                if typed.value_type != first.value_type {
                    let message = format!(
                        "the arguments of `{name}` differ: {} and {}",
                        first.describe(),
                        typed.describe()
                    );
                    return Err(FormulaError::type_error(message, arg.span()));
                }
            }
            Ok(first)
        }
    }
}

fn arity(name: &str, parameters: &str, found: usize, span: Span) -> FormulaError {
    let count = parameters.split(", ").count();
    let plural = if count == 1 { "" } else { "s" };
    let message = format!("`{name}` takes {count} argument{plural} ({parameters}), found {found}");
    FormulaError::type_error(message, span)
}

/// Combine two dimensions exponent by exponent, refusing exponents beyond
/// [`MAX_EXPONENT`] (which also keeps the `i8` arithmetic from overflowing).
fn checked(a: Dimension, b: Dimension, f: impl Fn(i8, i8) -> i16) -> Option<Dimension> {
    let limit = i16::from(MAX_EXPONENT);
    let e = |x: i8, y: i8| {
        let v = f(x, y);
        (-limit..=limit).contains(&v).then_some(v as i8)
    };
    Some(Dimension::new(
        e(a.mass, b.mass)?,
        e(a.length, b.length)?,
        e(a.time, b.time)?,
        e(a.temperature, b.temperature)?,
    ))
}

fn overflow(span: Span) -> FormulaError {
    let kind = FormulaErrorKind::DimensionOverflow { max: MAX_EXPONENT };
    FormulaError::new(kind, span)
}
