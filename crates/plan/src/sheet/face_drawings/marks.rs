//! The marks of a face drawing: the frame from face to page, gauges with their grids, solder
//! tabs and direction arrows, dimension lines with arrowheads, break lines, the datum symbol,
//! the scale bar and the axis arrows.

use gw_bridge::PlacedGauge;

use super::plan::Axis;
use crate::sheet::layout::Area;
use crate::sheet::writer::Writer;

/// Where the face lands on the page: x runs right, s runs up.
#[derive(Debug, Clone)]
pub(crate) struct Frame {
    pub x: Axis,
    pub s: Axis,
    /// Page position of the drawing's left edge and top edge, points.
    pub left: f32,
    pub top: f32,
}

impl Frame {
    pub fn width(&self) -> f32 {
        self.x.length_pt()
    }

    pub fn height(&self) -> f32 {
        self.s.length_pt()
    }

    pub fn area(&self) -> Area {
        Area::new(
            self.left,
            self.top,
            self.left + self.width(),
            self.top + self.height(),
        )
    }

    pub fn page_x(&self, x_m: f64) -> Option<f32> {
        self.x.to_pt(x_m).map(|v| self.left + v)
    }

    pub fn page_y(&self, s_m: f64) -> Option<f32> {
        self.s.to_pt(s_m).map(|v| self.top + self.height() - v)
    }

    /// Page point of (x, s), measured in the windows that hold `near` (a gauge's centre).
    pub fn page_near(&self, x_m: f64, s_m: f64, near: (f64, f64)) -> [f32; 2] {
        [
            self.left + self.x.to_pt_near(x_m, near.0),
            self.top + self.height() - self.s.to_pt_near(s_m, near.1),
        ]
    }
}

/// A polyline (closed: a polygon) drawn as straight lines.
pub(crate) fn poly(w: &mut Writer, points: &[[f32; 2]], closed: bool, width: f32, grey: u8) {
    for p in points.windows(2) {
        w.line(p[0], p[1], width, grey);
    }
    if closed && points.len() > 2 {
        w.line(points[points.len() - 1], points[0], width, grey);
    }
}

/// A filled arrowhead with its tip at `tip`, pointing along the unit vector `dir`.
pub(crate) fn arrow_head(w: &mut Writer, tip: [f32; 2], dir: [f32; 2], len: f32) {
    let half = 0.3 * len;
    let base = [tip[0] - dir[0] * len, tip[1] - dir[1] * len];
    let side = [-dir[1] * half, dir[0] * half];
    let a = [base[0] + side[0], base[1] + side[1]];
    let b = [base[0] - side[0], base[1] - side[1]];
    w.path(vec![tip, a, b], true, 0.3, Some(0));
}

/// A dimension line from `a` to `b` with arrowheads at both ends; when it is too short for
/// them, the arrows sit outside pointing in, on short runs of the line.
pub(crate) fn dimension_line(w: &mut Writer, a: [f32; 2], b: [f32; 2]) {
    let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
    let len = dx.hypot(dy);
    if len < 1e-3 {
        return;
    }
    let u = [dx / len, dy / len];
    let head = 5.0;
    if len >= 2.6 * head {
        w.line(a, b, 0.4, 0);
        arrow_head(w, a, [-u[0], -u[1]], head);
        arrow_head(w, b, u, head);
    } else {
        let out = head + 5.0;
        w.line(
            [a[0] - u[0] * out, a[1] - u[1] * out],
            [b[0] + u[0] * out, b[1] + u[1] * out],
            0.4,
            0,
        );
        arrow_head(w, a, u, head);
        arrow_head(w, b, [-u[0], -u[1]], head);
    }
}

/// An extension line (thin, grey) from `a` to `b`.
pub(crate) fn extension_line(w: &mut Writer, a: [f32; 2], b: [f32; 2]) {
    w.line(a, b, 0.3, 90);
}

/// A break line from `a` to `b`: straight with one zig-zag in the middle.
pub(crate) fn break_line(w: &mut Writer, a: [f32; 2], b: [f32; 2]) {
    let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
    let len = dx.hypot(dy);
    if len < 1e-3 {
        return;
    }
    let u = [dx / len, dy / len];
    let n = [-u[1], u[0]];
    let z = 4.0f32.min(len / 6.0);
    let at = |t: f32, off: f32| [a[0] + u[0] * t + n[0] * off, a[1] + u[1] * t + n[1] * off];
    let m = len / 2.0;
    let points = [
        a,
        at(m - z, 0.0),
        at(m - z / 2.0, 1.6 * z),
        at(m + z / 2.0, -1.6 * z),
        at(m + z, 0.0),
        b,
    ];
    poly(w, &points, false, 0.6, 0);
}

