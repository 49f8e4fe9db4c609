//! Property tests: the evaluator against the same arithmetic done directly
//! in `f64`, the checker against direct dimension bookkeeping, and the
//! parser and printer against arbitrary text.

use proptest::prelude::*;

use super::testing::{environment, functions};
use super::{parse, Formula, Outcome, ValueType};
use crate::units::unit::by_symbol;
use crate::units::{Dimension, Quantity};

/// An arithmetic tree over two pressures, a flow and literals.
#[derive(Clone, Debug)]
enum Tree {
    Pressure(usize),
    Flow,
    Bar(u32),
    LitresPerMinute(u32),
    Number(u32),
    Binary(char, Box<Tree>, Box<Tree>),
    Neg(Box<Tree>),
}

const PRESSURES: [&str; 2] = ["supply_pressure", "load_pressure"];

/// Literal values are quarters, so that their text is exact.
fn quarter(n: u32) -> f64 {
    f64::from(n) / 4.0
}

impl Tree {
    fn text(&self) -> String {
        match self {
            Tree::Pressure(i) => PRESSURES[*i].to_string(),
            Tree::Flow => "flow".to_string(),
            Tree::Bar(n) => format!("{} bar", quarter(*n)),
            Tree::LitresPerMinute(n) => format!("{} L/min", quarter(*n)),
            Tree::Number(n) => format!("{}", quarter(*n)),
            Tree::Binary(op, a, b) => format!("({} {op} {})", a.text(), b.text()),
            Tree::Neg(a) => format!("(-{})", a.text()),
        }
    }

    /// Mass, length and time exponents, or `None` where the checker must
    /// refuse the tree (a sum of unlike dimensions, an exponent beyond 32).
    fn dimension(&self) -> Option<[i32; 3]> {
        let within = |d: [i32; 3]| d.iter().all(|e| e.abs() <= 32).then_some(d);
        match self {
            Tree::Pressure(_) | Tree::Bar(_) => Some([1, -1, -2]),
            Tree::Flow | Tree::LitresPerMinute(_) => Some([0, 3, -1]),
            Tree::Number(_) => Some([0, 0, 0]),
            Tree::Neg(a) => a.dimension(),
            Tree::Binary(op, a, b) => {
                let (x, y) = (a.dimension()?, b.dimension()?);
                match op {
                    '+' | '-' => (x == y).then_some(x),
                    '*' => within([x[0] + y[0], x[1] + y[1], x[2] + y[2]]),
                    _ => within([x[0] - y[0], x[1] - y[1], x[2] - y[2]]),
                }
            }
        }
    }

    /// The value in SI, or `None` where evaluation must fail (division by
    /// zero, or any intermediate result that is not finite).
    fn value(&self, pressures: [f64; 2], flow: f64) -> Option<f64> {
        let v = match self {
            Tree::Pressure(i) => pressures[*i],
            Tree::Flow => flow,
            Tree::Bar(n) => by_symbol("bar").to_si(quarter(*n)),
            Tree::LitresPerMinute(n) => by_symbol("L/min").to_si(quarter(*n)),
            Tree::Number(n) => quarter(*n),
            Tree::Neg(a) => -a.value(pressures, flow)?,
            Tree::Binary(op, a, b) => {
                let (x, y) = (a.value(pressures, flow)?, b.value(pressures, flow)?);
                match op {
                    '+' => x + y,
                    '-' => x - y,
                    '*' => x * y,
                    _ if y == 0.0 => return None,
                    _ => x / y,
                }
            }
        };
        v.is_finite().then_some(v)
    }
}

