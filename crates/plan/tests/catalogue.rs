//! The catalogue of standard arrangements on every kind of part and section of the model
//! gallery: each entry it offers reads its wanted load, positively, on the exact bridge circuit
//! (not the linear sums the catalogue itself uses); what its text says it cancels, the circuit
//! does not read; and lateral bending of an I section is read at the flange tips.

use gw_bridge::arrangement::{CatalogueEntry, catalogue};
use gw_bridge::{BridgeModel, Setup};
use gw_mechanics::{Face, LoadComponent, LoadVector, Member, QuadratureOrder, Section};
use gw_plan::Project;
use gw_plan::arrangements::{apply_catalogue_entry, catalogue_spec};
use gw_plan::gallery::model_gallery;
use gw_plan::validate::bridge_from_plan;

/// The part with only the entry's gauges, its first bridge wired to the entry for `wanted`,
/// and the exact model of that bridge (bridge factor 1).
fn wired(
    project: &Project,
    part: usize,
    wanted: LoadComponent,
    entry: &CatalogueEntry,
) -> (gw_plan::document::Part, BridgeModel) {
    let mut project = project.clone();
    gw_plan::edit::add(&mut project, gw_plan::edit::ItemKind::Bridge, part).unwrap();
    let mut p = project.parts[part].clone();
    p.gauges.clear();
    p.bridges.truncate(1);
    p.bridges[0].wanted = wanted;
    p.bridges[0].shunt = None;
    // No lead resistance or amplifier loading to desensitise the bridge: the closed forms
    // compare strains.
    p.bridges[0].lead.length_m = 0.0;
    p.bridges[0].amplifier_input_ohm = None;
    let mut stock = project.gauge_stock.clone();
    apply_catalogue_entry(&mut p, &mut stock, 0, entry);
    let mut with_stock = project.clone();
    with_stock.gauge_stock = stock;
    let gauges = with_stock.placed_gauges(&p);
    let bridge = bridge_from_plan(&p, &gauges, &p.bridges[0]).expect("the entry wires a bridge");
    let setup = Setup {
        member: &p.member,
        gauges: &gauges,
        reference_temperature_c: project.reference_temperature_c,
        quadrature: QuadratureOrder::default(),
    };
    let model = BridgeModel::new(&setup, &bridge).expect("the bridge solves");
    (p, model)
}

/// Σ |strain| of the active grids per unit of `c`: the scale against which a bridge reading of
/// `c` counts as cancelled.
fn grid_scale(model: &BridgeModel, c: LoadComponent) -> f64 {
    (0..4)
        .map(|k| model.grid_strains(k, &LoadVector::unit(c))[2].abs())
        .sum()
}

fn station(member: &Member) -> f64 {
    member
        .faces()
        .first()
        .map(|f| f.x_range_m.0 + 0.4 * (f.x_range_m.1 - f.x_range_m.0))
        .unwrap_or(0.0)
}

#[test]
fn every_entry_on_every_part_reads_its_wanted_load_positively_and_cancels_what_it_says() {
    let project = model_gallery();
    let mut checked = 0;
    for (pi, part) in project.parts.iter().enumerate() {
        let spec = catalogue_spec(&project, part);
        for &wanted in part.member.components().iter() {
            if wanted == LoadComponent::TemperatureChange {
                continue;
            }
            for entry in catalogue(&part.member, wanted, station(&part.member), &spec) {
                let (_, model) = wired(&project, pi, wanted, &entry);
                let here = format!("{} / {} / {}", part.name, wanted.name(), entry.name);
                let reading = model.sensitivity(wanted).unwrap();
                // Reads: at least a thousandth of what its grids see, and positive.
                assert!(
                    reading > 1e-3 * grid_scale(&model, wanted),
                    "{here}: reads {reading:e} per unit; {}",
                    entry.description
                );
                let cancelled = entry
                    .description
                    .split("; ")
                    .find_map(|p| p.strip_prefix("cancels "))
                    .unwrap_or("");
                let shown = entry
                    .description
                    .split("; ")
                    .find_map(|p| p.strip_prefix("it also reads "))
                    .unwrap_or("");
                for &c in part.member.components().iter() {
                    if c == wanted || c == LoadComponent::TemperatureChange {
                        continue;
                    }
                    let s = model.sensitivity(c).unwrap().abs();
                    let scale = grid_scale(&model, c);
                    if cancelled.split(", ").any(|n| n == c.name()) {
                        assert!(
                            s <= 1e-4 * scale,
                            "{here}: says it cancels {} but reads {s:e} of {scale:e}",
                            c.name()
                        );
                    }
                    if shown.split(", ").any(|n| n == c.name()) {
                        assert!(
                            s > 1e-4 * scale,
                            "{here}: says {} shows but reads none",
                            c.name()
                        );
                    }
                }
                checked += 1;
            }
        }
    }
    assert!(checked > 40, "only {checked} entries checked");
}

