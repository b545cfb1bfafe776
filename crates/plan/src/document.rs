//! The project document: what the engineer plans, saved as RON.

use gw_bridge::{
    Excitation, GaugeSpec, InstrumentTemperature, LeadWire, LeadWiring, PlacedGauge, ShuntPlan,
    SignalChain, ThermalOutput, bridge::CompletionResistor,
    bridge_uncertainty::InstallationTolerances,
};
use gw_mechanics::{LoadComponent, LoadVector, Member, SurfacePoint};
use serde::{Deserialize, Serialize};

pub use crate::installation::{BridgeRecord, GridRecord, InPlaceCalibration, InstallationRecords};

/// The format version this build writes. Version 1 files (gauge data inside every gauge, a
/// typed bridge factor) and version 2 files (temperature ranges as changes from the
/// reference) are read and migrated by [`crate::io`].
pub const FORMAT_VERSION: u32 = 3;

/// Paper size for the build sheet. Default: A4.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum PaperSize {
    /// ISO A4, 210 × 297 mm.
    #[default]
    A4,
    /// US Letter, 8.5 × 11 in.
    Letter,
}

/// A whole plan.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
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
    /// Whether the build sheet ends with a 1:1 marking template of each face that carries
    /// gauges (default: yes).
    #[serde(default = "default_marking_templates")]
    pub marking_templates: bool,
    /// Temperature at which bridges are zeroed and gauge data apply, °C.
    pub reference_temperature_c: f64,
    /// Utilisation above which a margin warns, fraction (default 0.8, ours).
    #[serde(default = "default_warn")]
    pub warn_utilisation: f64,
    /// Fraction of a bridge's full scale its zero band may take before a finding notes it
    /// (default 0.1, common practice).
    #[serde(default = "default_zero_band_fraction")]
    pub zero_band_fraction: f64,
    /// Lead colours of our own default scheme, by conductor role (editable).
    #[serde(default)]
    pub lead_colours: LeadColours,
    /// Gauge types in stock for this project, referred to by name from each placed gauge.
    #[serde(default)]
    pub gauge_stock: Vec<StockGauge>,
    /// Parts.
    pub parts: Vec<Part>,
    /// Free notes.
    #[serde(default)]
    pub notes: String,
    /// What the technician recorded after installation (empty until entered or imported).
    #[serde(default, skip_serializing_if = "InstallationRecords::is_empty")]
    pub records: InstallationRecords,
}

fn default_warn() -> f64 {
    gw_bridge::margins::DEFAULT_WARN_UTILISATION
}

fn default_marking_templates() -> bool {
    true
}

fn default_zero_band_fraction() -> f64 {
    gw_bridge::zero_band::DEFAULT_ZERO_BAND_FRACTION
}

