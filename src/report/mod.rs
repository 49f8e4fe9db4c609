//! Reports of a diagnosis for people: the HTML work order.

mod html_report;

pub use html_report::{render_html, CHART_HEADING, CONSISTENCY_HEADING, HEADINGS, SIMILAR_HEADING};
