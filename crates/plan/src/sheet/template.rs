//! The 1:1 marking template of a face: the surroundings of its gauges at true size, to print
//! at 100 % and lay on the part. A check bar on every page (50 mm, or 2 in in US customary
//! units) proves the print's scale.

use gw_bridge::PlacedGauge;
use gw_mechanics::Face;

use super::face_drawings::piece::{EDGE_ROOM, PIECE_ROOM, draw_piece, piece_setup};
use super::face_drawings::plan::{FaceSetup, PT_PER_M, Scale};
use super::face_drawings::{LABEL, face_title};
use super::layout::{Area, MARGIN};
use super::writer::Writer;
use crate::document::Part;
use crate::units::Units;

/// The check bar: its length in metres and in words. 50 mm, or 2 in (50.8 mm, 1 in = 25.4 mm
/// exactly, NIST SP 811 Appendix B) for a technician with an inch rule.
fn check_bar_length(units: Units) -> (f64, &'static str) {
    match units {
        Units::Si => (0.050, "50 mm"),
        Units::UsCustomary => (2.0 * 0.0254, "2 in"),
    }
}

/// Face shown round each gauge on the template, points (at 1:1, 10.6 mm).
const PAD_PT: f64 = 30.0;

/// Starts a new page and draws the 1:1 marking template of `face` of `part` with the gauges of
/// `placed` that lie on it; draws nothing when none does.
pub(crate) fn draw(w: &mut Writer, part: &Part, placed: &[PlacedGauge], face: Face) {
    let Some(extent) = part.member.faces().into_iter().find(|e| e.face == face) else {
        return;
    };
    let Some(setup) = FaceSetup::new(&part.member, extent, placed, part.datum_m) else {
        return;
    };
    w.new_page();
    let title = format!(
        "Marking template at 1:1: {}, {}",
        part.name,
        setup.face.name()
    );
    w.heading(&title);
    let body = w.body();
    let max_w = w.column() - 2.0 * 20.0;
    let max_h = body.y1 - body.y0 - 200.0;
    let (x, s) = setup.axes(Scale::FULL, PAD_PT, (max_w, max_h));
    let pieces: Vec<_> = x
        .windows
        .iter()
        .flat_map(|&xw| s.windows.iter().map(move |&sw| (xw, sw)))
        .filter_map(|(xw, sw)| piece_setup(&setup, xw, sw).map(|p| (p, xw, sw)))
        .collect();
    let whole = x.windows == [setup.bounds.x_m] && s.windows == [setup.bounds.s_m];
    instructions(w, &setup, whole, pieces.len());
    check_bar(w);
    let n = pieces.len();
    let mut missing = Vec::new();
    for (k, (piece, xw, sw)) in pieces.iter().enumerate() {
        let h = ((sw.1 - sw.0) * PT_PER_M) as f32 + PIECE_ROOM;
        if w.y + h > w.bottom() {
            // Every page says which part and face it is for.
            w.new_page();
            w.heading(&format!("{title} (continued)"));
            check_bar(w);
        }
        let (dx, ds) = setup.datum;
        let units = w.units;
        let mm1 = |v: f64| super::len(units, v);
        w.para(
            8.0,
            true,
            &format!(
                "Piece {} of {n}: x from {} to {}, s from {} to {}, measured from the datum.",
                k + 1,
                mm1(xw.0 - dx),
                mm1(xw.1 - dx),
                mm1(sw.0 - ds),
                mm1(sw.1 - ds)
            ),
        );
        let top = w.y + EDGE_ROOM;
        let bottom = top + ((sw.1 - sw.0) * PT_PER_M) as f32 + EDGE_ROOM;
        let bounds = Area::new(MARGIN, w.y, w.right(), bottom);
        missing.extend(draw_piece(
            w,
            piece,
            (*xw, *sw),
            (MARGIN + 20.0, top),
            bounds,
        ));
        w.y = bottom + 8.0;
    }
    if !missing.is_empty() {
        w.para(
            7.5,
            true,
            &format!("No room on the template for: {}.", missing.join("; ")),
        );
    }
}

