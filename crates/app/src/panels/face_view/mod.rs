//! The face view: one face of the part drawn to scale, where gauges are placed, moved and
//! turned. Round faces are unrolled with the seam away from the gauges. Around the face: rulers,
//! a scale bar, the neighbouring faces and ends at each edge, supports and load points, and an
//! overview strip of the whole face. On it: the colour map with contours and principal
//! directions, the gauges with their grids and solder tabs, and what the cursor is over.
//!
//! Layout, snapping and label placement are pure functions in
//! [`gw_plan::drawing::face_layout`]; this module draws and turns input into commands.

mod edges;
mod gauges;
mod map_layer;
mod readout;
mod rulers;
mod toolbar;

use std::f64::consts::TAU;
use std::sync::Arc;

use egui::{Pos2, Rect, pos2, vec2};
use gw_bridge::{GaugePattern, PlacedGauge};
use gw_mechanics::imported::OutlineEdge;
use gw_mechanics::{Face, FaceExtent, LoadVector, Member, SurfacePoint};
use gw_plan::Part;
use gw_plan::drawing::face_layout::{
    FaceBounds, FaceWindow, FitKind, LabelPlacer, ScreenRect, seam_angle, wrap_into,
};

use super::map::MapSettings;
use crate::command::Command;
use crate::state::{DocumentState, Selection};
use crate::units::{Quantity, Units};

/// Width of the band beyond each edge of the face that names its neighbour, points.
const BAND: f32 = 20.0;
/// Space kept round the face when it is fitted to the canvas: the band and a gap.
const FIT_MARGIN: f32 = BAND + 8.0;
/// Height of the ruler along the top, points.
const TOP_RULER: f32 = 20.0;
/// Width of the rulers at the left and (round faces) right, points.
const SIDE_RULER: f32 = 46.0;
/// Height of what is drawn below the canvas: overview strip, readout, legend, selection line.
const BELOW_CANVAS: f32 = 172.0;

/// How a window was fitted and to which drawing-area size; `None` when the user zoomed or
/// panned.
type Fitted = Option<(FitKind, egui::Vec2)>;

/// What an imported face's outline was found for: part, face and the surface's digest.
type OutlineKey = (usize, Face, u64);

/// View state of the face view.
pub struct FaceView {
    face: Option<Face>,
    pattern: GaugePattern,
    map: Option<map_layer::MapLayer>,
    /// A gauge being dragged: its index, draft place and the grab offset from its centre.
    drag: Option<(usize, SurfacePoint, egui::Vec2)>,
    /// A gauge being turned (handle or typed angle): its index and draft angle.
    turn: Option<(usize, f64)>,
    /// The gauge selected when the face was last chosen: selecting another gauge shows its face.
    followed: Option<(usize, usize)>,
    /// The part shown last: another part opens on the face of its first gauge.
    shown_part: Option<usize>,
    /// The window onto the face, for (part, face), with how and to which drawing-area size
    /// it was fitted (`None` once the user zoomed or panned: it is kept as they left it, else
    /// it is fitted again the same way when the size changes).
    window: Option<((usize, Face), FaceWindow, Fitted)>,
    /// The seam of a round face, degrees, for (part, face, gauges on the face).
    seam: Option<((usize, Face, usize), f64)>,
    /// A change of window asked for by a button, done once the canvas is laid out.
    request: Option<ViewRequest>,
    /// The outline of the imported face shown, for (part, face, the surface's digest).
    outline: Option<(OutlineKey, Arc<Vec<OutlineEdge>>)>,
}

/// A change of window asked for by a button.
#[derive(Debug, Clone, Copy, PartialEq)]
enum ViewRequest {
    /// Show the whole face.
    WholeFace,
    /// Centre on the selected gauge, close enough to see its grids.
    Selection,
}

impl Default for FaceView {
    fn default() -> Self {
        Self {
            face: None,
            pattern: GaugePattern::SingleGrid,
            map: None,
            drag: None,
            turn: None,
            followed: None,
            shown_part: None,
            window: None,
            seam: None,
            request: None,
            outline: None,
        }
    }
}

