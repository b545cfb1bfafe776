//! The plan tree: project → gauge stock and parts → load cases, gauges, bridges. Click to
//! select, double-click or F2 to rename, drag to reorder, buttons to add, duplicate and delete
//! (with confirmation; undo brings it back). Each item shows its state.

use gw_plan::edit::{self, Item, ItemKind};
use gw_plan::evaluate::{Severity, Target};
use gw_plan::{PlanArm, Project};

use crate::command::Command;
use crate::state::{DocumentState, TestFocus};

/// The indices of the bridge named `bridge` on the part named `part`.
pub fn bridge_index(project: &Project, part: &str, bridge: &str) -> Option<(usize, usize)> {
    let p = project.parts.iter().position(|p| p.name == part)?;
    let b = project.parts[p]
        .bridges
        .iter()
        .position(|b| b.name == bridge)?;
    Some((p, b))
}

/// The bridge named `bridge` on the part named `part`.
pub fn bridge_plan<'a>(
    project: &'a Project,
    part: &str,
    bridge: &str,
) -> Option<&'a gw_plan::BridgePlan> {
    let (p, b) = bridge_index(project, part, bridge)?;
    project.parts.get(p)?.bridges.get(b)
}

/// The check-out entry of a channel named by its part and bridge.
pub fn channel_focus(project: &Project, part: &str, bridge: &str) -> Option<TestFocus> {
    bridge_index(project, part, bridge).map(|(part, bridge)| TestFocus::Channel { part, bridge })
}

/// View state: the item being renamed with its draft, the delete awaiting confirmation, the
/// last refusal.
#[derive(Default)]
pub struct TreePanel {
    renaming: Option<(Item, String)>,
    confirm_delete: Option<Item>,
    message: Option<String>,
}

/// The state mark of an item.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Mark {
    Fails,
    Warns,
    NotWired,
}

fn worst(doc: &DocumentState, matches: impl Fn(&Target) -> bool) -> Option<Mark> {
    let mut out = None;
    for f in doc
        .evaluation
        .findings
        .iter()
        .filter(|f| matches(&f.target))
    {
        let m = match f.severity {
            Severity::Error | Severity::Fail => Mark::Fails,
            Severity::Warn => Mark::Warns,
        };
        if out != Some(Mark::Fails) {
            out = Some(m);
        }
    }
    out
}

fn gauge_wired(project: &Project, part: usize, gauge: usize) -> bool {
    let Some(p) = project.parts.get(part) else {
        return true;
    };
    let Some(id) = p.gauges.get(gauge).map(|g| &g.id) else {
        return true;
    };
    p.bridges.iter().flat_map(|b| &b.arms).any(
        |a| matches!(a, PlanArm::Grid { gauge, .. } | PlanArm::Dummy { gauge, .. } if gauge == id),
    )
}

fn mark_of(doc: &DocumentState, item: Item) -> Option<Mark> {
    match item {
        Item::Part(p) => worst(
            doc,
            |t| matches!(t, Target::Part { part } | Target::LoadCase { part, .. } | Target::Gauge { part, .. } | Target::Bridge { part, .. } if *part == p),
        ),
        Item::LoadCase { part: p, case: c } => worst(
            doc,
            |t| matches!(t, Target::LoadCase { part, case } if *part == p && *case == c),
        ),
        Item::Gauge { part: p, gauge: g } => {
            let m = worst(
                doc,
                |t| matches!(t, Target::Gauge { part, gauge } if *part == p && *gauge == g),
            );
            // A failing margin shows first; then the hollow ring of a gauge in no bridge.
            if m == Some(Mark::Fails) {
                return m;
            }
            (!gauge_wired(&doc.project, p, g))
                .then_some(Mark::NotWired)
                .or(m)
        }
        Item::Bridge { part: p, bridge: b } => {
            let wired = doc
                .project
                .parts
                .get(p)
                .and_then(|pt| pt.bridges.get(b))
                .is_none_or(|pl| pl.is_wired());
            if !wired {
                return Some(Mark::NotWired);
            }
            worst(
                doc,
                |t| matches!(t, Target::Bridge { part, bridge } if *part == p && *bridge == b),
            )
        }
        Item::Project | Item::Stock(_) => None,
    }
}

