//! `spoolsleuth cases`: the real binary on notes each test writes itself (or
//! the built-in demo notes), in temporary folders, with whole outputs and
//! exit codes asserted.

use std::fs;
use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::Output;

use assert_cmd::Command;
use tempfile::TempDir;

/// A hermetic workspace: a notes folder, an index folder and a cache home.
pub(crate) struct Workspace {
    pub(crate) dir: TempDir,
}

impl Workspace {
    pub(crate) fn new() -> Self {
        let dir = tempfile::tempdir().expect("temp dir");
        fs::create_dir(dir.path().join("notes")).expect("notes dir");
        Workspace { dir }
    }

    pub(crate) fn notes(&self) -> PathBuf {
        self.dir.path().join("notes")
    }

    pub(crate) fn index(&self) -> PathBuf {
        self.dir.path().join("index")
    }

    pub(crate) fn write(&self, name: &str, text: &str) {
        fs::write(self.notes().join(name), text).expect("write note");
    }

    /// The command with the notes and index folders of this workspace.
    pub(crate) fn cases(&self, args: &[&str]) -> Command {
        let mut command = bare(self.dir.path());
        command
            .arg("cases")
            .arg("--cases")
            .arg(self.notes())
            .arg("--index-dir")
            .arg(self.index())
            .args(args);
        command
    }

    pub(crate) fn run(&self, args: &[&str]) -> Output {
        self.cases(args).output().expect("run spoolsleuth")
    }
}

/// The binary in `dir` with none of the user's settings.
fn bare(dir: &Path) -> Command {
    // Colour is decided by the terminal here: stdout is a pipe, so plain.
    let mut command = crate::harness::spoolsleuth(dir);
    command.env_remove("NO_COLOR");
    command
}

pub(crate) fn stdout(output: &Output) -> String {
    String::from_utf8_lossy(&output.stdout).into_owned()
}

pub(crate) fn stderr(output: &Output) -> String {
    String::from_utf8_lossy(&output.stderr).into_owned()
}

#[track_caller]
pub(crate) fn status(output: &Output, code: i32) {
    assert_eq!(
        output.status.code(),
        Some(code),
        "stdout:\n{}\nstderr:\n{}",
        stdout(output),
        stderr(output)
    );
}

pub(crate) fn ids(output: &Output) -> Vec<String> {
    let json: serde_json::Value = serde_json::from_slice(&output.stdout).expect("search JSON");
    json["hits"]
        .as_array()
        .expect("hits")
        .iter()
        .map(|hit| hit["id"].as_str().expect("id").to_string())
        .collect()
}

pub(crate) fn note(
    machine: &str,
    date: &str,
    title: &str,
    symptom: &str,
    cause: &str,
    body: &str,
) -> String {
    format!(
        "---\ndate: {date}\nmachine: {machine}\ntitle: {title}\nsymptoms: [{symptom}]\ncause: {cause}\n\
         fix: cleaned and reset\ndowntime: 90 min\nreadings:\n  supply: 160 bar\ntech: JT\n---\n\n{body}\n"
    )
}

pub(crate) fn two_notes(workspace: &Workspace) {
    workspace.write(
        "2024-03-02-press-4-sag.md",
        &note(
            "press-4",
            "2024-03-02",
            "Platen close sags",
            "speed-sags-under-load",
            "compensator-sticking",
            "The spool was stuck with silt.",
        ),
    );
    workspace.write(
        "2025-06-01-conveyor-7-hot.md",
        &note(
            "conveyor-7",
            "2025-06-01",
            "Conveyor runs hot",
            "runs-hot",
            "cooler-fouled",
            "Cooler core full of sawdust.",
        ),
    );
}

/// A third note, added after the first two were indexed.
pub(crate) fn add_sorter_note(workspace: &Workspace) {
    workspace.write(
        "2026-01-05-sorter-9-warm.md",
        &note(
            "sorter-9",
            "2026-01-05",
            "Sorter speeds up warm",
            "drift-warm",
            "needle-valve-uncompensated",
            "Needle valve again.",
        ),
    );
}

