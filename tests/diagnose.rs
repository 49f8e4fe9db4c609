//! `spoolsleuth diagnose`: the real binary in a temporary folder on breakdown
//! calls from every symptom family, with readings in mixed units. Each test
//! asserts the leading cause and its status from the JSON and the evidence
//! sentence with the number that proves it; the reports are compared whole.

use std::path::Path;
use std::process::Output;

use assert_cmd::Command;
use serde_json::Value;
use tempfile::TempDir;

/// The binary in a fresh temporary folder with none of the user's settings.
fn spoolsleuth(dir: &Path) -> Command {
    crate::harness::spoolsleuth(dir)
}

fn run(args: &[&str]) -> Output {
    let dir = TempDir::new().expect("temp dir");
    spoolsleuth(dir.path())
        .arg("diagnose")
        .args(args)
        .output()
        .expect("run spoolsleuth")
}

fn stdout(output: &Output) -> String {
    String::from_utf8_lossy(&output.stdout).into_owned()
}

fn stderr(output: &Output) -> String {
    String::from_utf8_lossy(&output.stderr).into_owned()
}

/// The diagnosis as JSON; the run must succeed.
#[track_caller]
fn diagnose(args: &[&str]) -> Value {
    let mut all = args.to_vec();
    all.push("--json");
    let output = run(&all);
    assert_eq!(output.status.code(), Some(0), "{}", stderr(&output));
    serde_json::from_slice(&output.stdout).expect("JSON on stdout")
}

/// `--reading` before each `NAME=VALUE`.
fn readings<'a>(pairs: &[&'a str]) -> Vec<&'a str> {
    pairs.iter().flat_map(|r| ["--reading", *r]).collect()
}

fn with(head: &[&'static str], pairs: &[&'static str]) -> Vec<&'static str> {
    let mut args = head.to_vec();
    args.extend(readings(pairs));
    args
}

/// The cause ranked first and its status.
#[track_caller]
fn leading(d: &Value) -> (String, String) {
    let first = &d["causes"][0];
    (
        first["cause"].as_str().unwrap().to_string(),
        first["status"].as_str().unwrap().to_string(),
    )
}

/// The evidence sentence of one rule of one cause.
#[track_caller]
fn evidence(d: &Value, cause: &str, rule: &str) -> String {
    let cause = d["causes"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["cause"] == cause)
        .unwrap_or_else(|| panic!("no cause {cause} in {d:#}"));
    let line = cause["evidence"]
        .as_array()
        .unwrap()
        .iter()
        .find(|e| e["rule"] == rule)
        .unwrap_or_else(|| panic!("no rule {rule} under {cause:#}"));
    line["text"].as_str().unwrap().to_string()
}

fn status_of(d: &Value, cause: &str) -> String {
    d["causes"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["cause"] == cause)
        .map_or_else(String::new, |c| c["status"].as_str().unwrap().to_string())
}

/// No component confirmed or likely, and no fix offered.
#[track_caller]
fn nothing_blamed(d: &Value) {
    for c in d["causes"].as_array().unwrap() {
        assert!(
            c["status"] != "confirmed" && c["status"] != "likely",
            "blamed a healthy circuit: {c:#}"
        );
    }
    assert!(d["fix"].is_null(), "{:#}", d["fix"]);
    assert!(d["consistency"].as_array().unwrap().is_empty());
}

// ------------------------------------------------------------ speed sags

/// Press-4, gauges in psi and bar: the drop collapses from 8 to 3.5 bar
/// while supply stands 45 bar over the load (2175 psi = 149.96 bar, NIST SP 811).
const SAG_STICKING: &[&str] = &[
    "supply_pressure@unloaded=2175 psi",
    "inter_pressure@unloaded=38 bar",
    "load_pressure@unloaded=435 psi",
    "supply_pressure@loaded=185 bar",
    "inter_pressure@loaded=2081 psi",
    "load_pressure@loaded=140 bar",
];

#[test]
fn sag_with_headroom_to_spare_is_the_sticking_compensator() {
    let d = diagnose(&with(
        &[
            "--machine",
            "press-4",
            "--complaint",
            "platen slows right down when it presses the panel",
        ],
        SAG_STICKING,
    ));
    assert_eq!(d["symptoms"][0]["id"], "speed-sags-under-load");
    assert_eq!(
        leading(&d),
        ("compensator-sticking".into(), "confirmed".into())
    );
    assert_eq!(
        evidence(
            &d,
            "compensator-sticking",
            "sag-drop-collapses-with-headroom"
        ),
        "the metering drop is 8.008 bar unloaded but 3.48 bar under load (it should stay above \
         7.22 bar), while supply stands 45 bar over the load, more than the 10 bar the valve needs"
    );
    assert_eq!(status_of(&d, "insufficient-headroom"), "ruled-out");
    assert_eq!(d["fix"]["cause"], "compensator-sticking");
}

#[test]
fn sag_with_supply_at_the_load_is_headroom_not_the_spool() {
    // Same complaint and the same collapsed drop; only the headroom differs:
    // 2973 psi (204.98 bar) against a 200 bar load leaves 5 bar for a valve needing 10.
    let d = diagnose(&with(
        &[
            "--machine",
            "press-4",
            "--complaint",
            "it bogs down on the thick panels",
        ],
        &[
            "supply_pressure@unloaded=150 bar",
            "inter_pressure@unloaded=38 bar",
            "load_pressure@unloaded=30 bar",
            "supply_pressure@loaded=2973 psi",
            "inter_pressure@loaded=203 bar",
            "load_pressure@loaded=200 bar",
        ],
    ));
    assert_eq!(
        leading(&d),
        ("insufficient-headroom".into(), "confirmed".into())
    );
    assert_eq!(
        evidence(&d, "insufficient-headroom", "sag-headroom-short"),
        "under load supply is only 4.981 bar above the load; the valve needs 10 bar (its 8 bar \
         setting plus 2 bar for the compensator)"
    );
    assert_ne!(status_of(&d, "compensator-sticking"), "confirmed");
    assert_ne!(status_of(&d, "compensator-sticking"), "likely");
}

#[test]
fn a_healthy_valve_that_eases_three_percent_under_load_is_not_blamed() {
    // Drop 8.21 → 7.74 bar: flow ∝ √Δp, so −2.9 % (derived), inside the 5 % band.
    let d = diagnose(&with(
        &[
            "--machine",
            "press-4",
            "--complaint",
            "platen slows down when it presses the panel",
        ],
        &[
            "supply_pressure@unloaded=150 bar",
            "inter_pressure@unloaded=38.2 bar",
            "load_pressure@unloaded=435 psi",
            "supply_pressure@loaded=185 bar",
            "inter_pressure@loaded=147.7 bar",
            "load_pressure@loaded=2030 psi",
            "flow@unloaded=20 L/min",
            "flow@loaded=5.13 gpm",
            "rod_speed@loaded=41 mm/s",
        ],
    ));
    nothing_blamed(&d);
    assert_eq!(
        evidence(
            &d,
            "cylinder-seal-bypass",
            "sag-cylinder-slower-than-its-flow"
        ),
        "19.42 L/min goes into the cap end and the rod speed of 41 mm/s accounts for \
         19.32 L/min, with the valve's own flow down 2.904 % (band 5 %): not the sign of a \
         piston seal bypassing while the valve holds its flow"
    );
}

