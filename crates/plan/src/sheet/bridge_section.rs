//! One bridge on the build sheet: its settings, wiring, and the values a technician checks
//! the installation against.

use gw_bridge::margins::MarginStatus;
use gw_bridge::units::si;

use super::writer::{BODY, Writer};
use super::{load, load_per, um, wiring_diagram};
use crate::connector::{Pinout, pin_number, shunt_place_words};
use crate::document::{BridgePlan, LeadColours, Part, Project};
use crate::evaluate::BridgeEvaluation;
use crate::units::{Quantity, Units, fixed_text};

/// The zero reading expected with the part unloaded, in words for a table cell: the
/// statistical band (root-sum-square of the arms' tolerances) and the worst case, mV/V.
pub(crate) fn zero_expected(be: &BridgeEvaluation) -> String {
    let z = &be.zero_band;
    format!(
        "{:.3} ±\u{a0}{:.3} (k\u{a0}=\u{a0}{:.0}); worst case {:.3} to {:.3}",
        z.centre_mv_per_v,
        z.statistical_mv_per_v,
        z.coverage_k,
        z.worst_low_mv_per_v,
        z.worst_high_mv_per_v
    )
}

/// The zero check in full: both bands, how they were formed, and a note when either takes
/// more than the project's chosen fraction of full scale.
fn zero_words(be: &BridgeEvaluation) -> String {
    let z = &be.zero_band;
    let mut s = format!(
        "Zero with the part unloaded: {} mV/V expected with every element at its nominal \
         value and the leads in place. Statistical band ±\u{a0}{:.3}\u{a0}mV/V: each arm's resistance \
         tolerance taken as a rectangular distribution and combined root-sum-square, coverage \
         factor k = {:.0} (about 95 % for a near-normal sum; GUM, JCGM 100:2008, 4.3.7 and \
         G). Worst case, every arm at the tolerance limit that pushes zero furthest: {} to \
         {} mV/V.",
        fixed_text(z.centre_mv_per_v, 3),
        z.statistical_mv_per_v,
        z.coverage_k,
        fixed_text(z.worst_low_mv_per_v, 3),
        fixed_text(z.worst_high_mv_per_v, 3)
    );
    if let Some(note) = z.note() {
        s.push(' ');
        s.push_str(&note);
    }
    s
}

/// The wanted load per mV/V of output, in words.
fn conversion_words(be: &BridgeEvaluation, units: Units) -> String {
    match be.wanted_per_mv_per_v {
        Some(k) => format!(
            "Conversion to engineering units: {} per mV/V of output (the wanted load divided by \
             the output, from the bridge's sensitivity on this part).",
            load_per(units, be.wanted, k)
        ),
        None => "Conversion to engineering units: none, the bridge does not respond to the \
                 wanted load on this part."
            .to_owned(),
    }
}

/// Resistivity of annealed copper at 20 °C, Ω·mm²/m (IEC 60028: 1/58).
const COPPER_OHM_MM2_PER_M: f64 = 1.0 / 58.0;

/// The lead wire: length, resistance per metre (or foot) and the copper size that gives it
/// (cross-section in mm², or the nearest AWG number in US customary units).
fn lead_words(plan: &BridgePlan, units: Units) -> String {
    let l = &plan.lead;
    let area_mm2 = COPPER_OHM_MM2_PER_M / l.ohm_per_m;
    let size = match units {
        _ if !(l.ohm_per_m > 0.0 && area_mm2.is_finite()) => String::new(),
        Units::Si => format!(", about {area_mm2:.2} mm² if copper (IEC 60028 resistivity)"),
        Units::UsCustomary => format!(
            ", about {} AWG if copper (IEC 60028 resistivity, ASTM B258 sizes)",
            awg(area_mm2)
        ),
    };
    // Ohms per display length unit of cable: the cable length's scale turns metres into feet.
    let per_length = l.ohm_per_m / units.to_display(Quantity::CableLength, 1.0);
    format!(
        "{} per conductor, {per_length:.4} Ω/{}{size}",
        units.format(Quantity::CableLength, l.length_m),
        units.label(Quantity::CableLength)
    )
}

/// The American Wire Gauge number nearest a copper cross-section: diameter
/// d = 0.127 mm × 92^((36 − n)/39) (ASTM B258), solved for n.
fn awg(area_mm2: f64) -> i32 {
    let d_mm = (4.0 * area_mm2 / std::f64::consts::PI).sqrt();
    (36.0 - 39.0 * (d_mm / 0.127).ln() / 92f64.ln()).round() as i32
}

/// The instrument settings of a bridge, as rows of a two-column table.
fn settings_rows(be: &BridgeEvaluation, plan: &BridgePlan, units: Units) -> Vec<Vec<String>> {
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
        vec!["Lead wire".to_owned(), lead_words(plan, units)],
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
            // Four significant figures: 4.000, 2.584 (a Poisson arrangement).
            crate::units::Units::Si.format_number(crate::units::Quantity::Plain, be.bridge_factor),
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
fn case_rows(part: &Part, be: &BridgeEvaluation, units: Units) -> Vec<Vec<String>> {
    let mut rows = vec![
        [
            "Load case",
            "Wanted load",
            "Output",
            "Displayed",
            "Of which temperature",
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
            .map(|l| {
                format!(
                    "{} {}",
                    be.wanted.name(),
                    load(units, be.wanted, l.value(be.wanted))
                )
            })
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
            format!("{} mV/V", fixed_text(c.reading.mv_per_v, 4)),
            um(c.reading.displayed_strain),
            um(c.from_temperature_strain),
            um(c.reading.target_strain),
            accuracy,
        ]);
    }
    rows
}