/// What one frame of the face view draws: the part, the face and how it is unrolled.
struct Scene<'a> {
    doc: &'a DocumentState,
    sel: Selection,
    part: &'a Part,
    face: Face,
    extent: FaceExtent,
    /// The face as drawn (on round faces one period from the seam).
    bounds: FaceBounds,
    /// Circumference of a round face, metres.
    period_m: Option<f64>,
    /// Seam of a round face, degrees from the top line.
    seam_deg: f64,
    loads: LoadVector,
    units: Units,
    /// Every gauge of the part that resolves, with its index in the part's list.
    gauges: Vec<(usize, PlacedGauge)>,
    /// The true outline of a face of an imported part (empty for closed-form faces, which fill
    /// their bounds).
    outline: Arc<Vec<OutlineEdge>>,
}

impl Scene<'_> {
    /// Radius of a round face, metres.
    fn radius_m(&self) -> Option<f64> {
        self.period_m.map(|p| p / TAU)
    }

    /// A stored `s` where it is drawn (round faces: inside the drawn period).
    fn drawn_s(&self, s_m: f64) -> f64 {
        match self.period_m {
            Some(p) => wrap_into(s_m, self.bounds.s_m.0, p),
            None => s_m,
        }
    }

    /// A length in display units.
    fn length(&self, v_m: f64) -> String {
        self.units.format(Quantity::Length, v_m)
    }

    /// Display units per metre of length.
    fn units_per_m(&self) -> f64 {
        self.units.to_display(Quantity::Length, 1.0)
    }

    /// The gauges on this face.
    fn on_face(&self) -> impl Iterator<Item = &(usize, PlacedGauge)> {
        self.gauges
            .iter()
            .filter(|(_, g)| g.position.face == self.face)
    }
}

/// Where the face sits on screen this frame.
#[derive(Debug, Clone, Copy)]
struct View {
    /// The drawing area (inside the rulers).
    area: Rect,
    window: FaceWindow,
}

impl View {
    fn canvas(&self) -> ScreenRect {
        to_screen_rect(self.area)
    }

    /// Screen point of face point (x, s).
    fn pos(&self, x_m: f64, s_m: f64) -> Pos2 {
        let [x, y] = self.window.to_screen(&self.canvas(), x_m, s_m);
        pos2(x, y)
    }

    /// Face point under a screen point.
    fn face_point(&self, p: Pos2) -> (f64, f64) {
        self.window.to_face(&self.canvas(), [p.x, p.y])
    }

    /// Screen rectangle of a face-coordinate box.
    fn rect(&self, (x0, x1): (f64, f64), (s0, s1): (f64, f64)) -> Rect {
        Rect::from_two_pos(self.pos(x0, s0), self.pos(x1, s1))
    }

    /// Screen rectangle of the whole face as drawn.
    fn face_rect(&self, b: &FaceBounds) -> Rect {
        self.rect(b.x_m, b.s_m)
    }

    /// Screen points per metre.
    fn scale(&self) -> f32 {
        self.window.px_per_m as f32
    }
}

fn to_screen_rect(r: Rect) -> ScreenRect {
    ScreenRect {
        min: [r.min.x, r.min.y],
        max: [r.max.x, r.max.y],
    }
}

fn to_rect(r: &ScreenRect) -> Rect {
    Rect::from_min_max(pos2(r.min[0], r.min[1]), pos2(r.max[0], r.max[1]))
}

impl FaceView {
    /// Shows `face` of part `part` next time the view draws.
    pub fn show_face(&mut self, part: usize, face: Face) {
        self.face = Some(face);
        self.shown_part = Some(part);
    }

    /// Draws the face view.
    pub fn face_ui(
        &mut self,
        ui: &mut egui::Ui,
        doc: &DocumentState,
        settings: &mut MapSettings,
        out: &mut Vec<Command>,
    ) {
        let Some(part) = doc.project.parts.get(doc.selection.part) else {
            return;
        };
        let Some(scene) = self.scene(doc, part) else {
            ui.label("This part has no face a gauge can be placed on.");
            return;
        };
        // Toolbar, canvas, then what goes below it.
        let shown = self.shown();
        self.toolbar_ui(ui, &scene, settings, shown, out);
        let avail = ui.available_size();
        let height = (avail.y - BELOW_CANVAS).max(160.0);
        let (full, response) =
            ui.allocate_exact_size(vec2(avail.x, height), egui::Sense::click_and_drag());
        let view = self.view(&scene, full);
        self.map_layer(ui, &scene, settings);
        self.navigate(ui, &response, &scene, view);
        let view = self.view(&scene, full);
        self.canvas_ui(ui, &scene, settings, view, &response, out);
        self.overview_ui(ui, &scene, view);
        self.readout_ui(ui, &scene, settings, view, &response);
    }

