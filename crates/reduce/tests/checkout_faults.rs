//! Check-out verdicts for a constructed record of each fault on the demo plan. The "measured"
//! values are made the way the fault makes them: a wrong completion resistor by solving the
//! bridge circuit with that resistor in place, a swapped arm by the opposite shunt step, and so
//! on; the verdict and the cause must name the fault.

use gw_plan::demo::demo_project;
use gw_plan::document::{PlanArm, Project};
use gw_plan::evaluate::{EvalOptions, Evaluation, UncertaintyDepth, evaluate};
use gw_plan::units::Units;
use gw_reduce::checkout::{Checkout, ItemCheck, Verdict, check_out};

fn quick(project: &Project) -> Evaluation {
    evaluate(
        project,
        &EvalOptions {
            uncertainty: UncertaintyDepth::Off,
            ..EvalOptions::default()
        },
    )
}

fn bridge_eval<'e>(ev: &'e Evaluation, name: &str) -> &'e gw_plan::evaluate::BridgeEvaluation {
    ev.parts
        .iter()
        .flat_map(|p| &p.bridges)
        .find(|b| b.name == name)
        .expect("the demo has this bridge")
}

/// Records every grid and bridge of the demo as a clean installation: resistance at nominal,
/// 10 GΩ, zero at the band's centre, no drift, the expected shunt step, the planned lead.
fn clean_records(project: &mut Project, ev: &Evaluation) {
    let parts = project.parts.clone();
    for part in &parts {
        for g in project.placed_gauges(part) {
            for e in 1..=g.element_count() {
                let r = project.records.grid_mut(&g.id, e);
                r.resistance_ohm = Some(g.spec.resistance_ohm);
                r.insulation_ohm = Some(10e9);
            }
        }
        for b in &part.bridges {
            let be = bridge_eval(ev, &b.name);
            let r = project.records.bridge_mut(&b.name);
            r.lead_ohm = Some(b.lead.length_m * b.lead.ohm_per_m);
            r.insulation_ohm = Some(10e9);
            r.zero_mv_per_v = Some(be.zero_band.centre_mv_per_v);
            r.zero_again_mv_per_v = Some(be.zero_band.centre_mv_per_v);
            r.shunt_step_strain = be.shunt.as_ref().map(|s| s.expected_reading_strain);
        }
    }
}

fn setup() -> (Project, Evaluation) {
    let mut project = demo_project();
    let ev = quick(&project);
    clean_records(&mut project, &ev);
    (project, ev)
}

fn item<'c>(c: &'c Checkout, bridge: &str, quantity: &str) -> &'c ItemCheck {
    c.channels
        .iter()
        .find(|ch| ch.bridge == bridge)
        .and_then(|ch| ch.items.iter().find(|i| i.quantity == quantity))
        .unwrap_or_else(|| panic!("no item \"{quantity}\" on \"{bridge}\""))
}

#[test]
fn a_clean_installation_passes_every_channel() {
    let (project, ev) = setup();
    let c = check_out(&project, &ev);
    assert!(!c.channels.is_empty());
    for ch in &c.channels {
        assert_eq!(
            ch.verdict(),
            Verdict::Pass,
            "{}: {}",
            ch.bridge,
            ch.summary()
        );
    }
    assert!(!c.has_failures());
}

#[test]
fn nothing_recorded_is_said_so_and_is_not_a_failure() {
    let project = demo_project();
    let ev = quick(&project);
    let c = check_out(&project, &ev);
    assert!(c.is_unrecorded());
    assert!(!c.has_failures());
}

#[test]
fn an_open_grid_fails_as_open() {
    let (mut project, ev) = setup();
    project.records.grid_mut("A1", 1).resistance_ohm = Some(5e6);
    let c = check_out(&project, &ev);
    let i = item(&c, "Arm bending", "A1 grid 1 resistance");
    assert_eq!(i.verdict, Verdict::Fail);
    assert!(i.cause.contains("open grid"), "{}", i.cause);
    assert!(c.has_failures());
}

