//! The catalogue of standard bridge arrangements, generated for the current part.
//!
//! Each entry says which gauges to place (positions and directions on this part) and what goes
//! in each arm. The bridge factor is computed from the part: the bridge's Σ±ε per unit of the
//! wanted load divided by the first active grid's strain, so that an instrument set to it
//! displays the strain that grid sees from the wanted load.

use gw_mechanics::{Face, LoadComponent, LoadVector, Member, SurfacePoint};
use serde::{Deserialize, Serialize};

use crate::bridge::CompletionResistor;
use crate::gauge::{GaugePattern, GaugeSpec, PlacedGauge};

/// What goes in an arm of a catalogue entry (gauge indices refer to the entry's own gauges).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub enum ArmSlot {
    /// Grid `element` of the entry's gauge `gauge`.
    Grid { gauge: usize, element: usize },
    /// A dummy identical to that grid.
    Dummy { gauge: usize, element: usize },
    /// A completion resistor equal to the grid resistance.
    Completion,
}

/// One standard arrangement on this part.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CatalogueEntry {
    /// Plain descriptive name.
    pub name: String,
    /// One line on what it measures and what it cancels.
    pub description: String,
    /// Gauges to place.
    pub gauges: Vec<PlacedGauge>,
    /// Arms 1..4.
    pub arms: [ArmSlot; 4],
}

impl CatalogueEntry {
    /// The completion resistor this entry uses for `spec` (tolerance ±0.05 %, 5 ppm/°C:
    /// common practice for bridge completion resistors).
    pub fn completion_for(spec: &GaugeSpec) -> CompletionResistor {
        CompletionResistor {
            ohm: spec.resistance_ohm,
            tolerance: 0.0005,
            tcr_per_c: 5e-6,
        }
    }
}

fn gauge(
    spec: &GaugeSpec,
    pattern: GaugePattern,
    face: Face,
    x: f64,
    s: f64,
    angle_deg: f64,
) -> PlacedGauge {
    PlacedGauge {
        id: String::new(),
        spec: GaugeSpec {
            pattern,
            ..spec.clone()
        },
        position: SurfacePoint::new(face, x, s),
        angle_rad: angle_deg.to_radians(),
    }
}

const fn g(gauge: usize, element: usize) -> ArmSlot {
    ArmSlot::Grid { gauge, element }
}

const C: ArmSlot = ArmSlot::Completion;

fn entry(
    name: &str,
    description: &str,
    gauges: Vec<PlacedGauge>,
    arms: [ArmSlot; 4],
) -> CatalogueEntry {
    CatalogueEntry {
        name: name.to_owned(),
        description: description.to_owned(),
        gauges,
        arms,
    }
}

