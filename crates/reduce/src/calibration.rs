//! In-place load calibration: the installed bridge loaded in steps of known load, each step
//! found as a plateau in the log, and a straight line fitted through the plateau means. It
//! gives the sensitivity and zero with their standard uncertainties, the nonlinearity (largest
//! departure of a plateau from the line) and the hysteresis (largest difference between the
//! rising and falling readings at the same load), both as a percentage of the full-scale
//! output, and the ratio of the fitted sensitivity to the predicted one.
//!
//! The known loads come from a reference column of the log (the applied load of the bridge's
//! wanted component) or, without one, from the steps entered in the bridge's record, paired in
//! order with the plateaus found in the bridge's own reading.

use gw_mechanics::LoadComponent;
use gw_plan::document::{LoadRecovery, Project};
use gw_plan::evaluate::{BridgeEvaluation, Evaluation};
use serde::Serialize;

use crate::fit::{PolynomialFit, fit_line};
use crate::reduction::{ChannelSeries, Reduction};

/// A run of samples where a signal holds still.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Plateau {
    /// First sample used (after trimming the edges).
    pub start: usize,
    /// One past the last sample used.
    pub end: usize,
    /// Mean of the signal over the samples used.
    pub mean: f64,
}

/// Shortest plateau, in samples (common practice: enough samples to average the noise).
pub const MIN_PLATEAU_SAMPLES: usize = 10;

/// Runs of `values` that stay within a band: the band is six times the noise (estimated from
/// the median absolute difference of neighbouring samples, which ignores the ramps between
/// steps) or 0.5 % of the signal's range, whichever is larger. The first and last fifth of
/// each run are dropped so that the edges of the ramps do not bias the mean.
pub fn find_plateaus(values: &[f64]) -> Vec<Plateau> {
    if values.len() < MIN_PLATEAU_SAMPLES {
        return Vec::new();
    }
    let mut diffs: Vec<f64> = values.windows(2).map(|w| (w[1] - w[0]).abs()).collect();
    diffs.sort_by(f64::total_cmp);
    let median_diff = diffs[diffs.len() / 2];
    // For white noise of standard deviation σ, the difference of two samples has σ√2 and its
    // median absolute value is 0.6745 σ√2 (normal distribution).
    let noise = median_diff / (0.6745 * std::f64::consts::SQRT_2);
    let (lo, hi) = values
        .iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(l, h), &v| {
            (l.min(v), h.max(v))
        });
    let band = (6.0 * noise).max(0.005 * (hi - lo));
    let mut runs = Vec::new();
    let mut start = 0;
    let mut sum = 0.0;
    for (i, &v) in values.iter().enumerate() {
        let n = (i - start) as f64;
        if n > 0.0 && (v - sum / n).abs() > band {
            runs.push((start, i));
            start = i;
            sum = 0.0;
        }
        sum += v;
    }
    runs.push((start, values.len()));
    runs.into_iter()
        .filter(|(s, e)| e - s >= MIN_PLATEAU_SAMPLES)
        .map(|(s, e)| {
            let trim = (e - s) / 5;
            let (s, e) = (s + trim, e - trim);
            let mean = values[s..e].iter().sum::<f64>() / (e - s) as f64;
            Plateau {
                start: s,
                end: e,
                mean,
            }
        })
        .collect()
}

/// Where the known loads came from.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub enum StepSource {
    /// A reference column of the log.
    ReferenceColumn(String),
    /// The steps entered in the bridge's record.
    EnteredSteps,
}

/// One calibration point: a plateau of the reading at a known load.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct CalibrationPoint {
    /// Known load, SI unit of the wanted component.
    pub load: f64,
    /// Mean reading, mV/V (as logged: no zero taken off, no span correction).
    pub reading_mv_per_v: f64,
    /// Standard deviation of the mean reading, mV/V.
    pub reading_sd_of_mean: f64,
    /// True on the way up (the load larger than the point before; the first point is).
    pub rising: bool,
    /// Time at the middle of the plateau, s.
    pub time_s: f64,
}

