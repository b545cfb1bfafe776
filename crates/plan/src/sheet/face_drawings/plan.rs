//! What a face drawing shows and at what scale: the face as drawn (a round face unrolled from
//! its seam), the windows along each axis round the gauges and the datum (with breaks between
//! them), and a scale from the standard series at which it all fits.

use std::f64::consts::TAU;

use gw_bridge::PlacedGauge;
use std::sync::Arc;

use gw_mechanics::imported::{FieldState, ImportedSurface, OutlineEdge, SurfaceField};
use gw_mechanics::{Face, FaceExtent, Member};

use crate::drawing::face_layout::{FaceBounds, FaceEdges, face_edges, seam_angle, wrap_into};

/// Points per metre at 1:1 (72 pt to the inch of 25.4 mm).
pub(crate) const PT_PER_M: f64 = 72.0 / 0.0254;

/// Room a break takes between two windows, points.
pub(crate) const BREAK_PT: f32 = 14.0;

/// Windows closer than this on the page are drawn as one: a break would save little.
const MERGE_PT: f64 = 60.0;

/// A drawing scale, drawn size : true size.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Scale {
    pub ratio: f64,
}

impl Scale {
    pub const FULL: Scale = Scale { ratio: 1.0 };

    /// Points on the page per metre of the part.
    pub fn pt_per_m(self) -> f64 {
        self.ratio * PT_PER_M
    }

    /// "2:1", "1:1", "1:2.5".
    pub fn label(self) -> String {
        let fmt = |v: f64| {
            if (v - v.round()).abs() < 1e-9 {
                format!("{v:.0}")
            } else {
                format!("{v}")
            }
        };
        if self.ratio >= 1.0 {
            format!("{}:1", fmt(self.ratio))
        } else {
            format!("1:{}", fmt(1.0 / self.ratio))
        }
    }
}

/// The scales tried, largest first: the recommended series of ISO 5455 (from memory) with
/// 1:2.5 and 1:25 between, as drawing offices commonly use them.
pub(crate) const SERIES: [Scale; 12] = [
    Scale { ratio: 2.0 },
    Scale { ratio: 1.0 },
    Scale { ratio: 0.5 },
    Scale { ratio: 0.4 },
    Scale { ratio: 0.2 },
    Scale { ratio: 0.1 },
    Scale { ratio: 0.05 },
    Scale { ratio: 0.04 },
    Scale { ratio: 0.02 },
    Scale { ratio: 0.01 },
    Scale { ratio: 0.005 },
    Scale { ratio: 0.002 },
];

/// One axis of the drawing: the windows onto the face along it (metres, ascending), drawn one
/// after the other with [`BREAK_PT`] between.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Axis {
    pub windows: Vec<(f64, f64)>,
    pub pt_per_m: f64,
}

impl Axis {
    /// Drawn length, points.
    pub fn length_pt(&self) -> f32 {
        let drawn: f64 = self.windows.iter().map(|(a, b)| b - a).sum::<f64>() * self.pt_per_m;
        drawn as f32 + BREAK_PT * self.windows.len().saturating_sub(1) as f32
    }

    /// Distance of `v_m` from the start of the drawn axis, points; `None` inside a break.
    pub fn to_pt(&self, v_m: f64) -> Option<f32> {
        let mut at = 0.0f32;
        let tol = 1e-9;
        for (a, b) in &self.windows {
            if v_m >= a - tol && v_m <= b + tol {
                return Some(at + ((v_m - a) * self.pt_per_m) as f32);
            }
            at += ((b - a) * self.pt_per_m) as f32 + BREAK_PT;
        }
        None
    }

    /// Drawn offset of `v_m` in the window holding `near_m` (for points just off a window, like
    /// the far corner of a gauge).
    pub fn to_pt_near(&self, v_m: f64, near_m: f64) -> f32 {
        let Some(base) = self.to_pt(near_m) else {
            return ((v_m - near_m) * self.pt_per_m) as f32;
        };
        base + ((v_m - near_m) * self.pt_per_m) as f32
    }
}