#[test]
fn demo_notes_answer_the_trade_questions_in_the_top_three() {
    let dir = tempfile::tempdir().unwrap();
    let rows = [
        ("hunts like crazy", "2020-04-28-trim-saw-6-hunting"),
        ("oscillating platen", "2021-07-14-press-4-hunting"),
        ("conveyor chain bouncing foam", "2021-08-18-conveyor-7-air"),
        ("compensator sticking silt", "2022-02-02-press-4-breather"),
        ("compensater", "2021-01-25-press-4-silt"),
        ("runs hot cooler", "2023-09-26-conveyor-7-cooler"),
        ("overheating fan seized", "2019-12-04-conveyor-7-hot"),
        ("overheting conveyor", "2019-12-04-conveyor-7-hot"),
        ("drops off under load platen", "2021-01-25-press-4-silt"),
        ("surges at start", "2019-09-10-trim-saw-6-lunge"),
        (
            "table jumps when raise selected",
            "2026-01-14-lift-table-5-lunge",
        ),
        ("creep", "2021-06-09-sorter-9-creep"),
        ("drift warm oil needle valve", "2019-07-02-sorter-9-warm"),
        (
            "intensification lowering",
            "2022-05-18-lift-table-5-intensification",
        ),
        (
            "runaway heavy load table",
            "2020-08-12-lift-table-5-runaway",
        ),
        ("accumulator", "2020-09-08-press-4-accumulator"),
        ("margin low frozen logs", "2021-04-21-carriage-2-margin"),
        (
            "ls signal bleed orifice missing",
            "2020-02-05-carriage-2-bleed",
        ),
        ("guage cracked snubber", "2025-01-20-conveyor-7-guage"),
        ("thermal relief trapped oil", "2021-03-30-lift-table-5-warm"),
        ("heat wave", "2022-07-06-conveyor-7-hot"),
        ("sagging press", "2026-02-10-press-4-sag"),
    ];
    let mut misses = Vec::new();
    for (query, expected) in rows {
        let output = bare(dir.path())
            .args(["cases", "search", query, "--limit", "3", "--json"])
            .output()
            .unwrap();
        status(&output, 0);
        let found = ids(&output);
        if !found.iter().any(|id| id == expected) {
            misses.push(format!("{query:?}: expected {expected} in {found:?}"));
        }
    }
    assert!(misses.is_empty(), "{}", misses.join("\n"));
}

#[test]
fn synonyms_find_notes_that_use_other_words() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    // "oscillating" is nowhere in the note; "hunts" is.
    workspace.write(
        "2023-01-01-trim-saw-6-hunt.md",
        &note(
            "trim-saw-6",
            "2023-01-01",
            "Feed hunts like crazy",
            "hunting",
            "air-in-oil",
            "Bled the cylinder.",
        ),
    );
    let output = workspace.run(&["search", "oscillating", "--json"]);
    status(&output, 0);
    assert_eq!(ids(&output), ["2023-01-01-trim-saw-6-hunt"]);
    let output = workspace.run(&["search", "loses speed", "--json"]);
    assert_eq!(ids(&output), ["2024-03-02-press-4-sag"]);
    let output = workspace.run(&["search", "overheating", "--json"]);
    assert_eq!(ids(&output), ["2025-06-01-conveyor-7-hot"]);
}

#[test]
fn search_prints_a_table_with_marked_snippets() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let output = workspace.run(&["search", "silt"]);
    status(&output, 0);
    assert_eq!(stderr(&output), "");
    assert_eq!(
        stdout(&output),
        "\
+------------+---------+----------------------+------------+--------------------------+------------------------+
| Date       | Machine | Cause                | Downtime   | Snippet                  | ID                     |
+==============================================================================================================+
| 2024-03-02 | press-4 | compensator-sticking | 1 h 30 min | The spool was stuck with | 2024-03-02-press-4-sag |
|            |         |                      |            | **silt**                 |                        |
+------------+---------+----------------------+------------+--------------------------+------------------------+
1 of 1 matching notes
"
    );
}

#[test]
fn typos_are_corrected_and_shown() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let output = workspace.run(&["search", "sawdsut", "--json"]);
    status(&output, 0);
    let json: serde_json::Value = serde_json::from_slice(&output.stdout).unwrap();
    assert_eq!(json["did_you_mean"], "sawdust");
    assert_eq!(ids(&output), ["2025-06-01-conveyor-7-hot"]);
    assert_eq!(
        json["hits"][0]["snippet"],
        "Cooler core full of **sawdust**"
    );
}

#[test]
fn nothing_found_exits_one() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let output = workspace.run(&["search", "zebra"]);
    status(&output, 1);
    assert_eq!(stdout(&output), "no notes match\n");
}