#[test]
fn hoop_minus_axial_is_not_offered_on_a_sphere_where_the_two_are_equal() {
    // A thin sphere under pressure is strained equally in every direction of its surface
    // (σ = p r / 2t both ways; Timoshenko, Strength of Materials, Part I, thin-walled
    // spheres), so a hoop grid and an axial grid in adjacent arms read nothing. On a cylinder
    // hoop is twice axial stress and the same pair reads.
    let project = model_gallery();
    let names = |kind: &str| -> Vec<String> {
        let part = project
            .parts
            .iter()
            .find(|p| p.name.contains(kind))
            .unwrap();
        let spec = catalogue_spec(&project, part);
        catalogue(
            &part.member,
            LoadComponent::InternalPressure,
            station(&part.member),
            &spec,
        )
        .into_iter()
        .map(|e| e.name)
        .collect()
    };
    let sphere = names("sphere");
    assert!(!sphere.is_empty());
    assert!(
        sphere.iter().all(|n| !n.contains("axial")),
        "offered on the sphere: {sphere:?}"
    );
    let cylinder = names("thin-walled cylinder");
    assert!(
        cylinder.iter().any(|n| n == "Hoop and axial pair"),
        "{cylinder:?}"
    );
}

#[test]
fn lateral_bending_of_an_i_section_is_read_at_the_flange_tips() {
    // Lateral bending of an I section strains its flanges most at their tips, ε = Mz y / (E Iz),
    // with Iz = 2 tf b³ / 12 + (d − 2 tf) tw³ / 12 (parallel flanges and web about the web's
    // centre line; any mechanics-of-materials text). The web face sits at y = tw / 2, where
    // the strain is a few percent of that.
    let project = model_gallery();
    let pi = project
        .parts
        .iter()
        .position(|p| p.name.contains("I section"))
        .unwrap();
    let part = &project.parts[pi];
    let Member::Beam(beam) = &part.member else {
        panic!("the girder is a beam")
    };
    let Section::IBeam {
        flange_width_m: b,
        depth_m: d,
        flange_thickness_m: tf,
        web_thickness_m: tw,
    } = beam.section
    else {
        panic!("the girder is an I section")
    };
    let spec = catalogue_spec(&project, part);
    let x = station(&part.member);
    let entries = catalogue(&part.member, LoadComponent::LateralForce, x, &spec);
    assert!(!entries.is_empty());
    for e in &entries {
        for g in &e.gauges {
            assert!(
                matches!(g.position.face, Face::Top | Face::Bottom)
                    && g.position.s_m.abs() > 0.3 * b,
                "{}: a grid at {:?} {} m is not at a flange tip",
                e.name,
                g.position.face,
                g.position.s_m
            );
        }
    }
    let four = entries
        .iter()
        .find(|e| e.gauges.len() == 4)
        .expect("a four-tip bridge is offered");
    let (_, model) = wired(&project, pi, LoadComponent::LateralForce, four);
    let iz = 2.0 * tf * b.powi(3) / 12.0 + (d - 2.0 * tf) * tw.powi(3) / 12.0;
    let e_mod = beam.material.youngs_modulus_pa;
    let nu = beam.material.poisson_ratio;
    let y = four.gauges[0].position.s_m.abs();
    // The cantilever is loaded at its free end, 1.5 m from the root.
    let moment_per_n = beam.length_m - x;
    let strain = moment_per_n * y / (e_mod * iz);
    // The grids read the transverse (Poisson) strain with their transverse sensitivity Kt,
    // corrected to the calibration beam's ν0 (Dally & Riley, Experimental Stress Analysis,
    // 3rd ed., Ch. 6).
    let kt = spec.transverse_sensitivity;
    let nu0 = gw_mechanics::transverse::CALIBRATION_POISSON_RATIO;
    let read = strain * (1.0 - nu * kt) / (1.0 - nu0 * kt);
    let displayed = model.sensitivity(LoadComponent::LateralForce).unwrap();
    let gf_ratio = spec.gauge_factor / model.bridge().instrument.gauge_factor;
    // 0.05 %: the exact circuit's central difference and four-grid nonlinearity are far
    // smaller; the web's own share of Iz is about 0.1 %, so dropping it would fail.
    approx::assert_relative_eq!(displayed, 4.0 * read * gf_ratio, max_relative = 5e-4);
}
