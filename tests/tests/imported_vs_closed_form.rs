//! The imported-field path against the project's own closed-form models (each itself checked
//! against its textbook source in `crates/mechanics/tests`). A mesh of a cantilever, a hollow
//! shaft and a plate with a hole is generated here; at each node the closed-form surface state
//! per unit load is written as a 3-D strain tensor (the in-plane strains of the face, the strain
//! normal to a free surface ε_n = −ν/(1 − ν)(εx + εy) of plane stress, no out-of-plane shear) to
//! `.vtu` and CSV files; the files are read back through the plan's import, and what grids read
//! on the imported part is compared with what they read on the closed-form part. Nodes that
//! are not on a gaugeable face (inside the part, on its end faces, on a bore) get the tensor
//! of the nearest gaugeable point: no grid of these tests reaches them.

use std::path::{Path, PathBuf};

use gw_mechanics::imported::{
    Cell, CellKind, FieldState, FieldUnits, ImportedLoad, ImportedSurface, LengthUnit, RawMesh,
    ReferenceAxis, ShearConvention, TensorUnit,
};
use gw_mechanics::{
    Beam, BeamSupport, Face, GridFootprint, LoadComponent, LoadVector, Material, Member,
    PlateWithHole, QuadratureOrder, Section, Shaft, SurfacePoint, grid_average_strain,
};
use gw_plan::imported_part::{attach, read_surface};
use vtkio::Vtk;
use vtkio::model::{
    Attribute, Attributes, ByteOrder, CellType, Cells, DataArray, DataSet, IOBuffer,
    UnstructuredGridPiece, Version, VertexNumbers,
};

fn steel() -> Material {
    Material::new("steel", 200e9, 0.3, 12e-6, 350e6).unwrap()
}

