//! The bad-input corpus: one table of malformed input, each row run through
//! the real binary in its own temporary folder. Every row states the exit
//! code and the message, and every run must leave the folder's files (notes,
//! profiles, readings, sessions, reports) exactly as they were; only the
//! index and cache folders may change.

use std::collections::BTreeMap;
use std::fs;
use std::path::Path;
use std::process::Output;

/// What the run must print.
#[derive(Clone, Copy, Debug)]
enum Says {
    /// Standard error is exactly this (newline added).
    Err(&'static str),
    /// Standard error holds this line (clap's usage text follows its line).
    ErrLine(&'static str),
    /// Standard output holds this line (a check's report).
    OutLine(&'static str),
}

/// One malformed input.
struct Case {
    args: &'static [&'static str],
    code: i32,
    files: &'static [(&'static str, &'static [u8])],
    name: &'static str,
    says: Says,
}

/// A good note present in every case's notes folder, so that a run that
/// changed or dropped it would be caught.
const GOOD_NOTE: (&str, &[u8]) = (
    "n/2024-03-02-press-4-sag.md",
    b"---\ndate: 2024-03-02\nmachine: press-4\ntitle: Platen sags\nsymptoms: [speed-sags-under-load]\n\
cause: compensator-sticking\nfix: cleaned the spool\n---\nsilt in the spool\n",
);

/// A note with one line replaced, for the front-matter rows.
macro_rules! note_with {
    ($line:literal) => {{
        const NOTE: &[u8] = concat!(
            "---\ndate: 2024-05-01\nmachine: conveyor-7\ntitle: Chain slows\n",
            $line,
            "\nfix: new pump\n---\nbody\n"
        )
        .as_bytes();
        NOTE
    }};
}

/// A user machine profile with the actuator line (and any after it) given.
macro_rules! profile_with {
    ($line:literal) => {{
        const PROFILE: &[u8] = concat!(
            "version: 1\nid: edger-1\nname: Edger infeed\nunits: us\ncircuit: restrictive\n\
placement: meter-in\n",
            $line,
            "\nnameplate:\n  bore: 3 in\n  spring_setting: 100 psi\n"
        )
        .as_bytes();
        PROFILE
    }};
}

const SEARCH: &[&str] = &[
    "cases",
    "--cases",
    "n",
    "--index-dir",
    "idx",
    "search",
    "silt",
];
const DIAGNOSE_FILE: &[&str] = &[
    "diagnose",
    "--machine",
    "press-4",
    "--complaint",
    "bogs",
    "--readings",
    "r.yaml",
];
const CHECK_MACHINES: &[&str] = &["machine", "check", "--cases", "c"];
const CHECK_RULES: &[&str] = &["rules", "check", "--rules", "mine"];
const FROM_JSON: &[&str] = &["cases", "--cases", "n", "add", "--from-json", "d.json"];
const GUIDE: &[&str] = &["guide", "--answers", "a.txt", "--session", "s.json"];
const RESUME: &[&str] = &[
    "guide",
    "--answers",
    "a.txt",
    "--session",
    "s.json",
    "--resume",
];
const ANSWERS: (&str, &[u8]) = ("a.txt", b"bogs\ny\npress-4\n");

#[rustfmt::skip]
fn cases() -> Vec<Case> {
    let row = |name, args, files, code, says| Case { args, code, files, name, says };
    vec![
        // ------------------------------------------------ readings on the command line
        row("reading without =", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded"], &[], 2,
            Says::Err("error: reading `supply_pressure@loaded`: expected NAME=VALUE, e.g. supply_pressure@loaded=\"180 bar\"")),
        row("reading without a name", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "=185 bar"], &[], 2,
            Says::Err("error: reading `=185 bar`: expected NAME=VALUE, e.g. supply_pressure@loaded=\"180 bar\"")),
        row("reading without a value", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded="], &[], 2,
            Says::Err("error: reading `supply_pressure@loaded=`: expected NAME=VALUE, e.g. supply_pressure@loaded=\"180 bar\"")),
        row("reading not a number", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded=abc"], &[], 2,
            Says::Err("error: reading `supply_pressure@loaded`: `abc` does not start with a number (expected e.g. `1500 psi`)")),
        row("reading without a unit", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded=185"], &[], 2,
            Says::Err("error: reading `supply_pressure@loaded`: `185` has no unit: expected a pressure unit such as psi, bar, kPa, MPa, psia, inHg (vacuum)")),
        row("reading below a vacuum", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded=-185 bar"], &[], 2,
            Says::Err("error: reading `supply_pressure@loaded`: `-185 bar` is below a perfect vacuum (more than one atmosphere under gauge zero)")),
        row("reading overflows", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded=1e400 bar"], &[], 2,
            Says::Err("error: reading `supply_pressure@loaded`: `1e400 bar` is not a finite number")),
        row("reading NaN", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded=NaN bar"], &[], 2,
            Says::Err("error: reading `supply_pressure@loaded`: `NaN bar` is not a finite number")),
        row("reading infinite", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded=inf bar"], &[], 2,
            Says::Err("error: reading `supply_pressure@loaded`: `inf bar` is not a finite number")),
        row("reading unknown unit", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded=185 barr"], &[], 2,
            Says::Err("error: reading `supply_pressure@loaded`: `185 barr`: unknown unit `barr` (did you mean `bar`?)")),
        row("reading unit of the wrong kind", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded=185 L/min"], &[], 2,
            Says::Err("error: reading `supply_pressure@loaded`: `185 L/min`: `L/min` is a flow unit, but a pressure is expected (e.g. psi, bar, kPa, MPa, psia, inHg (vacuum))")),
        row("reading with a decimal comma", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded=1,85 bar"], &[], 2,
            Says::Err("error: reading `supply_pressure@loaded`: `1,85 bar`: write decimals with a point and no thousands separator (e.g. `1500.5`)")),
        row("reading unit typed twice", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded=185 bar bar"], &[], 2,
            Says::Err("error: reading `supply_pressure@loaded`: `185 bar bar`: unknown unit `bar bar` (did you mean `bar abs`?)")),
        row("reading unknown quantity", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "flwo@loaded=14 L/min"], &[], 2,
            Says::Err("error: reading `flwo@loaded`: unknown quantity `flwo` (did you mean `flow`?)")),
        row("reading unknown operating point", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "flow@loadded=14 L/min"], &[], 2,
            Says::Err("error: reading `flow@loadded`: unknown operating point `loadded` (did you mean `loaded`?)")),
        row("reading below absolute zero", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--reading", "oil_temperature=-500 degC"], &[], 2,
            Says::Err("error: reading `oil_temperature`: `-500 degC` is below absolute zero")),

