//! The inspector: every field of the selected item, grouped, with units and help. An edit is
//! tried on a copy of the project; a rejected value is marked at its field with the reason.

use gw_plan::Project;
use gw_plan::edit::Item;

use super::fields::{Editor, Field, Group};
use super::item_fields;
use crate::command::Command;
use crate::state::DocumentState;
use crate::units::Units;

/// View state: the last rejected edit (item, field label, reason) and the text being typed in
/// a one-line field (item, field label, text) until it is committed.
#[derive(Default)]
pub struct InspectorPanel {
    rejected: Option<(Key, String, String)>,
    draft: Option<(Key, String, String)>,
}

/// What a rejected value or a draft belongs to: an item of the plan, or one check-out record
/// ("grid A1 1", "bridge Arm bending").
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Key {
    /// An item of the plan.
    Item(Item),
    /// A check-out record.
    Record(String),
}

/// What the inspector remembers about the fields of the item it shows: the last rejected
/// value (label, reason) and the text being typed (label, text).
pub(crate) struct Marks<'a> {
    pub(crate) rejected: Option<&'a (String, String)>,
    pub(crate) draft: &'a mut Option<(String, String)>,
}

/// The result of drawing one group list: the edited copy of the item (or why the typed text
/// cannot be read) and the field label.
type Edited<T> = Option<(Result<T, String>, String)>;

/// A copy of `item` with one field set.
fn edited<T: Clone, V>(item: &T, set: &dyn Fn(&mut T, V), value: V) -> T {
    let mut copy = item.clone();
    set(&mut copy, value);
    copy
}

fn number_ui<T: Clone>(
    ui: &mut egui::Ui,
    f: &Field<T>,
    item: &T,
    units: Units,
    label: egui::Id,
) -> Option<T> {
    let Editor::Number { unit, get, set } = &f.editor else {
        return None;
    };
    let stored = get(item);
    if !stored.is_finite() {
        ui.label("—");
        return None;
    }
    let mut shown = unit.show(units, stored);
    let speed = (shown.abs() * 0.005).max(0.001);
    let suffix = unit.suffix(units);
    let mut drag = egui::DragValue::new(&mut shown)
        .speed(speed)
        .max_decimals(6);
    // The unit's own resolution, so a field never reads "0.0000 mm", "17.7165 in", "0.000 °"
    // or "2.1000" for a gauge factor.
    let unit = *unit;
    drag = drag.custom_formatter(move |v, _| unit.number_text(units, v));
    let r = ui
        .add(
            drag
                // A typed number is one edit (one undo step), applied on Enter or leaving.
                .update_while_editing(false)
                .suffix(if suffix.is_empty() {
                    String::new()
                } else {
                    format!(" {suffix}")
                }),
        )
        .labelled_by(label)
        .on_hover_text(f.help);
    // Entering a field and leaving it as it reads is no edit: the stored value keeps its
    // digits beyond those shown (0.13 Ω/m must not become 0.1299 Ω/m by a look in Ω/ft).
    let as_shown = unit.number_text(units, unit.show(units, stored));
    let same = unit.number_text(units, shown) == as_shown;
    (r.changed() && shown.is_finite() && !same).then(|| edited(item, set, unit.store(units, shown)))
}

fn field_ui<T: Clone>(
    ui: &mut egui::Ui,
    f: &Field<T>,
    item: &T,
    units: Units,
    draft: &mut Option<(String, String)>,
) -> Option<Result<T, String>> {
    let label = ui.label(&f.label).on_hover_text(f.help).id;
    if let Editor::Parsed { get, parse } = &f.editor {
        let text = typed_ui(ui, f, &get(item), label, draft)?;
        let mut copy = item.clone();
        return Some(parse(&mut copy, &text).map(|()| copy));
    }
    field_value_ui(ui, f, item, units, label, draft).map(Ok)
}

