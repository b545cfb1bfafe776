//! One bridge on one part, ready to evaluate under any load vector: grid strains per unit of
//! each load component are computed once (mechanics is linear), then each reading builds the
//! arm resistances and solves the circuit.

use gw_mechanics::transverse::CALIBRATION_POISSON_RATIO;
use gw_mechanics::{
    GridFootprint, LoadComponent, LoadVector, Member, QuadratureOrder, SurfaceStrain,
    grid_average_state,
};
use serde::Serialize;

use crate::bridge::{ArmElement, Bridge, InstrumentTemperature};
use crate::circuit::{ArmResistor, BridgeCircuit, BridgeSolution, Excitation, Shunt};
use crate::error::BridgeError;
use crate::gauge::{GaugeSpec, PlacedGauge};

/// Arm signs in the small-signal output ¼(δ1 − δ2 + δ3 − δ4).
pub const ARM_SIGNS: [f64; 4] = [1.0, -1.0, 1.0, -1.0];

/// What the engineer's setup shares across bridges.
#[derive(Debug, Clone, Copy)]
pub struct Setup<'a> {
    /// The part.
    pub member: &'a Member,
    /// Placed gauges.
    pub gauges: &'a [PlacedGauge],
    /// Temperature at which the bridge is zeroed and gauge data are referenced, °C.
    pub reference_temperature_c: f64,
    /// Quadrature for grid averaging.
    pub quadrature: QuadratureOrder,
}

/// Per-unit strains of one grid: along and across the grid, at its centre and averaged.
#[derive(Debug, Clone, PartialEq)]
struct GridUnitStrains {
    /// (point along, point across, averaged along, averaged across) per unit of each component.
    per_component: [[f64; 4]; LoadComponent::COUNT],
}

impl GridUnitStrains {
    fn at(&self, loads: &LoadVector) -> [f64; 4] {
        let mut out = [0.0; 4];
        for c in LoadComponent::ALL {
            let v = loads[c];
            if v != 0.0 && c != LoadComponent::TemperatureChange {
                for (o, u) in out.iter_mut().zip(self.per_component[c.index()]) {
                    *o += v * u;
                }
            }
        }
        out
    }
}

/// Which effects a model of the reading includes (used to split the error into its causes).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Effects {
    /// Only the wanted load component (else every component of the load vector).
    pub wanted_only: bool,
    /// Grid-averaged strain (else the point value at the grid centre).
    pub averaged: bool,
    /// Transverse sensitivity.
    pub transverse: bool,
    /// The grids' own gauge factor (else the instrument's setting).
    pub actual_gauge_factor: bool,
    /// Thermal output, gauge-factor drift and completion-resistor drift.
    pub temperature: bool,
}

impl Effects {
    /// Everything on.
    pub const ALL: Effects = Effects {
        wanted_only: false,
        averaged: true,
        transverse: true,
        actual_gauge_factor: true,
        temperature: true,
    };
}

/// Small departures from the nominal plan, for uncertainty propagation.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Perturbation {
    /// Added to each arm's grid strain (along, across), m/m.
    pub grid_strain_offsets: [(f64, f64); 4],
    /// Gauge factor multiplier of the grids (common to the lot).
    pub gauge_factor_scale: f64,
    /// Added to every grid's transverse sensitivity.
    pub kt_offset: f64,
    /// Added to the part temperature of the reading, °C.
    pub temperature_offset_c: f64,
    /// Lead resistance multiplier.
    pub lead_scale: f64,
    /// Multiplier of each arm's completion resistor.
    pub completion_scale: [f64; 4],
}

impl Default for Perturbation {
    fn default() -> Self {
        Self {
            grid_strain_offsets: [(0.0, 0.0); 4],
            gauge_factor_scale: 1.0,
            kt_offset: 0.0,
            temperature_offset_c: 0.0,
            lead_scale: 1.0,
            completion_scale: [1.0; 4],
        }
    }
}

/// The error of a displayed reading against the target, split by cause; they sum to the total.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize)]
pub struct ErrorBreakdown {
    /// Unwanted load components that the arrangement does not cancel, m/m.
    pub leakage: f64,
    /// Grid averaging over the grid area versus the centre value, m/m.
    pub grid_averaging: f64,
    /// Transverse sensitivity, m/m.
    pub transverse_sensitivity: f64,
    /// Grid gauge factor differing from the instrument's setting, m/m.
    pub gauge_factor_setting: f64,
    /// Thermal output, gauge-factor drift and completion drift, m/m.
    pub temperature: f64,
    /// Bridge nonlinearity, m/m.
    pub nonlinearity: f64,
    /// Lead wires, amplifier loading and excitation regulation, m/m.
    pub leads_and_loading: f64,
}

