//! Errors from loading the rule base. Each names the file, line and column
//! and what was expected.

/// A rule base that could not be loaded.
#[derive(Debug, thiserror::Error)]
pub enum RulesError {
    /// A rule folder or file that could not be read.
    #[error("{path}: cannot read: {source}")]
    Read {
        /// The path.
        path: String,
        /// Why.
        source: std::io::Error,
    },
    /// One problem at one place: `file:line:col: message`.
    #[error("{at}: {message}")]
    Invalid {
        /// `file:line:col`.
        at: String,
        /// What is wrong and what was expected.
        message: String,
    },
    /// Several problems, each on its own line.
    #[error("{} problems in the rule base:\n{}", .0.len(), .0.iter().map(|e| format!("  {e}")).collect::<Vec<_>>().join("\n"))]
    Many(Vec<RulesError>),
    /// An unknown rule, symptom, cause or quantity id asked for by name.
    #[error("unknown {what} `{id}`{}", suggestion.as_ref().map(|s| format!(" (did you mean `{s}`?)")).unwrap_or_default())]
    UnknownId {
        /// What kind of id, e.g. "rule".
        what: &'static str,
        /// The id given.
        id: String,
        /// The nearest known id.
        suggestion: Option<String>,
    },
}

impl RulesError {
    /// Gather a list of problems into one error (`None` when empty).
    pub fn gather(mut errors: Vec<RulesError>) -> Option<RulesError> {
        match errors.len() {
            0 => None,
            1 => errors.pop(),
            _ => Some(RulesError::Many(errors)),
        }
    }
}
