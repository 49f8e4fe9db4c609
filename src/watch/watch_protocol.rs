//! What a search and a watcher say to each other: one JSON line each way.
//! The cursor a search keeps beside the index is in the same shape.

use std::io::Write;
use std::path::Path;

use serde::{Deserialize, Serialize};

use super::WatchPaths;

/// Version of the exchange; a watcher and a search of different versions
/// do not use each other's answers.
pub const PROTOCOL_VERSION: u32 = 1;

/// How far an index is current with one watcher run: every change that run
/// recorded up to `seq` is in the index.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub struct WatchCursor {
    /// The watcher run.
    pub epoch: u64,
    /// The last change of that run already in the index.
    pub seq: u64,
}

impl WatchCursor {
    /// The cursor saved beside the index in `index_dir`, if any is readable.
    pub fn load(index_dir: &Path) -> Option<WatchCursor> {
        let text = std::fs::read(WatchPaths::cursor_file(index_dir)).ok()?;
        serde_json::from_slice(&text).ok()
    }

    /// Save this cursor beside the index, atomically. Call it only once the
    /// index holds every change up to the cursor.
    pub fn save(&self, index_dir: &Path) -> std::io::Result<()> {
        let mut temp = tempfile::Builder::new()
            .prefix(WatchPaths::CURSOR_TEMP_PREFIX)
            .tempfile_in(index_dir)?;
        temp.write_all(&serde_json::to_vec(self).map_err(std::io::Error::other)?)?;
        temp.persist(WatchPaths::cursor_file(index_dir))
            .map_err(|e| e.error)?;
        Ok(())
    }
}

/// The notes folder a watcher watches, as the file system knows it (device
/// and inode), so that a search never takes the answer about another
/// folder of the same name.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub struct FolderIdentity {
    /// Device number.
    pub dev: u64,
    /// Inode number.
    pub ino: u64,
}

impl FolderIdentity {
    /// The identity of the folder at `path` now.
    pub fn of(path: &Path) -> std::io::Result<FolderIdentity> {
        identity(path)
    }
}

#[cfg(unix)]
fn identity(path: &Path) -> std::io::Result<FolderIdentity> {
    use std::os::unix::fs::MetadataExt;
    let metadata = std::fs::metadata(path)?;
    Ok(FolderIdentity {
        dev: metadata.dev(),
        ino: metadata.ino(),
    })
}

#[cfg(not(unix))]
fn identity(_path: &Path) -> std::io::Result<FolderIdentity> {
    Err(std::io::ErrorKind::Unsupported.into())
}

/// A search asks what changed since its cursor.
#[derive(Clone, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub struct SyncRequest {
    /// The index's cursor, if it has one.
    pub cursor: Option<WatchCursor>,
    /// [`PROTOCOL_VERSION`].
    pub version: u32,
}

/// What changed, or that the watcher cannot say.
#[derive(Clone, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case", tag = "kind")]
pub enum WatchAnswer {
    /// Look at every note (the cursor is from another run, from before lost
    /// events, or too much changed).
    Rescan,
    /// Only these names need a look.
    Names {
        /// Notes written, created, renamed or removed since the cursor.
        changed: Vec<String>,
        /// Notes whose changes may not be seen (links, several names):
        /// compare their size and time as a full check would.
        linked: Vec<String>,
    },
}

/// The watcher's answer.
#[derive(Clone, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub struct SyncReply {
    /// What to look at.
    pub answer: WatchAnswer,
    /// The cursor to save once the index holds those changes.
    pub cursor: WatchCursor,
    /// The folder watched.
    pub folder: FolderIdentity,
    /// [`PROTOCOL_VERSION`].
    pub version: u32,
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_saved_cursor_is_loaded_back_and_a_damaged_one_is_none() {
        let dir = tempfile::tempdir().unwrap();
        assert_eq!(WatchCursor::load(dir.path()), None);
        let cursor = WatchCursor { epoch: 42, seq: 7 };
        cursor.save(dir.path()).unwrap();
        assert_eq!(WatchCursor::load(dir.path()), Some(cursor));
        std::fs::write(WatchPaths::cursor_file(dir.path()), "{\"epoch\":4").unwrap();
        assert_eq!(WatchCursor::load(dir.path()), None);
    }

    #[test]
    fn replies_have_a_stable_shape() {
        let reply = SyncReply {
            answer: WatchAnswer::Names {
                changed: vec!["a.md".into()],
                linked: vec![],
            },
            cursor: WatchCursor { epoch: 1, seq: 2 },
            folder: FolderIdentity { dev: 3, ino: 4 },
            version: PROTOCOL_VERSION,
        };
        let line = serde_json::to_string(&reply).unwrap();
        assert_eq!(
            line,
            r#"{"answer":{"kind":"names","changed":["a.md"],"linked":[]},"cursor":{"epoch":1,"seq":2},"folder":{"dev":3,"ino":4},"version":1}"#
        );
        assert_eq!(serde_json::from_str::<SyncReply>(&line).unwrap(), reply);
    }
}
