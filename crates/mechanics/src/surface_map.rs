//! A sampled map of one surface quantity over a face, for the live colour map.

use serde::{Deserialize, Serialize};

use crate::error::{MechanicsError, Result};
use crate::load::LoadVector;
use crate::member::Member;
use crate::section_resultants::unit_strains;
use crate::surface::{Face, FaceExtent, SurfacePoint};
use crate::surface_state::SurfaceState;

/// The quantity a map shows.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum SurfaceQuantity {
    /// Normal strain along a direction, radians from local x; m/m.
    StrainAlong(f64),
    /// Larger principal strain, m/m.
    MaxPrincipalStrain,
    /// Smaller principal strain, m/m.
    MinPrincipalStrain,
    /// Von Mises equivalent stress, Pa.
    VonMisesStress,
}

/// Which strain a strain quantity counts. Default: [`StrainBasis::Mechanical`].
///
/// A free thermal expansion α·ΔT stretches the part without stress; counting it hides the
/// load's own pattern (a shaft's neutral axis, a vessel's hoop-to-axial ratio) under one
/// uniform shift, so maps show the mechanical strain unless asked otherwise.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum StrainBasis {
    /// Total minus free thermal strain: the part of the strain that carries stress.
    #[default]
    Mechanical,
    /// Total strain, free thermal expansion included.
    WithFreeThermal,
}

/// Values on a regular `nx × ns` grid of a face; `None` where the point is off the part
/// (inside a hole). Row-major: `values[j * nx + i]` is at `x[i]`, `s[j]`.
#[derive(Debug, Clone, PartialEq)]
pub struct SurfaceMap {
    /// The face.
    pub face: Face,
    /// Sample coordinates along x, metres.
    pub x_m: Vec<f64>,
    /// Sample coordinates across the face, metres.
    pub s_m: Vec<f64>,
    /// The values, SI units of the quantity.
    pub values: Vec<Option<f64>>,
}

impl SurfaceMap {
    /// Smallest and largest value on the map, if any point is on the part.
    pub fn range(&self) -> Option<(f64, f64)> {
        self.values
            .iter()
            .flatten()
            .fold(None, |acc, &v| match acc {
                None => Some((v, v)),
                Some((lo, hi)) => Some((lo.min(v), hi.max(v))),
            })
    }
}

/// Where samples sit on a face.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Sampling {
    /// Centres of `nx × ns` cells (for colour maps).
    CellCentres,
    /// `nx × ns` nodes including the edges (for peak values, which often sit on an edge).
    NodesWithEdges,
}

/// Samples `quantity` over the whole of `face` on an `nx × ns` grid (cell centres).
pub fn surface_map(
    member: &Member,
    face: Face,
    loads: &LoadVector,
    quantity: SurfaceQuantity,
    basis: StrainBasis,
    nx: usize,
    ns: usize,
) -> Result<SurfaceMap> {
    sample_face(
        member,
        face,
        loads,
        (quantity, basis),
        (nx, ns),
        Sampling::CellCentres,
    )
}

/// One surface quantity of a state, on the chosen strain basis; `None` when not finite.
pub fn quantity_of(
    state: &SurfaceState,
    material: &crate::Material,
    quantity: SurfaceQuantity,
    basis: StrainBasis,
) -> Option<f64> {
    let strain = match basis {
        StrainBasis::Mechanical => state.mechanical_strain(),
        StrainBasis::WithFreeThermal => state.strain,
    };
    let v = match quantity {
        SurfaceQuantity::StrainAlong(angle) => strain.along(angle),
        SurfaceQuantity::MaxPrincipalStrain => strain.principal().max,
        SurfaceQuantity::MinPrincipalStrain => strain.principal().min,
        SurfaceQuantity::VonMisesStress => state.von_mises_pa(material),
    };
    v.is_finite().then_some(v)
}

