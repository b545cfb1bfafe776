//! Apparent strain against the part temperature, by cause.

use egui_plot::{Legend, Line, Plot};
use gw_plan::evaluate::BridgeEvaluation;

pub(super) fn temperature_ui(ui: &mut egui::Ui, be: &BridgeEvaluation) {
    Plot::new("apparent strain")
        .legend(Legend::default())
        .height(320.0)
        .x_axis_label("Part temperature (°C)")
        .y_axis_label("Apparent strain (µε)")
        .show(ui, |plot| {
            let series =
                |f: &dyn Fn(&gw_bridge::temperature::ThermalPoint) -> f64| -> Vec<[f64; 2]> {
                    be.temperature
                        .iter()
                        .map(|p| [p.temperature_c, f(p) * 1e6])
                        .collect()
                };
            plot.line(Line::new("Total (this arrangement)", series(&|p| p.total)).width(3.0));
            plot.line(Line::new(
                "Gauge thermal output",
                series(&|p| p.gauge_thermal_output),
            ));
            plot.line(Line::new(
                "Expansion mismatch",
                series(&|p| p.expansion_mismatch),
            ));
            plot.line(Line::new(
                "Gauge-factor drift at full load",
                series(&|p| p.gauge_factor_drift),
            ));
            plot.line(Line::new("Lead resistance", series(&|p| p.lead_resistance)));
            plot.line(Line::new(
                "Completion drift",
                series(&|p| p.completion_drift),
            ));
            plot.line(
                Line::new("Without cancellation", series(&|p| p.uncompensated))
                    .style(egui_plot::LineStyle::dashed_loose()),
            );
        });
}