/// Windows along one axis: an interval round each item, merged where the gap between them
/// would be under [`MERGE_PT`] on the page; then, while the drawing stays within `max_pt`,
/// the smallest gaps are closed and the windows run out to the face's ends, so that a face
/// is broken only where it must be.
pub(crate) fn windows(
    items: &[(f64, f64)],
    face: (f64, f64),
    pt_per_m: f64,
    max_pt: f32,
) -> Vec<(f64, f64)> {
    let merge = MERGE_PT / pt_per_m;
    let mut sorted: Vec<(f64, f64)> = items
        .iter()
        .filter(|(a, b)| a.is_finite() && b.is_finite())
        .map(|&(a, b)| (a.min(b), a.max(b)))
        .collect();
    sorted.sort_by(|p, q| p.0.total_cmp(&q.0));
    let mut out: Vec<(f64, f64)> = Vec::new();
    for (a, b) in sorted {
        match out.last_mut() {
            Some(last) if a - last.1 < merge => last.1 = last.1.max(b),
            _ => out.push((a, b)),
        }
    }
    let length = |w: &[(f64, f64)]| {
        Axis {
            windows: w.to_vec(),
            pt_per_m,
        }
        .length_pt()
    };
    while out.len() > 1 {
        let Some(k) = (0..out.len() - 1)
            .min_by(|&i, &j| (out[i + 1].0 - out[i].1).total_cmp(&(out[j + 1].0 - out[j].1)))
        else {
            break;
        };
        let mut merged = out.clone();
        merged[k].1 = merged[k + 1].1;
        merged.remove(k + 1);
        if length(&merged) > max_pt {
            break;
        }
        out = merged;
    }
    for first in [true, false] {
        let Some(&(a, b)) = (if first { out.first() } else { out.last() }) else {
            break;
        };
        let (from, to) = if first { (a, face.0) } else { (b, face.1) };
        if (first && from <= to) || (!first && from >= to) {
            continue;
        }
        let mut ran = out.clone();
        let n = ran.len() - 1;
        if first {
            ran[0].0 = to;
        } else {
            ran[n].1 = to;
        }
        if (from - to).abs() * pt_per_m < MERGE_PT || length(&ran) <= max_pt {
            out = ran;
        }
    }
    out
}

/// Half the size of a gauge as drawn with its tabs, metres (as in the app's face view).
pub(crate) fn reach_m(g: &PlacedGauge) -> f64 {
    0.5 * 1.7 * g.spec.grid_length_m.max(g.spec.grid_width_m)
}

/// Margin of prepared surface round a grid, metres: 10 mm all round (common practice), as the
/// gauge table's "area to prepare" states it.
pub(crate) const PREP_MARGIN_M: f64 = 10e-3;

/// Length and width of the area to prepare round `g`, along and across its reference
/// direction, metres: the grid plus [`PREP_MARGIN_M`] all round.
pub(crate) fn prep_size_m(g: &PlacedGauge) -> (f64, f64) {
    (
        g.spec.grid_length_m + 2.0 * PREP_MARGIN_M,
        g.spec.grid_width_m + 2.0 * PREP_MARGIN_M,
    )
}

/// Half the extent of the area to prepare round `g` along x and along s, metres (the
/// rectangle turned with the gauge).
pub(crate) fn prep_half_m(g: &PlacedGauge) -> (f64, f64) {
    let (l, w) = prep_size_m(g);
    let (sin, cos) = g.angle_rad.sin_cos();
    (
        0.5 * (l * cos.abs() + w * sin.abs()),
        0.5 * (l * sin.abs() + w * cos.abs()),
    )
}

