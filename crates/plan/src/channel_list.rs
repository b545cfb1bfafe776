//! The acquisition channel list as CSV, from the evaluation.

use std::fmt::Write;

use gw_mechanics::LoadComponent;

use crate::evaluate::Evaluation;
use crate::units::{Quantity, Units};

fn field(s: &str) -> String {
    if s.contains([',', '"', '\n']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_owned()
    }
}

/// Six significant digits, without an exponent (loads per mV/V run from mN to MPa).
fn significant(value: f64) -> String {
    let magnitude = if value == 0.0 {
        0
    } else {
        value.abs().log10().floor() as i32
    };
    let decimals = (5 - magnitude).clamp(0, 12) as usize;
    format!("{value:.decimals$}")
}

/// Four decimals, without a minus sign on a value that rounds to zero.
fn four_decimals(value: f64) -> String {
    let text = format!("{value:.4}");
    if text
        .trim_start_matches('-')
        .chars()
        .all(|c| c == '0' || c == '.')
    {
        text.trim_start_matches('-').to_owned()
    } else {
        text
    }
}

/// One line per bridge: channel, bridge, part, arrangement, excitation, instrument gauge factor
/// and bridge factor, conversion (µε per mV/V), the wanted load per mV/V in its unit (empty when
/// the bridge does not respond to it), the zero reading expected at no load with its statistical
/// ± (at the stated coverage factor) and worst-case limits (mV/V), whether the load per mV/V is
/// predicted or from an in-place calibration, shunt value and its expected
/// reading, and the expected reading (mV/V and µε) at every load case of the part with the
/// share of it the case's temperature change causes (µε; the conversion applies to the rest).
///
/// The wanted load per mV/V is in the load's SI unit (N, N·m, Pa, °C), as `wanted_unit` says.
pub fn channel_list_csv(ev: &Evaluation) -> String {
    channel_list_csv_in(ev, Units::Si)
}

/// The unit the channel list gives a wanted load in, with its size per SI unit: the SI unit
/// itself (N, Pa: what acquisition software takes), or the US customary display unit.
fn wanted_unit(units: Units, c: LoadComponent) -> (f64, &'static str) {
    match units {
        Units::Si => (1.0, c.unit()),
        Units::UsCustomary => {
            let q = Quantity::of(c);
            (units.scale_to_display(q, 1.0), units.label(q))
        }
    }
}

/// [`channel_list_csv`] with the wanted load per mV/V in `units` (SI units as there; US
/// customary: lbf, lbf·in, psi, ksi, °F per mV/V). Strains stay µε and outputs mV/V.
pub fn channel_list_csv_in(ev: &Evaluation, units: Units) -> String {
    let mut out = String::new();
    let _ = writeln!(
        out,
        "channel,part,bridge,arrangement,excitation_v,gauge_factor_setting,bridge_factor,\
         microstrain_per_mv_per_v,wanted_load,wanted_unit,wanted_per_mv_per_v,zero_mv_per_v,\
         zero_statistical_mv_per_v,zero_coverage_k,zero_worst_low_mv_per_v,\
         zero_worst_high_mv_per_v,sensitivity_source,shunt_ohm,shunt_arm,shunt_expected_microstrain,load_case,\
         expected_mv_per_v,expected_microstrain,from_temperature_microstrain"
    );
    for part in &ev.parts {
        for b in &part.bridges {
            // Displayed strain = 4 (Vo/Vex) / (GF · bridge factor): µε per mV/V.
            let microstrain_per_mv_per_v = 4000.0 / (b.gauge_factor_setting * b.bridge_factor);
            let (scale, unit) = wanted_unit(units, b.wanted);
            let wanted_per_mv_per_v = b
                .channel_load_per_mv_per_v()
                .map(|k| significant(k * scale))
                .unwrap_or_default();
            let source = match &b.calibration {
                Some(_) => "in-place calibration",
                None => "predicted",
            };
            let z = &b.zero_band;
            let zero = [
                four_decimals(z.centre_mv_per_v),
                four_decimals(z.statistical_mv_per_v),
                format!("{}", z.coverage_k),
                four_decimals(z.worst_low_mv_per_v),
                four_decimals(z.worst_high_mv_per_v),
                source.to_owned(),
            ]
            .join(",");
            let (shunt_ohm, shunt_arm, shunt_reading) = match &b.shunt {
                Some(s) => (
                    format!("{:.0}", s.e96_ohm),
                    format!("{}", s.arm + 1),
                    format!("{:.1}", s.expected_reading_strain * 1e6),
                ),
                None => (String::new(), String::new(), String::new()),
            };
            for c in &b.cases {
                let _ = writeln!(
                    out,
                    "{},{},{},{},{:.3},{:.3},{:.4},{:.3},{},{},{},{},{},{},{},{},{:.4},{:.1},{:.1}",
                    b.channel_number,
                    field(&part.name),
                    field(&b.name),
                    field(&b.arrangement),
                    b.excitation_v,
                    b.gauge_factor_setting,
                    b.bridge_factor,
                    microstrain_per_mv_per_v,
                    field(b.wanted.name()),
                    field(unit),
                    wanted_per_mv_per_v,
                    zero,
                    shunt_ohm,
                    shunt_arm,
                    shunt_reading,
                    field(&c.case),
                    c.reading.mv_per_v,
                    c.reading.displayed_strain * 1e6,
                    c.from_temperature_strain * 1e6
                );
            }
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::{four_decimals, significant};

    #[test]
    fn a_value_that_rounds_to_zero_has_no_minus_sign() {
        assert_eq!(four_decimals(-1e-9), "0.0000");
        assert_eq!(four_decimals(-0.00012), "-0.0001");
        assert_eq!(four_decimals(0.92684), "0.9268");
    }

    #[test]
    fn six_significant_digits_whatever_the_size() {
        assert_eq!(significant(7692.307692), "7692.31");
        assert_eq!(significant(-0.001234567), "-0.00123457");
        assert_eq!(significant(1.5e8), "150000000");
        assert_eq!(significant(0.0), "0.00000");
    }
}
