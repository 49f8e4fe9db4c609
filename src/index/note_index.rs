//! The notes index itself: open it, notice new, edited and deleted notes and
//! index only those, or rebuild it from the notes when it is missing, from an
//! older schema, damaged or unreadable. The notes are the source of truth;
//! nothing here writes to the notes folder, and a rebuild deletes only the
//! index's own files inside the index folder.

use std::collections::HashMap;
use std::fs::{self, File, OpenOptions};
use std::io::ErrorKind;
use std::path::{Path, PathBuf};
use std::time::{Duration, SystemTime, UNIX_EPOCH};

use fs4::fs_std::FileExt;
use indicatif::{ProgressBar, ProgressStyle};
use tantivy::merge_policy::LogMergePolicy;
use tantivy::{Index, IndexReader, IndexWriter, ReloadPolicy, Searcher, TantivyError, Term};

use super::manifest::{
    read_manifest_bytes, IndexFingerprint, ManifestProblem, ManifestView, ManifestWriter,
    MANIFEST_FILE, OLD_MANIFEST_FILE,
};
use super::{
    content_hash, register_index_analyzers, IndexError, IndexLocation, IndexResult, Manifest,
    ManifestEntry, ManifestSummary, NoteSchema, SyncReport,
};
use crate::notes::{Note, NoteFile, NotesError, NotesFolder};
use crate::watch::{ask_watcher, WatchAnswer, WatchCursor, WatchPaths};

/// Memory budget of the index writer for a full build, in bytes, for its
/// one indexing thread. With the merge limits below, a full build of 100k
/// notes peaks at about 170 MB (measured; see tests/benches/RESULTS.md).
pub const WRITER_MEMORY_BUDGET: usize = 20_000_000;
/// Segments are merged four at a time (tantivy's default of eight maps
/// twice as much into memory per merge)...
const MERGE_MIN_SEGMENTS: usize = 4;
/// ...and those with more notes than this are not merged further.
const MERGE_MAX_DOCS: usize = 10_000;
/// A note modified less than this before it was read is read again on the
/// next check (file system times can be as coarse as 2 s).
const RACY_WINDOW: Duration = Duration::from_secs(3);
/// Budget for incremental updates: tantivy's minimum for one thread.
const UPDATE_MEMORY_BUDGET: usize = 15_000_000;
/// Show a progress bar from this many notes to index on.
const PROGRESS_FROM: usize = 2_000;
/// Our own lock, held while the index is changed.
const LOCK_FILE: &str = "spoolsleuth.lock";

/// An open, current index of a notes folder.
pub struct NoteIndex {
    dir: Option<PathBuf>,
    folder: NotesFolder,
    index: Index,
    reader: IndexReader,
    schema: NoteSchema,
}

impl std::fmt::Debug for NoteIndex {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_struct("NoteIndex")
            .field("dir", &self.dir)
            .field("folder", &self.folder)
            .finish_non_exhaustive()
    }
}

impl NoteIndex {
    /// Open the index of `folder` at `location`, bringing it up to date.
    pub fn open(
        folder: NotesFolder,
        location: &IndexLocation,
    ) -> IndexResult<(NoteIndex, SyncReport)> {
        match location {
            IndexLocation::Memory => Self::open_in_memory(folder),
            IndexLocation::Dir(dir) => Self::open_dir(folder, dir),
        }
    }

    /// A searcher over the current notes.
    pub fn searcher(&self) -> Searcher {
        self.reader.searcher()
    }

    /// The schema fields.
    pub fn schema(&self) -> &NoteSchema {
        &self.schema
    }

    /// The tantivy index.
    pub fn index(&self) -> &Index {
        &self.index
    }

    /// The notes folder this index mirrors.
    pub fn folder(&self) -> &NotesFolder {
        &self.folder
    }

    /// The error for a tantivy failure on this index.
    pub fn tantivy_error(&self, source: TantivyError) -> IndexError {
        IndexError::Tantivy {
            path: self.dir.clone().unwrap_or_else(|| PathBuf::from("memory")),
            source,
        }
    }

