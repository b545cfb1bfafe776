//! Where the gauges of each standard arrangement go on each kind of part. The text here says
//! only where the grids sit and how they are wired; what each entry reads and cancels on the
//! actual part is worked out afterwards from the part itself.

use std::f64::consts::PI;

use gw_mechanics::{Face, LoadComponent, Member, Section, SurfacePoint};

use super::{ArmSlot, CatalogueEntry};
use crate::gauge::{GaugePattern, GaugeSpec, PlacedGauge};

const C: ArmSlot = ArmSlot::Completion;

const fn g(gauge: usize, element: usize) -> ArmSlot {
    ArmSlot::Grid { gauge, element }
}

const DUMMY: ArmSlot = ArmSlot::Dummy {
    gauge: 0,
    element: 0,
};

fn entry(name: &str, layout: &str, gauges: Vec<PlacedGauge>, arms: [ArmSlot; 4]) -> CatalogueEntry {
    CatalogueEntry {
        name: name.to_owned(),
        description: layout.to_owned(),
        gauges,
        arms,
    }
}

/// Places gauges of one type at one station of the part.
struct Placer<'a> {
    spec: &'a GaugeSpec,
    x: f64,
}

impl Placer<'_> {
    fn at(&self, pattern: GaugePattern, at: (Face, f64), angle_deg: f64) -> PlacedGauge {
        PlacedGauge {
            id: String::new(),
            spec: GaugeSpec {
                pattern,
                ..self.spec.clone()
            },
            position: SurfacePoint::new(at.0, self.x, at.1),
            angle_rad: angle_deg.to_radians(),
        }
    }
    fn single(&self, at: (Face, f64), angle_deg: f64) -> PlacedGauge {
        self.at(GaugePattern::SingleGrid, at, angle_deg)
    }
    fn tee(&self, at: (Face, f64), angle_deg: f64) -> PlacedGauge {
        self.at(GaugePattern::TwoElement90, at, angle_deg)
    }
    fn pair(&self, at: (Face, f64)) -> PlacedGauge {
        self.at(GaugePattern::ShearPair, at, 0.0)
    }

    /// One grid alone, with a dummy, and with a Poisson grid, along `what` at `at`.
    fn basic(&self, out: &mut Vec<CatalogueEntry>, at: (Face, f64), angle: f64, what: &str) {
        out.push(entry(
            "One active grid",
            &format!("one grid along the {what}, completion resistors in the other arms"),
            vec![self.single(at, angle)],
            [g(0, 0), C, C, C],
        ));
        out.push(entry(
            "Active grid with dummy",
            &format!(
                "one grid along the {what} and an unstrained dummy of the same type in the adjacent arm"
            ),
            vec![self.single(at, angle)],
            [g(0, 0), DUMMY, C, C],
        ));
        out.push(entry(
            "Active grid with Poisson grid",
            &format!("a grid along the {what} and one across it, in adjacent arms"),
            vec![self.tee(at, angle)],
            [g(0, 0), g(0, 1), C, C],
        ));
    }
}

/// The standard layouts for `wanted` on `member` at station `x`.
pub(super) fn layouts(
    member: &Member,
    wanted: LoadComponent,
    x: f64,
    spec: &GaugeSpec,
) -> Vec<CatalogueEntry> {
    let mut out = Vec::new();
    let p = Placer { spec, x };
    match member {
        Member::Beam(beam) => beam_layouts(&mut out, &p, &beam.section, wanted),
        Member::Shaft(shaft) => round_bar_layouts(&mut out, &p, shaft.radius_m(), wanted),
        Member::ThinCylinder(_) | Member::ThickCylinder(_) | Member::ThinSphere(_) => {
            vessel_layouts(&mut out, member, spec, x, wanted)
        }
        Member::PlateWithHole(plate) => {
            plate_layouts(&mut out, spec, plate.hole_diameter_m / 2.0, wanted)
        }
        Member::GivenState(_) => {
            if wanted == LoadComponent::GivenStateFactor {
                p.basic(
                    &mut out,
                    (Face::Plate, 0.0),
                    0.0,
                    "x axis of the given state",
                );
            }
        }
        // An imported part has no symmetry the catalogue could rely on: the engineer places
        // its gauges and the chooser wires them.
        Member::ImportedField(_) => {}
    }
    out
}

/// Where the top, bottom, front and back lines of a beam are: flat faces, or arc lengths on
/// the round surface of a round section (s from the top line towards +y).
fn beam_spot(section: &Section, face: Face) -> (Face, f64) {
    match section.radii_m() {
        Some((r, _)) => {
            let s = match face {
                Face::Top => 0.0,
                Face::Bottom => PI * r,
                Face::Back => PI * r / 2.0,
                _ => -PI * r / 2.0,
            };
            (Face::Round, s)
        }
        None => (face, 0.0),
    }
}

