//! A diagnosis: the complaint recognised, every applicable rule evaluated
//! on the readings, the causes ranked with their evidence, and the next
//! measurement chosen. The value is plain data; `report` prints it.

use std::collections::{BTreeMap, BTreeSet};

use serde::Serialize;

use super::cause_assessment::{rank, CauseAssessment};
use super::next_measurement::{choose, NextMeasurement};
use super::reading_view::{read_all, ReadingView};
use super::{CauseHistory, DiagnosisError, DiagnosisInput};
use crate::rules::{Actuator, Circuit, Evaluated, Placement, Readings, RuleBase, RuleDef, Values};
use crate::units::UnitSystem;

/// The symptom that marks readings which cannot all be true.
pub const IMPOSSIBLE_READINGS: &str = "impossible-readings";

/// The JSON schema version of a [`Diagnosis`].
pub const SCHEMA_VERSION: u32 = 1;

/// How a symptom entered the diagnosis.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct SymptomView {
    /// Symptom id.
    pub id: String,
    /// Its label.
    pub label: String,
    /// `given` (named with --symptom) or `recognised` (found in the complaint).
    pub how: &'static str,
}

/// The machine, when one was named.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct MachineView {
    /// Machine id.
    pub id: String,
    /// What it is.
    pub name: String,
}

/// A caution to show.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct CautionView {
    /// Caution id.
    pub id: String,
    /// Short title.
    pub title: String,
    /// What to do.
    pub text: String,
}

/// The fix for the leading cause.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct FixView {
    /// Cause id.
    pub cause: String,
    /// Cause label.
    pub label: String,
    /// What to do.
    pub text: String,
}

/// Readings that cannot all be true, found before any component is blamed.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct ConsistencyProblem {
    /// The rule (or check) that found it.
    pub rule: String,
    /// What is wrong, with the numbers.
    pub message: String,
    /// The readings it is about (`name` or `name@point`), in the order to
    /// re-check them; not part of the JSON shape.
    #[serde(skip)]
    pub readings: Vec<String>,
}

/// A past case like the one at hand.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct PastCase {
    /// Note id (for `cases show`).
    pub id: String,
    /// Date, `YYYY-MM-DD`.
    pub date: String,
    /// Machine id.
    pub machine: String,
    /// Cause found then.
    pub cause: String,
    /// Relevance (higher is closer).
    pub score: f64,
    /// Text around the best match.
    pub snippet: String,
}

/// The whole result. Its JSON form is documented in README.md and is stable
/// within a `schema_version`.
#[derive(Clone, Debug, Serialize)]
pub struct Diagnosis {
    /// JSON schema version.
    pub schema_version: u32,
    /// The machine, if named.
    pub machine: Option<MachineView>,
    /// What drives the load, when known.
    pub actuator: Option<Actuator>,
    /// Circuit type.
    pub circuit: Circuit,
    /// Valve placement.
    pub placement: Placement,
    /// Unit system of the printed values.
    pub units: UnitSystem,
    /// The complaint as given.
    pub complaint: Option<String>,
    /// Symptoms considered.
    pub symptoms: Vec<SymptomView>,
    /// The readings, printed in the chosen units, with sanity warnings.
    pub readings: Vec<ReadingView>,
    /// Readings that cannot all be true (reported before any component).
    pub consistency: Vec<ConsistencyProblem>,
    /// Causes, most likely first.
    pub causes: Vec<CauseAssessment>,
    /// The measurement that would settle the most, if any is missing.
    pub next_measurement: Option<NextMeasurement>,
    /// The fix for the leading cause.
    pub fix: Option<FixView>,
    /// Safety cautions that apply to the fix and the next measurement.
    pub cautions: Vec<CautionView>,
    /// Past cases like this one (filled in by the caller from the notes index).
    pub similar_cases: Vec<PastCase>,
    /// Warnings about the input (assumptions, readings out of range).
    pub warnings: Vec<String>,
    /// The closing line deferring to local codes and licensed practice.
    pub closing: String,
}

