//! Formula text to syntax tree: a Pratt (precedence-climbing) parser.
//!
//! Why hand-written: the grammar is a dozen operators at eight precedence
//! levels, and what matters most is the error text a technician or rule
//! author sees ("comparisons cannot be chained: use `and`", "expected `)`,
//! found `,`") with an exact byte span, plus hard limits on nesting depth
//! and length so that no input can overflow the stack. A parser library
//! would add a dependency and a second tokenizer, while numbers and units
//! must be read by the same scanner and unit catalogue as technician input.
//! A Pratt parser states each operator's binding power in one place and
//! needs no backtracking.

use super::expr::{precedence, BinaryOp, Expr, Literal, UnaryOp};
use super::formula_error::{FormulaError, FormulaErrorKind, Span};
use super::lexer::{Lexer, Token, TokenKind};

/// The longest formula accepted, in bytes.
pub const MAX_LENGTH: usize = 4096;

/// The deepest nesting of brackets, operators and calls accepted.
pub const MAX_DEPTH: usize = 40;

/// A parsed subtree and its depth.
type Parsed = (Expr, usize);

/// Parses one formula's tokens into an [`Expr`].
#[derive(Debug)]
pub struct Parser<'a> {
    src: &'a str,
    tokens: Vec<Token>,
    pos: usize,
    depth: usize,
}

impl<'a> Parser<'a> {
    /// Parse `src` into a syntax tree (no names or types are checked here).
    pub fn parse(src: &'a str) -> Result<Expr, FormulaError> {
        let whole = Span::new(0, src.len());
        if src.len() > MAX_LENGTH {
            let kind = FormulaErrorKind::TooLong {
                len: src.len(),
                max: MAX_LENGTH,
            };
            return Err(FormulaError::new(kind, whole));
        }
        if src.trim().is_empty() {
            return Err(FormulaError::new(FormulaErrorKind::Empty, whole));
        }
        let mut parser = Parser {
            src,
            tokens: Lexer::tokenize(src)?,
            pos: 0,
            depth: 0,
        };
        let (expr, _) = parser.expression(precedence::IF)?;
        if parser.peek() != &TokenKind::End {
            let expected = if parser.after_bare_number() {
                "an operator (a unit goes right after its number, with at most one space)"
            } else {
                "an operator or the end of the formula"
            };
            return Err(parser.expected(expected));
        }
        Ok(expr)
    }

    fn peek(&self) -> &TokenKind {
        &self.tokens[self.pos.min(self.tokens.len() - 1)].kind
    }

    fn peek_second(&self) -> &TokenKind {
        &self.tokens[(self.pos + 1).min(self.tokens.len() - 1)].kind
    }

    fn span(&self) -> Span {
        self.tokens[self.pos.min(self.tokens.len() - 1)].span
    }

    fn advance(&mut self) -> Token {
        let token = self.tokens[self.pos.min(self.tokens.len() - 1)].clone();
        if self.pos < self.tokens.len() - 1 {
            self.pos += 1;
        }
        token
    }

    fn after_bare_number(&self) -> bool {
        let previous = self.pos.checked_sub(1).map(|i| &self.tokens[i].kind);
        matches!(previous, Some(TokenKind::Number(l)) if l.unit.is_none())
            && matches!(self.peek(), TokenKind::Name { .. })
    }

    fn found(&self) -> String {
        match self.peek() {
            TokenKind::End => "the end of the formula".to_string(),
            _ => {
                let span = self.span();
                format!("`{}`", &self.src[span.start..span.end])
            }
        }
    }

    fn expected(&self, expected: &str) -> FormulaError {
        let kind = FormulaErrorKind::Expected {
            expected: expected.to_string(),
            found: self.found(),
        };
        FormulaError::new(kind, self.span())
    }

    fn expect(&mut self, kind: &TokenKind, text: &str) -> Result<Token, FormulaError> {
        if self.peek() == kind {
            Ok(self.advance())
        } else {
            Err(self.expected(text))
        }
    }

    fn too_deep(&self, depth: usize, span: Span) -> Result<(), FormulaError> {
        if depth > MAX_DEPTH {
            let kind = FormulaErrorKind::TooDeep { max: MAX_DEPTH };
            return Err(FormulaError::new(kind, span));
        }
        Ok(())
    }

    /// An expression whose operators bind at least as tightly as `min`.
    fn expression(&mut self, min: u8) -> Result<Parsed, FormulaError> {
        self.depth += 1;
        self.too_deep(self.depth, self.span())?;
        let result = self.operators(min);
        self.depth -= 1;
        result
    }

