//! Machine profiles: any text, read as a profile and its nameplate checked
//! against the default rule base.
//!
//! A profile either parses or is refused with a located message; its
//! nameplate values are finite or reported as problems; nothing panics.

#![no_main]

use std::sync::OnceLock;

use libfuzzer_sys::fuzz_target;
use spoolsleuth::machine::parse;
use spoolsleuth::rules::RuleBase;

fn base() -> &'static RuleBase {
    static BASE: OnceLock<RuleBase> = OnceLock::new();
    BASE.get_or_init(|| RuleBase::load(&[]).unwrap_or_else(|e| panic!("default rules: {e}")))
}

fuzz_target!(|text: &str| {
    match parse("machines/fuzz.yaml", text) {
        Ok(profile) => {
            let (values, problems) = profile.nameplate_values(base());
            for (name, q) in &values {
                assert!(q.si().is_finite(), "{name} = {q:?}");
            }
            for problem in &problems {
                assert!(!problem.message.is_empty(), "{}", problem.name);
            }
        }
        Err(e) => assert!(!e.to_string().is_empty()),
    }
});