impl ErrorBreakdown {
    /// Sum of all causes, m/m.
    pub fn total(&self) -> f64 {
        self.leakage
            + self.grid_averaging
            + self.transverse_sensitivity
            + self.gauge_factor_setting
            + self.temperature
            + self.nonlinearity
            + self.leads_and_loading
    }
}

/// One reading of a bridge.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Reading {
    /// Arm resistances, Ω.
    pub arm_ohm: [f64; 4],
    /// Output voltage at the amplifier input, V (absolute, before zeroing).
    pub output_v: f64,
    /// Output change from the zero reading, V.
    pub output_change_v: f64,
    /// Output change per volt of set excitation, mV/V.
    pub mv_per_v: f64,
    /// Strain the instrument displays after zeroing, m/m.
    pub displayed_strain: f64,
    /// The strain the bridge is meant to report: the wanted component's point strains,
    /// combined by arm sign and divided by the bridge factor, m/m.
    pub target_strain: f64,
    /// Error split by cause.
    pub error: ErrorBreakdown,
    /// Excitation across the bridge corners, V.
    pub bridge_excitation_v: f64,
    /// Largest grid strain along its direction (averaged), m/m.
    pub max_grid_strain: f64,
}

/// A bridge prepared for evaluation on a part.
#[derive(Debug, Clone)]
pub struct BridgeModel {
    bridge: Bridge,
    specs: [Option<GaugeSpec>; 4],
    units: [Option<GridUnitStrains>; 4],
    footprints: [Option<GridFootprint>; 4],
    part_cte_per_c: f64,
    reference_temperature_c: f64,
    zero: BridgeSolution,
}

impl BridgeModel {
    /// Prepares `bridge` on the setup: validates it and computes every grid's per-unit strains.
    pub fn new(setup: &Setup<'_>, bridge: &Bridge) -> Result<Self, BridgeError> {
        bridge.validate(setup.gauges)?;
        let mut specs: [Option<GaugeSpec>; 4] = Default::default();
        let mut units: [Option<GridUnitStrains>; 4] = Default::default();
        let mut footprints: [Option<GridFootprint>; 4] = Default::default();
        for (k, arm) in bridge.arms.iter().enumerate() {
            let Some(g) = arm.grid() else { continue };
            let gauge = &setup.gauges[g.gauge];
            gauge.spec.validate()?;
            specs[k] = Some(gauge.spec.clone());
            if let ArmElement::Grid(_) = arm {
                let footprint = gauge.footprint(g.element);
                footprints[k] = Some(footprint);
                let angle = footprint.angle_rad;
                let across = angle + std::f64::consts::FRAC_PI_2;
                let mut per_component = [[0.0; 4]; LoadComponent::COUNT];
                for &c in setup.member.components().iter() {
                    let unit = LoadVector::unit(c);
                    let point = setup
                        .member
                        .state(&footprint.center, &unit)?
                        .mechanical_strain();
                    let avg =
                        grid_average_state(setup.member, &footprint, &unit, setup.quadrature)?
                            .mechanical_strain();
                    let along = |s: &SurfaceStrain, a: f64| s.along(a);
                    per_component[c.index()] = [
                        along(&point, angle),
                        along(&point, across),
                        along(&avg, angle),
                        along(&avg, across),
                    ];
                }
                units[k] = Some(GridUnitStrains { per_component });
            }
        }
        let mut model = Self {
            bridge: bridge.clone(),
            specs,
            units,
            footprints,
            part_cte_per_c: setup.member.material().cte_per_c,
            reference_temperature_c: setup.reference_temperature_c,
            zero: BridgeSolution {
                output_v: 0.0,
                bridge_excitation_v: 0.0,
                instrument_excitation_v: 0.0,
                arm_volts: [0.0; 4],
            },
        };
        model.zero = model.solve(&LoadVector::ZERO, None)?;
        Ok(model)
    }

    /// The bridge.
    pub fn bridge(&self) -> &Bridge {
        &self.bridge
    }

    /// Sets the bridge factor the instrument converts with. Only the conversion from output to
    /// displayed strain depends on it, so the prepared model stays valid.
    pub fn set_bridge_factor(&mut self, bridge_factor: f64) {
        self.bridge.instrument.bridge_factor = bridge_factor;
    }

