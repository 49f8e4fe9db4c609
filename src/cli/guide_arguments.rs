//! Arguments of `spoolsleuth guide`.

use std::path::PathBuf;

use clap::Args;

/// `spoolsleuth guide`: the walk, one safe step at a time.
#[derive(Debug, Args)]
#[command(
    long_about = "Walk through a diagnosis one safe step at a time: the complaint, the \
symptoms, the machine, then one measurement at a time with where and how to take it and its \
safety cautions, the ranking after each answer, and a conclusion with the numbers.\n\n\
Answers come from the terminal, or one per line from piped input or --answers FILE. Every \
accepted answer is saved to the session file, so Ctrl-C or the end of input loses nothing: \
continue with --resume.\n\n\
At any question: `why` explains the step; at a measurement: `skip` if you cannot take it, \
`stop` to conclude on what is known.\n\n\
Exit codes: 0 concluded, 1 stopped before a conclusion (the session is saved), 2 error.\n\n\
Example: spoolsleuth guide --machine press-4"
)]
pub struct GuideArguments {
    /// Read the answers from this file, one per line, instead of the terminal.
    #[arg(long, value_name = "FILE")]
    pub answers: Option<PathBuf>,
    /// Case notes folder where the walk may save its case note.
    #[arg(long, value_name = "DIR", env = "SPOOLSLEUTH_CASES")]
    pub cases: Option<PathBuf>,
    /// The machine, so the walk does not ask for it.
    #[arg(long, value_name = "ID")]
    pub machine: Option<String>,
    /// At the conclusion, write a work-order report: FILE.html (with the valve chart) or FILE.md.
    #[arg(long, value_name = "FILE")]
    pub report: Option<PathBuf>,
    /// Continue the walk saved in the session file.
    #[arg(long)]
    pub resume: bool,
    /// The session file (default: in the user's cache folder).
    #[arg(long, value_name = "FILE")]
    pub session: Option<PathBuf>,
}
