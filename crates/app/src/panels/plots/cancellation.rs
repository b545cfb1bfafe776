//! What cancels what: each bridge's response to every load component, the rejection of
//! unwanted loads at the selected load case and the multi-bridge recovery matrix. Each table
//! keeps its first column in place and scrolls the rest sideways.

use egui::{Response, RichText};
use gw_plan::evaluate::PartEvaluation;
use gw_plan::result_tables::{
    ResultTable, cross_talk_table, recovery_table, rejection_table, sensitivity_table,
};

use super::export::{PlotTable, export_menu};
use crate::state::DocumentState;

pub(super) fn cancellation_ui(ui: &mut egui::Ui, doc: &DocumentState, pe: &PartEvaluation) {
    if pe.bridges.is_empty() {
        ui.label("No bridge could be evaluated.");
        return;
    }
    egui::ScrollArea::vertical()
        .id_salt("cancellation scroll")
        .auto_shrink([false, true])
        .show(ui, |ui| {
            sensitivities_ui(ui, doc, pe);
            ui.separator();
            rejection_ui(ui, doc, pe);
            if pe.multi_axis.is_some() {
                ui.separator();
                multi_axis_ui(ui, doc, pe);
            }
        });
}

fn sensitivities_ui(ui: &mut egui::Ui, doc: &DocumentState, pe: &PartEvaluation) {
    ui.strong("Displayed strain per unit of each load");
    ui.label(
        "Each bridge's reading per unit of every load the part carries; its wanted load in bold.",
    );
    let table = sensitivity_table(pe, doc.units);
    titled_table_ui(ui, "Sensitivities", &table);
}

fn rejection_ui(ui: &mut egui::Ui, doc: &DocumentState, pe: &PartEvaluation) {
    let Some(part) = doc.project.parts.get(pe.part_index) else {
        return;
    };
    let Some(case) = part
        .load_cases
        .get(doc.selection.case)
        .or(part.load_cases.first())
    else {
        ui.label("Rejection of unwanted loads: the part has no load case.");
        return;
    };
    ui.strong(format!(
        "Rejection of unwanted loads at load case \"{}\"",
        case.name
    ));
    ui.label(
        "Each unwanted load's share of the reading: |its sensitivity × its value| over \
         |the wanted load's sensitivity × its value|, in dB (20 log₁₀ of the inverse) and in % \
         of the wanted reading. \"—\": the case applies no wanted load to compare with.",
    );
    let table = rejection_table(pe, &case.loads);
    titled_table_ui(ui, "Rejection of unwanted loads", &table);
}

fn multi_axis_ui(ui: &mut egui::Ui, doc: &DocumentState, pe: &PartEvaluation) {
    let Some(m) = &pe.multi_axis else {
        return;
    };
    ui.strong("Several bridges together");
    ui.label(format!(
        "Condition number {} (1 is ideal; large values mean the bridges cannot tell the loads apart).",
        gw_plan::units::number_text(m.condition_number, 2)
    ));
    ui.label("Recovery matrix: each recovered load = Σ (row entry × that bridge's displayed strain in µε).");
    titled_table_ui(ui, "Recovery matrix", &recovery_table(m, doc.units));
    if !m.cross_talk.is_empty() {
        ui.label("What one unit of each load not solved for puts into every recovered load:");
        titled_table_ui(ui, "Cross-talk", &cross_talk_table(m, doc.units));
    }
}

/// A table with its export menu.
fn titled_table_ui(ui: &mut egui::Ui, title: &str, table: &ResultTable) {
    let response = frozen_table_ui(ui, title, table);
    export_menu(&response, title, || plot_table(table));
}

/// A label that stays on one line (the table scrolls instead of wrapping).
fn cell_ui(ui: &mut egui::Ui, text: &str, strong: bool) {
    let text = if strong {
        RichText::new(text).strong()
    } else {
        RichText::new(text)
    };
    ui.add(egui::Label::new(text).extend());
}

/// The first column drawn in place, the others in a sideways scroll area beside it; both
/// grids have the same rows of the same height, so the rows line up.
fn frozen_table_ui(ui: &mut egui::Ui, id: &str, table: &ResultTable) -> Response {
    let row_height = ui.spacing().interact_size.y;
    ui.horizontal_top(|ui| {
        egui::Grid::new((id, "names"))
            .striped(true)
            .min_row_height(row_height)
            .show(ui, |ui| {
                cell_ui(ui, &table.corner, true);
                ui.end_row();
                for row in &table.rows {
                    cell_ui(ui, &row.name, false);
                    ui.end_row();
                }
            });
        // A solid bar below the cells, not one floating over the last row.
        ui.spacing_mut().scroll = egui::style::ScrollStyle::solid();
        egui::ScrollArea::horizontal()
            .id_salt((id, "scroll"))
            // Always shown, so that the columns beyond the edge are seen to be there.
            .scroll_bar_visibility(egui::scroll_area::ScrollBarVisibility::AlwaysVisible)
            .show(ui, |ui| {
                egui::Grid::new((id, "cells"))
                    .striped(true)
                    .min_row_height(row_height)
                    .num_columns(table.columns.len())
                    .show(ui, |ui| {
                        for header in &table.columns {
                            cell_ui(ui, header, true);
                        }
                        ui.end_row();
                        for row in &table.rows {
                            for (i, cell) in row.cells.iter().enumerate() {
                                cell_ui(ui, cell, row.stressed == Some(i));
                            }
                            ui.end_row();
                        }
                    });
            });
    })
    .response
}

fn plot_table(table: &ResultTable) -> PlotTable {
    PlotTable {
        columns: std::iter::once(table.corner.clone())
            .chain(table.columns.iter().cloned())
            .collect(),
        rows: table
            .rows
            .iter()
            .map(|r| {
                std::iter::once(r.name.clone())
                    .chain(r.cells.iter().cloned())
                    .collect()
            })
            .collect(),
    }
}
