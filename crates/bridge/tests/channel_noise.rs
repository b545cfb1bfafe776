//! The channel's noise: white noise integrates over the filter's equivalent noise bandwidth.

mod support;

use approx::assert_relative_eq;
use gw_bridge::signal_chain::{LowPassFilter, channel_figures, johnson_noise_v};
use gw_bridge::*;
use gw_mechanics::*;
use support::*;

fn one_grid() -> Vec<PlacedGauge> {
    vec![placed(
        spec(GaugePattern::SingleGrid),
        "G1",
        Face::Top,
        0.1,
        0.0,
        0.0,
    )]
}

/// ∫₀^∞ |H(f)|² df ÷ f_c for an n-pole Butterworth low-pass, |H|² = 1/(1 + (f/f_c)^(2n)), by
/// the midpoint rule after f/f_c = t/(1 − t) maps the half-line onto [0, 1).
fn butterworth_noise_bandwidth_by_integration(order: u32) -> f64 {
    let n = 200_000;
    let h = 1.0 / n as f64;
    (0..n)
        .map(|i| {
            let t = (i as f64 + 0.5) * h;
            let x = t / (1.0 - t);
            let magnitude_squared = 1.0 / (1.0 + x.powi(2 * order as i32));
            magnitude_squared / (1.0 - t).powi(2) * h
        })
        .sum()
}

#[test]
fn noise_integrates_over_the_filters_noise_bandwidth_not_its_cut_off() {
    // White noise through a filter integrates over ∫|H|² df (the equivalent noise bandwidth;
    // Motchenbacher & Connelly, Low-Noise Electronic System Design, ch. 1, from memory), here
    // integrated numerically and compared with the channel's Johnson and amplifier noise.
    let member = cantilever();
    let gauges = one_grid();
    let c = ArmElement::Completion(completion());
    let mut b = bridge([grid(0, 0), c, c, c], LoadComponent::VerticalForce, 1.0);
    let s = setup(&member, &gauges);
    let filters = [
        (LowPassFilter::FirstOrderRc, 1),
        (LowPassFilter::Butterworth { order: 2 }, 2),
        (LowPassFilter::Butterworth { order: 4 }, 4),
    ];
    for (filter, order) in filters {
        b.signal.filter = filter;
        let model = BridgeModel::new(&s, &b).unwrap();
        let ch = channel_figures(&model).unwrap();
        let enbw = butterworth_noise_bandwidth_by_integration(order) * b.signal.bandwidth_hz;
        assert_relative_eq!(ch.noise_bandwidth_hz, enbw, max_relative = 1e-6);
        assert_relative_eq!(
            ch.amplifier_noise_v,
            b.signal.amplifier_noise_v_per_rt_hz * enbw.sqrt(),
            max_relative = 1e-6
        );
        assert_relative_eq!(
            ch.johnson_noise_v,
            johnson_noise_v(ch.output_resistance_ohm, 293.15, enbw),
            max_relative = 1e-6
        );
    }
    // Values quoted in noise analyses (π/2, 1.11, 1.026; common practice), as a sanity check of
    // the integration itself.
    assert_relative_eq!(
        butterworth_noise_bandwidth_by_integration(1),
        std::f64::consts::FRAC_PI_2,
        max_relative = 1e-6
    );
    assert_relative_eq!(
        butterworth_noise_bandwidth_by_integration(2),
        1.111,
        max_relative = 1e-3
    );
    assert_relative_eq!(
        butterworth_noise_bandwidth_by_integration(4),
        1.026,
        max_relative = 1e-3
    );
    b.signal.filter = LowPassFilter::BrickWall;
    let model = BridgeModel::new(&s, &b).unwrap();
    let ch = channel_figures(&model).unwrap();
    assert_relative_eq!(
        ch.noise_bandwidth_hz,
        b.signal.bandwidth_hz,
        max_relative = 1e-12
    );
}

#[test]
fn a_butterworth_filter_of_no_poles_is_refused_naming_the_field() {
    let member = cantilever();
    let gauges = one_grid();
    let c = ArmElement::Completion(completion());
    let mut b = bridge([grid(0, 0), c, c, c], LoadComponent::VerticalForce, 1.0);
    b.signal.filter = LowPassFilter::Butterworth { order: 0 };
    let e = BridgeModel::new(&setup(&member, &gauges), &b).unwrap_err();
    assert!(e.to_string().contains("filter order"), "{e}");
    assert!(e.to_string().contains("outside 1 to 16"), "{e}");
}
