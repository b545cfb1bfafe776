//! The real app driven through its accessibility tree: open the demo, change a load, place,
//! move and turn a gauge, apply arrangements, undo and redo, save and reopen, open a broken
//! file, switch units.

use egui::accesskit::Role;
use egui_kittest::Harness;
use egui_kittest::kittest::Queryable;
use gw_app::app::{FileDialogs, GaugewrightApp};
use gw_app::settings::AppPaths;
use gw_app::state::DocumentState;
use gw_mechanics::LoadComponent;
use gw_plan::evaluate::{EvalOptions, UncertaintyDepth, evaluate};

fn app() -> GaugewrightApp {
    let mut a = GaugewrightApp::with_document(
        DocumentState::new(gw_plan::demo::demo_project(), None),
        AppPaths::default(),
        None,
    );
    a.dialogs = FileDialogs::TypedPath;
    a
}

fn harness() -> Harness<'static, GaugewrightApp> {
    let mut h = Harness::builder()
        .with_size(egui::vec2(1400.0, 900.0))
        .with_max_steps(16)
        .build_ui_state(|ui, app: &mut GaugewrightApp| app.frame_ui(ui), app());
    h.run();
    h
}

fn temp(name: &str) -> std::path::PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-app-ui-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    dir.join(name)
}

fn set_value(h: &mut Harness<'static, GaugewrightApp>, label: &str, text: &str) {
    h.get_by_role_and_label(Role::SpinButton, label).focus();
    h.run();
    h.get_by_role_and_label(Role::SpinButton, label)
        .type_text(text);
    h.run();
    h.key_press(egui::Key::Enter);
    h.run();
}

const PATH_FIELD: &str = "File path (type it; the desktop's file dialog is not available here):";

fn type_path(h: &mut Harness<'static, GaugewrightApp>, path: &std::path::Path) {
    h.get_by_role_and_label(Role::TextInput, PATH_FIELD).focus();
    h.run();
    h.get_by_role_and_label(Role::TextInput, PATH_FIELD)
        .type_text(&path.display().to_string());
    h.run();
}

/// Selects an item by clicking its row in the plan tree.
fn pick_in_tree(h: &mut Harness<'static, GaugewrightApp>, row: &str) {
    h.get_all_by_label(row)
        .find(|n| n.rect().left() < 280.0)
        .unwrap_or_else(|| panic!("no tree row {row}"))
        .click();
    h.run();
}

/// Opens a view by its tab in the menu bar.
fn open_view(h: &mut Harness<'static, GaugewrightApp>, tab: &str) {
    h.get_all_by_label(tab)
        .find(|n| n.rect().top() < 30.0)
        .unwrap_or_else(|| panic!("no tab {tab}"))
        .click();
    h.run();
}

fn vertical_force(h: &Harness<'static, GaugewrightApp>) -> f64 {
    h.state().doc.project.parts[0].load_cases[0].value(LoadComponent::VerticalForce)
}

fn menu(h: &mut Harness<'static, GaugewrightApp>, menu: &str, item: &str) {
    h.get_by_label(menu).click();
    h.run();
    h.get_by_label(item).click();
    h.run();
}

#[test]
fn opens_the_demo() {
    let h = harness();
    h.get_by_label("Reaction arm — beam");
    h.get_by_label("Drum drive shaft — round shaft");
    h.get_by_label_contains("none: every margin passes");
    h.get_by_role_and_label(Role::Button, "Gauge A1");
}

#[test]
fn changing_a_load_changes_the_displayed_output_by_the_amount_the_plan_predicts() {
    let mut h = harness();
    open_view(&mut h, "Results");
    h.get_by_label_contains("Rated pull: 1.3203 mV/V, displays 644.1 µε");
    pick_in_tree(&mut h, "Rated pull");
    set_value(&mut h, "Vertical force", "7000");
    assert_eq!(vertical_force(&h), 7000.0);
    // What the plan predicts for the edited project, formatted as the app shows it.
    let mut p = gw_plan::demo::demo_project();
    p.parts[0].load_cases[0].set_value(LoadComponent::VerticalForce, 7000.0);
    let ev = evaluate(
        &p,
        &EvalOptions {
            uncertainty: UncertaintyDepth::Off,
            ..EvalOptions::default()
        },
    );
    let r = &ev.parts[0].bridges[0].cases[0].reading;
    let expected = format!(
        "Rated pull: {:.4} mV/V, displays {:.1} µε",
        r.mv_per_v,
        r.displayed_strain * 1e6
    );
    assert!(expected != "Rated pull: 1.3203 mV/V, displays 644.1 µε");
    h.get_by_label_contains(&expected);
}

