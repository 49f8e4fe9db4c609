//! `spoolsleuth calc`: read the options with their units, call the physics
//! functions, and report inputs and results.

use std::f64::consts::PI;
use std::io::Write;

use super::calc_arguments::*;
use super::calc_report::Report;
use super::context::Context;
use crate::error::{Error, ExitStatus};
use crate::physics::{self, constants, BulkModulusInputs, Compensator, GasProcess};
use crate::units::{self, unit::WATER_DENSITY_60F, Kind};

/// Run one calculation and print its report to standard output.
pub fn execute(context: &Context, arguments: CalcArguments) -> Result<ExitStatus, Error> {
    let report = calculate(arguments.calculation)?;
    let system = context.units;
    let stdout = std::io::stdout();
    let mut out = stdout.lock();
    report.write(&mut out, system, arguments.json)?;
    out.flush()?;
    Ok(ExitStatus::Success)
}

/// Dispatch to the calculation.
fn calculate(calculation: Calculation) -> Result<Report, Error> {
    match calculation {
        Calculation::BulkModulus(a) => bulk_modulus(&a),
        Calculation::CompressedVolume(a) => compressed_volume(&a),
        Calculation::Compensator(a) => compensator(&a),
        Calculation::CylinderSpeed(a) => cylinder_speed(&a),
        Calculation::DensityAt(a) => density_at(&a),
        Calculation::FlowForce(a) => flow_force(&a),
        Calculation::GradeViscosity(a) => grade_viscosity(&a),
        Calculation::HeatBudget(a) => heat_budget(&a),
        Calculation::HydraulicPower(a) => hydraulic_power(&a),
        Calculation::Intensification(a) => intensification(&a),
        Calculation::Leakage(a) => leakage(&a),
        Calculation::MotorEfficiency(a) => motor_efficiency(&a),
        Calculation::MotorFrequency(a) => motor_frequency(&a),
        Calculation::MotorSpeed(a) => motor_speed(&a),
        Calculation::MotorTorque(a) => motor_torque(&a),
        Calculation::NaturalFrequency(a) => natural_frequency(&a),
        Calculation::OrificeConstant(a) => orifice_constant(&a),
        Calculation::OrificeFlow(a) => orifice_flow(&a),
        Calculation::ThrottlingHeat(a) => throttling_heat(&a),
        Calculation::ViscosityAt(a) => viscosity_at(&a),
        Calculation::ViscosityIndex(a) => viscosity_index(&a),
    }
}

fn bulk_modulus(a: &BulkModulusArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "bulk-modulus",
        "derived (series form); Rabie 2009, §2.2.3, eq. 2.57, p. 55",
    );
    let process = match a.process {
        ProcessChoice::Adiabatic => GasProcess::Adiabatic,
        ProcessChoice::Isothermal => GasProcess::Isothermal,
    };
    r.plain_input(
        "process",
        process.polytropic_index(),
        format!("{:?}", a.process).to_lowercase(),
    );
    let inputs = BulkModulusInputs {
        air_fraction_at_atmosphere: r.input("air", &a.air, Kind::Fraction)?,
        atmospheric_pressure_pa: r.input("atmosphere", &a.atmosphere, Kind::Pressure)?,
        container_pa: r.optional(
            "container-modulus",
            a.container_modulus.as_deref(),
            Kind::Modulus,
        )?,
        gauge_pressure_pa: r.input("pressure", &a.pressure, Kind::Pressure)?,
        liquid_pa: r.input("oil-modulus", &a.oil_modulus, Kind::Modulus)?,
        process,
    };
    let p_abs = inputs.gauge_pressure_pa + inputs.atmospheric_pressure_pa;
    let effective = physics::effective_bulk_modulus(&inputs)?;
    let gas = physics::gas_fraction_at_pressure(
        inputs.air_fraction_at_atmosphere,
        inputs.atmospheric_pressure_pa,
        p_abs,
        process,
    )?;
    r.result("gas-fraction-at-pressure", Kind::Fraction, gas);
    r.result("effective-bulk-modulus", Kind::Modulus, effective);
    Ok(r)
}