fn mark_ui(ui: &mut egui::Ui, mark: Option<Mark>) {
    let (colour, filled, help) = match mark {
        Some(Mark::Fails) => (
            super::palette::FAIL,
            true,
            "A margin fails or something could not be computed; see the findings",
        ),
        Some(Mark::Warns) => (
            super::palette::WARN,
            true,
            "A margin is close to its limit or a model is near its edge; see the findings",
        ),
        Some(Mark::NotWired) => (
            egui::Color32::GRAY,
            false,
            "Not wired: not in any bridge arm, or a bridge with no grid",
        ),
        None => (super::palette::PASS, true, "Every margin passes"),
    };
    // Drawn, not a glyph: the mark needs no particular font.
    let (rect, r) = ui.allocate_exact_size(egui::vec2(10.0, 10.0), egui::Sense::hover());
    let c = rect.center();
    if filled {
        ui.painter().circle_filled(c, 4.0, colour);
    } else {
        ui.painter()
            .circle_stroke(c, 3.5, egui::Stroke::new(1.5, colour));
    }
    r.on_hover_text(help);
}

impl TreePanel {
    /// Draws the tree and the buttons for the selected item, in a region named "Plan tree".
    /// Asks to delete `item` (the Delete key): the same confirmation as the Delete button.
    pub fn ask_delete(&mut self, item: Item) {
        if !matches!(item, Item::Project) {
            self.confirm_delete = Some(item);
        }
    }

    pub fn tree_ui(&mut self, ui: &mut egui::Ui, doc: &DocumentState, out: &mut Vec<Command>) {
        ui.scope_builder(
            egui::UiBuilder::new().accessibility_label("Plan tree"),
            |ui| self.contents_ui(ui, doc, out),
        );
    }

    fn contents_ui(&mut self, ui: &mut egui::Ui, doc: &DocumentState, out: &mut Vec<Command>) {
        let focus = doc.selection.inspected();
        self.toolbar_ui(ui, doc, focus, out);
        ui.separator();
        egui::ScrollArea::vertical()
            .auto_shrink([false, false])
            .show(ui, |ui| {
                self.row_ui(
                    ui,
                    doc,
                    Item::Project,
                    format!("Project: {}", doc.project.name),
                    out,
                );
                egui::CollapsingHeader::new("Gauge stock")
                    .default_open(true)
                    .show(ui, |ui| {
                        for (k, s) in doc.project.gauge_stock.iter().enumerate() {
                            self.row_ui(ui, doc, Item::Stock(k), s.name.clone(), out);
                        }
                        if doc.project.gauge_stock.is_empty() {
                            ui.weak("No gauge types yet; adding a gauge adds one.");
                        }
                    });
                for (i, part) in doc.project.parts.iter().enumerate() {
                    self.part_ui(ui, doc, i, part, out);
                }
                if doc.project.parts.is_empty() {
                    ui.weak("No parts: use Add, then Part.");
                }
                self.checkout_ui(ui, doc, out);
            });
        self.confirm_ui(ui, doc, out);
    }

    fn part_ui(
        &mut self,
        ui: &mut egui::Ui,
        doc: &DocumentState,
        i: usize,
        part: &gw_plan::Part,
        out: &mut Vec<Command>,
    ) {
        let id = ui.make_persistent_id(("tree part", i));
        egui::collapsing_header::CollapsingState::load_with_default_open(ui.ctx(), id, true)
            .show_header(ui, |ui| {
                self.row_ui(
                    ui,
                    doc,
                    Item::Part(i),
                    format!("{} — {}", part.name, part.member.kind_name()),
                    out,
                );
            })
            .body(|ui| {
                ui.weak("Load cases");
                for (c, case) in part.load_cases.iter().enumerate() {
                    self.row_ui(
                        ui,
                        doc,
                        Item::LoadCase { part: i, case: c },
                        case.name.clone(),
                        out,
                    );
                }
                ui.weak("Gauges");
                for (g, gauge) in part.gauges.iter().enumerate() {
                    let pattern = doc
                        .project
                        .stock_entry(&gauge.stock)
                        .map(|s| s.spec.pattern.name())
                        .unwrap_or("?");
                    self.row_ui(
                        ui,
                        doc,
                        Item::Gauge { part: i, gauge: g },
                        format!("Gauge {} ({pattern})", gauge.id),
                        out,
                    );
                }
                ui.weak("Bridges");
                for (b, bridge) in part.bridges.iter().enumerate() {
                    self.row_ui(
                        ui,
                        doc,
                        Item::Bridge { part: i, bridge: b },
                        format!("Bridge {}", bridge.name),
                        out,
                    );
                }
            });
    }

