//! The manifest stored beside the index: for every note file that was
//! indexed, its size, modification time and content hash, so a search can
//! tell new, edited and deleted notes from unchanged ones without reading
//! them; plus the size and time of each index file after the last write.
//!
//! A search reads it on every run, so it is a compact binary file loaded with
//! one read and looked at in place (names are borrowed from the bytes, not
//! copied): a text header line with the schema version, then little-endian
//! fields. A summary comes first (how many notes are indexed, the messages
//! of the broken ones, the index files), so a search that needs no note's
//! record reads only that; the records follow. Written atomically (temp
//! file + rename) after each commit.

use std::collections::BTreeMap;
use std::fs;
use std::io::{BufRead, BufReader, Read, Write};
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

/// The summary at the head of a manifest: enough to check an index whose
/// notes are known not to have changed.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct ManifestSummary {
    /// The messages of the notes skipped as malformed.
    pub broken: Vec<String>,
    /// Notes in the index.
    pub indexed: usize,
    /// The index files as they were after the last write.
    pub index_files: IndexFingerprint,
}

/// The longest summary read: far more than thousands of broken notes'
/// messages take, and a bound on what a damaged length can ask for.
const MAX_SUMMARY_BYTES: u64 = 64 * 1024 * 1024;

impl ManifestSummary {
    /// Read only the header and summary of the manifest in `dir`.
    pub fn read(dir: &Path) -> Result<ManifestSummary, ManifestProblem> {
        let file = match fs::File::open(dir.join(MANIFEST_FILE)) {
            Ok(file) => file,
            Err(e) if e.kind() == std::io::ErrorKind::NotFound => {
                return Err(ManifestProblem::Missing)
            }
            Err(e) => return Err(ManifestProblem::Unreadable(e.to_string())),
        };
        let unreadable = |e: std::io::Error| ManifestProblem::Unreadable(e.to_string());
        let mut file = BufReader::new(file);
        let mut header = Vec::new();
        file.by_ref()
            .take(256)
            .read_until(b'\n', &mut header)
            .map_err(unreadable)?;
        check_header(&header)?;
        let mut length = [0u8; 8];
        file.read_exact(&mut length)
            .map_err(|_| ManifestProblem::Unreadable("cut short".into()))?;
        let length = u64::from_le_bytes(length);
        if length > MAX_SUMMARY_BYTES {
            return Err(ManifestProblem::Unreadable("summary too long".into()));
        }
        let mut summary = Vec::new();
        file.take(length)
            .read_to_end(&mut summary)
            .map_err(unreadable)?;
        if summary.len() as u64 != length {
            return Err(ManifestProblem::Unreadable("cut short".into()));
        }
        let mut reader = Reader { bytes: &summary };
        let parsed = parse_summary(&mut reader)?;
        if !reader.bytes.is_empty() {
            return Err(ManifestProblem::Unreadable("bad summary".into()));
        }
        Ok(parsed)
    }
}

/// Check the header line (with its newline) names this schema version.
fn check_header(line: &[u8]) -> Result<(), ManifestProblem> {
    let line = line
        .strip_suffix(b"\n")
        .ok_or_else(|| ManifestProblem::Unreadable("no header".into()))?;
    let header =
        std::str::from_utf8(line).map_err(|_| ManifestProblem::Unreadable("bad header".into()))?;
    let version = header
        .strip_prefix(MAGIC)
        .map(str::trim)
        .ok_or_else(|| ManifestProblem::Unreadable("bad header".into()))?;
    if version != SCHEMA_VERSION.to_string() {
        return Err(ManifestProblem::OtherVersion(version.to_string()));
    }
    Ok(())
}

