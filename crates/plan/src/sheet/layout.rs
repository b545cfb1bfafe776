//! Page layout of the build sheet: drawing operations with text measured in the embedded
//! fonts, so that every text's box is known before the page is written. Labels are placed
//! where they clear everything already on the page, and [`problems`] checks a finished page:
//! no two text boxes overlap, no drawn line crosses a text box, nothing runs past a margin.

use std::sync::OnceLock;

use skrifa::MetadataProvider;
use skrifa::instance::{LocationRef, Size};
use skrifa::raw::TableProvider;

/// Page margin on every side, points.
pub(crate) const MARGIN: f32 = 40.0;

/// A drawing operation on a page (points, y down from the top; text at its baseline).
#[derive(Debug, Clone)]
pub(crate) enum Op {
    Text {
        x: f32,
        y: f32,
        size: f32,
        bold: bool,
        text: String,
    },
    Line {
        x1: f32,
        y1: f32,
        x2: f32,
        y2: f32,
        width: f32,
        grey: u8,
    },
    Rect {
        x: f32,
        y: f32,
        w: f32,
        h: f32,
        fill: Option<u8>,
        stroke: f32,
    },
    /// A polyline or polygon (closed), optionally filled.
    Path {
        points: Vec<[f32; 2]>,
        closed: bool,
        width: f32,
        grey: u8,
        fill: Option<u8>,
    },
    /// An area bounded by closed rings, filled by the even–odd rule (a ring inside another is
    /// a hole), not outlined.
    Region { rings: Vec<Vec<[f32; 2]>>, fill: u8 },
}

/// An axis-aligned box, points (y down).
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Area {
    pub x0: f32,
    pub y0: f32,
    pub x1: f32,
    pub y1: f32,
}

impl Area {
    pub fn new(x0: f32, y0: f32, x1: f32, y1: f32) -> Self {
        Self {
            x0: x0.min(x1),
            y0: y0.min(y1),
            x1: x0.max(x1),
            y1: y0.max(y1),
        }
    }

    /// True when the interiors overlap (touching edges do not count).
    pub fn overlaps(&self, o: &Area) -> bool {
        self.x0 < o.x1 && o.x0 < self.x1 && self.y0 < o.y1 && o.y0 < self.y1
    }

    pub fn contains(&self, o: &Area) -> bool {
        o.x0 >= self.x0 - 0.01
            && o.x1 <= self.x1 + 0.01
            && o.y0 >= self.y0 - 0.01
            && o.y1 <= self.y1 + 0.01
    }

    /// The box grown by `by` on every side (shrunk when negative; a side shrunk past the
    /// middle collapses onto it).
    pub fn grown(&self, by: f32) -> Area {
        let (cx, cy) = ((self.x0 + self.x1) / 2.0, (self.y0 + self.y1) / 2.0);
        Area {
            x0: (self.x0 - by).min(cx),
            y0: (self.y0 - by).min(cy),
            x1: (self.x1 + by).max(cx),
            y1: (self.y1 + by).max(cy),
        }
    }

    /// True when the segment from `a` to `b` passes through the interior (Liang–Barsky
    /// clipping).
    pub fn crossed_by(&self, a: [f32; 2], b: [f32; 2]) -> bool {
        let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
        let mut t0 = 0.0f32;
        let mut t1 = 1.0f32;
        for (p, q) in [
            (-dx, a[0] - self.x0),
            (dx, self.x1 - a[0]),
            (-dy, a[1] - self.y0),
            (dy, self.y1 - a[1]),
        ] {
            if p == 0.0 {
                if q <= 0.0 {
                    return false;
                }
            } else {
                let r = q / p;
                if p < 0.0 {
                    t0 = t0.max(r);
                } else {
                    t1 = t1.min(r);
                }
            }
        }
        t1 - t0 > 1e-4
    }
}

/// Metrics of one embedded font, in ems.
struct FontMetrics {
    data: &'static [u8],
    ascent: f32,
    descent: f32,
}

