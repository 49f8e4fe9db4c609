//! The watcher process's work: hold an inotify watch on the notes folder,
//! record the note names that change, and answer searches on a socket in
//! the index folder. Linux only; elsewhere starting one is an error and
//! every search looks at every note.

use std::path::{Path, PathBuf};
use std::sync::atomic::AtomicBool;

use super::WatchResult;

/// What a started watcher found.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct WatchStarted {
    /// Notes that are links or have other names: checked on every search.
    pub linked: usize,
    /// Note files in the folder when watching began.
    pub notes: usize,
    /// The socket searches connect to.
    pub socket: PathBuf,
}

/// A running watch on one notes folder, serving one index folder.
pub struct FolderWatcher {
    #[cfg(target_os = "linux")]
    inner: linux::Watcher,
}

impl std::fmt::Debug for FolderWatcher {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_struct("FolderWatcher").finish_non_exhaustive()
    }
}

impl FolderWatcher {
    /// Start watching `notes_dir` for the index in `index_dir`: take the
    /// watcher's lock, watch the folder, note its links, open the socket.
    pub fn start(notes_dir: &Path, index_dir: &Path) -> WatchResult<(FolderWatcher, WatchStarted)> {
        #[cfg(target_os = "linux")]
        {
            let (inner, started) = linux::Watcher::start(notes_dir, index_dir)?;
            Ok((FolderWatcher { inner }, started))
        }
        #[cfg(not(target_os = "linux"))]
        {
            let _ = (notes_dir, index_dir);
            Err(super::WatchError::Unsupported)
        }
    }

    /// Record changes and answer searches until `stop` is set (checked
    /// four times a second) or the folder goes away. The socket is removed
    /// when this returns.
    pub fn run(self, stop: &AtomicBool) -> WatchResult<()> {
        #[cfg(target_os = "linux")]
        {
            self.inner.run(stop)
        }
        #[cfg(not(target_os = "linux"))]
        {
            let _ = stop;
            Err(super::WatchError::Unsupported)
        }
    }
}

#[cfg(target_os = "linux")]
mod linux {
    use std::collections::hash_map::RandomState;
    use std::fs::{self, File, OpenOptions};
    use std::hash::{BuildHasher, Hasher};
    use std::io::{BufRead, BufReader, ErrorKind, Read, Write};
    use std::mem::MaybeUninit;
    use std::os::fd::{AsFd, OwnedFd};
    use std::os::unix::fs::MetadataExt;
    use std::os::unix::net::{UnixListener, UnixStream};
    use std::path::{Path, PathBuf};
    use std::sync::atomic::{AtomicBool, Ordering};
    use std::time::{Duration, SystemTime, UNIX_EPOCH};

    use fs4::fs_std::FileExt;
    use rustix::event::{poll, PollFd, PollFlags, Timespec};
    use rustix::fs::inotify::{self, CreateFlags, ReadFlags, WatchFlags};
    use rustix::io::Errno;

    use super::super::{
        ChangeLog, FolderIdentity, SyncReply, SyncRequest, WatchError, WatchPaths, WatchResult,
    };
    use super::WatchStarted;
    use crate::notes::is_note_file_name;

    /// Longest socket path the system takes (`sun_path` less its NUL).
    const SOCKET_PATH_LIMIT: usize = 107;
    /// How often the stop flag is looked at.
    const STOP_CHECK: Duration = Duration::from_millis(250);
    /// How long a search may take to ask, and the watcher to read up to its
    /// marker, before the exchange is dropped (the search then looks at
    /// every note). An answer takes well under a millisecond.
    const EXCHANGE_TIMEOUT: Duration = Duration::from_millis(500);
    /// The longest request read.
    const MAX_REQUEST_BYTES: u64 = 64 * 1024;
    /// Room for a few hundred events per read.
    const EVENT_BUFFER_BYTES: usize = 64 * 1024;