fn folder(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-imported-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

/// A structured block of hexahedra: nodes at `at(i, j, k)`, `n` cells each way; with `wrap_j`
/// the last layer of j joins the first (a full turn round an axis).
fn block(n: [usize; 3], wrap_j: bool, at: impl Fn(usize, usize, usize) -> [f64; 3]) -> RawMesh {
    let nj = if wrap_j { n[1] } else { n[1] + 1 };
    let id = |i: usize, j: usize, k: usize| ((k * nj + j % nj) * (n[0] + 1) + i) as u32;
    let mut points_m = Vec::new();
    for k in 0..=n[2] {
        for j in 0..nj {
            for i in 0..=n[0] {
                points_m.push(at(i, j, k));
            }
        }
    }
    let mut cells = Vec::new();
    for k in 0..n[2] {
        for j in 0..n[1] {
            for i in 0..n[0] {
                cells.push(Cell {
                    kind: CellKind::Hexa,
                    nodes: vec![
                        id(i, j, k),
                        id(i + 1, j, k),
                        id(i + 1, j + 1, k),
                        id(i, j + 1, k),
                        id(i, j, k + 1),
                        id(i + 1, j, k + 1),
                        id(i + 1, j + 1, k + 1),
                        id(i, j + 1, k + 1),
                    ],
                });
            }
        }
    }
    RawMesh { points_m, cells }
}

/// The 3-D strain tensor (xx, yy, zz, xy, yz, zx; tensor shear) of a free surface with the
/// closed-form state at `p` under one unit of `c`.
fn tensor_at(member: &Member, p: &SurfacePoint, c: LoadComponent) -> [f64; 6] {
    let state = member.state_per_unit(p, c).unwrap();
    let f = member.surface_frame(p).unwrap();
    let s = state.strain;
    let nu = member.material().poisson_ratio;
    let en = -nu / (1.0 - nu) * (s.normal_x + s.normal_y);
    let (ex, ey, n) = (f.axis_x, f.axis_y, f.normal);
    let t = |a: usize, b: usize| {
        s.normal_x * ex[a] * ex[b]
            + s.normal_y * ey[a] * ey[b]
            + 0.5 * s.shear_xy * (ex[a] * ey[b] + ey[a] * ex[b])
            + en * n[a] * n[b]
    };
    [t(0, 0), t(1, 1), t(2, 2), t(0, 1), t(1, 2), t(2, 0)]
}

/// Writes the mesh and one unit field as `.vtu` (strain in m/m named in the array, tensor
/// shear) and as CSV (µm/m, engineering shear) with an element CSV.
fn write_both(dir: &Path, stem: &str, mesh: &RawMesh, values: &[[f64; 6]]) {
    let points: Vec<f64> = mesh.points_m.iter().flatten().copied().collect();
    let mut connectivity = Vec::new();
    let mut offsets = Vec::new();
    for c in &mesh.cells {
        connectivity.extend(c.nodes.iter().map(|&v| u64::from(v)));
        offsets.push(connectivity.len() as u64);
    }
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
                    .with_data(values.iter().flatten().copied().collect::<Vec<f64>>()),
            )],
            cell: vec![],
        },
    };
    Vtk {
        version: Version::new_xml(1, 0),
        title: String::new(),
        byte_order: ByteOrder::LittleEndian,
        file_path: None,
        data: DataSet::inline(piece),
    }
    .export(dir.join(format!("{stem}.vtu")))
    .unwrap();
    let mut csv = String::from(
        "x [mm],y [mm],z [mm],exx [um/m],eyy [um/m],ezz [um/m],gxy [um/m],gyz [um/m],gzx [um/m]\n",
    );
    for (p, v) in mesh.points_m.iter().zip(values) {
        csv.push_str(&format!(
            "{},{},{},{},{},{},{},{},{}\n",
            p[0] * 1e3,
            p[1] * 1e3,
            p[2] * 1e3,
            v[0] * 1e6,
            v[1] * 1e6,
            v[2] * 1e6,
            2.0 * v[3] * 1e6,
            2.0 * v[4] * 1e6,
            2.0 * v[5] * 1e6
        ));
    }
    std::fs::write(dir.join(format!("{stem}.csv")), csv).unwrap();
    let mut cells = String::from("# kind, nodes (rows of the node file from 1)\n");
    for c in &mesh.cells {
        let list: Vec<String> = c.nodes.iter().map(|v| (v + 1).to_string()).collect();
        cells.push_str(&format!("hex,{}\n", list.join(",")));
    }
    std::fs::write(dir.join(format!("{stem}_cells.csv")), cells).unwrap();
}

/// The imported twin of `member`: unit fields of `components` written for every node of
/// `mesh` (each node's state taken at `point_of(node)`), read back through the import, by
/// `.vtu` or CSV.
fn imported_twin(
    dir: &Path,
    member: &Member,
    mesh: &RawMesh,
    components: &[LoadComponent],
    point_of: impl Fn([f64; 3]) -> SurfacePoint,
    csv: bool,
) -> Member {
    let mut loads = Vec::new();
    for &c in components {
        let stem = format!("{c:?}");
        let values: Vec<[f64; 6]> = mesh
            .points_m
            .iter()
            .map(|&p| tensor_at(member, &point_of(p), c))
            .collect();
        write_both(dir, &stem, mesh, &values);
        loads.push(ImportedLoad {
            component: c,
            name: String::new(),
            file: if csv {
                format!("{stem}.csv")
            } else {
                format!("{stem}.vtu")
            },
            array: None,
            units: (!csv).then_some(FieldUnits {
                length: LengthUnit::Metre,
                tensor: TensorUnit::StrainRatio,
                shear: ShearConvention::Tensor,
            }),
            checksum: None,
        });
    }
    let mut surface = ImportedSurface {
        material: member.material().clone(),
        reference_axis: ReferenceAxis::X,
        loads,
        mesh_file: csv.then(|| format!("{:?}_cells.csv", components[0])),
        field: FieldState::NotLoaded,
        read_notes: Vec::new(),
    };
    attach(&mut surface, Some(dir));
    assert!(surface.surface().is_some(), "{:?}", surface.field);
    Member::ImportedField(surface)
}

