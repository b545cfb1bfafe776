//! The build sheet converts a reading to the wanted load with one factor per bridge. A load
//! case that also warms the part adds an apparent strain the factor must not convert: the
//! reading less its temperature share, times the factor, is the case's wanted load.

use gw_mechanics::LoadComponent;
use gw_plan::demo::demo_project;
use gw_plan::{EvalOptions, evaluate};

#[test]
fn the_reading_less_its_temperature_share_converts_to_the_wanted_load() {
    let p = demo_project();
    let ev = evaluate(&p, &EvalOptions::default());
    let mut warmed = 0;
    for pe in &ev.parts {
        let part = &p.parts[pe.part_index];
        for be in &pe.bridges {
            let Some(factor) = be.wanted_per_mv_per_v else {
                continue;
            };
            // A rosette grid's channel reports its grid's strain from every load (the arm's
            // axial force too), so the conversion to one load is for the load bridges only.
            let strain_channel = part.bridges.iter().any(|b| {
                b.name == be.name && b.recovery == gw_plan::document::LoadRecovery::LeftOut
            });
            if strain_channel {
                continue;
            }
            for c in &be.cases {
                let case = part.load_cases.iter().find(|l| l.name == c.case).unwrap();
                let wanted = case.value(be.wanted);
                if case.value(LoadComponent::TemperatureChange) != 0.0 {
                    assert!(c.from_temperature_strain != 0.0, "{} {}", be.name, c.case);
                    warmed += 1;
                } else {
                    assert_eq!(c.from_temperature_strain, 0.0);
                }
                // Displayed strain back to mV/V by the instrument's own rule,
                // ε = 4 (Vo/Vex) / (k · bridge factor).
                let share_mv_per_v =
                    c.from_temperature_strain * be.gauge_factor_setting * be.bridge_factor / 4.0
                        * 1e3;
                let inferred = (c.reading.mv_per_v - share_mv_per_v) * factor;
                assert!(
                    (inferred - wanted).abs() <= 0.01 * wanted.abs(),
                    "{} {}: {inferred} from the reading less its temperature share, {wanted} applied",
                    be.name,
                    c.case
                );
            }
        }
    }
    assert!(warmed > 0, "the demo has a case that warms a bridge's part");
}
