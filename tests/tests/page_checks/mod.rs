//! Page checks on a rendered PDF, independent of how the PDF was laid out: the word boxes that
//! poppler's `pdftotext -bbox-layout` reports, and grey renders from `pdftoppm -gray` (PGM).
//! Coordinates are PDF points with y down from the top of the page, as poppler reports them.

use std::fmt;

/// One word as poppler sees it: its box in points and the text of its line, for messages.
#[derive(Debug, Clone)]
pub struct WordBox {
    pub text: String,
    pub line: String,
    pub x0: f64,
    pub y0: f64,
    pub x1: f64,
    pub y1: f64,
}

impl WordBox {
    /// The box shrunk by `by` points on every side (empty boxes stay empty: x0 > x1).
    pub fn shrunk(&self, by: f64) -> [f64; 4] {
        [self.x0 + by, self.y0 + by, self.x1 - by, self.y1 - by]
    }
}

impl fmt::Display for WordBox {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let line: String = self.line.chars().take(60).collect();
        let more = if self.line.chars().count() > 60 {
            "…"
        } else {
            ""
        };
        write!(
            f,
            "{:?} at x {:.1}–{:.1}, y {:.1}–{:.1} pt (line {:?}{more})",
            self.text, self.x0, self.x1, self.y0, self.y1, line
        )
    }
}

/// One page: its size in points and its words.
#[derive(Debug, Clone)]
pub struct Page {
    pub width: f64,
    pub height: f64,
    pub words: Vec<WordBox>,
}

/// Reads `pdftotext -bbox-layout` output (XHTML): every `<page>` with its size and every
/// `<word>` with its box, grouped by `<line>` so each word knows the text around it.
pub fn parse_bbox_xhtml(xhtml: &str) -> Result<Vec<Page>, String> {
    let mut pages = Vec::new();
    for (i, chunk) in elements(xhtml, "page").into_iter().enumerate() {
        let i = i + 1;
        let head = tag_head(chunk);
        let width = attr(head, "width").map_err(|e| format!("page {i}: {e}"))?;
        let height = attr(head, "height").map_err(|e| format!("page {i}: {e}"))?;
        let body = chunk.split("</page>").next().unwrap_or(chunk);
        let mut words = Vec::new();
        for line in elements(body, "line") {
            words.extend(parse_line(line).map_err(|e| format!("page {i}: {e}"))?);
        }
        pages.push(Page {
            width,
            height,
            words,
        });
    }
    if pages.is_empty() {
        return Err("no <page> element in the pdftotext -bbox-layout output".into());
    }
    Ok(pages)
}

/// The text after each opening tag `<name` (followed by a space or `>`) in `xml`.
fn elements<'a>(xml: &'a str, name: &str) -> Vec<&'a str> {
    xml.split(&format!("<{name}"))
        .skip(1)
        .filter(|rest| rest.starts_with([' ', '>', '\n', '\t']))
        .collect()
}

/// The words of one `<line …>` element (the text after `<line`).
fn parse_line(line: &str) -> Result<Vec<WordBox>, String> {
    let line = line.split("</line>").next().unwrap_or(line);
    let mut words = Vec::new();
    for w in elements(line, "word") {
        let head = tag_head(w);
        let Some(rest) = w.get(head.len() + 1..) else {
            return Err(format!("unclosed <word> tag: {:?}", short(w)));
        };
        let Some(end) = rest.find("</word>") else {
            return Err(format!("<word> without </word>: {:?}", short(w)));
        };
        words.push(WordBox {
            text: unescape(&rest[..end]),
            line: String::new(),
            x0: attr(head, "xMin")?,
            y0: attr(head, "yMin")?,
            x1: attr(head, "xMax")?,
            y1: attr(head, "yMax")?,
        });
    }
    let text = words
        .iter()
        .map(|w| w.text.as_str())
        .collect::<Vec<_>>()
        .join(" ");
    for w in &mut words {
        w.line.clone_from(&text);
    }
    Ok(words)
}

/// The attributes of a tag: the text up to its closing `>`.
fn tag_head(after_name: &str) -> &str {
    after_name.split('>').next().unwrap_or(after_name)
}

fn short(s: &str) -> String {
    s.chars().take(80).collect()
}

