//! The app's document state: project, file, undo history, derived results and selection.

use std::path::{Path, PathBuf};

use gw_mechanics::LoadComponent;
use gw_plan::edit::Item;
use gw_plan::evaluate::{EvalOptions, Evaluation, UncertaintyDepth, evaluate};
use gw_plan::{PlanGauge, Project};

use crate::command::Command;
use crate::measured::Measured;
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
    /// The item the inspector shows (`None`: the part).
    pub focus: Option<Item>,
    /// A check-out entry of the plan tree, shown in the inspector instead of `focus`.
    pub test: Option<TestFocus>,
}

/// What of the check-out and test the inspector shows.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum TestFocus {
    /// The overview: files, counts of verdicts.
    Overview,
    /// One channel: the records of its bridge and grids, and its checks.
    Channel {
        /// Part index.
        part: usize,
        /// Bridge index.
        bridge: usize,
    },
}

impl Selection {
    /// The selection that shows `item`: its part, and the case, gauge or bridge it is.
    pub fn of(item: Item, before: Selection) -> Selection {
        let part = item.part().unwrap_or(before.part);
        let same_part = part == before.part;
        let mut s = Selection {
            part,
            case: if same_part { before.case } else { 0 },
            gauge: if same_part { before.gauge } else { None },
            bridge: if same_part { before.bridge } else { None },
            focus: Some(item),
            test: None,
        };
        match item {
            Item::LoadCase { case, .. } => s.case = case,
            Item::Gauge { gauge, .. } => s.gauge = Some(gauge),
            Item::Bridge { bridge, .. } => s.bridge = Some(bridge),
            _ => {}
        }
        s
    }

    /// What the inspector shows: the focus, or else the selected part.
    pub fn inspected(&self) -> Item {
        self.focus.unwrap_or(Item::Part(self.part))
    }
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
    /// The test log and the results derived from the records and the log.
    pub measured: Measured,
}

