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

#[cfg(test)]
mod tests {
    use super::*;
    use crate::formula::testing::{environment, functions, readings};
    use crate::formula::{FormulaErrorKind, Span};
    use crate::units::{unit::PSI, Dimension};

    #[track_caller]
    fn compile(src: &str) -> Formula {
        Formula::compile(src, &environment(), &functions()).unwrap_or_else(|e| panic!("{src}: {e}"))
    }

    #[track_caller]
    fn value(src: &str, pairs: &[(&str, &str)]) -> Value {
        match compile(src).evaluate(&readings(pairs)) {
            Ok(Outcome::Known(v)) => v,
            other => panic!("{src}: {other:?}"),
        }
    }

    #[track_caller]
    fn si(src: &str, pairs: &[(&str, &str)]) -> f64 {
        value(src, pairs)
            .as_quantity()
            .map(|q| q.si())
            .unwrap_or(f64::NAN)
    }

    #[track_caller]
    fn holds(src: &str, pairs: &[(&str, &str)]) -> bool {
        value(src, pairs)
            .as_bool()
            .unwrap_or_else(|| panic!("{src} is not a condition"))
    }

    #[track_caller]
    fn error(src: &str) -> FormulaError {
        match Formula::compile(src, &environment(), &functions()) {
            Ok(f) => panic!("{src} compiled to {f}"),
            Err(e) => e,
        }
    }

    /// A compile error with its message and span.
    #[track_caller]
    fn case(src: &str, message: &str, span: (usize, usize)) {
        let e = error(src);
        assert_eq!(e.to_string(), message, "{src}");
        assert_eq!(
            e.span,
            Span::new(span.0, span.1),
            "span of {src}: {message}"
        );
    }

    fn close(a: f64, b: f64) -> bool {
        (a - b).abs() <= 1e-12 * a.abs().max(b.abs())
    }

    #[test]
    fn units_in_literals() {
        // NIST SP 811 B.8: 1 psi = 6.894 757 E+03 Pa, so 3 bar + 100 psi = 9.895e5 Pa.
        let v = si("3 bar + 100 psi", &[]);
        assert!((v - 9.895e5).abs() < 50.0, "{v}");
        assert!(
            (v - (3e5 + 100.0 * 6_894.757_293_168_361)).abs() < 1e-6,
            "{v}"
        );
        assert!(close(v, 3e5 + 100.0 * PSI));
        assert!(close(si("38 L/min", &[]), 38e-3 / 60.0));
        assert!(close(si("3 %", &[]), 0.03));
        assert!(close(
            si("2.8 in^3/rev * 1200 rpm", &[]),
            2.8 * 0.0254f64.powi(3) * 20.0
        ));
        assert!(close(si("1e-3 * 5 K", &[]), 5e-3));
        assert!(close(si("210bar / 2", &[]), 105e5));
        // Displacement × shaft speed is a flow with no factor of 2π.
        let f = compile("displacement * speed");
        assert_eq!(f.value_type(), ValueType::quantity(Dimension::FLOW));
        let q = si(
            "displacement * speed",
            &[("displacement", "45 cc/rev"), ("speed", "1200 rpm")],
        );
        assert!(close(q, 54e-3 / 60.0), "{q}");
    }

    #[test]
    fn comparisons_and_logic() {
        let p = [("supply_pressure", "150 bar"), ("load_pressure", "140 bar")];
        assert!(holds("supply_pressure - load_pressure < 12 bar", &p));
        assert!(!holds("supply_pressure - load_pressure >= 12 bar", &p));
        assert!(holds(
            "supply_pressure > load_pressure and not supply_pressure < 1 bar",
            &p
        ));
        assert!(holds("supply_pressure < 1 bar or true", &p));
        // `==` has a relative tolerance: 0.1 + 0.2 == 0.3 in any unit.
        assert!(holds("0.1 bar + 0.2 bar == 0.3 bar", &[]));
        assert!(holds("1 bar != 1.00001 bar", &[]));
        assert!(holds("1 bar == 100 kPa", &[]));
        assert!(holds("(1 bar < 2 bar) == true", &[]));
        assert!(close(
            si("if supply_pressure > 100 bar then 1 bar else 2 bar", &p),
            1e5
        ));
        assert!(close(
            si("max(supply_pressure, load_pressure, 3 bar)", &p),
            150e5
        ));
        assert!(close(si("min(supply_pressure, load_pressure)", &p), 140e5));
        assert!(close(si("abs(load_pressure - supply_pressure)", &p), 10e5));
        assert!(close(
            si("clamp(supply_pressure, 1 bar, 100 bar)", &p),
            100e5
        ));
        assert!(close(
            si(
                "sqrt(2 * (supply_pressure - load_pressure) / 870 kg/m^3)",
                &p
            ),
            (2e6 / 870.0f64).sqrt()
        ));
        assert!(close(si("bore^2 * 2", &[("bore", "10 mm")]), 2e-4));
        assert!(close(si("-bore^2", &[("bore", "10 mm")]), -1e-4));
        assert!(close(si("(-bore)^-2", &[("bore", "10 mm")]), 1e4));
    }

