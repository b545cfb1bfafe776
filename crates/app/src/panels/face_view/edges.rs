//! What lies round the face: a band beyond each edge naming the neighbouring face or end, the
//! clamp hatched, pins at pinned ends, load points with an arrow, the datum, and on a plate the
//! hole and the remote stresses.

use std::f32::consts::FRAC_PI_2;

use egui::{Color32, FontId, Painter, Rect, Shape, Stroke, pos2, vec2};
use gw_mechanics::{LoadComponent, Member};
use gw_plan::drawing::face_layout::{
    EndKind, LabelPlacer, Neighbour, candidates_around, face_edges,
};

use super::{BAND, Scene, View, to_rect, to_screen_rect};

/// Ink for symbols drawn over the map.
const INK: Color32 = Color32::from_rgb(25, 25, 30);

fn label_font() -> FontId {
    FontId::proportional(11.5)
}

/// Which edge of the drawn face.
#[derive(Debug, Clone, Copy, PartialEq)]
enum Side {
    Top,
    Bottom,
    Left,
    Right,
}

/// The bands, end symbols, load points and datum.
pub(super) fn edges_ui(
    ui: &egui::Ui,
    painter: &Painter,
    scene: &Scene,
    view: View,
    placer: &mut LabelPlacer,
) {
    let face = view.face_rect(&scene.bounds);
    let edges = face_edges(&scene.part.member, scene.face, scene.seam_deg);
    let text = ui.visuals().text_color();
    painter.rect_stroke(face, 0.0, Stroke::new(1.0, text), egui::StrokeKind::Outside);
    if let Member::PlateWithHole(p) = &scene.part.member {
        hole_ui(ui, painter, view, p.hole_diameter_m / 2.0);
    }
    load_points_ui(ui, painter, scene, view, placer);
    datum_ui(painter, scene, view, placer);
    for (side, neighbour) in [
        (Side::Top, edges.s_max),
        (Side::Bottom, edges.s_min),
        (Side::Left, edges.x_min),
        (Side::Right, edges.x_max),
    ] {
        band_ui(ui, painter, scene, view, placer, side, neighbour);
    }
}

/// The band beyond one edge: its fill or hatching, its symbols and its name.
fn band_ui(
    ui: &egui::Ui,
    painter: &Painter,
    scene: &Scene,
    view: View,
    placer: &mut LabelPlacer,
    side: Side,
    neighbour: Neighbour,
) {
    let face = view.face_rect(&scene.bounds);
    let band = match side {
        Side::Top => Rect::from_min_max(face.left_top() - vec2(0.0, BAND), face.right_top()),
        Side::Bottom => {
            Rect::from_min_max(face.left_bottom(), face.right_bottom() + vec2(0.0, BAND))
        }
        Side::Left => Rect::from_min_max(face.left_top() - vec2(BAND, 0.0), face.left_bottom()),
        Side::Right => Rect::from_min_max(face.right_top(), face.right_bottom() + vec2(BAND, 0.0)),
    };
    let visible = band.intersect(view.area);
    if !visible.is_positive() {
        return;
    }
    let fill = ui.visuals().widgets.inactive.bg_fill;
    painter.rect_filled(band, 0.0, fill);
    let weak = ui.visuals().weak_text_color();
    match neighbour {
        Neighbour::End {
            kind: EndKind::Clamped,
            ..
        } => hatch_ui(painter, band.intersect(view.area), weak),
        Neighbour::End {
            kind: EndKind::Pinned,
            ..
        } => pin_ui(painter, visible, side, ui.visuals().text_color()),
        Neighbour::End {
            kind: EndKind::ClosedVesselEnd,
            ..
        } => {
            let edge = if side == Side::Left {
                face.left()
            } else {
                face.right()
            };
            painter.line_segment(
                [pos2(edge, visible.top()), pos2(edge, visible.bottom())],
                Stroke::new(3.0, ui.visuals().text_color()),
            );
        }
        Neighbour::PlateEdge => {
            stress_arrows_ui(painter, scene, visible, side, ui.visuals().text_color())
        }
        _ => {}
    }
    let name = band_text(scene, side, neighbour);
    band_label_ui(ui, painter, visible, side, &name, placer);
}