/// The regular (index 0) and bold (index 1) fonts of the sheet.
fn fonts() -> &'static [FontMetrics; 2] {
    static FONTS: OnceLock<[FontMetrics; 2]> = OnceLock::new();
    FONTS.get_or_init(|| {
        [
            epaint_default_fonts::UBUNTU_LIGHT,
            epaint_default_fonts::HACK_REGULAR,
        ]
        .map(|data| {
            let (ascent, descent) = skrifa::FontRef::new(data)
                .ok()
                .map(|f| {
                    let m = f.metrics(Size::unscaled(), LocationRef::default());
                    let em = f32::from(m.units_per_em.max(1));
                    // The typographic ascender and descender, as the PDF's font descriptor
                    // states them.
                    match f.os2() {
                        Ok(os2) => (
                            f32::from(os2.s_typo_ascender()) / em,
                            -f32::from(os2.s_typo_descender()) / em,
                        ),
                        Err(_) => (m.ascent / em, -m.descent / em),
                    }
                })
                .unwrap_or((0.95, 0.25));
            FontMetrics {
                data,
                ascent,
                descent,
            }
        })
    })
}

/// The font data of the regular or bold face.
pub(crate) fn font_data(bold: bool) -> &'static [u8] {
    fonts()[usize::from(bold)].data
}

/// Height above the baseline of a line of text of `size`, points.
pub(crate) fn ascent(size: f32, bold: bool) -> f32 {
    fonts()[usize::from(bold)].ascent * size
}

/// Depth below the baseline of a line of text of `size`, points.
pub(crate) fn descent(size: f32, bold: bool) -> f32 {
    fonts()[usize::from(bold)].descent * size
}

/// Distance between baselines that keeps lines of `size` clear of each other, points.
pub(crate) fn line_pitch(size: f32, bold: bool) -> f32 {
    ascent(size, bold) + descent(size, bold) + 0.15 * size
}

/// Advance width of `text` at `size`, points.
pub(crate) fn text_width(text: &str, size: f32, bold: bool) -> f32 {
    let data = font_data(bold);
    let Ok(font) = skrifa::FontRef::new(data) else {
        return text.chars().count() as f32 * size * 0.6;
    };
    let em = f32::from(
        font.metrics(Size::unscaled(), LocationRef::default())
            .units_per_em
            .max(1),
    );
    let charmap = font.charmap();
    let glyphs = font.glyph_metrics(Size::unscaled(), LocationRef::default());
    text.chars()
        .map(|c| {
            charmap
                .map(c)
                .and_then(|g| glyphs.advance_width(g))
                .unwrap_or(em * 0.6)
        })
        .sum::<f32>()
        / em
        * size
}

/// The box a text occupies, from its baseline start.
pub(crate) fn text_area(x: f32, y: f32, size: f32, bold: bool, text: &str) -> Area {
    Area::new(
        x,
        y - ascent(size, bold),
        x + text_width(text, size, bold),
        y + descent(size, bold),
    )
}

/// Splits `text` into lines no wider than `width` at `size`; a word wider than the line is
/// broken between characters.
pub(crate) fn wrap(text: &str, size: f32, bold: bool, width: f32) -> Vec<String> {
    let mut lines = Vec::new();
    for paragraph in text.split('\n') {
        let mut line = String::new();
        // Words break at ordinary spaces only: a no-break space (U+00A0) holds a value to
        // its sign or a label to its blank.
        for word in paragraph.split([' ', '\t']).filter(|w| !w.is_empty()) {
            let candidate = if line.is_empty() {
                word.to_owned()
            } else {
                format!("{line} {word}")
            };
            if text_width(&candidate, size, bold) <= width {
                line = candidate;
                continue;
            }
            if !line.is_empty() {
                lines.push(std::mem::take(&mut line));
            }
            for c in word.chars() {
                line.push(c);
                if text_width(&line, size, bold) > width && line.chars().count() > 1 {
                    let last = line.pop().unwrap_or(' ');
                    lines.push(std::mem::take(&mut line));
                    line.push(last);
                }
            }
        }
        if !line.is_empty() || lines.is_empty() {
            lines.push(line);
        }
    }
    lines
}

