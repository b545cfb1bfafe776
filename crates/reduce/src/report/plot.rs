//! A small x–y plot drawn with the page's lines and paths: a framed area with ticks, tick
//! labels and axis titles carrying units, series told apart in black and white (a solid line,
//! open circles, filled triangles, large rings), and the legend in a row under the plot where
//! it cannot cover data.

use gw_plan::sheet::report_page::{PageBox, ReportWriter};

use super::numbers::fixed;

/// Size of tick labels and legend text, points.
const SMALL: f32 = 6.5;
/// Size of the plot's title, points.
const TITLE: f32 = 7.5;
/// Half-size of a marker, points.
const MARK: f32 = 1.8;

/// How a series is drawn.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) enum Style {
    /// A solid line through the points.
    Line,
    /// An open circle at each point.
    Circles,
    /// A small filled upward triangle at each point.
    Triangles,
    /// A large open circle at each point: it rings a small marker at the same place.
    Rings,
}

/// One series of a plot (values already in the axes' display units).
pub(super) struct Series {
    pub name: String,
    pub x: Vec<f64>,
    pub y: Vec<f64>,
    pub style: Style,
}

/// A plot: title, axis titles with units, and its series.
pub(super) struct Plot {
    pub title: String,
    pub x_title: String,
    pub y_title: String,
    pub series: Vec<Series>,
}

/// Ticks at 1, 2 or 5 × 10ⁿ covering `lo..hi`: the tick values and decimals for their labels.
fn ticks(lo: f64, hi: f64) -> (Vec<f64>, usize) {
    let (lo, hi) = if (hi - lo).abs() < 1e-12 * lo.abs().max(1e-300) || hi <= lo {
        let pad = if lo.abs() > 0.0 { lo.abs() * 0.1 } else { 1.0 };
        (lo - pad, hi + pad)
    } else {
        (lo, hi)
    };
    let raw = (hi - lo) / 5.0;
    let mag = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 5.0, 10.0]
        .iter()
        .map(|m| m * mag)
        .find(|s| *s >= raw)
        .unwrap_or(10.0 * mag);
    // Data a hair past a round value does not cost a whole step of empty plot: the frame
    // reaches to the data there instead (see `draw`).
    let first = (lo / step + 0.03).floor() as i64;
    let last = (hi / step - 0.03).ceil() as i64;
    let values = (first..=last).map(|k| k as f64 * step).collect();
    let decimals = (-step.log10().floor()).max(0.0) as usize;
    (values, decimals)
}

/// The finite range of `values`, or `None` when there are none.
fn range<'a>(values: impl Iterator<Item = &'a f64>) -> Option<(f64, f64)> {
    values
        .filter(|v| v.is_finite())
        .fold(None, |r, &v| match r {
            None => Some((v, v)),
            Some((a, b)) => Some((a.min(v), b.max(v))),
        })
}

/// A range widened by 3 % on each side, so that a marker at its end stays clear of the frame.
fn padded(lo: f64, hi: f64) -> (f64, f64) {
    let pad = 0.03 * (hi - lo);
    (lo - pad, hi + pad)
}

/// The page position of data within the frame.
struct Frame {
    area: PageBox,
    x: (f64, f64),
    y: (f64, f64),
}

impl Frame {
    fn at(&self, x: f64, y: f64) -> [f32; 2] {
        let fx = (x - self.x.0) / (self.x.1 - self.x.0);
        let fy = (y - self.y.0) / (self.y.1 - self.y.0);
        [
            self.area.x0 + (fx as f32) * (self.area.x1 - self.area.x0),
            self.area.y1 - (fy as f32) * (self.area.y1 - self.area.y0),
        ]
    }
}

