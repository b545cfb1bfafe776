//! Every kind of part in one enum, with one way to ask for the surface state.

use std::borrow::Cow;

use serde::{Deserialize, Serialize};

use crate::beam::{BEAM_COMPONENTS, Beam};
use crate::error::{MechanicsError, Result};
use crate::given_state::{GIVEN_STATE_COMPONENTS, GivenState};
use crate::imported::ImportedSurface;
use crate::load::{LoadComponent, LoadVector};
use crate::material::Material;
use crate::plate_with_hole::{PLATE_COMPONENTS, PlateWithHole};
use crate::shaft::{SHAFT_COMPONENTS, Shaft};
use crate::surface::{FaceExtent, SurfacePoint};
use crate::surface_state::SurfaceState;
use crate::thick_cylinder::{THICK_CYLINDER_COMPONENTS, ThickCylinder};
use crate::thin_cylinder::{THIN_CYLINDER_COMPONENTS, ThinCylinder};
use crate::thin_sphere::{THIN_SPHERE_COMPONENTS, ThinSphere};

/// Where the largest stress of a part was found.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum PeakLocation {
    /// On a gaugeable face.
    Surface(SurfacePoint),
    /// On the bore (inner surface) of a vessel, where the pressure acts and the stress is
    /// highest; radius in metres.
    Bore {
        /// Bore radius, metres.
        radius_m: f64,
    },
}

impl PeakLocation {
    /// Where, in words.
    pub fn describe(&self) -> String {
        match self {
            PeakLocation::Surface(p) => format!(
                "on the {} at x = {:.1} mm, s = {:.1} mm",
                p.face.name(),
                p.x_m * 1e3,
                p.s_m * 1e3
            ),
            PeakLocation::Bore { radius_m } => {
                format!("at the bore (r = {:.1} mm)", radius_m * 1e3)
            }
        }
    }
}

/// Von Mises equivalent of three principal stresses, Pa:
/// √(½ [(σ1 − σ2)² + (σ2 − σ3)² + (σ3 − σ1)²]) (Budynas & Nisbett, *Shigley's*, 10th ed., §5-5).
fn von_mises_3d([a, b, c]: [f64; 3]) -> f64 {
    (0.5 * ((a - b).powi(2) + (b - c).powi(2) + (c - a).powi(2))).sqrt()
}

/// A part whose surface strains Gaugewright can compute.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum Member {
    /// Prismatic beam or bar.
    Beam(Beam),
    /// Round shaft.
    Shaft(Shaft),
    /// Thin-walled cylindrical vessel.
    ThinCylinder(ThinCylinder),
    /// Thin-walled sphere.
    ThinSphere(ThinSphere),
    /// Thick-walled cylinder.
    ThickCylinder(ThickCylinder),
    /// Plate with a circular hole.
    PlateWithHole(PlateWithHole),
    /// A user-given uniform state.
    GivenState(GivenState),
    /// A surface and its fields imported from finite-element results.
    ImportedField(ImportedSurface),
}

