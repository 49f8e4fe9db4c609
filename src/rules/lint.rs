//! Lints over a loaded rule base: what loads but is still wrong or unsafe.

use super::rule_file::{Expectation, Hazard};
use super::RuleBase;

/// One lint finding.
#[derive(Clone, Debug, PartialEq, Eq, serde::Serialize)]
pub struct Lint {
    /// `file:line`.
    pub at: String,
    /// What is wrong.
    pub message: String,
}

impl RuleBase {
    /// Every lint finding, in a stable order.
    pub fn lint(&self) -> Vec<Lint> {
        let mut lints = Vec::new();
        for (what, first, second) in &self.duplicates {
            lints.push(Lint {
                at: second.clone(),
                message: format!("duplicate {what}: already defined at {first}"),
            });
        }
        self.lint_quantities(&mut lints);
        self.lint_causes(&mut lints);
        self.lint_rules(&mut lints);
        if self.closing.trim().is_empty() {
            lints.push(Lint {
                at: "rules".into(),
                message: "no `closing:` line deferring to local codes and licensed practice".into(),
            });
        }
        lints
    }

    fn unknown_cautions<'a>(&'a self, ids: &'a [String]) -> impl Iterator<Item = &'a String> + 'a {
        ids.iter().filter(|c| !self.cautions.contains_key(*c))
    }

    fn lint_quantities(&self, lints: &mut Vec<Lint>) {
        for q in self.quantities.values() {
            for c in self.unknown_cautions(&q.entry.cautions) {
                lints.push(Lint {
                    at: q.origin.at(),
                    message: format!("quantity `{}` names unknown caution `{c}`", q.entry.id),
                });
            }
            if q.entry.opens_circuit {
                for need in Hazard::OpensCircuit.required_cautions() {
                    if !q.entry.cautions.iter().any(|c| c == need) {
                        lints.push(Lint {
                            at: q.origin.at(),
                            message: format!(
                                "measuring `{}` opens the circuit but does not give the `{need}` caution",
                                q.entry.id
                            ),
                        });
                    }
                }
            }
        }
    }

    fn lint_causes(&self, lints: &mut Vec<Lint>) {
        for cause in self.causes.values() {
            let id = &cause.entry.id;
            for c in self.unknown_cautions(&cause.entry.cautions) {
                lints.push(Lint {
                    at: cause.origin.at(),
                    message: format!("cause `{id}` names unknown caution `{c}`"),
                });
            }
            for hazard in &cause.entry.fix_hazards {
                for need in hazard.required_cautions() {
                    if !cause.entry.cautions.iter().any(|c| c == need) {
                        lints.push(Lint {
                            at: cause.origin.at(),
                            message: format!(
                                "the fix for `{id}` is marked `{}` but does not give the `{need}` caution",
                                hazard.name()
                            ),
                        });
                    }
                }
            }
            let reached = self
                .rules
                .iter()
                .any(|r| &r.entry.cause == id && !r.entry.symptoms.is_empty());
            if !reached {
                lints.push(Lint {
                    at: cause.origin.at(),
                    message: format!("no symptom reaches cause `{id}`: no rule tests it"),
                });
            }
        }
    }

    fn lint_rules(&self, lints: &mut Vec<Lint>) {
        for rule in &self.rules {
            let e = &rule.entry;
            let at = rule.origin.at();
            if e.source.as_deref().is_none_or(|s| s.trim().is_empty()) {
                lints.push(Lint {
                    at: at.clone(),
                    message: format!("rule `{}` has no `source:` line (a citation, `common practice` or `from memory`)", e.id),
                });
            }
            let has = |x: Expectation| e.examples.iter().any(|ex| ex.expect == x);
            if e.examples.len() < 2 || !has(Expectation::True) || !has(Expectation::False) {
                lints.push(Lint {
                    at: at.clone(),
                    message: format!(
                        "rule `{}` needs at least two examples, one where the check is true and one where it is false",
                        e.id
                    ),
                });
            }
            if e.symptoms.is_empty() {
                lints.push(Lint {
                    at,
                    message: format!(
                        "rule `{}` names no symptom, so no complaint reaches it",
                        e.id
                    ),
                });
            }
        }
    }
}
