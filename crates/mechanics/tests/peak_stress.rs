//! The peak von Mises stress of a part finds the known critical point however coarse the
//! sampling. Each check names its source beside it; the expected values are worked out here
//! from statics and the cited formulas, not read back from the model.

use std::f64::consts::{FRAC_PI_2, PI};

use gw_mechanics::*;

/// Sample counts from the coarsest the search allows to the app's usual ones.
const SAMPLE_COUNTS: [usize; 7] = [2, 3, 4, 5, 7, 24, 40];

fn steel() -> Material {
    Material::new("test steel", 200e9, 0.3, 12e-6, 350e6).unwrap()
}

fn round_beam(d: f64, length: f64, support: BeamSupport, points: &[(f64, f64)]) -> Member {
    let beam = Beam {
        section: Section::SolidRound { diameter_m: d },
        material: steel(),
        length_m: length,
        support,
        load_points: points
            .iter()
            .map(|&(position_m, multiple)| LoadPoint {
                position_m,
                multiple,
            })
            .collect(),
    };
    beam.validate().unwrap();
    Member::Beam(beam)
}

/// Bending stress at the outer fibre of a solid round, σ = M c / I with I = π d⁴/64 and
/// c = d/2 (Timoshenko & Gere, *Mechanics of Materials*, flexure formula; moment of inertia
/// of a circle from their table of plane areas).
fn round_bending_stress(moment_n_m: f64, d: f64) -> f64 {
    let i = PI * d.powi(4) / 64.0;
    moment_n_m.abs() * (d / 2.0) / i
}

fn peak_x_m(at: PeakLocation) -> f64 {
    match at {
        PeakLocation::Surface(p) => p.x_m,
        PeakLocation::Bore { .. } => panic!("a beam has no bore, got {at:?}"),
    }
}

fn assert_within(value: f64, expected: f64, rel: f64, what: &str) {
    assert!(
        (value - expected).abs() <= rel * expected.abs(),
        "{what}: {value} differs from {expected} by more than {} %",
        rel * 100.0
    );
}

#[test]
fn central_load_on_a_simply_supported_round_peaks_under_the_load() {
    // Timoshenko & Gere, *Mechanics of Materials*, simply supported beam with a central
    // load: M = PL/4 under the load; σ = 32M/(πd³) for a solid round.
    let (d, l, p) = (0.04, 0.5, 6000.0);
    let m = round_beam(d, l, BeamSupport::SimplySupported, &[(l / 2.0, 1.0)]);
    let loads = LoadVector::from_pairs(&[(LoadComponent::VerticalForce, p)]);
    let expected = 32.0 * (p * l / 4.0) / (PI * d.powi(3));
    assert_within(expected, 119.366e6, 1e-4, "hand value of the round link");
    for n in SAMPLE_COUNTS {
        let (peak, at) = m.peak_von_mises(&loads, n).unwrap();
        assert_within(peak, expected, 1e-3, &format!("peak with {n} samples"));
        assert!((peak_x_m(at) - l / 2.0).abs() < 1e-6, "n = {n}: at {at:?}");
    }
}

#[test]
fn end_load_on_a_cantilever_peaks_at_the_clamp() {
    // Timoshenko & Gere, *Mechanics of Materials*, cantilever with a load at the free end:
    // M = PL at the fixed support, so σ = 32PL/(πd³) there.
    let (d, l, p) = (0.03, 0.7, 900.0);
    let m = round_beam(d, l, BeamSupport::Cantilever, &[(l, 1.0)]);
    let loads = LoadVector::from_pairs(&[(LoadComponent::VerticalForce, p)]);
    let expected = 32.0 * p * l / (PI * d.powi(3));
    for n in SAMPLE_COUNTS {
        let (peak, at) = m.peak_von_mises(&loads, n).unwrap();
        assert_within(peak, expected, 1e-3, &format!("peak with {n} samples"));
        assert!(peak_x_m(at).abs() < 1e-6, "n = {n}: at {at:?}");
    }
}

