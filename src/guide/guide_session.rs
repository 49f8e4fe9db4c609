//! The saved state of a guided walk: the options it started with and every
//! answer accepted so far. Replaying the answers rebuilds the walk exactly,
//! so an interrupted walk resumes where it stopped.

use std::path::{Path, PathBuf};

use serde::{Deserialize, Serialize};

/// The session file's version.
const VERSION: u32 = 1;

/// A walk's answers so far.
#[derive(Clone, Debug, Default, PartialEq, Eq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct GuideSession {
    /// File format version.
    pub version: u32,
    /// Answers accepted so far, in order.
    pub answers: Vec<String>,
}

/// A session file that could not be read or written.
#[derive(Debug, thiserror::Error)]
pub enum SessionError {
    /// Reading or writing failed.
    #[error("{path}: {source}")]
    Io {
        /// The session file.
        path: String,
        /// Why.
        source: std::io::Error,
    },
    /// The file is not a session of this version.
    #[error("{path}: not a guide session this version can resume: {message}")]
    Invalid {
        /// The session file.
        path: String,
        /// Why.
        message: String,
    },
}

impl GuideSession {
    /// An empty session.
    pub fn new() -> Self {
        GuideSession {
            version: VERSION,
            answers: Vec::new(),
        }
    }

    /// Read a saved session.
    pub fn load(path: &Path) -> Result<Self, SessionError> {
        let text = crate::text_file::read_text(path).map_err(|source| SessionError::Io {
            path: path.display().to_string(),
            source,
        })?;
        let session: GuideSession =
            serde_json::from_str(&text).map_err(|e| SessionError::Invalid {
                path: path.display().to_string(),
                message: e.to_string(),
            })?;
        if session.version != VERSION {
            return Err(SessionError::Invalid {
                path: path.display().to_string(),
                message: format!("version {} (expected {VERSION})", session.version),
            });
        }
        Ok(session)
    }

    /// Write the session atomically (a temporary file renamed over the old one).
    pub fn save(&self, path: &Path) -> Result<(), SessionError> {
        let io = |source| SessionError::Io {
            path: path.display().to_string(),
            source,
        };
        let dir = path
            .parent()
            .filter(|p| !p.as_os_str().is_empty())
            .unwrap_or(Path::new("."));
        std::fs::create_dir_all(dir).map_err(io)?;
        let mut tmp = tempfile::NamedTempFile::new_in(dir).map_err(io)?;
        let text = serde_json::to_string_pretty(self).expect("a session always serialises");
        std::io::Write::write_all(&mut tmp, text.as_bytes()).map_err(io)?;
        tmp.persist(path).map_err(|e| io(e.error))?;
        Ok(())
    }

    /// The default session file: in the user's cache folder.
    pub fn default_path() -> PathBuf {
        directories::ProjectDirs::from("", "", "spoolsleuth")
            .map_or_else(std::env::temp_dir, |d| d.cache_dir().to_path_buf())
            .join("guide-session.json")
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_session_round_trips_through_its_file() {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("s.json");
        let mut s = GuideSession::new();
        s.answers = vec!["it bogs".into(), "y".into()];
        s.save(&path).unwrap();
        assert_eq!(GuideSession::load(&path).unwrap(), s);
        std::fs::write(&path, "{\"version\": 9, \"answers\": []}").unwrap();
        let err = GuideSession::load(&path).unwrap_err().to_string();
        assert!(err.ends_with("version 9 (expected 1)"), "{err}");
    }
}
