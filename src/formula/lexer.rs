//! Turning formula text into tokens. Numbers and units are read with the
//! same scanner and unit catalogue as technician input, so `3 bar` means
//! the same in a reading and in a formula.

use super::expr::Literal;
use super::formula_error::{FormulaError, FormulaErrorKind, Span};
use crate::units::{self, unit::UNITS};

/// One token of formula text.
#[derive(Clone, Debug, PartialEq)]
pub enum TokenKind {
    /// `and`
    And,
    /// `^`
    Caret,
    /// `,`
    Comma,
    /// `else`
    Else,
    /// The end of the text.
    End,
    /// `==`
    EqualEqual,
    /// `false`
    False,
    /// `>`
    Greater,
    /// `>=`
    GreaterEqual,
    /// `if`
    If,
    /// `(`
    LeftParen,
    /// `<`
    Less,
    /// `<=`
    LessEqual,
    /// `-`
    Minus,
    /// A quantity name with an optional operating point: `flow@loaded`.
    Name {
        /// The name before `@`.
        name: String,
        /// The operating point after `@`, if any.
        point: Option<String>,
    },
    /// `not`
    Not,
    /// `!=`
    NotEqual,
    /// A number, with its unit if one follows it.
    Number(Literal),
    /// `or`
    Or,
    /// `+`
    Plus,
    /// `)`
    RightParen,
    /// `/`
    Slash,
    /// `*`
    Star,
    /// `then`
    Then,
    /// `true`
    True,
}

/// A token and the bytes of source it came from.
#[derive(Clone, Debug, PartialEq)]
pub struct Token {
    /// What the token is.
    pub kind: TokenKind,
    /// Where it is.
    pub span: Span,
}

/// Reads formula text into tokens, left to right.
#[derive(Debug)]
pub struct Lexer<'a> {
    src: &'a str,
    pos: usize,
}

impl<'a> Lexer<'a> {
    /// A lexer over `src`.
    pub fn new(src: &'a str) -> Self {
        Lexer { src, pos: 0 }
    }

    /// Every token of `src`, ending with [`TokenKind::End`].
    pub fn tokenize(src: &'a str) -> Result<Vec<Token>, FormulaError> {
        let mut lexer = Lexer::new(src);
        let mut tokens = Vec::new();
        loop {
            let token = lexer.next_token()?;
            let end = token.kind == TokenKind::End;
            tokens.push(token);
            if end {
                return Ok(tokens);
            }
        }
    }

    /// The next token; [`TokenKind::End`] once the text is used up.
    pub fn next_token(&mut self) -> Result<Token, FormulaError> {
        self.skip_whitespace();
        let start = self.pos;
        let Some(c) = self.peek() else {
            return Ok(self.token(TokenKind::End, start));
        };
        if c.is_ascii_digit() || (c == '.' && self.peek_at(1).is_some_and(|d| d.is_ascii_digit())) {
            return self.number();
        }
        if c.is_ascii_alphabetic() || c == '_' {
            return self.word();
        }
        self.operator(c)
    }

    fn peek(&self) -> Option<char> {
        self.src[self.pos..].chars().next()
    }

    fn peek_at(&self, n: usize) -> Option<char> {
        self.src[self.pos..].chars().nth(n)
    }

