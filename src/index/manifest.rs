//! The manifest stored beside the index: for every note file that was
//! indexed, its size, modification time and content hash, so a search can
//! tell new, edited and deleted notes from unchanged ones without reading
//! them. A line-based text file, written atomically after each commit.

use std::collections::BTreeMap;
use std::fs;
use std::io::Write;
use std::path::Path;

use super::{IndexError, IndexResult, SCHEMA_VERSION};

/// The manifest's file name inside the index folder.
pub const MANIFEST_FILE: &str = "spoolsleuth-manifest.txt";
const MAGIC: &str = "spoolsleuth-index-manifest";

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

/// File name → what was indexed, plus the schema version it was indexed with
/// and the state of the index files when it was written.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct Manifest {
    /// The entries, by file name.
    pub entries: BTreeMap<String, ManifestEntry>,
    /// The index files as they were after the last write; a search checks
    /// the index's checksums only when these differ.
    pub index_files: IndexFingerprint,
}

const INDEX_FILE_PREFIX: &str = "#index\t";

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

impl Manifest {
    /// Load the manifest of the index in `dir`.
    pub fn load(dir: &Path) -> Result<Manifest, ManifestProblem> {
        let path = dir.join(MANIFEST_FILE);
        let text = match fs::read_to_string(&path) {
            Ok(text) => text,
            Err(e) if e.kind() == std::io::ErrorKind::NotFound => {
                return Err(ManifestProblem::Missing)
            }
            Err(e) => return Err(ManifestProblem::Unreadable(e.to_string())),
        };
        Self::parse(&text)
    }

    fn parse(text: &str) -> Result<Manifest, ManifestProblem> {
        let mut lines = text.lines();
        let header = lines.next().unwrap_or_default();
        let version = header
            .strip_prefix(MAGIC)
            .map(str::trim)
            .ok_or_else(|| ManifestProblem::Unreadable("bad header".into()))?;
        if version != SCHEMA_VERSION.to_string() {
            return Err(ManifestProblem::OtherVersion(version.to_string()));
        }
        let mut entries = BTreeMap::new();
        let mut index_files = BTreeMap::new();
        for (number, line) in lines.enumerate() {
            let bad = || ManifestProblem::Unreadable(format!("line {}", number + 2));
            if let Some(rest) = line.strip_prefix(INDEX_FILE_PREFIX) {
                let mut parts = rest.splitn(3, '\t');
                let mut next = || parts.next().ok_or_else(bad);
                let size = next()?.parse().map_err(|_| bad())?;
                let mtime = next()?.parse().map_err(|_| bad())?;
                index_files.insert(next()?.to_string(), (size, mtime));
                continue;
            }
            let mut parts = line.splitn(5, '\t');
            let mut next = || parts.next().ok_or_else(bad);
            let size = next()?.parse().map_err(|_| bad())?;
            let mtime_ns = next()?.parse().map_err(|_| bad())?;
            let hash = u64::from_str_radix(next()?, 16).map_err(|_| bad())?;
            let name = next()?.to_string();
            let broken = parts.next().map(str::to_string);
            entries.insert(
                name,
                ManifestEntry {
                    broken,
                    hash,
                    mtime_ns,
                    size,
                },
            );
        }
        Ok(Manifest {
            entries,
            index_files,
        })
    }

    fn render(&self) -> String {
        let mut out = format!("{MAGIC} {SCHEMA_VERSION}\n");
        for (name, (size, mtime)) in &self.index_files {
            out.push_str(&format!("{INDEX_FILE_PREFIX}{size}\t{mtime}\t{name}\n"));
        }
        for (name, entry) in &self.entries {
            out.push_str(&format!(
                "{}\t{}\t{:016x}\t{name}",
                entry.size, entry.mtime_ns, entry.hash
            ));
            if let Some(broken) = &entry.broken {
                out.push('\t');
                out.push_str(&broken.replace(['\t', '\n', '\r'], " "));
            }
            out.push('\n');
        }
        out
    }

    /// Write the manifest into `dir` atomically (temp file + rename).
    pub fn save(&self, dir: &Path) -> IndexResult<()> {
        let mut temp = tempfile::Builder::new()
            .prefix(".spoolsleuth-manifest-")
            .tempfile_in(dir)
            .map_err(|e| IndexError::io(dir, e))?;
        temp.write_all(self.render().as_bytes())
            .map_err(|e| IndexError::io(temp.path(), e))?;
        temp.as_file()
            .sync_all()
            .map_err(|e| IndexError::io(temp.path(), e))?;
        let target = dir.join(MANIFEST_FILE);
        temp.persist(&target)
            .map_err(|e| IndexError::io(&target, e.error))?;
        Ok(())
    }

    /// Remove the manifest from `dir`, if there.
    pub fn remove(dir: &Path) -> IndexResult<()> {
        match fs::remove_file(dir.join(MANIFEST_FILE)) {
            Err(e) if e.kind() != std::io::ErrorKind::NotFound => {
                Err(IndexError::io(dir.join(MANIFEST_FILE), e))
            }
            _ => Ok(()),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn round_trips_entries_and_broken_notes() {
        let mut manifest = Manifest::default();
        manifest.index_files.insert("meta.json".into(), (12, 34));
        manifest.entries.insert(
            "a b.md".into(),
            ManifestEntry {
                broken: Some("a b.md:3:1: unknown\tfield".into()),
                hash: 0xdead_beef,
                mtime_ns: 1_700_000_000_123_456_789,
                size: 42,
            },
        );
        let dir = tempfile::tempdir().unwrap();
        manifest.save(dir.path()).unwrap();
        let back = Manifest::load(dir.path()).unwrap();
        assert_eq!(
            back.entries["a b.md"].broken.as_deref(),
            Some("a b.md:3:1: unknown field")
        );
        assert_eq!(back.entries["a b.md"].hash, 0xdead_beef);
        assert_eq!(back.index_files, manifest.index_files);
    }

    #[test]
    fn reports_missing_old_and_garbled_manifests() {
        let dir = tempfile::tempdir().unwrap();
        assert_eq!(Manifest::load(dir.path()), Err(ManifestProblem::Missing));
        assert_eq!(
            Manifest::parse(&format!("{MAGIC} 0\n")),
            Err(ManifestProblem::OtherVersion("0".into()))
        );
        assert!(matches!(
            Manifest::parse(&format!("{MAGIC} {SCHEMA_VERSION}\nx\t1")),
            Err(ManifestProblem::Unreadable(_))
        ));
    }
}