impl Member {
    /// Plain name of the member kind.
    pub fn kind_name(&self) -> &'static str {
        match self {
            Member::Beam(_) => "beam",
            Member::Shaft(_) => "round shaft",
            Member::ThinCylinder(_) => "thin-walled cylinder",
            Member::ThinSphere(_) => "thin-walled sphere",
            Member::ThickCylinder(_) => "thick-walled cylinder",
            Member::PlateWithHole(_) => "plate with a hole",
            Member::GivenState(_) => "given surface state",
            Member::ImportedField(_) => "imported field",
        }
    }

    /// The load components this member responds to.
    pub fn components(&self) -> Cow<'static, [LoadComponent]> {
        Cow::Borrowed(match self {
            Member::Beam(_) => BEAM_COMPONENTS,
            Member::Shaft(_) => SHAFT_COMPONENTS,
            Member::ThinCylinder(_) => THIN_CYLINDER_COMPONENTS,
            Member::ThinSphere(_) => THIN_SPHERE_COMPONENTS,
            Member::ThickCylinder(_) => THICK_CYLINDER_COMPONENTS,
            Member::PlateWithHole(_) => PLATE_COMPONENTS,
            Member::GivenState(_) => GIVEN_STATE_COMPONENTS,
            Member::ImportedField(m) => return m.components(),
        })
    }

    /// The part's material.
    pub fn material(&self) -> &Material {
        match self {
            Member::Beam(m) => &m.material,
            Member::Shaft(m) => &m.material,
            Member::ThinCylinder(m) => &m.material,
            Member::ThinSphere(m) => &m.material,
            Member::ThickCylinder(m) => &m.material,
            Member::PlateWithHole(m) => &m.material,
            Member::GivenState(m) => &m.material,
            Member::ImportedField(m) => &m.material,
        }
    }

    /// Mutable access to the material.
    pub fn material_mut(&mut self) -> &mut Material {
        match self {
            Member::Beam(m) => &mut m.material,
            Member::Shaft(m) => &mut m.material,
            Member::ThinCylinder(m) => &mut m.material,
            Member::ThinSphere(m) => &mut m.material,
            Member::ThickCylinder(m) => &mut m.material,
            Member::PlateWithHole(m) => &mut m.material,
            Member::GivenState(m) => &mut m.material,
            Member::ImportedField(m) => &mut m.material,
        }
    }

    /// Checks every dimension and property; the message names the value and the way out.
    pub fn validate(&self) -> Result<()> {
        match self {
            Member::Beam(m) => m.validate(),
            Member::Shaft(m) => m.validate(),
            Member::ThinCylinder(m) => m.validate(),
            Member::ThinSphere(m) => m.validate(),
            Member::ThickCylinder(m) => m.validate(),
            Member::PlateWithHole(m) => m.validate(),
            Member::GivenState(m) => m.validate(),
            Member::ImportedField(m) => m.validate(),
        }
    }

    /// Notes on where the model is near the edge of its validity (the model still runs).
    pub fn warnings(&self) -> Vec<String> {
        match self {
            Member::PlateWithHole(m) => m.warnings(),
            Member::ImportedField(m) => m.read_notes.clone(),
            _ => Vec::new(),
        }
    }

    /// The faces a gauge can be placed on.
    pub fn faces(&self) -> Vec<FaceExtent> {
        match self {
            Member::Beam(m) => m.faces(),
            Member::Shaft(m) => m.faces(),
            Member::ThinCylinder(m) => m.faces(),
            Member::ThinSphere(m) => m.faces(),
            Member::ThickCylinder(m) => m.faces(),
            Member::PlateWithHole(m) => m.faces(),
            Member::GivenState(m) => m.faces(),
            Member::ImportedField(m) => m.surface().map(|f| f.faces()).unwrap_or_default(),
        }
    }

    /// The point brought onto the part (s wrapped round), or an error saying why it is off.
    pub fn locate(&self, point: &SurfacePoint) -> Result<SurfacePoint> {
        if let Member::ImportedField(m) = self {
            m.loaded()?.locate(point)?;
            return Ok(*point);
        }
        let faces = self.faces();
        let Some(extent) = faces.iter().find(|f| f.face == point.face) else {
            let names: Vec<_> = faces.iter().map(|f| f.face.name()).collect();
            return Err(MechanicsError::PointOffPart {
                what: "the point",
                detail: format!(
                    "a {} has no {}; use one of: {}",
                    self.kind_name(),
                    point.face.name(),
                    names.join(", ")
                ),
            });
        };
        extent
            .locate(point)
            .map_err(|detail| MechanicsError::PointOffPart {
                what: "the point",
                detail,
            })
    }

    /// Checks a load vector before use: every value finite, and no non-zero load the model
    /// does not carry (it would otherwise be silently left out).
    pub fn check_loads(&self, loads: &LoadVector) -> Result<()> {
        if let Some((c, value)) = loads.first_non_finite() {
            return Err(MechanicsError::NotFinite {
                name: c.name(),
                value,
            });
        }
        let carried = self.components();
        let Some((c, _)) = loads.nonzero().find(|(c, _)| !carried.contains(c)) else {
            return Ok(());
        };
        let names: Vec<&str> = carried.iter().map(|c| c.name()).collect();
        let way_out = match (self, c) {
            (Member::Beam(_), LoadComponent::Torque) => format!(
                "torsion is modelled for round shafts only (the shaft model), not for beam \
                 sections; for another section enter the surface state from a separate analysis \
                 as a given state. A beam carries: {}",
                names.join(", ")
            ),
            _ => format!("use one of: {}", names.join(", ")),
        };
        Err(MechanicsError::LoadNotCarried {
            member: self.kind_name(),
            load: c.name(),
            way_out,
        })
    }

    /// Surface state at a point under a load vector. Linear in `loads`. A load the model does
    /// not carry is an error, not a zero.
    pub fn state(&self, point: &SurfacePoint, loads: &LoadVector) -> Result<SurfaceState> {
        self.check_loads(loads)?;
        let p = self.locate(point)?;
        Ok(self.state_unchecked(&p, loads))
    }

    /// Surface state at a point already located with [`Member::locate`], loads already checked.
    /// Used by the map and the grid quadrature, which check once for many points.
    pub fn state_unchecked(&self, p: &SurfacePoint, loads: &LoadVector) -> SurfaceState {
        let state = match self {
            Member::Beam(m) => m.state_at(p, loads),
            Member::Shaft(m) => m.state_at(p, loads),
            Member::ThinCylinder(m) => m.state_at(p, loads),
            Member::ThinSphere(m) => m.state_at(p, loads),
            Member::ThickCylinder(m) => m.state_at(p, loads),
            Member::PlateWithHole(m) => m.state_at(p, loads),
            Member::GivenState(m) => m.state_at(p, loads),
            Member::ImportedField(m) => m.surface().and_then(|f| {
                let at = f.locate(p).ok()?;
                Some(f.state_at(&at, loads, &m.material))
            }),
        };
        debug_assert!(
            state.is_some(),
            "located point must be on a face of the member"
        );
        state.unwrap_or_default()
    }

    /// Surface state per unit of one load component; an error for a component the member does
    /// not carry.
    pub fn state_per_unit(
        &self,
        point: &SurfacePoint,
        component: LoadComponent,
    ) -> Result<SurfaceState> {
        self.state(point, &LoadVector::unit(component))
    }

    /// The surface state per unit of every component this member carries.
    pub fn sensitivities(
        &self,
        point: &SurfacePoint,
    ) -> Result<Vec<(LoadComponent, SurfaceState)>> {
        self.components()
            .iter()
            .map(|&c| Ok((c, self.state_per_unit(point, c)?)))
            .collect()
    }

    /// The hoop stress of a thin-walled vessel under `loads` two ways, Pa: the membrane value
    /// at the mean radius (the design figure of the pressure-vessel rules) and the value on the
    /// outer surface, where the gauges sit and what they read. `None` for other parts.
    pub fn vessel_hoop_stresses(&self, loads: &LoadVector) -> Option<(f64, f64)> {
        let p = loads[LoadComponent::InternalPressure];
        match self {
            Member::ThinCylinder(c) => Some((
                c.stresses_per_pa().0 * p,
                c.outer_surface_stresses_per_pa().0 * p,
            )),
            Member::ThinSphere(s) => Some((
                s.stress_per_pa() * p,
                s.tangential_stress_per_pa(s.outer_diameter_m / 2.0) * p,
            )),
            _ => None,
        }
    }

    /// Von Mises stress at the bore of a pressure vessel (thick-wall solutions, the radial
    /// stress included), and the bore radius; `None` for parts without a pressurised bore. A
    /// free, uniform temperature change adds no stress.
    pub fn bore_von_mises(&self, loads: &LoadVector) -> Option<(f64, f64)> {
        let pi = loads[LoadComponent::InternalPressure];
        match self {
            Member::ThinCylinder(c) => {
                let s = c.bore_stresses_per_pa().map(|k| k * pi);
                Some((von_mises_3d(s), c.inner_radius_m()))
            }
            Member::ThickCylinder(c) => {
                let ri = c.inner_diameter_m / 2.0;
                let s = c.stresses_at(ri, pi, loads[LoadComponent::ExternalPressure]);
                Some((von_mises_3d([s.radial_pa, s.hoop_pa, s.axial_pa]), ri))
            }
            Member::ThinSphere(sp) => {
                let ri = sp.inner_radius_m();
                let t = sp.tangential_stress_per_pa(ri) * pi;
                Some((von_mises_3d([-pi, t, t]), ri))
            }
            _ => None,
        }
    }

    /// Largest von Mises stress in the part under `loads`, Pa, and where it occurs: sampled on
    /// an `n × n` grid of nodes (edges included) on every face, plus the points where the model
    /// says the stress can peak (a beam's load points, supports and moment extremes, the
    /// extreme fibres of a round section, a plate's hole edge) and
    /// the bore of a pressure vessel (where the stress is highest and no gauge can go).
    pub fn peak_von_mises(&self, loads: &LoadVector, n: usize) -> Result<(f64, PeakLocation)> {
        use crate::surface_map::{Sampling, StrainBasis, SurfaceQuantity, sample_face};
        let n = n.max(2);
        let material = self.material();
        if let Member::ImportedField(m) = self {
            let (vm, p) = m.loaded()?.peak_von_mises(loads, material).ok_or(
                MechanicsError::PointOffPart {
                    what: "every node",
                    detail: "the imported surface has no node with a finite stress".to_owned(),
                },
            )?;
            return Ok((vm, PeakLocation::Surface(p)));
        }
        let mut best: Option<(f64, PeakLocation)> = None;
        let mut consider = |vm: f64, p: PeakLocation| {
            if best.is_none_or(|(b, _)| vm > b) {
                best = Some((vm, p));
            }
        };
        for f in self.faces() {
            let map = sample_face(
                self,
                f.face,
                loads,
                (SurfaceQuantity::VonMisesStress, StrainBasis::Mechanical),
                (n, n),
                Sampling::NodesWithEdges,
            )?;
            for (j, s) in map.s_m.iter().enumerate() {
                for (i, x) in map.x_m.iter().enumerate() {
                    if let Some(vm) = map.values[j * map.x_m.len() + i] {
                        consider(vm, PeakLocation::Surface(SurfacePoint::new(f.face, *x, *s)));
                    }
                }
            }
            for p in crate::peak_points::critical_points(self, &f, loads, n) {
                let Ok(p) = f.locate(&p) else { continue };
                let vm = self.state_unchecked(&p, loads).von_mises_pa(material);
                if vm.is_finite() {
                    consider(vm, PeakLocation::Surface(p));
                }
            }
        }
        if let Some((vm, radius_m)) = self.bore_von_mises(loads) {
            consider(vm, PeakLocation::Bore { radius_m });
        }
        best.ok_or(MechanicsError::PointOffPart {
            what: "every sample point",
            detail: "the part has no gaugeable surface".to_owned(),
        })
    }
}
