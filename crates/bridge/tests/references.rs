//! Closed-form references for the bridge circuit and the gauge models. Each check names its
//! source; inputs are invented.

use approx::assert_relative_eq;
use gw_bridge::circuit::{
    ArmResistor, BridgeCircuit, Excitation, LeadWiring, Shunt, ShuntLocation, ideal_output_ratio,
};
use gw_bridge::gauge::ThermalOutput;

const R: f64 = 350.0;

fn circuit(
    deltas: [f64; 4],
    at_gauge: [bool; 4],
    wiring: LeadWiring,
    lead_ohm: f64,
) -> BridgeCircuit {
    BridgeCircuit {
        arms: std::array::from_fn(|k| ArmResistor {
            ohm: R * (1.0 + deltas[k]),
            at_gauge: at_gauge[k],
        }),
        wiring,
        lead_ohm,
        excitation: Excitation::Voltage { volts: 5.0 },
        amplifier_input_ohm: None,
        shunt: None,
    }
}

const QUARTER: [bool; 4] = [true, false, false, false];
const FULL: [bool; 4] = [true; 4];

#[test]
fn one_active_arm_output_and_its_nonlinearity() {
    // Dally & Riley, Experimental Stress Analysis, 3rd ed., Ch. 7 (Wheatstone bridge; from memory
    // for the section): Vo/Vex = (GF ε/4) / (1 + GF ε/2) for one active arm.
    let (gf, eps) = (2.1, 2000e-6);
    let d = gf * eps;
    let out = circuit([d, 0.0, 0.0, 0.0], QUARTER, LeadWiring::TwoWire, 0.0)
        .solve()
        .unwrap();
    assert_relative_eq!(
        out.output_v / 5.0,
        (d / 4.0) / (1.0 + d / 2.0),
        max_relative = 1e-12
    );
    // Nonlinearity: about GF ε / 2 = 0.21 % low against the linear GF ε / 4.
    let linear = d / 4.0;
    assert_relative_eq!(
        1.0 - out.output_v / 5.0 / linear,
        d / 2.0 / (1.0 + d / 2.0),
        max_relative = 1e-6
    );
}

#[test]
fn half_bridge_with_opposite_strains_is_linear() {
    // Dally & Riley 3rd ed., Ch. 7: two active adjacent arms with +ε and −ε give
    // Vo/Vex = GF ε / 2 exactly (the nonlinear terms cancel).
    let d = 2.0 * 1500e-6;
    let out = circuit(
        [d, -d, 0.0, 0.0],
        [true, true, false, false],
        LeadWiring::ThreeWire,
        0.0,
    )
    .solve()
    .unwrap();
    assert_relative_eq!(out.output_v / 5.0, d / 2.0, max_relative = 1e-12);
}

#[test]
fn full_bridge_with_four_active_arms() {
    // Dally & Riley 3rd ed., Ch. 7: four active arms ±ε give Vo/Vex = GF ε.
    let d = 2.0 * 800e-6;
    let out = circuit([d, -d, d, -d], FULL, LeadWiring::ThreeWire, 0.0)
        .solve()
        .unwrap();
    assert_relative_eq!(out.output_v / 5.0, d, max_relative = 1e-12);
}

#[test]
fn one_arm_one_percent_high_gives_a_four_hundredth() {
    // Common practice: one arm of an equal-arm bridge 1 % high unbalances the output by about
    // 1/400 of the excitation (exactly 1.01/2.01 − 1/2 = 1/402).
    let ratio = ideal_output_ratio([0.01, 0.0, 0.0, 0.0]);
    assert_relative_eq!(ratio, 1.0 / 400.0, max_relative = 0.01);
    let out = circuit([0.01, 0.0, 0.0, 0.0], QUARTER, LeadWiring::TwoWire, 0.0)
        .solve()
        .unwrap();
    assert_relative_eq!(out.output_v / 5.0, 1.0 / 402.0, max_relative = 1e-12);
}

fn sensitivity(wiring: LeadWiring, lead: f64) -> f64 {
    let d = 1e-6;
    let up = circuit([d, 0.0, 0.0, 0.0], QUARTER, wiring, lead)
        .solve()
        .unwrap()
        .output_v;
    let down = circuit([-d, 0.0, 0.0, 0.0], QUARTER, wiring, lead)
        .solve()
        .unwrap()
        .output_v;
    (up - down) / (2.0 * d)
}

#[test]
fn two_wire_leads_desensitize_by_r_over_r_plus_2rl() {
    // Dally & Riley 3rd ed., Ch. 7 (lead-wire effects): a two-wire quarter bridge puts both
    // leads in the active arm, desensitizing it by R / (R + 2 RL) (first order in RL/R).
    let rl = 1.0;
    let ratio = sensitivity(LeadWiring::TwoWire, rl) / sensitivity(LeadWiring::TwoWire, 0.0);
    assert_relative_eq!(
        ratio,
        R / (R + 2.0 * rl),
        max_relative = 2.0 * (rl / R).powi(2)
    );
}

