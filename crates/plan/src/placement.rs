//! Placement checks, each a warning at the gauge: a grid that comes closer to a clamp, support,
//! load point, end or hole than the model's field can be trusted; a grid that leaves its face;
//! grids of different gauges that overlap; a gauge no bridge reads; and a grid over which the
//! strain changes so fast that its average differs from the value at its centre.
//!
//! Every check takes the grid's footprint (centre ± half its length and width, turned by the
//! grid angle, for every element of a rosette), not only its centre.

use gw_bridge::PlacedGauge;
use gw_mechanics::{
    Beam, BeamSupport, GridFootprint, LoadComponent, Member, QuadratureOrder, ThinCylinder,
    grid_average_strain,
};

use crate::document::{LoadCase, Part, PlanArm};
use crate::evaluate::{Finding, Severity, Target};
use crate::marked::{Rounding, mark, mark_rounded};
use crate::units::Quantity;

/// The share of an end disturbance still left where the end checks stop warning, and the
/// largest difference between a grid's average and its centre value before the gradient check
/// warns: 5 % (common practice).
pub const PLACEMENT_TOLERANCE: f64 = 0.05;

/// How fast the slowest self-equilibrated end disturbance of a plane strip of depth h dies
/// out: its stresses fall as e^(−k·x/h) with k = Re w₁ ≈ 4.212, w₁ the first complex root of
/// sin w + w = 0 (the Papkovich–Fadle eigenfunctions of the strip, symmetric family; Timoshenko
/// & Goodier, *Theory of Elasticity*, 3rd ed., §26, from memory — the unit test below finds the
/// root). The antisymmetric (bending) family dies out faster, k ≈ 7.50.
pub const STRIP_END_DECAY_PER_DEPTH: f64 = 4.2124;

/// Clearance between a grid and the edge of a plate's hole, in hole radii: within half a
/// radius of the edge the Kirsch hoop stress falls from 3 to about 1.5 times the remote stress
/// (uniaxial tension, across the load; Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed.,
/// §35, from memory), so the reading depends steeply on where the grid sits.
pub const HOLE_EDGE_CLEARANCE_RADII: f64 = 0.5;

/// Centre strains below this are too small for the gradient check to mean anything, m/m.
pub const GRADIENT_CHECK_MIN_STRAIN: f64 = 1e-6;

/// Appends the placement warnings of one part, each targeted at its gauge. `gauges` are the
/// part's resolved gauges, in the order of `part.gauges`.
pub fn placement_findings(
    pi: usize,
    part: &Part,
    gauges: &[PlacedGauge],
    quadrature: QuadratureOrder,
    findings: &mut Vec<Finding>,
) {
    let mut notes: Vec<(usize, String)> = end_effect_notes(part, gauges);
    notes.extend(hole_edge_notes(&part.member, gauges));
    notes.extend(fit_notes(&part.member, gauges));
    notes.extend(overlap_notes(&part.member, gauges));
    notes.extend(unwired_notes(part, gauges));
    notes.extend(gradient_notes(part, gauges, quadrature));
    notes.extend(crate::imported_part::mesh_notes(part, gauges, quadrature));
    notes.extend(crate::imported_part::datum_notes(part, gauges));
    // One gauge's warnings together, in gauge order.
    notes.sort_by_key(|(gi, _)| *gi);
    for (gi, note) in notes {
        let Some(g) = gauges.get(gi) else {
            continue;
        };
        findings.push(Finding::marked(
            Severity::Warn,
            format!("part \"{}\", gauge {}: {note}", part.name, g.id),
            Target::Gauge {
                part: pi,
                gauge: gi,
            },
        ));
    }
}

/// The footprint of every element of a gauge (a rosette's elements share one centre).
fn footprints(g: &PlacedGauge) -> impl Iterator<Item = GridFootprint> + '_ {
    (0..g.element_count()).map(|k| g.footprint(k))
}

