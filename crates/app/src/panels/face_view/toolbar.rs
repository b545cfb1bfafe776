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
        self.elsewhere_ui(ui, scene);
    }

    /// When the selected gauge is on another face: says so, with a button that shows it (the
    /// gauge tools are greyed out meanwhile, so they never act on a gauge out of sight).
    fn elsewhere_ui(&mut self, ui: &mut egui::Ui, scene: &Scene) {
        let Some(g) = selected_elsewhere(scene) else {
            return;
        };
        let face = g.position.face;
        ui.horizontal_wrapped(|ui| {
            ui.label(format!("{} is on the {}.", g.id, face.name()));
            if ui
                .button(format!("Show the {}", face.name()))
                .on_hover_text("Show the face the selected gauge is on")
                .clicked()
            {
                self.face = Some(face);
            }
        });
    }

    /// Face picker, "Whole face" and "Zoom to selection".
    fn face_row_ui(&mut self, ui: &mut egui::Ui, scene: &Scene) {
        wrap_unless_fits(ui, "Face", FACE_COMBO);
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
        wrap_unless_fits(ui, "Pattern", PATTERN_COMBO);
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
        // Only a gauge on the face shown: one elsewhere is named in a line of its own.
        let selected = scene
            .sel
            .gauge
            .and_then(|g| scene.part.gauges.get(g).map(|p| (g, p)))
            .filter(|(_, p)| p.position.face == scene.face);
        let enabled = selected.is_some();
        let angle_rad = match (selected, self.turn) {
            (Some((g, _)), Some((t, a))) if g == t => a,
            (Some((_, p)), _) => p.angle_rad,
            (None, _) => 0.0,
        };
        let mut deg = angle_rad.to_degrees();
        let disabled_why = if selected_elsewhere(scene).is_some() {
            "The selected gauge is on another face: show that face first"
        } else {
            "Select a gauge on this face first"
        };
        wrap_unless_fits(ui, "Gauge angle", ANGLE_FIELD);
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
                .on_disabled_hover_text(disabled_why)
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
                .on_disabled_hover_text(disabled_why)
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
            .on_disabled_hover_text(disabled_why)
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

/// The selected gauge when it is on another face than the one shown.
fn selected_elsewhere<'a>(scene: &Scene<'a>) -> Option<&'a gw_plan::PlanGauge> {
    let g = scene.part.gauges.get(scene.sel.gauge?)?;
    (g.position.face != scene.face).then_some(g)
}

/// In a wrapping row: starts a new row unless a label with `text` and a control of
/// `control_width` points fit in what is left of this one (a labelled pair is laid out as
/// one piece, which the row would not wrap by itself).
fn wrap_unless_fits(ui: &mut egui::Ui, text: &str, control_width: f32) {
    let galley = egui::WidgetText::from(text).into_galley(
        ui,
        Some(egui::TextWrapMode::Extend),
        f32::INFINITY,
        egui::TextStyle::Body,
    );
    let needed = galley.size().x + ui.spacing().item_spacing.x + control_width + 8.0;
    let at_row_start = ui.cursor().left() <= ui.max_rect().left() + 1.0;
    if !at_row_start && ui.available_size_before_wrap().x < needed {
        ui.end_row();
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