    /// File systems whose changes can come from other machines, where the
    /// kernel sees only local writes (magic numbers from `statfs(2)`).
    const NETWORK_FILE_SYSTEMS: [(u64, &str); 10] = [
        (0x6969, "NFS"),
        (0x517B, "SMB"),
        (0xFF53_4D42, "CIFS"),
        (0xFE53_4D42, "SMB2"),
        (0x6573_5546, "FUSE"),
        (0x7375_7245, "Coda"),
        (0x5346_414F, "AFS"),
        (0x0102_1997, "9P"),
        (0x00C3_6400, "Ceph"),
        (0x0116_1970, "GFS2"),
    ];

    /// Which watched folder went away.
    #[derive(Clone, Copy, Debug)]
    enum Gone {
        /// The notes folder.
        Notes,
        /// The watch folder inside the index folder.
        WatchFolder,
    }

    /// One kernel event, copied out of the read buffer.
    struct Event {
        flags: ReadFlags,
        name: Option<String>,
        wd: i32,
    }

    pub(super) struct Watcher {
        buffer: Vec<MaybeUninit<u8>>,
        folder: FolderIdentity,
        /// Set when a watched folder went away.
        gone: Option<Gone>,
        inotify: OwnedFd,
        listener: UnixListener,
        _lock: File,
        log: ChangeLog,
        marker_wd: i32,
        next_marker: u64,
        notes_dir: PathBuf,
        notes_wd: i32,
        paths: WatchPaths,
        seen_marker: Option<u64>,
        /// The socket file as bound, to notice it removed or replaced.
        socket_inode: u64,
    }

    impl Watcher {
        pub(super) fn start(
            notes_dir: &Path,
            index_dir: &Path,
        ) -> WatchResult<(Self, WatchStarted)> {
            refuse_network_folder(notes_dir)?;
            let folder = FolderIdentity::of(notes_dir).map_err(|e| WatchError::io(notes_dir, e))?;
            let paths = WatchPaths::new(index_dir);
            let length = paths.socket.as_os_str().len();
            if length > SOCKET_PATH_LIMIT {
                return Err(WatchError::SocketPathTooLong {
                    path: paths.socket.clone(),
                    length,
                    limit: SOCKET_PATH_LIMIT,
                });
            }
            fs::create_dir_all(&paths.folder).map_err(|e| WatchError::io(&paths.folder, e))?;
            let lock = take_lock(&paths.lock)?;
            // Ours now: whatever a killed watcher left behind goes.
            remove_leftovers(&paths)?;
            let inotify = inotify::init(CreateFlags::CLOEXEC | CreateFlags::NONBLOCK)
                .map_err(|e| WatchError::io(notes_dir, e.into()))?;
            let notes_wd = inotify::add_watch(
                &inotify,
                notes_dir,
                WatchFlags::MODIFY
                    | WatchFlags::ATTRIB
                    | WatchFlags::CLOSE_WRITE
                    | WatchFlags::CREATE
                    | WatchFlags::DELETE
                    | WatchFlags::MOVED_FROM
                    | WatchFlags::MOVED_TO
                    | WatchFlags::DELETE_SELF
                    | WatchFlags::MOVE_SELF
                    | WatchFlags::ONLYDIR,
            )
            .map_err(|e| WatchError::io(notes_dir, e.into()))?;
            let marker_wd = inotify::add_watch(
                &inotify,
                &paths.folder,
                WatchFlags::CREATE | WatchFlags::ONLYDIR,
            )
            .map_err(|e| WatchError::io(&paths.folder, e.into()))?;
            let listener =
                UnixListener::bind(&paths.socket).map_err(|e| WatchError::io(&paths.socket, e))?;
            listener
                .set_nonblocking(true)
                .map_err(|e| WatchError::io(&paths.socket, e))?;
            let socket_inode = fs::symlink_metadata(&paths.socket)
                .map_err(|e| WatchError::io(&paths.socket, e))?
                .ino();
            let mut watcher = Watcher {
                buffer: vec![MaybeUninit::uninit(); EVENT_BUFFER_BYTES],
                folder,
                gone: None,
                inotify,
                listener,
                _lock: lock,
                log: ChangeLog::new(new_epoch()),
                marker_wd,
                next_marker: 0,
                notes_dir: notes_dir.to_path_buf(),
                notes_wd,
                paths,
                seen_marker: None,
                socket_inode,
            };
            // Listed after the watch began, so a link made meanwhile is
            // seen either here or as an event.
            let (notes, linked) = watcher.find_links()?;
            let started = WatchStarted {
                linked,
                notes,
                socket: watcher.paths.socket.clone(),
            };
            Ok((watcher, started))
        }

