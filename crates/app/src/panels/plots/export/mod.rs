//! Saving a plot as a picture and its numbers as CSV, from the plot's context menu.
//!
//! The menu is drawn deep inside a results tab and cannot reach the app, so it leaves an
//! [`ExportRequest`] in egui's memory for this frame. The app takes it after drawing
//! ([`take_request`]), asks for a path (the desktop's save dialog or a typed path) and hands the
//! request and the path to [`PlotExport::write`]. Data is written at once; a picture waits until
//! the dialogs are gone, asks the window for a screenshot, and is cropped to the plot when the
//! screenshot arrives ([`PlotExport::on_frame`]). Every outcome reaches the user as a notice.

mod data;
mod picture;

use std::path::{Path, PathBuf};

pub use data::{table_csv, write_table_csv};
pub use picture::{crop_to_rect, pixel_region, png_bytes};

use crate::state::{DocumentState, Notice};
use picture::PictureShot;

/// The numbers behind a plot or a table: a header row and rows of cells, each column's unit in
/// its header ("Load (kN)").
#[derive(Debug, Clone, PartialEq, Default)]
pub struct PlotTable {
    /// Column headers with units.
    pub columns: Vec<String>,
    /// Rows of cells, as shown or at full precision.
    pub rows: Vec<Vec<String>>,
}

/// What the context menu of a plot asked for.
#[derive(Debug, Clone, PartialEq)]
pub enum ExportRequest {
    /// The plot as shown on screen, as a PNG picture.
    Picture {
        /// The plot's title.
        name: String,
        /// The part of the window to keep, in points.
        rect: egui::Rect,
    },
    /// The plot's numbers, as CSV.
    Data {
        /// The plot's title.
        name: String,
        /// The numbers.
        table: PlotTable,
    },
}

impl ExportRequest {
    /// The plot's title.
    pub fn name(&self) -> &str {
        match self {
            ExportRequest::Picture { name, .. } | ExportRequest::Data { name, .. } => name,
        }
    }

    /// The file extension written, without the dot.
    pub fn extension(&self) -> &'static str {
        match self {
            ExportRequest::Picture { .. } => "png",
            ExportRequest::Data { .. } => "csv",
        }
    }

    /// The file name offered in the save dialog: "Output vs load" → "output-vs-load.png".
    pub fn suggested_file_name(&self) -> String {
        format!("{}.{}", file_stem(self.name()), self.extension())
    }
}

/// A thin edge kept around the picture, points.
const EDGE_MARGIN: f32 = 4.0;

/// Widgets whose edges lie this close are taken as touching, points.
const TOUCH: f32 = 0.5;

/// The part of the window a picture of a plot keeps: what `response` covers and the widgets
/// allocated right after it that touch it from outside. A plot's response covers only its data
/// area; its axes (tick labels and titles) are such widgets, and a picture without them cannot
/// be read. A table or a bar chart has none, and keeps its own rect.
pub fn picture_rect(response: &egui::Response) -> egui::Rect {
    let following: Vec<egui::Rect> = response.ctx.viewport(|v| {
        let widgets = &v.this_pass.widgets;
        let Some((layer, index)) = widgets.order(response.id) else {
            return Vec::new();
        };
        widgets
            .get_layer(layer)
            .skip(index + 1)
            .map(|w| w.rect)
            .collect()
    });
    with_touching(response.rect, following).expand(EDGE_MARGIN)
}

/// `rect` grown by the run of `following` rects that each touch it from outside along a whole
/// side's overlap (as a plot's axes do); the run ends at the first that does not.
pub fn with_touching(
    rect: egui::Rect,
    following: impl IntoIterator<Item = egui::Rect>,
) -> egui::Rect {
    let mut grown = rect;
    for r in following {
        let overlaps_x = r.min.x < rect.max.x && r.max.x > rect.min.x;
        let overlaps_y = r.min.y < rect.max.y && r.max.y > rect.min.y;
        let below_or_above = overlaps_x
            && ((r.min.y - rect.max.y).abs() <= TOUCH || (r.max.y - rect.min.y).abs() <= TOUCH);
        let left_or_right = overlaps_y
            && ((r.max.x - rect.min.x).abs() <= TOUCH || (r.min.x - rect.max.x).abs() <= TOUCH);
        if !(below_or_above || left_or_right) {
            break;
        }
        grown = grown.union(r);
    }
    grown
}