/// One face with gauges, as drawn: unrolled from the seam when round, gauges and datum brought
/// into the drawn range.
#[derive(Debug, Clone)]
pub(crate) struct FaceSetup {
    pub face: Face,
    pub extent: FaceExtent,
    pub bounds: FaceBounds,
    /// Circumference of a round face, metres.
    pub period_m: Option<f64>,
    pub edges: FaceEdges,
    /// The gauges on the face, `s` as drawn.
    pub gauges: Vec<PlacedGauge>,
    /// The datum (x, s as drawn), metres.
    pub datum: (f64, f64),
    /// The datum as the part states it (s not brought into the drawn range), metres.
    pub datum_stated: (f64, f64),
    /// True on the outer face of a sphere (x is the meridian arc).
    pub sphere: bool,
    /// The true outline of a face of an imported part (empty for the closed-form faces, which
    /// fill their bounds).
    pub outline: Vec<OutlineEdge>,
    /// The surface of an imported part, to tell what lies on the face.
    pub surface: Option<Arc<SurfaceField>>,
}

impl FaceSetup {
    /// The face `extent` of `member` with the gauges of `placed` that lie on it; `None` when
    /// none does.
    pub fn new(
        member: &Member,
        extent: FaceExtent,
        placed: &[PlacedGauge],
        datum_m: (f64, f64),
    ) -> Option<Self> {
        let mut gauges: Vec<PlacedGauge> = placed
            .iter()
            .filter(|g| g.position.face == extent.face)
            .filter(|g| g.position.x_m.is_finite() && g.position.s_m.is_finite())
            .cloned()
            .collect();
        if gauges.is_empty() {
            return None;
        }
        let period_m = extent
            .wraps
            .then_some(extent.s_range_m.1 - extent.s_range_m.0)
            .filter(|p| p.is_finite() && *p > 0.0);
        let (seam_deg, s_m) = match period_m {
            Some(p) => {
                let r = p / TAU;
                let angles: Vec<f64> = gauges.iter().map(|g| g.position.s_m / r).collect();
                let seam = seam_angle(&angles);
                (seam.to_degrees(), (seam * r, seam * r + p))
            }
            None => (0.0, extent.s_range_m),
        };
        let drawn = |s: f64| period_m.map_or(s, |p| wrap_into(s, s_m.0, p));
        for g in &mut gauges {
            g.position.s_m = drawn(g.position.s_m);
        }
        let finite = |v: f64| if v.is_finite() { v } else { 0.0 };
        let datum_stated = (finite(datum_m.0), finite(datum_m.1));
        let datum = (datum_stated.0, drawn(datum_stated.1));
        Some(Self {
            face: extent.face,
            extent,
            bounds: FaceBounds {
                x_m: extent.x_range_m,
                s_m,
            },
            period_m,
            edges: face_edges(member, extent.face, seam_deg),
            gauges,
            datum,
            datum_stated,
            sphere: matches!(member, Member::ThinSphere(_)),
            outline: match (member, extent.face) {
                (Member::ImportedField(m), Face::Patch(k)) => m
                    .surface()
                    .map_or_else(Vec::new, |f| f.outline(usize::from(k))),
                _ => Vec::new(),
            },
            surface: match member {
                Member::ImportedField(ImportedSurface {
                    field: FieldState::Loaded(f),
                    ..
                }) => Some(f.clone()),
                _ => None,
            },
        })
    }

