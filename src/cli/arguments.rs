//! Top-level command-line arguments (clap derive structs only).

use std::path::PathBuf;

use clap::{Parser, Subcommand, ValueEnum};

use super::rules_arguments::RulesArguments;

use super::calc_arguments::CalcArguments;
use super::diagnose_arguments::DiagnoseArguments;
use super::machine_arguments::MachineArguments;

/// Offline troubleshooting for pressure-compensated hydraulic flow controls.
#[derive(Debug, Parser)]
#[command(
    name = "spoolsleuth",
    version,
    about,
    long_about = "Offline troubleshooting for pressure-compensated hydraulic flow controls.\n\n\
Exit codes: 0 ran and everything passed (or something was found), 1 ran but a check \
failed (or nothing was found), 2 error (bad input, bad files, usage).\n\n\
This tool supports, and does not replace, local codes, the machine maker's \
instructions and licensed practice."
)]
pub struct Arguments {
    /// When to use colour.
    #[arg(
        long,
        value_enum,
        default_value = "auto",
        env = "SPOOLSLEUTH_COLOR",
        global = true
    )]
    pub color: ColorArgument,
    /// Extra rule folder(s) added to the built-in rule base.
    #[arg(
        long = "rules",
        value_name = "DIR",
        env = "SPOOLSLEUTH_RULES",
        global = true,
        long_help = "A folder of your own rule files (*.yaml), added to the built-in rule \
base. An entry with the same id as a built-in one replaces it, and the tool says so."
    )]
    pub rules: Vec<PathBuf>,
    /// Unit system for printed results [default: the machine's own, else metric].
    #[arg(
        long,
        value_enum,
        env = "SPOOLSLEUTH_UNITS",
        global = true,
        long_help = "Unit system for printed results. When it is not given, a diagnosis or a \
machine profile is printed in the machine's own units (its profile's `units:`), and \
everything else in metric."
    )]
    pub units: Option<UnitsArgument>,
    /// What to do.
    #[command(subcommand)]
    pub command: Command,
}

/// When to use colour.
#[derive(Clone, Copy, Debug, ValueEnum)]
pub enum ColorArgument {
    /// On a terminal, unless NO_COLOR is set or TERM=dumb.
    Auto,
    /// Always.
    Always,
    /// Never.
    Never,
}

/// Unit system for printed results.
#[derive(Clone, Copy, Debug, ValueEnum)]
pub enum UnitsArgument {
    /// bar, L/min, cm³/rev, °C, mm, kW.
    Metric,
    /// psi, gpm, in³/rev, °F, in, hp.
    Us,
}

/// The subcommands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Run one fluid-power calculation with readings in any unit.
    Calc(Box<CalcArguments>),
    /// Past case notes: add, search, show, stats.
    Cases(Box<super::cases_arguments::CasesArguments>),
    /// Draw the valve characteristic with the measured points, as SVG.
    Chart(Box<super::chart_arguments::ChartArguments>),
    /// Show the tool's job on the invented demo plant.
    #[command(
        long_about = "Show the tool's job on the invented demo plant: the six demo \
machines with what their nameplate data settles, then a breakdown call on press-4 with its \
readings diagnosed as `diagnose` does it (causes ranked with their numbers, the next \
measurement, the fix and its cautions, similar past cases), and the command that repeats \
the call by hand.\n\n\
Example: spoolsleuth demo --units us"
    )]
    Demo,
    /// Diagnose a complaint from readings on a machine or an ad-hoc circuit.
    Diagnose(Box<DiagnoseArguments>),
    /// Walk through a diagnosis one safe step at a time.
    Guide(super::guide_arguments::GuideArguments),
    /// List, show and check machine profiles.
    Machine(MachineArguments),
    /// Load, lint, list and explain the rule base.
    Rules(RulesArguments),
}

#[cfg(test)]
mod tests {
    use super::*;
    use clap::CommandFactory;

    #[test]
    fn the_command_line_definition_is_consistent() {
        Arguments::command().debug_assert();
    }
}
