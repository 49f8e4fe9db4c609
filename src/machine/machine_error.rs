//! Errors from reading machine profiles.

/// A machine profile that could not be read or found.
#[derive(Debug, thiserror::Error)]
pub enum MachineError {
    /// A profile file or folder that could not be read.
    #[error("{path}: cannot read: {source}")]
    Read {
        /// The path.
        path: String,
        /// Why.
        source: std::io::Error,
    },
    /// A profile that does not parse: `file:line:col: message`.
    #[error("{at}: {message}")]
    Invalid {
        /// `file:line:col`.
        at: String,
        /// What is wrong.
        message: String,
    },
    /// No machine with this id.
    #[error("unknown machine `{id}`{}", suggestion.as_ref().map(|s| format!(" (did you mean `{s}`?)")).unwrap_or_default())]
    Unknown {
        /// The id asked for.
        id: String,
        /// The nearest known id.
        suggestion: Option<String>,
    },
}
