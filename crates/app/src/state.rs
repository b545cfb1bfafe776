//! The app's document state: project, file, undo history, derived results and selection.

use std::path::{Path, PathBuf};

use gw_mechanics::LoadComponent;
use gw_plan::evaluate::{EvalOptions, Evaluation, UncertaintyDepth, evaluate};
use gw_plan::{PlanArm, Project};

use crate::command::Command;
use crate::units::Units;

/// What is selected.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct Selection {
    /// Part index.
    pub part: usize,
    /// Load case index.
    pub case: usize,
    /// Gauge index.
    pub gauge: Option<usize>,
    /// Bridge index.
    pub bridge: Option<usize>,
}

/// A message for the user.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Notice {
    /// True for errors.
    pub is_error: bool,
    /// Text.
    pub text: String,
}

/// Most undo steps kept.
const UNDO_LIMIT: usize = 200;

/// The document and everything derived from it.
pub struct DocumentState {
    /// The project.
    pub project: Project,
    /// File it came from or was saved to.
    pub path: Option<PathBuf>,
    /// Unsaved changes.
    pub dirty: bool,
    undo: Vec<Project>,
    redo: Vec<Project>,
    /// Evaluation of the current project (computed once per change).
    pub evaluation: Evaluation,
    /// Selection.
    pub selection: Selection,
    /// Display units.
    pub units: Units,
    /// Last message.
    pub notice: Option<Notice>,
    /// Number of evaluations so far (tests and diagnostics).
    pub evaluations: u64,
}

/// Options of the live evaluation (GUM budget, no Monte Carlo).
pub fn live_options() -> EvalOptions {
    EvalOptions {
        uncertainty: UncertaintyDepth::Gum,
        ..EvalOptions::default()
    }
}

impl DocumentState {
    /// A document for `project`.
    pub fn new(project: Project, path: Option<PathBuf>) -> Self {
        let evaluation = evaluate(&project, &live_options());
        let mut s = Self {
            project,
            path,
            dirty: false,
            undo: Vec::new(),
            redo: Vec::new(),
            evaluation,
            selection: Selection::default(),
            units: Units::Si,
            notice: None,
            evaluations: 1,
        };
        s.clamp_selection();
        s
    }

    /// Title bar text: file name and an unsaved-changes marker.
    pub fn title(&self) -> String {
        let name = self
            .path
            .as_ref()
            .and_then(|p| p.file_name())
            .map(|n| n.to_string_lossy().into_owned())
            .unwrap_or_else(|| "untitled".to_owned());
        format!("{}{name} — Gaugewright", if self.dirty { "● " } else { "" })
    }

    /// Whether undo / redo are available.
    pub fn can_undo(&self) -> bool {
        !self.undo.is_empty()
    }

    /// Whether redo is available.
    pub fn can_redo(&self) -> bool {
        !self.redo.is_empty()
    }

    fn reevaluate(&mut self) {
        self.evaluation = evaluate(&self.project, &live_options());
        self.evaluations += 1;
    }

    fn clamp_selection(&mut self) {
        let parts = self.project.parts.len();
        if parts == 0 {
            self.selection = Selection::default();
            return;
        }
        let sel = &mut self.selection;
        sel.part = sel.part.min(parts - 1);
        let part = &self.project.parts[sel.part];
        sel.case = sel.case.min(part.load_cases.len().saturating_sub(1));
        if sel.gauge.is_some_and(|g| g >= part.gauges.len()) {
            sel.gauge = None;
        }
        if sel.bridge.is_some_and(|b| b >= part.bridges.len()) {
            sel.bridge = None;
        }
        if sel.bridge.is_none() && !part.bridges.is_empty() {
            sel.bridge = Some(0);
        }
    }

    /// Applies commands in order, then evaluates once.
    pub fn apply_all(&mut self, commands: Vec<Command>) {
        if commands.is_empty() {
            return;
        }
        let mut changed = false;
        for c in commands {
            changed |= self.apply_one(c);
        }
        self.clamp_selection();
        if changed {
            self.reevaluate();
        }
    }

    /// Applies one command; returns whether the project changed.
    fn apply_one(&mut self, command: Command) -> bool {
        if command.edits_project() {
            let before = self.project.clone();
            if self.edit(command) && self.project != before {
                self.undo.push(before);
                if self.undo.len() > UNDO_LIMIT {
                    self.undo.remove(0);
                }
                self.redo.clear();
                self.dirty = true;
                return true;
            }
            self.project = before;
            return false;
        }
        match command {
            Command::Undo => {
                if let Some(p) = self.undo.pop() {
                    self.redo.push(std::mem::replace(&mut self.project, p));
                    self.dirty = true;
                    return true;
                }
                false
            }
            Command::Redo => {
                if let Some(p) = self.redo.pop() {
                    self.undo.push(std::mem::replace(&mut self.project, p));
                    self.dirty = true;
                    return true;
                }
                false
            }
            Command::SetUnits(u) => {
                self.units = u;
                false
            }
            Command::Select(s) => {
                self.selection = s;
                false
            }
            Command::ReplaceProject { project, path } => {
                self.project = *project;
                self.path = path;
                self.dirty = false;
                self.undo.clear();
                self.redo.clear();
                self.selection = Selection::default();
                true
            }
            _ => false,
        }
    }

