//! Parts made from imported finite-element results, in the plan: reading their result files
//! when a project opens or a result is imported, and the checks that belong to a mesh (too
//! coarse under a grid, a surface that is not free of load).

use std::path::{Path, PathBuf};
use std::sync::Arc;

use gw_bridge::PlacedGauge;
use gw_mechanics::imported::{FieldState, ImportedLoad, ImportedSurface, SurfaceField, UnitField};
use gw_mechanics::{GridFootprint, LoadComponent, Member, QuadratureOrder};

use crate::document::{Part, Project};
use crate::import::{ReadRequest, file_checksum, read_field};
use crate::marked::{Rounding, mark_rounded};
use crate::units::Quantity;

/// Fewest element faces a grid should span for the mesh's interpolated field to stand for
/// its average (our default: with fewer, the grid averages one or two linear pieces and a
/// peak between nodes is lost; common practice is several elements along the grid).
pub const MIN_FACETS_UNDER_GRID: usize = 3;

/// Largest stress normal to the surface at a grid, as a share of the largest in-plane
/// principal stress there, before the surface is taken as not free (5 %, common practice).
pub const NORMAL_STRESS_TOLERANCE: f64 = 0.05;

/// Stresses below this are too small for the free-surface check to mean anything, Pa.
const NORMAL_STRESS_FLOOR_PA: f64 = 1e3;

/// A file named in the project, found: relative names are taken from the project's folder.
pub fn resolve(file: &str, folder: Option<&Path>) -> PathBuf {
    let p = PathBuf::from(file);
    match folder {
        Some(dir) if p.is_relative() => dir.join(p),
        _ => p,
    }
}

/// The name a project stores for `path`: relative to the project's folder when it lies inside
/// it, else as given.
pub fn stored_name(path: &Path, folder: Option<&Path>) -> String {
    folder
        .and_then(|dir| path.strip_prefix(dir).ok())
        .unwrap_or(path)
        .to_string_lossy()
        .into_owned()
}

/// Reads every result of an imported part and builds its surface, with notes on what was
/// found on the way (a file changed since it was imported, values averaged to the nodes).
pub fn read_surface(
    f: &ImportedSurface,
    folder: Option<&Path>,
) -> Result<(SurfaceField, Vec<String>), String> {
    let mut notes = Vec::new();
    let mut mesh = None;
    let mut fields = Vec::new();
    let mesh_path = f.mesh_file.as_deref().map(|m| resolve(m, folder));
    for load in &f.loads {
        let path = resolve(&load.file, folder);
        let read = read_field(&ReadRequest {
            path: &path,
            array: load.array.as_deref(),
            stated: load.units,
            mesh_path: mesh_path.as_deref(),
        })
        .map_err(|e| format!("{} result: {e}", load.component.name()))?;
        notes.extend(checksum_note(load, &path));
        notes.extend(
            read.notes
                .iter()
                .map(|n| format!("{} result ({}): {n}", load.component.name(), load.file)),
        );
        if let Some(first) = &mesh {
            same_mesh(first, &read.mesh, load)?;
        } else {
            mesh = Some(read.mesh);
        }
        fields.push(UnitField {
            component: load.component,
            quantity: read.quantity,
            values: read.values,
        });
    }
    let mesh = mesh.ok_or("no result file is named; import at least one unit-load result")?;
    let source = f
        .mesh_file
        .as_deref()
        .or(f.loads.first().map(|l| l.file.as_str()))
        .unwrap_or_default();
    let surface = SurfaceField::new(&mesh, fields, f.reference_axis)
        .map_err(|e| format!("{source}: {e}"))?;
    Ok((surface, notes))
}

/// Refuses results on different meshes: they must share every point.
fn same_mesh(
    first: &gw_mechanics::imported::RawMesh,
    other: &gw_mechanics::imported::RawMesh,
    load: &ImportedLoad,
) -> Result<(), String> {
    if first.points_m.len() != other.points_m.len() {
        return Err(format!(
            "the {} result ({}) has {} points where the first result has {}; every unit-load \
             result must be on the same mesh",
            load.component.name(),
            load.file,
            other.points_m.len(),
            first.points_m.len()
        ));
    }
    let size = first
        .points_m
        .iter()
        .flatten()
        .fold(0.0_f64, |m, v| m.max(v.abs()))
        .max(1e-3);
    if let Some(i) = first
        .points_m
        .iter()
        .zip(&other.points_m)
        .position(|(a, b)| (0..3).any(|k| (a[k] - b[k]).abs() > 1e-6 * size))
    {
        return Err(format!(
            "point {} of the {} result ({}) is not where the first result has it; every \
             unit-load result must be on the same mesh",
            i + 1,
            load.component.name(),
            load.file
        ));
    }
    Ok(())
}

fn checksum_note(load: &ImportedLoad, path: &Path) -> Option<String> {
    let stored = load.checksum.as_ref()?;
    let now = file_checksum(path).ok()?;
    (now != *stored).then(|| {
        format!(
            "the {} result file {} has changed since it was imported; check the readings, \
             then import it again to accept the change",
            load.component.name(),
            load.file
        )
    })
}

/// Names the result files of every imported part from folder `to` instead of `from` (a
/// project saved somewhere else keeps finding them): a name relative to `from` becomes
/// relative to `to` where the file lies under it, else a full path.
pub fn rebase(project: &mut Project, from: Option<&Path>, to: Option<&Path>) {
    if from == to {
        return;
    }
    let moved = |name: &mut String| {
        let absolute = resolve(name, from);
        let absolute = if absolute.is_relative() {
            std::env::current_dir()
                .map(|d| d.join(&absolute))
                .unwrap_or(absolute)
        } else {
            absolute
        };
        *name = stored_name(&absolute, to);
    };
    for part in &mut project.parts {
        if let Member::ImportedField(f) = &mut part.member {
            f.loads.iter_mut().for_each(|l| moved(&mut l.file));
            if let Some(m) = f.mesh_file.as_mut() {
                moved(m);
            }
        }
    }
}

