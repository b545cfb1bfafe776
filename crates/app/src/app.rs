//! The application: menus, panels, shortcuts, files and the command loop.

use std::path::PathBuf;

use crate::command::Command;
use crate::panels::bridges::BridgesPanel;
use crate::panels::face_view::FaceView;
use crate::panels::findings::FindingsPanel;
use crate::panels::help::HelpPanel;
use crate::panels::import_field::{ImportFieldDialog, ImportOutcome};
use crate::panels::inspector::InspectorPanel;
use crate::panels::map::MapSettings;
use crate::panels::new_project::{NewProjectDialog, NewProjectOutcome};
use crate::panels::part_view::PartView;
use crate::panels::plots::PlotsPanel;
use crate::panels::plots::export::{ExportRequest, PlotExport};
use crate::panels::tree::TreePanel;
use crate::screenshot::ScreenshotRequest;
use crate::settings::{AppPaths, Settings};
use crate::state::{DocumentState, Notice};
use crate::units::Units;

/// The central tabs.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Tab {
    /// The whole part in 3-D: supports, loads, axes, the colour map and the gauges.
    Part,
    /// One face to scale, where gauges are placed, moved and turned.
    Face,
    /// Bridges: schematic, arms, arrangements, suggestions.
    Bridges,
    /// Plots and tables.
    Results,
    /// Method, assumptions and cautions.
    Help,
}

/// How files are picked. Default: the desktop's dialog, falling back to a typed path.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum FileDialogs {
    /// Native dialogs via the desktop portal.
    #[default]
    Native,
    /// Always ask for a typed path (no desktop portal, or tests).
    TypedPath,
}

/// What to do after the user confirms discarding unsaved work.
#[derive(Debug, Clone, PartialEq)]
pub enum Pending {
    /// Start a new project.
    New,
    /// Open the bundled demo.
    OpenDemo,
    /// Open this file.
    Open(PathBuf),
    /// Ask for a file to open.
    PickOpen,
}

/// What a typed path is for.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum PathPurpose {
    /// Open a project.
    Open,
    /// Save the project.
    Save,
    /// Write the build sheet PDF (and the channel list beside it).
    Sheet,
    /// Import filled-in check-out records (CSV).
    Records,
    /// Write the check-out records template (CSV).
    Template,
    /// Import a test log (CSV).
    Log,
    /// Save the picture of a plot (PNG).
    PlotPicture,
    /// Save the numbers of a plot (CSV).
    PlotData,
}

impl PathPurpose {
    /// What the dialog asks.
    fn prompt(self) -> &'static str {
        match self {
            PathPurpose::Open => "Open this project file:",
            PathPurpose::Save => "Save the project to this file:",
            PathPurpose::Sheet => "Write the build sheet to this PDF:",
            PathPurpose::Records => "Import the filled-in check-out records from this CSV file:",
            PathPurpose::Template => "Write the check-out records template to this CSV file:",
            PathPurpose::Log => "Import the test log from this CSV file:",
            PathPurpose::PlotPicture => "Save the picture of the plot to this PNG file:",
            PathPurpose::PlotData => "Save the data of the plot to this CSV file:",
        }
    }

    /// An example path.
    fn hint(self) -> &'static str {
        match self {
            PathPurpose::Open | PathPurpose::Save => "/path/to/project.ron",
            PathPurpose::Sheet => "/path/to/build_sheet.pdf",
            PathPurpose::Records | PathPurpose::Template => "/path/to/checkout_records.csv",
            PathPurpose::Log => "/path/to/test_log.csv",
            PathPurpose::PlotPicture => "/path/to/plot.png",
            PathPurpose::PlotData => "/path/to/plot.csv",
        }
    }

    /// The button that goes ahead.
    fn action(self) -> &'static str {
        match self {
            PathPurpose::Open => "Open",
            PathPurpose::Save => "Save",
            PathPurpose::Sheet => "Export",
            PathPurpose::Records | PathPurpose::Log => "Import",
            PathPurpose::Template => "Write",
            PathPurpose::PlotPicture | PathPurpose::PlotData => "Save",
        }
    }
}

