//! Where the loads of a load case are drawn on the part: arrows for forces, pressures and
//! remote stresses, turning arrows for couples, each with the value it stands for. Directions
//! follow the sign conventions of [`LoadComponent`]; a negative value turns the arrow round.

use gw_mechanics::{BeamSupport, LoadComponent, LoadVector, Member};

/// How a load is drawn.
#[derive(Debug, Clone, PartialEq)]
pub enum GlyphShape {
    /// Straight arrows, each from its tail to its head, metres.
    Arrows(Vec<[[f64; 3]; 2]>),
    /// A turning arrow about `axis` (right-handed) round `centre`, radius `radius_m`.
    Couple {
        /// Centre, metres.
        centre: [f64; 3],
        /// Unit axis of the couple: the arrow turns right-handed about it.
        axis: [f64; 3],
        /// Radius of the drawn arc, metres.
        radius_m: f64,
    },
}

/// One load drawn on the part.
#[derive(Debug, Clone, PartialEq)]
pub struct LoadGlyph {
    /// The component.
    pub component: LoadComponent,
    /// The value this glyph stands for (SI; a load point's share of a force), with its sign.
    pub value: f64,
    /// The drawing.
    pub shape: GlyphShape,
    /// Where its label goes, metres.
    pub label_at: [f64; 3],
}

/// A characteristic size of the member for arrow lengths, metres: the section or the part.
fn arrow_length(member: &Member) -> f64 {
    match member {
        Member::Beam(b) => {
            let c = b.section.width_m().max(b.section.height_m());
            (2.0 * c).max(0.12 * b.length_m).min(0.3 * b.length_m)
        }
        Member::Shaft(s) => (1.2 * s.outer_diameter_m).min(0.4 * s.length_m),
        Member::ThinCylinder(c) => 0.35 * c.outer_diameter_m,
        Member::ThickCylinder(c) => 0.35 * c.outer_diameter_m,
        Member::ThinSphere(s) => 0.25 * s.outer_diameter_m,
        Member::PlateWithHole(p) => 0.15 * p.width_m.max(p.height_m),
        Member::GivenState(g) => 0.15 * g.length_m.max(g.width_m),
        Member::ImportedField(_) => 0.0,
    }
}

fn add(a: [f64; 3], b: [f64; 3], k: f64) -> [f64; 3] {
    std::array::from_fn(|i| a[i] + k * b[i])
}

/// An arrow of length `len` along `dir` ending at `head` (pushing onto the part), or starting
/// at `tail` (pulling away) when `pull`.
fn arrow(point: [f64; 3], dir: [f64; 3], len: f64, pull: bool) -> [[f64; 3]; 2] {
    if pull {
        [point, add(point, dir, len)]
    } else {
        [add(point, dir, -len), point]
    }
}

/// Every load of `loads` drawn on `member`. Zero components draw nothing; a temperature change
/// and a given-state factor have no arrow (the view states them in words).
pub fn load_glyphs(member: &Member, loads: &LoadVector) -> Vec<LoadGlyph> {
    let len = arrow_length(member);
    let mut out = Vec::new();
    for (component, value) in loads.nonzero() {
        if !value.is_finite() {
            continue;
        }
        let sign = value.signum();
        let glyphs = match member {
            Member::Beam(_) | Member::Shaft(_) => {
                prismatic_glyphs(member, component, value, sign, len)
            }
            Member::ThinCylinder(_) | Member::ThickCylinder(_) | Member::ThinSphere(_) => {
                vessel_glyphs(member, component, value, sign, len)
            }
            Member::PlateWithHole(_) | Member::GivenState(_) => {
                plate_glyphs(member, component, value, sign, len)
            }
            // Where the loads of an imported result act is known to its model only.
            Member::ImportedField(_) => Vec::new(),
        };
        out.extend(glyphs);
    }
    out
}

