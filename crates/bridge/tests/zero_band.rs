//! The zero band against routes of its own: Monte Carlo sampling of the arm resistances solved
//! on the exact circuit (JCGM 101:2008), the small-signal bridge equation for the worst case,
//! and the voltage-divider equation for the lead offset of a two-wire quarter bridge. Inputs
//! are invented.

use approx::assert_relative_eq;
use gw_bridge::circuit::{ArmResistor, BridgeCircuit, Excitation, LeadWiring};
use gw_bridge::zero_band::{ZeroBand, ZeroBandExcess, ZeroBandLimit, zero_band};
use rand::SeedableRng;
use rand_distr::{Distribution, Uniform};
use rand_xoshiro::Xoshiro256PlusPlus;

const R: f64 = 350.0;
const VEX: f64 = 5.0;
const LIMIT: ZeroBandLimit = ZeroBandLimit {
    full_scale_mv_per_v: 2.0,
    fraction: 0.1,
};

fn circuit(at_gauge: [bool; 4], wiring: LeadWiring, lead_ohm: f64) -> BridgeCircuit {
    BridgeCircuit {
        arms: at_gauge.map(|at_gauge| ArmResistor { ohm: R, at_gauge }),
        wiring,
        lead_ohm,
        excitation: Excitation::Voltage { volts: VEX },
        amplifier_input_ohm: None,
        shunt: None,
    }
}

/// The output of `c` with arm k's resistance scaled by `scales[k]`, solved directly, mV/V.
fn solved_mv_per_v(c: &BridgeCircuit, scales: [f64; 4]) -> f64 {
    let mut c = c.clone();
    for (arm, s) in c.arms.iter_mut().zip(scales) {
        arm.ohm *= s;
    }
    c.solve().unwrap().output_v / VEX * 1e3
}

/// Mean and standard deviation of the zero reading with every arm drawn from its rectangular
/// tolerance, `trials` draws (JCGM 101:2008 §6.4.2 for the rectangular draw).
fn monte_carlo(c: &BridgeCircuit, tolerances: [f64; 4], trials: usize, seed: u64) -> (f64, f64) {
    let mut rng = Xoshiro256PlusPlus::seed_from_u64(seed);
    let unit = Uniform::new_inclusive(-1.0, 1.0).unwrap();
    let ys: Vec<f64> = (0..trials)
        .map(|_| {
            let scales = tolerances.map(|t| 1.0 + t * unit.sample(&mut rng));
            solved_mv_per_v(c, scales)
        })
        .collect();
    let n = ys.len() as f64;
    let mean = ys.iter().sum::<f64>() / n;
    let var = ys.iter().map(|y| (y - mean).powi(2)).sum::<f64>() / (n - 1.0);
    (mean, var.sqrt())
}

fn check_against_monte_carlo(c: &BridgeCircuit, tolerances: [f64; 4], seed: u64) -> ZeroBand {
    let band = zero_band(c, tolerances, VEX, LIMIT).unwrap();
    let trials = 20_000;
    let (mean, sd) = monte_carlo(c, tolerances, trials, seed);
    // The sample standard deviation of n near-normal draws scatters by about 1/√(2n) of itself
    // (0.5 % here); 3 % is six of those.
    assert_relative_eq!(band.standard_mv_per_v, sd, max_relative = 0.03);
    // The mean scatters by σ/√n about the centre (plus a second-order bias far below that).
    let se = sd / (trials as f64).sqrt();
    assert!(
        (mean - band.centre_mv_per_v).abs() < 5.0 * se,
        "Monte Carlo mean {mean} against centre {} (standard error {se})",
        band.centre_mv_per_v
    );
    assert_relative_eq!(band.statistical_mv_per_v, 2.0 * band.standard_mv_per_v);
    band
}

#[test]
fn statistical_band_matches_monte_carlo_on_a_three_wire_quarter_bridge() {
    // Gauge ±0.3 %, completion resistors ±0.1 %, 0.4 Ω leads.
    let c = circuit([true, false, false, false], LeadWiring::ThreeWire, 0.4);
    check_against_monte_carlo(&c, [0.003, 0.001, 0.001, 0.001], 11);
}

#[test]
fn statistical_band_matches_monte_carlo_on_a_full_bridge_with_remote_sense() {
    let mut c = circuit([true; 4], LeadWiring::RemoteSense, 1.5);
    c.amplifier_input_ohm = Some(20e3);
    let band = check_against_monte_carlo(&c, [0.004, 0.002, 0.003, 0.001], 12);
    assert!(band.standard_mv_per_v > 0.0);
}

#[test]
fn statistical_band_matches_monte_carlo_under_constant_current() {
    let mut c = circuit([true, true, false, false], LeadWiring::ThreeWire, 0.8);
    c.excitation = Excitation::Current { amps: VEX / R };
    check_against_monte_carlo(&c, [0.003, 0.003, 0.0005, 0.0005], 13);
}