fn compressed_volume(a: &CompressedVolumeArgs) -> Result<Report, Error> {
    let mut r = Report::new("compressed-volume", "derived (definition of bulk modulus)");
    let volume = r.input("volume", &a.volume, Kind::Volume)?;
    let rise = r.input("pressure-rise", &a.pressure_rise, Kind::Pressure)?;
    let bulk = r.input("bulk-modulus", &a.bulk_modulus, Kind::Modulus)?;
    let dv = physics::compressed_volume(volume, rise, bulk)?;
    r.result("compressed-volume", Kind::Volume, dv);
    Ok(r)
}

fn compensator(a: &CompensatorArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "compensator",
        "derived (own model); flow force Vacca §3.8.1 (momentum form)",
    );
    let area = match (&a.spool_area, &a.spool_diameter) {
        (Some(text), _) => r.input("spool-area", text, Kind::Area)?,
        (None, Some(text)) => {
            physics::circle_area(r.input("spool-diameter", text, Kind::Length)?)?
        }
        (None, None) => return Err(missing("--spool-area or --spool-diameter")),
    };
    let preload = match (&a.preload, &a.setting) {
        (Some(text), _) => r.input("preload", text, Kind::Force)?,
        (None, Some(text)) => {
            physics::spring_preload_for_setting(r.input("setting", text, Kind::Pressure)?, area)?
        }
        (None, None) => return Err(missing("--preload or --setting")),
    };
    let spool = Compensator {
        jet_angle_rad: angle(&mut r, "jet-angle", &a.jet_angle)?,
        spool_area_m2: area,
        spring_preload_n: preload,
        spring_rate_n_m: r.input("spring-rate", &a.spring_rate, Kind::Stiffness)?,
        velocity_coefficient: r.input("cv", &a.cv, Kind::Ratio)?,
    };
    let flow = r.input("flow", &a.flow, Kind::Flow)?;
    let density = r.input("density", &a.density, Kind::Density)?;
    let drop = r.input("compensator-drop", &a.compensator_drop, Kind::Pressure)?;
    let stroke = r.input("stroke", &a.stroke, Kind::Length)?;
    r.result("spool-area", Kind::Area, area);
    r.result("spring-preload", Kind::Force, preload);
    let point = |drop: f64, stroke: f64| -> Result<(f64, f64), Error> {
        let force = physics::compensator_flow_force(
            flow,
            density,
            spool.velocity_coefficient,
            drop,
            spool.jet_angle_rad,
        )?;
        Ok((force, spool.metering_drop(stroke, flow, density, drop)?))
    };
    let (force, held) = point(drop, stroke)?;
    r.result("flow-force", Kind::Force, force);
    r.result("metering-drop", Kind::Pressure, held);
    let compare_drop = r.optional("compare-drop", a.compare_drop.as_deref(), Kind::Pressure)?;
    let compare_stroke = r.optional("compare-stroke", a.compare_stroke.as_deref(), Kind::Length)?;
    if let (Some(drop2), Some(stroke2)) = (compare_drop, compare_stroke) {
        let (force2, held2) = point(drop2, stroke2)?;
        r.result("compare-flow-force", Kind::Force, force2);
        r.result("compare-metering-drop", Kind::Pressure, held2);
        let change = physics::flow_change_for_drop_change(held, held2)?;
        r.result("flow-change", Kind::Fraction, change);
    }
    Ok(r)
}

