//! Arguments of `spoolsleuth machine` (clap derive structs only).

use std::path::PathBuf;

use clap::{Args, Subcommand};

/// `spoolsleuth machine ...`
#[derive(Debug, Args)]
#[command(
    long_about = "Machine profiles: the demo plant's, built into spoolsleuth, and \
your own in the `machines/` folder of your cases folder (--cases or SPOOLSLEUTH_CASES). A \
profile of yours with a demo id replaces the demo one.\n\n\
Examples:\n  spoolsleuth machine list\n  spoolsleuth machine show press-4 --units us\n  \
spoolsleuth machine check --cases ~/plant-notes"
)]
pub struct MachineArguments {
    /// What to do with the profiles.
    #[command(subcommand)]
    pub action: MachineAction,
    /// Folder of case notes; your machine profiles are in its `machines/`.
    #[arg(long, global = true, env = "SPOOLSLEUTH_CASES", value_name = "DIR")]
    pub cases: Option<PathBuf>,
}

/// The `machine` subcommands.
#[derive(Debug, Subcommand)]
pub enum MachineAction {
    /// Check every profile's nameplate data and gauges against the rule base; exit 1 on a problem.
    #[command(
        long_about = "Check every profile: each nameplate key must be a known \
quantity with a unit of its kind that belongs to the machine's actuator, and each gauge a \
known quantity. Problems are listed as `file: key: message`.\n\n\
Exit status: 0 every profile is clean, 1 a problem was found, 2 a profile cannot be read."
    )]
    Check {
        /// Print the problems as JSON.
        #[arg(long)]
        json: bool,
    },
    /// List the machines: id, name, circuit, placement, actuator, units.
    List {
        /// Print as JSON.
        #[arg(long)]
        json: bool,
    },
    /// Show one profile with its nameplate values and what they settle.
    Show {
        /// The machine id, e.g. press-4.
        id: String,
        /// Print as JSON.
        #[arg(long)]
        json: bool,
    },
}
