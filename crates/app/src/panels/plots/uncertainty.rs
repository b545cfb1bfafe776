//! The uncertainty budget of the inferred load, largest source first, and the Monte Carlo
//! check on demand.

use egui_plot::{Bar, BarChart, Plot, VLine};
use gw_bridge::bridge_uncertainty::BridgeUncertainty;
use gw_plan::evaluate::BridgeEvaluation;
use gw_plan::result_tables::{ContributionRow, contribution_rows, dominant_sentence, share_text};

use super::MonteCarloRun;
use super::export::{PlotTable, export_menu};
use super::margins::{bar_cell_ui, bar_width, name_column_width, widest, wrapped_name_ui};
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
    egui::ScrollArea::vertical()
        .id_salt("uncertainty scroll")
        .auto_shrink([false, true])
        .show(ui, |ui| {
            uncertainty_ui(ui, doc, be);
            ui.separator();
            monte_carlo_ui(ui, doc, be, monte_carlo);
        });
}

/// The button that runs the Monte Carlo check, and its result while it still applies.
fn monte_carlo_ui(
    ui: &mut egui::Ui,
    doc: &DocumentState,
    be: &BridgeEvaluation,
    monte_carlo: &mut Option<MonteCarloRun>,
) {
    let sel = doc.selection;
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
        "At {}: inferred {} = {}; combined standard uncertainty u = {}, expanded U = ±{} for {:.0} % coverage, {}",
        be.uncertainty_case.as_deref().unwrap_or("—"),
        be.wanted.name(),
        units.format(q, u.gum.value),
        units.format_difference(q, u.gum.combined),
        units.format_difference(q, u.gum.expanded),
        u.gum.coverage_probability * 100.0,
        u.gum.coverage_text()
    ));
    let rows = contribution_rows(&u.gum);
    ui.strong(dominant_sentence(&rows, units, q));
    let response = contribution_bars_ui(ui, doc, be, &rows);
    export_menu(&response, "Uncertainty budget", || {
        budget_table(doc, be, &rows)
    });
    ui.weak(
        "Share: each source's part of the combined variance u², in % (the shares of \
         uncorrelated sources add to 100 %).",
    );
}

/// One row per source: its name, a bar of its contribution, the contribution in the measured
/// unit and its share of the variance.
fn contribution_bars_ui(
    ui: &mut egui::Ui,
    doc: &DocumentState,
    be: &BridgeEvaluation,
    rows: &[ContributionRow],
) -> egui::Response {
    let units = doc.units;
    let q = Quantity::of(be.wanted);
    let largest = rows.first().map_or(0.0, |r| r.contribution);
    let combined = be.uncertainty.as_ref().map_or(0.0, |u| u.gum.combined);
    let contribution_header = format!("Contribution ({})", units.label(q));
    let share_header = "Share (%)";
    // A contribution below the display resolution reads "< 0.001", never as a run of zeros.
    let values: Vec<String> = rows
        .iter()
        .map(|r| {
            format!(
                "{} {}",
                units.format_table_number(q, r.contribution),
                units.label(q)
            )
        })
        .collect();
    let shares: Vec<String> = rows
        .iter()
        .map(|r| share_text(r.variance_percent))
        .collect();
    let value_width = widest(
        ui,
        values
            .iter()
            .map(String::as_str)
            .chain([contribution_header.as_str()]),
    );
    let share_width = widest(ui, shares.iter().map(String::as_str).chain([share_header]));
    let name_width = name_column_width(
        ui,
        rows.iter().map(|r| r.name.as_str()).chain(["Source"]),
        &[value_width, share_width],
    );
    let width = bar_width(ui, &[name_width, value_width, share_width]);
    egui::Grid::new("budget bars")
        .striped(true)
        .num_columns(4)
        .show(ui, |ui| {
            ui.strong("Source");
            ui.label("");
            ui.strong(&contribution_header);
            ui.strong(share_header);
            ui.end_row();
            for ((r, value), share) in rows.iter().zip(values).zip(shares) {
                wrapped_name_ui(ui, name_width, &r.name);
                let fraction = if largest > 0.0 {
                    r.contribution / largest
                } else {
                    0.0
                };
                bar_cell_ui(ui, width, fraction, palette::WARN, None);
                ui.label(value)
                    .on_hover_text(of_combined(r.contribution, combined));
                ui.label(share);
                ui.end_row();
            }
        })
        .response
}

/// A contribution as a share of the combined standard uncertainty: "43.1 % of u".
fn of_combined(contribution: f64, combined: f64) -> String {
    if combined > 0.0 {
        format!(
            "{} % of the combined standard uncertainty u (the shares of u do not add up; \
             those of u² do)",
            crate::units::number_text(100.0 * contribution / combined, 1)
        )
    } else {
        "The combined standard uncertainty is zero.".to_owned()
    }
}

fn budget_table(doc: &DocumentState, be: &BridgeEvaluation, rows: &[ContributionRow]) -> PlotTable {
    let units = doc.units;
    let q = Quantity::of(be.wanted);
    let combined = be.uncertainty.as_ref().map_or(0.0, |u| u.gum.combined);
    PlotTable {
        columns: vec![
            "Source".into(),
            format!("Contribution ({})", units.label(q)),
            "Share of variance (%)".into(),
            "Contribution over combined u (%)".into(),
        ],
        rows: rows
            .iter()
            .map(|r| {
                vec![
                    r.name.clone(),
                    format!("{}", units.scale_to_display(q, r.contribution)),
                    r.variance_percent.map_or("—".into(), |p| format!("{p}")),
                    if combined > 0.0 {
                        format!("{}", 100.0 * r.contribution / combined)
                    } else {
                        "—".into()
                    },
                ]
            })
            .collect(),
    }
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
    let response = Plot::new("histogram")
        .height(200.0)
        .x_axis_label(format!(
            "Inferred {} ({})",
            be.wanted.name(),
            units.label(q)
        ))
        .y_axis_label("Trials")
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
        })
        .response;
    export_menu(&response, "Monte Carlo histogram", || PlotTable {
        columns: vec![format!("Bin centre ({})", units.label(q)), "Trials".into()],
        rows: counts
            .iter()
            .enumerate()
            .map(|(i, n)| {
                vec![
                    format!("{}", units.to_display(q, lo + width * (i as f64 + 0.5))),
                    n.to_string(),
                ]
            })
            .collect(),
    });
}
