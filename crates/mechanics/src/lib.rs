//! Strain fields on the surfaces of loaded parts: the mechanics engine of Gaugewright.
//!
//! A gauge bonded to a part sees the plane state of the free surface under it. This crate
//! computes that state for beams, round shafts, thin and thick pressure vessels, plates with
//! a hole and user-given states; transforms it to any direction; averages it over a grid's
//! area; and reduces rosette readings. Pure math: no I/O, no GUI.
//!
//! # Conventions
//! - SI units everywhere: m, Pa, N, N·m, rad, °C (temperature *changes*), strain as a plain
//!   ratio (m/m). Names carry the unit where the type leaves it open (`length_m`, `stress_pa`).
//! - Member axes: x along the member; z up; y horizontal so that x, y, z are right-handed.
//!   Section quantities use y (width) and z (height).
//! - Surface points: a [`Face`] plus `x_m` along the member and `s_m` across the face (arc
//!   length on round faces). The local surface axes x, y and the outward normal are
//!   right-handed, so gauge angles are counter-clockwise seen from outside. See [`surface`].
//! - Shear strain is engineering shear γ (twice the tensor component).
//! - Loads are named [`LoadComponent`]s collected in a [`LoadVector`]. Every surface quantity is
//!   linear in the load vector; [`Member::state_per_unit`] gives the state per unit of one
//!   component, and a load case is their sum.
//! - Invalid input returns a [`MechanicsError`] whose message names the value and the way out.

pub mod beam;
pub mod error;
pub mod given_state;
pub mod grid_average;
pub mod imported;
pub mod load;
pub mod material;
pub mod member;
mod peak_points;
pub mod plate_with_hole;
pub mod rectangle_shear;
pub mod rosette;
pub mod section;
mod section_resultants;
pub mod shaft;
pub mod surface;
pub mod surface_geometry;
pub mod surface_map;
pub mod surface_state;
pub mod thick_cylinder;
pub mod thin_cylinder;
pub mod thin_sphere;
pub mod transverse;

pub use beam::{Beam, BeamSupport, LoadPoint};
pub use error::{MechanicsError, Result};
pub use given_state::{GivenQuantity, GivenState};
pub use grid_average::{GridFootprint, QuadratureOrder, grid_average_state, grid_average_strain};
pub use load::{LoadComponent, LoadVector};
pub use material::{MATERIAL_LIBRARY, Material, library_material};
pub use member::{Member, PeakLocation};
pub use plate_with_hole::PlateWithHole;
pub use rectangle_shear::RectangleShear;
pub use rosette::{RosetteKind, analyse_rosette, rosette_readings, strain_from_three};
pub use section::Section;
pub use section_resultants::Resultants;
pub use shaft::Shaft;
pub use surface::{Face, FaceExtent, SurfacePoint};
pub use surface_geometry::SurfaceFrame;
pub use surface_map::{
    Sampling, StrainBasis, SurfaceMap, SurfaceQuantity, quantity_of, sample_face, surface_map,
};
pub use surface_state::{Principal, SurfaceState, SurfaceStrain, SurfaceStress};
pub use thick_cylinder::ThickCylinder;
pub use thin_cylinder::{ThinCylinder, VesselEnds};
pub use thin_sphere::ThinSphere;
