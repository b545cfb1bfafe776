//! The part view: the whole part in 3-D, drawn on the CPU (projected, shaded and sorted far to
//! near into one egui mesh, no GPU needed), with its supports, the loads of the selected case,
//! the colour map, contour lines, the gauges and the axes. Drag to turn, right-drag or
//! Shift-drag to slide, scroll to zoom at the cursor; click a face to open it in the face
//! view, click a gauge to select it.

mod camera;
mod overlays;
mod scene;

use egui::{Color32, Pos2, Rect, Sense, Shape, Vec2, vec2};
use gw_bridge::GaugePattern;
use gw_mechanics::{Face, Member, SurfacePoint};
use gw_plan::drawing::part_mesh::Region;

pub use camera::{Camera, Preset};
use overlays::Labels;
use scene::{Projection, Scene, SceneKey};

use super::map::MapSettings;
use crate::command::Command;
use crate::state::{DocumentState, Selection};

/// View state of the part view.
#[derive(Default)]
pub struct PartView {
    camera: Camera,
    /// The part the camera was fitted to (index, name, kind), so a new part is fitted anew.
    fitted: Option<(usize, String, &'static str)>,
    /// A fit or zoom asked for by a button, done once the view's size is known.
    pending: Option<Framing>,
    scene: Option<Scene>,
    projection: Option<Projection>,
    generation: u64,
    /// The size of the view at the last fit, while the user has not zoomed or slid since: a
    /// change of the window's size then fits the part again.
    fitted_size: Option<Vec2>,
    /// A gauge pattern to place where the next click lands (None: a click opens the face).
    pub placing: Option<GaugePattern>,
    /// A gauge being dragged over the surface and where it would land.
    drag: std::cell::Cell<Option<(usize, SurfacePoint)>>,
}

/// A change of framing waiting for the view's size.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Framing {
    /// The whole part and its loads.
    Fit,
    /// The selected gauge at the middle, about a sixth of the view across.
    Selection,
}

/// What the user did in the canvas this frame.
struct CanvasActions {
    open_face: Option<Face>,
}

impl PartView {
    /// Turns the part as a drag of `delta` pixels would (the arrow keys use it too).
    pub fn turn(&mut self, delta: Vec2) {
        self.camera.orbit(delta);
    }

    /// Turns to a preset view and fits the part into it.
    pub fn look_from(&mut self, preset: Preset) {
        self.camera.set_preset(preset);
        self.pending = Some(Framing::Fit);
    }

    /// Draws the part view; returns a face the user clicked, to open in the face view.
    pub fn part_ui(
        &mut self,
        ui: &mut egui::Ui,
        doc: &DocumentState,
        map: &mut MapSettings,
        out: &mut Vec<Command>,
    ) -> Option<Face> {
        let sel = doc.selection;
        let part = doc.project.parts.get(sel.part)?;
        let identity = (sel.part, part.name.clone(), part.member.kind_name());
        if self.fitted.as_ref() != Some(&identity) {
            self.fitted = Some(identity);
            self.pending = Some(Framing::Fit);
        }
        self.toolbar_ui(ui, doc, map);
        let key = SceneKey {
            evaluations: doc.evaluations,
            part: sel.part,
            case: sel.case,
            map: *map,
            units: doc.units,
        };
        if self.scene.as_ref().is_none_or(|s| s.key != key) {
            let loads = part
                .load_cases
                .get(sel.case)
                .map(|c| c.load_vector())
                .unwrap_or_default();
            self.generation += 1;
            self.scene = Some(Scene::build(key, &part.member, &loads, self.generation));
        }
        let legend_height = 58.0;
        let size = ui.available_size() - vec2(0.0, legend_height);
        let (resp, painter) =
            ui.allocate_painter(size.max(vec2(100.0, 100.0)), Sense::click_and_drag());
        resp.widget_info(|| egui::WidgetInfo::labeled(egui::Role::Image, true, "Part view"));
        let actions = self.canvas_ui(ui, &resp, &painter, doc, out);
        if let Some(found) = self.scene.as_ref().and_then(|s| s.found) {
            map.legend_ui(ui, found, doc.units, "on the part");
        }
        actions.open_face
    }

