//! Every page of the build sheet checked from the outside, with poppler, the way a reader
//! sees it: no two words overlap, no word runs past the 40 pt margins (word boxes from
//! `pdftotext -bbox-layout`), and no drawn line or shape edge runs through a word (the sheet
//! rendered with and without its text by `pdftoppm -gray`: under each word the graphics-only
//! render must be blank or a light fill). Sheets checked: the demo, the model gallery, and the
//! gallery's parts one at a time (one sheet per model kind and beam section).
//!
//! The sheet's own layout check (`build_sheet_layout_problems`) measures text with the sheet's
//! font metrics; these checks use what poppler extracts and draws, an independent route.

mod page_checks;

use std::path::{Path, PathBuf};
use std::process::Command;
use std::sync::OnceLock;

use gw_plan::Project;
use gw_plan::demo::demo_project;
use gw_plan::evaluate::{EvalOptions, evaluate};
use gw_plan::gallery::model_gallery;
use gw_plan::sheet::{build_sheet_graphics_only_pdf_in, build_sheet_pdf_in};
use gw_plan::units::Units;
use gw_verify::require_tool;
use page_checks::{
    Grey, Ink, Page, StrayInk, ink_under, margin_problems, overlap_problems, parse_bbox_xhtml,
    parse_pgm, stray_text_ink,
};

/// Set this variable to keep each sheet's PDFs and page renders for a look (the folders are
/// printed; run with `--nocapture`).
const KEEP_VAR: &str = "GW_KEEP_SHEET_PAGES";
/// Page margin on every side, points (the sheet's stated margin).
const MARGIN_PT: f64 = 40.0;
/// Word boxes are shrunk by this much before the overlap and margin tests: poppler's boxes
/// and the sheet's own text measure differ by rounding, and neighbouring words on one line may
/// share an edge.
const ROUNDING_PT: f64 = 0.3;
/// Word boxes are shrunk by this much before looking under them, so anti-aliasing of a line
/// that only touches a box's edge does not count.
const PIXEL_SHRINK_PT: f64 = 0.5;
/// Render resolution, dots per inch (72 points per inch).
const DPI: f64 = 100.0;
/// A pixel darker than this (0 black, 255 white) is ink; light-grey fills behind text are
/// lighter.
const DARK_BELOW: u8 = 160;
/// In the whole-sheet render, at least this share of word boxes must hold ink, or the renders
/// are blank or the coordinates misaligned and the line check would prove nothing. (Measured:
/// every word box of the demo and gallery sheets holds ink; boxes shifted by 4 pt still keep
/// about 97 %, which is why the stray-ink check below is the sharper one.)
const MIN_INKED_SHARE: f64 = 0.97;
/// Text ink (dark in the whole render, not in the graphics-only one) must lie inside the word
/// boxes grown by this much; ink farther out means boxes that do not line up with the render.
const STRAY_GROW_PT: f64 = 1.0;
/// Stray text pixels allowed per page (glyph parts outside poppler's nominal box).
const MAX_STRAY_PIXELS: usize = 0;

/// One sheet as poppler sees it: word boxes per page, and what lies under each word in the
/// whole render and in the graphics-only render (filled in by the pixel checks).
struct Checked {
    name: String,
    pages: Vec<Page>,
    full_ink: Vec<Vec<Ink>>,
    graphics_ink: Vec<Vec<Ink>>,
    stray: Vec<StrayInk>,
}

/// The projects whose sheets are checked, each with a name for messages and its units (the
/// longer US customary numbers must fit as well).
fn projects() -> Vec<(String, Project, Units)> {
    let gallery = model_gallery();
    let mut out = vec![
        ("demo sheet".to_string(), demo_project(), Units::Si),
        ("gallery sheet".to_string(), gallery.clone(), Units::Si),
        (
            "demo sheet in US customary units".to_string(),
            demo_project(),
            Units::UsCustomary,
        ),
        (
            "gallery sheet in US customary units".to_string(),
            gallery.clone(),
            Units::UsCustomary,
        ),
    ];
    for part in &gallery.parts {
        let mut alone = gallery.clone();
        alone.parts = vec![part.clone()];
        out.push((
            format!("sheet of gallery part {:?} alone", part.name),
            alone,
            Units::Si,
        ));
    }
    out
}

