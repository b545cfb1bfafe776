//! Thin-walled cylindrical pressure vessels (membrane theory).

use serde::{Deserialize, Serialize};

use crate::error::{MechanicsError, Result, inner_smaller, positive_dimension};
use crate::load::{LoadComponent, LoadVector};
use crate::material::Material;
use crate::surface::{Face, FaceExtent, SurfacePoint};
use crate::surface_state::SurfaceState;

/// Whether a cylinder's ends carry the pressure axially. Default: closed.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
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

/// A thin-walled cylinder; strains are reported on its outer surface (thick-wall solution at
/// the outer radius; the membrane stresses stay the design figures). Local x is axial, local y
/// is hoop.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
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

    /// Inner radius, metres.
    pub fn inner_radius_m(&self) -> f64 {
        self.outer_diameter_m / 2.0 - self.wall_m
    }

    /// Hoop and axial stresses per unit internal pressure on the outer surface, where the
    /// gauges sit, from the thick-wall solution at r = ro (σr = 0 there):
    /// σh = 2 ri² / (ro² − ri²), σa = ri² / (ro² − ri²) closed (0 open). Since
    /// ro² − ri² = 2 rm t, the outer hoop stress is the membrane value times (ri/rm)².
    ///
    /// Source: Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., §28, eqs. (46);
    /// Budynas & Nisbett, *Shigley's*, 10th ed., §3-16.
    pub fn outer_surface_stresses_per_pa(&self) -> (f64, f64) {
        let ro = self.outer_diameter_m / 2.0;
        let ri = self.inner_radius_m();
        let k = ri * ri / (ro * ro - ri * ri);
        let axial = match self.ends {
            VesselEnds::Closed => k,
            VesselEnds::Open => 0.0,
        };
        (2.0 * k, axial)
    }

    /// Radial, hoop and axial stresses per unit internal pressure at the bore (thick-wall
    /// solution at r = ri): σr = −1, σh = (ro² + ri²)/(ro² − ri²), σa as on the outside.
    /// Source as [`ThinCylinder::outer_surface_stresses_per_pa`].
    pub fn bore_stresses_per_pa(&self) -> [f64; 3] {
        let ro = self.outer_diameter_m / 2.0;
        let ri = self.inner_radius_m();
        let d = ro * ro - ri * ri;
        [
            -1.0,
            (ro * ro + ri * ri) / d,
            self.outer_surface_stresses_per_pa().1,
        ]
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
        // The gauge reads the outer surface, not the membrane (mean-radius) value.
        let (hoop, axial) = self.outer_surface_stresses_per_pa();
        let state = SurfaceState::from_stress(axial * p, hoop * p, 0.0, &self.material);
        let thermal = self.material.cte_per_c * loads[LoadComponent::TemperatureChange];
        Some(state.with_free_thermal(thermal))
    }
}
