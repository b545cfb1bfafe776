//! The whole-plan evaluation of the demo and the command line.

use gw_plan::cli::{check, eval_json};
use gw_plan::demo::demo_project;
use gw_plan::evaluate::{EvalOptions, UncertaintyDepth, evaluate};

#[test]
fn demo_evaluates_without_errors_or_failed_margins() {
    let ev = evaluate(&demo_project(), &EvalOptions::default());
    assert!(!ev.has_failures(), "{:#?}", ev.findings);
    assert_eq!(ev.parts.len(), 3);
    let bridges: usize = ev.parts.iter().map(|p| p.bridges.len()).sum();
    assert_eq!(bridges, 9);
    let project = demo_project();
    for part in &ev.parts {
        for b in &part.bridges {
            assert_eq!(b.cases.len(), 2);
            // The rosette's grids sit in quarter bridges of their own: each reports its grid's
            // whole strain (every load, and the apparent strain of the proof case's temperature
            // change), not one load, so the bound below is for the load bridges only.
            let strain_channel = project.parts[part.part_index].bridges.iter().any(|p| {
                p.name == b.name && p.recovery == gw_plan::document::LoadRecovery::LeftOut
            });
            for c in &b.cases {
                assert!(c.reading.displayed_strain.is_finite());
                if strain_channel {
                    continue;
                }
                // The instrument is set so it displays the first grid's strain from the wanted
                // load; in the invented demo the error sources stay below 15 % of it (a bound
                // for this demo, not a published value).
                let rel = (c.reading.displayed_strain - c.reading.target_strain).abs()
                    / c.reading.target_strain.abs();
                assert!(rel < 0.15, "{} {}: {rel}", b.name, c.case);
            }
            assert!(b.uncertainty.is_some());
        }
    }
    // The shaft has torque and bending bridges: the multi-bridge matrix separates them.
    let shaft = &ev.parts[1];
    let m = shaft.multi_axis.as_ref().unwrap();
    assert!(m.condition_number < 1.1, "{}", m.condition_number);
}

#[test]
fn a_failing_margin_gives_status_one_and_says_so() {
    let mut p = demo_project();
    // Raise the excitation until the grids overheat.
    for part in &mut p.parts {
        for b in &mut part.bridges {
            b.excitation = gw_bridge::Excitation::Voltage { volts: 10.0 };
        }
    }
    let dir = std::env::temp_dir().join(format!("gw-plan-cli-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("hot.ron");
    gw_plan::save_project(&p, &path).unwrap();
    let out = check(&path);
    assert_eq!(out.code, 1);
    assert!(
        out.stdout
            .contains("FAIL: part \"Reaction arm\", bridge \"Arm bending\""),
        "{}",
        out.stdout
    );
    assert!(out.stdout.contains("grid power vs self-heating limit"));
}

#[test]
fn check_and_eval_of_the_demo() {
    let dir = std::env::temp_dir().join(format!("gw-plan-eval-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("demo.ron");
    assert_eq!(gw_plan::cli::write_demo(&path, true).code, 0);
    let c = check(&path);
    assert_eq!(c.code, 0, "{}", c.stdout);
    assert!(c.stdout.contains("not a certification of safety"));
    let e = eval_json(&path, false);
    assert_eq!(e.code, 0, "{}", e.stderr);
    assert!(e.stdout.contains("\"displayed_strain\""));
    assert!(e.stdout.contains("\"mv_per_v\""));
    assert!(e.stdout.contains("\"combined\""));
    assert!(e.stdout.contains("\"temperature\""));
}

#[test]
fn broken_file_gives_status_two() {
    let dir = std::env::temp_dir().join(format!("gw-plan-broken-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("broken.ron");
    std::fs::write(&path, "(format_version: 1, name: ").unwrap();
    let out = check(&path);
    assert_eq!(out.code, 2);
    assert!(out.stderr.starts_with("error: "), "{}", out.stderr);
}

#[test]
fn monte_carlo_is_available_on_request() {
    let mut p = demo_project();
    p.parts.truncate(1);
    p.parts[0].bridges.truncate(1);
    let ev = evaluate(
        &p,
        &EvalOptions {
            uncertainty: UncertaintyDepth::GumAndMonteCarlo,
            monte_carlo_trials: 2000,
            ..EvalOptions::default()
        },
    );
    let u = ev.parts[0].bridges[0].uncertainty.as_ref().unwrap();
    assert_eq!(u.monte_carlo.trials, 2000);
    assert!(u.monte_carlo.standard_deviation > 0.0);
}

#[test]
fn a_load_case_beyond_the_thermal_output_curve_is_reported_at_the_gauge() {
    use gw_plan::evaluate::{Severity, Target};
    let mut p = gw_plan::demo::demo_project();
    let ev = evaluate(&p, &EvalOptions::default());
    assert!(
        !ev.findings
            .iter()
            .any(|f| f.message.contains("extrapolated"))
    );
    // The demo's cases run from −10 to +40 °C about 20 °C, i.e. 10 to 60 °C; a curve measured
    // from 15 °C up leaves the cold end uncovered.
    p.gauge_stock[0].spec.thermal_output.valid_range_c = Some((15.0, 120.0));
    let ev = evaluate(&p, &EvalOptions::default());
    let f = ev
        .findings
        .iter()
        .find(|f| f.message.contains("extrapolated"))
        .expect("a finding for the uncovered range");
    assert_eq!(f.severity, Severity::Warn);
    assert!(
        matches!(f.target, Target::Gauge { part: 0, gauge: 0 }),
        "{f:?}"
    );
}

#[test]
fn a_bridge_that_does_not_respond_to_its_wanted_load_fails_and_is_still_evaluated() {
    // The demo's bending bridge (four grids, top and bottom, in a full bridge) cancels axial
    // force by its arrangement; asked to measure the axial force of the load cases it shows
    // nothing, which must fail the check rather than pass every margin.
    let mut p = demo_project();
    p.parts[0].bridges[0].wanted = gw_mechanics::LoadComponent::AxialForce;
    // With the uncertainty budget on, as the app evaluates.
    let ev = evaluate(
        &p,
        &EvalOptions {
            uncertainty: UncertaintyDepth::Gum,
            ..EvalOptions::default()
        },
    );
    let fail = ev
        .findings
        .iter()
        .find(|f| f.message.contains("does not respond to the axial force"))
        .expect("a finding that the bridge does not respond");
    assert_eq!(fail.severity, gw_plan::evaluate::Severity::Fail);
    // The rest of the bridge is still there: readings, shunt, channel.
    let b = &ev.parts[0].bridges[0];
    assert!(b.shunt.is_some());
    assert!(!b.cases.is_empty() && b.channel.resolution_strain > 0.0);
    let dir = std::env::temp_dir().join(format!("gw-plan-deaf-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("deaf.ron");
    gw_plan::save_project(&p, &path).unwrap();
    let out = check(&path);
    assert_eq!(out.code, 1, "{}", out.stdout);
    assert!(out.stdout.contains("shunt"), "{}", out.stdout);
    // The demo as given responds to what each bridge measures.
    let ok = evaluate(&demo_project(), &EvalOptions::default());
    assert!(!ok.findings.iter().any(|f| f.message.contains("respond")));
}
