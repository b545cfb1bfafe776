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
                    });
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
                if case.proof_test {
                    ui.colored_label(super::palette::WARN, "Proof test: see the cautions in Help before loading.");
                }
            }
            ui.separator();
            ui.strong("Gauges");
            egui::Grid::new("gauges").num_columns(4).striped(true).show(ui, |ui| {
                for (i, g) in part.gauges.iter().enumerate() {
                    if ui.selectable_label(sel.gauge == Some(i), &g.id).on_hover_text("Select this gauge").clicked() {
                        out.push(Command::Select(Selection { gauge: Some(i), ..sel }));
                    }
                    ui.label(g.spec.pattern.name());
                    let mut deg = g.angle_rad.to_degrees();
                    if ui
                        .add(egui::DragValue::new(&mut deg).speed(1.0).suffix("°"))
                        .on_hover_text("Grid direction from the member axis, counter-clockwise seen from outside")
                        .changed()
                    {
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