/// The fit of one bridge.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CalibrationFit {
    /// Part name.
    pub part: String,
    /// Bridge name.
    pub bridge: String,
    /// The load calibrated.
    pub wanted: LoadComponent,
    /// Where the known loads came from.
    pub source: StepSource,
    /// The points fitted.
    pub points: Vec<CalibrationPoint>,
    /// The straight line reading = zero + sensitivity × load.
    pub line: PolynomialFit,
    /// Fitted sensitivity, mV/V per unit load.
    pub sensitivity: f64,
    /// Its standard uncertainty.
    pub sensitivity_u: f64,
    /// Fitted zero, mV/V.
    pub zero_mv_per_v: f64,
    /// Its standard uncertainty.
    pub zero_u: f64,
    /// Largest |plateau − line| over the full-scale output, fraction.
    pub nonlinearity: f64,
    /// Largest |falling − rising| reading at the same load over the full-scale output,
    /// fraction; `None` when no load was met both ways.
    pub hysteresis: Option<f64>,
    /// Standard uncertainty of the hysteresis from the plateaus' noise, fraction.
    pub hysteresis_u: Option<f64>,
    /// Predicted sensitivity, mV/V per unit load.
    pub predicted_sensitivity: f64,
    /// Fitted over predicted sensitivity.
    pub ratio: f64,
    /// Standard uncertainty of the ratio (the fit's; the prediction's own uncertainty is in
    /// the plan's budget).
    pub ratio_u: f64,
}

impl CalibrationFit {
    /// Wanted load per mV/V from the fit, and its standard uncertainty.
    pub fn load_per_mv_per_v(&self) -> (f64, f64) {
        let f = 1.0 / self.sensitivity;
        (
            f,
            self.sensitivity_u / (self.sensitivity * self.sensitivity),
        )
    }

    /// The calibration as the plan stores it.
    pub fn as_plan_calibration(&self, source: &str) -> gw_plan::installation::InPlaceCalibration {
        let (f, u) = self.load_per_mv_per_v();
        gw_plan::installation::InPlaceCalibration {
            load_per_mv_per_v: f,
            standard_uncertainty: u,
            zero_mv_per_v: self.zero_mv_per_v,
            source: source.to_owned(),
        }
    }
}

/// Why a bridge could not be calibrated.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum CalibrationError {
    /// No known loads.
    #[error(
        "bridge \"{bridge}\": no known loads; give the log a column of the applied {component} \
         or enter the load steps in the bridge's record"
    )]
    NoLoads {
        /// Bridge.
        bridge: String,
        /// Component.
        component: String,
    },
    /// Plateaus and entered steps do not pair up.
    #[error(
        "bridge \"{bridge}\": {found} plateaus found in the reading but {entered} load steps \
         entered; hold each step still for at least {MIN_PLATEAU_SAMPLES} samples, or correct \
         the steps"
    )]
    StepCount {
        /// Bridge.
        bridge: String,
        /// Plateaus found.
        found: usize,
        /// Steps entered.
        entered: usize,
    },
    /// The fit failed.
    #[error("bridge \"{bridge}\": {why}")]
    Fit {
        /// Bridge.
        bridge: String,
        /// Why.
        why: String,
    },
}

/// Calibrates every channel of `reduction` that has known loads; channels without them, and
/// channels that report a strain rather than a load (left out of the load recovery), are
/// skipped; other problems are returned beside the fits.
pub fn calibrate_all(
    project: &Project,
    ev: &Evaluation,
    reduction: &Reduction,
) -> (Vec<CalibrationFit>, Vec<CalibrationError>) {
    let mut fits = Vec::new();
    let mut errors = Vec::new();
    for ch in &reduction.channels {
        let Some(be) = ev
            .parts
            .iter()
            .flat_map(|p| &p.bridges)
            .find(|b| b.name == ch.bridge)
        else {
            continue;
        };
        let left_out = project
            .parts
            .iter()
            .flat_map(|p| &p.bridges)
            .any(|b| b.name == ch.bridge && b.recovery == LoadRecovery::LeftOut);
        if left_out {
            continue;
        }
        match calibrate(project, be, ch, reduction) {
            Ok(fit) => fits.push(fit),
            Err(CalibrationError::NoLoads { .. }) => {}
            Err(e) => errors.push(e),
        }
    }
    (fits, errors)
}

/// Calibrates one channel.
pub fn calibrate(
    project: &Project,
    be: &BridgeEvaluation,
    channel: &ChannelSeries,
    reduction: &Reduction,
) -> Result<CalibrationFit, CalibrationError> {
    let reading = &channel.raw_mv_per_v;
    let (source, pairs) = match reduction.applied_load(&channel.part, channel.wanted) {
        Some(applied) => {
            let pairs = find_plateaus(&applied.values)
                .into_iter()
                .map(|p| (p, p.mean))
                .collect::<Vec<_>>();
            (StepSource::ReferenceColumn(applied.column.clone()), pairs)
        }
        None => {
            let steps = project
                .records
                .bridge(&channel.bridge)
                .map(|r| r.known_load_steps.clone())
                .unwrap_or_default();
            if steps.is_empty() {
                return Err(CalibrationError::NoLoads {
                    bridge: channel.bridge.clone(),
                    component: channel.wanted.name().to_owned(),
                });
            }
            let plateaus = find_plateaus(reading);
            if plateaus.len() != steps.len() {
                return Err(CalibrationError::StepCount {
                    bridge: channel.bridge.clone(),
                    found: plateaus.len(),
                    entered: steps.len(),
                });
            }
            (
                StepSource::EnteredSteps,
                plateaus.into_iter().zip(steps).collect(),
            )
        }
    };
    let points = points_of(&pairs, reading, &reduction.time_s);
    fit_points(be, channel, source, points)
}

