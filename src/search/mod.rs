//! Searching the case notes: query building (synonym phrases, typo
//! correction through the term dictionary, filters), ranked hits with
//! highlighted snippets, statistics over the history, and the similar-cases
//! API other modules call.

mod case_search;
mod case_stats;
mod highlight;
mod machine_history;
mod query_builder;
mod search_error;
mod search_hit;
mod search_request;
mod similar_case;
mod snippet_text;
mod stored_note;
mod typo_corrector;

pub use case_search::{search, with_recovery};
pub use case_stats::{CaseStats, CauseCount, MachineStats, RepeatOffender, SymptomStats};
pub use highlight::HighlightStyle;
pub use machine_history::{machine_history, MachineHistory, SymptomHistory};
pub use query_builder::{BuiltQuery, QueryBuilder};
pub use search_error::SearchError;
pub use search_hit::{SearchHit, SearchResults};
pub use search_request::{SearchRequest, MAX_QUERY_CHARS};
pub use similar_case::{similar_cases, SimilarCase};
pub use snippet_text::SnippetText;
pub use stored_note::StoredNote;
pub use typo_corrector::{Correction, TypoCorrector};

/// Result alias for this module.
pub type SearchResult<T> = Result<T, SearchError>;
