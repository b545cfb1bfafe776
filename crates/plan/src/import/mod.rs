//! Reading finite-element results: the open VTK formats (XML `.vtu`, legacy `.vtk`) and CSV.
//!
//! Whatever the format, a result is a mesh (points and cells by corner nodes) and a symmetric
//! tensor per point, strain or stress. Its units are never assumed: a CSV states them in its
//! headers, a VTK file in its array's name or through the units the engineer states when
//! importing; a file whose units are stated nowhere is refused. Values come back in SI with
//! tensor shear components (ε = γ/2), in the order xx, yy, zz, xy, yz, zx.

mod csv_field;
mod vtk;

use std::path::Path;

use gw_mechanics::imported::{FieldUnits, RawMesh, TensorQuantity};
use sha2::{Digest, Sha256};

/// The largest result file read, bytes (1 GiB).
pub const MAX_RESULT_BYTES: u64 = 1 << 30;

/// What to read.
#[derive(Debug, Clone, Copy)]
pub struct ReadRequest<'a> {
    /// The result file: `.vtu`, `.vtk` or `.csv`.
    pub path: &'a Path,
    /// VTK: the tensor array's name (None: the only one with 6 or 9 components).
    pub array: Option<&'a str>,
    /// Units stated when importing (None: not stated).
    pub stated: Option<FieldUnits>,
    /// CSV only: where the cells come from (a `.vtu`/`.vtk` mesh, or an element CSV).
    pub mesh_path: Option<&'a Path>,
}

/// A result as read.
#[derive(Debug, Clone, PartialEq)]
pub struct ReadField {
    /// Points in metres, cells by corner nodes.
    pub mesh: RawMesh,
    /// One tensor per point, SI, order xx, yy, zz, xy, yz, zx, tensor shear.
    pub values: Vec<[f64; 6]>,
    /// Strain or stress.
    pub quantity: TensorQuantity,
    /// The units the file was read in.
    pub units: FieldUnits,
    /// What is worth saying about the reading.
    pub notes: Vec<String>,
}

/// Why a result could not be read. Every message names the file, the place and the way out.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
#[error("{file}: {detail}")]
pub struct ImportError {
    /// The file's name.
    pub file: String,
    /// What is wrong, where, and what to do.
    pub detail: String,
}

impl ImportError {
    pub(crate) fn new(path: &Path, detail: impl Into<String>) -> Self {
        Self {
            file: path
                .file_name()
                .map(|n| n.to_string_lossy().into_owned())
                .unwrap_or_else(|| path.display().to_string()),
            detail: detail.into(),
        }
    }
}

/// Refuses what is not a regular file of at most [`MAX_RESULT_BYTES`].
pub(crate) fn check_file(path: &Path) -> Result<(), ImportError> {
    let meta = std::fs::metadata(path)
        .map_err(|e| ImportError::new(path, format!("cannot be read ({e}); check the path")))?;
    if !meta.is_file() {
        return Err(ImportError::new(
            path,
            "is not a regular file; name a result file",
        ));
    }
    if meta.len() > MAX_RESULT_BYTES {
        return Err(ImportError::new(
            path,
            format!(
                "is {} MB, more than the {} MB read; export the outer surface or a coarser mesh",
                meta.len() >> 20,
                MAX_RESULT_BYTES >> 20
            ),
        ));
    }
    Ok(())
}

pub(crate) fn extension_of(path: &Path) -> String {
    path.extension()
        .map(|e| e.to_string_lossy().to_ascii_lowercase())
        .unwrap_or_default()
}

/// Reads one result file (and, for a CSV, its mesh).
pub fn read_field(req: &ReadRequest) -> Result<ReadField, ImportError> {
    check_file(req.path)?;
    match extension_of(req.path).as_str() {
        "vtu" | "vtk" => vtk::read_result(req),
        "csv" => csv_field::read_result(req),
        other => Err(ImportError::new(
            req.path,
            format!(
                "has the extension \"{other}\"; results are read from .vtu, .vtk or .csv files"
            ),
        )),
    }
}

/// The file's SHA-256, as "sha256:" and 64 hexadecimal digits.
pub fn file_checksum(path: &Path) -> Result<String, ImportError> {
    check_file(path)?;
    let mut file = std::fs::File::open(path)
        .map_err(|e| ImportError::new(path, format!("cannot be read ({e})")))?;
    let mut hasher = Sha256::new();
    std::io::copy(&mut file, &mut hasher)
        .map_err(|e| ImportError::new(path, format!("cannot be read ({e})")))?;
    let digest = hasher.finalize();
    let hex: String = digest.iter().map(|b| format!("{b:02x}")).collect();
    Ok(format!("sha256:{hex}"))
}

/// The unit written at the end of a name in square brackets, e.g. "strain [um/m]".
pub(crate) fn bracketed_unit(name: &str) -> Option<&str> {
    let open = name.rfind('[')?;
    let close = name[open..].find(']')? + open;
    Some(name[open + 1..close].trim())
}

/// The value of a statement against the file's own: the file wins, with a note when they
/// differ.
pub(crate) fn prefer_file<T: PartialEq + Copy>(
    file: Option<T>,
    stated: Option<T>,
    what: &str,
    show: impl Fn(T) -> String,
    notes: &mut Vec<String>,
) -> Option<T> {
    match (file, stated) {
        (Some(f), Some(s)) if f != s => {
            notes.push(format!(
                "the file gives the {what} as {} where the import states {}: the file's is used",
                show(f),
                show(s)
            ));
            Some(f)
        }
        (Some(f), _) => Some(f),
        (None, s) => s,
    }
}
