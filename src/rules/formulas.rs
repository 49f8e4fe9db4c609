//! The rule base's use of the formula language: the compile-time
//! environment, compiled checks and evidence sentences, and the physics
//! functions rule authors may call.

use std::collections::BTreeMap;
use std::sync::OnceLock;

use regex::Regex;

use crate::formula::{Environment, Formula, Function, FunctionTable, Outcome, Template, Value};
use crate::physics::{self, BulkModulusInputs, GasProcess, WaltherLine};
use crate::units::unit::{STANDARD_ATMOSPHERE, ZERO_CELSIUS};
use crate::units::{Dimension as D, Kind, Quantity, UnitSystem};

/// Every value a formula can look up, keyed `name` or `name@point`.
pub type Values = BTreeMap<String, Quantity>;

/// The names a formula may use, with their kinds, and the operating points.
#[derive(Clone, Debug, Default)]
pub struct TypeEnv {
    /// Quantity, setting and derived ids with their kinds.
    pub names: BTreeMap<String, Kind>,
    /// Operating point ids.
    pub points: Vec<String>,
}

impl TypeEnv {
    fn environment(&self) -> Environment {
        let mut env = Environment::new();
        for (name, kind) in &self.names {
            env.declare(name, *kind);
        }
        for p in &self.points {
            env.declare_point(p);
        }
        env
    }
}

/// What evaluating a check or derived formula gave.
#[derive(Clone, Debug, PartialEq)]
pub enum Evaluated {
    /// A condition's answer.
    Condition(bool),
    /// A quantity.
    Quantity(Quantity),
    /// The readings still needed.
    Missing(Vec<String>),
    /// Arithmetic that cannot be done on these readings (division by zero,
    /// a physics function outside its domain), with the reason.
    Failed(String),
}

/// A compiled formula (a rule's check or a derived quantity).
#[derive(Clone, Debug)]
pub struct Check {
    formula: Formula,
}

impl Check {
    /// Compile `text`; an error is the byte offset into `text` and a message.
    pub fn compile(text: &str, env: &TypeEnv) -> Result<Check, (usize, String)> {
        Formula::compile(text, &env.environment(), functions())
            .map(|formula| Check { formula })
            .map_err(|e| (e.span.start, e.kind.to_string()))
    }

    /// True when the formula is a condition (true or false).
    pub fn is_condition(&self) -> bool {
        self.formula.value_type() == crate::formula::ValueType::Bool
    }

    /// What the formula computes, with an article: "a pressure", "true or false".
    pub fn describe(&self) -> String {
        self.formula.value_type().describe(self.formula.kind())
    }

    /// Check that the formula computes a value that fits `kind`.
    pub fn expect_kind(&self, kind: Kind) -> Result<(), String> {
        let t = self.formula.value_type();
        let expected = crate::formula::ValueType::of_kind(kind);
        if t == expected {
            Ok(())
        } else {
            Err(format!(
                "the formula gives {}, but the quantity is declared as {}",
                t.describe(self.formula.kind()),
                expected.describe(Some(kind))
            ))
        }
    }

    /// The readings it reads (`name` or `name@point`), sorted.
    pub fn inputs(&self) -> Vec<String> {
        self.formula.inputs().map(str::to_string).collect()
    }

    /// The text it was compiled from.
    pub fn source(&self) -> &str {
        self.formula.source()
    }

    /// Evaluate on `values`.
    pub fn evaluate(&self, values: &Values) -> Evaluated {
        match self.formula.evaluate(values) {
            Ok(Outcome::Known(Value::Bool(b))) => Evaluated::Condition(b),
            Ok(Outcome::Known(Value::Quantity(q))) => Evaluated::Quantity(q),
            Ok(Outcome::Missing(names)) => Evaluated::Missing(names),
            Err(e) => Evaluated::Failed(e.kind.to_string()),
        }
    }

    /// Evaluate to a quantity, if the readings allow.
    pub fn evaluate_quantity(&self, values: &Values) -> Option<Quantity> {
        match self.evaluate(values) {
            Evaluated::Quantity(q) => Some(q),
            _ => None,
        }
    }
}

/// A compiled evidence sentence.
#[derive(Clone, Debug)]
pub struct Evidence {
    template: Template,
}

