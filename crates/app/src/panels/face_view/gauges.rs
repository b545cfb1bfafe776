//! Gauges on the face: drawn to scale (or at a minimum size, the same enlargement for all, then
//! translucent) with their grid lines and solder tabs, and an arrow along the reference
//! direction (the gauge's angle) for every pattern; each an
//! accessible handle that selects on click and moves on drag (snapping to 0.5 mm, stations and
//! the centre line), and a round handle on the selected gauge that turns it (5° steps unless
//! Shift is held). Ids are labelled at the first free place beside each gauge.

use std::f64::consts::PI;

use egui::{Color32, Painter, Pos2, Rect, Sense, Shape, Stroke, Vec2, vec2};
use gw_bridge::PlacedGauge;
use gw_mechanics::{Member, SurfacePoint};
use gw_plan::drawing::face_layout::{
    self, LabelPlacer, drawn_copies, snap_angle_deg, snap_coordinate,
};

use super::edges::pill_label_ui;
use super::rulers::MIN_GAUGE_PX;
use super::{FaceView, Scene, View, to_screen_rect};
use crate::command::Command;
use crate::state::Selection;

/// Ink of a gauge's grid.
const GRID_INK: Color32 = Color32::from_rgb(30, 30, 36);
/// Outline of the selected gauge and its turn handle.
const SELECTED: Color32 = Color32::from_rgb(0, 118, 150);
/// Backing film of a gauge, pale so the grid reads over any map colour.
const BACKING: Color32 = Color32::from_rgba_premultiplied(236, 234, 222, 215);
/// Solder tabs.
const TABS: Color32 = Color32::from_rgb(176, 120, 50);
/// Snapping reaches this far on screen, points.
const SNAP_REACH_PX: f64 = 8.0;

/// Half the size of the drawn gauge with its tabs, metres (at true size): how close to the
/// seam it counts as on it.
pub(super) fn reach_m(g: &PlacedGauge) -> f64 {
    0.5 * 1.7 * g.spec.grid_length_m.max(g.spec.grid_width_m)
}

/// How much larger than true size the gauges on this face are drawn (1 when readable).
pub(super) fn enlargement(scene: &Scene, view: View) -> f64 {
    let smallest = scene
        .on_face()
        .map(|(_, g)| g.spec.grid_length_m.max(g.spec.grid_width_m))
        .fold(f64::INFINITY, f64::min);
    if !smallest.is_finite() {
        return 1.0;
    }
    face_layout::enlargement(smallest * view.window.px_per_m, MIN_GAUGE_PX)
}

/// Gap between the direction arrow's tip and the turn handle, points.
const HANDLE_GAP: f32 = 14.0;
/// Radius of the turn handle, points.
const HANDLE_RADIUS: f32 = 6.0;

/// One gauge as drawn this frame.
pub(super) struct Drawn {
    index: usize,
    gauge: PlacedGauge,
    /// Screen centres: the first inside the drawn face, a second beyond the far edge when the
    /// gauge lies on the seam.
    centres: Vec<Pos2>,
    /// Screen points per metre of the drawing (true scale × enlargement).
    scale: f32,
    /// Drawn larger than true size: translucent, so what lies under it shows.
    enlarged: bool,
    selected: bool,
}

impl Drawn {
    /// Half the size of the backing film, points.
    fn half(&self) -> f32 {
        backing_half(&self.gauge, self.scale)
    }

    /// The boxes round everything drawn of the gauge: backing, tabs and direction arrow.
    fn boxes(&self) -> impl Iterator<Item = Rect> + '_ {
        let points = outline_points(&self.gauge, self.scale);
        self.centres
            .iter()
            .map(move |c| Rect::from_points(&points.iter().map(|p| *c + *p).collect::<Vec<_>>()))
    }

    /// Where the turn handle sits: on the reference direction, beyond the direction arrow.
    fn turn_handle(&self) -> Option<Pos2> {
        let c = *self.centres.first()?;
        let (u, _) = axes(self.gauge.angle_rad);
        let reach = self.half() + arrow_length(self.half()) + HANDLE_GAP;
        Some(c + u * reach)
    }

    /// Blocks the gauge, and on the selected one its turn handle and the line to it, so that
    /// no label covers them.
    fn block(&self, placer: &mut LabelPlacer) {
        for b in self.boxes() {
            placer.block(to_screen_rect(b));
        }
        let (Some(c), Some(h), true) = (self.centres.first(), self.turn_handle(), self.selected)
        else {
            return;
        };
        placer.block(to_screen_rect(Rect::from_center_size(
            h,
            Vec2::splat(2.0 * HANDLE_RADIUS + 4.0),
        )));
        // The line in short pieces, so that its box does not take the whole diagonal.
        for k in 0..=8 {
            let p = c.lerp(h, k as f32 / 8.0);
            placer.block(to_screen_rect(Rect::from_center_size(p, Vec2::splat(6.0))));
        }
    }
}

