//! Property tests for the identities the engine must keep.

use approx::relative_eq;
use gw_mechanics::*;
use proptest::prelude::*;

fn steel() -> Material {
    Material::new("test steel", 200e9, 0.3, 12e-6, 350e6).unwrap()
}

fn strain() -> impl Strategy<Value = SurfaceStrain> {
    (-2e-3..2e-3f64, -2e-3..2e-3f64, -2e-3..2e-3f64)
        .prop_map(|(a, b, c)| SurfaceStrain::new(a, b, c))
}

fn beam_member(support: BeamSupport, load_position_m: f64) -> Member {
    Member::Beam(
        Beam::new(
            Section::IBeam {
                flange_width_m: 0.08,
                depth_m: 0.12,
                flange_thickness_m: 0.01,
                web_thickness_m: 0.006,
            },
            steel(),
            1.0,
            support,
            load_position_m,
        )
        .unwrap(),
    )
}

/// `l` with the components `m` does not carry set to zero (the model refuses them).
fn carried(m: &Member, l: &LoadVector) -> LoadVector {
    let mut out = LoadVector::ZERO;
    for &c in m.components().iter() {
        out[c] = l[c];
    }
    out
}

fn load_vector() -> impl Strategy<Value = LoadVector> {
    proptest::collection::vec(-1e4..1e4f64, LoadComponent::COUNT).prop_map(|v| {
        let mut l = LoadVector::ZERO;
        for (c, x) in LoadComponent::ALL.iter().zip(v) {
            // Keep pressures, stresses and temperatures in a sensible range of their own units.
            l[*c] = match c {
                LoadComponent::TemperatureChange => x / 200.0,
                LoadComponent::GivenStateFactor => x / 1e4,
                LoadComponent::InternalPressure
                | LoadComponent::ExternalPressure
                | LoadComponent::RemoteStressX
                | LoadComponent::RemoteStressY
                | LoadComponent::RemoteShearXY => x * 1e3,
                _ => x,
            };
        }
        l
    })
}

fn close(a: f64, b: f64, scale: f64) -> bool {
    (a - b).abs() <= 1e-9 * scale.abs().max(1e-12)
}

fn states_close(a: &SurfaceState, b: &SurfaceState) -> bool {
    let scale = a
        .strain
        .normal_x
        .abs()
        .max(a.strain.normal_y.abs())
        .max(a.strain.shear_xy.abs())
        .max(1e-9);
    close(a.strain.normal_x, b.strain.normal_x, scale)
        && close(a.strain.normal_y, b.strain.normal_y, scale)
        && close(a.strain.shear_xy, b.strain.shear_xy, scale)
        && close(a.thermal_strain, b.thermal_strain, scale)
}

