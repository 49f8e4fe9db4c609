//! Writing a work-order report file: HTML (with the valve chart) or
//! Markdown, chosen by the file's extension, written atomically.

use std::io::Write;
use std::path::Path;

use crate::chart::{points_from_diagnosis, render_svg, ValveCurve, ValveModel};
use crate::diagnosis::Diagnosis;
use crate::report::{render_html, render_markdown};
use crate::rules::RuleBase;
use crate::Error;

/// The rule-base setting that is the healthy regulation band.
const BAND_SETTING: &str = "regulation_band";

/// The kinds of report file.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ReportKind {
    /// Self-contained HTML with the valve chart.
    Html,
    /// Markdown.
    Markdown,
}

/// The kind of report a path asks for, checked before any work is done.
pub fn report_kind(path: &Path) -> Result<ReportKind, Error> {
    let ext = path
        .extension()
        .and_then(|e| e.to_str())
        .map(str::to_ascii_lowercase)
        .unwrap_or_default();
    let folder = report_folder(path);
    if !folder.is_dir() {
        // Checked before the diagnosis runs, so a typo in the folder does not
        // print a verdict and then fail.
        return Err(Error::Input {
            option: "--report".into(),
            message: format!(
                "`{}`: there is no folder `{}` to write it in",
                path.display(),
                folder.display()
            ),
        });
    }
    match ext.as_str() {
        "html" | "htm" => Ok(ReportKind::Html),
        "md" | "markdown" => Ok(ReportKind::Markdown),
        _ => Err(Error::Input {
            option: "--report".into(),
            message: format!(
                "`{}`: a report is written as .html or .md (the file name's extension chooses)",
                path.display()
            ),
        }),
    }
}

/// The folder a report is written in.
fn report_folder(path: &Path) -> &Path {
    path.parent()
        .filter(|p| !p.as_os_str().is_empty())
        .unwrap_or(Path::new("."))
}

/// Write the report for `diagnosis` to `path` (`.html`, `.htm` or `.md`).
pub fn write_report(path: &Path, diagnosis: &Diagnosis, base: &RuleBase) -> Result<(), Error> {
    let text = match report_kind(path)? {
        ReportKind::Html => render_html(diagnosis, chart(diagnosis, base).as_deref()),
        ReportKind::Markdown => format!("{}{}", render_markdown(diagnosis), sign_off()),
    };
    let io = |e: std::io::Error| Error::Input {
        option: "--report".into(),
        message: format!("{}: {e}", path.display()),
    };
    let mut tmp = tempfile::NamedTempFile::new_in(report_folder(path)).map_err(io)?;
    tmp.write_all(text.as_bytes()).map_err(io)?;
    readable_by_all(tmp.as_file()).map_err(io)?;
    tmp.persist(path).map_err(|e| io(e.error))?;
    eprintln!("report written to {}", path.display());
    Ok(())
}

/// The valve chart, when the diagnosis knows the compensator setting and a
/// set flow (given, or the flow at the unloaded point) and has points to plot.
fn chart(d: &Diagnosis, base: &RuleBase) -> Option<String> {
    let value = |name: &str| {
        d.readings
            .iter()
            .find(|r| r.name == name)
            .map(|r| r.value_si)
    };
    let setting = value("spring_setting")?;
    let points = points_from_diagnosis(d);
    let flow_set = value("flow_set").or_else(|| {
        points
            .iter()
            .find(|p| p.name == "unloaded")
            .map(|p| p.flow.si())
    })?;
    let band = base.settings.get(BAND_SETTING)?.value.si();
    let curve = ValveCurve::new(flow_set, setting, ValveModel::default(), band).ok()?;
    render_svg(&curve, &points, d.units, None).ok()
}

/// The Markdown report's sign-off block for a work order.
fn sign_off() -> String {
    "\n## Sign-off\n\n| | |\n|---|---|\n| Technician | |\n| Date | |\n| Signature | |\n| Supervisor | |\n".to_string()
}

/// A report is meant to be shared: give it the usual file permissions
/// rather than the private ones of a temporary file.
#[cfg(unix)]
fn readable_by_all(file: &std::fs::File) -> std::io::Result<()> {
    use std::os::unix::fs::PermissionsExt;
    file.set_permissions(std::fs::Permissions::from_mode(0o644))
}

#[cfg(not(unix))]
fn readable_by_all(_file: &std::fs::File) -> std::io::Result<()> {
    Ok(())
}
