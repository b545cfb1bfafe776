//! The face view through the real app: add a gauge, drag it, turn it by its handle and by the
//! typed angle, and read the new place and angle in the inspector; gauges on an unrolled round
//! face, including one beside the seam, each keep their handle.

mod support;

use egui::accesskit::Role;
use egui_kittest::kittest::{NodeT, Queryable};
use gw_mechanics::{Face, Member, Shaft, SurfacePoint};
use support::*;

/// Opens the Face tab from the menu bar.
fn open_face_tab(h: &mut App) {
    h.get_all_by_label("Face")
        .find(|n| n.rect().top() < 30.0)
        .expect("the Face tab in the menu bar")
        .click();
    h.run();
}

/// The number at the start of an inspector field's text ("62.5 mm" → 62.5).
fn inspector_number(h: &App, label: &str) -> f64 {
    let text = control(h, Look::Inspector, Role::SpinButton, label)
        .value()
        .unwrap_or_default();
    text.split_whitespace()
        .next()
        .and_then(|v| v.parse::<f64>().ok())
        .unwrap_or_else(|| panic!("field {label} shows \"{text}\""))
}

/// Drags with the mouse from `from` to `to` in small steps, as a hand would.
fn drag(h: &mut App, from: egui::Pos2, to: egui::Pos2) {
    h.hover_at(from);
    h.run();
    h.drag_at(from);
    h.run();
    for k in 1..=8 {
        h.hover_at(from + (to - from) * (k as f32 / 8.0));
        h.run();
    }
    h.drop_at(to);
    h.run();
}

fn centre_of(h: &App, label: &str) -> egui::Pos2 {
    h.get_by_role_and_label(Role::Button, label).rect().center()
}

#[test]
fn a_gauge_added_dragged_and_turned_shows_its_new_place_and_angle_in_the_inspector() {
    let mut h = app_on(gw_plan::demo::demo_project());
    open_face_tab(&mut h);
    let before = h.state().doc.project.parts[0].gauges.len();
    press(&mut h, "Add gauge");
    let gauges = &h.state().doc.project.parts[0].gauges;
    assert_eq!(gauges.len(), before + 1);
    let id = gauges[before].id.clone();
    let start_mm = inspector_number(&h, "Along (x)");
    let start_s_mm = inspector_number(&h, "Across (s)");

    // Drag it 80 points to the right: it moves along x, stays on its line across, and lands on
    // the 0.5 mm grid (or a station, all of which sit on it in the demo).
    let c = centre_of(&h, &format!("Gauge {id}"));
    drag(&mut h, c, c + egui::vec2(80.0, 0.0));
    let x_mm = inspector_number(&h, "Along (x)");
    assert!(x_mm > start_mm + 1.0, "{start_mm} mm → {x_mm} mm");
    assert!(
        (x_mm * 2.0 - (x_mm * 2.0).round()).abs() < 1e-6,
        "{x_mm} mm"
    );
    assert!((inspector_number(&h, "Across (s)") - start_s_mm).abs() < 1e-9);
    let stored = h.state().doc.project.parts[0].gauges[before].position;
    assert!(
        (stored.x_m * 1e3 - x_mm).abs() < 0.05,
        "{stored:?} vs {x_mm} mm"
    );

    // Turn it by its handle: straight up from its centre is 90° from the member axis.
    let handle = format!("Turn handle of gauge {id}");
    let c = centre_of(&h, &format!("Gauge {id}"));
    let from = centre_of(&h, &handle);
    drag(&mut h, from, c + egui::vec2(0.0, -70.0));
    assert!((inspector_number(&h, "Angle") - 90.0).abs() < 1e-6);

    // 33° up and to the right of the centre: the handle turns in 5° steps, so 35°.
    let from = centre_of(&h, &handle);
    let a = 33f32.to_radians();
    drag(&mut h, from, c + egui::vec2(a.cos(), -a.sin()) * 70.0);
    assert!((inspector_number(&h, "Angle") - 35.0).abs() < 1e-6);

    // Typed in the toolbar.
    control(&h, Look::Anywhere, Role::SpinButton, "Gauge angle").focus();
    h.run();
    replace_focused_text(&mut h, "-20");
    h.key_press(egui::Key::Enter);
    h.run();
    assert!((inspector_number(&h, "Angle") + 20.0).abs() < 1e-6);
    let angle = h.state().doc.project.parts[0].gauges[before].angle_rad;
    assert!((angle.to_degrees() + 20.0).abs() < 1e-9);
}

