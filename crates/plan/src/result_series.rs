//! Plot series of one bridge's results, computed from its evaluation so the app only draws.
//!
//! # Output against load
//! Each load case's ramp gives the displayed strain and the straight line through the zero and
//! full-load readings ([`CaseRamp`]). The error against load ([`ErrorCurve`]) is in percent of
//! full scale, where full scale is the largest |wanted load| over the cases, turned into strain
//! by the bridge's displayed strain per unit of the wanted load (its [`Sensitivity`]).
//!
//! How each error source at a point of a case's ramp (fraction `f` of the case) is obtained:
//! - departure from the straight line (nonlinearity): displayed − straight-line strain of that
//!   ramp point, exact circuit;
//! - leakage of unwanted loads: the case's `reading.error.leakage` × `f` (the ramp scales all
//!   loads of the case together, and leakage is linear in them);
//! - leads (lead resistance, amplifier loading, excitation regulation):
//!   `reading.error.leads_and_loading` × `f` (a span error);
//! - gauge effects (grid averaging, transverse sensitivity, gauge-factor setting): their sum in
//!   `reading.error` × `f` (span errors);
//! - temperature: the largest |total apparent strain at no load| of the thermal sweep within
//!   the case's own range of part temperature (the sweep read linearly at the range's ends;
//!   the whole sweep when the case's range is not known); it is present at no load, so it
//!   does not scale with `f`.
//!
//! The total predicted error is the sum of the magnitudes (a worst case: the sources are not
//! assumed to cancel one another).
//!
//! [`Sensitivity`]: crate::evaluate::Sensitivity

use gw_bridge::temperature::ThermalPoint;

use crate::document::{LoadCase, RequiredAccuracy};
use crate::evaluate::{BridgeCase, BridgeEvaluation};

/// One load case's ramp: points of (wanted load SI, strain m/m).
#[derive(Debug, Clone, PartialEq)]
pub struct CaseRamp {
    /// Load case name.
    pub case: String,
    /// Displayed strain against the wanted load.
    pub displayed: Vec<[f64; 2]>,
    /// The straight line through the zero and full-load readings.
    pub straight: Vec<[f64; 2]>,
}

/// Error against load of one case, every value in % of full scale.
#[derive(Debug, Clone, PartialEq)]
pub struct ErrorCurve {
    /// Load case name.
    pub case: String,
    /// Points along the ramp.
    pub points: Vec<ErrorPoint>,
}

/// One point of an [`ErrorCurve`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ErrorPoint {
    /// Wanted load, SI.
    pub wanted: f64,
    /// Departure from the straight line, % of full scale (signed).
    pub departure_pct: f64,
    /// Leakage of unwanted loads, % of full scale (signed).
    pub leakage_pct: f64,
    /// Temperature at the extreme of the range, % of full scale (magnitude).
    pub temperature_pct: f64,
    /// Leads and loading, % of full scale (signed).
    pub leads_pct: f64,
    /// Grid averaging, transverse sensitivity and gauge-factor setting, % of full scale.
    pub gauge_pct: f64,
    /// Sum of the magnitudes of every source, % of full scale.
    pub total_pct: f64,
}

/// The ramps of every case of a bridge.
pub fn case_ramps(be: &BridgeEvaluation) -> Vec<CaseRamp> {
    be.cases
        .iter()
        .map(|c| CaseRamp {
            case: c.case.clone(),
            displayed: c
                .ramp
                .iter()
                .map(|p| [p.wanted_value, p.displayed_strain])
                .collect(),
            straight: c
                .ramp
                .iter()
                .map(|p| [p.wanted_value, p.linear_strain])
                .collect(),
        })
        .collect()
}

/// The largest |wanted load| over the cases, SI; `None` when every case applies none.
pub fn full_scale(be: &BridgeEvaluation) -> Option<f64> {
    let fs = be
        .cases
        .iter()
        .flat_map(|c| c.ramp.iter())
        .map(|p| p.wanted_value.abs())
        .filter(|v| v.is_finite())
        .fold(0.0, f64::max);
    (fs > 0.0).then_some(fs)
}

