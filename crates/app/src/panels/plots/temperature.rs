//! Apparent strain against the part temperature, by cause: the curves that are not zero over
//! the range, and beside the plot a table that is also the legend (low end, high end, largest
//! magnitude) with the causes that are zero here. Series from `gw_plan::result_series`.

use egui::{Align2, Color32};
use egui_plot::{Line, LineStyle, Plot, PlotPoint, Text, VLine};
use gw_plan::evaluate::BridgeEvaluation;
use gw_plan::result_series::{ThermalCurve, thermal_curves};

use super::output::readable_x_axis;
use crate::panels::plots::export::{PlotTable, export_menu};
use crate::state::DocumentState;
use crate::units::{Quantity, Units, number_text};

/// Colours of the causes, in the order of `thermal_curves`.
const COLOURS: [Color32; 7] = [
    Color32::from_rgb(235, 200, 60),
    Color32::from_rgb(60, 120, 200),
    Color32::from_rgb(220, 120, 40),
    Color32::from_rgb(60, 160, 90),
    Color32::from_rgb(170, 80, 170),
    Color32::from_rgb(190, 60, 60),
    Color32::from_rgb(130, 130, 130),
];

fn colour(i: usize) -> Color32 {
    COLOURS[i % COLOURS.len()]
}

pub(super) fn temperature_ui(ui: &mut egui::Ui, doc: &DocumentState, be: &BridgeEvaluation) {
    let units = doc.units;
    let reference_c = doc.project.reference_temperature_c;
    let curves = thermal_curves(&be.temperature);
    if curves.iter().all(|c| c.points.is_empty()) {
        ui.label("No temperature sweep for this bridge: see the findings below.");
        return;
    }
    // The table needs some 380 points; beside a plot narrower than that neither reads well,
    // so a narrow view puts it under the plot.
    if ui.available_width() >= 780.0 {
        let plot_width = ui.available_width() - 400.0;
        ui.horizontal_top(|ui| {
            ui.vertical(|ui| {
                ui.set_width(plot_width);
                thermal_plot_ui(ui, units, reference_c, &curves);
            });
            ui.vertical(|ui| contributions_ui(ui, units, reference_c, &curves));
        });
    } else {
        thermal_plot_ui(ui, units, reference_c, &curves);
        contributions_ui(ui, units, reference_c, &curves);
    }
}

fn temperature_axis(units: Units) -> String {
    format!("Part temperature ({})", units.label(Quantity::Temperature))
}

fn thermal_plot_ui(ui: &mut egui::Ui, units: Units, reference_c: f64, curves: &[ThermalCurve]) {
    let t = |c: f64| units.to_display(Quantity::Temperature, c);
    let reference_text = format!(
        "reference {}",
        units.format(Quantity::Temperature, reference_c)
    );
    // The label sits at the top of the data, not of the plot's bounds: placed at the bounds it
    // would widen them every frame.
    let top = curves
        .iter()
        .filter(|c| !c.is_zero())
        .flat_map(|c| c.points.iter().map(|p| p[1] * 1e6))
        .filter(|v| v.is_finite())
        .fold(0.0, f64::max);
    let plot = readable_x_axis(Plot::new("apparent strain"), temperature_axis(units));
    let response = plot
        .height(320.0)
        .y_axis_label("Apparent strain (µε)")
        .show(ui, |plot| {
            for (i, c) in curves.iter().enumerate().filter(|(_, c)| !c.is_zero()) {
                let pts: Vec<[f64; 2]> = c.points.iter().map(|[x, y]| [t(*x), y * 1e6]).collect();
                let mut line = Line::new(c.name, pts).color(colour(i));
                line = match i {
                    0 => line.width(3.0),
                    6 => line.style(LineStyle::dashed_loose()),
                    _ => line.width(1.5),
                };
                plot.line(line);
            }
            if reference_c.is_finite() {
                let x = t(reference_c);
                plot.vline(VLine::new("Reference temperature", x).color(Color32::GRAY));
                plot.text(
                    Text::new("reference", PlotPoint::new(x, top), reference_text)
                        .anchor(Align2::LEFT_TOP)
                        .color(Color32::GRAY),
                );
            }
        });
    export_menu(&response.response, "Apparent strain vs temperature", || {
        thermal_table(units, curves)
    });
}

