//! The catalogue of standard bridge arrangements, generated for the current part.
//!
//! Each entry says which gauges to place (positions and directions on this part) and what goes
//! in each arm. The bridge factor is computed from the part: the bridge's Σ±ε per unit of the
//! wanted load divided by the first active grid's strain, so that an instrument set to it
//! displays the strain that grid sees from the wanted load.

mod layouts;

use gw_mechanics::transverse::CALIBRATION_POISSON_RATIO;
use gw_mechanics::{LoadComponent, LoadVector, Member, QuadratureOrder, grid_average_state};
use serde::{Deserialize, Serialize};

use crate::bridge::CompletionResistor;
use crate::gauge::{GaugeSpec, PlacedGauge};

/// What goes in an arm of a catalogue entry (gauge indices refer to the entry's own gauges).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum ArmSlot {
    /// Grid `element` of the entry's gauge `gauge`.
    Grid { gauge: usize, element: usize },
    /// A dummy identical to that grid.
    Dummy { gauge: usize, element: usize },
    /// A completion resistor equal to the grid resistance.
    Completion,
}

/// One standard arrangement on this part.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct CatalogueEntry {
    /// Plain descriptive name.
    pub name: String,
    /// One line on where its grids go and what it reads, cancels and leaves on this part.
    pub description: String,
    /// Gauges to place.
    pub gauges: Vec<PlacedGauge>,
    /// Arms 1..4.
    pub arms: [ArmSlot; 4],
}

impl CatalogueEntry {
    /// The completion resistor this entry uses for `spec` (tolerance ±0.05 %, 5 ppm/°C:
    /// common practice for bridge completion resistors).
    pub fn completion_for(spec: &GaugeSpec) -> CompletionResistor {
        CompletionResistor {
            ohm: spec.resistance_ohm,
            tolerance: 0.0005,
            tcr_per_c: 5e-6,
        }
    }
}

/// Standard arrangements for measuring `wanted` on `member` at axial station `station_x_m`
/// (beams, shafts, vessels; the plate uses the point across the load from the hole), all with
/// grids of `spec`. Only entries that read the wanted load on this part are offered: each is
/// wired so that a positive wanted load reads positive, and its description says what it
/// reads, cancels and leaves on this part, worked out from the part's own strain field.
pub fn catalogue(
    member: &Member,
    wanted: LoadComponent,
    station_x_m: f64,
    spec: &GaugeSpec,
) -> Vec<CatalogueEntry> {
    layouts::layouts(member, wanted, station_x_m, spec)
        .into_iter()
        .filter_map(|e| fit_to_part(member, wanted, e))
        .collect()
}

/// Linear responses of one entry's arms on the part: ΔR/R per unit of each load component and
/// at a 10 °C rise (mechanically free), signed by arm.
struct ArmResponses {
    /// (signed sum, sum of magnitudes) per component.
    per_component: [(f64, f64); LoadComponent::COUNT],
    /// (signed sum, sum of magnitudes) of the thermal output at a 10 °C rise.
    thermal: (f64, f64),
}

fn responses(member: &Member, entry: &CatalogueEntry) -> Option<ArmResponses> {
    let mut per_component = [(0.0, 0.0); LoadComponent::COUNT];
    let mut thermal = (0.0, 0.0);
    let cte = member.material().cte_per_c;
    for (slot, sign) in entry.arms.iter().zip(crate::model::ARM_SIGNS) {
        let (gauge, element, active) = match *slot {
            ArmSlot::Grid { gauge, element } => (gauge, element, true),
            ArmSlot::Dummy { gauge, element } => (gauge, element, false),
            ArmSlot::Completion => continue,
        };
        let placed = entry.gauges.get(gauge)?;
        let spec = &placed.spec;
        let th = spec.gauge_factor
            * spec.thermal_output.apparent_strain(
                cte,
                spec.transverse_sensitivity,
                spec.gauge_factor,
                0.0,
                10.0,
            );
        thermal.0 += sign * th;
        thermal.1 += th.abs();
        if !active {
            continue;
        }
        let footprint = placed.footprint(element);
        for &c in member.components().iter() {
            if c == LoadComponent::TemperatureChange {
                continue;
            }
            let unit = LoadVector::unit(c);
            let st = grid_average_state(member, &footprint, &unit, QuadratureOrder::default())
                .ok()?
                .mechanical_strain();
            let a = st.along(footprint.angle_rad);
            let t = st.along(footprint.angle_rad + std::f64::consts::FRAC_PI_2);
            let kt = spec.transverse_sensitivity;
            let d = spec.gauge_factor * (a + kt * t) / (1.0 - CALIBRATION_POISSON_RATIO * kt);
            per_component[c.index()].0 += sign * d;
            per_component[c.index()].1 += d.abs();
        }
    }
    Some(ArmResponses {
        per_component,
        thermal,
    })
}

