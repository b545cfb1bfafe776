//! The bridge circuit solver (`gw_bridge::circuit::BridgeCircuit`) against ngspice, the
//! open-source descendant of Berkeley SPICE, on bridges whose netlists are written out by hand
//! below, node by node, from the way an instrumentation engineer wires them.
//!
//! `ngspice_bridge.rs` feeds ngspice the netlist the project builds itself, so a wiring mistake
//! shared by the builder and the solver would pass there. Here every netlist is drawn from the
//! physical layout instead: which tab each lead lands on, which terminal of the instrument it
//! reaches, which leads carry current and which only sense. Reference for every check: the
//! ngspice DC operating point (`op`) of that netlist, printed with 15 significant digits.
//!
//! Cases: a quarter bridge with a three-wire connection; the same with a remote sense lead; a
//! six-wire full bridge with remote sense; a half bridge with a shunt-calibration resistor at
//! the gauge end and at the instrument end of the leads; constant-current excitation of a half
//! bridge completed by resistors of another value; finite amplifier input resistance on a
//! four-wire full bridge and on a three-wire quarter bridge.
//!
//! Tolerance: 1 µV on every voltage. Where the supply is a plain source both sides solve the
//! same linear equations directly and agree to rounding (about 1e-14 V). A remote-sense supply
//! is an error amplifier of finite loop gain in the netlist (see [`REGULATOR_GAIN`]); it leaves
//! up to about 0.1 µV on the excitation voltages. 1 µV covers that and is still far below any
//! wiring mistake worth catching: moving the three-wire quarter bridge's lead A from arm 2
//! into arm 1 shifts its output by about 10 mV.

use std::io::Write;
use std::process::Command;

use gw_bridge::circuit::{
    ArmResistor, BridgeCircuit, BridgeSolution, Excitation, LeadWiring, Shunt, ShuntLocation,
};
use gw_verify::require_tool;

/// Agreement required on every compared voltage, V.
const TOLERANCE_V: f64 = 1e-6;

/// Loop gain of the error amplifier that stands for a remote-sense supply in the netlists.
/// The supply holds the sensed voltage Vout/gain below the set point (about 50 nV here) and the
/// bridge output the same 1 part in 1e8 low. A higher gain does not help: the rounding of
/// ngspice's solve grows with the gain (measured: 0.35 µV on the six-wire bridge at 1e9, 2.7 µV
/// at 1e10, against 70 nV at 1e8).
const REGULATOR_GAIN: &str = "1e8";

fn arm(ohm: f64, at_gauge: bool) -> ArmResistor {
    ArmResistor { ohm, at_gauge }
}

/// Runs `netlist` (title line and elements, no `.end`) through ngspice in batch mode at its DC
/// operating point and returns each `(label, expression)` probe's value, V.
fn ngspice(case: &str, netlist: &str, probes: &[(&str, &str)]) -> Vec<f64> {
    let mut deck = netlist.to_owned();
    deck.push_str(".control\nset numdgt=15\nop\n");
    for (label, expression) in probes {
        deck.push_str(&format!("let {label} = {expression}\nprint {label}\n"));
    }
    deck.push_str(".endc\n.end\n");
    let path =
        std::env::temp_dir().join(format!("gw-hand-netlist-{}-{case}.cir", std::process::id()));
    std::fs::File::create(&path)
        .and_then(|mut f| f.write_all(deck.as_bytes()))
        .expect("netlist written to the temporary directory");
    let out = Command::new("ngspice")
        .arg("-b")
        .arg(&path)
        .output()
        .expect("ngspice runs");
    let _ = std::fs::remove_file(&path);
    let text = String::from_utf8_lossy(&out.stdout);
    probes
        .iter()
        .map(|(label, _)| {
            text.lines()
                .find_map(|l| {
                    let (name, value) = l.split_once('=')?;
                    (name.trim() == *label).then(|| value.trim().parse::<f64>().ok())?
                })
                .unwrap_or_else(|| {
                    panic!(
                        "{case}: ngspice printed no {label}:\n{text}\n{}\n{deck}",
                        String::from_utf8_lossy(&out.stderr)
                    )
                })
        })
        .collect()
}

