//! Safety output over the whole rule base, driven by the rule base itself so
//! that a new rule, cause or measurement is covered without editing this
//! file: every cause whose fix opens the circuit, changes a setting or puts
//! someone near a moving load shows its cautions when a diagnosis gives that
//! fix, and every measurement that opens the circuit carries its cautions
//! when it is the one asked for next.

use std::collections::BTreeSet;

use spoolsleuth::diagnosis::{Diagnosis, DiagnosisInput};
use spoolsleuth::rules::{
    Circuit, Effect, ExampleEntry, Expectation, Hazard, Placement, RuleBase, RuleDef,
};
use spoolsleuth::units::UnitSystem;

/// The cautions each hazard of a fix needs, as the safety section of the
/// rules guide states them.
fn needed(hazard: Hazard) -> &'static [&'static str] {
    match hazard {
        Hazard::ChangesSetting => &["gauge-rating"],
        Hazard::MovingLoad => &["gravity-load"],
        Hazard::OpensCircuit => &["lockout", "trapped-pressure"],
    }
}

/// The diagnosis input of one rule example: its circuit and placement (or
/// the rule's first), the rule's symptoms, and the example's readings.
fn input(rule: &RuleDef, example: &ExampleEntry) -> DiagnosisInput {
    DiagnosisInput {
        actuator: rule.actuator,
        circuit: example
            .circuit
            .or_else(|| rule.entry.circuits.first().copied())
            .unwrap_or(Circuit::Restrictive),
        complaint: None,
        history: Vec::new(),
        machine: None,
        placement: example
            .placement
            .or_else(|| rule.entry.placements.first().copied())
            .unwrap_or(Placement::MeterIn),
        readings: example
            .readings
            .iter()
            .map(|(name, value)| (name.clone(), value.0.clone()))
            .collect(),
        skip: Vec::new(),
        symptoms: rule.entry.symptoms.clone(),
        units: UnitSystem::Metric,
    }
}

fn caution_ids(diagnosis: &Diagnosis) -> BTreeSet<&str> {
    diagnosis.cautions.iter().map(|c| c.id.as_str()).collect()
}

/// Every rule's `true` examples, for rules whose true outcome counts for
/// their cause, with the diagnosis each gives.
fn true_examples(base: &RuleBase) -> Vec<(&RuleDef, &ExampleEntry, Diagnosis)> {
    let mut runs = Vec::new();
    for rule in &base.rules {
        if !matches!(rule.entry.when_true, Effect::Confirms | Effect::Supports) {
            continue;
        }
        for example in &rule.entry.examples {
            if example.expect != Expectation::True {
                continue;
            }
            let diagnosis = Diagnosis::run(base, &input(rule, example))
                .unwrap_or_else(|e| panic!("{} / {}: {e}", rule.entry.id, example.name));
            runs.push((rule, example, diagnosis));
        }
    }
    runs
}

#[test]
fn every_hazardous_fix_shows_its_cautions() {
    let base = RuleBase::load(&[]).expect("the built-in rule base loads");
    let mut problems = Vec::new();
    let mut fixed: BTreeSet<String> = BTreeSet::new();
    // Causes that led a diagnosis that gave no fix at all: nothing hazardous
    // was instructed, so there was nothing to caution about.
    let mut led_without_fix: BTreeSet<String> = BTreeSet::new();
    for (rule, example, diagnosis) in true_examples(&base) {
        let Some(fix) = &diagnosis.fix else {
            if let Some(leader) = diagnosis.causes.first() {
                led_without_fix.insert(leader.cause.clone());
            }
            continue;
        };
        let Some(cause) = base.causes.get(&fix.cause) else {
            continue;
        };
        fixed.insert(fix.cause.clone());
        let shown = caution_ids(&diagnosis);
        for hazard in &cause.entry.fix_hazards {
            for caution in needed(*hazard) {
                if !shown.contains(caution) {
                    problems.push(format!(
                        "{} / {}: the fix for {} needs `{caution}`, shown {shown:?}",
                        rule.entry.id, example.name, fix.cause
                    ));
                }
            }
        }
    }
    // A cause whose rules only support it may need them all at once before
    // it is likely enough for its fix: run the union of their true examples.
    for (id, cause) in &base.causes {
        if cause.entry.fix_hazards.is_empty() || fixed.contains(id) {
            continue;
        }
        let Some(diagnosis) = merged(&base, id) else {
            continue;
        };
        let Some(fix) = diagnosis.fix.as_ref().filter(|f| f.cause == *id) else {
            continue;
        };
        fixed.insert(fix.cause.clone());
        let shown = caution_ids(&diagnosis);
        for hazard in &cause.entry.fix_hazards {
            for caution in needed(*hazard) {
                if !shown.contains(caution) {
                    problems.push(format!(
                        "all true examples for {id}: the fix needs `{caution}`, shown {shown:?}"
                    ));
                }
            }
        }
    }
    // Each hazardous cause must lead a diagnosis of its own rules' examples,
    // so that the check above has run on it (or no fix was given to check).
    for (id, cause) in &base.causes {
        let led = fixed.contains(id) || led_without_fix.contains(id);
        if !cause.entry.fix_hazards.is_empty() && !led {
            problems.push(format!(
                "no rule example leads to the fix for {id}: its cautions went unchecked"
            ));
        }
    }
    assert!(problems.is_empty(), "{}", problems.join("\n"));
}