    /// Preset views, fit and zoom to selection, and the map choice, on rows that keep their
    /// layout whatever is chosen.
    fn toolbar_ui(&mut self, ui: &mut egui::Ui, doc: &DocumentState, map: &mut MapSettings) {
        ui.horizontal_wrapped(|ui| {
            ui.label("View");
            for p in Preset::ALL {
                if ui
                    .button(p.name())
                    .on_hover_text(format!(
                        "Look at the part from the {} view",
                        p.name().to_lowercase()
                    ))
                    .clicked()
                {
                    self.camera.set_preset(p);
                    self.pending = Some(Framing::Fit);
                }
            }
            ui.separator();
            if ui
                .button("Fit part")
                .on_hover_text("Show the whole part")
                .clicked()
            {
                self.pending = Some(Framing::Fit);
            }
            let has_gauge = doc.selection.gauge.is_some();
            if ui
                .add_enabled(has_gauge, egui::Button::new("Zoom to selection"))
                .on_hover_text("Centre on the selected gauge and zoom in on it")
                .on_disabled_hover_text("Select a gauge first (in the plan tree or by clicking it)")
                .clicked()
            {
                self.pending = Some(Framing::Selection);
            }
        });
        ui.horizontal_wrapped(|ui| map.controls_ui(ui, false));
        ui.horizontal_wrapped(|ui| self.placing_ui(ui));
    }

    /// "Click to place": the pattern the next click on a face places (or opening the face).
    fn placing_ui(&mut self, ui: &mut egui::Ui) {
        let label = ui.label("Click on the part");
        let name = |p: Option<GaugePattern>| {
            p.map_or("opens the face".to_owned(), |p| {
                format!("places a {}", p.name())
            })
        };
        egui::ComboBox::from_id_salt("part view placing")
            .selected_text(name(self.placing))
            .show_ui(ui, |ui| {
                ui.selectable_value(&mut self.placing, None, name(None));
                for p in GaugePattern::ALL {
                    ui.selectable_value(&mut self.placing, Some(p), name(Some(p)));
                }
            })
            .response
            .labelled_by(label.id)
            .on_hover_text(
                "Place gauges straight on the 3-D part (the face's x axis is the gauge's 0°; \
                 drag a placed gauge to move it over the surface, turn it in the inspector or \
                 the face view)",
            );
    }

    fn zoom_to_gauge(&mut self, doc: &DocumentState, rect: Rect) {
        let sel = doc.selection;
        let Some(part) = doc.project.parts.get(sel.part) else {
            return;
        };
        let placed = doc.project.placed_gauges(part);
        let Some(g) = sel.gauge.and_then(|i| placed.get(i)) else {
            return;
        };
        let Some(frame) = part.member.surface_frame(&g.position) else {
            return;
        };
        self.camera.target = frame.position;
        // The gauge at about a tenth of the view, with some of the part round it.
        let reach = (5.0 * g.spec.grid_length_m.max(g.spec.grid_width_m)).max(0.005);
        self.camera.scale = f64::from(rect.width().min(rect.height()).max(100.0)) / (2.0 * reach);
    }

