//! What the colour map shows, shared by the part view and the face view: the quantity, the
//! strain basis, the colour scales, the legend with its ticks, and formatting of a map value.

use egui::{Color32, Rect, Sense, pos2, vec2};
use gw_mechanics::{StrainBasis, SurfaceQuantity};

use crate::units::{Quantity, Units, microstrain, number_text};

/// Which quantity the colour map shows.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum MapQuantity {
    /// Strain along the member axis (local x).
    #[default]
    StrainAlongAxis,
    /// Strain across (local y: hoop on round parts).
    StrainAcross,
    /// Strain along a direction the user sets.
    StrainAlongDirection,
    /// Larger principal strain.
    MaxPrincipal,
    /// Von Mises stress.
    VonMises,
}

impl MapQuantity {
    /// Every quantity, in menu order.
    pub const ALL: [MapQuantity; 5] = [
        MapQuantity::StrainAlongAxis,
        MapQuantity::StrainAcross,
        MapQuantity::StrainAlongDirection,
        MapQuantity::MaxPrincipal,
        MapQuantity::VonMises,
    ];

    /// Plain name.
    pub fn name(self) -> &'static str {
        match self {
            MapQuantity::StrainAlongAxis => "Strain along the axis",
            MapQuantity::StrainAcross => "Strain across (hoop)",
            MapQuantity::StrainAlongDirection => "Strain along a direction",
            MapQuantity::MaxPrincipal => "Larger principal strain",
            MapQuantity::VonMises => "Von Mises stress",
        }
    }
}

/// The map choice, shared by the views.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct MapSettings {
    /// Quantity.
    pub quantity: MapQuantity,
    /// Direction of [`MapQuantity::StrainAlongDirection`], degrees from local x.
    pub direction_deg: f64,
    /// Strain basis: mechanical unless the user asks for free thermal expansion too.
    pub basis: StrainBasis,
    /// Contour lines at the legend's ticks.
    pub contours: bool,
    /// Short strokes along the principal directions (face view).
    pub principal_marks: bool,
}

impl Default for MapSettings {
    fn default() -> Self {
        Self {
            quantity: MapQuantity::StrainAlongAxis,
            direction_deg: 45.0,
            basis: StrainBasis::Mechanical,
            contours: true,
            principal_marks: false,
        }
    }
}

impl MapSettings {
    /// The surface quantity to sample.
    pub fn surface(&self) -> SurfaceQuantity {
        match self.quantity {
            MapQuantity::StrainAlongAxis => SurfaceQuantity::StrainAlong(0.0),
            MapQuantity::StrainAcross => SurfaceQuantity::StrainAlong(std::f64::consts::FRAC_PI_2),
            MapQuantity::StrainAlongDirection => {
                SurfaceQuantity::StrainAlong(self.direction_deg.to_radians())
            }
            MapQuantity::MaxPrincipal => SurfaceQuantity::MaxPrincipalStrain,
            MapQuantity::VonMises => SurfaceQuantity::VonMisesStress,
        }
    }

    /// True for a stress map (sequential scale from zero).
    pub fn is_stress(&self) -> bool {
        self.quantity == MapQuantity::VonMises
    }

    /// The value formatted in display units.
    pub fn format(&self, value: f64, units: Units) -> String {
        if self.is_stress() {
            units.format_stress(value)
        } else {
            microstrain(value)
        }
    }

    /// The colour range for values from `lo` to `hi`, always including zero so that zero is
    /// the neutral colour: symmetric when the values change sign, from zero to the extreme
    /// when they do not (stress is never negative).
    pub fn scale_range(&self, (lo, hi): (f64, f64)) -> (f64, f64) {
        let tiny = 1e-300;
        // A sliver of the other sign (a rounding residue, a field that just touches zero)
        // does not make the scale symmetric.
        let sliver = 1e-3 * lo.abs().max(hi.abs());
        if self.is_stress() {
            (0.0, hi.max(tiny))
        } else if lo < -sliver && hi > sliver {
            let span = lo.abs().max(hi);
            (-span, span)
        } else if hi > sliver {
            (lo.min(0.0), hi)
        } else if lo < -sliver {
            (lo, hi.max(0.0))
        } else {
            (-tiny, tiny)
        }
    }

    /// Colour of `value` on a scale from `range` (see [`MapSettings::scale_range`]).
    pub fn colour(&self, value: f64, (lo, hi): (f64, f64)) -> Color32 {
        if self.is_stress() {
            sequential(value / hi)
        } else {
            diverging(value / hi.max(-lo))
        }
    }

