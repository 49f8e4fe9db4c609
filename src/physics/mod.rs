//! Checked fluid-power formulas: pure functions on SI values.
//!
//! Every argument and result is SI (Pa, m³/s, m², m, kg/m³, K, m²/s, W, N, N·m, s,
//! kg, kg·m²); a revolution is dimensionless, so displacement is m³/rev and shaft
//! speed rev/s. Each function names its formula and published source. Domain
//! errors come back as [`PhysicsError`]; nothing here panics on input or returns NaN.
//! Rule thresholds are not here: these functions compute quantities only.

mod bulk_modulus;
mod checks;
mod compensator;
mod compression;
pub mod constants;
mod cylinder;
mod density;
mod flow_force;
mod geometry;
mod leakage;
mod motor;
mod natural_frequency;
mod orifice;
mod physics_error;
mod power;
mod root;
#[cfg(test)]
mod testing;
mod viscosity;
mod viscosity_grade;
mod viscosity_index;
mod viscosity_index_table;

pub use bulk_modulus::{
    effective_bulk_modulus, gas_bulk_modulus, gas_fraction_at_pressure, mixture_bulk_modulus,
    tube_bulk_modulus, BulkModulusInputs, GasProcess,
};
pub use compensator::{
    compensator_flow_force, flow_change_for_drop_change, load_sensing_pump_pressure,
    regulation_headroom, required_supply_pressure, spring_preload_for_setting, start_up_flow_peak,
    Compensator,
};
pub use compression::{compressed_volume, trapped_pressure_rise};
pub use cylinder::{
    blocked_port_pressure, cylinder_flow, cylinder_force, cylinder_speed, meter_out_back_pressure,
    retract_back_pressure,
};
pub use density::{
    density_at_pressure, density_at_temperature, density_from_specific_gravity, specific_gravity,
};
pub use flow_force::{
    flow_force_constant, jet_angle_for_opening, jet_velocity, momentum_flow_force,
    steady_flow_force, SHARP_EDGE_JET_ANGLE,
};
pub use geometry::{annulus_area, circle_area, equivalent_diameter, periphery};
pub use leakage::{annular_leakage, case_flow_rise, drift_leakage, eccentricity_factor};
pub use motor::{
    motor_drop_for_torque, motor_flow, motor_mechanical_efficiency, motor_speed, motor_torque,
    motor_volumetric_efficiency, overall_efficiency,
};
pub use natural_frequency::{
    chamber_stiffness, chamber_volumes, cylinder_natural_frequency, motor_natural_frequency,
    natural_frequency,
};
pub use orifice::{
    capacity_flow, orifice_area_for_flow, orifice_capacity, orifice_drop, orifice_flow,
    reynolds_number, round_orifice_reynolds, slot_opening_for_flow, slot_reynolds,
    us_orifice_constant, valve_capacity, water_density_for_constant,
};
pub use physics_error::{PhysicsError, PhysicsResult};
pub use power::{
    bypass_heat_budget, heat_load, hydraulic_power, input_power, restrictive_heat_budget,
    shaft_power, temperature_rise_from_heat, throttling_heat, throttling_temperature_rise,
    torque_from_power, HeatBudget,
};
pub(crate) use root::bisect;
pub use viscosity::{dynamic_viscosity, kinematic_viscosity, WaltherLine};
pub use viscosity_grade::{
    grade_of_viscosity, viscosity_grade, ViscosityGrade, ISO_VISCOSITY_GRADES,
};
pub use viscosity_index::{
    nu_100_for_index, reference_viscosities, reported_viscosity_index, viscosity_index,
};
