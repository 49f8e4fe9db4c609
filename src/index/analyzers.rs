//! The text analyzers: English with stemming and synonyms for ranking, and a
//! plain lowercased one whose term dictionary serves typo correction. Queries
//! use the same chains without the synonym filter, because the index already
//! holds every synonym at each position.

use tantivy::tokenizer::{
    Language, LowerCaser, RemoveLongFilter, SimpleTokenizer, Stemmer, TextAnalyzer,
    TokenizerManager,
};
use tantivy::Index;

use super::SynonymFilter;

/// Name of the stemmed English analyzer.
pub const EN_ANALYZER: &str = "spoolsleuth_en";
/// Name of the unstemmed analyzer.
pub const PLAIN_ANALYZER: &str = "spoolsleuth_plain";

/// Longer tokens are dropped: they are pasted data, not words.
const MAX_TOKEN_BYTES: usize = 40;

/// Register the indexing analyzers on an index; tantivy does not store them,
/// so this follows every open.
pub fn register_index_analyzers(index: &Index) {
    let manager = index.tokenizers();
    manager.register(
        EN_ANALYZER,
        TextAnalyzer::builder(SimpleTokenizer::default())
            .filter(RemoveLongFilter::limit(MAX_TOKEN_BYTES))
            .filter(LowerCaser)
            .filter(SynonymFilter)
            .filter(Stemmer::new(Language::English))
            .build(),
    );
    manager.register(
        PLAIN_ANALYZER,
        TextAnalyzer::builder(SimpleTokenizer::default())
            .filter(RemoveLongFilter::limit(MAX_TOKEN_BYTES))
            .filter(LowerCaser)
            .filter(SynonymFilter)
            .build(),
    );
}

/// The analyzers for parsing queries: the same names, without synonyms.
pub fn query_tokenizers() -> TokenizerManager {
    let manager = TokenizerManager::default();
    manager.register(
        EN_ANALYZER,
        TextAnalyzer::builder(SimpleTokenizer::default())
            .filter(RemoveLongFilter::limit(MAX_TOKEN_BYTES))
            .filter(LowerCaser)
            .filter(Stemmer::new(Language::English))
            .build(),
    );
    manager.register(
        PLAIN_ANALYZER,
        TextAnalyzer::builder(SimpleTokenizer::default())
            .filter(RemoveLongFilter::limit(MAX_TOKEN_BYTES))
            .filter(LowerCaser)
            .build(),
    );
    manager
}