/// Glyphs on a beam or shaft along x.
fn prismatic_glyphs(
    member: &Member,
    component: LoadComponent,
    value: f64,
    sign: f64,
    len: f64,
) -> Vec<LoadGlyph> {
    let (l, hw, hh, both_ends, points) = match member {
        Member::Beam(b) => (
            b.length_m,
            b.section.width_m() / 2.0,
            b.section.height_m() / 2.0,
            b.support == BeamSupport::SimplySupported,
            b.load_points.clone(),
        ),
        Member::Shaft(s) => {
            let r = s.radius_m();
            (s.length_m, r, r, true, Vec::new())
        }
        _ => return Vec::new(),
    };
    let glyph = |value: f64, shape: GlyphShape, label_at| LoadGlyph {
        component,
        value,
        shape,
        label_at,
    };
    let ends = |f: &dyn Fn(f64, f64) -> LoadGlyph| {
        let mut v = vec![f(l, 1.0)];
        if both_ends {
            v.push(f(0.0, -1.0));
        }
        v
    };
    match component {
        LoadComponent::VerticalForce | LoadComponent::LateralForce => points
            .iter()
            .map(|p| {
                let share = value * p.multiple;
                let s = share.signum();
                let (dir, surface) = if component == LoadComponent::VerticalForce {
                    ([0.0, 0.0, -s], [p.position_m, 0.0, s * hh])
                } else {
                    ([0.0, s, 0.0], [p.position_m, -s * hw, 0.0])
                };
                let a = arrow(surface, dir, len, false);
                glyph(share, GlyphShape::Arrows(vec![a]), a[0])
            })
            .collect(),
        LoadComponent::UniformLoad => {
            let arrows: Vec<_> = (0..7)
                .map(|k| {
                    let x = l * (k as f64 + 0.5) / 7.0;
                    arrow([x, 0.0, sign * hh], [0.0, 0.0, -sign], 0.5 * len, false)
                })
                .collect();
            let at = arrows[3][0];
            vec![glyph(value, GlyphShape::Arrows(arrows), at)]
        }
        LoadComponent::AxialForce => ends(&|x, out| {
            let a = arrow([x, 0.0, 0.0], [out * sign, 0.0, 0.0], len, sign > 0.0);
            let tail = if sign > 0.0 { a[1] } else { a[0] };
            glyph(value, GlyphShape::Arrows(vec![a]), tail)
        }),
        LoadComponent::Torque | LoadComponent::BendingMomentY | LoadComponent::BendingMomentZ => {
            let axis = match component {
                LoadComponent::Torque => [1.0, 0.0, 0.0],
                LoadComponent::BendingMomentY => [0.0, 1.0, 0.0],
                _ => [0.0, 0.0, 1.0],
            };
            let r = 1.3 * hw.max(hh);
            ends(&|x, out| {
                let centre = [x + out * 0.6 * len, 0.0, 0.0];
                glyph(
                    value,
                    GlyphShape::Couple {
                        centre,
                        axis: axis.map(|c| c * out * sign),
                        radius_m: r,
                    },
                    add(centre, [0.0, 0.0, 1.0], r),
                )
            })
        }
        _ => Vec::new(),
    }
}

/// Pressure arrows round a vessel: outward for internal pressure, inward for external.
fn vessel_glyphs(
    member: &Member,
    component: LoadComponent,
    value: f64,
    sign: f64,
    len: f64,
) -> Vec<LoadGlyph> {
    let outward = match component {
        LoadComponent::InternalPressure => sign > 0.0,
        LoadComponent::ExternalPressure => sign < 0.0,
        _ => return Vec::new(),
    };
    let (centre, r, sphere) = match member {
        Member::ThinCylinder(c) => (
            [c.length_m / 2.0, 0.0, 0.0],
            c.outer_diameter_m / 2.0,
            false,
        ),
        Member::ThickCylinder(c) => (
            [c.length_m / 2.0, 0.0, 0.0],
            c.outer_diameter_m / 2.0,
            false,
        ),
        Member::ThinSphere(s) => ([0.0; 3], s.outer_diameter_m / 2.0, true),
        _ => return Vec::new(),
    };
    let mut dirs: Vec<[f64; 3]> = (0..8)
        .map(|k| {
            let t = std::f64::consts::TAU * k as f64 / 8.0;
            if sphere {
                [t.cos(), -t.sin(), 0.0]
            } else {
                [0.0, t.sin(), t.cos()]
            }
        })
        .collect();
    if sphere {
        dirs.push([0.0, 0.0, 1.0]);
        dirs.push([0.0, 0.0, -1.0]);
    }
    let arrows: Vec<_> = dirs
        .iter()
        .map(|d| arrow(add(centre, *d, r), *d, len, outward))
        .collect();
    let at = add(centre, [0.0, 0.0, 1.0], r + len);
    vec![LoadGlyph {
        component,
        value,
        shape: GlyphShape::Arrows(arrows),
        label_at: at,
    }]
}

/// Remote-stress arrows at the edges of a plate (outward for tension), shear along them.
fn plate_glyphs(
    member: &Member,
    component: LoadComponent,
    value: f64,
    sign: f64,
    len: f64,
) -> Vec<LoadGlyph> {
    let (hx, hy) = match member {
        Member::PlateWithHole(p) => (p.width_m / 2.0, p.height_m / 2.0),
        _ => return Vec::new(),
    };
    let stations = [-0.6, 0.0, 0.6];
    let arrows: Vec<[[f64; 3]; 2]> = match component {
        LoadComponent::RemoteStressX => [-1.0, 1.0]
            .iter()
            .flat_map(|e| {
                stations
                    .map(|k| arrow([e * hx, k * hy, 0.0], [e * sign, 0.0, 0.0], len, sign > 0.0))
            })
            .collect(),
        LoadComponent::RemoteStressY => [-1.0, 1.0]
            .iter()
            .flat_map(|e| {
                stations
                    .map(|k| arrow([k * hx, e * hy, 0.0], [0.0, e * sign, 0.0], len, sign > 0.0))
            })
            .collect(),
        LoadComponent::RemoteShearXY => {
            // Positive shear: +y on the +x edge, +x on the +y edge, and opposite on the others.
            let half = 0.5 * len;
            vec![
                [[hx, -half, 0.0], [hx, half, 0.0]],
                [[-hx, half, 0.0], [-hx, -half, 0.0]],
                [[-half, hy, 0.0], [half, hy, 0.0]],
                [[half, -hy, 0.0], [-half, -hy, 0.0]],
            ]
            .into_iter()
            .map(|[a, b]| if sign > 0.0 { [a, b] } else { [b, a] })
            .collect()
        }
        _ => return Vec::new(),
    };
    // The label at the outer end of the last arrow, off the plate.
    let Some(last) = arrows.last() else {
        return Vec::new();
    };
    let at = if sign > 0.0 { last[1] } else { last[0] };
    vec![LoadGlyph {
        component,
        value,
        shape: GlyphShape::Arrows(arrows),
        label_at: at,
    }]
}

