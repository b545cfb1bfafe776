//! The least-squares fit against certified reference data and an independent closed form.
//!
//! Reference data: NIST Statistical Reference Datasets (StRD), Linear Regression, datasets
//! "Norris" (lower difficulty, 36 observations, y = B0 + B1·x) and "Pontius" (average
//! difficulty, 40 observations, y = B0 + B1·x + B2·x²), with their certified values
//! (estimates, standard deviations of the estimates, residual standard deviation, R²), given
//! by NIST to 15 significant digits.
//!
//! Tolerances: relative 1e-10 on every certified quantity (estimates, their standard
//! deviations, residual SD) and absolute 1e-12 on R². The certified values are rounded to
//! 15 digits, far below these tolerances.

use approx::assert_relative_eq;
use gw_reduce::fit::{FitError, PolynomialFit, fit_line, fit_polynomial};

/// NIST StRD, Linear Regression, "Norris" (Norris, J., NIST, calibration of ozone monitors):
/// the data, as (y, x) pairs in the order of the dataset file.
const NORRIS_Y_X: [(f64, f64); 36] = [
    (0.1, 0.2),
    (338.8, 337.4),
    (118.1, 118.2),
    (888.0, 884.6),
    (9.2, 10.1),
    (228.1, 226.5),
    (668.5, 666.3),
    (998.5, 996.3),
    (449.1, 448.6),
    (778.9, 777.0),
    (559.2, 558.2),
    (0.3, 0.4),
    (0.1, 0.6),
    (778.1, 775.5),
    (668.8, 666.9),
    (339.3, 338.0),
    (448.9, 447.5),
    (10.8, 11.6),
    (557.7, 556.0),
    (228.3, 228.1),
    (998.0, 995.8),
    (888.8, 887.6),
    (119.6, 120.2),
    (0.3, 0.3),
    (0.6, 0.3),
    (557.6, 556.8),
    (339.3, 339.1),
    (888.0, 887.2),
    (998.5, 999.0),
    (778.9, 779.0),
    (10.2, 11.1),
    (117.6, 118.3),
    (228.9, 229.2),
    (668.4, 669.1),
    (449.2, 448.9),
    (0.2, 0.5),
];

/// NIST StRD, Linear Regression, "Pontius" (Pontius, P., NIST, load cell calibration): the
/// data, as (y, x) pairs in the order of the dataset file; x is the applied load.
const PONTIUS_Y_X: [(f64, f64); 40] = [
    (0.11019, 150000.0),
    (0.21956, 300000.0),
    (0.32949, 450000.0),
    (0.43899, 600000.0),
    (0.54803, 750000.0),
    (0.65694, 900000.0),
    (0.76562, 1050000.0),
    (0.87487, 1200000.0),
    (0.98292, 1350000.0),
    (1.09146, 1500000.0),
    (1.20001, 1650000.0),
    (1.30822, 1800000.0),
    (1.41599, 1950000.0),
    (1.52399, 2100000.0),
    (1.63194, 2250000.0),
    (1.73947, 2400000.0),
    (1.84646, 2550000.0),
    (1.95392, 2700000.0),
    (2.06128, 2850000.0),
    (2.16844, 3000000.0),
    (0.11052, 150000.0),
    (0.22018, 300000.0),
    (0.32939, 450000.0),
    (0.43886, 600000.0),
    (0.54798, 750000.0),
    (0.65739, 900000.0),
    (0.76596, 1050000.0),
    (0.87474, 1200000.0),
    (0.98300, 1350000.0),
    (1.09150, 1500000.0),
    (1.20004, 1650000.0),
    (1.30818, 1800000.0),
    (1.41613, 1950000.0),
    (1.52408, 2100000.0),
    (1.63159, 2250000.0),
    (1.73965, 2400000.0),
    (1.84696, 2550000.0),
    (1.95445, 2700000.0),
    (2.06177, 2850000.0),
    (2.16829, 3000000.0),
];

fn split(pairs: &[(f64, f64)]) -> (Vec<f64>, Vec<f64>) {
    pairs.iter().map(|&(y, x)| (x, y)).unzip()
}

/// Certified values of one NIST StRD linear-regression dataset.
struct Certified {
    estimates: &'static [f64],
    standard_deviations: &'static [f64],
    residual_sd: f64,
    r_squared: f64,
    degrees_of_freedom: usize,
}

