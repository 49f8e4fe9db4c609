//! Errors of starting or running a watcher. A search never sees these: when
//! no watcher answers, it looks at every note instead.

use std::path::PathBuf;

/// Why a watcher could not start or had to stop.
#[derive(Debug, thiserror::Error)]
pub enum WatchError {
    /// Another watcher already watches this index.
    #[error(
        "{path}: another 'spoolsleuth cases watch' already watches these notes; searches use it"
    )]
    AlreadyWatching {
        /// The watcher's lock file.
        path: PathBuf,
    },
    /// The built-in notes never change.
    #[error("the built-in demo notes never change, so there is nothing to watch; give your own folder with --cases DIR")]
    Embedded,
    /// The folder was removed or renamed while watched.
    #[error("{path}: the notes folder was removed or renamed; stopped watching (searches look at every note again)")]
    FolderGone {
        /// The notes folder.
        path: PathBuf,
    },
    /// The index folder, or the watcher's socket in it, was removed.
    #[error("{path}: the watcher's socket is gone (removed, or its index folder was); stopped watching (searches look at every note again)")]
    IndexGone {
        /// The socket.
        path: PathBuf,
    },
    /// Reading or writing a file, the socket or the kernel's watch failed.
    #[error("{path}: {source}")]
    Io {
        /// The file, folder or socket.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// The index lives in memory (its folder could not be written).
    #[error("the search index is kept in memory here, so there is no index folder to serve; choose a writable one with --index-dir")]
    MemoryIndex,
    /// Changes made on other machines are not seen on this one.
    #[error("{path}: the notes folder is on a {kind} file system, where changes made from other machines are not seen; searches look at every note instead")]
    NetworkFolder {
        /// The notes folder.
        path: PathBuf,
        /// What kind of file system it is.
        kind: &'static str,
    },
    /// A socket path longer than the system allows.
    #[error("{path}: the index folder's path is too long for a socket ({length} bytes, at most {limit}); choose a shorter one with --index-dir")]
    SocketPathTooLong {
        /// The socket path.
        path: PathBuf,
        /// Its length in bytes.
        length: usize,
        /// The longest allowed.
        limit: usize,
    },
    /// Not available on this operating system.
    #[error(
        "watching a folder needs Linux (inotify); on this system every search looks at every note"
    )]
    Unsupported,
}

impl WatchError {
    /// An I/O error on `path`.
    pub fn io(path: impl Into<PathBuf>, source: std::io::Error) -> Self {
        WatchError::Io {
            path: path.into(),
            source,
        }
    }
}
