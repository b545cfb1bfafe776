//! What the part views carry besides the part: supports, loads with their values, gauge
//! marks with their ids, face names, and labels placed clear of everything drawn.

use gw_bridge::units::si;
use gw_mechanics::{Face, Member};

use super::geometry::{Depth, Placed, V3, dist2, dot, rotated, round_along_x};
use super::symbols::{
    LABEL, MARK, RING, arrow, clamp, gauge_mark, pin, turning_arrow, turning_points, unit,
};
use crate::document::PlanGauge;
use crate::drawing::face_layout::{EndKind, Neighbour, face_edges};
use crate::drawing::load_glyphs::{GlyphShape, LoadGlyph};
use crate::sheet::layout::{Area, Op, ascent, descent, op_area, text_width};
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
    /// Marks of other gauges in the same view: a gauge's label lies nearer its own mark.
    pub rivals: Vec<[f32; 2]>,
    /// The gauge place the label names (an index into [`Record::marks`]).
    pub gauge: Option<usize>,
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
            rivals: Vec::new(),
            gauge: None,
        }
    }

    fn on_part(mut self) -> Self {
        self.on_part = true;
        self
    }
}

/// What the views hold for the checks and for what is drawn later: the gauges' places, the
/// room load arrows keep out of, the ticks, the arrows drawn and the gauge labels placed.
#[derive(Debug, Default, Clone)]
pub(super) struct Record {
    /// Each place of gauges in a view: the view's index, its page point and the gauge ids.
    pub marks: Vec<(usize, [f32; 2], Vec<String>)>,
    /// Per view, the areas load arrows keep out of: gauge marks, ticks and their labels' room.
    pub keep_out: Vec<Vec<Area>>,
    /// Gauge ticks of the views along the axis: view, from, to.
    pub ticks: Vec<(usize, [f32; 2], [f32; 2])>,
    /// Segments of the load arrows drawn: view, from, to.
    pub arrows: Vec<(usize, [f32; 2], [f32; 2])>,
    /// Gauge labels placed: the index of their place in `marks` and their box.
    pub gauge_labels: Vec<(usize, Area)>,
}

/// Distance from `p` to the nearest point of `a` (zero inside).
pub(super) fn to_box(p: [f32; 2], a: &Area) -> f32 {
    let dx = (a.x0 - p[0]).max(p[0] - a.x1).max(0.0);
    let dy = (a.y0 - p[1]).max(p[1] - a.y1).max(0.0);
    dx.hypot(dy)
}

/// Distance from `p` to the segment from `a` to `b`.
fn to_segment(p: [f32; 2], a: [f32; 2], b: [f32; 2]) -> f32 {
    let d = [b[0] - a[0], b[1] - a[1]];
    let len2 = d[0] * d[0] + d[1] * d[1];
    let t = if len2 > 0.0 {
        (((p[0] - a[0]) * d[0] + (p[1] - a[1]) * d[1]) / len2).clamp(0.0, 1.0)
    } else {
        0.0
    };
    dist2(p, [a[0] + t * d[0], a[1] + t * d[1]])
}

/// The leader from a label's anchor to its box, when the box lies away from what it names.
fn leader(l: &Label, b: &Area) -> Option<([f32; 2], [f32; 2])> {
    if l.centred {
        return None;
    }
    let g = b.grown(1.0);
    let q = [l.anchor[0].clamp(g.x0, g.x1), l.anchor[1].clamp(g.y0, g.y1)];
    let d = dist2(l.anchor, q);
    if d <= l.clear + 7.0 {
        return None;
    }
    let u = unit([q[0] - l.anchor[0], q[1] - l.anchor[1]]);
    let from = [l.anchor[0] + u[0] * l.clear, l.anchor[1] + u[1] * l.clear];
    Some((from, q))
}

