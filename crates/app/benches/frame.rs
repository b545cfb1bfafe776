//! CPU time of one frame of the app on the demo, per main view (no GPU: layout, text and
//! tessellation, as egui_kittest runs them).

use criterion::{Criterion, criterion_group, criterion_main};
use egui_kittest::Harness;
use gw_app::app::{GaugewrightApp, Tab};
use gw_app::settings::AppPaths;
use gw_app::state::DocumentState;

fn harness(tab: Tab) -> Harness<'static, GaugewrightApp> {
    harness_on(gw_plan::demo::demo_project(), tab)
}

fn harness_on(project: gw_plan::Project, tab: Tab) -> Harness<'static, GaugewrightApp> {
    let mut app =
        GaugewrightApp::with_document(DocumentState::new(project, None), AppPaths::default(), None);
    app.tab = tab;
    let mut h = Harness::builder()
        .with_size(egui::vec2(1440.0, 900.0))
        .build_ui_state(|ui, app: &mut GaugewrightApp| app.frame_ui(ui), app);
    h.run();
    h
}

fn bench(c: &mut Criterion) {
    for (name, tab) in [
        ("part", Tab::Part),
        ("face", Tab::Face),
        ("bridges", Tab::Bridges),
        ("results", Tab::Results),
    ] {
        let mut h = harness(tab);
        c.bench_function(&format!("frame/{name}"), |b| b.iter(|| h.step()));
    }
    // The part view while the part is being turned: every frame projects, shades and sorts
    // the whole mesh again. The gallery's round tube has the finest mesh of any part (outer
    // face, bore, end rings and clamp: about 30 000 triangles).
    let mut h = harness_on(gw_plan::gallery::model_gallery(), Tab::Part);
    h.state_mut().show_part(2);
    h.run();
    c.bench_function("frame/part_turning_finest_mesh", |b| {
        b.iter(|| {
            h.state_mut().turn_part_view(egui::vec2(3.0, 0.0));
            h.step();
        })
    });
    // The part view of an imported surface of about 200 000 nodes (the large example plate,
    // about 390 000 surface triangles), still and while it turns.
    let plate = gw_plan::large_example::plate_project().expect("the plate's plan");
    let mut h = harness_on(plate, Tab::Part);
    c.bench_function("frame/part_imported_200k_nodes", |b| b.iter(|| h.step()));
    c.bench_function("frame/part_imported_200k_nodes_turning", |b| {
        b.iter(|| {
            h.state_mut().turn_part_view(egui::vec2(3.0, 0.0));
            h.step();
        })
    });
    // The inspector on a bridge: its field table (arm choices, computed bridge factor) is
    // built every frame.
    let mut h = harness(Tab::Bridges);
    h.state_mut()
        .doc
        .apply_all(vec![gw_app::command::Command::Focus(
            gw_plan::edit::Item::Bridge { part: 0, bridge: 0 },
        )]);
    h.run();
    c.bench_function("frame/bridges_with_bridge_inspector", |b| {
        b.iter(|| h.step())
    });
    // An edit: one load change, re-evaluation of the whole plan, and the next frame.
    let mut h = harness(Tab::Results);
    let mut k = 0u32;
    c.bench_function("frame/results_after_a_load_edit", |b| {
        b.iter(|| {
            k += 1;
            let value = 6000.0 + f64::from(k % 100);
            let mut project = h.state().doc.project.clone();
            project.parts[0].load_cases[0]
                .set_value(gw_mechanics::LoadComponent::VerticalForce, value);
            h.state_mut()
                .doc
                .apply_all(vec![gw_app::command::Command::Edit {
                    project: Box::new(project),
                    focus: None,
                }]);
            h.step();
        })
    });
}

criterion_group!(benches, bench);
criterion_main!(benches);
