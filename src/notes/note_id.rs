//! Note ids: the file name without `.md`, made from date, machine and a word
//! of the complaint (`2026-12-01-press-4-sag`), with `-2`, `-3`... on collision.

use std::fmt;

use super::NoteDate;

/// The id of a note, equal to its file stem.
#[derive(Clone, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub struct NoteId(String);

/// Words that say nothing about the case and make poor ids.
const FILLER: &[&str] = &[
    "a", "after", "and", "at", "for", "from", "in", "is", "it", "of", "on", "the", "to", "too",
    "very", "when", "with",
];

impl NoteId {
    /// An id from an existing file stem.
    pub fn from_stem(stem: &str) -> Self {
        NoteId(stem.to_string())
    }

    /// A fresh id from date, machine and the first telling words of the title.
    pub fn generate(date: NoteDate, machine: &str, title: &str) -> Self {
        let words: Vec<String> = title
            .split(|c: char| !c.is_ascii_alphanumeric())
            .map(str::to_ascii_lowercase)
            .filter(|w| {
                !w.is_empty()
                    && !FILLER.contains(&w.as_str())
                    && !machine.split('-').any(|m| m == w)
            })
            .take(2)
            .collect();
        let machine = slug(machine);
        let mut id = format!("{date}-{machine}");
        for word in words {
            id.push('-');
            id.push_str(&word);
        }
        NoteId(id)
    }

    /// The id with a collision suffix: `n` = 1 is the id itself, 2 adds `-2`.
    pub fn with_suffix(&self, n: u32) -> Self {
        if n <= 1 {
            self.clone()
        } else {
            NoteId(format!("{}-{n}", self.0))
        }
    }

    /// The id as text.
    pub fn as_str(&self) -> &str {
        &self.0
    }
}

fn slug(text: &str) -> String {
    let lower = text.to_ascii_lowercase();
    let parts: Vec<&str> = lower
        .split(|c: char| !c.is_ascii_alphanumeric())
        .filter(|p| !p.is_empty())
        .collect();
    if parts.is_empty() {
        "machine".into()
    } else {
        parts.join("-")
    }
}

impl fmt::Display for NoteId {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.0)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn generates_readable_ids() {
        let date = "2026-12-01".parse().unwrap();
        assert_eq!(
            NoteId::generate(date, "press-4", "Sag under load on press 4").as_str(),
            "2026-12-01-press-4-sag-under"
        );
        assert_eq!(
            NoteId::generate(date, "Sorter 9", "").as_str(),
            "2026-12-01-sorter-9"
        );
        assert_eq!(
            NoteId::generate(date, "../..", "x/y").as_str(),
            "2026-12-01-machine-x-y"
        );
    }

    #[test]
    fn suffixes_count_from_two() {
        let id = NoteId::from_stem("a");
        assert_eq!(id.with_suffix(1).as_str(), "a");
        assert_eq!(id.with_suffix(3).as_str(), "a-3");
    }
}
