//! Choosing a report format once and rendering a diagnosis in it.

use super::{render_markdown, render_text};
use crate::diagnosis::Diagnosis;
use crate::output::Color;

/// The shapes a diagnosis can be printed in.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub enum ReportFormat {
    /// Pretty JSON, the documented `schema_version` 1 shape (README, "Diagnosis JSON").
    Json,
    /// Markdown, for a work order, a ticket or a wiki page.
    Markdown,
    /// Terminal text with tables.
    #[default]
    Table,
}

/// How terminal text is drawn.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct TextStyle {
    /// Colour decision for the stream written to.
    pub color: Color,
    /// Table width; `None` lets the table fit the terminal it is shown on.
    pub width: Option<u16>,
}

/// Render `diagnosis` in `format`.
pub fn render(
    diagnosis: &Diagnosis,
    format: ReportFormat,
    style: TextStyle,
) -> Result<String, serde_json::Error> {
    Ok(match format {
        ReportFormat::Json => serde_json::to_string_pretty(diagnosis)? + "\n",
        ReportFormat::Markdown => render_markdown(diagnosis),
        ReportFormat::Table => render_text(diagnosis, style),
    })
}