impl Evidence {
    /// Compile `text`; an error is the byte offset into `text` and a message.
    pub fn compile(text: &str, env: &TypeEnv) -> Result<Evidence, (usize, String)> {
        Template::compile(text, &env.environment(), functions())
            .map(|template| Evidence { template })
            .map_err(|e| (e.span.start, e.kind.to_string()))
    }

    /// The sentence with the computed numbers, or a note of what is missing.
    pub fn render(&self, values: &Values, system: UnitSystem) -> String {
        match self.template.render(values, system) {
            Ok(Outcome::Known(text)) => text,
            Ok(Outcome::Missing(names)) => format!("(needs {})", names.join(", ")),
            Err(e) => format!("(cannot compute: {})", e.kind),
        }
    }

    /// The sentence, or `None` when some of its numbers cannot be computed
    /// on these readings (a check can be settled by one half of an `and`
    /// while the sentence quotes both).
    pub fn try_render(&self, values: &Values, system: UnitSystem) -> Option<String> {
        match self.template.render(values, system) {
            Ok(Outcome::Known(text)) => Some(text),
            _ => None,
        }
    }

    /// The readings it reads.
    pub fn inputs(&self) -> Vec<String> {
        self.template.inputs()
    }
}

/// Identifiers a formula text mentions (for ordering derived quantities
/// before they are compiled).
pub fn referenced_names(text: &str) -> Vec<String> {
    identifiers(text).map(|m| m.as_str().to_string()).collect()
}

/// The byte offset of the first mention of `name` as a whole identifier.
pub fn name_offset(text: &str, name: &str) -> Option<usize> {
    identifiers(text)
        .find(|m| m.as_str() == name)
        .map(|m| m.start())
}

fn identifiers(text: &str) -> regex::Matches<'static, '_> {
    static IDENT: OnceLock<Regex> = OnceLock::new();
    IDENT
        .get_or_init(|| Regex::new(r"[A-Za-z_][A-Za-z0-9_]*").expect("valid regex"))
        .find_iter(text)
}

/// Every function rule authors can call: name, signature, what it computes.
pub fn function_list() -> Vec<(String, String, String)> {
    let builtins = [
        ("abs", "abs(x) -> same as x"),
        ("min", "min(a, b, …) -> same as a"),
        ("max", "max(a, b, …) -> same as a"),
        ("sqrt", "sqrt(x) -> square root of x's dimension"),
        ("clamp", "clamp(x, low, high) -> same as x"),
    ];
    let mut list: Vec<(String, String, String)> = builtins
        .iter()
        .map(|(n, s)| {
            let doc = crate::formula::Builtin::from_name(n).map_or("", |b| b.doc());
            ((*n).to_string(), (*s).to_string(), doc.to_string())
        })
        .collect();
    list.extend(
        functions()
            .iter()
            .map(|f| (f.name.clone(), f.signature(), f.doc.clone())),
    );
    list
}

fn err(e: physics::PhysicsError) -> String {
    e.to_string()
}

/// The physics functions bound into the formula language.
pub fn functions() -> &'static FunctionTable {
    static TABLE: OnceLock<FunctionTable> = OnceLock::new();
    TABLE.get_or_init(|| {
        let mut table = FunctionTable::new();
        for f in bindings() {
            table
                .register(f)
                .expect("physics function names are unique");
        }
        table
    })
}

