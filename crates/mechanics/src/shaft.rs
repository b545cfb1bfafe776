//! Round shafts, solid or hollow, under torque, bending in two planes and axial force.

use serde::{Deserialize, Serialize};

use crate::error::{MechanicsError, Result, positive_dimension};
use crate::load::{LoadComponent, LoadVector};
use crate::material::Material;
use crate::section::{Section, checked};
use crate::section_resultants::{Resultants, unit_strains};
use crate::surface::{FaceExtent, SurfacePoint};
use crate::surface_state::SurfaceState;

/// A round shaft along x from 0 to `length_m`; loads are constant along it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Shaft {
    /// Outer diameter, metres.
    pub outer_diameter_m: f64,
    /// Bore diameter, metres (0 for a solid shaft).
    pub inner_diameter_m: f64,
    /// Length shown and gaugeable, metres.
    pub length_m: f64,
    /// Material.
    pub material: Material,
}

/// Components a shaft carries.
pub const SHAFT_COMPONENTS: &[LoadComponent] = &[
    LoadComponent::Torque,
    LoadComponent::BendingMomentY,
    LoadComponent::BendingMomentZ,
    LoadComponent::AxialForce,
    LoadComponent::TemperatureChange,
];

impl Shaft {
    /// A shaft, checked.
    pub fn new(
        outer_diameter_m: f64,
        inner_diameter_m: f64,
        length_m: f64,
        material: Material,
    ) -> Result<Self> {
        let shaft = Self {
            outer_diameter_m,
            inner_diameter_m,
            length_m,
            material,
        };
        shaft.validate()?;
        Ok(shaft)
    }

    /// The shaft's cross-section.
    pub fn section(&self) -> Section {
        if self.inner_diameter_m > 0.0 {
            Section::RoundTube {
                outer_diameter_m: self.outer_diameter_m,
                inner_diameter_m: self.inner_diameter_m,
            }
        } else {
            Section::SolidRound {
                diameter_m: self.outer_diameter_m,
            }
        }
    }

    /// Checks dimensions and material.
    pub fn validate(&self) -> Result<()> {
        positive_dimension("shaft length", self.length_m)?;
        if self.inner_diameter_m < 0.0 || !self.inner_diameter_m.is_finite() {
            return Err(MechanicsError::NonPositiveDimension {
                name: "bore diameter (0 for a solid shaft)",
                value_m: self.inner_diameter_m,
            });
        }
        checked(self.section())?;
        self.material.validate()
    }

    /// Outer radius, metres.
    pub fn radius_m(&self) -> f64 {
        self.outer_diameter_m / 2.0
    }

    /// The round face.
    pub fn faces(&self) -> Vec<FaceExtent> {
        vec![FaceExtent::round(self.length_m, self.radius_m())]
    }

    pub(crate) fn state_at(
        &self,
        point: &SurfacePoint,
        loads: &LoadVector,
    ) -> Option<SurfaceState> {
        let unit = unit_strains(&self.section(), &self.material, point.face, point.s_m)?;
        Some(unit.state(&self.resultants(loads), self.thermal_strain(loads)))
    }

    /// Resultants (constant along the shaft).
    pub(crate) fn resultants(&self, loads: &LoadVector) -> Resultants {
        Resultants {
            axial_n: loads[LoadComponent::AxialForce],
            torque_n_m: loads[LoadComponent::Torque],
            moment_y_n_m: loads[LoadComponent::BendingMomentY],
            moment_z_n_m: loads[LoadComponent::BendingMomentZ],
            ..Resultants::default()
        }
    }

    /// Free thermal strain α·ΔT under `loads`.
    pub(crate) fn thermal_strain(&self, loads: &LoadVector) -> f64 {
        self.material.cte_per_c * loads[LoadComponent::TemperatureChange]
    }
}
