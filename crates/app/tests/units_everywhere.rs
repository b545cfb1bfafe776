//! One unit switch converts the inspector: with US customary units chosen from the Units menu,
//! a gauge, a load case, a bridge and a part show inches, °F, ppm/°F and W/in², never mm, °C
//! or ppm/°C; and a temperature range typed in °F is stored in °C. A lead's resistance reads
//! per foot; angles, gauge factors and other fixed-unit numbers carry no noise digits; the
//! face view's readout and the map legend follow the switch too.

mod support;

use egui::accesskit::Role;
use egui_kittest::kittest::{NodeT, Queryable};
use gw_app::units::Units;
use support::{App, Look, app_on, control, menu, select, set_number};

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

/// Exact by definition (NIST SP 811, 2008, Appendix B): 1 ft = 0.3048 m, 1 in = 0.0254 m.
const FOOT_M: f64 = 0.3048;
const INCH_M: f64 = 0.0254;

/// The number and the unit of a field's text: "0.0396 Ω/ft" → (0.0396, "Ω/ft").
fn number_and_unit(text: &str) -> (f64, String) {
    let (number, unit) = text.split_once(' ').unwrap_or((text, ""));
    let value = number
        .parse::<f64>()
        .unwrap_or_else(|_| panic!("\"{text}\" does not start with a number"));
    (value, unit.to_owned())
}

/// Decimal places written in a number's text.
fn places(text: &str) -> usize {
    let number = text.split(' ').next().unwrap_or_default();
    number.split_once('.').map_or(0, |(_, d)| d.len())
}

#[test]
fn lead_resistance_reads_per_foot_and_a_typed_value_is_stored_per_metre() {
    let mut h = demo_in_us();
    select(&mut h, "Bridge Arm bending");
    // The demo's leads: 0.13 Ω/m, 12 m.
    let text = number_value(&h, "Lead resistance");
    let (shown, unit) = number_and_unit(&text);
    assert_eq!(unit, "Ω/ft", "{text}");
    // 0.13 Ω/m × 0.3048 m/ft = 0.039 624 Ω/ft, shown to three significant digits.
    assert!((shown - 0.13 * FOOT_M).abs() <= 0.000_05, "{text}");
    assert_eq!(text, "0.0396 Ω/ft");
    let (length, unit) = number_and_unit(&number_value(&h, "Lead length"));
    assert_eq!(unit, "ft");
    // 12 m / 0.3048 m/ft = 39.37 ft, shown to a tenth.
    assert!((length - 12.0 / FOOT_M).abs() <= 0.05, "{length} ft");

    set_number(&mut h, "Lead resistance", "0.05");
    let stored = h.state().doc.project.parts[0].bridges[0].lead.ohm_per_m;
    // 0.05 Ω/ft / 0.3048 m/ft = 0.164 04 Ω/m.
    assert!(
        (stored - 0.05 / FOOT_M).abs() < 1e-12,
        "stored {stored} Ω/m"
    );
    assert_eq!(number_value(&h, "Lead resistance"), "0.05 Ω/ft");
    menu(&mut h, "Units", "SI (mm, N, MPa, °C)");
    assert_eq!(number_value(&h, "Lead resistance"), "0.164 Ω/m");
}

#[test]
fn angles_and_gauge_factors_show_no_noise_digits() {
    let mut h = demo_in_us();
    select(&mut h, "Gauge A1 (single grid)");
    // The demo's A1 lies along the axis, 50 mm from the end: 50 / 25.4 = 1.9685 in.
    assert_eq!(number_value(&h, "Angle"), "0 °");
    let (x, unit) = number_and_unit(&number_value(&h, "Along (x)"));
    assert_eq!(unit, "in");
    assert!((x - 0.05 / INCH_M).abs() <= 0.0005, "{x} in");
    // Typed as a whole angle, read back as one.
    set_number(&mut h, "Angle", "45");
    let angle = h.state().doc.project.parts[0].gauges[0].angle_rad;
    assert!((angle - std::f64::consts::FRAC_PI_4).abs() < 1e-12);
    assert_eq!(number_value(&h, "Angle"), "45 °");

    select(&mut h, "Bridge Arm bending");
    // The demo sets the instrument to the gauges' factor, 2.05.
    assert_eq!(number_value(&h, "Instrument gauge factor"), "2.05");
    assert_eq!(number_value(&h, "Gain"), "400");
    assert_eq!(number_value(&h, "Excitation"), "3 V");

    select(&mut h, STOCK_NAME);
    assert_eq!(number_value(&h, "Gauge factor"), "2.05");
    assert_eq!(number_value(&h, "Resistance"), "350 Ω");
    // 0.003 and 0.007 as fractions: 0.3 % and 0.7 %, not 0.30000000000000004.
    assert_eq!(number_value(&h, "Resistance tolerance"), "0.3 %");
    assert_eq!(number_value(&h, "Transverse sensitivity"), "0.7 %");
    // The thermal-output curve's small higher terms keep their digits: −3.5e-8 and 1.4e-10
    // per °C² and °C³ are −0.035 µε and 0.00014 µε, not "0 µε".
    assert_eq!(number_value(&h, "c2 (per °C²)"), "-0.035 µε");
    assert_eq!(number_value(&h, "c3 (per °C³)"), "0.00014 µε");
    // 3 mm grid: 3 / 25.4 = 0.1181 in, at the thousandth an inch field shows.
    let text = number_value(&h, "Grid length");
    assert_eq!(places(&text), 3, "{text}");
    assert!(
        (number_and_unit(&text).0 - 0.003 / INCH_M).abs() <= 0.0005,
        "{text}"
    );
}

