//! Arguments of `spoolsleuth chart` (clap derive structs only).
//!
//! Readings are taken as text and parsed with their units by the units module.

use std::path::PathBuf;

use clap::Args;

/// Draw the valve characteristic with the measured operating points.
#[derive(Debug, Args)]
#[command(
    long_about = "Draw what a restrictive (2-way) pressure-compensated flow control does: \
flow against supply minus load pressure, rising like an orifice until the compensator \
starts to throttle, then held on the plateau, with the healthy band around the set flow \
and each measured operating point as a labelled marker. The chart is one SVG file with \
no external reference; open it in any browser.\n\n\
The plateau's droop or rise comes from a force balance on the compensator spool \
(spring preload and rate against the metering drop and the flow force); the defaults are \
an assumed 10 mm spool with a 5 N/mm spring in 870 kg/m³ oil.\n\n\
Example: spoolsleuth chart --flow-set \"20 L/min\" --setting \"8 bar\" \
--point \"loaded:185 bar,140 bar,14.2 L/min\" --output valve.svg"
)]
pub struct ChartArguments {
    /// Healthy band around the set flow [default: the rule base's regulation_band]
    #[arg(long, value_name = "FRACTION")]
    pub band: Option<String>,
    /// Oil density, or a specific gravity such as 0.87
    #[arg(long, default_value = "870 kg/m^3", value_name = "DENSITY")]
    pub density: String,
    /// Set flow of the valve [default: the machine's nameplate flow_set]
    #[arg(long, value_name = "FLOW")]
    pub flow_set: Option<String>,
    /// Opening of the compensator's throttling edge with the spool at rest
    #[arg(
        long,
        value_name = "LENGTH",
        long_help = "Opening of the compensator's throttling edge with the spool at rest. \
The default, 1.788 mm, is the edge that puts the assumed spool at 0.5 mm of stroke at \
10 bar and 1.5 mm at 200 bar of compensator drop."
    )]
    pub full_opening: Option<String>,
    /// Machine profile whose nameplate gives flow_set and spring_setting
    #[arg(long, value_name = "ID")]
    pub machine: Option<String>,
    /// Largest supply minus load on the chart [default: from the points]
    #[arg(long, value_name = "PRESSURE")]
    pub max_drop: Option<String>,
    /// Drop across the wide-open compensator at the set flow
    #[arg(
        long,
        value_name = "PRESSURE",
        long_help = "Drop across the wide-open compensator at the set flow; with the \
spring setting it sets where the valve starts to regulate. The default, 5.189 bar, goes \
with the default --full-opening."
    )]
    pub open_drop: Option<String>,
    /// Where to write the SVG [default: standard output]
    #[arg(long, short, value_name = "FILE")]
    pub output: Option<PathBuf>,
    /// A measured operating point: NAME:SUPPLY,LOAD,FLOW (repeatable)
    #[arg(
        long,
        value_name = "NAME:SUPPLY,LOAD,FLOW",
        long_help = "A measured operating point: its name, then supply pressure, load \
pressure and flow, each with its unit, e.g. --point \"loaded:185 bar,140 bar,14.2 L/min\". \
Give it once per operating point."
    )]
    pub point: Vec<String>,
    /// Metering drop the compensator spring sets [default: the nameplate spring_setting]
    #[arg(long, value_name = "PRESSURE")]
    pub setting: Option<String>,
    /// Compensator spool diameter
    #[arg(long, default_value = "10 mm", value_name = "LENGTH")]
    pub spool_diameter: String,
    /// Compensator spring rate
    #[arg(long, default_value = "5 N/mm", value_name = "RATE")]
    pub spring_rate: String,
}
