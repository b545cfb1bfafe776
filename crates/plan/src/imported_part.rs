//! Parts made from imported finite-element results, in the plan: reading their result files
//! when a project opens or a result is imported, and the checks that belong to a mesh (too
//! coarse under a grid, a surface that is not free of load).

use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::{Arc, Mutex};

use gw_bridge::PlacedGauge;
use gw_mechanics::imported::{
    FieldState, ImportedLoad, ImportedSurface, ReferenceAxis, SurfaceField, UnitField,
};
use gw_mechanics::{GridFootprint, LoadComponent, Member, QuadratureOrder};

use crate::document::{Part, Project};
use crate::import::{ReadRequest, file_checksum, read_field};
use crate::marked::{Rounding, mark_rounded};
use crate::surface_cache;
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

/// How a reading goes, shared with whoever waits for it: the step it is at, and a way to
/// stop it between steps.
#[derive(Debug, Clone, Default)]
pub struct ReadProgress(Arc<ProgressState>);

#[derive(Debug, Default)]
struct ProgressState {
    step: Mutex<(usize, usize, String)>,
    cancelled: AtomicBool,
}

impl ReadProgress {
    /// Steps done, steps in all, and what is being done now.
    pub fn step(&self) -> (usize, usize, String) {
        self.0.step.lock().map(|s| s.clone()).unwrap_or_default()
    }

    /// Asks the reading to stop at its next step.
    pub fn cancel(&self) {
        self.0.cancelled.store(true, Ordering::Relaxed);
    }

    /// Whether the reading was asked to stop.
    pub fn is_cancelled(&self) -> bool {
        self.0.cancelled.load(Ordering::Relaxed)
    }

    /// Starts step `done` + 1 of `of`; refused once the reading is cancelled.
    fn begin(&self, done: usize, of: usize, what: String) -> Result<(), String> {
        if self.is_cancelled() {
            return Err(CANCELLED.to_owned());
        }
        if let Ok(mut s) = self.0.step.lock() {
            *s = (done, of, what);
        }
        Ok(())
    }
}

/// The message of a reading stopped on request.
pub const CANCELLED: &str = "the reading was cancelled; nothing was imported";

/// An imported part's results, read.
#[derive(Debug, Clone)]
pub struct SurfaceRead {
    /// The surface with its unit-load fields.
    pub surface: SurfaceField,
    /// What was found in the files (values averaged to the nodes, cells left out).
    pub notes: Vec<String>,
    /// Each result file's checksum, in the order of the loads.
    pub checksums: Vec<String>,
}

/// Reads every result of an imported part and builds its surface.
pub fn read_surface(f: &ImportedSurface, folder: Option<&Path>) -> Result<SurfaceRead, String> {
    read_surface_with(f, folder, &ReadProgress::default())
}