/// A dialog over the app.
#[derive(Debug, Clone, PartialEq)]
pub enum Modal {
    /// Type a path for a file to open, save, import or write.
    Path(PathPurpose, String),
    /// Unsaved changes would be lost.
    ConfirmDiscard(Pending),
    /// A recovery file from an earlier session exists.
    Recover(PathBuf),
    /// Describe the first part of a new project.
    NewProject,
    /// Import finite-element results as a new part.
    ImportField,
}

/// Autosave interval, seconds.
const AUTOSAVE_S: f64 = 60.0;

/// The Gaugewright desktop app.
pub struct GaugewrightApp {
    /// The document.
    pub doc: DocumentState,
    /// Current tab.
    pub tab: Tab,
    /// Open dialog, if any.
    pub modal: Option<Modal>,
    /// File-dialog behaviour.
    pub dialogs: FileDialogs,
    tree: TreePanel,
    inspector: InspectorPanel,
    new_project: NewProjectDialog,
    /// The "Import finite-element results" window's state.
    pub import_field: ImportFieldDialog,
    /// What the colour maps show (shared by the part and face views).
    pub map: MapSettings,
    part_view: PartView,
    face_view: FaceView,
    bridges: BridgesPanel,
    plots: PlotsPanel,
    /// Where the view in the centre was drawn last frame (tests check that texts stay in it).
    pub view_rect: egui::Rect,
    /// How far, in points, the centre view's content ran past the sides of its panel last
    /// frame (0 when it fits; a table that scrolls sideways fits).
    pub view_overflow: f32,
    findings: FindingsPanel,
    help: HelpPanel,
    settings: Settings,
    paths: AppPaths,
    screenshot: Option<ScreenshotRequest>,
    plot_export: PlotExport,
    last_title: String,
    last_autosave_s: f64,
}

impl GaugewrightApp {
    /// Starts on the last project (or the bundled demo on the first run), offering to recover
    /// unsaved work if a recovery file exists.
    pub fn new(paths: AppPaths, screenshot: Option<ScreenshotRequest>) -> Self {
        let settings = Settings::load(paths.settings.as_deref());
        let mut doc = DocumentState::new(gw_plan::demo::demo_project(), None);
        let mut modal = None;
        if settings.has_run
            && let Some(last) = settings.recent_files.first()
        {
            match gw_plan::load_project(last) {
                Ok(p) => doc = DocumentState::new(p, Some(last.clone())),
                // Say why, rather than showing the demo as if nothing had happened.
                Err(e) => {
                    doc.notice = Some(crate::state::Notice {
                        is_error: true,
                        text: format!(
                            "Could not open the last project, {}: {e}. Showing the demo instead; \
                             File › Open to choose a project.",
                            last.display()
                        ),
                    })
                }
            }
        }
        doc.units = settings.units;
        if let Some(r) = paths.recovery.as_ref().filter(|r| r.exists()) {
            modal = Some(Modal::Recover(r.clone()));
        }
        let mut app = Self::with_document(doc, paths, screenshot);
        app.modal = modal;
        app.settings = settings;
        app.settings.has_run = true;
        app.settings.save(app.paths.settings.as_deref());
        app
    }

    /// An app on a given document, remembering nothing (tests and screenshots).
    pub fn with_document(
        doc: DocumentState,
        paths: AppPaths,
        screenshot: Option<ScreenshotRequest>,
    ) -> Self {
        Self {
            doc,
            tab: Tab::Part,
            modal: None,
            dialogs: FileDialogs::default(),
            tree: TreePanel::default(),
            inspector: InspectorPanel::default(),
            new_project: NewProjectDialog::default(),
            import_field: ImportFieldDialog::default(),
            map: MapSettings::default(),
            part_view: PartView::default(),
            face_view: FaceView::default(),
            bridges: BridgesPanel::default(),
            plots: PlotsPanel::default(),
            view_rect: egui::Rect::NOTHING,
            view_overflow: 0.0,
            findings: FindingsPanel,
            help: HelpPanel,
            settings: Settings::default(),
            paths,
            screenshot,
            plot_export: PlotExport::default(),
            last_title: String::new(),
            last_autosave_s: 0.0,
        }
    }

