//! The rule base: YAML symptom → cause rules, each backed by a computed
//! check, loaded, dimension-checked, linted and self-tested.

mod example_run;
mod formulas;
mod lint;
mod readings;
mod rule_base;
mod rule_file;
mod rules_error;
mod source_map;

pub use example_run::ExampleResult;
pub use formulas::{function_list, functions, Check, Evaluated, Evidence, TypeEnv, Values};
pub use lint::Lint;
pub use readings::{ReadingError, Readings};
pub use rule_base::{
    default_sources, unknown, CauseDef, CautionDef, DerivedDef, Origin, QuantityDef, RuleBase,
    RuleDef, SettingDef, SymptomDef, MAX_RULE_FILE_BYTES,
};
pub use rule_file::{
    Actuator, Circuit, Effect, ExampleEntry, Expectation, Hazard, Placement, QuantitySource,
    RuleEntry, Scalar,
};
pub use rules_error::RulesError;
pub use source_map::{Position, SourceMap};