fn parse_summary(reader: &mut Reader<'_>) -> Result<ManifestSummary, ManifestProblem> {
    let indexed = reader.u32()? as usize;
    let mut broken = Vec::new();
    for _ in 0..reader.u32()? {
        let len = reader.u32()? as usize;
        broken.push(reader.str_of(len)?.to_string());
    }
    let mut index_files = IndexFingerprint::new();
    for _ in 0..reader.u32()? {
        let name = reader.text()?;
        let size = reader.u64()?;
        let mtime = reader.u128()?;
        index_files.insert(name.to_string(), (size, mtime));
    }
    Ok(ManifestSummary {
        broken,
        indexed,
        index_files,
    })
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
        check_header(&bytes[..=newline])?;
        let mut reader = Reader {
            bytes: &bytes[newline + 1..],
        };
        let length = usize::try_from(reader.u64()?)
            .map_err(|_| ManifestProblem::Unreadable("summary too long".into()))?;
        let mut summary = Reader {
            bytes: reader.take(length)?,
        };
        let summary_fields = parse_summary(&mut summary)?;
        if !summary.bytes.is_empty() {
            return Err(ManifestProblem::Unreadable("bad summary".into()));
        }
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
        if !reader.bytes.is_empty() {
            return Err(ManifestProblem::Unreadable("trailing bytes".into()));
        }
        let view = ManifestView {
            index_files: summary_fields.index_files,
            notes,
        };
        if view.indexed() != summary_fields.indexed {
            return Err(ManifestProblem::Unreadable(
                "its summary disagrees with its records".into(),
            ));
        }
        Ok(view)
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
    broken: Vec<String>,
    count: u32,
    indexed: u32,
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
            None => {
                self.body.extend_from_slice(&NOT_BROKEN.to_le_bytes());
                self.indexed += 1;
            }
            Some(message) => {
                let message = cut(message, (NOT_BROKEN - 1) as usize);
                self.body
                    .extend_from_slice(&(message.len() as u32).to_le_bytes());
                self.body.extend_from_slice(message.as_bytes());
                self.broken.push(message.to_string());
            }
        }
        self.count += 1;
    }

    /// The whole file: header, summary (its length first), then the notes.
    fn render(&self, index_files: &IndexFingerprint) -> Vec<u8> {
        let mut summary = Vec::new();
        summary.extend_from_slice(&self.indexed.to_le_bytes());
        summary.extend_from_slice(&(self.broken.len() as u32).to_le_bytes());
        for message in &self.broken {
            summary.extend_from_slice(&(message.len() as u32).to_le_bytes());
            summary.extend_from_slice(message.as_bytes());
        }
        summary.extend_from_slice(&(index_files.len() as u32).to_le_bytes());
        for (name, (size, mtime)) in index_files {
            push_text(&mut summary, name);
            summary.extend_from_slice(&size.to_le_bytes());
            summary.extend_from_slice(&mtime.to_le_bytes());
        }
        let mut out = format!("{MAGIC} {SCHEMA_VERSION}\n").into_bytes();
        out.reserve(8 + summary.len() + 4 + self.body.len());
        out.extend_from_slice(&(summary.len() as u64).to_le_bytes());
        out.extend_from_slice(&summary);
        out.extend_from_slice(&self.count.to_le_bytes());
        out.extend_from_slice(&self.body);
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
        let summary = ManifestSummary::read(dir.path()).unwrap();
        assert_eq!(summary.indexed, 1);
        assert_eq!(summary.broken, ["a b.md:3:1: unknown\tfield ✗"]);
        assert_eq!(summary.index_files, manifest.index_files);
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
        // The summary alone, from a file cut anywhere inside it.
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join(MANIFEST_FILE);
        let summary_end = whole.iter().position(|b| *b == b'\n').unwrap() + 1 + 8 + 12;
        for end in 0..summary_end {
            fs::write(&path, &whole[..end]).unwrap();
            assert!(
                matches!(
                    ManifestSummary::read(dir.path()),
                    Err(ManifestProblem::Unreadable(_))
                ),
                "prefix of {end} bytes"
            );
        }
        fs::write(&path, &whole).unwrap();
        assert_eq!(ManifestSummary::read(dir.path()).unwrap().indexed, 1);
    }

    proptest::proptest! {
        #[test]
        fn any_bytes_after_a_good_header_are_read_or_refused_without_a_panic(
            tail in proptest::collection::vec(proptest::num::u8::ANY, 0..512)
        ) {
            let mut bytes = format!("{MAGIC} {SCHEMA_VERSION}\n").into_bytes();
            bytes.extend_from_slice(&tail);
            let _ = ManifestView::parse(&bytes);
            let dir = tempfile::tempdir().unwrap();
            fs::write(dir.path().join(MANIFEST_FILE), &bytes).unwrap();
            let _ = ManifestSummary::read(dir.path());
        }
    }

    #[test]
    fn a_summary_that_disagrees_with_the_records_is_refused() {
        let mut writer = ManifestWriter::default();
        writer.push("a.md", &entry(None, 1));
        writer.indexed = 2;
        assert_eq!(
            ManifestView::parse(&writer.render(&IndexFingerprint::new())),
            Err(ManifestProblem::Unreadable(
                "its summary disagrees with its records".into()
            ))
        );
    }

    #[test]
    fn a_huge_count_in_a_short_file_is_refused() {
        let mut bytes = format!("{MAGIC} {SCHEMA_VERSION}\n").into_bytes();
        bytes.extend_from_slice(&12u64.to_le_bytes());
        bytes.extend_from_slice(&[0; 12]);
        bytes.extend_from_slice(&u32::MAX.to_le_bytes());
        assert_eq!(
            ManifestView::parse(&bytes),
            Err(ManifestProblem::Unreadable("cut short".into()))
        );
    }
}
