//! A note being put together from command-line options, a finished
//! diagnosis (JSON) or an editor template, before it is validated.

use std::path::Path;

use serde_json::Value;

use super::front_matter::{check_known, check_machine};
use super::vocabulary::{CAUSE_IDS, SYMPTOM_IDS};
use super::{Downtime, Note, NoteDate, NoteId, NotesError, NotesResult, Reading};

/// The fields of a note, each possibly missing.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct NoteDraft {
    /// Cause id.
    pub cause: Option<String>,
    /// Date `YYYY-MM-DD`; today when missing.
    pub date: Option<String>,
    /// Downtime such as `2 h`.
    pub downtime: Option<String>,
    /// What was done.
    pub fix: Option<String>,
    /// Machine id.
    pub machine: Option<String>,
    /// Parts used.
    pub parts: Vec<String>,
    /// Readings as `name: value`.
    pub readings: Vec<String>,
    /// Symptom ids.
    pub symptoms: Vec<String>,
    /// Technician's initials.
    pub technician: Option<String>,
    /// Free text.
    pub text: Option<String>,
    /// One-line complaint.
    pub title: Option<String>,
}

/// How a field is named in errors: by option (`--cause`) or by JSON field.
#[derive(Clone, Copy, Debug)]
pub enum DraftOrigin<'a> {
    /// Options of `cases add`.
    Options,
    /// A JSON file.
    Json(&'a Path),
}

impl DraftOrigin<'_> {
    fn name(self, field: &str) -> String {
        match self {
            DraftOrigin::Options => format!("--{}", field.trim_end_matches('s')),
            DraftOrigin::Json(path) => format!("{}: field '{field}'", path.display()),
        }
    }
}

impl NoteDraft {
    /// Read a finished diagnosis. Only the fields a note needs are read;
    /// anything else in the file is ignored.
    pub fn from_json(path: &Path, text: &str) -> NotesResult<NoteDraft> {
        let json_error = |message: String| NotesError::Json {
            path: path.to_path_buf(),
            message,
        };
        let value: Value = serde_json::from_str(text).map_err(|e| {
            json_error(format!(
                "{}:{}: {}",
                e.line(),
                e.column(),
                strip_position(&e.to_string())
            ))
        })?;
        let Value::Object(object) = &value else {
            return Err(json_error("a diagnosis must be a JSON object".into()));
        };
        // A field may be plain text, or an object as `diagnose --json` writes
        // it (`machine: {id, name}`, `fix: {cause, label, text}`).
        let text_of = |keys: &[&str]| {
            keys.iter().find_map(|key| {
                let v = object.get(*key)?;
                scalar_text(v)
                    .or_else(|| v.get("id").and_then(scalar_text))
                    .or_else(|| v.get("text").and_then(scalar_text))
            })
        };
        let cause = object
            .get("leading_cause")
            .and_then(|v| v.get("id").and_then(scalar_text).or_else(|| scalar_text(v)))
            .or_else(|| text_of(&["leading_cause_id", "cause"]))
            .or_else(|| {
                object
                    .get("fix")
                    .and_then(|f| f.get("cause"))
                    .and_then(scalar_text)
            })
            .or_else(|| leading_of_diagnosis(object));
        let readings = match object.get("readings") {
            Some(value) => readings_of(value)
                .map_err(|message| json_error(format!("field 'readings': {message}")))?,
            None => Vec::new(),
        };
        Ok(NoteDraft {
            cause,
            date: text_of(&["date"]),
            downtime: text_of(&["downtime"]),
            fix: text_of(&["fix"]),
            machine: text_of(&["machine"]),
            parts: object.get("parts").map(list_of).unwrap_or_default(),
            readings,
            symptoms: object.get("symptoms").map(list_of).unwrap_or_default(),
            technician: text_of(&["tech", "technician"]),
            text: text_of(&["notes", "text"]),
            title: text_of(&["complaint", "title"]),
        })
    }

    /// This draft with every field that `other` sets taken from `other`.
    pub fn overridden_by(mut self, other: NoteDraft) -> NoteDraft {
        macro_rules! take {
            ($($field:ident),*) => { $( if other.$field.is_some() { self.$field = other.$field; } )* };
        }
        take!(cause, date, downtime, fix, machine, technician, text, title);
        for (mine, theirs) in [
            (&mut self.parts, other.parts),
            (&mut self.readings, other.readings),
            (&mut self.symptoms, other.symptoms),
        ] {
            if !theirs.is_empty() {
                *mine = theirs;
            }
        }
        self
    }

