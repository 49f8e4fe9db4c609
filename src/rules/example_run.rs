//! Running every rule's worked examples: readings with units in, the
//! expected outcome out.

use super::formulas::Evaluated;
use super::rule_file::{Circuit, Expectation, Placement};
use super::{Readings, RuleBase, RuleDef};
use crate::units::UnitSystem;

/// The result of one example.
#[derive(Clone, Debug, PartialEq, serde::Serialize)]
pub struct ExampleResult {
    /// The rule's id.
    pub rule: String,
    /// The example's name.
    pub example: String,
    /// What the example expects.
    pub expected: Expectation,
    /// What the check gave (`None` when it could not run).
    pub got: Option<Expectation>,
    /// The evidence sentence, or the reason the example failed to run.
    pub detail: String,
    /// Whether the outcome matched.
    pub passed: bool,
}

impl RuleBase {
    /// Run every example of every rule.
    pub fn run_examples(&self) -> Vec<ExampleResult> {
        self.rules
            .iter()
            .flat_map(|rule| (0..rule.entry.examples.len()).map(move |i| self.run_example(rule, i)))
            .collect()
    }

    fn run_example(&self, rule: &RuleDef, index: usize) -> ExampleResult {
        let example = &rule.entry.examples[index];
        let mut result = ExampleResult {
            rule: rule.entry.id.clone(),
            example: example.name.clone(),
            expected: example.expect,
            got: None,
            detail: String::new(),
            passed: false,
        };
        let circuit = example
            .circuit
            .or_else(|| rule.entry.circuits.first().copied())
            .unwrap_or(Circuit::Restrictive);
        let placement = example
            .placement
            .or_else(|| rule.entry.placements.first().copied())
            .unwrap_or(Placement::MeterIn);
        if !rule.applies_to(circuit, placement) {
            result.detail = format!(
                "the rule does not apply to a {} circuit placed {}",
                circuit.name(),
                placement.name()
            );
            return result;
        }
        let mut readings = Readings::new();
        for (name, text) in &example.readings {
            if let Err(e) = readings.insert_text(self, name, &text.0) {
                result.detail = format!("reading `{}`: {}", e.name, e.message);
                return result;
            }
        }
        let values = self.values(&readings);
        let (got, detail) = match rule.check.evaluate(&values) {
            Evaluated::Condition(true) => (Expectation::True, String::new()),
            Evaluated::Condition(false) => (Expectation::False, String::new()),
            Evaluated::Missing(names) => {
                (Expectation::Missing, format!("needs {}", names.join(", ")))
            }
            Evaluated::Quantity(_) => {
                result.detail = "the check gave a quantity, not true or false".into();
                return result;
            }
            Evaluated::Failed(message) => {
                result.detail = message;
                return result;
            }
        };
        result.got = Some(got);
        result.passed = got == example.expect;
        result.detail = match got {
            Expectation::Missing => detail,
            Expectation::False => match &rule.evidence_false {
                Some(sentence) => sentence.render(&values, UnitSystem::Metric),
                None => "does not hold".to_string(),
            },
            Expectation::True => rule.evidence.render(&values, UnitSystem::Metric),
        };
        result
    }
}