/// Standard arrangements for measuring `wanted` on `member` at axial station `station_x_m`
/// (beams, shafts, vessels; the plate uses the point across the load from the hole), all with
/// grids of `spec`. Entries that do not apply to this part or component are left out.
pub fn catalogue(
    member: &Member,
    wanted: LoadComponent,
    station_x_m: f64,
    spec: &GaugeSpec,
) -> Vec<CatalogueEntry> {
    use GaugePattern::*;
    use LoadComponent::*;
    let x = station_x_m;
    let mut out = Vec::new();
    let single = |face, s, angle| gauge(spec, SingleGrid, face, x, s, angle);
    let tee = |face, s, angle| gauge(spec, TwoElement90, face, x, s, angle);
    let pair = |face, s| gauge(spec, ShearPair, face, x, s, 0.0);
    let common = |out: &mut Vec<CatalogueEntry>, face: Face, s: f64, angle: f64, what: &str| {
        out.push(entry(
            "One active grid",
            &format!("one grid along the {what}; simplest, but bending, axial load and temperature all show"),
            vec![single(face, s, angle)],
            [g(0, 0), C, C, C],
        ));
        out.push(entry(
            "Active grid with dummy",
            &format!("one grid along the {what} and an unstrained dummy in the adjacent arm; cancels temperature"),
            vec![single(face, s, angle)],
            [g(0, 0), ArmSlot::Dummy { gauge: 0, element: 0 }, C, C],
        ));
        out.push(entry(
            "Active grid with Poisson grid",
            &format!("a grid along the {what} and one across it in the adjacent arm; cancels temperature, gains 1 + ν"),
            vec![tee(face, s, angle)],
            [g(0, 0), g(0, 1), C, C],
        ));
    };
    match member {
        Member::Beam(beam) => {
            let w = beam.section.width_m();
            match wanted {
                VerticalForce | UniformLoad | BendingMomentY => {
                    common(&mut out, Face::Top, 0.0, 0.0, "beam axis on the top face");
                    out.push(entry(
                        "Bending pair, top and bottom faces",
                        "grids on the top and bottom faces in adjacent arms; doubles bending, cancels axial load and temperature",
                        vec![single(Face::Top, 0.0, 0.0), single(Face::Bottom, 0.0, 0.0)],
                        [g(0, 0), g(1, 0), C, C],
                    ));
                    out.push(entry(
                        "Bending, four grids on top and bottom",
                        "two grids on each face, opposite faces in adjacent arms; four times the bending, cancels axial load, lateral bending and temperature",
                        vec![
                            single(Face::Top, -w / 4.0, 0.0),
                            single(Face::Bottom, -w / 4.0, 0.0),
                            single(Face::Top, w / 4.0, 0.0),
                            single(Face::Bottom, w / 4.0, 0.0),
                        ],
                        [g(0, 0), g(1, 0), g(2, 0), g(3, 0)],
                    ));
                    if wanted == VerticalForce {
                        out.push(entry(
                            "Shear-web pair, one side",
                            "±45° pair on the side face at the neutral axis; reads shear force whatever the bending moment, cancels axial load and temperature",
                            vec![pair(Face::Front, 0.0)],
                            [g(0, 0), g(0, 1), C, C],
                        ));
                        out.push(entry(
                            "Shear-web pairs, both sides",
                            "±45° pairs on both side faces at the neutral axis; shear force only, cancels bending in both planes, axial load and temperature",
                            vec![pair(Face::Front, 0.0), pair(Face::Back, 0.0)],
                            [g(0, 0), g(0, 1), g(1, 1), g(1, 0)],
                        ));
                    }
                }
                AxialForce => {
                    common(&mut out, Face::Top, 0.0, 0.0, "beam axis on the top face");
                    out.push(entry(
                        "Axial pair, top and bottom faces",
                        "grids on the top and bottom faces in opposite arms; doubles axial strain, cancels vertical bending",
                        vec![single(Face::Top, 0.0, 0.0), single(Face::Bottom, 0.0, 0.0)],
                        [g(0, 0), C, g(1, 0), C],
                    ));
                    out.push(entry(
                        "Axial, four grids with Poisson pairs",
                        "axial and transverse grids on the top and bottom faces; 2(1 + ν) times the axial strain, cancels vertical bending and temperature",
                        vec![tee(Face::Top, 0.0, 0.0), tee(Face::Bottom, 0.0, 0.0)],
                        [g(0, 0), g(0, 1), g(1, 0), g(1, 1)],
                    ));
                }
                LateralForce | BendingMomentZ => {
                    common(
                        &mut out,
                        Face::Front,
                        0.0,
                        0.0,
                        "beam axis on the front face",
                    );
                    out.push(entry(
                        "Lateral bending pair, front and back faces",
                        "grids on the front and back faces in adjacent arms; doubles lateral bending, cancels axial load, vertical bending and temperature",
                        vec![single(Face::Front, 0.0, 0.0), single(Face::Back, 0.0, 0.0)],
                        [g(0, 0), g(1, 0), C, C],
                    ));
                }
                _ => {}
            }
        }
        Member::Shaft(shaft) => {
            let half_turn = std::f64::consts::PI * shaft.radius_m();
            match wanted {
                Torque => {
                    out.push(entry(
                        "Torque pair at ±45°",
                        "one ±45° pair in adjacent arms; reads torque, cancels axial load and temperature, leaves bending",
                        vec![pair(Face::Round, 0.0)],
                        [g(0, 0), g(0, 1), C, C],
                    ));
                    out.push(entry(
                        "Torque, four grids at ±45° on opposite sides",
                        "two ±45° pairs half a turn apart; four times the torque strain, cancels bending, axial load and temperature",
                        vec![pair(Face::Round, 0.0), pair(Face::Round, half_turn)],
                        [g(0, 0), g(0, 1), g(1, 0), g(1, 1)],
                    ));
                }
                BendingMomentY | BendingMomentZ => {
                    let s0 = if wanted == BendingMomentY {
                        0.0
                    } else {
                        half_turn / 2.0
                    };
                    common(&mut out, Face::Round, s0, 0.0, "shaft axis");
                    out.push(entry(
                        "Bending pair on opposite sides",
                        "axial grids half a turn apart in adjacent arms; doubles bending, cancels axial load, torque and temperature",
                        vec![single(Face::Round, s0, 0.0), single(Face::Round, s0 + half_turn, 0.0)],
                        [g(0, 0), g(1, 0), C, C],
                    ));
                }
                AxialForce => {
                    common(&mut out, Face::Round, 0.0, 0.0, "shaft axis");
                    out.push(entry(
                        "Axial, four grids with Poisson pairs",
                        "axial and hoop grids half a turn apart; 2(1 + ν) times the axial strain, cancels bending, torque and temperature",
                        vec![tee(Face::Round, 0.0, 0.0), tee(Face::Round, half_turn, 0.0)],
                        [g(0, 0), g(0, 1), g(1, 0), g(1, 1)],
                    ));
                }
                _ => {}
            }
        }
        Member::ThinCylinder(_) | Member::ThickCylinder(_) | Member::ThinSphere(_) => {
            if matches!(wanted, InternalPressure | ExternalPressure) {
                let (half_turn, x) = match member {
                    Member::ThinCylinder(v) => (std::f64::consts::PI * v.outer_diameter_m / 2.0, x),
                    Member::ThickCylinder(v) => {
                        (std::f64::consts::PI * v.outer_diameter_m / 2.0, x)
                    }
                    Member::ThinSphere(v) => (std::f64::consts::PI * v.outer_diameter_m / 2.0, 0.0),
                    _ => (0.0, x),
                };
                let hoop = |s: f64| gauge(spec, SingleGrid, Face::Round, x, s, 90.0);
                let tee_h = |s: f64| gauge(spec, TwoElement90, Face::Round, x, s, 90.0);
                out.push(entry(
                    "One hoop grid",
                    "one grid round the circumference; largest strain, temperature shows",
                    vec![hoop(0.0)],
                    [g(0, 0), C, C, C],
                ));
                out.push(entry(
                    "Hoop grid with dummy",
                    "a hoop grid and an unstrained dummy in the adjacent arm; cancels temperature",
                    vec![hoop(0.0)],
                    [
                        g(0, 0),
                        ArmSlot::Dummy {
                            gauge: 0,
                            element: 0,
                        },
                        C,
                        C,
                    ],
                ));
                out.push(entry(
                    "Hoop and axial pair",
                    "hoop and axial grids in adjacent arms; cancels temperature and uniform axial load effects",
                    vec![tee_h(0.0)],
                    [g(0, 0), g(0, 1), C, C],
                ));
                out.push(entry(
                    "Hoop and axial, four grids on opposite sides",
                    "two hoop/axial pairs half a turn apart; doubles the pair's output and cancels bending of the shell and temperature",
                    vec![tee_h(0.0), tee_h(half_turn)],
                    [g(0, 0), g(0, 1), g(1, 0), g(1, 1)],
                ));
            }
        }
        Member::PlateWithHole(p) => {
            if matches!(wanted, RemoteStressX | RemoteStressY) {
                let a = p.hole_diameter_m / 2.0;
                // Across the load from the hole, where the stress concentrates; the grid's
                // centre sits one grid length from the edge.
                let gap = a + spec.grid_width_m / 2.0 + spec.grid_length_m;
                let (x, s, angle) = if wanted == RemoteStressX {
                    (0.0, gap, 0.0)
                } else {
                    (gap, 0.0, 90.0)
                };
                let one = gauge(spec, SingleGrid, Face::Plate, x, s, angle);
                out.push(entry(
                    "One grid beside the hole",
                    "one grid along the load across from the hole, in the raised strain near its edge",
                    vec![one.clone()],
                    [g(0, 0), C, C, C],
                ));
                out.push(entry(
                    "Grid beside the hole with dummy",
                    "as the single grid, with a dummy in the adjacent arm to cancel temperature",
                    vec![one],
                    [
                        g(0, 0),
                        ArmSlot::Dummy {
                            gauge: 0,
                            element: 0,
                        },
                        C,
                        C,
                    ],
                ));
            }
        }
        Member::GivenState(_) => {
            if wanted == GivenStateFactor {
                common(&mut out, Face::Plate, 0.0, 0.0, "x axis of the given state");
            }
        }
    }
    // Keep only entries whose grids lie on the part.
    out.retain(|e| {
        e.gauges
            .iter()
            .all(|pg| member.state(&pg.position, &LoadVector::ZERO).is_ok())
    });
    out
}
