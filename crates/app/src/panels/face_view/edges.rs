//! What lies round the face: a band beyond each edge naming the neighbouring face or end, the
//! clamp hatched, pins at pinned ends, load points with an arrow, the datum, and on a plate the
//! hole and the remote stresses.

use std::f32::consts::FRAC_PI_2;

use egui::{Color32, FontId, Painter, Rect, Shape, Stroke, pos2, vec2};
use gw_mechanics::{LoadComponent, Member};
use gw_plan::drawing::face_layout::{
    EndKind, LabelPlacer, Neighbour, candidates_around, face_edges, force_along_s, force_direction,
    is_beside,
};

use super::{BAND, Scene, View, to_rect, to_screen_rect};
use crate::panels::fields::Digits;
use crate::units::{Quantity, Units};

/// Space between a label and what it names, points.
const LABEL_GAP: f32 = 4.0;

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

/// The bands, end symbols, load points and datum, with their labels placed clear of what
/// the placer already holds (the gauges and their handles).
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
    if scene.outline.is_empty() {
        painter.rect_stroke(face, 0.0, Stroke::new(1.0, text), egui::StrokeKind::Outside);
    } else {
        outline_ui(ui, painter, scene, view);
    }
    if let Member::PlateWithHole(p) = &scene.part.member {
        hole_ui(ui, painter, view, p.hole_diameter_m / 2.0);
    }
    load_points_ui(ui, painter, scene, view, placer);
    datum_label_ui(painter, scene, view, placer);
    for (side, neighbour) in [
        (Side::Top, edges.s_max),
        (Side::Bottom, edges.s_min),
        (Side::Left, edges.x_min),
        (Side::Right, edges.x_max),
    ] {
        band_ui(ui, painter, scene, view, placer, side, neighbour);
    }
}

/// An imported face's own outline (its holes and notches included) over a faint frame of its
/// bounds, where the bands beyond its sides stand.
fn outline_ui(ui: &egui::Ui, painter: &Painter, scene: &Scene, view: View) {
    let face = view.face_rect(&scene.bounds);
    let weak = ui.visuals().weak_text_color().gamma_multiply(0.5);
    painter.rect_stroke(face, 0.0, Stroke::new(0.5, weak), egui::StrokeKind::Outside);
    let stroke = Stroke::new(1.5, ui.visuals().text_color());
    let shown = view.area.expand(2.0);
    for e in scene.outline.iter() {
        let (a, b) = (view.pos(e.from[0], e.from[1]), view.pos(e.to[0], e.to[1]));
        if shown.intersects(Rect::from_two_pos(a, b)) {
            painter.line_segment([a, b], stroke);
        }
    }
}

/// What must stay visible over the gauges (an enlarged gauge is drawn larger than the room it
/// has): the edge of the hole and the datum mark.
pub(super) fn over_gauges_ui(ui: &egui::Ui, painter: &Painter, scene: &Scene, view: View) {
    if let Member::PlateWithHole(p) = &scene.part.member {
        let r = (p.hole_diameter_m / 2.0) as f32 * view.scale();
        let c = view.pos(0.0, 0.0);
        painter.circle_stroke(c, r, Stroke::new(1.5, ui.visuals().text_color()));
    }
    let (dx, ds) = scene.part.datum_m;
    let c = view.pos(dx, scene.drawn_s(ds));
    if view.area.expand(8.0).contains(c) {
        // A pale halo under the ink, so the mark reads over a dark hole or a gauge's grid.
        let halo = Stroke::new(3.5, Color32::from_rgba_unmultiplied(250, 250, 246, 200));
        for stroke in [halo, Stroke::new(1.5, INK)] {
            painter.circle_stroke(c, 5.0, stroke);
            painter.line_segment([c - vec2(8.0, 0.0), c + vec2(8.0, 0.0)], stroke);
            painter.line_segment([c - vec2(0.0, 8.0), c + vec2(0.0, 8.0)], stroke);
        }
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
        Neighbour::PlateEdge { .. } => {
            for arrow in stress_arrows_ui(painter, scene, visible, side, ui.visuals().text_color())
            {
                placer.block(to_screen_rect(arrow));
            }
        }
        _ => {}
    }
    let name = band_text(scene, side, neighbour);
    ui.interact(
        visible,
        ui.scope_id().with(("band", side as u8)),
        egui::Sense::hover(),
    )
    .on_hover_text(format!("{name}. {}", neighbour.explanation()));
    band_label_ui(
        ui,
        painter,
        visible,
        side,
        &[&name, neighbour.short_label()],
        placer,
    );
}

