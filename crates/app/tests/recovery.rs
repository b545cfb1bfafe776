//! Autosave to a recovery file, the offer to recover on the next start, and the settings that
//! bring the last project back.

use egui_kittest::Harness;
use egui_kittest::kittest::Queryable;
use gw_app::app::{FileDialogs, GaugewrightApp};
use gw_app::command::Command;
use gw_app::settings::AppPaths;
use gw_mechanics::LoadComponent;

fn paths(tag: &str) -> AppPaths {
    let dir = std::env::temp_dir().join(format!("gw-recovery-{tag}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    AppPaths {
        settings: Some(dir.join("settings.ron")),
        recovery: Some(dir.join("recovery.ron")),
    }
}

fn set_vertical_force(app: &mut GaugewrightApp, value: f64) {
    let mut p = app.doc.project.clone();
    p.parts[0].load_cases[0].set_value(LoadComponent::VerticalForce, value);
    app.doc.apply_all(vec![Command::Edit {
        project: Box::new(p),
        focus: None,
    }]);
}

#[test]
fn unsaved_work_is_autosaved_and_offered_back_on_the_next_start() {
    let p = paths("autosave");
    let recovery = p.recovery.clone().unwrap();
    // First run: the demo opens; an edit is autosaved after the interval.
    let mut first = GaugewrightApp::new(p.clone(), None);
    first.dialogs = FileDialogs::TypedPath;
    assert_eq!(first.doc.project.name, "Winch test stand (demo)");
    set_vertical_force(&mut first, 7777.0);
    first.autosave(30.0);
    assert!(!recovery.exists(), "autosave waits for its interval");
    first.autosave(61.0);
    assert!(recovery.exists());
    drop(first); // as if the app had crashed

    // Next start: the app offers the recovered work.
    let second = GaugewrightApp::new(p, None);
    let mut h = Harness::builder()
        .with_size(egui::vec2(1400.0, 900.0))
        .build_ui_state(|ui, app: &mut GaugewrightApp| app.frame_ui(ui), second);
    h.run();
    h.get_by_label_contains("closed with unsaved work");
    h.get_by_label("Recover").click();
    h.run();
    let doc = &h.state().doc;
    assert_eq!(
        doc.project.parts[0].load_cases[0].value(LoadComponent::VerticalForce),
        7777.0
    );
    assert!(
        doc.dirty,
        "recovered work is unsaved until the user saves it"
    );
}

#[test]
fn the_last_saved_project_reopens_on_the_next_start() {
    let p = paths("reopen");
    let file = p.settings.as_ref().unwrap().with_file_name("plan.ron");
    let mut first = GaugewrightApp::new(p.clone(), None);
    set_vertical_force(&mut first, 6100.0);
    first.save_path(&file);
    assert!(!first.doc.dirty);
    drop(first);
    let second = GaugewrightApp::new(p, None);
    assert_eq!(second.doc.path.as_deref(), Some(file.as_path()));
    assert_eq!(
        second.doc.project.parts[0].load_cases[0].value(LoadComponent::VerticalForce),
        6100.0
    );
}

#[test]
fn a_last_project_that_cannot_be_opened_is_named_with_the_reason() {
    // The last project was broken after it was saved: the app starts on the demo and says so,
    // instead of showing the demo as if nothing had happened.
    let p = paths("broken-last");
    let file = p.settings.as_ref().unwrap().with_file_name("plan.ron");
    let mut first = GaugewrightApp::new(p.clone(), None);
    first.save_path(&file);
    drop(first);
    std::fs::write(&file, "(format_version: 2, name: ").unwrap();
    let second = GaugewrightApp::new(p, None);
    assert_eq!(second.doc.project.name, "Winch test stand (demo)");
    assert_eq!(
        second.doc.path, None,
        "the broken file is not the open document"
    );
    let notice = second.doc.notice.as_ref().expect("the start says why");
    assert!(notice.is_error);
    assert!(notice.text.contains("plan.ron"), "{}", notice.text);
    assert!(notice.text.contains("line 1"), "{}", notice.text);
}

#[derive(Debug)]
struct DroppedPath(std::path::PathBuf);

impl egui::DroppedFile for DroppedPath {
    fn path(&self) -> &std::path::Path {
        &self.0
    }
    fn bytes(&self) -> Result<Vec<u8>, String> {
        std::fs::read(&self.0).map_err(|e| e.to_string())
    }
}

#[test]
fn dropping_a_project_file_on_the_window_opens_it() {
    let p = paths("drop");
    let file = p.settings.as_ref().unwrap().with_file_name("dropped.ron");
    let mut project = gw_plan::demo::demo_project();
    project.name = "Dropped plan".into();
    gw_plan::save_project(&project, &file).unwrap();
    let mut h = Harness::builder()
        .with_size(egui::vec2(1400.0, 900.0))
        .build_ui_state(
            |ui, app: &mut GaugewrightApp| app.frame_ui(ui),
            GaugewrightApp::new(p, None),
        );
    h.run();
    h.input_mut()
        .dropped_files
        .push(std::sync::Arc::new(DroppedPath(file.clone())));
    h.run();
    assert_eq!(h.state().doc.project.name, "Dropped plan");
    assert_eq!(h.state().doc.path.as_deref(), Some(file.as_path()));
}
