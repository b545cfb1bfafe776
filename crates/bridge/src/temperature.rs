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
    /// Gauge lot thermal output on the matched material, net over the arms.
    pub gauge_thermal_output: f64,
    /// Expansion mismatch between part and gauge match, net over the arms.
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
    let b = model.bridge();
    let gf_set = b.instrument.gauge_factor;
    let bf = b.instrument.bridge_factor;
    let t_ref = model.reference_temperature_c();
    let steps = steps.max(1);
    let mut mechanical_full = *full_load;
    mechanical_full[LoadComponent::TemperatureChange] = 0.0;
    let full_at_ref = model.displayed(&mechanical_full)?;
    let mut out = Vec::with_capacity(steps + 1);
    for i in 0..=steps {
        let dt = low_c + (high_c - low_c) * i as f64 / steps as f64;
        let t = t_ref + dt;
        let (mut lot, mut mismatch, mut completion, mut uncompensated) = (0.0, 0.0, 0.0, 0.0);
        for (k, sign) in ARM_SIGNS.iter().enumerate() {
            let follows = b.instrument_temperature == InstrumentTemperature::FollowsPart;
            match (&b.arms[k], model.spec(k)) {
                (ArmElement::Completion(c), _) if follows => {
                    let d = c.tcr_per_c * dt / (gf_set * bf);
                    completion += sign * d;
                    uncompensated += d.abs();
                }
                (ArmElement::Completion(_), _) => {}
                (_, Some(spec)) => {
                    let kt = spec.transverse_sensitivity;
                    let gf = spec.gauge_factor_at(t_ref, t) / gf_set / bf;
                    let matched = spec.thermal_output.apparent_strain(
                        spec.thermal_output.matched_cte_per_c,
                        kt,
                        spec.gauge_factor,
                        t_ref,
                        t,
                    );
                    let total = spec.thermal_output.apparent_strain(
                        model.part_cte_per_c(),
                        kt,
                        spec.gauge_factor,
                        t_ref,
                        t,
                    );
                    lot += sign * gf * matched;
                    mismatch += sign * gf * (total - matched);
                    uncompensated += (gf * total).abs();
                }
                _ => {}
            }
        }
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
