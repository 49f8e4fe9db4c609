//! `spoolsleuth rules`: malformed rule files, lints, overrides and the
//! check, list, show and functions commands, through the real binary.
//!
//! Every run is in a fresh temporary folder holding copies of the fixtures
//! from `tests/data/`, with the `SPOOLSLEUTH_*` variables cleared and
//! `NO_COLOR` set.

use std::collections::BTreeSet;
use std::path::{Path, PathBuf};
use std::process::Output;

use assert_cmd::Command;
use serde_json::{json, Value};
use spoolsleuth::rules::RuleBase;
use tempfile::TempDir;

/// A temporary working folder with a `mine/` rule folder in it.
struct Workspace {
    dir: TempDir,
}

impl Workspace {
    /// An empty `mine/` folder.
    fn new() -> Self {
        let dir = tempfile::tempdir().unwrap();
        std::fs::create_dir(dir.path().join("mine")).unwrap();
        Workspace { dir }
    }

    /// `mine/` holding copies of every file of `tests/data/<folder>`.
    fn with_folder(folder: &str) -> Self {
        let workspace = Workspace::new();
        for entry in std::fs::read_dir(data(folder)).unwrap() {
            let path = entry.unwrap().path();
            workspace.copy(&path);
        }
        workspace
    }

    /// `mine/` holding a copy of one fixture file.
    fn with_file(path: &Path) -> Self {
        let workspace = Workspace::new();
        workspace.copy(path);
        workspace
    }

    fn copy(&self, path: &Path) {
        let name = path.file_name().unwrap();
        std::fs::copy(path, self.dir.path().join("mine").join(name)).unwrap();
    }

    /// Write `bytes` as `mine/<name>`.
    fn write(&self, name: &str, bytes: &[u8]) {
        std::fs::write(self.dir.path().join("mine").join(name), bytes).unwrap();
    }

    /// `spoolsleuth` run in the workspace with a clean environment.
    fn command(&self) -> Command {
        crate::harness::spoolsleuth(self.dir.path())
    }

    /// `spoolsleuth ARGS` with no user rule folder.
    fn run(&self, args: &[&str]) -> Output {
        self.command().args(args).output().unwrap()
    }

    /// `spoolsleuth --rules mine ARGS`.
    fn run_mine(&self, args: &[&str]) -> Output {
        self.command()
            .args(["--rules", "mine"])
            .args(args)
            .output()
            .unwrap()
    }
}

fn data(folder: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("tests/data")
        .join(folder)
}

fn stdout(output: &Output) -> String {
    String::from_utf8(output.stdout.clone()).unwrap()
}

fn stderr(output: &Output) -> String {
    String::from_utf8(output.stderr.clone()).unwrap()
}

#[track_caller]
fn assert_status(output: &Output, code: i32) {
    assert_eq!(
        output.status.code(),
        Some(code),
        "stdout:\n{}\nstderr:\n{}",
        stdout(output),
        stderr(output)
    );
}

/// The JSON of a successful run.
#[track_caller]
fn json_of(output: &Output) -> Value {
    serde_json::from_slice(&output.stdout)
        .unwrap_or_else(|e| panic!("{e}: {}\n{}", stdout(output), stderr(output)))
}

