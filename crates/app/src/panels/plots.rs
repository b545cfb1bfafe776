//! Live plots and tables from the evaluation: output against load, apparent strain against
//! temperature, margins, uncertainty, what cancels what, and the multi-bridge matrix.

use egui::Color32;
use egui_plot::{Bar, BarChart, Legend, Line, Plot, VLine};
use gw_bridge::bridge_uncertainty::BridgeUncertainty;
use gw_bridge::margins::MarginStatus;
use gw_plan::evaluate::{BridgeEvaluation, PartEvaluation};

use super::palette;
use crate::command::Command;
use crate::panels::capitalise;
use crate::state::DocumentState;
use crate::units::{Quantity, microstrain};

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
        match view {
            PlotView::Output => output_ui(ui, doc, be),
            PlotView::Temperature => temperature_ui(ui, be),
            PlotView::Margins => margins_ui(ui, doc, be),
            PlotView::Uncertainty => uncertainty_with_monte_carlo_ui(ui, doc, be, monte_carlo),
            PlotView::Cancellation | PlotView::Measured => {}
        }
    }
}

/// The row of result views.
fn view_tabs_ui(ui: &mut egui::Ui, view: &mut PlotView) {
    ui.horizontal(|ui| {
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

/// The uncertainty budget, and the Monte Carlo check on demand.
fn uncertainty_with_monte_carlo_ui(
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

fn output_ui(ui: &mut egui::Ui, doc: &DocumentState, be: &BridgeEvaluation) {
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

fn temperature_ui(ui: &mut egui::Ui, be: &BridgeEvaluation) {
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

fn margins_ui(ui: &mut egui::Ui, doc: &DocumentState, be: &BridgeEvaluation) {
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

fn cancellation_ui(ui: &mut egui::Ui, doc: &DocumentState, pe: &PartEvaluation) {
    let units = doc.units;
    let Some(first) = pe.bridges.first() else {
        ui.label("No bridge could be evaluated.");
        return;
    };
    ui.label("Displayed strain per unit of each load component (µε per unit shown); the wanted one is in bold.");
    egui::Grid::new("cancels")
        .striped(true)
        .num_columns(first.sensitivities.len() + 1)
        .show(ui, |ui| {
            ui.strong("Bridge");
            for s in &first.sensitivities {
                let q = Quantity::of(s.component);
                ui.strong(format!(
                    "{} (per {})",
                    capitalise(s.component.name()),
                    units.label(q)
                ));
            }
            ui.end_row();
            for b in &pe.bridges {
                ui.label(&b.name);
                for s in &b.sensitivities {
                    let q = Quantity::of(s.component);
                    // Per display unit: convert one display unit to SI.
                    let per_unit = s.displayed_per_unit
                        * (units.from_display(q, 1.0) - units.from_display(q, 0.0));
                    let text = format!("{:.4}", per_unit * 1e6);
                    if s.component == b.wanted {
                        ui.strong(text);
                    } else {
                        ui.label(text);
                    }
                }
                ui.end_row();
            }
        });
    ui.separator();
    ui.label("Rejection of unwanted loads at their largest value in the load cases:");
    for b in &pe.bridges {
        let parts: Vec<String> = b
            .rejection
            .iter()
            .map(|r| {
                format!(
                    "{} {:.3} % ({:.0} dB)",
                    r.component.name(),
                    r.leakage_fraction * 100.0,
                    r.rejection_db
                )
            })
            .collect();
        ui.label(format!(
            "{}: {}",
            b.name,
            if parts.is_empty() {
                "—".into()
            } else {
                parts.join(", ")
            }
        ));
    }
    if let Some(m) = &pe.multi_axis {
        ui.separator();
        ui.strong("Several bridges together");
        ui.label(format!("Condition number {:.2} (1 is ideal; large values mean the bridges cannot tell the loads apart)", m.condition_number));
        ui.label("Recovery matrix: loads = matrix × displayed strains");
        egui::Grid::new("recovery").striped(true).show(ui, |ui| {
            ui.label("");
            for b in &m.bridges {
                ui.strong(b);
            }
            ui.end_row();
            for (row, c) in m.recovery.iter().zip(&m.components) {
                ui.label(capitalise(c.name()));
                for v in row {
                    ui.label(format!("{v:.4e}"));
                }
                ui.end_row();
            }
        });
        for (c, row) in &m.cross_talk {
            let shown: Vec<String> = row
                .iter()
                .zip(&m.components)
                .map(|(v, k)| format!("{:.3e} {} per unit", v, k.name()))
                .collect();
            ui.label(format!(
                "{} leaks into: {}",
                capitalise(c.name()),
                shown.join(", ")
            ));
        }
    }
}
