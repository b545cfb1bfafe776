//! Each face that carries gauges drawn to a stated scale from the standard series, seen from
//! a stated side, with the names of what lies beyond each edge, the gauges with their grid
//! lines, solder tabs and directions, and dimension lines from the datum. Long faces show only
//! the regions round the gauges and the datum, with break lines between; round faces are
//! unrolled (axial position across, arc length up) with the seam away from the gauges.

pub(super) mod marks;
pub(super) mod piece;
pub(super) mod plan;

use gw_mechanics::Face;

use self::marks::Frame;
use self::plan::{FaceSetup, Scale};
use super::layout::{Area, MARGIN, ascent, descent, line_pitch, text_width, wrap};
use super::writer::Writer;
use crate::document::Part;
use crate::units::{Quantity, Units};

/// Size of labels on the drawings, points (no text on a drawing or template is smaller).
pub(crate) const LABEL: f32 = 7.5;
/// Least gap between a label and any line, points.
const LINE_GAP: f32 = 2.5;
/// Least gap between two labels side by side, points.
const TEXT_GAP: f32 = 6.5;
/// One row of labels, points.
pub(super) const ROW: f32 = 11.5;
/// Rows of edge labels above and below a face.
pub(super) const EDGE_ROWS: f32 = 3.0;
/// Height of one tier of horizontal dimensions, points.
const TIER: f32 = 16.0;
/// Face shown round each gauge, points on the page.
const PAD_PT: f64 = 40.0;
/// Largest height of a drawn face, points.
const MAX_FACE_PT: f32 = 300.0;
/// Dimensions shorter than this are not drawn: the gauge lies on the datum's line, metres.
const ON_LINE_M: f64 = 0.05e-3;

/// Draws each face that carries gauges (see the module's description), from `w.y` down.
pub(crate) fn draw(w: &mut Writer, part: &Part, placed: &[gw_bridge::PlacedGauge]) {
    let mut first = true;
    for extent in part.member.faces() {
        if let Some(setup) = FaceSetup::new(&part.member, extent, placed, part.datum_m) {
            draw_face(w, &setup, first);
            first = false;
        }
    }
}

/// The face's name with a capital.
pub(crate) fn face_title(face: Face) -> String {
    let name = face.name();
    let mut c = name.chars();
    c.next()
        .map(|f| f.to_uppercase().collect::<String>() + c.as_str())
        .unwrap_or_default()
}

/// One dimension from the datum to a gauge, along x or s.
#[derive(Debug, Clone)]
struct Dim {
    /// Signed distance from the datum, metres.
    value_m: f64,
    /// The gauge measured to.
    gauge: usize,
}

impl Dim {
    /// The number alone, in the display length unit the drawing states.
    fn text(&self, units: Units) -> String {
        units.format_number(Quantity::Length, self.value_m)
    }
}

/// Dimensions along x (`along_x`) or s: one per distinct distance from the datum, to the gauge
/// nearest the dimension lines (lowest for x, rightmost for s), shortest first. The gauges on
/// the datum's own line are returned apart.
fn dims(setup: &FaceSetup, along_x: bool) -> (Vec<Dim>, Vec<usize>) {
    let coord = |i: usize| {
        let p = setup.gauges[i].position;
        if along_x {
            p.x_m - setup.datum.0
        } else {
            p.s_m - setup.datum.1
        }
    };
    let nearer = |i: usize, j: usize| {
        let (p, q) = (setup.gauges[i].position, setup.gauges[j].position);
        if along_x {
            p.s_m < q.s_m
        } else {
            p.x_m > q.x_m
        }
    };
    let mut out: Vec<Dim> = Vec::new();
    let mut on_line = Vec::new();
    for i in 0..setup.gauges.len() {
        let v = coord(i);
        if v.abs() < ON_LINE_M {
            on_line.push(i);
            continue;
        }
        match out.iter_mut().find(|d| (d.value_m - v).abs() < ON_LINE_M) {
            Some(d) if nearer(i, d.gauge) => d.gauge = i,
            Some(_) => {}
            None => out.push(Dim {
                value_m: v,
                gauge: i,
            }),
        }
    }
    out.sort_by(|a, b| a.value_m.abs().total_cmp(&b.value_m.abs()));
    (out, on_line)
}

/// Height of a label's box.
fn label_h() -> f32 {
    ascent(LABEL, false) + descent(LABEL, false)
}

