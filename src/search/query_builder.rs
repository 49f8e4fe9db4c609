//! Turning a search request into a tantivy query: check the syntax (with
//! the column of a mistake), correct typos, rewrite the trade's phrases,
//! parse over title, body, fix, details and tags with boosts, and add the
//! machine, symptom, cause and date filters as non-scoring clauses.

use std::ops::Bound;

use tantivy::collector::DocSetCollector;
use tantivy::query::{
    AllQuery, BooleanQuery, ConstScoreQuery, Occur, Query, QueryParser, QueryParserError,
    RangeQuery, TermQuery, TermSetQuery,
};
use tantivy::schema::Value;
use tantivy::schema::{Field, IndexRecordOption};
use tantivy::TantivyDocument;
use tantivy::{Searcher, Term};

use super::{SearchError, SearchRequest, SearchResult, TypoCorrector};
use crate::index::{query_tokenizers, rewrite_phrases, NoteSchema};
use crate::notes::{nearest, CAUSE_IDS, SYMPTOM_IDS};

/// Field boosts: a word in the complaint or the fix says more than one in
/// the story around it.
const BOOSTS: &[(&str, f32)] = &[
    ("body", 1.0),
    ("details", 0.5),
    ("fix", 1.5),
    ("tags", 1.0),
    ("title", 2.0),
];

/// A query ready to run.
pub struct BuiltQuery {
    /// The query with text clauses and filters.
    pub query: Box<dyn Query>,
    /// The text part alone, for snippets (none for a filter-only search).
    pub text: Option<Box<dyn Query>>,
    /// The corrected query, when a typo was corrected.
    pub did_you_mean: Option<String>,
}

/// Builds queries over one index.
pub struct QueryBuilder<'s> {
    schema: &'s NoteSchema,
    searcher: &'s Searcher,
}

impl<'s> QueryBuilder<'s> {
    /// A builder for the index behind `searcher`.
    pub fn new(searcher: &'s Searcher, schema: &'s NoteSchema) -> Self {
        QueryBuilder { schema, searcher }
    }

    /// Build the query for `request`.
    pub fn build(&self, request: &SearchRequest) -> SearchResult<BuiltQuery> {
        let mut clauses: Vec<(Occur, Box<dyn Query>)> = Vec::new();
        let (text, did_you_mean) = if request.query.trim().is_empty() {
            (None, None)
        } else {
            let (query, did_you_mean) = self.text_query(&request.query)?;
            (Some(query), did_you_mean)
        };
        if let Some(text) = &text {
            clauses.push((Occur::Must, text.box_clone()));
        }
        if let Some(machine) = &request.machine {
            self.check_machine(machine)?;
            clauses.push((Occur::Must, self.filter(self.schema.machine, machine)));
        }
        if let Some(symptom) = &request.symptom {
            check_id("--symptom", "symptom", symptom, SYMPTOM_IDS)?;
            clauses.push((Occur::Must, self.filter(self.schema.symptom, symptom)));
        }
        if let Some(cause) = &request.cause {
            check_id("--cause", "cause", cause, CAUSE_IDS)?;
            clauses.push((Occur::Must, self.filter(self.schema.cause, cause)));
        }
        if request.since.is_some() || request.until.is_some() {
            let bound = |date: Option<crate::notes::NoteDate>| {
                date.map_or(Bound::Unbounded, |d| {
                    Bound::Included(Term::from_field_u64(self.schema.date, d.ordinal()))
                })
            };
            let range = RangeQuery::new(bound(request.since), bound(request.until));
            clauses.push((
                Occur::Must,
                Box::new(ConstScoreQuery::new(Box::new(range), 0.0)),
            ));
        }
        if clauses.is_empty() {
            clauses.push((Occur::Must, Box::new(AllQuery)));
        }
        Ok(BuiltQuery {
            query: Box::new(BooleanQuery::new(clauses)),
            text,
            did_you_mean,
        })
    }

    fn text_query(&self, query: &str) -> SearchResult<(Box<dyn Query>, Option<String>)> {
        check_syntax(query)?;
        let correction = TypoCorrector::new(self.searcher, self.schema).correct(query)?;
        let text = rewrite_phrases(&correction.search_text);
        let parsed = self
            .parser()
            .parse_query(&text)
            .map_err(|e| parser_error(query, &e))?;
        Ok((self.resolve_exclusions(parsed)?, correction.did_you_mean))
    }

    /// Turn each excluded clause (`-word`, `-"a phrase"`) into the set of note
    /// ids it matches, found by a search of its own. Scoring an excluded
    /// phrase inside the main query trips an internal check of the search
    /// library when the phrase matches no note; a set of ids excludes the
    /// same notes with plain term lookups.
    fn resolve_exclusions(&self, parsed: Box<dyn Query>) -> SearchResult<Box<dyn Query>> {
        let Some(boolean) = parsed.downcast_ref::<BooleanQuery>() else {
            return Ok(parsed);
        };
        if !boolean
            .clauses()
            .iter()
            .any(|(occur, _)| *occur == Occur::MustNot)
        {
            return Ok(parsed);
        }
        let mut clauses: Vec<(Occur, Box<dyn Query>)> = Vec::new();
        for (occur, query) in boolean.clauses() {
            if *occur != Occur::MustNot {
                clauses.push((*occur, query.box_clone()));
                continue;
            }
            let ids = self.matching_ids(query.as_ref())?;
            if !ids.is_empty() {
                clauses.push((Occur::MustNot, Box::new(TermSetQuery::new(ids))));
            }
        }
        if clauses.iter().all(|(occur, _)| *occur == Occur::MustNot) {
            // Only exclusions: everything else is what remains.
            clauses.push((Occur::Must, Box::new(AllQuery)));
        }
        Ok(Box::new(BooleanQuery::new(clauses)))
    }

