//! A diagnosis as terminal text: the house tables for readings, causes and
//! past cases, colour only through [`Color`] (none when it says never).
//!
//! Sections come in the order a technician works: what was seen, what was
//! read, whether the readings can be trusted, what they point to, what to
//! measure next, what to fix, how to stay safe, what happened before.

use std::fmt::Write;

use comfy_table::Table;

use super::wording;
use super::TextStyle;
use crate::diagnosis::{CauseStatus, Diagnosis};
use crate::output::{table, Color};

/// Render `d` as terminal text.
pub fn render_text(d: &Diagnosis, style: TextStyle) -> String {
    let color = style.color;
    let mut out = String::new();
    header(&mut out, d, color);
    readings(&mut out, d, style);
    consistency(&mut out, d, color);
    causes(&mut out, d, style);
    next_measurement(&mut out, d, color);
    fix(&mut out, d, color);
    cautions(&mut out, d, color);
    similar_cases(&mut out, d, style);
    warnings(&mut out, d, color);
    let _ = writeln!(out, "\n{}", d.closing);
    out
}

fn sized(mut t: Table, style: TextStyle) -> Table {
    if let Some(width) = style.width {
        t.set_width(width);
    }
    t
}

fn heading(out: &mut String, color: Color, title: &str) {
    let _ = writeln!(out, "\n{}", color.bold(title));
}

fn header(out: &mut String, d: &Diagnosis, color: Color) {
    let _ = writeln!(out, "{} {}", color.bold("Machine:"), wording::machine(d));
    let _ = writeln!(out, "{} {}", color.bold("Circuit:"), wording::circuit(d));
    let _ = writeln!(out, "{} {}", color.bold("Units:"), d.units);
    if let Some(complaint) = &d.complaint {
        let _ = writeln!(out, "{} \"{complaint}\"", color.bold("Complaint:"));
    }
    let _ = writeln!(
        out,
        "{} {}",
        color.bold("Symptoms:"),
        wording::symptoms(d).join("; ")
    );
}

fn readings(out: &mut String, d: &Diagnosis, style: TextStyle) {
    heading(out, style.color, &format!("Readings ({})", d.units));
    if d.readings.is_empty() {
        let _ = writeln!(out, "none given");
        return;
    }
    let mut t = sized(table(["reading", "what", "value", "warnings"]), style);
    for r in &d.readings {
        let warnings: Vec<String> = r.warnings.iter().map(|w| style.color.yellow(w)).collect();
        t.add_row([
            r.name.clone(),
            r.label.clone(),
            r.shown.clone(),
            warnings.join("\n"),
        ]);
    }
    let _ = writeln!(out, "{t}");
}

fn consistency(out: &mut String, d: &Diagnosis, color: Color) {
    if d.consistency.is_empty() {
        return;
    }
    let _ = writeln!(
        out,
        "\n{}",
        color.red(&color.bold(&format!("!! {}", wording::GAUGES_FIRST)))
    );
    let _ = writeln!(out, "{}", wording::GAUGES_FIRST_WHY);
    for p in &d.consistency {
        let _ = writeln!(out, "  - {}: {}", p.rule, p.message);
    }
}

fn causes(out: &mut String, d: &Diagnosis, style: TextStyle) {
    heading(out, style.color, "Causes, most likely first");
    if d.causes.is_empty() {
        let _ = writeln!(out, "no rule applies to these symptoms on this circuit");
        return;
    }
    let mut t = sized(table(["#", "cause", "status", "score", "evidence"]), style);
    for (n, c) in d.causes.iter().enumerate() {
        let mut lines: Vec<String> = wording::ordered(c)
            .into_iter()
            .map(wording::evidence)
            .collect();
        lines.extend(wording::history(c));
        t.add_row([
            (n + 1).to_string(),
            format!("{}\n({})", c.label, c.cause),
            status_colored(style.color, c.status, &wording::status(c)),
            wording::percent(c.score),
            lines.join("\n"),
        ]);
    }
    let _ = writeln!(out, "{t}");
}

fn status_colored(color: Color, status: CauseStatus, words: &str) -> String {
    match status {
        CauseStatus::Confirmed => color.red(&color.bold(words)),
        CauseStatus::Likely => color.yellow(words),
        CauseStatus::RuledOut => color.green(words),
        _ => words.to_string(),
    }
}

fn next_measurement(out: &mut String, d: &Diagnosis, color: Color) {
    heading(out, color, "Next measurement");
    let Some(next) = &d.next_measurement else {
        let _ = writeln!(out, "{}", wording::no_measurement(d));
        return;
    };
    let _ = writeln!(out, "  what:       {}", wording::measurement(next));
    if let Some(point) = &next.point {
        let _ = writeln!(out, "  when:       {point}");
    }
    let _ = writeln!(out, "  where/how:  {}", next.how);
    if let Some(instrument) = &next.instrument {
        let _ = writeln!(out, "  instrument: {instrument}");
    }
    let _ = writeln!(out, "  why:        {}", next.why);
    for c in wording::measurement_cautions(d, next) {
        let _ = writeln!(
            out,
            "  {} {}",
            color.yellow("caution:"),
            wording::caution(c)
        );
    }
}

fn fix(out: &mut String, d: &Diagnosis, color: Color) {
    heading(out, color, "Fix for the leading cause");
    match &d.fix {
        Some(f) => {
            let _ = writeln!(out, "{} ({})", f.label, f.cause);
            let _ = writeln!(out, "  {}", f.text);
        }
        None => {
            let _ = writeln!(out, "{}", wording::NO_FIX);
        }
    }
}

fn cautions(out: &mut String, d: &Diagnosis, color: Color) {
    if d.cautions.is_empty() {
        return;
    }
    heading(out, color, "Safety");
    for c in &d.cautions {
        let _ = writeln!(out, "  {} {}", color.yellow("!"), wording::caution(c));
    }
}

fn similar_cases(out: &mut String, d: &Diagnosis, style: TextStyle) {
    if d.similar_cases.is_empty() {
        return;
    }
    heading(out, style.color, "Similar past cases");
    let mut t = sized(
        table(["date", "machine", "cause", "what happened", "id"]),
        style,
    );
    for c in &d.similar_cases {
        t.add_row([
            c.date.clone(),
            c.machine.clone(),
            c.cause.clone(),
            c.snippet.clone(),
            c.id.clone(),
        ]);
    }
    let _ = writeln!(out, "{t}");
}

fn warnings(out: &mut String, d: &Diagnosis, color: Color) {
    if d.warnings.is_empty() {
        return;
    }
    heading(out, color, "Warnings");
    for w in &d.warnings {
        let _ = writeln!(out, "  - {}", color.yellow(w));
    }
}
