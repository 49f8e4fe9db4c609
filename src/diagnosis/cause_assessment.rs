//! Ranking causes: each cause starts from the prior of its rules and every
//! check that ran moves it by a likelihood ratio.
//!
//! The ratios are the engine's own weighting, not facts of the trade: a
//! check that `confirms` multiplies the odds by 10, `supports` by 3,
//! `weakens` divides them by 3, and `rules-out` excludes the cause. A cause
//! whose checks could not run keeps its prior and is "not yet tested".

use std::collections::BTreeMap;

use serde::Serialize;

use super::{CauseHistory, CauseStatus};
use crate::rules::{Effect, Evaluated, RuleBase, RuleDef, Values};
use crate::units::UnitSystem;

const CONFIRMS: f64 = 10.0;
const SUPPORTS: f64 = 3.0;
const WEAKENS: f64 = 1.0 / 3.0;
/// How much a machine's own history can raise a cause's odds: a cause found
/// in every recent case of the symptom multiplies them by 1 + this.
const HISTORY_WEIGHT: f64 = 2.0;
/// Priors are capped so that one weakening check always shows.
const MAX_PRIOR: f64 = 0.95;
/// Probability at or above which an untested-by-confirmation cause is likely.
const LIKELY: f64 = 0.5;
/// Probability at or above which a cause is still possible.
const POSSIBLE: f64 = 0.2;

/// One rule's contribution to a cause.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct EvidenceLine {
    /// Rule id.
    pub rule: String,
    /// Rule title.
    pub title: String,
    /// `true`, `false`, `missing` or `failed`.
    pub outcome: &'static str,
    /// What the outcome means for the cause (none when it could not run).
    pub effect: Option<Effect>,
    /// The evidence sentence with the numbers, or what is missing.
    pub text: String,
}

/// A cause with its standing and the evidence for it.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct CauseAssessment {
    /// Cause id.
    pub cause: String,
    /// Cause label.
    pub label: String,
    /// Where it stands.
    pub status: CauseStatus,
    /// Probability-like score in [0, 1] after the checks.
    pub score: f64,
    /// The prior before any check.
    pub prior: f64,
    /// Every applicable rule's outcome.
    pub evidence: Vec<EvidenceLine>,
    /// Set when readings disagree: no component is blamed until they agree.
    pub on_hold: bool,
    /// The machine's history for this cause, in words, if it counted.
    pub history: Option<String>,
}

/// Rank the causes reached by the evaluated rules.
pub fn rank(
    base: &RuleBase,
    evaluated: &[(&RuleDef, Evaluated)],
    values: &Values,
    units: UnitSystem,
    readings_disagree: bool,
    history: &[CauseHistory],
) -> Vec<CauseAssessment> {
    let mut by_cause: BTreeMap<&str, Vec<(&RuleDef, &Evaluated)>> = BTreeMap::new();
    for (rule, outcome) in evaluated {
        by_cause
            .entry(rule.entry.cause.as_str())
            .or_default()
            .push((rule, outcome));
    }
    let mut causes: Vec<CauseAssessment> = by_cause
        .into_iter()
        .map(|(cause, rules)| {
            let mut a = assess(
                base,
                cause,
                &rules,
                values,
                units,
                readings_disagree,
                history,
            );
            a.history = history_words(base, cause, history);
            a
        })
        .collect();
    causes.sort_by(|a, b| {
        a.status
            .cmp(&b.status)
            .then(b.score.total_cmp(&a.score))
            .then(a.cause.cmp(&b.cause))
    });
    causes
}

