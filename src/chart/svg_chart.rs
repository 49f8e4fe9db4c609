//! The valve characteristic as one self-contained SVG: axes in the user's units,
//! the modelled curve, the healthy band, the regulating threshold and the measured
//! operating points as labelled markers.

use std::fmt::Write;

use super::axis::Axis;
use super::chart_error::ChartResult;
use super::operating_point::OperatingPoint;
use super::valve_curve::ValveCurve;
use crate::units::{self, Kind, Quantity, UnitSystem};

/// Size of the drawing, in SVG user units (pixels at 100 %).
const WIDTH: f64 = 760.0;
const HEIGHT: f64 = 470.0;
/// Room around the plot for the title and legend (top), tick labels and axis
/// titles (left, bottom).
const PLOT_LEFT: f64 = 78.0;
const PLOT_RIGHT: f64 = WIDTH - 28.0;
const PLOT_TOP: f64 = 84.0;
const PLOT_BOTTOM: f64 = HEIGHT - 60.0;
/// Points on the drawn curve; enough that no segment shows on a printed page.
const CURVE_SAMPLES: usize = 240;
/// Headroom above the highest value on each axis, so markers and labels stay inside.
const HEADROOM: f64 = 1.15;
/// Without measured points the pressure axis spans this many times the threshold,
/// enough to show the plateau's droop or rise.
const SPAN_WITHOUT_POINTS: f64 = 10.0;

/// The fill of the plot area. The headless render test finds the chart on a
/// screenshot by this colour, so it is used nowhere else in a report.
pub const PLOT_BACKGROUND: &str = "#f4f7fb";
const FONT: &str = "system-ui, -apple-system, 'Segoe UI', Roboto, Helvetica, Arial, sans-serif";
const CURVE_COLOUR: &str = "#1f4e79";
const BAND_COLOUR: &str = "#cfe9d5";
const NOMINAL_COLOUR: &str = "#2e7d32";
const THRESHOLD_COLOUR: &str = "#8a5a00";
const GRID_COLOUR: &str = "#d9e0e8";
const WITHIN_COLOUR: &str = "#2e7d32";
const OUTSIDE_COLOUR: &str = "#c62828";
/// Approximate advance of one character at 12 px in a sans-serif face, used to keep
/// labels inside the plot and apart (no font metrics are available offline).
const CHAR_WIDTH: f64 = 6.6;
const LINE_HEIGHT: f64 = 14.0;

/// The plot's placement and axes: maps data (SI) to SVG coordinates.
#[derive(Clone, Debug, PartialEq)]
pub struct ChartFrame {
    /// Supply minus load, in the display pressure unit.
    pub x: Axis,
    /// Flow, in the display flow unit.
    pub y: Axis,
    /// Units the axes are drawn in.
    pub system: UnitSystem,
}

impl ChartFrame {
    /// The frame for a curve and its measured points: the pressure axis from zero
    /// (or the lowest point) to the highest point, `max_drop_pa` if given, or ten
    /// times the threshold; the flow axis from zero to above the band and the points.
    pub fn new(
        curve: &ValveCurve,
        points: &[OperatingPoint],
        system: UnitSystem,
        max_drop_pa: Option<f64>,
    ) -> ChartFrame {
        let threshold = curve.threshold().total_drop_pa;
        let lowest = points
            .iter()
            .map(OperatingPoint::total_drop_pa)
            .fold(0.0, f64::min);
        let highest_point = points
            .iter()
            .map(OperatingPoint::total_drop_pa)
            .fold(f64::NEG_INFINITY, f64::max);
        let highest = match max_drop_pa.filter(|m| m.is_finite() && *m > 0.0) {
            Some(m) => m.max(highest_point),
            None if points.is_empty() => SPAN_WITHOUT_POINTS * threshold,
            None => (HEADROOM * highest_point).max(2.0 * threshold),
        };
        let flow_top = points
            .iter()
            .map(|p| p.flow.si())
            .fold(curve.band_limits().1, f64::max);
        ChartFrame {
            x: Axis::covering(pressure(lowest, system), pressure(highest, system)),
            y: Axis::covering(0.0, flow(HEADROOM * flow_top, system)),
            system,
        }
    }

