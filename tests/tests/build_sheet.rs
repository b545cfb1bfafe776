//! The build sheet and channel list: every page renders (poppler's pdftoppm), the printed
//! numbers equal the evaluation to the printed precision (pdftotext), the CSV parses and
//! matches, and a failing margin shows on the first page.

use std::path::{Path, PathBuf};
use std::process::Command;

use gw_plan::channel_list::channel_list_csv;
use gw_plan::demo::demo_project;
use gw_plan::evaluate::{EvalOptions, Evaluation, evaluate};
use gw_plan::sheet::{build_sheet_pdf, build_sheet_pdf_in};
use gw_plan::units::Units;
use gw_verify::require_tool;

fn dir() -> PathBuf {
    let d = std::env::temp_dir().join(format!("gw-sheet-{}", std::process::id()));
    std::fs::create_dir_all(&d).unwrap();
    d
}

fn write_sheet(name: &str, project: &gw_plan::Project) -> (PathBuf, Evaluation) {
    let ev = evaluate(project, &EvalOptions::default());
    let bytes = build_sheet_pdf(project, &ev).unwrap();
    let path = dir().join(name);
    std::fs::write(&path, bytes).unwrap();
    (path, ev)
}

fn pdftotext(pdf: &Path, first_page_only: bool) -> String {
    let mut cmd = Command::new("pdftotext");
    cmd.arg("-layout");
    if first_page_only {
        cmd.args(["-f", "1", "-l", "1"]);
    }
    let out = cmd.arg(pdf).arg("-").output().expect("pdftotext runs");
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    String::from_utf8_lossy(&out.stdout).into_owned()
}

#[test]
fn every_page_renders_and_is_not_blank() {
    if !require_tool("pdftoppm", "-v", "poppler-utils") {
        return;
    }
    let (pdf, _) = write_sheet("pages.pdf", &demo_project());
    let prefix = dir().join("page");
    let status = Command::new("pdftoppm")
        .args(["-png", "-r", "40"])
        .arg(&pdf)
        .arg(&prefix)
        .status()
        .unwrap();
    assert!(status.success());
    let mut pages: Vec<PathBuf> = std::fs::read_dir(dir())
        .unwrap()
        .filter_map(|e| e.ok().map(|e| e.path()))
        .filter(|p| {
            p.file_name()
                .is_some_and(|n| n.to_string_lossy().starts_with("page-"))
        })
        .collect();
    pages.sort();
    assert!(pages.len() >= 5, "{pages:?}");
    for p in &pages {
        let img = image::open(p).unwrap().to_luma8();
        let dark = img.pixels().filter(|px| px.0[0] < 128).count();
        assert!(
            dark > 200,
            "{} looks blank ({dark} dark pixels)",
            p.display()
        );
    }
}

#[test]
fn printed_readings_shunts_and_resistances_equal_the_evaluation() {
    if !require_tool("pdftotext", "-v", "poppler-utils") {
        return;
    }
    let (pdf, ev) = write_sheet("numbers.pdf", &demo_project());
    let text = pdftotext(&pdf, false);
    let mut checked = 0;
    for part in &ev.parts {
        assert!(
            text.contains(&format!("Part: {}", part.name)),
            "no section for {}",
            part.name
        );
        for b in &part.bridges {
            for c in &b.cases {
                let mv = format!("{:.4} mV/V", c.reading.mv_per_v);
                let ue = format!("{:.1} µε", c.reading.displayed_strain * 1e6);
                let line = text
                    .lines()
                    .find(|l| l.contains(&c.case) && l.contains(&mv))
                    .unwrap_or_else(|| panic!("{}: no line with {} and {mv}", b.name, c.case));
                assert!(line.contains(&ue), "{line} lacks {ue}");
                checked += 1;
            }
            if let Some(s) = &b.shunt {
                let want = format!("{} (E96)", gw_bridge::units::si(s.e96_ohm, "Ω"));
                assert!(text.contains(&want), "no {want}");
                let arm = format!("across arm {}", s.arm + 1);
                assert!(text.contains(&arm), "no {arm}");
                assert!(
                    text.contains(&format!("expect {:.1} µε", s.expected_reading_strain * 1e6))
                );
            }
            for (_, r) in &b.pin_resistances {
                assert!(
                    text.contains(&format!("{r:.2} Ω")),
                    "no pin resistance {r:.2}"
                );
            }
        }
    }
    // Nine bridges, two load cases each.
    assert_eq!(checked, 18);
}

#[test]
fn a_failing_margin_is_printed_on_the_first_page() {
    if !require_tool("pdftotext", "-v", "poppler-utils") {
        return;
    }
    let mut p = demo_project();
    for part in &mut p.parts {
        for b in &mut part.bridges {
            b.excitation = gw_bridge::Excitation::Voltage { volts: 10.0 };
        }
    }
    let (pdf, ev) = write_sheet("failing.pdf", &p);
    assert!(ev.has_failures());
    let first = pdftotext(&pdf, true);
    assert!(first.contains("MARGIN FAILS"), "{first}");
    assert!(first.contains("grid power vs self-heating limit"));
}

