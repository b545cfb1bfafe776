//! The part as a whole: views with its supports, loads and axes.
//!
//! Two or three orthographic views, each titled with the side it is seen from, drawn to one
//! scale of the standard series (the section of a slender member may be enlarged to a scale of
//! its own, stated beside it), with a scale bar. Lines come from the part's mesh
//! ([`PartMesh`]'s feature edges) and the silhouettes of its round surfaces; a depth buffer
//! dashes what lies behind the part. Loads come from the part's first load case
//! ([`load_glyphs`]), drawn as arrows of one length on the page with their values.

mod annotate;
mod geometry;
mod load_arrows;
mod symbols;

use gw_mechanics::{BeamSupport, LoadComponent, LoadVector, Member, VesselEnds};

use geometry::{Depth, Placed, V3, View, part_bounds, runs, silhouettes};
use symbols::{LABEL, axes, dashed, scale_bar};

use super::layout::{Area, ascent, descent, is_clear, line_pitch, text_width, wrap};
use super::writer::Writer;
use crate::document::Part;
use crate::drawing::load_glyphs::load_glyphs;
use crate::drawing::part_mesh::{PartMesh, Region};
use crate::units::Units;

/// Points per metre on paper at 1:1 (72 points to the inch of 25.4 mm).
const PT_PER_M: f64 = 72.0 / 0.0254;

/// Drawing scales (drawing size over true size): enlargements, full size and the usual
/// reductions (the 1, 2, 5 series with 2.5 and 25 beside it).
const SERIES: [f64; 14] = [
    5.0, 2.0, 1.0, 0.5, 0.4, 0.2, 0.1, 0.05, 0.04, 0.02, 0.01, 0.005, 0.002, 0.001,
];

/// Space round each view's drawing for arrows, supports and labels, points.
const PAD: f32 = 34.0;
/// Height of a view's title line, points.
const TITLE: f32 = 12.0;
/// Height the views may take together, points (under half an A4 page with the caption).
const MAX_HEIGHT: f32 = 300.0;
/// Height of the strip of scale bars under the views, points.
const STRIP: f32 = 24.0;

/// A scale as a ratio: "1:5", "2:1", "1:2.5".
fn ratio_text(r: f64) -> String {
    let plain = |v: f64| {
        let v = (v * 10.0).round() / 10.0;
        if v.fract() == 0.0 {
            format!("{v:.0}")
        } else {
            format!("{v:.1}")
        }
    };
    if r >= 1.0 {
        format!("{}:1", plain(r))
    } else {
        format!("1:{}", plain(1.0 / r))
    }
}

/// The views of a kind of part and their places in the grid (row, column).
fn arrangement(member: &Member) -> Vec<(View, usize, usize)> {
    match member {
        Member::Beam(_) | Member::Shaft(_) | Member::ThinCylinder(_) | Member::ThickCylinder(_) => {
            vec![
                (View::top("Top view (from above)"), 0, 0),
                (View::side("Side view (from the front)"), 1, 0),
                (View::end("End view (from x = L)"), 1, 1),
            ]
        }
        Member::ThinSphere(_) => vec![
            (View::side("Side view (from the front)"), 0, 0),
            (View::top("Top view (from above)"), 0, 1),
        ],
        Member::PlateWithHole(_) | Member::GivenState(_) => vec![
            (View::top("Plan view (from above)"), 0, 0),
            (View::side("Edge view (from the front)"), 1, 0),
        ],
        Member::ImportedField(_) => vec![(View::isometric("Isometric view"), 0, 0)],
    }
}

/// The scale of the views (ratio) and of the view along the axis, which is enlarged when
/// the main scale would leave the section small.
#[derive(Debug, Clone, Copy, PartialEq)]
struct Scales {
    main: f64,
    end: f64,
}

impl Scales {
    fn of(&self, v: &View) -> f64 {
        PT_PER_M * if v.along_axis { self.end } else { self.main }
    }
}

/// The grid's column widths and row heights at `scales`.
fn grid(cells: &[(View, usize, usize)], bounds: (V3, V3), scales: Scales) -> (Vec<f32>, Vec<f32>) {
    let cols = cells.iter().map(|c| c.2).max().unwrap_or(0) + 1;
    let rows = cells.iter().map(|c| c.1).max().unwrap_or(0) + 1;
    let (mut widths, mut heights) = (vec![0.0f32; cols], vec![0.0f32; rows]);
    for (v, r, c) in cells {
        let (lo, hi) = v.extent(bounds);
        let k = scales.of(v);
        widths[*c] = widths[*c].max(((hi[0] - lo[0]) * k) as f32 + 2.0 * PAD);
        heights[*r] = heights[*r].max(((hi[1] - lo[1]) * k) as f32 + 2.0 * PAD + TITLE);
    }
    (widths, heights)
}

