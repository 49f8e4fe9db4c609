//! `spoolsleuth demo` runs from any folder on the built-in data.

use assert_cmd::Command;

#[test]
fn the_demo_reasons_from_the_readings_to_the_sticking_compensator() {
    let dir = tempfile::tempdir().unwrap();
    let out = Command::new(env!("CARGO_BIN_EXE_spoolsleuth"))
        .current_dir(dir.path())
        .env("NO_COLOR", "1")
        .args(["demo"])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(0));
    let text = String::from_utf8(out.stdout).unwrap();
    // 143.5 bar − 140 bar = 3.5 bar across the orifice under load (derived).
    assert!(text.contains("3.5 bar under load"), "{text}");
    let confirms = text
        .lines()
        .find(|l| l.contains("sag-drop-collapses-with-headroom"))
        .unwrap();
    assert!(
        confirms.contains("compensator-sticking") && confirms.contains("confirms"),
        "{confirms}"
    );
    let headroom = text
        .lines()
        .find(|l| l.contains("sag-headroom-short"))
        .unwrap();
    assert!(headroom.contains("rules out"), "{headroom}");
    assert!(text.contains("licensed practice"));
}
