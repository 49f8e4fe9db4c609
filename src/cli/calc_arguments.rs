//! Arguments of `spoolsleuth calc` (clap derive structs only).
//!
//! Every reading is taken as text and parsed with its unit by the units
//! module, so `--flow "10 gpm"` and `--flow "37.85 L/min"` are the same input.

use clap::{Args, Subcommand, ValueEnum};

/// Options shared by every calculation, then the calculation itself.
#[derive(Debug, Args)]
pub struct CalcArguments {
    /// Which calculation to run.
    #[command(subcommand)]
    pub calculation: Calculation,
    /// Print a JSON object with SI values instead of a table.
    #[arg(long, global = true)]
    pub json: bool,
}

/// How entrained gas is compressed.
#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum ProcessChoice {
    /// Fast compression, polytropic index 1.4.
    Adiabatic,
    /// Slow compression at constant temperature, index 1.
    Isothermal,
}

/// The calculations, sorted by name.
#[derive(Debug, Subcommand)]
pub enum Calculation {
    /// Effective bulk modulus of oil with entrained air and compliant lines
    ///
    /// 1/β_e = 1/β_c + 1/β_oil + (V_g/V_t)/(n·p_abs), with the free-air fraction x₀
    /// measured at atmospheric pressure compressed first: V_g = x₀·(p_atm/p_abs)^(1/n).
    /// n = 1 isothermal, 1.4 adiabatic.
    ///
    /// Source: derived (series form); Rabie 2009, §2.2.3, eq. 2.57, p. 55 (gas–liquid mixture).
    ///
    /// Example: spoolsleuth calc bulk-modulus --pressure "10 bar" --air "1 %"
    #[command(verbatim_doc_comment)]
    BulkModulus(BulkModulusArgs),
    /// Volume of oil that must enter a line before its pressure rises
    ///
    /// ΔV = V·Δp/β_e: the oil that has to be pushed in before pressure builds, and that
    /// comes back out as a lunge when a loaded line is opened.
    ///
    /// Source: derived (definition of bulk modulus).
    ///
    /// Example: spoolsleuth calc compressed-volume --volume "2 L" --pressure-rise "100 bar" --bulk-modulus "1 GPa"
    #[command(verbatim_doc_comment)]
    CompressedVolume(CompressedVolumeArgs),
    /// Metering drop a compensator holds, and its drift between two operating points
    ///
    /// Δp_m = [F₀ + k·s − F_flow]/A_s, F_flow = ρ·Q·C_v·√(2·Δp_c/ρ)·cos θ, F₀ = setting·A_s.
    /// A relative change e of Δp_m changes the flow by √(1 + e) − 1.
    ///
    /// Source: derived (own model); flow force Vacca §3.8.1 (momentum form).
    ///
    /// Example: spoolsleuth calc compensator --spool-diameter "10 mm" --setting "8 bar" --spring-rate "5 N/mm" --flow "10 L/min" --compensator-drop "10 bar" --stroke "0.5 mm" --compare-drop "200 bar" --compare-stroke "1.5 mm"
    #[command(verbatim_doc_comment)]
    Compensator(CompensatorArgs),
    /// Cylinder areas and rod speeds, extending and retracting
    ///
    /// A_cap = π·D²/4, A_ann = π·(D² − d²)/4, v = Q/A.
    ///
    /// Source: derived (continuity; Rabie 2009, Example 2.1, p. 60).
    ///
    /// Example: spoolsleuth calc cylinder-speed --bore "4 in" --rod "2.5 in" --flow "10 gpm"
    #[command(verbatim_doc_comment)]
    CylinderSpeed(CylinderSpeedArgs),
    /// Oil density at another temperature (and pressure)
    ///
    /// ρ(T) = ρ₀/(1 + α·(T − T₀)); under pressure ρ·(1 + p/B).
    ///
    /// Source: Rabie 2009, §2.2.4, eq. 2.81, p. 60; pressure term Vacca 2021, §2.5.
    ///
    /// Example: spoolsleuth calc density-at --density "870 kg/m^3" --temperature "60 degC"
    #[command(verbatim_doc_comment)]
    DensityAt(DensityAtArgs),
    /// Steady flow force on a metering spool
    ///
    /// F_s = 2·C_d·C_v·w·x·Δp·cos θ, acting to close the opening; the gain 2·C_d·C_v·cos θ
    /// is 0.4285 for C_d 0.61, C_v 0.98, θ 69°.
    ///
    /// Source: Merritt 1967, ch. 4 (from memory for the exact section); Vacca §3.8.1 (momentum form).
    ///
    /// Example: spoolsleuth calc flow-force --spool-diameter "10 mm" --opening "0.2 mm" --drop "50 bar"
    #[command(verbatim_doc_comment)]
    FlowForce(FlowForceArgs),
    /// ISO grade limits, the 100 °C viscosity for a VI, and viscosity at a temperature
    ///
    /// ν₄₀ from ISO 3448; ν₁₀₀ solves VI(ν₄₀, ν₁₀₀) = target (ASTM D2270); other
    /// temperatures from the ASTM D341 line through both points.
    ///
    /// Source: ISO 3448:1992, Table 1; derived (ASTM D2270-10(2016) solved for ν₁₀₀, ASTM D341-09(2015)).
    ///
    /// Example: spoolsleuth calc grade-viscosity --grade 46 --index 100 --at "60 degC"
    #[command(verbatim_doc_comment)]
    GradeViscosity(GradeViscosityArgs),
    /// Heat of a restrictive against a bypass compensated flow control on a fixed pump
    ///
    /// Restrictive (2-way): surplus over the relief at p_relief, metered flow dropped
    /// from p_relief to p_load. Bypass (3-way): pump at p_load + Δp_comp, surplus
    /// spilled at that pressure. Heat = pump power − load power.
    ///
    /// Source: derived (arithmetic of P = p·Q, Rabie 2009, ch. 1); bypass spill pressure from memory / derived (Cetinkunt 2015, Fig. 7.53(c)).
    ///
    /// Example: spoolsleuth calc heat-budget --pump-flow "40 L/min" --set-flow "20 L/min" --load-pressure "100 bar" --relief-pressure "210 bar" --compensator-drop "8 bar"
    #[command(verbatim_doc_comment)]
    HeatBudget(HeatBudgetArgs),
    /// Hydraulic power of a pressure and a flow
    ///
    /// P = p·Q (P[kW] = p[bar]·Q[L/min]/600; P[hp] = p[psi]·Q[gpm]/1714.29);
    /// with an overall efficiency, input power P/η.
    ///
    /// Source: Rabie 2009, ch. 1; unit constants derived.
    ///
    /// Example: spoolsleuth calc hydraulic-power --pressure "2000 psi" --flow "20 gpm"
    #[command(verbatim_doc_comment)]
    HydraulicPower(HydraulicPowerArgs),
    /// Pressure on the metered or blocked side of a cylinder (intensification)
    ///
    /// Extending, rod side metered: p_rod = (p_cap·A_cap − F)/A_ann.
    /// Retracting, cap side metered: p_cap = (p_rod·A_ann − F)/A_cap.
    /// F opposes the motion (negative when overrunning). With --speed and --density,
    /// the metered flow Q = A·v and the needle-valve capacity Q/√(Δp/SG).
    ///
    /// Source: Esposito Ex. 8-6 (meter-out back pressure and capacity); force balance derived.
    ///
    /// Example: spoolsleuth calc intensification --bore "4 in" --rod "2.5 in" --cap-pressure "1500 psi"
    #[command(verbatim_doc_comment)]
    Intensification(IntensificationArgs),
    /// Laminar leakage through the annular gap around a spool or piston
    ///
    /// Q_L = π·D·c³·Δp/(12·μ·L)·(1 + 1.5·ε²), μ = ν·ρ.
    ///
    /// Source: Rabie 2009, §2, eq. 2.19, p. 44; eccentricity Rabie 2009, Fig. 2.6.
    ///
    /// Example: spoolsleuth calc leakage --diameter "10 mm" --clearance "5 um" --length "10 mm" --drop "100 bar" --viscosity "46 cSt" --density "855 kg/m^3"
    #[command(verbatim_doc_comment)]
    Leakage(LeakageArgs),
    /// Volumetric, mechanical and overall efficiency of a motor from field readings
    ///
    /// η_v = n·D/Q, η_m = T/(Δp·D/2π), η_o = η_v·η_m; heat = p·Q − 2π·n·T.
    ///
    /// Source: definitions (ISO 4409 terms).
    ///
    /// Example: spoolsleuth calc motor-efficiency --displacement "3 in^3/rev" --flow "15 gpm" --speed "1080 rpm" --drop "1750 psi" --torque "790 lbf*in"
    #[command(verbatim_doc_comment)]
    MotorEfficiency(MotorEfficiencyArgs),
    /// Hydraulic natural frequency of a motor driving an inertia
    ///
    /// ω_h = √(4·β_e·D_m²/(V_t·J)), D_m = D/(2π) per radian, half of V_t in each line.
    ///
    /// Source: derived (rotational analogue of the cylinder case); Merritt 1967, ch. 6 (from memory).
    ///
    /// Example: spoolsleuth calc motor-frequency --displacement "50 cm^3/rev" --volume "1 L" --inertia "0.5 kg*m^2" --bulk-modulus "1.2 GPa"
    #[command(verbatim_doc_comment)]
    MotorFrequency(MotorFrequencyArgs),
    /// Motor shaft speed from flow and displacement
    ///
    /// n = Q·η_v/D (n[rpm] = 1000·Q[L/min]·η_v/D[cm³/rev] = 231·Q[gpm]·η_v/D[in³/rev]).
    ///
    /// Source: derived (definition of displacement).
    ///
    /// Example: spoolsleuth calc motor-speed --flow "6 gpm" --displacement "0.75 in^3/rev"
    #[command(verbatim_doc_comment)]
    MotorSpeed(MotorSpeedArgs),
    /// Motor torque from pressure drop and displacement
    ///
    /// T = Δp·D·η_m/(2π); with --speed, output power 2π·n·T.
    ///
    /// Source: derived (definition of displacement).
    ///
    /// Example: spoolsleuth calc motor-torque --drop "2000 psi" --displacement "2.5 in^3/rev"
    #[command(verbatim_doc_comment)]
    MotorTorque(MotorTorqueArgs),
    /// Hydraulic natural frequency of a cylinder moving a mass
    ///
    /// k_h = β_e·(A₁²/V₁ + A₂²/V₂), f_n = √(k_h/m)/(2π), V₁ = A₁·x + V₀₁, V₂ = A₂·(S − x) + V₀₂.
    ///
    /// Source: derived (oil columns as parallel springs); Merritt 1967 (from memory); lowest at V₁ = V₂ (Stringer 1976).
    ///
    /// Example: spoolsleuth calc natural-frequency --bore "4 in" --rod "2.5 in" --stroke "12 in" --mass "1000 lb" --bulk-modulus "180000 psi"
    #[command(verbatim_doc_comment)]
    NaturalFrequency(NaturalFrequencyArgs),
    /// The constant K of the US orifice form Q[gpm] = K·C_d·A[in²]·√(Δp[psi]/SG)
    ///
    /// K = (in² → m²)·√(2·psi/ρ_w)/(gpm → m³/s); 37.973 for ρ_w = 1000 kg/m³
    /// (textbooks round it to 38.1).
    ///
    /// Source: derived (exact unit factors, NIST SP 811 B.8).
    ///
    /// Example: spoolsleuth calc orifice-constant --water-density "1000 kg/m^3"
    #[command(verbatim_doc_comment)]
    OrificeConstant(OrificeConstantArgs),
    /// Flow through a sharp-edged orifice
    ///
    /// Q = C_d·A·√(2·Δp/ρ). With --us-constant K, the US form
    /// Q[gpm] = K·C_d·A[in²]·√(Δp[psi]/SG) instead, SG against water at 60 °F.
    ///
    /// Source: Rabie 2009, eq. 2.34–2.37, p. 50; US form Esposito Ex. 8-4.
    ///
    /// Example: spoolsleuth calc orifice-flow --diameter "2 mm" --cd 0.62 --drop "10 bar" --density "870 kg/m^3"
    #[command(verbatim_doc_comment)]
    OrificeFlow(OrificeFlowArgs),
    /// Oil temperature rise and heat from throttling (relief, compensator, orifice)
    ///
    /// ΔT = Δp/(ρ·c_p), independent of flow; heat H = Δp·Q.
    ///
    /// Source: derived (steady-flow energy balance); c_p 2060 J/(kg·K) Rabie 2009, §2.2.12, p. 68.
    ///
    /// Example: spoolsleuth calc throttling-heat --drop "100 bar" --flow "20 L/min"
    #[command(verbatim_doc_comment)]
    ThrottlingHeat(ThrottlingHeatArgs),
    /// Viscosity at a temperature from two measured points (ASTM D341)
    ///
    /// log₁₀ log₁₀ Z = A − B·log₁₀ T, Z = ν + 0.7 + exp(−1.47 − 1.84ν − 0.51ν²), T in K, ν in cSt.
    ///
    /// Source: ASTM D341-09(2015).
    ///
    /// Example: spoolsleuth calc viscosity-at --viscosity-1 "46 cSt" --viscosity-2 "6.8 cSt" --at "60 degC"
    #[command(verbatim_doc_comment)]
    ViscosityAt(ViscosityAtArgs),
    /// Viscosity index from the 40 °C and 100 °C viscosities (ASTM D2270)
    ///
    /// VI = 100·(L − U)/(L − H) up to 100; above, N = (log H − log U)/log Y and
    /// VI = (10^N − 1)/0.00715 + 100. L and H from the standard's table (Y ≤ 70 cSt).
    ///
    /// Source: ASTM D2270-10(2016) via `chemicals` 1.5.2.
    ///
    /// Example: spoolsleuth calc viscosity-index --viscosity-40 "46 cSt" --viscosity-100 "6.8 cSt"
    #[command(verbatim_doc_comment)]
    ViscosityIndex(ViscosityIndexArgs),
}

