//! A diagnosis as Markdown, for a work order, a ticket or a wiki page: the
//! same sections in the same order as the terminal report.

use std::fmt::Write;

use super::wording;
use crate::diagnosis::Diagnosis;

/// Render `d` as Markdown.
pub fn render_markdown(d: &Diagnosis) -> String {
    let mut out = String::new();
    header(&mut out, d);
    readings(&mut out, d);
    consistency(&mut out, d);
    causes(&mut out, d);
    next_measurement(&mut out, d);
    fix(&mut out, d);
    cautions(&mut out, d);
    similar_cases(&mut out, d);
    warnings(&mut out, d);
    let _ = writeln!(out, "\n---\n\n*{}*", d.closing);
    out
}

/// A table cell: pipes escaped, line breaks as `<br>`.
fn cell(text: &str) -> String {
    text.replace('|', "\\|").replace('\n', "<br>")
}

fn row(out: &mut String, cells: &[String]) {
    let cells: Vec<String> = cells.iter().map(|c| cell(c)).collect();
    let _ = writeln!(out, "| {} |", cells.join(" | "));
}

fn header_row(out: &mut String, names: &[&str]) {
    let _ = writeln!(out, "| {} |", names.join(" | "));
    let _ = writeln!(out, "|{}", "---|".repeat(names.len()));
}

fn header(out: &mut String, d: &Diagnosis) {
    let _ = writeln!(out, "# Diagnosis: {}\n", wording::machine(d));
    let _ = writeln!(out, "- **Circuit:** {}", wording::circuit(d));
    let _ = writeln!(out, "- **Units:** {}", d.units);
    if let Some(complaint) = &d.complaint {
        let _ = writeln!(out, "- **Complaint:** \"{complaint}\"");
    }
    let _ = writeln!(out, "- **Symptoms:** {}", wording::symptoms(d).join("; "));
}

fn readings(out: &mut String, d: &Diagnosis) {
    let _ = writeln!(out, "\n## Readings ({})\n", d.units);
    if d.readings.is_empty() {
        let _ = writeln!(out, "None given.");
        return;
    }
    header_row(out, &["reading", "what", "value", "warnings"]);
    for r in &d.readings {
        row(
            out,
            &[
                format!("`{}`", r.name),
                r.label.clone(),
                r.shown.clone(),
                r.warnings.join("\n"),
            ],
        );
    }
}

fn consistency(out: &mut String, d: &Diagnosis) {
    if d.consistency.is_empty() {
        return;
    }
    let _ = writeln!(out, "\n## {}\n", wording::GAUGES_FIRST);
    let _ = writeln!(out, "> **{}**\n", wording::GAUGES_FIRST_WHY);
    for p in &d.consistency {
        let _ = writeln!(out, "- `{}`: {}", p.rule, p.message);
    }
}

fn causes(out: &mut String, d: &Diagnosis) {
    let _ = writeln!(out, "\n## Causes, most likely first\n");
    if d.causes.is_empty() {
        let _ = writeln!(out, "No rule applies to these symptoms on this circuit.");
        return;
    }
    header_row(out, &["#", "cause", "status", "score"]);
    for (n, c) in d.causes.iter().enumerate() {
        row(
            out,
            &[
                (n + 1).to_string(),
                format!("{} (`{}`)", c.label, c.cause),
                wording::status(c),
                wording::percent(c.score),
            ],
        );
    }
    for (n, c) in d.causes.iter().enumerate() {
        let _ = writeln!(
            out,
            "\n### {}. {} ({}, {})\n",
            n + 1,
            c.label,
            wording::status(c),
            wording::percent(c.score)
        );
        for line in wording::ordered(c) {
            let _ = writeln!(out, "- {}", wording::evidence(line));
        }
        if let Some(h) = wording::history(c) {
            let _ = writeln!(out, "- {h}");
        }
    }
}

fn next_measurement(out: &mut String, d: &Diagnosis) {
    let _ = writeln!(out, "\n## Next measurement\n");
    let Some(next) = &d.next_measurement else {
        let _ = writeln!(out, "{}", wording::no_measurement(d));
        return;
    };
    let _ = writeln!(out, "- **What:** {}", wording::measurement(next));
    if let Some(point) = &next.point {
        let _ = writeln!(out, "- **When:** {point}");
    }
    let _ = writeln!(out, "- **Where/how:** {}", next.how);
    if let Some(instrument) = &next.instrument {
        let _ = writeln!(out, "- **Instrument:** {instrument}");
    }
    let _ = writeln!(out, "- **Why:** {}", next.why);
    for c in wording::measurement_cautions(d, next) {
        let _ = writeln!(out, "- **Caution:** {}", wording::caution(c));
    }
}

fn fix(out: &mut String, d: &Diagnosis) {
    let _ = writeln!(out, "\n## Fix for the leading cause\n");
    match &d.fix {
        Some(f) => {
            let _ = writeln!(out, "**{}** (`{}`): {}", f.label, f.cause, f.text);
        }
        None => {
            let _ = writeln!(out, "{}", wording::NO_FIX);
        }
    }
}

fn cautions(out: &mut String, d: &Diagnosis) {
    if d.cautions.is_empty() {
        return;
    }
    let _ = writeln!(out, "\n## Safety\n");
    for c in &d.cautions {
        let _ = writeln!(out, "- **{}:** {}", c.title, c.text);
    }
}

fn similar_cases(out: &mut String, d: &Diagnosis) {
    if d.similar_cases.is_empty() {
        return;
    }
    let _ = writeln!(out, "\n## Similar past cases\n");
    header_row(out, &["date", "machine", "cause", "what happened", "id"]);
    for c in &d.similar_cases {
        row(
            out,
            &[
                c.date.clone(),
                c.machine.clone(),
                format!("`{}`", c.cause),
                c.snippet.clone(),
                format!("`{}`", c.id),
            ],
        );
    }
}

fn warnings(out: &mut String, d: &Diagnosis) {
    if d.warnings.is_empty() {
        return;
    }
    let _ = writeln!(out, "\n## Warnings\n");
    for w in &d.warnings {
        let _ = writeln!(out, "- {w}");
    }
}
