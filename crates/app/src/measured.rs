//! What came back from the installation, as the app holds it: the test log read from the file
//! the project names (kept here, not in the project), and the results derived from the records
//! and the log (check-out, reduction, calibration fits, decimated plot series), computed once
//! per change of the project or the log by `gw-reduce`.

use std::path::{Path, PathBuf};

use gw_plan::Project;
use gw_plan::evaluate::Evaluation;
use gw_reduce::calibration::{CalibrationFit, calibrate_all};
use gw_reduce::checkout::{Checkout, check_out};
use gw_reduce::log::{TestLog, read_log_file};
use gw_reduce::reduction::{ReduceOptions, Reduction, reduce};

use crate::state::Notice;

/// Most points drawn per plotted series: two per bucket, about one bucket per pixel column
/// of a wide plot.
pub const PLOT_BUCKETS: usize = 1500;

/// A test log read from a file.
pub struct LoadedLog {
    /// The file, resolved against the project's folder.
    pub path: PathBuf,
    /// The samples.
    pub log: TestLog,
}

/// Plot series of one reduced channel, decimated; SI units (mV/V readings, loads in the SI
/// unit of the bridge's wanted component).
#[derive(Debug, Clone, Default)]
pub struct ChannelPlot {
    /// Bridge name.
    pub bridge: String,
    /// Measured reading (mV/V) against time (s).
    pub measured_vs_time: Vec<[f64; 2]>,
    /// Predicted reading against time, when the log carries the applied loads.
    pub predicted_vs_time: Vec<[f64; 2]>,
    /// Measured reading against the applied wanted load, when the log carries it.
    pub measured_vs_load: Vec<[f64; 2]>,
    /// Predicted reading against the applied wanted load.
    pub predicted_vs_load: Vec<[f64; 2]>,
}

/// Principal strains of one rosette against time, decimated (strain, m/m).
#[derive(Debug, Clone, Default)]
pub struct RosettePlot {
    /// Gauge id.
    pub gauge: String,
    /// Measured ε1, ε2; predicted ε1, ε2 (empty when not predicted).
    pub series: [Vec<[f64; 2]>; 4],
}

/// Recovered against applied load of one component of a part, decimated (SI unit).
#[derive(Debug, Clone)]
pub struct RecoveredPlot {
    /// Part name.
    pub part: String,
    /// Component.
    pub component: gw_mechanics::LoadComponent,
    /// (applied, recovered) pairs.
    pub points: Vec<[f64; 2]>,
}

/// Everything derived from the records and the log.
pub struct Derived {
    /// Check-out of every channel (empty verdicts when nothing is recorded).
    pub checkout: Checkout,
    /// The reduced log, when a log is loaded and could be reduced.
    pub reduction: Option<Reduction>,
    /// Why the loaded log could not be reduced.
    pub reduce_error: Option<String>,
    /// Calibration fits of the channels with known loads.
    pub fits: Vec<CalibrationFit>,
    /// Why other channels could not be fitted.
    pub fit_errors: Vec<String>,
    /// Plot series per reduced channel.
    pub channel_plots: Vec<ChannelPlot>,
    /// Plot series per rosette.
    pub rosette_plots: Vec<RosettePlot>,
    /// Recovered against applied, per part and component with an applied load.
    pub recovered_plots: Vec<RecoveredPlot>,
}

/// The log and its derived results.
pub struct Measured {
    /// The loaded log, if any.
    pub log: Option<LoadedLog>,
    /// A log file that could not be read, so it is not tried again at every change.
    failed: Option<PathBuf>,
    /// The derived results.
    pub derived: Derived,
    /// Counts recomputations (tests and diagnostics).
    pub generation: u64,
}

/// The file a stored log path names: relative paths are taken from the project's folder.
pub fn resolve_log_path(stored: &str, project_path: Option<&Path>) -> PathBuf {
    let p = PathBuf::from(stored);
    match project_path.and_then(Path::parent) {
        Some(dir) if p.is_relative() => dir.join(p),
        _ => p,
    }
}

/// The path to store for a log file: relative to the project's folder when it lies inside it,
/// so the two can be moved together.
pub fn stored_log_path(file: &Path, project_path: Option<&Path>) -> String {
    project_path
        .and_then(Path::parent)
        .filter(|d| !d.as_os_str().is_empty())
        .and_then(|dir| file.strip_prefix(dir).ok())
        .unwrap_or(file)
        .display()
        .to_string()
}