/// The band's words: the neighbour, and on a plate the remote stress applied there.
fn band_text(scene: &Scene, side: Side, neighbour: Neighbour) -> String {
    let length = |x: f64| scene.length(x);
    let name = neighbour.label(&length);
    if neighbour != Neighbour::PlateEdge {
        return name;
    }
    let (component, symbol) = match side {
        Side::Left | Side::Right => (LoadComponent::RemoteStressX, "σx"),
        Side::Top | Side::Bottom => (LoadComponent::RemoteStressY, "σy"),
    };
    let sigma = scene.loads[component];
    let tau = scene.loads[LoadComponent::RemoteShearXY];
    let mut text = format!(
        "{name}, remote {symbol} {}",
        scene.units.format_stress(sigma)
    );
    if tau != 0.0 && side == Side::Top {
        text.push_str(&format!(", τxy {}", scene.units.format_stress(tau)));
    }
    text
}

/// The band's name, centred on the visible part of the band (turned along the side bands),
/// moved along the band when the middle is taken, left out when it fits nowhere.
fn band_label_ui(
    ui: &egui::Ui,
    painter: &Painter,
    visible: Rect,
    side: Side,
    name: &str,
    placer: &mut LabelPlacer,
) {
    let colour = ui.visuals().strong_text_color();
    let galley = painter.layout_no_wrap(name.to_owned(), label_font(), colour);
    let (w, h) = (galley.size().x, galley.size().y);
    let vertical = matches!(side, Side::Left | Side::Right);
    let size = if vertical { [h, w] } else { [w, h] };
    let c = visible.center();
    let candidates: Vec<[f32; 2]> = if vertical {
        [0.5, 0.25, 0.75]
            .iter()
            .map(|f| {
                [
                    c.x - h / 2.0,
                    visible.top() + visible.height() * f - w / 2.0,
                ]
            })
            .collect()
    } else {
        [0.5, 0.2, 0.8]
            .iter()
            .map(|f| {
                [
                    visible.left() + visible.width() * f - w / 2.0,
                    c.y - h / 2.0,
                ]
            })
            .collect()
    };
    let Some(area) = placer.place(size, &candidates) else {
        return;
    };
    let area = to_rect(&area);
    if vertical {
        // Read from bottom to top, turned a quarter to the left.
        painter.add(
            egui::epaint::TextShape::new(area.left_bottom(), galley, colour).with_angle(-FRAC_PI_2),
        );
    } else {
        painter.galley(area.min, galley, colour);
    }
}

/// Diagonal hatching: the clamp.
fn hatch_ui(painter: &Painter, band: Rect, colour: Color32) {
    if !band.is_positive() {
        return;
    }
    let painter = painter.with_clip_rect(band);
    let stroke = Stroke::new(1.0, colour);
    let mut x = band.left() - band.height();
    while x < band.right() {
        painter.line_segment(
            [pos2(x, band.bottom()), pos2(x + band.height(), band.top())],
            stroke,
        );
        x += 6.0;
    }
}

/// A pin under the edge: a triangle pointing at the face with its base line.
fn pin_ui(painter: &Painter, band: Rect, side: Side, colour: Color32) {
    let s = 7.0;
    for f in [0.15, 0.85] {
        let (tip, base_dir) = match side {
            Side::Left => (
                pos2(band.right(), band.top() + band.height() * f),
                vec2(-1.0, 0.0),
            ),
            _ => (
                pos2(band.left(), band.top() + band.height() * f),
                vec2(1.0, 0.0),
            ),
        };
        let across = vec2(0.0, 1.0);
        let base = tip + base_dir * (2.0 * s);
        let pts = vec![tip, base + across * s, base - across * s];
        painter.add(Shape::convex_polygon(
            pts,
            Color32::TRANSPARENT,
            Stroke::new(1.5, colour),
        ));
    }
}

/// Arrows of the remote stress on a plate edge: out of the plate for tension, into it for
/// compression.
fn stress_arrows_ui(painter: &Painter, scene: &Scene, band: Rect, side: Side, colour: Color32) {
    let component = match side {
        Side::Left | Side::Right => LoadComponent::RemoteStressX,
        _ => LoadComponent::RemoteStressY,
    };
    let sigma = scene.loads[component];
    if sigma == 0.0 || !sigma.is_finite() {
        return;
    }
    let outward = match side {
        Side::Left => vec2(-1.0, 0.0),
        Side::Right => vec2(1.0, 0.0),
        Side::Top => vec2(0.0, -1.0),
        Side::Bottom => vec2(0.0, 1.0),
    };
    let dir = if sigma > 0.0 { outward } else { -outward };
    let stroke = Stroke::new(1.5, colour);
    for f in [0.1, 0.9] {
        let c = band.lerp_inside(vec2(f, f));
        let c = match side {
            Side::Left | Side::Right => pos2(band.center().x, c.y),
            _ => pos2(c.x, band.center().y),
        };
        painter.arrow(c - dir * 7.0, dir * 14.0, stroke);
    }
}