    /// Rebuild from the notes after the index failed during a search.
    pub fn rebuild_after_failure(&mut self, failure: &str) -> IndexResult<SyncReport> {
        let Some(dir) = self.dir.clone() else {
            return Err(IndexError::io(
                "memory",
                std::io::Error::other(failure.to_string()),
            ));
        };
        let _lock = lock(&dir)?;
        let (fresh, report) = Self::rebuild(
            self.folder.clone(),
            &dir,
            format!("the index failed: {failure}"),
        )?;
        *self = fresh;
        Ok(report)
    }

    fn open_in_memory(folder: NotesFolder) -> IndexResult<(NoteIndex, SyncReport)> {
        let schema = NoteSchema::new();
        let index = Index::create_in_ram(schema.schema.clone());
        register_index_analyzers(&index);
        let files = folder.list()?;
        let memory = Path::new("memory");
        let mut writer: IndexWriter = index
            .writer_with_num_threads(1, UPDATE_MEMORY_BUDGET)
            .map_err(|e| tantivy(memory, e))?;
        let mut report = SyncReport::default();
        for file in &files {
            let text = match folder.read(&file.name) {
                Ok(text) => text,
                Err(unreadable) => {
                    report.broken.push(unreadable.to_string());
                    continue;
                }
            };
            match Note::parse(Path::new(&file.name), &text) {
                Ok(note) => {
                    writer
                        .add_document(schema.document(&note))
                        .map_err(|e| tantivy(memory, e))?;
                    report.added += 1;
                }
                Err(error) => report.broken.push(qualify(&folder, &error.to_string())),
            }
        }
        writer.commit().map_err(|e| tantivy(memory, e))?;
        let reader = manual_reader(&index).map_err(|e| tantivy(memory, e))?;
        Ok((
            NoteIndex {
                dir: None,
                folder,
                index,
                reader,
                schema,
            },
            report,
        ))
    }

    fn open_dir(folder: NotesFolder, dir: &Path) -> IndexResult<(NoteIndex, SyncReport)> {
        fs::create_dir_all(dir).map_err(|e| IndexError::io(dir, e))?;
        refuse_foreign_folder(dir)?;
        let stored = WatchCursor::load(dir);
        let reply = match &folder {
            NotesFolder::Disk(notes) => ask_watcher(notes, dir, stored),
            NotesFolder::Embedded => None,
        };
        let Some(reply) = reply else {
            return Self::open_checking_every_note(folder, dir, None);
        };
        match reply.answer {
            WatchAnswer::Names { changed, linked } => {
                let cursors = (stored, reply.cursor);
                Self::open_watched(folder, dir, changed, &linked, cursors)
            }
            WatchAnswer::Rescan => Self::open_checking_every_note(folder, dir, Some(reply.cursor)),
        }
    }

    /// Bring the index up to date by comparing every note file's size and
    /// time with the manifest. With a watcher's `cursor` (taken before the
    /// listing), save it afterwards so the next search can ask the watcher.
    fn open_checking_every_note(
        folder: NotesFolder,
        dir: &Path,
        cursor: Option<WatchCursor>,
    ) -> IndexResult<(NoteIndex, SyncReport)> {
        // Fast path without our lock: an intact index with nothing to do.
        // Listing the notes and opening the index run side by side.
        let bytes = read_manifest_bytes(dir);
        let (scanned, opened) = std::thread::scope(|scope| {
            let scan = scope.spawn(|| folder.scan());
            let opened = try_open(dir, bytes.as_deref());
            // Listing cannot panic on file data; if it did, list here instead.
            let scanned = scan.join().unwrap_or_else(|_| folder.scan());
            (scanned, opened)
        });
        let files = scanned?;
        if let Ok((index, view)) = opened {
            if is_current(&view, &files) {
                let report = SyncReport {
                    broken: broken_of(&folder, view.notes.iter().filter_map(|n| n.broken)),
                    ..SyncReport::default()
                };
                save_cursor(dir, cursor);
                return Ok((index.into_note_index(folder, dir)?, report));
            }
        }
        Self::update(folder, dir, cursor, |manifest| changes(manifest, &files))
    }