/// Inputs of `calc bulk-modulus`.
#[derive(Debug, Args)]
pub struct BulkModulusArgs {
    /// Free (entrained) air by volume at atmospheric pressure, e.g. "1 %"
    #[arg(long, value_name = "FRACTION")]
    pub air: String,
    /// Local atmospheric pressure (absolute)
    #[arg(long, default_value = "101.325 kPa", value_name = "PRESSURE")]
    pub atmosphere: String,
    /// Bulk modulus of the hose or tube, e.g. "20.7 GPa" (rigid if left out)
    #[arg(long, value_name = "MODULUS")]
    pub container_modulus: Option<String>,
    /// Bulk modulus of the air-free oil
    #[arg(long, default_value = "1.5 GPa", value_name = "MODULUS")]
    pub oil_modulus: String,
    /// Operating pressure (gauge)
    #[arg(long, value_name = "PRESSURE")]
    pub pressure: String,
    /// How the air is compressed
    #[arg(long, value_enum, default_value = "isothermal")]
    pub process: ProcessChoice,
}

/// Inputs of `calc compressed-volume`.
#[derive(Debug, Args)]
pub struct CompressedVolumeArgs {
    /// Effective bulk modulus of the oil in the line
    #[arg(long, value_name = "MODULUS")]
    pub bulk_modulus: String,
    /// Pressure rise
    #[arg(long, value_name = "PRESSURE")]
    pub pressure_rise: String,
    /// Oil volume between valve and actuator
    #[arg(long, value_name = "VOLUME")]
    pub volume: String,
}

