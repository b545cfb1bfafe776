//! Reference checks against published solutions. Each check names its source beside it.
//! Test inputs are invented; the expected values are evaluated here from the cited formulas.

use std::f64::consts::{FRAC_PI_2, FRAC_PI_4, PI};

use approx::assert_relative_eq;
use gw_mechanics::grid_average::gauss_legendre;
use gw_mechanics::plate_with_hole::kirsch_uniaxial;
use gw_mechanics::transverse::{
    CALIBRATION_POISSON_RATIO, correct_pair, correct_rosette, indicated_strain,
};
use gw_mechanics::*;

const E: f64 = 200e9;
const NU: f64 = 0.3;

fn steel() -> Material {
    Material::new("test steel", E, NU, 12e-6, 350e6).unwrap()
}

fn g() -> f64 {
    E / (2.0 * (1.0 + NU))
}

fn rect(b: f64, h: f64) -> Section {
    Section::Rectangle {
        width_m: b,
        height_m: h,
    }
}

fn loads(pairs: &[(LoadComponent, f64)]) -> LoadVector {
    LoadVector::from_pairs(pairs)
}

fn beam(section: Section, length: f64, support: BeamSupport, at: f64) -> Member {
    Member::Beam(Beam::new(section, steel(), length, support, at).unwrap())
}

fn state(m: &Member, face: Face, x: f64, s: f64, l: &LoadVector) -> SurfaceState {
    m.state(&SurfacePoint::new(face, x, s), l).unwrap()
}

/// Shear strain on the side face of a solid rectangle at the neutral axis per newton of vertical
/// shear: the elasticity value, itself checked in `rectangle_shear.rs`. Checks that use it here
/// are checks of the shear force.
fn side_shear_strain_per_newton(b: f64, h: f64) -> f64 {
    let field = RectangleShear {
        depth_m: h,
        width_m: b,
        poisson_ratio: NU,
    };
    field.face_stress_per_newton(0.0) / g()
}

// ---------------------------------------------------------------- sections

#[test]
fn rectangle_area_and_second_moments() {
    // Gere & Goodno, Mechanics of Materials, 7th ed., Appendix E, case 1: I = b h³ / 12.
    let s = rect(0.03, 0.05);
    assert_relative_eq!(s.area_m2(), 0.03 * 0.05, max_relative = 1e-12);
    assert_relative_eq!(
        s.second_moment_y_m4(),
        0.03 * 0.05f64.powi(3) / 12.0,
        max_relative = 1e-12
    );
    assert_relative_eq!(
        s.second_moment_z_m4(),
        0.05 * 0.03f64.powi(3) / 12.0,
        max_relative = 1e-12
    );
    // Section modulus b h² / 6 (Gere & Goodno §5.5, eq. 5-17).
    assert_relative_eq!(
        s.section_modulus_y_m3(),
        0.03 * 0.05f64.powi(2) / 6.0,
        max_relative = 1e-12
    );
}

#[test]
fn circle_and_tube_second_and_polar_moments() {
    // Gere & Goodno 7th ed., Appendix E, case 9: I = π d⁴ / 64; §3.3, eq. (3-10): Ip = π d⁴ / 32.
    let solid = Section::SolidRound { diameter_m: 0.04 };
    assert_relative_eq!(
        solid.second_moment_y_m4(),
        PI * 0.04f64.powi(4) / 64.0,
        max_relative = 1e-12
    );
    assert_relative_eq!(
        solid.torsion_constant_m4(),
        PI * 0.04f64.powi(4) / 32.0,
        max_relative = 1e-12
    );
    // Gere & Goodno §3.4, eq. (3-17): tube Ip = π (d2⁴ − d1⁴) / 32.
    let tube = Section::RoundTube {
        outer_diameter_m: 0.06,
        inner_diameter_m: 0.045,
    };
    assert_relative_eq!(
        tube.torsion_constant_m4(),
        PI * (0.06f64.powi(4) - 0.045f64.powi(4)) / 32.0,
        max_relative = 1e-12
    );
}

#[test]
fn i_section_second_moment_by_subtraction() {
    // Gere & Goodno 7th ed., §5.6 (wide-flange beam): I = [b h³ − (b − t)(h − 2tf)³] / 12.
    let (b, h, tf, tw) = (0.10, 0.20, 0.012, 0.008);
    let s = Section::IBeam {
        flange_width_m: b,
        depth_m: h,
        flange_thickness_m: tf,
        web_thickness_m: tw,
    };
    let expected = (b * h.powi(3) - (b - tw) * (h - 2.0 * tf).powi(3)) / 12.0;
    assert_relative_eq!(s.second_moment_y_m4(), expected, max_relative = 1e-12);
}

#[test]
fn rectangular_tube_second_moment_by_subtraction() {
    // Gere & Goodno 7th ed., Appendix E: hollow rectangle I = (B H³ − b h³) / 12.
    let s = Section::RectangularTube {
        width_m: 0.05,
        height_m: 0.08,
        wall_m: 0.004,
    };
    let expected = (0.05 * 0.08f64.powi(3) - 0.042 * 0.072f64.powi(3)) / 12.0;
    assert_relative_eq!(s.second_moment_y_m4(), expected, max_relative = 1e-12);
}

#[test]
fn rectangle_torsion_constant_matches_saint_venant_table() {
    // Timoshenko & Goodier, Theory of Elasticity, 3rd ed., §109, table of k1 (J = k1 a b³ for
    // a rectangle a × b, a ≥ b): a/b = 1 → 0.141, 2 → 0.229, 10 → 0.312.
    for (ratio, k1) in [(1.0, 0.141), (2.0, 0.229), (10.0, 0.312)] {
        let b = 0.01;
        let s = rect(b * ratio, b);
        let j = s.torsion_constant_m4();
        assert_relative_eq!(j / (b * ratio * b.powi(3)), k1, max_relative = 0.005);
    }
}

