//! Errors of the search module.

use crate::index::IndexError;

/// Any error while searching.
#[derive(Debug, thiserror::Error)]
pub enum SearchError {
    /// The index could not be opened or kept current.
    #[error(transparent)]
    Index(#[from] IndexError),
    /// A filter option holds a value that matches nothing known.
    #[error("{option}: {message}")]
    Option {
        /// The option, e.g. `--machine`.
        option: String,
        /// What is wrong.
        message: String,
    },
    /// The query text is longer than the limit.
    #[error("query: {chars} characters is longer than the limit of {max} characters")]
    QueryTooLong {
        /// Its length in characters.
        chars: usize,
        /// The limit in characters.
        max: usize,
    },
    /// The query text does not parse.
    #[error("query: {message}{}", column.map(|c| format!(" at column {c}")).unwrap_or_default())]
    Syntax {
        /// 1-based column (in characters) where the problem is, when known.
        column: Option<usize>,
        /// What is wrong.
        message: String,
    },
    /// tantivy failed while searching.
    #[error("search failed: {0}")]
    Tantivy(#[from] tantivy::TantivyError),
}