/// Inputs of `calc compensator`.
#[derive(Debug, Args)]
pub struct CompensatorArgs {
    /// Compensator drop at a second operating point
    #[arg(long, requires = "compare_stroke", value_name = "PRESSURE")]
    pub compare_drop: Option<String>,
    /// Closing stroke at the second operating point
    #[arg(long, requires = "compare_drop", value_name = "LENGTH")]
    pub compare_stroke: Option<String>,
    /// The compensator's own drop p₁ − p₂ (supply minus metering inlet)
    #[arg(long, value_name = "PRESSURE")]
    pub compensator_drop: String,
    /// Velocity coefficient of the throttling edge
    #[arg(long, default_value = "0.98", value_name = "RATIO")]
    pub cv: String,
    /// Oil density, or a specific gravity such as 0.87
    #[arg(long, default_value = "870 kg/m^3", value_name = "DENSITY")]
    pub density: String,
    /// Metered flow
    #[arg(long, value_name = "FLOW")]
    pub flow: String,
    /// Jet angle at the throttling edge (a bare number is in degrees)
    #[arg(long, default_value = "69 deg", value_name = "ANGLE")]
    pub jet_angle: String,
    /// Spring force with the spool fully open (instead of --setting)
    #[arg(
        long,
        conflicts_with = "setting",
        required_unless_present = "setting",
        value_name = "FORCE"
    )]
    pub preload: Option<String>,
    /// Metering drop the spring sets with no flow force (instead of --preload)
    #[arg(long, value_name = "PRESSURE")]
    pub setting: Option<String>,
    /// Spool end area (instead of --spool-diameter)
    #[arg(
        long,
        conflicts_with = "spool_diameter",
        required_unless_present = "spool_diameter",
        value_name = "AREA"
    )]
    pub spool_area: Option<String>,
    /// Spool diameter (instead of --spool-area)
    #[arg(long, value_name = "LENGTH")]
    pub spool_diameter: Option<String>,
    /// Spring rate
    #[arg(long, value_name = "RATE")]
    pub spring_rate: String,
    /// Closing stroke of the spool at this operating point
    #[arg(long, value_name = "LENGTH")]
    pub stroke: String,
}

