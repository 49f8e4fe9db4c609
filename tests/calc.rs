//! `spoolsleuth calc`: the published worked examples through the real binary,
//! whole-table output, help text and bad-input errors.

use std::process::Output;

use assert_cmd::Command;
use serde_json::Value;
use spoolsleuth::physics::constants::{GPM, INCH, PSI};

const LPM: f64 = 1e-3 / 60.0;
const BAR: f64 = 1e5;
const RPM: f64 = 1.0 / 60.0;
const LBF: f64 = 0.453_592_37 * 9.806_65;
const HP: f64 = 550.0 * 0.3048 * LBF;
const BTU_PER_HOUR: f64 = 1_055.055_852_62 / 3600.0;
const CST: f64 = 1e-6;

fn spoolsleuth() -> Command {
    let mut command = crate::harness::spoolsleuth_anywhere();
    command.env_remove("NO_COLOR").env("COLUMNS", "100");
    command
}

fn run(args: &[&str]) -> Output {
    spoolsleuth().arg("calc").args(args).output().unwrap()
}

/// Run `calc ARGS --json`, check it succeeded, and return the parsed JSON.
#[track_caller]
fn json(args: &[&str]) -> Value {
    let output = run(&[args, &["--json"]].concat());
    let stderr = String::from_utf8_lossy(&output.stderr);
    assert!(output.status.success(), "{args:?} failed: {stderr}");
    serde_json::from_slice(&output.stdout).unwrap()
}

/// The SI value of result `name`.
#[track_caller]
fn result(report: &Value, name: &str) -> f64 {
    report["results"][name]["value"]
        .as_f64()
        .unwrap_or_else(|| panic!("no result {name} in {report}"))
}

#[track_caller]
fn assert_close(actual: f64, expected: f64, relative: f64) {
    let error = ((actual - expected) / expected).abs();
    assert!(
        error <= relative,
        "expected {expected}, got {actual} (relative {error:e})"
    );
}

/// Within half a unit in the last of `decimals` printed decimal places.
#[track_caller]
fn assert_printed(actual: f64, expected: f64, decimals: i32) {
    let half = 0.5 * 10f64.powi(-decimals) * (1.0 + 1e-9);
    assert!(
        (actual - expected).abs() <= half,
        "expected {expected} (±{half}), got {actual}"
    );
}

#[test]
fn orifice_flow_si() {
    let r = json(&[
        "orifice-flow",
        "--diameter",
        "2 mm",
        "--cd",
        "0.62",
        "--drop",
        "10 bar",
        "--density",
        "870 kg/m^3",
    ]);
    // Rabie eq. 2.34–2.37: 5.6034 L/min
    assert_close(result(&r, "flow") / LPM, 5.6034, 1e-4);
    assert_eq!(r["calculation"], "orifice-flow");
    assert_eq!(r["source"], "Rabie 2009, eq. 2.34–2.37, p. 50");
    assert_eq!(r["inputs"]["drop"]["value"], 1e6);
    assert_eq!(r["inputs"]["drop"]["unit"], "Pa");
    assert_eq!(r["results"]["flow"]["unit"], "m³/s");
}

#[test]
fn orifice_constant() {
    let r = json(&["orifice-constant", "--water-density", "1000 kg/m^3"]);
    // derived: K = 37.9734
    assert_close(result(&r, "orifice-constant"), 37.9734, 1e-4);
}

#[test]
fn orifice_flow_us_form() {
    let r = json(&[
        "orifice-flow",
        "--diameter",
        "1 in",
        "--cd",
        "0.80",
        "--drop",
        "100 psi",
        "--density",
        "0.9",
        "--us-constant",
        "38.1",
    ]);
    // Esposito Ex. 8-4: 252.34 gpm
    assert_close(result(&r, "flow") / GPM, 252.34, 1e-4);
}

#[test]
fn meter_out_needle_valve() {
    let r = json(&[
        "intensification",
        "--cap-area",
        "3.14 in^2",
        "--annulus-area",
        "2.35 in^2",
        "--cap-pressure",
        "500 psi",
        "--load",
        "1000 lbf",
        "--speed",
        "10 in/s",
        "--density",
        "0.9",
    ]);
    // Esposito Ex. 8-6: p₂ 242.6 psi, Q 6.104 gpm, C_v 0.3718
    assert_printed(result(&r, "rod-pressure") / PSI, 242.6, 1);
    assert_printed(result(&r, "metered-flow") / GPM, 6.104, 3);
    assert_printed(result(&r, "valve-capacity") / GPM * PSI.sqrt(), 0.3718, 4);
    assert_eq!(r["results"]["valve-capacity"]["unit"], "m³/(s·√Pa)");
}

