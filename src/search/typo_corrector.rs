//! Typo correction through the index's own vocabulary: a query word that no
//! note contains is replaced by the nearest word that notes do contain (found
//! with a Levenshtein automaton over the unstemmed field's term dictionary),
//! and a rare word with a much commoner neighbour gets the neighbour as an
//! alternative. The corrected query doubles as the "did you mean".

use tantivy::query::FuzzyTermQuery;
use tantivy::schema::Field;
use tantivy::tokenizer::TokenizerManager;
use tantivy::{Searcher, Term};

use crate::index::{is_trade_word, query_tokenizers, NoteSchema, EN_ANALYZER};

/// Words shorter than this are left alone: too many real neighbours.
const MIN_WORD_CHARS: usize = 4;
/// A word found in at most this many notes may be a typo of a commoner word.
const RARE_DOC_FREQ: u64 = 2;
/// ... when that word is at least this many times commoner.
const COMMONER_BY: u64 = 4;

/// The query text after correction.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Correction {
    /// The user's query with each typo replaced by its correction.
    pub did_you_mean: Option<String>,
    /// The text to search for (rare words OR'ed with their correction).
    pub search_text: String,
}

/// Corrects query words against the words the notes contain.
pub struct TypoCorrector<'s> {
    fields: Vec<Field>,
    plain: Field,
    searcher: &'s Searcher,
    tokenizers: TokenizerManager,
}

impl<'s> TypoCorrector<'s> {
    /// A corrector over the index behind `searcher`.
    pub fn new(searcher: &'s Searcher, schema: &NoteSchema) -> Self {
        TypoCorrector {
            fields: vec![
                schema.title,
                schema.body,
                schema.fix,
                schema.details,
                schema.tags,
            ],
            plain: schema.plain,
            searcher,
            tokenizers: query_tokenizers(),
        }
    }

    /// Correct the words of `query` that look like typos.
    pub fn correct(&self, query: &str) -> tantivy::Result<Correction> {
        let mut shown = String::with_capacity(query.len());
        let mut search = String::with_capacity(query.len());
        let mut changed = false;
        let mut in_quotes = false;
        let mut at = 0;
        for (start, end) in candidate_words(query) {
            let between = &query[at..start];
            in_quotes ^= between.matches('"').count() % 2 == 1;
            shown.push_str(between);
            search.push_str(between);
            let word = &query[start..end];
            match self.suggest(word)? {
                Some((better, rare)) => {
                    changed = true;
                    shown.push_str(&better);
                    if rare && !in_quotes {
                        search.push_str(&format!("({word} {better})"));
                    } else {
                        search.push_str(&better);
                    }
                }
                None => {
                    shown.push_str(word);
                    search.push_str(word);
                }
            }
            at = end;
        }
        shown.push_str(&query[at..]);
        search.push_str(&query[at..]);
        Ok(Correction {
            did_you_mean: changed.then_some(shown),
            search_text: search,
        })
    }

    /// A better word for `word`, and whether `word` itself occurs (rarely).
    fn suggest(&self, word: &str) -> tantivy::Result<Option<(String, bool)>> {
        let lower = word.to_lowercase();
        if lower.chars().count() < MIN_WORD_CHARS || is_trade_word(&lower) {
            return Ok(None);
        }
        let doc_freq = self
            .searcher
            .doc_freq(&Term::from_field_text(self.plain, &lower))?;
        if doc_freq > RARE_DOC_FREQ || (doc_freq == 0 && self.stem_is_known(&lower)?) {
            return Ok(None);
        }
        let distance = if lower.chars().count() <= 5 { 1 } else { 2 };
        let neighbours = self.neighbours(&lower, distance)?;
        let best = neighbours
            .into_iter()
            .filter(|(candidate, freq)| {
                *candidate != lower && (doc_freq == 0 || *freq >= COMMONER_BY * doc_freq.max(1))
            })
            .min_by_key(|(candidate, freq)| {
                (
                    strsim::damerau_levenshtein(&lower, candidate),
                    std::cmp::Reverse(*freq),
                    candidate.clone(),
                )
            });
        Ok(best.map(|(candidate, _)| (candidate, doc_freq > 0)))
    }

