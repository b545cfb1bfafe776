//! The coverage factor of a GUM budget comes from the budget (JCGM 100:2008, Annex G), not a
//! fixed k = 2: checked against the standard's tables and worked example, and against Monte
//! Carlo of the same model (JCGM 101:2008).

use approx::assert_relative_eq;
use gw_bridge::uncertainty::{
    COVERAGE_PROBABILITY, CoverageMethod, InputQuantity, gum, monte_carlo,
};

fn sum(x: &[f64]) -> f64 {
    x.iter().sum()
}

#[test]
fn a_pure_rectangle_covers_ninety_five_percent_at_root_three_times_ninety_five_hundredths() {
    // JCGM 100:2008, G.1.3 and G.2.3: a rectangular output of half-width a holds p of its
    // values within ±p·a, so k_p = p·√3 (1.65 for 95 %).
    let inputs = [InputQuantity::rectangular("only", "", 0.0, 2.0)];
    let b = gum(&inputs, &sum, 0.95).unwrap();
    assert_eq!(b.coverage_method, CoverageMethod::DominantRectangular);
    assert_relative_eq!(b.coverage_factor, 0.95 * 3f64.sqrt(), max_relative = 1e-9);
    assert_relative_eq!(b.expanded, 0.95 * 2.0, max_relative = 1e-9);
}

#[test]
fn ten_degrees_of_freedom_give_the_t_factor_of_the_table() {
    // JCGM 100:2008, Table G.2 (t_p(ν) for p = 68.27, 90, 95, 95.45, 99, 99.73 %): at ν = 10,
    // 2.23 for 95 % and 2.28 for 95.45 %.
    let inputs =
        [InputQuantity::normal("repeated readings", "", 0.0, 1.0).with_degrees_of_freedom(10.0)];
    let b = gum(&inputs, &sum, 0.95).unwrap();
    assert_eq!(b.coverage_method, CoverageMethod::StudentT);
    assert_eq!(b.effective_degrees_of_freedom, Some(10.0));
    assert!(
        (b.coverage_factor - 2.23).abs() < 0.005,
        "{}",
        b.coverage_factor
    );
    let b = gum(&inputs, &sum, 0.9545).unwrap();
    assert!(
        (b.coverage_factor - 2.28).abs() < 0.005,
        "{}",
        b.coverage_factor
    );
    // ν = 1: 12.71 at 95 % (same table).
    let inputs = [InputQuantity::normal("two readings", "", 0.0, 1.0).with_degrees_of_freedom(1.0)];
    let b = gum(&inputs, &sum, 0.95).unwrap();
    assert!(
        (b.coverage_factor - 12.71).abs() < 0.005,
        "{}",
        b.coverage_factor
    );
}

#[test]
fn the_end_gauge_example_reproduces_its_effective_degrees_of_freedom_and_expanded_uncertainty() {
    // JCGM 100:2008, H.1 (calibration of an end gauge), Table H.1 and H.1.6, values as printed
    // (nm): contributions 25 (ν = 18), 9.7 (ν = 25.6), 2.9 (ν = 50) and 16.6 (ν = 2) give
    // uc = 32 nm and ν_eff = 16.7; truncated to 16, t₉₉(16) = 2.92 and U₉₉ = 93 nm.
    let inputs = [
        InputQuantity::normal("calibration of the standard", "nm", 0.0, 25.0)
            .with_degrees_of_freedom(18.0),
        InputQuantity::normal("measured difference", "nm", 0.0, 9.7).with_degrees_of_freedom(25.6),
        InputQuantity::normal("difference in expansion", "nm", 0.0, 2.9)
            .with_degrees_of_freedom(50.0),
        InputQuantity::normal("difference in temperature", "nm", 0.0, 16.6)
            .with_degrees_of_freedom(2.0),
    ];
    let b = gum(&inputs, &sum, 0.99).unwrap();
    assert!((b.combined - 32.0).abs() < 0.5, "{}", b.combined);
    let nu = b.effective_degrees_of_freedom.unwrap();
    // The printed contributions are rounded to two or three figures: ±0.1.
    assert!((nu - 16.7).abs() < 0.1, "{nu}");
    assert!(
        (b.coverage_factor - 2.92).abs() < 0.005,
        "{}",
        b.coverage_factor
    );
    assert!((b.expanded - 93.0).abs() < 1.0, "{}", b.expanded);
    // The measured difference's own ν = 25.6 comes from its three parts the same way
    // (H.1.3.2 and H.1.3.3: 5.8 nm, ν = 24; 3.9 nm, ν = 5; 6.7 nm, ν = 8); within 1 % of
    // the printed value, given the rounding.
    let parts = [
        InputQuantity::normal("repeated observations", "nm", 0.0, 5.8)
            .with_degrees_of_freedom(24.0),
        InputQuantity::normal("random effects of the comparator", "nm", 0.0, 3.9)
            .with_degrees_of_freedom(5.0),
        InputQuantity::normal("systematic effects of the comparator", "nm", 0.0, 6.7)
            .with_degrees_of_freedom(8.0),
    ];
    let d = gum(&parts, &sum, 0.95).unwrap();
    assert_relative_eq!(
        d.effective_degrees_of_freedom.unwrap(),
        25.6,
        max_relative = 0.01
    );
}

