//! The reduction of a log against the demo plan: unit conversions, zero and span, rosettes
//! against a strain state pushed through the forward grid model, load recovery, calibration
//! from plateaus, and the shipped example files.

use approx::assert_relative_eq;
use gw_mechanics::transverse::{CALIBRATION_POISSON_RATIO, indicated_strain};
use gw_plan::demo::demo_project;
use gw_plan::document::Project;
use gw_plan::evaluate::{BridgeEvaluation, EvalOptions, Evaluation, UncertaintyDepth, evaluate};
use gw_reduce::calibration::{StepSource, calibrate_all, find_plateaus};
use gw_reduce::log::read_log;
use gw_reduce::reduction::{ReduceOptions, ZeroFrom, reduce};

fn quick(project: &Project) -> Evaluation {
    evaluate(
        project,
        &EvalOptions {
            uncertainty: UncertaintyDepth::Off,
            ..EvalOptions::default()
        },
    )
}

fn bridge<'e>(ev: &'e Evaluation, name: &str) -> &'e BridgeEvaluation {
    ev.parts
        .iter()
        .flat_map(|p| &p.bridges)
        .find(|b| b.name == name)
        .expect("demo bridge")
}

fn log_of(header: &str, rows: impl Iterator<Item = String>) -> gw_reduce::log::TestLog {
    let mut text = format!("{header}\n");
    for r in rows {
        text.push_str(&r);
        text.push('\n');
    }
    read_log(text.as_bytes()).expect("a valid log")
}

#[test]
fn the_same_signal_in_mv_per_v_volts_and_microstrain_reduces_alike() {
    let project = demo_project();
    let ev = quick(&project);
    let b = bridge(&ev, "Arm bending");
    // Volts: Vo = (mV/V) · Vex / 1000. Displayed µε: 4 (Vo/Vex) / (GF · bridge factor) · 10⁶.
    let to_v = b.excitation_v / 1000.0;
    let to_ue = 4000.0 / (b.gauge_factor_setting * b.bridge_factor);
    let reading = |i: usize| if i < 10 { 0.0 } else { 0.8 };
    let make = |unit: &str, scale: f64| {
        log_of(
            &format!("time [s],ch1 [{unit}]"),
            (0..30).map(move |i| format!("{},{}", i as f64 * 0.2, reading(i) * scale)),
        )
    };
    let opts = ReduceOptions::default();
    let mut results = Vec::new();
    for (unit, scale) in [
        ("mV/V", 1.0),
        ("V", to_v),
        ("mV", to_v * 1e3),
        ("µε", to_ue),
    ] {
        let r = reduce(&project, &ev, &make(unit, scale), &opts).expect("reduces");
        let ch = r
            .channel("Arm bending")
            .expect("ch1 is the arm bending bridge");
        results.push(ch.mv_per_v[25]);
    }
    for v in &results {
        assert_relative_eq!(*v, 0.8, max_relative = 1e-12);
    }
}

#[test]
fn the_zero_is_the_mean_of_the_first_second_or_the_recorded_one() {
    let mut project = demo_project();
    let ev = quick(&project);
    let log = log_of(
        "time [s],Arm bending [mV/V]",
        (0..40).map(|i| {
            let t = i as f64 * 0.1;
            let v = if t < 2.0 {
                0.05 + 0.001 * (i % 2) as f64
            } else {
                0.55
            };
            format!("{t},{v}")
        }),
    );
    let r = reduce(&project, &ev, &log, &ReduceOptions::default()).expect("reduces");
    let ch = r.channel("Arm bending").expect("matched by name");
    // Samples at 0.0 … 1.0 s: eleven, six of them 0.05 and five 0.051.
    assert_relative_eq!(ch.zero_mv_per_v, 0.05 + 0.001 * 5.0 / 11.0, epsilon = 1e-12);
    project.records.bridge_mut("Arm bending").zero_mv_per_v = Some(0.04);
    let opts = ReduceOptions {
        zero: ZeroFrom::Records,
    };
    let r = reduce(&project, &ev, &log, &opts).expect("reduces");
    let ch = r.channel("Arm bending").expect("matched");
    assert_relative_eq!(ch.mv_per_v[30], 0.51, epsilon = 1e-12);
}

