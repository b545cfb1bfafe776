//! The installation report of the demo: it renders, its pages are clean (no text over text, no
//! line through a text, nothing past a margin) and it shows what it should, with a log, without
//! one and with nothing recorded.

use gw_plan::document::Project;
use gw_plan::evaluate::Evaluation;
use gw_plan::{EvalOptions, evaluate};
use gw_reduce::calibration::{CalibrationFit, calibrate_all};
use gw_reduce::checkout::{Checkout, Verdict, check_out};
use gw_reduce::example::{example_log, example_records};
use gw_reduce::log::read_log;
use gw_reduce::records_csv::read_records;
use gw_reduce::reduction::{ReduceOptions, Reduction, reduce};
use gw_reduce::report::{ReportInput, report_pages, report_pdf};

/// The demo plan with the example records filled in when `recorded`, and its evaluation.
fn demo(recorded: bool) -> (Project, Evaluation) {
    let mut p = gw_plan::demo::demo_project();
    if recorded {
        let ev = evaluate(&p, &EvalOptions::default());
        match read_records(&example_records(&p, &ev), &p) {
            Ok(r) => p.records = r,
            Err(e) => panic!("the example records do not read: {e}"),
        }
    }
    let ev = evaluate(&p, &EvalOptions::default());
    (p, ev)
}

/// The example log reduced and calibrated against the plan.
fn reduced(p: &Project, ev: &Evaluation) -> (Reduction, Vec<CalibrationFit>) {
    let log = match read_log(example_log(ev).as_bytes()) {
        Ok(l) => l,
        Err(e) => panic!("the example log does not read: {e}"),
    };
    let r = match reduce(p, ev, &log, &ReduceOptions::default()) {
        Ok(r) => r,
        Err(e) => panic!("the example log does not reduce: {e}"),
    };
    let (fits, _) = calibrate_all(p, ev, &r);
    (r, fits)
}

/// The report's text with its lines joined, so that a wrapped phrase reads whole.
fn flat(text: &str) -> String {
    text.replace(['\n', '\u{a0}'], " ")
}

/// Renders, checks the layout and returns the text and the page count.
fn render(input: &ReportInput<'_>, file: &str) -> (String, usize) {
    let pages = report_pages(input);
    let problems = pages.layout_problems();
    assert!(problems.is_empty(), "{}", problems.join("\n"));
    let pdf = match report_pdf(input) {
        Ok(b) => b,
        Err(e) => panic!("the report does not render: {e}"),
    };
    assert!(pdf.starts_with(b"%PDF"), "not a PDF");
    // Set GW_REPORT_DIR to keep the PDFs for looking at.
    if let Some(dir) = std::env::var_os("GW_REPORT_DIR") {
        let path = std::path::Path::new(&dir).join(file);
        if let Err(e) = std::fs::write(&path, &pdf) {
            panic!("could not write {}: {e}", path.display());
        }
    }
    let text = flat(&pages.text());
    for bad in ["NaN", "inf", "not computable"] {
        assert!(!text.contains(bad), "\"{bad}\" printed in the report");
    }
    (text, pages.page_count())
}

#[test]
fn the_demo_report_shows_every_channel_rosette_and_fit_on_clean_pages() {
    let (p, ev) = demo(true);
    let (r, fits) = reduced(&p, &ev);
    let checkout = check_out(&p, &ev);
    assert!(!fits.is_empty(), "the demo log calibrates a bridge");
    assert!(!r.rosettes.is_empty(), "the demo log reads a rosette");
    let input = ReportInput {
        project: &p,
        ev: &ev,
        checkout: &checkout,
        reduction: Some(&r),
        fits: &fits,
        log_name: "winch_first_test.csv",
    };
    let (text, pages) = render(&input, "demo_report.pdf");
    assert!(pages >= 3, "{pages} pages");
    for needle in [
        "Installation report",
        "winch_first_test.csv",
        "does not certify",
        "licensed engineering practice",
        "Measured against predicted",
        "Recovered loads against applied",
        "Calibration fits",
    ] {
        assert!(text.contains(needle), "\"{needle}\" missing");
    }
    for c in &r.channels {
        assert!(text.contains(&c.bridge), "channel {} missing", c.bridge);
        assert!(
            text.contains(&format!("Ch. {} {}", c.channel, c.bridge)),
            "no plot of {}",
            c.bridge
        );
    }
    for ro in &r.rosettes {
        assert!(text.contains(&format!("Rosette {} on {}", ro.gauge, ro.part)));
        assert!(
            text.contains("Kt = "),
            "the transverse-sensitivity correction is not stated"
        );
    }
    for f in &fits {
        assert!(text.contains(&format!("{} ({}): in-place calibration", f.bridge, f.part)));
        let ratio = format!("{:.4} ± {:.4}", f.ratio, f.ratio_u);
        assert!(
            text.contains(&ratio),
            "calibration row of {} without {ratio}",
            f.bridge
        );
    }
    // Every item that is not a pass is listed with its cause.
    for c in &checkout.channels {
        for i in c
            .items
            .iter()
            .filter(|i| matches!(i.verdict, Verdict::Check | Verdict::Fail))
        {
            assert!(
                text.contains(&flat(&i.cause)),
                "cause of {} missing",
                i.quantity
            );
        }
    }
}

#[test]
fn without_a_log_the_report_holds_the_check_out_only() {
    let (p, ev) = demo(true);
    let checkout = check_out(&p, &ev);
    let input = ReportInput {
        project: &p,
        ev: &ev,
        checkout: &checkout,
        reduction: None,
        fits: &[],
        log_name: "",
    };
    let (text, _) = render(&input, "no_log_report.pdf");
    assert!(text.contains("No test log was given"));
    assert!(text.contains("Log: none"));
    assert!(!text.contains("Measured against predicted"));
    for c in &checkout.channels {
        assert!(text.contains(&format!("{} / {}", c.part, c.bridge)));
    }
}

#[test]
fn with_nothing_recorded_the_report_says_so_and_still_reduces_the_log() {
    let (p, ev) = demo(false);
    let checkout: Checkout = check_out(&p, &ev);
    assert!(checkout.is_unrecorded());
    let (r, fits) = reduced(&p, &ev);
    let input = ReportInput {
        project: &p,
        ev: &ev,
        checkout: &checkout,
        reduction: Some(&r),
        fits: &fits,
        log_name: "winch_first_test.csv",
    };
    let (text, _) = render(&input, "unrecorded_report.pdf");
    assert!(text.contains("Nothing was recorded at check-out"));
    assert!(
        text.contains("not recorded:"),
        "the unrecorded items are not summed up"
    );
    assert!(!text.contains("Items that are not a pass"));
    assert!(text.contains("Check-out recorded: ____"));
    assert!(text.contains("no shunt step recorded"));
}
