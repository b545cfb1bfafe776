//! The places where a part's stress can peak, found from the model rather than by luck of a
//! grid: the peak search ([`crate::Member::peak_von_mises`]) evaluates these on top of its
//! regular sampling, so a coarse grid still finds a peak that sits at a known point.
//!
//! - Beams: the ends (clamp, pins), every load point from both sides (the moment diagram has
//!   a kink there and the shear a step) and, between them, the point where the shear under a
//!   uniform load changes sign (the extreme of the parabolic moment diagram).
//! - Round faces (shafts, round beams): the extreme bending fibres, across from each other,
//!   and the two neutral-axis lines between them, at every sampled position along the part.
//! - Flat faces of a beam: the centre line (the neutral axis of a side face) and both edges.
//! - A plate with a hole: the hole edge at the angles where the hoop stress there is extreme,
//!   with a ring of samples round the edge.
//! - Vessels and given states carry a uniform surface state; the bore of a vessel is taken
//!   exactly by [`crate::Member::bore_von_mises`].

use std::f64::consts::{FRAC_PI_2, PI, TAU};

use crate::beam::Beam;
use crate::load::{LoadComponent, LoadVector};
use crate::member::Member;
use crate::surface::{FaceExtent, SurfacePoint};

/// Positions along a beam where its moment diagram has a kink or an extreme, metres, sorted:
/// both ends, each load point and a point just before it (the left side of its shear step),
/// and inside each stretch between them the point where the vertical shear is zero.
pub(crate) fn beam_critical_x_m(beam: &Beam, loads: &LoadVector) -> Vec<f64> {
    let l = beam.length_m;
    let step = 1e-9 * l;
    let mut knots: Vec<f64> = vec![0.0, l];
    knots.extend(beam.load_points.iter().map(|p| p.position_m.clamp(0.0, l)));
    knots.sort_by(f64::total_cmp);
    knots.dedup();
    let mut xs = knots.clone();
    xs.extend(knots.iter().map(|&x| (x - step).max(0.0)));
    // Under a uniform load w the vertical shear grows as w·x between load points, and the
    // moment about y (whose slope it is) has its extreme where the shear is zero.
    let w = loads[LoadComponent::UniformLoad];
    if w != 0.0 {
        for pair in knots.windows(2) {
            let (a, b) = (pair[0], pair[1]);
            let mid = (a + b) / 2.0;
            let zero = mid - beam.resultants(mid, loads).shear_z_n / w;
            if zero > a && zero < b {
                xs.push(zero);
            }
        }
    }
    xs.sort_by(f64::total_cmp);
    xs.dedup();
    xs
}

/// Arc lengths on a round face at position `x_m` where the bending stress is extreme (the
/// two extreme fibres) and where it is zero (the neutral axis, where transverse shear is
/// largest). The axial stress round a prismatic round section is a + b cos θ + c sin θ
/// (Navier; θ from the top line), so three samples fix it and its extreme lies at
/// θ = atan2(c, b).
fn round_critical_s_m(member: &Member, x_m: f64, radius_m: f64, loads: &LoadVector) -> Vec<f64> {
    let material = member.material();
    let axial_stress = |theta: f64| {
        let p = SurfacePoint::on_round(x_m, theta, radius_m);
        member
            .state_unchecked(&p, loads)
            .stress(material)
            .normal_x_pa
    };
    let (top, side, bottom) = (axial_stress(0.0), axial_stress(FRAC_PI_2), axial_stress(PI));
    let (mean, b) = ((top + bottom) / 2.0, (top - bottom) / 2.0);
    let theta = (side - mean).atan2(b);
    let theta = if theta.is_finite() { theta } else { 0.0 };
    (0..4)
        .map(|k| (theta + k as f64 * FRAC_PI_2) * radius_m)
        .collect()
}

/// Points on the hole edge of radius `a_m`: a ring of `4n` and the four angles where the
/// hoop stress is extreme. At the edge σθ = σx + σy − 2 D with
/// D = (σx − σy) cos 2θ + 2τ sin 2θ (Kirsch; Timoshenko & Goodier, *Theory of Elasticity*,
/// 3rd ed., §35), so the extremes sit at 2θ = atan2(2τ, σx − σy) and a quarter turn apart.
fn hole_edge_points(
    extent: &FaceExtent,
    a_m: f64,
    loads: &LoadVector,
    n: usize,
) -> Vec<SurfacePoint> {
    let sx = loads[LoadComponent::RemoteStressX];
    let sy = loads[LoadComponent::RemoteStressY];
    let tau = loads[LoadComponent::RemoteShearXY];
    let extreme = 0.5 * (2.0 * tau).atan2(sx - sy);
    let extreme = if extreme.is_finite() { extreme } else { 0.0 };
    let ring = (0..4 * n).map(|k| TAU * k as f64 / (4 * n) as f64);
    let critical = (0..4).map(|k| extreme + k as f64 * FRAC_PI_2);
    ring.chain(critical)
        .map(|t| SurfacePoint::new(extent.face, a_m * t.cos(), a_m * t.sin()))
        .collect()
}

/// `n` evenly spaced values from `a` to `b`, both included.
fn nodes((a, b): (f64, f64), n: usize) -> Vec<f64> {
    let n = n.max(2);
    (0..n)
        .map(|i| a + (b - a) * i as f64 / (n - 1) as f64)
        .collect()
}

/// The points of `extent` where the stress can peak beyond an `n × n` grid of nodes (see the
/// module notes). Points may need bringing onto the face with [`FaceExtent::locate`].
pub(crate) fn critical_points(
    member: &Member,
    extent: &FaceExtent,
    loads: &LoadVector,
    n: usize,
) -> Vec<SurfacePoint> {
    let face = extent.face;
    let critical_x = match member {
        Member::Beam(beam) => beam_critical_x_m(beam, loads),
        _ => Vec::new(),
    };
    let grid_x = nodes(extent.x_range_m, n);
    let mut across = nodes(extent.s_range_m, n);
    let mut points = Vec::new();
    let prismatic = matches!(member, Member::Beam(_) | Member::Shaft(_));
    if extent.wraps && prismatic {
        let radius_m = extent.s_range_m.1 / PI;
        for &x in critical_x.iter().chain(&grid_x) {
            let s_extremes = round_critical_s_m(member, x, radius_m, loads);
            points.extend(s_extremes.iter().map(|&s| SurfacePoint::new(face, x, s)));
        }
    } else if !extent.wraps {
        across.push((extent.s_range_m.0 + extent.s_range_m.1) / 2.0);
        let centre = across[across.len() - 1];
        points.extend(grid_x.iter().map(|&x| SurfacePoint::new(face, x, centre)));
    }
    for &x in &critical_x {
        points.extend(across.iter().map(|&s| SurfacePoint::new(face, x, s)));
    }
    if let Some(a_m) = extent.hole_radius_m {
        points.extend(hole_edge_points(extent, a_m, loads, n));
    }
    points
}
