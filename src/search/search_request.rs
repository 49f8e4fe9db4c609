//! What a search asks for: query text, filters and a limit.

use crate::notes::NoteDate;

/// A search over the notes.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct SearchRequest {
    /// Only this cause id.
    pub cause: Option<String>,
    /// At most this many hits.
    pub limit: usize,
    /// Only this machine id.
    pub machine: Option<String>,
    /// Query text (may be empty: then the newest notes matching the filters).
    pub query: String,
    /// Only notes on or after this date.
    pub since: Option<NoteDate>,
    /// Only notes with this symptom id.
    pub symptom: Option<String>,
    /// Only notes on or before this date.
    pub until: Option<NoteDate>,
}

impl SearchRequest {
    /// A request for `query` with no filters and a limit of 10.
    pub fn new(query: impl Into<String>) -> Self {
        SearchRequest {
            cause: None,
            limit: 10,
            machine: None,
            query: query.into(),
            since: None,
            symptom: None,
            until: None,
        }
    }
}
