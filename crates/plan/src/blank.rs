//! A new, blank project with its first part, and the default member of each model kind.

use gw_bridge::bridge_uncertainty::InstallationTolerances;
use gw_mechanics::{
    Beam, BeamSupport, GivenQuantity, GivenState, LoadComponent, LoadPoint, Material, Member,
    PlateWithHole, Section, Shaft, SurfaceStrain, ThickCylinder, ThinCylinder, ThinSphere,
    VesselEnds,
};

use crate::document::{FORMAT_VERSION, LeadColours, LoadCase, PaperSize, Part, Project};

/// The kinds of model a part can have, in the order the app offers them.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ModelKind {
    /// Prismatic beam or bar.
    Beam,
    /// Round shaft.
    Shaft,
    /// Thin-walled cylindrical vessel.
    ThinCylinder,
    /// Thin-walled sphere.
    ThinSphere,
    /// Thick-walled cylinder.
    ThickCylinder,
    /// Plate with a circular hole.
    PlateWithHole,
    /// A uniform state entered by the engineer.
    GivenState,
    /// Imported finite-element results (made by importing them, not from defaults).
    ImportedField,
}

impl ModelKind {
    /// Every kind.
    pub const ALL: [ModelKind; 7] = [
        ModelKind::Beam,
        ModelKind::Shaft,
        ModelKind::ThinCylinder,
        ModelKind::ThinSphere,
        ModelKind::ThickCylinder,
        ModelKind::PlateWithHole,
        ModelKind::GivenState,
    ];

    /// The kind of a member.
    pub fn of(member: &Member) -> ModelKind {
        match member {
            Member::Beam(_) => ModelKind::Beam,
            Member::Shaft(_) => ModelKind::Shaft,
            Member::ThinCylinder(_) => ModelKind::ThinCylinder,
            Member::ThinSphere(_) => ModelKind::ThinSphere,
            Member::ThickCylinder(_) => ModelKind::ThickCylinder,
            Member::PlateWithHole(_) => ModelKind::PlateWithHole,
            Member::GivenState(_) => ModelKind::GivenState,
            Member::ImportedField(_) => ModelKind::ImportedField,
        }
    }

    /// Plain name.
    pub fn name(self) -> &'static str {
        self.default_member(&default_material()).kind_name()
    }

    /// A member of this kind with sizes of a typical small part, in `material`.
    pub fn default_member(self, material: &Material) -> Member {
        let material = material.clone();
        match self {
            ModelKind::Beam => Member::Beam(Beam {
                section: Section::Rectangle {
                    width_m: 0.03,
                    height_m: 0.05,
                },
                material,
                length_m: 0.5,
                support: BeamSupport::Cantilever,
                load_points: vec![LoadPoint::whole(0.5)],
            }),
            ModelKind::Shaft => Member::Shaft(Shaft {
                outer_diameter_m: 0.05,
                inner_diameter_m: 0.0,
                length_m: 0.5,
                material,
            }),
            ModelKind::ThinCylinder => Member::ThinCylinder(ThinCylinder {
                outer_diameter_m: 0.3,
                wall_m: 0.008,
                length_m: 0.8,
                ends: VesselEnds::Closed,
                material,
            }),
            ModelKind::ThinSphere => Member::ThinSphere(ThinSphere {
                outer_diameter_m: 0.5,
                wall_m: 0.01,
                material,
            }),
            ModelKind::ThickCylinder => Member::ThickCylinder(ThickCylinder {
                outer_diameter_m: 0.1,
                inner_diameter_m: 0.05,
                length_m: 0.3,
                ends: VesselEnds::Closed,
                material,
            }),
            ModelKind::PlateWithHole => Member::PlateWithHole(PlateWithHole {
                hole_diameter_m: 0.02,
                width_m: 0.2,
                height_m: 0.2,
                thickness_m: 0.01,
                material,
            }),
            ModelKind::GivenState => Member::GivenState(GivenState {
                quantity: GivenQuantity::Strain(SurfaceStrain::new(500e-6, -150e-6, 0.0)),
                length_m: 0.05,
                width_m: 0.05,
                material,
            }),
            ModelKind::ImportedField => {
                Member::ImportedField(gw_mechanics::imported::ImportedSurface {
                    material,
                    reference_axis: Default::default(),
                    loads: Vec::new(),
                    mesh_file: None,
                    field: Default::default(),
                    read_notes: Vec::new(),
                })
            }
        }
    }
}

