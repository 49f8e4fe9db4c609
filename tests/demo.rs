//! `spoolsleuth demo` runs from any folder on the built-in data.

#[test]
fn the_demo_reasons_from_the_readings_to_the_sticking_compensator() {
    let dir = tempfile::tempdir().unwrap();
    let out = crate::harness::spoolsleuth(dir.path())
        .args(["demo"])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(0));
    let text = String::from_utf8(out.stdout).unwrap();
    // 143.5 bar − 140 bar = 3.5 bar across the orifice under load (derived).
    assert!(
        text.contains("the metering drop is 8 bar unloaded but 3.5 bar"),
        "{text}"
    );
    let confirms = text
        .lines()
        .find(|l| l.contains("sag-drop-collapses-with-headroom"))
        .unwrap();
    assert!(
        confirms.contains("Compensator spool sticking")
            && confirms.contains("confirmed")
            && confirms.contains("(holds, confirms)"),
        "{confirms}"
    );
    let headroom = text
        .lines()
        .find(|l| l.contains("sag-headroom-short"))
        .unwrap();
    assert!(headroom.contains("rules out"), "{headroom}");
    // The fix comes with its cautions, and the same call can be run by hand.
    assert!(text.contains("Fix for the leading cause\nCompensator spool sticking"));
    assert!(text.contains("! Stored energy and trapped pressure:"));
    assert!(text
        .contains("To run the same call by hand:\n\nspoolsleuth diagnose --machine press-4 \\\n"));
    assert!(text.contains("  --reading flow@loaded=\"14.2 L/min\"\n"));
    assert!(text.contains("licensed practice"));
}