fn assess(
    base: &RuleBase,
    cause: &str,
    rules: &[(&RuleDef, &Evaluated)],
    values: &Values,
    units: UnitSystem,
    readings_disagree: bool,
    history: &[CauseHistory],
) -> CauseAssessment {
    let prior = rules
        .iter()
        .map(|(r, _)| r.entry.prior)
        .fold(0.0_f64, f64::max)
        .min(MAX_PRIOR);
    let mut odds = prior / (1.0 - prior);
    if let Some(share) = history_share(cause, history) {
        odds *= 1.0 + HISTORY_WEIGHT * share;
    }
    let (mut confirmed, mut ruled_out, mut tested) = (false, false, false);
    let mut evidence = Vec::new();
    for (rule, outcome) in rules {
        let (label, effect, text) = match outcome {
            Evaluated::Condition(holds) => {
                tested = true;
                let effect = if *holds {
                    rule.entry.when_true
                } else {
                    rule.entry.when_false
                };
                match effect {
                    Effect::Confirms => {
                        confirmed = true;
                        odds *= CONFIRMS;
                    }
                    Effect::Supports => odds *= SUPPORTS,
                    Effect::Weakens => odds *= WEAKENS,
                    Effect::RulesOut => ruled_out = true,
                }
                let label = if *holds { "true" } else { "false" };
                let sentence = if *holds {
                    Some(&rule.evidence)
                } else {
                    rule.evidence_false.as_ref()
                };
                let text = sentence
                    .and_then(|s| s.try_render(values, units))
                    .unwrap_or_else(|| settled_by(base, rule, values, units));
                (label, Some(effect), text)
            }
            Evaluated::Missing(names) => ("missing", None, format!("needs {}", names.join(", "))),
            Evaluated::Failed(message) => ("failed", None, format!("cannot compute: {message}")),
            Evaluated::Quantity(_) => ("failed", None, "the check gave a quantity".to_string()),
        };
        evidence.push(EvidenceLine {
            rule: rule.entry.id.clone(),
            title: rule.entry.title.clone(),
            outcome: label,
            effect,
            text,
        });
    }
    let p = odds / (1.0 + odds);
    let mut status = if ruled_out {
        CauseStatus::RuledOut
    } else if confirmed {
        CauseStatus::Confirmed
    } else if !tested {
        CauseStatus::NotYetTested
    } else if p >= LIKELY {
        CauseStatus::Likely
    } else if p >= POSSIBLE {
        CauseStatus::Possible
    } else {
        CauseStatus::Unlikely
    };
    // Readings that cannot all be true blame no component: neither a
    // confirmed nor a likely cause stands until the gauges agree.
    let on_hold =
        readings_disagree && matches!(status, CauseStatus::Confirmed | CauseStatus::Likely);
    if on_hold {
        status = CauseStatus::Possible;
    }
    CauseAssessment {
        cause: cause.to_string(),
        label: base
            .causes
            .get(cause)
            .map_or_else(|| cause.to_string(), |c| c.entry.label.clone()),
        status,
        score: if ruled_out { 0.0 } else { p },
        prior,
        evidence,
        on_hold,
        history: None,
    }
}

/// The best share of recent cases of a symptom that had this cause.
fn history_share(cause: &str, history: &[CauseHistory]) -> Option<f64> {
    history
        .iter()
        .filter(|h| h.cause == cause && h.of > 0)
        .map(|h| h.count as f64 / h.of as f64)
        .max_by(f64::total_cmp)
}

/// "3 of the last 5 speed sags under load cases on this machine were a compensator spool sticking".
fn history_words(base: &RuleBase, cause: &str, history: &[CauseHistory]) -> Option<String> {
    let h = history
        .iter()
        .filter(|h| h.cause == cause && h.of > 0)
        .max_by(|a, b| (a.count * b.of).cmp(&(b.count * a.of)))?;
    let symptom = base
        .symptoms
        .iter()
        .find(|s| s.entry.id == h.symptom)
        .map_or(h.symptom.clone(), |s| s.entry.label.to_lowercase());
    let label = base
        .causes
        .get(cause)
        .map_or(cause.to_string(), |c| c.entry.label.to_lowercase());
    Some(format!(
        "{} of the last {} \"{symptom}\" cases on this machine were: {label}",
        h.count, h.of
    ))
}

/// When a check has no sentence for its outcome (one that does not hold,
/// with no `evidence_false`), or was settled by part of its readings and
/// its sentence needs the rest: the values it was decided on, and the check
/// itself.
fn settled_by(base: &RuleBase, rule: &RuleDef, values: &Values, units: UnitSystem) -> String {
    let known: Vec<String> = rule
        .check
        .inputs()
        .into_iter()
        .filter_map(|name| {
            let value = values.get(&name)?;
            let id = name.split('@').next().unwrap_or(&name);
            let kind = base
                .quantities
                .get(id)
                .map(|q| q.kind)
                .or_else(|| base.settings.get(id).map(|s| s.kind))
                .or_else(|| {
                    base.derived
                        .iter()
                        .find(|d| d.entry.id == id)
                        .map(|d| d.kind)
                })?;
            Some(format!(
                "{name} = {}",
                crate::units::format(*value, kind, units)
            ))
        })
        .collect();
    format!(
        "decided on {} (check: {})",
        if known.is_empty() {
            "the readings at hand".to_string()
        } else {
            known.join(", ")
        },
        rule.check.source()
    )
}