    /// True when the stemmed form of `word` is in a ranked field (e.g. a
    /// plural of a word the notes use).
    fn stem_is_known(&self, word: &str) -> tantivy::Result<bool> {
        let Some(mut analyzer) = self.tokenizers.get(EN_ANALYZER) else {
            return Ok(false);
        };
        let mut stream = analyzer.token_stream(word);
        let Some(token) = stream.next() else {
            return Ok(false);
        };
        let stem = token.text.clone();
        for field in &self.fields {
            if self
                .searcher
                .doc_freq(&Term::from_field_text(*field, &stem))?
                > 0
            {
                return Ok(true);
            }
        }
        Ok(false)
    }

    /// Words of the unstemmed dictionary within `distance` edits, with doc counts.
    fn neighbours(&self, word: &str, distance: u8) -> tantivy::Result<Vec<(String, u64)>> {
        let automaton =
            FuzzyTermQuery::new(Term::from_field_text(self.plain, word), distance, true)
                .automaton()?;
        let mut found: std::collections::BTreeMap<String, u64> = Default::default();
        for segment in self.searcher.segment_readers() {
            let inverted = segment.inverted_index(self.plain)?;
            let mut stream = inverted.terms().search(&automaton).into_stream()?;
            while stream.advance() {
                if let Ok(text) = std::str::from_utf8(stream.key()) {
                    *found.entry(text.to_string()).or_default() +=
                        u64::from(stream.value().doc_freq);
                }
            }
        }
        Ok(found.into_iter().collect())
    }
}

/// Byte ranges of the words worth checking: runs of letters in chunks that
/// are not field queries, operators or patterns.
fn candidate_words(query: &str) -> Vec<(usize, usize)> {
    let mut words = Vec::new();
    let mut chunk_start = None;
    for (i, c) in query.char_indices().chain([(query.len(), ' ')]) {
        match (c.is_whitespace(), chunk_start) {
            (false, None) => chunk_start = Some(i),
            (true, Some(start)) => {
                words.extend(words_of_chunk(query, start, i));
                chunk_start = None;
            }
            _ => {}
        }
    }
    words
}

fn words_of_chunk(query: &str, start: usize, end: usize) -> Vec<(usize, usize)> {
    let chunk = &query[start..end];
    if chunk.contains([':', '*', '~', '^', '[', '{', '/']) || matches!(chunk, "AND" | "OR" | "NOT")
    {
        return Vec::new();
    }
    let mut words = Vec::new();
    let mut word_start = None;
    for (i, c) in chunk.char_indices().chain([(chunk.len(), ' ')]) {
        match (c.is_alphabetic(), word_start) {
            (true, None) => word_start = Some(i),
            (false, Some(s)) => {
                // Words glued to digits (`press4`) are ids, not typos.
                let glued = chunk[..s].ends_with(|c: char| c.is_ascii_digit())
                    || chunk[i..].starts_with(|c: char| c.is_ascii_digit());
                if !glued {
                    words.push((start + s, start + i));
                }
                word_start = None;
            }
            _ => {}
        }
    }
    words
}

#[cfg(test)]
mod tests {
    use super::*;

    fn words(query: &str) -> Vec<&str> {
        candidate_words(query)
            .into_iter()
            .map(|(s, e)| &query[s..e])
            .collect()
    }

    #[test]
    fn skips_fields_operators_and_ids() {
        assert_eq!(
            words("pump AND machine:press-4 \"hot oil\" press4 -noisy"),
            ["pump", "hot", "oil", "noisy"]
        );
        assert_eq!(words("élan vital*"), ["élan"]);
    }
}
