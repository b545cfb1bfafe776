//! Drawing the "Import finite-element results" window (the state and the reading are in
//! [`super::import_field`]).

use std::path::PathBuf;

use gw_mechanics::MATERIAL_LIBRARY;
use gw_mechanics::imported::{LengthUnit, ReferenceAxis, ShearConvention, TensorUnit};

use super::import_field::{IMPORTABLE, ImportFieldDialog, ImportOutcome, ResultRow};

const INTRO: &str = "One result file per unit load: the strain or stress your finite-element \
model gives for 1 N, 1 N·m or 1 Pa of that load, at the nodes (or elements) of the part's mesh. \
Files: XML .vtu or legacy .vtk with a 6-component tensor array (order xx, yy, zz, xy, yz, xz), or \
CSV with columns x, y, z and six tensor columns whose headers give the units, with the cells \
from a mesh file. The plan is only as good as the model: its supports, loads and material must \
be the real part's.";

/// Width of the text fields.
const FIELD_WIDTH: f32 = 260.0;

fn combo<T: Copy + PartialEq>(
    ui: &mut egui::Ui,
    id: &str,
    current: &mut T,
    options: &[T],
    name: impl Fn(T) -> String,
) -> bool {
    let mut changed = false;
    egui::ComboBox::from_id_salt(("import_field", id))
        .width(FIELD_WIDTH)
        .selected_text(name(*current))
        .show_ui(ui, |ui| {
            for &o in options {
                changed |= ui.selectable_value(current, o, name(o)).changed();
            }
        });
    changed
}

fn pick(native: bool, filters: &[&str]) -> Option<String> {
    if !native {
        return None;
    }
    rfd::FileDialog::new()
        .add_filter("Results", filters)
        .pick_file()
        .map(|p| p.to_string_lossy().into_owned())
}

impl ImportFieldDialog {
    /// Draws the window; returns what the user decided, if anything this frame.
    pub fn ui(
        &mut self,
        ctx: &egui::Context,
        folder: Option<PathBuf>,
        native_dialogs: bool,
    ) -> Option<ImportOutcome> {
        let running = self.poll();
        if running {
            ctx.request_repaint_after(std::time::Duration::from_millis(100));
        }
        let mut outcome = None;
        egui::Window::new("Import finite-element results")
            .collapsible(false)
            .resizable(true)
            .default_size([760.0, 640.0])
            .anchor(egui::Align2::CENTER_CENTER, [0.0, 0.0])
            .show(ctx, |ui| {
                // The form scrolls; the message and the buttons stay in sight below it.
                let form_height = (ctx.content_rect().height() - 300.0).max(200.0);
                egui::ScrollArea::vertical()
                    .max_height(form_height)
                    .show(ui, |ui| {
                        ui.label(INTRO);
                        ui.add_space(6.0);
                        let mut changed = self.part_ui(ui);
                        ui.separator();
                        changed |= self.rows_ui(ui, native_dialogs);
                        ui.separator();
                        changed |= self.units_ui(ui);
                        if changed {
                            self.forget_reading();
                        }
                    });
                ui.separator();
                outcome = self.actions_ui(ui, folder, running);
            });
        outcome
    }

    fn part_ui(&mut self, ui: &mut egui::Ui) -> bool {
        let mut changed = false;
        egui::Grid::new("import_part")
            .num_columns(2)
            .show(ui, |ui| {
                ui.label("Part name");
                changed |= ui
                    .add(egui::TextEdit::singleline(&mut self.part_name).desired_width(FIELD_WIDTH))
                    .changed();
                ui.end_row();
                ui.label("Material").on_hover_text(
                    "The material the results were computed with (its E and ν turn stresses into \
                 strains and back)",
                );
                let keys: Vec<Option<&'static str>> =
                    MATERIAL_LIBRARY.iter().map(|m| Some(m.key)).collect();
                changed |= combo(ui, "material", &mut self.material_key, &keys, |k| {
                    MATERIAL_LIBRARY
                        .iter()
                        .find(|m| Some(m.key) == k)
                        .map(|m| m.material().name)
                        .unwrap_or_default()
                });
                ui.end_row();
                ui.label("Face x axes follow").on_hover_text(
                "Each face of the part gets an x axis: this global axis of the model, projected \
                 onto the face (the next axis where it stands square to the face). Gauge \
                 positions and angles are measured in these axes.",
            );
                changed |= combo(
                    ui,
                    "axis",
                    &mut self.reference_axis,
                    &ReferenceAxis::ALL,
                    |a| a.name().to_owned(),
                );
                ui.end_row();
            });
        changed
    }

    fn rows_ui(&mut self, ui: &mut egui::Ui, native: bool) -> bool {
        let mut changed = false;
        ui.strong("Results, one per unit load");
        let mut remove = None;
        let count = self.rows.len();
        for (k, row) in self.rows.iter_mut().enumerate() {
            egui::Grid::new(("import_row", k))
                .num_columns(2)
                .show(ui, |ui| {
                    changed |= row_ui(ui, k, row, native);
                });
            if count > 1 && ui.button(format!("Remove result {}", k + 1)).clicked() {
                remove = Some(k);
            }
            ui.add_space(4.0);
        }
        if let Some(k) = remove {
            self.rows.remove(k);
            changed = true;
        }
        if self.rows.len() < IMPORTABLE.len() && ui.button("Add a result").clicked() {
            let next = IMPORTABLE
                .into_iter()
                .find(|c| self.rows.iter().all(|r| r.component != *c))
                .unwrap_or(IMPORTABLE[0]);
            self.rows.push(ResultRow {
                component: next,
                name: String::new(),
                file: String::new(),
                array: String::new(),
            });
            changed = true;
        }
        ui.add_space(4.0);
        egui::Grid::new("import_mesh")
            .num_columns(2)
            .show(ui, |ui| {
                ui.label("Cells for CSV results").on_hover_text(
                    "CSV results hold node values only: name the mesh (.vtu, .vtk, or an element \
                 CSV with rows kind,n1,n2,… numbering the nodes as the CSV rows)",
                );
                ui.horizontal(|ui| {
                    changed |= ui
                        .add(
                            egui::TextEdit::singleline(&mut self.mesh_file)
                                .desired_width(FIELD_WIDTH),
                        )
                        .changed();
                    if ui.button("Browse…").clicked()
                        && let Some(p) = pick(native, &["vtu", "vtk", "csv"])
                    {
                        self.mesh_file = p;
                        changed = true;
                    }
                });
                ui.end_row();
            });
        changed
    }