    /// Bring the index up to date from a watcher's answer: read the notes
    /// it saw change (whatever their size and time say), compare the linked
    /// notes' size and time as a full check would, and look at no other
    /// note. Save the watcher's cursor (`cursors.1`, the stored one being
    /// `cursors.0`) once the index holds the changes.
    fn open_watched(
        folder: NotesFolder,
        dir: &Path,
        changed: Vec<String>,
        linked: &[String],
        cursors: (Option<WatchCursor>, WatchCursor),
    ) -> IndexResult<(NoteIndex, SyncReport)> {
        let (stored, cursor) = cursors;
        let mut names = changed;
        // Linked notes are compared with their records; otherwise the
        // manifest's summary is all that is read.
        let opened = if linked.is_empty() {
            try_open_summary(dir).map(|(index, summary)| (index, summary.broken))
        } else {
            let bytes = read_manifest_bytes(dir);
            try_open(dir, bytes.as_deref()).map(|(index, view)| {
                let known: HashMap<&str, (u64, u128)> = view
                    .notes
                    .iter()
                    .map(|n| (n.name, (n.size, n.mtime_ns)))
                    .collect();
                names.extend(
                    linked
                        .iter()
                        .filter(|name| {
                            let now = folder.file(name).map(|f| (f.size, f.mtime_ns));
                            now.is_none() || now != known.get(name.as_str()).copied()
                        })
                        .cloned(),
                );
                let broken = view.notes.iter().filter_map(|n| n.broken);
                (index, broken.map(str::to_string).collect())
            })
        };
        match opened {
            Ok((index, broken)) if names.is_empty() => {
                let report = SyncReport {
                    broken: broken_of(&folder, broken.iter().map(String::as_str)),
                    ..SyncReport::default()
                };
                if stored != Some(cursor) {
                    save_cursor(dir, Some(cursor));
                }
                return Ok((index.into_note_index(folder, dir)?, report));
            }
            Ok(_) => {}
            // Rebuilt below under the lock, unless another process has
            // just done so: then every name given needs a look.
            Err(_) => names.extend(linked.iter().cloned()),
        }
        let changed_names = |manifest: &Manifest| changes_of_names(&folder, manifest, names);
        Self::update(folder.clone(), dir, Some(cursor), changed_names)
    }

    /// Under our lock, apply the changes `change_of` finds against the
    /// manifest (re-read: another process may have done the work), or
    /// rebuild when the index cannot be used; then save the watcher's
    /// `cursor`, which still holds after a rebuild as it was taken before
    /// the folder was listed.
    fn update(
        folder: NotesFolder,
        dir: &Path,
        cursor: Option<WatchCursor>,
        change_of: impl FnOnce(&Manifest) -> Changes,
    ) -> IndexResult<(NoteIndex, SyncReport)> {
        let _lock = lock(dir)?;
        let bytes = read_manifest_bytes(dir);
        let reopened =
            try_open(dir, bytes.as_deref()).map(|(index, view)| (index, view.to_manifest()));
        let opened = match reopened {
            Ok((index, manifest)) => {
                let change = change_of(&manifest);
                index
                    .into_note_index(folder, dir)?
                    .apply_changes(manifest, change)
            }
            Err(reason) => Self::rebuild(folder, dir, reason),
        }?;
        save_cursor(dir, cursor);
        Ok(opened)
    }

