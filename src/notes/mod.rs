//! Past case notes: one Markdown file per repair, with a YAML front matter of
//! our own field names. This folder owns the note model, parsing and
//! validation with file:line:column errors, ids, and the notes folder itself
//! (listing, reading and never-overwriting atomic writes).

mod demo_notes;
mod downtime;
mod front_matter;
mod note;
mod note_date;
mod note_draft;
mod note_editor;
mod note_id;
mod notes_error;
mod notes_folder;
mod reading;
mod vocabulary;

pub use downtime::Downtime;
pub use front_matter::FrontMatter;
pub use note::Note;
pub use note_date::NoteDate;
pub use note_draft::{DraftOrigin, NoteDraft};
pub use note_editor::NoteEditor;
pub use note_id::NoteId;
pub use notes_error::{NoteError, NotesError};
pub use notes_folder::{is_note_file_name, NoteFile, NotesFolder, MAX_NOTE_BYTES};
pub use reading::Reading;
pub use vocabulary::{nearest, CAUSE_IDS, SYMPTOM_IDS};

/// Result alias for this module.
pub type NotesResult<T> = Result<T, NotesError>;
