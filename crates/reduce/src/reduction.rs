//! A logged test reduced against the plan: each channel's reading in mV/V, its zero taken off,
//! its span corrected by the recorded shunt step, turned into displayed strain and into the
//! wanted load (through the in-place calibration where the plan holds one); each three-grid rosette read by three channels reduced to principal strains,
//! stresses, angle and maximum shear with the transverse-sensitivity correction; the part's
//! loads recovered from several bridges with the plan's recovery matrix; and, where the log
//! carries the applied loads from a reference, what the plan predicts for each of them.

use gw_bridge::GaugePattern;
use gw_mechanics::LoadComponent;
use gw_plan::document::{Part, PlanArm, Project};
use gw_plan::evaluate::{BridgeEvaluation, Evaluation, PartEvaluation};
use serde::Serialize;

use crate::checkout::strain_per_mv_per_v;
use crate::log::{ColumnUnit, LogColumn, TestLog};
use crate::rosette_series::{RosetteSeries, rosette_series};

/// Where each channel's zero comes from. Default: the start of the log.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub enum ZeroFrom {
    /// The mean of the samples in the first `seconds` of the log (at least one sample): the
    /// part must be unloaded when logging starts.
    LogStart {
        /// Length of the zero window, s.
        seconds: f64,
    },
    /// The zero recorded at check-out (the log start may be loaded).
    Records,
    /// No zero is taken off.
    None,
}

impl Default for ZeroFrom {
    fn default() -> Self {
        ZeroFrom::LogStart { seconds: 1.0 }
    }
}

/// How a log is reduced.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize)]
pub struct ReduceOptions {
    /// Where the zero comes from.
    pub zero: ZeroFrom,
}

/// A shunt step further than this from the expected one is taken for a fault, not a span
/// error, and is not used to correct the span (common practice).
pub const SPAN_CORRECTION_LIMIT: f64 = 0.05;

/// One channel of the log, reduced.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ChannelSeries {
    /// Part name.
    pub part: String,
    /// Bridge name.
    pub bridge: String,
    /// Channel number.
    pub channel: u32,
    /// Header of the log column it came from.
    pub column: String,
    /// The load the bridge measures.
    pub wanted: LoadComponent,
    /// The reading as logged, converted to mV/V (no zero, no span correction).
    pub raw_mv_per_v: Vec<f64>,
    /// The zero taken off, mV/V.
    pub zero_mv_per_v: f64,
    /// Factor applied to the zeroed reading (expected shunt step / recorded step; 1 when none).
    pub span_factor: f64,
    /// Where the span factor came from, in words.
    pub span_source: String,
    /// The zeroed, span-corrected reading, mV/V.
    pub mv_per_v: Vec<f64>,
    /// Displayed strain per mV/V: 4 / (gauge-factor setting × bridge factor) × 10⁻³.
    pub strain_per_mv_per_v: f64,
    /// Displayed strain (plan's gauge-factor setting and bridge factor), m/m.
    pub strain: Vec<f64>,
    /// The wanted load, SI unit, when the bridge responds to it (not for a channel left out of
    /// the load recovery, such as a rosette grid: it reports a strain).
    pub load: Option<Vec<f64>>,
    /// Wanted load per mV/V used (in-place calibration if the plan holds one, else predicted).
    pub load_per_mv_per_v: Option<f64>,
    /// The in-place calibration's load per mV/V over the predicted one (1 without a
    /// calibration): the load recovery, built on the predicted sensitivities, takes the
    /// channel's strain times this factor.
    pub calibration_factor: f64,
    /// What the plan predicts the zeroed reading to be under the applied loads, mV/V, when the
    /// log carries them.
    pub predicted_mv_per_v: Option<Vec<f64>>,
}

/// An applied load from a reference column of the log.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct AppliedLoad {
    /// Part name.
    pub part: String,
    /// Component.
    pub component: LoadComponent,
    /// Header of the column.
    pub column: String,
    /// Values, SI unit of the component.
    pub values: Vec<f64>,
}