#[test]
fn a_recorded_shunt_step_corrects_the_span_and_a_wrong_sign_does_not() {
    let mut project = demo_project();
    let ev = quick(&project);
    let expected = bridge(&ev, "Arm bending")
        .shunt
        .as_ref()
        .expect("planned")
        .expected_reading_strain;
    let log = log_of(
        "time [s],ch1 [mV/V]",
        (0..20).map(|i| format!("{},{}", i, if i < 2 { 0.0 } else { 1.0 })),
    );
    project.records.bridge_mut("Arm bending").shunt_step_strain = Some(expected * 0.98);
    let r = reduce(&project, &ev, &log, &ReduceOptions::default()).expect("reduces");
    let ch = r.channel("Arm bending").expect("matched");
    assert_relative_eq!(ch.span_factor, 1.0 / 0.98, max_relative = 1e-12);
    assert_relative_eq!(ch.mv_per_v[10], 1.0 / 0.98, max_relative = 1e-12);
    project.records.bridge_mut("Arm bending").shunt_step_strain = Some(-expected);
    let r = reduce(&project, &ev, &log, &ReduceOptions::default()).expect("reduces");
    assert_eq!(r.channel("Arm bending").expect("matched").span_factor, 1.0);
}

/// The rosette R1 of the demo under a strain state chosen here: each grid's indication from
/// the forward grid model (axial strain plus Kt times transverse strain, over 1 − ν0 Kt), logged
/// in µε; the reduction must give back the principal strains and angle of that state, worked
/// out with Mohr's circle.
#[test]
fn the_rosette_gives_back_a_known_state_through_the_transverse_sensitivity() {
    let project = demo_project();
    let ev = quick(&project);
    let kt = project
        .parts
        .iter()
        .flat_map(|p| project.placed_gauges(p))
        .find(|g| g.id == "R1")
        .expect("demo rosette")
        .spec
        .transverse_sensitivity;
    let (ex, ey, gxy) = (420e-6, -130e-6, 310e-6);
    let along = |deg: f64| {
        let t = deg.to_radians();
        (ex + ey) / 2.0 + (ex - ey) / 2.0 * (2.0 * t).cos() + gxy / 2.0 * (2.0 * t).sin()
    };
    let grid = |deg: f64| {
        indicated_strain(along(deg), along(deg + 90.0), kt, CALIBRATION_POISSON_RATIO)
            .expect("valid Kt")
    };
    let channels: Vec<u32> = [
        "Rosette R1, grid 1",
        "Rosette R1, grid 2",
        "Rosette R1, grid 3",
    ]
    .iter()
    .map(|n| bridge(&ev, n).channel_number)
    .collect();
    let header = format!(
        "time [s],ch{} [µε],ch{} [µε],ch{} [µε]",
        channels[0], channels[1], channels[2]
    );
    let values = [grid(0.0), grid(45.0), grid(90.0)].map(|e| e * 1e6);
    let log = log_of(
        &header,
        (0..5).map(|i| format!("{i},{},{},{}", values[0], values[1], values[2])),
    );
    let opts = ReduceOptions {
        zero: ZeroFrom::None,
    };
    let r = reduce(&project, &ev, &log, &opts).expect("reduces");
    let ro = r.rosettes.first().expect("R1 is read by three channels");
    let centre = (ex + ey) / 2.0;
    let radius = ((ex - ey) / 2.0_f64).hypot(gxy / 2.0);
    let angle = 0.5 * gxy.atan2(ex - ey);
    assert_relative_eq!(
        ro.measured.strain_1[2],
        centre + radius,
        max_relative = 1e-9
    );
    assert_relative_eq!(
        ro.measured.strain_2[2],
        centre - radius,
        max_relative = 1e-9
    );
    assert_relative_eq!(ro.measured.angle_rad[2], angle, epsilon = 1e-9);
    assert_relative_eq!(
        ro.measured.max_shear_strain[2],
        2.0 * radius,
        max_relative = 1e-9
    );
}

#[test]
fn loads_come_back_through_the_recovery_matrix() {
    let project = demo_project();
    let ev = quick(&project);
    let shaft = ev
        .parts
        .iter()
        .find(|p| p.name == "Drum drive shaft")
        .expect("demo part");
    let m = shaft.multi_axis.as_ref().expect("two bridges on the shaft");
    let torque = 1234.0;
    let moment = -321.0;
    let displayed = |b: &BridgeEvaluation| {
        b.sensitivities
            .iter()
            .map(|s| match s.component {
                gw_mechanics::LoadComponent::Torque => s.displayed_per_unit * torque,
                gw_mechanics::LoadComponent::BendingMomentY => s.displayed_per_unit * moment,
                _ => 0.0,
            })
            .sum::<f64>()
    };
    let header: Vec<String> = m.bridges.iter().map(|n| format!("{n} [µε]")).collect();
    let row: Vec<String> = m
        .bridges
        .iter()
        .map(|n| format!("{}", displayed(bridge(&ev, n)) * 1e6))
        .collect();
    let log = log_of(
        &format!("time [s],{}", header.join(",")),
        (0..3).map(|i| format!("{i},{}", row.join(","))),
    );
    let opts = ReduceOptions {
        zero: ZeroFrom::None,
    };
    let r = reduce(&project, &ev, &log, &opts).expect("reduces");
    let rec = r
        .recovered
        .iter()
        .find(|x| x.part == "Drum drive shaft")
        .expect("recovered");
    for (c, v) in rec.components.iter().zip(&rec.values) {
        let want = match c {
            gw_mechanics::LoadComponent::Torque => torque,
            gw_mechanics::LoadComponent::BendingMomentY => moment,
            other => panic!("unexpected component {other:?}"),
        };
        assert_relative_eq!(v[1], want, max_relative = 1e-9);
    }
}

