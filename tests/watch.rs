//! `spoolsleuth cases watch`: a real watcher process beside real searches,
//! on notes each test writes. The edits chosen are ones a check of sizes
//! and times cannot see (same size, time put back), so a search that finds
//! them shows the watcher's answer was used.
#![cfg(target_os = "linux")]

use std::fs;
use std::io::{BufRead, BufReader, Read, Write};
use std::path::Path;
use std::process::{Child, ChildStderr, Stdio};
use std::sync::mpsc;
use std::time::Duration;

use crate::cases::{add_sorter_note, ids, status, stderr, two_notes, Workspace};

/// How long a watcher may take to index the notes and start.
const START_LIMIT: Duration = Duration::from_secs(60);

/// A `cases watch` process of a workspace.
struct Watcher {
    child: Child,
    lines: mpsc::Receiver<String>,
}

impl Watcher {
    /// Start a watcher and wait until it says it is watching.
    fn start(workspace: &Workspace) -> Watcher {
        let mut watcher = Self::spawn(workspace);
        let first = watcher.line();
        assert!(
            first.starts_with("watching "),
            "unexpected first line from the watcher: {first:?}"
        );
        assert_eq!(
            watcher.line(),
            "searches of these notes ask this watcher instead of checking every note; stop with Ctrl-C"
        );
        watcher
    }

    fn spawn(workspace: &Workspace) -> Watcher {
        let mut child = crate::harness::process(workspace.dir.path())
            .arg("cases")
            .arg("--cases")
            .arg(workspace.notes())
            .arg("--index-dir")
            .arg(workspace.index())
            .arg("watch")
            .stdout(Stdio::null())
            .stderr(Stdio::piped())
            .spawn()
            .expect("start the watcher");
        let stderr: ChildStderr = child.stderr.take().expect("watcher stderr");
        let (sender, lines) = mpsc::channel();
        std::thread::spawn(move || {
            for line in BufReader::new(stderr).lines() {
                let Ok(line) = line else { break };
                if sender.send(line).is_err() {
                    break;
                }
            }
        });
        Watcher { child, lines }
    }

    /// The next line the watcher printed.
    fn line(&mut self) -> String {
        match self.lines.recv_timeout(START_LIMIT) {
            Ok(line) => line,
            Err(_) => {
                let _ = self.child.kill();
                panic!("the watcher printed nothing more");
            }
        }
    }

    /// Send SIGTERM and return the exit code and the lines printed after
    /// the start.
    fn terminate(self) -> (Option<i32>, Vec<String>) {
        self.signal("TERM");
        self.finish()
    }

    /// Send the signal `name` (`TERM`, `STOP`, `CONT`) to the watcher.
    fn signal(&self, name: &str) {
        let sent = std::process::Command::new("kill")
            .arg(format!("-{name}"))
            .arg(self.child.id().to_string())
            .status()
            .expect("run kill");
        assert!(sent.success());
    }

    /// Wait for the watcher to end on its own, and for the last of what it
    /// printed (the reader thread ends at the end of its stderr).
    fn finish(mut self) -> (Option<i32>, Vec<String>) {
        let code = self.child.wait().expect("wait for the watcher").code();
        let mut rest = Vec::new();
        while let Ok(line) = self.lines.recv_timeout(START_LIMIT) {
            rest.push(line);
        }
        (code, rest)
    }
}

impl Drop for Watcher {
    fn drop(&mut self) {
        let _ = self.child.kill();
        let _ = self.child.wait();
    }
}

/// Rewrite `path` in place with `from` replaced by `to` (same length) and
/// put its modification time back, so that neither size nor time moves.
fn rewrite_unseen(path: &Path, from: &str, to: &str) {
    let before = fs::read_to_string(path).unwrap();
    let after = before.replace(from, to);
    assert_eq!(before.len(), after.len());
    let file = fs::OpenOptions::new().write(true).open(path).unwrap();
    let modified = file.metadata().unwrap().modified().unwrap();
    (&file).write_all(after.as_bytes()).unwrap();
    file.set_modified(modified).unwrap();
    drop(file);
    assert_eq!(fs::metadata(path).unwrap().modified().unwrap(), modified);
}

/// Make a note's time old enough that an index takes it as settled.
fn age(path: &Path) {
    let old = std::time::SystemTime::now() - Duration::from_secs(86_400);
    fs::File::options()
        .write(true)
        .open(path)
        .unwrap()
        .set_modified(old)
        .unwrap();
}

fn sag_note(workspace: &Workspace) -> std::path::PathBuf {
    workspace.notes().join("2024-03-02-press-4-sag.md")
}

