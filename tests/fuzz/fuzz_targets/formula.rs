//! Rule-check formulas: any text, parsed, compiled against a small
//! vocabulary with the rule base's functions, and evaluated on a few sets of
//! readings.
//!
//! A formula either compiles or is refused with a message; a compiled one
//! prints a canonical text that compiles to itself; evaluation gives a
//! finite value, a list of missing readings or an error, never a panic.

#![no_main]

use std::collections::HashMap;
use std::sync::OnceLock;

use libfuzzer_sys::fuzz_target;
use spoolsleuth::formula::{Environment, Formula, Outcome, Value};
use spoolsleuth::units::{parse_quantity, Kind, Quantity};

fn environment() -> &'static Environment {
    static ENVIRONMENT: OnceLock<Environment> = OnceLock::new();
    ENVIRONMENT.get_or_init(|| {
        let mut env = Environment::new();
        for (name, kind) in [
            ("bore", Kind::Length),
            ("density", Kind::Density),
            ("displacement", Kind::Displacement),
            ("efficiency", Kind::Fraction),
            ("flow", Kind::Flow),
            ("load_pressure", Kind::Pressure),
            ("oil_temperature", Kind::Temperature),
            ("speed", Kind::ShaftSpeed),
            ("supply_pressure", Kind::Pressure),
            ("temperature_rise", Kind::TemperatureDifference),
        ] {
            env.declare(name, kind);
        }
        for point in ["loaded", "unloaded"] {
            env.declare_point(point);
        }
        env
    })
}

/// Ordinary readings, readings at zero, and readings at the far ends.
fn reading_sets() -> &'static [HashMap<String, Quantity>] {
    static SETS: OnceLock<Vec<HashMap<String, Quantity>>> = OnceLock::new();
    SETS.get_or_init(|| {
        let sets: [&[(&str, &str)]; 4] = [
            &[],
            &[
                ("bore", "63 mm"),
                ("density", "870 kg/m^3"),
                ("displacement", "45 cc/rev"),
                ("efficiency", "92 %"),
                ("flow", "38 L/min"),
                ("flow@loaded", "30 L/min"),
                ("flow@unloaded", "38 L/min"),
                ("load_pressure", "150 bar"),
                ("oil_temperature", "55 degC"),
                ("speed", "1500 rpm"),
                ("supply_pressure", "210 bar"),
                ("temperature_rise", "12 K"),
            ],
            &[
                ("bore", "0 mm"),
                ("density", "0"),
                ("displacement", "0 cc/rev"),
                ("efficiency", "0"),
                ("flow", "0 L/min"),
                ("load_pressure", "0 bar"),
                ("oil_temperature", "0 K"),
                ("speed", "0 rpm"),
                ("supply_pressure", "-1 bar"),
                ("temperature_rise", "0 K"),
            ],
            &[
                ("bore", "1e300 m"),
                ("flow", "1e300 L/min"),
                ("load_pressure", "1e300 bar"),
                ("speed", "1e-300 rpm"),
                ("supply_pressure", "1e300 psi"),
            ],
        ];
        sets.iter()
            .map(|pairs| {
                pairs
                    .iter()
                    .map(|(name, text)| {
                        let q =
                            parse_quantity(text).unwrap_or_else(|e| panic!("fixture {name}: {e}"));
                        ((*name).to_string(), q)
                    })
                    .collect()
            })
            .collect()
    })
}

fuzz_target!(|text: &str| {
    let functions = spoolsleuth::rules::functions();
    let formula = match Formula::compile(text, environment(), functions) {
        Ok(formula) => formula,
        Err(e) => {
            let _ = e.render(text, "fuzz.yaml", 1, 1);
            return;
        }
    };
    let canonical = formula.to_string();
    match Formula::compile(&canonical, environment(), functions) {
        Ok(again) => assert_eq!(again.to_string(), canonical, "from `{text}`"),
        Err(e) => panic!("`{text}` prints as `{canonical}`, which does not compile: {e}"),
    }
    for readings in reading_sets() {
        match formula.evaluate(readings) {
            Ok(Outcome::Known(Value::Quantity(q))) => {
                assert!(q.si().is_finite(), "`{text}` gave {q:?}");
            }
            Ok(Outcome::Known(Value::Bool(_)) | Outcome::Missing(_)) => {}
            Err(e) => {
                let _ = e.render(text, "fuzz.yaml", 1, 1);
            }
        }
    }
});
