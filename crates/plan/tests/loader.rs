//! The project file: round trip, the bundled demo, and every kind of broken file with its
//! exact message.

use gw_plan::demo::demo_project;
use gw_plan::io::{
    PlanError, backup_path, load_project, project_from_str, project_to_string, save_project,
};

fn demo_text() -> String {
    project_to_string(&demo_project()).unwrap()
}

#[test]
fn demo_round_trips_through_text() {
    let text = demo_text();
    let back = project_from_str(&text).unwrap();
    assert_eq!(back, demo_project());
}

#[test]
fn bundled_demo_file_is_the_demo_project() {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/../../assets/winch_test_stand.ron"
    );
    let text = std::fs::read_to_string(path).unwrap();
    assert_eq!(
        project_from_str(&text).unwrap(),
        demo_project(),
        "regenerate with `gaugewright demo --force assets/winch_test_stand.ron`"
    );
}

#[test]
fn syntax_error_names_line_and_column() {
    let text = demo_text().replacen(
        "  name: \"Winch test stand (demo)\",\n",
        "  name: \"Winch test stand (demo)\"\n",
        1,
    );
    let e = project_from_str(&text).unwrap_err();
    assert_eq!(
        e.to_string(),
        "line 4, column 3: Expected comma; correct the file or open its backup (.bak)"
    );
}

#[test]
fn wrong_type_names_line_and_column() {
    let text = demo_text().replacen(
        "reference_temperature_c: 20.0",
        "reference_temperature_c: \"warm\"",
        1,
    );
    let e = project_from_str(&text).unwrap_err();
    assert_eq!(
        e.to_string(),
        "line 10, column 27: Expected float; correct the file or open its backup (.bak)"
    );
}

#[test]
fn truncated_file_is_reported_not_panicked() {
    let text: String = demo_text().chars().take(500).collect();
    let e = project_from_str(&text).unwrap_err();
    assert!(matches!(e, PlanError::Syntax { .. }), "{e}");
    assert!(e.to_string().contains("cut short"), "{e}");
}

#[test]
fn value_out_of_range_names_the_part_and_the_value() {
    let text = demo_text().replacen("height_m: 0.06", "height_m: 0.0", 1);
    let e = project_from_str(&text).unwrap_err();
    assert_eq!(
        e.to_string(),
        "part \"Reaction arm\": section height must be greater than zero, got 0 mm; enter a positive dimension"
    );
}

#[test]
fn load_the_part_cannot_carry_is_named() {
    let text = demo_text().replacen("(VerticalForce, 6000.0)", "(Torque, 6000.0)", 1);
    let e = project_from_str(&text).unwrap_err();
    assert!(e.to_string().starts_with("part \"Reaction arm\" › load case \"Rated pull\": a beam carries no torque; use one of: axial force"), "{e}");
}

#[test]
fn unknown_format_version_says_which_versions_are_read() {
    let text = demo_text().replacen("format_version: 3", "format_version: 7", 1);
    let e = project_from_str(&text).unwrap_err();
    assert_eq!(
        e.to_string(),
        "format version 7 is not known to this Gaugewright, which reads versions 1 to 3; open it with a newer Gaugewright"
    );
}

#[test]
fn bridge_referring_to_a_missing_gauge_is_named() {
    let text = demo_text().replacen("gauge: \"A1\"", "gauge: \"A9\"", 1);
    let e = project_from_str(&text).unwrap_err();
    assert_eq!(
        e.to_string(),
        "part \"Reaction arm\" › bridge \"Arm bending\": arm 1 refers to gauge \"A9\", which is not on this part"
    );
}

#[test]
fn save_is_atomic_and_keeps_a_backup() {
    let dir = std::env::temp_dir().join(format!("gw-plan-save-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("plan.ron");
    let mut p = demo_project();
    save_project(&p, &path).unwrap();
    p.name = "second revision".into();
    save_project(&p, &path).unwrap();
    assert_eq!(load_project(&path).unwrap().name, "second revision");
    assert_eq!(
        load_project(&backup_path(&path)).unwrap().name,
        "Winch test stand (demo)"
    );
    assert!(!dir.join("plan.ron.tmp").exists());
}
