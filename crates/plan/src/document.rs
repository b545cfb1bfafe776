//! The project document: what the engineer plans, saved as RON.

use gw_bridge::{
    Excitation, GaugeSpec, InstrumentSetting, InstrumentTemperature, LeadWire, LeadWiring,
    PlacedGauge, ShuntPlan, SignalChain, bridge::CompletionResistor,
    bridge_uncertainty::InstallationTolerances,
};
use gw_mechanics::{LoadComponent, LoadVector, Member};
use serde::{Deserialize, Serialize};

/// The format version this build writes and reads.
pub const FORMAT_VERSION: u32 = 1;

/// Paper size for the build sheet. Default: A4.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
pub enum PaperSize {
    /// ISO A4, 210 × 297 mm.
    #[default]
    A4,
    /// US Letter, 8.5 × 11 in.
    Letter,
}

/// A whole plan.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Project {
    /// Format version of the file.
    pub format_version: u32,
    /// Project name.
    pub name: String,
    /// Revision label.
    #[serde(default)]
    pub revision: String,
    /// Date of this revision (free text, e.g. 2026-12-01).
    #[serde(default)]
    pub date: String,
    /// Prepared by (name or initials).
    #[serde(default)]
    pub prepared_by: String,
    /// Checked by.
    #[serde(default)]
    pub checked_by: String,
    /// Paper size of the build sheet.
    #[serde(default)]
    pub paper: PaperSize,
    /// Temperature at which bridges are zeroed and gauge data apply, °C.
    pub reference_temperature_c: f64,
    /// Utilisation above which a margin warns, fraction (default 0.8, ours).
    #[serde(default = "default_warn")]
    pub warn_utilisation: f64,
    /// Lead colours of our own default scheme, by conductor role (editable).
    #[serde(default)]
    pub lead_colours: LeadColours,
    /// Parts.
    pub parts: Vec<Part>,
    /// Free notes.
    #[serde(default)]
    pub notes: String,
}

fn default_warn() -> f64 {
    gw_bridge::margins::DEFAULT_WARN_UTILISATION
}

/// Lead colours by conductor role. The default scheme is the project's own; edit to the
/// site's practice.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct LeadColours {
    /// Excitation +.
    pub excitation_pos: String,
    /// Excitation −.
    pub excitation_neg: String,
    /// Output +.
    pub output_pos: String,
    /// Output −.
    pub output_neg: String,
    /// Sense leads.
    pub sense: String,
    /// Shield / drain.
    pub shield: String,
}

impl Default for LeadColours {
    fn default() -> Self {
        Self {
            excitation_pos: "orange".into(),
            excitation_neg: "brown".into(),
            output_pos: "violet".into(),
            output_neg: "grey".into(),
            sense: "pink".into(),
            shield: "bare".into(),
        }
    }
}

/// One part with its loads, gauges and bridges.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Part {
    /// Name, e.g. "Drum drive shaft".
    pub name: String,
    /// The mechanics model.
    pub member: Member,
    /// Library key of the material, if it came from the library.
    #[serde(default)]
    pub material_key: Option<String>,
    /// Load cases.
    pub load_cases: Vec<LoadCase>,
    /// Placed gauges.
    pub gauges: Vec<PlacedGauge>,
    /// Bridges.
    pub bridges: Vec<BridgePlan>,
    /// Resolution the engineer requires, m/m.
    pub required_resolution_strain: f64,
    /// How well the installation is known (uncertainty inputs).
    #[serde(default)]
    pub tolerances: InstallationTolerances,
    /// Datum for dimensions on drawings: (x, s) on the part's surface, m.
    #[serde(default)]
    pub datum_m: (f64, f64),
}