#[cfg(test)]
mod tests {
    use super::*;
    use gw_mechanics::{Beam, LoadPoint, Material, Section, Shaft};

    fn steel() -> Material {
        Material::new("m", 200e9, 0.3, 12e-6, 300e6).unwrap()
    }

    fn beam(support: BeamSupport) -> Member {
        let mut b = Beam::new(
            Section::Rectangle {
                width_m: 0.03,
                height_m: 0.06,
            },
            steel(),
            0.5,
            support,
            0.5,
        )
        .unwrap();
        b.load_points = vec![
            LoadPoint {
                position_m: 0.2,
                multiple: 0.5,
            },
            LoadPoint {
                position_m: 0.3,
                multiple: 0.5,
            },
        ];
        Member::Beam(b)
    }

    fn arrows(g: &LoadGlyph) -> &[[[f64; 3]; 2]] {
        match &g.shape {
            GlyphShape::Arrows(a) => a,
            GlyphShape::Couple { .. } => panic!("not arrows"),
        }
    }

    /// A positive vertical force acts downward (−z) on the top face at each load point, with
    /// the load point's share; a negative one pushes up from below.
    #[test]
    fn vertical_force_points_down_onto_the_top_at_each_load_point() {
        let m = beam(BeamSupport::SimplySupported);
        let g = load_glyphs(
            &m,
            &LoadVector::from_pairs(&[(LoadComponent::VerticalForce, 1000.0)]),
        );
        assert_eq!(g.len(), 2);
        for (glyph, x) in g.iter().zip([0.2, 0.3]) {
            assert!((glyph.value - 500.0).abs() < 1e-9);
            let [tail, head] = arrows(glyph)[0];
            assert!(head[2] < tail[2], "points down");
            assert!((head[0] - x).abs() < 1e-12 && (head[2] - 0.03).abs() < 1e-12);
        }
        let up = load_glyphs(
            &m,
            &LoadVector::from_pairs(&[(LoadComponent::VerticalForce, -1000.0)]),
        );
        let [tail, head] = arrows(&up[0])[0];
        assert!(head[2] > tail[2] && (head[2] + 0.03).abs() < 1e-12);
    }

    /// Tension pulls away from both ends of a shaft; a couple is drawn at both ends with
    /// opposite axes (equilibrium of the free body).
    #[test]
    fn shaft_loads_balance_on_its_free_body() {
        let m = Member::Shaft(Shaft::new(0.05, 0.0, 0.3, steel()).unwrap());
        let g = load_glyphs(
            &m,
            &LoadVector::from_pairs(&[
                (LoadComponent::AxialForce, 10e3),
                (LoadComponent::Torque, 200.0),
            ]),
        );
        let axial: Vec<_> = g
            .iter()
            .filter(|g| g.component == LoadComponent::AxialForce)
            .collect();
        assert_eq!(axial.len(), 2);
        let dirs: Vec<f64> = axial
            .iter()
            .map(|g| {
                let [t, h] = arrows(g)[0];
                h[0] - t[0]
            })
            .collect();
        assert!(dirs[0] > 0.0 && dirs[1] < 0.0, "{dirs:?}");
        let axes: Vec<[f64; 3]> = g
            .iter()
            .filter_map(|g| match g.shape {
                GlyphShape::Couple { axis, .. } => Some(axis),
                _ => None,
            })
            .collect();
        assert_eq!(axes.len(), 2);
        assert!((axes[0][0] + axes[1][0]).abs() < 1e-12 && axes[0][0] > 0.0);
    }

    #[test]
    fn a_cantilever_carries_its_end_loads_at_the_free_end_only() {
        let m = beam(BeamSupport::Cantilever);
        let g = load_glyphs(
            &m,
            &LoadVector::from_pairs(&[
                (LoadComponent::AxialForce, 5e3),
                (LoadComponent::TemperatureChange, 20.0),
            ]),
        );
        assert_eq!(g.len(), 1, "temperature draws no arrow");
        let [tail, _] = arrows(&g[0])[0];
        assert!((tail[0] - 0.5).abs() < 1e-12);
    }
}
