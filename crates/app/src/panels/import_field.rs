//! File → "Import finite-element results…": a part made from strain or stress results of a
//! finite-element model, one file per unit load. The engineer names each result's load, states
//! the units the files are written in, and reads them; the reading runs beside the window (it
//! can be cancelled) and shows what was found before the part is added.

use std::path::{Path, PathBuf};
use std::sync::Arc;
use std::sync::mpsc::{Receiver, TryRecvError, channel};
use std::time::Instant;

use gw_mechanics::imported::{
    FieldState, FieldUnits, ImportedLoad, ImportedSurface, LengthUnit, ReferenceAxis,
    ShearConvention, SurfaceField, TensorUnit,
};
use gw_mechanics::{LoadComponent, MATERIAL_LIBRARY, Member};
use gw_plan::Part;
use gw_plan::blank::new_part;
use gw_plan::imported_part::{
    CANCELLED, ReadProgress, SurfaceRead, read_surface_with, stored_name,
};

/// The loads an imported result can be the unit response to (a temperature change is added by
/// the material's expansion, not imported).
pub const IMPORTABLE: [LoadComponent; 9] = [
    LoadComponent::VerticalForce,
    LoadComponent::LateralForce,
    LoadComponent::AxialForce,
    LoadComponent::Torque,
    LoadComponent::BendingMomentY,
    LoadComponent::BendingMomentZ,
    LoadComponent::InternalPressure,
    LoadComponent::ExternalPressure,
    LoadComponent::UniformLoad,
];

/// One result row of the form.
#[derive(Debug, Clone, PartialEq)]
pub struct ResultRow {
    /// The load this result is per unit of.
    pub component: LoadComponent,
    /// What the engineer calls the load.
    pub name: String,
    /// Path of the file as typed or picked.
    pub file: String,
    /// Tensor array in a VTK file (empty: the only one).
    pub array: String,
}

/// What came back from a reading.
type Outcome = Result<SurfaceRead, String>;

/// A finished reading: the surface, the notes, each file's checksum.
type Read = (Arc<SurfaceField>, Vec<String>, Vec<String>);

/// A reading in progress.
struct Reading {
    started: Instant,
    receiver: Receiver<Outcome>,
    progress: ReadProgress,
}

/// View state of the dialog.
pub struct ImportFieldDialog {
    /// Name of the new part.
    pub part_name: String,
    /// Library key of the material.
    pub material_key: Option<&'static str>,
    /// Axis the faces' x axes follow.
    pub reference_axis: ReferenceAxis,
    /// The results, one per unit load.
    pub rows: Vec<ResultRow>,
    /// Mesh file for CSV results.
    pub mesh_file: String,
    /// Length unit (None: not stated).
    pub length: Option<LengthUnit>,
    /// Tensor unit (None: not stated).
    pub tensor: Option<TensorUnit>,
    /// Shear convention (None: not stated).
    pub shear: Option<ShearConvention>,
    reading: Option<Reading>,
    read: Option<Read>,
    message: Option<String>,
}

impl Default for ImportFieldDialog {
    fn default() -> Self {
        Self {
            part_name: "Imported part".to_owned(),
            material_key: MATERIAL_LIBRARY.first().map(|m| m.key),
            reference_axis: ReferenceAxis::X,
            rows: vec![ResultRow {
                component: LoadComponent::VerticalForce,
                name: String::new(),
                file: String::new(),
                array: String::new(),
            }],
            mesh_file: String::new(),
            length: None,
            tensor: None,
            shear: None,
            reading: None,
            read: None,
            message: None,
        }
    }
}

/// What the user decided.
pub enum ImportOutcome {
    /// Add this part to the project.
    Add(Box<Part>),
    /// Close without adding.
    Cancel,
}

impl ImportFieldDialog {
    /// The units as stated: all three, none, or why the statement is incomplete.
    pub fn stated_units(&self) -> Result<Option<FieldUnits>, String> {
        match (self.length, self.tensor, self.shear) {
            (Some(length), Some(tensor), Some(shear)) => Ok(Some(FieldUnits {
                length,
                tensor,
                shear,
            })),
            (None, None, None) => Ok(None),
            _ => Err(
                "State all three units (coordinates, values, shear) or none of them \
                      (then every file must state its own)."
                    .to_owned(),
            ),
        }
    }

