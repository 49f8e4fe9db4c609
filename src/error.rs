//! The crate-wide error type and the exit-code contract.
//!
//! Every module has its own typed error; this enum gathers them so that the
//! one place that prints errors (`run`) can map each to an exit code.

use std::process::ExitCode;

use crate::machine::MachineError;
use crate::physics::PhysicsError;
use crate::rules::RulesError;
use crate::units::UnitError;

/// How a command that ran to the end went.
///
/// The numbers are a documented contract (README, "Exit codes"):
/// 0 ran and everything passed or was found, 1 ran but a check failed or
/// nothing was found, 2 an error (bad input, bad files, usage).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ExitStatus {
    /// Ran; every check passed, or the search found something.
    Success,
    /// Ran; at least one check failed, or the search found nothing.
    Failure,
    /// Did not complete: bad input, unreadable files or a usage error.
    Error,
}

impl ExitStatus {
    /// The process exit code for this status.
    pub fn code(self) -> u8 {
        match self {
            ExitStatus::Success => 0,
            ExitStatus::Failure => 1,
            ExitStatus::Error => 2,
        }
    }
}

impl From<ExitStatus> for ExitCode {
    fn from(status: ExitStatus) -> Self {
        ExitCode::from(status.code())
    }
}

/// Any error the library reports to the user.
#[derive(Debug, thiserror::Error)]
pub enum Error {
    /// The valve characteristic could not be computed from the inputs.
    #[error(transparent)]
    Chart(#[from] crate::chart::ChartError),
    /// A diagnosis could not start from the input given.
    #[error(transparent)]
    Diagnosis(#[from] crate::diagnosis::DiagnosisError),
    /// Writing the output failed (other than a closed pipe, which is not an error).
    #[error("cannot write output: {0}")]
    Io(#[from] std::io::Error),
    /// An input value that the command cannot use, with the option that held it.
    #[error("{option}: {message}")]
    Input {
        /// The option or field that held the value, e.g. `--flow`.
        option: String,
        /// What is wrong with it.
        message: String,
    },
    /// The search index could not be opened or kept current.
    #[error(transparent)]
    Index(#[from] crate::index::IndexError),
    /// JSON could not be produced.
    #[error("cannot encode JSON: {0}")]
    Json(#[from] serde_json::Error),
    /// A machine profile could not be read or found.
    #[error(transparent)]
    Machine(#[from] MachineError),
    /// The rule base could not be loaded, or an id in it was not found.
    #[error(transparent)]
    Rules(#[from] RulesError),
    /// Inputs outside the domain of a formula.
    #[error(transparent)]
    Physics(#[from] PhysicsError),
    /// A case note or the notes folder is at fault.
    #[error(transparent)]
    Notes(#[from] crate::notes::NotesError),
    /// A search could not be run.
    #[error(transparent)]
    Search(#[from] crate::search::SearchError),
    /// A reading or unit that could not be understood.
    #[error(transparent)]
    Units(#[from] UnitError),
    /// A watcher of the notes folder could not start or had to stop.
    #[error(transparent)]
    Watch(#[from] crate::watch::WatchError),
}

impl Error {
    /// The exit status this error maps to (always [`ExitStatus::Error`] today;
    /// kept as a method so that a future kind can map elsewhere in one place).
    pub fn exit_status(&self) -> ExitStatus {
        ExitStatus::Error
    }

    /// True when the error is only a closed output pipe (`spoolsleuth ... | head`).
    pub fn is_broken_pipe(&self) -> bool {
        matches!(self, Error::Io(e) if e.kind() == std::io::ErrorKind::BrokenPipe)
    }
}
