//! Bridges: the list, a schematic the app draws, arm assignment, the arrangement catalogue and
//! the automatic chooser.

use egui::{Color32, Pos2, Stroke, pos2, vec2};
use gw_bridge::LeadWiring;
use gw_bridge::arrangement::{CatalogueEntry, catalogue};
use gw_bridge::chooser::RankedArrangement;
use gw_plan::{BridgePlan, Part, PlanArm};

use crate::command::Command;
use crate::panels::capitalise;
use crate::state::{DocumentState, Selection};

/// A suggestion list with the evaluation count, part and bridge it was made for.
/// The ranked list for one bridge at one evaluation, with the bridge as wired judged the same
/// way for comparison.
type Suggestions = (
    u64,
    usize,
    usize,
    Result<(Vec<RankedArrangement>, Option<RankedArrangement>), String>,
);

/// The catalogue for one bridge at one evaluation and station (its key), kept so that it is
/// worked out once per change, not every frame.
type Catalogue = ((u64, usize, usize, u64), Vec<CatalogueEntry>);

/// View state: the last suggestion list and catalogue and the project state they were made for.
#[derive(Default)]
pub struct BridgesPanel {
    suggestions: Option<Suggestions>,
    catalogue: Option<Catalogue>,
}

use super::fields::{BRIDGE_FACTOR, GAUGE_FACTOR};
use super::item_fields::{arm_choices, arm_text, ohm_text};

/// What sits in an arm, short enough for the schematic.
fn short_arm_text(arm: &PlanArm) -> String {
    match arm {
        PlanArm::Completion(c) => format!("{} resistor", ohm_text(c.ohm)),
        other => arm_text(other),
    }
}

/// Draws the four arms as a diamond with what sits in each, the corners' roles and the wiring.
fn schematic_ui(ui: &mut egui::Ui, plan: &BridgePlan, units: crate::units::Units) {
    let width = ui.available_width().clamp(460.0, 620.0);
    let (resp, painter) = ui.allocate_painter(vec2(width, 320.0), egui::Sense::hover());
    let r = resp.rect;
    let c = r.center();
    let top = pos2(c.x, r.top() + 50.0);
    let bottom = pos2(c.x, r.bottom() - 30.0);
    let left = pos2(c.x - 140.0, c.y);
    let right = pos2(c.x + 140.0, c.y);
    let text = ui.visuals().text_color();
    let gauge_site = Color32::from_rgb(200, 120, 40);
    let instrument = Color32::from_rgb(120, 130, 140);
    // Arm k joins these corners (see the arm numbering in gw_bridge::circuit).
    let arms: [(Pos2, Pos2); 4] = [(left, bottom), (top, left), (top, right), (right, bottom)];
    for (k, (a, b)) in arms.iter().enumerate() {
        let at_gauge = !matches!(plan.arms[k], PlanArm::Completion(_));
        let colour = if at_gauge { gauge_site } else { instrument };
        painter.line_segment([*a, *b], Stroke::new(3.0, colour));
        let mid = a.lerp(*b, 0.5);
        // Each label starts beside its arm's midpoint and runs away from the diamond, so it
        // never crosses an arm.
        let left_side = mid.x < c.x;
        let above = mid.y < c.y;
        let at = mid
            + vec2(
                if left_side { -8.0 } else { 8.0 },
                if above { -8.0 } else { 8.0 },
            );
        let align = match (left_side, above) {
            (true, true) => egui::Align2::RIGHT_BOTTOM,
            (true, false) => egui::Align2::RIGHT_TOP,
            (false, true) => egui::Align2::LEFT_BOTTOM,
            (false, false) => egui::Align2::LEFT_TOP,
        };
        painter.text(
            at,
            align,
            format!("arm {}: {}", k + 1, short_arm_text(&plan.arms[k])),
            egui::FontId::proportional(12.0),
            text,
        );
    }
    for (p, label, align) in [
        (top, "excitation +", egui::Align2::CENTER_BOTTOM),
        (bottom, "excitation −", egui::Align2::CENTER_TOP),
        (left, "output +", egui::Align2::RIGHT_CENTER),
        (right, "output −", egui::Align2::LEFT_CENTER),
    ] {
        painter.circle_filled(p, 4.0, text);
        let offset = match align {
            egui::Align2::CENTER_BOTTOM => vec2(0.0, -6.0),
            egui::Align2::CENTER_TOP => vec2(0.0, 6.0),
            egui::Align2::RIGHT_CENTER => vec2(-8.0, 0.0),
            _ => vec2(8.0, 0.0),
        };
        painter.text(
            p + offset,
            align,
            label,
            egui::FontId::proportional(12.0),
            text,
        );
    }
    let at_gauge = plan
        .arms
        .clone()
        .map(|a| !matches!(a, PlanArm::Completion(_)));
    painter.text(
        r.left_top(),
        egui::Align2::LEFT_TOP,
        format!(
            "{} wiring, {} leads",
            plan.wiring.trade_name(at_gauge),
            units.format(crate::units::Quantity::CableLength, plan.lead.length_m)
        ),
        egui::FontId::proportional(12.0),
        text,
    );
    // The legend on its own line below, so a long wiring name never runs into it.
    painter.text(
        r.left_top() + vec2(0.0, 16.0),
        egui::Align2::LEFT_TOP,
        "amber: at the gauge   grey: at the instrument",
        egui::FontId::proportional(11.0),
        text,
    );
}

