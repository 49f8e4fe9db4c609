//! The demo plant's breakdown call: the panel press that bogs down when it
//! closes on the panel. The demo shows it, and tests use it as a fixture.

use super::{Diagnosis, DiagnosisInput};
use crate::machine::MachineSet;
use crate::rules::RuleBase;

/// A breakdown call: the machine, the technician's words and the readings
/// taken, in the machine's own units.
#[derive(Clone, Copy, Debug)]
pub struct DemoCall {
    /// Machine id of a demo profile.
    pub machine: &'static str,
    /// The complaint in the technician's words.
    pub complaint: &'static str,
    /// Readings as `name@point` and text with its unit.
    pub readings: &'static [(&'static str, &'static str)],
}

/// press-4: the drop across the metering orifice collapses under load while
/// supply has pressure to spare (a sticking compensator spool).
pub const DEMO_CALL: DemoCall = DemoCall {
    machine: "press-4",
    complaint: "platen slows right down and bogs when it closes on the panel",
    readings: &[
        ("supply_pressure@unloaded", "150 bar"),
        ("inter_pressure@unloaded", "38 bar"),
        ("load_pressure@unloaded", "30 bar"),
        ("flow@unloaded", "20 L/min"),
        ("supply_pressure@loaded", "185 bar"),
        ("inter_pressure@loaded", "143.5 bar"),
        ("load_pressure@loaded", "140 bar"),
        ("flow@loaded", "14.2 L/min"),
    ],
};

impl DemoCall {
    /// The diagnosis input for this call on its demo machine.
    pub fn input(
        &self,
        machines: &MachineSet,
    ) -> Result<DiagnosisInput, crate::machine::MachineError> {
        let machine = machines.get(self.machine)?.profile.clone();
        let mut input = DiagnosisInput::for_machine(machine);
        input.complaint = Some(self.complaint.to_string());
        input.readings = self
            .readings
            .iter()
            .map(|(n, v)| ((*n).to_string(), (*v).to_string()))
            .collect();
        Ok(input)
    }

    /// The call diagnosed with the built-in rule base and demo machines
    /// (no case-note history).
    pub fn diagnose(&self) -> Result<Diagnosis, crate::Error> {
        let base = RuleBase::load(&[])?;
        let machines = MachineSet::load(None)?;
        Ok(Diagnosis::run(&base, &self.input(&machines)?)?)
    }

    /// The call as `diagnose` arguments: `--machine ID --complaint TEXT --reading NAME=VALUE ...`.
    pub fn arguments(&self) -> Vec<String> {
        let mut args = vec![
            "--machine".to_string(),
            self.machine.to_string(),
            "--complaint".to_string(),
            self.complaint.to_string(),
        ];
        for (name, value) in self.readings {
            args.push("--reading".to_string());
            args.push(format!("{name}={value}"));
        }
        args
    }
}
