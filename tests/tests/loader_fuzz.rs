//! A structure-aware fuzz of the whole road from file to sheet, run with every test: the text of
//! the demo or of the model gallery with random edits (characters deleted, swapped for digits,
//! signs and brackets, numbers scaled) goes through load, validation, evaluation, the JSON and
//! the build sheet. Each step
//! gives a result or a message, never a panic, and whatever loads evaluates to finite figures.
//! (The coverage-guided target in crates/fuzz goes further when run by hand.)

use gw_plan::demo::demo_project;
use gw_plan::evaluate::{EvalOptions, UncertaintyDepth, evaluate};
use gw_plan::{project_from_str, project_to_string};
use proptest::prelude::*;

/// One edit at a relative position in the text.
#[derive(Debug, Clone)]
enum Edit {
    Delete(f64, usize),
    Insert(f64, char),
    ScaleNumber(f64, f64),
}

fn edit() -> impl Strategy<Value = Edit> {
    prop_oneof![
        (0.0..1.0f64, 1usize..12).prop_map(|(at, n)| Edit::Delete(at, n)),
        (
            0.0..1.0f64,
            prop::sample::select(vec![
                '0', '9', '-', '.', 'e', '(', ')', '[', ']', ',', '"', ':'
            ])
        )
            .prop_map(|(at, c)| Edit::Insert(at, c)),
        (
            0.0..1.0f64,
            prop::sample::select(vec![0.0, -1.0, 1e9, 1e-9, 1e300])
        )
            .prop_map(|(at, k)| Edit::ScaleNumber(at, k)),
    ]
}

/// The char boundary at or before a relative position.
fn boundary(text: &str, at: f64) -> usize {
    let mut i = ((text.len() as f64) * at) as usize;
    while i > 0 && !text.is_char_boundary(i) {
        i -= 1;
    }
    i.min(text.len())
}

fn apply(text: &mut String, e: &Edit) {
    match *e {
        Edit::Delete(at, n) => {
            let i = boundary(text, at);
            let j = boundary(text, ((i + n) as f64 / text.len().max(1) as f64).min(1.0));
            if j > i {
                text.replace_range(i..j, "");
            }
        }
        Edit::Insert(at, c) => {
            let i = boundary(text, at);
            text.insert(i, c);
        }
        Edit::ScaleNumber(at, k) => {
            // The first number at or after the position, replaced by itself times k.
            let i = boundary(text, at);
            let rest = &text[i..];
            let Some(start) = rest.find(|c: char| c.is_ascii_digit()) else {
                return;
            };
            let len = rest[start..]
                .find(|c: char| !(c.is_ascii_digit() || c == '.' || c == 'e' || c == '-'))
                .unwrap_or(rest.len() - start);
            if let Ok(v) = rest[start..start + len].parse::<f64>() {
                let from = i + start;
                text.replace_range(from..from + len, &format!("{:?}", v * k));
            }
        }
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 48, .. ProptestConfig::default() })]

    #[test]
    fn edited_files_load_or_say_why_and_what_loads_evaluates_to_finite_figures(
        edits in prop::collection::vec(edit(), 1..4),
        gallery in proptest::bool::ANY,
    ) {
        // The demo (bridges on three parts) or the gallery (every model kind and section).
        let base = if gallery { gw_plan::gallery::model_gallery() } else { demo_project() };
        let mut text = project_to_string(&base).unwrap();
        for e in &edits {
            apply(&mut text, e);
        }
        match project_from_str(&text) {
            Err(e) => prop_assert!(!e.to_string().is_empty()),
            Ok(project) => {
                let options = EvalOptions {
                    uncertainty: UncertaintyDepth::Gum,
                    ..EvalOptions::default()
                };
                let ev = evaluate(&project, &options);
                let first = gw_plan::finite::first_non_finite(&ev);
                prop_assert!(first.is_none(), "{first:?}");
                prop_assert!(serde_json::to_string(&ev).is_ok());
                let sheet = gw_plan::sheet::build_sheet_pdf(&project, &ev);
                prop_assert!(sheet.is_ok() || !sheet.unwrap_err().is_empty());
            }
        }
    }
}