/// Inputs of `calc cylinder-speed`.
#[derive(Debug, Args)]
pub struct CylinderSpeedArgs {
    /// Bore (piston diameter)
    #[arg(long, value_name = "LENGTH")]
    pub bore: String,
    /// Flow into the cylinder
    #[arg(long, value_name = "FLOW")]
    pub flow: String,
    /// Rod diameter
    #[arg(long, value_name = "LENGTH")]
    pub rod: String,
}

/// Inputs of `calc density-at`.
#[derive(Debug, Args)]
pub struct DensityAtArgs {
    /// Secant bulk modulus for the pressure term
    #[arg(long, default_value = "1.43 GPa", value_name = "MODULUS")]
    pub bulk_modulus: String,
    /// Density at the reference temperature, or a specific gravity such as 0.87
    #[arg(long, value_name = "DENSITY")]
    pub density: String,
    /// Volumetric thermal expansion coefficient
    #[arg(long, default_value = "0.0007 1/K", value_name = "EXPANSION")]
    pub expansion: String,
    /// Pressure (gauge) at which to give the density
    #[arg(long, value_name = "PRESSURE")]
    pub pressure: Option<String>,
    /// Temperature the density was measured at
    #[arg(long, default_value = "15 degC", value_name = "TEMPERATURE")]
    pub reference_temperature: String,
    /// Temperature at which to give the density
    #[arg(long, value_name = "TEMPERATURE")]
    pub temperature: String,
}

