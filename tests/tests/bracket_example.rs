//! The example finite-element results shipped in `assets/bracket_fe/`: an invented steel
//! L-bracket (an upright plate bolted at its base, an arm at its top carrying the load at its
//! end) solved by the small finite-element solution in `bracket_example/fe.rs`. The solution is
//! first checked against beam theory on a cantilever; the shipped files must be what it gives
//! (`UPDATE_ASSETS=1 cargo test -p gw-verify --test bracket_example` writes them again).

#[path = "bracket_example/fe.rs"]
mod fe;

use std::path::{Path, PathBuf};

use fe::{BoxMesh, face_load, nodal_strains, solve, stiffness};
use gw_mechanics::imported::{FieldUnits, LengthUnit, ShearConvention, TensorUnit};
use gw_plan::import::{ReadRequest, read_field};
use vtkio::Vtk;
use vtkio::model::{
    Attribute, Attributes, ByteOrder, CellType, Cells, DataArray, DataSet, IOBuffer,
    UnstructuredGridPiece, Version, VertexNumbers,
};

/// Carbon steel as the library gives it (207 GPa, ν = 0.292).
const E: f64 = 207e9;
const NU: f64 = 0.292;

/// Evenly spaced grid lines from `a` to `b` in `n` steps.
fn lines(a: f64, b: f64, n: usize) -> Vec<f64> {
    (0..=n).map(|i| a + (b - a) * i as f64 / n as f64).collect()
}

/// Grid lines through several spans, each with its own number of steps.
fn spans(parts: &[(f64, f64, usize)]) -> Vec<f64> {
    let mut out: Vec<f64> = Vec::new();
    for &(a, b, n) in parts {
        let l = lines(a, b, n);
        out.extend(if out.is_empty() { &l[..] } else { &l[1..] });
    }
    out
}

/// Solves for a total force `load` on the face `axis = at`, the nodes of `z = 0` held.
fn solution(mesh: &BoxMesh, axis: usize, at: f64, load: [f64; 3]) -> Vec<f64> {
    let k = stiffness(mesh, E, NU);
    let f = face_load(mesh, axis, at, load);
    let fixed: Vec<bool> = (0..3 * mesh.nodes.len())
        .map(|d| mesh.position(d / 3)[2].abs() < 1e-12)
        .collect();
    solve(&k, &f, &fixed)
}

#[test]
fn the_solution_bends_a_cantilever_as_beam_theory_says() {
    // A cantilever 200 mm long along z (clamped at z = 0), 20 × 20 mm, a 1 kN force along +x at
    // its free end; 10 × 10 × 40 cells.
    let (l, b) = (0.2, 0.02);
    let mesh = BoxMesh::new(
        [
            lines(-b / 2.0, b / 2.0, 10),
            lines(-b / 2.0, b / 2.0, 10),
            lines(0.0, l, 40),
        ],
        |_| true,
    );
    let p = 1000.0;
    let u = solution(&mesh, 2, l, [p, 0.0, 0.0]);
    let i = b.powi(4) / 12.0;
    // Tip deflection: P L³ / 3 E I plus the shear term P L / (κ G A), κ = 5/6 (Timoshenko;
    // Gere & Goodno, *Mechanics of Materials*, §9.5 and §9.11).
    let g = E / (2.0 * (1.0 + NU));
    let expected = p * l.powi(3) / (3.0 * E * i) + p * l / (5.0 / 6.0 * g * b * b);
    let tip: Vec<f64> = (0..mesh.nodes.len())
        .filter(|&n| (mesh.position(n)[2] - l).abs() < 1e-12)
        .map(|n| u[3 * n])
        .collect();
    let deflection = tip.iter().sum::<f64>() / tip.len() as f64;
    // Fully integrated trilinear hexahedra are too stiff in bending (shear locking, common
    // practice): with 10 cells across the depth the deflection comes out 3.4 % low.
    let rel = (deflection - expected) / expected;
    assert!(
        rel.abs() < 0.05,
        "tip deflection {deflection:e} vs {expected:e} ({rel:+.3})"
    );
    // The surface strain at mid-span on the side the force along +x stretches (x = −b/2):
    // M c / (E I), Navier (Gere & Goodno, §5.5), the bending moment at mid-span P L / 2.
    let strains = nodal_strains(&mesh, &u);
    let at = |x: f64, z: f64| {
        (0..mesh.nodes.len())
            .find(|&n| {
                let q = mesh.position(n);
                (q[0] - x).abs() < 1e-12 && q[1].abs() < 1e-12 && (q[2] - z).abs() < 1e-12
            })
            .unwrap()
    };
    let n = at(-b / 2.0, l / 2.0);
    let navier = p * (l / 2.0) * (b / 2.0) / (E * i);
    let rel = (strains[n][2] - navier) / navier;
    assert!(
        rel.abs() < 0.03,
        "bending strain {:e} vs {navier:e} ({rel:+.3})",
        strains[n][2]
    );
}

