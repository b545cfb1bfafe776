//! The inspector for the plan tree's "Check-out and test": an overview of the records and the
//! log, or one channel's records (editable, one undo step per value) and its checks.

use gw_plan::installation::{BridgeRecord, GridRecord};
use gw_plan::{BridgePlan, PlanArm, Project};
use gw_reduce::checkout::{ChannelCheck, Verdict};

use super::fields::Group;
use super::inspector::{Candidate, Key, Marks, check, edit_ui};
use crate::command::Command;
use crate::state::{DocumentState, TestFocus};

/// The inspector's memory: the last rejected value and the text being typed, by record.
type Memory = Option<(Key, String, String)>;

/// The colour of a verdict; the word is always shown beside it.
pub fn verdict_colour(v: Verdict) -> egui::Color32 {
    match v {
        Verdict::Pass => super::palette::PASS,
        Verdict::Check => super::palette::WARN,
        Verdict::Fail => super::palette::FAIL,
        Verdict::NotRecorded => egui::Color32::GRAY,
    }
}

/// The check of a bridge of the plan.
pub fn channel_check<'a>(
    doc: &'a DocumentState,
    part: &str,
    bridge: &str,
) -> Option<&'a ChannelCheck> {
    doc.measured
        .derived
        .checkout
        .channels
        .iter()
        .find(|c| c.part == part && c.bridge == bridge)
}

/// Draws the check-out entry `test`.
pub fn checkout_ui(
    ui: &mut egui::Ui,
    doc: &DocumentState,
    test: TestFocus,
    rejected: &mut Memory,
    draft: &mut Memory,
    out: &mut Vec<Command>,
) {
    match test {
        TestFocus::Overview => {
            ui.heading("Check-out and test");
            ui.separator();
            overview_ui(ui, doc);
        }
        TestFocus::Channel { part, bridge } => {
            let Some((pt, b)) = doc
                .project
                .parts
                .get(part)
                .and_then(|p| Some((p, p.bridges.get(bridge)?)))
            else {
                ui.label("This channel is no longer in the plan.");
                return;
            };
            ui.heading(format!("Check-out — ch{} {}", b.channel, b.name));
            ui.separator();
            egui::ScrollArea::vertical()
                .auto_shrink([false, false])
                .show(ui, |ui| {
                    let check = channel_check(doc, &pt.name, &b.name);
                    if let Some(c) = check {
                        let v = c.verdict();
                        ui.colored_label(verdict_colour(v), format!("Verdict: {}", v.word()));
                    }
                    records_ui(ui, doc, b, rejected, draft, out);
                    checks_ui(ui, check, doc.units);
                });
        }
    }
}

fn overview_ui(ui: &mut egui::Ui, doc: &DocumentState) {
    let records = &doc.project.records;
    let d = &doc.measured.derived;
    ui.label(format!(
        "Records: {} grids and {} bridges recorded.",
        records.grids.len(),
        records.bridges.len()
    ));
    if d.checkout.is_unrecorded() {
        ui.weak(
            "Nothing recorded yet: File › Write check-out records template…, fill it in, then \
             File › Import check-out records…; or select a channel below the heading in the \
             plan tree and type the values here.",
        );
    }
    for v in [
        Verdict::Fail,
        Verdict::Check,
        Verdict::Pass,
        Verdict::NotRecorded,
    ] {
        let n = d
            .checkout
            .channels
            .iter()
            .filter(|c| c.verdict() == v)
            .count();
        ui.colored_label(verdict_colour(v), format!("{n} channels: {}", v.word()));
    }
    ui.separator();
    match (&doc.measured.log, &records.log_path) {
        (Some(log), _) => {
            ui.label(format!(
                "Test log: {} ({} samples, {} columns).",
                log.path.display(),
                log.log.len(),
                log.log.columns.len()
            ));
        }
        (None, Some(p)) => {
            ui.colored_label(
                super::palette::FAIL,
                format!(
                    "Test log {p} could not be read; File › Import test log… to choose it again."
                ),
            );
        }
        (None, None) => {
            ui.weak("No test log: File › Import test log….");
        }
    }
    for text in d.reduce_error.iter().chain(&d.fit_errors) {
        ui.add(egui::Label::new(egui::RichText::new(text).color(super::palette::WARN)).wrap());
    }
    if let Some(r) = &d.reduction {
        for note in &r.notes {
            ui.add(egui::Label::new(note).wrap());
        }
    }
}

