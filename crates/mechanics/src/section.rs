//! Cross-sections of prismatic members: area, second moments, torsion constant, section
//! moduli and the first moment of area used for transverse shear.
//!
//! Section axes: `y` horizontal (across the width), `z` vertical (across the height), origin at
//! the centroid. All sections here are doubly symmetric, so the centroid is the geometric centre.

use std::f64::consts::PI;

use serde::{Deserialize, Serialize};

use crate::error::{Result, inner_smaller, positive_dimension};

/// The shape of a member's cross-section. Dimensions in metres.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum Section {
    /// Solid rectangle, `width_m` along y, `height_m` along z.
    Rectangle { width_m: f64, height_m: f64 },
    /// Solid circle.
    SolidRound { diameter_m: f64 },
    /// Circular tube.
    RoundTube {
        outer_diameter_m: f64,
        inner_diameter_m: f64,
    },
    /// Rectangular hollow section of uniform wall thickness (sharp corners).
    RectangularTube {
        width_m: f64,
        height_m: f64,
        wall_m: f64,
    },
    /// Doubly symmetric I (flanged) section: flanges top and bottom, web vertical.
    IBeam {
        flange_width_m: f64,
        depth_m: f64,
        flange_thickness_m: f64,
        web_thickness_m: f64,
    },
}

/// An axis-aligned rectangle of a section, `[y0, y1, z0, z1]`, metres.
type Part = [f64; 4];

/// Up to four rectangles, without allocating (sections are evaluated per map pixel).
struct Parts {
    items: [Part; 4],
    len: usize,
}

impl Parts {
    fn new(list: &[Part]) -> Self {
        let mut items = [[0.0; 4]; 4];
        items[..list.len()].copy_from_slice(list);
        Self {
            items,
            len: list.len(),
        }
    }

    fn iter(&self) -> std::slice::Iter<'_, Part> {
        self.items[..self.len].iter()
    }
}

impl Section {
    /// Checks every dimension: positive, finite, and inner parts smaller than outer ones.
    pub fn validate(&self) -> Result<()> {
        match *self {
            Section::Rectangle { width_m, height_m } => {
                positive_dimension("section width", width_m)?;
                positive_dimension("section height", height_m)?;
            }
            Section::SolidRound { diameter_m } => {
                positive_dimension("diameter", diameter_m)?;
            }
            Section::RoundTube {
                outer_diameter_m,
                inner_diameter_m,
            } => {
                positive_dimension("outer diameter", outer_diameter_m)?;
                positive_dimension("inner diameter", inner_diameter_m)?;
                inner_smaller(
                    "inner diameter",
                    inner_diameter_m,
                    "outer diameter",
                    outer_diameter_m,
                )?;
            }
            Section::RectangularTube {
                width_m,
                height_m,
                wall_m,
            } => {
                positive_dimension("section width", width_m)?;
                positive_dimension("section height", height_m)?;
                positive_dimension("wall thickness", wall_m)?;
                inner_smaller(
                    "twice the wall thickness",
                    2.0 * wall_m,
                    "smaller outside dimension",
                    width_m.min(height_m),
                )?;
            }
            Section::IBeam {
                flange_width_m,
                depth_m,
                flange_thickness_m,
                web_thickness_m,
            } => {
                positive_dimension("flange width", flange_width_m)?;
                positive_dimension("depth", depth_m)?;
                positive_dimension("flange thickness", flange_thickness_m)?;
                positive_dimension("web thickness", web_thickness_m)?;
                inner_smaller(
                    "twice the flange thickness",
                    2.0 * flange_thickness_m,
                    "depth",
                    depth_m,
                )?;
                inner_smaller(
                    "web thickness",
                    web_thickness_m,
                    "flange width",
                    flange_width_m,
                )?;
            }
        }
        Ok(())
    }