    /// The drawing and what the pointer does in it.
    fn canvas_ui(
        &mut self,
        ui: &egui::Ui,
        resp: &egui::Response,
        painter: &egui::Painter,
        doc: &DocumentState,
        out: &mut Vec<Command>,
    ) -> CanvasActions {
        let mut actions = CanvasActions { open_face: None };
        let rect = resp.rect;
        self.pointer_ui(ui, resp);
        self.frame_view(doc, rect);
        let Some(scene) = self.scene.as_ref() else {
            return actions;
        };
        let key = (self.camera, rect, scene.generation);
        if self.projection.as_ref().is_none_or(|p| p.key != key) {
            self.projection = Some(Projection::build(scene, &self.camera, rect));
        }
        let Some(proj) = self.projection.as_ref() else {
            return actions;
        };
        let sel = doc.selection;
        let Some(part) = doc.project.parts.get(sel.part) else {
            return actions;
        };
        let member = &part.member;
        let painter = painter.with_clip_rect(rect);
        painter.rect_filled(rect, 0.0, ui.visuals().extreme_bg_color);
        painter.add(Shape::mesh(proj.mesh.clone()));
        let camera = self.camera;
        let centre = rect.center();
        let (_, _, eye) = camera.basis();
        let hover = resp
            .hover_pos()
            .and_then(|p| proj.pick(scene, p).map(|hit| (p, hit)));
        let hovered_face = hover.and_then(|(_, (t, _))| match scene.mesh.regions[t] {
            Region::Face(f) => Some(f),
            _ => None,
        });
        if scene.key.map.contours {
            overlays::contours(&painter, scene, &camera, centre, eye);
        }
        overlays::edges(&painter, scene, proj, eye, hovered_face);
        let (lo, hi) = scene.bounds;
        let middle = camera
            .project(std::array::from_fn(|i| 0.5 * (lo[i] + hi[i])), centre)
            .0;
        let mut labels = Labels::away_from(middle);
        labels.reserve(Rect::from_min_size(
            rect.left_bottom() - vec2(0.0, 92.0),
            vec2(92.0, 92.0),
        ));
        let info = case_text(doc);
        let info_rect = painter.text(
            rect.left_top() + vec2(8.0, 6.0),
            egui::Align2::LEFT_TOP,
            info,
            egui::FontId::proportional(13.0),
            ui.visuals().strong_text_color(),
        );
        labels.reserve(info_rect.expand(4.0));
        let size = (0..3).map(|i| hi[i] - lo[i]).fold(0.0, f64::max);
        let pending = overlays::load_arrows(
            &painter,
            (&camera, centre, proj),
            scene,
            doc.units,
            &mut labels,
        );
        self.gauges_ui(ui, &painter, (scene, proj), doc, size, &mut labels, out);
        for (anchor, text) in pending {
            labels.place(&painter, anchor, &text, overlays::colours::LOAD, true);
        }
        overlays::supports(&painter, &camera, centre, member, &mut labels);
        overlays::datum(
            &painter,
            (member, &camera, centre, scene, proj),
            part.datum_m,
            size,
            &mut labels,
        );
        overlays::axes(&painter, &camera, rect);
        if let Some((p, (t, w))) = hover {
            hover_note(ui, &painter, scene, (p, t, w), doc);
        }
        if resp.clicked()
            && let Some(f) = hovered_face
        {
            let hit = hover.and_then(|(_, hit)| surface_point(scene, hit));
            match place_gauge(self.placing, hit, sel.part) {
                Some(command) => out.push(command),
                None => actions.open_face = Some(f),
            }
        }
        actions
    }

    /// Carries out a fit or zoom asked for, or fits again when the view changed size since the
    /// last fit and the user has not zoomed or slid since.
    fn frame_view(&mut self, doc: &DocumentState, rect: Rect) {
        let mut pending = self.pending.take();
        if pending.is_none()
            && self
                .fitted_size
                .is_some_and(|s| (s - rect.size()).length() > 1.0)
        {
            pending = Some(Framing::Fit);
        }
        match pending {
            Some(Framing::Selection) => {
                self.zoom_to_gauge(doc, rect);
                self.fitted_size = None;
            }
            Some(Framing::Fit) => {
                if let Some(scene) = self.scene.as_ref() {
                    self.camera.fit(scene.extent_points(), rect);
                    self.fitted_size = Some(rect.size());
                }
            }
            None => {}
        }
    }

