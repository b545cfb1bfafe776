//! The face view's toolbar: face and view buttons, the map choice, and the gauge tools.
//! Every control keeps its width whatever it shows, so the rows never reflow when a longer
//! name is picked; gauge tools stay in place and are greyed out while no gauge is selected.

use egui::{Button, ComboBox, DragValue};
use gw_bridge::GaugePattern;
use gw_mechanics::{FaceExtent, SurfacePoint};
use gw_plan::drawing::face_layout::{FaceWindow, snap_coordinate};

use super::{FaceView, Scene, ViewRequest};
use crate::command::Command;
use crate::panels::map::MapSettings;

/// Width of the face picker, points.
const FACE_COMBO: f32 = 120.0;
/// Width of the pattern picker, points.
const PATTERN_COMBO: f32 = 200.0;
/// Width of the typed angle, points.
const ANGLE_FIELD: f32 = 64.0;

impl FaceView {
    /// The three toolbar rows.
    pub(super) fn toolbar_ui(
        &mut self,
        ui: &mut egui::Ui,
        scene: &Scene,
        settings: &mut MapSettings,
        shown: Option<FaceWindow>,
        out: &mut Vec<Command>,
    ) {
        ui.horizontal_wrapped(|ui| self.face_row_ui(ui, scene));
        ui.horizontal_wrapped(|ui| settings.controls_ui(ui, true));
        ui.horizontal_wrapped(|ui| {
            self.pattern_ui(ui, scene, shown, out);
            self.gauge_tools_ui(ui, scene, out);
        });
    }

    /// Face picker, "Whole face" and "Zoom to selection".
    fn face_row_ui(&mut self, ui: &mut egui::Ui, scene: &Scene) {
        ui.horizontal(|ui| {
            let label = ui.label("Face").id;
            ComboBox::from_id_salt("canvas face")
                .width(FACE_COMBO)
                .truncate()
                .selected_text(scene.face.name())
                .show_ui(ui, |ui| {
                    for f in scene.part.member.faces() {
                        ui.selectable_value(&mut self.face, Some(f.face), f.face.name());
                    }
                })
                .response
                .labelled_by(label)
                .on_hover_text("Which face of the part to show; round faces are unrolled");
        });
        if ui
            .button("Whole face")
            .on_hover_text("Show the whole face (the mouse wheel zooms, dragging the canvas pans)")
            .clicked()
        {
            self.request = Some(ViewRequest::WholeFace);
        }
        let on_face = scene.on_face().any(|(i, _)| Some(*i) == scene.sel.gauge);
        if ui
            .add_enabled(on_face, Button::new("Zoom to selection"))
            .on_hover_text("Centre the view on the selected gauge, close enough to see its grids")
            .on_disabled_hover_text("Select a gauge on this face first")
            .clicked()
        {
            self.request = Some(ViewRequest::Selection);
        }
    }

    /// Pattern picker and "Add gauge".
    fn pattern_ui(
        &mut self,
        ui: &mut egui::Ui,
        scene: &Scene,
        shown: Option<FaceWindow>,
        out: &mut Vec<Command>,
    ) {
        ui.horizontal(|ui| self.pattern_combo_ui(ui));
        if ui
            .button("Add gauge")
            .on_hover_text("Place a gauge of the chosen pattern in the middle of the view")
            .clicked()
        {
            let position = new_gauge_position(scene, &scene.extent, shown);
            out.push(Command::AddGauge {
                part: scene.sel.part,
                pattern: self.pattern,
                position,
                angle_rad: 0.0,
            });
        }
    }

    /// The pattern picker with its label.
    fn pattern_combo_ui(&mut self, ui: &mut egui::Ui) {
        let label = ui.label("Pattern").id;
        ComboBox::from_id_salt("canvas pattern")
            .width(PATTERN_COMBO)
            .truncate()
            .selected_text(self.pattern.name())
            .show_ui(ui, |ui| {
                for p in GaugePattern::ALL {
                    ui.selectable_value(&mut self.pattern, p, p.name());
                }
            })
            .response
            .labelled_by(label)
            .on_hover_text(
                "Grid pattern of the next gauge added, and of the reading under the cursor",
            );
    }

