use super::*;
use crate::document::{PaperSize, Project};
use crate::sheet::layout::{Area, Op, problems};
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
    assert!(texts(&w).iter().any(|t| t == "50.00"));
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
        "left edge: clamped end at x = 0 mm",
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

/// Text ops of every page with their boxes.
fn text_boxes(w: &Writer) -> Vec<(usize, String, f32, Area)> {
    let mut out = Vec::new();
    for (i, page) in w.pages.iter().enumerate() {
        for op in page {
            if let Op::Text {
                x,
                y,
                size,
                bold,
                text,
            } = op
            {
                let area = crate::sheet::layout::text_area(*x, *y, *size, *bold, text);
                out.push((i, text.clone(), *size, area));
            }
        }
    }
    out
}

/// Every part's face drawings, each part on a writer of its own.
fn drawn_parts() -> Vec<(String, Vec<gw_bridge::PlacedGauge>, Writer)> {
    let mut out = Vec::new();
    for project in projects() {
        for part in &project.parts {
            let placed = project.placed_gauges(part);
            let mut w = writer();
            draw(&mut w, part, &placed);
            out.push((part.name.clone(), placed, w));
        }
    }
    out
}

/// How many bold figures "k" the pages carry.
fn bold_figures(w: &Writer, k: usize) -> usize {
    w.pages
        .iter()
        .flatten()
        .filter(|op| matches!(op, Op::Text { text, bold: true, .. } if *text == k.to_string()))
        .count()
}

#[test]
fn every_grid_of_every_multi_grid_gauge_is_numbered() {
    let mut numbered = 0;
    for (name, placed, w) in drawn_parts() {
        for k in 1..=3 {
            let want = placed
                .iter()
                .filter(|g| g.element_count() >= k.max(2))
                .count();
            let got = bold_figures(&w, k);
            assert!(
                got >= want,
                "{name}: {got} grid {k} numbers for {want} gauges"
            );
            if k == 1 {
                numbered += want;
            }
        }
    }
    // The demo's shear pairs and the gallery's rosettes and pairs.
    assert!(numbered >= 4, "only {numbered} multi-grid gauges drawn");
}

#[test]
fn grid_numbers_stand_beyond_their_own_tabs() {
    // A two-element 90° gauge at 0°: grid 1 runs along +x, so its tabs and number are to its
    // left on the page; grid 2 runs along +s (up the page), so they are below it.
    let project = crate::gallery::model_gallery();
    let g = project
        .parts
        .iter()
        .flat_map(|p| project.placed_gauges(p))
        .find(|g| g.spec.pattern == gw_bridge::GaugePattern::TwoElement90)
        .map(|mut g| {
            g.angle_rad = 0.0;
            g
        })
        .expect("the gallery has a two-element 90° gauge");
    let mut w = writer();
    let c = [300.0, 400.0];
    let m = marks::gauge(&mut w, &g, c, plan::Scale::FULL.pt_per_m() as f32);
    let (one, two) = (m.tab_ends[0].0, m.tab_ends[1].0);
    assert!(
        one[0] < c[0] - 1.0 && (one[1] - c[1]).abs() < 1e-3,
        "{one:?}"
    );
    assert!(
        two[1] > c[1] + 1.0 && (two[0] - c[0]).abs() < 1e-3,
        "{two:?}"
    );
}

#[test]
fn the_sphere_names_its_poles_and_where_s_starts() {
    let project = crate::gallery::model_gallery();
    let part = project
        .parts
        .iter()
        .find(|p| matches!(p.member, gw_mechanics::Member::ThinSphere(_)))
        .expect("the gallery has a sphere");
    // Where the face's x ends lie in space, by gw_mechanics' own surface geometry: the largest
    // x is the top of the sphere (+z), the smallest the bottom.
    let extent = part.member.faces()[0];
    let z_at = |x: f64| {
        let p = gw_mechanics::SurfacePoint {
            face: Face::Round,
            x_m: x,
            s_m: 0.0,
        };
        part.member
            .surface_frame(&p)
            .expect("on the sphere")
            .position[2]
    };
    assert!(z_at(extent.x_range_m.1) > 0.0 && z_at(extent.x_range_m.0) < 0.0);
    let mut w = writer();
    draw(&mut w, part, &project.placed_gauges(part));
    let all = texts(&w).join(" ");
    for want in [
        "right edge: top pole (+z)",
        "left edge: bottom pole (−z)",
        "from the bottom pole (−z) on the left to the top pole (+z) on the right",
        "s round the equator from the reference meridian (s = 0",
    ] {
        assert!(all.contains(want), "\"{want}\" missing from:\n{all}");
    }
    assert!(!all.contains("top line"), "{all}");
    assert!(!all.contains("edge: pole"), "{all}");
}

