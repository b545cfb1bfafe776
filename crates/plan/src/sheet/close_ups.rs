//! Imported parts: a close-up round each gauge on its face, two to a row. Each shows the face's
//! own outline near the gauge (its edges to the neighbouring faces, named), the element edges
//! of the mesh there in grey, the other gauges that lie within it, the gauge with its grids and
//! direction, the distance from the gauge's centre to the nearest edge of the face, the face's
//! x and s directions, and the scale with a scale bar.

use gw_bridge::PlacedGauge;
use gw_mechanics::imported::{OutlineEdge, SurfaceField};
use gw_mechanics::{Face, Member};

use super::face_drawings::marks::{
    arrow_head, axis_arrows, clip_segment, dimension_line, gauge, scale_bar,
};
use super::layout::{Area, line_pitch};
use super::writer::Writer;
use crate::document::Part;
use crate::units::Quantity;

/// Points per metre on paper at 1:1.
const PT_PER_M: f64 = 72.0 / 0.0254;
/// Close-up scales tried, largest first (enlargements of the 1, 2, 5 series).
const SCALES: [f64; 8] = [20.0, 10.0, 5.0, 2.0, 1.0, 0.5, 0.2, 0.1];
/// Height of one close-up's drawing, points.
const BOX_H: f32 = 150.0;
/// Gap between the two close-ups of a row, points.
const GAP: f32 = 14.0;
/// Most element edges drawn in one close-up; a finer mesh is said in words.
const MAX_TRIANGLES: usize = 3000;
/// Label size, points.
const LABEL: f32 = 7.5;

/// Draws the close-ups of an imported part's gauges from `w.y` down; nothing for other parts.
pub(crate) fn draw(w: &mut Writer, part: &Part, placed: &[PlacedGauge]) {
    let Member::ImportedField(f) = &part.member else {
        return;
    };
    let Some(field) = f.surface() else {
        return;
    };
    let on_patches: Vec<usize> = (0..placed.len())
        .filter(|&i| matches!(placed[i].position.face, Face::Patch(_)))
        .collect();
    if on_patches.is_empty() {
        return;
    }
    w.heading("Close-ups round the gauges");
    w.para(
        8.0,
        false,
        "Each gauge on its face, seen from outside the part: the face's edges (heavy, named by \
         the face beyond), the mesh's element edges (grey), the nearest edge's distance from \
         the gauge's centre, and the face's +x and +s directions. Scales hold when printed at \
         100 %.",
    );
    let width = (w.column() - GAP) / 2.0;
    for pair in on_patches.chunks(2) {
        let title_h = 2.0 * line_pitch(9.0, true) + 2.0 * line_pitch(LABEL, false) + 6.0;
        w.room(title_h + BOX_H + 8.0);
        let top = w.y;
        let mut bottom = top;
        for (k, &gi) in pair.iter().enumerate() {
            let left = w.left() + k as f32 * (width + GAP);
            bottom = bottom.max(close_up(w, field, placed, gi, left, top, width));
        }
        w.y = bottom + 10.0;
    }
}

/// The largest scale at which a square of `span_m` fits in `room_pt`.
fn scale_for(span_m: f64, room_pt: f32) -> f64 {
    SCALES
        .into_iter()
        .find(|r| span_m * r * PT_PER_M <= f64::from(room_pt))
        .unwrap_or(SCALES[SCALES.len() - 1])
}

/// "5:1", "1:2".
fn ratio(r: f64) -> String {
    if r >= 1.0 {
        format!("{r:.0}:1")
    } else {
        format!("1:{:.0}", 1.0 / r)
    }
}

/// The point of segment `e` nearest `p`, and its distance, metres.
fn nearest_on(e: &OutlineEdge, p: [f64; 2]) -> ([f64; 2], f64) {
    let d = [e.to[0] - e.from[0], e.to[1] - e.from[1]];
    let len2 = d[0] * d[0] + d[1] * d[1];
    let t = if len2 > 0.0 {
        (((p[0] - e.from[0]) * d[0] + (p[1] - e.from[1]) * d[1]) / len2).clamp(0.0, 1.0)
    } else {
        0.0
    };
    let q = [e.from[0] + t * d[0], e.from[1] + t * d[1]];
    (q, (q[0] - p[0]).hypot(q[1] - p[1]))
}

