//! A placement warning through the real app: a gauge typed too close to the clamp shows a
//! finding that names it and the way out, and the finding goes when the gauge is moved clear.

mod support;

use egui_kittest::kittest::{NodeT, Queryable};
use gw_plan::evaluate::{Severity, Target};
use support::*;

const CLAMP_WARNING: &str = "gauge A1: its grid comes within 3.5 mm of the clamp at x = 0 mm";

#[test]
fn a_gauge_typed_next_to_the_clamp_is_a_finding_until_it_is_moved_clear() {
    let mut h = app_on(gw_plan::demo::demo_project());
    h.get_by_label_contains("none: every margin passes");
    select(&mut h, "Gauge A1 (single grid)");

    // 5 mm from the clamp: the 3 mm grid's edge is 3.5 mm from it.
    set_number(&mut h, "Along (x)", "5");
    let x = h.state().doc.project.parts[0].gauges[0].position.x_m;
    assert!((x - 0.005).abs() < 1e-12, "x = {x} m");
    let text = h
        .get_by_label_contains(CLAMP_WARNING)
        .accesskit_node()
        .label()
        .unwrap_or_default();
    assert!(text.contains("Saint-Venant's principle"), "{text}");
    assert!(
        text.contains("move it at least 43 mm from the clamp"),
        "{text}"
    );
    let f = h
        .state()
        .doc
        .evaluation
        .findings
        .iter()
        .find(|f| f.message.contains(CLAMP_WARNING))
        .expect("the finding behind the label");
    assert_eq!(f.severity, Severity::Warn);
    assert_eq!(f.target, Target::Gauge { part: 0, gauge: 0 });

    // Back at 50 mm (the demo's place) the grid is 48.5 mm from the clamp: clear.
    set_number(&mut h, "Along (x)", "50");
    assert!(h.query_by_label_contains(CLAMP_WARNING).is_none());
    h.get_by_label_contains("none: every margin passes");
}