/// True unless the part is an imported one whose results are not read.
pub fn is_ready(member: &Member) -> bool {
    match member {
        Member::ImportedField(f) => f.surface().is_some(),
        _ => true,
    }
}

/// Whether the part can be evaluated: an imported part needs its results read (the message
/// says why they are not, and the way out).
pub fn readiness(part: &Part) -> Result<(), crate::io::PlanError> {
    match &part.member {
        Member::ImportedField(f) => {
            f.loaded()
                .map(|_| ())
                .map_err(|e| crate::io::PlanError::Invalid {
                    path: format!("part \"{}\"", part.name),
                    message: e.to_string(),
                })
        }
        _ => Ok(()),
    }
}

/// Reads the results of every imported part of a project whose file lies in `folder`. A part
/// whose files cannot be read keeps the reason, shown where the part is checked.
pub fn attach_fields(project: &mut Project, folder: Option<&Path>) {
    for part in &mut project.parts {
        if let Member::ImportedField(f) = &mut part.member {
            attach(f, folder);
        }
    }
}

/// Reads one imported part's results into it.
pub fn attach(f: &mut ImportedSurface, folder: Option<&Path>) {
    match read_surface(f, folder) {
        Ok((surface, notes)) => {
            f.field = FieldState::Loaded(Arc::new(surface));
            f.read_notes = notes;
        }
        Err(why) => {
            f.field = FieldState::Failed(why);
            f.read_notes.clear();
        }
    }
}

/// The mesh checks of one imported part's gauges: each grid should span at least
/// [`MIN_FACETS_UNDER_GRID`] element faces, and the surface under it should be free (the
/// stress normal to it small beside the in-plane stresses).
pub fn mesh_notes(
    part: &Part,
    gauges: &[PlacedGauge],
    quadrature: QuadratureOrder,
) -> Vec<(usize, String)> {
    let Member::ImportedField(f) = &part.member else {
        return Vec::new();
    };
    let Some(surface) = f.surface() else {
        return Vec::new();
    };
    let mut out = Vec::new();
    for (gi, g) in gauges.iter().enumerate() {
        if let Some(note) = coarse_note(surface, g, quadrature) {
            out.push((gi, note));
        }
        if let Some(note) = normal_stress_note(part, g) {
            out.push((gi, note));
        }
    }
    out
}

fn quadrature_points(grid: &GridFootprint, q: QuadratureOrder) -> Vec<gw_mechanics::SurfacePoint> {
    let (ua, _) = gw_mechanics::grid_average::gauss_legendre(q.along.max(2));
    let (va, _) = gw_mechanics::grid_average::gauss_legendre(q.across.max(2));
    let mut pts = Vec::with_capacity(ua.len() * va.len());
    for u in &ua {
        for v in &va {
            pts.push(grid.point(u * grid.length_m / 2.0, v * grid.width_m / 2.0));
        }
    }
    pts
}

fn coarse_note(surface: &SurfaceField, g: &PlacedGauge, q: QuadratureOrder) -> Option<String> {
    let (count, grid) = (0..g.element_count())
        .map(|k| {
            let grid = g.footprint(k);
            (surface.facets_under(&quadrature_points(&grid, q)), grid)
        })
        .min_by_key(|(n, _)| *n)?;
    if count >= MIN_FACETS_UNDER_GRID {
        return None;
    }
    let Ok(at) = surface.locate(&grid.center) else {
        return None;
    };
    let size = surface.mesh_size_m(at.face)?;
    Some(format!(
        "its grid spans {count} element face{} of the mesh (elements about {} against a grid \
         {} long); the mesh is too coarse to trust the grid's average there: refine it near \
         the gauge to at least {MIN_FACETS_UNDER_GRID} elements along the grid",
        if count == 1 { "" } else { "s" },
        mark_rounded(Quantity::Length, size, Rounding::Nearest),
        mark_rounded(Quantity::Length, grid.length_m, Rounding::Nearest),
    ))
}

fn normal_stress_note(part: &Part, g: &PlacedGauge) -> Option<String> {
    let material = part.member.material();
    let (case, ratio) = part
        .load_cases
        .iter()
        .filter_map(|case| {
            let mut loads = case.load_vector();
            loads[LoadComponent::TemperatureChange] = 0.0;
            let state = part.member.state(&g.position, &loads).ok()?;
            let stress = state.stress(material);
            let p = stress.principal();
            let in_plane = p.max.abs().max(p.min.abs());
            (in_plane > NORMAL_STRESS_FLOOR_PA)
                .then(|| (case, stress.normal_out_of_plane_pa.abs() / in_plane))
        })
        .max_by(|a, b| a.1.total_cmp(&b.1))?;
    (ratio > NORMAL_STRESS_TOLERANCE).then(|| {
        format!(
            "the stress normal to the surface under it is {:.0} % of the in-plane stress at \
             \"{}\" (more than {:.0} %): the surface there is not free (a contact, a load or a \
             coarse mesh), so what the grid reads is not what the model's surface carries; \
             move the gauge or check the model there",
            100.0 * ratio,
            case.name,
            100.0 * NORMAL_STRESS_TOLERANCE
        )
    })
}