/// What the template is and how to use it.
fn instructions(w: &mut Writer, setup: &FaceSetup, whole: bool, pieces: usize) {
    let (_, bar) = check_bar_length(w.units);
    w.para(
        8.5,
        true,
        &format!(
            "Print this page at 100 % (actual size: no fit-to-page, no shrinking) and measure \
             the {bar} check bar before use; if it is not {bar}, do not use the template."
        ),
    );
    let extent = match (whole, pieces) {
        (true, _) => "The whole face is shown.",
        (false, 1) => {
            "Only the region round the gauges is shown: mark each gauge's centre from the datum \
             with the dimensions of the face drawing, then lay the template on with its \
             cross-hairs over the marks (and its edges on the part's edges where they are drawn)."
        }
        _ => {
            "Only the surroundings of the gauges are shown, in pieces: mark each gauge's centre \
             from the datum with the dimensions of the face drawing, then lay each piece on with \
             its cross-hairs over the marks."
        }
    };
    w.para(
        8.0,
        false,
        &format!(
            "{}, {}. {extent} Cross-hairs run through each gauge's centre along x and s and out \
             past the piece's edges, to transfer onto the part; the grey pads are the solder \
             tabs, the bold figure beyond a grid's tabs on a gauge of two or more grids is the grid's \
             number (as the wiring diagrams and the records number them) and the arrow is the \
             gauge's reference direction.",
            face_title(setup.face),
            setup.view_words()
        ),
    );
}