    /// Turns the part view as a drag of `delta` pixels would.
    pub fn turn_part_view(&mut self, delta: egui::Vec2) {
        self.part_view.turn(delta);
    }

    /// Shows one results tab (when the Results view is open).
    pub fn show_results(&mut self, view: crate::panels::plots::PlotView) {
        self.plots.show(view);
    }

    /// Shows values in a unit system for this run (the remembered choice is not changed).
    pub fn show_units(&mut self, units: Units) {
        self.doc.units = units;
    }

    /// Turns the part view to a preset view.
    pub fn look_from(&mut self, preset: crate::panels::part_view::Preset) {
        self.part_view.look_from(preset);
    }

    /// Selects part `index` (0-based) if the project has it; otherwise says which parts exist.
    pub fn show_part(&mut self, index: usize) {
        let count = self.doc.project.parts.len();
        if index < count {
            self.doc
                .apply_all(vec![Command::Focus(gw_plan::edit::Item::Part(index))]);
        } else {
            self.doc.notice = Some(Notice {
                is_error: true,
                text: format!(
                    "There is no part {} in this project: it has {count} part{}; showing part 1.",
                    index + 1,
                    if count == 1 { "" } else { "s" }
                ),
            });
        }
    }

    fn run_pending(&mut self, pending: Pending) {
        match pending {
            Pending::New => {
                self.new_project = NewProjectDialog::default();
                self.modal = Some(Modal::NewProject);
            }
            Pending::OpenDemo => {
                self.doc.apply_all(vec![Command::ReplaceProject {
                    project: Box::new(gw_plan::demo::demo_project()),
                    path: None,
                }]);
            }
            Pending::Open(path) => self.open_path(&path),
            Pending::PickOpen => self.pick_open(),
        }
    }

    /// Runs `pending` now, or asks first when there are unsaved changes.
    pub fn guarded(&mut self, pending: Pending) {
        if self.doc.dirty {
            self.modal = Some(Modal::ConfirmDiscard(pending));
        } else {
            self.run_pending(pending);
        }
    }

    fn pick_open(&mut self) {
        if self.dialogs == FileDialogs::Native
            && let Some(p) = rfd::FileDialog::new()
                .add_filter("Gaugewright project", &["ron"])
                .pick_file()
        {
            self.open_path(&p);
            return;
        }
        // No dialog appeared (no desktop portal) or it was cancelled: offer a typed path.
        self.modal = Some(Modal::Path(PathPurpose::Open, String::new()));
    }

    fn pick_save(&mut self) {
        if self.dialogs == FileDialogs::Native
            && let Some(p) = rfd::FileDialog::new()
                .add_filter("Gaugewright project", &["ron"])
                .set_file_name("project.ron")
                .save_file()
        {
            self.save_path(&p);
            return;
        }
        let current = self
            .doc
            .path
            .as_ref()
            .map(|p| p.display().to_string())
            .unwrap_or_default();
        self.modal = Some(Modal::Path(PathPurpose::Save, current));
    }

    fn pick_sheet(&mut self) {
        if self.dialogs == FileDialogs::Native
            && let Some(p) = rfd::FileDialog::new()
                .add_filter("PDF", &["pdf"])
                .set_file_name("build_sheet.pdf")
                .save_file()
        {
            self.export_sheet(&p);
            return;
        }
        self.modal = Some(Modal::Path(PathPurpose::Sheet, String::new()));
    }