/// Each malformed file in `tests/data/bad-rules/` and the one error line,
/// after `error: mine/<file>:`, that `rules check` must print for it.
const BAD_RULES: &[(&str, &str)] = &[
    ("bad-enum-value.yaml", "8:16: rules[0].when_true: unknown value `confirm` (did you mean `confirms`?)"),
    ("bad-phrase-regex.yaml", "7:14: bad phrase pattern `whin(e|es|ing .*cold`: unclosed group"),
    ("chained-comparison.yaml", "7:58: comparisons cannot be chained: use `and`, as in `a < b and b < c`"),
    ("check-is-a-quantity.yaml", "7:12: a check must be true or false, found a pressure (compare it with something)"),
    ("derived-cycle.yaml", "6:14: derived quantity `drop_a` depends on itself: drop_a → drop_b → drop_a"),
    ("derived-kind-mismatch.yaml", "6:14: the formula gives a pressure, but the quantity is declared as a flow"),
    ("derived-self-reference.yaml", "6:20: derived quantity `creeping_drop` depends on itself: creeping_drop → creeping_drop"),
    ("dimension-mismatch-addition.yaml", "6:14: cannot add a flow to a pressure"),
    ("dimension-mismatch-comparison.yaml", "7:12: cannot compare a pressure with a flow"),
    ("duplicate-key.yaml", "12:12: rules[0]: duplicate key `check` (the first is on line 7)"),
    ("effort-out-of-range.yaml", "8:13: effort must be from 1 (easy) to 5 (hard), found 7"),
    ("empty-file.yaml", "1:1: the file is empty (a rule file starts with `version: 1`)"),
    ("evidence-false-placeholder-error.yaml", "11:62: unknown unit `barr` (did you mean `bar`?)"),
    ("evidence-placeholder-error.yaml", "10:27: unknown quantity `supply_presure` (did you mean `supply_pressure`?)"),
    ("foreign-operator.yaml", "7:44: `&&` is not an operator here: use `and`"),
    ("formula-too-deep.yaml", "6:54: formula is nested too deeply (more than 40 levels of brackets, operators or calls)"),
    ("missing-required-field.yaml", "3:5: rules[0]: missing field `cause`"),
    ("missing-version.yaml", "1:1: missing field `version` (a rule file starts with `version: 1`)"),
    ("not-a-mapping.yaml", "1:1: invalid type: a list, expected a mapping"),
    ("prior-out-of-range.yaml", "11:12: prior must be above 0 and at most 1, found 1.5"),
    ("quantity-range-unit.yaml", "8:12: `10 L/min`: `L/min` is a flow unit, but a pressure is expected (e.g. psi, bar, kPa, MPa, psia, inHg (vacuum))"),
    ("setting-not-a-scalar.yaml", "3:5: settings[0]: expected a value with its unit, e.g. `8 bar`, found a list"),
    ("setting-unknown-unit.yaml", "5:12: `5 barr`: unknown unit `barr` (did you mean `bar`?)"),
    ("setting-wrong-dimension.yaml", "5:12: `5 L/min`: `L/min` is a flow unit, but a pressure is expected (e.g. psi, bar, kPa, MPa, psia, inHg (vacuum))"),
    ("temperature-point-plus-point.yaml", "6:14: cannot add two temperatures: write a temperature difference in K, dC or dF"),
    ("unknown-cause.yaml", "6:12: unknown cause `insufficent-headroom` (did you mean `insufficient-headroom`?)"),
    ("unknown-circuit.yaml", "6:16: rules[0].circuits[0]: unknown value `restricted` (did you mean `restrictive`?)"),
    ("unknown-function.yaml", "6:14: unknown function `sqr` (did you mean `sqrt`?)"),
    ("unknown-hazard.yaml", "7:19: causes[0].fix_hazards[0]: unknown value `opens-circut` (did you mean `opens-circuit`?)"),
    ("unknown-key.yaml", "5:5: settings[0]: unknown field `valeu` (did you mean `value`?)"),
    ("unknown-kind.yaml", "4:11: unknown quantity kind `presure` (did you mean `pressure`?)"),
    ("unknown-operating-point.yaml", "7:28: unknown operating point `loadded` (did you mean `loaded`?)"),
    ("unknown-quantity.yaml", "6:14: unknown quantity `suply_pressure` (did you mean `supply_pressure`?)"),
    ("unknown-symptom.yaml", "5:15: unknown symptom `speed-sag-under-load` (did you mean `speed-sags-under-load`?)"),
    ("unknown-unit.yaml", "6:34: unknown unit `barr` (did you mean `bar`?)"),
    ("unsupported-version.yaml", "1:10: unsupported rule-file version 2 (this spoolsleuth reads version 1)"),
    ("wrong-type.yaml", "11:12: rules[0].prior: invalid type: string \"likely\", expected a number"),
    ("yaml-bad-indentation.yaml", "5:4: did not find expected '-' indicator in the list that starts at 3:3 (check the indentation)"),
    ("yaml-tab-indentation.yaml", "4:1: found a tab character in the indentation (indent with spaces)"),
    ("yaml-unclosed-quote.yaml", "7:9: quoted text is never closed (add the closing quote)"),
];

/// `rules check` on a folder holding only `name` with these bytes: the
/// mismatch, if the run is not exactly one `error:` line with exit code 2.
fn check_bad_file(workspace: &Workspace, name: &str, expected: &str) -> Option<String> {
    let output = workspace.run_mine(&["rules", "check"]);
    let expected = format!("error: mine/{name}:{expected}\n");
    let (code, out, err) = (output.status.code(), stdout(&output), stderr(&output));
    (code != Some(2) || !out.is_empty() || err != expected).then(|| {
        format!("{name}:\n  expected {expected:?} with code 2\n  got      {err:?} with code {code:?}, stdout {out:?}")
    })
}

