//! Check-out: each value the technician recorded after installation compared with what the plan
//! expects, with a verdict and, where it is off, the likely cause in words.
//!
//! Acceptance limits are common practice for static measurements with bonded foil gauges:
//! - grid resistance within the gauge's resistance tolerance (a pass), up to three times it
//!   (check: a grid strained in bonding, or the meter's own leads not nulled), beyond (fail);
//! - insulation at least 1 GΩ at no more than 50 V (pass), 100 MΩ to 1 GΩ (check), below
//!   (fail);
//! - a zero inside the worst-case band (pass), within twice its half-width (check), beyond
//!   (fail);
//! - zero drift after the bridge has warmed up within 5 µε (pass), 20 µε (check);
//! - a shunt step within 0.5 % of the expected step (pass), 2 % (check), beyond or of the
//!   wrong sign (fail);
//! - a lead within 10 % of its planned resistance (pass), longer (check).

use std::fmt::Write;

use gw_plan::document::{BridgePlan, Part, PlanArm, Project};
use gw_plan::evaluate::{BridgeEvaluation, Evaluation};
use gw_plan::installation::{BridgeRecord, GridRecord};
use gw_plan::marked::{mark, render};
use gw_plan::units::{Quantity, Units};
use serde::Serialize;

/// Insulation at or above which a grid or a wired bridge passes, Ω (1 GΩ at ≤ 50 V, common
/// practice; the build sheet asks for the same).
pub const INSULATION_PASS_OHM: f64 = 1e9;
/// Insulation below which it fails, Ω (common practice).
pub const INSULATION_FAIL_OHM: f64 = 1e8;
/// A shunt step within this fraction of the expected step passes (common practice).
pub const SHUNT_PASS_FRACTION: f64 = 0.005;
/// A shunt step within this fraction of the expected step is to be checked (common practice).
pub const SHUNT_CHECK_FRACTION: f64 = 0.02;
/// Zero drift that passes, strain (common practice).
pub const DRIFT_PASS_STRAIN: f64 = 5e-6;
/// Zero drift above which the bridge fails, strain (common practice).
pub const DRIFT_FAIL_STRAIN: f64 = 20e-6;
/// A lead within this fraction of its planned resistance passes (common practice).
pub const LEAD_PASS_FRACTION: f64 = 0.1;

/// The outcome of one comparison.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Serialize)]
pub enum Verdict {
    /// Nothing was recorded for it.
    NotRecorded,
    /// Within the expected band.
    Pass,
    /// Outside the band but not clearly a fault: look again before testing.
    Check,
    /// A fault to find and put right before testing.
    Fail,
}

impl Verdict {
    /// The word shown beside the value.
    pub fn word(self) -> &'static str {
        match self {
            Verdict::NotRecorded => "not recorded",
            Verdict::Pass => "pass",
            Verdict::Check => "check",
            Verdict::Fail => "FAIL",
        }
    }
}

/// One recorded value against its expectation.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ItemCheck {
    /// What was measured: "A1 grid 1 resistance", "zero", "shunt step".
    pub quantity: String,
    /// The expected value and band, in words with units.
    pub expected: String,
    /// The recorded value with its unit ("—" when not recorded).
    pub measured: String,
    /// The verdict.
    pub verdict: Verdict,
    /// Why it is off and what to do, in words (empty on a pass).
    pub cause: String,
    /// `expected` and `cause` with their lengths marked for either unit system
    /// ([`gw_plan::marked`]), where they hold any.
    #[serde(skip)]
    pub marked: Option<(String, String)>,
}

impl ItemCheck {
    /// The expected value in a unit system.
    pub fn expected_in(&self, units: Units) -> String {
        match &self.marked {
            Some((expected, _)) => render(expected, units),
            None => self.expected.clone(),
        }
    }

    /// The cause in a unit system.
    pub fn cause_in(&self, units: Units) -> String {
        match &self.marked {
            Some((_, cause)) => render(cause, units),
            None => self.cause.clone(),
        }
    }
}