    /// The axes at `scale`, with `pad_pt` of face shown round each gauge, broken where they
    /// would be longer than `max` (width, height) points.
    pub fn axes(&self, scale: Scale, pad_pt: f64, max: (f32, f32)) -> (Axis, Axis) {
        let k = scale.pt_per_m();
        let pad = pad_pt / k;
        let datum_pad = 24.0 / k;
        let around = |c: f64, r: f64| (c - r, c + r);
        let clip = |(a, b): (f64, f64), (lo, hi): (f64, f64)| (a.max(lo), b.min(hi));
        let mut xs: Vec<(f64, f64)> = Vec::new();
        let mut ss: Vec<(f64, f64)> = Vec::new();
        for g in &self.gauges {
            // The whole area to prepare is shown, with a little face round it.
            let (px, ps) = prep_half_m(g);
            let rx = (reach_m(g) + pad).max(px + 6.0 / k);
            let rs = (reach_m(g) + pad).max(ps + 6.0 / k);
            xs.push(clip(around(g.position.x_m, rx), self.bounds.x_m));
            ss.push(clip(around(g.position.s_m, rs), self.bounds.s_m));
        }
        xs.push(around(self.datum.0, datum_pad));
        ss.push(around(self.datum.1, datum_pad));
        // A plate's hole is the feature the gauges are placed round: always shown whole.
        if let Some(a) = self
            .extent
            .hole_radius_m
            .filter(|a| a.is_finite() && *a > 0.0)
        {
            xs.push(clip(around(0.0, a + datum_pad), self.bounds.x_m));
            ss.push(clip(around(0.0, a + datum_pad), self.bounds.s_m));
        }
        (
            Axis {
                windows: windows(&xs, self.bounds.x_m, k, max.0),
                pt_per_m: k,
            },
            Axis {
                windows: windows(&ss, self.bounds.s_m, k, max.1),
                pt_per_m: k,
            },
        )
    }

    /// The scale of the series and the axes for a drawing within `width` × `height` points:
    /// the largest scale of 1:1 or more that shows the region unbroken; else the largest of
    /// 1:1 or more that breaks the face only along a direction in which it does not fit whole
    /// at 1:1; else the largest that fits with breaks; the smallest of the series when none
    /// does.
    pub fn fit(&self, width: f32, height: f32, pad_pt: f64) -> (Scale, Axis, Axis) {
        for scale in SERIES.iter().copied().filter(|s| s.ratio >= 1.0) {
            let (x, s) = self.axes(scale, pad_pt, (width, height));
            let unbroken = x.windows.len() == 1 && s.windows.len() == 1;
            if unbroken && x.length_pt() <= width && s.length_pt() <= height {
                return (scale, x, s);
            }
        }
        // Broken only along a direction where the face does not fit whole at 1:1; then, when
        // no scale of 1:1 or more allows that, wherever it must be.
        let k1 = Scale::FULL.pt_per_m();
        let fits_at_full = |(a, b): (f64, f64), max: f32| ((b - a) * k1) as f32 <= max;
        let may_break = (
            !fits_at_full(self.bounds.x_m, width),
            !fits_at_full(self.bounds.s_m, height),
        );
        let whole = |axis: &Axis, range: (f64, f64)| axis.windows == [range];
        for scale in SERIES.iter().copied().filter(|s| s.ratio >= 1.0) {
            let (x, s) = self.axes(scale, pad_pt, (width, height));
            let breaks_ok = (may_break.0 || whole(&x, self.bounds.x_m))
                && (may_break.1 || whole(&s, self.bounds.s_m));
            if breaks_ok && x.length_pt() <= width && s.length_pt() <= height {
                return (scale, x, s);
            }
        }
        for scale in SERIES {
            let (x, s) = self.axes(scale, pad_pt, (width, height));
            if x.length_pt() <= width && s.length_pt() <= height {
                return (scale, x, s);
            }
        }
        let scale = SERIES[SERIES.len() - 1];
        let (x, s) = self.axes(scale, pad_pt, (width, height));
        (scale, x, s)
    }