/// The largest scale of the series at which the views fit `width` and the height allowed.
fn choose_scales(width: f32, cells: &[(View, usize, usize)], bounds: (V3, V3)) -> Scales {
    let section = (0..3)
        .filter(|&i| i != 0)
        .map(|i| bounds.1[i] - bounds.0[i])
        .fold(0.0, f64::max);
    let has_end = cells.iter().any(|c| c.0.along_axis);
    let fits = |s: Scales| {
        let (w, h) = grid(cells, bounds, s);
        w.iter().sum::<f32>() <= width && h.iter().sum::<f32>() <= MAX_HEIGHT
    };
    for &main in &SERIES {
        let mut s = Scales { main, end: main };
        if has_end && section * main * PT_PER_M < 50.0 {
            // The section enlarged to no more than 80 points across.
            if let Some(&end) = SERIES
                .iter()
                .find(|&&e| e >= main && section * e * PT_PER_M <= 80.0)
            {
                s.end = end;
            }
        }
        if fits(s) {
            return s;
        }
    }
    let last = SERIES[SERIES.len() - 1];
    Scales {
        main: last,
        end: last,
    }
}

/// How the part is held, in words.
fn held(member: &Member) -> &'static str {
    match member {
        Member::Beam(b) => match b.support {
            BeamSupport::Cantilever => "clamped at x = 0 (hatched wall), free at x = L",
            BeamSupport::SimplySupported => "on pins at x = 0 and x = L",
        },
        Member::Shaft(_) => "no support drawn: the loads at its two ends balance each other",
        Member::ThinCylinder(c) if c.ends == VesselEnds::Closed => {
            "closed ends, which carry the pressure's axial pull; no support drawn"
        }
        Member::ThickCylinder(c) if c.ends == VesselEnds::Closed => {
            "closed ends, which carry the pressure's axial pull; no support drawn"
        }
        Member::ThinCylinder(_) | Member::ThickCylinder(_) => {
            "open ends, which carry no axial load; no support drawn"
        }
        Member::ThinSphere(_) => "the whole shell is under pressure; no support drawn",
        Member::PlateWithHole(_) => {
            "the remote stress acts at the plate's edges, away from the hole; no clamp drawn"
        }
        Member::GivenState(_) => "a region of a larger part whose surface state is given",
        Member::ImportedField(_) => {
            "held and loaded as in the finite-element model the results come from"
        }
    }
}

/// The axes in words.
fn axes_words(member: &Member) -> &'static str {
    match member {
        Member::ThinSphere(_) => {
            "z up through the poles; on the surface x runs from the equator towards the top \
             pole and s round the equator"
        }
        Member::PlateWithHole(_) => {
            "x and y in the plate's plane from the hole's centre, z up out of the gauge face"
        }
        Member::GivenState(_) => {
            "x and y in the region's plane from its centre, z up out of the face"
        }
        Member::ImportedField(_) => {
            "X, Y, Z as in the finite-element model; on each face x follows the reference axis \
             projected onto the face, s at right angles to it"
        }
        Member::Beam(b) if b.section.radii_m().is_some() => {
            "x along the member from the x = 0 end, y towards the back, z up; s round the \
             section from the top line towards +y"
        }
        Member::Beam(_) => "x along the member from the x = 0 end, y towards the back, z up",
        _ => {
            "x along the member from the x = 0 end, y towards the back, z up; s round the \
             surface from the top line towards +y"
        }
    }
}

/// The caption over the views: scale, axes, supports, the loads drawn and the marks.
fn caption(part: &Part, scales: Scales, units: Units) -> String {
    let member = &part.member;
    let scale = if scales.end == scales.main {
        format!("Scale {} when printed at 100 %.", ratio_text(scales.main))
    } else {
        format!(
            "Scale {} when printed at 100 % (end view {}).",
            ratio_text(scales.main),
            ratio_text(scales.end)
        )
    };
    let loads = match part.load_cases.first() {
        Some(case) => {
            let list: Vec<String> = case
                .loads
                .iter()
                .filter(|(_, v)| *v != 0.0)
                .map(|(c, v)| {
                    let arrowless = matches!(
                        c,
                        LoadComponent::TemperatureChange | LoadComponent::GivenStateFactor
                    );
                    format!(
                        "{} {}{}",
                        c.name(),
                        super::load(units, *c, *v),
                        if arrowless { " (no arrow)" } else { "" }
                    )
                })
                .collect();
            format!("Loads of case \"{}\": {}.", case.name, list.join(", "))
        }
        None => "No load case: no loads drawn.".to_owned(),
    };
    let ticks = if arrangement(member).iter().any(|c| c.0.along_axis) {
        "; ticks round the end view show where round the section each gauge sits"
    } else {
        ""
    };
    format!(
        "{scale} Axes: {}. Held: {}. {loads} Gauges: a circled cross where seen, a dashed \
         circle where behind the part (a wider dashed ring round a seen mark it lies under)\
         {ticks}.",
        axes_words(member),
        held(member)
    )
}