#[test]
fn filters_narrow_by_machine_symptom_cause_and_date() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let search = |args: &[&str]| ids(&workspace.run(&[&["search", "", "--json"], args].concat()));
    assert_eq!(
        search(&[]),
        ["2025-06-01-conveyor-7-hot", "2024-03-02-press-4-sag"]
    );
    assert_eq!(
        search(&["--machine", "press-4"]),
        ["2024-03-02-press-4-sag"]
    );
    assert_eq!(
        search(&["--symptom", "runs-hot"]),
        ["2025-06-01-conveyor-7-hot"]
    );
    assert_eq!(
        search(&["--cause", "compensator-sticking"]),
        ["2024-03-02-press-4-sag"]
    );
    assert_eq!(
        search(&["--since", "2025-01-01"]),
        ["2025-06-01-conveyor-7-hot"]
    );
    assert_eq!(
        search(&["--until", "2024-12-31"]),
        ["2024-03-02-press-4-sag"]
    );
}

#[test]
fn bad_options_and_queries_are_clear_errors() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let output = workspace.run(&["search", "x", "--since", "2024-13-01"]);
    status(&output, 2);
    assert!(
        stderr(&output).contains("invalid value '2024-13-01' for '--since <DATE>': '2024-13-01' is not a valid date: month 13 is out of range 1-12"),
        "{}",
        stderr(&output)
    );
    let output = workspace.run(&["search", "x", "--machine", "press4"]);
    status(&output, 2);
    assert_eq!(
        stderr(&output),
        "error: --machine: no notes for machine 'press4' (did you mean 'press-4'?)\n"
    );
    let output = workspace.run(&["search", "x", "--cause", "pump-wron"]);
    status(&output, 2);
    assert_eq!(
        stderr(&output),
        "error: --cause: unknown cause 'pump-wron' (did you mean 'pump-worn'?)\n"
    );
    let output = workspace.run(&["search", "silt AND (spool"]);
    status(&output, 2);
    assert!(
        stderr(&output).starts_with("error: query: "),
        "{}",
        stderr(&output)
    );
    assert!(
        stderr(&output).contains(" at column "),
        "{}",
        stderr(&output)
    );
    let output = workspace.run(&["search", "colour:red"]);
    status(&output, 2);
    assert_eq!(
        stderr(&output),
        "error: query: unknown field 'colour' (search fields: title, body, fix, machine, symptom, cause) at column 1\n"
    );
}

#[test]
fn added_edited_and_deleted_notes_are_picked_up() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    status(&workspace.run(&["search", "silt"]), 0);
    add_sorter_note(&workspace);
    assert_eq!(
        ids(&workspace.run(&["search", "needle", "--json"])),
        ["2026-01-05-sorter-9-warm"]
    );
    workspace.write(
        "2024-03-02-press-4-sag.md",
        &note(
            "press-4",
            "2024-03-02",
            "Platen close sags",
            "speed-sags-under-load",
            "compensator-sticking",
            "Varnish on the spool.",
        ),
    );
    status(&workspace.run(&["search", "silt"]), 1);
    assert_eq!(
        ids(&workspace.run(&["search", "varnish", "--json"])),
        ["2024-03-02-press-4-sag"]
    );
    fs::remove_file(workspace.notes().join("2025-06-01-conveyor-7-hot.md")).unwrap();
    status(&workspace.run(&["search", "sawdust"]), 1);
    assert_eq!(ids(&workspace.run(&["search", "", "--json"])).len(), 2);
}

#[test]
fn an_edit_in_place_that_keeps_the_size_is_picked_up() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    status(&workspace.run(&["search", "silt"]), 0);
    let path = workspace.notes().join("2024-03-02-press-4-sag.md");
    let before = fs::read_to_string(&path).unwrap();
    let after = before.replace("silt", "grit");
    assert_eq!(before.len(), after.len());
    // Rewrite the same file (no rename, so the folder itself is unchanged)
    // with a modification time that differs by one second.
    let file = fs::OpenOptions::new().write(true).open(&path).unwrap();
    let modified = file.metadata().unwrap().modified().unwrap();
    (&file).write_all(after.as_bytes()).unwrap();
    file.set_modified(modified + std::time::Duration::from_secs(1))
        .unwrap();
    drop(file);
    status(&workspace.run(&["search", "silt"]), 1);
    assert_eq!(
        ids(&workspace.run(&["search", "grit", "--json"])),
        ["2024-03-02-press-4-sag"]
    );
}

