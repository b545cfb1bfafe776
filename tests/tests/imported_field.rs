//! The imported-field path proved against the project's own closed-form models.
//!
//! A cantilever bar, a hollow round shaft and a plate with a central hole are meshed with
//! hexahedra exactly where the closed-form part lies in space (`Member::surface_frame`). Each
//! node on the mesh's outer surface carries, per unit of each load, the closed-form surface
//! state as a 3-D strain tensor in global axes: the face's in-plane strains, the strain normal
//! to the free surface ε_n = −ν/(1 − ν)(εx + εy) (plane stress) and no out-of-plane shear.
//! Surface nodes off the gaugeable faces (the bar's and the shaft's ends, the bore, the
//! plate's underside, hole wall and rim) carry the state of the nearest gaugeable point; nodes
//! inside the part carry zero, so that a value from inside leaking into the surface would
//! show. The fields are written as `.vtu` and as CSV, read back through the plan's import, and
//! the same gauges on the imported twin must read what they read on the closed-form part,
//! grid by grid and bridge by bridge, within a bound derived from the mesh.
//!
//! Source of every expected value: the closed-form models of this project, themselves checked
//! against their textbook sources in `crates/mechanics/tests`.

use std::f64::consts::{FRAC_PI_2, TAU};
use std::path::{Path, PathBuf};

use gw_bridge::bridge::COPPER_TCR_PER_C;
use gw_bridge::signal_chain::LowPassFilter;
use gw_bridge::{
    CompletionResistor, Excitation, GaugePattern, InstrumentTemperature, LeadWire, LeadWiring,
    PlacedGauge, SignalChain,
};
use gw_mechanics::imported::{
    FieldUnits, ImportedLoad, ImportedSurface, LengthUnit, ReferenceAxis, ShearConvention,
    TensorUnit,
};
use gw_mechanics::{
    Beam, BeamSupport, Face, GridFootprint, LoadComponent, LoadVector, Material, Member,
    PlateWithHole, QuadratureOrder, Section, Shaft, SurfaceFrame, SurfacePoint,
    grid_average_strain,
};
use gw_plan::Project;
use gw_plan::blank::{blank_project, new_part};
use gw_plan::document::{
    BridgeFactorOverride, BridgePlan, LoadCase, PlanArm, PlanGauge, default_gauge_spec,
    stock_name_for,
};
use gw_plan::evaluate::{EvalOptions, Evaluation, Severity, UncertaintyDepth, evaluate};
use gw_plan::imported_part::{attach, read_surface};
use vtkio::Vtk;
use vtkio::model::{
    Attribute, Attributes, ByteOrder, CellType, Cells, DataArray, DataSet, IOBuffer,
    UnstructuredGridPiece, Version, VertexNumbers,
};

/// Poisson's ratio of the steel used throughout.
const NU: f64 = 0.3;

fn steel() -> Material {
    Material::new("steel", 200e9, NU, 12e-6, 350e6).unwrap()
}