fn points_of(pairs: &[(Plateau, f64)], reading: &[f64], time_s: &[f64]) -> Vec<CalibrationPoint> {
    let mut points: Vec<CalibrationPoint> = Vec::new();
    for (p, load) in pairs {
        let Some(samples) = reading.get(p.start..p.end) else {
            continue;
        };
        let n = samples.len() as f64;
        let mean = samples.iter().sum::<f64>() / n;
        let var = samples.iter().map(|v| (v - mean).powi(2)).sum::<f64>() / (n - 1.0).max(1.0);
        let rising = points.last().is_none_or(|last| *load > last.load);
        let mid = (p.start + p.end) / 2;
        points.push(CalibrationPoint {
            load: *load,
            reading_mv_per_v: mean,
            reading_sd_of_mean: (var / n).sqrt(),
            rising,
            time_s: time_s.get(mid).copied().unwrap_or(0.0),
        });
    }
    points
}

fn fit_points(
    be: &BridgeEvaluation,
    channel: &ChannelSeries,
    source: StepSource,
    points: Vec<CalibrationPoint>,
) -> Result<CalibrationFit, CalibrationError> {
    let x: Vec<f64> = points.iter().map(|p| p.load).collect();
    let y: Vec<f64> = points.iter().map(|p| p.reading_mv_per_v).collect();
    let line = fit_line(&x, &y).map_err(|e| CalibrationError::Fit {
        bridge: channel.bridge.clone(),
        why: e.to_string(),
    })?;
    let sensitivity = line.slope();
    let load_span = x.iter().fold(0.0_f64, |m, v| m.max(v.abs()));
    let full_scale = (sensitivity * load_span).abs().max(f64::MIN_POSITIVE);
    let nonlinearity = points
        .iter()
        .map(|p| (p.reading_mv_per_v - line.value_at(p.load)).abs())
        .fold(0.0, f64::max)
        / full_scale;
    let (hysteresis, hysteresis_u) = hysteresis_of(&points, load_span, full_scale);
    let predicted_sensitivity = be
        .sensitivities
        .iter()
        .find(|s| s.component == channel.wanted)
        .map(|s| s.mv_per_v_per_unit)
        .unwrap_or(0.0);
    let sensitivity_u = line.standard_errors.get(1).copied().unwrap_or(0.0);
    let (ratio, ratio_u) = if predicted_sensitivity != 0.0 {
        (
            sensitivity / predicted_sensitivity,
            sensitivity_u / predicted_sensitivity.abs(),
        )
    } else {
        (f64::NAN, f64::NAN)
    };
    if !ratio.is_finite() {
        return Err(CalibrationError::Fit {
            bridge: channel.bridge.clone(),
            why: format!(
                "the plan predicts no response to {}, so there is nothing to compare the fit with",
                channel.wanted.name()
            ),
        });
    }
    Ok(CalibrationFit {
        part: channel.part.clone(),
        bridge: channel.bridge.clone(),
        wanted: channel.wanted,
        source,
        zero_mv_per_v: line.intercept(),
        zero_u: line.standard_errors.first().copied().unwrap_or(0.0),
        sensitivity,
        sensitivity_u,
        points,
        line,
        nonlinearity,
        hysteresis,
        hysteresis_u,
        predicted_sensitivity,
        ratio,
        ratio_u,
    })
}

/// Largest |falling − rising| at loads met both ways (within 1 % of the load span).
fn hysteresis_of(
    points: &[CalibrationPoint],
    load_span: f64,
    full_scale: f64,
) -> (Option<f64>, Option<f64>) {
    let mut worst: Option<(f64, f64)> = None;
    for down in points.iter().filter(|p| !p.rising) {
        for up in points.iter().filter(|p| p.rising) {
            if (down.load - up.load).abs() > 0.01 * load_span {
                continue;
            }
            let d = (down.reading_mv_per_v - up.reading_mv_per_v).abs();
            let u = down.reading_sd_of_mean.hypot(up.reading_sd_of_mean);
            if worst.is_none_or(|(w, _)| d > w) {
                worst = Some((d, u));
            }
        }
    }
    match worst {
        Some((d, u)) => (Some(d / full_scale), Some(u / full_scale)),
        None => (None, None),
    }
}
