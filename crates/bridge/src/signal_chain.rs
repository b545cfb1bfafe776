//! The acquisition channel: counts per microstrain, resolution, headroom, noise and grid power.

use serde::Serialize;

use crate::error::BridgeError;
use crate::model::{BridgeModel, Reading};

/// Boltzmann constant, J/K (CODATA 2018, exact by the 2019 SI definition).
pub const BOLTZMANN_J_PER_K: f64 = 1.380_649e-23;

/// Johnson–Nyquist noise of a resistance, V rms: vn = √(4 k T R B).
///
/// Source: Horowitz & Hill, *The Art of Electronics*, 3rd ed., §8.1.1 (Johnson noise).
/// ```
/// # use gw_bridge::signal_chain::johnson_noise_v;
/// // 1 kΩ at 300 K over 1 Hz: about 4.07 nV.
/// assert!((johnson_noise_v(1000.0, 300.0, 1.0) - 4.0704e-9).abs() < 1e-12);
/// ```
pub fn johnson_noise_v(resistance_ohm: f64, temperature_k: f64, bandwidth_hz: f64) -> f64 {
    (4.0 * BOLTZMANN_J_PER_K * temperature_k * resistance_ohm * bandwidth_hz).sqrt()
}

/// Figures of the channel for one bridge.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ChannelFigures {
    /// Output change at the amplifier input per displayed microstrain, V/µε.
    pub volts_per_microstrain: f64,
    /// ADC step, V at the ADC.
    pub lsb_v: f64,
    /// ADC counts per displayed microstrain.
    pub counts_per_microstrain: f64,
    /// Displayed strain per count, m/m.
    pub resolution_strain: f64,
    /// Bridge output resistance, Ω.
    pub output_resistance_ohm: f64,
    /// Johnson noise of the output resistance over the bandwidth, V rms.
    pub johnson_noise_v: f64,
    /// Amplifier noise over the bandwidth, V rms (referred to input).
    pub amplifier_noise_v: f64,
    /// Quantization noise referred to the input, V rms (LSB/√12 / gain).
    pub quantization_noise_v: f64,
    /// Total noise referred to the input, V rms (root sum of squares).
    pub total_noise_v: f64,
    /// Total noise as displayed strain, m/m rms.
    pub noise_strain_rms: f64,
    /// The analogue part of that noise (Johnson and amplifier, without quantization), in
    /// strain, rms: what an uncertainty budget that lists quantization on its own row takes
    /// as "noise", so quantization is counted once.
    pub analog_noise_strain_rms: f64,
    /// Power in each arm's element at no load, W.
    pub arm_power_w: [f64; 4],
    /// Power per grid area for grids and dummies, W/m² (0 for completion resistors).
    pub arm_power_density_w_m2: [f64; 4],
    /// Allowed power density for each arm's grid, W/m² (0 for completion resistors).
    pub arm_power_limit_w_m2: [f64; 4],
}

/// ADC voltage (after gain, including the zero offset) for a reading, V.
pub fn adc_volts(model: &BridgeModel, reading: &Reading) -> f64 {
    reading.output_v * model.bridge().signal.gain
}

/// Computes the channel figures of a bridge.
pub fn channel_figures(model: &BridgeModel) -> Result<ChannelFigures, BridgeError> {
    let b = model.bridge();
    let s = &b.signal;
    let vex = model.nominal_excitation_v();
    let volts_per_strain = vex * b.instrument.gauge_factor * b.instrument.bridge_factor / 4.0;
    let volts_per_microstrain = volts_per_strain * 1e-6;
    let lsb_v = 2.0 * s.input_range_v / 2f64.powi(s.adc_bits as i32);
    let counts_per_microstrain = volts_per_microstrain * s.gain / lsb_v;
    let output_resistance_ohm = model
        .circuit(&gw_mechanics::LoadVector::ZERO, None)
        .output_resistance_ohm()?;
    let temperature_k = model.reference_temperature_c() + 273.15;
    let johnson = johnson_noise_v(output_resistance_ohm, temperature_k, s.bandwidth_hz);
    let amplifier = s.amplifier_noise_v_per_rt_hz * s.bandwidth_hz.sqrt();
    let quantization = lsb_v / 12f64.sqrt() / s.gain;
    let total = (johnson * johnson + amplifier * amplifier + quantization * quantization).sqrt();
    let arm_power_w = model.arm_power_w();
    let mut density = [0.0; 4];
    let mut limit = [0.0; 4];
    for k in 0..4 {
        if let Some(spec) = model.spec(k) {
            density[k] = arm_power_w[k] / spec.grid_area_m2();
            limit[k] = spec.max_power_density_w_m2;
        }
    }
    Ok(ChannelFigures {
        volts_per_microstrain,
        lsb_v,
        counts_per_microstrain,
        resolution_strain: 1e-6 / counts_per_microstrain,
        output_resistance_ohm,
        johnson_noise_v: johnson,
        amplifier_noise_v: amplifier,
        quantization_noise_v: quantization,
        total_noise_v: total,
        noise_strain_rms: total / volts_per_strain,
        analog_noise_strain_rms: johnson.hypot(amplifier) / volts_per_strain,
        arm_power_w,
        arm_power_density_w_m2: density,
        arm_power_limit_w_m2: limit,
    })
}