        pub(super) fn run(mut self, stop: &AtomicBool) -> WatchResult<()> {
            let tick = timespec(STOP_CHECK);
            while !stop.load(Ordering::Relaxed) {
                let mut fds = [
                    PollFd::new(&self.inotify, PollFlags::IN),
                    PollFd::new(&self.listener, PollFlags::IN),
                ];
                match poll(&mut fds, Some(&tick)) {
                    Ok(_) | Err(Errno::INTR) => {}
                    Err(e) => return Err(WatchError::io(&self.notes_dir, e.into())),
                }
                self.drain()?;
                self.look_for_removal();
                self.stop_if_gone()?;
                loop {
                    match self.listener.accept() {
                        // A search that hangs up or garbles its question
                        // looks at every note; the watcher goes on.
                        Ok((stream, _)) => {
                            let _ = self.serve(stream);
                        }
                        Err(e) if e.kind() == ErrorKind::WouldBlock => break,
                        Err(e) if e.kind() == ErrorKind::Interrupted => {}
                        Err(e) => return Err(WatchError::io(&self.paths.socket, e)),
                    }
                    self.stop_if_gone()?;
                }
            }
            Ok(())
        }

        /// Notice a notes folder or socket removed while something still
        /// holds it open. The kernel reports a folder's removal only once
        /// nothing refers to it: a shell whose working folder it is keeps
        /// the notes folder, and the bound socket and the held lock keep
        /// the watch folder, so their paths are looked at on every tick.
        fn look_for_removal(&mut self) {
            if FolderIdentity::of(&self.notes_dir).ok() != Some(self.folder) {
                self.gone = Some(Gone::Notes);
            } else if fs::symlink_metadata(&self.paths.socket)
                .map(|m| m.ino())
                .ok()
                != Some(self.socket_inode)
            {
                self.gone = Some(Gone::WatchFolder);
            }
        }

        /// The error to stop with when a watched folder went away.
        fn stop_if_gone(&self) -> WatchResult<()> {
            match self.gone {
                None => Ok(()),
                Some(Gone::Notes) => Err(WatchError::FolderGone {
                    path: self.notes_dir.clone(),
                }),
                Some(Gone::WatchFolder) => Err(WatchError::IndexGone {
                    path: self.paths.socket.clone(),
                }),
            }
        }

        /// Answer one search: read its cursor, read every event up to a
        /// marker created now, reply with what changed since the cursor.
        fn serve(&mut self, stream: UnixStream) -> WatchResult<()> {
            let socket = self.paths.socket.clone();
            let io = |e| WatchError::io(&socket, e);
            stream.set_nonblocking(false).map_err(io)?;
            stream
                .set_read_timeout(Some(EXCHANGE_TIMEOUT))
                .map_err(io)?;
            stream
                .set_write_timeout(Some(EXCHANGE_TIMEOUT))
                .map_err(io)?;
            let mut line = Vec::new();
            BufReader::new((&stream).take(MAX_REQUEST_BYTES))
                .read_until(b'\n', &mut line)
                .map_err(io)?;
            let request: SyncRequest =
                serde_json::from_slice(&line).map_err(|e| io(std::io::Error::other(e)))?;
            if !self.read_to_marker()? {
                return Ok(());
            }
            let reply = SyncReply {
                answer: self.log.answer(request.cursor),
                cursor: self.log.cursor(),
                folder: self.folder,
                version: super::super::watch_protocol::PROTOCOL_VERSION,
            };
            let mut out = serde_json::to_vec(&reply).map_err(|e| io(std::io::Error::other(e)))?;
            out.push(b'\n');
            (&stream).write_all(&out).map_err(io)
        }