    /// Turn, slide and zoom from the pointer.
    fn pointer_ui(&mut self, ui: &egui::Ui, resp: &egui::Response) {
        let (shift, scroll) = ui.input(|i| (i.modifiers.shift, i.smooth_scroll_delta.y));
        if resp.dragged_by(egui::PointerButton::Primary) && !shift {
            self.camera.orbit(resp.drag_delta());
        } else if resp.dragged_by(egui::PointerButton::Secondary)
            || resp.dragged_by(egui::PointerButton::Middle)
            || (resp.dragged_by(egui::PointerButton::Primary) && shift)
        {
            self.camera.pan(resp.drag_delta());
            self.fitted_size = None;
        }
        if let Some(p) = resp.hover_pos()
            && scroll != 0.0
        {
            self.fitted_size = None;
            self.camera
                .zoom_at(f64::from(scroll * 0.004).exp(), p, resp.rect.center());
        }
        // Arrow keys turn the part by 5° while the pointer is over it and no field has the
        // keyboard.
        let free = ui.memory(|m| m.focused().is_none());
        if resp.hovered() && free {
            let step = 5f32.to_radians() / 0.008;
            let turn = ui.input(|i| {
                let k = |key| if i.key_pressed(key) { 1.0 } else { 0.0 };
                Vec2::new(
                    k(egui::Key::ArrowLeft) - k(egui::Key::ArrowRight),
                    k(egui::Key::ArrowUp) - k(egui::Key::ArrowDown),
                ) * step
            });
            if turn != Vec2::ZERO {
                self.turn(turn);
            }
        }
    }

    /// Every gauge on the side facing the viewer, each a clickable handle.
    #[allow(clippy::too_many_arguments)]
    fn gauges_ui(
        &self,
        ui: &egui::Ui,
        painter: &egui::Painter,
        (scene, proj): (&Scene, &Projection),
        doc: &DocumentState,
        size: f64,
        labels: &mut Labels,
        out: &mut Vec<Command>,
    ) {
        let sel = doc.selection;
        let Some(part) = doc.project.parts.get(sel.part) else {
            return;
        };
        let centre = proj.key.1.center();
        let ctx = (&part.member, &self.camera, centre, scene, proj);
        for (gi, g) in doc.project.placed_gauges(part).iter().enumerate() {
            let selected = sel.gauge == Some(gi);
            let Some(drawn) = overlays::gauge(painter, ctx, g, 0.004 * size, selected) else {
                continue;
            };
            let colour = if selected {
                super::palette::SELECTED
            } else {
                Color32::from_rgb(235, 235, 228)
            };
            // The whole drawn gauge (tabs and direction mark included) is kept clear.
            let extent = (2.2 * drawn.length_px).max(12.0);
            labels.reserve(Rect::from_center_size(drawn.centre, Vec2::splat(extent)));
            labels.place(painter, drawn.centre, &g.id, colour, selected);
            let reach = (drawn.length_px * 0.6).max(9.0);
            let handle = ui.interact(
                Rect::from_center_size(drawn.centre, Vec2::splat(2.0 * reach)),
                ui.unique_id().with(("part view gauge", gi)),
                Sense::click_and_drag(),
            );
            if handle.dragged()
                && let Some(p) = handle.interact_pointer_pos()
            {
                // Where it would land, shown until the button is let go (one undo step).
                if let Some(position) = proj
                    .pick(scene, p)
                    .and_then(|hit| surface_point(scene, hit))
                {
                    self.drag.set(Some((gi, position)));
                    painter.circle_stroke(p, 6.0, egui::Stroke::new(2.0, super::palette::SELECTED));
                }
            }
            if handle.drag_stopped()
                && let Some((g, position)) = self.drag.take()
                && g == gi
            {
                out.push(Command::MoveGauge {
                    part: sel.part,
                    gauge: gi,
                    position,
                });
            }
            let id = g.id.clone();
            handle.widget_info(|| {
                egui::WidgetInfo::labeled(egui::Role::Button, true, format!("Gauge {id}"))
            });
            if handle
                .on_hover_text(format!("{}: click to select, drag to move", g.id))
                .clicked()
            {
                out.push(Command::Select(Selection {
                    gauge: Some(gi),
                    ..sel
                }));
            }
        }
    }
}