#[test]
fn no_text_is_under_seven_points_and_labels_keep_apart_from_each_other_and_from_lines() {
    for (name, _, w) in drawn_parts() {
        let boxes = text_boxes(&w);
        for (i, (page, text, size, a)) in boxes.iter().enumerate() {
            assert!(*size >= 7.0, "{name}: \"{text}\" at {size} pt");
            // Beside one another (the same line), labels keep 6 pt apart.
            for (other_page, other, _, b) in &boxes[i + 1..] {
                let same_line = a.y0.max(b.y0) < a.y1.min(b.y1) - 1.0;
                let gap = (b.x0 - a.x1).max(a.x0 - b.x1);
                assert!(
                    page != other_page || !same_line || gap >= 6.0,
                    "{name}: \"{text}\" and \"{other}\" {gap} pt apart"
                );
            }
            // And 2 pt from every line (break lines, extension lines, arrows).
            let grown = a.grown(2.0);
            for op in &w.pages[*page] {
                for (p, q) in crate::sheet::layout::segments(op) {
                    assert!(
                        !grown.crossed_by(p, q),
                        "{name}: a line within 2 pt of \"{text}\""
                    );
                }
            }
        }
    }
}

#[test]
fn the_key_comes_with_each_parts_first_face_drawing() {
    for (name, _, w) in drawn_parts() {
        let all = texts(&w);
        let key = all
            .iter()
            .filter(|t| t.starts_with("Key to the face drawings"))
            .count();
        assert_eq!(key, 1, "{name}");
        let at = |p: &dyn Fn(&String) -> bool| all.iter().position(p);
        let key_at = at(&|t| t.starts_with("Key to the face drawings")).unwrap();
        let scales: Vec<usize> = (0..all.len())
            .filter(|&i| all[i].starts_with("Scale "))
            .collect();
        assert!(scales[0] < key_at, "{name}");
        if let Some(second) = scales.get(1) {
            assert!(
                key_at < *second,
                "{name}: the key comes after the second drawing"
            );
        }
    }
}

#[test]
fn the_area_to_prepare_is_the_grid_and_ten_millimetres_all_round() {
    // The reaction arm's top face: its gauges lie along x, 50 mm from the clamp, well inside
    // the face along x, so the dashed outline's length along x is the grid length plus 20 mm
    // (common practice: 10 mm of prepared surface all round) at the stated scale.
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
    let xs: Vec<f32> = w.pages[0]
        .iter()
        .filter_map(|op| match op {
            Op::Line {
                x1, x2, grey: 130, ..
            } => Some([*x1, *x2]),
            _ => None,
        })
        .flatten()
        .collect();
    assert!(!xs.is_empty(), "no outline of the area to prepare");
    let span =
        xs.iter().copied().fold(f32::MIN, f32::max) - xs.iter().copied().fold(f32::MAX, f32::min);
    let want = (placed[0].spec.grid_length_m * 1e3 + 20.0) * ratio * 72.0 / 25.4;
    assert!(
        (span as f64 - want).abs() < 0.01,
        "{span} pt, want {want} pt"
    );
}

/// The drawing of the gallery part named `name`, with its gauges.
fn gallery_drawing(name: &str) -> (Part, Vec<gw_bridge::PlacedGauge>, Writer) {
    let project = crate::gallery::model_gallery();
    let part = project
        .parts
        .iter()
        .find(|p| p.name.starts_with(name))
        .expect("the gallery has the part")
        .clone();
    let placed = project.placed_gauges(&part);
    let mut w = writer();
    draw(&mut w, &part, &placed);
    (part, placed, w)
}