        // ------------------------------------------------ readings files
        row("readings file missing", DIAGNOSE_FILE, &[], 2,
            Says::Err("error: --readings: r.yaml: cannot read: No such file or directory (os error 2)")),
        row("readings file is a folder", DIAGNOSE_FILE, &[("r.yaml/x", b"")], 2,
            Says::Err("error: --readings: r.yaml: cannot read: Is a directory (os error 21)")),
        row("readings file not UTF-8", DIAGNOSE_FILE, &[("r.yaml", b"supply_pressure@loaded: 185 \xb0bar\n")], 2,
            Says::Err("error: --readings: r.yaml: cannot read: the file is not UTF-8 text (at byte 28)")),
        row("readings file misspelt quantity", DIAGNOSE_FILE, &[("r.yaml", b"supply_pressure@loaded: 185 bar\nload_presure@loaded: 140 bar\n")], 2,
            Says::Err("error: r.yaml:2:1: `load_presure@loaded`: unknown quantity `load_presure` (did you mean `load_pressure`?)")),
        row("readings file value without unit", DIAGNOSE_FILE, &[("r.yaml", b"supply_pressure@loaded: 185\n")], 2,
            Says::Err("error: r.yaml:1:1: `supply_pressure@loaded`: `185` has no unit: expected a pressure unit such as psi, bar, kPa, MPa, psia, inHg (vacuum)")),
        row("readings file value is a list", DIAGNOSE_FILE, &[("r.yaml", b"supply_pressure@loaded: [185 bar]\n")], 2,
            Says::Err("error: r.yaml:1:1: `supply_pressure@loaded`: expected a value with its unit, e.g. `180 bar`")),
        row("readings file value is empty", DIAGNOSE_FILE, &[("r.yaml", b"flow@loaded: 3 gpm\nsupply_pressure@loaded:\n")], 2,
            Says::Err("error: r.yaml:2:1: `supply_pressure@loaded`: expected a value with its unit, e.g. `180 bar`")),
        row("readings file value is a yes/no", DIAGNOSE_FILE, &[("r.yaml", b"supply_pressure@loaded: true\n")], 2,
            Says::Err("error: r.yaml:1:1: `supply_pressure@loaded`: expected a value with its unit, e.g. `180 bar`")),
        row("readings file unit of the wrong kind", DIAGNOSE_FILE, &[("r.yaml", b"supply_pressure@loaded: 185 L/min\n")], 2,
            Says::Err("error: r.yaml:1:1: `supply_pressure@loaded`: `185 L/min`: `L/min` is a flow unit, but a pressure is expected (e.g. psi, bar, kPa, MPa, psia, inHg (vacuum))")),
        row("readings file unclosed quote", DIAGNOSE_FILE, &[("r.yaml", b"supply_pressure@loaded: \"185 bar\n")], 2,
            Says::Err("error: r.yaml:2:1: expected a mapping of reading name to value, e.g. `supply_pressure@loaded: 180 bar` (found unexpected end of stream)")),
        row("readings file tab indentation", DIAGNOSE_FILE, &[("r.yaml", b"supply_pressure@loaded: 185 bar\n\tload_pressure@loaded: 140 bar\n")], 2,
            Says::Err("error: r.yaml:2:1: expected a mapping of reading name to value, e.g. `supply_pressure@loaded: 180 bar` (found a tab character that violates indentation)")),
        row("readings file without colons", DIAGNOSE_FILE, &[("r.yaml", b"supply_pressure@loaded 185 bar\n")], 2,
            Says::Err("error: r.yaml:1:1: expected a mapping of reading name to value, e.g. `supply_pressure@loaded: 180 bar` (invalid type: string \"supply_pressure@loaded 185 bar\", expected a YAML mapping)")),
        row("readings file gives a reading twice", DIAGNOSE_FILE, &[("r.yaml", b"supply_pressure@loaded: 185 bar\nsupply_pressure@loaded: 190 bar\n")], 2,
            Says::Err("error: r.yaml:1:1: expected a mapping of reading name to value, e.g. `supply_pressure@loaded: 180 bar` (duplicate entry with key \"supply_pressure@loaded\")")),
        row("readings file of two documents", DIAGNOSE_FILE, &[("r.yaml", b"supply_pressure@loaded: 185 bar\n---\nflow@loaded: 3 gpm\n")], 2,
            Says::Err("error: r.yaml: expected a mapping of reading name to value, e.g. `supply_pressure@loaded: 180 bar` (deserializing from YAML containing more than one document is not supported)")),