/// Checks `ours` against the ngspice value to [`TOLERANCE_V`] and prints the difference.
fn agree(case: &str, quantity: &str, ours: f64, ngspice: f64) {
    let diff = (ours - ngspice).abs();
    assert!(
        diff < TOLERANCE_V,
        "{case}, {quantity}: solver {ours:.12e} V, ngspice {ngspice:.12e} V (difference {diff:.3e} V)"
    );
    println!(
        "{case}, {quantity}: solver {ours:.9e} V, ngspice {ngspice:.9e} V, difference {diff:.2e} V"
    );
}

fn solve(circuit: &BridgeCircuit) -> BridgeSolution {
    circuit.solve().expect("the bridge solves")
}

// ------------------------------------------------------------------------------------------
// Quarter bridge, three-wire.
// ------------------------------------------------------------------------------------------

/// One active gauge in arm 1 at the gauge site; arms 2, 3 and 4 are completion resistors in the
/// instrument (arm 3 and arm 4 slightly unequal, so swapping them would show). Each lead 1.5 Ω
/// (about 11 m of 0.14 mm² copper). 5 V excitation.
fn quarter_three_wire(wiring: LeadWiring, amplifier_input_ohm: Option<f64>) -> BridgeCircuit {
    BridgeCircuit {
        arms: [
            arm(350.7, true),
            arm(350.0, false),
            arm(350.3, false),
            arm(349.6, false),
        ],
        wiring,
        lead_ohm: 1.5,
        excitation: Excitation::Voltage { volts: 5.0 },
        amplifier_input_ohm,
        shunt: None,
    }
}

/// The quarter bridge's hand netlist up to (not including) the supply and the amplifier.
const QUARTER_THREE_WIRE: &str = "\
* Quarter bridge, three-wire connection.
* Instrument terminals: exc_p (excitation +), 0 (excitation -, ground), term_a (the end of
* the completion resistor that lead A lands on), amp_p (amplifier + input, where sense lead C
* lands). Gauge site: one gauge with an upper and a lower solder tab.
*
* Completion half bridge inside the instrument: arm 3 from excitation + to the amplifier -
* input, arm 4 from there to excitation -.
R3 exc_p amp_n 350.3
R4 amp_n 0 349.6
* Arm 2, the quarter-bridge completion resistor, from excitation + to the lead A terminal.
R2 exc_p term_a 350.0
* Lead A carries the bridge current from that terminal out to the gauge's upper tab, so it
* sits in arm 2, the arm adjacent to the gauge.
RLA term_a tab_up 1.5
* Lead C runs from the same upper tab back to the amplifier + input. The upper tab is the
* bridge's output + corner; lead C carries only the amplifier's input current.
RLC tab_up amp_p 1.5
* The gauge, arm 1, between its tabs.
RG tab_up tab_low 350.7
* Lead B returns from the lower tab to excitation -, so it sits in arm 1 with the gauge: one
* lead in each of two adjacent arms, and lead drift cancels.
RLB tab_low 0 1.5
";

#[test]
fn quarter_bridge_three_wire_matches_ngspice() {
    if !require_tool("ngspice", "--version", "ngspice") {
        return;
    }
    let case = "quarter bridge three-wire";
    let ours = solve(&quarter_three_wire(LeadWiring::ThreeWire, None));
    let netlist = format!(
        "{case}\n{QUARTER_THREE_WIRE}\
* A plain 5 V supply across the instrument's excitation terminals.
Vexc exc_p 0 DC 5
"
    );
    let v = ngspice(
        "quarter-three-wire",
        &netlist,
        &[("vout", "v(amp_p) - v(amp_n)")],
    );
    agree(case, "output", ours.output_v, v[0]);
}