    /// The excitation as a voltage, V: the set voltage, or for a constant current the voltage
    /// the solved circuit develops across the bridge at zero load. With unequal arms (a half
    /// bridge with completion resistors of another value) that is I·(R1 + R2)(R3 + R4)/ΣR, not
    /// I times the mean arm resistance.
    pub fn nominal_excitation_v(&self) -> f64 {
        match self.bridge.excitation {
            Excitation::Voltage { volts } => volts,
            Excitation::Current { .. } => self.zero.bridge_excitation_v,
        }
    }

    /// Mean nominal arm resistance, Ω.
    pub fn nominal_arm_ohm(&self) -> f64 {
        let sum: f64 = (0..4).map(|k| self.nominal_ohm(k)).sum();
        sum / 4.0
    }

    /// Nominal resistance of the element in `arm`, Ω.
    pub fn nominal_arm_ohm_of(&self, arm: usize) -> f64 {
        self.nominal_ohm(arm.min(3))
    }

    fn nominal_ohm(&self, arm: usize) -> f64 {
        match (&self.bridge.arms[arm], &self.specs[arm]) {
            (ArmElement::Completion(c), _) => c.ohm,
            (_, Some(spec)) => spec.resistance_ohm,
            _ => 0.0,
        }
    }

    /// Strains of the grid in `arm` under `loads` (point along, point across, averaged along,
    /// averaged across); zero for dummies and completion resistors.
    pub fn grid_strains(&self, arm: usize, loads: &LoadVector) -> [f64; 4] {
        self.units[arm]
            .as_ref()
            .map(|u| u.at(loads))
            .unwrap_or([0.0; 4])
    }

    /// ΔR/R of each arm under `loads` with the chosen effects.
    pub fn arm_deltas(&self, loads: &LoadVector, effects: Effects) -> [f64; 4] {
        self.arm_deltas_perturbed(loads, effects, &Perturbation::default())
    }

    fn arm_deltas_perturbed(
        &self,
        loads: &LoadVector,
        effects: Effects,
        p: &Perturbation,
    ) -> [f64; 4] {
        let mut l = *loads;
        if effects.wanted_only {
            l = LoadVector::ZERO;
            l[self.bridge.wanted] = loads[self.bridge.wanted];
        }
        let dt = loads[LoadComponent::TemperatureChange] + p.temperature_offset_c;
        let t = self.reference_temperature_c + dt;
        let gf_set = self.bridge.instrument.gauge_factor;
        let mut out = [0.0; 4];
        for (k, o) in out.iter_mut().enumerate() {
            match (&self.bridge.arms[k], &self.specs[k]) {
                (ArmElement::Completion(c), _) => {
                    let follows =
                        self.bridge.instrument_temperature == InstrumentTemperature::FollowsPart;
                    let drift = if effects.temperature && follows {
                        c.tcr_per_c * dt
                    } else {
                        0.0
                    };
                    *o = p.completion_scale[k] * (1.0 + drift) - 1.0;
                }
                (arm, Some(spec)) => {
                    let kt = spec.transverse_sensitivity + p.kt_offset;
                    let mut strain = 0.0;
                    if let ArmElement::Grid(_) = arm {
                        let [pa, pt, aa, at] = self.grid_strains(k, &l);
                        let (a, tr) = if effects.averaged { (aa, at) } else { (pa, pt) };
                        let (da, dtr) = p.grid_strain_offsets[k];
                        let (a, tr) = (a + da, tr + dtr);
                        strain = if effects.transverse {
                            (a + kt * tr) / (1.0 - CALIBRATION_POISSON_RATIO * kt)
                        } else {
                            a
                        };
                    }
                    let mut gf = if effects.actual_gauge_factor {
                        spec.gauge_factor * p.gauge_factor_scale
                    } else {
                        gf_set
                    };
                    // The lot's curve is a resistance change already (it holds the gauge
                    // factor's own drift); the expansion mismatch and the mechanical strain
                    // are strains, read at the gauge factor of the moment.
                    let mut curve = 0.0;
                    if effects.temperature {
                        let t_ref = self.reference_temperature_c;
                        gf *= spec.gauge_factor_at(t_ref, t) / spec.gauge_factor;
                        strain +=
                            spec.thermal_output
                                .mismatch_strain(self.part_cte_per_c, kt, t_ref, t);
                        curve = spec.thermal_output.curve_resistance_change(
                            spec.gauge_factor,
                            t_ref,
                            t,
                        );
                    }
                    *o = gf * strain + curve;
                }
                _ => {}
            }
        }
        out
    }