// ------------------------------------------------------- follows the supply

#[test]
fn conveyor_speed_that_follows_the_pump_with_headroom_is_the_compensator() {
    let d = diagnose(&with(
        &[
            "--machine",
            "conveyor-7",
            "--complaint",
            "chain is slower at idle, faster at full revs",
        ],
        &[
            "flow@low=7.9 gpm",
            "flow@high=36 L/min",
            "supply_pressure@low=80 bar",
            "load_pressure@low=60 bar",
            "supply_pressure@high=1305 psi",
            "load_pressure@high=60 bar",
        ],
    ));
    assert_eq!(d["symptoms"][0]["id"], "no-compensation-supply-swing");
    assert_eq!(
        leading(&d),
        ("compensator-sticking".into(), "confirmed".into())
    );
    assert_eq!(
        evidence(
            &d,
            "compensator-sticking",
            "swing-flow-follows-supply-with-headroom"
        ),
        "flow goes from 29.9 L/min at low supply to 36 L/min at high supply (20.38 %, band 5 %) \
         although even the low supply stands 20 bar over the load"
    );
}

#[test]
fn speed_that_follows_the_supply_without_headroom_at_idle_is_headroom() {
    // Both causes are checked; only the 4.97 bar of headroom at low supply separates them.
    let d = diagnose(&with(
        &[
            "--circuit",
            "restrictive",
            "--placement",
            "meter-in",
            "--actuator",
            "cylinder",
            "--complaint",
            "speed changes when another function runs, it is slower at idle",
        ],
        &[
            "spring_setting=8 bar",
            "flow@low=18 L/min",
            "flow@high=5.3 gpm",
            "supply_pressure@low=1595 psi",
            "load_pressure@low=105 bar",
            "supply_pressure@high=150 bar",
            "load_pressure@high=105 bar",
        ],
    ));
    assert_eq!(
        leading(&d),
        ("insufficient-headroom".into(), "confirmed".into())
    );
    assert_eq!(
        evidence(
            &d,
            "insufficient-headroom",
            "swing-headroom-lost-at-low-supply"
        ),
        "supply stands only 4.971 bar over the load at low supply but 45 bar at high supply; \
         the valve needs 10 bar"
    );
    assert_eq!(status_of(&d, "compensator-sticking"), "unlikely");
}

#[test]
fn a_conveyor_within_three_percent_across_the_throttle_is_not_blamed() {
    let d = diagnose(&with(
        &[
            "--machine",
            "conveyor-7",
            "--complaint",
            "speed follows the engine revs",
        ],
        &[
            "flow@low=30 L/min",
            "flow@high=8.16 gpm",
            "supply_pressure@low=80 bar",
            "load_pressure@low=60 bar",
            "supply_pressure@high=1305 psi",
            "load_pressure@high=60 bar",
        ],
    ));
    nothing_blamed(&d);
    assert_eq!(
        evidence(
            &d,
            "compensator-sticking",
            "swing-flow-follows-supply-with-headroom"
        ),
        "flow goes from 30 L/min at low supply to 30.89 L/min at high supply (2.963 %, band 5 %), \
         with 20 bar of headroom at low supply: not a flow that follows supply while the valve \
         has pressure to regulate"
    );
}

// ---------------------------------------------------------------- hunting

#[test]
fn hunting_at_a_third_of_the_oil_column_frequency_is_air() {
    let d = diagnose(&with(
        &[
            "--machine",
            "lift-table-5",
            "--complaint",
            "table hunts up and down at a steady setting",
        ],
        &[
            "line_volume=2 L",
            "oscillation_frequency=12 Hz",
            "inlet_vacuum@loaded=8 inHg",
        ],
    ));
    assert_eq!(leading(&d), ("air-in-oil".into(), "confirmed".into()));
    assert_eq!(
        evidence(&d, "air-in-oil", "hunt-frequency-implies-soft-oil"),
        "it hunts at 12 Hz; with air-free oil this cylinder and mass ring at 34.66 Hz, so the oil \
         behaves as if its bulk modulus were 0.1798 GPa instead of 1.5 GPa"
    );
    assert!(d["warnings"][0]
        .as_str()
        .unwrap()
        .starts_with("`inlet_vacuum@loaded` = 8 inHg: converted to gauge"));
}

#[test]
fn hunting_far_slower_than_the_oil_column_is_the_spool_not_air() {
    let d = diagnose(&with(
        &[
            "--machine",
            "lift-table-5",
            "--complaint",
            "table hunts up and down at a steady setting",
        ],
        &["line_volume=0.53 gal", "oscillation_frequency=0.8 Hz"],
    ));
    assert_eq!(
        leading(&d),
        ("compensator-sticking".into(), "likely".into())
    );
    assert_eq!(
        evidence(
            &d,
            "compensator-sticking",
            "hunt-too-slow-for-the-oil-column"
        ),
        "it swings at 0.8 Hz while the oil column rings at 28.28 Hz; a swing under 20 % of that \
         is a spool sticking and slipping"
    );
    assert_eq!(status_of(&d, "air-in-oil"), "unlikely");
}

// ------------------------------------------------------------------ heat

#[test]
fn a_press_that_runs_hot_dumps_its_surplus_over_the_relief() {
    let d = diagnose(&with(
        &[
            "--machine",
            "press-4",
            "--complaint",
            "the oil runs hot all afternoon",
        ],
        &[
            "supply_pressure@loaded=2973 psi",
            "load_pressure@loaded=60 bar",
            "flow@loaded=20 L/min",
            "pump_flow@loaded=10.6 gpm",
            "oil_temperature@hot=150 degF",
        ],
    ));
    assert_eq!(d["symptoms"][0]["id"], "runs-hot");
    assert_eq!(
        leading(&d),
        ("excess-flow-over-relief".into(), "confirmed".into())
    );
    assert_eq!(
        evidence(&d, "excess-flow-over-relief", "heat-surplus-over-relief"),
        "of 13.71 kW from the pump, 6.876 kW goes over the relief and 4.833 kW across the flow \
         control: 85.41 % turned into heat (limit 30 %)"
    );
}

// ----------------------------------------------------------------- lunge

#[test]
fn a_lunge_with_the_whole_supply_across_an_open_compensator() {
    let d = diagnose(&with(
        &[
            "--machine",
            "press-4",
            "--complaint",
            "platen lunges at the start of the close",
        ],
        &[
            "flow_set=20 L/min",
            "supply_pressure@start=2900 psi",
            "load_pressure@start=5 bar",
            "cap_pressure@steady=30 bar",
        ],
    ));
    assert_eq!(
        leading(&d),
        ("compensator-open-at-rest".into(), "likely".into())
    );
    assert_eq!(
        evidence(
            &d,
            "compensator-open-at-rest",
            "lunge-open-compensator-peak"
        ),
        "at the start 194.9 bar is available against a 8 bar setting, so until the spool moves \
         in up to 4.936 times the set 20 L/min can pass"
    );
    assert_eq!(status_of(&d, "line-volume-compliance"), "unlikely");
}

