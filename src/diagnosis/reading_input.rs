//! Readings as a technician types them: `NAME=VALUE` on the command line, or
//! a YAML file of `name: value` lines. Names and units are checked against
//! the rule base here, so that a file's mistake is reported at its line and
//! column rather than later by name only.

use super::DiagnosisError;
use crate::rules::{Readings, RuleBase};

/// Split `NAME=VALUE` (the value may hold `=` and spaces; both sides are
/// trimmed). The name may carry an operating point: `flow@loaded=14 L/min`.
pub fn parse_reading_argument(text: &str) -> Result<(String, String), DiagnosisError> {
    let syntax = || DiagnosisError::ReadingSyntax {
        text: text.to_string(),
    };
    let (name, value) = text.split_once('=').ok_or_else(syntax)?;
    let (name, value) = (name.trim(), value.trim());
    if name.is_empty() || value.is_empty() {
        return Err(syntax());
    }
    Ok((name.to_string(), value.to_string()))
}

/// Read a readings file: a YAML mapping of reading name to value with unit,
/// in file order. `file` is the name shown in messages. Every name and value
/// is checked against the rule base; the first problem is reported as
/// `file:line:col: message`.
pub fn parse_readings_file(
    base: &RuleBase,
    file: &str,
    text: &str,
) -> Result<Vec<(String, String)>, DiagnosisError> {
    let mapping: serde_yaml::Mapping = match serde_yaml::from_str::<Option<serde_yaml::Mapping>>(
        text,
    ) {
        Ok(Some(m)) => m,
        Ok(None) => return Ok(Vec::new()),
        Err(e) => {
            let at = e.location().map_or_else(
                || file.to_string(),
                |l| format!("{file}:{}:{}", l.line(), l.column()),
            );
            let message = e.to_string();
            let message = message.split(" at line ").next().unwrap_or(&message);
            return Err(DiagnosisError::ReadingsFile {
                at,
                message: format!("expected a mapping of reading name to value, e.g. `supply_pressure@loaded: 180 bar` ({message})"),
            });
        }
    };
    let mut out = Vec::new();
    for (key, value) in &mapping {
        let name = scalar_text(key).unwrap_or_default();
        let at = key_position(file, text, &name);
        let value = scalar_text(value).ok_or_else(|| DiagnosisError::ReadingsFile {
            at: at.clone(),
            message: format!("`{name}`: expected a value with its unit, e.g. `180 bar`"),
        })?;
        Readings::new()
            .insert_text(base, &name, &value)
            .map_err(|e| DiagnosisError::ReadingsFile {
                at: at.clone(),
                message: format!("`{name}`: {}", e.message),
            })?;
        out.push((name, value));
    }
    Ok(out)
}

fn scalar_text(value: &serde_yaml::Value) -> Option<String> {
    match value {
        serde_yaml::Value::String(s) => Some(s.trim().to_string()),
        serde_yaml::Value::Number(n) => Some(n.to_string()),
        _ => None,
    }
}

/// `file:line:col` of a top-level key (the first line that starts with it,
/// quoted or not, followed by a colon); `file` alone when not found.
fn key_position(file: &str, text: &str, key: &str) -> String {
    let forms = [
        format!("{key}:"),
        format!("\"{key}\":"),
        format!("'{key}':"),
    ];
    for (index, line) in text.lines().enumerate() {
        if forms.iter().any(|f| line.starts_with(f.as_str())) {
            return format!("{file}:{}:1", index + 1);
        }
    }
    file.to_string()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reading_arguments_split_at_the_first_equals() {
        assert_eq!(
            parse_reading_argument("flow@loaded = 14 L/min").unwrap(),
            ("flow@loaded".to_string(), "14 L/min".to_string())
        );
        assert!(parse_reading_argument("flow 14 L/min").is_err());
        assert!(parse_reading_argument("=14 L/min").is_err());
        assert!(parse_reading_argument("flow=").is_err());
    }

    #[test]
    fn a_readings_file_keeps_its_order_and_reports_positions() {
        let base = RuleBase::load(&[]).unwrap();
        let ok = "supply_pressure@loaded: 185 bar\nflow@loaded: 3.7 gpm\n";
        let readings = parse_readings_file(&base, "r.yaml", ok).unwrap();
        assert_eq!(readings[0].0, "supply_pressure@loaded");
        assert_eq!(readings[1].1, "3.7 gpm");
        let bad = "supply_pressure@loaded: 185 bar\nflwo@loaded: 14 L/min\n";
        let err = parse_readings_file(&base, "r.yaml", bad)
            .unwrap_err()
            .to_string();
        assert_eq!(
            err,
            "r.yaml:2:1: `flwo@loaded`: unknown quantity `flwo` (did you mean `flow`?)"
        );
        let syntax = "supply_pressure@loaded: [185 bar\n";
        let err = parse_readings_file(&base, "r.yaml", syntax)
            .unwrap_err()
            .to_string();
        assert!(err.starts_with("r.yaml:2:1: "), "{err}");
    }
}