/// The imported grid of a closed-form one: the same place in space, the same angle (both
/// faces' x axes checked to point the same way).
fn twin_grid(closed: &Member, imported: &Member, grid: &GridFootprint) -> GridFootprint {
    let frame = closed.surface_frame(&grid.center).unwrap();
    let Member::ImportedField(f) = imported else {
        unreachable!()
    };
    let field = f.surface().unwrap();
    let center = field.point_at(frame.position, 1e-3).unwrap();
    let other = field.frame(&center).unwrap();
    let along: f64 = (0..3).map(|k| frame.axis_x[k] * other.axis_x[k]).sum();
    assert!(along > 0.999, "x axes differ: {frame:?} vs {other:?}");
    GridFootprint { center, ..*grid }
}

fn read(member: &Member, grid: &GridFootprint, loads: &LoadVector) -> f64 {
    grid_average_strain(member, grid, loads, QuadratureOrder::default()).unwrap()
}

/// A solid rectangular cantilever 300 mm long, 20 wide (y), 30 high (z), clamped at x = 0 and
/// loaded at its tip, meshed 60 × 8 × 12.
fn cantilever() -> (Member, RawMesh) {
    let (l, b, h) = (0.3, 0.02, 0.03);
    let beam = Beam::new(
        Section::Rectangle {
            width_m: b,
            height_m: h,
        },
        steel(),
        l,
        BeamSupport::Cantilever,
        l,
    )
    .unwrap();
    let n = [60, 8, 12];
    let mesh = block(n, false, |i, j, k| {
        [
            l * i as f64 / n[0] as f64,
            -b / 2.0 + b * j as f64 / n[1] as f64,
            -h / 2.0 + h * k as f64 / n[2] as f64,
        ]
    });
    (Member::Beam(beam), mesh)
}

/// The cantilever's face under a node: the top and bottom first, then the sides (end faces
/// and inner nodes take the nearest side's state; no grid reaches them).
fn cantilever_point(p: [f64; 3]) -> SurfacePoint {
    let (b, h) = (0.02, 0.03);
    let x = p[0].clamp(1e-9, 0.3 - 1e-9);
    if (p[2] - h / 2.0).abs() < 1e-9 {
        SurfacePoint::new(Face::Top, x, p[1])
    } else if (p[2] + h / 2.0).abs() < 1e-9 {
        SurfacePoint::new(Face::Bottom, x, -p[1])
    } else if p[1] < 0.0 || (p[1] + b / 2.0).abs() < 1e-9 {
        SurfacePoint::new(Face::Front, x, p[2])
    } else {
        SurfacePoint::new(Face::Back, x, -p[2])
    }
}

