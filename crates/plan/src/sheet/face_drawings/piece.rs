//! One piece of a 1:1 marking template: a region of the face round some of its gauges, drawn
//! at true size with the gauges' outlines, cross-hairs through their centres out past the
//! piece's edges (to transfer onto the part), the datum when it lies in the piece, and the
//! names of what lies beyond each edge.

use super::labels::{around, place_apart};
use super::marks::Frame;
use super::outline::CLEAR;
use super::plan::{Axis, FaceSetup, Scale};
use super::{Drawing, EDGE_ROWS, LABEL, ROW, label_h};
use crate::sheet::layout::{Area, text_width};
use crate::sheet::len;
use crate::sheet::writer::Writer;

/// Room a piece needs above and below the face drawn in it, points.
pub(in crate::sheet) const PIECE_ROOM: f32 = 2.0 * EDGE_ROWS * ROW + 16.0;

/// Room above (and below) the face drawn in a piece, for the edge labels, points.
pub(in crate::sheet) const EDGE_ROOM: f32 = EDGE_ROWS * ROW;

/// How far the cross-hairs run past the piece's edges, points.
const CROSS_OUT: f32 = 8.0;

/// The piece of `setup` in x window `x` and s window `s`, at 1:1: the setup with only the
/// gauges in it, or `None` when it holds none.
pub(in crate::sheet) fn piece_setup(
    setup: &FaceSetup,
    x: (f64, f64),
    s: (f64, f64),
) -> Option<FaceSetup> {
    let inside = |v: f64, (a, b): (f64, f64)| v >= a - 1e-9 && v <= b + 1e-9;
    let mut piece = setup.clone();
    piece
        .gauges
        .retain(|g| inside(g.position.x_m, x) && inside(g.position.s_m, s));
    (!piece.gauges.is_empty()).then_some(piece)
}

/// Draws the piece of `setup` (already cut down by [`piece_setup`]) spanning windows `x` and
/// `s` at 1:1, its face's upper left corner at (`left`, `top`); labels go inside `bounds`.
/// Returns the labels that found no room.
pub(in crate::sheet) fn draw_piece(
    w: &mut Writer,
    setup: &FaceSetup,
    (x, s): ((f64, f64), (f64, f64)),
    (left, top): (f32, f32),
    bounds: Area,
) -> Vec<String> {
    let k = Scale::FULL.pt_per_m();
    let axis = |window: (f64, f64)| Axis {
        windows: vec![window],
        pt_per_m: k,
    };
    let mut d = Drawing {
        setup,
        scale: Scale::FULL,
        frame: Frame {
            x: axis(x),
            s: axis(s),
            left,
            top,
        },
        x_dims: Vec::new(),
        s_dims: Vec::new(),
        s_tier: 0.0,
        bounds,
        gauge_boxes: Vec::new(),
        grid_tabs: Vec::new(),
        missing: Vec::new(),
    };
    d.draw_face_outline(w);
    d.draw_gauges(w);
    d.draw_cross_hairs(w);
    let datum = d.datum_in_piece().then(|| d.draw_datum(w));
    d.label_grids(w);
    d.label_edges(w);
    d.label_piece_gauges(w);
    if let Some(datum) = datum {
        let size = [text_width("datum", LABEL, false), label_h()];
        let c = super::labels::nearest_first(
            around(datum, size, 2.0),
            super::labels::nearby(datum, size),
        );
        if place_apart(w, &d.bounds, false, "datum", &c).is_none() {
            d.missing.push("datum".into());
        }
    }
    d.missing
}

impl Drawing<'_> {
    fn datum_in_piece(&self) -> bool {
        let (x, s) = self.setup.datum;
        self.frame.page_x(x).is_some() && self.frame.page_y(s).is_some()
    }

    /// Lines through each gauge's centre along x and s, from the gauge out past the piece,
    /// kept clear of every gauge (its arrow included).
    fn draw_cross_hairs(&self, w: &mut Writer) {
        let f = self.frame.area();
        for (i, b) in self.gauge_boxes.iter().enumerate() {
            let c = self.centre(i);
            for (p, q) in [
                ([b.x0 - CLEAR, c[1]], [f.x0 - CROSS_OUT, c[1]]),
                ([b.x1 + CLEAR, c[1]], [f.x1 + CROSS_OUT, c[1]]),
                ([c[0], b.y0 - CLEAR], [c[0], f.y0 - CROSS_OUT]),
                ([c[0], b.y1 + CLEAR], [c[0], f.y1 + CROSS_OUT]),
            ] {
                let ahead = (q[0] - p[0]) * (p[0] - c[0]) + (q[1] - p[1]) * (p[1] - c[1]);
                if ahead > 1.0 {
                    self.extension(w, p, q);
                }
            }
        }
    }

    /// Each gauge's id, angle and position from the datum beside it.
    fn label_piece_gauges(&mut self, w: &mut Writer) {
        let (dx, ds) = self.setup.datum;
        for i in 0..self.setup.gauges.len() {
            let g = &self.setup.gauges[i];
            let texts = [
                (true, format!("{} {:.0}°", g.id, g.angle_rad.to_degrees())),
                (
                    false,
                    format!(
                        "x {}, s {}",
                        len(w.units, g.position.x_m - dx),
                        len(w.units, g.position.s_m - ds)
                    ),
                ),
            ];
            let mut anchor = self.gauge_boxes[i];
            // Beside the piece, level with the gauge, past the end of its cross-hair.
            let beside_x = self.frame.area().x1 + CROSS_OUT + 4.0;
            let level = self.centre(i)[1] - label_h() / 2.0;
            for (bold, text) in texts {
                let size = [text_width(&text, LABEL, bold), label_h()];
                let beside = [0.0f32, -1.0, 1.0, -2.0, 2.0].map(|k| [beside_x, level + k * ROW]);
                let mut c = around(anchor, size, 2.5);
                if !bold {
                    c.splice(0..0, beside);
                } else {
                    c.extend(beside);
                }
                match place_apart(w, &self.bounds, bold, &text, &c) {
                    Some(a) => anchor = a,
                    None => self.missing.push(text),
                }
            }
        }
    }
}
