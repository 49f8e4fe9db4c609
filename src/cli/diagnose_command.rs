//! `spoolsleuth diagnose`: turns the arguments into a diagnosis input (a
//! machine profile or an ad-hoc circuit, the complaint, the readings), adds
//! the machine's history and similar past cases from the case notes, runs
//! the engine and prints the report.

use std::io::IsTerminal;
use std::path::{Path, PathBuf};

use super::context::Context;
use super::diagnose_arguments::{
    ActuatorArgument, CircuitArgument, DiagnoseArguments, FormatArgument, PlacementArgument,
};
use crate::diagnosis::{
    parse_reading_argument, parse_readings_file, CauseHistory, Diagnosis, DiagnosisInput, PastCase,
};
use crate::error::{Error, ExitStatus};
use crate::index::{IndexLocation, NoteIndex};
use crate::machine::MachineSet;
use crate::notes::NotesFolder;
use crate::output::{self, Color};
use crate::report::{render, ReportFormat, TextStyle};
use crate::rules::{Actuator, Circuit, Placement, RuleBase};
use crate::search::{machine_history, similar_cases};
use crate::units::UnitSystem;

/// How many of a machine's most recent cases count as its history.
const HISTORY_CASES: usize = 10;
/// How many similar past cases to show.
const SIMILAR_CASES: usize = 3;
/// Table width when standard output is not a terminal, so that long
/// evidence sentences wrap the same way in a file, a pipe or a test.
pub const PIPE_WIDTH: u16 = 120;

/// Run `diagnose`.
pub fn execute(context: &Context, arguments: DiagnoseArguments) -> Result<ExitStatus, Error> {
    if let Some(path) = &arguments.report {
        super::report_file::report_kind(path)?;
    }
    let base = context.rule_base()?;
    let input = input(context, &base, &arguments)?;
    let notes = arguments
        .cases
        .clone()
        .map_or(NotesFolder::Embedded, NotesFolder::Disk);
    let diagnosis = diagnose(&base, input, notes, arguments.index_dir.as_deref())?;
    let format = if arguments.json {
        ReportFormat::Json
    } else {
        report_format(arguments.format)
    };
    print_report(context, &diagnosis, format)?;
    if let Some(path) = &arguments.report {
        super::report_file::write_report(path, &diagnosis, &base)?;
    }
    Ok(ExitStatus::Success)
}

/// Diagnose `input`, with the machine's history and similar past cases
/// from `notes`. Notes that cannot be searched leave a warning, not an
/// error: the diagnosis does not depend on them.
pub fn diagnose(
    base: &RuleBase,
    mut input: DiagnosisInput,
    notes: NotesFolder,
    index_dir: Option<&Path>,
) -> Result<Diagnosis, Error> {
    let mut notes_warning = None;
    let mut index = match open_index(notes, index_dir) {
        Ok(index) => Some(index),
        Err(err) => {
            notes_warning = Some(format!("past cases not consulted: {err}"));
            None
        }
    };
    if let (Some(index), Some(machine)) = (index.as_mut(), &input.machine) {
        input.history = history(index, &machine.id);
    }
    let mut diagnosis = Diagnosis::run(base, &input)?;
    if let Some(index) = index.as_mut() {
        diagnosis.similar_cases = past_cases(index, &diagnosis);
    }
    diagnosis.warnings.extend(notes_warning);
    Ok(diagnosis)
}

/// Print a diagnosis in `format` to standard output (JSON never in colour).
pub fn print_report(
    context: &Context,
    diagnosis: &Diagnosis,
    format: ReportFormat,
) -> Result<(), Error> {
    let style = text_style(context, format);
    output::print(&render(diagnosis, format, style)?)?;
    Ok(())
}

/// The text style for standard output.
pub fn text_style(context: &Context, format: ReportFormat) -> TextStyle {
    let terminal = std::io::stdout().is_terminal();
    TextStyle {
        color: if format == ReportFormat::Table {
            context.color
        } else {
            Color::never()
        },
        width: if terminal { None } else { Some(PIPE_WIDTH) },
    }
}

fn report_format(format: FormatArgument) -> ReportFormat {
    match format {
        FormatArgument::Json => ReportFormat::Json,
        FormatArgument::Markdown => ReportFormat::Markdown,
        FormatArgument::Table => ReportFormat::Table,
    }
}