#[test]
fn every_malformed_rule_file_gets_one_located_error_and_exit_code_2() {
    let listed: BTreeSet<&str> = BAD_RULES.iter().map(|(name, _)| *name).collect();
    let on_disk: BTreeSet<String> = std::fs::read_dir(data("bad-rules"))
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    let on_disk: BTreeSet<&str> = on_disk.iter().map(String::as_str).collect();
    assert_eq!(
        listed, on_disk,
        "the table and tests/data/bad-rules/ differ"
    );
    let mismatches: Vec<String> = BAD_RULES
        .iter()
        .filter_map(|(name, expected)| {
            let workspace = Workspace::with_file(&data("bad-rules").join(name));
            check_bad_file(&workspace, name, expected)
        })
        .collect();
    println!("{} malformed rule files checked", BAD_RULES.len());
    assert!(mismatches.is_empty(), "{}", mismatches.join("\n"));
}

/// A derived quantity whose formula is `supply_pressure` added to itself
/// until the formula passes the 4096-byte limit.
fn long_formula_file() -> Vec<u8> {
    let formula = format!("supply_pressure{}", " + supply_pressure".repeat(240));
    format!(
        "version: 1\nderived:\n  - id: long_sum\n    kind: pressure\n    label: Long sum\n    formula: {formula}\n"
    )
    .into_bytes()
}

/// A valid file padded with comment lines past the 1 MiB limit.
fn oversized_file() -> Vec<u8> {
    let mut text = String::from("version: 1\n");
    let line = "# a comment line that only makes this rule file larger\n";
    while text.len() as u64 <= spoolsleuth::rules::MAX_RULE_FILE_BYTES {
        text.push_str(line);
    }
    text.into_bytes()
}

/// A setting whose id holds a Latin-1 `é` (byte 0xE9), so the file is not UTF-8.
fn latin1_file() -> Vec<u8> {
    let mut bytes = b"version: 1\nsettings:\n  - id: caf".to_vec();
    bytes.push(0xE9);
    bytes
        .extend_from_slice(b"_band\n    kind: fraction\n    value: 5 %\n    source: from memory\n");
    bytes
}

#[test]
fn generated_malformed_rule_files_get_one_located_error_and_exit_code_2() {
    type Case = (&'static str, fn() -> Vec<u8>, &'static str);
    let cases: [Case; 3] = [
        (
            "formula-too-long.yaml",
            long_formula_file,
            "6:14: formula is 4335 bytes long; the limit is 4096",
        ),
        (
            "not-utf8.yaml",
            latin1_file,
            "3:12: the file is not UTF-8 text (byte 0xE9 here); save it as UTF-8",
        ),
        (
            "oversized.yaml",
            oversized_file,
            // A whole-file fault has no line or column to point at.
            " rule file is larger than the limit of 1048576 bytes",
        ),
    ];
    let mismatches: Vec<String> = cases
        .iter()
        .filter_map(|(name, bytes, expected)| {
            let workspace = Workspace::new();
            workspace.write(name, &bytes());
            check_bad_file(&workspace, name, expected)
        })
        .collect();
    println!("{} generated malformed rule files checked", cases.len());
    assert!(mismatches.is_empty(), "{}", mismatches.join("\n"));
}

/// What `rules check` reports on the built-in rule base alone.
struct Baseline {
    examples: u64,
    lints: Vec<String>,
    rules: u64,
}

fn baseline() -> Baseline {
    let report = json_of(&Workspace::new().run(&["rules", "check", "--json"]));
    let lints = report["lints"]
        .as_array()
        .unwrap()
        .iter()
        .map(|l| {
            format!(
                "lint: {}: {}",
                l["at"].as_str().unwrap(),
                l["message"].as_str().unwrap()
            )
        })
        .collect();
    Baseline {
        examples: report["examples"].as_u64().unwrap(),
        lints,
        rules: report["rules"].as_u64().unwrap(),
    }
}

/// A fixture in `tests/data/lint-rules/` that loads but must be reported.
struct LintCase {
    /// The fixture's file name.
    file: &'static str,
    /// Rules and examples it adds to the built-in base.
    added: (u64, u64),
    /// Examples whose outcome is not the expected one.
    failed: u64,
    /// The report lines it adds: `failed:` lines, then `lint:` lines.
    lines: &'static [&'static str],
}