#[test]
fn worst_case_of_a_full_bridge_without_leads_is_a_quarter_of_the_tolerance_sum() {
    // Small-signal bridge equation Vo/Vex ≈ ¼(δ1 − δ2 + δ3 − δ4) (Hoffmann, "An Introduction
    // to Measurements using Strain Gages", 1989, the Wheatstone bridge chapter; section number
    // from memory: §7): with every |δk| ≤ tk the output lies within ±¼ Σ tk.
    let tolerances = [0.003, 0.002, 0.001, 0.0005];
    let c = circuit([true; 4], LeadWiring::ThreeWire, 0.0);
    let band = zero_band(&c, tolerances, VEX, LIMIT).unwrap();
    let handbook = tolerances.iter().sum::<f64>() / 4.0 * 1e3;
    // The exact circuit departs from the small-signal line by terms of order t (0.3 %).
    assert_relative_eq!(band.worst_high_mv_per_v, handbook, max_relative = 0.01);
    assert_relative_eq!(band.worst_low_mv_per_v, -handbook, max_relative = 0.01);
    assert!(band.centre_mv_per_v.abs() < 1e-12);
    // Root-sum-square of rectangles: σ = ¼ √(Σ t²/3) (JCGM 100:2008 §4.3.7, §5.1.2).
    let rss = (tolerances.iter().map(|t| t * t / 3.0).sum::<f64>()).sqrt() / 4.0 * 1e3;
    assert_relative_eq!(band.standard_mv_per_v, rss, max_relative = 0.01);
}

#[test]
fn dense_random_sampling_never_leaves_the_worst_case() {
    let tolerances = [0.005, 0.001, 0.003, 0.002];
    let mut rng = Xoshiro256PlusPlus::seed_from_u64(21);
    let unit = Uniform::new_inclusive(-1.0, 1.0).unwrap();
    let pick = Uniform::new_inclusive(0u8, 3).unwrap();
    for (at_gauge, wiring, lead) in [
        ([true; 4], LeadWiring::ThreeWire, 0.0),
        ([true, false, false, false], LeadWiring::TwoWire, 0.6),
        ([true, true, false, false], LeadWiring::RemoteSense, 2.0),
    ] {
        let c = circuit(at_gauge, wiring, lead);
        let band = zero_band(&c, tolerances, VEX, LIMIT).unwrap();
        let slack = 1e-9 * band.worst_half_width_mv_per_v();
        let mut seen = (f64::INFINITY, f64::NEG_INFINITY);
        for _ in 0..4000 {
            // Half the draws push each arm to an end of its range: the worst case must hold
            // there too, not only inside.
            let scales = tolerances.map(|t| {
                let u = match pick.sample(&mut rng) {
                    0 => -1.0,
                    1 => 1.0,
                    _ => unit.sample(&mut rng),
                };
                1.0 + t * u
            });
            let v = solved_mv_per_v(&c, scales);
            assert!(
                v >= band.worst_low_mv_per_v - slack && v <= band.worst_high_mv_per_v + slack,
                "{wiring:?}: {v} mV/V outside {}..{}",
                band.worst_low_mv_per_v,
                band.worst_high_mv_per_v
            );
            seen = (seen.0.min(v), seen.1.max(v));
        }
        // The sampling reaches the corners, so the worst case is not padded either.
        let width = band.worst_high_mv_per_v - band.worst_low_mv_per_v;
        assert!(band.worst_high_mv_per_v - seen.1 < 0.02 * width);
        assert!(seen.0 - band.worst_low_mv_per_v < 0.02 * width);
    }
}

#[test]
fn a_two_wire_quarter_bridge_zero_sits_at_its_lead_offset() {
    // Both leads in the active arm (arm 1, which raises the output). Divider equation, written
    // out here: Vo/Vex = (R + 2RL)/(R + 2RL + R) − R/(R + R).
    let lead = 0.5;
    let c = circuit([true, false, false, false], LeadWiring::TwoWire, lead);
    let band = zero_band(&c, [0.003, 0.001, 0.001, 0.001], VEX, LIMIT).unwrap();
    let divider = ((R + 2.0 * lead) / (2.0 * R + 2.0 * lead) - 0.5) * 1e3;
    assert_relative_eq!(band.centre_mv_per_v, divider, max_relative = 1e-9);
    // Small signal: ¼ · 2RL/R (Hoffmann 1989, as above), good to order 2RL/R (0.3 %).
    let small_signal = 0.25 * (2.0 * lead / R) * 1e3;
    assert_relative_eq!(band.centre_mv_per_v, small_signal, max_relative = 0.005);
    // The band sits round the offset, not round zero: its mid-point is the offset to within
    // the second-order terms.
    let mid = (band.worst_low_mv_per_v + band.worst_high_mv_per_v) / 2.0;
    let width = band.worst_high_mv_per_v - band.worst_low_mv_per_v;
    assert!(
        (mid - band.centre_mv_per_v).abs() < 0.01 * width,
        "{band:?}"
    );
    // The offset itself is expected, not judged; the spread is: ±0.3 % on the gauge alone
    // moves the zero by about 0.75 mV/V, over a tenth of the 2 mV/V full scale.
    assert_eq!(band.exceeds, ZeroBandExcess::Both);
}

#[test]
fn a_band_inside_the_fraction_of_full_scale_is_not_noted() {
    let c = circuit([true; 4], LeadWiring::ThreeWire, 0.0);
    // Worst case ¼ · 4 · 0.00021 = 0.21 mV/V, just over a tenth of 2 mV/V; the statistical
    // band 2 · ¼ · √(4 t²/3) = 0.12 mV/V is inside it. A little tighter and both are inside.
    let band = zero_band(&c, [0.00021; 4], VEX, LIMIT).unwrap();
    assert_eq!(band.exceeds, ZeroBandExcess::WorstCaseOnly);
    let band = zero_band(&c, [0.00019; 4], VEX, LIMIT).unwrap();
    assert_eq!(band.exceeds, ZeroBandExcess::Within);
}
