//! The example plan on imported finite-element results: an invented steel L-bracket (an
//! upright plate bolted at its base, an arm at its top loaded at its end), whose unit-load
//! results ship in `assets/bracket_fe/`. Every name and number is invented.

use std::path::Path;

use gw_bridge::{GaugePattern, LeadWiring};
use gw_mechanics::imported::{
    FieldState, FieldUnits, ImportedLoad, ImportedSurface, LengthUnit, ReferenceAxis,
    ShearConvention, TensorUnit,
};
use gw_mechanics::{LoadComponent, Member, SurfacePoint};

use crate::blank::new_part;
use crate::demo::{bridge, case, completion, grid, material, shunt, stock};
use crate::document::{PlanGauge, Project, RequiredAccuracy, default_gauge_spec, stock_base_name};
use crate::imported_part::attach;

/// The result files (next to the plan) and the load each is per unit of.
const RESULTS: [(&str, LoadComponent, &str); 3] = [
    (
        "bracket_down.vtu",
        LoadComponent::VerticalForce,
        "load on the arm's end, downward",
    ),
    (
        "bracket_side.vtu",
        LoadComponent::LateralForce,
        "push on the arm's end, sideways (+Y)",
    ),
    (
        "bracket_pull.vtu",
        LoadComponent::AxialForce,
        "pull on the arm's end, along the arm (+X)",
    ),
];

/// A gauge of the stock's default type in `pattern` at the surface point nearest `at` (model
/// axes, metres).
fn gauge_at(
    surface: &ImportedSurface,
    id: &str,
    pattern: GaugePattern,
    at: [f64; 3],
    angle_deg: f64,
) -> Option<PlanGauge> {
    let position: SurfacePoint = surface.surface()?.point_at(at, 1e-6)?;
    Some(PlanGauge {
        id: id.into(),
        stock: stock_base_name(&default_gauge_spec(pattern)),
        lot: None,
        position,
        angle_rad: angle_deg.to_radians(),
    })
}

/// The bracket's part, its results read from `folder`; `None` when they cannot be read.
fn bracket_part(folder: &Path) -> Option<crate::document::Part> {
    let mut surface = ImportedSurface {
        material: material("carbon_steel"),
        reference_axis: ReferenceAxis::Z,
        loads: RESULTS
            .iter()
            .map(|&(file, component, name)| ImportedLoad {
                component,
                name: name.into(),
                file: file.into(),
                array: None,
                units: Some(FieldUnits {
                    length: LengthUnit::Metre,
                    tensor: TensorUnit::StrainRatio,
                    shear: ShearConvention::Tensor,
                }),
                checksum: crate::import::file_checksum(&folder.join(file)).ok(),
            })
            .collect(),
        mesh_file: None,
        field: FieldState::NotLoaded,
        read_notes: Vec::new(),
    };
    attach(&mut surface, Some(folder));
    // On the upright's faces x runs up (the reference axis Z); on the arm's top face, which
    // Z stands square to, x runs along the arm (global X).
    let gauges = vec![
        gauge_at(
            &surface,
            "U1",
            GaugePattern::SingleGrid,
            [-0.006, 0.0, 0.04],
            0.0,
        )?,
        gauge_at(
            &surface,
            "U2",
            GaugePattern::SingleGrid,
            [0.006, 0.0, 0.04],
            0.0,
        )?,
        gauge_at(
            &surface,
            "R1",
            GaugePattern::RectangularRosette,
            [0.05, 0.0, 0.12],
            0.0,
        )?,
    ];
    let mut part = new_part(
        "L-bracket",
        Member::ImportedField(surface),
        Some("carbon_steel".into()),
    );
    part.gauges = gauges;
    part.load_cases = load_cases();
    part.bridges = bridges();
    Some(part)
}

/// The example's load cases: the rated and proof loads down on the arm's end, a side push.
fn load_cases() -> Vec<crate::document::LoadCase> {
    use LoadComponent::*;
    vec![
        case(
            "Rated load",
            &[(VerticalForce, 2000.0)],
            (10.0, 40.0),
            true,
            false,
        ),
        case(
            "Side push",
            &[(LateralForce, 400.0)],
            (10.0, 40.0),
            false,
            false,
        ),
        case(
            "Proof load",
            &[(VerticalForce, 3000.0)],
            (15.0, 25.0),
            false,
            true,
        ),
    ]
}

/// A half bridge across the upright (its outer and inner faces) and one rosette grid on the arm.
fn bridges() -> Vec<crate::document::BridgePlan> {
    use LoadComponent::*;
    let mut upright = bridge(
        "Upright bending",
        "Half bridge: the upright's outer and inner faces in adjacent arms",
        [grid("U1", 1), grid("U2", 1), completion(), completion()],
        VerticalForce,
        LeadWiring::ThreeWire,
        8.0,
        1000.0,
        1,
        shunt(0, 500.0),
    );
    upright.required_accuracy = Some(RequiredAccuracy::PercentOfReading(3.0));
    let rosette = bridge(
        "Arm rosette, grid 1",
        "One rosette grid, three-wire",
        [grid("R1", 1), completion(), completion(), completion()],
        VerticalForce,
        LeadWiring::ThreeWire,
        8.0,
        1000.0,
        2,
        shunt(0, 500.0),
    );
    vec![upright, rosette]
}

/// The example plan, its results read from `folder` (where they ship: `assets/bracket_fe/`);
/// `None` when they cannot be read.
pub fn bracket_project(folder: &Path) -> Option<Project> {
    let part = bracket_part(folder)?;
    let mut p = crate::demo::demo_project();
    p.name = "L-bracket on finite-element results (example)".into();
    p.notes = "Invented example: a steel L-bracket whose surface strains come from a \
               finite-element solution, one result file per unit load."
        .into();
    p.gauge_stock = stock();
    p.parts = vec![part];
    p.records = Default::default();
    Some(p)
}
