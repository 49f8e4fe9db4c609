//! `spoolsleuth demo`: the tool's whole job on the invented demo plant. The
//! plant's machines with what their nameplates settle, then a breakdown
//! call on press-4 diagnosed exactly as `spoolsleuth diagnose` does it, and
//! the command line that repeats the call by hand. Everything it reads (the
//! rule base, the machines, the case notes) is compiled into the binary.

use super::context::Context;
use super::diagnose_command::{diagnose, text_style};
use crate::diagnosis::DiagnosisInput;
use crate::error::{Error, ExitStatus};
use crate::machine::{nameplate_settles, MachineSet};
use crate::notes::NotesFolder;
use crate::output::{self, table};
use crate::report::{render, ReportFormat};
use crate::rules::RuleBase;

/// The demo breakdown call: a machine, the technician's words, and the
/// readings taken (two operating points, in the machine's own units).
const MACHINE: &str = "press-4";
const COMPLAINT: &str = "platen slows right down and bogs when it closes on the panel";
const READINGS: &[(&str, &str)] = &[
    ("supply_pressure@unloaded", "150 bar"),
    ("inter_pressure@unloaded", "38 bar"),
    ("load_pressure@unloaded", "30 bar"),
    ("flow@unloaded", "20 L/min"),
    ("supply_pressure@loaded", "185 bar"),
    ("inter_pressure@loaded", "143.5 bar"),
    ("load_pressure@loaded", "140 bar"),
    ("flow@loaded", "14.2 L/min"),
];

/// Run the demo.
pub fn execute(context: &Context) -> Result<ExitStatus, Error> {
    let base = context.rule_base()?;
    let machines = MachineSet::load(None)?;
    let mut out =
        String::from("spoolsleuth demo: Carrow Valley Timber Products (an invented plant)\n\n");
    out.push_str(&plant_table(context, &base, &machines)?);
    out.push_str(&breakdown_call(context, &base, &machines)?);
    out.push_str(&by_hand());
    output::print(&out)?;
    Ok(ExitStatus::Success)
}

/// One row per machine: its circuit and the derived quantities its
/// nameplate alone settles.
fn plant_table(context: &Context, base: &RuleBase, machines: &MachineSet) -> Result<String, Error> {
    let mut t = table(["machine", "circuit", "computed from the nameplate"]);
    for m in &machines.machines {
        let p = &m.profile;
        if let Some(problem) = p.problems(base).first() {
            return Err(Error::Input {
                option: format!("{}: nameplate `{}`", m.file, problem.name),
                message: problem.message.clone(),
            });
        }
        let computed: Vec<String> = nameplate_settles(p, base, context.units_for(p.units))
            .iter()
            .map(|s| format!("{}: {}", s.label, s.shown))
            .collect();
        t.add_row([
            format!("{}\n{}", p.id, p.name),
            format!(
                "{} {} {}",
                p.circuit.name(),
                p.placement.name(),
                p.actuator.name()
            ),
            computed.join("\n"),
        ]);
    }
    Ok(format!("{t}\n"))
}

/// The breakdown call, diagnosed and rendered as `diagnose` renders it.
fn breakdown_call(
    context: &Context,
    base: &RuleBase,
    machines: &MachineSet,
) -> Result<String, Error> {
    let machine = machines.get(MACHINE)?.profile.clone();
    let mut input = DiagnosisInput::for_machine(machine);
    input.units = context.units_for(input.units);
    input.complaint = Some(COMPLAINT.to_string());
    input.readings = READINGS
        .iter()
        .map(|(n, v)| ((*n).to_string(), (*v).to_string()))
        .collect();
    let diagnosis = diagnose(base, input, NotesFolder::Embedded, None)?;
    let report = render(
        &diagnosis,
        ReportFormat::Table,
        text_style(context, ReportFormat::Table),
    )?;
    Ok(format!(
        "\nA breakdown call on {MACHINE}: the technician's words and readings, diagnosed\n\n{report}"
    ))
}

/// The command line that runs the same call by hand.
fn by_hand() -> String {
    let mut line =
        format!("spoolsleuth diagnose --machine {MACHINE} \\\n  --complaint \"{COMPLAINT}\"");
    for (name, value) in READINGS {
        line.push_str(&format!(" \\\n  --reading {name}=\"{value}\""));
    }
    format!("\nTo run the same call by hand:\n\n{line}\n")
}
