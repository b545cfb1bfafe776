//! Numbers as the report prints them: always finite ("—" where a value is absent or cannot be
//! computed), with a unit, and loads scaled to a readable prefix.

use gw_bridge::units::si;

/// What the report prints where a value is absent.
pub(super) const ABSENT: &str = "—";

/// `v` with `decimals` decimals, or "—".
pub(super) fn fixed(v: f64, decimals: usize) -> String {
    if v.is_finite() {
        // A rounded zero prints without a sign.
        let s = format!("{v:.decimals$}");
        if s.trim_start_matches('-')
            .chars()
            .all(|c| c == '0' || c == '.')
        {
            s.trim_start_matches('-').to_owned()
        } else {
            s
        }
    } else {
        ABSENT.to_owned()
    }
}

/// `v` with `digits` significant digits in plain notation, or "—".
pub(super) fn significant(v: f64, digits: usize) -> String {
    if !v.is_finite() {
        return ABSENT.to_owned();
    }
    if v == 0.0 {
        return "0".to_owned();
    }
    let magnitude = v.abs().log10().floor() as i64;
    let decimals = (digits as i64 - 1 - magnitude).clamp(0, 12) as usize;
    fixed(v, decimals)
}

/// `v ± u` with `decimals` decimals each, or "—".
pub(super) fn plus_minus(v: f64, u: f64, decimals: usize) -> String {
    if v.is_finite() && u.is_finite() {
        format!("{} ± {}", fixed(v, decimals), fixed(u, decimals))
    } else if v.is_finite() {
        fixed(v, decimals)
    } else {
        ABSENT.to_owned()
    }
}

/// A quantity in SI with a prefix ("2.00 kN"), or "—".
pub(super) fn quantity(v: f64, unit: &str) -> String {
    if v.is_finite() {
        si(v, unit)
    } else {
        ABSENT.to_owned()
    }
}

/// A percentage difference of `measured` from `predicted`, or "—" when the prediction is
/// zero or absent.
pub(super) fn difference_percent(measured: f64, predicted: f64) -> String {
    if !(measured.is_finite() && predicted.is_finite()) || predicted.abs() < 1e-12 {
        return ABSENT.to_owned();
    }
    let d = (measured - predicted) / predicted.abs() * 100.0;
    let s = fixed(d, 1);
    if d > 0.0 && s != "0.0" {
        format!("+{s} %")
    } else {
        format!("{s} %")
    }
}

/// A display scale for values of `unit` up to `largest` in magnitude: the factor to multiply
/// SI values by and the prefixed unit ("kN").
pub(super) fn scale_for(largest: f64, unit: &str) -> (f64, String) {
    if matches!(unit, "" | "°C" | "s") || !largest.is_finite() {
        return (1.0, unit.to_owned());
    }
    let (factor, prefix) = match largest.abs() {
        a if a >= 1e9 => (1e-9, "G"),
        a if a >= 1e6 => (1e-6, "M"),
        a if a >= 1e3 => (1e-3, "k"),
        a if a >= 1.0 || a == 0.0 => (1.0, ""),
        a if a >= 1e-3 => (1e3, "m"),
        _ => (1e6, "µ"),
    };
    (factor, format!("{prefix}{unit}"))
}

/// The index and value of the sample of largest magnitude (finite samples only).
pub(super) fn peak(values: &[f64]) -> Option<(usize, f64)> {
    values
        .iter()
        .copied()
        .enumerate()
        .filter(|(_, v)| v.is_finite())
        .max_by(|a, b| a.1.abs().total_cmp(&b.1.abs()))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn absent_values_print_as_a_dash_and_zero_has_no_sign() {
        assert_eq!(fixed(f64::NAN, 2), ABSENT);
        assert_eq!(fixed(-0.0001, 2), "0.00");
        assert_eq!(significant(0.000_123_456, 3), "0.000123");
        assert_eq!(significant(1234.6, 3), "1235");
        assert_eq!(plus_minus(1.0, f64::INFINITY, 1), "1.0");
        assert_eq!(difference_percent(1.02, 1.0), "+2.0 %");
        assert_eq!(difference_percent(1.0, 0.0), ABSENT);
        assert_eq!(scale_for(6000.0, "N"), (1e-3, "kN".to_owned()));
        assert_eq!(peak(&[1.0, f64::NAN, -3.0, 2.0]), Some((2, -3.0)));
    }
}
