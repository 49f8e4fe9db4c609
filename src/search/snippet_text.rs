//! A snippet of a note with the byte ranges of the matched words.

use std::ops::Range;

use serde::Serialize;

use super::HighlightStyle;

/// Text around the best match, on one line, with highlighted ranges.
#[derive(Clone, Debug, Default, PartialEq, Eq, Serialize)]
pub struct SnippetText {
    /// Byte ranges of `text` to highlight, sorted and disjoint.
    pub highlights: Vec<Range<usize>>,
    /// The snippet text, whitespace collapsed to single spaces.
    pub text: String,
}

impl SnippetText {
    /// A snippet from a fragment and its ranges, with whitespace runs
    /// (line breaks included) collapsed and the ranges moved to match.
    pub fn new(fragment: &str, highlights: &[Range<usize>]) -> Self {
        let mut text = String::with_capacity(fragment.len());
        let mut map = vec![0; fragment.len() + 1];
        let mut last_space = true;
        for (i, c) in fragment.char_indices() {
            for slot in &mut map[i..i + c.len_utf8()] {
                *slot = text.len();
            }
            if c.is_whitespace() {
                if !last_space {
                    text.push(' ');
                }
                last_space = true;
            } else {
                text.push(c);
                last_space = false;
            }
        }
        map[fragment.len()] = text.len();
        let trimmed_end = text.trim_end().len();
        text.truncate(trimmed_end);
        let highlights = highlights
            .iter()
            .filter(|r| r.end <= fragment.len() && r.start < r.end)
            .map(|r| map[r.start]..map[r.end].min(trimmed_end))
            .filter(|r| r.start < r.end)
            .collect();
        SnippetText { highlights, text }
    }

    /// A snippet without highlights: the start of `text`, cut at a word.
    pub fn plain(text: &str, max_chars: usize) -> Self {
        let mut snippet = Self::new(text, &[]);
        if snippet.text.chars().count() > max_chars {
            let cut = snippet
                .text
                .char_indices()
                .nth(max_chars)
                .map_or(snippet.text.len(), |(i, _)| i);
            let cut = snippet.text[..cut].rfind(' ').unwrap_or(cut);
            snippet.text.truncate(cut);
            snippet.text.push_str(" ...");
        }
        snippet
    }

    /// True when nothing is highlighted.
    pub fn is_unmarked(&self) -> bool {
        self.highlights.is_empty()
    }

    /// The text with each highlight between the style's markers.
    pub fn render(&self, style: HighlightStyle) -> String {
        let (open, close) = style.markers();
        let mut out = String::with_capacity(self.text.len() + 8 * self.highlights.len());
        let mut at = 0;
        for range in &self.highlights {
            if range.start < at {
                continue;
            }
            out.push_str(&self.text[at..range.start]);
            out.push_str(open);
            out.push_str(&self.text[range.clone()]);
            out.push_str(close);
            at = range.end;
        }
        out.push_str(&self.text[at..]);
        out
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn collapses_whitespace_and_keeps_ranges_on_their_words() {
        let snippet = SnippetText::new("the  spool\nwas  stuck ", &[5..10, 16..21]);
        assert_eq!(snippet.text, "the spool was stuck");
        assert_eq!(
            snippet.render(HighlightStyle::Markers),
            "the **spool** was **stuck**"
        );
        assert_eq!(
            snippet.render(HighlightStyle::Bold),
            "the \x1b[1mspool\x1b[0m was \x1b[1mstuck\x1b[0m"
        );
    }

    #[test]
    fn plain_snippets_cut_at_a_word() {
        assert_eq!(
            SnippetText::plain("one two three four", 9).text,
            "one two ..."
        );
        assert_eq!(SnippetText::plain("short", 9).text, "short");
    }
}