    /// Displayed strain of the linear small-signal bridge: Σ ±δ / (GF_set · bridge factor).
    pub fn linear_displayed(&self, deltas: [f64; 4]) -> f64 {
        let sum: f64 = deltas.iter().zip(ARM_SIGNS).map(|(d, s)| d * s).sum();
        sum / (self.bridge.instrument.gauge_factor * self.bridge.instrument.bridge_factor)
    }

    fn ratio_to_displayed(&self, ratio: f64) -> f64 {
        4.0 * ratio / (self.bridge.instrument.gauge_factor * self.bridge.instrument.bridge_factor)
    }

    /// Exact divider output Vo/Vex with nominal arm values and no leads.
    fn divider_ratio(&self, deltas: [f64; 4]) -> f64 {
        let r: Vec<f64> = (0..4)
            .map(|k| self.nominal_ohm(k) * (1.0 + deltas[k]))
            .collect();
        r[0] / (r[0] + r[1]) - r[3] / (r[2] + r[3])
    }

    /// The circuit with the arms under `loads` (all effects) and an optional shunt.
    pub fn circuit(&self, loads: &LoadVector, shunt: Option<Shunt>) -> BridgeCircuit {
        self.circuit_perturbed(loads, shunt, &Perturbation::default())
    }

    fn circuit_perturbed(
        &self,
        loads: &LoadVector,
        shunt: Option<Shunt>,
        p: &Perturbation,
    ) -> BridgeCircuit {
        let deltas = self.arm_deltas_perturbed(loads, Effects::ALL, p);
        let dt = loads[LoadComponent::TemperatureChange] + p.temperature_offset_c;
        let lead = &self.bridge.lead;
        let lead_ohm =
            (lead.length_m * lead.ohm_per_m * p.lead_scale * (1.0 + lead.tcr_per_c * dt)).max(0.0);
        let arms = std::array::from_fn(|k| ArmResistor {
            ohm: self.nominal_ohm(k) * (1.0 + deltas[k]),
            at_gauge: self.bridge.arms[k].at_gauge(),
        });
        BridgeCircuit {
            arms,
            wiring: self.bridge.wiring,
            lead_ohm,
            excitation: self.bridge.excitation,
            amplifier_input_ohm: self.bridge.amplifier_input_ohm,
            shunt,
        }
    }

    /// Displayed strain under `loads` with the plan perturbed by `p`, zeroed at no load and the
    /// reference temperature with the same perturbed components.
    pub fn perturbed_displayed(
        &self,
        loads: &LoadVector,
        p: &Perturbation,
    ) -> Result<f64, BridgeError> {
        let zero_p = Perturbation {
            grid_strain_offsets: [(0.0, 0.0); 4],
            temperature_offset_c: 0.0,
            ..*p
        };
        let loaded = self.circuit_perturbed(loads, None, p).solve()?;
        let zero = self
            .circuit_perturbed(&LoadVector::ZERO, None, &zero_p)
            .solve()?;
        Ok(
            self.ratio_to_displayed(
                (loaded.output_v - zero.output_v) / self.nominal_excitation_v(),
            ),
        )
    }

    fn solve(
        &self,
        loads: &LoadVector,
        shunt: Option<Shunt>,
    ) -> Result<BridgeSolution, BridgeError> {
        Ok(self.circuit(loads, shunt).solve()?)
    }

    /// Displayed strain from the exact circuit, after zeroing at no load.
    pub fn displayed(&self, loads: &LoadVector) -> Result<f64, BridgeError> {
        let s = self.solve(loads, None)?;
        Ok(
            self.ratio_to_displayed(
                (s.output_v - self.zero.output_v) / self.nominal_excitation_v(),
            ),
        )
    }

    /// The zero-load solution.
    pub fn zero(&self) -> &BridgeSolution {
        &self.zero
    }