/// Loads of one part recovered from several bridges.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RecoveredLoads {
    /// Part name.
    pub part: String,
    /// Bridges used, in the order of the recovery matrix's columns.
    pub bridges: Vec<String>,
    /// Components recovered.
    pub components: Vec<LoadComponent>,
    /// One series per component, SI unit.
    pub values: Vec<Vec<f64>>,
}

/// A whole log reduced.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Reduction {
    /// Time of each sample, s.
    pub time_s: Vec<f64>,
    /// Channels matched to bridges of the plan.
    pub channels: Vec<ChannelSeries>,
    /// Applied loads from reference columns.
    pub applied: Vec<AppliedLoad>,
    /// Rosettes read by three channels.
    pub rosettes: Vec<RosetteSeries>,
    /// Loads recovered per part.
    pub recovered: Vec<RecoveredLoads>,
    /// What was left out and why.
    pub notes: Vec<String>,
}

impl Reduction {
    /// The channel of bridge `bridge`.
    pub fn channel(&self, bridge: &str) -> Option<&ChannelSeries> {
        self.channels.iter().find(|c| c.bridge == bridge)
    }

    /// The applied load of `component` on `part`.
    pub fn applied_load(&self, part: &str, component: LoadComponent) -> Option<&AppliedLoad> {
        self.applied
            .iter()
            .find(|a| a.part == part && a.component == component)
    }
}

/// Why a log cannot be reduced against the plan.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum ReduceError {
    /// Two columns feed the same bridge.
    #[error("columns \"{first}\" and \"{second}\" both name bridge \"{bridge}\"; keep one")]
    DuplicateChannel {
        /// First column.
        first: String,
        /// Second column.
        second: String,
        /// Bridge.
        bridge: String,
    },
    /// A load column names no component of the plan, or several parts carry it.
    #[error("column \"{column}\": {why}")]
    LoadColumn {
        /// Column header.
        column: String,
        /// What is wrong and the way out.
        why: String,
    },
    /// No column matched a bridge of the plan.
    #[error(
        "no column of the log names a bridge of the plan; head each reading column with the \
         bridge's name or its channel as \"ch<number>\" (for example \"ch1 [mV/V]\")"
    )]
    NoChannels,
}

/// The bridge a column names: its channel as "ch3", "channel 3" or "ch3 anything", or its
/// name (case-insensitive).
fn bridge_for_column<'e>(
    name: &str,
    ev: &'e Evaluation,
) -> Option<(&'e PartEvaluation, &'e BridgeEvaluation)> {
    let lower = name.trim().to_lowercase();
    let channel = lower
        .strip_prefix("channel")
        .or_else(|| lower.strip_prefix("ch"))
        .map(str::trim_start)
        .and_then(|rest| {
            let digits: String = rest.chars().take_while(char::is_ascii_digit).collect();
            digits.parse::<u32>().ok()
        });
    ev.parts.iter().find_map(|pe| {
        pe.bridges
            .iter()
            .find(|b| match channel {
                Some(n) => b.channel_number == n,
                None => b.name.to_lowercase() == lower,
            })
            .map(|b| (pe, b))
    })
}

