//! Errors that stop a diagnosis before it starts.

/// Input a diagnosis cannot start from.
#[derive(Debug, thiserror::Error)]
pub enum DiagnosisError {
    /// The complaint is empty and no symptom was named.
    #[error("nothing to diagnose: give a complaint with --complaint \"...\" or a symptom with --symptom ID (known: {known})")]
    NoComplaint {
        /// The known symptom ids.
        known: String,
    },
    /// No symptom was recognised in the complaint and none was named.
    #[error("no symptom recognised in the complaint \"{complaint}\": name one with --symptom ID (known: {known})")]
    NoSymptom {
        /// The complaint as given.
        complaint: String,
        /// The known symptom ids.
        known: String,
    },
    /// A reading that could not be taken in.
    #[error("reading `{name}`: {message}")]
    Reading {
        /// The reading's name as given.
        name: String,
        /// What is wrong.
        message: String,
    },
    /// A `NAME=VALUE` argument without `=`.
    #[error("reading `{text}`: expected NAME=VALUE, e.g. supply_pressure@loaded=\"180 bar\"")]
    ReadingSyntax {
        /// The text as given.
        text: String,
    },
    /// A readings file that could not be read or parsed.
    #[error("{at}: {message}")]
    ReadingsFile {
        /// `file` or `file:line:col`.
        at: String,
        /// What is wrong.
        message: String,
    },
    /// An unknown symptom id.
    #[error("{0}")]
    UnknownSymptom(String),
}