/// The shunt check in words: the resistor, where it goes, and what to expect.
fn shunt_words(be: &BridgeEvaluation, plan: &BridgePlan, colours: &LeadColours) -> Option<String> {
    let s = be.shunt.as_ref()?;
    let at = shunt_place_words(plan, colours)?;
    // What the instrument displays back to the bridge's output: displayed strain =
    // 4 (Vo/Vex) / (gauge factor × bridge factor), the instrument's own conversion.
    let mv_per_v =
        s.expected_reading_strain * be.gauge_factor_setting * be.bridge_factor / 4.0 * 1e3;
    let sign = if s.expected_reading_strain < 0.0 {
        "negative: the shunt lowers that arm's resistance, as compression would"
    } else {
        "positive: the shunt lowers that arm's resistance, and the arm sits on the side of the \
         bridge where that raises the output"
    };
    Some(format!(
        "Shunt calibration: {} (E96) {at}; expect {} ({mv_per_v:.4} mV/V; {sign}).",
        si(s.e96_ohm, "Ω"),
        um(s.expected_reading_strain)
    ))
}

/// The resistance between each pair of pins, lowest pin numbers first.
fn pin_rows(pins: &Pinout, resistances: &[(String, f64)]) -> Vec<Vec<String>> {
    let mut keyed: Vec<((usize, usize), Vec<String>)> = resistances
        .iter()
        .map(|(name, r)| {
            let (a, b) = name.split_once(" to ").unwrap_or((name, name));
            let (pa, pb) = (
                pin_number(a.trim()).unwrap_or(usize::MAX),
                pin_number(b.trim()).unwrap_or(usize::MAX),
            );
            let words = if pa <= pb {
                pins.pair_words(name)
            } else {
                pins.pair_words(&format!("{} to {}", b.trim(), a.trim()))
            };
            (
                (pa.min(pb), pa.max(pb)),
                vec![words.unwrap_or_else(|| name.clone()), format!("{r:.2} Ω")],
            )
        })
        .collect();
    keyed.sort_by_key(|(k, _)| *k);
    keyed.into_iter().map(|(_, row)| row).collect()
}

/// Everything about one bridge.
pub(crate) fn draw(
    w: &mut Writer,
    project: &Project,
    part: &Part,
    be: &BridgeEvaluation,
    plan: &BridgePlan,
) {
    let units = w.units;
    w.room(330.0);
    w.heading(&format!(
        "Bridge \"{}\", channel {}",
        be.name, be.channel_number
    ));
    w.table(&[1.0, 2.0], &settings_rows(be, plan, units));
    wiring_diagram::draw_plan(w, project, part, plan);
    w.subheading(&format!(
        "Expected readings: channel {}, {}",
        be.channel_number, be.name
    ));
    w.table(
        &[1.2, 1.5, 1.0, 0.9, 1.0, 0.9, 1.0],
        &case_rows(part, be, units),
    );
    if be
        .cases
        .iter()
        .any(|c| c.from_temperature_strain.abs() > 0.05e-6)
    {
        w.para(
            BODY,
            false,
            "Displayed: what the instrument shows when zeroed at the reference temperature and \
             read with the part at the case's temperature change; its share is in the column \
             beside. The conversion to engineering units below applies to the reading less that \
             share: subtract it only when the bridge was zeroed at the reference temperature and \
             the part is at the case's temperature; otherwise zero the bridge at the test \
             temperature and subtract nothing. The accuracy lines count the share as error.",
        );
    }
    for a in &be.accuracy {
        w.para(
            BODY,
            a.margin.status != MarginStatus::Pass,
            &format!(
                "Accuracy, {}: {} — {}.",
                a.case,
                a.describe(be.wanted, units),
                a.margin.status.word()
            ),
        );
    }
    w.para(BODY, false, &conversion_words(be, units));
    let pins = Pinout::for_bridge(plan, &project.lead_colours);
    let zero = zero_words(be);
    let shunt = shunt_words(be, plan, &project.lead_colours);
    let mut rows = vec![vec![
        "Between (instrument disconnected)".to_owned(),
        "Expect".to_owned(),
    ]];
    rows.extend(pin_rows(&pins, &be.pin_resistances));
    // The checks stay together on one page.
    let height = 30.0
        + w.para_height(BODY, false, &zero)
        + shunt
            .as_deref()
            .map_or(0.0, |s| w.para_height(BODY, false, s))
        + w.table_height(&[2.0, 1.0], &rows, BODY);
    w.room(height);
    w.subheading(&format!(
        "Checks before the first test: channel {}, {}",
        be.channel_number, be.name
    ));
    w.para(BODY, false, &zero);
    if let Some(s) = &shunt {
        w.para(BODY, false, s);
    }
    w.table(&[2.0, 1.0], &rows);
}
