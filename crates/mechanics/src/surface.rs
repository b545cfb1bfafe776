//! Points on a part's surface and the extent of each face.
//!
//! A surface point is a face plus two coordinates in metres: `x_m` along the member axis (or
//! the plate's x) and `s_m` across the face (arc length on round faces, the plate's y on a
//! plate). The local surface axes of the strain state are x (along `x_m`) and y (along `s_m`),
//! chosen so that x, y and the outward normal are right-handed. Gauge angles are therefore
//! counter-clockwise as seen from outside the part.

use std::borrow::Cow;

use serde::{Deserialize, Serialize};

/// A face of a part.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum Face {
    /// Top face of a beam (outward normal +z); `s` runs towards +y from the centre line.
    Top,
    /// Bottom face of a beam (normal −z); `s` runs towards −y.
    Bottom,
    /// Front side face of a beam (normal −y; the web face of an I section); `s` runs up (+z)
    /// from the neutral axis.
    Front,
    /// Back side face of a beam (normal +y); `s` runs down (−z).
    Back,
    /// The round outer surface of a shaft, round beam or vessel; `s` is the arc length from the
    /// top line (+z), running towards +y.
    Round,
    /// The face of a flat plate; `x_m`, `s_m` are plan coordinates from the hole centre.
    Plate,
    /// A face of an imported surface (numbered from 0, largest first); `x_m`, `s_m` are the
    /// face's own flat coordinates (see [`crate::imported::patches`]).
    Patch(u16),
}

impl Face {
    /// Plain name for display.
    pub fn name(self) -> Cow<'static, str> {
        Cow::Borrowed(match self {
            Face::Top => "top face",
            Face::Bottom => "bottom face",
            Face::Front => "front face",
            Face::Back => "back face",
            Face::Round => "outer surface",
            Face::Plate => "plate face",
            Face::Patch(k) => return Cow::Owned(format!("face {}", k as u32 + 1)),
        })
    }
}

/// A point on a part's surface.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SurfacePoint {
    /// Face the point is on.
    pub face: Face,
    /// Coordinate along the member axis (plate: x), metres.
    pub x_m: f64,
    /// Coordinate across the face (arc length on round faces; plate: y), metres.
    pub s_m: f64,
}

impl SurfacePoint {
    /// A point from its face and coordinates.
    pub const fn new(face: Face, x_m: f64, s_m: f64) -> Self {
        Self { face, x_m, s_m }
    }

    /// A point on a round surface of radius `radius_m` at angle `angle_rad` from the top line.
    pub fn on_round(x_m: f64, angle_rad: f64, radius_m: f64) -> Self {
        Self::new(Face::Round, x_m, angle_rad * radius_m)
    }
}

/// Where a face extends, in its own coordinates.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FaceExtent {
    /// The face.
    pub face: Face,
    /// Range of `x_m`, metres.
    pub x_range_m: (f64, f64),
    /// Range of `s_m`, metres.
    pub s_range_m: (f64, f64),
    /// True when `s` wraps round (a full circumference).
    pub wraps: bool,
    /// Radius of a hole centred at the origin that is not part of the face, metres.
    pub hole_radius_m: Option<f64>,
}

impl FaceExtent {
    /// The round outer surface of a cylinder of `radius_m`, from x = 0 to `length_m`, with the
    /// arc length running half a turn either way from the top line.
    pub fn round(length_m: f64, radius_m: f64) -> Self {
        let half = std::f64::consts::PI * radius_m;
        Self {
            face: Face::Round,
            x_range_m: (0.0, length_m),
            s_range_m: (-half, half),
            wraps: true,
            hole_radius_m: None,
        }
    }

    /// A point of this face brought into range (s wrapped on round faces), or why it is off.
    pub fn locate(&self, point: &SurfacePoint) -> Result<SurfacePoint, String> {
        if !point.x_m.is_finite() || !point.s_m.is_finite() {
            return Err(format!(
                "its coordinates ({}, {}) are not finite numbers",
                point.x_m, point.s_m
            ));
        }
        let tol = 1e-9 * (self.x_range_m.1 - self.x_range_m.0).abs().max(1e-3);
        let (x0, x1) = self.x_range_m;
        if point.x_m < x0 - tol || point.x_m > x1 + tol {
            return Err(format!(
                "x = {:.2} mm lies outside {:.2} to {:.2} mm of the {}",
                point.x_m * 1e3,
                x0 * 1e3,
                x1 * 1e3,
                self.face.name()
            ));
        }
        let (s0, s1) = self.s_range_m;
        let mut s = point.s_m;
        if self.wraps {
            let period = s1 - s0;
            s = (s - s0).rem_euclid(period) + s0;
        } else if s < s0 - tol || s > s1 + tol {
            return Err(format!(
                "s = {:.2} mm lies outside {:.2} to {:.2} mm across the {}",
                s * 1e3,
                s0 * 1e3,
                s1 * 1e3,
                self.face.name()
            ));
        }
        if let Some(a) = self.hole_radius_m {
            let r = point.x_m.hypot(s);
            if r < a * (1.0 - 1e-9) {
                return Err(format!(
                    "it lies inside the hole (radius {:.2} mm, point at {:.2} mm from its centre)",
                    a * 1e3,
                    r * 1e3
                ));
            }
        }
        Ok(SurfacePoint::new(
            point.face,
            point.x_m.clamp(x0, x1),
            if self.wraps { s } else { s.clamp(s0, s1) },
        ))
    }
}