/// The range of x that the gauge's grids cover, metres.
fn x_span(g: &PlacedGauge) -> (f64, f64) {
    footprints(g)
        .flat_map(|f| f.corners())
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), c| {
            (lo.min(c.x_m), hi.max(c.x_m))
        })
}

/// A place along the member where the real part departs from the model: a clamp, a support,
/// a load point, an end with its fittings.
struct EndEffect {
    /// Position along the member, metres.
    x_m: f64,
    /// What it is, e.g. "the clamp".
    what: String,
    /// What the real part has there, for the message (may be empty).
    detail: &'static str,
}

impl EndEffect {
    fn new(x_m: f64, what: &str, detail: &'static str) -> Self {
        Self {
            x_m,
            what: what.to_owned(),
            detail,
        }
    }
}

/// How far from an end effect the model's field holds on a member, and the rule that says so.
struct Reach {
    /// Clearance between the grid and the end effect, metres.
    clearance_m: f64,
    /// The rule with its source and numbers, for the message.
    rule: String,
}

/// Saint-Venant's principle: a disturbance at an end dies out within about one section depth
/// (Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., §18; the distance is common
/// practice). The check warns until the slowest end disturbance of a strip of that depth has
/// fallen to [`PLACEMENT_TOLERANCE`]: ln(1/0.05) / 4.212 ≈ 0.71 depths (at one full depth it is
/// down to 1.5 %).
fn saint_venant(depth_m: f64, depth_name: &str) -> Reach {
    let clearance_m = depth_m * (1.0 / PLACEMENT_TOLERANCE).ln() / STRIP_END_DECAY_PER_DEPTH;
    Reach {
        clearance_m,
        rule: format!(
            "by Saint-Venant's principle (Timoshenko & Goodier, Theory of Elasticity, §18; about \
             one section depth — common practice) its disturbance dies out over about the \
             {depth_name} of {} and is below {:.0} % from {} on",
            mm(depth_m),
            PLACEMENT_TOLERANCE * 100.0,
            mm_rounded(clearance_m, true)
        ),
    }
}

/// A thin-walled cylinder's wall bends where a head or fitting holds it; the bending dies out
/// as e^(−βx) cos βx with β = [3(1 − ν²)]^¼ / √(r t), r the mean radius (Timoshenko &
/// Woinowsky-Krieger, *Theory of Plates and Shells*, 2nd ed., symmetrical deformation of
/// cylindrical shells, from memory). Much shorter than a diameter for a thin wall, so the
/// section-depth rule would warn far from any real disturbance. The check warns until the
/// envelope has fallen to [`PLACEMENT_TOLERANCE`].
fn shell_bending(cylinder: &ThinCylinder) -> Reach {
    let nu = cylinder.material.poisson_ratio;
    let rt = cylinder.mean_radius_m() * cylinder.wall_m;
    let beta = (3.0 * (1.0 - nu * nu)).powf(0.25) / rt.sqrt();
    let clearance_m = (1.0 / PLACEMENT_TOLERANCE).ln() / beta;
    Reach {
        clearance_m,
        rule: format!(
            "the wall bends where a head or fitting holds it, and that bending dies out as \
             e^(−x/{}) (thin-shell theory: Timoshenko & Woinowsky-Krieger, Theory of Plates and \
             Shells; from memory), below {:.0} % from {} on",
            mm(1.0 / beta),
            PLACEMENT_TOLERANCE * 100.0,
            mm_rounded(clearance_m, true)
        ),
    }
}

