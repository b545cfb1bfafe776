//! The results tabs name what they show: on the demo, in SI and in US customary units, every
//! margin bar, every uncertainty source and every row of the what-cancels-what tables carries
//! its name beside its number, and every number its unit, read through the accessibility tree.

mod support;

use egui::accesskit::Role;
use egui_kittest::kittest::{NodeT, Queryable};
use gw_app::units::{Quantity, Units};
use support::*;

/// Opens Results › `tab`.
fn open_results(h: &mut App, tab: &str) {
    h.get_all_by_label("Results")
        .find(|n| n.rect().top() < 30.0)
        .expect("the Results tab in the menu bar")
        .click();
    h.run();
    h.get_all_by_label(tab)
        .next()
        .unwrap_or_else(|| panic!("no results tab {tab}"))
        .click();
    h.run();
}

/// The demo in `units`, chosen from the Units menu.
fn demo_in(units: Units) -> App {
    let mut h = app_on(gw_plan::demo::demo_project());
    let item = match units {
        Units::Si => "SI (mm, N, MPa, °C)",
        Units::UsCustomary => "US customary (in, lbf, psi, °F)",
    };
    menu(&mut h, "Units", item);
    assert_eq!(h.state().doc.units, units);
    h
}

/// Every text label in the window, with the vertical centre of its row.
fn labels(h: &App) -> Vec<(String, f32)> {
    h.query_all_by_role(Role::Label)
        .filter_map(|n| {
            // A label's text is its accessible value.
            let node = n.accesskit_node();
            let text = node.value().or(node.label())?.to_string();
            Some((text, n.rect().center().y))
        })
        .collect()
}

/// The labels on the same row as the label `name` (centres within 3 points).
fn row_of(all: &[(String, f32)], name: &str) -> Vec<String> {
    let (_, y) = all
        .iter()
        .find(|(t, _)| t == name)
        .unwrap_or_else(|| panic!("no label \"{name}\" among {all:?}"));
    all.iter()
        .filter(|(t, ty)| (ty - y).abs() < 3.0 && t != name)
        .map(|(t, _)| t.clone())
        .collect()
}

/// Whether a text holds a number in e-notation ("1.1694e7") or a negative zero ("-0.000").
fn reads_badly(text: &str) -> bool {
    let b = text.as_bytes();
    let e_notation = (1..b.len().saturating_sub(1)).any(|i| {
        matches!(b[i], b'e' | b'E')
            && b[i - 1].is_ascii_digit()
            && (b[i + 1].is_ascii_digit() || b[i + 1] == b'-' || b[i + 1] == b'+')
    });
    let negative_zero = text.split_whitespace().any(|w| {
        w.strip_prefix('-')
            .is_some_and(|rest| !rest.is_empty() && rest.chars().all(|c| c == '0' || c == '.'))
    });
    e_notation || negative_zero
}

fn selected_bridge(h: &App) -> gw_plan::evaluate::BridgeEvaluation {
    let doc = &h.state().doc;
    let sel = doc.selection;
    let pe = doc
        .evaluation
        .parts
        .iter()
        .find(|p| p.part_index == sel.part)
        .expect("the demo's part is evaluated");
    let k = sel
        .bridge
        .and_then(|b| pe.bridge_indices.iter().position(|&i| i == b))
        .expect("a bridge is selected");
    pe.bridges[k].clone()
}

fn margins_are_named_and_the_closest_to_failing_is_on_top(units: Units) {
    let mut h = demo_in(units);
    open_results(&mut h, "Margins");
    let be = selected_bridge(&h);
    let case = &be.cases[h.state().doc.selection.case];
    let all = labels(&h);
    let mut tops = Vec::new();
    for m in &case.margins {
        let name = m.kind.name();
        let row = row_of(&all, name);
        assert!(
            row.iter().any(|t| t.contains(" % (") && t.ends_with(')')),
            "{units:?}: margin \"{name}\" has its value in % beside it: {row:?}"
        );
        let y = all.iter().find(|(t, _)| t == name).unwrap().1;
        tops.push((m.utilisation, y));
    }
    // The largest utilisation is drawn highest (smallest y).
    let highest = tops.iter().map(|t| t.1).fold(f32::INFINITY, f32::min);
    let largest = tops.iter().map(|t| t.0).fold(f64::NEG_INFINITY, f64::max);
    let accuracy = be.accuracy.iter().find(|a| a.case == case.case);
    let accuracy_largest = accuracy.is_some_and(|a| a.margin.utilisation > largest);
    if !accuracy_largest {
        let top = tops.iter().find(|t| t.1 == highest).unwrap();
        assert_eq!(
            top.0, largest,
            "{units:?}: the top bar is the closest to failing"
        );
    }
    assert!(
        all.iter()
            .any(|(t, _)| t.starts_with("Closest to its limit: ")),
        "{units:?}: the sentence that names the closest limit"
    );
    if accuracy.is_some() {
        let row = row_of(&all, "predicted error vs required accuracy");
        assert!(row.iter().any(|t| t.contains(" % (")), "{row:?}");
    }
    assert!(!all.iter().any(|(t, _)| reads_badly(t)), "{all:?}");
}

#[test]
fn margins_are_named_with_percentages_in_si_and_us_units() {
    margins_are_named_and_the_closest_to_failing_is_on_top(Units::Si);
    margins_are_named_and_the_closest_to_failing_is_on_top(Units::UsCustomary);
}

