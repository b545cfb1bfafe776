//! Display units and number formatting, shared by the app, the command line and the build
//! sheet so that a quantity reads the same everywhere.
//!
//! Stored values stay SI; conversion happens only here, at the display edge. Each quantity has
//! a display resolution in each unit system (a fixed step for lengths, temperatures and
//! strains; a number of significant digits for loads, stresses and plain numbers, whose sizes
//! range over many decades), and [`Units::format`] chooses its digits from it.
//!
//! Conversion factors are exact by definition: 1 in = 0.0254 m, 1 lbf = 4.448 221 615 260 5 N
//! (NIST SP 811, 2008, Appendix B), °F = 1.8 °C + 32 for temperatures and 1.8 °F per °C for
//! changes and coefficients.

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
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Quantity {
    /// Length on the part: positions, dimensions, grid sizes (SI m; shown mm or in).
    Length,
    /// Length of a cable run (SI m; shown m or ft).
    CableLength,
    /// Force (N; shown N or lbf).
    Force,
    /// Force per length (N/m; shown N/m or lbf/in).
    ForcePerLength,
    /// Moment (N·m; shown N·m or lbf·in).
    Moment,
    /// Pressure (Pa; shown MPa or psi).
    Pressure,
    /// Stress (Pa; shown MPa or ksi).
    Stress,
    /// Elastic modulus (Pa; shown GPa or Mpsi).
    Modulus,
    /// Temperature change (°C; shown °C or °F as a difference).
    TemperatureChange,
    /// Absolute temperature (°C; shown °C or °F).
    Temperature,
    /// Coefficient of thermal expansion (1/°C; shown ppm/°C or ppm/°F).
    ExpansionCoefficient,
    /// Power per area (W/m²; shown kW/m² or W/in²).
    PowerDensity,
    /// Resistance of a conductor per length (Ω/m; shown Ω/m or Ω/ft).
    ResistancePerLength,
    /// Strain (m/m; shown µε in both systems).
    Strain,
    /// Plain number.
    Plain,
}

/// How finely a quantity is shown, in its display unit.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Resolution {
    /// A fixed step, e.g. 0.01 mm.
    Step(f64),
    /// A number of significant digits.
    Significant(u32),
}

const LBF_N: f64 = 4.448_221_615_260_5; // exact by definition of the pound-force
const IN_M: f64 = 0.0254; // exact
const FT_M: f64 = 0.3048; // exact
const PSI_PA: f64 = LBF_N / (IN_M * IN_M);

impl Quantity {
    /// Every quantity (tests and tables).
    pub const ALL: [Quantity; 15] = [
        Quantity::Length,
        Quantity::CableLength,
        Quantity::Force,
        Quantity::ForcePerLength,
        Quantity::Moment,
        Quantity::Pressure,
        Quantity::Stress,
        Quantity::Modulus,
        Quantity::TemperatureChange,
        Quantity::Temperature,
        Quantity::ExpansionCoefficient,
        Quantity::PowerDensity,
        Quantity::ResistancePerLength,
        Quantity::Strain,
        Quantity::Plain,
    ];

    /// The quantity of a load component's value.
    pub fn of(c: LoadComponent) -> Quantity {
        match c {
            LoadComponent::AxialForce
            | LoadComponent::VerticalForce
            | LoadComponent::LateralForce => Quantity::Force,
            LoadComponent::UniformLoad => Quantity::ForcePerLength,
            LoadComponent::BendingMomentY
            | LoadComponent::BendingMomentZ
            | LoadComponent::Torque => Quantity::Moment,
            LoadComponent::InternalPressure | LoadComponent::ExternalPressure => Quantity::Pressure,
            LoadComponent::RemoteStressX
            | LoadComponent::RemoteStressY
            | LoadComponent::RemoteShearXY => Quantity::Stress,
            LoadComponent::GivenStateFactor => Quantity::Plain,
            LoadComponent::TemperatureChange => Quantity::TemperatureChange,
        }
    }

    /// Whether the display value carries an offset (only absolute temperature does): a ratio
    /// or a difference of such a quantity converts by the scale alone.
    pub fn has_offset(self) -> bool {
        self == Quantity::Temperature
    }
}

impl Units {
    /// (scale from SI, offset, unit label): display = SI · scale + offset.
    pub fn spec(self, q: Quantity) -> (f64, f64, &'static str) {
        match self {
            Units::Si => si_spec(q),
            Units::UsCustomary => us_spec(q),
        }
    }