#[test]
fn cantilever_grids_read_what_the_beam_model_reads_through_vtu_and_csv() {
    let (beam, mesh) = cantilever();
    let components = [
        LoadComponent::VerticalForce,
        LoadComponent::LateralForce,
        LoadComponent::AxialForce,
    ];
    let loads = LoadVector::from_pairs(&[
        (LoadComponent::VerticalForce, 2000.0),
        (LoadComponent::LateralForce, -700.0),
        (LoadComponent::AxialForce, 15000.0),
    ]);
    for csv in [false, true] {
        let dir = folder(&format!("cantilever-{csv}"));
        let imported = imported_twin(&dir, &beam, &mesh, &components, cantilever_point, csv);
        // Top face: vertical bending and axial strain are linear in x and uniform across the
        // face, which linear triangles interpolate exactly; lateral bending, k (L − x) y with
        // k = F_lat / (E I_z), has a bilinear term that a triangle of a 5 × 2.5 mm cell misses
        // by at most h_x h_y / 4 · k (the cell's diagonal split, common practice).
        let iz = 0.03 * 0.02f64.powi(3) / 12.0;
        let bilinear = 0.005 * 0.0025 / 4.0 * 700.0 / (200e9 * iz);
        let grids = [
            (Face::Top, 0.15, 0.0, 0.0),
            (Face::Top, 0.12, 0.004, 30f64.to_radians()),
            // The front face at the neutral axis at ±45°: the transverse shear γ, about
            // parabolic across the depth h, is interpolated linearly between nodes h_e = 2.5 mm
            // apart; linear interpolation misses by at most h_e²/8·|γ''| = (h_e/h)²·γ0 (common
            // practice), and a ±45° grid reads γ/2.
            (Face::Front, 0.2, 0.0, 45f64.to_radians()),
            (Face::Front, 0.2, 0.0, -45f64.to_radians()),
        ];
        for (face, x, s, angle) in grids {
            let grid = GridFootprint {
                center: SurfacePoint::new(face, x, s),
                angle_rad: angle,
                length_m: 3e-3,
                width_m: 1.8e-3,
            };
            let closed = read(&beam, &grid, &loads);
            let twin = read(&imported, &twin_grid(&beam, &imported, &grid), &loads);
            let tolerance = if face == Face::Top {
                bilinear
            } else {
                let gamma0 = beam.state(&grid.center, &loads).unwrap().strain.shear_xy;
                (2.5f64 / 30.0).powi(2) * gamma0.abs() / 2.0
            };
            assert!(
                (twin - closed).abs() <= tolerance + 1e-12,
                "{face:?} x = {x} at {:.0}° ({}): imported {twin:e} vs closed form {closed:e}",
                angle.to_degrees(),
                if csv { "CSV" } else { "vtu" }
            );
        }
    }
}

#[test]
fn hollow_shaft_grids_read_what_the_shaft_model_reads() {
    // Ø 50 / Ø 30 mm, 400 mm long, meshed 40 along × 72 round × 3 through the wall.
    let (ro, ri, l) = (0.025, 0.015, 0.4);
    let shaft = Member::Shaft(Shaft::new(2.0 * ro, 2.0 * ri, l, steel()).unwrap());
    let n = [40, 72, 3];
    let mesh = block(n, true, |i, j, k| {
        let phi = std::f64::consts::TAU * j as f64 / n[1] as f64;
        let r = ri + (ro - ri) * k as f64 / n[2] as f64;
        [l * i as f64 / n[0] as f64, r * phi.sin(), r * phi.cos()]
    });
    let point_of = |p: [f64; 3]| {
        let phi = p[1].atan2(p[2]);
        SurfacePoint::new(Face::Round, p[0].clamp(1e-9, l - 1e-9), phi * ro)
    };
    let components = [LoadComponent::Torque, LoadComponent::BendingMomentY];
    let dir = folder("shaft");
    let imported = imported_twin(&dir, &shaft, &mesh, &components, point_of, false);
    let loads = LoadVector::from_pairs(&[
        (LoadComponent::Torque, 900.0),
        (LoadComponent::BendingMomentY, 300.0),
    ]);
    // The facets are chords of the circle, 5° apart: where the tensor turns with the angle,
    // linear interpolation between nodes is off by about (Δφ/2)²/2 ≈ 0.1 % (the cosine's
    // second-order term, common practice); the grid lies on the tangent plane at its centre,
    // off the facets by at most their sagitta (0.02 mm here). Tolerance 0.5 %.
    for (s_deg, angle_deg) in [
        (0.0, 45.0),
        (0.0, -45.0),
        (2.5, 45.0),
        (100.0, 0.0),
        (30.0, 20.0),
    ] {
        let grid = GridFootprint {
            center: SurfacePoint::new(Face::Round, 0.2, f64::to_radians(s_deg) * ro),
            angle_rad: f64::to_radians(angle_deg),
            length_m: 3e-3,
            width_m: 1.8e-3,
        };
        let closed = read(&shaft, &grid, &loads);
        let twin = read(&imported, &twin_grid(&shaft, &imported, &grid), &loads);
        assert!(
            (twin - closed).abs() <= 5e-3 * closed.abs().max(50e-6),
            "s at {s_deg}°, grid at {angle_deg}°: imported {twin:e} vs closed form {closed:e}"
        );
    }
}