/// The segments an operation draws (outlines only: fills do not cross text).
pub(crate) fn segments(op: &Op) -> Vec<([f32; 2], [f32; 2])> {
    match op {
        Op::Text { .. } => Vec::new(),
        Op::Line { x1, y1, x2, y2, .. } => vec![([*x1, *y1], [*x2, *y2])],
        Op::Rect {
            x, y, w, h, stroke, ..
        } => {
            if *stroke <= 0.0 {
                return Vec::new();
            }
            let c = [[*x, *y], [x + w, *y], [x + w, y + h], [*x, y + h]];
            (0..4).map(|k| (c[k], c[(k + 1) % 4])).collect()
        }
        Op::Region { .. } => Vec::new(),
        Op::Path {
            points,
            closed,
            width,
            ..
        } => {
            if *width <= 0.0 || points.len() < 2 {
                return Vec::new();
            }
            let mut s: Vec<_> = points.windows(2).map(|p| (p[0], p[1])).collect();
            if *closed {
                s.push((points[points.len() - 1], points[0]));
            }
            s
        }
    }
}

/// The area an operation covers on the page (its ink, ignoring line width).
pub(crate) fn op_area(op: &Op) -> Area {
    match op {
        Op::Text {
            x,
            y,
            size,
            bold,
            text,
        } => text_area(*x, *y, *size, *bold, text),
        Op::Line { x1, y1, x2, y2, .. } => Area::new(*x1, *y1, *x2, *y2),
        Op::Rect { x, y, w, h, .. } => Area::new(*x, *y, x + w, y + h),
        Op::Path { points, .. } => points_area(points.iter()),
        Op::Region { rings, .. } => points_area(rings.iter().flatten()),
    }
}

/// The box round some points.
fn points_area<'a>(points: impl Iterator<Item = &'a [f32; 2]>) -> Area {
    let empty = Area {
        x0: f32::MAX,
        y0: f32::MAX,
        x1: f32::MIN,
        y1: f32::MIN,
    };
    points.fold(empty, |a, p| Area {
        x0: a.x0.min(p[0]),
        y0: a.y0.min(p[1]),
        x1: a.x1.max(p[0]),
        y1: a.y1.max(p[1]),
    })
}

/// A text box shrunk a little for the checks: glyphs do not fill their boxes to the edge, and
/// a box that merely touches a rule under a heading is not a crossing.
fn checked_area(op: &Op) -> Option<(Area, &str)> {
    match op {
        Op::Text { text, .. } if !text.trim().is_empty() => Some((op_area(op).grown(-0.3), text)),
        _ => None,
    }
}

/// Everything wrong with the layout of one page of `width` × `height`: text boxes that
/// overlap, lines that cross text, and anything outside the margins. Empty when the page is
/// clean.
pub(crate) fn problems(ops: &[Op], width: f32, height: f32) -> Vec<String> {
    let inside = Area::new(MARGIN, MARGIN, width - MARGIN, height - MARGIN);
    let mut out = Vec::new();
    let texts: Vec<(Area, &str)> = ops.iter().filter_map(checked_area).collect();
    for op in ops {
        let a = op_area(op).grown(-0.3);
        if !inside.contains(&a) {
            out.push(format!("past the margin: {}", describe(op)));
        }
    }
    for (i, (a, ta)) in texts.iter().enumerate() {
        for (b, tb) in texts.iter().skip(i + 1) {
            if a.overlaps(b) {
                out.push(format!("text overlaps text: \"{ta}\" and \"{tb}\""));
            }
        }
    }
    for (i, op) in ops.iter().enumerate() {
        let filled = match op {
            Op::Rect { fill, .. } | Op::Path { fill, .. } => fill.is_some(),
            Op::Region { .. } => true,
            _ => false,
        };
        if filled {
            let cover = op_area(op);
            for earlier in &ops[..i] {
                if let Some((a, t)) = checked_area(earlier)
                    && a.overlaps(&cover)
                {
                    out.push(format!("a filled shape drawn after \"{t}\" hides it"));
                }
            }
        }
    }
    for op in ops {
        for (p, q) in segments(op) {
            for (a, t) in &texts {
                if a.crossed_by(p, q) {
                    out.push(format!(
                        "a line from ({:.0}, {:.0}) to ({:.0}, {:.0}) crosses \"{t}\"",
                        p[0], p[1], q[0], q[1]
                    ));
                }
            }
        }
    }
    out
}

