//! The demo's example check-out records and first-test log (`assets/winch_checkout.csv`,
//! `assets/winch_first_test.csv`), written from the demo plan. Every value is invented: the
//! installation is imagined slightly off the plan (sensitivities within a few per cent, small
//! zero offsets, noise, a little hysteresis, one bridge with longer leads, one grid with low
//! insulation) so that the check-out, the reduction and the calibration have something to find.

use std::fmt::Write;

use gw_mechanics::LoadComponent;
use gw_plan::document::Project;
use gw_plan::evaluate::{BridgeEvaluation, Evaluation};

use crate::checkout::strain_per_mv_per_v;
use crate::records_csv::records_template;

/// Sample rate of the example log, Hz.
const RATE_HZ: f64 = 10.0;
/// Pull held at each step of the first test, N.
const PULL_STEPS_N: [f64; 7] = [0.0, 2000.0, 4000.0, 6000.0, 4000.0, 2000.0, 0.0];
/// Drum radius of the invented winch: drive torque = pull × radius, m.
const DRUM_RADIUS_M: f64 = 0.25;
/// Seconds each step is held, and each ramp between steps takes.
const HOLD_S: f64 = 10.0;
const RAMP_S: f64 = 4.0;

/// A small deterministic generator of normal noise (xorshift64* and Box–Muller), so the
/// example files are the same on every machine.
struct Noise(u64);

impl Noise {
    fn uniform(&mut self) -> f64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        let x = self.0.wrapping_mul(0x2545_f491_4f6c_dd1d);
        ((x >> 11) as f64 + 0.5) / (1u64 << 53) as f64
    }

    fn normal(&mut self) -> f64 {
        let (u1, u2) = (self.uniform(), self.uniform());
        (-2.0 * u1.ln()).sqrt() * (2.0 * std::f64::consts::PI * u2).cos()
    }
}

/// How the imagined installation differs from the plan, per bridge: sensitivity factor, zero
/// offset (mV/V), noise (mV/V, one standard deviation).
fn installed(bridge: &str) -> (f64, f64, f64) {
    match bridge {
        "Arm bending" => (0.982, 0.0121, 0.0004),
        "Arm shear web" => (1.014, -0.0187, 0.0004),
        "Drive torque" => (0.991, 0.0083, 0.0004),
        "Shaft bending" => (1.006, -0.0052, 0.0004),
        "Shell pressure" => (0.995, 0.0215, 0.0004),
        "Shell hoop, single grid" => (1.02, 0.0410, 0.0008),
        _ => (1.0, 0.003, 0.0005),
    }
}

/// The pull of the first test at time `t_s`: steps held, linear ramps between them.
fn pull_at(t_s: f64) -> f64 {
    let period = HOLD_S + RAMP_S;
    let k = (t_s / period).floor() as usize;
    let within = t_s - k as f64 * period;
    let here = PULL_STEPS_N[k.min(PULL_STEPS_N.len() - 1)];
    let next = PULL_STEPS_N[(k + 1).min(PULL_STEPS_N.len() - 1)];
    if within <= HOLD_S {
        here
    } else {
        here + (next - here) * (within - HOLD_S) / RAMP_S
    }
}

/// The loads on each part at a pull: the arm carries the pull and a quarter of it along its
/// axis, the drive shaft the pull times the drum radius and a bending moment in proportion,
/// the shell a pressure in proportion (the rated case's ratios of the demo).
pub fn loads_at(part: &str, pull_n: f64) -> Vec<(LoadComponent, f64)> {
    let f = pull_n / 6000.0;
    match part {
        "Reaction arm" => vec![
            (LoadComponent::VerticalForce, pull_n),
            (LoadComponent::AxialForce, 1500.0 * f),
        ],
        "Drum drive shaft" => vec![
            (LoadComponent::Torque, pull_n * DRUM_RADIUS_M),
            (LoadComponent::BendingMomentY, 250.0 * f),
        ],
        "Accumulator shell" => vec![(LoadComponent::InternalPressure, 14e6 * f)],
        _ => Vec::new(),
    }
}

fn reading_mv_per_v(be: &BridgeEvaluation, loads: &[(LoadComponent, f64)]) -> f64 {
    loads
        .iter()
        .map(|(c, v)| {
            be.sensitivities
                .iter()
                .find(|s| s.component == *c)
                .map(|s| s.mv_per_v_per_unit * v)
                .unwrap_or(0.0)
        })
        .sum()
}