/// Min/max decimation: the samples are cut into at most `buckets` runs by index and each run
/// is drawn by its lowest and highest point (in sample order), so peaks survive. Pairs with a
/// non-finite value are left out.
pub fn decimate(x: &[f64], y: &[f64], buckets: usize) -> Vec<[f64; 2]> {
    let n = x.len().min(y.len());
    let finite = |i: usize| x[i].is_finite() && y[i].is_finite();
    if n <= 2 * buckets.max(1) {
        return (0..n)
            .filter(|&i| finite(i))
            .map(|i| [x[i], y[i]])
            .collect();
    }
    let per = n.div_ceil(buckets.max(1));
    let mut out = Vec::with_capacity(2 * buckets);
    for start in (0..n).step_by(per) {
        let end = (start + per).min(n);
        let mut lo: Option<usize> = None;
        let mut hi: Option<usize> = None;
        for i in (start..end).filter(|&i| finite(i)) {
            if lo.is_none_or(|k| y[i] < y[k]) {
                lo = Some(i);
            }
            if hi.is_none_or(|k| y[i] > y[k]) {
                hi = Some(i);
            }
        }
        match (lo, hi) {
            (Some(a), Some(b)) if a == b => out.push([x[a], y[a]]),
            (Some(a), Some(b)) => {
                let (first, second) = if a < b { (a, b) } else { (b, a) };
                out.push([x[first], y[first]]);
                out.push([x[second], y[second]]);
            }
            _ => {}
        }
    }
    out
}

fn channel_plot(r: &Reduction, ch: &gw_reduce::reduction::ChannelSeries) -> ChannelPlot {
    let applied = r.applied_load(&ch.part, ch.wanted).map(|a| &a.values);
    let predicted = ch.predicted_mv_per_v.as_ref();
    let pair = |x: Option<&Vec<f64>>, y: Option<&Vec<f64>>| match (x, y) {
        (Some(x), Some(y)) => decimate(x, y, PLOT_BUCKETS),
        _ => Vec::new(),
    };
    ChannelPlot {
        bridge: ch.bridge.clone(),
        measured_vs_time: decimate(&r.time_s, &ch.mv_per_v, PLOT_BUCKETS),
        predicted_vs_time: pair(Some(&r.time_s), predicted),
        measured_vs_load: pair(applied, Some(&ch.mv_per_v)),
        predicted_vs_load: pair(applied, predicted),
    }
}

fn rosette_plot(r: &Reduction, s: &gw_reduce::rosette_series::RosetteSeries) -> RosettePlot {
    let t = &r.time_s;
    let d = |v: &[f64]| decimate(t, v, PLOT_BUCKETS);
    let (p1, p2) = match &s.predicted {
        Some(p) => (d(&p.strain_1), d(&p.strain_2)),
        None => (Vec::new(), Vec::new()),
    };
    RosettePlot {
        gauge: s.gauge.clone(),
        series: [d(&s.measured.strain_1), d(&s.measured.strain_2), p1, p2],
    }
}

fn recovered_plots(r: &Reduction) -> Vec<RecoveredPlot> {
    let mut out = Vec::new();
    for rec in &r.recovered {
        for (k, c) in rec.components.iter().enumerate() {
            let (Some(applied), Some(values)) = (r.applied_load(&rec.part, *c), rec.values.get(k))
            else {
                continue;
            };
            out.push(RecoveredPlot {
                part: rec.part.clone(),
                component: *c,
                points: decimate(&applied.values, values, PLOT_BUCKETS),
            });
        }
    }
    out
}

impl Derived {
    /// The check-out alone (no log).
    fn without_log(project: &Project, ev: &Evaluation) -> Self {
        Self {
            checkout: check_out(project, ev),
            reduction: None,
            reduce_error: None,
            fits: Vec::new(),
            fit_errors: Vec::new(),
            channel_plots: Vec::new(),
            rosette_plots: Vec::new(),
            recovered_plots: Vec::new(),
        }
    }

    /// Everything, from the project, its evaluation and the log if one is loaded.
    pub fn compute(project: &Project, ev: &Evaluation, log: Option<&TestLog>) -> Self {
        let mut d = Self::without_log(project, ev);
        let Some(log) = log else {
            return d;
        };
        match reduce(project, ev, log, &ReduceOptions::default()) {
            Ok(r) => {
                let (fits, errors) = calibrate_all(project, ev, &r);
                d.fits = fits;
                d.fit_errors = errors.iter().map(|e| e.to_string()).collect();
                d.channel_plots = r.channels.iter().map(|c| channel_plot(&r, c)).collect();
                d.rosette_plots = r.rosettes.iter().map(|s| rosette_plot(&r, s)).collect();
                d.recovered_plots = recovered_plots(&r);
                d.reduction = Some(r);
            }
            Err(e) => {
                d.reduce_error = Some(format!(
                    "The test log could not be reduced against the plan: {e}."
                ))
            }
        }
        d
    }
}