/// Where the member departs from its model along x, and how far that reaches.
fn end_effects(part: &Part) -> Option<(Vec<EndEffect>, Reach)> {
    let ends = |length_m: f64, detail: &'static str| {
        vec![
            EndEffect::new(0.0, "the end", detail),
            EndEffect::new(length_m, "the end", detail),
        ]
    };
    match &part.member {
        Member::Beam(b) => {
            // The larger of height and width: loads in either plane are disturbed.
            let depth_m = b.section.height_m().max(b.section.width_m());
            Some((
                beam_end_effects(b, &part.load_cases),
                saint_venant(depth_m, "section depth"),
            ))
        }
        Member::Shaft(s) => Some((
            ends(
                s.length_m,
                "shoulders, hubs or couplings sit there on the real shaft",
            ),
            saint_venant(s.outer_diameter_m, "outer diameter"),
        )),
        Member::ThickCylinder(c) => Some((
            ends(c.length_m, "heads or fittings sit there on the real vessel"),
            saint_venant(c.outer_diameter_m, "outer diameter"),
        )),
        Member::ThinCylinder(c) => Some((
            ends(c.length_m, "heads or fittings sit there on the real vessel"),
            shell_bending(c),
        )),
        _ => None,
    }
}

/// The supports and load points of a beam (and a cantilever's free end when end loads come in
/// there), one entry per position.
fn beam_end_effects(beam: &Beam, cases: &[LoadCase]) -> Vec<EndEffect> {
    use LoadComponent::*;
    let l = beam.length_m;
    let mut out = Vec::new();
    match beam.support {
        BeamSupport::Cantilever => out.push(EndEffect::new(0.0, "the clamp", "")),
        BeamSupport::SimplySupported => {
            out.push(EndEffect::new(0.0, "the support", ""));
            out.push(EndEffect::new(l, "the support", ""));
        }
    }
    let carries = |components: &[LoadComponent]| {
        cases
            .iter()
            .any(|c| components.iter().any(|&k| c.value(k) != 0.0))
    };
    let mut add = |e: EndEffect| {
        let tol = 1e-9 * l.max(1e-3);
        if out.iter().all(|o| (o.x_m - e.x_m).abs() > tol) {
            out.push(e);
        }
    };
    if carries(&[VerticalForce, LateralForce]) {
        for p in beam.load_points.iter().filter(|p| p.multiple != 0.0) {
            add(EndEffect::new(p.position_m, "the load point", ""));
        }
    }
    if beam.support == BeamSupport::Cantilever
        && carries(&[AxialForce, BendingMomentY, BendingMomentZ])
    {
        add(EndEffect::new(
            l,
            "the free end",
            "the axial force and applied moments come in there",
        ));
    }
    out
}

/// Rule 1: grids closer to a clamp, support, load point or end than the model's field holds.
fn end_effect_notes(part: &Part, gauges: &[PlacedGauge]) -> Vec<(usize, String)> {
    let Some((effects, reach)) = end_effects(part) else {
        return Vec::new();
    };
    let mut notes = Vec::new();
    for (gi, g) in gauges.iter().enumerate() {
        let (lo, hi) = x_span(g);
        for e in &effects {
            let gap = (lo - e.x_m).max(e.x_m - hi).max(0.0);
            if gap >= reach.clearance_m {
                continue;
            }
            let place = format!("{} at x = {}", e.what, mm(e.x_m));
            let place = if e.detail.is_empty() {
                place
            } else {
                format!("{place} ({})", e.detail)
            };
            let near = if gap > 0.0 {
                format!("its grid comes within {} of {place}", mm(gap))
            } else {
                format!("its grid reaches over {place}")
            };
            // Keep the gauge on its side of the end effect; the grid's edge sets the distance.
            let after = g.position.x_m >= e.x_m;
            let (centre, sign) = if after {
                (e.x_m + reach.clearance_m + (g.position.x_m - lo), "≥")
            } else {
                (e.x_m - reach.clearance_m - (hi - g.position.x_m), "≤")
            };
            notes.push((
                gi,
                format!(
                    "{near}, where the model's field does not hold: {}; move it at least {} \
                     from {} (grid centre at x {sign} {})",
                    reach.rule,
                    mm_rounded(reach.clearance_m, true),
                    e.what,
                    mm_rounded(centre, after)
                ),
            ));
        }
    }
    notes
}

