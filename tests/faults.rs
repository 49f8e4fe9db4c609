//! Faults around the notes: a search killed while it indexes, an index folder
//! that cannot be written, bad files among the notes, and processes adding
//! notes at the same time. After each, every note must still be there and
//! be found.

use std::collections::BTreeMap;
use std::fs;
use std::path::{Path, PathBuf};
use std::process::{Command, Output, Stdio};
use std::time::Duration;

use tempfile::TempDir;

/// A small seeded generator, so that a failing run can be repeated.
struct Xorshift(u64);

impl Xorshift {
    fn below(&mut self, n: u64) -> u64 {
        self.0 ^= self.0 << 13;
        self.0 ^= self.0 >> 7;
        self.0 ^= self.0 << 17;
        self.0 % n
    }
}

struct Notes {
    dir: TempDir,
    /// Every note written: file name → text.
    written: BTreeMap<String, String>,
}

impl Notes {
    fn new() -> Self {
        let dir = tempfile::tempdir().expect("temp dir");
        fs::create_dir(dir.path().join("notes")).expect("notes folder");
        Notes {
            dir,
            written: BTreeMap::new(),
        }
    }

    fn folder(&self) -> PathBuf {
        self.dir.path().join("notes")
    }

    fn index(&self) -> PathBuf {
        self.dir.path().join("index")
    }

    /// A note whose body holds the unique `word`.
    fn plant(&mut self, word: &str) {
        let name = format!("2024-01-01-press-4-{word}.md");
        let text = format!(
            "---\ndate: 2024-01-01\nmachine: press-4\ntitle: Platen sags {word}\n\
             symptoms: [speed-sags-under-load]\ncause: compensator-sticking\nfix: cleaned\n---\n\
             found {word} in the spool\n"
        );
        fs::write(self.folder().join(&name), &text).expect("write note");
        self.written.insert(name, text);
    }

    fn command(&self, args: &[&str]) -> Command {
        let mut command = crate::harness::process(self.dir.path());
        command
            .arg("cases")
            .arg("--cases")
            .arg(self.folder())
            .arg("--index-dir")
            .arg(self.index())
            .args(args);
        command
    }

    fn run(&self, args: &[&str]) -> Output {
        self.command(args).output().expect("run spoolsleuth")
    }

    /// The ids a search for `word` finds; the search must succeed.
    #[track_caller]
    fn found(&self, word: &str) -> Vec<String> {
        let output = self.run(&["search", word, "--json", "--limit", "1000"]);
        assert_eq!(
            output.status.code(),
            Some(0),
            "search {word}: {}",
            String::from_utf8_lossy(&output.stderr)
        );
        ids(&output)
    }

    /// The notes folder holds exactly what was written, byte for byte.
    #[track_caller]
    fn assert_untouched(&self) {
        let mut on_disk = BTreeMap::new();
        for entry in fs::read_dir(self.folder()).expect("read notes") {
            let entry = entry.expect("entry");
            let name = entry.file_name().into_string().expect("name");
            if self.written.contains_key(&name) {
                on_disk.insert(name, fs::read_to_string(entry.path()).expect("read note"));
            }
        }
        assert_eq!(on_disk.len(), self.written.len(), "a note went missing");
        assert!(on_disk == self.written, "a note changed");
    }
}

fn ids(output: &Output) -> Vec<String> {
    let json: serde_json::Value = serde_json::from_slice(&output.stdout).expect("search JSON");
    json["hits"]
        .as_array()
        .expect("hits")
        .iter()
        .map(|hit| hit["id"].as_str().expect("id").to_string())
        .collect()
}

fn stderr(output: &Output) -> String {
    String::from_utf8_lossy(&output.stderr).into_owned()
}

/// True when the folder really refuses new files (it does not for root).
fn refuses_writes(dir: &Path) -> bool {
    let probe = dir.join("write-probe");
    let refused = fs::write(&probe, "x").is_err();
    let _ = fs::remove_file(&probe);
    refused
}