/// The views' grid on the page: its top left corner, column widths and row heights.
struct Grid {
    left: f32,
    top: f32,
    widths: Vec<f32>,
    heights: Vec<f32>,
}

impl Grid {
    /// The cell at row `r`, column `c`.
    fn cell(&self, r: usize, c: usize) -> Area {
        let x0 = self.left + self.widths[..c].iter().sum::<f32>();
        let y0 = self.top + self.heights[..r].iter().sum::<f32>();
        Area::new(x0, y0, x0 + self.widths[c], y0 + self.heights[r])
    }

    /// Each view placed in its cell: centred below the cell's title line.
    fn place(
        &self,
        cells: &[(View, usize, usize)],
        bounds: (V3, V3),
        scales: Scales,
    ) -> Vec<Placed> {
        cells
            .iter()
            .map(|(v, r, c)| {
                let cell = self.cell(*r, *c);
                let (lo, hi) = v.extent(bounds);
                let k = scales.of(v);
                let (gw, gh) = (((hi[0] - lo[0]) * k) as f32, ((hi[1] - lo[1]) * k) as f32);
                let at = [
                    cell.x0 + (cell.x1 - cell.x0 - gw) / 2.0,
                    cell.y0 + TITLE + (cell.y1 - cell.y0 - TITLE - gh) / 2.0,
                ];
                Placed::new(v.clone(), k, at, bounds)
            })
            .collect()
    }
}

/// Draws the part in views that show where it is held and loaded, from `w.y` down.
pub(crate) fn draw(w: &mut Writer, part: &Part) {
    draw_recorded(w, part);
}

/// [`draw`], returning what it drew of the gauges and loads for the checks.
fn draw_recorded(w: &mut Writer, part: &Part) -> annotate::Record {
    let member = &part.member;
    let mesh = PartMesh::of(member);
    let bounds = part_bounds(&mesh);
    let sized = (0..3)
        .all(|i| bounds.0[i].is_finite() && bounds.1[i].is_finite() && bounds.1[i] > bounds.0[i]);
    if !sized {
        w.para(
            8.5,
            false,
            "The part views cannot be drawn: the part's size is not a positive finite number.",
        );
        return annotate::Record::default();
    }
    let cells = arrangement(member);
    let scales = choose_scales(w.column(), &cells, bounds);
    let text = caption(part, scales, w.units);
    let caption_h = wrap(&text, 8.0, false, w.column()).len() as f32 * line_pitch(8.0, false);
    let (widths, heights) = grid(&cells, bounds, scales);
    let grid_h: f32 = heights.iter().sum();
    w.room(40.0 + caption_h + grid_h + STRIP);
    w.subheading("Part views");
    w.para(8.0, false, &text);
    let g = Grid {
        left: w.left(),
        top: w.y,
        widths,
        heights,
    };
    let block = Area::new(w.left(), g.top, w.right(), g.top + grid_h + STRIP);
    let placed = g.place(&cells, bounds, scales);
    let with_depth: Vec<(Placed, Depth)> = placed
        .iter()
        .map(|v| {
            let d = Depth::of(&mesh, v);
            outlines(w, &mesh, member, v, &d);
            (v.clone(), d)
        })
        .collect();
    let mut labels = Vec::new();
    let mut record = annotate::Record::default();
    annotate::supports(w, member, &placed, &mut labels);
    // Gauges before loads: the arrows keep clear of the gauges' marks and ticks.
    annotate::gauges(
        w,
        member,
        &part.gauges,
        &with_depth,
        &mut record,
        &mut labels,
    );
    if let Some(case) = part.load_cases.first() {
        let glyphs = load_glyphs(member, &LoadVector::from_pairs(&case.loads));
        let (rec, lab) = (&mut record, &mut labels);
        load_arrows::draw(w, member, &with_depth, &glyphs, bounds, rec, lab);
    }
    annotate::faces(w, member, &placed, &mut labels);
    let mut missing = triads_and_titles(w, (&g, &block), &cells, &placed, scales);
    place_labels(w, &block, &placed, labels, &mut record, &mut missing);
    bars(w, scales, &cells, block.y1 - STRIP + 6.0);
    w.y = block.y1 + 2.0;
    if !missing.is_empty() {
        w.para(
            7.5,
            false,
            &format!("Not drawn for want of room: {}.", missing.join("; ")),
        );
    }
    record
}