fn tools_present() -> bool {
    // Both probes run so a CI machine without either fails on it by name.
    let text = require_tool("pdftotext", "-v", "poppler-utils");
    let render = require_tool("pdftoppm", "-v", "poppler-utils");
    text && render
}

/// Every sheet, built, extracted and rendered once for all tests of this file. Sheets are
/// worked on in parallel; each runs pdftotext once and pdftoppm twice (whole, graphics only).
fn checked_sheets() -> &'static [Checked] {
    static SHEETS: OnceLock<Vec<Checked>> = OnceLock::new();
    SHEETS.get_or_init(|| {
        let projects = projects();
        std::thread::scope(|s| {
            let handles: Vec<_> = projects
                .iter()
                .enumerate()
                .map(|(i, (name, p, units))| s.spawn(move || check_sheet(i, name, p, *units)))
                .collect();
            handles
                .into_iter()
                // A sheet that cannot be checked fails every test with its own message.
                .map(|h| h.join().unwrap_or_else(|e| std::panic::resume_unwind(e)))
                .collect()
        })
    })
}

fn work_dir(index: usize) -> PathBuf {
    let d = std::env::temp_dir().join(format!("gw-sheet-pages-{}-{index}", std::process::id()));
    std::fs::create_dir_all(&d).unwrap_or_else(|e| panic!("cannot create {}: {e}", d.display()));
    d
}

fn check_sheet(index: usize, name: &str, project: &Project, units: Units) -> Checked {
    let ev = evaluate(project, &EvalOptions::default());
    let dir = work_dir(index);
    let write = |file: &str, bytes: Result<Vec<u8>, String>| {
        let bytes = bytes.unwrap_or_else(|e| panic!("{name}: the sheet was refused: {e}"));
        let path = dir.join(file);
        std::fs::write(&path, bytes).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
        path
    };
    let full = write("full.pdf", build_sheet_pdf_in(project, &ev, units));
    let graphics = write(
        "graphics.pdf",
        build_sheet_graphics_only_pdf_in(project, &ev, units),
    );
    let checked = word_boxes(&full)
        .and_then(|pages| measure_renders(name, pages, &full, &graphics))
        .unwrap_or_else(|e| panic!("{name}: {e}"));
    if std::env::var_os(KEEP_VAR).is_some() {
        println!("{name}: PDFs and renders kept in {}", dir.display());
    } else {
        let _ = std::fs::remove_dir_all(&dir);
    }
    checked
}

/// Renders both PDFs once and measures, page by page, the ink under every word in each render
/// and the text ink outside the word boxes.
fn measure_renders(
    name: &str,
    pages: Vec<Page>,
    full: &Path,
    graphics: &Path,
) -> Result<Checked, String> {
    let full_files = render(full, "full", pages.len())?;
    let graphics_files = render(graphics, "graphics", pages.len())?;
    let px_per_pt = DPI / 72.0;
    let mut checked = Checked {
        name: name.to_string(),
        pages: Vec::new(),
        full_ink: Vec::new(),
        graphics_ink: Vec::new(),
        stray: Vec::new(),
    };
    for ((page, f), g) in pages.into_iter().zip(&full_files).zip(&graphics_files) {
        let full_img = read_page(f, &page)?;
        let graphics_img = read_page(g, &page)?;
        checked.full_ink.push(inks(&page, &full_img, px_per_pt));
        checked
            .graphics_ink
            .push(inks(&page, &graphics_img, px_per_pt));
        checked.stray.push(stray_text_ink(
            &page,
            &full_img,
            &graphics_img,
            px_per_pt,
            STRAY_GROW_PT,
            DARK_BELOW,
        ));
        checked.pages.push(page);
    }
    Ok(checked)
}

/// The word boxes of every page, from `pdftotext -bbox-layout`.
fn word_boxes(pdf: &Path) -> Result<Vec<Page>, String> {
    let out = Command::new("pdftotext")
        .arg("-bbox-layout")
        .arg(pdf)
        .arg("-")
        .output()
        .map_err(|e| format!("pdftotext did not run: {e}"))?;
    if !out.status.success() {
        return Err(format!(
            "pdftotext failed: {}",
            String::from_utf8_lossy(&out.stderr)
        ));
    }
    parse_bbox_xhtml(&String::from_utf8_lossy(&out.stdout))
}

