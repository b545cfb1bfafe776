//! Results › Measured: the check-out verdicts, each channel's measured reading against the
//! predicted one, the rosettes, the recovered loads and the in-place calibration fits. Every
//! number comes from the derived results (`crate::measured`), computed once per change; the
//! plotted series are decimated there.

use egui::Color32;
use egui_plot::{Line, Plot, Points};
use gw_reduce::calibration::CalibrationFit;
use gw_reduce::rosette_series::RosetteSeries;

use super::checkout_inspector::verdict_colour;
use crate::command::Command;
use crate::measured::{ChannelPlot, Derived};
use crate::state::DocumentState;
use crate::units::{Quantity, Units, microstrain, number_text};

/// Colour of measured series.
const MEASURED: Color32 = Color32::from_rgb(70, 140, 210);
/// Colour of predicted series.
const PREDICTED: Color32 = Color32::from_rgb(230, 150, 60);
/// Second measured series (ε2).
const MEASURED_2: Color32 = Color32::from_rgb(110, 190, 120);
/// Second predicted series.
const PREDICTED_2: Color32 = Color32::from_rgb(200, 110, 170);

/// What the channel plot is drawn against.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Abscissa {
    /// Time, s.
    #[default]
    Time,
    /// The applied wanted load from the log's reference column.
    AppliedLoad,
}

/// View state: the channel, rosette and fit shown, and the channel plot's abscissa.
#[derive(Default)]
pub struct MeasuredPanel {
    channel: Option<String>,
    rosette: Option<String>,
    fit: Option<String>,
    abscissa: Abscissa,
}

/// A number with its unit, or "—" when there is none; never "-0.0000".
fn shown(v: f64, decimals: usize, unit: &str) -> String {
    if v.is_finite() {
        format!("{} {unit}", number_text(v, decimals))
            .trim_end()
            .to_owned()
    } else {
        "—".to_owned()
    }
}

/// Display units per SI unit of a load quantity (a ratio: no offset).
fn scale(units: Units, q: Quantity) -> f64 {
    units.to_display(q, 1.0) - units.to_display(q, 0.0)
}

/// A legend drawn above a plot, outside its data.
fn legend_ui(ui: &mut egui::Ui, entries: &[(Color32, &str)]) {
    ui.horizontal_wrapped(|ui| {
        ui.label("Legend:");
        for (colour, name) in entries {
            let (rect, _) = ui.allocate_exact_size(egui::vec2(18.0, 10.0), egui::Sense::hover());
            ui.painter().line_segment(
                [rect.left_center(), rect.right_center()],
                egui::Stroke::new(3.0, *colour),
            );
            ui.label(*name);
        }
    });
}

/// Picks one name among `names` into `chosen` (the first when unset or gone).
fn pick_ui(ui: &mut egui::Ui, label: &str, names: &[String], chosen: &mut Option<String>) {
    if chosen.as_ref().is_none_or(|c| !names.contains(c)) {
        *chosen = names.first().cloned();
    }
    ui.horizontal(|ui| {
        let id = ui.label(label).id;
        egui::ComboBox::from_id_salt(label)
            .selected_text(chosen.clone().unwrap_or_else(|| "—".into()))
            .show_ui(ui, |ui| {
                for n in names {
                    ui.selectable_value(chosen, Some(n.clone()), n);
                }
            })
            .response
            .labelled_by(id);
    });
}

impl MeasuredPanel {
    /// Draws the sub-view.
    pub fn measured_ui(&mut self, ui: &mut egui::Ui, doc: &DocumentState, out: &mut Vec<Command>) {
        let Self {
            channel,
            rosette,
            fit,
            abscissa,
        } = self;
        let d = &doc.measured.derived;
        egui::ScrollArea::vertical()
            .auto_shrink([false, false])
            .show(ui, |ui| {
                header("Check-out verdicts", ui, |ui| verdicts_ui(ui, doc, out));
                let Some(r) = &d.reduction else {
                    ui.separator();
                    match &d.reduce_error {
                        Some(e) => ui.colored_label(super::palette::FAIL, e),
                        None => ui.label(
                            "No test log: File › Import test log… to compare the readings \
                             with the plan.",
                        ),
                    };
                    return;
                };
                header("Channel readings", ui, |ui| {
                    let names: Vec<String> = r.channels.iter().map(|c| c.bridge.clone()).collect();
                    pick_ui(ui, "Channel", &names, channel);
                    channel_ui(ui, doc, d, channel.as_deref(), abscissa);
                });
                header("Rosettes", ui, |ui| {
                    let names: Vec<String> = r.rosettes.iter().map(|s| s.gauge.clone()).collect();
                    if names.is_empty() {
                        ui.label("No rosette is read by three channels of this log.");
                        return;
                    }
                    pick_ui(ui, "Rosette", &names, rosette);
                    rosette_ui(ui, doc, d, rosette.as_deref());
                });
                header("Recovered loads", ui, |ui| recovered_ui(ui, doc, d));
                header("Calibration", ui, |ui| {
                    let names: Vec<String> = d.fits.iter().map(|f| f.bridge.clone()).collect();
                    calibration_table_ui(ui, doc, &d.fits);
                    if names.is_empty() {
                        return;
                    }
                    pick_ui(ui, "Fit of bridge", &names, fit);
                    if let Some(f) = d.fits.iter().find(|f| Some(&f.bridge) == fit.as_ref()) {
                        fit_ui(ui, doc, f, out);
                    }
                });
            });
    }
}