/// A face drawing being laid out.
struct Drawing<'a> {
    setup: &'a FaceSetup,
    scale: Scale,
    frame: Frame,
    x_dims: Vec<Dim>,
    s_dims: Vec<Dim>,
    /// Spacing of the vertical dimension tiers, points.
    s_tier: f32,
    /// Where the drawing's labels may go.
    bounds: Area,
    /// Boxes round the drawn gauges.
    gauge_boxes: Vec<Area>,
    /// Each drawn gauge's grids: the page point beyond the tabs and the grid's direction.
    grid_tabs: Vec<Vec<([f32; 2], [f32; 2])>>,
    /// Labels that found no free place, named in a note under the drawing.
    missing: Vec<String>,
}

/// Draws one face; `with_key` adds the key to the drawings under it (the part's first).
fn draw_face(w: &mut Writer, setup: &FaceSetup, with_key: bool) {
    let (x_dims, on_x) = dims(setup, true);
    let (s_dims, on_s) = dims(setup, false);
    let s_tier = s_dims
        .iter()
        .map(|d| text_width(&d.text(w.units), LABEL, false))
        .fold(0.0f32, f32::max)
        + 12.0;
    let right_room = if s_dims.is_empty() {
        0.0
    } else {
        14.0 + s_tier * s_dims.len() as f32
    };
    let title = format!("{}: {}.", face_title(setup.face), setup.view_words());
    let title_h = wrap(&title, 9.0, true, w.column()).len() as f32 * line_pitch(9.0, true);
    let under = EDGE_ROWS * ROW + TIER * x_dims.len() as f32 + 44.0;
    let over = title_h + line_pitch(8.0, false) + EDGE_ROWS * ROW + 6.0;
    let body = w.body();
    let max_h = (body.y1 - body.y0 - over - under - 10.0).min(MAX_FACE_PT);
    let max_w = w.column() - right_room - 8.0;
    let (scale, x, s) = setup.fit(max_w, max_h, PAD_PT);
    let face_h = s.length_pt();
    // The drawing stays on one page with the lines under it (and the key with the first).
    let key_h = if with_key { labels::key_height(w) } else { 0.0 };
    let legend_h = labels::legend_height(w, setup, &on_x, &on_s);
    w.room(over + face_h + under + legend_h + key_h);
    let top = w.y;
    let after_title = w.wrapped(MARGIN, top, w.column(), 9.0, true, &title);
    let scale_line = format!(
        "Scale {} when printed at 100 % (no fit-to-page): measure the scale bar before marking \
         out. Dimensions in {} from the datum.",
        scale.label(),
        super::length_unit_name(w.units)
    );
    let after_scale = w.wrapped(MARGIN, after_title, w.column(), 8.0, false, &scale_line);
    let frame = Frame {
        x,
        s,
        left: MARGIN + 8.0,
        top: after_scale + EDGE_ROWS * ROW + 4.0,
    };
    let bottom = frame.top + face_h + under;
    let mut d = Drawing {
        setup,
        scale,
        bounds: Area::new(MARGIN, after_scale, w.right(), bottom),
        frame,
        x_dims,
        s_dims,
        s_tier,
        gauge_boxes: Vec::new(),
        grid_tabs: Vec::new(),
        missing: Vec::new(),
    };
    d.draw_face_outline(w);
    d.draw_gauges(w);
    d.draw_prep_areas(w);
    let datum_box = d.draw_datum(w);
    d.draw_x_dims(w, datum_box);
    d.draw_s_dims(w, datum_box);
    d.draw_scale_and_axes(w);
    d.label_grids(w);
    d.label_dims(w);
    d.label_gauges(w, datum_box);
    d.label_edges(w);
    w.y = bottom;
    d.legend(w, &on_x, &on_s);
    if with_key {
        labels::key(w);
    }
}

