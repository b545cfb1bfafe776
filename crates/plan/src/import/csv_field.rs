//! CSV results: one row per node with its coordinates and six tensor components, the units in
//! the headers; the cells from a mesh file (a VTK mesh or an element CSV).

use std::path::Path;

use gw_mechanics::imported::{
    Cell, CellKind, FieldUnits, LengthUnit, RawMesh, ShearConvention, TensorUnit,
};

use super::{ImportError, ReadField, ReadRequest, bracketed_unit, prefer_file};

/// The tensor columns in our order (xx, yy, zz, xy, yz, zx), each with the names it may have.
const STRAIN: [&[&str]; 6] = [
    &["exx"],
    &["eyy"],
    &["ezz"],
    &["exy", "gxy", "eyx", "gyx"],
    &["eyz", "gyz", "ezy", "gzy"],
    &["ezx", "gzx", "exz", "gxz"],
];
const STRESS: [&[&str]; 6] = [
    &["sxx"],
    &["syy"],
    &["szz"],
    &["sxy", "syx"],
    &["syz", "szy"],
    &["szx", "sxz"],
];

/// Where each column is, and what the headers state.
struct Layout {
    coords: [usize; 3],
    tensor: [usize; 6],
    length: LengthUnit,
    unit: TensorUnit,
    shear: ShearConvention,
}

fn name_and_unit(header: &str) -> (String, Option<&str>) {
    let name = header
        .split('[')
        .next()
        .unwrap_or("")
        .trim()
        .to_ascii_lowercase();
    (name, bracketed_unit(header))
}

fn find(names: &[(String, Option<&str>)], wanted: &[&str]) -> Option<usize> {
    names.iter().position(|(n, _)| wanted.contains(&n.as_str()))
}

fn layout(path: &Path, headers: &csv::StringRecord) -> Result<Layout, ImportError> {
    let names: Vec<(String, Option<&str>)> = headers.iter().map(name_and_unit).collect();
    let missing = |what: &str| {
        ImportError::new(
            path,
            format!(
                "line 1 has no column {what}; the header must name x, y, z and six tensor \
                 columns (exx eyy ezz with gxy gyz gzx or exy eyz ezx, or sxx … szx), each with \
                 its unit in brackets, e.g. \"x [mm]\""
            ),
        )
    };
    let mut coords = [0; 3];
    for (k, axis) in ["x", "y", "z"].iter().enumerate() {
        coords[k] = find(&names, &[axis]).ok_or_else(|| missing(&format!("\"{axis}\"")))?;
    }
    let table = if find(&names, &["sxx"]).is_some() {
        STRESS
    } else {
        STRAIN
    };
    let mut tensor = [0; 6];
    for (k, wanted) in table.iter().enumerate() {
        tensor[k] = find(&names, wanted).ok_or_else(|| missing(&format!("\"{}\"", wanted[0])))?;
    }
    let shear = shear_of(path, &names, &tensor[3..])?;
    let length = column_unit(path, &names, &coords, "coordinates", LengthUnit::parse)?;
    let unit = column_unit(path, &names, &tensor, "tensor values", TensorUnit::parse)?;
    let stress = table == STRESS;
    if stress != (unit.quantity() == gw_mechanics::imported::TensorQuantity::Stress) {
        return Err(ImportError::new(
            path,
            format!(
                "line 1: the columns are {} but their unit {} is a {}; correct the header",
                if stress { "stresses" } else { "strains" },
                unit.symbol(),
                if stress { "strain" } else { "stress" }
            ),
        ));
    }
    Ok(Layout {
        coords,
        tensor,
        length,
        unit,
        shear,
    })
}

fn shear_of(
    path: &Path,
    names: &[(String, Option<&str>)],
    shear_columns: &[usize],
) -> Result<ShearConvention, ImportError> {
    let engineering = shear_columns
        .iter()
        .filter(|&&c| names[c].0.starts_with('g'))
        .count();
    match engineering {
        0 => Ok(ShearConvention::Tensor),
        3 => Ok(ShearConvention::Engineering),
        _ => Err(ImportError::new(
            path,
            "line 1 mixes engineering (g…) and tensor (e…) shear columns; name all three the \
             same way",
        )),
    }
}

/// The unit of a group of columns: the first must state it, the others agree where they do.
fn column_unit<U: PartialEq + Copy>(
    path: &Path,
    names: &[(String, Option<&str>)],
    columns: &[usize],
    what: &str,
    parse: fn(&str) -> Option<U>,
) -> Result<U, ImportError> {
    let first = &names[columns[0]];
    let text = first.1.ok_or_else(|| {
        ImportError::new(
            path,
            format!(
                "line 1: the units of the {what} are not stated; write them in brackets after the \
                 column name, e.g. \"{} [mm]\"",
                first.0
            ),
        )
    })?;
    let unit = parse(text).ok_or_else(|| {
        ImportError::new(
            path,
            format!(
                "line 1: column \"{}\" has the unknown unit \"{text}\"",
                first.0
            ),
        )
    })?;
    for &c in &columns[1..] {
        if let Some(other) = names[c].1
            && parse(other) != Some(unit)
        {
            return Err(ImportError::new(
                path,
                format!(
                    "line 1: column \"{}\" is in \"{other}\" but \"{}\" is in \"{text}\"; give \
                     the {what} one unit",
                    names[c].0, first.0
                ),
            ));
        }
    }
    Ok(unit)
}

