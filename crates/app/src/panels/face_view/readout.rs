//! Under the canvas: what the cursor is over (the map value, and what a grid of the chosen
//! pattern would read there, averaged over its area), the legend, and the selected gauge.

use egui::{Label, RichText};
use gw_bridge::GaugePattern;
use gw_mechanics::{SurfacePoint, quantity_of};
use gw_plan::drawing::face_layout::normalised_deg;
use gw_plan::drawing::probe::{probe_readings, probe_spec};

use super::{FaceView, Scene, View};
use crate::panels::fields::Digits;
use crate::panels::map::MapSettings;
use crate::units::{Quantity, Units, microstrain};

impl FaceView {
    /// The two readout lines, the legend and the selection line, each on one line that is
    /// cut short rather than run out of the panel; the reading of a pattern with several grids
    /// wraps onto a second line so that every grid is named.
    pub(super) fn readout_ui(
        &self,
        ui: &mut egui::Ui,
        scene: &Scene,
        settings: &MapSettings,
        view: View,
        response: &egui::Response,
    ) {
        let face_rect = view.face_rect(&scene.bounds).intersect(view.area);
        // Over the canvas or over a gauge on it.
        let over_canvas = response.contains_pointer() || response.hovered();
        let hover = ui
            .input(|i| i.pointer.hover_pos())
            .filter(|p| over_canvas && face_rect.contains(*p))
            .map(|p| view.face_point(p));
        let (first, second) = match hover {
            Some((x, s)) => self.readout_lines(scene, settings, x, s),
            None => (
                "Point at the face to read the map and what a grid would read there.".to_owned(),
                String::new(),
            ),
        };
        ui.add(Label::new(first).truncate());
        // A rosette's reading names every grid: wrapped rather than cut short.
        ui.add(Label::new(RichText::new(second)).wrap());
        if let Some(layer) = &self.map {
            settings.legend_ui(ui, layer.found, scene.units, "on this face");
        }
        let line = self.selection_line(scene);
        ui.add(Label::new(line).truncate());
    }

    /// Where the cursor is with the map value, and what a grid would read there.
    fn readout_lines(
        &self,
        scene: &Scene,
        settings: &MapSettings,
        x: f64,
        s: f64,
    ) -> (String, String) {
        let member = &scene.part.member;
        let Ok(point) = member.locate(&SurfacePoint::new(scene.face, x, s)) else {
            return ("Off the part.".to_owned(), String::new());
        };
        let place = match scene.radius_m() {
            Some(r) => format!(
                "x {}, {}° from the top line (arc {})",
                scene.length(point.x_m),
                TENTH_DEGREE.text(normalised_deg((point.s_m / r).to_degrees())),
                scene.length(point.s_m)
            ),
            None => format!(
                "x {}, s {}",
                scene.length(point.x_m),
                scene.length(point.s_m)
            ),
        };
        let value = member
            .state(&point, &scene.loads)
            .ok()
            .and_then(|st| quantity_of(&st, member.material(), settings.surface(), settings.basis))
            .map_or_else(
                || "no value".to_owned(),
                |v| settings.format(v, scene.units),
            );
        let first = format!(
            "{place}: {} {value}",
            settings.quantity.name().to_lowercase()
        );
        let spec = probe_spec(&scene.doc.project, self.pattern);
        let second = match probe_readings(member, &scene.loads, &spec, point, 0.0, settings.basis) {
            Some(r) if self.pattern == GaugePattern::SingleGrid => format!(
                "A {} single grid along the axis here reads {} (averaged over its grid)",
                short_length(scene.units, spec.grid_length_m),
                r.first()
                    .map_or_else(String::new, |g| microstrain(g.strain))
            ),
            Some(r) => {
                let parts: Vec<String> = r
                    .iter()
                    .map(|g| {
                        let angle = TENTH_DEGREE.text(g.angle_deg);
                        format!("{angle}° grid {}", microstrain(g.strain))
                    })
                    .collect();
                format!(
                    "A {} here (reference along the axis) reads: {}",
                    self.pattern.name(),
                    parts.join(", ")
                )
            }
            None => format!("A {} does not fit on the face here.", self.pattern.name()),
        };
        (first, second)
    }

    /// The selected gauge, from the datum.
    fn selection_line(&self, scene: &Scene) -> String {
        let Some(g) = scene.sel.gauge.and_then(|g| scene.part.gauges.get(g)) else {
            return "No gauge selected: click one, or add one with the chosen pattern.".to_owned();
        };
        let (dx, ds) = scene.part.datum_m;
        format!(
            "{} on the {}: {} along, {} across from the datum, grid at {}°",
            g.id,
            g.position.face.name(),
            scene.length(g.position.x_m - dx),
            scene.length(g.position.s_m - ds),
            TENTH_DEGREE.text(g.angle_rad.to_degrees())
        )
    }
}

/// Angles in the readout: to a tenth of a degree, whole ones without decimals ("45", "12.5").
const TENTH_DEGREE: Digits = Digits::Places(0, 1);

/// A grid size in words: "3 mm", "1.5 mm", "0.118 in" (the length's resolution, trailing zeros
/// dropped).
fn short_length(units: Units, length_m: f64) -> String {
    let shown = units.to_display(Quantity::Length, length_m);
    let decimals = units.decimals(Quantity::Length, shown);
    let number = Digits::Places(0, decimals).text(shown);
    format!("{number} {}", units.label(Quantity::Length))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn grid_sizes_read_in_the_chosen_units() {
        assert_eq!(short_length(Units::Si, 0.003), "3 mm");
        assert_eq!(short_length(Units::Si, 0.0015), "1.5 mm");
        // 3 mm / 25.4 mm per inch (NIST SP 811, Appendix B) = 0.1181 in.
        assert_eq!(short_length(Units::UsCustomary, 0.003), "0.118 in");
    }
}
