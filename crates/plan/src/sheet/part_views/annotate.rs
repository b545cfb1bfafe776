//! What the part views carry besides the part: supports, loads with their values, gauge
//! marks with their ids, face names, and labels placed clear of everything drawn.

use gw_bridge::units::si;
use gw_mechanics::{Face, Member};

use super::geometry::{Depth, Placed, V3, dist2, dot, round_along_x};
use super::symbols::{LABEL, arrow, clamp, gauge_mark, pin, turning_arrow, unit};
use crate::document::PlanGauge;
use crate::drawing::face_layout::{EndKind, Neighbour, face_edges};
use crate::drawing::load_glyphs::{GlyphShape, LoadGlyph};
use crate::sheet::layout::{Area, ascent, descent, text_width};
use crate::sheet::writer::Writer;

/// Length of a load arrow on the page, points.
const ARROW: f32 = 22.0;

/// A label waiting for a place: near `anchor`, at least `clear` from it, first towards
/// `toward` (or centred on the anchor when `centred`).
#[derive(Debug, Clone)]
pub(super) struct Label {
    pub text: String,
    pub anchor: [f32; 2],
    pub toward: [f32; 2],
    pub clear: f32,
    pub centred: bool,
    /// Where the label may go; `None`: anywhere in the views' block.
    pub within: Option<Area>,
    /// True when the label may lie over a view's drawing of the part (gauge ids, face names).
    pub on_part: bool,
    /// True when the label must stay on the side of `toward` (a face's name beside its edge).
    pub strict: bool,
}

impl Label {
    pub fn near(text: impl Into<String>, anchor: [f32; 2], toward: [f32; 2], clear: f32) -> Self {
        Self {
            text: text.into(),
            anchor,
            toward: unit(toward),
            clear,
            centred: false,
            within: None,
            on_part: false,
            strict: false,
        }
    }

    fn on_part(mut self) -> Self {
        self.on_part = true;
        self
    }
}

/// Places a label at the first free spot round its anchor, nearest first, off the drawings
/// of the part (`parts`) unless it belongs on them; false when no spot is free.
pub(super) fn place(w: &mut Writer, block: &Area, parts: &[Area], l: &Label) -> bool {
    let tw = text_width(&l.text, LABEL, false);
    let th = ascent(LABEL, false) + descent(LABEL, false);
    let s = std::f32::consts::FRAC_1_SQRT_2;
    let compass = [
        [1.0, 0.0],
        [0.0, -1.0],
        [-1.0, 0.0],
        [0.0, 1.0],
        [s, -s],
        [-s, -s],
        [-s, s],
        [s, s],
    ];
    let mut dirs = vec![l.toward];
    dirs.extend(compass.into_iter().filter(|d| {
        let along = d[0] * l.toward[0] + d[1] * l.toward[1];
        along < 0.999 && (!l.strict || along > 0.5)
    }));
    let mut candidates = Vec::new();
    if l.centred {
        candidates.push([l.anchor[0] - tw / 2.0, l.anchor[1] - th / 2.0]);
    }
    for d in [1.5, 4.0, 8.0, 13.0, 20.0, 30.0, 44.0, 60.0, 80.0] {
        for u in &dirs {
            let reach = l.clear + d;
            let (cx, y) = (
                l.anchor[0] + u[0] * (reach + tw / 2.0),
                l.anchor[1] + u[1] * (reach + th / 2.0) - th / 2.0,
            );
            // Centred on the ray, then hanging to either side of it.
            for x in [cx - tw / 2.0, cx, cx - tw] {
                candidates.push([x, y]);
            }
        }
    }
    if !l.on_part {
        candidates.retain(|c| {
            let a = Area::new(c[0], c[1], c[0] + tw, c[1] + th);
            !parts.iter().any(|p| p.overlaps(&a))
        });
    }
    let bounds = l.within.unwrap_or(*block);
    w.place_label(&bounds, LABEL, false, &l.text, &candidates, 1.0)
        .is_some()
}

fn box_distance(p: V3, (lo, hi): (V3, V3)) -> f64 {
    (0..3)
        .map(|i| (lo[i] - p[i]).max(p[i] - hi[i]).max(0.0).powi(2))
        .sum::<f64>()
        .sqrt()
}

fn clamped(p: V3, (lo, hi): (V3, V3)) -> V3 {
    std::array::from_fn(|i| p[i].clamp(lo[i], hi[i]))
}

/// The text of a load: its name and value in its unit.
fn load_text(g: &LoadGlyph) -> String {
    format!(
        "{} {}",
        g.component.name(),
        si(g.value.abs(), g.component.unit())
    )
}