    fn operators(&mut self, min: u8) -> Result<Parsed, FormulaError> {
        let (mut left, mut depth) = self.prefix()?;
        let mut compared = false;
        loop {
            if self.peek() == &TokenKind::Caret {
                (left, depth) = self.power(left, depth)?;
                continue;
            }
            let Some(op) = binary_op(self.peek()) else {
                break;
            };
            let p = op.precedence();
            if p < min {
                break;
            }
            if compared && op.is_comparison() {
                let kind = FormulaErrorKind::ChainedComparison;
                return Err(FormulaError::new(kind, self.span()));
            }
            self.advance();
            let (right, right_depth) = self.expression(p + 1)?;
            let span = left.span().to(right.span());
            depth = 1 + depth.max(right_depth);
            self.too_deep(depth, span)?;
            left = Expr::Binary {
                op,
                left: Box::new(left),
                right: Box::new(right),
                span,
            };
            compared = op.is_comparison();
        }
        Ok((left, depth))
    }

    fn power(&mut self, base: Expr, depth: usize) -> Result<Parsed, FormulaError> {
        self.advance();
        let exponent_span = self.span();
        let negative = self.peek() == &TokenKind::Minus;
        if negative {
            self.advance();
        }
        let exponent = match self.peek() {
            TokenKind::Number(literal) => literal.as_exponent(),
            _ => None,
        };
        let Some(exponent) = exponent else {
            return Err(self.expected("a whole number from -9 to 9 after `^`"));
        };
        let end = self.advance().span;
        if self.peek() == &TokenKind::Caret {
            let kind = FormulaErrorKind::ChainedPower;
            return Err(FormulaError::new(kind, self.span()));
        }
        let span = base.span().to(exponent_span).to(end);
        self.too_deep(depth + 1, span)?;
        let power = Expr::Power {
            base: Box::new(base),
            exponent: if negative { -exponent } else { exponent },
            span,
        };
        Ok((power, depth + 1))
    }

    fn prefix(&mut self) -> Result<Parsed, FormulaError> {
        let start = self.span();
        match self.peek().clone() {
            TokenKind::Number(literal) => {
                self.advance();
                Ok((
                    Expr::Literal {
                        literal,
                        span: start,
                    },
                    1,
                ))
            }
            TokenKind::True | TokenKind::False => {
                let value = self.advance().kind == TokenKind::True;
                Ok((Expr::Bool { value, span: start }, 1))
            }
            TokenKind::Name { name, point } => {
                self.advance();
                if self.peek() == &TokenKind::LeftParen {
                    if point.is_some() {
                        let kind = FormulaErrorKind::Type {
                            message: "a function cannot have an operating point".to_string(),
                        };
                        return Err(FormulaError::new(kind, start));
                    }
                    return self.call(name, start);
                }
                Ok((
                    Expr::Name {
                        name,
                        point,
                        span: start,
                    },
                    1,
                ))
            }
            TokenKind::LeftParen => {
                self.advance();
                let (inner, depth) = self.expression(precedence::IF)?;
                let end = self.expect(&TokenKind::RightParen, "`)`")?.span;
                Ok((inner.bracketed(start.to(end)), depth))
            }
            TokenKind::Minus => self.negation(start),
            TokenKind::Not => {
                self.advance();
                let (operand, depth) = self.expression(precedence::NOT)?;
                Ok(unary(UnaryOp::Not, operand, depth, start))
            }
            TokenKind::If => self.conditional(start),
            _ => Err(self.expected("a value")),
        }
    }

    /// `-x`; a minus right before a number is part of the number (so that
    /// `-40 degC` is a temperature), unless a power follows (`-2^2` is -4).
    fn negation(&mut self, start: Span) -> Result<Parsed, FormulaError> {
        self.advance();
        if let (TokenKind::Number(literal), next) = (self.peek(), self.peek_second()) {
            if next != &TokenKind::Caret {
                let number = format!("-{}", literal.number);
                let unit = literal.unit.clone();
                let span = start.to(self.advance().span);
                let literal = Literal::parse(&number, unit.as_deref()).map_err(|message| {
                    FormulaError::new(FormulaErrorKind::InvalidLiteral { message }, span)
                })?;
                return Ok((Expr::Literal { literal, span }, 1));
            }
        }
        let (operand, depth) = self.expression(precedence::NEG)?;
        Ok(unary(UnaryOp::Neg, operand, depth, start))
    }