/// Full scale as displayed strain, m/m: full scale times the displayed strain per unit of the
/// wanted load. `None` without a full scale or a response.
pub fn full_scale_strain(be: &BridgeEvaluation) -> Option<f64> {
    let fs = full_scale(be)?;
    let per_unit = be
        .sensitivities
        .iter()
        .find(|s| s.component == be.wanted)?
        .displayed_per_unit;
    let strain = (fs * per_unit).abs();
    (strain > 0.0 && strain.is_finite()).then_some(strain)
}

/// The largest |total apparent strain| over the thermal sweep, m/m (0 without a sweep).
pub fn temperature_extreme_strain(sweep: &[ThermalPoint]) -> f64 {
    sweep
        .iter()
        .map(|p| p.total.abs())
        .filter(|v| v.is_finite())
        .fold(0.0, f64::max)
}

/// The largest |total apparent strain| of the sweep between part temperatures `low_c` and
/// `high_c`, m/m: the sweep's points inside, and the sweep read linearly at both ends.
pub fn temperature_extreme_strain_in(sweep: &[ThermalPoint], low_c: f64, high_c: f64) -> f64 {
    let (lo, hi) = (low_c.min(high_c), low_c.max(high_c));
    let inside = sweep
        .iter()
        .filter(|p| p.temperature_c >= lo && p.temperature_c <= hi)
        .map(|p| p.total);
    let ends = [lo, hi].into_iter().filter_map(|t| total_at(sweep, t));
    inside
        .chain(ends)
        .map(f64::abs)
        .filter(|v| v.is_finite())
        .fold(0.0, f64::max)
}

/// The sweep's total read linearly at `t_c`; `None` outside the sweep.
fn total_at(sweep: &[ThermalPoint], t_c: f64) -> Option<f64> {
    sweep.windows(2).find_map(|w| {
        let (a, b) = (&w[0], &w[1]);
        let (t0, t1) = (a.temperature_c, b.temperature_c);
        if t_c < t0.min(t1) || t_c > t0.max(t1) {
            return None;
        }
        let span = t1 - t0;
        let share = if span == 0.0 { 0.0 } else { (t_c - t0) / span };
        Some(a.total + (b.total - a.total) * share)
    })
}

/// The error curves of every case, or `None` when the bridge has no full scale. `cases` are
/// the part's load cases, for each case's temperature range (a case not found there takes
/// the whole sweep).
pub fn error_curves(be: &BridgeEvaluation, cases: &[LoadCase]) -> Option<Vec<ErrorCurve>> {
    let fs_strain = full_scale_strain(be)?;
    let whole = temperature_extreme_strain(&be.temperature);
    Some(
        be.cases
            .iter()
            .map(|c| {
                let temperature = cases.iter().find(|l| l.name == c.case).map_or(whole, |l| {
                    let (t0, t1) = l.temperature_range_c;
                    temperature_extreme_strain_in(&be.temperature, t0, t1)
                });
                error_curve(c, temperature, fs_strain)
            })
            .collect(),
    )
}

/// One case's error curve; `temperature` and `fs_strain` in m/m.
pub fn error_curve(case: &BridgeCase, temperature: f64, fs_strain: f64) -> ErrorCurve {
    let e = &case.reading.error;
    let gauge = e.grid_averaging + e.transverse_sensitivity + e.gauge_factor_setting;
    let pct = |strain: f64| 100.0 * strain / fs_strain;
    let points = case
        .ramp
        .iter()
        .map(|p| {
            let f = p.fraction;
            let departure = pct(p.displayed_strain - p.linear_strain);
            let leakage = pct(e.leakage * f);
            let leads = pct(e.leads_and_loading * f);
            let gauge = pct(gauge * f);
            let temperature = pct(temperature);
            ErrorPoint {
                wanted: p.wanted_value,
                departure_pct: departure,
                leakage_pct: leakage,
                temperature_pct: temperature,
                leads_pct: leads,
                gauge_pct: gauge,
                total_pct: departure.abs()
                    + leakage.abs()
                    + temperature.abs()
                    + leads.abs()
                    + gauge.abs(),
            }
        })
        .collect();
    ErrorCurve {
        case: case.case.clone(),
        points,
    }
}

