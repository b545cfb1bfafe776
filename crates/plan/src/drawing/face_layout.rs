//! Layout of one face drawn to scale: the window onto the face (fit, zoom about a point, pan),
//! ruler ticks and the scale bar, the seam of an unrolled round face, what lies beyond each
//! edge, snapping while a gauge is dragged or turned, the smallest drawn gauge size, and label
//! placement without collisions.
//!
//! Conventions: face coordinates are metres (`x` along the member, `s` across the face, as in
//! [`gw_mechanics::SurfacePoint`]); screen coordinates are pixels with y running down. The face
//! is drawn as seen from outside, so `x` runs right and `s` runs up on screen. On an unrolled
//! round face the drawn `s` runs over one period starting at the seam and may leave the range
//! the member reports; [`wrap_into`] brings a stored `s` into the drawn range.

use std::f64::consts::{PI, TAU};

use gw_mechanics::{BeamSupport, Face, LoadComponent, Member, Section, VesselEnds};

/// An axis-aligned rectangle on screen, pixels (y down).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ScreenRect {
    /// Top-left corner.
    pub min: [f32; 2],
    /// Bottom-right corner.
    pub max: [f32; 2],
}

impl ScreenRect {
    /// A rectangle from its top-left corner and size.
    pub fn from_min_size(min: [f32; 2], size: [f32; 2]) -> Self {
        Self {
            min,
            max: [min[0] + size[0], min[1] + size[1]],
        }
    }

    /// Width.
    pub fn width(&self) -> f32 {
        self.max[0] - self.min[0]
    }

    /// Height.
    pub fn height(&self) -> f32 {
        self.max[1] - self.min[1]
    }

    /// Centre point.
    pub fn centre(&self) -> [f32; 2] {
        [
            (self.min[0] + self.max[0]) / 2.0,
            (self.min[1] + self.max[1]) / 2.0,
        ]
    }

    /// True when the two rectangles share some area (touching edges do not count).
    pub fn overlaps(&self, other: &ScreenRect) -> bool {
        self.min[0] < other.max[0]
            && other.min[0] < self.max[0]
            && self.min[1] < other.max[1]
            && other.min[1] < self.max[1]
    }

    /// True when `other` lies wholly inside this rectangle.
    pub fn contains_rect(&self, other: &ScreenRect) -> bool {
        other.min[0] >= self.min[0]
            && other.min[1] >= self.min[1]
            && other.max[0] <= self.max[0]
            && other.max[1] <= self.max[1]
    }

    /// The rectangle grown by `margin` on every side.
    pub fn expand(&self, margin: f32) -> Self {
        Self {
            min: [self.min[0] - margin, self.min[1] - margin],
            max: [self.max[0] + margin, self.max[1] + margin],
        }
    }
}

/// The drawn extent of a face: `x` range and drawn `s` range, metres.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FaceBounds {
    /// Range of `x`, metres.
    pub x_m: (f64, f64),
    /// Range of drawn `s`, metres (on a round face: one period from the seam).
    pub s_m: (f64, f64),
}

impl FaceBounds {
    /// Length along x, metres.
    pub fn length_m(&self) -> f64 {
        self.x_m.1 - self.x_m.0
    }

    /// Width across (s), metres.
    pub fn width_m(&self) -> f64 {
        self.s_m.1 - self.s_m.0
    }

    fn centre(&self) -> (f64, f64) {
        (
            (self.x_m.0 + self.x_m.1) / 2.0,
            (self.s_m.0 + self.s_m.1) / 2.0,
        )
    }
}

/// A face drawn whole is "a strip" when it would fill less than this fraction of the canvas
/// height; the view then fits the face's width to the height and shows a window along x.
pub const STRIP_FRACTION: f64 = 0.6;

/// Largest zoom: pixels per metre (0.4 px per µm, a 3 mm grid over 1000 px).
pub const MAX_PX_PER_M: f64 = 4e5;

/// The window onto a face: which face point sits at the canvas centre, and the scale.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FaceWindow {
    /// Face x at the canvas centre, metres.
    pub centre_x_m: f64,
    /// Face s (drawn) at the canvas centre, metres.
    pub centre_s_m: f64,
    /// Scale, pixels per metre.
    pub px_per_m: f64,
}

impl FaceWindow {
    /// Screen point of face point (x, s) on `canvas`.
    pub fn to_screen(&self, canvas: &ScreenRect, x_m: f64, s_m: f64) -> [f32; 2] {
        let [cx, cy] = canvas.centre();
        [
            cx + ((x_m - self.centre_x_m) * self.px_per_m) as f32,
            cy - ((s_m - self.centre_s_m) * self.px_per_m) as f32,
        ]
    }

    /// Face point (x, s) under screen point `p` on `canvas`.
    pub fn to_face(&self, canvas: &ScreenRect, p: [f32; 2]) -> (f64, f64) {
        let [cx, cy] = canvas.centre();
        (
            self.centre_x_m + (p[0] - cx) as f64 / self.px_per_m,
            self.centre_s_m - (p[1] - cy) as f64 / self.px_per_m,
        )
    }

    /// The window zoomed by `factor` with the face point under `cursor` kept where it is,
    /// the scale kept between `min_px_per_m` and [`MAX_PX_PER_M`].
    pub fn zoomed_about(
        &self,
        canvas: &ScreenRect,
        cursor: [f32; 2],
        factor: f64,
        min_px_per_m: f64,
    ) -> Self {
        if !(factor.is_finite() && factor > 0.0) {
            return *self;
        }
        let (x, s) = self.to_face(canvas, cursor);
        let px_per_m = (self.px_per_m * factor).clamp(min_px_per_m.min(MAX_PX_PER_M), MAX_PX_PER_M);
        let k = self.px_per_m / px_per_m;
        Self {
            centre_x_m: x + (self.centre_x_m - x) * k,
            centre_s_m: s + (self.centre_s_m - s) * k,
            px_per_m,
        }
    }

    /// The window moved so that the drawing follows the pointer by `(dx, dy)` pixels.
    pub fn panned(&self, dx_px: f32, dy_px: f32) -> Self {
        Self {
            centre_x_m: self.centre_x_m - dx_px as f64 / self.px_per_m,
            centre_s_m: self.centre_s_m + dy_px as f64 / self.px_per_m,
            ..*self
        }
    }

    /// The window with its centre kept on the face, so the face never leaves the canvas.
    pub fn clamped(&self, bounds: &FaceBounds) -> Self {
        let clamp = |v: f64, (a, b): (f64, f64)| {
            if v.is_finite() {
                v.clamp(a.min(b), a.max(b))
            } else {
                (a + b) / 2.0
            }
        };
        Self {
            centre_x_m: clamp(self.centre_x_m, bounds.x_m),
            centre_s_m: clamp(self.centre_s_m, bounds.s_m),
            px_per_m: self.px_per_m,
        }
    }

    /// The face range visible on `canvas`: (x range, s range), metres.
    pub fn visible(&self, canvas: &ScreenRect) -> ((f64, f64), (f64, f64)) {
        let (x0, s1) = self.to_face(canvas, canvas.min);
        let (x1, s0) = self.to_face(canvas, canvas.max);
        ((x0, x1), (s0, s1))
    }

    /// True when the whole face is on `canvas`.
    pub fn shows_whole(&self, canvas: &ScreenRect, bounds: &FaceBounds) -> bool {
        let ((x0, x1), (s0, s1)) = self.visible(canvas);
        let tol = 1e-9 * bounds.length_m().max(bounds.width_m());
        x0 <= bounds.x_m.0 + tol
            && x1 >= bounds.x_m.1 - tol
            && s0 <= bounds.s_m.0 + tol
            && s1 >= bounds.s_m.1 - tol
    }
}