    fn conditional(&mut self, start: Span) -> Result<Parsed, FormulaError> {
        self.advance();
        let (condition, d1) = self.expression(precedence::IF)?;
        self.expect(&TokenKind::Then, "`then`")?;
        let (then_branch, d2) = self.expression(precedence::IF)?;
        self.expect(&TokenKind::Else, "`else` (an `if` needs both branches)")?;
        let (else_branch, d3) = self.expression(precedence::IF)?;
        let span = start.to(else_branch.span());
        let depth = 1 + d1.max(d2).max(d3);
        self.too_deep(depth, span)?;
        let expr = Expr::If {
            condition: Box::new(condition),
            then_branch: Box::new(then_branch),
            else_branch: Box::new(else_branch),
            span,
        };
        Ok((expr, depth))
    }

    fn call(&mut self, name: String, start: Span) -> Result<Parsed, FormulaError> {
        self.advance();
        let mut args = Vec::new();
        let mut depth = 0;
        if self.peek() != &TokenKind::RightParen {
            loop {
                let (arg, d) = self.expression(precedence::IF)?;
                depth = depth.max(d);
                args.push(arg);
                if self.peek() != &TokenKind::Comma {
                    break;
                }
                self.advance();
            }
        }
        let end = self.expect(&TokenKind::RightParen, "`,` or `)`")?.span;
        let span = start.to(end);
        self.too_deep(depth + 1, span)?;
        Ok((Expr::Call { name, args, span }, depth + 1))
    }
}

fn unary(op: UnaryOp, operand: Expr, depth: usize, start: Span) -> Parsed {
    let span = start.to(operand.span());
    let expr = Expr::Unary {
        op,
        operand: Box::new(operand),
        span,
    };
    (expr, depth + 1)
}