#[test]
fn add_move_and_rotate_a_gauge() {
    let mut h = harness();
    open_view(&mut h, "Face");
    let before = h.state().doc.project.parts[0].gauges.len();
    h.get_by_label("Add gauge").click();
    h.run();
    let gauges = &h.state().doc.project.parts[0].gauges;
    assert_eq!(gauges.len(), before + 1);
    let id = gauges[before].id.clone();
    let start = gauges[before].position;
    // Turn it by the button.
    h.get_by_label("Turn 15° left").click();
    h.run();
    let angle = h.state().doc.project.parts[0].gauges[before]
        .angle_rad
        .to_degrees();
    assert!((angle - 15.0).abs() < 1e-9, "{angle}");
    // Drag it 60 pixels to the right.
    let centre = h
        .get_by_role_and_label(Role::Button, &format!("Gauge {id}"))
        .rect()
        .center();
    h.hover_at(centre);
    h.run();
    h.drag_at(centre);
    h.run();
    for k in 1..=6 {
        h.hover_at(centre + egui::vec2(10.0 * k as f32, 0.0));
        h.run();
    }
    h.drop_at(centre + egui::vec2(60.0, 0.0));
    h.run();
    let moved = h.state().doc.project.parts[0].gauges[before].position;
    assert!(moved.x_m > start.x_m + 1e-3, "{start:?} → {moved:?}");
    assert_eq!(moved.face, start.face);
}

#[test]
fn apply_a_catalogue_arrangement_and_a_suggested_one() {
    let mut h = harness();
    open_view(&mut h, "Bridges");
    let gauges_before = h.state().doc.project.parts[0].gauges.len();
    h.get_by_label("Apply Bending pair, top and bottom").click();
    h.run();
    let doc = &h.state().doc;
    assert_eq!(
        doc.project.parts[0].bridges[0].arrangement,
        "Bending pair, top and bottom"
    );
    assert_eq!(doc.project.parts[0].gauges.len(), gauges_before + 2);
    // Two grids in a bending pair read twice the first grid's strain (computed, not typed).
    assert!((doc.evaluation.parts[0].bridges[0].bridge_factor - 2.0).abs() < 1e-6);
    // The Suggest button and its ranked list sit below the catalogue: scroll down to them as
    // a user would.
    h.get_by_label("Suggest arrangements").scroll_to_me();
    h.run();
    h.get_by_label("Suggest arrangements").click();
    h.run();
    h.get_by_label("Apply suggestion 1").scroll_to_me();
    h.run();
    h.get_by_label("Apply suggestion 1").click();
    h.run();
    let doc = &h.state().doc;
    assert_eq!(
        doc.project.parts[0].bridges[0].arrangement,
        "Suggested arrangement"
    );
    // The suggestion for vertical force with axial load present cancels the axial load.
    let ev = &doc.evaluation.parts[0].bridges[0];
    let axial = ev
        .rejection
        .iter()
        .find(|r| r.component == LoadComponent::AxialForce)
        .unwrap();
    assert!(axial.leakage_fraction < 1e-4, "{axial:?}");
}

#[test]
fn undo_and_redo() {
    let mut h = harness();
    pick_in_tree(&mut h, "Rated pull");
    set_value(&mut h, "Vertical force", "8000");
    assert_eq!(vertical_force(&h), 8000.0);
    assert!(h.state().doc.dirty);
    menu(&mut h, "Edit", "Undo");
    assert_eq!(vertical_force(&h), 6000.0);
    menu(&mut h, "Edit", "Redo");
    assert_eq!(vertical_force(&h), 8000.0);
    // And by the keyboard.
    h.key_press_modifiers(egui::Modifiers::COMMAND, egui::Key::Z);
    h.run();
    assert_eq!(vertical_force(&h), 6000.0);
}

#[test]
fn save_reopen_and_compare() {
    let mut h = harness();
    let path = temp("saved.ron");
    pick_in_tree(&mut h, "Rated pull");
    set_value(&mut h, "Vertical force", "6500");
    menu(&mut h, "File", "Save as…");
    type_path(&mut h, &path);
    h.get_by_label("Save").click();
    h.run();
    assert!(!h.state().doc.dirty);
    assert_eq!(h.state().doc.path.as_deref(), Some(path.as_path()));
    let saved = h.state().doc.project.clone();
    // Change it, then reopen the saved file (confirming the discard).
    set_value(&mut h, "Vertical force", "9999");
    menu(&mut h, "File", "Open…");
    h.get_by_label("Discard changes").click();
    h.run();
    type_path(&mut h, &path);
    h.get_by_label("Open").click();
    h.run();
    assert_eq!(h.state().doc.project, saved);
    assert_eq!(vertical_force(&h), 6500.0);
}

#[test]
fn a_broken_file_shows_why_and_leaves_the_project_intact() {
    let mut h = harness();
    let path = temp("broken.ron");
    std::fs::write(&path, "(format_version: 1, name: \"half a file\",").unwrap();
    let before = h.state().doc.project.clone();
    menu(&mut h, "File", "Open…");
    type_path(&mut h, &path);
    h.get_by_label("Open").click();
    h.run();
    h.get_by_label_contains("Could not open");
    h.get_by_label_contains("The open project is unchanged");
    assert_eq!(h.state().doc.project, before);
}

