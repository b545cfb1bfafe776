//! Rosette reduction and transverse-sensitivity correction against published worked examples
//! and against the closed-form rosette equations, an independent formulation of the general
//! three-direction solution the mechanics crate uses.
//!
//! Angle convention: the crate measures angles counter-clockwise from the 0° element (grid a,
//! along local x). The worked examples below measure gauge angles counter-clockwise from the x
//! axis with gauge a on x, and give θp from x to the larger principal strain, so their angles
//! map one to one.
//!
//! Sources:
//! - [Philpot] T. A. Philpot, *MecMovies* companion to *Mechanics of Materials: An Integrated
//!   Learning System*, module M13.6 "Principal stresses from rosette data"
//!   (<https://drbuc2jl8158i.cloudfront.net/shared/Engeneering/mecmovies/ch13/m13_06_s060.html>,
//!   s042, s044, s071) and module M13.5 "Strain measurement with rosettes" (s071–s073).
//! - [Example] "Strain Rossette Example" (delta rosette with transverse-sensitivity
//!   correction), <https://www.scribd.com/doc/254795586/Strain-Rossette-Example>.
//! - [E1561] ASTM E1561, *Analysis of Strain Gage Rosette Data*, and Dally & Riley,
//!   *Experimental Stress Analysis*, 3rd ed., ch. 9 (rosette analysis): closed-form principal
//!   strains, stresses and angle of rectangular and delta rosettes.

use std::f64::consts::{FRAC_PI_2, PI};

use approx::assert_relative_eq;
use gw_mechanics::Material;
use gw_mechanics::SurfaceState;
use gw_mechanics::rosette::{RosetteKind, analyse_rosette, strain_from_three};
use gw_mechanics::transverse::{CALIBRATION_POISSON_RATIO, correct_pair, correct_rosette};

const MICRO: f64 = 1e-6;

fn material(youngs_modulus_pa: f64, poisson_ratio: f64) -> Material {
    Material {
        name: "reference".to_string(),
        youngs_modulus_pa,
        poisson_ratio,
        cte_per_c: 12e-6,
        yield_strength_pa: 300e6,
    }
}

/// Difference of two axis directions, modulo 180° (an axis at θ is the axis at θ + 180°).
fn axis_difference_rad(a: f64, b: f64) -> f64 {
    let d = (a - b).rem_euclid(PI);
    d.min(PI - d)
}

// ---------------------------------------------------------------------------------------
// Published worked examples
// ---------------------------------------------------------------------------------------

#[test]
fn rectangular_rosette_on_aluminium_matches_philpot_m13_6() {
    // [Philpot] M13.6: gauge a at 0° reads +770 µε (εx), gauge c at 90° reads −350 µε (εy),
    // and the reduced shear strain is γxy = +1940 µrad. For a 0/45/90 rosette
    // γxy = 2εb − εa − εc, so gauge b at 45° read (1940 + 770 − 350)/2 = +1180 µε.
    // E = 70 000 MPa, ν = 0.33.
    let al = material(70e9, 0.33);
    let readings = [770.0 * MICRO, 1180.0 * MICRO, -350.0 * MICRO];
    let result = analyse_rosette(RosetteKind::Rectangular, &readings, &al).expect("valid rosette");

    // Reduced strains (s042, s044).
    assert_relative_eq!(result.strain.normal_x, 770.0 * MICRO, epsilon = 1e-12);
    assert_relative_eq!(result.strain.normal_y, -350.0 * MICRO, epsilon = 1e-12);
    assert_relative_eq!(result.strain.shear_xy, 1940.0 * MICRO, epsilon = 1e-12);

    // Principal strains 1330.04 µε and −910.04 µε; tan 2θp = 1.732, θp = 30° (s060).
    let p = result.principal_strain;
    assert_relative_eq!(p.max, 1330.04 * MICRO, epsilon = 0.006 * MICRO);
    assert_relative_eq!(p.min, -910.04 * MICRO, epsilon = 0.006 * MICRO);
    assert_relative_eq!(p.angle_rad.to_degrees(), 30.0, epsilon = 0.01);
    // Maximum in-plane shear strain γmax = εp1 − εp2 = 2240.08 µrad (from the same values).
    assert_relative_eq!(
        result.strain.max_shear(),
        2240.08 * MICRO,
        epsilon = 0.01 * MICRO
    );

    // Principal stresses 80.89 MPa and −37.01 MPa (s071).
    let (s1, s2) = result.principal_stress_pa;
    assert_relative_eq!(s1, 80.89e6, epsilon = 0.006e6);
    assert_relative_eq!(s2, -37.01e6, epsilon = 0.006e6);

    // σy = −7.53 MPa (s042) and τxy = 51.05 MPa with G = 26 316 MPa (s044).
    let stress = SurfaceState::from_strain(result.strain).stress(&al);
    assert_relative_eq!(stress.normal_y_pa, -7.53e6, epsilon = 0.006e6);
    assert_relative_eq!(stress.shear_xy_pa, 51.05e6, epsilon = 0.006e6);
}