#[test]
fn a_note_rewritten_within_the_same_time_stamp_is_picked_up() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let path = workspace.notes().join("2024-03-02-press-4-sag.md");
    // A time not yet past when the note is indexed (as for a note written
    // a moment before, or by a machine whose clock runs ahead).
    let stamp = std::time::SystemTime::now() + std::time::Duration::from_secs(86_400);
    fs::File::options()
        .write(true)
        .open(&path)
        .unwrap()
        .set_modified(stamp)
        .unwrap();
    status(&workspace.run(&["search", "silt"]), 0);
    // Same size and the very same time: only a note indexed too soon after
    // its last write is read again, and this one was.
    let before = fs::read_to_string(&path).unwrap();
    let file = fs::OpenOptions::new().write(true).open(&path).unwrap();
    (&file)
        .write_all(before.replace("silt", "grit").as_bytes())
        .unwrap();
    file.set_modified(stamp).unwrap();
    drop(file);
    assert_eq!(fs::metadata(&path).unwrap().modified().unwrap(), stamp);
    assert_eq!(
        ids(&workspace.run(&["search", "grit", "--json"])),
        ["2024-03-02-press-4-sag"]
    );
}

/// The largest file of the index (a segment file).
fn largest_index_file(workspace: &Workspace) -> PathBuf {
    fs::read_dir(workspace.index())
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| {
            p.extension()
                .is_some_and(|e| e != "json" && e != "bin" && e != "lock")
        })
        .max_by_key(|p| fs::metadata(p).unwrap().len())
        .unwrap()
}

#[test]
fn a_damaged_or_missing_index_file_leads_to_a_rebuild() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    status(&workspace.run(&["search", "silt"]), 0);
    let victim = largest_index_file(&workspace);
    let length = fs::metadata(&victim).unwrap().len();
    fs::OpenOptions::new()
        .write(true)
        .open(&victim)
        .unwrap()
        .set_len(length / 2)
        .unwrap();
    let output = workspace.run(&["search", "", "--json"]);
    status(&output, 0);
    assert_eq!(ids(&output).len(), 2);
    assert!(
        stderr(&output).starts_with("note: rebuilt the search index because "),
        "{}",
        stderr(&output)
    );

    // Zeros written inside a file, size unchanged: only the checksums tell.
    let victim = largest_index_file(&workspace);
    let mut bytes = fs::read(&victim).unwrap();
    let middle = bytes.len() / 2;
    bytes[middle - 8..middle + 8].fill(0);
    fs::write(&victim, bytes).unwrap();
    let output = workspace.run(&["search", "", "--json"]);
    assert_eq!(ids(&output).len(), 2);
    assert_eq!(
        stderr(&output),
        "note: rebuilt the search index because 1 of its files were damaged\n"
    );

    fs::remove_file(largest_index_file(&workspace)).unwrap();
    let output = workspace.run(&["search", "", "--json"]);
    assert_eq!(ids(&output).len(), 2);
    assert!(
        stderr(&output).starts_with("note: rebuilt the search index because "),
        "{}",
        stderr(&output)
    );
    // The notes are untouched.
    assert_eq!(fs::read_dir(workspace.notes()).unwrap().count(), 2);
}

#[test]
fn an_index_from_another_schema_version_is_rebuilt() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    status(&workspace.run(&["search", "silt"]), 0);
    // The manifest starts with a text line naming its schema version.
    let manifest = workspace.index().join("spoolsleuth-manifest.bin");
    let mut bytes = fs::read(&manifest).unwrap();
    let header = b"spoolsleuth-index-manifest 2\n";
    assert!(bytes.starts_with(header));
    bytes[header.len() - 2] = b'0';
    fs::write(&manifest, bytes).unwrap();
    let output = workspace.run(&["search", "silt", "--json"]);
    assert_eq!(ids(&output), ["2024-03-02-press-4-sag"]);
    assert_eq!(
        stderr(&output),
        "note: rebuilt the search index because it was written with schema version 0\n"
    );
}

#[test]
fn a_broken_note_is_reported_with_path_and_line_and_skipped() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    workspace.write(
        "bad.md",
        "---\ndate: 2024-01-01\nmachnie: press-4\n---\ntext\n",
    );
    for _ in 0..2 {
        let output = workspace.run(&["search", "silt", "--json"]);
        status(&output, 0);
        assert_eq!(ids(&output), ["2024-03-02-press-4-sag"]);
        let expected = format!(
            "warning: {}: unknown field 'machnie' (did you mean 'machine'?) (note skipped)\n",
            workspace.notes().join("bad.md:3:1").display()
        );
        assert_eq!(stderr(&output), expected);
    }
}