/// The scale that shows the whole face on `canvas` with `margin_px` left on every side.
pub fn whole_face_scale(bounds: &FaceBounds, canvas: &ScreenRect, margin_px: f32) -> f64 {
    let w = (canvas.width() - 2.0 * margin_px).max(1.0) as f64;
    let h = (canvas.height() - 2.0 * margin_px).max(1.0) as f64;
    let k = (w / bounds.length_m().max(1e-9)).min(h / bounds.width_m().max(1e-9));
    k.clamp(1e-6, MAX_PX_PER_M)
}

/// The whole face, centred.
pub fn whole_face_window(bounds: &FaceBounds, canvas: &ScreenRect, margin_px: f32) -> FaceWindow {
    let (centre_x_m, centre_s_m) = bounds.centre();
    FaceWindow {
        centre_x_m,
        centre_s_m,
        px_per_m: whole_face_scale(bounds, canvas, margin_px),
    }
}

/// The window a face opens with: the whole face, unless it would be a strip (less than
/// [`STRIP_FRACTION`] of the canvas height); then the face's width fills the canvas height
/// and the window along x is centred on `focus_x_m` (a gauge), kept inside the face.
pub fn fit_window(
    bounds: &FaceBounds,
    canvas: &ScreenRect,
    margin_px: f32,
    focus_x_m: Option<f64>,
) -> FaceWindow {
    let whole = whole_face_window(bounds, canvas, margin_px);
    let usable_h = (canvas.height() - 2.0 * margin_px).max(1.0) as f64;
    if bounds.width_m() * whole.px_per_m >= STRIP_FRACTION * usable_h {
        return whole;
    }
    let px_per_m = (usable_h / bounds.width_m().max(1e-9)).min(MAX_PX_PER_M);
    let half_window = (canvas.width() - 2.0 * margin_px).max(1.0) as f64 / 2.0 / px_per_m;
    let (x0, x1) = bounds.x_m;
    let focus = focus_x_m
        .filter(|x| x.is_finite())
        .unwrap_or((x0 + x1) / 2.0);
    // Keep the window on the face: its ends stop at the face's ends.
    let centre_x_m = if x1 - x0 <= 2.0 * half_window {
        (x0 + x1) / 2.0
    } else {
        focus.clamp(x0 + half_window, x1 - half_window)
    };
    FaceWindow {
        centre_x_m,
        centre_s_m: bounds.centre().1,
        px_per_m,
    }
}

/// The smallest step of 1, 2 or 5 × 10ⁿ display units whose ticks are at least
/// `min_spacing_px` apart at `px_per_unit`.
pub fn ruler_step(px_per_unit: f64, min_spacing_px: f64) -> f64 {
    let raw = min_spacing_px / px_per_unit;
    if !(raw.is_finite() && raw > 0.0) {
        return 1.0;
    }
    let mag = 10f64.powf(raw.log10().floor());
    [1.0, 2.0, 5.0, 10.0]
        .iter()
        .map(|k| k * mag)
        .find(|s| *s >= raw * (1.0 - 1e-12))
        .unwrap_or(10.0 * mag)
}

/// The multiples of `step` from `lo` to `hi` (display units), at most 1000 of them.
pub fn ruler_ticks(lo: f64, hi: f64, step: f64) -> Vec<f64> {
    if !(lo.is_finite() && hi.is_finite() && step.is_finite() && step > 0.0) {
        return Vec::new();
    }
    let (lo, hi) = (lo.min(hi), lo.max(hi));
    let first = (lo / step).ceil() as i64;
    let last = (hi / step).floor() as i64;
    if last < first || last - first > 1000 {
        return Vec::new();
    }
    (first..=last).map(|k| k as f64 * step).collect()
}

/// Angle ruler steps, degrees: the smallest of these at least `min_spacing_px` apart.
pub fn angle_step_deg(px_per_deg: f64, min_spacing_px: f64) -> f64 {
    [1.0, 2.0, 5.0, 10.0, 15.0, 30.0, 45.0, 90.0]
        .into_iter()
        .find(|s| s * px_per_deg >= min_spacing_px)
        .unwrap_or(90.0)
}

/// An angle in degrees brought into (−180°, 180°].
pub fn normalised_deg(deg: f64) -> f64 {
    let d = (deg + 180.0).rem_euclid(360.0) - 180.0;
    if d <= -180.0 { d + 360.0 } else { d }
}

/// The length of a scale bar, display units: the largest 1, 2 or 5 × 10ⁿ not longer than
/// `max_px` at `px_per_unit`.
pub fn scale_bar_length(px_per_unit: f64, max_px: f64) -> f64 {
    let raw = max_px / px_per_unit;
    if !(raw.is_finite() && raw > 0.0) {
        return 1.0;
    }
    let mag = 10f64.powf(raw.log10().floor());
    [5.0, 2.0, 1.0]
        .iter()
        .map(|k| k * mag)
        .find(|s| *s <= raw * (1.0 + 1e-12))
        .unwrap_or(mag)
}

/// Where to cut a round face open, radians from the top line: the middle of the largest
/// angular gap between the gauges at `angles_rad`, so the seam runs as far from every gauge
/// as it can. With no gauges, the bottom line (π).
pub fn seam_angle(angles_rad: &[f64]) -> f64 {
    let mut a: Vec<f64> = angles_rad
        .iter()
        .filter(|v| v.is_finite())
        .map(|v| v.rem_euclid(TAU))
        .collect();
    if a.is_empty() {
        return PI;
    }
    a.sort_by(f64::total_cmp);
    let mut best = (a[0] + TAU - a[a.len() - 1], a[a.len() - 1]);
    for w in a.windows(2) {
        let gap = w[1] - w[0];
        if gap > best.0 + 1e-12 {
            best = (gap, w[0]);
        }
    }
    let seam = (best.1 + best.0 / 2.0).rem_euclid(TAU);
    if seam > PI { seam - TAU } else { seam }
}

/// `s` brought into the drawn range `[start, start + period)`.
pub fn wrap_into(s: f64, start: f64, period: f64) -> f64 {
    if !(period.is_finite() && period > 0.0) {
        return s;
    }
    (s - start).rem_euclid(period) + start
}

/// Where a gauge at `s` is drawn on an unrolled face running from `start` over one `period`:
/// once inside the range, and a second time beyond the far edge when it lies within `reach`
/// (its own size) of the seam, so a gauge on the seam shows whole at both edges.
pub fn drawn_copies(s: f64, reach: f64, start: f64, period: f64) -> Vec<f64> {
    let s = wrap_into(s, start, period);
    let mut out = vec![s];
    if period.is_finite() && period > 0.0 {
        if s - start < reach {
            out.push(s + period);
        } else if start + period - s < reach {
            out.push(s - period);
        }
    }
    out
}

/// Gauges whose true size is under `min_px` are drawn this many times larger (at least 1).
pub fn enlargement(true_size_px: f64, min_px: f64) -> f64 {
    if true_size_px.is_finite() && true_size_px > 0.0 && true_size_px < min_px {
        min_px / true_size_px
    } else {
        1.0
    }
}

/// Snaps a dragged coordinate: to the nearest target within `reach` (stations, centre
/// lines), else to the nearest multiple of `step`.
pub fn snap_coordinate(value: f64, step: f64, targets: &[f64], reach: f64) -> f64 {
    let nearest = targets
        .iter()
        .copied()
        .filter(|t| t.is_finite() && (t - value).abs() <= reach)
        .min_by(|a, b| (a - value).abs().total_cmp(&(b - value).abs()));
    match nearest {
        Some(t) => t,
        None if step > 0.0 && step.is_finite() => (value / step).round() * step,
        None => value,
    }
}

/// An angle in degrees snapped to multiples of `step_deg`.
pub fn snap_angle_deg(deg: f64, step_deg: f64) -> f64 {
    if step_deg > 0.0 && deg.is_finite() {
        (deg / step_deg).round() * step_deg
    } else {
        deg
    }
}