fn uncertainty_sources_are_named_with_their_unit(units: Units) {
    let mut h = demo_in(units);
    open_results(&mut h, "Uncertainty");
    let be = selected_bridge(&h);
    let budget = &be.uncertainty.as_ref().expect("the demo's budget").gum;
    let unit = units.label(Quantity::of(be.wanted));
    let all = labels(&h);
    for r in &budget.rows {
        let row = row_of(&all, &r.name);
        assert!(
            row.iter().any(|t| t.ends_with(&format!(" {unit}"))),
            "{units:?}: source \"{}\" has its contribution in {unit}: {row:?}",
            r.name
        );
        assert!(
            row.iter().any(|t| t.ends_with(" %") || t == "—"),
            "{units:?}: source \"{}\" has its share of the variance: {row:?}",
            r.name
        );
    }
    // The largest contribution is named in the sentence above the bars.
    let largest = budget
        .rows
        .iter()
        .max_by(|a, b| a.contribution.total_cmp(&b.contribution))
        .unwrap();
    assert!(
        all.iter()
            .any(|(t, _)| t.starts_with(&format!("Dominant source: {},", largest.name))),
        "{units:?}: the dominant source is named"
    );
    assert!(
        all.iter()
            .any(|(t, _)| t == &format!("Contribution ({unit})"))
    );
    assert!(!all.iter().any(|(t, _)| reads_badly(t)), "{all:?}");
}

#[test]
fn uncertainty_sources_are_named_with_units_in_si_and_us_units() {
    uncertainty_sources_are_named_with_their_unit(Units::Si);
    uncertainty_sources_are_named_with_their_unit(Units::UsCustomary);
}

fn cancellation_rows_are_named_and_headers_carry_units(units: Units) {
    let mut h = demo_in(units);
    open_results(&mut h, "What cancels what");
    let doc = &h.state().doc;
    let pe = doc
        .evaluation
        .parts
        .iter()
        .find(|p| p.part_index == doc.selection.part)
        .unwrap()
        .clone();
    let all = labels(&h);
    let (force, moment) = match units {
        Units::Si => ("µε per kN)", "µε per kN·m)"),
        Units::UsCustomary => ("µε per kip)", "µε per kip·in)"),
    };
    let headers: Vec<&String> = all
        .iter()
        .map(|(t, _)| t)
        .filter(|t| t.contains("(µε per "))
        .collect();
    assert!(
        headers
            .iter()
            .any(|t| t.ends_with(force) || t.ends_with(moment)),
        "{units:?}: sensitivities per a readable unit: {headers:?}"
    );
    for b in &pe.bridges {
        // The bridge's name stands in the frozen column once per table (sensitivities and
        // rejection), each time with a full row of cells beside it.
        let rows: Vec<f32> = all
            .iter()
            .filter(|(t, _)| t == &b.name)
            .map(|(_, y)| *y)
            .collect();
        assert!(rows.len() >= 2, "{units:?}: bridge \"{}\" rows", b.name);
        for y in rows {
            let cells = all
                .iter()
                .filter(|(t, ty)| (ty - y).abs() < 3.0 && t != &b.name)
                .count();
            assert!(
                cells >= b.sensitivities.len(),
                "{units:?}: bridge \"{}\" has a cell per load",
                b.name
            );
        }
    }
    assert!(
        all.iter().any(|(t, _)| t.ends_with("(dB, % of reading)")),
        "rejection headers name dB and %"
    );
    if let Some(m) = &pe.multi_axis {
        let per = match units {
            Units::Si => [
                " (kN per µε)",
                " (N per µε)",
                " (kN·m per µε)",
                " (N·m per µε)",
            ],
            Units::UsCustomary => [
                " (kip per µε)",
                " (lbf per µε)",
                " (kip·in per µε)",
                " (lbf·in per µε)",
            ],
        };
        let recovered = all
            .iter()
            .filter(|(t, _)| per.iter().any(|p| t.ends_with(p)))
            .count();
        assert_eq!(recovered, m.components.len(), "{units:?}: recovery rows");
    }
    for (t, _) in &all {
        assert!(!reads_badly(t), "{units:?}: \"{t}\" reads badly");
    }
}

#[test]
fn what_cancels_what_is_named_with_units_in_si_and_us_units() {
    cancellation_rows_are_named_and_headers_carry_units(Units::Si);
    cancellation_rows_are_named_and_headers_carry_units(Units::UsCustomary);
}

#[test]
fn the_check_for_badly_read_numbers_catches_them() {
    assert!(reads_badly("1.1694e7"));
    assert!(reads_badly("-0.0000"));
    assert!(reads_badly("x 2.5E-3 y"));
    assert!(!reads_badly("Bridge \"Pull\" measures vertical force"));
    assert!(!reads_badly("-0.5"));
    assert!(!reads_badly("< 0.001"));
}

#[test]
fn output_vs_load_gives_the_error_margins_checks() {
    // The error plot's known error leaves the uncertainty out; the line under it gives the
    // figure the Margins tab judges (the known error plus the expanded uncertainty) for the
    // case closest to its limit, so the two tabs never disagree.
    for units in [Units::Si, Units::UsCustomary] {
        let mut h = demo_in(units);
        open_results(&mut h, "Output vs load");
        let be = selected_bridge(&h);
        let q = Quantity::of(be.wanted);
        let closest = be
            .accuracy
            .iter()
            .max_by(|a, b| a.margin.utilisation.total_cmp(&b.margin.utilisation))
            .expect("the demo's bridge states a required accuracy");
        let all = labels(&h);
        let line = all
            .iter()
            .map(|(t, _)| t)
            .find(|t| t.starts_with("With the expanded uncertainty"))
            .expect("the line with the uncertainty");
        let predicted = units.format_difference(q, closest.predicted());
        let allowed = units.format_difference(q, closest.allowed);
        assert!(
            line.contains(&format!("±{predicted}"))
                && line.contains(&format!("±{allowed}"))
                && line.contains(&closest.case),
            "{units:?}: {line}"
        );
    }
}
