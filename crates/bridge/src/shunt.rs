//! Shunt calibration: the resistor for a target simulated strain, the nearest standard value
//! and what the technician should read.

use serde::Serialize;

use crate::circuit::Shunt;
use crate::error::BridgeError;
use crate::model::BridgeModel;

/// The E96 (±1 %) series, one decade, per IEC 60063.
pub const E96: [f64; 96] = [
    1.00, 1.02, 1.05, 1.07, 1.10, 1.13, 1.15, 1.18, 1.21, 1.24, 1.27, 1.30, 1.33, 1.37, 1.40, 1.43,
    1.47, 1.50, 1.54, 1.58, 1.62, 1.65, 1.69, 1.74, 1.78, 1.82, 1.87, 1.91, 1.96, 2.00, 2.05, 2.10,
    2.15, 2.21, 2.26, 2.32, 2.37, 2.43, 2.49, 2.55, 2.61, 2.67, 2.74, 2.80, 2.87, 2.94, 3.01, 3.09,
    3.16, 3.24, 3.32, 3.40, 3.48, 3.57, 3.65, 3.74, 3.83, 3.92, 4.02, 4.12, 4.22, 4.32, 4.42, 4.53,
    4.64, 4.75, 4.87, 4.99, 5.11, 5.23, 5.36, 5.49, 5.62, 5.76, 5.90, 6.04, 6.19, 6.34, 6.49, 6.65,
    6.81, 6.98, 7.15, 7.32, 7.50, 7.68, 7.87, 8.06, 8.25, 8.45, 8.66, 8.87, 9.09, 9.31, 9.53, 9.76,
];

/// Shunt resistance that simulates a strain of magnitude `strain` in an arm of resistance
/// `arm_ohm` with gauge factor `gauge_factor`: from ε = −R / (GF (R + Rs)),
/// Rs = R / (GF |ε|) − R.
///
/// Source: Dally & Riley, *Experimental Stress Analysis*, 3rd ed., Ch. 7 (shunt calibration;
/// from memory for the section).
pub fn shunt_for_strain(arm_ohm: f64, gauge_factor: f64, strain: f64) -> f64 {
    arm_ohm / (gauge_factor * strain.abs()) - arm_ohm
}

/// Strain simulated by a shunt `shunt_ohm` across `arm_ohm`: −R / (GF (R + Rs)).
pub fn simulated_strain(arm_ohm: f64, gauge_factor: f64, shunt_ohm: f64) -> f64 {
    -arm_ohm / (gauge_factor * (arm_ohm + shunt_ohm))
}

/// The E96 value nearest to `ohm` on a logarithmic scale.
pub fn nearest_e96(ohm: f64) -> f64 {
    if !(ohm.is_finite() && ohm > 0.0) {
        return f64::NAN;
    }
    let decade = 10f64.powf(ohm.log10().floor());
    let mantissa = ohm / decade;
    let mut best = (f64::INFINITY, 1.0);
    for candidate in E96.iter().copied().chain([10.0]) {
        let d = (mantissa / candidate).ln().abs();
        if d < best.0 {
            best = (d, candidate);
        }
    }
    // Round away the binary representation error of the decade product.
    let value = best.1 * decade;
    let digits = 3 - value.log10().floor() as i32 - 1;
    let scale = 10f64.powi(digits);
    (value * scale).round() / scale
}

/// The shunt calibration of one bridge.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ShuntCalibration {
    /// Arm index 0..4.
    pub arm: usize,
    /// Exact resistance for the target strain, Ω.
    pub exact_ohm: f64,
    /// Nearest E96 value, Ω.
    pub e96_ohm: f64,
    /// Strain the E96 value simulates in the arm (at the gauge, no leads), m/m.
    pub simulated_strain: f64,
    /// What the instrument should display with the shunt applied where planned, m/m.
    pub expected_reading_strain: f64,
    /// Same, had the shunt been applied directly at the gauge, m/m (the difference is the
    /// lead effect when shunting at the instrument).
    pub reading_at_gauge_strain: f64,
}

/// Works out the planned shunt calibration of a bridge, if it has one.
pub fn shunt_calibration(model: &BridgeModel) -> Result<Option<ShuntCalibration>, BridgeError> {
    let Some(plan) = model.bridge().shunt else {
        return Ok(None);
    };
    let arm_ohm = model.nominal_arm_ohm_of(plan.arm);
    let gf = model
        .spec(plan.arm)
        .map(|s| s.gauge_factor)
        .unwrap_or(model.bridge().instrument.gauge_factor);
    let exact_ohm = shunt_for_strain(arm_ohm, gf, plan.target_strain);
    let e96_ohm = nearest_e96(exact_ohm);
    let expected = model.shunt_reading(Shunt {
        arm: plan.arm,
        ohm: e96_ohm,
        location: plan.location,
    })?;
    let at_gauge = model.shunt_reading(Shunt {
        arm: plan.arm,
        ohm: e96_ohm,
        location: crate::circuit::ShuntLocation::GaugeEnd,
    })?;
    Ok(Some(ShuntCalibration {
        arm: plan.arm,
        exact_ohm,
        e96_ohm,
        simulated_strain: simulated_strain(arm_ohm, gf, e96_ohm),
        expected_reading_strain: expected,
        reading_at_gauge_strain: at_gauge,
    }))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn e96_table_follows_the_series_formula_but_for_its_one_listed_exception() {
        // IEC 60063: E96 values are 10^(i/96) rounded to three figures (one listed value
        // differs from plain rounding by one in the last digit; from memory).
        for (i, v) in E96.iter().enumerate() {
            let formula = (10f64.powf(i as f64 / 96.0) * 100.0).round() / 100.0;
            assert!((formula - v).abs() < 0.011, "index {i}: {v} vs {formula}");
        }
    }

    #[test]
    fn nearest_e96_picks_the_closest_value() {
        assert_eq!(nearest_e96(174_650.0), 174_000.0);
        assert_eq!(nearest_e96(99.0), 100.0);
        assert_eq!(nearest_e96(87_000.0), 86_600.0);
    }
}
