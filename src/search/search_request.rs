//! What a search asks for: query text, filters and a limit.

use super::{SearchError, SearchResult};
use crate::notes::NoteDate;

/// The longest query accepted, in characters: far above any question a
/// technician types, low enough that no pasted text becomes thousands of
/// query clauses and typo look-ups.
pub const MAX_QUERY_CHARS: usize = 1000;

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

    /// Refuse a query longer than [`MAX_QUERY_CHARS`], before any work.
    pub fn check_length(&self) -> SearchResult<()> {
        let chars = self.query.chars().count();
        if chars > MAX_QUERY_CHARS {
            return Err(SearchError::QueryTooLong {
                chars,
                max: MAX_QUERY_CHARS,
            });
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_query_over_the_limit_is_refused_with_its_length() {
        let longest = "é".repeat(MAX_QUERY_CHARS);
        assert!(SearchRequest::new(longest.as_str()).check_length().is_ok());
        let err = SearchRequest::new(format!("{longest}x"))
            .check_length()
            .unwrap_err();
        assert_eq!(
            err.to_string(),
            "query: 1001 characters is longer than the limit of 1000 characters"
        );
    }
}
