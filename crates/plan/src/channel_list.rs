//! The acquisition channel list as CSV, from the evaluation.

use std::fmt::Write;

use crate::evaluate::Evaluation;

fn field(s: &str) -> String {
    if s.contains([',', '"', '\n']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_owned()
    }
}

/// One line per bridge: channel, bridge, part, arrangement, excitation, instrument gauge factor
/// and bridge factor, conversion (µε per mV/V), shunt value and its expected reading, and the
/// expected reading (mV/V and µε) at every load case of the part.
pub fn channel_list_csv(ev: &Evaluation) -> String {
    let mut out = String::new();
    let _ = writeln!(
        out,
        "channel,part,bridge,arrangement,excitation_v,gauge_factor_setting,bridge_factor,\
         microstrain_per_mv_per_v,shunt_ohm,shunt_arm,shunt_expected_microstrain,load_case,\
         expected_mv_per_v,expected_microstrain"
    );
    for part in &ev.parts {
        for b in &part.bridges {
            // Displayed strain = 4 (Vo/Vex) / (GF · bridge factor): µε per mV/V.
            let microstrain_per_mv_per_v = 4000.0 / (b.gauge_factor_setting * b.bridge_factor);
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
                    "{},{},{},{},{:.3},{:.3},{:.4},{:.3},{},{},{},{},{:.4},{:.1}",
                    b.channel_number,
                    field(&part.name),
                    field(&b.name),
                    field(&b.arrangement),
                    b.excitation_v,
                    b.gauge_factor_setting,
                    b.bridge_factor,
                    microstrain_per_mv_per_v,
                    shunt_ohm,
                    shunt_arm,
                    shunt_reading,
                    field(&c.case),
                    c.reading.mv_per_v,
                    c.reading.displayed_strain * 1e6
                );
            }
        }
    }
    out
}
