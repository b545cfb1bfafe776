//! Writes laid-out pages to PDF with the embedded fonts.

use krilla::Document;
use krilla::color::luma;
use krilla::geom::{Path, PathBuilder, Point};
use krilla::num::NormalizedF32;
use krilla::page::PageSettings;
use krilla::paint::{Fill, FillRule, Stroke};
use krilla::surface::Surface;
use krilla::text::{Font, TextDirection};

use super::layout::{Op, font_data};
use super::writer::Writer;

/// The characters of the sheet's text that its fonts cannot print, each with the first text
/// it occurs in: a name in a script the embedded fonts do not cover would print as empty boxes.
fn unprintable(w: &Writer) -> Vec<(char, String)> {
    use skrifa::MetadataProvider;
    let maps = [false, true].map(|bold| skrifa::FontRef::new(font_data(bold)).ok());
    let mut out: Vec<(char, String)> = Vec::new();
    for op in w.pages.iter().flatten() {
        let Op::Text { bold, text, .. } = op else {
            continue;
        };
        let Some(font) = &maps[usize::from(*bold)] else {
            continue;
        };
        let charmap = font.charmap();
        for c in text.chars() {
            if !c.is_whitespace() && charmap.map(c).is_none() && out.iter().all(|(d, _)| *d != c) {
                out.push((c, text.clone()));
            }
        }
    }
    out
}

fn grey_fill(g: u8) -> Fill {
    Fill {
        paint: luma::Color::new(g).into(),
        opacity: NormalizedF32::ONE,
        rule: Default::default(),
    }
}

fn stroke(width: f32, grey: u8) -> Stroke {
    Stroke {
        paint: luma::Color::new(grey).into(),
        width,
        ..Stroke::default()
    }
}

fn draw(surface: &mut Surface, path: Option<Path>, fill: Option<u8>, line: Option<(f32, u8)>) {
    if let Some(path) = path {
        surface.set_fill(fill.map(grey_fill));
        surface.set_stroke(line.filter(|(w, _)| *w > 0.0).map(|(w, g)| stroke(w, g)));
        surface.draw_path(&path);
    }
}

/// Draws one operation; texts only when `with_text`.
fn draw_op(surface: &mut Surface, fonts: &[Font; 2], op: &Op, with_text: bool) {
    match op {
        Op::Text {
            x,
            y,
            size,
            bold,
            text,
        } => {
            if with_text {
                surface.set_fill(Some(grey_fill(0)));
                surface.set_stroke(None);
                let font = fonts[usize::from(*bold)].clone();
                let at = Point::from_xy(*x, *y);
                surface.draw_text(at, font, *size, text, false, TextDirection::Auto);
            }
        }
        Op::Line {
            x1,
            y1,
            x2,
            y2,
            width,
            grey,
        } => {
            let mut pb = PathBuilder::new();
            pb.move_to(*x1, *y1);
            pb.line_to(*x2, *y2);
            draw(surface, pb.finish(), None, Some((*width, *grey)));
        }
        Op::Rect {
            x,
            y,
            w,
            h,
            fill,
            stroke,
        } => {
            let mut pb = PathBuilder::new();
            if let Some(r) = krilla::geom::Rect::from_xywh(*x, *y, *w, *h) {
                pb.push_rect(r);
            }
            draw(surface, pb.finish(), *fill, Some((*stroke, 0)));
        }
        Op::Path {
            points,
            closed,
            width,
            grey,
            fill,
        } => {
            let mut pb = PathBuilder::new();
            for (i, p) in points.iter().enumerate() {
                if i == 0 {
                    pb.move_to(p[0], p[1]);
                } else {
                    pb.line_to(p[0], p[1]);
                }
            }
            if *closed {
                pb.close();
            }
            draw(surface, pb.finish(), *fill, Some((*width, *grey)));
        }
        Op::Region { rings, fill } => {
            let mut pb = PathBuilder::new();
            for ring in rings.iter().filter(|r| r.len() > 2) {
                pb.move_to(ring[0][0], ring[0][1]);
                for p in &ring[1..] {
                    pb.line_to(p[0], p[1]);
                }
                pb.close();
            }
            if let Some(path) = pb.finish() {
                surface.set_fill(Some(Fill {
                    rule: FillRule::EvenOdd,
                    ..grey_fill(*fill)
                }));
                surface.set_stroke(None);
                surface.draw_path(&path);
            }
        }
    }
}

/// The pages as PDF bytes; without text when `with_text` is false.
pub(crate) fn render(w: &Writer, with_text: bool) -> Result<Vec<u8>, String> {
    let missing = unprintable(w);
    if !missing.is_empty() {
        let chars: String = missing.iter().map(|(c, _)| *c).collect();
        let shown: String = missing[0].1.chars().take(60).collect();
        return Err(format!(
            "the build sheet's fonts cannot print {chars} (first in \"{shown}\"); the sheet prints \
             Latin, Greek and Cyrillic letters: spell names in those, or the sheet would show \
             empty boxes where they stand"
        ));
    }
    let load = |bold: bool| {
        Font::new(font_data(bold).to_vec().into(), 0).ok_or("the embedded font could not be read")
    };
    let fonts = [load(false)?, load(true)?];
    let mut doc = Document::new();
    for ops in &w.pages {
        let settings = PageSettings::from_wh(w.width, w.height).ok_or("bad page size")?;
        let mut page = doc.start_page_with(settings);
        let mut surface = page.surface();
        for op in ops {
            draw_op(&mut surface, &fonts, op, with_text);
        }
        surface.finish();
        page.finish();
    }
    doc.finish()
        .map_err(|e| format!("could not write the PDF: {e:?}"))
}