fn bindings() -> Vec<Function> {
    vec![
        Function::new(
            "circle_area",
            "area of a circle of this diameter (Rabie 2009, Example 2.1)",
            &[("d", D::LENGTH)],
            D::AREA,
            |a| physics::circle_area(a[0]).map_err(err),
        ),
        Function::new(
            "annulus_area",
            "annulus (rod-side) area of a cylinder (Rabie 2009, Example 2.1)",
            &[("bore", D::LENGTH), ("rod", D::LENGTH)],
            D::AREA,
            |a| physics::annulus_area(a[0], a[1]).map_err(err),
        ),
        Function::new(
            "orifice_flow",
            "flow through a sharp-edged orifice, Q = Cd·A·√(2Δp/ρ) (Rabie 2009, eq. 2.34–2.37)",
            &[("cd", D::NONE), ("area", D::AREA), ("dp", D::PRESSURE), ("density", D::DENSITY)],
            D::FLOW,
            |a| physics::orifice_flow(a[0], a[1], a[2], a[3]).map_err(err),
        ),
        Function::new(
            "orifice_area",
            "effective orifice area for a flow and drop (Rabie 2009, eq. 2.34–2.37)",
            &[("flow", D::FLOW), ("cd", D::NONE), ("dp", D::PRESSURE), ("density", D::DENSITY)],
            D::AREA,
            |a| physics::orifice_area_for_flow(a[1], a[0], a[2], a[3]).map_err(err),
        ),
        Function::new(
            "motor_flow",
            "theoretical flow a motor of this displacement takes at this speed (derived)",
            &[("displacement", D::VOLUME), ("speed", D::FREQUENCY)],
            D::FLOW,
            |a| physics::motor_flow(a[1], a[0], 1.0).map_err(err),
        ),
        Function::new(
            "motor_speed",
            "motor shaft speed from flow, displacement and volumetric efficiency (derived)",
            &[("flow", D::FLOW), ("displacement", D::VOLUME), ("eta_v", D::NONE)],
            D::FREQUENCY,
            |a| physics::motor_speed(a[0], a[1], a[2]).map_err(err),
        ),
        Function::new(
            "hydraulic_power",
            "hydraulic power (and throttling heat), P = Δp·Q (derived)",
            &[("dp", D::PRESSURE), ("flow", D::FLOW)],
            D::POWER,
            |a| physics::hydraulic_power(a[0], a[1]).map_err(err),
        ),
        Function::new(
            "oil_temp_rise",
            "oil temperature rise across a restriction, ΔT = Δp/(ρ·c_p) (energy balance)",
            &[("dp", D::PRESSURE), ("density", D::DENSITY), ("cp", D::SPECIFIC_HEAT)],
            D::TEMPERATURE,
            |a| physics::throttling_temperature_rise(a[0], a[1], a[2]).map_err(err),
        ),
        Function::new(
            "intensified_pressure",
            "meter-out rod-side pressure, (p_cap·A_cap − F)/A_ann (Esposito Ex. 8-6)",
            &[
                ("p_cap", D::PRESSURE),
                ("area_cap", D::AREA),
                ("area_ann", D::AREA),
                ("force", D::FORCE),
            ],
            D::PRESSURE,
            |a| physics::meter_out_back_pressure(a[0], a[1], a[2], a[3]).map_err(err),
        ),
        Function::new(
            "compression_volume",
            "oil volume taken up by compression, ΔV = V·Δp/β (derived)",
            &[("volume", D::VOLUME), ("dp", D::PRESSURE), ("bulk_modulus", D::PRESSURE)],
            D::VOLUME,
            |a| physics::compressed_volume(a[0], a[1], a[2]).map_err(err),
        ),
        Function::new(
            "effective_bulk_modulus",
            "bulk modulus of oil with free air compressed to this gauge pressure, isothermal (Rabie 2009, eq. 2.57, series form)",
            &[("bulk_oil", D::PRESSURE), ("air_fraction", D::NONE), ("pressure", D::PRESSURE)],
            D::PRESSURE,
            |a| {
                physics::effective_bulk_modulus(&BulkModulusInputs {
                    air_fraction_at_atmosphere: a[1],
                    atmospheric_pressure_pa: STANDARD_ATMOSPHERE,
                    container_pa: None,
                    gauge_pressure_pa: a[2],
                    liquid_pa: a[0],
                    process: GasProcess::Isothermal,
                })
                .map_err(err)
            },
        ),
        Function::new(
            "cylinder_natural_frequency",
            "hydraulic natural frequency of a cylinder and mass, √(β(A₁²/V₁ + A₂²/V₂)/m)/2π (derived)",
            &[
                ("bulk_modulus", D::PRESSURE),
                ("area_cap", D::AREA),
                ("area_ann", D::AREA),
                ("volume_cap", D::VOLUME),
                ("volume_ann", D::VOLUME),
                ("mass", D::MASS),
            ],
            D::FREQUENCY,
            |a| physics::cylinder_natural_frequency(a[0], a[1], a[3], a[2], a[4], a[5]).map_err(err),
        ),
        Function::new(
            "viscosity_at",
            "oil viscosity at a temperature from its 40 °C viscosity and viscosity index (ASTM D2270, ASTM D341)",
            &[("nu40", D::KINEMATIC_VISCOSITY), ("vi", D::NONE), ("temperature", D::TEMPERATURE)],
            D::KINEMATIC_VISCOSITY,
            |a| {
                let nu100 = physics::nu_100_for_index(a[0], a[1]).map_err(err)?;
                let line = WaltherLine::through(ZERO_CELSIUS + 40.0, a[0], ZERO_CELSIUS + 100.0, nu100)
                    .map_err(err)?;
                line.viscosity_at(a[2]).map_err(err)
            },
        )
        .with_temperature_point(2),
        Function::new(
            "startup_flow_peak",
            "flow peak while an open compensator closes, Q_set·√(Δp_available/Δp_set) (derived)",
            &[("flow_set", D::FLOW), ("dp_available", D::PRESSURE), ("dp_set", D::PRESSURE)],
            D::FLOW,
            |a| physics::start_up_flow_peak(a[0], a[1], a[2]).map_err(err),
        ),
    ]
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::parse_as;

    fn env() -> TypeEnv {
        let mut names = BTreeMap::new();
        names.insert("supply_pressure".to_string(), Kind::Pressure);
        names.insert("load_pressure".to_string(), Kind::Pressure);
        names.insert("flow".to_string(), Kind::Flow);
        names.insert("oil_temperature".to_string(), Kind::Temperature);
        names.insert("bore".to_string(), Kind::Length);
        TypeEnv {
            names,
            points: vec!["loaded".into(), "unloaded".into()],
        }
    }

    #[test]
    fn checks_compile_and_evaluate() {
        let check = Check::compile(
            "supply_pressure@loaded - load_pressure@loaded > 10 bar",
            &env(),
        )
        .unwrap();
        assert!(check.is_condition());
        let mut values = Values::new();
        values.insert(
            "supply_pressure@loaded".into(),
            parse_as("180 bar", Kind::Pressure).unwrap(),
        );
        assert_eq!(
            check.evaluate(&values),
            Evaluated::Missing(vec!["load_pressure@loaded".into()])
        );
        values.insert(
            "load_pressure@loaded".into(),
            parse_as("1500 psi", Kind::Pressure).unwrap(),
        );
        assert_eq!(check.evaluate(&values), Evaluated::Condition(true));
    }

    #[test]
    fn physics_functions_are_dimension_checked() {
        // Rabie 2009, eq. 2.34–2.37 worked through: d 2 mm, Cd 0.62, 10 bar, 870 kg/m³ → 5.6034 L/min.
        let f = Check::compile(
            "orifice_flow(0.62, circle_area(2 mm), 10 bar, 870 kg/m^3)",
            &env(),
        )
        .unwrap();
        let q = f.evaluate_quantity(&Values::new()).unwrap();
        assert!((q.si() * 60_000.0 - 5.6034).abs() < 1e-3);
        let (_, message) =
            Check::compile("orifice_flow(0.62, 2 mm, 10 bar, 870 kg/m^3)", &env()).unwrap_err();
        assert!(message.contains("area"), "{message}");
    }

    #[test]
    fn viscosity_at_a_temperature() {
        // ASTM D341 through the VI-100 ν₁₀₀ of VG 46 (6.760 cSt, derived): 20.56 cSt at 60 °C.
        let f = Check::compile("viscosity_at(46 cSt, 100, oil_temperature)", &env()).unwrap();
        let mut values = Values::new();
        values.insert(
            "oil_temperature".into(),
            parse_as("60 degC", Kind::Temperature).unwrap(),
        );
        let nu = f.evaluate_quantity(&values).unwrap().si() * 1e6;
        assert!((nu - 20.56).abs() < 0.05, "{nu}");
    }

    #[test]
    fn the_function_list_names_every_binding() {
        let names: Vec<String> = function_list().into_iter().map(|f| f.0).collect();
        assert!(names.contains(&"viscosity_at".to_string()));
        assert!(names.contains(&"abs".to_string()));
    }
}