/// Distance from the origin (a plate's hole centre) to the nearest point of a footprint, m.
fn distance_from_origin(f: &GridFootprint) -> f64 {
    let (sin, cos) = f.angle_rad.sin_cos();
    let (dx, ds) = (-f.center.x_m, -f.center.s_m);
    let along = (dx * cos + ds * sin).abs() - f.length_m / 2.0;
    let across = (-dx * sin + ds * cos).abs() - f.width_m / 2.0;
    along.max(0.0).hypot(across.max(0.0))
}

/// The hole radius of a plate, and how close each gauge's grids come to the hole centre.
fn hole_distances(member: &Member, gauges: &[PlacedGauge]) -> Option<(f64, Vec<f64>)> {
    let Member::PlateWithHole(plate) = member else {
        return None;
    };
    let nearest = gauges
        .iter()
        .map(|g| {
            footprints(g)
                .map(|f| distance_from_origin(&f))
                .fold(f64::INFINITY, f64::min)
        })
        .collect();
    Some((plate.hole_diameter_m / 2.0, nearest))
}

/// Rule 1 on a plate: the Kirsch field holds up to the hole's edge, but within half a radius of
/// it the reading depends steeply on where the grid sits.
fn hole_edge_notes(member: &Member, gauges: &[PlacedGauge]) -> Vec<(usize, String)> {
    let Some((radius_m, nearest)) = hole_distances(member, gauges) else {
        return Vec::new();
    };
    let clearance_m = HOLE_EDGE_CLEARANCE_RADII * radius_m;
    nearest
        .iter()
        .enumerate()
        // A grid over the hole is the fit check's to report.
        .filter(|(_, d)| **d >= radius_m && **d - radius_m < clearance_m)
        .map(|(gi, d)| {
            (
                gi,
                format!(
                    "its grid comes within {} of the hole edge (hole radius {}); within half a \
                     radius of the edge the stress falls from 3 to about 1.5 times the remote \
                     stress (Kirsch: Timoshenko & Goodier, Theory of Elasticity, §35; from \
                     memory), so the reading depends steeply on where the grid sits — place it \
                     with a template and check the position tolerance, or move it at least {} \
                     from the hole edge",
                    mm(d - radius_m),
                    mm(radius_m),
                    mm_rounded(clearance_m, true)
                ),
            )
        })
        .collect()
}

/// Rule 2: a grid whose footprint leaves its face (round faces wrap round, so only x counts
/// there) or lies partly over a plate's hole.
fn fit_notes(member: &Member, gauges: &[PlacedGauge]) -> Vec<(usize, String)> {
    let faces = member.faces();
    let holes = hole_distances(member, gauges);
    let mut notes = Vec::new();
    for (gi, g) in gauges.iter().enumerate() {
        let Some(extent) = faces.iter().find(|f| f.face == g.position.face) else {
            continue;
        };
        // The hole is checked against the whole rectangle below, not only its corners.
        let outline = gw_mechanics::FaceExtent {
            hole_radius_m: None,
            ..*extent
        };
        let off_face = footprints(g)
            .flat_map(|f| f.corners())
            .find_map(|c| outline.locate(&c).err())
            .map(|why| {
                format!(
                    "does not fit on the {}: at one corner, {why}; move it onto the face or \
                     choose a smaller gauge",
                    g.position.face.name()
                )
            });
        let over_hole = holes.as_ref().and_then(|(radius_m, nearest)| {
            let d = nearest.get(gi).copied()?;
            (d < radius_m * (1.0 - 1e-9)).then(|| {
                format!(
                    "does not fit on the plate: part of it lies over the hole (radius {}; the \
                     grid reaches {} from its centre); move it clear of the hole",
                    mm(*radius_m),
                    mm(d)
                )
            })
        });
        for problem in [off_face, over_hole].into_iter().flatten() {
            let (l, w) = (g.spec.grid_length_m, g.spec.grid_width_m);
            notes.push((gi, format!("its grid ({} × {}) {problem}", mm(l), mm(w))));
        }
    }
    notes
}