impl Diagnosis {
    /// Diagnose `input` with the rule base.
    pub fn run(base: &RuleBase, input: &DiagnosisInput) -> Result<Diagnosis, DiagnosisError> {
        let symptoms = symptoms(base, input)?;
        let ids: BTreeSet<&str> = symptoms.iter().map(|s| s.id.as_str()).collect();
        let (readings, mut consistency, warnings) = gather_readings(base, input)?;
        let values = base.values(&readings);
        let rules: Vec<&RuleDef> = base
            .rules
            .iter()
            .filter(|r| {
                r.applies_to(input.circuit, input.placement) && r.fits_actuator(input.actuator)
            })
            .collect();
        consistency.extend(consistency_problems(&rules, &values, input.units));
        let evaluated: Vec<(&RuleDef, Evaluated)> = rules
            .iter()
            .filter(|r| r.entry.symptoms.iter().any(|s| ids.contains(s.as_str())))
            .filter(|r| !is_consistency_rule(r))
            .map(|r| (*r, r.check.evaluate(&values)))
            .collect();
        // Only the history of the symptoms at hand counts: a cause found
        // for another complaint on this machine says nothing about this one.
        let history: Vec<CauseHistory> = input
            .history
            .iter()
            .filter(|h| ids.contains(h.symptom.as_str()))
            .cloned()
            .collect();
        let causes = rank(
            base,
            &evaluated,
            &values,
            input.units,
            !consistency.is_empty(),
            &history,
        );
        // Readings that cannot all be true are settled at the gauge first.
        let next_measurement = consistency
            .iter()
            .find_map(|p| recheck(base, p, &readings))
            .or_else(|| choose(base, &causes, &evaluated, &values, &input.skip));
        let fix = leading_fix(base, &causes, &consistency);
        let cautions = cautions(base, fix.as_ref(), next_measurement.as_ref());
        Ok(Diagnosis {
            schema_version: SCHEMA_VERSION,
            machine: input.machine.as_ref().map(|m| MachineView {
                id: m.id.clone(),
                name: m.name.clone(),
            }),
            actuator: input.actuator,
            circuit: input.circuit,
            placement: input.placement,
            units: input.units,
            complaint: input.complaint.clone(),
            symptoms,
            readings: read_all(base, &readings, input.units),
            consistency,
            causes,
            next_measurement,
            fix,
            cautions,
            similar_cases: Vec::new(),
            warnings,
            closing: base.closing.clone(),
        })
    }

    /// The leading cause that is not ruled out, if any.
    pub fn leading(&self) -> Option<&CauseAssessment> {
        self.causes
            .first()
            .filter(|c| c.status.is_open() || c.status == super::CauseStatus::Confirmed)
    }
}

fn known_symptoms(base: &RuleBase) -> String {
    base.symptoms
        .iter()
        .map(|s| s.entry.id.as_str())
        .collect::<Vec<_>>()
        .join(", ")
}

/// The symptoms named outright, then those recognised in the complaint.
fn symptoms(base: &RuleBase, input: &DiagnosisInput) -> Result<Vec<SymptomView>, DiagnosisError> {
    let mut out: Vec<SymptomView> = Vec::new();
    for id in &input.symptoms {
        let s = base.symptom_by_id(id).map_err(|e| {
            let message = e.to_string();
            // Without a near id, the known ones are the help.
            DiagnosisError::UnknownSymptom(if message.contains("did you mean") {
                message
            } else {
                format!("{message} (known: {})", known_symptoms(base))
            })
        })?;
        if !out.iter().any(|v| v.id == s.entry.id) {
            out.push(SymptomView {
                id: s.entry.id.clone(),
                label: s.entry.label.clone(),
                how: "given",
            });
        }
    }
    let complaint = input.complaint.as_deref().map(str::trim).unwrap_or("");
    for s in base.recognise(complaint) {
        if !out.iter().any(|v| v.id == s.entry.id) {
            out.push(SymptomView {
                id: s.entry.id.clone(),
                label: s.entry.label.clone(),
                how: "recognised",
            });
        }
    }
    if out.is_empty() {
        return Err(if complaint.is_empty() {
            DiagnosisError::NoComplaint {
                known: known_symptoms(base),
            }
        } else {
            DiagnosisError::NoSymptom {
                complaint: complaint.to_string(),
                known: known_symptoms(base),
            }
        });
    }
    Ok(out)
}

/// Relative difference above which two readings of one quantity disagree.
/// A gauge of accuracy class 1–2.5 % reads within this of another (from memory).
const SAME_READING_TOLERANCE: f64 = 0.03;

