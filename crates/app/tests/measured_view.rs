//! After bonding, driven through the accessibility tree as a user would: the demo's example
//! check-out records and first-test log imported from the File menu, the verdicts in the plan
//! tree and the Measured view, a channel's records edited in the inspector, the rosette table,
//! and the fitted sensitivity put into the channel list and taken back with Undo.

mod support;

use egui::accesskit::Role;
use egui_kittest::kittest::Queryable;

use gw_plan::evaluate::{EvalOptions, evaluate};
use gw_reduce::example::{example_log, example_records};
use support::*;

/// The demo's example records and log written to a fresh folder: (records, log).
fn example_files(test: &str) -> (std::path::PathBuf, std::path::PathBuf) {
    let project = gw_plan::demo::demo_project();
    let ev = evaluate(&project, &EvalOptions::default());
    let dir = temp_dir(test);
    let records = dir.join("winch_checkout.csv");
    let log = dir.join("winch_first_test.csv");
    std::fs::write(&records, example_records(&project, &ev)).unwrap();
    std::fs::write(&log, example_log(&ev)).unwrap();
    (records, log)
}

/// File → `item`, then the typed path and the Import button.
fn import(h: &mut App, item: &str, path: &std::path::Path) {
    menu(h, "File", item);
    control(h, Look::Anywhere, Role::TextInput, PATH_FIELD).focus();
    h.run();
    replace_focused_text(h, &path.display().to_string());
    press(h, "Import");
}

fn has_label(h: &App, text: &str) -> bool {
    h.query_all_by_label(text).next().is_some()
}

/// Opens Results › Measured.
fn open_measured(h: &mut App) {
    h.get_all_by_label("Results")
        .find(|n| n.rect().top() < 30.0)
        .expect("the Results tab in the menu bar")
        .click();
    h.run();
    h.get_by_label("Measured").click();
    h.run();
}

#[test]
fn imported_records_show_their_verdicts_in_the_tree_and_undo_takes_them_back() {
    let (records, _) = example_files("records");
    let mut h = app_on(gw_plan::demo::demo_project());
    let before = h.state().doc.project.clone();
    assert!(
        has_label(&h, "not recorded"),
        "before the import nothing is recorded"
    );
    import(&mut h, "Import check-out records…", &records);
    let project = &h.state().doc.project;
    assert!(!project.records.grids.is_empty() && !project.records.bridges.is_empty());
    // Each channel of the demo is a row of the tree with its verdict in words; the example
    // imagines one grid with low insulation (P2, 0.45 GΩ), so some channel is not a pass.
    let tree = h.get_by_role_and_label(Role::GenericContainer, "Plan tree");
    for bridge in &project.parts[0].bridges {
        let row = format!("ch{} {}", bridge.channel, bridge.name);
        assert!(tree.query_by_label(&row).is_some(), "tree row {row}");
    }
    assert!(has_label(&h, "pass"));
    assert!(has_label(&h, "check") || has_label(&h, "FAIL"));
    assert!(!has_label(&h, "not recorded"), "every channel has records");
    menu(&mut h, "Edit", "Undo");
    assert!(
        h.state().doc.project == before,
        "undo takes the import back"
    );
}

#[test]
fn a_broken_records_file_names_its_line_and_leaves_the_project_alone() {
    let dir = temp_dir("broken-records");
    let path = dir.join("broken.csv");
    std::fs::write(
        &path,
        "kind,item,grid,resistance_ohm\ngrid,A1,1,three hundred fifty\n",
    )
    .unwrap();
    let mut h = app_on(gw_plan::demo::demo_project());
    let before = h.state().doc.project.clone();
    import(&mut h, "Import check-out records…", &path);
    let notice = h
        .state()
        .doc
        .notice
        .clone()
        .expect("the import says why it failed");
    assert!(notice.is_error);
    assert!(notice.text.contains("line"), "{}", notice.text);
    assert!(notice.text.contains("unchanged"), "{}", notice.text);
    assert!(h.state().doc.project == before);
}

