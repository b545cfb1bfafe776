//! Reducing a long test log: 10⁶ samples of 16 channels against a 16-channel plan built on the
//! demo, with three rosettes (two rectangular, one delta), the load recovery of every part and
//! the predicted readings under two applied loads.
//!
//! `reduce/1e6_samples_16_channels` times `reduction::reduce` on a log already in memory;
//! `read_log/1e6_samples_16_channels` times reading the same log from CSV text.
//!
//! With `GW_REDUCE_PEER_DIR=<dir>` set, the bench also writes the log and the inputs the
//! reduction uses (unit factors, zero window, span factors, strain and load per mV/V, predicted
//! sensitivities, rosette reading maps, recovery matrices) and some reduced samples into `<dir>`,
//! for `benches/peers/reduce_peer.py` to repeat the same arithmetic with numpy.

use std::hint::black_box;
use std::path::Path;
use std::time::Duration;

use criterion::{Criterion, SamplingMode, criterion_group, criterion_main};
use gw_bridge::GaugePattern;
use gw_mechanics::{Face, LoadComponent, SurfacePoint};
use gw_plan::demo::demo_project;
use gw_plan::document::{
    BridgePlan, LoadRecovery, PlanArm, PlanGauge, Project, StockGauge, default_gauge_spec,
    stock_base_name,
};
use gw_plan::evaluate::{BridgeEvaluation, EvalOptions, Evaluation, UncertaintyDepth, evaluate};
use gw_reduce::checkout::strain_per_mv_per_v;
use gw_reduce::log::{ColumnUnit, LogColumn, TestLog, read_log, write_log};
use gw_reduce::reduction::{ReduceOptions, Reduction, ZeroFrom, reduce};
use gw_reduce::rosette_series::reading_map;
use serde_json::{Value, json};

/// Samples in the log.
const SAMPLES: usize = 1_000_000;
/// Sample rate, Hz.
const RATE_HZ: f64 = 1000.0;
/// Length of the zero window at the start of the log, s.
const ZERO_WINDOW_S: f64 = 1.0;
/// Largest pull of the invented test, N; one cycle every `PULL_PERIOD_S`.
const PULL_PEAK_N: f64 = 6000.0;
const PULL_PERIOD_S: f64 = 200.0;

fn placed(id: &str, pattern: GaugePattern, face: Face, x_m: f64, s_m: f64) -> PlanGauge {
    PlanGauge {
        id: id.into(),
        stock: stock_base_name(&default_gauge_spec(pattern)),
        lot: None,
        position: SurfacePoint::new(face, x_m, s_m),
        angle_rad: 0.0,
    }
}

/// A quarter bridge reading one grid, made from the demo's rosette channel (three-wire, three
/// completion resistors, left out of the load recovery).
fn quarter_bridge(
    template: &BridgePlan,
    name: &str,
    gauge: &str,
    grid: usize,
    channel: u32,
) -> BridgePlan {
    let mut b = template.clone();
    b.name = name.into();
    b.arms[0] = PlanArm::Grid {
        gauge: gauge.into(),
        grid,
    };
    b.channel = channel;
    b
}