#[test]
fn delta_rosette_strain_state_matches_philpot_m13_5() {
    // [Philpot] M13.5: a delta rosette, gauges at 0°, 60°, 120° from x, reads
    // εa = +800 µε, εb = −200 µε, εc = +625 µε. The module reduces gauges b and c to
    //   −200 = 800(0.25) + εy(0.75) + γxy(0.433)
    //   +625 = 800(0.25) + εy(0.75) − γxy(0.433)
    // whose solution is εy = +16.67 µε, γxy = −952.66 µrad (with the rounded 0.433; the
    // exact √3/4 gives −952.63 µrad, hence the 0.05 µrad tolerance).
    let strain = strain_from_three(
        [0.0, 60f64.to_radians(), 120f64.to_radians()],
        [800.0 * MICRO, -200.0 * MICRO, 625.0 * MICRO],
    )
    .expect("valid rosette");
    assert_relative_eq!(strain.normal_x, 800.0 * MICRO, epsilon = 1e-12);
    assert_relative_eq!(strain.normal_y, 16.67 * MICRO, epsilon = 0.005 * MICRO);
    assert_relative_eq!(strain.shear_xy, -952.66 * MICRO, epsilon = 0.05 * MICRO);
}

#[test]
fn delta_rosette_matches_the_published_example() {
    // [Example]: delta rosette, grids at 0°, 60°, 120°, readings 1018, 224, −1527 µε.
    // Published: εy = −1208 µε, γxy = 2022 µrad, ε1 = 1409 µε, ε2 = −1599 µε (whole µε).
    let steel = material(200e9, 0.3);
    let readings = [1018.0 * MICRO, 224.0 * MICRO, -1527.0 * MICRO];
    let result = analyse_rosette(RosetteKind::Delta, &readings, &steel).expect("valid rosette");
    assert_relative_eq!(result.strain.normal_x, 1018.0 * MICRO, epsilon = 1e-12);
    assert_relative_eq!(
        result.strain.normal_y,
        -1208.0 * MICRO,
        epsilon = 0.5 * MICRO
    );
    assert_relative_eq!(
        result.strain.shear_xy,
        2022.0 * MICRO,
        epsilon = 0.5 * MICRO
    );
    assert_relative_eq!(
        result.principal_strain.max,
        1409.0 * MICRO,
        epsilon = 0.5 * MICRO
    );
    assert_relative_eq!(
        result.principal_strain.min,
        -1599.0 * MICRO,
        epsilon = 0.5 * MICRO
    );
}

#[test]
fn delta_rosette_transverse_correction_matches_the_published_example() {
    // [Example]: the same delta rosette, grids with Kt = 0.02 calibrated on ν0 = 0.285.
    // Published corrected readings: 1036.6, 232.3, −1553.7 µε (to 0.1 µε).
    //
    // The example multiplies only the 0° reading by the calibration factor
    // (1 − ν0 Kt)/(1 − Kt²) = 0.99470; its 60° and 120° values are the bracketed terms
    // without it (with it they would be 231.05 and −1545.5 µε). The factor belongs to every
    // grid alike, so the 0° value is compared as published and the other two after taking
    // the factor out.
    assert_relative_eq!(CALIBRATION_POISSON_RATIO, 0.285, epsilon = 1e-15);
    let (kt, nu0) = (0.02, 0.285);
    let corrected = correct_rosette(
        [0.0, 60f64.to_radians(), 120f64.to_radians()],
        [1018.0 * MICRO, 224.0 * MICRO, -1527.0 * MICRO],
        kt,
        nu0,
    )
    .expect("valid rosette");
    let factor = (1.0 - nu0 * kt) / (1.0 - kt * kt);
    assert_relative_eq!(corrected[0], 1036.6 * MICRO, epsilon = 0.05 * MICRO);
    assert_relative_eq!(corrected[1] / factor, 232.3 * MICRO, epsilon = 0.05 * MICRO);
    assert_relative_eq!(
        corrected[2] / factor,
        -1553.7 * MICRO,
        epsilon = 0.05 * MICRO
    );
}

