//! The real binary in a real window under a virtual display: it starts on the demo, renders,
//! saves a screenshot and exits; the image is not blank.

use std::process::Command;

#[test]
fn the_real_window_renders_the_demo_and_saves_a_screenshot() {
    if !gw_verify::require_tool("xvfb-run", "--help", "xvfb") {
        return;
    }
    let dir = std::env::temp_dir().join(format!("gw-window-{}", std::process::id()));
    let runtime = dir.join("xdg");
    std::fs::create_dir_all(&runtime).unwrap();
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        std::fs::set_permissions(&runtime, std::fs::Permissions::from_mode(0o700)).unwrap();
    }
    let png = dir.join("smoke.png");
    let output = Command::new("xvfb-run")
        .args(["-a", "-s", "-screen 0 1440x900x24"])
        .arg(env!("CARGO_BIN_EXE_gaugewright"))
        .arg("--screenshot")
        .arg(&png)
        .env("XDG_RUNTIME_DIR", &runtime)
        .output()
        .expect("xvfb-run starts");
    assert!(
        output.status.success(),
        "status {:?}\nstdout {}\nstderr {}",
        output.status,
        String::from_utf8_lossy(&output.stdout),
        String::from_utf8_lossy(&output.stderr)
    );
    let image = image::open(&png).expect("a PNG was written").to_rgb8();
    assert!(image.width() >= 800 && image.height() >= 500);
    // Not blank: the pixels vary (text, colour map, panels).
    let n = (image.width() * image.height()) as f64;
    let mean: f64 = image.pixels().map(|p| p.0[0] as f64).sum::<f64>() / n;
    let var: f64 = image
        .pixels()
        .map(|p| (p.0[0] as f64 - mean).powi(2))
        .sum::<f64>()
        / n;
    assert!(
        var.sqrt() > 5.0,
        "the screenshot looks blank (standard deviation {:.2})",
        var.sqrt()
    );
    let distinct: std::collections::HashSet<[u8; 3]> = image.pixels().map(|p| p.0).collect();
    assert!(
        distinct.len() > 50,
        "only {} distinct colours",
        distinct.len()
    );
}