    fn units_ui(&mut self, ui: &mut egui::Ui) -> bool {
        let mut changed = false;
        ui.strong("Units of the files").on_hover_text(
            "A VTK file cannot carry its units: state them here. A CSV states them in its \
             headers (they win over these, with a note). Nothing is assumed.",
        );
        egui::Grid::new("import_units")
            .num_columns(2)
            .show(ui, |ui| {
                let not_stated = "not stated".to_owned();
                ui.label("Coordinates in");
                let lengths: Vec<Option<LengthUnit>> = std::iter::once(None)
                    .chain(LengthUnit::ALL.map(Some))
                    .collect();
                changed |= combo(ui, "length", &mut self.length, &lengths, |u| {
                    u.map_or(not_stated.clone(), |u| u.symbol().to_owned())
                });
                ui.end_row();
                ui.label("Values in");
                let tensors: Vec<Option<TensorUnit>> = std::iter::once(None)
                    .chain(TensorUnit::ALL.map(Some))
                    .collect();
                changed |= combo(ui, "tensor", &mut self.tensor, &tensors, |u| {
                    u.map_or(not_stated.clone(), |u| {
                        let what = match u.quantity() {
                            gw_mechanics::imported::TensorQuantity::Strain => "strain",
                            gw_mechanics::imported::TensorQuantity::Stress => "stress",
                        };
                        format!("{} ({what})", u.symbol())
                    })
                });
                ui.end_row();
                ui.label("Shear components are");
                let shears = [
                    None,
                    Some(ShearConvention::Engineering),
                    Some(ShearConvention::Tensor),
                ];
                changed |= combo(ui, "shear", &mut self.shear, &shears, |u| {
                    u.map_or(not_stated.clone(), |u| u.name().to_owned())
                });
                ui.end_row();
            });
        changed
    }

    fn actions_ui(
        &mut self,
        ui: &mut egui::Ui,
        folder: Option<PathBuf>,
        running: bool,
    ) -> Option<ImportOutcome> {
        let mut outcome = None;
        if let Some(m) = self.message() {
            ui.colored_label(ui.visuals().error_fg_color, m);
        }
        if let Some(s) = self.summary() {
            ui.label(s);
        }
        ui.horizontal(|ui| {
            if running {
                let (done, of, what) = self.reading_step().unwrap_or_default();
                ui.add(
                    egui::ProgressBar::new(done as f32 / of.max(1) as f32)
                        .desired_width(160.0)
                        .text(format!(
                            "step {} of {}",
                            (done + 1).min(of.max(1)),
                            of.max(1)
                        )),
                );
                ui.label(format!(
                    "{} … {:.1} s",
                    if what.is_empty() { "starting" } else { &what },
                    self.reading_for_s().unwrap_or(0.0)
                ));
                if ui.button("Cancel reading").clicked() {
                    self.cancel_reading();
                }
            } else if ui.button("Read the files").clicked() {
                self.start_reading(folder.clone());
            }
            if self.is_read()
                && ui
                    .button("Add the part")
                    .on_hover_text("Add the part to the project (Ctrl+Z removes it)")
                    .clicked()
                && let Some(part) = self.part(folder.as_deref())
            {
                outcome = Some(ImportOutcome::Add(Box::new(part)));
            }
            if ui.button("Close").clicked() {
                self.cancel_reading();
                outcome = Some(ImportOutcome::Cancel);
            }
        });
        outcome
    }
}

fn row_ui(ui: &mut egui::Ui, k: usize, row: &mut ResultRow, native: bool) -> bool {
    let mut changed = false;
    ui.label(format!("Result {}: per unit of", k + 1));
    changed |= combo(
        ui,
        &format!("component{k}"),
        &mut row.component,
        &IMPORTABLE,
        |c| format!("{} (1 {})", c.name(), c.unit()),
    );
    ui.end_row();
    ui.label("Your name for the load");
    changed |= ui
        .add(
            egui::TextEdit::singleline(&mut row.name)
                .hint_text("e.g. pull on the lifting eye")
                .desired_width(FIELD_WIDTH),
        )
        .changed();
    ui.end_row();
    ui.label("File");
    ui.horizontal(|ui| {
        changed |= ui
            .add(egui::TextEdit::singleline(&mut row.file).desired_width(FIELD_WIDTH))
            .changed();
        if ui.button("Browse…").clicked()
            && let Some(p) = pick(native, &["vtu", "vtk", "csv"])
        {
            row.file = p;
            changed = true;
        }
    });
    ui.end_row();
    ui.label("Tensor array (VTK)").on_hover_text(
        "Name of the strain or stress array; leave empty when the file has only one",
    );
    changed |= ui
        .add(egui::TextEdit::singleline(&mut row.array).desired_width(FIELD_WIDTH))
        .changed();
    ui.end_row();
    changed
}