    /// SVG coordinates of the data point (`total_drop_pa` Pa of supply minus load,
    /// `flow_m3_s` m³/s). y grows downwards in SVG, so flow is flipped.
    pub fn to_svg(&self, total_drop_pa: f64, flow_m3_s: f64) -> (f64, f64) {
        let fx = self.x.fraction(pressure(total_drop_pa, self.system));
        let fy = self.y.fraction(flow(flow_m3_s, self.system));
        (
            PLOT_LEFT + fx * (PLOT_RIGHT - PLOT_LEFT),
            PLOT_BOTTOM - fy * (PLOT_BOTTOM - PLOT_TOP),
        )
    }

    /// The largest supply minus load on the axis, Pa.
    fn max_drop_pa(&self) -> f64 {
        self.x.max / pressure(1.0, self.system)
    }
}

/// Draw the chart of `curve` with the measured `points` in `system` units as one
/// SVG document with no external reference.
pub fn render_svg(
    curve: &ValveCurve,
    points: &[OperatingPoint],
    system: UnitSystem,
    max_drop_pa: Option<f64>,
) -> ChartResult<String> {
    let frame = ChartFrame::new(curve, points, system, max_drop_pa);
    let mut svg = String::new();
    let _ = write!(
        svg,
        r#"<svg xmlns="http://www.w3.org/2000/svg" class="valve-chart" viewBox="0 0 {WIDTH} {HEIGHT}" width="{WIDTH}" height="{HEIGHT}" font-family="{FONT}" font-size="12" role="img">"#
    );
    let _ = write!(svg, "<title>{}</title>", escape(&caption(curve, system)));
    let _ = write!(
        svg,
        r##"<rect x="0" y="0" width="{WIDTH}" height="{HEIGHT}" fill="#ffffff"/>"##
    );
    heading(&mut svg, curve, system);
    let _ = write!(
        svg,
        r#"<rect class="plot-area" x="{PLOT_LEFT}" y="{PLOT_TOP}" width="{}" height="{}" fill="{PLOT_BACKGROUND}"/>"#,
        PLOT_RIGHT - PLOT_LEFT,
        PLOT_BOTTOM - PLOT_TOP
    );
    grid(&mut svg, &frame);
    band(&mut svg, &frame, curve);
    threshold(&mut svg, &frame, curve);
    curve_line(&mut svg, &frame, curve)?;
    markers(&mut svg, &frame, curve, points);
    axis_titles(&mut svg, system);
    svg.push_str("</svg>\n");
    Ok(svg)
}

/// The chart's one-line description, also its accessible title.
fn caption(curve: &ValveCurve, system: UnitSystem) -> String {
    format!(
        "Flow against supply minus load: set {} at a {} spring setting, regulates above {}",
        show(curve.flow_set(), Kind::Flow, system),
        show(curve.setting(), Kind::Pressure, system),
        show(curve.threshold().total_drop_pa, Kind::Pressure, system),
    )
}

