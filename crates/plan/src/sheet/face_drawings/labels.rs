//! The drawing's labels, each at the first place clear of every line and label already on the
//! page: dimension values, gauge ids with their angles, the datum and the edge names; then the
//! legend under the drawing.

use super::plan::FaceSetup;
use super::{Drawing, LABEL, LINE_GAP, ROW, TEXT_GAP, label_h};
use crate::drawing::face_layout::{Neighbour, ScreenRect, candidates_around};
use crate::sheet::layout::{Area, Op, is_clear, line_pitch, text_area, text_width, wrap};
use crate::sheet::len;
use crate::sheet::writer::Writer;
use crate::units::Units;

/// True when a label of `size` with its top-left corner at `at` keeps [`TEXT_GAP`] from every
/// text on the page beside it (a line apart above or below is enough: rows read apart).
fn apart_from_texts(ops: &[Op], at: [f32; 2], size: [f32; 2]) -> bool {
    let area = Area::new(
        at[0] - TEXT_GAP,
        at[1] - 1.0,
        at[0] + size[0] + TEXT_GAP,
        at[1] + size[1] + 1.0,
    );
    ops.iter().all(|op| match op {
        Op::Text {
            x,
            y,
            size,
            bold,
            text,
        } => !text_area(*x, *y, *size, *bold, text).overlaps(&area),
        _ => true,
    })
}

/// Places `text` at the first of `candidates` inside `bounds`, [`LINE_GAP`] clear of every
/// line and [`TEXT_GAP`] from every label beside it; returns its box.
pub(in crate::sheet) fn place_apart(
    w: &mut Writer,
    bounds: &Area,
    bold: bool,
    text: &str,
    candidates: &[[f32; 2]],
) -> Option<Area> {
    let size = [text_width(text, LABEL, bold), label_h()];
    let apart: Vec<[f32; 2]> = candidates
        .iter()
        .copied()
        .filter(|c| apart_from_texts(w.current(), *c, size))
        .collect();
    w.place_label(bounds, LABEL, bold, text, &apart, LINE_GAP)
}

/// Candidate top-left corners round `anchor` for a label of `size`.
/// The first ring of `around` (the eight places beside the anchor), then `near`, then the
/// farther rings.
pub(in crate::sheet) fn nearest_first(around: Vec<[f32; 2]>, near: Vec<[f32; 2]>) -> Vec<[f32; 2]> {
    let split = around.len().min(8);
    let (first, rest) = around.split_at(split);
    [first, &near, rest].concat()
}

/// Candidate top-left corners for a label of `size` near `anchor`, nearest first: every
/// place on a 2 pt grid within 40 pt whose box keeps [`LINE_GAP`] from the anchor's box.
pub(in crate::sheet) fn nearby(anchor: Area, size: [f32; 2]) -> Vec<[f32; 2]> {
    let keep = anchor.grown(LINE_GAP + 0.5);
    let mut c: Vec<(f32, [f32; 2])> = Vec::new();
    for i in -20..=20 {
        for j in -20..=20 {
            let x = anchor.x0 - size[0] + 2.0 * i as f32 + 0.5 * (anchor.x1 - anchor.x0 + size[0]);
            let y = anchor.y0 - size[1] + 2.0 * j as f32 + 0.5 * (anchor.y1 - anchor.y0 + size[1]);
            let b = Area::new(x, y, x + size[0], y + size[1]);
            if b.overlaps(&keep) {
                continue;
            }
            let dx = (b.x0 - anchor.x1).max(anchor.x0 - b.x1).max(0.0);
            let dy = (b.y0 - anchor.y1).max(anchor.y0 - b.y1).max(0.0);
            c.push((dx.hypot(dy), [x, y]));
        }
    }
    c.sort_by(|p, q| p.0.total_cmp(&q.0));
    c.into_iter().map(|(_, p)| p).collect()
}

/// Candidate top-left corners for a label of `size` round `anchor` (see
/// [`candidates_around`]).
pub(crate) fn around(anchor: Area, size: [f32; 2], gap: f32) -> Vec<[f32; 2]> {
    let rect = ScreenRect {
        min: [anchor.x0, anchor.y0],
        max: [anchor.x1, anchor.y1],
    };
    candidates_around(&rect, size, gap)
}