#[test]
fn switch_units() {
    let mut h = harness();
    let modulus = |h: &Harness<'static, GaugewrightApp>| {
        let text = h
            .get_by_role_and_label(Role::SpinButton, "Young's modulus")
            .value()
            .unwrap();
        text.split_whitespace()
            .next()
            .and_then(|v| v.parse::<f64>().ok())
            .unwrap()
    };
    assert!((modulus(&h) - 207.0).abs() < 1e-9);
    menu(&mut h, "Units", "US customary (in, lbf, psi, °F)");
    // 207 GPa = 30.02 Mpsi (NIST SP 811: 1 psi = 6 894.757 Pa), shown to the modulus's three
    // significant digits.
    assert!((modulus(&h) - 30.02).abs() < 0.05, "{}", modulus(&h));
    // The stored value is unchanged.
    assert_eq!(vertical_force(&h), 6000.0);
}

#[test]
fn raising_the_excitation_shows_a_failing_self_heating_margin_and_clicking_it_selects_the_bridge() {
    let mut h = harness();
    open_view(&mut h, "Bridges");
    pick_in_tree(&mut h, "Bridge Arm bending");
    set_value(&mut h, "Excitation", "10");
    let plan = &h.state().doc.project.parts[0].bridges[0];
    assert_eq!(
        plan.excitation,
        gw_bridge::Excitation::Voltage { volts: 10.0 }
    );
    let finding = "part \"Reaction arm\", bridge \"Arm bending\", Rated pull: grid power vs self-heating limit";
    h.get_by_label_contains(finding);
    // Select another bridge, then click the finding: the bridge at fault is selected again.
    h.get_by_label("Arm shear web").click();
    h.run();
    assert_eq!(h.state().doc.selection.bridge, Some(1));
    h.get_by_label_contains(finding).click();
    h.run();
    assert_eq!(h.state().doc.selection.bridge, Some(0));
}

#[test]
fn a_name_committed_by_clicking_another_tree_row_leaves_that_row_selected() {
    let mut h = harness();
    h.get_by_role_and_label(Role::TextInput, "Name").focus();
    h.run();
    h.get_by_role_and_label(Role::TextInput, "Name")
        .type_text(" (left)");
    h.run();
    pick_in_tree(&mut h, "Rated pull");
    let doc = &h.state().doc;
    assert_eq!(doc.project.parts[0].name, "Reaction arm (left)");
    assert_eq!(
        doc.selection.focus,
        Some(gw_plan::edit::Item::LoadCase { part: 0, case: 0 })
    );
}

#[test]
fn a_typed_bridge_factor_can_be_set_and_asks_for_its_reason() {
    let mut h = harness();
    pick_in_tree(&mut h, "Bridge Arm bending");
    h.get_by_role_and_label(Role::CheckBox, "Type the bridge factor")
        .click();
    h.run();
    let plan = &h.state().doc.project.parts[0].bridges[0];
    assert!(plan.bridge_factor_override.is_some(), "ticking applies");
    h.get_by_label_contains("typed without a reason");
    set_value(&mut h, "Bridge factor", "3.9");
    h.get_by_role_and_label(Role::TextInput, "Reason").focus();
    h.run();
    h.get_by_role_and_label(Role::TextInput, "Reason")
        .type_text("checked by a dead-weight calibration");
    h.run();
    h.key_press(egui::Key::Enter);
    h.run();
    let o = h.state().doc.project.parts[0].bridges[0]
        .bridge_factor_override
        .clone()
        .unwrap();
    assert!((o.value - 3.9).abs() < 1e-12);
    assert_eq!(o.reason, "checked by a dead-weight calibration");
    assert!(
        h.query_by_label_contains("typed without a reason")
            .is_none()
    );
    let ev = &h.state().doc.evaluation.parts[0].bridges[0];
    assert!((ev.bridge_factor - 3.9).abs() < 1e-12);
}

#[test]
fn the_delete_key_asks_before_deleting_a_gauge() {
    let mut h = harness();
    pick_in_tree(&mut h, "Gauge A1 (single grid)");
    let before = h.state().doc.project.clone();
    h.key_press(egui::Key::Delete);
    h.run();
    assert_eq!(
        h.state().doc.project,
        before,
        "nothing is deleted before the answer"
    );
    h.get_by_label("Delete it").click();
    h.run();
    assert_eq!(
        h.state().doc.project.parts[0].gauges.len(),
        before.parts[0].gauges.len() - 1
    );
}

#[test]
fn selecting_a_gauge_in_the_tree_shows_its_face_in_the_layout() {
    let mut h = harness();
    open_view(&mut h, "Face");
    // The layout opens on the top face: A2 (bottom face) is not drawn.
    assert!(
        h.query_by_role_and_label(Role::Button, "Gauge A2")
            .is_none()
    );
    pick_in_tree(&mut h, "Gauge A2 (single grid)");
    h.get_by_role_and_label(Role::Button, "Gauge A2");
    h.get_by_label_contains("A2 on the bottom face");
}
