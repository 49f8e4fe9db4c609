//! `spoolsleuth chart`: read the valve's settings and the measured points with
//! their units, compute the characteristic and write it as SVG.

use std::io::Write;

use super::chart_arguments::ChartArguments;
use super::context::Context;
use crate::chart::{render_svg, ChartError, OperatingPoint, ValveCurve, ValveModel};
use crate::error::{Error, ExitStatus};
use crate::machine::MachineSet;
use crate::units::{self, Kind, Quantity};

/// Nameplate keys that can stand in for `--flow-set` and `--setting`.
const NAMEPLATE_FLOW_SET: &str = "flow_set";
const NAMEPLATE_SETTING: &str = "spring_setting";
/// The rule-base setting that is the default healthy band.
const BAND_SETTING: &str = "regulation_band";

/// Draw the chart and write it to the file or standard output.
pub fn execute(context: &Context, arguments: ChartArguments) -> Result<ExitStatus, Error> {
    let base = context.rule_base()?;
    let nameplate = match &arguments.machine {
        Some(id) => {
            let machines = MachineSet::load(None)?;
            machines.get(id)?.profile.nameplate_values(&base).0
        }
        None => Default::default(),
    };
    let from_machine = |key: &str| nameplate.get(key).map(Quantity::si);
    let flow_set = optional(&arguments.flow_set, "--flow-set", Kind::Flow)?
        .or_else(|| from_machine(NAMEPLATE_FLOW_SET))
        .ok_or_else(|| missing("--flow-set", NAMEPLATE_FLOW_SET, &arguments.machine))?;
    let setting = optional(&arguments.setting, "--setting", Kind::Pressure)?
        .or_else(|| from_machine(NAMEPLATE_SETTING))
        .ok_or_else(|| missing("--setting", NAMEPLATE_SETTING, &arguments.machine))?;
    let band = match optional(&arguments.band, "--band", Kind::Fraction)? {
        Some(b) => b,
        None => base
            .settings
            .get(BAND_SETTING)
            .map(|s| s.value.si())
            .ok_or_else(|| Error::Input {
                option: "--band".to_string(),
                message: format!("the rule base has no `{BAND_SETTING}` setting: give --band"),
            })?,
    };
    let model = model(&arguments)?;
    let curve = ValveCurve::new(flow_set, setting, model, band).map_err(|e| match e {
        ChartError::Parameter { name, message } => Error::Input {
            option: option_for(name).to_string(),
            message: format!("{name} {message}"),
        },
        other => other.into(),
    })?;
    let points = arguments
        .point
        .iter()
        .map(|text| parse_point(text))
        .collect::<Result<Vec<_>, _>>()?;
    let max_drop = optional(&arguments.max_drop, "--max-drop", Kind::Pressure)?;
    let svg = render_svg(&curve, &points, context.units, max_drop)?;
    match &arguments.output {
        Some(path) => std::fs::write(path, svg).map_err(|e| Error::Input {
            option: "--output".to_string(),
            message: format!("cannot write `{}`: {e}", path.display()),
        })?,
        None => {
            let mut out = std::io::stdout().lock();
            out.write_all(svg.as_bytes())?;
            out.flush()?;
        }
    }
    Ok(ExitStatus::Success)
}

/// The model: the defaults of [`ValveModel`], with the options given.
fn model(a: &ChartArguments) -> Result<ValveModel, Error> {
    let defaults = ValveModel::default();
    Ok(ValveModel {
        density_kg_m3: required(&a.density, "--density", Kind::Density)?,
        full_opening_m: optional(&a.full_opening, "--full-opening", Kind::Length)?
            .unwrap_or(defaults.full_opening_m),
        open_drop_pa: optional(&a.open_drop, "--open-drop", Kind::Pressure)?
            .unwrap_or(defaults.open_drop_pa),
        spool_diameter_m: required(&a.spool_diameter, "--spool-diameter", Kind::Length)?,
        spring_rate_n_m: required(&a.spring_rate, "--spring-rate", Kind::Stiffness)?,
        ..defaults
    })
}