#[test]
fn thin_square_tube_torsion_constant_by_bredt() {
    // Gere & Goodno 7th ed., §3.11, eq. (3-96): J = 4 Am² t / Lm for a thin tube of constant t.
    let s = Section::RectangularTube {
        width_m: 0.1,
        height_m: 0.1,
        wall_m: 0.002,
    };
    let am = 0.098 * 0.098;
    assert_relative_eq!(
        s.torsion_constant_m4(),
        4.0 * am * am * 0.002 / (4.0 * 0.098),
        max_relative = 1e-12
    );
}

// ---------------------------------------------------------------- transverse shear

#[test]
fn rectangle_neutral_axis_shear_is_three_halves_v_over_a_across_the_width_and_more_at_the_face() {
    // Gere & Goodno 7th ed., §5.8, eq. (5-40): the mean across the width at the neutral axis is
    // 3V / (2A). Cantilever: |V| = P everywhere.
    let (b, h, p) = (0.02, 0.06, 5000.0);
    let field = RectangleShear {
        depth_m: h,
        width_m: b,
        poisson_ratio: NU,
    };
    let mean = 1.5 * p / (b * h);
    assert_relative_eq!(
        field.mean_stress_per_newton(0.0) * p,
        mean,
        max_relative = 1e-12
    );
    // On the side face the elasticity solution (Timoshenko & Goodier, Theory of Elasticity, 3rd
    // ed., §124) gives mean · (1 + K [1/3 − (2/π²) Σ 1/(m² cosh(mπh/b))]), K = 2ν/(1 + ν)·(b/h)².
    // Every term of the sum is positive and the sum is below (π²/6)/cosh(πh/b), so the factor
    // lies between 1 + K/3 (1 − 1/cosh(πh/b)) and 1 + K/3: about 1.7 % up for b/h = 1/3.
    let m = beam(rect(b, h), 0.5, BeamSupport::Cantilever, 0.5);
    let st = state(
        &m,
        Face::Front,
        0.25,
        0.0,
        &loads(&[(LoadComponent::VerticalForce, p)]),
    );
    let factor = st.strain.shear_xy.abs() * g() / mean;
    let k = 2.0 * NU / (1.0 + NU) * (b / h).powi(2);
    let upper = 1.0 + k / 3.0;
    let lower = 1.0 + k / 3.0 * (1.0 - 1.0 / (PI * h / b).cosh());
    assert!(
        lower <= factor && factor <= upper,
        "{lower} ≤ {factor} ≤ {upper}"
    );
}

#[test]
fn solid_round_surface_shear_at_the_neutral_axis_is_the_elasticity_value() {
    // Timoshenko & Goodier, Theory of Elasticity, 3rd ed., §124: on the surface of a round bar
    // at the neutral axis τ = (1 + 2ν)/(1 + ν) · V/A, where a gauge sits; the elementary
    // 4V/(3A) (Gere & Goodno 7th ed., §5.9, eq. (5-43)) is the mean across the neutral axis and
    // is 8 % higher at ν = 0.3, so the tolerance of 1e-9 tells them apart.
    let (d, p) = (0.03, 2000.0);
    let m = beam(
        Section::SolidRound { diameter_m: d },
        0.4,
        BeamSupport::Cantilever,
        0.4,
    );
    let r = d / 2.0;
    let st = state(
        &m,
        Face::Round,
        0.2,
        FRAC_PI_2 * r,
        &loads(&[(LoadComponent::VerticalForce, p)]),
    );
    let area = PI * r * r;
    let exact = (1.0 + 2.0 * NU) / (1.0 + NU) * p / area;
    assert_relative_eq!(st.strain.shear_xy.abs(), exact / g(), max_relative = 1e-9);
    assert!((4.0 * p / (3.0 * area) / exact - 1.0) > 0.08);
}

#[test]
fn thick_tube_neutral_axis_shear() {
    // Gere & Goodno 7th ed., §5.9, eq. (5-44): τmax = (4V/3A)(r2² + r2 r1 + r1²)/(r2² + r1²).
    let (r2, r1, p) = (0.03, 0.02, 4000.0);
    let s = Section::RoundTube {
        outer_diameter_m: 2.0 * r2,
        inner_diameter_m: 2.0 * r1,
    };
    let m = beam(s, 0.4, BeamSupport::Cantilever, 0.4);
    let st = state(
        &m,
        Face::Round,
        0.1,
        FRAC_PI_2 * r2,
        &loads(&[(LoadComponent::VerticalForce, p)]),
    );
    let area = PI * (r2 * r2 - r1 * r1);
    let tau = 4.0 * p / (3.0 * area) * (r2 * r2 + r2 * r1 + r1 * r1) / (r2 * r2 + r1 * r1);
    assert_relative_eq!(st.strain.shear_xy.abs(), tau / g(), max_relative = 1e-9);
}

#[test]
fn i_section_web_shear_at_neutral_axis() {
    // Gere & Goodno 7th ed., §5.10, eq. (5-48a): τmax = V/(8 I t)[b(h² − h1²) + t h1²],
    // h1 = clear web height.
    let (b, h, tf, t, v) = (0.1, 0.2, 0.012, 0.008, 20e3);
    let s = Section::IBeam {
        flange_width_m: b,
        depth_m: h,
        flange_thickness_m: tf,
        web_thickness_m: t,
    };
    let m = beam(s, 1.0, BeamSupport::Cantilever, 1.0);
    let st = state(
        &m,
        Face::Front,
        0.5,
        0.0,
        &loads(&[(LoadComponent::VerticalForce, v)]),
    );
    let h1 = h - 2.0 * tf;
    let tau = v / (8.0 * s.second_moment_y_m4() * t) * (b * (h * h - h1 * h1) + t * h1 * h1);
    assert_relative_eq!(st.strain.shear_xy.abs(), tau / g(), max_relative = 1e-9);
}

