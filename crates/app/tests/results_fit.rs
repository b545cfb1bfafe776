//! Every results tab of the demo, in SI and in US customary units, at the window size of an
//! ordinary laptop (1280 × 800): no text starts or ends outside the centre view (unless the
//! view scrolls sideways there) and no two texts overlap.

mod support;

use egui::accesskit::Role;
use egui_kittest::Harness;
use egui_kittest::kittest::{NodeT, Queryable};
use gw_app::app::{FileDialogs, GaugewrightApp, Tab};
use gw_app::panels::plots::PlotView;
use gw_app::settings::AppPaths;
use gw_app::state::{DocumentState, Selection};
use gw_app::units::Units;
use gw_plan::edit::Item;
use gw_plan::evaluate::{EvalOptions, evaluate};
use gw_reduce::example::{example_log, example_records};
use support::*;

const TABS: [PlotView; 6] = [
    PlotView::Output,
    PlotView::Temperature,
    PlotView::Margins,
    PlotView::Uncertainty,
    PlotView::Cancellation,
    PlotView::Measured,
];

/// The demo at 1280 × 800 on the Results view, with its check-out records and test log.
fn results_app() -> App {
    let project = gw_plan::demo::demo_project();
    let ev = evaluate(&project, &EvalOptions::default());
    let dir = temp_dir("results_fit");
    let records = dir.join("winch_checkout.csv");
    let log = dir.join("winch_first_test.csv");
    std::fs::write(&records, example_records(&project, &ev)).unwrap();
    std::fs::write(&log, example_log(&ev)).unwrap();
    let mut app =
        GaugewrightApp::with_document(DocumentState::new(project, None), AppPaths::default(), None);
    app.dialogs = FileDialogs::TypedPath;
    app.tab = Tab::Results;
    let mut h = Harness::builder()
        .with_size(egui::vec2(1280.0, 800.0))
        .with_max_steps(12)
        .build_ui_state(|ui, app: &mut GaugewrightApp| app.frame_ui(ui), app);
    h.run();
    import(&mut h, "Import check-out records…", &records);
    import(&mut h, "Import test log…", &log);
    h
}

fn import(h: &mut App, item: &str, path: &std::path::Path) {
    menu(h, "File", item);
    control(h, Look::Anywhere, Role::TextInput, PATH_FIELD).focus();
    h.run();
    replace_focused_text(h, &path.display().to_string());
    press(h, "Import");
}

/// A rectangle in window points: (x0, y0, x1, y1).
type Box2 = (f64, f64, f64, f64);

fn bounds(node: &egui_kittest::Node<'_>) -> Option<Box2> {
    let r = node.accesskit_node().bounding_box()?;
    let r = egui::Rect::from_min_max(
        egui::pos2(r.x0 as f32, r.y0 as f32),
        egui::pos2(r.x1 as f32, r.y1 as f32),
    );
    let b = (
        f64::from(r.left()),
        f64::from(r.top()),
        f64::from(r.right()),
        f64::from(r.bottom()),
    );
    (b.2 > b.0 && b.3 > b.1).then_some(b)
}

/// The texts of the centre view and what is wrong with their places.
fn problems(h: &App, tab: PlotView, units: Units) -> Vec<String> {
    let view = h.state().view_rect;
    let (left, top, right, bottom) = (
        f64::from(view.left()),
        f64::from(view.top()),
        f64::from(view.right()),
        f64::from(view.bottom()),
    );
    let inside = |b: &Box2| {
        let cx = 0.5 * (b.0 + b.2);
        let cy = 0.5 * (b.1 + b.3);
        cx > left && cx < right && cy > top && cy < bottom
    };
    // A horizontal scroll bar in the view: the texts above it may run on under the edge.
    let scrolls_sideways_above = |y: f64| {
        h.query_all_by_role(Role::ScrollBar)
            .any(|s| bounds(&s).is_some_and(|b| inside(&b) && (b.2 - b.0) > (b.3 - b.1) && b.1 > y))
    };
    let texts: Vec<(String, Box2)> = h
        .query_all_by_role(Role::Label)
        .filter_map(|n| {
            let b = bounds(&n)?;
            let node = n.accesskit_node();
            let text = node.label().or_else(|| node.value()).unwrap_or_default();
            (inside(&b) && !text.is_empty()).then_some((text, b))
        })
        .collect();
    let mut found = Vec::new();
    for (text, b) in &texts {
        let off = b.0 < left - 1.0 || (b.2 > right + 1.0 && !scrolls_sideways_above(b.1));
        if off {
            found.push(format!(
                "{tab:?}, {units:?}: \"{text}\" spans x {:.0}..{:.0}, the view {left:.0}..{right:.0}",
                b.0, b.2
            ));
        }
    }
    for (i, (a, ba)) in texts.iter().enumerate() {
        for (c, bc) in &texts[i + 1..] {
            let w = ba.2.min(bc.2) - ba.0.max(bc.0);
            let hgt = ba.3.min(bc.3) - ba.1.max(bc.1);
            if w > 2.0 && hgt > 2.0 {
                found.push(format!("{tab:?}, {units:?}: \"{a}\" overlaps \"{c}\""));
            }
        }
    }
    found
}

#[test]
fn every_results_tab_keeps_its_texts_in_the_view_in_both_unit_systems() {
    let mut h = results_app();
    let mut found = Vec::new();
    let mut seen = 0;
    for units in [Units::Si, Units::UsCustomary] {
        for tab in TABS {
            h.state_mut().show_units(units);
            h.state_mut().show_results(tab);
            h.run();
            seen += h.query_all_by_role(Role::Label).count();
            found.extend(problems(&h, tab, units));
        }
    }
    assert!(seen > 100, "the tabs showed only {seen} texts");
    assert!(found.is_empty(), "{}", found.join("\n"));
}

#[test]
fn with_a_bridge_in_the_inspector_every_results_tab_still_fits() {
    // The inspector of a bridge is the widest; the view in the centre is narrowest then.
    let mut h = results_app();
    let mut found = Vec::new();
    for units in [Units::Si, Units::UsCustomary] {
        h.state_mut().show_units(units);
        for part in 0..h.state().doc.project.parts.len() {
            let item = Item::Bridge { part, bridge: 0 };
            let before = h.state().doc.selection;
            h.state_mut().doc.selection = Selection::of(item, before);
            for tab in TABS {
                h.state_mut().show_results(tab);
                h.run();
                found.extend(problems(&h, tab, units));
            }
        }
    }
    assert!(found.is_empty(), "{}", found.join("\n"));
}
