//! Every field of the project file has an editor in the inspector: the test walks the document
//! as the file stores it (every model kind, section, option and variant present) and looks for
//! a field description that covers each stored value.

use std::collections::BTreeSet;

use gw_app::panels::item_fields::{
    bridge_groups, gauge_groups, load_case_groups, part_groups, project_groups, stock_groups,
};
use gw_bridge::{Excitation, ShuntLocation, ShuntPlan};
use gw_mechanics::{GivenQuantity, Section};
use gw_plan::blank::{ModelKind, default_material, new_part};
use gw_plan::document::{BridgeFactorOverride, GaugeLot, RequiredAccuracy};
use gw_plan::{Part, Project};

/// Stored values written by the program itself, not by the engineer.
const EXCEPTIONS: &[&str] = &["format_version"];

/// Lists whose entries the plan tree adds, copies, deletes and reorders (an empty list is
/// stored as one value).
const TREE_LISTS: &[(&str, &str)] = &[
    ("project", "gauge_stock"),
    ("project", "parts"),
    ("part", "load_cases"),
    ("part", "gauges"),
    ("part", "bridges"),
];

/// A project holding every variant the file can store.
fn everything() -> Project {
    let mut p = gw_plan::demo::demo_project();
    let steel = default_material();
    for kind in ModelKind::ALL {
        p.parts
            .push(new_part(kind.name(), kind.default_member(&steel), None));
    }
    let sections = [
        Section::SolidRound { diameter_m: 0.04 },
        Section::RoundTube {
            outer_diameter_m: 0.04,
            inner_diameter_m: 0.03,
        },
        Section::RectangularTube {
            width_m: 0.04,
            height_m: 0.06,
            wall_m: 0.004,
        },
        Section::IBeam {
            flange_width_m: 0.08,
            depth_m: 0.12,
            flange_thickness_m: 0.01,
            web_thickness_m: 0.006,
        },
    ];
    for section in sections {
        let mut part = p.parts[0].clone();
        if let gw_mechanics::Member::Beam(b) = &mut part.member {
            b.section = section;
        }
        part.gauges.clear();
        part.bridges.clear();
        p.parts.push(part);
    }
    let mut stress = new_part("stress", ModelKind::GivenState.default_member(&steel), None);
    if let gw_mechanics::Member::GivenState(g) = &mut stress.member {
        g.quantity = GivenQuantity::Stress {
            normal_x_pa: 1e6,
            normal_y_pa: 0.0,
            shear_xy_pa: 0.0,
        };
    }
    p.parts.push(stress);
    p.parts.push(imported_part());
    let gauge = &mut p.parts[0].gauges[0];
    let mut lot = GaugeLot::from_spec(&p.gauge_stock[0].spec);
    lot.lot_number = "L-1".into();
    lot.thermal_output.reference_gauge_factor = Some(2.0);
    lot.thermal_output.valid_range_c = Some((-20.0, 100.0));
    gauge.lot = Some(lot);
    p.gauge_stock[0].spec.thermal_output.reference_gauge_factor = Some(2.0);
    p.gauge_stock[0].spec.thermal_output.valid_range_c = Some((-20.0, 100.0));
    let b = &mut p.parts[0].bridges[1];
    b.bridge_factor_override = Some(BridgeFactorOverride {
        value: 4.0,
        reason: "checked against a calibration".into(),
    });
    b.excitation = Excitation::Current { amps: 0.005 };
    b.required_accuracy = Some(RequiredAccuracy::InMeasuredUnit(50.0));
    b.shunt = Some(ShuntPlan {
        arm: 1,
        target_strain: 1e-4,
        location: ShuntLocation::GaugeEnd,
    });
    p.parts[1].material_key = None;
    p.parts[0].bridges[0].required_accuracy = Some(RequiredAccuracy::PercentOfReading(1.0));
    p
}

/// A part from imported results (a one-element block read in memory, every optional value of
/// its result list present).
fn imported_part() -> Part {
    use gw_mechanics::imported::*;
    let points_m: Vec<[f64; 3]> = (0..8)
        .map(|c| {
            [
                f64::from(c & 1) * 0.1,
                f64::from(c >> 1 & 1) * 0.05,
                f64::from(c >> 2) * 0.02,
            ]
        })
        .collect();
    let mesh = RawMesh {
        points_m,
        cells: vec![Cell {
            kind: CellKind::Hexa,
            nodes: vec![0, 1, 3, 2, 4, 5, 7, 6],
        }],
    };
    let field = SurfaceField::new(
        &mesh,
        vec![UnitField {
            component: gw_mechanics::LoadComponent::VerticalForce,
            quantity: TensorQuantity::Strain,
            values: vec![[1e-6, 0.0, 0.0, 0.0, 0.0, 0.0]; 8],
        }],
        ReferenceAxis::X,
    )
    .unwrap();
    let surface = ImportedSurface {
        material: default_material(),
        reference_axis: ReferenceAxis::X,
        loads: vec![ImportedLoad {
            component: gw_mechanics::LoadComponent::VerticalForce,
            name: "pull".into(),
            file: "block.vtu".into(),
            array: Some("strain".into()),
            units: Some(FieldUnits {
                length: LengthUnit::Metre,
                tensor: TensorUnit::StrainRatio,
                shear: ShearConvention::Tensor,
            }),
            checksum: Some("sha256:00".into()),
        }],
        mesh_file: Some("block_cells.csv".into()),
        field: FieldState::Loaded(std::sync::Arc::new(field)),
        read_notes: Vec::new(),
    };
    new_part(
        "imported",
        gw_mechanics::Member::ImportedField(surface),
        None,
    )
}

