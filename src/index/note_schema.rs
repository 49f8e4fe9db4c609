//! The tantivy schema of the notes index and the mapping of a note to a
//! document.

use tantivy::schema::{
    Field, IndexRecordOption, NumericOptions, Schema, TextFieldIndexing, TextOptions, STORED,
    STRING,
};
use tantivy::TantivyDocument;

use super::{EN_ANALYZER, PLAIN_ANALYZER};
use crate::notes::Note;

/// Version of the schema, analyzers, synonym lists and manifest layout
/// together; an index written with another version is rebuilt. (2: the
/// manifest opens with a summary, so a search that a watcher has told
/// "nothing changed" need not read every note's record.)
pub const SCHEMA_VERSION: u32 = 2;

/// The fields of the notes index.
#[derive(Clone, Debug)]
pub struct NoteSchema {
    /// Free text of the note (stored, for snippets).
    pub body: Field,
    /// Cause id (exact, stored).
    pub cause: Field,
    /// Date as `YYYYMMDD` (indexed, fast, stored).
    pub date: Field,
    /// Parts and readings (stemmed, not stored).
    pub details: Field,
    /// Downtime in minutes (stored; absent when not recorded).
    pub downtime: Field,
    /// The fix, with parts (stemmed, stored).
    pub fix: Field,
    /// Note id (exact, stored).
    pub id: Field,
    /// Machine id (exact, stored).
    pub machine: Field,
    /// Every word unstemmed, for typo correction (not stored).
    pub plain: Field,
    /// The tantivy schema.
    pub schema: Schema,
    /// Symptom ids (exact, stored, several per note).
    pub symptom: Field,
    /// Machine, symptom and cause ids as words (stemmed, not stored).
    pub tags: Field,
    /// One-line complaint (stemmed, stored).
    pub title: Field,
}

impl NoteSchema {
    /// Build the schema.
    pub fn new() -> Self {
        let mut builder = Schema::builder();
        let stemmed = |stored: bool| {
            let indexing = TextFieldIndexing::default()
                .set_tokenizer(EN_ANALYZER)
                .set_index_option(IndexRecordOption::WithFreqsAndPositions);
            let options = TextOptions::default().set_indexing_options(indexing);
            if stored {
                options.set_stored()
            } else {
                options
            }
        };
        let plain = TextOptions::default().set_indexing_options(
            TextFieldIndexing::default()
                .set_tokenizer(PLAIN_ANALYZER)
                .set_index_option(IndexRecordOption::WithFreqs),
        );
        let id = builder.add_text_field("id", STRING | STORED);
        let date = builder.add_u64_field(
            "date",
            NumericOptions::default()
                .set_indexed()
                .set_fast()
                .set_stored(),
        );
        let machine = builder.add_text_field("machine", STRING | STORED);
        let symptom = builder.add_text_field("symptom", STRING | STORED);
        let cause = builder.add_text_field("cause", STRING | STORED);
        let downtime = builder.add_u64_field("downtime", STORED);
        let title = builder.add_text_field("title", stemmed(true));
        let body = builder.add_text_field("body", stemmed(true));
        let fix = builder.add_text_field("fix", stemmed(true));
        let details = builder.add_text_field("details", stemmed(false));
        let tags = builder.add_text_field("tags", stemmed(false));
        let plain = builder.add_text_field("plain", plain);
        NoteSchema {
            body,
            cause,
            date,
            details,
            downtime,
            fix,
            id,
            machine,
            plain,
            schema: builder.build(),
            symptom,
            tags,
            title,
        }
    }

    /// The document for a note.
    pub fn document(&self, note: &Note) -> TantivyDocument {
        let mut doc = TantivyDocument::new();
        doc.add_text(self.id, note.id.as_str());
        doc.add_u64(self.date, note.date.ordinal());
        doc.add_text(self.machine, &note.machine);
        for symptom in &note.symptoms {
            doc.add_text(self.symptom, symptom);
        }
        doc.add_text(self.cause, &note.cause);
        if let Some(downtime) = note.downtime {
            doc.add_u64(self.downtime, downtime.minutes());
        }
        doc.add_text(self.title, &note.title);
        doc.add_text(self.body, &note.text);
        doc.add_text(self.fix, &note.fix);
        let details = note
            .parts
            .iter()
            .cloned()
            .chain(note.readings.iter().map(ToString::to_string))
            .collect::<Vec<_>>()
            .join("\n");
        doc.add_text(self.details, &details);
        let tags = std::iter::once(note.machine.as_str())
            .chain(note.symptoms.iter().map(String::as_str))
            .chain([note.cause.as_str()])
            .map(|id| id.replace('-', " "))
            .collect::<Vec<_>>()
            .join("\n");
        doc.add_text(self.tags, &tags);
        for text in [&note.title, &note.text, &note.fix, &details, &tags] {
            doc.add_text(self.plain, text);
        }
        doc
    }
}

impl Default for NoteSchema {
    fn default() -> Self {
        Self::new()
    }
}