/// Draws `plot` in the box `bounds` (title on top, legend at the bottom).
pub(super) fn draw(w: &mut ReportWriter, plot: &Plot, bounds: PageBox) {
    let pitch = ReportWriter::line_pitch(SMALL, false);
    let xr = range(plot.series.iter().flat_map(|s| &s.x)).unwrap_or((0.0, 1.0));
    let yr = range(plot.series.iter().flat_map(|s| &s.y)).unwrap_or((0.0, 1.0));
    let (xt, xd) = ticks(xr.0, xr.1);
    let (yt, yd) = ticks(yr.0.min(0.0), yr.1.max(0.0));
    let y_labels: Vec<String> = yt.iter().map(|v| fixed(*v, yd)).collect();
    let label_w = y_labels
        .iter()
        .map(|l| ReportWriter::text_width(l, SMALL, false))
        .fold(0.0f32, f32::max);
    let title_bottom = w.wrapped(
        bounds.x0,
        bounds.y0,
        bounds.x1 - bounds.x0,
        TITLE,
        true,
        &plot.title,
    );
    w.text_top(bounds.x0, title_bottom + 1.0, SMALL, false, &plot.y_title);
    // The last x tick label is centred on the frame's right edge: keep half of it inside.
    let last_x = xt.last().map_or(0.0, |v| {
        ReportWriter::text_width(&fixed(*v, xd), SMALL, false)
    });
    let area = PageBox::new(
        bounds.x0 + label_w + 6.0,
        title_bottom + 1.0 + pitch + 4.0,
        bounds.x1 - (0.5 * last_x + 1.0).max(4.0),
        bounds.y1 - 3.0 * pitch - 6.0,
    );
    let frame = Frame {
        area,
        x: padded(xt[0].min(xr.0), xt[xt.len() - 1].max(xr.1)),
        y: padded(yt[0].min(yr.0), yt[yt.len() - 1].max(yr.1)),
    };
    axes(w, &frame, (&xt, xd), (&yt, &y_labels));
    let x_title_top = area.y1 + 3.0 + pitch;
    let tw = ReportWriter::text_width(&plot.x_title, SMALL, false);
    let cx = 0.5 * (area.x0 + area.x1) - 0.5 * tw;
    w.text_top(cx.max(bounds.x0), x_title_top, SMALL, false, &plot.x_title);
    for s in &plot.series {
        series(w, &frame, s);
    }
    legend(w, plot, bounds.x0 + 4.0, x_title_top + pitch + 1.0);
}

/// The frame, light grid lines at the ticks, tick marks outside the frame and tick labels.
fn axes(w: &mut ReportWriter, f: &Frame, x: (&[f64], usize), y: (&[f64], &[String])) {
    let a = f.area;
    for v in y.0 {
        let p = f.at(f.x.0, *v);
        w.line([a.x0, p[1]], [a.x1, p[1]], 0.3, 200);
    }
    for v in x.0 {
        let p = f.at(*v, f.y.0);
        w.line([p[0], a.y0], [p[0], a.y1], 0.3, 200);
    }
    w.rect(a, None, 0.6);
    let asc = ReportWriter::ascent(SMALL, false);
    let desc = ReportWriter::descent(SMALL, false);
    for (v, label) in y.0.iter().zip(y.1) {
        let p = f.at(f.x.0, *v);
        w.line([a.x0 - 2.5, p[1]], [a.x0, p[1]], 0.6, 0);
        let lw = ReportWriter::text_width(label, SMALL, false);
        w.text_top(
            a.x0 - 4.0 - lw,
            p[1] - 0.5 * (asc + desc),
            SMALL,
            false,
            label,
        );
    }
    let mut last_right = f32::MIN;
    for v in x.0 {
        let p = f.at(*v, f.y.0);
        w.line([p[0], a.y1], [p[0], a.y1 + 2.5], 0.6, 0);
        let label = fixed(*v, x.1);
        let lw = ReportWriter::text_width(&label, SMALL, false);
        let left = p[0] - 0.5 * lw;
        // A label that would touch the one before is left out; its tick stays.
        if left > last_right + 3.0 {
            w.text_top(left, a.y1 + 3.0, SMALL, false, &label);
            last_right = left + lw;
        }
    }
}

