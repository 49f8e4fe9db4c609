//! Top-level command-line arguments (clap derive structs only).

use clap::{Parser, Subcommand};

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
    /// Past case notes: add, search, show, stats.
    Cases(super::cases_arguments::CasesArguments),
}
