//! XML `.vtu` and legacy `.vtk` unstructured grids, through the vtkio crate.

use std::path::Path;

use gw_mechanics::imported::{Cell, CellKind, FieldUnits, RawMesh, TensorUnit};
use vtkio::Vtk;
use vtkio::model::{Attribute, CellType, DataSet, IOBuffer, UnstructuredGridPiece, VertexNumbers};

use super::{ImportError, ReadField, ReadRequest, bracketed_unit, prefer_file};

/// The corner-node kind of a VTK cell type (quadratic cells by their corners), or `None` for
/// cells that are not read (vertices, lines, polygons, higher-order cells).
fn kind_of(t: CellType) -> Option<(CellKind, bool)> {
    Some(match t {
        CellType::Triangle => (CellKind::Triangle, false),
        CellType::Quad => (CellKind::Quad, false),
        CellType::Tetra => (CellKind::Tetra, false),
        CellType::Hexahedron => (CellKind::Hexa, false),
        CellType::Wedge => (CellKind::Wedge, false),
        CellType::Pyramid => (CellKind::Pyramid, false),
        CellType::QuadraticTriangle => (CellKind::Triangle, true),
        CellType::QuadraticQuad => (CellKind::Quad, true),
        CellType::QuadraticTetra => (CellKind::Tetra, true),
        CellType::QuadraticHexahedron => (CellKind::Hexa, true),
        CellType::QuadraticWedge => (CellKind::Wedge, true),
        _ => return None,
    })
}

/// The unstructured grid of a VTK file.
fn read_grid(path: &Path) -> Result<UnstructuredGridPiece, ImportError> {
    let vtk = Vtk::import(path).map_err(|e| {
        let text = e.to_string();
        if text.contains("raw") {
            ImportError::new(
                path,
                "stores its data as raw appended binary, which is not read; save it with ASCII, \
                 base64 or compressed binary encoding",
            )
        } else {
            ImportError::new(
                path,
                format!("is not a readable VTK file ({text}); export it again as .vtu or .vtk"),
            )
        }
    })?;
    let DataSet::UnstructuredGrid { mut pieces, .. } = vtk.data else {
        return Err(ImportError::new(
            path,
            "holds no unstructured grid (a finite-element mesh); export the mesh with its result",
        ));
    };
    if pieces.len() != 1 {
        return Err(ImportError::new(
            path,
            format!(
                "holds {} pieces; export the whole mesh as one piece",
                pieces.len()
            ),
        ));
    }
    pieces
        .remove(0)
        .into_loaded_piece_data(None)
        .map_err(|e| ImportError::new(path, format!("its grid cannot be read ({e})")))
}

/// Every cell as (type, nodes), whichever way the file lists them.
fn cell_lists(
    path: &Path,
    piece: &UnstructuredGridPiece,
) -> Result<Vec<(CellType, Vec<u64>)>, ImportError> {
    let types = &piece.cells.types;
    let bad = |detail: String| ImportError::new(path, detail);
    let mut out = Vec::with_capacity(types.len());
    match &piece.cells.cell_verts {
        VertexNumbers::Legacy { vertices, .. } => {
            let mut i = 0usize;
            for (c, &t) in types.iter().enumerate() {
                let n = *vertices
                    .get(i)
                    .ok_or_else(|| bad(format!("the cell list ends before cell {}", c + 1)))?
                    as usize;
                let nodes = vertices
                    .get(i + 1..i + 1 + n)
                    .ok_or_else(|| bad(format!("the cell list ends inside cell {}", c + 1)))?;
                out.push((t, nodes.iter().map(|&v| u64::from(v)).collect()));
                i += 1 + n;
            }
        }
        VertexNumbers::XML {
            connectivity,
            offsets,
        } => {
            let offsets: &[u64] = if offsets.len() == types.len() + 1 && offsets.first() == Some(&0)
            {
                &offsets[1..]
            } else {
                offsets
            };
            if offsets.len() != types.len() {
                return Err(bad(format!(
                    "lists {} cell types but {} cell offsets; the cells are damaged",
                    types.len(),
                    offsets.len()
                )));
            }
            let mut start = 0usize;
            for (c, (&t, &end)) in types.iter().zip(offsets).enumerate() {
                let end = end as usize;
                let nodes = connectivity.get(start..end).ok_or_else(|| {
                    bad(format!(
                        "the offsets of cell {} run outside the connectivity",
                        c + 1
                    ))
                })?;
                out.push((t, nodes.to_vec()));
                start = end;
            }
        }
    }
    Ok(out)
}