    #[test]
    fn operating_points() {
        let f = compile("flow@loaded < 0.95 * flow@unloaded");
        assert_eq!(
            f.inputs().collect::<Vec<_>>(),
            ["flow@loaded", "flow@unloaded"]
        );
        let r = [("flow@loaded", "30 L/min"), ("flow@unloaded", "38 L/min")];
        assert!(holds("flow@loaded < 0.95 * flow@unloaded", &r));
        assert!(holds("flow@unloaded - flow@loaded > 5 L/min", &r));
        // A point-tagged reading is not the untagged one.
        assert_eq!(
            compile("flow@loaded > flow").evaluate(&readings(&r)),
            Ok(Outcome::Missing(vec!["flow".to_string()]))
        );
        assert!(holds(
            "oil_temperature@hot - oil_temperature@cold > 5 K",
            &[
                ("oil_temperature@hot", "70 degC"),
                ("oil_temperature@cold", "60 degC")
            ]
        ));
        case(
            "supply_pressure@high > 3 bar",
            "unknown operating point `high`",
            (16, 20),
        );
    }

    #[test]
    fn missing_readings_are_an_outcome() {
        let f = compile("flow@loaded < 0.95 * flow@unloaded and supply_pressure > 3 bar");
        let missing = |pairs: &[(&str, &str)]| f.evaluate(&readings(pairs));
        assert_eq!(
            missing(&[]),
            Ok(Outcome::Missing(vec![
                "flow@loaded".to_string(),
                "flow@unloaded".to_string(),
                "supply_pressure".to_string()
            ]))
        );
        assert_eq!(
            missing(&[("flow@loaded", "30 L/min")]),
            Ok(Outcome::Missing(vec![
                "flow@unloaded".to_string(),
                "supply_pressure".to_string()
            ]))
        );
        // A known false side settles `and` whatever the other side reads.
        assert_eq!(
            missing(&[("supply_pressure", "1 bar")]),
            Ok(Outcome::Known(Value::Bool(false)))
        );
        let g = compile("supply_pressure > 100 bar or flow < flow_set");
        assert_eq!(
            g.evaluate(&readings(&[("supply_pressure", "150 bar")])),
            Ok(Outcome::Known(Value::Bool(true)))
        );
        assert_eq!(
            g.evaluate(&readings(&[
                ("supply_pressure", "50 bar"),
                ("flow", "3 L/min")
            ])),
            Ok(Outcome::Missing(vec!["flow_set".to_string()]))
        );
        // An open condition needs its own readings and those of both branches.
        let h =
            compile("if oil_temperature > 60 degC then flow < flow_set else flow@cold < flow_set");
        assert_eq!(
            h.evaluate(&readings(&[("flow", "3 L/min")])),
            Ok(Outcome::Missing(vec![
                "flow@cold".to_string(),
                "flow_set".to_string(),
                "oil_temperature".to_string()
            ]))
        );
        assert_eq!(
            h.inputs().collect::<Vec<_>>(),
            ["flow", "flow@cold", "flow_set", "oil_temperature"]
        );
    }