/// A named load case.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct LoadCase {
    /// Name, e.g. "Rated pull".
    pub name: String,
    /// Component values at full load (SI units of each component). A temperature change here
    /// is the part's temperature during the case.
    pub loads: Vec<(LoadComponent, f64)>,
    /// Points on the ramp from zero to full load for plots.
    #[serde(default = "default_ramp")]
    pub ramp_steps: u32,
    /// Temperature range for apparent-strain plots, as changes from the reference, °C.
    pub temperature_range_c: (f64, f64),
    /// Whether the case is applied many times (fatigue margins apply).
    #[serde(default)]
    pub cycled: bool,
    /// The case involves a proof load, pressure test or similar (cautions shown).
    #[serde(default)]
    pub proof_test: bool,
}

fn default_ramp() -> u32 {
    10
}

impl LoadCase {
    /// The full-load vector.
    pub fn load_vector(&self) -> LoadVector {
        LoadVector::from_pairs(&self.loads)
    }

    /// The value of one component (0 if absent).
    pub fn value(&self, component: LoadComponent) -> f64 {
        self.load_vector()[component]
    }

    /// Sets one component, adding it if absent.
    pub fn set_value(&mut self, component: LoadComponent, value: f64) {
        if let Some(entry) = self.loads.iter_mut().find(|(c, _)| *c == component) {
            entry.1 = value;
        } else {
            self.loads.push((component, value));
        }
    }
}

/// What goes in one arm, by gauge id.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum PlanArm {
    /// Grid number `grid` (1-based) of gauge `gauge`.
    Grid { gauge: String, grid: usize },
    /// A dummy identical to that grid.
    Dummy { gauge: String, grid: usize },
    /// A completion resistor.
    Completion(CompletionResistor),
}

/// A bridge in the plan.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct BridgePlan {
    /// Name, e.g. "Drive torque".
    pub name: String,
    /// Name of the arrangement it was built from (for display).
    #[serde(default)]
    pub arrangement: String,
    /// Arms 1..4.
    pub arms: [PlanArm; 4],
    /// Lead wiring.
    pub wiring: LeadWiring,
    /// Lead wires.
    pub lead: LeadWire,
    /// Excitation.
    pub excitation: Excitation,
    /// Amplifier input resistance, Ω (`None` = ideal).
    #[serde(default)]
    pub amplifier_input_ohm: Option<f64>,
    /// Instrument conversion.
    pub instrument: InstrumentSetting,
    /// Acquisition channel.
    pub signal: SignalChain,
    /// The load component the bridge measures.
    pub wanted: LoadComponent,
    /// Instrument temperature.
    #[serde(default)]
    pub instrument_temperature: InstrumentTemperature,
    /// Shunt calibration.
    #[serde(default)]
    pub shunt: Option<ShuntPlan>,
    /// Acquisition channel number on the instrument.
    #[serde(default)]
    pub channel: u32,
}

/// A gauge type used by the demo and offered by the app when adding gauges: a 3 mm, 350 Ω
/// grid matched to steel. Values are typical of foil gauges (common practice).
pub fn default_gauge_spec(pattern: gw_bridge::GaugePattern) -> GaugeSpec {
    GaugeSpec {
        pattern,
        grid_length_m: 3e-3,
        grid_width_m: 1.8e-3,
        resistance_ohm: 350.0,
        resistance_tolerance: 0.003,
        gauge_factor: 2.05,
        gauge_factor_tolerance: 0.01,
        transverse_sensitivity: 0.007,
        strain_limit: 0.03,
        fatigue_strain_limit: 1.5e-3,
        thermal_output: gw_bridge::ThermalOutput {
            matched_cte_per_c: 10.8e-6,
            lot_polynomial: vec![-32e-6, 2.2e-6, -3.5e-8, 1.4e-10],
        },
        gauge_factor_temp_coeff_per_c: 0.0001,
        // Power-density limits depend on heat sinking; 3 kW/m² (about 2 W/in²) is a common
        // practice figure for a thick steel part.
        max_power_density_w_m2: 3000.0,
    }
}