/// The inspector follows what the user picked last in a view: a gauge, a bridge, a load case
/// or a part, in that order of precedence.
fn inferred_focus(before: &Selection, after: &Selection) -> Option<Item> {
    let part = after.part;
    if let Some(gauge) = after.gauge
        && after.gauge != before.gauge
    {
        return Some(Item::Gauge { part, gauge });
    }
    if let Some(bridge) = after.bridge
        && after.bridge != before.bridge
    {
        return Some(Item::Bridge { part, bridge });
    }
    if after.case != before.case {
        return Some(Item::LoadCase {
            part,
            case: after.case,
        });
    }
    if after.part != before.part {
        return Some(Item::Part(part));
    }
    if after.gauge.is_none() && before.gauge.is_some() {
        return Some(Item::Part(part));
    }
    after.focus.or(before.focus)
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
        let measured = Measured::new(&project, &evaluation);
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
            measured,
        };
        s.clamp_selection();
        s.sync_log();
        s.measured.recompute(&s.project, &s.evaluation);
        s
    }

    /// Reads the test log the project names, if it changed; says so when it cannot be read.
    /// Returns whether the loaded log changed.
    fn sync_log(&mut self) -> bool {
        let outcome = self.measured.sync_log(&self.project, self.path.as_deref());
        if let Some(n) = outcome.notice {
            self.notice = Some(n);
        }
        outcome.changed
    }

    /// Takes a test log read from `file`: the project stores its path (one undo step) and the
    /// results are computed again.
    pub fn import_log(&mut self, file: &Path, log: gw_reduce::log::TestLog) {
        let stored = crate::measured::stored_log_path(file, self.path.as_deref());
        let samples = log.len();
        self.measured.set_log(
            crate::measured::resolve_log_path(&stored, self.path.as_deref()),
            log,
        );
        self.apply_all(vec![Command::SetLogPath(Some(stored))]);
        self.measured.recompute(&self.project, &self.evaluation);
        self.notice = Some(Notice {
            is_error: false,
            text: format!(
                "Read the test log {} ({samples} samples); Results › Measured shows it.",
                file.display()
            ),
        });
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
        self.measured.recompute(&self.project, &self.evaluation);
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
        if let Some(f) = sel.focus
            && gw_plan::edit::item_name(&self.project, f).is_none()
        {
            sel.focus = None;
        }
        if let Some(TestFocus::Channel { part, bridge }) = sel.test
            && self
                .project
                .parts
                .get(part)
                .is_none_or(|p| p.bridges.get(bridge).is_none())
        {
            sel.test = Some(TestFocus::Overview);
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
        let log_changed = self.sync_log();
        if changed {
            self.reevaluate();
        } else if log_changed {
            self.measured.recompute(&self.project, &self.evaluation);
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
                self.selection = Selection {
                    focus: inferred_focus(&self.selection, &s),
                    test: None,
                    ..s
                };
                false
            }
            Command::FocusTest(test) => {
                if let TestFocus::Channel { part, bridge } = test {
                    self.selection = Selection::of(Item::Bridge { part, bridge }, self.selection);
                }
                self.selection.test = Some(test);
                false
            }
            Command::Focus(item) => {
                self.selection = Selection::of(item, self.selection);
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
        match command {
            Command::Edit { project, focus } => self.replace_edited(*project, focus),
            Command::SetDatum { part, x_m, s_m } => self.set_datum(part, x_m, s_m),
            Command::AddGauge {
                part,
                pattern,
                position,
                angle_rad,
            } => self.add_gauge(part, pattern, position, angle_rad),
            Command::MoveGauge {
                part,
                gauge,
                position,
            } => self.move_gauge(part, gauge, position),
            Command::SetGaugeAngle {
                part,
                gauge,
                angle_rad,
            } => self.turn_gauge(part, gauge, angle_rad),
            Command::DeleteGauge { part, gauge } => {
                let ok =
                    gw_plan::edit::delete(&mut self.project, Item::Gauge { part, gauge }).is_ok();
                self.selection.gauge = None;
                self.selection.focus = Some(Item::Part(part));
                ok
            }
            Command::SetArm {
                part,
                bridge,
                arm,
                element,
            } => self.set_arm(part, bridge, arm, element),
            Command::SetWiring {
                part,
                bridge,
                wiring,
            } => self
                .bridge_mut(part, bridge)
                .map(|b| b.wiring = wiring)
                .is_some(),
            Command::AddBridge { part } => {
                match gw_plan::edit::add(&mut self.project, gw_plan::edit::ItemKind::Bridge, part) {
                    Ok(item) => {
                        self.selection = Selection::of(item, self.selection);
                        true
                    }
                    Err(_) => false,
                }
            }
            Command::ApplyCatalogue {
                part,
                bridge,
                entry,
            } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                gw_plan::arrangements::apply_catalogue_entry(
                    p,
                    &mut self.project.gauge_stock,
                    bridge,
                    &entry,
                );
                true
            }
            Command::ApplySuggestion {
                part,
                bridge,
                ranked,
            } => {
                let Some(p) = self.project.parts.get_mut(part) else {
                    return false;
                };
                gw_plan::arrangements::apply_ranked(p, bridge, &ranked);
                true
            }
            Command::SetRecords(_) | Command::SetLogPath(_) | Command::SetCalibration { .. } => {
                self.edit_installation(command)
            }
            Command::Undo
            | Command::Redo
            | Command::SetUnits(_)
            | Command::Select(_)
            | Command::Focus(_)
            | Command::FocusTest(_)
            | Command::ReplaceProject { .. } => false,
        }
    }

    /// The edits of what came back from the installation: records, the log's path, an
    /// in-place calibration.
    fn edit_installation(&mut self, command: Command) -> bool {
        match command {
            Command::SetRecords(records) => {
                let r = &mut self.project.records;
                r.grids = records.grids;
                r.bridges = records.bridges;
                true
            }
            Command::SetLogPath(path) => {
                self.project.records.log_path = path;
                true
            }
            Command::SetCalibration {
                part,
                bridge,
                calibration,
            } => self
                .bridge_mut(part, bridge)
                .map(|b| b.calibration = calibration.map(|c| *c))
                .is_some(),
            _ => false,
        }
    }

    /// Takes an edited copy of the project (inspector, tree), if it is valid.
    fn replace_edited(&mut self, project: Project, focus: Option<Item>) -> bool {
        if gw_plan::validate::validate_project(&project).is_err() {
            return false;
        }
        self.project = project;
        if let Some(item) = focus {
            self.selection = Selection::of(item, self.selection);
        }
        true
    }

    fn set_datum(&mut self, part: usize, x_m: f64, s_m: f64) -> bool {
        let Some(p) = self.project.parts.get_mut(part) else {
            return false;
        };
        if !(x_m.is_finite() && s_m.is_finite()) {
            return false;
        }
        p.datum_m = (x_m, s_m);
        true
    }

    fn move_gauge(
        &mut self,
        part: usize,
        gauge: usize,
        position: gw_mechanics::SurfacePoint,
    ) -> bool {
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
        true
    }

    fn turn_gauge(&mut self, part: usize, gauge: usize, angle_rad: f64) -> bool {
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
        true
    }

    fn bridge_mut(&mut self, part: usize, bridge: usize) -> Option<&mut gw_plan::BridgePlan> {
        self.project
            .parts
            .get_mut(part)
            .and_then(|p| p.bridges.get_mut(bridge))
    }

    fn set_arm(
        &mut self,
        part: usize,
        bridge: usize,
        arm: usize,
        element: gw_plan::PlanArm,
    ) -> bool {
        let Some(b) = self.bridge_mut(part, bridge) else {
            return false;
        };
        if arm > 3 {
            return false;
        }
        b.arms[arm] = element;
        b.arrangement = "Custom".into();
        gw_plan::validate::validate_project(&self.project).is_ok()
    }

    fn add_gauge(
        &mut self,
        part: usize,
        pattern: gw_bridge::GaugePattern,
        position: gw_mechanics::SurfacePoint,
        angle_rad: f64,
    ) -> bool {
        // The first stock type of that pattern, or the default type added to the stock.
        let stock = match self
            .project
            .gauge_stock
            .iter()
            .find(|s| s.spec.pattern == pattern)
        {
            Some(s) => s.name.clone(),
            None => gw_plan::document::stock_name_for(
                &mut self.project.gauge_stock,
                &gw_plan::document::default_gauge_spec(pattern),
            ),
        };
        let Some(p) = self.project.parts.get_mut(part) else {
            return false;
        };
        if p.member.locate(&position).is_err() || !angle_rad.is_finite() {
            return false;
        }
        let id = gw_plan::arrangements::next_gauge_id(p);
        p.gauges.push(PlanGauge {
            id,
            stock,
            lot: None,
            position,
            angle_rad,
        });
        self.selection.gauge = Some(p.gauges.len() - 1);
        self.selection.focus = Some(Item::Gauge {
            part,
            gauge: p.gauges.len() - 1,
        });
        true
    }

    /// Opens a file; on failure the open project is untouched and the message says why.
    pub fn open(&mut self, path: &Path) {
        match gw_plan::load_project(path) {
            Ok(p) => {
                // Set first: a test log that cannot be read replaces it with the reason.
                self.notice = Some(Notice {
                    is_error: false,
                    text: format!("Opened {}", path.display()),
                });
                self.apply_all(vec![Command::ReplaceProject {
                    project: Box::new(p),
                    path: Some(path.to_owned()),
                }]);
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
        // Result files named relative to the old folder are named from the new one.
        let from = self.path.as_deref().and_then(Path::parent);
        gw_plan::imported_part::rebase(&mut self.project, from, path.parent());
        match gw_plan::save_project(&self.project, path) {
            Ok(()) => {
                self.path = Some(path.to_owned());
                self.dirty = false;
                // The imported surfaces are kept beside the project for a fast reopening; a
                // cache that cannot be written only makes the next opening read the files.
                let unkept = gw_plan::imported_part::write_caches(&self.project, path);
                let text = if unkept.is_empty() {
                    format!("Saved {}", path.display())
                } else {
                    format!(
                        "Saved {} (the imported surface could not be kept beside it: {}; it is \
                         read from its result files when the project opens)",
                        path.display(),
                        unkept.join("; ")
                    )
                };
                self.notice = Some(Notice {
                    is_error: false,
                    text,
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
    pub fn components(&self) -> std::borrow::Cow<'static, [LoadComponent]> {
        self.project
            .parts
            .get(self.selection.part)
            .map(|p| p.member.components())
            .unwrap_or_default()
    }
}
