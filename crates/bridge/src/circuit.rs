//! The Wheatstone bridge as a real circuit: four arms, lead wires, excitation, amplifier input
//! resistance and an optional shunt-calibration resistor, built into a [`Network`] and solved
//! exactly.
//!
//! # Arm numbering and polarity (ours, used everywhere in Gaugewright)
//! ```text
//!                 excitation +
//!                /            \
//!            arm 2            arm 3
//!              /                \
//!   output + ──                  ── output −
//!              \                /
//!            arm 1            arm 4
//!                \            /
//!                 excitation −
//! ```
//! Output = V(output +) − V(output −). Raising arm 1 or arm 3 raises the output; raising arm 2
//! or arm 4 lowers it. Small signal: Vo/Vex ≈ ¼(δ1 − δ2 + δ3 − δ4), δ = ΔR/R.

use serde::{Deserialize, Serialize};

use crate::network::{CurrentSource, Network, NetworkError, Node, Solution, VoltageSource};

/// How leads connect the gauge site to the instrument. Default: [`LeadWiring::ThreeWire`].
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum LeadWiring {
    /// One lead per bridge corner used at the gauge site; at a corner shared by a grid and an
    /// instrument-side resistor, the lead sits in the grid's arm (both leads of a quarter bridge
    /// in the active arm).
    TwoWire,
    /// As two-wire, plus a separate sense lead from each output corner that joins a grid to an
    /// instrument-side resistor: the current-carrying lead moves into the adjacent arm, so lead
    /// drift cancels.
    #[default]
    ThreeWire,
    /// Three-wire plus sense leads at the excitation corners: the supply holds the voltage at the
    /// bridge itself, so excitation-lead drops and drift drop out.
    RemoteSense,
}

impl LeadWiring {
    /// The wirings offered for a bridge with `at_gauge` arms at the gauge site: a quarter
    /// bridge is wired with two or three wires; half and full bridges without or with remote
    /// sense (common practice).
    pub fn choices(at_gauge: usize) -> [LeadWiring; 2] {
        if at_gauge <= 1 {
            [LeadWiring::TwoWire, LeadWiring::ThreeWire]
        } else {
            [LeadWiring::ThreeWire, LeadWiring::RemoteSense]
        }
    }

    /// The name the trade gives this wiring of a bridge whose arms sit at the gauge site as
    /// `at_gauge` says: "two-wire" and "three-wire" for a quarter bridge; for half and full
    /// bridges the number of conductors and whether sense leads are run
    /// ("four-wire, no sense", "six-wire with remote sense" for a full bridge).
    pub fn trade_name(self, at_gauge: [bool; 4]) -> String {
        let count = at_gauge.iter().filter(|a| **a).count();
        if count <= 1 {
            return self.name().to_owned();
        }
        let circuit = BridgeCircuit {
            arms: at_gauge.map(|at_gauge| ArmResistor {
                ohm: 350.0,
                at_gauge,
            }),
            wiring: self,
            lead_ohm: 1.0,
            excitation: Excitation::default(),
            amplifier_input_ohm: None,
            shunt: None,
        };
        let conductors = circuit.network().1.lead_count;
        let words = [
            "no", "one", "two", "three", "four", "five", "six", "seven", "eight",
        ];
        let n = words.get(conductors).copied().unwrap_or("many");
        match self {
            LeadWiring::RemoteSense => format!("{n}-wire with remote sense"),
            _ => format!("{n}-wire, no sense"),
        }
    }

    /// Plain name.
    pub fn name(self) -> &'static str {
        match self {
            LeadWiring::TwoWire => "two-wire",
            LeadWiring::ThreeWire => "three-wire",
            LeadWiring::RemoteSense => "three-wire with remote sense",
        }
    }
}

/// Bridge excitation. Default: constant voltage 5 V.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum Excitation {
    /// Constant voltage, V.
    Voltage { volts: f64 },
    /// Constant current, A.
    Current { amps: f64 },
}

