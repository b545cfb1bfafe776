//! Loads recovered from several bridges against the applied loads of the log.

use gw_plan::sheet::report_page::{BODY_SIZE, ReportWriter};

use super::numbers::{ABSENT, difference_percent, fixed, peak, quantity};
use crate::reduction::{RecoveredLoads, Reduction};

/// The largest |recovered − applied| over the log and its sample.
fn largest_difference(recovered: &[f64], applied: &[f64]) -> Option<(usize, f64)> {
    let d: Vec<f64> = recovered.iter().zip(applied).map(|(r, a)| r - a).collect();
    peak(&d)
}

fn rows_of(r: &Reduction, rec: &RecoveredLoads, rows: &mut Vec<Vec<String>>) {
    for (c, v) in rec.components.iter().zip(&rec.values) {
        let unit = c.unit();
        let at_peak = peak(v);
        let applied = r.applied_load(&rec.part, *c).map(|a| a.values.as_slice());
        let applied_at = match (at_peak, applied) {
            (Some((i, _)), Some(a)) => a.get(i).copied().unwrap_or(f64::NAN),
            _ => f64::NAN,
        };
        let recovered = at_peak.map_or(f64::NAN, |(_, p)| p);
        let largest =
            applied
                .and_then(|a| largest_difference(v, a))
                .map_or(ABSENT.to_owned(), |(i, d)| {
                    let t = r.time_s.get(i).copied().unwrap_or(f64::NAN);
                    format!("{} at {} s", quantity(d, unit), fixed(t, 1))
                });
        rows.push(vec![
            rec.part.clone(),
            c.name().to_owned(),
            rec.bridges.join(", "),
            quantity(recovered, unit),
            quantity(applied_at, unit),
            difference_percent(recovered, applied_at),
            largest,
        ]);
    }
}

/// The section, when loads were recovered.
pub(super) fn draw(w: &mut ReportWriter, r: &Reduction) {
    if r.recovered.is_empty() {
        return;
    }
    w.heading("Recovered loads against applied");
    w.para(
        BODY_SIZE,
        false,
        "Each part's loads solved from its bridges with the plan's recovery matrix, at the \
         sample of the largest recovered value, beside the applied load the log records there. \
         Difference = (recovered − applied) / |applied|; the largest difference is the largest \
         |recovered − applied| over the whole log.",
    );
    let mut rows = vec![
        [
            "Part",
            "Load",
            "From bridges",
            "Peak recovered",
            "Applied there",
            "Difference",
            "Largest difference",
        ]
        .map(String::from)
        .to_vec(),
    ];
    for rec in &r.recovered {
        rows_of(r, rec, &mut rows);
    }
    w.table(&[1.0, 1.0, 1.6, 0.9, 0.9, 0.95, 1.15], &rows, BODY_SIZE);
}
