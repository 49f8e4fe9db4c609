//! Finding where an entry and its keys sit in a YAML file's text.
//!
//! serde_yaml reports positions for syntax errors and unknown keys, but keeps
//! none for values that parsed, so a semantic error (a bad formula, an unknown
//! quantity) is located by searching the text: the entry's `id:` line first,
//! then the key inside that entry. Formulas are single-line scalars, so an
//! offset inside a formula is a column offset on the key's line.

/// A file's name and text, with line-oriented look-ups.
#[derive(Clone, Debug)]
pub struct SourceMap {
    /// The name shown in messages, e.g. `rules/sag.yaml`.
    pub name: String,
    /// The text.
    pub text: String,
}

/// A 1-based line and column.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub struct Position {
    /// Line, from 1.
    pub line: usize,
    /// Column, from 1, in characters.
    pub column: usize,
}

impl SourceMap {
    /// A map over `text` shown as `name`.
    pub fn new(name: impl Into<String>, text: impl Into<String>) -> Self {
        SourceMap {
            name: name.into(),
            text: text.into(),
        }
    }

    /// The `nth` (from 0) entry with this id inside the top-level list
    /// `section` (`rules:`, `causes:`, …): where its `id:` value starts.
    /// Searching by section keeps a rule and a cause of the same id apart,
    /// and `nth` keeps two entries of the same id in one list apart.
    pub fn entry(&self, section: &str, id: &str, nth: usize) -> Option<Position> {
        let (index, line) = self
            .section_lines(section)
            .filter(|(_, line)| is_id_line(line, id))
            .nth(nth)?;
        let column = line.find("id:").map_or(1, |c| c + 4);
        Some(Position {
            line: index + 1,
            column: char_column(line, column.min(line.len())),
        })
    }

    /// The lines (0-based index and text) under the top-level key `section`,
    /// up to the next top-level key.
    fn section_lines<'a>(&'a self, section: &str) -> impl Iterator<Item = (usize, &'a str)> + 'a {
        let header = format!("{section}:");
        let start = self.text.lines().position(|line| line.starts_with(&header));
        let body = |line: &str| line.is_empty() || line.starts_with([' ', '-', '#']);
        self.text
            .lines()
            .enumerate()
            .skip(start.map_or(usize::MAX, |s| s + 1))
            .take_while(move |(_, line)| body(line))
    }

    /// Where the value of `key` starts inside the entry whose `id:` is at
    /// `entry` (the first `key:` after the id line, before the next entry at
    /// the same indentation). Falls back to the entry itself.
    pub fn key(&self, entry: Position, key: &str) -> Position {
        self.nth_key(entry.line, key, 0).unwrap_or(entry)
    }

    /// The `nth` (from 0) `key:` of the mapping that starts on line `line`
    /// (1-based; a list item `- key: …` or a plain `key: …` line), searching
    /// to the end of that mapping.
    pub fn nth_key(&self, line: usize, key: &str, nth: usize) -> Option<Position> {
        let start = line.checked_sub(1)?;
        let first = self.text.lines().nth(start)?;
        let key_indent = indent(first) + if is_item(first) { 2 } else { 0 };
        let in_mapping = self
            .text
            .lines()
            .enumerate()
            .skip(start)
            .filter(|(_, text)| !text.trim().is_empty() && !text.trim_start().starts_with('#'))
            .take_while(|(index, text)| *index == start || indent(text) >= key_indent);
        let mut keys = in_mapping.filter_map(|(index, text)| {
            let at_key = if index == start {
                key_indent
            } else {
                indent(text)
            };
            let body = text.get(at_key..)?;
            let rest = body.strip_prefix(key)?.strip_prefix(':')?;
            let value = text.len() - rest.trim_start().len();
            Some(Position {
                line: index + 1,
                column: char_column(text, value),
            })
        });
        keys.nth(nth)
    }

    /// Where the value of the top-level `key:` starts.
    pub fn top_level_key(&self, key: &str) -> Option<Position> {
        let header = format!("{key}:");
        let index = self
            .text
            .lines()
            .position(|line| line.starts_with(&header))?;
        self.nth_key(index + 1, key, 0)
    }

    /// Where `needle` first occurs at or after `from`.
    pub fn find_from(&self, from: Position, needle: &str) -> Option<Position> {
        self.text
            .lines()
            .enumerate()
            .skip(from.line.checked_sub(1)?)
            .find_map(|(index, line)| {
                let skip = if index + 1 == from.line {
                    byte_index(line, from.column.saturating_sub(1))
                } else {
                    0
                };
                let found = line.get(skip..)?.find(needle)? + skip;
                Some(Position {
                    line: index + 1,
                    column: char_column(line, found),
                })
            })
    }

    /// The character at a position, if there is one.
    pub fn char_at(&self, position: Position) -> Option<char> {
        let line = self.text.lines().nth(position.line.checked_sub(1)?)?;
        line.chars().nth(position.column.checked_sub(1)?)
    }

    /// The text of the scalar at a position, without surrounding quotes, and
    /// the column where its content starts.
    pub fn scalar_at(&self, position: Position) -> Option<(String, usize)> {
        let line = self.text.lines().nth(position.line.checked_sub(1)?)?;
        let start = byte_index(line, position.column.checked_sub(1)?);
        let raw = line.get(start..)?.trim_end();
        let quoted = raw.starts_with('"') || raw.starts_with('\'');
        let content = if quoted {
            &raw[1..raw.len().saturating_sub(1).max(1)]
        } else {
            raw
        };
        Some((content.to_string(), position.column + usize::from(quoted)))
    }

    /// `name:line:col: message`.
    pub fn render(&self, position: Option<Position>, message: &str) -> String {
        match position {
            Some(p) => format!("{}:{}:{}: {message}", self.name, p.line, p.column),
            None => format!("{}: {message}", self.name),
        }
    }
}