/// Inputs of `calc flow-force`.
#[derive(Debug, Args)]
pub struct FlowForceArgs {
    /// Discharge coefficient
    #[arg(long, default_value = "0.61", value_name = "RATIO")]
    pub cd: String,
    /// Velocity coefficient
    #[arg(long, default_value = "0.98", value_name = "RATIO")]
    pub cv: String,
    /// Oil density, or a specific gravity such as 0.87
    #[arg(long, default_value = "870 kg/m^3", value_name = "DENSITY")]
    pub density: String,
    /// Pressure drop across the opening
    #[arg(long, value_name = "PRESSURE")]
    pub drop: String,
    /// Jet angle (a bare number is in degrees)
    #[arg(long, default_value = "69 deg", value_name = "ANGLE")]
    pub jet_angle: String,
    /// Axial opening x of the metering edge
    #[arg(long, value_name = "LENGTH")]
    pub opening: String,
    /// Spool diameter, metering round the full periphery (instead of --width)
    #[arg(
        long,
        conflicts_with = "width",
        required_unless_present = "width",
        value_name = "LENGTH"
    )]
    pub spool_diameter: Option<String>,
    /// Port width w (instead of --spool-diameter)
    #[arg(long, value_name = "LENGTH")]
    pub width: Option<String>,
}

/// Inputs of `calc grade-viscosity`.
#[derive(Debug, Args)]
pub struct GradeViscosityArgs {
    /// Temperature at which to give the viscosity
    #[arg(long, value_name = "TEMPERATURE")]
    pub at: Option<String>,
    /// Viscosity whose temperature to find, e.g. "20 cSt"
    #[arg(long, value_name = "VISCOSITY")]
    pub find: Option<String>,
    /// ISO 3448 viscosity grade number, e.g. 46
    #[arg(long, value_name = "VG")]
    pub grade: u32,
    /// Viscosity index of the oil
    #[arg(long, default_value = "100", value_name = "VI")]
    pub index: String,
}

