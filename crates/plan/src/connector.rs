//! What the technician wires at the cable's connector: our own plain default pin assignment
//! for a bridge's conductors, and the sign of the strain each arm's grid sees under the wanted
//! load, so the wiring can be checked by loading the part.
//!
//! # Pin assignment
//! Every role has its own pin, the same on every channel whatever the wiring, in our own
//! plain fixed order: 1 excitation +, 2 excitation −, 3 output +, 4 output −,
//! 5 excitation + sense, 6 excitation − sense, 7 output + sense, 8 output − sense,
//! 9 shield (drain). A wiring uses the pins of the conductors it has (as
//! [`BridgeCircuit::network`] lists them) and the shield; its other pins stay empty. Four
//! grids wired without sense leads use pins one to four and the shield pin; one grid wired
//! with two wires uses the excitation − and output + pins and the shield pin.

use gw_bridge::circuit::{ARM_CORNERS, ArmResistor, BridgeCircuit, Excitation, ShuntLocation};
use gw_bridge::model::ARM_SIGNS;
use gw_bridge::{BridgeModel, LeadWiring, Setup};
use gw_mechanics::{LoadVector, QuadratureOrder};

use crate::document::{BridgePlan, LeadColours, Part, PlanArm, Project};
use crate::validate::bridge_from_plan;

/// The conductor name the shield has in a [`Pinout`] (the circuit has no such conductor).
pub const SHIELD: &str = "shield";

/// Conductor names in pin order, as the circuit names them: pin `k + 1` carries
/// `PIN_ROLES[k]` on every channel.
const PIN_ROLES: [&str; 9] = [
    "exc+",
    "exc-",
    "out+",
    "out-",
    "sense exc+",
    "sense exc-",
    "sense out+",
    "sense out-",
    SHIELD,
];

/// The fixed pin of a conductor by the circuit's name ("out+", "sense exc-", "shield"), or
/// `None` for a name the circuit does not use.
pub fn pin_number(conductor: &str) -> Option<usize> {
    PIN_ROLES
        .iter()
        .position(|r| *r == conductor)
        .map(|k| k + 1)
}

/// The circuit's name of the current-carrying conductor at each bridge corner (corner order of
/// [`ARM_CORNERS`]: excitation +, excitation −, output +, output −).
pub const CORNER_CONDUCTORS: [&str; 4] = ["exc+", "exc-", "out+", "out-"];

/// One connector pin.
#[derive(Debug, Clone, PartialEq)]
pub struct Pin {
    /// Pin number, from 1.
    pub number: usize,
    /// The circuit's name of the conductor ("exc+", "sense out-", …) or [`SHIELD`].
    pub conductor: String,
    /// Its role in words: "excitation +", "output − sense", "shield (drain)".
    pub role: String,
    /// The colour of the conductor, from the project's lead colours.
    pub colour: String,
}

impl Pin {
    /// "pin 3 (output +)".
    pub fn words(&self) -> String {
        format!("pin {} ({})", self.number, self.role)
    }
}

/// The pins of one bridge's connector that its wiring uses.
#[derive(Debug, Clone, PartialEq)]
pub struct Pinout {
    /// The used pins in pin-number order (numbers from the fixed order, so with gaps where
    /// the wiring has no such conductor); the shield is last.
    pub pins: Vec<Pin>,
}

/// The role of a conductor in words, or `None` for a name the circuit does not use.
pub fn role_words(conductor: &str) -> Option<&'static str> {
    Some(match conductor {
        "exc+" => "excitation +",
        "exc-" => "excitation −",
        "out+" => "output +",
        "out-" => "output −",
        "sense exc+" => "excitation + sense",
        "sense exc-" => "excitation − sense",
        "sense out+" => "output + sense",
        "sense out-" => "output − sense",
        SHIELD => "shield (drain)",
        _ => return None,
    })
}

fn colour_of(conductor: &str, colours: &LeadColours) -> String {
    match conductor {
        "exc+" => colours.excitation_pos.clone(),
        "exc-" => colours.excitation_neg.clone(),
        "out+" => colours.output_pos.clone(),
        "out-" => colours.output_neg.clone(),
        SHIELD => colours.shield.clone(),
        _ => colours.sense.clone(),
    }
}