fn assert_matches(fit: &PolynomialFit, certified: &Certified) {
    assert_eq!(fit.coefficients.len(), certified.estimates.len());
    for (k, (&got, &want)) in fit.coefficients.iter().zip(certified.estimates).enumerate() {
        assert!(
            ((got - want) / want).abs() <= 1e-10,
            "estimate B{k}: {got:e} against certified {want:e}"
        );
    }
    for (k, (&got, &want)) in fit
        .standard_errors
        .iter()
        .zip(certified.standard_deviations)
        .enumerate()
    {
        assert!(
            ((got - want) / want).abs() <= 1e-10,
            "standard deviation of B{k}: {got:e} against certified {want:e}"
        );
    }
    assert_relative_eq!(
        fit.residual_sd,
        certified.residual_sd,
        max_relative = 1e-10,
        epsilon = 0.0
    );
    assert!((fit.r_squared - certified.r_squared).abs() <= 1e-12);
    assert_eq!(fit.degrees_of_freedom, certified.degrees_of_freedom);
}

#[test]
fn norris_matches_the_nist_certified_values() {
    let (x, y) = split(&NORRIS_Y_X);
    assert_eq!(x.len(), 36, "Norris has 36 observations (NIST StRD)");
    // NIST StRD, Linear Regression, Norris, certified values.
    let certified = Certified {
        estimates: &[-0.262323073774029, 1.00211681802045],
        standard_deviations: &[0.232818234301152, 0.429796848199937E-03],
        residual_sd: 0.884796396144373,
        r_squared: 0.999993745883712,
        degrees_of_freedom: 34,
    };
    let fit = fit_line(&x, &y).expect("Norris data are valid");
    assert_matches(&fit, &certified);
    assert_relative_eq!(
        fit.intercept(),
        certified.estimates[0],
        max_relative = 1e-10
    );
    assert_relative_eq!(fit.slope(), certified.estimates[1], max_relative = 1e-10);
}

#[test]
fn pontius_matches_the_nist_certified_values() {
    let (x, y) = split(&PONTIUS_Y_X);
    assert_eq!(x.len(), 40, "Pontius has 40 observations (NIST StRD)");
    // NIST StRD, Linear Regression, Pontius, certified values.
    let certified = Certified {
        estimates: &[
            0.673565789473684E-03,
            0.732059160401003E-06,
            -0.316081871345029E-14,
        ],
        standard_deviations: &[
            0.107938612033077E-03,
            0.157817399981659E-09,
            0.486652849992036E-16,
        ],
        residual_sd: 0.205177424076185E-03,
        r_squared: 0.999999900178537,
        degrees_of_freedom: 37,
    };
    let fit = fit_polynomial(&x, &y, 2).expect("Pontius data are valid");
    assert_matches(&fit, &certified);
}

#[test]
fn pontius_fitted_curve_passes_through_the_certified_model() {
    // The fitted curve evaluated at the ends of the load range equals the certified model
    // B0 + B1·x + B2·x² (NIST StRD, Pontius, certified estimates) there.
    let (x, y) = split(&PONTIUS_Y_X);
    let fit = fit_polynomial(&x, &y, 2).expect("Pontius data are valid");
    for load in [150000.0_f64, 3000000.0] {
        let certified = 0.673565789473684E-03 + 0.732059160401003E-06 * load
            - 0.316081871345029E-14 * load * load;
        assert_relative_eq!(fit.value_at(load), certified, max_relative = 1e-12);
    }
}

/// Simple linear regression in closed form, written from the textbook sums:
/// b1 = Sxy / Sxx, b0 = ȳ − b1 x̄, s² = (Syy − b1 Sxy) / (n − 2),
/// se(b1) = s / √Sxx, se(b0) = s √(1/n + x̄² / Sxx), R² = b1 Sxy / Syy.
/// Source: Draper & Smith, *Applied Regression Analysis*, 3rd ed., ch. 1 (fitting a straight
/// line by least squares; precision of the estimated regression).
struct ClosedFormLine {
    intercept: f64,
    slope: f64,
    intercept_se: f64,
    slope_se: f64,
    residual_sd: f64,
    r_squared: f64,
}

