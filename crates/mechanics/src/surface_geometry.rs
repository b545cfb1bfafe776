//! Where a surface point sits in space: the part's global axes for drawing it in 3-D.
//!
//! Global axes are the member axes of [`crate`] (x along the member, z up, y so that x, y, z
//! are right-handed); a beam's section is centred on the x axis, a sphere on the origin with
//! its poles on ±z, a plate lies in the x–y plane with its gaugeable face on top.

use crate::member::Member;
use crate::section::Section;
use crate::surface::{Face, SurfacePoint};

/// A point of a face in space with the face's local axes there, all in global coordinates.
/// `axis_x`, `axis_y` and `normal` are unit vectors and right-handed (x × y = normal).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SurfaceFrame {
    /// Position, metres.
    pub position: [f64; 3],
    /// Outward normal.
    pub normal: [f64; 3],
    /// Local surface x (the direction of growing `x_m`).
    pub axis_x: [f64; 3],
    /// Local surface y (the direction of growing `s_m`).
    pub axis_y: [f64; 3],
}

impl SurfaceFrame {
    /// The point at local offsets `(u_m, v_m)` along the surface axes, on the tangent plane.
    pub fn offset(&self, u_m: f64, v_m: f64) -> [f64; 3] {
        std::array::from_fn(|i| self.position[i] + u_m * self.axis_x[i] + v_m * self.axis_y[i])
    }
}

/// Half width (y) and half height (z) of a beam face's plane from the section centre, and
/// where the side faces lie (the web of an I section).
fn beam_planes(section: &Section) -> (f64, f64) {
    let half_height = section.height_m() / 2.0;
    let side = match *section {
        Section::IBeam {
            web_thickness_m, ..
        } => web_thickness_m / 2.0,
        _ => section.width_m() / 2.0,
    };
    (side, half_height)
}

/// The frame of a prismatic face at (x, s); `radius_m` for round sections.
fn prismatic_frame(face: Face, x: f64, s: f64, section: &Section) -> Option<SurfaceFrame> {
    let (side, half_height) = beam_planes(section);
    let frame = |position, normal, axis_y| SurfaceFrame {
        position,
        normal,
        axis_x: [1.0, 0.0, 0.0],
        axis_y,
    };
    Some(match face {
        Face::Top => frame([x, s, half_height], [0.0, 0.0, 1.0], [0.0, 1.0, 0.0]),
        Face::Bottom => frame([x, -s, -half_height], [0.0, 0.0, -1.0], [0.0, -1.0, 0.0]),
        Face::Front => frame([x, -side, s], [0.0, -1.0, 0.0], [0.0, 0.0, 1.0]),
        Face::Back => frame([x, side, -s], [0.0, 1.0, 0.0], [0.0, 0.0, -1.0]),
        Face::Round => {
            let (r, _) = section.radii_m()?;
            round_frame(x, s, r)
        }
        Face::Plate | Face::Patch(_) => return None,
    })
}

/// The round face of radius `r` about the x axis: the angle s/r runs from the top line (+z)
/// towards +y.
fn round_frame(x: f64, s: f64, r: f64) -> SurfaceFrame {
    let (sin, cos) = (s / r).sin_cos();
    SurfaceFrame {
        position: [x, r * sin, r * cos],
        normal: [0.0, sin, cos],
        axis_x: [1.0, 0.0, 0.0],
        axis_y: [0.0, cos, -sin],
    }
}

/// A sphere of radius `r` about the origin: `x` is the arc along a meridian from the equator
/// towards the +z pole (latitude x/r), `s` the arc along the equator (longitude −s/r), so that
/// local x, y and the outward normal are right-handed.
fn sphere_frame(x: f64, s: f64, r: f64) -> SurfaceFrame {
    let (sin_lat, cos_lat) = (x / r).sin_cos();
    let (sin_lon, cos_lon) = (-s / r).sin_cos();
    let normal = [cos_lat * cos_lon, cos_lat * sin_lon, sin_lat];
    let axis_x = [-sin_lat * cos_lon, -sin_lat * sin_lon, cos_lat];
    // y = normal × x: towards falling longitude.
    let axis_y = [sin_lon, -cos_lon, 0.0];
    SurfaceFrame {
        position: normal.map(|c| c * r),
        normal,
        axis_x,
        axis_y,
    }
}

/// A flat face in the x–y plane at height `z`, normal +z.
fn flat_frame(x: f64, s: f64, z: f64) -> SurfaceFrame {
    SurfaceFrame {
        position: [x, s, z],
        normal: [0.0, 0.0, 1.0],
        axis_x: [1.0, 0.0, 0.0],
        axis_y: [0.0, 1.0, 0.0],
    }
}