/// The file's bytes (its size was checked before).
fn contents(path: &Path) -> Result<Vec<u8>, ImportError> {
    std::fs::read(path).map_err(|e| ImportError::new(path, format!("cannot be read ({e})")))
}

fn reader(bytes: &[u8], headers: bool) -> csv::Reader<&[u8]> {
    csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .has_headers(headers)
        .flexible(true)
        .trim(csv::Trim::All)
        .from_reader(bytes)
}

/// The line a record is on. The reader puts a record that follows comment or blank lines at
/// the first of them, so those are stepped over here.
fn line_of(record: &csv::StringRecord, bytes: &[u8]) -> u64 {
    let Some(pos) = record.position() else {
        return 0;
    };
    let (mut line, mut at) = (pos.line(), pos.byte() as usize);
    while at < bytes.len() && matches!(bytes[at], b'#' | b'\n' | b'\r') {
        let skip = if bytes[at] == b'#' {
            bytes[at..]
                .iter()
                .position(|&b| b == b'\n')
                .map_or(bytes.len() - at, |n| n + 1)
        } else {
            1
        };
        if bytes[at] != b'\r' {
            line += 1;
        }
        at += skip;
    }
    line
}

/// The header's layout, then each row's coordinates (in the file's unit) and tensor values.
type Rows = (Layout, Vec<[f64; 3]>, Vec<[f64; 6]>);

/// The rows of a node CSV.
fn rows(path: &Path) -> Result<Rows, ImportError> {
    let bytes = contents(path)?;
    let mut rdr = reader(&bytes, true);
    let headers = rdr
        .headers()
        .map_err(|e| ImportError::new(path, format!("its header cannot be read ({e})")))?
        .clone();
    let layout = layout(path, &headers)?;
    let (mut coords, mut values) = (Vec::new(), Vec::new());
    let mut record = csv::StringRecord::new();
    loop {
        match rdr.read_record(&mut record) {
            Ok(false) => break,
            Ok(true) => {}
            Err(e) => return Err(ImportError::new(path, format!("cannot be read ({e})"))),
        }
        let line = line_of(&record, &bytes);
        if record.len() != headers.len() {
            return Err(ImportError::new(
                path,
                format!(
                    "line {line} has {} fields where the header has {}",
                    record.len(),
                    headers.len()
                ),
            ));
        }
        let number = |col: usize| -> Result<f64, ImportError> {
            let text = &record[col];
            match text.parse::<f64>() {
                Ok(v) if v.is_finite() => Ok(v),
                _ => Err(ImportError::new(
                    path,
                    format!(
                        "line {line}, column {} (\"{}\"): \"{text}\" is not a number; repair \
                         the export",
                        col + 1,
                        &headers[col]
                    ),
                )),
            }
        };
        let mut p = [0.0; 3];
        for (v, &col) in p.iter_mut().zip(&layout.coords) {
            *v = number(col)?;
        }
        let mut t = [0.0; 6];
        for (v, &col) in t.iter_mut().zip(&layout.tensor) {
            *v = number(col)?;
        }
        coords.push(p);
        values.push(t);
    }
    if coords.is_empty() {
        return Err(ImportError::new(path, "has a header but no node rows"));
    }
    Ok((layout, coords, values))
}