    /// Performs an edit on the project; false if it did not apply.
    fn edit(&mut self, command: Command) -> bool {
        let reference = self.project.reference_temperature_c;
        match command {
            Command::SetLoad {
                part,
                case,
                component,
                value,
            } => {
                let Some(c) = self.case_mut(part, case) else {
                    return false;
                };
                if !value.is_finite() {
                    return false;
                }
                c.set_value(component, value);
            }
            Command::RenameLoadCase { part, case, name } => {
                let Some(c) = self.case_mut(part, case) else {
                    return false;
                };
                c.name = name;
            }
            Command::AddLoadCase { part } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                let mut copy =
                    p.load_cases
                        .get(self.selection.case)
                        .cloned()
                        .unwrap_or(gw_plan::LoadCase {
                            name: String::new(),
                            loads: Vec::new(),
                            ramp_steps: 10,
                            temperature_range_c: (-10.0, 40.0),
                            cycled: false,
                            proof_test: false,
                        });
                copy.name = format!("Load case {}", p.load_cases.len() + 1);
                p.load_cases.push(copy);
                self.selection.case = p.load_cases.len() - 1;
            }
            Command::DeleteLoadCase { part, case } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                if case >= p.load_cases.len() || p.load_cases.len() == 1 {
                    return false;
                }
                p.load_cases.remove(case);
            }
            Command::SetCaseSettings {
                part,
                case,
                ramp_steps,
                temperature_range_c,
                cycled,
            } => {
                let Some(c) = self.case_mut(part, case) else {
                    return false;
                };
                let (lo, hi) = temperature_range_c;
                if !(lo.is_finite() && hi.is_finite() && lo <= hi)
                    || ramp_steps == 0
                    || ramp_steps > 1000
                {
                    return false;
                }
                c.ramp_steps = ramp_steps;
                c.temperature_range_c = temperature_range_c;
                c.cycled = cycled;
            }
            Command::SetDatum { part, x_m, s_m } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                if !(x_m.is_finite() && s_m.is_finite()) {
                    return false;
                }
                p.datum_m = (x_m, s_m);
            }
            Command::SetMember { part, member } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                if member.validate().is_err() {
                    return false;
                }
                p.member = *member;
            }
            Command::AddGauge {
                part,
                pattern,
                position,
                angle_rad,
            } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                let id = gw_plan::arrangements::next_gauge_id(p);
                p.gauges.push(gw_bridge::PlacedGauge {
                    id,
                    spec: gw_plan::document::default_gauge_spec(pattern),
                    position,
                    angle_rad,
                });
                self.selection.gauge = Some(p.gauges.len() - 1);
            }
            Command::MoveGauge {
                part,
                gauge,
                position,
            } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                if p.member.locate(&position).is_err() {
                    return false;
                }
                let Some(g) = p.gauges.get_mut(gauge) else {
                    return false;
                };
                g.position = position;
            }
            Command::SetGaugeAngle {
                part,
                gauge,
                angle_rad,
            } => {
                let Some(g) = self
                    .project
                    .parts
                    .get_mut(part)
                    .and_then(|p| p.gauges.get_mut(gauge))
                else {
                    return false;
                };
                if !angle_rad.is_finite() {
                    return false;
                }
                g.angle_rad = angle_rad;
            }
            Command::DeleteGauge { part, gauge } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                if gauge >= p.gauges.len() {
                    return false;
                }
                let id = p.gauges.remove(gauge).id;
                let completion = PlanArm::Completion(gw_bridge::CompletionResistor {
                    ohm: 350.0,
                    tolerance: 0.0005,
                    tcr_per_c: 5e-6,
                });
                for b in &mut p.bridges {
                    for arm in &mut b.arms {
                        if matches!(arm, PlanArm::Grid { gauge, .. } | PlanArm::Dummy { gauge, .. } if *gauge == id)
                        {
                            *arm = completion.clone();
                        }
                    }
                }
                self.selection.gauge = None;
            }
            Command::SetGaugeSpec { part, gauge, spec } => {
                let Some(g) = self
                    .project
                    .parts
                    .get_mut(part)
                    .and_then(|p| p.gauges.get_mut(gauge))
                else {
                    return false;
                };
                if spec.validate().is_err() {
                    return false;
                }
                g.spec = *spec;
            }
            Command::SetBridge { part, bridge, plan } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                let Ok(b) = gw_plan::validate::bridge_from_plan(p, &plan) else {
                    return false;
                };
                if b.validate(&p.gauges).is_err() {
                    return false;
                }
                let Some(slot) = p.bridges.get_mut(bridge) else {
                    return false;
                };
                *slot = *plan;
            }
            Command::SetArm {
                part,
                bridge,
                arm,
                element,
            } => {
                let Some(b) = self
                    .project
                    .parts
                    .get_mut(part)
                    .and_then(|p| p.bridges.get_mut(bridge))
                else {
                    return false;
                };
                if arm > 3 {
                    return false;
                }
                b.arms[arm] = element;
                b.arrangement = "Custom".into();
                let part_ref = &self.project.parts[part];
                let plan = part_ref.bridges[bridge].clone();
                let bf = gw_plan::arrangements::bridge_factor_for(part_ref, &plan, reference);
                self.project.parts[part].bridges[bridge]
                    .instrument
                    .bridge_factor = bf;
            }
            Command::SetWiring {
                part,
                bridge,
                wiring,
            } => {
                let Some(b) = self
                    .project
                    .parts
                    .get_mut(part)
                    .and_then(|p| p.bridges.get_mut(bridge))
                else {
                    return false;
                };
                b.wiring = wiring;
            }
            Command::AddBridge { part } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                let Some(template) = p.bridges.first().cloned() else {
                    return false;
                };
                let mut b = template;
                b.name = format!("Bridge {}", p.bridges.len() + 1);
                b.channel = p.bridges.iter().map(|b| b.channel).max().unwrap_or(0) + 1;
                p.bridges.push(b);
                self.selection.bridge = Some(p.bridges.len() - 1);
            }
            Command::ApplyCatalogue {
                part,
                bridge,
                entry,
            } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                gw_plan::arrangements::apply_catalogue_entry(p, bridge, &entry, reference);
            }
            Command::ApplySuggestion {
                part,
                bridge,
                ranked,
            } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                gw_plan::arrangements::apply_ranked(p, bridge, &ranked, reference);
            }
            Command::Undo
            | Command::Redo
            | Command::SetUnits(_)
            | Command::Select(_)
            | Command::ReplaceProject { .. } => {
                return false;
            }
        }
        true
    }

    fn case_mut(&mut self, part: usize, case: usize) -> Option<&mut gw_plan::LoadCase> {
        self.project.parts.get_mut(part)?.load_cases.get_mut(case)
    }

    /// Opens a file; on failure the open project is untouched and the message says why.
    pub fn open(&mut self, path: &Path) {
        match gw_plan::load_project(path) {
            Ok(p) => {
                self.apply_all(vec![Command::ReplaceProject {
                    project: Box::new(p),
                    path: Some(path.to_owned()),
                }]);
                self.notice = Some(Notice {
                    is_error: false,
                    text: format!("Opened {}", path.display()),
                });
            }
            Err(e) => {
                self.notice = Some(Notice {
                    is_error: true,
                    text: format!(
                        "Could not open {}: {e}. The open project is unchanged.",
                        path.display()
                    ),
                });
            }
        }
    }

    /// Saves to `path` (atomic, with backup).
    pub fn save_to(&mut self, path: &Path) -> bool {
        match gw_plan::save_project(&self.project, path) {
            Ok(()) => {
                self.path = Some(path.to_owned());
                self.dirty = false;
                self.notice = Some(Notice {
                    is_error: false,
                    text: format!("Saved {}", path.display()),
                });
                true
            }
            Err(e) => {
                self.notice = Some(Notice {
                    is_error: true,
                    text: format!(
                        "Could not save: {e}. Your work is still open; try another location."
                    ),
                });
                false
            }
        }
    }

    /// Displayed strain of a bridge at a load case, from the evaluation.
    pub fn displayed(&self, part: usize, bridge: usize, case: usize) -> Option<f64> {
        let pe = self
            .evaluation
            .parts
            .iter()
            .find(|p| p.part_index == part)?;
        let k = pe.bridge_indices.iter().position(|&b| b == bridge)?;
        Some(pe.bridges.get(k)?.cases.get(case)?.reading.displayed_strain)
    }

    /// The load components the selected part carries.
    pub fn components(&self) -> &'static [LoadComponent] {
        self.project
            .parts
            .get(self.selection.part)
            .map(|p| p.member.components())
            .unwrap_or(&[])
    }
}