/// The demo plus a second rectangular rosette on the arm (channels 10–12), a delta rosette on
/// the drive shaft (13–15) and a single axial grid on the arm's neutral axis that joins the
/// arm's load recovery (16); every bridge with a shunt gets a recorded step 0.8 % short, so the
/// span is corrected.
fn sixteen_channel_project() -> Project {
    let mut project = demo_project();
    if !project
        .gauge_stock
        .iter()
        .any(|s| s.spec.pattern == GaugePattern::DeltaRosette)
    {
        let spec = default_gauge_spec(GaugePattern::DeltaRosette);
        project.gauge_stock.push(StockGauge {
            name: stock_base_name(&spec),
            spec,
        });
    }
    let template = project.parts[0]
        .bridges
        .iter()
        .find(|b| b.channel == 7)
        .cloned()
        .expect("the demo reads its rosette grid 1 on channel 7");
    let arm = &mut project.parts[0];
    arm.gauges.push(placed(
        "R2",
        GaugePattern::RectangularRosette,
        Face::Back,
        0.30,
        -0.006,
    ));
    arm.gauges.push(placed(
        "A5",
        GaugePattern::SingleGrid,
        Face::Front,
        0.35,
        0.0,
    ));
    for k in 1..=3 {
        arm.bridges.push(quarter_bridge(
            &template,
            &format!("Rosette R2, grid {k}"),
            "R2",
            k,
            9 + k as u32,
        ));
    }
    let mut axial = quarter_bridge(&template, "Arm axial, one grid", "A5", 1, 16);
    axial.arrangement = "One axial grid on the neutral axis".into();
    axial.wanted = LoadComponent::AxialForce;
    axial.recovery = LoadRecovery::Included;
    arm.bridges.push(axial);
    let shaft = &mut project.parts[1];
    let quarter_turn_m = 0.5 * std::f64::consts::PI * 0.03;
    shaft.gauges.push(placed(
        "D1",
        GaugePattern::DeltaRosette,
        Face::Round,
        0.45,
        quarter_turn_m,
    ));
    for k in 1..=3 {
        let mut b = quarter_bridge(
            &template,
            &format!("Rosette D1, grid {k}"),
            "D1",
            k,
            12 + k as u32,
        );
        // A plan names a load its part carries even for a channel that reports a strain.
        b.wanted = LoadComponent::Torque;
        shaft.bridges.push(b);
    }
    let ev = evaluate(&project, &fast());
    for pe in &ev.parts {
        for be in &pe.bridges {
            if let Some(s) = &be.shunt {
                project.records.bridge_mut(&be.name).shunt_step_strain =
                    Some(s.expected_reading_strain * 0.992);
            }
        }
    }
    project
}

fn fast() -> EvalOptions {
    EvalOptions {
        uncertainty: UncertaintyDepth::Off,
        ..EvalOptions::default()
    }
}

/// Deterministic uniform noise in [−1, 1) (xorshift64*), the same on every machine.
struct Noise(u64);

impl Noise {
    fn next(&mut self) -> f64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        let x = self.0.wrapping_mul(0x2545_f491_4f6c_dd1d);
        ((x >> 11) as f64 / (1u64 << 53) as f64) * 2.0 - 1.0
    }
}

fn per_unit(be: &BridgeEvaluation, component: LoadComponent) -> f64 {
    be.sensitivities
        .iter()
        .find(|s| s.component == component)
        .map(|s| s.mv_per_v_per_unit)
        .unwrap_or(0.0)
}

/// How a channel is logged: rosette grids in µε, the shell pressure bridge in volts, the rest
/// in mV/V (as the demo's example log).
fn unit_of(be: &BridgeEvaluation) -> (ColumnUnit, &'static str, f64) {
    if be.name.starts_with("Rosette") {
        (
            ColumnUnit::Microstrain,
            "µε",
            1e-6 / strain_per_mv_per_v(be),
        )
    } else if be.name == "Shell pressure" {
        (ColumnUnit::Volt, "V", 1e3 / be.excitation_v)
    } else {
        (ColumnUnit::MvPerV, "mV/V", 1.0)
    }
}

/// The log: a reference pull cycling 0 → 6 kN → 0, split into the arm's two components, and
/// every channel of the plan with a small zero offset and noise.
fn long_log(ev: &Evaluation) -> TestLog {
    let time_s: Vec<f64> = (0..SAMPLES).map(|i| i as f64 / RATE_HZ).collect();
    let pull: Vec<f64> = time_s
        .iter()
        .map(|t| 0.5 * PULL_PEAK_N * (1.0 - (2.0 * std::f64::consts::PI * t / PULL_PERIOD_S).cos()))
        .collect();
    let kn = ColumnUnit::Load {
        to_si: 1e3,
        si_unit: "N",
    };
    let mut columns = vec![
        LogColumn {
            name: "Reaction arm: vertical force".into(),
            unit: kn,
            unit_text: "kN".into(),
            values: pull.clone(),
        },
        LogColumn {
            name: "Reaction arm: axial force".into(),
            unit: kn,
            unit_text: "kN".into(),
            values: pull.iter().map(|p| 0.25 * p).collect(),
        },
    ];
    let mut noise = Noise(0x5eed_0016_0000_0001);
    for pe in &ev.parts {
        for be in &pe.bridges {
            let full = gw_reduce::example::loads_at(&pe.name, 1.0);
            let per_newton: f64 = full.iter().map(|(c, v)| per_unit(be, *c) * v).sum();
            let (unit, unit_text, to_mv_per_v) = unit_of(be);
            let zero_mv_per_v = 0.002 * be.channel_number as f64;
            let values = pull
                .iter()
                .map(|p| {
                    let mv = per_newton * p + zero_mv_per_v + 0.0005 * noise.next();
                    mv / to_mv_per_v
                })
                .collect();
            columns.push(LogColumn {
                name: format!("ch{} {}", be.channel_number, be.name),
                unit,
                unit_text: unit_text.into(),
                values,
            });
        }
    }
    TestLog { time_s, columns }
}

