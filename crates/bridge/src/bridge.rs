//! A bridge as the engineer defines it: what sits in each arm, wiring, leads, excitation,
//! instrument settings and signal chain.

use gw_mechanics::LoadComponent;
use serde::{Deserialize, Serialize};

use crate::circuit::{Excitation, LeadWiring, ShuntLocation};
use crate::error::{BridgeError, check_plausible, check_positive};
use crate::gauge::{GridRef, PlacedGauge};
use crate::signal_chain::LowPassFilter;

/// A fixed resistor that completes the bridge (at the instrument).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct CompletionResistor {
    /// Nominal resistance, Ω.
    pub ohm: f64,
    /// Tolerance, ± fraction (0.0005 = ±0.05 %).
    pub tolerance: f64,
    /// Temperature coefficient, 1/°C.
    pub tcr_per_c: f64,
}

/// What occupies one arm.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum ArmElement {
    /// An active grid on the part.
    Grid(GridRef),
    /// A dummy grid identical to the referenced grid, on an unstrained piece of the part's
    /// material at the part's temperature.
    Dummy(GridRef),
    /// A completion resistor at the instrument.
    Completion(CompletionResistor),
}

impl ArmElement {
    /// True for grids and dummies (they sit at the gauge site).
    pub fn at_gauge(&self) -> bool {
        !matches!(self, ArmElement::Completion(_))
    }

    /// The referenced grid of a grid or dummy.
    pub fn grid(&self) -> Option<GridRef> {
        match *self {
            ArmElement::Grid(g) | ArmElement::Dummy(g) => Some(g),
            ArmElement::Completion(_) => None,
        }
    }
}

/// Lead wires from the gauge site to the instrument (all leads alike).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LeadWire {
    /// Length of one lead, m.
    pub length_m: f64,
    /// Resistance per metre at the reference temperature, Ω/m.
    pub ohm_per_m: f64,
    /// Temperature coefficient of resistance, 1/°C (copper about 0.0039, from memory).
    pub tcr_per_c: f64,
}

/// Copper's temperature coefficient of resistance near 20 °C, 1/°C (from memory).
pub const COPPER_TCR_PER_C: f64 = 0.0039;

/// How the instrument converts the output to a displayed strain.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct InstrumentSetting {
    /// Gauge factor set on the instrument.
    pub gauge_factor: f64,
    /// Bridge factor: how many times the target strain the bridge's Σ±ε is
    /// (1 for one active arm, 2 for two bending grids, 4 for four, 2(1+ν) for axial with
    /// Poisson grids). Displayed strain = 4 (Vo/Vex) / (GF · bridge factor).
    pub bridge_factor: f64,
}

/// The acquisition channel behind the bridge.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SignalChain {
    /// Amplifier voltage gain.
    pub gain: f64,
    /// ADC input range, ± V at the ADC (after gain).
    pub input_range_v: f64,
    /// ADC resolution, bits.
    pub adc_bits: u32,
    /// Amplifier input voltage noise density, V/√Hz.
    pub amplifier_noise_v_per_rt_hz: f64,
    /// Measurement bandwidth: the −3 dB cut-off of the channel's low-pass filter, Hz.
    pub bandwidth_hz: f64,
    /// The low-pass filter whose cut-off `bandwidth_hz` is; noise integrates over its noise
    /// bandwidth. Files without it load as a first-order RC (the conservative default, see
    /// [`LowPassFilter`]).
    #[serde(default)]
    pub filter: LowPassFilter,
    /// Excitation accuracy, ± fraction.
    pub excitation_accuracy: f64,
    /// Gain accuracy, ± fraction.
    pub gain_accuracy: f64,
}

/// Whether the completion resistors follow the part's temperature. Default: fixed.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum InstrumentTemperature {
    /// The instrument stays at the reference temperature.
    #[default]
    Fixed,
    /// The instrument (and its completion resistors) sees the same change as the part.
    FollowsPart,
}

/// A planned shunt calibration.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ShuntPlan {
    /// Arm index 0..4 the resistor goes across.
    pub arm: usize,
    /// Magnitude of the strain the shunt should simulate in that arm, m/m.
    pub target_strain: f64,
    /// Where it is connected.
    pub location: ShuntLocation,
}