/// Opens a tab of the menu bar (Part, Face, …).
fn open_tab(h: &mut App, tab: &str) {
    h.get_all_by_label(tab)
        .find(|n| n.rect().top() < 30.0)
        .unwrap_or_else(|| panic!("the {tab} tab in the menu bar"))
        .click();
    h.run();
}

/// The first label whose text contains `part`.
fn label_containing(h: &App, part: &str) -> String {
    h.root()
        .children_recursive()
        .flat_map(|n| {
            let a = n.accesskit_node();
            [a.label(), a.value()]
        })
        .flatten()
        .find(|t| t.contains(part))
        .unwrap_or_else(|| panic!("no text contains \"{part}\""))
}

#[test]
fn face_view_readout_reads_inches_and_whole_degrees() {
    let mut h = demo_in_us();
    open_tab(&mut h, "Face");
    select(&mut h, "Gauge A1 (single grid)");
    let line = label_containing(&h, "across from the datum");
    // A1 at x = 50 mm, s = −7.5 mm from the datum at 0: 50 / 25.4 = 1.969 in and
    // −7.5 / 25.4 = −0.295 in; along the axis, 0°.
    let along = format!("{:.3} in along", 0.05 / INCH_M);
    let across = format!("{:.3} in across", -0.0075 / INCH_M);
    assert!(line.contains(&along), "{line}");
    assert!(line.contains(&across), "{line}");
    assert!(line.ends_with("grid at 0°"), "{line}");
    assert!(!line.contains("mm"), "{line}");

    // Over the gauge, the readout names a grid of the chosen pattern by its length:
    // 3 mm / 25.4 = 0.118 in.
    let at = h
        .get_by_role_and_label(Role::Button, "Gauge A1")
        .rect()
        .center();
    h.hover_at(at);
    h.run();
    let reads = label_containing(&h, "single grid along the axis here reads");
    let grid = format!("A {:.3} in single grid", 0.003 / INCH_M);
    assert!(reads.starts_with(&grid), "{reads}");
}

#[test]
fn map_legend_of_stress_reads_ksi() {
    let mut h = demo_in_us();
    open_tab(&mut h, "Part");
    control(&h, Look::Anywhere, Role::ComboBox, "Map").click();
    h.run();
    h.query_all_by_role(Role::ListBox)
        .find_map(|list| list.query_by_label("Von Mises stress"))
        .expect("the map list offers von Mises stress")
        .click();
    h.run();
    let legend = label_containing(&h, "Von Mises stress, ");
    assert_eq!(legend, "Von Mises stress, ksi");
    // "on the part: 0.000 ksi to 12.34 ksi": both ends in ksi, none in MPa.
    let range = label_containing(&h, "on the part: ");
    assert_eq!(range.matches(" ksi").count(), 2, "{range}");
    assert!(!range.contains("MPa"), "{range}");
}