/// Bending moment of a simply supported span under point loads (position, force), from
/// statics: the left reaction from moments about the right support, then the moment of the
/// forces left of the cut (Timoshenko & Gere, *Mechanics of Materials*, shear-force and
/// bending-moment diagrams).
fn simply_supported_moment(span: f64, forces: &[(f64, f64)], x: f64) -> f64 {
    let left_reaction: f64 = forces.iter().map(|&(a, f)| f * (span - a) / span).sum();
    let left_of_cut: f64 = forces
        .iter()
        .filter(|&&(a, _)| a < x)
        .map(|&(a, f)| f * (x - a))
        .sum();
    left_reaction * x - left_of_cut
}

#[test]
fn two_load_points_peak_at_the_larger_moment_of_the_diagram() {
    // Moment diagram from statics in this test (Timoshenko & Gere, shear-force and
    // bending-moment diagrams); stress from the flexure formula.
    let (d, l, p) = (0.03, 1.0, 1000.0);
    let points = [(0.3, 1.0), (0.7, 2.0)];
    let m = round_beam(d, l, BeamSupport::SimplySupported, &points);
    let forces: Vec<(f64, f64)> = points.iter().map(|&(a, k)| (a, k * p)).collect();
    // Where the diagram peaks, read off a fine scan of it.
    let (x_max, m_max) = (0..=10_000)
        .map(|i| l * i as f64 / 10_000.0)
        .map(|x| (x, simply_supported_moment(l, &forces, x)))
        .fold(
            (0.0, 0.0_f64),
            |b, c| if c.1.abs() > b.1.abs() { c } else { b },
        );
    assert!(
        (x_max - 0.7).abs() < 1e-9,
        "diagram peaks at the right load"
    );
    let left = simply_supported_moment(l, &forces, 0.3);
    assert!(m_max > left * 1.2, "the right load point clearly governs");
    let loads = LoadVector::from_pairs(&[(LoadComponent::VerticalForce, p)]);
    let expected = round_bending_stress(m_max, d);
    for n in SAMPLE_COUNTS {
        let (peak, at) = m.peak_von_mises(&loads, n).unwrap();
        assert_within(peak, expected, 1e-3, &format!("peak with {n} samples"));
        assert!((peak_x_m(at) - 0.7).abs() < 1e-6, "n = {n}: at {at:?}");
    }
}

#[test]
fn uniform_load_on_a_simply_supported_round_peaks_at_mid_span() {
    // Timoshenko & Gere, *Mechanics of Materials*, simply supported beam with a uniform load:
    // M = wL²/8 at mid-span, where the shear is zero. The point force is left at zero.
    let (d, l, w) = (0.05, 1.2, 4000.0);
    let m = round_beam(d, l, BeamSupport::SimplySupported, &[(0.9, 1.0)]);
    let loads = LoadVector::from_pairs(&[(LoadComponent::UniformLoad, w)]);
    let expected = round_bending_stress(w * l * l / 8.0, d);
    for n in SAMPLE_COUNTS {
        let (peak, at) = m.peak_von_mises(&loads, n).unwrap();
        assert_within(peak, expected, 1e-3, &format!("peak with {n} samples"));
        assert!((peak_x_m(at) - l / 2.0).abs() < 1e-6, "n = {n}: at {at:?}");
    }
}

