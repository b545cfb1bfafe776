//! Gauges on the face: drawn to scale (or at a minimum size, the same enlargement for all)
//! with their grid lines, solder tabs at one end and a direction mark at the other; each an
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

/// One gauge as drawn this frame.
struct Drawn {
    index: usize,
    gauge: PlacedGauge,
    /// Screen centres: the first inside the drawn face, a second beyond the far edge when the
    /// gauge lies on the seam.
    centres: Vec<Pos2>,
    /// Screen points per metre of the drawing (true scale × enlargement).
    scale: f32,
    selected: bool,
}

impl Drawn {
    /// Half the drawn size, points.
    fn half(&self) -> f32 {
        0.85 * (self
            .gauge
            .spec
            .grid_length_m
            .max(self.gauge.spec.grid_width_m) as f32)
            * self.scale
    }

    fn boxes(&self) -> impl Iterator<Item = Rect> + '_ {
        let h = self.half();
        self.centres
            .iter()
            .map(move |c| Rect::from_center_size(*c, Vec2::splat(2.0 * h)))
    }

    /// Where the turn handle sits: beyond the direction mark.
    fn turn_handle(&self) -> Option<Pos2> {
        let c = *self.centres.first()?;
        let a = self.gauge.angle_rad;
        Some(c + vec2(a.cos() as f32, -(a.sin() as f32)) * (self.half() + 16.0))
    }
}

impl FaceView {
    /// Draws the gauges on the face and handles moving and turning them.
    pub(super) fn gauges_ui(
        &mut self,
        ui: &mut egui::Ui,
        painter: &Painter,
        scene: &Scene,
        view: View,
        placer: &mut LabelPlacer,
        out: &mut Vec<Command>,
    ) {
        let drawn = self.drawn_gauges(scene, view);
        for d in &drawn {
            for b in d.boxes() {
                placer.block(to_screen_rect(b));
            }
            if d.selected
                && let Some(h) = d.turn_handle()
            {
                placer.block(to_screen_rect(Rect::from_center_size(h, Vec2::splat(14.0))));
            }
        }
        // The selected gauge last, so it lies on top.
        let order = drawn
            .iter()
            .filter(|d| !d.selected)
            .chain(drawn.iter().filter(|d| d.selected));
        for d in order {
            for c in &d.centres {
                gauge_shape_ui(painter, *c, &d.gauge, d.scale, d.selected);
            }
        }
        for d in &drawn {
            self.gauge_handle_ui(ui, scene, view, d, out);
        }
        // The turn handle last, so it stays on top of any gauge it lies over.
        for d in drawn.iter().filter(|d| d.selected) {
            self.turn_handle_ui(ui, painter, scene, d, out);
        }
        for d in &drawn {
            for b in d.boxes() {
                let ink = if d.selected { SELECTED } else { GRID_INK };
                pill_label_ui(painter, b, &d.gauge.id, placer, ink);
            }
        }
    }

    /// The gauges of this face where they are drawn, with a gauge being dragged or turned at
    /// its draft place.
    fn drawn_gauges(&self, scene: &Scene, view: View) -> Vec<Drawn> {
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

    /// The round handle beyond the selected gauge's direction mark: drag to turn.
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
        painter.line_segment([centre, at], Stroke::new(1.0, SELECTED));
        painter.circle(at, 6.0, Color32::WHITE, Stroke::new(2.0, SELECTED));
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

/// Draws one gauge at `centre`: backing, then each grid with its serpentine lines, solder tabs
/// at its start and, for the reference grid, a direction mark at its far end.
fn gauge_shape_ui(painter: &Painter, centre: Pos2, g: &PlacedGauge, scale: f32, selected: bool) {
    let len = g.spec.grid_length_m as f32 * scale;
    let wid = g.spec.grid_width_m as f32 * scale;
    let a = g.angle_rad;
    let (u, v) = axes(a);
    let half = 0.85 * len.max(wid);
    let backing: Vec<Pos2> = [(-1.0, -1.0), (1.0, -1.0), (1.0, 1.0), (-1.0, 1.0)]
        .iter()
        .map(|(p, q)| centre + u * (p * half) + v * (q * half))
        .collect();
    let outline = if selected {
        Stroke::new(2.0, SELECTED)
    } else {
        Stroke::new(1.0, Color32::from_rgba_unmultiplied(30, 30, 36, 120))
    };
    painter.add(Shape::convex_polygon(backing, BACKING, outline));
    for e in 0..g.element_count() {
        let (u, v) = axes(g.element_angle_rad(e));
        grid_ui(painter, centre, u, v, len, wid, e == 0);
    }
}

/// Screen directions of a grid's axis (u) and across it (v), for an angle counter-clockwise
/// from local x seen from outside (screen y runs down).
fn axes(angle_rad: f64) -> (Vec2, Vec2) {
    let (s, c) = (angle_rad.sin() as f32, angle_rad.cos() as f32);
    (vec2(c, -s), vec2(-s, -c))
}

/// One grid: serpentine lines along u, tabs beyond the −u end, a mark beyond the +u end of
/// the reference grid.
fn grid_ui(painter: &Painter, c: Pos2, u: Vec2, v: Vec2, len: f32, wid: f32, reference: bool) {
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
    painter.add(Shape::line(path, Stroke::new(width, GRID_INK)));
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
        painter.add(Shape::convex_polygon(pad, TABS, Stroke::new(0.8, GRID_INK)));
        painter.line_segment(
            [at(-len / 2.0, across(line)), at(start, mid)],
            Stroke::new(width, GRID_INK),
        );
    }
    if reference {
        let tip = at(len / 2.0 + 0.42 * len, 0.0);
        let base = at(len / 2.0 + 0.14 * len, 0.0);
        let side = v * (0.14 * len);
        painter.add(Shape::convex_polygon(
            vec![tip, base + side, base - side],
            GRID_INK,
            Stroke::NONE,
        ));
    }
}
