//! Test fixtures: a small rule-base vocabulary and physics functions
//! registered the way other modules will register theirs.

use std::collections::HashMap;
use std::f64::consts::PI;

use super::{Environment, Function, FunctionTable};
use crate::units::{parse_quantity, Dimension, Kind, Quantity};

/// The vocabulary the formula tests are checked against.
pub(crate) fn environment() -> Environment {
    let mut env = Environment::new();
    for (name, kind) in [
        ("ambient_temperature", Kind::Temperature),
        ("bore", Kind::Length),
        ("cd", Kind::Ratio),
        ("density", Kind::Density),
        ("displacement", Kind::Displacement),
        ("efficiency", Kind::Fraction),
        ("flow", Kind::Flow),
        ("flow_set", Kind::Flow),
        ("load_pressure", Kind::Pressure),
        ("oil_temperature", Kind::Temperature),
        ("orifice_area", Kind::Area),
        ("speed", Kind::ShaftSpeed),
        ("spring_setting", Kind::Pressure),
        ("supply_pressure", Kind::Pressure),
        ("temperature_rise", Kind::TemperatureDifference),
    ] {
        env.declare(name, kind);
    }
    for point in ["cold", "hot", "loaded", "low", "unloaded"] {
        env.declare_point(point);
    }
    env
}

fn orifice_flow(args: &[f64]) -> Result<f64, String> {
    let [cd, area, dp, density] = args else {
        return Err("expected four arguments".to_string());
    };
    if *dp < 0.0 {
        return Err("the pressure drop is negative".to_string());
    }
    if *density <= 0.0 {
        return Err("the density must be positive".to_string());
    }
    Ok(cd * area * (2.0 * dp / density).sqrt())
}

fn pump_flow(args: &[f64]) -> Result<f64, String> {
    let [displacement, speed, efficiency] = args else {
        return Err("expected three arguments".to_string());
    };
    Ok(displacement * speed * efficiency)
}

fn cylinder_speed(args: &[f64]) -> Result<f64, String> {
    let [flow, bore] = args else {
        return Err("expected two arguments".to_string());
    };
    Ok(flow / (PI / 4.0 * bore * bore))
}

/// Three physics bindings, written inline to prove the registry.
pub(crate) fn functions() -> FunctionTable {
    let mut table = FunctionTable::new();
    let flow = Dimension::FLOW;
    for function in [
        Function::new(
            "orifice_flow",
            "flow through a sharp-edged orifice, Q = cd·A·√(2Δp/ρ)",
            &[
                ("cd", Dimension::NONE),
                ("area", Dimension::AREA),
                ("dp", Dimension::PRESSURE),
                ("density", Dimension::DENSITY),
            ],
            flow,
            orifice_flow,
        ),
        Function::new(
            "pump_flow",
            "delivered flow of a pump, Q = V·n·η",
            &[
                ("displacement", Dimension::VOLUME),
                ("speed", Dimension::FREQUENCY),
                ("efficiency", Dimension::NONE),
            ],
            flow,
            pump_flow,
        ),
        Function::new(
            "cylinder_speed",
            "rod speed of a cylinder, v = Q / (πD²/4)",
            &[("flow", flow), ("bore", Dimension::LENGTH)],
            Dimension::VELOCITY,
            cylinder_speed,
        ),
    ] {
        if let Err(e) = table.register(function) {
            panic!("fixture: {e}");
        }
    }
    table
}

/// Readings from `name=text` pairs, read as a technician's input is.
pub(crate) fn readings(pairs: &[(&str, &str)]) -> HashMap<String, Quantity> {
    pairs
        .iter()
        .map(|(name, text)| {
            let q = parse_quantity(text).unwrap_or_else(|e| panic!("fixture {name}: {e}"));
            ((*name).to_string(), q)
        })
        .collect()
}
