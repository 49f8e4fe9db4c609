//! Watching a notes folder so that searches need not look at every note.
//!
//! Without a watcher, every search compares the size and time of each note
//! file with the index's manifest: correct, but on 100 000 notes that alone
//! costs a third of a second. `spoolsleuth cases watch` runs a
//! [`FolderWatcher`]: it holds an inotify watch on the notes folder, keeps a
//! [`ChangeLog`] of the note names written, created, renamed or removed, and
//! answers each search over a socket in the index folder with the names
//! changed since the search's [`WatchCursor`] (kept beside the index).
//!
//! Correctness rests on three things. Before answering, the watcher creates
//! a marker file in a folder it watches and reads events up to that
//! marker's, so every write that finished before the search asked is in the
//! answer (inotify queues events in order). Anything it cannot vouch for (a
//! cursor of another watcher or from before a queue overflow, too many
//! changes) is answered with "look at every note", and with no watcher at
//! all the search does exactly that. Notes that are links, or files with
//! other names elsewhere, are reported as "check these each time" because
//! their changes may not pass through the folder.

mod change_log;
mod folder_watcher;
mod watch_client;
mod watch_error;
mod watch_paths;
mod watch_protocol;

pub use change_log::ChangeLog;
pub use folder_watcher::{FolderWatcher, WatchStarted};
pub use watch_client::ask_watcher;
pub use watch_error::WatchError;
pub use watch_paths::WatchPaths;
pub use watch_protocol::{FolderIdentity, SyncReply, SyncRequest, WatchAnswer, WatchCursor};

/// Result alias for this module.
pub type WatchResult<T> = Result<T, WatchError>;