/// Inputs of `calc heat-budget`.
#[derive(Debug, Args)]
pub struct HeatBudgetArgs {
    /// Drop the bypass compensator holds over the metering orifice
    #[arg(long, value_name = "PRESSURE")]
    pub compensator_drop: String,
    /// Load pressure
    #[arg(long, value_name = "PRESSURE")]
    pub load_pressure: String,
    /// Fixed pump flow
    #[arg(long, value_name = "FLOW")]
    pub pump_flow: String,
    /// Relief valve setting
    #[arg(long, value_name = "PRESSURE")]
    pub relief_pressure: String,
    /// Flow the valve is set to
    #[arg(long, value_name = "FLOW")]
    pub set_flow: String,
}

/// Inputs of `calc hydraulic-power`.
#[derive(Debug, Args)]
pub struct HydraulicPowerArgs {
    /// Overall efficiency of the pump and drive, e.g. "85 %"
    #[arg(long, value_name = "FRACTION")]
    pub efficiency: Option<String>,
    /// Flow
    #[arg(long, value_name = "FLOW")]
    pub flow: String,
    /// Pressure
    #[arg(long, value_name = "PRESSURE")]
    pub pressure: String,
}

/// Inputs of `calc intensification`.
#[derive(Debug, Args)]
pub struct IntensificationArgs {
    /// Annulus (rod-side) area (with --cap-area, instead of --bore and --rod)
    #[arg(long, requires = "cap_area", conflicts_with_all = ["bore", "rod"], value_name = "AREA")]
    pub annulus_area: Option<String>,
    /// Bore (piston diameter)
    #[arg(
        long,
        requires = "rod",
        required_unless_present = "cap_area",
        value_name = "LENGTH"
    )]
    pub bore: Option<String>,
    /// Cap-side area (with --annulus-area, instead of --bore and --rod)
    #[arg(long, requires = "annulus_area", conflicts_with_all = ["bore", "rod"], value_name = "AREA")]
    pub cap_area: Option<String>,
    /// Cap-side pressure while extending (the rod side is metered or blocked)
    #[arg(
        long,
        conflicts_with = "rod_pressure",
        required_unless_present = "rod_pressure",
        value_name = "PRESSURE"
    )]
    pub cap_pressure: Option<String>,
    /// Oil density or specific gravity, for the needle-valve capacity (with --speed)
    #[arg(long, requires = "speed", value_name = "DENSITY")]
    pub density: Option<String>,
    /// Load opposing the motion; negative when it aids it (overrunning)
    #[arg(
        long,
        default_value = "0 N",
        allow_hyphen_values = true,
        value_name = "FORCE"
    )]
    pub load: String,
    /// Rod diameter
    #[arg(long, requires = "bore", value_name = "LENGTH")]
    pub rod: Option<String>,
    /// Rod-side pressure while retracting (the cap side is metered or blocked)
    #[arg(long, value_name = "PRESSURE")]
    pub rod_pressure: Option<String>,
    /// Rod speed, for the metered flow and the needle-valve capacity
    #[arg(long, requires = "density", value_name = "VELOCITY")]
    pub speed: Option<String>,
}

/// Inputs of `calc leakage`.
#[derive(Debug, Args)]
pub struct LeakageArgs {
    /// Radial clearance c
    #[arg(long, value_name = "LENGTH")]
    pub clearance: String,
    /// Oil density, with --viscosity
    #[arg(long, default_value = "870 kg/m^3", value_name = "DENSITY")]
    pub density: String,
    /// Spool or piston diameter
    #[arg(long, value_name = "LENGTH")]
    pub diameter: String,
    /// Pressure drop along the gap
    #[arg(long, value_name = "PRESSURE")]
    pub drop: String,
    /// Dynamic viscosity (instead of --viscosity)
    #[arg(
        long,
        conflicts_with = "viscosity",
        required_unless_present = "viscosity",
        value_name = "VISCOSITY"
    )]
    pub dynamic_viscosity: Option<String>,
    /// Eccentricity ratio, 0 centred to 1 touching
    #[arg(long, default_value = "0", value_name = "RATIO")]
    pub eccentricity: String,
    /// Length of the sealing land
    #[arg(long, value_name = "LENGTH")]
    pub length: String,
    /// Kinematic viscosity at the running temperature (instead of --dynamic-viscosity)
    #[arg(long, value_name = "VISCOSITY")]
    pub viscosity: Option<String>,
}