fn tree() -> impl Strategy<Value = Tree> {
    let leaf = prop_oneof![
        (0..2usize).prop_map(Tree::Pressure),
        Just(Tree::Flow),
        (0..4000u32).prop_map(Tree::Bar),
        (0..400u32).prop_map(Tree::LitresPerMinute),
        (0..40u32).prop_map(Tree::Number),
    ];
    leaf.prop_recursive(5, 32, 2, |inner| {
        prop_oneof![
            (
                prop::sample::select(vec!['+', '-', '*', '/']),
                inner.clone(),
                inner.clone()
            )
                .prop_map(|(op, a, b)| Tree::Binary(op, Box::new(a), Box::new(b))),
            inner.prop_map(|a| Tree::Neg(Box::new(a))),
        ]
    })
}

/// Words and symbols that make text likely to be nearly valid formulas.
fn formula_like_text() -> impl Strategy<Value = String> {
    let pieces = vec![
        "flow",
        "flow_set",
        "supply_pressure",
        "oil_temperature",
        "@loaded",
        "@hot",
        "3",
        "0.5",
        "1e3",
        "bar",
        "L/min",
        "degC",
        "K",
        "%",
        "(",
        ")",
        "+",
        "-",
        "*",
        "/",
        "^",
        "2",
        "-1",
        "<",
        "<=",
        "==",
        "!=",
        ">",
        "and",
        "or",
        "not",
        "if",
        "then",
        "else",
        "true",
        "max(",
        "clamp(",
        "sqrt(",
        ",",
        " ",
        "@",
        ".",
        "e",
        "bra",
        "°",
        "µ",
    ];
    prop::collection::vec(prop::sample::select(pieces), 0..24).prop_map(|v| v.concat())
}

proptest! {
    #[test]
    fn evaluation_matches_direct_arithmetic(
        tree in tree(),
        p1 in -1e7f64..1e7,
        p2 in -1e7f64..1e7,
        flow in 0.0f64..1e-2,
    ) {
        let text = tree.text();
        let compiled = Formula::compile(&text, &environment(), &functions());
        let Some(dims) = tree.dimension() else {
            prop_assert!(compiled.is_err(), "{text} should not compile");
            return Ok(());
        };
        let formula = compiled.map_err(|e| TestCaseError::fail(format!("{text}: {e}")))?;
        let expected = Dimension::new(dims[0] as i8, dims[1] as i8, dims[2] as i8, 0);
        prop_assert_eq!(formula.value_type(), ValueType::quantity(expected));
        let inputs = [
            ("supply_pressure", Quantity::new(p1, Dimension::PRESSURE)),
            ("load_pressure", Quantity::new(p2, Dimension::PRESSURE)),
            ("flow", Quantity::new(flow, Dimension::FLOW)),
        ];
        let result = formula.evaluate(&inputs[..]);
        match tree.value([p1, p2], flow) {
            None => prop_assert!(result.is_err(), "{text} gave {result:?}"),
            Some(want) => {
                let got = match result {
                    Ok(Outcome::Known(v)) => v.as_quantity().map(|q| q.si()),
                    other => return Err(TestCaseError::fail(format!("{text}: {other:?}"))),
                };
                prop_assert_eq!(got, Some(want), "{}", text);
            }
        }
    }

    #[test]
    fn any_text_compiles_or_fails_cleanly(text in formula_like_text()) {
        let readings = [
            ("flow", Quantity::new(1e-3, Dimension::FLOW)),
            ("supply_pressure", Quantity::new(1e6, Dimension::PRESSURE)),
            ("oil_temperature@hot", Quantity::temperature(330.0)),
        ];
        if let Ok(formula) = Formula::compile(&text, &environment(), &functions()) {
            let _ = formula.evaluate(&readings[..]);
        }
        if let Ok(expr) = parse(&text) {
            // The canonical text parses back to the same tree.
            let canonical = expr.to_string();
            let again = parse(&canonical).map_err(|e| TestCaseError::fail(format!("{canonical}: {e}")))?;
            prop_assert_eq!(again.sexpr(), expr.sexpr(), "{} printed as {}", text, canonical);
        }
    }

    #[test]
    fn arbitrary_text_never_panics(text in "\\PC{0,80}") {
        let _ = Formula::compile(&text, &environment(), &functions());
    }
}
