//! Evidence sentences with computed values: `"the drop across the orifice
//! is {supply_pressure - load_pressure in bar}, below the {spring_setting}"`.
//!
//! Each `{expr}` or `{expr in UNIT}` placeholder is compiled and checked
//! like a formula when the rule base loads. `{{` and `}}` stand for braces.

use super::environment::Environment;
use super::formula::Formula;
use super::formula_error::{FormulaError, FormulaErrorKind, Span};
use super::function_table::FunctionTable;
use super::inputs::Inputs;
use super::outcome::Outcome;
use super::value::Value;
use crate::units::unit::{self, Scale};
use crate::units::{self, format_number, Quantity, UnitExpr, UnitSystem};

/// A compiled evidence sentence.
#[derive(Clone, Debug)]
pub struct Template {
    source: String,
    parts: Vec<Part>,
}

#[derive(Clone, Debug)]
enum Part {
    Text(String),
    Value {
        formula: Formula,
        /// Byte offset of the formula in the template.
        offset: usize,
        unit: Option<UnitExpr>,
    },
}

impl Template {
    /// Compile `source`, checking every placeholder. Error spans are byte
    /// offsets into the whole template.
    pub fn compile(
        source: &str,
        environment: &Environment,
        functions: &FunctionTable,
    ) -> Result<Template, FormulaError> {
        let mut parts = Vec::new();
        let mut text = String::new();
        let mut rest = source.char_indices().peekable();
        while let Some((i, c)) = rest.next() {
            match c {
                '{' if rest.peek().map(|(_, c)| *c) == Some('{') => {
                    rest.next();
                    text.push('{');
                }
                '}' if rest.peek().map(|(_, c)| *c) == Some('}') => {
                    rest.next();
                    text.push('}');
                }
                '}' => return Err(brace_error("unmatched `}` (write `}}` for a brace)", i)),
                '{' => {
                    let Some(len) = source[i + 1..].find('}') else {
                        return Err(brace_error("unclosed `{` in the template", i));
                    };
                    let end = i + 1 + len;
                    while rest.peek().is_some_and(|(j, _)| *j <= end) {
                        rest.next();
                    }
                    if !text.is_empty() {
                        parts.push(Part::Text(std::mem::take(&mut text)));
                    }
                    parts.push(placeholder(source, i + 1, end, environment, functions)?);
                }
                _ => text.push(c),
            }
        }
        if !text.is_empty() {
            parts.push(Part::Text(text));
        }
        Ok(Template {
            source: source.to_string(),
            parts,
        })
    }

    /// The template as written.
    pub fn source(&self) -> &str {
        &self.source
    }

    /// The readings any placeholder reads, sorted and without repeats.
    pub fn inputs(&self) -> Vec<String> {
        let mut names: Vec<String> = self
            .parts
            .iter()
            .filter_map(|p| match p {
                Part::Value { formula, .. } => Some(formula.inputs()),
                Part::Text(_) => None,
            })
            .flatten()
            .map(str::to_string)
            .collect();
        names.sort();
        names.dedup();
        names
    }

    /// The sentence with every placeholder's value printed: in its `in
    /// UNIT`, or else in the unit its kind is printed in for `system`.
    pub fn render<I: Inputs + ?Sized>(
        &self,
        inputs: &I,
        system: UnitSystem,
    ) -> Result<Outcome<String>, FormulaError> {
        let mut out = String::new();
        let mut missing = Vec::new();
        for part in &self.parts {
            match part {
                Part::Text(text) => out.push_str(text),
                Part::Value {
                    formula,
                    offset,
                    unit,
                } => match formula.evaluate(inputs).map_err(|e| e.shifted(*offset))? {
                    Outcome::Known(value) => {
                        out.push_str(&show(value, formula, unit.as_ref(), system))
                    }
                    Outcome::Missing(names) => missing.extend(names),
                },
            }
        }
        if missing.is_empty() {
            return Ok(Outcome::Known(out));
        }
        missing.sort();
        missing.dedup();
        Ok(Outcome::Missing(missing))
    }
}

