//! The vessels' outer-surface readings and bore peaks against an independent route: the
//! axisymmetric elasticity equations solved by finite differences (displacement u(r), Navier
//! equation, traction boundary conditions), with no use of the closed-form Lamé or thick-sphere
//! solutions the models use. Second-order differences on 801 nodes agree with the exact
//! solution to about 1e-6 relative, so a tolerance of 1e-4 separates the outer-surface value
//! from the membrane (mean-radius) value, which differs by (rm/ri)² − 1: 4 % to 9 % here.

use gw_mechanics::{
    LoadComponent, LoadVector, Material, Member, PeakLocation, SurfacePoint, ThickCylinder,
    ThinCylinder, ThinSphere, VesselEnds,
};

const E: f64 = 200e9;
const NU: f64 = 0.3;
const N: usize = 800;

fn steel() -> Material {
    Material::new("steel", E, NU, 12e-6, 300e6).unwrap()
}

fn lame_constants() -> (f64, f64) {
    let mu = E / (2.0 * (1.0 + NU));
    let lambda = E * NU / ((1.0 + NU) * (1.0 - 2.0 * NU));
    (lambda, mu)
}

/// Gaussian elimination with partial pivoting for a banded system: every row has its
/// non-zeros within three places of the diagonal (the difference stencil and the one-sided
/// boundary rows).
fn solve(mut a: Vec<Vec<f64>>, mut b: Vec<f64>) -> Vec<f64> {
    const BAND: usize = 3;
    let n = b.len();
    for k in 0..n {
        let last = (k + BAND).min(n - 1);
        let p = (k..=last)
            .max_by(|&i, &j| a[i][k].abs().total_cmp(&a[j][k].abs()))
            .unwrap();
        a.swap(k, p);
        b.swap(k, p);
        let end = (k + 2 * BAND + 1).min(n);
        for i in k + 1..=last {
            let f = a[i][k] / a[k][k];
            let (top, bottom) = a.split_at_mut(i);
            for (x, y) in bottom[0][k..end].iter_mut().zip(&top[k][k..end]) {
                *x -= f * y;
            }
            b[i] -= f * b[k];
        }
    }
    let mut x = vec![0.0; n];
    for k in (0..n).rev() {
        let end = (k + 2 * BAND + 1).min(n);
        let s: f64 = (k + 1..end).map(|j| a[k][j] * x[j]).sum();
        x[k] = (b[k] - s) / a[k][k];
    }
    x
}

/// Radial displacement of a cylinder (uniform axial strain `ez`) or a sphere under an inner
/// radial stress `-p` and a free outer surface. `sphere` switches the Navier equation
/// u'' + (k/r) u' − (k/r²) u = 0 between k = 1 (cylinder) and k = 2 (sphere), with
/// σr = (λ + 2μ) u' + kλ u/r + λ ez.
fn radial_displacement(ri: f64, ro: f64, p: f64, ez: f64, sphere: bool) -> (Vec<f64>, Vec<f64>) {
    let (lambda, mu) = lame_constants();
    let k = if sphere { 2.0 } else { 1.0 };
    let h = (ro - ri) / N as f64;
    let r: Vec<f64> = (0..=N).map(|i| ri + h * i as f64).collect();
    let n = N + 1;
    let mut a = vec![vec![0.0; n]; n];
    let mut b = vec![0.0; n];
    for i in 1..N {
        a[i][i - 1] = 1.0 / (h * h) - k / (2.0 * h * r[i]);
        a[i][i] = -2.0 / (h * h) - k / (r[i] * r[i]);
        a[i][i + 1] = 1.0 / (h * h) + k / (2.0 * h * r[i]);
    }
    // Traction rows with one-sided second-order derivatives.
    let c = lambda + 2.0 * mu;
    a[0][0] = c * (-3.0 / (2.0 * h)) + k * lambda / r[0];
    a[0][1] = c * (4.0 / (2.0 * h));
    a[0][2] = c * (-1.0 / (2.0 * h));
    b[0] = -p - lambda * ez;
    a[N][N] = c * (3.0 / (2.0 * h)) + k * lambda / r[N];
    a[N][N - 1] = c * (-4.0 / (2.0 * h));
    a[N][N - 2] = c * (1.0 / (2.0 * h));
    b[N] = -lambda * ez;
    (r, solve(a, b))
}

/// Stresses (σr, σθ, σz) of a cylinder at node i.
fn cylinder_stresses(r: &[f64], u: &[f64], ez: f64, i: usize) -> [f64; 3] {
    let (lambda, mu) = lame_constants();
    let h = r[1] - r[0];
    let du = if i == 0 {
        (-3.0 * u[0] + 4.0 * u[1] - u[2]) / (2.0 * h)
    } else if i == r.len() - 1 {
        (3.0 * u[i] - 4.0 * u[i - 1] + u[i - 2]) / (2.0 * h)
    } else {
        (u[i + 1] - u[i - 1]) / (2.0 * h)
    };
    let et = u[i] / r[i];
    let tr = du + et + ez;
    [
        lambda * tr + 2.0 * mu * du,
        lambda * tr + 2.0 * mu * et,
        lambda * tr + 2.0 * mu * ez,
    ]
}

