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
#[serde(deny_unknown_fields)]
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
    ///
    /// The superposition of [`kirsch_uniaxial`] for σx (at 0°), σy (at 90°) and the shear τ
    /// (tension τ at 45° with compression τ at 135°), written out so that no trigonometric
    /// function is needed: with c = cos 2θ, s = sin 2θ, D = (σx − σy) c + 2τ s and
    /// F = (σx − σy) s − 2τ c,
    /// σr = P(1 − q) + D/2 (1 − 4q + 3q²), σθ = P(1 + q) − D/2 (1 + 3q²),
    /// τrθ = −F/2 (1 + 2q − 3q²), with P = (σx + σy)/2 and q = a²/r².
    pub fn stresses_at(&self, x_m: f64, y_m: f64, loads: &LoadVector) -> (f64, f64, f64) {
        let a = self.hole_diameter_m / 2.0;
        let r2 = (x_m * x_m + y_m * y_m).max(a * a);
        let r = r2.sqrt();
        let (cos, sin) = if x_m == 0.0 && y_m == 0.0 {
            (1.0, 0.0)
        } else {
            (x_m / r, y_m / r)
        };
        let (c2, s2) = (cos * cos - sin * sin, 2.0 * sin * cos);
        let sx = loads[LoadComponent::RemoteStressX];
        let sy = loads[LoadComponent::RemoteStressY];
        let tau = loads[LoadComponent::RemoteShearXY];
        let q = a * a / r2;
        let mean = (sx + sy) / 2.0;
        let d = (sx - sy) * c2 + 2.0 * tau * s2;
        let f = (sx - sy) * s2 - 2.0 * tau * c2;
        let sr = mean * (1.0 - q) + d / 2.0 * (1.0 - 4.0 * q + 3.0 * q * q);
        let st = mean * (1.0 + q) - d / 2.0 * (1.0 + 3.0 * q * q);
        let trt = -f / 2.0 * (1.0 + 2.0 * q - 3.0 * q * q);
        let sigma_x = sr * cos * cos + st * sin * sin - 2.0 * trt * sin * cos;
        let sigma_y = sr * sin * sin + st * cos * cos + 2.0 * trt * sin * cos;
        let tau_xy = (sr - st) * sin * cos + trt * (cos * cos - sin * sin);
        (sigma_x, sigma_y, tau_xy)
    }

    pub(crate) fn state_at(
        &self,
        point: &SurfacePoint,
        loads: &LoadVector,
    ) -> Option<SurfaceState> {
        if point.face != Face::Plate {
            return None;
        }
        let (sx, sy, txy) = self.stresses_at(point.x_m, point.s_m, loads);
        let thermal = self.material.cte_per_c * loads[LoadComponent::TemperatureChange];
        Some(SurfaceState::from_stress(sx, sy, txy, &self.material).with_free_thermal(thermal))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;
    use std::f64::consts::{FRAC_PI_2, FRAC_PI_4};

    #[test]
    fn combined_field_equals_superposed_uniaxial_solutions() {
        let m = Material::new("m", 200e9, 0.3, 12e-6, 300e6).unwrap();
        let plate = PlateWithHole::new(0.02, 0.3, 0.3, 0.005, m).unwrap();
        let loads = LoadVector::from_pairs(&[
            (LoadComponent::RemoteStressX, 70e6),
            (LoadComponent::RemoteStressY, -30e6),
            (LoadComponent::RemoteShearXY, 20e6),
        ]);
        for (x, y) in [(0.011, 0.0), (0.0, 0.012), (-0.013, 0.02), (0.03, -0.015)] {
            let (r, t) = (f64::hypot(x, y), f64::atan2(y, x));
            let mut polar = (0.0, 0.0, 0.0);
            for (s, dir) in [
                (70e6, 0.0),
                (-30e6, FRAC_PI_2),
                (20e6, FRAC_PI_4),
                (-20e6, 3.0 * FRAC_PI_4),
            ] {
                let (a, b, c) = kirsch_uniaxial(s, dir, 0.01, r, t);
                polar = (polar.0 + a, polar.1 + b, polar.2 + c);
            }
            let (sr, st, trt) = polar;
            let (sin, cos) = t.sin_cos();
            let (sx, sy, txy) = plate.stresses_at(x, y, &loads);
            assert_relative_eq!(
                sx,
                sr * cos * cos + st * sin * sin - 2.0 * trt * sin * cos,
                epsilon = 1.0
            );
            assert_relative_eq!(
                sy,
                sr * sin * sin + st * cos * cos + 2.0 * trt * sin * cos,
                epsilon = 1.0
            );
            assert_relative_eq!(
                txy,
                (sr - st) * sin * cos + trt * (cos * cos - sin * sin),
                epsilon = 1.0
            );
        }
    }
}
