//! The example plan on imported results (`assets/bracket_fe/bracket.ron`): it is what the
//! example's builder makes (`UPDATE_ASSETS=1 cargo test -p gw-plan --test bracket_example`
//! writes it again), it opens from its file with its results read, every bridge reads its
//! wanted load with no error, its build sheet is laid out cleanly in both unit systems, and its
//! summary prints a zero reading without a minus sign.

use std::path::PathBuf;

use gw_bridge::ArmElement;
use gw_mechanics::LoadComponent;
use gw_plan::arrangements::suggest;
use gw_plan::bracket_example::bracket_project;
use gw_plan::cli::eval_summary;
use gw_plan::evaluate::Severity;
use gw_plan::io::project_to_string;
use gw_plan::sheet::{build_sheet_layout_problems_in, build_sheet_text};
use gw_plan::units::Units;
use gw_plan::{EvalOptions, evaluate, load_project};

fn folder() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../../assets/bracket_fe")
}

#[test]
fn the_shipped_example_plan_is_what_its_builder_makes() {
    let made = bracket_project(&folder()).expect("the example's results are readable");
    let text = project_to_string(&made).unwrap();
    let path = folder().join("bracket.ron");
    if std::env::var_os("UPDATE_ASSETS").is_some() {
        std::fs::write(&path, &text).unwrap();
    }
    let shipped = std::fs::read_to_string(&path).unwrap();
    assert!(
        shipped == text,
        "assets/bracket_fe/bracket.ron differs from what the builder makes; write it again \
         with UPDATE_ASSETS=1"
    );
}

#[test]
fn the_example_opens_reads_its_loads_and_prints_cleanly() {
    let p = load_project(&folder().join("bracket.ron")).unwrap();
    let ev = evaluate(&p, &EvalOptions::default());
    let errors: Vec<_> = ev
        .findings
        .iter()
        .filter(|f| f.severity == Severity::Error)
        .collect();
    assert!(errors.is_empty(), "{errors:#?}");
    let part = &ev.parts[0];
    assert_eq!(part.bridges.len(), 2);
    for b in &part.bridges {
        let rated = &b.cases[0];
        assert!(
            rated.reading.displayed_strain.abs() > 10e-6,
            "{}: {:e}",
            b.name,
            rated.reading.displayed_strain
        );
    }
    for units in [Units::Si, Units::UsCustomary] {
        let problems = build_sheet_layout_problems_in(&p, &ev, units);
        assert!(problems.is_empty(), "{units:?}: {}", problems.join("\n"));
    }
    let text = build_sheet_text(&p, &ev);
    assert!(text.contains("Isometric view"), "{text}");
}

#[test]
fn the_example_summary_shows_no_negative_zero() {
    // The side push leaves the half bridge across the upright at zero: it reads "0.0000 mV/V".
    let out = eval_summary(&folder().join("bracket.ron"), false);
    assert_eq!(out.code, 0, "{}", out.stderr);
    assert!(out.stdout.contains(" 0.0000 mV/V"), "{}", out.stdout);
    for bad in ["-0.0000", "-0.0 µε", "-0.000 "] {
        assert!(!out.stdout.contains(bad), "{bad}:\n{}", out.stdout);
    }
}

/// Arms 1 and 3 add, arms 2 and 4 subtract (the bridge's output sign of each arm).
fn arm_sign(arm: usize) -> f64 {
    if arm.is_multiple_of(2) { 1.0 } else { -1.0 }
}

#[test]
fn the_chooser_and_the_rejections_work_on_imported_results() {
    let p = load_project(&folder().join("bracket.ron")).unwrap();
    let part = &p.parts[0];
    let ranked = suggest(&p, part, 0).expect("the chooser runs on an imported part");
    assert!(ranked.len() >= 3, "{} entries", ranked.len());
    // Among its entries: the upright's outer and inner faces (U1, U2) alone, in arms of
    // opposite sign. They bend in opposite senses under the downward load while a temperature
    // change moves them alike, so the pair cancels temperature (Hoffmann, An Introduction to
    // Stress Analysis and Transducer Design using Strain Gauges, half-bridge bending
    // arrangement; from memory for the reference).
    let pair = ranked
        .iter()
        .find(|r| {
            let grids: Vec<(usize, f64)> = r
                .arms
                .iter()
                .enumerate()
                .filter_map(|(arm, a)| match a {
                    ArmElement::Grid(g) => Some((g.gauge, arm_sign(arm))),
                    _ => None,
                })
                .collect();
            r.arms.iter().all(|a| !matches!(a, ArmElement::Dummy(_)))
                && grids.len() == 2
                && grids.iter().any(|&(g, _)| g == 0)
                && grids.iter().any(|&(g, _)| g == 1)
                && grids[0].1 * grids[1].1 < 0.0
        })
        .expect("the upright's half bridge is among the suggestions");
    assert!(
        pair.reason.contains("cancels temperature"),
        "{}",
        pair.reason
    );
    // The bracket is symmetric about the plane y = 0, where U1 and U2 sit; a side push (along
    // y) strains it antisymmetrically, so a grid along that plane reads almost nothing of it.
    assert!(
        pair.worst_leakage() < 1e-4 * pair.rated,
        "side push leaks {} of {} {}",
        pair.worst_leakage(),
        pair.rated,
        pair.unit
    );
    // The chooser's full-scale output is what the evaluation of the same bridge, as wired in
    // the plan, reads at the proof load (the rated value the chooser takes: 3 kN).
    let ev = evaluate(&p, &EvalOptions::default());
    let wired = &ev.parts[0].bridges[0];
    let proof = wired
        .cases
        .iter()
        .find(|c| c.case == "Proof load")
        .expect("the example has a proof load");
    assert!((pair.rated - 3000.0).abs() < 1e-9, "{}", pair.rated);
    let ratio = pair.full_scale_mv_per_v / proof.reading.mv_per_v;
    assert!((ratio - 1.0).abs() < 0.01, "{pair:?} against {proof:?}");
    for b in &ev.parts[0].bridges {
        let side = b
            .rejection
            .iter()
            .find(|r| r.component == LoadComponent::LateralForce)
            .expect("the side push is an unwanted load of the part");
        assert!(
            side.rejection_db > 60.0,
            "{}: {} dB",
            b.name,
            side.rejection_db
        );
        let down = b
            .sensitivities
            .iter()
            .find(|s| s.component == LoadComponent::VerticalForce)
            .unwrap();
        assert!(down.displayed_per_unit.abs() > 0.0, "{}", b.name);
    }
}
