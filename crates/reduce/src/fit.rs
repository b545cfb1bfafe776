//! Least-squares polynomial fits with the uncertainty of each coefficient, as used for the
//! in-place calibration of a bridge: readings against known loads.
//!
//! The fit is solved by a QR factorisation of the column-scaled Vandermonde matrix rather than
//! by the normal equations: forming XᵀX squares the condition number, and with loads in
//! newtons (x up to millions, x² up to 10¹³) the normal equations lose most of their digits.

use nalgebra::{DMatrix, DVector};
use thiserror::Error;

/// A fitted polynomial y ≈ Σ coefficients[k] · x^k, k = 0..=degree, with the statistics of the
/// fit.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct PolynomialFit {
    /// Estimates b0, b1, … in units of y / x^k.
    pub coefficients: Vec<f64>,
    /// Standard deviation of each estimate, same order and units as `coefficients`.
    pub standard_errors: Vec<f64>,
    /// Residual standard deviation √(SSE / (n − p)), in units of y.
    pub residual_sd: f64,
    /// Coefficient of determination 1 − SSE / SST. Zero when the readings do not vary at all
    /// (SST = 0): nothing is left to explain, and a flat reading is no sign of a good bridge.
    pub r_squared: f64,
    /// Residual degrees of freedom n − p (points less coefficients).
    pub degrees_of_freedom: usize,
}

impl PolynomialFit {
    /// The fitted value at `x` (Horner's scheme).
    pub fn value_at(&self, x: f64) -> f64 {
        self.coefficients
            .iter()
            .rev()
            .fold(0.0, |acc, b| acc * x + b)
    }

    /// The coefficient of x, b1 (zero for a fit of degree 0).
    pub fn slope(&self) -> f64 {
        self.coefficients.get(1).copied().unwrap_or(0.0)
    }

    /// The constant term, b0.
    pub fn intercept(&self) -> f64 {
        self.coefficients.first().copied().unwrap_or(0.0)
    }
}

/// Why a fit could not be made.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum FitError {
    /// Loads and readings are not paired one to one.
    #[error("{x} loads but {y} readings: give one reading for each load")]
    LengthMismatch { x: usize, y: usize },

    /// Not enough points for the requested degree with at least one degree of freedom left.
    #[error(
        "{got} points are too few: this fit needs at least {needed}; apply more load steps or lower the degree"
    )]
    TooFewPoints { needed: usize, got: usize },

    /// A load or a reading is NaN or infinite.
    #[error(
        "point {} (counting from 1) has a load or reading that is not a finite number; correct or remove it",
        .index + 1
    )]
    NotFinite {
        /// Position of the point, counting from 0.
        index: usize,
    },

    /// Every point was taken at the same load, so no slope can be found.
    #[error("the loads do not vary: apply at least two different loads")]
    AllSameX,

    /// Some loads differ, but fewer distinct loads than the degree needs.
    #[error(
        "{got} different loads are too few for this degree, which needs {needed}; apply more distinct loads or lower the degree"
    )]
    TooFewDistinctX { needed: usize, got: usize },

    /// The loads differ so little against their size that the fit cannot be resolved.
    #[error(
        "the loads are too close together for a fit of degree {degree}: spread them over the range or lower the degree"
    )]
    IllConditioned { degree: usize },
}

/// Fits y ≈ Σ b_k x^k, k = 0..=degree, by ordinary least squares, with the standard deviation
/// of each estimate from s²(XᵀX)⁻¹, s² = SSE / (n − p).
///
/// Source: ordinary least squares as in Draper & Smith, *Applied Regression Analysis*, 3rd ed.,
/// ch. 5 (matrix form), and the NIST/SEMATECH e-Handbook of Statistical Methods, §4.1.4.1
/// (linear least squares). Solved by Householder QR of the Vandermonde matrix with each column
/// scaled to unit norm; (XᵀX)⁻¹ comes from R⁻¹R⁻ᵀ and is then unscaled.
///
/// Needs at least degree + 2 points (one degree of freedom for the residual) taken at
/// degree + 1 or more different loads.
/// ```
/// # use gw_reduce::fit::fit_polynomial;
/// // Readings on the exact parabola y = 1 + 2x + 3x² are fitted exactly.
/// let x = [0.0, 1.0, 2.0, 3.0, 4.0];
/// let y: Vec<f64> = x.iter().map(|x| 1.0 + 2.0 * x + 3.0 * x * x).collect();
/// let fit = fit_polynomial(&x, &y, 2).unwrap();
/// assert!((fit.coefficients[2] - 3.0).abs() < 1e-12);
/// assert!(fit.residual_sd < 1e-12);
/// assert_eq!(fit.degrees_of_freedom, 2);
/// ```
pub fn fit_polynomial(x: &[f64], y: &[f64], degree: usize) -> Result<PolynomialFit, FitError> {
    check_inputs(x, y, degree)?;
    let n = x.len();
    let p = degree + 1;

    // Vandermonde matrix with each column scaled to unit norm.
    let mut design = DMatrix::from_fn(n, p, |i, k| x[i].powi(k as i32));
    let mut column_norms = Vec::with_capacity(p);
    for mut column in design.column_iter_mut() {
        let norm = column.norm();
        if norm == 0.0 || !norm.is_finite() {
            return Err(FitError::IllConditioned { degree });
        }
        column /= norm;
        column_norms.push(norm);
    }
    let observations = DVector::from_column_slice(y);

    let qr = design.clone().qr();
    let r = qr.r();
    let largest_pivot = r.diagonal().amax();
    // A pivot this small against the largest means the columns are numerically dependent.
    if r.diagonal()
        .iter()
        .any(|d| d.abs() <= largest_pivot * f64::EPSILON * n as f64)
    {
        return Err(FitError::IllConditioned { degree });
    }
    let q_t_y = qr.q().transpose() * &observations;
    let Some(scaled_coefficients) = r.solve_upper_triangular(&q_t_y) else {
        return Err(FitError::IllConditioned { degree });
    };
    let Some(r_inverse) = r.solve_upper_triangular(&DMatrix::identity(p, p)) else {
        return Err(FitError::IllConditioned { degree });
    };

    let residuals = &observations - &design * &scaled_coefficients;
    let sse = residuals.norm_squared();
    let degrees_of_freedom = n - p;
    let variance = sse / degrees_of_freedom as f64;
    let mean_y = y.iter().sum::<f64>() / n as f64;
    let sst: f64 = y.iter().map(|v| (v - mean_y).powi(2)).sum();
    let r_squared = if sst > 0.0 { 1.0 - sse / sst } else { 0.0 };

    // Unscale: b_k = c_k / d_k and var(b_k) = s² [(RᵀR)⁻¹]_kk / d_k², where the diagonal of
    // (RᵀR)⁻¹ = R⁻¹R⁻ᵀ is the squared norm of each row of R⁻¹.
    let coefficients = scaled_coefficients
        .iter()
        .zip(&column_norms)
        .map(|(c, d)| c / d)
        .collect();
    let standard_errors = r_inverse
        .row_iter()
        .zip(&column_norms)
        .map(|(row, d)| (variance * row.norm_squared()).sqrt() / d)
        .collect();

    Ok(PolynomialFit {
        coefficients,
        standard_errors,
        residual_sd: variance.sqrt(),
        r_squared,
        degrees_of_freedom,
    })
}

