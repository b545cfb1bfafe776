//! What the technician measures at the cable connector before plugging in.

use gw_bridge::BridgeModel;
use gw_bridge::circuit::Excitation;
use gw_bridge::network::CurrentSource;
use gw_mechanics::LoadVector;

/// Resistance standing in for "not connected" when the instrument-side resistors are left out
/// of a pin-to-pin measurement, Ω. Its parallel effect on a 350 Ω reading is below 1e-6.
const OPEN_OHM: f64 = 1e9;

/// Expected resistance between every pair of cable conductors at the instrument end, with the
/// gauges and leads only (completion resistors stay in the instrument), at no load and the
/// reference temperature, Ω.
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
    let mut out = Vec::new();
    for (i, (name_a, a)) in nodes.conductors.iter().enumerate() {
        for (name_b, b) in nodes.conductors.iter().skip(i + 1) {
            let mut probe = net.clone();
            probe.current_sources.push(CurrentSource {
                name: "ohmmeter".into(),
                from: *b,
                to: *a,
                amps: 1.0,
            });
            if let Ok(s) = probe.solve() {
                let r = s.between(*a, *b);
                if r.is_finite() && r < OPEN_OHM / 10.0 {
                    out.push((format!("{name_a} to {name_b}"), r));
                }
            }
        }
    }
    out
}