/// Each check of the channel: measured, expected, verdict, and the cause when it is off.
fn checks_ui(ui: &mut egui::Ui, check: Option<&ChannelCheck>, units: crate::units::Units) {
    let Some(check) = check else {
        ui.label("This bridge could not be evaluated, so there is nothing to check against.");
        return;
    };
    egui::CollapsingHeader::new("Checks")
        .default_open(true)
        .show(ui, |ui| {
            for item in &check.items {
                ui.horizontal_wrapped(|ui| {
                    ui.strong(&item.quantity);
                    ui.colored_label(verdict_colour(item.verdict), item.verdict.word());
                });
                ui.label(format!("measured {}", item.measured));
                let expected = item.expected_in(units);
                ui.add(egui::Label::new(format!("expected {expected}")).wrap());
                let cause = item.cause_in(units);
                if !cause.is_empty() {
                    ui.add(egui::Label::new(egui::RichText::new(cause).italics()).wrap());
                }
                ui.add_space(4.0);
            }
        });
}

/// The grids in the bridge's arms, each once: (gauge id, grid number).
fn grids_of(b: &BridgePlan) -> Vec<(String, usize)> {
    let mut out: Vec<(String, usize)> = Vec::new();
    for arm in &b.arms {
        if let PlanArm::Grid { gauge, grid } = arm
            && !out.iter().any(|(g, k)| g == gauge && k == grid)
        {
            out.push((gauge.clone(), *grid));
        }
    }
    out
}

fn records_ui(
    ui: &mut egui::Ui,
    doc: &DocumentState,
    b: &BridgePlan,
    rejected: &mut Memory,
    draft: &mut Memory,
    out: &mut Vec<Command>,
) {
    let project = &doc.project;
    let units = doc.units;
    let name = b.name.clone();
    let current = project
        .records
        .bridge(&name)
        .cloned()
        .unwrap_or(BridgeRecord {
            bridge: name.clone(),
            ..BridgeRecord::default()
        });
    let groups = super::record_fields::bridge_record_groups(b.wanted, units);
    let key = Key::Record(format!("bridge {name}"));
    record_ui(
        ui,
        project,
        key,
        &groups,
        &current,
        units,
        rejected,
        draft,
        out,
        |p, copy| {
            *p.records.bridge_mut(&name) = copy;
            Ok(())
        },
    );
    for (gauge, grid) in grids_of(b) {
        let current = project
            .records
            .grid(&gauge, grid)
            .cloned()
            .unwrap_or(GridRecord {
                gauge: gauge.clone(),
                grid,
                ..GridRecord::default()
            });
        let title = format!("Gauge {gauge}, grid {grid}");
        let groups = super::record_fields::grid_record_groups(title, units);
        let key = Key::Record(format!("grid {gauge} {grid}"));
        record_ui(
            ui,
            project,
            key,
            &groups,
            &current,
            units,
            rejected,
            draft,
            out,
            |p, copy| {
                *p.records.grid_mut(&gauge, grid) = copy;
                Ok(())
            },
        );
    }
}

/// One record's fields; an edit becomes a command, a refused value is kept with its reason.
#[allow(clippy::too_many_arguments)]
fn record_ui<T: Clone>(
    ui: &mut egui::Ui,
    project: &Project,
    key: Key,
    groups: &[Group<T>],
    current: &T,
    units: crate::units::Units,
    rejected: &mut Memory,
    draft: &mut Memory,
    out: &mut Vec<Command>,
    put: impl FnOnce(&mut Project, T) -> Result<(), String>,
) {
    let here = rejected
        .as_ref()
        .filter(|(k, _, _)| *k == key)
        .map(|(_, l, r)| (l.clone(), r.clone()));
    let mine = draft.as_ref().is_some_and(|(k, _, _)| *k == key);
    let mut typing = if mine {
        draft.take().map(|(_, l, t)| (l, t))
    } else {
        None
    };
    let mut marks = Marks {
        rejected: here.as_ref(),
        draft: &mut typing,
    };
    let candidate: Candidate = ui
        .push_id(format!("{key:?}"), |ui| {
            edit_ui(ui, project, groups, current, units, &mut marks, put)
        })
        .inner;
    if let Some(t) = typing {
        *draft = Some((key.clone(), t.0, t.1));
    }
    if let Some((candidate, label)) = candidate {
        match candidate.and_then(|c| check(&c).map(|()| c)) {
            Ok(c) => {
                *rejected = None;
                out.push(Command::Edit {
                    project: Box::new(c),
                    focus: None,
                });
            }
            Err(reason) => *rejected = Some((key, label, reason)),
        }
    }
}
