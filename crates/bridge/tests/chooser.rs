//! The arrangement chooser on an invented cantilever: it ranks by the error left in the wanted
//! load at its rated value, in newtons, and will not prefer a bridge that cancels perfectly
//! but hardly reads anything.

mod support;

use approx::assert_relative_eq;
use gw_bridge::bridge_uncertainty::InstallationTolerances;
use gw_bridge::chooser::{ChooserRequest, RankedArrangement, assess, choose};
use gw_bridge::*;
use gw_mechanics::*;
use support::*;

fn single(id: &str, face: Face, x: f64, s: f64) -> PlacedGauge {
    placed(spec(GaugePattern::SingleGrid), id, face, x, s, 0.0)
}

/// Top and bottom grids at 0.1 m from the root, plus two top grids 1 mm apart along the beam
/// (side by side across it) at 0.2 m.
fn gauges() -> Vec<PlacedGauge> {
    vec![
        single("G1", Face::Top, 0.1, 0.0),
        single("G2", Face::Bottom, 0.1, 0.0),
        single("G3", Face::Top, 0.2, -0.005),
        single("G4", Face::Top, 0.201, 0.005),
    ]
}

fn request(unwanted: Vec<(LoadComponent, f64)>, keep: usize) -> ChooserRequest {
    let mut template = bridge([grid(0, 0); 4], LoadComponent::VerticalForce, 1.0);
    template.arms = [ArmElement::Completion(completion()); 4];
    ChooserRequest {
        wanted: LoadComponent::VerticalForce,
        wanted_magnitude: 1000.0,
        unwanted,
        temperature_range_c: (-10.0, 30.0),
        reference_temperature_c: 20.0,
        template,
        completion: completion(),
        tolerances: InstallationTolerances::default(),
        keep,
    }
}

fn uses_only(r: &RankedArrangement, gauges: &[usize]) -> bool {
    r.arms.iter().all(|a| match a {
        ArmElement::Grid(g) => gauges.contains(&g.gauge),
        _ => true,
    })
}

/// G3 and G4 in arms of opposite sign: the bridge reads their difference.
fn close_difference(r: &RankedArrangement) -> bool {
    let sign_of = |gauge: usize| {
        r.arms.iter().enumerate().find_map(|(k, a)| match a {
            ArmElement::Grid(g) if g.gauge == gauge => Some(k % 2),
            _ => None,
        })
    };
    uses_only(r, &[2, 3])
        && active(r) == 2
        && matches!((sign_of(2), sign_of(3)), (Some(a), Some(b)) if a != b)
}

fn active(r: &RankedArrangement) -> usize {
    r.arms
        .iter()
        .filter(|a| matches!(a, ArmElement::Grid(_)))
        .count()
}

#[test]
fn the_bending_pair_cancels_axial_load() {
    let member = cantilever();
    let gauges = &gauges()[..2];
    let req = request(vec![(LoadComponent::AxialForce, 20_000.0)], 10);
    let ranked = choose(&member, gauges, &req, QuadratureOrder::default()).unwrap();
    let best = &ranked[0];
    // Opposite faces in adjacent arms: axial strain is equal in both and cancels exactly
    // (Hoffmann, An Introduction to Stress Analysis and Transducer Design using Strain Gauges,
    // half-bridge bending arrangement; from memory for the reference).
    assert!(best.worst_leakage() < 1e-6 * 1000.0, "{best:?}");
    assert_eq!(active(best), 2, "{}", best.reason);
    assert!(
        best.reason.contains("cancels axial force"),
        "{}",
        best.reason
    );
    for pair in ranked.windows(2) {
        assert!(pair[0].score >= pair[1].score);
    }
}

#[test]
fn a_pair_of_grids_a_millimetre_apart_does_not_outrank_a_proper_bridge() {
    // The two top grids 1 mm apart read dM/dx = V exactly and cancel the tip moment, axial load
    // and temperature perfectly, but their difference is under 1 µε at 1000 N (V Δx / (E Z) =
    // 1000 × 0.001 / (200e9 × 5.33e-6) = 0.94 µε), less than what half a millimetre of
    // placement moves either grid (V × 0.5 mm / (E Z) = 0.47 µε each). The top and bottom
    // pair leaks the 2 N·m tip moment as 2 / 0.4 m = 5 N but reads 375 µε per grid.
    let member = cantilever();
    let gauges = gauges();
    let req = request(
        vec![
            (LoadComponent::AxialForce, 5000.0),
            (LoadComponent::BendingMomentY, 2.0),
        ],
        1000,
    );
    let ranked = choose(&member, &gauges, &req, QuadratureOrder::default()).unwrap();
    let best = &ranked[0];
    assert!(!close_difference(best), "{}", best.reason);
    assert!(best.total_error() < 0.02 * 1000.0, "{}", best.reason);
    let close: Vec<&RankedArrangement> = ranked.iter().filter(|r| close_difference(r)).collect();
    assert!(!close.is_empty(), "the close pair is ranked, low");
    for r in close {
        // Placement alone: √2 × 0.47 µε over 0.94 µε ≈ 70 % of the rated load (1 σ).
        assert!(r.error.placement > 0.5 * 1000.0, "{}", r.reason);
        assert!(r.score < best.score);
    }
}

