//! The notes folder: a directory of `*.md` files on disk, or the demo notes
//! built into the binary. It lists, reads and adds notes; it never changes or
//! deletes an existing note.

use std::fs;
use std::io::{Read, Write};
use std::path::{Path, PathBuf};
use std::time::UNIX_EPOCH;

use super::demo_notes::demo_notes;
use super::vocabulary::nearest;
use super::{Note, NoteId, NotesError, NotesResult};

/// Where the notes live.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum NotesFolder {
    /// A folder of `*.md` files.
    Disk(PathBuf),
    /// The demo notes built into the binary (read-only).
    Embedded,
}

/// One note file as listed: name, size and modification time.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct NoteFile {
    /// Modification time in nanoseconds since the Unix epoch (0 for embedded notes).
    pub mtime_ns: u128,
    /// The file name, e.g. `2024-03-02-press-4-sag.md`.
    pub name: String,
    /// Size in bytes.
    pub size: u64,
}

impl NoteFile {
    /// The note id: the file name without `.md`.
    pub fn id(&self) -> NoteId {
        NoteId::from_stem(self.name.strip_suffix(".md").unwrap_or(&self.name))
    }
}

/// The display folder for the built-in notes.
const EMBEDDED_PATH: &str = "cases/notes";

/// The largest file read as a note. A case note is a page or two of text; a
/// bigger `.md` file is something else (a log, an export) and reading it
/// whole would swamp memory and bury the real notes in the results.
pub const MAX_NOTE_BYTES: u64 = 1024 * 1024;

impl NotesFolder {
    /// True for the read-only built-in demo notes.
    pub fn is_embedded(&self) -> bool {
        matches!(self, NotesFolder::Embedded)
    }

    /// The folder as shown to the user.
    pub fn display_path(&self) -> &Path {
        match self {
            NotesFolder::Disk(dir) => dir,
            NotesFolder::Embedded => Path::new(EMBEDDED_PATH),
        }
    }

    /// The path of a note file in this folder, as shown to the user.
    pub fn path_of(&self, name: &str) -> PathBuf {
        self.display_path().join(name)
    }

    /// Every note file (`*.md`, not hidden), sorted by name.
    pub fn list(&self) -> NotesResult<Vec<NoteFile>> {
        let mut files = self.scan()?;
        files.sort_by(|a, b| a.name.cmp(&b.name));
        Ok(files)
    }

    /// Every note file in directory order: the quick listing behind the
    /// check for changed notes. On a large folder the sizes and times are
    /// read on two threads.
    pub fn scan(&self) -> NotesResult<Vec<NoteFile>> {
        match self {
            NotesFolder::Embedded => Ok(embedded_files().collect()),
            NotesFolder::Disk(dir) => scan_dir(dir),
        }
    }

    /// The number of note files, from their names alone (no sizes or times).
    pub fn count(&self) -> NotesResult<usize> {
        match self {
            NotesFolder::Embedded => Ok(demo_notes().len()),
            NotesFolder::Disk(dir) => {
                let mut count = 0;
                for entry in fs::read_dir(dir).map_err(|e| NotesError::io(dir, e))? {
                    let entry = entry.map_err(|e| NotesError::io(dir, e))?;
                    count += usize::from(note_name(&entry).is_some());
                }
                Ok(count)
            }
        }
    }

    /// Call `visit` on each note file in directory order, one at a time, so
    /// a full build never holds the list of all notes.
    pub fn for_each_file<E: From<NotesError>>(
        &self,
        mut visit: impl FnMut(NoteFile) -> Result<(), E>,
    ) -> Result<(), E> {
        match self {
            NotesFolder::Embedded => embedded_files().try_for_each(visit),
            NotesFolder::Disk(dir) => {
                for entry in fs::read_dir(dir).map_err(|e| NotesError::io(dir, e))? {
                    let entry = entry.map_err(|e| NotesError::io(dir, e))?;
                    if let Some(file) = note_file(&entry) {
                        visit(file)?;
                    }
                }
                Ok(())
            }
        }
    }

