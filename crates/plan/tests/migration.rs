//! Files of format version 1 open, evaluate exactly as before, and save as the current version.

use gw_plan::document::FORMAT_VERSION;
use gw_plan::evaluate::{EvalOptions, evaluate};
use gw_plan::{load_project, project_from_str, project_to_string};

fn v1_demo_path() -> std::path::PathBuf {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/data/winch_test_stand_v1.ron")
}

#[test]
fn the_version_1_demo_opens_and_evaluates_like_the_current_demo() {
    let text = std::fs::read_to_string(v1_demo_path()).unwrap();
    assert!(
        text.contains("format_version: 1"),
        "fixture must stay version 1"
    );
    let old = project_from_str(&text).unwrap();
    assert_eq!(old.format_version, FORMAT_VERSION);
    let options = EvalOptions::default();
    let a = evaluate(&old, &options);
    // Version 1 had no required accuracy; the current demo states some, which adds margins.
    // The current demo also has a rosette on the arm, read by three channels of its own: the
    // version 1 file predates it.
    let mut demo = gw_plan::demo::demo_project();
    for b in demo.parts.iter_mut().flat_map(|p| &mut p.bridges) {
        b.required_accuracy = None;
    }
    for part in &mut demo.parts {
        part.gauges.retain(|g| g.id != "R1");
        part.bridges.retain(|b| !b.name.starts_with("Rosette R1"));
    }
    demo.gauge_stock
        .retain(|s| s.spec.pattern != gw_bridge::GaugePattern::RectangularRosette);
    // The version-1 file holds the demo's ranges as changes from the reference, so once read
    // they are the demo's numbers plus the reference.
    let t_ref = demo.reference_temperature_c;
    for case in demo.parts.iter_mut().flat_map(|p| &mut p.load_cases) {
        let (lo, hi) = case.temperature_range_c;
        case.temperature_range_c = (lo + t_ref, hi + t_ref);
    }
    let b = evaluate(&demo, &options);
    assert_eq!(
        serde_json::to_string(&a).unwrap(),
        serde_json::to_string(&b).unwrap()
    );
    // Every gauge of the file found its data in the stock, and no typed bridge factor
    // differed from the computed one.
    assert_eq!(old.gauge_stock.len(), 3);
    assert!(
        old.parts
            .iter()
            .flat_map(|p| &p.bridges)
            .all(|b| b.bridge_factor_override.is_none())
    );
}

#[test]
fn a_version_1_file_saves_as_the_current_version_with_identical_evaluation() {
    let old = load_project(&v1_demo_path()).unwrap();
    let saved = project_to_string(&old).unwrap();
    assert!(saved.contains(&format!("format_version: {FORMAT_VERSION}")));
    let again = project_from_str(&saved).unwrap();
    assert_eq!(again, old);
    let options = EvalOptions::default();
    assert_eq!(
        serde_json::to_string(&evaluate(&old, &options)).unwrap(),
        serde_json::to_string(&evaluate(&again, &options)).unwrap()
    );
}

#[test]
fn a_typed_version_1_bridge_factor_that_differs_is_kept_with_its_reason() {
    let text = std::fs::read_to_string(v1_demo_path()).unwrap();
    // The first bridge's factor in the file is 4 (four active grids); type 3.5 instead.
    let first = text
        .find("bridge_factor: 4.0")
        .expect("fixture has a bridge factor of 4");
    let edited = format!(
        "{}bridge_factor: 3.5{}",
        &text[..first],
        &text[first + "bridge_factor: 4.0".len()..]
    );
    let p = project_from_str(&edited).unwrap();
    let o = p.parts[0].bridges[0]
        .bridge_factor_override
        .as_ref()
        .expect("a differing typed factor is kept");
    assert!((o.value - 3.5).abs() < 1e-12);
    assert!(o.reason.contains("version-1"));
    let ev = evaluate(&p, &EvalOptions::default());
    assert!((ev.parts[0].bridges[0].bridge_factor - 3.5).abs() < 1e-12);
}

#[test]
fn a_version_2_file_reads_its_temperature_changes_as_part_temperatures_and_evaluates_the_same() {
    // A version-2 file stored each case's range as changes from the reference: write the demo
    // that way and read it back.
    let demo = gw_plan::demo::demo_project();
    let t_ref = demo.reference_temperature_c;
    let mut old = demo.clone();
    old.format_version = 2;
    for case in old.parts.iter_mut().flat_map(|p| &mut p.load_cases) {
        let (lo, hi) = case.temperature_range_c;
        case.temperature_range_c = (lo - t_ref, hi - t_ref);
    }
    let text = project_to_string(&old).unwrap();
    assert!(text.contains("format_version: 2"));
    let read = project_from_str(&text).unwrap();
    assert_eq!(read.format_version, FORMAT_VERSION);
    for (a, b) in read
        .parts
        .iter()
        .flat_map(|p| &p.load_cases)
        .zip(demo.parts.iter().flat_map(|p| &p.load_cases))
    {
        assert!((a.temperature_range_c.0 - b.temperature_range_c.0).abs() < 1e-9);
        assert!((a.temperature_range_c.1 - b.temperature_range_c.1).abs() < 1e-9);
    }
    let options = EvalOptions::default();
    assert_eq!(
        serde_json::to_string(&evaluate(&read, &options)).unwrap(),
        serde_json::to_string(&evaluate(&demo, &options)).unwrap()
    );
}