/// Renders every page of `pdf` in one run (grey, PGM, files `<prefix>-NN.pgm` beside the PDF)
/// and returns the files in page order; there must be `page_count` of them.
fn render(pdf: &Path, prefix: &str, page_count: usize) -> Result<Vec<PathBuf>, String> {
    let dir = pdf.parent().ok_or("the PDF has no folder")?;
    let status = Command::new("pdftoppm")
        .args(["-r", &DPI.to_string(), "-gray"])
        .arg(pdf)
        .arg(dir.join(prefix))
        .status()
        .map_err(|e| format!("pdftoppm did not run: {e}"))?;
    if !status.success() {
        return Err(format!("pdftoppm failed on {}", pdf.display()));
    }
    let mut files: Vec<PathBuf> = std::fs::read_dir(dir)
        .map_err(|e| e.to_string())?
        .filter_map(|e| e.ok().map(|e| e.path()))
        .filter(|p| {
            p.file_name()
                .is_some_and(|n| n.to_string_lossy().starts_with(&format!("{prefix}-")))
        })
        .collect();
    // pdftoppm pads page numbers to one width, so the names sort in page order.
    files.sort();
    if files.len() != page_count {
        return Err(format!(
            "the {prefix} render has {} pages, the text has {page_count}",
            files.len()
        ));
    }
    Ok(files)
}

/// One rendered page, which must be the size of `page` at the render's resolution.
fn read_page(file: &Path, page: &Page) -> Result<Grey, String> {
    let bytes = std::fs::read(file).map_err(|e| format!("{}: {e}", file.display()))?;
    let img = parse_pgm(&bytes).map_err(|e| format!("{}: {e}", file.display()))?;
    let (w, h) = (page.width * DPI / 72.0, page.height * DPI / 72.0);
    if (img.width as f64 - w).abs() > 1.0 || (img.height as f64 - h).abs() > 1.0 {
        return Err(format!(
            "{}: {}×{} px, expected {w:.0}×{h:.0} for a {}×{} pt page",
            file.display(),
            img.width,
            img.height,
            page.width,
            page.height
        ));
    }
    Ok(img)
}

/// The ink under every word of one page, each box shrunk by `PIXEL_SHRINK_PT`.
fn inks(page: &Page, img: &Grey, px_per_pt: f64) -> Vec<Ink> {
    page.words
        .iter()
        .map(|w| ink_under(img, w.shrunk(PIXEL_SHRINK_PT), px_per_pt, DARK_BELOW))
        .collect()
}

/// Every word with ink under it in the graphics-only render: a line or a shape edge runs
/// through it.
fn line_problems(sheet: &str, pages: &[Page], graphics_ink: &[Vec<Ink>]) -> Vec<String> {
    let pt_per_px = 72.0 / DPI;
    let mut out = Vec::new();
    for (p, (page, inks)) in pages.iter().zip(graphics_ink).enumerate() {
        for (w, ink) in page.words.iter().zip(inks) {
            if ink.dark > 0 {
                let (x, y) = ink.darkest_at;
                out.push(format!(
                    "{sheet}, page {}: {w} has a drawing through it: {} of {} pixels dark in \
                     the graphics-only render, darkest {} at x {:.1}, y {:.1} pt",
                    p + 1,
                    ink.dark,
                    ink.looked_at,
                    ink.darkest,
                    (x as f64 + 0.5) * pt_per_px,
                    (y as f64 + 0.5) * pt_per_px
                ));
            }
        }
    }
    out
}