#[test]
fn shear_web_pair_reads_plus_and_minus_half_gamma() {
    // Gere & Goodno 7th ed., §7.7 (strain transformation): in pure shear ε(±45°) = ±γ/2;
    // γ the surface value at the neutral axis of a side face, where the ±45° pair sits.
    let (b, h, p) = (0.02, 0.06, 5000.0);
    let m = beam(rect(b, h), 0.5, BeamSupport::Cantilever, 0.5);
    let st = state(
        &m,
        Face::Front,
        0.25,
        0.0,
        &loads(&[(LoadComponent::VerticalForce, p)]),
    );
    let gamma = side_shear_strain_per_newton(b, h) * p;
    assert_relative_eq!(
        st.strain.along(FRAC_PI_4).abs(),
        gamma / 2.0,
        max_relative = 1e-9
    );
    assert_relative_eq!(
        st.strain.along(FRAC_PI_4),
        -st.strain.along(-FRAC_PI_4),
        max_relative = 1e-9
    );
}

// ---------------------------------------------------------------- beams

#[test]
fn cantilever_end_load_root_bending_strain() {
    // Young & Budynas, Roark's Formulas, 7th ed., Table 8.1 case 1a: M = −W(l − x);
    // σ = M c / I (Gere & Goodno §5.5, eq. 5-13); ε = σ/E at the top face (tension).
    let (b, h, l, p) = (0.025, 0.05, 0.8, 1500.0);
    let m = beam(rect(b, h), l, BeamSupport::Cantilever, l);
    let st = state(
        &m,
        Face::Top,
        0.0,
        0.0,
        &loads(&[(LoadComponent::VerticalForce, p)]),
    );
    let sigma = 6.0 * p * l / (b * h * h);
    assert_relative_eq!(st.strain.normal_x, sigma / E, max_relative = 1e-12);
    // Transverse strain −ν εx (Gere & Goodno §1.7).
    assert_relative_eq!(st.strain.normal_y, -NU * sigma / E, max_relative = 1e-12);
}

#[test]
fn cantilever_strain_falls_linearly_to_the_free_end() {
    // Roark 7th ed., Table 8.1 case 1a: M(x) = W (l − x); bottom face in compression.
    let (b, h, l, p) = (0.025, 0.05, 0.8, 1500.0);
    let m = beam(rect(b, h), l, BeamSupport::Cantilever, l);
    let x = 0.3;
    let st = state(
        &m,
        Face::Bottom,
        x,
        0.0,
        &loads(&[(LoadComponent::VerticalForce, p)]),
    );
    let sigma = p * (l - x) * (h / 2.0) / (b * h.powi(3) / 12.0);
    assert_relative_eq!(st.strain.normal_x, -sigma / E, max_relative = 1e-12);
}

#[test]
fn cantilever_uniform_load_root_moment() {
    // Roark 7th ed., Table 8.1 case 2a: root moment w l² / 2.
    let (b, h, l, w) = (0.02, 0.04, 0.6, 800.0);
    let m = beam(rect(b, h), l, BeamSupport::Cantilever, l);
    let st = state(
        &m,
        Face::Top,
        0.0,
        0.0,
        &loads(&[(LoadComponent::UniformLoad, w)]),
    );
    let sigma = (w * l * l / 2.0) / (b * h * h / 6.0);
    assert_relative_eq!(st.strain.normal_x, sigma / E, max_relative = 1e-12);
}

#[test]
fn simply_supported_midspan_point_load() {
    // Roark 7th ed., Table 8.1 case 1e: Mmax = W l / 4 under a central load; bottom in tension.
    let (b, h, l, p) = (0.03, 0.06, 1.2, 4000.0);
    let m = beam(rect(b, h), l, BeamSupport::SimplySupported, l / 2.0);
    let st = state(
        &m,
        Face::Bottom,
        l / 2.0,
        0.0,
        &loads(&[(LoadComponent::VerticalForce, p)]),
    );
    let sigma = (p * l / 4.0) / (b * h * h / 6.0);
    assert_relative_eq!(st.strain.normal_x, sigma / E, max_relative = 1e-12);
}

#[test]
fn four_point_bending_has_constant_moment_and_no_shear_between_the_loads() {
    // Gere & Goodno 7th ed., §4.5 and Appendix H, table H-2 case 6 (two equal loads P at a from
    // each support): M = P a between the loads, V = 0 there; bottom in tension.
    let (b, h, l, a, p) = (0.03, 0.06, 1.2, 0.35, 2500.0);
    let m = Member::Beam(Beam {
        section: rect(b, h),
        material: steel(),
        length_m: l,
        support: BeamSupport::SimplySupported,
        load_points: vec![LoadPoint::whole(a), LoadPoint::whole(l - a)],
    });
    m.validate().unwrap();
    let pl = loads(&[(LoadComponent::VerticalForce, p)]);
    let sigma = p * a / (b * h * h / 6.0);
    for x in [a + 0.01, l / 2.0, l - a - 0.01] {
        let st = state(&m, Face::Bottom, x, 0.0, &pl);
        assert_relative_eq!(st.strain.normal_x, sigma / E, max_relative = 1e-12);
        let side = state(&m, Face::Front, x, 0.0, &pl);
        assert!(
            side.strain.shear_xy.abs() < 1e-15,
            "no shear between the loads"
        );
    }
    // Outside the loads the shear force is the reaction P.
    let side = state(&m, Face::Front, a / 2.0, 0.0, &pl);
    assert_relative_eq!(
        side.strain.shear_xy.abs(),
        side_shear_strain_per_newton(b, h) * p,
        max_relative = 1e-12
    );
}

#[test]
fn a_beam_without_a_load_point_is_refused_with_the_way_out() {
    let mut beam = Beam::new(rect(0.03, 0.06), steel(), 1.0, BeamSupport::Cantilever, 1.0).unwrap();
    beam.load_points.clear();
    let e = beam.validate().unwrap_err().to_string();
    assert!(e.contains("add one"), "{e}");
}

