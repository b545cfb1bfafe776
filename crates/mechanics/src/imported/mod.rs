//! A part described by a finite-element result instead of a closed-form model.
//!
//! The engineer exports, for each unit load (one newton, one newton-metre, one pascal of a
//! named load component), the strain or stress tensor at the nodes of the part's mesh. The
//! outer surface of the mesh is split into faces (smooth patches with no sharp edge inside),
//! each with flat coordinates of its own, so that a gauge is placed, drawn and averaged over
//! its grid as on any other face. Load cases scale and add the unit fields, as for the closed-
//! form models. Reading the files is the plan crate's job; this module holds the geometry and
//! the interpolation.

pub mod mesh;
pub mod units;

pub use mesh::{Cell, CellKind, RawMesh, SurfaceTriangles};
pub use units::{FieldUnits, LengthUnit, ShearConvention, TensorQuantity, TensorUnit};
pub mod field;
pub mod patches;

pub use field::{Located, OutlineEdge, SurfaceField, SurfaceMesh, UnitField, outline_rings};
pub use patches::{Patch, ReferenceAxis};

use std::borrow::Cow;
use std::sync::Arc;

use serde::{Deserialize, Serialize};

use crate::error::{MechanicsError, Result};
use crate::load::LoadComponent;
use crate::material::Material;

/// One imported result: the response of the part to one unit of a load component.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ImportedLoad {
    /// The load component the result is per unit of (1 N, 1 N·m, 1 Pa…).
    pub component: LoadComponent,
    /// What the engineer calls this load, e.g. "pull on the lifting eye".
    #[serde(default)]
    pub name: String,
    /// The result file (`.vtu`, `.vtk` or `.csv`), relative to the project's folder where it
    /// lies inside it.
    pub file: String,
    /// Name of the tensor array in a VTK file (none: the only one there).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub array: Option<String>,
    /// Units as stated when importing (none: as the file states them).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub units: Option<FieldUnits>,
    /// Checksum of the file when it was imported, to tell when it has changed since.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub checksum: Option<String>,
}

/// Whether the field behind an imported part has been read.
#[derive(Debug, Clone, Default)]
pub enum FieldState {
    /// Not read yet (a project just parsed).
    #[default]
    NotLoaded,
    /// Read and ready.
    Loaded(Arc<SurfaceField>),
    /// Reading failed; the message says why and the way out.
    Failed(String),
}

impl PartialEq for FieldState {
    fn eq(&self, other: &Self) -> bool {
        match (self, other) {
            (FieldState::NotLoaded, FieldState::NotLoaded) => true,
            (FieldState::Loaded(a), FieldState::Loaded(b)) => a.digest() == b.digest(),
            (FieldState::Failed(a), FieldState::Failed(b)) => a == b,
            _ => false,
        }
    }
}

/// A part described by imported finite-element results, one per unit load.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ImportedSurface {
    /// Material of the part (the one the results were computed with).
    pub material: Material,
    /// The global axis each face's x axis follows, projected onto the face.
    #[serde(default)]
    pub reference_axis: ReferenceAxis,
    /// The unit-load results.
    pub loads: Vec<ImportedLoad>,
    /// Where the cells come from when the results are CSV files (a VTK mesh or an element
    /// CSV), relative to the project's folder where it lies inside it.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub mesh_file: Option<String>,
    /// The surface and fields as read (not stored in the project).
    #[serde(skip)]
    pub field: FieldState,
    /// What reading the files found worth saying (a file changed since it was imported,
    /// element values averaged to the nodes); not stored.
    #[serde(skip)]
    pub read_notes: Vec<String>,
}

impl ImportedSurface {
    /// The surface, once read.
    pub fn surface(&self) -> Option<&SurfaceField> {
        match &self.field {
            FieldState::Loaded(f) => Some(f),
            _ => None,
        }
    }

    /// The surface, or why it is not there.
    pub fn loaded(&self) -> Result<&SurfaceField> {
        match &self.field {
            FieldState::Loaded(f) => Ok(f),
            FieldState::Failed(why) => Err(MechanicsError::ImportedField {
                detail: why.clone(),
            }),
            FieldState::NotLoaded => Err(MechanicsError::ImportedField {
                detail: "its result files have not been read yet; open the project from its \
                         file, or import the results again"
                    .to_owned(),
            }),
        }
    }

    /// The load components carried: one per imported result (as read, or as named before the
    /// files are read), and a temperature change.
    pub fn components(&self) -> Cow<'static, [LoadComponent]> {
        let mut c: Vec<LoadComponent> = match self.surface() {
            Some(f) => f.components(),
            None => self.loads.iter().map(|l| l.component).collect(),
        };
        c.push(LoadComponent::TemperatureChange);
        Cow::Owned(c)
    }

    /// Checks the material and the list of results. Whether the files were read is asked
    /// separately ([`ImportedSurface::loaded`]): a project whose result files are missing still
    /// opens and can be edited.
    pub fn validate(&self) -> Result<()> {
        self.material.validate()?;
        if self.loads.is_empty() {
            return Err(MechanicsError::ImportedField {
                detail: "no result file is named; import at least one unit-load result".to_owned(),
            });
        }
        Ok(())
    }
}