/// `None` when most word boxes hold ink in the whole-sheet render; otherwise what is wrong,
/// with a few of the empty words.
fn ink_shortfall(sheet: &str, pages: &[Page], full_ink: &[Vec<Ink>]) -> Option<String> {
    let mut words = 0;
    let mut empty = Vec::new();
    for (p, (page, inks)) in pages.iter().zip(full_ink).enumerate() {
        for (w, ink) in page.words.iter().zip(inks) {
            words += 1;
            if ink.dark == 0 {
                empty.push(format!("page {}: {w}", p + 1));
            }
        }
    }
    let inked = (words - empty.len()) as f64 / words.max(1) as f64;
    if words > 0 && inked >= MIN_INKED_SHARE {
        return None;
    }
    Some(format!(
        "{sheet}: only {:.0} % of {words} word boxes hold ink in the whole render (want at \
         least {:.0} %): blank render or misaligned coordinates? First empty ones:\n{}",
        inked * 100.0,
        MIN_INKED_SHARE * 100.0,
        empty
            .iter()
            .take(10)
            .cloned()
            .collect::<Vec<_>>()
            .join("\n")
    ))
}

/// Every page whose text ink lies outside the word boxes (grown by `STRAY_GROW_PT`) in more
/// than `MAX_STRAY_PIXELS` pixels: the boxes and the render do not line up there, or the page
/// prints text poppler does not report.
fn stray_problems(sheet: &str, stray: &[StrayInk]) -> Vec<String> {
    let pt_per_px = 72.0 / DPI;
    stray
        .iter()
        .enumerate()
        .filter(|(_, s)| s.stray_pixels > MAX_STRAY_PIXELS)
        .map(|(p, s)| {
            let (x, y) = s.first_stray_at.unwrap_or((0, 0));
            format!(
                "{sheet}, page {}: {} of {} text pixels lie outside every word box, the first \
                 at x {:.1}, y {:.1} pt",
                p + 1,
                s.stray_pixels,
                s.text_pixels,
                (x as f64 + 0.5) * pt_per_px,
                (y as f64 + 0.5) * pt_per_px
            )
        })
        .collect()
}

/// Both alignment checks of every sheet: ink in most word boxes, no text ink outside them.
fn alignment_problems(sheets: &[Checked]) -> Vec<String> {
    sheets
        .iter()
        .flat_map(|s| {
            let shortfall = ink_shortfall(&s.name, &s.pages, &s.full_ink);
            shortfall
                .into_iter()
                .chain(stray_problems(&s.name, &s.stray))
        })
        .collect()
}

/// Fails with every problem listed, one per line, when there are any.
fn assert_none(what: &str, problems: &[String]) {
    assert!(
        problems.is_empty(),
        "{} {what}:\n{}",
        problems.len(),
        problems.join("\n")
    );
}

#[test]
fn no_two_words_overlap_on_any_page() {
    if !tools_present() {
        return;
    }
    let problems: Vec<String> = checked_sheets()
        .iter()
        .flat_map(|s| {
            overlap_problems(&s.pages, ROUNDING_PT)
                .into_iter()
                .map(move |p| format!("{}, {p}", s.name))
        })
        .collect();
    assert_none("overlapping word pairs", &problems);
}

#[test]
fn no_word_runs_past_a_page_margin() {
    if !tools_present() {
        return;
    }
    let problems: Vec<String> = checked_sheets()
        .iter()
        .flat_map(|s| {
            margin_problems(&s.pages, MARGIN_PT, ROUNDING_PT)
                .into_iter()
                .map(move |p| format!("{}, {p}", s.name))
        })
        .collect();
    assert_none("words past a margin", &problems);
}

#[test]
fn the_renders_line_up_with_the_word_boxes() {
    if !tools_present() {
        return;
    }
    assert_none(
        "signs that the renders do not line up with the word boxes",
        &alignment_problems(checked_sheets()),
    );
}

#[test]
fn no_drawn_line_runs_through_a_word() {
    if !tools_present() {
        return;
    }
    let sheets = checked_sheets();
    // Unless the renders line up with the word boxes, a clean graphics render proves nothing.
    assert_none(
        "signs that the renders do not line up with the word boxes",
        &alignment_problems(sheets),
    );
    let problems: Vec<String> = sheets
        .iter()
        .flat_map(|s| line_problems(&s.name, &s.pages, &s.graphics_ink))
        .collect();
    assert_none("words with a drawn line through them", &problems);
}