/// The error the bridge's required accuracy allows at wanted load `wanted`, % of full scale
/// `fs` (both SI). `None` when no accuracy is required (the evaluation lists no check).
pub fn allowed_pct(be: &BridgeEvaluation, wanted: f64, fs: f64) -> Option<f64> {
    let required = be.accuracy.first()?.required;
    let allowed = match required {
        RequiredAccuracy::PercentOfReading(p) => p / 100.0 * wanted.abs(),
        RequiredAccuracy::InMeasuredUnit(a) => a.abs(),
    };
    let pct = 100.0 * allowed / fs;
    pct.is_finite().then_some(pct)
}

/// One apparent-strain contribution over the sweep.
#[derive(Debug, Clone, PartialEq)]
pub struct ThermalCurve {
    /// What causes it.
    pub name: &'static str,
    /// (part temperature °C, apparent strain m/m).
    pub points: Vec<[f64; 2]>,
    /// Apparent strain at the low end of the range, m/m.
    pub at_low: f64,
    /// At the high end, m/m.
    pub at_high: f64,
    /// Signed value of largest magnitude over the range, m/m.
    pub largest: f64,
}

impl ThermalCurve {
    /// Whether the curve is zero over the whole range (nothing to draw).
    pub fn is_zero(&self) -> bool {
        self.largest == 0.0
    }
}

