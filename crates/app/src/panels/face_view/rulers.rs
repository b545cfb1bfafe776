//! Rulers along the top and left (and on round faces the arc length at the right), the scale
//! bar with the enlargement note, the overview strip of the whole face, and zoom and pan.

use std::f64::consts::PI;

use egui::{Align2, Color32, FontId, Painter, Pos2, Rect, Sense, Stroke, pos2, vec2};
use gw_plan::drawing::face_layout::{
    self, angle_step_deg, arc_ruler_ticks, normalised_deg, ruler_step, ruler_ticks,
    scale_bar_length,
};

use super::{FIT_MARGIN, FaceView, SIDE_RULER, Scene, TOP_RULER, View, ViewRequest, gauges};
use crate::units::{Quantity, number_text};

/// Smallest spacing of labelled ruler ticks, points: along the top (labels side by side) and
/// down the side (labels stacked).
const TOP_SPACING: f64 = 70.0;
const SIDE_SPACING: f64 = 30.0;
/// Height of the overview strip, points.
pub(super) const OVERVIEW: f32 = 24.0;
/// A drawn grid never smaller than this, points.
pub(super) const MIN_GAUGE_PX: f64 = 24.0;

fn ruler_font() -> FontId {
    FontId::proportional(10.5)
}

/// A number with as many decimals as the step needs.
fn tick_text(value: f64, step: f64) -> String {
    let decimals = (-step.log10().floor()).clamp(0.0, 4.0) as usize;
    let v = if value.abs() < step * 1e-6 {
        0.0
    } else {
        value
    };
    format!("{v:.decimals$}")
}

/// The rulers round the drawing area.
pub(super) fn rulers_ui(ui: &egui::Ui, scene: &Scene, view: View) {
    let painter = ui.painter();
    let area = view.area;
    let fill = ui.visuals().panel_fill;
    let text = ui.visuals().text_color();
    let top = Rect::from_min_max(area.min - vec2(SIDE_RULER, TOP_RULER), area.right_top());
    let left = Rect::from_min_max(area.min - vec2(SIDE_RULER, 0.0), area.left_bottom());
    painter.rect_filled(top, 0.0, fill);
    painter.rect_filled(left, 0.0, fill);
    let unit = scene.units.label(Quantity::Length);
    painter.text(
        top.left_top() + vec2(4.0, 3.0),
        Align2::LEFT_TOP,
        format!("x, {unit}"),
        ruler_font(),
        ui.visuals().weak_text_color(),
    );
    x_ruler_ui(painter, scene, view, text);
    match scene.radius_m() {
        Some(r) => {
            angle_ruler_ui(painter, scene, view, r, text);
            arc_ruler_ui(ui, scene, view, r, text);
        }
        None => s_ruler_ui(painter, scene, view, text),
    }
}

/// Ticks and minor ticks of x along the top.
fn x_ruler_ui(painter: &Painter, scene: &Scene, view: View, text: Color32) {
    let per_m = scene.units_per_m();
    let px_per_unit = view.window.px_per_m / per_m;
    let step = ruler_step(px_per_unit, TOP_SPACING);
    let ((x0, x1), _) = view.window.visible(&view.canvas());
    let y = view.area.top();
    let stroke = Stroke::new(1.0, text);
    for t in ruler_ticks(x0 * per_m, x1 * per_m, step / 5.0) {
        let major = (t / step - (t / step).round()).abs() < 1e-6;
        let x = view.pos(t / per_m, 0.0).x;
        let len = if major { 7.0 } else { 3.0 };
        painter.line_segment([pos2(x, y - len), pos2(x, y)], stroke);
        if major {
            painter.text(
                pos2(x, y - 8.0),
                Align2::CENTER_BOTTOM,
                tick_text(t, step),
                ruler_font(),
                text,
            );
        }
    }
}

/// Ticks of s down the left side of a flat face (s up).
fn s_ruler_ui(painter: &Painter, scene: &Scene, view: View, text: Color32) {
    let per_m = scene.units_per_m();
    let step = ruler_step(view.window.px_per_m / per_m, SIDE_SPACING);
    let (_, (s0, s1)) = view.window.visible(&view.canvas());
    let x = view.area.left();
    let stroke = Stroke::new(1.0, text);
    for t in ruler_ticks(s0 * per_m, s1 * per_m, step / 5.0) {
        let major = (t / step - (t / step).round()).abs() < 1e-6;
        let y = view.pos(0.0, t / per_m).y;
        let len = if major { 7.0 } else { 3.0 };
        painter.line_segment([pos2(x - len, y), pos2(x, y)], stroke);
        if major {
            painter.text(
                pos2(x - 9.0, y),
                Align2::RIGHT_CENTER,
                tick_text(t, step),
                ruler_font(),
                text,
            );
        }
    }
}

