//! The expected zero reading and the conversion to engineering units, as the evaluation gives
//! them for the demo, checked by routes of their own.

use approx::assert_relative_eq;
use gw_bridge::LeadWiring;
use gw_plan::demo::demo_project;
use gw_plan::document::{PlanArm, Project};
use gw_plan::evaluate::{BridgeEvaluation, EvalOptions, Evaluation, evaluate};
use gw_plan::io::{project_from_str, project_to_string};
use gw_plan::validate::validate_project;

fn quick() -> EvalOptions {
    EvalOptions {
        uncertainty: gw_plan::evaluate::UncertaintyDepth::Off,
        ..EvalOptions::default()
    }
}

fn bridge(ev: &Evaluation, part: usize, bridge: usize) -> &BridgeEvaluation {
    let pe = ev.parts.iter().find(|p| p.part_index == part).unwrap();
    let k = pe.bridge_indices.iter().position(|&b| b == bridge).unwrap();
    &pe.bridges[k]
}

#[test]
fn conversion_factor_times_a_reading_gives_the_wanted_load() {
    let demo = demo_project();
    let mut checked = 0;
    for (pi, part) in demo.parts.iter().enumerate() {
        for (bi, plan) in part.bridges.iter().enumerate() {
            // Only the wanted load, at the reference temperature: nothing but the bridge's own
            // response is left in the reading.
            let mut p = demo.clone();
            for case in &mut p.parts[pi].load_cases {
                case.loads.retain(|(c, _)| *c == plan.wanted);
            }
            let ev = evaluate(&p, &quick());
            let be = bridge(&ev, pi, bi);
            let f = be
                .wanted_per_mv_per_v
                .expect("every demo bridge reads its load");
            for (case, c) in p.parts[pi].load_cases.iter().zip(&be.cases) {
                let load = case.value(plan.wanted);
                // What is left is the exact circuit's nonlinearity, below GF·ε/2 ≈ 0.1 % at
                // 1000 µε for one active arm (Vo/Vex = (GF ε/4)/(1 + GF ε/2), the exact
                // one-arm output in the small-signal handbooks): 0.5 % bounds it here.
                assert_relative_eq!(f * c.reading.mv_per_v, load, max_relative = 0.005);
                checked += 1;
            }
        }
    }
    // Nine bridges, two load cases each.
    assert_eq!(checked, 18);
}

#[test]
fn a_two_wire_quarter_bridge_zero_sits_at_its_lead_offset() {
    // The demo's single hoop grid with completion resistors, wired with two wires: both leads
    // in the active arm (arm 1). Divider equation written out here:
    // Vo/Vex = (R + 2RL)/(R + 2RL + Rc) − Rc/(Rc + Rc).
    let mut p = demo_project();
    let (pi, bi) = quarter_bridge(&p);
    let plan = &mut p.parts[pi].bridges[bi];
    plan.wiring = LeadWiring::TwoWire;
    plan.amplifier_input_ohm = None;
    plan.lead.length_m = 20.0;
    plan.lead.ohm_per_m = 0.02;
    let rl = 20.0 * 0.02;
    let PlanArm::Grid { gauge, .. } = plan.arms[0].clone() else {
        panic!("the quarter bridge's grid is in arm 1")
    };
    let PlanArm::Completion(c) = plan.arms[1] else {
        panic!("completion in arm 2")
    };
    let gauges = p.placed_gauges(&p.parts[pi]);
    let r = gauges
        .iter()
        .find(|g| g.id == gauge)
        .unwrap()
        .spec
        .resistance_ohm;
    let rc = c.ohm;
    let ev = evaluate(&p, &quick());
    let z = &bridge(&ev, pi, bi).zero_band;
    let divider = ((r + 2.0 * rl) / (r + 2.0 * rl + rc) - 0.5) * 1e3;
    assert_relative_eq!(z.centre_mv_per_v, divider, max_relative = 1e-9);
    assert!(z.worst_low_mv_per_v < z.centre_mv_per_v && z.centre_mv_per_v < z.worst_high_mv_per_v);
}

/// The demo's bridge with one grid in arm 1 and completion resistors in the others.
fn quarter_bridge(p: &Project) -> (usize, usize) {
    for (pi, part) in p.parts.iter().enumerate() {
        for (bi, b) in part.bridges.iter().enumerate() {
            let completions = b.arms[1..]
                .iter()
                .filter(|a| matches!(a, PlanArm::Completion(_)))
                .count();
            if matches!(b.arms[0], PlanArm::Grid { .. }) && completions == 3 {
                return (pi, bi);
            }
        }
    }
    panic!("the demo has a quarter bridge")
}