    /// Writes the build sheet PDF and the channel list CSV beside it, through the safe writer;
    /// neither may land on the open project or on another project.
    pub fn export_sheet(&mut self, pdf: &std::path::Path) {
        use gw_plan::safe_write::{Backup, holds_a_project, same_file, write_file};
        let csv = pdf.with_extension("csv");
        let open = self.doc.path.clone();
        let clash = [pdf, csv.as_path()]
            .into_iter()
            .find(|p| open.as_deref().is_some_and(|o| same_file(p, o)) || holds_a_project(p));
        if let Some(p) = clash {
            self.doc.notice = Some(Notice {
                is_error: true,
                text: format!(
                    "Did not write the build sheet: {} is a project file and would be lost. Choose another name.",
                    p.display()
                ),
            });
            return;
        }
        let ev = gw_plan::evaluate(&self.doc.project, &gw_plan::EvalOptions::default());
        let units = self.doc.units;
        let result = gw_plan::sheet::build_sheet_pdf_in(&self.doc.project, &ev, units)
            .and_then(|bytes| write_file(pdf, &bytes, Backup::Replace).map_err(|e| e.to_string()))
            .and_then(|()| {
                let text = gw_plan::channel_list::channel_list_csv_in(&ev, units);
                write_file(&csv, text.as_bytes(), Backup::Replace).map_err(|e| e.to_string())
            });
        self.doc.notice = Some(match result {
            Ok(()) => Notice {
                is_error: false,
                text: format!("Wrote {} and the channel list beside it", pdf.display()),
            },
            Err(e) => Notice {
                is_error: true,
                text: format!("Could not write the build sheet: {e}"),
            },
        });
    }

    /// Opens a file (a failure leaves the open project untouched and says why).
    pub fn open_path(&mut self, path: &std::path::Path) {
        self.doc.open(path);
        if self.doc.path.as_deref() == Some(path) {
            self.settings.remember(path);
            self.settings.save(self.paths.settings.as_deref());
        }
    }

    /// Saves to a path and remembers it.
    pub fn save_path(&mut self, path: &std::path::Path) {
        if self.doc.save_to(path) {
            self.settings.remember(path);
            self.settings.save(self.paths.settings.as_deref());
            if let Some(r) = &self.paths.recovery {
                let _ = std::fs::remove_file(r);
            }
        }
    }

    /// Save, or Save as when the project has no file yet.
    pub fn save(&mut self) {
        match self.doc.path.clone() {
            Some(p) => self.save_path(&p),
            None => self.pick_save(),
        }
    }

    /// Writes the recovery file when there are unsaved changes and the interval has passed.
    pub fn autosave(&mut self, now_s: f64) {
        if now_s - self.last_autosave_s < AUTOSAVE_S {
            return;
        }
        self.last_autosave_s = now_s;
        if let (true, Some(r)) = (self.doc.dirty, self.paths.recovery.as_ref()) {
            if let Some(dir) = r.parent() {
                let _ = std::fs::create_dir_all(dir);
            }
            let _ = gw_plan::save_project(&self.doc.project, r);
        }
    }

    fn shortcuts(&mut self, ui: &egui::Ui, out: &mut Vec<Command>) {
        use egui::{Key, KeyboardShortcut, Modifiers};
        let typing = ui.ctx().egui_wants_keyboard_input();
        let (undo, redo, redo_y, new, open, save, delete) = ui.input_mut(|i| {
            (
                i.consume_shortcut(&KeyboardShortcut::new(Modifiers::COMMAND, Key::Z)),
                i.consume_shortcut(&KeyboardShortcut::new(
                    Modifiers::COMMAND | Modifiers::SHIFT,
                    Key::Z,
                )),
                i.consume_shortcut(&KeyboardShortcut::new(Modifiers::COMMAND, Key::Y)),
                i.consume_shortcut(&KeyboardShortcut::new(Modifiers::COMMAND, Key::N)),
                i.consume_shortcut(&KeyboardShortcut::new(Modifiers::COMMAND, Key::O)),
                i.consume_shortcut(&KeyboardShortcut::new(Modifiers::COMMAND, Key::S)),
                !typing && i.key_pressed(Key::Delete),
            )
        });
        if redo || redo_y {
            out.push(Command::Redo);
        } else if undo {
            out.push(Command::Undo);
        }
        if new {
            self.guarded(Pending::New);
        }
        if open {
            self.guarded(Pending::PickOpen);
        }
        if save {
            self.save();
        }
        if delete && let Some(item) = self.doc.selection.focus {
            // The same confirmation as the tree's Delete button; undo brings it back.
            self.tree.ask_delete(item);
        }
    }