        // ------------------------------------------------ rule files beyond the rules corpus
        row("rule file not UTF-8", CHECK_RULES, &[("mine/a.yaml", b"\xff\xfeversion: 1\n")], 2,
            Says::Err("error: mine/a.yaml:1:1: the file is not UTF-8 text (byte 0xFF here); save it as UTF-8")),
        row("rule file with an empty list", CHECK_RULES, &[("mine/a.yaml", b"version: 1\nrules: ~\n")], 2,
            Says::Err("error: mine/a.yaml:2:8: rules: invalid type: unit value, expected a list")),
        row("rule file version as text", CHECK_RULES, &[("mine/a.yaml", b"version: \"1\"\n")], 2,
            Says::Err("error: mine/a.yaml:1:10: version: invalid type: string \"1\", expected a whole number")),
        row("rule file version twice", CHECK_RULES, &[("mine/a.yaml", b"version: 1\nversion: 1\n")], 2,
            Says::Err("error: mine/a.yaml:2:10: duplicate key `version` (the first is on line 1)")),
        row("rule file setting without a source", CHECK_RULES, &[("mine/a.yaml", b"version: 1\nsettings:\n  - id: x_floor\n    kind: pressure\n    value: 8 bar\n")], 2,
            Says::Err("error: mine/a.yaml:3:5: settings[0]: missing field `source`")),
        row("rule folder is a file", &["rules", "check", "--rules", "a.txt"], &[("a.txt", b"x")], 2,
            Says::Err("error: a.txt: cannot read: Not a directory (os error 20)")),
        row("bad rule file stops a diagnosis", &["diagnose", "--rules", "mine", "--machine", "press-4", "--complaint", "bogs"], &[("mine/a.yaml", b"version: 1\nrules: ~\n")], 2,
            Says::Err("error: mine/a.yaml:2:8: rules: invalid type: unit value, expected a list")),