#[test]
fn meter_out_load_cases() {
    let p = |load: &str| {
        let r = json(&[
            "intensification",
            "--cap-area",
            "3.14 in^2",
            "--annulus-area",
            "2.35 in^2",
            "--cap-pressure",
            "500 psi",
            "--load",
            load,
        ]);
        result(&r, "rod-pressure") / PSI
    };
    // Esposito Ex. 8-6: 668.1 psi with F = 0; 1093.6 psi with 1000 lb overrunning
    assert_printed(p("0 lbf"), 668.1, 1);
    assert_printed(p("-1000 lbf"), 1093.6, 1);
}

#[test]
fn blocked_port_intensification() {
    let r = json(&[
        "intensification",
        "--bore",
        "4 in",
        "--rod",
        "2.5 in",
        "--cap-pressure",
        "1500 psi",
    ]);
    // derived: 1500 psi cap, rod blocked → 2461.5 psi
    assert_close(result(&r, "rod-pressure") / PSI, 2461.5, 1e-4);
    let r = json(&[
        "intensification",
        "--bore",
        "4 in",
        "--rod",
        "2.5 in",
        "--rod-pressure",
        "1500 psi",
    ]);
    // derived: rod side at 1500 psi, cap port closed → 914.1 psi
    assert_printed(result(&r, "cap-pressure") / PSI, 914.1, 1);
}

#[test]
fn cylinder_speeds() {
    let r = json(&[
        "cylinder-speed",
        "--bore",
        "4 in",
        "--rod",
        "2.5 in",
        "--flow",
        "10 gpm",
    ]);
    // derived: 183.82 / 301.66 in/min
    assert_close(result(&r, "extend-speed") * 60.0 / INCH, 183.82, 1e-4);
    assert_close(result(&r, "retract-speed") * 60.0 / INCH, 301.66, 1e-4);
    // derived: ratio 1.6410
    assert_printed(result(&r, "area-ratio"), 1.6410, 4);
}

#[test]
fn hydraulic_power() {
    let r = json(&[
        "hydraulic-power",
        "--pressure",
        "2000 psi",
        "--flow",
        "20 gpm",
    ]);
    // derived: 23.333 hp; 17.400 kW; 59 370 Btu/h
    let p = result(&r, "hydraulic-power");
    assert_close(p / HP, 23.333, 1e-4);
    assert_close(p / 1e3, 17.400, 1e-4);
    assert_close(result(&r, "heat-equivalent") / BTU_PER_HOUR, 59_370.0, 1e-4);
    let r = json(&[
        "hydraulic-power",
        "--pressure",
        "150 bar",
        "--flow",
        "60 L/min",
    ]);
    // derived: 15.000 kW
    assert_close(result(&r, "hydraulic-power") / 1e3, 15.0, 1e-4);
}

#[test]
fn throttling_heat() {
    let r = json(&["throttling-heat", "--drop", "100 bar"]);
    // energy balance; c_p Rabie §2.2.12: 5.580 K
    assert_close(result(&r, "temperature-rise"), 5.580, 1e-3);
    let r = json(&[
        "throttling-heat",
        "--drop",
        "1000 psi",
        "--flow",
        "10 gpm",
        "--density",
        "7.42 lb/gal",
        "--specific-heat",
        "0.42 BTU/(lb*F)",
        "--inlet-temperature",
        "120 degF",
    ]);
    // Esposito ch. 11: +7.94 °F → 127.9 °F
    assert_printed(result(&r, "temperature-rise") * 1.8, 7.94, 2);
    assert_printed(result(&r, "outlet-temperature") * 1.8 - 459.67, 127.9, 1);
}

