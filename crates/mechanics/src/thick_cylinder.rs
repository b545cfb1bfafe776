//! Thick-walled cylinders under internal and external pressure (Lamé).

use serde::{Deserialize, Serialize};

use crate::error::{Result, inner_smaller, positive_dimension};
use crate::load::{LoadComponent, LoadVector};
use crate::material::Material;
use crate::surface::{Face, FaceExtent, SurfacePoint};
use crate::surface_state::{SurfaceState, SurfaceStrain};
use crate::thin_cylinder::VesselEnds;

/// A thick-walled cylinder; gauges sit on the outer surface. Local x axial, local y hoop.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ThickCylinder {
    /// Outer diameter, metres.
    pub outer_diameter_m: f64,
    /// Inner (bore) diameter, metres.
    pub inner_diameter_m: f64,
    /// Length shown, metres.
    pub length_m: f64,
    /// End condition.
    pub ends: VesselEnds,
    /// Material.
    pub material: Material,
}

/// Components a thick cylinder carries.
pub const THICK_CYLINDER_COMPONENTS: &[LoadComponent] = &[
    LoadComponent::InternalPressure,
    LoadComponent::ExternalPressure,
    LoadComponent::TemperatureChange,
];

/// Radial, hoop and axial stresses at one radius, Pa.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LameStresses {
    /// σr, Pa.
    pub radial_pa: f64,
    /// σθ, Pa.
    pub hoop_pa: f64,
    /// σa, Pa.
    pub axial_pa: f64,
}

impl ThickCylinder {
    /// A thick cylinder, checked.
    pub fn new(
        outer_diameter_m: f64,
        inner_diameter_m: f64,
        length_m: f64,
        ends: VesselEnds,
        material: Material,
    ) -> Result<Self> {
        let v = Self {
            outer_diameter_m,
            inner_diameter_m,
            length_m,
            ends,
            material,
        };
        v.validate()?;
        Ok(v)
    }

    /// Checks dimensions and material.
    pub fn validate(&self) -> Result<()> {
        positive_dimension("outer diameter", self.outer_diameter_m)?;
        positive_dimension("inner diameter", self.inner_diameter_m)?;
        positive_dimension("vessel length", self.length_m)?;
        inner_smaller(
            "inner diameter",
            self.inner_diameter_m,
            "outer diameter",
            self.outer_diameter_m,
        )?;
        self.material.validate()
    }

    /// Lamé stresses at radius `r_m` under internal `pi` and external `po` pressure:
    /// σr,θ = (pi ri² − po ro²)/(ro² − ri²) ∓ (pi − po) ri² ro² / ((ro² − ri²) r²);
    /// axial (closed ends) σa = (pi ri² − po ro²)/(ro² − ri²).
    ///
    /// Source: Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., §28, eqs. (46);
    /// Budynas & Nisbett, *Shigley's*, 10th ed., §3-16, eqs. (3-49), (3-50).
    pub fn stresses_at(&self, r_m: f64, pi_pa: f64, po_pa: f64) -> LameStresses {
        let ri = self.inner_diameter_m / 2.0;
        let ro = self.outer_diameter_m / 2.0;
        let d = ro * ro - ri * ri;
        let mean = (pi_pa * ri * ri - po_pa * ro * ro) / d;
        let var = (pi_pa - po_pa) * ri * ri * ro * ro / (d * r_m * r_m);
        LameStresses {
            radial_pa: mean - var,
            hoop_pa: mean + var,
            axial_pa: match self.ends {
                VesselEnds::Closed => mean,
                VesselEnds::Open => 0.0,
            },
        }
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
        let s = self.stresses_at(
            self.outer_diameter_m / 2.0,
            loads[LoadComponent::InternalPressure],
            loads[LoadComponent::ExternalPressure],
        );
        let e = self.material.youngs_modulus_pa;
        let nu = self.material.poisson_ratio;
        // Three-dimensional Hooke: the outer surface carries σr = −po.
        let axial = (s.axial_pa - nu * (s.hoop_pa + s.radial_pa)) / e;
        let hoop = (s.hoop_pa - nu * (s.axial_pa + s.radial_pa)) / e;
        let state = SurfaceState {
            strain: SurfaceStrain::new(axial, hoop, 0.0),
            thermal_strain: 0.0,
            normal_stress_pa: s.radial_pa,
        };
        let thermal = self.material.cte_per_c * loads[LoadComponent::TemperatureChange];
        Some(state.with_free_thermal(thermal))
    }
}