#[test]
fn a_search_killed_while_indexing_loses_no_note() {
    let mut notes = Notes::new();
    for n in 0..2000 {
        notes.plant(&format!("bulk{n}x"));
    }
    let mut random = Xorshift(0x5eed_1e55_c0ff_ee00);
    let mut planted = Vec::new();
    for round in 0..24 {
        // Make the next search do real work: a rebuild after losing index
        // files, or an update with new notes.
        match round % 4 {
            0 => {
                let _ = fs::remove_file(notes.index().join("meta.json"));
            }
            1 => {
                let _ = fs::remove_file(notes.index().join("spoolsleuth-manifest.txt"));
            }
            2 => {
                for n in 0..40 {
                    notes.plant(&format!("batch{round}n{n}x"));
                }
            }
            _ => {}
        }
        let word = format!("planted{round}x");
        notes.plant(&word);
        planted.push(word.clone());
        let mut child = notes
            .command(&["search", &word])
            .stdout(Stdio::null())
            .stderr(Stdio::null())
            .spawn()
            .expect("spawn search");
        std::thread::sleep(Duration::from_millis(random.below(700)));
        // SIGKILL: no destructor, no unlock, no cleanup runs.
        let _ = child.kill();
        let _ = child.wait();
        assert_eq!(
            notes.found(&word),
            [format!("2024-01-01-press-4-{word}")],
            "round {round}"
        );
    }
    for word in &planted {
        assert_eq!(notes.found(word).len(), 1, "{word}");
    }
    let stats = notes.run(&["stats", "--json"]);
    let stats: serde_json::Value = serde_json::from_slice(&stats.stdout).expect("stats JSON");
    assert_eq!(stats["notes"], notes.written.len());
    notes.assert_untouched();
}

#[test]
fn a_read_only_index_folder_still_finds_every_note() {
    let mut notes = Notes::new();
    notes.plant("firstx");
    assert_eq!(notes.found("firstx").len(), 1);
    notes.plant("secondx");
    let index = notes.index();
    let mut permissions = fs::metadata(&index).expect("index").permissions();
    std::os::unix::fs::PermissionsExt::set_mode(&mut permissions, 0o555);
    fs::set_permissions(&index, permissions.clone()).expect("chmod");
    if refuses_writes(&index) {
        let output = notes.run(&["search", "secondx", "--json"]);
        assert_eq!(output.status.code(), Some(0), "{}", stderr(&output));
        assert_eq!(ids(&output), ["2024-01-01-press-4-secondx"]);
        assert!(
            stderr(&output).starts_with("warning: cannot keep the search index: "),
            "{}",
            stderr(&output)
        );
    } else {
        println!("skipped the read-only index check: chmod does not stop this user (root)");
    }
    std::os::unix::fs::PermissionsExt::set_mode(&mut permissions, 0o755);
    fs::set_permissions(&index, permissions).expect("chmod back");
    assert_eq!(notes.found("secondx").len(), 1);
    notes.assert_untouched();
}

/// A full disk cannot be made portably without mounting a small file system.
/// A file-size limit (`ulimit -f`, with SIGXFSZ ignored so that the write
/// fails with EFBIG instead of killing the process) fails the writes the same
/// way a full disk does, on any Unix with a POSIX shell.
fn with_full_disk(notes: &Notes, args: &[&str], blocks: u32) -> Output {
    let command = notes.command(args);
    let mut shell = Command::new("sh");
    shell
        .arg("-c")
        .arg(format!(
            "ulimit -f {blocks}; trap '' XFSZ; exec \"$0\" \"$@\""
        ))
        .arg(command.get_program())
        .args(command.get_args())
        .current_dir(notes.dir.path())
        .env("NO_COLOR", "1")
        .env("HOME", notes.dir.path())
        .env("XDG_CACHE_HOME", notes.dir.path().join("cache"));
    shell.output().expect("run under a file-size limit")
}

#[test]
fn a_full_disk_gives_a_search_from_memory_and_adds_no_broken_note() {
    let mut notes = Notes::new();
    for n in 0..30 {
        notes.plant(&format!("full{n}x"));
    }
    let output = with_full_disk(&notes, &["search", "full7x", "--json"], 4);
    assert_eq!(output.status.code(), Some(0), "{}", stderr(&output));
    assert_eq!(ids(&output), ["2024-01-01-press-4-full7x"]);
    assert!(
        stderr(&output).starts_with("warning: cannot keep the search index: "),
        "{}",
        stderr(&output)
    );

    let add = [
        "add",
        "--date",
        "2026-12-01",
        "--machine",
        "press-4",
        "--title",
        "Sag",
        "--symptom",
        "hunting",
        "--cause",
        "air-in-oil",
        "--fix",
        "bled it",
    ];
    let output = with_full_disk(&notes, &add, 0);
    assert_eq!(output.status.code(), Some(2), "{}", stderr(&output));
    assert!(
        stderr(&output).contains("File too large"),
        "{}",
        stderr(&output)
    );
    // Neither a partial note nor a leftover temporary file.
    assert_eq!(
        fs::read_dir(notes.folder()).expect("notes").count(),
        notes.written.len()
    );
    notes.assert_untouched();
    // Once there is room the index is built and every note is found.
    assert_eq!(notes.found("full29x").len(), 1);
}