#[test]
fn heat_budget_restrictive_against_bypass() {
    let r = json(&[
        "heat-budget",
        "--pump-flow",
        "40 L/min",
        "--set-flow",
        "20 L/min",
        "--load-pressure",
        "100 bar",
        "--relief-pressure",
        "210 bar",
        "--compensator-drop",
        "8 bar",
    ]);
    // derived: 7.00 + 3.67 = 10.67 kW restrictive; 3.87 kW bypass; 3.33 kW to the load
    assert_printed(result(&r, "restrictive-relief-heat") / 1e3, 7.00, 2);
    assert_printed(result(&r, "restrictive-metering-heat") / 1e3, 3.67, 2);
    assert_printed(result(&r, "restrictive-heat") / 1e3, 10.67, 2);
    assert_printed(result(&r, "bypass-heat") / 1e3, 3.87, 2);
    assert_printed(result(&r, "load-power") / 1e3, 3.33, 2);
    assert_close(result(&r, "bypass-pump-pressure") / BAR, 108.0, 1e-12);
}

#[test]
fn motor_speed_and_torque() {
    let r = json(&[
        "motor-speed",
        "--flow",
        "6 gpm",
        "--displacement",
        "0.75 in^3/rev",
    ]);
    // derived: 1848 rpm
    assert_close(result(&r, "speed") / RPM, 1848.0, 1e-4);
    let r = json(&[
        "motor-torque",
        "--drop",
        "2000 psi",
        "--displacement",
        "2.5 in^3/rev",
    ]);
    // derived: 795.77 lbf·in
    assert_close(result(&r, "torque") / (LBF * INCH), 795.77, 1e-4);
    let r = json(&[
        "motor-speed",
        "--flow",
        "60 L/min",
        "--displacement",
        "100 cm^3/rev",
        "--volumetric-efficiency",
        "0.95",
    ]);
    // derived: 570 rpm
    assert_close(result(&r, "speed") / RPM, 570.0, 1e-4);
    let r = json(&[
        "motor-torque",
        "--drop",
        "200 bar",
        "--displacement",
        "100 cm^3/rev",
    ]);
    // derived: 318.31 N·m
    assert_close(result(&r, "torque"), 318.31, 1e-4);
}

#[test]
fn motor_efficiencies() {
    let r = json(&[
        "motor-efficiency",
        "--displacement",
        "3 in^3/rev",
        "--flow",
        "15 gpm",
        "--speed",
        "1080 rpm",
        "--drop",
        "1750 psi",
        "--torque",
        "790 lbf*in",
    ]);
    // definitions (ISO 4409 terms): η_v .9351, η_m .9455, η_o .8841
    assert_printed(result(&r, "volumetric-efficiency"), 0.9351, 4);
    assert_printed(result(&r, "mechanical-efficiency"), 0.9455, 4);
    assert_printed(result(&r, "overall-efficiency"), 0.8841, 4);
    // derived: 1.775 hp generated in the motor
    assert_printed(result(&r, "heat") / HP, 1.775, 3);
}

#[test]
fn viscosity_lines() {
    let r = json(&[
        "viscosity-at",
        "--viscosity-1",
        "46 cSt",
        "--viscosity-2",
        "6.8 cSt",
        "--at",
        "60 degC",
    ]);
    // ASTM D341: 20.62 cSt (A 9.41799, B 3.68444)
    assert_printed(result(&r, "viscosity-at") / CST, 20.62, 2);
    assert_close(result(&r, "constant-a"), 9.41799, 1e-5);
    assert_close(result(&r, "constant-b"), 3.68444, 1e-5);
    let r = json(&[
        "viscosity-at",
        "--temperature-1",
        "313 K",
        "--viscosity-1",
        "32 cSt",
        "--temperature-2",
        "373 K",
        "--viscosity-2",
        "5.4 cSt",
        "--at",
        "353 K",
    ]);
    // ASTM D341 (T = t + 273): 8.533 cSt
    assert_printed(result(&r, "viscosity-at") / CST, 8.533, 3);
}

#[test]
fn viscosity_indices() {
    let r = json(&[
        "viscosity-index",
        "--viscosity-40",
        "73.3 cSt",
        "--viscosity-100",
        "8.86 cSt",
    ]);
    // ASTM D2270 via `chemicals` 1.5.2: 92
    assert_eq!(result(&r, "reported-viscosity-index"), 92.0);
    let r = json(&[
        "viscosity-index",
        "--viscosity-40",
        "46 cSt",
        "--viscosity-100",
        "6.8 cSt",
    ]);
    // ASTM D2270 via `chemicals` 1.5.2: 101.6
    assert_printed(result(&r, "viscosity-index"), 101.6, 1);
    let r = json(&["grade-viscosity", "--grade", "46", "--index", "100"]);
    // derived (`chemicals` + `scipy`): 6.760 cSt
    assert_printed(result(&r, "viscosity-100") / CST, 6.760, 3);
}