    fn rest(&self) -> &'a str {
        &self.src[self.pos..]
    }

    fn skip_whitespace(&mut self) {
        while let Some(c) = self.peek().filter(|c| c.is_whitespace()) {
            self.pos += c.len_utf8();
        }
    }

    fn token(&self, kind: TokenKind, start: usize) -> Token {
        Token {
            kind,
            span: Span::new(start, self.pos),
        }
    }

    fn error(&self, kind: FormulaErrorKind, start: usize, end: usize) -> FormulaError {
        FormulaError::new(kind, Span::new(start, end))
    }

    fn operator(&mut self, c: char) -> Result<Token, FormulaError> {
        let start = self.pos;
        let next = self.peek_at(1);
        let (kind, len) = match (c, next) {
            ('+', _) => (TokenKind::Plus, 1),
            ('-', _) => (TokenKind::Minus, 1),
            ('*', Some('*')) => return Err(self.use_instead("**", "^")),
            ('*', _) => (TokenKind::Star, 1),
            ('/', _) => (TokenKind::Slash, 1),
            ('^', _) => (TokenKind::Caret, 1),
            ('(', _) => (TokenKind::LeftParen, 1),
            (')', _) => (TokenKind::RightParen, 1),
            (',', _) => (TokenKind::Comma, 1),
            ('<', Some('=')) => (TokenKind::LessEqual, 2),
            ('<', Some('>')) => return Err(self.use_instead("<>", "!=")),
            ('<', _) => (TokenKind::Less, 1),
            ('>', Some('=')) => (TokenKind::GreaterEqual, 2),
            ('>', _) => (TokenKind::Greater, 1),
            ('=', Some('=')) => (TokenKind::EqualEqual, 2),
            ('=', _) => return Err(self.use_instead("=", "==")),
            ('!', Some('=')) => (TokenKind::NotEqual, 2),
            ('!', _) => return Err(self.use_instead("!", "not")),
            ('&', Some('&')) => return Err(self.use_instead("&&", "and")),
            ('&', _) => return Err(self.use_instead("&", "and")),
            ('|', Some('|')) => return Err(self.use_instead("||", "or")),
            ('|', _) => return Err(self.use_instead("|", "or")),
            _ => return Err(self.foreign_operator(c)),
        };
        self.pos += len;
        Ok(self.token(kind, start))
    }

    fn use_instead(&self, found: &str, instead: &'static str) -> FormulaError {
        self.error(
            FormulaErrorKind::UseInstead {
                found: found.to_string(),
                instead,
            },
            self.pos,
            self.pos + found.len(),
        )
    }

    /// Typographic operators pasted from documents get a pointer to ours.
    fn foreign_operator(&self, c: char) -> FormulaError {
        let instead = match c {
            '≤' => "<=",
            '≥' => ">=",
            '≠' => "!=",
            '×' | '·' => "*",
            '÷' => "/",
            '−' | '–' => "-",
            _ => {
                let ch = c.escape_debug().to_string();
                return self.error(
                    FormulaErrorKind::UnexpectedChar { ch },
                    self.pos,
                    self.pos + c.len_utf8(),
                );
            }
        };
        self.error(
            FormulaErrorKind::UseInstead {
                found: c.to_string(),
                instead,
            },
            self.pos,
            self.pos + c.len_utf8(),
        )
    }

    fn identifier(&mut self) -> &'a str {
        let start = self.pos;
        while self
            .peek()
            .is_some_and(|c| c.is_ascii_alphanumeric() || c == '_')
        {
            self.pos += 1;
        }
        &self.src[start..self.pos]
    }

    fn word(&mut self) -> Result<Token, FormulaError> {
        let start = self.pos;
        let name = self.identifier();
        let keyword = match name {
            "and" => Some(TokenKind::And),
            "else" => Some(TokenKind::Else),
            "false" => Some(TokenKind::False),
            "if" => Some(TokenKind::If),
            "not" => Some(TokenKind::Not),
            "or" => Some(TokenKind::Or),
            "then" => Some(TokenKind::Then),
            "true" => Some(TokenKind::True),
            _ => None,
        };
        if let Some(kind) = keyword {
            return Ok(self.token(kind, start));
        }
        let point = if self.peek() == Some('@') {
            self.pos += 1;
            let point = self.identifier();
            if point.is_empty() || point.starts_with(|c: char| c.is_ascii_digit()) {
                return Err(self.error(
                    FormulaErrorKind::Expected {
                        expected: "an operating point name after `@`".to_string(),
                        found: found_at(self.src, self.pos),
                    },
                    self.pos,
                    self.pos + self.peek().map_or(0, char::len_utf8),
                ));
            }
            Some(point.to_string())
        } else {
            None
        };
        let kind = TokenKind::Name {
            name: name.to_string(),
            point,
        };
        Ok(self.token(kind, start))
    }

    fn number(&mut self) -> Result<Token, FormulaError> {
        let start = self.pos;
        let (mantissa_len, len) = units::number_len(self.rest());
        let mantissa = &self.rest()[..mantissa_len];
        let text = &self.rest()[..len];
        let value: Option<f64> = text.parse().ok().filter(|v: &f64| v.is_finite());
        if mantissa.matches('.').count() > 1 || value.is_none() {
            return Err(self.error(
                FormulaErrorKind::MalformedNumber {
                    text: text.to_string(),
                },
                start,
                start + len,
            ));
        }
        self.pos += len;
        let unit = self.unit()?;
        let literal = Literal::parse(text, unit).map_err(|message| {
            self.error(
                FormulaErrorKind::InvalidLiteral { message },
                start,
                self.pos,
            )
        })?;
        Ok(self.token(TokenKind::Number(literal), start))
    }

    /// The unit right after a number, if any: after at most one space, the
    /// longest catalogue spelling or compound unit that ends where a unit
    /// cannot go on. A word there that is no unit (and no keyword, as in
    /// `3 and`) is an unknown unit.
    fn unit(&mut self) -> Result<Option<&'a str>, FormulaError> {
        let after_space = usize::from(self.rest().starts_with(' '));
        let at = self.pos + after_space;
        let rest = &self.src[at..];
        if !rest.starts_with(starts_unit) {
            return Ok(None);
        }
        let word_len = rest.find(|c| !continues_unit(c)).unwrap_or(rest.len());
        if after_space == 1 && is_keyword(&rest[..word_len]) {
            return Ok(None);
        }
        match unit_len(rest) {
            Some(len) => {
                self.pos = at + len;
                Ok(Some(&rest[..len]))
            }
            None => Err(self.unknown_unit(at, unit_run_len(rest))),
        }
    }

    fn unknown_unit(&self, at: usize, len: usize) -> FormulaError {
        let unit = &self.src[at..at + len];
        let suggestion = crate::suggest::suggest(unit, UNITS.iter().flat_map(|u| u.spellings()))
            .and_then(units::unit::find)
            .map(|u| u.symbol.to_string());
        self.error(
            FormulaErrorKind::UnknownUnit {
                unit: unit.to_string(),
                suggestion,
            },
            at,
            at + len,
        )
    }
}