fn cylinder_speed(a: &CylinderSpeedArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "cylinder-speed",
        "derived (continuity; Rabie 2009, Example 2.1, p. 60)",
    );
    let bore = r.input("bore", &a.bore, Kind::Length)?;
    let rod = r.input("rod", &a.rod, Kind::Length)?;
    let flow = r.input("flow", &a.flow, Kind::Flow)?;
    let cap = physics::circle_area(bore)?;
    let annulus = physics::annulus_area(bore, rod)?;
    r.result("cap-area", Kind::Area, cap);
    r.result("annulus-area", Kind::Area, annulus);
    r.result("area-ratio", Kind::Ratio, cap / annulus);
    r.result(
        "extend-speed",
        Kind::Velocity,
        physics::cylinder_speed(flow, cap)?,
    );
    r.result(
        "retract-speed",
        Kind::Velocity,
        physics::cylinder_speed(flow, annulus)?,
    );
    Ok(r)
}

fn density_at(a: &DensityAtArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "density-at",
        "Rabie 2009, §2.2.4, eq. 2.81, p. 60; pressure term Vacca 2021, §2.5",
    );
    let rho0 = r.input("density", &a.density, Kind::Density)?;
    let t0 = r.input(
        "reference-temperature",
        &a.reference_temperature,
        Kind::Temperature,
    )?;
    let t = r.input("temperature", &a.temperature, Kind::Temperature)?;
    let alpha = r.input("expansion", &a.expansion, Kind::Expansion)?;
    let mut rho = physics::density_at_temperature(rho0, t0, t, alpha)?;
    if let Some(p) = r.optional("pressure", a.pressure.as_deref(), Kind::Pressure)? {
        let bulk = r.input("bulk-modulus", &a.bulk_modulus, Kind::Modulus)?;
        rho = physics::density_at_pressure(rho, p, bulk)?;
    }
    r.result("density", Kind::Density, rho);
    r.result(
        "specific-gravity",
        Kind::Ratio,
        physics::specific_gravity(rho, WATER_DENSITY_60F)?,
    );
    Ok(r)
}

fn flow_force(a: &FlowForceArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "flow-force",
        "Merritt 1967, ch. 4 (from memory for the exact section); Vacca §3.8.1 (momentum form)",
    );
    let width = match (&a.width, &a.spool_diameter) {
        (Some(text), _) => r.input("width", text, Kind::Length)?,
        (None, Some(text)) => physics::periphery(r.input("spool-diameter", text, Kind::Length)?)?,
        (None, None) => return Err(missing("--width or --spool-diameter")),
    };
    let opening = r.input("opening", &a.opening, Kind::Length)?;
    let drop = r.input("drop", &a.drop, Kind::Pressure)?;
    let cd = r.input("cd", &a.cd, Kind::Ratio)?;
    let cv = r.input("cv", &a.cv, Kind::Ratio)?;
    let theta = angle(&mut r, "jet-angle", &a.jet_angle)?;
    let density = r.input("density", &a.density, Kind::Density)?;
    let area = width * opening;
    let flow = if area > 0.0 {
        physics::orifice_flow(cd, area, drop, density)?
    } else {
        0.0
    };
    r.result("port-width", Kind::Length, width);
    r.result(
        "flow-force-gain",
        Kind::Ratio,
        physics::flow_force_constant(cd, cv, theta)?,
    );
    r.result(
        "jet-velocity",
        Kind::Velocity,
        physics::jet_velocity(cv, drop, density)?,
    );
    r.result("flow", Kind::Flow, flow);
    r.result(
        "flow-force",
        Kind::Force,
        physics::steady_flow_force(cd, cv, area, drop, theta)?,
    );
    Ok(r)
}

fn grade_viscosity(a: &GradeViscosityArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "grade-viscosity",
        "ISO 3448:1992, Table 1; derived (ASTM D2270-10(2016) solved for ν₁₀₀, ASTM D341-09(2015))",
    );
    let grade = physics::viscosity_grade(a.grade)?;
    r.plain_input("grade", f64::from(a.grade), format!("ISO VG {}", a.grade));
    let index = r.input("index", &a.index, Kind::Ratio)?;
    let nu_100 = physics::nu_100_for_index(grade.mid_m2_s, index)?;
    let line = physics::WaltherLine::through(313.15, grade.mid_m2_s, 373.15, nu_100)?;
    r.result("viscosity-40-min", Kind::KinematicViscosity, grade.min_m2_s);
    r.result("viscosity-40", Kind::KinematicViscosity, grade.mid_m2_s);
    r.result("viscosity-40-max", Kind::KinematicViscosity, grade.max_m2_s);
    r.result("viscosity-100", Kind::KinematicViscosity, nu_100);
    evaluate_line(&mut r, &line, a.at.as_deref(), a.find.as_deref())?;
    Ok(r)
}

