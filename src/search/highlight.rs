//! How matched words are marked in snippets: bold on a colour terminal,
//! `**word**` everywhere else (pipes, files, `NO_COLOR`, `TERM=dumb`).

/// The marker pair around a highlighted word.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum HighlightStyle {
    /// ANSI bold.
    Bold,
    /// `**word**`.
    Markers,
}

impl HighlightStyle {
    /// Bold only for a terminal, and never when `NO_COLOR` is set or `TERM=dumb`.
    pub fn detect(is_terminal: bool) -> Self {
        let no_color = std::env::var_os("NO_COLOR").is_some_and(|v| !v.is_empty());
        let dumb = std::env::var("TERM").is_ok_and(|t| t == "dumb");
        if is_terminal && !no_color && !dumb {
            HighlightStyle::Bold
        } else {
            HighlightStyle::Markers
        }
    }

    /// The opening and closing marker.
    pub fn markers(self) -> (&'static str, &'static str) {
        match self {
            HighlightStyle::Bold => ("\x1b[1m", "\x1b[0m"),
            HighlightStyle::Markers => ("**", "**"),
        }
    }
}