#[test]
fn a_channel_record_typed_in_the_inspector_is_one_undo_step() {
    let mut h = app_on(gw_plan::demo::demo_project());
    let bridge = h.state().doc.project.parts[0].bridges[0].clone();
    let row = format!("ch{} {}", bridge.channel, bridge.name);
    // The check-out entries stand below the parts: scroll the tree down to them.
    tree_row(&h, &row).scroll_to_me();
    h.run();
    select(&mut h, &row);
    set_text(&mut h, "Zero (mV/V)", "0.0123");
    let zero = |h: &App| {
        h.state()
            .doc
            .project
            .records
            .bridge(&bridge.name)
            .and_then(|r| r.zero_mv_per_v)
    };
    assert_eq!(zero(&h), Some(0.0123));
    // A word where a number belongs is refused at its field, with the way out.
    set_text(&mut h, "Zero (mV/V)", "twelve");
    assert!(has_label(
        &h,
        "Not applied: \"twelve\" is not a number; type a plain number in mV/V or leave the field empty for \"not measured\""
    ));
    assert_eq!(zero(&h), Some(0.0123));
    menu(&mut h, "Edit", "Undo");
    assert_eq!(zero(&h), None);
}

#[test]
fn the_measured_view_shows_the_log_against_the_plan_and_the_fit_goes_into_the_channel_list() {
    let (records, log) = example_files("measured");
    let mut h = app_on(gw_plan::demo::demo_project());
    import(&mut h, "Import check-out records…", &records);
    import(&mut h, "Import test log…", &log);
    let state = h.state();
    assert_eq!(
        state.doc.project.records.log_path.as_deref(),
        Some(log.display().to_string().as_str())
    );
    assert!(state.doc.measured.log.is_some(), "{:?}", state.doc.notice);
    let reduction = state
        .doc
        .measured
        .derived
        .reduction
        .as_ref()
        .expect("reduced");
    let rosette = reduction
        .rosettes
        .first()
        .expect("the demo's rosette")
        .gauge
        .clone();
    let fit = state
        .doc
        .measured
        .derived
        .fits
        .first()
        .expect("a fit")
        .clone();
    open_measured(&mut h);
    assert!(has_label(&h, "Channel"));
    // The rosette table: one row per principal value, measured against predicted.
    assert!(has_label(&h, "Angle of ε1 from grid 1"));
    assert!(has_label(&h, "Angle of ε1 from the part's axis"));
    assert!(
        h.query_all_by_label_contains("µε").next().is_some(),
        "strains are shown in µε"
    );
    assert!(
        h.query_all_by_label_contains("NaN").next().is_none(),
        "no NaN shown"
    );
    assert!(has_label(&h, &rosette) || h.query_all_by_label_contains(&rosette).next().is_some());
    // The fitted sensitivity replaces the predicted one; Undo brings the predicted one back.
    let (part, bridge) =
        gw_app::panels::tree::bridge_index(&h.state().doc.project, &fit.part, &fit.bridge)
            .expect("the fitted bridge is in the plan");
    let calibration = |h: &App| {
        h.state().doc.project.parts[part].bridges[bridge]
            .calibration
            .clone()
    };
    assert!(calibration(&h).is_none());
    press(&mut h, "Use the fitted sensitivity in the channel list");
    let c = calibration(&h).expect("the fit is stored in the plan");
    assert!(
        (c.load_per_mv_per_v - 1.0 / fit.sensitivity).abs() <= 1e-9 * c.load_per_mv_per_v.abs()
    );
    menu(&mut h, "Edit", "Undo");
    assert!(calibration(&h).is_none(), "undo clears the calibration");
}

#[test]
fn a_project_whose_log_is_missing_opens_without_it_and_says_so() {
    let dir = temp_dir("missing-log");
    let mut project = gw_plan::demo::demo_project();
    project.records.log_path = Some("gone.csv".into());
    let path = dir.join("stand.ron");
    gw_plan::save_project(&project, &path).unwrap();
    let mut h = app_on(gw_plan::demo::demo_project());
    h.state_mut().open_path(&path);
    h.run();
    let doc = &h.state().doc;
    assert_eq!(
        doc.path.as_deref(),
        Some(path.as_path()),
        "the project opened"
    );
    assert!(doc.measured.log.is_none());
    let notice = doc.notice.clone().expect("a notice");
    assert!(
        notice.is_error && notice.text.contains("Import test log"),
        "{}",
        notice.text
    );
}
