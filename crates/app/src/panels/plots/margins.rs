//! Utilisation of every limit at the selected load case, closest to failing first.

use egui::{Color32, Response, RichText, Sense, Stroke, vec2};
use gw_plan::evaluate::BridgeEvaluation;
use gw_plan::result_tables::{
    BAR_CAP_PERCENT, MarginRow, accuracy_at, accuracy_sentence, closest_sentence, margin_rows,
};

use super::export::{PlotTable, export_menu};
use super::status_colour;
use crate::panels::palette;
use crate::state::DocumentState;
use crate::units::Quantity;

/// The widest of `texts` on one line in the body font (`strong` for headers alike).
pub(super) fn widest<'a>(ui: &egui::Ui, texts: impl IntoIterator<Item = &'a str>) -> f32 {
    texts
        .into_iter()
        .map(|t| {
            egui::WidgetText::from(RichText::new(t).strong())
                .into_galley(
                    ui,
                    Some(egui::TextWrapMode::Extend),
                    f32::INFINITY,
                    egui::TextStyle::Body,
                )
                .size()
                .x
        })
        .fold(0.0, f32::max)
}

/// The narrowest bar column before names wrap.
const BAR_MIN: f32 = 80.0;

/// Width of the name column: the widest name, or less where the view is narrow, so that the
/// bar keeps [`BAR_MIN`] beside the other columns (`others`, their widths); never under two
/// fifths of the view.
pub(super) fn name_column_width<'a>(
    ui: &egui::Ui,
    names: impl IntoIterator<Item = &'a str>,
    others: &[f32],
) -> f32 {
    let spare = ui.available_width()
        - others.iter().sum::<f32>()
        - BAR_MIN
        - ui.spacing().item_spacing.x * (others.len() as f32 + 2.0)
        - 16.0;
    widest(ui, names).min(spare.max(0.4 * ui.available_width()))
}

/// A name in a column `width` wide, wrapped onto a second line when longer.
pub(super) fn wrapped_name_ui(ui: &mut egui::Ui, width: f32, name: &str) {
    ui.scope(|ui| {
        ui.set_max_width(width);
        ui.add(egui::Label::new(name).wrap());
    });
}

/// Width of the bar column: what is left of the panel after the other columns (`others`, their
/// widths) and the spacing between `others.len() + 1` columns.
pub(super) fn bar_width(ui: &egui::Ui, others: &[f32]) -> f32 {
    let spacing = ui.spacing().item_spacing.x * (others.len() as f32 + 1.0);
    // A little to spare for the scroll bar of the panel.
    let left = ui.available_width() - others.iter().sum::<f32>() - spacing - 16.0;
    left.clamp(60.0, 480.0)
}

/// A horizontal bar filling `fraction` (0…1) of a cell `width` wide, with a vertical mark at
/// `mark` (0…1) when given.
pub(super) fn bar_cell_ui(
    ui: &mut egui::Ui,
    width: f32,
    fraction: f64,
    fill: Color32,
    mark: Option<f64>,
) -> Response {
    let height = ui.spacing().interact_size.y;
    let (rect, response) = ui.allocate_exact_size(vec2(width, height), Sense::hover());
    let painter = ui.painter_at(rect);
    let bar_height = height * 0.7;
    let top = rect.center().y - bar_height / 2.0;
    let length = width * fraction.clamp(0.0, 1.0) as f32;
    painter.rect_filled(
        egui::Rect::from_min_size(egui::pos2(rect.left(), top), vec2(length, bar_height)),
        2.0,
        fill,
    );
    if let Some(m) = mark {
        let x = rect.left() + width * m.clamp(0.0, 1.0) as f32;
        painter.vline(x, rect.y_range(), Stroke::new(2.0, palette::FAIL));
    }
    response
}

/// The header above the bars: "0 %" at the left, "100 % = limit" at the limit line.
fn axis_header_ui(ui: &mut egui::Ui, width: f32, limit_at: f64) {
    let height = ui.spacing().interact_size.y;
    let (rect, _) = ui.allocate_exact_size(vec2(width, height), Sense::hover());
    let painter = ui.painter_at(rect);
    let font = egui::TextStyle::Body.resolve(ui.style());
    let colour = ui.visuals().weak_text_color();
    let x = rect.left() + width * limit_at as f32;
    painter.vline(x, rect.y_range(), Stroke::new(2.0, palette::FAIL));
    let text_width = |t: &str| {
        painter
            .layout_no_wrap(t.to_owned(), font.clone(), colour)
            .size()
            .x
    };
    // Left of the line there is room for "0 %" and "limit 100 %", or for the limit alone in
    // a narrow column, or for "100 %"; the labels never overlap.
    let room = x - 3.0 - rect.left();
    let zero = text_width("0 %") + 8.0;
    let (show_zero, limit) = if room >= zero + text_width("limit 100 %") {
        (true, "limit 100 %")
    } else if room >= text_width("limit 100 %") {
        (false, "limit 100 %")
    } else {
        (false, "100 %")
    };
    if show_zero {
        painter.text(
            rect.left_center(),
            egui::Align2::LEFT_CENTER,
            "0 %",
            font.clone(),
            colour,
        );
    }
    painter.text(
        egui::pos2(x - 3.0, rect.center().y),
        egui::Align2::RIGHT_CENTER,
        limit,
        font,
        palette::FAIL,
    );
}

