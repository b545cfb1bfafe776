//! Output against load: each load case's ramp with its straight line, and beside it the
//! predicted error against load with the required accuracy as a band. The series come from
//! `gw_plan::result_series`; this file only draws them.

use egui::Color32;
use egui_plot::{Line, LineStyle, MarkerShape, Plot, Points, Polygon};
use gw_plan::evaluate::BridgeEvaluation;
use gw_plan::result_series::{self, CaseRamp, ErrorCurve};

use crate::panels::capitalise;
use crate::panels::plots::export::{PlotTable, export_menu};
use crate::state::DocumentState;
use crate::units::{Quantity, Units, fixed_text, microstrain, number_text};

/// Case colours and markers, taken in turn, so two cases differ in both.
const CASE_STYLES: [(Color32, MarkerShape); 6] = [
    (Color32::from_rgb(60, 120, 200), MarkerShape::Circle),
    (Color32::from_rgb(220, 120, 40), MarkerShape::Square),
    (Color32::from_rgb(60, 160, 90), MarkerShape::Diamond),
    (Color32::from_rgb(170, 80, 170), MarkerShape::Up),
    (Color32::from_rgb(190, 60, 60), MarkerShape::Cross),
    (Color32::from_rgb(120, 120, 120), MarkerShape::Down),
];

fn case_style(i: usize) -> (Color32, MarkerShape) {
    CASE_STYLES[i % CASE_STYLES.len()]
}

/// The band colour of the required accuracy.
const BAND: Color32 = Color32::from_rgba_premultiplied(45, 90, 55, 90);

pub(super) fn output_ui(ui: &mut egui::Ui, doc: &DocumentState, be: &BridgeEvaluation) {
    for c in &be.cases {
        ui.label(format!(
            "{}: {} mV/V, displays {} (target {})",
            c.case,
            fixed_text(c.reading.mv_per_v, 4),
            microstrain(c.reading.displayed_strain),
            microstrain(c.reading.target_strain),
        ));
    }
    zero_and_conversion_ui(ui, doc, be);
    let cases = doc
        .project
        .parts
        .get(doc.selection.part)
        .map_or(&[][..], |p| &p.load_cases[..]);
    let curves = result_series::error_curves(be, cases);
    error_summary_ui(ui, doc.units, be, curves.as_deref());
    let names: Vec<&str> = be.cases.iter().map(|c| c.case.as_str()).collect();
    let band = curves.is_some()
        && result_series::full_scale(be).is_some_and(|fs| {
            be.cases.iter().any(|c| {
                c.ramp
                    .iter()
                    .any(|p| result_series::allowed_pct(be, p.wanted_value, fs).is_some())
            })
        });
    legend_ui(ui, &names, band);
    ui.columns(2, |cols| {
        ramps_plot_ui(&mut cols[0], doc.units, be);
        match &curves {
            Some(curves) => error_plot_ui(&mut cols[1], doc.units, be, curves),
            None => {
                cols[1].weak("No error against load: no case applies the wanted load.");
            }
        }
    });
}

