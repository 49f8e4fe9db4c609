//! `spoolsleuth demo`: the tool's job on the invented demo plant. Every
//! number printed is computed here from the demo machines' nameplate data,
//! a set of demo readings and the built-in rule base.

use super::context::Context;
use crate::error::{Error, ExitStatus};
use crate::machine::MachineSet;
use crate::output::{self, table};
use crate::rules::{Effect, Evaluated, Readings, RuleBase};
use crate::units;

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
    out.push_str(&plant_table(&base, &machines)?);
    out.push_str(&breakdown_call(context, &base, &machines)?);
    out.push_str(&format!("\n{}\n", base.closing));
    output::print(&out)?;
    Ok(ExitStatus::Success)
}

/// One row per machine: its circuit and the derived quantities its
/// nameplate alone settles.
fn plant_table(base: &RuleBase, machines: &MachineSet) -> Result<String, Error> {
    let mut t = table(["machine", "circuit", "computed from the nameplate"]);
    for m in &machines.machines {
        let p = &m.profile;
        let (nameplate, problems) = p.nameplate_values(base);
        if let Some(problem) = problems.first() {
            return Err(Error::Input {
                option: format!("{}: nameplate `{}`", m.file, problem.name),
                message: problem.message.clone(),
            });
        }
        let mut readings = Readings::new();
        for (name, value) in &nameplate {
            readings.insert(name, *value);
        }
        let values = base.values(&readings);
        let computed: Vec<String> = base
            .derived
            .iter()
            .filter_map(|d| {
                let v = values.get(&d.entry.id)?;
                Some(format!(
                    "{}: {}",
                    d.entry.label,
                    units::format(*v, d.kind, p.units)
                ))
            })
            .collect();
        t.add_row([
            format!("{}\n{}", p.id, p.name),
            format!(
                "{} {} {}",
                p.circuit.name(),
                p.placement.name(),
                actuator(p.actuator)
            ),
            computed.join("\n"),
        ]);
    }
    Ok(format!("{t}\n"))
}

fn actuator(a: crate::machine::Actuator) -> &'static str {
    match a {
        crate::machine::Actuator::Cylinder => "cylinder",
        crate::machine::Actuator::Motor => "motor",
    }
}

/// The breakdown call: recognise the complaint, evaluate every rule that
/// applies to the machine, and show what each check says with its numbers.
fn breakdown_call(
    context: &Context,
    base: &RuleBase,
    machines: &MachineSet,
) -> Result<String, Error> {
    let machine = &machines.get(MACHINE)?.profile;
    let system = machine.units;
    let mut out = format!(
        "\nBreakdown call on {} ({}): \"{COMPLAINT}\"\n",
        machine.id, machine.name
    );
    let symptoms: Vec<String> = base
        .recognise(COMPLAINT)
        .iter()
        .map(|s| s.entry.id.clone())
        .collect();
    out.push_str(&format!("Recognised symptoms: {}\n", symptoms.join(", ")));
    let mut readings = Readings::new();
    let (nameplate, _) = machine.nameplate_values(base);
    for (name, value) in &nameplate {
        readings.insert(name, *value);
    }
    let mut shown = table(["reading", "value"]);
    for (name, text) in READINGS {
        readings
            .insert_text(base, name, text)
            .map_err(|e| Error::Input {
                option: e.name.clone(),
                message: e.message,
            })?;
        let kind = base
            .quantity_for_reading(name)
            .map(|q| q.kind)
            .map_err(|m| Error::Input {
                option: (*name).to_string(),
                message: m,
            })?;
        let value = readings
            .get(name)
            .unwrap_or(units::Quantity::number(f64::NAN));
        shown.add_row([(*name).to_string(), units::format(value, kind, system)]);
    }
    out.push_str(&format!("{shown}\n"));
    let values = base.values(&readings);
    let mut checks = table(["rule", "cause", "what the numbers say", "evidence"]);
    for rule in base.rules.iter().filter(|r| {
        r.applies_to(machine.circuit, machine.placement)
            && r.entry.symptoms.iter().any(|s| symptoms.contains(s))
    }) {
        let (verdict, evidence) = match rule.check.evaluate(&values) {
            Evaluated::Condition(holds) => {
                let effect = if holds {
                    rule.entry.when_true
                } else {
                    rule.entry.when_false
                };
                (effect_words(effect), rule.evidence.render(&values, system))
            }
            Evaluated::Missing(names) => (
                "not yet tested".to_string(),
                format!("needs {}", names.join(", ")),
            ),
            Evaluated::Quantity(_) | Evaluated::Failed(_) => continue,
        };
        let verdict = match verdict.as_str() {
            "confirms" => context.color.red(&verdict),
            _ => verdict,
        };
        checks.add_row([
            rule.entry.id.clone(),
            rule.entry.cause.clone(),
            verdict,
            evidence,
        ]);
    }
    out.push_str(&format!("{checks}\n"));
    Ok(out)
}

fn effect_words(effect: Effect) -> String {
    effect.name().replace('-', " ")
}