        // ------------------------------------------------ machine profiles in the cases folder
        row("profile unknown field", CHECK_MACHINES, &[("c/machines/edger-1.yaml", profile_with!("actuator: cylinder\nnmae: x"))], 2,
            Says::Err("error: c/machines/edger-1.yaml:8:1: unknown field `nmae` (did you mean `name`?)")),
        row("profile misspelt actuator", CHECK_MACHINES, &[("c/machines/edger-1.yaml", profile_with!("actuator: cylindr"))], 2,
            Says::Err("error: c/machines/edger-1.yaml:7:11: actuator: unknown variant `cylindr` (did you mean `cylinder`?)")),
        row("profile wrong actuator", CHECK_MACHINES, &[("c/machines/edger-1.yaml", profile_with!("actuator: piston"))], 2,
            Says::Err("error: c/machines/edger-1.yaml:7:11: actuator: unknown variant `piston`, expected `cylinder` or `motor`")),
        row("profile bad id", CHECK_MACHINES, &[("c/machines/edger-1.yaml", b"version: 1\nid: Edger_1\nname: Edger\nunits: us\ncircuit: restrictive\nplacement: meter-in\nactuator: cylinder\n")], 2,
            Says::Err("error: c/machines/edger-1.yaml: machine id `Edger_1` must be lowercase letters, digits and dashes")),
        row("profile YAML tab", CHECK_MACHINES, &[("c/machines/edger-1.yaml", profile_with!("actuator: cylinder\n\tplant: x"))], 2,
            Says::Err("error: c/machines/edger-1.yaml:8:1: found a tab character that violates indentation")),
        row("profile version", CHECK_MACHINES, &[("c/machines/edger-1.yaml", b"version: 7\nid: edger-1\nname: Edger\nunits: us\ncircuit: restrictive\nplacement: meter-in\nactuator: cylinder\n")], 2,
            Says::Err("error: c/machines/edger-1.yaml: unsupported profile version 7 (expected 1)")),
        row("profile unknown units", CHECK_MACHINES, &[("c/machines/edger-1.yaml", b"version: 1\nid: edger-1\nname: Edger\nunits: imperial\ncircuit: restrictive\nplacement: meter-in\n")], 2,
            Says::Err("error: c/machines/edger-1.yaml:4:8: units: unknown variant `imperial`, expected `metric` or `us`")),
        row("profile breaks a diagnosis", &["diagnose", "--cases", "c", "--machine", "edger-1", "--complaint", "bogs"], &[("c/machines/edger-1.yaml", profile_with!("actuator: piston"))], 2,
            Says::Err("error: c/machines/edger-1.yaml:7:11: actuator: unknown variant `piston`, expected `cylinder` or `motor`")),
        row("profile nameplate unknown quantity", CHECK_MACHINES, &[("c/machines/edger-1.yaml", b"version: 1\nid: edger-1\nname: Edger\nunits: us\ncircuit: restrictive\nplacement: meter-in\nactuator: cylinder\nnameplate:\n  boar: 3 in\n")], 1,
            Says::OutLine("c/machines/edger-1.yaml: boar: unknown quantity `boar`")),
        row("profile nameplate bad unit", CHECK_MACHINES, &[("c/machines/edger-1.yaml", b"version: 1\nid: edger-1\nname: Edger\nunits: us\ncircuit: restrictive\nplacement: meter-in\nactuator: cylinder\nnameplate:\n  bore: 3 psi\n")], 1,
            Says::OutLine("c/machines/edger-1.yaml: bore: `3 psi`: `psi` is a pressure unit, but a length is expected (e.g. mm, in)")),
        row("profile nameplate of the other actuator", CHECK_MACHINES, &[("c/machines/edger-1.yaml", b"version: 1\nid: edger-1\nname: Edger\nunits: us\ncircuit: restrictive\nplacement: meter-in\nactuator: motor\nnameplate:\n  bore: 3 in\n")], 1,
            Says::OutLine("c/machines/edger-1.yaml: bore: `bore` belongs to a cylinder but this machine drives a motor")),

