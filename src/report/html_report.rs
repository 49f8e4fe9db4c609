//! A diagnosis as one self-contained HTML work order: inline CSS and SVG, no
//! scripts, fonts or links, readable on a phone and printable on A4 or Letter.

use std::fmt::Write;

use crate::chart::escape;
use crate::diagnosis::{CauseAssessment, CauseStatus, Diagnosis, EvidenceLine};
use crate::rules::Effect;

/// Headings of the sections every report has, in order.
pub const HEADINGS: &[&str] = &[
    "Machine",
    "Complaint",
    "Readings",
    "Reasoning",
    "Conclusion",
    "Fix",
    "Cautions",
    "Sign-off",
];
/// Heading of the chart section, present when a chart is given.
pub const CHART_HEADING: &str = "What the valve is doing";
/// Heading of the readings that cannot all be true, present when there are any.
pub const CONSISTENCY_HEADING: &str = "Readings that disagree";
/// Heading of the similar past cases, present when there are any.
pub const SIMILAR_HEADING: &str = "Similar past cases";

/// The style sheet: a single column that reads on a phone, tables that scroll
/// sideways rather than squeeze, and a print layout with page margins that fit
/// both A4 and Letter (the narrower of the two sets the width).
const STYLE: &str = r#"
:root { color-scheme: light; }
* { box-sizing: border-box; }
body { margin: 0; background: #eef1f4; color: #1a1a1a;
  font: 16px/1.45 system-ui, -apple-system, "Segoe UI", Roboto, Helvetica, Arial, sans-serif; }
