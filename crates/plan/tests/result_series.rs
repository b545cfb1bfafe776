//! The plot series of the demo's first bridge (which states 2 % of reading) read against the
//! project itself: full scale from the load cases, the band from the stated requirement, and
//! the error at no load from the thermal sweep alone.

use gw_plan::demo::demo_project;
use gw_plan::document::RequiredAccuracy;
use gw_plan::evaluate::{EvalOptions, evaluate};
use gw_plan::result_series::{
    allowed_pct, case_ramps, error_curves, full_scale, temperature_extreme_strain_in,
};

#[test]
fn demo_bridge_series_agree_with_the_project() {
    let project = demo_project();
    let evaluation = evaluate(&project, &EvalOptions::default());
    let (part_index, bridge_index) = project
        .parts
        .iter()
        .enumerate()
        .find_map(|(p, part)| {
            let b = part
                .bridges
                .iter()
                .position(|b| b.required_accuracy.is_some())?;
            Some((p, b))
        })
        .expect("the demo states an accuracy for one bridge");
    let part = &project.parts[part_index];
    let plan = &part.bridges[bridge_index];
    let pe = evaluation
        .parts
        .iter()
        .find(|p| p.part_index == part_index)
        .unwrap();
    let k = pe
        .bridge_indices
        .iter()
        .position(|&i| i == bridge_index)
        .unwrap();
    let be = &pe.bridges[k];

    // Full scale: the largest |wanted load| of the part's load cases, read from the document.
    let expected_fs = part
        .load_cases
        .iter()
        .map(|c| c.value(plan.wanted).abs())
        .fold(0.0, f64::max);
    let fs = full_scale(be).unwrap();
    assert!(
        (fs - expected_fs).abs() <= 1e-9 * expected_fs,
        "{fs} vs {expected_fs}"
    );

    // The band: p % of reading at full scale is p % of full scale; at no load, nothing.
    let Some(RequiredAccuracy::PercentOfReading(p)) = plan.required_accuracy else {
        panic!("the demo states a percentage of reading");
    };
    assert!((allowed_pct(be, fs, fs).unwrap() - p).abs() < 1e-12);
    assert_eq!(allowed_pct(be, 0.0, fs).unwrap(), 0.0);

    // One ramp per case, each starting at no load.
    let ramps = case_ramps(be);
    assert_eq!(ramps.len(), be.cases.len());
    for r in &ramps {
        assert_eq!(r.displayed[0][0], 0.0);
        assert_eq!(r.displayed.len(), r.straight.len());
    }

    // At no load only the temperature extreme remains, as a share of the full-scale strain.
    let per_unit = be
        .sensitivities
        .iter()
        .find(|s| s.component == plan.wanted)
        .unwrap()
        .displayed_per_unit;
    for curve in error_curves(be, &part.load_cases).unwrap() {
        let case = part
            .load_cases
            .iter()
            .find(|c| c.name == curve.case)
            .unwrap();
        let (t0, t1) = case.temperature_range_c;
        let extreme = temperature_extreme_strain_in(&be.temperature, t0, t1);
        let zero_load_pct = 100.0 * extreme / (fs * per_unit).abs();
        let first = curve.points[0];
        assert!(
            (first.total_pct - zero_load_pct).abs() < 1e-9,
            "{}: {first:?} vs {zero_load_pct}",
            curve.case
        );
        assert!(curve.points.iter().all(|p| p.total_pct.is_finite()));
    }
}