fn field_value_ui<T: Clone>(
    ui: &mut egui::Ui,
    f: &Field<T>,
    item: &T,
    units: Units,
    label: egui::Id,
    draft: &mut Option<(String, String)>,
) -> Option<T> {
    match &f.editor {
        Editor::Number { .. } => number_ui(ui, f, item, units, label),
        Editor::Whole { range, get, set } => {
            let mut v = get(item);
            let r = ui
                .add(
                    egui::DragValue::new(&mut v)
                        .range(range.0..=range.1)
                        .update_while_editing(false),
                )
                .labelled_by(label)
                .on_hover_text(f.help);
            r.changed().then(|| edited(item, set, v))
        }
        Editor::Text {
            multiline: true,
            get,
            set,
        } => {
            let mut v = get(item);
            let r = ui
                .add(
                    egui::TextEdit::multiline(&mut v)
                        .desired_rows(3)
                        .desired_width(200.0),
                )
                .labelled_by(label)
                .on_hover_text(f.help);
            r.changed().then(|| edited(item, set, v))
        }
        Editor::Text {
            multiline: false, ..
        } => line_ui(ui, f, item, label, draft),
        Editor::Flag { get, set } => {
            let mut v = get(item);
            let r = ui
                .checkbox(&mut v, "")
                .labelled_by(label)
                .on_hover_text(f.help);
            r.changed().then(|| edited(item, set, v))
        }
        Editor::Choice { options, get, set } => {
            let current = get(item);
            let shown = current
                .and_then(|i| options.get(i))
                .cloned()
                .unwrap_or_else(|| "—".to_owned());
            let mut picked = None;
            egui::ComboBox::from_id_salt((f.path, &f.label))
                .selected_text(shown)
                .width(200.0)
                .show_ui(ui, |ui| {
                    for (i, o) in options.iter().enumerate() {
                        if ui.selectable_label(current == Some(i), o).clicked()
                            && current != Some(i)
                        {
                            picked = Some(i);
                        }
                    }
                })
                .response
                .labelled_by(label)
                .on_hover_text(f.help);
            picked.map(|i| edited(item, set, i))
        }
        Editor::Info(text) => {
            ui.add(egui::Label::new(text).wrap())
                .labelled_by(label)
                .on_hover_text(f.help);
            None
        }
        Editor::InfoInUnits(text) => {
            ui.label(text(units))
                .labelled_by(label)
                .on_hover_text(f.help);
            None
        }
        Editor::Parsed { .. } => None,
    }
}

/// A one-line text field. Names are committed when the field loses focus, so a half-typed id
/// is not tried; until then the typed text is kept in `draft`, since the field is drawn
/// afresh from the project every frame.
fn line_ui<T: Clone>(
    ui: &mut egui::Ui,
    f: &Field<T>,
    item: &T,
    label: egui::Id,
    draft: &mut Option<(String, String)>,
) -> Option<T> {
    let Editor::Text { get, set, .. } = &f.editor else {
        return None;
    };
    let v = typed_ui(ui, f, &get(item), label, draft)?;
    Some(edited(item, set, v))
}

/// A one-line text field showing `stored` (or the draft being typed); the committed text when
/// the field loses focus with something else in it.
fn typed_ui<T>(
    ui: &mut egui::Ui,
    f: &Field<T>,
    stored: &str,
    label: egui::Id,
    draft: &mut Option<(String, String)>,
) -> Option<String> {
    let mut v = match draft.as_ref() {
        Some((l, text)) if *l == f.label => text.clone(),
        _ => stored.to_owned(),
    };
    let r = ui
        .add(egui::TextEdit::singleline(&mut v).desired_width(200.0))
        .labelled_by(label)
        .on_hover_text(f.help);
    if r.has_focus() {
        *draft = Some((f.label.clone(), v));
        return None;
    }
    if draft.as_ref().is_some_and(|(l, _)| *l == f.label) {
        *draft = None;
    }
    (r.lost_focus() && v != stored).then_some(v)
}