/// The datum symbol: a circle of radius `r` with a cross through it; returns its box.
pub(crate) fn datum_mark(w: &mut Writer, c: [f32; 2], r: f32) -> Area {
    let points: Vec<[f32; 2]> = (0..20)
        .map(|k| {
            let t = k as f32 / 20.0 * std::f32::consts::TAU;
            [c[0] + r * t.cos(), c[1] + r * t.sin()]
        })
        .collect();
    poly(w, &points, true, 0.8, 0);
    let k = 1.7 * r;
    w.line([c[0] - k, c[1]], [c[0] + k, c[1]], 0.6, 0);
    w.line([c[0], c[1] - k], [c[0], c[1] + k], 0.6, 0);
    Area::new(c[0] - k, c[1] - k, c[0] + k, c[1] + k)
}

/// Page direction of a grid axis at `angle_rad` counter-clockwise from +x (page y runs down).
fn page_dir(angle_rad: f64) -> [f32; 2] {
    let (s, c) = angle_rad.sin_cos();
    [c as f32, -(s as f32)]
}

/// A gauge as drawn: the box round everything drawn, and for each grid (in the order of
/// `PlacedGauge::footprint`) the page point just beyond its solder tabs and the grid's page
/// direction.
#[derive(Debug, Clone)]
pub(crate) struct GaugeMarks {
    pub area: Area,
    pub tab_ends: Vec<([f32; 2], [f32; 2])>,
}

/// One gauge at page point `centre`, `k` points per metre: every grid's outline, its grid
/// lines along the grid direction and two solder tabs beyond the grid's start (the end away
/// from its direction, as the app's face view draws them), and an arrow along the gauge's
/// reference direction.
pub(crate) fn gauge(w: &mut Writer, g: &PlacedGauge, centre: [f32; 2], k: f32) -> GaugeMarks {
    let len = g.spec.grid_length_m as f32 * k;
    let wid = g.spec.grid_width_m as f32 * k;
    let mut pts: Vec<[f32; 2]> = Vec::new();
    let mut tab_ends = Vec::new();
    for e in 0..g.element_count() {
        let u = page_dir(g.footprint(e).angle_rad);
        pts.extend(grid(w, centre, u, len, wid));
        let back = len * (0.5 + 0.08 + 0.28);
        tab_ends.push(([centre[0] - u[0] * back, centre[1] - u[1] * back], u));
    }
    let u = page_dir(g.angle_rad);
    let reach = pts
        .iter()
        .map(|p| (p[0] - centre[0]).hypot(p[1] - centre[1]))
        .fold(0.0f32, f32::max);
    let from = reach + 1.5;
    let tip = from + (0.6 * len).clamp(9.0, 16.0);
    let at = |t: f32| [centre[0] + u[0] * t, centre[1] + u[1] * t];
    w.line(at(from), at(tip - 3.0), 0.7, 0);
    arrow_head(w, at(tip), u, 5.0);
    pts.push(at(tip));
    let area = pts.iter().fold(
        Area::new(centre[0], centre[1], centre[0], centre[1]),
        |a, p| {
            Area::new(
                a.x0.min(p[0]),
                a.y0.min(p[1]),
                a.x1.max(p[0]),
                a.y1.max(p[1]),
            )
        },
    );
    GaugeMarks { area, tab_ends }
}

