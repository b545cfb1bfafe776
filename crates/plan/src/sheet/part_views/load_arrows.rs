//! Load arrows of the part views: straight arrows of one length on the page from where each
//! load meets the part, turning arrows for couples, each kept clear of the gauges' marks,
//! ticks and the room for their labels (gauges matter more than arrows).

use gw_mechanics::Member;

use super::annotate::{Label, Record, to_box};
use super::geometry::{Depth, Placed, V3, dist2, dot, rotated};
use super::symbols::{arrow, turning_arrow, turning_points, unit};
use crate::drawing::load_glyphs::{GlyphShape, LoadGlyph};
use crate::sheet::layout::Area;
use crate::sheet::writer::Writer;
use crate::units::Units;

/// Length of a load arrow on the page, points.
const ARROW: f32 = 22.0;

fn box_distance(p: V3, (lo, hi): (V3, V3)) -> f64 {
    (0..3)
        .map(|i| (lo[i] - p[i]).max(p[i] - hi[i]).max(0.0).powi(2))
        .sum::<f64>()
        .sqrt()
}

fn clamped(p: V3, (lo, hi): (V3, V3)) -> V3 {
    std::array::from_fn(|i| p[i].clamp(lo[i], hi[i]))
}

/// The text of a load: its name and value in its display unit.
fn load_text(g: &LoadGlyph, units: Units) -> String {
    format!(
        "{} {}",
        g.component.name(),
        crate::sheet::load(units, g.component, g.value.abs())
    )
}

/// One view as the loads see it: where it is, what the part covers, what to keep clear of.
struct Scene<'a> {
    index: usize,
    v: &'a Placed,
    depth: &'a Depth,
    bounds: (V3, V3),
    /// True when a set of pressure arrows may turn about the line of sight (the view along a
    /// vessel's axis, any view of a sphere).
    turnable: bool,
}

/// Draws every glyph in each view where it lies in the page's plane (once per place), clear
/// of the gauges' marks, ticks and their labels' room, and queues its label in the first view
/// that shows it.
pub(super) fn draw(
    w: &mut Writer,
    member: &Member,
    views: &[(Placed, Depth)],
    glyphs: &[LoadGlyph],
    bounds: (V3, V3),
    record: &mut Record,
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
        for (vi, (v, depth)) in views.iter().enumerate() {
            let scene = Scene {
                index: vi,
                v,
                depth,
                bounds,
                turnable: v.view.along_axis || matches!(member, Member::ThinSphere(_)),
            };
            let anchor = match &g.shape {
                GlyphShape::Arrows(list) => arrows(w, &scene, g, list, record, &mut drawn[vi]),
                GlyphShape::Couple { centre, axis, .. } => {
                    couple(w, &scene, (*centre, *axis), record, &mut drawn[vi])
                }
            };
            if let (Some((at, toward, clear)), false) = (anchor, labelled) {
                labels.push(Label::near(load_text(g, w.units), at, toward, clear));
                labelled = true;
            }
        }
    }
}

/// True when the polyline keeps clear of every area in `keep` (by the half width of an
/// arrow's head).
fn clear_of(points: &[[f32; 2]], keep: &[Area]) -> bool {
    keep.iter().all(|k| {
        let k = k.grown(2.0);
        points.windows(2).all(|s| !k.crossed_by(s[0], s[1]))
            && points.iter().all(|p| to_box(*p, &k) > 0.0)
    })
}

/// A straight arrow on the page: tail, head, and how it meets the part.
#[derive(Debug, Clone, Copy)]
struct PageArrow {
    tail: [f32; 2],
    head: [f32; 2],
    /// A push (its head on the part), a pull (its tail on it), or neither.
    meets: Meets,
}

#[derive(Debug, Clone, Copy, PartialEq)]
enum Meets {
    Push,
    Pull,
    Neither,
}