impl Default for Excitation {
    fn default() -> Self {
        Excitation::Voltage { volts: 5.0 }
    }
}

/// Where a shunt-calibration resistor is connected. Default: at the instrument.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum ShuntLocation {
    /// Directly across the arm at the gauge site (for an arm whose element sits in the
    /// instrument, directly across that element, the same as [`ShuntLocation::InstrumentEnd`]).
    GaugeEnd,
    /// Across the arm's terminals at the instrument, so leads sit in series with the shunt.
    #[default]
    InstrumentEnd,
}

/// One arm as the circuit sees it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ArmResistor {
    /// Resistance of the element, Ω.
    pub ohm: f64,
    /// True if the element sits at the gauge site (grids and dummies), false if at the
    /// instrument (completion resistors).
    pub at_gauge: bool,
}

/// A shunt resistor across one arm.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Shunt {
    /// Arm index 0..4 (arm 1 is index 0).
    pub arm: usize,
    /// Shunt resistance, Ω.
    pub ohm: f64,
    /// Where it is connected.
    pub location: ShuntLocation,
}

/// Everything needed to solve one bridge.
#[derive(Debug, Clone, PartialEq)]
pub struct BridgeCircuit {
    /// Arms 1..4 (indices 0..4).
    pub arms: [ArmResistor; 4],
    /// Lead wiring.
    pub wiring: LeadWiring,
    /// Resistance of one lead wire, Ω (below [`IDEAL_LEAD_OHM`] the leads are ideal).
    pub lead_ohm: f64,
    /// Excitation.
    pub excitation: Excitation,
    /// Amplifier differential input resistance, Ω (`None`: ideal, infinite).
    pub amplifier_input_ohm: Option<f64>,
    /// Optional shunt-calibration resistor.
    pub shunt: Option<Shunt>,
}

/// Lead resistance below which leads are treated as ideal connections, Ω.
pub const IDEAL_LEAD_OHM: f64 = 1e-6;

/// Bridge corners.
const EXC_POS: usize = 0;
const EXC_NEG: usize = 1;
const OUT_POS: usize = 2;
const OUT_NEG: usize = 3;

/// Corners each arm joins, in arm order 1..4.
pub const ARM_CORNERS: [(usize, usize); 4] = [
    (OUT_POS, EXC_NEG),
    (EXC_POS, OUT_POS),
    (EXC_POS, OUT_NEG),
    (OUT_NEG, EXC_NEG),
];

