//! Drawing symbols of the part views: arrows, turning arrows, dashed (hidden) lines, the
//! clamp's hatching, pins, gauge marks, the axes and the scale bar. Sizes are in points.

use crate::sheet::layout::{Area, Op, ascent, text_width};
use crate::sheet::writer::Writer;

/// Size of the views' labels, points.
pub(super) const LABEL: f32 = 7.5;

fn sub(a: [f32; 2], b: [f32; 2]) -> [f32; 2] {
    [a[0] - b[0], a[1] - b[1]]
}

fn along(a: [f32; 2], u: [f32; 2], k: f32) -> [f32; 2] {
    [a[0] + k * u[0], a[1] + k * u[1]]
}

pub(super) fn unit(d: [f32; 2]) -> [f32; 2] {
    let n = d[0].hypot(d[1]);
    if n < 1e-6 {
        [0.0, 0.0]
    } else {
        [d[0] / n, d[1] / n]
    }
}

/// A straight arrow with a filled head at `head`.
pub(super) fn arrow(w: &mut Writer, tail: [f32; 2], head: [f32; 2], width: f32) {
    let d = sub(head, tail);
    let len = d[0].hypot(d[1]);
    if len < 2.0 {
        return;
    }
    let u = unit(d);
    let h = 5.0f32.min(0.45 * len);
    let side = [-u[1] * h * 0.38, u[0] * h * 0.38];
    let base = along(head, u, -h);
    w.line(tail, along(head, u, -0.8 * h), width, 0);
    w.ops().push(Op::Path {
        points: vec![head, along(base, side, 1.0), along(base, side, -1.0)],
        closed: true,
        width: 0.3,
        grey: 0,
        fill: Some(0),
    });
}

/// The points of a turning arrow: three quarters of a circle round `centre`, turning
/// anticlockwise on the page when `anticlockwise`, the open quarter facing `gap`; the arrow's
/// head is at the last point.
pub(super) fn turning_points(
    centre: [f32; 2],
    radius: f32,
    anticlockwise: bool,
    gap: [f32; 2],
) -> Vec<[f32; 2]> {
    // Page angles measured anticlockwise as seen (y down, hence the minus signs).
    let gap_angle = if gap == [0.0, 0.0] {
        -std::f32::consts::FRAC_PI_4
    } else {
        (-gap[1]).atan2(gap[0])
    };
    let sense = if anticlockwise { 1.0 } else { -1.0 };
    let start = gap_angle + sense * std::f32::consts::FRAC_PI_4;
    let at = |t: f32| {
        let a = start + sense * t;
        [centre[0] + radius * a.cos(), centre[1] - radius * a.sin()]
    };
    let n = 24;
    let span = 1.5 * std::f32::consts::PI;
    (0..=n).map(|k| at(span * k as f32 / n as f32)).collect()
}

/// A turning arrow along `points` (from [`turning_points`]).
pub(super) fn turning_arrow(w: &mut Writer, points: &[[f32; 2]]) {
    let n = points.len() - 1;
    w.path(points[..n - 1].to_vec(), false, 0.9, None);
    arrow(w, points[n - 2], points[n], 0.9);
}

/// A hidden line: dashes along the polyline.
pub(super) fn dashed(w: &mut Writer, points: &[[f32; 2]], width: f32) {
    let (dash, gap) = (3.0, 2.0);
    let mut drawing = true;
    let mut left: f32 = dash;
    for seg in points.windows(2) {
        let (mut a, b) = (seg[0], seg[1]);
        let mut len = sub(b, a)[0].hypot(sub(b, a)[1]);
        let u = unit(sub(b, a));
        while len > 1e-4 {
            let step = left.min(len);
            let next = along(a, u, step);
            if drawing {
                w.line(a, next, width, 70);
            }
            a = next;
            len -= step;
            left -= step;
            if left <= 1e-4 {
                drawing = !drawing;
                left = if drawing { dash } else { gap };
            }
        }
    }
}

/// The hatching of a fixed end: a wall line across the member at `x` from `y0` to `y1`, with
/// short strokes on the side `side` (−1 left, +1 right) of it.
pub(super) fn clamp(w: &mut Writer, x: f32, (y0, y1): (f32, f32), side: f32) {
    w.line([x, y0], [x, y1], 1.4, 0);
    let mut y = y0 + 3.0;
    while y <= y1 + 0.01 {
        w.line([x, y], [x + side * 6.0, y - 6.0], 0.5, 0);
        y += 4.0;
    }
}

/// A pin under a beam: a triangle with its apex at `apex`, on hatched ground.
pub(super) fn pin(w: &mut Writer, apex: [f32; 2]) {
    let (h, half) = (9.0, 5.5);
    let base = apex[1] + h;
    w.path(
        vec![apex, [apex[0] - half, base], [apex[0] + half, base]],
        true,
        0.8,
        None,
    );
    w.line([apex[0] - 9.0, base], [apex[0] + 9.0, base], 0.8, 0);
    let mut x = apex[0] - 7.0;
    while x <= apex[0] + 9.0 {
        w.line([x, base], [x - 4.0, base + 4.0], 0.5, 0);
        x += 4.0;
    }
}

/// Radius of a gauge mark, points.
pub(super) const MARK: f32 = 3.2;
/// Radius of the dashed ring of a hidden gauge that lies under a seen one, points.
pub(super) const RING: f32 = 5.4;

