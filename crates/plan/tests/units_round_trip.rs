//! Display-unit conversions: every quantity survives SI → US customary → SI, and the
//! conversions agree with NIST SP 811 (2008), Appendix B.8/B.9 factors.

use gw_plan::units::{Quantity, Units};
use proptest::prelude::*;

fn close(a: f64, b: f64, rel: f64) -> bool {
    (a - b).abs() <= rel * a.abs().max(b.abs()).max(1e-300)
}

proptest! {
    #[test]
    fn us_display_and_back_returns_the_si_value(
        index in 0..Quantity::ALL.len(),
        mantissa in -1.0f64..1.0,
        exponent in -9i32..10,
    ) {
        let q = Quantity::ALL[index];
        let si = mantissa * 10f64.powi(exponent);
        for units in [Units::UsCustomary, Units::Si] {
            let back = units.from_display(q, units.to_display(q, si));
            // Temperatures carry an offset: compare against the larger of the value and it.
            let scale = si.abs().max(if q.has_offset() { 32.0 } else { 0.0 });
            prop_assert!(
                (back - si).abs() <= 1e-12 * scale.max(f64::MIN_POSITIVE),
                "{q:?} in {units:?}: {si} came back as {back}"
            );
        }
    }
}

/// One SI unit of `q` expressed in the US display unit, from NIST SP 811 Appendix B.8:
/// "to convert from <US unit> to <SI unit> multiply by" — so one SI unit is 1 / factor.
fn us_display_of(q: Quantity, si: f64) -> f64 {
    Units::UsCustomary.to_display(q, si)
}

#[test]
fn conversions_match_nist_sp_811_appendix_b() {
    // (quantity, SI value of one US display unit, NIST SP 811 B.8 factor, its tolerance)
    let cases = [
        // inch to metre: 2.54 E-02 (exact)
        (Quantity::Length, 2.54e-2, 1e-15),
        // foot to metre: 3.048 E-01 (exact)
        (Quantity::CableLength, 3.048e-1, 1e-15),
        // pound-force to newton: 4.448 222 E+00
        (Quantity::Force, 4.448_222, 1e-6),
        // pound-force per inch to newton per metre: 1.751 268 E+02
        (Quantity::ForcePerLength, 1.751_268e2, 1e-6),
        // pound-force inch to newton metre: 1.129 848 E-01
        (Quantity::Moment, 1.129_848e-1, 1e-6),
        // pound-force per square inch (psi) to pascal: 6.894 757 E+03
        (Quantity::Pressure, 6.894_757e3, 1e-6),
        // kip per square inch (ksi) to pascal: 6.894 757 E+06
        (Quantity::Stress, 6.894_757e6, 1e-6),
        // 10^6 psi to pascal: 6.894 757 E+09 (from the psi factor)
        (Quantity::Modulus, 6.894_757e9, 1e-6),
        // watt per square inch to watt per square metre: 1.550 003 E+03
        (Quantity::PowerDensity, 1.550_003e3, 1e-6),
    ];
    for (q, si_of_one, tol) in cases {
        let shown = us_display_of(q, si_of_one);
        assert!(
            close(shown, 1.0, tol),
            "{q:?}: one US unit shows as {shown}"
        );
    }
}

#[test]
fn temperatures_follow_nist_sp_811_b9() {
    // NIST SP 811 B.9: t/°C = (t/°F − 32)/1.8; a temperature interval: ΔT/K = ΔT/°F / 1.8.
    let us = Units::UsCustomary;
    for (c, f) in [
        (-10.0, 14.0),
        (40.0, 104.0),
        (0.0, 32.0),
        (100.0, 212.0),
        (-40.0, -40.0),
    ] {
        assert!(
            close(us.to_display(Quantity::Temperature, c), f, 1e-12),
            "{c} °C"
        );
        assert!(close(us.from_display(Quantity::Temperature, f), c, 1e-12));
    }
    assert!(us.from_display(Quantity::Temperature, 32.0).abs() < 1e-12);
    // A change of 50 °C is a change of 90 °F, with no offset.
    assert!(close(
        us.to_display(Quantity::TemperatureChange, 50.0),
        90.0,
        1e-12
    ));
    // 10 ppm/°C of expansion is 10/1.8 ppm/°F (per degree, scaled by the interval ratio).
    assert!(close(
        us.to_display(Quantity::ExpansionCoefficient, 10e-6),
        10.0 / 1.8,
        1e-12
    ));
    assert_eq!(us.label(Quantity::Temperature), "°F");
    assert_eq!(us.label(Quantity::ExpansionCoefficient), "ppm/°F");
    assert_eq!(us.label(Quantity::PowerDensity), "W/in²");
}

#[test]
fn field_precision_has_no_trailing_noise() {
    // 18.09 mm and 450 mm in the display resolution.
    assert_eq!(Units::Si.format(Quantity::Length, 0.01809), "18.09 mm");
    assert_eq!(
        Units::UsCustomary.format(Quantity::Length, 0.45),
        "17.717 in"
    );
    assert_eq!(Units::Si.format(Quantity::Length, 0.0), "0 mm");
}