    /// How the face is seen, in words.
    pub fn view_words(&self) -> String {
        match self.face {
            Face::Top => "seen from above, looking down on the top face".into(),
            Face::Bottom => "seen from below, looking up at the bottom face".into(),
            Face::Front => "seen from the front (the −y side), looking at the front face".into(),
            Face::Back => "seen from the back (the +y side) with x running to the right, so the \
                           part shows upside down: the bottom face lies beyond the upper edge"
                .into(),
            Face::Round if self.sphere => "seen from outside, the surface unrolled flat: x \
                                           along a meridian across, from the bottom pole (−z) \
                                           on the left to the top pole (+z) on the right; s \
                                           round the equator up"
                .into(),
            Face::Round => "seen from outside, the surface unrolled flat: position x along \
                            the axis across, arc length s round the surface up"
                .into(),
            Face::Patch(_) => "seen from outside, square to the face's mean plane: x along the \
                               reference axis across, s up"
                .into(),
            Face::Plate => "seen square to the face, from the side the gauges are on".into(),
        }
    }

    /// What the datum's coordinates are measured from, in words.
    pub fn datum_words(&self) -> &'static str {
        match self.face {
            // gw_mechanics' surface_geometry: x is the meridian arc from the equator towards
            // the +z pole, s the arc along the equator from the meridian through +x (longitude
            // −s/r, so s grows towards −y).
            Face::Round if self.sphere => {
                "x along a meridian from the equator (x = 0), + towards the top pole (+z); s round \
                 the equator from the reference meridian (s = 0, the meridian through the +x \
                 axis of the part views: choose it on the part, at a nozzle or a weld seam, and \
                 mark it first), + towards −y. Mark s along the equator first, then go x up \
                 the meridian: the drawing's scale holds along those two lines only (along a \
                 circle of latitude at x the true distance is s·cos(x/R), R the sphere's \
                 radius)"
            }
            Face::Round => {
                "x along the axis from the member's start, s round from the top line (+z in the \
                 part views), + towards +y. A round part shows no top line of its own: \
                 choose the line on the part that is to be s = 0 (a keyway, a flat, a weld seam \
                 or a scribed mark), mark it first along the part, and measure s round from it \
                 in the direction the drawing's +s arrow shows"
            }
            Face::Plate => "x and s from the centre of the face",
            Face::Patch(_) => {
                "x and s from the face's centroid, x along the reference axis laid onto the face; \
                 find the datum on the part from the isometric view and the face's edges"
            }
            _ => "x along the member from its start, s across from the face's centre line",
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn scales_are_named_the_drawing_office_way() {
        let names: Vec<String> = SERIES.iter().map(|s| s.label()).collect();
        assert_eq!(names[..5], ["2:1", "1:1", "1:2", "1:2.5", "1:5"]);
        // 25.4 mm at 1:1 is 72 pt; at 1:2 it is 36 pt.
        assert!((Scale::FULL.pt_per_m() * 0.0254 - 72.0).abs() < 1e-9);
        assert!((SERIES[2].pt_per_m() * 0.0254 - 36.0).abs() < 1e-9);
    }

    #[test]
    fn windows_merge_near_items_and_break_between_far_ones() {
        // At 1 pt per mm with 80 pt to spare: items 10 mm apart merge, 100 mm apart do not;
        // the first window reaches the face's start 5 mm away, the last stops short of the
        // end 300 mm away.
        let k = 1000.0;
        let items = [(0.005, 0.015), (0.025, 0.03), (0.13, 0.14)];
        let w = windows(&items, (0.0, 0.45), k, 80.0);
        assert_eq!(w, vec![(0.0, 0.03), (0.13, 0.14)]);
        // With room for 200 pt the 100 mm gap closes; with 500 pt the whole face shows.
        assert_eq!(windows(&items, (0.0, 0.45), k, 200.0), vec![(0.0, 0.14)]);
        assert_eq!(windows(&items, (0.0, 0.45), k, 500.0), vec![(0.0, 0.45)]);
        let axis = Axis {
            windows: w,
            pt_per_m: k,
        };
        assert!((axis.length_pt() - (30.0 + 10.0 + BREAK_PT)).abs() < 1e-3);
        assert!((axis.to_pt(0.135).unwrap() - (30.0 + BREAK_PT + 5.0)).abs() < 1e-3);
        assert!(axis.to_pt(0.08).is_none());
    }
}
