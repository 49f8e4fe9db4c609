//! Errors of the notes module: a problem inside one note (with its place) and
//! problems with the notes folder.

use std::fmt;
use std::path::PathBuf;

/// A problem inside one note, at a line and column of its file.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct NoteError {
    /// Column (1-based) of the fault, 0 when only the line is known.
    pub column: usize,
    /// Line (1-based) of the fault in the whole file.
    pub line: usize,
    /// What is wrong, lowercase, no trailing period.
    pub message: String,
    /// The file as the user named it.
    pub path: PathBuf,
}

impl NoteError {
    /// A problem at `line:column` of `path`.
    pub fn new(
        path: impl Into<PathBuf>,
        line: usize,
        column: usize,
        message: impl Into<String>,
    ) -> Self {
        NoteError {
            column,
            line,
            message: message.into(),
            path: path.into(),
        }
    }
}

impl fmt::Display for NoteError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let path = self.path.display();
        match (self.line, self.column) {
            (0, _) => write!(f, "{path}: {}", self.message),
            (line, 0) => write!(f, "{path}:{line}: {}", self.message),
            (line, column) => write!(f, "{path}:{line}:{column}: {}", self.message),
        }
    }
}

impl std::error::Error for NoteError {}

/// Any error of the notes module.
#[derive(Debug, thiserror::Error)]
pub enum NotesError {
    /// A note file name that is not a plain name inside the notes folder.
    #[error("'{name}' is not a note file of the notes folder: a note is read only from the folder itself")]
    BadName {
        /// The name given.
        name: String,
    },
    /// A note id that could not name a file of the notes folder.
    #[error("'{id}' is not a note id: an id is a file name of the notes folder without '.md', with no '/' or '..'")]
    BadId {
        /// The id given.
        id: String,
    },
    /// The demo notes are built into the binary and cannot be changed.
    #[error("the built-in demo notes are read-only; choose a notes folder with --cases DIR or SPOOLSLEUTH_CASES")]
    EmbeddedReadOnly,
    /// The note in the editor was abandoned; the draft is kept.
    #[error("no note added; your draft is kept at {draft}")]
    EditAborted {
        /// Where the draft is.
        draft: PathBuf,
    },
    /// The editor could not be started or failed.
    #[error("cannot run the editor '{editor}': {message}")]
    Editor {
        /// The editor command.
        editor: String,
        /// What went wrong.
        message: String,
    },
    /// A JSON diagnosis file could not be used.
    #[error("{path}: {message}")]
    Json {
        /// The file.
        path: PathBuf,
        /// What is wrong (with line and column when known).
        message: String,
    },
    /// A note is malformed.
    #[error(transparent)]
    Note(#[from] NoteError),
    /// No note has this id; the nearest id is suggested.
    #[error("no note with id '{id}'{}", suggestion.as_ref().map(|s| format!(" (did you mean '{s}'?)")).unwrap_or_default())]
    NotFound {
        /// The id asked for.
        id: String,
        /// The nearest existing id.
        suggestion: Option<String>,
    },
    /// A file or folder could not be read or written.
    #[error("{path}: {source}")]
    Io {
        /// The file or folder.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// A note file that is not read: too large, not UTF-8, or a link that
    /// leads out of the notes folder. A search skips it with a warning.
    #[error("{path}: {reason}")]
    Unreadable {
        /// The note file.
        path: PathBuf,
        /// Why it is not read.
        reason: String,
    },
    /// An option given to `cases add` is not valid.
    #[error("{option}: {message}")]
    Option {
        /// The option, e.g. `--date`.
        option: String,
        /// What is wrong.
        message: String,
    },
}

impl NotesError {
    /// An I/O error on `path`.
    pub fn io(path: impl Into<PathBuf>, source: std::io::Error) -> Self {
        NotesError::Io {
            path: path.into(),
            source,
        }
    }
}
