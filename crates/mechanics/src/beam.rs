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
#[serde(deny_unknown_fields)]
pub enum BeamSupport {
    /// Fixed at x = 0, free at x = L.
    #[default]
    Cantilever,
    /// Pinned at x = 0 and x = L.
    SimplySupported,
}

/// Where a point force acts on a beam, and how much of it.
///
/// The vertical and lateral force components of a load case act at every load point, each
/// multiplied by the point's `multiple`: one end load is one point with multiple 1; four-point
/// bending with a total force P is two points with multiple 0.5; two equal wheel loads of P
/// each are two points with multiple 1.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LoadPoint {
    /// Position along the beam, metres from x = 0.
    pub position_m: f64,
    /// Multiple of the force components applied here.
    pub multiple: f64,
}

impl LoadPoint {
    /// The whole force at one position.
    pub const fn whole(position_m: f64) -> Self {
        Self {
            position_m,
            multiple: 1.0,
        }
    }
}

/// A straight prismatic beam along x from 0 to `length_m`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
#[serde(from = "BeamFile")]
pub struct Beam {
    /// Cross-section.
    pub section: Section,
    /// Material.
    pub material: Material,
    /// Length (span), metres.
    pub length_m: f64,
    /// Supports.
    pub support: BeamSupport,
    /// Where the vertical and lateral point forces act (the free end, `length_m`, for the
    /// usual cantilever end load). At least one.
    pub load_points: Vec<LoadPoint>,
}

/// A beam as files store it: `load_points`, or the single `load_position_m` of earlier files.
#[derive(Deserialize)]
#[serde(deny_unknown_fields)]
struct BeamFile {
    section: Section,
    material: Material,
    length_m: f64,
    support: BeamSupport,
    #[serde(default)]
    load_points: Vec<LoadPoint>,
    #[serde(default, deserialize_with = "present_number")]
    load_position_m: Option<f64>,
}

/// A plain number in the file as `Some` (earlier files wrote `load_position_m: 0.45`).
fn present_number<'de, D: serde::Deserializer<'de>>(
    d: D,
) -> std::result::Result<Option<f64>, D::Error> {
    f64::deserialize(d).map(Some)
}

impl From<BeamFile> for Beam {
    fn from(f: BeamFile) -> Self {
        let mut load_points = f.load_points;
        if let Some(x) = f.load_position_m {
            load_points.insert(0, LoadPoint::whole(x));
        }
        Self {
            section: f.section,
            material: f.material,
            length_m: f.length_m,
            support: f.support,
            load_points,
        }
    }
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
    /// A beam with one point load position, checked.
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
            load_points: vec![LoadPoint::whole(load_position_m)],
        };
        beam.validate()?;
        Ok(beam)
    }

    /// Checks section, material, length and load points.
    pub fn validate(&self) -> Result<()> {
        checked(self.section)?;
        self.material.validate()?;
        positive_dimension("beam length", self.length_m)?;
        if self.load_points.is_empty() {
            return Err(MechanicsError::NoLoadPoint);
        }
        for p in &self.load_points {
            finite("load position", p.position_m)?;
            finite("load multiple", p.multiple)?;
            if !(0.0..=self.length_m).contains(&p.position_m) {
                return Err(MechanicsError::LoadOutsideSpan {
                    position_m: p.position_m,
                    span_m: self.length_m,
                });
            }
        }
        Ok(())
    }

    /// The first load point's position (where a single end or point load acts), metres.
    pub fn first_load_position_m(&self) -> f64 {
        self.load_points
            .first()
            .map(|p| p.position_m)
            .unwrap_or(self.length_m)
    }

    /// Internal resultants on the +x face of a cut at `x_m` under `loads`: the sum of all
    /// external forces and support reactions beyond the cut, and their moments about it.
    pub fn resultants(&self, x_m: f64, loads: &LoadVector) -> Resultants {
        let l = self.length_m;
        let p_down = loads[LoadComponent::VerticalForce];
        let p_lat = loads[LoadComponent::LateralForce];
        let w_down = loads[LoadComponent::UniformLoad];
        let mut r = Resultants {
            axial_n: loads[LoadComponent::AxialForce],
            moment_y_n_m: loads[LoadComponent::BendingMomentY],
            moment_z_n_m: loads[LoadComponent::BendingMomentZ],
            ..Resultants::default()
        };
        // Each force beyond the cut, (position, Fy, Fz) with z up, adds its shear and moment.
        let mut add = |pos: f64, fy: f64, fz: f64| {
            if pos > x_m {
                let arm = pos - x_m;
                r.shear_y_n += fy;
                r.shear_z_n += fz;
                // r × F with r = arm x̂: moment about y is −arm·Fz, about z is arm·Fy.
                r.moment_y_n_m += -arm * fz;
                r.moment_z_n_m += arm * fy;
            }
        };
        let (mut ry, mut rz) = (0.0, 0.0);
        for p in &self.load_points {
            add(p.position_m, p.multiple * p_lat, -p.multiple * p_down);
            // Reaction at the right pin from moments about the left pin.
            rz += p.multiple * p_down * p.position_m / l;
            ry -= p.multiple * p_lat * p.position_m / l;
        }
        if self.support == BeamSupport::SimplySupported {
            add(l, ry, rz + w_down * l / 2.0);
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