#[test]
fn searches_see_edits_that_keep_size_and_time_through_the_watcher() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    age(&sag_note(&workspace));
    status(&workspace.run(&["search", "silt"]), 0);
    let watcher = Watcher::start(&workspace);
    rewrite_unseen(&sag_note(&workspace), "silt", "grit");
    status(&workspace.run(&["search", "silt"]), 1);
    assert_eq!(
        ids(&workspace.run(&["search", "grit", "--json"])),
        ["2024-03-02-press-4-sag"]
    );
    let (code, lines) = watcher.terminate();
    assert_eq!(code, Some(0));
    assert_eq!(
        lines,
        [format!("stopped watching {}", workspace.notes().display())]
    );
    assert!(!workspace.index().join("watch/socket").exists());
}

#[test]
fn added_renamed_and_deleted_notes_are_picked_up_while_watched() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let _watcher = Watcher::start(&workspace);
    add_sorter_note(&workspace);
    assert_eq!(
        ids(&workspace.run(&["search", "needle", "--json"])),
        ["2026-01-05-sorter-9-warm"]
    );
    fs::rename(
        workspace.notes().join("2026-01-05-sorter-9-warm.md"),
        workspace.notes().join("2026-01-06-sorter-9-warm.md"),
    )
    .unwrap();
    assert_eq!(
        ids(&workspace.run(&["search", "needle", "--json"])),
        ["2026-01-06-sorter-9-warm"]
    );
    fs::remove_file(workspace.notes().join("2025-06-01-conveyor-7-hot.md")).unwrap();
    status(&workspace.run(&["search", "sawdust"]), 1);
    assert_eq!(ids(&workspace.run(&["search", "", "--json"])).len(), 2);
    // Editors' and our own temporary files are not notes.
    fs::write(
        workspace.notes().join(".2024-03-02-press-4-sag.md.swp"),
        "x",
    )
    .unwrap();
    assert_eq!(ids(&workspace.run(&["search", "", "--json"])).len(), 2);
}

#[test]
fn a_linked_note_is_compared_on_every_search() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    // The real file sits in a subfolder, whose changes the watch on the
    // notes folder does not see; the note is a link to it.
    let archive = workspace.notes().join("archive");
    fs::create_dir(&archive).unwrap();
    fs::rename(sag_note(&workspace), archive.join("sag.txt")).unwrap();
    std::os::unix::fs::symlink("archive/sag.txt", sag_note(&workspace)).unwrap();
    let mut watcher = Watcher::spawn(&workspace);
    assert!(watcher
        .line()
        .ends_with("; 1 linked note is checked on every search"));
    watcher.line();
    status(&workspace.run(&["search", "silt"]), 0);
    let text = fs::read_to_string(archive.join("sag.txt")).unwrap();
    fs::write(archive.join("sag.txt"), text.replace("silt", "gravel")).unwrap();
    assert_eq!(
        ids(&workspace.run(&["search", "gravel", "--json"])),
        ["2024-03-02-press-4-sag"]
    );
}

#[test]
fn a_second_watcher_is_refused_and_the_first_goes_on() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let first = Watcher::start(&workspace);
    let output = workspace.run(&["watch"]);
    status(&output, 2);
    assert_eq!(
        stderr(&output),
        format!(
            "error: {}: another 'spoolsleuth cases watch' already watches these notes; searches use it\n",
            workspace.index().join("watch/lock").display()
        )
    );
    age(&sag_note(&workspace));
    status(&workspace.run(&["search", "silt"]), 0);
    rewrite_unseen(&sag_note(&workspace), "silt", "grit");
    status(&workspace.run(&["search", "grit"]), 0);
    assert_eq!(first.terminate().0, Some(0));
}

#[test]
fn a_killed_watcher_leaves_searches_correct_and_a_new_one_starts() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let mut watcher = Watcher::start(&workspace);
    watcher.child.kill().unwrap();
    watcher.child.wait().unwrap();
    // Its socket is left behind; searches find nobody there and check every
    // note themselves.
    assert!(workspace.index().join("watch/socket").exists());
    fs::remove_file(workspace.notes().join("2025-06-01-conveyor-7-hot.md")).unwrap();
    status(&workspace.run(&["search", "sawdust"]), 1);
    status(&workspace.run(&["search", "silt"]), 0);
    drop(watcher);
    let _again = Watcher::start(&workspace);
    age(&sag_note(&workspace));
    status(&workspace.run(&["search", "silt"]), 0);
    rewrite_unseen(&sag_note(&workspace), "silt", "grit");
    status(&workspace.run(&["search", "grit"]), 0);
}

#[test]
fn a_removed_notes_folder_stops_the_watcher_with_an_error() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let watcher = Watcher::start(&workspace);
    fs::remove_dir_all(workspace.notes()).unwrap();
    let (code, lines) = watcher.finish();
    assert_eq!(code, Some(2));
    assert_eq!(
        lines,
        [format!(
            "error: {}: the notes folder was removed or renamed; stopped watching (searches look at every note again)",
            workspace.notes().display()
        )]
    );
}