/// Below this share of the grids' own responses a signed sum is a cancellation (rounding of
/// the strain field, not a reading).
const CANCELLED: f64 = 1e-6;

/// Below this ΔR/R per unit of a component the grids see nothing of it (rounding of a zero
/// strain; a real response per pascal is still some 1e-12).
const UNSEEN: f64 = 1e-20;

/// The entry as it works on this part, or `None` when its grids do not all lie on the part or
/// it does not read the wanted load (its output is zero by symmetry here).
fn fit_to_part(
    member: &Member,
    wanted: LoadComponent,
    mut entry: CatalogueEntry,
) -> Option<CatalogueEntry> {
    let on_part = entry
        .gauges
        .iter()
        .all(|pg| member.state(&pg.position, &LoadVector::ZERO).is_ok());
    if !on_part {
        return None;
    }
    let r = responses(member, &entry)?;
    let (sum, magnitude) = r.per_component[wanted.index()];
    if magnitude < UNSEEN || sum.abs() <= CANCELLED * magnitude {
        return None;
    }
    if sum < 0.0 {
        // Swapping the arms of each half reverses every term: arms 1 ↔ 2 and 3 ↔ 4.
        let [a1, a2, a3, a4] = entry.arms;
        entry.arms = [a2, a1, a4, a3];
    }
    // Output relative to its most strained grid's.
    let mut largest: f64 = 0.0;
    for slot in entry.arms {
        if let ArmSlot::Grid { gauge, element } = slot {
            let one = single_grid_response(member, &entry, (gauge, element), wanted)?;
            largest = largest.max(one.abs());
        }
    }
    let factor = sum.abs() / largest;
    entry.description = describe(member, wanted, &entry.description, &r, factor);
    Some(entry)
}

fn single_grid_response(
    member: &Member,
    entry: &CatalogueEntry,
    (gauge, element): (usize, usize),
    wanted: LoadComponent,
) -> Option<f64> {
    let alone = CatalogueEntry {
        arms: [
            ArmSlot::Grid { gauge, element },
            ArmSlot::Completion,
            ArmSlot::Completion,
            ArmSlot::Completion,
        ],
        ..entry.clone()
    };
    let (sum, _) = responses(member, &alone)?.per_component[wanted.index()];
    Some(sum)
}

/// The layout sentence followed by what the entry does on this part.
fn describe(
    member: &Member,
    wanted: LoadComponent,
    layout: &str,
    r: &ArmResponses,
    factor: f64,
) -> String {
    let mut cancels = Vec::new();
    let mut unseen = Vec::new();
    let mut shows = Vec::new();
    for &c in member.components().iter() {
        if c == wanted || c == LoadComponent::TemperatureChange {
            continue;
        }
        let (sum, magnitude) = r.per_component[c.index()];
        if magnitude < UNSEEN {
            unseen.push(c.name());
        } else if sum.abs() <= CANCELLED * magnitude {
            cancels.push(c.name());
        } else {
            shows.push(c.name());
        }
    }
    let (t_sum, t_magnitude) = r.thermal;
    let temperature = if t_magnitude == 0.0 {
        "temperature is left to the gauges' own compensation"
    } else if t_sum.abs() <= CANCELLED * t_magnitude {
        cancels.push("temperature");
        ""
    } else {
        "temperature shows"
    };
    let mut text = format!("{layout}; on this part it reads {factor:.2} × its most strained grid");
    if !cancels.is_empty() {
        text += &format!("; cancels {}", cancels.join(", "));
    }
    if !unseen.is_empty() {
        text += &format!("; its grids see no {}", unseen.join(", no "));
    }
    if !shows.is_empty() {
        text += &format!("; it also reads {}", shows.join(", "));
    }
    if !temperature.is_empty() {
        text += &format!("; {temperature}");
    }
    text
}
