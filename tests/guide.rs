//! Scripted `spoolsleuth guide` sessions, end to end, one per main symptom
//! family: answers from a file, the conclusion checked, an interrupted walk
//! resumed. The demo machines and rule base are built into the binary.

use std::path::Path;

fn guide(dir: &Path, answers: &[&str], extra: &[&str]) -> (i32, String, String) {
    let answers_file = dir.join("answers.txt");
    std::fs::write(&answers_file, answers.join("\n") + "\n").unwrap();
    let out = crate::harness::spoolsleuth(dir)
        .args(["guide", "--answers"])
        .arg(&answers_file)
        .arg("--session")
        .arg(dir.join("session.json"))
        .args(extra)
        .output()
        .unwrap();
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8(out.stdout).unwrap(),
        String::from_utf8(out.stderr).unwrap(),
    )
}

fn conclusion(stdout: &str) -> &str {
    stdout
        .lines()
        .find(|l| l.starts_with("Conclusion: "))
        .unwrap_or_else(|| panic!("no conclusion in:\n{stdout}"))
}

const SAG: &[&str] = &[
    "platen slows right down and bogs when it closes on the panel",
    "y",
    "press-4",
    "ok",
    "185 bar",
    "ok",
    "skip",
    "ok",
    "140 bar",
    "ok",
    "skip",
    "ok",
    "skip",
    "ok",
    "skip",
    "ok",
    "skip",
    "ok",
    "30 bar",
    "ok",
    "143.5 bar",
    "ok",
    "38 bar",
    "n",
];

#[test]
fn a_sagging_press_is_walked_to_its_sticking_compensator() {
    let dir = tempfile::tempdir().unwrap();
    let (code, out, _) = guide(dir.path(), SAG, &[]);
    assert_eq!(code, 0);
    assert_eq!(
        conclusion(&out),
        "Conclusion: Compensator spool sticking — confirmed."
    );
    // 143.5 bar − 140 bar = 3.5 bar across the orifice (derived).
    assert!(
        out.contains("the metering drop is 8 bar unloaded but 3.5 bar under load"),
        "{out}"
    );
    assert!(out.contains("Changed: Too little supply headroom — not yet tested → ruled out"));
    assert!(out.contains("CAUTION — Lock out every energy source"));
    assert!(out
        .trim_end()
        .ends_with("licensed practice; when they differ, follow them."));
    assert!(
        !dir.path().join("session.json").exists(),
        "a finished walk leaves no session"
    );
}

#[test]
fn a_sorter_that_speeds_up_warm_is_its_uncompensated_needle_valve() {
    let dir = tempfile::tempdir().unwrap();
    let answers = [
        "the sorter chain speeds up as the oil warms up through the shift",
        "y",
        "sorter-9",
        "ok",
        "140 degF",
        "ok",
        "18 degC",
        "ok",
        "400 rpm",
        "ok",
        "472 rpm",
        "n",
    ];
    let (code, out, _) = guide(dir.path(), &answers, &[]);
    assert_eq!(code, 0);
    assert_eq!(
        conclusion(&out),
        "Conclusion: Plain needle valve, not compensated — confirmed."
    );
    assert!(
        out.contains("the motor goes from 400 rpm cold to 472 rpm hot"),
        "{out}"
    );
}

#[test]
fn a_hunting_press_points_at_air_drawn_in_at_the_inlet() {
    let dir = tempfile::tempdir().unwrap();
    let answers = [
        "platen hunts, surging up and down at about 2 Hz",
        "y",
        "press-4",
        "ok",
        "skip",
        "ok",
        "skip",
        "ok",
        "9 inHg",
        "ok",
        "skip",
        "ok",
        "skip",
        "n",
    ];
    let (code, out, _) = guide(dir.path(), &answers, &[]);
    assert_eq!(code, 0);
    assert_eq!(
        conclusion(&out),
        "Conclusion: Free air in the oil — likely."
    );
    assert!(
        out.contains("the pump inlet is at 9 inHg vac; the limit is 5 inHg vac"),
        "{out}"
    );
}

