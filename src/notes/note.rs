//! One case note: what happened to which machine, why, and how it was fixed.

use std::path::Path;

use serde::Serialize;

use super::{Downtime, FrontMatter, NoteDate, NoteError, NoteId, Reading};

/// A validated case note.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Note {
    /// The cause id found, e.g. `compensator-sticking`.
    pub cause: String,
    /// When the case happened.
    pub date: NoteDate,
    /// How long the machine was down, if recorded.
    pub downtime: Option<Downtime>,
    /// What was done about it.
    pub fix: String,
    /// The note's id (its file name without `.md`).
    pub id: NoteId,
    /// The machine id, e.g. `press-4`.
    pub machine: String,
    /// Parts used.
    pub parts: Vec<String>,
    /// Readings taken, as named text.
    pub readings: Vec<Reading>,
    /// Symptom ids, e.g. `speed-sags-under-load`.
    pub symptoms: Vec<String>,
    /// The technician's initials.
    pub technician: Option<String>,
    /// The free text after the front matter.
    pub text: String,
    /// A one-line summary of the complaint.
    pub title: String,
}

/// The JSON shape of a note (`cases show --json`); field names are stable.
#[derive(Serialize)]
pub struct NoteJson<'a> {
    cause: &'a str,
    date: String,
    downtime: Option<String>,
    downtime_minutes: Option<u64>,
    fix: &'a str,
    id: &'a str,
    machine: &'a str,
    parts: &'a [String],
    path: String,
    readings: &'a [Reading],
    schema_version: u32,
    symptoms: &'a [String],
    tech: Option<&'a str>,
    text: &'a str,
    title: &'a str,
}

/// The front matter fields in the order they are written.
#[derive(Serialize)]
struct FrontMatterOut<'a> {
    date: String,
    machine: &'a str,
    title: &'a str,
    symptoms: &'a [String],
    cause: &'a str,
    fix: &'a str,
    #[serde(skip_serializing_if = "<[String]>::is_empty")]
    parts: &'a [String],
    #[serde(skip_serializing_if = "Option::is_none")]
    downtime: Option<String>,
    #[serde(skip_serializing_if = "serde_yaml::Mapping::is_empty")]
    readings: serde_yaml::Mapping,
    #[serde(skip_serializing_if = "Option::is_none")]
    tech: Option<&'a str>,
}

impl Note {
    /// Parse the text of the file at `path`; the id is the file stem.
    pub fn parse(path: &Path, text: &str) -> Result<Note, NoteError> {
        let stem = path
            .file_stem()
            .map(|s| s.to_string_lossy().into_owned())
            .unwrap_or_default();
        FrontMatter::split(path, text)?.into_note(NoteId::from_stem(&stem))
    }

    /// The note as a Markdown file with front matter; parses back to the same note.
    pub fn to_markdown(&self) -> String {
        let readings = self
            .readings
            .iter()
            .map(|r| {
                (
                    serde_yaml::Value::from(r.name.as_str()),
                    serde_yaml::Value::from(r.value.as_str()),
                )
            })
            .collect();
        let front = FrontMatterOut {
            cause: &self.cause,
            date: self.date.to_string(),
            downtime: self.downtime.map(|d| d.to_string()),
            fix: &self.fix,
            machine: &self.machine,
            parts: &self.parts,
            readings,
            symptoms: &self.symptoms,
            tech: self.technician.as_deref(),
            title: &self.title,
        };
        // Serializing plain strings, lists and a string map cannot fail.
        let yaml = serde_yaml::to_string(&front).unwrap_or_default();
        // Blank lines around the text and spaces after it are layout; the
        // indentation of its first line is content (a Markdown code block).
        let text = self.text.trim_start_matches(['\r', '\n']).trim_end();
        if text.trim().is_empty() {
            format!("---\n{yaml}---\n")
        } else {
            format!("---\n{yaml}---\n\n{text}\n")
        }
    }

    /// The stable JSON view of the note, with the path it was read from.
    pub fn to_json(&self, path: &Path) -> NoteJson<'_> {
        NoteJson {
            cause: &self.cause,
            date: self.date.to_string(),
            downtime: self.downtime.map(|d| d.to_string()),
            downtime_minutes: self.downtime.map(Downtime::minutes),
            fix: &self.fix,
            id: self.id.as_str(),
            machine: &self.machine,
            parts: &self.parts,
            path: path.display().to_string(),
            readings: &self.readings,
            schema_version: 1,
            symptoms: &self.symptoms,
            tech: self.technician.as_deref(),
            text: &self.text,
            title: &self.title,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn markdown_round_trips_awkward_text() {
        let note = Note {
            cause: "pump-worn".into(),
            date: "2022-05-06".parse().unwrap(),
            downtime: Some(Downtime::from_minutes(90)),
            fix: "yes: replaced 'pump' # really\nsecond line".into(),
            id: NoteId::from_stem("n"),
            machine: "conveyor-7".into(),
            parts: vec!["true".into(), "12".into()],
            readings: vec!["case drain: 4 L/min".parse().unwrap()],
            symptoms: vec!["runs-hot".into()],
            technician: Some("MK".into()),
            text: "Text --- with dashes\n\n---\nand a rule.".into(),
            title: "- starts with a dash".into(),
        };
        let back = Note::parse(Path::new("n.md"), &note.to_markdown()).unwrap();
        assert_eq!(back.fix, note.fix);
        assert_eq!(back.title, note.title);
        assert_eq!(back.parts, note.parts);
        assert_eq!(back.readings, note.readings);
        assert_eq!(back.text.trim(), note.text);
    }

    #[test]
    fn the_text_keeps_the_indentation_of_its_first_line() {
        let mut note = Note::parse(
            Path::new("n.md"),
            "---\ndate: 2022-05-06\nmachine: conveyor-7\ntitle: t\nsymptoms: [runs-hot]\n\
             cause: pump-worn\nfix: f\n---\n",
        )
        .unwrap();
        note.text = "\n\n    case drain: 4 L/min\n    supply: 160 bar  \n\n".into();
        let back = Note::parse(Path::new("n.md"), &note.to_markdown()).unwrap();
        assert_eq!(back.text, "    case drain: 4 L/min\n    supply: 160 bar\n");
        assert_eq!(
            Note {
                text: note.text.clone(),
                ..back
            },
            note
        );
    }
}
