//! A surface state given by the user for a case solved elsewhere (a finite-element model, a
//! handbook case), uniform over a rectangular patch.

use serde::{Deserialize, Serialize};

use crate::error::{Result, at_most, finite, positive_dimension};
use crate::load::{LoadComponent, LoadVector};
use crate::material::Material;
use crate::surface::{Face, FaceExtent, SurfacePoint};
use crate::surface_state::{SurfaceState, SurfaceStrain};

/// How the user gave the state.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum GivenQuantity {
    /// Strains εx, εy, γxy, m/m.
    Strain(SurfaceStrain),
    /// Plane stresses σx, σy, τxy, Pa.
    Stress {
        normal_x_pa: f64,
        normal_y_pa: f64,
        shear_xy_pa: f64,
    },
}

/// A uniform state on a rectangular patch centred on the origin. It scales with the
/// [`LoadComponent::GivenStateFactor`] component (1 = as given).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct GivenState {
    /// The state at factor 1.
    pub quantity: GivenQuantity,
    /// Patch length along x, metres.
    pub length_m: f64,
    /// Patch width along y, metres.
    pub width_m: f64,
    /// Material of the part.
    pub material: Material,
}

/// Components a given state carries.
pub const GIVEN_STATE_COMPONENTS: &[LoadComponent] = &[
    LoadComponent::GivenStateFactor,
    LoadComponent::TemperatureChange,
];

impl GivenState {
    /// Checks every value.
    pub fn validate(&self) -> Result<()> {
        positive_dimension("patch length", self.length_m)?;
        positive_dimension("patch width", self.width_m)?;
        match self.quantity {
            // A strain of one (100 %) or a stress of 10 GPa is beyond any gauged part.
            GivenQuantity::Strain(s) => {
                for (name, v) in [
                    ("given strain along x", s.normal_x),
                    ("given strain along y", s.normal_y),
                    ("given shear strain", s.shear_xy),
                ] {
                    finite(name, v)?;
                    at_most(name, v, 1.0, "m/m")?;
                }
            }
            GivenQuantity::Stress {
                normal_x_pa,
                normal_y_pa,
                shear_xy_pa,
            } => {
                for (name, v) in [
                    ("given stress along x", normal_x_pa),
                    ("given stress along y", normal_y_pa),
                    ("given shear stress", shear_xy_pa),
                ] {
                    finite(name, v)?;
                    at_most(name, v, 1e10, "Pa")?;
                }
            }
        }
        self.material.validate()
    }

    /// The state at factor 1 (no temperature change).
    pub fn unit_state(&self) -> SurfaceState {
        match self.quantity {
            GivenQuantity::Strain(s) => SurfaceState::from_strain(s),
            GivenQuantity::Stress {
                normal_x_pa,
                normal_y_pa,
                shear_xy_pa,
            } => SurfaceState::from_stress(normal_x_pa, normal_y_pa, shear_xy_pa, &self.material),
        }
    }

    /// The patch.
    pub fn faces(&self) -> Vec<FaceExtent> {
        vec![FaceExtent {
            face: Face::Plate,
            x_range_m: (-self.length_m / 2.0, self.length_m / 2.0),
            s_range_m: (-self.width_m / 2.0, self.width_m / 2.0),
            wraps: false,
            hole_radius_m: None,
        }]
    }

    pub(crate) fn state_at(
        &self,
        point: &SurfacePoint,
        loads: &LoadVector,
    ) -> Option<SurfaceState> {
        if point.face != Face::Plate {
            return None;
        }
        let thermal = self.material.cte_per_c * loads[LoadComponent::TemperatureChange];
        Some(
            (self.unit_state() * loads[LoadComponent::GivenStateFactor]).with_free_thermal(thermal),
        )
    }
}
