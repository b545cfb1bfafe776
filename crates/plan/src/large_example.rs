//! A large invented imported part, for measuring speed on a surface of about 200 000 nodes: a
//! plate 440 × 220 mm of 1 mm hexahedra, 2 mm thick (195 000 nodes, all on its surface), with
//! a bending field along its length per unit vertical force and a shear across it per unit
//! torque, and a plan of 12 gauges in 4 bridges on its top face. The fields are made up to
//! vary smoothly; they are not the solution of any load.

use std::path::Path;
use std::sync::Arc;

use gw_bridge::{GaugePattern, LeadWiring};
use gw_mechanics::imported::{
    Cell, FieldState, FieldUnits, ImportedLoad, ImportedSurface, LengthUnit, RawMesh,
    ReferenceAxis, ShearConvention, SurfaceField, TensorQuantity, TensorUnit, UnitField,
};
use gw_mechanics::{LoadComponent, Member};
use vtkio::model::{
    Attribute, Attributes, ByteOrder, CellType, Cells, DataArray, DataSet, IOBuffer,
    UnstructuredGridPiece, Version, VertexNumbers, Vtk,
};

use crate::blank::new_part;
use crate::demo::{bridge, case, completion, grid, material, shunt, stock};
use crate::document::{PlanGauge, Project, default_gauge_spec, stock_base_name};

/// Elements along the plate's length and width.
const ELEMENTS: (u32, u32) = (440, 220);
/// Length, width and thickness, metres.
const SIZE_M: [f64; 3] = [0.44, 0.22, 0.002];

/// The plate's mesh: one layer of 1 mm hexahedra.
pub fn plate_mesh() -> RawMesh {
    let (nx, ny) = ELEMENTS;
    let id = |i: u32, j: u32, k: u32| (k * (ny + 1) + j) * (nx + 1) + i;
    let mut points_m = Vec::new();
    for k in 0..=1 {
        for j in 0..=ny {
            for i in 0..=nx {
                points_m.push([
                    SIZE_M[0] * f64::from(i) / f64::from(nx),
                    SIZE_M[1] * f64::from(j) / f64::from(ny),
                    SIZE_M[2] * f64::from(k),
                ]);
            }
        }
    }
    let mut cells = Vec::new();
    for j in 0..ny {
        for i in 0..nx {
            cells.push(Cell::grid_hexahedron(id, i, j, 0));
        }
    }
    RawMesh { points_m, cells }
}

