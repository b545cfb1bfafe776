//! Internal force resultants on a cross-section and the surface state they cause
//! (elementary beam theory: Navier for normal stress, Coulomb for torsion of round sections;
//! transverse shear by the elasticity solution on solid rectangles and solid rounds, by
//! Jourawski's mean and the thin-wall shear flow on tubes and flanged sections).

use crate::material::Material;
use crate::rectangle_shear::RectangleShear;
use crate::section::Section;
use crate::surface::Face;
use crate::surface_state::{SurfaceState, SurfaceStrain};

/// Resultants acting on the +x face of a cut, SI units, right-handed about the section axes.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Resultants {
    /// Axial force N, positive in tension.
    pub axial_n: f64,
    /// Shear force along +y, N.
    pub shear_y_n: f64,
    /// Shear force along +z, N.
    pub shear_z_n: f64,
    /// Torque about +x, N·m.
    pub torque_n_m: f64,
    /// Moment about +y, N·m (positive stretches +z).
    pub moment_y_n_m: f64,
    /// Moment about +z, N·m (positive compresses +y).
    pub moment_z_n_m: f64,
}

/// Where a surface coordinate sits in the section and which way the local y axis points.
struct SectionPoint {
    y: f64,
    z: f64,
    /// Direction of local surface y in the section plane, (dy, dz).
    dir: (f64, f64),
}

fn section_point(section: &Section, face: Face, s_m: f64) -> Option<SectionPoint> {
    let b = section.width_m();
    let h = section.height_m();
    if let Some((r, _)) = section.radii_m() {
        if face != Face::Round {
            return None;
        }
        let phi = s_m / r;
        let (sin, cos) = phi.sin_cos();
        return Some(SectionPoint {
            y: r * sin,
            z: r * cos,
            dir: (cos, -sin),
        });
    }
    let side_y = match *section {
        Section::IBeam {
            web_thickness_m, ..
        } => web_thickness_m / 2.0,
        _ => b / 2.0,
    };
    match face {
        Face::Top => Some(SectionPoint {
            y: s_m,
            z: h / 2.0,
            dir: (1.0, 0.0),
        }),
        Face::Bottom => Some(SectionPoint {
            y: -s_m,
            z: -h / 2.0,
            dir: (-1.0, 0.0),
        }),
        Face::Front => Some(SectionPoint {
            y: -side_y,
            z: s_m,
            dir: (0.0, 1.0),
        }),
        Face::Back => Some(SectionPoint {
            y: side_y,
            z: -s_m,
            dir: (0.0, -1.0),
        }),
        Face::Round | Face::Plate | Face::Patch(_) => None,
    }
}

/// Half-extent of `s` on a face of a prismatic section, metres (round: half circumference).
pub(crate) fn face_half_extent_m(section: &Section, face: Face) -> Option<f64> {
    if let Some((r, _)) = section.radii_m() {
        return (face == Face::Round).then_some(std::f64::consts::PI * r);
    }
    match (face, *section) {
        (Face::Top | Face::Bottom, _) => Some(section.width_m() / 2.0),
        (
            Face::Front | Face::Back,
            Section::IBeam {
                depth_m,
                flange_thickness_m,
                ..
            },
        ) => Some(depth_m / 2.0 - flange_thickness_m),
        (Face::Front | Face::Back, _) => Some(section.height_m() / 2.0),
        _ => None,
    }
}

/// The faces of a prismatic section.
pub(crate) fn section_faces(section: &Section) -> &'static [Face] {
    if section.is_round() {
        &[Face::Round]
    } else {
        &[Face::Top, Face::Bottom, Face::Front, Face::Back]
    }
}

/// Surface strain at one surface point per unit of each resultant, in the order
/// axial, shear y, shear z, torque, moment y, moment z. The state under any resultants is their
/// weighted sum, which lets the colour map compute these once per row.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct UnitStrains([SurfaceStrain; 6]);

impl UnitStrains {
    /// The surface state under `resultants` plus a free thermal strain.
    pub(crate) fn state(&self, r: &Resultants, thermal_strain: f64) -> SurfaceState {
        let k = [
            r.axial_n,
            r.shear_y_n,
            r.shear_z_n,
            r.torque_n_m,
            r.moment_y_n_m,
            r.moment_z_n_m,
        ];
        let mut strain = SurfaceStrain::default();
        for (unit, k) in self.0.iter().zip(k) {
            strain.normal_x += unit.normal_x * k;
            strain.normal_y += unit.normal_y * k;
            strain.shear_xy += unit.shear_xy * k;
        }
        SurfaceState::from_strain(strain).with_free_thermal(thermal_strain)
    }
}