/// A description of what stands at byte `at` of `src`, for messages.
pub(crate) fn found_at(src: &str, at: usize) -> String {
    match src.get(at..).and_then(|rest| rest.chars().next()) {
        Some(c) => format!("`{}`", c.escape_debug()),
        None => "the end of the formula".to_string(),
    }
}

fn is_keyword(word: &str) -> bool {
    matches!(
        word,
        "and" | "else" | "false" | "if" | "not" | "or" | "then" | "true"
    )
}

/// Characters a unit may start with (`bar`, `°C`, `µm`, `%`, `"`).
fn starts_unit(c: char) -> bool {
    c.is_alphabetic() || "°µμΔ%'\"".contains(c)
}

/// Characters that go on a unit's name; anything else ends a spelling.
/// Operators are not among them, so `3 bar/2` is 3 bar divided by 2.
fn continues_unit(c: char) -> bool {
    c.is_alphanumeric() || "_°µμΔ²³%·'\".".contains(c)
}

/// The length of the text that could belong to a compound unit: unit
/// characters and the operators units are built with, up to a space.
fn unit_run_len(rest: &str) -> usize {
    rest.find(|c| !(continues_unit(c) || "/*^()-".contains(c)))
        .unwrap_or(rest.len())
}

/// True when nothing that could go on a unit's name follows byte `end`.
fn ends_unit(rest: &str, end: usize) -> bool {
    rest.is_char_boundary(end) && !rest[end..].starts_with(continues_unit)
}