    /// Everything drawn on the canvas, in order from the map up to the labels.
    fn canvas_ui(
        &mut self,
        ui: &mut egui::Ui,
        scene: &Scene,
        settings: &MapSettings,
        view: View,
        response: &egui::Response,
        out: &mut Vec<Command>,
    ) {
        let painter = ui.painter_at(view.area);
        painter.rect_filled(view.area, 0.0, ui.visuals().extreme_bg_color);
        if let Some(layer) = &self.map {
            layer.paint(&painter, scene, view);
        }
        map_layer::principal_marks_ui(&painter, scene, settings, view);
        // Gauges are placed (and kept clear of labels) before anything is labelled.
        let mut placer = LabelPlacer::new(to_screen_rect(view.area.shrink(2.0)));
        let drawn = self.drawn_gauges(scene, view);
        Self::block_gauges(&drawn, &mut placer);
        edges::edges_ui(ui, &painter, scene, view, &mut placer);
        self.gauges_ui(ui, scene, view, &drawn, &mut placer, out);
        edges::over_gauges_ui(ui, &painter, scene, view);
        if response.clicked() {
            out.push(Command::Select(Selection {
                gauge: None,
                ..scene.sel
            }));
        }
        rulers::rulers_ui(ui, scene, view);
    }

    /// The face to show, the seam of a round face and the gauges, or `None` for a member with
    /// no face.
    fn scene<'a>(&mut self, doc: &'a DocumentState, part: &'a Part) -> Option<Scene<'a>> {
        let sel = doc.selection;
        let gauges: Vec<(usize, PlacedGauge)> = part
            .gauges
            .iter()
            .enumerate()
            .filter_map(|(i, g)| g.resolve(&doc.project.gauge_stock).map(|p| (i, p)))
            .collect();
        if self.shown_part != Some(sel.part) {
            self.shown_part = Some(sel.part);
            self.face = gauges.first().map(|(_, g)| g.position.face);
        }
        // A gauge selected anywhere (tree, finding, canvas) brings its face into view.
        let selected = sel.gauge.map(|g| (sel.part, g));
        let newly_selected = selected != self.followed;
        if newly_selected {
            self.followed = selected;
            if let Some((_, g)) = gauges.iter().find(|(i, _)| Some(*i) == sel.gauge) {
                self.face = Some(g.position.face);
            }
        }
        let faces = part.member.faces();
        let extent = faces
            .iter()
            .find(|e| Some(e.face) == self.face)
            .or(faces.first())
            .copied()?;
        self.face = Some(extent.face);
        let period_m = extent
            .wraps
            .then_some(extent.s_range_m.1 - extent.s_range_m.0)
            .filter(|p| p.is_finite() && *p > 0.0);
        let seam_deg = self.seam_deg(sel.part, &extent, period_m, &gauges);
        let bounds = FaceBounds {
            x_m: extent.x_range_m,
            s_m: match period_m {
                Some(p) => {
                    let start = seam_deg.to_radians() * p / TAU;
                    (start, start + p)
                }
                None => extent.s_range_m,
            },
        };
        let loads = part
            .load_cases
            .get(sel.case)
            .map(|c| c.load_vector())
            .unwrap_or_default();
        if newly_selected {
            // Forget the window if the selected gauge is not in it, so the view comes to it.
            self.forget_window_unless_showing(sel.gauge, &gauges);
        }
        let outline = self.outline_of(sel.part, part, extent.face);
        Some(Scene {
            doc,
            sel,
            part,
            outline,
            face: extent.face,
            extent,
            bounds,
            period_m,
            seam_deg,
            loads,
            units: doc.units,
            gauges,
        })
    }

    /// The outline of face `face` of an imported part, kept while the part, face and surface
    /// stay the same (finding it walks the whole surface); empty for closed-form faces.
    fn outline_of(&mut self, index: usize, part: &Part, face: Face) -> Arc<Vec<OutlineEdge>> {
        let (Member::ImportedField(m), Face::Patch(k)) = (&part.member, face) else {
            return Arc::default();
        };
        let Some(field) = m.surface() else {
            return Arc::default();
        };
        let key = (index, face, field.digest());
        match &self.outline {
            Some((kept, edges)) if *kept == key => edges.clone(),
            _ => {
                let edges = Arc::new(field.outline(usize::from(k)));
                self.outline = Some((key, edges.clone()));
                edges
            }
        }
    }

