//! The outcome of one `calc` run: its inputs and results in SI, printed as a
//! table in the chosen unit system or as a stable JSON object.

use std::io::Write;

use comfy_table::{presets::UTF8_FULL_CONDENSED, Table};
use serde_json::{json, Map, Value};

use crate::error::Error;
use crate::units::{self, Kind, Quantity, UnitSystem};

/// How one value is printed in the table.
#[derive(Clone, Debug)]
enum Shown {
    /// Through the units module, in the unit its kind uses in the chosen system.
    Kind(Kind),
    /// Text already prepared for each system (for quantities without a kind).
    Text { metric: String, us: String },
}

/// One named value, held in SI.
#[derive(Clone, Debug)]
struct Entry {
    name: String,
    si: f64,
    si_unit: &'static str,
    shown: Shown,
}

impl Entry {
    fn display(&self, system: UnitSystem) -> String {
        match &self.shown {
            Shown::Kind(kind) => units::format(Quantity::of(*kind, self.si), *kind, system),
            Shown::Text { metric, us } => match system {
                UnitSystem::Metric => metric.clone(),
                UnitSystem::Us => us.clone(),
            },
        }
    }

    fn json(&self) -> Value {
        json!({ "value": self.si, "unit": self.si_unit })
    }
}

/// Inputs and results of one calculation, with the published source of its formula.
#[derive(Debug)]
pub(crate) struct Report {
    calculation: &'static str,
    inputs: Vec<Entry>,
    results: Vec<Entry>,
    source: &'static str,
}

impl Report {
    /// An empty report for `calculation` whose formula comes from `source`.
    pub(crate) fn new(calculation: &'static str, source: &'static str) -> Self {
        Report {
            calculation,
            inputs: Vec::new(),
            results: Vec::new(),
            source,
        }
    }

    /// Parse `text` given to `--option` as a `kind`, record it as an input, and
    /// return its SI value. A bad reading becomes an error naming the option.
    pub(crate) fn input(&mut self, option: &str, text: &str, kind: Kind) -> Result<f64, Error> {
        let quantity = units::parse_as(text, kind).map_err(|err| Error::Input {
            option: format!("--{option}"),
            message: err.to_string(),
        })?;
        self.inputs.push(Entry {
            name: option.to_string(),
            si: quantity.si(),
            si_unit: si_unit(kind),
            shown: Shown::Kind(kind),
        });
        Ok(quantity.si())
    }

    /// Like [`Report::input`] for an option that may be absent.
    pub(crate) fn optional(
        &mut self,
        option: &str,
        text: Option<&str>,
        kind: Kind,
    ) -> Result<Option<f64>, Error> {
        text.map(|t| self.input(option, t, kind)).transpose()
    }

    /// Record an input that is not a reading with a unit (e.g. a grade number).
    pub(crate) fn plain_input(&mut self, option: &str, value: f64, text: String) {
        self.inputs.push(Entry {
            name: option.to_string(),
            si: value,
            si_unit: "1",
            shown: Shown::Text {
                metric: text.clone(),
                us: text,
            },
        });
    }

    /// Record an input angle in radians, printed in degrees.
    pub(crate) fn angle_input(&mut self, option: &str, radians: f64) {
        let degrees = format!("{}°", units::format_number(radians.to_degrees()));
        self.inputs.push(Entry {
            name: option.to_string(),
            si: radians,
            si_unit: "rad",
            shown: Shown::Text {
                metric: degrees.clone(),
                us: degrees,
            },
        });
    }

    /// Record a result of `kind` with SI value `si`.
    pub(crate) fn result(&mut self, name: &str, kind: Kind, si: f64) {
        self.results.push(Entry {
            name: name.to_string(),
            si,
            si_unit: si_unit(kind),
            shown: Shown::Kind(kind),
        });
    }

    /// Record a result that has no kind of its own, with its SI unit and the text
    /// shown for each unit system.
    pub(crate) fn custom_result(
        &mut self,
        name: &str,
        si: f64,
        si_unit: &'static str,
        metric: String,
        us: String,
    ) {
        self.results.push(Entry {
            name: name.to_string(),
            si,
            si_unit,
            shown: Shown::Text { metric, us },
        });
    }

    /// Write the report as a table (or JSON) to `out`.
    pub(crate) fn write(
        &self,
        out: &mut impl Write,
        system: UnitSystem,
        as_json: bool,
    ) -> Result<(), Error> {
        if as_json {
            writeln!(out, "{}", serde_json::to_string_pretty(&self.json())?)?;
        } else {
            writeln!(out, "{}", self.table(system))?;
            writeln!(out, "source: {}", self.source)?;
        }
        Ok(())
    }

    fn json(&self) -> Value {
        let map = |entries: &[Entry]| {
            entries
                .iter()
                .map(|e| (e.name.clone(), e.json()))
                .collect::<Map<String, Value>>()
        };
        json!({
            "calculation": self.calculation,
            "inputs": map(&self.inputs),
            "results": map(&self.results),
            "source": self.source,
        })
    }

    fn table(&self, system: UnitSystem) -> Table {
        let mut table = Table::new();
        table.load_style(UTF8_FULL_CONDENSED);
        table.set_header(vec![self.calculation, "", "value"]);
        for (section, entries) in [("input", &self.inputs), ("result", &self.results)] {
            for entry in entries {
                table.add_row(vec![
                    section.to_string(),
                    entry.name.clone(),
                    entry.display(system),
                ]);
            }
        }
        table
    }
}

/// The SI unit a kind's values are held in, as printed in JSON.
fn si_unit(kind: Kind) -> &'static str {
    match kind {
        Kind::Area => "m²",
        Kind::Density => "kg/m³",
        Kind::Displacement => "m³/rev",
        Kind::DynamicViscosity => "Pa·s",
        Kind::Energy => "J",
        Kind::Expansion => "1/K",
        Kind::Flow => "m³/s",
        Kind::Force => "N",
        Kind::Fraction | Kind::Ratio => "1",
        Kind::Frequency => "Hz",
        Kind::Heat | Kind::Power => "W",
        Kind::Inertia => "kg·m²",
        Kind::KinematicViscosity => "m²/s",
        Kind::Length => "m",
        Kind::Mass => "kg",
        Kind::Modulus | Kind::Pressure => "Pa",
        Kind::ShaftSpeed => "rev/s",
        Kind::SpecificHeat => "J/(kg·K)",
        Kind::Stiffness => "N/m",
        Kind::Temperature | Kind::TemperatureDifference => "K",
        Kind::Time => "s",
        Kind::Torque => "N·m",
        Kind::Velocity => "m/s",
        Kind::Volume => "m³",
    }
}