#[test]
fn add_from_options_writes_a_note_that_is_found() {
    let workspace = Workspace::new();
    let output = workspace.run(&[
        "add",
        "--date",
        "2026-12-01",
        "--machine",
        "press-4",
        "--title",
        "Sag under load",
        "--symptom",
        "speed-sags-under-load",
        "--cause",
        "compensator-sticking",
        "--fix",
        "Cleaned the spool",
        "--reading",
        "supply: 160 bar",
        "--downtime",
        "2 h",
        "--tech",
        "MK",
    ]);
    status(&output, 0);
    let path = workspace.notes().join("2026-12-01-press-4-sag-under.md");
    assert_eq!(
        stdout(&output),
        format!("added 2026-12-01-press-4-sag-under: {}\n", path.display())
    );
    assert_eq!(
        fs::read_to_string(&path).unwrap(),
        "---\ndate: 2026-12-01\nmachine: press-4\ntitle: Sag under load\nsymptoms:\n- speed-sags-under-load\n\
         cause: compensator-sticking\nfix: Cleaned the spool\ndowntime: 2 h\nreadings:\n  supply: 160 bar\ntech: MK\n---\n"
    );
    assert_eq!(
        ids(&workspace.run(&["search", "spool", "--json"])),
        ["2026-12-01-press-4-sag-under"]
    );
}

#[test]
fn add_rejects_bad_options_with_the_option_named() {
    let workspace = Workspace::new();
    let output = workspace.run(&[
        "add",
        "--machine",
        "press-4",
        "--title",
        "x",
        "--symptom",
        "hunting",
        "--cause",
        "air-in-oil",
        "--fix",
        "y",
        "--date",
        "2024-02-30",
    ]);
    status(&output, 2);
    assert_eq!(stderr(&output), "error: --date: '2024-02-30' is not a valid date: day 30 is out of range 1-29 for 2024-02\n");
    assert_eq!(fs::read_dir(workspace.notes()).unwrap().count(), 0);
}

#[test]
fn add_from_a_diagnosis_json_file() {
    let workspace = Workspace::new();
    let json = workspace.dir.path().join("diagnosis.json");
    fs::write(
        &json,
        r#"{"machine": "sorter-9", "complaint": "Chain speed drifts as oil warms", "symptoms": ["drift-warm"],
            "leading_cause": {"id": "needle-valve-uncompensated", "confidence": 0.9},
            "fix": "Fitted a compensated valve", "readings": {"oil temp": "50 °C"}, "date": "2026-11-30",
            "session": {"answers": 12}}"#,
    )
    .unwrap();
    let output = workspace.run(&["add", "--from-json", json.to_str().unwrap(), "--json"]);
    status(&output, 0);
    let reply: serde_json::Value = serde_json::from_slice(&output.stdout).unwrap();
    assert_eq!(reply["id"], "2026-11-30-sorter-9-chain-speed");
    let shown = workspace.run(&["show", "2026-11-30-sorter-9-chain-speed", "--json"]);
    let note: serde_json::Value = serde_json::from_slice(&shown.stdout).unwrap();
    assert_eq!(note["cause"], "needle-valve-uncompensated");
    assert_eq!(
        note["readings"],
        serde_json::json!([{"name": "oil temp", "value": "50 °C"}])
    );
}

#[test]
fn two_processes_adding_at_once_keep_both_notes() {
    let workspace = Workspace::new();
    let args = [
        "add",
        "--date",
        "2026-12-01",
        "--machine",
        "press-4",
        "--title",
        "Sag",
        "--symptom",
        "speed-sags-under-load",
        "--cause",
        "compensator-sticking",
        "--fix",
        "Cleaned",
    ];
    let children: Vec<_> = (0..2)
        .map(|_| {
            let mut command = crate::harness::process(workspace.dir.path());
            command
                .arg("cases")
                .arg("--cases")
                .arg(workspace.notes())
                .args(args);
            command.stdout(std::process::Stdio::null()).spawn().unwrap()
        })
        .collect();
    for mut child in children {
        assert!(child.wait().unwrap().success());
    }
    let mut names: Vec<String> = fs::read_dir(workspace.notes())
        .unwrap()
        .map(|e| e.unwrap().file_name().into_string().unwrap())
        .collect();
    names.sort();
    assert_eq!(
        names,
        ["2026-12-01-press-4-sag-2.md", "2026-12-01-press-4-sag.md"]
    );
}