/// The load case and any uniform temperature change, in words.
fn case_text(doc: &DocumentState) -> String {
    let sel = doc.selection;
    let Some(part) = doc.project.parts.get(sel.part) else {
        return String::new();
    };
    let Some(case) = part.load_cases.get(sel.case) else {
        return format!("{}: no load case", part.name);
    };
    let mut text = format!("{}, load case: {}", part.name, case.name);
    let dt = case.value(gw_mechanics::LoadComponent::TemperatureChange);
    if dt != 0.0 {
        text += &format!(
            "\nPart {} from the reference temperature",
            doc.units
                .format(crate::units::Quantity::TemperatureChange, dt)
        );
    }
    if let Member::GivenState(_) = part.member {
        let k = case.value(gw_mechanics::LoadComponent::GivenStateFactor);
        let k = crate::panels::fields::Digits::Places(0, 3).text(k);
        text += &format!("\nGiven state × {k}");
    }
    text
}

/// The face and map value under the cursor, and what a click does.
fn hover_note(
    ui: &egui::Ui,
    painter: &egui::Painter,
    scene: &Scene,
    (p, t, w): (Pos2, usize, [f32; 3]),
    doc: &DocumentState,
) {
    let Region::Face(face) = scene.mesh.regions[t] else {
        return;
    };
    let tri = scene.mesh.triangles[t];
    let value: Option<f64> = tri
        .iter()
        .zip(w)
        .map(|(&k, w)| scene.values[k as usize].map(|v| v * f64::from(w)))
        .sum();
    let mut text = crate::panels::capitalise(&face.name());
    if let Some(v) = value {
        text += &format!(": {}", scene.key.map.format(v, doc.units));
    }
    text += "\nClick to open it in the Face view";
    let galley = painter.layout_no_wrap(
        text,
        egui::FontId::proportional(12.5),
        ui.visuals().strong_text_color(),
    );
    let size = galley.size() + vec2(8.0, 4.0);
    let clip = painter.clip_rect();
    let mut at = p + vec2(16.0, 16.0);
    if at.x + size.x > clip.right() {
        at.x = p.x - 16.0 - size.x;
    }
    if at.y + size.y > clip.bottom() {
        at.y = p.y - 16.0 - size.y;
    }
    let r = Rect::from_min_size(at, size);
    painter.rect_filled(r, 3.0, Color32::from_black_alpha(190));
    painter.galley(r.min + vec2(4.0, 2.0), galley, Color32::WHITE);
}

/// The gauge a click places when a pattern is chosen and the click lands on a face.
fn place_gauge(
    placing: Option<GaugePattern>,
    hit: Option<SurfacePoint>,
    part: usize,
) -> Option<Command> {
    Some(Command::AddGauge {
        part,
        pattern: placing?,
        position: hit?,
        angle_rad: 0.0,
    })
}

/// The surface point under a hit on the mesh: the hit triangle's vertices' points weighted by
/// where in it the pointer is (all three lie on one face).
fn surface_point(scene: &Scene, (t, w): (usize, [f32; 3])) -> Option<SurfacePoint> {
    let tri = scene.mesh.triangles[t];
    let points: Vec<SurfacePoint> = tri
        .iter()
        .map(|&v| scene.mesh.points[v as usize])
        .collect::<Option<_>>()?;
    let face = points[0].face;
    if points.iter().any(|p| p.face != face) {
        return None;
    }
    let blend = |f: fn(&SurfacePoint) -> f64| -> f64 {
        (0..3).map(|k| f64::from(w[k]) * f(&points[k])).sum()
    };
    Some(SurfacePoint::new(face, blend(|p| p.x_m), blend(|p| p.s_m)))
}