/// Add the viscosity at `--at` and the temperature of `--find` when given.
fn evaluate_line(
    r: &mut Report,
    line: &physics::WaltherLine,
    at: Option<&str>,
    find: Option<&str>,
) -> Result<(), Error> {
    if let Some(t) = r.optional("at", at, Kind::Temperature)? {
        r.result(
            "viscosity-at",
            Kind::KinematicViscosity,
            line.viscosity_at(t)?,
        );
    }
    if let Some(nu) = r.optional("find", find, Kind::KinematicViscosity)? {
        r.result(
            "temperature-for",
            Kind::Temperature,
            line.temperature_at(nu)?,
        );
    }
    Ok(())
}

fn heat_budget(a: &HeatBudgetArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "heat-budget",
        "derived (arithmetic of P = p·Q, Rabie 2009, ch. 1); bypass spill pressure from memory / derived (Cetinkunt 2015, Fig. 7.53(c))",
    );
    let pump = r.input("pump-flow", &a.pump_flow, Kind::Flow)?;
    let set = r.input("set-flow", &a.set_flow, Kind::Flow)?;
    let load = r.input("load-pressure", &a.load_pressure, Kind::Pressure)?;
    let relief = r.input("relief-pressure", &a.relief_pressure, Kind::Pressure)?;
    let drop = r.input("compensator-drop", &a.compensator_drop, Kind::Pressure)?;
    let restrictive = physics::restrictive_heat_budget(pump, set, load, relief)?;
    let bypass = physics::bypass_heat_budget(pump, set, load, drop)?;
    r.result("load-power", Kind::Power, restrictive.load_power_w);
    r.result(
        "restrictive-pump-pressure",
        Kind::Pressure,
        restrictive.pump_pressure_pa,
    );
    r.result(
        "restrictive-relief-heat",
        Kind::Heat,
        restrictive.surplus_heat_w,
    );
    r.result(
        "restrictive-metering-heat",
        Kind::Heat,
        restrictive.metering_heat_w,
    );
    r.result("restrictive-heat", Kind::Heat, restrictive.heat_w);
    r.result(
        "bypass-pump-pressure",
        Kind::Pressure,
        bypass.pump_pressure_pa,
    );
    r.result("bypass-heat", Kind::Heat, bypass.heat_w);
    r.result("heat-saved", Kind::Heat, restrictive.heat_w - bypass.heat_w);
    Ok(r)
}

fn hydraulic_power(a: &HydraulicPowerArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "hydraulic-power",
        "Rabie 2009, ch. 1; unit constants derived",
    );
    let pressure = r.input("pressure", &a.pressure, Kind::Pressure)?;
    let flow = r.input("flow", &a.flow, Kind::Flow)?;
    let power = physics::hydraulic_power(pressure, flow)?;
    r.result("hydraulic-power", Kind::Power, power);
    r.result("heat-equivalent", Kind::Heat, power);
    if let Some(eta) = r.optional("efficiency", a.efficiency.as_deref(), Kind::Fraction)? {
        r.result(
            "input-power",
            Kind::Power,
            physics::input_power(power, eta)?,
        );
    }
    Ok(r)
}

