//! Imported surfaces kept beside their project, so that it reopens without reading the result
//! files again: one file per imported part in the folder `<project name>-cache` next to the
//! project file, in a compact binary form (postcard), naming each source file with its size,
//! time and checksum. A cache is used only while every source it names is unchanged (same size
//! and time, or else the same checksum) and the part still asks for the same files, arrays and
//! units; in any doubt the result files are read again. A source that has gone missing leaves
//! the cached surface in use, with a note that says so.

use std::path::{Path, PathBuf};
use std::time::UNIX_EPOCH;

use gw_mechanics::imported::{ImportedSurface, SurfaceField, SurfaceMesh};
use serde::{Deserialize, Serialize};

use crate::import::file_checksum;
use crate::imported_part::resolve;
use crate::safe_write::{Backup, write_file};

/// The layout of a cache file; a file of another layout is read again from the sources.
const FORMAT: u32 = 1;

/// One source file as it was when the cache was written.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
struct Stamp {
    name: String,
    bytes: u64,
    modified_ns: u128,
    checksum: String,
}

#[derive(Debug, Serialize, Deserialize)]
struct CacheFile {
    format: u32,
    request: String,
    sources: Vec<Stamp>,
    notes: Vec<String>,
    checksums: Vec<String>,
    surface: SurfaceMesh,
}

/// A surface read back from its cache.
#[derive(Debug)]
pub struct Cached {
    /// The surface, before it is split into faces.
    pub surface: SurfaceMesh,
    /// The notes of the reading it was made from, and of sources now missing.
    pub notes: Vec<String>,
    /// Each result file's checksum when the cache was written, in the order of the loads.
    pub checksums: Vec<String>,
}

/// Where the surface of part `index` (from 0) named `name` of the project at `project` is
/// kept.
pub fn cache_path(project: &Path, index: usize, name: &str) -> PathBuf {
    let stem = project
        .file_stem()
        .map(|s| s.to_string_lossy().into_owned())
        .unwrap_or_else(|| "project".to_owned());
    let slug: String = name
        .chars()
        .map(|c| if c.is_alphanumeric() { c } else { '-' })
        .take(40)
        .collect();
    project
        .with_file_name(format!("{stem}-cache"))
        .join(format!("{}-{slug}.surface", index + 1))
}

/// What the part asks to read, in one line: a cache made for another request is not used.
fn request_of(f: &ImportedSurface) -> String {
    let loads: Vec<String> = f
        .loads
        .iter()
        .map(|l| format!("{:?}|{}|{:?}|{:?}", l.component, l.file, l.array, l.units))
        .collect();
    format!("{}#{:?}", loads.join(";"), f.mesh_file)
}

/// Every file the part is read from: its results, then its mesh file.
fn source_names(f: &ImportedSurface) -> Vec<&str> {
    f.loads
        .iter()
        .map(|l| l.file.as_str())
        .chain(f.mesh_file.as_deref())
        .collect()
}

fn size_and_time(path: &Path) -> Option<(u64, u128)> {
    let meta = std::fs::metadata(path).ok()?;
    let modified = meta.modified().ok()?.duration_since(UNIX_EPOCH).ok()?;
    Some((meta.len(), modified.as_nanos()))
}

/// Writes the cache of a part whose results were read (`checksums` of its result files in the
/// order of its loads). Errors say why in words; the project itself is not touched.
pub fn write(
    path: &Path,
    f: &ImportedSurface,
    folder: Option<&Path>,
    surface: &SurfaceField,
    notes: &[String],
    checksums: &[String],
) -> Result<(), String> {
    let mut sources = Vec::new();
    for (k, name) in source_names(f).into_iter().enumerate() {
        let file = resolve(name, folder);
        let (bytes, modified_ns) =
            size_and_time(&file).ok_or_else(|| format!("{name} cannot be read"))?;
        let checksum = match checksums.get(k) {
            Some(sum) => sum.clone(),
            None => file_checksum(&file).map_err(|e| e.to_string())?,
        };
        sources.push(Stamp {
            name: name.to_owned(),
            bytes,
            modified_ns,
            checksum,
        });
    }
    let cache = CacheFile {
        format: FORMAT,
        request: request_of(f),
        sources,
        notes: notes.to_vec(),
        checksums: checksums.to_vec(),
        surface: surface.surface_mesh(),
    };
    let bytes = postcard::to_stdvec(&cache).map_err(|e| e.to_string())?;
    if let Some(dir) = path.parent() {
        std::fs::create_dir_all(dir).map_err(|e| format!("{}: {e}", dir.display()))?;
    }
    write_file(path, &bytes, Backup::Replace).map_err(|e| e.to_string())
}

/// The cached surface of a part, when the cache is there, of this layout, made for the same
/// request, and every source it names is unchanged or missing.
pub fn read(path: &Path, f: &ImportedSurface, folder: Option<&Path>) -> Option<Cached> {
    let bytes = std::fs::read(path).ok()?;
    let cache: CacheFile = postcard::from_bytes(&bytes).ok()?;
    if cache.format != FORMAT || cache.request != request_of(f) {
        return None;
    }
    let names = source_names(f);
    if names.len() != cache.sources.len() || cache.checksums.len() != f.loads.len() {
        return None;
    }
    let mut notes = cache.notes;
    for (name, stamp) in names.into_iter().zip(&cache.sources) {
        let file = resolve(name, folder);
        match size_and_time(&file) {
            None => notes.push(format!(
                "{name} is not found: the surface kept beside the project when it was last \
                 read is used; put the file back or import the result again"
            )),
            Some(now) if now == (stamp.bytes, stamp.modified_ns) => {}
            Some(_) => {
                if file_checksum(&file).ok()? != stamp.checksum {
                    return None;
                }
            }
        }
    }
    Some(Cached {
        surface: cache.surface,
        notes,
        checksums: cache.checksums,
    })
}
