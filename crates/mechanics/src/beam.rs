//! Prismatic beams: cantilever and simply supported, with point, lateral, uniform and axial
//! loads and applied moments, by elementary (Euler–Bernoulli) beam theory.

use serde::{Deserialize, Serialize};

use crate::error::{MechanicsError, Result, finite, positive_dimension};
use crate::load::{LoadComponent, LoadVector};
use crate::material::Material;
use crate::section::{Section, checked};
use crate::section_resultants::{Resultants, face_half_extent_m, section_faces, unit_strains};
use crate::surface::{FaceExtent, SurfacePoint};
use crate::surface_state::SurfaceState;

/// How a beam is supported. Default: [`BeamSupport::Cantilever`].
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
pub enum BeamSupport {
    /// Fixed at x = 0, free at x = L.
    #[default]
    Cantilever,
    /// Pinned at x = 0 and x = L.
    SimplySupported,
}

/// A straight prismatic beam along x from 0 to `length_m`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Beam {
    /// Cross-section.
    pub section: Section,
    /// Material.
    pub material: Material,
    /// Length (span), metres.
    pub length_m: f64,
    /// Supports.
    pub support: BeamSupport,
    /// Where the vertical and lateral point forces act, metres from x = 0
    /// (the free end, `length_m`, for the usual cantilever end load).
    pub load_position_m: f64,
}

/// Components a beam carries.
pub const BEAM_COMPONENTS: &[LoadComponent] = &[
    LoadComponent::AxialForce,
    LoadComponent::VerticalForce,
    LoadComponent::LateralForce,
    LoadComponent::UniformLoad,
    LoadComponent::BendingMomentY,
    LoadComponent::BendingMomentZ,
    LoadComponent::TemperatureChange,
];

impl Beam {
    /// A beam, checked.
    pub fn new(
        section: Section,
        material: Material,
        length_m: f64,
        support: BeamSupport,
        load_position_m: f64,
    ) -> Result<Self> {
        let beam = Self {
            section,
            material,
            length_m,
            support,
            load_position_m,
        };
        beam.validate()?;
        Ok(beam)
    }

    /// Checks section, material, length and load position.
    pub fn validate(&self) -> Result<()> {
        checked(self.section)?;
        self.material.validate()?;
        positive_dimension("beam length", self.length_m)?;
        finite("load position", self.load_position_m)?;
        if !(0.0..=self.length_m).contains(&self.load_position_m) {
            return Err(MechanicsError::LoadOutsideSpan {
                position_m: self.load_position_m,
                span_m: self.length_m,
            });
        }
        Ok(())
    }

    /// Internal resultants on the +x face of a cut at `x_m` under `loads`: the sum of all
    /// external forces and support reactions beyond the cut, and their moments about it.
    pub fn resultants(&self, x_m: f64, loads: &LoadVector) -> Resultants {
        let l = self.length_m;
        let a = self.load_position_m;
        let p_down = loads[LoadComponent::VerticalForce];
        let p_lat = loads[LoadComponent::LateralForce];
        let w_down = loads[LoadComponent::UniformLoad];
        let beyond = |pos: f64| pos > x_m;

        // Forces beyond the cut as (position, Fy, Fz) with z up.
        let mut forces: [(f64, f64, f64); 2] = [(a, p_lat, -p_down), (l, 0.0, 0.0)];
        if self.support == BeamSupport::SimplySupported {
            // Reaction at the right pin from moments about the left pin.
            let rz = p_down * a / l + w_down * l / 2.0;
            let ry = -p_lat * a / l;
            forces[1] = (l, ry, rz);
        }
        let mut r = Resultants {
            axial_n: loads[LoadComponent::AxialForce],
            moment_y_n_m: loads[LoadComponent::BendingMomentY],
            moment_z_n_m: loads[LoadComponent::BendingMomentZ],
            ..Resultants::default()
        };
        for &(pos, fy, fz) in &forces {
            if beyond(pos) {
                let arm = pos - x_m;
                r.shear_y_n += fy;
                r.shear_z_n += fz;
                // r × F with r = arm x̂: moment about y is −arm·Fz, about z is arm·Fy.
                r.moment_y_n_m += -arm * fz;
                r.moment_z_n_m += arm * fy;
            }
        }
        // Uniform load on (x, L]: resultant w(L − x) downward at the middle of that length.
        let rest = (l - x_m).max(0.0);
        r.shear_z_n -= w_down * rest;
        r.moment_y_n_m += w_down * rest * rest / 2.0;
        r
    }

    /// Faces and their extents.
    pub fn faces(&self) -> Vec<FaceExtent> {
        section_faces(&self.section)
            .iter()
            .filter_map(|&face| {
                let half = face_half_extent_m(&self.section, face)?;
                Some(FaceExtent {
                    face,
                    x_range_m: (0.0, self.length_m),
                    s_range_m: (-half, half),
                    wraps: self.section.is_round(),
                    hole_radius_m: None,
                })
            })
            .collect()
    }

    /// Surface state at a located point (see [`crate::Member::state`]).
    pub(crate) fn state_at(
        &self,
        point: &SurfacePoint,
        loads: &LoadVector,
    ) -> Option<SurfaceState> {
        let unit = unit_strains(&self.section, &self.material, point.face, point.s_m)?;
        Some(unit.state(
            &self.resultants(point.x_m, loads),
            self.thermal_strain(loads),
        ))
    }

    /// Free thermal strain α·ΔT under `loads`.
    pub(crate) fn thermal_strain(&self, loads: &LoadVector) -> f64 {
        self.material.cte_per_c * loads[LoadComponent::TemperatureChange]
    }
}