#[test]
fn simply_supported_off_centre_point_load() {
    // Gere & Goodno 7th ed., Appendix H, table H-2 case 5: M under the load = P a b / L.
    let (b, h, l, a, p) = (0.03, 0.06, 1.2, 0.4, 4000.0);
    let m = beam(rect(b, h), l, BeamSupport::SimplySupported, a);
    let st = state(
        &m,
        Face::Bottom,
        a,
        0.0,
        &loads(&[(LoadComponent::VerticalForce, p)]),
    );
    let sigma = (p * a * (l - a) / l) / (b * h * h / 6.0);
    assert_relative_eq!(st.strain.normal_x, sigma / E, max_relative = 1e-12);
    // Reaction at the left support R = P b / L is the shear left of the load (statics).
    let r = m
        .state(
            &SurfacePoint::new(Face::Front, 0.1, 0.0),
            &loads(&[(LoadComponent::VerticalForce, p)]),
        )
        .unwrap();
    assert_relative_eq!(
        r.strain.shear_xy.abs(),
        side_shear_strain_per_newton(b, h) * (p * (l - a) / l),
        max_relative = 1e-12
    );
}

#[test]
fn simply_supported_uniform_load_midspan_moment() {
    // Roark 7th ed., Table 8.1 case 2e: Mmax = w l² / 8.
    let (b, h, l, w) = (0.03, 0.06, 1.5, 2000.0);
    let m = beam(rect(b, h), l, BeamSupport::SimplySupported, 0.0);
    let st = state(
        &m,
        Face::Bottom,
        l / 2.0,
        0.0,
        &loads(&[(LoadComponent::UniformLoad, w)]),
    );
    let sigma = (w * l * l / 8.0) / (b * h * h / 6.0);
    assert_relative_eq!(st.strain.normal_x, sigma / E, max_relative = 1e-12);
}

#[test]
fn axial_force_strain_and_poisson_strain() {
    // Gere & Goodno 7th ed., §1.5 (σ = P/A), §1.7 (ε' = −ν ε).
    let (b, h, n) = (0.02, 0.04, 50e3);
    let m = beam(rect(b, h), 0.3, BeamSupport::Cantilever, 0.3);
    let st = state(
        &m,
        Face::Front,
        0.15,
        0.01,
        &loads(&[(LoadComponent::AxialForce, n)]),
    );
    assert_relative_eq!(st.strain.normal_x, n / (b * h * E), max_relative = 1e-12);
    assert_relative_eq!(
        st.strain.normal_y,
        -NU * n / (b * h * E),
        max_relative = 1e-12
    );
}

#[test]
fn lateral_force_bends_in_the_horizontal_plane() {
    // Roark 7th ed., Table 8.1 case 1a applied about the vertical axis: M = W l at the root,
    // σ = M (b/2) / Iz; a +y push stretches the −y (front) side at the root.
    let (b, h, l, p) = (0.02, 0.05, 0.5, 300.0);
    let m = beam(rect(b, h), l, BeamSupport::Cantilever, l);
    let st = state(
        &m,
        Face::Front,
        0.0,
        0.0,
        &loads(&[(LoadComponent::LateralForce, p)]),
    );
    let sigma = p * l * (b / 2.0) / (h * b.powi(3) / 12.0);
    assert_relative_eq!(st.strain.normal_x, sigma / E, max_relative = 1e-12);
}

#[test]
fn combined_axial_and_bending_superpose() {
    // Gere & Goodno 7th ed., §8.5 (combined loadings), σ = N/A + M c/I (superposition).
    let (b, h, l, p, n) = (0.025, 0.05, 0.8, 1500.0, 20e3);
    let m = beam(rect(b, h), l, BeamSupport::Cantilever, l);
    let st = state(
        &m,
        Face::Top,
        0.2,
        0.0,
        &loads(&[
            (LoadComponent::VerticalForce, p),
            (LoadComponent::AxialForce, n),
        ]),
    );
    let sigma = n / (b * h) + p * (l - 0.2) / (b * h * h / 6.0);
    assert_relative_eq!(st.strain.normal_x, sigma / E, max_relative = 1e-12);
}

// ---------------------------------------------------------------- shafts

#[test]
fn solid_shaft_torsion_shear_and_45_degree_reading() {
    // Gere & Goodno 7th ed., §3.3, eq. (3-14): τmax = 16 T / (π d³); γ = τ / G (Hooke's law in
    // shear, §1.6); a ±45° grid reads ±γ/2 (strain transformation, §7.7).
    let (d, t) = (0.04, 500.0);
    let m = Member::Shaft(Shaft::new(d, 0.0, 0.3, steel()).unwrap());
    let st = state(
        &m,
        Face::Round,
        0.1,
        0.0,
        &loads(&[(LoadComponent::Torque, t)]),
    );
    let gamma = 16.0 * t / (PI * d.powi(3)) / g();
    assert_relative_eq!(st.strain.shear_xy.abs(), gamma, max_relative = 1e-12);
    assert_relative_eq!(
        st.strain.along(FRAC_PI_4).abs(),
        gamma / 2.0,
        max_relative = 1e-12
    );
    assert_relative_eq!(st.strain.normal_x, 0.0);
}

#[test]
fn hollow_shaft_torsion() {
    // Gere & Goodno 7th ed., §3.4, eq. (3-16): τ = T r / Ip with Ip of the tube.
    let (d2, d1, t) = (0.05, 0.038, 800.0);
    let m = Member::Shaft(Shaft::new(d2, d1, 0.3, steel()).unwrap());
    let st = state(
        &m,
        Face::Round,
        0.1,
        0.02,
        &loads(&[(LoadComponent::Torque, t)]),
    );
    let ip = PI * (d2.powi(4) - d1.powi(4)) / 32.0;
    assert_relative_eq!(
        st.strain.shear_xy.abs(),
        t * d2 / 2.0 / ip / g(),
        max_relative = 1e-12
    );
}

