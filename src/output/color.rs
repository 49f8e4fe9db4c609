//! Deciding once whether to colour output.

use std::io::IsTerminal;

/// When to use colour.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub enum ColorChoice {
    /// Colour when the stream is a terminal, `NO_COLOR` is unset and `TERM` is not `dumb`.
    #[default]
    Auto,
    /// Always colour.
    Always,
    /// Never colour.
    Never,
}

/// The decision for one stream: render through this value.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Color {
    enabled: bool,
}

impl Color {
    /// No colour (tests, JSON, pipes).
    pub fn never() -> Self {
        Color { enabled: false }
    }

    /// Decide for standard output.
    pub fn for_stdout(choice: ColorChoice) -> Self {
        Self::decide(choice, std::io::stdout().is_terminal())
    }

    fn decide(choice: ColorChoice, is_terminal: bool) -> Self {
        let env_allows = std::env::var_os("NO_COLOR").is_none_or(|v| v.is_empty())
            && std::env::var("TERM").map_or(true, |t| t != "dumb");
        let enabled = match choice {
            ColorChoice::Always => true,
            ColorChoice::Never => false,
            ColorChoice::Auto => is_terminal && env_allows,
        };
        Color { enabled }
    }

    /// Whether colour is on.
    pub fn enabled(self) -> bool {
        self.enabled
    }

    /// Bold text.
    pub fn bold(self, s: &str) -> String {
        self.wrap("1", s)
    }

    /// Red text (failures, ruled-in faults).
    pub fn red(self, s: &str) -> String {
        self.wrap("31", s)
    }

    /// Green text (passes).
    pub fn green(self, s: &str) -> String {
        self.wrap("32", s)
    }

    /// Yellow text (warnings, cautions).
    pub fn yellow(self, s: &str) -> String {
        self.wrap("33", s)
    }

    fn wrap(self, code: &str, s: &str) -> String {
        if self.enabled {
            format!("\x1b[{code}m{s}\x1b[0m")
        } else {
            s.to_string()
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn never_and_pipes_are_plain() {
        assert_eq!(Color::never().red("x"), "x");
        assert!(!Color::decide(ColorChoice::Auto, false).enabled());
        assert!(Color::decide(ColorChoice::Always, false).enabled());
    }
}