/// The part of a polygon (closed; any shape) inside `clip`, by clipping against each side in
/// turn (Sutherland–Hodgman). Where the polygon leaves the box and comes back, the result runs
/// along the box's side; filled, it covers exactly the polygon's area inside the box.
pub(crate) fn clip_polygon(points: &[[f32; 2]], clip: &Area) -> Vec<[f32; 2]> {
    let mut out = points.to_vec();
    // (axis, limit, keep the side above the limit)
    for (axis, limit, above) in [
        (0, clip.x0, true),
        (0, clip.x1, false),
        (1, clip.y0, true),
        (1, clip.y1, false),
    ] {
        let input = std::mem::take(&mut out);
        let Some(&last) = input.last() else {
            break;
        };
        let inside = |p: [f32; 2]| {
            if above {
                p[axis] >= limit
            } else {
                p[axis] <= limit
            }
        };
        let cross = |a: [f32; 2], b: [f32; 2]| {
            let t = (limit - a[axis]) / (b[axis] - a[axis]);
            [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])]
        };
        let mut prev = last;
        for &p in &input {
            match (inside(prev), inside(p)) {
                (true, true) => out.push(p),
                (true, false) => out.push(cross(prev, p)),
                (false, true) => {
                    out.push(cross(prev, p));
                    out.push(p);
                }
                (false, false) => {}
            }
            prev = p;
        }
    }
    out
}

/// The part of segment `a`–`b` inside `clip`, if any (Liang–Barsky).
pub(crate) fn clip_segment(a: [f32; 2], b: [f32; 2], clip: &Area) -> Option<([f32; 2], [f32; 2])> {
    let d = [b[0] - a[0], b[1] - a[1]];
    let (mut t0, mut t1) = (0.0f32, 1.0f32);
    for (p, q) in [
        (-d[0], a[0] - clip.x0),
        (d[0], clip.x1 - a[0]),
        (-d[1], a[1] - clip.y0),
        (d[1], clip.y1 - a[1]),
    ] {
        if p.abs() < 1e-9 {
            if q < 0.0 {
                return None;
            }
            continue;
        }
        let t = q / p;
        if p < 0.0 {
            t0 = t0.max(t);
        } else {
            t1 = t1.min(t);
        }
    }
    (t0 < t1).then(|| {
        let at = |t: f32| [a[0] + d[0] * t, a[1] + d[1] * t];
        (at(t0), at(t1))
    })
}

/// The pieces of segment `a`–`b` left once the stretch inside each box of `avoid` is cut
/// out, in order from `a`.
pub(crate) fn outside_boxes(a: [f32; 2], b: [f32; 2], avoid: &[Area]) -> Vec<([f32; 2], [f32; 2])> {
    let d = [b[0] - a[0], b[1] - a[1]];
    let mut cuts: Vec<(f32, f32)> = avoid
        .iter()
        .filter_map(|area| {
            let (p, q) = clip_segment(a, b, area)?;
            let t = |p: [f32; 2]| {
                let n = d[0] * d[0] + d[1] * d[1];
                if n < 1e-12 {
                    0.0
                } else {
                    ((p[0] - a[0]) * d[0] + (p[1] - a[1]) * d[1]) / n
                }
            };
            Some((t(p), t(q)))
        })
        .collect();
    cuts.sort_by(|p, q| p.0.total_cmp(&q.0));
    let at = |t: f32| [a[0] + d[0] * t, a[1] + d[1] * t];
    let mut out = Vec::new();
    let mut from = 0.0f32;
    for (c0, c1) in cuts {
        if c0 > from {
            out.push((at(from), at(c0)));
        }
        from = from.max(c1);
    }
    if from < 1.0 {
        out.push((at(from), at(1.0)));
    }
    out
}

/// The pieces of segment `a`–`b` outside the circle of centre `c` and radius `r`, in order
/// from `a`.
pub(crate) fn outside_circle(
    a: [f32; 2],
    b: [f32; 2],
    c: [f32; 2],
    r: f32,
) -> Vec<([f32; 2], [f32; 2])> {
    // Points a + t·d with |a + t·d − c| = r: t² d·d + 2 t d·(a − c) + |a − c|² − r² = 0.
    let d = [b[0] - a[0], b[1] - a[1]];
    let m = [a[0] - c[0], a[1] - c[1]];
    let qa = d[0] * d[0] + d[1] * d[1];
    let qb = 2.0 * (d[0] * m[0] + d[1] * m[1]);
    let qc = m[0] * m[0] + m[1] * m[1] - r * r;
    let disc = qb * qb - 4.0 * qa * qc;
    if qa < 1e-12 || r.is_nan() || r <= 0.0 || disc <= 0.0 {
        return vec![(a, b)];
    }
    let root = disc.sqrt();
    let (t0, t1) = ((-qb - root) / (2.0 * qa), (-qb + root) / (2.0 * qa));
    let at = |t: f32| [a[0] + d[0] * t, a[1] + d[1] * t];
    let mut out = Vec::new();
    if t0 > 0.0 {
        out.push((a, at(t0.min(1.0))));
    }
    if t1 < 1.0 {
        out.push((at(t1.max(0.0)), b));
    }
    out
}