    /// Plain name of the section shape.
    pub fn shape_name(&self) -> &'static str {
        match self {
            Section::Rectangle { .. } => "solid rectangle",
            Section::SolidRound { .. } => "solid round",
            Section::RoundTube { .. } => "round tube",
            Section::RectangularTube { .. } => "rectangular tube",
            Section::IBeam { .. } => "I section",
        }
    }

    /// True for circular sections, whose surface is one round face.
    pub fn is_round(&self) -> bool {
        matches!(self, Section::SolidRound { .. } | Section::RoundTube { .. })
    }

    /// Outer and inner radius of a round section (inner 0 for solid), metres.
    pub fn radii_m(&self) -> Option<(f64, f64)> {
        match *self {
            Section::SolidRound { diameter_m } => Some((diameter_m / 2.0, 0.0)),
            Section::RoundTube {
                outer_diameter_m,
                inner_diameter_m,
            } => Some((outer_diameter_m / 2.0, inner_diameter_m / 2.0)),
            _ => None,
        }
    }

    /// Overall width along y, metres.
    pub fn width_m(&self) -> f64 {
        match *self {
            Section::Rectangle { width_m, .. } | Section::RectangularTube { width_m, .. } => {
                width_m
            }
            Section::SolidRound { diameter_m } => diameter_m,
            Section::RoundTube {
                outer_diameter_m, ..
            } => outer_diameter_m,
            Section::IBeam { flange_width_m, .. } => flange_width_m,
        }
    }

    /// Overall height along z, metres.
    pub fn height_m(&self) -> f64 {
        match *self {
            Section::Rectangle { height_m, .. } | Section::RectangularTube { height_m, .. } => {
                height_m
            }
            Section::SolidRound { diameter_m } => diameter_m,
            Section::RoundTube {
                outer_diameter_m, ..
            } => outer_diameter_m,
            Section::IBeam { depth_m, .. } => depth_m,
        }
    }

    /// The rectangles that make up a polygonal section (empty for round sections).
    fn parts(&self) -> Parts {
        match *self {
            Section::Rectangle { width_m, height_m } => Parts::new(&[[
                -width_m / 2.0,
                width_m / 2.0,
                -height_m / 2.0,
                height_m / 2.0,
            ]]),
            Section::RectangularTube {
                width_m: b,
                height_m: h,
                wall_m: t,
            } => Parts::new(&[
                [-b / 2.0, b / 2.0, h / 2.0 - t, h / 2.0],
                [-b / 2.0, b / 2.0, -h / 2.0, -h / 2.0 + t],
                [-b / 2.0, -b / 2.0 + t, -h / 2.0 + t, h / 2.0 - t],
                [b / 2.0 - t, b / 2.0, -h / 2.0 + t, h / 2.0 - t],
            ]),
            Section::IBeam {
                flange_width_m: bf,
                depth_m: d,
                flange_thickness_m: tf,
                web_thickness_m: tw,
            } => Parts::new(&[
                [-bf / 2.0, bf / 2.0, d / 2.0 - tf, d / 2.0],
                [-bf / 2.0, bf / 2.0, -d / 2.0, -d / 2.0 + tf],
                [-tw / 2.0, tw / 2.0, -d / 2.0 + tf, d / 2.0 - tf],
            ]),
            Section::SolidRound { .. } | Section::RoundTube { .. } => Parts::new(&[]),
        }
    }

    /// Cross-sectional area A, m².
    ///
    /// ```
    /// # use gw_mechanics::Section;
    /// let tube = Section::RoundTube { outer_diameter_m: 0.05, inner_diameter_m: 0.04 };
    /// let a = std::f64::consts::PI / 4.0 * (0.05f64.powi(2) - 0.04f64.powi(2));
    /// assert!((tube.area_m2() - a).abs() < 1e-15);
    /// ```
    pub fn area_m2(&self) -> f64 {
        if let Some((ro, ri)) = self.radii_m() {
            return PI * (ro * ro - ri * ri);
        }
        self.parts()
            .iter()
            .map(|[y0, y1, z0, z1]| (y1 - y0) * (z1 - z0))
            .sum()
    }

    /// Second moment of area about the horizontal y axis, Iy = ∫ z² dA, m⁴
    /// (governs bending in the vertical x–z plane).
    pub fn second_moment_y_m4(&self) -> f64 {
        if let Some((ro, ri)) = self.radii_m() {
            return PI / 4.0 * (ro.powi(4) - ri.powi(4));
        }
        self.parts()
            .iter()
            .map(|[y0, y1, z0, z1]| (y1 - y0) * (z1.powi(3) - z0.powi(3)) / 3.0)
            .sum()
    }

    /// Second moment of area about the vertical z axis, Iz = ∫ y² dA, m⁴
    /// (governs bending in the horizontal x–y plane).
    pub fn second_moment_z_m4(&self) -> f64 {
        if let Some((ro, ri)) = self.radii_m() {
            return PI / 4.0 * (ro.powi(4) - ri.powi(4));
        }
        self.parts()
            .iter()
            .map(|[y0, y1, z0, z1]| (z1 - z0) * (y1.powi(3) - y0.powi(3)) / 3.0)
            .sum()
    }

    /// Elastic section modulus for vertical bending, Wy = Iy / (h/2), m³.
    pub fn section_modulus_y_m3(&self) -> f64 {
        self.second_moment_y_m4() / (self.height_m() / 2.0)
    }

    /// Elastic section modulus for horizontal bending, Wz = Iz / (b/2), m³.
    pub fn section_modulus_z_m3(&self) -> f64 {
        self.second_moment_z_m4() / (self.width_m() / 2.0)
    }

    /// Torsion constant J (T = G J θ'), m⁴.
    ///
    /// Round: polar moment π(D⁴ − d⁴)/32. Solid rectangle: Roark's formula
    /// K = a b³ [16/3 − 3.36 (b/a)(1 − b⁴/(12 a⁴))] with a, b the half sides, a ≥ b
    /// (Young & Budynas, *Roark's Formulas for Stress and Strain*, 7th ed., Table 10.7, from
    /// memory for the case number). Rectangular tube: Bredt's thin-wall formula
    /// 4 Aₘ² t / Lₘ on the wall mid-line (Timoshenko & Goodier, *Theory of Elasticity*, §115).
    /// I section: open thin-walled Σ b t³ / 3 (Roark 7th ed. §10.3, from memory).
    pub fn torsion_constant_m4(&self) -> f64 {
        match *self {
            Section::SolidRound { .. } | Section::RoundTube { .. } => {
                let (ro, ri) = self.radii_m().unwrap_or((0.0, 0.0));
                PI / 2.0 * (ro.powi(4) - ri.powi(4))
            }
            Section::Rectangle { width_m, height_m } => {
                let a = width_m.max(height_m) / 2.0;
                let b = width_m.min(height_m) / 2.0;
                a * b.powi(3)
                    * (16.0 / 3.0 - 3.36 * (b / a) * (1.0 - b.powi(4) / (12.0 * a.powi(4))))
            }
            Section::RectangularTube {
                width_m,
                height_m,
                wall_m,
            } => {
                let bm = width_m - wall_m;
                let hm = height_m - wall_m;
                4.0 * (bm * hm).powi(2) * wall_m / (2.0 * (bm + hm))
            }
            Section::IBeam {
                flange_width_m,
                depth_m,
                flange_thickness_m,
                web_thickness_m,
            } => {
                (2.0 * flange_width_m * flange_thickness_m.powi(3)
                    + (depth_m - 2.0 * flange_thickness_m) * web_thickness_m.powi(3))
                    / 3.0
            }
        }
    }

    /// First moment about the y axis of the area above height z, Q(z) = ∫_{z'>z} z' dA, m³.
    pub fn first_moment_above_m3(&self, z_m: f64) -> f64 {
        if let Some((ro, ri)) = self.radii_m() {
            let cap = |r: f64| {
                let h = (r * r - z_m * z_m).max(0.0);
                if z_m.abs() >= r {
                    0.0
                } else {
                    2.0 / 3.0 * h.powf(1.5)
                }
            };
            return cap(ro) - cap(ri);
        }
        self.parts()
            .iter()
            .map(|[y0, y1, z0, z1]| {
                let lo = z_m.max(*z0);
                if lo < *z1 {
                    (y1 - y0) * (z1 * z1 - lo * lo) / 2.0
                } else {
                    0.0
                }
            })
            .sum()
    }

    /// First moment about the z axis of the area beyond y (towards +y), m³.
    pub fn first_moment_beyond_m3(&self, y_m: f64) -> f64 {
        if self.is_round() {
            return self.first_moment_above_m3(y_m);
        }
        self.parts()
            .iter()
            .map(|[y0, y1, z0, z1]| {
                let lo = y_m.max(*y0);
                if lo < *y1 {
                    (z1 - z0) * (y1 * y1 - lo * lo) / 2.0
                } else {
                    0.0
                }
            })
            .sum()
    }

    /// Shear stress τxy (acting along y on a cross-section) in the top (`z_sign` > 0) or
    /// bottom flange of an I section or wall of a rectangular tube at `y_m`, per newton of
    /// vertical shear Vz, Pa/N; zero for solid sections, whose top and bottom faces are free of
    /// it. Thin-wall shear flow: along the flange ∂τxy/∂y = −Vz z̄ / Iy (equilibrium of a
    /// flange element with the bending stress σx = My z / Iy and dMy/dx = Vz), with τ = 0 at a
    /// free flange tip (I section; linear across the web's width, where the flow turns into the
    /// web) or at the middle of the wall by symmetry (tube). z̄ is the height of the flange's
    /// mid-plane.
    ///
    /// Source: Gere & Goodno, *Mechanics of Materials*, 7th ed., §6.8–6.9 (shear stresses in
    /// thin-walled open and closed sections); Budynas & Nisbett, *Shigley's*, 10th ed., §3-11.
    pub fn flange_shear_per_unit_vz(&self, y_m: f64, z_sign: f64) -> f64 {
        let iy = self.second_moment_y_m4();
        match *self {
            Section::IBeam {
                flange_width_m,
                depth_m,
                flange_thickness_m,
                web_thickness_m,
            } => {
                let zbar = z_sign.signum() * (depth_m - flange_thickness_m) / 2.0;
                let k = -zbar / iy;
                let at = |y: f64| k * (y - y.signum() * flange_width_m / 2.0);
                let hw = web_thickness_m / 2.0;
                if y_m.abs() >= hw {
                    at(y_m)
                } else {
                    at(hw) * y_m / hw
                }
            }
            Section::RectangularTube {
                height_m, wall_m, ..
            } => {
                let zbar = z_sign.signum() * (height_m - wall_m) / 2.0;
                -zbar * y_m / iy
            }
            _ => 0.0,
        }
    }

    /// Total material width cut by the horizontal line at height z, metres.
    pub fn width_at_m(&self, z_m: f64) -> f64 {
        if let Some((ro, ri)) = self.radii_m() {
            let chord = |r: f64| 2.0 * (r * r - z_m * z_m).max(0.0).sqrt();
            return chord(ro) - chord(ri);
        }
        self.parts()
            .iter()
            .filter(|[_, _, z0, z1]| *z0 <= z_m && z_m <= *z1)
            .map(|[y0, y1, _, _]| y1 - y0)
            .sum()
    }

    /// Total material thickness cut by the vertical line at y, metres.
    pub fn thickness_at_m(&self, y_m: f64) -> f64 {
        if self.is_round() {
            return self.width_at_m(y_m);
        }
        self.parts()
            .iter()
            .filter(|[y0, y1, _, _]| *y0 <= y_m && y_m <= *y1)
            .map(|[_, _, z0, z1]| z1 - z0)
            .sum()
    }

    /// First moment of area above the neutral axis, Q(0), m³.
    ///
    /// Rectangle: b h² / 8 (Gere & Goodno, *Mechanics of Materials*, 7th ed., §5.8).
    pub fn first_moment_neutral_axis_m3(&self) -> f64 {
        self.first_moment_above_m3(0.0)
    }

    /// Width of material at the neutral axis (the shear-carrying width b in τ = VQ/(Ib)), m.
    pub fn width_at_neutral_axis_m(&self) -> f64 {
        self.width_at_m(0.0)
    }
}

/// Validates a section and hands it back, for member constructors.
pub(crate) fn checked(section: Section) -> Result<Section> {
    section.validate()?;
    Ok(section)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn rectangle_neutral_axis_first_moment_is_bh2_over_8() {
        // Gere & Goodno, Mechanics of Materials, 7th ed., §5.8: Q = b h² / 8 at the neutral axis.
        let s = Section::Rectangle {
            width_m: 0.02,
            height_m: 0.06,
        };
        assert_relative_eq!(
            s.first_moment_neutral_axis_m3(),
            0.02 * 0.06f64.powi(2) / 8.0,
            max_relative = 1e-12
        );
    }

    #[test]
    fn solid_round_neutral_axis_first_moment_is_2r3_over_3() {
        // Gere & Goodno, 7th ed., §5.9: Q = 2 r³ / 3 for a solid circle.
        let s = Section::SolidRound { diameter_m: 0.04 };
        assert_relative_eq!(
            s.first_moment_neutral_axis_m3(),
            2.0 * 0.02f64.powi(3) / 3.0,
            max_relative = 1e-12
        );
    }
}