/// A hand-made `pdftotext -bbox-layout` page: two words that overlap, two that only share an
/// edge within the rounding allowance, one past the right margin; a second page with a word
/// past the top margin and one past the right margin by less than the rounding allowance.
const HAND_MADE_XHTML: &str = r#"<doc>
  <page width="595.000000" height="842.000000">
    <flow><block xMin="100" yMin="100" xMax="200" yMax="114">
      <line xMin="100" yMin="100" xMax="200" yMax="114">
        <word xMin="100.0" yMin="100.0" xMax="140.0" yMax="110.0">alpha</word>
        <word xMin="135.0" yMin="104.0" xMax="170.0" yMax="114.0">&quot;beta&quot;</word>
      </line>
      <line xMin="169.8" yMin="104" xMax="200" yMax="114">
        <word xMin="169.8" yMin="104.0" xMax="200.0" yMax="114.0">touching</word>
      </line>
      <line xMin="540" yMin="300" xMax="570" yMax="310">
        <word xMin="540.0" yMin="300.0" xMax="570.0" yMax="310.0">gamma</word>
      </line>
    </block></flow>
  </page>
  <page width="595.000000" height="842.000000">
    <flow><block><line xMin="60" yMin="20" xMax="90" yMax="30">
      <word xMin="60.0" yMin="20.0" xMax="90.0" yMax="30.0">delta&amp;co</word>
    </line>
    <line xMin="500" yMin="400" xMax="555.2" yMax="410">
      <word xMin="500.0" yMin="400.0" xMax="555.2" yMax="410.0">rounding</word>
    </line></block></flow>
  </page>
</doc>"#;