#[test]
fn a_saw_that_jumps_forward_at_the_start_lost_its_back_pressure() {
    let d = diagnose(&with(
        &[
            "--machine",
            "trim-saw-6",
            "--complaint",
            "saw jumps forward at the start of every cut",
        ],
        &["rod_pressure@start=3 bar", "rod_pressure@steady=450 psi"],
    ));
    assert_eq!(d["symptoms"][0]["id"], "startup-lunge");
    assert_eq!(leading(&d), ("check-valve-leaking".into(), "likely".into()));
    assert_eq!(
        evidence(&d, "check-valve-leaking", "lunge-no-back-pressure-at-start"),
        "the rod side starts at 43.51 psi against 450 psi while running: it lost oil while \
         stopped, so nothing holds the piston until it refills"
    );
}

// ----------------------------------------------------------------- drift

#[test]
fn a_needle_valve_speeds_up_as_the_oil_thins() {
    let d = diagnose(&with(
        &[
            "--machine",
            "sorter-9",
            "--complaint",
            "the chain speeds up as the oil warms up in the afternoon",
        ],
        &[
            "shaft_speed@cold=220 rpm",
            "shaft_speed@hot=262 rpm",
            "oil_temperature@cold=59 degF",
            "oil_temperature@hot=55 degC",
        ],
    ));
    let ids: Vec<&str> = d["symptoms"]
        .as_array()
        .unwrap()
        .iter()
        .map(|s| s["id"].as_str().unwrap())
        .collect();
    assert_eq!(ids, ["drift-warm"]);
    assert_eq!(
        leading(&d),
        ("needle-valve-uncompensated".into(), "confirmed".into())
    );
    assert_eq!(
        evidence(
            &d,
            "needle-valve-uncompensated",
            "drift-needle-follows-viscosity"
        ),
        "the motor goes from 220 rpm cold to 262 rpm hot while the oil thins 6.549 times: the \
         needle's long narrow path meters by viscosity"
    );
}

// ------------------------------------------------------------ low flow

#[test]
fn fine_feed_that_fades_with_the_drop_held_is_a_silting_orifice() {
    let d = diagnose(&with(
        &[
            "--machine",
            "press-4",
            "--complaint",
            "on the fine feed setting it goes stop and start",
        ],
        &[
            "flow@start=0.53 gpm",
            "flow@steady=1.4 L/min",
            "inter_pressure@steady=38 bar",
            "load_pressure@steady=435 psi",
            "pressure_swing=1.5 bar",
        ],
    ));
    assert_eq!(d["symptoms"][0]["id"], "erratic-low-flow");
    assert_eq!(leading(&d), ("orifice-silted".into(), "confirmed".into()));
    assert_eq!(
        evidence(&d, "orifice-silted", "lowflow-flow-decays-with-drop-held"),
        "flow falls from 2.006 L/min to 1.4 L/min during the run while the drop across the \
         orifice holds at 8.008 bar: the opening itself is closing up"
    );
    assert_eq!(status_of(&d, "compensator-sticking"), "unlikely");
}

#[test]
fn fine_feed_with_a_jumping_intermediate_pressure_is_the_spool_not_silt() {
    let d = diagnose(&with(
        &[
            "--machine",
            "press-4",
            "--complaint",
            "on the fine feed setting it goes stop and start",
        ],
        &[
            "flow@start=2 L/min",
            "flow@steady=1.95 L/min",
            "inter_pressure@steady=38 bar",
            "load_pressure@steady=30 bar",
            "pressure_swing=90 psi",
        ],
    ));
    assert_eq!(
        leading(&d),
        ("compensator-sticking".into(), "likely".into())
    );
    assert_eq!(
        evidence(&d, "compensator-sticking", "lowflow-compensator-jumping"),
        "the intermediate pressure swings 6.205 bar peak to peak on a 8 bar compensator; a \
         regulating spool keeps it within 4 bar"
    );
    assert_ne!(status_of(&d, "orifice-silted"), "confirmed");
    assert_ne!(status_of(&d, "orifice-silted"), "likely");
}

// --------------------------------------------------------------- stalled

#[test]
fn flow_that_falls_off_under_pressure_with_a_sound_inlet_is_a_worn_pump() {
    let d = diagnose(&with(
        &[
            "--machine",
            "sorter-9",
            "--complaint",
            "the sorter chain barely moves",
        ],
        &[
            "pump_flow@unloaded=29 L/min",
            "pump_flow@loaded=5.8 gpm",
            "inlet_vacuum@loaded=2 inHg",
            "inlet_vacuum@unloaded=2 inHg",
        ],
    ));
    assert_eq!(d["symptoms"][0]["id"], "slow-or-stalled");
    assert_eq!(leading(&d), ("pump-worn".into(), "confirmed".into()));
    assert_eq!(
        evidence(&d, "pump-worn", "stall-pump-slips-under-pressure"),
        "the pump gives 29 L/min at no load but 21.96 L/min at test pressure, 24.29 % less \
         (limit 15 %), with the inlet at 2 inHg vac (limit 5 inHg vac)"
    );
    assert_ne!(status_of(&d, "inlet-restricted"), "confirmed");
}

#[test]
fn flow_short_even_unloaded_with_a_deep_inlet_vacuum_is_a_restricted_inlet() {
    let d = diagnose(&with(
        &[
            "--machine",
            "sorter-9",
            "--complaint",
            "the sorter chain barely moves",
        ],
        &[
            "pump_flow@unloaded=5.8 gpm",
            "pump_flow@loaded=21 L/min",
            "inlet_vacuum@loaded=9 inHg",
            "inlet_vacuum@unloaded=-0.3 bar",
        ],
    ));
    assert_eq!(leading(&d), ("inlet-restricted".into(), "confirmed".into()));
    assert_eq!(
        evidence(&d, "inlet-restricted", "stall-pump-starved-at-inlet"),
        "unloaded the pump gives only 21.96 L/min of its rated 30 L/min while its inlet pulls \
         8.859 inHg vac (limit 5 inHg vac)"
    );
    assert_eq!(status_of(&d, "pump-worn"), "possible");
}

// ------------------------------------------------------------ overrunning

#[test]
fn a_meter_in_table_that_runs_away_lowering_has_nothing_holding_it() {
    let d = diagnose(&with(
        &[
            "--circuit",
            "restrictive",
            "--placement",
            "meter-in",
            "--actuator",
            "cylinder",
            "--complaint",
            "the table comes down way too fast when lowering",
        ],
        &[
            "bore=4 in",
            "rod=63 mm",
            "load_mass=1500 kg",
            "cap_pressure@loaded=72 psi",
        ],
    ));
    assert_eq!(d["symptoms"][0]["id"], "overrunning-runaway");
    assert_eq!(
        leading(&d),
        ("meter-in-overrunning".into(), "confirmed".into())
    );
    assert_eq!(
        evidence(
            &d,
            "meter-in-overrunning",
            "overrun-weight-beats-outlet-back-pressure"
        ),
        "lowering, the load weighs 14.71 kN but the cap side, at 4.964 bar, holds back only \
         4.025 kN; nothing in a meter-in circuit restrains the rest"
    );
    assert!(d["machine"].is_null());
    assert_eq!(d["actuator"], "cylinder");
}

// -------------------------------------------------------- intensification