fn header(title: &str, ui: &mut egui::Ui, body: impl FnOnce(&mut egui::Ui)) {
    egui::CollapsingHeader::new(title)
        .default_open(true)
        .show(ui, body);
}

/// One row per channel: number, bridge (click to inspect its records), verdict, summary.
fn verdicts_ui(ui: &mut egui::Ui, doc: &DocumentState, out: &mut Vec<Command>) {
    let checkout = &doc.measured.derived.checkout;
    if checkout.channels.is_empty() {
        ui.label("No bridge could be evaluated.");
        return;
    }
    egui::Grid::new("verdicts")
        .striped(true)
        .num_columns(3)
        .show(ui, |ui| {
            ui.strong("Channel");
            ui.strong("Bridge");
            ui.strong("Verdict");
            ui.end_row();
            for c in &checkout.channels {
                ui.label(format!("ch{}", c.channel));
                let focus = crate::panels::tree::channel_focus(&doc.project, &c.part, &c.bridge);
                if ui
                    .link(&c.bridge)
                    .on_hover_text("Show its records and checks in the inspector")
                    .clicked()
                    && let Some(f) = focus
                {
                    out.push(Command::FocusTest(f));
                }
                let v = c.verdict();
                ui.colored_label(verdict_colour(v), v.word())
                    .on_hover_text(c.summary());
                ui.end_row();
            }
        });
}

fn channel_ui(
    ui: &mut egui::Ui,
    doc: &DocumentState,
    d: &Derived,
    bridge: Option<&str>,
    abscissa: &mut Abscissa,
) {
    let (Some(r), Some(name)) = (&d.reduction, bridge) else {
        return;
    };
    let (Some(ch), Some(plot)) = (
        r.channel(name),
        d.channel_plots.iter().find(|p| p.bridge == name),
    ) else {
        return;
    };
    let q = Quantity::of(ch.wanted);
    let units = doc.units;
    ui.add(
        egui::Label::new(format!(
            "Zero taken off {}; span factor {} ({})",
            shown(ch.zero_mv_per_v, 4, "mV/V"),
            shown(ch.span_factor, 4, ""),
            ch.span_source
        ))
        .wrap(),
    );
    let has_load = !plot.measured_vs_load.is_empty();
    ui.horizontal(|ui| {
        ui.label("Against:");
        ui.selectable_value(abscissa, Abscissa::Time, "time");
        ui.add_enabled_ui(has_load, |ui| {
            ui.selectable_value(
                abscissa,
                Abscissa::AppliedLoad,
                format!("applied {}", ch.wanted.name()),
            )
            .on_disabled_hover_text("The log has no column of the applied load of this bridge");
        });
    });
    if !has_load {
        *abscissa = Abscissa::Time;
    }
    reading_plot_ui(ui, plot, *abscissa, units, q, ch.wanted.name());
}