fn thermal_table(units: Units, curves: &[ThermalCurve]) -> PlotTable {
    let mut columns = vec![temperature_axis(units)];
    columns.extend(curves.iter().map(|c| format!("{} (µε)", c.name)));
    let n = curves.iter().map(|c| c.points.len()).max().unwrap_or(0);
    let rows = (0..n)
        .map(|k| {
            let temperature = curves
                .iter()
                .find_map(|c| c.points.get(k))
                .map_or(String::new(), |p| {
                    units.format_table_number(Quantity::Temperature, p[0])
                });
            let mut row = vec![temperature];
            row.extend(curves.iter().map(|c| {
                c.points
                    .get(k)
                    .map_or(String::new(), |p| number_text(p[1] * 1e6, 3))
            }));
            row
        })
        .collect();
    PlotTable { columns, rows }
}

/// The legend and contributions table, then the causes that are zero over the range.
fn contributions_ui(ui: &mut egui::Ui, units: Units, reference_c: f64, curves: &[ThermalCurve]) {
    let (Some(first), Some(last)) = (
        curves.iter().find_map(|c| c.points.first()),
        curves.iter().find_map(|c| c.points.last()),
    ) else {
        return;
    };
    let at = |c: f64| units.format(Quantity::Temperature, c);
    ui.strong("Apparent strain (µε)");
    let response = egui::Grid::new("thermal contributions")
        .striped(true)
        .num_columns(5)
        .show(ui, |ui| {
            ui.label("");
            ui.label("Cause");
            ui.label(format!("at {}", at(first[0])));
            ui.label(format!("at {}", at(last[0])));
            ui.label("largest magnitude");
            ui.end_row();
            for (i, c) in curves.iter().enumerate().filter(|(_, c)| !c.is_zero()) {
                swatch_ui(ui, colour(i), i == 6);
                ui.label(c.name);
                for v in [c.at_low, c.at_high, c.largest] {
                    ui.label(units.format_table_number(Quantity::Strain, v));
                }
                ui.end_row();
            }
        });
    export_menu(&response.response, "Apparent strain contributions", || {
        contributions_table(units, curves, first[0], last[0])
    });
    ui.weak(format!(
        "Grey vertical line: the reference temperature {}, where bridges are zeroed.",
        at(reference_c)
    ));
    let zero: Vec<&str> = curves
        .iter()
        .filter(|c| c.is_zero())
        .map(|c| c.name)
        .collect();
    if !zero.is_empty() {
        ui.add_space(6.0);
        ui.strong("Zero here (not drawn)");
        for name in zero {
            ui.label(name);
        }
    }
}

/// A short line in the curve's colour, dashed for the comparison curve.
fn swatch_ui(ui: &mut egui::Ui, colour: Color32, dashed: bool) {
    let (rect, _) = ui.allocate_exact_size(egui::vec2(22.0, 10.0), egui::Sense::hover());
    let y = rect.center().y;
    let stroke = egui::Stroke::new(2.5, colour);
    if dashed {
        for k in 0..3 {
            let x = rect.left() + k as f32 * 8.0;
            ui.painter()
                .line_segment([egui::pos2(x, y), egui::pos2(x + 4.0, y)], stroke);
        }
    } else {
        ui.painter().line_segment(
            [egui::pos2(rect.left(), y), egui::pos2(rect.right(), y)],
            stroke,
        );
    }
}

fn contributions_table(
    units: Units,
    curves: &[ThermalCurve],
    low_c: f64,
    high_c: f64,
) -> PlotTable {
    let at = |c: f64| units.format(Quantity::Temperature, c);
    let rows = curves
        .iter()
        .map(|c| {
            vec![
                c.name.to_owned(),
                format!("{:.3}", c.at_low * 1e6),
                format!("{:.3}", c.at_high * 1e6),
                format!("{:.3}", c.largest * 1e6),
            ]
        })
        .collect();
    PlotTable {
        columns: vec![
            "Cause".into(),
            format!("At {} (µε)", at(low_c)),
            format!("At {} (µε)", at(high_c)),
            "Largest magnitude (µε)".into(),
        ],
        rows,
    }
}
