//! Writing results: plain text tables, JSON, colour decisions. Business code
//! returns values; only the command layer prints them through here.

mod color;
mod table;

pub use color::{Color, ColorChoice};
pub use table::table;

use std::io::Write;

/// Write text to standard output. A closed pipe (`| head`) surfaces as an
/// I/O error of kind `BrokenPipe`, which `run` treats as success.
pub fn print(text: &str) -> std::io::Result<()> {
    let mut out = std::io::stdout().lock();
    out.write_all(text.as_bytes())?;
    if !text.ends_with('\n') {
        out.write_all(b"\n")?;
    }
    out.flush()
}

/// Write a value as pretty JSON to standard output.
pub fn print_json<T: serde::Serialize>(value: &T) -> Result<(), crate::Error> {
    let text = serde_json::to_string_pretty(value)?;
    print(&text)?;
    Ok(())
}