/// The example log: time, the reference load cell's pull split into the arm's two components,
/// and every channel of the demo (rosette channels in µε as a strain instrument shows them,
/// the shell pressure bridge in volts, the rest in mV/V).
pub fn example_log(ev: &Evaluation) -> String {
    let duration = (PULL_STEPS_N.len() - 1) as f64 * (HOLD_S + RAMP_S) + HOLD_S;
    let n = (duration * RATE_HZ).round() as usize;
    let bridges: Vec<(&str, &BridgeEvaluation)> = ev
        .parts
        .iter()
        .flat_map(|p| p.bridges.iter().map(move |b| (p.name.as_str(), b)))
        .collect();
    let mut out = String::new();
    out.push_str(
        "# Winch test stand (demo), first test: pull in steps of 2 kN to 6 kN and back.\n\
         # Invented data. Reference load cell in the pull line; the arm sees the pull across it\n\
         # and a quarter of it along it.\n",
    );
    out.push_str("time [s],Reaction arm: vertical force [kN],Reaction arm: axial force [kN]");
    for (_, b) in &bridges {
        let unit = unit_of(b);
        let header = format!("ch{} {} [{unit}]", b.channel_number, b.name);
        if header.contains(',') {
            let _ = write!(out, ",\"{header}\"");
        } else {
            let _ = write!(out, ",{header}");
        }
    }
    out.push('\n');
    let mut noise = Noise(0x5eed_1234_abcd_0042);
    for i in 0..n {
        let t = i as f64 / RATE_HZ;
        let pull = pull_at(t);
        let cell = pull * (1.0 + 0.0005 * noise.normal());
        let _ = write!(out, "{t:.1},{:.4},{:.4}", cell / 1e3, 0.25 * cell / 1e3);
        let falling = t > 3.0 * (HOLD_S + RAMP_S) + HOLD_S;
        for (part, b) in &bridges {
            let (gain, zero, sd) = installed(&b.name);
            let ideal = reading_mv_per_v(b, &loads_at(part, pull));
            // A little hysteresis: 0.1 % of the reading at 6 kN more on the way down.
            let full = reading_mv_per_v(b, &loads_at(part, 6000.0));
            let hysteresis = if falling && pull > 0.0 {
                0.001 * full.abs() * (1.0 - (pull / 6000.0 - 0.5).abs() * 2.0).max(0.0)
            } else {
                0.0
            };
            let mv = gain * ideal + zero + hysteresis + sd * noise.normal();
            let _ = match unit_of(b) {
                "µε" => write!(out, ",{:.2}", mv * strain_per_mv_per_v(b) * 1e6),
                "V" => write!(out, ",{:.7}", mv * b.excitation_v * 1e-3),
                _ => write!(out, ",{mv:.5}"),
            };
        }
        out.push('\n');
    }
    out
}

fn unit_of(b: &BridgeEvaluation) -> &'static str {
    if b.name.starts_with("Rosette") {
        "µε"
    } else if b.name == "Shell pressure" {
        "V"
    } else {
        "mV/V"
    }
}

/// The example records: the template of the demo filled in as an imagined technician would.
pub fn example_records(project: &Project, ev: &Evaluation) -> String {
    let mut filled = project.clone();
    let mut noise = Noise(0x0dd_ba11_cafe_0001);
    for part in &project.parts {
        for g in project.placed_gauges(part) {
            for e in 1..=g.element_count() {
                let r = filled.records.grid_mut(&g.id, e);
                let off = 0.4 * g.spec.resistance_tolerance * noise.normal();
                r.resistance_ohm = Some(round(g.spec.resistance_ohm * (1.0 + off), 2));
                r.insulation_ohm = Some(if g.id == "P2" {
                    0.45e9
                } else {
                    round(8.0 + 10.0 * noise.uniform(), 1) * 1e9
                });
                r.serial = format!("{}-{e}", g.id);
                r.date = "2026-11-24".into();
                r.initials = "TK".into();
            }
        }
    }
    for pe in &ev.parts {
        for be in &pe.bridges {
            let (_, zero, _) = installed(&be.name);
            let Some(plan) = project
                .parts
                .get(pe.part_index)
                .and_then(|p| p.bridges.iter().find(|b| b.name == be.name))
            else {
                continue;
            };
            let planned_lead = plan.lead.length_m * plan.lead.ohm_per_m;
            let longer = be.name == "Shaft bending";
            let r = filled.records.bridge_mut(&be.name);
            r.lead_ohm = Some(round(
                if longer {
                    planned_lead * 1.45
                } else {
                    planned_lead * (1.0 + 0.03 * noise.normal())
                },
                3,
            ));
            r.insulation_ohm = Some(round(5.0 + 10.0 * noise.uniform(), 1) * 1e9);
            let z = be.zero_band.centre_mv_per_v + zero;
            r.zero_mv_per_v = Some(round(z, 4));
            r.zero_again_mv_per_v = Some(round(z + 0.0003 * noise.normal(), 4));
            r.shunt_step_strain = be.shunt.as_ref().map(|s| {
                let factor = if longer {
                    0.989
                } else {
                    1.0 + 0.001 * noise.normal()
                };
                round(s.expected_reading_strain * factor * 1e6, 1) * 1e-6
            });
            if be.name == "Drive torque" {
                r.known_load_steps = PULL_STEPS_N.iter().map(|p| p * DRUM_RADIUS_M).collect();
            }
            r.date = "2026-11-25".into();
            r.initials = "TK".into();
        }
    }
    records_template(&filled, ev)
}

fn round(v: f64, digits: i32) -> f64 {
    let f = 10f64.powi(digits);
    (v * f).round() / f
}
