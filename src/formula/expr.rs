//! The syntax tree of a formula, and its canonical text (the pretty-printer).

use std::fmt;

use super::formula_error::Span;
use crate::units::{self, Quantity};

/// A number as written in a formula, with its unit if it has one, and its
/// value in SI.
#[derive(Clone, Debug, PartialEq)]
pub struct Literal {
    /// The number as written, with a leading `-` if it was negated in place.
    pub number: String,
    /// The unit as written, if any.
    pub unit: Option<String>,
    /// The value, read the way technician input is read.
    pub value: Quantity,
}

impl Literal {
    /// Read `number` with `unit` as a reading would be read; the error is
    /// the unit parser's message.
    pub fn parse(number: &str, unit: Option<&str>) -> Result<Literal, String> {
        let text = match unit {
            Some(unit) => format!("{number} {unit}"),
            None => number.to_string(),
        };
        let value = units::parse_quantity(&text).map_err(|e| e.to_string())?;
        Ok(Literal {
            number: number.to_string(),
            unit: unit.map(str::to_string),
            value,
        })
    }

    /// The value as a power, for a plain whole number from -9 to 9 with no unit.
    pub fn as_exponent(&self) -> Option<i8> {
        let v = self.value.si();
        (self.unit.is_none() && v.fract() == 0.0 && v.abs() <= 9.0).then_some(v as i8)
    }
}

impl fmt::Display for Literal {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match &self.unit {
            Some(unit) => write!(f, "{} {unit}", self.number),
            None => f.write_str(&self.number),
        }
    }
}

/// An operator with two operands.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum BinaryOp {
    /// `+`
    Add,
    /// `and`
    And,
    /// `/`
    Div,
    /// `==` (within a relative tolerance)
    Eq,
    /// `>=`
    Ge,
    /// `>`
    Gt,
    /// `<=`
    Le,
    /// `<`
    Lt,
    /// `*`
    Mul,
    /// `!=` (beyond a relative tolerance)
    Ne,
    /// `or`
    Or,
    /// `-`
    Sub,
}

impl BinaryOp {
    /// The operator as written.
    pub fn symbol(self) -> &'static str {
        match self {
            BinaryOp::Add => "+",
            BinaryOp::And => "and",
            BinaryOp::Div => "/",
            BinaryOp::Eq => "==",
            BinaryOp::Ge => ">=",
            BinaryOp::Gt => ">",
            BinaryOp::Le => "<=",
            BinaryOp::Lt => "<",
            BinaryOp::Mul => "*",
            BinaryOp::Ne => "!=",
            BinaryOp::Or => "or",
            BinaryOp::Sub => "-",
        }
    }

    /// How tightly the operator binds; higher binds tighter.
    pub fn precedence(self) -> u8 {
        match self {
            BinaryOp::Or => precedence::OR,
            BinaryOp::And => precedence::AND,
            BinaryOp::Add | BinaryOp::Sub => precedence::SUM,
            BinaryOp::Mul | BinaryOp::Div => precedence::PRODUCT,
            _ => precedence::COMPARISON,
        }
    }

    /// True for `< <= > >= == !=`.
    pub fn is_comparison(self) -> bool {
        self.precedence() == precedence::COMPARISON
    }
}

/// An operator with one operand.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum UnaryOp {
    /// `-x`
    Neg,
    /// `not x`
    Not,
}

/// Precedence levels shared by the parser and the printer, loosest first.
pub(crate) mod precedence {
    /// `if … then … else …`
    pub const IF: u8 = 0;
    /// `or`
    pub const OR: u8 = 1;
    /// `and`
    pub const AND: u8 = 2;
    /// `not x`
    pub const NOT: u8 = 3;
    /// `< <= > >= == !=` (not associative)
    pub const COMPARISON: u8 = 4;
    /// `+ -`
    pub const SUM: u8 = 5;
    /// `* /`
    pub const PRODUCT: u8 = 6;
    /// `-x`
    pub const NEG: u8 = 7;
    /// `x^n`
    pub const POWER: u8 = 8;
    /// Names, numbers, calls, brackets.
    pub const ATOM: u8 = 9;
}

/// A formula's syntax tree. Every node knows the source bytes it spans.
#[derive(Clone, Debug, PartialEq)]
pub enum Expr {
    /// `left op right`
    Binary {
        /// The operator.
        op: BinaryOp,
        /// The left operand.
        left: Box<Expr>,
        /// The right operand.
        right: Box<Expr>,
        /// Where.
        span: Span,
    },
    /// `true` or `false`.
    Bool {
        /// The value.
        value: bool,
        /// Where.
        span: Span,
    },
    /// `name(arg, …)`
    Call {
        /// The function's name.
        name: String,
        /// The arguments.
        args: Vec<Expr>,
        /// Where (the name through the closing bracket).
        span: Span,
    },
    /// `if condition then then_branch else else_branch`
    If {
        /// The condition.
        condition: Box<Expr>,
        /// The value when the condition holds.
        then_branch: Box<Expr>,
        /// The value otherwise.
        else_branch: Box<Expr>,
        /// Where.
        span: Span,
    },
    /// A number, with its unit if it has one.
    Literal {
        /// The number.
        literal: Literal,
        /// Where.
        span: Span,
    },
    /// A reading: `supply_pressure`, `flow@loaded`.
    Name {
        /// The quantity's name.
        name: String,
        /// The operating point, if tagged.
        point: Option<String>,
        /// Where.
        span: Span,
    },
    /// `base^exponent` with a constant whole exponent.
    Power {
        /// The base.
        base: Box<Expr>,
        /// The exponent.
        exponent: i8,
        /// Where.
        span: Span,
    },
    /// `-x` or `not x`.
    Unary {
        /// The operator.
        op: UnaryOp,
        /// The operand.
        operand: Box<Expr>,
        /// Where.
        span: Span,
    },
}