    /// Typed angle, turn buttons and "Datum here", for the selected gauge.
    fn gauge_tools_ui(&mut self, ui: &mut egui::Ui, scene: &Scene, out: &mut Vec<Command>) {
        let part = scene.sel.part;
        let selected = scene
            .sel
            .gauge
            .and_then(|g| scene.part.gauges.get(g).map(|p| (g, p)));
        let enabled = selected.is_some();
        let angle_rad = match (selected, self.turn) {
            (Some((g, _)), Some((t, a))) if g == t => a,
            (Some((_, p)), _) => p.angle_rad,
            (None, _) => 0.0,
        };
        let mut deg = angle_rad.to_degrees();
        let field = ui
            .horizontal(|ui| {
                let label = ui.label("Gauge angle").id;
                ui.add_enabled_ui(enabled, |ui| {
                    ui.add_sized(
                        [ANGLE_FIELD, ui.spacing().interact_size.y],
                        DragValue::new(&mut deg)
                            .range(-360.0..=360.0)
                            .speed(1.0)
                            .max_decimals(1)
                            .suffix("°")
                            .update_while_editing(false),
                    )
                })
                .inner
                .labelled_by(label)
                .on_hover_text(
                    "Direction of the selected gauge, counter-clockwise from the member axis \
                     seen from outside: type it, or drag",
                )
            })
            .inner;
        if let Some((g, _)) = selected {
            if field.changed() {
                self.turn = Some((g, deg.to_radians()));
            }
            let done = field.drag_stopped() || (field.changed() && !field.dragged());
            if done && let Some((t, a)) = self.turn.take() {
                out.push(Command::SetGaugeAngle {
                    part,
                    gauge: t,
                    angle_rad: a,
                });
            }
        }
        for (text, step) in [("Turn 15° left", 15f64), ("Turn 15° right", -15.0)] {
            if ui
                .add_enabled(enabled, Button::new(text))
                .on_hover_text("Turn the selected gauge (or drag the round handle beside it)")
                .clicked()
                && let Some((g, p)) = selected
            {
                out.push(Command::SetGaugeAngle {
                    part,
                    gauge: g,
                    angle_rad: p.angle_rad + step.to_radians(),
                });
            }
        }
        if ui
            .add_enabled(enabled, Button::new("Datum here"))
            .on_hover_text(
                "Put the dimension datum at the selected gauge's centre; the build sheet \
                 measures from it",
            )
            .clicked()
            && let Some((_, p)) = selected
        {
            out.push(Command::SetDatum {
                part,
                x_m: p.position.x_m,
                s_m: p.position.s_m,
            });
        }
    }
}

/// Where "Add gauge" puts a gauge: the middle of the view on the 0.5 mm grid, brought onto
/// the face; beside the hole if that point is in it.
fn new_gauge_position(scene: &Scene, e: &FaceExtent, shown: Option<FaceWindow>) -> SurfacePoint {
    let middle = (
        (e.x_range_m.0 + e.x_range_m.1) / 2.0,
        (e.s_range_m.0 + e.s_range_m.1) / 2.0,
    );
    let (x, s) = shown.map_or(middle, |w| (w.centre_x_m, w.centre_s_m));
    let snap = |v: f64| snap_coordinate(v, 0.0005, &[], 0.0);
    let x = snap(x).clamp(e.x_range_m.0, e.x_range_m.1);
    let s = if scene.period_m.is_some() {
        snap(s)
    } else {
        snap(s).clamp(e.s_range_m.0, e.s_range_m.1)
    };
    // The first spot along x that no other gauge on the face covers, up to 30 mm either way.
    let step = 0.006;
    let free = (0..12)
        .map(|k| {
            x + step
                * if k % 2 == 0 {
                    k as f64 / 2.0
                } else {
                    -(k as f64 + 1.0) / 2.0
                }
        })
        .map(|x| SurfacePoint::new(scene.face, x, s))
        .filter_map(|p| scene.part.member.locate(&p).ok())
        .find(|p| {
            scene.on_face().all(|(_, g)| {
                (g.position.x_m - p.x_m).abs() >= step || (g.position.s_m - p.s_m).abs() >= step
            })
        });
    if let Some(p) = free {
        return p;
    }
    if let Ok(p) = scene
        .part
        .member
        .locate(&SurfacePoint::new(scene.face, x, s))
    {
        return p;
    }
    if let Some(a) = e.hole_radius_m {
        // Beside the hole rather than in it, on the line from its centre.
        let r = x.hypot(s);
        let (ux, us) = if r > 1e-9 { (x / r, s / r) } else { (0.0, 1.0) };
        let point = SurfacePoint::new(scene.face, ux * (a + 0.005), us * (a + 0.005));
        if scene.part.member.locate(&point).is_ok() {
            return point;
        }
    }
    SurfacePoint::new(scene.face, middle.0, middle.1)
}