/// Draws every glyph in each view where it lies in the page's plane (once per place) and
/// queues its label in the first view that shows it.
pub(super) fn loads(
    w: &mut Writer,
    views: &[Placed],
    glyphs: &[LoadGlyph],
    bounds: (V3, V3),
    labels: &mut Vec<Label>,
) {
    let mut drawn: Vec<Vec<[f32; 2]>> = vec![Vec::new(); views.len()];
    let mut couples_named = Vec::new();
    for g in glyphs {
        // A couple acts at both ends of a free body: its value is named once.
        let mut labelled =
            matches!(g.shape, GlyphShape::Couple { .. }) && couples_named.contains(&g.component);
        if matches!(g.shape, GlyphShape::Couple { .. }) {
            couples_named.push(g.component);
        }
        for (vi, v) in views.iter().enumerate() {
            let anchor = match &g.shape {
                GlyphShape::Arrows(list) => arrows(w, v, g, list, bounds, &mut drawn[vi]),
                GlyphShape::Couple { centre, axis, .. } => {
                    couple(w, v, (*centre, *axis), bounds, &mut drawn[vi])
                }
            };
            if let (Some((at, toward, clear)), false) = (anchor, labelled) {
                labels.push(Label::near(load_text(g), at, toward, clear));
                labelled = true;
            }
        }
    }
}

/// The straight arrows of a glyph in one view, drawn to a fixed length on the page from the
/// point where they touch the part; the label's anchor when any is drawn.
fn arrows(
    w: &mut Writer,
    v: &Placed,
    g: &LoadGlyph,
    list: &[[V3; 2]],
    bounds: (V3, V3),
    drawn: &mut Vec<[f32; 2]>,
) -> Option<([f32; 2], [f32; 2], f32)> {
    let uniform = g.component == gw_mechanics::LoadComponent::UniformLoad;
    let length = if uniform { 0.55 * ARROW } else { ARROW };
    let mut tails = Vec::new();
    let mut anchor = None;
    for [t, h] in list {
        let (pt, ph) = (v.page(*t), v.page(*h));
        let true_len = (0..3).map(|i| (h[i] - t[i]).powi(2)).sum::<f64>().sqrt();
        if true_len <= 0.0 || f64::from(dist2(pt, ph)) < 0.9 * true_len * v.k {
            continue;
        }
        let u = unit([ph[0] - pt[0], ph[1] - pt[1]]);
        let (dt, dh) = (box_distance(*t, bounds), box_distance(*h, bounds));
        let eps = 1e-9;
        let (tail, head) = if dh + eps < dt {
            ([ph[0] - u[0] * length, ph[1] - u[1] * length], ph)
        } else if dt + eps < dh {
            (pt, [pt[0] + u[0] * length, pt[1] + u[1] * length])
        } else {
            (pt, ph)
        };
        let key = [(tail[0] + head[0]) / 2.0, (tail[1] + head[1]) / 2.0];
        if drawn.iter().any(|d| dist2(*d, key) < 1.0) {
            continue;
        }
        drawn.push(key);
        arrow(w, tail, head, 1.1);
        tails.push(tail);
        // The label goes off the free end: beyond the tail of a push, the head of a pull.
        let free = if dh + eps < dt { tail } else { head };
        anchor = Some((free, [free[0] - key[0], free[1] - key[1]], 2.0));
    }
    if uniform && tails.len() > 1 {
        w.line(tails[0], tails[tails.len() - 1], 0.8, 0);
        let mid = tails[tails.len() / 2];
        anchor = Some((mid, [0.0, -1.0], 2.0));
    }
    anchor
}

/// A couple seen face on: a turning arrow beyond the end it acts on, or round the part when
/// it acts along the line of sight.
fn couple(
    w: &mut Writer,
    v: &Placed,
    (centre, axis): (V3, V3),
    bounds: (V3, V3),
    drawn: &mut Vec<[f32; 2]>,
) -> Option<([f32; 2], [f32; 2], f32)> {
    let s = dot(axis, v.view.toward);
    if s.abs() < 0.9 {
        return None;
    }
    let (pc, pe) = (v.page(centre), v.page(clamped(centre, bounds)));
    let off = unit([pc[0] - pe[0], pc[1] - pe[1]]);
    let (c, r) = if off == [0.0, 0.0] {
        (pc, 0.5 * v.size[0].max(v.size[1]) + 8.0)
    } else {
        let r = 9.0;
        ([pe[0] + off[0] * (r + 6.0), pe[1] + off[1] * (r + 6.0)], r)
    };
    if drawn.iter().any(|d| dist2(*d, c) < 1.0) {
        return None;
    }
    drawn.push(c);
    turning_arrow(w, c, r, s > 0.0, [-off[0], -off[1]]);
    let toward = if off == [0.0, 0.0] { [1.0, -1.0] } else { off };
    Some((c, toward, r + 1.0))
}