/// Paths of every stored value: names joined by dots, "[]" for list elements.
fn leaves(v: &serde_json::Value, here: String, out: &mut BTreeSet<String>) {
    match v {
        serde_json::Value::Object(map) if !map.is_empty() => {
            for (k, child) in map {
                let next = if here.is_empty() {
                    k.clone()
                } else {
                    format!("{here}.{k}")
                };
                leaves(child, next, out);
            }
        }
        serde_json::Value::Array(items) if !items.is_empty() => {
            for child in items {
                leaves(child, format!("{here}[]"), out);
            }
        }
        _ => {
            out.insert(here);
        }
    }
}

/// Which kind of item a stored path belongs to, and the path inside it.
fn split(path: &str) -> (&'static str, &str) {
    for (prefix, kind) in [
        ("parts[].load_cases[].", "load case"),
        ("parts[].gauges[].", "gauge"),
        ("parts[].bridges[].", "bridge"),
        ("parts[].", "part"),
        ("gauge_stock[].", "stock"),
    ] {
        if let Some(rest) = path.strip_prefix(prefix) {
            return (kind, rest);
        }
    }
    ("project", path)
}

/// Whether a field path covers a stored path: its names lead the stored ones ("*" matches any
/// name, "|" separates alternatives).
fn covers(field: &str, stored: &str) -> bool {
    let stored: Vec<&str> = stored
        .split('.')
        .map(|s| s.trim_end_matches("[]"))
        .collect();
    field.split('|').any(|one| {
        // "X.(present)" edits whether the optional X is there: it covers an absent X.
        if let Some(option) = one.strip_suffix(".(present)")
            && stored.join(".") == option
        {
            return true;
        }
        let names: Vec<&str> = one.split('.').collect();
        names.len() <= stored.len() && names.iter().zip(&stored).all(|(f, s)| *f == "*" || f == s)
    })
}

fn paths_of<T>(
    groups: Vec<gw_app::panels::fields::Group<T>>,
    out: &mut Vec<(&'static str, String)>,
    kind: &'static str,
) {
    for g in groups {
        for f in g.fields {
            out.push((kind, f.path.to_owned()));
        }
    }
}

fn editor_paths(p: &Project) -> Vec<(&'static str, String)> {
    let mut out: Vec<(&'static str, String)> = TREE_LISTS
        .iter()
        .map(|(k, p)| (*k, (*p).to_owned()))
        .collect();
    paths_of(project_groups(), &mut out, "project");
    paths_of(stock_groups(), &mut out, "stock");
    for part in &p.parts {
        paths_of(part_groups(part), &mut out, "part");
        paths_of(load_case_groups(&part.member), &mut out, "load case");
        for g in &part.gauges {
            paths_of(gauge_groups(p, part, g), &mut out, "gauge");
        }
        for b in &part.bridges {
            paths_of(bridge_groups(p, part, b), &mut out, "bridge");
        }
    }
    out
}

#[test]
fn every_stored_value_of_the_project_has_an_editor() {
    let p = everything();
    gw_plan::validate::validate_project(&p).unwrap();
    let mut stored = BTreeSet::new();
    leaves(
        &serde_json::to_value(&p).unwrap(),
        String::new(),
        &mut stored,
    );
    assert!(
        stored.len() > 100,
        "the walk found only {} values",
        stored.len()
    );
    let editors = editor_paths(&p);
    let missing: Vec<&String> = stored
        .iter()
        .filter(|s| !EXCEPTIONS.contains(&s.as_str()))
        .filter(|s| {
            let (kind, rest) = split(s);
            !editors.iter().any(|(k, f)| *k == kind && covers(f, rest))
        })
        .collect();
    assert!(
        missing.is_empty(),
        "stored values without an editor: {missing:#?}"
    );
}

#[test]
fn the_walk_notices_a_value_without_an_editor() {
    // The check itself can fail: a stored path no field covers is reported.
    let editors = editor_paths(&everything());
    let (kind, rest) = split("parts[].member.Beam.a_new_dimension_m");
    assert!(!editors.iter().any(|(k, f)| *k == kind && covers(f, rest)));
    let _ = Part::clone;
}
