//! Applying arrangements to a part: catalogue entries and chooser results become gauges and
//! bridge arms, with the bridge factor worked out from the part.

use gw_bridge::arrangement::{ArmSlot, CatalogueEntry};
use gw_bridge::chooser::RankedArrangement;
use gw_bridge::{ArmElement, Bridge, BridgeModel, PlacedGauge, Setup};
use gw_mechanics::{LoadVector, QuadratureOrder};

use crate::document::{BridgePlan, Part, PlanArm, PlanGauge, StockGauge, stock_name_for};
use crate::validate::bridge_from_plan;

/// A gauge id not yet used on the part: "G1", "G2", …
pub fn next_gauge_id(part: &Part) -> String {
    (1..)
        .map(|n| format!("G{n}"))
        .find(|id| part.gauges.iter().all(|g| &g.id != id))
        .unwrap_or_else(|| "G".to_owned())
}

/// Bridge factor that makes the instrument display the strain the first active grid sees from
/// the wanted load: Σ±ε / ε(first grid), from grid-averaged strains per unit wanted load.
/// Falls back to 1 when the bridge does not respond.
pub fn bridge_factor_for(
    part: &Part,
    gauges: &[PlacedGauge],
    plan: &BridgePlan,
    reference_temperature_c: f64,
) -> f64 {
    let Ok(bridge) = bridge_from_plan(part, gauges, plan) else {
        return 1.0;
    };
    bridge_factor_of(part, gauges, &bridge, reference_temperature_c)
}

/// [`bridge_factor_for`] of a bridge already resolved.
pub fn bridge_factor_of(
    part: &Part,
    gauges: &[PlacedGauge],
    bridge: &Bridge,
    reference_temperature_c: f64,
) -> f64 {
    let setup = Setup {
        member: &part.member,
        gauges,
        reference_temperature_c,
        quadrature: QuadratureOrder::default(),
    };
    BridgeModel::new(&setup, bridge)
        .map(|model| bridge_factor_of_model(&model))
        .unwrap_or(1.0)
}

/// [`bridge_factor_for`] from a prepared model: Σ±ε / ε(first active grid) per unit of the
/// wanted load, 1 when the bridge does not respond.
pub fn bridge_factor_of_model(model: &BridgeModel) -> f64 {
    let bridge = model.bridge();
    let unit = LoadVector::unit(bridge.wanted);
    let signs = gw_bridge::model::ARM_SIGNS;
    let mut sum = 0.0;
    let mut first = None;
    for (k, sign) in signs.iter().enumerate() {
        if matches!(bridge.arms[k], ArmElement::Grid(_)) {
            let e = model.grid_strains(k, &unit)[2];
            sum += sign * e;
            first.get_or_insert(e * sign);
        }
    }
    match first {
        Some(f) if f.abs() > 0.0 && (sum / f).is_finite() && (sum / f).abs() > 1e-9 => {
            (sum / f).abs()
        }
        _ => 1.0,
    }
}

/// The gauge type catalogue entries are placed with: the stock type of the part's first gauge
/// (without its lot's values), or the default single grid.
pub fn catalogue_spec(project: &crate::Project, part: &Part) -> gw_bridge::GaugeSpec {
    part.gauges
        .first()
        .and_then(|g| project.stock_entry(&g.stock))
        .map(|s| s.spec.clone())
        .unwrap_or_else(|| crate::document::default_gauge_spec(gw_bridge::GaugePattern::SingleGrid))
}

/// What the chooser is asked for bridge `plan` of `part`: its wanted load at the largest value
/// the part's load cases give it, against the others they carry (largest magnitudes), over the
/// widest temperature range of the cases, in the bridge's own wiring, excitation and channel.
pub fn chooser_request(
    project: &crate::Project,
    part: &Part,
    plan: &BridgePlan,
) -> Result<gw_bridge::chooser::ChooserRequest, String> {
    use gw_mechanics::LoadComponent;
    let expected = crate::validate::expected_magnitudes(part);
    let magnitude = expected
        .iter()
        .find(|(c, _)| *c == plan.wanted)
        .map(|(_, m)| *m)
        .filter(|m| *m > 0.0)
        .ok_or_else(|| {
            format!(
                "no load case applies {}; give it its rated value in a load case, then suggest again",
                plan.wanted.name()
            )
        })?;
    let unwanted = expected
        .iter()
        .filter(|(c, _)| *c != plan.wanted && *c != LoadComponent::TemperatureChange)
        .copied()
        .collect();
    // Part temperatures in the document; the chooser works in changes from the reference.
    let t_ref = project.reference_temperature_c;
    let range = crate::document::temperature_span(&part.load_cases)
        .map_or((-20.0, 40.0), |(lo, hi)| (lo - t_ref, hi - t_ref));
    let spec = catalogue_spec(project, part);
    Ok(gw_bridge::chooser::ChooserRequest {
        wanted: plan.wanted,
        wanted_magnitude: magnitude,
        unwanted,
        temperature_range_c: range,
        reference_temperature_c: project.reference_temperature_c,
        template: crate::validate::bridge_settings(plan),
        completion: CatalogueEntry::completion_for(&spec),
        tolerances: part.tolerances,
        keep: 8,
    })
}