/// The mesh of a grid: points scaled to metres, cells by corner nodes, with notes on what was
/// left out.
fn mesh_of(
    path: &Path,
    piece: &UnstructuredGridPiece,
    metres_per_unit: f64,
) -> Result<(RawMesh, Vec<String>), ImportError> {
    let coords: Vec<f64> = piece
        .points
        .cast_into::<f64>()
        .ok_or_else(|| ImportError::new(path, "its point coordinates are not numbers"))?;
    let points_m: Vec<[f64; 3]> = coords
        .chunks_exact(3)
        .map(|c| {
            [
                c[0] * metres_per_unit,
                c[1] * metres_per_unit,
                c[2] * metres_per_unit,
            ]
        })
        .collect();
    let mut notes = Vec::new();
    let (mut skipped, mut quadratic) = (0usize, 0usize);
    let mut cells = Vec::new();
    for (c, (t, nodes)) in cell_lists(path, piece)?.into_iter().enumerate() {
        let Some((kind, is_quadratic)) = kind_of(t) else {
            skipped += 1;
            continue;
        };
        quadratic += usize::from(is_quadratic);
        let corners = kind.corners();
        if nodes.len() < corners {
            return Err(ImportError::new(
                path,
                format!(
                    "cell {} ({t:?}) has {} nodes, fewer than its {corners} corners",
                    c + 1,
                    nodes.len()
                ),
            ));
        }
        if let Some(&v) = nodes[..corners]
            .iter()
            .find(|&&v| usize::try_from(v).map_or(true, |i| i >= points_m.len()))
        {
            return Err(ImportError::new(
                path,
                format!(
                    "cell {} names point {v} but the file has {} points (numbered from 0); the \
                     connectivity does not fit the points: export them together",
                    c + 1,
                    points_m.len()
                ),
            ));
        }
        let nodes = nodes[..corners].iter().map(|&v| v as u32).collect();
        cells.push(Cell { kind, nodes });
    }
    if skipped > 0 {
        notes.push(format!(
            "{skipped} cells that are not surfaces or solids (vertices, lines, polygons) were left out"
        ));
    }
    if quadratic > 0 {
        notes.push(format!(
            "the mid-side nodes of {quadratic} quadratic cells were left out: the surface is \
             interpolated linearly between corner nodes"
        ));
    }
    if cells.is_empty() {
        return Err(ImportError::new(
            path,
            "has no cells Gaugewright reads (triangles, quadrilaterals, tetrahedra, hexahedra, \
             wedges, pyramids); export the mesh's cells with the result",
        ));
    }
    let mesh = RawMesh { points_m, cells };
    mesh.validate().map_err(|e| {
        ImportError::new(
            path,
            e.to_string()
                .replace("the imported field cannot be used: ", ""),
        )
    })?;
    Ok((mesh, notes))
}

/// A tensor array of the file: its name, components, values, and whether it is on the points.
struct Candidate<'a> {
    name: String,
    components: usize,
    data: &'a IOBuffer,
    on_points: bool,
}