    /// The text of a note file. A note larger than [`MAX_NOTE_BYTES`], not
    /// UTF-8, or a link that leads out of the folder is
    /// [`NotesError::Unreadable`]; a name that is not a plain file name of
    /// the folder is refused.
    pub fn read(&self, name: &str) -> NotesResult<String> {
        if !is_plain_file_name(name) {
            return Err(NotesError::BadName {
                name: name.to_string(),
            });
        }
        match self {
            NotesFolder::Embedded => demo_notes()
                .iter()
                .find(|(n, _)| *n == name)
                .map(|(_, text)| (*text).to_string())
                .ok_or_else(|| {
                    NotesError::io(self.path_of(name), std::io::ErrorKind::NotFound.into())
                }),
            NotesFolder::Disk(dir) => read_disk_note(dir, name),
        }
    }

    /// The note file `name` with its size and time as it is now, or `None`
    /// when there is no such note file (removed, a folder, a dangling link,
    /// not a note's name). The built-in notes never change.
    pub fn file(&self, name: &str) -> Option<NoteFile> {
        if !is_note_file_name(name) || !is_plain_file_name(name) {
            return None;
        }
        match self {
            NotesFolder::Embedded => embedded_files().find(|f| f.name == name),
            NotesFolder::Disk(dir) => {
                let metadata = fs::metadata(dir.join(name)).ok()?;
                metadata.is_file().then(|| NoteFile {
                    mtime_ns: mtime_ns(&metadata),
                    name: name.to_string(),
                    size: metadata.len(),
                })
            }
        }
    }

    /// The note with this id and its path, or the nearest id as a suggestion.
    pub fn find(&self, id: &str) -> NotesResult<(Note, PathBuf)> {
        let name = format!("{id}.md");
        if !is_plain_file_name(&name) {
            return Err(NotesError::BadId { id: id.to_string() });
        }
        let files = self.list()?;
        if files.iter().any(|f| f.name == name) {
            let path = self.path_of(&name);
            let note = Note::parse(&path, &self.read(&name)?)?;
            return Ok((note, path));
        }
        let ids: Vec<String> = files.iter().map(|f| f.id().to_string()).collect();
        let suggestion = nearest(id, ids.iter().map(String::as_str))
            .map(str::to_string)
            .or_else(|| ids.iter().find(|known| known.contains(id)).cloned());
        Err(NotesError::NotFound {
            id: id.to_string(),
            suggestion,
        })
    }

    /// Write a new note under a fresh id (adding `-2`, `-3`... on collision),
    /// atomically, never replacing a file. Returns the id and path used.
    pub fn add(&self, note: &Note) -> NotesResult<(NoteId, PathBuf)> {
        let NotesFolder::Disk(dir) = self else {
            return Err(NotesError::EmbeddedReadOnly);
        };
        if !is_plain_file_name(&format!("{}.md", note.id)) {
            return Err(NotesError::BadId {
                id: note.id.to_string(),
            });
        }
        fs::create_dir_all(dir).map_err(|e| NotesError::io(dir, e))?;
        for n in 1..=10_000 {
            let id = note.id.with_suffix(n);
            let mut note = note.clone();
            note.id = id.clone();
            let target = dir.join(format!("{id}.md"));
            if target.exists() {
                continue;
            }
            let mut temp = tempfile::Builder::new()
                .prefix(".spoolsleuth-")
                .suffix(".tmp")
                .tempfile_in(dir)
                .map_err(|e| NotesError::io(dir, e))?;
            temp.write_all(note.to_markdown().as_bytes())
                .map_err(|e| NotesError::io(temp.path(), e))?;
            temp.as_file()
                .sync_all()
                .map_err(|e| NotesError::io(temp.path(), e))?;
            match temp.persist_noclobber(&target) {
                Ok(_) => return Ok((id, target)),
                // Another process took this id between the check and the link: try the next.
                Err(err) if err.error.kind() == std::io::ErrorKind::AlreadyExists => continue,
                Err(err) => return Err(NotesError::io(&target, err.error)),
            }
        }
        Err(NotesError::io(
            dir,
            std::io::Error::other("no free note id left"),
        ))
    }
}