        // ------------------------------------------------ case notes read by a search (skipped, not fatal)
        row("note with an impossible date", SEARCH, &[("n/bad.md", b"---\ndate: 2024-02-30\nmachine: press-4\ntitle: t\nsymptoms: [hunting]\ncause: air-in-oil\nfix: f\n---\n")], 0,
            Says::Err("warning: n/bad.md:2:7: field 'date': '2024-02-30' is not a valid date: day 30 is out of range 1-29 for 2024-02 (note skipped)")),
        row("note with a date in another form", SEARCH, &[("n/bad.md", b"---\ndate: 02/03/2024\nmachine: press-4\ntitle: t\nsymptoms: [hunting]\ncause: air-in-oil\nfix: f\n---\n")], 0,
            Says::Err("warning: n/bad.md:2:7: field 'date': '02/03/2024' is not a date of the form YYYY-MM-DD (note skipped)")),
        row("note without a date", SEARCH, &[("n/bad.md", b"---\nmachine: press-4\ntitle: t\nsymptoms: [hunting]\ncause: air-in-oil\nfix: f\n---\n")], 0,
            Says::Err("warning: n/bad.md:1: missing field 'date' (note skipped)")),
        row("note with a bad machine id", SEARCH, &[("n/bad.md", b"---\ndate: 2024-03-02\nmachine: Press 4\ntitle: t\nsymptoms: [hunting]\ncause: air-in-oil\nfix: f\n---\n")], 0,
            Says::Err("warning: n/bad.md:3:10: machine id 'Press 4' must be lowercase letters and digits joined by dashes, e.g. 'press-4' (note skipped)")),
        row("note with an unknown cause", SEARCH, &[("n/bad.md", note_with!("symptoms: [hunting]\ncause: pump-wron"))], 0,
            Says::Err("warning: n/bad.md:6:8: unknown cause 'pump-wron' in 'cause' (did you mean 'pump-worn'?) (note skipped)")),
        row("note with no symptoms", SEARCH, &[("n/bad.md", note_with!("symptoms: []\ncause: pump-worn"))], 0,
            Says::Err("warning: n/bad.md:5:11: field 'symptoms' needs at least one entry (note skipped)")),
        row("note with a misspelt field", SEARCH, &[("n/bad.md", note_with!("symptoms: [hunting]\ncuase: pump-worn"))], 0,
            Says::Err("warning: n/bad.md:6:1: unknown field 'cuase' (did you mean 'cause'?) (note skipped)")),
        row("note with a downtime unit", SEARCH, &[("n/bad.md", note_with!("symptoms: [hunting]\ncause: pump-worn\ndowntime: 3 fortnights"))], 0,
            Says::Err("warning: n/bad.md:7:11: field 'downtime': unknown time unit 'fortnights' in '3 fortnights' (use min, h, shift or day) (note skipped)")),
        row("note with a reading without a name", SEARCH, &[("n/bad.md", note_with!("symptoms: [hunting]\ncause: pump-worn\nreadings: 160 bar"))], 0,
            Says::Err("warning: n/bad.md:7:11: reading '160 bar' has no name (write 'name: value', e.g. 'supply: 1450 psi') (note skipped)")),
        row("note with a list for a title", SEARCH, &[("n/bad.md", b"---\ndate: 2024-03-02\nmachine: press-4\ntitle: [a, b]\nsymptoms: [hunting]\ncause: air-in-oil\nfix: f\n---\n")], 0,
            Says::Err("warning: n/bad.md:4:8: field 'title' must be text (note skipped)")),
        row("note without front matter", SEARCH, &[("n/bad.md", b"just some words about the press\n")], 0,
            Says::Err("warning: n/bad.md:1:1: missing front matter: a note starts with a '---' line (note skipped)")),
        row("note with unclosed front matter", SEARCH, &[("n/bad.md", b"---\ndate: 2024-03-02\nmachine: press-4\n")], 0,
            Says::Err("warning: n/bad.md:1:1: front matter is not closed: add a '---' line after the fields (note skipped)")),
        row("note with a tab", SEARCH, &[("n/bad.md", b"---\ndate: 2024-03-02\n\tmachine: press-4\n---\n")], 0,
            Says::Err("warning: n/bad.md:3:1: found a tab character that violates indentation (note skipped)")),
        row("empty note", SEARCH, &[("n/bad.md", b"")], 0,
            Says::Err("warning: n/bad.md:1:1: missing front matter: a note starts with a '---' line (note skipped)")),
        row("note with a NUL byte", SEARCH, &[("n/bad.md", b"---\ndate: 2024-03-02\n\0---\n")], 0,
            Says::Err("warning: n/bad.md: the file holds a NUL byte (at byte 21): it is not a text note (note skipped)")),
        row("note not UTF-8", SEARCH, &[("n/bad.md", b"---\ntitle: caf\xe9\n---\n")], 0,
            Says::Err("warning: n/bad.md: the file is not UTF-8 text (at byte 14); save it as UTF-8 (note skipped)")),

