//! Invalid input gives a typed error naming the value and the way out, never a panic or NaN.

use gw_mechanics::*;

fn steel() -> Material {
    Material::new("test steel", 200e9, 0.3, 12e-6, 350e6).unwrap()
}

#[test]
fn zero_thickness_names_the_wall() {
    let e = ThinCylinder::new(0.3, 0.0, 1.0, VesselEnds::Closed, steel()).unwrap_err();
    assert_eq!(
        e.to_string(),
        "wall thickness must be greater than zero, got 0 mm; enter a positive dimension"
    );
}

#[test]
fn bore_larger_than_shaft_names_both_diameters() {
    let e = Shaft::new(0.05, 0.052, 0.3, steel()).unwrap_err();
    assert_eq!(
        e.to_string(),
        "inner diameter 52 mm must be smaller than outer diameter 50 mm; \
         reduce the inner diameter or enlarge the outer diameter"
    );
}

#[test]
fn nan_dimension_is_rejected() {
    let e = Section::Rectangle {
        width_m: f64::NAN,
        height_m: 0.02,
    }
    .validate()
    .unwrap_err();
    assert!(matches!(
        e,
        MechanicsError::NotFinite {
            name: "section width",
            ..
        }
    ));
}

#[test]
fn infinite_load_is_rejected_not_propagated() {
    let m = Member::Shaft(Shaft::new(0.04, 0.0, 0.3, steel()).unwrap());
    let l = LoadVector::from_pairs(&[(LoadComponent::Torque, f64::INFINITY)]);
    let e = m
        .state(&SurfacePoint::new(Face::Round, 0.1, 0.0), &l)
        .unwrap_err();
    assert!(
        e.to_string().starts_with("torque is not a finite number"),
        "{e}"
    );
}

#[test]
fn point_inside_the_hole_is_off_the_part() {
    let m = Member::PlateWithHole(PlateWithHole::new(0.02, 0.2, 0.2, 0.005, steel()).unwrap());
    let e = m
        .state(
            &SurfacePoint::new(Face::Plate, 0.002, 0.001),
            &LoadVector::ZERO,
        )
        .unwrap_err();
    assert!(e.to_string().contains("inside the hole"), "{e}");
}

#[test]
fn point_beyond_the_beam_end_is_off_the_part() {
    let b = Beam::new(
        Section::Rectangle {
            width_m: 0.02,
            height_m: 0.04,
        },
        steel(),
        0.5,
        BeamSupport::Cantilever,
        0.5,
    )
    .unwrap();
    let e = Member::Beam(b)
        .state(&SurfacePoint::new(Face::Top, 0.6, 0.0), &LoadVector::ZERO)
        .unwrap_err();
    assert_eq!(
        e.to_string(),
        "the point is off the part: x = 600.00 mm lies outside 0.00 to 500.00 mm of the top face"
    );
}

#[test]
fn a_shaft_has_no_top_face() {
    let m = Member::Shaft(Shaft::new(0.04, 0.0, 0.3, steel()).unwrap());
    let e = m
        .state(&SurfacePoint::new(Face::Top, 0.1, 0.0), &LoadVector::ZERO)
        .unwrap_err();
    assert!(e.to_string().contains("use one of: outer surface"), "{e}");
}

#[test]
fn grid_overlapping_the_hole_says_how_to_fix_it() {
    let m = Member::PlateWithHole(PlateWithHole::new(0.02, 0.2, 0.2, 0.005, steel()).unwrap());
    let grid = GridFootprint {
        center: SurfacePoint::new(Face::Plate, 0.0, 0.0105),
        angle_rad: 0.0,
        length_m: 0.003,
        width_m: 0.002,
    };
    let e =
        grid_average_strain(&m, &grid, &LoadVector::ZERO, QuadratureOrder::default()).unwrap_err();
    assert!(
        e.to_string()
            .contains("move the gauge or choose a shorter grid"),
        "{e}"
    );
}

#[test]
fn load_position_off_the_span_is_rejected() {
    let e = Beam::new(
        Section::SolidRound { diameter_m: 0.02 },
        steel(),
        1.0,
        BeamSupport::SimplySupported,
        1.2,
    )
    .unwrap_err();
    assert!(matches!(e, MechanicsError::LoadOutsideSpan { .. }));
}

#[test]
fn rosette_with_two_parallel_grids_is_singular() {
    let e = strain_from_three([0.0, 0.0, 1.0], [1e-4, 1e-4, 0.0]).unwrap_err();
    assert!(matches!(e, MechanicsError::SingularRosette { .. }));
}

#[test]
fn a_torque_on_a_beam_is_refused_not_taken_as_zero() {
    // Torsion of non-round sections is not modelled: the engine must say so rather than leave
    // the torque out of the state (which would let a plan claim to cancel it).
    let beam = gw_mechanics::Member::Beam(
        gw_mechanics::Beam::new(
            gw_mechanics::Section::Rectangle {
                width_m: 0.03,
                height_m: 0.06,
            },
            steel(),
            0.5,
            gw_mechanics::BeamSupport::Cantilever,
            0.5,
        )
        .unwrap(),
    );
    let loads = gw_mechanics::LoadVector::from_pairs(&[
        (gw_mechanics::LoadComponent::VerticalForce, 1e3),
        (gw_mechanics::LoadComponent::Torque, 50.0),
    ]);
    let p = gw_mechanics::SurfacePoint::new(gw_mechanics::Face::Top, 0.2, 0.0);
    let e = beam.state(&p, &loads).unwrap_err();
    assert!(matches!(e, MechanicsError::LoadNotCarried { .. }), "{e}");
    let text = e.to_string();
    assert!(
        text.contains("torque") && text.contains("round shafts"),
        "{text}"
    );
    assert!(
        gw_mechanics::surface_map(
            &beam,
            gw_mechanics::Face::Top,
            &loads,
            gw_mechanics::SurfaceQuantity::StrainAlong(0.0),
            gw_mechanics::StrainBasis::Mechanical,
            4,
            4
        )
        .is_err()
    );
    assert!(
        beam.state_per_unit(&p, gw_mechanics::LoadComponent::Torque)
            .is_err()
    );
    // A pressure on a shaft is refused the same way.
    let shaft =
        gw_mechanics::Member::Shaft(gw_mechanics::Shaft::new(0.05, 0.0, 0.3, steel()).unwrap());
    let pressure = gw_mechanics::LoadVector::from_pairs(&[(
        gw_mechanics::LoadComponent::InternalPressure,
        1e6,
    )]);
    let p = gw_mechanics::SurfacePoint::new(gw_mechanics::Face::Round, 0.1, 0.0);
    assert!(matches!(
        shaft.state(&p, &pressure),
        Err(MechanicsError::LoadNotCarried { .. })
    ));
}