#[test]
fn bulk_modulus_with_air() {
    let r = json(&["bulk-modulus", "--pressure", "10 bar", "--air", "1 %"]);
    // derived (series form, isothermal): 0.662 GPa
    assert_printed(result(&r, "effective-bulk-modulus") / 1e9, 0.662, 3);
    let r = json(&[
        "bulk-modulus",
        "--pressure",
        "10 bar",
        "--air",
        "1 %",
        "--process",
        "adiabatic",
    ]);
    // derived (series form, adiabatic): 0.539 GPa
    assert_printed(result(&r, "effective-bulk-modulus") / 1e9, 0.539, 3);
}

#[test]
fn natural_frequencies() {
    let r = json(&[
        "natural-frequency",
        "--bore",
        "4 in",
        "--rod",
        "2.5 in",
        "--stroke",
        "12 in",
        "--mass",
        "1000 lb",
        "--bulk-modulus",
        "180000 psi",
    ]);
    // derived: 77.03 Hz
    assert_printed(result(&r, "natural-frequency"), 77.03, 2);
    let r = json(&[
        "natural-frequency",
        "--cap-area",
        "20 cm^2",
        "--annulus-area",
        "20 cm^2",
        "--cap-volume",
        "0.5 L",
        "--rod-volume",
        "0.5 L",
        "--mass",
        "500 kg",
        "--bulk-modulus",
        "1.4 GPa",
    ]);
    // derived: 33.69 Hz
    assert_printed(result(&r, "natural-frequency"), 33.69, 2);
    let r = json(&[
        "motor-frequency",
        "--displacement",
        "50 cm^3/rev",
        "--volume",
        "1 L",
        "--inertia",
        "0.5 kg*m^2",
        "--bulk-modulus",
        "1.2 GPa",
    ]);
    // derived: 3.92 Hz
    assert_printed(result(&r, "natural-frequency"), 3.92, 2);
}

#[test]
fn spool_flow_force() {
    let r = json(&[
        "flow-force",
        "--spool-diameter",
        "10 mm",
        "--opening",
        "0.2 mm",
        "--drop",
        "50 bar",
    ]);
    // Vacca §3.8.1 (momentum form): 13.46 N
    assert_printed(result(&r, "flow-force"), 13.46, 2);
    // derived: 0.4285
    assert_printed(result(&r, "flow-force-gain"), 0.4285, 4);
    let bare = json(&[
        "flow-force",
        "--width",
        "31.416 mm",
        "--opening",
        "0.2 mm",
        "--drop",
        "50 bar",
        "--jet-angle",
        "69",
    ]);
    assert_close(result(&bare, "flow-force"), result(&r, "flow-force"), 1e-4);
}

#[test]
fn compensator_regulation_error() {
    let r = json(&[
        "compensator",
        "--spool-diameter",
        "10 mm",
        "--setting",
        "8 bar",
        "--spring-rate",
        "5 N/mm",
        "--flow",
        "10 L/min",
        "--compensator-drop",
        "10 bar",
        "--stroke",
        "0.5 mm",
        "--compare-drop",
        "200 bar",
        "--compare-stroke",
        "1.5 mm",
    ]);
    // derived (own model): 8.007 → 7.565 bar; −2.80 % flow
    assert_printed(result(&r, "metering-drop") / BAR, 8.007, 3);
    assert_printed(result(&r, "compare-metering-drop") / BAR, 7.565, 3);
    assert_printed(result(&r, "flow-change") * 100.0, -2.80, 2);
}

#[test]
fn annular_leakage() {
    let leak = |mu: &str| {
        let r = json(&[
            "leakage",
            "--diameter",
            "10 mm",
            "--clearance",
            "5 um",
            "--length",
            "10 mm",
            "--drop",
            "100 bar",
            "--dynamic-viscosity",
            mu,
        ]);
        result(&r, "leakage") / (1e-6 / 60.0)
    };
    // Rabie eq. 2.19: 0.499 / 1.129 cm³/min
    assert_printed(leak("39.33 mPa*s"), 0.499, 3);
    assert_printed(leak("17.39 mPa*s"), 1.129, 3);
    let r = json(&[
        "leakage",
        "--diameter",
        "10 mm",
        "--clearance",
        "5 um",
        "--length",
        "10 mm",
        "--drop",
        "100 bar",
        "--viscosity",
        "46 cSt",
        "--density",
        "855 kg/m^3",
    ]);
    // Rabie eq. 2.19, μ = ν·ρ: 0.499 cm³/min
    assert_printed(result(&r, "leakage") / (1e-6 / 60.0), 0.499, 3);
}

