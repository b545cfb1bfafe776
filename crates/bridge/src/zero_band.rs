//! The zero reading a technician should see on a bridge at no load, and how far the resistance
//! tolerances of its arms may move it.
//!
//! The centre is the exact circuit's output with every element at its nominal value (a
//! two-wire quarter bridge, for one, has both leads in its active arm and does not read zero).
//! Around it come two bands, both in mV/V of the set excitation:
//! - **statistical**: each arm's resistance tolerance ±t taken as a rectangular distribution,
//!   standard deviation t/√3 (JCGM 100:2008 §4.3.7), carried through the exact circuit's
//!   sensitivity to that arm (central differences) and summed root-sum-square (JCGM 100:2008
//!   §5.1.2), then expanded with the coverage factor [`ZERO_BAND_COVERAGE_K`] = 2, about 95 %
//!   for a near-normal sum (JCGM 100:2008 §G.2, §G.6.6). With one arm's tolerance much larger
//!   than the others the sum is not near-normal and the k = 2 band can reach past the worst
//!   case (2/√3 of it for a single arm): the worst case then bounds what can occur.
//! - **worst case**: every arm at the end of its tolerance that pushes the output furthest, up
//!   and down. The output of a resistive bridge is monotonic in each arm's resistance (a
//!   bilinear fraction of it), so the extremes are among the 2⁴ corners, each solved exactly.

use serde::Serialize;

use crate::bridge::ArmElement;
use crate::circuit::BridgeCircuit;
use crate::error::{BridgeError, check_fraction, check_positive};
use crate::model::BridgeModel;
use gw_mechanics::LoadVector;

/// Coverage factor of the statistical zero band: 2, about 95 % for a near-normal sum
/// (JCGM 100:2008 §G.2, §G.6.6).
pub const ZERO_BAND_COVERAGE_K: f64 = 2.0;

/// Fraction of full scale a zero band may take before it is noted (common practice: a zero
/// within about a tenth of full scale leaves the input range for the signal and lets a wrong
/// connection show up at the zero check).
pub const DEFAULT_ZERO_BAND_FRACTION: f64 = 0.1;

/// Relative step of an arm's resistance for the central differences.
const STEP: f64 = 1e-4;

/// Which band exceeds the chosen fraction of full scale. Default: [`ZeroBandExcess::Within`].
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize)]
pub enum ZeroBandExcess {
    /// Both bands are within the fraction of full scale.
    #[default]
    Within,
    /// Only the statistical band exceeds it.
    StatisticalOnly,
    /// Only the worst case exceeds it.
    WorstCaseOnly,
    /// Both exceed it.
    Both,
    /// The bridge reads nothing at any load case, so there is no full scale to compare with.
    NoFullScale,
}

impl ZeroBandExcess {
    /// True when one band or both exceed the fraction of full scale.
    pub fn exceeded(self) -> bool {
        matches!(
            self,
            ZeroBandExcess::StatisticalOnly | ZeroBandExcess::WorstCaseOnly | ZeroBandExcess::Both
        )
    }
}

/// What the zero band is judged against.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ZeroBandLimit {
    /// The bridge's largest |reading| over its load cases, mV/V.
    pub full_scale_mv_per_v: f64,
    /// Fraction of full scale a band may take before it is noted, 0 < f ≤ 1.
    pub fraction: f64,
}

/// The expected zero reading of a bridge at no load and its spread from resistance tolerances,
/// mV/V of the set excitation.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ZeroBand {
    /// Zero reading with every element at its nominal value (leads included), mV/V.
    pub centre_mv_per_v: f64,
    /// Standard deviation of the zero reading from the arms' tolerances, mV/V.
    pub standard_mv_per_v: f64,
    /// Coverage factor of the statistical band.
    pub coverage_k: f64,
    /// Statistical band: ± half-width about the centre (k × standard deviation), mV/V.
    pub statistical_mv_per_v: f64,
    /// Lowest zero reading with every arm at a tolerance limit, mV/V.
    pub worst_low_mv_per_v: f64,
    /// Highest zero reading with every arm at a tolerance limit, mV/V.
    pub worst_high_mv_per_v: f64,
    /// Resistance tolerance of each arm, ± fraction.
    pub arm_tolerances: [f64; 4],
    /// Change of the zero reading per unit ΔR/R of each arm, mV/V.
    pub arm_sensitivities_mv_per_v: [f64; 4],
    /// The bridge's largest |reading| over its load cases, mV/V.
    pub full_scale_mv_per_v: f64,
    /// Fraction of full scale a band may take before it is noted.
    pub limit_fraction: f64,
    /// Which band exceeds that fraction.
    pub exceeds: ZeroBandExcess,
}

