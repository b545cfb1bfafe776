//! Lays the build sheet's pages out top to bottom: paragraphs and table cells wrapped to
//! their measured width, a header on every page, and labels placed clear of what is drawn.

use super::layout::{
    Area, MARGIN, Op, ascent, descent, is_clear, line_pitch, text_area, text_width, wrap,
};
use crate::document::PaperSize;
use crate::units::Units;

/// Size of body text, points.
pub(crate) const BODY: f32 = 8.5;

/// The page header: the project's name and the details line(s), wrapped.
#[derive(Debug, Clone)]
pub(crate) struct Header {
    pub title: String,
    pub details: String,
}

/// Lays pages out top to bottom.
pub(crate) struct Writer {
    pub width: f32,
    pub height: f32,
    pub pages: Vec<Vec<Op>>,
    /// Top of the free space on the current page.
    pub y: f32,
    /// The unit system every number on the pages is shown in (SI unless set).
    pub units: Units,
    header: Header,
    header_height: f32,
}

impl Writer {
    pub fn new(paper: PaperSize, header: Header) -> Self {
        let (width, height) = match paper {
            PaperSize::A4 => (595.0, 842.0),
            PaperSize::Letter => (612.0, 792.0),
        };
        let mut w = Self {
            width,
            height,
            pages: vec![Vec::new()],
            y: MARGIN,
            units: Units::Si,
            header,
            header_height: 0.0,
        };
        w.header_height = w.header_ops(1, 1).1;
        w.y = MARGIN + w.header_height;
        w
    }

    /// Left edge of the text column.
    pub fn left(&self) -> f32 {
        MARGIN
    }

    /// Right edge of the text column.
    pub fn right(&self) -> f32 {
        self.width - MARGIN
    }

    /// Width of the text column.
    pub fn column(&self) -> f32 {
        self.width - 2.0 * MARGIN
    }

    /// Bottom of the usable page.
    pub fn bottom(&self) -> f32 {
        self.height - MARGIN
    }

    /// The usable area of a page below the header.
    pub fn body(&self) -> Area {
        Area::new(
            MARGIN,
            MARGIN + self.header_height,
            self.width - MARGIN,
            self.height - MARGIN,
        )
    }

    pub fn ops(&mut self) -> &mut Vec<Op> {
        if self.pages.is_empty() {
            self.pages.push(Vec::new());
        }
        let n = self.pages.len() - 1;
        &mut self.pages[n]
    }

    /// The operations of the current page so far.
    pub fn current(&self) -> &[Op] {
        self.pages.last().map(Vec::as_slice).unwrap_or(&[])
    }

    pub fn new_page(&mut self) {
        self.pages.push(Vec::new());
        self.y = MARGIN + self.header_height;
    }

    /// Starts a new page unless `h` points fit below the current position.
    pub fn room(&mut self, h: f32) {
        if self.y + h > self.bottom() && !self.current().is_empty() {
            self.new_page();
        }
    }

    /// Text with its baseline at `y`.
    pub fn text_at(&mut self, x: f32, y: f32, size: f32, bold: bool, text: impl Into<String>) {
        self.ops().push(Op::Text {
            x,
            y,
            size,
            bold,
            text: text.into(),
        });
    }

    /// Text whose box starts at `top`; returns its box.
    pub fn text_top(&mut self, x: f32, top: f32, size: f32, bold: bool, text: &str) -> Area {
        let y = top + ascent(size, bold);
        self.text_at(x, y, size, bold, text);
        text_area(x, y, size, bold, text)
    }

    /// Lines of `text` wrapped to `width` from `x`, the first box at `top`; returns the
    /// bottom of the last line.
    pub fn wrapped(
        &mut self,
        x: f32,
        top: f32,
        width: f32,
        size: f32,
        bold: bool,
        text: &str,
    ) -> f32 {
        let mut t = top;
        for line in wrap(text, size, bold, width) {
            self.text_top(x, t, size, bold, &line);
            t += line_pitch(size, bold);
        }
        t
    }

    /// A paragraph across the column, indented by `indent`.
    pub fn para_indented(&mut self, indent: f32, size: f32, bold: bool, text: &str) {
        let width = self.column() - indent;
        let lines = wrap(text, size, bold, width);
        let pitch = line_pitch(size, bold);
        // A short paragraph stays on one page.
        if lines.len() <= 8 {
            self.room(lines.len() as f32 * pitch);
        }
        for line in lines {
            self.room(pitch);
            let top = self.y;
            self.text_top(MARGIN + indent, top, size, bold, &line);
            self.y += pitch;
        }
        self.y += 0.25 * size;
    }