fn reading_plot_ui(
    ui: &mut egui::Ui,
    plot: &ChannelPlot,
    abscissa: Abscissa,
    units: Units,
    q: Quantity,
    wanted: &str,
) {
    let predicted = !plot.predicted_vs_time.is_empty();
    let mut legend = vec![(MEASURED, "measured")];
    if predicted {
        legend.push((PREDICTED, "predicted by the plan"));
    } else {
        legend.push((PREDICTED, "predicted: the log has no applied loads"));
    }
    legend_ui(ui, &legend);
    let k = scale(units, q);
    let (x_label, m, p, xk) = match abscissa {
        Abscissa::Time => (
            "Time (s)".to_owned(),
            &plot.measured_vs_time,
            &plot.predicted_vs_time,
            1.0,
        ),
        Abscissa::AppliedLoad => (
            format!("Applied {wanted} ({})", units.label(q)),
            &plot.measured_vs_load,
            &plot.predicted_vs_load,
            k,
        ),
    };
    let scaled =
        |v: &[[f64; 2]]| -> Vec<[f64; 2]> { v.iter().map(|p| [p[0] * xk, p[1]]).collect() };
    Plot::new(("reading", &plot.bridge))
        .allow_scroll(false)
        .height(220.0)
        .x_axis_label(x_label)
        .y_axis_label("Reading (mV/V)")
        .show(ui, |pl| {
            pl.line(Line::new("measured", scaled(m)).color(MEASURED));
            if !p.is_empty() {
                pl.line(Line::new("predicted", scaled(p)).color(PREDICTED));
            }
        });
}

/// The principal values at the summary sample (the largest predicted state, or the measured
/// peak without applied loads), measured against predicted.
fn rosette_table_ui(ui: &mut egui::Ui, doc: &DocumentState, s: &RosetteSeries) {
    let Some(i) = s.summary_index() else {
        ui.label("The rosette has no samples.");
        return;
    };
    let deg = |a: f64| shown(a.to_degrees(), 1, "°");
    let row = |p: &gw_reduce::rosette_series::PrincipalSeries| -> Option<[String; 7]> {
        let at = |v: &Vec<f64>| v.get(i).copied().unwrap_or(f64::NAN);
        Some([
            microstrain(at(&p.strain_1)),
            microstrain(at(&p.strain_2)),
            deg(at(&p.angle_rad)),
            deg(at(&p.angle_rad) + s.orientation_rad),
            microstrain(at(&p.max_shear_strain)),
            doc.units.format_stress(at(&p.stress_1_pa)),
            doc.units.format_stress(at(&p.stress_2_pa)),
        ])
    };
    let measured = row(&s.measured).unwrap_or_default();
    let predicted = s.predicted.as_ref().and_then(row);
    ui.add(
        egui::Label::new(format!(
            "At the peak, t = {}; grids read by {}",
            shown(
                doc.measured
                    .derived
                    .reduction
                    .as_ref()
                    .and_then(|r| r.time_s.get(i).copied())
                    .unwrap_or(f64::NAN),
                1,
                "s"
            ),
            s.bridges.join(", ")
        ))
        .wrap(),
    );
    let names = [
        "ε1",
        "ε2",
        "Angle of ε1 from grid 1",
        "Angle of ε1 from the part's axis",
        "Maximum shear strain",
        "σ1",
        "σ2",
    ];
    egui::Grid::new(("rosette table", &s.gauge))
        .striped(true)
        .num_columns(3)
        .show(ui, |ui| {
            ui.strong("At the peak");
            ui.strong("Measured");
            ui.strong("Predicted");
            ui.end_row();
            for (k, name) in names.iter().enumerate() {
                ui.label(*name);
                ui.label(&measured[k]);
                ui.label(predicted.as_ref().map_or("—", |p| p[k].as_str()));
                ui.end_row();
            }
        });
}

fn rosette_ui(ui: &mut egui::Ui, doc: &DocumentState, d: &Derived, gauge: Option<&str>) {
    let Some(r) = &d.reduction else { return };
    let Some(s) = r.rosettes.iter().find(|s| Some(s.gauge.as_str()) == gauge) else {
        return;
    };
    rosette_table_ui(ui, doc, s);
    let Some(plot) = d.rosette_plots.iter().find(|p| p.gauge == s.gauge) else {
        return;
    };
    let names = ["ε1 measured", "ε2 measured", "ε1 predicted", "ε2 predicted"];
    let colours = [MEASURED, MEASURED_2, PREDICTED, PREDICTED_2];
    let present: Vec<(Color32, &str)> = (0..4)
        .filter(|&k| !plot.series[k].is_empty())
        .map(|k| (colours[k], names[k]))
        .collect();
    legend_ui(ui, &present);
    Plot::new(("rosette", &s.gauge))
        .allow_scroll(false)
        .height(200.0)
        .x_axis_label("Time (s)")
        .y_axis_label("Principal strain (µε)")
        .show(ui, |pl| {
            for k in 0..4 {
                let pts: Vec<[f64; 2]> =
                    plot.series[k].iter().map(|p| [p[0], p[1] * 1e6]).collect();
                pl.line(Line::new(names[k], pts).color(colours[k]));
            }
        });
}