#[test]
fn plate_with_a_hole_grids_read_what_the_kirsch_field_gives() {
    // A 10 mm thick plate with a Ø 20 mm hole, meshed round the hole out to r = 80 mm: 120
    // round × 48 radial (graded, finest at the hole) × 1 through the thickness.
    let (a, outer, t) = (0.01, 0.08, 0.01);
    let plate = Member::PlateWithHole(PlateWithHole::new(2.0 * a, 0.4, 0.4, t, steel()).unwrap());
    let n = [48, 120, 1];
    let radius = |i: usize| a * (outer / a).powf(i as f64 / n[0] as f64);
    let mesh = block(n, true, |i, j, k| {
        let th = std::f64::consts::TAU * j as f64 / n[1] as f64;
        let r = radius(i);
        [r * th.cos(), r * th.sin(), -t / 2.0 + t * k as f64]
    });
    let point_of = |p: [f64; 3]| {
        // The hole edge itself is on the face (r = a); round-off inside it is taken back out.
        let r = p[0].hypot(p[1]).max(a);
        let th = p[1].atan2(p[0]);
        SurfacePoint::new(Face::Plate, r * th.cos(), r * th.sin())
    };
    let components = [LoadComponent::RemoteStressX, LoadComponent::RemoteShearXY];
    let dir = folder("plate");
    let imported = imported_twin(&dir, &plate, &mesh, &components, point_of, true);
    let loads = LoadVector::from_pairs(&[
        (LoadComponent::RemoteStressX, 80e6),
        (LoadComponent::RemoteShearXY, 20e6),
    ]);
    let d = (outer / a).powf(1.0 / n[0] as f64); // ratio of one radial step
    for (r_over_a, th_deg, angle_deg) in [(2.0, 90.0, 0.0), (1.6, 90.0, 0.0), (3.0, 45.0, 90.0)] {
        let (r, th) = (r_over_a * a, f64::to_radians(th_deg));
        let grid = GridFootprint {
            center: SurfacePoint::new(Face::Plate, r * th.cos(), r * th.sin()),
            angle_rad: f64::to_radians(angle_deg),
            length_m: 2e-3,
            width_m: 1.5e-3,
        };
        let closed = read(&plate, &grid, &loads);
        let twin = read(&imported, &twin_grid(&plate, &imported, &grid), &loads);
        // Linear interpolation error ≤ h²/8·|f''| (common practice) radially and round the
        // hole: f'' estimated from the closed form by central differences over one element
        // (the element sizes there are h_r = r (d − 1) and h_θ = r·3°).
        let strain_at = |rr: f64, tt: f64| {
            let p = SurfacePoint::new(Face::Plate, rr * tt.cos(), rr * tt.sin());
            plate
                .state(&p, &loads)
                .unwrap()
                .strain
                .along(grid.angle_rad)
        };
        let (hr, ht) = (r * (d - 1.0), std::f64::consts::TAU / n[1] as f64);
        let frr = (strain_at(r + hr, th) - 2.0 * strain_at(r, th) + strain_at(r - hr, th)).abs();
        let ftt = (strain_at(r, th + ht) - 2.0 * strain_at(r, th) + strain_at(r, th - ht)).abs();
        let bound = (frr + ftt) / 8.0;
        assert!(
            (twin - closed).abs() <= 1.5 * bound + 1e-3 * closed.abs(),
            "r = {r_over_a} a at {th_deg}°: imported {twin:e} vs closed form {closed:e} (bound {bound:e})"
        );
    }
}

