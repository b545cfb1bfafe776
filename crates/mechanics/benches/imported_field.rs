//! An imported surface of about 200 000 nodes: building its faces and index from the mesh and
//! the unit-load tensors, and one grid-averaged reading on it.

use std::hint::black_box;
use std::sync::Arc;

use criterion::{Criterion, criterion_group, criterion_main};
use gw_mechanics::imported::{
    Cell, CellKind, FieldState, ImportedSurface, RawMesh, ReferenceAxis, SurfaceField,
    TensorQuantity, UnitField,
};
use gw_mechanics::*;

/// A plate 440 × 220 elements of 1 mm, one element thick (2 mm): 195 000 nodes, all on the
/// surface.
fn plate_mesh() -> RawMesh {
    let (nx, ny, nz) = (440u32, 220u32, 1u32);
    let id = |i: u32, j: u32, k: u32| (k * (ny + 1) + j) * (nx + 1) + i;
    let mut points_m = Vec::new();
    for k in 0..=nz {
        for j in 0..=ny {
            for i in 0..=nx {
                points_m.push([i as f64 * 1e-3, j as f64 * 1e-3, k as f64 * 2e-3]);
            }
        }
    }
    let mut cells = Vec::new();
    for j in 0..ny {
        for i in 0..nx {
            let nodes = vec![
                id(i, j, 0),
                id(i + 1, j, 0),
                id(i + 1, j + 1, 0),
                id(i, j + 1, 0),
                id(i, j, 1),
                id(i + 1, j, 1),
                id(i + 1, j + 1, 1),
                id(i, j + 1, 1),
            ];
            cells.push(Cell {
                kind: CellKind::Hexa,
                nodes,
            });
        }
    }
    RawMesh { points_m, cells }
}

/// Bending strain varying along x and a shear varying along y, per unit load.
fn fields(mesh: &RawMesh) -> Vec<UnitField> {
    let bend = mesh
        .points_m
        .iter()
        .map(|p| {
            [
                1e-6 * (1.0 - p[0] / 0.44),
                -0.3e-6 * (1.0 - p[0] / 0.44),
                0.0,
                0.0,
                0.0,
                0.0,
            ]
        })
        .collect();
    let shear = mesh
        .points_m
        .iter()
        .map(|p| [0.0, 0.0, 0.0, 0.5e-6 * (p[1] / 0.22), 0.0, 0.0])
        .collect();
    vec![
        UnitField {
            component: LoadComponent::VerticalForce,
            quantity: TensorQuantity::Strain,
            values: bend,
        },
        UnitField {
            component: LoadComponent::Torque,
            quantity: TensorQuantity::Strain,
            values: shear,
        },
    ]
}

fn bench(c: &mut Criterion) {
    let mesh = plate_mesh();
    let units = fields(&mesh);
    c.bench_function("imported_field/build_200k_nodes", |b| {
        b.iter(|| {
            SurfaceField::new(black_box(&mesh), units.clone(), ReferenceAxis::X).expect("builds")
        })
    });
    let field = SurfaceField::new(&mesh, units, ReferenceAxis::X).expect("builds");
    let centre = field
        .point_at([0.2, 0.1, 0.002], 1e-6)
        .expect("on the top face");
    let member = Member::ImportedField(ImportedSurface {
        material: Material::new("steel", 200e9, 0.3, 12e-6, 300e6).expect("valid"),
        reference_axis: ReferenceAxis::X,
        loads: Vec::new(),
        mesh_file: None,
        field: FieldState::Loaded(Arc::new(field)),
        read_notes: Vec::new(),
    });
    let grid = GridFootprint {
        center: centre,
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
            grid_average_strain(
                black_box(&member),
                &grid,
                &loads,
                QuadratureOrder::default(),
            )
            .expect("reads")
        })
    });
}

criterion_group! {
    name = benches;
    config = Criterion::default().sample_size(10);
    targets = bench
}
criterion_main!(benches);