/// The length of the longest unit at the start of `rest`: a catalogue
/// spelling (some have spaces: `bar abs`) or a compound such as `m^3/s`.
fn unit_len(rest: &str) -> Option<usize> {
    let spelled = UNITS
        .iter()
        .flat_map(|u| u.spellings())
        .filter(|s| rest.starts_with(s) && ends_unit(rest, s.len()))
        .map(str::len)
        .max()
        .unwrap_or(0);
    let run = unit_run_len(rest);
    let compound = (spelled + 1..=run)
        .rev()
        .filter(|&end| ends_unit(rest, end))
        .find(|&end| units::parse_unit(&rest[..end], &rest[..end]).is_ok());
    compound.or((spelled > 0).then_some(spelled))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::unit::PSI;
    use crate::units::{Dimension, Quantity};

    #[track_caller]
    fn kinds(src: &str) -> Vec<TokenKind> {
        Lexer::tokenize(src)
            .unwrap_or_else(|e| panic!("{src}: {e}"))
            .into_iter()
            .map(|t| t.kind)
            .collect()
    }

    #[track_caller]
    fn literal(src: &str) -> Literal {
        match kinds(src).as_slice() {
            [TokenKind::Number(l), TokenKind::End] => l.clone(),
            other => panic!("{src}: {other:?}"),
        }
    }

    #[track_caller]
    fn case(src: &str, text: &str, value: Quantity) {
        let l = literal(src);
        assert_eq!(l.to_string(), text, "{src}");
        assert_eq!(l.value.dimension(), value.dimension(), "{src}");
        assert_eq!(
            l.value.is_temperature_point(),
            value.is_temperature_point(),
            "{src}"
        );
        let rel = ((l.value.si() - value.si()) / value.si()).abs();
        assert!(rel < 1e-12, "{src}: {} vs {}", l.value.si(), value.si());
    }

    #[test]
    fn numbers_with_units() {
        let p = |pa| Quantity::new(pa, Dimension::PRESSURE);
        case("0.05", "0.05", Quantity::number(0.05));
        case("1e-3", "1e-3", Quantity::number(1e-3));
        case("3 bar", "3 bar", p(3e5));
        case("210bar", "210 bar", p(210e5));
        case("100 psi", "100 psi", p(100.0 * PSI));
        case(
            "38 L/min",
            "38 L/min",
            Quantity::new(38e-3 / 60.0, Dimension::FLOW),
        );
        case("5 K", "5 K", Quantity::new(5.0, Dimension::TEMPERATURE));
        case("55 degC", "55 degC", Quantity::temperature(328.15));
        case(
            "2.8 in^3/rev",
            "2.8 in^3/rev",
            Quantity::new(2.8 * 0.0254f64.powi(3), Dimension::VOLUME),
        );
        case("3 %", "3 %", Quantity::number(0.03));
        case("1.5e3 psi", "1.5e3 psi", p(1500.0 * PSI));
        case("2 m^3/s", "2 m^3/s", Quantity::new(2.0, Dimension::FLOW));
        case("0.8 bar abs", "0.8 bar abs", p(0.8e5 - 101_325.0));
        case(
            "5 dF",
            "5 dF",
            Quantity::new(25.0 / 9.0, Dimension::TEMPERATURE),
        );
    }

    #[test]
    fn a_unit_ends_where_an_operator_or_space_starts() {
        let bar = || TokenKind::Number(Literal::parse("3", Some("bar")).unwrap());
        assert_eq!(
            kinds("3 bar/2").len(),
            4,
            "3 bar, /, 2, end: {:?}",
            kinds("3 bar/2")
        );
        assert_eq!(kinds("3 bar/2")[0], bar());
        assert_eq!(kinds("(3 bar)")[1], bar());
        assert_eq!(kinds("3 bar*x")[1], TokenKind::Star);
        assert_eq!(kinds("3 bar and x")[1], TokenKind::And);
        assert_eq!(kinds("3 and x")[1], TokenKind::And);
        assert_eq!(kinds("if x then 3 else 4")[3], kinds("3")[0]);
        assert_eq!(
            kinds("flow@loaded")[0],
            TokenKind::Name {
                name: "flow".to_string(),
                point: Some("loaded".to_string())
            }
        );
    }

    #[test]
    fn readings_and_formulas_agree_on_every_spelling() {
        // Every catalogue spelling after a number gives the value a reading gives.
        for unit in UNITS {
            for spelling in unit.spellings().filter(|s| s.starts_with(starts_unit)) {
                let text = format!("7 {spelling}");
                let Ok(reading) = units::parse_quantity(&text) else {
                    continue;
                };
                let l = literal(&text);
                assert_eq!(l.value, reading, "{text}");
            }
        }
    }

    #[track_caller]
    fn error(src: &str, message: &str, span: (usize, usize)) {
        let err = Lexer::tokenize(src).expect_err(src);
        assert_eq!(err.to_string(), message, "{src}");
        assert_eq!(err.span, Span::new(span.0, span.1), "{src}");
    }

    #[test]
    fn errors() {
        error("3 bra", "unknown unit `bra` (did you mean `bar`?)", (2, 5));
        error("3bra", "unknown unit `bra` (did you mean `bar`?)", (1, 4));
        error("1.2.3", "malformed number `1.2.3`", (0, 5));
        error("1e999", "malformed number `1e999`", (0, 5));
        error("a = b", "`=` is not an operator here: use `==`", (2, 3));
        error("a && b", "`&&` is not an operator here: use `and`", (2, 4));
        error("a # b", "unexpected character `#`", (2, 3));
        error(
            "flow@",
            "expected an operating point name after `@`, found the end of the formula",
            (5, 5),
        );
        error(
            "10 SUS",
            "`10 SUS`: a SUS reading must be at least 32 SUS",
            (0, 6),
        );
    }
}