#[test]
fn plateaus_are_found_between_ramps_despite_noise() {
    // Seven holds of 50 samples with 20-sample ramps between them, alternating ±0.3 % noise.
    let steps = [0.0, 1.0, 2.0, 3.0, 2.0, 1.0, 0.0];
    let mut v = Vec::new();
    for (k, s) in steps.iter().enumerate() {
        for i in 0..50 {
            v.push(s + if i % 2 == 0 { 0.003 } else { -0.003 });
        }
        if let Some(next) = steps.get(k + 1) {
            for i in 1..=20 {
                v.push(s + (next - s) * i as f64 / 21.0);
            }
        }
    }
    let p = find_plateaus(&v);
    assert_eq!(p.len(), steps.len(), "{p:?}");
    for (plateau, s) in p.iter().zip(steps) {
        assert!((plateau.mean - s).abs() < 0.002, "{plateau:?} against {s}");
    }
}

#[test]
fn unmatched_and_ambiguous_columns_are_explained() {
    let project = demo_project();
    let ev = quick(&project);
    let log = log_of(
        "time [s],ch1 [mV/V],spare [mV/V]",
        (0..3).map(|i| format!("{i},0,0")),
    );
    let r = reduce(&project, &ev, &log, &ReduceOptions::default()).expect("reduces");
    assert!(
        r.notes.iter().any(|n| n.contains("\"spare\"")),
        "{:?}",
        r.notes
    );
    let twice = log_of(
        "time [s],ch1 [mV/V],Arm bending [mV/V]",
        (0..3).map(|i| format!("{i},0,0")),
    );
    let e = reduce(&project, &ev, &twice, &ReduceOptions::default()).unwrap_err();
    assert!(e.to_string().contains("both name bridge"), "{e}");
    let load = log_of(
        "time [s],ch1 [mV/V],torsion [N·m]",
        (0..3).map(|i| format!("{i},0,0")),
    );
    let e = reduce(&project, &ev, &load, &ReduceOptions::default()).unwrap_err();
    assert!(e.to_string().contains("not a load component"), "{e}");
}

/// The shipped example files are those the demo writes: regenerate them with
/// `UPDATE_ASSETS=1 cargo test -p gw-reduce --test reduction` after changing the demo.
#[test]
fn the_shipped_example_files_match_the_demo() {
    let project = demo_project();
    let ev = evaluate(&project, &EvalOptions::default());
    let root = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../../assets");
    let files = [
        (
            "winch_checkout.csv",
            gw_reduce::example::example_records(&project, &ev),
        ),
        ("winch_first_test.csv", gw_reduce::example::example_log(&ev)),
    ];
    for (name, text) in files {
        let path = root.join(name);
        if std::env::var_os("UPDATE_ASSETS").is_some() {
            std::fs::write(&path, &text).expect("assets/ is writable");
        }
        let shipped = std::fs::read_to_string(&path).unwrap_or_default();
        assert!(
            shipped == text,
            "assets/{name} differs from what the demo writes; run UPDATE_ASSETS=1 cargo test \
             -p gw-reduce --test reduction"
        );
    }
}