/// Angle from the top line down the left side of an unrolled round face.
fn angle_ruler_ui(painter: &Painter, _scene: &Scene, view: View, r: f64, text: Color32) {
    let px_per_deg = view.window.px_per_m * r * PI / 180.0;
    let step = angle_step_deg(px_per_deg, SIDE_SPACING);
    let (_, (s0, s1)) = view.window.visible(&view.canvas());
    let deg = |s: f64| (s / r).to_degrees();
    let x = view.area.left();
    let stroke = Stroke::new(1.0, text);
    for t in ruler_ticks(deg(s0), deg(s1), step) {
        let y = view.pos(0.0, t.to_radians() * r).y;
        painter.line_segment([pos2(x - 7.0, y), pos2(x, y)], stroke);
        painter.text(
            pos2(x - 9.0, y),
            Align2::RIGHT_CENTER,
            format!("{}°", number_text(normalised_deg(t), 0)),
            ruler_font(),
            text,
        );
    }
}

/// Arc length from the top line down the right side of an unrolled round face, counted in
/// (−half, half] of the circumference like the stored positions.
fn arc_ruler_ui(ui: &egui::Ui, scene: &Scene, view: View, r: f64, text: Color32) {
    let painter = ui.painter();
    let area = view.area;
    let band = Rect::from_min_max(
        area.right_top(),
        area.right_bottom() + vec2(SIDE_RULER, 0.0),
    );
    painter.rect_filled(band, 0.0, ui.visuals().panel_fill);
    painter.text(
        band.left_top() - vec2(-4.0, TOP_RULER - 3.0),
        Align2::LEFT_TOP,
        "arc",
        ruler_font(),
        ui.visuals().weak_text_color(),
    );
    let per_m = scene.units_per_m();
    let step = ruler_step(view.window.px_per_m / per_m, SIDE_SPACING);
    let (_, (s0, s1)) = view.window.visible(&view.canvas());
    let stroke = Stroke::new(1.0, text);
    for (s, value) in arc_ruler_ticks(s0, s1, 2.0 * PI * r, step / per_m) {
        let y = view.pos(0.0, s).y;
        painter.line_segment([pos2(band.left(), y), pos2(band.left() + 7.0, y)], stroke);
        painter.text(
            pos2(band.left() + 9.0, y),
            Align2::LEFT_CENTER,
            tick_text(value * per_m, step),
            ruler_font(),
            text,
        );
    }
}

/// The scale bar in `space` (beside the overview strip), with a note when gauges are drawn
/// larger than they are.
fn scale_bar_ui(ui: &egui::Ui, scene: &Scene, view: View, space: Rect) {
    let painter = ui.painter().with_clip_rect(space);
    let per_m = scene.units_per_m();
    let px_per_unit = view.window.px_per_m / per_m;
    let length = scale_bar_length(
        px_per_unit,
        (space.width() as f64 * 0.35).clamp(20.0, 110.0),
    );
    let bar_px = (length * px_per_unit) as f32;
    let unit = scene.units.label(Quantity::Length);
    let mut caption = format!("{} {unit}", tick_text(length, length));
    let k = gauges::enlargement(scene, view);
    if k > 1.0 + 1e-6 {
        caption.push_str(&format!(";  gauges drawn {k:.1}× enlarged"));
    }
    let text = ui.visuals().text_color();
    let y = space.center().y;
    let x0 = space.left() + 12.0;
    let stroke = Stroke::new(2.0, text);
    painter.line_segment([pos2(x0, y), pos2(x0 + bar_px, y)], stroke);
    for x in [x0, x0 + bar_px] {
        painter.line_segment([pos2(x, y - 4.0), pos2(x, y + 4.0)], Stroke::new(1.0, text));
    }
    let galley = painter.layout(
        caption,
        FontId::proportional(11.0),
        text,
        (space.right() - x0 - bar_px - 8.0).max(10.0),
    );
    painter.galley(
        pos2(x0 + bar_px + 8.0, y - galley.size().y / 2.0),
        galley,
        text,
    );
}