    /// Height a paragraph across the column takes.
    pub fn para_height(&self, size: f32, bold: bool, text: &str) -> f32 {
        wrap(text, size, bold, self.column()).len() as f32 * line_pitch(size, bold) + 0.25 * size
    }

    /// Height a table across the column takes (see [`Writer::table`]).
    pub fn table_height(&self, widths: &[f32], rows: &[Vec<String>], size: f32) -> f32 {
        let xs = self.columns(widths);
        rows.iter()
            .enumerate()
            .map(|(i, row)| row_height(&xs, row, size, i == 0) + if i == 0 { 2.5 } else { 0.0 })
            .sum::<f32>()
            + 4.0
    }

    /// Left edge and width of each column of a table with `widths` shares of the column.
    fn columns(&self, widths: &[f32]) -> Vec<(f32, f32)> {
        let total: f32 = widths.iter().sum::<f32>().max(1e-6);
        let gap = 4.0;
        let col = self.column();
        let mut xs = Vec::with_capacity(widths.len());
        let mut x = MARGIN;
        for w in widths {
            xs.push((x, w / total * col - gap));
            x += w / total * col;
        }
        xs
    }

    pub fn para(&mut self, size: f32, bold: bool, text: &str) {
        self.para_indented(0.0, size, bold, text);
    }

    pub fn heading(&mut self, text: &str) {
        self.room(60.0);
        self.y += 6.0;
        let top = self.y;
        self.y = self.wrapped(MARGIN, top, self.column(), 12.0, true, text) + 3.0;
    }

    pub fn subheading(&mut self, text: &str) {
        self.room(40.0);
        self.y += 3.0;
        let top = self.y;
        self.y = self.wrapped(MARGIN, top, self.column(), 9.5, true, text) + 2.0;
    }

    pub fn line(&mut self, a: [f32; 2], b: [f32; 2], width: f32, grey: u8) {
        self.ops().push(Op::Line {
            x1: a[0],
            y1: a[1],
            x2: b[0],
            y2: b[1],
            width,
            grey,
        });
    }

    pub fn rect(&mut self, area: Area, fill: Option<u8>, stroke: f32) {
        self.ops().push(Op::Rect {
            x: area.x0,
            y: area.y0,
            w: area.x1 - area.x0,
            h: area.y1 - area.y0,
            fill,
            stroke,
        });
    }

    pub fn path(&mut self, points: Vec<[f32; 2]>, closed: bool, width: f32, fill: Option<u8>) {
        self.ops().push(Op::Path {
            points,
            closed,
            width,
            grey: 0,
            fill,
        });
    }

    /// An area bounded by closed rings, filled in `fill` by the even–odd rule.
    pub fn region(&mut self, rings: Vec<Vec<[f32; 2]>>, fill: u8) {
        self.ops().push(Op::Region { rings, fill });
    }

    /// A table across the column. `widths` are the columns' shares of the column width; the
    /// first row is the heading, in bold, with a rule under it. Cells wrap within their
    /// column; a row moves to the next page whole, and the heading is repeated there.
    pub fn table(&mut self, widths: &[f32], rows: &[Vec<String>]) {
        self.table_sized(widths, rows, BODY);
    }

    pub fn table_sized(&mut self, widths: &[f32], rows: &[Vec<String>], size: f32) {
        let xs = self.columns(widths);
        let Some((head, body)) = rows.split_first() else {
            return;
        };
        self.table_row(&xs, head, size, true);
        for row in body {
            let h = row_height(&xs, row, size, false);
            if self.y + h > self.bottom() {
                self.new_page();
                self.table_row(&xs, head, size, true);
            }
            self.table_row(&xs, row, size, false);
        }
        self.y += 4.0;
    }