/// Half the size of a gauge's backing film at `scale` points per metre.
fn backing_half(g: &PlacedGauge, scale: f32) -> f32 {
    0.85 * (g.spec.grid_length_m.max(g.spec.grid_width_m) as f32) * scale
}

/// Length of the direction arrow beyond a backing of half size `half`, points.
fn arrow_length(half: f32) -> f32 {
    (0.35 * half).clamp(8.0, 14.0)
}

/// The corners of everything drawn of a gauge, from its centre: backing, solder tabs of every
/// grid, and the tip of the direction arrow.
fn outline_points(g: &PlacedGauge, scale: f32) -> Vec<Vec2> {
    let half = backing_half(g, scale);
    let len = g.spec.grid_length_m as f32 * scale;
    let wid = g.spec.grid_width_m as f32 * scale;
    let (u, v) = axes(g.angle_rad);
    let mut out: Vec<Vec2> = [(-1.0, -1.0), (1.0, -1.0), (1.0, 1.0), (-1.0, 1.0)]
        .iter()
        .map(|(p, q)| u * (p * half) + v * (q * half))
        .collect();
    out.push(u * (half + arrow_length(half)));
    for e in 0..g.element_count() {
        let (u, v) = axes(g.element_angle_rad(e));
        let back = -(0.5 + 0.08 + 0.28) * len;
        out.extend([u * back + v * (wid / 2.0), u * back - v * (wid / 2.0)]);
    }
    out
}

impl FaceView {
    /// Draws the gauges on the face (placed by [`FaceView::drawn_gauges`], already blocked
    /// for labels) and handles moving and turning them; their ids go at the first free place.
    pub(super) fn gauges_ui(
        &mut self,
        ui: &mut egui::Ui,
        scene: &Scene,
        view: View,
        drawn: &[Drawn],
        placer: &mut LabelPlacer,
        out: &mut Vec<Command>,
    ) {
        let painter = &ui.painter_at(view.area);
        // The selected gauge last, so it lies on top.
        let order = drawn
            .iter()
            .filter(|d| !d.selected)
            .chain(drawn.iter().filter(|d| d.selected));
        for d in order {
            for c in &d.centres {
                gauge_shape_ui(painter, *c, &d.gauge, d.scale, d.selected, d.enlarged);
            }
        }
        for d in drawn {
            self.gauge_handle_ui(ui, scene, view, d, out);
        }
        // The turn handle last, so it stays on top of any gauge it lies over.
        for d in drawn.iter().filter(|d| d.selected) {
            self.turn_handle_ui(ui, painter, scene, d, out);
        }
        for d in drawn {
            for b in d.boxes() {
                let ink = if d.selected { SELECTED } else { GRID_INK };
                pill_label_ui(painter, b, &d.gauge.id, placer, ink);
            }
        }
    }

    /// Keeps every gauge of the face, and the selected one's turn handle, clear of labels.
    pub(super) fn block_gauges(drawn: &[Drawn], placer: &mut LabelPlacer) {
        for d in drawn {
            d.block(placer);
        }
    }

    /// The gauges of this face where they are drawn, with a gauge being dragged or turned at
    /// its draft place.
    pub(super) fn drawn_gauges(&self, scene: &Scene, view: View) -> Vec<Drawn> {
        let k = enlargement(scene, view) as f32;
        let mut out = Vec::new();
        for (index, g) in &scene.gauges {
            let mut gauge = g.clone();
            if let Some((d, p, _)) = self.drag
                && d == *index
            {
                gauge.position = p;
            }
            if let Some((t, a)) = self.turn
                && t == *index
            {
                gauge.angle_rad = a;
            }
            if gauge.position.face != scene.face {
                continue;
            }
            let s_list = match scene.period_m {
                Some(p) => drawn_copies(gauge.position.s_m, reach_m(&gauge), scene.bounds.s_m.0, p),
                None => vec![gauge.position.s_m],
            };
            let centres = s_list
                .iter()
                .map(|s| view.pos(gauge.position.x_m, *s))
                .collect();
            out.push(Drawn {
                index: *index,
                selected: scene.sel.gauge == Some(*index),
                gauge,
                centres,
                scale: view.scale() * k,
                enlarged: k > 1.0 + 1e-6,
            });
        }
        out
    }