#[test]
fn shaft_bending_stress_at_top_line() {
    // Gere & Goodno 7th ed., §5.5, eq. (5-18b): σ = 32 M / (π d³) for a solid circle.
    let (d, mom) = (0.04, 300.0);
    let m = Member::Shaft(Shaft::new(d, 0.0, 0.3, steel()).unwrap());
    let st = state(
        &m,
        Face::Round,
        0.1,
        0.0,
        &loads(&[(LoadComponent::BendingMomentY, mom)]),
    );
    assert_relative_eq!(
        st.strain.normal_x,
        32.0 * mom / (PI * d.powi(3)) / E,
        max_relative = 1e-12
    );
    // A quarter turn round, on the neutral axis, bending gives nothing.
    let side = state(
        &m,
        Face::Round,
        0.1,
        FRAC_PI_2 * d / 2.0,
        &loads(&[(LoadComponent::BendingMomentY, mom)]),
    );
    assert!(side.strain.normal_x.abs() < 1e-18);
}

#[test]
fn shaft_bending_and_torsion_principal_stress() {
    // Gere & Goodno 7th ed., §7.3, eq. (7-17): σ1 = σx/2 + √((σx/2)² + τ²).
    let (d, mom, t) = (0.04, 300.0, 500.0);
    let m = Member::Shaft(Shaft::new(d, 0.0, 0.3, steel()).unwrap());
    let st = state(
        &m,
        Face::Round,
        0.1,
        0.0,
        &loads(&[
            (LoadComponent::BendingMomentY, mom),
            (LoadComponent::Torque, t),
        ]),
    );
    let sx = 32.0 * mom / (PI * d.powi(3));
    let tau = 16.0 * t / (PI * d.powi(3));
    let s1 = sx / 2.0 + ((sx / 2.0).powi(2) + tau * tau).sqrt();
    assert_relative_eq!(
        st.stress(&steel()).principal().max,
        s1,
        max_relative = 1e-10
    );
}

// ---------------------------------------------------------------- pressure vessels

fn thin_cyl(ends: VesselEnds) -> Member {
    Member::ThinCylinder(ThinCylinder::new(0.4, 0.008, 1.0, ends, steel()).unwrap())
}

#[test]
fn thin_cylinder_membrane_stresses_are_the_design_figures() {
    // Gere & Goodno 7th ed., §8.3, eqs. (8-5), (8-6): σ1 = p r / t, σ2 = p r / (2t) at the mean
    // radius; open ends carry no axial membrane stress. (The gauge reading on the outer surface
    // is checked against the thick-wall equations in thick_wall_reading.rs.)
    let r = (0.4 - 0.008) / 2.0;
    for (ends, axial) in [(VesselEnds::Closed, r / 0.016), (VesselEnds::Open, 0.0)] {
        let Member::ThinCylinder(c) = thin_cyl(ends) else {
            unreachable!()
        };
        let (hoop, ax) = c.stresses_per_pa();
        assert_relative_eq!(hoop, r / 0.008, max_relative = 1e-12);
        assert_relative_eq!(ax, axial, max_relative = 1e-12);
    }
}

#[test]
fn thin_sphere_membrane_stress_is_the_design_figure() {
    // Gere & Goodno 7th ed., §8.2, eq. (8-1): σ = p r / (2t) at the mean radius.
    let s = ThinSphere::new(1.0, 0.01, steel()).unwrap();
    assert_relative_eq!(s.stress_per_pa(), 0.495 / 0.02, max_relative = 1e-12);
}

#[test]
fn thin_wall_model_refuses_a_thick_wall_and_names_the_other_model() {
    // Limit r/t ≥ 10: common practice (see THIN_WALL_MIN_RATIO).
    let e = ThinCylinder::new(0.1, 0.01, 0.3, VesselEnds::Closed, steel()).unwrap_err();
    assert!(matches!(e, MechanicsError::ThinWallOutsideValidity { .. }));
    assert!(
        e.to_string().contains("thick-walled cylinder model (Lamé)"),
        "{e}"
    );
}

#[test]
fn lame_hoop_stress_at_bore_and_outer_surface() {
    // Budynas & Nisbett, Shigley's, 10th ed., §3-16, eq. (3-50) with po = 0:
    // σt(ri) = p (ro² + ri²)/(ro² − ri²); σt(ro) = 2 p ri² / (ro² − ri²).
    let (ro, ri, p) = (0.05, 0.03, 100e6);
    let v = ThickCylinder::new(2.0 * ro, 2.0 * ri, 0.2, VesselEnds::Closed, steel()).unwrap();
    let at_bore = v.stresses_at(ri, p, 0.0);
    assert_relative_eq!(
        at_bore.hoop_pa,
        p * (ro * ro + ri * ri) / (ro * ro - ri * ri),
        max_relative = 1e-12
    );
    assert_relative_eq!(at_bore.radial_pa, -p, max_relative = 1e-12);
    let at_outer = v.stresses_at(ro, p, 0.0);
    assert_relative_eq!(
        at_outer.hoop_pa,
        2.0 * p * ri * ri / (ro * ro - ri * ri),
        max_relative = 1e-12
    );
    // Closed ends: σl = p ri² / (ro² − ri²) (Shigley eq. 3-52).
    assert_relative_eq!(
        at_outer.axial_pa,
        p * ri * ri / (ro * ro - ri * ri),
        max_relative = 1e-12
    );
}