fn candidates(piece: &UnstructuredGridPiece) -> Vec<Candidate<'_>> {
    let mut out = Vec::new();
    for (list, on_points) in [(&piece.data.point, true), (&piece.data.cell, false)] {
        for a in list {
            match a {
                Attribute::DataArray(d) => out.push(Candidate {
                    name: d.name.clone(),
                    components: d.num_comp(),
                    data: &d.data,
                    on_points,
                }),
                Attribute::Field { data_array, .. } => {
                    out.extend(data_array.iter().map(|f| Candidate {
                        name: f.name.clone(),
                        components: f.num_comp(),
                        data: &f.data,
                        on_points,
                    }))
                }
            }
        }
    }
    out.retain(|c| c.components == 6 || c.components == 9);
    out
}

fn choose<'a>(
    path: &Path,
    array: Option<&str>,
    mut found: Vec<Candidate<'a>>,
) -> Result<Candidate<'a>, ImportError> {
    let names = || {
        found
            .iter()
            .map(|c| format!("\"{}\"", c.name))
            .collect::<Vec<_>>()
            .join(", ")
    };
    match array {
        Some(name) => {
            let listed = names();
            let k = found.iter().position(|c| c.name == name).ok_or_else(|| {
                ImportError::new(
                    path,
                    if listed.is_empty() {
                        format!("has no array \"{name}\" and no tensor array at all (6 or 9 components); export the strain or stress tensor")
                    } else {
                        format!("has no tensor array \"{name}\"; its tensor arrays are {listed}")
                    },
                )
            })?;
            Ok(found.swap_remove(k))
        }
        None => match found.len() {
            0 => Err(ImportError::new(
                path,
                "has no tensor array (6 or 9 components on the points or cells); export the \
                 strain or stress tensor",
            )),
            1 => Ok(found.remove(0)),
            _ => Err(ImportError::new(
                path,
                format!(
                    "has several tensor arrays ({}); name the one to read",
                    names()
                ),
            )),
        },
    }
}

/// Six symmetric components (xx, yy, zz, xy, yz, zx) of each element of an array.
fn symmetric(path: &Path, c: &Candidate) -> Result<Vec<[f64; 6]>, ImportError> {
    let v: Vec<f64> = c
        .data
        .cast_into::<f64>()
        .ok_or_else(|| ImportError::new(path, format!("array \"{}\" is not numbers", c.name)))?;
    if c.components == 6 {
        return Ok(v
            .chunks_exact(6)
            .map(|t| [t[0], t[1], t[2], t[3], t[4], t[5]])
            .collect());
    }
    let mut out = Vec::with_capacity(v.len() / 9);
    for (i, t) in v.chunks_exact(9).enumerate() {
        let scale = t.iter().fold(0.0_f64, |m, x| m.max(x.abs()));
        let asym = [(1, 3), (2, 6), (5, 7)]
            .iter()
            .fold(0.0_f64, |m, &(a, b)| m.max((t[a] - t[b]).abs()));
        if asym > 1e-6 * scale {
            return Err(ImportError::new(
                path,
                format!(
                    "array \"{}\" is not symmetric at element {} (a strain or stress tensor \
                     is); export the symmetric tensor",
                    c.name,
                    i + 1
                ),
            ));
        }
        out.push([
            t[0],
            t[4],
            t[8],
            0.5 * (t[1] + t[3]),
            0.5 * (t[5] + t[7]),
            0.5 * (t[2] + t[6]),
        ]);
    }
    Ok(out)
}

/// Cell values averaged to the points of the cells that use them.
fn to_points(cell_values: &[[f64; 6]], cells: &[(CellType, Vec<u64>)], n: usize) -> Vec<[f64; 6]> {
    let mut sum = vec![[0.0; 6]; n];
    let mut count = vec![0u32; n];
    for (value, (_, nodes)) in cell_values.iter().zip(cells) {
        for &v in nodes {
            if let Some(s) = sum.get_mut(v as usize) {
                (0..6).for_each(|k| s[k] += value[k]);
                count[v as usize] += 1;
            }
        }
    }
    sum.iter()
        .zip(&count)
        .map(|(s, &c)| {
            if c == 0 {
                [0.0; 6]
            } else {
                s.map(|x| x / f64::from(c))
            }
        })
        .collect()
}