fn beam_layouts(
    out: &mut Vec<CatalogueEntry>,
    p: &Placer,
    section: &Section,
    wanted: LoadComponent,
) {
    use LoadComponent::*;
    let spot = |face| beam_spot(section, face);
    match wanted {
        VerticalForce | UniformLoad | BendingMomentY => vertical_bending(out, p, section),
        AxialForce => {
            p.basic(out, spot(Face::Top), 0.0, "beam axis on the top");
            out.push(entry(
                "Axial pair, top and bottom",
                "grids along the axis on the top and the bottom, in opposite arms",
                vec![
                    p.single(spot(Face::Top), 0.0),
                    p.single(spot(Face::Bottom), 0.0),
                ],
                [g(0, 0), C, g(1, 0), C],
            ));
            out.push(entry(
                "Axial, four grids with Poisson pairs",
                "a grid along the axis and one across it on the top and on the bottom; the axial grids in opposite arms, the cross grids between them",
                vec![p.tee(spot(Face::Top), 0.0), p.tee(spot(Face::Bottom), 0.0)],
                [g(0, 0), g(0, 1), g(1, 0), g(1, 1)],
            ));
        }
        LateralForce | BendingMomentZ => lateral_bending(out, p, section),
        _ => {}
    }
}

fn vertical_bending(out: &mut Vec<CatalogueEntry>, p: &Placer, section: &Section) {
    let spot = |face| beam_spot(section, face);
    p.basic(out, spot(Face::Top), 0.0, "beam axis on the top");
    out.push(entry(
        "Bending pair, top and bottom",
        "grids along the axis on the top and the bottom, in adjacent arms",
        vec![
            p.single(spot(Face::Top), 0.0),
            p.single(spot(Face::Bottom), 0.0),
        ],
        [g(0, 0), g(1, 0), C, C],
    ));
    if section.radii_m().is_none() {
        let w = section.width_m();
        let at = |face, s| (face, s);
        out.push(entry(
            "Bending, four grids on top and bottom",
            "two grids side by side on the top and two on the bottom, each top grid in an arm adjacent to a bottom grid",
            vec![
                p.single(at(Face::Top, -w / 4.0), 0.0),
                p.single(at(Face::Bottom, -w / 4.0), 0.0),
                p.single(at(Face::Top, w / 4.0), 0.0),
                p.single(at(Face::Bottom, w / 4.0), 0.0),
            ],
            [g(0, 0), g(1, 0), g(2, 0), g(3, 0)],
        ));
    }
    out.push(entry(
        "Shear-web pair, one side",
        "a ±45° pair on the side at the neutral axis, its two grids in adjacent arms",
        vec![p.pair(spot(Face::Front))],
        [g(0, 0), g(0, 1), C, C],
    ));
    out.push(entry(
        "Shear-web pairs, both sides",
        "±45° pairs on both sides at the neutral axis, wired as a full bridge",
        vec![p.pair(spot(Face::Front)), p.pair(spot(Face::Back))],
        [g(0, 0), g(0, 1), g(1, 1), g(1, 0)],
    ));
}

/// Lateral bending strains the part most at the extreme fibres across it: the side faces of a
/// rectangle or box, the flange tips of an I section (its side face is the thin web, at the
/// neutral axis of lateral bending), the side lines of a round bar.
fn lateral_bending(out: &mut Vec<CatalogueEntry>, p: &Placer, section: &Section) {
    if let Section::IBeam { flange_width_m, .. } = section {
        // The grid's centre half a grid width plus a grid length in from the flange edge.
        let s = flange_width_m / 2.0 - p.spec.grid_width_m / 2.0 - p.spec.grid_length_m;
        let tip = |face, side: f64| (face, side * s);
        p.basic(
            out,
            tip(Face::Top, 1.0),
            0.0,
            "beam axis at a tip of the top flange",
        );
        out.push(entry(
            "Lateral bending pair, flange tips",
            "grids along the axis at both tips of the top flange, in adjacent arms",
            vec![
                p.single(tip(Face::Top, 1.0), 0.0),
                p.single(tip(Face::Top, -1.0), 0.0),
            ],
            [g(0, 0), g(1, 0), C, C],
        ));
        out.push(entry(
            "Lateral bending, four flange tips",
            "grids along the axis at both tips of both flanges; the tips on one side in opposite arms, the two sides in adjacent arms",
            vec![
                p.single(tip(Face::Top, 1.0), 0.0),
                p.single(tip(Face::Top, -1.0), 0.0),
                p.single(tip(Face::Bottom, -1.0), 0.0),
                p.single(tip(Face::Bottom, 1.0), 0.0),
            ],
            [g(0, 0), g(1, 0), g(2, 0), g(3, 0)],
        ));
        return;
    }
    let spot = |face| beam_spot(section, face);
    p.basic(
        out,
        spot(Face::Back),
        0.0,
        "beam axis on the back side (+y)",
    );
    out.push(entry(
        "Lateral bending pair, both sides",
        "grids along the axis on the back (+y) and the front (−y) side, in adjacent arms",
        vec![
            p.single(spot(Face::Back), 0.0),
            p.single(spot(Face::Front), 0.0),
        ],
        [g(0, 0), g(1, 0), C, C],
    ));
}