/// The cable conductors a bridge wired as `plan` says has, by the circuit's names, in the
/// circuit's order. The list does not depend on the leads' resistance: leads too short to
/// model are still wires to connect.
pub fn conductors(plan: &BridgePlan) -> Vec<&'static str> {
    circuit_conductors(plan.arms.each_ref().map(at_gauge), plan.wiring)
}

/// True for an arm element that sits at the gauge site (grids and dummies).
pub fn at_gauge(arm: &PlanArm) -> bool {
    !matches!(arm, PlanArm::Completion(_))
}

/// The conductors of a bridge whose arms sit at the gauge site as `at_gauge` says.
pub fn circuit_conductors(at_gauge: [bool; 4], wiring: LeadWiring) -> Vec<&'static str> {
    let circuit = BridgeCircuit {
        arms: at_gauge.map(|at_gauge| ArmResistor {
            ohm: 350.0,
            at_gauge,
        }),
        wiring,
        // Any real lead: below the ideal limit the circuit merges the nodes and lists none.
        lead_ohm: 1.0,
        excitation: Excitation::default(),
        amplifier_input_ohm: None,
        shunt: None,
    };
    circuit
        .network()
        .1
        .conductors
        .into_iter()
        .map(|(name, _)| name)
        .collect()
}

impl Pinout {
    /// Pins for the conductors named (the circuit's names, any order) plus the shield, each on
    /// its fixed pin; a name the circuit does not use is refused with a message.
    pub fn new(conductors: &[&str], colours: &LeadColours) -> Result<Pinout, String> {
        let wires = &PIN_ROLES[..PIN_ROLES.len() - 1];
        if let Some(bad) = conductors.iter().find(|c| !wires.contains(c)) {
            return Err(format!(
                "\"{bad}\" is not a bridge conductor; expected one of {}",
                wires.join(", ")
            ));
        }
        let pins: Vec<Pin> = PIN_ROLES
            .iter()
            .enumerate()
            .filter(|(_, r)| **r == SHIELD || conductors.contains(r))
            .map(|(k, c)| Pin {
                number: k + 1,
                conductor: (*c).to_owned(),
                role: role_words(c).unwrap_or(c).to_owned(),
                colour: colour_of(c, colours),
            })
            .collect();
        Ok(pins_checked(pins))
    }

    /// The pinout of a bridge in the plan, with the project's lead colours.
    pub fn for_bridge(plan: &BridgePlan, colours: &LeadColours) -> Pinout {
        // Every name comes from the circuit, so none is refused.
        Pinout::new(&conductors(plan), colours).unwrap_or(Pinout { pins: Vec::new() })
    }

    /// The pin of a conductor by the circuit's name ("out+", "sense exc-", "shield").
    pub fn pin(&self, conductor: &str) -> Option<&Pin> {
        self.pins.iter().find(|p| p.conductor == conductor)
    }

    /// The shield's pin (always the last, pin 9).
    pub fn shield(&self) -> Option<&Pin> {
        self.pin(SHIELD)
    }

    /// The pins this wiring leaves empty: their numbers and the roles they have on other
    /// channels, in pin order.
    pub fn unused(&self) -> Vec<(usize, &'static str)> {
        PIN_ROLES
            .iter()
            .enumerate()
            .filter(|(_, c)| self.pin(c).is_none())
            .map(|(k, c)| (k + 1, role_words(c).unwrap_or(c)))
            .collect()
    }

    /// The conductors without the shield, in pin order.
    pub fn conductor_pins(&self) -> impl Iterator<Item = &Pin> {
        self.pins.iter().filter(|p| p.conductor != SHIELD)
    }

    /// A pair of conductors named as [`crate::wiring::pin_resistances`] names them
    /// ("exc+ to out+") in pins: "pin 1 (excitation +) to pin 3 (output +)". `None` when
    /// either name has no pin here.
    pub fn pair_words(&self, pair: &str) -> Option<String> {
        let (a, b) = pair.split_once(" to ")?;
        let (a, b) = (self.pin(a.trim())?, self.pin(b.trim())?);
        Some(format!("{} to {}", a.words(), b.words()))
    }

