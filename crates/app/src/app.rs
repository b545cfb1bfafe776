//! The application state and its frame.

use crate::screenshot::ScreenshotRequest;

/// The Gaugewright desktop app.
pub struct GaugewrightApp {
    screenshot: Option<ScreenshotRequest>,
}

impl GaugewrightApp {
    /// A new app; `screenshot` saves the window after a few frames and closes it.
    pub fn new(screenshot: Option<ScreenshotRequest>) -> Self {
        Self { screenshot }
    }
}

impl eframe::App for GaugewrightApp {
    fn ui(&mut self, ui: &mut egui::Ui, _frame: &mut eframe::Frame) {
        let Self { screenshot } = self;
        egui::CentralPanel::default().show(ui, |ui| {
            ui.heading("Gaugewright");
            ui.label("Strain-gauge installation planning.");
        });
        if let Some(request) = screenshot {
            request.on_frame(ui.ctx());
        }
    }
}