/// The key of both plots, above them so that it covers no data: each load case's colour and
/// marker, what solid and dashed lines are, and the band.
fn legend_ui(ui: &mut egui::Ui, cases: &[&str], band: bool) {
    let grey = ui.visuals().weak_text_color();
    ui.horizontal_wrapped(|ui| {
        for (i, name) in cases.iter().enumerate() {
            let (colour, marker) = case_style(i);
            key_ui(ui, egui::RichText::new(*name), |ui| {
                key_swatch_ui(ui, colour, Some(marker), false);
            });
            ui.add_space(8.0);
        }
        let words = |t: &str| egui::RichText::new(t).weak();
        key_ui(ui, words("exact circuit, total predicted error"), |ui| {
            key_swatch_ui(ui, grey, Some(MarkerShape::Circle), false);
        });
        key_ui(ui, words("straight line, departure from it"), |ui| {
            key_swatch_ui(ui, grey, None, true);
        });
        if band {
            key_ui(
                ui,
                words("with expanded uncertainty, as Margins checks it"),
                |ui| {
                    let (rect, _) = ui
                        .allocate_exact_size(egui::vec2(SWATCH_WIDTH, 14.0), egui::Sense::hover());
                    ui.painter()
                        .circle_stroke(rect.center(), 6.0, egui::Stroke::new(1.5, grey));
                },
            );
        }
        if band {
            key_ui(ui, words("required accuracy ±"), |ui| {
                let (rect, _) =
                    ui.allocate_exact_size(egui::vec2(SWATCH_WIDTH, 12.0), egui::Sense::hover());
                ui.painter().rect_filled(rect, 0.0, BAND);
                ui.painter().rect_stroke(
                    rect,
                    0.0,
                    egui::Stroke::new(1.0, Color32::from_rgb(70, 150, 110)),
                    egui::StrokeKind::Inside,
                );
            });
        }
    });
}

/// One entry of a key, its swatch and words kept together on one line: the row wraps between
/// entries, not inside one.
fn key_ui(ui: &mut egui::Ui, text: egui::RichText, swatch: impl FnOnce(&mut egui::Ui)) {
    let words = egui::WidgetText::from(text).into_galley(
        ui,
        Some(egui::TextWrapMode::Extend),
        f32::INFINITY,
        egui::TextStyle::Body,
    );
    let needed = SWATCH_WIDTH + ui.spacing().item_spacing.x + words.size().x;
    if ui.available_size_before_wrap().x < needed {
        ui.end_row();
    }
    swatch(ui);
    ui.add(egui::Label::new(words));
}

/// The width of a key's swatch.
const SWATCH_WIDTH: f32 = 26.0;

/// A short line (dashed when `dashed`) with a marker on it, as the plots draw a series.
fn key_swatch_ui(ui: &mut egui::Ui, colour: Color32, marker: Option<MarkerShape>, dashed: bool) {
    let (rect, _) = ui.allocate_exact_size(egui::vec2(SWATCH_WIDTH, 14.0), egui::Sense::hover());
    let painter = ui.painter();
    let y = rect.center().y;
    let stroke = egui::Stroke::new(1.5, colour);
    if dashed {
        let mut x = rect.left();
        while x < rect.right() {
            let end = (x + 4.0).min(rect.right());
            painter.line_segment([egui::pos2(x, y), egui::pos2(end, y)], stroke);
            x += 7.0;
        }
    } else {
        painter.line_segment(
            [egui::pos2(rect.left(), y), egui::pos2(rect.right(), y)],
            stroke,
        );
    }
    if let Some(marker) = marker {
        marker_shape(painter, rect.center(), 4.0, marker, colour);
    }
}

/// A marker as the plot draws it: circle, square, diamond, triangles up and down, cross.
fn marker_shape(
    painter: &egui::Painter,
    c: egui::Pos2,
    r: f32,
    marker: MarkerShape,
    colour: Color32,
) {
    use egui::pos2;
    let polygon =
        |points: Vec<egui::Pos2>| egui::Shape::convex_polygon(points, colour, egui::Stroke::NONE);
    let shape = match marker {
        MarkerShape::Square => polygon(vec![
            pos2(c.x - r, c.y - r),
            pos2(c.x + r, c.y - r),
            pos2(c.x + r, c.y + r),
            pos2(c.x - r, c.y + r),
        ]),
        MarkerShape::Diamond => polygon(vec![
            pos2(c.x, c.y - r),
            pos2(c.x + r, c.y),
            pos2(c.x, c.y + r),
            pos2(c.x - r, c.y),
        ]),
        MarkerShape::Up => polygon(vec![
            pos2(c.x, c.y - r),
            pos2(c.x + r, c.y + r),
            pos2(c.x - r, c.y + r),
        ]),
        MarkerShape::Down => polygon(vec![
            pos2(c.x - r, c.y - r),
            pos2(c.x + r, c.y - r),
            pos2(c.x, c.y + r),
        ]),
        MarkerShape::Cross => {
            let stroke = egui::Stroke::new(2.0, colour);
            painter.line_segment([pos2(c.x - r, c.y - r), pos2(c.x + r, c.y + r)], stroke);
            painter.line_segment([pos2(c.x - r, c.y + r), pos2(c.x + r, c.y - r)], stroke);
            return;
        }
        _ => egui::Shape::circle_filled(c, r, colour),
    };
    painter.add(shape);
}