impl Drawing<'_> {
    /// Places `text`, or notes it as missing.
    fn place(&mut self, w: &mut Writer, bold: bool, text: &str, candidates: &[[f32; 2]]) {
        if place_apart(w, &self.bounds, bold, text, candidates).is_none() {
            self.missing.push(text.to_owned());
        }
    }

    pub(super) fn label_dims(&mut self, w: &mut Writer) {
        let h = label_h();
        let d0 = self.datum_page();
        for i in 0..self.x_dims.len() {
            let (text, g) = (self.x_dims[i].text(w.units), self.x_dims[i].gauge);
            let tw = text_width(&text, LABEL, false);
            let (y, xg) = (self.x_tier_y(i), self.centre(g)[0]);
            let top = y - 1.5 - h;
            let mid = (d0[0] + xg) / 2.0;
            let (lo, hi) = (d0[0].min(xg), d0[0].max(xg));
            let c = [
                [mid - tw / 2.0, top],
                [hi + 4.0, top],
                [lo - 4.0 - tw, top],
                [hi + 12.0, top],
                [lo - 12.0 - tw, top],
            ];
            let label = format!("{text} ({} along x)", self.setup.gauges[g].id);
            self.place_or(w, &text, &c, label);
        }
        for j in 0..self.s_dims.len() {
            let (text, g) = (self.s_dims[j].text(w.units), self.s_dims[j].gauge);
            let (x, yg) = (self.s_tier_x(j) + 3.0, self.centre(g)[1]);
            let mid = (d0[1] + yg) / 2.0;
            let (lo, hi) = (d0[1].min(yg), d0[1].max(yg));
            let c = [
                [x, mid - h / 2.0],
                [x, hi + 3.0],
                [x, lo - 3.0 - h],
                [x, hi + 12.0],
                [x, lo - 12.0 - h],
            ];
            let label = format!("{text} ({} along s)", self.setup.gauges[g].id);
            self.place_or(w, &text, &c, label);
        }
    }

    /// Places `text`, or notes `missing` as missing.
    fn place_or(&mut self, w: &mut Writer, text: &str, c: &[[f32; 2]], missing: String) {
        if place_apart(w, &self.bounds, false, text, c).is_none() {
            self.missing.push(missing);
        }
    }

    /// Each gauge's id and reference angle beside it, and "datum" beside the datum.
    pub(super) fn label_gauges(&mut self, w: &mut Writer, datum: Area) {
        let h = label_h();
        for i in 0..self.setup.gauges.len() {
            let g = &self.setup.gauges[i];
            let text = format!("{} {:.0}°", g.id, g.angle_rad.to_degrees());
            let size = [text_width(&text, LABEL, true), h];
            let b = self.gauge_boxes[i];
            let c = nearest_first(around(b, size, 2.5), nearby(b, size));
            self.place(w, true, &text, &c);
        }
        let size = [text_width("datum", LABEL, false), h];
        let c = nearest_first(around(datum, size, 2.0), nearby(datum, size));
        self.place(w, false, "datum", &c);
    }

    /// The number of each grid of a gauge with more than one, just beyond the grid's solder
    /// tabs, numbered from 1 as the wiring diagrams and the records number them.
    pub(super) fn label_grids(&mut self, w: &mut Writer) {
        for i in 0..self.setup.gauges.len() {
            let tabs = self.grid_tabs[i].clone();
            if tabs.len() < 2 {
                continue;
            }
            for (k, (end, dir)) in tabs.into_iter().enumerate() {
                let text = (k + 1).to_string();
                let c = grid_number_candidates(end, dir, &text);
                if place_apart(w, &self.bounds, true, &text, &c).is_none() {
                    let id = &self.setup.gauges[i].id;
                    self.missing.push(format!("{id} grid {}", k + 1));
                }
            }
        }
    }

    /// What lies beyond each edge, in the rows above and below the face.
    pub(super) fn label_edges(&mut self, w: &mut Writer) {
        let units = w.units;
        let len = |x: f64| len(units, x);
        let e = self.setup.edges;
        let f = self.frame.area();
        let b = self.setup.bounds;
        let reaches = |windows: &[(f64, f64)], first: bool, end: f64| {
            let v = if first {
                windows.first()
            } else {
                windows.last()
            };
            v.is_some_and(|(a, z)| {
                if first {
                    *a <= end + 1e-9
                } else {
                    *z >= end - 1e-9
                }
            })
        };
        let name = |reached: bool, which: &str, n: Neighbour| {
            format!("{} {}", edge_words(reached, which, &n), n.label(&len))
        };
        let top_ok = reaches(&self.frame.s.windows, false, b.s_m.1);
        let bottom_ok = reaches(&self.frame.s.windows, true, b.s_m.0);
        let top = name(top_ok, "upper", e.s_max);
        let bottom = name(bottom_ok, "lower", e.s_min);
        let left_ok = reaches(&self.frame.x.windows, true, b.x_m.0);
        let right_ok = reaches(&self.frame.x.windows, false, b.x_m.1);
        let left = name(left_ok, "left", e.x_min);
        let right = name(right_ok, "right", e.x_max);
        let h = label_h();
        // The first row keeps the label gap from the face's edge line.
        let off = LINE_GAP + 1.0;
        let above = [0.0, 1.0, 2.0].map(|k| f.y0 - off - h - k * ROW);
        let below = [0.0, 1.0, 2.0].map(|k| f.y1 + off + k * ROW);
        let [a0, a1, a2] = above;
        let [b0, b1, b2] = below;
        // Two lines (what the edge is, then its name) in rows next to each other, the upper
        // line first, where one line finds no room.
        let (up, down) = ([(a1, a0), (a2, a1)], [(b0, b1), (b1, b2)]);
        for (text, rows, pairs, align) in [
            (top, vec![a0, a1, a2], up.to_vec(), 0.5),
            (bottom, vec![b0, b1, b2], down.to_vec(), 0.5),
            (left, vec![a1, a0, a2, b1, b0, b2], [up, down].concat(), 0.0),
            (
                right,
                vec![b1, b0, b2, a1, a0, a2],
                [down, up].concat(),
                1.0,
            ),
        ] {
            let c = self.row_candidates(text_width(&text, LABEL, false), &rows, align);
            if place_apart(w, &self.bounds, false, &text, &c).is_none()
                && !self.place_split(w, &text, &pairs, align)
            {
                self.missing.push(text);
            }
        }
    }

    /// Places `text` in two lines split after its colon, the lines in a pair of `rows`
    /// (upper, lower) at the first place where both are clear; false when none is.
    fn place_split(&self, w: &mut Writer, text: &str, rows: &[(f32, f32)], align: f32) -> bool {
        let Some((head, tail)) = text.split_once(": ") else {
            return false;
        };
        let head = format!("{head}:");
        let widths = [&head, tail].map(|t| text_width(t, LABEL, false));
        let h = label_h();
        for &(upper, lower) in rows {
            let xs = self.row_candidates(widths[0].max(widths[1]), &[upper], align);
            let spot = xs.iter().find(|c| {
                [(upper, widths[0]), (lower, widths[1])]
                    .iter()
                    .all(|&(y, tw)| {
                        let area = Area::new(c[0], y, c[0] + tw, y + h);
                        is_clear(w.current(), &self.bounds, &area, LINE_GAP)
                            && apart_from_texts(w.current(), [c[0], y], [tw, h])
                    })
            });
            if let Some(c) = spot {
                w.text_top(c[0], upper, LABEL, false, &head);
                w.text_top(c[0], lower, LABEL, false, tail);
                return true;
            }
        }
        false
    }

    /// Candidates along the given rows, aligned to the face (`align` 0 left, 0.5 centred, 1
    /// right), then farther and farther from there: a centred label tries the first row all
    /// along before the next, an end's label tries every row near its end, then moves along.
    fn row_candidates(&self, tw: f32, rows: &[f32], align: f32) -> Vec<[f32; 2]> {
        let f = self.frame.area();
        let (lo, hi) = (self.bounds.x0, (self.bounds.x1 - tw).max(self.bounds.x0));
        // An end's label wider than the face starts no farther out than the face's middle.
        let first = match align {
            a if a > 0.75 => (f.x1 - tw).max((f.x0 + f.x1) / 2.0),
            a if a < 0.25 => f.x0,
            _ => f.x0 + 0.5 * (f.x1 - f.x0 - tw),
        }
        .clamp(lo, hi);
        let xs: Vec<f32> = (0..=60u32)
            .map(|k| first + 10.0 * k.div_ceil(2) as f32 * if k % 2 == 0 { 1.0 } else { -1.0 })
            .filter(|x| (lo..=hi).contains(x))
            .collect();
        if align == 0.5 {
            // Next to its edge matters more than centred: the nearest row first.
            rows.iter()
                .flat_map(|&y| xs.iter().map(move |&x| [x, y]))
                .collect()
        } else {
            // Near its end in the first rows that have room there; then aligned with its end
            // matters more than the row.
            let near = rows.iter().flat_map(|&y| {
                xs.iter()
                    .filter(move |&&x| (x - first).abs() <= 40.0)
                    .map(move |&x| [x, y])
            });
            near.chain(xs.iter().flat_map(|&x| rows.iter().map(move |&y| [x, y])))
                .collect()
        }
    }

    /// The lines under the drawing: the datum, gauges on the datum's lines and any label
    /// that found no room.
    pub(super) fn legend(&self, w: &mut Writer, on_x: &[usize], on_s: &[usize]) {
        for text in legend_paras(self.setup, on_x, on_s, w.units) {
            w.para(LEGEND, false, &text);
        }
        if !self.missing.is_empty() {
            w.para(
                LEGEND,
                true,
                &format!(
                    "No room on the drawing for: {}; the gauge table gives every position.",
                    self.missing.join("; ")
                ),
            );
        }
    }
}