#[test]
fn add_through_the_editor_reopens_on_error() {
    let workspace = Workspace::new();
    // First save has a typo in a field name; the second is fine.
    let script = workspace.dir.path().join("editor.sh");
    let count = workspace.dir.path().join("count");
    fs::write(
        &script,
        format!(
            "#!/bin/sh\nif [ -f '{count}' ]; then field=machine; else field=machnie; touch '{count}'; fi\n\
             printf -- '---\\ndate: 2026-10-10\\n%s: trim-saw-6\\ntitle: Saw lunges\\nsymptoms: [startup-lunge]\\n\
             cause: compensator-open-at-rest\\nfix: Fitted a bleed\\n---\\nJumps at start.\\n' \"$field\" > \"$1\"\n",
            count = count.display()
        ),
    )
    .unwrap();
    let output = workspace
        .cases(&["add", "--edit"])
        .env("EDITOR", format!("sh {}", script.display()))
        .write_stdin("\n")
        .output()
        .unwrap();
    status(&output, 0);
    assert!(
        stderr(&output).contains(
            ":3:1: unknown field 'machnie' (did you mean 'machine'?)\nedit the note again? [Y/n] "
        ),
        "{}",
        stderr(&output)
    );
    assert_eq!(
        stdout(&output),
        format!(
            "added 2026-10-10-trim-saw-6-lunges: {}\n",
            workspace
                .notes()
                .join("2026-10-10-trim-saw-6-lunges.md")
                .display()
        )
    );
}

#[test]
fn an_unchanged_editor_template_adds_nothing() {
    let workspace = Workspace::new();
    let output = workspace
        .cases(&["add", "--edit"])
        .env("EDITOR", "true")
        .output()
        .unwrap();
    status(&output, 1);
    assert_eq!(
        stderr(&output),
        "nothing added: the note was left unchanged\n"
    );
    assert_eq!(fs::read_dir(workspace.notes()).unwrap().count(), 0);
}

#[test]
fn the_built_in_notes_are_read_only() {
    let dir = tempfile::tempdir().unwrap();
    let output = bare(dir.path())
        .args(["cases", "add", "--machine", "press-4"])
        .output()
        .unwrap();
    status(&output, 2);
    assert_eq!(
        stderr(&output),
        "error: the built-in demo notes are read-only; choose a notes folder with --cases DIR or SPOOLSLEUTH_CASES\n"
    );
}

#[test]
fn show_prints_a_note_or_suggests_the_nearest_id() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let output = workspace.run(&["show", "2024-03-02-press-4-sag"]);
    status(&output, 0);
    assert_eq!(
        stdout(&output),
        format!(
            "Platen close sags\n2024-03-02-press-4-sag  ({})\n\nDate:      2024-03-02\nMachine:   press-4\n\
             Symptoms:  speed-sags-under-load\nCause:     compensator-sticking\nFix:       cleaned and reset\n\
             Downtime:  1 h 30 min\nReadings:  supply: 160 bar\nTech:      JT\n\nThe spool was stuck with silt.\n",
            workspace.notes().join("2024-03-02-press-4-sag.md").display()
        )
    );
    let output = workspace.run(&["show", "2024-03-02-press-4-sga"]);
    status(&output, 2);
    assert_eq!(stderr(&output), "error: no note with id '2024-03-02-press-4-sga' (did you mean '2024-03-02-press-4-sag'?)\n");
}

#[test]
fn stats_count_causes_and_repeat_offenders() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    workspace.write(
        "2025-01-01-press-4-sag.md",
        &note(
            "press-4",
            "2025-01-01",
            "Sags again",
            "speed-sags-under-load",
            "compensator-sticking",
            "Silt.",
        ),
    );
    let output = workspace.run(&["stats", "--json"]);
    status(&output, 0);
    let stats: serde_json::Value = serde_json::from_slice(&output.stdout).unwrap();
    assert_eq!(stats["notes"], 3);
    assert_eq!(stats["total_downtime_minutes"], 270);
    assert_eq!(
        stats["repeat_offenders"],
        serde_json::json!([{"cause": "compensator-sticking", "count": 2, "downtime_minutes": 180, "first": "2024-03-02",
            "ids": ["2024-03-02-press-4-sag", "2025-01-01-press-4-sag"], "last": "2025-01-01", "machine": "press-4"}])
    );
    assert_eq!(
        stats["machines"][1]["causes"],
        serde_json::json!([{"cause": "compensator-sticking", "count": 2}])
    );
}

#[test]
fn a_folder_of_other_files_is_never_used_as_an_index() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    fs::create_dir(workspace.index()).unwrap();
    fs::write(workspace.index().join("thesis.txt"), "precious").unwrap();
    let output = workspace.run(&["search", "silt"]);
    status(&output, 2);
    assert!(stderr(&output)
        .contains("refusing to keep an index in a folder that holds other files ('thesis.txt')"));
    assert_eq!(
        fs::read_to_string(workspace.index().join("thesis.txt")).unwrap(),
        "precious"
    );
}