    #[test]
    fn affine_temperatures() {
        let hot = [
            ("oil_temperature@hot", "70 degC"),
            ("oil_temperature@cold", "60 degC"),
        ];
        let rise = compile("oil_temperature@hot - oil_temperature@cold");
        assert_eq!(
            rise.value_type(),
            ValueType::quantity(Dimension::TEMPERATURE)
        );
        assert!(close(
            si("oil_temperature@hot - oil_temperature@cold", &hot),
            10.0
        ));
        let warmer = value("oil_temperature@hot - 9 dF", &hot)
            .as_quantity()
            .unwrap();
        assert!(warmer.is_temperature_point());
        assert!(close(warmer.si(), 343.15 - 5.0));
        assert!(holds("5 K + oil_temperature@cold < 70 degC", &hot));
        assert!(holds(
            "max(oil_temperature@hot, oil_temperature@cold) == 70 degC",
            &hot
        ));
        assert!(holds("-40 degC == -40 degF", &[]));
        assert!(si("55 degC - 131 degF", &[]).abs() < 1e-9);
        compile("oil_temperature - ambient_temperature < temperature_rise");
        compile("(oil_temperature@hot - oil_temperature@cold) * 2 > 5 dC");
        let hint =
            "subtract two temperatures to get a difference, or write differences in K, dC or dF";
        let cases: &[(&str, String)] = &[
            (
                "oil_temperature@hot + oil_temperature@cold",
                "cannot add two temperatures: write a temperature difference in K, dC or dF".into(),
            ),
            ("oil_temperature * 2", format!("cannot multiply a temperature: {hint}")),
            ("oil_temperature / 2", format!("cannot divide a temperature: {hint}")),
            ("-oil_temperature", format!("cannot negate a temperature: {hint}")),
            ("oil_temperature^2", format!("cannot raise to a power a temperature: {hint}")),
            ("sqrt(oil_temperature)", format!("cannot take `sqrt` of a temperature: {hint}")),
            (
                "oil_temperature@hot > 5 K",
                "cannot compare a temperature with a temperature difference: write differences in K, dC or dF".into(),
            ),
            (
                "oil_temperature@hot - oil_temperature@cold > 5 degC",
                "cannot compare a temperature difference with a temperature: write differences in K, dC or dF".into(),
            ),
            (
                "temperature_rise - oil_temperature",
                "cannot subtract a temperature from a temperature difference".into(),
            ),
            (
                "oil_temperature > 60",
                "cannot compare a temperature with a plain number (write the number with a unit, e.g. `60 °C`)".into(),
            ),
            ("oil_temperature + supply_pressure", "cannot add a pressure to a temperature".into()),
        ];
        for (src, message) in cases {
            assert_eq!(&error(src).to_string(), message, "{src}");
        }
    }

    #[test]
    fn type_errors_with_spans() {
        case(
            "supply_pressure < flow",
            "cannot compare a pressure with a flow",
            (0, 22),
        );
        case(
            "supply_pressure + speed",
            "cannot add a shaft speed to a pressure",
            (0, 23),
        );
        case(
            "supply_pressure - flow",
            "cannot subtract a flow from a pressure",
            (0, 22),
        );
        case(
            "displacement * speed > supply_pressure",
            "cannot compare a flow with a pressure",
            (0, 38),
        );
        case(
            "1 + sqrt(bore)",
            "cannot take the square root of a length",
            (9, 13),
        );
        case(
            "supply_pressure > 3",
            "cannot compare a pressure with a plain number (write the number with a unit, e.g. `3 bar`)",
            (0, 19),
        );
        case(
            "supply_pressure and flow > flow_set",
            "`and` needs true/false values, found a pressure",
            (0, 15),
        );
        case(
            "not flow",
            "`not` needs true/false values, found a flow",
            (4, 8),
        );
        case(
            "if flow > flow_set then supply_pressure else flow",
            "the branches of `if` differ: a pressure and a flow",
            (0, 49),
        );
        case(
            "if flow then 1 else 2",
            "the condition of `if` must be true or false, found a flow",
            (3, 7),
        );
        case(
            "suply_pressure > 3 bar",
            "unknown quantity `suply_pressure` (did you mean `supply_pressure`?)",
            (0, 14),
        );
        case(
            "flow@laoded < flow_set",
            "unknown operating point `laoded` (did you mean `loaded`?)",
            (5, 11),
        );
        case(
            "orifice_flw(cd, orifice_area, supply_pressure, density) > flow",
            "unknown function `orifice_flw` (did you mean `orifice_flow`?)",
            (0, 11),
        );
        case(
            "orifice_flow(cd, bore, supply_pressure, density) > flow",
            "argument `area` of `orifice_flow` must be an area, found a length",
            (17, 21),
        );
        case(
            "clamp(flow, flow_set)",
            "`clamp` takes 3 arguments (x, lo, hi), found 2",
            (0, 21),
        );
        case(
            "max(flow)",
            "`max` takes two or more arguments, found 1",
            (0, 9),
        );
        case(
            "pump_flow(displacement, speed)",
            "`pump_flow` takes 3 arguments (displacement, speed, efficiency), found 2",
            (0, 30),
        );
        case(
            "max(flow, supply_pressure)",
            "the arguments of `max` differ: a flow and a pressure",
            (10, 25),
        );
        case(
            "(flow < flow_set) < true",
            "cannot order true/false values with `<` (use `==` or `!=`)",
            (0, 24),
        );
        case(
            "-(flow > flow_set)",
            "cannot negate a true/false value",
            (0, 18),
        );
        case("flow + true", "cannot add a true/false value", (0, 11));
        case(
            "(bore^9)^9",
            "the units of this expression are too complex (a power of a base unit exceeds 32)",
            (0, 10),
        );
    }

