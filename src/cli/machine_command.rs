//! `spoolsleuth machine list|show|check`: the machine profiles as tables or
//! JSON, what each nameplate settles, and the profiles checked against the
//! rule base's vocabulary.

use serde::Serialize;

use super::context::Context;
use super::diagnose_command::user_machines;
use super::machine_arguments::{MachineAction, MachineArguments};
use crate::error::{Error, ExitStatus};
use crate::machine::{nameplate_settles, LoadedMachine, MachineSet, SettledValue};
use crate::output::{self, table};
use crate::rules::RuleBase;
use crate::units::{self, UnitSystem};

/// JSON schema version of the `machine` outputs.
const SCHEMA_VERSION: u32 = 1;

/// Run a `machine` subcommand.
pub fn execute(context: &Context, arguments: MachineArguments) -> Result<ExitStatus, Error> {
    let machines = MachineSet::load(user_machines(arguments.cases.as_deref()).as_deref())?;
    match arguments.action {
        MachineAction::Check { json } => check(context, &machines, json),
        MachineAction::List { json } => list(&machines, json),
        MachineAction::Show { id, json } => show(context, machines.get(&id)?, json),
    }
}

/// One row of `machine list`.
#[derive(Serialize)]
struct Summary<'a> {
    actuator: &'static str,
    circuit: &'static str,
    file: &'a str,
    id: &'a str,
    name: &'a str,
    placement: &'static str,
    units: UnitSystem,
}

fn summary(m: &LoadedMachine) -> Summary<'_> {
    let p = &m.profile;
    Summary {
        actuator: p.actuator.name(),
        circuit: p.circuit.name(),
        file: &m.file,
        id: &p.id,
        name: &p.name,
        placement: p.placement.name(),
        units: p.units,
    }
}

fn list(machines: &MachineSet, json: bool) -> Result<ExitStatus, Error> {
    let rows: Vec<Summary> = machines.machines.iter().map(summary).collect();
    if json {
        output::print_json(&serde_json::json!({
            "machines": rows,
            "schema_version": SCHEMA_VERSION,
        }))?;
        return Ok(ExitStatus::Success);
    }
    let mut t = table(["id", "name", "circuit", "placement", "actuator", "units"]);
    for r in &rows {
        t.add_row([
            r.id.to_string(),
            r.name.to_string(),
            r.circuit.to_string(),
            r.placement.to_string(),
            r.actuator.to_string(),
            r.units.to_string(),
        ]);
    }
    output::print(&format!("{t}\n{} machines\n", rows.len()))?;
    Ok(ExitStatus::Success)
}

/// A nameplate value as written and as printed in the machine's units.
#[derive(Serialize)]
struct NameplateRow {
    given: String,
    label: String,
    name: String,
    shown: String,
}

fn nameplate_rows(base: &RuleBase, m: &LoadedMachine, system: UnitSystem) -> Vec<NameplateRow> {
    let (values, _) = m.profile.nameplate_values(base);
    m.profile
        .nameplate
        .iter()
        .map(|(name, given)| {
            let q = base.quantities.get(name);
            let shown = match (values.get(name), q) {
                (Some(v), Some(q)) => units::format(*v, q.kind, system),
                _ => "(not understood: see `spoolsleuth machine check`)".to_string(),
            };
            NameplateRow {
                given: given.0.clone(),
                label: q.map_or_else(String::new, |q| q.entry.label.clone()),
                name: name.clone(),
                shown,
            }
        })
        .collect()
}

fn show(context: &Context, m: &LoadedMachine, json: bool) -> Result<ExitStatus, Error> {
    let base = context.rule_base()?;
    let p = &m.profile;
    let system = context.units_for(p.units);
    let nameplate = nameplate_rows(&base, m, system);
    let settles = nameplate_settles(p, &base, system);
    if json {
        output::print_json(&serde_json::json!({
            "actuator": p.actuator.name(),
            "circuit": p.circuit.name(),
            "file": m.file,
            "gauges": p.gauges,
            "id": p.id,
            "name": p.name,
            "nameplate": nameplate,
            "notes": p.notes,
            "oil": p.oil,
            "placement": p.placement.name(),
            "plant": p.plant,
            "pump": p.pump,
            "schema_version": SCHEMA_VERSION,
            "settles": settles,
            "units": system,
        }))?;
        return Ok(ExitStatus::Success);
    }
    output::print(&show_text(m, system, &nameplate, &settles))?;
    Ok(ExitStatus::Success)
}

fn show_text(
    m: &LoadedMachine,
    system: UnitSystem,
    nameplate: &[NameplateRow],
    settles: &[SettledValue],
) -> String {
    let p = &m.profile;
    let mut out = format!("{}: {}\n", p.id, p.name);
    let mut facts = vec![
        ("circuit", p.circuit.name().to_string()),
        ("placement", p.placement.name().to_string()),
        ("actuator", p.actuator.name().to_string()),
        ("units", system.to_string()),
    ];
    for (key, value) in [("plant", &p.plant), ("pump", &p.pump), ("oil", &p.oil)] {
        if let Some(v) = value {
            facts.push((key, v.clone()));
        }
    }
    facts.push(("gauges", p.gauges.join(", ")));
    facts.push(("file", m.file.clone()));
    for (key, value) in facts {
        out.push_str(&format!("  {key:<10} {value}\n"));
    }
    let mut t = table(["nameplate", "what", "as written", "value"]);
    for r in nameplate {
        t.add_row([&r.name, &r.label, &r.given, &r.shown]);
    }
    out.push_str(&format!("\nNameplate ({system})\n{t}\n"));
    out.push_str("\nWhat the nameplate settles\n");
    if settles.is_empty() {
        out.push_str("nothing yet: no derived quantity has all its inputs on the nameplate\n");
    } else {
        let mut t = table(["quantity", "value"]);
        for s in settles {
            t.add_row([format!("{} ({})", s.label, s.id), s.shown.clone()]);
        }
        out.push_str(&format!("{t}\n"));
    }
    if let Some(notes) = &p.notes {
        out.push_str(&format!("\nNotes: {notes}\n"));
    }
    out
}

/// One problem found by `machine check`.
#[derive(Serialize)]
struct Problem {
    file: String,
    key: String,
    message: String,
}

fn check(context: &Context, machines: &MachineSet, json: bool) -> Result<ExitStatus, Error> {
    let base = context.rule_base()?;
    let problems: Vec<Problem> = machines
        .machines
        .iter()
        .flat_map(|m| {
            m.profile.problems(&base).into_iter().map(|p| Problem {
                file: m.file.clone(),
                key: p.name,
                message: p.message,
            })
        })
        .collect();
    if json {
        output::print_json(&serde_json::json!({
            "machines": machines.machines.len(),
            "problems": problems,
            "schema_version": SCHEMA_VERSION,
        }))?;
    } else {
        let mut out = String::new();
        for p in &problems {
            out.push_str(&format!("{}: {}: {}\n", p.file, p.key, p.message));
        }
        out.push_str(&format!(
            "{} machine profiles checked, {} problem{}\n",
            machines.machines.len(),
            problems.len(),
            if problems.len() == 1 { "" } else { "s" }
        ));
        output::print(&out)?;
    }
    Ok(if problems.is_empty() {
        ExitStatus::Success
    } else {
        ExitStatus::Failure
    })
}