/// The bracket's mesh: the upright (x from −6 to 6 mm, z from 0 to 120 mm) and the arm (x
/// from 6 to 106 mm, z from 108 to 120 mm), both 60 mm wide (y from −30 to 30 mm).
fn bracket() -> BoxMesh {
    let mm = 1e-3;
    BoxMesh::new(
        [
            spans(&[(-6.0 * mm, 6.0 * mm, 4), (6.0 * mm, 106.0 * mm, 40)]),
            lines(-30.0 * mm, 30.0 * mm, 16),
            spans(&[(0.0, 108.0 * mm, 36), (108.0 * mm, 120.0 * mm, 4)]),
        ],
        |c| c[0] < 6.0 * mm || c[2] > 108.0 * mm,
    )
}

/// The bracket's unit loads: their file names and 1 N at the arm's end face.
const LOADS: [(&str, [f64; 3]); 3] = [
    ("bracket_down.vtu", [0.0, 0.0, -1.0]),
    ("bracket_side.vtu", [0.0, 1.0, 0.0]),
    ("bracket_pull.vtu", [1.0, 0.0, 0.0]),
];

fn write_vtu(path: &Path, mesh: &BoxMesh, strains: &[[f64; 6]]) {
    let points: Vec<f64> = (0..mesh.nodes.len())
        .flat_map(|n| mesh.position(n))
        .collect();
    let connectivity: Vec<u64> = mesh
        .cells
        .iter()
        .flat_map(|(_, ids)| ids.map(|v| v as u64))
        .collect();
    let offsets = (1..=mesh.cells.len() as u64).map(|c| 8 * c).collect();
    let piece = UnstructuredGridPiece {
        points: IOBuffer::F64(points),
        cells: Cells {
            cell_verts: VertexNumbers::XML {
                connectivity,
                offsets,
            },
            types: vec![CellType::Hexahedron; mesh.cells.len()],
        },
        data: Attributes {
            point: vec![Attribute::DataArray(
                DataArray::new("strain [m/m]", 6)
                    .with_data(strains.iter().flatten().copied().collect::<Vec<f64>>()),
            )],
            cell: vec![],
        },
    };
    Vtk {
        version: Version::new_xml(1, 0),
        title: "L-bracket, unit load".into(),
        byte_order: ByteOrder::LittleEndian,
        file_path: None,
        data: DataSet::inline(piece),
    }
    .export(path)
    .unwrap();
}

fn assets() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../assets/bracket_fe")
}

/// The units the shipped files are written in (coordinates in metres, strain ratio, tensor
/// shear), as the example plan states them.
fn shipped_units() -> FieldUnits {
    FieldUnits {
        length: LengthUnit::Metre,
        tensor: TensorUnit::StrainRatio,
        shear: ShearConvention::Tensor,
    }
}

#[test]
fn the_shipped_bracket_results_are_what_the_solution_gives() {
    let mesh = bracket();
    let k = stiffness(&mesh, E, NU);
    let fixed: Vec<bool> = (0..3 * mesh.nodes.len())
        .map(|d| mesh.position(d / 3)[2].abs() < 1e-12)
        .collect();
    let update = std::env::var_os("UPDATE_ASSETS").is_some();
    for (file, load) in LOADS {
        let f = face_load(&mesh, 0, 0.106, load);
        let u = solve(&k, &f, &fixed);
        // Statics: the base's reactions balance the unit load (common practice).
        let mut ku = vec![0.0; f.len()];
        for (d, v) in ku.iter_mut().enumerate() {
            *v = k_row(&k, d, &u);
        }
        for axis in 0..3 {
            let reaction: f64 = (0..mesh.nodes.len())
                .filter(|&n| fixed[3 * n])
                .map(|n| ku[3 * n + axis])
                .sum();
            assert!(
                (reaction + load[axis]).abs() < 1e-6,
                "{file}: {reaction} along {axis}"
            );
        }
        let strains = nodal_strains(&mesh, &u);
        let path = assets().join(file);
        if update {
            std::fs::create_dir_all(assets()).unwrap();
            write_vtu(&path, &mesh, &strains);
        }
        let shipped = read_field(&ReadRequest {
            path: &path,
            array: None,
            stated: Some(shipped_units()),
            mesh_path: None,
        })
        .unwrap_or_else(|e| panic!("{e}; write the files with UPDATE_ASSETS=1"));
        let scale = strains
            .iter()
            .flatten()
            .fold(0.0_f64, |m, v| m.max(v.abs()));
        assert_eq!(shipped.values.len(), strains.len(), "{file}");
        for (a, b) in shipped.values.iter().zip(&strains) {
            for m in 0..6 {
                assert!(
                    (a[m] - b[m]).abs() <= 1e-9 * scale,
                    "{file} differs from the solution; write it again with UPDATE_ASSETS=1"
                );
            }
        }
    }
}

fn k_row(k: &fe::Sparse, row: usize, u: &[f64]) -> f64 {
    k.row_times(row, u)
}