#[test]
fn a_rod_gauge_above_the_relief_that_the_area_ratio_explains_is_real() {
    let d = diagnose(&with(
        &[
            "--machine",
            "trim-saw-6",
            "--complaint",
            "rod side gauge reads higher than the relief setting",
        ],
        &[
            "cap_pressure@loaded=69 bar",
            "load_force@loaded=500 lbf",
            "rod_pressure@loaded=1290 psi",
            "cylinder_rating=3000 psi",
        ],
    ));
    // The reading is explained, so it is not a gauge problem.
    assert!(
        d["consistency"].as_array().unwrap().is_empty(),
        "{:#}",
        d["consistency"]
    );
    assert_eq!(
        leading(&d),
        ("meter-out-intensification".into(), "confirmed".into())
    );
    assert_eq!(
        evidence(
            &d,
            "meter-out-intensification",
            "intens-breakthrough-over-relief"
        ),
        "cutting at 1001 psi on the cap side, the rod side jumps to 1435 psi when the saw breaks \
         through, over the 1200 psi relief"
    );
    assert_eq!(
        evidence(
            &d,
            "meter-out-intensification",
            "intens-rod-gauge-explained-by-ratio"
        ),
        "the rod gauge reads 1290 psi, over the 1200 psi relief, and the cap pressure 1001 psi \
         with a 500 lbf load predicts 1289 psi: the reading is real"
    );
    let cautions: Vec<&str> = d["cautions"]
        .as_array()
        .unwrap()
        .iter()
        .map(|c| c["id"].as_str().unwrap())
        .collect();
    assert!(cautions.contains(&"intensification"), "{cautions:?}");
    assert!(cautions.contains(&"gravity-load"), "{cautions:?}");
}

// ------------------------------------------------------ impossible readings

#[test]
fn load_above_supply_is_flagged_before_any_component() {
    let d = diagnose(&with(
        &[
            "--machine",
            "press-4",
            "--complaint",
            "the gauges don't add up, it bogs under load",
        ],
        &[
            "supply_pressure@unloaded=150 bar",
            "inter_pressure@unloaded=38 bar",
            "load_pressure@unloaded=30 bar",
            "supply_pressure@loaded=1740 psi",
            "inter_pressure@loaded=143.5 bar",
            "load_pressure@loaded=140 bar",
        ],
    ));
    let problems = d["consistency"].as_array().unwrap();
    assert_eq!(problems[0]["rule"], "read-load-above-supply");
    assert_eq!(
        problems[0]["message"],
        "Load pressure reads above supply pressure on a meter-in valve that is passing flow: \
         downstream of the valve reads 140 bar but upstream only 120 bar; oil cannot flow \
         uphill, and two 250 bar gauges differ by at most 10 bar"
    );
    assert_eq!(d["fix"]["cause"], "gauge-error");
    for c in d["causes"].as_array().unwrap() {
        assert!(
            c["status"] != "confirmed" && c["status"] != "likely",
            "{c:#}"
        );
    }
    let held = d["causes"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["cause"] == "insufficient-headroom")
        .unwrap();
    assert_eq!(held["on_hold"], true);
}

#[test]
fn one_gauge_read_twice_with_two_answers_is_reported_first() {
    let mut pairs = SAG_STICKING.to_vec();
    pairs.push("supply_pressure@loaded=1500 psi");
    let d = diagnose(&with(
        &[
            "--machine",
            "press-4",
            "--complaint",
            "it bogs down under load",
        ],
        &pairs,
    ));
    assert_eq!(d["consistency"][0]["rule"], "same-reading-twice");
    assert_eq!(
        d["consistency"][0]["message"],
        "`supply_pressure@loaded` was given twice and the two disagree: 185 bar and 1500 psi \
         (44 % apart); the first is used"
    );
    assert_eq!(d["fix"]["cause"], "gauge-error");
    assert_eq!(status_of(&d, "compensator-sticking"), "possible");
}

// ------------------------------------------------------------ units

#[test]
fn units_given_win_over_the_machine_and_the_machine_wins_over_metric() {
    let press = |extra: &[&'static str]| {
        let mut args = vec!["--machine", "press-4", "--complaint", "it bogs under load"];
        args.extend_from_slice(extra);
        args.extend(readings(SAG_STICKING));
        diagnose(&args)
    };
    assert_eq!(press(&[])["units"], "metric");
    let us = press(&["--units", "us"]);
    assert_eq!(us["units"], "us");
    assert!(evidence(
        &us,
        "compensator-sticking",
        "sag-drop-collapses-with-headroom"
    )
    .contains("supply stands 652.7 psi over the load"));
    let table = diagnose(&["--machine", "lift-table-5", "--complaint", "table hunts"]);
    assert_eq!(table["units"], "us");
    let metric = diagnose(&[
        "--units",
        "metric",
        "--machine",
        "lift-table-5",
        "--complaint",
        "table hunts",
    ]);
    assert_eq!(metric["units"], "metric");
}

// --------------------------------------------------------------- bad input

#[track_caller]
fn fails(args: &[&str], message: &str) {
    let output = run(args);
    assert_eq!(stderr(&output), message);
    assert_eq!(stdout(&output), "");
    assert_eq!(output.status.code(), Some(2));
}

#[test]
fn an_unknown_machine_names_the_nearest() {
    fails(
        &["--machine", "press-5", "--complaint", "bogs"],
        "error: unknown machine `press-5` (did you mean `press-4`?)\n",
    );
}

#[test]
fn an_unknown_reading_names_the_nearest() {
    fails(
        &[
            "--machine",
            "press-4",
            "--complaint",
            "bogs",
            "--reading",
            "flwo@loaded=14 L/min",
        ],
        "error: reading `flwo@loaded`: unknown quantity `flwo` (did you mean `flow`?)\n",
    );
}

#[test]
fn a_unit_of_the_wrong_kind_is_refused() {
    fails(
        &[
            "--machine",
            "press-4",
            "--complaint",
            "bogs",
            "--reading",
            "supply_pressure@loaded=185 L/min",
        ],
        "error: reading `supply_pressure@loaded`: `185 L/min`: `L/min` is a flow unit, but a \
         pressure is expected (e.g. psi, bar, kPa, MPa, psia, inHg (vacuum))\n",
    );
    fails(
        &["--machine", "press-4", "--complaint", "bogs", "--reading", "supply_pressure@loaded=185 barr"],
        "error: reading `supply_pressure@loaded`: `185 barr`: unknown unit `barr` (did you mean `bar`?)\n",
    );
}

#[test]
fn a_machine_and_a_contradicting_circuit_are_refused() {
    fails(
        &[
            "--machine",
            "press-4",
            "--circuit",
            "bypass",
            "--complaint",
            "bogs",
        ],
        "error: the argument '--machine <ID>' cannot be used with '--circuit <CIRCUIT>'\n\n\
         Usage: spoolsleuth diagnose --machine <ID> --complaint <TEXT>\n\n\
         For more information, try '--help'.\n",
    );
}

#[test]
fn an_empty_complaint_is_refused_with_the_known_symptoms() {
    fails(
        &["--machine", "press-4", "--complaint", "  "],
        "error: nothing to diagnose: give a complaint with --complaint \"...\" or a symptom with \
         --symptom ID (known: speed-sags-under-load, no-compensation-supply-swing, hunting, \
         runs-hot, startup-lunge, drift-warm, erratic-low-flow, slow-or-stalled, \
         overrunning-runaway, meter-out-intensification, impossible-readings)\n",
    );
}