fn brace_error(message: &str, at: usize) -> FormulaError {
    FormulaError::type_error(message, Span::new(at, at + 1))
}

/// Compile the placeholder `source[start..end]` (inside the braces).
fn placeholder(
    source: &str,
    start: usize,
    end: usize,
    environment: &Environment,
    functions: &FunctionTable,
) -> Result<Part, FormulaError> {
    let inner = &source[start..end];
    let lead = inner.len() - inner.trim_start().len();
    let offset = start + lead;
    let body = inner.trim();
    if body.is_empty() {
        let message = "empty placeholder: write a formula between the braces";
        return Err(FormulaError::type_error(
            message,
            Span::new(start - 1, end + 1),
        ));
    }
    let compile =
        |text: &str| Formula::compile(text, environment, functions).map_err(|e| e.shifted(offset));
    let Some(at) = body.rfind(" in ") else {
        return Ok(Part::Value {
            formula: compile(body)?,
            offset,
            unit: None,
        });
    };
    let (expression, unit_text) = (&body[..at], body[at + 4..].trim());
    let unit_offset = offset + at + 4 + (body[at + 4..].len() - body[at + 4..].trim_start().len());
    let unit = match units::parse_unit(unit_text, unit_text) {
        Ok(unit) => unit,
        // `{bore - 0.5 in * 2}`: not a unit after all, so all one formula.
        Err(unit_error) => match compile(body) {
            Ok(formula) => {
                return Ok(Part::Value {
                    formula,
                    offset,
                    unit: None,
                })
            }
            Err(_) => return Err(unit_failure(unit_error, unit_text, unit_offset)),
        },
    };
    let formula = compile(expression)?;
    if formula.value_type().dimension() != Some(unit.dimension) {
        let message = format!(
            "cannot show {} in `{unit_text}`, which is a {} unit",
            formula.value_type().describe(formula.kind()),
            unit.dimension.name()
        );
        let span = Span::new(unit_offset, unit_offset + unit_text.len());
        return Err(FormulaError::type_error(message, span));
    }
    Ok(Part::Value {
        formula,
        offset,
        unit: Some(unit),
    })
}

fn unit_failure(error: units::UnitError, unit_text: &str, at: usize) -> FormulaError {
    let span = Span::new(at, at + unit_text.len());
    let kind = match error {
        units::UnitError::UnknownUnit {
            unit, suggestion, ..
        } => FormulaErrorKind::UnknownUnit { unit, suggestion },
        other => FormulaErrorKind::InvalidLiteral {
            message: other.to_string(),
        },
    };
    FormulaError::new(kind, span)
}

/// A value as text: in `unit` if given, else in its kind's unit.
fn show(value: Value, formula: &Formula, unit: Option<&UnitExpr>, system: UnitSystem) -> String {
    let q = match value {
        Value::Bool(b) => return b.to_string(),
        Value::Quantity(q) => q,
    };
    if let Some(unit) = unit {
        return in_unit(q, unit);
    }
    let kind = formula
        .kind()
        .filter(|k| super::value_type::ValueType::of_kind(*k) == formula.value_type())
        .or_else(|| formula.value_type().default_kind());
    match kind {
        Some(kind) => units::format(q, kind, system),
        None => format!("{} {}", format_number(q.si()), q.dimension()),
    }
}

fn in_unit(q: Quantity, unit: &UnitExpr) -> String {
    if let Some(catalogued) = unit::find(&unit.text) {
        if let Some(v) = units::value_in(q, catalogued.symbol) {
            return format!("{} {}", format_number(v), catalogued.symbol);
        }
    }
    match unit.scale {
        Scale::Linear { factor, offset } => {
            format!(
                "{} {}",
                format_number((q.si() - offset) / factor),
                unit.text
            )
        }
        Scale::Saybolt => format!("{} {}", format_number(q.si()), q.dimension()),
    }
}
