//! Technician readings: any text, read as a quantity of every kind.
//!
//! A reading either parses to a finite value that prints, or is refused with
//! a message; nothing panics, and no garbage becomes a number.

#![no_main]

use libfuzzer_sys::fuzz_target;
use spoolsleuth::units::{format, parse_as, parse_quantity, parse_unit, Kind, UnitSystem};

fuzz_target!(|text: &str| {
    if let Ok(q) = parse_quantity(text) {
        assert!(q.si().is_finite(), "`{text}` parsed to {q:?}");
    }
    let _ = parse_unit(text, text).map_err(|e| e.to_string());
    for &kind in Kind::ALL {
        match parse_as(text, kind) {
            Ok(q) => {
                assert!(q.si().is_finite(), "`{text}` as {kind:?} parsed to {q:?}");
                for system in [UnitSystem::Metric, UnitSystem::Us] {
                    let _ = format(q, kind, system);
                }
            }
            Err(e) => assert!(!e.to_string().is_empty()),
        }
    }
});