    /// The File menu: new, open, demo, recent, save, export.
    fn file_menu_ui(&mut self, ui: &mut egui::Ui) {
        if ui
            .button("New")
            .on_hover_text("Start a new project (Ctrl+N)")
            .clicked()
        {
            self.guarded(Pending::New);
        }
        if ui
            .button("Open…")
            .on_hover_text("Open a project file (Ctrl+O)")
            .clicked()
        {
            self.guarded(Pending::PickOpen);
        }
        if ui
            .button("Open the demo")
            .on_hover_text("Open the bundled demo project")
            .clicked()
        {
            self.guarded(Pending::OpenDemo);
        }
        ui.menu_button("Recent", |ui| {
            ui.label("Projects opened or saved lately:");
            let recent = self.settings.recent_files.clone();
            if recent.is_empty() {
                ui.label("No recent files");
            }
            for p in recent {
                if ui
                    .button(p.display().to_string())
                    .on_hover_text("Open this project")
                    .clicked()
                {
                    self.guarded(Pending::Open(p));
                }
            }
        });
        ui.separator();
        if ui
            .button("Save")
            .on_hover_text("Save (Ctrl+S); the previous version is kept as .bak")
            .clicked()
        {
            self.save();
        }
        if ui
            .button("Save as…")
            .on_hover_text("Save the project to a new file")
            .clicked()
        {
            self.pick_save();
        }
        ui.separator();
        if ui
            .button("Export build sheet…")
            .on_hover_text(
                "Write the technician's build sheet (PDF) and the channel list (CSV beside it)",
            )
            .clicked()
        {
            self.pick_sheet();
        }
        ui.separator();
        if ui
            .button("Import finite-element results…")
            .on_hover_text(
                "Add a part made from strain or stress results of a finite-element model, one \
                 file per unit load (.vtu, .vtk or CSV)",
            )
            .clicked()
        {
            self.modal = Some(Modal::ImportField);
        }
        self.test_files_menu_ui(ui);
    }

    fn menu_ui(&mut self, ui: &mut egui::Ui, out: &mut Vec<Command>) {
        egui::MenuBar::new().ui(ui, |ui| {
            ui.menu_button("File", |ui| self.file_menu_ui(ui));
            ui.menu_button("Edit", |ui| {
                if ui
                    .add_enabled(self.doc.can_undo(), egui::Button::new("Undo"))
                    .on_hover_text("Ctrl+Z")
                    .clicked()
                {
                    out.push(Command::Undo);
                }
                if ui
                    .add_enabled(self.doc.can_redo(), egui::Button::new("Redo"))
                    .on_hover_text("Ctrl+Shift+Z or Ctrl+Y")
                    .clicked()
                {
                    out.push(Command::Redo);
                }
            });
            ui.menu_button("Units", |ui| {
                for (u, name) in [
                    (Units::Si, "SI (mm, N, MPa, °C)"),
                    (Units::UsCustomary, "US customary (in, lbf, psi, °F)"),
                ] {
                    if ui
                        .selectable_label(self.doc.units == u, name)
                        .on_hover_text("Display units; values are stored in SI whatever is shown")
                        .clicked()
                    {
                        out.push(Command::SetUnits(u));
                        self.settings.units = u;
                        self.settings.save(self.paths.settings.as_deref());
                    }
                }
            });
            ui.separator();
            for (t, name, help) in [
                (
                    Tab::Part,
                    "Part",
                    "The whole part in 3-D with supports, loads, the colour map and the gauges",
                ),
                (
                    Tab::Face,
                    "Face",
                    "One face to scale: place, move and turn gauges",
                ),
                (
                    Tab::Bridges,
                    "Bridges",
                    "Bridge wiring, arrangements and suggestions",
                ),
                (
                    Tab::Results,
                    "Results",
                    "Output, temperature, margins, uncertainty, what cancels what",
                ),
                (
                    Tab::Help,
                    "Help and cautions",
                    "How Gaugewright computes, and the cautions that apply",
                ),
            ] {
                ui.selectable_value(&mut self.tab, t, name)
                    .on_hover_text(help);
            }
        });
    }

