//! Every page of the build sheet is laid out cleanly: no two texts overlap, no drawn line runs
//! through a text, no filled shape hides one, nothing crosses a margin. Checked on the sheet's
//! own record of what it draws, for the demo, for the gallery of every model kind (whole and
//! one part at a time), on both paper sizes, with long names and with failing margins, in SI
//! and in US customary units.
//! (The same pages are checked again from the PDF itself with poppler in
//! `tests/tests/sheet_pages.rs`.)

use gw_plan::demo::demo_project;
use gw_plan::document::PaperSize;
use gw_plan::gallery::model_gallery;
use gw_plan::sheet::{build_sheet_layout_problems_in, build_sheet_text};
use gw_plan::units::Units;
use gw_plan::{EvalOptions, Project, evaluate};

/// Clean in both unit systems: US customary numbers run longer ("17.717 in" against
/// "450.00 mm", "744615 lbf" against "3312214 N"), and must fit their columns too.
fn assert_clean(what: &str, project: &Project) {
    let ev = evaluate(project, &EvalOptions::default());
    for units in [Units::Si, Units::UsCustomary] {
        let problems = build_sheet_layout_problems_in(project, &ev, units);
        assert!(
            problems.is_empty(),
            "{what} ({units:?}): {} layout problems:\n{}",
            problems.len(),
            problems.join("\n")
        );
    }
}

#[test]
fn the_demo_sheet_is_clean_on_both_paper_sizes() {
    let mut p = demo_project();
    assert_clean("demo, A4", &p);
    p.paper = PaperSize::Letter;
    assert_clean("demo, Letter", &p);
}

#[test]
fn a_sheet_for_each_model_kind_is_clean() {
    let gallery = model_gallery();
    assert_clean("gallery", &gallery);
    for part in &gallery.parts {
        let mut one = gallery.clone();
        one.parts = vec![part.clone()];
        assert_clean(&part.name, &one);
    }
}

#[test]
fn long_names_wrap_instead_of_running_past_the_margin() {
    let mut p = demo_project();
    p.name = "Winch test stand for the north quay, second build, with the heavier drum and the \
              revised reaction arm"
        .into();
    p.prepared_by = "A. Very-Long-Surname-Engineer of the instrumentation group".into();
    for part in &mut p.parts {
        part.name = format!(
            "{} of the second build, revised after the first proof",
            part.name
        );
        for b in &mut part.bridges {
            b.name = format!("{} measured at the mid-span station", b.name);
        }
    }
    assert_clean("long names", &p);
    let ev = evaluate(&p, &EvalOptions::default());
    let text = build_sheet_text(&p, &ev);
    assert!(text.contains("revised"), "the long name is printed");
}

#[test]
fn a_sheet_with_failing_margins_is_clean_and_says_so() {
    let mut p = demo_project();
    for part in &mut p.parts {
        for b in &mut part.bridges {
            b.excitation = gw_bridge::Excitation::Voltage { volts: 10.0 };
        }
    }
    let ev = evaluate(&p, &EvalOptions::default());
    assert!(ev.has_failures());
    assert_clean("failing margins", &p);
}

#[test]
fn a_new_project_of_each_model_kind_without_gauges_is_clean() {
    use gw_plan::blank::{ModelKind, blank_project, default_material, new_part};
    for kind in ModelKind::ALL {
        let member = kind.default_member(&default_material());
        let p = blank_project(new_part("First part", member, None));
        assert_clean(kind.name(), &p);
        let ev = evaluate(&p, &EvalOptions::default());
        assert!(build_sheet_text(&p, &ev).contains("No bridges planned"));
    }
}
