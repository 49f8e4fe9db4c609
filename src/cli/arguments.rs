//! Top-level command-line arguments (clap derive structs only).

use clap::{Parser, Subcommand};

use super::calc_arguments::CalcArguments;

/// Offline troubleshooting for pressure-compensated hydraulic flow controls.
#[derive(Debug, Parser)]
#[command(name = "spoolsleuth", version, about)]
pub struct Arguments {
    /// What to do.
    #[command(subcommand)]
    pub command: Command,
}

/// The subcommands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Run one fluid-power calculation with readings in any unit
    Calc(CalcArguments),
}
