//! The fields of a note as stored in the index, read back from a document.

use tantivy::schema::{Field, Value};
use tantivy::{DocAddress, Searcher, TantivyDocument};

use crate::index::NoteSchema;
use crate::notes::{Downtime, NoteDate};

/// The stored summary of one indexed note.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct StoredNote {
    /// Cause id.
    pub cause: String,
    /// Date (absent only if the index holds a bad value).
    pub date: Option<NoteDate>,
    /// Downtime, when recorded.
    pub downtime: Option<Downtime>,
    /// Note id.
    pub id: String,
    /// Machine id.
    pub machine: String,
    /// Symptom ids.
    pub symptoms: Vec<String>,
    /// One-line complaint.
    pub title: String,
}

impl StoredNote {
    /// Read the note stored at `address`.
    pub fn load(
        searcher: &Searcher,
        schema: &NoteSchema,
        address: DocAddress,
    ) -> tantivy::Result<(Self, TantivyDocument)> {
        let doc: TantivyDocument = searcher.doc(address)?;
        let text = |field: Field| {
            doc.get_first(field)
                .and_then(|v| v.as_str())
                .unwrap_or_default()
                .to_string()
        };
        let note = StoredNote {
            cause: text(schema.cause),
            date: doc
                .get_first(schema.date)
                .and_then(|v| v.as_u64())
                .and_then(NoteDate::from_ordinal),
            downtime: doc
                .get_first(schema.downtime)
                .and_then(|v| v.as_u64())
                .map(Downtime::from_minutes),
            id: text(schema.id),
            machine: text(schema.machine),
            symptoms: doc
                .get_all(schema.symptom)
                .filter_map(|v| v.as_str().map(str::to_string))
                .collect(),
            title: text(schema.title),
        };
        Ok((note, doc))
    }

    /// The date as text, or `?` when unknown.
    pub fn date_text(&self) -> String {
        self.date.map_or_else(|| "?".to_string(), |d| d.to_string())
    }
}