/// The wanted load's axis title: "Axial force (kN)".
fn load_axis(units: Units, be: &BridgeEvaluation) -> String {
    let q = Quantity::of(be.wanted);
    format!("{} ({})", capitalise(be.wanted.name()), units.label(q))
}

/// Displayed strain against load: markers for the exact circuit, dashed straight line.
fn ramps_plot_ui(ui: &mut egui::Ui, units: Units, be: &BridgeEvaluation) {
    let q = Quantity::of(be.wanted);
    let ramps = result_series::case_ramps(be);
    let shown = |pts: &[[f64; 2]]| -> Vec<[f64; 2]> {
        pts.iter()
            .map(|[w, s]| [units.to_display(q, *w), s * 1e6])
            .collect()
    };
    let plot = readable_x_axis(Plot::new("output vs load"), load_axis(units, be));
    let response = plot
        .height(300.0)
        .y_axis_label("Displayed strain (µε)")
        .show(ui, |plot| {
            for (i, r) in ramps.iter().enumerate() {
                let (colour, marker) = case_style(i);
                plot.line(
                    Line::new(r.case.clone(), shown(&r.straight))
                        .color(colour)
                        .style(LineStyle::dashed_loose()),
                );
                plot.points(
                    Points::new(r.case.clone(), shown(&r.displayed))
                        .color(colour)
                        .shape(marker)
                        .radius(4.0),
                );
            }
        });
    export_menu(&response.response, "Output vs load", || {
        ramps_table(units, be, &ramps)
    });
}

fn ramps_table(units: Units, be: &BridgeEvaluation, ramps: &[CaseRamp]) -> PlotTable {
    let q = Quantity::of(be.wanted);
    let mut rows = Vec::new();
    for r in ramps {
        for (d, s) in r.displayed.iter().zip(&r.straight) {
            rows.push(vec![
                r.case.clone(),
                units.format_table_number(q, d[0]),
                format!("{:.3}", d[1] * 1e6),
                format!("{:.3}", s[1] * 1e6),
            ]);
        }
    }
    PlotTable {
        columns: vec![
            "Load case".into(),
            load_axis(units, be),
            "Displayed strain (µε)".into(),
            "Straight line (µε)".into(),
        ],
        rows,
    }
}

/// The band the required accuracy allows, as a closed polygon over the load range.
fn band_polygon(units: Units, be: &BridgeEvaluation, fs: f64) -> Option<Vec<[f64; 2]>> {
    let q = Quantity::of(be.wanted);
    let (lo, hi) = be
        .cases
        .iter()
        .flat_map(|c| c.ramp.iter().map(|p| p.wanted_value))
        .fold((0.0_f64, 0.0_f64), |(a, b), v| (a.min(v), b.max(v)));
    let xs = [lo, 0.0, hi];
    let upper: Vec<[f64; 2]> = xs
        .iter()
        .map(|&w| {
            Some([
                units.to_display(q, w),
                result_series::allowed_pct(be, w, fs)?,
            ])
        })
        .collect::<Option<_>>()?;
    let lower = upper.iter().rev().map(|[x, y]| [*x, -y]);
    Some(upper.iter().copied().chain(lower).collect())
}