/// A numeric attribute `name="…"` of a tag.
fn attr(head: &str, name: &str) -> Result<f64, String> {
    let key = format!(" {name}=\"");
    let padded = format!(" {head}");
    let Some(start) = padded.find(&key).map(|i| i + key.len()) else {
        return Err(format!("no {name} in <{}>", short(head)));
    };
    let value = padded[start..].split('"').next().unwrap_or("");
    match value.parse::<f64>() {
        Ok(v) if v.is_finite() => Ok(v),
        _ => Err(format!(
            "{name}=\"{value}\" is not a number in <{}>",
            short(head)
        )),
    }
}

/// XML character references and the five named entities.
fn unescape(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    let mut rest = s;
    while let Some(amp) = rest.find('&') {
        out.push_str(&rest[..amp]);
        let tail = &rest[amp..];
        let Some(semi) = tail.find(';') else {
            out.push_str(tail);
            return out;
        };
        let name = &tail[1..semi];
        let ch = match name {
            "amp" => Some('&'),
            "lt" => Some('<'),
            "gt" => Some('>'),
            "quot" => Some('"'),
            "apos" => Some('\''),
            _ => name
                .strip_prefix("#x")
                .and_then(|h| u32::from_str_radix(h, 16).ok())
                .or_else(|| name.strip_prefix('#').and_then(|d| d.parse().ok()))
                .and_then(char::from_u32),
        };
        match ch {
            Some(c) => out.push(c),
            None => out.push_str(&tail[..=semi]),
        }
        rest = &tail[semi + 1..];
    }
    out.push_str(rest);
    out
}

/// Every pair of words on a page whose boxes, each shrunk by `shrink` points, still overlap:
/// one line per pair, naming the page (1-based) and both words.
pub fn overlap_problems(pages: &[Page], shrink: f64) -> Vec<String> {
    let mut out = Vec::new();
    for (p, page) in pages.iter().enumerate() {
        let boxes: Vec<[f64; 4]> = page.words.iter().map(|w| w.shrunk(shrink)).collect();
        for i in 0..boxes.len() {
            for j in i + 1..boxes.len() {
                let (a, b) = (boxes[i], boxes[j]);
                let apart = a[2] <= b[0] || b[2] <= a[0] || a[3] <= b[1] || b[3] <= a[1];
                let empty = a[0] >= a[2] || a[1] >= a[3] || b[0] >= b[2] || b[1] >= b[3];
                if !apart && !empty {
                    out.push(format!(
                        "page {}: {} overlaps {}",
                        p + 1,
                        page.words[i],
                        page.words[j]
                    ));
                }
            }
        }
    }
    out
}

/// Every word whose box, shrunk by `shrink` points, runs past a margin of `margin` points from
/// the page's edges, with the side(s) and by how much (unshrunk).
pub fn margin_problems(pages: &[Page], margin: f64, shrink: f64) -> Vec<String> {
    let mut out = Vec::new();
    for (p, page) in pages.iter().enumerate() {
        for w in &page.words {
            let sides = [
                ("left", margin - w.x0),
                ("top", margin - w.y0),
                ("right", w.x1 - (page.width - margin)),
                ("bottom", w.y1 - (page.height - margin)),
            ];
            if sides.iter().all(|(_, by)| *by <= shrink) {
                continue;
            }
            let past: Vec<String> = sides
                .iter()
                .filter(|(_, by)| *by > 0.0)
                .map(|(side, by)| format!("{side} by {by:.2} pt"))
                .collect();
            if !past.is_empty() {
                out.push(format!(
                    "page {}: {w} runs past the {margin:.0} pt margin ({})",
                    p + 1,
                    past.join(", ")
                ));
            }
        }
    }
    out
}

/// A grey image, one byte per pixel, row by row (0 black, 255 white).
pub struct Grey {
    pub width: usize,
    pub height: usize,
    pub pixels: Vec<u8>,
}

impl Grey {
    /// A white image.
    pub fn white(width: usize, height: usize) -> Self {
        Self {
            width,
            height,
            pixels: vec![255; width * height],
        }
    }

    pub fn get(&self, x: usize, y: usize) -> u8 {
        self.pixels[y * self.width + x]
    }

    pub fn set(&mut self, x: usize, y: usize, v: u8) {
        self.pixels[y * self.width + x] = v;
    }
}