#[test]
fn channel_list_parses_and_matches_the_evaluation() {
    let ev = evaluate(&demo_project(), &EvalOptions::default());
    let csv = channel_list_csv(&ev);
    let mut lines = csv.lines();
    let header: Vec<&str> = lines.next().unwrap().split(',').collect();
    let col = |name: &str| header.iter().position(|h| *h == name).unwrap();
    // A small CSV reader: quoted fields may hold commas.
    let parse = |line: &str| -> Vec<String> {
        let mut out = vec![String::new()];
        let mut quoted = false;
        for ch in line.chars() {
            match ch {
                '"' => quoted = !quoted,
                ',' if !quoted => out.push(String::new()),
                c => out.last_mut().unwrap().push(c),
            }
        }
        out
    };
    let rows: Vec<Vec<String>> = lines.map(parse).collect();
    assert_eq!(rows.len(), 18);
    for part in &ev.parts {
        for b in &part.bridges {
            for c in &b.cases {
                let row = rows
                    .iter()
                    .find(|r| r[col("bridge")] == b.name && r[col("load_case")] == c.case)
                    .unwrap();
                assert_eq!(row.len(), header.len());
                let mv: f64 = row[col("expected_mv_per_v")].parse().unwrap();
                let ue: f64 = row[col("expected_microstrain")].parse().unwrap();
                assert!((mv - c.reading.mv_per_v).abs() <= 0.5e-4);
                assert!((ue - c.reading.displayed_strain * 1e6).abs() <= 0.05);
                let warm: f64 = row[col("from_temperature_microstrain")].parse().unwrap();
                assert!((warm - c.from_temperature_strain * 1e6).abs() <= 0.05);
                let channel: u32 = row[col("channel")].parse().unwrap();
                assert_eq!(channel, b.channel_number);
                if let Some(s) = &b.shunt {
                    let ohm: f64 = row[col("shunt_ohm")].parse().unwrap();
                    assert_eq!(ohm, s.e96_ohm);
                }
                // Conversion: 4000 / (GF · bridge factor) µε per mV/V, so mV/V × conversion is the
                // linear reading.
                let k: f64 = row[col("microstrain_per_mv_per_v")].parse().unwrap();
                assert!((k - 4000.0 / (b.gauge_factor_setting * b.bridge_factor)).abs() < 1e-3);
            }
        }
    }
}

#[test]
fn names_in_latin_greek_and_cyrillic_print_and_others_are_refused_with_the_characters() {
    // Accented Latin, Greek and Cyrillic names print as themselves; a name the embedded fonts
    // cannot print (here Chinese) stops the export with the characters listed, instead of a
    // sheet with empty boxes where the name should be.
    let mut project = demo_project();
    project.parts[0].name = "Träger Δοκός Балка".into();
    let ev = evaluate(&project, &EvalOptions::default());
    let bytes = build_sheet_pdf(&project, &ev).expect("these scripts print");
    if require_tool("pdftotext", "-v", "poppler-utils") {
        let path = dir().join("scripts.pdf");
        std::fs::write(&path, bytes).unwrap();
        let text = pdftotext(&path, false);
        for word in ["Träger", "Δοκός", "Балка"] {
            assert!(text.contains(word), "{word} not on the sheet");
        }
    }
    project.parts[0].name = "支架".into();
    let ev = evaluate(&project, &EvalOptions::default());
    let err = build_sheet_pdf(&project, &ev).unwrap_err();
    assert!(err.contains('支') && err.contains('架'), "{err}");
    assert!(err.contains("Latin, Greek and Cyrillic"), "{err}");
}

#[test]
fn the_us_customary_sheet_prints_inches_and_pounds_force_in_the_pdf() {
    if !require_tool("pdftotext", "-v", "poppler-utils") {
        return;
    }
    let project = demo_project();
    let ev = evaluate(&project, &EvalOptions::default());
    let path = dir().join("us.pdf");
    std::fs::write(
        &path,
        build_sheet_pdf_in(&project, &ev, Units::UsCustomary).unwrap(),
    )
    .unwrap();
    let text = pdftotext(&path, false);
    assert!(text.contains("Units: US customary"), "{text}");
    // The arm is 450 mm long: 450 / 25.4 = 17.717 in (NIST SP 811, Appendix B: 1 in =
    // 25.4 mm exactly).
    assert!(text.contains(&format!("length {:.3} in", 450.0 / 25.4)));
    // Every bridge reads the same mV/V and µε as in SI: the units change only loads and
    // lengths.
    for b in ev.parts.iter().flat_map(|p| &p.bridges) {
        for c in &b.cases {
            let mv = format!("{:.4} mV/V", c.reading.mv_per_v);
            assert!(text.contains(&mv), "{}: no {mv}", b.name);
        }
    }
    for si in [" MPa", " mm ", "°C", " kN"] {
        assert!(!text.contains(si), "\"{si}\" on the US sheet");
    }
}
