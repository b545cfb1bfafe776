//! Placement warnings on the demo: a grid too near a clamp, support, load point, end or hole; a
//! grid off its face; overlapping grids; a gauge in no bridge; a steep gradient across a grid.
//! Each appears at the gauge when the gauge is put in a bad place and goes when it is moved to
//! a good one. The demo as bundled has none.

use gw_mechanics::{
    BeamSupport, Face, LoadComponent, LoadPoint, Member, PlateWithHole, SurfacePoint,
};
use gw_plan::Project;
use gw_plan::demo::demo_project;
use gw_plan::evaluate::{EvalOptions, Finding, Severity, Target, evaluate};
use gw_plan::units::Units;

const ARM: usize = 0;
const SHAFT: usize = 1;
const SHELL: usize = 2;

/// The warnings at gauge `gauge` of part `part` whose message contains `words`.
fn warnings(p: &Project, part: usize, gauge: usize, words: &str) -> Vec<Finding> {
    evaluate(p, &EvalOptions::default())
        .findings
        .into_iter()
        .filter(|f| {
            f.severity == Severity::Warn
                && f.target == Target::Gauge { part, gauge }
                && f.message.contains(words)
        })
        .collect()
}

/// The one warning at the gauge containing `words`, checked to name the part and the gauge.
fn one_warning(p: &Project, part: usize, gauge: usize, words: &str) -> String {
    let found = warnings(p, part, gauge, words);
    assert_eq!(
        found.len(),
        1,
        "one warning with \"{words}\" at gauge {gauge} of part {part}: {:#?}",
        evaluate(p, &EvalOptions::default()).findings
    );
    let message = found[0].message.clone();
    let g = &p.parts[part].gauges[gauge];
    assert!(
        message.contains(&format!("part \"{}\"", p.parts[part].name))
            && message.contains(&format!("gauge {}", g.id)),
        "{message}"
    );
    message
}

fn no_warning(p: &Project, part: usize, gauge: usize, words: &str) {
    let found = warnings(p, part, gauge, words);
    assert!(found.is_empty(), "{found:#?}");
}

/// Moves gauge `gauge` of part `part` to (x, s) in millimetres on its face.
fn place(p: &mut Project, part: usize, gauge: usize, x_mm: f64, s_mm: f64) {
    let g = &mut p.parts[part].gauges[gauge];
    g.position = SurfacePoint::new(g.position.face, x_mm * 1e-3, s_mm * 1e-3);
}

#[test]
fn the_bundled_demo_has_no_findings() {
    let ev = evaluate(&demo_project(), &EvalOptions::default());
    assert!(ev.findings.is_empty(), "{:#?}", ev.findings);
}

#[test]
fn a_grid_near_the_clamp_warns_until_it_is_moved_clear() {
    let mut p = demo_project();
    // A1: a 3 mm grid along the arm, centre 5 mm from the clamp: its edge is 3.5 mm away.
    place(&mut p, ARM, 0, 5.0, -7.5);
    let m = one_warning(&p, ARM, 0, "clamp");
    for words in [
        "within 3.5 mm of the clamp at x = 0 mm",
        "Saint-Venant's principle (Timoshenko & Goodier, Theory of Elasticity, §18; about one \
         section depth — common practice)",
        "section depth of 60 mm",
        "move it at least 43 mm from the clamp (grid centre at x ≥ 45 mm)",
    ] {
        assert!(m.contains(words), "{words}: {m}");
    }
    // 0.71 of the 60 mm depth is 42.7 mm: an edge at 42.0 mm warns, one at 43.5 mm does not.
    place(&mut p, ARM, 0, 43.5, -7.5);
    one_warning(&p, ARM, 0, "clamp");
    place(&mut p, ARM, 0, 45.0, -7.5);
    no_warning(&p, ARM, 0, "clamp");
    place(&mut p, ARM, 0, 50.0, -7.5);
    no_warning(&p, ARM, 0, "clamp");
}

#[test]
fn a_placement_warning_reads_in_us_customary_units() {
    let mut p = demo_project();
    place(&mut p, ARM, 0, 5.0, -7.5);
    let found = warnings(&p, ARM, 0, "clamp");
    let us = found[0].text(Units::UsCustomary);
    // 3.5 mm = 0.1378 in and 60 mm = 2.362 in (1 in = 25.4 mm exactly, NIST SP 811,
    // Appendix B); the clearance, just under 42.67 mm (1.680 in), is rounded up to the shown
    // hundredth so that it still keeps the grid clear.
    for words in [
        "within 0.138 in of the clamp at x = 0 in",
        "section depth of 2.36 in",
        "move it at least 1.68 in from the clamp",
    ] {
        assert!(us.contains(words), "{words}: {us}");
    }
    assert!(!us.contains(" mm"), "{us}");
    assert_eq!(found[0].text(Units::Si), found[0].message);
}