    /// Index the new and edited notes of `change` and drop its deleted
    /// ones; caller holds the lock. The manifest is written only when
    /// something in it changed.
    fn apply_changes(
        self,
        mut manifest: Manifest,
        change: Changes,
    ) -> IndexResult<(NoteIndex, SyncReport)> {
        let dir = self.dir.clone().unwrap_or_default();
        let mut report = SyncReport::default();
        let mut writer: Option<IndexWriter> = None;
        let mut dirty = false;
        let mut removed = change.removed;
        let mut unreadable = Vec::new();
        for file in &change.changed {
            let known = manifest.entries.get(&file.name);
            let text = match self.folder.read(&file.name) {
                Ok(text) => text,
                // Deleted since it was listed: drop it like any deleted note.
                Err(NotesError::Io { source, .. }) if source.kind() == ErrorKind::NotFound => {
                    if known.is_some() {
                        removed.push(file.name.clone());
                    }
                    continue;
                }
                Err(error) => {
                    // Left out of the manifest so that it is tried again next
                    // time (a permission fixed, a file cut down to size).
                    if known.is_some() {
                        let writer = self.writer(&mut writer, &dir)?;
                        writer.delete_term(Term::from_field_text(
                            self.schema.id,
                            &name_to_id(&file.name),
                        ));
                        manifest.entries.remove(&file.name);
                        dirty = true;
                        report.removed += 1;
                    }
                    unreadable.push(error.to_string());
                    continue;
                }
            };
            let hash = content_hash(text.as_bytes());
            let entry = |broken| ManifestEntry {
                broken,
                hash,
                mtime_ns: settled_mtime(file.mtime_ns),
                size: file.size,
            };
            if known.is_some_and(|k| k.hash == hash) {
                // Touched but not changed: remember the new time only.
                let same = entry(known.and_then(|k| k.broken.clone()));
                if known != Some(&same) {
                    manifest.entries.insert(file.name.clone(), same);
                    dirty = true;
                }
                continue;
            }
            let writer = self.writer(&mut writer, &dir)?;
            writer.delete_term(Term::from_field_text(
                self.schema.id,
                &name_to_id(&file.name),
            ));
            let broken = match Note::parse(Path::new(&file.name), &text) {
                Ok(note) => {
                    writer
                        .add_document(self.schema.document(&note))
                        .map_err(|e| tantivy(&dir, e))?;
                    None
                }
                Err(error) => Some(error.to_string()),
            };
            if known.is_some() {
                report.updated += 1;
            } else {
                report.added += 1;
            }
            manifest.entries.insert(file.name.clone(), entry(broken));
        }
        for name in &removed {
            let writer = self.writer(&mut writer, &dir)?;
            writer.delete_term(Term::from_field_text(self.schema.id, &name_to_id(name)));
            manifest.entries.remove(name);
            report.removed += 1;
        }
        if let Some(mut writer) = writer {
            writer.commit().map_err(|e| tantivy(&dir, e))?;
            writer
                .wait_merging_threads()
                .map_err(|e| tantivy(&dir, e))?;
            // Saved after the commit: a crash in between only redoes the changes.
            manifest.index_files = index_fingerprint(&dir)?;
            manifest.save(&dir)?;
            self.reader.reload().map_err(|e| tantivy(&dir, e))?;
        } else if dirty {
            manifest.save(&dir)?;
        }
        report.broken = broken_of(
            &self.folder,
            manifest
                .entries
                .values()
                .filter_map(|e| e.broken.as_deref()),
        );
        unreadable.sort();
        report.broken.extend(unreadable);
        Ok((self, report))
    }