#[test]
fn an_arrangement_below_one_count_of_the_channel_is_rejected() {
    // A 16-bit converter over ±10 V after a gain of 100 at 5 V excitation: one count is
    // 20 V / 65 536 / 100 / 5 V = 0.61 µV/V, which an instrument at gauge factor 2 shows as
    // 4 × 0.61e-6 / 2 = 1.22 µε; the close pair's full scale (0.94 µε) is below it.
    let member = cantilever();
    let gauges = gauges();
    let mut req = request(vec![(LoadComponent::BendingMomentY, 2.0)], 200);
    req.template.signal.adc_bits = 16;
    let ranked = choose(&member, &gauges, &req, QuadratureOrder::default()).unwrap();
    assert!(!ranked.is_empty());
    assert!(
        ranked.iter().all(|r| !close_difference(r)),
        "a bridge reading less than one count was offered"
    );
    for r in &ranked {
        assert!(r.error.resolution < 1000.0, "{}", r.reason);
    }
}

#[test]
fn two_wire_leads_warming_with_the_part_show_in_the_temperature_error() {
    // A quarter bridge wired with two leads of 0.5 Ω each has 1 Ω of copper in the active arm;
    // warmed by 30 °C it grows by 1 Ω × 0.00393/°C (copper near 20 °C, from memory) × 30 °C
    // = 0.118 Ω, which the bridge reads as a strain ΔR / (R GF) (Dally & Riley, Experimental
    // Stress Analysis, 3rd ed., Ch. 7, lead-wire effects; from memory for the section). In newtons it is that strain over the
    // grid's strain per newton, σ/E = (0.4 m / Z) / E per newton at 0.1 m from the root of a
    // cantilever loaded at 0.5 m (Z = b h² / 6, any mechanics-of-materials text). The grid is
    // matched to the part, so the leads are the only thermal cause.
    let member = cantilever();
    let gauges = &gauges()[..1];
    let mut req = request(vec![], 50);
    req.template.wiring = LeadWiring::TwoWire;
    req.template.lead = LeadWire {
        length_m: 10.0,
        ohm_per_m: 0.05,
        tcr_per_c: 0.00393,
    };
    let c = ArmElement::Completion(completion());
    let quarter = assess(
        &member,
        gauges,
        &req,
        &[grid(0, 0), c, c, c],
        QuadratureOrder::default(),
    )
    .unwrap()
    .expect("the quarter bridge reads the wanted load");
    let z = 0.02 * 0.04f64.powi(2) / 6.0;
    let strain_per_n = 0.4 / z / 200e9;
    let lead_change = 1.0 * 0.00393 * 30.0;
    let expected_n = lead_change / (350.0 * 2.0) / strain_per_n;
    // 1 %: the exact circuit adds the one-arm nonlinearity (ΔR/2R ≈ 2e-4) and the lead's
    // share of the arm (1 Ω in 351 Ω) that the closed form leaves out.
    assert_relative_eq!(
        quarter.error.temperature.abs(),
        expected_n,
        max_relative = 0.01
    );
    // A dummy in the adjacent arm, wired with its own two leads beside the gauge's, warms the
    // same copper on the other side of the output node: the chooser puts it first.
    let ranked = choose(&member, gauges, &req, QuadratureOrder::default()).unwrap();
    assert!(
        matches!(ranked[0].arms[1], ArmElement::Dummy(_)),
        "{}",
        ranked[0].reason
    );
    assert!(
        ranked[0].error.temperature.abs() < 0.01 * expected_n,
        "{}",
        ranked[0].reason
    );
}

#[test]
fn the_ranking_is_explained_in_the_wanted_unit() {
    let member = cantilever();
    let gauges = gauges();
    let req = request(vec![(LoadComponent::BendingMomentY, 2.0)], 5);
    let ranked = choose(&member, &gauges, &req, QuadratureOrder::default()).unwrap();
    for r in &ranked {
        assert_eq!(r.unit, "N");
        assert!(
            r.reason.contains("error at rated load ±") && r.reason.contains(" N"),
            "{}",
            r.reason
        );
        assert!(r.reason.contains("at 1.000 kN"), "{}", r.reason);
    }
}

#[test]
fn a_wanted_load_without_a_rated_value_is_refused_with_the_way_out() {
    let member = cantilever();
    let mut req = request(vec![], 5);
    req.wanted_magnitude = 0.0;
    let err = choose(&member, &gauges(), &req, QuadratureOrder::default()).unwrap_err();
    assert!(err.to_string().contains("load case"), "{err}");
}

#[test]
fn a_dummy_is_offered_like_each_kind_of_grid_so_its_temperature_cancels() {
    // Two gauges from lots with different thermal output: a dummy cancels a grid's
    // temperature only if it is like that grid, so each lot gets its own dummy.
    let member = cantilever();
    let mut g2 = single("G2", Face::Bottom, 0.1, 0.0);
    g2.spec.thermal_output.matched_cte_per_c = 16e-6;
    let gauges = vec![single("G1", Face::Top, 0.1, 0.0), g2];
    let req = request(vec![], 500);
    let ranked = choose(&member, &gauges, &req, QuadratureOrder::default()).unwrap();
    let like = |r: &RankedArrangement, gauge: usize| {
        r.arms
            .iter()
            .any(|a| matches!(a, ArmElement::Dummy(g) if g.gauge == gauge))
    };
    let with_g2_dummy = ranked
        .iter()
        .find(|r| like(r, 1) && !like(r, 0))
        .expect("a dummy like G2 is offered");
    assert!(
        with_g2_dummy.reason.contains("dummy like G2/1"),
        "{}",
        with_g2_dummy.reason
    );
    // G2 alone with its own dummy in the adjacent arm: the mismatch of its lot cancels.
    let c = ArmElement::Completion(completion());
    let dummy = ArmElement::Dummy(GridRef {
        gauge: 1,
        element: 0,
    });
    let own = assess(
        &member,
        &gauges,
        &req,
        &[dummy, grid(1, 0), c, c],
        QuadratureOrder::default(),
    )
    .unwrap()
    .expect("reads the load");
    assert!(
        own.error.temperature.abs() < 1e-6 * 1000.0,
        "{}",
        own.reason
    );
}
