//! Where a cause stands after the checks.

use serde::Serialize;

/// The standing of a cause, from shown to excluded.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum CauseStatus {
    /// A check that confirms it holds, and none rules it out.
    Confirmed,
    /// The checks so far make it more likely than not.
    Likely,
    /// The checks leave it open.
    Possible,
    /// No check could run yet: readings are missing.
    NotYetTested,
    /// The checks make it unlikely.
    Unlikely,
    /// A check rules it out.
    RuledOut,
}

impl CauseStatus {
    /// The status in plain words.
    pub fn words(self) -> &'static str {
        match self {
            CauseStatus::Confirmed => "confirmed",
            CauseStatus::Likely => "likely",
            CauseStatus::Possible => "possible",
            CauseStatus::NotYetTested => "not yet tested",
            CauseStatus::Unlikely => "unlikely",
            CauseStatus::RuledOut => "ruled out",
        }
    }

    /// Whether the cause is still worth a measurement.
    pub fn is_open(self) -> bool {
        matches!(
            self,
            CauseStatus::Likely
                | CauseStatus::Possible
                | CauseStatus::NotYetTested
                | CauseStatus::Unlikely
        )
    }
}