/// The contributions drawn on the temperature plot, in the order of [`ThermalPoint`]: total,
/// gauge thermal output, expansion mismatch, gauge-factor drift, leads, completion drift and
/// the uncompensated sum for comparison.
pub fn thermal_curves(sweep: &[ThermalPoint]) -> Vec<ThermalCurve> {
    type Get = fn(&ThermalPoint) -> f64;
    let parts: [(&'static str, Get); 7] = [
        ("Total (this arrangement)", |p| p.total),
        ("Gauge thermal output", |p| p.gauge_thermal_output),
        ("Expansion mismatch", |p| p.expansion_mismatch),
        ("Gauge-factor drift at full load", |p| p.gauge_factor_drift),
        ("Lead resistance", |p| p.lead_resistance),
        ("Completion drift", |p| p.completion_drift),
        ("Without cancellation", |p| p.uncompensated),
    ];
    parts
        .into_iter()
        .map(|(name, get)| thermal_curve(name, sweep, get))
        .collect()
}

fn thermal_curve(
    name: &'static str,
    sweep: &[ThermalPoint],
    get: fn(&ThermalPoint) -> f64,
) -> ThermalCurve {
    let points: Vec<[f64; 2]> = sweep
        .iter()
        .map(|p| [p.temperature_c, get(p)])
        .filter(|[t, v]| t.is_finite() && v.is_finite())
        .collect();
    let at_low = points.first().map_or(0.0, |p| p[1]);
    let at_high = points.last().map_or(0.0, |p| p[1]);
    let largest = points
        .iter()
        .map(|p| p[1])
        .fold(0.0, |m: f64, v| if v.abs() > m.abs() { v } else { m });
    ThermalCurve {
        name,
        points,
        at_low,
        at_high,
        largest,
    }
}

#[cfg(test)]
mod tests {
    use gw_bridge::model::{ErrorBreakdown, Reading};

    use super::*;
    use crate::evaluate::RampPoint;

    /// A case ramping the wanted load from 0 to `full` N in four steps; the displayed strain is
    /// `displayed(f)` at fraction f, with the straight line through its ends as the evaluation
    /// draws it.
    fn case(full: f64, error: ErrorBreakdown, displayed: impl Fn(f64) -> f64) -> BridgeCase {
        let ramp = (0..=4)
            .map(|i| {
                let f = i as f64 / 4.0;
                RampPoint {
                    fraction: f,
                    wanted_value: full * f,
                    displayed_strain: displayed(f),
                    linear_strain: displayed(0.0) + (displayed(1.0) - displayed(0.0)) * f,
                }
            })
            .collect();
        BridgeCase {
            case: "rated".into(),
            reading: Reading {
                arm_ohm: [350.0; 4],
                output_v: 0.0,
                output_change_v: 0.0,
                mv_per_v: 0.0,
                displayed_strain: displayed(1.0),
                target_strain: displayed(1.0),
                error,
                bridge_excitation_v: 5.0,
                max_grid_strain: 0.0,
            },
            adc_v: 0.0,
            margins: Vec::new(),
            ramp,
            from_temperature_strain: 0.0,
        }
    }

    #[test]
    fn a_linear_bridge_has_no_departure() {
        let c = case(1000.0, ErrorBreakdown::default(), |f| 1e-3 * f);
        let curve = error_curve(&c, 0.0, 1e-3);
        for p in &curve.points {
            assert!(p.departure_pct.abs() < 1e-12, "{p:?}");
            assert!(p.total_pct.abs() < 1e-12, "{p:?}");
        }
    }

    #[test]
    fn leakage_at_full_load_in_percent_of_full_scale() {
        // Full scale 1000 µε; a leakage of 5 µε at full load is 0.5 % of full scale, half of
        // that at half load (worked by hand).
        let error = ErrorBreakdown {
            leakage: 5e-6,
            ..Default::default()
        };
        let c = case(1000.0, error, |f| 1e-3 * f);
        let curve = error_curve(&c, 0.0, 1e-3);
        let last = curve.points.last().unwrap();
        assert!((last.leakage_pct - 0.5).abs() < 1e-12, "{last:?}");
        assert!((last.total_pct - 0.5).abs() < 1e-12, "{last:?}");
        assert!((curve.points[2].total_pct - 0.25).abs() < 1e-12);
    }

    #[test]
    fn at_zero_load_only_the_zero_load_sources_remain() {
        // Span errors vanish at no load; the temperature extreme (2 µε of 1000 µε = 0.2 %)
        // does not.
        let error = ErrorBreakdown {
            leakage: 5e-6,
            leads_and_loading: -3e-6,
            gauge_factor_setting: 1e-6,
            ..Default::default()
        };
        let c = case(1000.0, error, |f| 1e-3 * f + 4e-6 * f * (1.0 - f));
        let curve = error_curve(&c, 2e-6, 1e-3);
        let first = curve.points[0];
        assert!((first.total_pct - 0.2).abs() < 1e-12, "{first:?}");
        // At half load: departure 4·0.25 = 1 µε, leakage 2.5, leads 1.5, gauge 0.5, temperature
        // 2 → 7.5 µε = 0.75 %.
        let mid = curve.points[2];
        assert!((mid.departure_pct - 0.1).abs() < 1e-12, "{mid:?}");
        assert!((mid.total_pct - 0.75).abs() < 1e-12, "{mid:?}");
    }

    fn thermal(t: f64, total: f64, leads: f64) -> ThermalPoint {
        ThermalPoint {
            temperature_c: t,
            gauge_thermal_output: 0.0,
            expansion_mismatch: 0.0,
            gauge_factor_drift: 0.0,
            lead_resistance: leads,
            completion_drift: 0.0,
            total,
            uncompensated: total.abs(),
        }
    }

    #[test]
    fn zero_curves_are_flagged_and_the_extremes_read_off() {
        let sweep = [
            thermal(-10.0, -3e-6, 1e-7),
            thermal(20.0, 0.0, 0.0),
            thermal(60.0, 2e-6, -2e-7),
        ];
        let curves = thermal_curves(&sweep);
        let total = &curves[0];
        assert_eq!(total.at_low, -3e-6);
        assert_eq!(total.at_high, 2e-6);
        assert_eq!(total.largest, -3e-6);
        assert!(!total.is_zero());
        assert!(curves[1].is_zero(), "gauge thermal output is zero here");
        assert_eq!(curves[4].largest, -2e-7);
        assert_eq!(temperature_extreme_strain(&sweep), 3e-6);
        // From 5 °C to 60 °C: halfway between −10 °C (−3 µε) and 20 °C (0) reads −1.5 µε, and
        // 60 °C reads 2 µε, the larger (worked by hand).
        assert!((temperature_extreme_strain_in(&sweep, 5.0, 60.0) - 2e-6).abs() < 1e-18);
        assert!((temperature_extreme_strain_in(&sweep, 5.0, 20.0) - 1.5e-6).abs() < 1e-18);
    }
}
