//! The bridge circuit solver against ngspice (a general-purpose circuit simulator) on random
//! bridges with leads, wiring variants, remote sense, constant current, amplifier loading and
//! shunts. Agreement required: 1 µV.

use std::io::Write;
use std::process::Command;

use gw_bridge::circuit::{
    ArmResistor, BridgeCircuit, Excitation, LeadWiring, Shunt, ShuntLocation,
};
use gw_verify::require_tool;
use rand::{RngExt, SeedableRng};
use rand_xoshiro::Xoshiro256PlusPlus;

fn random_bridge(rng: &mut Xoshiro256PlusPlus) -> BridgeCircuit {
    let base = [120.0, 350.0, 1000.0][rng.random_range(0..3)];
    let arms = std::array::from_fn(|_| ArmResistor {
        ohm: base * (1.0 + rng.random_range(-0.02..0.02)),
        at_gauge: rng.random_bool(0.6),
    });
    let wiring = [
        LeadWiring::TwoWire,
        LeadWiring::ThreeWire,
        LeadWiring::RemoteSense,
    ][rng.random_range(0..3)];
    let excitation = if rng.random_bool(0.75) {
        Excitation::Voltage {
            volts: rng.random_range(1.0..10.0),
        }
    } else {
        Excitation::Current {
            amps: rng.random_range(1e-3..10e-3),
        }
    };
    let shunt = rng.random_bool(0.5).then(|| Shunt {
        arm: rng.random_range(0..4),
        ohm: rng.random_range(20e3..500e3),
        location: if rng.random_bool(0.5) {
            ShuntLocation::GaugeEnd
        } else {
            ShuntLocation::InstrumentEnd
        },
    });
    BridgeCircuit {
        arms,
        wiring,
        lead_ohm: rng.random_range(0.05..5.0),
        excitation,
        amplifier_input_ohm: rng.random_bool(0.5).then(|| rng.random_range(5e3..1e7)),
        shunt,
    }
}

fn ngspice_values(netlist: &str, labels: &[&str]) -> Vec<f64> {
    let dir = std::env::temp_dir().join(format!("gw-ngspice-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("bridge.cir");
    std::fs::File::create(&path)
        .unwrap()
        .write_all(netlist.as_bytes())
        .unwrap();
    let out = Command::new("ngspice")
        .arg("-b")
        .arg(&path)
        .output()
        .expect("ngspice runs");
    let text = String::from_utf8_lossy(&out.stdout);
    labels
        .iter()
        .map(|label| {
            text.lines()
                .find_map(|l| {
                    let (name, value) = l.split_once('=')?;
                    (name.trim() == *label).then(|| value.trim().parse::<f64>().ok())?
                })
                .unwrap_or_else(|| panic!("ngspice printed no {label}:\n{text}\n{netlist}"))
        })
        .collect()
}

#[test]
fn bridge_solver_agrees_with_ngspice_on_random_networks() {
    if !require_tool("ngspice", "--version", "ngspice") {
        return;
    }
    let mut rng = Xoshiro256PlusPlus::seed_from_u64(20261201);
    let mut worst = 0.0_f64;
    for case in 0..24 {
        let circuit = random_bridge(&mut rng);
        let (net, nodes) = circuit.network();
        let ours = circuit.solve().unwrap();
        let regulated = net.voltage_sources.first().and_then(|s| s.regulate);
        let mut print = vec![("vout".to_owned(), nodes.output.0, nodes.output.1)];
        if let Some((p, n)) = regulated {
            print.push(("vsense".to_owned(), p, n));
        }
        let netlist = net.to_spice(&format!("random bridge {case}"), &print);
        let values = ngspice_values(&netlist, &["vout", "vsense"][..print.len()]);
        // A regulating supply on a linear network: scale the terminal-driven solution so the
        // sensed voltage equals the set point.
        let reference = match (regulated, circuit.excitation) {
            (Some(_), Excitation::Voltage { volts }) => values[0] * volts / values[1],
            _ => values[0],
        };
        let diff = (ours.output_v - reference).abs();
        worst = worst.max(diff);
        assert!(
            diff < 1e-6,
            "case {case}: ours {} V, ngspice {reference} V\n{netlist}",
            ours.output_v
        );
    }
    println!("largest difference from ngspice over 24 random bridges: {worst:.3e} V");
}
