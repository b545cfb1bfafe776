//! The plane state a gauge sees on a free surface: strains, stresses, transformation,
//! principal values and von Mises stress.
//!
//! Local surface axes: `x` and `y` lie in the surface; angles are measured from x towards y.
//! Shear strain is engineering shear γxy (twice the tensor component).

use std::ops::{Add, Mul, Sub};

use serde::{Deserialize, Serialize};

use crate::material::Material;

/// In-plane strains at a surface point, as plain ratios (m/m).
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SurfaceStrain {
    /// Normal strain along local x.
    pub normal_x: f64,
    /// Normal strain along local y.
    pub normal_y: f64,
    /// Engineering shear strain γxy.
    pub shear_xy: f64,
}

/// Principal values of a plane state.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Principal {
    /// Larger principal value.
    pub max: f64,
    /// Smaller principal value.
    pub min: f64,
    /// Angle from local x to the direction of `max`, radians, in (−π/2, π/2].
    pub angle_rad: f64,
}

impl SurfaceStrain {
    /// A strain state from its three components.
    pub const fn new(normal_x: f64, normal_y: f64, shear_xy: f64) -> Self {
        Self {
            normal_x,
            normal_y,
            shear_xy,
        }
    }

    /// Normal strain in the direction at `angle_rad` from x towards y:
    /// ε(θ) = (εx+εy)/2 + (εx−εy)/2 · cos 2θ + γxy/2 · sin 2θ.
    ///
    /// Source: Gere & Goodno, *Mechanics of Materials*, 7th ed., §7.7 (transformation
    /// equations for plane strain).
    /// ```
    /// # use gw_mechanics::SurfaceStrain;
    /// // Pure shear γ = 200 µε: a 45° grid reads γ/2.
    /// let s = SurfaceStrain::new(0.0, 0.0, 200e-6);
    /// assert!((s.along(std::f64::consts::FRAC_PI_4) - 100e-6).abs() < 1e-15);
    /// ```
    pub fn along(&self, angle_rad: f64) -> f64 {
        let (s2, c2) = (2.0 * angle_rad).sin_cos();
        let mean = (self.normal_x + self.normal_y) / 2.0;
        let half_diff = (self.normal_x - self.normal_y) / 2.0;
        mean + half_diff * c2 + self.shear_xy / 2.0 * s2
    }

    /// The same state expressed in axes rotated by `angle_rad` (new x at that angle).
    pub fn rotated(&self, angle_rad: f64) -> Self {
        let (s2, c2) = (2.0 * angle_rad).sin_cos();
        let half_diff = (self.normal_x - self.normal_y) / 2.0;
        Self {
            normal_x: self.along(angle_rad),
            normal_y: self.along(angle_rad + std::f64::consts::FRAC_PI_2),
            shear_xy: 2.0 * (-half_diff * s2 + self.shear_xy / 2.0 * c2),
        }
    }

    /// Principal strains and the angle of the larger one.
    /// ε1,2 = (εx+εy)/2 ± √(((εx−εy)/2)² + (γxy/2)²), tan 2θp = γxy / (εx − εy).
    pub fn principal(&self) -> Principal {
        principal(self.normal_x, self.normal_y, self.shear_xy / 2.0)
    }

    /// Maximum in-plane engineering shear strain γmax = ε1 − ε2.
    pub fn max_shear(&self) -> f64 {
        let p = self.principal();
        p.max - p.min
    }

    /// True if every component is finite.
    pub fn is_finite(&self) -> bool {
        self.normal_x.is_finite() && self.normal_y.is_finite() && self.shear_xy.is_finite()
    }
}

/// Principal values of a symmetric 2×2 tensor [[a, t], [t, b]].
fn principal(a: f64, b: f64, t: f64) -> Principal {
    let mean = (a + b) / 2.0;
    let half_diff = (a - b) / 2.0;
    let radius = half_diff.hypot(t);
    let mut angle_rad = 0.5 * t.atan2(half_diff);
    if angle_rad <= -std::f64::consts::FRAC_PI_2 {
        angle_rad += std::f64::consts::PI;
    }
    Principal {
        max: mean + radius,
        min: mean - radius,
        angle_rad,
    }
}

impl Add for SurfaceStrain {
    type Output = Self;
    fn add(self, o: Self) -> Self {
        Self::new(
            self.normal_x + o.normal_x,
            self.normal_y + o.normal_y,
            self.shear_xy + o.shear_xy,
        )
    }
}

impl Sub for SurfaceStrain {
    type Output = Self;
    fn sub(self, o: Self) -> Self {
        Self::new(
            self.normal_x - o.normal_x,
            self.normal_y - o.normal_y,
            self.shear_xy - o.shear_xy,
        )
    }
}

impl Mul<f64> for SurfaceStrain {
    type Output = Self;
    fn mul(self, k: f64) -> Self {
        Self::new(self.normal_x * k, self.normal_y * k, self.shear_xy * k)
    }
}

/// In-plane stresses at a surface point, Pa, plus the stress normal to the surface
/// (zero on a free surface, −p under an external pressure p).
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SurfaceStress {
    /// σx, Pa.
    pub normal_x_pa: f64,
    /// σy, Pa.
    pub normal_y_pa: f64,
    /// τxy, Pa.
    pub shear_xy_pa: f64,
    /// σ normal to the surface, Pa.
    pub normal_out_of_plane_pa: f64,
}