#[test]
fn unreadable_binary_and_huge_files_are_skipped_by_name() {
    let mut notes = Notes::new();
    notes.plant("keptx");
    let folder = notes.folder();
    fs::write(
        folder.join("binary.md"),
        b"---\ndate: 2024-01-01\n\0\x01\x02 keptx\n",
    )
    .unwrap();
    let mut huge = b"---\ndate: 2024-01-01\n---\n".to_vec();
    huge.resize(3 * 1024 * 1024, b'a');
    fs::write(folder.join("huge.md"), huge).unwrap();
    let locked = folder.join("locked.md");
    fs::write(&locked, "---\ndate: 2024-01-01\n---\nkeptx\n").unwrap();
    let mut permissions = fs::metadata(&locked).unwrap().permissions();
    std::os::unix::fs::PermissionsExt::set_mode(&mut permissions, 0o000);
    fs::set_permissions(&locked, permissions).unwrap();
    let unreadable = fs::read(&locked).is_err();
    if !unreadable {
        println!("skipped the unreadable-note check: chmod does not stop this user (root)");
    }
    for _ in 0..2 {
        let output = notes.run(&["search", "keptx", "--json"]);
        assert_eq!(output.status.code(), Some(0), "{}", stderr(&output));
        assert_eq!(ids(&output), ["2024-01-01-press-4-keptx"]);
        let err = stderr(&output);
        let name = |file: &str| folder.join(file).display().to_string();
        assert!(err.contains(&format!(
            "warning: {}: the file holds a NUL byte (at byte 21): it is not a text note (note skipped)\n",
            name("binary.md")
        )), "{err}");
        assert!(
            err.contains(&format!(
                "warning: {}: the note is larger than the limit of 1048576 bytes (note skipped)\n",
                name("huge.md")
            )),
            "{err}"
        );
        if unreadable {
            assert!(
                err.contains(&format!(
                    "warning: {}: Permission denied (os error 13) (note skipped)\n",
                    name("locked.md")
                )),
                "{err}"
            );
        }
    }
    notes.assert_untouched();
}

#[test]
fn processes_adding_at_once_keep_every_note() {
    let notes = Notes::new();
    let rounds = 8;
    for round in 0..rounds {
        let title = format!("Sag round {round}");
        let children: Vec<_> = (0..2)
            .map(|n| {
                let text = format!("writer {n} of round {round}");
                notes
                    .command(&[
                        "add",
                        "--date",
                        "2026-12-01",
                        "--machine",
                        "press-4",
                        "--title",
                        &title,
                        "--symptom",
                        "hunting",
                        "--cause",
                        "air-in-oil",
                        "--fix",
                        "bled it",
                        "--text",
                        &text,
                    ])
                    .stdout(Stdio::null())
                    .spawn()
                    .expect("spawn add")
            })
            .collect();
        for mut child in children {
            assert!(child.wait().expect("wait").success(), "round {round}");
        }
    }
    let mut bodies: Vec<String> = fs::read_dir(notes.folder())
        .expect("notes")
        .map(|e| fs::read_to_string(e.expect("entry").path()).expect("read"))
        .collect();
    bodies.sort();
    assert_eq!(bodies.len(), 2 * rounds);
    for round in 0..rounds {
        for n in 0..2 {
            let text = format!("writer {n} of round {round}");
            assert_eq!(
                bodies.iter().filter(|b| b.contains(&text)).count(),
                1,
                "{text}"
            );
        }
    }
    let stats = notes.run(&["stats", "--json"]);
    let stats: serde_json::Value = serde_json::from_slice(&stats.stdout).expect("stats JSON");
    assert_eq!(stats["notes"], 2 * rounds);
}