/// Places the labels, the gauges' first (they matter most), recording where those went and
/// adding what found no room to `missing`.
fn place_labels(
    w: &mut Writer,
    block: &Area,
    placed: &[Placed],
    mut labels: Vec<annotate::Label>,
    record: &mut annotate::Record,
    missing: &mut Vec<String>,
) {
    labels.sort_by_key(|l| l.gauge.is_none());
    let parts: Vec<Area> = placed.iter().map(|p| p.drawing().grown(0.5)).collect();
    for l in &labels {
        match (annotate::place(w, block, &parts, l), l.gauge) {
            (Some(b), Some(i)) => record.gauge_labels.push((i, b)),
            (Some(_), None) => {}
            (None, _) => missing.push(l.text.clone()),
        }
    }
}

/// The axes of every view and the views' titles, before the labels so that these keep
/// clear of them; returns what found no room.
fn triads_and_titles(
    w: &mut Writer,
    (g, block): (&Grid, &Area),
    cells: &[(View, usize, usize)],
    placed: &[Placed],
    scales: Scales,
) -> Vec<String> {
    let mut missing = Vec::new();
    for ((_, r, c), p) in cells.iter().zip(placed) {
        // In the cell, or in the last column out to the right margin.
        let cell = g.cell(*r, *c);
        let wide = Area::new(cell.x0, cell.y0, block.x1, cell.y1);
        let last = *c + 1 == g.widths.len();
        let drawn = triad(w, p, &cell, false) || (last && triad(w, p, &wide, true));
        if !drawn {
            missing.push(format!("axes of the {}", p.view.title.to_lowercase()));
        }
    }
    for ((v, r, c), p) in cells.iter().zip(placed) {
        let cell = g.cell(*r, *c);
        let title = title_of(v, scales);
        let tw = text_width(&title, 8.0, true);
        let spots: Vec<[f32; 2]> = (0..40)
            .flat_map(|i| {
                let x = p.at[0].min(cell.x0 + 4.0) + 6.0 * i as f32;
                [[x, cell.y0], [x, cell.y0 + 6.0]]
            })
            .chain((0..40).map(|i| [cell.x1 - tw - 6.0 * i as f32, cell.y0]))
            .collect();
        if w.place_label(block, 8.0, true, &title, &spots, 1.0)
            .is_none()
        {
            missing.push(title);
        }
    }
    missing
}

/// A view's title, with its own scale when it differs from the rest.
fn title_of(v: &View, scales: Scales) -> String {
    if v.along_axis && scales.end != scales.main {
        format!("{}, {}", v.title, ratio_text(scales.end))
    } else {
        v.title.to_owned()
    }
}

/// The part's edges and silhouettes in one view: seen lines solid, hidden lines dashed.
fn outlines(w: &mut Writer, mesh: &PartMesh, member: &Member, v: &Placed, depth: &Depth) {
    let mut lines: Vec<(Vec<V3>, bool)> = mesh
        .edges
        .iter()
        .filter(|(r, _)| *r != Region::Fixture)
        .map(|(_, idx)| {
            (
                idx.iter().map(|&i| mesh.positions[i as usize]).collect(),
                false,
            )
        })
        .collect();
    lines.extend(silhouettes(member, &v.view));
    // Hidden lines first, so that a seen line over one stays whole.
    let all: Vec<_> = lines
        .iter()
        .flat_map(|(line, always)| runs(line, v, (!always).then_some(depth)))
        .collect();
    for run in all.iter().filter(|r| r.hidden) {
        dashed(w, &run.points, 0.45);
    }
    for run in all.into_iter().filter(|r| !r.hidden) {
        w.path(run.points, false, 0.9, None);
    }
}

