//! Output against load: each load case's ramp and the straight line.

use egui_plot::{Legend, Line, Plot};
use gw_plan::evaluate::BridgeEvaluation;

use crate::panels::capitalise;
use crate::state::DocumentState;
use crate::units::{Quantity, microstrain};

pub(super) fn output_ui(ui: &mut egui::Ui, doc: &DocumentState, be: &BridgeEvaluation) {
    let units = doc.units;
    let q = Quantity::of(be.wanted);
    for c in &be.cases {
        let nl = c
            .ramp
            .iter()
            .map(|p| (p.displayed_strain - p.linear_strain).abs())
            .fold(0.0, f64::max);
        ui.label(format!(
            "{}: {:.4} mV/V, displays {} (target {}); largest departure from the straight line {}",
            c.case,
            c.reading.mv_per_v,
            microstrain(c.reading.displayed_strain),
            microstrain(c.reading.target_strain),
            microstrain(nl)
        ));
    }
    zero_and_conversion_ui(ui, doc, be);
    Plot::new("output vs load")
        .legend(Legend::default())
        .height(300.0)
        .x_axis_label(format!(
            "{} ({})",
            capitalise(be.wanted.name()),
            units.label(q)
        ))
        .y_axis_label("Displayed strain (µε)")
        .show(ui, |plot| {
            for c in &be.cases {
                let pts: Vec<[f64; 2]> = c
                    .ramp
                    .iter()
                    .map(|p| {
                        [
                            units.to_display(q, p.wanted_value),
                            p.displayed_strain * 1e6,
                        ]
                    })
                    .collect();
                let lin: Vec<[f64; 2]> = c
                    .ramp
                    .iter()
                    .map(|p| [units.to_display(q, p.wanted_value), p.linear_strain * 1e6])
                    .collect();
                plot.line(Line::new(c.case.clone(), pts));
                plot.line(
                    Line::new(format!("{} straight line", c.case), lin)
                        .style(egui_plot::LineStyle::dashed_dense()),
                );
            }
        });
}

/// The zero reading a technician should see at no load, with its statistical and worst-case
/// spread, and the wanted load per mV/V in the display unit.
fn zero_and_conversion_ui(ui: &mut egui::Ui, doc: &DocumentState, be: &BridgeEvaluation) {
    let z = &be.zero_band;
    ui.label(format!(
        "Zero at no load: {:.4} mV/V, ± {:.4} mV/V from resistance tolerances (k = {}), {:.4} to \
         {:.4} mV/V at worst",
        z.centre_mv_per_v,
        z.statistical_mv_per_v,
        z.coverage_k,
        z.worst_low_mv_per_v,
        z.worst_high_mv_per_v
    ))
    .on_hover_text(
        "Nominal zero of the exact circuit (leads included); the ± treats each arm's resistance \
         tolerance as rectangular (JCGM 100:2008 §4.3.7), the worst case puts every arm at the \
         end of its tolerance",
    );
    if let Some(note) = z.note() {
        ui.label(note);
    }
    let q = Quantity::of(be.wanted);
    match be.channel_load_per_mv_per_v() {
        Some(f) => {
            // A ratio: scale only (a unit offset does not apply to a load per mV/V).
            let scale = doc.units.to_display(q, 1.0) - doc.units.to_display(q, 0.0);
            let shown = f * scale;
            let magnitude = if shown == 0.0 {
                0
            } else {
                shown.abs().log10().floor() as i32
            };
            let decimals = (5 - magnitude).clamp(0, 9) as usize;
            let source = match &be.calibration {
                Some(_) => " (from the in-place calibration)",
                None => "",
            };
            ui.label(format!(
                "{} per mV/V: {shown:.decimals$} {}{source}",
                capitalise(be.wanted.name()),
                doc.units.label(q)
            ));
        }
        None => {
            ui.label(format!(
                "No conversion to {}: the bridge does not respond to it",
                be.wanted.name()
            ));
        }
    }
}