/// One marker of `style` centred on `p`.
fn marker(w: &mut ReportWriter, style: Style, p: [f32; 2]) {
    let [x, y] = p;
    match style {
        Style::Line => {}
        Style::Circles => {
            let pts = (0..10)
                .map(|k| {
                    let t = k as f32 / 10.0 * std::f32::consts::TAU;
                    [x + MARK * t.cos(), y + MARK * t.sin()]
                })
                .collect();
            w.path(pts, true, 0.5, 0, None);
        }
        Style::Triangles => {
            let pts = vec![
                [x, y - 1.2 * MARK],
                [x + 1.1 * MARK, y + 0.8 * MARK],
                [x - 1.1 * MARK, y + 0.8 * MARK],
            ];
            w.path(pts, true, 0.3, 0, Some(0));
        }
        Style::Rings => {
            let pts = (0..14)
                .map(|k| {
                    let t = k as f32 / 14.0 * std::f32::consts::TAU;
                    [x + 2.0 * MARK * t.cos(), y + 2.0 * MARK * t.sin()]
                })
                .collect();
            w.path(pts, true, 0.6, 0, None);
        }
    }
}

/// A series: a line broken where a value is missing, or a marker at each point.
fn series(w: &mut ReportWriter, f: &Frame, s: &Series) {
    let points = s.x.iter().zip(&s.y);
    if s.style == Style::Line {
        let mut run: Vec<[f32; 2]> = Vec::new();
        for (x, y) in points {
            if x.is_finite() && y.is_finite() {
                run.push(f.at(*x, *y));
            } else if run.len() > 1 {
                w.path(std::mem::take(&mut run), false, 1.0, 0, None);
            } else {
                run.clear();
            }
        }
        if run.len() > 1 {
            w.path(run, false, 1.0, 0, None);
        }
        return;
    }
    for (x, y) in points.filter(|(x, y)| x.is_finite() && y.is_finite()) {
        marker(w, s.style, f.at(*x, *y));
    }
}

/// The legend: a sample of each series and its name, in a row from `x` at `top`.
fn legend(w: &mut ReportWriter, plot: &Plot, x: f32, top: f32) {
    let asc = ReportWriter::ascent(SMALL, false);
    let desc = ReportWriter::descent(SMALL, false);
    let mid = top + 0.5 * (asc + desc);
    let mut at = x;
    for s in &plot.series {
        if s.style == Style::Line {
            w.line([at, mid], [at + 14.0, mid], 1.0, 0);
            at += 17.0;
        } else {
            marker(w, s.style, [at + 4.0, mid]);
            at += 10.0;
        }
        let b = w.text_top(at, top, SMALL, false, &s.name);
        at = b.x1 + 10.0;
    }
}

/// At most `count` samples of `values`, evenly spaced.
pub(super) fn thin(values: &[f64], count: usize) -> Vec<f64> {
    let step = values.len().div_ceil(count.max(1)).max(1);
    values.iter().step_by(step).copied().collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ticks_cover_the_range_in_round_steps() {
        let (t, d) = ticks(-0.13, 1.07);
        assert_eq!(t.len(), 5, "{t:?}");
        assert!(
            (t[0] + 0.5).abs() < 1e-12 && (t[4] - 1.5).abs() < 1e-12,
            "{t:?}"
        );
        assert_eq!(d, 1);
        // Data a hair past 6 ends at 6, not a step later.
        let (t, d) = ticks(0.0, 6.01);
        assert!((t[t.len() - 1] - 6.0).abs() < 1e-12, "{t:?}");
        assert_eq!(d, 0);
        let (flat, _) = ticks(2.0, 2.0);
        assert!(flat.len() >= 2 && flat[0] < 2.0);
        assert_eq!(thin(&[0.0; 700], 70).len(), 70);
    }
}
