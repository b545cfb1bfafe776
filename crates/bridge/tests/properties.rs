//! Property tests of the bridge identities and the chooser's ordering.

use gw_bridge::chooser::score;
use gw_bridge::circuit::{ArmResistor, BridgeCircuit, Excitation, LeadWiring};
use proptest::prelude::*;

fn circuit(ohms: [f64; 4], at_gauge: [bool; 4], lead: f64, wiring: LeadWiring) -> BridgeCircuit {
    BridgeCircuit {
        arms: std::array::from_fn(|k| ArmResistor {
            ohm: ohms[k],
            at_gauge: at_gauge[k],
        }),
        wiring,
        lead_ohm: lead,
        excitation: Excitation::Voltage { volts: 5.0 },
        amplifier_input_ohm: None,
        shunt: None,
    }
}

fn wiring() -> impl Strategy<Value = LeadWiring> {
    prop_oneof![
        Just(LeadWiring::TwoWire),
        Just(LeadWiring::ThreeWire),
        Just(LeadWiring::RemoteSense)
    ]
}

proptest! {
    #[test]
    fn swapping_the_two_halves_flips_the_output(
        d in proptest::array::uniform4(-0.01..0.01f64),
        g in proptest::array::uniform4(any::<bool>()),
        lead in 0.0..3.0f64,
        w in wiring(),
    ) {
        let ohms = d.map(|x| 350.0 * (1.0 + x));
        let a = circuit(ohms, g, lead, w).solve().unwrap().output_v;
        // Halves: arms 1–2 (output +) and arms 4–3 (output −); swap 1↔4 and 2↔3.
        let swapped = circuit([ohms[3], ohms[2], ohms[1], ohms[0]], [g[3], g[2], g[1], g[0]], lead, w);
        let b = swapped.solve().unwrap().output_v;
        // Equal and opposite up to the solver's round-off: a node voltage of a few volts is
        // found to about κ·u of itself, where u is the unit round-off and κ grows as the ratio
        // of the arm to the lead resistance (the stiffest conductance against the softest;
        // forward error of a backward-stable solve, from memory). Low-ohm leads therefore
        // loosen the bound: 0.1 nV at 1 Ω, under 2 nV at 1 mΩ, against outputs near 1 mV.
        let round_off = 4.0 * f64::EPSILON * 5.0 * (1.0 + 350.0 / lead.max(1e-6));
        prop_assert!(
            (a + b).abs() <= 1e-8 * a.abs() + 1e-10 + round_off,
            "{a} vs {b}"
        );
    }

    #[test]
    fn equal_strains_in_adjacent_arms_cancel(d in -0.01..0.01f64, k in 0usize..4) {
        // Adjacent pairs: (1,2), (2,3), (3,4), (4,1).
        let mut ohms = [350.0; 4];
        ohms[k] *= 1.0 + d;
        ohms[(k + 1) % 4] *= 1.0 + d;
        let out = circuit(ohms, [true; 4], 0.0, LeadWiring::ThreeWire).solve().unwrap().output_v;
        prop_assert!(out.abs() < 1e-13, "{out}");
    }

    #[test]
    fn more_error_or_more_gauges_never_ranks_higher(
        error in 1e-6..0.5f64, extra in 1e-9..0.5f64, count in 1usize..8,
    ) {
        prop_assert!(score(error + extra, count) < score(error, count));
        prop_assert!(score(error, count + 1) < score(error, count));
    }
}