    /// The New project dialog: a created project replaces the open one.
    fn new_project_modal_ui(&mut self, ui: &mut egui::Ui) {
        match self.new_project.ui(ui.ctx(), self.doc.units) {
            Some(NewProjectOutcome::Create(project)) => {
                self.doc.apply_all(vec![Command::ReplaceProject {
                    project,
                    path: None,
                }]);
                self.doc.notice = Some(Notice {
                    is_error: false,
                    text: "New project: add gauges and bridges from the plan tree (Add), \
                           edit every value in the inspector on the right."
                        .into(),
                });
                self.modal = None;
            }
            Some(NewProjectOutcome::Cancel) => self.modal = None,
            None => {}
        }
    }

    /// The import window: an added part joins the project (one undo step) and is selected.
    fn import_field_modal_ui(&mut self, ui: &mut egui::Ui) {
        let folder = self
            .doc
            .path
            .as_ref()
            .and_then(|p| p.parent())
            .map(|p| p.to_path_buf());
        let native = self.dialogs == FileDialogs::Native;
        match self.import_field.ui(ui.ctx(), folder, native) {
            Some(ImportOutcome::Add(part)) => {
                let mut project = self.doc.project.clone();
                project.parts.push(*part);
                let index = project.parts.len() - 1;
                self.doc.apply_all(vec![Command::Edit {
                    project: Box::new(project),
                    focus: Some(gw_plan::edit::Item::Part(index)),
                }]);
                self.doc.notice = Some(Notice {
                    is_error: false,
                    text: "Imported part added: choose \"Click on the part: places a …\" in the \
                           part view and click where a gauge goes (or click a face to open it), \
                           then wire the gauges in the bridges view."
                        .into(),
                });
                self.import_field = ImportFieldDialog::default();
                self.modal = None;
            }
            Some(ImportOutcome::Cancel) => self.modal = None,
            None => {}
        }
    }

    /// The typed-path dialog; true when answered.
    fn path_modal_ui(&mut self, ui: &mut egui::Ui, purpose: PathPurpose, mut text: String) -> bool {
        let mut close = false;
        ui.label(purpose.prompt());
        let label =
            ui.label("File path (type it; the desktop's file dialog is not available here):");
        let r = ui
            .add(
                egui::TextEdit::singleline(&mut text)
                    .desired_width(420.0)
                    .hint_text(purpose.hint()),
            )
            .labelled_by(label.id);
        self.modal = Some(Modal::Path(purpose, text.clone()));
        ui.horizontal(|ui| {
            let go = ui.button(purpose.action()).clicked()
                || (r.lost_focus() && ui.input(|i| i.key_pressed(egui::Key::Enter)));
            if go && !text.trim().is_empty() {
                self.run_path(purpose, &PathBuf::from(text.trim()));
                close = true;
            }
            if ui.button("Cancel").clicked() {
                close = true;
            }
        });
        close
    }

    /// Does what the path was asked for.
    pub fn run_path(&mut self, purpose: PathPurpose, path: &std::path::Path) {
        match purpose {
            PathPurpose::Open => self.open_path(path),
            PathPurpose::Save => self.save_path(path),
            PathPurpose::Sheet => self.export_sheet(path),
            PathPurpose::Records => crate::test_files::import_records(&mut self.doc, path),
            PathPurpose::Template => crate::test_files::write_template(&mut self.doc, path),
            PathPurpose::Log => crate::test_files::import_log(&mut self.doc, path),
            PathPurpose::PlotPicture | PathPurpose::PlotData => {
                self.plot_export.write(path, &mut self.doc)
            }
        }
    }

    /// Asks for a CSV file for `purpose` with the desktop's dialog, or a typed path.
    fn pick_csv(&mut self, purpose: PathPurpose) {
        if self.dialogs == FileDialogs::Native {
            let dialog = rfd::FileDialog::new().add_filter("CSV", &["csv"]);
            let picked = match purpose {
                PathPurpose::Template => dialog.set_file_name("checkout_records.csv").save_file(),
                _ => dialog.pick_file(),
            };
            if let Some(p) = picked {
                self.run_path(purpose, &p);
                return;
            }
        }
        self.modal = Some(Modal::Path(purpose, String::new()));
    }