fn recovered_ui(ui: &mut egui::Ui, doc: &DocumentState, d: &Derived) {
    if d.recovered_plots.is_empty() {
        ui.label(
            "No load recovered against an applied load: recovery needs bridges of one part that \
             together see its loads, and the log a column of the applied load.",
        );
        return;
    }
    let units = doc.units;
    for (n, rp) in d.recovered_plots.iter().enumerate() {
        let q = Quantity::of(rp.component);
        let k = scale(units, q);
        let unit = units.label(q);
        ui.label(format!("{}: {}", rp.part, rp.component.name()));
        legend_ui(
            ui,
            &[(MEASURED, "recovered"), (Color32::GRAY, "equal to applied")],
        );
        let pts: Vec<[f64; 2]> = rp.points.iter().map(|p| [p[0] * k, p[1] * k]).collect();
        let (lo, hi) = pts
            .iter()
            .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), p| {
                (a.min(p[0]), b.max(p[0]))
            });
        Plot::new(("recovered", n))
            .allow_scroll(false)
            .height(180.0)
            .x_axis_label(format!("Applied ({unit})"))
            .y_axis_label(format!("Recovered ({unit})"))
            .show(ui, |pl| {
                if lo.is_finite() && hi.is_finite() {
                    pl.line(Line::new("equal", vec![[lo, lo], [hi, hi]]).color(Color32::GRAY));
                }
                pl.points(Points::new("recovered", pts).color(MEASURED).radius(1.5));
            });
    }
}

/// A sensitivity with its uncertainty, per a round multiple of the wanted load's display unit
/// chosen so the figure has leading digits ("0.2160 ± 0.0001 mV/V per 1000 N").
fn per_load(doc: &DocumentState, f: &CalibrationFit, v: f64, u: Option<f64>) -> String {
    let q = Quantity::of(f.wanted);
    let per_unit = v / scale(doc.units, q);
    let mut multiple = 1.0_f64;
    while per_unit.abs() * multiple < 0.1 && multiple < 1e12 && per_unit != 0.0 {
        multiple *= 1000.0;
    }
    let per = if multiple == 1.0 {
        doc.units.label(q).to_owned()
    } else {
        format!("{multiple} {}", doc.units.label(q))
    };
    let k = multiple / scale(doc.units, q);
    match u {
        Some(u) => format!(
            "{} ± {} mV/V per {per}",
            shown(v * k, 4, ""),
            shown(u * k, 4, "")
        ),
        None => format!("{} mV/V per {per}", shown(v * k, 4, "")),
    }
}

fn percent(v: Option<f64>, u: Option<f64>) -> String {
    match (v, u) {
        (Some(v), Some(u)) if v.is_finite() && u.is_finite() => {
            format!(
                "{} ± {} %",
                number_text(v * 100.0, 2),
                number_text(u * 100.0, 2)
            )
        }
        (Some(v), _) => shown(v * 100.0, 2, "%"),
        _ => "—".into(),
    }
}

fn calibration_table_ui(ui: &mut egui::Ui, doc: &DocumentState, fits: &[CalibrationFit]) {
    if fits.is_empty() {
        ui.label("No calibration fit: a fit needs known load steps (a reference column of the log or steps in the bridge's record).");
        return;
    }
    egui::Grid::new("fits")
        .striped(true)
        .num_columns(3)
        .show(ui, |ui| {
            ui.strong("Bridge");
            ui.strong("Fitted / predicted");
            ui.strong("In the channel list");
            ui.end_row();
            for f in fits {
                ui.label(&f.bridge);
                ui.label(format!(
                    "{} ± {}",
                    shown(f.ratio, 4, ""),
                    shown(f.ratio_u, 4, "")
                ));
                let used = crate::panels::tree::bridge_plan(&doc.project, &f.part, &f.bridge)
                    .is_some_and(|b| b.calibration.is_some());
                ui.label(if used { "fitted" } else { "predicted" });
                ui.end_row();
            }
        });
}