fn closed_form_line(x: &[f64], y: &[f64]) -> ClosedFormLine {
    let n = x.len() as f64;
    let mean_x = x.iter().sum::<f64>() / n;
    let mean_y = y.iter().sum::<f64>() / n;
    let sxx: f64 = x.iter().map(|v| (v - mean_x).powi(2)).sum();
    let syy: f64 = y.iter().map(|v| (v - mean_y).powi(2)).sum();
    let sxy: f64 = x
        .iter()
        .zip(y)
        .map(|(a, b)| (a - mean_x) * (b - mean_y))
        .sum();
    let slope = sxy / sxx;
    let s2 = (syy - slope * sxy) / (n - 2.0);
    let s = s2.sqrt();
    ClosedFormLine {
        intercept: mean_y - slope * mean_x,
        slope,
        intercept_se: s * (1.0 / n + mean_x * mean_x / sxx).sqrt(),
        slope_se: s / sxx.sqrt(),
        residual_sd: s,
        r_squared: slope * sxy / syy,
    }
}

#[test]
fn fit_line_agrees_with_the_closed_form_simple_regression() {
    // Invented calibration: load steps in N up and down, readings in mV/V with scatter.
    let load_n = [
        0.0, 2000.0, 4000.0, 6000.0, 8000.0, 10000.0, 8000.0, 4000.0, 0.0,
    ];
    let reading = [
        0.0012, 0.4031, 0.8022, 1.2050, 1.6019, 2.0044, 1.6032, 0.8009, 0.0021,
    ];
    let fit = fit_line(&load_n, &reading).expect("valid calibration");
    let reference = closed_form_line(&load_n, &reading);
    assert_relative_eq!(fit.intercept(), reference.intercept, max_relative = 1e-9);
    assert_relative_eq!(fit.slope(), reference.slope, max_relative = 1e-12);
    assert_relative_eq!(
        fit.standard_errors[0],
        reference.intercept_se,
        max_relative = 1e-9
    );
    assert_relative_eq!(
        fit.standard_errors[1],
        reference.slope_se,
        max_relative = 1e-9
    );
    assert_relative_eq!(fit.residual_sd, reference.residual_sd, max_relative = 1e-9);
    assert_relative_eq!(fit.r_squared, reference.r_squared, epsilon = 1e-12);
    assert_eq!(fit.degrees_of_freedom, 7);
    // The invented data lie near 2.0e-4 mV/V per N: a sanity bound, not a reference.
    assert!((fit.slope() - 2.0e-4).abs() < 1e-6);
}

#[test]
fn length_mismatch_is_reported_with_both_lengths() {
    let err = fit_line(&[0.0, 1.0, 2.0], &[0.0, 1.0]).unwrap_err();
    assert_eq!(err, FitError::LengthMismatch { x: 3, y: 2 });
    assert!(err.to_string().contains("one reading for each load"));
}

#[test]
fn a_single_point_is_too_few() {
    let err = fit_line(&[1.0], &[2.0]).unwrap_err();
    assert_eq!(err, FitError::TooFewPoints { needed: 3, got: 1 });
    // Two points leave no degree of freedom for the residual either.
    let err = fit_line(&[1.0, 2.0], &[2.0, 3.0]).unwrap_err();
    assert_eq!(err, FitError::TooFewPoints { needed: 3, got: 2 });
    let err = fit_line(&[], &[]).unwrap_err();
    assert_eq!(err, FitError::TooFewPoints { needed: 3, got: 0 });
}

#[test]
fn all_loads_equal_is_singular() {
    let err = fit_line(&[5.0, 5.0, 5.0, 5.0], &[1.0, 1.1, 0.9, 1.0]).unwrap_err();
    assert_eq!(err, FitError::AllSameX);
    assert_eq!(
        err.to_string(),
        "the loads do not vary: apply at least two different loads"
    );
}

#[test]
fn a_nan_or_infinite_value_is_located() {
    let err = fit_line(&[0.0, 1.0, f64::NAN, 3.0], &[0.0, 1.0, 2.0, 3.0]).unwrap_err();
    assert_eq!(err, FitError::NotFinite { index: 2 });
    assert!(err.to_string().contains("point 3 (counting from 1)"));
    let err = fit_line(&[0.0, 1.0, 2.0, 3.0], &[0.0, f64::INFINITY, 2.0, 3.0]).unwrap_err();
    assert_eq!(err, FitError::NotFinite { index: 1 });
}