fn binary_op(kind: &TokenKind) -> Option<BinaryOp> {
    Some(match kind {
        TokenKind::And => BinaryOp::And,
        TokenKind::EqualEqual => BinaryOp::Eq,
        TokenKind::Greater => BinaryOp::Gt,
        TokenKind::GreaterEqual => BinaryOp::Ge,
        TokenKind::Less => BinaryOp::Lt,
        TokenKind::LessEqual => BinaryOp::Le,
        TokenKind::Minus => BinaryOp::Sub,
        TokenKind::NotEqual => BinaryOp::Ne,
        TokenKind::Or => BinaryOp::Or,
        TokenKind::Plus => BinaryOp::Add,
        TokenKind::Slash => BinaryOp::Div,
        TokenKind::Star => BinaryOp::Mul,
        _ => return None,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Parses `src` and checks the tree's shape and its canonical text.
    #[track_caller]
    fn case(src: &str, tree: &str, canonical: &str) {
        let expr = Parser::parse(src).unwrap_or_else(|e| panic!("{src}: {e}"));
        assert_eq!(expr.sexpr(), tree, "tree of {src}");
        assert_eq!(expr.to_string(), canonical, "canonical text of {src}");
        let again = Parser::parse(canonical).unwrap_or_else(|e| panic!("{canonical}: {e}"));
        assert_eq!(
            again.sexpr(),
            tree,
            "the canonical text of {src} parses back"
        );
    }

    #[test]
    fn text_to_tree() {
        case("a + b * c", "(+ a (* b c))", "a + b * c");
        case("(a + b) * c", "(* (+ a b) c)", "(a + b) * c");
        case("a - b - c", "(- (- a b) c)", "a - b - c");
        case("a - (b - c)", "(- a (- b c))", "a - (b - c)");
        case("a / b / c", "(/ (/ a b) c)", "a / b / c");
        case("-a^2", "(neg (^ a 2))", "-a^2");
        case("-2^2", "(neg (^ 2 2))", "-2^2");
        case("(-2)^2", "(^ -2 2)", "(-2)^2");
        case("x^-1", "(^ x -1)", "x^-1");
        case("(a*b)^2", "(^ (* a b) 2)", "(a * b)^2");
        case("-40 degC", "[-40 degC]", "-40 degC");
        case("a - -3 bar", "(- a [-3 bar])", "a - -3 bar");
        case("3 bar+100 psi", "(+ [3 bar] [100 psi])", "3 bar + 100 psi");
        case("210bar", "[210 bar]", "210 bar");
        case("38 L/min / 2", "(/ [38 L/min] 2)", "38 L/min / 2");
        case(
            "flow@loaded < 0.95 * flow@unloaded",
            "(< flow@loaded (* 0.95 flow@unloaded))",
            "flow@loaded < 0.95 * flow@unloaded",
        );
        case(
            "a < b and b < c or not d",
            "(or (and (< a b) (< b c)) (not d))",
            "a < b and b < c or not d",
        );
        case("not a < b", "(not (< a b))", "not a < b");
        case("not (a and b)", "(not (and a b))", "not (a and b)");
        case("(a < b) == c", "(== (< a b) c)", "(a < b) == c");
        case(
            "if a > b then a else b",
            "(if (> a b) a b)",
            "if a > b then a else b",
        );
        case(
            "1 + (if c then 2 else 3)",
            "(+ 1 (if c 2 3))",
            "1 + (if c then 2 else 3)",
        );
        case("clamp(x,lo , hi)", "(clamp x lo hi)", "clamp(x, lo, hi)");
        case(
            "max(a, min(b, c))",
            "(max a (min b c))",
            "max(a, min(b, c))",
        );
        case("true or false", "(or true false)", "true or false");
        case("a != b", "(!= a b)", "a != b");
        case("--a", "(neg (neg a))", "--a");
        case("- -3", "(neg -3)", "--3");
    }

    #[track_caller]
    fn error(src: &str, message: &str, span: (usize, usize)) {
        let err = Parser::parse(src).expect_err(src);
        assert_eq!(err.to_string(), message, "{src}");
        assert_eq!(err.span, Span::new(span.0, span.1), "span of {src}");
    }

    #[test]
    fn syntax_errors() {
        error(
            "a < b < c",
            "comparisons cannot be chained: use `and`, as in `a < b and b < c`",
            (6, 7),
        );
        error(
            "a < b == c",
            "comparisons cannot be chained: use `and`, as in `a < b and b < c`",
            (6, 8),
        );
        error(
            "a^2^3",
            "a power of a power is ambiguous: add brackets, as in `(a^2)^3`",
            (3, 4),
        );
        error(
            "a^b",
            "expected a whole number from -9 to 9 after `^`, found `b`",
            (2, 3),
        );
        error(
            "a^2.5",
            "expected a whole number from -9 to 9 after `^`, found `2.5`",
            (2, 5),
        );
        error(
            "a^12",
            "expected a whole number from -9 to 9 after `^`, found `12`",
            (2, 4),
        );
        error(
            "(a + b",
            "expected `)`, found the end of the formula",
            (6, 6),
        );
        error(
            "a +",
            "expected a value, found the end of the formula",
            (3, 3),
        );
        error(
            "a b",
            "expected an operator or the end of the formula, found `b`",
            (2, 3),
        );
        error(
            "3  bar",
            "expected an operator (a unit goes right after its number, with at most one space), found `bar`",
            (3, 6),
        );
        error("max(a b)", "expected `,` or `)`, found `b`", (6, 7));
        error("max(a,)", "expected a value, found `)`", (6, 7));
        error(
            "if a then b",
            "expected `else` (an `if` needs both branches), found the end of the formula",
            (11, 11),
        );
        error("if a b", "expected `then`, found `b`", (5, 6));
        error(")", "expected a value, found `)`", (0, 1));
        error("   ", "empty formula", (0, 3));
        error("-300 degC", "`-300 degC` is below absolute zero", (0, 9));
        error(
            "f@hot(x)",
            "a function cannot have an operating point",
            (0, 5),
        );
    }

    #[test]
    fn limits() {
        let deep = format!("{}x{}", "(".repeat(40), ")".repeat(40));
        assert_eq!(
            Parser::parse(&deep).unwrap_err().kind,
            FormulaErrorKind::TooDeep { max: MAX_DEPTH }
        );
        let ok = format!("{}x{}", "(".repeat(30), ")".repeat(30));
        assert!(Parser::parse(&ok).is_ok());
        // A long flat chain is as deep as it is long.
        let chain = vec!["x"; 60].join(" + ");
        assert_eq!(
            Parser::parse(&chain).unwrap_err().kind,
            FormulaErrorKind::TooDeep { max: MAX_DEPTH }
        );
        let negations = format!("{}x", "-".repeat(100));
        assert!(Parser::parse(&negations).is_err());
        // Thousands of brackets fail cleanly rather than overflow the stack.
        let huge = "(".repeat(MAX_LENGTH);
        assert_eq!(
            Parser::parse(&huge).unwrap_err().kind,
            FormulaErrorKind::TooDeep { max: MAX_DEPTH }
        );
        let long = "x".repeat(MAX_LENGTH + 1);
        assert_eq!(
            Parser::parse(&long).unwrap_err().to_string(),
            "formula is 4097 bytes long; the limit is 4096"
        );
    }
}
