//! The "New project" dialog on its own, driven through its accessibility tree: pick a model,
//! enter a size, create; and a size the model refuses keeps "Create" from making anything.

use egui::accesskit::Role;
use egui_kittest::Harness;
use egui_kittest::kittest::Queryable;
use gw_app::panels::new_project::{NewProjectDialog, NewProjectOutcome};
use gw_app::units::Units;
use gw_mechanics::Member;

/// The dialog and the last thing it reported.
#[derive(Default)]
struct Host {
    dialog: NewProjectDialog,
    outcome: Option<NewProjectOutcome>,
}

fn harness() -> Harness<'static, Host> {
    let mut h = Harness::builder()
        .with_size(egui::vec2(900.0, 700.0))
        .build_ui_state(
            |ui, host: &mut Host| {
                if let Some(outcome) = host.dialog.ui(ui.ctx(), Units::Si) {
                    host.outcome = Some(outcome);
                }
            },
            Host::default(),
        );
    h.run();
    h
}

fn choose(h: &mut Harness<'static, Host>, label: &str, option: &str) {
    h.get_by_role_and_label(Role::ComboBox, label).click();
    h.run();
    h.get_by_label(option).click();
    h.run();
}

fn set_value(h: &mut Harness<'static, Host>, label: &str, text: &str) {
    h.get_by_role_and_label(Role::SpinButton, label).focus();
    h.run();
    h.get_by_role_and_label(Role::SpinButton, label)
        .type_text(text);
    h.run();
    h.key_press(egui::Key::Enter);
    h.run();
}

#[test]
fn choosing_a_shaft_and_its_diameter_creates_a_project_with_that_shaft() {
    let mut h = harness();
    choose(&mut h, "Model", "round shaft");
    set_value(&mut h, "Outer diameter", "80");
    h.get_by_role_and_label(Role::Button, "Create").click();
    h.run();
    let Some(NewProjectOutcome::Create(project)) = &h.state().outcome else {
        panic!("expected a new project, got {:?}", h.state().outcome);
    };
    let part = &project.parts[0];
    assert_eq!(part.name, "Part 1");
    assert_eq!(part.material_key.as_deref(), Some("carbon_steel"));
    let Member::Shaft(shaft) = &part.member else {
        panic!("expected a shaft, got {:?}", part.member);
    };
    assert!((shaft.outer_diameter_m - 0.080).abs() < 1e-12, "{shaft:?}");
}

#[test]
fn a_bore_larger_than_the_shaft_says_why_and_creates_nothing() {
    let mut h = harness();
    choose(&mut h, "Model", "round shaft");
    set_value(&mut h, "Bore diameter", "60");
    h.get_by_label_contains("must be smaller than");
    h.get_by_role_and_label(Role::Button, "Create").click();
    h.run();
    assert!(h.state().outcome.is_none(), "{:?}", h.state().outcome);
    h.get_by_role_and_label(Role::Button, "Cancel").click();
    h.run();
    assert!(matches!(h.state().outcome, Some(NewProjectOutcome::Cancel)));
}
