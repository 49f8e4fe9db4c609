//! Rule files: any text, added as a user file to the default rule base.
//!
//! The rule base either loads (and then lints and runs its examples) or is
//! refused with located messages; nothing panics.

#![no_main]

use std::sync::OnceLock;

use libfuzzer_sys::fuzz_target;
use spoolsleuth::rules::{default_sources, RuleBase, SourceMap};

fn defaults() -> &'static [(SourceMap, bool)] {
    static DEFAULTS: OnceLock<Vec<(SourceMap, bool)>> = OnceLock::new();
    DEFAULTS.get_or_init(default_sources)
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