#[test]
fn compressed_volume() {
    let r = json(&[
        "compressed-volume",
        "--volume",
        "2 L",
        "--pressure-rise",
        "100 bar",
        "--bulk-modulus",
        "1 GPa",
    ]);
    // derived: 20 cm³
    assert_close(result(&r, "compressed-volume") * 1e6, 20.0, 1e-12);
}

#[test]
fn warm_oil_density() {
    // Rabie 2009, §2.2.4, eq. 2.81, p. 60 (division form): 855.0, 843.4, 832.1 kg/m³
    for (t, rho) in [("40 degC", 855.0), ("60 degC", 843.4), ("80 degC", 832.1)] {
        let r = json(&["density-at", "--density", "870 kg/m^3", "--temperature", t]);
        assert_printed(result(&r, "density"), rho, 1);
    }
}

#[test]
fn whole_table_metric() {
    let output = run(&[
        "orifice-flow",
        "--diameter",
        "2 mm",
        "--cd",
        "0.62",
        "--drop",
        "10 bar",
        "--density",
        "870 kg/m^3",
    ]);
    assert!(output.status.success());
    let expected = "\
┌──────────────┬──────────┬─────────────┐
│ orifice-flow ┆          ┆ value       │
╞══════════════╪══════════╪═════════════╡
│ input        ┆ diameter ┆ 2 mm        │
│ input        ┆ cd       ┆ 0.62        │
│ input        ┆ drop     ┆ 10 bar      │
│ input        ┆ density  ┆ 870 kg/m³   │
│ result       ┆ area     ┆ 0.03142 cm² │
│ result       ┆ flow     ┆ 5.603 L/min │
└──────────────┴──────────┴─────────────┘
source: Rabie 2009, eq. 2.34–2.37, p. 50
";
    assert_eq!(String::from_utf8(output.stdout).unwrap(), expected);
}

#[test]
fn whole_table_us() {
    let output = run(&[
        "motor-speed",
        "--flow",
        "6 gpm",
        "--displacement",
        "0.75 in^3/rev",
        "--units",
        "us",
    ]);
    assert!(output.status.success());
    let expected = "\
┌─────────────┬───────────────────────┬──────────────┐
│ motor-speed ┆                       ┆ value        │
╞═════════════╪═══════════════════════╪══════════════╡
│ input       ┆ flow                  ┆ 6 gpm        │
│ input       ┆ displacement          ┆ 0.75 in³/rev │
│ input       ┆ volumetric-efficiency ┆ 100 %        │
│ result      ┆ speed                 ┆ 1848 rpm     │
└─────────────┴───────────────────────┴──────────────┘
source: derived (definition of displacement)
";
    assert_eq!(String::from_utf8(output.stdout).unwrap(), expected);
}

const CALCULATIONS: &[&str] = &[
    "bulk-modulus",
    "compensator",
    "compressed-volume",
    "cylinder-speed",
    "density-at",
    "flow-force",
    "grade-viscosity",
    "heat-budget",
    "hydraulic-power",
    "intensification",
    "leakage",
    "motor-efficiency",
    "motor-frequency",
    "motor-speed",
    "motor-torque",
    "natural-frequency",
    "orifice-constant",
    "orifice-flow",
    "throttling-heat",
    "viscosity-at",
    "viscosity-index",
];

#[test]
fn calc_help_lists_every_calculation() {
    let output = run(&["--help"]);
    assert!(output.status.success());
    let help = String::from_utf8(output.stdout).unwrap();
    for name in CALCULATIONS {
        assert!(
            help.contains(&format!("  {name} ")),
            "{name} missing from:\n{help}"
        );
    }
}

