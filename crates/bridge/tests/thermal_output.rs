//! A lot's thermal-output curve already holds everything the grid's resistance does with
//! temperature on the matched material, its gauge factor's change included: the reading must
//! not scale it again by the gauge factor's drift. The expansion mismatch is a real strain and
//! is read at the gauge factor of the moment.

mod support;

use approx::assert_relative_eq;
use gw_bridge::temperature::thermal_sweep;
use gw_bridge::*;
use gw_mechanics::*;
use support::*;

/// Gauge-factor temperature coefficient large enough that counting it twice shows: 1 % over
/// 100 °C.
const DRIFT_PER_C: f64 = 1e-4;
const T_REF_C: f64 = 20.0;
const DT_C: f64 = 100.0;

fn curve(t: f64) -> f64 {
    -40e-6 + 2.5e-6 * t - 0.03e-6 * t * t
}

/// One grid on the cantilever with the curve above and the drift, of `gauge_factor`, the
/// curve recorded at `reference`, matched to `matched_cte_per_c` (the part is 11e-6 /°C).
fn grid_gauge(gauge_factor: f64, reference: Option<f64>, matched_cte_per_c: f64) -> PlacedGauge {
    let mut s = spec(GaugePattern::SingleGrid);
    s.gauge_factor = gauge_factor;
    s.gauge_factor_temp_coeff_per_c = DRIFT_PER_C;
    s.thermal_output.lot_polynomial = vec![-40e-6, 2.5e-6, -0.03e-6];
    s.thermal_output.reference_gauge_factor = reference;
    s.thermal_output.matched_cte_per_c = matched_cte_per_c;
    placed(s, "G1", Face::Top, 0.1, 0.0, 0.0)
}

/// A quarter bridge of that grid with ideal completion resistors, read at `gf_set`.
fn quarter_bridge(gf_set: f64) -> Bridge {
    let c = ArmElement::Completion(CompletionResistor {
        ohm: 350.0,
        tolerance: 0.0,
        tcr_per_c: 0.0,
    });
    let mut b = bridge([grid(0, 0), c, c, c], LoadComponent::VerticalForce, 1.0);
    b.instrument.gauge_factor = gf_set;
    b
}

fn reading_at_no_load(member: &Member, gauge: PlacedGauge, gf_set: f64, dt: f64) -> f64 {
    let gauges = [gauge];
    let model = BridgeModel::new(&setup(member, &gauges), &quarter_bridge(gf_set)).unwrap();
    let mut l = LoadVector::ZERO;
    l[LoadComponent::TemperatureChange] = dt;
    model.displayed(&l).unwrap()
}

#[test]
fn a_curve_read_at_its_reference_gauge_factor_reads_back_as_recorded_despite_gauge_factor_drift() {
    // Data-sheet convention (from memory): the curve is the strain indicated on the matched
    // material with the instrument at the curve's gauge factor, whatever the grid's factor did
    // with temperature meanwhile. Here −170 µε over 100 °C; the exact circuit adds the one-arm
    // nonlinearity, GF·ε/2 ≈ 1.7e-4 relative (Dally & Riley, ch. 7, from memory), so we allow
    // 5e-4. Counting the drift again would be 1 % off.
    let member = cantilever();
    let recorded = curve(T_REF_C + DT_C) - curve(T_REF_C);
    // Curve recorded at the grid's own factor (none stated), instrument at that factor.
    let g = grid_gauge(2.0, None, 11e-6);
    let r = reading_at_no_load(&member, g, 2.0, DT_C);
    assert_relative_eq!(r, recorded, max_relative = 5e-4);
    // Curve recorded at 2.00 on a lot of factor 2.10, instrument at the curve's 2.00.
    let g = grid_gauge(2.10, Some(2.00), 11e-6);
    let r = reading_at_no_load(&member, g, 2.00, DT_C);
    assert_relative_eq!(r, recorded, max_relative = 5e-4);
}

#[test]
fn the_expansion_mismatch_is_read_at_the_gauge_factor_of_the_moment_and_the_curve_is_not() {
    // A gauge matched to 16e-6 /°C on an 11e-6 /°C part: the mismatch −5e-6 × 100 °C = −500 µε
    // is a strain the grid really sees, so it reads at GF(T) = GF·(1 + 1e-4 × 100); the curve
    // adds as recorded. Tolerance: the one-arm nonlinearity, GF·ε/2 ≈ 7e-4 relative, so 1.5e-3;
    // scaling the curve too would be 1.7 µε (2.5e-3 relative) off, not scaling the mismatch
    // 5 µε.
    let member = cantilever();
    let g = grid_gauge(2.0, None, 16e-6);
    let mismatch = (11e-6 - 16e-6) * DT_C;
    let recorded = curve(T_REF_C + DT_C) - curve(T_REF_C);
    let expected = recorded + mismatch * (1.0 + DRIFT_PER_C * DT_C);
    let r = reading_at_no_load(&member, g, 2.0, DT_C);
    assert_relative_eq!(r, expected, max_relative = 1.5e-3);
    // The nonlinearity has a known sign and size for one arm: Vo/Vex = (δ/4)/(1 + δ/2), read
    // as 4 (Vo/Vex)/GF (Dally & Riley, ch. 7, from memory); with it the match is 1e-9.
    let delta = 2.0 * expected;
    let exact = 4.0 * (delta / 4.0) / (1.0 + delta / 2.0) / 2.0;
    assert_relative_eq!(r, exact, max_relative = 1e-9);
}

#[test]
fn the_thermal_sweep_shows_the_curve_as_recorded_and_the_mismatch_at_the_drifted_factor() {
    // The split of the sweep follows the same rule, and its parts add up to the exact circuit's
    // total (no leads here, so the remainder is the one-arm nonlinearity only).
    let member = cantilever();
    let gauges = [grid_gauge(2.0, None, 16e-6)];
    let model = BridgeModel::new(&setup(&member, &gauges), &quarter_bridge(2.0)).unwrap();
    let sweep = thermal_sweep(&model, 0.0, DT_C, 1, &LoadVector::ZERO).unwrap();
    let last = sweep.last().unwrap();
    let recorded = curve(T_REF_C + DT_C) - curve(T_REF_C);
    let mismatch = (11e-6 - 16e-6) * DT_C * (1.0 + DRIFT_PER_C * DT_C);
    assert_relative_eq!(last.gauge_thermal_output, recorded, max_relative = 1e-12);
    assert_relative_eq!(last.expansion_mismatch, mismatch, max_relative = 1e-12);
    let parts = last.gauge_thermal_output + last.expansion_mismatch;
    assert_relative_eq!(last.total, parts, max_relative = 1.5e-3);
}