/// The hole of a plate: left empty, outlined.
fn hole_ui(ui: &egui::Ui, painter: &Painter, view: View, radius_m: f64) {
    let c = view.pos(0.0, 0.0);
    let r = radius_m as f32 * view.scale();
    painter.circle(
        c,
        r,
        ui.visuals().extreme_bg_color,
        Stroke::new(1.5, ui.visuals().text_color()),
    );
}

/// Load points of a beam: a dashed line across the face at each and an arrow onto its top
/// edge, with a label.
fn load_points_ui(
    ui: &egui::Ui,
    painter: &Painter,
    scene: &Scene,
    view: View,
    placer: &mut LabelPlacer,
) {
    let Member::Beam(beam) = &scene.part.member else {
        return;
    };
    let face = view.face_rect(&scene.bounds);
    let stroke = Stroke::new(1.5, INK);
    for (k, lp) in beam.load_points.iter().enumerate() {
        let x = view.pos(lp.position_m, 0.0).x;
        if x < view.area.left() - 1.0 || x > view.area.right() + 1.0 {
            continue;
        }
        let line = [pos2(x, face.top()), pos2(x, face.bottom())];
        painter.extend(Shape::dashed_line(&line, Stroke::new(1.0, INK), 6.0, 4.0));
        let tip = pos2(x, face.top());
        painter.arrow(
            tip - vec2(0.0, BAND),
            vec2(0.0, BAND - 1.0),
            Stroke::new(2.0, ui.visuals().strong_text_color()),
        );
        let arrow = Rect::from_min_max(tip - vec2(5.0, BAND), tip + vec2(5.0, 0.0));
        placer.block(to_screen_rect(arrow));
        let mut name = if beam.load_points.len() > 1 {
            format!("load point {}", k + 1)
        } else {
            "load point".to_owned()
        };
        if (lp.multiple - 1.0).abs() > 1e-9 {
            name.push_str(&format!(" (×{})", lp.multiple));
        }
        let anchor = Rect::from_min_max(tip, tip + vec2(1.0, 6.0));
        pill_label_ui(painter, anchor, &name, placer, stroke.color);
    }
}

/// The datum: a cross at its point and a dashed line at its x.
fn datum_ui(painter: &Painter, scene: &Scene, view: View, placer: &mut LabelPlacer) {
    let (dx, ds) = scene.part.datum_m;
    let c = view.pos(dx, scene.drawn_s(ds));
    if !view.area.expand(8.0).contains(c) {
        return;
    }
    let stroke = Stroke::new(1.5, INK);
    painter.circle_stroke(c, 5.0, stroke);
    painter.line_segment([c - vec2(8.0, 0.0), c + vec2(8.0, 0.0)], stroke);
    painter.line_segment([c - vec2(0.0, 8.0), c + vec2(0.0, 8.0)], stroke);
    let mark = Rect::from_center_size(c, vec2(16.0, 16.0));
    placer.block(to_screen_rect(mark));
    pill_label_ui(painter, mark, "datum", placer, INK);
}

/// A small label with a pale background beside `anchor`, at the first free place.
pub(super) fn pill_label_ui(
    painter: &Painter,
    anchor: Rect,
    text: &str,
    placer: &mut LabelPlacer,
    colour: Color32,
) -> Option<Rect> {
    let galley = painter.layout_no_wrap(text.to_owned(), label_font(), colour);
    let size = galley.size() + vec2(6.0, 2.0);
    let area = placer.place(
        [size.x, size.y],
        &candidates_around(&to_screen_rect(anchor), [size.x, size.y], 4.0),
    )?;
    let area = to_rect(&area);
    painter.rect_filled(
        area,
        3.0,
        Color32::from_rgba_unmultiplied(250, 250, 246, 225),
    );
    painter.galley(area.min + vec2(3.0, 1.0), galley, colour);
    Some(area)
}
