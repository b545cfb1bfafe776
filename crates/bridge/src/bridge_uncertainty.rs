//! The uncertainty budget of one bridge reading: what the wanted load inferred from the
//! displayed strain may be off by, per GUM and by Monte Carlo, with the exact circuit in the
//! model.

use gw_mechanics::{LoadVector, Member, QuadratureOrder, grid_average_state};
use serde::{Deserialize, Serialize};

use crate::bridge::ArmElement;
use crate::error::BridgeError;
use crate::model::{BridgeModel, Perturbation};
use crate::signal_chain::ChannelFigures;
use crate::uncertainty::{GumBudget, InputQuantity, MonteCarloResult, gum, monte_carlo};

/// How well the installation and its environment are known. Defaults are ours; edit them to
/// the job.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
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
    /// GUM linear propagation (k = 2).
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
    // Geometric derivatives of each active grid's (along, across) strain at this load.
    let mut geometry = Vec::new();
    for k in 0..4 {
        let ArmElement::Grid(grid) = b.arms[k] else {
            continue;
        };
        let Some(fp) = model.footprint(k) else {
            continue;
        };
        let strains = |f: gw_mechanics::GridFootprint| -> Result<(f64, f64), BridgeError> {
            let st = grid_average_state(member, &f, loads, quadrature)?.mechanical_strain();
            Ok((
                st.along(fp.angle_rad),
                st.along(fp.angle_rad + std::f64::consts::FRAC_PI_2),
            ))
        };
        let h_angle = 0.5f64.to_radians();
        let rot = |d: f64| gw_mechanics::GridFootprint {
            angle_rad: fp.angle_rad + d,
            ..fp
        };
        // A rotated grid reads along its own rotated direction.
        let along_rot = |d: f64| -> Result<(f64, f64), BridgeError> {
            let f = rot(d);
            let st = grid_average_state(member, &f, loads, quadrature)?.mechanical_strain();
            Ok((
                st.along(f.angle_rad),
                st.along(f.angle_rad + std::f64::consts::FRAC_PI_2),
            ))
        };
        let (ap, tp) = along_rot(h_angle)?;
        let (am, tm) = along_rot(-h_angle)?;
        let d_angle = ((ap - am) / (2.0 * h_angle), (tp - tm) / (2.0 * h_angle));
        let h_pos = 0.5e-3;
        let shifted = |dx: f64, ds: f64| {
            let mut f = fp;
            f.center.x_m += dx;
            f.center.s_m += ds;
            strains(f)
        };
        // Near an edge of the face a one-sided difference keeps the grid on the part.
        let derivative = |step: &dyn Fn(f64) -> Result<(f64, f64), BridgeError>| {
            Ok(match (step(h_pos), step(-h_pos)) {
                (Ok((a1, t1)), Ok((a0, t0))) => {
                    ((a1 - a0) / (2.0 * h_pos), (t1 - t0) / (2.0 * h_pos))
                }
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
        let d_pos = derivative(&|d| shifted(d, 0.0))?;
        // Across the face too: beside a hole or across a flange the field changes fastest
        // that way.
        let d_across = derivative(&|d| shifted(0.0, d))?;
        geometry.push((grid.gauge, k, d_angle, d_pos, d_across));
    }
    // Grids on one carrier (a pair, a rosette) turn and shift together: one direction and one
    // position per carrier, not independent draws per grid (JCGM 100:2008, 5.2 on correlated
    // inputs; here modelled as one shared input).
    let mut carriers: Vec<(usize, Vec<usize>)> = Vec::new();
    for (i, g) in geometry.iter().enumerate() {
        match carriers.iter_mut().find(|(c, _)| *c == g.0) {
            Some((_, members)) => members.push(i),
            None => carriers.push((g.0, vec![i])),
        }
    }
    for (_, members) in &carriers {
        let arms: Vec<String> = members
            .iter()
            .map(|&i| (geometry[i].1 + 1).to_string())
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
    let mut completions = Vec::new();
    for k in 0..4 {
        if let ArmElement::Completion(c) = b.arms[k] {
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
        b.signal.excitation_accuracy,
    ));
    inputs.push(InputQuantity::rectangular(
        "gain (relative)",
        "",
        0.0,
        b.signal.gain_accuracy,
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
    let n_carriers = carriers.len();
    let n_comp = completions.len();
    let f = |x: &[f64]| -> f64 {
        let mut p = Perturbation {
            gauge_factor_scale: 1.0 + x[0],
            kt_offset: x[1],
            ..Perturbation::default()
        };
        for (j, (_, members)) in carriers.iter().enumerate() {
            let (angle, pos, across) = (x[2 + 3 * j], x[3 + 3 * j], x[4 + 3 * j]);
            for &i in members {
                let (_, k, da, dp, dc) = geometry[i];
                p.grid_strain_offsets[k] = (
                    da.0 * angle + dp.0 * pos + dc.0 * across,
                    da.1 * angle + dp.1 * pos + dc.1 * across,
                );
            }
        }
        let base = 2 + 3 * n_carriers;
        for (i, k) in completions.iter().enumerate() {
            p.completion_scale[*k] = (1.0 + x[base + 2 * i]) * (1.0 + x[base + 2 * i + 1]);
        }
        let rest = base + 2 * n_comp;
        p.lead_scale = 1.0 + x[rest];
        p.temperature_offset_c = x[rest + 1];
        let displayed = model.perturbed_displayed(loads, &p).unwrap_or(f64::NAN);
        let reading =
            displayed * (1.0 + x[rest + 2]) * (1.0 + x[rest + 3]) + x[rest + 4] + x[rest + 5];
        reading / s_w
    };
    let budget = gum(&inputs, &f, 2.0);
    let mc = monte_carlo(&inputs, &f, tol.monte_carlo_trials, tol.seed, 40);
    Ok(BridgeUncertainty {
        gum: budget,
        monte_carlo: mc,
        unit: wanted.unit(),
    })
}