/// Places labels one after another, each at the first candidate that stays inside the bounds
/// and clear of everything placed or blocked before it.
#[derive(Debug, Clone)]
pub struct LabelPlacer {
    bounds: ScreenRect,
    taken: Vec<ScreenRect>,
}

impl LabelPlacer {
    /// A placer for labels inside `bounds`.
    pub fn new(bounds: ScreenRect) -> Self {
        Self {
            bounds,
            taken: Vec::new(),
        }
    }

    /// Marks an area no label may cover (a gauge, a symbol).
    pub fn block(&mut self, area: ScreenRect) {
        self.taken.push(area);
    }

    /// True when a label at `area` would be inside the bounds and clear of the rest.
    pub fn is_free(&self, area: &ScreenRect) -> bool {
        self.bounds.contains_rect(area) && !self.taken.iter().any(|t| t.overlaps(area))
    }

    /// Places a label of `size` at the first free candidate top-left corner; `None` when
    /// every candidate collides (the caller leaves the label out rather than overlap).
    pub fn place(&mut self, size: [f32; 2], candidates: &[[f32; 2]]) -> Option<ScreenRect> {
        let area = candidates
            .iter()
            .map(|c| ScreenRect::from_min_size(*c, size))
            .find(|a| self.is_free(a))?;
        self.taken.push(area);
        Some(area)
    }
}

/// Candidate top-left corners for a label of `size` beside `anchor`: right, left, above,
/// below, the four corners, then the same again twice, farther out each time (a label placed
/// that far wants a leader line to its anchor, see [`is_beside`]).
pub fn candidates_around(anchor: &ScreenRect, size: [f32; 2], gap: f32) -> Vec<[f32; 2]> {
    let mut out = Vec::with_capacity(24);
    for g in [gap, 3.0 * gap + size[1], 6.0 * gap + 2.5 * size[1]] {
        let [cx, cy] = anchor.centre();
        let (w, h) = (size[0], size[1]);
        let right = anchor.max[0] + g;
        let left = anchor.min[0] - g - w;
        let above = anchor.min[1] - g - h;
        let below = anchor.max[1] + g;
        out.extend([
            [right, cy - h / 2.0],
            [left, cy - h / 2.0],
            [cx - w / 2.0, above],
            [cx - w / 2.0, below],
            [right, above],
            [right, below],
            [left, above],
            [left, below],
        ]);
    }
    out
}

/// True when a label at `label` touches `anchor` grown by `gap` (placed in the first ring of
/// [`candidates_around`]); a label farther away is joined to its anchor by a leader line.
pub fn is_beside(anchor: &ScreenRect, label: &ScreenRect, gap: f32) -> bool {
    anchor.expand(gap + 0.5).overlaps(label)
}

/// How the window onto a face was fitted to the canvas, so that it is fitted the same way
/// again when the canvas changes size (as long as the user has not zoomed or panned since).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum FitKind {
    /// The window the face opens with ([`fit_window`]): the default.
    Opening,
    /// The whole face ([`whole_face_window`]), as "Whole face" asks.
    WholeFace,
}

impl FitKind {
    /// The window fitted this way onto `canvas`.
    pub fn window(
        self,
        bounds: &FaceBounds,
        canvas: &ScreenRect,
        margin_px: f32,
        focus_x_m: Option<f64>,
    ) -> FaceWindow {
        match self {
            FitKind::Opening => fit_window(bounds, canvas, margin_px, focus_x_m),
            FitKind::WholeFace => whole_face_window(bounds, canvas, margin_px),
        }
    }
}

/// Ticks of the arc-length ruler of an unrolled round face from drawn `s0_m` to `s1_m`: each
/// as (drawn s, value), metres, the value counted in (−half, half] of the circumference
/// `period_m` like stored positions, at multiples of `step_m`. Where one turn meets the next
/// (at ±half) the last tick of one and the first of the other fall close together: a tick
/// less than half a step after the one before is left out, so labels never overprint.
pub fn arc_ruler_ticks(s0_m: f64, s1_m: f64, period_m: f64, step_m: f64) -> Vec<(f64, f64)> {
    let ok = [s0_m, s1_m, period_m, step_m].iter().all(|v| v.is_finite());
    if !ok || period_m <= 0.0 || step_m <= 0.0 || (s1_m - s0_m).abs() > 100.0 * period_m {
        return Vec::new();
    }
    let (s0, s1) = (s0_m.min(s1_m), s0_m.max(s1_m));
    let half = period_m / 2.0;
    let turns = ((s0 + half) / period_m).floor() as i64..=((s1 + half) / period_m).ceil() as i64;
    let tol = 1e-9 * period_m;
    let mut all: Vec<(f64, f64)> = turns
        .flat_map(|k| {
            ruler_ticks(-half, half, step_m)
                .into_iter()
                // −half belongs to the previous turn.
                .filter(|t| *t > -half + tol)
                .map(move |t| (t + k as f64 * period_m, t))
        })
        .filter(|(s, _)| *s >= s0 - tol && *s <= s1 + tol)
        .collect();
    all.sort_by(|a, b| a.0.total_cmp(&b.0));
    let mut kept: Vec<(f64, f64)> = Vec::with_capacity(all.len());
    for tick in all {
        if kept
            .last()
            .is_none_or(|last| tick.0 - last.0 >= step_m / 2.0 - tol)
        {
            kept.push(tick);
        }
    }
    kept
}

/// Which way a point force on a beam acts, in words, for a force `component` of `value`
/// (N, with the component's sign convention); `None` for other components or a zero value.
pub fn force_direction(component: LoadComponent, value: f64) -> Option<&'static str> {
    if !value.is_finite() || value == 0.0 {
        return None;
    }
    match component {
        LoadComponent::VerticalForce if value > 0.0 => Some("down"),
        LoadComponent::VerticalForce => Some("up"),
        LoadComponent::LateralForce if value > 0.0 => Some("towards the back (+y)"),
        LoadComponent::LateralForce => Some("towards the front (−y)"),
        _ => None,
    }
}

/// The part of a beam's point force along +s of a flat `face` (the force in the plane of the
/// face, as drawn), from its vertical (positive down) and lateral (positive +y) components,
/// newtons. `None` on a round face, where s runs round the section.
pub fn force_along_s(face: Face, vertical_n: f64, lateral_n: f64) -> Option<f64> {
    // s is +z on the front face, −z on the back, +y on the top and −y on the bottom.
    match face {
        Face::Front => Some(-vertical_n),
        Face::Back => Some(vertical_n),
        Face::Top => Some(lateral_n),
        Face::Bottom => Some(-lateral_n),
        _ => None,
    }
}

/// How a member ends at one end of its length.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum EndKind {
    /// Fixed (the clamp of a cantilever).
    Clamped,
    /// Pinned support.
    Pinned,
    /// Free end.
    Free,
    /// End of a shaft (loads are constant along it).
    ShaftEnd,
    /// Capped vessel end.
    ClosedVesselEnd,
    /// Open vessel end.
    OpenVesselEnd,
}

