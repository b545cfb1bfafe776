//! Applying arrangements to a part: catalogue entries and chooser results become gauges and
//! bridge arms, with the bridge factor worked out from the part.

use gw_bridge::arrangement::{ArmSlot, CatalogueEntry};
use gw_bridge::chooser::RankedArrangement;
use gw_bridge::{ArmElement, BridgeModel, Setup};
use gw_mechanics::{LoadVector, QuadratureOrder};

use crate::document::{BridgePlan, Part, PlanArm};
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
pub fn bridge_factor_for(part: &Part, plan: &BridgePlan, reference_temperature_c: f64) -> f64 {
    let Ok(bridge) = bridge_from_plan(part, plan) else {
        return 1.0;
    };
    let setup = Setup {
        member: &part.member,
        gauges: &part.gauges,
        reference_temperature_c,
        quadrature: QuadratureOrder::default(),
    };
    let Ok(model) = BridgeModel::new(&setup, &bridge) else {
        return 1.0;
    };
    let unit = LoadVector::unit(plan.wanted);
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

/// Adds the entry's gauges to the part (with new ids) and sets the bridge's arms, arrangement
/// name and bridge factor.
pub fn apply_catalogue_entry(
    part: &mut Part,
    bridge: usize,
    entry: &CatalogueEntry,
    reference_temperature_c: f64,
) {
    let mut ids = Vec::new();
    for g in &entry.gauges {
        let mut placed = g.clone();
        placed.id = next_gauge_id(part);
        ids.push(placed.id.clone());
        part.gauges.push(placed);
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
    let plan_copy = plan.clone();
    let bf = bridge_factor_for(part, &plan_copy, reference_temperature_c);
    if let Some(plan) = part.bridges.get_mut(bridge) {
        plan.instrument.bridge_factor = bf;
    }
}

/// Rewires a bridge to a ranked chooser entry (grids already on the part).
pub fn apply_ranked(
    part: &mut Part,
    bridge: usize,
    ranked: &RankedArrangement,
    reference_temperature_c: f64,
) {
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
    let plan_copy = plan.clone();
    let bf = bridge_factor_for(part, &plan_copy, reference_temperature_c);
    if let Some(plan) = part.bridges.get_mut(bridge) {
        plan.instrument.bridge_factor = bf;
    }
}
