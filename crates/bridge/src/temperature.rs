//! Apparent strain of a bridge against temperature, split into its causes, and how much of it
//! the arrangement cancels.

use gw_mechanics::{LoadComponent, LoadVector};
use serde::Serialize;

use crate::bridge::{ArmElement, InstrumentTemperature};
use crate::error::BridgeError;
use crate::model::{ARM_SIGNS, BridgeModel};

/// Apparent (displayed) strain at one temperature with no mechanical load, m/m.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ThermalPoint {
    /// Part temperature, °C.
    pub temperature_c: f64,
    /// Gauge lot thermal output on the matched material, net over the arms, as the curve records
    /// it (the grids' gauge-factor drift is inside the curve, not added to it).
    pub gauge_thermal_output: f64,
    /// Expansion mismatch between part and gauge match, net over the arms, read at the grids'
    /// gauge factor at that temperature.
    pub expansion_mismatch: f64,
    /// Gauge-factor drift, shown as the change of the full-load reading (span change).
    pub gauge_factor_drift: f64,
    /// Lead-resistance change (with the small nonlinear remainder of the exact circuit).
    pub lead_resistance: f64,
    /// Completion-resistor drift.
    pub completion_drift: f64,
    /// Total apparent strain at no load from the exact circuit.
    pub total: f64,
    /// What the same grids would show without the arrangement's cancellation
    /// (the sum of the arms' magnitudes), for comparison.
    pub uncompensated: f64,
}

/// Sweeps temperature changes from `low_c` to `high_c` (relative to the reference) in `steps`
/// steps; `full_load` is the load case used to show gauge-factor drift.
pub fn thermal_sweep(
    model: &BridgeModel,
    low_c: f64,
    high_c: f64,
    steps: usize,
    full_load: &LoadVector,
) -> Result<Vec<ThermalPoint>, BridgeError> {
    let steps = steps.max(1);
    let changes: Vec<f64> = (0..=steps)
        .map(|i| low_c + (high_c - low_c) * i as f64 / steps as f64)
        .collect();
    thermal_sweep_at(model, &changes, full_load)
}

/// The temperature changes of a sweep from `low_c` to `high_c` in at least `steps` steps,
/// with the reference (a change of zero) among them whenever the range holds it, so that a
/// curve with a corner at the reference (the magnitude of an uncompensated sum) is drawn
/// with its corner in place.
pub fn sweep_changes(low_c: f64, high_c: f64, steps: usize) -> Vec<f64> {
    let steps = steps.max(1);
    let mut changes: Vec<f64> = (0..=steps)
        .map(|i| low_c + (high_c - low_c) * i as f64 / steps as f64)
        .collect();
    if low_c < 0.0 && high_c > 0.0 && !changes.contains(&0.0) {
        let at = changes.partition_point(|&dt| dt < 0.0);
        changes.insert(at, 0.0);
    }
    changes
}

/// The apparent strain and its causes at each temperature change of `changes_c` (relative to
/// the reference); `full_load` is the load case used to show gauge-factor drift.
pub fn thermal_sweep_at(
    model: &BridgeModel,
    changes_c: &[f64],
    full_load: &LoadVector,
) -> Result<Vec<ThermalPoint>, BridgeError> {
    let b = model.bridge();
    let t_ref = model.reference_temperature_c();
    let mut mechanical_full = *full_load;
    mechanical_full[LoadComponent::TemperatureChange] = 0.0;
    let full_at_ref = model.displayed(&mechanical_full)?;
    let mut out = Vec::with_capacity(changes_c.len());
    for &dt in changes_c {
        let t = t_ref + dt;
        let ArmSplit {
            lot,
            mismatch,
            completion,
            uncompensated,
        } = arm_split(model, dt);
        let mut thermal_only = LoadVector::ZERO;
        thermal_only[LoadComponent::TemperatureChange] = dt;
        let total = model.displayed(&thermal_only)?;
        // Leads: the exact circuit's apparent strain less the arm contributions.
        let lead_resistance = total - (lot + mismatch + completion);
        // Gauge-factor drift changes the span: the full-load reading scales by GF(T)/GF(Tref).
        let gf_ratio = (0..4)
            .find_map(|k| match b.arms[k] {
                ArmElement::Grid(_) => model
                    .spec(k)
                    .map(|s| s.gauge_factor_at(t_ref, t) / s.gauge_factor),
                _ => None,
            })
            .unwrap_or(1.0);
        let gauge_factor_drift = full_at_ref * (gf_ratio - 1.0);
        out.push(ThermalPoint {
            temperature_c: t,
            gauge_thermal_output: lot,
            expansion_mismatch: mismatch,
            gauge_factor_drift,
            lead_resistance,
            completion_drift: completion,
            total,
            uncompensated,
        });
    }
    Ok(out)
}

/// The arms' share of the apparent strain at one temperature change, displayed strain, m/m.
struct ArmSplit {
    /// The lots' curves, net over the arms.
    lot: f64,
    /// The expansion mismatch, net over the arms.
    mismatch: f64,
    /// Completion-resistor drift, net.
    completion: f64,
    /// The arms' magnitudes summed, as without cancellation.
    uncompensated: f64,
}

/// Splits the arms' apparent strain at a change `dt` from the reference temperature. A lot's
/// curve is the resistance change it records (its gauge factor's drift is already in it); the
/// expansion mismatch is a strain, read at the grid's gauge factor at that temperature.
fn arm_split(model: &BridgeModel, dt: f64) -> ArmSplit {
    let b = model.bridge();
    let per_delta = 1.0 / (b.instrument.gauge_factor * b.instrument.bridge_factor);
    let t_ref = model.reference_temperature_c();
    let t = t_ref + dt;
    let follows = b.instrument_temperature == InstrumentTemperature::FollowsPart;
    let mut split = ArmSplit {
        lot: 0.0,
        mismatch: 0.0,
        completion: 0.0,
        uncompensated: 0.0,
    };
    for (k, sign) in ARM_SIGNS.iter().enumerate() {
        match (&b.arms[k], model.spec(k)) {
            (ArmElement::Completion(c), _) if follows => {
                let d = c.tcr_per_c * dt * per_delta;
                split.completion += sign * d;
                split.uncompensated += d.abs();
            }
            (ArmElement::Completion(_), _) => {}
            (_, Some(spec)) => {
                let th = &spec.thermal_output;
                let curve = th.curve_resistance_change(spec.gauge_factor, t_ref, t) * per_delta;
                let mismatch = spec.gauge_factor_at(t_ref, t)
                    * th.mismatch_strain(
                        model.part_cte_per_c(),
                        spec.transverse_sensitivity,
                        t_ref,
                        t,
                    )
                    * per_delta;
                split.lot += sign * curve;
                split.mismatch += sign * mismatch;
                split.uncompensated += (curve + mismatch).abs();
            }
            _ => {}
        }
    }
    split
}

#[cfg(test)]
mod sweep_tests {
    use super::sweep_changes;

    #[test]
    fn a_sweep_across_the_reference_holds_it() {
        let c = sweep_changes(-30.0, 20.0, 7);
        assert!(c.contains(&0.0));
        assert_eq!(c.len(), 9);
        assert!(c.windows(2).all(|w| w[0] < w[1]));
        assert_eq!(sweep_changes(5.0, 20.0, 3), vec![5.0, 10.0, 15.0, 20.0]);
    }
}