#[test]
fn a_hot_conveyor_finds_its_relief_cracking_under_the_bypass_pressure() {
    let dir = tempfile::tempdir().unwrap();
    let mut answers = vec![
        "the oil runs hot on the outfeed conveyor",
        "y",
        "conveyor-7",
    ];
    answers.extend(["ok", "172 bar", "ok", "179 bar"]);
    answers.extend(["ok", "skip"].repeat(5));
    answers.push("n");
    let (code, out, _) = guide(dir.path(), &answers, &[]);
    assert_eq!(code, 0);
    assert_eq!(
        conclusion(&out),
        "Conclusion: Relief set too low — possible."
    );
    assert!(
        out.contains("above the 153 bar where a relief set at 180 bar starts to crack"),
        "{out}"
    );
}

#[test]
fn a_lift_table_that_blew_its_rod_seal_is_meter_out_intensification() {
    let dir = tempfile::tempdir().unwrap();
    let answers = [
        "blew the rod seal on the lift table while lowering",
        "y",
        "lift-table-5",
        "ok",
        "skip",
        "ok",
        "1450 psi",
        "n",
    ];
    let (code, out, _) = guide(dir.path(), &answers, &[]);
    assert_eq!(code, 0);
    assert_eq!(
        conclusion(&out),
        "Conclusion: Meter-out intensification — confirmed."
    );
    assert!(out.contains("the rod side jumps to 2379 psi"), "{out}");
}

#[test]
fn a_bad_answer_is_explained_and_asked_again() {
    let dir = tempfile::tempdir().unwrap();
    let mut answers = SAG.to_vec();
    // A reading with a misspelt unit, then the same reading right.
    let at = answers.iter().position(|a| *a == "185 bar").unwrap();
    answers.insert(at, "185 bra");
    answers.insert(at, "maybe");
    let (code, out, err) = guide(dir.path(), &answers, &[]);
    assert_eq!(code, 0, "{err}");
    assert!(
        err.contains("not accepted: `maybe` does not start with a number (expected e.g. `1500 psi`) — try again"),
        "{err}"
    );
    assert!(
        err.contains(
            "not accepted: `185 bra`: unknown unit `bra` (did you mean `bar`?) — try again"
        ),
        "{err}"
    );
    assert_eq!(
        conclusion(&out),
        "Conclusion: Compensator spool sticking — confirmed."
    );
}

#[test]
fn an_interrupted_walk_resumes_where_it_stopped() {
    let dir = tempfile::tempdir().unwrap();
    let (code, _, err) = guide(dir.path(), &SAG[..9], &[]);
    assert_eq!(code, 1);
    let session = dir.path().join("session.json");
    assert!(err.contains(&format!(
        "input ended before a conclusion: 9 answers are saved in {}; continue with `spoolsleuth guide --resume --session {}`",
        session.display(),
        session.display()
    )), "{err}");
    let (code, out, err) = guide(dir.path(), &SAG[9..], &["--resume"]);
    assert_eq!(code, 0, "{err}");
    assert!(err.contains("resumed after 9 answers from"), "{err}");
    assert_eq!(
        conclusion(&out),
        "Conclusion: Compensator spool sticking — confirmed."
    );
}

#[test]
fn the_walk_saves_its_case_note_when_asked() {
    let dir = tempfile::tempdir().unwrap();
    let cases = dir.path().join("cases");
    let mut answers = SAG.to_vec();
    answers.pop();
    answers.extend(["y", "jt"]);
    let (code, out, err) = guide(dir.path(), &answers, &["--cases", cases.to_str().unwrap()]);
    assert_eq!(code, 0, "{err}");
    let saved = out
        .lines()
        .find(|l| l.starts_with("Saved case note "))
        .unwrap();
    let notes: Vec<_> = std::fs::read_dir(&cases).unwrap().collect();
    assert_eq!(notes.len(), 1, "{saved}");
    let text = std::fs::read_to_string(notes[0].as_ref().unwrap().path()).unwrap();
    assert!(text.contains("cause: compensator-sticking"), "{text}");
    assert!(text.contains("machine: press-4"), "{text}");
    assert!(text.contains("JT"), "{text}");
}

#[test]
fn the_walk_ends_in_a_work_order_report() {
    let dir = tempfile::tempdir().unwrap();
    let report = dir.path().join("wo.md");
    let (code, _, err) = guide(dir.path(), SAG, &["--report", report.to_str().unwrap()]);
    assert_eq!(code, 0, "{err}");
    let md = std::fs::read_to_string(&report).unwrap();
    assert!(md.contains("Compensator spool sticking"), "{md}");
    assert!(md.contains("## Sign-off"), "{md}");
}
