//! A project with one part of every model kind and of every beam section, each with a gauge or
//! two and loads of its own: the set the part and face views are checked and pictured with.
//! Every name and number is invented.

use gw_bridge::GaugePattern;
use gw_mechanics::{
    Beam, BeamSupport, Face, LoadComponent, LoadPoint, Member, Section, SurfacePoint,
};

use crate::blank::{ModelKind, blank_project, default_material, new_part};
use crate::document::{PlanGauge, Project, StockGauge, default_gauge_spec, stock_base_name};

fn gauge(id: &str, pattern: GaugePattern, face: Face, x: f64, s: f64, angle_deg: f64) -> PlanGauge {
    PlanGauge {
        id: id.into(),
        stock: stock_base_name(&default_gauge_spec(pattern)),
        lot: None,
        position: SurfacePoint::new(face, x, s),
        angle_rad: angle_deg.to_radians(),
    }
}

fn beam(section: Section, support: BeamSupport, length_m: f64, points: &[f64]) -> Member {
    let n = points.len() as f64;
    Member::Beam(Beam {
        section,
        material: default_material(),
        length_m,
        support,
        load_points: points
            .iter()
            .map(|&position_m| LoadPoint {
                position_m,
                multiple: 1.0 / n,
            })
            .collect(),
    })
}

/// One part of the gallery: name, model, loads of its one case, gauges.
type GalleryPart = (
    &'static str,
    Member,
    Vec<(LoadComponent, f64)>,
    Vec<PlanGauge>,
);

/// The gallery project.
pub fn model_gallery() -> Project {
    use GaugePattern::*;
    use LoadComponent::*;
    let parts: Vec<GalleryPart> = vec![
        (
            "Bracket arm (rectangle)",
            beam(
                Section::Rectangle {
                    width_m: 0.025,
                    height_m: 0.05,
                },
                BeamSupport::Cantilever,
                0.4,
                &[0.4],
            ),
            vec![(VerticalForce, 2500.0), (AxialForce, 4000.0)],
            vec![
                gauge("R1", SingleGrid, Face::Top, 0.08, 0.0, 0.0),
                gauge("R2", RectangularRosette, Face::Front, 0.2, 0.0, 0.0),
            ],
        ),
        (
            "Round link (solid round)",
            beam(
                Section::SolidRound { diameter_m: 0.04 },
                BeamSupport::SimplySupported,
                0.5,
                &[0.25],
            ),
            vec![(VerticalForce, 6000.0)],
            vec![gauge("L1", SingleGrid, Face::Round, 0.25, 0.0, 0.0)],
        ),
        (
            "Boom tube (round tube)",
            beam(
                Section::RoundTube {
                    outer_diameter_m: 0.06,
                    inner_diameter_m: 0.05,
                },
                BeamSupport::Cantilever,
                0.9,
                &[0.9],
            ),
            vec![(VerticalForce, 800.0), (BendingMomentZ, 60.0)],
            vec![gauge("T1", ShearPair, Face::Round, 0.3, 0.047, 0.0)],
        ),
        (
            "Rail (rectangular tube)",
            beam(
                Section::RectangularTube {
                    width_m: 0.05,
                    height_m: 0.08,
                    wall_m: 0.004,
                },
                BeamSupport::SimplySupported,
                1.2,
                &[0.45, 0.75],
            ),
            vec![(VerticalForce, 9000.0)],
            vec![gauge("B1", SingleGrid, Face::Bottom, 0.6, 0.0, 0.0)],
        ),
        (
            "Girder (I section)",
            beam(
                Section::IBeam {
                    flange_width_m: 0.1,
                    depth_m: 0.2,
                    flange_thickness_m: 0.0085,
                    web_thickness_m: 0.0056,
                },
                BeamSupport::Cantilever,
                1.5,
                &[1.5],
            ),
            vec![(VerticalForce, 12000.0), (LateralForce, 1500.0)],
            vec![
                gauge("W1", ShearPair, Face::Front, 0.7, 0.0, 0.0),
                gauge("F1", SingleGrid, Face::Top, 0.3, 0.0, 0.0),
            ],
        ),
        (
            "Spindle (shaft)",
            ModelKind::Shaft.default_member(&default_material()),
            vec![(Torque, 400.0), (BendingMomentY, 150.0)],
            vec![gauge("S1", ShearPair, Face::Round, 0.25, 0.0, 0.0)],
        ),
        (
            "Receiver (thin-walled cylinder)",
            ModelKind::ThinCylinder.default_member(&default_material()),
            vec![(InternalPressure, 1.6e6)],
            vec![gauge("V1", TwoElement90, Face::Round, 0.4, 0.0, 0.0)],
        ),
        (
            "Float (thin-walled sphere)",
            ModelKind::ThinSphere.default_member(&default_material()),
            vec![(InternalPressure, 1.2e6)],
            vec![gauge("P1", TwoElement90, Face::Round, 0.1, 0.2, 0.0)],
        ),
        (
            "Ram barrel (thick-walled cylinder)",
            ModelKind::ThickCylinder.default_member(&default_material()),
            vec![(InternalPressure, 40e6)],
            vec![gauge("H1", TwoElement90, Face::Round, 0.15, 0.0, 0.0)],
        ),
        (
            "Lug plate (plate with a hole)",
            ModelKind::PlateWithHole.default_member(&default_material()),
            vec![(RemoteStressX, 60e6)],
            vec![gauge("K1", DeltaRosette, Face::Plate, 0.0, 0.016, 0.0)],
        ),
        (
            "Test patch (given surface state)",
            ModelKind::GivenState.default_member(&default_material()),
            vec![(GivenStateFactor, 1.0)],
            vec![gauge("G1", RectangularRosette, Face::Plate, 0.0, 0.0, 0.0)],
        ),
    ];
    let mut list = parts.into_iter().map(|(name, member, loads, gauges)| {
        let mut part = new_part(name, member, None);
        if let Some(case) = part.load_cases.first_mut() {
            case.name = "Working load".into();
            case.loads = loads;
        }
        part.gauges = gauges;
        part
    });
    let Some(first) = list.next() else {
        unreachable!("the gallery has parts")
    };
    let mut project = blank_project(first);
    project.parts.extend(list);
    project.name = "Model gallery".into();
    project.gauge_stock = [
        SingleGrid,
        TwoElement90,
        RectangularRosette,
        DeltaRosette,
        ShearPair,
    ]
    .into_iter()
    .map(|pattern| {
        let spec = default_gauge_spec(pattern);
        StockGauge {
            name: stock_base_name(&spec),
            spec,
        }
    })
    .collect();
    project
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_gallery_is_a_valid_project_with_every_kind_and_section() {
        let p = model_gallery();
        crate::validate::validate_project(&p).unwrap();
        for kind in ModelKind::ALL {
            assert!(
                p.parts
                    .iter()
                    .any(|part| ModelKind::of(&part.member) == kind)
            );
        }
        let sections: std::collections::HashSet<&str> = p
            .parts
            .iter()
            .filter_map(|part| match &part.member {
                Member::Beam(b) => Some(b.section.shape_name()),
                _ => None,
            })
            .collect();
        assert_eq!(sections.len(), 5);
        for part in &p.parts {
            assert_eq!(
                p.placed_gauges(part).len(),
                part.gauges.len(),
                "{}",
                part.name
            );
        }
    }
}