/// Size of the lines under a drawing, points.
const LEGEND: f32 = 7.5;

/// The paragraphs under a drawing: where the datum is and what its coordinates are measured
/// from, and the gauges on the datum's lines (`on_x`, `on_s`: indices into the setup's gauges).
fn legend_paras(setup: &FaceSetup, on_x: &[usize], on_s: &[usize], units: Units) -> Vec<String> {
    let mm1 = |v: f64| len(units, v);
    let (dx, ds) = setup.datum_stated;
    let round = match setup.period_m {
        Some(p) => format!(
            " Arc lengths are measured round the surface as drawn; the other way round \
             differs by the circumference, {}.",
            mm1(p)
        ),
        None => String::new(),
    };
    let mut out = vec![format!(
        "Datum (circle with a cross) at x = {}, s = {} ({}); every dimension is in {} from it, \
         + towards the +x and +s arrows.{round}",
        mm1(dx),
        mm1(ds),
        setup.datum_words(),
        crate::sheet::length_unit_name(units)
    )];
    out.extend(hole_note(setup, units));
    let ids = |list: &[usize]| {
        list.iter()
            .map(|&i| setup.gauges[i].id.as_str())
            .collect::<Vec<_>>()
            .join(", ")
    };
    let both: Vec<usize> = on_x.iter().copied().filter(|i| on_s.contains(i)).collect();
    let only = |list: &[usize]| -> Vec<usize> {
        list.iter().copied().filter(|i| !both.contains(i)).collect()
    };
    for (list, words) in [
        (both.clone(), "At the datum itself".to_owned()),
        (
            only(on_x),
            format!("On the datum's line across the face (x = {})", mm1(dx)),
        ),
        (
            only(on_s),
            format!("On the datum's line along the face (s = {})", mm1(ds)),
        ),
    ] {
        if !list.is_empty() {
            out.push(format!("{words}: {}.", ids(&list)));
        }
    }
    out
}