impl Expr {
    /// The source bytes this node spans.
    pub fn span(&self) -> Span {
        match self {
            Expr::Binary { span, .. }
            | Expr::Bool { span, .. }
            | Expr::Call { span, .. }
            | Expr::If { span, .. }
            | Expr::Literal { span, .. }
            | Expr::Name { span, .. }
            | Expr::Power { span, .. }
            | Expr::Unary { span, .. } => *span,
        }
    }

    /// The node with its span widened to the brackets around it, so that
    /// messages about a bracketed operation underline the brackets too.
    /// Names and calls keep their own span, which locates their name.
    pub(crate) fn bracketed(mut self, outer: Span) -> Expr {
        match &mut self {
            Expr::Binary { span, .. }
            | Expr::Bool { span, .. }
            | Expr::If { span, .. }
            | Expr::Literal { span, .. }
            | Expr::Power { span, .. }
            | Expr::Unary { span, .. } => *span = outer,
            Expr::Call { .. } | Expr::Name { .. } => {}
        }
        self
    }

    /// How tightly this node binds, for deciding where brackets go.
    fn precedence(&self) -> u8 {
        match self {
            Expr::Binary { op, .. } => op.precedence(),
            Expr::If { .. } => precedence::IF,
            Expr::Literal { literal, .. } if literal.number.starts_with('-') => precedence::NEG,
            Expr::Power { .. } => precedence::POWER,
            Expr::Unary {
                op: UnaryOp::Neg, ..
            } => precedence::NEG,
            Expr::Unary {
                op: UnaryOp::Not, ..
            } => precedence::NOT,
            Expr::Bool { .. } | Expr::Call { .. } | Expr::Literal { .. } | Expr::Name { .. } => {
                precedence::ATOM
            }
        }
    }

    /// A fully bracketed prefix form, e.g. `(+ a (* [3 bar] b))`, that shows
    /// the tree's shape; used by tests and when debugging the parser.
    pub fn sexpr(&self) -> String {
        match self {
            Expr::Binary {
                op, left, right, ..
            } => format!("({} {} {})", op.symbol(), left.sexpr(), right.sexpr()),
            Expr::Bool { value, .. } => value.to_string(),
            Expr::Call { name, args, .. } => {
                let args: Vec<String> = args.iter().map(Expr::sexpr).collect();
                format!("({name} {})", args.join(" "))
            }
            Expr::If {
                condition,
                then_branch,
                else_branch,
                ..
            } => format!(
                "(if {} {} {})",
                condition.sexpr(),
                then_branch.sexpr(),
                else_branch.sexpr()
            ),
            Expr::Literal { literal, .. } if literal.unit.is_some() => format!("[{literal}]"),
            Expr::Literal { literal, .. } => literal.to_string(),
            Expr::Name { .. } => self.to_string(),
            Expr::Power { base, exponent, .. } => format!("(^ {} {exponent})", base.sexpr()),
            Expr::Unary {
                op: UnaryOp::Neg,
                operand,
                ..
            } => format!("(neg {})", operand.sexpr()),
            Expr::Unary {
                op: UnaryOp::Not,
                operand,
                ..
            } => format!("(not {})", operand.sexpr()),
        }
    }
}

/// Write `child`, bracketed when it binds looser than `min`.
fn child(f: &mut fmt::Formatter<'_>, child: &Expr, min: u8) -> fmt::Result {
    if child.precedence() < min {
        write!(f, "({child})")
    } else {
        write!(f, "{child}")
    }
}

impl fmt::Display for Expr {
    /// The canonical text: single spaces around binary operators and
    /// keywords, `, ` between arguments, and only the brackets the tree needs
    /// (parsing the text gives the same tree back).
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Expr::Binary {
                op, left, right, ..
            } => {
                let p = op.precedence();
                // Left-associative, so an equal-precedence right operand needs
                // brackets; comparisons do not associate at all.
                let left_min = if op.is_comparison() { p + 1 } else { p };
                child(f, left, left_min)?;
                write!(f, " {} ", op.symbol())?;
                child(f, right, p + 1)
            }
            Expr::Bool { value, .. } => write!(f, "{value}"),
            Expr::Call { name, args, .. } => {
                write!(f, "{name}(")?;
                for (i, arg) in args.iter().enumerate() {
                    if i > 0 {
                        f.write_str(", ")?;
                    }
                    write!(f, "{arg}")?;
                }
                f.write_str(")")
            }
            Expr::If {
                condition,
                then_branch,
                else_branch,
                ..
            } => write!(f, "if {condition} then {then_branch} else {else_branch}"),
            Expr::Literal { literal, .. } => write!(f, "{literal}"),
            Expr::Name { name, point, .. } => match point {
                Some(point) => write!(f, "{name}@{point}"),
                None => f.write_str(name),
            },
            Expr::Power { base, exponent, .. } => {
                child(f, base, precedence::ATOM)?;
                write!(f, "^{exponent}")
            }
            Expr::Unary { op, operand, .. } => {
                let (text, min) = match op {
                    UnaryOp::Neg => ("-", precedence::NEG),
                    UnaryOp::Not => ("not ", precedence::NOT),
                };
                f.write_str(text)?;
                child(f, operand, min)
            }
        }
    }
}
