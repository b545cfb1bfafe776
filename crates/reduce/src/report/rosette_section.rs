//! Rosettes at their peak sample: principal strains, angle, maximum shear and principal
//! stresses, measured and predicted side by side.

use gw_plan::sheet::report_page::{BODY_SIZE, ReportWriter};

use super::numbers::{ABSENT, fixed};
use crate::reduction::Reduction;
use crate::rosette_series::{PrincipalSeries, RosetteSeries};

/// The quantities of a row: label and value at sample `i` in display units.
fn quantities(s: &PrincipalSeries, i: usize, orientation_rad: f64) -> [(String, f64); 7] {
    let at = |v: &[f64]| v.get(i).copied().unwrap_or(f64::NAN);
    let angle = at(&s.angle_rad);
    [
        ("ε1 (µε)".to_owned(), at(&s.strain_1) * 1e6),
        ("ε2 (µε)".to_owned(), at(&s.strain_2) * 1e6),
        (
            "Angle of ε1 from grid 1, counter-clockwise (°)".to_owned(),
            angle.to_degrees(),
        ),
        (
            "Angle of ε1 from the part's x axis (°)".to_owned(),
            (angle + orientation_rad).to_degrees(),
        ),
        (
            "Maximum shear strain ε1 − ε2 (µε)".to_owned(),
            at(&s.max_shear_strain) * 1e6,
        ),
        ("σ1 (MPa)".to_owned(), at(&s.stress_1_pa) * 1e-6),
        ("σ2 (MPa)".to_owned(), at(&s.stress_2_pa) * 1e-6),
    ]
}

fn rows(ro: &RosetteSeries, i: usize) -> Vec<Vec<String>> {
    let mut rows = vec![
        ["Quantity", "Measured", "Predicted", "Measured − predicted"]
            .map(String::from)
            .to_vec(),
    ];
    let measured = quantities(&ro.measured, i, ro.orientation_rad);
    let predicted = ro
        .predicted
        .as_ref()
        .map(|p| quantities(p, i, ro.orientation_rad));
    for (k, (label, m)) in measured.into_iter().enumerate() {
        let p = predicted.as_ref().map_or(f64::NAN, |p| p[k].1);
        let d = if p.is_finite() {
            fixed(m - p, 1)
        } else {
            ABSENT.to_owned()
        };
        rows.push(vec![label, fixed(m, 1), fixed(p, 1), d]);
    }
    rows
}

/// One rosette.
fn rosette(w: &mut ReportWriter, r: &Reduction, ro: &RosetteSeries) {
    w.subheading(&format!("Rosette {} on {}", ro.gauge, ro.part));
    let Some(i) = ro.summary_index() else {
        w.para(
            BODY_SIZE,
            false,
            "The log holds no sample for this rosette.",
        );
        return;
    };
    let t = r.time_s.get(i).copied().unwrap_or(f64::NAN);
    w.para(
        BODY_SIZE,
        false,
        &format!(
            "Grids 1, 2 and 3 read by {}; grid 1 at {}° from the part's x axis. At the sample of \
             the largest predicted principal strain (of the largest measured one when the log has \
             no applied loads), t = {} s. Each grid was corrected for its transverse \
             sensitivity Kt = {} % before the reduction.{}",
            ro.bridges.join(", "),
            fixed(ro.orientation_rad.to_degrees(), 1),
            fixed(t, 1),
            fixed(ro.transverse_sensitivity * 100.0, 2),
            if ro.predicted.is_none() {
                " The log carries no applied loads, so there is no prediction."
            } else {
                ""
            }
        ),
    );
    w.table(&[3.0, 1.0, 1.0, 1.3], &rows(ro, i), BODY_SIZE);
}

/// The section, when the log has rosettes.
pub(super) fn draw(w: &mut ReportWriter, r: &Reduction) {
    if r.rosettes.is_empty() {
        return;
    }
    w.heading("Rosettes");
    w.para(
        BODY_SIZE,
        false,
        "Principal strains and stresses (plane stress, the part's elastic constants), the \
         angle of the larger principal strain and the maximum in-plane shear strain, measured \
         and predicted by the plan under the log's applied loads.",
    );
    for ro in &r.rosettes {
        rosette(w, r, ro);
    }
}