#[test]
fn quarter_bridge_with_remote_sense_matches_ngspice() {
    if !require_tool("ngspice", "--version", "ngspice") {
        return;
    }
    // The app offers remote sense for half and full bridges only (`LeadWiring::choices`), but
    // the solver accepts it on a quarter bridge; this is the wiring it then stands for.
    let case = "quarter bridge three-wire with remote sense";
    let ours = solve(&quarter_three_wire(LeadWiring::RemoteSense, None));
    let netlist = format!(
        "{case}\n{QUARTER_THREE_WIRE}\
* Remote sense. The excitation + corner is inside the instrument (arms 2 and 3 meet there),
* so sense + is the excitation + terminal itself. The only far point on the excitation side
* is the gauge's lower tab: a fourth lead, D, runs from it to the supply's sense - input and
* carries no current.
RLD tab_low sense_n 1.5
* The supply as an error amplifier: a 5 V reference stands on sense -, and the output at
* excitation + is driven until excitation + minus sense - equals the reference.
Vref ref sense_n DC 5
Esup exc_p 0 ref exc_p {REGULATOR_GAIN}
"
    );
    let v = ngspice(
        "quarter-remote-sense",
        &netlist,
        &[
            ("vout", "v(amp_p) - v(amp_n)"),
            ("vsensed", "v(exc_p) - v(sense_n)"),
            ("vterminals", "v(exc_p)"),
        ],
    );
    agree(case, "output", ours.output_v, v[0]);
    agree(case, "sensed excitation", ours.bridge_excitation_v, v[1]);
    agree(
        case,
        "excitation at the instrument terminals",
        ours.instrument_excitation_v,
        v[2],
    );
}

// ------------------------------------------------------------------------------------------
// Full bridge, six-wire with remote sense.
// ------------------------------------------------------------------------------------------

#[test]
fn full_bridge_six_wire_remote_sense_matches_ngspice() {
    if !require_tool("ngspice", "--version", "ngspice") {
        return;
    }
    let case = "full bridge six-wire with remote sense";
    // Four grids on a bending beam (arms 1 and 3 in tension, 2 and 4 in compression), each a
    // little off nominal; 2.5 Ω per lead.
    let ours = solve(&BridgeCircuit {
        arms: [
            arm(350.70, true),
            arm(349.25, true),
            arm(350.80, true),
            arm(349.40, true),
        ],
        wiring: LeadWiring::RemoteSense,
        lead_ohm: 2.5,
        excitation: Excitation::Voltage { volts: 5.0 },
        amplifier_input_ohm: None,
        shunt: None,
    });
    let netlist = format!(
        "{case}
* Transducer: all four arms at the gauge site, corners exc_p_br, exc_n_br, out_p_br,
* out_n_br. Instrument terminals: exc_p (excitation +), 0 (excitation -), sense_p, sense_n,
* amp_p, amp_n.
R1 out_p_br exc_n_br 350.70
R2 exc_p_br out_p_br 349.25
R3 exc_p_br out_n_br 350.80
R4 out_n_br exc_n_br 349.40
* Excitation leads carry the bridge current from the terminals to the excitation corners.
RLEP exc_p exc_p_br 2.5
RLEN exc_n_br 0 2.5
* Sense leads run from the same corners back to the supply's sense inputs, no current.
RLSP exc_p_br sense_p 2.5
RLSN exc_n_br sense_n 2.5
* Signal leads from the output corners to the amplifier inputs, no current.
RLOP out_p_br amp_p 2.5
RLON out_n_br amp_n 2.5
* The supply as an error amplifier holding sense + minus sense - at the 5 V reference.
Vref ref sense_n DC 5
Esup exc_p 0 ref sense_p {REGULATOR_GAIN}
"
    );
    let v = ngspice(
        "full-six-wire",
        &netlist,
        &[
            ("vout", "v(amp_p) - v(amp_n)"),
            ("vbridge", "v(exc_p_br) - v(exc_n_br)"),
            ("vterminals", "v(exc_p)"),
        ],
    );
    agree(case, "output", ours.output_v, v[0]);
    agree(
        case,
        "excitation across the bridge",
        ours.bridge_excitation_v,
        v[1],
    );
    agree(
        case,
        "excitation at the instrument terminals",
        ours.instrument_excitation_v,
        v[2],
    );
}

// ------------------------------------------------------------------------------------------
// Half bridge with shunt calibration.
// ------------------------------------------------------------------------------------------

