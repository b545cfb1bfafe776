//! The part panel: parts, dimensions and material, load cases, and the gauge list.

use gw_mechanics::LoadComponent;

use crate::command::Command;
use crate::member_fields::{fields, with_field};
use crate::state::{DocumentState, Selection};
use crate::units::{Quantity, Units};

/// View state: the last rejected edit per field, with its reason.
#[derive(Default)]
pub struct ProjectPanel {
    field_error: Option<(usize, usize, String)>,
}

fn value_edit(
    ui: &mut egui::Ui,
    label: egui::Id,
    units: Units,
    q: Quantity,
    si: f64,
    help: &str,
) -> Option<f64> {
    let mut shown = units.to_display(q, si);
    let speed = (shown.abs() * 0.005).max(0.01);
    let r = ui
        .add(
            egui::DragValue::new(&mut shown)
                .speed(speed)
                .suffix(format!(" {}", units.label(q))),
        )
        .labelled_by(label)
        .on_hover_text(help);
    (r.changed() && shown.is_finite()).then(|| units.from_display(q, shown))
}

impl ProjectPanel {
    /// Draws the panel.
    pub fn project_ui(&mut self, ui: &mut egui::Ui, doc: &DocumentState, out: &mut Vec<Command>) {
        let Self { field_error } = self;
        let units = doc.units;
        let sel = doc.selection;
        egui::ScrollArea::vertical().show(ui, |ui| {
            ui.heading("Parts");
            for (i, p) in doc.project.parts.iter().enumerate() {
                let label = format!("{} — {}", p.name, p.member.kind_name());
                if ui.selectable_label(sel.part == i, label).on_hover_text("Show this part").clicked() {
                    out.push(Command::Select(Selection { part: i, case: 0, gauge: None, bridge: None }));
                }
            }
            let Some(part) = doc.project.parts.get(sel.part) else {
                ui.label("The project has no parts.");
                return;
            };
            ui.separator();
            ui.strong("Dimensions");
            let material = part.member.material();
            ui.label(format!(
                "Material: {} (E {}, ν {:.3}, yield {})",
                material.name,
                units.format_modulus(material.youngs_modulus_pa),
                material.poisson_ratio,
                units.format_stress(material.yield_strength_pa)
            ))
            .on_hover_text("Typical values; use the certificate values of the real material where they matter.");
            ui.horizontal(|ui| {
                egui::ComboBox::from_label("Material")
                    .selected_text(material.name.clone())
                    .show_ui(ui, |ui| {
                        for entry in gw_mechanics::MATERIAL_LIBRARY {
                            if ui.selectable_label(part.material_key.as_deref() == Some(entry.key), entry.name).on_hover_text(entry.source).clicked() {
                                let mut m = part.member.clone();
                                *m.material_mut() = entry.material();
                                out.push(Command::SetMember { part: sel.part, member: Box::new(m) });
                            }
                        }
                    })
                    .response
                    .on_hover_text("Pick a library material; edit the values below for a custom one");
            });
            egui::Grid::new("material").num_columns(2).show(ui, |ui| {
                let m = material.clone();
                let mut edits: Vec<(usize, f64)> = Vec::new();
                let label = ui.label("Young's modulus").id;
                if let Some(v) = value_edit(ui, label, units, Quantity::Modulus, m.youngs_modulus_pa, "Young's modulus E") {
                    edits.push((0, v));
                }
                ui.end_row();
                let label = ui.label("Poisson's ratio").id;
                if let Some(v) = value_edit(ui, label, units, Quantity::Plain, m.poisson_ratio, "Poisson's ratio ν (0 to 0.5)") {
                    edits.push((1, v));
                }
                ui.end_row();
                let label = ui.label("Expansion (ppm/°C)").id;
                if let Some(v) = value_edit(ui, label, units, Quantity::Plain, m.cte_per_c * 1e6, "Coefficient of thermal expansion, 10⁻⁶ per °C") {
                    edits.push((2, v * 1e-6));
                }
                ui.end_row();
                let label = ui.label("Yield strength").id;
                if let Some(v) = value_edit(ui, label, units, Quantity::Pressure, m.yield_strength_pa, "0.2 % yield strength") {
                    edits.push((3, v));
                }
                ui.end_row();
                for (k, v) in edits {
                    let mut member = part.member.clone();
                    let mat = member.material_mut();
                    match k {
                        0 => mat.youngs_modulus_pa = v,
                        1 => mat.poisson_ratio = v,
                        2 => mat.cte_per_c = v,
                        _ => mat.yield_strength_pa = v,
                    }
                    mat.name = "Custom material".into();
                    match member.validate() {
                        Ok(()) => out.push(Command::SetMember { part: sel.part, member: Box::new(member) }),
                        Err(e) => *field_error = Some((sel.part, 100 + k, e.to_string())),
                    }
                }
                if let Some((p, k, msg)) = field_error.as_ref()
                    && *p == sel.part
                    && *k >= 100
                {
                    ui.label("");
                    ui.colored_label(super::palette::FAIL, msg);
                    ui.end_row();
                }
            });
            egui::Grid::new("dimensions").num_columns(2).show(ui, |ui| {
                for (k, f) in fields(&part.member).iter().enumerate() {
                    let label = ui.label(f.label).id;
                    if let Some(v) = value_edit(ui, label, units, f.quantity, f.value, f.help) {
                        let candidate = with_field(&part.member, k, v);
                        match candidate.validate() {
                            Ok(()) => {
                                *field_error = None;
                                out.push(Command::SetMember { part: sel.part, member: Box::new(candidate) });
                            }
                            Err(e) => *field_error = Some((sel.part, k, e.to_string())),
                        }
                    }
                    ui.end_row();
                    if let Some((p, fk, msg)) = field_error.as_ref()
                        && *p == sel.part
                        && *fk == k
                    {
                        ui.label("");
                        ui.colored_label(super::palette::FAIL, msg);
                        ui.end_row();
                    }
                }
            });
            ui.separator();
            ui.horizontal(|ui| {
                egui::ComboBox::from_label("Load case")
                    .selected_text(part.load_cases.get(sel.case).map(|c| c.name.as_str()).unwrap_or("—"))
                    .show_ui(ui, |ui| {
                        for (i, c) in part.load_cases.iter().enumerate() {
                            if ui.selectable_label(i == sel.case, &c.name).clicked() {
                                out.push(Command::Select(Selection { case: i, ..sel }));
                            }
                        }
                    })
                    .response
                    .on_hover_text("The load case the map, readings and margins show");
                if ui.button("Add").on_hover_text("Add a load case copied from this one").clicked() {
                    out.push(Command::AddLoadCase { part: sel.part });
                }
                if ui.button("Delete").on_hover_text("Delete this load case (a part keeps at least one)").clicked() {
                    out.push(Command::DeleteLoadCase { part: sel.part, case: sel.case });
                }
            });
            if let Some(case) = part.load_cases.get(sel.case) {
                let mut name = case.name.clone();
                if ui.add(egui::TextEdit::singleline(&mut name).hint_text("load case name")).on_hover_text("Name of the load case").changed() {
                    out.push(Command::RenameLoadCase { part: sel.part, case: sel.case, name });
                }
                egui::Grid::new("loads").num_columns(2).show(ui, |ui| {
                    for &c in part.member.components() {
                        let q = Quantity::of(c);
                        let label = ui.label(capitalise(c.name())).id;
                        let help = format!("{} at full load of this case, {}", c.name(), units.label(q));
                        let si = case.value(c);
                        let q_shown = if c == LoadComponent::TemperatureChange { Quantity::TemperatureChange } else { q };
                        if let Some(v) = value_edit(ui, label, units, q_shown, si, &help) {
                            out.push(Command::SetLoad { part: sel.part, case: sel.case, component: c, value: v });
                        }
                        ui.end_row();
                    }
                });
                ui.horizontal(|ui| {
                    let mut steps = case.ramp_steps;
                    let mut lo = units.to_display(Quantity::TemperatureChange, case.temperature_range_c.0);
                    let mut hi = units.to_display(Quantity::TemperatureChange, case.temperature_range_c.1);
                    let mut cycled = case.cycled;
                    let t = units.label(Quantity::TemperatureChange);
                    let mut changed = false;
                    ui.label("Ramp points");
                    changed |= ui
                        .add(egui::DragValue::new(&mut steps).range(1..=200))
                        .on_hover_text("Points from zero to full load in the output plot")
                        .changed();
                    ui.label("Temperature from");
                    changed |= ui
                        .add(egui::DragValue::new(&mut lo).suffix(format!(" {t}")))
                        .on_hover_text("Low end of the apparent-strain plot, as a change from the reference temperature")
                        .changed();
                    ui.label("to");
                    changed |= ui
                        .add(egui::DragValue::new(&mut hi).suffix(format!(" {t}")))
                        .on_hover_text("High end of the apparent-strain plot, as a change from the reference temperature")
                        .changed();
                    changed |= ui.checkbox(&mut cycled, "Cycled").on_hover_text("Applied many times: fatigue margins apply").changed();
                    if changed {
                        let lo = units.from_display(Quantity::TemperatureChange, lo);
                        let hi = units.from_display(Quantity::TemperatureChange, hi);
                        out.push(Command::SetCaseSettings { part: sel.part, case: sel.case, ramp_steps: steps, temperature_range_c: (lo.min(hi), hi.max(lo)), cycled });
                    }
                });
                if case.proof_test {
                    ui.colored_label(super::palette::WARN, "Proof test: see the cautions in Help before loading.");
                }
            }
            ui.separator();
            ui.strong("Gauges");
            if let Some((gi, g)) = sel.gauge.and_then(|g| part.gauges.get(g).map(|p| (g, p))) {
                egui::CollapsingHeader::new(format!("Gauge data of {}", g.id)).default_open(false).show(ui, |ui| {
                    let s = &g.spec;
                    let mut spec = s.clone();
                    let mut changed = false;
                    egui::Grid::new("gauge data").num_columns(2).show(ui, |ui| {
                        let mut num = |ui: &mut egui::Ui, label: &str, value: &mut f64, scale: f64, suffix: &str, help: &str| {
                            changed |= super::scaled_number_row(ui, label, value, scale, suffix, help);
                        };
                        num(ui, "Grid length", &mut spec.grid_length_m, 1e3, " mm", "Active grid length");
                        num(ui, "Grid width", &mut spec.grid_width_m, 1e3, " mm", "Active grid width");
                        num(ui, "Resistance", &mut spec.resistance_ohm, 1.0, " Ω", "Nominal grid resistance");
                        num(ui, "Gauge factor", &mut spec.gauge_factor, 1.0, "", "Gauge factor of the lot");
                        num(ui, "Gauge-factor tolerance", &mut spec.gauge_factor_tolerance, 100.0, " %", "± tolerance of the gauge factor");
                        num(ui, "Transverse sensitivity", &mut spec.transverse_sensitivity, 100.0, " %", "Kt of the grid");
                        num(ui, "Strain limit", &mut spec.strain_limit, 1e6, " µε", "Largest strain the grid survives once");
                        num(ui, "Fatigue strain limit", &mut spec.fatigue_strain_limit, 1e6, " µε", "Strain amplitude for the rated cycles");
                        num(ui, "Matched expansion", &mut spec.thermal_output.matched_cte_per_c, 1e6, " ppm/°C", "Expansion coefficient the gauge is matched to");
                        num(ui, "Allowed power density", &mut spec.max_power_density_w_m2, 1e-3, " kW/m²", "Self-heating limit; depends on the part's heat sinking");
                    });
                    if changed {
                        match spec.validate() {
                            Ok(()) => out.push(Command::SetGaugeSpec { part: sel.part, gauge: gi, spec: Box::new(spec) }),
                            Err(e) => {
                                ui.colored_label(super::palette::FAIL, e.to_string());
                            }
                        }
                    }
                });
            }
            egui::Grid::new("gauges").num_columns(4).striped(true).show(ui, |ui| {
                for (i, g) in part.gauges.iter().enumerate() {
                    if ui.selectable_label(sel.gauge == Some(i), &g.id).on_hover_text("Select this gauge").clicked() {
                        out.push(Command::Select(Selection { gauge: Some(i), ..sel }));
                    }
                    ui.label(g.spec.pattern.name());
                    let mut deg = g.angle_rad.to_degrees();
                    if ui
                        .add(egui::DragValue::new(&mut deg).speed(1.0).suffix("°"))
                        .on_hover_text("Grid direction from the member axis, counter-clockwise seen from outside; snaps to 0.5°")
                        .changed()
                    {
                        // Snap to half degrees: finer than any layout can hold.
                        let deg = (deg * 2.0).round() / 2.0;
                        out.push(Command::SetGaugeAngle { part: sel.part, gauge: i, angle_rad: deg.to_radians() });
                    }
                    if ui.small_button("Delete").on_hover_text("Delete this gauge; arms that used it get a completion resistor").clicked() {
                        out.push(Command::DeleteGauge { part: sel.part, gauge: i });
                    }
                    ui.end_row();
                }
            });
        });
    }
}

/// "axial force" → "Axial force".
pub fn capitalise(s: &str) -> String {
    let mut c = s.chars();
    c.next()
        .map(|f| f.to_uppercase().collect::<String>() + c.as_str())
        .unwrap_or_default()
}
