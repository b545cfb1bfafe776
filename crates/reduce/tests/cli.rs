//! The `checkout` and `reduce` subcommands on the shipped demo files: outputs, exit statuses,
//! and refusals to write over an input.

use std::path::{Path, PathBuf};

use gw_reduce::cli::{ReduceFiles, ReduceFormat, checkout, reduce_command};
use gw_reduce::reduction::ReduceOptions;

fn asset(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("../../assets")
        .join(name)
}

fn temp_dir(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-reduce-cli-{name}-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("temp dir");
    dir
}

#[test]
fn checkout_of_the_example_records_passes_with_two_channels_to_check() {
    let out = checkout(
        &asset("winch_test_stand.ron"),
        Some(&asset("winch_checkout.csv")),
        None,
    );
    assert_eq!(out.code, 0, "{}", out.stderr);
    assert_eq!(out.stdout.matches(": check\n").count(), 2, "{}", out.stdout);
    assert!(out.stdout.contains("Leads longer than planned"));
    assert!(out.stdout.contains("Low insulation"));
}

#[test]
fn checkout_exits_one_when_a_channel_fails_and_names_the_line_of_a_bad_record() {
    let dir = temp_dir("fail");
    let text = std::fs::read_to_string(asset("winch_checkout.csv")).expect("asset");
    // Grid A1 open: a lifted tab reads megohms.
    let broken = text.replacen(",A1-1,350.59,", ",A1-1,4500000,", 1);
    assert_ne!(
        broken, text,
        "the example's A1 row changed; update this test"
    );
    let path = dir.join("records.csv");
    std::fs::write(&path, &broken).expect("write");
    let out = checkout(&asset("winch_test_stand.ron"), Some(&path), None);
    assert_eq!(out.code, 1, "{}", out.stdout);
    assert!(out.stdout.contains("An open grid"), "{}", out.stdout);
    let bad = text.replacen(",A1-1,350.59,", ",A1-1,35O.59,", 1);
    std::fs::write(&path, &bad).expect("write");
    let out = checkout(&asset("winch_test_stand.ron"), Some(&path), None);
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("line 2"), "{}", out.stderr);
    assert!(
        out.stderr.contains("\"35O.59\" is not a number"),
        "{}",
        out.stderr
    );
}

#[test]
fn the_template_lists_every_grid_and_bridge_and_reads_back_empty() {
    let dir = temp_dir("template");
    let path = dir.join("template.csv");
    let out = checkout(&asset("winch_test_stand.ron"), None, Some(&path));
    assert_eq!(out.code, 0, "{}", out.stderr);
    let text = std::fs::read_to_string(&path).expect("written");
    // 20 grids and 9 bridges in the demo, and the header.
    assert_eq!(text.lines().count(), 1 + 20 + 9, "{text}");
    let project = gw_plan::load_project(&asset("winch_test_stand.ron")).expect("demo");
    let records = gw_reduce::records_csv::read_records(&text, &project).expect("reads back");
    assert!(records.grids.iter().all(|g| g.resistance_ohm.is_none()));
    // The template never replaces the plan.
    let out = checkout(
        &asset("winch_test_stand.ron"),
        None,
        Some(&asset("winch_test_stand.ron")),
    );
    assert_eq!(out.code, 2);
}

#[test]
fn reduce_writes_csv_json_and_the_report_and_refuses_to_overwrite_its_inputs() {
    let dir = temp_dir("reduce");
    let csv = dir.join("result.csv");
    let pdf = dir.join("report.pdf");
    let files = ReduceFiles {
        plan: &asset("winch_test_stand.ron"),
        data: &asset("winch_first_test.csv"),
        out: &csv,
        records: Some(&asset("winch_checkout.csv")),
        report: Some(&pdf),
    };
    let out = reduce_command(&files, ReduceFormat::Csv, &ReduceOptions::default());
    assert_eq!(out.code, 0, "{}{}", out.stdout, out.stderr);
    assert!(out.stdout.contains("R1 on Reaction arm"), "{}", out.stdout);
    assert!(out.stdout.contains("recovered"), "{}", out.stdout);
    assert!(
        out.stdout.contains("In-place calibration"),
        "{}",
        out.stdout
    );
    let text = std::fs::read_to_string(&csv).expect("written");
    let header = text.lines().next().expect("header");
    assert!(header.starts_with("time [s],"));
    assert!(header.contains("Reaction arm R1 ε1 [µε]"), "{header}");
    assert!(
        header.contains("Reaction arm: recovered vertical force [N]"),
        "{header}"
    );
    // The example log has 94 s at 10 samples a second; the result has one row each.
    assert_eq!(text.lines().count(), 1 + 940);
    assert!(!text.contains("NaN"));
    let bytes = std::fs::read(&pdf).expect("report written");
    assert!(bytes.starts_with(b"%PDF"));

    let json = dir.join("result.json");
    let files = ReduceFiles {
        out: &json,
        report: None,
        ..files
    };
    let out = reduce_command(&files, ReduceFormat::Json, &ReduceOptions::default());
    assert_eq!(out.code, 0, "{}", out.stderr);
    let value: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&json).expect("written")).expect("JSON");
    assert_eq!(
        value["reduction"]["channels"].as_array().map(Vec::len),
        Some(9)
    );
    assert!(
        value["calibrations"]
            .as_array()
            .is_some_and(|a| a.len() == 3)
    );

    let onto_log = ReduceFiles {
        out: &asset("winch_first_test.csv"),
        ..files
    };
    let out = reduce_command(&onto_log, ReduceFormat::Csv, &ReduceOptions::default());
    assert_eq!(out.code, 2);
    assert!(
        out.stderr.contains("is a file being read"),
        "{}",
        out.stderr
    );
}

#[test]
fn a_broken_log_is_reported_with_its_line_and_nothing_is_written() {
    let dir = temp_dir("broken");
    let log = dir.join("log.csv");
    let text = std::fs::read_to_string(asset("winch_first_test.csv")).expect("asset");
    let mut lines: Vec<String> = text.lines().map(str::to_owned).collect();
    // Line 9 of the file: an empty field.
    let fields: Vec<&str> = lines[8].split(',').collect();
    let mut emptied: Vec<String> = fields.iter().map(|f| (*f).to_owned()).collect();
    emptied[3] = String::new();
    lines[8] = emptied.join(",");
    std::fs::write(&log, lines.join("\n")).expect("write");
    let out_path = dir.join("result.csv");
    let files = ReduceFiles {
        plan: &asset("winch_test_stand.ron"),
        data: &log,
        out: &out_path,
        records: None,
        report: None,
    };
    let out = reduce_command(&files, ReduceFormat::Csv, &ReduceOptions::default());
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("line 9"), "{}", out.stderr);
    assert!(!out_path.exists());
}
