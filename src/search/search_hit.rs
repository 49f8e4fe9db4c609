//! One ranked hit, and the results of a search.

use serde::Serialize;

use super::{HighlightStyle, SnippetText, StoredNote};

/// A note that matched, with its score and snippet.
#[derive(Clone, Debug, PartialEq)]
pub struct SearchHit {
    /// The note's stored fields.
    pub note: StoredNote,
    /// BM25 score (0 for filter-only searches).
    pub score: f32,
    /// Text around the match.
    pub snippet: SnippetText,
}

/// The hits of one search and how the query was understood.
#[derive(Clone, Debug, PartialEq)]
pub struct SearchResults {
    /// The query with typos corrected, when a word was corrected.
    pub did_you_mean: Option<String>,
    /// The hits, best first.
    pub hits: Vec<SearchHit>,
    /// The query as given.
    pub query: String,
    /// How many notes matched in all (may exceed the hits shown).
    pub total: usize,
}

/// JSON shape of `cases search --json` (documented in cases/README.md).
#[derive(Serialize)]
pub struct SearchResultsJson<'a> {
    did_you_mean: Option<&'a str>,
    hits: Vec<SearchHitJson<'a>>,
    query: &'a str,
    schema_version: u32,
    total: usize,
}

#[derive(Serialize)]
struct SearchHitJson<'a> {
    cause: &'a str,
    date: String,
    downtime_minutes: Option<u64>,
    id: &'a str,
    machine: &'a str,
    score: f32,
    snippet: String,
    snippet_highlights: &'a [std::ops::Range<usize>],
    snippet_text: &'a str,
    symptoms: &'a [String],
    title: &'a str,
}

impl SearchResults {
    /// The stable JSON view.
    pub fn to_json(&self) -> SearchResultsJson<'_> {
        SearchResultsJson {
            did_you_mean: self.did_you_mean.as_deref(),
            hits: self
                .hits
                .iter()
                .map(|hit| SearchHitJson {
                    cause: &hit.note.cause,
                    date: hit.note.date_text(),
                    downtime_minutes: hit.note.downtime.map(|d| d.minutes()),
                    id: &hit.note.id,
                    machine: &hit.note.machine,
                    score: (hit.score * 1000.0).round() / 1000.0,
                    snippet: hit.snippet.render(HighlightStyle::Markers),
                    snippet_highlights: &hit.snippet.highlights,
                    snippet_text: &hit.snippet.text,
                    symptoms: &hit.note.symptoms,
                    title: &hit.note.title,
                })
                .collect(),
            query: &self.query,
            schema_version: 1,
            total: self.total,
        }
    }
}