fn groups_ui<T: Clone>(
    ui: &mut egui::Ui,
    groups: &[Group<T>],
    item: &T,
    units: Units,
    marks: &mut Marks<'_>,
) -> Edited<T> {
    let mut edited = None;
    for (gi, group) in groups.iter().enumerate() {
        egui::CollapsingHeader::new(&group.title)
            .id_salt(("inspector group", gi))
            .default_open(true)
            .show(ui, |ui| {
                egui::Grid::new(("inspector grid", gi))
                    .num_columns(2)
                    .spacing([10.0, 4.0])
                    .show(ui, |ui| {
                        for f in &group.fields {
                            // Fields of an absent optional value read NaN: they are not shown.
                            if let Editor::Number { get, .. } = &f.editor
                                && get(item).is_nan()
                            {
                                continue;
                            }
                            if let Some(copy) = field_ui(ui, f, item, units, marks.draft) {
                                edited = Some((copy, f.label.clone()));
                            }
                            ui.end_row();
                            if let Some((label, reason)) = marks.rejected
                                && *label == f.label
                            {
                                ui.label("");
                                ui.add(
                                    egui::Label::new(
                                        egui::RichText::new(format!("Not applied: {reason}"))
                                            .color(super::palette::FAIL),
                                    )
                                    .wrap(),
                                );
                                ui.end_row();
                            }
                        }
                    });
            });
    }
    edited
}

/// Puts an edited copy of an item back into a copy of the project.
fn with_item(
    project: &Project,
    apply: impl FnOnce(&mut Project) -> Result<(), String>,
) -> Result<Project, String> {
    let mut p = project.clone();
    apply(&mut p)?;
    Ok(p)
}

/// What an edit in the inspector produced: the candidate project (or why the edit cannot
/// apply) and the label of the field edited.
pub(crate) type Candidate = Option<(Result<Project, String>, String)>;

/// Draws `groups` for `current` and, on an edit, puts the edited copy into a copy of the
/// project with `put`.
pub(crate) fn edit_ui<T: Clone>(
    ui: &mut egui::Ui,
    project: &Project,
    groups: &[Group<T>],
    current: &T,
    units: Units,
    marks: &mut Marks<'_>,
    put: impl FnOnce(&mut Project, T) -> Result<(), String>,
) -> Candidate {
    let (copy, label) = groups_ui(ui, groups, current, units, marks)?;
    Some((copy.and_then(|c| with_item(project, |p| put(p, c))), label))
}

/// The fields of the item the inspector shows.
fn item_ui(
    ui: &mut egui::Ui,
    project: &Project,
    item: Item,
    units: Units,
    marks: &mut Marks<'_>,
) -> Candidate {
    match item {
        Item::Project => {
            let groups = item_fields::project_groups();
            edit_ui(ui, project, &groups, project, units, marks, |p, copy| {
                *p = copy;
                Ok(())
            })
        }
        Item::Stock(k) => {
            let s = project.gauge_stock.get(k)?;
            edit_ui(
                ui,
                project,
                &item_fields::stock_groups(),
                s,
                units,
                marks,
                |p, copy| {
                    let new_name = copy.name.clone();
                    p.gauge_stock[k] = gw_plan::StockGauge {
                        name: s.name.clone(),
                        ..copy
                    };
                    // A new name is carried into every gauge of this type.
                    if new_name != s.name {
                        gw_plan::edit::rename(p, item, &new_name)?;
                    }
                    Ok(())
                },
            )
        }
        Item::Part(i) => {
            let part = project.parts.get(i)?;
            let groups = item_fields::part_groups(part);
            edit_ui(ui, project, &groups, part, units, marks, |p, copy| {
                p.parts[i] = copy;
                Ok(())
            })
        }
        Item::LoadCase { part, case } => {
            let pt = project.parts.get(part)?;
            let c = pt.load_cases.get(case)?;
            let groups = item_fields::load_case_groups(&pt.member);
            edit_ui(ui, project, &groups, c, units, marks, |p, copy| {
                p.parts[part].load_cases[case] = copy;
                Ok(())
            })
        }
        Item::Gauge { part, gauge } => {
            let pt = project.parts.get(part)?;
            let g = pt.gauges.get(gauge)?;
            let groups = item_fields::gauge_groups(project, pt, g);
            edit_ui(ui, project, &groups, g, units, marks, |p, copy| {
                let new_id = copy.id.clone();
                p.parts[part].gauges[gauge] = gw_plan::PlanGauge {
                    id: g.id.clone(),
                    ..copy
                };
                // A new id is carried into every arm that uses the gauge.
                if new_id != g.id {
                    gw_plan::edit::rename(p, item, &new_id)?;
                }
                Ok(())
            })
        }
        Item::Bridge { part, bridge } => {
            let pt = project.parts.get(part)?;
            let b = pt.bridges.get(bridge)?;
            let groups = item_fields::bridge_groups(project, pt, b);
            edit_ui(ui, project, &groups, b, units, marks, |p, copy| {
                p.parts[part].bridges[bridge] = copy;
                Ok(())
            })
        }
    }
}