#[test]
fn the_default_index_lives_in_the_cache_folder() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let output = bare(workspace.dir.path())
        .args(["cases", "search", "silt", "--cases"])
        .arg(workspace.notes())
        .output()
        .unwrap();
    status(&output, 0);
    let cache = workspace.dir.path().join("cache").join("spoolsleuth");
    let entries: Vec<String> = fs::read_dir(&cache)
        .unwrap()
        .map(|e| e.unwrap().file_name().into_string().unwrap())
        .collect();
    assert_eq!(entries.len(), 1);
    assert!(entries[0].starts_with("index-"), "{entries:?}");
}

#[test]
fn a_note_is_added_straight_from_a_diagnosis() {
    let dir = tempfile::tempdir().unwrap();
    let json = dir.path().join("d.json");
    let diagnose = crate::harness::spoolsleuth(dir.path())
        .arg("diagnose")
        .args(spoolsleuth::diagnosis::DEMO_CALL.arguments())
        .args(["--index-dir", "index", "--json"])
        .output()
        .unwrap();
    assert_eq!(diagnose.status.code(), Some(0));
    std::fs::write(&json, &diagnose.stdout).unwrap();
    let notes = dir.path().join("notes");
    let add = crate::harness::spoolsleuth(dir.path())
        .args(["cases", "add", "--cases"])
        .arg(&notes)
        .arg("--from-json")
        .arg(&json)
        .args(["--tech", "JT"])
        .output()
        .unwrap();
    assert_eq!(
        add.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&add.stderr)
    );
    let file = std::fs::read_dir(&notes)
        .unwrap()
        .next()
        .unwrap()
        .unwrap()
        .path();
    let text = std::fs::read_to_string(file).unwrap();
    for line in [
        "machine: press-4",
        "title: platen slows right down and bogs when it closes on the panel",
        "- speed-sags-under-load",
        "cause: compensator-sticking",
        "  inter_pressure@loaded: 143.5 bar",
        "tech: JT",
    ] {
        assert!(
            text.lines().any(|l| l == line),
            "{line:?} missing from\n{text}"
        );
    }
}

/// A note with a valid front matter and a body of more than 1 MiB.
fn huge_note(body: &str) -> String {
    let mut text = note(
        "press-4",
        "2024-05-05",
        "Logger dump",
        "runs-hot",
        "cooler-fouled",
        body,
    );
    text.push_str(&"a".repeat(1 << 20));
    text
}

#[test]
fn a_note_over_the_size_limit_is_skipped_with_a_warning_and_left_alone() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let huge = huge_note("Silt everywhere.");
    workspace.write("2024-05-05-press-4-logger.md", &huge);
    let warning = |name: &str| {
        format!(
            "warning: {}: the note is larger than the limit of 1048576 bytes (note skipped)\n",
            workspace.notes().join(name).display()
        )
    };
    // Built from scratch, then kept.
    for _ in 0..2 {
        let output = workspace.run(&["search", "silt", "--json"]);
        status(&output, 0);
        assert_eq!(ids(&output), ["2024-03-02-press-4-sag"]);
        assert_eq!(stderr(&output), warning("2024-05-05-press-4-logger.md"));
    }
    // An indexed note that grows over the limit leaves the index.
    let grown = huge_note("The spool was stuck with silt.");
    workspace.write("2024-03-02-press-4-sag.md", &grown);
    let output = workspace.run(&["search", "silt", "--json"]);
    status(&output, 1);
    assert_eq!(ids(&output), Vec::<String>::new());
    assert_eq!(
        stderr(&output),
        warning("2024-03-02-press-4-sag.md") + &warning("2024-05-05-press-4-logger.md")
    );
    let read = |name: &str| fs::read_to_string(workspace.notes().join(name)).unwrap();
    assert_eq!(read("2024-05-05-press-4-logger.md"), huge);
    assert_eq!(read("2024-03-02-press-4-sag.md"), grown);
}

#[test]
fn a_note_that_is_not_utf8_is_skipped_with_a_warning() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    fs::write(
        workspace.notes().join("latin.md"),
        b"---\ntitle: Caf\xe9 press\n---\n",
    )
    .unwrap();
    let output = workspace.run(&["search", "silt", "--json"]);
    status(&output, 0);
    assert_eq!(ids(&output), ["2024-03-02-press-4-sag"]);
    assert_eq!(
        stderr(&output),
        format!(
            "warning: {}: the file is not UTF-8 text (at byte 14); save it as UTF-8 (note skipped)\n",
            workspace.notes().join("latin.md").display()
        )
    );
}

