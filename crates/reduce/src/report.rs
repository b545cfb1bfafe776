//! The installation report (PDF): check-out verdicts, measured against predicted per channel,
//! rosettes, recovered loads and calibration fits, on the plan's paper in the build sheet's
//! look (same header, fonts, tables and layout check).

mod calibration_section;
mod channel_section;
mod checkout_section;
mod numbers;
mod plot;
mod recovered_section;
mod rosette_section;

use gw_plan::document::Project;
use gw_plan::evaluate::Evaluation;
use gw_plan::sheet::report_page::{BODY_SIZE, ReportPages, ReportWriter};

use crate::calibration::CalibrationFit;
use crate::checkout::Checkout;
use crate::reduction::Reduction;

/// Everything the report shows.
#[derive(Debug, Clone, Copy)]
pub struct ReportInput<'a> {
    /// The plan.
    pub project: &'a Project,
    /// Its evaluation.
    pub ev: &'a Evaluation,
    /// The check-out.
    pub checkout: &'a Checkout,
    /// The reduced log, if one was given.
    pub reduction: Option<&'a Reduction>,
    /// Calibration fits.
    pub fits: &'a [CalibrationFit],
    /// Name of the log file, for the header.
    pub log_name: &'a str,
}

/// Renders the report to PDF bytes.
pub fn report_pdf(input: &ReportInput<'_>) -> Result<Vec<u8>, String> {
    report_pages(input).pdf()
}

/// The report's pages laid out: for its PDF, its layout check and its text.
pub fn report_pages(input: &ReportInput<'_>) -> ReportPages {
    let mut w = ReportWriter::new(input.project.paper, &input.project.name, &details(input));
    compose(&mut w, input);
    w.finish()
}

/// The first and last of the dates the technician entered in the records, if any.
fn record_dates(project: &Project) -> Option<(String, String)> {
    let records = &project.records;
    let mut dates: Vec<&str> = records
        .grids
        .iter()
        .map(|g| g.date.trim())
        .chain(records.bridges.iter().map(|b| b.date.trim()))
        .filter(|d| !d.is_empty())
        .collect();
    dates.sort_unstable();
    Some((dates.first()?.to_string(), dates.last()?.to_string()))
}

/// The header's details line: what the report is, revision, log and dates.
fn details(input: &ReportInput<'_>) -> String {
    let p = input.project;
    let or_blank = |s: &str, blank: &str| {
        if s.trim().is_empty() {
            blank.to_owned()
        } else {
            s.trim().to_owned()
        }
    };
    // Each label stays with its value: no-break spaces inside an item, ordinary ones between.
    let item = |label: &str, value: String| format!("{label}: {value}").replace(' ', "\u{a0}");
    let log = if input.reduction.is_some() {
        or_blank(input.log_name, "unnamed")
    } else {
        "none".to_owned()
    };
    let checked_out = match record_dates(p) {
        Some((a, b)) if a == b => a,
        Some((a, b)) => format!("{a} to {b}"),
        None => "____".to_owned(),
    };
    [
        "Installation report".replace(' ', "\u{a0}"),
        item("Revision", or_blank(&p.revision, "____")),
        item("Plan date", or_blank(&p.date, "____")),
        item("Log", log),
        item("Check-out recorded", checked_out),
        item("Report date", "________".to_owned()),
        item("Checked by", "________".to_owned()),
    ]
    .join("   ")
}

/// The caution that stands at the top of the first page.
const CAUTION: &str = "This report compares what was measured with what the plan predicts. It \
     does not certify that the part, the fixture or the test is safe. Proof loads and \
     pressure tests follow local codes, standards and licensed engineering practice; a \
     difference from the prediction is a reason to stop and find its cause before loading \
     further.";

/// The report's sections in order.
fn compose(w: &mut ReportWriter, input: &ReportInput<'_>) {
    w.heading("Installation report");
    w.para(9.0, true, "Caution");
    w.para(BODY_SIZE, false, CAUTION);
    checkout_section::draw(w, input.checkout);
    match input.reduction {
        Some(r) => {
            channel_section::draw(w, r);
            rosette_section::draw(w, r);
            recovered_section::draw(w, r);
            calibration_section::draw(w, input.fits);
            notes(w, r);
        }
        None => {
            w.heading("Test");
            w.para(
                BODY_SIZE,
                false,
                "No test log was given: this report holds the check-out only. Reduce a log \
                 against the plan to add measured against predicted, rosettes, recovered \
                 loads and calibration fits.",
            );
        }
    }
}

/// What the reduction left out and why.
fn notes(w: &mut ReportWriter, r: &Reduction) {
    if r.notes.is_empty() {
        return;
    }
    w.subheading("Notes on the reduction");
    for n in &r.notes {
        w.para(BODY_SIZE, false, &format!("• {n}"));
    }
}