#[test]
fn broken_files_are_refused_with_the_place() {
    let (beam, mesh) = cantilever();
    let dir = folder("broken");
    let _ = imported_twin(
        &dir,
        &beam,
        &mesh,
        &[LoadComponent::VerticalForce],
        cantilever_point,
        true,
    );
    let surface = |file: &str, mesh_file: Option<&str>, units| ImportedSurface {
        material: steel(),
        reference_axis: ReferenceAxis::X,
        loads: vec![ImportedLoad {
            component: LoadComponent::VerticalForce,
            name: String::new(),
            file: file.into(),
            array: None,
            units,
            checksum: None,
        }],
        mesh_file: mesh_file.map(str::to_owned),
        field: FieldState::NotLoaded,
        read_notes: Vec::new(),
    };
    let si = Some(FieldUnits {
        length: LengthUnit::Metre,
        tensor: TensorUnit::StrainRatio,
        shear: ShearConvention::Tensor,
    });
    let fails = |s: &ImportedSurface, words: &str| {
        let e = read_surface(s, Some(&dir)).map(|_| ()).unwrap_err();
        assert!(e.contains(words), "expected \"{words}\" in: {e}");
    };
    // A NaN in a CSV: the line and the column.
    let text = std::fs::read_to_string(dir.join("VerticalForce.csv")).unwrap();
    let mut lines: Vec<String> = text.lines().map(str::to_owned).collect();
    let mut fields: Vec<&str> = lines[5].split(',').collect();
    fields[4] = "NaN";
    lines[5] = fields.join(",");
    std::fs::write(dir.join("nan.csv"), lines.join("\n")).unwrap();
    fails(
        &surface("nan.csv", Some("VerticalForce_cells.csv"), None),
        "line 6, column 5",
    );
    // A cell that refers past the points: the node count and the cells disagree.
    let cells = std::fs::read_to_string(dir.join("VerticalForce_cells.csv")).unwrap();
    let last = mesh.points_m.len() + 1;
    let broken = cells.replacen("hex,1,", &format!("hex,{last},"), 1);
    std::fs::write(dir.join("broken_cells.csv"), broken).unwrap();
    fails(
        &surface("VerticalForce.csv", Some("broken_cells.csv"), None),
        &format!("node \"{last}\" is not a node number"),
    );
    // A named array that is not there.
    let mut named = surface("VerticalForce.vtu", None, si);
    named.loads[0].array = Some("stress".into());
    fails(&named, "no tensor array \"stress\"");
    // A VTK file without stated units.
    let mut unstated = surface("VerticalForce.vtu", None, None);
    unstated.loads[0].file = "bare.vtu".into();
    let bare = std::fs::read_to_string(dir.join("VerticalForce.vtu"))
        .unwrap()
        .replace("strain [m/m]", "strain");
    std::fs::write(dir.join("bare.vtu"), bare).unwrap();
    fails(&unstated, "units are not stated");
    // A mesh with no surface: no cells at all.
    std::fs::write(dir.join("no_cells.csv"), "# no cells\n").unwrap();
    fails(
        &surface("VerticalForce.csv", Some("no_cells.csv"), None),
        "no outer surface",
    );
    // Two results on different meshes.
    let (_, other_mesh) = {
        let (b, _) = cantilever();
        let n = [10, 2, 2];
        (
            b,
            block(n, false, |i, j, k| {
                [0.03 * i as f64, 0.01 * j as f64, 0.015 * k as f64]
            }),
        )
    };
    let values = vec![[0.0; 6]; other_mesh.points_m.len()];
    write_both(&dir, "small", &other_mesh, &values);
    let mut two = surface("VerticalForce.vtu", None, si);
    two.loads.push(ImportedLoad {
        component: LoadComponent::AxialForce,
        file: "small.vtu".into(),
        ..two.loads[0].clone()
    });
    fails(&two, "every unit-load result must be on the same mesh");
}