    fn writer<'w>(
        &self,
        writer: &'w mut Option<IndexWriter>,
        dir: &Path,
    ) -> IndexResult<&'w mut IndexWriter> {
        if writer.is_none() {
            let new = self
                .index
                .writer_with_num_threads(1, UPDATE_MEMORY_BUDGET)
                .map_err(|e| tantivy(dir, e))?;
            new.set_merge_policy(merge_policy());
            *writer = Some(new);
        }
        writer
            .as_mut()
            .ok_or_else(|| IndexError::io(dir, std::io::Error::other("no index writer")))
    }

    /// Index every note from scratch; caller holds the lock. Notes are read
    /// and indexed one at a time in directory order, and their manifest
    /// records appended as they go, so memory stays with the index writer.
    fn rebuild(
        folder: NotesFolder,
        dir: &Path,
        reason: String,
    ) -> IndexResult<(NoteIndex, SyncReport)> {
        Manifest::remove(dir)?;
        remove_index_files(dir)?;
        let schema = NoteSchema::new();
        let index =
            Index::create_in_dir(dir, schema.schema.clone()).map_err(|e| tantivy(dir, e))?;
        register_index_analyzers(&index);
        let mut writer: IndexWriter = index
            .writer_with_num_threads(1, WRITER_MEMORY_BUDGET)
            .map_err(|e| tantivy(dir, e))?;
        writer.set_merge_policy(merge_policy());
        let progress = progress_bar(folder.count()?);
        let mut manifest = ManifestWriter::default();
        let mut broken = Vec::new();
        let mut report = SyncReport {
            rebuilt: Some(reason),
            ..SyncReport::default()
        };
        let mut unreadable = Vec::new();
        folder.for_each_file(|file| -> IndexResult<()> {
            let text = match folder.read(&file.name) {
                Ok(text) => text,
                // Deleted since it was listed: nothing to index.
                Err(NotesError::Io { source, .. }) if source.kind() == ErrorKind::NotFound => {
                    progress.inc(1);
                    return Ok(());
                }
                // Unreadable, binary or too big: left out of the manifest, so it
                // is tried again on the next search.
                Err(error) => {
                    unreadable.push(error.to_string());
                    progress.inc(1);
                    return Ok(());
                }
            };
            let problem = match Note::parse(Path::new(&file.name), &text) {
                Ok(note) => {
                    writer
                        .add_document(schema.document(&note))
                        .map_err(|e| tantivy(dir, e))?;
                    report.added += 1;
                    None
                }
                Err(error) => {
                    let message = error.to_string();
                    broken.push(qualify(&folder, &message));
                    Some(message)
                }
            };
            let entry = ManifestEntry {
                broken: problem,
                hash: content_hash(text.as_bytes()),
                mtime_ns: settled_mtime(file.mtime_ns),
                size: file.size,
            };
            manifest.push(&file.name, &entry);
            progress.inc(1);
            Ok(())
        })?;
        progress.set_message("committing");
        writer.commit().map_err(|e| tantivy(dir, e))?;
        writer.wait_merging_threads().map_err(|e| tantivy(dir, e))?;
        manifest.save(dir, &index_fingerprint(dir)?)?;
        progress.finish_and_clear();
        broken.sort();
        report.broken = broken;
        unreadable.sort();
        report.broken.extend(unreadable);
        let reader = manual_reader(&index).map_err(|e| tantivy(dir, e))?;
        Ok((
            NoteIndex {
                dir: Some(dir.to_path_buf()),
                folder,
                index,
                reader,
                schema,
            },
            report,
        ))
    }
}

/// An index opened and checked, not yet tied to a notes folder.
struct OpenedIndex {
    index: Index,
    reader: IndexReader,
}

impl OpenedIndex {
    fn into_note_index(self, folder: NotesFolder, dir: &Path) -> IndexResult<NoteIndex> {
        Ok(NoteIndex {
            dir: Some(dir.to_path_buf()),
            folder,
            index: self.index,
            reader: self.reader,
            schema: NoteSchema::new(),
        })
    }
}

/// Why a manifest cannot be used, as the reason for a rebuild.
fn describe(problem: &ManifestProblem) -> String {
    match problem {
        ManifestProblem::Missing => "its manifest was missing".to_string(),
        ManifestProblem::OtherVersion(v) => format!("it was written with schema version {v}"),
        ManifestProblem::Unreadable(why) => format!("its manifest was unreadable ({why})"),
    }
}