/// The clamp or pins of a beam and the names of the ends of a prismatic part.
pub(super) fn supports(w: &mut Writer, member: &Member, views: &[Placed], labels: &mut Vec<Label>) {
    let Some(face) = member.faces().first().map(|f| f.face) else {
        return;
    };
    if matches!(
        member,
        Member::ThinSphere(_) | Member::PlateWithHole(_) | Member::GivenState(_)
    ) {
        return;
    }
    let edges = face_edges(member, face, 0.0);
    let length = |x: f64| format!("{:.0} mm", x * 1e3);
    for (end, outward) in [(edges.x_min, -1.0f32), (edges.x_max, 1.0)] {
        let Neighbour::End { x_m, kind } = end else {
            continue;
        };
        for v in views.iter().filter(|v| !v.view.along_axis) {
            let b = v.drawing();
            let x = v.page([x_m, 0.0, 0.0])[0];
            let side_view = v.view.toward[1] < -0.5;
            match kind {
                EndKind::Clamped => clamp(w, x, (b.y0 - 7.0, b.y1 + 7.0), outward),
                EndKind::Pinned if side_view => pin(w, [x, b.y1]),
                _ => {}
            }
            if side_view {
                let at = match kind {
                    EndKind::Clamped => [x + outward * 8.0, b.y0 - 7.0],
                    EndKind::Pinned => [x, b.y1 + 9.0],
                    _ => [x, b.y1],
                };
                let toward = match kind {
                    EndKind::Pinned => [0.0, 1.0],
                    EndKind::Clamped => [outward, -1.0],
                    _ => [outward, 1.0],
                };
                labels.push(Label::near(end.label(&length), at, toward, 1.0));
            }
        }
    }
}

/// The position and outward normal of a gauge on the part, if it is on it.
fn gauge_frame(member: &Member, g: &PlanGauge) -> Option<(V3, V3)> {
    let p = member.locate(&g.position).ok()?;
    let f = member.surface_frame(&p)?;
    Some((f.position, f.normal))
}

/// Gauge marks with their ids: where the face is seen, a circled cross; where it is behind
/// the part, a dashed circle named with its face. The view along the axis of a prismatic part
/// marks every gauge with a tick on the section's outline, showing where round it sits.
pub(super) fn gauges(
    w: &mut Writer,
    member: &Member,
    gauges: &[PlanGauge],
    views: &[(Placed, Depth)],
    labels: &mut Vec<Label>,
) {
    for (v, depth) in views {
        if v.view.along_axis {
            ticks(w, member, gauges, v, labels);
            continue;
        }
        for g in gauges {
            let Some((p, n)) = gauge_frame(member, g) else {
                continue;
            };
            let nd = dot(n, v.view.toward);
            let at = v.page(p);
            let seen = depth.seen(at, v.depth(p));
            let hidden = nd < -0.35 || (nd > 0.35 && !seen);
            if nd.abs() <= 0.35 {
                continue;
            }
            gauge_mark(w, at, hidden);
            let text = match (hidden, g.position.face) {
                (false, _) => g.id.clone(),
                (true, Face::Round) => format!("{} (far side)", g.id),
                (true, f) => format!("{} ({})", g.id, f.name()),
            };
            labels.push(Label::near(text, at, [1.0, -1.0], 3.5).on_part());
        }
    }
}

/// Ticks on the section's outline in the view along the axis, one per place, with the ids of
/// the gauges there.
fn ticks(
    w: &mut Writer,
    member: &Member,
    gauges: &[PlanGauge],
    v: &Placed,
    labels: &mut Vec<Label>,
) {
    let mut places: Vec<([f32; 2], [f32; 2], Vec<String>)> = Vec::new();
    for g in gauges {
        let Some((p, n)) = gauge_frame(member, g) else {
            continue;
        };
        let at = v.page(p);
        let u = unit(v.direction(n));
        match places.iter_mut().find(|(a, _, _)| dist2(*a, at) < 2.0) {
            Some((_, _, ids)) => ids.push(g.id.clone()),
            None => places.push((at, u, vec![g.id.clone()])),
        }
    }
    for (at, u, ids) in places {
        let a = [at[0] + 1.5 * u[0], at[1] + 1.5 * u[1]];
        let b = [at[0] + 9.0 * u[0], at[1] + 9.0 * u[1]];
        w.line(a, b, 1.2, 0);
        labels.push(Label::near(ids.join(", "), b, u, 1.0));
    }
}

