//! Shear on the top and bottom faces of flanged and box sections under vertical shear,
//! checked by an independent route: the equilibrium of a flange element along the beam,
//! ∂τxy/∂y = −∂σx/∂x, with ∂σx/∂x taken by finite differences of the model's own bending
//! stress at two stations and integrated across the flange from the free tip (I section) or from
//! the wall's middle, where the flow is zero by symmetry (box). The bending stress is linear
//! along the beam under an end load, so the difference quotient is exact; the tolerance covers
//! rounding only.

use gw_mechanics::{
    Beam, BeamSupport, Face, LoadComponent, LoadVector, Material, Member, Section, SurfacePoint,
};

fn steel() -> Material {
    Material::new("steel", 200e9, 0.3, 12e-6, 300e6).unwrap()
}

fn cantilever(section: Section) -> Member {
    Member::Beam(Beam::new(section, steel(), 1.0, BeamSupport::Cantilever, 1.0).unwrap())
}

/// σx and τ (local, on the face) at a surface point under an end load of 10 kN.
fn stresses(m: &Member, face: Face, x: f64, s: f64) -> (f64, f64) {
    let loads = LoadVector::from_pairs(&[(LoadComponent::VerticalForce, 10e3)]);
    let st = m
        .state(&SurfacePoint::new(face, x, s), &loads)
        .unwrap()
        .stress(&steel());
    (st.normal_x_pa, st.shear_xy_pa)
}

/// ∂σx/∂x on a face line, by a central difference.
fn dsigma_dx(m: &Member, face: Face, x: f64, s: f64) -> f64 {
    let h = 0.01;
    (stresses(m, face, x + h, s).0 - stresses(m, face, x - h, s).0) / (2.0 * h)
}

#[test]
fn i_section_top_flange_carries_the_shear_flow_from_its_tips() {
    let (b, d, tf, tw) = (0.1, 0.2, 0.0085, 0.0056);
    let m = cantilever(Section::IBeam {
        flange_width_m: b,
        depth_m: d,
        flange_thickness_m: tf,
        web_thickness_m: tw,
    });
    let x = 0.4;
    // σx in the flange at height z is the surface value times z/(d/2) (plane sections); its
    // integral over the flange thickness is tf z̄ times the surface gradient over d/2.
    let zbar = (d - tf) / 2.0;
    for y in [0.045, 0.03, 0.01, -0.02, -0.04] {
        let g = dsigma_dx(&m, Face::Top, x, y);
        // τxy(y) = ∫ from the tip to y of ∂σx/∂x across the flange, per unit thickness.
        let tip = y.signum() * b / 2.0;
        let expected = (tip - y) * zbar * g / (d / 2.0);
        let (_, tau) = stresses(&m, Face::Top, x, y);
        assert!(
            (tau - expected).abs() <= 1e-9 * expected.abs().max(1.0),
            "y = {y}: {tau} vs {expected}"
        );
        assert!(
            expected.abs() > 1e3,
            "a real shear stress at y = {y}: {expected}"
        );
    }
    // Zero at the free tips.
    assert!(stresses(&m, Face::Top, x, b / 2.0).1.abs() < 1e-6);
}

#[test]
fn box_bottom_wall_carries_the_shear_flow_from_its_middle() {
    let (w, h, t) = (0.05, 0.08, 0.004);
    let m = cantilever(Section::RectangularTube {
        width_m: w,
        height_m: h,
        wall_m: t,
    });
    let x = 0.5;
    let zbar = (h - t) / 2.0;
    for s in [0.02, 0.01, -0.015] {
        // On the bottom face s runs towards −y: y = −s, and the local shear is −τxy.
        let y: f64 = -s;
        let g = dsigma_dx(&m, Face::Bottom, x, s);
        // Flange stress at z = −z̄ is the surface value times z̄/(h/2) (same sign as the
        // surface, both below the axis). τxy(y) = −∫ from 0 to y of ∂σx/∂x.
        let tau_xy = -y * zbar * g / (h / 2.0);
        let (_, tau_local) = stresses(&m, Face::Bottom, x, s);
        assert!(
            (tau_local + tau_xy).abs() <= 1e-9 * tau_xy.abs().max(1.0),
            "s = {s}: {tau_local} vs {}",
            -tau_xy
        );
        assert!(tau_xy.abs() > 1e3);
    }
    assert!(stresses(&m, Face::Bottom, x, 0.0).1.abs() < 1e-6);
}

#[test]
fn solid_sections_have_no_vertical_shear_on_top() {
    let m = cantilever(Section::Rectangle {
        width_m: 0.03,
        height_m: 0.06,
    });
    assert_eq!(stresses(&m, Face::Top, 0.4, 0.01).1, 0.0);
}