/// Departure from the straight line (dashed) and total predicted error (markers and solid
/// line), % of full scale, with the required accuracy shaded.
fn error_plot_ui(ui: &mut egui::Ui, units: Units, be: &BridgeEvaluation, curves: &[ErrorCurve]) {
    let q = Quantity::of(be.wanted);
    let fs = result_series::full_scale(be).unwrap_or(f64::NAN);
    let band = band_polygon(units, be, fs);
    let plot = readable_x_axis(Plot::new("error vs load"), load_axis(units, be));
    let response = plot
        .height(300.0)
        .include_y(0.0)
        .y_axis_label("Error (% of full scale)")
        .show(ui, |plot| {
            if let Some(band) = &band {
                plot.polygon(
                    Polygon::new("Required accuracy ±", band.clone())
                        .fill_color(BAND)
                        .stroke(egui::Stroke::new(1.0, Color32::from_rgb(70, 150, 110))),
                );
            }
            for (i, c) in curves.iter().enumerate() {
                let (colour, marker) = case_style(i);
                let at = |f: fn(&result_series::ErrorPoint) -> f64| -> Vec<[f64; 2]> {
                    c.points
                        .iter()
                        .map(|p| [units.to_display(q, p.wanted), f(p)])
                        .collect()
                };
                let total = format!("{} total", c.case);
                plot.line(Line::new(total.clone(), at(|p| p.total_pct)).color(colour));
                plot.points(
                    Points::new(total, at(|p| p.total_pct))
                        .color(colour)
                        .shape(marker)
                        .radius(4.0),
                );
                plot.line(
                    Line::new(format!("{} departure", c.case), at(|p| p.departure_pct))
                        .color(colour)
                        .style(LineStyle::dashed_loose()),
                );
                // The figure Margins checks: the known error plus the expanded uncertainty, at
                // the case's load.
                if let Some(a) = be.accuracy.iter().find(|a| a.case == c.case) {
                    let at_load = [units.to_display(q, a.applied), 100.0 * a.predicted() / fs];
                    plot.points(
                        Points::new(format!("{} with uncertainty", c.case), vec![at_load])
                            .color(colour)
                            .shape(marker)
                            .filled(false)
                            .radius(7.0),
                    );
                }
            }
        });
    export_menu(&response.response, "Error vs load", || {
        error_table(units, be, curves, fs)
    });
}

fn error_table(units: Units, be: &BridgeEvaluation, curves: &[ErrorCurve], fs: f64) -> PlotTable {
    let q = Quantity::of(be.wanted);
    let pct = |v: f64| number_text(v, 4);
    let mut rows = Vec::new();
    for c in curves {
        for p in &c.points {
            let allowed = result_series::allowed_pct(be, p.wanted, fs).map_or(String::new(), pct);
            rows.push(vec![
                c.case.clone(),
                units.format_table_number(q, p.wanted),
                pct(p.departure_pct),
                pct(p.leakage_pct),
                pct(p.temperature_pct),
                pct(p.leads_pct),
                pct(p.gauge_pct),
                pct(p.total_pct),
                allowed,
            ]);
        }
    }
    let columns = [
        "Load case".to_owned(),
        load_axis(units, be),
        "Departure from straight line (% FS)".into(),
        "Leakage (% FS)".into(),
        "Temperature (% FS)".into(),
        "Leads (% FS)".into(),
        "Gauge effects (% FS)".into(),
        "Total predicted error (% FS)".into(),
        "Required accuracy ± (% FS)".into(),
    ];
    PlotTable {
        columns: columns.to_vec(),
        rows,
    }
}

