//! The panels. Each holds only view state and emits [`crate::command::Command`]s.

pub mod bridges;
pub mod canvas;
pub mod findings;
pub mod help;
pub mod plots;
pub mod project;

/// Colours of our own calm engineering look.
pub mod palette {
    use egui::Color32;
    /// Pass.
    pub const PASS: Color32 = Color32::from_rgb(70, 150, 110);
    /// Warn.
    pub const WARN: Color32 = Color32::from_rgb(210, 160, 50);
    /// Fail.
    pub const FAIL: Color32 = Color32::from_rgb(200, 70, 60);
    /// Selected gauge outline.
    pub const SELECTED: Color32 = Color32::from_rgb(250, 250, 250);
    /// Gauge outline.
    pub const GAUGE: Color32 = Color32::from_rgb(30, 30, 35);
}