/// The part and component a load column names: "[applied] [<part>:] <component>".
fn load_for_column(
    column: &LogColumn,
    project: &Project,
    si_unit: &str,
) -> Result<(String, LoadComponent), ReduceError> {
    let header = column.name.trim();
    let (part_name, component_name) = match header.split_once(':') {
        Some((p, c)) => (Some(p.trim()), c.trim()),
        None => (None, header),
    };
    let component_name = component_name.to_lowercase();
    let component_name = component_name
        .strip_prefix("applied ")
        .unwrap_or(&component_name)
        .trim();
    let err = |why: String| ReduceError::LoadColumn {
        column: column.name.clone(),
        why,
    };
    let Some(component) = LoadComponent::ALL
        .into_iter()
        .find(|c| c.name() == component_name)
    else {
        let names: Vec<&str> = LoadComponent::ALL.iter().map(|c| c.name()).collect();
        return Err(err(format!(
            "\"{component_name}\" is not a load component; use one of: {}",
            names.join(", ")
        )));
    };
    if component.unit() != si_unit {
        return Err(err(format!(
            "a {} is in {}, not {si_unit}; state a unit of that kind",
            component.name(),
            component.unit()
        )));
    }
    let carriers: Vec<&Part> = project
        .parts
        .iter()
        .filter(|p| part_name.is_none_or(|n| p.name.eq_ignore_ascii_case(n)))
        .filter(|p| p.member.components().contains(&component))
        .collect();
    match carriers.as_slice() {
        [one] => Ok((one.name.clone(), component)),
        [] => Err(err(match part_name {
            Some(n) => format!("no part named \"{n}\" carries a {}", component.name()),
            None => format!("no part of the plan carries a {}", component.name()),
        })),
        _ => Err(err(format!(
            "several parts carry a {}; name the part first, as \"<part>: {}\"",
            component.name(),
            component.name()
        ))),
    }
}

/// The log column's values in mV/V of the bridge.
fn to_mv_per_v(column: &LogColumn, be: &BridgeEvaluation) -> Vec<f64> {
    let factor = match column.unit {
        ColumnUnit::MvPerV => 1.0,
        // Stored in volts whether written in V or mV.
        ColumnUnit::Volt => 1e3 / be.excitation_v,
        ColumnUnit::Microstrain => 1e-6 / strain_per_mv_per_v(be),
        ColumnUnit::Load { .. } => 0.0,
    };
    column.values.iter().map(|v| v * factor).collect()
}

fn zero_of(raw: &[f64], time_s: &[f64], zero: ZeroFrom, recorded: Option<f64>) -> f64 {
    match zero {
        ZeroFrom::None => 0.0,
        ZeroFrom::Records => recorded.unwrap_or(0.0),
        ZeroFrom::LogStart { seconds } => {
            let t0 = time_s.first().copied().unwrap_or(0.0);
            let n = time_s
                .iter()
                .take_while(|&&t| t - t0 <= seconds)
                .count()
                .clamp(1, raw.len().max(1));
            raw.iter().take(n).sum::<f64>() / n as f64
        }
    }
}

/// The span factor from the recorded shunt step, with its source in words.
fn span_of(project: &Project, be: &BridgeEvaluation) -> (f64, String) {
    let step = project
        .records
        .bridge(&be.name)
        .and_then(|r| r.shunt_step_strain);
    match (&be.shunt, step) {
        (Some(s), Some(step)) => {
            let factor = s.expected_reading_strain / step;
            if (factor - 1.0).abs() <= SPAN_CORRECTION_LIMIT {
                (
                    factor,
                    format!(
                        "shunt step {:.1} µε recorded, {:.1} µε expected",
                        step * 1e6,
                        s.expected_reading_strain * 1e6
                    ),
                )
            } else {
                (
                    1.0,
                    "none: the recorded shunt step is too far from the expected one to be a \
                     span error (see the check-out)"
                        .to_owned(),
                )
            }
        }
        (Some(_), None) => (1.0, "none: no shunt step recorded".to_owned()),
        (None, _) => (1.0, "none: no shunt planned".to_owned()),
    }
}

