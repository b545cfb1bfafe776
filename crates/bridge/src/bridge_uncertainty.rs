//! The uncertainty budget of one bridge reading: what the wanted load inferred from the
//! displayed strain may be off by, per GUM and by Monte Carlo, with the exact circuit in the
//! model.

use gw_mechanics::{GridFootprint, LoadVector, Member, QuadratureOrder, grid_average_state};
use serde::{Deserialize, Serialize};

use crate::bridge::ArmElement;
use crate::error::BridgeError;
use crate::model::{BridgeModel, Perturbation};
use crate::signal_chain::ChannelFigures;
use crate::uncertainty::{
    COVERAGE_PROBABILITY, GumBudget, InputQuantity, MonteCarloResult, gum, monte_carlo,
};

/// How well the installation and its environment are known. Defaults are ours; edit them to
/// the job.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct InstallationTolerances {
    /// Standard uncertainty of each grid's direction, rad (default 1°, common practice for
    /// careful hand layout).
    pub misalignment_rad: f64,
    /// Standard uncertainty of each grid's position, along the member and across the face
    /// alike, m (default 0.5 mm).
    pub position_m: f64,
    /// Standard uncertainty of transverse sensitivity (default 0.005).
    pub transverse_sensitivity: f64,
    /// ± fraction of lead resistance (default 10 %).
    pub lead_resistance_fraction: f64,
    /// Standard uncertainty of the part temperature, °C (default 2 °C).
    pub temperature_c: f64,
    /// Monte Carlo trials (default 20 000).
    pub monte_carlo_trials: usize,
    /// Monte Carlo seed (fixed so results repeat).
    pub seed: u64,
}

impl Default for InstallationTolerances {
    fn default() -> Self {
        Self {
            misalignment_rad: 1f64.to_radians(),
            position_m: 0.5e-3,
            transverse_sensitivity: 0.005,
            lead_resistance_fraction: 0.1,
            temperature_c: 2.0,
            monte_carlo_trials: 20_000,
            seed: 0x6761_7567,
        }
    }
}

/// The budget of one bridge at one load case.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct BridgeUncertainty {
    /// GUM linear propagation, with the coverage factor for 95 % chosen from the budget.
    pub gum: GumBudget,
    /// Monte Carlo propagation.
    pub monte_carlo: MonteCarloResult,
    /// Unit of the measurand (the wanted load component's unit).
    pub unit: &'static str,
}

/// Inputs, in order: lot gauge factor, Kt, per gauge carrying active grids (direction, position
/// along, position across: its grids move together), per completion
/// arm (tolerance, drift), lead resistance, temperature, excitation, gain, quantization, noise.
pub fn bridge_uncertainty(
    member: &Member,
    model: &BridgeModel,
    loads: &LoadVector,
    channel: &ChannelFigures,
    tol: &InstallationTolerances,
    quadrature: QuadratureOrder,
) -> Result<BridgeUncertainty, BridgeError> {
    let b = model.bridge();
    let wanted = b.wanted;
    let s_w = model.sensitivity(wanted)?;
    if s_w == 0.0 || !s_w.is_finite() {
        return Err(BridgeError::Invalid {
            what: format!("bridge \"{}\"", b.name),
            why: format!(
                "does not respond to its wanted load ({}); choose another arrangement",
                wanted.name()
            ),
        });
    }
    let mut inputs = Vec::new();
    let gf_tol = (0..4)
        .filter_map(|k| model.spec(k).map(|s| s.gauge_factor_tolerance))
        .fold(0.0, f64::max);
    inputs.push(InputQuantity::rectangular(
        "gauge factor of the lot (relative)",
        "",
        0.0,
        gf_tol,
    ));
    inputs.push(InputQuantity::normal(
        "transverse sensitivity",
        "",
        0.0,
        tol.transverse_sensitivity,
    ));
    let geometry = grid_geometry(member, model, loads, quadrature)?;
    let carriers = carriers(&geometry);
    push_carrier_inputs(&mut inputs, &carriers, &geometry, tol);
    let completions = push_completion_inputs(&mut inputs, model, tol);
    push_channel_inputs(&mut inputs, model, channel, tol);
    let reading = ReadingModel {
        model,
        loads,
        wanted_sensitivity: s_w,
        geometry,
        carriers,
        completions,
    };
    let f = |x: &[f64]| reading.wanted_load(x);
    let budget = gum(&inputs, &f, COVERAGE_PROBABILITY)?;
    let mc = monte_carlo(&inputs, &f, tol.monte_carlo_trials, tol.seed, 40);
    Ok(BridgeUncertainty {
        gum: budget,
        monte_carlo: mc,
        unit: wanted.unit(),
    })
}

