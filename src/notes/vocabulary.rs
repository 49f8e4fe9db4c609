//! The symptom and cause ids a note may use, shared with the rule base, and
//! nearest-match suggestions for typos.

/// Symptom ids, sorted.
pub const SYMPTOM_IDS: &[&str] = &[
    "drift-warm",
    "erratic-low-flow",
    "hunting",
    "impossible-readings",
    "meter-out-intensification",
    "no-compensation-supply-swing",
    "overrunning-runaway",
    "runs-hot",
    "slow-or-stalled",
    "speed-sags-under-load",
    "startup-lunge",
];

/// Cause ids, sorted.
pub const CAUSE_IDS: &[&str] = &[
    "air-in-oil",
    "check-valve-leaking",
    "compensator-open-at-rest",
    "compensator-spring-weak",
    "compensator-sticking",
    "cooler-fouled",
    "cylinder-seal-bypass",
    "excess-flow-over-relief",
    "gauge-error",
    "inlet-restricted",
    "insufficient-headroom",
    "line-volume-compliance",
    "ls-margin-low",
    "ls-signal-bleed",
    "meter-in-overrunning",
    "meter-out-intensification",
    "motor-worn",
    "needle-valve-uncompensated",
    "oil-too-hot",
    "orifice-silted",
    "pump-worn",
    "relief-leaking",
    "relief-set-low",
    "trapped-oil-thermal",
];

/// The candidate closest to `word`, if it is close enough to be a likely
/// typo (the crate's one suggestion rule, [`crate::suggest::suggest`]).
pub fn nearest<'a, I>(word: &str, candidates: I) -> Option<&'a str>
where
    I: IntoIterator<Item = &'a str>,
{
    crate::suggest::suggest(word, candidates)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn lists_are_sorted_and_unique() {
        for list in [SYMPTOM_IDS, CAUSE_IDS] {
            assert!(list.windows(2).all(|pair| pair[0] < pair[1]));
        }
    }

    #[test]
    fn nearest_finds_typos_and_rejects_strangers() {
        assert_eq!(nearest("machnie", ["machine", "date"]), Some("machine"));
        assert_eq!(
            nearest("compensator-stiking", CAUSE_IDS.iter().copied()),
            Some("compensator-sticking")
        );
        assert_eq!(nearest("banana", ["machine", "date"]), None);
    }
}