/// The demo's example: every channel matched, every verdict a pass or a check, the rosette
/// near its prediction, the arm's vertical force recovered, and the two calibrations finding
/// the sensitivities the example installation was given (0.982 and 0.991 of the plan's).
#[test]
fn the_demo_example_reduces_and_calibrates() {
    let mut project = demo_project();
    let ev = evaluate(&project, &EvalOptions::default());
    let records_text = gw_reduce::example::example_records(&project, &ev);
    project.records =
        gw_reduce::records_csv::read_records(&records_text, &project).expect("example records");
    let ev = evaluate(&project, &EvalOptions::default());
    let checkout = gw_reduce::checkout::check_out(&project, &ev);
    assert!(!checkout.has_failures(), "{}", checkout.text());
    let checks: Vec<&str> = checkout
        .channels
        .iter()
        .filter(|c| c.verdict() == gw_reduce::checkout::Verdict::Check)
        .map(|c| c.bridge.as_str())
        .collect();
    assert_eq!(checks, ["Shaft bending", "Shell hoop, single grid"]);
    let log_text = gw_reduce::example::example_log(&ev);
    let log = read_log(log_text.as_bytes()).expect("example log");
    let r = reduce(&project, &ev, &log, &ReduceOptions::default()).expect("reduces");
    assert_eq!(r.channels.len(), 9);
    assert!(r.notes.is_empty(), "{:?}", r.notes);
    let ro = r.rosettes.first().expect("R1");
    let predicted = ro
        .predicted
        .as_ref()
        .expect("the log has the applied loads");
    // Averaged over the hold at 6 kN, where the noise of single samples averages out.
    let pull = &r
        .applied_load("Reaction arm", gw_mechanics::LoadComponent::VerticalForce)
        .expect("reference column")
        .values;
    let held: Vec<usize> = (0..pull.len()).filter(|&k| pull[k] > 5900.0).collect();
    let mean = |v: &[f64]| held.iter().map(|&k| v[k]).sum::<f64>() / held.len() as f64;
    assert!(held.len() > 50);
    assert_relative_eq!(
        mean(&ro.measured.strain_1),
        mean(&predicted.strain_1),
        max_relative = 0.01
    );
    assert_relative_eq!(
        mean(&ro.measured.angle_rad),
        mean(&predicted.angle_rad),
        epsilon = 0.01
    );
    let arm = r
        .recovered
        .iter()
        .find(|x| x.part == "Reaction arm")
        .expect("two bridges on the arm");
    let applied = r
        .applied_load("Reaction arm", gw_mechanics::LoadComponent::VerticalForce)
        .expect("reference column");
    let j = applied
        .values
        .iter()
        .enumerate()
        .max_by(|a, b| a.1.total_cmp(b.1))
        .map(|(j, _)| j)
        .expect("samples");
    assert_relative_eq!(arm.values[0][j], applied.values[j], max_relative = 0.03);
    let (fits, errors) = calibrate_all(&project, &ev, &r);
    assert!(errors.is_empty(), "{errors:?}");
    let fit = |name: &str| fits.iter().find(|f| f.bridge == name).expect("fitted");
    assert_relative_eq!(fit("Arm bending").ratio, 0.982, max_relative = 0.005);
    assert!(matches!(
        fit("Arm bending").source,
        StepSource::ReferenceColumn(_)
    ));
    assert_relative_eq!(fit("Drive torque").ratio, 0.991, max_relative = 0.005);
    assert_eq!(fit("Drive torque").source, StepSource::EnteredSteps);
    assert_eq!(fit("Drive torque").points.len(), 7);
    assert!(fit("Arm bending").hysteresis.is_some());
}

/// With the arm's two bridges calibrated in place, the recovered vertical force follows the
/// applied one (the example installation reads 1.8 % low on bending and 1.5 % high on shear,
/// which the predicted sensitivities alone cannot know).
#[test]
fn in_place_calibrations_carry_into_the_load_recovery() {
    let mut project = demo_project();
    let ev = evaluate(&project, &EvalOptions::default());
    let records_text = gw_reduce::example::example_records(&project, &ev);
    project.records =
        gw_reduce::records_csv::read_records(&records_text, &project).expect("example records");
    let ev = evaluate(&project, &EvalOptions::default());
    let log = read_log(gw_reduce::example::example_log(&ev).as_bytes()).expect("example log");
    let held_error = |project: &Project| {
        let ev = evaluate(project, &EvalOptions::default());
        let r = reduce(project, &ev, &log, &ReduceOptions::default()).expect("reduces");
        let arm = r
            .recovered
            .iter()
            .find(|x| x.part == "Reaction arm")
            .expect("arm");
        let applied = &r
            .applied_load("Reaction arm", gw_mechanics::LoadComponent::VerticalForce)
            .expect("reference")
            .values;
        let held: Vec<usize> = (0..applied.len())
            .filter(|&k| applied[k] > 5900.0)
            .collect();
        let mean = |v: &[f64]| held.iter().map(|&k| v[k]).sum::<f64>() / held.len() as f64;
        (mean(&arm.values[0]) - mean(applied)) / mean(applied)
    };
    let before = held_error(&project);
    assert!(
        before < -0.01,
        "the example reads low before calibration: {before}"
    );
    let r = reduce(&project, &ev, &log, &ReduceOptions::default()).expect("reduces");
    let (fits, _) = calibrate_all(&project, &ev, &r);
    for f in &fits {
        let fitted = f.as_plan_calibration("example log");
        for b in project.parts.iter_mut().flat_map(|p| &mut p.bridges) {
            if b.name == f.bridge {
                b.calibration = Some(fitted.clone());
            }
        }
    }
    let after = held_error(&project);
    assert!(after.abs() < 0.002, "after calibration: {after}");
}