/// Whether two grid rectangles on one face overlap, by the separating-axis test (touching
/// edges do not count). `period_m` is the circumference of a face that wraps round in s.
fn grids_overlap(a: &GridFootprint, b: &GridFootprint, period_m: Option<f64>) -> bool {
    let mut ds = b.center.s_m - a.center.s_m;
    if let Some(p) = period_m.filter(|p| *p > 0.0) {
        ds -= p * (ds / p).round();
    }
    let dx = b.center.x_m - a.center.x_m;
    // Half the extent of a rectangle projected on the direction at `axis` radians.
    let reach = |f: &GridFootprint, axis: f64| {
        let t = f.angle_rad - axis;
        f.length_m / 2.0 * t.cos().abs() + f.width_m / 2.0 * t.sin().abs()
    };
    let right = std::f64::consts::FRAC_PI_2;
    [
        a.angle_rad,
        a.angle_rad + right,
        b.angle_rad,
        b.angle_rad + right,
    ]
    .into_iter()
    .all(|axis| {
        let gap = (dx * axis.cos() + ds * axis.sin()).abs();
        let sum = reach(a, axis) + reach(b, axis);
        gap < sum * (1.0 - 1e-9)
    })
}

/// Rule 3: grids of different gauges that overlap (a rosette's own stacked grids are meant to).
fn overlap_notes(member: &Member, gauges: &[PlacedGauge]) -> Vec<(usize, String)> {
    let faces = member.faces();
    let mut notes = Vec::new();
    for (i, a) in gauges.iter().enumerate() {
        for (j, b) in gauges.iter().enumerate().skip(i + 1) {
            if a.position.face != b.position.face {
                continue;
            }
            let period_m = faces
                .iter()
                .find(|f| f.face == a.position.face && f.wraps)
                .map(|f| f.s_range_m.1 - f.s_range_m.0);
            let overlap =
                footprints(a).any(|fa| footprints(b).any(|fb| grids_overlap(&fa, &fb, period_m)));
            if !overlap {
                continue;
            }
            let mut ds = b.position.s_m - a.position.s_m;
            if let Some(p) = period_m.filter(|p| *p > 0.0) {
                ds -= p * (ds / p).round();
            }
            let apart = mm((b.position.x_m - a.position.x_m).hypot(ds));
            let face = a.position.face.name();
            for (k, other) in [(i, b), (j, a)] {
                notes.push((
                    k,
                    format!(
                        "its grid overlaps the grid of gauge {} on the {face} (centres {apart} \
                         apart); move one of them so the grids, and their carriers, are clear of \
                         each other",
                        other.id
                    ),
                ));
            }
        }
    }
    notes
}

/// Rule 4: a gauge that no bridge arm names, as a grid or as a dummy.
fn unwired_notes(part: &Part, gauges: &[PlacedGauge]) -> Vec<(usize, String)> {
    gauges
        .iter()
        .enumerate()
        .filter(|(_, g)| {
            !part.bridges.iter().flat_map(|b| &b.arms).any(|a| {
                matches!(a, PlanArm::Grid { gauge, .. } | PlanArm::Dummy { gauge, .. } if *gauge == g.id)
            })
        })
        .map(|(gi, _)| {
            (
                gi,
                "it is in no bridge, so nothing reads it; put one of its grids in a bridge arm \
                 (or use it as a dummy), or delete the gauge"
                    .to_owned(),
            )
        })
        .collect()
}

/// What the gradient check found on one grid.
struct Gradient {
    element: usize,
    case: String,
    average: f64,
    centre: f64,
}

impl Gradient {
    fn relative(&self) -> f64 {
        (self.average - self.centre) / self.centre
    }
}