proptest! {
    #[test]
    fn rotation_keeps_the_invariants(s in strain(), angle in -7.0..7.0f64) {
        let r = s.rotated(angle);
        prop_assert!(close(r.normal_x + r.normal_y, s.normal_x + s.normal_y, 1e-3));
        let (p, q) = (s.principal(), r.principal());
        prop_assert!(close(p.max, q.max, 1e-3) && close(p.min, q.min, 1e-3));
        // Rotating back returns the original state.
        let back = r.rotated(-angle);
        prop_assert!(close(back.shear_xy, s.shear_xy, 1e-3) && close(back.normal_x, s.normal_x, 1e-3));
    }

    #[test]
    fn principal_direction_reads_the_principal_strain(s in strain()) {
        let p = s.principal();
        prop_assert!(close(s.along(p.angle_rad), p.max, 1e-3));
        prop_assert!(close(s.along(p.angle_rad + std::f64::consts::FRAC_PI_2), p.min, 1e-3));
    }

    #[test]
    fn rosette_round_trip(s in strain(), orientation in -3.2..3.2f64, delta in any::<bool>()) {
        let kind = if delta { RosetteKind::Delta } else { RosetteKind::Rectangular };
        let readings = rosette_readings(kind, &s, orientation);
        let result = analyse_rosette(kind, &readings, &steel()).unwrap();
        // The recovered state is in the rosette's axes; rotate the truth into them.
        let truth = s.rotated(orientation);
        prop_assert!(close(result.strain.normal_x, truth.normal_x, 1e-3));
        prop_assert!(close(result.strain.normal_y, truth.normal_y, 1e-3));
        prop_assert!(close(result.strain.shear_xy, truth.shear_xy, 1e-3));
    }

    #[test]
    fn superposition_is_linear(
        a in load_vector(), b in load_vector(), ka in -3.0..3.0f64, kb in -3.0..3.0f64,
        x in 0.0..1.0f64, s in -0.04..0.04f64, simply in any::<bool>(),
    ) {
        let m = beam_member(if simply { BeamSupport::SimplySupported } else { BeamSupport::Cantilever }, 0.6);
        let (a, b) = (carried(&m, &a), carried(&m, &b));
        let p = SurfacePoint::new(Face::Top, x, s);
        let mut combined = LoadVector::ZERO;
        for c in LoadComponent::ALL {
            combined[c] = ka * a[c] + kb * b[c];
        }
        let lhs = m.state(&p, &combined).unwrap();
        let rhs = m.state(&p, &a).unwrap() * ka + m.state(&p, &b).unwrap() * kb;
        prop_assert!(states_close(&lhs, &rhs), "{lhs:?} vs {rhs:?}");
    }

    #[test]
    fn per_component_states_sum_to_the_load_case(l in load_vector(), x in 0.0..0.3f64, angle in -3.1..3.1f64) {
        let members = [
            Member::Shaft(Shaft::new(0.05, 0.02, 0.3, steel()).unwrap()),
            Member::ThickCylinder(ThickCylinder::new(0.1, 0.06, 0.3, VesselEnds::Closed, steel()).unwrap()),
            beam_member(BeamSupport::Cantilever, 0.6),
        ];
        for m in &members {
            let p = if matches!(m, Member::Beam(_)) {
                SurfacePoint::new(Face::Front, x, angle / 100.0)
            } else {
                SurfacePoint::on_round(x, angle, 0.025)
            };
            let l = carried(m, &l);
            let whole = m.state(&p, &l).unwrap();
            let mut sum = SurfaceState::default();
            for (c, per_unit) in m.sensitivities(&p).unwrap() {
                sum = sum + per_unit * l[c];
            }
            prop_assert!(states_close(&whole, &sum), "{}: {whole:?} vs {sum:?}", m.kind_name());
        }
    }

    #[test]
    fn grid_average_equals_point_value_in_a_linear_field(
        x in 0.1..0.9f64, s in 0.01..0.03f64, angle in -3.1..3.1f64, len in 0.001..0.01f64,
        p in -5e3..5e3f64, n in -5e4..5e4f64,
    ) {
        // Cantilever under an end load and axial force: on one half of the top flange, clear of
        // the web (where the flange's shear flow turns) and of the tip, the surface strain is
        // linear in x and in s.
        let m = beam_member(BeamSupport::Cantilever, 1.0);
        let l = LoadVector::from_pairs(&[(LoadComponent::VerticalForce, p), (LoadComponent::AxialForce, n)]);
        let centre = SurfacePoint::new(Face::Top, x, s);
        let grid = GridFootprint { center: centre, angle_rad: angle, length_m: len, width_m: len / 2.0 };
        let avg = grid_average_strain(&m, &grid, &l, QuadratureOrder::default()).unwrap();
        let point = m.state(&centre, &l).unwrap().strain.along(angle);
        prop_assert!(relative_eq!(avg, point, epsilon = 1e-15, max_relative = 1e-9), "{avg} vs {point}");
    }

    #[test]
    fn kirsch_field_returns_to_the_remote_field_far_from_the_hole(
        sx in -2e8..2e8f64, sy in -2e8..2e8f64, txy in -1e8..1e8f64, theta in -3.2..3.2f64,
    ) {
        let plate = PlateWithHole::new(0.002, 2.0, 2.0, 0.005, steel()).unwrap();
        let l = LoadVector::from_pairs(&[
            (LoadComponent::RemoteStressX, sx),
            (LoadComponent::RemoteStressY, sy),
            (LoadComponent::RemoteShearXY, txy),
        ]);
        // At r = 500 a the disturbance is a few times (a/r)² = 4e-6 of the remote stress.
        let r = 0.5;
        let (ax, ay, axy) = plate.stresses_at(r * theta.cos(), r * theta.sin(), &l);
        let scale = sx.abs().max(sy.abs()).max(txy.abs()).max(1.0);
        prop_assert!((ax - sx).abs() < 1e-4 * scale);
        prop_assert!((ay - sy).abs() < 1e-4 * scale);
        prop_assert!((axy - txy).abs() < 1e-4 * scale);
    }

    #[test]
    fn no_finite_input_gives_a_nan(l in load_vector(), x in -0.5..1.5f64, s in -0.2..0.2f64) {
        let m = beam_member(BeamSupport::SimplySupported, 0.6);
        for face in [Face::Top, Face::Bottom, Face::Front, Face::Back, Face::Round] {
            if let Ok(st) = m.state(&SurfacePoint::new(face, x, s), &l) {
                prop_assert!(st.strain.is_finite());
            }
        }
    }
}
