//! The layout canvas: the selected face drawn to scale (round faces unrolled: axial position
//! across, arc length up) with a live colour map, a legend, the value under the cursor, and
//! the gauges drawn to scale. Click selects, drag moves, buttons add and turn gauges.

use egui::{Color32, Pos2, Rect, Sense, Stroke, TextureHandle, Vec2, pos2, vec2};
use gw_bridge::GaugePattern;
use gw_mechanics::{Face, SurfacePoint, surface_map};

use super::map::MapSettings;
use super::palette;
use crate::command::Command;
use crate::state::{DocumentState, Selection};
use crate::units::Quantity;

/// The colour-map texture with what it was made for: evaluation count, face, quantity,
/// selection, and the value range.
type MapTexture = (u64, Face, MapSettings, Selection, TextureHandle, (f64, f64));

/// View state of the face view.
pub struct FaceView {
    face: Option<Face>,
    zoom: f32,
    pattern: GaugePattern,
    texture: Option<MapTexture>,
    drag: Option<(usize, SurfacePoint)>,
    /// The gauge selected when the face was last chosen: selecting another gauge shows its face.
    followed: Option<(usize, usize)>,
}

impl Default for FaceView {
    fn default() -> Self {
        Self {
            face: None,
            zoom: 1.0,
            pattern: GaugePattern::SingleGrid,
            texture: None,
            drag: None,
            followed: None,
        }
    }
}

const MAP_NX: usize = 192;
const MAP_NS: usize = 96;

impl FaceView {
    /// Shows `face` next time the view draws.
    pub fn show_face(&mut self, face: Face) {
        self.face = Some(face);
    }