const LINT_CASES: &[LintCase] = &[
    LintCase {
        file: "duplicate-rule-id.yaml",
        added: (1, 2),
        failed: 0,
        lines: &["lint: mine/duplicate-rule-id.yaml:23: duplicate rule `sag-supply-low`: already defined at mine/duplicate-rule-id.yaml:3"],
    },
    LintCase {
        file: "example-expects-wrong-outcome.yaml",
        added: (1, 3),
        failed: 1,
        lines: &["failed: rule `sag-supply-low`, example `45 bar under load`: expected false, got true: supply is 45 bar under load"],
    },
    LintCase {
        file: "fix-hazard-without-caution.yaml",
        added: (0, 0),
        failed: 0,
        lines: &["lint: mine/fix-hazard-without-caution.yaml:3: the fix for `compensator-sticking` is marked `moving-load` but does not give the `gravity-load` caution"],
    },
    LintCase {
        file: "quantity-opens-circuit-without-cautions.yaml",
        added: (0, 0),
        failed: 0,
        lines: &[
            "lint: mine/quantity-opens-circuit-without-cautions.yaml:3: measuring `filter_drop` opens the circuit but does not give the `lockout` caution",
            "lint: mine/quantity-opens-circuit-without-cautions.yaml:3: measuring `filter_drop` opens the circuit but does not give the `trapped-pressure` caution",
        ],
    },
    LintCase {
        file: "rule-with-one-example.yaml",
        added: (1, 1),
        failed: 0,
        lines: &["lint: mine/rule-with-one-example.yaml:3: rule `sag-supply-low` needs at least two examples, one where the check is true and one where it is false"],
    },
    LintCase {
        file: "rule-without-false-example.yaml",
        added: (1, 2),
        failed: 0,
        lines: &["lint: mine/rule-without-false-example.yaml:3: rule `sag-supply-low` needs at least two examples, one where the check is true and one where it is false"],
    },
    LintCase {
        file: "rule-without-source.yaml",
        added: (1, 2),
        failed: 0,
        lines: &["lint: mine/rule-without-source.yaml:3: rule `sag-supply-low` has no `source:` line (a citation, `common practice` or `from memory`)"],
    },
    LintCase {
        file: "unreached-cause.yaml",
        added: (0, 0),
        failed: 0,
        lines: &["lint: mine/unreached-cause.yaml:3: no symptom reaches cause `filter-blocked`: no rule tests it"],
    },
];

/// The report lines after the results table: `failed:`, `override:`,
/// `lint:` and the summary.
fn report_lines(text: &str) -> Vec<String> {
    text.lines()
        .filter(|l| !l.starts_with(['┌', '│', '╞', '├', '└']))
        .map(str::to_string)
        .collect()
}

/// The run's mismatch, if it is not exit code 1 with exactly the baseline
/// findings plus the case's lines and the summary that adds them up.
fn check_lint_case(base: &Baseline, case: &LintCase) -> Option<String> {
    let workspace = Workspace::with_file(&data("lint-rules").join(case.file));
    let output = workspace.run_mine(&["rules", "check"]);
    let mut lines = report_lines(&stdout(&output));
    let summary = lines.pop().unwrap_or_default();
    let added: Vec<String> = lines
        .iter()
        .filter(|l| !base.lints.contains(l))
        .cloned()
        .collect();
    let kept = base.lints.iter().all(|l| lines.contains(l));
    let (rules, examples) = (base.rules + case.added.0, base.examples + case.added.1);
    let lints = base.lints.len() + case.lines.iter().filter(|l| l.starts_with("lint")).count();
    let expected_summary = format!(
        "{rules} rules, {examples} examples: {} passed, {} failed; {lints} lint findings",
        examples - case.failed,
        case.failed
    );
    let ok = output.status.code() == Some(1)
        && stderr(&output).is_empty()
        && kept
        && added == case.lines
        && summary == expected_summary;
    (!ok).then(|| {
        format!(
            "{}:\n  expected {:?}\n  and      {expected_summary:?}\n  got      {added:?}\n  and      {summary:?}, code {:?}, stderr {:?}",
            case.file,
            case.lines,
            output.status.code(),
            stderr(&output)
        )
    })
}

