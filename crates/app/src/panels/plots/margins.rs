//! Utilisation of every limit at the selected load case.

use egui_plot::{Bar, BarChart, Plot, VLine};
use gw_plan::evaluate::BridgeEvaluation;

use super::status_colour;
use crate::panels::palette;
use crate::state::DocumentState;

pub(super) fn margins_ui(ui: &mut egui::Ui, doc: &DocumentState, be: &BridgeEvaluation) {
    let Some(case) = be.cases.get(doc.selection.case).or(be.cases.first()) else {
        return;
    };
    ui.label(format!("Load case: {}", case.case));
    let bars: Vec<Bar> = case
        .margins
        .iter()
        .enumerate()
        .map(|(i, m)| {
            Bar::new(i as f64, (m.utilisation * 100.0).min(400.0))
                .name(format!("{} ({})", m.kind.name(), m.status.word()))
                .fill(status_colour(m.status))
        })
        .collect();
    Plot::new("margins")
        .height(260.0)
        .y_axis_label("Margin item")
        .x_axis_label("Utilisation (%)")
        .show(ui, |plot| {
            plot.bar_chart(BarChart::new("utilisation", bars).horizontal());
            plot.vline(VLine::new("limit", 100.0).color(palette::FAIL));
        });
    egui::Grid::new("margin table")
        .striped(true)
        .num_columns(3)
        .show(ui, |ui| {
            for m in &case.margins {
                ui.label(m.kind.name());
                ui.label(format!("{:.1} %", m.utilisation * 100.0));
                ui.colored_label(status_colour(m.status), m.status.word());
                ui.end_row();
            }
        });
    match be.accuracy.iter().find(|a| a.case == case.case) {
        Some(a) => {
            ui.colored_label(
                status_colour(a.margin.status),
                format!("Accuracy: {}", a.describe(be.wanted.unit())),
            );
        }
        None if be.accuracy.is_empty() => {
            ui.weak("No required accuracy stated for this bridge (Inspector › Accuracy).");
        }
        None => {}
    }
}