#[test]
fn lame_outer_surface_strain_under_internal_pressure() {
    // Shigley 10th ed. eqs. (3-50), (3-52) at r = ro, and Hooke's law for the free surface.
    let (ro, ri, p) = (0.05, 0.03, 100e6);
    let m = Member::ThickCylinder(
        ThickCylinder::new(2.0 * ro, 2.0 * ri, 0.2, VesselEnds::Closed, steel()).unwrap(),
    );
    let st = state(
        &m,
        Face::Round,
        0.1,
        0.0,
        &loads(&[(LoadComponent::InternalPressure, p)]),
    );
    let hoop = 2.0 * p * ri * ri / (ro * ro - ri * ri);
    let axial = p * ri * ri / (ro * ro - ri * ri);
    assert_relative_eq!(
        st.strain.normal_y,
        (hoop - NU * axial) / E,
        max_relative = 1e-12
    );
    assert_relative_eq!(
        st.strain.normal_x,
        (axial - NU * hoop) / E,
        max_relative = 1e-12
    );
}

#[test]
fn lame_external_pressure_hoop_at_outer_surface() {
    // Timoshenko & Goodier 3rd ed., §28, eqs. (46) with pi = 0:
    // σθ(ro) = −po (ro² + ri²)/(ro² − ri²), σr(ro) = −po.
    let (ro, ri, po) = (0.05, 0.03, 30e6);
    let v = ThickCylinder::new(2.0 * ro, 2.0 * ri, 0.2, VesselEnds::Open, steel()).unwrap();
    let s = v.stresses_at(ro, 0.0, po);
    assert_relative_eq!(
        s.hoop_pa,
        -po * (ro * ro + ri * ri) / (ro * ro - ri * ri),
        max_relative = 1e-12
    );
    assert_relative_eq!(s.radial_pa, -po, max_relative = 1e-12);
}

#[test]
fn lame_agrees_with_thin_wall_average_and_maximum() {
    // Budynas & Nisbett, Shigley's 10th ed., §3-14: thin-wall tangential stress
    // (σt)av = p di / (2t) (exact by equilibrium) and (σt)max = p (di + t) / (2t) (within a few
    // per cent of Lamé for thin walls).
    let (ro, t, p) = (0.505, 0.01, 1e6);
    let ri = ro - t;
    let v = ThickCylinder::new(2.0 * ro, 2.0 * ri, 0.5, VesselEnds::Closed, steel()).unwrap();
    let (x, w) = gauss_legendre(8);
    let average: f64 = x
        .iter()
        .zip(&w)
        .map(|(x, w)| w / 2.0 * v.stresses_at(ri + (1.0 + x) * t / 2.0, p, 0.0).hoop_pa)
        .sum();
    assert_relative_eq!(average, p * 2.0 * ri / (2.0 * t), max_relative = 1e-9);
    let at_bore = v.stresses_at(ri, p, 0.0).hoop_pa;
    assert_relative_eq!(at_bore, p * (2.0 * ri + t) / (2.0 * t), max_relative = 0.01);
}

// ---------------------------------------------------------------- plate with a hole

fn plate() -> PlateWithHole {
    PlateWithHole::new(0.02, 0.3, 0.3, 0.005, steel()).unwrap()
}

#[test]
fn kirsch_peak_and_minimum_at_the_hole_edge() {
    // Timoshenko & Goodier 3rd ed., §35: σθ = 3S at θ = ±π/2 and −S at θ = 0, π.
    let s = 100e6;
    let (_, peak, _) = kirsch_uniaxial(s, 0.0, 0.01, 0.01, FRAC_PI_2);
    let (_, low, _) = kirsch_uniaxial(s, 0.0, 0.01, 0.01, 0.0);
    assert_relative_eq!(peak, 3.0 * s, max_relative = 1e-12);
    assert_relative_eq!(low, -s, max_relative = 1e-12);
}

#[test]
fn kirsch_decay_at_one_radius_from_the_edge() {
    // Timoshenko & Goodier 3rd ed., §35, eq. (61) at r = 2a, θ = π/2: σθ = 1.22 S
    // (S/2 (2 + a²/r² + 3a⁴/r⁴) = 1.21875 S).
    let (_, hoop, _) = kirsch_uniaxial(1.0, 0.0, 0.01, 0.02, FRAC_PI_2);
    assert_relative_eq!(hoop, 1.21875, max_relative = 1e-12);
}

#[test]
fn kirsch_equal_biaxial_gives_twice_the_stress_everywhere_on_the_edge() {
    // Timoshenko & Goodier 3rd ed., §35: superposing S along x and y gives σθ = 2S at r = a.
    let p = plate();
    let l = loads(&[
        (LoadComponent::RemoteStressX, 50e6),
        (LoadComponent::RemoteStressY, 50e6),
    ]);
    for k in 0..8 {
        let t = k as f64 * PI / 8.0;
        let (sx, sy, txy) = p.stresses_at(0.01 * t.cos(), 0.01 * t.sin(), &l);
        let hoop = sx * t.sin().powi(2) + sy * t.cos().powi(2) - 2.0 * txy * t.sin() * t.cos();
        assert_relative_eq!(hoop, 100e6, max_relative = 1e-9);
    }
}

#[test]
fn kirsch_pure_shear_peak_is_four_times_the_shear() {
    // Timoshenko & Goodier 3rd ed., §35: pure shear τ gives σθ = ±4τ at the hole edge.
    let p = plate();
    let l = loads(&[(LoadComponent::RemoteShearXY, 10e6)]);
    let m = Member::PlateWithHole(p);
    let (vm_peak, _) = m.peak_von_mises(&l, 40).unwrap();
    // Von Mises of a uniaxial 4τ at the free edge is 4τ.
    assert_relative_eq!(vm_peak, 40e6, max_relative = 0.002);
}