    /// The display resolution of a quantity in this system.
    pub fn resolution(self, q: Quantity) -> Resolution {
        use Quantity as Q;
        match (self, q) {
            (Units::Si, Q::Length) => Resolution::Step(0.01),
            (Units::UsCustomary, Q::Length) => Resolution::Step(0.001),
            (_, Q::CableLength) => Resolution::Step(0.1),
            (_, Q::Temperature | Q::TemperatureChange) => Resolution::Step(0.1),
            (_, Q::ExpansionCoefficient) => Resolution::Step(0.01),
            (_, Q::Strain) => Resolution::Step(0.1),
            (_, Q::Force | Q::ForcePerLength | Q::Moment | Q::Pressure | Q::Stress) => {
                Resolution::Significant(4)
            }
            (_, Q::Modulus | Q::PowerDensity | Q::ResistancePerLength) => {
                Resolution::Significant(3)
            }
            (_, Q::Plain) => Resolution::Significant(4),
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

    /// A difference or a ratio in SI to display (scale only, no offset): a temperature span,
    /// an error band, a sensitivity.
    pub fn scale_to_display(self, q: Quantity, si: f64) -> f64 {
        si * self.spec(q).0
    }

    /// Unit label.
    pub fn label(self, q: Quantity) -> &'static str {
        self.spec(q).2
    }

    /// Decimal places for a display value `shown` of quantity `q`.
    pub fn decimals(self, q: Quantity, shown: f64) -> usize {
        decimals_for(self.resolution(q), shown)
    }

    /// The number alone, in the display unit: "12.35". Exact zero is "0"; a value that would
    /// round to zero at the display resolution keeps its sign ("0.000" never appears as
    /// "-0.000"). Not finite: "—".
    pub fn format_number(self, q: Quantity, si: f64) -> String {
        let shown = self.to_display(q, si);
        number_text(shown, self.decimals(q, shown))
    }

    /// "12.35 MPa": the number at the quantity's resolution and its unit.
    pub fn format(self, q: Quantity, si: f64) -> String {
        with_unit(self.format_number(q, si), self.label(q))
    }

    /// Like [`Units::format`] for a difference (an error, a band, a span): scale only.
    pub fn format_difference(self, q: Quantity, si: f64) -> String {
        let shown = self.scale_to_display(q, si);
        with_unit(
            number_text(shown, self.decimals(q, shown)),
            self.label(q).trim_start_matches('+'),
        )
    }

    /// For tables: exact zero as "0", a value smaller than the display resolution as
    /// "< 0.001" (the resolution), otherwise as [`Units::format_number`].
    pub fn format_table_number(self, q: Quantity, si: f64) -> String {
        let shown = if q.has_offset() {
            self.to_display(q, si)
        } else {
            self.scale_to_display(q, si)
        };
        table_text(shown, self.resolution(q))
    }

    /// Elastic modulus: GPa or Mpsi.
    pub fn format_modulus(self, pa: f64) -> String {
        self.format(Quantity::Modulus, pa)
    }

    /// Stress for margins and maps: MPa or ksi.
    pub fn format_stress(self, pa: f64) -> String {
        self.format(Quantity::Stress, pa)
    }

    /// The unit a sensitivity is given per, with its size in SI: µε per kN, per kN·m, per
    /// MPa, per °C (SI) or per kip, per kip·in, per ksi, per °F (US customary), chosen so that
    /// typical sensitivities read as numbers between about 0.1 and 1000.
    pub fn per_unit(self, q: Quantity) -> (f64, &'static str) {
        use Quantity as Q;
        match (self, q) {
            (Units::Si, Q::Force) => (1e3, "kN"),
            (Units::Si, Q::ForcePerLength) => (1e3, "kN/m"),
            (Units::Si, Q::Moment) => (1e3, "kN·m"),
            (Units::Si, Q::Pressure | Q::Stress) => (1e6, "MPa"),
            (Units::UsCustomary, Q::Force) => (1e3 * LBF_N, "kip"),
            (Units::UsCustomary, Q::ForcePerLength) => (1e3 * LBF_N / IN_M, "kip/in"),
            (Units::UsCustomary, Q::Moment) => (1e3 * LBF_N * IN_M, "kip·in"),
            (Units::UsCustomary, Q::Pressure | Q::Stress) => (1e3 * PSI_PA, "ksi"),
            (Units::UsCustomary, Q::TemperatureChange | Q::Temperature) => (1.0 / 1.8, "°F"),
            (Units::Si, Q::TemperatureChange | Q::Temperature) => (1.0, "°C"),
            (_, other) => (1.0 / self.spec(other).0, self.label(other)),
        }
    }
}

fn si_spec(q: Quantity) -> (f64, f64, &'static str) {
    match q {
        Quantity::Length => (1e3, 0.0, "mm"),
        Quantity::CableLength => (1.0, 0.0, "m"),
        Quantity::Force => (1.0, 0.0, "N"),
        Quantity::ForcePerLength => (1.0, 0.0, "N/m"),
        Quantity::Moment => (1.0, 0.0, "N·m"),
        Quantity::Pressure | Quantity::Stress => (1e-6, 0.0, "MPa"),
        Quantity::Modulus => (1e-9, 0.0, "GPa"),
        Quantity::TemperatureChange | Quantity::Temperature => (1.0, 0.0, "°C"),
        Quantity::ExpansionCoefficient => (1e6, 0.0, "ppm/°C"),
        Quantity::PowerDensity => (1e-3, 0.0, "kW/m²"),
        Quantity::ResistancePerLength => (1.0, 0.0, "Ω/m"),
        Quantity::Strain => (1e6, 0.0, "µε"),
        Quantity::Plain => (1.0, 0.0, ""),
    }
}

fn us_spec(q: Quantity) -> (f64, f64, &'static str) {
    match q {
        Quantity::Length => (1.0 / IN_M, 0.0, "in"),
        Quantity::CableLength => (1.0 / FT_M, 0.0, "ft"),
        Quantity::Force => (1.0 / LBF_N, 0.0, "lbf"),
        Quantity::ForcePerLength => (IN_M / LBF_N, 0.0, "lbf/in"),
        Quantity::Moment => (1.0 / (LBF_N * IN_M), 0.0, "lbf·in"),
        Quantity::Pressure => (1.0 / PSI_PA, 0.0, "psi"),
        Quantity::Stress => (1e-3 / PSI_PA, 0.0, "ksi"),
        Quantity::Modulus => (1e-6 / PSI_PA, 0.0, "Mpsi"),
        Quantity::TemperatureChange => (1.8, 0.0, "°F"),
        Quantity::Temperature => (1.8, 32.0, "°F"),
        // Per °C to per °F: a coefficient per degree shrinks as the degree does.
        Quantity::ExpansionCoefficient => (1e6 / 1.8, 0.0, "ppm/°F"),
        Quantity::PowerDensity => (IN_M * IN_M, 0.0, "W/in²"),
        Quantity::ResistancePerLength => (FT_M, 0.0, "Ω/ft"),
        Quantity::Strain => (1e6, 0.0, "µε"),
        Quantity::Plain => (1.0, 0.0, ""),
    }
}

/// Decimal places that show a value at a resolution.
fn decimals_for(resolution: Resolution, shown: f64) -> usize {
    match resolution {
        Resolution::Step(step) => step_decimals(step),
        Resolution::Significant(digits) => {
            if shown == 0.0 || !shown.is_finite() {
                return 0;
            }
            let magnitude = shown.abs().log10().floor() as i32;
            (digits as i32 - 1 - magnitude).clamp(0, 9) as usize
        }
    }
}

/// Decimal places of a step such as 0.01 (2) or 0.5 (1): the fewest that write it exactly.
fn step_decimals(step: f64) -> usize {
    if step <= 0.0 || !step.is_finite() {
        return 0;
    }
    (0..=9)
        .find(|&d| {
            let scaled = step * 10f64.powi(d as i32);
            (scaled - scaled.round()).abs() < 1e-9 * scaled.max(1.0)
        })
        .unwrap_or(9)
}

/// A number at `decimals` places: exact zero "0", never "-0.00", "—" when not finite.
pub fn number_text(shown: f64, decimals: usize) -> String {
    if shown == 0.0 {
        return "0".to_owned();
    }
    fixed_text(shown, decimals)
}

/// A number at exactly `decimals` places ("0.0000" for zero), never "-0.0000" for a value that
/// rounds to zero, "—" when not finite.
pub fn fixed_text(shown: f64, decimals: usize) -> String {
    if !shown.is_finite() {
        return "—".to_owned();
    }
    let text = format!("{shown:.decimals$}");
    match text.strip_prefix('-') {
        Some(rest) if rest.chars().all(|c| c == '0' || c == '.') => rest.to_owned(),
        _ => text,
    }
}

/// A table entry: "0" for exact zero, "< 0.001" below the resolution, else the number.
fn table_text(shown: f64, resolution: Resolution) -> String {
    if !shown.is_finite() {
        return "—".to_owned();
    }
    if shown == 0.0 {
        return "0".to_owned();
    }
    let decimals = decimals_for(resolution, shown);
    let smallest = match resolution {
        Resolution::Step(step) => step,
        // Significant digits have no floor of their own: a table shows a thousandth of the
        // display unit at most.
        Resolution::Significant(_) => 1e-3,
    };
    if shown.abs() < smallest / 2.0 {
        let places = step_decimals(smallest);
        return format!("< {smallest:.places$}");
    }
    number_text(shown, decimals)
}

fn with_unit(number: String, unit: &str) -> String {
    if unit.is_empty() {
        number
    } else {
        format!("{number} {unit}")
    }
}

/// Strain as µε with one decimal in both systems; a value that rounds to zero is "0.0", never
/// "-0.0"; not finite: "—".
pub fn microstrain(strain: f64) -> String {
    if strain.is_finite() {
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
    fn us_customary_matches_the_definitions() {
        // NIST SP 811 (2008), Appendix B: 1 lbf = 4.448 221 615 260 5 N, 1 psi = 6 894.757 Pa,
        // 1 ft = 0.3048 m; 100 °C = 212 °F.
        let u = Units::UsCustomary;
        assert!((u.from_display(Quantity::Pressure, 1.0) - 6894.757).abs() < 1e-3);
        assert!((u.from_display(Quantity::Stress, 1.0) - 6.894_757e6).abs() < 1.0);
        assert!((u.to_display(Quantity::Force, LBF_N) - 1.0).abs() < 1e-12);
        assert!((u.to_display(Quantity::Temperature, 100.0) - 212.0).abs() < 1e-12);
        assert!((u.to_display(Quantity::CableLength, 0.3048) - 1.0).abs() < 1e-12);
        // 11.7 ppm/°C (a steel) is 6.5 ppm/°F.
        assert!((u.to_display(Quantity::ExpansionCoefficient, 11.7e-6) - 6.5).abs() < 1e-9);
        // 1 W/in² = 1 / 0.0254² W/m² = 1550.0031 W/m².
        assert!((u.from_display(Quantity::PowerDensity, 1.0) - 1550.0031).abs() < 1e-3);
    }

    #[test]
    fn fixed_places_never_show_a_negative_zero() {
        assert_eq!(fixed_text(-0.0, 4), "0.0000");
        assert_eq!(fixed_text(-0.000_04, 4), "0.0000");
        assert_eq!(fixed_text(-0.000_06, 4), "-0.0001");
        assert_eq!(fixed_text(-1.5, 1), "-1.5");
        assert_eq!(fixed_text(0.25, 3), "0.250");
        assert_eq!(fixed_text(f64::NAN, 2), "—");
    }

    #[test]
    fn digits_follow_the_resolution() {
        let si = Units::Si;
        assert_eq!(si.format(Quantity::Length, 0.01809), "18.09 mm");
        assert_eq!(si.format(Quantity::Length, 0.0), "0 mm");
        assert_eq!(
            Units::UsCustomary.format(Quantity::Length, 0.45),
            "17.717 in"
        );
        assert_eq!(si.format(Quantity::Force, 12_345.0), "12345 N");
        assert_eq!(si.format(Quantity::Force, 1.5), "1.500 N");
        assert_eq!(si.format(Quantity::Temperature, 23.0), "23.0 °C");
        assert_eq!(
            Units::UsCustomary.format(Quantity::Temperature, -10.0),
            "14.0 °F"
        );
        assert_eq!(si.format(Quantity::Length, -1e-9), "0.00 mm");
        assert_eq!(si.format(Quantity::Force, f64::NAN), "— N");
    }

    #[test]
    fn tables_show_zero_and_values_below_resolution() {
        let si = Units::Si;
        assert_eq!(si.format_table_number(Quantity::Strain, 0.0), "0");
        assert_eq!(si.format_table_number(Quantity::Strain, 1e-9), "< 0.1");
        assert_eq!(si.format_table_number(Quantity::Strain, -2.5e-6), "-2.5");
        assert_eq!(si.format_table_number(Quantity::Plain, 1e-7), "< 0.001");
        assert_eq!(si.format_table_number(Quantity::Plain, 0.123456), "0.1235");
    }

    #[test]
    fn step_decimals_of_common_steps() {
        assert_eq!(step_decimals(0.01), 2);
        assert_eq!(step_decimals(0.001), 3);
        assert_eq!(step_decimals(0.1), 1);
        assert_eq!(step_decimals(0.5), 1);
        assert_eq!(step_decimals(0.25), 2);
        assert_eq!(step_decimals(1.0), 0);
    }

    #[test]
    fn sensitivities_are_given_per_a_readable_unit() {
        // 1 kip = 1000 lbf; 1 ksi = 1000 psi (NIST SP 811, Appendix B).
        let (kip, label) = Units::UsCustomary.per_unit(Quantity::Force);
        assert_eq!(label, "kip");
        assert!((kip - 4448.2216).abs() < 1e-3);
        assert_eq!(Units::Si.per_unit(Quantity::Pressure), (1e6, "MPa"));
        let (f, l) = Units::UsCustomary.per_unit(Quantity::TemperatureChange);
        assert_eq!(l, "°F");
        assert!((f * 1.8 - 1.0).abs() < 1e-12);
    }
}