fn fit_rows(doc: &DocumentState, f: &CalibrationFit) -> Vec<(&'static str, String)> {
    vec![
        (
            "Sensitivity",
            per_load(doc, f, f.sensitivity, Some(f.sensitivity_u)),
        ),
        ("Predicted", per_load(doc, f, f.predicted_sensitivity, None)),
        (
            "Ratio fitted / predicted",
            format!("{} ± {}", shown(f.ratio, 4, ""), shown(f.ratio_u, 4, "")),
        ),
        (
            "Zero",
            format!(
                "{} ± {}",
                shown(f.zero_mv_per_v, 4, "mV/V"),
                shown(f.zero_u, 4, "mV/V")
            ),
        ),
        (
            "Nonlinearity (of full scale)",
            percent(Some(f.nonlinearity), None),
        ),
        (
            "Hysteresis (of full scale)",
            percent(f.hysteresis, f.hysteresis_u),
        ),
        ("Points", format!("{}", f.points.len())),
        (
            "Known loads",
            match &f.source {
                gw_reduce::calibration::StepSource::ReferenceColumn(c) => {
                    format!("from the log's column \"{c}\"")
                }
                gw_reduce::calibration::StepSource::EnteredSteps => {
                    "the steps entered in the bridge's record".to_owned()
                }
            },
        ),
    ]
}

fn fit_ui(ui: &mut egui::Ui, doc: &DocumentState, f: &CalibrationFit, out: &mut Vec<Command>) {
    egui::Grid::new(("fit", &f.bridge))
        .striped(true)
        .num_columns(2)
        .show(ui, |ui| {
            for (name, value) in fit_rows(doc, f) {
                ui.label(name);
                ui.label(value);
                ui.end_row();
            }
        });
    fit_plot_ui(ui, doc, f);
    calibration_buttons_ui(ui, doc, f, out);
}

fn fit_plot_ui(ui: &mut egui::Ui, doc: &DocumentState, f: &CalibrationFit) {
    let q = Quantity::of(f.wanted);
    let k = scale(doc.units, q);
    let pts: Vec<[f64; 2]> = f
        .points
        .iter()
        .map(|p| [p.load * k, p.reading_mv_per_v])
        .collect();
    let (lo, hi) = f
        .points
        .iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), p| {
            (a.min(p.load), b.max(p.load))
        });
    let at = |load: f64| [load * k, f.zero_mv_per_v + f.sensitivity * load];
    legend_ui(
        ui,
        &[(MEASURED, "plateau means"), (PREDICTED, "fitted line")],
    );
    Plot::new(("fit plot", &f.bridge))
        .allow_scroll(false)
        .height(200.0)
        .x_axis_label(format!(
            "Known {} ({})",
            f.wanted.name(),
            doc.units.label(q)
        ))
        .y_axis_label("Reading (mV/V)")
        .show(ui, |pl| {
            if lo.is_finite() && hi.is_finite() {
                pl.line(Line::new("fitted line", vec![at(lo), at(hi)]).color(PREDICTED));
            }
            pl.points(
                Points::new("plateau means", pts)
                    .color(MEASURED)
                    .radius(3.5),
            );
        });
}

fn calibration_buttons_ui(
    ui: &mut egui::Ui,
    doc: &DocumentState,
    f: &CalibrationFit,
    out: &mut Vec<Command>,
) {
    let Some((part, bridge)) = crate::panels::tree::bridge_index(&doc.project, &f.part, &f.bridge)
    else {
        return;
    };
    let in_use = doc
        .project
        .parts
        .get(part)
        .and_then(|p| p.bridges.get(bridge))
        .is_some_and(|b| b.calibration.is_some());
    ui.label(if in_use {
        "The channel list uses the fitted sensitivity of this bridge."
    } else {
        "The channel list uses the predicted sensitivity of this bridge."
    });
    ui.horizontal_wrapped(|ui| {
        if ui
            .button("Use the fitted sensitivity in the channel list")
            .on_hover_text("Store this fit in the plan as the bridge's in-place calibration (Ctrl+Z undoes it)")
            .clicked()
        {
            let source = match &doc.measured.log {
                Some(l) => format!("fit to {}", l.path.display()),
                None => "fit to the test log".to_owned(),
            };
            out.push(Command::SetCalibration {
                part,
                bridge,
                calibration: Some(Box::new(f.as_plan_calibration(&source))),
            });
        }
        if ui
            .add_enabled(in_use, egui::Button::new("Go back to the predicted sensitivity"))
            .on_hover_text("Remove the in-place calibration from the plan")
            .clicked()
        {
            out.push(Command::SetCalibration {
                part,
                bridge,
                calibration: None,
            });
        }
    });
}
