//! `eval` without `--json`: the human summary says what the JSON says, per bridge and load case.

use std::path::PathBuf;

use gw_plan::cli::{check, eval_json, eval_summary};
use gw_plan::demo::demo_project;
use gw_plan::evaluate::{EvalOptions, evaluate};
use gw_plan::{Project, save_project};

fn saved(project: &Project, test: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-plan-cli-{}-{test}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("project.ron");
    save_project(project, &path).unwrap();
    path
}

#[test]
fn the_summary_gives_every_bridge_its_reading_per_load_case() {
    let project = demo_project();
    let path = saved(&project, "readings");
    let out = eval_summary(&path, false);
    assert_eq!(out.code, 0, "{}", out.stderr);
    assert!(out.stderr.is_empty(), "{}", out.stderr);
    let ev = evaluate(&project, &EvalOptions::default());
    for part in &ev.parts {
        assert!(out.stdout.contains(&part.name), "{}", part.name);
        for b in &part.bridges {
            assert!(
                out.stdout.contains(&format!("bridge \"{}\"", b.name)),
                "{}:\n{}",
                b.name,
                out.stdout
            );
            for c in &b.cases {
                let line = format!("{}: {:.4} mV/V, displays ", c.case, c.reading.mv_per_v);
                assert!(out.stdout.contains(&line), "{line}\n{}", out.stdout);
            }
        }
    }
    let bridges: usize = ev.parts.iter().map(|p| p.bridges.len()).sum();
    assert_eq!(out.stdout.matches("uncertainty at \"").count(), bridges);
    assert_eq!(out.stdout.matches("    channel ").count(), bridges);
    assert!(out.stdout.contains("not a certification of safety"));
    assert!(!out.stdout.contains("Monte Carlo"), "{}", out.stdout);
}

#[test]
fn the_summary_shows_monte_carlo_only_when_asked() {
    let mut project = demo_project();
    project.parts.truncate(1);
    project.parts[0].bridges.truncate(1);
    project.parts[0].tolerances.monte_carlo_trials = 1000;
    let path = saved(&project, "monte-carlo");
    let with = eval_summary(&path, true);
    assert_eq!(with.code, 0, "{}", with.stderr);
    assert!(
        with.stdout
            .contains("Monte Carlo, 1000 trials: 95 % interval"),
        "{}",
        with.stdout
    );
    assert!(!eval_summary(&path, false).stdout.contains("Monte Carlo"));
}

#[test]
fn check_stays_short_and_eval_json_stays_json() {
    let path = saved(&demo_project(), "unchanged");
    let c = check(&path);
    assert_eq!(c.code, 0, "{}", c.stdout);
    assert!(!c.stdout.contains("uncertainty at"), "{}", c.stdout);
    assert!(!c.stdout.contains("    channel "), "{}", c.stdout);
    let j = eval_json(&path, false);
    assert_eq!(j.code, 0, "{}", j.stderr);
    assert!(j.stdout.starts_with('{') && j.stdout.ends_with("}\n"));
}

#[test]
fn a_failing_plan_gives_status_one_in_the_summary_too() {
    let mut project = demo_project();
    // Raise the excitation until the grids overheat (as in the check test).
    for part in &mut project.parts {
        for b in &mut part.bridges {
            b.excitation = gw_bridge::Excitation::Voltage { volts: 10.0 };
        }
    }
    let path = saved(&project, "hot");
    let out = eval_summary(&path, false);
    assert_eq!(out.code, 1);
    assert!(
        out.stdout.contains("AT LEAST ONE MARGIN FAILS"),
        "{}",
        out.stdout
    );
    assert!(out.stdout.contains("grid power vs self-heating limit"));
}

#[test]
fn a_broken_file_gives_status_two_in_the_summary_too() {
    let dir = std::env::temp_dir().join(format!("gw-plan-cli-{}-broken", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("broken.ron");
    std::fs::write(&path, "(format_version: 1, name: ").unwrap();
    let out = eval_summary(&path, false);
    assert_eq!(out.code, 2);
    assert!(out.stdout.is_empty());
    assert!(out.stderr.starts_with("error: "), "{}", out.stderr);
}