/// Every assignment of the part's placed grids to the arms of bridge `bridge`, ranked by the
/// error each leaves in the wanted load at its rated value ([`chooser_request`]).
pub fn suggest(
    project: &crate::Project,
    part: &Part,
    bridge: usize,
) -> Result<Vec<RankedArrangement>, String> {
    let plan = part.bridges.get(bridge).ok_or("there is no such bridge")?;
    let request = chooser_request(project, part, plan)?;
    let gauges = project.placed_gauges(part);
    gw_bridge::chooser::choose(&part.member, &gauges, &request, QuadratureOrder::default())
        .map_err(|e| e.to_string())
}

/// The bridge as wired, judged as the chooser judges its suggestions (`None` when it is not
/// wired, does not read its wanted load positively or reads less than one count).
pub fn assess_wired(
    project: &crate::Project,
    part: &Part,
    bridge: usize,
) -> Result<Option<RankedArrangement>, String> {
    let plan = part.bridges.get(bridge).ok_or("there is no such bridge")?;
    let gauges = project.placed_gauges(part);
    let Ok(wired) = bridge_from_plan(part, &gauges, plan) else {
        return Ok(None);
    };
    let request = chooser_request(project, part, plan)?;
    gw_bridge::chooser::assess(
        &part.member,
        &gauges,
        &request,
        &wired.arms,
        QuadratureOrder::default(),
    )
    .map_err(|e| e.to_string())
}

/// Adds the entry's gauges to the part (with new ids, their data in the project's gauge stock)
/// and sets the bridge's arms and arrangement name. The bridge factor follows from the part.
pub fn apply_catalogue_entry(
    part: &mut Part,
    stock: &mut Vec<StockGauge>,
    bridge: usize,
    entry: &CatalogueEntry,
) {
    let mut ids = Vec::new();
    for g in &entry.gauges {
        let id = next_gauge_id(part);
        ids.push(id.clone());
        part.gauges.push(PlanGauge {
            id,
            stock: stock_name_for(stock, &g.spec),
            lot: None,
            position: g.position,
            angle_rad: g.angle_rad,
        });
    }
    let Some(plan) = part.bridges.get_mut(bridge) else {
        return;
    };
    let completion = entry
        .gauges
        .first()
        .map(|g| CatalogueEntry::completion_for(&g.spec))
        .unwrap_or(gw_bridge::CompletionResistor {
            ohm: 350.0,
            tolerance: 0.0005,
            tcr_per_c: 5e-6,
        });
    let id = |gauge: usize| ids.get(gauge).cloned().unwrap_or_default();
    plan.arms = entry.arms.map(|slot| match slot {
        ArmSlot::Grid { gauge, element } => PlanArm::Grid {
            gauge: id(gauge),
            grid: element + 1,
        },
        ArmSlot::Dummy { gauge, element } => PlanArm::Dummy {
            gauge: id(gauge),
            grid: element + 1,
        },
        ArmSlot::Completion => PlanArm::Completion(completion),
    });
    plan.arrangement = entry.name.clone();
    plan.bridge_factor_override = None;
}

/// Rewires a bridge to a ranked chooser entry (grids already on the part, indices into its
/// gauge list).
pub fn apply_ranked(part: &mut Part, bridge: usize, ranked: &RankedArrangement) {
    let id = |g: usize| part.gauges.get(g).map(|p| p.id.clone()).unwrap_or_default();
    let arms = ranked.arms.map(|a| match a {
        ArmElement::Grid(g) => PlanArm::Grid {
            gauge: id(g.gauge),
            grid: g.element + 1,
        },
        ArmElement::Dummy(g) => PlanArm::Dummy {
            gauge: id(g.gauge),
            grid: g.element + 1,
        },
        ArmElement::Completion(c) => PlanArm::Completion(c),
    });
    let Some(plan) = part.bridges.get_mut(bridge) else {
        return;
    };
    plan.arms = arms;
    plan.arrangement = "Suggested arrangement".into();
    plan.bridge_factor_override = None;
}
