//! The build sheet and the channel list in US customary units: no SI unit left where a US one
//! belongs, numbers that agree with an independent conversion, and pages as clean as the SI
//! sheet's.
//!
//! Reference conversions: NIST SP 811 (2008), Appendix B: 1 in = 25.4 mm exactly,
//! 1 lbf = 4.448 221 615 260 5 N, 1 psi = 6 894.757 Pa; °F = 1.8 °C + 32 for a temperature and
//! 1.8 °F per °C for a change.

use gw_mechanics::{LoadComponent, Member, Section};
use gw_plan::channel_list::{channel_list_csv, channel_list_csv_in};
use gw_plan::demo::demo_project;
use gw_plan::document::PaperSize;
use gw_plan::gallery::model_gallery;
use gw_plan::sheet::{build_sheet_layout_problems_in, build_sheet_text, build_sheet_text_in};
use gw_plan::units::Units;
use gw_plan::{EvalOptions, Project, evaluate};

const MM_PER_IN: f64 = 25.4;
const N_PER_LBF: f64 = 4.448_221_615_260_5;

fn us_text(project: &Project) -> String {
    let ev = evaluate(project, &EvalOptions::default());
    build_sheet_text_in(project, &ev, Units::UsCustomary)
}

/// Words of a text, with the punctuation round them taken off.
fn words(text: &str) -> Vec<&str> {
    text.split_whitespace()
        .map(|w| w.trim_matches(|c: char| matches!(c, ',' | '.' | ';' | ':' | '(' | ')' | '"')))
        .collect()
}

/// Each SI unit written after a number in `text`, with the number.
fn si_units_after_numbers(text: &str) -> Vec<String> {
    const SI: [&str; 13] = [
        "mm", "mm²", "m", "N", "kN", "N·m", "kN·m", "MPa", "GPa", "°C", "ppm/°C", "kW/m²", "N/m",
    ];
    let w = words(text);
    w.windows(2)
        .filter(|p| p[0].parse::<f64>().is_ok() && SI.contains(&p[1]))
        .map(|p| format!("{} {}", p[0], p[1]))
        .collect()
}

/// No SI unit after a number, and none of the SI unit names anywhere.
fn assert_no_si(what: &str, text: &str) {
    let left = si_units_after_numbers(text);
    assert!(
        left.is_empty(),
        "{what}: SI units on the US sheet: {left:?}"
    );
    for unit in ["MPa", "°C", " N·m", "kN", "kW/m²", " mm"] {
        let lines: Vec<&str> = text.lines().filter(|l| l.contains(unit)).collect();
        assert!(
            lines.is_empty(),
            "{what}: \"{unit}\" on the US sheet: {lines:#?}"
        );
    }
}

#[test]
fn the_us_sheet_of_every_model_kind_speaks_us_units_only() {
    assert_no_si("gallery", &us_text(&model_gallery()));
}

#[test]
fn the_us_sheet_of_the_demo_speaks_us_units_only() {
    let text = us_text(&demo_project());
    assert_no_si("demo", &text);
    let w = words(&text);
    for unit in ["in", "lbf", "lbf·in", "°F", "ft"] {
        assert!(w.contains(&unit), "no \"{unit}\" on the US sheet");
    }
    assert!(w.contains(&"psi") || w.contains(&"ksi"), "no psi or ksi");
    assert!(
        text.contains("Units: US customary"),
        "the sheet names its units"
    );
}

#[test]
fn the_si_sheet_still_speaks_si_and_names_its_units() {
    let p = demo_project();
    let ev = evaluate(&p, &EvalOptions::default());
    let text = build_sheet_text(&p, &ev);
    assert!(text.contains("Units: SI"), "the sheet names its units");
    let w = words(&text);
    for unit in ["mm", "N", "N·m", "MPa", "m"] {
        assert!(w.contains(&unit), "no \"{unit}\" on the SI sheet");
    }
    for unit in ["lbf", "psi", "ksi", "°F", "in"] {
        let after_number = w
            .windows(2)
            .any(|p| p[0].parse::<f64>().is_ok() && p[1] == unit);
        assert!(!after_number, "\"{unit}\" on the SI sheet");
    }
}

