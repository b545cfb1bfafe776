//! Every change to the project is a command, applied in one place after the panels draw.
//! That single entry point gives undo/redo, dirty tracking and tests.

use gw_bridge::LeadWiring;
use gw_bridge::arrangement::CatalogueEntry;
use gw_bridge::chooser::RankedArrangement;
use gw_mechanics::SurfacePoint;
use gw_plan::edit::Item;
use gw_plan::{PlanArm, Project};

use crate::units::Units;

/// A change to the project or to what the app shows.
#[derive(Debug, Clone)]
pub enum Command {
    /// Replace the project with an edited copy (inspector fields and plan-tree edits, already
    /// validated), then focus `focus` if given.
    Edit {
        project: Box<Project>,
        focus: Option<Item>,
    },
    /// Show this item in the inspector (and select it everywhere).
    Focus(Item),
    /// Put the dimension datum of a part at a surface point.
    SetDatum { part: usize, x_m: f64, s_m: f64 },
    /// Add a gauge of a pattern at a point.
    AddGauge {
        part: usize,
        pattern: gw_bridge::GaugePattern,
        position: SurfacePoint,
        angle_rad: f64,
    },
    /// Move a gauge.
    MoveGauge {
        part: usize,
        gauge: usize,
        position: SurfacePoint,
    },
    /// Turn a gauge to an angle.
    SetGaugeAngle {
        part: usize,
        gauge: usize,
        angle_rad: f64,
    },
    /// Delete a gauge (and clear the arms that used it).
    DeleteGauge { part: usize, gauge: usize },
    /// Set what goes in one arm.
    SetArm {
        part: usize,
        bridge: usize,
        arm: usize,
        element: PlanArm,
    },
    /// Set a bridge's lead wiring.
    SetWiring {
        part: usize,
        bridge: usize,
        wiring: LeadWiring,
    },
    /// Add a bridge.
    AddBridge { part: usize },
    /// Apply a catalogue arrangement to a bridge (adds its gauges).
    ApplyCatalogue {
        part: usize,
        bridge: usize,
        entry: Box<CatalogueEntry>,
    },
    /// Rewire a bridge to a suggested arrangement.
    ApplySuggestion {
        part: usize,
        bridge: usize,
        ranked: Box<RankedArrangement>,
    },
    /// Replace the check-out records of grids and bridges (an imported records file); the
    /// log path is kept.
    SetRecords(Box<gw_plan::installation::InstallationRecords>),
    /// Name the test log the project reads (`None`: no log).
    SetLogPath(Option<String>),
    /// Use an in-place calibration for a bridge's sensitivity (`None`: back to the predicted).
    SetCalibration {
        part: usize,
        bridge: usize,
        calibration: Option<Box<gw_plan::installation::InPlaceCalibration>>,
    },
    /// Show a check-out entry in the inspector.
    FocusTest(crate::state::TestFocus),
    /// Replace the whole project (new, open, recover).
    ReplaceProject {
        project: Box<Project>,
        path: Option<std::path::PathBuf>,
    },
    /// Undo the last change.
    Undo,
    /// Redo the last undone change.
    Redo,
    /// Switch display units.
    SetUnits(Units),
    /// Change what is selected.
    Select(crate::state::Selection),
}

impl Command {
    /// True for commands that change the project (and so go on the undo stack).
    pub fn edits_project(&self) -> bool {
        !matches!(
            self,
            Command::Undo
                | Command::Redo
                | Command::SetUnits(_)
                | Command::Select(_)
                | Command::Focus(_)
                | Command::FocusTest(_)
                | Command::ReplaceProject { .. }
        )
    }
}