fn options() -> ReduceOptions {
    ReduceOptions {
        zero: ZeroFrom::LogStart {
            seconds: ZERO_WINDOW_S,
        },
    }
}

fn bench(c: &mut Criterion) {
    let project = sixteen_channel_project();
    let ev = evaluate(&project, &fast());
    let log = long_log(&ev);
    let check = reduce(&project, &ev, &log, &options()).expect("the bench log names the plan");
    let findings: Vec<&str> = ev.findings.iter().map(|f| f.message.as_str()).collect();
    assert_eq!(
        check.channels.len(),
        16,
        "notes: {:?}; findings: {findings:?}",
        check.notes
    );
    assert_eq!(check.rosettes.len(), 3, "notes: {:?}", check.notes);
    assert_eq!(check.recovered.len(), 3, "notes: {:?}", check.notes);
    if let Some(dir) = std::env::var_os("GW_REDUCE_PEER_DIR")
        && let Err(e) = export_for_peer(Path::new(&dir), &project, &ev, &log, &check)
    {
        eprintln!(
            "could not write the peer's inputs to {}: {e}",
            Path::new(&dir).display()
        );
    }
    drop(check);

    let mut group = c.benchmark_group("reduce");
    group
        .sample_size(10)
        .sampling_mode(SamplingMode::Flat)
        .warm_up_time(Duration::from_secs(1))
        .measurement_time(Duration::from_secs(8));
    group.bench_function("1e6_samples_16_channels", |b| {
        b.iter(|| reduce(&project, &ev, black_box(&log), &options()))
    });
    group.finish();

    let text = write_log(&log);
    let mut group = c.benchmark_group("read_log");
    group
        .sample_size(10)
        .sampling_mode(SamplingMode::Flat)
        .warm_up_time(Duration::from_secs(1))
        .measurement_time(Duration::from_secs(20));
    group.bench_function("1e6_samples_16_channels", |b| {
        b.iter(|| read_log(black_box(text.as_bytes())))
    });
    group.finish();
}

/// Samples whose reduced values the peer checks its own against.
const CHECK_SAMPLES: [usize; 5] = [0, 1, 4321, 500_000, SAMPLES - 1];

fn at(series: &[f64]) -> Vec<f64> {
    CHECK_SAMPLES.iter().map(|&i| series[i]).collect()
}