/// The axes of a view in a free corner of its cell (or, `near_drawing`, at the free spot of
/// `cell` nearest the drawing): the two in the page's plane as arrows, the third as a circle;
/// z is named "up". False when no spot is free.
fn triad(w: &mut Writer, v: &Placed, cell: &Area, near_drawing: bool) -> bool {
    let names = ["x", "y", "z up"];
    let dirs: [([f32; 2], f64); 3] = std::array::from_fn(|i| {
        let mut e = [0.0; 3];
        e[i] = 1.0;
        (v.direction(e), geometry::dot(e, v.view.toward))
    });
    let right = (0..3).find(|&i| dirs[i].0[0] > 0.5).unwrap_or(0);
    let up = (0..3).find(|&i| dirs[i].0[1] < -0.5).unwrap_or(2);
    let third = 3 - right - up;
    let h = ascent(LABEL, false) + descent(LABEL, false);
    let (wr, wu, wt) = (
        text_width(names[right], LABEL, false),
        text_width(names[up], LABEL, false),
        text_width(names[third], LABEL, false),
    );
    let size = |o: [f32; 2]| {
        Area::new(
            o[0] - 5.0 - wt,
            o[1] - 14.0 - h - 1.0,
            o[0] + 15.0 + wr,
            o[1] + h / 2.0 + 1.0,
        )
    };
    let probe = size([0.0, 0.0]);
    let mut spots = Vec::new();
    let (free_w, free_h) = (
        cell.x1 - cell.x0 - probe.x1 + probe.x0 - 4.0,
        cell.y1 - cell.y0 - TITLE - probe.y1 + probe.y0 - 4.0,
    );
    for t in 0..=16 {
        let f = t as f32 / 16.0;
        let (left, right) = (cell.x0 + 2.0 - probe.x0, cell.x1 - 2.0 - probe.x1);
        let (upper, lower) = (cell.y0 + TITLE + 2.0 - probe.y0, cell.y1 - 2.0 - probe.y1);
        spots.push([left + f * free_w, lower]);
        spots.push([left + f * free_w, upper]);
        spots.push([left, lower - f * free_h]);
        spots.push([right, lower - f * free_h]);
    }
    if near_drawing {
        // Anywhere in the area, nearest the drawing's lower right corner first.
        let corner = [v.drawing().x1, v.drawing().y1];
        spots.clear();
        for i in 0..=((cell.x1 - cell.x0) / 6.0) as usize {
            for j in 0..=((cell.y1 - cell.y0) / 6.0) as usize {
                spots.push([cell.x0 + 6.0 * i as f32, cell.y0 + 6.0 * j as f32]);
            }
        }
        spots.sort_by(|a, b| geometry::dist2(*a, corner).total_cmp(&geometry::dist2(*b, corner)));
    }
    let Some(o) = spots
        .into_iter()
        .find(|o| is_clear(w.current(), cell, &size(*o), 1.0))
    else {
        return false;
    };
    axes(w, o, dirs);
    w.text_top(o[0] + 14.0, o[1] - h / 2.0, LABEL, false, names[right]);
    w.text_top(o[0] - wu / 2.0, o[1] - 14.0 - h, LABEL, false, names[up]);
    w.text_top(o[0] - 4.0 - wt, o[1] - h / 2.0, LABEL, false, names[third]);
    true
}