/// What lies beyond one edge of a face.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Neighbour {
    /// Another face of the same member.
    Face(Face),
    /// The tip of a flange (the long edges of an I section's flange faces), on the side of
    /// `toward` (the back face, +y, or the front face, −y).
    FlangeTip {
        /// [`Face::Back`] or [`Face::Front`]: which side of the section the tip is on.
        toward: Face,
    },
    /// The inside of a flange where the web meets it (the edges of an I section's web faces).
    FlangeInside {
        /// True for the top flange.
        top: bool,
    },
    /// The seam of an unrolled round face: the surface continues at the other edge.
    Seam {
        /// Angle of the seam from the top line (on a sphere from the reference meridian),
        /// degrees.
        angle_deg: f64,
        /// Radius of the round face, metres: the seam's arc length s is `angle × radius`.
        radius_m: f64,
        /// True on a sphere, where s runs round the equator from the reference meridian.
        sphere: bool,
    },
    /// An end of the member.
    End {
        /// Where, metres along x.
        x_m: f64,
        /// How it ends.
        kind: EndKind,
    },
    /// A pole of a sphere (the meridian arc ends there): the top pole on +z, where x, the
    /// meridian arc from the equator, is largest; the bottom pole on −z.
    Pole {
        /// True for the top pole (+z).
        top: bool,
        /// Where, metres along x (the meridian arc from the equator).
        x_m: f64,
    },
    /// The outer edge of a plate, where the remote stress is applied.
    PlateEdge {
        /// The line the edge lies on.
        at: EdgeLine,
    },
    /// The edge of the region a given surface state was entered for.
    RegionEdge {
        /// The line the edge lies on.
        at: EdgeLine,
    },
    /// A side of a face of an imported surface, with the face most of that side borders
    /// (None where the surface ends there, as at a shell's free edge).
    MeshEdge {
        /// The line the side lies on (the face's extent; the face's own outline may stay
        /// inside it).
        at: EdgeLine,
        /// The face beyond.
        beyond: Option<Face>,
    },
}

/// The line an edge of a flat face lies on, in face coordinates.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum EdgeLine {
    /// x = `x_m` (a left or right edge).
    X {
        /// Metres.
        x_m: f64,
    },
    /// s = `s_m` (a top or bottom edge).
    S {
        /// Metres.
        s_m: f64,
    },
}

impl EdgeLine {
    /// "x = -25.0 mm"; `length` formats a length.
    pub fn label(&self, length: &dyn Fn(f64) -> String) -> String {
        match self {
            EdgeLine::X { x_m } => format!("x = {}", length(*x_m)),
            EdgeLine::S { s_m } => format!("s = {}", length(*s_m)),
        }
    }
}

impl Neighbour {
    /// The edge's name as the face view shows it; `length` formats an x position.
    pub fn label(&self, length: &dyn Fn(f64) -> String) -> String {
        match self {
            Neighbour::Face(f) => f.name().into_owned(),
            Neighbour::FlangeTip { toward } => match toward {
                Face::Front => "flange edge, front (−y)".to_owned(),
                _ => "flange edge, back (+y)".to_owned(),
            },
            Neighbour::FlangeInside { top: true } => "top flange (inside)".to_owned(),
            Neighbour::FlangeInside { top: false } => "bottom flange (inside)".to_owned(),
            Neighbour::Seam {
                angle_deg,
                radius_m,
                sphere,
            } => seam_label(*angle_deg, *radius_m, *sphere, length),
            Neighbour::End { x_m, kind } => {
                let what = match kind {
                    EndKind::Clamped => "clamped end",
                    EndKind::Pinned => "pinned end",
                    EndKind::Free => "free end",
                    EndKind::ShaftEnd => "shaft end",
                    EndKind::ClosedVesselEnd => "closed end",
                    EndKind::OpenVesselEnd => "open end",
                };
                format!("{what} at x = {}", length(*x_m))
            }
            Neighbour::Pole { top, x_m } => {
                let which = if *top {
                    "top pole (+z)"
                } else {
                    "bottom pole (−z)"
                };
                format!("{which} at x = {}", length(*x_m))
            }
            Neighbour::PlateEdge { at } => format!("plate edge at {}", at.label(length)),
            Neighbour::RegionEdge { at } => format!("edge at {}", at.label(length)),
            Neighbour::MeshEdge {
                at,
                beyond: Some(f),
            } => format!("{} at {}", f.name(), at.label(length)),
            Neighbour::MeshEdge { at, beyond: None } => {
                format!("free edge at {}", at.label(length))
            }
        }
    }

    /// A short name for a narrow band, where [`Neighbour::label`] does not fit.
    pub fn short_label(&self) -> &'static str {
        match self {
            Neighbour::Face(_) => "face",
            Neighbour::FlangeTip { .. } => "flange edge",
            Neighbour::FlangeInside { .. } => "flange",
            Neighbour::Seam { .. } => "seam",
            Neighbour::End { kind, .. } => match kind {
                EndKind::Clamped => "clamp",
                EndKind::Pinned => "pin",
                EndKind::Free => "free end",
                EndKind::ShaftEnd => "end",
                EndKind::ClosedVesselEnd => "closed end",
                EndKind::OpenVesselEnd => "open end",
            },
            Neighbour::Pole { top: true, .. } => "top pole",
            Neighbour::Pole { top: false, .. } => "bottom pole",
            Neighbour::PlateEdge { .. } => "plate edge",
            Neighbour::RegionEdge { .. } => "edge",
            Neighbour::MeshEdge {
                beyond: Some(_), ..
            } => "face",
            Neighbour::MeshEdge { beyond: None, .. } => "free edge",
        }
    }

    /// What the band beyond the edge stands for, for its tooltip.
    pub fn explanation(&self) -> &'static str {
        match self {
            Neighbour::Face(_) => "The next face of the member continues past this edge.",
            Neighbour::FlangeTip { .. } => "The flange ends here.",
            Neighbour::FlangeInside { .. } => "The web meets the flange here.",
            Neighbour::Seam { .. } => {
                "The round face is cut open here to lay it flat; it continues at the other edge."
            }
            Neighbour::End { kind, .. } => match kind {
                EndKind::Clamped => "The clamp holds the beam fixed beyond this edge.",
                EndKind::Pinned => "The beam rests on a pin here, free to turn.",
                EndKind::Free => "Nothing holds the beam beyond this edge.",
                EndKind::ShaftEnd => "The shaft ends here.",
                EndKind::ClosedVesselEnd => "A closed end carries the pressure's axial pull.",
                EndKind::OpenVesselEnd => "An open end carries no axial load.",
            },
            Neighbour::Pole { top: true, .. } => {
                "The meridian ends at the top pole (+z), a quarter circumference from the equator."
            }
            Neighbour::Pole { top: false, .. } => {
                "The meridian ends at the bottom pole (−z), a quarter circumference from the \
                 equator."
            }
            Neighbour::PlateEdge { .. } => "The remote stress acts on the plate beyond this edge.",
            Neighbour::RegionEdge { .. } => {
                "The given surface state was entered for this region only."
            }
            Neighbour::MeshEdge {
                beyond: Some(_), ..
            } => "The imported surface continues on this face past the edge.",
            Neighbour::MeshEdge { beyond: None, .. } => {
                "The imported surface ends here (a free edge of the mesh)."
            }
        }
    }
}

/// "seam at s = -47.1 mm (-90°, the front line), joins the other edge": the seam's arc
/// length from s = 0, with its angle and, where it lies on one, the named line.
fn seam_label(
    angle_deg: f64,
    radius_m: f64,
    sphere: bool,
    length: &dyn Fn(f64) -> String,
) -> String {
    let deg = normalised_deg(angle_deg);
    let near = |a: f64| (deg - a).abs() < 0.5;
    // gw_mechanics' surface_geometry: on a cylinder the angle s/r runs from the top line (+z)
    // towards +y; on a sphere s runs round the equator from the meridian through +x.
    let line = match (sphere, deg) {
        (true, _) if near(0.0) => Some("the reference meridian"),
        (true, _) => None,
        (false, _) if near(0.0) => Some("the top line"),
        (false, _) if near(90.0) => Some("the back line"),
        (false, _) if near(-90.0) => Some("the front line"),
        (false, _) if near(180.0) || near(-180.0) => Some("the bottom line"),
        _ => None,
    };
    let angle = match line {
        Some(l) => format!("{deg:.0}°, {l}"),
        None => format!("{deg:.0}°"),
    };
    if radius_m.is_finite() && radius_m > 0.0 {
        let arc = deg.to_radians() * radius_m;
        format!(
            "seam at s = {} ({angle}), joins the other edge",
            length(arc)
        )
    } else {
        format!("seam at {angle}, joins the other edge")
    }
}

