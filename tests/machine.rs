//! `spoolsleuth machine list|show|check` on the built-in demo plant and on
//! profiles each test writes into its own cases folder.

use std::path::Path;
use std::process::Output;

use serde_json::Value;
use tempfile::TempDir;

/// The binary in `dir` with none of the user's settings.
fn spoolsleuth(dir: &Path, args: &[&str]) -> Output {
    crate::harness::spoolsleuth(dir)
        .arg("machine")
        .args(args)
        .output()
        .expect("run spoolsleuth")
}

fn machine(args: &[&str]) -> Output {
    let dir = TempDir::new().unwrap();
    spoolsleuth(dir.path(), args)
}

fn stdout(output: &Output) -> String {
    String::from_utf8_lossy(&output.stdout).into_owned()
}

#[track_caller]
fn json(args: &[&str]) -> Value {
    let output = machine(args);
    assert_eq!(output.status.code(), Some(0));
    serde_json::from_slice(&output.stdout).unwrap()
}

/// A cases folder with one machine profile of the user's own.
fn cases_with(profile_name: &str, profile: &str) -> TempDir {
    let dir = TempDir::new().unwrap();
    let machines = dir.path().join("cases").join("machines");
    std::fs::create_dir_all(&machines).unwrap();
    std::fs::write(machines.join(profile_name), profile).unwrap();
    dir
}

#[test]
fn list_names_every_demo_machine_with_its_circuit() {
    let list = json(&["list", "--json"]);
    assert_eq!(list["schema_version"], 1);
    let rows = list["machines"].as_array().unwrap();
    let ids: Vec<&str> = rows.iter().map(|m| m["id"].as_str().unwrap()).collect();
    assert_eq!(
        ids,
        [
            "carriage-2",
            "conveyor-7",
            "lift-table-5",
            "press-4",
            "sorter-9",
            "trim-saw-6"
        ]
    );
    let sorter = &rows[4];
    assert_eq!(sorter["circuit"], "needle");
    assert_eq!(sorter["placement"], "bleed-off");
    assert_eq!(sorter["actuator"], "motor");
    assert_eq!(sorter["units"], "metric");
    let text = stdout(&machine(&["list"]));
    assert!(text.contains(
        "│ lift-table-5 ┆ Scissor lift table           ┆ restrictive  ┆ meter-out ┆ cylinder ┆ us     │"
    ), "{text}");
    assert!(text.ends_with("6 machines\n"));
}

#[test]
fn show_prints_the_nameplate_in_the_machines_units_and_what_it_settles() {
    let text = stdout(&machine(&["show", "press-4"]));
    assert!(
        text.starts_with("press-4: Panel hot-press platen close\n"),
        "{text}"
    );
    // π/4 · (100 mm)² = 78.54 cm² (derived).
    assert!(text.contains("│ Cap-side piston area (cap_area)"), "{text}");
    assert!(text.contains("78.54 cm²"), "{text}");
    // 210 bar × 78.54 / 53.91 = 305.9 bar (derived).
    assert!(text.contains("305.9 bar"), "{text}");
    let us = json(&["show", "lift-table-5", "--json"]);
    assert_eq!(us["units"], "us");
    let bore = us["nameplate"]
        .as_array()
        .unwrap()
        .iter()
        .find(|n| n["name"] == "bore")
        .unwrap();
    assert_eq!(bore["shown"], "4 in");
    let metric = json(&["--units", "metric", "show", "lift-table-5", "--json"]);
    let settles = metric["settles"].as_array().unwrap();
    let cap = settles.iter().find(|s| s["id"] == "cap_area").unwrap();
    // π/4 · (101.6 mm)² = 81.07 cm² (derived).
    assert_eq!(cap["shown"], "81.07 cm²");
}

#[test]
fn an_unknown_machine_names_the_nearest() {
    let output = machine(&["show", "press4"]);
    assert_eq!(
        String::from_utf8_lossy(&output.stderr),
        "error: unknown machine `press4` (did you mean `press-4`?)\n"
    );
    assert_eq!(output.status.code(), Some(2));
}

#[test]
fn check_passes_the_demo_plant() {
    let output = machine(&["check"]);
    assert_eq!(stdout(&output), "6 machine profiles checked, 0 problems\n");
    assert_eq!(output.status.code(), Some(0));
}

#[test]
fn check_names_each_problem_with_its_file_and_key() {
    let dir = cases_with(
        "edger-1.yaml",
        "version: 1\nid: edger-1\nname: Edger infeed\ncircuit: restrictive\n\
         placement: meter-in\nactuator: motor\nnameplate:\n  bore: 3 in\n  spring_setting: 100 gpm\n  \
         supply_pressure: 150 bar\n  relief_setings: 2000 psi\ngauges: [supply_pressure, flwo]\n",
    );
    let output = spoolsleuth(dir.path(), &["check", "--cases", "cases"]);
    let file = "cases/machines/edger-1.yaml";
    assert_eq!(
        stdout(&output),
        format!(
            "{file}: relief_setings: unknown quantity `relief_setings` (did you mean `relief_setting`?)\n\
             {file}: spring_setting: `100 gpm`: `gpm` is a flow unit, but a pressure is expected (e.g. psi, bar, kPa, MPa, psia, inHg (vacuum))\n\
             {file}: flwo: unknown quantity `flwo` (did you mean `flow`?)\n\
             {file}: supply_pressure: `supply_pressure` is a gauge reading, not nameplate data: give it as a reading (--reading supply_pressure@loaded=...)\n\
             {file}: bore: `bore` belongs to a cylinder but this machine drives a motor\n\
             7 machine profiles checked, 5 problems\n"
        )
    );
    assert_eq!(output.status.code(), Some(1));
    let report: Value = serde_json::from_slice(
        &spoolsleuth(dir.path(), &["check", "--cases", "cases", "--json"]).stdout,
    )
    .unwrap();
    assert_eq!(report["problems"].as_array().unwrap().len(), 5);
    assert_eq!(report["problems"][4]["key"], "bore");
}

#[test]
fn a_profile_of_the_users_own_replaces_the_demo_one() {
    let dir = cases_with(
        "press-4.yaml",
        "version: 1\nid: press-4\nname: Rebuilt press\nunits: us\ncircuit: bypass\n\
         placement: meter-in\nactuator: cylinder\nnameplate:\n  bore: 125 mm\n",
    );
    let output = spoolsleuth(
        dir.path(),
        &["show", "press-4", "--cases", "cases", "--json"],
    );
    let shown: Value = serde_json::from_slice(&output.stdout).unwrap();
    assert_eq!(shown["name"], "Rebuilt press");
    assert_eq!(shown["circuit"], "bypass");
    assert_eq!(shown["file"], "cases/machines/press-4.yaml");
    let bore = &shown["nameplate"][0];
    assert_eq!(bore["shown"], "4.921 in");
}