    /// Draws the face view.
    pub fn face_ui(
        &mut self,
        ui: &mut egui::Ui,
        doc: &DocumentState,
        quantity: &mut MapSettings,
        out: &mut Vec<Command>,
    ) {
        let Self {
            face,
            zoom,
            pattern,
            texture,
            drag,
            followed,
        } = self;
        let sel = doc.selection;
        let Some(part) = doc.project.parts.get(sel.part) else {
            return;
        };
        let placed = doc.project.placed_gauges(part);
        // A gauge selected anywhere (tree, finding, canvas) brings its face into view.
        let selected = sel.gauge.map(|g| (sel.part, g));
        if selected != *followed {
            *followed = selected;
            if let Some(g) = sel.gauge.and_then(|g| placed.get(g)) {
                *face = Some(g.position.face);
            }
        }
        let member = &part.member;
        let faces = member.faces();
        let current = face
            .filter(|f| faces.iter().any(|e| e.face == *f))
            .unwrap_or(faces[0].face);
        *face = Some(current);
        let units = doc.units;
        ui.horizontal_wrapped(|ui| {
            let label = ui.label("Face").id;
            egui::ComboBox::from_id_salt("canvas face")
                .selected_text(current.name())
                .show_ui(ui, |ui| {
                    for f in &faces {
                        ui.selectable_value(face, Some(f.face), f.face.name());
                    }
                })
                .response
                .labelled_by(label)
                .on_hover_text("Which face of the part to show; round faces are unrolled");
            quantity.controls_ui(ui, false);
            let label = ui.label("Zoom").id;
            ui.add(egui::Slider::new(zoom, 0.5..=40.0).logarithmic(true))
                .labelled_by(label)
                .on_hover_text("Zoom the drawing");
            // The gauge tools on their own row, so no label is parted from its control.
            ui.end_row();
            let label = ui.label("Pattern").id;
            egui::ComboBox::from_id_salt("canvas pattern")
                .selected_text(pattern.name())
                .show_ui(ui, |ui| {
                    for p in GaugePattern::ALL {
                        ui.selectable_value(pattern, p, p.name());
                    }
                })
                .response
                .labelled_by(label)
                .on_hover_text("Grid pattern of the next gauge added");
            if ui
                .button("Add gauge")
                .on_hover_text("Place a gauge of the chosen pattern at the middle of this face")
                .clicked()
            {
                let e = faces
                    .iter()
                    .find(|e| e.face == current)
                    .copied()
                    .unwrap_or(faces[0]);
                let mut x = (e.x_range_m.0 + e.x_range_m.1) / 2.0;
                let mut s = (e.s_range_m.0 + e.s_range_m.1) / 2.0;
                if let Some(a) = e.hole_radius_m {
                    // Beside the hole rather than in it.
                    x = 0.0;
                    s = a + 0.005;
                }
                out.push(Command::AddGauge {
                    part: sel.part,
                    pattern: *pattern,
                    position: SurfacePoint::new(current, x, s),
                    angle_rad: 0.0,
                });
            }
            if let Some(g) = sel.gauge.and_then(|g| part.gauges.get(g)) && ui
                .button("Datum here")
                .on_hover_text("Put the dimension datum at the selected gauge's centre; the build sheet measures from it")
                .clicked()
            {
                out.push(Command::SetDatum { part: sel.part, x_m: g.position.x_m, s_m: g.position.s_m });
            }
            if let Some(g) = sel.gauge.and_then(|g| part.gauges.get(g).map(|p| (g, p))) {
                for (label, step) in [("Turn 15° left", 15f64), ("Turn 15° right", -15.0)] {
                    if ui
                        .button(label)
                        .on_hover_text("Turn the selected gauge")
                        .clicked()
                    {
                        out.push(Command::SetGaugeAngle {
                            part: sel.part,
                            gauge: g.0,
                            angle_rad: g.1.angle_rad + step.to_radians(),
                        });
                    }
                }
            }
        });
        let extent = faces
            .iter()
            .find(|e| e.face == current)
            .copied()
            .unwrap_or(faces[0]);
        let loads = part
            .load_cases
            .get(sel.case)
            .map(|c| c.load_vector())
            .unwrap_or_default();

        // Colour map texture, rebuilt only when the project, face, quantity or selection changes.
        let key_ok = texture.as_ref().is_some_and(|(n, f, q, s, _, _)| {
            *n == doc.evaluations
                && *f == current
                && *q == *quantity
                && s.part == sel.part
                && s.case == sel.case
        });
        if !key_ok
            && let Ok(map) = surface_map(
                member,
                current,
                &loads,
                quantity.surface(),
                quantity.basis,
                MAP_NX,
                MAP_NS,
            )
        {
            let (lo, hi) = map.range().unwrap_or((0.0, 0.0));
            let range = quantity.scale_range((lo, hi));
            let mut pixels = Vec::with_capacity(MAP_NX * MAP_NS);
            // Image rows run top to bottom; s increases upward.
            for j in (0..MAP_NS).rev() {
                for i in 0..MAP_NX {
                    pixels.push(match map.values[j * MAP_NX + i] {
                        None => Color32::from_gray(40),
                        Some(v) => quantity.colour(v, range),
                    });
                }
            }
            let image = egui::ColorImage::new([MAP_NX, MAP_NS], pixels);
            let handle = ui
                .ctx()
                .load_texture("surface map", image, egui::TextureOptions::LINEAR);
            *texture = Some((doc.evaluations, current, *quantity, sel, handle, (lo, hi)));
        }

        let (x0, x1) = extent.x_range_m;
        let (s0, s1) = extent.s_range_m;
        let avail = ui.available_size() - vec2(0.0, 40.0);
        let base = ((avail.x as f64 - 20.0) / (x1 - x0))
            .min((avail.y as f64 - 20.0) / (s1 - s0))
            .max(1.0);
        let scale = base * *zoom as f64; // pixels per metre
        let size = vec2(((x1 - x0) * scale) as f32, ((s1 - s0) * scale) as f32);
        egui::ScrollArea::both().show(ui, |ui| {
            let (resp, painter) =
                ui.allocate_painter(size + vec2(20.0, 20.0), Sense::click_and_drag());
            let origin = resp.rect.min + vec2(10.0, 10.0);
            let to_screen = |x: f64, s: f64| -> Pos2 {
                pos2(
                    origin.x + ((x - x0) * scale) as f32,
                    origin.y + ((s1 - s) * scale) as f32,
                )
            };
            let to_world = |p: Pos2| -> (f64, f64) {
                (
                    x0 + (p.x - origin.x) as f64 / scale,
                    s1 - (p.y - origin.y) as f64 / scale,
                )
            };
            let face_rect = Rect::from_min_size(origin, size);
            if let Some((_, _, _, _, tex, _)) = texture.as_ref() {
                painter.image(
                    tex.id(),
                    face_rect,
                    Rect::from_min_max(pos2(0.0, 0.0), pos2(1.0, 1.0)),
                    Color32::WHITE,
                );
            }
            painter.rect_stroke(
                face_rect,
                0.0,
                Stroke::new(1.0, ui.visuals().text_color()),
                egui::StrokeKind::Outside,
            );

            // Gauges on this face, each an accessible handle: click selects, drag moves.
            for (gi, g) in placed.iter().enumerate() {
                let pos = match drag {
                    Some((d, p)) if *d == gi => *p,
                    _ => g.position,
                };
                if pos.face != current {
                    continue;
                }
                let selected = sel.gauge == Some(gi);
                for e in 0..g.element_count() {
                    let fp = gw_mechanics::GridFootprint {
                        center: pos,
                        ..g.footprint(e)
                    };
                    let corners: Vec<Pos2> = fp
                        .corners()
                        .iter()
                        .map(|c| to_screen(c.x_m, c.s_m))
                        .collect();
                    let stroke = Stroke::new(
                        if selected { 2.5 } else { 1.5 },
                        if selected {
                            palette::SELECTED
                        } else {
                            palette::GAUGE
                        },
                    );
                    painter.add(egui::Shape::closed_line(corners.clone(), stroke));
                    let (sin, cos) = fp.angle_rad.sin_cos();
                    let half = fp.length_m * 0.5;
                    let a = to_screen(pos.x_m - half * cos, pos.s_m - half * sin);
                    let b = to_screen(pos.x_m + half * cos, pos.s_m + half * sin);
                    painter.line_segment([a, b], stroke);
                }
                let centre = to_screen(pos.x_m, pos.s_m);
                painter.text(
                    centre + vec2(8.0, -8.0),
                    egui::Align2::LEFT_BOTTOM,
                    &g.id,
                    egui::FontId::proportional(13.0),
                    ui.visuals().strong_text_color(),
                );
                let reach =
                    ((g.spec.grid_length_m.max(g.spec.grid_width_m) * scale) as f32 * 0.6).max(8.0);
                let handle = ui.interact(
                    Rect::from_center_size(centre, Vec2::splat(2.0 * reach)),
                    ui.scope_id().with(("gauge", gi)),
                    Sense::click_and_drag(),
                );
                let id = g.id.clone();
                handle.widget_info(|| {
                    egui::WidgetInfo::labeled(egui::Role::Button, true, format!("Gauge {id}"))
                });
                let handle =
                    handle.on_hover_text(format!("{} — drag to move, click to select", g.id));
                if handle.clicked() || handle.drag_started() {
                    out.push(Command::Select(Selection {
                        gauge: Some(gi),
                        ..sel
                    }));
                }
                if handle.drag_started() {
                    *drag = Some((gi, g.position));
                }
                if handle.dragged()
                    && let (Some((d, p)), Some(pointer)) =
                        (drag.as_mut(), handle.interact_pointer_pos())
                    && *d == gi
                {
                    let (x, s) = to_world(pointer);
                    // Snap to 0.5 mm, then to a nearby station (another gauge, the datum, the
                    // load point) and to the face's centre line, within 1.5 mm.
                    let snap = |v: f64| (v / 0.0005).round() * 0.0005;
                    let mut stations: Vec<f64> = part
                        .gauges
                        .iter()
                        .enumerate()
                        .filter(|(k, _)| *k != gi)
                        .map(|(_, o)| o.position.x_m)
                        .collect();
                    stations.push(part.datum_m.0);
                    if let gw_mechanics::Member::Beam(b) = member {
                        stations.extend(b.load_points.iter().map(|p| p.position_m));
                    }
                    let near = |v: f64, targets: &[f64]| {
                        targets
                            .iter()
                            .copied()
                            .find(|t| (t - v).abs() < 0.0015)
                            .unwrap_or(snap(v))
                    };
                    let candidate = SurfacePoint::new(current, near(x, &stations), near(s, &[0.0]));
                    if member.locate(&candidate).is_ok() {
                        *p = candidate;
                    }
                }
                if handle.drag_stopped()
                    && let Some((d, p)) = drag.take()
                {
                    out.push(Command::MoveGauge {
                        part: sel.part,
                        gauge: d,
                        position: p,
                    });
                }
            }
            if resp.clicked() {
                out.push(Command::Select(Selection { gauge: None, ..sel }));
            }

            // Value under the cursor.
            if let Some(h) = resp.hover_pos() {
                let (x, s) = to_world(h);
                if face_rect.contains(h) {
                    let p = SurfacePoint::new(current, x, s);
                    if let Ok(st) = member.state(&p, &loads)
                        && let Some(v) = gw_mechanics::quantity_of(
                            &st,
                            member.material(),
                            quantity.surface(),
                            quantity.basis,
                        )
                    {
                        let value = quantity.format(v, units);
                        painter.text(
                            h + vec2(14.0, 14.0),
                            egui::Align2::LEFT_TOP,
                            format!(
                                "x {}  s {}  {}",
                                units.format(Quantity::Length, x),
                                units.format(Quantity::Length, s),
                                value
                            ),
                            egui::FontId::proportional(12.0),
                            ui.visuals().strong_text_color(),
                        );
                    }
                }
            }
        });
        // Legend.
        if let Some((_, _, q, _, _, found)) = texture.as_ref() {
            q.legend_ui(ui, *found, units);
        }
        if let Some(g) = sel.gauge.and_then(|g| part.gauges.get(g)) {
            let (dx, ds) = part.datum_m;
            ui.label(format!(
                "{} on the {}: {} along, {} across from the datum, grid at {:.1}°",
                g.id,
                g.position.face.name(),
                units.format(Quantity::Length, g.position.x_m - dx),
                units.format(Quantity::Length, g.position.s_m - ds),
                g.angle_rad.to_degrees()
            ));
        }
    }
}