#[test]
fn each_help_shows_formula_source_and_a_working_example() {
    for name in CALCULATIONS {
        // A wide terminal keeps each example on one line.
        let output = spoolsleuth()
            .env("COLUMNS", "1000")
            .args(["calc", name, "--help"])
            .output()
            .unwrap();
        assert!(output.status.success(), "{name} --help");
        let help = String::from_utf8(output.stdout).unwrap();
        assert!(help.contains("Source: "), "{name}: no source in\n{help}");
        let example = help
            .lines()
            .find_map(|l| l.trim().strip_prefix("Example: spoolsleuth calc "))
            .unwrap_or_else(|| panic!("{name}: no example in\n{help}"));
        assert!(
            example.starts_with(name),
            "{name}: example runs another calculation"
        );
        let args = split_example(example);
        let run = spoolsleuth().arg("calc").args(&args).output().unwrap();
        assert!(
            run.status.success(),
            "{name}: example failed: {}",
            String::from_utf8_lossy(&run.stderr)
        );
    }
}

/// Split an example command line on spaces outside double quotes.
fn split_example(line: &str) -> Vec<String> {
    let mut args = Vec::new();
    let mut current = String::new();
    let mut quoted = false;
    for c in line.chars() {
        match c {
            '"' => quoted = !quoted,
            ' ' if !quoted => {
                if !current.is_empty() {
                    args.push(std::mem::take(&mut current));
                }
            }
            _ => current.push(c),
        }
    }
    if !current.is_empty() {
        args.push(current);
    }
    args
}

#[test]
fn bad_reading_names_the_option_and_quotes_the_text() {
    let output = run(&["orifice-flow", "--diameter", "2 mm", "--drop", "10 bra"]);
    assert_eq!(output.status.code(), Some(2));
    assert!(output.stdout.is_empty());
    assert_eq!(
        String::from_utf8(output.stderr).unwrap(),
        "error: --drop: `10 bra`: unknown unit `bra` (did you mean `bar`?)\n"
    );
}

#[test]
fn a_pasted_reading_over_the_length_limit_exits_2_unquoted() {
    let pasted = format!("10 {}", "bar ".repeat(100));
    let output = run(&["orifice-flow", "--diameter", "2 mm", "--drop", &pasted]);
    assert_eq!(output.status.code(), Some(2));
    assert!(output.stdout.is_empty());
    assert_eq!(
        String::from_utf8(output.stderr).unwrap(),
        "error: --drop: a reading of 402 bytes is longer than the limit of 256 bytes \
         (expected a number and a unit, e.g. `1500 psi`)\n"
    );
}

#[test]
fn wrong_dimension_and_missing_unit_exit_2() {
    let output = run(&[
        "motor-speed",
        "--flow",
        "6 psi",
        "--displacement",
        "0.75 in^3/rev",
    ]);
    assert_eq!(output.status.code(), Some(2));
    let stderr = String::from_utf8(output.stderr).unwrap();
    assert!(stderr.starts_with("error: --flow: `6 psi`:"), "{stderr}");
    let output = run(&[
        "motor-speed",
        "--flow",
        "6",
        "--displacement",
        "0.75 in^3/rev",
    ]);
    assert_eq!(output.status.code(), Some(2));
    let stderr = String::from_utf8(output.stderr).unwrap();
    assert!(
        stderr.starts_with("error: --flow: `6` has no unit"),
        "{stderr}"
    );
}

#[test]
fn physics_domain_errors_exit_2() {
    let output = run(&[
        "cylinder-speed",
        "--bore",
        "50 mm",
        "--rod",
        "60 mm",
        "--flow",
        "10 L/min",
    ]);
    assert_eq!(output.status.code(), Some(2));
    assert_eq!(
        String::from_utf8(output.stderr).unwrap(),
        "error: rod diameter 0.06 m must be smaller than the bore 0.05 m\n"
    );
    let output = run(&[
        "viscosity-index",
        "--viscosity-40",
        "5 cSt",
        "--viscosity-100",
        "1.5 cSt",
    ]);
    assert_eq!(output.status.code(), Some(2));
    let stderr = String::from_utf8(output.stderr).unwrap();
    assert!(
        stderr.starts_with("error: viscosity at 100 °C must be at least"),
        "{stderr}"
    );
    let output = run(&["grade-viscosity", "--grade", "47"]);
    assert_eq!(output.status.code(), Some(2));
    let stderr = String::from_utf8(output.stderr).unwrap();
    assert!(
        stderr.contains("ISO VG 47 is not a viscosity grade"),
        "{stderr}"
    );
}

#[test]
fn the_command_line_definition_is_consistent() {
    use clap::CommandFactory;
    spoolsleuth::cli::Arguments::command().debug_assert();
}
