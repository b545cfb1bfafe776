//! In-place calibration fits: one table row per bridge and a plot of its points (rising and
//! falling told apart) with the fitted line.

use gw_plan::sheet::report_page::{BODY_SIZE, PageBox, ReportWriter};

use super::numbers::{ABSENT, fixed, plus_minus, scale_for, significant};
use super::plot::{self, Plot, Series, Style};
use crate::calibration::{CalibrationFit, StepSource};

/// Height of one calibration plot, points.
const PLOT_HEIGHT: f32 = 165.0;

/// The display unit of a fit's loads: factor from SI and the prefixed unit.
fn load_scale(f: &CalibrationFit) -> (f64, String) {
    let largest = f.points.iter().fold(0.0f64, |m, p| m.max(p.load.abs()));
    scale_for(largest, f.wanted.unit())
}

fn source_text(f: &CalibrationFit) -> String {
    match &f.source {
        StepSource::ReferenceColumn(c) => format!("log column \"{c}\""),
        StepSource::EnteredSteps => "steps entered in the bridge's record".to_owned(),
    }
}

/// One row: sensitivities per display unit of load.
fn row(f: &CalibrationFit) -> Vec<String> {
    let (k, unit) = load_scale(f);
    let rising = f.points.iter().filter(|p| p.rising).count();
    let per = |v: f64| v / k;
    let digits = 5;
    let sens_u = significant(per(f.sensitivity_u), 2);
    vec![
        format!("{} ({})", f.bridge, f.part),
        format!(
            "{} ({rising} rising, {} falling)",
            f.points.len(),
            f.points.len() - rising
        ),
        source_text(f),
        format!(
            "{} ± {sens_u} per {unit}",
            significant(per(f.sensitivity), digits)
        ),
        format!(
            "{} per {unit}",
            significant(per(f.predicted_sensitivity), digits)
        ),
        plus_minus(f.ratio, f.ratio_u, 4),
        plus_minus(f.zero_mv_per_v, f.zero_u, 5),
        fixed(f.nonlinearity * 100.0, 3),
        match (f.hysteresis, f.hysteresis_u) {
            (Some(h), Some(u)) => plus_minus(h * 100.0, u * 100.0, 3),
            (Some(h), None) => fixed(h * 100.0, 3),
            _ => format!("{ABSENT} (no load met both ways)"),
        },
    ]
}

fn table(w: &mut ReportWriter, fits: &[CalibrationFit]) {
    let mut rows = vec![
        [
            "Bridge (part)",
            "Points",
            "Source of loads",
            "Sensitivity ± u (mV/V)",
            "Predicted (mV/V)",
            "Fitted / predicted ± u",
            "Zero ± u (mV/V)",
            "Nonlinearity (% FS)",
            "Hysteresis ± u (% FS)",
        ]
        .map(String::from)
        .to_vec(),
    ];
    rows.extend(fits.iter().map(row));
    w.table(
        &[1.15, 0.7, 1.0, 1.3, 1.0, 1.05, 1.0, 1.05, 0.85],
        &rows,
        7.0,
    );
}

fn fit_plot(f: &CalibrationFit) -> Plot {
    let (k, unit) = load_scale(f);
    let points = |rising: bool| {
        let chosen: Vec<_> = f.points.iter().filter(|p| p.rising == rising).collect();
        (
            chosen.iter().map(|p| p.load * k).collect::<Vec<f64>>(),
            chosen
                .iter()
                .map(|p| p.reading_mv_per_v)
                .collect::<Vec<f64>>(),
        )
    };
    let (lo, hi) = f
        .points
        .iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), p| {
            (a.min(p.load), b.max(p.load))
        });
    let mut series = vec![Series {
        name: "fitted line".to_owned(),
        x: vec![lo * k, hi * k],
        y: vec![f.line.value_at(lo), f.line.value_at(hi)],
        style: Style::Line,
    }];
    let (xr, yr) = points(true);
    series.push(Series {
        name: "rising steps".to_owned(),
        x: xr,
        y: yr,
        style: Style::Triangles,
    });
    let (xf, yf) = points(false);
    if !xf.is_empty() {
        series.push(Series {
            name: "falling steps".to_owned(),
            x: xf,
            y: yf,
            style: Style::Rings,
        });
    }
    Plot {
        title: format!("{} ({}): in-place calibration", f.bridge, f.part),
        x_title: format!("known {} ({unit})", f.wanted.name()),
        y_title: "plateau reading as logged (mV/V)".to_owned(),
        series,
    }
}

/// The section.
pub(super) fn draw(w: &mut ReportWriter, fits: &[CalibrationFit]) {
    w.heading("Calibration fits");
    if fits.is_empty() {
        w.para(
            BODY_SIZE,
            false,
            "No bridge was calibrated: the log carries no applied load for a bridge that \
             measures one, and no load steps were entered in the records.",
        );
        return;
    }
    w.para(
        BODY_SIZE,
        false,
        "A straight line, reading = zero + sensitivity × load, fitted by least squares to the \
         mean reading of each plateau held at a known load (readings as logged: no zero taken \
         off, no span correction). u: standard uncertainty from the fit. Non-linearity: the \
         largest distance of a plateau from the line; hysteresis: the largest difference \
         between falling and rising readings at the same load; both in % of the full-scale \
         output (FS).",
    );
    table(w, fits);
    let gap = 14.0;
    let width = 0.5 * (w.column() - gap);
    for pair in fits.chunks(2) {
        w.room(PLOT_HEIGHT + 6.0);
        let top = w.y() + 4.0;
        for (i, f) in pair.iter().enumerate() {
            let x0 = w.left() + i as f32 * (width + gap);
            plot::draw(
                w,
                &fit_plot(f),
                PageBox::new(x0, top, x0 + width, top + PLOT_HEIGHT),
            );
        }
        w.set_y(top + PLOT_HEIGHT + 6.0);
    }
}
