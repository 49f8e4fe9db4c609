//! Arguments of `spoolsleuth diagnose` (clap derive structs only).

use std::path::PathBuf;

use clap::{Args, ValueEnum};

/// Diagnose a complaint from readings on a known machine or an ad-hoc circuit.
#[derive(Debug, Args)]
#[command(
    long_about = "Diagnose a complaint from gauge readings: recognise the symptoms \
in the complaint, run every rule that applies to the circuit, rank the causes with the \
numbers that prove them, and say what to measure next, what to fix and how to stay safe. \
Readings that cannot all be true are reported before any component is blamed.\n\n\
Name a machine (its circuit, nameplate data and units come from its profile) or describe \
the circuit with --circuit, --placement and --actuator and give nameplate values as \
readings. Readings are NAME=VALUE with a unit; NAME may carry an operating point \
(flow@loaded). Past cases on the machine come from the case notes.\n\n\
Exit status: 0 ran, 2 bad input (unknown machine, reading or symptom, unit error, \
empty complaint).\n\n\
Examples:\n  spoolsleuth diagnose --machine press-4 --complaint 'platen bogs when it closes' \\\n    \
--reading supply_pressure@loaded='185 bar' --reading load_pressure@loaded='140 bar'\n  \
spoolsleuth diagnose --circuit restrictive --placement meter-in --actuator cylinder \\\n    \
--symptom speed-sags-under-load --readings readings.yaml --format markdown"
)]
pub struct DiagnoseArguments {
    /// Also write a work-order report: FILE.html (with the valve chart) or FILE.md.
    #[arg(long, value_name = "FILE")]
    pub report: Option<std::path::PathBuf>,
    /// What drives the load (ad-hoc circuit).
    #[arg(long, value_enum, conflicts_with = "machine")]
    pub actuator: Option<ActuatorArgument>,
    /// Folder of case notes; the user's machine profiles are in its `machines/`.
    #[arg(
        long,
        env = "SPOOLSLEUTH_CASES",
        value_name = "DIR",
        long_help = "Folder of case notes (Markdown, one per case); machine profiles of your \
own go in its `machines/` folder. Past cases and the machine's history come from these \
notes. Without it, the demo plant's machines and notes built into spoolsleuth are used."
    )]
    pub cases: Option<PathBuf>,
    /// Circuit type (ad-hoc circuit, instead of --machine).
    #[arg(
        long,
        value_enum,
        required_unless_present = "machine",
        conflicts_with = "machine"
    )]
    pub circuit: Option<CircuitArgument>,
    /// The complaint in the technician's or operator's own words.
    #[arg(long, value_name = "TEXT")]
    pub complaint: Option<String>,
    /// Output format.
    #[arg(long, value_enum, default_value = "table")]
    pub format: FormatArgument,
    /// Folder for the search index of the case notes (default: a cache folder).
    #[arg(long, env = "SPOOLSLEUTH_INDEX_DIR", value_name = "DIR")]
    pub index_dir: Option<PathBuf>,
    /// Print JSON (the same as --format json).
    #[arg(long, conflicts_with = "format")]
    pub json: bool,
    /// Machine id from the demo plant or your cases folder, e.g. press-4.
    #[arg(long, value_name = "ID")]
    pub machine: Option<String>,
    /// Where the valve sits (ad-hoc circuit, instead of --machine).
    #[arg(
        long,
        value_enum,
        required_unless_present = "machine",
        conflicts_with = "machine"
    )]
    pub placement: Option<PlacementArgument>,
    /// A reading, NAME=VALUE, e.g. flow@loaded="14 L/min" (repeatable).
    #[arg(
        long,
        value_name = "NAME=VALUE",
        long_help = "A reading as NAME=VALUE with its unit: supply_pressure@loaded=\"185 bar\", \
flow@loaded=\"3.7 gpm\", bore=\"100 mm\". NAME is a quantity id (see `spoolsleuth rules \
list`), optionally with an operating point after @. Repeat the option for each reading; a \
reading given twice is compared with itself."
    )]
    pub reading: Vec<String>,
    /// A YAML file of readings, `name: value` per line.
    #[arg(long, value_name = "FILE")]
    pub readings: Option<PathBuf>,
    /// A symptom id, e.g. speed-sags-under-load (repeatable).
    #[arg(long, value_name = "ID")]
    pub symptom: Vec<String>,
}

/// Circuit type.
#[derive(Clone, Copy, Debug, ValueEnum)]
pub enum CircuitArgument {
    /// Bypass (3-way) compensated flow control.
    Bypass,
    /// Load-sensing pump.
    LoadSensing,
    /// Plain needle valve, not compensated.
    Needle,
    /// Restrictive (2-way) compensated flow control.
    Restrictive,
}

/// Valve placement.
#[derive(Clone, Copy, Debug, ValueEnum)]
pub enum PlacementArgument {
    /// In a branch to tank.
    BleedOff,
    /// In the line to the actuator.
    MeterIn,
    /// In the line from the actuator.
    MeterOut,
}

/// Actuator.
#[derive(Clone, Copy, Debug, ValueEnum)]
pub enum ActuatorArgument {
    /// A hydraulic cylinder.
    Cylinder,
    /// A hydraulic motor.
    Motor,
}

/// Output format.
#[derive(Clone, Copy, Debug, ValueEnum)]
pub enum FormatArgument {
    /// Pretty JSON (documented in README.md, "Diagnosis JSON").
    Json,
    /// Markdown, for a work order or a wiki.
    Markdown,
    /// Terminal text with tables.
    Table,
}