/// Open and check the index in `dir` against its manifest `bytes`, or say
/// why it must be rebuilt.
fn try_open<'b>(
    dir: &Path,
    bytes: Result<&'b [u8], &ManifestProblem>,
) -> Result<(OpenedIndex, ManifestView<'b>), String> {
    if !dir.join("meta.json").exists() {
        return Err("there was no index yet".into());
    }
    let manifest = ManifestView::parse(bytes.map_err(describe)?).map_err(|p| describe(&p))?;
    let index = open_checked(dir, &manifest.index_files, manifest.indexed())?;
    Ok((index, manifest))
}

/// The same as [`try_open`] from the manifest's summary alone, for a search
/// that needs no note's record.
fn try_open_summary(dir: &Path) -> Result<(OpenedIndex, ManifestSummary), String> {
    if !dir.join("meta.json").exists() {
        return Err("there was no index yet".into());
    }
    let summary = ManifestSummary::read(dir).map_err(|p| describe(&p))?;
    let index = open_checked(dir, &summary.index_files, summary.indexed)?;
    Ok((index, summary))
}

/// Open the index in `dir`, check its schema, its files against the
/// manifest's `index_files` (checksums only when they differ) and its
/// number of notes against `indexed`.
fn open_checked(
    dir: &Path,
    index_files: &IndexFingerprint,
    indexed: usize,
) -> Result<OpenedIndex, String> {
    let index = Index::open_in_dir(dir).map_err(|e| format!("it could not be opened ({e})"))?;
    if index.schema() != NoteSchema::new().schema {
        return Err("its schema differs".into());
    }
    register_index_analyzers(&index);
    // Files damaged in place are not noticed by opening or searching; their
    // checksums are read (the whole index) only when the index files are not
    // as the last write left them.
    if index_fingerprint(dir).ok().as_ref() != Some(index_files) {
        let damaged = index
            .validate_checksum()
            .map_err(|e| format!("it could not be checked ({e})"))?;
        if !damaged.is_empty() {
            return Err(format!("{} of its files were damaged", damaged.len()));
        }
    }
    let reader = manual_reader(&index).map_err(|e| format!("it could not be read ({e})"))?;
    let found = reader.searcher().num_docs();
    if found != indexed as u64 {
        return Err(format!(
            "it held {found} notes where its manifest lists {indexed}"
        ));
    }
    Ok(OpenedIndex { index, reader })
}

/// The merge policy of every writer: segments of up to `MERGE_MAX_DOCS`
/// notes are merged `MERGE_MIN_SEGMENTS` at a time, larger ones are left
/// alone, so a merge never maps more than a few small segments into memory.
fn merge_policy() -> Box<LogMergePolicy> {
    let mut policy = LogMergePolicy::default();
    policy.set_min_num_segments(MERGE_MIN_SEGMENTS);
    policy.set_max_docs_before_merge(MERGE_MAX_DOCS);
    Box::new(policy)
}

/// A modification time to record for a file read now: its own, or 0 when it
/// is so recent that a second write within the file system's time
/// resolution could follow unseen (same size, same time). A 0 never matches
/// a real file, so the next check reads such a note again.
fn settled_mtime(mtime_ns: u128) -> u128 {
    let now = SystemTime::now()
        .duration_since(UNIX_EPOCH)
        .map_or(0, |d| d.as_nanos());
    if now.saturating_sub(mtime_ns) < RACY_WINDOW.as_nanos() {
        0
    } else {
        mtime_ns
    }
}

/// True when every listed file is in the manifest with the same size and
/// time, and the manifest lists no other file.
fn is_current(manifest: &ManifestView<'_>, files: &[NoteFile]) -> bool {
    if manifest.notes.len() != files.len() {
        return false;
    }
    let known: HashMap<&str, (u64, u128)> = manifest
        .notes
        .iter()
        .map(|n| (n.name, (n.size, n.mtime_ns)))
        .collect();
    // Names are unique on both sides and as many: each file matching one
    // record leaves no record over, so no note was deleted.
    known.len() == files.len()
        && files
            .iter()
            .all(|f| known.get(f.name.as_str()) == Some(&(f.size, f.mtime_ns)))
}