/// Node map of a built bridge network.
#[derive(Debug, Clone, PartialEq)]
pub struct BridgeNodes {
    /// Where each arm's element is connected (its two nodes).
    pub arm_nodes: [(Node, Node); 4],
    /// Amplifier input nodes (output +, output −).
    pub output: (Node, Node),
    /// The bridge's excitation corners as seen at the bridge (remote where grids are).
    pub bridge_excitation: (Node, Node),
    /// The instrument's excitation terminals.
    pub instrument_excitation: (Node, Node),
    /// Number of lead wires.
    pub lead_count: usize,
    /// Instrument-side end of each lead wire, with its role ("exc+", "sense out+", …).
    pub conductors: Vec<(&'static str, Node)>,
}

/// The solved bridge.
#[derive(Debug, Clone, PartialEq)]
pub struct BridgeSolution {
    /// Output voltage at the amplifier input, V.
    pub output_v: f64,
    /// Excitation voltage across the bridge corners, V.
    pub bridge_excitation_v: f64,
    /// Excitation voltage at the instrument terminals, V.
    pub instrument_excitation_v: f64,
    /// Voltage across each arm element, V.
    pub arm_volts: [f64; 4],
}

/// Conductor names of the corners, as the pin assignment knows them.
const CORNER: [&str; 4] = ["exc+", "exc-", "out+", "out-"];
const INSTRUMENT_NODE: [&str; 4] = [
    "exc+ instrument",
    "exc- instrument",
    "out+ instrument",
    "out- instrument",
];
const GAUGE_NODE: [&str; 4] = ["exc+ gauge", "exc- gauge", "out+ gauge", "out- gauge"];
const SENSE_NODE: [&str; 4] = ["exc+ sense", "exc- sense", "out+ sense", "out- sense"];
const LEAD: [&str; 4] = ["lead exc+", "lead exc-", "lead out+", "lead out-"];
const SENSE_LEAD: [&str; 4] = [
    "sense lead exc+",
    "sense lead exc-",
    "sense lead out+",
    "sense lead out-",
];
const SENSE_CONDUCTOR: [&str; 4] = ["sense exc+", "sense exc-", "sense out+", "sense out-"];
const ARM: [&str; 4] = ["arm 1", "arm 2", "arm 3", "arm 4"];

/// The leads of a bridge as built into its network.
struct Leads {
    /// Node of each corner at the gauge site (the instrument's where no lead runs).
    remote: [Node; 4],
    /// Node each corner is sensed at.
    sense: [Node; 4],
    /// Number of lead wires.
    count: usize,
    /// Instrument-side end of each lead wire, with its role.
    conductors: Vec<(&'static str, Node)>,
}

impl BridgeCircuit {
    /// Builds the network. Ground is the instrument's excitation − terminal.
    pub fn network(&self) -> (Network, BridgeNodes) {
        let mut net = Network::new();
        // Instrument drive node of each corner; excitation − is ground.
        let mut inst: [Node; 4] = [0; 4];
        for c in [EXC_POS, OUT_POS, OUT_NEG] {
            inst[c] = net.node(INSTRUMENT_NODE[c]);
        }
        inst[EXC_NEG] = 0;
        let leads = self.leads(&mut net, inst);
        let arm_nodes = self.arms_and_shunt(&mut net, inst, leads.remote);
        let output = (leads.sense[OUT_POS], leads.sense[OUT_NEG]);
        if let Some(rin) = self.amplifier_input_ohm {
            net.resistor("amplifier input", output.0, output.1, rin);
        }
        self.excitation_source(&mut net, inst, &leads);
        let nodes = BridgeNodes {
            arm_nodes,
            output,
            bridge_excitation: (leads.remote[EXC_POS], leads.remote[EXC_NEG]),
            instrument_excitation: (inst[EXC_POS], inst[EXC_NEG]),
            lead_count: leads.count,
            conductors: leads.conductors,
        };
        (net, nodes)
    }

    /// True when an arm at the gauge site (`at_gauge`) or in the instrument (not) touches
    /// corner `c`.
    fn corner_used(&self, c: usize, at_gauge: bool) -> bool {
        self.arms
            .iter()
            .zip(ARM_CORNERS)
            .any(|(a, (p, q))| a.at_gauge == at_gauge && (p == c || q == c))
    }

    /// The lead wires (and sense leads) from each corner used at the gauge site to the
    /// instrument.
    fn leads(&self, net: &mut Network, inst: [Node; 4]) -> Leads {
        let mut leads = Leads {
            remote: inst,
            sense: inst,
            count: 0,
            conductors: Vec::new(),
        };
        // Leads below a micro-ohm are treated as ideal (the nodes merge), which keeps the
        // equations well conditioned.
        let ideal_leads = self.lead_ohm < IDEAL_LEAD_OHM;
        for c in 0..4 {
            if !self.corner_used(c, true) || ideal_leads {
                continue;
            }
            leads.remote[c] = net.node(GAUGE_NODE[c]);
            net.resistor(LEAD[c], leads.remote[c], inst[c], self.lead_ohm);
            leads.count += 1;
            leads.conductors.push((CORNER[c], inst[c]));
            let output_corner = c == OUT_POS || c == OUT_NEG;
            let separate_sense = match self.wiring {
                LeadWiring::TwoWire => false,
                LeadWiring::ThreeWire => output_corner && self.corner_used(c, false),
                LeadWiring::RemoteSense => {
                    (output_corner && self.corner_used(c, false)) || c == EXC_POS || c == EXC_NEG
                }
            };
            if separate_sense {
                leads.sense[c] = net.node(SENSE_NODE[c]);
                net.resistor(
                    SENSE_LEAD[c],
                    leads.remote[c],
                    leads.sense[c],
                    self.lead_ohm,
                );
                leads.count += 1;
                leads.conductors.push((SENSE_CONDUCTOR[c], leads.sense[c]));
            } else if output_corner {
                leads.sense[c] = inst[c];
            }
        }
        leads
    }