/// A plain file name from a title: lower case letters and digits, words joined by '-'.
pub fn file_stem(name: &str) -> String {
    let mut stem = String::new();
    for word in name
        .split(|c: char| !c.is_alphanumeric())
        .filter(|w| !w.is_empty())
    {
        if !stem.is_empty() {
            stem.push('-');
        }
        stem.extend(word.chars().flat_map(char::to_lowercase));
    }
    if stem.is_empty() {
        "plot".to_owned()
    } else {
        stem
    }
}

fn request_id() -> egui::Id {
    egui::Id::unique("gaugewright plot export request")
}

/// Adds the context menu to a drawn plot or table: "Save picture as PNG…" and "Save data as
/// CSV…". `name` is the plot's title (the default file name); `table` builds the numbers only
/// when the menu asks for them.
pub fn export_menu(response: &egui::Response, name: &str, table: impl FnOnce() -> PlotTable) {
    // The container form opens on a right click anywhere inside, whether the response senses
    // clicks (a plot) or only hovering (a table or grid of bars, whose cells take the clicks).
    response.container_context_menu(|ui| {
        let mut request = None;
        if ui
            .button("Save picture as PNG…")
            .on_hover_text("The plot as shown, with its axes, as a PNG picture")
            .clicked()
        {
            request = Some(ExportRequest::Picture {
                name: name.to_owned(),
                rect: picture_rect(response),
            });
        }
        if ui
            .button("Save data as CSV…")
            .on_hover_text("The numbers behind the plot, with units in the headers")
            .clicked()
        {
            request = Some(ExportRequest::Data {
                name: name.to_owned(),
                table: table(),
            });
        }
        if let Some(request) = request {
            ui.ctx()
                .data_mut(|d| d.insert_temp(request_id(), Some(request)));
            ui.close();
        }
    });
}

/// The request a plot's menu made in this frame, if any (taken, so it is answered once).
pub fn take_request(ctx: &egui::Context) -> Option<ExportRequest> {
    ctx.data_mut(|d| d.remove_temp::<Option<ExportRequest>>(request_id()))
        .flatten()
}

/// The app's side of plot export: a request waiting for its path, and a picture waiting for
/// its screenshot.
#[derive(Default)]
pub struct PlotExport {
    waiting: Option<ExportRequest>,
    shot: Option<PictureShot>,
}

impl PlotExport {
    /// Keeps `request` until its path is chosen (a newer request replaces it).
    pub fn wait_for_path(&mut self, request: ExportRequest) {
        self.waiting = Some(request);
    }

    /// Writes the waiting request to `path`: data at once, a picture once the window has been
    /// drawn without the dialog. Nothing waiting: says so.
    pub fn write(&mut self, path: &Path, doc: &mut DocumentState) {
        let Some(request) = self.waiting.take() else {
            doc.notice = Some(notice(
                true,
                "Nothing to save: right-click a plot and choose what to save.".to_owned(),
            ));
            return;
        };
        let path = with_extension(path, request.extension());
        if let Some(refusal) = refuse_project(&path, doc) {
            doc.notice = Some(refusal);
            return;
        }
        match request {
            ExportRequest::Data { name, table } => {
                doc.notice = Some(match write_table_csv(&table, &path) {
                    Ok(()) => notice(
                        false,
                        format!("Saved the data of \"{name}\" to {}", path.display()),
                    ),
                    Err(e) => notice(
                        true,
                        format!(
                            "Could not save the data of \"{name}\": {e}. The project is \
                             unchanged; choose another folder."
                        ),
                    ),
                });
            }
            ExportRequest::Picture { name, rect } => {
                self.shot = Some(PictureShot::new(name, rect, path));
            }
        }
    }

    /// Call once per frame after drawing. `dialog_open`: a dialog covers the window, so the
    /// picture waits.
    pub fn on_frame(&mut self, ctx: &egui::Context, doc: &mut DocumentState, dialog_open: bool) {
        let Some(shot) = &mut self.shot else {
            return;
        };
        if let Some(done) = shot.on_frame(ctx, dialog_open) {
            doc.notice = Some(done);
            self.shot = None;
        }
    }
}

/// A typed path without an extension gains the one for what is written.
fn with_extension(path: &Path, extension: &str) -> PathBuf {
    if path.extension().is_none() {
        path.with_extension(extension)
    } else {
        path.to_path_buf()
    }
}

