//! Internal force resultants on a cross-section and the surface state they cause
//! (elementary beam theory: Navier for normal stress, Jourawski for transverse shear,
//! Coulomb for torsion of round sections).

use crate::material::Material;
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
        Face::Round | Face::Plate => None,
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

/// Surface state at `(face, s)` of a section carrying `resultants`, plus a temperature change.
/// Returns `None` if the face does not belong to the section.
///
/// σx = N/A + My z/Iy − Mz y/Iz; τ from shear by τ = V Q / (I b) along the surface direction;
/// torque on round sections τ = T r / J. Transverse strain −ν σx / E.
pub(crate) fn surface_state(
    section: &Section,
    material: &Material,
    resultants: &Resultants,
    temperature_change_c: f64,
    face: Face,
    s_m: f64,
) -> Option<SurfaceState> {
    let p = section_point(section, face, s_m)?;
    let e = material.youngs_modulus_pa;
    let nu = material.poisson_ratio;
    let g = material.shear_modulus_pa();
    let iy = section.second_moment_y_m4();
    let iz = section.second_moment_z_m4();
    let sigma = resultants.axial_n / section.area_m2() + resultants.moment_y_n_m * p.z / iy
        - resultants.moment_z_n_m * p.y / iz;

    // Jourawski mean shear stresses at this level, along +z (from Vz) and along +y (from Vy).
    let tau_z = if resultants.shear_z_n != 0.0 {
        let width = section.width_at_m(p.z);
        if width > 0.0 {
            resultants.shear_z_n * section.first_moment_above_m3(p.z) / (iy * width)
        } else {
            0.0
        }
    } else {
        0.0
    };
    let tau_y = if resultants.shear_y_n != 0.0 {
        let thickness = section.thickness_at_m(p.y);
        if thickness > 0.0 {
            resultants.shear_y_n * section.first_moment_beyond_m3(p.y) / (iz * thickness)
        } else {
            0.0
        }
    } else {
        0.0
    };
    let (dy, dz) = p.dir;
    let mut tau_s = 0.0;
    if section.is_round() {
        // On a free round boundary the shear stress is tangent to it; its vertical (horizontal)
        // component is the Jourawski mean, so the tangential value is that over the tangent's
        // component. Near the top (sides) the component and Q vanish together.
        if dz.abs() > 1e-9 {
            tau_s += tau_z / dz;
        }
        if dy.abs() > 1e-9 {
            tau_s += tau_y / dy;
        }
        if let Some((r, _)) = section.radii_m() {
            // Torque on +x face acts along x̂ × r̂, opposite to the local y direction.
            tau_s -= resultants.torque_n_m * r / section.torsion_constant_m4();
        }
    } else {
        // Flat faces: vertical shear shows on side faces, horizontal shear on top/bottom.
        tau_s += tau_z * dz + tau_y * dy;
    }
    let thermal = material.cte_per_c * temperature_change_c;
    Some(SurfaceState {
        strain: SurfaceStrain::new(sigma / e + thermal, -nu * sigma / e + thermal, tau_s / g),
        thermal_strain: thermal,
        normal_stress_pa: 0.0,
    })
}
