//! The part view of every model kind in the real window under a virtual display: the part
//! fills the view (its drawn outline spans at least 40 % of the view's area) and turning the
//! camera changes the picture.

use std::path::{Path, PathBuf};
use std::process::Command;

use image::RgbImage;

/// The view's background grey (egui's dark theme, the part view's canvas).
const BACKGROUND: [u8; 3] = [10, 10, 10];

fn run_window(project: &Path, part: usize, camera: &str, png: &Path, runtime: &Path) {
    let output = Command::new("xvfb-run")
        .args(["-a", "-s", "-screen 0 1280x800x24"])
        .arg(env!("CARGO_BIN_EXE_gaugewright"))
        .arg(project)
        .args([
            "--view",
            "part",
            "--part",
            &part.to_string(),
            "--camera",
            camera,
        ])
        .arg("--screenshot")
        .arg(png)
        .env("XDG_RUNTIME_DIR", runtime)
        .env("HOME", runtime)
        .output()
        .expect("xvfb-run starts");
    assert!(
        output.status.success(),
        "part {part}: status {:?}\nstderr {}",
        output.status,
        String::from_utf8_lossy(&output.stderr)
    );
}

/// The longest run of indices where `keep` holds.
fn longest_run(n: u32, keep: impl Fn(u32) -> bool) -> Option<(u32, u32)> {
    let (mut best, mut start) = (None::<(u32, u32)>, None);
    for i in 0..=n {
        match (i < n && keep(i), start) {
            (true, None) => start = Some(i),
            (false, Some(s)) => {
                if best.is_none_or(|(a, b)| i - 1 - s > b - a) {
                    best = Some((s, i - 1));
                }
                start = None;
            }
            _ => {}
        }
    }
    best
}

/// The view: the widest block of columns with some background in each (a part fitted into the
/// view leaves a margin above and below it), and within it the rows
/// from the first to the last that are mostly background.
fn view_rect(img: &RgbImage) -> (u32, u32, u32, u32) {
    let (w, h) = img.dimensions();
    let bg = |x, y| img.get_pixel(x, y).0 == BACKGROUND;
    let (x0, x1) = longest_run(w, |x| (0..h).filter(|&y| bg(x, y)).count() as u32 > h / 25)
        .expect("a view with its background");
    let wide = |y| (x0..=x1).filter(|&x| bg(x, y)).count() as u32 > (x1 - x0) / 3;
    let y0 = (0..h).find(|&y| wide(y)).expect("view rows");
    let y1 = (0..h).rev().find(|&y| wide(y)).expect("view rows");
    (x0, y0, x1, y1)
}

/// Bounding box of the shaded part inside `r`: pixels that are bright and whose neighbours two
/// pixels away are bright too (filled surface, not the strokes of text, arrows or axes).
fn part_box(
    img: &RgbImage,
    (x0, y0, x1, y1): (u32, u32, u32, u32),
) -> Option<(u32, u32, u32, u32)> {
    let bright = |x: u32, y: u32| {
        let p = img.get_pixel(x, y).0;
        u32::from(p[0]) + u32::from(p[1]) + u32::from(p[2]) > 3 * 70
    };
    let mut b: Option<(u32, u32, u32, u32)> = None;
    for y in y0 + 2..y1.saturating_sub(2) {
        for x in x0 + 2..x1.saturating_sub(2) {
            if bright(x, y)
                && bright(x - 2, y)
                && bright(x + 2, y)
                && bright(x, y - 2)
                && bright(x, y + 2)
            {
                b = Some(b.map_or((x, y, x, y), |(a, c, d, e)| {
                    (a.min(x), c.min(y), d.max(x), e.max(y))
                }));
            }
        }
    }
    b
}

fn area((x0, y0, x1, y1): (u32, u32, u32, u32)) -> f64 {
    f64::from(x1 - x0 + 1) * f64::from(y1 - y0 + 1)
}

#[test]
fn every_model_kind_fills_the_part_view_and_turns() {
    if !gw_verify::require_tool("xvfb-run", "--help", "xvfb") {
        return;
    }
    let dir: PathBuf = std::env::temp_dir().join(format!("gw-part-view-{}", std::process::id()));
    let runtime = dir.join("xdg");
    std::fs::create_dir_all(&runtime).unwrap();
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        std::fs::set_permissions(&runtime, std::fs::Permissions::from_mode(0o700)).unwrap();
    }
    let project = dir.join("gallery.ron");
    let gallery = gw_plan::gallery::model_gallery();
    gw_plan::save_project(&gallery, &project).unwrap();
    let mut report = Vec::new();
    for (k, part) in gallery.parts.iter().enumerate() {
        let n = k + 1;
        let iso = dir.join(format!("part{n}-isometric.png"));
        let front = dir.join(format!("part{n}-front.png"));
        run_window(&project, n, "isometric", &iso, &runtime);
        run_window(&project, n, "front", &front, &runtime);
        let a = image::open(&iso).unwrap().to_rgb8();
        let b = image::open(&front).unwrap().to_rgb8();
        let view = view_rect(&a);
        assert!(
            area(view) > 0.2 * f64::from(a.width() * a.height()),
            "{}: view {view:?}",
            part.name
        );
        let drawn = part_box(&a, view).unwrap_or_else(|| panic!("{}: no part drawn", part.name));
        let share = area(drawn) / area(view);
        report.push(format!("{}: {:.0} %", part.name, share * 100.0));
        assert!(
            share >= 0.40,
            "{}: the part spans {:.0} % of the view {view:?}, drawn {drawn:?}",
            part.name,
            share * 100.0
        );
        let (x0, y0, x1, y1) = view;
        let changed = (y0..=y1)
            .flat_map(|y| (x0..=x1).map(move |x| (x, y)))
            .filter(|&(x, y)| a.get_pixel(x, y) != b.get_pixel(x, y))
            .count() as f64;
        assert!(
            changed / area(view) > 0.05,
            "{}: turning from isometric to front changed only {:.1} % of the view",
            part.name,
            100.0 * changed / area(view)
        );
    }
    println!("part extent in the view: {}", report.join("; "));
    let _ = std::fs::remove_dir_all(&dir);
}
