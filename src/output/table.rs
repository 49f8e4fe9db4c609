//! Building plain tables with comfy-table in one house style.

use comfy_table::{presets, ContentArrangement, Table};

/// A table with the given header, in the house style: UTF-8 borders,
/// wrapped to the terminal width when there is one.
pub fn table<I, S>(header: I) -> Table
where
    I: IntoIterator<Item = S>,
    S: Into<comfy_table::Cell>,
{
    let mut table = Table::new();
    table
        .load_style(presets::UTF8_FULL_CONDENSED)
        .set_content_arrangement(ContentArrangement::Dynamic)
        .set_header(header);
    table
}
