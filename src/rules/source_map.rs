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

    /// The line (0-based index) holding `id: <id>` as an entry's id.
    fn id_line(&self, id: &str) -> Option<usize> {
        self.text.lines().position(|line| {
            let t = line.trim_start().trim_start_matches("- ").trim_start();
            t.strip_prefix("id:")
                .map(|v| v.trim().trim_matches(|c| c == '\'' || c == '"') == id)
                .unwrap_or(false)
        })
    }

    /// Where the entry with this id starts (its `id:` value), if found.
    pub fn entry(&self, id: &str) -> Option<Position> {
        let index = self.id_line(id)?;
        let line = self.text.lines().nth(index)?;
        let column = line.find("id:").map_or(1, |c| c + 4);
        Some(Position {
            line: index + 1,
            column: char_column(line, column.min(line.len())),
        })
    }

    /// Where the value of `key` starts inside the entry with this id (the
    /// first `key:` after the entry's id line, before the next entry at the
    /// same indentation). Falls back to the entry itself.
    pub fn key(&self, id: &str, key: &str) -> Option<Position> {
        let start = self.id_line(id)?;
        let lines: Vec<&str> = self.text.lines().collect();
        // The indentation of the list item that holds the id.
        let first = lines[start];
        let item_indent = if first.trim_start().starts_with("- ") {
            indent(first)
        } else {
            indent(first).saturating_sub(2)
        };
        for (offset, line) in lines.iter().enumerate().skip(start + 1) {
            let body = line.trim_start();
            if body.is_empty() || body.starts_with('#') {
                continue;
            }
            let line_indent = indent(line);
            if line_indent < item_indent || (line_indent == item_indent && body.starts_with("- ")) {
                break;
            }
            if let Some(rest) = body.strip_prefix(key).and_then(|r| r.strip_prefix(':')) {
                let value_start = line.len() - rest.len() + (rest.len() - rest.trim_start().len());
                return Some(Position {
                    line: offset + 1,
                    column: char_column(line, value_start),
                });
            }
        }
        self.entry(id)
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

    const TEXT: &str = "version: 1\nrules:\n  - id: first\n    check: a > b\n  - id: second\n    title: x\n    check: \"c < d\"\n";

    #[test]
    fn finds_entries_and_keys() {
        let map = SourceMap::new("rules/x.yaml", TEXT);
        assert_eq!(map.entry("second"), Some(Position { line: 5, column: 9 }));
        let check = map.key("second", "check").unwrap();
        assert_eq!(
            check,
            Position {
                line: 7,
                column: 12
            }
        );
        assert_eq!(map.scalar_at(check), Some(("c < d".to_string(), 13)));
        assert_eq!(
            map.key("first", "check"),
            Some(Position {
                line: 4,
                column: 12
            })
        );
        // A key missing from the entry falls back to the entry.
        assert_eq!(map.key("first", "evidence"), map.entry("first"));
        assert_eq!(map.render(Some(check), "bad"), "rules/x.yaml:7:12: bad");
    }
}