#[test]
fn a_notes_folder_removed_while_still_held_open_stops_the_watcher() {
    // A process working in the folder keeps it alive after its removal, so
    // the kernel does not report the removal; the watcher still notices.
    let workspace = Workspace::new();
    two_notes(&workspace);
    let watcher = Watcher::start(&workspace);
    let mut holder = std::process::Command::new("sleep")
        .arg("60")
        .current_dir(workspace.notes())
        .spawn()
        .expect("start sleep");
    fs::remove_dir_all(workspace.notes()).unwrap();
    let (code, lines) = watcher.finish();
    holder.kill().unwrap();
    holder.wait().unwrap();
    assert_eq!(code, Some(2));
    assert_eq!(lines.len(), 1);
    assert!(lines[0].ends_with("the notes folder was removed or renamed; stopped watching (searches look at every note again)"));
}

#[test]
fn the_built_in_notes_cannot_be_watched() {
    let dir = tempfile::tempdir().unwrap();
    let output = crate::harness::spoolsleuth(dir.path())
        .args(["cases", "watch"])
        .output()
        .unwrap();
    assert_eq!(output.status.code(), Some(2));
    assert_eq!(
        String::from_utf8_lossy(&output.stderr),
        "error: the built-in demo notes never change, so there is nothing to watch; give your own folder with --cases DIR\n"
    );
    assert!(output.stdout.is_empty());
}

#[test]
fn a_stranger_on_the_socket_is_not_believed() {
    // Whatever answers on the socket must name this notes folder; an
    // answer about another folder is ignored and every note checked.
    let workspace = Workspace::new();
    two_notes(&workspace);
    age(&sag_note(&workspace));
    status(&workspace.run(&["search", "silt"]), 0);
    let socket_dir = workspace.index().join("watch");
    fs::create_dir_all(&socket_dir).unwrap();
    let listener = std::os::unix::net::UnixListener::bind(socket_dir.join("socket")).unwrap();
    let server = std::thread::spawn(move || {
        for _ in 0..2 {
            let (mut stream, _) = listener.accept().unwrap();
            let mut byte = [0u8; 1];
            while stream.read(&mut byte).unwrap() == 1 && byte[0] != b'\n' {}
            stream
                .write_all(
                    b"{\"answer\":{\"kind\":\"names\",\"changed\":[],\"linked\":[]},\
                      \"cursor\":{\"epoch\":1,\"seq\":1},\"folder\":{\"dev\":1,\"ino\":1},\"version\":1}\n",
                )
                .unwrap();
        }
    });
    fs::remove_file(workspace.notes().join("2025-06-01-conveyor-7-hot.md")).unwrap();
    status(&workspace.run(&["search", "sawdust"]), 1);
    status(&workspace.run(&["search", "silt"]), 0);
    server.join().unwrap();
}

#[test]
fn a_broken_note_is_still_reported_on_each_search_while_watched() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    workspace.write(
        "2026-02-01-broken.md",
        "---\ndate: 2026-02-01\nmachine: [\n---\n",
    );
    let mut watcher = Watcher::spawn(&workspace);
    // The watcher brings the index up to date first, and says so too.
    assert!(watcher.line().ends_with("(note skipped)"));
    assert!(watcher.line().starts_with("watching 3 notes in "));
    watcher.line();
    for _ in 0..2 {
        let output = workspace.run(&["search", "silt"]);
        status(&output, 0);
        let warnings = stderr(&output);
        assert!(
            warnings.starts_with(&format!(
                "warning: {}:",
                workspace.notes().join("2026-02-01-broken.md").display()
            )) && warnings.ends_with("(note skipped)\n")
                && warnings.lines().count() == 1,
            "{warnings}"
        );
    }
}

#[test]
fn a_removed_index_folder_stops_the_watcher_with_an_error() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let watcher = Watcher::start(&workspace);
    fs::remove_dir_all(workspace.index()).unwrap();
    let (code, lines) = watcher.finish();
    assert_eq!(code, Some(2));
    assert_eq!(
        lines,
        [format!(
            "error: {}: the watcher's socket is gone (removed, or its index folder was); stopped watching (searches look at every note again)",
            workspace.index().join("watch/socket").display()
        )]
    );
    // The next search builds a new index from the notes.
    status(&workspace.run(&["search", "silt"]), 0);
}

#[test]
fn a_stopped_watcher_does_not_stop_searches_from_seeing_changes() {
    let workspace = Workspace::new();
    two_notes(&workspace);
    let watcher = Watcher::start(&workspace);
    watcher.signal("STOP");
    fs::remove_file(workspace.notes().join("2025-06-01-conveyor-7-hot.md")).unwrap();
    // Nobody answers: the search gives up waiting and checks every note.
    status(&workspace.run(&["search", "sawdust"]), 1);
    watcher.signal("CONT");
    status(&workspace.run(&["search", "silt"]), 0);
    assert_eq!(watcher.terminate().0, Some(0));
}