impl SurfaceStress {
    /// Principal in-plane stresses and the angle of the larger one.
    pub fn principal(&self) -> Principal {
        principal(self.normal_x_pa, self.normal_y_pa, self.shear_xy_pa)
    }

    /// Von Mises equivalent stress, Pa:
    /// √(½[(σx−σy)² + (σy−σn)² + (σn−σx)²] + 3τxy²).
    ///
    /// Source: Budynas & Nisbett, *Shigley's Mechanical Engineering Design*, 10th ed., eq. (5-14).
    pub fn von_mises_pa(&self) -> f64 {
        let (sx, sy, sn, t) = (
            self.normal_x_pa,
            self.normal_y_pa,
            self.normal_out_of_plane_pa,
            self.shear_xy_pa,
        );
        (0.5 * ((sx - sy).powi(2) + (sy - sn).powi(2) + (sn - sx).powi(2)) + 3.0 * t * t).sqrt()
    }
}

/// Everything a gauge needs to know about one surface point.
///
/// All fields are linear in the loads, so states superpose by addition.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SurfaceState {
    /// Total in-plane strain (what a perfectly compensated gauge reads), m/m.
    pub strain: SurfaceStrain,
    /// The free thermal part of the normal strains, α·ΔT, m/m (it causes no stress).
    pub thermal_strain: f64,
    /// Stress normal to the surface, Pa (zero on a free surface).
    pub normal_stress_pa: f64,
}

impl SurfaceState {
    /// The state of a free surface with the given total strain and no thermal part.
    pub const fn from_strain(strain: SurfaceStrain) -> Self {
        Self {
            strain,
            thermal_strain: 0.0,
            normal_stress_pa: 0.0,
        }
    }

    /// The strain state of a free surface under the given in-plane stresses (plane stress
    /// Hooke's law): εx = (σx − ν σy)/E, εy = (σy − ν σx)/E, γ = τ/G.
    pub fn from_stress(
        normal_x_pa: f64,
        normal_y_pa: f64,
        shear_xy_pa: f64,
        material: &Material,
    ) -> Self {
        let e = material.youngs_modulus_pa;
        let nu = material.poisson_ratio;
        Self::from_strain(SurfaceStrain::new(
            (normal_x_pa - nu * normal_y_pa) / e,
            (normal_y_pa - nu * normal_x_pa) / e,
            shear_xy_pa / material.shear_modulus_pa(),
        ))
    }

    /// The state with a free thermal strain α·ΔT added to both normal strains.
    pub fn with_free_thermal(mut self, thermal_strain: f64) -> Self {
        self.strain.normal_x += thermal_strain;
        self.strain.normal_y += thermal_strain;
        self.thermal_strain += thermal_strain;
        self
    }

    /// The strain that produces stress (total minus free thermal strain).
    pub fn mechanical_strain(&self) -> SurfaceStrain {
        SurfaceStrain::new(
            self.strain.normal_x - self.thermal_strain,
            self.strain.normal_y - self.thermal_strain,
            self.strain.shear_xy,
        )
    }

    /// Stresses from Hooke's law with a known out-of-plane stress σn:
    /// σx = (A + νB)/(1 − ν²), σy = (B + νA)/(1 − ν²) with A = E εx + ν σn, B = E εy + ν σn;
    /// τ = G γ. With σn = 0 this is plane-stress Hooke
    /// (Gere & Goodno, *Mechanics of Materials*, 7th ed., §7.5).
    pub fn stress(&self, material: &Material) -> SurfaceStress {
        let e = material.youngs_modulus_pa;
        let nu = material.poisson_ratio;
        let m = self.mechanical_strain();
        let a = e * m.normal_x + nu * self.normal_stress_pa;
        let b = e * m.normal_y + nu * self.normal_stress_pa;
        SurfaceStress {
            normal_x_pa: (a + nu * b) / (1.0 - nu * nu),
            normal_y_pa: (b + nu * a) / (1.0 - nu * nu),
            shear_xy_pa: material.shear_modulus_pa() * m.shear_xy,
            normal_out_of_plane_pa: self.normal_stress_pa,
        }
    }

    /// Von Mises equivalent stress at this point, Pa.
    pub fn von_mises_pa(&self, material: &Material) -> f64 {
        self.stress(material).von_mises_pa()
    }
}

impl Add for SurfaceState {
    type Output = Self;
    fn add(self, o: Self) -> Self {
        Self {
            strain: self.strain + o.strain,
            thermal_strain: self.thermal_strain + o.thermal_strain,
            normal_stress_pa: self.normal_stress_pa + o.normal_stress_pa,
        }
    }
}

impl Mul<f64> for SurfaceState {
    type Output = Self;
    fn mul(self, k: f64) -> Self {
        Self {
            strain: self.strain * k,
            thermal_strain: self.thermal_strain * k,
            normal_stress_pa: self.normal_stress_pa * k,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn hooke_round_trip() {
        let m = Material::new("m", 200e9, 0.3, 12e-6, 300e6).unwrap();
        let st = SurfaceState::from_stress(100e6, -40e6, 25e6, &m);
        let back = st.stress(&m);
        assert_relative_eq!(back.normal_x_pa, 100e6, max_relative = 1e-12);
        assert_relative_eq!(back.normal_y_pa, -40e6, max_relative = 1e-12);
        assert_relative_eq!(back.shear_xy_pa, 25e6, max_relative = 1e-12);
    }
}