#[test]
fn the_word_checks_report_overlapping_words_and_words_past_a_margin() {
    let pages = parse_bbox_xhtml(HAND_MADE_XHTML).expect("the hand-made page parses");
    assert_eq!(pages.len(), 2);
    assert_eq!(pages[0].words.len(), 4);
    assert_eq!(pages[0].words[1].text, "\"beta\"");
    assert_eq!(pages[0].words[1].line, "alpha \"beta\"");

    let overlaps = overlap_problems(&pages, ROUNDING_PT);
    assert_eq!(overlaps.len(), 1, "{overlaps:#?}");
    let o = &overlaps[0];
    assert!(o.starts_with("page 1:") && o.contains("\"alpha\""), "{o}");
    assert!(o.contains(r#""\"beta\"""#), "{o}");

    let margins = margin_problems(&pages, MARGIN_PT, ROUNDING_PT);
    assert_eq!(margins.len(), 2, "{margins:#?}");
    assert!(margins[0].starts_with("page 1:"), "{}", margins[0]);
    assert!(margins[0].contains("\"gamma\""), "{}", margins[0]);
    assert!(margins[0].contains("right by 15.00 pt"), "{}", margins[0]);
    assert!(margins[1].starts_with("page 2:"), "{}", margins[1]);
    assert!(margins[1].contains("\"delta&co\""), "{}", margins[1]);
    assert!(margins[1].contains("top by 20.00 pt"), "{}", margins[1]);
}

#[test]
fn unreadable_word_boxes_are_refused_with_the_reason() {
    let err = parse_bbox_xhtml("<doc></doc>").unwrap_err();
    assert!(err.contains("no <page>"), "{err}");
    let err = parse_bbox_xhtml(r#"<page width="595" height="x"></page>"#).unwrap_err();
    assert!(err.contains("height=\"x\" is not a number"), "{err}");
    let bad_word = r#"<page width="595" height="842"><line><word xMin="1" yMin="2" xMax="3">a</word></line></page>"#;
    let err = parse_bbox_xhtml(bad_word).unwrap_err();
    assert!(err.contains("page 1") && err.contains("no yMax"), "{err}");
}

/// A synthetic page at the test's resolution: three words, a light fill behind the first, a
/// dark line through the second, and a dark line just clear of the third.
fn synthetic_page() -> (Page, Grey) {
    let pages = parse_bbox_xhtml(
        r#"<page width="595" height="842"><line>
        <word xMin="100" yMin="100" xMax="140" yMax="110">filled</word>
        <word xMin="200" yMin="100" xMax="240" yMax="110">crossed</word>
        <word xMin="300" yMin="100" xMax="340" yMax="110">clear</word>
        </line></page>"#,
    )
    .expect("the synthetic page parses");
    let page = pages.into_iter().next().expect("one page");
    let s = DPI / 72.0;
    let px = |pt: f64| (pt * s) as usize;
    let mut img = Grey::white(px(595.0) + 1, px(842.0) + 1);
    for y in px(98.0)..px(112.0) {
        for x in px(98.0)..px(142.0) {
            img.set(x, y, 215);
        }
    }
    // A 1 px dark rule at 105 pt across "crossed", and one at 111.5 pt passing under "clear".
    for x in px(190.0)..px(250.0) {
        img.set(x, px(105.0), 0);
    }
    for x in px(290.0)..px(350.0) {
        img.set(x, px(111.5), 40);
    }
    (page, img)
}

#[test]
fn the_pixel_check_reports_a_line_through_a_word_but_not_a_light_fill() {
    let (page, img) = synthetic_page();
    let ink = vec![inks(&page, &img, DPI / 72.0)];
    let pages = [page];
    let problems = line_problems("synthetic sheet", &pages, &ink);
    assert_eq!(problems.len(), 1, "{problems:#?}");
    let p = &problems[0];
    assert!(p.starts_with("synthetic sheet, page 1:"), "{p}");
    assert!(p.contains("\"crossed\"") && p.contains("darkest 0"), "{p}");
    assert!(p.contains("y 104.8 pt"), "{p}");
}

#[test]
fn the_ink_sanity_check_fails_on_a_blank_render_and_passes_on_inked_words() {
    let (page, mut img) = synthetic_page();
    let s = DPI / 72.0;
    let blank = Grey::white(img.width, img.height);
    let pages = [page];
    let ink = vec![inks(&pages[0], &blank, s)];
    let msg = ink_shortfall("blank sheet", &pages, &ink).expect("a blank render is reported");
    assert!(msg.contains("only 0 % of 3 word boxes"), "{msg}");
    assert!(msg.contains("\"filled\""), "{msg}");
    // Ink in the middle of each word, as glyphs would put it.
    for w in &pages[0].words {
        let (cx, cy) = ((w.x0 + w.x1) / 2.0 * s, (w.y0 + w.y1) / 2.0 * s);
        img.set(cx as usize, cy as usize, 0);
    }
    let ink = vec![inks(&pages[0], &img, s)];
    assert_eq!(ink_shortfall("inked sheet", &pages, &ink), None);
}

#[test]
fn text_ink_outside_the_word_boxes_is_reported() {
    let (mut page, graphics) = synthetic_page();
    let s = DPI / 72.0;
    // Glyph-like ink across the middle of each word in the whole render; the dark rule through
    // "crossed" is in both renders, so it is drawing, not text.
    let mut full = Grey::white(graphics.width, graphics.height);
    full.pixels.clone_from(&graphics.pixels);
    for w in &page.words {
        for x in ((w.x0 + 1.0) * s) as usize..((w.x1 - 1.0) * s) as usize {
            for y in ((w.y0 + 2.0) * s) as usize..((w.y1 - 2.0) * s) as usize {
                full.set(x, y, 20);
            }
        }
    }
    let lined_up = stray_text_ink(&page, &full, &graphics, s, STRAY_GROW_PT, DARK_BELOW);
    assert!(lined_up.text_pixels > 100, "{lined_up:?}");
    assert_eq!(lined_up.stray_pixels, 0, "{lined_up:?}");
    assert!(stray_problems("synthetic sheet", &[lined_up]).is_empty());
    // The same render against boxes 4 pt too low: ink above the boxes is reported.
    for w in &mut page.words {
        w.y0 += 4.0;
        w.y1 += 4.0;
    }
    let shifted = stray_text_ink(&page, &full, &graphics, s, STRAY_GROW_PT, DARK_BELOW);
    assert!(shifted.stray_pixels > 0, "{shifted:?}");
    let problems = stray_problems("synthetic sheet", &[shifted]);
    assert_eq!(problems.len(), 1, "{problems:#?}");
    assert!(
        problems[0].starts_with("synthetic sheet, page 1:")
            && problems[0].contains("lie outside every word box"),
        "{}",
        problems[0]
    );
}
