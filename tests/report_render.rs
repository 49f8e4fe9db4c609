//! The HTML work order as a browser draws it: a fixed diagnosis with its chart,
//! rendered headless to a PNG, and the chart's region checked for a drawing.
//!
//! Needs `/usr/bin/chromium`. Without it the test says so and passes; with
//! `SPOOLSLEUTH_INSTALL_CHROMIUM=1` it first tries `apt-get install -y chromium` once.

use std::fs::File;
use std::io::BufReader;
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

use spoolsleuth::chart::{
    points_from_diagnosis, render_svg, ValveCurve, ValveModel, PLOT_BACKGROUND,
};
use spoolsleuth::diagnosis::{Diagnosis, DEMO_CALL};
use spoolsleuth::machine::MachineSet;
use spoolsleuth::report::render_html;
use spoolsleuth::rules::RuleBase;
use spoolsleuth::units::UnitSystem;

const CHROMIUM: &str = "/usr/bin/chromium";
/// A browser that has not written its screenshot by then is stuck.
const BROWSER_TIMEOUT: Duration = Duration::from_secs(90);
/// The screenshot's size: a desktop-width window tall enough for the chart.
const WINDOW: (u32, u32) = (1000, 1400);
/// The colours of the curve and of the band, as the chart writes them.
const CURVE: [u8; 3] = [0x1f, 0x4e, 0x79];

fn chromium() -> Option<&'static Path> {
    let path = Path::new(CHROMIUM);
    if !path.exists() && std::env::var("SPOOLSLEUTH_INSTALL_CHROMIUM").as_deref() == Ok("1") {
        eprintln!("report_render: installing chromium (SPOOLSLEUTH_INSTALL_CHROMIUM=1)");
        let _ = Command::new("apt-get")
            .args(["install", "-y", "chromium"])
            .status();
    }
    path.exists().then_some(path)
}

/// The demo breakdown call on press-4, diagnosed with the built-in rule base.
fn fixed_diagnosis(base: &RuleBase) -> Diagnosis {
    let machines = MachineSet::load(None).unwrap();
    let input = DEMO_CALL.input(&machines).unwrap();
    Diagnosis::run(base, &input).unwrap()
}

fn report_html() -> String {
    let base = RuleBase::load(&[]).unwrap();
    let d = fixed_diagnosis(&base);
    let band = base.settings.get("regulation_band").unwrap().value.si();
    let curve = ValveCurve::new(20.0 / 60_000.0, 8e5, ValveModel::default(), band).unwrap();
    let svg = render_svg(&curve, &points_from_diagnosis(&d), UnitSystem::Metric, None).unwrap();
    render_html(&d, Some(&svg))
}

/// Run the browser, killing it if it hangs.
fn screenshot(browser: &Path, page: &Path, png: &Path, profile: &Path) {
    let mut child = Command::new(browser)
        .args([
            "--headless",
            "--no-sandbox",
            "--disable-gpu",
            "--disable-quic",
            "--no-first-run",
            "--disable-background-networking",
            "--disable-component-update",
            "--disable-sync",
            "--hide-scrollbars",
        ])
        .arg(format!("--user-data-dir={}", profile.display()))
        .arg(format!("--screenshot={}", png.display()))
        .arg(format!("--window-size={},{}", WINDOW.0, WINDOW.1))
        .arg(format!("file://{}", page.display()))
        .stdout(Stdio::null())
        .stderr(Stdio::null())
        .spawn()
        .expect("chromium starts");
    let start = Instant::now();
    while child.try_wait().unwrap().is_none() {
        if start.elapsed() > BROWSER_TIMEOUT {
            let _ = child.kill();
            let _ = child.wait();
            panic!("chromium did not finish within {BROWSER_TIMEOUT:?}");
        }
        std::thread::sleep(Duration::from_millis(200));
    }
}

/// RGB pixels of a PNG with its width and height.
fn decode(png: &Path) -> (Vec<[u8; 3]>, u32, u32) {
    let decoder = png::Decoder::new(BufReader::new(File::open(png).unwrap()));
    let mut reader = decoder.read_info().unwrap();
    let mut buf = vec![0; reader.output_buffer_size().unwrap()];
    let info = reader.next_frame(&mut buf).unwrap();
    let channels = info.color_type.samples();
    assert_eq!(info.bit_depth, png::BitDepth::Eight);
    assert!(channels >= 3, "{:?}", info.color_type);
    let pixels = buf[..info.buffer_size()]
        .chunks(channels)
        .map(|c| [c[0], c[1], c[2]])
        .collect();
    (pixels, info.width, info.height)
}

fn hex(colour: &str) -> [u8; 3] {
    let n = u32::from_str_radix(colour.trim_start_matches('#'), 16).unwrap();
    [(n >> 16) as u8, (n >> 8) as u8, n as u8]
}

fn near(a: [u8; 3], b: [u8; 3], tolerance: u8) -> bool {
    a.iter().zip(b).all(|(x, y)| x.abs_diff(y) <= tolerance)
}

#[test]
fn the_work_order_renders_with_a_drawn_chart() {
    let Some(browser) = chromium() else {
        eprintln!(
            "report_render: skipped, {CHROMIUM} not found (set SPOOLSLEUTH_INSTALL_CHROMIUM=1 to install it)"
        );
        return;
    };
    let dir = tempfile::tempdir().unwrap();
    let page = dir.path().join("report.html");
    let png = dir.path().join("report.png");
    std::fs::write(&page, report_html()).unwrap();
    screenshot(browser, &page, &png, &dir.path().join("profile"));
    let size = std::fs::metadata(&png)
        .expect("a screenshot was written")
        .len();
    assert!(size > 20_000, "screenshot of {size} bytes");
    // Keep the page and its picture where a person can look at them.
    let kept = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("report_render.png");
    let _ = std::fs::copy(&png, &kept);
    let _ = std::fs::copy(&page, kept.with_extension("html"));
    eprintln!("report_render: screenshot kept at {}", kept.display());

    let (pixels, width, height) = decode(&png);
    assert_eq!((width, height), WINDOW);
    // The plot area's fill is used nowhere else: its pixels locate the chart.
    let background = hex(PLOT_BACKGROUND);
    let (mut left, mut top, mut right, mut bottom) = (u32::MAX, u32::MAX, 0, 0);
    for (i, p) in pixels.iter().enumerate() {
        if near(*p, background, 1) {
            let (x, y) = (i as u32 % width, i as u32 / width);
            (left, top, right, bottom) = (left.min(x), top.min(y), right.max(x), bottom.max(y));
        }
    }
    assert!(
        right > left + 400 && bottom > top + 200,
        "chart area {left},{top}–{right},{bottom}"
    );
    let region: Vec<[u8; 3]> = (top..=bottom)
        .flat_map(|y| (left..=right).map(move |x| (x, y)))
        .map(|(x, y)| pixels[(y * width + x) as usize])
        .collect();
    assert!(
        region.iter().any(|p| *p != region[0]),
        "the chart area is one colour"
    );
    let curve = region.iter().filter(|p| near(**p, CURVE, 8)).count();
    assert!(curve > 500, "only {curve} pixels of the curve's colour");
    let band = region
        .iter()
        .filter(|p| near(**p, hex("#cfe9d5"), 12) || near(**p, hex("#d4ebdb"), 12))
        .count();
    assert!(band > 2_000, "only {band} pixels of the band's colour");
}