/// What lies beyond each edge of a face, as drawn (x right, s up).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FaceEdges {
    /// Beyond the top edge (largest s).
    pub s_max: Neighbour,
    /// Beyond the bottom edge (smallest s).
    pub s_min: Neighbour,
    /// Beyond the left edge (smallest x).
    pub x_min: Neighbour,
    /// Beyond the right edge (largest x).
    pub x_max: Neighbour,
}

/// What lies beyond each edge of `face` of `member`. `seam_deg` is the seam of a round face
/// (ignored on flat faces).
///
/// Side faces follow the surface conventions of `gw_mechanics::surface`: on the top face s
/// runs towards +y (the back face), on the bottom face towards −y (the front face), on the
/// front face up (the top face), on the back face down (the bottom face).
pub fn face_edges(member: &Member, face: Face, seam_deg: f64) -> FaceEdges {
    let extent = member.faces().into_iter().find(|e| e.face == face);
    let (x_range, s_range) =
        extent.map_or(((0.0, 0.0), (0.0, 0.0)), |e| (e.x_range_m, e.s_range_m));
    let s_line = |s_m: f64| EdgeLine::S { s_m };
    let (x_min, x_max) = match (member, face) {
        (Member::ImportedField(_), Face::Patch(_)) => (
            mesh_edge(member, face, EdgeLine::X { x_m: x_range.0 }),
            mesh_edge(member, face, EdgeLine::X { x_m: x_range.1 }),
        ),
        _ => ends(member, x_range),
    };
    let tip = |toward: Face| Neighbour::FlangeTip { toward };
    let (s_max, s_min) = match (member, face) {
        (_, Face::Round) => {
            let seam = Neighbour::Seam {
                angle_deg: seam_deg,
                radius_m: (s_range.1 - s_range.0) / TAU,
                sphere: matches!(member, Member::ThinSphere(_)),
            };
            (seam, seam)
        }
        (Member::Beam(b), f) if matches!(b.section, Section::IBeam { .. }) => match f {
            // s runs towards +y on the top face and towards −y on the bottom face.
            Face::Top => (tip(Face::Back), tip(Face::Front)),
            Face::Bottom => (tip(Face::Front), tip(Face::Back)),
            Face::Front => (
                Neighbour::FlangeInside { top: true },
                Neighbour::FlangeInside { top: false },
            ),
            _ => (
                Neighbour::FlangeInside { top: false },
                Neighbour::FlangeInside { top: true },
            ),
        },
        (Member::PlateWithHole(_), _) => (
            Neighbour::PlateEdge {
                at: s_line(s_range.1),
            },
            Neighbour::PlateEdge {
                at: s_line(s_range.0),
            },
        ),
        (Member::ImportedField(_), Face::Patch(_)) => (
            mesh_edge(member, face, s_line(s_range.1)),
            mesh_edge(member, face, s_line(s_range.0)),
        ),
        (Member::GivenState(_) | Member::ImportedField(_), _)
        | (_, Face::Plate | Face::Patch(_)) => (
            Neighbour::RegionEdge {
                at: s_line(s_range.1),
            },
            Neighbour::RegionEdge {
                at: s_line(s_range.0),
            },
        ),
        (_, Face::Top) => (Neighbour::Face(Face::Back), Neighbour::Face(Face::Front)),
        (_, Face::Bottom) => (Neighbour::Face(Face::Front), Neighbour::Face(Face::Back)),
        (_, Face::Front) => (Neighbour::Face(Face::Top), Neighbour::Face(Face::Bottom)),
        (_, Face::Back) => (Neighbour::Face(Face::Bottom), Neighbour::Face(Face::Top)),
    };
    FaceEdges {
        s_max,
        s_min,
        x_min,
        x_max,
    }
}

/// The side of an imported face on `line`: the face beyond the longest share of the outline
/// edges that lie on that line (within a thousandth of the face's size), or a region edge
/// when none does (the outline stays inside the extent there).
fn mesh_edge(member: &Member, face: Face, line: EdgeLine) -> Neighbour {
    let region = Neighbour::RegionEdge { at: line };
    let (Member::ImportedField(m), Face::Patch(k)) = (member, face) else {
        return region;
    };
    let Some(field) = m.surface() else {
        return region;
    };
    let Some(patch) = field.patches().get(usize::from(k)) else {
        return region;
    };
    let size = (patch.x_range_m.1 - patch.x_range_m.0).max(patch.s_range_m.1 - patch.s_range_m.0);
    let on = |p: [f64; 2]| match line {
        EdgeLine::X { x_m } => (p[0] - x_m).abs() <= 1e-3 * size,
        EdgeLine::S { s_m } => (p[1] - s_m).abs() <= 1e-3 * size,
    };
    // Length along the line per face beyond (None: a free edge).
    let mut shares: Vec<(Option<usize>, f64)> = Vec::new();
    for e in field.outline(usize::from(k)) {
        if on(e.from) && on(e.to) {
            let len = (e.to[0] - e.from[0]).hypot(e.to[1] - e.from[1]);
            match shares.iter_mut().find(|(b, _)| *b == e.beyond) {
                Some(share) => share.1 += len,
                None => shares.push((e.beyond, len)),
            }
        }
    }
    match shares.iter().max_by(|a, b| a.1.total_cmp(&b.1)) {
        Some(&(beyond, _)) => Neighbour::MeshEdge {
            at: line,
            beyond: beyond.map(|b| Face::Patch(b as u16)),
        },
        None => region,
    }
}

/// The neighbours beyond x = start and x = end of a member whose faces run over `x_range`.
fn ends(member: &Member, x_range: (f64, f64)) -> (Neighbour, Neighbour) {
    let x_line = |x_m: f64| EdgeLine::X { x_m };
    let end = |x_m: f64, kind: EndKind| Neighbour::End { x_m, kind };
    match member {
        Member::Beam(b) => match b.support {
            BeamSupport::Cantilever => (end(0.0, EndKind::Clamped), end(b.length_m, EndKind::Free)),
            BeamSupport::SimplySupported => {
                (end(0.0, EndKind::Pinned), end(b.length_m, EndKind::Pinned))
            }
        },
        Member::Shaft(s) => (
            end(0.0, EndKind::ShaftEnd),
            end(s.length_m, EndKind::ShaftEnd),
        ),
        Member::ThinCylinder(c) => {
            let kind = vessel_end(c.ends);
            (end(0.0, kind), end(c.length_m, kind))
        }
        Member::ThickCylinder(c) => {
            let kind = vessel_end(c.ends);
            (end(0.0, kind), end(c.length_m, kind))
        }
        // x is the meridian arc from the equator towards the +z pole (gw_mechanics'
        // surface_geometry): the smallest x is the bottom pole, the largest the top pole.
        Member::ThinSphere(_) => (
            Neighbour::Pole {
                top: false,
                x_m: x_range.0,
            },
            Neighbour::Pole {
                top: true,
                x_m: x_range.1,
            },
        ),
        Member::PlateWithHole(_) => (
            Neighbour::PlateEdge {
                at: x_line(x_range.0),
            },
            Neighbour::PlateEdge {
                at: x_line(x_range.1),
            },
        ),
        Member::GivenState(_) | Member::ImportedField(_) => (
            Neighbour::RegionEdge {
                at: x_line(x_range.0),
            },
            Neighbour::RegionEdge {
                at: x_line(x_range.1),
            },
        ),
    }
}