/// On a plate whose datum lies in its hole: that the datum is the hole's centre, found from
/// the hole's edge, and how far each gauge's centre lies from that edge along the line from
/// the hole's centre (its distance from the centre less the hole's radius).
pub(super) fn hole_note(setup: &FaceSetup, units: Units) -> Option<String> {
    let mm1 = |v: f64| len(units, v);
    let a = setup
        .extent
        .hole_radius_m
        .filter(|a| a.is_finite() && *a > 0.0)?;
    let (dx, ds) = setup.datum_stated;
    if dx.hypot(ds) >= a {
        return None;
    }
    let at_centre = if dx.hypot(ds) < 0.05e-3 {
        "The datum is the hole's centre".to_owned()
    } else {
        format!(
            "The datum lies in the hole, {} from its centre",
            mm1(dx.hypot(ds))
        )
    };
    let gauges: Vec<String> = setup
        .gauges
        .iter()
        .map(|g| {
            let (x, s) = (g.position.x_m, g.position.s_m);
            let toward = s.atan2(x).to_degrees();
            format!(
                "{}: {} from the hole edge (on the line from the centre at {toward:.0}° from +x)",
                g.id,
                mm1(x.hypot(s) - a)
            )
        })
        .collect();
    Some(format!(
        "{at_centre}, with no metal to mark there: find it from the hole's edge (the hole is {} \
         across), and measure each gauge's centre from the edge along the line from the \
         centre; {}.",
        mm1(2.0 * a),
        gauges.join("; ")
    ))
}

