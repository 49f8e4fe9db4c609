//! The similar-cases API for the diagnosis: given a complaint in plain words
//! and optional machine and symptom, the past cases that read most alike.

use serde::Serialize;

use super::{search, SearchError, SearchRequest, SearchResult};
use crate::index::NoteIndex;
use crate::notes::NoteDate;

/// A past case like the one at hand.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SimilarCase {
    /// Cause id found then.
    pub cause: String,
    /// When it happened.
    pub date: Option<NoteDate>,
    /// Note id (for `cases show`).
    pub id: String,
    /// Machine id.
    pub machine: String,
    /// Relevance (BM25; higher is closer).
    pub score: f32,
    /// Text around the best match, without markers.
    pub snippet: String,
}

/// Past cases most like `complaint`, best first. The complaint is plain
/// words: query syntax characters in it are ignored. A machine or symptom
/// that no note mentions gives no cases rather than an error.
pub fn similar_cases(
    index: &mut NoteIndex,
    complaint: &str,
    machine: Option<&str>,
    symptom: Option<&str>,
    limit: usize,
) -> SearchResult<Vec<SimilarCase>> {
    let words: String = complaint
        .chars()
        .map(|c| {
            if c.is_alphanumeric() || c == '-' {
                c.to_ascii_lowercase()
            } else {
                ' '
            }
        })
        .collect();
    // A leading dash would mean "exclude"; plain words have none.
    let words = words
        .split_whitespace()
        .map(|w| w.trim_start_matches('-'))
        .collect::<Vec<_>>()
        .join(" ");
    let mut request = SearchRequest::new(words);
    request.machine = machine.map(str::to_string);
    request.symptom = symptom.map(str::to_string);
    request.limit = limit;
    let results = match search(index, &request) {
        Err(SearchError::Option { .. }) => return Ok(Vec::new()),
        other => other?,
    };
    Ok(results
        .hits
        .into_iter()
        .map(|hit| SimilarCase {
            cause: hit.note.cause,
            date: hit.note.date,
            id: hit.note.id,
            machine: hit.note.machine,
            score: hit.score,
            snippet: hit.snippet.text,
        })
        .collect())
}