main { max-width: 900px; margin: 0 auto; padding: 16px 20px 32px; background: #ffffff; }
header { border-bottom: 3px solid #1f4e79; padding-bottom: 8px; margin-bottom: 8px; }
.kicker { margin: 0; color: #555555; font-size: 0.85rem; letter-spacing: 0.04em; text-transform: uppercase; }
h1 { margin: 2px 0 0; font-size: 1.55rem; }
h2 { margin: 22px 0 8px; font-size: 1.15rem; color: #1f4e79; border-bottom: 1px solid #d4dbe3; padding-bottom: 3px; }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: 2px 14px; margin: 0; }
dl.facts dt { color: #555555; }
dl.facts dd { margin: 0; font-weight: 600; }
blockquote { margin: 0; padding: 8px 12px; border-left: 4px solid #8a96a3; background: #f6f8fa; font-style: italic; }
figure { margin: 0; }
figure svg { display: block; width: 100%; height: auto; border: 1px solid #d4dbe3; }
figcaption { font-size: 0.85rem; color: #555555; margin-top: 4px; }
.scroll { overflow-x: auto; }
table { border-collapse: collapse; width: 100%; font-size: 0.95rem; }
th, td { text-align: left; padding: 5px 8px; border-bottom: 1px solid #e1e6eb; vertical-align: top; }
th { background: #f0f3f6; font-weight: 600; }
td.value { white-space: nowrap; font-variant-numeric: tabular-nums; }
code { font-size: 0.85em; background: #f0f3f6; padding: 0 3px; border-radius: 3px; }
.warn { color: #8a5a00; }
ul.tree, ul.tree ul { list-style: none; margin: 0; padding-left: 18px; }
ul.tree { padding-left: 0; }
ul.tree li { position: relative; margin: 4px 0; }
ul.tree ul { border-left: 2px solid #d4dbe3; margin-left: 6px; padding-left: 14px; }
.group-name { font-weight: 700; }
.status, .effect { display: inline-block; padding: 0 6px; border-radius: 9px; font-size: 0.8rem; font-weight: 600; }
.status-confirmed, .effect-confirms { background: #fde2e1; color: #9b1c1c; }
.status-likely, .effect-supports { background: #fff1d6; color: #7a4b00; }
.status-possible, .status-not-yet-tested { background: #e8eef5; color: #2b4a6b; }
.status-unlikely, .status-ruled-out, .effect-weakens, .effect-rules-out { background: #e3f2e5; color: #1e5b25; }
.effect-none { background: #eeeeee; color: #555555; }
.evidence { display: block; color: #333333; }
.conclusion { font-size: 1.05rem; }
.caution { border-left: 4px solid #c62828; background: #fff5f5; padding: 6px 10px; margin: 6px 0; }
.caution strong { display: block; }
.closing { margin-top: 22px; padding: 10px 12px; background: #f6f8fa; border: 1px solid #d4dbe3; font-size: 0.95rem; }
.signoff { display: grid; grid-template-columns: repeat(2, minmax(0, 1fr)); gap: 18px 28px; margin-top: 6px; }
.signoff div { border-bottom: 1px solid #1a1a1a; min-height: 2.6em; padding-top: 1.6em; font-size: 0.8rem; color: #555555; }
@media (max-width: 600px) {
  body { font-size: 15px; background: #ffffff; }
  main { padding: 12px; }
  h1 { font-size: 1.3rem; }
  .signoff { grid-template-columns: 1fr; }
  dl.facts { grid-template-columns: 1fr; }
  dl.facts dd { margin-bottom: 4px; }
  table { font-size: 0.85rem; }
  th, td { padding: 4px 5px; }
  td code { word-break: break-all; }
}
@page { margin: 14mm 12mm; }
@media print {
  body { background: #ffffff; font-size: 10.5pt; }
  main { max-width: none; padding: 0; }
  h2 { break-after: avoid-page; }
  figure, .caution, .signoff, ul.tree > li > ul > li, tr { break-inside: avoid-page; }
  .scroll { overflow: visible; }
  .status, .effect, th, .caution, blockquote, .closing { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
}
"#;

/// The work order for `diagnosis`, with the valve chart `chart_svg` (an `<svg>`
/// document from [`crate::chart::render_svg`]) when one is given. All text from
/// the diagnosis is escaped; the chart is inserted as it is.
pub fn render_html(diagnosis: &Diagnosis, chart_svg: Option<&str>) -> String {
    let mut html = String::new();
    let title = match &diagnosis.machine {
        Some(m) => format!("Work order: {} ({})", m.name, m.id),
        None => "Work order".to_string(),
    };
    let _ = writeln!(
        html,
        "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n\
<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n\
<title>{}</title>\n<style>{STYLE}</style>\n</head>\n<body>\n<main>",
        escape(&title)
    );
    header(&mut html, diagnosis);
    complaint(&mut html, diagnosis);
    if let Some(svg) = chart_svg {
        chart(&mut html, svg);
    }
    readings(&mut html, diagnosis);
    consistency(&mut html, diagnosis);
    reasoning(&mut html, diagnosis);
    conclusion(&mut html, diagnosis);
    fix(&mut html, diagnosis);
    cautions(&mut html, diagnosis);
    similar(&mut html, diagnosis);
    let _ = writeln!(
        html,
        "<p class=\"closing\">{}</p>",
        escape(&diagnosis.closing)
    );
    sign_off(&mut html);
    html.push_str("</main>\n</body>\n</html>\n");
    html
}

fn section(html: &mut String, id: &str, heading: &str) {
    let _ = writeln!(html, "<section id=\"{id}\">\n<h2>{}</h2>", escape(heading));
}

fn header(html: &mut String, d: &Diagnosis) {
    let name = d
        .machine
        .as_ref()
        .map_or("Breakdown call", |m| m.name.as_str());
    let _ = writeln!(
        html,
        "<header>\n<p class=\"kicker\">spoolsleuth work order</p>\n<h1>{}</h1>\n</header>",
        escape(name)
    );
    section(html, "machine", "Machine");
    html.push_str("<dl class=\"facts\">\n");
    let mut fact = |term: &str, value: &str| {
        let _ = writeln!(html, "<dt>{}</dt><dd>{}</dd>", escape(term), escape(value));
    };
    match &d.machine {
        Some(m) => {
            fact("machine", &m.id);
            fact("what it is", &m.name);
        }
        None => fact("machine", "not named"),
    }
    fact("circuit", d.circuit.name());
    fact("valve placement", d.placement.name());
    fact("units", &d.units.to_string());
    html.push_str("</dl>\n</section>\n");
}

fn complaint(html: &mut String, d: &Diagnosis) {
    section(html, "complaint", "Complaint");
    let words = d
        .complaint
        .as_deref()
        .filter(|c| !c.trim().is_empty())
        .unwrap_or("(no words given: symptoms named directly)");
    let _ = writeln!(html, "<blockquote>{}</blockquote>", escape(words));
    if !d.symptoms.is_empty() {
        html.push_str("<p>Symptoms considered:</p>\n<ul>\n");
        for s in &d.symptoms {
            let _ = writeln!(
                html,
                "<li>{} <code>{}</code> ({})</li>",
                escape(&s.label),
                escape(&s.id),
                escape(s.how)
            );
        }
        html.push_str("</ul>\n");
    }
    html.push_str("</section>\n");
}

fn chart(html: &mut String, svg: &str) {
    section(html, "chart", CHART_HEADING);
    let _ = writeln!(
        html,
        "<figure>\n{}\n<figcaption>Flow against supply minus load pressure. The line is the \
valve model; the shaded band is the healthy range around the set flow; each dot is a \
measured operating point.</figcaption>\n</figure>\n</section>",
        svg.trim()
    );
}

fn readings(html: &mut String, d: &Diagnosis) {
    section(html, "readings", "Readings");
    if d.readings.is_empty() {
        html.push_str("<p>No readings were given.</p>\n");
    } else {
        // A notes column only when a reading has a warning: it keeps the table
        // narrow enough for a phone otherwise.
        let notes = d.readings.iter().any(|r| !r.warnings.is_empty());
        html.push_str(
            "<div class=\"scroll\"><table>\n<thead><tr><th>reading</th><th>what</th><th>value</th>",
        );
        html.push_str(if notes { "<th>notes</th>" } else { "" });
        html.push_str("</tr></thead>\n<tbody>\n");
        for r in &d.readings {
            let _ = write!(
                html,
                "<tr><td><code>{}</code></td><td>{}</td><td class=\"value\">{}</td>",
                escape(&r.name),
                escape(&r.label),
                escape(&r.shown),
            );
            if notes {
                let _ = write!(
                    html,
                    "<td class=\"warn\">{}</td>",
                    escape(&r.warnings.join("; "))
                );
            }
            html.push_str("</tr>\n");
        }
        html.push_str("</tbody>\n</table></div>\n");
    }
    if !d.warnings.is_empty() {
        html.push_str("<ul class=\"warn\">\n");
        for w in &d.warnings {
            let _ = writeln!(html, "<li>{}</li>", escape(w));
        }
        html.push_str("</ul>\n");
    }
    html.push_str("</section>\n");
}

fn consistency(html: &mut String, d: &Diagnosis) {
    if d.consistency.is_empty() {
        return;
    }
    section(html, "consistency", CONSISTENCY_HEADING);
    html.push_str(
        "<p>These readings cannot all be true. No component is blamed until they agree.</p>\n<ul>\n",
    );
    for p in &d.consistency {
        let _ = writeln!(
            html,
            "<li>{} <code>{}</code></li>",
            escape(&p.message),
            escape(&p.rule)
        );
    }
    html.push_str("</ul>\n</section>\n");
}

/// The causes grouped by where the checks left them, each with its checks.
fn reasoning(html: &mut String, d: &Diagnosis) {
    section(html, "reasoning", "Reasoning");
    if d.causes.is_empty() {
        html.push_str(
            "<p>No rule of the rule base applies to these symptoms on this circuit.</p>\n",
        );
        html.push_str("</section>\n");
        return;
    }
    let groups: [(&str, &[CauseStatus]); 3] = [
        ("Ruled in", &[CauseStatus::Confirmed, CauseStatus::Likely]),
        (
            "Still open",
            &[CauseStatus::Possible, CauseStatus::NotYetTested],
        ),
        (
            "Ruled out or made unlikely",
            &[CauseStatus::Unlikely, CauseStatus::RuledOut],
        ),
    ];
    html.push_str("<ul class=\"tree\">\n");
    for (name, statuses) in groups {
        let causes: Vec<&CauseAssessment> = d
            .causes
            .iter()
            .filter(|c| statuses.contains(&c.status))
            .collect();
        if causes.is_empty() {
            continue;
        }
        let _ = writeln!(
            html,
            "<li class=\"group\"><span class=\"group-name\">{}</span>\n<ul>",
            escape(name)
        );
        for c in causes {
            cause(html, c);
        }
        html.push_str("</ul>\n</li>\n");
    }
    html.push_str("</ul>\n</section>\n");
}

fn cause(html: &mut String, c: &CauseAssessment) {
    let _ = writeln!(
        html,
        "<li class=\"cause\"><span class=\"status status-{}\">{}</span> <strong>{}</strong> \
<code>{}</code> <span class=\"score\">score {} % (prior {} %)</span>",
        css_name(c.status.words()),
        escape(c.status.words()),
        escape(&c.label),
        escape(&c.cause),
        percent(c.score),
        percent(c.prior)
    );
    if c.on_hold {
        html.push_str(
            "<div class=\"warn\">On hold: its check confirms it, but readings disagree.</div>\n",
        );
    }
    if let Some(h) = &c.history {
        let _ = writeln!(html, "<div>History: {}</div>", escape(h));
    }
    html.push_str("<ul>\n");
    for e in &c.evidence {
        check(html, e);
    }
    html.push_str("</ul>\n</li>\n");
}

fn check(html: &mut String, e: &EvidenceLine) {
    let (class, verdict) = match (e.outcome, e.effect) {
        ("true", Some(effect)) => (effect.name(), format!("holds: {}", effect_words(effect))),
        ("false", Some(effect)) => (
            effect.name(),
            format!("does not hold: {}", effect_words(effect)),
        ),
        ("missing", _) => ("none", "not run yet".to_string()),
        _ => ("none", "could not run".to_string()),
    };
    let _ = writeln!(
        html,
        "<li class=\"check\"><span class=\"effect effect-{class}\">{}</span> {} <code>{}</code>\
<span class=\"evidence\">{}</span></li>",
        escape(&verdict),
        escape(&e.title),
        escape(&e.rule),
        escape(&e.text)
    );
}

fn effect_words(effect: Effect) -> &'static str {
    match effect {
        Effect::Confirms => "confirms",
        Effect::Supports => "supports",
        Effect::Weakens => "weakens",
        Effect::RulesOut => "rules out",
    }
}

fn conclusion(html: &mut String, d: &Diagnosis) {
    section(html, "conclusion", "Conclusion");
    html.push_str("<p class=\"conclusion\">");
    if !d.consistency.is_empty() {
        html.push_str(
            "The readings disagree: check the gauges and take the readings again before \
blaming any component.",
        );
    } else if let Some(c) = d.leading() {
        let _ = write!(
            html,
            "Most likely: <strong>{}</strong> ({}, score {} %).",
            escape(&c.label),
            escape(c.status.words()),
            percent(c.score)
        );
    } else {
        html.push_str("No cause stands after the checks that could run.");
    }
    html.push_str("</p>\n");
    if let Some(n) = &d.next_measurement {
        let point = n
            .point
            .as_deref()
            .map(|p| format!(" at the {p} operating point"))
            .unwrap_or_default();
        let _ = writeln!(
            html,
            "<p><strong>Next measurement:</strong> {}{} (<code>{}</code>). {} {}</p>",
            escape(&n.label),
            escape(&point),
            escape(&n.reading),
            escape(&n.how),
            escape(&n.why)
        );
        if let Some(instrument) = &n.instrument {
            let _ = writeln!(html, "<p>Instrument: {}</p>", escape(instrument));
        }
    }
    html.push_str("</section>\n");
}

fn fix(html: &mut String, d: &Diagnosis) {
    section(html, "fix", "Fix");
    match &d.fix {
        Some(f) => {
            let _ = writeln!(
                html,
                "<p><strong>{}</strong> <code>{}</code></p>\n<p>{}</p>",
                escape(&f.label),
                escape(&f.cause),
                escape(&f.text)
            );
        }
        None => html.push_str("<p>No fix yet: no cause stands. Take the next measurement.</p>\n"),
    }
    html.push_str("</section>\n");
}

fn cautions(html: &mut String, d: &Diagnosis) {
    section(html, "cautions", "Cautions");
    if d.cautions.is_empty() {
        html.push_str(
            "<p>No caution of the rule base is attached to this fix or measurement. The \
site's own lock-out and pressure-release procedure still applies.</p>\n",
        );
    }
    for c in &d.cautions {
        let _ = writeln!(
            html,
            "<div class=\"caution\"><strong>{}</strong>{}</div>",
            escape(&c.title),
            escape(&c.text)
        );
    }
    html.push_str("</section>\n");
}

fn similar(html: &mut String, d: &Diagnosis) {
    if d.similar_cases.is_empty() {
        return;
    }
    section(html, "similar", SIMILAR_HEADING);
    html.push_str(
        "<div class=\"scroll\"><table>\n<thead><tr><th>date</th><th>machine</th><th>cause found</th>\
<th>note</th></tr></thead>\n<tbody>\n",
    );
    for c in &d.similar_cases {
        let _ = writeln!(
            html,
            "<tr><td class=\"value\">{}</td><td>{}</td><td>{}</td><td>{} <code>{}</code></td></tr>",
            escape(&c.date),
            escape(&c.machine),
            escape(&c.cause),
            escape(&c.snippet),
            escape(&c.id)
        );
    }
    html.push_str("</tbody>\n</table></div>\n</section>\n");
}

fn sign_off(html: &mut String) {
    section(html, "sign-off", "Sign-off");
    html.push_str("<div class=\"signoff\">\n");
    for line in [
        "Technician (name)",
        "Date",
        "Technician signature",
        "Work accepted by (name and signature)",
    ] {
        let _ = writeln!(html, "<div>{}</div>", escape(line));
    }
    html.push_str("</div>\n</section>\n");
}

/// A 0–1 score as a whole percentage.
fn percent(x: f64) -> String {
    format!("{:.0}", (x * 100.0).clamp(0.0, 100.0))
}

/// `not yet tested` → `not-yet-tested`, for a CSS class.
fn css_name(words: &str) -> String {
    words.replace(' ', "-")
}

#[cfg(test)]
mod tests {
    use scraper::{Html, Selector};

    use super::*;
    use crate::chart::{points_from_diagnosis, render_svg, ChartFrame, ValveCurve, ValveModel};
    use crate::diagnosis::{PastCase, DEMO_CALL};
    use crate::machine::MachineSet;
    use crate::rules::RuleBase;
    use crate::units::UnitSystem;

    fn diagnosis(complaint: &str) -> Diagnosis {
        let base = RuleBase::load(&[]).unwrap();
        let machines = MachineSet::load(None).unwrap();
        let mut input = DEMO_CALL.input(&machines).unwrap();
        input.complaint = Some(complaint.to_string());
        Diagnosis::run(&base, &input).unwrap()
    }

    fn chart_for(d: &Diagnosis) -> (String, ChartFrame) {
        let curve = ValveCurve::new(20.0 / 60_000.0, 8e5, ValveModel::default(), 0.05).unwrap();
        let points = points_from_diagnosis(d);
        assert_eq!(points.len(), 2);
        let svg = render_svg(&curve, &points, UnitSystem::Metric, None).unwrap();
        (
            svg,
            ChartFrame::new(&curve, &points, UnitSystem::Metric, None),
        )
    }

    fn headings(doc: &Html) -> Vec<String> {
        doc.select(&Selector::parse("h2").unwrap())
            .map(|h| h.text().collect::<String>())
            .collect()
    }

    #[test]
    fn the_report_parses_with_every_section_and_the_chart_in_place() {
        let d = diagnosis("platen slows right down and bogs when it closes on the panel");
        let (svg, frame) = chart_for(&d);
        let html = render_html(&d, Some(&svg));
        let doc = Html::parse_document(&html);
        assert!(doc.errors.is_empty(), "{:?}", doc.errors);
        let found = headings(&doc);
        for h in HEADINGS.iter().chain([&CHART_HEADING]) {
            assert!(found.iter().any(|f| f == h), "{h} missing from {found:?}");
        }
        assert!(!found.iter().any(|f| f == SIMILAR_HEADING), "{found:?}");
        let svgs: Vec<_> = doc
            .select(&Selector::parse("figure svg").unwrap())
            .collect();
        assert_eq!(svgs.len(), 1);
        for p in points_from_diagnosis(&d) {
            let sel = Selector::parse(&format!("circle[data-point=\"{}\"]", p.name)).unwrap();
            let c = doc.select(&sel).next().expect("a marker for each point");
            let (x, y) = frame.to_svg(p.total_drop_pa(), p.flow.si());
            let at = |a: &str| c.value().attr(a).unwrap().parse::<f64>().unwrap();
            assert!(
                (at("cx") - x).abs() < 0.006 && (at("cy") - y).abs() < 0.006,
                "{}",
                p.name
            );
        }
    }

    #[test]
    fn the_reasoning_tree_shows_what_was_ruled_in_and_out_with_the_numbers() {
        let d = diagnosis("platen slows right down and bogs when it closes on the panel");
        let doc = Html::parse_document(&render_html(&d, None));
        let groups: Vec<String> = doc
            .select(&Selector::parse("ul.tree > li > span.group-name").unwrap())
            .map(|g| g.text().collect())
            .collect();
        assert!(groups.contains(&"Ruled in".to_string()), "{groups:?}");
        assert!(
            groups.contains(&"Ruled out or made unlikely".to_string()),
            "{groups:?}"
        );
        let causes = Selector::parse("ul.tree li.cause").unwrap();
        let checks = Selector::parse("li.check").unwrap();
        let sticking = doc
            .select(&causes)
            .find(|c| c.text().any(|t| t == "compensator-sticking"))
            .expect("the sticking compensator is in the tree");
        assert!(sticking.text().any(|t| t == "confirmed"));
        let evidence: String = sticking.select(&checks).flat_map(|c| c.text()).collect();
        assert!(evidence.contains("3.5 bar"), "{evidence}");
        let headroom = doc
            .select(&causes)
            .find(|c| c.text().any(|t| t == "insufficient-headroom"))
            .unwrap();
        assert!(headroom.text().any(|t| t == "ruled out"));
        // every evidence line of the diagnosis appears once under its cause
        let lines: usize = d.causes.iter().map(|c| c.evidence.len()).sum();
        assert_eq!(doc.select(&checks).count(), lines);
        assert!(doc
            .select(&Selector::parse("svg").unwrap())
            .next()
            .is_none());
        assert!(!headings(&doc).contains(&CHART_HEADING.to_string()));
    }

    #[test]
    fn cautions_closing_and_sign_off_are_shown_and_text_is_escaped() {
        let mut d = diagnosis("slows <b>under</b> load & \"bogs\"");
        d.similar_cases.push(PastCase {
            id: "2024-03-01-press-4".into(),
            date: "2024-03-01".into(),
            machine: "press-4".into(),
            cause: "compensator-sticking".into(),
            score: 3.2,
            snippet: "spool <stuck> with varnish".into(),
        });
        let html = render_html(&d, None);
        assert!(html.contains("slows &lt;b&gt;under&lt;/b&gt; load &amp; &quot;bogs&quot;"));
        assert!(html.contains("spool &lt;stuck&gt; with varnish"));
        let doc = Html::parse_document(&html);
        assert!(headings(&doc).contains(&SIMILAR_HEADING.to_string()));
        assert!(!d.cautions.is_empty());
        let cautions: Vec<String> = doc
            .select(&Selector::parse("#cautions .caution strong").unwrap())
            .map(|c| c.text().collect())
            .collect();
        for c in &d.cautions {
            assert!(cautions.contains(&c.title), "{cautions:?}");
        }
        let closing: String = doc
            .select(&Selector::parse("p.closing").unwrap())
            .flat_map(|p| p.text())
            .collect();
        assert_eq!(closing, d.closing);
        assert!(closing.contains("licensed practice"));
        let lines = doc
            .select(&Selector::parse(".signoff div").unwrap())
            .count();
        assert_eq!(lines, 4);
    }

    #[test]
    fn self_contained_for_phone_and_print() {
        let d = diagnosis("slows down under load");
        let (svg, _) = chart_for(&d);
        let html = render_html(&d, Some(&svg));
        for banned in ["<script", "<link", "@import", "url(", "src=", "href="] {
            assert!(!html.contains(banned), "{banned}");
        }
        assert!(html
            .contains(r#"<meta name="viewport" content="width=device-width, initial-scale=1">"#));
        assert!(html.contains("@media print") && html.contains("@page"));
        assert!(html.contains("@media (max-width: 600px)"));
    }
}