impl ZeroBand {
    /// The worst case as ± about the centre: its larger distance from the centre, mV/V.
    pub fn worst_half_width_mv_per_v(&self) -> f64 {
        (self.worst_high_mv_per_v - self.centre_mv_per_v)
            .max(self.centre_mv_per_v - self.worst_low_mv_per_v)
    }

    /// The largest zero reading in size the worst case allows, mV/V: a zero offset within ±
    /// this value includes the centre's own offset.
    pub fn largest_offset_mv_per_v(&self) -> f64 {
        self.worst_low_mv_per_v
            .abs()
            .max(self.worst_high_mv_per_v.abs())
    }

    /// The fraction of full scale in mV/V.
    pub fn limit_mv_per_v(&self) -> f64 {
        self.limit_fraction * self.full_scale_mv_per_v
    }

    /// A note for the technician and the engineer when a band takes more than the chosen
    /// fraction of full scale: a zero inside such a band says little about the installation.
    /// `None` when both bands are within it. A note, not a warning: with ordinary gauge
    /// tolerances most bridges are zeroed electrically anyway (common practice).
    pub fn note(&self) -> Option<String> {
        let band = match self.exceeds {
            ZeroBandExcess::Within | ZeroBandExcess::NoFullScale => return None,
            ZeroBandExcess::StatisticalOnly => "the statistical band exceeds",
            ZeroBandExcess::WorstCaseOnly => "the worst case exceeds",
            ZeroBandExcess::Both => "both bands exceed",
        };
        Some(format!(
            "Note: {band} {:.0} % of full scale ({:.4} of {:.4} mV/V), so a zero reading inside \
             the band proves little about the installation: zero the bridge electrically and \
             record the offset, or use gauges or completion resistors of closer resistance \
             tolerance.",
            self.limit_fraction * 100.0,
            self.limit_mv_per_v(),
            self.full_scale_mv_per_v
        ))
    }
}

/// Resistance tolerance of each arm of a prepared bridge: the completion resistor's tolerance,
/// or the grid's (or dummy's) lot resistance tolerance, ± fraction.
pub fn arm_tolerances(model: &BridgeModel) -> [f64; 4] {
    std::array::from_fn(|k| match model.bridge().arms[k] {
        ArmElement::Completion(c) => c.tolerance,
        _ => model.spec(k).map(|s| s.resistance_tolerance).unwrap_or(0.0),
    })
}

/// The zero band of a prepared bridge at no load and the reference temperature.
pub fn zero_band_of_model(
    model: &BridgeModel,
    limit: ZeroBandLimit,
) -> Result<ZeroBand, BridgeError> {
    zero_band(
        &model.circuit(&LoadVector::ZERO, None),
        arm_tolerances(model),
        model.nominal_excitation_v(),
        limit,
    )
}

/// The zero reading of `circuit` with each arm's resistance multiplied by `scales`, in mV/V of
/// `excitation_v` (the set excitation, which the reading is divided by).
pub fn zero_reading_mv_per_v(
    circuit: &BridgeCircuit,
    scales: [f64; 4],
    excitation_v: f64,
) -> Result<f64, BridgeError> {
    let mut c = circuit.clone();
    for (arm, s) in c.arms.iter_mut().zip(scales) {
        arm.ohm *= s;
    }
    let out = c.solve()?.output_v / excitation_v * 1e3;
    if out.is_finite() {
        Ok(out)
    } else {
        Err(BridgeError::Invalid {
            what: "zero reading".into(),
            why: "the bridge circuit gives no finite output; check its arm resistances".into(),
        })
    }
}

