//! Thin-walled spherical pressure vessels (membrane theory).

use serde::{Deserialize, Serialize};

use crate::error::{Result, inner_smaller, positive_dimension};
use crate::load::{LoadComponent, LoadVector};
use crate::material::Material;
use crate::surface::{Face, FaceExtent, SurfacePoint};
use crate::surface_state::SurfaceState;
use crate::thin_cylinder::check_thin_wall;

/// A thin-walled sphere; strains on the outer surface. Local x is meridional (`x_m` is the
/// meridian arc from the equator), local y is along the parallel.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ThinSphere {
    /// Outer diameter, metres.
    pub outer_diameter_m: f64,
    /// Wall thickness, metres.
    pub wall_m: f64,
    /// Material.
    pub material: Material,
}

/// Components a thin sphere carries.
pub const THIN_SPHERE_COMPONENTS: &[LoadComponent] = &[
    LoadComponent::InternalPressure,
    LoadComponent::TemperatureChange,
];

impl ThinSphere {
    /// A thin sphere, checked.
    pub fn new(outer_diameter_m: f64, wall_m: f64, material: Material) -> Result<Self> {
        let v = Self {
            outer_diameter_m,
            wall_m,
            material,
        };
        v.validate()?;
        Ok(v)
    }

    /// Mean radius, metres.
    pub fn mean_radius_m(&self) -> f64 {
        (self.outer_diameter_m - self.wall_m) / 2.0
    }

    /// Checks dimensions, material and the thin-wall limit.
    pub fn validate(&self) -> Result<()> {
        positive_dimension("outer diameter", self.outer_diameter_m)?;
        positive_dimension("wall thickness", self.wall_m)?;
        inner_smaller(
            "twice the wall thickness",
            2.0 * self.wall_m,
            "outer diameter",
            self.outer_diameter_m,
        )?;
        self.material.validate()?;
        check_thin_wall(self.mean_radius_m(), self.wall_m)
    }

    /// Membrane stress per unit pressure, σ = p r / (2t) in every direction.
    ///
    /// Source: Gere & Goodno, *Mechanics of Materials*, 7th ed., §8.2, eq. (8-1).
    pub fn stress_per_pa(&self) -> f64 {
        self.mean_radius_m() / (2.0 * self.wall_m)
    }

    /// The outer face: meridian arc ±quarter circumference, parallel a full turn.
    pub fn faces(&self) -> Vec<FaceExtent> {
        let quarter = std::f64::consts::FRAC_PI_2 * self.outer_diameter_m / 2.0;
        vec![FaceExtent {
            face: Face::Round,
            x_range_m: (-quarter, quarter),
            s_range_m: (-2.0 * quarter, 2.0 * quarter),
            wraps: true,
            hole_radius_m: None,
        }]
    }

    pub(crate) fn state_at(
        &self,
        point: &SurfacePoint,
        loads: &LoadVector,
    ) -> Option<SurfaceState> {
        if point.face != Face::Round {
            return None;
        }
        let sigma = self.stress_per_pa() * loads[LoadComponent::InternalPressure];
        let state = SurfaceState::from_stress(sigma, sigma, 0.0, &self.material);
        let thermal = self.material.cte_per_c * loads[LoadComponent::TemperatureChange];
        Some(state.with_free_thermal(thermal))
    }
}
