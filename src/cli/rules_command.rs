//! `spoolsleuth rules check|list|show|functions`: the glue and the printing.

use serde::Serialize;

use super::context::Context;
use super::rules_arguments::RulesAction;
use crate::error::{Error, ExitStatus};
use crate::output::{self, table};
use crate::rules::{ExampleResult, Expectation, Lint, RuleBase, RuleDef};

/// Run a `rules` subcommand.
pub fn execute(context: &Context, action: RulesAction) -> Result<ExitStatus, Error> {
    match action {
        RulesAction::Check { json } => check(context, json),
        RulesAction::Functions { json } => functions(json),
        RulesAction::List { json, symptom } => list(context, json, symptom.as_deref()),
        RulesAction::Show { id, json } => show(context, &id, json),
    }
}

/// The JSON shape of `rules check --json`.
#[derive(Serialize)]
struct CheckReport<'a> {
    schema_version: u32,
    rules: usize,
    examples: usize,
    passed: usize,
    failed: usize,
    lints: &'a [Lint],
    overrides: Vec<Override>,
    results: &'a [ExampleResult],
}

#[derive(Serialize)]
struct Override {
    id: String,
    at: String,
    replaces: String,
}

fn check(context: &Context, json: bool) -> Result<ExitStatus, Error> {
    let base = context.rule_base()?;
    let lints = base.lint();
    let results = base.run_examples();
    let failed = results.iter().filter(|r| !r.passed).count();
    let report = CheckReport {
        schema_version: 1,
        rules: base.rules.len(),
        examples: results.len(),
        passed: results.len() - failed,
        failed,
        lints: &lints,
        overrides: overrides(&base),
        results: &results,
    };
    if json {
        output::print_json(&report)?;
    } else {
        output::print(&check_text(context, &report))?;
    }
    Ok(if failed == 0 && lints.is_empty() {
        ExitStatus::Success
    } else {
        ExitStatus::Failure
    })
}

fn overrides(base: &RuleBase) -> Vec<Override> {
    base.rules
        .iter()
        .filter_map(|r| {
            Some(Override {
                id: r.entry.id.clone(),
                at: r.origin.at(),
                replaces: r.origin.replaces.clone()?,
            })
        })
        .collect()
}

fn expectation(e: Option<Expectation>) -> &'static str {
    match e {
        Some(Expectation::True) => "true",
        Some(Expectation::False) => "false",
        Some(Expectation::Missing) => "missing",
        None => "error",
    }
}

fn check_text(context: &Context, report: &CheckReport) -> String {
    let color = context.color;
    let mut t = table(["rule", "example", "expected", "got", "result"]);
    for r in report.results {
        let verdict = if r.passed {
            color.green("pass")
        } else {
            color.red("FAIL")
        };
        t.add_row([
            r.rule.clone(),
            r.example.clone(),
            expectation(Some(r.expected)).to_string(),
            expectation(r.got).to_string(),
            verdict,
        ]);
    }
    let mut out = format!("{t}\n");
    for r in report.results.iter().filter(|r| !r.passed) {
        out.push_str(&format!(
            "{}: rule `{}`, example `{}`: expected {}, got {}: {}\n",
            color.red("failed"),
            r.rule,
            r.example,
            expectation(Some(r.expected)),
            expectation(r.got),
            r.detail
        ));
    }
    for o in &report.overrides {
        out.push_str(&format!(
            "override: rule `{}` at {} replaces the built-in rule at {}\n",
            o.id, o.at, o.replaces
        ));
    }
    for l in report.lints {
        out.push_str(&format!(
            "{}: {}: {}\n",
            color.yellow("lint"),
            l.at,
            l.message
        ));
    }
    out.push_str(&format!(
        "{} rules, {} examples: {} passed, {} failed; {} lint findings\n",
        report.rules,
        report.examples,
        report.passed,
        report.failed,
        report.lints.len()
    ));
    out
}

/// The JSON shape of one rule in `rules list --json` and `rules show --json`.
#[derive(Serialize)]
struct RuleView {
    id: String,
    title: String,
    symptoms: Vec<String>,
    cause: String,
    cause_label: String,
    circuits: Vec<&'static str>,
    placements: Vec<&'static str>,
    check: String,
    inputs: Vec<String>,
    when_true: &'static str,
    when_false: &'static str,
    evidence: String,
    evidence_false: Option<String>,
    prior: f64,
    source: String,
    fix: String,
    cautions: Vec<String>,
    thresholds: Vec<Threshold>,
    defined_at: String,
    replaces: Option<String>,
}

/// A setting a rule uses, with its value and provenance.
#[derive(Serialize)]
struct Threshold {
    id: String,
    value: String,
    source: String,
    note: Option<String>,
}