/// Strains per unit resultant at `(face, s)`, or `None` if the face is not on the section.
///
/// σx = N/A + My z/Iy − Mz y/Iz (Navier); transverse strain −ν σx / E; shear along the
/// surface from the transverse shear (see [`shear_per_newton`]), the thin-wall shear flow of
/// flanges and tube walls on top and bottom faces, and, on round sections, τ = T r / J.
pub(crate) fn unit_strains(
    section: &Section,
    material: &Material,
    face: Face,
    s_m: f64,
) -> Option<UnitStrains> {
    let p = section_point(section, face, s_m)?;
    let e = material.youngs_modulus_pa;
    let nu = material.poisson_ratio;
    let g = material.shear_modulus_pa();
    let iy = section.second_moment_y_m4();
    let iz = section.second_moment_z_m4();
    let normal = |sigma: f64| SurfaceStrain::new(sigma / e, -nu * sigma / e, 0.0);
    let shear = |tau: f64| SurfaceStrain::new(0.0, 0.0, tau / g);

    let (tau_y, tau_z) = shear_per_newton(section, nu, &p);
    let (dy, dz) = p.dir;
    let (shear_y, shear_z, torque) = if let Some((r, _)) = section.radii_m() {
        // On a free round boundary the shear stress is tangent to it; its vertical (horizontal)
        // component is the Jourawski mean, so the tangential value is that over the tangent's
        // component. Near the top (sides) the component and Q vanish together.
        let along = |tau: f64, component: f64| {
            if component.abs() > 1e-9 {
                tau / component
            } else {
                0.0
            }
        };
        // On a solid round bar the elasticity solution replaces the mean: its surface shear is
        // the Jourawski value times 3(1 + 2ν) / (4(1 + ν)) all round the boundary, which at the
        // neutral axis gives (1 + 2ν)/(1 + ν) · V/A instead of 4/3 · V/A (Timoshenko & Goodier,
        // Theory of Elasticity, 3rd ed., §124, bending of a cantilever of circular section).
        // Tubes keep the mean, which is exact in the thin-wall limit.
        let exact = match section {
            Section::SolidRound { .. } => 3.0 * (1.0 + 2.0 * nu) / (4.0 * (1.0 + nu)),
            _ => 1.0,
        };
        // Torque on the +x face acts along x̂ × r̂, opposite to the local y direction.
        (
            exact * along(tau_y, dy),
            exact * along(tau_z, dz),
            -r / section.torsion_constant_m4(),
        )
    } else {
        // Flat faces: vertical shear shows on side faces and, as the shear flow of flanges and
        // tube walls, on top and bottom; horizontal shear on top and bottom.
        let flange = section.flange_shear_per_unit_vz(p.y, p.z);
        (tau_y * dy, tau_z * dz + flange * dy, 0.0)
    };
    Some(UnitStrains([
        normal(1.0 / section.area_m2()),
        shear(shear_y),
        shear(shear_z),
        shear(torque),
        normal(p.z / iy),
        normal(-p.y / iz),
    ]))
}

/// Transverse shear stress at a surface point per newton of shear force, Pa/N: along +y from
/// Vy and along +z from Vz.
///
/// Solid rectangle: the elasticity (Saint-Venant flexure) value on the faces parallel to each
/// force, Vz on the side faces and Vy on the top and bottom (Timoshenko & Goodier, *Theory of
/// Elasticity*, 3rd ed., §124; see [`RectangleShear`]); each face shows only one of the two.
/// Other sections: the mean across the width at that level, τ = V Q / (I b) (Jourawski; Gere &
/// Goodno, *Mechanics of Materials*, 7th ed., §5.8), which the caller turns into the tangential
/// value on round faces.
fn shear_per_newton(section: &Section, nu: f64, p: &SectionPoint) -> (f64, f64) {
    if let Section::Rectangle { width_m, height_m } = *section {
        let (dy, dz) = p.dir;
        let along_y = RectangleShear {
            depth_m: width_m,
            width_m: height_m,
            poisson_ratio: nu,
        };
        let along_z = RectangleShear {
            depth_m: height_m,
            width_m,
            poisson_ratio: nu,
        };
        // Skip the component this face does not show: the map asks for many points.
        let tau_y = if dy != 0.0 {
            along_y.face_stress_per_newton(p.y)
        } else {
            0.0
        };
        let tau_z = if dz != 0.0 {
            along_z.face_stress_per_newton(p.z)
        } else {
            0.0
        };
        return (tau_y, tau_z);
    }
    let width = section.width_at_m(p.z);
    let tau_z = if width > 0.0 {
        section.first_moment_above_m3(p.z) / (section.second_moment_y_m4() * width)
    } else {
        0.0
    };
    let thickness = section.thickness_at_m(p.y);
    let tau_y = if thickness > 0.0 {
        section.first_moment_beyond_m3(p.y) / (section.second_moment_z_m4() * thickness)
    } else {
        0.0
    };
    (tau_y, tau_z)
}