#[test]
fn every_lint_fixture_is_reported_with_exit_code_1() {
    let base = baseline();
    let mismatches: Vec<String> = LINT_CASES
        .iter()
        .filter_map(|case| check_lint_case(&base, case))
        .collect();
    println!("{} lint fixtures checked", LINT_CASES.len());
    assert!(mismatches.is_empty(), "{}", mismatches.join("\n"));
}

/// The 1-based line of `- id: <id>` in a built-in rule file.
fn built_in_line(file: &str, id: &str) -> usize {
    let text = std::fs::read_to_string(Path::new(env!("CARGO_MANIFEST_DIR")).join(file)).unwrap();
    text.lines()
        .position(|l| l.trim() == format!("- id: {id}"))
        .unwrap()
        + 1
}

#[test]
fn a_user_rule_replaces_the_built_in_one_of_the_same_id_and_says_so() {
    let workspace = Workspace::with_folder("override-rules");
    let at = built_in_line("rules/sag.yaml", "sag-headroom-short");
    let base = baseline();
    let by_flag = workspace.run_mine(&["rules", "check"]);
    let by_env = workspace
        .command()
        .env("SPOOLSLEUTH_RULES", "mine")
        .args(["rules", "check"])
        .output()
        .unwrap();
    for output in [&by_flag, &by_env] {
        let lines = report_lines(&stdout(output));
        let mut expected = vec![format!(
            "override: rule `sag-headroom-short` at mine/sag.yaml:7 replaces the built-in rule at rules/sag.yaml:{at}"
        )];
        expected.extend(base.lints.iter().cloned());
        assert_eq!(lines[..lines.len() - 1], expected[..]);
        assert_status(output, if base.lints.is_empty() { 0 } else { 1 });
    }
    let show = workspace.run_mine(&["rules", "show", "sag-headroom-short"]);
    assert_status(&show, 0);
    assert_eq!(
        stdout(&show).lines().last().unwrap(),
        format!("Defined at mine/sag.yaml:7, replacing the built-in rule at rules/sag.yaml:{at}")
    );
    let json = json_of(&workspace.run_mine(&["rules", "show", "sag-headroom-short", "--json"]));
    assert_eq!(json["defined_at"], "mine/sag.yaml:7");
    assert_eq!(json["replaces"], format!("rules/sag.yaml:{at}"));
    assert_eq!(
        json["check"],
        "supply_headroom@loaded < spring_setting + 5 bar"
    );
}

#[test]
fn the_rules_environment_variable_reads_the_folder_like_the_flag() {
    let workspace = Workspace::with_folder("user-rules");
    let by_env = workspace
        .command()
        .env("SPOOLSLEUTH_RULES", "mine")
        .args(["rules", "show", "whine-cold-inlet-vacuum-high", "--json"])
        .output()
        .unwrap();
    let by_flag = workspace.run_mine(&["rules", "show", "whine-cold-inlet-vacuum-high", "--json"]);
    assert_status(&by_env, 0);
    assert_eq!(stdout(&by_env), stdout(&by_flag));
    let missing = workspace
        .command()
        .env("SPOOLSLEUTH_RULES", "nowhere")
        .args(["rules", "check"])
        .output()
        .unwrap();
    assert_status(&missing, 2);
    assert!(
        stderr(&missing).starts_with("error: nowhere: cannot read: "),
        "{}",
        stderr(&missing)
    );
}

#[test]
fn rules_list_for_a_symptom_shows_only_its_rules() {
    let workspace = Workspace::with_folder("user-rules");
    let output = workspace.run_mine(&["rules", "list", "--symptom", "whines-when-cold"]);
    assert_status(&output, 0);
    assert_eq!(
        stdout(&output),
        "\
┌──────────────────────────────┬──────────────────┬──────────────────────────┬───────────────────┐
│ id                           ┆ symptoms         ┆ cause                    ┆ inputs            │
╞══════════════════════════════╪══════════════════╪══════════════════════════╪═══════════════════╡
│ whine-cold-inlet-vacuum-high ┆ whines-when-cold ┆ suction-strainer-clogged ┆ inlet_vacuum@cold │
└──────────────────────────────┴──────────────────┴──────────────────────────┴───────────────────┘
1 rule
"
    );
    assert_eq!(stderr(&output), "");
}

