//! A flat plate with a circular hole under remote in-plane stress (Kirsch solution).

use serde::{Deserialize, Serialize};

use crate::error::{Result, inner_smaller, positive_dimension};
use crate::load::{LoadComponent, LoadVector};
use crate::material::Material;
use crate::surface::{Face, FaceExtent, SurfacePoint};
use crate::surface_state::SurfaceState;

/// A plate with a central circular hole. The solution is for an infinite plate; `width_m` and
/// `height_m` bound the region that can be gauged and drawn. Coordinates from the hole centre.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct PlateWithHole {
    /// Hole diameter, metres.
    pub hole_diameter_m: f64,
    /// Plate width along x, metres.
    pub width_m: f64,
    /// Plate height along y, metres.
    pub height_m: f64,
    /// Plate thickness, metres.
    pub thickness_m: f64,
    /// Material.
    pub material: Material,
}

/// Components a plate with a hole carries.
pub const PLATE_COMPONENTS: &[LoadComponent] = &[
    LoadComponent::RemoteStressX,
    LoadComponent::RemoteStressY,
    LoadComponent::RemoteShearXY,
    LoadComponent::TemperatureChange,
];

/// Smallest plate width / hole diameter for which the infinite-plate solution is shown without a
/// warning. Common practice.
pub const PLATE_MIN_WIDTH_RATIO: f64 = 5.0;

/// Polar stresses (σr, σθ, τrθ), Pa, at radius r and polar angle θ from x for a remote
/// uniaxial stress `stress_pa` acting at angle `direction_rad` from x:
///
/// σr = S/2 (1 − a²/r²) + S/2 (1 − 4a²/r² + 3a⁴/r⁴) cos 2θ′,
/// σθ = S/2 (1 + a²/r²) − S/2 (1 + 3a⁴/r⁴) cos 2θ′,
/// τrθ = −S/2 (1 + 2a²/r² − 3a⁴/r⁴) sin 2θ′, with θ′ = θ − direction.
///
/// Source: Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., §35, eqs. (61).
/// ```
/// # use gw_mechanics::plate_with_hole::kirsch_uniaxial;
/// // At the hole edge across the load (θ = 90°) the hoop stress is 3 S.
/// let (_, hoop, _) = kirsch_uniaxial(100e6, 0.0, 0.005, 0.005, std::f64::consts::FRAC_PI_2);
/// assert!((hoop - 300e6).abs() < 1e-3);
/// ```
pub fn kirsch_uniaxial(
    stress_pa: f64,
    direction_rad: f64,
    hole_radius_m: f64,
    r_m: f64,
    theta_rad: f64,
) -> (f64, f64, f64) {
    let q = (hole_radius_m / r_m).powi(2);
    let (s2, c2) = (2.0 * (theta_rad - direction_rad)).sin_cos();
    let h = stress_pa / 2.0;
    let radial = h * (1.0 - q) + h * (1.0 - 4.0 * q + 3.0 * q * q) * c2;
    let hoop = h * (1.0 + q) - h * (1.0 + 3.0 * q * q) * c2;
    let shear = -h * (1.0 + 2.0 * q - 3.0 * q * q) * s2;
    (radial, hoop, shear)
}

impl PlateWithHole {
    /// A plate, checked.
    pub fn new(
        hole_diameter_m: f64,
        width_m: f64,
        height_m: f64,
        thickness_m: f64,
        material: Material,
    ) -> Result<Self> {
        let p = Self {
            hole_diameter_m,
            width_m,
            height_m,
            thickness_m,
            material,
        };
        p.validate()?;
        Ok(p)
    }

    /// Checks dimensions and material.
    pub fn validate(&self) -> Result<()> {
        positive_dimension("hole diameter", self.hole_diameter_m)?;
        positive_dimension("plate width", self.width_m)?;
        positive_dimension("plate height", self.height_m)?;
        positive_dimension("plate thickness", self.thickness_m)?;
        inner_smaller(
            "hole diameter",
            self.hole_diameter_m,
            "smaller plate dimension",
            self.width_m.min(self.height_m),
        )?;
        self.material.validate()
    }

    /// A note when the plate is too small for the infinite-plate solution.
    pub fn warnings(&self) -> Vec<String> {
        let ratio = self.width_m.min(self.height_m) / self.hole_diameter_m;
        if ratio < PLATE_MIN_WIDTH_RATIO {
            vec![format!(
                "plate is only {ratio:.1} hole diameters wide; the infinite-plate solution \
                 underestimates the stress near the hole below {PLATE_MIN_WIDTH_RATIO} (common practice) — \
                 treat the map as indicative or use a finite-width solution"
            )]
        } else {
            Vec::new()
        }
    }

    /// The plate face, with the hole excluded.
    pub fn faces(&self) -> Vec<FaceExtent> {
        vec![FaceExtent {
            face: Face::Plate,
            x_range_m: (-self.width_m / 2.0, self.width_m / 2.0),
            s_range_m: (-self.height_m / 2.0, self.height_m / 2.0),
            wraps: false,
            hole_radius_m: Some(self.hole_diameter_m / 2.0),
        }]
    }

    /// Cartesian stresses (σx, σy, τxy), Pa, at plan point (x, y) for remote stresses.
    pub fn stresses_at(&self, x_m: f64, y_m: f64, loads: &LoadVector) -> (f64, f64, f64) {
        use std::f64::consts::{FRAC_PI_2, FRAC_PI_4};
        let a = self.hole_diameter_m / 2.0;
        let r = x_m.hypot(y_m).max(a);
        let theta = y_m.atan2(x_m);
        let tau = loads[LoadComponent::RemoteShearXY];
        // Pure shear τ is tension τ at 45° plus compression τ at 135°.
        let parts = [
            (loads[LoadComponent::RemoteStressX], 0.0),
            (loads[LoadComponent::RemoteStressY], FRAC_PI_2),
            (tau, FRAC_PI_4),
            (-tau, 3.0 * FRAC_PI_4),
        ];
        let (mut sr, mut st, mut trt) = (0.0, 0.0, 0.0);
        for (s, dir) in parts {
            if s != 0.0 {
                let (a1, b1, c1) = kirsch_uniaxial(s, dir, a, r, theta);
                sr += a1;
                st += b1;
                trt += c1;
            }
        }
        let (sin, cos) = theta.sin_cos();
        let sx = sr * cos * cos + st * sin * sin - 2.0 * trt * sin * cos;
        let sy = sr * sin * sin + st * cos * cos + 2.0 * trt * sin * cos;
        let txy = (sr - st) * sin * cos + trt * (cos * cos - sin * sin);
        (sx, sy, txy)
    }

    pub(crate) fn state_at(&self, point: &SurfacePoint, loads: &LoadVector) -> Option<SurfaceState> {
        if point.face != Face::Plate {
            return None;
        }
        let (sx, sy, txy) = self.stresses_at(point.x_m, point.s_m, loads);
        let thermal = self.material.cte_per_c * loads[LoadComponent::TemperatureChange];
        Some(SurfaceState::from_stress(sx, sy, txy, &self.material).with_free_thermal(thermal))
    }
}