/// The diagnosis input: a machine's profile, or the ad-hoc circuit given.
fn input(
    context: &Context,
    base: &RuleBase,
    arguments: &DiagnoseArguments,
) -> Result<DiagnosisInput, Error> {
    let mut input = match &arguments.machine {
        Some(id) => {
            let machines = MachineSet::load(user_machines(arguments.cases.as_deref()).as_deref())?;
            let profile = machines.get(id)?.profile.clone();
            let mut input = DiagnosisInput::for_machine(profile);
            input.units = context.units_for(input.units);
            input
        }
        None => ad_hoc(context, arguments)?,
    };
    input.complaint = arguments.complaint.clone();
    input.symptoms = arguments.symptom.clone();
    if let Some(path) = &arguments.readings {
        input.readings = readings_file(base, path)?;
    }
    for text in &arguments.reading {
        input.readings.push(parse_reading_argument(text)?);
    }
    Ok(input)
}

/// `<cases>/machines`, where a user's own machine profiles live.
pub fn user_machines(cases: Option<&Path>) -> Option<PathBuf> {
    cases.map(|c| c.join("machines"))
}

fn ad_hoc(context: &Context, arguments: &DiagnoseArguments) -> Result<DiagnosisInput, Error> {
    let missing = |option: &str| Error::Input {
        option: option.to_string(),
        message: "give a machine with --machine ID, or the circuit with --circuit and --placement"
            .to_string(),
    };
    let circuit = arguments.circuit.ok_or_else(|| missing("--circuit"))?;
    let placement = arguments.placement.ok_or_else(|| missing("--placement"))?;
    Ok(DiagnosisInput {
        actuator: arguments.actuator.map(|a| match a {
            ActuatorArgument::Cylinder => Actuator::Cylinder,
            ActuatorArgument::Motor => Actuator::Motor,
        }),
        circuit: match circuit {
            CircuitArgument::Bypass => Circuit::Bypass,
            CircuitArgument::LoadSensing => Circuit::LoadSensing,
            CircuitArgument::Needle => Circuit::Needle,
            CircuitArgument::Restrictive => Circuit::Restrictive,
        },
        complaint: None,
        history: Vec::new(),
        machine: None,
        placement: match placement {
            PlacementArgument::BleedOff => Placement::BleedOff,
            PlacementArgument::MeterIn => Placement::MeterIn,
            PlacementArgument::MeterOut => Placement::MeterOut,
        },
        readings: Vec::new(),
        skip: Vec::new(),
        symptoms: Vec::new(),
        units: context.units_given.unwrap_or(UnitSystem::Metric),
    })
}

fn readings_file(base: &RuleBase, path: &Path) -> Result<Vec<(String, String)>, Error> {
    let name = path.display().to_string();
    let text = crate::text_file::read_text(path).map_err(|e| Error::Input {
        option: "--readings".to_string(),
        message: format!("{name}: cannot read: {e}"),
    })?;
    Ok(parse_readings_file(base, &name, &text)?)
}

fn open_index(notes: NotesFolder, index_dir: Option<&Path>) -> Result<NoteIndex, Error> {
    let location = IndexLocation::resolve(&notes, index_dir)?;
    let (index, _) = NoteIndex::open(notes, &location)?;
    Ok(index)
}

/// The machine's recent history: for each symptom, how often each cause
/// was found. A history that cannot be read counts as none.
fn history(index: &mut NoteIndex, machine: &str) -> Vec<CauseHistory> {
    let Ok(history) = machine_history(index, machine, HISTORY_CASES) else {
        return Vec::new();
    };
    history
        .by_symptom
        .iter()
        .flat_map(|s| {
            let of: usize = s.causes.iter().map(|c| c.count).sum();
            s.causes.iter().map(move |c| CauseHistory {
                symptom: s.symptom.clone(),
                cause: c.cause.clone(),
                count: c.count,
                of,
            })
        })
        .collect()
}

/// Past cases most like this one: on the same machine first, then on any.
fn past_cases(index: &mut NoteIndex, d: &Diagnosis) -> Vec<PastCase> {
    let mut words: Vec<String> = d.complaint.iter().cloned().collect();
    words.extend(d.symptoms.iter().map(|s| s.label.clone()));
    let text = words.join(" ");
    let symptom = d.symptoms.first().map(|s| s.id.as_str());
    let machine = d.machine.as_ref().map(|m| m.id.as_str());
    let mut found =
        similar_cases(index, &text, machine, symptom, SIMILAR_CASES).unwrap_or_default();
    if found.is_empty() && machine.is_some() {
        found = similar_cases(index, &text, None, symptom, SIMILAR_CASES).unwrap_or_default();
    }
    found
        .into_iter()
        .map(|c| PastCase {
            id: c.id,
            date: c.date.map(|d| d.to_string()).unwrap_or_default(),
            machine: c.machine,
            cause: c.cause,
            // BM25 scores mean nothing past three decimals.
            score: (f64::from(c.score) * 1000.0).round() / 1000.0,
            snippet: c.snippet,
        })
        .collect()
}