    /// The accessible handle of a gauge (on its copy inside the face): click selects, drag
    /// moves.
    fn gauge_handle_ui(
        &mut self,
        ui: &mut egui::Ui,
        scene: &Scene,
        view: View,
        d: &Drawn,
        out: &mut Vec<Command>,
    ) {
        let Some(centre) = d.centres.first().copied() else {
            return;
        };
        if !view.area.contains(centre) {
            return;
        }
        let reach = d.half().max(9.0);
        let handle = ui.interact(
            Rect::from_center_size(centre, Vec2::splat(2.0 * reach)),
            ui.scope_id().with(("gauge", d.index)),
            Sense::click_and_drag(),
        );
        let id = d.gauge.id.clone();
        handle.widget_info(|| {
            egui::WidgetInfo::labeled(egui::Role::Button, true, format!("Gauge {id}"))
        });
        let handle =
            handle.on_hover_text(format!("{} — drag to move, click to select", d.gauge.id));
        if handle.clicked() || handle.drag_started() {
            out.push(Command::Select(Selection {
                gauge: Some(d.index),
                ..scene.sel
            }));
        }
        if handle.drag_started() {
            let grab = handle
                .interact_pointer_pos()
                .map_or(Vec2::ZERO, |p| centre - p);
            self.drag = Some((d.index, d.gauge.position, grab));
        }
        if handle.dragged()
            && let (Some((g, p, grab)), Some(pointer)) =
                (self.drag.as_mut(), handle.interact_pointer_pos())
            && *g == d.index
        {
            let (x, s) = view.face_point(pointer + *grab);
            let candidate = snapped(scene, view, d.index, x, s);
            if let Ok(located) = scene.part.member.locate(&candidate) {
                *p = located;
            }
        }
        if handle.drag_stopped()
            && let Some((g, p, _)) = self.drag.take()
        {
            out.push(Command::MoveGauge {
                part: scene.sel.part,
                gauge: g,
                position: p,
            });
        }
    }

    /// The round handle beyond the selected gauge's direction arrow: drag to turn.
    fn turn_handle_ui(
        &mut self,
        ui: &mut egui::Ui,
        painter: &Painter,
        scene: &Scene,
        d: &Drawn,
        out: &mut Vec<Command>,
    ) {
        let (Some(centre), Some(at)) = (d.centres.first().copied(), d.turn_handle()) else {
            return;
        };
        // On the reference direction, continuing the direction arrow.
        let (u, _) = axes(d.gauge.angle_rad);
        let tip = centre + u * (d.half() + arrow_length(d.half()));
        painter.line_segment([tip, at], Stroke::new(1.5, SELECTED));
        painter.circle(
            at,
            HANDLE_RADIUS,
            Color32::WHITE,
            Stroke::new(2.0, SELECTED),
        );
        let handle = ui.interact(
            Rect::from_center_size(at, Vec2::splat(16.0)),
            ui.scope_id().with(("turn", d.index)),
            Sense::drag(),
        );
        let id = d.gauge.id.clone();
        handle.widget_info(|| {
            egui::WidgetInfo::labeled(
                egui::Role::Button,
                true,
                format!("Turn handle of gauge {id}"),
            )
        });
        let handle =
            handle.on_hover_text("Drag to turn the gauge: 5° steps, hold Shift for any angle");
        if handle.dragged()
            && let Some(p) = handle.interact_pointer_pos()
        {
            let v = p - centre;
            if v.length() > 2.0 {
                let deg = (-v.y as f64).atan2(v.x as f64).to_degrees();
                let free = ui.input(|i| i.modifiers.shift);
                let deg = if free { deg } else { snap_angle_deg(deg, 5.0) };
                self.turn = Some((d.index, deg.to_radians()));
            }
        }
        if handle.drag_stopped()
            && let Some((g, a)) = self.turn.take()
        {
            out.push(Command::SetGaugeAngle {
                part: scene.sel.part,
                gauge: g,
                angle_rad: a,
            });
        }
    }
}

/// A dragged gauge's place: x to stations (other gauges, the datum, load points), s to the
/// centre line (on round faces the top, bottom and side lines), within a few points; else
/// both to 0.5 mm.
fn snapped(scene: &Scene, view: View, gauge: usize, x: f64, s: f64) -> SurfacePoint {
    let reach = (SNAP_REACH_PX / view.window.px_per_m).min(0.005);
    let mut stations: Vec<f64> = scene
        .part
        .gauges
        .iter()
        .enumerate()
        .filter(|(k, _)| *k != gauge)
        .map(|(_, o)| o.position.x_m)
        .collect();
    stations.push(scene.part.datum_m.0);
    if let Member::Beam(b) = &scene.part.member {
        stations.extend(b.load_points.iter().map(|p| p.position_m));
    }
    let lines: Vec<f64> = match scene.radius_m() {
        Some(r) => (-4..=4)
            .map(|k| k as f64 * PI * r / 2.0)
            .map(|l| scene.drawn_s(l))
            .collect(),
        None => vec![(scene.extent.s_range_m.0 + scene.extent.s_range_m.1) / 2.0],
    };
    SurfacePoint::new(
        scene.face,
        snap_coordinate(x, 0.0005, &stations, reach),
        snap_coordinate(s, 0.0005, &lines, reach),
    )
}