/// A dashed grey line from `a` to `b`: dashes of `dash` points with gaps of half that.
pub(crate) fn dashed(w: &mut Writer, a: [f32; 2], b: [f32; 2], dash: f32, grey: u8) {
    let len = (b[0] - a[0]).hypot(b[1] - a[1]);
    if len < 0.3 {
        return;
    }
    let u = [(b[0] - a[0]) / len, (b[1] - a[1]) / len];
    let mut t = 0.0;
    while t < len {
        let e = (t + dash).min(len);
        w.line(
            [a[0] + u[0] * t, a[1] + u[1] * t],
            [a[0] + u[0] * e, a[1] + u[1] * e],
            0.5,
            grey,
        );
        t = e + 0.5 * dash;
    }
}

/// One grid: outline, four lines along `u`, tabs beyond the −u end. Returns its corner points.
fn grid(w: &mut Writer, c: [f32; 2], u: [f32; 2], len: f32, wid: f32) -> Vec<[f32; 2]> {
    let v = [-u[1], u[0]];
    let at = |a: f32, b: f32| [c[0] + u[0] * a + v[0] * b, c[1] + u[1] * a + v[1] * b];
    let (l, h) = (len / 2.0, wid / 2.0);
    let outline = vec![at(-l, -h), at(l, -h), at(l, h), at(-l, h)];
    poly(w, &outline, true, 0.6, 0);
    let n = 4;
    for i in 0..n {
        let b = -h + wid * (i as f32 + 0.5) / n as f32;
        w.line(at(-0.92 * l, b), at(0.92 * l, b), 0.35, 60);
    }
    let (tab_len, tab_wid) = (0.28 * len, 0.38 * wid);
    let start = -l - 0.08 * len;
    let mut out = outline;
    for side in [-1.0f32, 1.0] {
        let mid = side * (h - tab_wid / 2.0);
        let pad = vec![
            at(start, mid - tab_wid / 2.0),
            at(start - tab_len, mid - tab_wid / 2.0),
            at(start - tab_len, mid + tab_wid / 2.0),
            at(start, mid + tab_wid / 2.0),
        ];
        out.extend(pad.iter().copied());
        w.path(pad, true, 0.5, Some(150));
    }
    out
}

/// A scale bar `length_pt` long from (`x`, `y`): five parts, black and white in turn, with "0"
/// and `label` (its length, "50 mm" or "2 in") under its ends. Returns its box.
pub(crate) fn scale_bar(w: &mut Writer, x: f32, y: f32, label: &str, length_pt: f64) -> Area {
    let len = length_pt as f32;
    let h = 3.0;
    for k in 0..5 {
        let a = x + len * k as f32 / 5.0;
        w.rect(
            Area::new(a, y, a + len / 5.0, y + h),
            Some(if k % 2 == 0 { 0 } else { 255 }),
            0.5,
        );
    }
    let size = super::LABEL;
    let zero = w.text_top(x - 2.0, y + h + 2.0, size, false, "0");
    let end = crate::sheet::layout::text_width(label, size, false);
    let last = w.text_top(x + len - end / 2.0, y + h + 2.0, size, false, label);
    Area::new(x, y, last.x1.max(x + len), zero.y1.max(last.y1))
}

/// The axis arrows from (`x`, `y`) (their common tail): "+x" to the right, "+s" up, each
/// `len` points. Returns the box of the glyph with its labels.
pub(crate) fn axis_arrows(w: &mut Writer, x: f32, y: f32, len: f32) -> Area {
    w.line([x, y], [x + len - 3.0, y], 0.7, 0);
    arrow_head(w, [x + len, y], [1.0, 0.0], 5.0);
    w.line([x, y], [x, y - len + 3.0], 0.7, 0);
    arrow_head(w, [x, y - len], [0.0, -1.0], 5.0);
    let a = w.text_top(x + len + 3.0, y - 5.0, 7.5, true, "+x");
    let b = w.text_top(x + 4.0, y - len - 4.0, 7.5, true, "+s");
    Area::new(x - 4.0, b.y0, a.x1, y + 4.0)
}
