//! Reports of a diagnosis: terminal text (house tables, colour through
//! [`Color`](crate::output::Color)), Markdown for a work order or a wiki,
//! and JSON. Renderers are pure: they take a [`Diagnosis`](crate::diagnosis::Diagnosis)
//! and return a `String`; the command layer prints it.

mod markdown_report;
mod report_format;
mod text_report;
mod wording;

pub use markdown_report::render_markdown;
pub use report_format::{render, ReportFormat, TextStyle};
pub use text_report::render_text;