#[test]
fn perpendicular_pair_correction_inverts_the_grid_response_worked_by_hand() {
    // A 0/90 pair on a part strained εa = 1000 µε, εt = −300 µε; Kt = 0.03, ν0 = 0.285.
    // Each grid indicates ε̂ = (ε_own + Kt ε_other) / (1 − ν0 Kt) (Dally & Riley, ch. 6,
    // transverse sensitivity), worked by hand:
    //   1 − ν0 Kt = 1 − 0.00855 = 0.99145
    //   ε̂a = (1000 − 0.03·300) / 0.99145 = 991 / 0.99145 = 999.5461 µε
    //   ε̂t = (−300 + 0.03·1000) / 0.99145 = −270 / 0.99145 = −272.3284 µε
    let indicated_a = 999.5461 * MICRO;
    let indicated_t = -272.3284 * MICRO;
    let (axial, transverse) =
        correct_pair(indicated_a, indicated_t, 0.03, 0.285).expect("valid pair");
    assert_relative_eq!(axial, 1000.0 * MICRO, epsilon = 0.0002 * MICRO);
    assert_relative_eq!(transverse, -300.0 * MICRO, epsilon = 0.0002 * MICRO);
}

#[test]
fn uniaxial_stress_on_the_calibration_material_needs_no_correction() {
    // The gauge factor is measured in uniaxial stress on a material of ν0, so a grid along
    // that stress indicates the true strain (Dally & Riley, ch. 6): εt = −ν0 εa.
    // Its perpendicular partner, though, does not indicate −ν0 εa; correct both and the
    // axial grid stays as read.
    let nu0 = CALIBRATION_POISSON_RATIO;
    let kt = 0.04;
    let axial = 1500.0 * MICRO;
    let transverse = -nu0 * axial;
    let indicated_t = (transverse + kt * axial) / (1.0 - nu0 * kt);
    let (a, t) = correct_pair(axial, indicated_t, kt, nu0).expect("valid pair");
    assert_relative_eq!(a, axial, max_relative = 1e-12);
    assert_relative_eq!(t, transverse, max_relative = 1e-12);
}

// ---------------------------------------------------------------------------------------
// Closed-form rosette equations [E1561] against the general solution, over a grid
// ---------------------------------------------------------------------------------------

/// Principal strains (ε1, ε2), principal stresses (σ1, σ2), angle of ε1 (Pa, radians).
type ClosedForm = ([f64; 2], [f64; 2], f64);

/// Principal strains (ε1, ε2), principal stresses (σ1, σ2) and angle from the 0° element to
/// ε1 (counter-clockwise) of a rectangular 0/45/90 rosette [E1561]:
/// ε1,2 = (ε0+ε90)/2 ± (1/√2)√((ε0−ε45)² + (ε45−ε90)²),
/// σ1,2 = (E/2)[(ε0+ε90)/(1−ν) ± (√2/(1+ν))√((ε0−ε45)² + (ε45−ε90)²)],
/// θ = ½ atan2(2ε45 − ε0 − ε90, ε0 − ε90).
fn rectangular_closed_form(e: [f64; 3], youngs_pa: f64, nu: f64) -> ClosedForm {
    let [e0, e45, e90] = e;
    let root = ((e0 - e45).powi(2) + (e45 - e90).powi(2)).sqrt();
    let strain = [
        (e0 + e90) / 2.0 + root / 2f64.sqrt(),
        (e0 + e90) / 2.0 - root / 2f64.sqrt(),
    ];
    let stress = [
        youngs_pa / 2.0 * ((e0 + e90) / (1.0 - nu) + 2f64.sqrt() / (1.0 + nu) * root),
        youngs_pa / 2.0 * ((e0 + e90) / (1.0 - nu) - 2f64.sqrt() / (1.0 + nu) * root),
    ];
    let angle = 0.5 * (2.0 * e45 - e0 - e90).atan2(e0 - e90);
    (strain, stress, angle)
}