        // ------------------------------------------------ cases add: options and --from-json
        row("add without a fix", &["cases", "--cases", "n", "add", "--date", "2026-12-01", "--machine", "press-4", "--title", "Sag", "--symptom", "hunting", "--cause", "air-in-oil"], &[], 2,
            Says::Err("error: --fix: is required")),
        row("add with a bad machine id", &["cases", "--cases", "n", "add", "--date", "2026-12-01", "--machine", "Press 4", "--title", "Sag", "--symptom", "hunting", "--cause", "air-in-oil", "--fix", "x"], &[], 2,
            Says::Err("error: --machine: machine id 'Press 4' must be lowercase letters and digits joined by dashes, e.g. 'press-4'")),
        row("add with an unknown cause", &["cases", "--cases", "n", "add", "--date", "2026-12-01", "--machine", "press-4", "--title", "Sag", "--symptom", "hunting", "--cause", "pump-wron", "--fix", "x"], &[], 2,
            Says::Err("error: --cause: unknown cause 'pump-wron' in 'cause' (did you mean 'pump-worn'?)")),
        row("add with an impossible date", &["cases", "--cases", "n", "add", "--date", "2024-02-30", "--machine", "press-4", "--title", "Sag", "--symptom", "hunting", "--cause", "air-in-oil", "--fix", "x"], &[], 2,
            Says::Err("error: --date: '2024-02-30' is not a valid date: day 30 is out of range 1-29 for 2024-02")),
        row("add with an empty downtime", &["cases", "--cases", "n", "add", "--date", "2026-12-01", "--machine", "press-4", "--title", "Sag", "--symptom", "hunting", "--cause", "air-in-oil", "--fix", "x", "--downtime", ""], &[], 2,
            Says::Err("error: --downtime: downtime is empty (write e.g. '3.5 h' or '45 min')")),
        row("add with a nameless reading", &["cases", "--cases", "n", "add", "--date", "2026-12-01", "--machine", "press-4", "--title", "Sag", "--symptom", "hunting", "--cause", "air-in-oil", "--fix", "x", "--reading", "160 bar"], &[], 2,
            Says::Err("error: --reading: reading '160 bar' has no name (write 'name: value', e.g. 'supply: 1450 psi')")),
        row("add from a missing JSON file", FROM_JSON, &[], 2,
            Says::Err("error: d.json: No such file or directory (os error 2)")),
        row("add from broken JSON", FROM_JSON, &[("d.json", b"{not json")], 2,
            Says::Err("error: d.json: 1:2: key must be a string")),
        row("add from empty JSON", FROM_JSON, &[("d.json", b"")], 2,
            Says::Err("error: d.json: 1:0: EOF while parsing a value")),
        row("add from a JSON list", FROM_JSON, &[("d.json", b"[1, 2]")], 2,
            Says::Err("error: d.json: a diagnosis must be a JSON object")),
        row("add from JSON without a title", FROM_JSON, &[("d.json", b"{\"machine\": \"press-4\"}")], 2,
            Says::Err("error: d.json: field 'title': is required")),
        row("add from JSON with a misspelt cause", FROM_JSON, &[("d.json", br#"{"machine": "press-4", "complaint": "sags", "symptoms": "hunting", "leading_cause": "pump-wron", "fix": "x"}"#)], 2,
            Says::Err("error: d.json: field 'cause': unknown cause 'pump-wron' in 'cause' (did you mean 'pump-worn'?)")),
        row("add from JSON with an impossible date", FROM_JSON, &[("d.json", br#"{"machine": "press-4", "complaint": "sags", "symptoms": ["hunting"], "leading_cause": "pump-worn", "fix": "x", "date": "2026-02-30"}"#)], 2,
            Says::Err("error: d.json: field 'date': '2026-02-30' is not a valid date: day 30 is out of range 1-28 for 2026-02")),
        row("add from JSON with readings that are a number", FROM_JSON, &[("d.json", br#"{"machine": "press-4", "complaint": "sags", "symptoms": ["hunting"], "leading_cause": "pump-worn", "fix": "x", "date": "2026-02-03", "readings": 5}"#)], 2,
            Says::Err("error: d.json: field 'readings': expected an object of name to value, or a list")),
        row("add from non-UTF-8 JSON", FROM_JSON, &[("d.json", b"\xff\xfe{}")], 2,
            Says::Err("error: d.json: the file is not UTF-8 text (at byte 0)")),
        row("add to the built-in notes", &["cases", "add", "--machine", "press-4"], &[], 2,
            Says::Err("error: the built-in demo notes are read-only; choose a notes folder with --cases DIR or SPOOLSLEUTH_CASES")),

        // ------------------------------------------------ guide answers and sessions
        row("guide answers file missing", GUIDE, &[], 2,
            Says::Err("error: --answers: a.txt: No such file or directory (os error 2)")),
        row("guide answers file is a folder", GUIDE, &[("a.txt/x", b"")], 2,
            Says::ErrLine("error: --answers: a.txt: cannot read: Is a directory (os error 21)")),
        row("guide answers file not UTF-8", GUIDE, &[("a.txt", b"\xff\xfe bogs\n")], 2,
            Says::ErrLine("error: --answers: a.txt: cannot read: stream did not contain valid UTF-8")),
        row("guide unknown machine option", &["guide", "--answers", "a.txt", "--session", "s.json", "--machine", "press-99"], &[ANSWERS], 2,
            Says::Err("error: unknown machine `press-99` (did you mean `press-4`?)")),
        row("guide resume a broken session", RESUME, &[ANSWERS, ("s.json", b"{broken")], 2,
            Says::Err("error: --session: s.json: not a guide session this version can resume: key must be a string at line 1 column 2")),
        row("guide resume an empty object", RESUME, &[ANSWERS, ("s.json", b"{}")], 2,
            Says::Err("error: --session: s.json: not a guide session this version can resume: missing field `version` at line 1 column 2")),
        row("guide resume a missing session", RESUME, &[ANSWERS], 2,
            Says::Err("error: --session: s.json: No such file or directory (os error 2)")),
        row("guide resume a folder", RESUME, &[ANSWERS, ("s.json/x", b"")], 2,
            Says::Err("error: --session: s.json: Is a directory (os error 21)")),
        row("guide report of an unknown kind", &["guide", "--answers", "a.txt", "--session", "s.json", "--report", "out.pdf"], &[ANSWERS], 2,
            Says::Err("error: --report: `out.pdf`: a report is written as .html or .md (the file name's extension chooses)")),

        // ------------------------------------------------ search queries
        row("query with an unclosed quote", &["cases", "--cases", "n", "--index-dir", "idx", "search", "\"silt spool"], &[], 2,
            Says::Err("error: query: a quoted phrase is never closed (add the closing quote) at column 12")),
        row("query with an open bracket", &["cases", "--cases", "n", "--index-dir", "idx", "search", "(silt"], &[], 2,
            Says::Err("error: query: expected ')' at column 6")),
        row("query with a stray bracket", &["cases", "--cases", "n", "--index-dir", "idx", "search", "silt)"], &[], 2,
            Says::Err("error: query: unparsed end of query at column 5")),
        row("query with an empty field", &["cases", "--cases", "n", "--index-dir", "idx", "search", "machine:"], &[], 2,
            Says::Err("error: query: expected word at column 9")),
        row("query with an unknown field", &["cases", "--cases", "n", "--index-dir", "idx", "search", "colour:red"], &[], 2,
            Says::Err("error: query: unknown field 'colour' (search fields: title, body, fix, machine, symptom, cause) at column 1")),
        row("search since an impossible date", &["cases", "--cases", "n", "--index-dir", "idx", "search", "x", "--since", "2024-02-30"], &[], 2,
            Says::ErrLine("error: invalid value '2024-02-30' for '--since <DATE>': '2024-02-30' is not a valid date: day 30 is out of range 1-29 for 2024-02")),
        row("search until a word", &["cases", "--cases", "n", "--index-dir", "idx", "search", "x", "--until", "yesterday"], &[], 2,
            Says::ErrLine("error: invalid value 'yesterday' for '--until <DATE>': 'yesterday' is not a date of the form YYYY-MM-DD")),
        row("search since after until", &["cases", "--cases", "n", "--index-dir", "idx", "search", "x", "--since", "2025-01-01", "--until", "2024-01-01"], &[], 2,
            Says::Err("error: --since: 2025-01-01 is after --until 2024-01-01: no date can be in both")),
        row("search unknown machine", &["cases", "--cases", "n", "--index-dir", "idx", "search", "x", "--machine", "press4"], &[], 2,
            Says::Err("error: --machine: no notes for machine 'press4' (did you mean 'press-4'?)")),
        row("search unknown symptom", &["cases", "--cases", "n", "--index-dir", "idx", "search", "x", "--symptom", "huntin"], &[], 2,
            Says::Err("error: --symptom: unknown symptom 'huntin' (did you mean 'hunting'?)")),
        row("search limit zero", &["cases", "--cases", "n", "--index-dir", "idx", "search", "x", "--limit", "0"], &[], 2,
            Says::ErrLine("error: invalid value '0' for '--limit <N>': 0 is not in 1..=1000")),
        row("search a missing notes folder", &["cases", "--cases", "nowhere", "--index-dir", "idx", "search", "x"], &[], 2,
            Says::Err("error: nowhere: No such file or directory (os error 2)")),
        row("search into a folder of other files", &["cases", "--cases", "n", "--index-dir", "n", "search", "x"], &[], 2,
            Says::Err("error: n: refusing to keep an index in a folder that holds other files ('2024-03-02-press-4-sag.md'); choose an empty folder with --index-dir")),
        row("show an unknown note", &["cases", "--cases", "n", "show", "2024-03-02-press-4-sga"], &[], 2,
            Says::Err("error: no note with id '2024-03-02-press-4-sga' (did you mean '2024-03-02-press-4-sag'?)")),

        // ------------------------------------------------ command-line arguments
        row("unknown option", &["--frobnicate", "demo"], &[], 2,
            Says::ErrLine("error: unexpected argument '--frobnicate' found")),
        row("unknown subcommand", &["diagnoze"], &[], 2,
            Says::ErrLine("error: unrecognized subcommand 'diagnoze'")),
        row("missing value", &["diagnose", "--machine"], &[], 2,
            Says::ErrLine("error: a value is required for '--machine <ID>' but none was supplied")),
        row("bad format", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--format", "yaml"], &[], 2,
            Says::ErrLine("error: invalid value 'yaml' for '--format <FORMAT>'")),
        row("bad units", &["--units", "imperial", "machine", "list"], &[], 2,
            Says::ErrLine("error: invalid value 'imperial' for '--units <UNITS>'")),
        row("bad colour", &["--color", "sometimes", "machine", "list"], &[], 2,
            Says::ErrLine("error: invalid value 'sometimes' for '--color <COLOR>'")),
        row("bad actuator", &["diagnose", "--circuit", "restrictive", "--placement", "meter-in", "--actuator", "piston", "--complaint", "bogs"], &[], 2,
            Says::ErrLine("error: invalid value 'piston' for '--actuator <ACTUATOR>'")),
        row("circuit without placement", &["diagnose", "--circuit", "restrictive", "--complaint", "bogs"], &[], 2,
            Says::ErrLine("  --placement <PLACEMENT>")),
        row("json with format", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--json", "--format", "markdown"], &[], 2,
            Says::ErrLine("error: the argument '--json' cannot be used with '--format <FORMAT>'")),
        row("machine with actuator", &["diagnose", "--machine", "press-4", "--actuator", "motor", "--complaint", "bogs"], &[], 2,
            Says::ErrLine("error: the argument '--machine <ID>' cannot be used with '--actuator <ACTUATOR>'")),
        row("option given twice", &["cases", "--cases", "n", "add", "--title", "a", "--title", "b"], &[], 2,
            Says::ErrLine("error: the argument '--title <TEXT>' cannot be used multiple times")),
        row("unknown machine", &["diagnose", "--machine", "press-5", "--complaint", "bogs"], &[], 2,
            Says::Err("error: unknown machine `press-5` (did you mean `press-4`?)")),
        row("unknown symptom", &["diagnose", "--machine", "press-4", "--symptom", "huntin"], &[], 2,
            Says::Err("error: unknown symptom `huntin` (did you mean `hunting`?)")),
        row("unknown rule", &["rules", "show", "sag-drop-colapses-with-headroom"], &[], 2,
            Says::Err("error: unknown rule `sag-drop-colapses-with-headroom` (did you mean `sag-drop-collapses-with-headroom`?)")),
        row("report of an unknown kind", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--report", "out.pdf"], &[], 2,
            Says::Err("error: --report: `out.pdf`: a report is written as .html or .md (the file name's extension chooses)")),
        row("report into a missing folder", &["diagnose", "--machine", "press-4", "--complaint", "bogs", "--report", "nowhere/out.md"], &[], 2,
            Says::Err("error: --report: `nowhere/out.md`: there is no folder `nowhere` to write it in")),
    ]
}

/// Every file under `root` with its bytes, except the index and cache folders.
fn snapshot(root: &Path) -> BTreeMap<String, Vec<u8>> {
    let mut files = BTreeMap::new();
    let mut stack = vec![root.to_path_buf()];
    while let Some(dir) = stack.pop() {
        for entry in fs::read_dir(&dir).expect("read temp dir") {
            let path = entry.expect("entry").path();
            let relative = path
                .strip_prefix(root)
                .expect("inside root")
                .to_string_lossy()
                .into_owned();
            if relative == "idx" || relative == "cache" {
                continue;
            }
            if path.is_dir() {
                files.insert(format!("{relative}/"), Vec::new());
                stack.push(path);
            } else {
                files.insert(relative, fs::read(&path).expect("read file"));
            }
        }
    }
    files
}

fn run(root: &Path, args: &[&str]) -> Output {
    crate::harness::spoolsleuth(root)
        .args(args)
        .output()
        .expect("run spoolsleuth")
}

/// The mismatches of one case, empty when it behaved.
fn check(case: &Case) -> Vec<String> {
    let dir = tempfile::tempdir().expect("temp dir");
    let root = dir.path();
    for (name, bytes) in [GOOD_NOTE].iter().chain(case.files) {
        let path = root.join(name);
        fs::create_dir_all(path.parent().expect("parent")).expect("folders");
        if !name.ends_with("/x") {
            fs::write(&path, bytes).expect("write input");
        }
    }
    let before = snapshot(root);
    let output = run(root, case.args);
    let after = snapshot(root);
    let (out, err) = (
        String::from_utf8_lossy(&output.stdout),
        String::from_utf8_lossy(&output.stderr),
    );
    let mut problems = Vec::new();
    if output.status.code() != Some(case.code) {
        problems.push(format!(
            "exit code {:?}, expected {}",
            output.status.code(),
            case.code
        ));
    }
    let said = match case.says {
        Says::Err(line) => err == format!("{line}\n"),
        Says::ErrLine(line) => err.lines().any(|l| l == line),
        Says::OutLine(line) => out.lines().any(|l| l == line),
    };
    if !said {
        problems.push(format!("expected {:?}", case.says));
    }
    if case.code == 2 && !out.is_empty() {
        // An error is the only output: no half-printed verdict before it.
        problems.push("stdout is not empty on an error".into());
    }
    if before != after {
        let changed: Vec<&String> = before
            .keys()
            .chain(after.keys())
            .filter(|k| before.get(*k) != after.get(*k))
            .collect();
        problems.push(format!("files changed: {changed:?}"));
    }
    if problems.is_empty() {
        return problems;
    }
    vec![format!(
        "{}: {}\n    args: {:?}\n    stdout: {:?}\n    stderr: {:?}",
        case.name,
        problems.join("; "),
        case.args,
        out.chars().take(400).collect::<String>(),
        err
    )]
}

#[test]
fn every_malformed_input_gets_a_clear_message_and_writes_nothing() {
    let cases = cases();
    let failures: Vec<String> = cases.iter().flat_map(check).collect();
    println!("bad-input corpus: {} cases", cases.len());
    assert!(cases.len() >= 80, "only {} cases", cases.len());
    assert!(
        failures.is_empty(),
        "{} of {} cases failed:\n{}",
        failures.len(),
        cases.len(),
        failures.join("\n")
    );
}