        /// Create a marker file in the watch folder and read events until
        /// its creation comes through: inotify keeps one queue in order, so
        /// every change that finished before the marker has been recorded.
        /// False when the marker did not come through in time or the folder
        /// went away.
        fn read_to_marker(&mut self) -> WatchResult<bool> {
            let number = self.next_marker;
            self.next_marker += 1;
            let marker = self
                .paths
                .folder
                .join(format!("{}{number}", WatchPaths::MARKER_PREFIX));
            File::create(&marker).map_err(|e| WatchError::io(&marker, e))?;
            fs::remove_file(&marker).map_err(|e| WatchError::io(&marker, e))?;
            let wait = timespec(EXCHANGE_TIMEOUT);
            loop {
                self.drain()?;
                if self.gone.is_some() {
                    return Ok(false);
                }
                if self.seen_marker.is_some_and(|seen| seen >= number) {
                    return Ok(true);
                }
                let mut fds = [PollFd::new(&self.inotify, PollFlags::IN)];
                match poll(&mut fds, Some(&wait)) {
                    Ok(0) => return Ok(false),
                    Ok(_) | Err(Errno::INTR) => {}
                    Err(e) => return Err(WatchError::io(&self.notes_dir, e.into())),
                }
            }
        }

        /// Read and record every queued event.
        fn drain(&mut self) -> WatchResult<()> {
            let mut events = Vec::new();
            let mut reader = inotify::Reader::new(self.inotify.as_fd(), &mut self.buffer);
            loop {
                match reader.next() {
                    Ok(event) => events.push(Event {
                        flags: event.events(),
                        name: event
                            .file_name()
                            .and_then(|n| n.to_str().ok())
                            .map(str::to_string),
                        wd: event.wd(),
                    }),
                    Err(Errno::AGAIN) => break,
                    Err(Errno::INTR) => {}
                    Err(e) => return Err(WatchError::io(&self.notes_dir, e.into())),
                }
            }
            for event in events {
                self.record(event)?;
            }
            Ok(())
        }

        fn record(&mut self, event: Event) -> WatchResult<()> {
            if event.flags.contains(ReadFlags::QUEUE_OVERFLOW) {
                // Events were lost: older cursors mean "look at every note",
                // and links made meanwhile are looked for again.
                self.log.forget();
                self.find_links()?;
                return Ok(());
            }
            if event.wd == self.marker_wd {
                let number = event.name.as_deref().and_then(|n| {
                    n.strip_prefix(WatchPaths::MARKER_PREFIX)?
                        .parse::<u64>()
                        .ok()
                });
                if let Some(number) = number {
                    self.seen_marker = self.seen_marker.max(Some(number));
                }
                if event
                    .flags
                    .intersects(ReadFlags::IGNORED | ReadFlags::UNMOUNT)
                {
                    self.gone = Some(Gone::WatchFolder);
                }
                return Ok(());
            }
            if event.wd != self.notes_wd {
                return Ok(());
            }
            if event.flags.intersects(
                ReadFlags::DELETE_SELF
                    | ReadFlags::MOVE_SELF
                    | ReadFlags::IGNORED
                    | ReadFlags::UNMOUNT,
            ) {
                self.gone = Some(Gone::Notes);
                return Ok(());
            }
            if let Some(name) = event.name.filter(|n| is_note_file_name(n)) {
                self.log.record(&name);
                let linked =
                    fs::symlink_metadata(self.notes_dir.join(&name)).is_ok_and(|m| is_linked(&m));
                self.log.check_always(&name, linked);
            }
            Ok(())
        }

