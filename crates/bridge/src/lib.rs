//! Gauges, Wheatstone bridges, temperature effects, signal chain and uncertainty, on top of the
//! mechanics engine. No GUI.
//!
//! # Conventions
//! - SI units inside (Ω, V, A, W, m, °C, strain as m/m), as in `gw-mechanics`.
//! - Arms are numbered 1..4 (indices 0..4) round the bridge as drawn in [`circuit`]: arms 1 and
//!   2 form the output + half, arms 3 and 4 the output − half; small-signal output
//!   Vo/Vex ≈ ¼(δ1 − δ2 + δ3 − δ4).
//! - Readings are after zero balance at no load and the reference temperature.
//! - Circuits are solved exactly by nodal analysis; small-signal formulas appear only in tests
//!   and in the fast linear estimates used for searching.

pub mod arrangement;
pub mod bridge;
pub mod bridge_uncertainty;
pub mod chooser;
pub mod circuit;
pub mod error;
pub mod gauge;
pub mod margins;
pub mod model;
pub mod multi_axis;
pub mod network;
pub mod shunt;
pub mod signal_chain;
pub mod temperature;
pub mod uncertainty;
pub mod units;
pub mod zero_band;

pub use bridge::{
    ArmElement, Bridge, CompletionResistor, InstrumentSetting, InstrumentTemperature, LeadWire,
    ShuntPlan, SignalChain,
};
pub use circuit::{BridgeCircuit, Excitation, LeadWiring, ShuntLocation};
pub use error::BridgeError;
pub use gauge::{GaugePattern, GaugeSpec, GridRef, PlacedGauge, ThermalOutput};
pub use model::{BridgeModel, Effects, ErrorBreakdown, Reading, Setup};
