//! Case notes: any text, read as a note file.
//!
//! A note either parses, and then writes back as Markdown that parses to the
//! same note (nothing in it is lost: only blank lines before its text and
//! spaces after it are layout), or is refused with a located message.

#![no_main]

use std::path::Path;

use libfuzzer_sys::fuzz_target;
use spoolsleuth::notes::Note;

fuzz_target!(|text: &str| {
    let path = Path::new("2024-01-02-press-4-sag.md");
    match Note::parse(path, text) {
        Ok(note) => {
            let markdown = note.to_markdown();
            match Note::parse(path, &markdown) {
                Ok(back) => {
                    // Blank lines before the text and spaces after it are layout.
                    let layout =
                        |text: &str| text.trim_start_matches(['\r', '\n']).trim_end().to_string();
                    assert_eq!(
                        layout(&back.text),
                        layout(&note.text),
                        "written back as:\n{markdown}"
                    );
                    let text = note.text.clone();
                    assert_eq!(Note { text, ..back }, note, "written back as:\n{markdown}");
                }
                Err(e) => panic!("written back as:\n{markdown}\nwhich does not parse: {e}"),
            }
            let _ = note.to_json(path);
        }
        Err(e) => assert!(!e.to_string().is_empty()),
    }
});
