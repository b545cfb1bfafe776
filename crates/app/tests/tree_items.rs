//! The plan tree on the demo, driven through the accessibility tree: every kind of item can be
//! renamed, duplicated and deleted (with confirmation), and Edit → Undo brings back exactly the
//! project before; a dragged load case moves; a rejected value says why at its field; a name
//! typed into the inspector is kept key by key until Enter.

mod support;

use egui::accesskit::Role;
use egui_kittest::kittest::{NodeT, Queryable};
use gw_plan::Project;
use gw_plan::edit::{Item, item_name};
use support::*;

/// One row of the demo's plan tree and the item it stands for.
struct Row {
    label: &'static str,
    item: Item,
}

const PROJECT: Row = Row {
    label: "Project: Winch test stand (demo)",
    item: Item::Project,
};
const GAUGE_TYPE: Row = Row {
    label: "single grid, 3 mm, 350 Ω",
    item: Item::Stock(0),
};
const PART: Row = Row {
    label: "Reaction arm — beam",
    item: Item::Part(0),
};
const LOAD_CASE: Row = Row {
    label: "Rated pull",
    item: Item::LoadCase { part: 0, case: 0 },
};
const GAUGE: Row = Row {
    label: "Gauge A1 (single grid)",
    item: Item::Gauge { part: 0, gauge: 0 },
};
const BRIDGE: Row = Row {
    label: "Bridge Arm bending",
    item: Item::Bridge { part: 0, bridge: 0 },
};

fn demo_app() -> App {
    app_on(gw_plan::demo::demo_project())
}

fn project(h: &App) -> Project {
    h.state().doc.project.clone()
}

fn name_of(h: &App, item: Item) -> Option<String> {
    item_name(&h.state().doc.project, item)
}

/// Edit → Undo, then the project must be exactly `before`.
fn undo_restores(h: &mut App, before: &Project, what: &str) {
    menu(h, "Edit", "Undo");
    assert!(h.state().doc.project == *before, "undo after {what}");
}

/// Types a new name into the tree's rename field (already open) and presses Enter.
fn type_new_name(h: &mut App, name: &str) {
    assert!(
        h.query_all_by_role(Role::TextInput).any(|f| f.is_focused()),
        "the rename field is open and has the keyboard"
    );
    replace_focused_text(h, name);
    h.key_press(egui::Key::Enter);
    h.run();
}

/// Selects `row`, renames it with the Rename button and checks the new name.
fn rename_with_button(h: &mut App, row: &Row, name: &str) {
    select(h, row.label);
    press(h, "Rename");
    type_new_name(h, name);
    assert_eq!(name_of(h, row.item).as_deref(), Some(name), "{}", row.label);
}

fn delete_with_confirmation(h: &mut App, row: &Row) {
    select(h, row.label);
    press(h, "Delete");
    h.get_by_role_and_label(Role::Window, "Delete");
    press(h, "Delete it");
}

#[test]
fn renaming_each_kind_of_item_then_undo_restores_the_project() {
    let mut h = demo_app();
    let before = project(&h);
    for (row, name) in [
        (&PROJECT, "Winch stand, rev B"),
        (&PART, "Reaction arm, left"),
        (&GAUGE, "TOP1"),
        (&BRIDGE, "Arm vertical load"),
    ] {
        rename_with_button(&mut h, row, name);
        undo_restores(&mut h, &before, &format!("renaming {}", row.label));
    }

    // A gauge type's new name follows into every gauge of that type.
    rename_with_button(&mut h, &GAUGE_TYPE, "Foil, 3 mm, 350 Ω");
    assert_eq!(
        h.state().doc.project.parts[0].gauges[0].stock,
        "Foil, 3 mm, 350 Ω"
    );
    undo_restores(&mut h, &before, "renaming the gauge type");

    // F2 renames the selected item.
    select(&mut h, LOAD_CASE.label);
    h.key_press(egui::Key::F2);
    h.run();
    type_new_name(&mut h, "Rated pull, 6 kN");
    assert_eq!(
        name_of(&h, LOAD_CASE.item).as_deref(),
        Some("Rated pull, 6 kN")
    );
    undo_restores(&mut h, &before, "renaming a load case with F2");
}

/// Two clicks on `row` in one frame. The harness gives every queued event a frame of its own,
/// a quarter of a second apart, which is too slow for a double-click.
fn double_click(h: &mut App, row: &str) {
    let at = tree_row(h, row).rect().center();
    let button = |pressed| egui::Event::PointerButton {
        pos: at,
        button: egui::PointerButton::Primary,
        pressed,
        modifiers: egui::Modifiers::NONE,
    };
    let events = [
        egui::Event::PointerMoved(at),
        button(true),
        button(false),
        button(true),
        button(false),
    ];
    h.input_mut().events.extend(events);
    h.run();
}

#[test]
fn double_clicking_a_row_renames_it() {
    let mut h = demo_app();
    let before = project(&h);
    double_click(&mut h, BRIDGE.label);
    type_new_name(&mut h, "Arm vertical load");
    assert_eq!(
        name_of(&h, BRIDGE.item).as_deref(),
        Some("Arm vertical load")
    );
    undo_restores(&mut h, &before, "renaming by double-click");
}