/// Every check of one channel (a bridge with the grids in its arms).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ChannelCheck {
    /// Part name.
    pub part: String,
    /// Bridge name.
    pub bridge: String,
    /// Acquisition channel number.
    pub channel: u32,
    /// The checks, grids first.
    pub items: Vec<ItemCheck>,
}

impl ChannelCheck {
    /// The worst verdict among the recorded items; `NotRecorded` when nothing was recorded.
    pub fn verdict(&self) -> Verdict {
        self.items
            .iter()
            .map(|i| i.verdict)
            .max()
            .unwrap_or(Verdict::NotRecorded)
    }

    /// The causes of the items that are not a pass, joined.
    pub fn summary(&self) -> String {
        let causes: Vec<&str> = self
            .items
            .iter()
            .filter(|i| matches!(i.verdict, Verdict::Check | Verdict::Fail))
            .map(|i| i.cause.as_str())
            .collect();
        causes.join(" ")
    }
}

/// The check-out of every channel of the project.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Checkout {
    /// One entry per evaluated bridge, in channel order.
    pub channels: Vec<ChannelCheck>,
}

impl Checkout {
    /// True when any channel fails.
    pub fn has_failures(&self) -> bool {
        self.channels.iter().any(|c| c.verdict() == Verdict::Fail)
    }

    /// True when nothing at all was recorded.
    pub fn is_unrecorded(&self) -> bool {
        self.channels
            .iter()
            .all(|c| c.verdict() == Verdict::NotRecorded)
    }

    /// A plain-text table: one block per channel with its items.
    pub fn text(&self) -> String {
        let mut out = String::from("Verdict per channel:\n");
        for c in &self.channels {
            let _ = writeln!(
                out,
                "  ch{:<3} {:<13} {} / {}",
                c.channel,
                c.verdict().word(),
                c.part,
                c.bridge
            );
        }
        out.push_str("\nEach value recorded:\n");
        for c in &self.channels {
            let _ = writeln!(
                out,
                "channel {} — {} / {}: {}",
                c.channel,
                c.part,
                c.bridge,
                c.verdict().word()
            );
            for i in &c.items {
                let _ = write!(
                    out,
                    "  {:<12} {:<34} measured {:<16} expected {}",
                    i.verdict.word(),
                    i.quantity,
                    i.measured,
                    i.expected
                );
                if i.cause.is_empty() {
                    out.push('\n');
                } else {
                    let _ = writeln!(out, "\n               {}", i.cause);
                }
            }
        }
        out
    }
}

