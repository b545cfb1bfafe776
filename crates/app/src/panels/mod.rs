//! The panels. Each holds only view state and emits [`crate::command::Command`]s.

pub mod bridges;
pub mod checkout_inspector;
pub mod face_view;
pub mod fields;
pub mod findings;
pub mod help;
pub mod import_field;
mod import_field_ui;
pub mod imported_fields;
pub mod inspector;
pub mod item_fields;
pub mod map;
pub mod measured;
pub mod new_project;
pub mod part_view;
pub mod plots;
pub mod record_fields;
pub mod tree;

/// A labelled number in a two-column grid, shown as `value × scale` with `suffix`; writes the
/// value back and returns true when the user changed it. Ends the grid row.
pub fn scaled_number_row(
    ui: &mut egui::Ui,
    label: &str,
    value: &mut f64,
    scale: f64,
    suffix: &str,
    help: &str,
) -> bool {
    let id = ui.label(label).id;
    let mut shown = *value * scale;
    let speed = (shown.abs() * 0.005).max(0.001);
    let changed = ui
        .add(egui::DragValue::new(&mut shown).speed(speed).suffix(suffix))
        .labelled_by(id)
        .on_hover_text(help)
        .changed();
    if changed {
        *value = shown / scale;
    }
    ui.end_row();
    changed
}

/// "axial force" → "Axial force".
pub fn capitalise(s: &str) -> String {
    let mut c = s.chars();
    c.next()
        .map(|f| f.to_uppercase().collect::<String>() + c.as_str())
        .unwrap_or_default()
}

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