    /// The four arms between their corners (at the gauge site or in the instrument), and the
    /// shunt where it is connected; returns each arm's nodes.
    fn arms_and_shunt(
        &self,
        net: &mut Network,
        inst: [Node; 4],
        remote: [Node; 4],
    ) -> [(Node, Node); 4] {
        let mut arm_nodes = [(0, 0); 4];
        for (k, (arm, (p, q))) in self.arms.iter().zip(ARM_CORNERS).enumerate() {
            let (a, b) = if arm.at_gauge {
                (remote[p], remote[q])
            } else {
                (inst[p], inst[q])
            };
            net.resistor(ARM[k], a, b, arm.ohm);
            arm_nodes[k] = (a, b);
        }
        if let Some(shunt) = self.shunt {
            let arm = shunt.arm.min(3);
            let (p, q) = ARM_CORNERS[arm];
            let (a, b) = match shunt.location {
                // Directly across the arm's element, wherever it sits: a resistor in the
                // instrument has no gauge-site end.
                ShuntLocation::GaugeEnd => arm_nodes[arm],
                ShuntLocation::InstrumentEnd => (inst[p], inst[q]),
            };
            net.resistor("shunt", a, b, shunt.ohm);
        }
        arm_nodes
    }

    /// The excitation source at the instrument's terminals; a voltage source regulates at
    /// the bridge where remote sense leads exist.
    fn excitation_source(&self, net: &mut Network, inst: [Node; 4], leads: &Leads) {
        let bridge_excitation = match self.wiring {
            LeadWiring::RemoteSense => (leads.sense[EXC_POS], leads.sense[EXC_NEG]),
            _ => (leads.remote[EXC_POS], leads.remote[EXC_NEG]),
        };
        match self.excitation {
            Excitation::Voltage { volts } => net.voltage_sources.push(VoltageSource {
                name: "excitation".into(),
                pos: inst[EXC_POS],
                neg: inst[EXC_NEG],
                volts,
                regulate: (self.wiring == LeadWiring::RemoteSense).then_some(bridge_excitation),
            }),
            Excitation::Current { amps } => net.current_sources.push(CurrentSource {
                name: "excitation".into(),
                from: inst[EXC_NEG],
                to: inst[EXC_POS],
                amps,
            }),
        }
    }

    /// Solves the bridge.
    pub fn solve(&self) -> Result<BridgeSolution, NetworkError> {
        let (net, nodes) = self.network();
        let s: Solution = net.solve()?;
        let arm_volts = nodes.arm_nodes.map(|(a, b)| s.between(a, b));
        Ok(BridgeSolution {
            output_v: s.between(nodes.output.0, nodes.output.1),
            bridge_excitation_v: s.between(nodes.bridge_excitation.0, nodes.bridge_excitation.1),
            instrument_excitation_v: s
                .between(nodes.instrument_excitation.0, nodes.instrument_excitation.1),
            arm_volts,
        })
    }