impl Drawing<'_> {
    /// Points per metre on the page.
    fn k(&self) -> f32 {
        self.scale.pt_per_m() as f32
    }

    /// Page centre of gauge `i`.
    fn centre(&self, i: usize) -> [f32; 2] {
        let p = self.setup.gauges[i].position;
        self.frame.page_near(p.x_m, p.s_m, (p.x_m, p.s_m))
    }

    fn datum_page(&self) -> [f32; 2] {
        let (x, s) = self.setup.datum;
        self.frame.page_near(x, s, (x, s))
    }

    fn draw_gauges(&mut self, w: &mut Writer) {
        for i in 0..self.setup.gauges.len() {
            let m = marks::gauge(w, &self.setup.gauges[i], self.centre(i), self.k());
            self.gauge_boxes.push(m.area);
            self.grid_tabs.push(m.tab_ends);
        }
    }

    /// The area to prepare round each gauge (its grid plus the margin all round, turned with
    /// the gauge) as a dashed grey rectangle, cut at the face's edges and breaks and where it
    /// would cross a gauge or a plate's hole.
    fn draw_prep_areas(&self, w: &mut Writer) {
        let avoid: Vec<Area> = self.gauge_boxes.iter().map(|b| b.grown(2.0)).collect();
        for i in 0..self.setup.gauges.len() {
            let Some(window) = self.window_of(i) else {
                continue;
            };
            let g = &self.setup.gauges[i];
            let (l, wd) = plan::prep_size_m(g);
            let (hl, hw) = (0.5 * l as f32 * self.k(), 0.5 * wd as f32 * self.k());
            let (sin, cos) = g.angle_rad.sin_cos();
            let (u, v) = ([cos as f32, -sin as f32], [-sin as f32, -cos as f32]);
            let c = self.centre(i);
            let at = |a: f32, b: f32| [c[0] + u[0] * a + v[0] * b, c[1] + u[1] * a + v[1] * b];
            let corners = [at(-hl, -hw), at(hl, -hw), at(hl, hw), at(-hl, hw)];
            for k in 0..4 {
                let Some((p, q)) = marks::clip_segment(corners[k], corners[(k + 1) % 4], &window)
                else {
                    continue;
                };
                for (a, b) in marks::outside_boxes(p, q, &avoid) {
                    for (a, b) in self.outside_hole(a, b) {
                        for (a, b) in self.on_imported_face(i, a, b) {
                            marks::dashed(w, a, b, 3.0, 130);
                        }
                    }
                }
            }
        }
    }

    /// The pieces of segment `a`–`b` outside a plate's hole (all of it when there is none).
    fn outside_hole(&self, a: [f32; 2], b: [f32; 2]) -> Vec<([f32; 2], [f32; 2])> {
        match self.hole_page() {
            Some((c, r)) => marks::outside_circle(a, b, c, r),
            None => vec![(a, b)],
        }
    }

    /// The pieces of segment `a`–`b` (in the window of gauge `i`) that lie on an imported face:
    /// a face need not fill its bounds, and nothing is prepared in a hole. All of it on the
    /// closed-form faces.
    fn on_imported_face(&self, i: usize, a: [f32; 2], b: [f32; 2]) -> Vec<([f32; 2], [f32; 2])> {
        let Some(surface) = &self.setup.surface else {
            return vec![(a, b)];
        };
        let g = &self.setup.gauges[i].position;
        let (c, k) = (self.centre(i), self.k());
        let on = |p: [f32; 2]| {
            let x = g.x_m + f64::from((p[0] - c[0]) / k);
            let s = g.s_m - f64::from((p[1] - c[1]) / k);
            surface
                .locate(&gw_mechanics::SurfacePoint::new(g.face, x, s))
                .is_ok()
        };
        // Steps of about half a point: a dash is 3 points long.
        let len = (b[0] - a[0]).hypot(b[1] - a[1]);
        let n = (len / 0.5).ceil().max(1.0) as usize;
        let at = |t: f32| [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
        let mut out = Vec::new();
        let mut start: Option<f32> = None;
        for j in 0..n {
            let (t0, t1) = (j as f32 / n as f32, (j + 1) as f32 / n as f32);
            match (on(at((t0 + t1) / 2.0)), start) {
                (true, None) => start = Some(t0),
                (false, Some(t)) => {
                    out.push((at(t), at(t0)));
                    start = None;
                }
                _ => {}
            }
        }
        if let Some(t) = start {
            out.push((at(t), b));
        }
        out
    }

    /// The page box of the part of the face (window and face bounds) holding gauge `i`.
    fn window_of(&self, i: usize) -> Option<Area> {
        let p = self.setup.gauges[i].position;
        let b = self.setup.bounds;
        let f = &self.frame;
        let xw =
            f.x.windows
                .iter()
                .find(|(a, z)| p.x_m >= a - 1e-9 && p.x_m <= z + 1e-9)?;
        let sw =
            f.s.windows
                .iter()
                .find(|(a, z)| p.s_m >= a - 1e-9 && p.s_m <= z + 1e-9)?;
        let (x0, x1) = (xw.0.max(b.x_m.0), xw.1.min(b.x_m.1));
        let (s0, s1) = (sw.0.max(b.s_m.0), sw.1.min(b.s_m.1));
        Some(Area::new(
            f.page_x(x0)?,
            f.page_y(s1)?,
            f.page_x(x1)?,
            f.page_y(s0)?,
        ))
    }

    fn draw_datum(&self, w: &mut Writer) -> Area {
        marks::datum_mark(w, self.datum_page(), 3.5)
    }
}

mod labels;
mod outline;

#[cfg(test)]
mod tests;