fn is_id_line(line: &str, id: &str) -> bool {
    let t = line.trim_start().trim_start_matches("- ").trim_start();
    t.strip_prefix("id:")
        .is_some_and(|v| v.trim().trim_matches(|c| c == '\'' || c == '"') == id)
}

fn is_item(line: &str) -> bool {
    line.trim_start().starts_with("- ")
}

fn indent(s: &str) -> usize {
    s.len() - s.trim_start().len()
}

fn char_column(line: &str, byte: usize) -> usize {
    line.get(..byte).map_or(1, |p| p.chars().count() + 1)
}

fn byte_index(line: &str, chars: usize) -> usize {
    line.char_indices()
        .nth(chars)
        .map_or(line.len(), |(i, _)| i)
}

#[cfg(test)]
mod tests {
    use super::*;

    const TEXT: &str = "version: 1\ncauses:\n  - id: second\n    label: x\nrules:\n  - id: first\n    check: a > b\n  - id: second\n    title: x\n    check: \"c < d\"\n  - id: second\n    check: e\n    check: f\n";

    fn at(line: usize, column: usize) -> Position {
        Position { line, column }
    }

    #[test]
    fn finds_entries_by_section_and_occurrence() {
        let map = SourceMap::new("rules/x.yaml", TEXT);
        assert_eq!(map.entry("causes", "second", 0), Some(at(3, 9)));
        assert_eq!(map.entry("rules", "second", 0), Some(at(8, 9)));
        assert_eq!(map.entry("rules", "second", 1), Some(at(11, 9)));
        assert_eq!(map.entry("rules", "second", 2), None);
        assert_eq!(map.entry("settings", "second", 0), None);
    }

    #[test]
    fn finds_keys_inside_an_entry() {
        let map = SourceMap::new("rules/x.yaml", TEXT);
        let second = map.entry("rules", "second", 0).unwrap();
        let check = map.key(second, "check");
        assert_eq!(check, at(10, 12));
        assert_eq!(map.scalar_at(check), Some(("c < d".to_string(), 13)));
        let first = map.entry("rules", "first", 0).unwrap();
        assert_eq!(map.key(first, "check"), at(7, 12));
        // A key missing from the entry falls back to the entry, never to the
        // next entry's key.
        assert_eq!(map.key(first, "title"), first);
        // A repeated key: the second one.
        assert_eq!(map.nth_key(11, "check", 1), Some(at(13, 12)));
        assert_eq!(map.render(Some(check), "bad"), "rules/x.yaml:10:12: bad");
    }
}
