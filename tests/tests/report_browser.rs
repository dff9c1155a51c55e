//! The demo report rendered in a real browser (headless Chromium, Debian package `chromium`):
//! the page must not be blank and its figures must have drawn. Skips, saying why, where
//! Chromium is absent; `.ci/run` installs it so that CI really runs this.

use sandprov_tests::Sandbox;
use std::path::{Path, PathBuf};
use std::process::Command;

fn chromium() -> Option<PathBuf> {
    ["/usr/bin/chromium", "/usr/bin/chromium-browser"]
        .iter()
        .map(PathBuf::from)
        .find(|p| p.exists())
}

struct Screenshot {
    width: usize,
    height: usize,
    rgb: Vec<[u8; 3]>,
}

fn screenshot(browser: &Path, page: &Path, out: &Path, profile: &Path) -> Screenshot {
    let status = Command::new(browser)
        .args([
            "--headless",
            "--no-sandbox",
            "--disable-gpu",
            "--disable-background-networking",
            "--disable-component-update",
            "--disable-sync",
            "--no-first-run",
            "--hide-scrollbars",
            "--window-size=1280,2000",
        ])
        .arg(format!("--user-data-dir={}", profile.display()))
        .arg(format!("--screenshot={}", out.display()))
        .arg(format!("file://{}", page.display()))
        .output()
        .expect("chromium starts");
    assert!(
        status.status.success(),
        "chromium failed: {}",
        String::from_utf8_lossy(&status.stderr)
    );
    let decoder = png::Decoder::new(std::io::BufReader::new(
        std::fs::File::open(out).expect("a screenshot was written"),
    ));
    let mut reader = decoder.read_info().expect("a PNG screenshot");
    let mut buf = vec![0; reader.output_buffer_size()];
    let info = reader.next_frame(&mut buf).expect("one frame");
    let channels = info.color_type.samples();
    let rgb = buf[..info.buffer_size()]
        .chunks(channels)
        .map(|p| [p[0], p[1], p[2]])
        .collect();
    Screenshot {
        width: info.width as usize,
        height: info.height as usize,
        rgb,
    }
}

#[test]
fn demo_report_renders_in_headless_chromium() {
    let Some(browser) = chromium() else {
        eprintln!("SKIPPED demo_report_renders_in_headless_chromium: no chromium at /usr/bin (apt-get install chromium)");
        return;
    };
    let sb = Sandbox::new();
    sb.sandprov()
        .args(["demo", "-o", "demo", "--quiet"])
        .assert()
        .success();
    let shot = screenshot(
        &browser,
        &sb.path("demo/report.html"),
        &sb.path("shot.png"),
        &sb.path("profile"),
    );
    assert_eq!((shot.width, shot.height), (1280, 2000));
    // Not blank: a real page has a good share of ink (text, rules, table bands, figures).
    let ink = shot
        .rgb
        .iter()
        .filter(|p| p.iter().any(|c| *c < 200))
        .count();
    let share = ink as f64 / shot.rgb.len() as f64;
    assert!(
        share > 0.01,
        "only {:.4} of the page has ink: blank?",
        share
    );
    // Figures drew: the report's own palette colours appear in quantity (text and tables are
    // grey; only the figures' markers and fields carry these hues).
    let coloured = shot
        .rgb
        .iter()
        .filter(|p| {
            let (mx, mn) = (
                *p.iter().max().unwrap() as i32,
                *p.iter().min().unwrap() as i32,
            );
            mx - mn > 60
        })
        .count();
    assert!(
        coloured > 2_000,
        "only {coloured} saturated pixels: did the figures draw?"
    );
    // Keep the screenshot next to the target folder for a person to look at.
    let keep = sandprov_tests::repo_root()
        .join("target")
        .join("report-screenshot.png");
    let _ = std::fs::copy(sb.path("shot.png"), keep);
}
