//! The drawing's labels, each at the first place clear of every line and label already on the
//! page: dimension values, gauge ids with their angles, the datum and the edge names; then the
//! legend under the drawing.

use super::{Drawing, LABEL, ROW, label_h, mm1};
use crate::drawing::face_layout::{ScreenRect, candidates_around};
use crate::sheet::layout::{Area, text_width};
use crate::sheet::writer::Writer;

/// Candidate top-left corners round `anchor` for a label of `size`.
fn around(anchor: Area, size: [f32; 2], gap: f32) -> Vec<[f32; 2]> {
    let rect = ScreenRect {
        min: [anchor.x0, anchor.y0],
        max: [anchor.x1, anchor.y1],
    };
    candidates_around(&rect, size, gap)
}

impl Drawing<'_> {
    /// Places `text`, or notes it as missing.
    fn place(&mut self, w: &mut Writer, bold: bool, text: &str, candidates: &[[f32; 2]]) {
        if w.place_label(&self.bounds, LABEL, bold, text, candidates, 1.0)
            .is_none()
        {
            self.missing.push(text.to_owned());
        }
    }

    pub(super) fn label_dims(&mut self, w: &mut Writer) {
        let h = label_h();
        let d0 = self.datum_page();
        for i in 0..self.x_dims.len() {
            let (text, g) = (self.x_dims[i].text(), self.x_dims[i].gauge);
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
            let (text, g) = (self.s_dims[j].text(), self.s_dims[j].gauge);
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
        if w.place_label(&self.bounds, LABEL, false, text, c, 1.0)
            .is_none()
        {
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
            let c = around(self.gauge_boxes[i], size, 2.5);
            self.place(w, true, &text, &c);
        }
        let size = [text_width("datum", LABEL, false), h];
        let c = around(datum, size, 2.0);
        self.place(w, false, "datum", &c);
    }

    /// What lies beyond each edge, in the rows above and below the face.
    pub(super) fn label_edges(&mut self, w: &mut Writer) {
        let len = |x: f64| mm1(x);
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
        let side = |reached: bool, which: &str| {
            if reached {
                format!("beyond the {which} edge:")
            } else {
                format!("past the break, towards the {which} edge:")
            }
        };
        let top_ok = reaches(&self.frame.s.windows, false, b.s_m.1);
        let bottom_ok = reaches(&self.frame.s.windows, true, b.s_m.0);
        let top = format!("{} {}", side(top_ok, "upper"), e.s_max.label(&len));
        let bottom = format!("{} {}", side(bottom_ok, "lower"), e.s_min.label(&len));
        let left_ok = reaches(&self.frame.x.windows, true, b.x_m.0);
        let right_ok = reaches(&self.frame.x.windows, false, b.x_m.1);
        let left = format!("{} {}", side(left_ok, "left"), e.x_min.label(&len));
        let right = format!("{} {}", side(right_ok, "right"), e.x_max.label(&len));
        let h = label_h();
        let above = [f.y0 - 2.0 - h, f.y0 - 2.0 - h - ROW];
        let below = [f.y1 + 2.0, f.y1 + 2.0 + ROW];
        for (text, rows, align) in [
            (top, vec![above[0], above[1]], 0.5),
            (bottom, vec![below[0], below[1]], 0.5),
            (left, vec![above[1], above[0], below[1], below[0]], 0.0),
            (right, vec![below[1], below[0], above[1], above[0]], 1.0),
        ] {
            let c = self.row_candidates(&text, &rows, align);
            self.place(w, false, &text, &c);
        }
    }

    /// Candidates along the given rows, aligned to the face (`align` 0 left, 0.5 centred, 1
    /// right), then farther and farther from there: a centred label tries the first row all
    /// along before the next, an end's label tries every row before moving along.
    fn row_candidates(&self, text: &str, rows: &[f32], align: f32) -> Vec<[f32; 2]> {
        let tw = text_width(text, LABEL, false);
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
            // Aligned with its end matters more than the row.
            xs.iter()
                .flat_map(|&x| rows.iter().map(move |&y| [x, y]))
                .collect()
        }
    }

    /// The lines under the drawing: the datum, how gauges are drawn, breaks, gauges on the
    /// datum's lines and any label that found no room.
    pub(super) fn legend(&self, w: &mut Writer, on_x: &[usize], on_s: &[usize]) {
        let (dx, ds) = self.setup.datum_stated;
        let round = match self.setup.period_m {
            Some(p) => format!(
                " Arc lengths are measured round the surface as drawn; the other way round \
                 differs by the circumference, {}.",
                mm1(p)
            ),
            None => String::new(),
        };
        w.para(
            7.5,
            false,
            &format!(
                "Datum (circle with a cross) at x = {}, s = {} ({}); every dimension is in mm \
                 from it, + towards the +x and +s arrows.{round}",
                mm1(dx),
                mm1(ds),
                self.setup.datum_words()
            ),
        );
        let ids = |list: &[usize]| {
            list.iter()
                .map(|&i| self.setup.gauges[i].id.as_str())
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
                w.para(7.5, false, &format!("{words}: {}.", ids(&list)));
            }
        }
        if !self.missing.is_empty() {
            w.para(
                7.5,
                true,
                &format!(
                    "No room on the drawing for: {}; the gauge table gives every position.",
                    self.missing.join("; ")
                ),
            );
        }
    }
}

/// The key to every face drawing of a part, printed once under the last of them.
pub(super) fn key(w: &mut Writer) {
    w.para(
        7.5,
        false,
        "Key to the face drawings: each gauge has every grid outlined with its grid lines along \
         the grid direction; the grey pads are the solder tabs, at the end of each grid \
         facing away from its direction; the arrow is the gauge's reference direction, its \
         angle counted counter-clockwise from +x as drawn (for a rosette the grids lie at their \
         pattern's angles from it). The names round each face say what lies beyond each edge, \
         so a drawing cannot be read mirrored. A zig-zag line is a break: the face goes on \
         there, and distances across it are true.",
    );
}