fn intensification(a: &IntensificationArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "intensification",
        "Esposito Ex. 8-6 (meter-out back pressure and capacity); force balance derived",
    );
    let (cap, annulus) = cylinder_areas(
        &mut r,
        a.bore.as_deref(),
        a.rod.as_deref(),
        a.cap_area.as_deref(),
        a.annulus_area.as_deref(),
    )?;
    let load = r.input("load", &a.load, Kind::Force)?;
    let (name, pressure, metered_area) = match (&a.cap_pressure, &a.rod_pressure) {
        (Some(text), _) => {
            let p = r.input("cap-pressure", text, Kind::Pressure)?;
            (
                "rod-pressure",
                physics::meter_out_back_pressure(p, cap, annulus, load)?,
                annulus,
            )
        }
        (None, Some(text)) => {
            let p = r.input("rod-pressure", text, Kind::Pressure)?;
            (
                "cap-pressure",
                physics::retract_back_pressure(p, annulus, cap, load)?,
                cap,
            )
        }
        (None, None) => return Err(missing("--cap-pressure or --rod-pressure")),
    };
    r.result(name, Kind::Pressure, pressure);
    let speed = r.optional("speed", a.speed.as_deref(), Kind::Velocity)?;
    let density = r.optional("density", a.density.as_deref(), Kind::Density)?;
    if let (Some(speed), Some(density)) = (speed, density) {
        let flow = physics::cylinder_flow(speed, metered_area)?;
        let sg = physics::specific_gravity(density, WATER_DENSITY_60F)?;
        r.result("metered-flow", Kind::Flow, flow);
        let capacity = physics::valve_capacity(flow, pressure, sg)?;
        capacity_result(&mut r, "valve-capacity", capacity);
    }
    Ok(r)
}

/// Record a valve capacity (SI m³/(s·√Pa)), shown as Kv in m³/h/√bar or C_v in gpm/√psi.
fn capacity_result(r: &mut Report, name: &str, capacity: f64) {
    let kv = capacity * 3600.0 * 1e5f64.sqrt();
    let cv = capacity / constants::GPM * constants::PSI.sqrt();
    r.custom_result(
        name,
        capacity,
        "m³/(s·√Pa)",
        format!("{} m³/h/√bar", units::format_number(kv)),
        format!("{} gpm/√psi", units::format_number(cv)),
    );
}

/// Cap and annulus areas given directly, or from a bore and rod (then also reported).
fn cylinder_areas(
    r: &mut Report,
    bore: Option<&str>,
    rod: Option<&str>,
    cap_area: Option<&str>,
    annulus_area: Option<&str>,
) -> Result<(f64, f64), Error> {
    match (bore, rod, cap_area, annulus_area) {
        (_, _, Some(cap), Some(annulus)) => Ok((
            r.input("cap-area", cap, Kind::Area)?,
            r.input("annulus-area", annulus, Kind::Area)?,
        )),
        (Some(bore), Some(rod), _, _) => {
            let bore = r.input("bore", bore, Kind::Length)?;
            let rod = r.input("rod", rod, Kind::Length)?;
            let (cap, annulus) = (
                physics::circle_area(bore)?,
                physics::annulus_area(bore, rod)?,
            );
            r.result("cap-area", Kind::Area, cap);
            r.result("annulus-area", Kind::Area, annulus);
            Ok((cap, annulus))
        }
        _ => Err(missing(
            "--bore and --rod, or --cap-area and --annulus-area",
        )),
    }
}

fn leakage(a: &LeakageArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "leakage",
        "Rabie 2009, §2, eq. 2.19, p. 44; eccentricity Rabie 2009, Fig. 2.6",
    );
    let diameter = r.input("diameter", &a.diameter, Kind::Length)?;
    let clearance = r.input("clearance", &a.clearance, Kind::Length)?;
    let length = r.input("length", &a.length, Kind::Length)?;
    let drop = r.input("drop", &a.drop, Kind::Pressure)?;
    let mu = match (&a.dynamic_viscosity, &a.viscosity) {
        (Some(text), _) => r.input("dynamic-viscosity", text, Kind::DynamicViscosity)?,
        (None, Some(text)) => {
            let nu = r.input("viscosity", text, Kind::KinematicViscosity)?;
            let rho = r.input("density", &a.density, Kind::Density)?;
            let mu = physics::dynamic_viscosity(nu, rho)?;
            r.result("dynamic-viscosity", Kind::DynamicViscosity, mu);
            mu
        }
        (None, None) => return Err(missing("--viscosity or --dynamic-viscosity")),
    };
    let factor =
        physics::eccentricity_factor(r.input("eccentricity", &a.eccentricity, Kind::Ratio)?)?;
    let concentric = physics::annular_leakage(diameter, clearance, length, drop, mu)?;
    r.result("leakage", Kind::Flow, concentric * factor);
    Ok(r)
}