/// The units: the array's name may carry the value unit; the rest must be stated.
fn units_of(
    path: &Path,
    array_name: &str,
    stated: Option<FieldUnits>,
    notes: &mut Vec<String>,
) -> Result<FieldUnits, ImportError> {
    let named = match bracketed_unit(array_name) {
        Some(text) => Some(TensorUnit::parse(text).ok_or_else(|| {
            ImportError::new(
                path,
                format!(
                    "array \"{array_name}\" names the unit \"{text}\", which is not known; use \
                     one of {}",
                    TensorUnit::ALL.map(|u| u.symbol()).join(", ")
                ),
            )
        })?),
        None => None,
    };
    let tensor = prefer_file(
        named,
        stated.map(|s| s.tensor),
        "value unit",
        |u| u.symbol().to_owned(),
        notes,
    );
    let (Some(tensor), Some(stated)) = (tensor, stated) else {
        let missing = if tensor.is_some() {
            "the unit of its coordinates and the shear convention are not stated (a VTK file \
             cannot carry them): state them when importing"
        } else {
            "its units are not stated: a VTK file cannot carry them. State the coordinates' \
             unit, the values' unit and the shear convention when importing (the values' unit \
             may also be written in the array's name, e.g. \"strain [um/m]\")"
        };
        return Err(ImportError::new(path, missing));
    };
    Ok(FieldUnits { tensor, ..stated })
}

/// Reads a VTK result.
pub(super) fn read_result(req: &ReadRequest) -> Result<ReadField, ImportError> {
    let path = req.path;
    let piece = read_grid(path)?;
    let chosen = choose(path, req.array, candidates(&piece))?;
    let mut notes = Vec::new();
    let units = units_of(path, &chosen.name, req.stated, &mut notes)?;
    let (mesh, mesh_notes) = mesh_of(path, &piece, units.length.to_si())?;
    notes.extend(mesh_notes);
    let raw = symmetric(path, &chosen)?;
    let values = if chosen.on_points {
        if raw.len() != mesh.points_m.len() {
            return Err(ImportError::new(
                path,
                format!(
                    "array \"{}\" has {} values for {} points; the result and the mesh do not \
                     belong together",
                    chosen.name,
                    raw.len(),
                    mesh.points_m.len()
                ),
            ));
        }
        raw
    } else {
        let cells = cell_lists(path, &piece)?;
        if raw.len() != cells.len() {
            return Err(ImportError::new(
                path,
                format!(
                    "array \"{}\" has {} values for {} cells; the result and the mesh do not \
                     belong together",
                    chosen.name,
                    raw.len(),
                    cells.len()
                ),
            ));
        }
        notes.push("the element values were averaged to the nodes".to_owned());
        to_points(&raw, &cells, mesh.points_m.len())
    };
    finish(path, mesh, &values, units, notes, &chosen.name)
}

/// Converts to SI and refuses values that are not numbers.
pub(super) fn finish(
    path: &Path,
    mesh: RawMesh,
    values: &[[f64; 6]],
    units: FieldUnits,
    notes: Vec<String>,
    what: &str,
) -> Result<ReadField, ImportError> {
    if let Some(i) = values.iter().position(|v| v.iter().any(|x| !x.is_finite())) {
        return Err(ImportError::new(
            path,
            format!(
                "{what} is not a number at point {}; repair the export",
                i + 1
            ),
        ));
    }
    Ok(ReadField {
        values: values.iter().map(|v| units.to_si(*v)).collect(),
        quantity: units.tensor.quantity(),
        units,
        notes,
        mesh,
    })
}

/// The mesh of a VTK file alone (for CSV results), in metres.
pub(super) fn read_mesh(
    path: &Path,
    metres_per_unit: f64,
) -> Result<(RawMesh, Vec<String>), ImportError> {
    super::check_file(path)?;
    let piece = read_grid(path)?;
    mesh_of(path, &piece, metres_per_unit)
}
