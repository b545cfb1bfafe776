//! Saving a plot from its context menu: right-click, choose what to save, type the path, find
//! the file. The app runs as a whole; a plot of known numbers is drawn beside it with the same
//! menu the results tabs use, so what the files hold is known independently of any evaluation.

use egui::accesskit::Role;
use egui::{Event, Modifiers, PointerButton, Pos2, Rect};
use egui_kittest::Harness;
use egui_kittest::kittest::Queryable;
use egui_plot::{Line, Plot};
use gw_app::app::{FileDialogs, GaugewrightApp};
use gw_app::panels::plots::export::{PlotTable, export_menu};
use gw_app::settings::AppPaths;
use gw_app::state::DocumentState;

const PATH_FIELD: &str = "File path (type it; the desktop's file dialog is not available here):";

/// The app and a plot of known numbers drawn over it.
struct Bench {
    app: GaugewrightApp,
    /// Where the plot's data area was drawn in the last frame.
    plot_area: Rect,
}

fn known_table() -> PlotTable {
    PlotTable {
        columns: vec!["Load (kN)".into(), "Displayed strain (µε)".into()],
        rows: vec![
            vec!["0".into(), "0.0".into()],
            vec!["10".into(), "501.5".into()],
            vec!["20".into(), "1003.0".into()],
        ],
    }
}

fn bench_ui(ui: &mut egui::Ui, bench: &mut Bench) {
    bench.app.frame_ui(ui);
    egui::Window::new("Known plot")
        .fixed_pos([420.0, 140.0])
        .show(ui.ctx(), |ui| {
            let shown = Plot::new("known plot")
                .width(360.0)
                .height(220.0)
                .x_axis_label("Load (kN)")
                .y_axis_label("Displayed strain (µε)")
                .show(ui, |plot| {
                    plot.line(Line::new(
                        "ramp",
                        vec![[0.0, 0.0], [10.0, 501.5], [20.0, 1003.0]],
                    ));
                });
            bench.plot_area = shown.response.rect;
            export_menu(&shown.response, "Output vs load", known_table);
        });
}

fn bench(renderer: bool) -> Harness<'static, Bench> {
    let mut app = GaugewrightApp::with_document(
        DocumentState::new(gw_plan::demo::demo_project(), None),
        AppPaths::default(),
        None,
    );
    app.dialogs = FileDialogs::TypedPath;
    let state = Bench {
        app,
        plot_area: Rect::NOTHING,
    };
    let builder = Harness::builder()
        .with_size(egui::vec2(1280.0, 800.0))
        .with_max_steps(32);
    let builder = if renderer { builder.wgpu() } else { builder };
    let mut h = builder.build_ui_state(bench_ui, state);
    h.run();
    h
}

fn temp(name: &str) -> std::path::PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-plot-export-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    dir.join(name)
}

fn right_click(h: &mut Harness<'static, Bench>, pos: Pos2) {
    h.hover_at(pos);
    h.run();
    for pressed in [true, false] {
        h.event(Event::PointerButton {
            pos,
            button: PointerButton::Secondary,
            pressed,
            modifiers: Modifiers::NONE,
        });
    }
    h.run();
}

/// Right-clicks the plot, chooses `entry`, replaces the offered path by `path` and saves.
/// Returns the path the dialog offered.
fn save_through_menu(
    h: &mut Harness<'static, Bench>,
    entry: &str,
    path: &std::path::Path,
) -> String {
    let centre = h.state().plot_area.center();
    right_click(h, centre);
    h.get_by_label(entry).click();
    h.run();
    let offered = h
        .get_by_role_and_label(Role::TextInput, PATH_FIELD)
        .value()
        .unwrap_or_default();
    h.get_by_role_and_label(Role::TextInput, PATH_FIELD).focus();
    h.run();
    h.key_press_modifiers(Modifiers::COMMAND, egui::Key::A);
    h.run();
    h.get_by_role_and_label(Role::TextInput, PATH_FIELD)
        .type_text(&path.display().to_string());
    h.run();
    h.get_by_label("Save").click();
    h.run();
    offered
}

#[test]
fn data_saved_from_the_menu_reads_back_as_the_table() {
    let mut h = bench(false);
    let path = temp("known.csv");
    let _ = std::fs::remove_file(&path);
    let offered = save_through_menu(&mut h, "Save data as CSV…", &path);
    assert_eq!(offered, "output-vs-load.csv");

    let mut reader = csv::Reader::from_path(&path).expect("the CSV was written");
    let headers: Vec<String> = reader
        .headers()
        .unwrap()
        .iter()
        .map(str::to_owned)
        .collect();
    assert_eq!(headers, ["Load (kN)", "Displayed strain (µε)"]);
    let rows: Vec<Vec<String>> = reader
        .records()
        .map(|r| r.unwrap().iter().map(str::to_owned).collect())
        .collect();
    assert_eq!(rows, known_table().rows);

    let notice = h.state().app.doc.notice.clone().expect("a notice");
    assert!(!notice.is_error, "{}", notice.text);
    assert!(notice.text.contains("known.csv"), "{}", notice.text);
    assert!(h.state().app.modal.is_none());
}