    /// The part as described (its field not read yet); `folder` is the project's folder.
    pub fn describe(&self, folder: Option<&Path>) -> Result<ImportedSurface, String> {
        let units = self.stated_units()?;
        let material = self
            .material_key
            .and_then(gw_mechanics::library_material)
            .map(|m| m.material())
            .unwrap_or_else(gw_plan::blank::default_material);
        let mut loads = Vec::new();
        for (k, row) in self.rows.iter().enumerate() {
            let file = row.file.trim();
            if file.is_empty() {
                return Err(format!("Result {}: name its file.", k + 1));
            }
            if self.rows[..k].iter().any(|r| r.component == row.component) {
                return Err(format!(
                    "Result {}: the {} already has a result; give each load one file.",
                    k + 1,
                    row.component.name()
                ));
            }
            loads.push(ImportedLoad {
                component: row.component,
                name: row.name.trim().to_owned(),
                file: stored_name(Path::new(file), folder),
                array: (!row.array.trim().is_empty()).then(|| row.array.trim().to_owned()),
                units,
                checksum: None,
            });
        }
        let mesh = self.mesh_file.trim();
        Ok(ImportedSurface {
            material,
            reference_axis: self.reference_axis,
            loads,
            mesh_file: (!mesh.is_empty()).then(|| stored_name(Path::new(mesh), folder)),
            field: FieldState::NotLoaded,
            read_notes: Vec::new(),
        })
    }

    /// Starts reading the files beside the window.
    pub fn start_reading(&mut self, folder: Option<PathBuf>) {
        self.read = None;
        let surface = match self.describe(folder.as_deref()) {
            Ok(s) => s,
            Err(e) => {
                self.message = Some(e);
                return;
            }
        };
        self.message = None;
        let (sender, receiver) = channel();
        let progress = ReadProgress::default();
        let shared = progress.clone();
        std::thread::spawn(move || {
            let outcome = read_surface_with(&surface, folder.as_deref(), &shared);
            // The window may have been closed: nobody listens then.
            let _ = sender.send(outcome);
        });
        self.reading = Some(Reading {
            started: Instant::now(),
            receiver,
            progress,
        });
    }

    /// Takes a finished reading, if any; true while one is still running.
    pub fn poll(&mut self) -> bool {
        let Some(reading) = &self.reading else {
            return false;
        };
        match reading.receiver.try_recv() {
            Ok(Ok(read)) => {
                self.read = Some((Arc::new(read.surface), read.notes, read.checksums));
                self.reading = None;
                false
            }
            Ok(Err(e)) => {
                self.message = Some(e);
                self.reading = None;
                false
            }
            Err(TryRecvError::Empty) => true,
            Err(TryRecvError::Disconnected) => {
                self.message = Some("The reading stopped without a result.".to_owned());
                self.reading = None;
                false
            }
        }
    }

    /// Asks the running reading to stop at its next step (between files, before the surface
    /// is built) and stops waiting for it.
    pub fn cancel_reading(&mut self) {
        if let Some(reading) = self.reading.take() {
            reading.progress.cancel();
            self.message = Some(format!(
                "{}{}.",
                CANCELLED[..1].to_uppercase(),
                &CANCELLED[1..]
            ));
        }
    }

    /// The part to add, once the files are read.
    pub fn part(&self, folder: Option<&Path>) -> Option<Part> {
        let (field, notes, sums) = self.read.as_ref()?;
        let mut surface = self.describe(folder).ok()?;
        for (load, sum) in surface.loads.iter_mut().zip(sums) {
            load.checksum = Some(sum.clone());
        }
        surface.field = FieldState::Loaded(field.clone());
        surface.read_notes = notes.clone();
        let name = if self.part_name.trim().is_empty() {
            "Imported part"
        } else {
            self.part_name.trim()
        };
        Some(new_part(
            name,
            Member::ImportedField(surface),
            self.material_key.map(str::to_owned),
        ))
    }

    /// What was read, in words.
    pub fn summary(&self) -> Option<String> {
        let (field, notes, _) = self.read.as_ref()?;
        let mut text = format!(
            "Read: {} surface nodes, {} triangles, {} faces ({}).",
            field.node_count(),
            field.triangle_count(),
            field.patches().len(),
            if field.from_solid() {
                "the outer surface of the solid cells"
            } else {
                "shell cells"
            }
        );
        for n in notes {
            text.push_str("\n• ");
            text.push_str(n);
        }
        Some(text)
    }

    /// The message under the form (an error, or a cancelled reading).
    pub fn message(&self) -> Option<&str> {
        self.message.as_deref()
    }

    /// Seconds since the running reading started.
    pub fn reading_for_s(&self) -> Option<f64> {
        self.reading
            .as_ref()
            .map(|r| r.started.elapsed().as_secs_f64())
    }

    /// The running reading's steps done, steps in all, and what it is doing.
    pub fn reading_step(&self) -> Option<(usize, usize, String)> {
        self.reading.as_ref().map(|r| r.progress.step())
    }

    /// True once the files are read and the part can be added.
    pub fn is_read(&self) -> bool {
        self.read.is_some()
    }

    /// Forgets a finished reading and its message (the form changed).
    pub fn forget_reading(&mut self) {
        self.read = None;
        self.message = None;
    }
}