#[test]
fn three_wire_cancels_lead_drift() {
    // Dally & Riley 3rd ed., Ch. 7: with two wires a lead change ΔRL shows as 2ΔRL/R of arm
    // change; with three wires the two current-carrying leads sit in adjacent arms and cancel.
    let (rl, drift) = (2.0, 0.2);
    let shift = |w| {
        let a = circuit([0.0; 4], QUARTER, w, rl).solve().unwrap().output_v;
        let b = circuit([0.0; 4], QUARTER, w, rl + drift)
            .solve()
            .unwrap()
            .output_v;
        b - a
    };
    let two = shift(LeadWiring::TwoWire);
    assert_relative_eq!(two / 5.0, 2.0 * drift / R / 4.0, max_relative = 0.03);
    let three = shift(LeadWiring::ThreeWire);
    assert!(
        three.abs() < 0.01 * two.abs(),
        "three-wire {three} vs two-wire {two}"
    );
}

#[test]
fn remote_sense_holds_the_bridge_voltage() {
    // With sense leads the supply regulates the voltage at the bridge itself: full bridge,
    // 10 Ω excitation leads, bridge excitation stays at the set 5 V.
    let out = circuit([0.0; 4], FULL, LeadWiring::RemoteSense, 10.0)
        .solve()
        .unwrap();
    assert_relative_eq!(out.bridge_excitation_v, 5.0, max_relative = 1e-12);
    // Without sense: the divider R/(R + 2 RL) of the bridge input resistance R (Ohm's law).
    let plain = circuit([0.0; 4], FULL, LeadWiring::ThreeWire, 10.0)
        .solve()
        .unwrap();
    assert_relative_eq!(
        plain.bridge_excitation_v,
        5.0 * R / (R + 20.0),
        max_relative = 1e-12
    );
}

#[test]
fn shunt_at_the_gauge_simulates_the_textbook_strain() {
    // Dally & Riley 3rd ed., Ch. 7 (shunt calibration): Rs across an arm R simulates
    // ε = −R / (GF (R + Rs)); the bridge then reads it with the one-arm nonlinearity.
    let (gf, rs) = (2.0, 87_325.0);
    let mut c = circuit([0.0; 4], QUARTER, LeadWiring::ThreeWire, 0.0);
    c.shunt = Some(Shunt {
        arm: 0,
        ohm: rs,
        location: ShuntLocation::GaugeEnd,
    });
    let out = c.solve().unwrap();
    let eps = -R / (gf * (R + rs));
    let d = gf * eps;
    assert_relative_eq!(
        out.output_v / 5.0,
        (d / 4.0) / (1.0 + d / 2.0),
        max_relative = 1e-7
    );
}

#[test]
fn constant_current_excitation_of_a_balanced_bridge() {
    // Ohm's law: an equal-arm bridge presents R to the supply, so I·R appears across it.
    let mut c = circuit([0.0; 4], FULL, LeadWiring::ThreeWire, 1.0);
    c.excitation = Excitation::Current { amps: 0.01 };
    let out = c.solve().unwrap();
    assert_relative_eq!(out.bridge_excitation_v, 0.01 * R, max_relative = 1e-12);
}

#[test]
fn thermal_output_from_expansion_mismatch() {
    // Dally & Riley 3rd ed., Ch. 6 (temperature compensation; from memory for the form):
    // a grid matched to α = 10.8e-6 /°C on a part with 23.4e-6 /°C reads (αp − αg)ΔT = 126 µε
    // over +10 °C when Kt = 0.
    let t = ThermalOutput {
        matched_cte_per_c: 10.8e-6,
        lot_polynomial: vec![],
        reference_gauge_factor: None,
        valid_range_c: None,
    };
    assert_relative_eq!(
        t.apparent_strain(23.4e-6, 0.0, 2.0, 20.0, 30.0),
        126e-6,
        max_relative = 1e-12
    );
    // A matched part reads only the lot polynomial, relative to the reference temperature.
    let lot = ThermalOutput {
        matched_cte_per_c: 10.8e-6,
        lot_polynomial: vec![-30e-6, 2e-6, -0.05e-6],
        reference_gauge_factor: None,
        valid_range_c: None,
    };
    let poly = |x: f64| -30e-6 + 2e-6 * x - 0.05e-6 * x * x;
    assert_relative_eq!(
        lot.apparent_strain(10.8e-6, 0.02, 2.0, 20.0, 60.0),
        poly(60.0) - poly(20.0),
        max_relative = 1e-12
    );
}

#[test]
fn wiring_names_count_the_conductors_the_trade_counts() {
    // Conductor counts as wired in practice (common practice): a quarter bridge with two or
    // three leads; a full bridge with four leads, six with remote sense; a half bridge with
    // its completion at the instrument with three leads, five with remote sense.
    let full = [true; 4];
    assert_eq!(
        LeadWiring::ThreeWire.trade_name(full),
        "four-wire, no sense"
    );
    assert_eq!(LeadWiring::TwoWire.trade_name(full), "four-wire, no sense");
    assert_eq!(
        LeadWiring::RemoteSense.trade_name(full),
        "six-wire with remote sense"
    );
    let half = [true, true, false, false];
    assert_eq!(
        LeadWiring::ThreeWire.trade_name(half),
        "three-wire, no sense"
    );
    assert_eq!(
        LeadWiring::RemoteSense.trade_name(half),
        "five-wire with remote sense"
    );
    let quarter = [true, false, false, false];
    assert_eq!(LeadWiring::TwoWire.trade_name(quarter), "two-wire");
    assert_eq!(LeadWiring::ThreeWire.trade_name(quarter), "three-wire");
    assert_eq!(
        LeadWiring::choices(1),
        [LeadWiring::TwoWire, LeadWiring::ThreeWire]
    );
    assert_eq!(
        LeadWiring::choices(4),
        [LeadWiring::ThreeWire, LeadWiring::RemoteSense]
    );
}
