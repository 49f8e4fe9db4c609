//! Arguments of `spoolsleuth rules`.

use clap::{Args, Subcommand};

/// `spoolsleuth rules ...`
#[derive(Debug, Args)]
pub struct RulesArguments {
    /// What to do with the rule base.
    #[command(subcommand)]
    pub action: RulesAction,
}

/// The `rules` subcommands.
#[derive(Debug, Subcommand)]
pub enum RulesAction {
    /// Load, lint and run every rule's examples; exit 1 on any failure.
    #[command(
        long_about = "Load the rule base (the built-in one plus --rules folders), \
lint it and run every rule's worked examples.\n\nExample: spoolsleuth rules check --rules my-rules/"
    )]
    Check {
        /// Print the results as JSON.
        #[arg(long)]
        json: bool,
    },
    /// List the formula functions available to rule authors.
    Functions {
        /// Print as JSON.
        #[arg(long)]
        json: bool,
    },
    /// List the rules: id, symptoms, cause, inputs.
    List {
        /// Print as JSON.
        #[arg(long)]
        json: bool,
        /// Only rules for this symptom id.
        #[arg(long, value_name = "ID")]
        symptom: Option<String>,
    },
    /// Show one rule in plain words.
    Show {
        /// The rule id.
        id: String,
        /// Print as JSON.
        #[arg(long)]
        json: bool,
    },
}