/// True for a file name of the folder itself: no separator, not `.` or
/// `..`, not absolute, not empty.
fn is_plain_file_name(name: &str) -> bool {
    let mut components = Path::new(name).components();
    matches!(
        (components.next(), components.next()),
        (Some(std::path::Component::Normal(n)), None) if n == name
    )
}

/// Read `name` in `dir`: inside the folder (a link out of it is refused), at
/// most [`MAX_NOTE_BYTES`], UTF-8 text with no NUL byte (a NUL means a
/// binary file saved under a `.md` name).
fn read_disk_note(dir: &Path, name: &str) -> NotesResult<String> {
    let path = dir.join(name);
    let unreadable = |reason: String| NotesError::Unreadable {
        path: path.clone(),
        reason,
    };
    let link = fs::symlink_metadata(&path).map_err(|e| NotesError::io(&path, e))?;
    if link.file_type().is_symlink() {
        let target = fs::canonicalize(&path).map_err(|e| NotesError::io(&path, e))?;
        let root = fs::canonicalize(dir).map_err(|e| NotesError::io(dir, e))?;
        if !target.starts_with(&root) {
            return Err(unreadable(format!(
                "the note is a link to {}, outside the notes folder",
                target.display()
            )));
        }
    }
    let file = fs::File::open(&path).map_err(|e| NotesError::io(&path, e))?;
    // Read one byte past the limit rather than trusting the size listed,
    // which may change between the listing and the read.
    let mut bytes = Vec::new();
    file.take(MAX_NOTE_BYTES + 1)
        .read_to_end(&mut bytes)
        .map_err(|e| NotesError::io(&path, e))?;
    if bytes.len() as u64 > MAX_NOTE_BYTES {
        return Err(unreadable(format!(
            "the note is larger than the limit of {MAX_NOTE_BYTES} bytes"
        )));
    }
    if let Some(at) = bytes.iter().position(|b| *b == 0) {
        return Err(unreadable(format!(
            "the file holds a NUL byte (at byte {at}): it is not a text note"
        )));
    }
    String::from_utf8(bytes).map_err(|e| {
        unreadable(format!(
            "the file is not UTF-8 text (at byte {}); save it as UTF-8",
            e.utf8_error().valid_up_to()
        ))
    })
}

fn embedded_files() -> impl Iterator<Item = NoteFile> {
    demo_notes().iter().map(|(name, text)| NoteFile {
        mtime_ns: 0,
        name: (*name).to_string(),
        size: text.len() as u64,
    })
}

/// From this many notes on, a scan reads sizes and times on two threads.
const PARALLEL_SCAN_FROM: usize = 4_096;

fn scan_dir(dir: &Path) -> NotesResult<Vec<NoteFile>> {
    let mut entries = Vec::new();
    for entry in fs::read_dir(dir).map_err(|e| NotesError::io(dir, e))? {
        let entry = entry.map_err(|e| NotesError::io(dir, e))?;
        if note_name(&entry).is_some() {
            entries.push(entry);
        }
    }
    let stat_all = |entries: &[fs::DirEntry]| -> Vec<NoteFile> {
        entries.iter().filter_map(note_file).collect()
    };
    let threads = std::thread::available_parallelism().map_or(1, |n| n.get());
    if entries.len() < PARALLEL_SCAN_FROM || threads < 2 {
        return Ok(stat_all(&entries));
    }
    let (first, second) = entries.split_at(entries.len() / 2);
    Ok(std::thread::scope(|scope| {
        let other = scope.spawn(|| stat_all(second));
        let mut files = stat_all(first);
        // The helper cannot panic on file data; if it did, do its half here.
        files.extend(other.join().unwrap_or_else(|_| stat_all(second)));
        files
    }))
}

/// True for the name of a note file: `*.md` and not hidden (editors' and
/// our own temporary files start with a dot).
pub fn is_note_file_name(name: &str) -> bool {
    !name.starts_with('.') && name.ends_with(".md")
}