#[test]
fn a_wide_zero_band_carries_a_note_with_the_figures_and_the_way_out() {
    let mut p = demo_project();
    p.zero_band_fraction = 1e-6;
    let ev = evaluate(&p, &quick());
    // A note on the bridge, not a finding: ordinary tolerances would flag nearly every bridge.
    assert!(
        !ev.findings.iter().any(|f| f.message.contains("zero")),
        "{:#?}",
        ev.findings
    );
    for part in &ev.parts {
        for b in &part.bridges {
            let z = &b.zero_band;
            let full = b
                .cases
                .iter()
                .map(|c| c.reading.mv_per_v.abs())
                .fold(0.0, f64::max);
            assert_relative_eq!(z.full_scale_mv_per_v, full);
            assert!(z.exceeds.exceeded(), "{}", b.name);
            let note = z.note().expect("a note");
            assert!(note.contains(&format!("{full:.4}")), "{note}");
            assert!(note.contains("closer resistance"), "{note}");
            assert!(note.contains("record the offset"), "{note}");
        }
    }
    // Arms matched to ±0.0001 %: the worst case of a full bridge is ¼ · 4 · 1e-6 = 0.001 mV/V,
    // well inside a tenth of the smallest full scale of the demo (about 0.1 mV/V).
    p.zero_band_fraction = 0.1;
    for stock in &mut p.gauge_stock {
        stock.spec.resistance_tolerance = 1e-6;
    }
    for part in &mut p.parts {
        for b in &mut part.bridges {
            for arm in &mut b.arms {
                if let PlanArm::Completion(c) = arm {
                    c.tolerance = 1e-6;
                }
            }
        }
    }
    let ev = evaluate(&p, &quick());
    for part in &ev.parts {
        for b in &part.bridges {
            assert!(b.zero_band.note().is_none(), "{}", b.name);
        }
    }
}

#[test]
fn the_zero_band_fraction_must_lie_above_zero_and_at_most_one() {
    let mut p = demo_project();
    assert_eq!(p.zero_band_fraction, 0.1);
    validate_project(&p).unwrap();
    for bad in [0.0, -0.1, 1.5, f64::NAN] {
        p.zero_band_fraction = bad;
        let e = validate_project(&p).unwrap_err().to_string();
        assert!(
            e.contains("zero band fraction") && e.contains("above 0 and at most 1"),
            "{e}"
        );
    }
}

#[test]
fn a_file_without_the_zero_band_fraction_takes_the_default() {
    let text = project_to_string(&demo_project()).unwrap();
    let line = text
        .lines()
        .find(|l| l.trim_start().starts_with("zero_band_fraction:"))
        .expect("saved with the project's settings");
    let without = text.replace(&format!("{line}\n"), "");
    assert!(!without.contains("zero_band_fraction"));
    let p = project_from_str(&without).unwrap();
    assert_eq!(
        p.zero_band_fraction,
        gw_bridge::zero_band::DEFAULT_ZERO_BAND_FRACTION
    );
}

#[test]
fn the_channel_list_carries_the_zero_band_and_the_conversion() {
    let ev = evaluate(&demo_project(), &quick());
    let csv = gw_plan::channel_list::channel_list_csv(&ev);
    let mut lines = csv.lines();
    let header: Vec<&str> = lines.next().unwrap().split(',').collect();
    let col = |name: &str| header.iter().position(|h| *h == name).unwrap();
    // Quoted fields may hold commas.
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
    for b in ev.parts.iter().flat_map(|p| &p.bridges) {
        let row = rows.iter().find(|r| r[col("bridge")] == b.name).unwrap();
        assert_eq!(row.len(), header.len());
        let num = |name: &str| row[col(name)].parse::<f64>().unwrap();
        let z = &b.zero_band;
        assert!((num("zero_mv_per_v") - z.centre_mv_per_v).abs() <= 0.5e-4);
        assert!((num("zero_statistical_mv_per_v") - z.statistical_mv_per_v).abs() <= 0.5e-4);
        assert!((num("zero_worst_low_mv_per_v") - z.worst_low_mv_per_v).abs() <= 0.5e-4);
        assert!((num("zero_worst_high_mv_per_v") - z.worst_high_mv_per_v).abs() <= 0.5e-4);
        assert_eq!(num("zero_coverage_k"), z.coverage_k);
        assert_eq!(row[col("wanted_unit")], b.wanted.unit());
        let f = b.wanted_per_mv_per_v.unwrap();
        assert_relative_eq!(num("wanted_per_mv_per_v"), f, max_relative = 1e-5);
    }
}
