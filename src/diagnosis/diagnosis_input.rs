//! What a diagnosis starts from: the circuit, the complaint and the readings.

use crate::machine::{Actuator, MachineProfile};
use crate::rules::{Circuit, Placement};
use crate::units::UnitSystem;

/// The inputs of one diagnosis.
#[derive(Clone, Debug)]
pub struct DiagnosisInput {
    /// What drives the load, when known (rules about motors are skipped on a
    /// cylinder and the other way round).
    pub actuator: Option<Actuator>,
    /// Circuit type.
    pub circuit: Circuit,
    /// The technician's own words.
    pub complaint: Option<String>,
    /// The machine's own past: how often each cause was found for each
    /// symptom over its recent cases (counts as prior evidence).
    pub history: Vec<CauseHistory>,
    /// The machine profile, when the machine is known.
    pub machine: Option<MachineProfile>,
    /// Where the valve sits.
    pub placement: Placement,
    /// Readings as given, `name` or `name@point` with the text typed, in
    /// the order given (a name may appear twice; the two are compared).
    pub readings: Vec<(String, String)>,
    /// Readings the technician cannot take this time: never proposed as
    /// the next measurement.
    pub skip: Vec<String>,
    /// Symptom ids named outright.
    pub symptoms: Vec<String>,
    /// How results are printed.
    pub units: UnitSystem,
}

impl DiagnosisInput {
    /// Inputs for a known machine: its circuit, placement, actuator and units.
    pub fn for_machine(machine: MachineProfile) -> Self {
        DiagnosisInput {
            actuator: Some(machine.actuator),
            circuit: machine.circuit,
            complaint: None,
            history: Vec::new(),
            placement: machine.placement,
            readings: Vec::new(),
            skip: Vec::new(),
            symptoms: Vec::new(),
            units: machine.units,
            machine: Some(machine),
        }
    }
}

/// How often a cause was found for a symptom over a machine's recent cases.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct CauseHistory {
    /// Symptom id.
    pub symptom: String,
    /// Cause id.
    pub cause: String,
    /// Cases with this symptom that had this cause.
    pub count: usize,
    /// Cases with this symptom in the window looked at.
    pub of: usize,
}