fn manual_reader(index: &Index) -> tantivy::Result<IndexReader> {
    index
        .reader_builder()
        .reload_policy(ReloadPolicy::Manual)
        .try_into()
}

/// Files to read because they are new or may have changed, and names in
/// the manifest whose files are gone.
#[derive(Debug, Default)]
struct Changes {
    changed: Vec<NoteFile>,
    removed: Vec<String>,
}

/// The changes between the manifest and a listing of every note file: a
/// file whose size or time moved is read again.
fn changes(manifest: &Manifest, files: &[NoteFile]) -> Changes {
    let changed = files
        .iter()
        .filter(|f| {
            manifest
                .entries
                .get(&f.name)
                .is_none_or(|e| e.size != f.size || e.mtime_ns != f.mtime_ns)
        })
        .cloned()
        .collect();
    let present: std::collections::HashSet<&str> = files.iter().map(|f| f.name.as_str()).collect();
    let removed = manifest
        .entries
        .keys()
        .filter(|name| !present.contains(name.as_str()))
        .cloned()
        .collect();
    Changes { changed, removed }
}

/// The changes among `names` (a watcher saw them change): each that is a
/// note file now is read again whatever its size and time, each that is
/// not is dropped from the index.
fn changes_of_names(folder: &NotesFolder, manifest: &Manifest, mut names: Vec<String>) -> Changes {
    names.sort();
    names.dedup();
    let mut change = Changes::default();
    for name in names {
        match folder.file(&name) {
            Some(file) => change.changed.push(file),
            None if manifest.entries.contains_key(&name) => change.removed.push(name),
            None => {}
        }
    }
    change
}

/// Save a watcher's cursor beside the index. A cursor that cannot be saved
/// (a full disk) only makes the next search ask about more notes.
fn save_cursor(dir: &Path, cursor: Option<WatchCursor>) {
    if let Some(cursor) = cursor {
        let _ = cursor.save(dir);
    }
}

fn name_to_id(name: &str) -> String {
    name.strip_suffix(".md").unwrap_or(name).to_string()
}

/// The broken notes' messages, sorted, with the folder in front of each.
fn broken_of<'m>(folder: &NotesFolder, messages: impl Iterator<Item = &'m str>) -> Vec<String> {
    let mut broken: Vec<String> = messages.map(|m| qualify(folder, m)).collect();
    broken.sort();
    broken
}

fn qualify(folder: &NotesFolder, message: &str) -> String {
    folder.display_path().join(message).display().to_string()
}

fn tantivy(path: &Path, source: TantivyError) -> IndexError {
    IndexError::Tantivy {
        path: path.to_path_buf(),
        source,
    }
}

/// Take our lock on the index folder, waiting for another process to finish.
/// The OS releases it when the holder exits, even if it was killed.
fn lock(dir: &Path) -> IndexResult<File> {
    let path = dir.join(LOCK_FILE);
    let file = OpenOptions::new()
        .create(true)
        .truncate(false)
        .write(true)
        .open(&path)
        .map_err(|e| IndexError::io(&path, e))?;
    FileExt::lock_exclusive(&file).map_err(|e| IndexError::io(&path, e))?;
    Ok(file)
}

/// True for the files tantivy writes: its metadata and locks, and segment
/// files named by a 32-digit hex id.
fn is_index_file(name: &str) -> bool {
    let segment = name.len() > 33
        && name.as_bytes()[..32].iter().all(u8::is_ascii_hexdigit)
        && name.as_bytes()[32] == b'.';
    segment
        || matches!(
            name,
            "meta.json" | ".managed.json" | ".tantivy-meta.lock" | ".tantivy-writer.lock"
        )
}