fn heading(svg: &mut String, curve: &ValveCurve, system: UnitSystem) {
    let _ = write!(
        svg,
        r##"<text x="{PLOT_LEFT}" y="24" font-size="16" font-weight="700" fill="#1a1a1a">Flow against supply minus load pressure</text>"##
    );
    let _ = write!(
        svg,
        r##"<text x="{PLOT_LEFT}" y="44" fill="#444444">set flow {} · spring setting {} · regulates above {}</text>"##,
        escape(&show(curve.flow_set(), Kind::Flow, system)),
        escape(&show(curve.setting(), Kind::Pressure, system)),
        escape(&show(
            curve.threshold().total_drop_pa,
            Kind::Pressure,
            system
        )),
    );
    let y = 66.0;
    let mut x = PLOT_LEFT;
    let _ = write!(
        svg,
        r#"<line x1="{x}" y1="{}" x2="{}" y2="{}" stroke="{CURVE_COLOUR}" stroke-width="3"/>"#,
        y - 4.0,
        x + 22.0,
        y - 4.0
    );
    x += 28.0;
    x = legend_text(svg, x, y, "valve model");
    let _ = write!(
        svg,
        r#"<rect x="{x:.1}" y="{}" width="22" height="10" fill="{BAND_COLOUR}" stroke="{NOMINAL_COLOUR}" stroke-width="0.5"/>"#,
        y - 9.0
    );
    x += 28.0;
    x = legend_text(
        svg,
        x,
        y,
        &format!(
            "healthy band ±{} %",
            units::format_number(curve.band() * 100.0)
        ),
    );
    for (colour, words) in [
        (WITHIN_COLOUR, "measured, healthy"),
        (OUTSIDE_COLOUR, "measured, out of band"),
    ] {
        let _ = write!(
            svg,
            r##"<circle cx="{:.1}" cy="{:.1}" r="5" fill="{colour}" stroke="#ffffff" stroke-width="1.5"/>"##,
            x + 6.0,
            y - 4.0
        );
        x = legend_text(svg, x + 16.0, y, words);
    }
}

fn legend_text(svg: &mut String, x: f64, y: f64, words: &str) -> f64 {
    let _ = write!(
        svg,
        r##"<text x="{x:.1}" y="{y}" fill="#333333">{}</text>"##,
        escape(words)
    );
    x + words.chars().count() as f64 * CHAR_WIDTH + 18.0
}