/// Reads a binary PGM (P5, 8-bit), as `pdftoppm -gray` writes it.
pub fn parse_pgm(bytes: &[u8]) -> Result<Grey, String> {
    // Header: magic, width, height, maxval as whitespace-separated tokens, then one
    // whitespace byte, then the pixels. pdftoppm writes no comments.
    let mut fields = Vec::new();
    let mut pos = 0;
    while fields.len() < 4 {
        while pos < bytes.len() && bytes[pos].is_ascii_whitespace() {
            pos += 1;
        }
        let start = pos;
        while pos < bytes.len() && !bytes[pos].is_ascii_whitespace() {
            pos += 1;
        }
        if start == pos {
            return Err("PGM header cut short".into());
        }
        fields.push(String::from_utf8_lossy(&bytes[start..pos]).into_owned());
    }
    if fields[0] != "P5" || fields[3] != "255" {
        return Err(format!("not an 8-bit binary PGM: header {fields:?}"));
    }
    let (Ok(width), Ok(height)) = (fields[1].parse::<usize>(), fields[2].parse::<usize>()) else {
        return Err(format!("PGM size is not a number: {fields:?}"));
    };
    let pixels = bytes.get(pos + 1..).unwrap_or(&[]).to_vec();
    if pixels.len() != width * height {
        return Err(format!(
            "PGM {width}×{height} holds {} bytes, not {}",
            pixels.len(),
            width * height
        ));
    }
    Ok(Grey {
        width,
        height,
        pixels,
    })
}

/// What lies under one word box in a render: how many pixels (centres inside the box) are
/// darker than the threshold, how many pixels were looked at, and the darkest value with
/// where it is (pixels).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Ink {
    pub dark: usize,
    pub looked_at: usize,
    pub darkest: u8,
    pub darkest_at: (usize, usize),
}

/// The pixels (of `n` in a row or column) whose centres lie between `lo` and `hi` points:
/// pixel i covers [i, i + 1) / px_per_pt points, its centre is at (i + 0.5) / px_per_pt.
/// Empty when none does.
fn pixel_span(lo: f64, hi: f64, px_per_pt: f64, n: usize) -> std::ops::Range<usize> {
    let first = ((lo * px_per_pt - 0.5).ceil().max(0.0) as usize).min(n);
    let end = ((hi * px_per_pt - 0.5).floor() + 1.0).clamp(0.0, n as f64) as usize;
    first..end.max(first)
}

/// The pixels of `img` whose centres lie inside `area` (points, [x0, y0, x1, y1]) at
/// `px_per_pt` pixels per point, measured against `dark_below`.
pub fn ink_under(img: &Grey, area: [f64; 4], px_per_pt: f64, dark_below: u8) -> Ink {
    let xs = pixel_span(area[0], area[2], px_per_pt, img.width);
    let ys = pixel_span(area[1], area[3], px_per_pt, img.height);
    let mut ink = Ink {
        dark: 0,
        looked_at: 0,
        darkest: 255,
        darkest_at: (0, 0),
    };
    for y in ys {
        for x in xs.clone() {
            let v = img.get(x, y);
            ink.looked_at += 1;
            if v < dark_below {
                ink.dark += 1;
            }
            if v < ink.darkest {
                ink.darkest = v;
                ink.darkest_at = (x, y);
            }
        }
    }
    ink
}

/// Ink that the text alone puts on a page (dark in the whole render, not dark in the
/// graphics-only render) but that lies outside every word box grown by some points: text
/// poppler did not report as a word, or word boxes that do not line up with the render.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct StrayInk {
    pub text_pixels: usize,
    pub stray_pixels: usize,
    pub first_stray_at: Option<(usize, usize)>,
}

/// Counts text ink outside the word boxes of `page`, each grown by `grow_pt` points.
pub fn stray_text_ink(
    page: &Page,
    full: &Grey,
    graphics: &Grey,
    px_per_pt: f64,
    grow_pt: f64,
    dark_below: u8,
) -> StrayInk {
    let (w, h) = (full.width, full.height);
    let mut covered = vec![false; w * h];
    for word in &page.words {
        let [x0, y0, x1, y1] = word.shrunk(-grow_pt);
        let xs = pixel_span(x0, x1, px_per_pt, w);
        for y in pixel_span(y0, y1, px_per_pt, h) {
            covered[y * w + xs.start..y * w + xs.end].fill(true);
        }
    }
    let mut out = StrayInk {
        text_pixels: 0,
        stray_pixels: 0,
        first_stray_at: None,
    };
    let same_size = full.width == graphics.width && full.height == graphics.height;
    for (i, (&ink, &covered)) in full.pixels.iter().zip(&covered).enumerate() {
        let in_graphics = same_size && graphics.pixels[i] < dark_below;
        if ink < dark_below && !in_graphics {
            out.text_pixels += 1;
            if !covered {
                out.stray_pixels += 1;
                out.first_stray_at.get_or_insert((i % w, i / w));
            }
        }
    }
    out
}