    /// True when no field is set.
    pub fn is_empty(&self) -> bool {
        *self == NoteDraft::default()
    }

    /// Validate into a note with a fresh id; errors name the option or field.
    pub fn into_note(self, origin: DraftOrigin<'_>) -> NotesResult<Note> {
        let bad = |field: &str, message: String| NotesError::Option {
            option: origin.name(field),
            message,
        };
        let need = |field: &str, value: Option<String>| {
            value
                .map(|v| v.trim().to_string())
                .filter(|v| !v.is_empty())
                .ok_or_else(|| bad(field, "is required".into()))
        };
        let machine = need("machine", self.machine)?;
        check_machine(&machine).map_err(|m| bad("machine", m))?;
        let title = need("title", self.title)?;
        let cause = need("cause", self.cause)?;
        check_known("cause", &cause, CAUSE_IDS).map_err(|m| bad("cause", m))?;
        if self.symptoms.is_empty() {
            return Err(bad("symptoms", "at least one symptom is required".into()));
        }
        for symptom in &self.symptoms {
            check_known("symptoms", symptom, SYMPTOM_IDS).map_err(|m| bad("symptoms", m))?;
        }
        let date = match self.date {
            Some(date) => date.parse::<NoteDate>().map_err(|m| bad("date", m))?,
            None => NoteDate::today(),
        };
        let downtime = self
            .downtime
            .map(|d| d.parse::<Downtime>().map_err(|m| bad("downtime", m)))
            .transpose()?;
        let readings = self
            .readings
            .iter()
            .map(|r| r.parse::<Reading>().map_err(|m| bad("readings", m)))
            .collect::<Result<_, _>>()?;
        Ok(Note {
            cause,
            date,
            downtime,
            fix: need("fix", self.fix)?,
            id: NoteId::generate(date, &machine, &title),
            machine,
            parts: self.parts,
            readings,
            symptoms: self.symptoms,
            technician: self.technician,
            text: self.text.unwrap_or_default(),
            title,
        })
    }

    /// A Markdown template for an editor, with what is known filled in.
    pub fn template(&self) -> String {
        let field = |value: &Option<String>| value.as_deref().map(yaml_scalar).unwrap_or_default();
        let list = |items: &[String]| {
            format!(
                "[{}]",
                items
                    .iter()
                    .map(|i| yaml_scalar(i))
                    .collect::<Vec<_>>()
                    .join(", ")
            )
        };
        let readings: String = self
            .readings
            .iter()
            .map(|r| format!("  - {}\n", yaml_scalar(r)))
            .collect();
        let date = self
            .date
            .clone()
            .unwrap_or_else(|| NoteDate::today().to_string());
        format!(
            "---\n\
             # New case note: fill in the fields, save and close the editor.\n\
             # Leave the file unchanged to add nothing.\n\
             # symptoms: one or more of {symptoms}\n\
             # cause: one of {causes}\n\
             date: {date}\n\
             machine: {machine}\n\
             title: {title}\n\
             symptoms: {symptom_list}\n\
             cause: {cause}\n\
             fix: {fix}\n\
             parts: {parts}\n\
             downtime: {downtime}\n\
             readings:\n{readings}  # - 'supply: 1450 psi'\n\
             tech: {tech}\n\
             ---\n\n{text}\n",
            symptoms = SYMPTOM_IDS.join(", "),
            causes = CAUSE_IDS.join(", "),
            machine = field(&self.machine),
            title = field(&self.title),
            symptom_list = list(&self.symptoms),
            cause = field(&self.cause),
            fix = field(&self.fix),
            parts = list(&self.parts),
            downtime = field(&self.downtime),
            tech = field(&self.technician),
            text = self
                .text
                .as_deref()
                .unwrap_or("What happened, what you measured, what you tried."),
        )
    }
}

fn yaml_scalar(text: &str) -> String {
    serde_yaml::to_string(text)
        .map(|s| s.trim_end().to_string())
        .unwrap_or_default()
}

fn strip_position(message: &str) -> String {
    message
        .split(" at line ")
        .next()
        .unwrap_or(message)
        .to_string()
}

fn scalar_text(value: &Value) -> Option<String> {
    match value {
        Value::String(s) if !s.trim().is_empty() => Some(s.trim().to_string()),
        Value::Number(n) => Some(n.to_string()),
        _ => None,
    }
}