fn view(base: &RuleBase, rule: &RuleDef, context: &Context) -> RuleView {
    let e = &rule.entry;
    let cause = base.causes.get(&e.cause);
    let inputs = rule.check.inputs();
    let thresholds = inputs
        .iter()
        .filter_map(|name| {
            let s = base.settings.get(name.split('@').next().unwrap_or(name))?;
            Some(Threshold {
                id: s.entry.id.clone(),
                value: crate::units::format(s.value, s.kind, context.units),
                source: s.entry.source.clone(),
                note: s.entry.note.clone(),
            })
        })
        .collect();
    RuleView {
        id: e.id.clone(),
        title: e.title.clone(),
        symptoms: e.symptoms.clone(),
        cause: e.cause.clone(),
        cause_label: cause.map(|c| c.entry.label.clone()).unwrap_or_default(),
        circuits: e.circuits.iter().map(|c| c.name()).collect(),
        placements: e.placements.iter().map(|p| p.name()).collect(),
        check: e.check.clone(),
        inputs: inputs
            .into_iter()
            .filter(|n| !base.settings.contains_key(n.split('@').next().unwrap_or(n)))
            .collect(),
        when_true: e.when_true.name(),
        when_false: e.when_false.name(),
        evidence: e.evidence.clone(),
        evidence_false: e.evidence_false.clone(),
        prior: e.prior,
        source: e.source.clone().unwrap_or_default(),
        fix: cause.map(|c| c.entry.fix.clone()).unwrap_or_default(),
        cautions: cause.map(|c| c.entry.cautions.clone()).unwrap_or_default(),
        thresholds,
        defined_at: rule.origin.at(),
        replaces: rule.origin.replaces.clone(),
    }
}

fn list(context: &Context, json: bool, symptom: Option<&str>) -> Result<ExitStatus, Error> {
    let base = context.rule_base()?;
    if let Some(id) = symptom {
        base.symptom_by_id(id)?;
    }
    let views: Vec<RuleView> = base
        .rules
        .iter()
        .filter(|r| symptom.is_none_or(|s| r.entry.symptoms.iter().any(|x| x == s)))
        .map(|r| view(&base, r, context))
        .collect();
    if json {
        output::print_json(&views)?;
        return Ok(ExitStatus::Success);
    }
    let mut t = table(["id", "symptoms", "cause", "inputs"]);
    for v in &views {
        t.add_row([
            v.id.clone(),
            v.symptoms.join(", "),
            v.cause.clone(),
            v.inputs.join(", "),
        ]);
    }
    let noun = if views.len() == 1 { "rule" } else { "rules" };
    output::print(&format!("{t}\n{} {noun}", views.len()))?;
    Ok(ExitStatus::Success)
}

fn show(context: &Context, id: &str, json: bool) -> Result<ExitStatus, Error> {
    let base = context.rule_base()?;
    let rule = base.rule_by_id(id)?;
    let v = view(&base, rule, context);
    if json {
        output::print_json(&v)?;
        return Ok(ExitStatus::Success);
    }
    let color = context.color;
    let mut out = format!("{} — {}\n", color.bold(&v.id), v.title);
    out.push_str(&format!(
        "Tests the cause: {} ({})\n",
        v.cause_label, v.cause
    ));
    out.push_str(&format!("For symptoms: {}\n", v.symptoms.join(", ")));
    let scope = |names: &[&str]| {
        if names.is_empty() {
            "all".to_string()
        } else {
            names.join(", ")
        }
    };
    out.push_str(&format!(
        "Applies to circuits: {}; placements: {}\n",
        scope(&v.circuits),
        scope(&v.placements)
    ));
    out.push_str(&format!("Check: {}\n", v.check));
    out.push_str(&format!(
        "  if true, it {}; if false, it {}\n",
        effect_on(v.when_true, "the cause"),
        effect_on(v.when_false, "it")
    ));
    out.push_str(&format!("Readings it needs: {}\n", v.inputs.join(", ")));
    for t in &v.thresholds {
        out.push_str(&format!(
            "Threshold {} = {} (source: {})\n",
            t.id, t.value, t.source
        ));
    }
    out.push_str(&format!("Evidence: {}\n", v.evidence));
    if let Some(sentence) = &v.evidence_false {
        out.push_str(&format!("Evidence when false: {sentence}\n"));
    }
    out.push_str(&format!("Prior likelihood: {}\n", v.prior));
    out.push_str(&format!("Source: {}\n", v.source));
    out.push_str(&format!("Fix: {}\n", v.fix));
    for c in &v.cautions {
        if let Some(caution) = base.cautions.get(c) {
            out.push_str(&format!(
                "{}: {} — {}\n",
                color.yellow("Caution"),
                caution.entry.title,
                caution.entry.text
            ));
        }
    }
    out.push_str(&format!("Defined at {}", v.defined_at));
    if let Some(r) = &v.replaces {
        out.push_str(&format!(", replacing the built-in rule at {r}"));
    }
    out.push('\n');
    output::print(&out)?;
    Ok(ExitStatus::Success)
}

/// The JSON shape of one function in `rules functions --json`.
#[derive(Serialize)]
struct FunctionView {
    name: String,
    signature: String,
    doc: String,
}

fn functions(json: bool) -> Result<ExitStatus, Error> {
    let views: Vec<FunctionView> = crate::rules::function_list()
        .into_iter()
        .map(|(name, signature, doc)| FunctionView {
            name,
            signature,
            doc,
        })
        .collect();
    if json {
        output::print_json(&views)?;
        return Ok(ExitStatus::Success);
    }
    let mut t = table(["function", "signature", "what it computes"]);
    for f in &views {
        t.add_row([f.name.clone(), f.signature.clone(), f.doc.clone()]);
    }
    output::print(&t.to_string())?;
    Ok(ExitStatus::Success)
}

/// An effect's name as words acting on `object`: "weakens it", "rules it out".
fn effect_on(effect: &str, object: &str) -> String {
    match effect.strip_suffix("-out") {
        Some(verb) => format!("{verb} {object} out"),
        None => format!("{effect} {object}"),
    }
}
