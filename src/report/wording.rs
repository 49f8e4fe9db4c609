//! The words both report formats share, so that the terminal and the
//! Markdown report say the same thing the same way.

use crate::diagnosis::{CauseAssessment, CautionView, Diagnosis, EvidenceLine, NextMeasurement};

/// The banner shown when readings cannot all be true.
pub const GAUGES_FIRST: &str =
    "Readings that cannot all be true: check the gauges before blaming any component";

/// What to say under the banner.
pub const GAUGES_FIRST_WHY: &str = "A gauge or meter is wrong, or was read at the wrong port. \
No component is confirmed until the readings agree; re-read them on a gauge you trust.";

/// `press-4 (Panel hot-press platen close)`, or `ad-hoc circuit`.
pub fn machine(d: &Diagnosis) -> String {
    match &d.machine {
        Some(m) => format!("{} ({})", m.id, m.name),
        None => "ad-hoc circuit (no machine profile)".to_string(),
    }
}

/// `restrictive, meter-in, cylinder`.
pub fn circuit(d: &Diagnosis) -> String {
    let mut parts = vec![d.circuit.name(), d.placement.name()];
    parts.push(d.actuator.map_or("actuator not given", |a| a.name()));
    parts.join(", ")
}

/// `Speed sags under load (speed-sags-under-load, recognised)`, one per symptom.
pub fn symptoms(d: &Diagnosis) -> Vec<String> {
    d.symptoms
        .iter()
        .map(|s| format!("{} ({}, {})", s.label, s.id, s.how))
        .collect()
}

/// A score as a whole percentage.
pub fn percent(score: f64) -> String {
    format!("{:.0} %", score * 100.0)
}

/// The status in words, with the hold when readings disagree.
pub fn status(cause: &CauseAssessment) -> String {
    if cause.on_hold {
        format!("{} (on hold: readings disagree)", cause.status.words())
    } else {
        cause.status.words().to_string()
    }
}

/// A cause's evidence lines, the checks that ran first (in rule order),
/// then those still waiting for readings: what the numbers say comes before
/// what is missing.
pub fn ordered(cause: &CauseAssessment) -> Vec<&EvidenceLine> {
    let (ran, waiting): (Vec<&EvidenceLine>, Vec<&EvidenceLine>) =
        cause.evidence.iter().partition(|e| e.effect.is_some());
    ran.into_iter().chain(waiting).collect()
}

/// `rule (holds, confirms): text`.
pub fn evidence(line: &EvidenceLine) -> String {
    let outcome = match line.outcome {
        "true" => "holds",
        "false" => "does not hold",
        "missing" => "not yet tested",
        _ => "could not run",
    };
    match line.effect {
        Some(effect) => format!(
            "{} ({outcome}, {}): {}",
            line.rule,
            effect.name().replace('-', " "),
            line.text
        ),
        None => format!("{} ({outcome}): {}", line.rule, line.text),
    }
}

/// `history: 2 of the last 4 ... cases on this machine were: ...`.
pub fn history(cause: &CauseAssessment) -> Option<String> {
    cause.history.as_ref().map(|h| format!("history: {h}"))
}

/// `Intermediate pressure (inter_pressure@loaded)`.
pub fn measurement(next: &NextMeasurement) -> String {
    format!("{} ({})", next.label, next.reading)
}

/// The cautions of the next measurement, looked up among the diagnosis's
/// cautions (which always include them).
pub fn measurement_cautions<'a>(d: &'a Diagnosis, next: &NextMeasurement) -> Vec<&'a CautionView> {
    next.cautions
        .iter()
        .filter_map(|id| d.cautions.iter().find(|c| &c.id == id))
        .collect()
}

/// `Title: text`.
pub fn caution(c: &CautionView) -> String {
    format!("{}: {}", c.title, c.text)
}

/// What to say when no next measurement is chosen.
pub fn no_measurement(d: &Diagnosis) -> &'static str {
    if d.causes.iter().any(|c| c.status.is_open()) {
        "none: every open check already has its readings"
    } else {
        "none: no cause is left open"
    }
}

/// What to say when there is no fix.
pub const NO_FIX: &str =
    "none yet: no cause is confirmed or likely; take the next measurement before opening anything";
