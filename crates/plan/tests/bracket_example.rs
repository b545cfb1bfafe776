//! The example plan on imported results (`assets/bracket_fe/bracket.ron`): it is what the
//! example's builder makes (`UPDATE_ASSETS=1 cargo test -p gw-plan --test bracket_example`
//! writes it again), it opens from its file with its results read, every bridge reads its
//! wanted load with no error, and its build sheet is laid out cleanly in both unit systems.

use std::path::PathBuf;

use gw_plan::bracket_example::bracket_project;
use gw_plan::evaluate::Severity;
use gw_plan::io::project_to_string;
use gw_plan::sheet::{build_sheet_layout_problems_in, build_sheet_text};
use gw_plan::units::Units;
use gw_plan::{EvalOptions, evaluate, load_project};

fn folder() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../../assets/bracket_fe")
}

#[test]
fn the_shipped_example_plan_is_what_its_builder_makes() {
    let made = bracket_project(&folder()).expect("the example's results are readable");
    let text = project_to_string(&made).unwrap();
    let path = folder().join("bracket.ron");
    if std::env::var_os("UPDATE_ASSETS").is_some() {
        std::fs::write(&path, &text).unwrap();
    }
    let shipped = std::fs::read_to_string(&path).unwrap();
    assert!(
        shipped == text,
        "assets/bracket_fe/bracket.ron differs from what the builder makes; write it again \
         with UPDATE_ASSETS=1"
    );
}

#[test]
fn the_example_opens_reads_its_loads_and_prints_cleanly() {
    let p = load_project(&folder().join("bracket.ron")).unwrap();
    let ev = evaluate(&p, &EvalOptions::default());
    let errors: Vec<_> = ev
        .findings
        .iter()
        .filter(|f| f.severity == Severity::Error)
        .collect();
    assert!(errors.is_empty(), "{errors:#?}");
    let part = &ev.parts[0];
    assert_eq!(part.bridges.len(), 2);
    for b in &part.bridges {
        let rated = &b.cases[0];
        assert!(
            rated.reading.displayed_strain.abs() > 10e-6,
            "{}: {:e}",
            b.name,
            rated.reading.displayed_strain
        );
    }
    for units in [Units::Si, Units::UsCustomary] {
        let problems = build_sheet_layout_problems_in(&p, &ev, units);
        assert!(problems.is_empty(), "{units:?}: {}", problems.join("\n"));
    }
    let text = build_sheet_text(&p, &ev);
    assert!(text.contains("Isometric view"), "{text}");
}
