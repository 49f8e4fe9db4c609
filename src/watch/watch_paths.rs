//! Where a watcher's files live: a `watch` folder inside the index folder
//! (its socket, its lock and the markers it creates to know it has read
//! every earlier event), and the cursor file beside the index.

use std::path::{Path, PathBuf};

/// The files of the watcher of one index folder.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct WatchPaths {
    /// The `watch` folder.
    pub folder: PathBuf,
    /// Held locked by the running watcher.
    pub lock: PathBuf,
    /// The socket a search connects to.
    pub socket: PathBuf,
}

impl WatchPaths {
    /// Name of the watch folder inside the index folder.
    pub const FOLDER: &'static str = "watch";
    /// Name of the cursor file inside the index folder.
    pub const CURSOR_FILE: &'static str = "watch-cursor.json";
    /// Prefix of the cursor's temporary file while it is saved.
    pub const CURSOR_TEMP_PREFIX: &'static str = ".spoolsleuth-cursor-";
    /// Prefix of the marker files the watcher creates in its folder.
    pub const MARKER_PREFIX: &'static str = "marker-";

    /// The watcher files of the index in `index_dir`.
    pub fn new(index_dir: &Path) -> Self {
        let folder = index_dir.join(Self::FOLDER);
        WatchPaths {
            lock: folder.join("lock"),
            socket: folder.join("socket"),
            folder,
        }
    }

    /// The cursor file of the index in `index_dir`.
    pub fn cursor_file(index_dir: &Path) -> PathBuf {
        index_dir.join(Self::CURSOR_FILE)
    }

    /// True for a name in the index folder that belongs to watching.
    pub fn is_own_name(name: &str) -> bool {
        name == Self::FOLDER
            || name == Self::CURSOR_FILE
            || name.starts_with(Self::CURSOR_TEMP_PREFIX)
    }
}