#[test]
fn rules_list_without_a_symptom_shows_every_rule_once() {
    let workspace = Workspace::new();
    let output = workspace.run(&["rules", "list"]);
    assert_status(&output, 0);
    let listed = json_of(&workspace.run(&["rules", "list", "--json"]));
    let ids: Vec<&str> = listed
        .as_array()
        .unwrap()
        .iter()
        .map(|r| r["id"].as_str().unwrap())
        .collect();
    let text = stdout(&output);
    let rows: Vec<&str> = text
        .lines()
        .filter(|l| l.starts_with('│'))
        .skip(1)
        .map(|l| l.trim_start_matches('│').split('┆').next().unwrap().trim())
        .collect();
    assert_eq!(rows, ids);
    assert_eq!(text.lines().last().unwrap(), format!("{} rules", ids.len()));
    let base = baseline();
    assert_eq!(ids.len() as u64, base.rules);
}

#[test]
fn rules_list_with_an_unknown_symptom_suggests_the_nearest() {
    let output = Workspace::new().run(&["rules", "list", "--symptom", "speed-sags-under-lod"]);
    assert_status(&output, 2);
    assert_eq!(stdout(&output), "");
    assert_eq!(
        stderr(&output),
        "error: unknown symptom `speed-sags-under-lod` (did you mean `speed-sags-under-load`?)\n"
    );
}

/// `Caution: TITLE — TEXT` for a built-in caution, as `rules show` prints it.
fn caution_line(base: &RuleBase, id: &str) -> String {
    let caution = &base.cautions[id].entry;
    format!("Caution: {} — {}", caution.title, caution.text)
}

#[test]
fn rules_show_explains_a_rule_in_plain_words() {
    let workspace = Workspace::with_folder("user-rules");
    let output = workspace.run_mine(&["rules", "show", "whine-cold-inlet-vacuum-high"]);
    assert_status(&output, 0);
    let base = RuleBase::load(&[]).unwrap();
    let expected = format!(
        "\
whine-cold-inlet-vacuum-high — The pump draws more vacuum than cold oil allows
Tests the cause: Suction strainer clogged (suction-strainer-clogged)
For symptoms: whines-when-cold
Applies to circuits: all; placements: all
Check: inlet_vacuum@cold < cold_inlet_vacuum_limit
  if true, it supports the cause; if false, it weakens it
Readings it needs: inlet_vacuum@cold
Threshold cold_inlet_vacuum_limit = -0.237 bar (source: from memory)
Evidence: the inlet reads {{inlet_vacuum@cold in inHg}} of vacuum with cold oil (limit {{cold_inlet_vacuum_limit in inHg}})
Prior likelihood: 0.4
Source: from memory
Fix: Lock out, drain the tank below the strainer and clean or replace it.
{}
{}
Caution: Tank drained before the strainer comes out — Lock out the drive and drain the tank below the strainer before you open its housing.
Defined at mine/cold-whine.yaml:33
",
        caution_line(&base, "lockout"),
        caution_line(&base, "trapped-pressure"),
    );
    assert_eq!(stdout(&output), expected);
    assert_eq!(stderr(&output), "");
}

#[test]
fn rules_show_json_gives_every_field() {
    let workspace = Workspace::with_folder("user-rules");
    let output = workspace.run_mine(&["rules", "show", "whine-cold-inlet-vacuum-high", "--json"]);
    assert_status(&output, 0);
    assert_eq!(
        json_of(&output),
        json!({
            "id": "whine-cold-inlet-vacuum-high",
            "title": "The pump draws more vacuum than cold oil allows",
            "symptoms": ["whines-when-cold"],
            "cause": "suction-strainer-clogged",
            "cause_label": "Suction strainer clogged",
            "circuits": [],
            "placements": [],
            "check": "inlet_vacuum@cold < cold_inlet_vacuum_limit",
            "inputs": ["inlet_vacuum@cold"],
            "when_true": "supports",
            "when_false": "weakens",
            "evidence": "the inlet reads {inlet_vacuum@cold in inHg} of vacuum with cold oil (limit {cold_inlet_vacuum_limit in inHg})",
            "evidence_false": null,
            "prior": 0.4,
            "source": "from memory",
            "fix": "Lock out, drain the tank below the strainer and clean or replace it.",
            "cautions": ["lockout", "trapped-pressure", "strainer-drain"],
            "thresholds": [{
                "id": "cold_inlet_vacuum_limit",
                "value": "-0.237 bar",
                "source": "from memory",
                "note": "Cold oil is allowed a little more vacuum than the running limit."
            }],
            "defined_at": "mine/cold-whine.yaml:33",
            "replaces": null
        })
    );
}