    #[test]
    fn malformed_formulas() {
        let too_long = "x".repeat(5000);
        let too_deep = format!("{}flow{}", "(".repeat(50), ")".repeat(50));
        let cases: &[(&str, &str)] = &[
            ("", "empty formula"),
            ("flow <", "expected a value, found the end of the formula"),
            ("flow < < flow_set", "expected a value, found `<`"),
            ("flow = flow_set", "`=` is not an operator here: use `==`"),
            ("flow > flow_set && speed > 1 rpm", "`&&` is not an operator here: use `and`"),
            ("flow > flow_set || true", "`||` is not an operator here: use `or`"),
            ("!(flow > flow_set)", "`!` is not an operator here: use `not`"),
            ("flow ≤ flow_set", "`≤` is not an operator here: use `<=`"),
            ("flow <> flow_set", "`<>` is not an operator here: use `!=`"),
            ("bore ** 2", "`**` is not an operator here: use `^`"),
            ("supply_pressure > 3 bra", "unknown unit `bra` (did you mean `bar`?)"),
            ("supply_pressure > 3 kPA", "unknown unit `kPA` (did you mean `kPa`?)"),
            ("speed > 1000 rpms", "unknown unit `rpms` (did you mean `rpm`?)"),
            ("flow > 1.2.3 L/min", "malformed number `1.2.3`"),
            ("flow > 1e999 L/min", "malformed number `1e999`"),
            ("flow@ > 3 L/min", "expected an operating point name after `@`, found ` `"),
            (
                "flow < flow_set < 3 L/min",
                "comparisons cannot be chained: use `and`, as in `a < b and b < c`",
            ),
            ("bore^2^2", "a power of a power is ambiguous: add brackets, as in `(a^2)^3`"),
            ("bore^x", "expected a whole number from -9 to 9 after `^`, found `x`"),
            ("bore^0.5", "expected a whole number from -9 to 9 after `^`, found `0.5`"),
            ("(flow < flow_set", "expected `)`, found the end of the formula"),
            ("max(flow flow_set)", "expected `,` or `)`, found `flow_set`"),
            (
                "if flow > flow_set then true",
                "expected `else` (an `if` needs both branches), found the end of the formula",
            ),
            ("flow flow_set", "expected an operator or the end of the formula, found `flow_set`"),
            (
                "flow > 3  L/min",
                "expected an operator (a unit goes right after its number, with at most one space), found `L`",
            ),
            ("flow > 3 L/min,", "expected an operator or the end of the formula, found `,`"),
            ("flow # 2", "unexpected character `#`"),
            ("-500 degC < oil_temperature", "`-500 degC` is below absolute zero"),
            ("foo(flow)", "unknown function `foo`"),
            ("flow@hot(3)", "a function cannot have an operating point"),
            ("suply_pressure > 3 bar", "unknown quantity `suply_pressure` (did you mean `supply_pressure`?)"),
            ("supply_pressure < flow", "cannot compare a pressure with a flow"),
            ("supply_pressure + speed", "cannot add a shaft speed to a pressure"),
            ("sqrt(bore)", "cannot take the square root of a length"),
            (&too_long, "formula is 5000 bytes long; the limit is 4096"),
            (&too_deep, "formula is nested too deeply (more than 40 levels of brackets, operators or calls)"),
        ];
        assert!(cases.len() >= 30);
        for (src, message) in cases {
            assert_eq!(&error(src).to_string(), message, "{src}");
        }
    }

