//! One reading a technician took, kept as text with a name (`supply: 1450 psi`);
//! units are checked elsewhere.

use std::fmt;
use std::str::FromStr;

use serde::Serialize;

/// A named reading such as `supply: 1450 psi`.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct Reading {
    /// What was measured, e.g. `supply`.
    pub name: String,
    /// The value as written, e.g. `1450 psi`.
    pub value: String,
}

impl FromStr for Reading {
    type Err = String;

    fn from_str(text: &str) -> Result<Self, String> {
        let (name, value) = text.split_once(':').ok_or_else(|| {
            format!("reading '{text}' has no name (write 'name: value', e.g. 'supply: 1450 psi')")
        })?;
        let (name, value) = (name.trim(), value.trim());
        if name.is_empty() || value.is_empty() {
            return Err(format!(
                "reading '{text}' needs a name and a value (e.g. 'supply: 1450 psi')"
            ));
        }
        Ok(Reading {
            name: name.to_string(),
            value: value.to_string(),
        })
    }
}

impl fmt::Display for Reading {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}: {}", self.name, self.value)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn splits_name_and_value() {
        let reading: Reading = "supply : 1450 psi".parse().unwrap();
        assert_eq!(reading.to_string(), "supply: 1450 psi");
        assert!("1450 psi".parse::<Reading>().is_err());
        assert!("supply:".parse::<Reading>().is_err());
    }
}