/// Parse the readings and the machine's nameplate; two readings of one
/// quantity that disagree become a consistency problem.
fn gather_readings(
    base: &RuleBase,
    input: &DiagnosisInput,
) -> Result<(Readings, Vec<ConsistencyProblem>, Vec<String>), DiagnosisError> {
    let mut readings = Readings::new();
    let mut problems = Vec::new();
    let mut warnings = Vec::new();
    let mut first_text: BTreeMap<String, String> = BTreeMap::new();
    for (name, text) in &input.readings {
        let previous = readings.get(name);
        let mut parsed = Readings::new();
        parsed
            .insert_text(base, name, text)
            .map_err(|e| DiagnosisError::Reading {
                name: e.name,
                message: e.message,
            })?;
        let value = parsed.get(name).expect("a parsed reading is present");
        match previous {
            Some(old) => {
                let scale = old.si().abs().max(value.si().abs());
                if scale > 0.0 && (old.si() - value.si()).abs() / scale > SAME_READING_TOLERANCE {
                    problems.push(ConsistencyProblem {
                        rule: "same-reading-twice".into(),
                        message: format!(
                            "`{name}` was given twice and the two disagree: {} and {} ({:.0} % apart); the first is used",
                            first_text.get(name).map_or("", String::as_str),
                            text.trim(),
                            100.0 * (old.si() - value.si()).abs() / scale
                        ),
                        readings: vec![name.clone()],
                    });
                }
            }
            None => {
                readings
                    .insert_text(base, name, text)
                    .map_err(|e| DiagnosisError::Reading {
                        name: e.name,
                        message: e.message,
                    })?;
                first_text.insert(name.clone(), text.trim().to_string());
            }
        }
        if text.contains("inHg") || text.contains("abs") || text.contains("psia") {
            warnings.push(format!(
                "`{name}` = {}: converted to gauge with the standard atmosphere (101.325 kPa); give a barometer reading if the site is high",
                text.trim()
            ));
        }
    }
    if let Some(machine) = &input.machine {
        let (nameplate, nameplate_problems) = machine.nameplate_values(base);
        for p in nameplate_problems {
            warnings.push(format!(
                "machine `{}` nameplate `{}`: {}",
                machine.id, p.name, p.message
            ));
        }
        for (name, value) in nameplate {
            if !readings.has(&name) {
                readings.insert(&name, value);
            }
        }
    }
    Ok((readings, problems, warnings))
}

/// The cause that readings which cannot all be true point to.
const GAUGE_ERROR: &str = "gauge-error";

/// A rule that tests whether the readings can all be true: filed under
/// impossible readings and blaming a gauge. A rule filed there that blames a
/// component (a rod reading above the relief that the area ratio explains)
/// shows the reading is real, so it is evidence for its cause like any other.
fn is_consistency_rule(rule: &RuleDef) -> bool {
    rule.entry.cause == GAUGE_ERROR && rule.entry.symptoms.iter().any(|s| s == IMPOSSIBLE_READINGS)
}

/// The rules for readings that cannot all be true, evaluated whatever the
/// complaint: a rule that confirms or supports its cause is a problem.
fn consistency_problems(
    rules: &[&RuleDef],
    values: &Values,
    units: UnitSystem,
) -> Vec<ConsistencyProblem> {
    rules
        .iter()
        .filter(|r| is_consistency_rule(r))
        .filter_map(|r| match r.check.evaluate(values) {
            Evaluated::Condition(true) => Some(ConsistencyProblem {
                rule: r.entry.id.clone(),
                message: format!("{}: {}", r.entry.title, r.evidence.render(values, units)),
                readings: r.check.inputs(),
            }),
            _ => None,
        })
        .collect()
}

/// Re-reading a gauge behind readings that disagree: the first of the
/// problem's readings that was taken on a gauge (not nameplate data).
fn recheck(
    base: &RuleBase,
    problem: &ConsistencyProblem,
    readings: &Readings,
) -> Option<NextMeasurement> {
    let reading = problem.readings.iter().find(|name| {
        let id = name.split('@').next().unwrap_or(name);
        readings.has(name)
            && base
                .quantities
                .get(id)
                .is_some_and(|q| q.entry.source == crate::rules::QuantitySource::Gauge)
    })?;
    let (id, point) = match reading.split_once('@') {
        Some((n, p)) => (n, Some(p)),
        None => (reading.as_str(), None),
    };
    let q = base.quantities.get(id)?;
    Some(NextMeasurement {
        reading: reading.clone(),
        label: q.entry.label.clone(),
        point: point
            .and_then(|p| base.points.iter().find(|x| x.id == p))
            .map(|p| p.label.clone()),
        how: format!(
            "Read it again at the same port and operating point with a second gauge of known accuracy \
             (or swap the two gauges) and check the unit it was written in. {}",
            q.entry.measure.clone().unwrap_or_default()
        )
        .trim()
        .to_string(),
        instrument: q.entry.instrument.clone(),
        why: format!(
            "the readings cannot all be true ({}): settle the gauges before any component is blamed",
            problem.rule
        ),
        settles: vec!["gauge-error".to_string()],
        effort: q.entry.effort,
        cautions: q.entry.cautions.clone(),
    })
}

/// The fix for the leading cause, once the checks make it confirmed or
/// likely: a fix on a merely possible cause would send someone to open a
/// line on a hunch, so until then the next measurement is the advice. With
/// readings that disagree, the gauges come first.
fn leading_fix(
    base: &RuleBase,
    causes: &[CauseAssessment],
    consistency: &[ConsistencyProblem],
) -> Option<FixView> {
    let cause_id = if consistency.is_empty() {
        causes
            .first()
            .filter(|c| {
                matches!(
                    c.status,
                    super::CauseStatus::Confirmed | super::CauseStatus::Likely
                )
            })?
            .cause
            .clone()
    } else {
        GAUGE_ERROR.to_string()
    };
    let cause = base.causes.get(&cause_id)?;
    Some(FixView {
        cause: cause_id,
        label: cause.entry.label.clone(),
        text: cause.entry.fix.clone(),
    })
}

