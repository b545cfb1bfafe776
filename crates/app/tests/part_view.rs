//! The part view through the real app: turn to a preset, click a face and see it in the face
//! view; click a gauge and see it selected; drag to turn the part; zoom to the selection.

mod support;

use egui::accesskit::Role;
use egui_kittest::kittest::Queryable;
use gw_app::app::Tab;
use support::*;

/// A press and release at one spot: a click.
fn click_at(h: &mut App, p: egui::Pos2) {
    h.hover_at(p);
    h.run();
    h.drag_at(p);
    h.run();
    h.drop_at(p);
    h.run();
}

fn view_rect(h: &App) -> egui::Rect {
    h.get_by_role_and_label(Role::Image, "Part view").rect()
}

/// What the face view's Face list shows.
fn face_shown(h: &App) -> String {
    h.get_by_role_and_label(Role::ComboBox, "Face")
        .value()
        .unwrap_or_default()
}

/// A spot on `face` of the demo beam: just beside the handle of a gauge on that face.
fn beside_a_gauge_on(h: &App, face: gw_mechanics::Face) -> egui::Pos2 {
    let part = &h.state().doc.project.parts[0];
    let g = part
        .gauges
        .iter()
        .find(|g| g.position.face == face)
        .unwrap_or_else(|| panic!("the demo beam has a gauge on its {}", face.name()));
    let handle = h
        .get_by_role_and_label(Role::Button, &format!("Gauge {}", g.id))
        .rect();
    handle.right_center() + egui::vec2(8.0, 0.0)
}

#[test]
fn clicking_a_face_in_the_part_view_opens_it_in_the_face_view() {
    use gw_mechanics::Face;
    let mut h = app_on(gw_plan::demo::demo_project());
    assert_eq!(h.state().tab, Tab::Part, "the app opens on the part view");
    press(&mut h, "Front");
    let spot = beside_a_gauge_on(&h, Face::Front);
    click_at(&mut h, spot);
    assert_eq!(h.state().tab, Tab::Face);
    assert_eq!(face_shown(&h), "front face");
    // Back to the part, from the top: the same spot is on the top face.
    h.get_all_by_label("Part")
        .find(|n| n.rect().top() < 30.0)
        .expect("the Part tab")
        .click();
    h.run();
    press(&mut h, "Top");
    let spot = beside_a_gauge_on(&h, Face::Top);
    click_at(&mut h, spot);
    assert_eq!(h.state().tab, Tab::Face);
    assert_eq!(face_shown(&h), "top face");
}

#[test]
fn clicking_a_gauge_in_the_part_view_selects_it_everywhere() {
    let mut h = app_on(gw_plan::demo::demo_project());
    press(&mut h, "Top");
    let part = &h.state().doc.project.parts[0];
    let (index, id) = part
        .gauges
        .iter()
        .enumerate()
        .find(|(_, g)| g.position.face == gw_mechanics::Face::Top)
        .map(|(i, g)| (i, g.id.clone()))
        .expect("the demo beam has a gauge on its top face");
    h.get_by_role_and_label(Role::Button, &format!("Gauge {id}"))
        .click();
    h.run();
    assert_eq!(h.state().doc.selection.gauge, Some(index));
    assert_eq!(h.state().tab, Tab::Part, "selecting a gauge keeps the view");
    // The inspector shows it.
    control(&h, Look::Inspector, Role::TextInput, "Id");
    // Zoom to it: the gauge is now drawn large, at the middle of the view.
    press(&mut h, "Zoom to selection");
    let handle = h
        .get_by_role_and_label(Role::Button, &format!("Gauge {id}"))
        .rect();
    let view = view_rect(&h);
    assert!(
        (handle.center() - view.center()).length() < 3.0,
        "{handle:?} in {view:?}"
    );
    assert!(handle.width() > 60.0, "drawn {} px wide", handle.width());
}

#[test]
fn dragging_turns_the_part_and_the_gauges_go_round_with_it() {
    let mut h = app_on(gw_plan::demo::demo_project());
    press(&mut h, "Isometric");
    let id = h.state().doc.project.parts[0].gauges[0].id.clone();
    let before = h
        .get_by_role_and_label(Role::Button, &format!("Gauge {id}"))
        .rect()
        .center();
    // Drag on an empty corner of the view, away from the part.
    let view = view_rect(&h);
    let from = view.left_top() + egui::vec2(30.0, 60.0);
    h.hover_at(from);
    h.run();
    h.drag_at(from);
    h.run();
    for k in 1..=5 {
        h.hover_at(from + egui::vec2(12.0 * k as f32, 0.0));
        h.run();
    }
    h.drop_at(from + egui::vec2(60.0, 0.0));
    h.run();
    assert_eq!(h.state().tab, Tab::Part, "a drag is not a click");
    let label = format!("Gauge {id}");
    let after = h
        .query_all_by_role_and_label(Role::Button, &label)
        .next()
        .map(|n| n.rect().center());
    assert!(
        after.is_none_or(|a| (a - before).length() > 5.0),
        "the gauge stayed at {before:?}"
    );
}