pub(super) fn margins_ui(ui: &mut egui::Ui, doc: &DocumentState, be: &BridgeEvaluation) {
    let Some((case, rows)) = margin_rows(be, doc.selection.case) else {
        ui.label("This bridge has no load case to judge.");
        return;
    };
    ui.label(format!("Load case: {case}"));
    ui.strong(closest_sentence(&rows));
    let figures: Vec<String> = rows
        .iter()
        .map(|r| r.figures_text(doc.units, be.wanted))
        .collect();
    let response = margin_bars_ui(ui, &rows, &figures);
    export_menu(&response, "Margins", || {
        margins_table(&case, &rows, &figures)
    });
    accuracy_ui(ui, doc, be, &case);
}

/// One row per limit: its name, a bar of its utilisation against the 100 % line, the number
/// and the verdict, and the value against the limit in the display units.
fn margin_bars_ui(ui: &mut egui::Ui, rows: &[MarginRow], figures: &[String]) -> Response {
    let scale = rows
        .iter()
        .map(|r| r.percent)
        .filter(|p| p.is_finite())
        .fold(120.0_f64, f64::max)
        .min(BAR_CAP_PERCENT);
    let values: Vec<String> = rows.iter().map(value_text).collect();
    let name_width = name_column_width(
        ui,
        rows.iter().map(|r| r.name.as_str()).chain(["Limit"]),
        &[
            widest(
                ui,
                values.iter().map(String::as_str).chain(["Utilisation (%)"]),
            ),
            widest(ui, figures.iter().map(String::as_str).chain([FIGURES])),
        ],
    );
    let width = bar_width(
        ui,
        &[
            name_width,
            widest(
                ui,
                values.iter().map(String::as_str).chain(["Utilisation (%)"]),
            ),
            widest(ui, figures.iter().map(String::as_str).chain([FIGURES])),
        ],
    );
    egui::Grid::new("margin bars")
        .striped(true)
        .num_columns(4)
        .show(ui, |ui| {
            ui.strong("Limit");
            axis_header_ui(ui, width, 100.0 / scale);
            ui.strong("Utilisation (%)");
            ui.strong(FIGURES);
            ui.end_row();
            for ((r, value), figure) in rows.iter().zip(values).zip(figures) {
                wrapped_name_ui(ui, name_width, &r.name);
                let fraction = if r.percent.is_finite() {
                    r.percent / scale
                } else {
                    1.0
                };
                bar_cell_ui(
                    ui,
                    width,
                    fraction,
                    status_colour(r.status),
                    Some(100.0 / scale),
                );
                ui.colored_label(status_colour(r.status), value);
                ui.label(figure);
                ui.end_row();
            }
        })
        .response
}

/// "49.3 % (pass)".
fn value_text(r: &MarginRow) -> String {
    format!("{} ({})", r.percent_text(), r.status.word())
}

/// The heading of the value-against-limit column.
const FIGURES: &str = "Value of limit";

fn margins_table(case: &str, rows: &[MarginRow], figures: &[String]) -> PlotTable {
    PlotTable {
        columns: vec![
            "Load case".into(),
            "Limit".into(),
            "Utilisation (%)".into(),
            "Status".into(),
            FIGURES.into(),
        ],
        rows: rows
            .iter()
            .zip(figures)
            .map(|(r, figure)| {
                vec![
                    case.to_owned(),
                    r.name.clone(),
                    if r.percent.is_finite() {
                        format!("{}", r.percent)
                    } else {
                        "—".into()
                    },
                    r.status.word().to_owned(),
                    figure.clone(),
                ]
            })
            .collect(),
    }
}

/// The accuracy check at the case in the display units, its breakdown on hover.
fn accuracy_ui(ui: &mut egui::Ui, doc: &DocumentState, be: &BridgeEvaluation, case: &str) {
    match accuracy_at(be, case) {
        Some(a) => {
            ui.colored_label(
                status_colour(a.margin.status),
                accuracy_sentence(a, doc.units, Quantity::of(be.wanted)),
            )
            .on_hover_text(a.describe(be.wanted, doc.units));
        }
        None if be.accuracy.is_empty() => {
            ui.weak("No required accuracy stated for this bridge (Inspector › Accuracy).");
        }
        None => {
            ui.weak("The required accuracy does not apply at this load case.");
        }
    }
}