/// Carbon steel from the library (the usual starting point).
pub fn default_material() -> Material {
    gw_mechanics::MATERIAL_LIBRARY
        .first()
        .map(|m| m.material())
        .unwrap_or(Material {
            name: "Steel".into(),
            youngs_modulus_pa: 200e9,
            poisson_ratio: 0.29,
            cte_per_c: 11.7e-6,
            yield_strength_pa: 250e6,
        })
}

/// A first load case for a member: its first mechanical component at a modest value.
pub fn first_load_case(member: &Member) -> LoadCase {
    // The load such a part is usually planned for first.
    let preferred = [
        LoadComponent::VerticalForce,
        LoadComponent::Torque,
        LoadComponent::InternalPressure,
        LoadComponent::RemoteStressX,
        LoadComponent::GivenStateFactor,
    ];
    let carried = member.components();
    let component = preferred
        .into_iter()
        .find(|c| carried.contains(c))
        .or_else(|| {
            carried
                .iter()
                .copied()
                .find(|&c| c != LoadComponent::TemperatureChange)
        })
        .unwrap_or(LoadComponent::TemperatureChange);
    let value = match component {
        LoadComponent::AxialForce | LoadComponent::VerticalForce => 1000.0,
        LoadComponent::Torque => 100.0,
        LoadComponent::InternalPressure | LoadComponent::ExternalPressure => 1e6,
        LoadComponent::RemoteStressX | LoadComponent::RemoteStressY => 50e6,
        LoadComponent::GivenStateFactor => 1.0,
        _ => 1.0,
    };
    LoadCase {
        name: "Load case 1".into(),
        loads: vec![(component, value)],
        ramp_steps: 10,
        temperature_range_c: (-10.0, 40.0),
        cycled: false,
        proof_test: false,
    }
}

/// A part with no gauges and no bridges.
pub fn new_part(name: &str, member: Member, material_key: Option<String>) -> Part {
    let case = first_load_case(&member);
    Part {
        name: name.to_owned(),
        member,
        material_key,
        load_cases: vec![case],
        gauges: Vec::new(),
        bridges: Vec::new(),
        required_resolution_strain: 1e-6,
        tolerances: InstallationTolerances::default(),
        datum_m: (0.0, 0.0),
    }
}

/// A new project holding `first` as its only part, with an empty gauge stock.
pub fn blank_project(first: Part) -> Project {
    Project {
        format_version: FORMAT_VERSION,
        name: "New project".into(),
        revision: "A".into(),
        date: String::new(),
        prepared_by: String::new(),
        checked_by: String::new(),
        paper: PaperSize::A4,
        reference_temperature_c: 20.0,
        warn_utilisation: gw_bridge::margins::DEFAULT_WARN_UTILISATION,
        zero_band_fraction: gw_bridge::zero_band::DEFAULT_ZERO_BAND_FRACTION,
        marking_templates: true,
        lead_colours: LeadColours::default(),
        gauge_stock: Vec::new(),
        parts: vec![first],
        notes: String::new(),
        records: Default::default(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_default_member_is_valid_and_a_blank_project_validates() {
        for kind in ModelKind::ALL {
            let m = kind.default_member(&default_material());
            m.validate()
                .unwrap_or_else(|e| panic!("{}: {e}", kind.name()));
            assert_eq!(ModelKind::of(&m), kind);
            let p = blank_project(new_part("Part", m, None));
            crate::validate::validate_project(&p).unwrap();
        }
    }
}
