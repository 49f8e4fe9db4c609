//! The manifest stored beside the index: for every note file that was
//! indexed, its size, modification time and content hash, so a search can
//! tell new, edited and deleted notes from unchanged ones without reading
//! them; plus the size and time of each index file after the last write.
//!
//! A search reads it on every run, so it is a compact binary file loaded with
//! one read and looked at in place (names are borrowed from the bytes, not
//! copied): a text header line with the schema version, then little-endian
//! records. Written atomically (temp file + rename) after each commit.

use std::collections::BTreeMap;
use std::fs;
use std::io::Write;
use std::path::Path;

use super::{IndexError, IndexResult, SCHEMA_VERSION};

/// The manifest's file name inside the index folder.
pub const MANIFEST_FILE: &str = "spoolsleuth-manifest.bin";
/// The text manifest of earlier versions: still recognised as ours, never
/// read, removed by the rebuild that its absence of a binary manifest causes.
pub const OLD_MANIFEST_FILE: &str = "spoolsleuth-manifest.txt";
const MAGIC: &str = "spoolsleuth-index-manifest";
/// Marks a note without a parse error.
const NOT_BROKEN: u32 = u32::MAX;

/// What was indexed from one note file.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct ManifestEntry {
    /// The parse error when the note was skipped as malformed.
    pub broken: Option<String>,
    /// Content hash of the file.
    pub hash: u64,
    /// Modification time, ns since the epoch.
    pub mtime_ns: u128,
    /// Size in bytes.
    pub size: u64,
}

/// Size and modification time (ns) of each file of the index itself.
pub type IndexFingerprint = BTreeMap<String, (u64, u128)>;

/// File name → what was indexed, plus the state of the index files when it
/// was written: the form that is changed by an update.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct Manifest {
    /// The entries, by file name.
    pub entries: BTreeMap<String, ManifestEntry>,
    /// The index files as they were after the last write; a search checks
    /// the index's checksums only when these differ.
    pub index_files: IndexFingerprint,
}

/// One note of a manifest, borrowed from the manifest's bytes.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct NoteRecord<'a> {
    /// The parse error when the note was skipped as malformed.
    pub broken: Option<&'a str>,
    /// Content hash of the file.
    pub hash: u64,
    /// Modification time, ns since the epoch.
    pub mtime_ns: u128,
    /// File name.
    pub name: &'a str,
    /// Size in bytes.
    pub size: u64,
}

/// A manifest read in place: the form a search uses.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct ManifestView<'a> {
    /// The index files as they were after the last write.
    pub index_files: IndexFingerprint,
    /// The notes, in the order they were written.
    pub notes: Vec<NoteRecord<'a>>,
}

/// Why a manifest could not be used.
#[derive(Debug, PartialEq, Eq)]
pub enum ManifestProblem {
    /// No manifest file.
    Missing,
    /// Written by another schema version.
    OtherVersion(String),
    /// Not readable as a manifest.
    Unreadable(String),
}

/// Read the bytes of the manifest of the index in `dir` (one read).
pub fn read_manifest_bytes(dir: &Path) -> Result<Vec<u8>, ManifestProblem> {
    match fs::read(dir.join(MANIFEST_FILE)) {
        Ok(bytes) => Ok(bytes),
        Err(e) if e.kind() == std::io::ErrorKind::NotFound => Err(ManifestProblem::Missing),
        Err(e) => Err(ManifestProblem::Unreadable(e.to_string())),
    }
}