/// The name of a note file entry (UTF-8, see [`is_note_file_name`]), from
/// the directory listing alone.
fn note_name(entry: &fs::DirEntry) -> Option<String> {
    let name = entry.file_name().into_string().ok()?;
    is_note_file_name(&name).then_some(name)
}

/// A file's modification time in nanoseconds since the Unix epoch (0 when
/// the system cannot tell).
fn mtime_ns(metadata: &fs::Metadata) -> u128 {
    metadata
        .modified()
        .ok()
        .and_then(|t| t.duration_since(UNIX_EPOCH).ok())
        .map_or(0, |d| d.as_nanos())
}

/// The listed note file with its size and time, or `None` for a folder, a
/// dangling link or a file removed since it was listed. Reads the entry's
/// metadata relative to the open folder (no path lookup); a symlink is
/// followed, so a linked note counts like a real one.
fn note_file(entry: &fs::DirEntry) -> Option<NoteFile> {
    let name = note_name(entry)?;
    let file_type = entry.file_type().ok()?;
    let metadata = if file_type.is_symlink() {
        fs::metadata(entry.path()).ok()?
    } else {
        entry.metadata().ok()?
    };
    if !metadata.is_file() {
        return None;
    }
    Some(NoteFile {
        mtime_ns: mtime_ns(&metadata),
        name,
        size: metadata.len(),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn sample(id: &str) -> Note {
        Note {
            cause: "pump-worn".into(),
            date: "2022-05-06".parse().unwrap(),
            downtime: None,
            fix: "new pump".into(),
            id: NoteId::from_stem(id),
            machine: "conveyor-7".into(),
            parts: vec![],
            readings: vec![],
            symptoms: vec!["runs-hot".into()],
            technician: None,
            text: String::new(),
            title: "hot".into(),
        }
    }

    #[test]
    fn add_never_overwrites_and_suffixes_ids() {
        let dir = tempfile::tempdir().unwrap();
        let folder = NotesFolder::Disk(dir.path().to_path_buf());
        let (first, _) = folder.add(&sample("a")).unwrap();
        let (second, path) = folder.add(&sample("a")).unwrap();
        assert_eq!((first.as_str(), second.as_str()), ("a", "a-2"));
        assert_eq!(
            Note::parse(&path, &fs::read_to_string(&path).unwrap())
                .unwrap()
                .id
                .as_str(),
            "a-2"
        );
        let names: Vec<String> = folder.list().unwrap().into_iter().map(|f| f.name).collect();
        assert_eq!(names, ["a-2.md", "a.md"]);
    }

    #[test]
    fn find_suggests_the_nearest_id() {
        let dir = tempfile::tempdir().unwrap();
        let folder = NotesFolder::Disk(dir.path().to_path_buf());
        folder.add(&sample("2024-01-02-press-4-sag")).unwrap();
        let err = folder.find("2024-01-02-press-4-sga").unwrap_err();
        assert_eq!(
            err.to_string(),
            "no note with id '2024-01-02-press-4-sga' (did you mean '2024-01-02-press-4-sag'?)"
        );
    }

    #[test]
    fn one_note_file_is_looked_up_by_name() {
        let dir = tempfile::tempdir().unwrap();
        fs::write(dir.path().join("a.md"), "12345").unwrap();
        fs::write(dir.path().join(".a.md.swp"), "x").unwrap();
        fs::create_dir(dir.path().join("folder.md")).unwrap();
        let folder = NotesFolder::Disk(dir.path().to_path_buf());
        let file = folder.file("a.md").unwrap();
        assert_eq!((file.name.as_str(), file.size), ("a.md", 5));
        assert!(file.mtime_ns > 0);
        for name in ["gone.md", ".a.md.swp", "folder.md", "../a.md", "a.txt"] {
            assert_eq!(folder.file(name), None, "{name}");
        }
        let first = &demo_notes()[0];
        assert_eq!(
            NotesFolder::Embedded.file(first.0).map(|f| f.size),
            Some(first.1.len() as u64)
        );
    }

    #[test]
    fn only_plain_file_names_of_the_folder_are_read() {
        for name in ["a.md", "2024-01-02-press-4-sag.md", "..md", "a b.md"] {
            assert!(is_plain_file_name(name), "{name}");
        }
        for name in [
            "",
            ".",
            "..",
            "../a.md",
            "/etc/a.md",
            "x/a.md",
            "./a.md",
            "a.md/",
        ] {
            assert!(!is_plain_file_name(name), "{name}");
        }
        let dir = tempfile::tempdir().unwrap();
        let notes = dir.path().join("notes");
        fs::create_dir(&notes).unwrap();
        fs::write(dir.path().join("secret.md"), "---\n---\n").unwrap();
        let folder = NotesFolder::Disk(notes);
        assert_eq!(
            folder.read("../secret.md").unwrap_err().to_string(),
            "'../secret.md' is not a note file of the notes folder: a note is read only from the folder itself"
        );
        for id in ["../secret", "/etc/passwd", "a/../../secret"] {
            assert_eq!(
                folder.find(id).unwrap_err().to_string(),
                format!("'{id}' is not a note id: an id is a file name of the notes folder without '.md', with no '/' or '..'")
            );
        }
    }

    #[test]
    fn add_refuses_an_id_that_leaves_the_folder() {
        let dir = tempfile::tempdir().unwrap();
        let notes = dir.path().join("notes");
        let folder = NotesFolder::Disk(notes.clone());
        let err = folder.add(&sample("../escaped")).unwrap_err();
        assert_eq!(
            err.to_string(),
            "'../escaped' is not a note id: an id is a file name of the notes folder without '.md', with no '/' or '..'"
        );
        assert!(!dir.path().join("escaped.md").exists());
        assert!(!notes.exists());
    }

    #[test]
    fn a_note_over_the_limit_is_not_read() {
        let dir = tempfile::tempdir().unwrap();
        let folder = NotesFolder::Disk(dir.path().to_path_buf());
        let limit = usize::try_from(MAX_NOTE_BYTES).unwrap();
        fs::write(dir.path().join("big.md"), "x".repeat(limit + 1)).unwrap();
        fs::write(dir.path().join("edge.md"), "x".repeat(limit)).unwrap();
        assert_eq!(
            folder.read("big.md").unwrap_err().to_string(),
            format!(
                "{}: the note is larger than the limit of 1048576 bytes",
                dir.path().join("big.md").display()
            )
        );
        assert_eq!(folder.read("edge.md").unwrap().len(), limit);
    }

    #[cfg(unix)]
    #[test]
    fn a_link_out_of_the_folder_is_not_read_but_one_inside_is() {
        let dir = tempfile::tempdir().unwrap();
        let notes = dir.path().join("notes");
        fs::create_dir(&notes).unwrap();
        fs::write(dir.path().join("secret.md"), "outside").unwrap();
        fs::write(notes.join("real.md"), "inside").unwrap();
        std::os::unix::fs::symlink(dir.path().join("secret.md"), notes.join("out.md")).unwrap();
        std::os::unix::fs::symlink("real.md", notes.join("alias.md")).unwrap();
        let folder = NotesFolder::Disk(notes.clone());
        let names: Vec<String> = folder.list().unwrap().into_iter().map(|f| f.name).collect();
        assert_eq!(names, ["alias.md", "out.md", "real.md"]);
        assert_eq!(folder.read("alias.md").unwrap(), "inside");
        assert_eq!(
            folder.read("out.md").unwrap_err().to_string(),
            format!(
                "{}: the note is a link to {}, outside the notes folder",
                notes.join("out.md").display(),
                fs::canonicalize(dir.path().join("secret.md"))
                    .unwrap()
                    .display()
            )
        );
    }

    #[test]
    fn embedded_notes_are_read_only() {
        assert!(matches!(
            NotesFolder::Embedded.add(&sample("a")),
            Err(NotesError::EmbeddedReadOnly)
        ));
    }
}
