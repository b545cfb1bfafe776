//! One unit switch converts the inspector: with US customary units chosen from the Units menu,
//! a gauge, a load case, a bridge and a part show inches, °F, ppm/°F and W/in², never mm, °C
//! or ppm/°C; and a temperature range typed in °F is stored in °C.

mod support;

use egui::accesskit::Role;
use egui_kittest::kittest::{NodeT, Queryable};
use gw_app::units::Units;
use support::{App, app_on, menu, select, set_number};

/// The demo in US customary units.
fn demo_in_us() -> App {
    let mut h = app_on(gw_plan::demo::demo_project());
    menu(&mut h, "Units", "US customary (in, lbf, psi, °F)");
    assert_eq!(h.state().doc.units, Units::UsCustomary);
    h
}

/// Every label and value shown in the inspector.
fn inspector_texts(h: &App) -> Vec<String> {
    let inspector = h.get_by_role_and_label(Role::GenericContainer, "Inspector");
    inspector
        .children_recursive()
        .flat_map(|n| {
            let a = n.accesskit_node();
            [a.label(), a.value()]
        })
        .flatten()
        .filter(|t| !t.is_empty())
        .collect()
}

/// The shown value of the number field labelled `label`.
fn number_value(h: &App, label: &str) -> String {
    let inspector = h.get_by_role_and_label(Role::GenericContainer, "Inspector");
    let field = inspector.get_by_role_and_label(Role::SpinButton, label);
    field.accesskit_node().value().unwrap_or_default()
}

/// The name the demo gives its gauge type: a name the engineer wrote, not a measurement.
const STOCK_NAME: &str = "single grid, 3 mm, 350 Ω";

/// SI units that must not appear, as whole words (the thermal-output coefficients are a
/// polynomial in °C and say so: those labels are allowed; so is the gauge type's name).
fn si_leftovers(texts: &[String]) -> Vec<String> {
    texts
        .iter()
        .filter(|t| !t.contains(STOCK_NAME))
        .filter(|t| !t.contains("T in °C") && !t.contains("per °C") && !t.contains("µε/°C"))
        .filter(|t| {
            t.split(|c: char| c.is_whitespace() || c == ',' || c == '(' || c == ')')
                .any(|w| matches!(w, "mm" | "°C" | "ppm/°C" | "kW/m²" | "m" | "MPa" | "GPa"))
        })
        .cloned()
        .collect()
}

#[test]
fn gauge_load_case_bridge_and_part_show_us_units_only() {
    let mut h = demo_in_us();
    let rows: [(&str, &[&str]); 4] = [
        ("Gauge A1 (single grid)", &["in"]),
        ("Rated pull", &["°F"]),
        ("Bridge Arm bending", &["ft"]),
        ("Reaction arm — beam", &["in", "Mpsi", "ppm/°F"]),
    ];
    for (row, wanted) in rows {
        select(&mut h, row);
        let texts = inspector_texts(&h);
        for unit in wanted {
            assert!(
                texts.iter().any(|t| t.ends_with(&format!(" {unit}"))),
                "{row}: a field in {unit}; inspector shows {texts:?}"
            );
        }
        let left = si_leftovers(&texts);
        assert!(
            left.is_empty(),
            "{row}: SI units left in US customary: {left:?}"
        );
    }
}

#[test]
fn stock_gauge_shows_ppm_per_f_and_w_per_square_inch() {
    let mut h = demo_in_us();
    select(&mut h, STOCK_NAME);
    let texts = inspector_texts(&h);
    for unit in ["ppm/°F", "W/in²"] {
        assert!(
            texts.iter().any(|t| t.ends_with(&format!(" {unit}"))),
            "stock gauge: a field in {unit}; inspector shows {texts:?}"
        );
    }
    let left = si_leftovers(&texts);
    assert!(left.is_empty(), "stock gauge: SI units left: {left:?}");
}

#[test]
fn a_range_typed_in_fahrenheit_is_stored_in_celsius() {
    let mut h = demo_in_us();
    select(&mut h, "Rated pull");
    set_number(&mut h, "Temperature from", "14");
    set_number(&mut h, "Temperature to", "104");
    let (low, high) = h.state().doc.project.parts[0].load_cases[0].temperature_range_c;
    // NIST SP 811 B.9: t/°C = (t/°F − 32)/1.8, so 14 °F is −10 °C and 104 °F is 40 °C.
    assert!((low - -10.0).abs() < 1e-9, "stored low end {low} °C");
    assert!((high - 40.0).abs() < 1e-9, "stored high end {high} °C");
    assert_eq!(number_value(&h, "Temperature from"), "14.0 °F");
    assert_eq!(number_value(&h, "Temperature to"), "104.0 °F");
    // Back in SI the same values read in °C.
    menu(&mut h, "Units", "SI (mm, N, MPa, °C)");
    assert_eq!(number_value(&h, "Temperature from"), "-10.0 °C");
    assert_eq!(number_value(&h, "Temperature to"), "40.0 °C");
}
