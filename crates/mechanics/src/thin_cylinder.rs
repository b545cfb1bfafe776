//! Thin-walled cylindrical pressure vessels (membrane theory).

use serde::{Deserialize, Serialize};

use crate::error::{MechanicsError, Result, inner_smaller, positive_dimension};
use crate::load::{LoadComponent, LoadVector};
use crate::material::Material;
use crate::surface::{Face, FaceExtent, SurfacePoint};
use crate::surface_state::SurfaceState;

/// Whether a cylinder's ends carry the pressure axially. Default: closed.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
pub enum VesselEnds {
    /// Capped ends: the pressure on the caps loads the wall axially.
    #[default]
    Closed,
    /// Open ends (e.g. a pipe run with sliding seals): no axial pressure load.
    Open,
}

/// Smallest mean radius / wall thickness for which the thin-wall formulas are used.
///
/// Common practice; the same threshold of one tenth appears in Young & Budynas, *Roark's
/// Formulas for Stress and Strain*, 7th ed., §13.1 (from memory).
pub const THIN_WALL_MIN_RATIO: f64 = 10.0;

/// Checks mean radius / wall against [`THIN_WALL_MIN_RATIO`]; the error names the
/// thick-walled model to use instead.
pub(crate) fn check_thin_wall(mean_radius_m: f64, wall_m: f64) -> Result<()> {
    let ratio = mean_radius_m / wall_m;
    if ratio < THIN_WALL_MIN_RATIO {
        return Err(MechanicsError::ThinWallOutsideValidity {
            ratio,
            limit: THIN_WALL_MIN_RATIO,
        });
    }
    Ok(())
}

/// A thin-walled cylinder; strains are reported on its outer surface. Local x is axial,
/// local y is hoop.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ThinCylinder {
    /// Outer diameter, metres.
    pub outer_diameter_m: f64,
    /// Wall thickness, metres.
    pub wall_m: f64,
    /// Length of the cylindrical shell shown, metres.
    pub length_m: f64,
    /// End condition.
    pub ends: VesselEnds,
    /// Material.
    pub material: Material,
}

/// Components a thin cylinder carries.
pub const THIN_CYLINDER_COMPONENTS: &[LoadComponent] = &[
    LoadComponent::InternalPressure,
    LoadComponent::TemperatureChange,
];

impl ThinCylinder {
    /// A thin cylinder, checked (including the thin-wall validity limit).
    pub fn new(
        outer_diameter_m: f64,
        wall_m: f64,
        length_m: f64,
        ends: VesselEnds,
        material: Material,
    ) -> Result<Self> {
        let v = Self {
            outer_diameter_m,
            wall_m,
            length_m,
            ends,
            material,
        };
        v.validate()?;
        Ok(v)
    }

    /// Mean radius (D − t)/2, the radius used in the membrane formulas, metres.
    pub fn mean_radius_m(&self) -> f64 {
        (self.outer_diameter_m - self.wall_m) / 2.0
    }

    /// Checks dimensions, material and that r/t is at least [`THIN_WALL_MIN_RATIO`].
    pub fn validate(&self) -> Result<()> {
        positive_dimension("outer diameter", self.outer_diameter_m)?;
        positive_dimension("wall thickness", self.wall_m)?;
        positive_dimension("vessel length", self.length_m)?;
        inner_smaller(
            "twice the wall thickness",
            2.0 * self.wall_m,
            "outer diameter",
            self.outer_diameter_m,
        )?;
        self.material.validate()?;
        check_thin_wall(self.mean_radius_m(), self.wall_m)
    }

    /// Hoop and axial membrane stresses per unit internal pressure: σh = p r / t,
    /// σa = p r / (2t) closed (0 open).
    ///
    /// Source: Gere & Goodno, *Mechanics of Materials*, 7th ed., §8.3, eqs. (8-5), (8-6).
    pub fn stresses_per_pa(&self) -> (f64, f64) {
        let hoop = self.mean_radius_m() / self.wall_m;
        let axial = match self.ends {
            VesselEnds::Closed => hoop / 2.0,
            VesselEnds::Open => 0.0,
        };
        (hoop, axial)
    }

    /// The round outer face.
    pub fn faces(&self) -> Vec<FaceExtent> {
        vec![FaceExtent::round(
            self.length_m,
            self.outer_diameter_m / 2.0,
        )]
    }

    pub(crate) fn state_at(
        &self,
        point: &SurfacePoint,
        loads: &LoadVector,
    ) -> Option<SurfaceState> {
        if point.face != Face::Round {
            return None;
        }
        let p = loads[LoadComponent::InternalPressure];
        let (hoop, axial) = self.stresses_per_pa();
        let state = SurfaceState::from_stress(axial * p, hoop * p, 0.0, &self.material);
        let thermal = self.material.cte_per_c * loads[LoadComponent::TemperatureChange];
        Some(state.with_free_thermal(thermal))
    }
}
