//! A new user's whole path from a blank project to the bundled demo's first part, "Reaction
//! arm", with nothing but clicks and typing: File → New, the plan tree's Add menu, the
//! inspector, File → Save as…. The command line then evaluates the saved file and the demo,
//! and every figure of that part's bridges and load cases must agree.

mod support;

use std::path::Path;
use std::process::Command;

use gw_plan::{Part, Project};
use serde_json::Value;
use support::*;

/// A load case as the demo defines it, in the units the inspector shows (N, °C).
struct CaseEntry {
    name: &'static str,
    vertical_force_n: &'static str,
    axial_force_n: &'static str,
    temperature_change_c: Option<&'static str>,
    cycled: bool,
    proof_test: bool,
}

const RATED_PULL: CaseEntry = CaseEntry {
    name: "Rated pull",
    vertical_force_n: "6000",
    axial_force_n: "1500",
    temperature_change_c: None,
    cycled: true,
    proof_test: false,
};

const PROOF_PULL: CaseEntry = CaseEntry {
    name: "Proof pull",
    vertical_force_n: "9000",
    axial_force_n: "2200",
    temperature_change_c: Some("15"),
    cycled: false,
    proof_test: true,
};

/// A placed gauge: id, face and position in mm.
struct GaugeEntry {
    id: &'static str,
    face: &'static str,
    x_mm: &'static str,
    s_mm: &'static str,
}

const BENDING_GAUGES: [GaugeEntry; 4] = [
    GaugeEntry {
        id: "A1",
        face: "top face",
        x_mm: "50",
        s_mm: "-7.5",
    },
    GaugeEntry {
        id: "A2",
        face: "bottom face",
        x_mm: "50",
        s_mm: "-7.5",
    },
    GaugeEntry {
        id: "A3",
        face: "top face",
        x_mm: "50",
        s_mm: "7.5",
    },
    GaugeEntry {
        id: "A4",
        face: "bottom face",
        x_mm: "50",
        s_mm: "7.5",
    },
];

const SHEAR_GAUGES: [GaugeEntry; 2] = [
    GaugeEntry {
        id: "S1",
        face: "front face",
        x_mm: "250",
        s_mm: "0",
    },
    GaugeEntry {
        id: "S2",
        face: "back face",
        x_mm: "250",
        s_mm: "0",
    },
];

/// The name adding the first gauge gives the default single-grid type.
const SINGLE_GRID_TYPE: &str = "single grid, 3 mm, 350 Ω";
/// The name the demo gives its shear-pair type (typed here, so the files can be compared).
const SHEAR_PAIR_TYPE: &str = "±45° shear pair, 3 mm, 350 Ω";