#[test]
fn shaft_in_two_plane_bending_and_torsion_peaks_on_the_resultant_fibre() {
    // Budynas & Nisbett, *Shigley's Mechanical Engineering Design*, 10th ed., §7-4: a round
    // shaft in two-plane bending carries σ = 32√(My² + Mz²)/(πd³) on the fibre of the
    // resultant moment, τ = 16T/(πd³) all round; von Mises √(σ² + 3τ²) (§5-5).
    let d = 0.04;
    let m = Member::Shaft(Shaft::new(d, 0.0, 0.3, steel()).unwrap());
    let (my, mz, t) = (300.0, -520.0, 400.0);
    let loads = LoadVector::from_pairs(&[
        (LoadComponent::BendingMomentY, my),
        (LoadComponent::BendingMomentZ, mz),
        (LoadComponent::Torque, t),
    ]);
    let sigma = 32.0 * my.hypot(mz) / (PI * d.powi(3));
    let tau = 16.0 * t / (PI * d.powi(3));
    let expected = (sigma * sigma + 3.0 * tau * tau).sqrt();
    for n in SAMPLE_COUNTS {
        let (peak, _) = m.peak_von_mises(&loads, n).unwrap();
        assert_within(peak, expected, 1e-3, &format!("peak with {n} samples"));
    }
}

fn plate() -> Member {
    Member::PlateWithHole(PlateWithHole::new(0.02, 0.3, 0.3, 0.005, steel()).unwrap())
}

fn hole_angle(at: PeakLocation) -> (f64, f64) {
    let PeakLocation::Surface(p) = at else {
        panic!("a plate has no bore, got {at:?}");
    };
    (p.x_m.hypot(p.s_m), p.s_m.atan2(p.x_m))
}

#[test]
fn plate_in_remote_tension_peaks_at_three_times_it_at_the_hole_edge() {
    // Kirsch solution (Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., §35): under a
    // remote tension S along x the hoop stress at the hole edge reaches 3S at θ = ±90°.
    let m = plate();
    let s = 100e6;
    let loads = LoadVector::from_pairs(&[(LoadComponent::RemoteStressX, s)]);
    for n in SAMPLE_COUNTS {
        let (peak, at) = m.peak_von_mises(&loads, n).unwrap();
        assert_within(peak, 3.0 * s, 1e-3, &format!("peak with {n} samples"));
        let (r, theta) = hole_angle(at);
        assert!(
            (r - 0.01).abs() < 1e-9,
            "n = {n}: on the hole edge, r = {r}"
        );
        assert!(
            (theta.abs() - FRAC_PI_2).abs() < 1e-6,
            "n = {n}: θ = {theta}"
        );
    }
}

#[test]
fn plate_in_tension_at_an_angle_peaks_a_quarter_turn_from_it() {
    // Tension S at 30° to x, written as σx, σy, τ by the stress transformation (Timoshenko &
    // Gere, *Mechanics of Materials*, plane stress): σx = S cos²φ, σy = S sin²φ,
    // τ = S sin φ cos φ. Kirsch (Timoshenko & Goodier, §35): 3S at the edge, 90° from φ.
    let m = plate();
    let (s, phi) = (80e6, PI / 6.0);
    let loads = LoadVector::from_pairs(&[
        (LoadComponent::RemoteStressX, s * phi.cos().powi(2)),
        (LoadComponent::RemoteStressY, s * phi.sin().powi(2)),
        (LoadComponent::RemoteShearXY, s * phi.sin() * phi.cos()),
    ]);
    for n in SAMPLE_COUNTS {
        let (peak, at) = m.peak_von_mises(&loads, n).unwrap();
        assert_within(peak, 3.0 * s, 1e-3, &format!("peak with {n} samples"));
        let (_, theta) = hole_angle(at);
        let off = (theta - phi - FRAC_PI_2).rem_euclid(PI);
        assert!(off.min(PI - off) < 1e-6, "n = {n}: θ = {theta}");
    }
}

#[test]
fn plate_in_pure_shear_peaks_at_four_times_it() {
    // Kirsch (Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., §35): pure shear τ gives
    // σθ = ±4τ at the hole edge, at 45° to the axes.
    let m = plate();
    let loads = LoadVector::from_pairs(&[(LoadComponent::RemoteShearXY, 25e6)]);
    for n in SAMPLE_COUNTS {
        let (peak, _) = m.peak_von_mises(&loads, n).unwrap();
        assert_within(peak, 100e6, 1e-3, &format!("peak with {n} samples"));
    }
}