/// Lead colours by conductor role. The default scheme is the project's own; edit to the
/// site's practice.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
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
#[serde(deny_unknown_fields)]
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
    pub gauges: Vec<PlanGauge>,
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
#[serde(deny_unknown_fields)]
pub struct LoadCase {
    /// Name, e.g. "Rated pull".
    pub name: String,
    /// Component values at full load (SI units of each component). A temperature change here
    /// is the part's temperature during the case.
    pub loads: Vec<(LoadComponent, f64)>,
    /// Points on the ramp from zero to full load for plots.
    #[serde(default = "default_ramp")]
    pub ramp_steps: u32,
    /// The part's temperature range during the case (low, high), absolute, °C: the span of
    /// the apparent-strain plots and the temperature error. (Format versions 1 and 2 stored
    /// changes from the reference; reading them adds the reference.)
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

/// The union of the load cases' part-temperature ranges, °C; `None` without cases.
pub fn temperature_span(cases: &[LoadCase]) -> Option<(f64, f64)> {
    cases
        .iter()
        .map(|c| c.temperature_range_c)
        .reduce(|a, b| (a.0.min(b.0), a.1.max(b.1)))
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
#[serde(deny_unknown_fields)]
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
#[serde(deny_unknown_fields)]
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
    /// Gauge factor set on the instrument.
    pub gauge_factor_setting: f64,
    /// A bridge factor typed by the engineer instead of the one computed from the arrangement
    /// and the part (`None`: computed).
    #[serde(default)]
    pub bridge_factor_override: Option<BridgeFactorOverride>,
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
    /// The accuracy the engineer needs from this bridge (`None`: none stated).
    #[serde(default)]
    pub required_accuracy: Option<RequiredAccuracy>,
    /// Whether the bridge joins the part's load recovery. Default: it does.
    #[serde(default, skip_serializing_if = "LoadRecovery::is_default")]
    pub recovery: LoadRecovery,
    /// A sensitivity found by loading the installed bridge; when present it replaces the
    /// predicted one in the channel list (`None`: predicted).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub calibration: Option<InPlaceCalibration>,
}

/// Whether a bridge's reading enters the part's load recovery (the least-squares solve of
/// loads from several bridges). A channel that reports a strain, such as one grid of a
/// rosette, is left out. Default: included.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
pub enum LoadRecovery {
    /// The bridge's reading is one of the equations the loads are solved from.
    #[default]
    Included,
    /// The bridge reports its own reading only.
    LeftOut,
}

impl LoadRecovery {
    fn is_default(&self) -> bool {
        *self == LoadRecovery::Included
    }
}

/// How closely a bridge must read its wanted load: the predicted error (what the arrangement
/// leaks from unwanted loads, temperature, leads and the rest of the error breakdown) plus the
/// expanded uncertainty must stay inside it in every load case.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum RequiredAccuracy {
    /// ± this percentage of the wanted load in each case.
    PercentOfReading(f64),
    /// ± this much of the wanted load, in its SI unit (N, N·m, Pa, …).
    InMeasuredUnit(f64),
}

impl RequiredAccuracy {
    /// The error allowed when the wanted load is `value`, in its SI unit.
    pub fn allowed(self, value: f64) -> f64 {
        match self {
            RequiredAccuracy::PercentOfReading(p) => p / 100.0 * value.abs(),
            RequiredAccuracy::InMeasuredUnit(a) => a,
        }
    }

    /// The number as entered (percent or SI value).
    pub fn amount(self) -> f64 {
        match self {
            RequiredAccuracy::PercentOfReading(v) | RequiredAccuracy::InMeasuredUnit(v) => v,
        }
    }
}

impl BridgePlan {
    /// True when at least one arm holds an active grid.
    pub fn is_wired(&self) -> bool {
        self.arms.iter().any(|a| matches!(a, PlanArm::Grid { .. }))
    }
}

/// A bridge factor set by hand, with the reason for not using the computed one.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct BridgeFactorOverride {
    /// The bridge factor the instrument is set to.
    pub value: f64,
    /// Why the computed factor is not used (shown on the build sheet).
    pub reason: String,
}

/// A gauge type in the project's stock: what a data sheet gives, defined once.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct StockGauge {
    /// Name the placed gauges refer to, e.g. "3 mm single grid, 350 Ω".
    pub name: String,
    /// The data.
    pub spec: GaugeSpec,
}

/// The values of one gauge's lot where they differ from its stock type.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct GaugeLot {
    /// Lot number printed on the packet.
    #[serde(default)]
    pub lot_number: String,
    /// Nominal grid resistance of the lot, Ω.
    pub resistance_ohm: f64,
    /// Gauge factor of the lot.
    pub gauge_factor: f64,
    /// Gauge-factor tolerance of the lot, ± fraction.
    pub gauge_factor_tolerance: f64,
    /// Transverse sensitivity of the lot, fraction.
    pub transverse_sensitivity: f64,
    /// Thermal output of the lot.
    pub thermal_output: ThermalOutput,
}

impl GaugeLot {
    /// The lot values of a gauge type (the starting point of an override).
    pub fn from_spec(spec: &GaugeSpec) -> Self {
        Self {
            lot_number: String::new(),
            resistance_ohm: spec.resistance_ohm,
            gauge_factor: spec.gauge_factor,
            gauge_factor_tolerance: spec.gauge_factor_tolerance,
            transverse_sensitivity: spec.transverse_sensitivity,
            thermal_output: spec.thermal_output.clone(),
        }
    }