#[test]
fn an_unknown_symptom_names_the_nearest() {
    fails(
        &["--machine", "press-4", "--symptom", "huntin"],
        "error: unknown symptom `huntin` (did you mean `hunting`?)\n",
    );
}

#[test]
fn a_readings_file_error_points_at_its_line() {
    let dir = TempDir::new().unwrap();
    std::fs::write(
        dir.path().join("readings.yaml"),
        "supply_pressure@loaded: 185 bar\nload_presure@loaded: 140 bar\n",
    )
    .unwrap();
    let output = spoolsleuth(dir.path())
        .args([
            "diagnose",
            "--machine",
            "press-4",
            "--complaint",
            "bogs",
            "--readings",
            "readings.yaml",
        ])
        .output()
        .unwrap();
    assert_eq!(
        stderr(&output),
        "error: readings.yaml:2:1: `load_presure@loaded`: unknown quantity `load_presure` (did \
         you mean `load_pressure`?)\n"
    );
    assert_eq!(output.status.code(), Some(2));
}

#[test]
fn a_readings_file_gives_the_same_diagnosis_as_the_options() {
    let dir = TempDir::new().unwrap();
    let yaml: String = SAG_STICKING
        .iter()
        .map(|r| {
            let (name, value) = r.split_once('=').unwrap();
            format!("{name}: {value}\n")
        })
        .collect();
    std::fs::write(dir.path().join("readings.yaml"), yaml).unwrap();
    let output = spoolsleuth(dir.path())
        .args([
            "diagnose",
            "--machine",
            "press-4",
            "--complaint",
            "bogs",
            "--readings",
            "readings.yaml",
            "--json",
        ])
        .output()
        .unwrap();
    let from_file: Value = serde_json::from_slice(&output.stdout).unwrap();
    let from_options = diagnose(&with(
        &["--machine", "press-4", "--complaint", "bogs"],
        SAG_STICKING,
    ));
    assert_eq!(from_file["causes"], from_options["causes"]);
}

// ----------------------------------------------------------- user machines

#[test]
fn a_machine_from_the_cases_folder_is_diagnosed_in_its_own_units() {
    let dir = TempDir::new().unwrap();
    let machines = dir.path().join("plant").join("machines");
    std::fs::create_dir_all(&machines).unwrap();
    std::fs::write(
        machines.join("edger-1.yaml"),
        "version: 1\nid: edger-1\nname: Edger infeed\nunits: us\ncircuit: restrictive\n\
         placement: meter-in\nactuator: cylinder\nnameplate:\n  bore: 3 in\n  spring_setting: 100 psi\n",
    )
    .unwrap();
    let output = spoolsleuth(dir.path())
        .args([
            "diagnose",
            "--cases",
            "plant",
            "--machine",
            "edger-1",
            "--complaint",
            "it bogs down",
            "--json",
        ])
        .args(readings(SAG_STICKING))
        .output()
        .unwrap();
    assert_eq!(output.status.code(), Some(0), "{}", stderr(&output));
    let d: Value = serde_json::from_slice(&output.stdout).unwrap();
    assert_eq!(d["machine"]["id"], "edger-1");
    assert_eq!(d["units"], "us");
    assert_eq!(
        leading(&d),
        ("compensator-sticking".into(), "confirmed".into())
    );
    assert!(d["similar_cases"].as_array().unwrap().is_empty());
}

// ------------------------------------------------------------- the shapes

/// The top-level keys documented in README.md under "Diagnosis JSON".
const DOCUMENTED_KEYS: [&str; 17] = [
    "actuator",
    "causes",
    "cautions",
    "circuit",
    "closing",
    "complaint",
    "consistency",
    "fix",
    "machine",
    "next_measurement",
    "placement",
    "readings",
    "schema_version",
    "similar_cases",
    "symptoms",
    "units",
    "warnings",
];

#[test]
fn the_json_has_exactly_the_documented_keys() {
    let d = diagnose(&with(
        &["--machine", "press-4", "--complaint", "bogs"],
        SAG_STICKING,
    ));
    let mut keys: Vec<&str> = d.as_object().unwrap().keys().map(String::as_str).collect();
    keys.sort_unstable();
    let mut documented = DOCUMENTED_KEYS.to_vec();
    documented.sort_unstable();
    assert_eq!(keys, documented);
    assert_eq!(d["schema_version"], 1);
    let readme =
        std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/README.md")).unwrap();
    let section = readme.split("## Diagnosis JSON").nth(1).unwrap();
    for key in &documented {
        assert!(
            section.contains(&format!("| `{key}` |")),
            "README lacks `{key}`"
        );
    }
}

// ------------------------------------------------------------ whole reports

/// A fixed breakdown call that fills every section: impossible readings,
/// causes on hold, a next measurement, the gauge fix with its cautions,
/// past cases from the built-in notes and a vacuum warning.
const WHOLE: &[&str] = &[
    "--units",
    "us",
    "--circuit",
    "restrictive",
    "--placement",
    "meter-in",
    "--actuator",
    "cylinder",
    "--complaint",
    "it bogs under load and the gauges don't add up",
    "--reading",
    "spring_setting=8 bar",
    "--reading",
    "gauge_full_scale=250 bar",
    "--reading",
    "supply_pressure@loaded=1740 psi",
    "--reading",
    "inter_pressure@loaded=143.5 bar",
    "--reading",
    "load_pressure@loaded=140 bar",
    "--reading",
    "inlet_vacuum@loaded=3 inHg",
];

#[track_caller]
fn whole(extra: &[&str], expected: &str) {
    let mut args = WHOLE.to_vec();
    args.extend_from_slice(extra);
    let output = run(&args);
    assert_eq!(stderr(&output), "");
    assert_eq!(output.status.code(), Some(0));
    let actual = stdout(&output);
    if actual != expected {
        for (n, (a, e)) in actual.lines().zip(expected.lines()).enumerate() {
            assert_eq!(a, e, "first difference at line {}", n + 1);
        }
        assert_eq!(actual, expected);
    }
}

#[test]
fn the_table_report_whole() {
    whole(&[], TABLE_REPORT);
}

#[test]
fn the_markdown_report_whole() {
    whole(&["--format", "markdown"], MARKDOWN_REPORT);
}

const TABLE_REPORT: &str = r#"Machine: ad-hoc circuit (no machine profile)
Circuit: restrictive, meter-in, cylinder
Units: us
Complaint: "it bogs under load and the gauges don't add up"
Symptoms: Speed sags under load (speed-sags-under-load, recognised); Readings that cannot all be true (impossible-readings, recognised)

Readings (us)
┌────────────────────────┬──────────────────────────────┬────────────┬──────────┐
│ reading                ┆ what                         ┆ value      ┆ warnings │
╞════════════════════════╪══════════════════════════════╪════════════╪══════════╡
│ gauge_full_scale       ┆ Gauge full scale             ┆ 3626 psi   ┆          │
│ inlet_vacuum@loaded    ┆ Pump inlet pressure (vacuum) ┆ -1.473 psi ┆          │
│ inter_pressure@loaded  ┆ Intermediate pressure        ┆ 2081 psi   ┆          │
│ load_pressure@loaded   ┆ Load pressure                ┆ 2031 psi   ┆          │
│ spring_setting         ┆ Compensator setting          ┆ 116 psi    ┆          │
│ supply_pressure@loaded ┆ Supply pressure              ┆ 1740 psi   ┆          │
└────────────────────────┴──────────────────────────────┴────────────┴──────────┘