/// An element CSV: rows "kind,n1,n2,…", node numbers from 1.
fn element_csv(path: &Path, points: usize) -> Result<Vec<Cell>, ImportError> {
    super::check_file(path)?;
    let bytes = contents(path)?;
    let mut rdr = reader(&bytes, false);
    let mut cells = Vec::new();
    let mut record = csv::StringRecord::new();
    let mut first = true;
    loop {
        match rdr.read_record(&mut record) {
            Ok(false) => break,
            Ok(true) => {}
            Err(e) => return Err(ImportError::new(path, format!("cannot be read ({e})"))),
        }
        let line = line_of(&record, &bytes);
        let kind = match record.get(0).unwrap_or("").to_ascii_lowercase().as_str() {
            "tri" | "triangle" => CellKind::Triangle,
            "quad" => CellKind::Quad,
            "tet" | "tetra" => CellKind::Tetra,
            "hex" | "hexa" => CellKind::Hexa,
            "wedge" => CellKind::Wedge,
            "pyramid" => CellKind::Pyramid,
            // A header line before the first cell.
            _ if first => {
                first = false;
                continue;
            }
            other => {
                return Err(ImportError::new(
                    path,
                    format!(
                        "line {line}: \"{other}\" is not a cell kind; use tri, quad, tet, hex, \
                         wedge or pyramid"
                    ),
                ));
            }
        };
        first = false;
        let nodes: Vec<&str> = record.iter().skip(1).filter(|f| !f.is_empty()).collect();
        if nodes.len() != kind.corners() {
            return Err(ImportError::new(
                path,
                format!(
                    "line {line}: the row gives {} nodes but a {kind:?} cell has {} corners",
                    nodes.len(),
                    kind.corners()
                ),
            ));
        }
        let mut ids = Vec::with_capacity(nodes.len());
        for text in nodes {
            match text.parse::<u64>() {
                Ok(n) if n >= 1 && n as usize <= points => ids.push((n - 1) as u32),
                _ => {
                    return Err(ImportError::new(
                        path,
                        format!(
                            "line {line}: node \"{text}\" is not a node number from 1 to {points} \
                             (the rows of the node file)"
                        ),
                    ));
                }
            }
        }
        cells.push(Cell { kind, nodes: ids });
    }
    if cells.is_empty() {
        return Err(ImportError::new(
            path,
            "has no cell rows; give one row per element: kind,n1,n2,… (node numbers from 1)",
        ));
    }
    Ok(cells)
}

/// Reads a CSV result with its cells.
pub(super) fn read_result(req: &ReadRequest) -> Result<ReadField, ImportError> {
    let path = req.path;
    let (layout, coords, values) = rows(path)?;
    let mut notes = Vec::new();
    let file_units = FieldUnits {
        length: layout.length,
        tensor: layout.unit,
        shear: layout.shear,
    };
    if let Some(stated) = req.stated {
        prefer_file(
            Some(file_units.length),
            Some(stated.length),
            "coordinates' unit",
            |u| u.symbol().to_owned(),
            &mut notes,
        );
        prefer_file(
            Some(file_units.tensor),
            Some(stated.tensor),
            "values' unit",
            |u| u.symbol().to_owned(),
            &mut notes,
        );
        if file_units.tensor.quantity() == gw_mechanics::imported::TensorQuantity::Strain {
            prefer_file(
                Some(file_units.shear),
                Some(stated.shear),
                "shear convention",
                |u| u.name().to_owned(),
                &mut notes,
            );
        }
    }
    let k = layout.length.to_si();
    let points_m: Vec<[f64; 3]> = coords.iter().map(|p| p.map(|v| v * k)).collect();
    let mesh_path = req.mesh_path.ok_or_else(|| {
        ImportError::new(
            path,
            "holds node values only: name the file its cells come from (a .vtu or .vtk mesh, or \
             an element CSV with rows kind,n1,n2,…)",
        )
    })?;
    let cells = match super::extension_of(mesh_path).as_str() {
        "csv" => element_csv(mesh_path, points_m.len())?,
        "vtu" | "vtk" => vtk_cells(mesh_path, &points_m, k, &mut notes)?,
        other => {
            return Err(ImportError::new(
                mesh_path,
                format!("has the extension \"{other}\"; cells are read from .vtu, .vtk or .csv"),
            ));
        }
    };
    let mesh = RawMesh { points_m, cells };
    super::vtk::finish(path, mesh, &values, file_units, notes, "a tensor value")
}

/// The cells of a VTK mesh whose points must be the CSV's rows, in order.
fn vtk_cells(
    mesh_path: &Path,
    points_m: &[[f64; 3]],
    metres_per_unit: f64,
    notes: &mut Vec<String>,
) -> Result<Vec<Cell>, ImportError> {
    let (mesh, mesh_notes) = super::vtk::read_mesh(mesh_path, metres_per_unit)?;
    notes.extend(mesh_notes);
    if mesh.points_m.len() != points_m.len() {
        return Err(ImportError::new(
            mesh_path,
            format!(
                "has {} points but the CSV has {} node rows; the mesh and the result do not \
                 belong together",
                mesh.points_m.len(),
                points_m.len()
            ),
        ));
    }
    let size = points_m
        .iter()
        .flatten()
        .fold(0.0_f64, |m, v| m.max(v.abs()))
        .max(1e-6);
    if let Some(i) = mesh
        .points_m
        .iter()
        .zip(points_m)
        .position(|(a, b)| (0..3).any(|k| (a[k] - b[k]).abs() > 1e-6 * size))
    {
        return Err(ImportError::new(
            mesh_path,
            format!(
                "point {} is not where node row {} of the CSV puts it; the mesh and the result \
                 do not belong together",
                i + 1,
                i + 1
            ),
        ));
    }
    Ok(mesh.cells)
}
