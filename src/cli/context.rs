//! What every command needs from the global options, resolved once.

use std::path::PathBuf;

use super::arguments::{Arguments, ColorArgument, UnitsArgument};
use crate::output::{Color, ColorChoice};
use crate::rules::RuleBase;
use crate::units::UnitSystem;
use crate::Error;

/// The global options, turned into domain values.
#[derive(Clone, Debug)]
pub struct Context {
    /// Colour decision for standard output.
    pub color: Color,
    /// Extra rule folders.
    pub rule_dirs: Vec<PathBuf>,
    /// Unit system for printing (the one given, else metric).
    pub units: UnitSystem,
    /// The unit system given with `--units` or the environment, if any; a
    /// machine's own units apply otherwise.
    pub units_given: Option<UnitSystem>,
}

impl Context {
    /// Resolve the global options.
    pub fn from_arguments(arguments: &Arguments) -> Self {
        let choice = match arguments.color {
            ColorArgument::Auto => ColorChoice::Auto,
            ColorArgument::Always => ColorChoice::Always,
            ColorArgument::Never => ColorChoice::Never,
        };
        let units_given = arguments.units.map(|u| match u {
            UnitsArgument::Metric => UnitSystem::Metric,
            UnitsArgument::Us => UnitSystem::Us,
        });
        Context {
            color: Color::for_stdout(choice),
            rule_dirs: arguments.rules.clone(),
            units: units_given.unwrap_or_default(),
            units_given,
        }
    }

    /// Load the rule base (built-in plus the user's folders).
    pub fn rule_base(&self) -> Result<RuleBase, Error> {
        Ok(RuleBase::load(&self.rule_dirs)?)
    }
}