#[test]
fn a_grid_near_the_load_point_warns() {
    let mut p = demo_project();
    // S1, the ±45° pair on the front face: at 440 mm its grids reach to 441.7 mm, 8.3 mm from
    // the load at the free end (450 mm).
    place(&mut p, ARM, 4, 440.0, 0.0);
    let m = one_warning(&p, ARM, 4, "load point");
    assert!(
        m.contains("within 8.3 mm of the load point at x = 450 mm"),
        "{m}"
    );
    assert!(m.contains("grid centre at x ≤ 405 mm"), "{m}");
    place(&mut p, ARM, 4, 250.0, 0.0);
    no_warning(&p, ARM, 4, "load point");
}

#[test]
fn a_grid_near_a_pin_support_warns() {
    let mut p = demo_project();
    let Member::Beam(beam) = &mut p.parts[ARM].member else {
        panic!("the demo's arm is a beam")
    };
    // Four-point bending: pins at both ends, half the force at 150 and at 300 mm.
    beam.support = BeamSupport::SimplySupported;
    beam.load_points = vec![
        LoadPoint {
            position_m: 0.15,
            multiple: 0.5,
        },
        LoadPoint {
            position_m: 0.3,
            multiple: 0.5,
        },
    ];
    // The bending gauges at 50 mm stay 48.5 mm from the pin at x = 0: clear.
    no_warning(&p, ARM, 0, "support");
    place(&mut p, ARM, 4, 430.0, 0.0);
    let m = one_warning(&p, ARM, 4, "support");
    assert!(m.contains("of the support at x = 450 mm"), "{m}");
    // Between the load points, more than 43 mm from each: clear of everything.
    place(&mut p, ARM, 4, 225.0, 0.0);
    no_warning(&p, ARM, 4, "move it");
    // Near the second load point.
    place(&mut p, ARM, 4, 290.0, 0.0);
    let m = one_warning(&p, ARM, 4, "load point");
    assert!(m.contains("the load point at x = 300 mm"), "{m}");
}

#[test]
fn a_grid_near_a_shaft_end_warns() {
    let mut p = demo_project();
    // B1 on the 60 mm shaft, 600 mm long.
    place(&mut p, SHAFT, 2, 20.0, 0.0);
    let m = one_warning(&p, SHAFT, 2, "end at x = 0 mm");
    assert!(m.contains("shoulders, hubs or couplings"), "{m}");
    assert!(m.contains("outer diameter of 60 mm"), "{m}");
    place(&mut p, SHAFT, 2, 580.0, 0.0);
    one_warning(&p, SHAFT, 2, "end at x = 600 mm");
    place(&mut p, SHAFT, 2, 150.0, 0.0);
    no_warning(&p, SHAFT, 2, "end");
}

#[test]
fn a_grid_near_a_vessel_end_warns_within_the_shell_bending_length() {
    let mut p = demo_project();
    // P2, a hoop grid on the shell (220 mm diameter, 9 mm wall): the bending of the wall at
    // a head dies out over 3/β ≈ 72 mm, much less than the diameter.
    let s = p.parts[SHELL].gauges[1].position.s_m * 1e3;
    place(&mut p, SHELL, 1, 50.0, s);
    let m = one_warning(&p, SHELL, 1, "end at x = 0 mm");
    assert!(m.contains("heads or fittings"), "{m}");
    assert!(m.contains("move it at least 72 mm from the end"), "{m}");
    place(&mut p, SHELL, 1, 100.0, s);
    no_warning(&p, SHELL, 1, "end");
    place(&mut p, SHELL, 1, 400.0, s);
    no_warning(&p, SHELL, 1, "end");
}

/// The demo's shell made a 200 mm square plate with a central hole of `hole_mm`, loaded by a
/// remote stress along x; its gauges moved onto the plate face.
fn plate(hole_mm: f64) -> Project {
    let mut p = demo_project();
    let part = &mut p.parts[SHELL];
    let material = part.member.material().clone();
    part.member = Member::PlateWithHole(PlateWithHole {
        hole_diameter_m: hole_mm * 1e-3,
        width_m: 0.2,
        height_m: 0.2,
        thickness_m: 0.01,
        material,
    });
    for case in &mut part.load_cases {
        case.loads = vec![(LoadComponent::RemoteStressX, 80e6)];
    }
    for b in &mut part.bridges {
        b.wanted = LoadComponent::RemoteStressX;
    }
    for (g, (x, s)) in part
        .gauges
        .iter_mut()
        .zip([(60e-3, 60e-3), (-60e-3, 60e-3)])
    {
        g.position = SurfacePoint::new(Face::Plate, x, s);
        g.angle_rad = 0.0;
    }
    p
}

