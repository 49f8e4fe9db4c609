//! Machine profiles: one YAML file per machine with its circuit and
//! nameplate data.

mod machine_error;
mod machine_profile;
mod machine_set;
mod nameplate_settles;

pub use machine_error::MachineError;
pub use machine_profile::{Actuator, MachineProfile, NameplateProblem};
pub use machine_set::{parse, LoadedMachine, MachineSet};
pub use nameplate_settles::{nameplate_settles, SettledValue};
