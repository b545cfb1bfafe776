//! The findings list: every validation problem and failed margin; clicking one selects the
//! item at fault.

use gw_plan::evaluate::{Severity, Target};

use super::palette;
use crate::state::DocumentState;

/// View state of the findings list (none needed beyond the document).
#[derive(Default)]
pub struct FindingsPanel;

impl FindingsPanel {
    /// Draws the list; clicking selects the target in `doc`.
    pub fn findings_ui(&mut self, ui: &mut egui::Ui, doc: &mut DocumentState) {
        let Self = self;
        ui.horizontal_wrapped(|ui| {
            ui.strong("Findings");
            let n = doc.evaluation.findings.len();
            ui.label(if n == 0 {
                "— none: every margin passes".to_owned()
            } else {
                format!("— {n}")
            });
            if let Some(notice) = &doc.notice {
                ui.separator();
                let colour = if notice.is_error {
                    palette::FAIL
                } else {
                    ui.visuals().text_color()
                };
                ui.colored_label(colour, &notice.text);
            }
        });
        let mut select = None;
        let units = doc.units;
        egui::ScrollArea::vertical()
            .max_height(110.0)
            .show(ui, |ui| {
                for f in &doc.evaluation.findings {
                    let (word, colour) = match f.severity {
                        Severity::Error => ("Problem", palette::FAIL),
                        Severity::Fail => ("Fails", palette::FAIL),
                        Severity::Warn => ("Check", palette::WARN),
                    };
                    // Wrapped, so a long message stays inside the panel.
                    ui.horizontal_wrapped(|ui| {
                        ui.colored_label(colour, word);
                        if ui
                            .link(f.text(units))
                            .on_hover_text("Select the item this is about")
                            .clicked()
                        {
                            select = Some(f.target);
                        }
                    });
                }
            });
        if let Some(t) = select {
            let s = &mut doc.selection;
            match t {
                Target::Part { part } => s.part = part,
                Target::LoadCase { part, case } => {
                    s.part = part;
                    s.case = case;
                }
                Target::Gauge { part, gauge } => {
                    s.part = part;
                    s.gauge = Some(gauge);
                }
                Target::Bridge { part, bridge } => {
                    s.part = part;
                    s.bridge = Some(bridge);
                }
            }
        }
    }
}