#[test]
fn a_shorted_grid_fails_as_shorted() {
    let (mut project, ev) = setup();
    project.records.grid_mut("S1", 2).resistance_ohm = Some(0.8);
    let c = check_out(&project, &ev);
    let i = item(&c, "Arm shear web", "S1 grid 2 resistance");
    assert_eq!(i.verdict, Verdict::Fail);
    assert!(i.cause.contains("shorted grid"), "{}", i.cause);
}

#[test]
fn a_grid_just_off_tolerance_is_to_be_checked_not_failed() {
    let (mut project, ev) = setup();
    // 350 Ω ± 0.3 %: 0.5 % high is outside the tolerance, inside three times it.
    project.records.grid_mut("A2", 1).resistance_ohm = Some(350.0 * 1.005);
    let c = check_out(&project, &ev);
    assert_eq!(
        item(&c, "Arm bending", "A2 grid 1 resistance").verdict,
        Verdict::Check
    );
}

#[test]
fn swapped_arms_show_as_a_shunt_step_of_the_wrong_sign() {
    let (mut project, ev) = setup();
    let expected = bridge_eval(&ev, "Drive torque")
        .shunt
        .as_ref()
        .expect("planned shunt")
        .expected_reading_strain;
    project.records.bridge_mut("Drive torque").shunt_step_strain = Some(-expected);
    let c = check_out(&project, &ev);
    let i = item(&c, "Drive torque", "shunt step");
    assert_eq!(i.verdict, Verdict::Fail);
    assert!(i.cause.contains("wrong sign"), "{}", i.cause);
    assert!(i.cause.contains("swapped"), "{}", i.cause);
    assert!(i.cause.contains("adjacent arm"), "{}", i.cause);
}

#[test]
fn a_shunt_that_did_not_connect_shows_no_step() {
    let (mut project, ev) = setup();
    project.records.bridge_mut("Arm bending").shunt_step_strain = Some(1e-7);
    let c = check_out(&project, &ev);
    let i = item(&c, "Arm bending", "shunt step");
    assert_eq!(i.verdict, Verdict::Fail);
    assert!(i.cause.contains("did not connect"), "{}", i.cause);
}

#[test]
fn a_wrong_completion_resistor_is_named_with_its_value_and_arm() {
    let (mut project, ev) = setup();
    // What the technician reads with a 120 Ω resistor fitted in arm 3 of the shell's single-grid
    // bridge: the same plan with that resistor, solved as a circuit (leads and all).
    let mut fitted = project.clone();
    let shell = fitted
        .parts
        .iter_mut()
        .find(|p| p.name == "Accumulator shell")
        .expect("demo part");
    let bridge = shell
        .bridges
        .iter_mut()
        .find(|b| b.name == "Shell hoop, single grid")
        .expect("demo bridge");
    let PlanArm::Completion(c) = &mut bridge.arms[2] else {
        panic!("arm 3 of the demo's single-grid bridge is a completion resistor");
    };
    c.ohm = 120.0;
    let read = bridge_eval(&quick(&fitted), "Shell hoop, single grid")
        .zero_band
        .centre_mv_per_v;
    project
        .records
        .bridge_mut("Shell hoop, single grid")
        .zero_mv_per_v = Some(read);
    let c = check_out(&project, &ev);
    let i = item(&c, "Shell hoop, single grid", "zero");
    assert_eq!(i.verdict, Verdict::Fail);
    assert!(i.cause.contains("wrong completion resistor"), "{}", i.cause);
    assert!(i.cause.contains("120 Ω"), "{}", i.cause);
    assert!(i.cause.contains("arm 3"), "{}", i.cause);
}

#[test]
fn an_open_arm_is_told_apart_from_a_wrong_resistor() {
    let (mut project, ev) = setup();
    // An open arm of an equal-arm bridge drives the output to half the excitation: 500 mV/V
    // in size (the divider equation with one arm infinite).
    project.records.bridge_mut("Arm bending").zero_mv_per_v = Some(-498.0);
    let c = check_out(&project, &ev);
    let i = item(&c, "Arm bending", "zero");
    assert_eq!(i.verdict, Verdict::Fail);
    assert!(i.cause.contains("open or shorted arm"), "{}", i.cause);
}

