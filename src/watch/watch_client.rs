//! A search asking the watcher of its index what changed. Any failure (no
//! watcher, a stale socket, a slow or confused watcher, another folder) is
//! `None`, and the search then looks at every note as it would anyway.

use std::path::Path;

use super::{FolderIdentity, SyncReply, WatchCursor};

/// How long a search waits for the watcher before looking at every note
/// itself (an answer takes well under a millisecond; a stopped or swamped
/// watcher must not hold searches up for long).
#[cfg(unix)]
const ANSWER_TIMEOUT: std::time::Duration = std::time::Duration::from_millis(500);
/// The longest answer read (a list of at most 20 000 names and the links).
#[cfg(unix)]
const MAX_REPLY_BYTES: u64 = 64 * 1024 * 1024;

/// Ask the watcher of the index in `index_dir` which notes of `notes_dir`
/// changed since `cursor`.
pub fn ask_watcher(
    notes_dir: &Path,
    index_dir: &Path,
    cursor: Option<WatchCursor>,
) -> Option<SyncReply> {
    let reply = exchange(index_dir, cursor)?;
    let folder = FolderIdentity::of(notes_dir).ok()?;
    (reply.version == super::watch_protocol::PROTOCOL_VERSION && reply.folder == folder)
        .then_some(reply)
}

#[cfg(unix)]
fn exchange(index_dir: &Path, cursor: Option<WatchCursor>) -> Option<SyncReply> {
    use std::io::{BufRead, BufReader, Read, Write};
    use std::os::unix::net::UnixStream;

    use super::{SyncRequest, WatchPaths};

    let socket = WatchPaths::new(index_dir).socket;
    let mut stream = UnixStream::connect(&socket).ok()?;
    stream.set_read_timeout(Some(ANSWER_TIMEOUT)).ok()?;
    stream.set_write_timeout(Some(ANSWER_TIMEOUT)).ok()?;
    let request = SyncRequest {
        cursor,
        version: super::watch_protocol::PROTOCOL_VERSION,
    };
    let mut line = serde_json::to_vec(&request).ok()?;
    line.push(b'\n');
    stream.write_all(&line).ok()?;
    let mut reply = Vec::new();
    BufReader::new(stream.take(MAX_REPLY_BYTES))
        .read_until(b'\n', &mut reply)
        .ok()?;
    serde_json::from_slice(&reply).ok()
}

#[cfg(not(unix))]
fn exchange(_index_dir: &Path, _cursor: Option<WatchCursor>) -> Option<SyncReply> {
    None
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn no_watcher_means_no_answer() {
        let dir = tempfile::tempdir().unwrap();
        assert_eq!(ask_watcher(dir.path(), dir.path(), None), None);
    }

    #[cfg(unix)]
    #[test]
    fn a_stale_socket_or_a_garbled_answer_means_no_answer() {
        use std::io::{Read, Write};
        use std::os::unix::net::UnixListener;

        use super::super::WatchPaths;

        let dir = tempfile::tempdir().unwrap();
        let paths = WatchPaths::new(dir.path());
        std::fs::create_dir(&paths.folder).unwrap();
        drop(UnixListener::bind(&paths.socket).unwrap());
        assert_eq!(ask_watcher(dir.path(), dir.path(), None), None);

        std::fs::remove_file(&paths.socket).unwrap();
        let listener = UnixListener::bind(&paths.socket).unwrap();
        let server = std::thread::spawn(move || {
            let (mut stream, _) = listener.accept().unwrap();
            let mut byte = [0u8; 1];
            while stream.read(&mut byte).unwrap() == 1 && byte[0] != b'\n' {}
            stream.write_all(b"{\"answer\":\n").unwrap();
        });
        assert_eq!(ask_watcher(dir.path(), dir.path(), None), None);
        server.join().unwrap();
    }
}