    /// The two pins a shunt across arm index `arm` (0..4, arm 1 is index 0) lands on: the
    /// current-carrying conductors of the arm's two corners. `None` when a corner has no
    /// conductor in the cable (both ends of that corner are inside the instrument).
    pub fn shunt_pins(&self, arm: usize) -> Option<(&Pin, &Pin)> {
        let (p, q) = ARM_CORNERS.get(arm)?;
        Some((
            self.pin(CORNER_CONDUCTORS[*p])?,
            self.pin(CORNER_CONDUCTORS[*q])?,
        ))
    }

    /// Where a shunt across arm index `arm` lands, in words: "between pin 1 (excitation +)
    /// and pin 3 (output +)", or the instrument's terminals where a corner has no pin.
    pub fn shunt_words(&self, arm: usize) -> String {
        if let Some((a, b)) = self.shunt_pins(arm) {
            return format!("between {} and {}", a.words(), b.words());
        }
        let Some((p, q)) = ARM_CORNERS.get(arm) else {
            return format!("across arm {}, which the bridge does not have", arm + 1);
        };
        let end = |c: usize| match self.pin(CORNER_CONDUCTORS[c]) {
            Some(pin) => pin.words(),
            None => format!(
                "the instrument's {} terminal (no pin)",
                role_words(CORNER_CONDUCTORS[c]).unwrap_or("")
            ),
        };
        format!("between {} and {}", end(*p), end(*q))
    }
}

/// Each pin on its fixed number, in order, the shield last (an internal invariant of
/// [`Pinout::new`]).
fn pins_checked(pins: Vec<Pin>) -> Pinout {
    debug_assert!(
        pins.iter()
            .all(|p| pin_number(&p.conductor) == Some(p.number))
    );
    debug_assert!(pins.windows(2).all(|w| w[0].number < w[1].number));
    debug_assert!(pins.last().is_some_and(|p| p.conductor == SHIELD));
    Pinout { pins }
}

/// Where a planned shunt is connected: the arm (index 0..4) and whether it sits at the gauge
/// site. A shunt planned at the gauge end across a completion resistor goes across that
/// resistor in the instrument, as the schematic draws it.
pub(crate) fn shunt_place(plan: &BridgePlan) -> Option<(usize, bool)> {
    let shunt = plan.shunt?;
    let arm = shunt.arm.min(3);
    let at_gauge_end =
        shunt.location == ShuntLocation::GaugeEnd && plan.arms.get(arm).is_some_and(at_gauge);
    Some((arm, at_gauge_end))
}

/// Where the shunt of a bridge goes, in the words the schematic's notes and the bridge's
/// checks both use: "across arm 1 at the instrument end, between pin 3 (output +) and pin 2
/// (excitation −)", or "across arm 1 at the gauge end, between the gauge-site terminals of
/// pin 3 (output +) and pin 2 (excitation −)". `None` when no shunt is planned.
pub(crate) fn shunt_place_words(plan: &BridgePlan, colours: &LeadColours) -> Option<String> {
    let planned = plan.shunt?.location;
    let (arm, at_gauge_end) = shunt_place(plan)?;
    let pins = Pinout::for_bridge(plan, colours);
    let n = arm + 1;
    Some(match (at_gauge_end, planned) {
        (true, _) => match pins.shunt_pins(arm) {
            Some((a, b)) => format!(
                "across arm {n} at the gauge end, between the gauge-site terminals of {} and {}",
                a.words(),
                b.words()
            ),
            None => format!("across arm {n} at the gauge end, {}", pins.shunt_words(arm)),
        },
        (false, ShuntLocation::GaugeEnd) => format!(
            "across arm {n} at the instrument end (planned at the gauge end, but arm {n} is a \
             resistor in the instrument), {}",
            pins.shunt_words(arm)
        ),
        (false, ShuntLocation::InstrumentEnd) => {
            format!(
                "across arm {n} at the instrument end, {}",
                pins.shunt_words(arm)
            )
        }
    })
}

/// The sign of the strain along an arm's grid under a positive value of the wanted load.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ArmSign {
    /// The grid stretches: its resistance rises.
    Tension,
    /// The grid shortens.
    Compression,
    /// The grid reads nothing of the wanted load (below a millionth of the bridge's largest).
    Unstrained,
    /// A dummy grid or a completion resistor: no strain from the load.
    NotActive,
}

