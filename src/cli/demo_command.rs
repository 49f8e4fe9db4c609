//! `spoolsleuth demo`: the tool's whole job on the invented demo plant. The
//! plant's machines with what their nameplates settle, then a breakdown
//! call on press-4 diagnosed exactly as `spoolsleuth diagnose` does it, and
//! the command line that repeats the call by hand. Everything it reads (the
//! rule base, the machines, the case notes) is compiled into the binary.

use super::context::Context;
use super::diagnose_command::{diagnose, text_style};
use crate::diagnosis::DEMO_CALL;
use crate::error::{Error, ExitStatus};
use crate::machine::{nameplate_settles, MachineSet};
use crate::notes::NotesFolder;
use crate::output::{self, table};
use crate::report::{render, ReportFormat};
use crate::rules::RuleBase;

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
    let mut input = DEMO_CALL.input(machines)?;
    input.units = context.units_for(input.units);
    let diagnosis = diagnose(base, input, NotesFolder::Embedded, None)?;
    let report = render(
        &diagnosis,
        ReportFormat::Table,
        text_style(context, ReportFormat::Table),
    )?;
    Ok(format!(
        "\nA breakdown call on {}: the technician's words and readings, diagnosed\n\n{report}",
        DEMO_CALL.machine
    ))
}

/// The command line that runs the same call by hand.
fn by_hand() -> String {
    let mut line = format!(
        "spoolsleuth diagnose --machine {} \\\n  --complaint \"{}\"",
        DEMO_CALL.machine, DEMO_CALL.complaint
    );
    for (name, value) in DEMO_CALL.readings {
        line.push_str(&format!(" \\\n  --reading {name}=\"{value}\""));
    }
    format!("\nTo run the same call by hand:\n\n{line}\n")
}