impl Member {
    /// Where a point of a face lies in space, with the face's local axes there; `None` for a
    /// face the member does not have. The point is not range-checked (drawing may run past an
    /// edge); use [`Member::locate`] first where that matters.
    pub fn surface_frame(&self, point: &SurfacePoint) -> Option<SurfaceFrame> {
        let (x, s) = (point.x_m, point.s_m);
        match (self, point.face) {
            (Member::Beam(b), face) => prismatic_frame(face, x, s, &b.section),
            (Member::Shaft(m), Face::Round) => Some(round_frame(x, s, m.radius_m())),
            (Member::ThinCylinder(m), Face::Round) => {
                Some(round_frame(x, s, m.outer_diameter_m / 2.0))
            }
            (Member::ThickCylinder(m), Face::Round) => {
                Some(round_frame(x, s, m.outer_diameter_m / 2.0))
            }
            (Member::ThinSphere(m), Face::Round) => {
                Some(sphere_frame(x, s, m.outer_diameter_m / 2.0))
            }
            (Member::PlateWithHole(m), Face::Plate) => Some(flat_frame(x, s, m.thickness_m / 2.0)),
            (Member::GivenState(_), Face::Plate) => Some(flat_frame(x, s, 0.0)),
            (Member::ImportedField(m), Face::Patch(_)) => m.surface()?.frame(point),
            _ => None,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::{Beam, BeamSupport, Material, Shaft, ThinSphere};

    fn steel() -> Material {
        Material::new("m", 200e9, 0.3, 12e-6, 300e6).unwrap()
    }

    fn cross(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
        [
            a[1] * b[2] - a[2] * b[1],
            a[2] * b[0] - a[0] * b[2],
            a[0] * b[1] - a[1] * b[0],
        ]
    }

    fn close(a: [f64; 3], b: [f64; 3], tol: f64) -> bool {
        a.iter().zip(b).all(|(p, q)| (p - q).abs() <= tol)
    }

    /// Every face of every member: right-handed unit axes, and the axes are the derivatives
    /// of the position with respect to x_m and s_m (checked by finite differences, a route
    /// independent of the closed-form axes).
    #[test]
    fn frames_are_right_handed_and_follow_the_coordinates() {
        let members = [
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
                    BeamSupport::Cantilever,
                    1.0,
                )
                .unwrap(),
            ),
            Member::Shaft(Shaft::new(0.05, 0.02, 0.3, steel()).unwrap()),
            Member::ThinSphere(ThinSphere::new(0.6, 0.005, steel()).unwrap()),
        ];
        let h = 1e-6;
        for m in &members {
            for f in m.faces() {
                let x = 0.3 * f.x_range_m.0 + 0.7 * f.x_range_m.1;
                let s = 0.6 * f.s_range_m.0 + 0.4 * f.s_range_m.1;
                let at = |x, s| m.surface_frame(&SurfacePoint::new(f.face, x, s)).unwrap();
                let fr = at(x, s);
                assert!(close(cross(fr.axis_x, fr.axis_y), fr.normal, 1e-12));
                let dx = at(x + h, s).position;
                let ds = at(x, s + h).position;
                let dx: [f64; 3] = std::array::from_fn(|i| (dx[i] - fr.position[i]) / h);
                let ds: [f64; 3] = std::array::from_fn(|i| (ds[i] - fr.position[i]) / h);
                assert!(close(dx, fr.axis_x, 1e-4), "{:?} x {dx:?}", f.face);
                // On a sphere the parallel's arc shrinks by cos(latitude).
                let scale = match m {
                    Member::ThinSphere(sp) => (x / (sp.outer_diameter_m / 2.0)).cos(),
                    _ => 1.0,
                };
                assert!(
                    close(ds, fr.axis_y.map(|c| c * scale), 1e-4),
                    "{:?} s {ds:?}",
                    f.face
                );
            }
        }
    }

    #[test]
    fn beam_faces_sit_on_the_section_outline() {
        let beam = Member::Beam(
            Beam::new(
                Section::Rectangle {
                    width_m: 0.03,
                    height_m: 0.06,
                },
                steel(),
                0.5,
                BeamSupport::Cantilever,
                0.5,
            )
            .unwrap(),
        );
        let top = beam
            .surface_frame(&SurfacePoint::new(Face::Top, 0.2, 0.01))
            .unwrap();
        assert!(close(top.position, [0.2, 0.01, 0.03], 1e-15));
        let front = beam
            .surface_frame(&SurfacePoint::new(Face::Front, 0.2, 0.02))
            .unwrap();
        assert!(close(front.position, [0.2, -0.015, 0.02], 1e-15));
        assert!(
            beam.surface_frame(&SurfacePoint::new(Face::Round, 0.2, 0.0))
                .is_none()
        );
    }
}