/// The check bar with its label, at `w.y`.
fn check_bar(w: &mut Writer) {
    let (length_m, words) = check_bar_length(w.units);
    w.room(30.0);
    let y = w.y + 4.0;
    let len = (length_m * PT_PER_M) as f32;
    let x = MARGIN + 4.0;
    for end in [x, x + len] {
        w.line([end, y - 3.0], [end, y + 8.0], 0.6, 0);
    }
    w.rect(Area::new(x, y, x + len, y + 5.0), Some(0), 0.0);
    w.text_top(
        x + len + 8.0,
        y - 1.0,
        LABEL + 1.0,
        true,
        &format!("{words} check bar: measure it first"),
    );
    w.y = y + 18.0;
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::document::{PaperSize, Project};
    use crate::sheet::layout::{Op, problems};
    use crate::sheet::writer::Header;

    fn writer() -> Writer {
        Writer::new(
            PaperSize::A4,
            Header {
                title: "Templates".into(),
                details: "checked page by page".into(),
            },
        )
    }

    fn projects() -> Vec<Project> {
        vec![crate::demo::demo_project(), crate::gallery::model_gallery()]
    }

    /// The faces of `part` that carry gauges, and the gauges.
    fn gauged_faces(project: &Project, part: &Part) -> (Vec<Face>, Vec<PlacedGauge>) {
        let placed = project.placed_gauges(part);
        let mut faces: Vec<Face> = placed.iter().map(|g| g.position.face).collect();
        faces.dedup();
        faces.sort_by_key(|f| format!("{f:?}"));
        faces.dedup();
        (faces, placed)
    }

    #[test]
    fn every_template_of_the_demo_and_the_gallery_is_clean_and_on_pages_of_its_own() {
        let mut drawn = 0;
        for project in projects() {
            for part in &project.parts {
                let (faces, placed) = gauged_faces(&project, part);
                for face in faces {
                    let mut w = writer();
                    w.para(9.0, false, "Text before the template.");
                    draw(&mut w, part, &placed, face);
                    assert!(w.pages.len() >= 2, "{}: no new page", part.name);
                    for (i, page) in w.pages.iter().enumerate() {
                        let p = problems(page, w.width, w.height);
                        assert!(
                            p.is_empty(),
                            "{} {face:?}, page {}: {p:#?}",
                            part.name,
                            i + 1
                        );
                    }
                    let texts: Vec<&str> = w.pages[1..]
                        .iter()
                        .flatten()
                        .filter_map(|op| match op {
                            Op::Text { text, .. } => Some(text.as_str()),
                            _ => None,
                        })
                        .collect();
                    assert!(
                        !texts.iter().any(|t| t.starts_with("No room")),
                        "{texts:#?}"
                    );
                    for g in placed.iter().filter(|g| g.position.face == face) {
                        let id = format!("{} ", g.id);
                        assert!(texts.iter().any(|t| t.starts_with(&id)), "{} missing", g.id);
                    }
                    drawn += 1;
                }
            }
        }
        assert!(drawn >= 15, "{drawn}");
    }

    #[test]
    fn every_template_page_names_its_part_and_face_and_numbers_every_grid() {
        let (mut continued, mut numbered) = (0, 0);
        for project in projects() {
            for part in &project.parts {
                let (faces, placed) = gauged_faces(&project, part);
                for face in faces {
                    let mut w = writer();
                    draw(&mut w, part, &placed, face);
                    let title = format!("Marking template at 1:1: {}, {}", part.name, face.name());
                    let mut figures = [0usize; 4];
                    for (i, page) in w.pages.iter().enumerate().skip(1) {
                        let texts: Vec<(&str, bool, f32)> = page
                            .iter()
                            .filter_map(|op| match op {
                                Op::Text {
                                    text, bold, size, ..
                                } => Some((text.as_str(), *bold, *size)),
                                _ => None,
                            })
                            .collect();
                        // The heading may wrap: its first line starts the page's text.
                        let first = texts.first().map_or("", |t| t.0);
                        assert!(
                            !first.is_empty()
                                && (first.starts_with(&title)
                                    || title.starts_with(first.trim_end())),
                            "{} {face:?}, page {}: \"{first}\"",
                            part.name,
                            i + 1
                        );
                        continued += usize::from(texts.iter().any(|t| t.0.contains("(continued)")));
                        for (text, bold, size) in &texts {
                            assert!(*size >= 7.0, "\"{text}\" at {size} pt");
                            if let Ok(k) = text.parse::<usize>()
                                && *bold
                                && k < figures.len()
                            {
                                figures[k] += 1;
                            }
                        }
                    }
                    let on_face: Vec<_> =
                        placed.iter().filter(|g| g.position.face == face).collect();
                    for (k, got) in figures.iter().enumerate().skip(1) {
                        let want = on_face
                            .iter()
                            .filter(|g| g.element_count() >= k.max(2))
                            .count();
                        assert!(
                            *got >= want,
                            "{} {face:?}: grid {k} on {got} of {want}",
                            part.name
                        );
                    }
                    numbered += on_face.iter().filter(|g| g.element_count() > 1).count();
                }
            }
        }
        // The demo's drive shaft template runs over two pages; pairs and rosettes are drawn.
        assert!(continued >= 1 && numbered >= 4, "{continued} {numbered}");
    }

    #[test]
    fn the_check_bar_is_fifty_millimetres_and_the_face_is_true_size() {
        let project = crate::demo::demo_project();
        let part = &project.parts[0];
        let mut w = writer();
        draw(&mut w, part, &project.placed_gauges(part), Face::Top);
        // 50 mm at 72 pt to the inch of 25.4 mm: 141.73 pt.
        let bar = w.pages[1]
            .iter()
            .find_map(|op| match op {
                Op::Rect {
                    w, fill: Some(0), ..
                } => Some(*w),
                _ => None,
            })
            .expect("a check bar");
        assert!((bar - 141.73).abs() < 0.01, "{bar}");
        // The reaction arm's top face is 30 mm wide: 85.04 pt across at 1:1.
        let face = w.pages[1]
            .iter()
            .find_map(|op| match op {
                Op::Rect {
                    h, fill: Some(238), ..
                } => Some(*h),
                _ => None,
            })
            .expect("the face is shaded");
        assert!((face - 85.04).abs() < 0.01, "{face}");
    }

    #[test]
    fn a_face_without_gauges_draws_nothing() {
        let project = crate::demo::demo_project();
        let part = &project.parts[0];
        let mut w = writer();
        draw(&mut w, part, &project.placed_gauges(part), Face::Round);
        assert_eq!(w.pages.len(), 1);
        assert!(w.pages[0].is_empty());
    }
}