#[test]
fn duplicating_each_kind_of_item_then_undo_restores_the_project() {
    let mut h = demo_app();
    let before = project(&h);
    for (row, copy) in [
        (&GAUGE_TYPE, Item::Stock(1)),
        (&PART, Item::Part(1)),
        (&LOAD_CASE, Item::LoadCase { part: 0, case: 1 }),
        (&GAUGE, Item::Gauge { part: 0, gauge: 1 }),
        (&BRIDGE, Item::Bridge { part: 0, bridge: 1 }),
    ] {
        select(&mut h, row.label);
        press(&mut h, "Duplicate");
        let original = item_name(&before, row.item).unwrap();
        let copied = name_of(&h, copy).unwrap();
        assert_ne!(
            copied, original,
            "the copy of {} has its own name",
            row.label
        );
        assert_eq!(
            h.state().doc.selection.inspected(),
            copy,
            "the copy of {} is selected",
            row.label
        );
        undo_restores(&mut h, &before, &format!("duplicating {}", row.label));
    }
}

#[test]
fn deleting_each_kind_of_item_asks_first_then_undo_restores_the_project() {
    let mut h = demo_app();
    let before = project(&h);
    for row in [&PART, &LOAD_CASE, &GAUGE, &BRIDGE] {
        delete_with_confirmation(&mut h, row);
        assert_eq!(
            siblings(&project(&h), row.item),
            siblings(&before, row.item) - 1,
            "{}",
            row.label
        );
        undo_restores(&mut h, &before, &format!("deleting {}", row.label));
    }
}

/// How many items of the same kind sit beside `item` (itself included).
fn siblings(p: &Project, item: Item) -> usize {
    match item {
        Item::Project => 1,
        Item::Stock(_) => p.gauge_stock.len(),
        Item::Part(_) => p.parts.len(),
        Item::LoadCase { part, .. } => p.parts[part].load_cases.len(),
        Item::Gauge { part, .. } => p.parts[part].gauges.len(),
        Item::Bridge { part, .. } => p.parts[part].bridges.len(),
    }
}

#[test]
fn a_gauge_type_in_use_is_kept_with_the_reason_and_an_unused_copy_can_be_deleted() {
    let mut h = demo_app();
    let before = project(&h);
    delete_with_confirmation(&mut h, &GAUGE_TYPE);
    assert!(h.state().doc.project == before);
    h.get_by_label_contains("give them another type first");

    select(&mut h, GAUGE_TYPE.label);
    press(&mut h, "Duplicate");
    let with_copy = project(&h);
    let copy = name_of(&h, Item::Stock(1)).unwrap();
    select(&mut h, &copy);
    press(&mut h, "Delete");
    press(&mut h, "Delete it");
    assert_eq!(project(&h).gauge_stock, before.gauge_stock);
    undo_restores(&mut h, &with_copy, "deleting the unused copy");
    undo_restores(&mut h, &before, "duplicating the gauge type");
}

#[test]
fn the_project_header_cannot_be_deleted_or_duplicated_and_keep_it_keeps_an_item() {
    let mut h = demo_app();
    let before = project(&h);
    select(&mut h, PROJECT.label);
    for button in ["Delete", "Duplicate"] {
        assert!(
            h.get_by_role_and_label(Role::Button, button)
                .accesskit_node()
                .is_disabled(),
            "{button} is offered for the project header"
        );
    }
    select(&mut h, PART.label);
    press(&mut h, "Delete");
    press(&mut h, "Keep it");
    assert!(h.state().doc.project == before);
    assert!(h.query_by_role_and_label(Role::Window, "Delete").is_none());
}

/// Drags the row `from` onto the row `to` with the mouse.
fn drag_row(h: &mut App, from: &str, to: &str) {
    let start = tree_row(h, from).rect().center();
    let end = tree_row(h, to).rect().center();
    h.hover_at(start);
    h.run();
    h.drag_at(start);
    h.run();
    for k in 1..=8 {
        h.hover_at(start + (end - start) * (k as f32 / 8.0));
        h.run();
    }
    h.drop_at(end);
    h.run();
}

#[test]
fn dragging_a_load_case_onto_another_moves_it_and_undo_puts_it_back() {
    let mut h = demo_app();
    let before = project(&h);
    drag_row(&mut h, "Rated pull", "Proof pull");
    let names: Vec<String> = project(&h).parts[0]
        .load_cases
        .iter()
        .map(|c| c.name.clone())
        .collect();
    assert_eq!(names, ["Proof pull", "Rated pull"]);
    undo_restores(&mut h, &before, "dragging a load case");
}

#[test]
fn a_rejected_section_height_shows_the_reason_at_the_field_and_changes_nothing() {
    let mut h = demo_app();
    let before = project(&h);
    select(&mut h, PART.label);
    set_number(&mut h, "Section height", "0");
    let reason = h.get_by_label_contains("section height must be greater than zero");
    let text = reason.accesskit_node().value().unwrap_or_default();
    assert!(text.starts_with("Not applied:"), "{text}");
    assert!(h.state().doc.project == before);
    assert!(!h.state().doc.can_undo());
}

/// Regression: a one-line inspector field was drawn afresh from the project every frame, so
/// what was typed vanished before Enter could commit it.
#[test]
fn an_inspector_name_field_keeps_each_key_typed_until_enter() {
    let mut h = demo_app();
    select(&mut h, GAUGE.label);
    control(&h, Look::Inspector, Role::TextInput, "Id").focus();
    h.run();
    h.key_press_modifiers(egui::Modifiers::COMMAND, egui::Key::A);
    for key in ["T", "O", "P", "1"] {
        h.event(egui::Event::Text(key.to_owned()));
        h.run();
    }
    h.key_press(egui::Key::Enter);
    h.run();
    let part = &h.state().doc.project.parts[0];
    assert_eq!(part.gauges[0].id, "TOP1");
    // The bridge arm that used A1 follows the new id.
    assert_eq!(
        part.bridges[0].arms[0],
        gw_plan::PlanArm::Grid {
            gauge: "TOP1".into(),
            grid: 1
        }
    );
}
