//! The notes index itself: open it, notice new, edited and deleted notes and
//! index only those, or rebuild it from the notes when it is missing, from an
//! older schema, damaged or unreadable. The notes are the source of truth;
//! nothing here writes to the notes folder, and a rebuild deletes only the
//! index's own files inside the index folder.

use std::fs::{self, File, OpenOptions};
use std::path::{Path, PathBuf};
use std::time::UNIX_EPOCH;

use fs4::fs_std::FileExt;
use indicatif::{ProgressBar, ProgressStyle};
use tantivy::{Index, IndexReader, IndexWriter, ReloadPolicy, Searcher, TantivyError, Term};

use super::manifest::{IndexFingerprint, ManifestProblem, MANIFEST_FILE};
use super::{
    content_hash, register_index_analyzers, IndexError, IndexLocation, IndexResult, Manifest,
    ManifestEntry, NoteSchema, SyncReport,
};
use crate::notes::{Note, NoteFile, NotesError, NotesFolder};

/// Memory budget of the index writer for a full build, in bytes (split over
/// its threads). Chosen so that indexing 100k notes stays well under 200 MB.
pub const WRITER_MEMORY_BUDGET: usize = 40_000_000;
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
            let parsed = match read_note(&folder, &file.name)? {
                Ok(text) => Note::parse(Path::new(&file.name), &text).map_err(|e| e.to_string()),
                Err(problem) => Err(problem),
            };
            match parsed {
                Ok(note) => {
                    writer
                        .add_document(schema.document(&note))
                        .map_err(|e| tantivy(memory, e))?;
                    report.added += 1;
                }
                Err(problem) => report.broken.push(qualify(&folder, &problem)),
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
        // Fast path without our lock: an intact index with nothing to do.
        if let Ok((index, manifest)) = try_open(dir) {
            let files = folder.list()?;
            if changes(&manifest, &files).is_empty() {
                let report = SyncReport {
                    broken: broken_of(&folder, &manifest),
                    ..SyncReport::default()
                };
                return Ok((index.into_note_index(folder, dir)?, report));
            }
        }
        let _lock = lock(dir)?;
        // Re-check under the lock: another process may have done the work.
        match try_open(dir) {
            Ok((index, manifest)) => {
                let index = index.into_note_index(folder, dir)?;
                index.apply_changes(manifest)
            }
            Err(reason) => Self::rebuild(folder, dir, reason),
        }
    }

    /// Index new and edited notes and drop deleted ones; caller holds the lock.
    fn apply_changes(self, mut manifest: Manifest) -> IndexResult<(NoteIndex, SyncReport)> {
        let dir = self.dir.clone().unwrap_or_default();
        let files = self.folder.list()?;
        let mut report = SyncReport::default();
        let mut writer: Option<IndexWriter> = None;
        let change = changes(&manifest, &files);
        for name in &change.removed {
            let writer = self.writer(&mut writer, &dir)?;
            writer.delete_term(Term::from_field_text(self.schema.id, &name_to_id(name)));
            manifest.entries.remove(name);
            report.removed += 1;
        }
        for file in &change.changed {
            let known = manifest.entries.get(&file.name);
            let text = match read_note(&self.folder, &file.name)? {
                Ok(text) => text,
                Err(problem) => {
                    // Unread: whatever was indexed from this file before goes.
                    let writer = self.writer(&mut writer, &dir)?;
                    writer.delete_term(Term::from_field_text(
                        self.schema.id,
                        &name_to_id(&file.name),
                    ));
                    if known.is_some() {
                        report.updated += 1;
                    } else {
                        report.added += 1;
                    }
                    let entry = unread_entry(file, problem);
                    manifest.entries.insert(file.name.clone(), entry);
                    continue;
                }
            };
            let hash = content_hash(text.as_bytes());
            let entry = |broken| ManifestEntry {
                broken,
                hash,
                mtime_ns: file.mtime_ns,
                size: file.size,
            };
            if known.is_some_and(|k| k.hash == hash) {
                // Touched but not changed: remember the new time only.
                let broken = known.and_then(|k| k.broken.clone());
                manifest.entries.insert(file.name.clone(), entry(broken));
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
        if let Some(mut writer) = writer {
            writer.commit().map_err(|e| tantivy(&dir, e))?;
            writer
                .wait_merging_threads()
                .map_err(|e| tantivy(&dir, e))?;
            // Saved after the commit: a crash in between only redoes the changes.
            manifest.index_files = index_fingerprint(&dir)?;
            manifest.save(&dir)?;
            self.reader.reload().map_err(|e| tantivy(&dir, e))?;
        } else {
            manifest.save(&dir)?;
        }
        report.broken = broken_of(&self.folder, &manifest);
        Ok((self, report))
    }

    fn writer<'w>(
        &self,
        writer: &'w mut Option<IndexWriter>,
        dir: &Path,
    ) -> IndexResult<&'w mut IndexWriter> {
        if writer.is_none() {
            *writer = Some(
                self.index
                    .writer_with_num_threads(1, UPDATE_MEMORY_BUDGET)
                    .map_err(|e| tantivy(dir, e))?,
            );
        }
        writer
            .as_mut()
            .ok_or_else(|| IndexError::io(dir, std::io::Error::other("no index writer")))
    }

    /// Index every note from scratch; caller holds the lock.
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
        let threads = std::thread::available_parallelism().map_or(1, |n| n.get().min(2));
        let mut writer: IndexWriter = index
            .writer_with_num_threads(threads, WRITER_MEMORY_BUDGET)
            .map_err(|e| tantivy(dir, e))?;
        let files = folder.list()?;
        let progress = progress_bar(files.len());
        let mut manifest = Manifest::default();
        let mut report = SyncReport {
            rebuilt: Some(reason),
            ..SyncReport::default()
        };
        for file in &files {
            let text = match read_note(&folder, &file.name)? {
                Ok(text) => text,
                Err(problem) => {
                    manifest
                        .entries
                        .insert(file.name.clone(), unread_entry(file, problem));
                    progress.inc(1);
                    continue;
                }
            };
            let broken = match Note::parse(Path::new(&file.name), &text) {
                Ok(note) => {
                    writer
                        .add_document(schema.document(&note))
                        .map_err(|e| tantivy(dir, e))?;
                    report.added += 1;
                    None
                }
                Err(error) => Some(error.to_string()),
            };
            let entry = ManifestEntry {
                broken,
                hash: content_hash(text.as_bytes()),
                mtime_ns: file.mtime_ns,
                size: file.size,
            };
            manifest.entries.insert(file.name.clone(), entry);
            progress.inc(1);
        }
        progress.set_message("committing");
        writer.commit().map_err(|e| tantivy(dir, e))?;
        writer.wait_merging_threads().map_err(|e| tantivy(dir, e))?;
        manifest.index_files = index_fingerprint(dir)?;
        manifest.save(dir)?;
        progress.finish_and_clear();
        report.broken = broken_of(&folder, &manifest);
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