    #[test]
    fn registered_functions() {
        let r = [
            ("cd", "0.62"),
            ("orifice_area", "20 mm^2"),
            ("supply_pressure", "150 bar"),
            ("load_pressure", "140 bar"),
            ("density", "870 kg/m^3"),
            ("flow_set", "30 L/min"),
        ];
        let src = "orifice_flow(cd, orifice_area, supply_pressure - load_pressure, density)";
        let f = compile(src);
        assert_eq!(f.value_type(), ValueType::quantity(Dimension::FLOW));
        let direct = 0.62 * 20e-6 * (2.0 * 10e5 / 870.0f64).sqrt();
        assert!(close(si(src, &r), direct));
        // 35.7 L/min through the orifice: above a 30 L/min setting.
        assert!(holds(&format!("{src} > flow_set"), &r));
        let pump = si(
            "pump_flow(displacement, speed, efficiency)",
            &[
                ("displacement", "45 cc/rev"),
                ("speed", "1200 rpm"),
                ("efficiency", "92 %"),
            ],
        );
        assert!(close(pump, 45e-6 * 20.0 * 0.92));
        let v = si("cylinder_speed(30 L/min, 50 mm)", &[]);
        assert!(close(
            v,
            0.5e-3 / (std::f64::consts::PI / 4.0 * 0.05 * 0.05)
        ));
        // A function's own error names the function.
        let reversed =
            compile("orifice_flow(cd, orifice_area, load_pressure - supply_pressure, density)");
        let e = reversed.evaluate(&readings(&r)).unwrap_err();
        assert_eq!(
            e.to_string(),
            "`orifice_flow` failed: the pressure drop is negative"
        );
        assert_eq!(e.span, Span::new(0, 72));
    }

    #[test]
    fn arithmetic_that_is_not_finite_is_an_error() {
        let r = [
            ("supply_pressure", "150 bar"),
            ("load_pressure", "150 bar"),
            ("flow", "3 L/min"),
        ];
        let cases = [
            (
                "flow / (supply_pressure - load_pressure) > 1 L/min / 1 bar",
                "division by zero in `flow / (supply_pressure - load_pressure)`",
            ),
            (
                "sqrt((load_pressure - supply_pressure - 1 bar) / 870 kg/m^3)",
                "square root of a negative number in `sqrt((load_pressure - supply_pressure - 1 bar) / 870 kg/m^3)`",
            ),
            ("(supply_pressure - load_pressure)^-1", "division by zero in `(supply_pressure - load_pressure)^-1`"),
            ("clamp(flow, 2 L/min, 1 L/min)", "a lower bound above the upper bound in `clamp(flow, 2 L/min, 1 L/min)`"),
            (
                "1e300 * 1e300 * supply_pressure",
                "a result too large to represent in `1e300 * 1e300`",
            ),
        ];
        for (src, message) in cases {
            let e = compile(src).evaluate(&readings(&r)).expect_err(src);
            assert!(
                matches!(e.kind, FormulaErrorKind::NotFinite { .. }),
                "{src}"
            );
            assert_eq!(e.to_string(), message, "{src}");
        }
    }

    #[test]
    fn readings_must_have_their_declared_dimension() {
        let e = compile("flow > 3 L/min")
            .evaluate(&readings(&[("flow", "3 bar")]))
            .unwrap_err();
        assert_eq!(
            e.to_string(),
            "the reading `flow` is a pressure, but it was declared as a flow"
        );
        assert_eq!(e.span, Span::new(0, 4));
        let e = compile("oil_temperature > 3 degC")
            .evaluate(&readings(&[("oil_temperature", "5 K")]))
            .unwrap_err();
        assert_eq!(
            e.to_string(),
            "the reading `oil_temperature` is a temperature difference, but it was declared as a temperature"
        );
    }

    #[test]
    fn conditions_and_locations() {
        let env = environment();
        let e = Formula::compile_condition("supply_pressure - load_pressure", &env, &functions())
            .unwrap_err();
        assert_eq!(
            e.to_string(),
            "a check must be true or false, found a pressure (compare it with something)"
        );
        assert!(Formula::compile_condition("flow < flow_set", &env, &functions()).is_ok());
        // The rules loader supplies where the formula starts in its file.
        let src = "supply_pressure > 3 bra";
        assert_eq!(
            error(src).render(src, "rules/compensator.yaml", 12, 12),
            "rules/compensator.yaml:12:32: unknown unit `bra` (did you mean `bar`?)"
        );
        assert_eq!(compile("flow  >3 L/min").to_string(), "flow > 3 L/min");
        assert_eq!(compile("flow<flow_set").source(), "flow<flow_set");
    }
}
