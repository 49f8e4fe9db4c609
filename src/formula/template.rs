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

#[cfg(test)]
mod tests {
    use super::*;
    use crate::formula::testing::{environment, functions, readings};

    #[track_caller]
    fn compile(src: &str) -> Template {
        Template::compile(src, &environment(), &functions())
            .unwrap_or_else(|e| panic!("{src}: {e}"))
    }

    #[track_caller]
    fn render(src: &str, pairs: &[(&str, &str)], system: UnitSystem) -> String {
        match compile(src).render(&readings(pairs), system) {
            Ok(Outcome::Known(text)) => text,
            other => panic!("{src}: {other:?}"),
        }
    }

    const READINGS: &[(&str, &str)] = &[
        ("supply_pressure", "150 bar"),
        ("load_pressure", "140 bar"),
        ("spring_setting", "12 bar"),
        ("flow@loaded", "30 L/min"),
        ("efficiency", "0.92"),
        ("cd", "0.62"),
        ("oil_temperature@hot", "70 degC"),
        ("oil_temperature@cold", "60 degC"),
    ];

    #[test]
    fn placeholders_are_printed_in_units() {
        let sentence = "the drop across the orifice is {supply_pressure - load_pressure in bar}, below the {spring_setting}";
        assert_eq!(
            render(sentence, READINGS, UnitSystem::Metric),
            "the drop across the orifice is 10 bar, below the 12 bar"
        );
        // 12 bar = 174.05 psi (NIST SP 811 psi factor); `in bar` stays in bar.
        assert_eq!(
            render(sentence, READINGS, UnitSystem::Us),
            "the drop across the orifice is 10 bar, below the 174 psi"
        );
        let cases = [
            ("{flow@loaded in gpm}", "7.925 gpm"),
            ("{flow@loaded in m^3/s}", "0.0005 m^3/s"),
            ("{flow@loaded}", "30 L/min"),
            // A fraction prints in percent, a plain ratio as a number.
            ("{efficiency}", "92 %"),
            ("{efficiency in %}", "92 %"),
            ("{cd}", "0.62"),
            ("{oil_temperature@hot}", "70 °C"),
            ("{oil_temperature@hot in degF}", "158 °F"),
            ("{oil_temperature@hot - oil_temperature@cold}", "10 K"),
            (
                "{oil_temperature@hot - oil_temperature@cold in dF}",
                "18 Δ°F",
            ),
            ("{supply_pressure > load_pressure}", "true"),
            ("{2 * flow@loaded}", "60 L/min"),
            (
                "{{braces}} stay: {spring_setting in psi}",
                "{braces} stay: 174 psi",
            ),
        ];
        for (src, text) in cases {
            assert_eq!(render(src, READINGS, UnitSystem::Metric), text, "{src}");
        }
        assert_eq!(
            render(
                "{oil_temperature@hot - oil_temperature@cold}",
                READINGS,
                UnitSystem::Us
            ),
            "18 Δ°F"
        );
    }

    #[test]
    fn missing_readings_and_inputs() {
        let t = compile("{flow@loaded} of {flow_set}, at {supply_pressure in psi}");
        assert_eq!(t.inputs(), ["flow@loaded", "flow_set", "supply_pressure"]);
        assert_eq!(
            t.render(&readings(READINGS), UnitSystem::Metric),
            Ok(Outcome::Missing(vec!["flow_set".to_string()]))
        );
        assert_eq!(
            t.source(),
            "{flow@loaded} of {flow_set}, at {supply_pressure in psi}"
        );
    }

    #[track_caller]
    fn error(src: &str, message: &str, span: (usize, usize)) {
        let e = Template::compile(src, &environment(), &functions()).expect_err(src);
        assert_eq!(e.to_string(), message, "{src}");
        assert_eq!(e.span, Span::new(span.0, span.1), "span in {src}");
    }

    #[test]
    fn errors_point_into_the_template() {
        error(
            "at { suply_pressure }",
            "unknown quantity `suply_pressure` (did you mean `supply_pressure`?)",
            (5, 19),
        );
        error(
            "at {flow in L/mn}",
            "unknown unit `L/mn` (did you mean `L/min`?)",
            (12, 16),
        );
        error(
            "at {flow in bar}",
            "cannot show a flow in `bar`, which is a pressure unit",
            (12, 15),
        );
        error("at {flow", "unclosed `{` in the template", (3, 4));
        error(
            "at } here",
            "unmatched `}` (write `}}` for a brace)",
            (3, 4),
        );
        error(
            "at {  } here",
            "empty placeholder: write a formula between the braces",
            (3, 7),
        );
        error(
            "{flow + 3 bar in bar}",
            "cannot add a pressure to a flow",
            (1, 13),
        );
        let e = compile("{supply_pressure / (load_pressure - spring_setting)}")
            .render(
                &readings(&[
                    ("supply_pressure", "1 bar"),
                    ("load_pressure", "1 bar"),
                    ("spring_setting", "1 bar"),
                ]),
                UnitSystem::Metric,
            )
            .unwrap_err();
        assert_eq!(e.span, Span::new(1, 51));
        // A formula that merely contains `in` as a length unit still compiles.
        assert_eq!(
            render("{bore - 0.5 in * 2}", &[("bore", "2 in")], UnitSystem::Us),
            "1 in"
        );
    }
}