#[test]
fn a_known_dimension_and_load_read_as_an_independent_conversion_gives() {
    let p = demo_project();
    let arm = &p.parts[0];
    let Member::Beam(beam) = &arm.member else {
        panic!("the demo's first part is a beam");
    };
    let Section::Rectangle { width_m, height_m } = beam.section else {
        panic!("the demo's arm is a rectangle");
    };
    // 450 mm / 25.4 = 17.717 in; 30 mm = 1.181 in; 60 mm = 2.362 in: a thousandth of an inch,
    // the app's resolution for a length in inches.
    let inches = |m: f64| format!("{:.3} in", m * 1e3 / MM_PER_IN);
    let text = us_text(&p);
    for want in [
        format!("length {}", inches(beam.length_m)),
        format!("{} wide × {} high", inches(width_m), inches(height_m)),
    ] {
        assert!(text.contains(&want), "\"{want}\" not on the sheet");
    }
    assert!(
        text.contains("length 17.717 in"),
        "{}",
        inches(beam.length_m)
    );
    // The first load case's vertical force, 6000 N = 1348.85 lbf: four significant figures.
    let force = arm.load_cases[0]
        .loads
        .iter()
        .find(|(c, _)| *c == LoadComponent::VerticalForce)
        .map(|(_, v)| *v)
        .expect("the first case pulls down");
    let want = format!("vertical force {:.0} lbf", force / N_PER_LBF);
    assert_eq!(want, "vertical force 1349 lbf");
    assert!(text.contains(&want), "\"{want}\" not on the sheet");
}

#[test]
fn the_us_sheet_is_clean_on_both_papers_and_for_every_model_kind() {
    let mut projects = vec![("demo, A4".to_owned(), demo_project())];
    let mut letter = demo_project();
    letter.paper = PaperSize::Letter;
    projects.push(("demo, Letter".to_owned(), letter));
    projects.push(("gallery".to_owned(), model_gallery()));
    for (what, project) in projects {
        let ev = evaluate(&project, &EvalOptions::default());
        let problems = build_sheet_layout_problems_in(&project, &ev, Units::UsCustomary);
        assert!(
            problems.is_empty(),
            "{what}: {} layout problems:\n{}",
            problems.len(),
            problems.join("\n")
        );
    }
}

/// The fields of one CSV line (RFC 4180 quoting, no line breaks inside a field).
fn fields(line: &str) -> Vec<String> {
    let mut out = vec![String::new()];
    let mut quoted = false;
    let mut chars = line.chars().peekable();
    while let Some(c) = chars.next() {
        match (c, quoted) {
            ('"', true) if chars.peek() == Some(&'"') => {
                chars.next();
                out.last_mut().unwrap().push('"');
            }
            ('"', _) => quoted = !quoted,
            (',', false) => out.push(String::new()),
            (c, _) => out.last_mut().unwrap().push(c),
        }
    }
    out
}

#[test]
fn the_us_channel_list_gives_the_load_per_mv_per_v_in_us_units() {
    let p = demo_project();
    let ev = evaluate(&p, &EvalOptions::default());
    let si = channel_list_csv(&ev);
    let us = channel_list_csv_in(&ev, Units::UsCustomary);
    assert_eq!(si, channel_list_csv_in(&ev, Units::Si));
    let column = |csv: &str, name: &str| -> Vec<String> {
        let mut lines = csv.lines().map(fields);
        let head = lines.next().unwrap();
        let k = head.iter().position(|h| h == name).unwrap();
        lines
            .map(|l| l.get(k).cloned().unwrap_or_default())
            .collect()
    };
    let (si_units, us_units) = (column(&si, "wanted_unit"), column(&us, "wanted_unit"));
    let (si_k, us_k) = (
        column(&si, "wanted_per_mv_per_v"),
        column(&us, "wanted_per_mv_per_v"),
    );
    let mut forces = 0;
    for i in 0..si_units.len() {
        if si_units[i] != "N" || si_k[i].is_empty() {
            continue;
        }
        forces += 1;
        assert_eq!(us_units[i], "lbf");
        let (a, b): (f64, f64) = (si_k[i].parse().unwrap(), us_k[i].parse().unwrap());
        // Six significant figures each way.
        assert!(
            (b - a / N_PER_LBF).abs() < 1e-5 * b.abs(),
            "{a} N against {b} lbf"
        );
    }
    assert!(forces > 0, "the demo measures a force");
    // Outputs and strains do not change with the units.
    assert_eq!(
        column(&si, "expected_mv_per_v"),
        column(&us, "expected_mv_per_v")
    );
}