/// Draws one gauge at `centre`: backing, each grid with its serpentine lines and solder tabs
/// at its start, and the direction arrow: the gauge's reference direction (its angle), drawn
/// the same way for every pattern. An enlarged gauge is translucent, so the features it lies
/// over stay visible.
fn gauge_shape_ui(
    painter: &Painter,
    centre: Pos2,
    g: &PlacedGauge,
    scale: f32,
    selected: bool,
    enlarged: bool,
) {
    let len = g.spec.grid_length_m as f32 * scale;
    let wid = g.spec.grid_width_m as f32 * scale;
    let (u, v) = axes(g.angle_rad);
    let half = backing_half(g, scale);
    let backing: Vec<Pos2> = [(-1.0, -1.0), (1.0, -1.0), (1.0, 1.0), (-1.0, 1.0)]
        .iter()
        .map(|(p, q)| centre + u * (p * half) + v * (q * half))
        .collect();
    let outline = if selected {
        Stroke::new(2.0, SELECTED)
    } else {
        Stroke::new(1.0, Color32::from_rgba_unmultiplied(30, 30, 36, 120))
    };
    let (film, ink) = if enlarged {
        (BACKING.gamma_multiply(0.45), GRID_INK.gamma_multiply(0.75))
    } else {
        (BACKING, GRID_INK)
    };
    painter.add(Shape::convex_polygon(backing, film, outline));
    for e in 0..g.element_count() {
        let (u, v) = axes(g.element_angle_rad(e));
        grid_ui(painter, centre, u, v, len, wid, ink);
    }
    let arrow_ink = if selected { SELECTED } else { GRID_INK };
    let base = centre + u * half;
    let tip = centre + u * (half + arrow_length(half));
    let side = v * (0.45 * arrow_length(half));
    painter.add(Shape::convex_polygon(
        vec![tip, base + side, base - side],
        arrow_ink,
        Stroke::NONE,
    ));
}

/// Screen directions of a grid's axis (u) and across it (v), for an angle counter-clockwise
/// from local x seen from outside (screen y runs down).
fn axes(angle_rad: f64) -> (Vec2, Vec2) {
    let (s, c) = (angle_rad.sin() as f32, angle_rad.cos() as f32);
    (vec2(c, -s), vec2(-s, -c))
}

/// One grid: serpentine lines along u, tabs beyond the −u end.
fn grid_ui(painter: &Painter, c: Pos2, u: Vec2, v: Vec2, len: f32, wid: f32, ink: Color32) {
    // An even number of lines, so the grid starts and ends at the tab end.
    let n = 2 * ((wid / 5.0).clamp(2.0, 4.0) as usize);
    let at = |along: f32, across: f32| c + u * along + v * across;
    let across = |i: usize| -wid / 2.0 + wid * (i as f32 + 0.5) / n as f32;
    let mut path = Vec::with_capacity(2 * n + 2);
    for i in 0..n {
        let (from, to) = if i % 2 == 0 {
            (-len / 2.0, len / 2.0)
        } else {
            (len / 2.0, -len / 2.0)
        };
        path.push(at(from, across(i)));
        path.push(at(to, across(i)));
    }
    let width = if len > 40.0 { 1.4 } else { 1.0 };
    painter.add(Shape::line(path, Stroke::new(width, ink)));
    // Solder tabs: two pads beyond the start of the grid, joined to the first and last lines.
    let tab_len = 0.28 * len;
    let tab_wid = 0.38 * wid;
    let start = -len / 2.0 - 0.08 * len;
    for (side, line) in [(-1.0, 0), (1.0, n - 1)] {
        let mid = side * (wid / 2.0 - tab_wid / 2.0);
        let pad: Vec<Pos2> = [(0.0, -0.5), (-1.0, -0.5), (-1.0, 0.5), (0.0, 0.5)]
            .iter()
            .map(|(p, q)| at(start + p * tab_len, mid + q * tab_wid))
            .collect();
        painter.add(Shape::convex_polygon(pad, TABS, Stroke::new(0.8, ink)));
        painter.line_segment(
            [at(-len / 2.0, across(line)), at(start, mid)],
            Stroke::new(width, ink),
        );
    }
}