#[test]
fn the_seam_is_given_as_an_arc_length_with_its_angle() {
    // The gallery's round link: a solid round bar. The seam's arc length from the top line is
    // its angle's share of the circumference π·d (the bar's diameter from its section).
    let (part, _, w) = gallery_drawing("Round link");
    let gw_mechanics::Member::Beam(beam) = &part.member else {
        panic!("the round link is a beam");
    };
    let gw_mechanics::Section::SolidRound { diameter_m } = beam.section else {
        panic!("the round link is a solid round");
    };
    let all = texts(&w);
    let seam = all
        .iter()
        .find_map(|t| {
            t.split_once("seam at s = ")
                .map(|(_, rest)| rest.to_owned())
        })
        .expect("the seam is named with its arc length");
    let (arc, rest) = seam.split_once(" mm (").expect("arc in mm, then the angle");
    let arc_mm: f64 = arc.parse().expect("a number");
    let deg: f64 = rest.split('°').next().unwrap().parse().expect("an angle");
    let want_mm = deg / 360.0 * std::f64::consts::PI * diameter_m * 1e3;
    assert!(
        (arc_mm - want_mm).abs() < 0.051,
        "{seam}: want {want_mm:.2} mm"
    );
    // The note says how to set up s = 0 on a part that turns.
    assert!(
        all.join(" ")
            .contains("choose the line on the part that is to be s = 0"),
        "{all:#?}"
    );
}

#[test]
fn a_plates_hole_is_drawn_open_and_the_datum_is_found_from_its_edge() {
    let (part, placed, w) = gallery_drawing("Lug plate");
    let gw_mechanics::Member::PlateWithHole(plate) = &part.member else {
        panic!("the lug plate is a plate with a hole");
    };
    let r_m = 0.5 * plate.hole_diameter_m;
    let ops = &w.pages[0];
    // The hole: a closed outline filled white, drawn after the shaded face.
    let (hole, centre, r_pt) = ops
        .iter()
        .enumerate()
        .find_map(|(i, op)| match op {
            Op::Path {
                points,
                closed: true,
                fill: Some(255),
                ..
            } => {
                // Centre and radius from the outline's box.
                let (lo, hi) = points
                    .iter()
                    .fold(([f32::MAX; 2], [f32::MIN; 2]), |(lo, hi), p| {
                        (
                            [lo[0].min(p[0]), lo[1].min(p[1])],
                            [hi[0].max(p[0]), hi[1].max(p[1])],
                        )
                    });
                let c = [(lo[0] + hi[0]) / 2.0, (lo[1] + hi[1]) / 2.0];
                Some((i, c, (hi[0] - lo[0]) / 2.0))
            }
            _ => None,
        })
        .expect("the hole is drawn white");
    let shade = ops
        .iter()
        .position(|op| {
            matches!(
                op,
                Op::Rect {
                    fill: Some(238),
                    ..
                }
            )
        })
        .expect("the face is shaded");
    assert!(shade < hole);
    // At the stated scale the drawn hole has the plate's hole radius.
    let want_pt = r_m * stated_ratio(&w) * 72.0 / 0.0254;
    assert!(
        ((r_pt as f64) - want_pt).abs() < 0.5,
        "{r_pt} pt, want {want_pt}"
    );
    // No dash of the area to prepare lies inside the hole.
    for op in ops {
        if let Op::Line {
            x1,
            y1,
            x2,
            y2,
            grey: 130,
            ..
        } = op
        {
            let mid = [(x1 + x2) / 2.0, (y1 + y2) / 2.0];
            let d = (mid[0] - centre[0]).hypot(mid[1] - centre[1]);
            assert!(d >= r_pt - 0.05, "a dash {d} pt from the hole's centre");
        }
    }
    // The note gives each gauge's distance from the hole's edge: K1 sits on the line from the
    // centre along +s, so the distance is its s less the hole's radius.
    let g = &placed[0];
    let want = format!(
        "{}: {:.2} mm from the hole edge",
        g.id,
        (g.position.s_m.abs() - r_m) * 1e3
    );
    let all = texts(&w).join(" ");
    assert!(all.contains("The datum is the hole's centre"), "{all}");
    assert!(all.contains(&want), "{want} not in {all}");
}

/// Twice-halved shoelace area of a ring, square points.
fn ring_area(ring: &[[f32; 2]]) -> f64 {
    let n = ring.len();
    (0..n)
        .map(|i| {
            let (a, b) = (ring[i], ring[(i + 1) % n]);
            f64::from(a[0]) * f64::from(b[1]) - f64::from(b[0]) * f64::from(a[1])
        })
        .sum::<f64>()
        .abs()
        / 2.0
}