/// Samples `quantity` on `basis` over `face` on an `nx × ns` grid with the chosen sampling.
pub fn sample_face(
    member: &Member,
    face: Face,
    loads: &LoadVector,
    (quantity, basis): (SurfaceQuantity, StrainBasis),
    (nx, ns): (usize, usize),
    sampling: Sampling,
) -> Result<SurfaceMap> {
    member.check_loads(loads)?;
    let faces = member.faces();
    let Some(extent) = faces.iter().find(|f| f.face == face) else {
        return Err(MechanicsError::PointOffPart {
            what: "the map",
            detail: format!("a {} has no {}", member.kind_name(), face.name()),
        });
    };
    let (nx, ns) = (nx.max(1), ns.max(1));
    let centres = |(a, b): (f64, f64), n: usize| -> Vec<f64> {
        match sampling {
            Sampling::CellCentres => (0..n)
                .map(|i| a + (b - a) * (i as f64 + 0.5) / n as f64)
                .collect(),
            Sampling::NodesWithEdges => (0..n)
                .map(|i| a + (b - a) * i as f64 / (n.max(2) - 1) as f64)
                .collect(),
        }
    };
    let x_m = centres(extent.x_range_m, nx);
    let s_m = centres(extent.s_range_m, ns);
    let material = member.material();
    // Direction terms hoisted out of the loop: ε(θ) = εx (1+c)/2 + εy (1−c)/2 + γ s/2.
    let (s2, c2) = match quantity {
        SurfaceQuantity::StrainAlong(angle) => (2.0 * angle).sin_cos(),
        _ => (0.0, 1.0),
    };
    let value_of = |state: &SurfaceState| -> Option<f64> {
        let strain = match basis {
            StrainBasis::Mechanical => state.mechanical_strain(),
            StrainBasis::WithFreeThermal => state.strain,
        };
        let v = match quantity {
            SurfaceQuantity::StrainAlong(_) => {
                let e = &strain;
                e.normal_x * (1.0 + c2) / 2.0
                    + e.normal_y * (1.0 - c2) / 2.0
                    + e.shear_xy * s2 / 2.0
            }
            SurfaceQuantity::MaxPrincipalStrain => strain.principal().max,
            SurfaceQuantity::MinPrincipalStrain => strain.principal().min,
            SurfaceQuantity::VonMisesStress => state.von_mises_pa(material),
        };
        v.is_finite().then_some(v)
    };
    let mut values = Vec::with_capacity(nx * ns);
    match member {
        // Prismatic members: strains per unit resultant once per row, resultants once per
        // column, then a weighted sum per point.
        Member::Beam(beam) => {
            let columns: Vec<_> = x_m.iter().map(|&x| beam.resultants(x, loads)).collect();
            let thermal = beam.thermal_strain(loads);
            for &s in &s_m {
                let unit = unit_strains(&beam.section, &beam.material, face, s);
                for r in &columns {
                    values.push(unit.and_then(|u| value_of(&u.state(r, thermal))));
                }
            }
        }
        Member::Shaft(shaft) => {
            let r = shaft.resultants(loads);
            let thermal = shaft.thermal_strain(loads);
            let section = shaft.section();
            for &s in &s_m {
                let value = unit_strains(&section, &shaft.material, face, s)
                    .and_then(|u| value_of(&u.state(&r, thermal)));
                values.extend(std::iter::repeat_n(value, x_m.len()));
            }
        }
        _ => values = point_by_point(member, extent, loads, (&x_m, &s_m), &value_of),
    }
    Ok(SurfaceMap {
        face,
        x_m,
        s_m,
        values,
    })
}

