//! The uncertainty budget of the inferred load, and the Monte Carlo check on demand.

use egui_plot::{Bar, BarChart, Plot, VLine};
use gw_bridge::bridge_uncertainty::BridgeUncertainty;
use gw_plan::evaluate::BridgeEvaluation;

use super::MonteCarloRun;
use crate::panels::palette;
use crate::state::DocumentState;
use crate::units::Quantity;

/// The uncertainty budget, and the Monte Carlo check on demand.
pub(super) fn uncertainty_with_monte_carlo_ui(
    ui: &mut egui::Ui,
    doc: &DocumentState,
    be: &BridgeEvaluation,
    monte_carlo: &mut Option<MonteCarloRun>,
) {
    let sel = doc.selection;
    uncertainty_ui(ui, doc, be);
    ui.separator();
    let bridge = sel.bridge.unwrap_or(0);
    if ui
        .button("Run Monte Carlo (20 000 trials)")
        .on_hover_text(
            "Propagate the same inputs by random sampling (JCGM 101:2008); takes a few seconds",
        )
        .clicked()
    {
        let r = gw_plan::evaluate::monte_carlo_for(&doc.project, sel.part, bridge, 20_000);
        *monte_carlo = Some((doc.evaluations, sel.part, bridge, r));
    }
    if let Some((n, p, b, r)) = monte_carlo.as_ref()
        && *n == doc.evaluations
        && *p == sel.part
        && *b == bridge
    {
        match r {
            Ok(u) => histogram_ui(ui, doc, be, u),
            Err(e) => {
                ui.colored_label(palette::FAIL, e);
            }
        }
    }
}

fn uncertainty_ui(ui: &mut egui::Ui, doc: &DocumentState, be: &BridgeEvaluation) {
    let Some(u) = &be.uncertainty else {
        ui.label("No uncertainty budget for this bridge.");
        return;
    };
    let units = doc.units;
    let q = Quantity::of(be.wanted);
    ui.label(format!(
        "At {}: inferred {} = {}; combined standard uncertainty {}, expanded ± {} for {:.0} % coverage, {}",
        be.uncertainty_case.as_deref().unwrap_or("—"),
        be.wanted.name(),
        units.format(q, u.gum.value),
        units.format(q, u.gum.combined),
        units.format(q, u.gum.expanded),
        u.gum.coverage_probability * 100.0,
        u.gum.coverage_text()
    ));
    let bars: Vec<Bar> = u
        .gum
        .rows
        .iter()
        .enumerate()
        .map(|(i, r)| {
            Bar::new(
                i as f64,
                units.to_display(q, r.contribution) - units.to_display(q, 0.0),
            )
            .name(&r.name)
        })
        .collect();
    Plot::new("uncertainty")
        .height(240.0)
        .x_axis_label(format!("Contribution ({})", units.label(q)))
        .show(ui, |plot| {
            plot.bar_chart(BarChart::new("contributions", bars).horizontal())
        });
    egui::Grid::new("budget")
        .striped(true)
        .num_columns(2)
        .show(ui, |ui| {
            for r in u.gum.rows.iter().take(8) {
                ui.label(&r.name);
                ui.label(units.format(q, r.contribution).replace("+", ""));
                ui.end_row();
            }
        });
}

fn histogram_ui(
    ui: &mut egui::Ui,
    doc: &DocumentState,
    be: &BridgeEvaluation,
    u: &BridgeUncertainty,
) {
    let units = doc.units;
    let q = Quantity::of(be.wanted);
    let mc = &u.monte_carlo;
    ui.label(format!(
        "Monte Carlo, {} trials: standard deviation {} (GUM {}); 95 % interval {} to {} (GUM ± {} about {})",
        mc.trials,
        units.format(q, mc.standard_deviation),
        units.format(q, u.gum.combined),
        units.format(q, mc.interval_95.0),
        units.format(q, mc.interval_95.1),
        units.format(q, u.gum.expanded),
        units.format(q, u.gum.value)
    ));
    let (lo, width, counts) = &mc.histogram;
    let bars: Vec<Bar> = counts
        .iter()
        .enumerate()
        .map(|(i, n)| {
            Bar::new(
                units.to_display(q, lo + width * (i as f64 + 0.5)),
                *n as f64,
            )
            .width(units.to_display(q, *width) - units.to_display(q, 0.0))
        })
        .collect();
    Plot::new("histogram")
        .height(200.0)
        .x_axis_label(units.label(q))
        .show(ui, |plot| {
            plot.bar_chart(BarChart::new("trials", bars));
            plot.vline(
                VLine::new("GUM low", units.to_display(q, u.gum.value - u.gum.expanded))
                    .color(palette::WARN),
            );
            plot.vline(
                VLine::new(
                    "GUM high",
                    units.to_display(q, u.gum.value + u.gum.expanded),
                )
                .color(palette::WARN),
            );
        });
}
