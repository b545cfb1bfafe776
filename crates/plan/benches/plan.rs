//! Evaluating the whole demo plan.

use criterion::{Criterion, criterion_group, criterion_main};
use gw_plan::demo::demo_project;
use gw_plan::evaluate::{EvalOptions, UncertaintyDepth, evaluate};
use std::hint::black_box;

fn bench(c: &mut Criterion) {
    let project = demo_project();
    let fast = EvalOptions {
        uncertainty: UncertaintyDepth::Off,
        ..EvalOptions::default()
    };
    c.bench_function("evaluate_demo/no_uncertainty", |b| {
        b.iter(|| evaluate(black_box(&project), &fast))
    });
    c.bench_function("evaluate_demo/with_gum", |b| {
        b.iter(|| evaluate(black_box(&project), &EvalOptions::default()))
    });
    // The placement warnings of every demo part (part of the evaluation above).
    let resolved: Vec<_> = project
        .parts
        .iter()
        .map(|p| project.placed_gauges(p))
        .collect();
    c.bench_function("placement_demo", |b| {
        b.iter(|| {
            let mut findings = Vec::new();
            for (pi, (part, gauges)) in project.parts.iter().zip(&resolved).enumerate() {
                gw_plan::placement::placement_findings(
                    pi,
                    black_box(part),
                    gauges,
                    fast.quadrature,
                    &mut findings,
                );
            }
            findings
        })
    });
}

criterion_group!(benches, bench);
criterion_main!(benches);