/// A refusal when `path` is the open project or holds another project.
fn refuse_project(path: &Path, doc: &DocumentState) -> Option<Notice> {
    use gw_plan::safe_write::{holds_a_project, same_file};
    let on_project = doc.path.as_deref().is_some_and(|o| same_file(path, o));
    (on_project || holds_a_project(path)).then(|| {
        notice(
            true,
            format!(
                "Did not save: {} is a project file and would be lost. Choose another name.",
                path.display()
            ),
        )
    })
}

fn notice(is_error: bool, text: String) -> Notice {
    Notice { is_error, text }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn file_stem_joins_words_in_lower_case() {
        assert_eq!(file_stem("Output vs load"), "output-vs-load");
        assert_eq!(file_stem("  Margins / limits (%) "), "margins-limits");
        assert_eq!(file_stem("Strain (µε)"), "strain-µε");
        assert_eq!(file_stem("—"), "plot");
    }

    #[test]
    fn suggested_name_carries_the_extension() {
        let data = ExportRequest::Data {
            name: "What cancels what".into(),
            table: PlotTable::default(),
        };
        assert_eq!(data.suggested_file_name(), "what-cancels-what.csv");
        let picture = ExportRequest::Picture {
            name: "Temperature".into(),
            rect: egui::Rect::ZERO,
        };
        assert_eq!(picture.suggested_file_name(), "temperature.png");
    }

    #[test]
    fn picture_takes_the_axes_that_touch_the_plot_area() {
        use egui::{Rect, pos2};
        let area = Rect::from_min_max(pos2(100.0, 50.0), pos2(400.0, 250.0));
        let x_axis = Rect::from_min_max(pos2(100.0, 250.0), pos2(400.0, 280.0));
        let y_axis = Rect::from_min_max(pos2(50.0, 50.0), pos2(100.0, 250.0));
        // The next line of text, below the plot after the item spacing: not part of it.
        let next = Rect::from_min_max(pos2(0.0, 284.0), pos2(300.0, 300.0));
        let grown = with_touching(area, [x_axis, y_axis, next]);
        assert_eq!(
            grown,
            Rect::from_min_max(pos2(50.0, 50.0), pos2(400.0, 280.0))
        );
        // A widget inside the rect (a table's cell) ends the run.
        let cell = Rect::from_min_max(pos2(100.0, 50.0), pos2(150.0, 70.0));
        assert_eq!(with_touching(area, [cell, x_axis]), area);
        assert_eq!(with_touching(area, [next]), area);
    }

    #[test]
    fn typed_path_without_extension_gains_one() {
        assert_eq!(
            with_extension(Path::new("/tmp/a"), "csv"),
            PathBuf::from("/tmp/a.csv")
        );
        assert_eq!(
            with_extension(Path::new("/tmp/a.txt"), "csv"),
            PathBuf::from("/tmp/a.txt")
        );
    }

    #[test]
    fn writing_with_nothing_waiting_says_so() {
        let mut doc = DocumentState::new(gw_plan::demo::demo_project(), None);
        let mut export = PlotExport::default();
        let path = std::env::temp_dir().join(format!("gw-nothing-{}.csv", std::process::id()));
        export.write(&path, &mut doc);
        assert!(doc.notice.as_ref().is_some_and(|n| n.is_error));
        assert!(!path.exists());
    }

    #[test]
    fn data_is_not_written_over_a_project() {
        let dir = std::env::temp_dir().join(format!("gw-export-guard-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let project = dir.join("p.ron");
        gw_plan::save_project(&gw_plan::demo::demo_project(), &project).unwrap();
        let before = std::fs::read(&project).unwrap();
        let mut doc = DocumentState::new(gw_plan::demo::demo_project(), None);
        let mut export = PlotExport::default();
        export.wait_for_path(ExportRequest::Data {
            name: "Output vs load".into(),
            table: PlotTable {
                columns: vec!["a".into()],
                rows: vec![vec!["1".into()]],
            },
        });
        export.write(&project, &mut doc);
        assert_eq!(std::fs::read(&project).unwrap(), before);
        let n = doc.notice.expect("a notice");
        assert!(n.is_error && n.text.contains("project file"), "{}", n.text);
    }
}
