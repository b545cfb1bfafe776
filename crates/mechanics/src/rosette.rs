//! Strain rosettes both ways: what each element reads for a given state, and the state,
//! principal strains and principal stresses from the readings.

use serde::{Deserialize, Serialize};

use crate::error::{MechanicsError, Result, finite};
use crate::material::Material;
use crate::surface_state::{Principal, SurfaceState, SurfaceStrain};

/// Rosette layouts. Element angles are measured from the rosette's reference direction.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum RosetteKind {
    /// Two grids at 0° and 90°.
    TwoElement90,
    /// Three grids at 0°, 45°, 90°.
    Rectangular,
    /// Three grids at 0°, 60°, 120°.
    Delta,
}

impl RosetteKind {
    /// Element angles, degrees.
    pub fn element_angles_deg(self) -> &'static [f64] {
        match self {
            RosetteKind::TwoElement90 => &[0.0, 90.0],
            RosetteKind::Rectangular => &[0.0, 45.0, 90.0],
            RosetteKind::Delta => &[0.0, 60.0, 120.0],
        }
    }

    /// Plain name.
    pub fn name(self) -> &'static str {
        match self {
            RosetteKind::TwoElement90 => "two-element 90° rosette",
            RosetteKind::Rectangular => "rectangular rosette 0/45/90",
            RosetteKind::Delta => "delta rosette 0/60/120",
        }
    }
}

/// What each element of a rosette reads (ideal grids) when the rosette's 0° element points at
/// `orientation_rad` from local x.
pub fn rosette_readings(
    kind: RosetteKind,
    strain: &SurfaceStrain,
    orientation_rad: f64,
) -> Vec<f64> {
    kind.element_angles_deg()
        .iter()
        .map(|a| strain.along(orientation_rad + a.to_radians()))
        .collect()
}

/// The plane strain state, in the rosette's axes (x along the 0° direction), from three
/// readings at any three distinct directions: solves εᵢ = a + b cos 2θᵢ + c sin 2θᵢ.
pub fn strain_from_three(angles_rad: [f64; 3], readings: [f64; 3]) -> Result<SurfaceStrain> {
    for r in readings {
        finite("rosette reading", r)?;
    }
    let rows: Vec<[f64; 3]> = angles_rad
        .iter()
        .map(|t| [1.0, (2.0 * t).cos(), (2.0 * t).sin()])
        .collect();
    let det3 = |m: [[f64; 3]; 3]| {
        m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1])
            - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0])
            + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0])
    };
    let a = [rows[0], rows[1], rows[2]];
    let d = det3(a);
    if d.abs() < 1e-9 {
        return Err(MechanicsError::SingularRosette {
            angles_deg: angles_rad.map(f64::to_degrees),
        });
    }
    // Cramer's rule, column by column.
    let mut coeffs = [0.0; 3];
    for (k, coeff) in coeffs.iter_mut().enumerate() {
        let mut m = a;
        for (i, row) in m.iter_mut().enumerate() {
            row[k] = readings[i];
        }
        *coeff = det3(m) / d;
    }
    let [mean, half_diff, half_shear] = coeffs;
    Ok(SurfaceStrain::new(
        mean + half_diff,
        mean - half_diff,
        2.0 * half_shear,
    ))
}

/// Everything the analysis of one rosette reading gives.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RosetteResult {
    /// Strain state in the rosette's axes.
    pub strain: SurfaceStrain,
    /// Principal strains; angle from the 0° element to ε1, counter-clockwise.
    pub principal_strain: Principal,
    /// Principal stresses (plane stress Hooke on the principal strains), Pa.
    pub principal_stress_pa: (f64, f64),
    /// Von Mises stress, Pa.
    pub von_mises_pa: f64,
}

/// Principal strains, angle and stresses from a three-element rosette's readings.
///
/// Rectangular: ε1,2 = (ε0+ε90)/2 ± (1/√2)√((ε0−ε45)² + (ε45−ε90)²);
/// delta: ε1,2 = Σ/3 ± (√2/3)√((ε0−ε60)² + (ε60−ε120)² + (ε120−ε0)²)
/// (ASTM E1561, *Analysis of Strain Gage Rosette Data*; Dally & Riley, *Experimental Stress
/// Analysis*, 3rd ed., §9.6). Computed here by the general three-direction solution.
pub fn analyse_rosette(
    kind: RosetteKind,
    readings: &[f64],
    material: &Material,
) -> Result<RosetteResult> {
    let angles = kind.element_angles_deg();
    let (Ok(angles3), Ok(readings3)) =
        (<[f64; 3]>::try_from(angles), <[f64; 3]>::try_from(readings))
    else {
        return Err(MechanicsError::SingularRosette {
            angles_deg: [angles[0], angles.get(1).copied().unwrap_or(0.0), 0.0],
        });
    };
    let strain = strain_from_three(angles3.map(f64::to_radians), readings3)?;
    let principal_strain = strain.principal();
    let e = material.youngs_modulus_pa;
    let nu = material.poisson_ratio;
    let k = e / (1.0 - nu * nu);
    let s1 = k * (principal_strain.max + nu * principal_strain.min);
    let s2 = k * (principal_strain.min + nu * principal_strain.max);
    Ok(RosetteResult {
        strain,
        principal_strain,
        principal_stress_pa: (s1, s2),
        von_mises_pa: SurfaceState::from_strain(strain).von_mises_pa(material),
    })
}