fn describe(op: &Op) -> String {
    match op {
        Op::Text { text, .. } => format!("text \"{text}\""),
        other => {
            let a = op_area(other);
            format!(
                "a drawing from ({:.0}, {:.0}) to ({:.0}, {:.0})",
                a.x0, a.y0, a.x1, a.y1
            )
        }
    }
}

/// True when `area` lies inside `bounds` and clear of every text and every drawn segment of
/// `ops` (by `gap`).
pub(crate) fn is_clear(ops: &[Op], bounds: &Area, area: &Area, gap: f32) -> bool {
    if !bounds.contains(area) {
        return false;
    }
    let grown = area.grown(gap);
    ops.iter().all(|op| match op {
        Op::Text { .. } => !op_area(op).overlaps(&grown),
        _ => segments(op).iter().all(|(p, q)| !grown.crossed_by(*p, *q)),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_wider_text_measures_wider_and_bold_is_the_monospaced_face() {
        let narrow = text_width("iiii", 10.0, false);
        let wide = text_width("MMMM", 10.0, false);
        assert!(wide > 1.5 * narrow, "{narrow} {wide}");
        let a = text_width("iiii", 10.0, true);
        let b = text_width("MMMM", 10.0, true);
        assert!((a - b).abs() < 1e-3, "{a} {b}");
    }

    #[test]
    fn wrapped_lines_fit_and_keep_every_word() {
        let text = "Insulation resistance from grid to part at least the acceptance value \
                    stated, measured at no more than fifty volts";
        let lines = wrap(text, 9.0, false, 120.0);
        assert!(lines.len() > 2);
        for l in &lines {
            assert!(text_width(l, 9.0, false) <= 120.0, "{l}");
        }
        assert_eq!(lines.join(" "), text);
        let long = wrap("abcdefghijklmnopqrstuvwxyz", 9.0, false, 30.0);
        assert!(long.len() > 2);
        assert_eq!(long.concat(), "abcdefghijklmnopqrstuvwxyz");
    }

    #[test]
    fn the_check_finds_overlaps_crossings_and_margins() {
        let text = |x: f32, y: f32, t: &str| Op::Text {
            x,
            y,
            size: 9.0,
            bold: false,
            text: t.into(),
        };
        let clean = vec![text(100.0, 100.0, "first"), text(100.0, 120.0, "second")];
        assert!(problems(&clean, 595.0, 842.0).is_empty());
        let overlapping = vec![text(100.0, 100.0, "first"), text(110.0, 103.0, "second")];
        assert_eq!(problems(&overlapping, 595.0, 842.0).len(), 1);
        let crossed = vec![
            text(100.0, 100.0, "first"),
            Op::Line {
                x1: 90.0,
                y1: 97.0,
                x2: 200.0,
                y2: 97.0,
                width: 0.5,
                grey: 0,
            },
        ];
        assert_eq!(problems(&crossed, 595.0, 842.0).len(), 1);
        let outside = vec![text(30.0, 100.0, "first")];
        assert_eq!(problems(&outside, 595.0, 842.0).len(), 1);
        let fill = Op::Rect {
            x: 95.0,
            y: 85.0,
            w: 60.0,
            h: 20.0,
            fill: Some(235),
            stroke: 0.0,
        };
        let hidden = vec![text(100.0, 100.0, "first"), fill.clone()];
        assert_eq!(problems(&hidden, 595.0, 842.0).len(), 1);
        let under = vec![fill, text(100.0, 100.0, "first")];
        assert!(problems(&under, 595.0, 842.0).is_empty());
        let path = Op::Path {
            points: vec![[100.0, 200.0], [120.0, 210.0], [110.0, 230.0]],
            closed: true,
            width: 0.5,
            grey: 0,
            fill: Some(200),
        };
        let a = op_area(&path);
        assert_eq!((a.x0, a.y0, a.x1, a.y1), (100.0, 200.0, 120.0, 230.0));
        let beside = vec![text(100.0, 100.0, "first"), path];
        assert!(problems(&beside, 595.0, 842.0).is_empty());
        let on_margin = Op::Line {
            x1: MARGIN,
            y1: 100.0,
            x2: MARGIN,
            y2: 200.0,
            width: 0.5,
            grey: 0,
        };
        assert!(problems(&[on_margin], 595.0, 842.0).is_empty());
    }
}