/// The arrows of `list` that lie in the page's plane, drawn to `length` points from where
/// they meet the part.
fn page_arrows(s: &Scene, list: &[[V3; 2]], length: f32) -> Vec<PageArrow> {
    let mut out = Vec::new();
    for [t, h] in list {
        let (pt, ph) = (s.v.page(*t), s.v.page(*h));
        let true_len = (0..3).map(|i| (h[i] - t[i]).powi(2)).sum::<f64>().sqrt();
        if true_len <= 0.0 || f64::from(dist2(pt, ph)) < 0.9 * true_len * s.v.k {
            continue;
        }
        let u = unit([ph[0] - pt[0], ph[1] - pt[1]]);
        let (dt, dh) = (box_distance(*t, s.bounds), box_distance(*h, s.bounds));
        let eps = 1e-9;
        out.push(if dh + eps < dt {
            PageArrow {
                tail: [ph[0] - u[0] * length, ph[1] - u[1] * length],
                head: ph,
                meets: Meets::Push,
            }
        } else if dt + eps < dh {
            PageArrow {
                tail: pt,
                head: [pt[0] + u[0] * length, pt[1] + u[1] * length],
                meets: Meets::Pull,
            }
        } else {
            PageArrow {
                tail: pt,
                head: ph,
                meets: Meets::Neither,
            }
        });
    }
    out
}

/// The same force drawn at the other end of its line of action through the part: a push
/// becomes a pull from the far side, a pull a push onto the near side.
fn flipped(s: &Scene, a: &PageArrow) -> Option<PageArrow> {
    let u = unit([a.head[0] - a.tail[0], a.head[1] - a.tail[1]]);
    let len = dist2(a.tail, a.head);
    let (start, dir) = match a.meets {
        Meets::Push => (a.head, u),
        Meets::Pull => (a.tail, [-u[0], -u[1]]),
        Meets::Neither => return None,
    };
    let reach = s.v.size[0].hypot(s.v.size[1]) + 4.0;
    let mut inside = false;
    let mut k = 0.5;
    while k < reach {
        let p = [start[0] + dir[0] * k, start[1] + dir[1] * k];
        let covered = s.depth.covers(p);
        if inside && !covered {
            return Some(match a.meets {
                Meets::Push => PageArrow {
                    tail: p,
                    head: [p[0] + u[0] * len, p[1] + u[1] * len],
                    meets: Meets::Pull,
                },
                _ => PageArrow {
                    tail: [p[0] - u[0] * len, p[1] - u[1] * len],
                    head: p,
                    meets: Meets::Push,
                },
            });
        }
        inside |= covered;
        k += 0.5;
    }
    None
}

/// Where one arrow goes: where it acts if that is clear of the gauges, else at the other end
/// of its line of action, else moved aside; as it acts when nothing is clear.
fn clear_arrow(s: &Scene, a: PageArrow, keep: &[Area]) -> PageArrow {
    let u = unit([a.head[0] - a.tail[0], a.head[1] - a.tail[1]]);
    let n = [-u[1], u[0]];
    let mut options = vec![a];
    options.extend(flipped(s, &a));
    for d in [6.0, -6.0, 12.0, -12.0, 18.0, -18.0] {
        let shift = |p: [f32; 2]| [p[0] + n[0] * d, p[1] + n[1] * d];
        // Moved aside only while it still meets the part.
        let moved = PageArrow {
            tail: shift(a.tail),
            head: shift(a.head),
            meets: a.meets,
        };
        let touch = if a.meets == Meets::Pull {
            moved.tail
        } else {
            moved.head
        };
        if s.depth
            .covers([touch[0] + u[0] * 1.0, touch[1] + u[1] * 1.0])
            || s.depth
                .covers([touch[0] - u[0] * 1.0, touch[1] - u[1] * 1.0])
        {
            options.push(moved);
        }
    }
    options
        .into_iter()
        .find(|o| clear_of(&[o.tail, o.head], keep))
        .unwrap_or(a)
}

/// The arrows of a set of pressure arrows turned together about the line of sight through
/// the part's centre to the first angle at which all keep clear of the gauges.
fn turned_set(s: &Scene, list: &[[V3; 2]], length: f32, keep: &[Area]) -> Option<Vec<PageArrow>> {
    let centre: V3 = std::array::from_fn(|i| 0.5 * (s.bounds.0[i] + s.bounds.1[i]));
    let step = std::f64::consts::PI / 16.0;
    [0.0, 2.0, -2.0, 1.0, -1.0, 3.0, -3.0]
        .into_iter()
        .map(|k| {
            let turned: Vec<[V3; 2]> = list
                .iter()
                .map(|ab| ab.map(|p| rotated(p, centre, s.v.view.toward, k * step)))
                .collect();
            page_arrows(s, &turned, length)
        })
        .find(|set| set.iter().all(|a| clear_of(&[a.tail, a.head], keep)))
}