/// One diagnosis on every true example of the rules that support or confirm
/// `cause`, on the first such rule's circuit and placement.
fn merged(base: &RuleBase, cause: &str) -> Option<Diagnosis> {
    let rules: Vec<&RuleDef> = base
        .rules
        .iter()
        .filter(|r| r.entry.cause == cause)
        .filter(|r| matches!(r.entry.when_true, Effect::Confirms | Effect::Supports))
        .collect();
    let first = rules.first()?;
    let example = first
        .entry
        .examples
        .iter()
        .find(|e| e.expect == Expectation::True)?;
    let mut all = input(first, example);
    for rule in &rules {
        for example in rule
            .entry
            .examples
            .iter()
            .filter(|e| e.expect == Expectation::True)
        {
            for (name, value) in &example.readings {
                if !all.readings.iter().any(|(n, _)| n == name) {
                    all.readings.push((name.clone(), value.0.clone()));
                }
            }
        }
        for symptom in &rule.entry.symptoms {
            if !all.symptoms.contains(symptom) {
                all.symptoms.push(symptom.clone());
            }
        }
    }
    Diagnosis::run(base, &all).ok()
}

#[test]
fn every_measurement_that_opens_the_circuit_carries_its_cautions() {
    let base = RuleBase::load(&[]).expect("the built-in rule base loads");
    let opening: BTreeSet<&str> = base
        .quantities
        .values()
        .filter(|q| q.entry.opens_circuit)
        .map(|q| q.entry.id.as_str())
        .collect();
    assert!(!opening.is_empty(), "no measurement opens the circuit");
    let mut asked: BTreeSet<&str> = BTreeSet::new();
    let mut problems = Vec::new();
    for quantity in &opening {
        // A rule that needs the reading, with it left out of a true example;
        // every other reading proposed first is marked as not takeable, until
        // this one is the one asked for.
        for rule in &base.rules {
            let Some(example) = rule
                .entry
                .examples
                .iter()
                .find(|e| e.expect == Expectation::True && needs(e, quantity))
            else {
                continue;
            };
            let mut input = input(rule, example);
            input
                .readings
                .retain(|(name, _)| name.split('@').next() != Some(quantity));
            for _ in 0..base.quantities.len() {
                let diagnosis = Diagnosis::run(&base, &input).expect("diagnosis runs");
                let Some(next) = &diagnosis.next_measurement else {
                    break;
                };
                let name = next.reading.split('@').next().unwrap_or_default();
                if name != *quantity {
                    input.skip.push(next.reading.clone());
                    continue;
                }
                asked.insert(quantity);
                let def = &base.quantities[name];
                let shown = caution_ids(&diagnosis);
                for caution in &def.entry.cautions {
                    if !next.cautions.contains(caution) || !shown.contains(caution.as_str()) {
                        problems.push(format!(
                            "{}: measuring {} does not carry `{caution}`",
                            rule.entry.id, next.reading
                        ));
                    }
                }
                for caution in ["trapped-pressure"] {
                    if !next.cautions.iter().any(|c| c == caution) {
                        problems.push(format!(
                            "{}: opening the circuit to measure it needs `{caution}`",
                            next.reading
                        ));
                    }
                }
                break;
            }
            if asked.contains(quantity) {
                break;
            }
        }
    }
    let never: Vec<&&str> = opening.iter().filter(|q| !asked.contains(*q)).collect();
    assert!(never.is_empty(), "never asked for, so unchecked: {never:?}");
    assert!(problems.is_empty(), "{}", problems.join("\n"));
}

/// True when the example reads `quantity` (at any point).
fn needs(example: &ExampleEntry, quantity: &str) -> bool {
    example
        .readings
        .keys()
        .any(|name| name.split('@').next() == Some(quantity))
}
