//! The face itself (its windows, edges, breaks and any hole), the dimension and extension
//! lines, and the scale bar with the axis arrows.

use gw_mechanics::imported::outline_rings;

use super::{Drawing, EDGE_ROWS, ROW, TIER, label_h, marks};
use crate::sheet::layout::Area;
use crate::sheet::writer::Writer;

/// Gap between a gauge (its arrow's tip included) and an extension line, points.
pub(super) const CLEAR: f32 = 4.0;

/// Two face coordinates closer than this are the same line, metres.
const SAME_M: f64 = 1e-9;

impl Drawing<'_> {
    /// The face in each pair of windows, shaded, with its true edges drawn solid and a break
    /// line where a window stops short of the edge. A face of an imported part is shaded and
    /// edged along its own outline (holes left open), not its bounding rectangle.
    pub(super) fn draw_face_outline(&self, w: &mut Writer) {
        let b = self.setup.bounds;
        let f = &self.frame;
        let outline = &self.setup.outline;
        let rings = outline_rings(outline);
        for &(xa, xb) in &f.x.windows {
            let (x0, x1) = (xa.max(b.x_m.0), xb.min(b.x_m.1));
            for &(sa, sb) in &f.s.windows {
                let (s0, s1) = (sa.max(b.s_m.0), sb.min(b.s_m.1));
                if x1 <= x0 || s1 <= s0 {
                    continue;
                }
                let (Some(px0), Some(px1), Some(py0), Some(py1)) =
                    (f.page_x(x0), f.page_x(x1), f.page_y(s1), f.page_y(s0))
                else {
                    continue;
                };
                let area = Area::new(px0, py0, px1, py1);
                if outline.is_empty() {
                    w.rect(area, Some(238), 0.0);
                } else {
                    self.draw_true_face(w, &rings, (x0, s0), area);
                }
                let edge = |at: f64, end: f64| (at - end).abs() < SAME_M;
                let sides = [
                    (edge(x0, b.x_m.0), [px0, py0], [px0, py1]),
                    (edge(x1, b.x_m.1), [px1, py0], [px1, py1]),
                    (edge(s1, b.s_m.1), [px0, py0], [px1, py0]),
                    (edge(s0, b.s_m.0), [px0, py1], [px1, py1]),
                ];
                for (is_edge, p, q) in sides {
                    if !is_edge {
                        marks::break_line(w, p, q);
                    } else if outline.is_empty() {
                        w.line(p, q, 0.9, 0);
                    }
                }
            }
        }
        self.draw_hole(w);
    }

    /// An imported face inside one window (`area` on the page, its lower left corner at face
    /// point `origin`): the face's rings shaded by the even–odd rule, its outline drawn solid.
    fn draw_true_face(
        &self,
        w: &mut Writer,
        rings: &[Vec<[f64; 2]>],
        origin: (f64, f64),
        area: Area,
    ) {
        let k = f64::from(self.k());
        let page = |p: [f64; 2]| {
            [
                area.x0 + ((p[0] - origin.0) * k) as f32,
                area.y1 - ((p[1] - origin.1) * k) as f32,
            ]
        };
        let shaded: Vec<Vec<[f32; 2]>> = rings
            .iter()
            .map(|r| {
                let on_page: Vec<[f32; 2]> = r.iter().map(|p| page(*p)).collect();
                marks::clip_polygon(&on_page, &area)
            })
            .filter(|r| r.len() > 2)
            .collect();
        if !shaded.is_empty() {
            w.region(shaded, 238);
        }
        // Edges along the window's own sides land a rounding error outside it: kept.
        let keep = area.grown(0.05);
        for e in &self.setup.outline {
            if let Some((p, q)) = marks::clip_segment(page(e.from), page(e.to), &keep)
                && (q[0] - p[0]).hypot(q[1] - p[1]) > 0.05
            {
                w.line(p, q, 0.9, 0);
            }
        }
    }

    /// A plate's hole, where it lies in the windows: white (no metal there) with its outline.
    fn draw_hole(&self, w: &mut Writer) {
        let Some(a) = self.setup.extent.hole_radius_m.filter(|a| *a > 0.0) else {
            return;
        };
        let f = &self.frame;
        let n = 96;
        let points: Vec<Option<[f32; 2]>> = (0..=n)
            .map(|k| {
                let t = k as f64 / n as f64 * std::f64::consts::TAU;
                Some([f.page_x(a * t.cos())?, f.page_y(a * t.sin())?])
            })
            .collect();
        if let Some(ring) = points.iter().copied().collect::<Option<Vec<_>>>() {
            w.path(ring, true, 0.8, Some(255));
            return;
        }
        // A step longer than the arc between points jumps a break: not drawn.
        let step = (std::f64::consts::TAU * a / n as f64) as f32 * self.k() * 1.5;
        for pair in points.windows(2) {
            if let [Some(p), Some(q)] = pair
                && (q[0] - p[0]).hypot(q[1] - p[1]) <= step
            {
                w.line(*p, *q, 0.8, 0);
            }
        }
    }

    /// The hole of a plate on the page, centre and radius (points), when it is drawn whole.
    pub(super) fn hole_page(&self) -> Option<([f32; 2], f32)> {
        let a = self.setup.extent.hole_radius_m.filter(|a| *a > 0.0)?;
        let f = &self.frame;
        let c = [f.page_x(0.0)?, f.page_y(0.0)?];
        Some((c, a as f32 * self.k()))
    }

    /// Page y of horizontal dimension tier `i`.
    pub(super) fn x_tier_y(&self, i: usize) -> f32 {
        self.frame.area().y1 + EDGE_ROWS * ROW + TIER * i as f32 + label_h() + 4.0
    }

    /// Page x of vertical dimension tier `j`.
    pub(super) fn s_tier_x(&self, j: usize) -> f32 {
        self.frame.area().x1 + 14.0 + self.s_tier * j as f32
    }

    /// Dimensions along x below the face: extension lines down from the datum and from each
    /// gauge, a dimension line with arrowheads per distance, the shortest nearest the face.
    pub(super) fn draw_x_dims(&self, w: &mut Writer, datum: Area) {
        let Some(last) = self.x_dims.len().checked_sub(1) else {
            return;
        };
        let xd = self.datum_page()[0];
        self.extension(w, [xd, datum.y1 + 1.5], [xd, self.x_tier_y(last) + 3.0]);
        for (i, d) in self.x_dims.iter().enumerate() {
            let y = self.x_tier_y(i);
            let xg = self.centre(d.gauge)[0];
            let from = self.gauge_boxes[d.gauge].y1 + CLEAR;
            self.extension(w, [xg, from], [xg, y + 3.0]);
            marks::dimension_line(w, [xd, y], [xg, y]);
        }
    }

    /// Dimensions along s right of the face, likewise.
    pub(super) fn draw_s_dims(&self, w: &mut Writer, datum: Area) {
        let Some(last) = self.s_dims.len().checked_sub(1) else {
            return;
        };
        let yd = self.datum_page()[1];
        self.extension(w, [datum.x1 + 1.5, yd], [self.s_tier_x(last) + 3.0, yd]);
        for (j, d) in self.s_dims.iter().enumerate() {
            let x = self.s_tier_x(j);
            let yg = self.centre(d.gauge)[1];
            let from = self.gauge_boxes[d.gauge].x1 + CLEAR;
            self.extension(w, [from, yg], [x + 3.0, yg]);
            marks::dimension_line(w, [x, yd], [x, yg]);
        }
    }

    /// An extension line from `a` to `b`, left out where it would cross a gauge (its grids,
    /// tabs and arrow, with [`CLEAR`] round them).
    pub(super) fn extension(&self, w: &mut Writer, a: [f32; 2], b: [f32; 2]) {
        let avoid: Vec<Area> = self.gauge_boxes.iter().map(|g| g.grown(CLEAR)).collect();
        for (p, q) in marks::outside_boxes(a, b, &avoid) {
            if (q[0] - p[0]).hypot(q[1] - p[1]) > 1.0 {
                marks::extension_line(w, p, q);
            }
        }
    }

    /// The scale bar in the display length unit and the +x, +s arrows, under the dimensions.
    pub(super) fn draw_scale_and_axes(&self, w: &mut Writer) {
        let y = self.x_tier_y(self.x_dims.len()) - label_h();
        let pt_per_m = self.scale.pt_per_m();
        let (length_m, label) = crate::sheet::scale_bar_length(w.units, pt_per_m, 120.0);
        let bar = marks::scale_bar(w, self.frame.left, y, &label, length_m * pt_per_m);
        marks::axis_arrows(w, bar.x1 + 40.0, y + 24.0, 18.0);
    }
}