impl FaceView {
    /// Mouse-wheel zoom about the cursor, pan by dragging empty canvas, and the window the
    /// buttons asked for.
    pub(super) fn navigate(
        &mut self,
        ui: &egui::Ui,
        response: &egui::Response,
        scene: &Scene,
        view: View,
    ) {
        let canvas = view.canvas();
        let whole = face_layout::whole_face_window(&scene.bounds, &canvas, FIT_MARGIN);
        match self.request.take() {
            Some(ViewRequest::WholeFace) => {
                // A fit: done again if the view changes size before the user zooms or pans.
                self.fit(scene, view.area, face_layout::FitKind::WholeFace);
            }
            Some(ViewRequest::Selection) => {
                if let Some((_, g)) = scene.on_face().find(|(i, _)| Some(*i) == scene.sel.gauge) {
                    // Close enough that the grid is about 90 points long.
                    let close = 90.0 / g.spec.grid_length_m.max(1e-4);
                    let px_per_m = view
                        .window
                        .px_per_m
                        .max(close)
                        .min(face_layout::MAX_PX_PER_M);
                    self.set_window(
                        scene,
                        face_layout::FaceWindow {
                            centre_x_m: g.position.x_m,
                            centre_s_m: scene.drawn_s(g.position.s_m),
                            px_per_m,
                        },
                    );
                }
            }
            None => {}
        }
        let window = self.shown().unwrap_or(view.window);
        if response.hovered()
            && let Some(cursor) = response.hover_pos()
        {
            let (scroll, zoom) = ui.input(|i| (i.smooth_scroll_delta.y, i.zoom_delta()));
            let factor = zoom as f64 * (scroll as f64 * 0.003).exp();
            if (factor - 1.0).abs() > 1e-6 {
                let min = whole.px_per_m * 0.5;
                let zoomed = window.zoomed_about(&canvas, [cursor.x, cursor.y], factor, min);
                self.set_window(scene, zoomed);
            }
        }
        if response.dragged() && self.drag.is_none() && self.turn.is_none() {
            let d = response.drag_delta();
            let window = self.shown().unwrap_or(view.window);
            self.set_window(scene, window.panned(d.x, d.y));
        }
    }

    /// The whole face in a strip under the canvas, the visible window outlined on it; a click
    /// or drag there moves the window.
    pub(super) fn overview_ui(&mut self, ui: &mut egui::Ui, scene: &Scene, view: View) {
        let (row, response) = ui.allocate_exact_size(
            vec2(ui.available_width(), OVERVIEW),
            Sense::click_and_drag(),
        );
        // The strip takes the larger part of the row; the scale bar the rest.
        let split = view.area.left() + view.area.width() * 0.58;
        let strip = Rect::from_min_max(
            pos2(view.area.left(), row.top() + 2.0),
            pos2(split, row.bottom() - 2.0),
        );
        scale_bar_ui(
            ui,
            scene,
            view,
            Rect::from_min_max(pos2(split, row.top()), row.right_bottom()),
        );
        let painter = ui.painter();
        painter.text(
            pos2(strip.left() - 6.0, strip.center().y),
            Align2::RIGHT_CENTER,
            "whole",
            ruler_font(),
            ui.visuals().weak_text_color(),
        );
        let b = &scene.bounds;
        let to_strip = |x: f64, s: f64| -> Pos2 {
            pos2(
                strip.left() + ((x - b.x_m.0) / b.length_m()) as f32 * strip.width(),
                strip.bottom() - ((s - b.s_m.0) / b.width_m()) as f32 * strip.height(),
            )
        };
        painter.rect_filled(strip, 0.0, ui.visuals().extreme_bg_color);
        if let Some(layer) = &self.map {
            layer.paint_overview(painter, scene, strip, &to_strip);
        }
        for (_, g) in scene.on_face() {
            let c = to_strip(g.position.x_m, scene.drawn_s(g.position.s_m));
            painter.circle_filled(c, 2.5, Color32::from_rgb(25, 25, 30));
        }
        let ((x0, x1), (s0, s1)) = view.window.visible(&view.canvas());
        let shown = Rect::from_two_pos(to_strip(x0, s0), to_strip(x1, s1)).intersect(strip);
        let outline = ui.visuals().strong_text_color();
        painter.rect_stroke(
            strip,
            0.0,
            Stroke::new(1.0, ui.visuals().weak_text_color()),
            egui::StrokeKind::Outside,
        );
        painter.rect_stroke(
            shown,
            1.0,
            Stroke::new(2.0, outline),
            egui::StrokeKind::Inside,
        );
        let response =
            response.on_hover_text("The whole face: click or drag to move the view there");
        response.widget_info(|| {
            egui::WidgetInfo::labeled(egui::Role::Button, true, "Overview of the whole face")
        });
        if (response.clicked() || response.dragged())
            && let Some(p) = response.interact_pointer_pos()
        {
            let x = b.x_m.0 + ((p.x - strip.left()) / strip.width()) as f64 * b.length_m();
            let s = b.s_m.0 + ((strip.bottom() - p.y) / strip.height()) as f64 * b.width_m();
            let mut w = self.shown().unwrap_or(view.window);
            w.centre_x_m = x;
            w.centre_s_m = s;
            self.set_window(scene, w);
        }
    }
}
