//! Diagnosis: the complaint recognised, every applicable rule evaluated on
//! the readings, causes ranked with computed evidence, readings that cannot
//! all be true reported first, and the next measurement chosen.

mod cause_assessment;
mod cause_status;
mod demo_call;
#[allow(clippy::module_inception)]
mod diagnosis;
mod diagnosis_error;
mod diagnosis_input;
mod next_measurement;
mod reading_input;
mod reading_view;

pub use cause_assessment::{CauseAssessment, EvidenceLine};
pub use cause_status::CauseStatus;
pub use demo_call::{DemoCall, DEMO_CALL};
pub use diagnosis::{
    CautionView, ConsistencyProblem, Diagnosis, FixView, MachineView, PastCase, SymptomView,
    IMPOSSIBLE_READINGS, SCHEMA_VERSION,
};
pub use diagnosis_error::DiagnosisError;
pub use diagnosis_input::{CauseHistory, DiagnosisInput};
pub use next_measurement::NextMeasurement;
pub use reading_input::{parse_reading_argument, parse_readings_file};
pub use reading_view::ReadingView;
