//! What the technician measures at the cable connector before plugging in.

use gw_bridge::BridgeModel;
use gw_bridge::circuit::Excitation;
use gw_mechanics::LoadVector;
use nalgebra::DMatrix;

/// Resistance standing in for "not connected" when the instrument-side resistors are left out
/// of a pin-to-pin measurement, Ω. Its parallel effect on a 350 Ω reading is below 1e-6.
const OPEN_OHM: f64 = 1e9;

/// Expected resistance between every pair of cable conductors at the instrument end, with the
/// gauges and leads only (completion resistors stay in the instrument), at no load and the
/// reference temperature, Ω.
///
/// Two-point resistances from one inverse of the grounded conductance matrix:
/// R_ab = Z_aa + Z_bb − 2 Z_ab with Z = G⁻¹ (Klein & Randić, "Resistance distance",
/// J. Math. Chem. 12, 1993), so all pairs cost one factorisation.
pub fn pin_resistances(model: &BridgeModel) -> Vec<(String, f64)> {
    let mut circuit = model.circuit(&LoadVector::ZERO, None);
    for arm in &mut circuit.arms {
        if !arm.at_gauge {
            arm.ohm = OPEN_OHM;
        }
    }
    circuit.excitation = Excitation::Current { amps: 0.0 };
    circuit.amplifier_input_ohm = None;
    circuit.shunt = None;
    let (net, nodes) = circuit.network();
    let n = net.node_count.saturating_sub(1);
    let mut g = DMatrix::<f64>::zeros(n, n);
    for r in &net.resistors {
        let c = 1.0 / r.ohm;
        let (a, b) = (r.a.checked_sub(1), r.b.checked_sub(1));
        if let Some(i) = a {
            g[(i, i)] += c;
        }
        if let Some(j) = b {
            g[(j, j)] += c;
        }
        if let (Some(i), Some(j)) = (a, b) {
            g[(i, j)] -= c;
            g[(j, i)] -= c;
        }
    }
    let Some(z) = g.try_inverse() else {
        return Vec::new();
    };
    let zz = |a: usize, b: usize| -> f64 {
        match (a.checked_sub(1), b.checked_sub(1)) {
            (Some(i), Some(j)) => z[(i, j)],
            _ => 0.0,
        }
    };
    let mut out = Vec::new();
    for (i, (name_a, a)) in nodes.conductors.iter().enumerate() {
        for (name_b, b) in nodes.conductors.iter().skip(i + 1) {
            let r = zz(*a, *a) + zz(*b, *b) - 2.0 * zz(*a, *b);
            if r.is_finite() && r < OPEN_OHM / 10.0 {
                out.push((format!("{name_a} to {name_b}"), r));
            }
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::demo::demo_project;
    use crate::validate::bridge_from_plan;
    use gw_bridge::network::CurrentSource;
    use gw_bridge::{BridgeModel, Setup};
    use gw_mechanics::QuadratureOrder;

    #[test]
    fn one_inverse_agrees_with_injecting_a_current_between_each_pair() {
        let p = demo_project();
        let part = &p.parts[0];
        let gauges = p.placed_gauges(part);
        let bridge = bridge_from_plan(part, &gauges, &part.bridges[0]).unwrap();
        let setup = Setup {
            member: &part.member,
            gauges: &gauges,
            reference_temperature_c: 20.0,
            quadrature: QuadratureOrder::default(),
        };
        let model = BridgeModel::new(&setup, &bridge).unwrap();
        let fast = pin_resistances(&model);
        assert!(!fast.is_empty());
        // Ohm's law directly: 1 A between the two pins, read the voltage.
        let mut circuit = model.circuit(&LoadVector::ZERO, None);
        for arm in &mut circuit.arms {
            if !arm.at_gauge {
                arm.ohm = OPEN_OHM;
            }
        }
        circuit.excitation = Excitation::Current { amps: 0.0 };
        circuit.amplifier_input_ohm = None;
        let (net, nodes) = circuit.network();
        let mut k = 0;
        for (i, (_, a)) in nodes.conductors.iter().enumerate() {
            for (_, b) in nodes.conductors.iter().skip(i + 1) {
                let mut probe = net.clone();
                probe.current_sources.push(CurrentSource {
                    name: "ohmmeter".into(),
                    from: *b,
                    to: *a,
                    amps: 1.0,
                });
                let r = probe.solve().unwrap().between(*a, *b);
                assert!((r - fast[k].1).abs() < 1e-6 * r, "{r} vs {}", fast[k].1);
                k += 1;
            }
        }
    }
}
