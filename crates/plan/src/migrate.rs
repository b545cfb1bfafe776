//! Reading files of earlier format versions.
//!
//! Version 1 kept the full gauge data inside every placed gauge and a typed bridge factor in
//! every bridge. Version 2 keeps gauge data once, in the project's gauge stock, and computes
//! the bridge factor from the arrangement and the part; a version-1 factor that differs from
//! the computed one is kept as an override with its reason, so the evaluation does not change.
//!
//! Versions 1 and 2 stored each load case's temperature range as changes from the reference
//! temperature; version 3 stores the part's own temperatures, so reading an older file adds
//! the reference to both ends (the evaluation does not change).

use gw_bridge::bridge_uncertainty::InstallationTolerances;
use gw_bridge::{
    Excitation, InstrumentSetting, InstrumentTemperature, LeadWire, LeadWiring, PlacedGauge,
    ShuntPlan, SignalChain,
};
use gw_mechanics::{LoadComponent, Member};
use serde::Deserialize;

use crate::document::{
    BridgeFactorOverride, BridgePlan, FORMAT_VERSION, LeadColours, LoadCase, PaperSize, Part,
    PlanArm, PlanGauge, Project, StockGauge, stock_name_for,
};

/// Reason recorded for a version-1 bridge factor that differs from the computed one.
pub const KEPT_FROM_VERSION_1: &str =
    "kept from a version-1 file, where the bridge factor was typed; remove to use the computed one";

#[derive(Deserialize)]
#[serde(deny_unknown_fields)]
pub(crate) struct ProjectV1 {
    /// Read (it says the file is version 1) and otherwise unused.
    #[serde(default, rename = "format_version")]
    _format_version: u32,
    name: String,
    #[serde(default)]
    revision: String,
    #[serde(default)]
    date: String,
    #[serde(default)]
    prepared_by: String,
    #[serde(default)]
    checked_by: String,
    #[serde(default)]
    paper: PaperSize,
    reference_temperature_c: f64,
    #[serde(default = "default_warn")]
    warn_utilisation: f64,
    #[serde(default)]
    lead_colours: LeadColours,
    parts: Vec<PartV1>,
    #[serde(default)]
    notes: String,
}

fn default_warn() -> f64 {
    gw_bridge::margins::DEFAULT_WARN_UTILISATION
}

#[derive(Deserialize)]
#[serde(deny_unknown_fields)]
struct PartV1 {
    name: String,
    member: Member,
    #[serde(default)]
    material_key: Option<String>,
    load_cases: Vec<LoadCase>,
    gauges: Vec<PlacedGauge>,
    bridges: Vec<BridgePlanV1>,
    required_resolution_strain: f64,
    #[serde(default)]
    tolerances: InstallationTolerances,
    #[serde(default)]
    datum_m: (f64, f64),
}

#[derive(Deserialize)]
#[serde(deny_unknown_fields)]
struct BridgePlanV1 {
    name: String,
    #[serde(default)]
    arrangement: String,
    arms: [PlanArm; 4],
    wiring: LeadWiring,
    lead: LeadWire,
    excitation: Excitation,
    #[serde(default)]
    amplifier_input_ohm: Option<f64>,
    instrument: InstrumentSetting,
    signal: SignalChain,
    wanted: LoadComponent,
    #[serde(default)]
    instrument_temperature: InstrumentTemperature,
    #[serde(default)]
    shunt: Option<ShuntPlan>,
    #[serde(default)]
    channel: u32,
}

/// Turns load-case temperature ranges stored as changes from the reference (versions 1 and 2)
/// into part temperatures (version 3), and marks the project as the current version.
pub(crate) fn ranges_to_part_temperatures(project: &mut Project) {
    let t_ref = project.reference_temperature_c;
    for case in project
        .parts
        .iter_mut()
        .flat_map(|p| p.load_cases.iter_mut())
    {
        let (lo, hi) = case.temperature_range_c;
        case.temperature_range_c = (lo + t_ref, hi + t_ref);
    }
    project.format_version = FORMAT_VERSION;
}

impl ProjectV1 {
    /// The same plan in the current format.
    pub(crate) fn upgrade(self) -> Project {
        let mut stock = Vec::new();
        let reference = self.reference_temperature_c;
        let parts = self
            .parts
            .into_iter()
            .map(|p| upgrade_part(p, &mut stock, reference))
            .collect();
        Project {
            format_version: FORMAT_VERSION,
            name: self.name,
            revision: self.revision,
            date: self.date,
            prepared_by: self.prepared_by,
            checked_by: self.checked_by,
            paper: self.paper,
            reference_temperature_c: reference,
            warn_utilisation: self.warn_utilisation,
            zero_band_fraction: gw_bridge::zero_band::DEFAULT_ZERO_BAND_FRACTION,
            marking_templates: true,
            lead_colours: self.lead_colours,
            gauge_stock: stock,
            parts,
            notes: self.notes,
            records: Default::default(),
        }
    }
}

fn upgrade_part(p: PartV1, stock: &mut Vec<StockGauge>, reference_c: f64) -> Part {
    let gauges = p
        .gauges
        .iter()
        .map(|g| PlanGauge {
            id: g.id.clone(),
            stock: stock_name_for(stock, &g.spec),
            lot: None,
            position: g.position,
            angle_rad: g.angle_rad,
        })
        .collect();
    let mut part = Part {
        name: p.name,
        member: p.member,
        material_key: p.material_key,
        load_cases: p.load_cases,
        gauges,
        bridges: Vec::new(),
        required_resolution_strain: p.required_resolution_strain,
        tolerances: p.tolerances,
        datum_m: p.datum_m,
    };
    for b in p.bridges {
        let typed = b.instrument.bridge_factor;
        let mut plan = BridgePlan {
            name: b.name,
            arrangement: b.arrangement,
            arms: b.arms,
            wiring: b.wiring,
            lead: b.lead,
            excitation: b.excitation,
            amplifier_input_ohm: b.amplifier_input_ohm,
            gauge_factor_setting: b.instrument.gauge_factor,
            bridge_factor_override: None,
            signal: b.signal,
            wanted: b.wanted,
            instrument_temperature: b.instrument_temperature,
            shunt: b.shunt,
            channel: b.channel,
            required_accuracy: None,
            recovery: Default::default(),
            calibration: None,
        };
        let computed = crate::arrangements::bridge_factor_for(&part, &p.gauges, &plan, reference_c);
        if (computed - typed).abs() > 1e-12 * typed.abs().max(1.0) {
            plan.bridge_factor_override = Some(BridgeFactorOverride {
                value: typed,
                reason: KEPT_FROM_VERSION_1.to_owned(),
            });
        }
        part.bridges.push(plan);
    }
    part
}
