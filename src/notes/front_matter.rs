//! Splitting a note file into its YAML front matter and free text, and
//! turning the front matter into a validated [`Note`] with file:line:column
//! errors for every fault.

use std::path::Path;

use serde_yaml::Value;

use super::vocabulary::{nearest, CAUSE_IDS, SYMPTOM_IDS};
use super::{Downtime, Note, NoteDate, NoteError, NoteId, Reading};

/// The field names a note's front matter may use, sorted.
pub const FIELDS: &[&str] = &[
    "cause", "date", "downtime", "fix", "machine", "parts", "readings", "symptoms", "tech", "title",
];

/// The front matter of one note file: its YAML text, where it starts, and the
/// free text after it.
#[derive(Debug)]
pub struct FrontMatter<'a> {
    /// The free text after the closing `---`.
    pub body: &'a str,
    /// 1-based line of the file on which the YAML text starts.
    first_line: usize,
    path: &'a Path,
    /// The YAML text between the `---` lines.
    pub yaml: &'a str,
}

impl<'a> FrontMatter<'a> {
    /// Split `text` (the contents of `path`) at its `---` lines.
    pub fn split(path: &'a Path, text: &'a str) -> Result<Self, NoteError> {
        let text = text.strip_prefix('\u{feff}').unwrap_or(text);
        let Some(after_open) = strip_delimiter(text) else {
            return Err(NoteError::new(
                path,
                1,
                1,
                "missing front matter: a note starts with a '---' line",
            ));
        };
        let mut offset = 0;
        for line in after_open.split_inclusive('\n') {
            if line.trim_end() == "---" {
                return Ok(FrontMatter {
                    body: after_open[offset + line.len()..].trim_start_matches(['\r', '\n']),
                    first_line: 2,
                    path,
                    yaml: &after_open[..offset],
                });
            }
            offset += line.len();
        }
        Err(NoteError::new(
            path,
            1,
            1,
            "front matter is not closed: add a '---' line after the fields",
        ))
    }

    /// Parse and validate the fields into a note with this id.
    pub fn into_note(self, id: NoteId) -> Result<Note, NoteError> {
        let value: Value = serde_yaml::from_str(self.yaml).map_err(|e| self.yaml_error(&e))?;
        let mapping = match value {
            Value::Mapping(mapping) => mapping,
            Value::Null => return Err(self.error_at_line(0, 0, "front matter is empty: it needs at least date, machine, title, symptoms, cause and fix")),
            _ => return Err(self.error_at_line(0, 1, "front matter must be a list of 'field: value' lines")),
        };
        let mut fields = Fields {
            front: &self,
            mapping: &mapping,
        };
        fields.check_names()?;
        Ok(Note {
            cause: fields.id_in("cause", CAUSE_IDS)?,
            date: fields.parsed::<NoteDate>("date")?,
            downtime: fields.optional_parsed::<Downtime>("downtime")?,
            fix: fields.text("fix")?,
            id,
            machine: fields.machine()?,
            parts: fields.list("parts", false)?,
            readings: fields.readings()?,
            symptoms: fields.symptoms()?,
            technician: fields.optional_text("tech")?,
            text: self.body.to_string(),
            title: fields.text("title")?,
        })
    }

    fn yaml_error(&self, error: &serde_yaml::Error) -> NoteError {
        let message = error.to_string();
        // serde_yaml appends " at line L column C"; the place goes in front instead.
        let message = message
            .split(" at line ")
            .next()
            .unwrap_or(&message)
            .to_string();
        match error.location() {
            Some(location) => self.error_at_line(
                location.line().saturating_sub(1),
                location.column(),
                message,
            ),
            None => self.error_at_line(0, 0, message),
        }
    }

    /// An error at a 0-based line of the YAML text.
    fn error_at_line(
        &self,
        yaml_line: usize,
        column: usize,
        message: impl Into<String>,
    ) -> NoteError {
        NoteError::new(self.path, self.first_line + yaml_line, column, message)
    }

    /// The 0-based YAML line of a top-level key and the column of its value.
    fn locate(&self, key: &str) -> (usize, usize) {
        for (index, line) in self.yaml.lines().enumerate() {
            if let Some(rest) = line.strip_prefix(key) {
                let after = rest.trim_start();
                if let Some(value) = after.strip_prefix(':') {
                    let value_start = line.len() - value.trim_start().len();
                    return (index, value_start + 1);
                }
            }
        }
        (0, 0)
    }

    fn field_error(&self, key: &str, message: impl Into<String>) -> NoteError {
        let (line, column) = self.locate(key);
        self.error_at_line(line, column, message)
    }
}

fn strip_delimiter(text: &str) -> Option<&str> {
    let (first, rest) = text.split_once('\n')?;
    (first.trim_end() == "---").then_some(rest)
}

/// Reads typed fields out of the parsed mapping, reporting each fault at its key.
struct Fields<'f, 'a> {
    front: &'f FrontMatter<'a>,
    mapping: &'f serde_yaml::Mapping,
}