impl ArmSign {
    /// The mark drawn on the arm: "+", "−", "0", or nothing.
    pub fn mark(self) -> &'static str {
        match self {
            ArmSign::Tension => "+",
            ArmSign::Compression => "−",
            ArmSign::Unstrained => "0",
            ArmSign::NotActive => "",
        }
    }

    /// "tension", "compression", "no strain", or nothing.
    pub fn words(self) -> &'static str {
        match self {
            ArmSign::Tension => "tension",
            ArmSign::Compression => "compression",
            ArmSign::Unstrained => "no strain",
            ArmSign::NotActive => "",
        }
    }
}

/// The sign of each arm's grid strain (grid-averaged, along the grid) per unit of the
/// bridge's wanted load.
pub fn arm_signs(model: &BridgeModel) -> [ArmSign; 4] {
    let unit = LoadVector::unit(model.bridge().wanted);
    let active: [bool; 4] =
        std::array::from_fn(|k| matches!(model.bridge().arms[k], gw_bridge::ArmElement::Grid(_)));
    let strain: [f64; 4] = std::array::from_fn(|k| model.grid_strains(k, &unit)[2]);
    let largest = strain.iter().fold(0.0f64, |m, e| m.max(e.abs()));
    std::array::from_fn(|k| match (active[k], strain[k]) {
        (false, _) => ArmSign::NotActive,
        (true, e) if !e.is_finite() || e.abs() <= 1e-6 * largest || largest == 0.0 => {
            ArmSign::Unstrained
        }
        (true, e) if e > 0.0 => ArmSign::Tension,
        _ => ArmSign::Compression,
    })
}

/// The bridge prepared on its part, as the evaluation prepares it (default quadrature).
pub fn bridge_model(
    project: &Project,
    part: &Part,
    plan: &BridgePlan,
) -> Result<BridgeModel, String> {
    let gauges = project.placed_gauges(part);
    let bridge = bridge_from_plan(part, &gauges, plan).map_err(|e| e.to_string())?;
    let setup = Setup {
        member: &part.member,
        gauges: &gauges,
        reference_temperature_c: project.reference_temperature_c,
        quadrature: QuadratureOrder::default(),
    };
    BridgeModel::new(&setup, &bridge).map_err(|e| e.to_string())
}

/// [`arm_signs`] of a bridge in the plan.
pub fn arm_signs_for(
    project: &Project,
    part: &Part,
    plan: &BridgePlan,
) -> Result<[ArmSign; 4], String> {
    bridge_model(project, part, plan).map(|m| arm_signs(&m))
}

