//! How matched words are marked in snippets: bold where the output's colour
//! decision allows it, `**word**` everywhere else (pipes, files, `NO_COLOR`).

/// The marker pair around a highlighted word.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum HighlightStyle {
    /// ANSI bold.
    Bold,
    /// `**word**`.
    Markers,
}

impl HighlightStyle {
    /// The opening and closing marker.
    pub fn markers(self) -> (&'static str, &'static str) {
        match self {
            HighlightStyle::Bold => ("\x1b[1m", "\x1b[0m"),
            HighlightStyle::Markers => ("**", "**"),
        }
    }
}