    /// The id terms of every note `query` matches.
    fn matching_ids(&self, query: &dyn Query) -> SearchResult<Vec<Term>> {
        let docs = self.searcher.search(query, &DocSetCollector)?;
        let mut ids = Vec::with_capacity(docs.len());
        for address in docs {
            let doc: TantivyDocument = self.searcher.doc(address)?;
            if let Some(id) = doc.get_first(self.schema.id).and_then(|v| v.as_str()) {
                ids.push(Term::from_field_text(self.schema.id, id));
            }
        }
        Ok(ids)
    }

    fn parser(&self) -> QueryParser {
        let schema = self.schema;
        let fields = vec![
            schema.title,
            schema.body,
            schema.fix,
            schema.details,
            schema.tags,
        ];
        let mut parser = QueryParser::new(schema.schema.clone(), fields, query_tokenizers());
        for (name, boost) in BOOSTS {
            if let Ok(field) = schema.schema.get_field(name) {
                parser.set_field_boost(field, *boost);
            }
        }
        parser
    }

    fn filter(&self, field: Field, value: &str) -> Box<dyn Query> {
        let term = TermQuery::new(
            Term::from_field_text(field, value),
            IndexRecordOption::Basic,
        );
        Box::new(ConstScoreQuery::new(Box::new(term), 0.0))
    }

    /// A machine filter must name a machine some note is about.
    fn check_machine(&self, machine: &str) -> SearchResult<()> {
        if self
            .searcher
            .doc_freq(&Term::from_field_text(self.schema.machine, machine))?
            > 0
        {
            return Ok(());
        }
        let known = self.values(self.schema.machine)?;
        let message = match nearest(machine, known.iter().map(String::as_str)) {
            Some(near) => format!("no notes for machine '{machine}' (did you mean '{near}'?)"),
            None => format!(
                "no notes for machine '{machine}' (machines in the notes: {})",
                known.join(", ")
            ),
        };
        Err(SearchError::Option {
            option: "--machine".into(),
            message,
        })
    }

    /// Every value of an exact field in the index, sorted.
    fn values(&self, field: Field) -> SearchResult<Vec<String>> {
        let mut values = std::collections::BTreeSet::new();
        for segment in self.searcher.segment_readers() {
            let inverted = segment.inverted_index(field)?;
            let mut stream = inverted
                .terms()
                .stream()
                .map_err(tantivy::TantivyError::from)?;
            while stream.advance() {
                values.insert(String::from_utf8_lossy(stream.key()).into_owned());
            }
        }
        Ok(values.into_iter().collect())
    }
}

fn check_id(option: &str, what: &str, id: &str, known: &[&str]) -> SearchResult<()> {
    if known.contains(&id) {
        return Ok(());
    }
    let message = match nearest(id, known.iter().copied()) {
        Some(near) => format!("unknown {what} '{id}' (did you mean '{near}'?)"),
        None => format!("unknown {what} '{id}' (known: {})", known.join(", ")),
    };
    Err(SearchError::Option {
        option: option.into(),
        message,
    })
}

/// Report the first syntax mistake of the user's own text, with its column.
fn check_syntax(query: &str) -> SearchResult<()> {
    let (_, errors) = tantivy::query_grammar::parse_query_lenient(query);
    match errors.first() {
        None => Ok(()),
        Some(error) => {
            let pos = error.pos.min(query.len());
            let column = query
                .get(..pos)
                .map_or(pos, |prefix| prefix.chars().count())
                + 1;
            let message = if error.message.starts_with("missing delimiter") {
                // The parser's own words show an escaped quote: `missing delimiter \"`.
                "a quoted phrase is never closed (add the closing quote)".to_string()
            } else {
                error.message.to_lowercase()
            };
            Err(SearchError::Syntax {
                column: Some(column),
                message,
            })
        }
    }
}

fn parser_error(query: &str, error: &QueryParserError) -> SearchError {
    let (message, needle) = match error {
        QueryParserError::FieldDoesNotExist(field) => (
            format!("unknown field '{field}' (search fields: title, body, fix, machine, symptom, cause)"),
            Some(format!("{field}:")),
        ),
        QueryParserError::AllButQueryForbidden => ("a query cannot only exclude words; add a word to look for".to_string(), None),
        other => (other.to_string().to_lowercase(), None),
    };
    let column = needle
        .and_then(|n| query.find(&n))
        .map(|pos| query[..pos].chars().count() + 1);
    SearchError::Syntax { column, message }
}