/// The grid average and the centre value of the mechanical strain along one grid, at the load
/// case where the centre value is largest. `None` when nothing can be computed or the centre
/// value is below [`GRADIENT_CHECK_MIN_STRAIN`].
fn grid_gradient(
    part: &Part,
    g: &PlacedGauge,
    element: usize,
    quadrature: QuadratureOrder,
) -> Option<Gradient> {
    let member = &part.member;
    let grid = g.footprint(element);
    let (case, loads, centre) = part
        .load_cases
        .iter()
        .filter_map(|case| {
            // A free thermal strain is uniform and the grid is compensated for it: only the
            // mechanical strain has a gradient.
            let mut loads = case.load_vector();
            loads[LoadComponent::TemperatureChange] = 0.0;
            let centre = member
                .state(&grid.center, &loads)
                .ok()?
                .strain
                .along(grid.angle_rad);
            Some((case, loads, centre))
        })
        .max_by(|a, b| a.2.abs().total_cmp(&b.2.abs()))?;
    if centre.abs() < GRADIENT_CHECK_MIN_STRAIN {
        return None;
    }
    let average = grid_average_strain(member, &grid, &loads, quadrature).ok()?;
    Some(Gradient {
        element,
        case: case.name.clone(),
        average,
        centre,
    })
}

/// Rule 5: the strain along a grid, averaged over its area, differs from its centre value by
/// more than [`PLACEMENT_TOLERANCE`] at the load case that strains it most (the grid's worst
/// element per gauge).
fn gradient_notes(
    part: &Part,
    gauges: &[PlacedGauge],
    quadrature: QuadratureOrder,
) -> Vec<(usize, String)> {
    // In a uniform field every grid reads its centre value.
    if matches!(
        part.member,
        Member::ThinCylinder(_)
            | Member::ThinSphere(_)
            | Member::ThickCylinder(_)
            | Member::GivenState(_)
    ) {
        return Vec::new();
    }
    let mut notes = Vec::new();
    for (gi, g) in gauges.iter().enumerate() {
        let worst = (0..g.element_count())
            .filter_map(|k| grid_gradient(part, g, k, quadrature))
            .filter(|r| r.relative().abs() > PLACEMENT_TOLERANCE)
            .max_by(|a, b| a.relative().abs().total_cmp(&b.relative().abs()));
        let Some(r) = worst else {
            continue;
        };
        let which = if g.element_count() > 1 {
            format!(" (grid {})", r.element + 1)
        } else {
            String::new()
        };
        notes.push((
            gi,
            format!(
                "the strain changes steeply under its grid{which}: at \"{}\" the grid averages \
                 {:.1} µε against {:.1} µε at its centre ({:+.0} %, more than the {:.0} % of \
                 common practice), so the reading depends on exactly where the grid sits; move \
                 it where the field is more even or choose a shorter grid",
                r.case,
                r.average * 1e6,
                r.centre * 1e6,
                r.relative() * 100.0,
                PLACEMENT_TOLERANCE * 100.0
            ),
        ));
    }
    notes
}

/// A length for a message, marked to read in either unit system ([`crate::marked`]).
fn mm(m: f64) -> String {
    mark(Quantity::Length, m)
}