impl InspectorPanel {
    /// Draws the inspector for the selected item, in a region named "Inspector" so a screen
    /// reader (or a test) can tell its fields from the views' controls of the same name.
    pub fn inspector_ui(&mut self, ui: &mut egui::Ui, doc: &DocumentState, out: &mut Vec<Command>) {
        ui.scope_builder(
            egui::UiBuilder::new().accessibility_label("Inspector"),
            |ui| self.contents_ui(ui, doc, out),
        );
    }

    fn contents_ui(&mut self, ui: &mut egui::Ui, doc: &DocumentState, out: &mut Vec<Command>) {
        let Self { rejected, draft } = self;
        if let Some(test) = doc.selection.test {
            super::checkout_inspector::checkout_ui(ui, doc, test, rejected, draft, out);
            return;
        }
        let item = doc.selection.inspected();
        let key = Key::Item(item);
        let project = &doc.project;
        let units = doc.units;
        let here = rejected
            .as_ref()
            .filter(|(i, _, _)| *i == key)
            .map(|(_, l, r)| (l.clone(), r.clone()));
        // Text typed for another item is dropped with it.
        let mut typing = draft
            .take()
            .filter(|(i, _, _)| *i == key)
            .map(|(_, l, t)| (l, t));
        let mut marks = Marks {
            rejected: here.as_ref(),
            draft: &mut typing,
        };
        let title = match gw_plan::edit::item_name(project, item) {
            Some(name) => format!("{} — {name}", super::capitalise(item.kind_name())),
            None => "Nothing selected".to_owned(),
        };
        ui.heading(title);
        ui.separator();
        let candidate = egui::ScrollArea::vertical()
            .auto_shrink([false, false])
            .show(ui, |ui| item_ui(ui, project, item, units, &mut marks))
            .inner;
        *draft = typing.map(|(l, t)| (key.clone(), l, t));
        if let Some((candidate, label)) = candidate {
            match candidate.and_then(|c| check(&c).map(|()| c)) {
                Ok(candidate) => {
                    *rejected = None;
                    // The item is already shown; a text field committed as the user clicks
                    // elsewhere must not pull the selection back.
                    out.push(Command::Edit {
                        project: Box::new(candidate),
                        focus: None,
                    });
                }
                Err(reason) => *rejected = Some((key, label, reason)),
            }
        }
    }
}

/// Whether the edited project may replace the current one; the reason when not.
pub(crate) fn check(candidate: &Project) -> Result<(), String> {
    gw_plan::validate::validate_project(candidate).map_err(|e| e.to_string())
}