/// The inputs a fit of `degree` needs: as many x as y, finite, enough points and enough
/// distinct x.
fn check_inputs(x: &[f64], y: &[f64], degree: usize) -> Result<(), FitError> {
    if x.len() != y.len() {
        return Err(FitError::LengthMismatch {
            x: x.len(),
            y: y.len(),
        });
    }
    let n = x.len();
    let p = degree + 1;
    if n < p + 1 {
        return Err(FitError::TooFewPoints {
            needed: p + 1,
            got: n,
        });
    }
    if let Some(index) = x
        .iter()
        .zip(y)
        .position(|(a, b)| !a.is_finite() || !b.is_finite())
    {
        return Err(FitError::NotFinite { index });
    }
    if p >= 2 {
        let distinct = count_distinct(x);
        if distinct == 1 {
            return Err(FitError::AllSameX);
        }
        if distinct < p {
            return Err(FitError::TooFewDistinctX {
                needed: p,
                got: distinct,
            });
        }
    }
    Ok(())
}

/// Fits a straight line y ≈ b0 + b1 x by ordinary least squares: [`fit_polynomial`] of
/// degree 1.
/// ```
/// # use gw_reduce::fit::fit_line;
/// // Reading in mV/V against load in N, exactly 0.002 mV/V per kN with a 0.01 mV/V offset.
/// let load_n = [0.0, 5e3, 10e3, 15e3];
/// let reading = [0.01, 0.02, 0.03, 0.04];
/// let fit = fit_line(&load_n, &reading).unwrap();
/// assert!((fit.slope() - 2e-6).abs() < 1e-18);
/// assert!((fit.intercept() - 0.01).abs() < 1e-14);
/// ```
pub fn fit_line(x: &[f64], y: &[f64]) -> Result<PolynomialFit, FitError> {
    fit_polynomial(x, y, 1)
}

/// How many different values `values` holds (all finite).
fn count_distinct(values: &[f64]) -> usize {
    let mut sorted = values.to_vec();
    sorted.sort_by(f64::total_cmp);
    sorted.dedup();
    sorted.len()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_degree_zero_fit_is_the_mean_and_its_standard_error() {
        // Mean of 1, 2, 3, 6 is 3; s² = (4 + 1 + 0 + 9)/3 = 14/3; se = √(s²/n).
        let fit = fit_polynomial(&[0.0, 1.0, 2.0, 3.0], &[1.0, 2.0, 3.0, 6.0], 0).unwrap();
        assert!((fit.intercept() - 3.0).abs() < 1e-14);
        assert!((fit.standard_errors[0] - (14.0_f64 / 3.0 / 4.0).sqrt()).abs() < 1e-14);
        assert_eq!(fit.slope(), 0.0);
    }

    #[test]
    fn two_distinct_loads_cannot_carry_a_parabola() {
        let err = fit_polynomial(&[1.0, 1.0, 2.0, 2.0], &[1.0, 1.1, 2.0, 2.1], 2).unwrap_err();
        assert_eq!(err, FitError::TooFewDistinctX { needed: 3, got: 2 });
    }

    #[test]
    fn flat_readings_explain_nothing() {
        let fit = fit_line(&[0.0, 1.0, 2.0], &[5.0, 5.0, 5.0]).unwrap();
        assert_eq!(fit.r_squared, 0.0);
        assert!(fit.slope().abs() < 1e-15);
    }
}
