use super::*;
use crate::document::{PaperSize, Project};
use crate::sheet::layout::{Op, problems};
use crate::sheet::writer::Header;

fn writer() -> Writer {
    Writer::new(
        PaperSize::A4,
        Header {
            title: "Face drawings".into(),
            details: "checked page by page".into(),
        },
    )
}

fn projects() -> Vec<Project> {
    vec![crate::demo::demo_project(), crate::gallery::model_gallery()]
}

fn texts(w: &Writer) -> Vec<String> {
    w.pages
        .iter()
        .flatten()
        .filter_map(|op| match op {
            Op::Text { text, .. } => Some(text.clone()),
            _ => None,
        })
        .collect()
}

#[test]
fn every_face_drawing_of_the_demo_and_the_gallery_is_clean() {
    let mut faces = 0;
    for project in projects() {
        for part in &project.parts {
            let placed = project.placed_gauges(part);
            let mut w = writer();
            draw(&mut w, part, &placed);
            for (i, page) in w.pages.iter().enumerate() {
                let p = problems(page, w.width, w.height);
                assert!(p.is_empty(), "{}, page {}: {p:#?}", part.name, i + 1);
            }
            let all = texts(&w);
            assert!(
                !all.iter().any(|t| t.starts_with("No room")),
                "{}: a label found no room: {all:#?}",
                part.name
            );
            // Every gauge is named on its drawing.
            for g in &placed {
                assert!(
                    all.iter().any(|t| t.starts_with(&format!("{} ", g.id))),
                    "{}: {} not labelled",
                    part.name,
                    g.id
                );
            }
            faces += all.iter().filter(|t| t.starts_with("Scale ")).count();
        }
    }
    assert!(faces >= 15, "only {faces} faces drawn");
}

/// The ratio a "Scale a:b when printed…" line states.
fn stated_ratio(w: &Writer) -> f64 {
    let line = texts(w)
        .into_iter()
        .find(|t| t.starts_with("Scale "))
        .expect("a scale is stated");
    let ratio = line["Scale ".len()..]
        .split_whitespace()
        .next()
        .expect("the ratio follows");
    let (a, b) = ratio.split_once(':').expect("a:b");
    a.parse::<f64>().unwrap() / b.parse::<f64>().unwrap()
}

#[test]
fn the_stated_scale_is_the_drawn_scale() {
    // The demo's reaction arm: its top face is 30 mm wide (the section's width), drawn whole
    // across. The shaded face's height must be 30 mm × the stated ratio, at 72 pt per 25.4 mm.
    let project = crate::demo::demo_project();
    let part = &project.parts[0];
    let placed: Vec<_> = project
        .placed_gauges(part)
        .into_iter()
        .filter(|g| g.position.face == Face::Top)
        .collect();
    let mut w = writer();
    draw(&mut w, part, &placed);
    let ratio = stated_ratio(&w);
    let face_h = w.pages[0]
        .iter()
        .find_map(|op| match op {
            Op::Rect {
                h, fill: Some(238), ..
            } => Some(*h as f64),
            _ => None,
        })
        .expect("the face is shaded");
    let want = 30.0 * ratio * 72.0 / 25.4;
    assert!((face_h - want).abs() < 0.01, "{face_h} pt, want {want} pt");
    // The scale bar: its five parts together are as long as its label says.
    let bar: f64 = w.pages[0]
        .iter()
        .filter_map(|op| match op {
            Op::Rect { w, h, stroke, .. } if *h == 3.0 && *stroke == 0.5 => Some(*w as f64),
            _ => None,
        })
        .sum();
    let label = texts(&w)
        .into_iter()
        .filter_map(|t| t.strip_suffix(" mm").and_then(|v| v.parse::<f64>().ok()))
        .next()
        .expect("the bar is labelled");
    assert!(
        (bar - label * ratio * 72.0 / 25.4).abs() < 0.01,
        "{bar} pt for {label} mm"
    );
}

#[test]
fn a_dimension_line_is_as_long_as_its_value_at_the_stated_scale() {
    // The reaction arm's gauges sit 50 mm from the datum along x, drawn unbroken: the longest
    // horizontal dimension line is 50 mm × the stated ratio.
    let project = crate::demo::demo_project();
    let part = &project.parts[0];
    let placed: Vec<_> = project
        .placed_gauges(part)
        .into_iter()
        .filter(|g| g.position.face == Face::Top)
        .collect();
    let mut w = writer();
    draw(&mut w, part, &placed);
    let ratio = stated_ratio(&w);
    let longest = w.pages[0]
        .iter()
        .filter_map(|op| match op {
            Op::Line {
                x1,
                y1,
                x2,
                y2,
                width,
                ..
            } if *width == 0.4 && y1 == y2 => Some((x2 - x1).abs() as f64),
            _ => None,
        })
        .fold(0.0, f64::max);
    let want = 50.0 * ratio * 72.0 / 25.4;
    assert!(
        (longest - want).abs() < 0.01,
        "{longest} pt, want {want} pt"
    );
    assert!(texts(&w).iter().any(|t| t == "50.0"));
}

#[test]
fn each_face_says_how_it_is_seen_and_what_lies_beyond_its_edges() {
    let project = crate::demo::demo_project();
    let part = &project.parts[0];
    let mut w = writer();
    draw(&mut w, part, &project.placed_gauges(part));
    let all = texts(&w).join("\n");
    for want in [
        "Top face: seen from above, looking down on the top face.",
        "beyond the upper edge: back face",
        "beyond the lower edge: front face",
        "beyond the left edge: clamped end at x = 0.0 mm",
        // The back face is drawn with x to the right, so the bottom face lies above it (past a
        // break: the 60 mm side is not drawn whole).
        "upper edge: bottom face",
        "+x",
    ] {
        assert!(all.contains(want), "\"{want}\" missing from:\n{all}");
    }
}

#[test]
fn every_stated_scale_is_from_the_series_and_long_faces_are_broken() {
    let names: Vec<String> = plan::SERIES.iter().map(|s| s.label()).collect();
    for project in projects() {
        for part in &project.parts {
            let mut w = writer();
            draw(&mut w, part, &project.placed_gauges(part));
            for t in texts(&w).iter().filter(|t| t.starts_with("Scale ")) {
                let name = t["Scale ".len()..].split_whitespace().next().unwrap_or("");
                assert!(names.iter().any(|n| n == name), "{}: {t}", part.name);
            }
        }
    }
    // The drum drive shaft is 600 mm long with gauges at 150 and 300 mm: drawn in pieces.
    let project = crate::demo::demo_project();
    let part = &project.parts[1];
    let mut w = writer();
    draw(&mut w, part, &project.placed_gauges(part));
    assert!(texts(&w).iter().any(|t| t.starts_with("past the break")));
}