/// Half bridge for bending: the tension grid in arm 1 and the compression grid in arm 2 at the
/// gauge site, arms 3 and 4 completion resistors in the instrument. Three conductors (the
/// solver's two-wire setting; the trade calls this three-wire, no sense). 174.65 kΩ across
/// arm 2 simulates about +1000 µε at gauge factor 2 (ε = R / (GF (R + Rs)), sign flipped by
/// arm 2's place in the bridge).
fn half_bridge_with_shunt(location: ShuntLocation) -> BridgeCircuit {
    BridgeCircuit {
        arms: [
            arm(350.35, true),
            arm(349.65, true),
            arm(350.2, false),
            arm(349.9, false),
        ],
        wiring: LeadWiring::TwoWire,
        lead_ohm: 1.5,
        excitation: Excitation::Voltage { volts: 5.0 },
        amplifier_input_ohm: None,
        shunt: Some(Shunt {
            arm: 1,
            ohm: 174_650.0,
            location,
        }),
    }
}

const HALF_BRIDGE: &str = "\
* Half bridge, three conductors. Gauge site: grid 1 (tension) and grid 2 (compression)
* share a middle tab, the output + corner; grid 2's free end is the excitation + corner,
* grid 1's free end the excitation - corner. Instrument terminals: exc_p, 0 (excitation -),
* amp_p (signal), amp_n.
Vexc exc_p 0 DC 5
* Completion half bridge inside the instrument, across its excitation terminals.
R3 exc_p amp_n 350.2
R4 amp_n 0 349.9
* The two grids.
RG2 tab_exc_p tab_mid 349.65
RG1 tab_mid tab_exc_n 350.35
* Excitation leads carry the gauge half's current.
RLEP exc_p tab_exc_p 1.5
RLEN tab_exc_n 0 1.5
* Signal lead from the middle tab to the amplifier + input.
RLS tab_mid amp_p 1.5
";

/// The half bridge with its shunt placed by `shunt_lines` (netlist text), against ours with the
/// shunt at `location`.
fn half_bridge_shunt_case(case: &str, tag: &str, location: ShuntLocation, shunt_lines: &str) {
    let ours = solve(&half_bridge_with_shunt(location));
    let netlist = format!("{case}\n{HALF_BRIDGE}{shunt_lines}");
    let v = ngspice(
        tag,
        &netlist,
        &[
            ("vout", "v(amp_p) - v(amp_n)"),
            ("vgauges", "v(tab_exc_p) - v(tab_exc_n)"),
        ],
    );
    agree(case, "output", ours.output_v, v[0]);
    agree(
        case,
        "excitation across the gauge half",
        ours.bridge_excitation_v,
        v[1],
    );
}

#[test]
fn half_bridge_shunt_at_the_gauge_end_matches_ngspice() {
    if !require_tool("ngspice", "--version", "ngspice") {
        return;
    }
    half_bridge_shunt_case(
        "half bridge, shunt at the gauge end",
        "half-shunt-gauge-end",
        ShuntLocation::GaugeEnd,
        "\
* Shunt soldered straight across grid 2's tabs: no lead in series with it.
RSH tab_exc_p tab_mid 174650
",
    );
}

#[test]
fn half_bridge_shunt_at_the_instrument_end_matches_ngspice() {
    if !require_tool("ngspice", "--version", "ngspice") {
        return;
    }
    half_bridge_shunt_case(
        "half bridge, shunt at the instrument end",
        "half-shunt-instrument-end",
        ShuntLocation::InstrumentEnd,
        "\
* Shunt switched in at the instrument across grid 2's terminals, excitation + and signal:
* its current runs out along the excitation + lead and back along the signal lead, so both
* leads sit in series with it and the signal lead now carries current.
RSH exc_p amp_p 174650
",
    );
}

// ------------------------------------------------------------------------------------------
// Constant-current excitation, unequal arms.
// ------------------------------------------------------------------------------------------

