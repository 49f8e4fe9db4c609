//! Where the index of a notes folder lives: in memory for the built-in demo
//! notes, else a folder given by the user or a cache folder per notes folder.

use std::path::{Path, PathBuf};

use super::{content_hash, IndexError, IndexResult};
use crate::notes::NotesFolder;

/// The place of an index.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum IndexLocation {
    /// A folder on disk that the index owns.
    Dir(PathBuf),
    /// In memory, rebuilt on each run (the built-in notes).
    Memory,
}

impl IndexLocation {
    /// The location for `folder`: `chosen` when given, else a cache folder
    /// named after a hash of the notes folder's absolute path.
    pub fn resolve(folder: &NotesFolder, chosen: Option<&Path>) -> IndexResult<Self> {
        let dir = match folder {
            NotesFolder::Embedded => return Ok(IndexLocation::Memory),
            NotesFolder::Disk(dir) => dir,
        };
        if let Some(chosen) = chosen {
            return Ok(IndexLocation::Dir(chosen.to_path_buf()));
        }
        let cache =
            directories::ProjectDirs::from("", "", "spoolsleuth").ok_or(IndexError::NoCacheDir)?;
        let absolute = std::fs::canonicalize(dir)
            .unwrap_or_else(|_| std::path::absolute(dir).unwrap_or_else(|_| dir.clone()));
        let name = format!(
            "index-{:016x}",
            content_hash(absolute.to_string_lossy().as_bytes())
        );
        Ok(IndexLocation::Dir(cache.cache_dir().join(name)))
    }
}