fn grid(svg: &mut String, frame: &ChartFrame) {
    svg.push_str(r#"<g class="grid">"#);
    for t in frame.x.ticks() {
        let x = PLOT_LEFT + frame.x.fraction(t) * (PLOT_RIGHT - PLOT_LEFT);
        let _ = write!(
            svg,
            r##"<line x1="{x:.2}" y1="{PLOT_TOP}" x2="{x:.2}" y2="{PLOT_BOTTOM}" stroke="{GRID_COLOUR}"/><text x="{x:.2}" y="{}" text-anchor="middle" fill="#333333">{}</text>"##,
            PLOT_BOTTOM + 18.0,
            units::format_number(t)
        );
    }
    for t in frame.y.ticks() {
        let y = PLOT_BOTTOM - frame.y.fraction(t) * (PLOT_BOTTOM - PLOT_TOP);
        let _ = write!(
            svg,
            r##"<line x1="{PLOT_LEFT}" y1="{y:.2}" x2="{PLOT_RIGHT}" y2="{y:.2}" stroke="{GRID_COLOUR}"/><text x="{}" y="{:.2}" text-anchor="end" fill="#333333">{}</text>"##,
            PLOT_LEFT - 8.0,
            y + 4.0,
            units::format_number(t)
        );
    }
    let _ = write!(
        svg,
        r##"<rect x="{PLOT_LEFT}" y="{PLOT_TOP}" width="{}" height="{}" fill="none" stroke="#8a96a3"/></g>"##,
        PLOT_RIGHT - PLOT_LEFT,
        PLOT_BOTTOM - PLOT_TOP
    );
}

/// The healthy band, from the threshold on (below it the valve is not meant to
/// regulate), and the set flow as a dashed line through it.
fn band(svg: &mut String, frame: &ChartFrame, curve: &ValveCurve) {
    let (low, high) = curve.band_limits();
    let start = curve.threshold().total_drop_pa;
    let (x0, y_high) = frame.to_svg(start, high);
    let (_, y_low) = frame.to_svg(start, low);
    let (_, y_set) = frame.to_svg(start, curve.flow_set());
    let _ = write!(
        svg,
        r#"<rect class="healthy-band" x="{x0:.2}" y="{y_high:.2}" width="{:.2}" height="{:.2}" fill="{BAND_COLOUR}" fill-opacity="0.85"/>"#,
        (PLOT_RIGHT - x0).max(0.0),
        (y_low - y_high).max(0.0)
    );
    let _ = write!(
        svg,
        r#"<line class="set-flow" x1="{x0:.2}" y1="{y_set:.2}" x2="{PLOT_RIGHT}" y2="{y_set:.2}" stroke="{NOMINAL_COLOUR}" stroke-dasharray="6 4"/>"#
    );
}

fn threshold(svg: &mut String, frame: &ChartFrame, curve: &ValveCurve) {
    let th = curve.threshold();
    let (x, _) = frame.to_svg(th.total_drop_pa, 0.0);
    let _ = write!(
        svg,
        r#"<line class="threshold" x1="{x:.2}" y1="{PLOT_TOP}" x2="{x:.2}" y2="{PLOT_BOTTOM}" stroke="{THRESHOLD_COLOUR}" stroke-width="1.5" stroke-dasharray="3 3"/>"#
    );
    let words = format!(
        "regulates above {}",
        show(th.total_drop_pa, Kind::Pressure, frame.system)
    );
    // Keep the words inside the plot: to the right of the line unless that runs off.
    let width = words.chars().count() as f64 * CHAR_WIDTH;
    let (tx, anchor) = if x + 6.0 + width <= PLOT_RIGHT {
        (x + 6.0, "start")
    } else {
        (x - 6.0, "end")
    };
    let _ = write!(
        svg,
        r#"<text x="{tx:.2}" y="{}" text-anchor="{anchor}" fill="{THRESHOLD_COLOUR}">{}</text>"#,
        PLOT_BOTTOM - 10.0,
        escape(&words)
    );
}

fn curve_line(svg: &mut String, frame: &ChartFrame, curve: &ValveCurve) -> ChartResult<()> {
    let samples = curve.samples(frame.max_drop_pa(), CURVE_SAMPLES)?;
    let mut path = String::new();
    for (i, (dp, q)) in samples.iter().enumerate() {
        let (x, y) = frame.to_svg(*dp, *q);
        let _ = write!(path, "{}{x:.2},{y:.2}", if i == 0 { "M" } else { " L" });
    }
    let _ = write!(
        svg,
        r#"<path class="valve-curve" d="{path}" fill="none" stroke="{CURVE_COLOUR}" stroke-width="3" stroke-linejoin="round"/>"#
    );
    Ok(())
}

/// A placed label: its box, for keeping later labels off it.
#[derive(Clone, Copy)]
struct Box2 {
    left: f64,
    top: f64,
    right: f64,
    bottom: f64,
}

impl Box2 {
    fn overlaps(&self, other: &Box2) -> bool {
        self.left < other.right
            && other.left < self.right
            && self.top < other.bottom
            && other.top < self.bottom
    }

    fn inside_plot(&self) -> bool {
        self.left >= PLOT_LEFT
            && self.right <= PLOT_RIGHT
            && self.top >= PLOT_TOP
            && self.bottom <= PLOT_BOTTOM
    }
}

fn markers(svg: &mut String, frame: &ChartFrame, curve: &ValveCurve, points: &[OperatingPoint]) {
    let places: Vec<(f64, f64)> = points
        .iter()
        .map(|p| frame.to_svg(p.total_drop_pa(), p.flow.si()))
        .collect();
    // Markers are obstacles for every label.
    let mut taken: Vec<Box2> = places
        .iter()
        .map(|(x, y)| Box2 {
            left: x - 7.0,
            top: y - 7.0,
            right: x + 7.0,
            bottom: y + 7.0,
        })
        .collect();
    for (p, (x, y)) in points.iter().zip(places) {
        let (words, within) = verdict(curve, p);
        let lines = [
            p.name.clone(),
            format!(
                "{} · {}",
                show(p.total_drop_pa(), Kind::Pressure, frame.system),
                show(p.flow.si(), Kind::Flow, frame.system)
            ),
            words,
        ];
        let colour = if within {
            WITHIN_COLOUR
        } else {
            OUTSIDE_COLOUR
        };
        let _ = write!(
            svg,
            r##"<g class="operating-point"><circle data-point="{}" cx="{x:.2}" cy="{y:.2}" r="7" fill="{colour}" stroke="#ffffff" stroke-width="2"><title>{}</title></circle>"##,
            escape(&p.name),
            escape(&lines.join(", "))
        );
        let (tx, ty, anchor, placed) = place_label(x, y, &lines, &taken);
        taken.push(placed);
        let _ = write!(
            svg,
            r##"<text x="{tx:.2}" y="{ty:.2}" text-anchor="{anchor}" fill="#1a1a1a" stroke="#ffffff" stroke-width="3" paint-order="stroke">"##
        );
        for (i, line) in lines.iter().enumerate() {
            let weight = if i == 0 { r#" font-weight="700""# } else { "" };
            let dy = if i == 0 { 0.0 } else { LINE_HEIGHT };
            let _ = write!(
                svg,
                r#"<tspan x="{tx:.2}" dy="{dy}"{weight}>{}</tspan>"#,
                escape(line)
            );
        }
        svg.push_str("</text></g>");
    }
}

/// What a measured point says, in words, and whether it is healthy. Once the
/// compensator regulates, the flow belongs in the healthy band around the set flow
/// (the rule base's `regulation_band`); short of the threshold the valve cannot
/// regulate, whatever its flow, and a load at or above supply is a gauge question.
fn verdict(curve: &ValveCurve, p: &OperatingPoint) -> (String, bool) {
    let dp = p.total_drop_pa();
    if dp <= 0.0 {
        return (
            "load at or above supply: check the gauges".to_string(),
            false,
        );
    }
    if dp < curve.threshold().total_drop_pa {
        return ("short of the threshold: not regulating".to_string(), false);
    }
    let deviation = p.flow.si() / curve.flow_set() - 1.0;
    if deviation.abs() <= curve.band() {
        return ("within the healthy band".to_string(), true);
    }
    let words = format!(
        "{} % {} the set flow",
        units::format_number((deviation * 100.0).abs().round()),
        if deviation < 0.0 { "below" } else { "above" }
    );
    (words, false)
}

/// Where a label goes: the first of right-above, right-below, left-above and
/// left-below the marker that stays in the plot and clear of what is placed;
/// the first that stays in the plot when none is clear.
fn place_label(x: f64, y: f64, lines: &[String], taken: &[Box2]) -> (f64, f64, &'static str, Box2) {
    let width = lines.iter().map(|l| l.chars().count()).max().unwrap_or(0) as f64 * CHAR_WIDTH;
    let height = LINE_HEIGHT * lines.len() as f64;
    let candidates = [(1.0, -1.0), (1.0, 1.0), (-1.0, -1.0), (-1.0, 1.0)];
    let boxes: Vec<(f64, f64, &'static str, Box2)> = candidates
        .iter()
        .map(|(sx, sy)| {
            let left = if *sx > 0.0 {
                x + 11.0
            } else {
                x - 11.0 - width
            };
            let top = if *sy < 0.0 {
                y - 11.0 - height
            } else {
                y + 11.0
            };
            let anchor_x = if *sx > 0.0 { left } else { left + width };
            let anchor = if *sx > 0.0 { "start" } else { "end" };
            // The first baseline sits one line below the top, less the descent.
            (
                anchor_x,
                top + LINE_HEIGHT - 3.0,
                anchor,
                Box2 {
                    left,
                    top,
                    right: left + width,
                    bottom: top + height,
                },
            )
        })
        .collect();
    boxes
        .iter()
        .find(|c| c.3.inside_plot() && !taken.iter().any(|t| t.overlaps(&c.3)))
        .or_else(|| boxes.iter().find(|c| c.3.inside_plot()))
        .copied()
        .unwrap_or(boxes[0])
}

fn axis_titles(svg: &mut String, system: UnitSystem) {
    let _ = write!(
        svg,
        r##"<text x="{}" y="{}" text-anchor="middle" font-size="13" fill="#1a1a1a">supply − load pressure ({})</text>"##,
        (PLOT_LEFT + PLOT_RIGHT) / 2.0,
        HEIGHT - 16.0,
        escape(Kind::Pressure.display_unit(system))
    );
    let cy = (PLOT_TOP + PLOT_BOTTOM) / 2.0;
    let _ = write!(
        svg,
        r##"<text x="20" y="{cy}" transform="rotate(-90 20 {cy})" text-anchor="middle" font-size="13" fill="#1a1a1a">flow ({})</text>"##,
        escape(Kind::Flow.display_unit(system))
    );
}

/// `si` printed in the unit its kind is shown in, e.g. `45 bar`.
fn show(si: f64, kind: Kind, system: UnitSystem) -> String {
    units::format(Quantity::of(kind, si), kind, system)
}

/// A pressure in the display unit of `system`.
fn pressure(pa: f64, system: UnitSystem) -> f64 {
    in_display_unit(pa, Kind::Pressure, system)
}

/// A flow in the display unit of `system`.
fn flow(m3_s: f64, system: UnitSystem) -> f64 {
    in_display_unit(m3_s, Kind::Flow, system)
}

fn in_display_unit(si: f64, kind: Kind, system: UnitSystem) -> f64 {
    // Every kind's display unit is in the catalogue with the kind's dimension
    // (tested in units::kind), so the conversion cannot fail.
    units::value_in(Quantity::of(kind, si), kind.display_unit(system))
        .expect("a kind's display unit converts its own dimension")
}

/// Text made safe for SVG and HTML content and attribute values.
pub fn escape(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    for c in text.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            _ => out.push(c),
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use scraper::{Html, Selector};

    use super::*;
    use crate::chart::ValveModel;

    const LPM: f64 = 1e-3 / 60.0;
    const BAR: f64 = 1e5;

    fn point(name: &str, supply_bar: f64, load_bar: f64, flow_lpm: f64) -> OperatingPoint {
        OperatingPoint {
            flow: Quantity::of(Kind::Flow, flow_lpm * LPM),
            load: Quantity::of(Kind::Pressure, load_bar * BAR),
            name: name.to_string(),
            supply: Quantity::of(Kind::Pressure, supply_bar * BAR),
        }
    }

    fn demo() -> (ValveCurve, Vec<OperatingPoint>) {
        let curve = ValveCurve::new(20.0 * LPM, 8.0 * BAR, ValveModel::default(), 0.05).unwrap();
        let points = vec![
            point("loaded", 185.0, 140.0, 14.2),
            point("unloaded", 150.0, 30.0, 20.0),
        ];
        (curve, points)
    }

    fn attr(el: &scraper::ElementRef, name: &str) -> f64 {
        el.value().attr(name).unwrap().parse().unwrap()
    }

    #[test]
    fn every_point_is_drawn_where_the_frame_maps_it() {
        let (curve, points) = demo();
        for system in [UnitSystem::Metric, UnitSystem::Us] {
            let svg = render_svg(&curve, &points, system, None).unwrap();
            let frame = ChartFrame::new(&curve, &points, system, None);
            let doc = Html::parse_fragment(&svg);
            for p in &points {
                let sel = Selector::parse(&format!("circle[data-point=\"{}\"]", p.name)).unwrap();
                let circle = doc.select(&sel).next().expect("a marker per point");
                let (x, y) = frame.to_svg(p.total_drop_pa(), p.flow.si());
                assert!(
                    (attr(&circle, "cx") - x).abs() < 0.006,
                    "{system}: {}",
                    p.name
                );
                assert!(
                    (attr(&circle, "cy") - y).abs() < 0.006,
                    "{system}: {}",
                    p.name
                );
                assert!(
                    (PLOT_LEFT..=PLOT_RIGHT).contains(&x) && (PLOT_TOP..=PLOT_BOTTOM).contains(&y)
                );
            }
        }
    }

    #[test]
    fn the_frame_maps_axis_ends_to_the_plot_corners() {
        let (curve, points) = demo();
        let frame = ChartFrame::new(&curve, &points, UnitSystem::Metric, None);
        // 120 bar × 1.15 = 138 bar → axis to 140 bar in steps of 20; flow to 25 L/min
        assert_eq!((frame.x.min, frame.x.max, frame.x.step), (0.0, 140.0, 20.0));
        assert_eq!(frame.y.max, 25.0);
        let (x0, y0) = frame.to_svg(0.0, 0.0);
        let (x1, y1) = frame.to_svg(140.0 * BAR, 25.0 * LPM);
        assert!((x0 - PLOT_LEFT).abs() < 1e-9 && (y0 - PLOT_BOTTOM).abs() < 1e-9);
        assert!((x1 - PLOT_RIGHT).abs() < 1e-9 && (y1 - PLOT_TOP).abs() < 1e-9);
    }

    #[test]
    fn axes_labels_and_band_in_the_users_units() {
        let (curve, points) = demo();
        let metric = render_svg(&curve, &points, UnitSystem::Metric, None).unwrap();
        assert!(metric.contains("supply − load pressure (bar)") && metric.contains("flow (L/min)"));
        assert!(metric.contains("45 bar · 14.2 L/min"), "{metric}");
        assert!(metric.contains("29 % below the set flow"), "{metric}");
        assert!(metric.contains("within the healthy band"), "{metric}");
        assert!(metric.contains("healthy band ±5 %"));
        let us = render_svg(&curve, &points, UnitSystem::Us, None).unwrap();
        assert!(us.contains("supply − load pressure (psi)") && us.contains("flow (gpm)"));
        assert!(us.contains("652.7 psi · 3.751 gpm"), "{us}");
        // the band spans the set flow ±5 %, from the threshold to the right edge
        let frame = ChartFrame::new(&curve, &points, UnitSystem::Metric, None);
        let doc = Html::parse_fragment(&metric);
        let rect = doc
            .select(&Selector::parse("rect.healthy-band").unwrap())
            .next()
            .unwrap();
        let (x, top) = frame.to_svg(curve.threshold().total_drop_pa, 21.0 * LPM);
        let (_, bottom) = frame.to_svg(0.0, 19.0 * LPM);
        assert!((attr(&rect, "x") - x).abs() < 0.006);
        assert!((attr(&rect, "y") - top).abs() < 0.006);
        assert!((attr(&rect, "height") - (bottom - top)).abs() < 0.011);
    }

    #[test]
    fn markup_in_a_point_name_is_escaped_and_nothing_external_is_referenced() {
        let (curve, _) = demo();
        let points = vec![point("<b>&\"x\"", 60.0, 10.0, 19.9)];
        let svg = render_svg(&curve, &points, UnitSystem::Metric, None).unwrap();
        assert!(svg.contains("&lt;b&gt;&amp;&quot;x&quot;"));
        assert!(!svg.contains("<b>"));
        for banned in ["<script", "href", "url(", "@import", "<image"] {
            assert!(!svg.contains(banned), "{banned}");
        }
        assert!(svg.contains("within the healthy band"));
    }

    #[test]
    fn without_points_the_axis_spans_ten_thresholds_and_a_given_span_wins() {
        let (curve, _) = demo();
        let th = curve.threshold().total_drop_pa;
        let frame = ChartFrame::new(&curve, &[], UnitSystem::Metric, None);
        assert!(frame.x.max >= 10.0 * th / BAR && frame.x.max < 10.0 * th / BAR * 1.3);
        let frame = ChartFrame::new(&curve, &[], UnitSystem::Metric, Some(300.0 * BAR));
        assert_eq!(frame.x.max, 300.0);
    }

    #[test]
    fn a_point_short_of_the_threshold_is_not_regulating() {
        let (curve, _) = demo();
        let points = vec![point("creep", 20.0, 12.0, 15.0)];
        let svg = render_svg(&curve, &points, UnitSystem::Metric, None).unwrap();
        assert!(svg.contains("short of the threshold: not regulating"));
        assert!(svg.contains(&format!(r#"fill="{OUTSIDE_COLOUR}""#)));
    }

    #[test]
    fn a_point_with_load_above_supply_widens_the_axis_below_zero() {
        let (curve, _) = demo();
        let points = vec![point("odd", 100.0, 120.0, 2.0)];
        let frame = ChartFrame::new(&curve, &points, UnitSystem::Metric, None);
        assert!(frame.x.min <= -20.0);
        let svg = render_svg(&curve, &points, UnitSystem::Metric, None).unwrap();
        assert!(svg.contains("load at or above supply: check the gauges"));
    }
}
