//! Searches: any text, as a query (first line) with machine, symptom and
//! cause filters (next lines), over an in-memory index of the demo notes.
//!
//! A search either gives hits or is refused with a message; nothing panics.

#![no_main]

use std::sync::{Mutex, OnceLock};

use libfuzzer_sys::fuzz_target;
use spoolsleuth::index::{IndexLocation, NoteIndex};
use spoolsleuth::notes::NotesFolder;
use spoolsleuth::search::{search, SearchRequest};

fn index() -> &'static Mutex<NoteIndex> {
    static INDEX: OnceLock<Mutex<NoteIndex>> = OnceLock::new();
    INDEX.get_or_init(|| {
        let (index, report) = NoteIndex::open(NotesFolder::Embedded, &IndexLocation::Memory)
            .unwrap_or_else(|e| panic!("demo index: {e}"));
        assert!(report.broken.is_empty(), "{:?}", report.broken);
        Mutex::new(index)
    })
}

fn filter(line: Option<&str>) -> Option<String> {
    line.filter(|l| !l.is_empty()).map(str::to_string)
}

fuzz_target!(|text: &str| {
    let mut lines = text.split('\n');
    let mut request = SearchRequest::new(lines.next().unwrap_or_default());
    request.machine = filter(lines.next());
    request.symptom = filter(lines.next());
    request.cause = filter(lines.next());
    request.limit = 5;
    let mut index = index().lock().unwrap_or_else(|e| e.into_inner());
    match search(&mut index, &request) {
        Ok(results) => {
            assert!(results.hits.len() <= request.limit);
            let _ = results.to_json();
        }
        Err(e) => assert!(!e.to_string().is_empty()),
    }
});
