//! Driving the real app through its accessibility tree, as a user would: find a control by the
//! label in front of it, click, type, pick from a drop-down, use the plan tree and the menus.
//! Each test file uses a part of these helpers.
#![allow(dead_code)]

use egui::accesskit::{Role, Toggled};
use egui_kittest::kittest::{NodeT, Queryable};
use egui_kittest::{Harness, Node};
use gw_app::app::{FileDialogs, GaugewrightApp};
use gw_app::settings::AppPaths;
use gw_app::state::DocumentState;

/// The app in a test harness.
pub type App = Harness<'static, GaugewrightApp>;

/// The label of the typed-path field of the open and save dialogs.
pub const PATH_FIELD: &str =
    "File path (type it; the desktop's file dialog is not available here):";

/// The app on `project`, with typed-path file dialogs, one frame drawn.
pub fn app_on(project: gw_plan::Project) -> App {
    let mut app =
        GaugewrightApp::with_document(DocumentState::new(project, None), AppPaths::default(), None);
    app.dialogs = FileDialogs::TypedPath;
    let mut h = Harness::builder()
        .with_size(egui::vec2(1400.0, 900.0))
        // A grid shown for the first time (another item in the inspector) takes a few
        // frames to settle its column widths.
        .with_max_steps(12)
        .build_ui_state(|ui, app: &mut GaugewrightApp| app.frame_ui(ui), app);
    h.run();
    h
}

/// The open dialog window, if any: while it is open, the user is answering it.
fn dialog(h: &App) -> Option<Node<'_>> {
    h.query_all_by_role(Role::Window)
        .find(|w| w.accesskit_node().label().is_some_and(|l| !l.is_empty()))
}

/// A named region of the window: "Inspector" or "Plan tree".
fn region<'a>(h: &'a App, name: &'a str) -> Node<'a> {
    h.get_by_role_and_label(Role::GenericContainer, name)
}

/// Where a control is looked for when no dialog is open (a dialog, while open, is where the
/// user looks).
#[derive(Debug, Clone, Copy)]
pub enum Look {
    /// Anywhere in the window.
    Anywhere,
    /// In the inspector.
    Inspector,
}

/// The control of `role` labelled `label`.
pub fn control<'a>(h: &'a App, look: Look, role: Role, label: &'a str) -> Node<'a> {
    let within = dialog(h).unwrap_or_else(|| match look {
        Look::Anywhere => h.root(),
        Look::Inspector => region(h, "Inspector"),
    });
    within.get_by_role_and_label(role, label)
}

/// Scrolls a control into view and clicks it.
fn scroll_and_click(h: &mut App, look: Look, role: Role, label: &str) {
    control(h, look, role, label).scroll_to_me();
    h.run();
    control(h, look, role, label).click();
    h.run();
}

/// Clicks the button labelled `label`.
pub fn press(h: &mut App, label: &str) {
    scroll_and_click(h, Look::Anywhere, Role::Button, label);
}

/// An entry of the open menu or drop-down list.
fn popup_entry<'a>(h: &'a App, label: &'a str) -> Node<'a> {
    [Role::Menu, Role::ListBox]
        .into_iter()
        .flat_map(|role| h.query_all_by_role(role))
        .find_map(|popup| popup.query_by_label(label))
        .unwrap_or_else(|| panic!("no open menu or list offers \"{label}\""))
}

/// Clicks `item` in the menu-bar menu `menu` (File → New).
pub fn menu(h: &mut App, menu: &str, item: &str) {
    h.get_by_label(menu).click();
    h.run();
    popup_entry(h, item).click();
    h.run();
}

/// Picks `option` in the drop-down labelled `label`.
pub fn choose(h: &mut App, label: &str, option: &str) {
    scroll_and_click(h, Look::Inspector, Role::ComboBox, label);
    popup_entry(h, option).click();
    h.run();
}

/// Types `text` into the number field labelled `label` and presses Enter.
pub fn set_number(h: &mut App, label: &str, text: &str) {
    control(h, Look::Inspector, Role::SpinButton, label).focus();
    h.run();
    control(h, Look::Inspector, Role::SpinButton, label).type_text(text);
    h.run();
    h.key_press(egui::Key::Enter);
    h.run();
}

/// Replaces the text of the field labelled `label` by `text` and presses Enter (inspector
/// text fields commit when they lose focus, which Enter does).
pub fn set_text(h: &mut App, label: &str, text: &str) {
    control(h, Look::Inspector, Role::TextInput, label).focus();
    h.run();
    replace_focused_text(h, text);
    h.key_press(egui::Key::Enter);
    h.run();
}

/// Selects everything in the focused text field and types `text` over it.
pub fn replace_focused_text(h: &mut App, text: &str) {
    h.key_press_modifiers(egui::Modifiers::COMMAND, egui::Key::A);
    h.run();
    h.event(egui::Event::Text(text.to_owned()));
    h.run();
}

/// Ticks (`on`) or clears the check box labelled `label`.
pub fn set_flag(h: &mut App, label: &str, on: bool) {
    let ticked = |h: &App| {
        control(h, Look::Inspector, Role::CheckBox, label)
            .accesskit_node()
            .toggled()
            == Some(Toggled::True)
    };
    if ticked(h) != on {
        scroll_and_click(h, Look::Inspector, Role::CheckBox, label);
    }
    assert_eq!(ticked(h), on, "check box \"{label}\"");
}

/// The row of the plan tree labelled `row`.
pub fn tree_row<'a>(h: &'a App, row: &'a str) -> Node<'a> {
    region(h, "Plan tree").get_by_role_and_label(Role::Button, row)
}

/// Selects an item by clicking its row in the plan tree.
pub fn select(h: &mut App, row: &str) {
    tree_row(h, row).click();
    h.run();
}

/// Adds an item with the plan tree's Add menu (Part, Load case, Gauge, Bridge, Gauge type).
pub fn add(h: &mut App, what: &str) {
    region(h, "Plan tree").get_by_label("Add").click();
    h.run();
    popup_entry(h, what).click();
    h.run();
}

/// Saves through File → Save as… and the typed-path dialog.
pub fn save_as(h: &mut App, path: &std::path::Path) {
    menu(h, "File", "Save as…");
    control(h, Look::Anywhere, Role::TextInput, PATH_FIELD).focus();
    h.run();
    replace_focused_text(h, &path.display().to_string());
    press(h, "Save");
}

/// A fresh directory for this test process's files.
pub fn temp_dir(test: &str) -> std::path::PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-app-{test}-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    dir
}
