//! The build sheet for the technician: a printable PDF with embedded fonts, readable in black
//! and white. Every number comes from the same [`Evaluation`] the app shows.

mod bridge_section;
mod close_ups;
mod face_drawings;
mod front;
mod layout;
mod part_section;
mod part_views;
mod pdf;
mod records;
pub mod report_page;
mod template;
mod wiring_diagram;
mod writer;

use layout::Op;
use writer::{Header, Writer};

use gw_mechanics::LoadComponent;

use crate::document::Project;
use crate::evaluate::{Evaluation, Finding, Severity};
use crate::units::{Quantity, Units, microstrain};

pub(crate) fn um(strain: f64) -> String {
    microstrain(strain)
}

/// A length on the part in the sheet's units, at the length's display resolution.
pub(crate) fn len(units: Units, m: f64) -> String {
    units.format(Quantity::Length, m)
}

/// A value of load component `c` (SI) in the sheet's units.
pub(crate) fn load(units: Units, c: LoadComponent, v: f64) -> String {
    units.format(Quantity::of(c), v)
}

/// A load per unit of something (the conversion per mV/V): scale only.
pub(crate) fn load_per(units: Units, c: LoadComponent, v: f64) -> String {
    units.format_difference(Quantity::of(c), v)
}

/// A round scale-bar length no longer than `max_pt` at `pt_per_m` points per metre: 1, 2 or 5
/// times a power of ten of the display length unit (mm or in). Returns the length in metres
/// and its label ("50 mm", "2 in").
pub(crate) fn scale_bar_length(units: Units, pt_per_m: f64, max_pt: f64) -> (f64, String) {
    let per_m = units.to_display(Quantity::Length, 1.0);
    let shown = crate::drawing::face_layout::scale_bar_length(pt_per_m / per_m, max_pt);
    let number = format!("{shown:.3}");
    let number = number.trim_end_matches('0').trim_end_matches('.');
    (
        shown / per_m,
        format!("{number} {}", units.label(Quantity::Length)),
    )
}

/// The display length unit's name in a sentence ("in mm" reads well; "in in" does not).
pub(crate) fn length_unit_name(units: Units) -> &'static str {
    match units {
        Units::Si => "millimetres",
        Units::UsCustomary => "inches",
    }
}

/// The unit system in words, with its units, for the front page.
pub(crate) fn units_words(units: Units) -> &'static str {
    match units {
        Units::Si => "SI (mm, N, N·m, MPa, °C)",
        Units::UsCustomary => "US customary (in, lbf, lbf·in, psi and ksi, °F)",
    }
}

/// Text of the printed failure banner (also shown by the app and the CLI), in SI.
pub fn failure_lines(ev: &Evaluation) -> Vec<String> {
    failure_lines_in(ev, Units::Si)
}

/// Text of the printed failure banner in `units`.
pub fn failure_lines_in(ev: &Evaluation, units: Units) -> Vec<String> {
    ev.findings
        .iter()
        .filter(|f| matches!(f.severity, Severity::Fail | Severity::Error))
        .map(|f| finding_text(f, units))
        .collect()
}

/// A finding's words in `units`.
pub(crate) fn finding_text(f: &Finding, units: Units) -> String {
    f.text(units)
}

/// Renders the build sheet to PDF bytes, in SI units.
pub fn build_sheet_pdf(project: &Project, ev: &Evaluation) -> Result<Vec<u8>, String> {
    build_sheet_pdf_in(project, ev, Units::Si)
}

/// Renders the build sheet to PDF bytes, every number in `units`.
pub fn build_sheet_pdf_in(
    project: &Project,
    ev: &Evaluation,
    units: Units,
) -> Result<Vec<u8>, String> {
    pdf::render(&compose(project, ev, units), true)
}

/// The build sheet with its drawings, rules and boxes but no text: rendered beside the whole
/// sheet, it shows whether any drawn line runs through a text (the pixels under each word must
/// be blank here). In SI units.
pub fn build_sheet_graphics_only_pdf(
    project: &Project,
    ev: &Evaluation,
) -> Result<Vec<u8>, String> {
    build_sheet_graphics_only_pdf_in(project, ev, Units::Si)
}

/// [`build_sheet_graphics_only_pdf`] of the sheet in `units`.
pub fn build_sheet_graphics_only_pdf_in(
    project: &Project,
    ev: &Evaluation,
    units: Units,
) -> Result<Vec<u8>, String> {
    pdf::render(&compose(project, ev, units), false)
}

/// Layout problems of every page of the SI sheet (overlapping text, lines through text,
/// anything past a margin), each with its page number; empty for a clean sheet.
pub fn build_sheet_layout_problems(project: &Project, ev: &Evaluation) -> Vec<String> {
    build_sheet_layout_problems_in(project, ev, Units::Si)
}

/// Layout problems of every page of the sheet in `units`.
pub fn build_sheet_layout_problems_in(
    project: &Project,
    ev: &Evaluation,
    units: Units,
) -> Vec<String> {
    let w = compose(project, ev, units);
    w.pages
        .iter()
        .enumerate()
        .flat_map(|(i, ops)| {
            layout::problems(ops, w.width, w.height)
                .into_iter()
                .map(move |p| format!("page {}: {p}", i + 1))
        })
        .collect()
}

/// Every text the SI build sheet prints, page by page, one item per line: what a reader of the
/// sheet sees, for checks that need no PDF reader.
pub fn build_sheet_text(project: &Project, ev: &Evaluation) -> String {
    build_sheet_text_in(project, ev, Units::Si)
}