impl BridgesPanel {
    /// Draws the panel.
    pub fn bridges_ui(&mut self, ui: &mut egui::Ui, doc: &DocumentState, out: &mut Vec<Command>) {
        let Self {
            suggestions,
            catalogue,
        } = self;
        let sel = doc.selection;
        let Some(part) = doc.project.parts.get(sel.part) else {
            return;
        };
        egui::ScrollArea::vertical().show(ui, |ui| {
            ui.horizontal_wrapped(|ui| {
                ui.strong("Bridges");
                for (i, b) in part.bridges.iter().enumerate() {
                    if ui.selectable_label(sel.bridge == Some(i), &b.name).on_hover_text("Select this bridge").clicked() {
                        out.push(Command::Select(Selection { bridge: Some(i), ..sel }));
                    }
                }
                if ui.button("Add bridge").on_hover_text("Add a new bridge to this part, not yet wired").clicked() {
                    out.push(Command::AddBridge { part: sel.part });
                }
            });
            let Some((bi, plan)) = sel.bridge.and_then(|b| part.bridges.get(b).map(|p| (b, p))) else {
                ui.label("This part has no bridge yet.");
                return;
            };
            ui.separator();
            let factor = doc
                .evaluation
                .parts
                .iter()
                .find(|p| p.part_index == sel.part)
                .and_then(|pe| pe.bridge_indices.iter().position(|&b| b == bi).and_then(|k| pe.bridges.get(k)))
                .map(|be| format!("bridge factor {}", BRIDGE_FACTOR.number_text(doc.units, be.bridge_factor)))
                .unwrap_or_else(|| "not evaluated yet".to_owned());
            ui.label(format!(
                "{} — measures {}; arrangement: {}; channel {}; instrument gauge factor {}, {factor}. Edit every setting in the inspector.",
                plan.name,
                plan.wanted.name(),
                if plan.arrangement.is_empty() { "custom" } else { &plan.arrangement },
                plan.channel,
                GAUGE_FACTOR.number_text(doc.units, plan.gauge_factor_setting),
            ));
            schematic_ui(ui, plan, doc.units);
            ui.horizontal(|ui| {
                ui.label("Wiring");
                let at_gauge = plan.arms.clone().map(|a| !matches!(a, PlanArm::Completion(_)));
                let count = at_gauge.iter().filter(|a| **a).count();
                let now = plan.wiring.trade_name(at_gauge);
                for w in LeadWiring::choices(count) {
                    let name = w.trade_name(at_gauge);
                    if ui.selectable_label(now == name, &name).on_hover_text("How leads connect the gauge site to the instrument").clicked() {
                        out.push(Command::SetWiring { part: sel.part, bridge: bi, wiring: w });
                    }
                }
            });
            let choices = arm_choices(&doc.project, part);
            egui::Grid::new("arms").num_columns(2).show(ui, |ui| {
                for k in 0..4 {
                    let label = ui.label(format!("Arm {}", k + 1)).id;
                    egui::ComboBox::from_id_salt(("bridge view arm", k))
                        .selected_text(arm_text(&plan.arms[k]))
                        .show_ui(ui, |ui| {
                            for choice in &choices {
                                if ui.selectable_label(*choice == plan.arms[k], arm_text(choice)).clicked() {
                                    out.push(Command::SetArm { part: sel.part, bridge: bi, arm: k, element: choice.clone() });
                                }
                            }
                        })
                        .response
                        .labelled_by(label)
                        .on_hover_text("What sits in this arm: a grid, a dummy grid or a completion resistor");
                    ui.end_row();
                }
            });
            ui.separator();
            ui.strong("Arrangements for this part");
            catalogue_ui(ui, doc, part, bi, catalogue, out);
            ui.separator();
            suggestions_ui(ui, doc, part, bi, suggestions, out);
        });
    }
}