/// What lies beyond an edge, in words.
fn beyond_text(beyond: Option<usize>) -> String {
    match beyond {
        Some(k) => format!("edge to face {}", k + 1),
        None => "free edge".to_owned(),
    }
}

/// One close-up at (`left`, `top`), `width` wide; returns its bottom.
fn close_up(
    w: &mut Writer,
    field: &SurfaceField,
    placed: &[PlacedGauge],
    gi: usize,
    left: f32,
    top: f32,
    width: f32,
) -> f32 {
    let g = &placed[gi];
    let Face::Patch(face) = g.position.face else {
        return top;
    };
    let face = usize::from(face);
    let centre_m = [g.position.x_m, g.position.s_m];
    let outline = field.outline(face);
    let mesh = field.mesh_size_m(face).unwrap_or(0.0);
    let nearest = outline
        .iter()
        .map(|e| (e, nearest_on(e, centre_m)))
        .min_by(|a, b| a.1.1.total_cmp(&b.1.1));
    // The window: the gauge with room round it and a few elements at least; the nearest edge
    // is brought in when it lies a little beyond, and farther an arrow points to it.
    let size = g.spec.grid_length_m.max(g.spec.grid_width_m);
    let edge_d = nearest.map_or(f64::INFINITY, |n| n.1.1);
    let base = (2.0 * size).max(1.5 * mesh).max(2e-3);
    let half = if edge_d < 1.5 * base {
        base.max(1.15 * edge_d)
    } else {
        base
    };
    let r = scale_for(2.0 * half, BOX_H.min(width));
    let k = (r * PT_PER_M) as f32;
    let title = format!("{} on face {}, scale {}", g.id, face + 1, ratio(r));
    let after_title = w.wrapped(left, top, width, 9.0, true, &title);
    let area = Area::new(
        left,
        after_title + 2.0,
        left + width,
        after_title + 2.0 + BOX_H,
    );
    let page = |p: [f64; 2]| -> [f32; 2] {
        let cx = left + width / 2.0;
        let cy = area.y0 + BOX_H / 2.0;
        [
            cx + ((p[0] - centre_m[0]) as f32) * k,
            cy - ((p[1] - centre_m[1]) as f32) * k,
        ]
    };
    w.rect(area, None, 0.4);
    let reach_m = [
        f64::from(width / 2.0) / f64::from(k),
        f64::from(BOX_H / 2.0) / f64::from(k),
    ];
    let drawn_mesh = mesh_lines(w, field, face, centre_m, reach_m, &area, &page);
    for e in &outline {
        if let Some((a, b)) = clip_segment(page(e.from), page(e.to), &area) {
            w.line(a, b, 1.4, 0);
        }
    }
    // Gauge names stay out of the drawing (the mesh's lines run everywhere in it): the other
    // gauges drawn are named under it.
    let mut others = Vec::new();
    for (j, other) in placed.iter().enumerate() {
        let same_face = other.position.face == g.position.face;
        let at = page([other.position.x_m, other.position.s_m]);
        if j != gi
            && same_face
            && area
                .grown(-6.0)
                .contains(&Area::new(at[0], at[1], at[0], at[1]))
        {
            gauge(w, other, at, k);
            others.push(other.id.clone());
        }
    }
    let centre = page(centre_m);
    gauge(w, g, centre, k);
    let mut lines = Vec::new();
    if let Some((e, (foot, d))) = nearest {
        draw_to_edge(w, centre, page(foot), d, &area);
        lines.push(format!(
            "Nearest edge of the face ({}): {} from the centre.",
            beyond_text(e.beyond),
            w.units.format(Quantity::Length, d)
        ));
    }
    if !others.is_empty() {
        lines.push(format!("Also drawn: {}.", others.join(", ")));
    }
    lines.push(if drawn_mesh {
        format!(
            "Element edges in grey (elements about {}).",
            w.units.format(Quantity::Length, mesh)
        )
    } else {
        format!(
            "Elements about {}: finer than drawn.",
            w.units.format(Quantity::Length, mesh)
        )
    });
    let mut below = area.y1 + 3.0;
    for line in &lines {
        below = w.wrapped(left, below, width, LABEL, false, line);
    }
    // The scale bar at the left, the face's axes at the right, under the text.
    let (bar_m, label) =
        crate::sheet::scale_bar_length(w.units, r * PT_PER_M, f64::from(0.4 * width));
    let axes_len = 16.0;
    let row = below + axes_len + 10.0;
    let bar = scale_bar(w, left + 4.0, row - 3.0, &label, bar_m * r * PT_PER_M);
    let axes = axis_arrows(w, left + width - 40.0, row, axes_len);
    bar.y1.max(axes.y1)
}