fn motor_efficiency(a: &MotorEfficiencyArgs) -> Result<Report, Error> {
    let mut r = Report::new("motor-efficiency", "definitions (ISO 4409 terms)");
    let d = r.input("displacement", &a.displacement, Kind::Displacement)?;
    let flow = r.input("flow", &a.flow, Kind::Flow)?;
    let speed = r.input("speed", &a.speed, Kind::ShaftSpeed)?;
    let drop = r.input("drop", &a.drop, Kind::Pressure)?;
    let torque = r.input("torque", &a.torque, Kind::Torque)?;
    let eta_v = physics::motor_volumetric_efficiency(speed, d, flow)?;
    let eta_m = physics::motor_mechanical_efficiency(torque, drop, d)?;
    let input = physics::hydraulic_power(drop, flow)?;
    let output = physics::shaft_power(torque, speed)?;
    r.result(
        "theoretical-speed",
        Kind::ShaftSpeed,
        physics::motor_speed(flow, d, 1.0)?,
    );
    r.result(
        "theoretical-torque",
        Kind::Torque,
        physics::motor_torque(drop, d, 1.0)?,
    );
    r.result("volumetric-efficiency", Kind::Fraction, eta_v);
    r.result("mechanical-efficiency", Kind::Fraction, eta_m);
    r.result(
        "overall-efficiency",
        Kind::Fraction,
        physics::overall_efficiency(eta_v, eta_m)?,
    );
    r.result("input-power", Kind::Power, input);
    r.result("output-power", Kind::Power, output);
    r.result("heat", Kind::Heat, input - output);
    Ok(r)
}

fn motor_frequency(a: &MotorFrequencyArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "motor-frequency",
        "derived (rotational analogue of the cylinder case); Merritt 1967, ch. 6 (from memory)",
    );
    let d = r.input("displacement", &a.displacement, Kind::Displacement)?;
    let volume = r.input("volume", &a.volume, Kind::Volume)?;
    let inertia = r.input("inertia", &a.inertia, Kind::Inertia)?;
    let bulk = r.input("bulk-modulus", &a.bulk_modulus, Kind::Modulus)?;
    let f = physics::motor_natural_frequency(bulk, d, volume, inertia)?;
    r.result("natural-frequency", Kind::Frequency, f);
    Ok(r)
}

fn motor_speed(a: &MotorSpeedArgs) -> Result<Report, Error> {
    let mut r = Report::new("motor-speed", "derived (definition of displacement)");
    let flow = r.input("flow", &a.flow, Kind::Flow)?;
    let d = r.input("displacement", &a.displacement, Kind::Displacement)?;
    let eta = r.input(
        "volumetric-efficiency",
        &a.volumetric_efficiency,
        Kind::Fraction,
    )?;
    r.result(
        "speed",
        Kind::ShaftSpeed,
        physics::motor_speed(flow, d, eta)?,
    );
    Ok(r)
}

fn motor_torque(a: &MotorTorqueArgs) -> Result<Report, Error> {
    let mut r = Report::new("motor-torque", "derived (definition of displacement)");
    let drop = r.input("drop", &a.drop, Kind::Pressure)?;
    let d = r.input("displacement", &a.displacement, Kind::Displacement)?;
    let eta = r.input(
        "mechanical-efficiency",
        &a.mechanical_efficiency,
        Kind::Fraction,
    )?;
    let torque = physics::motor_torque(drop, d, eta)?;
    r.result("torque", Kind::Torque, torque);
    if let Some(speed) = r.optional("speed", a.speed.as_deref(), Kind::ShaftSpeed)? {
        r.result(
            "output-power",
            Kind::Power,
            physics::shaft_power(torque, speed)?,
        );
    }
    Ok(r)
}

