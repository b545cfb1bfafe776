//! Numbers in their units for messages and explanations.

/// A value in an SI unit with a decimal prefix and four significant figures ("12.35 kN").
/// Temperatures and plain numbers keep no prefix; a value that is not a number says so.
pub fn si(value: f64, unit: &str) -> String {
    if !value.is_finite() {
        return format!("not computable {unit}").trim_end().to_owned();
    }
    let prefixed = !matches!(unit, "" | "°C");
    let (scale, prefix) = match value.abs() {
        a if !prefixed || a == 0.0 => (1.0, ""),
        a if a >= 1e9 => (1e9, "G"),
        a if a >= 1e6 => (1e6, "M"),
        a if a >= 1e3 => (1e3, "k"),
        a if a >= 1.0 => (1.0, ""),
        a if a >= 1e-3 => (1e-3, "m"),
        _ => (1e-6, "µ"),
    };
    let scaled = value / scale;
    let decimals = match scaled.abs() {
        a if a >= 100.0 => 1,
        a if a >= 10.0 => 2,
        _ => 3,
    };
    format!("{scaled:.decimals$} {prefix}{unit}")
        .trim_end()
        .to_owned()
}

#[cfg(test)]
mod tests {
    use super::si;

    #[test]
    fn prefixes_follow_the_magnitude() {
        assert_eq!(si(12_345.0, "N"), "12.35 kN");
        assert_eq!(si(0.0123, "N·m"), "12.30 mN·m");
        assert_eq!(si(2.5e6, "Pa"), "2.500 MPa");
        assert_eq!(si(-40.0, "°C"), "-40.00 °C");
        assert_eq!(si(f64::NAN, "N"), "not computable N");
    }
}