/// The leading cause of a `diagnose --json` object: the first cause that is
/// confirmed or likely.
fn leading_of_diagnosis(object: &serde_json::Map<String, Value>) -> Option<String> {
    object
        .get("causes")?
        .as_array()?
        .iter()
        .find(|c| {
            matches!(
                c.get("status").and_then(Value::as_str),
                Some("confirmed" | "likely")
            )
        })?
        .get("cause")
        .and_then(scalar_text)
}

fn list_of(value: &Value) -> Vec<String> {
    match value {
        Value::Array(items) => items
            .iter()
            .filter_map(|item| scalar_text(item).or_else(|| item.get("id").and_then(scalar_text)))
            .collect(),
        other => scalar_text(other).into_iter().collect(),
    }
}

/// Readings as `{"supply": "1450 psi"}`, `["supply: 1450 psi"]`,
/// `[{"name": "supply", "value": 1450, "unit": "psi"}]` or a diagnosis's own
/// `[{"name": "supply_pressure@loaded", "shown": "1450 psi", ...}]`. A reading
/// that cannot be taken in is an error: dropping it would lose it from the note.
fn readings_of(value: &Value) -> Result<Vec<String>, String> {
    match value {
        Value::Null => Ok(Vec::new()),
        Value::Object(map) => map
            .iter()
            .map(|(name, v)| {
                scalar_text(v)
                    .map(|text| format!("{name}: {text}"))
                    .ok_or_else(|| format!("reading '{name}' has no value"))
            })
            .collect(),
        Value::Array(items) => items
            .iter()
            .enumerate()
            .map(|(n, item)| {
                reading_item(item).ok_or_else(|| {
                    format!(
                        "entry {} is neither 'name: value' text nor an object with a name and a value",
                        n + 1
                    )
                })
            })
            .collect(),
        _ => Err("expected an object of name to value, or a list".into()),
    }
}

fn reading_item(item: &Value) -> Option<String> {
    scalar_text(item).or_else(|| {
        let name = item.get("name").and_then(scalar_text)?;
        let value = item
            .get("value")
            .or_else(|| item.get("shown"))
            .and_then(scalar_text)?;
        let unit = item
            .get("unit")
            .and_then(scalar_text)
            .map(|u| format!(" {u}"))
            .unwrap_or_default();
        Some(format!("{name}: {value}{unit}"))
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    const DIAGNOSIS: &str = r#"{
        "machine": "press-4", "complaint": "Platen close sags under load",
        "symptoms": ["speed-sags-under-load"], "leading_cause": {"id": "compensator-sticking", "score": 0.8},
        "fix": "cleaned compensator spool", "readings": [{"name": "supply", "value": 160, "unit": "bar"}],
        "date": "2026-12-01", "extra": {"anything": true}
    }"#;

    #[test]
    fn reads_a_diagnosis_and_ignores_extra_fields() {
        let draft = NoteDraft::from_json(Path::new("d.json"), DIAGNOSIS).unwrap();
        let note = draft
            .into_note(DraftOrigin::Json(Path::new("d.json")))
            .unwrap();
        assert_eq!(note.id.as_str(), "2026-12-01-press-4-platen-close");
        assert_eq!(note.cause, "compensator-sticking");
        assert_eq!(note.readings[0].to_string(), "supply: 160 bar");
    }

    #[test]
    fn json_errors_name_file_line_and_field() {
        let err = NoteDraft::from_json(Path::new("d.json"), "{\n  \"machine\": }").unwrap_err();
        assert_eq!(err.to_string(), "d.json: 2:14: expected value");
        let draft = NoteDraft::from_json(
            Path::new("d.json"),
            &DIAGNOSIS.replace("compensator-sticking", "compensator-stuck"),
        )
        .unwrap();
        let err = draft
            .into_note(DraftOrigin::Json(Path::new("d.json")))
            .unwrap_err();
        assert_eq!(
            err.to_string(),
            "d.json: field 'cause': unknown cause 'compensator-stuck' in 'cause' (did you mean 'compensator-sticking'?)"
        );
    }

    #[test]
    fn options_errors_name_the_option() {
        let draft = NoteDraft {
            machine: Some("press-4".into()),
            ..NoteDraft::default()
        };
        assert_eq!(
            draft
                .into_note(DraftOrigin::Options)
                .unwrap_err()
                .to_string(),
            "--title: is required"
        );
    }

    #[test]
    fn template_parses_once_filled() {
        let draft = NoteDraft::from_json(Path::new("d.json"), DIAGNOSIS).unwrap();
        let note = Note::parse(Path::new("t.md"), &draft.template()).unwrap();
        assert_eq!(note.machine, "press-4");
        assert_eq!(note.readings[0].value, "160 bar");
    }
}