/// The cylinder's displacement and axial strain with the ends' axial force balanced: closed
/// ends carry p π ri², open ends nothing. Superposes a pressure solution with ez = 0 and a
/// unit-axial-strain solution without pressure.
fn cylinder(ri: f64, ro: f64, p: f64, closed: bool) -> (Vec<f64>, Vec<f64>, f64) {
    let (r, ua) = radial_displacement(ri, ro, p, 0.0, false);
    let (_, ub) = radial_displacement(ri, ro, 0.0, 1.0, false);
    let force = |u: &[f64], ez: f64| -> f64 {
        // Trapezoid rule for ∫ σz 2π r dr.
        (0..N)
            .map(|i| {
                let f = |j: usize| {
                    cylinder_stresses(&r, u, ez, j)[2] * 2.0 * std::f64::consts::PI * r[j]
                };
                0.5 * (f(i) + f(i + 1)) * (r[i + 1] - r[i])
            })
            .sum()
    };
    let (na, nb) = (force(&ua, 0.0), force(&ub, 1.0));
    let wanted = if closed {
        p * std::f64::consts::PI * ri * ri
    } else {
        0.0
    };
    let ez = (wanted - na) / nb;
    let u = ua.iter().zip(&ub).map(|(a, b)| a + ez * b).collect();
    (r, u, ez)
}

fn pressure(p: f64) -> LoadVector {
    LoadVector::from_pairs(&[(LoadComponent::InternalPressure, p)])
}

#[test]
fn thin_cylinder_reads_the_outer_surface_of_the_thick_wall_solution() {
    for (ends, closed) in [(VesselEnds::Closed, true), (VesselEnds::Open, false)] {
        // The demo's accumulator shell: 220 mm outside, 9 mm wall (rm/t = 11.7).
        let (d, t, p) = (0.22, 0.009, 14e6);
        let m = Member::ThinCylinder(ThinCylinder::new(d, t, 0.8, ends, steel()).unwrap());
        let st = m
            .state(&SurfacePoint::on_round(0.4, 0.3, d / 2.0), &pressure(p))
            .unwrap();
        let (r, u, ez) = cylinder(d / 2.0 - t, d / 2.0, p, closed);
        let hoop = u[N] / r[N];
        assert!(
            (st.strain.normal_y / hoop - 1.0).abs() < 1e-4,
            "{ends:?}: {} vs {hoop}",
            st.strain.normal_y
        );
        assert!(
            (st.strain.normal_x - ez).abs() < 1e-4 * hoop.abs(),
            "{ends:?}: {} vs {ez}",
            st.strain.normal_x
        );
        // The membrane (design) hoop stress, p rm / t, is higher than the outer surface's.
        if let Member::ThinCylinder(c) = &m {
            let membrane = c.stresses_per_pa().0 * p;
            let outer = c.outer_surface_stresses_per_pa().0 * p;
            assert!(membrane > 1.05 * outer, "{membrane} vs {outer}");
        }
    }
}

#[test]
fn thin_sphere_reads_the_outer_surface_of_the_thick_sphere_solution() {
    let (d, t, p) = (0.5, 0.02, 6e6);
    let m = Member::ThinSphere(ThinSphere::new(d, t, steel()).unwrap());
    let st = m
        .state(
            &SurfacePoint::new(gw_mechanics::Face::Round, 0.05, 0.1),
            &pressure(p),
        )
        .unwrap();
    let (r, u) = radial_displacement(d / 2.0 - t, d / 2.0, p, 0.0, true);
    let hoop = u[N] / r[N];
    assert!(
        (st.strain.normal_x / hoop - 1.0).abs() < 1e-4,
        "{} vs {hoop}",
        st.strain.normal_x
    );
    assert!((st.strain.normal_y / hoop - 1.0).abs() < 1e-4);
}

#[test]
fn the_bore_governs_the_peak_stress_of_a_pressurised_cylinder() {
    // Thick cylinder, 100 mm outside, 50 mm bore, 40 MPa inside, closed ends.
    let (ro, ri, p) = (0.05, 0.025, 40e6);
    let m = Member::ThickCylinder(
        ThickCylinder::new(2.0 * ro, 2.0 * ri, 0.3, VesselEnds::Closed, steel()).unwrap(),
    );
    let (peak, at) = m.peak_von_mises(&pressure(p), 20).unwrap();
    let (r, u, ez) = cylinder(ri, ro, p, true);
    let [a, b, c] = cylinder_stresses(&r, &u, ez, 0);
    let expected = (0.5 * ((a - b).powi(2) + (b - c).powi(2) + (c - a).powi(2))).sqrt();
    assert!(matches!(at, PeakLocation::Bore { .. }), "{at:?}");
    assert!((peak / expected - 1.0).abs() < 1e-3, "{peak} vs {expected}");
    // The outer surface alone (what was sampled before) is well below it.
    let [a, b, c] = cylinder_stresses(&r, &u, ez, N);
    let outer = (0.5 * ((a - b).powi(2) + (b - c).powi(2) + (c - a).powi(2))).sqrt();
    assert!(peak > 1.5 * outer);
    // A thin cylinder and a sphere report their bore too.
    let thin = Member::ThinCylinder(
        ThinCylinder::new(0.22, 0.009, 0.8, VesselEnds::Closed, steel()).unwrap(),
    );
    assert!(matches!(
        thin.peak_von_mises(&pressure(14e6), 20).unwrap().1,
        PeakLocation::Bore { .. }
    ));
    let sphere = Member::ThinSphere(ThinSphere::new(0.5, 0.02, steel()).unwrap());
    let (vm, at) = sphere.peak_von_mises(&pressure(6e6), 20).unwrap();
    assert!(matches!(at, PeakLocation::Bore { .. }));
    // Thick sphere at the bore: σr = −p, σt from the finite-difference solution.
    let (r, u) = radial_displacement(0.23, 0.25, 6e6, 0.0, true);
    let (lambda, mu) = lame_constants();
    let h = r[1] - r[0];
    let du = (-3.0 * u[0] + 4.0 * u[1] - u[2]) / (2.0 * h);
    let et = u[0] / r[0];
    let st = lambda * (du + 2.0 * et) + 2.0 * mu * et;
    assert!((vm / (st + 6e6) - 1.0).abs() < 1e-3, "{vm} vs {}", st + 6e6);
}