    /// The seam of a round face: kept while the gauges on the face stay clear of it, chosen
    /// again (in the largest gap between them) when the face opens, a gauge is added or
    /// removed, or a gauge comes within its own size of the seam. Not while one is dragged.
    fn seam_deg(
        &mut self,
        part: usize,
        extent: &FaceExtent,
        period_m: Option<f64>,
        gauges: &[(usize, PlacedGauge)],
    ) -> f64 {
        let Some(period) = period_m else {
            return 0.0;
        };
        let radius = period / TAU;
        let on_face: Vec<&PlacedGauge> = gauges
            .iter()
            .map(|(_, g)| g)
            .filter(|g| g.position.face == extent.face)
            .collect();
        let key = (part, extent.face, on_face.len());
        if let Some((k, seam)) = self.seam
            && (k == key || self.drag.is_some())
        {
            let start = seam.to_radians() * radius;
            let clear = on_face.iter().all(|g| {
                let s = wrap_into(g.position.s_m, start, period);
                let reach = gauges::reach_m(g);
                s - start >= reach && start + period - s >= reach
            });
            if clear || self.drag.is_some() {
                return seam;
            }
        }
        let angles: Vec<f64> = on_face.iter().map(|g| g.position.s_m / radius).collect();
        let seam = seam_angle(&angles).to_degrees();
        self.seam = Some((key, seam));
        seam
    }

    fn forget_window_unless_showing(
        &mut self,
        gauge: Option<usize>,
        gauges: &[(usize, PlacedGauge)],
    ) {
        let Some((_, g)) = gauges.iter().find(|(i, _)| Some(*i) == gauge) else {
            return;
        };
        if let Some(((_, face), w, _)) = self.window
            && face == g.position.face
        {
            // The window's last canvas is not known here; half a window either way is what the
            // narrowest canvas (about 400 points) shows.
            let half = 200.0 / w.px_per_m;
            if (g.position.x_m - w.centre_x_m).abs() < half {
                return;
            }
        }
        self.window = None;
    }

    /// The drawing area and window for the canvas rectangle `full`.
    fn view(&mut self, scene: &Scene, full: Rect) -> View {
        let right = if scene.period_m.is_some() {
            SIDE_RULER
        } else {
            0.0
        };
        let area = Rect::from_min_max(
            full.min + vec2(SIDE_RULER, TOP_RULER),
            full.max - vec2(right, 0.0),
        );
        let key = (scene.sel.part, scene.face);
        let size = area.size();
        let window = match self.window {
            Some((k, w, fitted)) if k == key && fitted.is_none_or(|(_, f)| f == size) => w,
            Some((k, _, Some((kind, _)))) if k == key => self.fit(scene, area, kind),
            _ => self.fit(scene, area, FitKind::Opening),
        };
        View { area, window }
    }

    /// Fits the window onto the drawing `area` the way `kind` says, and keeps it.
    fn fit(&mut self, scene: &Scene, area: Rect, kind: FitKind) -> FaceWindow {
        let focus = self.focus_x(scene);
        let w = kind.window(&scene.bounds, &to_screen_rect(area), FIT_MARGIN, focus);
        self.window = Some(((scene.sel.part, scene.face), w, Some((kind, area.size()))));
        w
    }

    /// Where a fitted window centres along x: the selected gauge, else the middle of the
    /// gauges on the face.
    fn focus_x(&self, scene: &Scene) -> Option<f64> {
        if let Some((_, g)) = scene.on_face().find(|(i, _)| Some(*i) == scene.sel.gauge) {
            return Some(g.position.x_m);
        }
        let xs: Vec<f64> = scene.on_face().map(|(_, g)| g.position.x_m).collect();
        let (lo, hi) = xs
            .iter()
            .fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), x| {
                (lo.min(*x), hi.max(*x))
            });
        (!xs.is_empty()).then_some((lo + hi) / 2.0)
    }

    /// Sets the window onto the current face, as the user asked.
    fn set_window(&mut self, scene: &Scene, window: FaceWindow) {
        self.window = Some((
            (scene.sel.part, scene.face),
            window.clamped(&scene.bounds),
            None,
        ));
    }

    /// The window shown last.
    fn shown(&self) -> Option<FaceWindow> {
        self.window.map(|(_, w, _)| w)
    }
}