    /// "Check-out and test": the overview, then each channel with its verdict in colour and
    /// in words.
    fn checkout_ui(&mut self, ui: &mut egui::Ui, doc: &DocumentState, out: &mut Vec<Command>) {
        let focus = doc.selection.test;
        let id = ui.make_persistent_id("tree check-out");
        egui::collapsing_header::CollapsingState::load_with_default_open(ui.ctx(), id, true)
            .show_header(ui, |ui| {
                let r = ui
                    .selectable_label(focus == Some(TestFocus::Overview), "Check-out and test")
                    .on_hover_text("The installation's records, the test log and their verdicts");
                if r.clicked() {
                    out.push(Command::FocusTest(TestFocus::Overview));
                }
            })
            .body(|ui| {
                for c in &doc.measured.derived.checkout.channels {
                    let Some(f) = channel_focus(&doc.project, &c.part, &c.bridge) else {
                        continue;
                    };
                    let v = c.verdict();
                    ui.horizontal(|ui| {
                        let colour = super::checkout_inspector::verdict_colour(v);
                        let (rect, _) =
                            ui.allocate_exact_size(egui::vec2(10.0, 10.0), egui::Sense::hover());
                        ui.painter().circle_filled(rect.center(), 4.0, colour);
                        let r = ui
                            .selectable_label(
                                focus == Some(f),
                                format!("ch{} {}", c.channel, c.bridge),
                            )
                            .on_hover_text("Show the channel's records and checks");
                        if r.clicked() {
                            out.push(Command::FocusTest(f));
                        }
                        ui.colored_label(colour, v.word());
                    });
                }
            });
    }

    /// One item: mark, name (or the rename field), click, double-click, drag and drop.
    fn row_ui(
        &mut self,
        ui: &mut egui::Ui,
        doc: &DocumentState,
        item: Item,
        text: String,
        out: &mut Vec<Command>,
    ) {
        let selected = doc.selection.test.is_none() && doc.selection.inspected() == item;
        ui.horizontal(|ui| {
            if !matches!(item, Item::Project | Item::Stock(_)) {
                mark_ui(ui, mark_of(doc, item));
            }
            if let Some((renaming, draft)) = &mut self.renaming
                && *renaming == item
            {
                let r = ui.add(
                    egui::TextEdit::singleline(draft)
                        .desired_width(160.0)
                        .hint_text("new name"),
                );
                r.request_focus();
                if ui.input(|i| i.key_pressed(egui::Key::Escape)) {
                    self.renaming = None;
                } else if r.lost_focus() || ui.input(|i| i.key_pressed(egui::Key::Enter)) {
                    let name = draft.clone();
                    self.renaming = None;
                    self.apply(doc, out, |p| edit::rename(p, item, &name).map(|()| item));
                }
                return;
            }
            let r = ui
                .selectable_label(selected, text)
                .interact(egui::Sense::click_and_drag())
                .on_hover_text("Click to select; double-click or F2 to rename; drag to reorder");
            if r.clicked() {
                out.push(Command::Focus(item));
            }
            if r.double_clicked() {
                self.start_rename(doc, item);
            }
            if !matches!(item, Item::Project) {
                r.dnd_set_drag_payload(item);
            }
            if let Some(dragged) = r.dnd_release_payload::<Item>() {
                self.drop_on(doc, *dragged, item, out);
            }
        });
    }

    fn start_rename(&mut self, doc: &DocumentState, item: Item) {
        if let Some(name) = edit::item_name(&doc.project, item) {
            self.renaming = Some((item, name));
        }
    }

    /// Dropping an item on a sibling moves it to the sibling's place.
    fn drop_on(
        &mut self,
        doc: &DocumentState,
        dragged: Item,
        target: Item,
        out: &mut Vec<Command>,
    ) {
        let to = match (dragged, target) {
            (Item::Stock(_), Item::Stock(k)) | (Item::Part(_), Item::Part(k)) => Some(k),
            (Item::LoadCase { part: a, .. }, Item::LoadCase { part: b, case }) if a == b => {
                Some(case)
            }
            (Item::Gauge { part: a, .. }, Item::Gauge { part: b, gauge }) if a == b => Some(gauge),
            (Item::Bridge { part: a, .. }, Item::Bridge { part: b, bridge }) if a == b => {
                Some(bridge)
            }
            _ => None,
        };
        match to {
            Some(to) if dragged != target => {
                self.apply(doc, out, |p| edit::move_to(p, dragged, to))
            }
            Some(_) => {}
            None => {
                self.message = Some(
                    "Drop an item on another of the same kind in the same part to move it there."
                        .into(),
                )
            }
        }
    }

