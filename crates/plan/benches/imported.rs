//! An imported surface of about 200 000 nodes (the large example plate): building its faces
//! and index from the mesh, reading its two result files, opening it from the surface kept
//! beside the project, one grid-averaged reading on it, and the whole-plan evaluation of its 12
//! gauges in 4 bridges.

use std::hint::black_box;

use criterion::{Criterion, criterion_group, criterion_main};
use gw_mechanics::imported::{ReferenceAxis, SurfaceField};
use gw_mechanics::{GridFootprint, LoadComponent, LoadVector, Member, QuadratureOrder};
use gw_plan::evaluate::{EvalOptions, UncertaintyDepth, evaluate};
use gw_plan::imported_part::read_surface;
use gw_plan::large_example::{plate_fields, plate_mesh, plate_project, write_plate_results};
use gw_plan::surface_cache;

fn building(c: &mut Criterion) {
    let mesh = plate_mesh();
    let units = plate_fields(&mesh);
    c.bench_function("imported_field/build_200k_nodes", |b| {
        b.iter(|| {
            SurfaceField::new(black_box(&mesh), units.clone(), ReferenceAxis::X).expect("builds")
        })
    });
}

fn reading(c: &mut Criterion) {
    let dir = std::env::temp_dir().join(format!("gw-bench-plate-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("a temporary folder");
    let surface = write_plate_results(&dir).expect("written");
    c.bench_function("imported_field/read_200k_node_files", |b| {
        b.iter(|| read_surface(black_box(&surface), Some(&dir)).expect("reads"))
    });
    let read = read_surface(&surface, Some(&dir)).expect("reads");
    let cache = dir.join("plate-cache").join("1-plate.surface");
    surface_cache::write(
        &cache,
        &surface,
        Some(&dir),
        &read.surface,
        &read.notes,
        &read.checksums,
    )
    .expect("kept");
    c.bench_function("imported_field/open_from_cache", |b| {
        b.iter(|| {
            let kept = surface_cache::read(black_box(&cache), &surface, Some(&dir)).expect("kept");
            SurfaceField::from_surface(kept.surface, surface.reference_axis).expect("builds")
        })
    });
    let _ = std::fs::remove_dir_all(&dir);
}

fn evaluating(c: &mut Criterion) {
    let project = plate_project().expect("the plate's plan");
    let part = &project.parts[0];
    let Member::ImportedField(f) = &part.member else {
        unreachable!("an imported part")
    };
    let field = f.surface().expect("read");
    let grid = GridFootprint {
        center: field
            .point_at([0.2, 0.1, 0.002], 1e-6)
            .expect("on the top face"),
        angle_rad: 0.3,
        length_m: 6e-3,
        width_m: 3e-3,
    };
    let loads = LoadVector::from_pairs(&[
        (LoadComponent::VerticalForce, 1e3),
        (LoadComponent::Torque, 50.0),
    ]);
    c.bench_function("imported_field/grid_average_8x4", |b| {
        b.iter(|| {
            gw_mechanics::grid_average_strain(
                black_box(&part.member),
                &grid,
                &loads,
                QuadratureOrder::default(),
            )
            .expect("reads")
        })
    });
    let rated = part.load_cases[0].load_vector();
    c.bench_function("imported_field/peak_stress_one_case", |b| {
        b.iter(|| field.peak_von_mises(black_box(&rated), &f.material))
    });
    let ev = evaluate(&project, &EvalOptions::default());
    let errors: Vec<_> = ev
        .findings
        .iter()
        .filter(|f| f.severity == gw_plan::evaluate::Severity::Error)
        .map(|f| f.message.clone())
        .collect();
    assert!(
        errors.is_empty(),
        "the plate's plan is not sound: {errors:#?}"
    );
    let fast = EvalOptions {
        uncertainty: UncertaintyDepth::Off,
        ..EvalOptions::default()
    };
    c.bench_function("imported_field/evaluate_12_gauges_4_bridges", |b| {
        b.iter(|| evaluate(black_box(&project), &fast))
    });
    c.bench_function(
        "imported_field/evaluate_12_gauges_4_bridges_with_gum",
        |b| b.iter(|| evaluate(black_box(&project), &EvalOptions::default())),
    );
}

criterion_group! {
    name = benches;
    config = Criterion::default().sample_size(10);
    targets = building, reading, evaluating
}
criterion_main!(benches);
