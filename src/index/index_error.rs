//! Errors of the index module.

use std::path::PathBuf;

use crate::notes::NotesError;

/// Any error while opening, syncing or rebuilding the index.
#[derive(Debug, thiserror::Error)]
pub enum IndexError {
    /// No cache folder is known for this user.
    #[error("cannot find a cache folder for the index; choose one with --index-dir DIR or SPOOLSLEUTH_INDEX_DIR")]
    NoCacheDir,
    /// The index folder holds files spoolsleuth did not write.
    #[error("{path}: refusing to keep an index in a folder that holds other files ('{example}'); choose an empty folder with --index-dir")]
    ForeignFolder {
        /// The folder.
        path: PathBuf,
        /// One of the files found there.
        example: String,
    },
    /// Reading or writing a file of the index failed.
    #[error("{path}: {source}")]
    Io {
        /// The file or folder.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// The notes folder could not be read.
    #[error(transparent)]
    Notes(#[from] NotesError),
    /// tantivy failed in a way that a rebuild did not cure.
    #[error("{path}: search index error: {source}")]
    Tantivy {
        /// The index folder (or `memory` for the built-in notes).
        path: PathBuf,
        /// The cause.
        source: tantivy::TantivyError,
    },
}

impl IndexError {
    /// An I/O error on `path`.
    pub fn io(path: impl Into<PathBuf>, source: std::io::Error) -> Self {
        IndexError::Io {
            path: path.into(),
            source,
        }
    }
}
