//! Reports of a diagnosis: terminal text (house tables, colour through
//! [`Color`](crate::output::Color)), Markdown and a self-contained HTML work
//! order with the valve chart. Renderers are pure: they take a
//! [`Diagnosis`](crate::diagnosis::Diagnosis) and return a `String`; the
//! command layer prints or writes it.

mod html_report;
mod markdown_report;
mod report_format;
mod text_report;
mod wording;

pub use html_report::{render_html, CHART_HEADING, CONSISTENCY_HEADING, HEADINGS, SIMILAR_HEADING};
pub use markdown_report::render_markdown;
pub use report_format::{render, ReportFormat, TextStyle};
pub use text_report::render_text;
