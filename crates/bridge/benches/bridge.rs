//! The chooser over 12 placed grids, and 10⁶ Monte Carlo trials of a full bridge.

use criterion::{Criterion, criterion_group, criterion_main};
use gw_bridge::chooser::{ChooserRequest, choose};
use gw_bridge::uncertainty::{FullBridgeCase, full_bridge_monte_carlo};
use gw_bridge::*;
use gw_mechanics::*;
use std::hint::black_box;

/// The bridge the arrangements go into: three-wire leads of 5 m, 5 V, a 24-bit channel.
fn template() -> Bridge {
    let completion = ArmElement::Completion(CompletionResistor {
        ohm: 350.0,
        tolerance: 0.0005,
        tcr_per_c: 5e-6,
    });
    Bridge {
        name: "bench".into(),
        arms: [completion; 4],
        wiring: LeadWiring::ThreeWire,
        lead: LeadWire {
            length_m: 5.0,
            ohm_per_m: 0.05,
            tcr_per_c: bridge::COPPER_TCR_PER_C,
        },
        excitation: Excitation::Voltage { volts: 5.0 },
        amplifier_input_ohm: None,
        instrument: InstrumentSetting {
            gauge_factor: 2.0,
            bridge_factor: 1.0,
        },
        signal: SignalChain {
            gain: 100.0,
            input_range_v: 10.0,
            adc_bits: 24,
            amplifier_noise_v_per_rt_hz: 10e-9,
            bandwidth_hz: 100.0,
            filter: signal_chain::LowPassFilter::FirstOrderRc,
            excitation_accuracy: 0.001,
            gain_accuracy: 0.001,
        },
        wanted: LoadComponent::VerticalForce,
        instrument_temperature: InstrumentTemperature::Fixed,
        shunt: None,
    }
}

fn spec(pattern: GaugePattern) -> GaugeSpec {
    GaugeSpec {
        pattern,
        grid_length_m: 3e-3,
        grid_width_m: 1.8e-3,
        resistance_ohm: 350.0,
        resistance_tolerance: 0.003,
        gauge_factor: 2.05,
        gauge_factor_tolerance: 0.01,
        transverse_sensitivity: 0.007,
        strain_limit: 0.03,
        fatigue_strain_limit: 1.5e-3,
        thermal_output: ThermalOutput {
            matched_cte_per_c: 10.8e-6,
            lot_polynomial: vec![-32e-6, 2.2e-6, -3.5e-8],
            reference_gauge_factor: None,
            valid_range_c: None,
        },
        gauge_factor_temp_coeff_per_c: 1e-4,
        max_power_density_w_m2: 3000.0,
    }
}

fn bench(c: &mut Criterion) {
    let material = Material::new("steel", 207e9, 0.292, 11.7e-6, 350e6).expect("valid material");
    let member = Member::Beam(
        Beam::new(
            Section::Rectangle {
                width_m: 0.03,
                height_m: 0.06,
            },
            material,
            0.45,
            BeamSupport::Cantilever,
            0.45,
        )
        .expect("valid beam"),
    );
    let place = |pattern, face, x, s| PlacedGauge {
        id: format!("G{x}{s}"),
        spec: spec(pattern),
        position: SurfacePoint::new(face, x, s),
        angle_rad: 0.0,
    };
    // 12 grids: four two-element gauges and two shear pairs.
    let gauges = vec![
        place(GaugePattern::TwoElement90, Face::Top, 0.05, -0.0075),
        place(GaugePattern::TwoElement90, Face::Bottom, 0.05, -0.0075),
        place(GaugePattern::TwoElement90, Face::Top, 0.05, 0.0075),
        place(GaugePattern::TwoElement90, Face::Bottom, 0.05, 0.0075),
        place(GaugePattern::ShearPair, Face::Front, 0.25, 0.0),
        place(GaugePattern::ShearPair, Face::Back, 0.25, 0.0),
    ];
    let request = ChooserRequest {
        wanted: LoadComponent::VerticalForce,
        wanted_magnitude: 6000.0,
        unwanted: vec![
            (LoadComponent::AxialForce, 2000.0),
            (LoadComponent::LateralForce, 500.0),
        ],
        temperature_range_c: (-10.0, 40.0),
        reference_temperature_c: 20.0,
        template: template(),
        completion: CompletionResistor {
            ohm: 350.0,
            tolerance: 0.0005,
            tcr_per_c: 5e-6,
        },
        tolerances: gw_bridge::bridge_uncertainty::InstallationTolerances::default(),
        keep: 20,
    };
    c.bench_function("chooser/12_grids", |b| {
        b.iter(|| {
            choose(
                black_box(&member),
                black_box(&gauges),
                &request,
                QuadratureOrder::default(),
            )
        })
    });
    let case = FullBridgeCase {
        strains: [500e-6, -150e-6, 500e-6, -150e-6],
        gauge_factor: 2.05,
        gauge_factor_tolerance: 0.01,
        arm_tolerance: 0.003,
        excitation_v: 5.0,
        excitation_tolerance: 0.001,
    };
    let mut group = c.benchmark_group("monte_carlo");
    group.sample_size(10);
    group.bench_function("full_bridge_1e6_trials", |b| {
        b.iter(|| full_bridge_monte_carlo(black_box(&case), 1_000_000, 42))
    });
    group.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
