//! Shared test fixtures: an invented part and gauge type.
#![allow(dead_code)]

use gw_bridge::*;
use gw_mechanics::*;

pub fn steel() -> Material {
    Material::new("test steel", 200e9, 0.3, 11e-6, 350e6).unwrap()
}

pub fn spec(pattern: GaugePattern) -> GaugeSpec {
    GaugeSpec {
        pattern,
        grid_length_m: 3e-3,
        grid_width_m: 2e-3,
        resistance_ohm: 350.0,
        resistance_tolerance: 0.003,
        gauge_factor: 2.0,
        gauge_factor_tolerance: 0.01,
        transverse_sensitivity: 0.0,
        strain_limit: 0.02,
        fatigue_strain_limit: 1.5e-3,
        thermal_output: ThermalOutput {
            matched_cte_per_c: 11e-6,
            lot_polynomial: vec![],
            reference_gauge_factor: None,
            valid_range_c: None,
        },
        gauge_factor_temp_coeff_per_c: 0.0,
        max_power_density_w_m2: 3100.0,
    }
}

pub fn cantilever() -> Member {
    Member::Beam(
        Beam::new(
            Section::Rectangle {
                width_m: 0.02,
                height_m: 0.04,
            },
            steel(),
            0.5,
            BeamSupport::Cantilever,
            0.5,
        )
        .unwrap(),
    )
}

pub fn placed(
    spec: GaugeSpec,
    id: &str,
    face: Face,
    x: f64,
    s: f64,
    angle_deg: f64,
) -> PlacedGauge {
    PlacedGauge {
        id: id.into(),
        spec,
        position: SurfacePoint::new(face, x, s),
        angle_rad: angle_deg.to_radians(),
    }
}

pub fn completion() -> CompletionResistor {
    CompletionResistor {
        ohm: 350.0,
        tolerance: 0.0005,
        tcr_per_c: 5e-6,
    }
}

pub fn bridge(arms: [ArmElement; 4], wanted: LoadComponent, bridge_factor: f64) -> Bridge {
    Bridge {
        name: "test bridge".into(),
        arms,
        wiring: LeadWiring::ThreeWire,
        lead: LeadWire {
            length_m: 0.0,
            ohm_per_m: 0.0,
            tcr_per_c: bridge::COPPER_TCR_PER_C,
        },
        excitation: Excitation::Voltage { volts: 5.0 },
        amplifier_input_ohm: None,
        instrument: InstrumentSetting {
            gauge_factor: 2.0,
            bridge_factor,
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
        wanted,
        instrument_temperature: InstrumentTemperature::Fixed,
        shunt: None,
    }
}

pub fn grid(gauge: usize, element: usize) -> ArmElement {
    ArmElement::Grid(GridRef { gauge, element })
}

pub fn setup<'a>(member: &'a Member, gauges: &'a [PlacedGauge]) -> Setup<'a> {
    Setup {
        member,
        gauges,
        reference_temperature_c: 20.0,
        quadrature: QuadratureOrder::default(),
    }
}
