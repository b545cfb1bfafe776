//! Every results tab of the demo in the real window under a virtual display at 1280 × 800, in SI
//! and in US customary units: the binary saves the screenshot and does not report the view's
//! content running past an edge of its panel (which the screenshot would show cut off). At
//! 800 × 600, where the side panels leave the view too narrow, the report does appear: the check
//! can fail.

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

/// A private runtime folder, as a desktop session has one.
fn scratch() -> PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-results-window-{}", std::process::id()));
    let runtime = dir.join("xdg");
    std::fs::create_dir_all(&runtime).unwrap();
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        std::fs::set_permissions(&runtime, std::fs::Permissions::from_mode(0o700)).unwrap();
    }
    dir
}

fn screenshot(dir: &Path, screen: &str, tab: &str, units: &str) -> (Output, PathBuf) {
    let png = dir.join(format!("{tab}-{units}-{screen}.png"));
    let demo = Path::new(env!("CARGO_MANIFEST_DIR")).join("../../assets/winch_test_stand.ron");
    let output = Command::new("xvfb-run")
        .args(["-a", "-s", &format!("-screen 0 {screen}x24")])
        .arg(env!("CARGO_BIN_EXE_gaugewright"))
        .arg(&demo)
        .args(["--view", "results", "--results", tab, "--units", units])
        .arg("--screenshot")
        .arg(&png)
        .env("XDG_RUNTIME_DIR", dir.join("xdg"))
        .env("HOME", dir)
        .output()
        .expect("xvfb-run starts");
    (output, png)
}

fn said(output: &Output) -> String {
    format!(
        "status {:?}\nstdout {}\nstderr {}",
        output.status,
        String::from_utf8_lossy(&output.stdout),
        String::from_utf8_lossy(&output.stderr)
    )
}

#[test]
fn every_results_tab_fits_the_real_window_in_both_unit_systems() {
    if !gw_verify::require_tool("xvfb-run", "--help", "xvfb") {
        return;
    }
    let dir = scratch();
    for units in ["si", "us"] {
        for tab in [
            "output",
            "temperature",
            "margins",
            "uncertainty",
            "cancellation",
            "measured",
        ] {
            let (output, png) = screenshot(&dir, "1280x800", tab, units);
            assert!(output.status.success(), "{tab}, {units}: {}", said(&output));
            let stderr = String::from_utf8_lossy(&output.stderr);
            assert!(!stderr.contains("layout:"), "{tab}, {units}: {stderr}");
            let image = image::open(&png).expect("a PNG was written").to_rgb8();
            assert_eq!(
                (image.width(), image.height()),
                (1280, 800),
                "{tab}, {units}"
            );
            let distinct: std::collections::HashSet<[u8; 3]> =
                image.pixels().map(|p| p.0).collect();
            assert!(distinct.len() > 50, "{tab}, {units}: a blank picture");
        }
    }
    let (output, _) = screenshot(&dir, "800x600", "margins", "si");
    assert!(output.status.success(), "{}", said(&output));
    assert!(
        String::from_utf8_lossy(&output.stderr).contains("layout: the view's content runs"),
        "a view too narrow for its content is reported: {}",
        said(&output)
    );
    let _ = std::fs::remove_dir_all(&dir);
}