/// The same for a delta 0/60/120 rosette [E1561]:
/// ε1,2 = Σ/3 ± (√2/3)√((ε0−ε60)² + (ε60−ε120)² + (ε120−ε0)²),
/// σ1,2 = (E/3)[Σ/(1−ν) ± (√2/(1+ν))√(…)],
/// θ = ½ atan2(√3(ε60 − ε120), 2ε0 − ε60 − ε120).
fn delta_closed_form(e: [f64; 3], youngs_pa: f64, nu: f64) -> ClosedForm {
    let [e0, e60, e120] = e;
    let sum = e0 + e60 + e120;
    let root = ((e0 - e60).powi(2) + (e60 - e120).powi(2) + (e120 - e0).powi(2)).sqrt();
    let strain = [
        sum / 3.0 + 2f64.sqrt() / 3.0 * root,
        sum / 3.0 - 2f64.sqrt() / 3.0 * root,
    ];
    let stress = [
        youngs_pa / 3.0 * (sum / (1.0 - nu) + 2f64.sqrt() / (1.0 + nu) * root),
        youngs_pa / 3.0 * (sum / (1.0 - nu) - 2f64.sqrt() / (1.0 + nu) * root),
    ];
    let angle = 0.5 * (3f64.sqrt() * (e60 - e120)).atan2(2.0 * e0 - e60 - e120);
    (strain, stress, angle)
}

/// Invented readings, µε: every combination of these for the three elements.
const GRID_MICROSTRAIN: [f64; 7] = [-1800.0, -640.0, -75.0, 0.0, 210.0, 955.0, 2400.0];

fn compare_over_grid(kind: RosetteKind, closed_form: fn([f64; 3], f64, f64) -> ClosedForm) {
    let steel = material(205e9, 0.29);
    let mut compared_angles = 0;
    for a in GRID_MICROSTRAIN {
        for b in GRID_MICROSTRAIN {
            for c in GRID_MICROSTRAIN {
                let readings = [a * MICRO, b * MICRO, c * MICRO];
                let result = analyse_rosette(kind, &readings, &steel).expect("valid rosette");
                let (strain, stress, angle) =
                    closed_form(readings, steel.youngs_modulus_pa, steel.poisson_ratio);
                let p = result.principal_strain;
                let context = format!("{} readings {a}, {b}, {c} µε", kind.name());
                assert!((p.max - strain[0]).abs() < 1e-12, "ε1, {context}");
                assert!((p.min - strain[1]).abs() < 1e-12, "ε2, {context}");
                let (s1, s2) = result.principal_stress_pa;
                assert!((s1 - stress[0]).abs() < 1.0, "σ1, {context}");
                assert!((s2 - stress[1]).abs() < 1.0, "σ2, {context}");
                // The angle is defined only where the principal strains differ.
                if strain[0] - strain[1] > 1.0 * MICRO {
                    assert!(
                        axis_difference_rad(p.angle_rad, angle) < 1e-9,
                        "angle {} against {}, {context}",
                        p.angle_rad.to_degrees(),
                        angle.to_degrees()
                    );
                    assert!(p.angle_rad > -FRAC_PI_2 && p.angle_rad <= FRAC_PI_2);
                    compared_angles += 1;
                }
            }
        }
    }
    assert!(compared_angles > 300, "the grid must exercise the angle");
}

#[test]
fn rectangular_rosette_agrees_with_the_closed_form_over_a_grid() {
    compare_over_grid(RosetteKind::Rectangular, rectangular_closed_form);
}

#[test]
fn delta_rosette_agrees_with_the_closed_form_over_a_grid() {
    compare_over_grid(RosetteKind::Delta, delta_closed_form);
}

#[test]
fn closed_forms_reproduce_the_published_examples() {
    // Guards the closed forms themselves against the worked examples above.
    let (strain, stress, angle) =
        rectangular_closed_form([770.0 * MICRO, 1180.0 * MICRO, -350.0 * MICRO], 70e9, 0.33);
    assert_relative_eq!(strain[0], 1330.04 * MICRO, epsilon = 0.006 * MICRO); // [Philpot] s060
    assert_relative_eq!(strain[1], -910.04 * MICRO, epsilon = 0.006 * MICRO); // [Philpot] s060
    assert_relative_eq!(stress[0], 80.89e6, epsilon = 0.006e6); // [Philpot] s071
    assert_relative_eq!(stress[1], -37.01e6, epsilon = 0.006e6); // [Philpot] s071
    assert_relative_eq!(angle.to_degrees(), 30.0, epsilon = 0.01); // [Philpot] s060
    let (strain, _, _) =
        delta_closed_form([1018.0 * MICRO, 224.0 * MICRO, -1527.0 * MICRO], 200e9, 0.3);
    assert_relative_eq!(strain[0], 1409.0 * MICRO, epsilon = 0.5 * MICRO); // [Example]
    assert_relative_eq!(strain[1], -1599.0 * MICRO, epsilon = 0.5 * MICRO); // [Example]
}