/// [`read_surface`], telling `progress` each step and stopping when it is cancelled.
pub fn read_surface_with(
    f: &ImportedSurface,
    folder: Option<&Path>,
    progress: &ReadProgress,
) -> Result<SurfaceRead, String> {
    let mut notes = Vec::new();
    let mut mesh = None;
    let mut fields = Vec::new();
    let mut checksums = Vec::new();
    let steps = f.loads.len() + 1;
    let mesh_path = f.mesh_file.as_deref().map(|m| resolve(m, folder));
    for (k, load) in f.loads.iter().enumerate() {
        progress.begin(k, steps, format!("reading {}", load.file))?;
        let path = resolve(&load.file, folder);
        let read = read_field(&ReadRequest {
            path: &path,
            array: load.array.as_deref(),
            stated: load.units,
            mesh_path: mesh_path.as_deref(),
        })
        .map_err(|e| format!("{} result: {e}", load.component.name()))?;
        let sum =
            file_checksum(&path).map_err(|e| format!("{} result: {e}", load.component.name()))?;
        checksums.push(sum);
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
    progress.begin(steps - 1, steps, "finding the outer surface".to_owned())?;
    let source = f
        .mesh_file
        .as_deref()
        .or(f.loads.first().map(|l| l.file.as_str()))
        .unwrap_or_default();
    let surface =
        SurfaceField::new(&mesh, fields, f.reference_axis).map_err(|e| format!("{source}: {e}"))?;
    progress.begin(steps, steps, "done".to_owned())?;
    Ok(SurfaceRead {
        surface,
        notes,
        checksums,
    })
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

/// A note when a result file's checksum is not the one the project recorded at import.
pub(crate) fn changed_note(load: &ImportedLoad, now: &str) -> Option<String> {
    let stored = load.checksum.as_ref()?;
    (now != stored).then(|| {
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

/// Reads the results of every imported part of the project saved at `project_path` (None:
/// not saved; names are then taken as given). Each part's surface comes from its cache beside
/// the project while its sources are unchanged, else from its files, and the cache is then
/// written again. A part whose files cannot be read keeps the reason, shown where the part is
/// checked.
pub fn attach_fields(project: &mut Project, project_path: Option<&Path>) {
    let folder = project_path.and_then(Path::parent);
    for (index, part) in project.parts.iter_mut().enumerate() {
        if let Member::ImportedField(f) = &mut part.member {
            let cache = project_path.map(|p| surface_cache::cache_path(p, index, &part.name));
            let from_cache = cache
                .as_deref()
                .and_then(|c| surface_cache::read(c, f, folder))
                .and_then(|c| {
                    let surface = SurfaceField::from_surface(c.surface, f.reference_axis).ok()?;
                    Some(SurfaceRead {
                        surface,
                        notes: c.notes,
                        checksums: c.checksums,
                    })
                });
            let read = match from_cache {
                Some(read) => Ok(read),
                None => read_surface(f, folder).inspect(|read| {
                    if let Some(c) = &cache {
                        // A cache is a convenience: a project in a folder that cannot be
                        // written to is simply read from its files each time.
                        let _ = surface_cache::write(
                            c,
                            f,
                            folder,
                            &read.surface,
                            &read.notes,
                            &read.checksums,
                        );
                    }
                }),
            };
            match read {
                Ok(read) => install(f, read),
                Err(why) => fail(f, why),
            }
        }
    }
}

/// Writes the cache of every imported part whose results are read, beside the project saved
/// at `project_path`. Returns what could not be written, in words.
pub fn write_caches(project: &Project, project_path: &Path) -> Vec<String> {
    let folder = project_path.parent();
    let mut problems = Vec::new();
    for (index, part) in project.parts.iter().enumerate() {
        if let Member::ImportedField(f) = &part.member {
            let cache = surface_cache::cache_path(project_path, index, &part.name);
            if let Err(e) = write_cache(&cache, f, folder) {
                problems.push(format!("part \"{}\": {e}", part.name));
            }
        }
    }
    problems
}

/// Writes one part's cache unless a good one is there: the checksums are taken from the
/// files, and the notes are the reading's own (not those of files changed since import).
fn write_cache(cache: &Path, f: &ImportedSurface, folder: Option<&Path>) -> Result<(), String> {
    let Some(surface) = f.surface() else {
        return Ok(());
    };
    if surface_cache::read(cache, f, folder).is_some() {
        return Ok(());
    }
    let checksums = f
        .loads
        .iter()
        .map(|l| file_checksum(&resolve(&l.file, folder)).map_err(|e| e.to_string()))
        .collect::<Result<Vec<_>, _>>()?;
    let changed: Vec<String> = f
        .loads
        .iter()
        .zip(&checksums)
        .filter_map(|(load, sum)| changed_note(load, sum))
        .collect();
    let notes: Vec<String> = f
        .read_notes
        .iter()
        .filter(|n| !changed.contains(n))
        .cloned()
        .collect();
    surface_cache::write(cache, f, folder, surface, &notes, &checksums)
}

/// Reads one imported part's results into it from its files.
pub fn attach(f: &mut ImportedSurface, folder: Option<&Path>) {
    match read_surface(f, folder) {
        Ok(read) => install(f, read),
        Err(why) => fail(f, why),
    }
}

fn fail(f: &mut ImportedSurface, why: String) {
    f.field = FieldState::Failed(why);
    f.read_notes.clear();
}

/// Puts a read surface into its part, with a note for each result file whose checksum is not
/// the one recorded at import.
fn install(f: &mut ImportedSurface, read: SurfaceRead) {
    let mut notes: Vec<String> = f
        .loads
        .iter()
        .zip(&read.checksums)
        .filter_map(|(load, sum)| changed_note(load, sum))
        .collect();
    notes.extend(read.notes);
    f.field = FieldState::Loaded(Arc::new(read.surface));
    f.read_notes = notes;
}

/// Makes the faces of an imported part take their x axes from `axis`, keeping every gauge
/// where it is on the part and pointing the way it points: each gauge's place and direction
/// in space are found under the old axes and measured again in the new ones. Refused, with
/// the part unchanged, when the results are not read or a gauge cannot be found again.
pub fn set_reference_axis(part: &mut Part, axis: ReferenceAxis) -> Result<(), String> {
    let Member::ImportedField(f) = &mut part.member else {
        return Err("only a part from imported results has a reference axis".to_owned());
    };
    if f.reference_axis == axis {
        return Ok(());
    }
    let old = f
        .surface()
        .ok_or("the results are not read; read them before changing the axis")?;
    let new = old.with_reference(axis).map_err(|e| e.to_string())?;
    let mut moved = Vec::with_capacity(part.gauges.len());
    for g in &part.gauges {
        let lost = || format!("gauge {} cannot be found again on the surface", g.id);
        let frame = old.frame(&g.position).ok_or_else(lost)?;
        let (sin, cos) = g.angle_rad.sin_cos();
        let dir: [f64; 3] = std::array::from_fn(|i| cos * frame.axis_x[i] + sin * frame.axis_y[i]);
        let position = new.point_at(frame.position, 1e-6).ok_or_else(lost)?;
        let there = new.frame(&position).ok_or_else(lost)?;
        let dot = |a: [f64; 3], b: [f64; 3]| a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
        let angle = dot(dir, there.axis_y).atan2(dot(dir, there.axis_x));
        moved.push((position, angle));
    }
    for (g, (position, angle)) in part.gauges.iter_mut().zip(moved) {
        g.position = position;
        g.angle_rad = angle;
    }
    f.reference_axis = axis;
    f.field = FieldState::Loaded(Arc::new(new));
    Ok(())
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

/// The datum on each face of an imported part that carries gauges: a face need not cover its
/// flat coordinates' rectangle (a hole, a notch), and a datum off the metal cannot be marked or
/// measured from. Said at the first gauge of each such face.
pub fn datum_notes(part: &Part, gauges: &[PlacedGauge]) -> Vec<(usize, String)> {
    let Member::ImportedField(f) = &part.member else {
        return Vec::new();
    };
    let Some(surface) = f.surface() else {
        return Vec::new();
    };
    let (dx, ds) = part.datum_m;
    let mut out = Vec::new();
    let mut seen = Vec::new();
    for (gi, g) in gauges.iter().enumerate() {
        let face = g.position.face;
        if seen.contains(&face) {
            continue;
        }
        seen.push(face);
        if surface
            .locate(&gw_mechanics::SurfacePoint::new(face, dx, ds))
            .is_ok()
        {
            continue;
        }
        out.push((
            gi,
            format!(
                "the datum (x = {}, s = {}) lies off {} (in a hole or past its edge), where it \
                 cannot be marked or measured from; set it on the metal of this face: Datum \
                 here in the face view, or Datum x and s of the part",
                mark_rounded(Quantity::Length, dx, Rounding::Nearest),
                mark_rounded(Quantity::Length, ds, Rounding::Nearest),
                face.name()
            ),
        ));
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