impl<'a> ManifestView<'a> {
    /// Parse manifest bytes, borrowing names and messages from them.
    pub fn parse(bytes: &'a [u8]) -> Result<ManifestView<'a>, ManifestProblem> {
        let newline = bytes
            .iter()
            .position(|b| *b == b'\n')
            .ok_or_else(|| ManifestProblem::Unreadable("no header".into()))?;
        let header = std::str::from_utf8(&bytes[..newline])
            .map_err(|_| ManifestProblem::Unreadable("bad header".into()))?;
        let version = header
            .strip_prefix(MAGIC)
            .map(str::trim)
            .ok_or_else(|| ManifestProblem::Unreadable("bad header".into()))?;
        if version != SCHEMA_VERSION.to_string() {
            return Err(ManifestProblem::OtherVersion(version.to_string()));
        }
        let mut reader = Reader {
            bytes: &bytes[newline + 1..],
        };
        let count = reader.u32()? as usize;
        // Each record takes at least 38 bytes: a bad count cannot over-allocate.
        let mut notes = Vec::with_capacity(count.min(reader.bytes.len() / 38));
        for _ in 0..count {
            let name = reader.text()?;
            let size = reader.u64()?;
            let mtime_ns = reader.u128()?;
            let hash = reader.u64()?;
            let broken = match reader.u32()? {
                NOT_BROKEN => None,
                len => Some(reader.str_of(len as usize)?),
            };
            notes.push(NoteRecord {
                broken,
                hash,
                mtime_ns,
                name,
                size,
            });
        }
        let mut index_files = IndexFingerprint::new();
        for _ in 0..reader.u32()? {
            let name = reader.text()?;
            let size = reader.u64()?;
            let mtime = reader.u128()?;
            index_files.insert(name.to_string(), (size, mtime));
        }
        if !reader.bytes.is_empty() {
            return Err(ManifestProblem::Unreadable("trailing bytes".into()));
        }
        Ok(ManifestView { index_files, notes })
    }

    /// The number of notes that are in the index (not skipped as broken).
    pub fn indexed(&self) -> usize {
        self.notes.iter().filter(|n| n.broken.is_none()).count()
    }

    /// An owned copy, for changing.
    pub fn to_manifest(&self) -> Manifest {
        let entries = self
            .notes
            .iter()
            .map(|n| {
                let entry = ManifestEntry {
                    broken: n.broken.map(str::to_string),
                    hash: n.hash,
                    mtime_ns: n.mtime_ns,
                    size: n.size,
                };
                (n.name.to_string(), entry)
            })
            .collect();
        Manifest {
            entries,
            index_files: self.index_files.clone(),
        }
    }
}

/// A cursor over manifest bytes; every read is bounds-checked.
struct Reader<'a> {
    bytes: &'a [u8],
}

impl<'a> Reader<'a> {
    fn take(&mut self, len: usize) -> Result<&'a [u8], ManifestProblem> {
        if self.bytes.len() < len {
            return Err(ManifestProblem::Unreadable("cut short".into()));
        }
        let (head, tail) = self.bytes.split_at(len);
        self.bytes = tail;
        Ok(head)
    }

    fn array<const N: usize>(&mut self) -> Result<[u8; N], ManifestProblem> {
        let mut out = [0; N];
        out.copy_from_slice(self.take(N)?);
        Ok(out)
    }

    fn u32(&mut self) -> Result<u32, ManifestProblem> {
        Ok(u32::from_le_bytes(self.array()?))
    }

    fn u64(&mut self) -> Result<u64, ManifestProblem> {
        Ok(u64::from_le_bytes(self.array()?))
    }

    fn u128(&mut self) -> Result<u128, ManifestProblem> {
        Ok(u128::from_le_bytes(self.array()?))
    }

    /// Text preceded by its length in two bytes.
    fn text(&mut self) -> Result<&'a str, ManifestProblem> {
        let len = u16::from_le_bytes(self.array()?);
        self.str_of(usize::from(len))
    }

    fn str_of(&mut self, len: usize) -> Result<&'a str, ManifestProblem> {
        std::str::from_utf8(self.take(len)?)
            .map_err(|_| ManifestProblem::Unreadable("text is not UTF-8".into()))
    }
}

/// Builds a manifest one note at a time, as notes are indexed, so a full
/// build never holds a map of all notes.
#[derive(Debug, Default)]
pub struct ManifestWriter {
    body: Vec<u8>,
    count: u32,
}

impl ManifestWriter {
    /// Add the record of one note file. Names longer than 65 535 bytes
    /// cannot occur (file systems allow 255) and are cut to fit.
    pub fn push(&mut self, name: &str, entry: &ManifestEntry) {
        push_text(&mut self.body, name);
        self.body.extend_from_slice(&entry.size.to_le_bytes());
        self.body.extend_from_slice(&entry.mtime_ns.to_le_bytes());
        self.body.extend_from_slice(&entry.hash.to_le_bytes());
        match &entry.broken {
            None => self.body.extend_from_slice(&NOT_BROKEN.to_le_bytes()),
            Some(message) => {
                let message = cut(message, (NOT_BROKEN - 1) as usize);
                self.body
                    .extend_from_slice(&(message.len() as u32).to_le_bytes());
                self.body.extend_from_slice(message.as_bytes());
            }
        }
        self.count += 1;
    }

    /// The whole file: header, notes, then the index files.
    fn render(&self, index_files: &IndexFingerprint) -> Vec<u8> {
        let mut out = format!("{MAGIC} {SCHEMA_VERSION}\n").into_bytes();
        out.reserve(self.body.len() + 8 + index_files.len() * 64);
        out.extend_from_slice(&self.count.to_le_bytes());
        out.extend_from_slice(&self.body);
        out.extend_from_slice(&(index_files.len() as u32).to_le_bytes());
        for (name, (size, mtime)) in index_files {
            push_text(&mut out, name);
            out.extend_from_slice(&size.to_le_bytes());
            out.extend_from_slice(&mtime.to_le_bytes());
        }
        out
    }