/// The zero band of `circuit` (every element at its nominal value, no shunt) with arm
/// resistance tolerances `tolerances` (± fraction), read per volt of `excitation_v`, judged
/// against `limit`.
pub fn zero_band(
    circuit: &BridgeCircuit,
    tolerances: [f64; 4],
    excitation_v: f64,
    limit: ZeroBandLimit,
) -> Result<ZeroBand, BridgeError> {
    check_inputs(tolerances, excitation_v, limit)?;
    let centre = zero_reading_mv_per_v(circuit, [1.0; 4], excitation_v)?;
    // A balanced bridge solves to a few 1e-16 V of rounding, not to zero: below a nano-mV/V
    // (far under any instrument's resolution) the centre is zero, without a stray sign.
    let centre = if centre.abs() < 1e-9 { 0.0 } else { centre };
    let mut sensitivities = [0.0; 4];
    for (k, s) in sensitivities.iter_mut().enumerate() {
        let mut up = [1.0; 4];
        let mut down = [1.0; 4];
        up[k] += STEP;
        down[k] -= STEP;
        *s = (zero_reading_mv_per_v(circuit, up, excitation_v)?
            - zero_reading_mv_per_v(circuit, down, excitation_v)?)
            / (2.0 * STEP);
    }
    // Rectangular ±t has standard deviation t/√3 (JCGM 100:2008 §4.3.7).
    let variance: f64 = sensitivities
        .iter()
        .zip(tolerances)
        .map(|(s, t)| (s * t / 3f64.sqrt()).powi(2))
        .sum();
    let standard = variance.sqrt();
    let (low, high) = worst_corners(circuit, tolerances, excitation_v)?;
    let statistical = ZERO_BAND_COVERAGE_K * standard;
    let mut band = ZeroBand {
        centre_mv_per_v: centre,
        standard_mv_per_v: standard,
        coverage_k: ZERO_BAND_COVERAGE_K,
        statistical_mv_per_v: statistical,
        worst_low_mv_per_v: low.min(centre),
        worst_high_mv_per_v: high.max(centre),
        arm_tolerances: tolerances,
        arm_sensitivities_mv_per_v: sensitivities,
        full_scale_mv_per_v: limit.full_scale_mv_per_v,
        limit_fraction: limit.fraction,
        exceeds: ZeroBandExcess::Within,
    };
    band.exceeds = judge(&band);
    Ok(band)
}

/// Lowest and highest zero reading over the 2⁴ corners of the tolerance box, mV/V.
fn worst_corners(
    circuit: &BridgeCircuit,
    tolerances: [f64; 4],
    excitation_v: f64,
) -> Result<(f64, f64), BridgeError> {
    let mut low = f64::INFINITY;
    let mut high = f64::NEG_INFINITY;
    for corner in 0..16u32 {
        let scales = std::array::from_fn(|k| {
            let sign = if corner & (1 << k) == 0 { -1.0 } else { 1.0 };
            1.0 + sign * tolerances[k]
        });
        let v = zero_reading_mv_per_v(circuit, scales, excitation_v)?;
        low = low.min(v);
        high = high.max(v);
    }
    Ok((low, high))
}

fn judge(band: &ZeroBand) -> ZeroBandExcess {
    let limit = band.limit_mv_per_v();
    if limit <= 0.0 {
        return ZeroBandExcess::NoFullScale;
    }
    match (
        band.statistical_mv_per_v > limit,
        band.worst_half_width_mv_per_v() > limit,
    ) {
        (false, false) => ZeroBandExcess::Within,
        (true, false) => ZeroBandExcess::StatisticalOnly,
        (false, true) => ZeroBandExcess::WorstCaseOnly,
        (true, true) => ZeroBandExcess::Both,
    }
}

