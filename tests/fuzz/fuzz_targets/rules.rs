//! Rule files: any text, added as a user file to the default vocabulary.
//!
//! The rule base either loads (and then lints and runs its examples) or is
//! refused with located messages; nothing panics.

#![no_main]

use std::sync::OnceLock;

use libfuzzer_sys::fuzz_target;
use spoolsleuth::rules::{default_sources, RuleBase, SourceMap};

/// The default files a user's rule file builds on: the vocabulary, not the
/// symptom families' rules, whose regexes and examples would make each run
/// several times slower without reaching more of the loader.
const VOCABULARY: &[&str] = &[
    "rules/causes.yaml",
    "rules/cautions.yaml",
    "rules/derived.yaml",
    "rules/quantities.yaml",
    "rules/readings.yaml",
    "rules/settings.yaml",
    "rules/symptoms.yaml",
];

fn defaults() -> &'static [(SourceMap, bool)] {
    static DEFAULTS: OnceLock<Vec<(SourceMap, bool)>> = OnceLock::new();
    DEFAULTS.get_or_init(|| {
        let sources: Vec<(SourceMap, bool)> = default_sources()
            .into_iter()
            .filter(|(source, _)| VOCABULARY.contains(&source.name.as_str()))
            .collect();
        assert_eq!(
            sources.len(),
            VOCABULARY.len(),
            "a vocabulary file is missing"
        );
        sources
    })
}

fuzz_target!(|text: &str| {
    let mut sources = defaults().to_vec();
    sources.push((SourceMap::new("mine/fuzz.yaml", text), true));
    match RuleBase::from_sources(sources) {
        Ok(base) => {
            let _ = base.lint();
            let _ = base.run_examples();
        }
        Err(e) => assert!(!e.to_string().is_empty()),
    }
});