/// Names of the faces: beside the section's outline in the view along the axis, inside the
/// face where a view sees it face on, and the reference lines of round parts.
pub(super) fn faces(w: &mut Writer, member: &Member, views: &[Placed], labels: &mut Vec<Label>) {
    let has_end_view = views.iter().any(|v| v.view.along_axis);
    for v in views {
        for f in member.faces() {
            let mid = SurfaceMid::of(&f);
            let Some(fr) =
                member.surface_frame(&gw_mechanics::SurfacePoint::new(f.face, mid.x, mid.s))
            else {
                continue;
            };
            if v.view.along_axis {
                if f.face != Face::Round {
                    let p = [f.x_range_m.1, fr.position[1], fr.position[2]];
                    let mut l = Label::near(f.face.name(), v.page(p), v.direction(fr.normal), 1.5);
                    l.strict = true;
                    labels.push(l);
                }
                continue;
            }
            if f.face == Face::Round || dot(fr.normal, v.view.toward) < 0.7 {
                continue;
            }
            let corners: Vec<[f32; 2]> = [(0, 0), (0, 1), (1, 0), (1, 1)]
                .iter()
                .filter_map(|&(i, j)| {
                    let x = if i == 0 { f.x_range_m.0 } else { f.x_range_m.1 };
                    let s = if j == 0 { f.s_range_m.0 } else { f.s_range_m.1 };
                    member
                        .surface_frame(&gw_mechanics::SurfacePoint::new(f.face, x, s))
                        .map(|c| v.page(c.position))
                })
                .collect();
            let within =
                corners
                    .iter()
                    .fold(Area::new(f32::MAX, f32::MAX, f32::MIN, f32::MIN), |a, c| {
                        Area {
                            x0: a.x0.min(c[0]),
                            y0: a.y0.min(c[1]),
                            x1: a.x1.max(c[0]),
                            y1: a.y1.max(c[1]),
                        }
                    });
            let mut l = Label::near(f.face.name(), v.page(fr.position), [0.0, 0.0], 0.0).on_part();
            l.centred = true;
            if has_end_view {
                l.within = Some(within);
            }
            labels.push(l);
        }
    }
    round_references(w, member, views, labels);
}

/// The middle of a face in its own coordinates (off the hole of a plate).
struct SurfaceMid {
    x: f64,
    s: f64,
}

impl SurfaceMid {
    fn of(f: &gw_mechanics::FaceExtent) -> Self {
        let x = 0.5 * (f.x_range_m.0 + f.x_range_m.1);
        let mut s = 0.5 * (f.s_range_m.0 + f.s_range_m.1);
        if let Some(a) = f.hole_radius_m {
            s = 0.5 * (a + f.s_range_m.1);
        }
        Self { x, s }
    }
}

/// The top line (s = 0) and the outer surface of a round part in the view along its axis;
/// the equator and a pole of a sphere in the side view.
fn round_references(w: &mut Writer, member: &Member, views: &[Placed], labels: &mut Vec<Label>) {
    if let (Some((ro, _, l, _)), Some(v)) = (
        round_along_x(member),
        views.iter().find(|v| v.view.along_axis),
    ) {
        let top = v.page([l, 0.0, ro]);
        w.line(top, [top[0], top[1] - 6.0], 0.8, 0);
        labels.push(Label::near(
            "s = 0",
            [top[0], top[1] - 6.0],
            [-1.0, -0.6],
            1.0,
        ));
        let s = std::f64::consts::FRAC_1_SQRT_2;
        let p = v.page([l, -ro * s, ro * s]);
        labels.push(Label::near("outer surface", p, [-1.0, -1.0], 2.0));
    }
    if let (Member::ThinSphere(sp), Some(v)) =
        (member, views.iter().find(|v| v.view.toward[1] < -0.5))
    {
        let r = sp.outer_diameter_m / 2.0;
        labels.push(Label::near(
            "equator, x = 0",
            v.page([r, 0.0, 0.0]),
            [1.0, 0.0],
            1.5,
        ));
        labels.push(Label::near("pole", v.page([0.0, 0.0, r]), [0.0, -1.0], 1.5));
        let s = std::f64::consts::FRAC_1_SQRT_2;
        labels.push(Label::near(
            "outer surface",
            v.page([-r * s, 0.0, r * s]),
            [-1.0, -1.0],
            2.0,
        ));
        // The equator as a thin reference line: x on the surface is measured from it.
        w.line(v.page([-r, 0.0, 0.0]), v.page([r, 0.0, 0.0]), 0.4, 110);
    }
}