impl Measured {
    /// No log; the check-out of `project`.
    pub fn new(project: &Project, ev: &Evaluation) -> Self {
        Self {
            log: None,
            failed: None,
            derived: Derived::without_log(project, ev),
            generation: 1,
        }
    }

    /// Computes the derived results again.
    pub fn recompute(&mut self, project: &Project, ev: &Evaluation) {
        self.derived = Derived::compute(project, ev, self.log.as_ref().map(|l| &l.log));
        self.generation += 1;
    }

    /// Takes a log already read from `path`.
    pub fn set_log(&mut self, path: PathBuf, log: TestLog) {
        self.failed = None;
        self.log = Some(LoadedLog { path, log });
    }

    /// Makes the loaded log follow the project's log path: reads it when the path changed,
    /// drops it when the project names none. Returns whether the log changed, and a notice
    /// when the file could not be read (the project stays open, without the log).
    pub fn sync_log(&mut self, project: &Project, project_path: Option<&Path>) -> SyncOutcome {
        let Some(stored) = project.records.log_path.as_deref() else {
            self.failed = None;
            let changed = self.log.take().is_some();
            return SyncOutcome {
                changed,
                notice: None,
            };
        };
        let path = resolve_log_path(stored, project_path);
        let same = |p: &PathBuf| *p == path;
        if self.log.as_ref().is_some_and(|l| same(&l.path))
            || self.failed.as_ref().is_some_and(same)
        {
            return SyncOutcome::default();
        }
        let changed = self.log.is_some();
        match read_log_file(&path) {
            Ok(log) => {
                self.set_log(path, log);
                SyncOutcome {
                    changed: true,
                    notice: None,
                }
            }
            Err(e) => {
                self.log = None;
                self.failed = Some(path);
                SyncOutcome {
                    changed,
                    notice: Some(Notice {
                        is_error: true,
                        text: format!(
                            "The project's test log could not be read: {e}. The project is open \
                             without it; File › Import test log… to choose the file again."
                        ),
                    }),
                }
            }
        }
    }
}

/// What following the project's log path did.
#[derive(Debug, Default)]
pub struct SyncOutcome {
    /// The loaded log changed (read, replaced or dropped).
    pub changed: bool,
    /// Why the log could not be read.
    pub notice: Option<Notice>,
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn decimation_keeps_the_peaks_and_caps_the_points() {
        // A spike at one sample out of a million must still show after decimation.
        let n = 1_000_000;
        let x: Vec<f64> = (0..n).map(|i| i as f64).collect();
        let mut y = vec![0.0; n];
        y[654_321] = 5.0;
        y[123_456] = -3.0;
        let d = decimate(&x, &y, 1000);
        assert!(d.len() <= 2000, "{} points", d.len());
        assert!(d.iter().any(|p| p == &[654_321.0, 5.0]));
        assert!(d.iter().any(|p| p == &[123_456.0, -3.0]));
        // Points stay in sample order, so a time series is drawn left to right.
        assert!(d.windows(2).all(|w| w[0][0] < w[1][0]));
    }

    #[test]
    fn decimation_drops_non_finite_samples() {
        let d = decimate(&[0.0, 1.0, 2.0], &[1.0, f64::NAN, 3.0], 10);
        assert_eq!(d, vec![[0.0, 1.0], [2.0, 3.0]]);
    }

    #[test]
    fn log_paths_are_stored_relative_to_the_project_folder() {
        let project = Path::new("/work/stand/stand.ron");
        let stored = stored_log_path(Path::new("/work/stand/logs/first.csv"), Some(project));
        assert_eq!(stored, "logs/first.csv");
        assert_eq!(
            resolve_log_path(&stored, Some(project)),
            PathBuf::from("/work/stand/logs/first.csv")
        );
        // Outside the folder, or with no project file, the path is kept whole.
        assert_eq!(
            stored_log_path(Path::new("/elsewhere/first.csv"), Some(project)),
            "/elsewhere/first.csv"
        );
        assert_eq!(
            resolve_log_path("/elsewhere/first.csv", Some(project)),
            PathBuf::from("/elsewhere/first.csv")
        );
    }
}