/// The map of any other member, one point at a time (rows of `s`, each along `x`): nothing in a
/// plate's hole, nor where an imported face does not reach (a hole, a notch, a round end).
fn point_by_point(
    member: &Member,
    extent: &FaceExtent,
    loads: &LoadVector,
    (x_m, s_m): (&[f64], &[f64]),
    value_of: &dyn Fn(&SurfaceState) -> Option<f64>,
) -> Vec<Option<f64>> {
    let imported = matches!(member, Member::ImportedField(_));
    let mut values = Vec::with_capacity(x_m.len() * s_m.len());
    for &s in s_m {
        for &x in x_m {
            let p = SurfacePoint::new(extent.face, x, s);
            let inside_hole = extent.hole_radius_m.is_some_and(|a| x * x + s * s < a * a);
            if inside_hole || (imported && member.locate(&p).is_err()) {
                values.push(None);
            } else {
                values.push(value_of(&member.state_unchecked(&p, loads)));
            }
        }
    }
    values
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::{Beam, BeamSupport, LoadComponent, Material, Section, Shaft};

    fn steel() -> Material {
        Material::new("m", 200e9, 0.3, 12e-6, 300e6).unwrap()
    }

    #[test]
    fn fast_map_of_prismatic_members_equals_pointwise_states() {
        let beam = Member::Beam(
            Beam::new(
                Section::IBeam {
                    flange_width_m: 0.08,
                    depth_m: 0.12,
                    flange_thickness_m: 0.01,
                    web_thickness_m: 0.006,
                },
                steel(),
                1.0,
                BeamSupport::SimplySupported,
                0.4,
            )
            .unwrap(),
        );
        let shaft = Member::Shaft(Shaft::new(0.05, 0.02, 0.3, steel()).unwrap());
        let loads = LoadVector::from_pairs(&[
            (LoadComponent::VerticalForce, 3e3),
            (LoadComponent::LateralForce, -1e3),
            (LoadComponent::Torque, 200.0),
            (LoadComponent::BendingMomentZ, 50.0),
            (LoadComponent::TemperatureChange, 5.0),
        ]);
        for (member, face) in [
            (&beam, Face::Front),
            (&beam, Face::Top),
            (&shaft, Face::Round),
        ] {
            // Only the loads each model carries (others are refused).
            let mut loads = loads;
            for c in LoadComponent::ALL {
                if !member.components().contains(&c) {
                    loads[c] = 0.0;
                }
            }
            let angle = 0.7;
            let map = surface_map(
                member,
                face,
                &loads,
                SurfaceQuantity::StrainAlong(angle),
                StrainBasis::WithFreeThermal,
                16,
                8,
            )
            .unwrap();
            for (j, &s) in map.s_m.iter().enumerate() {
                for (i, &x) in map.x_m.iter().enumerate() {
                    let expected = member
                        .state(&SurfacePoint::new(face, x, s), &loads)
                        .unwrap()
                        .strain
                        .along(angle);
                    let got = map.values[j * map.x_m.len() + i].unwrap();
                    assert!((got - expected).abs() <= 1e-12 * expected.abs().max(1e-9));
                }
            }
        }
    }

    #[test]
    fn mechanical_map_leaves_out_free_expansion() {
        // A free, uniform temperature change stretches the part without stress (Timoshenko &
        // Goodier, Theory of Elasticity, §150: a free body uniformly heated is stress-free), so
        // the mechanical strain of a shaft in bending is zero on its neutral axis whatever ΔT,
        // and a heated, unpressurised vessel shows no mechanical strain at all.
        let shaft = Member::Shaft(Shaft::new(0.05, 0.0, 0.3, steel()).unwrap());
        let loads = LoadVector::from_pairs(&[
            (LoadComponent::BendingMomentY, 400.0),
            (LoadComponent::TemperatureChange, 30.0),
        ]);
        let map = |basis| {
            surface_map(
                &shaft,
                Face::Round,
                &loads,
                SurfaceQuantity::StrainAlong(0.0),
                basis,
                4,
                4,
            )
            .unwrap()
        };
        // Cell centres of 4 rows over ±π r sit at ±π r/4 and ±3π r/4: use the exact neutral
        // axis by a pointwise state instead.
        let r = 0.025;
        let p = SurfacePoint::on_round(0.1, std::f64::consts::FRAC_PI_2, r);
        let st = shaft.state(&p, &loads).unwrap();
        assert!(st.mechanical_strain().normal_x.abs() < 1e-15);
        assert!((st.strain.normal_x - 12e-6 * 30.0).abs() < 1e-15);
        let mech = map(StrainBasis::Mechanical);
        let total = map(StrainBasis::WithFreeThermal);
        for (m, t) in mech.values.iter().zip(&total.values) {
            assert!((t.unwrap() - m.unwrap() - 12e-6 * 30.0).abs() < 1e-15);
        }
        let vessel = Member::ThinCylinder(
            crate::ThinCylinder::new(0.2, 0.004, 0.5, crate::VesselEnds::Closed, steel()).unwrap(),
        );
        let heat = LoadVector::from_pairs(&[(LoadComponent::TemperatureChange, 40.0)]);
        let m = surface_map(
            &vessel,
            Face::Round,
            &heat,
            SurfaceQuantity::MaxPrincipalStrain,
            StrainBasis::Mechanical,
            3,
            3,
        )
        .unwrap();
        assert!(m.values.iter().all(|v| v.unwrap().abs() < 1e-18));
    }
}