    /// The stock type with this lot's values.
    pub fn applied_to(&self, spec: &GaugeSpec) -> GaugeSpec {
        GaugeSpec {
            resistance_ohm: self.resistance_ohm,
            gauge_factor: self.gauge_factor,
            gauge_factor_tolerance: self.gauge_factor_tolerance,
            transverse_sensitivity: self.transverse_sensitivity,
            thermal_output: self.thermal_output.clone(),
            ..spec.clone()
        }
    }
}

/// A gauge placed on a part: a stock type (with its lot's values where they differ), a
/// position and a direction.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PlanGauge {
    /// Short identifier shown on drawings and the build sheet, e.g. "G1".
    pub id: String,
    /// Name of the stock type.
    pub stock: String,
    /// This gauge's lot values where they differ from the stock type.
    #[serde(default)]
    pub lot: Option<GaugeLot>,
    /// Centre of the grid area on the part's surface.
    pub position: SurfacePoint,
    /// Reference direction, radians from the local surface x axis.
    pub angle_rad: f64,
}

impl PlanGauge {
    /// The gauge as the measurement core sees it, or `None` when its stock type is missing.
    pub fn resolve(&self, stock: &[StockGauge]) -> Option<PlacedGauge> {
        let entry = stock.iter().find(|s| s.name == self.stock)?;
        let spec = match &self.lot {
            Some(lot) => lot.applied_to(&entry.spec),
            None => entry.spec.clone(),
        };
        Some(PlacedGauge {
            id: self.id.clone(),
            spec,
            position: self.position,
            angle_rad: self.angle_rad,
        })
    }
}

/// The gauges of a part as the measurement core sees them. Gauges whose stock type is missing
/// are left out (validation reports them first).
pub fn placed_gauges(stock: &[StockGauge], part: &Part) -> Vec<PlacedGauge> {
    part.gauges
        .iter()
        .filter_map(|g| g.resolve(stock))
        .collect()
}

impl Project {
    /// The stock type of that name.
    pub fn stock_entry(&self, name: &str) -> Option<&StockGauge> {
        self.gauge_stock.iter().find(|s| s.name == name)
    }

    /// The gauges of part `part` as the measurement core sees them.
    pub fn placed_gauges(&self, part: &Part) -> Vec<PlacedGauge> {
        placed_gauges(&self.gauge_stock, part)
    }
}

/// The name of the stock entry holding `spec`, adding an entry (named after its pattern, grid
/// length and resistance) when no entry holds the same data.
pub fn stock_name_for(stock: &mut Vec<StockGauge>, spec: &GaugeSpec) -> String {
    if let Some(s) = stock.iter().find(|s| s.spec == *spec) {
        return s.name.clone();
    }
    let base = stock_base_name(spec);
    let name = (1..)
        .map(|n| {
            if n == 1 {
                base.clone()
            } else {
                format!("{base} ({n})")
            }
        })
        .find(|n| stock.iter().all(|s| &s.name != n))
        .unwrap_or(base);
    stock.push(StockGauge {
        name: name.clone(),
        spec: spec.clone(),
    });
    name
}

/// The name a stock type gets from its data: pattern, grid length and resistance.
pub fn stock_base_name(spec: &GaugeSpec) -> String {
    format!(
        "{}, {} mm, {} Ω",
        spec.pattern.name(),
        format_number(spec.grid_length_m * 1e3),
        format_number(spec.resistance_ohm)
    )
}

/// "3", "1.5", "0.75": a short number for names.
fn format_number(v: f64) -> String {
    let s = format!("{v:.3}");
    s.trim_end_matches('0').trim_end_matches('.').to_owned()
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
            reference_gauge_factor: None,
            valid_range_c: None,
        },
        gauge_factor_temp_coeff_per_c: 0.0001,
        // Power-density limits depend on heat sinking; 3 kW/m² (about 2 W/in²) is a common
        // practice figure for a thick steel part.
        max_power_density_w_m2: 3000.0,
    }
}