/// The sign the output takes under a positive wanted load from the marks alone: raising
/// arms 1 and 3 raises the output, raising arms 2 and 4 lowers it (the arm numbering of
/// [`gw_bridge::circuit`]). `None` when the marks disagree (some arms push the output up and
/// others down), so the sign depends on the sizes.
pub fn output_sign_from_marks(signs: &[ArmSign; 4]) -> Option<f64> {
    let mut pushes = signs.iter().zip(ARM_SIGNS).filter_map(|(s, a)| match s {
        ArmSign::Tension => Some(a),
        ArmSign::Compression => Some(-a),
        _ => None,
    });
    let first = pushes.next()?;
    pushes.all(|p| p == first).then_some(first)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::demo::demo_project;

    fn numbered(p: &Pinout) -> Vec<(usize, &str)> {
        p.pins
            .iter()
            .map(|p| (p.number, p.conductor.as_str()))
            .collect()
    }

    fn unused_numbers(p: &Pinout) -> Vec<usize> {
        p.unused().into_iter().map(|(n, _)| n).collect()
    }

    fn pinout(at_gauge: [bool; 4], wiring: LeadWiring) -> Pinout {
        Pinout::new(
            &circuit_conductors(at_gauge, wiring),
            &LeadColours::default(),
        )
        .unwrap()
    }

    const QUARTER: [bool; 4] = [true, false, false, false];
    const HALF: [bool; 4] = [true, true, false, false];
    const FULL: [bool; 4] = [true; 4];
    const WIRINGS: [LeadWiring; 3] = [
        LeadWiring::TwoWire,
        LeadWiring::ThreeWire,
        LeadWiring::RemoteSense,
    ];

    /// Every split of the four arms between the gauge site and the instrument.
    fn every_split() -> impl Iterator<Item = [bool; 4]> {
        (0..16u8).map(|m| std::array::from_fn(|k| m & (1 << k) != 0))
    }

    // The conductor counts are the trade's: a quarter bridge is wired with two or three wires,
    // a half bridge with three (five with remote sense), a full bridge with four (six with
    // remote sense) — common practice. The pin numbers are our own fixed order.
    #[test]
    fn quarter_bridges_use_the_fixed_pins_of_their_two_or_three_conductors() {
        let two = pinout(QUARTER, LeadWiring::TwoWire);
        assert_eq!(numbered(&two), [(2, "exc-"), (3, "out+"), (9, SHIELD)]);
        assert_eq!(unused_numbers(&two), [1, 4, 5, 6, 7, 8]);
        let three = pinout(QUARTER, LeadWiring::ThreeWire);
        assert_eq!(
            numbered(&three),
            [(2, "exc-"), (3, "out+"), (7, "sense out+"), (9, SHIELD)]
        );
        assert_eq!(unused_numbers(&three), [1, 4, 5, 6, 8]);
        let sense = three.pin("sense out+").unwrap();
        assert_eq!(sense.role, "output + sense");
        assert_eq!(sense.colour, LeadColours::default().sense);
        assert_eq!(three.shield().map(|p| p.number), Some(9));
        assert_eq!(three.unused()[0], (1, "excitation +"));
    }

    #[test]
    fn half_and_full_bridges_with_and_without_remote_sense_use_the_fixed_pins() {
        let half = pinout(HALF, LeadWiring::ThreeWire);
        assert_eq!(
            numbered(&half),
            [(1, "exc+"), (2, "exc-"), (3, "out+"), (9, SHIELD)]
        );
        let half_sense = pinout(HALF, LeadWiring::RemoteSense);
        assert_eq!(
            numbered(&half_sense),
            [
                (1, "exc+"),
                (2, "exc-"),
                (3, "out+"),
                (5, "sense exc+"),
                (6, "sense exc-"),
                (9, SHIELD)
            ]
        );
        assert_eq!(unused_numbers(&half_sense), [4, 7, 8]);
        let full = pinout(FULL, LeadWiring::ThreeWire);
        assert_eq!(
            numbered(&full),
            [
                (1, "exc+"),
                (2, "exc-"),
                (3, "out+"),
                (4, "out-"),
                (9, SHIELD)
            ]
        );
        assert_eq!(unused_numbers(&full), [5, 6, 7, 8]);
        let full_sense = pinout(FULL, LeadWiring::RemoteSense);
        assert_eq!(
            numbered(&full_sense),
            [
                (1, "exc+"),
                (2, "exc-"),
                (3, "out+"),
                (4, "out-"),
                (5, "sense exc+"),
                (6, "sense exc-"),
                (9, SHIELD)
            ]
        );
        assert_eq!(full_sense.pins[0].colour, "orange");
    }

    #[test]
    fn the_same_role_lands_on_the_same_pin_in_every_wiring() {
        // The fixed order as the technician's table states it, by role words.
        let table = [
            (1, "excitation +"),
            (2, "excitation −"),
            (3, "output +"),
            (4, "output −"),
            (5, "excitation + sense"),
            (6, "excitation − sense"),
            (7, "output + sense"),
            (8, "output − sense"),
            (9, "shield (drain)"),
        ];
        let mut seen: Vec<(String, usize)> = Vec::new();
        for at_gauge in every_split() {
            for wiring in WIRINGS {
                let p = pinout(at_gauge, wiring);
                for pin in &p.pins {
                    assert!(
                        table.contains(&(pin.number, pin.role.as_str())),
                        "{at_gauge:?} {wiring:?}: pin {} is {}",
                        pin.number,
                        pin.role
                    );
                    match seen.iter().find(|(c, _)| *c == pin.conductor) {
                        Some((_, n)) => assert_eq!(*n, pin.number, "{}", pin.conductor),
                        None => seen.push((pin.conductor.clone(), pin.number)),
                    }
                }
                // The unused pins keep their roles too, and used and unused make up 1 to 9.
                for (n, role) in p.unused() {
                    assert!(table.contains(&(n, role)), "unused pin {n} as {role}");
                }
                let mut all: Vec<usize> = p.pins.iter().map(|p| p.number).collect();
                all.extend(unused_numbers(&p));
                all.sort_unstable();
                assert_eq!(all, (1..=9).collect::<Vec<_>>(), "{at_gauge:?} {wiring:?}");
            }
        }
        // Every role of the table turns up on some channel.
        assert_eq!(seen.len(), table.len());
    }

    #[test]
    fn every_conductor_of_the_circuit_has_exactly_one_pin() {
        for at_gauge in every_split() {
            for wiring in WIRINGS {
                let list = circuit_conductors(at_gauge, wiring);
                let p = pinout(at_gauge, wiring);
                assert_eq!(p.pins.len(), list.len() + 1, "{at_gauge:?} {wiring:?}");
                for c in &list {
                    assert_eq!(p.pins.iter().filter(|pin| pin.conductor == *c).count(), 1);
                }
                assert_eq!(p.pins.last().map(|p| p.number), Some(9));
            }
        }
    }

    #[test]
    fn pin_pairs_and_shunt_pins_name_both_ends() {
        let full = pinout(FULL, LeadWiring::RemoteSense);
        assert_eq!(
            full.pair_words("exc+ to out+").as_deref(),
            Some("pin 1 (excitation +) to pin 3 (output +)")
        );
        assert_eq!(
            full.pair_words("out- to sense exc-").as_deref(),
            Some("pin 4 (output −) to pin 6 (excitation − sense)")
        );
        assert_eq!(full.pair_words("exc+ to nowhere"), None);
        // Arm 1 joins output + and excitation −; arm 3 excitation + and output −.
        let (a, b) = full.shunt_pins(0).unwrap();
        assert_eq!((a.number, b.number), (3, 2));
        let (a, b) = full.shunt_pins(2).unwrap();
        assert_eq!((a.number, b.number), (1, 4));
        // A quarter bridge has no excitation + conductor: a shunt across arm 2 lands on the
        // instrument's own terminal there.
        let quarter = pinout(QUARTER, LeadWiring::TwoWire);
        assert!(quarter.shunt_pins(1).is_none());
        assert!(
            quarter
                .shunt_words(1)
                .contains("excitation + terminal (no pin)")
        );
        // Across arm 1 the quarter bridge lands on the same pins as the full bridge.
        assert_eq!(quarter.shunt_words(0), full.shunt_words(0));
        assert_eq!(
            quarter.shunt_words(0),
            "between pin 3 (output +) and pin 2 (excitation −)"
        );
        assert!(Pinout::new(&["exc+", "ground"], &LeadColours::default()).is_err());
        assert!(Pinout::new(&["exc+", SHIELD], &LeadColours::default()).is_err());
    }

    #[test]
    fn the_shunt_place_reads_the_same_for_every_wiring_and_names_its_end() {
        let p = demo_project();
        let colours = LeadColours::default();
        let base = &p.parts[0].bridges[0];
        assert_eq!(
            base.shunt.map(|s| (s.arm, s.location)),
            Some((0, ShuntLocation::InstrumentEnd))
        );
        let at_instrument = "across arm 1 at the instrument end, between pin 3 (output +) \
                             and pin 2 (excitation −)";
        let at_gauge = "across arm 1 at the gauge end, between the gauge-site terminals of \
                        pin 3 (output +) and pin 2 (excitation −)";
        let completion = PlanArm::Completion(gw_bridge::CompletionResistor {
            ohm: 350.0,
            tolerance: 0.0005,
            tcr_per_c: 5e-6,
        });
        for split in [FULL, HALF, QUARTER] {
            for wiring in WIRINGS {
                let mut plan = base.clone();
                for (k, keep) in split.iter().enumerate() {
                    if !keep {
                        plan.arms[k] = completion.clone();
                    }
                }
                plan.wiring = wiring;
                let words = shunt_place_words(&plan, &colours);
                assert_eq!(
                    words.as_deref(),
                    Some(at_instrument),
                    "{split:?} {wiring:?}"
                );
                if let Some(s) = plan.shunt.as_mut() {
                    s.location = ShuntLocation::GaugeEnd;
                }
                let words = shunt_place_words(&plan, &colours);
                assert_eq!(words.as_deref(), Some(at_gauge), "{split:?} {wiring:?}");
                // Arm 4 of a half or quarter bridge is a resistor in the instrument.
                if let Some(s) = plan.shunt.as_mut() {
                    s.arm = 3;
                }
                let words = shunt_place_words(&plan, &colours).unwrap();
                let expected = if split[3] {
                    "across arm 4 at the gauge end, between the gauge-site terminals of pin 4 \
                     (output −) and pin 2 (excitation −)"
                } else {
                    "across arm 4 at the instrument end (planned at the gauge end, but arm 4 is \
                     a resistor in the instrument), between "
                };
                assert!(words.starts_with(expected), "{split:?} {wiring:?}: {words}");
                plan.shunt = None;
                assert_eq!(shunt_place_words(&plan, &colours), None);
            }
        }
    }

    #[test]
    fn a_bending_full_bridge_has_tension_and_compression_on_opposite_arms_and_reads_positive() {
        let p = demo_project();
        let part = &p.parts[0];
        let plan = part
            .bridges
            .iter()
            .find(|b| b.name == "Arm bending")
            .unwrap();
        let model = bridge_model(&p, part, plan).unwrap();
        let signs = arm_signs(&model);
        // Opposite arms (1 and 3, 2 and 4) carry the same sign, neighbours the other.
        assert_eq!(signs[0], signs[2]);
        assert_eq!(signs[1], signs[3]);
        assert_ne!(signs[0], signs[1]);
        assert!(
            signs
                .iter()
                .all(|s| matches!(s, ArmSign::Tension | ArmSign::Compression))
        );
        // Raising arms 1 and 3 raises the output (the bridge's arm numbering), so a positive
        // output needs arms 1 and 3 in tension.
        assert_eq!(signs[0], ArmSign::Tension);
        assert_eq!(output_sign_from_marks(&signs), Some(1.0));
        // Independent route: the exact circuit solved under a positive wanted load.
        let reading = model.sensitivity(plan.wanted).unwrap();
        assert!(reading > 0.0, "{reading}");
    }

    #[test]
    fn a_quarter_bridge_hoop_grid_is_in_tension_under_internal_pressure() {
        let p = demo_project();
        let part = p
            .parts
            .iter()
            .find(|x| x.name == "Accumulator shell")
            .unwrap();
        let plan = part
            .bridges
            .iter()
            .find(|b| b.name == "Shell hoop, single grid")
            .unwrap();
        let signs = arm_signs_for(&p, part, plan).unwrap();
        // Internal pressure stretches a closed cylinder round its circumference: hoop strain
        // pr(2 − ν)/(2tE) > 0 (Timoshenko, Strength of Materials, part I, thin-walled
        // cylinders).
        assert_eq!(
            signs,
            [
                ArmSign::Tension,
                ArmSign::NotActive,
                ArmSign::NotActive,
                ArmSign::NotActive
            ]
        );
        assert_eq!(output_sign_from_marks(&signs), Some(1.0));
    }

    #[test]
    fn a_dummy_or_a_grid_across_a_pure_load_reads_as_marked() {
        let p = demo_project();
        let part = &p.parts[0];
        let mut plan = part
            .bridges
            .iter()
            .find(|b| b.name == "Arm bending")
            .unwrap()
            .clone();
        plan.arms[3] = PlanArm::Dummy {
            gauge: "A4".into(),
            grid: 1,
        };
        let signs = arm_signs_for(&p, part, &plan).unwrap();
        assert_eq!(signs[3], ArmSign::NotActive);
        assert_eq!(signs[3].mark(), "");
        assert_eq!(ArmSign::Compression.mark(), "−");
        assert_eq!(
            output_sign_from_marks(&[
                ArmSign::Tension,
                ArmSign::Tension,
                ArmSign::NotActive,
                ArmSign::NotActive
            ]),
            None
        );
    }
}
