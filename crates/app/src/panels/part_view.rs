//! The part view: the whole part in 3-D.

use gw_mechanics::Face;

use super::map::MapSettings;
use crate::command::Command;
use crate::state::DocumentState;

/// View state of the part view.
#[derive(Default)]
pub struct PartView {}

impl PartView {
    /// Draws the part view; returns a face the user clicked, to open in the face view.
    pub fn part_ui(
        &mut self,
        ui: &mut egui::Ui,
        _doc: &DocumentState,
        _map: &mut MapSettings,
        _out: &mut Vec<Command>,
    ) -> Option<Face> {
        ui.label("Part view");
        None
    }
}