/// How one active grid's strains (along, across) change with its placement.
#[derive(Debug, Clone, Copy)]
struct GridGeometry {
    /// Index of the gauge (carrier) the grid belongs to.
    gauge: usize,
    /// Arm the grid sits in.
    arm: usize,
    /// Per radian of turn.
    d_angle: (f64, f64),
    /// Per metre along the member.
    d_along: (f64, f64),
    /// Per metre across the face.
    d_across: (f64, f64),
}

/// Geometric derivatives of each active grid's (along, across) strain at this load.
fn grid_geometry(
    member: &Member,
    model: &BridgeModel,
    loads: &LoadVector,
    quadrature: QuadratureOrder,
) -> Result<Vec<GridGeometry>, BridgeError> {
    let mut geometry = Vec::new();
    for k in 0..4 {
        let ArmElement::Grid(grid) = model.bridge().arms[k] else {
            continue;
        };
        let Some(fp) = model.footprint(k) else {
            continue;
        };
        let (d_angle, d_along, d_across) = placement_derivatives(member, fp, loads, quadrature)?;
        geometry.push(GridGeometry {
            gauge: grid.gauge,
            arm: k,
            d_angle,
            d_along,
            d_across,
        });
    }
    Ok(geometry)
}

type StrainPair = (f64, f64);

/// Derivatives of a grid's averaged (along, across) strain with its direction (per radian),
/// its position along the member and across the face (per metre).
fn placement_derivatives(
    member: &Member,
    fp: GridFootprint,
    loads: &LoadVector,
    quadrature: QuadratureOrder,
) -> Result<(StrainPair, StrainPair, StrainPair), BridgeError> {
    // A grid reads along its own (possibly turned) direction.
    let strains = |f: GridFootprint| -> Result<StrainPair, BridgeError> {
        let st = grid_average_state(member, &f, loads, quadrature)?.mechanical_strain();
        Ok((
            st.along(f.angle_rad),
            st.along(f.angle_rad + std::f64::consts::FRAC_PI_2),
        ))
    };
    let h_angle = 0.5f64.to_radians();
    let turned = |d: f64| GridFootprint {
        angle_rad: fp.angle_rad + d,
        ..fp
    };
    let (ap, tp) = strains(turned(h_angle))?;
    let (am, tm) = strains(turned(-h_angle))?;
    let d_angle = ((ap - am) / (2.0 * h_angle), (tp - tm) / (2.0 * h_angle));
    let h_pos = 0.5e-3;
    let shifted = |dx: f64, ds: f64| {
        let mut f = fp;
        f.center.x_m += dx;
        f.center.s_m += ds;
        strains(f)
    };
    // Near an edge of the face a one-sided difference keeps the grid on the part.
    let derivative = |step: &dyn Fn(f64) -> Result<StrainPair, BridgeError>| {
        Ok(match (step(h_pos), step(-h_pos)) {
            (Ok((a1, t1)), Ok((a0, t0))) => ((a1 - a0) / (2.0 * h_pos), (t1 - t0) / (2.0 * h_pos)),
            (Ok((a1, t1)), Err(_)) => {
                let (a0, t0) = strains(fp)?;
                ((a1 - a0) / h_pos, (t1 - t0) / h_pos)
            }
            (Err(_), Ok((a0, t0))) => {
                let (a1, t1) = strains(fp)?;
                ((a1 - a0) / h_pos, (t1 - t0) / h_pos)
            }
            (Err(e), Err(_)) => return Err(e),
        })
    };
    let d_along = derivative(&|d| shifted(d, 0.0))?;
    // Across the face too: beside a hole or across a flange the field changes fastest that way.
    let d_across = derivative(&|d| shifted(0.0, d))?;
    Ok((d_angle, d_along, d_across))
}

/// Grids on one carrier (a pair, a rosette) turn and shift together: one direction and one
/// position per carrier, not independent draws per grid (JCGM 100:2008, 5.2 on correlated
/// inputs; here modelled as one shared input). Each entry: gauge index, indices into
/// `geometry`.
fn carriers(geometry: &[GridGeometry]) -> Vec<(usize, Vec<usize>)> {
    let mut carriers: Vec<(usize, Vec<usize>)> = Vec::new();
    for (i, g) in geometry.iter().enumerate() {
        match carriers.iter_mut().find(|(c, _)| *c == g.gauge) {
            Some((_, members)) => members.push(i),
            None => carriers.push((g.gauge, vec![i])),
        }
    }
    carriers
}