/// Reduces `log` against the plan and its evaluation.
pub fn reduce(
    project: &Project,
    ev: &Evaluation,
    log: &TestLog,
    options: &ReduceOptions,
) -> Result<Reduction, ReduceError> {
    let mut notes = Vec::new();
    let mut applied = Vec::new();
    let mut matched: Vec<(&PartEvaluation, &BridgeEvaluation, &LogColumn)> = Vec::new();
    for column in &log.columns {
        if let ColumnUnit::Load { si_unit, .. } = column.unit {
            let (part, component) = load_for_column(column, project, si_unit)?;
            applied.push(AppliedLoad {
                part,
                component,
                column: column.name.clone(),
                values: column.values.clone(),
            });
            continue;
        }
        let Some((pe, be)) = bridge_for_column(&column.name, ev) else {
            notes.push(format!(
                "column \"{}\" names no bridge of the plan and was left out",
                column.name
            ));
            continue;
        };
        if let Some((_, _, first)) = matched.iter().find(|(_, b, _)| b.name == be.name) {
            return Err(ReduceError::DuplicateChannel {
                first: first.name.clone(),
                second: column.name.clone(),
                bridge: be.name.clone(),
            });
        }
        matched.push((pe, be, column));
    }
    if matched.is_empty() {
        return Err(ReduceError::NoChannels);
    }
    let channels: Vec<ChannelSeries> = matched
        .iter()
        .map(|(pe, be, column)| channel_series(project, pe, be, column, log, options, &applied))
        .collect();
    let rosettes = rosettes_of(project, ev, &channels, &mut notes);
    let recovered = recovered_loads(ev, &channels, &mut notes);
    Ok(Reduction {
        time_s: log.time_s.clone(),
        channels,
        applied,
        rosettes,
        recovered,
        notes,
    })
}

fn channel_series(
    project: &Project,
    pe: &PartEvaluation,
    be: &BridgeEvaluation,
    column: &LogColumn,
    log: &TestLog,
    options: &ReduceOptions,
    applied: &[AppliedLoad],
) -> ChannelSeries {
    let raw = to_mv_per_v(column, be);
    let recorded_zero = project
        .records
        .bridge(&be.name)
        .and_then(|r| r.zero_mv_per_v);
    let zero = zero_of(&raw, &log.time_s, options.zero, recorded_zero);
    let (span, span_source) = span_of(project, be);
    let mv_per_v: Vec<f64> = raw.iter().map(|r| (r - zero) * span).collect();
    let per = strain_per_mv_per_v(be);
    let strain = mv_per_v.iter().map(|m| m * per).collect();
    // A channel that reports a strain (a rosette grid) is not converted to a load.
    let strain_channel = project
        .parts
        .get(pe.part_index)
        .and_then(|p| p.bridges.iter().find(|b| b.name == be.name))
        .is_some_and(|b| b.recovery == gw_plan::document::LoadRecovery::LeftOut);
    let load_per_mv_per_v = if strain_channel {
        None
    } else {
        be.channel_load_per_mv_per_v()
    };
    let load = load_per_mv_per_v.map(|f| mv_per_v.iter().map(|m| m * f).collect());
    let calibration_factor = match (&be.calibration, be.wanted_per_mv_per_v) {
        (Some(c), Some(predicted)) if predicted != 0.0 && c.load_per_mv_per_v.is_finite() => {
            c.load_per_mv_per_v / predicted
        }
        _ => 1.0,
    };
    let predicted_mv_per_v = predicted_reading(be, &pe.name, applied, raw.len());
    ChannelSeries {
        part: pe.name.clone(),
        bridge: be.name.clone(),
        channel: be.channel_number,
        column: column.name.clone(),
        wanted: be.wanted,
        raw_mv_per_v: raw,
        zero_mv_per_v: zero,
        span_factor: span,
        span_source,
        mv_per_v,
        strain_per_mv_per_v: per,
        strain,
        load,
        load_per_mv_per_v,
        calibration_factor,
        predicted_mv_per_v,
    }
}

/// Σ (mV/V per unit of each applied component) × applied value, when the log carries an
/// applied load of the bridge's part.
fn predicted_reading(
    be: &BridgeEvaluation,
    part: &str,
    applied: &[AppliedLoad],
    len: usize,
) -> Option<Vec<f64>> {
    let mine: Vec<&AppliedLoad> = applied.iter().filter(|a| a.part == part).collect();
    if mine.is_empty() {
        return None;
    }
    let mut out = vec![0.0; len];
    for a in mine {
        let per_unit = be
            .sensitivities
            .iter()
            .find(|s| s.component == a.component)
            .map(|s| s.mv_per_v_per_unit)
            .unwrap_or(0.0);
        for (o, v) in out.iter_mut().zip(&a.values) {
            *o += per_unit * v;
        }
    }
    Some(out)
}