#[test]
fn kirsch_far_field_returns_the_remote_stress() {
    // Timoshenko & Goodier 3rd ed., §35: the disturbance decays as (a/r)²; at r = 50 a it is
    // below 0.1 % of S.
    let p = plate();
    let l = loads(&[
        (LoadComponent::RemoteStressX, 80e6),
        (LoadComponent::RemoteStressY, -20e6),
    ]);
    let (sx, sy, txy) = p.stresses_at(0.35, 0.35, &l);
    assert_relative_eq!(sx, 80e6, max_relative = 1e-3);
    assert_relative_eq!(sy, -20e6, max_relative = 5e-3);
    assert!(txy.abs() < 1e-3 * 80e6);
}

// ---------------------------------------------------------------- transformation and stress

#[test]
fn strain_transformation_special_directions() {
    // Gere & Goodno 7th ed., §7.7, eq. (7-71a): ε(0) = εx, ε(90°) = εy, ε(45°) = (εx+εy+γ)/2.
    let s = SurfaceStrain::new(400e-6, -120e-6, 300e-6);
    assert_relative_eq!(s.along(0.0), 400e-6, max_relative = 1e-12);
    assert_relative_eq!(s.along(FRAC_PI_2), -120e-6, max_relative = 1e-12);
    assert_relative_eq!(
        s.along(FRAC_PI_4),
        (400e-6 - 120e-6 + 300e-6) / 2.0,
        max_relative = 1e-12
    );
}

#[test]
fn principal_strains_and_angle() {
    // Gere & Goodno 7th ed., §7.7, eqs. (7-74), (7-75): ε1,2 = (εx+εy)/2 ± √(((εx−εy)/2)² + (γ/2)²),
    // tan 2θp = γ / (εx − εy).
    let s = SurfaceStrain::new(340e-6, 110e-6, 180e-6);
    let p = s.principal();
    let r = ((340e-6 - 110e-6) / 2.0f64).hypot(90e-6);
    assert_relative_eq!(p.max, 225e-6 + r, max_relative = 1e-12);
    assert_relative_eq!(p.min, 225e-6 - r, max_relative = 1e-12);
    assert_relative_eq!(
        p.angle_rad,
        0.5 * (180e-6f64 / 230e-6).atan(),
        max_relative = 1e-12
    );
}

#[test]
fn von_mises_of_uniaxial_and_pure_shear() {
    // Budynas & Nisbett, Shigley's 10th ed., §5-5, eq. (5-15): σ' = √(σx² − σxσy + σy² + 3τ²);
    // uniaxial σ gives σ, pure shear τ gives √3 τ.
    let uni = SurfaceStress {
        normal_x_pa: 120e6,
        ..SurfaceStress::default()
    };
    assert_relative_eq!(uni.von_mises_pa(), 120e6, max_relative = 1e-12);
    let shear = SurfaceStress {
        shear_xy_pa: 50e6,
        ..SurfaceStress::default()
    };
    assert_relative_eq!(
        shear.von_mises_pa(),
        3f64.sqrt() * 50e6,
        max_relative = 1e-12
    );
}

// ---------------------------------------------------------------- rosettes

#[test]
fn rectangular_rosette_closed_form() {
    // ASTM E1561 / Dally & Riley 3rd ed., §9.6: ε1,2 = (ε0+ε90)/2 ± (1/√2)√((ε0−ε45)² + (ε45−ε90)²);
    // tan 2θ = (2ε45 − ε0 − ε90)/(ε0 − ε90).
    let (e0, e45, e90) = (650e-6, 300e-6, -150e-6);
    let r = analyse_rosette(RosetteKind::Rectangular, &[e0, e45, e90], &steel()).unwrap();
    let rad = ((e0 - e45).powi(2) + (e45 - e90).powi(2)).sqrt() / 2f64.sqrt();
    assert_relative_eq!(
        r.principal_strain.max,
        (e0 + e90) / 2.0 + rad,
        max_relative = 1e-12
    );
    assert_relative_eq!(
        r.principal_strain.min,
        (e0 + e90) / 2.0 - rad,
        max_relative = 1e-12
    );
    assert_relative_eq!(
        r.principal_strain.angle_rad,
        0.5 * ((2.0 * e45 - e0 - e90) / (e0 - e90)).atan(),
        max_relative = 1e-12
    );
}

#[test]
fn delta_rosette_closed_form() {
    // ASTM E1561 / Dally & Riley 3rd ed., §9.6:
    // ε1,2 = Σ/3 ± (√2/3)√((ε0−ε60)² + (ε60−ε120)² + (ε120−ε0)²).
    let (a, b, c) = (500e-6, -80e-6, 220e-6);
    let r = analyse_rosette(RosetteKind::Delta, &[a, b, c], &steel()).unwrap();
    let rad = 2f64.sqrt() / 3.0 * ((a - b).powi(2) + (b - c).powi(2) + (c - a).powi(2)).sqrt();
    assert_relative_eq!(
        r.principal_strain.max,
        (a + b + c) / 3.0 + rad,
        max_relative = 1e-12
    );
    assert_relative_eq!(
        r.principal_strain.min,
        (a + b + c) / 3.0 - rad,
        max_relative = 1e-12
    );
}

#[test]
fn rosette_principal_stresses_from_principal_strains() {
    // Dally & Riley 3rd ed., §9.6: σ1 = E/(1−ν²)(ε1 + ν ε2), σ2 = E/(1−ν²)(ε2 + ν ε1).
    let r = analyse_rosette(
        RosetteKind::Rectangular,
        &[650e-6, 300e-6, -150e-6],
        &steel(),
    )
    .unwrap();
    let (e1, e2) = (r.principal_strain.max, r.principal_strain.min);
    assert_relative_eq!(
        r.principal_stress_pa.0,
        E / (1.0 - NU * NU) * (e1 + NU * e2),
        max_relative = 1e-12
    );
    assert_relative_eq!(
        r.principal_stress_pa.1,
        E / (1.0 - NU * NU) * (e2 + NU * e1),
        max_relative = 1e-12
    );
}

// ---------------------------------------------------------------- transverse sensitivity