    /// The unit the legend's ticks are in.
    fn tick_unit(&self, units: Units) -> &'static str {
        if self.is_stress() {
            units.label(Quantity::Stress)
        } else {
            "µε"
        }
    }

    /// Legend value per SI value: µε per unit strain, MPa or ksi per pascal.
    fn tick_scale(&self, units: Units) -> f64 {
        if self.is_stress() {
            units.scale_to_display(Quantity::Stress, 1.0)
        } else {
            1e6
        }
    }

    /// The legend's ticks across `range` as SI values: round numbers of the legend's unit
    /// (every 100 µε, every 10 MPa, every 2 ksi), so the contours drawn at them are too.
    pub fn levels(&self, range: (f64, f64), units: Units) -> Vec<f64> {
        let k = self.tick_scale(units);
        ticks((range.0 * k, range.1 * k))
            .into_iter()
            .map(|t| t / k)
            .collect()
    }

    /// The map choice controls: quantity, direction, thermal expansion, contours.
    pub fn controls_ui(&mut self, ui: &mut egui::Ui, with_principal_marks: bool) {
        // Each label with its control in one group, so a row that wraps never parts them.
        ui.horizontal(|ui| self.quantity_ui(ui));
        ui.horizontal(|ui| self.direction_ui(ui));
        let mut thermal = self.basis == StrainBasis::WithFreeThermal;
        if ui
            .checkbox(&mut thermal, "Free thermal expansion")
            .on_hover_text(
                "Add the stress-free expansion α·ΔT to the strains shown. Off: the map shows \
                 mechanical strain, the part that carries stress",
            )
            .changed()
        {
            self.basis = if thermal {
                StrainBasis::WithFreeThermal
            } else {
                StrainBasis::Mechanical
            };
        }
        ui.checkbox(&mut self.contours, "Contours")
            .on_hover_text("Lines of equal value at the legend's ticks");
        if with_principal_marks {
            ui.checkbox(&mut self.principal_marks, "Principal directions")
                .on_hover_text("Short strokes along the larger principal strain");
        }
    }

    fn quantity_ui(&mut self, ui: &mut egui::Ui) {
        let label = ui.label("Map").id;
        egui::ComboBox::from_id_salt("map quantity")
            .width(190.0)
            .selected_text(self.quantity.name())
            .show_ui(ui, |ui| {
                for q in MapQuantity::ALL {
                    ui.selectable_value(&mut self.quantity, q, q.name());
                }
            })
            .response
            .labelled_by(label)
            .on_hover_text("Surface quantity shown as colour, under the selected load case");
    }

    /// The direction of "Strain along a direction": always there (greyed out unless used), so
    /// the row never shifts when the map changes.
    fn direction_ui(&mut self, ui: &mut egui::Ui) {
        let along = self.quantity == MapQuantity::StrainAlongDirection;
        let label = ui.add_enabled(along, egui::Label::new("at")).id;
        ui.add_enabled(
            along,
            egui::DragValue::new(&mut self.direction_deg)
                .range(-180.0..=180.0)
                .speed(1.0)
                .suffix("°"),
        )
        .labelled_by(label)
        .on_hover_text(
            "Direction of the mapped strain, counter-clockwise from the member axis seen from \
             outside (for \"Strain along a direction\")",
        );
    }

    /// The legend: the colour bar with its ticks and the range found, `scope` saying where
    /// ("on the part", "on this face"). The range goes on a line of its own, so nothing runs
    /// out of a narrow view.
    pub fn legend_ui(&self, ui: &mut egui::Ui, found: (f64, f64), units: Units, scope: &str) {
        let range = self.scale_range(found);
        ui.horizontal_wrapped(|ui| {
            ui.label(format!(
                "{}, {}",
                self.quantity.name(),
                self.tick_unit(units)
            ));
            // Room beyond the bar for half of its last tick label, so that label never runs
            // into the text after the legend.
            let (rect, _) = ui.allocate_exact_size(vec2(240.0 + 24.0, 30.0), Sense::hover());
            let bar = Rect::from_min_size(rect.min, vec2(240.0, 12.0));
            let painter = ui.painter();
            let n = 60;
            for k in 0..n {
                let t = k as f64 / (n - 1) as f64;
                let v = range.0 + (range.1 - range.0) * t;
                let x = bar.left() + bar.width() * k as f32 / n as f32;
                painter.rect_filled(
                    Rect::from_min_size(
                        pos2(x, bar.top()),
                        vec2(bar.width() / n as f32 + 1.0, bar.height()),
                    ),
                    0.0,
                    self.colour(v, range),
                );
            }
            let text = ui.visuals().text_color();
            let scale = self.tick_scale(units);
            let ticks = ticks((range.0 * scale, range.1 * scale));
            let decimals = tick_decimals(&ticks);
            let font = egui::FontId::proportional(10.0);
            let mut last_right = f32::NEG_INFINITY;
            for t in &ticks {
                let at = (t / scale - range.0) / (range.1 - range.0);
                let x = bar.left() + bar.width() * at as f32;
                painter.line_segment(
                    [pos2(x, bar.bottom()), pos2(x, bar.bottom() + 3.0)],
                    egui::Stroke::new(1.0, text),
                );
                let label = number_text(*t, decimals);
                let galley = painter.layout_no_wrap(label, font.clone(), text);
                let left = x - galley.size().x / 2.0;
                if left > last_right + 4.0 && x + galley.size().x / 2.0 <= rect.right() {
                    last_right = left + galley.size().x;
                    painter.galley(pos2(left, bar.bottom() + 3.0), galley, text);
                }
            }
        });
        ui.label(format!(
            "{scope}: {} to {}",
            self.format(found.0, units),
            self.format(found.1, units)
        ));
    }
}