!! Readings that cannot all be true: check the gauges before blaming any component
A gauge or meter is wrong, or was read at the wrong port. No component is confirmed until the readings agree; re-read them on a gauge you trust.
  - read-load-above-supply: Load pressure reads above supply pressure on a meter-in valve that is passing flow: downstream of the valve reads 2031 psi but upstream only 1740 psi; oil cannot flow uphill, and two 3626 psi gauges differ by at most 145 psi
  - read-inter-outside-bracket: The intermediate pressure is not between supply and load pressure: the intermediate port reads 2081 psi, outside the 2031 psi to 1740 psi it must lie between (allowing 145 psi for the gauges)

Causes, most likely first
┌───┬──────────────────────────────────────┬─────────────────────────────┬───────┬─────────────────────────────────────┐
│ # ┆ cause                                ┆ status                      ┆ score ┆ evidence                            │
╞═══╪══════════════════════════════════════╪═════════════════════════════╪═══════╪═════════════════════════════════════╡
│ 1 ┆ Too little supply headroom           ┆ possible (on hold: readings ┆ 81 %  ┆ sag-headroom-short (holds,          │
│   ┆ (insufficient-headroom)              ┆ disagree)                   ┆       ┆ confirms): under load supply is     │
│   ┆                                      ┆                             ┆       ┆ only -290.5 psi above the load; the │
│   ┆                                      ┆                             ┆       ┆ valve needs 145 psi (its 116 psi    │
│   ┆                                      ┆                             ┆       ┆ setting plus 29.01 psi for the      │
│   ┆                                      ┆                             ┆       ┆ compensator)                        │
│ 2 ┆ Cylinder piston seal bypassing       ┆ not yet tested              ┆ 30 %  ┆ drift-midstroke-test-fails (not yet │
│   ┆ (cylinder-seal-bypass)               ┆                             ┆       ┆ tested): needs cap_pressure@held,   │
│   ┆                                      ┆                             ┆       ┆ midstroke_expected_difference@held, │
│   ┆                                      ┆                             ┆       ┆ rod_pressure@held                   │
│   ┆                                      ┆                             ┆       ┆ sag-cylinder-slower-than-its-flow   │
│   ┆                                      ┆                             ┆       ┆ (not yet tested): needs             │
│   ┆                                      ┆                             ┆       ┆ cylinder_flow@loaded, flow@loaded,  │
│   ┆                                      ┆                             ┆       ┆ flow_sag                            │
│   ┆                                      ┆                             ┆       ┆ stall-stroke-slower-than-flow (not  │
│   ┆                                      ┆                             ┆       ┆ yet tested): needs cap_area,        │
│   ┆                                      ┆                             ┆       ┆ flow@loaded, stroke_speed@loaded    │
│ 3 ┆ Oil too hot (too thin)               ┆ not yet tested              ┆ 30 %  ┆ heat-oil-past-its-grade (not yet    │
│   ┆ (oil-too-hot)                        ┆                             ┆       ┆ tested): needs oil_temperature@hot, │
│   ┆                                      ┆                             ┆       ┆ reservoir_temperature@hot,          │
│   ┆                                      ┆                             ┆       ┆ running_viscosity@hot               │
│   ┆                                      ┆                             ┆       ┆ sag-oil-too-thin-under-load (not    │
│   ┆                                      ┆                             ┆       ┆ yet tested): needs                  │
│   ┆                                      ┆                             ┆       ┆ running_viscosity@loaded            │
│ 4 ┆ Pump worn                            ┆ not yet tested              ┆ 30 %  ┆ stall-pump-slips-under-pressure     │
│   ┆ (pump-worn)                          ┆                             ┆       ┆ (not yet tested): needs             │
│   ┆                                      ┆                             ┆       ┆ pump_flow_loss                      │
│ 5 ┆ Relief set too low                   ┆ not yet tested              ┆ 25 %  ┆ stall-supply-stops-below-relief     │
│   ┆ (relief-set-low)                     ┆                             ┆       ┆ (not yet tested): needs             │
│   ┆                                      ┆                             ┆       ┆ relief_setting                      │
│ 6 ┆ Compensator spring weak or broken    ┆ not yet tested              ┆ 15 %  ┆ sag-drop-low-at-every-load (not yet │
│   ┆ (compensator-spring-weak)            ┆                             ┆       ┆ tested): needs                      │
│   ┆                                      ┆                             ┆       ┆ metering_drop@unloaded,             │
│   ┆                                      ┆                             ┆       ┆ supply_headroom@unloaded            │
│ 7 ┆ Compensator spool sticking           ┆ unlikely                    ┆ 12 %  ┆ sag-drop-collapses-with-headroom    │
│   ┆ (compensator-sticking)               ┆                             ┆       ┆ (does not hold, weakens): decided   │
│   ┆                                      ┆                             ┆       ┆ on drop_floor = 104.7 psi,          │
│   ┆                                      ┆                             ┆       ┆ metering_drop@loaded = 50.76 psi,   │
│   ┆                                      ┆                             ┆       ┆ required_headroom = 145 psi,        │
│   ┆                                      ┆                             ┆       ┆ supply_headroom@loaded = -290.5 psi │
│   ┆                                      ┆                             ┆       ┆ (check: metering_drop@unloaded >=   │
│   ┆                                      ┆                             ┆       ┆ drop_floor and metering_drop@loaded │
│   ┆                                      ┆                             ┆       ┆ < drop_floor and                    │
│   ┆                                      ┆                             ┆       ┆ supply_headroom@loaded >=           │
│   ┆                                      ┆                             ┆       ┆ required_headroom)                  │
└───┴──────────────────────────────────────┴─────────────────────────────┴───────┴─────────────────────────────────────┘