/// Every text the build sheet in `units` prints, as [`build_sheet_text`].
pub fn build_sheet_text_in(project: &Project, ev: &Evaluation, units: Units) -> String {
    let w = compose(project, ev, units);
    let mut out = String::new();
    for op in w.pages.iter().flatten() {
        if let Op::Text { text, .. } = op {
            out.push_str(text);
            out.push('\n');
        }
    }
    out
}

/// The page header: the project's name, and its parts, revision, date and signatures (blank
/// lines where the project leaves them empty).
fn header(project: &Project) -> Header {
    let or_blank = |s: &str, blank: &'static str| {
        if s.trim().is_empty() {
            blank.to_owned()
        } else {
            s.to_owned()
        }
    };
    // Each label stays with its value: no-break spaces inside an item, ordinary ones between.
    let item = |label: &str, value: String| format!("{label}: {value}").replace(' ', "\u{a0}");
    let parts = project
        .parts
        .iter()
        .map(|p| p.name.as_str())
        .collect::<Vec<_>>()
        .join(", ");
    Header {
        title: project.name.clone(),
        details: [
            format!("Parts: {parts}"),
            item("Revision", or_blank(&project.revision, "____")),
            item("Date", or_blank(&project.date, "____")),
            item("Prepared by", or_blank(&project.prepared_by, "________")),
            item("Checked by", or_blank(&project.checked_by, "________")),
        ]
        .join("   "),
    }
}

/// A 1:1 marking template of every face that carries gauges, each on pages of its own.
fn templates(w: &mut Writer, project: &Project) {
    for part in &project.parts {
        let placed = project.placed_gauges(part);
        for extent in part.member.faces() {
            if placed.iter().any(|g| g.position.face == extent.face) {
                template::draw(w, part, &placed, extent.face);
            }
        }
    }
}

/// Lays out the whole sheet.
fn compose(project: &Project, ev: &Evaluation, units: Units) -> Writer {
    let mut w = Writer::new(project.paper, header(project));
    w.units = units;
    front::draw(&mut w, project, ev);
    for pe in &ev.parts {
        let Some(part) = project.parts.get(pe.part_index) else {
            continue;
        };
        part_section::draw(&mut w, project, part, pe);
        for (k, be) in pe.bridges.iter().enumerate() {
            if let Some(plan) = pe.bridge_indices.get(k).and_then(|&i| part.bridges.get(i)) {
                bridge_section::draw(&mut w, project, part, be, plan);
            }
        }
    }
    w.new_page();
    records::gauge_records(&mut w, project);
    records::bridge_records(&mut w, project, ev);
    records::checklist(&mut w);
    if project.marking_templates {
        templates(&mut w, project);
    }
    w.finish();
    w
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::document::RequiredAccuracy;

    fn page_text(w: &Writer, page: usize) -> String {
        w.pages[page]
            .iter()
            .filter_map(|op| match op {
                Op::Text { text, .. } => Some(text.as_str()),
                _ => None,
            })
            .collect::<Vec<_>>()
            .join(" ")
    }

    #[test]
    fn a_missed_accuracy_stands_on_the_first_page() {
        let mut p = crate::demo::demo_project();
        p.parts[0].bridges[0].required_accuracy = Some(RequiredAccuracy::PercentOfReading(0.001));
        let ev = crate::evaluate(&p, &crate::EvalOptions::default());
        let misses: Vec<_> = ev.parts[0].bridges[0]
            .accuracy
            .iter()
            .filter(|a| a.margin.status == gw_bridge::margins::MarginStatus::Fail)
            .collect();
        assert!(!misses.is_empty(), "0.001 % of reading cannot be met");
        let w = compose(&p, &ev, Units::Si);
        let first = page_text(&w, 0);
        assert!(first.contains("MARGIN FAILS"), "{first}");
        for a in misses {
            let words = a.describe(ev.parts[0].bridges[0].wanted, Units::Si);
            let start: String = words.chars().take(30).collect();
            assert!(first.contains(&start), "{start} not on page 1: {first}");
        }
    }

    #[test]
    fn a_plan_that_passes_says_so_without_a_banner() {
        let p = crate::demo::demo_project();
        let ev = crate::evaluate(&p, &crate::EvalOptions::default());
        assert!(!ev.has_failures());
        let first = page_text(&compose(&p, &ev, Units::Si), 0);
        assert!(!first.contains("MARGIN FAILS"));
        assert!(first.contains("not a certification"));
    }

    #[test]
    fn marking_templates_follow_the_project_setting() {
        let mut p = crate::demo::demo_project();
        let ev = crate::evaluate(&p, &crate::EvalOptions::default());
        let faces_with_gauges: usize = p
            .parts
            .iter()
            .map(|part| {
                let placed = p.placed_gauges(part);
                part.member
                    .faces()
                    .iter()
                    .filter(|e| placed.iter().any(|g| g.position.face == e.face))
                    .count()
            })
            .sum();
        assert!(faces_with_gauges >= 5);
        let titled = |w: &Writer| {
            (0..w.pages.len())
                .filter(|&i| page_text(w, i).contains("Marking template at 1:1"))
                .count()
        };
        let with = compose(&p, &ev, Units::Si);
        assert!(titled(&with) >= faces_with_gauges);
        p.marking_templates = false;
        let without = compose(&p, &ev, Units::Si);
        assert_eq!(titled(&without), 0);
        assert!(without.pages.len() < with.pages.len());
    }
}
