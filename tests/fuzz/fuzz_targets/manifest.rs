//! The index manifest: any bytes after a good header line, read as the
//! whole manifest a search loads and as the summary alone a watched search
//! reads. A damaged manifest is refused (the index is then rebuilt), never
//! a panic, and whatever is accepted is consistent with itself.

#![no_main]

use libfuzzer_sys::fuzz_target;
use spoolsleuth::index::{ManifestView, SCHEMA_VERSION};

fuzz_target!(|tail: &[u8]| {
    let mut bytes = format!("spoolsleuth-index-manifest {SCHEMA_VERSION}\n").into_bytes();
    bytes.extend_from_slice(tail);
    if let Ok(view) = ManifestView::parse(&bytes) {
        let manifest = view.to_manifest();
        assert!(manifest.entries.len() <= view.notes.len());
        assert!(view.indexed() <= view.notes.len());
    }
});
