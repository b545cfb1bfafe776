//! What cancels what: each bridge's response to every load component, the rejection of
//! unwanted loads and the multi-bridge recovery matrix.

use gw_plan::evaluate::PartEvaluation;

use crate::panels::capitalise;
use crate::state::DocumentState;
use crate::units::Quantity;

pub(super) fn cancellation_ui(ui: &mut egui::Ui, doc: &DocumentState, pe: &PartEvaluation) {
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