#[test]
fn monte_carlo_of_a_rectangle_dominated_model_matches_the_coverage_factor_not_two() {
    // JCGM 101:2008, 7.7 (probabilistically symmetric coverage interval) against JCGM 100:2008,
    // G.6.5: a ±1 rectangle with two small normal inputs. With 400 000 trials the half-width
    // of the 95 % interval is known to about 0.1 %; we allow 1 %. k = 2 would be 13 % wide.
    let inputs = [
        InputQuantity::rectangular("tolerance", "", 0.0, 1.0),
        InputQuantity::normal("a", "", 0.0, 0.15),
        InputQuantity::normal("b", "", 0.0, 0.15),
    ];
    let f = |x: &[f64]| x[0] + x[1] - x[2];
    let b = gum(&inputs, &f, COVERAGE_PROBABILITY).unwrap();
    assert_eq!(b.coverage_method, CoverageMethod::DominantRectangular);
    let mc = monte_carlo(&inputs, &f, 400_000, 23, 40);
    let half_width = 0.5 * (mc.interval_95.1 - mc.interval_95.0);
    assert_relative_eq!(b.expanded, half_width, max_relative = 0.01);
    assert!(
        (2.0 * b.combined - half_width).abs() > 0.1 * half_width,
        "k = 2 would agree too: the model is not rectangle-dominated enough"
    );
    assert!(
        b.coverage_text()
            .contains("one rectangular input dominates")
    );
}

#[test]
fn monte_carlo_of_a_model_of_normal_inputs_matches_the_normal_factor() {
    // The other side of the criterion: three comparable inputs, one of them rectangular, are
    // close to normal, and the t route (ν infinite: 1.96, JCGM 100:2008, Table G.1) matches
    // Monte Carlo within 1 %.
    let inputs = [
        InputQuantity::rectangular("tolerance", "", 0.0, 1.0),
        InputQuantity::normal("a", "", 0.0, 0.8),
        InputQuantity::normal("b", "", 0.0, 0.8),
    ];
    let b = gum(&inputs, &sum, COVERAGE_PROBABILITY).unwrap();
    assert_eq!(b.coverage_method, CoverageMethod::StudentT);
    assert_relative_eq!(b.coverage_factor, 1.96, max_relative = 1e-3);
    let mc = monte_carlo(&inputs, &sum, 400_000, 29, 40);
    let half_width = 0.5 * (mc.interval_95.1 - mc.interval_95.0);
    assert_relative_eq!(b.expanded, half_width, max_relative = 0.01);
}

#[test]
fn degrees_of_freedom_that_are_not_positive_are_refused_naming_the_input() {
    for nu in [0.0, -3.0, f64::NAN, f64::NEG_INFINITY] {
        let inputs = [
            InputQuantity::normal("ok", "", 0.0, 1.0),
            InputQuantity::normal("repeated readings", "", 0.0, 1.0).with_degrees_of_freedom(nu),
        ];
        let e = gum(&inputs, &sum, COVERAGE_PROBABILITY).unwrap_err();
        let text = e.to_string();
        assert!(
            text.contains("degrees of freedom of \"repeated readings\""),
            "{text}"
        );
    }
}
