//! Pages in the build sheet's look for documents written beside it (the installation report):
//! the same header, fonts, paragraphs, tables and drawing primitives, the same layout check and
//! the same PDF output, behind a small public interface.

use super::layout::{self, Area, Op};
use super::pdf;
use super::writer::{BODY, Header, Writer};
use crate::document::PaperSize;

/// Size of body text on the sheet, points.
pub const BODY_SIZE: f32 = BODY;

/// A box on the page, points, y down from the top edge.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PageBox {
    /// Left edge.
    pub x0: f32,
    /// Top edge.
    pub y0: f32,
    /// Right edge.
    pub x1: f32,
    /// Bottom edge.
    pub y1: f32,
}

impl PageBox {
    /// The box between two corners, in any order.
    pub fn new(x0: f32, y0: f32, x1: f32, y1: f32) -> Self {
        let a = Area::new(x0, y0, x1, y1);
        Self::from(a)
    }
}

impl From<Area> for PageBox {
    fn from(a: Area) -> Self {
        Self {
            x0: a.x0,
            y0: a.y0,
            x1: a.x1,
            y1: a.y1,
        }
    }
}

impl From<PageBox> for Area {
    fn from(b: PageBox) -> Self {
        Area::new(b.x0, b.y0, b.x1, b.y1)
    }
}

/// Lays pages out top to bottom in the build sheet's look. Coordinates are points from the
/// top-left corner of the page; texts are placed by their baseline (`text_at`) or the top of
/// their box (`text_top`).
pub struct ReportWriter {
    w: Writer,
}

impl ReportWriter {
    /// A writer on `paper` whose pages carry `title` and the `details` line in their header.
    pub fn new(paper: PaperSize, title: &str, details: &str) -> Self {
        let header = Header {
            title: title.to_owned(),
            details: details.to_owned(),
        };
        Self {
            w: Writer::new(paper, header),
        }
    }

    /// Left edge of the text column.
    pub fn left(&self) -> f32 {
        self.w.left()
    }

    /// Right edge of the text column.
    pub fn right(&self) -> f32 {
        self.w.right()
    }

    /// Width of the text column.
    pub fn column(&self) -> f32 {
        self.w.column()
    }

    /// Bottom of the usable page.
    pub fn bottom(&self) -> f32 {
        self.w.bottom()
    }

    /// Top of the free space on the current page.
    pub fn y(&self) -> f32 {
        self.w.y
    }

    /// Moves the top of the free space (after drawing something by hand).
    pub fn set_y(&mut self, y: f32) {
        self.w.y = y;
    }

    /// Starts a new page.
    pub fn new_page(&mut self) {
        self.w.new_page();
    }

    /// Starts a new page unless `height` points fit below the current position.
    pub fn room(&mut self, height: f32) {
        self.w.room(height);
    }

    /// A section heading (starts a new page when little room is left).
    pub fn heading(&mut self, text: &str) {
        self.w.heading(text);
    }

    /// A sub-heading.
    pub fn subheading(&mut self, text: &str) {
        self.w.subheading(text);
    }

    /// A paragraph across the column.
    pub fn para(&mut self, size: f32, bold: bool, text: &str) {
        self.w.para(size, bold, text);
    }

    /// Height a paragraph across the column takes.
    pub fn para_height(&self, size: f32, bold: bool, text: &str) -> f32 {
        self.w.para_height(size, bold, text)
    }

    /// A table across the column at `size`: `widths` are the columns' shares, the first row
    /// is the heading (bold, ruled, repeated on a new page).
    pub fn table(&mut self, widths: &[f32], rows: &[Vec<String>], size: f32) {
        self.w.table_sized(widths, rows, size);
    }

    /// Height a table takes at body size.
    pub fn table_height(&self, widths: &[f32], rows: &[Vec<String>], size: f32) -> f32 {
        self.w.table_height(widths, rows, size)
    }

    /// Text with its baseline at `y`.
    pub fn text_at(&mut self, x: f32, y: f32, size: f32, bold: bool, text: &str) {
        self.w.text_at(x, y, size, bold, text);
    }

    /// Text whose box starts at `top`; returns its box.
    pub fn text_top(&mut self, x: f32, top: f32, size: f32, bold: bool, text: &str) -> PageBox {
        self.w.text_top(x, top, size, bold, text).into()
    }

