//! Thin-walled spherical pressure vessels (membrane theory).

use serde::{Deserialize, Serialize};

use crate::error::{Result, inner_smaller, positive_dimension};
use crate::load::{LoadComponent, LoadVector};
use crate::material::Material;
use crate::surface::{Face, FaceExtent, SurfacePoint};
use crate::surface_state::SurfaceState;
use crate::thin_cylinder::check_thin_wall;

/// A thin-walled sphere; strains on the outer surface (thick-sphere solution at the outer
/// radius; the membrane stress stays the design figure). Local x is meridional (`x_m` is the
/// meridian arc from the equator), local y is along the parallel.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
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

    /// Inner radius, metres.
    pub fn inner_radius_m(&self) -> f64 {
        self.outer_diameter_m / 2.0 - self.wall_m
    }

    /// Tangential stress per unit internal pressure at radius r of the thick-walled sphere:
    /// σt = ri³ (ro³ + 2 r³) / (2 r³ (ro³ − ri³)); on the outer surface (where the gauges sit,
    /// σr = 0) it is 3 ri³ / (2 (ro³ − ri³)), at the bore (ro³ + 2 ri³) / (2 (ro³ − ri³)) with
    /// σr = −1.
    ///
    /// Source: Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., §137, eqs. (200);
    /// Budynas & Nisbett, *Shigley's*, 10th ed., §3-16 (thick-walled spheres).
    pub fn tangential_stress_per_pa(&self, r_m: f64) -> f64 {
        let ro = self.outer_diameter_m / 2.0;
        let ri = self.inner_radius_m();
        ri.powi(3) * (ro.powi(3) + 2.0 * r_m.powi(3))
            / (2.0 * r_m.powi(3) * (ro.powi(3) - ri.powi(3)))
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
        // The gauge reads the outer surface, not the membrane (mean-radius) value.
        let sigma = self.tangential_stress_per_pa(self.outer_diameter_m / 2.0)
            * loads[LoadComponent::InternalPressure];
        let state = SurfaceState::from_stress(sigma, sigma, 0.0, &self.material);
        let thermal = self.material.cte_per_c * loads[LoadComponent::TemperatureChange];
        Some(state.with_free_thermal(thermal))
    }
}