Next measurement
  what:       Load pressure (load_pressure@loaded)
  when:       running at working load (cutting, pressing, carrying)
  where/how:  Read it again at the same port and operating point with a second gauge of known accuracy (or swap the two gauges) and check the unit it was written in. Gauge on the test coupling at the actuator port the valve feeds (or at the valve's outlet port), read while the actuator moves at working load.
  instrument: 0–250 bar / 0–3600 psi gauge
  why:        the readings cannot all be true (read-load-above-supply): settle the gauges before any component is blamed
  caution: Fluid injection: A pin-hole jet can pierce skin from about 100 psi (7 bar). Search for leaks with a piece of card or wood, never a hand; wear eye and hand protection. Anyone hit by a jet goes to hospital at once and tells the staff it is an injection injury: the oil must be removed surgically within hours.
  caution: Gauge and test-hose rating: Use gauges, test hoses and couplings rated above the highest pressure the port can reach (relief setting, or the intensified pressure on a rod side), and a snubber where pressure spikes. Keep a gauge on the pump while you change any setting and never set a relief above the rating of the lowest-rated part.
  caution: Raised and suspended loads: Lower the load to the ground or block it mechanically (props, transport locks) before opening lines or removing valves. Never leave a raised load on cylinders, hoses or holding valves, and never stand or reach under it.
  caution: Moving machinery: Keep guards on when the machine runs for a test; read speeds with an optical tachometer from outside the guard. Keep hands, tools and test hoses clear of moving parts and of the actuator's path, and have someone at the emergency stop.

Fix for the leading cause
Gauge or meter error (gauge-error)
  Check the gauge against a known good one, confirm which port each gauge is on and in which units, and retake the readings before acting on them.

Safety
  ! Gauge and test-hose rating: Use gauges, test hoses and couplings rated above the highest pressure the port can reach (relief setting, or the intensified pressure on a rod side), and a snubber where pressure spikes. Keep a gauge on the pump while you change any setting and never set a relief above the rating of the lowest-rated part.
  ! Fluid injection: A pin-hole jet can pierce skin from about 100 psi (7 bar). Search for leaks with a piece of card or wood, never a hand; wear eye and hand protection. Anyone hit by a jet goes to hospital at once and tells the staff it is an injection injury: the oil must be removed surgically within hours.
  ! Raised and suspended loads: Lower the load to the ground or block it mechanically (props, transport locks) before opening lines or removing valves. Never leave a raised load on cylinders, hoses or holding valves, and never stand or reach under it.
  ! Moving machinery: Keep guards on when the machine runs for a test; read speeds with an optical tachometer from outside the guard. Keep hands, tools and test hoses clear of moving parts and of the actuator's path, and have someone at the emergency stop.

Similar past cases
┌────────────┬────────────┬──────────────────────┬───────────────────────────────────────┬─────────────────────────────┐
│ date       ┆ machine    ┆ cause                ┆ what happened                         ┆ id                          │
╞════════════╪════════════╪══════════════════════╪═══════════════════════════════════════╪═════════════════════════════╡
│ 2020-06-22 ┆ conveyor-7 ┆ motor-worn           ┆ Conveyor loses speed under the heavy  ┆ 2020-06-22-conveyor-7-motor │
│            ┆            ┆                      ┆ beam loads. Pump flow fine,           ┆                             │
│            ┆            ┆                      ┆ compensator in the bypass valve ok.   ┆                             │
│            ┆            ┆                      ┆ Measured case drain on the motor: 6   ┆                             │
│            ┆            ┆                      ┆ L/min, way too much                   ┆                             │
│ 2021-12-01 ┆ carriage-2 ┆ motor-worn           ┆ Margin right, pump right, but the     ┆ 2021-12-01-carriage-2-motor │
│            ┆            ┆                      ┆ carriage loses speed under load.      ┆                             │
│            ┆            ┆                      ┆ Motor case drain measured 3.5 gpm     ┆                             │
│            ┆            ┆                      ┆ into a bucket, should be under 0.5.   ┆                             │
│            ┆            ┆                      ┆ Motor worn out. New                   ┆                             │
│ 2021-01-25 ┆ press-4    ┆ compensator-sticking ┆ Third time for this one. Spool in the ┆ 2021-01-25-press-4-silt     │
│            ┆            ┆                      ┆ compensater hangs, speed drops off    ┆                             │
│            ┆            ┆                      ┆ when the platens load up. Oil         ┆                             │
│            ┆            ┆                      ┆ cleanliness 22/20/17, way too dirty   ┆                             │
│            ┆            ┆                      ┆ for a compensated                     ┆                             │
└────────────┴────────────┴──────────────────────┴───────────────────────────────────────┴─────────────────────────────┘

Warnings
  - `inlet_vacuum@loaded` = 3 inHg: converted to gauge with the standard atmosphere (101.325 kPa); give a barometer reading if the site is high

spoolsleuth supports, and does not replace, local codes, the machine maker's instructions and licensed practice; when they differ, follow them.
"#;

const MARKDOWN_REPORT: &str = r#"# Diagnosis: ad-hoc circuit (no machine profile)

- **Circuit:** restrictive, meter-in, cylinder
- **Units:** us
- **Complaint:** "it bogs under load and the gauges don't add up"
- **Symptoms:** Speed sags under load (speed-sags-under-load, recognised); Readings that cannot all be true (impossible-readings, recognised)

## Readings (us)

| reading | what | value | warnings |
|---|---|---|---|
| `gauge_full_scale` | Gauge full scale | 3626 psi |  |
| `inlet_vacuum@loaded` | Pump inlet pressure (vacuum) | -1.473 psi |  |
| `inter_pressure@loaded` | Intermediate pressure | 2081 psi |  |
| `load_pressure@loaded` | Load pressure | 2031 psi |  |
| `spring_setting` | Compensator setting | 116 psi |  |
| `supply_pressure@loaded` | Supply pressure | 1740 psi |  |

## Readings that cannot all be true: check the gauges before blaming any component

> **A gauge or meter is wrong, or was read at the wrong port. No component is confirmed until the readings agree; re-read them on a gauge you trust.**

- `read-load-above-supply`: Load pressure reads above supply pressure on a meter-in valve that is passing flow: downstream of the valve reads 2031 psi but upstream only 1740 psi; oil cannot flow uphill, and two 3626 psi gauges differ by at most 145 psi
- `read-inter-outside-bracket`: The intermediate pressure is not between supply and load pressure: the intermediate port reads 2081 psi, outside the 2031 psi to 1740 psi it must lie between (allowing 145 psi for the gauges)

## Causes, most likely first

| # | cause | status | score |
|---|---|---|---|
| 1 | Too little supply headroom (`insufficient-headroom`) | possible (on hold: readings disagree) | 81 % |
| 2 | Cylinder piston seal bypassing (`cylinder-seal-bypass`) | not yet tested | 30 % |
| 3 | Oil too hot (too thin) (`oil-too-hot`) | not yet tested | 30 % |
| 4 | Pump worn (`pump-worn`) | not yet tested | 30 % |
| 5 | Relief set too low (`relief-set-low`) | not yet tested | 25 % |
| 6 | Compensator spring weak or broken (`compensator-spring-weak`) | not yet tested | 15 % |
| 7 | Compensator spool sticking (`compensator-sticking`) | unlikely | 12 % |

### 1. Too little supply headroom (possible (on hold: readings disagree), 81 %)

- sag-headroom-short (holds, confirms): under load supply is only -290.5 psi above the load; the valve needs 145 psi (its 116 psi setting plus 29.01 psi for the compensator)

### 2. Cylinder piston seal bypassing (not yet tested, 30 %)

- drift-midstroke-test-fails (not yet tested): needs cap_pressure@held, midstroke_expected_difference@held, rod_pressure@held
- sag-cylinder-slower-than-its-flow (not yet tested): needs cylinder_flow@loaded, flow@loaded, flow_sag
- stall-stroke-slower-than-flow (not yet tested): needs cap_area, flow@loaded, stroke_speed@loaded

### 3. Oil too hot (too thin) (not yet tested, 30 %)

- heat-oil-past-its-grade (not yet tested): needs oil_temperature@hot, reservoir_temperature@hot, running_viscosity@hot
- sag-oil-too-thin-under-load (not yet tested): needs running_viscosity@loaded

### 4. Pump worn (not yet tested, 30 %)

- stall-pump-slips-under-pressure (not yet tested): needs pump_flow_loss

### 5. Relief set too low (not yet tested, 25 %)

- stall-supply-stops-below-relief (not yet tested): needs relief_setting

### 6. Compensator spring weak or broken (not yet tested, 15 %)

- sag-drop-low-at-every-load (not yet tested): needs metering_drop@unloaded, supply_headroom@unloaded

### 7. Compensator spool sticking (unlikely, 12 %)

- sag-drop-collapses-with-headroom (does not hold, weakens): decided on drop_floor = 104.7 psi, metering_drop@loaded = 50.76 psi, required_headroom = 145 psi, supply_headroom@loaded = -290.5 psi (check: metering_drop@unloaded >= drop_floor and metering_drop@loaded < drop_floor and supply_headroom@loaded >= required_headroom)

## Next measurement

- **What:** Load pressure (load_pressure@loaded)
- **When:** running at working load (cutting, pressing, carrying)
- **Where/how:** Read it again at the same port and operating point with a second gauge of known accuracy (or swap the two gauges) and check the unit it was written in. Gauge on the test coupling at the actuator port the valve feeds (or at the valve's outlet port), read while the actuator moves at working load.
- **Instrument:** 0–250 bar / 0–3600 psi gauge
- **Why:** the readings cannot all be true (read-load-above-supply): settle the gauges before any component is blamed
- **Caution:** Fluid injection: A pin-hole jet can pierce skin from about 100 psi (7 bar). Search for leaks with a piece of card or wood, never a hand; wear eye and hand protection. Anyone hit by a jet goes to hospital at once and tells the staff it is an injection injury: the oil must be removed surgically within hours.
- **Caution:** Gauge and test-hose rating: Use gauges, test hoses and couplings rated above the highest pressure the port can reach (relief setting, or the intensified pressure on a rod side), and a snubber where pressure spikes. Keep a gauge on the pump while you change any setting and never set a relief above the rating of the lowest-rated part.
- **Caution:** Raised and suspended loads: Lower the load to the ground or block it mechanically (props, transport locks) before opening lines or removing valves. Never leave a raised load on cylinders, hoses or holding valves, and never stand or reach under it.
- **Caution:** Moving machinery: Keep guards on when the machine runs for a test; read speeds with an optical tachometer from outside the guard. Keep hands, tools and test hoses clear of moving parts and of the actuator's path, and have someone at the emergency stop.

## Fix for the leading cause

**Gauge or meter error** (`gauge-error`): Check the gauge against a known good one, confirm which port each gauge is on and in which units, and retake the readings before acting on them.

## Safety

- **Gauge and test-hose rating:** Use gauges, test hoses and couplings rated above the highest pressure the port can reach (relief setting, or the intensified pressure on a rod side), and a snubber where pressure spikes. Keep a gauge on the pump while you change any setting and never set a relief above the rating of the lowest-rated part.
- **Fluid injection:** A pin-hole jet can pierce skin from about 100 psi (7 bar). Search for leaks with a piece of card or wood, never a hand; wear eye and hand protection. Anyone hit by a jet goes to hospital at once and tells the staff it is an injection injury: the oil must be removed surgically within hours.
- **Raised and suspended loads:** Lower the load to the ground or block it mechanically (props, transport locks) before opening lines or removing valves. Never leave a raised load on cylinders, hoses or holding valves, and never stand or reach under it.
- **Moving machinery:** Keep guards on when the machine runs for a test; read speeds with an optical tachometer from outside the guard. Keep hands, tools and test hoses clear of moving parts and of the actuator's path, and have someone at the emergency stop.

## Similar past cases

| date | machine | cause | what happened | id |
|---|---|---|---|---|
| 2020-06-22 | conveyor-7 | `motor-worn` | Conveyor loses speed under the heavy beam loads. Pump flow fine, compensator in the bypass valve ok. Measured case drain on the motor: 6 L/min, way too much | `2020-06-22-conveyor-7-motor` |
| 2021-12-01 | carriage-2 | `motor-worn` | Margin right, pump right, but the carriage loses speed under load. Motor case drain measured 3.5 gpm into a bucket, should be under 0.5. Motor worn out. New | `2021-12-01-carriage-2-motor` |
| 2021-01-25 | press-4 | `compensator-sticking` | Third time for this one. Spool in the compensater hangs, speed drops off when the platens load up. Oil cleanliness 22/20/17, way too dirty for a compensated | `2021-01-25-press-4-silt` |

## Warnings

- `inlet_vacuum@loaded` = 3 inHg: converted to gauge with the standard atmosphere (101.325 kPa); give a barometer reading if the site is high

---

*spoolsleuth supports, and does not replace, local codes, the machine maker's instructions and licensed practice; when they differ, follow them.*
"#;

mod report_files {
    fn run(dir: &std::path::Path, report: &str) -> std::process::Output {
        super::spoolsleuth(dir)
            .arg("diagnose")
            .args(spoolsleuth::diagnosis::DEMO_CALL.arguments())
            .args(["--index-dir", "index", "--report", report])
            .output()
            .unwrap()
    }

    #[test]
    fn a_markdown_work_order_has_every_section_and_a_sign_off() {
        let dir = tempfile::tempdir().unwrap();
        let out = run(dir.path(), "work-order.md");
        assert_eq!(
            out.status.code(),
            Some(0),
            "{}",
            String::from_utf8_lossy(&out.stderr)
        );
        assert!(String::from_utf8_lossy(&out.stderr).contains("report written to work-order.md"));
        let md = std::fs::read_to_string(dir.path().join("work-order.md")).unwrap();
        let headings: Vec<&str> = md.lines().filter(|l| l.starts_with("## ")).collect();
        for wanted in [
            "## Readings (metric)",
            "## Causes, most likely first",
            "## Sign-off",
        ] {
            assert!(
                headings.contains(&wanted),
                "{wanted} missing from {headings:?}"
            );
        }
        assert!(md.contains("3.5 bar under load"), "{md}");
        assert!(md.contains("licensed practice"));
    }

    #[test]
    fn an_html_work_order_carries_the_valve_chart_with_both_points() {
        let dir = tempfile::tempdir().unwrap();
        let out = run(dir.path(), "work-order.html");
        assert_eq!(
            out.status.code(),
            Some(0),
            "{}",
            String::from_utf8_lossy(&out.stderr)
        );
        let html = std::fs::read_to_string(dir.path().join("work-order.html")).unwrap();
        assert_eq!(html.matches("<svg").count(), 1, "one inline chart");
        assert!(html.contains("<h2>What the valve is doing</h2>"));
        // 150 − 30 = 120 bar and 185 − 140 = 45 bar over the load (derived).
        assert!(html.contains("unloaded, 120 bar · 20 L/min, within the healthy band"));
        assert!(html.contains("loaded, 45 bar · 14.2 L/min, 29 % below the set flow"));
        assert!(!html.contains("<script"), "no scripts");
        assert!(!html.contains("<link"), "no external resources");
    }

    #[test]
    fn a_report_of_an_unknown_kind_is_refused_before_anything_is_written() {
        let dir = tempfile::tempdir().unwrap();
        let out = run(dir.path(), "work-order.pdf");
        assert_eq!(out.status.code(), Some(2));
        assert!(out.stdout.is_empty(), "nothing printed before the refusal");
        assert!(String::from_utf8_lossy(&out.stderr).contains(
            "error: --report: `work-order.pdf`: a report is written as .html or .md (the file name's extension chooses)"
        ));
        assert!(!dir.path().join("work-order.pdf").exists());
    }
}
