//! Choosing the next measurement: among the readings the open causes'
//! checks still need, the one that would settle the most, weighted by how
//! likely each cause is and by how hard the reading is to take.

use std::collections::BTreeMap;

use serde::Serialize;

use super::CauseAssessment;
use crate::rules::{Evaluated, RuleBase, RuleDef, Values};

/// The reading to take next, and why.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct NextMeasurement {
    /// `name` or `name@point`.
    pub reading: String,
    /// The quantity's label.
    pub label: String,
    /// The operating point to take it at, in words, if any.
    pub point: Option<String>,
    /// Where and how to measure it.
    pub how: String,
    /// The instrument.
    pub instrument: Option<String>,
    /// Why it discriminates, in one line.
    pub why: String,
    /// The open causes it would settle checks for.
    pub settles: Vec<String>,
    /// How hard it is to take, 1 (easy) to 5 (hard).
    pub effort: u8,
    /// Caution ids that go with taking it.
    pub cautions: Vec<String>,
}

/// The best next reading, if any check of an open cause is missing readings.
pub fn choose(
    base: &RuleBase,
    causes: &[CauseAssessment],
    evaluated: &[(&RuleDef, Evaluated)],
    values: &Values,
    skip: &[String],
) -> Option<NextMeasurement> {
    let weight: BTreeMap<&str, f64> = causes
        .iter()
        .filter(|c| c.status.is_open())
        .map(|c| (c.cause.as_str(), c.score.max(0.01)))
        .collect();
    // reading → (score, causes it helps)
    let mut candidates: BTreeMap<String, (f64, Vec<String>)> = BTreeMap::new();
    for (rule, outcome) in evaluated {
        let Evaluated::Missing(names) = outcome else {
            continue;
        };
        let Some(&w) = weight.get(rule.entry.cause.as_str()) else {
            continue;
        };
        let needed = readings_needed(base, names, values);
        // A check waiting on a reading that cannot be taken cannot be settled.
        if needed.iter().any(|r| skip.contains(r)) {
            continue;
        }
        if needed.is_empty() {
            continue;
        }
        let share = w / needed.len() as f64;
        for reading in needed {
            let entry = candidates.entry(reading).or_insert((0.0, Vec::new()));
            entry.0 += share;
            if !entry.1.contains(&rule.entry.cause) {
                entry.1.push(rule.entry.cause.clone());
            }
        }
    }
    let (reading, (score, settles)) = candidates
        .into_iter()
        .map(|(r, (s, c))| {
            let effort = f64::from(effort(base, &r));
            (r, (s / effort, c))
        })
        .max_by(|a, b| a.1 .0.total_cmp(&b.1 .0).then(b.0.cmp(&a.0)))?;
    let _ = score;
    let (name, point) = match reading.split_once('@') {
        Some((n, p)) => (n.to_string(), Some(p.to_string())),
        None => (reading.clone(), None),
    };
    let q = base.quantities.get(&name)?;
    let point_label = point
        .as_ref()
        .and_then(|p| base.points.iter().find(|x| &x.id == p))
        .map(|p| p.label.clone());
    let labels: Vec<String> = settles
        .iter()
        .map(|c| {
            base.causes
                .get(c)
                .map_or(c.clone(), |d| d.entry.label.to_lowercase())
        })
        .collect();
    let why = format!(
        "it is the reading most of the open checks are waiting for: it bears on {} ({} of 5 to take)",
        labels.join(", "),
        q.entry.effort
    );
    Some(NextMeasurement {
        reading,
        label: q.entry.label.clone(),
        point: point_label,
        how: q
            .entry
            .measure
            .clone()
            .unwrap_or_else(|| q.entry.description.clone()),
        instrument: q.entry.instrument.clone(),
        why,
        settles,
        effort: q.entry.effort,
        cautions: q.entry.cautions.clone(),
    })
}

fn effort(base: &RuleBase, reading: &str) -> u8 {
    let name = reading.split('@').next().unwrap_or(reading);
    base.quantities
        .get(name)
        .map_or(3, |q| q.entry.effort.max(1))
}

/// The readings (with their points) a check is still waiting for: derived
/// quantities are followed down to the readings they are computed from,
/// settings and values already known are dropped.
fn readings_needed(base: &RuleBase, names: &[String], values: &Values) -> Vec<String> {
    let mut out: Vec<String> = Vec::new();
    let mut stack: Vec<String> = names.to_vec();
    let mut guard = 0;
    while let Some(name) = stack.pop() {
        guard += 1;
        if guard > 1000 || values.contains_key(&name) {
            continue;
        }
        let (base_name, point) = match name.split_once('@') {
            Some((n, p)) => (n.to_string(), Some(p.to_string())),
            None => (name.clone(), None),
        };
        if base.settings.contains_key(&base_name) {
            continue;
        }
        if let Some(d) = base.derived.iter().find(|d| d.entry.id == base_name) {
            for input in d.formula.inputs() {
                let tagged = match (&point, input.contains('@')) {
                    (Some(p), false)
                        if !base.is_nameplate(&input) && !base.settings.contains_key(&input) =>
                    {
                        format!("{input}@{p}")
                    }
                    _ => input,
                };
                stack.push(tagged);
            }
        } else if base.quantities.contains_key(&base_name) {
            let tagged = if base.is_nameplate(&base_name) {
                base_name
            } else {
                name
            };
            if !values.contains_key(&tagged) && !out.contains(&tagged) {
                out.push(tagged);
            }
        }
    }
    out.sort();
    out
}