#[test]
fn rules_show_with_an_unknown_id_suggests_the_nearest() {
    let output = Workspace::new().run(&["rules", "show", "sag-headroom-shrt"]);
    assert_status(&output, 2);
    assert_eq!(stdout(&output), "");
    assert_eq!(
        stderr(&output),
        "error: unknown rule `sag-headroom-shrt` (did you mean `sag-headroom-short`?)\n"
    );
}

#[test]
fn rules_functions_lists_every_function_rule_authors_can_call() {
    let workspace = Workspace::new();
    let expected: Vec<Value> = spoolsleuth::rules::function_list()
        .into_iter()
        .map(|(name, signature, doc)| json!({"name": name, "signature": signature, "doc": doc}))
        .collect();
    let listed = json_of(&workspace.run(&["rules", "functions", "--json"]));
    assert_eq!(listed, Value::Array(expected.clone()));
    let output = workspace.run(&["rules", "functions"]);
    assert_status(&output, 0);
    let text = stdout(&output);
    let header = text.lines().nth(1).unwrap();
    let columns: Vec<&str> = header.trim_matches('│').split('┆').map(str::trim).collect();
    assert_eq!(columns, ["function", "signature", "what it computes"]);
    // A row starts with the name; wrapped docs continue on lines whose
    // first cell is empty.
    let names: Vec<&str> = text
        .lines()
        .filter(|l| l.starts_with('│'))
        .skip(1)
        .map(|l| l.trim_start_matches('│').split('┆').next().unwrap().trim())
        .filter(|name| !name.is_empty())
        .collect();
    let expected_names: Vec<&str> = expected
        .iter()
        .map(|f| f["name"].as_str().unwrap())
        .collect();
    assert_eq!(names, expected_names);
}

#[test]
fn rules_check_json_has_a_stable_shape_and_the_built_in_base_passes() {
    let report = json_of(&Workspace::new().run(&["rules", "check", "--json"]));
    let keys: Vec<&str> = report
        .as_object()
        .unwrap()
        .keys()
        .map(String::as_str)
        .collect();
    let mut expected = vec![
        "examples",
        "failed",
        "lints",
        "overrides",
        "passed",
        "results",
        "rules",
        "schema_version",
    ];
    expected.sort_unstable();
    let mut keys = keys;
    keys.sort_unstable();
    assert_eq!(keys, expected);
    assert_eq!(report["schema_version"], 1);
    assert_eq!(report["failed"], 0);
    assert_eq!(report["overrides"], json!([]));
    let examples = report["examples"].as_u64().unwrap();
    assert_eq!(report["passed"].as_u64(), Some(examples));
    let results = report["results"].as_array().unwrap();
    assert_eq!(results.len() as u64, examples);
    let result_keys: Vec<&str> = results[0]
        .as_object()
        .unwrap()
        .keys()
        .map(String::as_str)
        .collect();
    let mut result_keys = result_keys;
    result_keys.sort_unstable();
    assert_eq!(
        result_keys,
        ["detail", "example", "expected", "got", "passed", "rule"]
    );
    for lint in report["lints"].as_array().unwrap() {
        let mut lint_keys: Vec<&str> = lint
            .as_object()
            .unwrap()
            .keys()
            .map(String::as_str)
            .collect();
        lint_keys.sort_unstable();
        assert_eq!(lint_keys, ["at", "message"]);
    }
}

#[test]
fn the_built_in_rule_base_has_at_least_40_rules_and_80_examples_and_none_fail() {
    let workspace = Workspace::new();
    let output = workspace.run(&["rules", "check"]);
    let base = baseline();
    // Lint findings in the built-in base are reported, not failed examples:
    // the exit code follows them.
    assert_status(&output, if base.lints.is_empty() { 0 } else { 1 });
    assert!(base.rules >= 40, "{} rules", base.rules);
    assert!(base.examples >= 80, "{} examples", base.examples);
    let lines = report_lines(&stdout(&output));
    let mut expected = base.lints.clone();
    expected.push(format!(
        "{} rules, {} examples: {} passed, 0 failed; {} lint findings",
        base.rules,
        base.examples,
        base.examples,
        base.lints.len()
    ));
    assert_eq!(lines, expected);
    assert_eq!(stderr(&output), "");
}
