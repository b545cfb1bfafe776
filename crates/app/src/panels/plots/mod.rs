//! Live plots and tables from the evaluation: output against load, apparent strain against
//! temperature, margins, uncertainty, what cancels what, and the multi-bridge matrix.

mod cancellation;
pub mod export;
mod margins;
mod output;
mod temperature;
mod uncertainty;

use cancellation::cancellation_ui;
use egui::Color32;
use gw_bridge::bridge_uncertainty::BridgeUncertainty;
use gw_bridge::margins::MarginStatus;
use margins::margins_ui;
use output::output_ui;
use temperature::temperature_ui;
use uncertainty::uncertainty_with_monte_carlo_ui;

use super::palette;
use crate::command::Command;
use crate::state::DocumentState;

/// Which view the plots tab shows.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum PlotView {
    /// Output against load.
    #[default]
    Output,
    /// Apparent strain against temperature.
    Temperature,
    /// Margins.
    Margins,
    /// Uncertainty.
    Uncertainty,
    /// What cancels what, and the multi-bridge matrix.
    Cancellation,
    /// The check-out and the test log against the plan.
    Measured,
}

/// View state.
#[derive(Default)]
pub struct PlotsPanel {
    view: PlotView,
    monte_carlo: Option<MonteCarloRun>,
    measured: super::measured::MeasuredPanel,
}

/// A Monte Carlo result with what it was run for: the evaluation count, part and bridge.
type MonteCarloRun = (u64, usize, usize, Result<BridgeUncertainty, String>);

fn status_colour(s: MarginStatus) -> Color32 {
    match s {
        MarginStatus::Pass => palette::PASS,
        MarginStatus::Warn => palette::WARN,
        MarginStatus::Fail => palette::FAIL,
    }
}

impl PlotsPanel {
    /// Shows one results tab.
    pub fn show(&mut self, view: PlotView) {
        self.view = view;
    }

    /// Draws the plots of the selected bridge.
    pub fn plots_ui(&mut self, ui: &mut egui::Ui, doc: &DocumentState, out: &mut Vec<Command>) {
        let Self {
            view,
            monte_carlo,
            measured,
        } = self;
        let sel = doc.selection;
        view_tabs_ui(ui, view);
        ui.separator();
        if *view == PlotView::Measured {
            measured.measured_ui(ui, doc, out);
            return;
        }
        let Some(pe) = doc
            .evaluation
            .parts
            .iter()
            .find(|p| p.part_index == sel.part)
        else {
            ui.label("This part could not be evaluated; see the findings below.");
            return;
        };
        if *view == PlotView::Cancellation {
            cancellation_ui(ui, doc, pe);
            return;
        }
        let Some(be) = sel
            .bridge
            .and_then(|b| pe.bridge_indices.iter().position(|&i| i == b))
            .and_then(|k| pe.bridges.get(k))
        else {
            ui.label("Select a bridge that could be evaluated.");
            return;
        };
        ui.label(format!(
            "Bridge \"{}\", measures {}",
            be.name,
            be.wanted.name()
        ));
        if *view == PlotView::Uncertainty {
            // It scrolls on its own, with Monte Carlo below the budget.
            uncertainty_with_monte_carlo_ui(ui, doc, be, monte_carlo);
            return;
        }
        // Many load cases push the plots down: the tab scrolls rather than cut them off.
        egui::ScrollArea::vertical()
            .auto_shrink([false, false])
            .show(ui, |ui| match view {
                PlotView::Output => output_ui(ui, doc, be),
                PlotView::Temperature => temperature_ui(ui, doc, be),
                PlotView::Margins => margins_ui(ui, doc, be),
                _ => {}
            });
    }
}

/// The row of result views.
fn view_tabs_ui(ui: &mut egui::Ui, view: &mut PlotView) {
    // Wrapped: with a wide inspector beside it the row takes two lines rather than running
    // under the inspector.
    ui.horizontal_wrapped(|ui| {
        for (v, name, help) in [
            (
                PlotView::Output,
                "Output vs load",
                "Displayed strain over each load case's ramp, with the straight line",
            ),
            (
                PlotView::Temperature,
                "Temperature",
                "Apparent strain against temperature, by cause",
            ),
            (
                PlotView::Margins,
                "Margins",
                "Utilisation of every limit at the selected load case",
            ),
            (
                PlotView::Uncertainty,
                "Uncertainty",
                "Contributions to the uncertainty of the inferred load",
            ),
            (
                PlotView::Cancellation,
                "What cancels what",
                "Each bridge's response to every load component",
            ),
            (
                PlotView::Measured,
                "Measured",
                "The check-out records and the test log against the plan",
            ),
        ] {
            ui.selectable_value(view, v, name).on_hover_text(help);
        }
    });
}