/// The standard arrangements for this part and load, each with an Apply button.
fn catalogue_ui(
    ui: &mut egui::Ui,
    doc: &DocumentState,
    part: &Part,
    bi: usize,
    cache: &mut Option<Catalogue>,
    out: &mut Vec<Command>,
) {
    let sel = doc.selection;
    let Some(plan) = part.bridges.get(bi) else {
        return;
    };
    let placed = doc.project.placed_gauges(part);
    let station = sel
        .gauge
        .and_then(|g| placed.get(g))
        .map(|g| g.position.x_m)
        .unwrap_or_else(|| {
            part.member
                .faces()
                .first()
                .map(|f| (f.x_range_m.0 + f.x_range_m.1) / 4.0)
                .unwrap_or(0.0)
        });
    let key = (doc.evaluations, sel.part, bi, station.to_bits());
    if cache.as_ref().is_none_or(|(k, _)| *k != key) {
        let spec = gw_plan::arrangements::catalogue_spec(&doc.project, part);
        *cache = Some((key, catalogue(&part.member, plan.wanted, station, &spec)));
    }
    let entries = cache.as_ref().map(|(_, e)| e.clone()).unwrap_or_default();
    if entries.is_empty() {
        ui.label("No standard arrangement measures this load on this part.");
    }
    for e in entries {
        let clicked = button_beside_text(
            ui,
            &format!("Apply {}", e.name),
            "Adds its gauges and rewires this bridge",
            &capitalise(&e.description),
        );
        if clicked {
            out.push(Command::ApplyCatalogue {
                part: sel.part,
                bridge: bi,
                entry: Box::new(e.clone()),
            });
        }
    }
}

/// A button with its explanation wrapped beside it, the rows separated by a thin line; true
/// when the button was clicked.
fn button_beside_text(ui: &mut egui::Ui, label: &str, hover: &str, text: &str) -> bool {
    let mut clicked = false;
    ui.horizontal_top(|ui| {
        clicked = ui.button(label).on_hover_text(hover).clicked();
        ui.vertical(|ui| {
            ui.add(egui::Label::new(text).wrap());
        });
    });
    ui.separator();
    clicked
}

/// The Suggest button and the ranked list it produced for this bridge.
fn suggestions_ui(
    ui: &mut egui::Ui,
    doc: &DocumentState,
    part: &Part,
    bi: usize,
    suggestions: &mut Option<Suggestions>,
    out: &mut Vec<Command>,
) {
    let sel = doc.selection;
    ui.horizontal(|ui| {
        ui.strong("Suggest");
        if ui
            .button("Suggest arrangements")
            .on_hover_text(
                "Search every assignment of the placed grids to the four arms and rank them",
            )
            .clicked()
        {
            let result = gw_plan::arrangements::suggest(&doc.project, part, bi).and_then(|list| {
                let wired = gw_plan::arrangements::assess_wired(&doc.project, part, bi)?;
                Ok((list, wired))
            });
            *suggestions = Some((doc.evaluations, sel.part, bi, result));
        }
    });
    let Some((n, p, b, result)) = suggestions.as_ref() else {
        return;
    };
    if *n != doc.evaluations || *p != sel.part || *b != bi {
        return;
    }
    match result {
        Err(e) => {
            ui.colored_label(super::palette::FAIL, e);
        }
        Ok((list, _)) if list.is_empty() => {
            ui.label(
                "No arrangement of the placed grids reads this load by more than one count of \
                 the channel; place grids where it strains the part.",
            );
        }
        Ok((list, wired)) => {
            ui.label(
                "Ranked by the error each leaves in the wanted load at its rated value: \
                 unwanted loads, temperature (leads included) and nonlinearity at their worst, \
                 plus twice the root sum of squares of noise, quantization and placement \
                 tolerance (about a 95 % bound).",
            );
            if let Some(w) = wired {
                ui.add(egui::Label::new(format!("As wired: {}", capitalise(&w.reason))).wrap());
                ui.separator();
            }
            for (i, r) in list.iter().enumerate() {
                let clicked = button_beside_text(
                    ui,
                    &format!("Apply suggestion {}", i + 1),
                    "Rewire this bridge to this arrangement",
                    &capitalise(&r.reason),
                );
                if clicked {
                    out.push(Command::ApplySuggestion {
                        part: sel.part,
                        bridge: bi,
                        ranked: Box::new(r.clone()),
                    });
                }
            }
        }
    }
}