/// One line answering "how big is the predicted error against the required accuracy".
fn error_summary_ui(
    ui: &mut egui::Ui,
    units: Units,
    be: &BridgeEvaluation,
    curves: Option<&[ErrorCurve]>,
) {
    let q = Quantity::of(be.wanted);
    let (Some(curves), Some(fs)) = (curves, result_series::full_scale(be)) else {
        return;
    };
    let worst = curves
        .iter()
        .flat_map(|c| c.points.iter().map(move |p| (c, p)))
        .filter(|(_, p)| p.total_pct.is_finite())
        .max_by(|a, b| a.1.total_pct.total_cmp(&b.1.total_pct));
    let Some((c, p)) = worst else {
        return;
    };
    ui.label(format!(
        "Full scale {}. Largest known error {} % of full scale ({}, at {}); the uncertainty \
         comes on top.",
        units.format(q, fs),
        number_text(p.total_pct, 3),
        c.case,
        units.format(q, p.wanted)
    ))
    .on_hover_text(
        "Sum of the magnitudes of departure from the straight line, leakage of unwanted loads, \
         temperature at the extreme of the range, leads and gauge effects",
    );
    with_uncertainty_ui(ui, units, be, fs);
    match result_series::allowed_pct(be, p.wanted, fs) {
        Some(a) => {
            let verdict = if p.total_pct <= a {
                "within"
            } else {
                "outside"
            };
            ui.label(format!(
                "Required accuracy at that load: ±{} % of full scale — the known error is \
                 {verdict}.",
                number_text(a, 3)
            ));
        }
        None => {
            ui.weak("No required accuracy is stated for this bridge, so no band is drawn.");
        }
    }
}
/// The predicted error as Margins checks it (known error plus expanded uncertainty), at the
/// case closest to its limit, in the wanted load's unit and % of full scale.
fn with_uncertainty_ui(ui: &mut egui::Ui, units: Units, be: &BridgeEvaluation, fs: f64) {
    let q = Quantity::of(be.wanted);
    let Some(a) = be
        .accuracy
        .iter()
        .max_by(|a, b| a.margin.utilisation.total_cmp(&b.margin.utilisation))
    else {
        return;
    };
    ui.label(format!(
        "With the expanded uncertainty, as Margins checks it: ±{} ({} % of full scale) against \
         the required ±{} at {} — {}.",
        units.format_difference(q, a.predicted()),
        number_text(100.0 * a.predicted() / fs, 3),
        units.format_difference(q, a.allowed),
        a.case,
        a.margin.status.word()
    ));
}

/// The zero reading a technician should see at no load, with its statistical and worst-case
/// spread, and the wanted load per mV/V in the display unit.
fn zero_and_conversion_ui(ui: &mut egui::Ui, doc: &DocumentState, be: &BridgeEvaluation) {
    let z = &be.zero_band;
    ui.label(format!(
        "Zero at no load: {} mV/V, ± {} mV/V from resistance tolerances (k = {}), {} to {} mV/V \
         at worst",
        number_text(z.centre_mv_per_v, 4),
        number_text(z.statistical_mv_per_v, 4),
        z.coverage_k,
        number_text(z.worst_low_mv_per_v, 4),
        number_text(z.worst_high_mv_per_v, 4)
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

/// An x axis titled `title` whose tick labels read in narrow plots: steps of 1, 2 or 5 times a
/// power of ten, about five labels across (the default spacing keeps only powers of ten, which
/// can leave a single "0").
pub(super) fn readable_x_axis<'a>(plot: Plot<'a>, title: String) -> Plot<'a> {
    plot.custom_x_axes(vec![
        egui_plot::AxisHints::new_x()
            .label(title)
            .label_spacing(30.0..=45.0),
    ])
    .x_grid_spacer(egui_plot::uniform_grid_spacer(|input| {
        let span = input.bounds.1 - input.bounds.0;
        let raw = if span.is_finite() && span > 0.0 {
            span / 5.0
        } else {
            input.base_step_size.max(f64::MIN_POSITIVE)
        };
        let power = 10f64.powf(raw.log10().floor());
        let step = [1.0, 2.0, 5.0, 10.0]
            .into_iter()
            .map(|m| m * power)
            .find(|s| *s >= raw)
            .unwrap_or(10.0 * power);
        [step / 5.0, step, step * 5.0]
    }))
}