/// A fresh, empty folder under the system's temporary folder.
fn fresh_folder(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-imported-field-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

fn dot(a: [f64; 3], b: [f64; 3]) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

// ---------------------------------------------------------------------------------------------
// Meshes
// ---------------------------------------------------------------------------------------------

/// Hexahedra: nodes, cells by corner nodes in the VTK order (four corners round the bottom,
/// then the four above them), and whether each node lies on the outer surface.
struct HexMesh {
    points_m: Vec<[f64; 3]>,
    cells: Vec<[usize; 8]>,
    on_surface: Vec<bool>,
}

/// A structured block of `n[0] × n[1] × n[2]` hexahedra with nodes at `at(i, j, k)`; with
/// `wrap_j` the layer j = n[1] is the layer j = 0 (a full turn round an axis). The index
/// directions i, j, k must be right-handed in space.
fn hex_block(n: [usize; 3], wrap_j: bool, at: impl Fn(usize, usize, usize) -> [f64; 3]) -> HexMesh {
    let nj = if wrap_j { n[1] } else { n[1] + 1 };
    let id = |i: usize, j: usize, k: usize| (k * nj + j % nj) * (n[0] + 1) + i;
    let (mut points_m, mut on_surface) = (Vec::new(), Vec::new());
    for k in 0..=n[2] {
        for j in 0..nj {
            for i in 0..=n[0] {
                points_m.push(at(i, j, k));
                let side = !wrap_j && (j == 0 || j == n[1]);
                on_surface.push(i == 0 || i == n[0] || k == 0 || k == n[2] || side);
            }
        }
    }
    let mut cells = Vec::new();
    for k in 0..n[2] {
        for j in 0..n[1] {
            for i in 0..n[0] {
                cells.push([
                    id(i, j, k),
                    id(i + 1, j, k),
                    id(i + 1, j + 1, k),
                    id(i, j + 1, k),
                    id(i, j, k + 1),
                    id(i + 1, j, k + 1),
                    id(i + 1, j + 1, k + 1),
                    id(i, j + 1, k + 1),
                ]);
            }
        }
    }
    HexMesh {
        points_m,
        cells,
        on_surface,
    }
}

/// The cells of a mesh near a point of a face: edge lengths along two directions at right
/// angles, the first at `angle_rad` from the face's x (a cell's corners lie within these
/// lengths along each direction).
#[derive(Debug, Clone, Copy)]
struct CellShape {
    h1_m: f64,
    h2_m: f64,
    angle_rad: f64,
}

/// A closed-form part, its mesh, and what the bound on the imported twin needs to know.
struct Model {
    name: &'static str,
    closed: Member,
    mesh: HexMesh,
    components: Vec<LoadComponent>,
    /// The gaugeable-face point whose state a surface node carries.
    face_point: Box<dyn Fn([f64; 3]) -> SurfacePoint>,
    /// The mesh's cells on a face near a point.
    cell_size: Box<dyn Fn(&SurfacePoint) -> CellShape>,
    /// Radius of a curved face (`None`: every face flat).
    radius_m: Option<f64>,
    /// Largest distance from the closed-form face to the mesh's facets, metres.
    sagitta_m: f64,
}

/// A solid rectangular cantilever 300 mm long, 30 mm across (y), 40 mm high (z), its section
/// centred on the x axis and clamped at x = 0, loaded at its tip; 60 × 12 × 16 cells of
/// 5 × 2.5 × 2.5 mm.
fn cantilever() -> Model {
    let (l, b, h) = (0.3, 0.03, 0.04);
    let n = [60, 12, 16];
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
    let mesh = hex_block(n, false, |i, j, k| {
        [
            l * i as f64 / n[0] as f64,
            -b / 2.0 + b * j as f64 / n[1] as f64,
            -h / 2.0 + h * k as f64 / n[2] as f64,
        ]
    });
    // The nearest of the four long faces (Member::surface_frame: top z = h/2 with s = y,
    // bottom s = −y, front y = −b/2 with s = z, back s = −z); on a face it is the face itself.
    let face_point = move |p: [f64; 3]| {
        let [x, y, z] = p;
        let near = [
            (h / 2.0 - z, SurfacePoint::new(Face::Top, x, y)),
            (z + h / 2.0, SurfacePoint::new(Face::Bottom, x, -y)),
            (y + b / 2.0, SurfacePoint::new(Face::Front, x, z)),
            (b / 2.0 - y, SurfacePoint::new(Face::Back, x, -z)),
        ];
        near.into_iter()
            .min_by(|a, b| a.0.total_cmp(&b.0))
            .unwrap()
            .1
    };
    Model {
        name: "cantilever",
        closed: Member::Beam(beam),
        mesh,
        components: vec![LoadComponent::VerticalForce, LoadComponent::AxialForce],
        face_point: Box::new(face_point),
        cell_size: Box::new(move |_| CellShape {
            h1_m: l / n[0] as f64,
            h2_m: b / n[1] as f64,
            angle_rad: 0.0,
        }),
        radius_m: None,
        sagitta_m: 0.0,
    }
}

/// A hollow shaft Ø 50 / Ø 30 mm, 400 mm long along x; 40 cells along, 72 round (5°), 4
/// through the wall. The angle s/r runs from +z towards +y (Member::surface_frame).
fn hollow_shaft() -> Model {
    let (ro, ri, l) = (0.025, 0.015, 0.4);
    let n = [40, 72, 4];
    let shaft = Shaft::new(2.0 * ro, 2.0 * ri, l, steel()).unwrap();
    let mesh = hex_block(n, true, |i, j, k| {
        let phi = TAU * j as f64 / n[1] as f64;
        let r = ri + (ro - ri) * k as f64 / n[2] as f64;
        [l * i as f64 / n[0] as f64, r * phi.sin(), r * phi.cos()]
    });
    // Outer nodes are on the round face; bore and end nodes take the outer point at their angle.
    let face_point = move |p: [f64; 3]| SurfacePoint::new(Face::Round, p[0], p[1].atan2(p[2]) * ro);
    let dphi = TAU / n[1] as f64;
    Model {
        name: "hollow shaft",
        closed: Member::Shaft(shaft),
        mesh,
        components: vec![LoadComponent::Torque, LoadComponent::BendingMomentY],
        face_point: Box::new(face_point),
        cell_size: Box::new(move |_| CellShape {
            h1_m: l / n[0] as f64,
            h2_m: ro * dphi,
            angle_rad: 0.0,
        }),
        radius_m: Some(ro),
        sagitta_m: ro * (1.0 - (dphi / 2.0).cos()),
    }
}

/// Ratio of one radial cell to the next in the plate's mesh.
const PLATE_GROWTH: f64 = 1.044_273_782_427_413_8; // 8^(1/48)

/// A 10 mm plate with a Ø 20 mm hole at the origin in the x–y plane, its gauged face on top at
/// z = t/2 (Member::surface_frame); meshed round the hole out to r = 80 mm, 48 cells radially
/// (each 4.4 % longer than the one inside it), 120 round (3°), one through the thickness.
fn plate_with_hole() -> Model {
    let (a, t) = (0.01, 0.01);
    let n = [48, 120, 1];
    let plate = PlateWithHole::new(2.0 * a, 0.2, 0.2, t, steel()).unwrap();
    let mesh = hex_block(n, true, |i, j, k| {
        let r = a * PLATE_GROWTH.powi(i as i32);
        let th = TAU * j as f64 / n[1] as f64;
        [r * th.cos(), r * th.sin(), -t / 2.0 + t * k as f64]
    });
    // Every node is on the surface; the underside and the hole wall take the top's state at
    // the same (x, y), brought out of the hole where rounding puts it a hair inside.
    let face_point = move |p: [f64; 3]| {
        let (r, th) = (p[0].hypot(p[1]).max(a), p[1].atan2(p[0]));
        SurfacePoint::new(Face::Plate, r * th.cos(), r * th.sin())
    };
    // Radially from r to r·g, round r·g·Δθ at most (g the growth).
    let cell_size = move |p: &SurfacePoint| {
        let r = p.x_m.hypot(p.s_m) * PLATE_GROWTH;
        CellShape {
            h1_m: r * (PLATE_GROWTH - 1.0),
            h2_m: r * TAU / n[1] as f64,
            angle_rad: p.s_m.atan2(p.x_m),
        }
    };
    Model {
        name: "plate with a hole",
        closed: Member::PlateWithHole(plate),
        mesh,
        components: vec![LoadComponent::RemoteStressX, LoadComponent::RemoteStressY],
        face_point: Box::new(face_point),
        cell_size: Box::new(cell_size),
        radius_m: None,
        sagitta_m: 0.0,
    }
}

// ---------------------------------------------------------------------------------------------
// Fields
// ---------------------------------------------------------------------------------------------

/// The strain tensor (xx, yy, zz, xy, yz, zx; tensor shear) in global axes of a free surface
/// whose face frame is `f` and whose in-plane strains are (εx, εy, γxy): the in-plane part
/// turned into global axes, ε_n = −ν/(1 − ν)(εx + εy) along the normal (plane stress, σ_n = 0;
/// Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., ch. 2 on plane stress), no
/// out-of-plane shear.
fn free_surface_tensor(f: &SurfaceFrame, (ex, ey, gxy): (f64, f64, f64), nu: f64) -> [f64; 6] {
    let en = -nu / (1.0 - nu) * (ex + ey);
    let (x, y, n) = (f.axis_x, f.axis_y, f.normal);
    let t = |a: usize, b: usize| {
        ex * x[a] * x[b]
            + ey * y[a] * y[b]
            + 0.5 * gxy * (x[a] * y[b] + y[a] * x[b])
            + en * n[a] * n[b]
    };
    [t(0, 0), t(1, 1), t(2, 2), t(0, 1), t(1, 2), t(2, 0)]
}

/// The closed-form tensor at a face point per unit of one load.
fn unit_tensor(m: &Member, p: &SurfacePoint, c: LoadComponent) -> [f64; 6] {
    let state = m
        .state_per_unit(p, c)
        .unwrap_or_else(|e| panic!("{p:?}: {e}"));
    let frame = m.surface_frame(p).unwrap();
    let e = state.mechanical_strain();
    free_surface_tensor(
        &frame,
        (e.normal_x, e.normal_y, e.shear_xy),
        m.material().poisson_ratio,
    )
}

/// The closed-form tensor at a face point under a combination of loads.
fn tensor_under(m: &Member, p: &SurfacePoint, loads: &LoadVector) -> [f64; 6] {
    let mut t = [0.0; 6];
    for (c, value) in loads.nonzero() {
        let u = unit_tensor(m, p, c);
        t.iter_mut().zip(u).for_each(|(a, b)| *a += value * b);
    }
    t
}

/// One unit load's tensor at every node: the closed form on the surface, zero inside.
fn node_values(model: &Model, c: LoadComponent) -> Vec<[f64; 6]> {
    let m = &model.mesh;
    m.points_m
        .iter()
        .zip(&m.on_surface)
        .map(|(&p, &surface)| {
            if surface {
                unit_tensor(&model.closed, &(model.face_point)(p), c)
            } else {
                [0.0; 6]
            }
        })
        .collect()
}

// ---------------------------------------------------------------------------------------------
// Files
// ---------------------------------------------------------------------------------------------

/// The units the `.vtu` files are written in, stated at import (the array's name also says
/// µm/m): coordinates in mm, strain in µm/m, tensor shear.
const VTU_UNITS: FieldUnits = FieldUnits {
    length: LengthUnit::Millimetre,
    tensor: TensorUnit::MicroStrain,
    shear: ShearConvention::Tensor,
};

/// The name of the tensor array in the `.vtu` files.
const VTU_ARRAY: &str = "strain [um/m]";

/// Writes an unstructured grid: points in mm, cells as (type, nodes), and a 6-component
/// point array of µm/m (tensor shear) when `values` is given.
fn write_vtu(
    path: &Path,
    points_m: &[[f64; 3]],
    cells: &[(CellType, Vec<u64>)],
    values: &[[f64; 6]],
) {
    let mut connectivity = Vec::new();
    let mut offsets = Vec::new();
    for (_, nodes) in cells {
        connectivity.extend_from_slice(nodes);
        offsets.push(connectivity.len() as u64);
    }
    let points: Vec<f64> = points_m.iter().flatten().map(|v| v * 1e3).collect();
    let data: Vec<f64> = values.iter().flatten().map(|v| v * 1e6).collect();
    let piece = UnstructuredGridPiece {
        points: IOBuffer::F64(points),
        cells: Cells {
            cell_verts: VertexNumbers::XML {
                connectivity,
                offsets,
            },
            types: cells.iter().map(|c| c.0).collect(),
        },
        data: Attributes {
            point: vec![Attribute::DataArray(
                DataArray::new(VTU_ARRAY, 6).with_data(data),
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
    .export(path)
    .unwrap();
}

fn hex_cells(mesh: &HexMesh) -> Vec<(CellType, Vec<u64>)> {
    mesh.cells
        .iter()
        .map(|c| (CellType::Hexahedron, c.iter().map(|&v| v as u64).collect()))
        .collect()
}

/// The node CSV: coordinates in mm, strains in µm/m with engineering shear (γ = 2ε).
fn node_csv(points_m: &[[f64; 3]], values: &[[f64; 6]]) -> String {
    let mut text = String::from(
        "x [mm],y [mm],z [mm],exx [um/m],eyy [um/m],ezz [um/m],gxy [um/m],gyz [um/m],gzx [um/m]\n",
    );
    for (p, v) in points_m.iter().zip(values) {
        let row: Vec<String> = p
            .iter()
            .map(|c| c * 1e3)
            .chain(v[..3].iter().map(|e| e * 1e6))
            .chain(v[3..].iter().map(|e| 2.0 * e * 1e6))
            .map(|x| x.to_string())
            .collect();
        text.push_str(&row.join(","));
        text.push('\n');
    }
    text
}

/// The element CSV: one row "hex,n1,…,n8" per cell, node numbers the node CSV's rows from 1.
fn element_csv(mesh: &HexMesh) -> String {
    let mut text = String::from("# kind, corner nodes (rows of the node file, from 1)\n");
    for c in &mesh.cells {
        let nodes: Vec<String> = c.iter().map(|v| (v + 1).to_string()).collect();
        text.push_str(&format!("hex,{}\n", nodes.join(",")));
    }
    text
}

/// How the results are read back.
#[derive(Debug, Clone, Copy, PartialEq)]
enum Route {
    /// One `.vtu` per load, units stated at import.
    Vtu,
    /// One node CSV per load, the cells from an element CSV.
    CsvElements,
    /// One node CSV per load, the cells from the first load's `.vtu`.
    CsvVtuMesh,
}

fn stem(c: LoadComponent) -> String {
    format!("{c:?}")
}

/// Writes every unit load of `model` as `.vtu` and CSV, and the element CSV, into `dir`.
fn write_results(dir: &Path, model: &Model) {
    let cells = hex_cells(&model.mesh);
    for &c in &model.components {
        let values = node_values(model, c);
        write_vtu(
            &dir.join(format!("{}.vtu", stem(c))),
            &model.mesh.points_m,
            &cells,
            &values,
        );
        let csv = node_csv(&model.mesh.points_m, &values);
        std::fs::write(dir.join(format!("{}.csv", stem(c))), csv).unwrap();
    }
    std::fs::write(dir.join("cells.csv"), element_csv(&model.mesh)).unwrap();
}

/// The imported part of `model` naming its result files for `route` (not read yet).
fn imported_surface(model: &Model, route: Route) -> ImportedSurface {
    let loads = model
        .components
        .iter()
        .map(|&c| ImportedLoad {
            component: c,
            name: format!("one unit of {}", c.name()),
            file: match route {
                Route::Vtu => format!("{}.vtu", stem(c)),
                _ => format!("{}.csv", stem(c)),
            },
            array: (route == Route::Vtu).then(|| VTU_ARRAY.to_owned()),
            units: (route == Route::Vtu).then_some(VTU_UNITS),
            checksum: None,
        })
        .collect();
    ImportedSurface {
        material: model.closed.material().clone(),
        reference_axis: ReferenceAxis::X,
        loads,
        mesh_file: match route {
            Route::Vtu => None,
            Route::CsvElements => Some("cells.csv".into()),
            Route::CsvVtuMesh => Some(format!("{}.vtu", stem(model.components[0]))),
        },
        field: Default::default(),
        read_notes: vec![],
    }
}

/// Reads the twin's results and checks the surface found: every mesh point counted, and as
/// many surface nodes as the structured block has on its boundary (by construction).
fn read_twin(model: &Model, dir: &Path, route: Route) -> Member {
    let mut surface = imported_surface(model, route);
    attach(&mut surface, Some(dir));
    let field = surface
        .surface()
        .unwrap_or_else(|| panic!("{} by {route:?}: {:?}", model.name, surface.field));
    assert_eq!(field.mesh_point_count(), model.mesh.points_m.len());
    let boundary = model.mesh.on_surface.iter().filter(|&&s| s).count();
    assert_eq!(
        field.node_count(),
        boundary,
        "{}: surface nodes",
        model.name
    );
    Member::ImportedField(surface)
}

// ---------------------------------------------------------------------------------------------
// Projects
// ---------------------------------------------------------------------------------------------

/// A bridge on the closed-form or imported part; the instrument is set to the same bridge
/// factor on both so that the displayed strains compare the circuits' outputs.
fn bridge(name: &str, arms: [PlanArm; 4], wanted: LoadComponent, factor: f64) -> BridgePlan {
    BridgePlan {
        name: name.into(),
        arrangement: String::new(),
        arms,
        wiring: LeadWiring::ThreeWire,
        // 0.14 mm² copper: about 0.13 Ω/m (from memory).
        lead: LeadWire {
            length_m: 5.0,
            ohm_per_m: 0.13,
            tcr_per_c: COPPER_TCR_PER_C,
        },
        excitation: Excitation::Voltage { volts: 2.5 },
        amplifier_input_ohm: Some(10e6),
        gauge_factor_setting: 2.0,
        bridge_factor_override: Some(BridgeFactorOverride {
            value: factor,
            reason: "the same setting on the closed-form part and on its imported twin".into(),
        }),
        signal: SignalChain {
            gain: 500.0,
            input_range_v: 10.0,
            adc_bits: 24,
            amplifier_noise_v_per_rt_hz: 8e-9,
            bandwidth_hz: 100.0,
            filter: LowPassFilter::FirstOrderRc,
            excitation_accuracy: 0.0005,
            gain_accuracy: 0.001,
        },
        wanted,
        instrument_temperature: InstrumentTemperature::Fixed,
        shunt: None,
        channel: 1,
        required_accuracy: None,
        recovery: Default::default(),
        calibration: None,
    }
}

fn arm(gauge: &str, grid: usize) -> PlanArm {
    PlanArm::Grid {
        gauge: gauge.into(),
        grid,
    }
}

fn completion() -> PlanArm {
    PlanArm::Completion(CompletionResistor {
        ohm: 350.0,
        tolerance: 0.0005,
        tcr_per_c: 5e-6,
    })
}

fn case(name: &str, loads: &[(LoadComponent, f64)]) -> LoadCase {
    LoadCase {
        name: name.into(),
        loads: loads.to_vec(),
        ramp_steps: 4,
        temperature_range_c: (20.0, 20.0),
        cycled: false,
        proof_test: false,
    }
}

/// The closed-form project: the part with its gauges (id, pattern, face point, angle), bridges
/// and load cases.
fn closed_project(
    model: &Model,
    gauges: &[(&str, GaugePattern, SurfacePoint, f64)],
    bridges: Vec<BridgePlan>,
    cases: Vec<LoadCase>,
) -> Project {
    let mut part = new_part(model.name, model.closed.clone(), None);
    part.load_cases = cases;
    part.bridges = bridges;
    let mut p = blank_project(part);
    for &(id, pattern, position, angle_deg) in gauges {
        let stock = stock_name_for(&mut p.gauge_stock, &default_gauge_spec(pattern));
        p.parts[0].gauges.push(PlanGauge {
            id: id.into(),
            stock,
            lot: None,
            position,
            angle_rad: angle_deg.to_radians(),
        });
    }
    p
}

/// The imported twin of a closed-form project: the part's member replaced, every gauge moved
/// to the twin's surface point at the same place in space. The angle carries over because
/// both faces' x axes point the same way there (asserted).
fn twin_project(model: &Model, closed: &Project, imported: Member) -> Project {
    let mut p = closed.clone();
    let Member::ImportedField(f) = &imported else {
        unreachable!()
    };
    let field = f.surface().unwrap();
    // The closed-form face lies at most the facets' sagitta off the mesh's surface.
    let tolerance_m = 2.0 * model.sagitta_m + 1e-9;
    for g in &mut p.parts[0].gauges {
        let frame = model.closed.surface_frame(&g.position).unwrap();
        let at = field
            .point_at(frame.position, tolerance_m)
            .unwrap_or_else(|| panic!("{}: gauge {} is off the mesh", model.name, g.id));
        let twin = field.frame(&at).unwrap();
        let (along, normal) = (
            dot(frame.axis_x, twin.axis_x),
            dot(frame.normal, twin.normal),
        );
        assert!(
            along > 1.0 - 1e-9 && normal > 0.999,
            "{}: gauge {}: the faces' axes differ: {frame:?} vs {twin:?}",
            model.name,
            g.id
        );
        g.position = at;
    }
    p.parts[0].member = imported;
    p
}

// ---------------------------------------------------------------------------------------------
// Bounds
// ---------------------------------------------------------------------------------------------

/// Bound on the error of interpolating each tensor component linearly over the mesh's
/// triangles near a grid, and the largest tensor size (Frobenius norm) there.
///
/// Linear interpolation on a triangle is exact for linear fields; for a field with Hessian H
/// its error at a point p is ½ Σ wᵢ (pᵢ − p)ᵀ H (pᵢ − p) (wᵢ the barycentric weights; Taylor's
/// theorem, exact for quadratics). In the cell's axes (u, v) that is at most
/// ½ (|Huu| Σ wᵢ duᵢ² + 2 |Huv| Σ wᵢ |duᵢ dvᵢ| + |Hvv| Σ wᵢ dvᵢ²); Σ wᵢ duᵢ² is the variance of
/// values spread over at most h₁, so ≤ h₁²/4 (Popoviciu's inequality), and the cross term is
/// ≤ h₁h₂/4 (Cauchy–Schwarz), so the error is ≤ (|Huu| h₁² + 2 |Huv| h₁h₂ + |Hvv| h₂²)/8,
/// in one dimension the h²/8·|f''| of common practice. The Hessian is the closed form's, by
/// central differences one cell wide, the largest over a 5 × 5 sampling of the grid's area
/// grown by one cell each way.
fn interpolation_errors(
    model: &Model,
    grid: &GridFootprint,
    loads: &LoadVector,
) -> ([f64; 6], f64) {
    let c = (model.cell_size)(&grid.center);
    let grow = c.h1_m.max(c.h2_m);
    let (ru, rv) = (grid.length_m / 2.0 + grow, grid.width_m / 2.0 + grow);
    let mut errors = [0.0_f64; 6];
    let mut size = 0.0_f64;
    for a in 0..5 {
        for b in 0..5 {
            let p = grid.point(ru * (a as f64 / 2.0 - 1.0), rv * (b as f64 / 2.0 - 1.0));
            let c = (model.cell_size)(&p);
            let (h1, h2) = (c.h1_m, c.h2_m);
            let step = h1.min(h2);
            let (sin, cos) = c.angle_rad.sin_cos();
            let f = |du: f64, dv: f64| {
                let (dx, ds) = (du * cos - dv * sin, du * sin + dv * cos);
                let q = SurfacePoint::new(p.face, p.x_m + dx * step, p.s_m + ds * step);
                tensor_under(&model.closed, &q, loads)
            };
            let centre = f(0.0, 0.0);
            let (up, um, vp, vm) = (f(1.0, 0.0), f(-1.0, 0.0), f(0.0, 1.0), f(0.0, -1.0));
            let (pp, pm, mp, mm) = (f(1.0, 1.0), f(1.0, -1.0), f(-1.0, 1.0), f(-1.0, -1.0));
            for k in 0..6 {
                let huu = (up[k] - 2.0 * centre[k] + um[k]) / (step * step);
                let hvv = (vp[k] - 2.0 * centre[k] + vm[k]) / (step * step);
                let huv = (pp[k] - pm[k] - mp[k] + mm[k]) / (4.0 * step * step);
                let e =
                    (huu.abs() * h1 * h1 + 2.0 * huv.abs() * h1 * h2 + hvv.abs() * h2 * h2) / 8.0;
                errors[k] = errors[k].max(e);
            }
            size = size.max(frobenius(&centre));
        }
    }
    (errors, size)
}

fn frobenius(t: &[f64; 6]) -> f64 {
    let diagonal: f64 = t[..3].iter().map(|v| v * v).sum();
    let shear: f64 = t[3..].iter().map(|v| v * v).sum();
    (diagonal + 2.0 * shear).sqrt()
}

/// Bound on |imported − closed form| for what a grid reads along `angle_rad` (from the face's
/// x), in three parts:
/// - interpolation: the reading along the unit vector d is Σ dᵢ dⱼ εᵢⱼ, so the components'
///   errors eᵢⱼ add up to at most Σ |dᵢ dⱼ| eᵢⱼ;
/// - on a curved face (radius r), the grid laid on the tangent plane instead of along the
///   arc: with ρ = the grid's half extent round the face / r, its points move along the arc
///   by up to r ρ³/3 (r·tan⁻¹(ρ) against r ρ) and its directions, read in the centre's axes
///   laid onto the surface, turn by up to ρ²/4 (from tan a′ = tan a · cos ρ); with the
///   reading's gradient at most 3‖ε‖/r (harmonics up to the third round the axis) and its
///   rate of turn at most 2‖ε‖, that is at most ‖ε‖ (ρ³ + ρ²/2);
/// - rounding through the files' decimal and unit conversions: 10⁻⁹ ‖ε‖ (common practice,
///   far above a few units in the last place).
fn reading_bound(model: &Model, grid: &GridFootprint, loads: &LoadVector, angle_rad: f64) -> f64 {
    let frame = model.closed.surface_frame(&grid.center).unwrap();
    let (sin, cos) = angle_rad.sin_cos();
    let d: [f64; 3] = std::array::from_fn(|k| cos * frame.axis_x[k] + sin * frame.axis_y[k]);
    let (e, size) = interpolation_errors(model, grid, loads);
    let weights = [
        d[0] * d[0],
        d[1] * d[1],
        d[2] * d[2],
        2.0 * (d[0] * d[1]).abs(),
        2.0 * (d[1] * d[2]).abs(),
        2.0 * (d[2] * d[0]).abs(),
    ];
    let interpolation: f64 = weights.iter().zip(e).map(|(w, e)| w * e).sum();
    let geometric = model.radius_m.map_or(0.0, |r| {
        let (sin, cos) = grid.angle_rad.sin_cos();
        let rho = 0.5 * (grid.length_m * sin.abs() + grid.width_m * cos.abs()) / r;
        size * (rho.powi(3) + rho * rho / 2.0)
    });
    interpolation + geometric + 1e-9 * size
}

// ---------------------------------------------------------------------------------------------
// Comparisons
// ---------------------------------------------------------------------------------------------

/// Every grid of every gauge under every load case: the grid-averaged strain along the grid
/// on the imported twin against the closed form, within [`reading_bound`]. Returns the
/// disagreements, one line each.
fn compare_grids(model: &Model, closed: &Project, twin: &Project, label: &str) -> Vec<String> {
    let (cp, tp) = (&closed.parts[0], &twin.parts[0]);
    let (cg, tg) = (closed.placed_gauges(cp), twin.placed_gauges(tp));
    let q = QuadratureOrder::default();
    let mut out = Vec::new();
    for case in &cp.load_cases {
        let loads = case.load_vector();
        for (c, t) in cg.iter().zip(&tg) {
            for k in 0..c.element_count() {
                let (fc, ft) = (c.footprint(k), t.footprint(k));
                let want = grid_average_strain(&cp.member, &fc, &loads, q).unwrap();
                let got = grid_average_strain(&tp.member, &ft, &loads, q).unwrap();
                let bound = reading_bound(model, &fc, &loads, fc.angle_rad);
                let line = format!(
                    "{} ({label}), {}, gauge {} grid {}: imported {:.4} µm/m, closed form \
                     {:.4} µm/m, difference {:.2e} µm/m, bound {:.2e} µm/m",
                    model.name,
                    case.name,
                    c.id,
                    k + 1,
                    got * 1e6,
                    want * 1e6,
                    (got - want) * 1e6,
                    bound * 1e6
                );
                println!("{line}");
                if (got - want).abs() > bound {
                    out.push(line);
                }
            }
        }
    }
    out
}

/// The grids' bound on a bridge's displayed strain: the instrument shows
/// 4 ΔV/V / (k_set · bridge factor) and ΔV/V ≈ k/4 Σ ± (ε_along + K_t ε_across) over the grid
/// arms (the Wheatstone bridge's linearised output, common practice), so the grids'
/// bounds add up scaled by k/(k_set · bridge factor); 1 % more covers the bridge's own
/// non-linearity (about k ε/2, under 0.2 % at these strains, common practice), which acts
/// on both parts alike.
fn bridge_bound(model: &Model, closed: &Project, bridge: &BridgePlan, loads: &LoadVector) -> f64 {
    let gauges: Vec<PlacedGauge> = closed.placed_gauges(&closed.parts[0]);
    let mut sum = 0.0;
    let mut scale: f64 = 0.0;
    for a in &bridge.arms {
        let PlanArm::Grid { gauge, grid } = a else {
            continue;
        };
        let g = gauges.iter().find(|g| &g.id == gauge).unwrap();
        let f = g.footprint(grid - 1);
        let across = reading_bound(model, &f, loads, f.angle_rad + FRAC_PI_2);
        let kt = g.spec.transverse_sensitivity.abs();
        sum += reading_bound(model, &f, loads, f.angle_rad) + kt * across;
        scale = scale.max(g.spec.gauge_factor / bridge.gauge_factor_setting);
    }
    let factor = bridge.bridge_factor_override.as_ref().unwrap().value;
    1.01 * scale * sum / factor
}

fn quick() -> EvalOptions {
    EvalOptions {
        uncertainty: UncertaintyDepth::Off,
        ..EvalOptions::default()
    }
}

/// Evaluates both projects and compares each bridge's displayed strain per load case within
/// [`bridge_bound`]; also checks that neither evaluation has an error and that the twin's
/// surface is found free under every gauge (its tensors carry σ_n = 0). Returns the
/// disagreements.
fn compare_bridges(model: &Model, closed: &Project, twin: &Project, label: &str) -> Vec<String> {
    let (ec, et) = (evaluate(closed, &quick()), evaluate(twin, &quick()));
    for (ev, which) in [(&ec, "closed form"), (&et, "imported")] {
        let errors: Vec<_> = ev
            .findings
            .iter()
            .filter(|f| f.severity == Severity::Error || f.message.contains("is not free"))
            .collect();
        assert!(errors.is_empty(), "{} {which}: {errors:#?}", model.name);
    }
    let mut out = Vec::new();
    for plan in &closed.parts[0].bridges {
        for case in &closed.parts[0].load_cases {
            let want = displayed(&ec, &plan.name, &case.name);
            let got = displayed(&et, &plan.name, &case.name);
            let bound = bridge_bound(model, closed, plan, &case.load_vector());
            let line = format!(
                "{} ({label}), bridge \"{}\", {}: imported {:.4} µm/m, closed form {:.4} µm/m, \
                 difference {:.2e} µm/m, bound {:.2e} µm/m",
                model.name,
                plan.name,
                case.name,
                got * 1e6,
                want * 1e6,
                (got - want) * 1e6,
                bound * 1e6
            );
            println!("{line}");
            if (got - want).abs() > bound {
                out.push(line);
            }
        }
    }
    out
}

fn displayed(ev: &Evaluation, bridge: &str, case: &str) -> f64 {
    let b = ev.parts[0]
        .bridges
        .iter()
        .find(|b| b.name == bridge)
        .unwrap_or_else(|| panic!("bridge {bridge} not evaluated: {:#?}", ev.findings));
    b.cases
        .iter()
        .find(|c| c.case == case)
        .unwrap()
        .reading
        .displayed_strain
}

/// Writes the model's results, reads them back by each route, and compares grids and bridges.
fn prove(model: &Model, closed: &Project, routes: &[Route]) {
    let dir = fresh_folder(&model.name.replace(' ', "-"));
    write_results(&dir, model);
    let mut disagreements = Vec::new();
    for &route in routes {
        let twin = twin_project(model, closed, read_twin(model, &dir, route));
        let label = format!("{route:?}");
        disagreements.extend(compare_grids(model, closed, &twin, &label));
        disagreements.extend(compare_bridges(model, closed, &twin, &label));
    }
    assert!(
        disagreements.is_empty(),
        "the imported twin disagrees with the closed form:\n{}",
        disagreements.join("\n")
    );
    let _ = std::fs::remove_dir_all(&dir);
}

// ---------------------------------------------------------------------------------------------
// The cases
// ---------------------------------------------------------------------------------------------

#[test]
fn cantilever_gauges_read_on_the_imported_twin_what_the_beam_model_gives() {
    // Top and bottom: an end-loaded cantilever's bending strain is linear in x and uniform
    // across the face, the axial strain uniform, so linear triangles carry them exactly and
    // the bound is rounding alone. The front face at the neutral axis carries the parabolic
    // transverse shear and the bilinear bending strain k (L − x) z: there the bound of
    // interpolation_errors applies.
    let model = cantilever();
    use GaugePattern::*;
    use LoadComponent::*;
    let gauges = [
        (
            "T1",
            SingleGrid,
            SurfacePoint::new(Face::Top, 0.1, 0.0),
            0.0,
        ),
        (
            "B1",
            SingleGrid,
            SurfacePoint::new(Face::Bottom, 0.1, 0.0),
            0.0,
        ),
        (
            "R1",
            RectangularRosette,
            SurfacePoint::new(Face::Top, 0.2, 0.003),
            0.0,
        ),
        (
            "S1",
            ShearPair,
            SurfacePoint::new(Face::Front, 0.15, 0.0),
            0.0,
        ),
    ];
    let bridges = vec![
        bridge(
            "Bending, top and bottom in adjacent arms",
            [arm("T1", 1), arm("B1", 1), completion(), completion()],
            VerticalForce,
            2.0,
        ),
        bridge(
            "Rosette grid 2, quarter bridge",
            [arm("R1", 2), completion(), completion(), completion()],
            AxialForce,
            1.0,
        ),
        bridge(
            "Shear pair on the side",
            [arm("S1", 1), arm("S1", 2), completion(), completion()],
            VerticalForce,
            2.0,
        ),
    ];
    let cases = vec![
        case("Tip force", &[(VerticalForce, 2000.0)]),
        case("Pull", &[(AxialForce, 50_000.0)]),
        case("Both", &[(VerticalForce, -1500.0), (AxialForce, 30_000.0)]),
    ];
    let closed = closed_project(&model, &gauges, bridges, cases);
    prove(
        &model,
        &closed,
        &[Route::Vtu, Route::CsvElements, Route::CsvVtuMesh],
    );
}

#[test]
fn hollow_shaft_gauges_read_on_the_imported_twin_what_the_shaft_model_gives() {
    // The facets are chords 5° apart: the tensor, a sum of harmonics of the angle up to the
    // third, is interpolated linearly between nodes (interpolation_errors), and the grids lie
    // on tangent planes instead of the arc (the curved-face term of reading_bound).
    let model = hollow_shaft();
    use GaugePattern::*;
    use LoadComponent::*;
    let r = 0.025;
    let round = |deg: f64| SurfacePoint::new(Face::Round, 0.2, r * deg.to_radians());
    let gauges = [
        ("S1", ShearPair, round(90.0), 0.0),
        ("S2", ShearPair, round(-90.0), 0.0),
        ("B1", SingleGrid, round(0.0), 0.0),
        ("B2", SingleGrid, round(180.0), 0.0),
        ("R1", RectangularRosette, round(40.0), 15.0),
    ];
    let bridges = vec![
        bridge(
            "Torque, one shear pair",
            [arm("S1", 1), arm("S1", 2), completion(), completion()],
            Torque,
            2.0,
        ),
        bridge(
            "Bending, top and bottom",
            [arm("B1", 1), arm("B2", 1), completion(), completion()],
            BendingMomentY,
            2.0,
        ),
    ];
    let cases = vec![
        case("Torque", &[(Torque, 800.0)]),
        case("Bending", &[(BendingMomentY, 300.0)]),
        case("Both", &[(Torque, -500.0), (BendingMomentY, 200.0)]),
    ];
    let closed = closed_project(&model, &gauges, bridges, cases);
    prove(&model, &closed, &[Route::Vtu, Route::CsvVtuMesh]);
}

#[test]
fn plate_gauges_near_the_hole_read_on_the_imported_twin_what_the_kirsch_field_gives() {
    // Near the hole the Kirsch field's curvature sets the bound (interpolation_errors); the
    // single grid lies across the 90° line 5 mm from the hole's edge (seven cells of the
    // graded mesh in between), the rosette 10 mm out at 45°.
    let model = plate_with_hole();
    use GaugePattern::*;
    use LoadComponent::*;
    let at = |r: f64, deg: f64| {
        let t = f64::to_radians(deg);
        SurfacePoint::new(Face::Plate, r * t.cos(), r * t.sin())
    };
    let gauges = [
        ("P1", SingleGrid, at(0.015, 90.0), 0.0),
        ("P2", RectangularRosette, at(0.02, 45.0), 0.0),
        ("P3", SingleGrid, at(0.04, 180.0), 90.0),
    ];
    let bridges = vec![
        bridge(
            "Beside the hole, quarter bridge",
            [arm("P1", 1), completion(), completion(), completion()],
            RemoteStressX,
            1.0,
        ),
        bridge(
            "Rosette grid 2, quarter bridge",
            [arm("P2", 2), completion(), completion(), completion()],
            RemoteStressX,
            1.0,
        ),
    ];
    let cases = vec![
        case("Remote stress x", &[(RemoteStressX, 80e6)]),
        case("Biaxial", &[(RemoteStressX, 60e6), (RemoteStressY, -30e6)]),
    ];
    let closed = closed_project(&model, &gauges, bridges, cases);
    prove(&model, &closed, &[Route::Vtu, Route::CsvElements]);
}

// ---------------------------------------------------------------------------------------------
// Broken files
// ---------------------------------------------------------------------------------------------

/// One result per (component, file), the units stated for `.vtu` files.
fn one_surface(results: &[(LoadComponent, &str)], mesh_file: Option<&str>) -> ImportedSurface {
    ImportedSurface {
        material: steel(),
        reference_axis: ReferenceAxis::X,
        loads: results
            .iter()
            .map(|&(component, file)| ImportedLoad {
                component,
                name: String::new(),
                file: file.into(),
                array: None,
                units: file.ends_with(".vtu").then_some(VTU_UNITS),
                checksum: None,
            })
            .collect(),
        mesh_file: mesh_file.map(str::to_owned),
        field: Default::default(),
        read_notes: vec![],
    }
}

/// Reads a broken surface: it must be refused with a message containing every one of
/// `words`; what is missing is added to `misses`.
fn refused(dir: &Path, s: &ImportedSurface, words: &[&str], misses: &mut Vec<String>) {
    let e = match read_surface(s, Some(dir)) {
        Ok(_) => panic!("read although broken: {:?}", s.loads),
        Err(e) => e,
    };
    println!("{e}");
    for w in words.iter().filter(|w| !e.contains(*w)) {
        misses.push(format!("expected \"{w}\" in: {e}"));
    }
}

/// A small bar of 4 × 2 × 2 hexahedra, 45 nodes, with a made-up strain at each node.
fn small_bar(cells_along: usize) -> (HexMesh, Vec<[f64; 6]>) {
    let mesh = hex_block([cells_along, 2, 2], false, |i, j, k| {
        [0.01 * i as f64, 0.01 * j as f64, 0.01 * k as f64]
    });
    let values = mesh
        .points_m
        .iter()
        .map(|p| [100e-6 * p[0], -30e-6 * p[0], -30e-6 * p[0], 0.0, 0.0, 0.0])
        .collect();
    (mesh, values)
}

/// A fresh folder holding the small bar's result as `good.vtu`, as `good.csv` and its cells as
/// `cells.csv` (a comment line, then one row per cell), each checked to read.
fn folder_of_good_files(name: &str) -> (PathBuf, HexMesh, Vec<[f64; 6]>) {
    let dir = fresh_folder(name);
    let (mesh, values) = small_bar(4);
    write_vtu(
        &dir.join("good.vtu"),
        &mesh.points_m,
        &hex_cells(&mesh),
        &values,
    );
    std::fs::write(dir.join("good.csv"), node_csv(&mesh.points_m, &values)).unwrap();
    std::fs::write(dir.join("cells.csv"), element_csv(&mesh)).unwrap();
    let c = LoadComponent::VerticalForce;
    read_surface(&one_surface(&[(c, "good.vtu")], None), Some(&dir)).unwrap();
    read_surface(
        &one_surface(&[(c, "good.csv")], Some("cells.csv")),
        Some(&dir),
    )
    .unwrap();
    (dir, mesh, values)
}

#[test]
fn broken_meshes_are_refused_with_the_file_and_the_place() {
    use LoadComponent::*;
    let (dir, mesh, values) = folder_of_good_files("broken-mesh");
    let n = mesh.points_m.len();
    let mut misses = Vec::new();

    // A .vtu with one point fewer than its cells use: the first cell using the lost node is
    // named, with the node and the count.
    let first = mesh
        .cells
        .iter()
        .position(|c| c.contains(&(n - 1)))
        .unwrap()
        + 1;
    write_vtu(
        &dir.join("short.vtu"),
        &mesh.points_m[..n - 1],
        &hex_cells(&mesh),
        &values[..n - 1],
    );
    refused(
        &dir,
        &one_surface(&[(VerticalForce, "short.vtu")], None),
        &[
            "short.vtu",
            // VTK numbers points from 0: the missing last point is number n - 1.
            &format!(
                "cell {first} names point {} but the file has {} points",
                n - 1,
                n - 1
            ),
        ],
        &mut misses,
    );
    // The same through an element CSV: the line (the third cell's, after the comment line)
    // and the node.
    let cells = element_csv(&mesh).replacen("hex,3,", &format!("hex,{},", n + 1), 1);
    std::fs::write(dir.join("past.csv"), cells).unwrap();
    refused(
        &dir,
        &one_surface(&[(VerticalForce, "good.csv")], Some("past.csv")),
        &[
            "past.csv",
            &format!("line 4: node \"{}\" is not a node number", n + 1),
        ],
        &mut misses,
    );

    // A mesh with no surface: only line cells (the bar's edges along x).
    let lines_only: Vec<(CellType, Vec<u64>)> = (0..n - 1)
        .filter(|i| (i + 1) % 5 != 0)
        .map(|i| (CellType::Line, vec![i as u64, i as u64 + 1]))
        .collect();
    write_vtu(&dir.join("lines.vtu"), &mesh.points_m, &lines_only, &values);
    refused(
        &dir,
        &one_surface(&[(VerticalForce, "lines.vtu")], None),
        &["lines.vtu", "has no cells"],
        &mut misses,
    );
    // … or no cells at all.
    std::fs::write(dir.join("no_cells.csv"), "# kind, nodes\n").unwrap();
    refused(
        &dir,
        &one_surface(&[(VerticalForce, "good.csv")], Some("no_cells.csv")),
        &["no_cells.csv", "has no cell rows"],
        &mut misses,
    );

    // Two unit loads on different meshes: the second file, its point count and the first's.
    let (other, other_values) = small_bar(6);
    write_vtu(
        &dir.join("other.vtu"),
        &other.points_m,
        &hex_cells(&other),
        &other_values,
    );
    let m = other.points_m.len();
    refused(
        &dir,
        &one_surface(
            &[(VerticalForce, "good.vtu"), (AxialForce, "other.vtu")],
            None,
        ),
        &[
            "axial force result (other.vtu)",
            &format!("has {m} points where the first result has {n}"),
            "same mesh",
        ],
        &mut misses,
    );
    assert!(
        misses.is_empty(),
        "messages that do not name the place:\n{}",
        misses.join("\n")
    );
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn broken_values_are_refused_with_the_file_and_the_place() {
    use LoadComponent::*;
    let (dir, mesh, values) = folder_of_good_files("broken-values");
    let mut misses = Vec::new();
    // A NaN in the node CSV at node 7 (line 8), in the column of eyy (the fifth).
    let text = node_csv(&mesh.points_m, &values);
    let mut lines: Vec<String> = text.lines().map(str::to_owned).collect();
    let mut fields: Vec<String> = lines[7].split(',').map(str::to_owned).collect();
    fields[4] = "NaN".into();
    lines[7] = fields.join(",");
    std::fs::write(dir.join("nan.csv"), lines.join("\n")).unwrap();
    refused(
        &dir,
        &one_surface(&[(VerticalForce, "nan.csv")], Some("cells.csv")),
        &["nan.csv", "line 8, column 5", "eyy"],
        &mut misses,
    );
    // The same with a comment line above the header: the NaN is on line 9 of the file.
    std::fs::write(
        dir.join("nan_noted.csv"),
        format!("# exported for a test\n{}", lines.join("\n")),
    )
    .unwrap();
    refused(
        &dir,
        &one_surface(&[(VerticalForce, "nan_noted.csv")], Some("cells.csv")),
        &["nan_noted.csv", "line 9, column 5"],
        &mut misses,
    );

    // An array name that is not in the file: the file's own tensor arrays are listed.
    let mut named = one_surface(&[(VerticalForce, "good.vtu")], None);
    named.loads[0].array = Some("stress [MPa]".into());
    refused(
        &dir,
        &named,
        &[
            "good.vtu",
            "no tensor array \"stress [MPa]\"",
            &format!("\"{VTU_ARRAY}\""),
        ],
        &mut misses,
    );

    assert!(
        misses.is_empty(),
        "messages that do not name the place:\n{}",
        misses.join("\n")
    );
    let _ = std::fs::remove_dir_all(&dir);
}

/// A fault in the first row of an element CSV, which follows a comment line, is put on that
/// row's own line (the reader starts the record at the comment).
#[test]
fn element_csv_first_row_after_a_comment_is_on_its_own_line() {
    use LoadComponent::*;
    let (dir, mesh, _) = folder_of_good_files("broken-element-csv");
    let n = mesh.points_m.len();
    let mut misses = Vec::new();
    // cells.csv: line 1 is a comment, line 2 the first cell.
    let cells = element_csv(&mesh).replacen("hex,1,", &format!("hex,{},", n + 1), 1);
    std::fs::write(dir.join("past.csv"), cells).unwrap();
    refused(
        &dir,
        &one_surface(&[(VerticalForce, "good.csv")], Some("past.csv")),
        &[&format!("past.csv: line 2: node \"{}\"", n + 1)],
        &mut misses,
    );
    assert!(misses.is_empty(), "{}", misses.join("\n"));
    let _ = std::fs::remove_dir_all(&dir);
}