fn check_inputs(
    tolerances: [f64; 4],
    excitation_v: f64,
    limit: ZeroBandLimit,
) -> Result<(), BridgeError> {
    for (k, t) in tolerances.iter().enumerate() {
        check_fraction(&format!("arm {} resistance tolerance", k + 1), *t, 0.0, 0.5)?;
    }
    check_positive("excitation for the zero reading", excitation_v)?;
    let fs = limit.full_scale_mv_per_v;
    if !(fs.is_finite() && fs >= 0.0) {
        return Err(BridgeError::Invalid {
            what: "full scale of the zero check".into(),
            why: format!("must be zero or a positive number of mV/V, got {fs}"),
        });
    }
    let f = limit.fraction;
    if !(f.is_finite() && f > 0.0 && f <= 1.0) {
        return Err(BridgeError::Invalid {
            what: "zero band fraction of full scale".into(),
            why: format!("{f} must lie above 0 and at most 1 (e.g. 0.1)"),
        });
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::circuit::{ArmResistor, Excitation, LeadWiring};
    use approx::assert_relative_eq;

    fn equal_arms(lead_ohm: f64) -> BridgeCircuit {
        BridgeCircuit {
            arms: [true, false, false, false].map(|at_gauge| ArmResistor {
                ohm: 350.0,
                at_gauge,
            }),
            wiring: LeadWiring::ThreeWire,
            lead_ohm,
            excitation: Excitation::Voltage { volts: 5.0 },
            amplifier_input_ohm: None,
            shunt: None,
        }
    }

    const LIMIT: ZeroBandLimit = ZeroBandLimit {
        full_scale_mv_per_v: 2.0,
        fraction: 0.1,
    };

    #[test]
    fn an_equal_arm_bridge_without_tolerances_reads_zero_with_no_band() {
        let band = zero_band(&equal_arms(0.0), [0.0; 4], 5.0, LIMIT).unwrap();
        assert!(band.centre_mv_per_v.abs() < 1e-12);
        assert!(band.statistical_mv_per_v.abs() < 1e-12);
        assert!(band.worst_half_width_mv_per_v() < 1e-12);
        assert_eq!(band.exceeds, ZeroBandExcess::Within);
    }

    #[test]
    fn arm_sensitivities_follow_the_arm_signs() {
        // Small signal: ∂(Vo/Vex)/∂δk = ±¼ for equal arms (Hoffmann, "An Introduction to
        // Measurements using Strain Gages", 1989, §7), signs in the crate's arm numbering.
        let band = zero_band(&equal_arms(0.0), [0.001; 4], 5.0, LIMIT).unwrap();
        for (s, sign) in band
            .arm_sensitivities_mv_per_v
            .iter()
            .zip(crate::model::ARM_SIGNS)
        {
            assert_relative_eq!(*s, sign * 250.0, max_relative = 1e-6);
        }
    }

    #[test]
    fn bad_inputs_are_refused_with_the_value_named() {
        let circuit = equal_arms(0.0);
        let e = zero_band(&circuit, [0.001, -0.1, 0.0, 0.0], 5.0, LIMIT).unwrap_err();
        assert!(e.to_string().contains("arm 2 resistance tolerance"), "{e}");
        let e = zero_band(&circuit, [0.001; 4], f64::NAN, LIMIT).unwrap_err();
        assert!(e.to_string().contains("excitation"), "{e}");
        let bad = ZeroBandLimit {
            fraction: 0.0,
            ..LIMIT
        };
        let e = zero_band(&circuit, [0.001; 4], 5.0, bad).unwrap_err();
        assert!(e.to_string().contains("above 0 and at most 1"), "{e}");
    }

    #[test]
    fn no_full_scale_is_said_rather_than_judged() {
        let none = ZeroBandLimit {
            full_scale_mv_per_v: 0.0,
            fraction: 0.1,
        };
        let band = zero_band(&equal_arms(0.0), [0.003; 4], 5.0, none).unwrap();
        assert_eq!(band.exceeds, ZeroBandExcess::NoFullScale);
        assert!(!band.exceeds.exceeded());
    }
}
