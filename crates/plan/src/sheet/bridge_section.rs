//! One bridge on the build sheet: its settings, wiring, and the values a technician checks
//! the installation against.

use gw_bridge::margins::MarginStatus;
use gw_bridge::units::si;

use super::writer::{BODY, Writer};
use super::{um, wiring_diagram};
use crate::document::{BridgePlan, Part, Project};
use crate::evaluate::BridgeEvaluation;

/// The zero reading expected with the part unloaded, in words for a table cell.
pub(crate) fn zero_expected(be: &BridgeEvaluation) -> String {
    format!(
        "{:.3} ± {:.3} (worst case)",
        be.zero_band.centre_mv_per_v,
        be.zero_band.worst_half_width_mv_per_v()
    )
}

/// The instrument settings of a bridge, as rows of a two-column table.
fn settings_rows(be: &BridgeEvaluation, plan: &BridgePlan) -> Vec<Vec<String>> {
    let mut rows = vec![
        vec!["Setting".to_owned(), "Value".to_owned()],
        vec!["Measures".to_owned(), be.wanted.name().to_owned()],
        vec![
            "Arrangement".to_owned(),
            if be.arrangement.is_empty() {
                "custom".to_owned()
            } else {
                be.arrangement.clone()
            },
        ],
        vec!["Lead wiring".to_owned(), be.wiring.clone()],
        vec![
            "Excitation".to_owned(),
            format!("{:.2} V at the bridge", be.excitation_v),
        ],
        vec![
            "Gauge factor set on the instrument".to_owned(),
            format!("{:.3}", be.gauge_factor_setting),
        ],
        vec![
            "Bridge factor".to_owned(),
            format!("{:.4}", be.bridge_factor),
        ],
        vec![
            "Gain, input range".to_owned(),
            format!(
                "{:.0}, ±{:.1} V",
                plan.signal.gain, plan.signal.input_range_v
            ),
        ],
    ];
    if let Some(o) = &plan.bridge_factor_override {
        rows.push(vec![
            "Bridge factor set by hand".to_owned(),
            if o.reason.trim().is_empty() {
                "no reason given".to_owned()
            } else {
                o.reason.clone()
            },
        ]);
    }
    rows
}

/// Readings per load case: the wanted load, the output, what the instrument displays, and
/// the accuracy check where one is asked for.
fn case_rows(part: &Part, be: &BridgeEvaluation) -> Vec<Vec<String>> {
    let unit = be.wanted.unit();
    let mut rows = vec![
        [
            "Load case",
            "Wanted load",
            "Output",
            "Displayed",
            "Target strain",
            "Required accuracy",
        ]
        .map(String::from)
        .to_vec(),
    ];
    for c in &be.cases {
        let load = part
            .load_cases
            .iter()
            .find(|l| l.name == c.case)
            .map(|l| si(l.value(be.wanted), unit))
            .unwrap_or_default();
        let accuracy = be
            .accuracy
            .iter()
            .find(|a| a.case == c.case)
            .map(|a| a.margin.status.word().to_owned())
            .unwrap_or_else(|| "none stated".to_owned());
        rows.push(vec![
            c.case.clone(),
            load,
            format!("{:.4} mV/V", c.reading.mv_per_v),
            um(c.reading.displayed_strain),
            um(c.reading.target_strain),
            accuracy,
        ]);
    }
    rows
}

/// The shunt check in words: the resistor, where it goes, and what to expect.
fn shunt_words(be: &BridgeEvaluation, plan: &BridgePlan) -> Option<String> {
    let s = be.shunt.as_ref()?;
    Some(format!(
        "Shunt calibration: {:.0} Ω (E96) across arm {} at the {}; expect {}.",
        s.e96_ohm,
        s.arm + 1,
        match plan.shunt.map(|p| p.location) {
            Some(gw_bridge::ShuntLocation::GaugeEnd) => "gauge",
            _ => "instrument",
        },
        um(s.expected_reading_strain)
    ))
}

/// Everything about one bridge.
pub(crate) fn draw(
    w: &mut Writer,
    project: &Project,
    part: &Part,
    be: &BridgeEvaluation,
    plan: &BridgePlan,
) {
    w.room(330.0);
    w.heading(&format!(
        "Bridge \"{}\", channel {}",
        be.name, be.channel_number
    ));
    w.table(&[1.0, 2.0], &settings_rows(be, plan));
    wiring_diagram::draw(w, project, part, be, &plan.arms);
    w.subheading("Expected readings");
    w.table(&[1.3, 1.1, 1.1, 1.0, 1.0, 1.1], &case_rows(part, be));
    for a in &be.accuracy {
        w.para(
            BODY,
            a.margin.status != MarginStatus::Pass,
            &format!(
                "Accuracy, {}: {} — {}.",
                a.case,
                a.describe(be.wanted.unit()),
                a.margin.status.word()
            ),
        );
    }
    w.subheading("Checks before the first test");
    w.para(
        BODY,
        false,
        &format!("Zero with the part unloaded: {} mV/V.", zero_expected(be)),
    );
    if let Some(s) = shunt_words(be, plan) {
        w.para(BODY, true, &s);
    }
    let mut rows = vec![vec![
        "Between (instrument disconnected)".to_owned(),
        "Expect".to_owned(),
    ]];
    for (name, r) in &be.pin_resistances {
        rows.push(vec![name.clone(), format!("{r:.2} Ω")]);
    }
    w.table(&[2.0, 1.0], &rows);
}