/// The option behind a model parameter the chart refused.
fn option_for(parameter: &str) -> &'static str {
    match parameter {
        "density" => "--density",
        "full opening" => "--full-opening",
        "open drop" => "--open-drop",
        "regulation band" => "--band",
        "set flow" => "--flow-set",
        "spool diameter" => "--spool-diameter",
        "spring rate" => "--spring-rate",
        "spring setting" => "--setting",
        _ => "chart",
    }
}

fn required(text: &str, option: &str, kind: Kind) -> Result<f64, Error> {
    units::parse_as(text, kind)
        .map(|q| q.si())
        .map_err(|e| Error::Input {
            option: option.to_string(),
            message: e.to_string(),
        })
}

fn optional(text: &Option<String>, option: &str, kind: Kind) -> Result<Option<f64>, Error> {
    text.as_deref()
        .map(|t| required(t, option, kind))
        .transpose()
}

fn missing(option: &str, key: &str, machine: &Option<String>) -> Error {
    let message = match machine {
        Some(id) => format!("machine `{id}` has no nameplate `{key}`: give {option}"),
        None => format!("give {option}, or --machine with a nameplate `{key}`"),
    };
    Error::Input {
        option: option.to_string(),
        message,
    }
}

/// Read `NAME:SUPPLY,LOAD,FLOW`, e.g. `loaded:185 bar,140 bar,14.2 L/min`.
fn parse_point(text: &str) -> Result<OperatingPoint, Error> {
    let bad = |message: String| Error::Input {
        option: "--point".to_string(),
        message: format!("`{}`: {message}", text.trim()),
    };
    let shape = "expected NAME:SUPPLY,LOAD,FLOW, e.g. `loaded:185 bar,140 bar,14.2 L/min`";
    let (name, values) = text.split_once(':').ok_or_else(|| bad(shape.to_string()))?;
    let name = name.trim();
    if name.is_empty()
        || !name
            .chars()
            .all(|c| c.is_ascii_alphanumeric() || c == '_' || c == '-')
    {
        return Err(bad(format!(
            "the point name `{name}` must be letters, digits, `_` or `-` ({shape})"
        )));
    }
    let parts: Vec<&str> = values.split(',').collect();
    let [supply, load, flow] = parts.as_slice() else {
        return Err(bad(format!(
            "{} value(s) after the name, {shape}; write decimals with a point",
            parts.len()
        )));
    };
    let read = |what: &str, text: &str, kind: Kind| {
        units::parse_as(text, kind).map_err(|e| bad(format!("{what}: {e}")))
    };
    Ok(OperatingPoint {
        flow: read("flow", flow, Kind::Flow)?,
        load: read("load pressure", load, Kind::Pressure)?,
        name: name.to_string(),
        supply: read("supply pressure", supply, Kind::Pressure)?,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_point_reads_with_its_units() {
        let p = parse_point("loaded:185 bar, 2030 psi ,14.2 L/min").unwrap();
        assert_eq!(p.name, "loaded");
        assert!((p.supply.si() - 185e5).abs() < 1e-6);
        // 2030 psi = 139.96 bar (NIST SP 811 factor)
        assert!((p.load.si() / 1e5 - 139.96).abs() < 0.01);
        assert!((p.flow.si() * 60_000.0 - 14.2).abs() < 1e-9);
    }

    #[test]
    fn bad_points_name_the_option_and_quote_the_text() {
        let cases = [
            (
                "loaded 185 bar,140 bar,14 L/min",
                "expected NAME:SUPPLY,LOAD,FLOW",
            ),
            ("loaded:185 bar,140 bar", "2 value(s)"),
            ("loaded:185,5 bar,140 bar,14 L/min", "4 value(s)"),
            ("lo aded:185 bar,140 bar,14 L/min", "point name `lo aded`"),
            (
                "loaded:185 barr,140 bar,14 L/min",
                "supply pressure: `185 barr`: unknown unit",
            ),
            ("loaded:185 bar,140 bar,14 bar", "flow: `14 bar`"),
            (":185 bar,140 bar,14 L/min", "point name ``"),
        ];
        for (text, part) in cases {
            let err = parse_point(text).unwrap_err().to_string();
            assert!(err.starts_with(&format!("--point: `{text}`")), "{err}");
            assert!(err.contains(part), "{err}");
        }
    }
}