fn natural_frequency(a: &NaturalFrequencyArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "natural-frequency",
        "derived (oil columns as parallel springs); Merritt 1967 (from memory); Stringer 1976",
    );
    let (cap, annulus) = cylinder_areas(
        &mut r,
        a.bore.as_deref(),
        a.rod.as_deref(),
        a.cap_area.as_deref(),
        a.annulus_area.as_deref(),
    )?;
    let (v1, v2) = match (&a.cap_volume, &a.rod_volume, &a.stroke) {
        (Some(v1), Some(v2), _) => (
            r.input("cap-volume", v1, Kind::Volume)?,
            r.input("rod-volume", v2, Kind::Volume)?,
        ),
        (_, _, Some(stroke)) => {
            let stroke = r.input("stroke", stroke, Kind::Length)?;
            let position = r.optional("position", a.position.as_deref(), Kind::Length)?;
            let dead1 = r.input("cap-dead-volume", &a.cap_dead_volume, Kind::Volume)?;
            let dead2 = r.input("rod-dead-volume", &a.rod_dead_volume, Kind::Volume)?;
            let x = position.unwrap_or(stroke / 2.0);
            physics::chamber_volumes(cap, annulus, stroke, x, dead1, dead2)?
        }
        _ => return Err(missing("--stroke, or --cap-volume and --rod-volume")),
    };
    let mass = r.input("mass", &a.mass, Kind::Mass)?;
    let bulk = r.input("bulk-modulus", &a.bulk_modulus, Kind::Modulus)?;
    let stiffness =
        physics::chamber_stiffness(bulk, cap, v1)? + physics::chamber_stiffness(bulk, annulus, v2)?;
    r.result("cap-volume", Kind::Volume, v1);
    r.result("rod-volume", Kind::Volume, v2);
    r.result("stiffness", Kind::Stiffness, stiffness);
    r.result(
        "natural-frequency",
        Kind::Frequency,
        physics::natural_frequency(stiffness, mass)?,
    );
    Ok(r)
}

fn orifice_constant(a: &OrificeConstantArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "orifice-constant",
        "derived (exact unit factors, NIST SP 811 B.8)",
    );
    let rho_w = r.input("water-density", &a.water_density, Kind::Density)?;
    r.result(
        "orifice-constant",
        Kind::Ratio,
        physics::us_orifice_constant(rho_w)?,
    );
    Ok(r)
}

fn orifice_flow(a: &OrificeFlowArgs) -> Result<Report, Error> {
    let source = if a.us_constant.is_some() {
        "Esposito Ex. 8-4 (US form with a stated constant); Rabie 2009, eq. 2.34–2.37, p. 50"
    } else {
        "Rabie 2009, eq. 2.34–2.37, p. 50"
    };
    let mut r = Report::new("orifice-flow", source);
    let area = match (&a.area, &a.diameter) {
        (Some(text), _) => r.input("area", text, Kind::Area)?,
        (None, Some(text)) => {
            let area = physics::circle_area(r.input("diameter", text, Kind::Length)?)?;
            r.result("area", Kind::Area, area);
            area
        }
        (None, None) => return Err(missing("--area or --diameter")),
    };
    let cd = r.input("cd", &a.cd, Kind::Ratio)?;
    let drop = r.input("drop", &a.drop, Kind::Pressure)?;
    let mut density = r.input("density", &a.density, Kind::Density)?;
    if let Some(k) = r.optional("us-constant", a.us_constant.as_deref(), Kind::Ratio)? {
        // The US form divides by SG; the SI equation with the water density that K
        // implies gives the same flow.
        let sg = physics::specific_gravity(density, WATER_DENSITY_60F)?;
        density = sg * physics::water_density_for_constant(k)?;
    }
    r.result(
        "flow",
        Kind::Flow,
        physics::orifice_flow(cd, area, drop, density)?,
    );
    Ok(r)
}

