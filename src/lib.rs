//! spoolsleuth: offline troubleshooting for pressure-compensated hydraulic
//! flow-control circuits.
//!
//! The library is layered: [`units`] reads and prints values with their
//! dimensions, [`formula`] compiles and evaluates the rule base's unit-aware
//! checks, [`physics`] holds the checked fluid-power formulas, and the
//! command-line glue in `cli` turns arguments into calls and reports. See
//! DEVELOPERS.md for the architecture.

pub mod chart;
pub mod cli;
pub mod diagnosis;
pub mod error;
pub mod formula;
pub mod guide;
pub mod index;
pub mod machine;
pub mod notes;
pub mod output;
pub mod physics;
pub mod report;
pub mod rules;
pub mod search;
pub mod suggest;
pub mod text_file;
pub mod units;
pub mod watch;

mod run;

pub use error::{Error, ExitStatus};
pub use run::run;
