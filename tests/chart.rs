//! `spoolsleuth chart` writes the valve characteristic and refuses bad input with
//! exit code 2 and a message that names the option and quotes the text.

fn chart(args: &[&str]) -> std::process::Output {
    let dir = tempfile::tempdir().unwrap();
    crate::harness::spoolsleuth(dir.path())
        .arg("chart")
        .args(args)
        .output()
        .unwrap()
}

#[test]
fn writes_the_chart_with_the_machines_setting_to_a_file() {
    let dir = tempfile::tempdir().unwrap();
    let file = dir.path().join("valve.svg");
    let out = chart(&[
        "--machine",
        "press-4",
        "--flow-set",
        "20 L/min",
        "--point",
        "loaded:185 bar,140 bar,14.2 L/min",
        "--output",
        file.to_str().unwrap(),
    ]);
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    assert!(out.stdout.is_empty());
    let svg = std::fs::read_to_string(&file).unwrap();
    assert!(svg.starts_with("<svg"));
    // press-4's nameplate spring_setting is 8 bar; the band is the rule base's 5 %
    assert!(svg.contains("spring setting 8 bar"), "{svg}");
    assert!(svg.contains("healthy band ±5 %"));
    assert!(svg.contains(r#"data-point="loaded""#));
    assert!(svg.contains("29 % below the set flow"));
}

#[test]
fn prints_to_standard_output_in_us_units() {
    let out = chart(&[
        "--flow-set",
        "5 gpm",
        "--setting",
        "120 psi",
        "--band",
        "3 %",
        "--units",
        "us",
    ]);
    assert_eq!(out.status.code(), Some(0));
    let svg = String::from_utf8(out.stdout).unwrap();
    assert!(svg.contains("(psi)") && svg.contains("(gpm)") && svg.contains("±3 %"));
}

#[test]
fn bad_input_is_exit_two_naming_the_option() {
    let cases: &[(&[&str], &str)] = &[
        (
            &[
                "--flow-set",
                "20 L/min",
                "--setting",
                "8 bar",
                "--point",
                "loaded:185 bar,140 bar",
            ],
            "error: --point: `loaded:185 bar,140 bar`: 2 value(s)",
        ),
        (
            &["--flow-set", "20 L/mn", "--setting", "8 bar"],
            "error: --flow-set: `20 L/mn`: unknown unit `L/mn` (did you mean `L/min`?)",
        ),
        (
            &["--setting", "8 bar"],
            "error: --flow-set: give --flow-set",
        ),
        (
            &["--machine", "press-4"],
            "error: --flow-set: machine `press-4` has no nameplate `flow_set`",
        ),
        (
            &[
                "--flow-set",
                "20 L/min",
                "--setting",
                "8 bar",
                "--band",
                "120 %",
            ],
            "error: --band: regulation band must be at least 0 and below 100 %",
        ),
    ];
    for (args, message) in cases {
        let out = chart(args);
        assert_eq!(out.status.code(), Some(2), "{args:?}");
        let err = String::from_utf8(out.stderr).unwrap();
        assert!(err.starts_with(message), "{err}");
        assert!(out.stdout.is_empty());
    }
}
