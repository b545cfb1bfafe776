fn main() -> eframe::Result {
    let options = eframe::NativeOptions::default();
    eframe::run_native("Gaugewright", options, Box::new(|_cc| Ok(Box::new(App))))
}
struct App;
impl eframe::App for App {
    fn ui(&mut self, ui: &mut egui::Ui, _frame: &mut eframe::Frame) {
        ui.heading("Gaugewright");
    }
}