/// Writes `log.f64` (time, then every column, each `SAMPLES` little-endian f64), `inputs.json`
/// (what the reduction uses) and `expected.json` (reduced values at `CHECK_SAMPLES`).
fn export_for_peer(
    dir: &Path,
    project: &Project,
    ev: &Evaluation,
    log: &TestLog,
    red: &Reduction,
) -> std::io::Result<()> {
    std::fs::create_dir_all(dir)?;
    let mut bytes = Vec::with_capacity((log.columns.len() + 1) * SAMPLES * 8);
    for series in std::iter::once(&log.time_s).chain(log.columns.iter().map(|c| &c.values)) {
        for v in series {
            bytes.extend_from_slice(&v.to_le_bytes());
        }
    }
    std::fs::write(dir.join("log.f64"), bytes)?;

    let bridge_eval = |name: &str| {
        ev.parts
            .iter()
            .flat_map(|p| &p.bridges)
            .find(|b| b.name == name)
    };
    let column_index = |name: &str| log.columns.iter().position(|c| c.name == name);
    let applied: Vec<Value> = red
        .applied
        .iter()
        .map(|a| json!({ "part": a.part, "column": column_index(&a.column) }))
        .collect();
    let channel_index = |bridge: &str| red.channels.iter().position(|c| c.bridge == bridge);
    let channels: Vec<Value> = red
        .channels
        .iter()
        .map(|ch| {
            let be = bridge_eval(&ch.bridge).expect("a reduced channel is a bridge of the plan");
            let predicted = ch.predicted_mv_per_v.as_ref().map(|_| {
                red.applied
                    .iter()
                    .enumerate()
                    .filter(|(_, a)| a.part == ch.part)
                    .map(|(k, a)| json!({ "applied": k, "mv_per_v_per_unit": per_unit(be, a.component) }))
                    .collect::<Vec<_>>()
            });
            json!({
                "bridge": ch.bridge,
                "column": column_index(&ch.column),
                "unit_factor": unit_of(be).2,
                "span_factor": ch.span_factor,
                "strain_per_mv_per_v": ch.strain_per_mv_per_v,
                "load_per_mv_per_v": ch.load_per_mv_per_v,
                "predicted": predicted,
            })
        })
        .collect();
    let rosettes = rosette_inputs(project, red);
    let recovered: Vec<Value> = red
        .recovered
        .iter()
        .map(|r| {
            let m = ev
                .parts
                .iter()
                .find(|p| p.name == r.part)
                .and_then(|p| p.multi_axis.as_ref())
                .expect("recovered loads come from the part's recovery matrix");
            json!({
                "part": r.part,
                "channels": m.bridges.iter().map(|b| channel_index(b)).collect::<Vec<_>>(),
                "recovery": m.recovery,
            })
        })
        .collect();
    let inputs = json!({
        "samples": SAMPLES,
        "columns": log.columns.len(),
        "zero_window_s": ZERO_WINDOW_S,
        "applied": applied,
        "channels": channels,
        "rosettes": rosettes,
        "recovered": recovered,
    });
    std::fs::write(dir.join("inputs.json"), inputs.to_string())?;

    let expected = expected_values(red);
    std::fs::write(dir.join("expected.json"), expected.to_string())
}

/// What the peer needs of each rosette: its channels, reading map and elastic constants.
fn rosette_inputs(project: &Project, red: &Reduction) -> Vec<Value> {
    let channel_index = |bridge: &str| red.channels.iter().position(|c| c.bridge == bridge);
    red.rosettes
        .iter()
        .map(|r| {
            let part = project
                .parts
                .iter()
                .find(|p| p.name == r.part)
                .expect("a reduced rosette is on a part of the plan");
            let gauge = project
                .placed_gauges(part)
                .into_iter()
                .find(|g| g.id == r.gauge)
                .expect("a reduced rosette is a gauge of its part");
            let angles: [f64; 3] = gauge
                .spec
                .pattern
                .element_angles_deg()
                .try_into()
                .expect("a rosette has three grids");
            let map = reading_map(angles, gauge.spec.transverse_sensitivity)
                .expect("the rosette was reduced with this map");
            let material = part.member.material();
            json!({
                "gauge": r.gauge,
                "channels": r.bridges.iter().map(|b| channel_index(b)).collect::<Vec<_>>(),
                "map": map,
                "youngs_modulus_pa": material.youngs_modulus_pa,
                "poisson_ratio": material.poisson_ratio,
            })
        })
        .collect()
}

/// The reduced values at `CHECK_SAMPLES`, for the peer to compare its own with.
fn expected_values(red: &Reduction) -> Value {
    let principal = |p: &gw_reduce::rosette_series::PrincipalSeries| {
        json!({
            "strain_1": at(&p.strain_1),
            "strain_2": at(&p.strain_2),
            "angle_rad": at(&p.angle_rad),
            "max_shear_strain": at(&p.max_shear_strain),
            "stress_1_pa": at(&p.stress_1_pa),
            "stress_2_pa": at(&p.stress_2_pa),
        })
    };
    json!({
        "samples": CHECK_SAMPLES,
        "channels": red.channels.iter().map(|ch| json!({
            "zero_mv_per_v": ch.zero_mv_per_v,
            "mv_per_v": at(&ch.mv_per_v),
            "strain": at(&ch.strain),
            "load": ch.load.as_deref().map(at),
            "predicted_mv_per_v": ch.predicted_mv_per_v.as_deref().map(at),
        })).collect::<Vec<_>>(),
        "rosettes": red.rosettes.iter().map(|r| json!({
            "measured": principal(&r.measured),
            "predicted": r.predicted.as_ref().map(principal),
        })).collect::<Vec<_>>(),
        "recovered": red.recovered.iter().map(|r| {
            r.values.iter().map(|v| at(v)).collect::<Vec<_>>()
        }).collect::<Vec<_>>(),
    })
}

criterion_group!(benches, bench);
criterion_main!(benches);