    /// Write the manifest into `dir` atomically (temp file + rename).
    pub fn save(&self, dir: &Path, index_files: &IndexFingerprint) -> IndexResult<()> {
        let mut temp = tempfile::Builder::new()
            .prefix(".spoolsleuth-manifest-")
            .tempfile_in(dir)
            .map_err(|e| IndexError::io(dir, e))?;
        temp.write_all(&self.render(index_files))
            .map_err(|e| IndexError::io(temp.path(), e))?;
        temp.as_file()
            .sync_all()
            .map_err(|e| IndexError::io(temp.path(), e))?;
        let target = dir.join(MANIFEST_FILE);
        temp.persist(&target)
            .map_err(|e| IndexError::io(&target, e.error))?;
        Ok(())
    }
}

fn push_text(out: &mut Vec<u8>, text: &str) {
    let text = cut(text, usize::from(u16::MAX));
    out.extend_from_slice(&(text.len() as u16).to_le_bytes());
    out.extend_from_slice(text.as_bytes());
}

/// `text` cut to at most `max` bytes at a character boundary.
fn cut(text: &str, max: usize) -> &str {
    if text.len() <= max {
        return text;
    }
    let mut end = max;
    while !text.is_char_boundary(end) {
        end -= 1;
    }
    &text[..end]
}

impl Manifest {
    /// Load the manifest of the index in `dir` as an owned map.
    pub fn load(dir: &Path) -> Result<Manifest, ManifestProblem> {
        let bytes = read_manifest_bytes(dir)?;
        Ok(ManifestView::parse(&bytes)?.to_manifest())
    }

    /// Write the manifest into `dir` atomically (temp file + rename).
    pub fn save(&self, dir: &Path) -> IndexResult<()> {
        let mut writer = ManifestWriter::default();
        for (name, entry) in &self.entries {
            writer.push(name, entry);
        }
        writer.save(dir, &self.index_files)
    }

    /// Remove the manifest (and one of an earlier format) from `dir`, if there.
    pub fn remove(dir: &Path) -> IndexResult<()> {
        for name in [MANIFEST_FILE, OLD_MANIFEST_FILE] {
            match fs::remove_file(dir.join(name)) {
                Err(e) if e.kind() != std::io::ErrorKind::NotFound => {
                    return Err(IndexError::io(dir.join(name), e))
                }
                _ => {}
            }
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn entry(broken: Option<&str>, hash: u64) -> ManifestEntry {
        ManifestEntry {
            broken: broken.map(str::to_string),
            hash,
            mtime_ns: 1_700_000_000_123_456_789,
            size: 42,
        }
    }

    #[test]
    fn round_trips_entries_and_broken_notes() {
        let mut manifest = Manifest::default();
        manifest.index_files.insert("meta.json".into(), (12, 34));
        manifest.entries.insert(
            "a b.md".into(),
            entry(Some("a b.md:3:1: unknown\tfield ✗"), 0xdead_beef),
        );
        manifest.entries.insert("ü.md".into(), entry(None, 7));
        let dir = tempfile::tempdir().unwrap();
        manifest.save(dir.path()).unwrap();
        assert_eq!(Manifest::load(dir.path()).unwrap(), manifest);
        let bytes = read_manifest_bytes(dir.path()).unwrap();
        let view = ManifestView::parse(&bytes).unwrap();
        assert_eq!(view.indexed(), 1);
        assert_eq!(view.notes[1].name, "ü.md");
        assert_eq!(view.notes[0].broken, Some("a b.md:3:1: unknown\tfield ✗"));
    }

    #[test]
    fn reports_missing_old_and_garbled_manifests() {
        let dir = tempfile::tempdir().unwrap();
        assert_eq!(Manifest::load(dir.path()), Err(ManifestProblem::Missing));
        assert_eq!(
            ManifestView::parse(format!("{MAGIC} 0\n").as_bytes()),
            Err(ManifestProblem::OtherVersion("0".into()))
        );
        let mut writer = ManifestWriter::default();
        writer.push("a.md", &entry(None, 1));
        let whole = writer.render(&IndexFingerprint::new());
        assert!(ManifestView::parse(&whole).is_ok());
        // Every shorter prefix, and a longer file, is refused without a panic.
        for end in 0..whole.len() {
            assert!(
                matches!(
                    ManifestView::parse(&whole[..end]),
                    Err(ManifestProblem::Unreadable(_))
                ),
                "prefix of {end} bytes"
            );
        }
        let mut longer = whole.clone();
        longer.push(0);
        assert!(ManifestView::parse(&longer).is_err());
    }

    #[test]
    fn a_huge_count_in_a_short_file_is_refused() {
        let mut bytes = format!("{MAGIC} {SCHEMA_VERSION}\n").into_bytes();
        bytes.extend_from_slice(&u32::MAX.to_le_bytes());
        assert_eq!(
            ManifestView::parse(&bytes),
            Err(ManifestProblem::Unreadable("cut short".into()))
        );
    }
}