    fn table_row(&mut self, xs: &[(f32, f32)], row: &[String], size: f32, head: bool) {
        let h = row_height(xs, row, size, head);
        self.room(h + if head { 30.0 } else { 0.0 });
        let top = self.y;
        for (c, cell) in row.iter().enumerate() {
            let Some(&(x, w)) = xs.get(c) else { continue };
            self.wrapped(x, top, w, size, head, cell);
        }
        self.y = top + h;
        if head {
            let y = self.y + 0.5;
            let (l, r) = (self.left(), self.right());
            self.line([l, y], [r, y], 0.5, 0);
            self.y += 2.0;
        }
    }

    /// A checklist line: a tick box, the step wrapped in the left part of the column, and
    /// the name of a record field with a rule to write on in the right part.
    pub fn checkbox_line(&mut self, text: &str, field: &str) {
        let field_x = self.right() - 190.0;
        let text_x = MARGIN + 15.0;
        let lines = wrap(text, 9.0, false, field_x - 10.0 - text_x);
        let pitch = line_pitch(9.0, false);
        self.room(lines.len() as f32 * pitch + 8.0);
        let top = self.y + 2.0;
        let box_top = top + ascent(9.0, false) - 8.5;
        self.rect(
            Area::new(MARGIN, box_top, MARGIN + 9.0, box_top + 9.0),
            None,
            0.8,
        );
        let bottom = self.wrapped(text_x, top, field_x - 10.0 - text_x, 9.0, false, text);
        if !field.is_empty() {
            let label = self.text_top(field_x, top, 8.0, false, field);
            let y = top + ascent(9.0, false) + descent(9.0, false) + 1.0;
            let r = self.right();
            self.line([label.x1 + 4.0, y], [r, y], 0.5, 0);
        }
        self.y = bottom + 6.0;
    }

    /// A label of `text` at the first candidate top-left corner where it lies inside `bounds`
    /// and clear of everything on the page by `gap`; returns its box, or `None` when no
    /// candidate is free (nothing is drawn then).
    pub fn place_label(
        &mut self,
        bounds: &Area,
        size: f32,
        bold: bool,
        text: &str,
        candidates: &[[f32; 2]],
        gap: f32,
    ) -> Option<Area> {
        let w = text_width(text, size, bold);
        let h = ascent(size, bold) + descent(size, bold);
        let spot = candidates.iter().find(|c| {
            let area = Area::new(c[0], c[1], c[0] + w, c[1] + h);
            is_clear(self.current(), bounds, &area, gap)
        })?;
        Some(self.text_top(spot[0], spot[1], size, bold, text))
    }

    /// The header's operations for page `page` of `total`, and its height.
    fn header_ops(&self, page: usize, total: usize) -> (Vec<Op>, f32) {
        let mut ops = Vec::new();
        let mut push = |x: f32, top: f32, size: f32, bold: bool, text: &str| {
            ops.push(Op::Text {
                x,
                y: top + ascent(size, bold),
                size,
                bold,
                text: text.to_owned(),
            });
        };
        let numbering = format!("page {page} of {total}");
        let nw = text_width(&numbering, 9.0, false);
        push(self.right() - nw, MARGIN, 9.0, false, &numbering);
        let title_width = self.column() - nw - 12.0;
        let mut top = MARGIN;
        for line in wrap(&self.header.title, 12.0, true, title_width) {
            push(MARGIN, top, 12.0, true, &line);
            top += line_pitch(12.0, true);
        }
        for line in wrap(&self.header.details, BODY, false, self.column()) {
            push(MARGIN, top, BODY, false, &line);
            top += line_pitch(BODY, false);
        }
        top += 2.0;
        ops.push(Op::Line {
            x1: MARGIN,
            y1: top,
            x2: self.right(),
            y2: top,
            width: 0.8,
            grey: 0,
        });
        (ops, top + 10.0 - MARGIN)
    }

    /// Adds the header to every page; call once, when the pages are complete.
    pub fn finish(&mut self) {
        self.pages.retain(|p| !p.is_empty());
        let total = self.pages.len();
        for i in 0..total {
            let (ops, _) = self.header_ops(i + 1, total);
            self.pages[i].splice(0..0, ops);
        }
    }
}

/// Height of a table row whose cells wrap within their columns.
fn row_height(xs: &[(f32, f32)], row: &[String], size: f32, bold: bool) -> f32 {
    row.iter()
        .zip(xs)
        .map(|(cell, (_, w))| wrap(cell, size, bold, *w).len())
        .max()
        .unwrap_or(1) as f32
        * line_pitch(size, bold)
        + 1.5
}
