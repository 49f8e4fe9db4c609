//! Running a search: ranked hits with snippets, and recovery from a damaged
//! index (rebuild from the notes, then search again).

use std::panic::AssertUnwindSafe;

use tantivy::collector::{Count, TopDocs};
use tantivy::query::Query;
use tantivy::snippet::SnippetGenerator;
use tantivy::{DocAddress, Order, Score, Searcher, TantivyDocument};

use super::{
    QueryBuilder, SearchError, SearchHit, SearchRequest, SearchResult, SearchResults, SnippetText,
    StoredNote,
};
use crate::index::{NoteIndex, NoteSchema};

/// Longest snippet, in characters.
const SNIPPET_CHARS: usize = 160;

/// Search the notes; a query over [`super::MAX_QUERY_CHARS`] is refused.
pub fn search(index: &mut NoteIndex, request: &SearchRequest) -> SearchResult<SearchResults> {
    request.check_length()?;
    with_recovery(index, |index| run(index, request))
}

/// Run `job` on the index; if tantivy fails (or panics on damaged files),
/// rebuild the index from the notes and run it once more.
pub fn with_recovery<T>(
    index: &mut NoteIndex,
    job: impl Fn(&NoteIndex) -> SearchResult<T>,
) -> SearchResult<T> {
    let failure = match std::panic::catch_unwind(AssertUnwindSafe(|| job(index))) {
        Ok(Err(SearchError::Tantivy(error))) => error.to_string(),
        Ok(outcome) => return outcome,
        Err(panic) => panic
            .downcast_ref::<String>()
            .cloned()
            .or_else(|| panic.downcast_ref::<&str>().map(|s| (*s).to_string()))
            .unwrap_or_else(|| "it panicked".into()),
    };
    index.rebuild_after_failure(&failure)?;
    job(index)
}

fn run(index: &NoteIndex, request: &SearchRequest) -> SearchResult<SearchResults> {
    let searcher = index.searcher();
    let schema = index.schema();
    let built = QueryBuilder::new(&searcher, schema).build(request)?;
    let limit = request.limit.max(1);
    let (ranked, total): (Vec<(Score, DocAddress)>, usize) = match &built.text {
        Some(_) => searcher.search(
            &built.query,
            &(TopDocs::with_limit(limit).order_by_score(), Count),
        )?,
        None => {
            // No words: the newest notes that pass the filters.
            let collector =
                TopDocs::with_limit(limit).order_by_fast_field::<u64>("date", Order::Desc);
            let (newest, total) = searcher.search(&built.query, &(collector, Count))?;
            (
                newest
                    .into_iter()
                    .map(|(_, address)| (0.0, address))
                    .collect(),
                total,
            )
        }
    };
    let snippets = Snippets::new(&searcher, schema, built.text.as_deref())?;
    let mut hits = Vec::with_capacity(ranked.len());
    for (score, address) in ranked {
        let (note, doc) = StoredNote::load(&searcher, schema, address)?;
        let snippet = snippets.best(&doc, &note);
        hits.push(SearchHit {
            note,
            score,
            snippet,
        });
    }
    Ok(SearchResults {
        did_you_mean: built.did_you_mean,
        hits,
        query: request.query.clone(),
        total,
    })
}

/// Snippet generators for the stored text fields, best field first.
pub(crate) struct Snippets {
    body: tantivy::schema::Field,
    generators: Vec<SnippetGenerator>,
}

impl Snippets {
    /// Generators for `query` (none for a filter-only search).
    pub(crate) fn new(
        searcher: &Searcher,
        schema: &NoteSchema,
        query: Option<&dyn Query>,
    ) -> SearchResult<Self> {
        let mut generators = Vec::new();
        if let Some(query) = query {
            for field in [schema.body, schema.fix, schema.title] {
                let mut generator = SnippetGenerator::create(searcher, query, field)?;
                generator.set_max_num_chars(SNIPPET_CHARS);
                generators.push(generator);
            }
        }
        Ok(Snippets {
            body: schema.body,
            generators,
        })
    }

    /// The first snippet with a highlight, else the start of the text.
    pub(crate) fn best(&self, doc: &TantivyDocument, note: &StoredNote) -> SnippetText {
        for generator in &self.generators {
            let snippet = generator.snippet_from_doc(doc);
            if !snippet.highlighted().is_empty() {
                return SnippetText::new(snippet.fragment(), snippet.highlighted());
            }
        }
        use tantivy::schema::Value;
        let body = doc
            .get_first(self.body)
            .and_then(|v| v.as_str())
            .unwrap_or_default();
        let text = if body.trim().is_empty() {
            &note.title
        } else {
            body
        };
        SnippetText::plain(text, SNIPPET_CHARS)
    }
}