/// Height of the paragraphs under a drawing, with a line to spare for a note of labels that
/// found no room, points.
pub(super) fn legend_height(w: &Writer, setup: &FaceSetup, on_x: &[usize], on_s: &[usize]) -> f32 {
    let pitch = line_pitch(LEGEND, false);
    legend_paras(setup, on_x, on_s, w.units)
        .iter()
        .map(|t| wrap(t, LEGEND, false, w.column()).len() as f32 * pitch + 0.25 * LEGEND)
        .sum::<f32>()
        + pitch
}

/// The key to the face drawings.
const KEY: &str = "Key to the face drawings: each gauge has every grid outlined with its grid \
    lines along the grid direction; the grey pads are the solder tabs, at the end of each grid \
    facing away from its direction; on a gauge of two or more grids the bold figure beyond each \
    grid's tabs is the grid's number (grid 1, grid 2, … as the wiring diagrams and the records \
    name them). The arrow is the gauge's reference direction, its angle counted \
    counter-clockwise from +x as drawn (for a rosette the grids lie at their pattern's angles \
    from it). The dashed grey rectangle round a gauge is the area to prepare (the grid plus \
    {margin} all round, as in the gauge table), cut off at the face's edges. The names round each \
    face say which edge borders what, so a drawing cannot be read mirrored. A zig-zag line is \
    a break: the face goes on there, and distances across it are true.";

/// Size of the key's text, points.
const KEY_SIZE: f32 = 7.5;

/// The key in the sheet's units: the margin round a prepared area is 10 mm (SI) or about
/// 0.4 in (10 mm = 0.394 in).
fn key_text(units: Units) -> String {
    let margin = match units {
        Units::Si => "10 mm",
        Units::UsCustomary => "about 0.4 in",
    };
    KEY.replace("{margin}", margin)
}

/// The key to every face drawing of a part, printed under the first of them.
pub(super) fn key(w: &mut Writer) {
    w.para(KEY_SIZE, false, &key_text(w.units));
}

/// Height the key takes, points.
pub(super) fn key_height(w: &Writer) -> f32 {
    let lines = wrap(&key_text(w.units), KEY_SIZE, false, w.column()).len() as f32;
    lines * line_pitch(KEY_SIZE, false) + 0.25 * KEY_SIZE
}

/// How an edge's label starts: "beyond the left edge:" where another face lies past it,
/// "left edge:" where the edge itself is what is named (an end, a pole, a seam, a flange's or
/// a plate's edge), "past the break, towards the left edge:" where the drawing stops short.
pub(super) fn edge_words(reached: bool, which: &str, n: &Neighbour) -> String {
    let borders_a_face = matches!(
        n,
        Neighbour::Face(_)
            | Neighbour::FlangeInside { .. }
            | Neighbour::MeshEdge {
                beyond: Some(_),
                ..
            }
    );
    match (reached, borders_a_face) {
        (false, _) => format!("past the break, towards the {which} edge:"),
        (true, true) => format!("beyond the {which} edge:"),
        (true, false) => format!("{which} edge:"),
    }
}

/// Candidate top-left corners for grid number `text` beyond the tabs: straight out from the
/// tabs' end `end` (the grid runs along `dir` away from it), then a little to either side,
/// then farther out.
fn grid_number_candidates(end: [f32; 2], dir: [f32; 2], text: &str) -> Vec<[f32; 2]> {
    let (tw, h) = (text_width(text, LABEL, true), label_h());
    let out = [-dir[0], -dir[1]];
    let side = [-out[1], out[0]];
    let half = 0.5 * (out[0].abs() * tw + out[1].abs() * h);
    let mut c = Vec::new();
    for d in [LINE_GAP + 0.5, 4.5, 7.0, 10.0, 14.0, 19.0] {
        for s in [0.0f32, 4.0, -4.0, 8.0, -8.0] {
            let q = [
                end[0] + out[0] * (d + half) + side[0] * s,
                end[1] + out[1] * (d + half) + side[1] * s,
            ];
            c.push([q[0] - tw / 2.0, q[1] - h / 2.0]);
        }
    }
    let tip = Area::new(end[0] - 1.0, end[1] - 1.0, end[0] + 1.0, end[1] + 1.0);
    c.extend(around(tip, [tw, h], 8.0));
    c
}