    /// Thevenin resistance seen by the amplifier between the output nodes (sources zeroed,
    /// amplifier input resistance excluded), Ω.
    pub fn output_resistance_ohm(&self) -> Result<f64, NetworkError> {
        let mut quiet = self.clone();
        quiet.amplifier_input_ohm = None;
        quiet.excitation = Excitation::Voltage { volts: 0.0 };
        let (mut net, nodes) = quiet.network();
        // A regulated source with zero set point still holds its sense nodes together.
        net.current_sources.push(CurrentSource {
            name: "probe".into(),
            from: nodes.output.1,
            to: nodes.output.0,
            amps: 1.0,
        });
        let s = net.solve()?;
        Ok(s.between(nodes.output.0, nodes.output.1))
    }
}

/// Output ratio Vo/Vex of an ideal equal-arm bridge from the four arms' ΔR/R, exact:
/// Vo/Vex = R1/(R1+R2) − R4/(R3+R4) with Rk = R(1 + δk).
pub fn ideal_output_ratio(deltas: [f64; 4]) -> f64 {
    let r = deltas.map(|d| 1.0 + d);
    r[0] / (r[0] + r[1]) - r[3] / (r[2] + r[3])
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    fn quarter(ohm: f64, wiring: LeadWiring, lead: f64) -> BridgeCircuit {
        let arm = |ohm, at_gauge| ArmResistor { ohm, at_gauge };
        BridgeCircuit {
            arms: [
                arm(ohm, true),
                arm(350.0, false),
                arm(350.0, false),
                arm(350.0, false),
            ],
            wiring,
            lead_ohm: lead,
            excitation: Excitation::Voltage { volts: 5.0 },
            amplifier_input_ohm: None,
            shunt: None,
        }
    }

    #[test]
    fn quarter_bridge_without_leads_matches_the_divider_formula() {
        let s = quarter(350.7, LeadWiring::TwoWire, 0.0).solve().unwrap();
        let expected = 5.0 * ideal_output_ratio([0.7 / 350.0, 0.0, 0.0, 0.0]);
        assert_relative_eq!(s.output_v, expected, max_relative = 1e-12);
    }

    #[test]
    fn lead_counts_match_the_wiring_names() {
        assert_eq!(
            quarter(350.0, LeadWiring::TwoWire, 0.1)
                .network()
                .1
                .lead_count,
            2
        );
        assert_eq!(
            quarter(350.0, LeadWiring::ThreeWire, 0.1)
                .network()
                .1
                .lead_count,
            3
        );
    }

    #[test]
    fn a_gauge_end_shunt_across_a_resistor_in_the_instrument_sits_across_that_resistor() {
        // Two-wire quarter bridge with 2 Ω leads: a shunt across arm 2 (a resistor in the
        // instrument) planned "at the gauge end" is the same circuit as one at the instrument
        // end, both straight across the resistor. Checked by hand: arm 2 becomes 350 ‖ R.
        let with = |location| {
            let mut c = quarter(350.0, LeadWiring::TwoWire, 2.0);
            c.shunt = Some(Shunt {
                arm: 1,
                ohm: 100_000.0,
                location,
            });
            c.solve().unwrap().output_v
        };
        let gauge_end = with(ShuntLocation::GaugeEnd);
        let instrument_end = with(ShuntLocation::InstrumentEnd);
        assert_relative_eq!(gauge_end, instrument_end, max_relative = 1e-12);
        let parallel = 350.0 * 100_000.0 / 100_350.0;
        let mut by_hand = quarter(350.0, LeadWiring::TwoWire, 2.0);
        by_hand.arms[1].ohm = parallel;
        assert_relative_eq!(
            gauge_end,
            by_hand.solve().unwrap().output_v,
            max_relative = 1e-9
        );
        // Across the grid (arm 1) the two ends differ by the leads.
        let across_grid = |location| {
            let mut c = quarter(350.0, LeadWiring::TwoWire, 2.0);
            c.shunt = Some(Shunt {
                arm: 0,
                ohm: 100_000.0,
                location,
            });
            c.solve().unwrap().output_v
        };
        assert!(
            (across_grid(ShuntLocation::GaugeEnd) - across_grid(ShuntLocation::InstrumentEnd))
                .abs()
                > 1e-6
        );
    }
}