#[test]
fn data_that_cannot_be_written_is_reported_and_the_project_kept() {
    let mut h = bench(false);
    let before = h.state().app.doc.project.clone();
    let path = temp("no-such-folder").join("known.csv");
    save_through_menu(&mut h, "Save data as CSV…", &path);
    assert!(!path.exists());
    let notice = h.state().app.doc.notice.clone().expect("a notice");
    assert!(notice.is_error, "{}", notice.text);
    assert!(notice.text.contains("known.csv"), "{}", notice.text);
    assert!(
        notice.text.contains("choose another folder"),
        "{}",
        notice.text
    );
    assert_eq!(h.state().app.doc.project, before);
}

#[test]
fn picture_saved_from_the_menu_is_the_plot_with_its_axes() {
    let mut h = bench(true);
    let path = temp("known.png");
    let _ = std::fs::remove_file(&path);
    let offered = save_through_menu(&mut h, "Save picture as PNG…", &path);
    assert_eq!(offered, "output-vs-load.png");
    // The picture waits for a frame without the dialog, then for the screenshot.
    for _ in 0..8 {
        h.step();
    }
    h.run();
    let notice = h.state().app.doc.notice.clone().expect("a notice");
    assert!(!notice.is_error, "{}", notice.text);

    let picture = image::open(&path).expect("the PNG was written").to_rgba8();
    let area = h.state().plot_area;
    let (w, h_px) = picture.dimensions();
    // Wider and taller than the data area by the axes (the y axis on the left, the x axis
    // below), yet no bigger than the window holding it.
    assert!(
        w as f32 > area.width() + 20.0 && (w as f32) < area.width() + 140.0,
        "{w} px wide"
    );
    assert!(
        h_px as f32 > area.height() + 15.0 && (h_px as f32) < area.height() + 90.0,
        "{h_px} px high"
    );
    // A plot, not a blank: more than a handful of distinct colours.
    let mut colours: Vec<[u8; 4]> = picture.pixels().map(|p| p.0).collect();
    colours.sort_unstable();
    colours.dedup();
    assert!(colours.len() > 10, "only {} colours", colours.len());
}

/// The app alone, as the user sees it.
fn app_harness() -> Harness<'static, GaugewrightApp> {
    let mut app = GaugewrightApp::with_document(
        DocumentState::new(gw_plan::demo::demo_project(), None),
        AppPaths::default(),
        None,
    );
    app.dialogs = FileDialogs::TypedPath;
    let mut h = Harness::builder()
        .with_size(egui::vec2(1280.0, 800.0))
        .with_max_steps(32)
        .build_ui_state(|ui, app: &mut GaugewrightApp| app.frame_ui(ui), app);
    h.run();
    h
}

fn click_labelled(
    h: &mut Harness<'static, GaugewrightApp>,
    label: &str,
    pick: impl Fn(Rect) -> bool,
) {
    h.get_all_by_label(label)
        .find(|n| pick(n.rect()))
        .unwrap_or_else(|| panic!("no {label}"))
        .click();
    h.run();
}

#[test]
fn results_table_saves_its_data_from_a_right_click() {
    let mut h = app_harness();
    click_labelled(&mut h, "Results", |r| r.top() < 30.0);
    click_labelled(&mut h, "Temperature", |r| r.top() > 30.0 && r.top() < 60.0);
    // The contributions table's "Cause" header, in the centre view.
    let cause = h
        .get_all_by_label("Cause")
        .map(|n| n.rect())
        .find(|r| r.left() > 300.0 && r.right() < 900.0)
        .expect("the contributions table in the centre");
    right_click_app(&mut h, cause.center());
    h.get_by_label("Save data as CSV…").click();
    h.run();
    let offered = h
        .get_by_role_and_label(Role::TextInput, PATH_FIELD)
        .value()
        .unwrap_or_default();
    assert!(
        offered.ends_with("apparent-strain-contributions.csv"),
        "{offered}"
    );
    let path = temp("results-table.csv");
    let _ = std::fs::remove_file(&path);
    h.get_by_role_and_label(Role::TextInput, PATH_FIELD).focus();
    h.run();
    h.key_press_modifiers(Modifiers::COMMAND, egui::Key::A);
    h.run();
    h.get_by_role_and_label(Role::TextInput, PATH_FIELD)
        .type_text(&path.display().to_string());
    h.run();
    h.get_by_label("Save").click();
    h.run();

    let mut reader = csv::Reader::from_path(&path).expect("the CSV was written");
    let headers: Vec<String> = reader
        .headers()
        .unwrap()
        .iter()
        .map(str::to_owned)
        .collect();
    assert_eq!(headers.first().map(String::as_str), Some("Cause"));
    assert!(
        headers.iter().skip(1).all(|c| c.ends_with("(µε)")),
        "{headers:?}"
    );
    let causes: Vec<String> = reader
        .records()
        .map(|r| r.unwrap().get(0).unwrap_or_default().to_owned())
        .collect();
    assert!(!causes.is_empty());
    // Every cause in the file is one the view names, in the table or among those at zero.
    for cause in &causes {
        let in_view = h
            .query_all_by_label(cause)
            .any(|n| n.rect().left() > 300.0 && n.rect().right() < 900.0);
        assert!(in_view, "{cause} is not shown in the centre view");
    }
}

fn right_click_app(h: &mut Harness<'static, GaugewrightApp>, pos: Pos2) {
    h.hover_at(pos);
    h.run();
    for pressed in [true, false] {
        h.event(Event::PointerButton {
            pos,
            button: PointerButton::Secondary,
            pressed,
            modifiers: Modifiers::NONE,
        });
    }
    h.run();
}