    /// The File menu's entries for what comes back from the installation.
    fn test_files_menu_ui(&mut self, ui: &mut egui::Ui) {
        for (purpose, name, help) in [
            (
                PathPurpose::Template,
                "Write check-out records template…",
                "A CSV with one row per grid and per bridge, the expected values filled in, for \
                 the technician to complete",
            ),
            (
                PathPurpose::Records,
                "Import check-out records…",
                "Read the filled-in records CSV into the project (Ctrl+Z undoes it)",
            ),
            (
                PathPurpose::Log,
                "Import test log…",
                "Read a test log (CSV with units in the headers); the project remembers the file",
            ),
        ] {
            if ui.button(name).on_hover_text(help).clicked() {
                self.pick_csv(purpose);
            }
        }
    }

    fn modal_ui(&mut self, ui: &mut egui::Ui) {
        let Some(modal) = self.modal.clone() else {
            return;
        };
        if modal == Modal::NewProject {
            self.new_project_modal_ui(ui);
            return;
        }
        if modal == Modal::ImportField {
            self.import_field_modal_ui(ui);
            return;
        }
        let mut close = false;
        let mut next = None;
        egui::Window::new("Gaugewright")
            .collapsible(false)
            .resizable(false)
            .anchor(egui::Align2::CENTER_CENTER, [0.0, 0.0])
            .show(ui.ctx(), |ui| match modal {
                Modal::Path(purpose, text) => close = self.path_modal_ui(ui, purpose, text),
                Modal::ConfirmDiscard(pending) => {
                    ui.label("The project has unsaved changes. Discard them?");
                    ui.horizontal(|ui| {
                        if ui.button("Discard changes").clicked() {
                            next = Some(pending.clone());
                            close = true;
                        }
                        if ui.button("Keep working").clicked() {
                            close = true;
                        }
                    });
                }
                Modal::NewProject | Modal::ImportField => {}
                Modal::Recover(path) => close = self.recover_ui(ui, &path),
            });
        if close {
            self.modal = None;
        }
        if let Some(p) = next {
            self.doc.dirty = false;
            self.run_pending(p);
        }
    }

    /// The offer to recover unsaved work; true when answered.
    fn recover_ui(&mut self, ui: &mut egui::Ui, path: &std::path::Path) -> bool {
        let mut close = false;
        ui.label("Gaugewright closed with unsaved work last time. Recover it?");
        ui.horizontal(|ui| {
            if ui.button("Recover").clicked() {
                if let Ok(p) = gw_plan::load_project(path) {
                    self.doc.apply_all(vec![Command::ReplaceProject {
                        project: Box::new(p),
                        path: None,
                    }]);
                    self.doc.dirty = true;
                } else {
                    self.doc.notice = Some(Notice {
                        is_error: true,
                        text: "The recovery file could not be read.".into(),
                    });
                }
                close = true;
            }
            if ui.button("Discard it").clicked() {
                let _ = std::fs::remove_file(path);
                close = true;
            }
        });
        close
    }

    /// One frame of the whole app.
    pub fn frame_ui(&mut self, ui: &mut egui::Ui) {
        let mut out = Vec::new();
        self.shortcuts(ui, &mut out);
        let dropped: Vec<PathBuf> = ui.input(|i| {
            i.raw
                .dropped_files
                .iter()
                .map(|f| f.path().to_path_buf())
                .filter(|p| !p.as_os_str().is_empty())
                .collect()
        });
        if let Some(p) = dropped.into_iter().next() {
            self.guarded(Pending::Open(p));
        }
        egui::Panel::top("menu").show(ui, |ui| self.menu_ui(ui, &mut out));
        egui::Panel::bottom("findings")
            .resizable(true)
            .default_size(140.0)
            .show(ui, |ui| {
                self.findings.findings_ui(ui, &mut self.doc);
            });
        // Size ranges keep the side panels from following their content's width from item to
        // item, which would move the views in the centre.
        egui::Panel::left("plan tree")
            .resizable(true)
            .default_size(300.0)
            .size_range(260.0..=340.0)
            .show(ui, |ui| {
                self.tree.tree_ui(ui, &self.doc, &mut out);
            });
        egui::Panel::right("inspector")
            .resizable(true)
            .default_size(360.0)
            .size_range(320.0..=440.0)
            .show(ui, |ui| {
                self.inspector.inspector_ui(ui, &self.doc, &mut out);
            });
        egui::CentralPanel::default().show(ui, |ui| {
            let room = ui.max_rect();
            self.view_rect = room;
            self.view_ui(ui, &mut out);
            // The ui grows past its panel when its content does not fit; the panel stays.
            let used = ui.min_rect();
            self.view_overflow = [
                used.right() - room.right(),
                room.left() - used.left(),
                used.bottom() - room.bottom(),
            ]
            .into_iter()
            .fold(0.0, f32::max);
        });
        self.plot_export_frame(ui.ctx());
        self.modal_ui(ui);
        self.finish_frame(ui, out);
    }