#[test]
fn a_polygon_clipped_to_a_box_keeps_the_area_inside_it() {
    // Plane geometry: the square 0..10 overlaps the box 5..15 in a 5 × 5 square; an L shape
    // (the square 0..10 less its quarter 5..10 × 5..10) overlaps the box 0..20 × 0..5 in 10 × 5.
    let square = [[0.0, 0.0], [10.0, 0.0], [10.0, 10.0], [0.0, 10.0]];
    let clipped = marks::clip_polygon(&square, &Area::new(5.0, 5.0, 15.0, 15.0));
    assert!((ring_area(&clipped) - 25.0).abs() < 1e-9, "{clipped:?}");
    let l_shape = [
        [0.0, 0.0],
        [10.0, 0.0],
        [10.0, 5.0],
        [5.0, 5.0],
        [5.0, 10.0],
        [0.0, 10.0],
    ];
    let clipped = marks::clip_polygon(&l_shape, &Area::new(0.0, 0.0, 20.0, 5.0));
    assert!((ring_area(&clipped) - 50.0).abs() < 1e-9, "{clipped:?}");
    assert!(marks::clip_polygon(&square, &Area::new(20.0, 20.0, 30.0, 30.0)).is_empty());
}

/// A 60 × 40 mm steel strap, 3 mm thick, with a 10 × 6 mm slot through it, as an imported part
/// (2 mm hexahedra, 30 × 20 less 5 × 3 of them), under a uniform unit stress.
fn holed_plate() -> gw_mechanics::Member {
    use gw_mechanics::imported::{
        Cell, FieldState, ImportedSurface, RawMesh, ReferenceAxis, SurfaceField, TensorQuantity,
        UnitField,
    };
    let (nx, ny) = (30u32, 20u32);
    let id = |i: u32, j: u32, k: u32| (k * (ny + 1) + j) * (nx + 1) + i;
    let mut points_m = Vec::new();
    for k in 0..2 {
        for j in 0..=ny {
            for i in 0..=nx {
                points_m.push([
                    0.002 * f64::from(i),
                    0.002 * f64::from(j),
                    0.003 * f64::from(k),
                ]);
            }
        }
    }
    let mut cells = Vec::new();
    for j in 0..ny {
        for i in 0..nx {
            if (12..17).contains(&i) && (8..11).contains(&j) {
                continue;
            }
            cells.push(Cell::grid_hexahedron(id, i, j, 0));
        }
    }
    let field = UnitField {
        component: gw_mechanics::LoadComponent::AxialForce,
        quantity: TensorQuantity::Stress,
        values: vec![[1.0, 0.0, 0.0, 0.0, 0.0, 0.0]; points_m.len()],
    };
    let mesh = RawMesh { points_m, cells };
    let surface = SurfaceField::new(&mesh, vec![field], ReferenceAxis::X).unwrap();
    gw_mechanics::Member::ImportedField(ImportedSurface {
        material: gw_mechanics::library_material("carbon_steel")
            .unwrap()
            .material(),
        reference_axis: ReferenceAxis::X,
        loads: Vec::new(),
        mesh_file: None,
        field: FieldState::Loaded(std::sync::Arc::new(surface)),
        read_notes: Vec::new(),
    })
}