/// The channel that reads grid `grid` of gauge `gauge` alone (its only active arm).
fn single_grid_channel<'c>(
    part: &Part,
    channels: &'c [ChannelSeries],
    gauge: &str,
    grid: usize,
) -> Option<&'c ChannelSeries> {
    channels.iter().filter(|c| c.part == part.name).find(|c| {
        let Some(plan) = part.bridges.iter().find(|b| b.name == c.bridge) else {
            return false;
        };
        let grids: Vec<&PlanArm> = plan
            .arms
            .iter()
            .filter(|a| matches!(a, PlanArm::Grid { .. }))
            .collect();
        matches!(grids.as_slice(), [PlanArm::Grid { gauge: g, grid: k }] if g == gauge && *k == grid)
    })
}

fn rosettes_of(
    project: &Project,
    ev: &Evaluation,
    channels: &[ChannelSeries],
    notes: &mut Vec<String>,
) -> Vec<RosetteSeries> {
    let mut out = Vec::new();
    for pe in &ev.parts {
        let Some(part) = project.parts.get(pe.part_index) else {
            continue;
        };
        for g in project.placed_gauges(part) {
            if !matches!(
                g.spec.pattern,
                GaugePattern::RectangularRosette | GaugePattern::DeltaRosette
            ) {
                continue;
            }
            let found: Vec<Option<&ChannelSeries>> = (1..=3)
                .map(|k| single_grid_channel(part, channels, &g.id, k))
                .collect();
            let [Some(a), Some(b), Some(c)] = found[..] else {
                if found.iter().any(Option::is_some) {
                    notes.push(format!(
                        "rosette {} on \"{}\": not every grid is read by a channel of its own \
                         in the log, so it is not reduced",
                        g.id, part.name
                    ));
                }
                continue;
            };
            match rosette_series(part, &g, [a, b, c]) {
                Ok(r) => out.push(r),
                Err(e) => notes.push(format!("rosette {} on \"{}\": {e}", g.id, part.name)),
            }
        }
    }
    out
}

fn recovered_loads(
    ev: &Evaluation,
    channels: &[ChannelSeries],
    notes: &mut Vec<String>,
) -> Vec<RecoveredLoads> {
    let mut out = Vec::new();
    for pe in &ev.parts {
        let Some(m) = &pe.multi_axis else {
            continue;
        };
        let inputs: Vec<Option<&ChannelSeries>> = m
            .bridges
            .iter()
            .map(|name| channels.iter().find(|c| &c.bridge == name))
            .collect();
        if inputs.iter().any(Option::is_none) {
            if inputs.iter().any(Option::is_some) {
                let missing: Vec<&str> = m
                    .bridges
                    .iter()
                    .zip(&inputs)
                    .filter(|(_, c)| c.is_none())
                    .map(|(n, _)| n.as_str())
                    .collect();
                notes.push(format!(
                    "loads of \"{}\" not recovered: the log has no column for {}",
                    pe.name,
                    missing.join(", ")
                ));
            }
            continue;
        }
        let inputs: Vec<&ChannelSeries> = inputs.into_iter().flatten().collect();
        let len = inputs.first().map(|c| c.strain.len()).unwrap_or(0);
        let values = m
            .recovery
            .iter()
            .map(|row| {
                let mut v = vec![0.0; len];
                for (coef, ch) in row.iter().zip(&inputs) {
                    let coef = coef * ch.calibration_factor;
                    for (o, s) in v.iter_mut().zip(&ch.strain) {
                        *o += coef * s;
                    }
                }
                v
            })
            .collect();
        out.push(RecoveredLoads {
            part: pe.name.clone(),
            bridges: m.bridges.clone(),
            components: m.components.clone(),
            values,
        });
    }
    out
}