fn is_own_file(name: &str) -> bool {
    is_index_file(name)
        || name == MANIFEST_FILE
        || name == OLD_MANIFEST_FILE
        || name == LOCK_FILE
        || name.starts_with(".spoolsleuth-manifest-")
        || WatchPaths::is_own_name(name)
}

/// Size and modification time of the index's files (not its lock files).
fn index_fingerprint(dir: &Path) -> IndexResult<IndexFingerprint> {
    let mut files = IndexFingerprint::new();
    for entry in fs::read_dir(dir).map_err(|e| IndexError::io(dir, e))? {
        let entry = entry.map_err(|e| IndexError::io(dir, e))?;
        let name = entry.file_name().to_string_lossy().into_owned();
        if !is_index_file(&name) || name.ends_with(".lock") {
            continue;
        }
        let metadata = entry
            .metadata()
            .map_err(|e| IndexError::io(entry.path(), e))?;
        let mtime = metadata
            .modified()
            .ok()
            .and_then(|t| t.duration_since(UNIX_EPOCH).ok())
            .map_or(0, |d| d.as_nanos());
        files.insert(name, (metadata.len(), mtime));
    }
    Ok(files)
}

fn remove_index_files(dir: &Path) -> IndexResult<()> {
    for entry in fs::read_dir(dir).map_err(|e| IndexError::io(dir, e))? {
        let entry = entry.map_err(|e| IndexError::io(dir, e))?;
        let name = entry.file_name().to_string_lossy().into_owned();
        if is_index_file(&name) && entry.file_type().is_ok_and(|t| t.is_file()) {
            fs::remove_file(entry.path()).map_err(|e| IndexError::io(entry.path(), e))?;
        }
    }
    Ok(())
}

/// Refuse a folder that holds files of its own and none of ours, so that a
/// mistyped `--index-dir` never mixes the index into someone's documents.
fn refuse_foreign_folder(dir: &Path) -> IndexResult<()> {
    let mut foreign = None;
    for entry in fs::read_dir(dir).map_err(|e| IndexError::io(dir, e))? {
        let name = entry
            .map_err(|e| IndexError::io(dir, e))?
            .file_name()
            .to_string_lossy()
            .into_owned();
        if name == MANIFEST_FILE
            || name == OLD_MANIFEST_FILE
            || name == "meta.json"
            || name == LOCK_FILE
        {
            return Ok(());
        }
        if !is_own_file(&name) {
            foreign.get_or_insert(name);
        }
    }
    match foreign {
        Some(example) => Err(IndexError::ForeignFolder {
            path: dir.to_path_buf(),
            example,
        }),
        None => Ok(()),
    }
}

fn progress_bar(len: usize) -> ProgressBar {
    if len < PROGRESS_FROM {
        return ProgressBar::hidden();
    }
    // Draws on stderr, and hides itself when stderr is not a terminal.
    let bar = ProgressBar::new(len as u64).with_message("indexing notes");
    if let Ok(style) =
        ProgressStyle::with_template("{msg} {wide_bar} {pos}/{len} ({per_sec}, {eta} left)")
    {
        bar.set_style(style);
    }
    bar
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn recognises_only_tantivy_files_as_index_files() {
        assert!(is_index_file("0123456789abcdef0123456789abcdef.idx"));
        assert!(is_index_file("0123456789abcdef0123456789abcdef.12.del"));
        assert!(is_index_file("meta.json"));
        assert!(!is_index_file("notes.md"));
        assert!(!is_index_file("0123456789abcdef0123456789abcdeg.idx"));
    }

    #[test]
    fn refuses_a_folder_of_other_files() {
        let dir = tempfile::tempdir().unwrap();
        fs::write(dir.path().join("thesis.docx"), "x").unwrap();
        let err = refuse_foreign_folder(dir.path()).unwrap_err();
        assert!(
            matches!(err, IndexError::ForeignFolder { ref example, .. } if example == "thesis.docx")
        );
        assert!(refuse_foreign_folder(tempfile::tempdir().unwrap().path()).is_ok());
    }
}