/// The total length of the solid edge lines (0.9 pt, black) that run along the rings, points.
fn ring_lines_pt(ops: &[Op], rings: &[Vec<[f32; 2]>]) -> f64 {
    let near_ring = |p: [f32; 2]| {
        rings.iter().any(|r| {
            (0..r.len()).any(|i| {
                let (a, b) = (r[i], r[(i + 1) % r.len()]);
                let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
                let t = (((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / (dx * dx + dy * dy))
                    .clamp(0.0, 1.0);
                (a[0] + t * dx - p[0]).hypot(a[1] + t * dy - p[1]) < 0.1
            })
        })
    };
    ops.iter()
        .filter_map(|op| match op {
            Op::Line {
                x1,
                y1,
                x2,
                y2,
                width,
                grey: 0,
            } if *width == 0.9 && near_ring([*x1, *y1]) && near_ring([*x2, *y2]) => {
                Some(f64::from((x2 - x1).hypot(y2 - y1)))
            }
            _ => None,
        })
        .sum()
}

/// Whether a point lies inside the box round `ring`, `inset` points in from its sides.
fn inside_box_of(ring: &[[f32; 2]], inset: f32) -> impl Fn([f32; 2]) -> bool {
    let (lo, hi) = ring
        .iter()
        .fold(([f32::MAX; 2], [f32::MIN; 2]), |(lo, hi), p| {
            (
                [lo[0].min(p[0]), lo[1].min(p[1])],
                [hi[0].max(p[0]), hi[1].max(p[1])],
            )
        });
    move |p| {
        (lo[0] + inset..hi[0] - inset).contains(&p[0])
            && (lo[1] + inset..hi[1] - inset).contains(&p[1])
    }
}

/// The middle of every dash of an area to prepare (grey 130 lines).
fn dash_middles(ops: &[Op]) -> Vec<[f32; 2]> {
    ops.iter()
        .filter_map(|op| match op {
            Op::Line {
                x1,
                y1,
                x2,
                y2,
                grey: 130,
                ..
            } => Some([(x1 + x2) / 2.0, (y1 + y2) / 2.0]),
            _ => None,
        })
        .collect()
}

#[test]
fn an_imported_face_is_drawn_by_its_own_outline_with_its_hole_open() {
    let mut project = crate::demo::demo_project();
    let mut part = project.parts[0].clone();
    part.member = holed_plate();
    let gw_mechanics::Member::ImportedField(m) = &part.member else {
        unreachable!()
    };
    // One gauge on the top face, 3 mm right of the slot.
    let at = m
        .surface()
        .unwrap()
        .point_at([0.037, 0.019, 0.003], 1e-6)
        .unwrap();
    part.gauges.truncate(1);
    part.gauges[0].position = at;
    part.gauges[0].angle_rad = 0.0;
    project.parts = vec![part.clone()];
    let placed = project.placed_gauges(&part);
    let mut w = writer();
    draw(&mut w, &part, &placed);
    let ops = &w.pages[0];
    // No shaded bounding rectangle: the face is a region of rings.
    assert!(
        !ops.iter().any(|op| matches!(
            op,
            Op::Rect {
                fill: Some(238),
                ..
            }
        )),
        "the bounding rectangle is shaded"
    );
    let rings = ops
        .iter()
        .find_map(|op| match op {
            Op::Region { rings, fill: 238 } => Some(rings.clone()),
            _ => None,
        })
        .expect("the face is shaded by its outline");
    // At the stated scale, the slot is 10 × 6 mm and the whole face (drawn in one window)
    // 60 × 40 mm: the shaded area is their difference.
    let pt_per_m = stated_ratio(&w) * 72.0 / 0.0254;
    let mut areas_mm2: Vec<f64> = rings
        .iter()
        .map(|r| ring_area(r) / (pt_per_m * pt_per_m) * 1e6)
        .collect();
    areas_mm2.sort_by(f64::total_cmp);
    assert_eq!(areas_mm2.len(), 2, "{areas_mm2:?}");
    assert!((areas_mm2[0] - 60.0).abs() < 0.5, "{areas_mm2:?}");
    assert!((areas_mm2[1] - 2400.0).abs() < 10.0, "{areas_mm2:?}");
    // Every side of both rings is drawn as an edge line: 2 × (60 + 40) mm round the strap
    // and 2 × (10 + 6) mm round the slot.
    let edge_mm = ring_lines_pt(ops, &rings) / pt_per_m * 1e3;
    assert!((edge_mm - 232.0).abs() < 0.5, "edges drawn: {edge_mm} mm");
    // The area to prepare round the gauge (10 mm all round) reaches over the slot, but none of
    // its dashes lie in it.
    let slot = rings
        .iter()
        .min_by(|a, b| ring_area(a).total_cmp(&ring_area(b)))
        .unwrap();
    let in_slot = inside_box_of(slot, 0.5);
    let dashes = dash_middles(ops);
    assert!(dashes.len() > 20, "the area to prepare is drawn");
    assert!(
        !dashes.iter().any(|&p| in_slot(p)),
        "a dash of the area to prepare lies in the slot"
    );
    let page_problems = problems(ops, w.width, w.height);
    assert!(page_problems.is_empty(), "{page_problems:#?}");
}