/// Inputs of `calc motor-efficiency`.
#[derive(Debug, Args)]
pub struct MotorEfficiencyArgs {
    /// Motor displacement per revolution
    #[arg(long, value_name = "DISPLACEMENT")]
    pub displacement: String,
    /// Pressure drop across the motor
    #[arg(long, value_name = "PRESSURE")]
    pub drop: String,
    /// Flow into the motor
    #[arg(long, value_name = "FLOW")]
    pub flow: String,
    /// Measured shaft speed
    #[arg(long, value_name = "SPEED")]
    pub speed: String,
    /// Measured output torque
    #[arg(long, value_name = "TORQUE")]
    pub torque: String,
}

/// Inputs of `calc motor-frequency`.
#[derive(Debug, Args)]
pub struct MotorFrequencyArgs {
    /// Effective bulk modulus
    #[arg(long, value_name = "MODULUS")]
    pub bulk_modulus: String,
    /// Motor displacement per revolution
    #[arg(long, value_name = "DISPLACEMENT")]
    pub displacement: String,
    /// Load inertia on the shaft
    #[arg(long, value_name = "INERTIA")]
    pub inertia: String,
    /// Total oil volume of both motor lines
    #[arg(long, value_name = "VOLUME")]
    pub volume: String,
}

/// Inputs of `calc motor-speed`.
#[derive(Debug, Args)]
pub struct MotorSpeedArgs {
    /// Motor displacement per revolution
    #[arg(long, value_name = "DISPLACEMENT")]
    pub displacement: String,
    /// Flow into the motor
    #[arg(long, value_name = "FLOW")]
    pub flow: String,
    /// Volumetric efficiency, e.g. "95 %"
    #[arg(long, default_value = "100 %", value_name = "FRACTION")]
    pub volumetric_efficiency: String,
}

/// Inputs of `calc motor-torque`.
#[derive(Debug, Args)]
pub struct MotorTorqueArgs {
    /// Motor displacement per revolution
    #[arg(long, value_name = "DISPLACEMENT")]
    pub displacement: String,
    /// Pressure drop across the motor
    #[arg(long, value_name = "PRESSURE")]
    pub drop: String,
    /// Mechanical efficiency, e.g. "92 %"
    #[arg(long, default_value = "100 %", value_name = "FRACTION")]
    pub mechanical_efficiency: String,
    /// Shaft speed, for the output power
    #[arg(long, value_name = "SPEED")]
    pub speed: Option<String>,
}

/// Inputs of `calc natural-frequency`.
#[derive(Debug, Args)]
pub struct NaturalFrequencyArgs {
    /// Annulus (rod-side) area (with --cap-area, instead of --bore and --rod)
    #[arg(long, requires = "cap_area", conflicts_with_all = ["bore", "rod"], value_name = "AREA")]
    pub annulus_area: Option<String>,
    /// Bore (piston diameter)
    #[arg(
        long,
        requires = "rod",
        required_unless_present = "cap_area",
        value_name = "LENGTH"
    )]
    pub bore: Option<String>,
    /// Effective bulk modulus
    #[arg(long, value_name = "MODULUS")]
    pub bulk_modulus: String,
    /// Cap-side area (with --annulus-area, instead of --bore and --rod)
    #[arg(long, requires = "annulus_area", value_name = "AREA")]
    pub cap_area: Option<String>,
    /// Line and valve volume on the cap side, added to the chamber
    #[arg(long, default_value = "0 L", value_name = "VOLUME")]
    pub cap_dead_volume: String,
    /// Whole cap-side oil volume (with --rod-volume, instead of --stroke)
    #[arg(
        long,
        requires = "rod_volume",
        conflicts_with = "stroke",
        value_name = "VOLUME"
    )]
    pub cap_volume: Option<String>,
    /// Moving mass
    #[arg(long, value_name = "MASS")]
    pub mass: String,
    /// Piston position from the cap end (mid-stroke if left out)
    #[arg(long, requires = "stroke", value_name = "LENGTH")]
    pub position: Option<String>,
    /// Rod diameter
    #[arg(long, requires = "bore", value_name = "LENGTH")]
    pub rod: Option<String>,
    /// Line and valve volume on the rod side, added to the chamber
    #[arg(long, default_value = "0 L", value_name = "VOLUME")]
    pub rod_dead_volume: String,
    /// Whole rod-side oil volume (with --cap-volume, instead of --stroke)
    #[arg(long, requires = "cap_volume", value_name = "VOLUME")]
    pub rod_volume: Option<String>,
    /// Stroke (instead of --cap-volume and --rod-volume)
    #[arg(long, required_unless_present = "cap_volume", value_name = "LENGTH")]
    pub stroke: Option<String>,
}