    /// Runs a structural edit on a copy; emits it when it succeeds, keeps the reason when not.
    fn apply(
        &mut self,
        doc: &DocumentState,
        out: &mut Vec<Command>,
        op: impl FnOnce(&mut Project) -> Result<Item, String>,
    ) {
        let mut p = doc.project.clone();
        match op(&mut p).and_then(|item| {
            gw_plan::validate::validate_project(&p)
                .map(|()| item)
                .map_err(|e| e.to_string())
        }) {
            Ok(item) => {
                self.message = None;
                out.push(Command::Edit {
                    project: Box::new(p),
                    focus: Some(item),
                });
            }
            Err(e) => self.message = Some(e),
        }
    }

    fn toolbar_ui(
        &mut self,
        ui: &mut egui::Ui,
        doc: &DocumentState,
        focus: Item,
        out: &mut Vec<Command>,
    ) {
        let part = focus.part().unwrap_or(doc.selection.part);
        let has_part = part < doc.project.parts.len();
        ui.horizontal_wrapped(|ui| {
            ui.menu_button("Add", |ui| {
                for (kind, label, needs_part) in [
                    (ItemKind::Part, "Part", false),
                    (ItemKind::LoadCase, "Load case", true),
                    (ItemKind::Gauge, "Gauge", true),
                    (ItemKind::Bridge, "Bridge", true),
                    (ItemKind::Stock, "Gauge type", false),
                ] {
                    if ui
                        .add_enabled(has_part || !needs_part, egui::Button::new(label))
                        .on_hover_text("Add to the selected part (or to the project)")
                        .clicked()
                    {
                        self.apply(doc, out, |p| edit::add(p, kind, part));
                        ui.close();
                    }
                }
            })
            .response
            .on_hover_text("Add a part, load case, gauge, bridge or gauge type");
            let editable = !matches!(focus, Item::Project);
            if ui
                .add_enabled(editable, egui::Button::new("Duplicate"))
                .on_hover_text("Copy the selected item")
                .clicked()
            {
                self.apply(doc, out, |p| edit::duplicate(p, focus));
            }
            if ui
                .button("Rename")
                .on_hover_text("Rename the selected item (F2)")
                .clicked()
            {
                self.start_rename(doc, focus);
            }
            if ui
                .add_enabled(editable, egui::Button::new("Delete"))
                .on_hover_text("Delete the selected item (asks first; Ctrl+Z brings it back)")
                .clicked()
            {
                self.confirm_delete = Some(focus);
            }
        });
        if ui.input(|i| i.key_pressed(egui::Key::F2)) && !ui.ctx().egui_wants_keyboard_input() {
            self.start_rename(doc, focus);
        }
        if let Some(m) = &self.message {
            ui.add(egui::Label::new(egui::RichText::new(m).color(super::palette::FAIL)).wrap());
        }
    }

    fn confirm_ui(&mut self, ui: &mut egui::Ui, doc: &DocumentState, out: &mut Vec<Command>) {
        let Some(item) = self.confirm_delete else {
            return;
        };
        let name = edit::item_name(&doc.project, item).unwrap_or_default();
        let mut close = false;
        egui::Window::new("Delete")
            .collapsible(false)
            .resizable(false)
            .anchor(egui::Align2::CENTER_CENTER, [0.0, 0.0])
            .show(ui.ctx(), |ui| {
                ui.label(format!("Delete {} \"{name}\"?", item.kind_name()));
                if matches!(item, Item::Gauge { .. }) {
                    ui.label("Bridge arms that use it get a completion resistor.");
                }
                ui.label("Undo in the Edit menu (Ctrl+Z) brings it back.");
                ui.horizontal(|ui| {
                    if ui.button("Delete it").clicked() {
                        let parent = match item {
                            Item::Part(_) | Item::Stock(_) => Item::Project,
                            other => Item::Part(other.part().unwrap_or(0)),
                        };
                        self.apply(doc, out, |p| edit::delete(p, item).map(|()| parent));
                        close = true;
                    }
                    if ui.button("Keep it").clicked() {
                        close = true;
                    }
                });
            });
        if close {
            self.confirm_delete = None;
        }
    }
}