impl Fields<'_, '_> {
    fn check_names(&mut self) -> Result<(), NoteError> {
        for key in self.mapping.keys() {
            let Some(name) = key.as_str() else {
                return Err(self.front.error_at_line(
                    0,
                    1,
                    "field names must be words such as 'machine'",
                ));
            };
            if !FIELDS.contains(&name) {
                let (line, _) = self.front.locate(name);
                let hint = nearest(name, FIELDS.iter().copied())
                    .map(|s| format!(" (did you mean '{s}'?)"))
                    .unwrap_or_else(|| format!(" (known fields: {})", FIELDS.join(", ")));
                return Err(self.front.error_at_line(
                    line,
                    1,
                    format!("unknown field '{name}'{hint}"),
                ));
            }
        }
        Ok(())
    }

    fn get(&self, key: &str) -> Option<&Value> {
        self.mapping.get(key).filter(|v| !v.is_null())
    }

    fn required(&self, key: &str) -> Result<&Value, NoteError> {
        self.get(key).ok_or_else(|| {
            let (line, column) = self.front.locate(key);
            if column == 0 {
                NoteError::new(self.front.path, 1, 0, format!("missing field '{key}'"))
            } else {
                self.front
                    .error_at_line(line, column, format!("field '{key}' is empty"))
            }
        })
    }

    fn scalar_text(&self, key: &str, value: &Value) -> Result<String, NoteError> {
        match value {
            Value::String(s) => Ok(s.trim().to_string()),
            Value::Number(n) => Ok(n.to_string()),
            Value::Bool(b) => Ok(b.to_string()),
            _ => Err(self
                .front
                .field_error(key, format!("field '{key}' must be text"))),
        }
    }

    fn text(&self, key: &str) -> Result<String, NoteError> {
        let text = self.scalar_text(key, self.required(key)?)?;
        if text.is_empty() {
            return Err(self
                .front
                .field_error(key, format!("field '{key}' is empty")));
        }
        Ok(text)
    }

    fn optional_text(&self, key: &str) -> Result<Option<String>, NoteError> {
        match self.get(key) {
            None => Ok(None),
            Some(value) => Ok(Some(self.scalar_text(key, value)?).filter(|t| !t.is_empty())),
        }
    }

    fn parsed<T: std::str::FromStr<Err = String>>(&self, key: &str) -> Result<T, NoteError> {
        self.text(key)?.parse().map_err(|reason: String| {
            self.front
                .field_error(key, format!("field '{key}': {reason}"))
        })
    }

    fn optional_parsed<T: std::str::FromStr<Err = String>>(
        &self,
        key: &str,
    ) -> Result<Option<T>, NoteError> {
        match self.get(key) {
            None => Ok(None),
            Some(Value::Number(n)) => Err(self.front.field_error(
                key,
                format!("field '{key}': '{n}' needs a unit, e.g. '{n} h' or '{n} min'"),
            )),
            Some(_) => self.parsed(key).map(Some),
        }
    }

    fn list(&self, key: &str, required: bool) -> Result<Vec<String>, NoteError> {
        let value = if required {
            Some(self.required(key)?)
        } else {
            self.get(key)
        };
        let items = match value {
            None => return Ok(Vec::new()),
            Some(Value::Sequence(items)) => items
                .iter()
                .map(|item| self.scalar_text(key, item))
                .collect::<Result<Vec<_>, _>>()?,
            Some(other) => vec![self.scalar_text(key, other)?],
        };
        let items: Vec<String> = items.into_iter().filter(|i| !i.is_empty()).collect();
        if required && items.is_empty() {
            return Err(self
                .front
                .field_error(key, format!("field '{key}' needs at least one entry")));
        }
        Ok(items)
    }

    fn id_in(&self, key: &str, known: &[&str]) -> Result<String, NoteError> {
        let id = self.text(key)?;
        check_known(key, &id, known).map_err(|message| self.front.field_error(key, message))?;
        Ok(id)
    }

    fn symptoms(&self) -> Result<Vec<String>, NoteError> {
        let symptoms = self.list("symptoms", true)?;
        for symptom in &symptoms {
            check_known("symptoms", symptom, SYMPTOM_IDS)
                .map_err(|message| self.front.field_error("symptoms", message))?;
        }
        Ok(symptoms)
    }

    fn machine(&self) -> Result<String, NoteError> {
        let machine = self.text("machine")?;
        check_machine(&machine).map_err(|message| self.front.field_error("machine", message))?;
        Ok(machine)
    }

    fn readings(&self) -> Result<Vec<Reading>, NoteError> {
        match self.get("readings") {
            None => Ok(Vec::new()),
            Some(Value::Mapping(map)) => map
                .iter()
                .map(|(name, value)| {
                    let name = self.scalar_text("readings", name)?;
                    let value = self.scalar_text("readings", value)?;
                    format!("{name}: {value}")
                        .parse()
                        .map_err(|m: String| self.front.field_error("readings", m))
                })
                .collect(),
            Some(_) => self
                .list("readings", false)?
                .iter()
                .map(|text| {
                    text.parse()
                        .map_err(|m: String| self.front.field_error("readings", m))
                })
                .collect(),
        }
    }
}