        /// Count the notes and mark those that are links or have other
        /// names: their changes may not pass through this folder.
        fn find_links(&mut self) -> WatchResult<(usize, usize)> {
            let dir = &self.notes_dir;
            let (mut notes, mut linked) = (0, 0);
            for entry in fs::read_dir(dir).map_err(|e| WatchError::io(dir, e))? {
                let entry = entry.map_err(|e| WatchError::io(dir, e))?;
                let Ok(name) = entry.file_name().into_string() else {
                    continue;
                };
                if !is_note_file_name(&name) {
                    continue;
                }
                notes += 1;
                let is_link = entry.metadata().is_ok_and(|m| is_linked(&m));
                linked += usize::from(is_link);
                self.log.check_always(&name, is_link);
            }
            Ok((notes, linked))
        }
    }

    impl Drop for Watcher {
        fn drop(&mut self) {
            // Searches that find no socket look at every note. Only our own
            // socket goes: after the index folder was removed, a new
            // watcher's may stand at the same path.
            let ours = fs::symlink_metadata(&self.paths.socket)
                .is_ok_and(|m| m.ino() == self.socket_inode);
            if ours {
                let _ = fs::remove_file(&self.paths.socket);
            }
        }
    }

    /// A symbolic link, or a file with more than one name.
    fn is_linked(metadata: &fs::Metadata) -> bool {
        metadata.file_type().is_symlink() || (metadata.is_file() && metadata.nlink() > 1)
    }

    fn refuse_network_folder(notes_dir: &Path) -> WatchResult<()> {
        let stat =
            rustix::fs::statfs(notes_dir).map_err(|e| WatchError::io(notes_dir, e.into()))?;
        #[allow(clippy::unnecessary_cast)] // the field's type differs between targets
        let magic = (stat.f_type as u64) & 0xFFFF_FFFF;
        match NETWORK_FILE_SYSTEMS.iter().find(|(m, _)| *m == magic) {
            Some((_, kind)) => Err(WatchError::NetworkFolder {
                path: notes_dir.to_path_buf(),
                kind,
            }),
            None => Ok(()),
        }
    }

    fn take_lock(path: &Path) -> WatchResult<File> {
        let file = OpenOptions::new()
            .create(true)
            .truncate(false)
            .write(true)
            .open(path)
            .map_err(|e| WatchError::io(path, e))?;
        match FileExt::try_lock_exclusive(&file) {
            Ok(true) => Ok(file),
            Ok(false) => Err(WatchError::AlreadyWatching {
                path: path.to_path_buf(),
            }),
            Err(e) => Err(WatchError::io(path, e)),
        }
    }

    fn remove_leftovers(paths: &WatchPaths) -> WatchResult<()> {
        for entry in fs::read_dir(&paths.folder).map_err(|e| WatchError::io(&paths.folder, e))? {
            let entry = entry.map_err(|e| WatchError::io(&paths.folder, e))?;
            let marker = entry
                .file_name()
                .to_string_lossy()
                .starts_with(WatchPaths::MARKER_PREFIX);
            if marker || entry.path() == paths.socket {
                match fs::remove_file(entry.path()) {
                    Ok(()) => {}
                    Err(e) if e.kind() == ErrorKind::NotFound => {}
                    Err(e) => return Err(WatchError::io(entry.path(), e)),
                }
            }
        }
        Ok(())
    }

    /// A number for this run of the watcher that no earlier run had: the
    /// standard library's per-process random hash keys over the time and
    /// process id.
    fn new_epoch() -> u64 {
        let mut hasher = RandomState::new().build_hasher();
        hasher.write_u128(
            SystemTime::now()
                .duration_since(UNIX_EPOCH)
                .map_or(0, |d| d.as_nanos()),
        );
        hasher.write_u32(std::process::id());
        hasher.finish()
    }

    fn timespec(duration: Duration) -> Timespec {
        Timespec {
            tv_sec: duration.as_secs() as _,
            tv_nsec: duration.subsec_nanos() as _,
        }
    }
}