fn round_bar_layouts(out: &mut Vec<CatalogueEntry>, p: &Placer, r: f64, wanted: LoadComponent) {
    use LoadComponent::*;
    let half_turn = PI * r;
    let round = |s: f64| (Face::Round, s);
    match wanted {
        Torque => {
            out.push(entry(
                "Torque pair at ±45°",
                "one ±45° pair, its grids in adjacent arms",
                vec![p.pair(round(0.0))],
                [g(0, 0), g(0, 1), C, C],
            ));
            out.push(entry(
                "Torque, four grids at ±45° on opposite sides",
                "two ±45° pairs half a turn apart, wired as a full bridge",
                vec![p.pair(round(0.0)), p.pair(round(half_turn))],
                [g(0, 0), g(0, 1), g(1, 0), g(1, 1)],
            ));
        }
        BendingMomentY | BendingMomentZ => {
            let s0 = if wanted == BendingMomentY {
                0.0
            } else {
                half_turn / 2.0
            };
            p.basic(out, round(s0), 0.0, "shaft axis");
            out.push(entry(
                "Bending pair on opposite sides",
                "grids along the axis half a turn apart, in adjacent arms",
                vec![
                    p.single(round(s0), 0.0),
                    p.single(round(s0 + half_turn), 0.0),
                ],
                [g(0, 0), g(1, 0), C, C],
            ));
        }
        AxialForce => {
            p.basic(out, round(0.0), 0.0, "shaft axis");
            out.push(entry(
                "Axial, four grids with Poisson pairs",
                "axial and hoop grids half a turn apart, the axial grids in opposite arms",
                vec![p.tee(round(0.0), 0.0), p.tee(round(half_turn), 0.0)],
                [g(0, 0), g(0, 1), g(1, 0), g(1, 1)],
            ));
        }
        _ => {}
    }
}

fn vessel_layouts(
    out: &mut Vec<CatalogueEntry>,
    member: &Member,
    spec: &GaugeSpec,
    x: f64,
    wanted: LoadComponent,
) {
    use LoadComponent::*;
    if !matches!(wanted, InternalPressure | ExternalPressure) {
        return;
    }
    let (outer_d, x) = match member {
        Member::ThinCylinder(v) => (v.outer_diameter_m, x),
        Member::ThickCylinder(v) => (v.outer_diameter_m, x),
        Member::ThinSphere(v) => (v.outer_diameter_m, 0.0),
        _ => return,
    };
    let p = Placer { spec, x };
    let half_turn = PI * outer_d / 2.0;
    let round = |s: f64| (Face::Round, s);
    out.push(entry(
        "One hoop grid",
        "one grid round the circumference, completion resistors in the other arms",
        vec![p.single(round(0.0), 90.0)],
        [g(0, 0), C, C, C],
    ));
    out.push(entry(
        "Hoop grid with dummy",
        "a hoop grid and an unstrained dummy of the same type in the adjacent arm",
        vec![p.single(round(0.0), 90.0)],
        [g(0, 0), DUMMY, C, C],
    ));
    out.push(entry(
        "Hoop and axial pair",
        "a hoop grid and an axial grid on one carrier, in adjacent arms",
        vec![p.tee(round(0.0), 90.0)],
        [g(0, 0), g(0, 1), C, C],
    ));
    out.push(entry(
        "Hoop and axial, four grids on opposite sides",
        "two hoop/axial carriers half a turn apart, wired as a full bridge",
        vec![p.tee(round(0.0), 90.0), p.tee(round(half_turn), 90.0)],
        [g(0, 0), g(0, 1), g(1, 0), g(1, 1)],
    ));
}

fn plate_layouts(out: &mut Vec<CatalogueEntry>, spec: &GaugeSpec, a: f64, wanted: LoadComponent) {
    use LoadComponent::*;
    if !matches!(wanted, RemoteStressX | RemoteStressY) {
        return;
    }
    // Across the load from the hole, where the stress concentrates; the grid's centre sits one
    // grid length from the edge.
    let gap = a + spec.grid_width_m / 2.0 + spec.grid_length_m;
    let (x, s, angle) = if wanted == RemoteStressX {
        (0.0, gap, 0.0)
    } else {
        (gap, 0.0, 90.0)
    };
    let p = Placer { spec, x };
    let one = p.single((Face::Plate, s), angle);
    out.push(entry(
        "One grid beside the hole",
        "one grid along the load, beside the hole across from it, in the raised strain near its edge",
        vec![one.clone()],
        [g(0, 0), C, C, C],
    ));
    out.push(entry(
        "Grid beside the hole with dummy",
        "the grid beside the hole with an unstrained dummy of the same type in the adjacent arm",
        vec![one],
        [g(0, 0), DUMMY, C, C],
    ));
}
