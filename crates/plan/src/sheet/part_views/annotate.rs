//! What the part views carry besides the part and its loads: supports, gauge marks with their
//! ids, face names, and labels placed clear of everything drawn, beside what they name.

use gw_mechanics::{Face, Member};

use super::geometry::{Depth, Placed, V3, dist2, dot, round_along_x};
use super::symbols::{LABEL, MARK, RING, clamp, gauge_mark, pin, unit};
use crate::document::PlanGauge;
use crate::drawing::face_layout::{EndKind, Neighbour, face_edges};
use crate::sheet::layout::{Area, Op, ascent, descent, op_area, text_width};
use crate::sheet::writer::Writer;

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
    let units = w.units;
    let length = |x: f64| crate::sheet::len(units, x);
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