/// The cautions of the fix and of the next measurement, each once.
fn cautions(
    base: &RuleBase,
    fix: Option<&FixView>,
    next: Option<&NextMeasurement>,
) -> Vec<CautionView> {
    let mut ids: Vec<String> = Vec::new();
    if let Some(f) = fix {
        if let Some(c) = base.causes.get(&f.cause) {
            ids.extend(c.entry.cautions.iter().cloned());
        }
    }
    if let Some(n) = next {
        ids.extend(n.cautions.iter().cloned());
    }
    let mut seen = BTreeSet::new();
    ids.into_iter()
        .filter(|id| seen.insert(id.clone()))
        .filter_map(|id| {
            let c = base.cautions.get(&id)?;
            Some(CautionView {
                id,
                title: c.entry.title.clone(),
                text: c.entry.text.clone(),
            })
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::diagnosis::{CauseStatus, DEMO_CALL};
    use crate::machine::MachineSet;

    fn press(readings: &[(&str, &str)], complaint: &str) -> Diagnosis {
        let base = RuleBase::load(&[]).unwrap();
        let machine = MachineSet::load(None)
            .unwrap()
            .get("press-4")
            .unwrap()
            .profile
            .clone();
        let mut input = DiagnosisInput::for_machine(machine);
        input.complaint = Some(complaint.to_string());
        input.readings = readings
            .iter()
            .map(|(n, v)| (n.to_string(), v.to_string()))
            .collect();
        Diagnosis::run(&base, &input).unwrap()
    }

    #[test]
    fn a_drop_that_collapses_with_headroom_to_spare_is_the_compensator() {
        let d = press(
            DEMO_CALL.readings,
            "it bogs down when it closes on the panel",
        );
        assert_eq!(d.causes[0].cause, "compensator-sticking");
        assert_eq!(d.causes[0].status, CauseStatus::Confirmed);
        let headroom = d
            .causes
            .iter()
            .find(|c| c.cause == "insufficient-headroom")
            .unwrap();
        assert_eq!(headroom.status, CauseStatus::RuledOut);
        assert!(d.consistency.is_empty(), "{:?}", d.consistency);
        assert_eq!(d.fix.as_ref().unwrap().cause, "compensator-sticking");
        // A cylinder machine is never asked for a motor reading.
        if let Some(next) = &d.next_measurement {
            assert!(
                !next.reading.contains("shaft_speed") && !next.reading.contains("case_drain"),
                "{next:?}"
            );
        }
    }

    #[test]
    fn load_above_supply_on_meter_in_is_a_gauge_problem_first() {
        let readings = [
            ("supply_pressure@unloaded", "150 bar"),
            ("inter_pressure@unloaded", "38 bar"),
            ("load_pressure@unloaded", "30 bar"),
            ("supply_pressure@loaded", "120 bar"),
            ("inter_pressure@loaded", "143.5 bar"),
            ("load_pressure@loaded", "140 bar"),
            ("gauge_full_scale", "250 bar"),
        ];
        let d = press(&readings, "it bogs down when it closes on the panel");
        assert!(!d.consistency.is_empty());
        assert_eq!(d.fix.as_ref().unwrap().cause, "gauge-error");
        // The gauges are settled before anything else is measured.
        let next = d.next_measurement.as_ref().unwrap();
        assert!(next.reading.ends_with("@loaded"), "{next:?}");
        assert_eq!(next.settles, ["gauge-error"]);
        assert!(d.causes.iter().all(|c| c.status != CauseStatus::Confirmed));
    }

    #[test]
    fn two_readings_of_one_gauge_that_disagree_are_reported() {
        let mut readings = DEMO_CALL.readings.to_vec();
        readings.push(("supply_pressure@loaded", "1500 psi"));
        let d = press(&readings, "slows down under load");
        assert!(
            d.consistency.iter().any(|p| p.rule == "same-reading-twice"),
            "{:?}",
            d.consistency
        );
    }

    #[test]
    fn an_empty_complaint_is_an_error() {
        let base = RuleBase::load(&[]).unwrap();
        let machine = MachineSet::load(None)
            .unwrap()
            .get("press-4")
            .unwrap()
            .profile
            .clone();
        let input = DiagnosisInput::for_machine(machine);
        let err = Diagnosis::run(&base, &input).unwrap_err().to_string();
        assert!(err.starts_with("nothing to diagnose"), "{err}");
    }
}