fn throttling_heat(a: &ThrottlingHeatArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "throttling-heat",
        "derived (steady-flow energy balance); c_p Rabie 2009, §2.2.12, p. 68",
    );
    let drop = r.input("drop", &a.drop, Kind::Pressure)?;
    let density = r.input("density", &a.density, Kind::Density)?;
    let cp = r.input("specific-heat", &a.specific_heat, Kind::SpecificHeat)?;
    let rise = physics::throttling_temperature_rise(drop, density, cp)?;
    r.result("temperature-rise", Kind::TemperatureDifference, rise);
    if let Some(flow) = r.optional("flow", a.flow.as_deref(), Kind::Flow)? {
        r.result("heat", Kind::Heat, physics::throttling_heat(drop, flow)?);
    }
    if let Some(t) = r.optional(
        "inlet-temperature",
        a.inlet_temperature.as_deref(),
        Kind::Temperature,
    )? {
        r.result("outlet-temperature", Kind::Temperature, t + rise);
    }
    Ok(r)
}

fn viscosity_at(a: &ViscosityAtArgs) -> Result<Report, Error> {
    let mut r = Report::new("viscosity-at", "ASTM D341-09(2015)");
    let t1 = r.input("temperature-1", &a.temperature_1, Kind::Temperature)?;
    let nu1 = r.input("viscosity-1", &a.viscosity_1, Kind::KinematicViscosity)?;
    let t2 = r.input("temperature-2", &a.temperature_2, Kind::Temperature)?;
    let nu2 = r.input("viscosity-2", &a.viscosity_2, Kind::KinematicViscosity)?;
    let line = physics::WaltherLine::through(t1, nu1, t2, nu2)?;
    r.result("constant-a", Kind::Ratio, line.a());
    r.result("constant-b", Kind::Ratio, line.b());
    evaluate_line(&mut r, &line, a.at.as_deref(), a.find.as_deref())?;
    Ok(r)
}

fn viscosity_index(a: &ViscosityIndexArgs) -> Result<Report, Error> {
    let mut r = Report::new(
        "viscosity-index",
        "ASTM D2270-10(2016) via `chemicals` 1.5.2",
    );
    let u = r.input("viscosity-40", &a.viscosity_40, Kind::KinematicViscosity)?;
    let y = r.input("viscosity-100", &a.viscosity_100, Kind::KinematicViscosity)?;
    let (low, high) = physics::reference_viscosities(y)?;
    r.result("reference-l", Kind::KinematicViscosity, low);
    r.result("reference-h", Kind::KinematicViscosity, high);
    r.result(
        "viscosity-index",
        Kind::Ratio,
        physics::viscosity_index(u, y)?,
    );
    r.result(
        "reported-viscosity-index",
        Kind::Ratio,
        physics::reported_viscosity_index(u, y)?,
    );
    Ok(r)
}

/// Read an angle: a bare number is in degrees; `deg` and `rad` are understood.
fn angle(r: &mut Report, option: &str, text: &str) -> Result<f64, Error> {
    let bad = |err: units::UnitError| Error::Input {
        option: format!("--{option}"),
        message: err.to_string(),
    };
    let (number, unit) = units::split_number(text).map_err(bad)?;
    let radians = if unit.is_empty() {
        number.to_radians()
    } else {
        // Angles are fractions of a revolution to the units module.
        units::parse_as(text, Kind::Ratio).map_err(bad)?.si() * 2.0 * PI
    };
    r.angle_input(option, radians);
    Ok(radians)
}

/// An error for a combination of options that clap lets through but the
/// calculation cannot use.
fn missing(what: &str) -> Error {
    Error::Input {
        option: "calc".to_string(),
        message: format!("give {what}"),
    }
}