#[test]
fn transverse_sensitivity_error_in_equal_biaxial_field() {
    // Dally & Riley 3rd ed., §6.5: percent error = Kt (εt/εa + ν0) / (1 − ν0 Kt) × 100.
    // Kt = 0.05, εt = εa: 0.05 × 1.285 / (1 − 0.01425) = 6.518 %.
    let e = indicated_strain(1000e-6, 1000e-6, 0.05, CALIBRATION_POISSON_RATIO).unwrap();
    assert_relative_eq!(
        (e - 1000e-6) / 1000e-6,
        0.05 * 1.285 / (1.0 - 0.285 * 0.05),
        max_relative = 1e-12
    );
}

#[test]
fn transverse_correction_recovers_true_strains() {
    // Dally & Riley 3rd ed., §6.5, correction for two orthogonal gauges:
    // εa = (1 − ν0 Kt)(ε̂a − Kt ε̂t)/(1 − Kt²).
    let (ea, et, kt) = (800e-6, -500e-6, 0.04);
    let ia = indicated_strain(ea, et, kt, CALIBRATION_POISSON_RATIO).unwrap();
    let it = indicated_strain(et, ea, kt, CALIBRATION_POISSON_RATIO).unwrap();
    let (ca, ct) = correct_pair(ia, it, kt, CALIBRATION_POISSON_RATIO).unwrap();
    assert_relative_eq!(ca, ea, max_relative = 1e-12);
    assert_relative_eq!(ct, et, max_relative = 1e-12);
}

#[test]
fn rectangular_rosette_transverse_correction() {
    // Dally & Riley 3rd ed., §9.7 (rosette correction): each grid is corrected against the
    // indication perpendicular to it, ε̂(θ+90°) = ε̂0 + ε̂90 − ε̂θ.
    let truth = SurfaceStrain::new(600e-6, -200e-6, 350e-6);
    let kt = 0.03;
    let angles = [0.0, FRAC_PI_4, FRAC_PI_2];
    let indicated = angles.map(|t| {
        indicated_strain(
            truth.along(t),
            truth.along(t + FRAC_PI_2),
            kt,
            CALIBRATION_POISSON_RATIO,
        )
        .unwrap()
    });
    let corrected = correct_rosette(angles, indicated, kt, CALIBRATION_POISSON_RATIO).unwrap();
    for (c, t) in corrected.iter().zip(angles) {
        assert_relative_eq!(*c, truth.along(t), max_relative = 1e-12);
    }
}

// ---------------------------------------------------------------- grid averaging

#[test]
fn grid_average_near_the_hole_matches_the_integral_of_the_kirsch_field() {
    // Timoshenko & Goodier 3rd ed., §35, eqs. (61), integrated analytically along the radial
    // line θ = 90°: a grid along x, 0.002 mm long, spanning r = a … a + d across its width reads
    // (1/E)(⟨σθ⟩ − ν⟨σr⟩) with
    // ⟨σθ⟩ = S/2 [2 + (a²/d)(1/a − 1/(a+d)) + (a⁴/d)(1/a³ − 1/(a+d)³)],
    // ⟨σr⟩ = S/2 [3(a²/d)(1/a − 1/(a+d)) − (a⁴/d)(1/a³ − 1/(a+d)³)].
    let s = 100e6;
    let a = 0.01;
    let d = 0.003;
    let m = Member::PlateWithHole(plate());
    let grid = GridFootprint {
        center: SurfacePoint::new(Face::Plate, 0.0, a + d / 2.0),
        angle_rad: 0.0,
        length_m: 2e-6,
        width_m: d,
    };
    let l = loads(&[(LoadComponent::RemoteStressX, s)]);
    let read = grid_average_strain(
        &m,
        &grid,
        &l,
        QuadratureOrder {
            along: 2,
            across: 12,
        },
    )
    .unwrap();
    let i2 = a * a / d * (1.0 / a - 1.0 / (a + d));
    let i4 = a.powi(4) / d * (1.0 / a.powi(3) - 1.0 / (a + d).powi(3));
    let hoop = s / 2.0 * (2.0 + i2 + i4);
    let radial = s / 2.0 * (3.0 * i2 - i4);
    assert_relative_eq!(read, (hoop - NU * radial) / E, max_relative = 1e-6);
    // And it is visibly below the peak at the edge, (3S − 0)/E.
    assert!(read < 0.85 * 3.0 * s / E);
}

#[test]
fn gauss_legendre_three_point_nodes() {
    // Abramowitz & Stegun, Handbook of Mathematical Functions, Table 25.4: n = 3 nodes 0, ±√0.6,
    // weights 8/9, 5/9.
    let (x, w) = gauss_legendre(3);
    assert_relative_eq!(x[2], 0.6f64.sqrt(), max_relative = 1e-14);
    assert!(x[1].abs() < 1e-15);
    assert_relative_eq!(w[1], 8.0 / 9.0, max_relative = 1e-14);
    assert_relative_eq!(w[0], 5.0 / 9.0, max_relative = 1e-14);
}

// ---------------------------------------------------------------- temperature

#[test]
fn free_thermal_expansion_gives_strain_but_no_stress() {
    // Gere & Goodno 7th ed., §2.5, eq. (2-16): εT = α ΔT; an unrestrained part is unstressed.
    let m = beam(rect(0.02, 0.04), 0.3, BeamSupport::Cantilever, 0.3);
    let st = state(
        &m,
        Face::Top,
        0.1,
        0.0,
        &loads(&[(LoadComponent::TemperatureChange, 40.0)]),
    );
    assert_relative_eq!(st.strain.normal_x, 12e-6 * 40.0, max_relative = 1e-12);
    assert_relative_eq!(st.strain.normal_y, 12e-6 * 40.0, max_relative = 1e-12);
    assert!(st.von_mises_pa(&steel()) < 1e-3);
}