/// The unit fields (tensor strain, m/m): bending falling along x per newton, shear growing
/// across y per newton-metre.
pub fn plate_fields(mesh: &RawMesh) -> Vec<UnitField> {
    let along = |p: &[f64; 3]| 1.0 - p[0] / SIZE_M[0];
    let bend = mesh
        .points_m
        .iter()
        .map(|p| [1e-6 * along(p), -0.3e-6 * along(p), 0.0, 0.0, 0.0, 0.0])
        .collect();
    let shear = mesh
        .points_m
        .iter()
        .map(|p| [0.0, 0.0, 0.0, 0.5e-6 * (p[1] / SIZE_M[1]), 0.0, 0.0])
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

/// The result files' names and loads.
const FILES: [(&str, LoadComponent); 2] = [
    ("plate_bend.vtu", LoadComponent::VerticalForce),
    ("plate_shear.vtu", LoadComponent::Torque),
];

/// Writes the plate's two unit-load results as `.vtu` into `folder` and returns the part's
/// description of them (not read yet).
pub fn write_plate_results(folder: &Path) -> Result<ImportedSurface, String> {
    let mesh = plate_mesh();
    let fields = plate_fields(&mesh);
    for ((file, _), field) in FILES.iter().zip(&fields) {
        write_vtu(&folder.join(file), &mesh, &field.values)?;
    }
    Ok(plate_surface(FieldState::NotLoaded))
}

/// The plate as a part's description, with its field in the given state.
fn plate_surface(field: FieldState) -> ImportedSurface {
    ImportedSurface {
        material: material("carbon_steel"),
        reference_axis: ReferenceAxis::X,
        loads: FILES
            .iter()
            .map(|&(file, component)| ImportedLoad {
                component,
                name: component.name().into(),
                file: file.into(),
                array: None,
                units: Some(FieldUnits {
                    length: LengthUnit::Metre,
                    tensor: TensorUnit::StrainRatio,
                    shear: ShearConvention::Tensor,
                }),
                checksum: None,
            })
            .collect(),
        mesh_file: None,
        field,
        read_notes: Vec::new(),
    }
}

fn write_vtu(path: &Path, mesh: &RawMesh, values: &[[f64; 6]]) -> Result<(), String> {
    let mut connectivity = Vec::new();
    let mut offsets = Vec::new();
    for c in &mesh.cells {
        connectivity.extend(c.nodes.iter().map(|&v| u64::from(v)));
        offsets.push(connectivity.len() as u64);
    }
    let piece = UnstructuredGridPiece {
        points: IOBuffer::F64(mesh.points_m.iter().flatten().copied().collect()),
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
    .export(path)
    .map_err(|e| format!("{}: {e}", path.display()))
}

/// The plan on the plate, its surface built in memory (no files): 12 gauges on the top face
/// in 4 bridges (a full bending bridge, a full shear bridge, two half bending bridges), a
/// rated, a combined and a proof case.
pub fn plate_project() -> Result<Project, String> {
    let mesh = plate_mesh();
    let surface = SurfaceField::new(&mesh, plate_fields(&mesh), ReferenceAxis::X)
        .map_err(|e| e.to_string())?;
    plate_project_on(plate_surface(FieldState::Loaded(Arc::new(surface))))
}

/// The plan of [`plate_project`] on a plate whose results are read (or not yet).
pub fn plate_project_on(surface: ImportedSurface) -> Result<Project, String> {
    use LoadComponent::*;
    let field = surface
        .surface()
        .ok_or("the plate's results are not read")?
        .clone();
    let at = |id: &str, pattern: GaugePattern, x_mm: f64, y_mm: f64, angle_deg: f64| {
        let position = field
            .point_at([x_mm * 1e-3, y_mm * 1e-3, SIZE_M[2]], 1e-6)
            .ok_or_else(|| format!("no top-face point at {x_mm} mm, {y_mm} mm"))?;
        Ok::<_, String>(PlanGauge {
            id: id.into(),
            stock: stock_base_name(&default_gauge_spec(pattern)),
            lot: None,
            position,
            angle_rad: angle_deg.to_radians(),
        })
    };
    let single = GaugePattern::SingleGrid;
    let layout = [
        ("B1", 60.0, 60.0, 0.0),
        ("B2", 60.0, 80.0, 90.0),
        ("B3", 60.0, 140.0, 0.0),
        ("B4", 60.0, 160.0, 90.0),
        ("S1", 300.0, 150.0, 45.0),
        ("S2", 300.0, 170.0, -45.0),
        ("S3", 320.0, 150.0, -45.0),
        ("S4", 320.0, 170.0, 45.0),
        ("H1", 150.0, 110.0, 0.0),
        ("H2", 150.0, 130.0, 90.0),
        ("H3", 250.0, 50.0, 0.0),
        ("H4", 250.0, 70.0, 90.0),
    ];
    let gauges = layout
        .iter()
        .map(|&(id, x, y, a)| at(id, single, x, y, a))
        .collect::<Result<Vec<_>, _>>()?;
    let mut part = new_part(
        "Test plate",
        Member::ImportedField(surface),
        Some("carbon_steel".into()),
    );
    part.gauges = gauges;
    let full = |name: &str, ids: [&str; 4], wanted, channel| {
        bridge(
            name,
            "Full bridge",
            ids.map(|g| grid(g, 1)),
            wanted,
            LeadWiring::RemoteSense,
            5.0,
            1000.0,
            channel,
            shunt(0, 500.0),
        )
    };
    let half = |name: &str, ids: [&str; 2], channel| {
        bridge(
            name,
            "Half bridge",
            [grid(ids[0], 1), grid(ids[1], 1), completion(), completion()],
            VerticalForce,
            LeadWiring::ThreeWire,
            5.0,
            1000.0,
            channel,
            shunt(0, 500.0),
        )
    };
    part.bridges = vec![
        full("Bending", ["B1", "B2", "B3", "B4"], VerticalForce, 1),
        full("Shear", ["S1", "S2", "S3", "S4"], Torque, 2),
        half("Middle", ["H1", "H2"], 3),
        half("Side", ["H3", "H4"], 4),
    ];
    part.load_cases = vec![
        case(
            "Rated",
            &[(VerticalForce, 100.0)],
            (15.0, 35.0),
            true,
            false,
        ),
        case(
            "Combined",
            &[(VerticalForce, 80.0), (Torque, 200.0)],
            (15.0, 35.0),
            false,
            false,
        ),
        case(
            "Proof",
            &[(VerticalForce, 150.0)],
            (20.0, 25.0),
            false,
            true,
        ),
    ];
    let mut p = crate::demo::demo_project();
    p.name = "Test plate (speed measurement)".into();
    p.gauge_stock = stock();
    p.parts = vec![part];
    p.records = Default::default();
    Ok(p)
}