/// Open and validate the index in `dir`, or say why it must be rebuilt.
fn try_open(dir: &Path) -> Result<(OpenedIndex, Manifest), String> {
    if !dir.join("meta.json").exists() {
        return Err("there was no index yet".into());
    }
    let manifest = Manifest::load(dir).map_err(|problem| match problem {
        ManifestProblem::Missing => "its manifest was missing".to_string(),
        ManifestProblem::OtherVersion(v) => format!("it was written with schema version {v}"),
        ManifestProblem::Unreadable(why) => format!("its manifest was unreadable ({why})"),
    })?;
    let index = Index::open_in_dir(dir).map_err(|e| format!("it could not be opened ({e})"))?;
    if index.schema() != NoteSchema::new().schema {
        return Err("its schema differs".into());
    }
    register_index_analyzers(&index);
    // Catches files damaged in place, which opening and searching do not notice.
    let damaged = index
        .validate_checksum()
        .map_err(|e| format!("it could not be checked ({e})"))?;
    if !damaged.is_empty() {
        return Err(format!("{} of its files were damaged", damaged.len()));
    }
    let reader = manual_reader(&index).map_err(|e| format!("it could not be read ({e})"))?;
    let indexed = manifest
        .entries
        .values()
        .filter(|e| e.broken.is_none())
        .count() as u64;
    let found = reader.searcher().num_docs();
    if found != indexed {
        return Err(format!(
            "it held {found} notes where its manifest lists {indexed}"
        ));
    }
    Ok((OpenedIndex { index, reader }, manifest))
}

fn manual_reader(index: &Index) -> tantivy::Result<IndexReader> {
    index
        .reader_builder()
        .reload_policy(ReloadPolicy::Manual)
        .try_into()
}

/// Files added or changed since the manifest, and names no longer there.
#[derive(Debug, Default)]
struct Changes<'f> {
    changed: Vec<&'f NoteFile>,
    removed: Vec<String>,
}

impl Changes<'_> {
    fn is_empty(&self) -> bool {
        self.changed.is_empty() && self.removed.is_empty()
    }
}

fn changes<'f>(manifest: &Manifest, files: &'f [NoteFile]) -> Changes<'f> {
    let changed = files
        .iter()
        .filter(|f| {
            manifest
                .entries
                .get(&f.name)
                .is_none_or(|e| e.size != f.size || e.mtime_ns != f.mtime_ns)
        })
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

/// A note's text, or why it is skipped: too large, not UTF-8, or a link out
/// of the notes folder (`name: reason`, as a parse error reads).
fn read_note(folder: &NotesFolder, name: &str) -> IndexResult<Result<String, String>> {
    match folder.read(name) {
        Ok(text) => Ok(Ok(text)),
        Err(NotesError::Unreadable { reason, .. }) => Ok(Err(format!("{name}: {reason}"))),
        Err(error) => Err(error.into()),
    }
}

/// The manifest entry of a note skipped unread. Its hash is that of the
/// reason: no note text starts like a reason, so an edit is always re-read.
fn unread_entry(file: &NoteFile, problem: String) -> ManifestEntry {
    ManifestEntry {
        hash: content_hash(problem.as_bytes()),
        broken: Some(problem),
        mtime_ns: file.mtime_ns,
        size: file.size,
    }
}

fn name_to_id(name: &str) -> String {
    name.strip_suffix(".md").unwrap_or(name).to_string()
}

/// The broken notes of a manifest, with the folder in front of each message.
fn broken_of(folder: &NotesFolder, manifest: &Manifest) -> Vec<String> {
    manifest
        .entries
        .values()
        .filter_map(|e| e.broken.as_deref())
        .map(|message| qualify(folder, message))
        .collect()
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
        || name == LOCK_FILE
        || name.starts_with(".spoolsleuth-manifest-")
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
        if name == MANIFEST_FILE || name == "meta.json" || name == LOCK_FILE {
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
