//! The valve characteristic: flow against supply minus load pressure for a
//! restrictive compensated valve, with the healthy band, the regulating threshold
//! and the measured operating points, drawn as one self-contained SVG.
//!
//! [`ValveCurve`] is pure computation on SI values: the orifice-like branch while the
//! compensator is wide open, then the plateau whose droop or rise comes from the
//! [`Compensator`](crate::physics::Compensator) force balance. [`render_svg`] draws it
//! in the user's [`UnitSystem`](crate::units::UnitSystem); [`ChartFrame::to_svg`] is
//! the one mapping from data to drawing coordinates, so tests can check where each
//! measured point lands.
//!
//! Why the SVG is written by hand rather than with a plotting crate: the chart is one
//! fixed layout (two linear axes, a line, a shaded band, a dashed marker and a few
//! labelled points) that has to be embedded inline in an HTML work order with no
//! scripts, fonts or links, and the tests need the exact coordinate of every marker.
//! Writing the elements ourselves gives that exact control of coordinates, output
//! that is small and stable from one version to the next, no new dependency (plotting
//! crates bring font loading and raster back ends this chart does not use), and
//! markup we can escape and check ourselves. The price, tick steps and label
//! placement, is a hundred lines of code here.

mod axis;
mod chart_error;
mod operating_point;
mod svg_chart;
mod valve_curve;

pub use axis::Axis;
pub use chart_error::{ChartError, ChartResult};
pub use operating_point::{points_from_diagnosis, points_from_readings, OperatingPoint};
pub use svg_chart::{escape, render_svg, ChartFrame, PLOT_BACKGROUND};
pub use valve_curve::{ValveCurve, ValveModel, ValveState};