#[test]
fn a_grid_near_the_hole_edge_warns_and_one_over_the_hole_does_not_fit() {
    let mut p = plate(20.0);
    no_warning(&p, SHELL, 1, "hole");
    // P2 along x above the hole (radius 10 mm): its edge 1.1 mm from the hole edge.
    place(&mut p, SHELL, 1, 0.0, 12.0);
    let m = one_warning(&p, SHELL, 1, "hole edge");
    assert!(
        m.contains("within 1.1 mm of the hole edge (hole radius 10 mm)"),
        "{m}"
    );
    assert!(
        m.contains("move it at least 5.0 mm from the hole edge"),
        "{m}"
    );
    // Its centre is on the plate, but the grid reaches 0.6 mm into the hole.
    place(&mut p, SHELL, 1, 0.0, 10.3);
    let m = one_warning(&p, SHELL, 1, "does not fit");
    assert!(m.contains("lies over the hole"), "{m}");
    no_warning(&p, SHELL, 1, "hole edge");
    // 6 mm from the edge: clear.
    place(&mut p, SHELL, 1, 0.0, 16.0);
    no_warning(&p, SHELL, 1, "hole");
}

#[test]
fn a_grid_off_its_face_warns() {
    let mut p = demo_project();
    // A1 on the 30 mm wide top face: at s = 14.5 mm its 1.8 mm wide grid reaches 15.4 mm.
    place(&mut p, ARM, 0, 50.0, 14.5);
    let m = one_warning(&p, ARM, 0, "does not fit on the top face");
    assert!(
        m.contains("s = 15.40 mm lies outside -15.00 to 15.00 mm"),
        "{m}"
    );
    // Turned across the arm, its 3 mm length reaches out where its width did not.
    place(&mut p, ARM, 0, 50.0, 13.8);
    no_warning(&p, ARM, 0, "does not fit");
    p.parts[ARM].gauges[0].angle_rad = 90f64.to_radians();
    one_warning(&p, ARM, 0, "does not fit on the top face");
    place(&mut p, ARM, 0, 50.0, 13.0);
    no_warning(&p, ARM, 0, "does not fit");
    // On the shaft's round face only the ends count: B1 at 1 mm from the end.
    place(&mut p, SHAFT, 2, 1.0, 0.0);
    one_warning(&p, SHAFT, 2, "does not fit on the outer surface");
}

#[test]
fn overlapping_grids_of_two_gauges_warn_at_both() {
    let mut p = demo_project();
    // A3 beside A1 on the top face, 1.5 mm apart across 1.8 mm wide grids.
    place(&mut p, ARM, 2, 50.0, -6.0);
    let a1 = one_warning(&p, ARM, 0, "overlaps");
    assert!(a1.contains("the grid of gauge A3 on the top face"), "{a1}");
    let a3 = one_warning(&p, ARM, 2, "overlaps");
    assert!(a3.contains("the grid of gauge A1"), "{a3}");
    assert!(a3.contains("centres 1.5 mm apart"), "{a3}");
    // 2 mm apart: the grids are clear.
    place(&mut p, ARM, 2, 50.0, -5.5);
    no_warning(&p, ARM, 0, "overlaps");
    no_warning(&p, ARM, 2, "overlaps");
    // The stacked grids of one gauge (P1, two-element) are meant to overlap.
    no_warning(&p, SHELL, 0, "overlaps");
}

#[test]
fn a_gauge_in_no_bridge_warns_until_a_bridge_uses_it() {
    let mut p = demo_project();
    let mut extra = p.parts[ARM].gauges[0].clone();
    extra.id = "X1".into();
    extra.position = SurfacePoint::new(Face::Top, 0.2, 0.0);
    p.parts[ARM].gauges.push(extra);
    let x1 = p.parts[ARM].gauges.len() - 1;
    let m = one_warning(&p, ARM, x1, "in no bridge");
    assert!(m.contains("put one of its grids in a bridge arm"), "{m}");
    // As the dummy in the shear-web bridge's fourth arm (S2 stays wired through the third).
    p.parts[ARM].bridges[1].arms[3] = gw_plan::PlanArm::Dummy {
        gauge: "X1".into(),
        grid: 1,
    };
    no_warning(&p, ARM, x1, "in no bridge");
    no_warning(&p, ARM, 5, "in no bridge");
    // Without the shear-web bridge, S1 and S2 are read by nothing.
    p.parts[ARM].bridges.remove(1);
    one_warning(&p, ARM, 4, "in no bridge");
    one_warning(&p, ARM, 5, "in no bridge");
}

#[test]
fn a_steep_gradient_across_the_grid_warns() {
    // A grid pointing at a 20 mm hole, across the load, its near end 5.5 mm from the edge
    // (clear of the hole-edge check): the strain along it falls steeply towards the hole, and
    // its average is 7 % larger than its centre value.
    let mut p = plate(20.0);
    p.parts[SHELL].gauges[1].angle_rad = 90f64.to_radians();
    place(&mut p, SHELL, 1, 0.0, 17.0);
    let m = one_warning(&p, SHELL, 1, "changes steeply");
    assert!(
        m.contains("the grid averages -23.0 µε against -21.5 µε at its centre (+7 %"),
        "{m}"
    );
    assert!(m.contains("more than the 5 % of common practice"), "{m}");
    no_warning(&p, SHELL, 1, "hole edge");
    // Further out the field is even.
    place(&mut p, SHELL, 1, 0.0, 40.0);
    no_warning(&p, SHELL, 1, "changes steeply");
}