/// The straight arrows of a glyph in one view, drawn to a fixed length on the page from the
/// point where they touch the part; the label's anchor when any is drawn.
fn arrows(
    w: &mut Writer,
    s: &Scene,
    g: &LoadGlyph,
    list: &[[V3; 2]],
    record: &mut Record,
    drawn: &mut Vec<[f32; 2]>,
) -> Option<([f32; 2], [f32; 2], f32)> {
    use gw_mechanics::LoadComponent as C;
    let uniform = g.component == C::UniformLoad;
    let length = if uniform { 0.55 * ARROW } else { ARROW };
    let keep = record.keep_out.get(s.index).cloned().unwrap_or_default();
    let pressure = matches!(g.component, C::InternalPressure | C::ExternalPressure);
    let set = (pressure && s.turnable)
        .then(|| turned_set(s, list, length, &keep))
        .flatten()
        .unwrap_or_else(|| {
            page_arrows(s, list, length)
                .into_iter()
                .map(|a| {
                    if pressure {
                        a
                    } else {
                        clear_arrow(s, a, &keep)
                    }
                })
                .collect()
        });
    let mut tails = Vec::new();
    let mut anchor = None;
    for a in set {
        let key = [(a.tail[0] + a.head[0]) / 2.0, (a.tail[1] + a.head[1]) / 2.0];
        if drawn.iter().any(|d| dist2(*d, key) < 1.0) {
            continue;
        }
        drawn.push(key);
        arrow(w, a.tail, a.head, 1.1);
        record.arrows.push((s.index, a.tail, a.head));
        tails.push(a.tail);
        // The label goes off the free end: beyond the tail of a push, the head of a pull.
        let free = if a.meets == Meets::Push {
            a.tail
        } else {
            a.head
        };
        anchor = Some((free, [free[0] - key[0], free[1] - key[1]], 2.0));
    }
    if uniform && tails.len() > 1 {
        w.line(tails[0], tails[tails.len() - 1], 0.8, 0);
        record
            .arrows
            .push((s.index, tails[0], tails[tails.len() - 1]));
        let mid = tails[tails.len() / 2];
        anchor = Some((mid, [0.0, -1.0], 2.0));
    }
    anchor
}

/// A couple seen face on: a turning arrow beyond the end it acts on, or round the part when
/// it acts along the line of sight, then as close as it keeps clear of the gauges.
fn couple(
    w: &mut Writer,
    s: &Scene,
    (centre, axis): (V3, V3),
    record: &mut Record,
    drawn: &mut Vec<[f32; 2]>,
) -> Option<([f32; 2], [f32; 2], f32)> {
    let v = s.v;
    let sense = dot(axis, v.view.toward);
    if sense.abs() < 0.9 {
        return None;
    }
    let (pc, pe) = (v.page(centre), v.page(clamped(centre, s.bounds)));
    let off = unit([pc[0] - pe[0], pc[1] - pe[1]]);
    let (c, r0) = if off == [0.0, 0.0] {
        (pc, 0.5 * v.size[0].max(v.size[1]) + 8.0)
    } else {
        let r = 9.0;
        ([pe[0] + off[0] * (r + 6.0), pe[1] + off[1] * (r + 6.0)], r)
    };
    if drawn.iter().any(|d| dist2(*d, c) < 1.0) {
        return None;
    }
    drawn.push(c);
    let keep = record.keep_out.get(s.index).cloned().unwrap_or_default();
    let gap = [-off[0], -off[1]];
    let s2 = std::f32::consts::FRAC_1_SQRT_2;
    let gaps = [
        gap,
        [0.0, -1.0],
        [s2, -s2],
        [1.0, 0.0],
        [s2, s2],
        [0.0, 1.0],
    ];
    let tries = (0..10).flat_map(|k| gaps.map(|g| (r0 + 4.0 * k as f32, g)));
    let (r, pts) = tries
        .map(|(r, g)| (r, turning_points(c, r, sense > 0.0, g)))
        .find(|(_, p)| off != [0.0, 0.0] || clear_of(p, &keep))
        .unwrap_or_else(|| (r0, turning_points(c, r0, sense > 0.0, gap)));
    turning_arrow(w, &pts);
    for seg in pts.windows(2) {
        record.arrows.push((s.index, seg[0], seg[1]));
    }
    let toward = if off == [0.0, 0.0] { [1.0, -1.0] } else { off };
    Some((c, toward, r + 1.0))
}