#[test]
fn gauges_round_a_thin_shaft_keep_their_handles_even_beside_the_seam() {
    // A 6 mm shaft (18.8 mm round) with a 3 mm gauge every quarter turn: the gaps between them
    // are about 4.7 mm, less than a gauge with its tabs, so wherever the seam goes a gauge lies
    // within its own size of it and is drawn at both edges.
    let mut project = gw_plan::demo::demo_project();
    let part = &mut project.parts[1];
    let Member::Shaft(shaft) = &part.member else {
        panic!("the demo's second part is a shaft");
    };
    part.member = Member::Shaft(Shaft {
        outer_diameter_m: 0.006,
        inner_diameter_m: 0.0,
        ..shaft.clone()
    });
    let r = 0.003;
    for (g, quarter) in part.gauges.iter_mut().zip([0.0, 1.0, 2.0, -1.0]) {
        g.position = SurfacePoint::new(Face::Round, 0.3, quarter * std::f64::consts::FRAC_PI_2 * r);
    }
    let mut h = app_on(project);
    select(&mut h, "Drum drive shaft — round shaft");
    open_face_tab(&mut h);
    for id in ["T1", "T2", "B1", "B2"] {
        h.get_by_role_and_label(Role::Button, &format!("Gauge {id}"));
    }
    // Selecting one from the tree keeps it on view with its turn handle.
    select(&mut h, "Gauge T2 (±45° shear pair)");
    h.get_by_role_and_label(Role::Button, "Turn handle of gauge T2");
}

#[test]
fn the_demo_shaft_opens_with_every_gauge_whole_and_clickable() {
    // T2 and B2 sit on the bottom line, where a face cut open at 180° would split them.
    let mut h = app_on(gw_plan::demo::demo_project());
    select(&mut h, "Drum drive shaft — round shaft");
    open_face_tab(&mut h);
    let area = h
        .get_by_role_and_label(Role::Button, "Overview of the whole face")
        .rect();
    for id in ["T1", "T2", "B1", "B2"] {
        let bottom = centre_of(&h, &format!("Gauge {id}")).y;
        assert!(bottom < area.top(), "gauge {id} is above the strip");
    }
    h.get_by_role_and_label(Role::Button, "Gauge B2").click();
    h.run();
    assert_eq!(h.state().doc.selection.gauge, Some(3));
    assert!((inspector_number(&h, "Angle")).abs() < 1e-9);
}

/// Picks `face` in the face view's face picker (the inspector has a "Face" field too).
fn choose_face(h: &mut App, face: &str) {
    // The one on the row of "Whole face".
    let row = centre_of(h, "Whole face").y;
    h.get_all_by_role_and_label(Role::ComboBox, "Face")
        .find(|n| (n.rect().center().y - row).abs() < 6.0)
        .expect("the face picker of the face view")
        .click();
    h.run();
    [Role::Menu, Role::ListBox]
        .into_iter()
        .flat_map(|role| h.query_all_by_role(role))
        .find_map(|popup| popup.query_by_label(face))
        .unwrap_or_else(|| panic!("the face picker offers no {face}"))
        .click();
    h.run();
}

/// Whether the control of `role` labelled `label` can be used.
fn enabled(h: &App, role: Role, label: &str) -> bool {
    !control(h, Look::Anywhere, role, label)
        .accesskit_node()
        .is_disabled()
}

#[test]
fn the_gauge_tools_do_not_act_on_a_selected_gauge_on_another_face() {
    let mut h = app_on(gw_plan::demo::demo_project());
    select(&mut h, "Gauge S1 (±45° shear pair)");
    open_face_tab(&mut h);
    assert!(enabled(&h, Role::SpinButton, "Gauge angle"));
    // The user picks the top face; S1 stays selected on the front face.
    choose_face(&mut h, "top face");
    assert_eq!(h.state().doc.selection.gauge, Some(4));
    h.get_by_label("S1 is on the front face.");
    assert!(!enabled(&h, Role::SpinButton, "Gauge angle"));
    assert!(!enabled(&h, Role::Button, "Turn 15° left"));
    assert!(!enabled(&h, Role::Button, "Datum here"));
    let before = h.state().doc.project.parts[0].gauges[4].angle_rad;
    h.get_by_role_and_label(Role::Button, "Turn 15° left")
        .click();
    h.run();
    assert_eq!(h.state().doc.project.parts[0].gauges[4].angle_rad, before);
    // One press shows its face, and the tools act on it again.
    press(&mut h, "Show the front face");
    assert!(h.query_by_label("S1 is on the front face.").is_none());
    h.get_by_role_and_label(Role::Button, "Gauge S1");
    assert!(enabled(&h, Role::Button, "Turn 15° left"));
    press(&mut h, "Turn 15° left");
    let after = h.state().doc.project.parts[0].gauges[4].angle_rad;
    assert!((after - before - 15f64.to_radians()).abs() < 1e-9);
}

#[test]
fn whole_face_is_fitted_again_when_the_window_changes_size() {
    let mut h = app_on(gw_plan::demo::demo_project());
    open_face_tab(&mut h);
    press(&mut h, "Whole face");
    // A1 and A3 sit 15 mm apart across the top face.
    let width = |h: &App| centre_of(h, "Gauge A1").y - centre_of(h, "Gauge A3").y;
    let before = width(&h).abs();
    h.set_size(egui::vec2(1900.0, 1060.0));
    h.run();
    h.run();
    let after = width(&h).abs();
    assert!(
        after > before * 1.2,
        "the gauges are {before} and then {after} points apart"
    );
}