/// The band's words: the neighbour, and on a plate the remote stress applied there.
fn band_text(scene: &Scene, side: Side, neighbour: Neighbour) -> String {
    let length = |x: f64| scene.length(x);
    let name = neighbour.label(&length);
    if !matches!(neighbour, Neighbour::PlateEdge { .. }) {
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
/// moved along the band when the middle is taken; the first of `names` that fits inside the
/// band's visible length, left out when none fits (the band's tooltip still names it).
fn band_label_ui(
    ui: &egui::Ui,
    painter: &Painter,
    visible: Rect,
    side: Side,
    names: &[&str],
    placer: &mut LabelPlacer,
) {
    let colour = ui.visuals().strong_text_color();
    let vertical = matches!(side, Side::Left | Side::Right);
    let room = if vertical {
        visible.height()
    } else {
        visible.width()
    } - 6.0;
    for name in names {
        let galley = painter.layout_no_wrap((*name).to_owned(), label_font(), colour);
        let (w, h) = (galley.size().x, galley.size().y);
        if w > room {
            continue;
        }
        let size = if vertical { [h, w] } else { [w, h] };
        let c = visible.center();
        let candidates: Vec<[f32; 2]> = [0.5, 0.25, 0.75, 0.15, 0.85]
            .iter()
            .map(|f| {
                if vertical {
                    let y = visible.top() + visible.height() * f - w / 2.0;
                    [
                        c.x - h / 2.0,
                        y.clamp(visible.top() + 3.0, visible.bottom() - 3.0 - w),
                    ]
                } else {
                    let x = visible.left() + visible.width() * f - w / 2.0;
                    [
                        x.clamp(visible.left() + 3.0, visible.right() - 3.0 - w),
                        c.y - h / 2.0,
                    ]
                }
            })
            .collect();
        let Some(area) = placer.place(size, &candidates) else {
            continue;
        };
        let area = to_rect(&area);
        if vertical {
            // Read from bottom to top, turned a quarter to the left.
            painter.add(
                egui::epaint::TextShape::new(area.left_bottom(), galley, colour)
                    .with_angle(-FRAC_PI_2),
            );
        } else {
            painter.galley(area.min, galley, colour);
        }
        return;
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
/// compression. Returns where they are drawn.
fn stress_arrows_ui(
    painter: &Painter,
    scene: &Scene,
    band: Rect,
    side: Side,
    colour: Color32,
) -> Vec<Rect> {
    let component = match side {
        Side::Left | Side::Right => LoadComponent::RemoteStressX,
        _ => LoadComponent::RemoteStressY,
    };
    let sigma = scene.loads[component];
    if sigma == 0.0 || !sigma.is_finite() {
        return Vec::new();
    }
    let outward = match side {
        Side::Left => vec2(-1.0, 0.0),
        Side::Right => vec2(1.0, 0.0),
        Side::Top => vec2(0.0, -1.0),
        Side::Bottom => vec2(0.0, 1.0),
    };
    let dir = if sigma > 0.0 { outward } else { -outward };
    let stroke = Stroke::new(1.5, colour);
    [0.1, 0.9]
        .into_iter()
        .map(|f| {
            let c = band.lerp_inside(vec2(f, f));
            let c = match side {
                Side::Left | Side::Right => pos2(band.center().x, c.y),
                _ => pos2(c.x, band.center().y),
            };
            painter.arrow(c - dir * 7.0, dir * 14.0, stroke);
            Rect::from_center_size(c, vec2(16.0, 16.0))
        })
        .collect()
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

/// Load points of a beam: a dashed line across the face at each, an arrow the way the force
/// acts where it lies in the plane of the face, and a label with its value and direction.
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
    let vertical = scene.loads[LoadComponent::VerticalForce];
    let lateral = scene.loads[LoadComponent::LateralForce];
    let ink = ui.visuals().strong_text_color();
    for (k, lp) in beam.load_points.iter().enumerate() {
        let x = view.pos(lp.position_m, 0.0).x;
        if x < view.area.left() - 1.0 || x > view.area.right() + 1.0 {
            continue;
        }
        let line = [pos2(x, face.top()), pos2(x, face.bottom())];
        painter.extend(Shape::dashed_line(&line, Stroke::new(1.0, INK), 6.0, 4.0));
        let along_s = force_along_s(scene.face, vertical * lp.multiple, lateral * lp.multiple);
        // Onto the top edge pushing down the screen (−s), or onto the bottom edge pushing up.
        let (tip, dir) = match along_s {
            Some(f) if f > 0.0 => (pos2(x, face.bottom()), -1.0),
            _ => (pos2(x, face.top()), 1.0),
        };
        let shows_way = along_s.is_some_and(|f| f != 0.0 && f.is_finite());
        let stroke = Stroke::new(2.0, ink);
        let tail = tip - vec2(0.0, dir * BAND);
        if shows_way {
            painter.arrow(tail, vec2(0.0, dir * (BAND - 1.0)), stroke);
        } else {
            painter.line_segment([tail, tip], Stroke::new(1.0, ink));
        }
        let mark = Rect::from_two_pos(tail - vec2(5.0, 0.0), tip + vec2(5.0, 0.0));
        placer.block(to_screen_rect(mark));
        let name = load_point_text(scene, beam.load_points.len(), k, lp.multiple);
        let anchor = Rect::from_center_size(tip + vec2(0.0, dir * 6.0), vec2(2.0, 10.0));
        pill_label_ui(painter, anchor, &name, placer, INK);
    }
}

/// "load point: vertical force 6.000 kN, down": each force the point carries in this load
/// case, with the way it acts.
fn load_point_text(scene: &Scene, count: usize, k: usize, multiple: f64) -> String {
    let mut name = if count > 1 {
        format!("load point {}", k + 1)
    } else {
        "load point".to_owned()
    };
    if (multiple - 1.0).abs() > 1e-9 {
        let multiple = Digits::Places(0, 3).text(multiple);
        name.push_str(&format!(" (×{multiple})"));
    }
    let forces: Vec<String> = [LoadComponent::VerticalForce, LoadComponent::LateralForce]
        .into_iter()
        .filter_map(|c| {
            let value = scene.loads[c] * multiple;
            let way = force_direction(c, value)?;
            let shown = force_text(scene, value.abs());
            Some(format!("{} {shown}, {way}", c.name()))
        })
        .collect();
    if forces.is_empty() {
        format!("{name}: no force in this case")
    } else {
        format!("{name}: {}", forces.join("; "))
    }
}

/// A force for a label: kN from 1 kN up in SI, else the unit system's own.
fn force_text(scene: &Scene, force_n: f64) -> String {
    match scene.units {
        Units::Si if force_n >= 1e3 => format!("{:.2} kN", force_n / 1e3),
        units => units.format(Quantity::Force, force_n),
    }
}

/// The datum's label beside its mark (the mark is drawn over the gauges).
fn datum_label_ui(painter: &Painter, scene: &Scene, view: View, placer: &mut LabelPlacer) {
    let (dx, ds) = scene.part.datum_m;
    let c = view.pos(dx, scene.drawn_s(ds));
    if !view.area.expand(8.0).contains(c) {
        return;
    }
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
    let anchor_rect = to_screen_rect(anchor);
    let placed = placer.place(
        [size.x, size.y],
        &candidates_around(&anchor_rect, [size.x, size.y], LABEL_GAP),
    )?;
    let area = to_rect(&placed);
    if !is_beside(&anchor_rect, &placed, LABEL_GAP) {
        // Placed farther out: a leader line says what it names.
        let from = anchor.clamp(area.center());
        let to = area.clamp(anchor.center());
        painter.line_segment([from, to], Stroke::new(1.0, colour.gamma_multiply(0.8)));
    }
    painter.rect_filled(
        area,
        3.0,
        Color32::from_rgba_unmultiplied(250, 250, 246, 225),
    );
    painter.galley(area.min + vec2(3.0, 1.0), galley, colour);
    Some(area)
}