fn vessel_end(ends: VesselEnds) -> EndKind {
    match ends {
        VesselEnds::Closed => EndKind::ClosedVesselEnd,
        VesselEnds::Open => EndKind::OpenVesselEnd,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use gw_mechanics::{Beam, LoadPoint, Material, library_material};

    fn canvas() -> ScreenRect {
        ScreenRect::from_min_size([100.0, 50.0], [600.0, 400.0])
    }

    fn steel() -> Material {
        library_material("carbon_steel")
            .expect("carbon steel is in the library")
            .material()
    }

    fn beam(section: Section, support: BeamSupport) -> Member {
        Member::Beam(Beam {
            section,
            material: steel(),
            length_m: 0.45,
            support,
            load_points: vec![LoadPoint::whole(0.45)],
        })
    }

    /// One hexahedron 40 × 20 × 10 mm from the origin, read as an imported part.
    fn imported_brick() -> Member {
        use gw_mechanics::imported::{
            Cell, CellKind, FieldState, ImportedSurface, RawMesh, ReferenceAxis, SurfaceField,
            TensorQuantity, UnitField,
        };
        let points_m: Vec<[f64; 3]> = (0..8)
            .map(|k| {
                let (i, j, l) = (k & 1, (k >> 1) & 1, k >> 2);
                [
                    0.04 * f64::from(i),
                    0.02 * f64::from(j),
                    0.01 * f64::from(l),
                ]
            })
            .collect();
        // Corner order of a hexahedron: the bottom ring, then the top ring.
        let nodes = vec![0, 1, 3, 2, 4, 5, 7, 6];
        let mesh = RawMesh {
            points_m,
            cells: vec![Cell {
                kind: CellKind::Hexa,
                nodes,
            }],
        };
        let field = UnitField {
            component: gw_mechanics::LoadComponent::AxialForce,
            quantity: TensorQuantity::Stress,
            values: vec![[1.0, 0.0, 0.0, 0.0, 0.0, 0.0]; 8],
        };
        let surface = SurfaceField::new(&mesh, vec![field], ReferenceAxis::X).unwrap();
        Member::ImportedField(ImportedSurface {
            material: steel(),
            reference_axis: ReferenceAxis::X,
            loads: Vec::new(),
            mesh_file: None,
            field: FieldState::Loaded(std::sync::Arc::new(surface)),
            read_notes: Vec::new(),
        })
    }

    #[test]
    fn the_sides_of_an_imported_face_name_the_faces_beyond() {
        let brick = imported_brick();
        let Member::ImportedField(m) = &brick else {
            unreachable!()
        };
        let field = m.surface().unwrap();
        // The top face: normal +z; x runs along global X, s along Y.
        let top = field
            .patches()
            .iter()
            .position(|p| p.normal[2] > 0.999)
            .unwrap();
        let edges = face_edges(&brick, Face::Patch(top as u16), 0.0);
        let beyond = |n: Neighbour| match n {
            Neighbour::MeshEdge {
                beyond: Some(Face::Patch(k)),
                ..
            } => field.patches()[usize::from(k)].normal,
            other => panic!("{other:?}"),
        };
        // Past x_min lies the face looking −X, past x_max the one looking +X, past s_min the
        // one looking −Y, past s_max the one looking +Y.
        let close = |n: [f64; 3], want: [f64; 3]| (0..3).all(|i| (n[i] - want[i]).abs() < 1e-9);
        assert!(close(beyond(edges.x_min), [-1.0, 0.0, 0.0]));
        assert!(close(beyond(edges.x_max), [1.0, 0.0, 0.0]));
        assert!(close(beyond(edges.s_min), [0.0, -1.0, 0.0]));
        assert!(close(beyond(edges.s_max), [0.0, 1.0, 0.0]));
        let mm = |v: f64| format!("{:.0} mm", v * 1e3);
        let Neighbour::MeshEdge {
            beyond: Some(f), ..
        } = edges.x_min
        else {
            unreachable!()
        };
        assert_eq!(
            edges.x_min.label(&mm),
            format!("{} at x = -20 mm", f.name())
        );
    }

    /// A 450 mm × 30 mm face on a 600 × 400 px canvas would be 40 px tall drawn whole; the fit
    /// makes its 30 mm fill the 380 px left inside 10 px margins instead, a window of
    /// 580 / (380 / 0.03) = 45.8 mm along x centred on the gauge at 50 mm.
    #[test]
    fn a_strip_face_fills_the_height_and_centres_on_the_gauge() {
        let bounds = FaceBounds {
            x_m: (0.0, 0.45),
            s_m: (-0.015, 0.015),
        };
        let w = fit_window(&bounds, &canvas(), 10.0, Some(0.05));
        assert!((w.px_per_m - 380.0 / 0.03).abs() < 1e-6, "{}", w.px_per_m);
        assert!((w.centre_x_m - 0.05).abs() < 1e-12);
        let top = w.to_screen(&canvas(), 0.05, 0.015);
        let bottom = w.to_screen(&canvas(), 0.05, -0.015);
        assert!((top[1] - 60.0).abs() < 1e-3 && (bottom[1] - 440.0).abs() < 1e-3);
        // A gauge near the end: the window stops at the face's end instead of running off it.
        let w = fit_window(&bounds, &canvas(), 10.0, Some(0.001));
        let ((x0, _), _) = w.visible(&canvas());
        assert!((x0 - (-10.0 / w.px_per_m)).abs() < 1e-9, "{x0}");
        assert!(!w.shows_whole(&canvas(), &bounds));
    }

    #[test]
    fn a_squat_face_is_shown_whole() {
        let bounds = FaceBounds {
            x_m: (0.0, 0.6),
            s_m: (-0.094, 0.094),
        };
        let w = fit_window(&bounds, &canvas(), 10.0, Some(0.1));
        // 580 px / 600 mm limits the scale; 188 mm is then 182 px of 380: a strip, so the
        // height is filled: 380 px / 188 mm.
        assert!((w.px_per_m - 380.0 / 0.188).abs() < 1e-6);
        let square = FaceBounds {
            x_m: (-0.1, 0.1),
            s_m: (-0.1, 0.1),
        };
        let w = fit_window(&square, &canvas(), 10.0, Some(0.05));
        assert_eq!(w.centre_x_m, 0.0);
        assert!(w.shows_whole(&canvas(), &square));
    }

    #[test]
    fn zoom_keeps_the_point_under_the_cursor() {
        let w = FaceWindow {
            centre_x_m: 0.2,
            centre_s_m: 0.0,
            px_per_m: 5000.0,
        };
        let cursor = [180.0, 120.0];
        let before = w.to_face(&canvas(), cursor);
        let z = w.zoomed_about(&canvas(), cursor, 2.5, 100.0);
        assert_eq!(z.px_per_m, 12500.0);
        let after = z.to_face(&canvas(), cursor);
        assert!((before.0 - after.0).abs() < 1e-12 && (before.1 - after.1).abs() < 1e-12);
        // Panning by 50 px to the right shows what was 50 px to the left.
        let p = w.panned(50.0, 0.0);
        let moved = p.to_face(&canvas(), [cursor[0] + 50.0, cursor[1]]);
        assert!((moved.0 - before.0).abs() < 1e-12);
        // Never past the largest zoom, never NaN.
        let far = w.zoomed_about(&canvas(), cursor, 1e12, 100.0);
        assert_eq!(far.px_per_m, MAX_PX_PER_M);
        assert_eq!(w.zoomed_about(&canvas(), cursor, f64::NAN, 100.0), w);
    }

    #[test]
    fn ruler_steps_are_round_and_far_enough_apart() {
        // 10 px per mm, at least 60 px apart: 6 mm is not round, 10 mm is.
        assert_eq!(ruler_step(10.0, 60.0), 10.0);
        assert_eq!(ruler_step(10.0, 15.0), 2.0);
        assert_eq!(ruler_step(10.0, 40.0), 5.0);
        assert!((ruler_step(1000.0, 60.0) - 0.1).abs() < 1e-12);
        assert_eq!(ruler_ticks(-7.0, 23.0, 10.0), vec![0.0, 10.0, 20.0]);
        assert!(ruler_ticks(0.0, f64::NAN, 1.0).is_empty());
        assert!(ruler_ticks(0.0, 1e9, 1.0).is_empty());
        assert_eq!(angle_step_deg(1.0, 40.0), 45.0);
        assert_eq!(angle_step_deg(4.0, 40.0), 10.0);
        // At 3 px per mm a bar of at most 100 px is 20 mm (33 mm is not round).
        assert_eq!(scale_bar_length(3.0, 100.0), 20.0);
        assert_eq!(scale_bar_length(2.0, 100.0), 50.0);
    }

    #[test]
    fn the_seam_runs_through_the_middle_of_the_largest_gap() {
        let deg = |d: f64| d.to_radians();
        // Gauges on the top and bottom lines (a shaft's bending pair): the seam goes to a side.
        let s = seam_angle(&[deg(0.0), deg(180.0)]).to_degrees();
        assert!((s.abs() - 90.0).abs() < 1e-9, "{s}");
        // Three gauges within 40° of the top line, one at 100°: the largest gap is from 100°
        // round to 340° (−20°), its middle at 220°, which is −140°.
        let s = seam_angle(&[deg(-20.0), deg(0.0), deg(20.0), deg(100.0)]).to_degrees();
        assert!((s + 140.0).abs() < 1e-9, "{s}");
        // No gauge: the bottom line.
        assert!((seam_angle(&[]) - PI).abs() < 1e-12);
        // One gauge: diametrically opposite.
        assert!((seam_angle(&[deg(30.0)]).to_degrees() + 150.0).abs() < 1e-9);
        assert!((seam_angle(&[f64::NAN]) - PI).abs() < 1e-12);
    }

    #[test]
    fn every_gauge_is_clear_of_the_seam_it_chose() {
        // Gauges spread unevenly round the circumference: the seam is at least half the largest
        // gap (here 150°, from 110° to 260°) from each of them.
        let gauges: Vec<f64> = [0.0f64, 45.0, 80.0, 110.0, 260.0, 300.0]
            .iter()
            .map(|d| d.to_radians())
            .collect();
        let seam = seam_angle(&gauges);
        for g in &gauges {
            let d = (g - seam).rem_euclid(TAU);
            let d = d.min(TAU - d).to_degrees();
            assert!(
                d >= 75.0 - 1e-9,
                "gauge at {} is {d}° from the seam",
                g.to_degrees()
            );
        }
    }

    #[test]
    fn a_gauge_on_the_seam_is_drawn_at_both_edges() {
        let period = 0.2;
        let start = -0.05;
        // 3 mm above the lower edge with a 5 mm reach: also drawn beyond the upper edge.
        assert_eq!(drawn_copies(-0.047, 0.005, start, period).len(), 2);
        let c = drawn_copies(-0.047 + period, 0.005, start, period);
        assert!((c[0] + 0.047).abs() < 1e-12 && (c[1] - 0.153).abs() < 1e-12);
        // 3 mm below the upper edge: also drawn below the lower edge.
        let c = drawn_copies(0.147, 0.005, start, period);
        assert!((c[1] + 0.053).abs() < 1e-12, "{c:?}");
        // Well inside: once.
        assert_eq!(drawn_copies(0.05, 0.005, start, period).len(), 1);
    }

    #[test]
    fn small_gauges_are_enlarged_to_the_minimum_size() {
        assert_eq!(enlargement(8.0, 24.0), 3.0);
        assert_eq!(enlargement(30.0, 24.0), 1.0);
        assert_eq!(enlargement(0.0, 24.0), 1.0);
        assert_eq!(enlargement(f64::NAN, 24.0), 1.0);
    }

    #[test]
    fn snapping_prefers_stations_then_the_half_millimetre_grid() {
        // 51.2 mm with a gauge's station at 50 mm within 1.5 mm: the station.
        assert_eq!(snap_coordinate(0.0512, 0.0005, &[0.05, 0.2], 0.0015), 0.05);
        // 53.26 mm, no station near: the 0.5 mm grid, 53.5 mm.
        let v = snap_coordinate(0.05326, 0.0005, &[0.05], 0.0015);
        assert!((v - 0.0535).abs() < 1e-12, "{v}");
        // The nearer of two stations.
        assert_eq!(
            snap_coordinate(0.0101, 0.0005, &[0.009, 0.011], 0.0015),
            0.011
        );
        assert_eq!(snap_angle_deg(47.4, 5.0), 45.0);
        assert_eq!(snap_angle_deg(-92.6, 5.0), -95.0);
        assert_eq!(snap_angle_deg(47.4, 0.0), 47.4);
    }

    #[test]
    fn labels_take_the_first_free_place_and_never_overlap() {
        let mut placer = LabelPlacer::new(ScreenRect::from_min_size([0.0, 0.0], [200.0, 100.0]));
        let gauge = ScreenRect::from_min_size([90.0, 40.0], [20.0, 20.0]);
        placer.block(gauge);
        let size = [30.0, 12.0];
        let first = placer
            .place(size, &candidates_around(&gauge, size, 4.0))
            .unwrap();
        // Right of the gauge, centred on it.
        assert_eq!(first.min, [114.0, 44.0]);
        // The same label again goes to the left: the right is taken.
        let second = placer
            .place(size, &candidates_around(&gauge, size, 4.0))
            .unwrap();
        assert_eq!(second.min, [56.0, 44.0]);
        assert!(!second.overlaps(&first) && !second.overlaps(&gauge));
        // A label that cannot fit anywhere is left out.
        assert!(placer.place([500.0, 12.0], &[[0.0, 0.0]]).is_none());
        // At the panel's edge, the candidates outside it are skipped.
        let corner = ScreenRect::from_min_size([185.0, 0.0], [10.0, 10.0]);
        let placed = placer
            .place(size, &candidates_around(&corner, size, 4.0))
            .unwrap();
        assert!(placed.max[0] <= 200.0 && placed.min[1] >= 0.0);
    }

    #[test]
    fn edges_are_named_after_their_neighbours() {
        let rect = beam(
            Section::Rectangle {
                width_m: 0.03,
                height_m: 0.06,
            },
            BeamSupport::Cantilever,
        );
        let mm = |x: f64| format!("{:.0} mm", x * 1e3);
        let top = face_edges(&rect, Face::Top, 0.0);
        assert_eq!(top.s_max, Neighbour::Face(Face::Back));
        assert_eq!(top.s_min, Neighbour::Face(Face::Front));
        assert_eq!(top.x_min.label(&mm), "clamped end at x = 0 mm");
        assert_eq!(top.x_max.label(&mm), "free end at x = 450 mm");
        let back = face_edges(&rect, Face::Back, 0.0);
        assert_eq!(back.s_max, Neighbour::Face(Face::Bottom));
        let ibeam = beam(
            Section::IBeam {
                flange_width_m: 0.1,
                depth_m: 0.2,
                flange_thickness_m: 0.01,
                web_thickness_m: 0.006,
            },
            BeamSupport::SimplySupported,
        );
        let top = face_edges(&ibeam, Face::Top, 0.0);
        assert_eq!(top.s_max.label(&mm), "flange edge, back (+y)");
        assert_eq!(top.s_min.label(&mm), "flange edge, front (−y)");
        let bottom = face_edges(&ibeam, Face::Bottom, 0.0);
        assert_eq!(bottom.s_max.label(&mm), "flange edge, front (−y)");
        assert_eq!(top.x_min.label(&mm), "pinned end at x = 0 mm");
        let web = face_edges(&ibeam, Face::Front, 0.0);
        assert_eq!(web.s_max, Neighbour::FlangeInside { top: true });
        let web = face_edges(&ibeam, Face::Back, 0.0);
        assert_eq!(web.s_max, Neighbour::FlangeInside { top: false });
        let round = beam(
            Section::SolidRound { diameter_m: 0.04 },
            BeamSupport::Cantilever,
        );
        // The seam a quarter turn from the top line towards −y on a 40 mm bar: s = −π/2 × 20 mm
        // = −31.4 mm (arc length = radius × angle), on the front line (gw_mechanics'
        // surface_geometry: s/r runs from the top line towards +y).
        let e = face_edges(&round, Face::Round, 270.0);
        let mm1 = |x: f64| format!("{:.1} mm", x * 1e3);
        assert_eq!(
            e.s_min.label(&mm1),
            "seam at s = -31.4 mm (-90°, the front line), joins the other edge"
        );
        // Half a turn on the same bar: 62.8 mm round, on the bottom line; 40° names no line.
        let e = face_edges(&round, Face::Round, 180.0);
        assert_eq!(
            e.s_max.label(&mm1),
            "seam at s = 62.8 mm (180°, the bottom line), joins the other edge"
        );
        let e = face_edges(&round, Face::Round, 40.0);
        assert_eq!(
            e.s_max.label(&mm1),
            "seam at s = 14.0 mm (40°), joins the other edge"
        );
    }

    /// The four names of a face's edges, top, bottom, left, right.
    fn edge_names(member: &Member, face: Face) -> [String; 4] {
        let mm = |x: f64| format!("{:.0} mm", x * 1e3);
        let e = face_edges(member, face, 0.0);
        [e.s_max, e.s_min, e.x_min, e.x_max].map(|n| n.label(&mm))
    }

    fn all_differ(names: &[String]) -> bool {
        names
            .iter()
            .enumerate()
            .all(|(i, a)| names.iter().skip(i + 1).all(|b| a != b))
    }

    #[test]
    fn each_edge_of_an_i_section_flange_and_of_a_given_state_patch_has_its_own_name() {
        let ibeam = beam(
            Section::IBeam {
                flange_width_m: 0.1,
                depth_m: 0.2,
                flange_thickness_m: 0.01,
                web_thickness_m: 0.006,
            },
            BeamSupport::SimplySupported,
        );
        for face in [Face::Top, Face::Bottom, Face::Front, Face::Back] {
            let names = edge_names(&ibeam, face);
            assert!(all_differ(&names), "{face:?}: {names:?}");
        }
        let gallery = crate::gallery::model_gallery();
        let patch = gallery
            .parts
            .iter()
            .map(|p| p.member.clone())
            .find(|m| matches!(m, Member::GivenState(_)))
            .expect("the gallery has a given-state patch");
        let face = patch.faces()[0].face;
        let names = edge_names(&patch, face);
        assert!(all_differ(&names), "{names:?}");
        assert_eq!(names[2], "edge at x = -25 mm");
        assert_eq!(names[0], "edge at s = 25 mm");
    }

    /// The Ram barrel of the gallery: 314 mm round, the seam at 180°, 50 mm steps. Ticks at
    /// +150 mm and at −150 mm of the next turn are 14 mm apart across the seam.
    #[test]
    fn arc_ruler_labels_at_the_seam_do_not_overprint() {
        let period = 0.314;
        let step = 0.05;
        let start = period / 2.0;
        // The visible range runs past both edges of the face (the band and the margin).
        let ticks = arc_ruler_ticks(start - 0.03, start + period + 0.03, period, step);
        assert!(!ticks.is_empty());
        for w in ticks.windows(2) {
            assert!(
                w[1].0 - w[0].0 >= step / 2.0 - 1e-12,
                "{:?} and {:?} overprint",
                w[0],
                w[1]
            );
        }
        // Every value is in (−half, half] and each turn's ticks are labelled once.
        assert!(ticks.iter().all(|(_, v)| *v > -0.157 && *v <= 0.157));
        let zero = ticks.iter().filter(|(_, v)| v.abs() < 1e-12).count();
        assert_eq!(zero, 1, "{ticks:?}");
        // +150 mm is kept; −150 mm of the next turn, 14 mm after it, is left out.
        assert!(ticks.iter().any(|(_, v)| (v - 0.15).abs() < 1e-12));
        assert!(
            !ticks.iter().any(|(_, v)| (v + 0.15).abs() < 1e-12),
            "{ticks:?}"
        );
        assert!(arc_ruler_ticks(0.0, f64::NAN, period, step).is_empty());
        assert!(arc_ruler_ticks(0.0, 1.0, 0.0, step).is_empty());
    }

    #[test]
    fn placed_labels_never_overlap_each_other_or_what_is_blocked() {
        // A crowd of gauges and symbols on a small canvas, labels of several sizes for each:
        // whatever is placed is inside the bounds and clear of everything else.
        let bounds = ScreenRect::from_min_size([0.0, 0.0], [300.0, 200.0]);
        let mut placer = LabelPlacer::new(bounds);
        let mut seed = 12345u32;
        let mut next = move || {
            seed = seed.wrapping_mul(1_103_515_245).wrapping_add(12_345);
            (seed >> 8) as f32 / (1u32 << 24) as f32
        };
        let mut blocked = Vec::new();
        for _ in 0..20 {
            let r = ScreenRect::from_min_size([next() * 280.0, next() * 180.0], [20.0, 20.0]);
            placer.block(r);
            blocked.push(r);
        }
        let mut placed = Vec::new();
        for k in 0..60 {
            let anchor = blocked[k % blocked.len()];
            let size = [20.0 + next() * 60.0, 14.0];
            if let Some(a) = placer.place(size, &candidates_around(&anchor, size, 4.0)) {
                placed.push(a);
            }
        }
        assert!(placed.len() >= 10, "only {} placed", placed.len());
        for (i, a) in placed.iter().enumerate() {
            assert!(bounds.contains_rect(a));
            assert!(
                blocked.iter().all(|b| !b.overlaps(a)),
                "{a:?} covers a symbol"
            );
            assert!(
                placed[i + 1..].iter().all(|b| !b.overlaps(a)),
                "{a:?} overlaps"
            );
        }
    }

    #[test]
    fn a_whole_face_fit_is_done_again_for_a_new_canvas() {
        let bounds = FaceBounds {
            x_m: (0.0, 0.45),
            s_m: (-0.015, 0.015),
        };
        let small = ScreenRect::from_min_size([0.0, 0.0], [400.0, 300.0]);
        let large = ScreenRect::from_min_size([0.0, 0.0], [800.0, 500.0]);
        let a = FitKind::WholeFace.window(&bounds, &small, 10.0, None);
        let b = FitKind::WholeFace.window(&bounds, &large, 10.0, None);
        assert!(a.shows_whole(&small, &bounds) && b.shows_whole(&large, &bounds));
        assert!((b.px_per_m / a.px_per_m - 780.0 / 380.0).abs() < 1e-9);
        // The opening fit of a strip fills the height instead.
        let c = FitKind::Opening.window(&bounds, &large, 10.0, None);
        assert!((c.px_per_m - 480.0 / 0.03).abs() < 1e-6);
    }

    #[test]
    fn point_forces_are_described_and_drawn_the_way_they_act() {
        assert_eq!(
            force_direction(LoadComponent::VerticalForce, 6e3),
            Some("down")
        );
        assert_eq!(
            force_direction(LoadComponent::VerticalForce, -1.0),
            Some("up")
        );
        assert_eq!(
            force_direction(LoadComponent::LateralForce, -1.0),
            Some("towards the front (−y)")
        );
        assert_eq!(force_direction(LoadComponent::VerticalForce, 0.0), None);
        assert_eq!(force_direction(LoadComponent::Torque, 1.0), None);
        // Down on the front face (s up) is −s; on the back face (s down) +s; on the top face a
        // vertical force has no part in the plane.
        assert_eq!(force_along_s(Face::Front, 6e3, 0.0), Some(-6e3));
        assert_eq!(force_along_s(Face::Back, 6e3, 0.0), Some(6e3));
        assert_eq!(force_along_s(Face::Top, 6e3, 0.0), Some(0.0));
        assert_eq!(force_along_s(Face::Round, 6e3, 0.0), None);
    }
}