/// A length for a "move it at least" message, rounded up (`up`) or down to the shown digit so
/// that the rounded figure still keeps the grid clear.
fn mm_rounded(m: f64, up: bool) -> String {
    let rounding = if up { Rounding::Up } else { Rounding::Down };
    mark_rounded(Quantity::Length, m, rounding)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::marked::render;
    use crate::units::Units;
    use gw_mechanics::{Face, SurfacePoint};

    fn grid(x_mm: f64, s_mm: f64, angle_deg: f64) -> GridFootprint {
        GridFootprint {
            center: SurfacePoint::new(Face::Top, x_mm * 1e-3, s_mm * 1e-3),
            angle_rad: angle_deg.to_radians(),
            length_m: 3e-3,
            width_m: 1.8e-3,
        }
    }

    #[test]
    fn strip_end_decay_is_the_first_root_of_sin_w_plus_w() {
        // Newton's method on f(w) = sin w + w in complex numbers (re, im).
        let (mut x, mut y): (f64, f64) = (4.0, 2.0);
        for _ in 0..50 {
            let (f_re, f_im) = (x.sin() * y.cosh() + x, x.cos() * y.sinh() + y);
            let (d_re, d_im) = (x.cos() * y.cosh() + 1.0, -x.sin() * y.sinh());
            let den = d_re * d_re + d_im * d_im;
            x -= (f_re * d_re + f_im * d_im) / den;
            y -= (f_im * d_re - f_re * d_im) / den;
        }
        // Timoshenko & Goodier §26 (from memory): 2λc = 4.2124 + 2.2507i.
        assert!((x - STRIP_END_DECAY_PER_DEPTH).abs() < 1e-4, "{x}");
        assert!((y - 2.2507).abs() < 1e-3, "{y}");
        // The clearance this gives: 0.71 of a section depth.
        let k = (1.0 / PLACEMENT_TOLERANCE).ln() / STRIP_END_DECAY_PER_DEPTH;
        assert!((k - 0.711).abs() < 1e-3, "{k}");
    }

    #[test]
    fn turned_grids_whose_bounding_boxes_overlap_are_apart_by_the_separating_axis() {
        // Both at 45°, side by side 2.0 mm apart across their 1.8 mm width: the axis-aligned
        // boxes overlap, the grids do not.
        let d = 2.0 / 2f64.sqrt();
        assert!(!grids_overlap(
            &grid(0.0, 0.0, 45.0),
            &grid(-d, d, 45.0),
            None
        ));
        let d = 1.6 / 2f64.sqrt();
        assert!(grids_overlap(
            &grid(0.0, 0.0, 45.0),
            &grid(-d, d, 45.0),
            None
        ));
        // Touching end to end is not overlapping.
        assert!(!grids_overlap(
            &grid(0.0, 0.0, 0.0),
            &grid(3.0, 0.0, 0.0),
            None
        ));
        // A round face wraps: s = 0 and s = circumference − 1 mm are 1 mm apart.
        assert!(grids_overlap(
            &grid(0.0, 0.0, 0.0),
            &grid(0.0, 99.0, 0.0),
            Some(0.1)
        ));
    }

    #[test]
    fn distance_from_the_hole_centre_to_a_turned_grid() {
        // A grid along x centred at (0, 12 mm): its near edge is 12 − 0.9 mm from the centre.
        assert!((distance_from_origin(&grid(0.0, 12.0, 0.0)) - 11.1e-3).abs() < 1e-12);
        // Turned 90°: its near end is 12 − 1.5 mm away.
        assert!((distance_from_origin(&grid(0.0, 12.0, 90.0)) - 10.5e-3).abs() < 1e-12);
        // A corner: centre (10, 10) mm, near corner at (8.5, 9.1) mm.
        let d = distance_from_origin(&grid(10.0, 10.0, 0.0));
        assert!((d - 8.5e-3f64.hypot(9.1e-3)).abs() < 1e-12);
    }

    #[test]
    fn rounded_lengths_keep_the_grid_clear() {
        let si = |text: String| render(&text, Units::Si);
        assert_eq!(si(mm_rounded(0.04267, true)), "43 mm");
        assert_eq!(si(mm_rounded(0.04267, false)), "42 mm");
        assert_eq!(si(mm_rounded(0.06, true)), "60 mm");
        assert_eq!(si(mm_rounded(0.00512, true)), "5.2 mm");
        assert_eq!(si(mm(0.0)), "0 mm");
        assert_eq!(si(mm(-0.0)), "0 mm");
        // 42.67 mm = 1.6799 in (1 in = 25.4 mm, NIST SP 811): 1.68 in up, 1.67 in down.
        assert_eq!(
            render(&mm_rounded(0.04267, true), Units::UsCustomary),
            "1.68 in"
        );
        assert_eq!(
            render(&mm_rounded(0.04267, false), Units::UsCustomary),
            "1.67 in"
        );
    }
}
