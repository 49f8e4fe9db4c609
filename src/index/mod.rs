//! The search index of the case notes: a tantivy index derived from the
//! notes folder, kept current on every use. This folder owns the schema, the
//! analyzers (stemming, the trade's synonyms, an unstemmed field for typos),
//! the manifest of indexed files, and syncing or rebuilding.

mod analyzers;
mod content_hash;
mod index_error;
mod index_location;
mod manifest;
mod note_index;
mod note_schema;
mod sync_report;
mod synonym_filter;

pub use analyzers::{query_tokenizers, register_index_analyzers, EN_ANALYZER, PLAIN_ANALYZER};
pub use content_hash::content_hash;
pub use index_error::IndexError;
pub use index_location::IndexLocation;
pub use manifest::{
    read_manifest_bytes, IndexFingerprint, Manifest, ManifestEntry, ManifestProblem,
    ManifestSummary, ManifestView, ManifestWriter, NoteRecord, MANIFEST_FILE,
};
pub use note_index::{NoteIndex, WRITER_MEMORY_BUDGET};
pub use note_schema::{NoteSchema, SCHEMA_VERSION};
pub use sync_report::SyncReport;
pub use synonym_filter::{is_trade_word, rewrite_phrases, SynonymFilter};

/// Result alias for this module.
pub type IndexResult<T> = Result<T, IndexError>;
