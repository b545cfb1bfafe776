//! Display units. Stored values stay SI; conversion happens only here, at the display edge.

use gw_mechanics::LoadComponent;
use serde::{Deserialize, Serialize};

/// The unit system shown. Default: SI.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
pub enum Units {
    /// mm, N, N·m, MPa, °C.
    #[default]
    Si,
    /// in, lbf, lbf·in, psi/ksi, °F.
    UsCustomary,
}

/// Kinds of quantity with their own display unit.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Quantity {
    /// Length (SI m).
    Length,
    /// Force (N).
    Force,
    /// Force per length (N/m).
    ForcePerLength,
    /// Moment (N·m).
    Moment,
    /// Pressure or stress (Pa).
    Pressure,
    /// Elastic modulus (Pa), shown in GPa or Mpsi.
    Modulus,
    /// Temperature change (°C).
    TemperatureChange,
    /// Absolute temperature (°C).
    Temperature,
    /// Plain number.
    Plain,
}

impl Quantity {
    /// The quantity of a load component.
    pub fn of(c: LoadComponent) -> Quantity {
        match c.unit() {
            "N" => Quantity::Force,
            "N/m" => Quantity::ForcePerLength,
            "N·m" => Quantity::Moment,
            "Pa" => Quantity::Pressure,
            "°C" => Quantity::TemperatureChange,
            _ => Quantity::Plain,
        }
    }
}

const LBF_N: f64 = 4.448_221_615_260_5; // exact by definition of the pound-force
const IN_M: f64 = 0.0254; // exact
const PSI_PA: f64 = LBF_N / (IN_M * IN_M);

impl Units {
    /// (scale from SI, offset, unit label): display = SI · scale + offset.
    pub fn spec(self, q: Quantity) -> (f64, f64, &'static str) {
        match (self, q) {
            (Units::Si, Quantity::Length) => (1e3, 0.0, "mm"),
            (Units::Si, Quantity::Force) => (1.0, 0.0, "N"),
            (Units::Si, Quantity::ForcePerLength) => (1.0, 0.0, "N/m"),
            (Units::Si, Quantity::Moment) => (1.0, 0.0, "N·m"),
            (Units::Si, Quantity::Pressure) => (1e-6, 0.0, "MPa"),
            (Units::Si, Quantity::Modulus) => (1e-9, 0.0, "GPa"),
            (Units::UsCustomary, Quantity::Modulus) => (1e-6 / PSI_PA, 0.0, "Mpsi"),
            (Units::Si, Quantity::TemperatureChange) => (1.0, 0.0, "°C"),
            (Units::Si, Quantity::Temperature) => (1.0, 0.0, "°C"),
            (Units::UsCustomary, Quantity::Length) => (1.0 / IN_M, 0.0, "in"),
            (Units::UsCustomary, Quantity::Force) => (1.0 / LBF_N, 0.0, "lbf"),
            (Units::UsCustomary, Quantity::ForcePerLength) => (IN_M / LBF_N, 0.0, "lbf/in"),
            (Units::UsCustomary, Quantity::Moment) => (1.0 / (LBF_N * IN_M), 0.0, "lbf·in"),
            (Units::UsCustomary, Quantity::Pressure) => (1.0 / PSI_PA, 0.0, "psi"),
            (Units::UsCustomary, Quantity::TemperatureChange) => (1.8, 0.0, "°F"),
            (Units::UsCustomary, Quantity::Temperature) => (1.8, 32.0, "°F"),
            (_, Quantity::Plain) => (1.0, 0.0, ""),
        }
    }

    /// SI value to display value.
    pub fn to_display(self, q: Quantity, si: f64) -> f64 {
        let (k, off, _) = self.spec(q);
        si * k + off
    }

    /// Display value to SI value.
    pub fn from_display(self, q: Quantity, shown: f64) -> f64 {
        let (k, off, _) = self.spec(q);
        (shown - off) / k
    }

    /// Unit label.
    pub fn label(self, q: Quantity) -> &'static str {
        self.spec(q).2
    }

    /// "12.3 MPa".
    pub fn format(self, q: Quantity, si: f64) -> String {
        let v = self.to_display(q, si);
        let digits = if v.abs() >= 100.0 {
            1
        } else if v.abs() >= 1.0 {
            3
        } else {
            4
        };
        format!("{v:.digits$} {}", self.label(q))
    }

    /// Elastic modulus: GPa or Mpsi.
    pub fn format_modulus(self, pa: f64) -> String {
        match self {
            Units::Si => format!("{:.1} GPa", pa / 1e9),
            Units::UsCustomary => format!("{:.2} Mpsi", pa / PSI_PA / 1e6),
        }
    }

    /// Stress for margins and maps: MPa or ksi.
    pub fn format_stress(self, pa: f64) -> String {
        match self {
            Units::Si => format!("{:.1} MPa", pa / 1e6),
            Units::UsCustomary => format!("{:.2} ksi", pa / PSI_PA / 1e3),
        }
    }
}

/// Strain is shown as µε in both systems.
pub fn microstrain(strain: f64) -> String {
    if strain.is_finite() {
        // A value that rounds to zero is shown as 0.0, never as "-0.0".
        let shown = strain * 1e6;
        let shown = if shown.abs() < 0.05 { 0.0 } else { shown };
        format!("{shown:.1} µε")
    } else {
        "—".to_owned()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn us_customary_round_trips_and_matches_the_definitions() {
        // NIST SP 811, Appendix B: 1 lbf = 4.448 221 615 260 5 N, 1 psi = 6 894.757 Pa.
        let u = Units::UsCustomary;
        assert!((u.from_display(Quantity::Pressure, 1.0) - 6894.757).abs() < 1e-3);
        assert!((u.to_display(Quantity::Force, LBF_N) - 1.0).abs() < 1e-12);
        assert!((u.to_display(Quantity::Temperature, 100.0) - 212.0).abs() < 1e-12);
        for q in [Quantity::Length, Quantity::Moment, Quantity::Temperature] {
            assert!((u.from_display(q, u.to_display(q, 3.7)) - 3.7).abs() < 1e-12);
        }
    }
}