/// Round tick values across `range`: steps of 1, 2 or 5 × 10ⁿ, four to eight ticks.
pub fn ticks((lo, hi): (f64, f64)) -> Vec<f64> {
    let span = hi - lo;
    if !(span.is_finite() && span > 0.0) {
        return Vec::new();
    }
    let raw = span / 5.0;
    let mag = 10f64.powf(raw.log10().floor());
    let step = [1.0, 2.0, 5.0, 10.0]
        .iter()
        .map(|k| k * mag)
        .find(|s| span / s <= 8.0)
        .unwrap_or(10.0 * mag);
    let first = (lo / step).ceil() as i64;
    let last = (hi / step).floor() as i64;
    (first..=last).map(|k| k as f64 * step).collect()
}

/// Decimals that tell round ticks apart: none for steps of 1 and more, one for 0.5 or 0.2.
fn tick_decimals(ticks: &[f64]) -> usize {
    match ticks {
        [a, b, ..] if b > a => (-(b - a).log10().floor()).max(0.0) as usize,
        _ => 0,
    }
}

/// Our diverging colour scale: deep blue for compression through a pale neutral to deep
/// amber for tension; `t` in −1…1.
pub fn diverging(t: f64) -> Color32 {
    let t = if t.is_finite() {
        t.clamp(-1.0, 1.0)
    } else {
        0.0
    } as f32;
    let neutral = [235.0, 235.0, 228.0];
    let (end, k) = if t < 0.0 {
        ([40.0, 90.0, 170.0], -t)
    } else {
        ([200.0, 110.0, 30.0], t)
    };
    let mix = |i: usize| (neutral[i] + (end[i] - neutral[i]) * k) as u8;
    Color32::from_rgb(mix(0), mix(1), mix(2))
}

/// Our sequential scale for stress: pale to deep plum; `t` in 0…1.
pub fn sequential(t: f64) -> Color32 {
    let t = if t.is_finite() {
        t.clamp(0.0, 1.0)
    } else {
        0.0
    } as f32;
    let a = [240.0, 238.0, 230.0];
    let b = [110.0, 40.0, 90.0];
    let mix = |i: usize| (a[i] + (b[i] - a[i]) * t) as u8;
    Color32::from_rgb(mix(0), mix(1), mix(2))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ticks_are_round_and_inside_the_range() {
        let t = ticks((-726.8e-6, 726.8e-6));
        assert!(t.len() >= 4 && t.len() <= 8, "{t:?}");
        for v in &t {
            assert!(v.abs() <= 726.8e-6 + 1e-18);
            let in_steps = v / 200e-6;
            assert!((in_steps - in_steps.round()).abs() < 1e-9, "{v}");
        }
        assert!(ticks((0.0, 0.0)).is_empty());
        assert!(ticks((0.0, f64::NAN)).is_empty());
    }

    #[test]
    fn zero_strain_is_the_neutral_colour_whatever_the_range() {
        let m = MapSettings::default();
        let r = m.scale_range((-1e-6, 5e-4));
        assert_eq!(m.colour(0.0, r), diverging(0.0));
        assert_ne!(m.colour(5e-4, r), m.colour(-5e-4, r));
        // All of one sign: the bar runs from zero, and the extreme gets the full colour.
        let r = m.scale_range((2e-4, 5e-4));
        assert_eq!(r, (0.0, 5e-4));
        assert_eq!(m.colour(5e-4, r), diverging(1.0));
        assert_eq!(m.colour(0.0, r), diverging(0.0));
    }

    #[test]
    fn stress_ticks_are_round_in_ksi_in_us_customary_units() {
        let m = MapSettings {
            quantity: MapQuantity::VonMises,
            ..MapSettings::default()
        };
        // 1 ksi = 6.894 757 MPa (NIST SP 811, Appendix B: 1 psi = 6 894.757 Pa).
        let ksi_pa = 6.894_757e6;
        let levels = m.levels((0.0, 100e6), Units::UsCustomary);
        assert!(levels.len() >= 4, "{levels:?}");
        for pa in &levels {
            let ksi = pa / ksi_pa;
            assert!(
                (ksi - ksi.round()).abs() < 1e-4,
                "{ksi} ksi is not a round tick"
            );
        }
        let si = m.levels((0.0, 100e6), Units::Si);
        assert!(
            si.iter()
                .all(|pa| (pa / 1e6 - (pa / 1e6).round()).abs() < 1e-9)
        );
        assert_eq!(m.tick_unit(Units::UsCustomary), "ksi");
        assert_eq!(m.tick_unit(Units::Si), "MPa");
    }

    #[test]
    fn small_ticks_keep_the_decimals_that_tell_them_apart() {
        assert_eq!(tick_decimals(&[0.0, 0.5, 1.0]), 1);
        assert_eq!(tick_decimals(&[0.0, 0.02]), 2);
        assert_eq!(tick_decimals(&[-200.0, 0.0, 200.0]), 0);
        assert_eq!(tick_decimals(&[]), 0);
    }
}
