//! A part made from imported results inside a project: its files are read again when the
//! project opens (named relative to the project's folder), a file changed since it was
//! imported and a file that is gone are said at the part, a project saved elsewhere keeps
//! finding them, and the mesh checks warn at the gauge (a grid over too few elements, a surface
//! that is not free), and a datum off the metal of a gauge's face is warned.

use std::path::{Path, PathBuf};

use gw_bridge::GaugePattern;
use gw_mechanics::imported::{FieldState, ImportedLoad, ImportedSurface, ReferenceAxis};
use gw_mechanics::{Face, LoadComponent, Member, SurfacePoint};
use gw_plan::blank::{blank_project, default_material, new_part};
use gw_plan::document::{PlanGauge, default_gauge_spec, stock_name_for};
use gw_plan::evaluate::{EvalOptions, Severity, Target, evaluate};
use gw_plan::imported_part::{attach, rebase, set_reference_axis};
use gw_plan::{Project, load_project, save_project};

/// A fresh folder for one test.
fn folder(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-imported-part-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

/// A bar 200 × 20 × 10 mm (x, y, z from the origin), `n` elements along, as node and element
/// CSV files: the strain of a cantilever clamped at x = 0 under a unit tip force, εxx = k (L −
/// x) z (z from the mid-plane), εyy = εzz = −ν εxx, given as tensor strains in µm/m. With
/// `normal_stress` the top face also carries a through-thickness stress (an unfree surface).
fn write_bar(dir: &Path, n: usize, normal_stress: bool) {
    let (nx, ny, nz) = (n, 4usize, 2usize);
    let (l, w, t) = (0.2, 0.02, 0.01);
    let mut nodes = String::from(
        "# a bar under a unit tip force\nx [mm],y [mm],z [mm],exx [um/m],eyy [um/m],ezz [um/m],\
         exy [um/m],eyz [um/m],ezx [um/m]\n",
    );
    for k in 0..=nz {
        for j in 0..=ny {
            for i in 0..=nx {
                let (x, y, z) = (
                    l * i as f64 / nx as f64,
                    w * j as f64 / ny as f64,
                    t * k as f64 / nz as f64,
                );
                let exx = 0.5 * (l - x) * (z - t / 2.0) / 1e-3; // µm/m per N
                let ezz = if normal_stress && k == nz {
                    exx
                } else {
                    -0.3 * exx
                };
                nodes.push_str(&format!(
                    "{},{},{},{exx},{},{ezz},0,0,0\n",
                    x * 1e3,
                    y * 1e3,
                    z * 1e3,
                    -0.3 * exx
                ));
            }
        }
    }
    let id = |i: usize, j: usize, k: usize| (k * (ny + 1) + j) * (nx + 1) + i + 1;
    let mut cells = String::from("# hexahedra, node numbers are rows of bar.csv\n");
    for k in 0..nz {
        for j in 0..ny {
            for i in 0..nx {
                let c = [
                    id(i, j, k),
                    id(i + 1, j, k),
                    id(i + 1, j + 1, k),
                    id(i, j + 1, k),
                    id(i, j, k + 1),
                    id(i + 1, j, k + 1),
                    id(i + 1, j + 1, k + 1),
                    id(i, j + 1, k + 1),
                ];
                let list: Vec<String> = c.iter().map(|v| v.to_string()).collect();
                cells.push_str(&format!("hex,{}\n", list.join(",")));
            }
        }
    }
    std::fs::write(dir.join("bar.csv"), nodes).unwrap();
    std::fs::write(dir.join("bar_cells.csv"), cells).unwrap();
}

/// A project with the bar as its part, one single grid on the top face at x, and the results
/// read from `dir`.
fn project(dir: &Path, x_m: f64) -> Project {
    let surface = ImportedSurface {
        material: default_material(),
        reference_axis: ReferenceAxis::X,
        loads: vec![ImportedLoad {
            component: LoadComponent::VerticalForce,
            name: "tip force".into(),
            file: "bar.csv".into(),
            array: None,
            units: None,
            checksum: Some(gw_plan::import::file_checksum(&dir.join("bar.csv")).unwrap()),
        }],
        mesh_file: Some("bar_cells.csv".into()),
        field: FieldState::NotLoaded,
        read_notes: Vec::new(),
    };
    let mut part = new_part("bar", Member::ImportedField(surface), None);
    if let Member::ImportedField(f) = &mut part.member {
        attach(f, Some(dir));
        assert!(f.surface().is_some(), "{:?}", f.field);
    }
    let mut p = blank_project(part);
    let stock = stock_name_for(
        &mut p.gauge_stock,
        &default_gauge_spec(GaugePattern::SingleGrid),
    );
    let top = top_point(&p, x_m);
    p.parts[0].gauges.push(PlanGauge {
        id: "G1".into(),
        stock,
        lot: None,
        position: top,
        angle_rad: 0.0,
    });
    p.parts[0].load_cases[0].loads = vec![(LoadComponent::VerticalForce, 1000.0)];
    p
}

/// The point of the top face above (x, 10 mm).
fn top_point(p: &Project, x_m: f64) -> SurfacePoint {
    let Member::ImportedField(f) = &p.parts[0].member else {
        panic!("an imported part")
    };
    let point = f
        .surface()
        .unwrap()
        .point_at([x_m, 0.01, 0.01], 1e-9)
        .unwrap();
    assert!(matches!(point.face, Face::Patch(_)));
    point
}

fn reading(p: &Project) -> f64 {
    let g = &p.placed_gauges(&p.parts[0])[0];
    let grid = g.footprint(0);
    gw_mechanics::grid_average_strain(
        &p.parts[0].member,
        &grid,
        &p.parts[0].load_cases[0].load_vector(),
        Default::default(),
    )
    .unwrap()
}

#[test]
fn a_project_with_imported_results_saves_and_reads_them_again() {
    let dir = folder("save");
    write_bar(&dir, 40, false);
    let p = project(&dir, 0.1);
    // At x = 100 mm on the top face: 0.5 µm/m per N per mm of lever and per mm above the
    // mid-plane, × 100 mm × 5 mm × 1000 N = 250 µm/m (the field as written above; linear in x
    // and uniform across the face, so the grid's average is its centre value).
    let before = reading(&p);
    assert!((before - 250e-6).abs() < 1e-9, "{before}");
    let file = dir.join("plan.ron");
    save_project(&p, &file).unwrap();
    let text = std::fs::read_to_string(&file).unwrap();
    assert!(
        text.contains("\"bar.csv\""),
        "stored relative to the project"
    );
    let back = load_project(&file).unwrap();
    assert_eq!(reading(&back), before);
    let ev = evaluate(&back, &EvalOptions::default());
    assert!(
        ev.findings.iter().all(|f| f.severity != Severity::Error),
        "{:#?}",
        ev.findings
    );
}

#[test]
fn a_changed_or_missing_result_file_is_said_at_the_part() {
    let dir = folder("changed");
    write_bar(&dir, 40, false);
    let p = project(&dir, 0.1);
    let file = dir.join("plan.ron");
    save_project(&p, &file).unwrap();
    // The same mesh with another field: a new result file.
    let text = std::fs::read_to_string(dir.join("bar.csv")).unwrap();
    std::fs::write(dir.join("bar.csv"), text.replacen("0,0,0\n", "0,0,1\n", 1)).unwrap();
    let back = load_project(&file).unwrap();
    let ev = evaluate(&back, &EvalOptions::default());
    assert!(
        ev.findings.iter().any(|f| f.severity == Severity::Warn
            && f.target == Target::Part { part: 0 }
            && f.message
                .contains("bar.csv has changed since it was imported")),
        "{:#?}",
        ev.findings
    );
    std::fs::remove_file(dir.join("bar.csv")).unwrap();
    // The surface kept beside the project is used, and the part says the file is gone.
    let kept = load_project(&file).unwrap();
    let ev = evaluate(&kept, &EvalOptions::default());
    assert!(
        ev.findings.iter().any(|f| f.severity == Severity::Warn
            && f.target == Target::Part { part: 0 }
            && f.message.contains("bar.csv is not found")),
        "{:#?}",
        ev.findings
    );
    // Without it the project still opens (and can be edited); the part says which file is
    // missing.
    std::fs::remove_dir_all(dir.join("plan-cache")).unwrap();
    let gone = load_project(&file).unwrap();
    let ev = evaluate(&gone, &EvalOptions::default());
    assert!(
        ev.findings.iter().any(|f| f.severity == Severity::Error
            && f.target == Target::Part { part: 0 }
            && f.message.contains("bar.csv")),
        "{:#?}",
        ev.findings
    );
}

/// Sets a file's modification time.
fn set_modified(path: &Path, time: std::time::SystemTime) {
    std::fs::OpenOptions::new()
        .write(true)
        .open(path)
        .unwrap()
        .set_modified(time)
        .unwrap();
}

#[test]
fn a_reopened_project_takes_its_surface_from_the_cache_while_the_results_are_unchanged() {
    let dir = folder("cache");
    write_bar(&dir, 40, false);
    let p = project(&dir, 0.1);
    let file = dir.join("plan.ron");
    save_project(&p, &file).unwrap();
    let first = load_project(&file).unwrap();
    let cache = gw_plan::surface_cache::cache_path(&file, 0, "bar");
    assert!(
        cache.is_file(),
        "the first opening keeps the surface beside the project"
    );
    assert_eq!(cache.parent().unwrap(), dir.join("plan-cache"));

    // The result file made unreadable with its size and time kept: only the cache can give
    // the surface now, and it gives the same one.
    let results = dir.join("bar.csv");
    let time = std::fs::metadata(&results).unwrap().modified().unwrap();
    let len = std::fs::metadata(&results).unwrap().len() as usize;
    std::fs::write(&results, "#".repeat(len)).unwrap();
    set_modified(&results, time);
    let cached = load_project(&file).unwrap();
    assert_eq!(reading(&cached), reading(&first));
    let (Member::ImportedField(a), Member::ImportedField(b)) =
        (&first.parts[0].member, &cached.parts[0].member)
    else {
        unreachable!()
    };
    assert_eq!(a.surface().unwrap().digest(), b.surface().unwrap().digest());

    // A new time and other contents: the file is read again (and refused, as it is broken).
    set_modified(&results, time + std::time::Duration::from_secs(5));
    let reread = load_project(&file).unwrap();
    let Member::ImportedField(c) = &reread.parts[0].member else {
        unreachable!()
    };
    assert!(
        matches!(&c.field, FieldState::Failed(why) if why.contains("bar.csv")),
        "{:?}",
        c.field
    );

    // A damaged cache is passed over: the results are read from their files.
    write_bar(&dir, 40, false);
    std::fs::write(&cache, b"not a surface").unwrap();
    let repaired = load_project(&file).unwrap();
    assert_eq!(reading(&repaired), reading(&first));
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn changing_the_reference_axis_keeps_each_gauge_where_it_is_on_the_part() {
    let dir = folder("axis");
    write_bar(&dir, 40, false);
    let mut p = project(&dir, 0.1);
    p.parts[0].gauges[0].angle_rad = 30f64.to_radians();
    let frame = |p: &Project| {
        let Member::ImportedField(f) = &p.parts[0].member else {
            unreachable!()
        };
        let g = &p.parts[0].gauges[0];
        let fr = f.surface().unwrap().frame(&g.position).unwrap();
        let (sin, cos) = g.angle_rad.sin_cos();
        let dir: Vec<f64> = (0..3)
            .map(|i| cos * fr.axis_x[i] + sin * fr.axis_y[i])
            .collect();
        (fr.position, dir)
    };
    let (at, dir) = frame(&p);
    let before = reading(&p);
    set_reference_axis(&mut p.parts[0], ReferenceAxis::Y).unwrap();
    let (at_after, dir_after) = frame(&p);
    for i in 0..3 {
        assert!((at[i] - at_after[i]).abs() < 1e-9, "{at:?} → {at_after:?}");
        assert!(
            (dir[i] - dir_after[i]).abs() < 1e-9,
            "{dir:?} → {dir_after:?}"
        );
    }
    // On the top face (normal +z) x now runs along global Y: the grid that was 30° from the
    // bar's axis is now at 30° − 90° from the face's x.
    let g = &p.parts[0].gauges[0];
    assert!(
        (g.angle_rad.to_degrees() - (30.0 - 90.0)).abs() < 1e-6,
        "{}",
        g.angle_rad.to_degrees()
    );
    // εxx = 250 µm/m, εyy = −75 µm/m along the bar and across (no shear): at 30° the grid
    // reads εxx cos²30° + εyy sin²30° (strain transformation, Hibbeler, Mechanics of
    // Materials, §10.2), whatever the axes it is measured in.
    let expected = 250e-6 * 0.75 + (-75e-6) * 0.25;
    assert!((before - expected).abs() < 1e-9, "{before}");
    assert!((reading(&p) - expected).abs() < 1e-9, "{}", reading(&p));
}

#[test]
fn a_project_saved_in_another_folder_still_finds_its_results() {
    let dir = folder("rebase");
    write_bar(&dir, 40, false);
    let mut p = project(&dir, 0.1);
    let elsewhere = dir.join("copies");
    std::fs::create_dir_all(&elsewhere).unwrap();
    rebase(&mut p, Some(&dir), Some(&elsewhere));
    let Member::ImportedField(f) = &p.parts[0].member else {
        unreachable!()
    };
    assert_eq!(
        PathBuf::from(&f.loads[0].file),
        dir.join("bar.csv"),
        "outside the new folder: a full path"
    );
    let file = elsewhere.join("plan.ron");
    save_project(&p, &file).unwrap();
    let back = load_project(&file).unwrap();
    assert_eq!(reading(&back), reading(&p));
}

#[test]
fn a_grid_over_too_few_elements_is_warned_and_a_finer_mesh_is_not() {
    let coarse = folder("coarse");
    write_bar(&coarse, 5, false); // 40 mm elements under a 3 mm grid
    let p = project(&coarse, 0.1);
    let ev = evaluate(&p, &EvalOptions::default());
    let warned = |ev: &gw_plan::evaluate::Evaluation| {
        ev.findings.iter().any(|f| {
            f.target == Target::Gauge { part: 0, gauge: 0 } && f.message.contains("too coarse")
        })
    };
    assert!(warned(&ev), "{:#?}", ev.findings);
    let fine = folder("fine");
    write_bar(&fine, 200, false); // 1 mm elements: three under the grid
    let p = project(&fine, 0.1);
    assert!(!warned(&evaluate(&p, &EvalOptions::default())));
}

#[test]
fn a_surface_carrying_a_normal_stress_is_warned() {
    let dir = folder("normal");
    write_bar(&dir, 40, true);
    let p = project(&dir, 0.1);
    let ev = evaluate(&p, &EvalOptions::default());
    assert!(
        ev.findings.iter().any(|f| {
            f.target == Target::Gauge { part: 0, gauge: 0 } && f.message.contains("not free")
        }),
        "{:#?}",
        ev.findings
    );
}

#[test]
fn a_datum_off_the_face_is_warned_at_its_first_gauge() {
    let dir = folder("datum");
    write_bar(&dir, 40, false);
    let mut p = project(&dir, 0.1);
    let warned = |p: &Project| {
        evaluate(p, &EvalOptions::default())
            .findings
            .iter()
            .any(|f| {
                f.target == Target::Gauge { part: 0, gauge: 0 }
                    && f.message.contains("datum")
                    && f.message.contains("lies off")
            })
    };
    // The top face's x and s run from its centroid: 200 × 20 mm, so x = ±100 mm at its ends.
    assert!(!warned(&p), "the datum at the centroid is on the face");
    p.parts[0].datum_m = (0.095, 0.005);
    assert!(!warned(&p), "a datum 5 mm inside the end is on the face");
    p.parts[0].datum_m = (0.105, 0.0);
    assert!(warned(&p), "a datum 5 mm past the end is off the face");
    p.parts[0].datum_m = (0.0, 0.012);
    assert!(warned(&p), "a datum 2 mm past the side is off the face");
}
