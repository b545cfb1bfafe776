//! The acquisition channel: counts per microstrain, resolution, headroom, noise and grid power.

use serde::{Deserialize, Serialize};

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

/// The low-pass filter that sets the channel's bandwidth. White noise through it integrates
/// over its equivalent noise bandwidth, not over its −3 dB cut-off.
///
/// Default: [`LowPassFilter::FirstOrderRc`]. One pole is what any amplifier has even with no
/// filter set, and it has the widest noise bandwidth of the kinds here, so a channel whose
/// filter is not stated never has its noise understated.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum LowPassFilter {
    /// One pole (an RC section, or the amplifier's own roll-off): noise bandwidth π/2 × the
    /// cut-off.
    #[default]
    FirstOrderRc,
    /// Butterworth (maximally flat) low-pass of `order` poles, 1 to
    /// [`LowPassFilter::MAX_ORDER`].
    Butterworth {
        /// Number of poles.
        order: u32,
    },
    /// The stated bandwidth is the noise bandwidth: an ideal brick-wall filter, or a digital
    /// filter whose data sheet gives its noise bandwidth (enter that as the bandwidth).
    BrickWall,
}

impl LowPassFilter {
    /// Highest Butterworth order accepted (beyond it the noise bandwidth is within 0.2 % of
    /// the cut-off).
    pub const MAX_ORDER: u32 = 16;

    /// Order given to a Butterworth filter when the engineer picks that kind (four poles, a
    /// usual setting of bridge amplifiers, common practice).
    pub const USUAL_BUTTERWORTH_ORDER: u32 = 4;

    /// Plain name, e.g. "Butterworth, 4 poles".
    pub fn name(self) -> String {
        match self {
            LowPassFilter::FirstOrderRc => "first-order RC".into(),
            LowPassFilter::Butterworth { order: 1 } => "Butterworth, 1 pole".into(),
            LowPassFilter::Butterworth { order } => format!("Butterworth, {order} poles"),
            LowPassFilter::BrickWall => "brick wall".into(),
        }
    }

    /// Checks the order; the message names the field and the range.
    pub fn validate(self) -> Result<(), BridgeError> {
        match self {
            LowPassFilter::Butterworth { order } if !(1..=Self::MAX_ORDER).contains(&order) => {
                Err(BridgeError::Invalid {
                    what: "filter order".into(),
                    why: format!(
                        "{order} poles is outside 1 to {}; a Butterworth filter has at least one pole",
                        Self::MAX_ORDER
                    ),
                })
            }
            _ => Ok(()),
        }
    }

    /// Equivalent noise bandwidth ÷ −3 dB cut-off.
    pub fn noise_bandwidth_ratio(self) -> Result<f64, BridgeError> {
        self.validate()?;
        Ok(match self {
            LowPassFilter::FirstOrderRc => butterworth_noise_bandwidth_ratio(1),
            LowPassFilter::Butterworth { order } => butterworth_noise_bandwidth_ratio(order),
            LowPassFilter::BrickWall => 1.0,
        })
    }

    /// Equivalent noise bandwidth of this filter with its −3 dB cut-off at `cutoff_hz`, Hz.
    pub fn noise_bandwidth_hz(self, cutoff_hz: f64) -> Result<f64, BridgeError> {
        Ok(self.noise_bandwidth_ratio()? * cutoff_hz)
    }
}

/// Equivalent noise bandwidth of an n-pole Butterworth low-pass ÷ its −3 dB cut-off:
/// ∫₀^∞ |H(f)|² df / f_c with |H|² = 1 / (1 + (f/f_c)^(2n)), which is (π/2n) / sin(π/2n).
///
/// Source: the definition of noise bandwidth (Motchenbacher & Connelly, *Low-Noise Electronic
/// System Design*, ch. 1, from memory) and the integral ∫₀^∞ dx / (1 + xᵐ) = (π/m) / sin(π/m)
/// (Gradshteyn & Ryzhik 3.241.2, from memory). `order` 0 is taken as 1 (callers validate it).
/// ```
/// # use gw_bridge::signal_chain::butterworth_noise_bandwidth_ratio;
/// // One pole (an RC): π/2.
/// assert!((butterworth_noise_bandwidth_ratio(1) - std::f64::consts::FRAC_PI_2).abs() < 1e-12);
/// // Two poles 1.111, four poles 1.026.
/// assert!((butterworth_noise_bandwidth_ratio(2) - 1.1107).abs() < 1e-4);
/// assert!((butterworth_noise_bandwidth_ratio(4) - 1.0262).abs() < 1e-4);
/// ```
pub fn butterworth_noise_bandwidth_ratio(order: u32) -> f64 {
    let x = std::f64::consts::PI / (2.0 * f64::from(order.max(1)));
    x / x.sin()
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
    /// Equivalent noise bandwidth of the channel's filter, Hz: what white noise integrates
    /// over (the −3 dB bandwidth times the filter's ratio, e.g. π/2 for one pole).
    pub noise_bandwidth_hz: f64,
    /// Johnson noise of the output resistance over the noise bandwidth, V rms.
    pub johnson_noise_v: f64,
    /// Amplifier noise over the noise bandwidth, V rms (referred to input).
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
    // White noise through a real filter integrates over its noise bandwidth, which is wider
    // than the −3 dB cut-off (π/2 times for one pole).
    let noise_bandwidth_hz = s.filter.noise_bandwidth_hz(s.bandwidth_hz)?;
    let johnson = johnson_noise_v(output_resistance_ohm, temperature_k, noise_bandwidth_hz);
    let amplifier = s.amplifier_noise_v_per_rt_hz * noise_bandwidth_hz.sqrt();
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
        noise_bandwidth_hz,
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