/// A Wheatstone bridge.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Bridge {
    /// Name shown everywhere, e.g. "Bending at root".
    pub name: String,
    /// Arms 1..4.
    pub arms: [ArmElement; 4],
    /// Lead wiring.
    pub wiring: LeadWiring,
    /// Lead wires.
    pub lead: LeadWire,
    /// Excitation.
    pub excitation: Excitation,
    /// Amplifier differential input resistance, Ω (`None`: ideal).
    pub amplifier_input_ohm: Option<f64>,
    /// Instrument conversion.
    pub instrument: InstrumentSetting,
    /// Acquisition channel.
    pub signal: SignalChain,
    /// The load component this bridge is meant to measure.
    pub wanted: LoadComponent,
    /// Instrument temperature.
    pub instrument_temperature: InstrumentTemperature,
    /// Shunt calibration, if planned.
    pub shunt: Option<ShuntPlan>,
}

/// One setting to check: its name, value, whether it must be positive, its plausible range and
/// its unit.
type SettingCheck<'a> = (&'a str, f64, bool, (f64, f64), &'a str);

impl Bridge {
    /// Checks the bridge against the placed gauges.
    pub fn validate(&self, gauges: &[PlacedGauge]) -> Result<(), BridgeError> {
        self.validate_arms(gauges)?;
        self.validate_settings()
    }

    /// True when at least one arm holds an active grid.
    pub fn is_wired(&self) -> bool {
        self.arms.iter().any(|a| matches!(a, ArmElement::Grid(_)))
    }

    /// Checks what sits in the arms: an active grid somewhere, grids that exist, each grid in
    /// one arm only, completion resistors of positive value.
    pub fn validate_arms(&self, gauges: &[PlacedGauge]) -> Result<(), BridgeError> {
        let what = |s: &str| format!("bridge \"{}\": {s}", self.name);
        if !self.arms.iter().any(|a| matches!(a, ArmElement::Grid(_))) {
            return Err(BridgeError::Invalid {
                what: what("arms"),
                why: "no arm holds an active grid; put a grid in at least one arm".into(),
            });
        }
        let mut seen = Vec::new();
        for (k, arm) in self.arms.iter().enumerate() {
            match arm {
                ArmElement::Grid(g) | ArmElement::Dummy(g) => {
                    let Some(gauge) = gauges.get(g.gauge) else {
                        return Err(BridgeError::Invalid {
                            what: what(&format!("arm {}", k + 1)),
                            why: format!(
                                "refers to gauge number {} which does not exist",
                                g.gauge + 1
                            ),
                        });
                    };
                    if g.element >= gauge.element_count() {
                        return Err(BridgeError::Invalid {
                            what: what(&format!("arm {}", k + 1)),
                            why: format!(
                                "gauge {} has {} grid(s); grid {} does not exist",
                                gauge.id,
                                gauge.element_count(),
                                g.element + 1
                            ),
                        });
                    }
                    if matches!(arm, ArmElement::Grid(_)) {
                        if seen.contains(g) {
                            return Err(BridgeError::Invalid {
                                what: what(&format!("arm {}", k + 1)),
                                why: format!(
                                    "grid {} of gauge {} is already in another arm; one grid can sit in one arm only",
                                    g.element + 1,
                                    gauge.id
                                ),
                            });
                        }
                        seen.push(*g);
                    }
                }
                ArmElement::Completion(c) => {
                    let arm = |s: &str| what(&format!("completion resistor in arm {}: {s}", k + 1));
                    check_positive(&arm("resistance"), c.ohm)?;
                    check_plausible(&arm("tolerance"), c.tolerance, (0.0, 0.1), "")?;
                    check_plausible(&arm("drift"), c.tcr_per_c, (-1e-3, 1e-3), " /°C")?;
                }
            }
        }
        Ok(())
    }

    /// Checks leads, instrument, excitation, signal chain and shunt.
    pub fn validate_settings(&self) -> Result<(), BridgeError> {
        self.validate_leads_and_instrument()?;
        self.validate_channel()?;
        self.validate_shunt()
    }