/// Direction, position along and position across of each carrier.
fn push_carrier_inputs(
    inputs: &mut Vec<InputQuantity>,
    carriers: &[(usize, Vec<usize>)],
    geometry: &[GridGeometry],
    tol: &InstallationTolerances,
) {
    for (_, members) in carriers {
        let arms: Vec<String> = members
            .iter()
            .map(|&i| (geometry[i].arm + 1).to_string())
            .collect();
        let which = if arms.len() == 1 {
            format!("the gauge in arm {}", arms[0])
        } else {
            format!("the gauge carrying arms {}", arms.join(" and "))
        };
        inputs.push(InputQuantity::normal(
            &format!("direction of {which}"),
            "rad",
            0.0,
            tol.misalignment_rad,
        ));
        inputs.push(InputQuantity::normal(
            &format!("position of {which} along the part"),
            "m",
            0.0,
            tol.position_m,
        ));
        inputs.push(InputQuantity::normal(
            &format!("position of {which} across the face"),
            "m",
            0.0,
            tol.position_m,
        ));
    }
}

/// Tolerance and drift of each completion resistor; returns the arms that hold one.
fn push_completion_inputs(
    inputs: &mut Vec<InputQuantity>,
    model: &BridgeModel,
    tol: &InstallationTolerances,
) -> Vec<usize> {
    let mut completions = Vec::new();
    for k in 0..4 {
        if let ArmElement::Completion(c) = model.bridge().arms[k] {
            inputs.push(InputQuantity::rectangular(
                &format!("completion resistor in arm {} (relative)", k + 1),
                "",
                0.0,
                c.tolerance,
            ));
            // Drift with the instrument's temperature, known as well as the part temperature.
            inputs.push(InputQuantity::normal(
                &format!("drift of completion resistor in arm {} (relative)", k + 1),
                "",
                0.0,
                c.tcr_per_c * tol.temperature_c,
            ));
            completions.push(k);
        }
    }
    completions
}

/// Leads, part temperature, excitation, gain, quantization and noise.
fn push_channel_inputs(
    inputs: &mut Vec<InputQuantity>,
    model: &BridgeModel,
    channel: &ChannelFigures,
    tol: &InstallationTolerances,
) {
    let signal = &model.bridge().signal;
    inputs.push(InputQuantity::rectangular(
        "lead resistance (relative)",
        "",
        0.0,
        tol.lead_resistance_fraction,
    ));
    inputs.push(InputQuantity::normal(
        "part temperature",
        "°C",
        0.0,
        tol.temperature_c,
    ));
    inputs.push(InputQuantity::rectangular(
        "excitation (relative)",
        "",
        0.0,
        signal.excitation_accuracy,
    ));
    inputs.push(InputQuantity::rectangular(
        "gain (relative)",
        "",
        0.0,
        signal.gain_accuracy,
    ));
    inputs.push(InputQuantity::rectangular(
        "quantization",
        "m/m",
        0.0,
        channel.resolution_strain / 2.0,
    ));
    // Quantization has its own row above; the noise row is the analogue noise only, so the
    // quantization inside the channel's total noise figure is not counted twice.
    inputs.push(InputQuantity::normal(
        "noise (Johnson and amplifier)",
        "m/m",
        0.0,
        channel.analog_noise_strain_rms,
    ));
}

/// The measurement model: the wanted load inferred from the reading of the bridge perturbed by
/// the inputs, in the order [`bridge_uncertainty`] lists them.
struct ReadingModel<'a> {
    model: &'a BridgeModel,
    loads: &'a LoadVector,
    wanted_sensitivity: f64,
    geometry: Vec<GridGeometry>,
    carriers: Vec<(usize, Vec<usize>)>,
    completions: Vec<usize>,
}

impl ReadingModel<'_> {
    fn wanted_load(&self, x: &[f64]) -> f64 {
        let mut p = Perturbation {
            gauge_factor_scale: 1.0 + x[0],
            kt_offset: x[1],
            ..Perturbation::default()
        };
        for (j, (_, members)) in self.carriers.iter().enumerate() {
            let (angle, along, across) = (x[2 + 3 * j], x[3 + 3 * j], x[4 + 3 * j]);
            for &i in members {
                let g = &self.geometry[i];
                p.grid_strain_offsets[g.arm] = (
                    g.d_angle.0 * angle + g.d_along.0 * along + g.d_across.0 * across,
                    g.d_angle.1 * angle + g.d_along.1 * along + g.d_across.1 * across,
                );
            }
        }
        let base = 2 + 3 * self.carriers.len();
        for (i, k) in self.completions.iter().enumerate() {
            p.completion_scale[*k] = (1.0 + x[base + 2 * i]) * (1.0 + x[base + 2 * i + 1]);
        }
        let rest = base + 2 * self.completions.len();
        p.lead_scale = 1.0 + x[rest];
        p.temperature_offset_c = x[rest + 1];
        let displayed = self
            .model
            .perturbed_displayed(self.loads, &p)
            .unwrap_or(f64::NAN);
        let reading =
            displayed * (1.0 + x[rest + 2]) * (1.0 + x[rest + 3]) + x[rest + 4] + x[rest + 5];
        reading / self.wanted_sensitivity
    }
}