    /// Text wrapped to `width` from `x`, the first line's box at `top`; returns the bottom of
    /// the last line.
    pub fn wrapped(
        &mut self,
        x: f32,
        top: f32,
        width: f32,
        size: f32,
        bold: bool,
        text: &str,
    ) -> f32 {
        self.w.wrapped(x, top, width, size, bold, text)
    }

    /// A straight line, `grey` from 0 (black) to 255 (white).
    pub fn line(&mut self, a: [f32; 2], b: [f32; 2], width: f32, grey: u8) {
        self.w.line(a, b, width, grey);
    }

    /// A polyline (a polygon when `closed`), stroked in `grey` and optionally filled.
    pub fn path(
        &mut self,
        points: Vec<[f32; 2]>,
        closed: bool,
        width: f32,
        grey: u8,
        fill: Option<u8>,
    ) {
        self.w.ops().push(Op::Path {
            points,
            closed,
            width,
            grey,
            fill,
        });
    }

    /// A rectangle, optionally filled, outlined when `stroke` is above zero.
    pub fn rect(&mut self, area: PageBox, fill: Option<u8>, stroke: f32) {
        self.w.rect(area.into(), fill, stroke);
    }

    /// True when `area` lies inside `bounds` and clear, by `gap`, of every text and drawn line
    /// on the current page.
    pub fn is_clear(&self, bounds: PageBox, area: PageBox, gap: f32) -> bool {
        layout::is_clear(self.w.current(), &bounds.into(), &area.into(), gap)
    }

    /// A label at the first of `candidates` (top-left corners) where it lies inside `bounds`
    /// and clear of everything by `gap`; its box, or `None` when no candidate is free.
    pub fn place_label(
        &mut self,
        bounds: PageBox,
        size: f32,
        bold: bool,
        text: &str,
        candidates: &[[f32; 2]],
        gap: f32,
    ) -> Option<PageBox> {
        self.w
            .place_label(&bounds.into(), size, bold, text, candidates, gap)
            .map(PageBox::from)
    }

    /// Advance width of `text` at `size`, points.
    pub fn text_width(text: &str, size: f32, bold: bool) -> f32 {
        layout::text_width(text, size, bold)
    }

    /// Height above the baseline of text of `size`, points.
    pub fn ascent(size: f32, bold: bool) -> f32 {
        layout::ascent(size, bold)
    }

    /// Depth below the baseline of text of `size`, points.
    pub fn descent(size: f32, bold: bool) -> f32 {
        layout::descent(size, bold)
    }

    /// Distance between baselines of lines of `size`, points.
    pub fn line_pitch(size: f32, bold: bool) -> f32 {
        layout::line_pitch(size, bold)
    }

    /// The pages complete, each with its header and page number.
    pub fn finish(mut self) -> ReportPages {
        self.w.finish();
        ReportPages { w: self.w }
    }

    /// The pages as PDF bytes.
    pub fn finish_pdf(self) -> Result<Vec<u8>, String> {
        self.finish().pdf()
    }
}

/// Finished pages: written to PDF, checked for layout problems, or read as text.
pub struct ReportPages {
    w: Writer,
}

impl ReportPages {
    /// Number of pages.
    pub fn page_count(&self) -> usize {
        self.w.pages.len()
    }

    /// The pages as PDF bytes with the embedded fonts.
    pub fn pdf(&self) -> Result<Vec<u8>, String> {
        pdf::render(&self.w, true)
    }

    /// Overlapping texts, lines through texts and anything past a margin, each with its page
    /// number; empty for clean pages.
    pub fn layout_problems(&self) -> Vec<String> {
        self.w
            .pages
            .iter()
            .enumerate()
            .flat_map(|(i, ops)| {
                layout::problems(ops, self.w.width, self.w.height)
                    .into_iter()
                    .map(move |p| format!("page {}: {p}", i + 1))
            })
            .collect()
    }

    /// Every text printed, one per line, page by page.
    pub fn text(&self) -> String {
        let mut out = String::new();
        for op in self.w.pages.iter().flatten() {
            if let Op::Text { text, .. } = op {
                out.push_str(text);
                out.push('\n');
            }
        }
        out
    }
}