#[test]
fn longer_leads_than_planned_are_named_with_their_length() {
    let (mut project, ev) = setup();
    let plan_lead = project
        .parts
        .iter()
        .flat_map(|p| &p.bridges)
        .find(|b| b.name == "Shaft bending")
        .map(|b| b.lead)
        .expect("demo bridge");
    // Half as long again: 1.5 × the planned resistance of one conductor.
    project.records.bridge_mut("Shaft bending").lead_ohm =
        Some(1.5 * plan_lead.length_m * plan_lead.ohm_per_m);
    let c = check_out(&project, &ev);
    let i = item(&c, "Shaft bending", "lead resistance (one conductor)");
    assert_eq!(i.verdict, Verdict::Check);
    assert!(i.cause.contains("Leads longer than planned"), "{}", i.cause);
    let metres = format!("about {:.1} m", 1.5 * plan_lead.length_m);
    assert!(i.cause.contains(&metres), "{} lacks {metres}", i.cause);
    // In US customary units the same cause gives the length in feet (1 ft = 0.3048 m exactly,
    // NIST SP 811, Appendix B), and the expected value the lead per foot.
    let feet = format!("about {:.1} ft", 1.5 * plan_lead.length_m / 0.3048);
    let us = i.cause_in(Units::UsCustomary);
    assert!(us.contains(&feet), "{us} lacks {feet}");
    let per_foot = plan_lead.ohm_per_m * 0.3048;
    let expected = i.expected_in(Units::UsCustomary);
    let shown: f64 = expected
        .split(" at ")
        .nth(1)
        .and_then(|t| t.strip_suffix(" Ω/ft)"))
        .and_then(|t| t.parse().ok())
        .unwrap_or_else(|| panic!("no Ω/ft in {expected}"));
    assert!(
        (shown - per_foot).abs() < 0.0005 * per_foot.max(1.0),
        "{expected}"
    );
    assert_eq!(i.expected_in(Units::Si), i.expected);
}

#[test]
fn a_poorly_bonded_gauge_shows_in_insulation_and_drift() {
    let (mut project, ev) = setup();
    project.records.grid_mut("P2", 1).insulation_ohm = Some(30e6);
    let be = bridge_eval(&ev, "Shell hoop, single grid");
    // 40 µε of drift, as mV/V of this bridge: Vo/Vex = GF · BF · ε / 4.
    let drift_mv_per_v = 40e-6 * be.gauge_factor_setting * be.bridge_factor / 4.0 * 1e3;
    let r = project.records.bridge_mut("Shell hoop, single grid");
    r.zero_again_mv_per_v = r.zero_mv_per_v.map(|z| z + drift_mv_per_v);
    let c = check_out(&project, &ev);
    let ins = item(&c, "Shell hoop, single grid", "P2 grid 1 insulation");
    assert_eq!(ins.verdict, Verdict::Fail);
    assert!(ins.cause.contains("poorly bonded"), "{}", ins.cause);
    let drift = item(&c, "Shell hoop, single grid", "zero drift after warm-up");
    assert_eq!(drift.verdict, Verdict::Fail);
    assert!(drift.measured.starts_with("40.0"), "{}", drift.measured);
    assert!(drift.cause.contains("drifts"), "{}", drift.cause);
}

#[test]
fn a_slightly_low_shunt_step_on_long_leads_is_a_check_with_the_lead_cause() {
    let (mut project, ev) = setup();
    let expected = bridge_eval(&ev, "Shaft bending")
        .shunt
        .as_ref()
        .expect("planned shunt")
        .expected_reading_strain;
    project
        .records
        .bridge_mut("Shaft bending")
        .shunt_step_strain = Some(expected * 0.99);
    let c = check_out(&project, &ev);
    let i = item(&c, "Shaft bending", "shunt step");
    assert_eq!(i.verdict, Verdict::Check);
    assert!(i.cause.contains("leads longer than planned"), "{}", i.cause);
}

#[test]
fn the_text_names_every_channel_and_its_verdict() {
    let (mut project, ev) = setup();
    project.records.grid_mut("A1", 1).resistance_ohm = Some(5e6);
    let text = check_out(&project, &ev).text();
    for b in project.parts.iter().flat_map(|p| &p.bridges) {
        assert!(text.contains(&b.name), "{} missing", b.name);
    }
    assert!(text.contains("FAIL"));
}