/// Inputs of `calc orifice-constant`.
#[derive(Debug, Args)]
pub struct OrificeConstantArgs {
    /// Density of the water that specific gravity refers to
    #[arg(long, default_value = "1000 kg/m^3", value_name = "DENSITY")]
    pub water_density: String,
}

/// Inputs of `calc orifice-flow`.
#[derive(Debug, Args)]
pub struct OrificeFlowArgs {
    /// Orifice area (instead of --diameter)
    #[arg(
        long,
        conflicts_with = "diameter",
        required_unless_present = "diameter",
        value_name = "AREA"
    )]
    pub area: Option<String>,
    /// Discharge coefficient
    #[arg(long, default_value = "0.61", value_name = "RATIO")]
    pub cd: String,
    /// Oil density, or a specific gravity such as 0.87
    #[arg(long, default_value = "870 kg/m^3", value_name = "DENSITY")]
    pub density: String,
    /// Round orifice diameter (instead of --area)
    #[arg(long, value_name = "LENGTH")]
    pub diameter: Option<String>,
    /// Pressure drop across the orifice
    #[arg(long, value_name = "PRESSURE")]
    pub drop: String,
    /// Use the US form with this constant K (e.g. 38.1) instead of the SI equation
    #[arg(long, value_name = "K")]
    pub us_constant: Option<String>,
}

/// Inputs of `calc throttling-heat`.
#[derive(Debug, Args)]
pub struct ThrottlingHeatArgs {
    /// Oil density, or a specific gravity such as 0.87
    #[arg(long, default_value = "870 kg/m^3", value_name = "DENSITY")]
    pub density: String,
    /// Pressure drop across the throttle
    #[arg(long, value_name = "PRESSURE")]
    pub drop: String,
    /// Flow through the throttle, for the heat rate
    #[arg(long, value_name = "FLOW")]
    pub flow: Option<String>,
    /// Oil temperature entering the throttle, for the outlet temperature
    #[arg(long, value_name = "TEMPERATURE")]
    pub inlet_temperature: Option<String>,
    /// Specific heat of the oil
    #[arg(long, default_value = "2060 J/(kg*K)", value_name = "SPECIFIC_HEAT")]
    pub specific_heat: String,
}

/// Inputs of `calc viscosity-at`.
#[derive(Debug, Args)]
pub struct ViscosityAtArgs {
    /// Temperature at which to give the viscosity
    #[arg(long, value_name = "TEMPERATURE")]
    pub at: Option<String>,
    /// Viscosity whose temperature to find
    #[arg(long, value_name = "VISCOSITY")]
    pub find: Option<String>,
    /// Temperature of the first point
    #[arg(long, default_value = "40 degC", value_name = "TEMPERATURE")]
    pub temperature_1: String,
    /// Temperature of the second point
    #[arg(long, default_value = "100 degC", value_name = "TEMPERATURE")]
    pub temperature_2: String,
    /// Viscosity at the first point
    #[arg(long, value_name = "VISCOSITY")]
    pub viscosity_1: String,
    /// Viscosity at the second point
    #[arg(long, value_name = "VISCOSITY")]
    pub viscosity_2: String,
}

/// Inputs of `calc viscosity-index`.
#[derive(Debug, Args)]
pub struct ViscosityIndexArgs {
    /// Kinematic viscosity at 100 °C
    #[arg(long, value_name = "VISCOSITY")]
    pub viscosity_100: String,
    /// Kinematic viscosity at 40 °C
    #[arg(long, value_name = "VISCOSITY")]
    pub viscosity_40: String,
}