/// The scale bars under the views: the main one, and the end view's when it has its own.
fn bars(w: &mut Writer, scales: Scales, cells: &[(View, usize, usize)], top: f32) {
    let x = w.left() + 6.0;
    let caption = format!("scale {} when printed at 100 %", ratio_text(scales.main));
    let end = scale_bar(w, x, top, scales.main * PT_PER_M, &caption);
    if scales.end != scales.main && cells.iter().any(|c| c.0.along_axis) {
        let caption = format!("end view: scale {}", ratio_text(scales.end));
        scale_bar(w, end + 24.0, top, scales.end * PT_PER_M, &caption);
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::document::PaperSize;
    use crate::sheet::layout::{Op, problems};
    use crate::sheet::writer::Header;
    use geometry::dist2;

    fn header() -> Header {
        Header {
            title: "Part views".into(),
            details: "test".into(),
        }
    }

    /// The scale text of a bar ("scale 1:5 when printed at 100 %") as drawing over true size.
    fn stated_ratio(text: &str) -> Option<f64> {
        let rest = text.strip_prefix("scale ")?;
        let ratio = rest.strip_suffix(" when printed at 100 %")?;
        let (a, b) = ratio.split_once(':')?;
        Some(a.parse::<f64>().ok()? / b.parse::<f64>().ok()?)
    }

    /// The length the bar's blocks span, points: filled blocks 3.5 points high in one row
    /// starting at the bar's left end.
    fn bar_span(ops: &[Op], x0: f32, y: f32) -> f32 {
        let mut right = x0;
        loop {
            let next = ops.iter().find_map(|op| match op {
                Op::Rect {
                    x,
                    y: ry,
                    w,
                    h,
                    fill: Some(_),
                    ..
                } if (*x - right).abs() < 0.01
                    && (*ry - y).abs() < 0.01
                    && (*h - 3.5).abs() < 0.01 =>
                {
                    Some(x + w)
                }
                _ => None,
            });
            match next {
                Some(r) => right = r,
                None => return right - x0,
            }
        }
    }

    /// Checks the scale bar on a page: the stated scale turns the length printed at the bar's
    /// end into the bar's length on paper (72 points per inch of 25.4 mm).
    fn check_bar(ops: &[Op]) -> Result<(), String> {
        let texts: Vec<(f32, f32, &str)> = ops
            .iter()
            .filter_map(|op| match op {
                Op::Text { x, y, text, .. } => Some((*x, *y, text.as_str())),
                _ => None,
            })
            .collect();
        let (bx, by, ratio) = texts
            .iter()
            .find_map(|(x, y, t)| stated_ratio(t).map(|r| (*x, *y, r)))
            .ok_or("no scale text")?;
        // The bar ends left of its caption, on the same line; its blocks start at its left end.
        let start = ops
            .iter()
            .filter_map(|op| match op {
                Op::Rect {
                    x,
                    y,
                    h,
                    fill: Some(0),
                    ..
                } if (*h - 3.5).abs() < 0.01 && *x < bx && (y - by).abs() < 12.0 => Some((*x, *y)),
                _ => None,
            })
            .min_by(|a, b| a.0.total_cmp(&b.0))
            .ok_or("no scale bar")?;
        let span = bar_span(ops, start.0, start.1);
        let mm = texts
            .iter()
            .filter(|(x, y, _)| *x > start.0 && *x < bx && *y > start.1)
            .find_map(|(_, _, t)| t.strip_suffix(" mm")?.parse::<f64>().ok())
            .ok_or("no length under the bar")?;
        let expected = (mm / 25.4 * 72.0 * ratio) as f32;
        if (span - expected).abs() > 0.5 {
            return Err(format!(
                "bar of {span} pt for {mm} mm at {ratio}: expected {expected}"
            ));
        }
        Ok(())
    }

    fn draw_all(project: &crate::document::Project) {
        for part in &project.parts {
            let mut w = Writer::new(PaperSize::A4, header());
            draw(&mut w, part);
            for (i, page) in w.pages.iter().enumerate() {
                let p = problems(page, w.width, w.height);
                assert!(p.is_empty(), "{}, page {}: {p:#?}", part.name, i + 1);
            }
            let ops: Vec<Op> = w.pages.concat();
            let texts: Vec<&str> = ops
                .iter()
                .filter_map(|op| match op {
                    Op::Text { text, .. } => Some(text.as_str()),
                    _ => None,
                })
                .collect();
            assert!(
                !texts.iter().any(|t| t.starts_with("Not drawn")),
                "{}: {texts:?}",
                part.name
            );
            check_bar(&ops).unwrap_or_else(|e| panic!("{}: {e}", part.name));
            for g in &part.gauges {
                assert!(
                    texts
                        .iter()
                        .any(|t| t.split([' ', ',']).any(|word| word == g.id)),
                    "{}: gauge {} unnamed",
                    part.name,
                    g.id
                );
            }
            let views = arrangement(&part.member).len();
            assert_eq!(
                texts.iter().filter(|t| **t == "z up").count(),
                views,
                "{}",
                part.name
            );
            let height = w.y - 60.0;
            assert!(height < 0.55 * w.height, "{}: {height} pt", part.name);
        }
    }

    #[test]
    fn every_part_of_the_gallery_and_the_demo_is_drawn_clean_to_a_stated_scale() {
        draw_all(&crate::gallery::model_gallery());
        draw_all(&crate::demo::demo_project());
    }

    #[test]
    fn scales_come_from_the_series_and_read_as_ratios() {
        assert_eq!(ratio_text(0.2), "1:5");
        assert_eq!(ratio_text(0.4), "1:2.5");
        assert_eq!(ratio_text(2.0), "2:1");
        assert_eq!(ratio_text(1.0), "1:1");
        // A 0.4 m beam of 25 × 50 mm: at 1:2.5 (1134 pt/m) its top view alone is
        // 0.4 × 1134 + 2 × 34 = 522 pt wide, more than the 515 pt column; at 1:5 it is 295 pt,
        // and the section, 28 pt high at 1:5, is enlarged to 1:2 (71 pt).
        let cells = arrangement(&crate::gallery::model_gallery().parts[0].member);
        let s = choose_scales(
            515.0,
            &cells,
            ([0.0, -0.0125, -0.025], [0.4, 0.0125, 0.025]),
        );
        assert_eq!(s.main, 0.2);
        assert!(s.end > s.main, "the section is enlarged: {s:?}");
    }

    /// Loads drawn with their values: the gallery's cantilever shows its vertical force in
    /// kilonewtons, and a shaft's torque as a turning arrow named with its value.
    #[test]
    fn loads_and_supports_are_named_with_their_values() {
        use crate::units::Units::{Si, UsCustomary};
        // US customary figures worked by hand from NIST SP 811, Appendix B (1 lbf =
        // 4.448 221 615 260 5 N, 1 in = 25.4 mm, 1 psi = 6 894.757 Pa): 2500 N = 562.0 lbf;
        // 400 N·m = 400 / (4.448 221 6 × 0.0254) = 3540 lbf·in; 1.6 MPa = 232.1 psi;
        // 60 MPa = 8.702 ksi; 500 mm = 19.685 in.
        for (units, name, wanted) in [
            (
                Si,
                "Bracket arm (rectangle)",
                vec!["vertical force 2500 N", "clamped end at x = 0 mm"],
            ),
            (
                Si,
                "Spindle (shaft)",
                vec!["torque 400.0 N·m", "shaft end at x = 0 mm"],
            ),
            (
                Si,
                "Round link (solid round)",
                vec!["pinned end at x = 500.00 mm", "s = 0"],
            ),
            (
                Si,
                "Receiver (thin-walled cylinder)",
                vec!["internal pressure 1.600 MPa"],
            ),
            (
                Si,
                "Lug plate (plate with a hole)",
                vec!["remote stress along x 60.00 MPa", "plate face"],
            ),
            (
                UsCustomary,
                "Bracket arm (rectangle)",
                vec!["vertical force 562.0 lbf", "clamped end at x = 0 in"],
            ),
            (UsCustomary, "Spindle (shaft)", vec!["torque 3540 lbf·in"]),
            (
                UsCustomary,
                "Round link (solid round)",
                vec!["pinned end at x = 19.685 in"],
            ),
            (
                UsCustomary,
                "Receiver (thin-walled cylinder)",
                vec!["internal pressure 232.1 psi"],
            ),
            (
                UsCustomary,
                "Lug plate (plate with a hole)",
                vec!["remote stress along x 8.702 ksi"],
            ),
        ] {
            let gallery = crate::gallery::model_gallery();
            let part = gallery.parts.iter().find(|p| p.name == name).unwrap();
            let mut w = Writer::new(PaperSize::A4, header());
            w.units = units;
            draw(&mut w, part);
            let texts: Vec<String> = w
                .pages
                .concat()
                .into_iter()
                .filter_map(|op| match op {
                    Op::Text { text, .. } => Some(text),
                    _ => None,
                })
                .collect();
            for t in wanted {
                assert!(
                    texts.iter().any(|x| x == t),
                    "{name}: {t} missing from {texts:?}"
                );
            }
        }
    }

    /// Every part of the gallery and the demo, drawn, with what it recorded of its gauges.
    fn recorded() -> Vec<(String, annotate::Record, Vec<Op>)> {
        let mut out = Vec::new();
        for project in [crate::gallery::model_gallery(), crate::demo::demo_project()] {
            for part in &project.parts {
                let mut w = Writer::new(PaperSize::A4, header());
                let r = draw_recorded(&mut w, part);
                out.push((part.name.clone(), r, w.pages.concat()));
            }
        }
        out
    }

    /// Each gauge's label lies nearer its own mark (or tick) than any other gauge's in the
    /// same view, and every place of gauges is labelled.
    #[test]
    fn each_gauge_label_is_nearest_its_own_mark() {
        use annotate::to_box;
        for (name, r, ops) in recorded() {
            assert!(
                !r.marks.is_empty() || name.contains("patch"),
                "{name}: no marks"
            );
            for (i, (view, at, ids)) in r.marks.iter().enumerate() {
                let boxes: Vec<&Area> = r
                    .gauge_labels
                    .iter()
                    .filter(|(k, _)| *k == i)
                    .map(|(_, b)| b)
                    .collect();
                assert_eq!(
                    boxes.len(),
                    1,
                    "{name}: {ids:?} labelled {} times",
                    boxes.len()
                );
                let own = to_box(*at, boxes[0]);
                // Beyond a short gap, a leader runs from the mark to the label.
                let led = ops.iter().any(|op| match op {
                    Op::Line {
                        x1,
                        y1,
                        x2,
                        y2,
                        width,
                        ..
                    } if (*width - 0.4).abs() < 1e-3 => {
                        dist2([*x1, *y1], *at) < symbols::RING + 1.5
                            && to_box([*x2, *y2], boxes[0]) < 1.5
                    }
                    _ => false,
                });
                assert!(
                    own < 12.0 || led,
                    "{name}: {ids:?} {own:.1} pt away, no leader"
                );
                for (j, (other_view, other, other_ids)) in r.marks.iter().enumerate() {
                    if j == i || other_view != view {
                        continue;
                    }
                    assert!(
                        own < to_box(*other, boxes[0]),
                        "{name}: the label of {ids:?} ({own:.1} pt from its mark) lies \
                         nearer the mark of {other_ids:?}"
                    );
                }
            }
        }
    }

    /// The reaction arm's top view follows the surface conventions of `gw_mechanics::Face`:
    /// on the top face s runs towards +y, on the bottom face towards −y, and the top view has
    /// +y up the page. A1 (top, s = −7.5 mm) and A4 (bottom, s = +7.5 mm) are both on the
    /// front (−y) half, lower on the page than A3 and A2; the hidden A2 and A4 are drawn as
    /// dashed rings round the seen marks they lie under.
    #[test]
    fn the_arms_top_view_puts_each_gauge_on_its_own_side() {
        let all = recorded();
        let (_, r, ops) = all.iter().find(|(n, _, _)| n == "Reaction arm").unwrap();
        let place = |id: &str| {
            r.marks
                .iter()
                .find(|(v, _, ids)| *v == 0 && ids.iter().any(|i| i == id))
                .map(|m| m.1)
                .unwrap_or_else(|| panic!("{id} not marked in the top view"))
        };
        let (a1, a2, a3, a4) = (place("A1"), place("A2"), place("A3"), place("A4"));
        assert!(a1[1] > a3[1] + 3.0, "A1 {a1:?} below A3 {a3:?}");
        assert!(
            dist2(a1, a4) < 0.5 && dist2(a2, a3) < 0.5,
            "{a1:?} {a4:?} {a2:?} {a3:?}"
        );
        for hidden in [a2, a4] {
            let dashes = ops
                .iter()
                .filter(|op| match op {
                    Op::Line { x1, y1, x2, y2, .. } => [[*x1, *y1], [*x2, *y2]]
                        .iter()
                        .all(|p| (dist2(*p, hidden) - symbols::RING).abs() < 0.05),
                    _ => false,
                })
                .count();
            assert!(dashes >= 8, "dashed ring round {hidden:?}: {dashes} dashes");
        }
    }

    /// Shortest distance between the segments a–b and c–d, points (sampled finely).
    fn segment_gap(a: [f32; 2], b: [f32; 2], c: [f32; 2], d: [f32; 2]) -> f32 {
        let at =
            |p: [f32; 2], q: [f32; 2], t: f32| [p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])];
        let mut best = f32::MAX;
        for i in 0..=100 {
            for j in 0..=100 {
                let (p, q) = (at(a, b, i as f32 / 100.0), at(c, d, j as f32 / 100.0));
                best = best.min(dist2(p, q));
            }
        }
        best
    }

    /// No load arrow runs over a gauge tick, a gauge mark or a gauge's label.
    #[test]
    fn load_arrows_keep_clear_of_gauge_ticks_marks_and_labels() {
        for (name, r, _) in recorded() {
            for &(view, p, q) in &r.arrows {
                for &(tv, a, b) in &r.ticks {
                    let gap = segment_gap(p, q, a, b);
                    assert!(
                        tv != view || gap > 1.5,
                        "{name}: an arrow {gap:.1} pt from a tick"
                    );
                }
                for (i, b) in &r.gauge_labels {
                    let (mv, at, ids) = &r.marks[*i];
                    if *mv != view {
                        continue;
                    }
                    assert!(
                        !b.grown(1.0).crossed_by(p, q),
                        "{name}: an arrow crosses the label of {ids:?}"
                    );
                    let mark = Area::new(at[0] - 3.2, at[1] - 3.2, at[0] + 3.2, at[1] + 3.2);
                    assert!(
                        r.ticks.iter().any(|t| t.0 == view) || !mark.crossed_by(p, q),
                        "{name}: an arrow crosses the mark of {ids:?}"
                    );
                }
            }
        }
    }
}
