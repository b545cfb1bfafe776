//! Transverse sensitivity of a grid and its correction.
//!
//! A grid responds to ΔR/R = Sa (εa + Kt εt). Its gauge factor is measured in a uniaxial
//! stress field on a material of Poisson's ratio ν0, so the instrument indicates
//! ε̂ = (εa + Kt εt) / (1 − ν0 Kt).
//! Source: Dally & Riley, *Experimental Stress Analysis*, 3rd ed., §6.5 (transverse
//! sensitivity), from memory for the section number.

use crate::error::{MechanicsError, Result, finite};

/// Poisson's ratio of the gauge-factor calibration specimen, 0.285 (a steel beam), as
/// specified for gauge-factor calibration in ASTM E251 (from memory).
pub const CALIBRATION_POISSON_RATIO: f64 = 0.285;

fn check_kt(kt: f64) -> Result<()> {
    finite("transverse sensitivity", kt)?;
    if kt.abs() >= 1.0 {
        return Err(MechanicsError::TransverseSensitivityOutOfRange { value: kt });
    }
    Ok(())
}

/// The strain a grid indicates for true axial and transverse strains:
/// ε̂ = (εa + Kt εt) / (1 − ν0 Kt).
/// ```
/// # use gw_mechanics::transverse::*;
/// // In the calibration field itself (εt = −ν0 εa) the indication is exact.
/// let e = indicated_strain(1000e-6, -CALIBRATION_POISSON_RATIO * 1000e-6, 0.03, CALIBRATION_POISSON_RATIO).unwrap();
/// assert!((e - 1000e-6).abs() < 1e-15);
/// ```
pub fn indicated_strain(
    axial: f64,
    transverse: f64,
    kt: f64,
    calibration_poisson: f64,
) -> Result<f64> {
    check_kt(kt)?;
    Ok((axial + kt * transverse) / (1.0 - calibration_poisson * kt))
}

/// True strains along two perpendicular grids from their indications:
/// εa = (1 − ν0 Kt)(ε̂a − Kt ε̂t) / (1 − Kt²), and likewise for εt.
pub fn correct_pair(
    indicated_a: f64,
    indicated_t: f64,
    kt: f64,
    calibration_poisson: f64,
) -> Result<(f64, f64)> {
    check_kt(kt)?;
    let c = (1.0 - calibration_poisson * kt) / (1.0 - kt * kt);
    Ok((
        c * (indicated_a - kt * indicated_t),
        c * (indicated_t - kt * indicated_a),
    ))
}

/// Corrects the three readings of a rosette (any three distinct directions, radians, all grids
/// with the same Kt). The indication perpendicular to each grid follows from the invariant
/// ε(θ) + ε(θ + 90°) = εx + εy, which the indicated field obeys too because it is linear.
pub fn correct_rosette(
    angles_rad: [f64; 3],
    indicated: [f64; 3],
    kt: f64,
    calibration_poisson: f64,
) -> Result<[f64; 3]> {
    check_kt(kt)?;
    let field = crate::rosette::strain_from_three(angles_rad, indicated)?;
    let sum = field.normal_x + field.normal_y;
    let mut out = [0.0; 3];
    for (o, &e) in out.iter_mut().zip(&indicated) {
        *o = correct_pair(e, sum - e, kt, calibration_poisson)?.0;
    }
    Ok(out)
}
