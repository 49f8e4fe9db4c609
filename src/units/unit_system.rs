//! The unit system results are printed in.

use std::fmt;
use std::str::FromStr;

/// Metric (bar, L/min, °C) or US customary (psi, gpm, °F) printing.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum UnitSystem {
    /// bar, L/min, cm³/rev, °C, mm, kW.
    #[default]
    Metric,
    /// psi, gpm, in³/rev, °F, in, hp.
    Us,
}

impl fmt::Display for UnitSystem {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            UnitSystem::Metric => "metric",
            UnitSystem::Us => "us",
        })
    }
}

impl FromStr for UnitSystem {
    type Err = String;

    fn from_str(s: &str) -> Result<Self, Self::Err> {
        match s.to_ascii_lowercase().as_str() {
            "metric" | "si" => Ok(UnitSystem::Metric),
            "us" | "us-customary" | "imperial" => Ok(UnitSystem::Us),
            _ => Err(format!(
                "unknown unit system `{s}` (expected `metric` or `us`)"
            )),
        }
    }
}