    /// The view in the centre: the tab shown.
    fn view_ui(&mut self, ui: &mut egui::Ui, out: &mut Vec<Command>) {
        match self.tab {
            Tab::Part => {
                if let Some(face) = self.part_view.part_ui(ui, &self.doc, &mut self.map, out) {
                    self.face_view.show_face(self.doc.selection.part, face);
                    self.tab = Tab::Face;
                }
            }
            Tab::Face => self.face_view.face_ui(ui, &self.doc, &mut self.map, out),
            Tab::Bridges => self.bridges.bridges_ui(ui, &self.doc, out),
            Tab::Results => self.plots.plots_ui(ui, &self.doc, out),
            Tab::Help => self.help.help_ui(ui, &self.doc),
        }
    }

    /// After the panels: apply the commands they emitted, title, autosave, screenshot.
    fn finish_frame(&mut self, ui: &mut egui::Ui, out: Vec<Command>) {
        if !out.is_empty() {
            let before = self.doc.evaluations;
            self.doc.apply_all(out);
            if self.doc.evaluations != before {
                // Draw again before presenting, so every panel shows the edit in this frame.
                ui.ctx().request_discard("the project changed");
            }
            ui.ctx().request_repaint();
        }
        let title = self.doc.title();
        if title != self.last_title {
            ui.ctx()
                .send_viewport_cmd(egui::ViewportCommand::Title(title.clone()));
            self.last_title = title;
        }
        let now = ui.input(|i| i.time);
        self.autosave(now);
        if let Some(request) = &mut self.screenshot {
            request.on_frame(ui.ctx(), self.view_overflow);
        }
    }
}

/// Saving plots: the request a plot's context menu left, its path, and the picture's screenshot.
impl GaugewrightApp {
    fn plot_export_frame(&mut self, ctx: &egui::Context) {
        if let Some(request) = crate::panels::plots::export::take_request(ctx) {
            self.pick_plot_export(request);
        }
        let dialog_open = self.modal.is_some();
        self.plot_export.on_frame(ctx, &mut self.doc, dialog_open);
    }

    /// Asks where to save what a plot's menu asked for: the desktop's save dialog with a name
    /// from the plot's title, or a typed path with that name beside the project.
    fn pick_plot_export(&mut self, request: ExportRequest) {
        let suggested = request.suggested_file_name();
        let (purpose, filter) = match request {
            ExportRequest::Picture { .. } => (PathPurpose::PlotPicture, "PNG picture"),
            ExportRequest::Data { .. } => (PathPurpose::PlotData, "CSV"),
        };
        let extension = request.extension();
        self.plot_export.wait_for_path(request);
        if self.dialogs == FileDialogs::Native
            && let Some(p) = rfd::FileDialog::new()
                .add_filter(filter, &[extension])
                .set_file_name(&suggested)
                .save_file()
        {
            self.run_path(purpose, &p);
            return;
        }
        let beside_project = self
            .doc
            .path
            .as_deref()
            .and_then(std::path::Path::parent)
            .map(|dir| dir.join(&suggested).display().to_string());
        self.modal = Some(Modal::Path(purpose, beside_project.unwrap_or(suggested)));
    }
}

impl eframe::App for GaugewrightApp {
    fn ui(&mut self, ui: &mut egui::Ui, _frame: &mut eframe::Frame) {
        self.frame_ui(ui);
    }
}
