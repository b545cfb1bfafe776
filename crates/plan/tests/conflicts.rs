//! Conflicts between bridges and lists that name one thing twice: two bridges on one channel
//! and one grid in two bridges are warnings at the later bridge; a load case that lists a load
//! twice is refused.

use gw_mechanics::LoadComponent;
use gw_plan::demo::demo_project;
use gw_plan::evaluate::{EvalOptions, Severity, Target, evaluate};
use gw_plan::{PlanArm, project_from_str, project_to_string};

fn warnings_at(p: &gw_plan::Project, part: usize, bridge: usize) -> Vec<String> {
    evaluate(p, &EvalOptions::default())
        .findings
        .into_iter()
        .filter(|f| f.severity == Severity::Warn && f.target == Target::Bridge { part, bridge })
        .map(|f| f.message)
        .collect()
}

#[test]
fn two_bridges_on_one_channel_are_named_at_the_later_one() {
    let mut p = demo_project();
    assert!(warnings_at(&p, 1, 0).iter().all(|w| !w.contains("channel")));
    let first = p.parts[0].bridges[0].channel;
    p.parts[1].bridges[0].channel = first;
    let w = warnings_at(&p, 1, 0);
    assert!(
        w.iter()
            .any(|m| m.contains(&format!("channel {first}"))
                && m.contains(&p.parts[0].bridges[0].name)),
        "{w:?}"
    );
    assert!(warnings_at(&p, 0, 0).iter().all(|m| !m.contains("channel")));
}

#[test]
fn one_grid_in_two_bridges_is_named() {
    let mut p = demo_project();
    let PlanArm::Grid { gauge, grid } = p.parts[0].bridges[0].arms[0].clone() else {
        panic!("the demo's first bridge has a grid in arm 1")
    };
    p.parts[0].bridges[1].arms[3] = PlanArm::Grid {
        gauge: gauge.clone(),
        grid,
    };
    let w = warnings_at(&p, 0, 1);
    assert!(
        w.iter()
            .any(|m| m.contains(&format!("grid {grid} of gauge {gauge}"))
                && m.contains("one circuit only")),
        "{w:?}"
    );
}

#[test]
fn a_load_listed_twice_in_a_case_is_refused() {
    let mut p = demo_project();
    let case = &mut p.parts[0].load_cases[0];
    case.loads.push((LoadComponent::VerticalForce, 1.0));
    let text = project_to_string(&p).unwrap();
    let err = project_from_str(&text).unwrap_err().to_string();
    assert!(err.contains("vertical force is listed twice"), "{err}");
    assert!(err.contains("Rated pull"), "{err}");
}