#[test]
fn constant_current_half_bridge_with_unequal_arms_matches_ngspice() {
    if !require_tool("ngspice", "--version", "ngspice") {
        return;
    }
    let case = "constant current, 350 Ω half bridge completed by 1 kΩ";
    // 350 Ω grids at the gauge site completed by 1 kΩ resistors (0.3 % apart) in the
    // instrument: the 10 mA splits between the two halves, and the split depends on the leads.
    let ours = solve(&BridgeCircuit {
        arms: [
            arm(350.7, true),
            arm(349.3, true),
            arm(1000.0, false),
            arm(1003.0, false),
        ],
        wiring: LeadWiring::ThreeWire,
        lead_ohm: 1.5,
        excitation: Excitation::Current { amps: 0.01 },
        amplifier_input_ohm: None,
        shunt: None,
    });
    let netlist = format!(
        "{case}
* Half bridge, three conductors, as in the shunt cases; 1 kOhm completion half.
* Constant-current source: 10 mA out of the excitation + terminal, back into excitation -.
Iexc 0 exc_p DC 10m
R3 exc_p amp_n 1000
R4 amp_n 0 1003
RG2 tab_exc_p tab_mid 349.3
RG1 tab_mid tab_exc_n 350.7
RLEP exc_p tab_exc_p 1.5
RLEN tab_exc_n 0 1.5
RLS tab_mid amp_p 1.5
"
    );
    let v = ngspice(
        "constant-current",
        &netlist,
        &[
            ("vout", "v(amp_p) - v(amp_n)"),
            ("vgauges", "v(tab_exc_p) - v(tab_exc_n)"),
            ("vterminals", "v(exc_p)"),
        ],
    );
    agree(case, "output", ours.output_v, v[0]);
    agree(
        case,
        "excitation across the gauge half",
        ours.bridge_excitation_v,
        v[1],
    );
    agree(
        case,
        "excitation at the instrument terminals",
        ours.instrument_excitation_v,
        v[2],
    );
}

// ------------------------------------------------------------------------------------------
// Finite amplifier input resistance.
// ------------------------------------------------------------------------------------------

#[test]
fn amplifier_input_resistance_on_a_four_wire_full_bridge_matches_ngspice() {
    if !require_tool("ngspice", "--version", "ngspice") {
        return;
    }
    let case = "four-wire full bridge into a 10 kΩ amplifier";
    // A low input resistance (an older carrier-frequency amplifier, or a logger's divider)
    // draws current through the signal leads, which then drop voltage.
    let ours = solve(&BridgeCircuit {
        arms: [
            arm(350.70, true),
            arm(349.25, true),
            arm(350.80, true),
            arm(349.40, true),
        ],
        wiring: LeadWiring::ThreeWire,
        lead_ohm: 2.5,
        excitation: Excitation::Voltage { volts: 5.0 },
        amplifier_input_ohm: Some(10_000.0),
        shunt: None,
    });
    let netlist = format!(
        "{case}
* Transducer: all four arms at the gauge site; four conductors, no sense.
Vexc exc_p 0 DC 5
R1 out_p_br exc_n_br 350.70
R2 exc_p_br out_p_br 349.25
R3 exc_p_br out_n_br 350.80
R4 out_n_br exc_n_br 349.40
RLEP exc_p exc_p_br 2.5
RLEN exc_n_br 0 2.5
* Signal leads to the amplifier, whose 10 kOhm differential input closes the loop.
RLOP out_p_br amp_p 2.5
RLON out_n_br amp_n 2.5
RIN amp_p amp_n 10000
"
    );
    let v = ngspice(
        "amplifier-full",
        &netlist,
        &[
            ("vout", "v(amp_p) - v(amp_n)"),
            ("vbridge", "v(exc_p_br) - v(exc_n_br)"),
        ],
    );
    agree(case, "output", ours.output_v, v[0]);
    agree(
        case,
        "excitation across the bridge",
        ours.bridge_excitation_v,
        v[1],
    );
}

#[test]
fn amplifier_input_resistance_on_a_three_wire_quarter_bridge_matches_ngspice() {
    if !require_tool("ngspice", "--version", "ngspice") {
        return;
    }
    let case = "three-wire quarter bridge into a 10 kΩ amplifier";
    let ours = solve(&quarter_three_wire(LeadWiring::ThreeWire, Some(10_000.0)));
    let netlist = format!(
        "{case}\n{QUARTER_THREE_WIRE}\
Vexc exc_p 0 DC 5
* The amplifier's input resistance draws current through sense lead C.
RIN amp_p amp_n 10000
"
    );
    let v = ngspice(
        "amplifier-quarter",
        &netlist,
        &[("vout", "v(amp_p) - v(amp_n)")],
    );
    agree(case, "output", ours.output_v, v[0]);
}
