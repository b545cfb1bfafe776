//! Nothing non-finite reaches the user: random valid variations of the demo (loads,
//! temperatures, leads, excitation, gain, positions, material) go through the evaluation,
//! `check`, `eval` (summary and JSON), the channel list and the build sheet's text, and no figure
//! anywhere is NaN or infinite. A variation the checks refuse must say why. Every number of the
//! evaluation is looked at directly, since JSON would write a NaN as `null` like an empty option.

use std::path::PathBuf;

use gw_mechanics::LoadComponent;
use gw_plan::cli::{check, eval_json, eval_summary};
use gw_plan::demo::demo_project;
use gw_plan::evaluate::{EvalOptions, evaluate};
use gw_plan::{Project, save_project};
use proptest::prelude::*;

/// One variation: a factor on every load, a temperature change, a lead length, an excitation,
/// a gain, a shift of every gauge along the part and a factor on Young's modulus.
#[derive(Debug, Clone)]
struct Variation {
    load_factor: f64,
    temperature_change_c: f64,
    lead_m: f64,
    excitation_v: f64,
    gain: f64,
    shift_m: f64,
    stiffness_factor: f64,
    zero_loads: bool,
}

fn variation() -> impl Strategy<Value = Variation> {
    (
        -3.0..3.0f64,
        -60.0..120.0f64,
        0.0..200.0f64,
        0.1..20.0f64,
        1.0..5000.0f64,
        -0.05..0.05f64,
        0.3..3.0f64,
        proptest::bool::weighted(0.15),
    )
        .prop_map(
            |(load_factor, temperature_change_c, lead_m, excitation_v, gain, shift_m, k, z)| {
                Variation {
                    load_factor,
                    temperature_change_c,
                    lead_m,
                    excitation_v,
                    gain,
                    shift_m,
                    stiffness_factor: k,
                    zero_loads: z,
                }
            },
        )
}

fn varied(v: &Variation) -> Project {
    let mut p = demo_project();
    for part in &mut p.parts {
        let e = part.member.material().youngs_modulus_pa * v.stiffness_factor;
        part.member.material_mut().youngs_modulus_pa = e;
        for case in &mut part.load_cases {
            for (c, value) in &mut case.loads {
                if *c != LoadComponent::TemperatureChange {
                    *value *= if v.zero_loads { 0.0 } else { v.load_factor };
                }
            }
            case.set_value(LoadComponent::TemperatureChange, v.temperature_change_c);
        }
        for g in &mut part.gauges {
            g.position.x_m += v.shift_m;
        }
        for b in &mut part.bridges {
            b.lead.length_m = v.lead_m;
            b.signal.gain = v.gain;
            if let gw_bridge::Excitation::Voltage { volts } = &mut b.excitation {
                *volts = v.excitation_v;
            }
        }
    }
    p
}

fn folder() -> PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-finite-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

/// Words that mean a number went wrong, as Rust, RON and JSON print them.
fn non_finite_in(text: &str) -> Option<String> {
    for bad in ["NaN", "inf", "null"] {
        for (at, _) in text.match_indices(bad) {
            let before = text[..at].chars().last().unwrap_or(' ');
            let after = text[at + bad.len()..].chars().next().unwrap_or(' ');
            // Whole words only ("information", "inferred" and "nullable" are fine).
            if !before.is_alphanumeric() && !after.is_alphanumeric() && after != '_' {
                let from = at.saturating_sub(120);
                return Some(text[from..(at + 40).min(text.len())].to_owned());
            }
        }
    }
    None
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 24, .. ProptestConfig::default() })]

    #[test]
    fn no_figure_is_ever_nan_or_infinite(v in variation()) {
        let project = varied(&v);
        let path = folder().join("varied.ron");
        if let Err(e) = gw_plan::validate::validate_project(&project) {
            // Refused: the message says where and why.
            prop_assert!(e.to_string().len() > 10);
            return Ok(());
        }
        save_project(&project, &path).unwrap();
        let ev = evaluate(&project, &EvalOptions::default());
        let first = gw_plan::finite::first_non_finite(&ev);
        prop_assert!(first.is_none(), "evaluation: {first:?}");
        for out in [check(&path), eval_summary(&path, false)] {
            prop_assert!(out.code < 2, "{}", out.stderr);
            prop_assert!(non_finite_in(&out.stdout).is_none(), "{:?}", non_finite_in(&out.stdout));
        }
        let json = eval_json(&path, false);
        prop_assert!(json.code < 2, "{}", json.stderr);
        let value: serde_json::Value = serde_json::from_str(&json.stdout).unwrap();
        let mut nulls = Vec::new();
        null_paths(&value, String::new(), &mut nulls);
        let wrong: Vec<&String> = nulls.iter().filter(|p| !allowed_null(p)).collect();
        prop_assert!(wrong.is_empty(), "{wrong:?}");
        let csv = gw_plan::channel_list::channel_list_csv(&ev);
        prop_assert!(non_finite_in(&csv).is_none(), "{:?}", non_finite_in(&csv));
        let sheet = gw_plan::sheet::build_sheet_text(&project, &ev);
        prop_assert!(non_finite_in(&sheet).is_none(), "{:?}", non_finite_in(&sheet));
    }
}

/// Where the JSON holds `null`.
fn null_paths(v: &serde_json::Value, here: String, out: &mut Vec<String>) {
    match v {
        serde_json::Value::Null => out.push(here),
        serde_json::Value::Array(items) => {
            for (i, x) in items.iter().enumerate() {
                null_paths(x, format!("{here}[{i}]"), out);
            }
        }
        serde_json::Value::Object(map) => {
            for (k, x) in map {
                null_paths(x, format!("{here}.{k}"), out);
            }
        }
        _ => {}
    }
}

/// Fields that are absent by design (an option with nothing in it), not a number gone wrong.
fn allowed_null(path: &str) -> bool {
    [
        "membrane_hoop_pa",
        "outer_hoop_pa",
        ".shunt",
        ".uncertainty",
        "uncertainty_case",
        "effective_degrees_of_freedom",
        "degrees_of_freedom",
        "multi_axis",
        "safety_factor_to_yield",
    ]
    .iter()
    .any(|ok| path.ends_with(ok))
}