/// A gauge mark: a circled cross where the gauge is seen, a dashed circle of radius `r` where
/// it is behind the part.
pub(super) fn gauge_mark(w: &mut Writer, at: [f32; 2], hidden: bool, r: f32) {
    let n = if hidden { 24 } else { 16 };
    let circle: Vec<[f32; 2]> = (0..=n)
        .map(|k| {
            let t = std::f32::consts::TAU * k as f32 / n as f32;
            [at[0] + r * t.cos(), at[1] + r * t.sin()]
        })
        .collect();
    if hidden {
        for k in (0..n).step_by(2) {
            w.line(circle[k], circle[k + 1], 0.6, 0);
        }
    } else {
        w.path(circle, true, 0.8, Some(255));
        w.line([at[0] - r, at[1]], [at[0] + r, at[1]], 0.6, 0);
        w.line([at[0], at[1] - r], [at[0], at[1] + r], 0.6, 0);
    }
}

/// The axes of a view: an arrow for each axis in the page's plane, a circle with a dot (axis
/// towards the reader) or a cross (away) for the one along the line of sight. `dirs` are the
/// page directions of x, y and z with their depths. Returns the label anchors.
pub(super) fn axes(w: &mut Writer, origin: [f32; 2], dirs: [([f32; 2], f64); 3]) -> [[f32; 2]; 3] {
    let len = 12.0;
    let mut tips = [origin; 3];
    for (i, (d, toward)) in dirs.iter().enumerate() {
        if d[0].hypot(d[1]) > 0.5 {
            tips[i] = along(origin, unit(*d), len);
            arrow(w, origin, tips[i], 0.7);
        } else {
            let r = 2.6;
            let ring: Vec<[f32; 2]> = (0..12)
                .map(|k| {
                    let t = std::f32::consts::TAU * k as f32 / 12.0;
                    [origin[0] + r * t.cos(), origin[1] + r * t.sin()]
                })
                .collect();
            w.path(ring, true, 0.6, Some(255));
            if *toward > 0.0 {
                w.path(
                    vec![
                        [origin[0] - 0.7, origin[1] - 0.7],
                        [origin[0] + 0.7, origin[1] - 0.7],
                        [origin[0] + 0.7, origin[1] + 0.7],
                        [origin[0] - 0.7, origin[1] + 0.7],
                    ],
                    true,
                    0.3,
                    Some(0),
                );
            } else {
                let k = 0.7 * r;
                w.line(
                    [origin[0] - k, origin[1] - k],
                    [origin[0] + k, origin[1] + k],
                    0.5,
                    0,
                );
                w.line(
                    [origin[0] - k, origin[1] + k],
                    [origin[0] + k, origin[1] - k],
                    0.5,
                    0,
                );
            }
        }
    }
    tips
}

/// A scale bar at `k` points per metre from (`x`, `top`): five blocks, black and white, with
/// "0" and its length in the sheet's length unit under the ends, and `caption` after it.
/// Returns the right edge of what it drew.
pub(super) fn scale_bar(w: &mut Writer, x: f32, top: f32, k: f64, caption: &str) -> f32 {
    let (length_m, end) = crate::sheet::scale_bar_length(w.units, k, 110.0);
    let length = (length_m * k) as f32;
    let block = length / 5.0;
    for i in 0..5 {
        let x0 = x + i as f32 * block;
        w.rect(
            Area::new(x0, top, x0 + block, top + 3.5),
            Some(if i % 2 == 0 { 0 } else { 255 }),
            0.5,
        );
    }
    let under = top + 5.0;
    let zero = text_width("0", LABEL, false);
    w.text_top(x - zero / 2.0, under, LABEL, false, "0");
    let ew = text_width(&end, LABEL, false);
    let end_box = w.text_top(x + length - ew / 2.0, under, LABEL, false, &end);
    let cx = end_box.x1.max(x + length) + 8.0;
    let cy = top + 1.75 - ascent(8.0, false) / 2.0;
    let c = w.text_top(cx, cy, 8.0, false, caption);
    c.x1
}

#[cfg(test)]
mod tests {
    #[test]
    fn the_scale_bar_is_a_round_length_that_fits() {
        use crate::sheet::scale_bar_length;
        use crate::units::Units;
        // 1:5 is 2834.6 / 5 = 566.9 pt per metre: 100 mm is 56.7 pt, 200 mm 113 pt.
        let k = 72.0 / 0.0254 / 5.0;
        let (l, text) = scale_bar_length(Units::Si, k, 110.0);
        assert!((l - 0.1).abs() < 1e-12);
        assert_eq!(text, "100 mm");
        assert!((scale_bar_length(Units::Si, k, 120.0).0 - 0.2).abs() < 1e-12);
        // 1:1: 20 mm is 56.7 pt, 50 mm 141.7 pt.
        assert!((scale_bar_length(Units::Si, 72.0 / 0.0254, 110.0).0 - 0.02).abs() < 1e-12);
        // In inches (72 pt each at 1:1, by the definition of the point): 1 in fits 110 pt,
        // 2 in (144 pt) does not; at 1:5 an inch is 14.4 pt, so 5 in (72 pt) fits.
        let (l, text) = scale_bar_length(Units::UsCustomary, 72.0 / 0.0254, 110.0);
        assert_eq!(text, "1 in");
        assert!((l - 0.0254).abs() < 1e-12);
        assert_eq!(scale_bar_length(Units::UsCustomary, k, 110.0).1, "5 in");
    }
}
