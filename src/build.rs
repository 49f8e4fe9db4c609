//! Build script: embeds the demo case notes (`cases/notes/*.md`) into the
//! binary, and rebuilds when a note is added, edited or removed.

use std::fmt::Write as _;
use std::path::PathBuf;
use std::{env, fs};

fn main() {
    let manifest_dir =
        PathBuf::from(env::var_os("CARGO_MANIFEST_DIR").expect("cargo sets CARGO_MANIFEST_DIR"));
    let notes_dir = manifest_dir.join("cases").join("notes");
    println!("cargo:rerun-if-changed=cases/notes");
    let mut names: Vec<(String, PathBuf)> = fs::read_dir(&notes_dir)
        .map(|entries| {
            entries
                .filter_map(Result::ok)
                .map(|entry| entry.path())
                .filter(|path| path.extension().is_some_and(|ext| ext == "md"))
                .filter_map(|path| Some((path.file_name()?.to_str()?.to_string(), path)))
                .collect()
        })
        .unwrap_or_default();
    names.sort();
    let mut code = String::from("static DEMO_NOTES: &[(&str, &str)] = &[\n");
    for (name, path) in names {
        writeln!(
            code,
            "    ({name:?}, include_str!({:?})),",
            path.display().to_string()
        )
        .expect("writing to a String");
    }
    code.push_str("];\n");
    let out =
        PathBuf::from(env::var_os("OUT_DIR").expect("cargo sets OUT_DIR")).join("demo_notes.rs");
    fs::write(out, code).expect("cannot write the embedded notes list");
}