#[test]
fn temperature_coefficients_bridge_factor_and_calibration_read_cleanly_in_us_units() {
    let mut project = gw_plan::demo::demo_project();
    // A fitted sensitivity of 10 kN per mV/V on the bending bridge (it measures a force).
    project.parts[0].bridges[0].calibration = Some(gw_plan::installation::InPlaceCalibration {
        load_per_mv_per_v: 10e3,
        standard_uncertainty: 20.0,
        zero_mv_per_v: 0.0,
        source: "first test".into(),
    });
    let mut h = app_on(project);
    menu(&mut h, "Units", "US customary (in, lbf, psi, °F)");
    select(&mut h, "Bridge Arm bending");
    // Copper leads, 0.0039 /°C (the demo's figure) = 3900 ppm/°C; per °F a degree is 1/1.8 as
    // large (NIST SP 811, B.9): 2166.7 ppm/°F, shown in whole ppm.
    let (drift, unit) = number_and_unit(&number_value(&h, "Lead drift"));
    assert_eq!(unit, "ppm/°F");
    assert!((drift - 3900.0 / 1.8).abs() <= 0.5, "{drift} ppm/°F");
    assert_eq!(places(&number_value(&h, "Lead drift")), 0);
    // Four grids on top and bottom read 4 × the strain of one: "4.0", not "4.0000".
    let texts = inspector_texts(&h);
    assert!(texts.iter().any(|t| t == "4.0"), "{texts:?}");
    assert!(!texts.iter().any(|t| t.contains("4.0000")), "{texts:?}");
    // 10 kN / 4.448 221 615 260 5 N/lbf (NIST SP 811, Appendix B) = 2248.09 lbf.
    let used = texts
        .iter()
        .find(|t| t.starts_with("fitted: "))
        .unwrap_or_else(|| panic!("no fitted sensitivity in {texts:?}"));
    let lbf = 10e3 / 4.448_221_615_260_5;
    let shown: f64 = used
        .trim_start_matches("fitted: ")
        .split(' ')
        .next()
        .and_then(|v| v.parse().ok())
        .unwrap_or_else(|| panic!("{used}"));
    assert!((shown - lbf).abs() <= 0.5, "{used}");
    assert!(used.contains(" lbf per mV/V (first test)"), "{used}");
}

#[test]
fn every_item_of_the_demo_reads_in_us_units_without_noise_digits() {
    let mut h = demo_in_us();
    let project = h.state().doc.project.clone();
    let stock_names: Vec<String> = project.gauge_stock.iter().map(|s| s.name.clone()).collect();
    let mut rows = stock_names.clone();
    for part in &project.parts {
        rows.push(format!("{} — {}", part.name, part.member.kind_name()));
        rows.extend(part.load_cases.iter().map(|c| c.name.clone()));
        rows.extend(part.bridges.iter().map(|b| format!("Bridge {}", b.name)));
        rows.extend(part.gauges.iter().filter_map(|g| {
            let pattern = project.stock_entry(&g.stock)?.spec.pattern.name();
            Some(format!("Gauge {} ({pattern})", g.id))
        }));
    }
    let mut visited = 0;
    for row in &rows {
        // A row whose name repeats (a load case of the same name on two parts) is skipped.
        if tree_rows(&h, row) != 1 {
            continue;
        }
        select(&mut h, row);
        visited += 1;
        // Gauge types are named by the engineer ("single grid, 3 mm, 350 Ω"): names, not
        // measurements, also where a long name wraps onto a second line.
        let texts: Vec<String> = inspector_texts(&h)
            .into_iter()
            .filter(|t| {
                !stock_names
                    .iter()
                    .any(|n| t.contains(n.as_str()) || n.contains(t.as_str()))
            })
            .collect();
        let left = si_leftovers(&texts);
        assert!(left.is_empty(), "{row}: SI units left: {left:?}");
        // No field shows more than five decimals, nor a negative zero.
        for t in &texts {
            let number = t.split(' ').next().unwrap_or_default();
            if let Ok(v) = number.parse::<f64>() {
                assert!(places(number) <= 5, "{row}: \"{t}\" has noise digits");
                assert!(!(v == 0.0 && number.starts_with('-')), "{row}: \"{t}\"");
            }
        }
    }
    assert!(
        visited * 4 >= rows.len() * 3,
        "only {visited} of {} items could be selected",
        rows.len()
    );
}

/// How many plan-tree rows read `row`.
fn tree_rows(h: &App, row: &str) -> usize {
    h.get_by_role_and_label(Role::GenericContainer, "Plan tree")
        .query_all_by_role_and_label(Role::Button, row)
        .count()
}

#[test]
fn entering_a_field_and_leaving_it_unchanged_keeps_the_stored_value() {
    let mut h = demo_in_us();
    select(&mut h, "Bridge Arm bending");
    let before = h.state().doc.project.clone();
    // 0.13 Ω/m reads 0.0396 Ω/ft; taken back as typed it would store 0.1299 Ω/m.
    for label in ["Lead resistance", "Lead length"] {
        control(&h, Look::Inspector, Role::SpinButton, label).focus();
        h.run();
        h.key_press(egui::Key::Enter);
        h.run();
    }
    assert_eq!(h.state().doc.project, before);
    assert!(!h.state().doc.dirty);
}