/// What differs between the demo's two bridges on the reaction arm.
struct BridgeEntry {
    name: &'static str,
    arrangement: &'static str,
    arms: [&'static str; 4],
    wiring: &'static str,
    gain: &'static str,
    channel: &'static str,
    shunt_microstrain: &'static str,
    /// Required accuracy, % of reading ("" for none).
    accuracy_percent: &'static str,
}

const ARM_BENDING: BridgeEntry = BridgeEntry {
    name: "Arm bending",
    arrangement: "Bending, four grids on top and bottom",
    arms: ["A1 grid 1", "A2 grid 1", "A3 grid 1", "A4 grid 1"],
    wiring: "six-wire with remote sense",
    gain: "400",
    channel: "1",
    shunt_microstrain: "500",
    accuracy_percent: "2",
};

const ARM_SHEAR_WEB: BridgeEntry = BridgeEntry {
    name: "Arm shear web",
    arrangement: "Shear-web pairs, both sides",
    arms: ["S1 grid 2", "S1 grid 1", "S2 grid 1", "S2 grid 2"],
    wiring: "four-wire, no sense",
    gain: "1000",
    channel: "2",
    shunt_microstrain: "100",
    accuracy_percent: "",
};

/// File → New, and the dialog filled for the reaction arm: a 450 mm cantilever of solid
/// 30 × 60 mm rectangle in carbon steel, loaded at its free end.
fn start_blank_reaction_arm(h: &mut App) {
    menu(h, "File", "New");
    set_text(h, "Part name", "Reaction arm");
    choose(h, "Model", "beam");
    choose(h, "Support", "cantilever");
    choose(h, "Section", "solid rectangle");
    set_number(h, "Length", "450");
    set_number(h, "Section width", "30");
    set_number(h, "Section height", "60");
    set_number(h, "Load position", "450");
    choose(h, "Material", "Carbon steel, normalised");
    press(h, "Create");
    let project = &h.state().doc.project;
    assert_eq!(project.parts.len(), 1);
    assert!(project.gauge_stock.is_empty());
    assert_eq!(project.parts[0].name, "Reaction arm");
}

fn set_reference_temperature(h: &mut App, celsius: &str) {
    select(h, &format!("Project: {}", h.state().doc.project.name));
    set_number(h, "Reference temperature", celsius);
}

/// Fills the selected load case.
fn fill_load_case(h: &mut App, case: &CaseEntry) {
    set_text(h, "Name", case.name);
    set_number(h, "Vertical force", case.vertical_force_n);
    set_number(h, "Axial force", case.axial_force_n);
    if let Some(dt) = case.temperature_change_c {
        set_number(h, "Temperature change", dt);
    }
    set_number(h, "Temperature from", "-10");
    set_number(h, "Temperature to", "40");
    set_flag(h, "Cycled", case.cycled);
    set_flag(h, "Proof load or pressure test", case.proof_test);
}

/// Adds a gauge with the tree's Add menu and places it; `stock` picks its type when it is not
/// the first one.
fn add_gauge(h: &mut App, gauge: &GaugeEntry, stock: Option<&str>) {
    add(h, "Gauge");
    set_text(h, "Id", gauge.id);
    if let Some(stock) = stock {
        choose(h, "Gauge type", stock);
    }
    choose(h, "Face", gauge.face);
    set_number(h, "Along (x)", gauge.x_mm);
    set_number(h, "Across (s)", gauge.s_mm);
    set_number(h, "Angle", "0");
    let part = &h.state().doc.project.parts[0];
    assert!(
        part.gauges.iter().any(|g| g.id == gauge.id),
        "gauge {} was not added: {:#?}",
        gauge.id,
        part.gauges
    );
}

/// Adds a gauge type and makes it the demo's ±45° shear pair.
fn add_shear_pair_type(h: &mut App) {
    add(h, "Gauge type");
    choose(h, "Pattern", "±45° shear pair");
    set_text(h, "Name", SHEAR_PAIR_TYPE);
}

/// Adds a bridge with the tree's Add menu and sets every value the demo gives it.
fn add_bridge(h: &mut App, bridge: &BridgeEntry) {
    add(h, "Bridge");
    set_text(h, "Name", bridge.name);
    choose(h, "Measures", "Vertical force");
    set_number(h, "Channel", bridge.channel);
    for (k, arm) in bridge.arms.iter().enumerate() {
        choose(h, &format!("Arm {}", k + 1), arm);
    }
    // Choosing arms marks the arrangement "Custom"; the name is typed after them.
    set_text(h, "Arrangement", bridge.arrangement);
    choose(h, "Wiring", bridge.wiring);
    fill_leads_excitation_and_instrument(h);
    set_number(h, "Gain", bridge.gain);
    fill_shunt(h, bridge.shunt_microstrain);
    if !bridge.accuracy_percent.is_empty() {
        choose(h, "Required accuracy", "± % of reading");
        set_number(h, "Within ±", bridge.accuracy_percent);
    }
}

/// The settings both demo bridges share.
fn fill_leads_excitation_and_instrument(h: &mut App) {
    set_number(h, "Lead length", "12");
    set_number(h, "Lead resistance", "0.13");
    choose(h, "Excitation kind", "constant voltage");
    set_number(h, "Excitation", "3");
    set_number(h, "Instrument gauge factor", "2.05");
    set_number(h, "Input range", "10");
    set_number(h, "Converter bits", "24");
    set_number(h, "Noise density", "8");
    set_number(h, "Bandwidth", "100");
    set_number(h, "Excitation accuracy", "0.05");
    set_number(h, "Gain accuracy", "0.1");
    set_flag(h, "Amplifier input resistance stated", true);
    set_number(h, "Amplifier input", "10");
    choose(h, "Instrument temperature", "stays at the reference");
}

fn fill_shunt(h: &mut App, microstrain: &str) {
    set_flag(h, "Shunt calibration", true);
    choose(h, "Shunt across", "arm 1");
    set_number(h, "Shunt simulates", microstrain);
    choose(h, "Shunt connected", "at the instrument end");
}

/// `gaugewright eval FILE --json`, parsed.
fn evaluate_with_the_command_line(path: &Path) -> Value {
    let out = Command::new(env!("CARGO_BIN_EXE_gaugewright"))
        .arg("eval")
        .arg(path)
        .arg("--json")
        .output()
        .expect("the gaugewright binary runs");
    assert_ne!(
        out.status.code(),
        Some(2),
        "{} could not be evaluated: {}",
        path.display(),
        String::from_utf8_lossy(&out.stderr)
    );
    serde_json::from_slice(&out.stdout).expect("eval --json prints JSON")
}

/// Walks two JSON values together: numbers within 1e-9 relative (or 1e-15 absolute), every
/// other value equal. Returns how many numbers were compared.
fn assert_agree(path: &str, ours: &Value, demo: &Value) -> usize {
    match (ours, demo) {
        (Value::Number(a), Value::Number(b)) => {
            let (a, b) = (a.as_f64().unwrap(), b.as_f64().unwrap());
            let diff = (a - b).abs();
            assert!(
                diff <= 1e-15 || diff <= 1e-9 * a.abs().max(b.abs()),
                "{path}: ours {a}, demo {b}"
            );
            1
        }
        (Value::Array(a), Value::Array(b)) => {
            assert_eq!(a.len(), b.len(), "{path}: length");
            a.iter()
                .zip(b)
                .enumerate()
                .map(|(k, (x, y))| assert_agree(&format!("{path}[{k}]"), x, y))
                .sum()
        }
        (Value::Object(a), Value::Object(b)) => {
            let keys = |o: &serde_json::Map<String, Value>| o.keys().cloned().collect::<Vec<_>>();
            assert_eq!(keys(a), keys(b), "{path}: fields");
            a.iter()
                .map(|(k, x)| assert_agree(&format!("{path}.{k}"), x, &b[k]))
                .sum()
        }
        _ => {
            assert_eq!(ours, demo, "{path}");
            0
        }
    }
}

/// A part as JSON with each case's loads in a fixed order: the inspector adds a load to the
/// end of the list when it is first typed, after the load a new case starts with, and the
/// order of that list carries no meaning.
fn part_json(part: &Part) -> Value {
    let mut part = part.clone();
    for case in &mut part.load_cases {
        case.loads.sort_by_key(|(c, _)| format!("{c:?}"));
    }
    serde_json::to_value(&part).unwrap()
}

/// The saved document holds the demo's first part: the part itself, the data of every gauge
/// type it uses and the reference temperature.
fn assert_same_document(ours: &Project, demo: &Project) {
    assert_eq!(ours.reference_temperature_c, demo.reference_temperature_c);
    let numbers = assert_agree(
        "parts[0]",
        &part_json(&ours.parts[0]),
        &part_json(&demo.parts[0]),
    );
    assert!(numbers > 50, "only {numbers} numbers in the part");
    for gauge in &ours.parts[0].gauges {
        let (Some(a), Some(b)) = (
            ours.stock_entry(&gauge.stock),
            demo.stock_entry(&gauge.stock),
        ) else {
            panic!("gauge {} has no type \"{}\"", gauge.id, gauge.stock);
        };
        assert_agree(
            &format!("stock \"{}\"", gauge.stock),
            &serde_json::to_value(&a.spec).unwrap(),
            &serde_json::to_value(&b.spec).unwrap(),
        );
    }
}

/// The demo's arm without its rosette R1 and the three quarter bridges that read it: the
/// gauges and bridges this walk-through builds by hand are the others.
fn without_rosette(mut demo: Project) -> Project {
    for part in &mut demo.parts {
        part.gauges.retain(|g| g.id != "R1");
        part.bridges.retain(|b| !b.name.starts_with("Rosette R1"));
    }
    demo
}

/// Every figure the command line computes for the first part's bridges and load cases. The
/// project's name is left out: it is the one thing the two files do not share.
fn assert_same_evaluation(ours: &Value, demo: &Value) {
    let bridges = assert_agree(
        "parts[0].bridges",
        &ours["parts"][0]["bridges"],
        &demo["parts"][0]["bridges"],
    );
    assert_agree(
        "parts[0].cases",
        &ours["parts"][0]["cases"],
        &demo["parts"][0]["cases"],
    );
    assert!(bridges > 200, "only {bridges} numbers in the bridges");
}

#[test]
fn a_new_user_builds_the_demo_reaction_arm_from_a_blank_project_with_the_same_results() {
    let mut h = app_on(gw_plan::demo::demo_project());
    start_blank_reaction_arm(&mut h);
    set_reference_temperature(&mut h, "20");

    select(&mut h, "Load case 1");
    fill_load_case(&mut h, &RATED_PULL);
    add(&mut h, "Load case");
    fill_load_case(&mut h, &PROOF_PULL);

    for gauge in &BENDING_GAUGES {
        add_gauge(&mut h, gauge, None);
    }
    // Adding the first gauge put the default single-grid type in the stock.
    assert_eq!(h.state().doc.project.gauge_stock[0].name, SINGLE_GRID_TYPE);
    add_shear_pair_type(&mut h);
    for gauge in &SHEAR_GAUGES {
        add_gauge(&mut h, gauge, Some(SHEAR_PAIR_TYPE));
    }

    add_bridge(&mut h, &ARM_BENDING);
    add_bridge(&mut h, &ARM_SHEAR_WEB);

    let dir = temp_dir("author-from-blank");
    let saved = dir.join("reaction_arm.ron");
    save_as(&mut h, &saved);
    assert!(!h.state().doc.dirty, "{:?}", h.state().doc.notice);
    let ours = gw_plan::load_project(&saved).unwrap();
    let demo = without_rosette(gw_plan::demo::demo_project());
    assert_same_document(&ours, &demo);

    let demo_path = dir.join("demo.ron");
    let written = Command::new(env!("CARGO_BIN_EXE_gaugewright"))
        .arg("demo")
        .arg(&demo_path)
        .status()
        .unwrap();
    assert!(written.success());
    let written = without_rosette(gw_plan::load_project(&demo_path).unwrap());
    gw_plan::save_project(&written, &demo_path).unwrap();
    assert_same_evaluation(
        &evaluate_with_the_command_line(&saved),
        &evaluate_with_the_command_line(&demo_path),
    );
}
