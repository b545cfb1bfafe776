//! The live strain map (256 × 128 surface points) and one grid-averaged reading.

use criterion::{Criterion, criterion_group, criterion_main};
use gw_mechanics::*;
use std::hint::black_box;

fn steel() -> Material {
    library_material("carbon_steel")
        .map(|m| m.material())
        .unwrap_or_else(|| {
            Material::new("steel", 207e9, 0.292, 11.7e-6, 350e6).expect("valid material")
        })
}

fn members() -> Vec<(&'static str, Member, Face, LoadVector)> {
    let beam = Beam::new(
        Section::IBeam {
            flange_width_m: 0.08,
            depth_m: 0.12,
            flange_thickness_m: 0.01,
            web_thickness_m: 0.006,
        },
        steel(),
        1.2,
        BeamSupport::SimplySupported,
        0.5,
    )
    .expect("valid beam");
    let shaft = Shaft::new(0.05, 0.02, 0.4, steel()).expect("valid shaft");
    let plate = PlateWithHole::new(0.02, 0.2, 0.1, 0.006, steel()).expect("valid plate");
    vec![
        (
            "beam_front_face",
            Member::Beam(beam),
            Face::Front,
            LoadVector::from_pairs(&[
                (LoadComponent::VerticalForce, 8e3),
                (LoadComponent::AxialForce, 2e4),
                (LoadComponent::UniformLoad, 500.0),
            ]),
        ),
        (
            "shaft",
            Member::Shaft(shaft),
            Face::Round,
            LoadVector::from_pairs(&[
                (LoadComponent::Torque, 400.0),
                (LoadComponent::BendingMomentY, 150.0),
            ]),
        ),
        (
            "plate_with_hole",
            Member::PlateWithHole(plate),
            Face::Plate,
            LoadVector::from_pairs(&[
                (LoadComponent::RemoteStressX, 80e6),
                (LoadComponent::RemoteShearXY, 10e6),
            ]),
        ),
    ]
}

fn bench(c: &mut Criterion) {
    for (name, member, face, loads) in members() {
        c.bench_function(&format!("map_256x128/{name}"), |b| {
            b.iter(|| {
                surface_map(
                    black_box(&member),
                    face,
                    black_box(&loads),
                    SurfaceQuantity::StrainAlong(0.3),
                    StrainBasis::Mechanical,
                    256,
                    128,
                )
            })
        });
    }
    let plate = PlateWithHole::new(0.02, 0.2, 0.1, 0.006, steel()).expect("valid plate");
    let member = Member::PlateWithHole(plate);
    let grid = GridFootprint {
        center: SurfacePoint::new(Face::Plate, 0.0, 0.013),
        angle_rad: 0.0,
        length_m: 0.003,
        width_m: 0.002,
    };
    let loads = LoadVector::from_pairs(&[(LoadComponent::RemoteStressX, 80e6)]);
    c.bench_function("grid_average/plate_8x4", |b| {
        b.iter(|| {
            grid_average_strain(
                black_box(&member),
                black_box(&grid),
                &loads,
                QuadratureOrder::default(),
            )
        })
    });
}

criterion_group!(benches, bench);
criterion_main!(benches);