/// True when a label at `b` may stand: nearer its own mark than any other gauge's, and its
/// leader, if it needs one, clear of every text and of the other gauges' marks.
fn fits(ops: &[Op], l: &Label, b: &Area) -> bool {
    let own = to_box(l.anchor, b);
    if l.rivals.iter().any(|r| to_box(*r, b) <= own + 1.0) {
        return false;
    }
    let Some((p, q)) = leader(l, b) else {
        return true;
    };
    let texts_clear = ops
        .iter()
        .all(|op| !matches!(op, Op::Text { .. }) || !op_area(op).grown(0.5).crossed_by(p, q));
    texts_clear && l.rivals.iter().all(|r| to_segment(*r, p, q) > RING + 1.0)
}

/// The top left corners a label may take round its anchor, nearest first.
fn candidates(l: &Label, tw: f32, th: f32) -> Vec<[f32; 2]> {
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
    let mut out = Vec::new();
    if l.centred {
        out.push([l.anchor[0] - tw / 2.0, l.anchor[1] - th / 2.0]);
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
                out.push([x, y]);
            }
        }
    }
    out
}

/// Places a label at the first free spot round its anchor, nearest first, off the drawings
/// of the part (`parts`) unless it belongs on them, with a leader line when it stands away
/// from its anchor; its box, or `None` when no spot is free.
pub(super) fn place(w: &mut Writer, block: &Area, parts: &[Area], l: &Label) -> Option<Area> {
    let tw = text_width(&l.text, LABEL, false);
    let th = ascent(LABEL, false) + descent(LABEL, false);
    let mut spots = candidates(l, tw, th);
    spots.retain(|c| {
        let a = Area::new(c[0], c[1], c[0] + tw, c[1] + th);
        (l.on_part || !parts.iter().any(|p| p.overlaps(&a))) && fits(w.current(), l, &a)
    });
    let bounds = l.within.unwrap_or(*block);
    let b = w.place_label(&bounds, LABEL, false, &l.text, &spots, 1.0)?;
    if let Some((p, q)) = leader(l, &b) {
        w.line(p, q, 0.4, 0);
    }
    Some(b)
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
pub(super) fn loads(
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
                labels.push(Label::near(load_text(g), at, toward, clear));
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

/// A gauge as a view shows it: its page point, whether it is behind the part, its label.
struct Shown {
    at: [f32; 2],
    hidden: bool,
    text: String,
}

/// The gauges a view across the axis shows (their faces turned towards or away from it).
fn shown(member: &Member, gauges: &[PlanGauge], v: &Placed, depth: &Depth) -> Vec<Shown> {
    let mut out = Vec::new();
    for g in gauges {
        let Some((p, n)) = gauge_frame(member, g) else {
            continue;
        };
        let nd = dot(n, v.view.toward);
        if nd.abs() <= 0.35 {
            continue;
        }
        let at = v.page(p);
        let hidden = nd < 0.0 || !depth.seen(at, v.depth(p));
        let text = match (hidden, g.position.face) {
            (false, _) => g.id.clone(),
            (true, Face::Round) => format!("{} (far side)", g.id),
            (true, f) => format!("{} ({})", g.id, f.name()),
        };
        out.push(Shown { at, hidden, text });
    }
    out
}

/// Gauge marks with their ids: where the face is seen, a circled cross; where it is behind
/// the part, a dashed circle named with its face (a wider dashed ring round a seen mark at the
/// same place). Gauges at one place share one label, seen ones first. The view along the axis
/// of a prismatic part marks every gauge with a tick on the section's outline, showing where
/// round it sits. Records each place and the room load arrows keep out of.
pub(super) fn gauges(
    w: &mut Writer,
    member: &Member,
    gauges: &[PlanGauge],
    views: &[(Placed, Depth)],
    record: &mut Record,
    labels: &mut Vec<Label>,
) {
    record.keep_out = vec![Vec::new(); views.len()];
    for (vi, (v, depth)) in views.iter().enumerate() {
        if v.view.along_axis {
            ticks(w, member, gauges, (vi, v), record, labels);
            continue;
        }
        let mut list = shown(member, gauges, v, depth);
        // Seen ones first, so that a place's first mark is seen when any is.
        list.sort_by_key(|g| g.hidden);
        let mut places: Vec<([f32; 2], Vec<Shown>)> = Vec::new();
        for g in list {
            match places.iter_mut().find(|(a, _)| dist2(*a, g.at) < 2.0) {
                Some((_, here)) => here.push(g),
                None => places.push((g.at, vec![g])),
            }
        }
        for hidden in [false, true] {
            for (at, here) in &places {
                let under_seen = hidden && !here[0].hidden;
                let r = if under_seen { RING } else { MARK };
                if here.iter().any(|g| g.hidden == hidden) {
                    gauge_mark(w, *at, hidden, r);
                }
            }
        }
        let centre = v.drawing();
        let mid = (centre.y0 + centre.y1) / 2.0;
        for (i, (at, here)) in places.iter().enumerate() {
            let r = if here.iter().any(|g| g.hidden) && !here[0].hidden {
                RING
            } else {
                MARK
            };
            record.keep_out[vi].push(Area::new(at[0] - r, at[1] - r, at[0] + r, at[1] + r));
            let text: Vec<&str> = here.iter().map(|g| g.text.as_str()).collect();
            // Off the nearer long edge of the drawing, where there is room.
            let toward = if at[1] > mid + 0.5 {
                [0.0, 1.0]
            } else {
                [0.0, -1.0]
            };
            let mut l = Label::near(text.join("; "), *at, toward, r + 0.5).on_part();
            l.rivals = places
                .iter()
                .enumerate()
                .filter(|(j, _)| *j != i)
                .map(|(_, p)| p.0)
                .collect();
            l.gauge = Some(record.marks.len());
            record.marks.push((vi, *at, ids(here)));
            labels.push(l);
        }
    }
}

/// The gauge ids in a label's text: the first word of each part.
fn ids(here: &[Shown]) -> Vec<String> {
    here.iter()
        .filter_map(|g| g.text.split(' ').next().map(str::to_owned))
        .collect()
}

/// Ticks on the section's outline in the view along the axis, one per place, with the ids of
/// the gauges there; each tick and the room for its label are kept free of load arrows.
fn ticks(
    w: &mut Writer,
    member: &Member,
    gauges: &[PlanGauge],
    (vi, v): (usize, &Placed),
    record: &mut Record,
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
    let ends: Vec<[f32; 2]> = places
        .iter()
        .map(|(at, u, _)| [at[0] + 9.0 * u[0], at[1] + 9.0 * u[1]])
        .collect();
    let th = ascent(LABEL, false) + descent(LABEL, false);
    for (i, (at, u, ids)) in places.into_iter().enumerate() {
        let a = [at[0] + 1.5 * u[0], at[1] + 1.5 * u[1]];
        let b = ends[i];
        w.line(a, b, 1.2, 0);
        record.ticks.push((vi, a, b));
        let text = ids.join(", ");
        let tw = text_width(&text, LABEL, false);
        // The label's room beyond the tick's end, as `place` first tries it.
        let c = [
            b[0] + u[0] * (2.5 + tw / 2.0),
            b[1] + u[1] * (2.5 + th / 2.0),
        ];
        let keep = &mut record.keep_out[vi];
        keep.push(Area::new(a[0], a[1], b[0], b[1]).grown(1.0));
        keep.push(Area::new(
            c[0] - tw / 2.0,
            c[1] - th / 2.0,
            c[0] + tw / 2.0,
            c[1] + th / 2.0,
        ));
        let mut l = Label::near(text, b, u, 1.0);
        l.rivals = ends
            .iter()
            .enumerate()
            .filter(|(j, _)| *j != i)
            .map(|(_, e)| *e)
            .collect();
        l.gauge = Some(record.marks.len());
        record.marks.push((vi, b, ids));
        labels.push(l);
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