/// Checks that `id` is one of `known`, suggesting the nearest when not.
pub fn check_known(field: &str, id: &str, known: &[&str]) -> Result<(), String> {
    if known.contains(&id) {
        return Ok(());
    }
    Err(match nearest(id, known.iter().copied()) {
        Some(near) => format!(
            "unknown {} '{id}' in '{field}' (did you mean '{near}'?)",
            singular(field)
        ),
        None => format!(
            "unknown {} '{id}' in '{field}' (known: {})",
            singular(field),
            known.join(", ")
        ),
    })
}

fn singular(field: &str) -> &str {
    match field {
        "symptoms" => "symptom",
        other => other,
    }
}

/// Checks that a machine id is lowercase words and digits joined by dashes.
pub fn check_machine(machine: &str) -> Result<(), String> {
    let ok = !machine.is_empty()
        && machine.split('-').all(|part| {
            !part.is_empty()
                && part
                    .bytes()
                    .all(|b| b.is_ascii_lowercase() || b.is_ascii_digit())
        });
    if ok {
        Ok(())
    } else {
        Err(format!("machine id '{machine}' must be lowercase letters and digits joined by dashes, e.g. 'press-4'"))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const GOOD: &str = "---\ndate: 2024-03-02\nmachine: press-4\ntitle: Platen close sags\nsymptoms: [speed-sags-under-load]\ncause: compensator-sticking\nfix: cleaned the spool\nparts:\n  - seal kit\ndowntime: 3.5 h\nreadings:\n  supply: 160 bar\n  load: 152 bar\ntech: JT\n---\n\nFree text here.\n";

    fn parse(text: &str) -> Result<Note, NoteError> {
        FrontMatter::split(Path::new("cases/notes/x.md"), text)?.into_note(NoteId::from_stem("x"))
    }

    #[track_caller]
    fn error(text: &str) -> String {
        parse(text).unwrap_err().to_string()
    }

    #[test]
    fn parses_a_complete_note() {
        let note = parse(GOOD).unwrap();
        assert_eq!(note.machine, "press-4");
        assert_eq!(note.downtime.unwrap().minutes(), 210);
        assert_eq!(note.readings[1].to_string(), "load: 152 bar");
        assert_eq!(note.parts, ["seal kit"]);
        assert_eq!(note.technician.as_deref(), Some("JT"));
        assert_eq!(note.text, "Free text here.\n");
    }

    #[test]
    fn names_an_unknown_field_with_a_suggestion() {
        let text = GOOD.replace("machine: press-4", "machnie: press-4");
        assert_eq!(
            error(&text),
            "cases/notes/x.md:3:1: unknown field 'machnie' (did you mean 'machine'?)"
        );
    }

    #[test]
    fn places_bad_values_at_their_line_and_column() {
        assert_eq!(
            error(&GOOD.replace("2024-03-02", "2024-13-02")),
            "cases/notes/x.md:2:7: field 'date': '2024-13-02' is not a valid date: month 13 is out of range 1-12"
        );
        assert_eq!(
            error(&GOOD.replace("cause: compensator-sticking", "cause: compensater-sticking")),
            "cases/notes/x.md:6:8: unknown cause 'compensater-sticking' in 'cause' (did you mean 'compensator-sticking'?)"
        );
        assert_eq!(
            error(&GOOD.replace("downtime: 3.5 h", "downtime: 3.5")),
            "cases/notes/x.md:10:11: field 'downtime': '3.5' needs a unit, e.g. '3.5 h' or '3.5 min'"
        );
    }

    #[test]
    fn reports_yaml_syntax_errors_in_file_lines() {
        let message = error(&GOOD.replace("title: Platen close sags", "title: [unclosed"));
        assert!(message.starts_with("cases/notes/x.md:5:"), "{message}");
    }

    #[test]
    fn reports_missing_fields_and_delimiters() {
        assert_eq!(
            error(&GOOD.replace("fix: cleaned the spool\n", "")),
            "cases/notes/x.md:1: missing field 'fix'"
        );
        assert_eq!(
            error("no front matter"),
            "cases/notes/x.md:1:1: missing front matter: a note starts with a '---' line"
        );
        assert_eq!(
            error("---\ndate: 2024-01-01\n"),
            "cases/notes/x.md:1:1: front matter is not closed: add a '---' line after the fields"
        );
    }

    #[test]
    fn accepts_readings_as_a_list_of_strings() {
        let text = GOOD.replace(
            "readings:\n  supply: 160 bar\n  load: 152 bar\n",
            "readings: ['supply: 160 bar']\n",
        );
        assert_eq!(parse(&text).unwrap().readings[0].value, "160 bar");
    }

    #[test]
    fn rejects_badly_formed_machine_ids() {
        assert!(error(&GOOD.replace("machine: press-4", "machine: Press 4"))
            .contains("must be lowercase"));
    }
}