/// The dimension from the gauge's centre to the nearest edge of its face, or an arrow towards
/// it when the edge lies beyond the close-up.
fn draw_to_edge(w: &mut Writer, centre: [f32; 2], foot: [f32; 2], d: f64, area: &Area) {
    if d <= 0.0 {
        return;
    }
    if area.contains(&Area::new(foot[0], foot[1], foot[0], foot[1])) {
        dimension_line(w, centre, foot);
        return;
    }
    let dir = [foot[0] - centre[0], foot[1] - centre[1]];
    let n = dir[0].hypot(dir[1]).max(1e-6);
    let u = [dir[0] / n, dir[1] / n];
    let reach = 0.45 * (area.x1 - area.x0).min(area.y1 - area.y0);
    let tip = [centre[0] + u[0] * reach, centre[1] + u[1] * reach];
    w.line(centre, tip, 0.5, 0);
    arrow_head(w, tip, u, 5.0);
}

/// An edge by the bits of its two ends, the lower first.
type EdgeKey = ([u64; 2], [u64; 2]);

/// The element edges of the face within the close-up, in light grey (the diagonals that cut
/// an element face into triangles left out). False, with nothing drawn, above
/// [`MAX_TRIANGLES`].
fn mesh_lines(
    w: &mut Writer,
    field: &SurfaceField,
    face: usize,
    centre: [f64; 2],
    reach_m: [f64; 2],
    area: &Area,
    page: &dyn Fn([f64; 2]) -> [f32; 2],
) -> bool {
    let Some(p) = field.patches().get(face) else {
        return true;
    };
    let inside = |c: &[f64; 2]| {
        (c[0] - centre[0]).abs() <= reach_m[0] && (c[1] - centre[1]).abs() <= reach_m[1]
    };
    let near: Vec<usize> = (0..p.corners.len())
        .filter(|&t| p.corners[t].iter().any(inside))
        .collect();
    if near.len() > MAX_TRIANGLES {
        return false;
    }
    // Each edge once, keyed by its ends; an edge both of whose triangles come from one element
    // face is that face's diagonal.
    let key = |a: [f64; 2], b: [f64; 2]| {
        let (a, b) = (a.map(f64::to_bits), b.map(f64::to_bits));
        if a <= b { (a, b) } else { (b, a) }
    };
    let mut edges: Vec<(EdgeKey, u32, [f64; 2], [f64; 2])> = Vec::new();
    for &t in &near {
        let facet = field.facet_of(face, t).unwrap_or(u32::MAX);
        let c = p.corners[t];
        for e in 0..3 {
            let (a, b) = (c[e], c[(e + 1) % 3]);
            edges.push((key(a, b), facet, a, b));
        }
    }
    edges.sort_by(|x, y| x.0.cmp(&y.0).then(x.1.cmp(&y.1)));
    for run in edges.chunk_by(|x, y| x.0 == y.0) {
        let diagonal = run.len() == 2 && run[0].1 == run[1].1;
        if diagonal {
            continue;
        }
        if let Some((a, b)) = clip_segment(page(run[0].2), page(run[0].3), area) {
            w.line(a, b, 0.25, 170);
        }
    }
    true
}