/// Every evaluated bridge with its part and its plan, in plan order.
pub fn evaluated_bridges<'a>(
    project: &'a Project,
    ev: &'a Evaluation,
) -> impl Iterator<Item = (&'a Part, &'a BridgePlan, &'a BridgeEvaluation)> + 'a {
    ev.parts.iter().flat_map(move |pe| {
        let part = project.parts.get(pe.part_index);
        pe.bridges
            .iter()
            .zip(&pe.bridge_indices)
            .filter_map(move |(be, &bi)| {
                let part = part?;
                Some((part, part.bridges.get(bi)?, be))
            })
    })
}

/// Compares the project's records with the plan's expectations.
pub fn check_out(project: &Project, ev: &Evaluation) -> Checkout {
    let mut channels: Vec<ChannelCheck> = evaluated_bridges(project, ev)
        .map(|(part, plan, be)| channel_check(project, part, plan, be))
        .collect();
    // In channel order, as the technician works through the instrument.
    channels.sort_by_key(|c| c.channel);
    Checkout { channels }
}

fn channel_check(
    project: &Project,
    part: &Part,
    plan: &BridgePlan,
    be: &BridgeEvaluation,
) -> ChannelCheck {
    let mut items = Vec::new();
    let mut seen: Vec<(String, usize)> = Vec::new();
    for arm in &plan.arms {
        let PlanArm::Grid { gauge, grid } = arm else {
            continue;
        };
        if seen.contains(&(gauge.clone(), *grid)) {
            continue;
        }
        seen.push((gauge.clone(), *grid));
        let spec = part
            .gauges
            .iter()
            .find(|g| &g.id == gauge)
            .and_then(|g| g.resolve(&project.gauge_stock))
            .map(|g| g.spec);
        let record = project.records.grid(gauge, *grid);
        if let Some(spec) = spec {
            let label = format!("{gauge} grid {grid}");
            items.push(grid_resistance(
                &label,
                spec.resistance_ohm,
                spec.resistance_tolerance,
                record,
            ));
            items.push(insulation(
                &format!("{label} insulation"),
                record.and_then(|r| r.insulation_ohm),
            ));
        }
    }
    let record = project.records.bridge(&plan.name);
    items.push(lead_check(plan, record));
    items.push(insulation(
        "bridge insulation",
        record.and_then(|r| r.insulation_ohm),
    ));
    items.push(zero_check(plan, be, record));
    items.push(drift_check(be, record));
    // A bridge without a planned shunt has no step to record.
    if be.shunt.is_some() {
        items.push(shunt_check(plan, be, record));
    }
    ChannelCheck {
        part: part.name.clone(),
        bridge: plan.name.clone(),
        channel: plan.channel,
        items,
    }
}

fn unrecorded(quantity: &str, expected: String) -> ItemCheck {
    ItemCheck {
        quantity: quantity.to_owned(),
        expected,
        measured: "—".to_owned(),
        verdict: Verdict::NotRecorded,
        cause: String::new(),
        marked: None,
    }
}

/// Grid resistance at its tabs against the nominal and its tolerance.
pub fn grid_resistance(
    label: &str,
    nominal_ohm: f64,
    tolerance: f64,
    record: Option<&GridRecord>,
) -> ItemCheck {
    let quantity = format!("{label} resistance");
    let expected = format!("{nominal_ohm:.1} Ω ± {:.2} %", tolerance * 100.0);
    let Some(measured) = record.and_then(|r| r.resistance_ohm) else {
        return unrecorded(&quantity, expected);
    };
    let off = (measured - nominal_ohm) / nominal_ohm;
    let (verdict, cause) = if !measured.is_finite() || measured > 20.0 * nominal_ohm {
        (
            Verdict::Fail,
            "An open grid: a broken grid line or a tab lifted from its solder. Replace the \
             gauge."
                .to_owned(),
        )
    } else if measured < 0.1 * nominal_ohm {
        (
            Verdict::Fail,
            "A shorted grid: a solder bridge across the tabs or the grid touching the part \
             through a damaged carrier. Find the short or replace the gauge."
                .to_owned(),
        )
    } else if off.abs() <= tolerance {
        (Verdict::Pass, String::new())
    } else if off.abs() <= 3.0 * tolerance {
        (
            Verdict::Check,
            format!(
                "{:+.2} % from nominal: a grid strained while bonding, heat from soldering, or \
                 the meter's own lead resistance not nulled. Measure again at the tabs.",
                off * 100.0
            ),
        )
    } else {
        (
            Verdict::Fail,
            format!(
                "{:+.1} % from nominal: a damaged grid or a gauge of another nominal \
                 resistance. Check the packet and replace the gauge.",
                off * 100.0
            ),
        )
    };
    ItemCheck {
        quantity,
        expected,
        measured: format!("{measured:.1} Ω"),
        verdict,
        cause,
        marked: None,
    }
}

/// Insulation to the part against 1 GΩ.
fn insulation(quantity: &str, measured: Option<f64>) -> ItemCheck {
    let expected = format!("≥ {:.0} GΩ at ≤ 50 V", INSULATION_PASS_OHM / 1e9);
    let Some(ohm) = measured else {
        return unrecorded(quantity, expected);
    };
    let (verdict, cause) = if ohm >= INSULATION_PASS_OHM {
        (Verdict::Pass, String::new())
    } else if ohm >= INSULATION_FAIL_OHM {
        (
            Verdict::Check,
            "Low insulation: moisture under the coating or a poorly bonded gauge. Dry the \
             installation, measure again, and watch the zero for drift."
                .to_owned(),
        )
    } else {
        (
            Verdict::Fail,
            "Insulation far too low: a poorly bonded or damaged gauge, moisture, or a lead \
             touching the part. The zero will drift; find the path before testing."
                .to_owned(),
        )
    };
    ItemCheck {
        quantity: quantity.to_owned(),
        expected,
        measured: format_ohm(ohm),
        verdict,
        cause,
        marked: None,
    }
}

fn format_ohm(ohm: f64) -> String {
    if ohm >= 1e9 {
        format!("{:.1} GΩ", ohm / 1e9)
    } else if ohm >= 1e6 {
        format!("{:.0} MΩ", ohm / 1e6)
    } else if ohm >= 1e3 {
        format!("{:.1} kΩ", ohm / 1e3)
    } else {
        format!("{ohm:.2} Ω")
    }
}

/// One lead conductor against the planned length × resistance per metre.
fn lead_check(plan: &BridgePlan, record: Option<&BridgeRecord>) -> ItemCheck {
    let planned = plan.lead.length_m * plan.lead.ohm_per_m;
    let expected_marked = format!(
        "{planned:.2} Ω ({} at {})",
        mark(Quantity::CableLength, plan.lead.length_m),
        mark(Quantity::ResistancePerLength, plan.lead.ohm_per_m)
    );
    let expected = render(&expected_marked, Units::Si);
    let Some(measured) = record.and_then(|r| r.lead_ohm) else {
        let mut item = unrecorded("lead resistance (one conductor)", expected);
        item.marked = Some((expected_marked, String::new()));
        return item;
    };
    let off = if planned > 0.0 {
        (measured - planned) / planned
    } else {
        0.0
    };
    let (verdict, cause) = if off.abs() <= LEAD_PASS_FRACTION || planned <= 0.0 {
        (Verdict::Pass, String::new())
    } else if off > 0.0 {
        let length = if plan.lead.ohm_per_m > 0.0 {
            measured / plan.lead.ohm_per_m
        } else {
            0.0
        };
        (
            Verdict::Check,
            format!(
                "Leads longer than planned (about {}) or of thinner wire: the bridge reads \
                 lower by the extra lead resistance, and more so on a two-wire bridge. Correct \
                 the span with the shunt step, or update the lead in the plan.",
                mark(Quantity::CableLength, length)
            ),
        )
    } else {
        (
            Verdict::Check,
            "Leads shorter than planned or of heavier wire: update the lead in the plan so the \
             expected shunt step and zero are right."
                .to_owned(),
        )
    };
    ItemCheck {
        quantity: "lead resistance (one conductor)".to_owned(),
        expected,
        measured: format!("{measured:.2} Ω"),
        verdict,
        cause: render(&cause, Units::Si),
        marked: Some((expected_marked, cause)),
    }
}

/// Resistance ratios of the nominal values a technician may fit by mistake (common nominal
/// grid and completion values, common practice).
const NOMINAL_OHMS: [f64; 4] = [120.0, 350.0, 1000.0, 5000.0];

/// The zero against its worst-case band, with the likely cause of a large offset.
fn zero_check(
    plan: &BridgePlan,
    be: &BridgeEvaluation,
    record: Option<&BridgeRecord>,
) -> ItemCheck {
    let z = &be.zero_band;
    let expected = format!(
        "{:.3} mV/V, worst case {:.3} to {:.3} mV/V",
        z.centre_mv_per_v, z.worst_low_mv_per_v, z.worst_high_mv_per_v
    );
    let Some(zero) = record.and_then(|r| r.zero_mv_per_v) else {
        return unrecorded("zero", expected);
    };
    let half = z.worst_half_width_mv_per_v().max(1e-6);
    let offset = zero - z.centre_mv_per_v;
    let (verdict, cause) = if zero >= z.worst_low_mv_per_v && zero <= z.worst_high_mv_per_v {
        (Verdict::Pass, String::new())
    } else if offset.abs() <= 2.0 * half {
        (
            Verdict::Check,
            "Zero just outside its worst-case band: a grid strained while bonding, a \
             completion resistor out of tolerance, or the part not fully unloaded. Read again \
             unloaded; zero electrically if it holds steady."
                .to_owned(),
        )
    } else {
        (Verdict::Fail, zero_fault_words(plan, be, offset))
    };
    ItemCheck {
        quantity: "zero".to_owned(),
        expected,
        measured: format!("{zero:.3} mV/V"),
        verdict,
        cause,
        marked: None,
    }
}

/// Words for a large zero offset: the arm whose resistance change explains it best, if any.
/// An equal-arm bridge with one arm at r times its nominal reads ±1000 (r − 1) / (2 (1 + r))
/// mV/V (the exact divider equation), the sign that of the arm's side of the output.
fn zero_fault_words(plan: &BridgePlan, be: &BridgeEvaluation, offset_mv_per_v: f64) -> String {
    let sens = be.zero_band.arm_sensitivities_mv_per_v;
    let mut best: Option<(f64, String)> = None;
    for (k, arm) in plan.arms.iter().enumerate() {
        let sign = sens[k].signum();
        if sign == 0.0 {
            continue;
        }
        let arm_nominal = match arm {
            PlanArm::Completion(c) => c.ohm,
            _ => continue,
        };
        for &fitted in &NOMINAL_OHMS {
            if (fitted - arm_nominal).abs() < 1e-9 {
                continue;
            }
            let r = fitted / arm_nominal;
            let predicted = sign * 1000.0 * (r - 1.0) / (2.0 * (1.0 + r));
            let miss = (offset_mv_per_v - predicted).abs() / predicted.abs();
            if miss < 0.1 && best.as_ref().is_none_or(|(m, _)| miss < *m) {
                best = Some((
                    miss,
                    format!(
                        "A wrong completion resistor: the offset is what a {fitted:.0} Ω \
                         resistor gives in arm {} where the plan has {arm_nominal:.0} Ω. Check \
                         its value.",
                        k + 1
                    ),
                ));
            }
        }
    }
    if let Some((_, words)) = best {
        return words;
    }
    if offset_mv_per_v.abs() > 100.0 {
        return "An open or shorted arm (a broken lead, a lifted tab or a solder bridge): the \
                offset is of the size a missing or bridged arm gives. Check each arm's resistance \
                at the connector."
            .to_owned();
    }
    "Zero far outside its band: a damaged or overstrained grid, an arm of the wrong nominal \
     value, or the part preloaded. Check each arm's resistance at the connector."
        .to_owned()
}

/// How far the zero moved between the first reading and one after warm-up.
fn drift_check(be: &BridgeEvaluation, record: Option<&BridgeRecord>) -> ItemCheck {
    let per_mv_per_v = strain_per_mv_per_v(be);
    let expected = format!(
        "within {:.0} µε ({:.4} mV/V)",
        DRIFT_PASS_STRAIN * 1e6,
        DRIFT_PASS_STRAIN / per_mv_per_v.abs().max(1e-12)
    );
    let (Some(first), Some(again)) = (
        record.and_then(|r| r.zero_mv_per_v),
        record.and_then(|r| r.zero_again_mv_per_v),
    ) else {
        return unrecorded("zero drift after warm-up", expected);
    };
    let drift = (again - first) * per_mv_per_v;
    let (verdict, cause) = if drift.abs() <= DRIFT_PASS_STRAIN {
        (Verdict::Pass, String::new())
    } else {
        (
            if drift.abs() <= DRIFT_FAIL_STRAIN {
                Verdict::Check
            } else {
                Verdict::Fail
            },
            "The zero drifts: a poorly bonded or not fully cured gauge, moisture (see the \
             insulation), or self-heating at this excitation. Let it settle and read again; \
             if it keeps moving, rebond."
                .to_owned(),
        )
    };
    ItemCheck {
        quantity: "zero drift after warm-up".to_owned(),
        expected,
        measured: format!("{:.1} µε", drift * 1e6),
        verdict,
        cause,
        marked: None,
    }
}

/// Displayed strain per mV/V of the bridge: 4 / (GF · bridge factor) × 10⁻³.
pub fn strain_per_mv_per_v(be: &BridgeEvaluation) -> f64 {
    4e-3 / (be.gauge_factor_setting * be.bridge_factor)
}

/// The shunt step against the expected one; its sign tells swapped arms.
fn shunt_check(
    plan: &BridgePlan,
    be: &BridgeEvaluation,
    record: Option<&BridgeRecord>,
) -> ItemCheck {
    let Some(shunt) = &be.shunt else {
        return ItemCheck {
            quantity: "shunt step".to_owned(),
            expected: "no shunt planned".to_owned(),
            measured: "—".to_owned(),
            verdict: Verdict::NotRecorded,
            cause: String::new(),
            marked: None,
        };
    };
    let expected_strain = shunt.expected_reading_strain;
    let expected = format!(
        "{:.1} µε ({:.0} Ω across arm {})",
        expected_strain * 1e6,
        shunt.e96_ohm,
        shunt.arm + 1
    );
    let Some(step) = record.and_then(|r| r.shunt_step_strain) else {
        return unrecorded("shunt step", expected);
    };
    let ratio = step / expected_strain;
    let (verdict, cause) = if (ratio - 1.0).abs() <= SHUNT_PASS_FRACTION {
        (Verdict::Pass, String::new())
    } else if ratio < 0.0 && (ratio + 1.0).abs() <= 0.1 {
        (
            Verdict::Fail,
            "The shunt step has the wrong sign: two arms are swapped (the shunted arm sits on \
             the other side of the output), the output leads are reversed, or the shunt went \
             across an adjacent arm. Check the arms against the wiring diagram."
                .to_owned(),
        )
    } else if ratio.abs() < 0.05 {
        (
            Verdict::Fail,
            "No shunt step: the shunt resistor did not connect, or it went across pins that \
             hold no arm. Check the pins named on the sheet."
                .to_owned(),
        )
    } else if (ratio - 1.0).abs() <= SHUNT_CHECK_FRACTION {
        (
            Verdict::Check,
            format!(
                "Shunt step {:+.2} % from expected: {} or a shunt resistor off its value. The \
                 measured step can correct the span.",
                (ratio - 1.0) * 100.0,
                lead_words(plan, ratio)
            ),
        )
    } else {
        (
            Verdict::Fail,
            format!(
                "Shunt step {:+.1} % from expected: the shunt on the wrong arm or an arm of \
                 another nominal value, a gauge-factor or bridge-factor setting that differs \
                 from the plan, or {}.",
                (ratio - 1.0) * 100.0,
                lead_words(plan, ratio)
            ),
        )
    };
    ItemCheck {
        quantity: "shunt step".to_owned(),
        expected,
        measured: format!("{:.1} µε", step * 1e6),
        verdict,
        cause,
        marked: None,
    }
}

fn lead_words(plan: &BridgePlan, ratio: f64) -> &'static str {
    match (ratio < 1.0, plan.wiring) {
        (true, gw_bridge::LeadWiring::TwoWire) => "leads longer than planned",
        (true, _) => "leads longer than planned (when shunting at the instrument)",
        (false, _) => "leads shorter than planned",
    }
}