#[cfg(unix)]
#[test]
fn a_link_out_of_the_notes_folder_is_skipped_and_not_shown() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let outside = workspace.dir.path().join("outside.md");
    let secret = note(
        "press-4",
        "2024-04-04",
        "Secret",
        "runs-hot",
        "cooler-fouled",
        "Silt outside.",
    );
    fs::write(&outside, &secret).unwrap();
    let link = workspace.notes().join("2024-04-04-press-4-secret.md");
    std::os::unix::fs::symlink(&outside, &link).unwrap();
    let problem = format!(
        "{}: the note is a link to {}, outside the notes folder",
        link.display(),
        fs::canonicalize(&outside).unwrap().display()
    );
    let output = workspace.run(&["search", "silt", "--json"]);
    status(&output, 0);
    assert_eq!(ids(&output), ["2024-03-02-press-4-sag"]);
    assert_eq!(
        stderr(&output),
        format!("warning: {problem} (note skipped)\n")
    );
    let output = workspace.run(&["show", "2024-04-04-press-4-secret"]);
    status(&output, 2);
    assert_eq!(stdout(&output), "");
    assert_eq!(stderr(&output), format!("error: {problem}\n"));
    assert_eq!(fs::read_to_string(&outside).unwrap(), secret);
}

#[test]
fn show_refuses_ids_that_leave_the_notes_folder() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    fs::write(
        workspace.dir.path().join("secret.md"),
        note(
            "press-4",
            "2024-04-04",
            "Secret",
            "runs-hot",
            "cooler-fouled",
            "x",
        ),
    )
    .unwrap();
    for id in ["../secret", "/etc/passwd", "sub/../../secret"] {
        let output = workspace.run(&["show", id]);
        status(&output, 2);
        assert_eq!(stdout(&output), "");
        assert_eq!(
            stderr(&output),
            format!(
                "error: '{id}' is not a note id: an id is a file name of the notes folder \
                 without '.md', with no '/' or '..'\n"
            )
        );
    }
}

#[test]
fn add_makes_ids_inside_the_notes_folder_from_any_title() {
    let workspace = Workspace::new();
    let output = workspace.run(&[
        "add",
        "--date",
        "2026-12-01",
        "--machine",
        "press-4",
        "--title",
        "../../etc/passwd",
        "--symptom",
        "speed-sags-under-load",
        "--cause",
        "compensator-sticking",
        "--fix",
        "Cleaned the spool",
    ]);
    status(&output, 0);
    let path = workspace.notes().join("2026-12-01-press-4-etc-passwd.md");
    assert_eq!(
        stdout(&output),
        format!("added 2026-12-01-press-4-etc-passwd: {}\n", path.display())
    );
    let names: Vec<String> = fs::read_dir(workspace.dir.path())
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    assert_eq!(names, ["notes"]);
}

#[test]
fn a_query_over_the_length_limit_exits_2_before_any_indexing() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let query = "silt ".repeat(201);
    let output = workspace.run(&["search", &query]);
    status(&output, 2);
    assert_eq!(stdout(&output), "");
    assert_eq!(
        stderr(&output),
        "error: query: 1005 characters is longer than the limit of 1000 characters\n"
    );
    assert!(!workspace.index().exists());
}

/// An excluded phrase that matches no note once crashed the search inside
/// the search library; it must exclude nothing and answer like the plain word.
#[test]
fn an_excluded_phrase_that_matches_nothing_excludes_nothing() {
    let dir = tempfile::tempdir().unwrap();
    let search = |query: &str| {
        let output = crate::harness::spoolsleuth(dir.path())
            .args([
                "cases",
                "search",
                query,
                "--limit",
                "50",
                "--json",
                "--index-dir",
                "index",
            ])
            .output()
            .unwrap();
        assert_eq!(
            output.status.code(),
            Some(0),
            "{}",
            String::from_utf8_lossy(&output.stderr)
        );
        let json: serde_json::Value = serde_json::from_slice(&output.stdout).unwrap();
        let mut ids: Vec<String> = json["hits"]
            .as_array()
            .unwrap()
            .iter()
            .map(|h| h["id"].as_str().unwrap().to_string())
            .collect();
        ids.sort();
        ids
    };
    let plain = search("spool");
    assert!(!plain.is_empty());
    assert_eq!(search("+spool -\"runs h\""), plain);
    // An excluded word that does match takes its notes out, and only those.
    let silt = search("+spool +silt");
    let without = search("+spool -silt");
    assert!(!silt.is_empty());
    assert!(without.iter().all(|id| !silt.contains(id)));
    assert_eq!(without.len() + silt.len(), plain.len());
}