    /// `field` of this bridge, for messages.
    fn field(&self, field: &str) -> String {
        format!("bridge \"{}\": {field}", self.name)
    }

    /// Each value positive where it must be, then inside its plausible range: (name, value,
    /// must be positive, range, unit).
    fn check_each(&self, checks: &[SettingCheck<'_>]) -> Result<(), BridgeError> {
        for &(name, value, positive, range, unit) in checks {
            if positive {
                check_positive(&self.field(name), value)?;
            }
            check_plausible(&self.field(name), value, range, unit)?;
        }
        Ok(())
    }

    fn validate_leads_and_instrument(&self) -> Result<(), BridgeError> {
        let (excitation, value, range, unit) = match self.excitation {
            Excitation::Voltage { volts } => ("excitation voltage", volts, (0.0, 50.0), " V"),
            Excitation::Current { amps } => ("excitation current", amps, (0.0, 1.0), " A"),
        };
        self.check_each(&[
            (
                "lead length",
                self.lead.length_m,
                false,
                (0.0, 10_000.0),
                " m",
            ),
            (
                "lead resistance per metre",
                self.lead.ohm_per_m,
                false,
                (0.0, 10.0),
                " Ω/m",
            ),
            // Copper is 0.0039 /°C; no lead wire drifts ten times as much.
            (
                "lead drift",
                self.lead.tcr_per_c,
                false,
                (-0.04, 0.04),
                " /°C",
            ),
            (
                "instrument gauge factor",
                self.instrument.gauge_factor,
                true,
                (0.0, 200.0),
                "",
            ),
            (
                "bridge factor",
                self.instrument.bridge_factor,
                true,
                (0.0, 1000.0),
                "",
            ),
            (excitation, value, true, range, unit),
        ])
    }

    fn validate_channel(&self) -> Result<(), BridgeError> {
        let s = &self.signal;
        self.check_each(&[
            ("amplifier gain", s.gain, true, (0.0, 1e6), ""),
            ("input range", s.input_range_v, true, (0.0, 1000.0), " V"),
            (
                "amplifier noise density",
                s.amplifier_noise_v_per_rt_hz,
                false,
                (0.0, 1e-5),
                " V/√Hz",
            ),
            (
                "excitation accuracy",
                s.excitation_accuracy,
                false,
                (0.0, 0.1),
                "",
            ),
            ("gain accuracy", s.gain_accuracy, false, (0.0, 0.1), ""),
        ])?;
        if !(1..=32).contains(&s.adc_bits) {
            return Err(BridgeError::Invalid {
                what: self.field("ADC resolution"),
                why: format!("{} bits is outside 1 to 32", s.adc_bits),
            });
        }
        self.check_each(&[("bandwidth", s.bandwidth_hz, true, (0.0, 1e7), " Hz")])?;
        if let Err(BridgeError::Invalid { what: field, why }) = s.filter.validate() {
            return Err(BridgeError::Invalid {
                what: self.field(&field),
                why,
            });
        }
        if let Some(rin) = self.amplifier_input_ohm {
            self.check_each(&[("amplifier input resistance", rin, true, (0.0, 1e15), " Ω")])?;
        }
        Ok(())
    }

    fn validate_shunt(&self) -> Result<(), BridgeError> {
        let Some(s) = self.shunt else {
            return Ok(());
        };
        if s.arm > 3 {
            return Err(BridgeError::Invalid {
                what: self.field("shunt arm"),
                why: "choose arm 1 to 4".into(),
            });
        }
        // A shunt simulates ε = R / (GF (R + Rs)) < 1/GF: a target at or beyond that needs no
        // resistor at all; a few percent is already far beyond any grid.
        self.check_each(&[(
            "shunt target strain",
            s.target_strain,
            true,
            (0.0, 0.05),
            "",
        )])
    }

    /// Number of gauges' grids at the gauge site (active and dummy).
    pub fn grid_count(&self) -> usize {
        self.arms.iter().filter(|a| a.at_gauge()).count()
    }
}