    /// A full reading under `loads` with the error split by cause.
    pub fn reading(&self, loads: &LoadVector) -> Result<Reading, BridgeError> {
        let e = Effects::ALL;
        const BASE: Effects = Effects {
            wanted_only: false,
            averaged: false,
            transverse: false,
            actual_gauge_factor: false,
            temperature: false,
        };
        let model = |effects: Effects| self.linear_displayed(self.arm_deltas(loads, effects));
        let m0 = model(Effects {
            wanted_only: true,
            ..BASE
        });
        let m1 = model(BASE);
        let m2 = model(Effects {
            averaged: true,
            ..BASE
        });
        let m3 = model(Effects {
            averaged: true,
            transverse: true,
            ..BASE
        });
        let m4a = model(Effects {
            temperature: false,
            ..e
        });
        let deltas = self.arm_deltas(loads, e);
        let m4 = self.linear_displayed(deltas);
        let zero_deltas = self.arm_deltas(&LoadVector::ZERO, e);
        let m5 =
            self.ratio_to_displayed(self.divider_ratio(deltas) - self.divider_ratio(zero_deltas));
        let s = self.solve(loads, None)?;
        let change = s.output_v - self.zero.output_v;
        let vex = self.nominal_excitation_v();
        let m6 = self.ratio_to_displayed(change / vex);
        let max_grid_strain = (0..4)
            .filter(|&k| self.units[k].is_some())
            .map(|k| self.grid_strains(k, loads)[2])
            .fold(0.0_f64, |m, v| if v.abs() > m.abs() { v } else { m });
        let arm_ohm = std::array::from_fn(|k| self.nominal_ohm(k) * (1.0 + deltas[k]));
        Ok(Reading {
            arm_ohm,
            output_v: s.output_v,
            output_change_v: change,
            mv_per_v: 1e3 * change / vex,
            displayed_strain: m6,
            target_strain: m0,
            error: ErrorBreakdown {
                leakage: m1 - m0,
                grid_averaging: m2 - m1,
                transverse_sensitivity: m3 - m2,
                gauge_factor_setting: m4a - m3,
                temperature: m4 - m4a,
                nonlinearity: m5 - m4,
                leads_and_loading: m6 - m5,
            },
            bridge_excitation_v: s.bridge_excitation_v,
            max_grid_strain,
        })
    }

    /// Displayed strain per unit of `component` at zero load (central difference of the exact
    /// circuit), m/m per unit of the component.
    pub fn sensitivity(&self, component: LoadComponent) -> Result<f64, BridgeError> {
        let h = if component == LoadComponent::TemperatureChange {
            1.0
        } else {
            // A step that strains the most-strained grid by about 10 µε keeps it linear.
            let unit = LoadVector::unit(component);
            let largest = (0..4)
                .map(|k| {
                    self.grid_strains(k, &unit)[2]
                        .abs()
                        .max(self.grid_strains(k, &unit)[3].abs())
                })
                .fold(0.0_f64, f64::max);
            if largest == 0.0 {
                return Ok(0.0);
            }
            1e-5 / largest
        };
        let plus = self.displayed(&LoadVector::unit(component).scaled(h))?;
        let minus = self.displayed(&LoadVector::unit(component).scaled(-h))?;
        Ok((plus - minus) / (2.0 * h))
    }

    /// Linear per-unit displayed strain of each component (no circuit), for fast searches.
    pub fn linear_sensitivity(&self, component: LoadComponent) -> f64 {
        if component == LoadComponent::TemperatureChange {
            let up =
                self.linear_displayed(self.arm_deltas(&LoadVector::unit(component), Effects::ALL));
            let down = self.linear_displayed(
                self.arm_deltas(&LoadVector::unit(component).scaled(-1.0), Effects::ALL),
            );
            return (up - down) / 2.0;
        }
        self.linear_displayed(self.arm_deltas(&LoadVector::unit(component), Effects::ALL))
    }

    /// Reading with a shunt across an arm, displayed strain after zeroing, m/m.
    pub fn shunt_reading(&self, shunt: Shunt) -> Result<f64, BridgeError> {
        let s = self.solve(&LoadVector::ZERO, Some(shunt))?;
        Ok(
            self.ratio_to_displayed(
                (s.output_v - self.zero.output_v) / self.nominal_excitation_v(),
            ),
        )
    }

    /// Power dissipated in each arm's element at no load, W.
    pub fn arm_power_w(&self) -> [f64; 4] {
        std::array::from_fn(|k| {
            let r = self.nominal_ohm(k);
            if r > 0.0 {
                self.zero.arm_volts[k].powi(2) / r
            } else {
                0.0
            }
        })
    }

    /// Gauge spec of the grid or dummy in `arm`.
    pub fn spec(&self, arm: usize) -> Option<&GaugeSpec> {
        self.specs.get(arm).and_then(|s| s.as_ref())
    }

    /// Footprint of the active grid in `arm`.
    pub fn footprint(&self, arm: usize) -> Option<GridFootprint> {
        self.footprints.get(arm).copied().flatten()
    }

    /// Part expansion coefficient, 1/°C.
    pub fn part_cte_per_c(&self) -> f64 {
        self.part_cte_per_c
    }

    /// Reference temperature, °C.
    pub fn reference_temperature_c(&self) -> f64 {
        self.reference_temperature_c
    }
}
