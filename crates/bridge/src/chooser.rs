//! The automatic arrangement chooser: searches every assignment of the placed grids (and
//! dummies and completion resistors) to the four arms and ranks them by the error each leaves
//! in the wanted quantity at its rated load, in that quantity's own unit.
//!
//! The error counts what an instrumentation engineer would: the leakage of every unwanted load
//! at its expected magnitude, the apparent reading over the temperature range (leads and
//! completion resistors included), nonlinearity at full scale, the channel's noise and
//! resolution, and how much the reading moves when the gauges sit off their marks by the
//! placement tolerances. An arrangement whose full-scale output is below one count of the
//! channel is rejected outright, however well it cancels.
//!
//! The search screens every assignment with the linear small-signal bridge on grid-averaged,
//! transverse-corrected strains (arms 1 and 3 add, arms 2 and 4 subtract, so an assignment is
//! fixed by the unordered pair in arms 1/3 and the unordered pair in arms 2/4; entries whose
//! output for the wanted load would be negative are the mirror of another entry and are
//! skipped), then evaluates the most promising ones on the exact circuit of the bridge they are
//! for: its leads, excitation, instrument and channel.

mod exact;
mod screen;

use gw_mechanics::{LoadComponent, Member, QuadratureOrder};
use serde::Serialize;

use crate::bridge::{ArmElement, Bridge, CompletionResistor};
use crate::bridge_uncertainty::InstallationTolerances;
use crate::error::BridgeError;
use crate::gauge::PlacedGauge;

/// What the engineer asks of the chooser.
#[derive(Debug, Clone, PartialEq)]
pub struct ChooserRequest {
    /// The load component to measure.
    pub wanted: LoadComponent,
    /// Its rated (full-scale) magnitude, in the SI unit of the component.
    pub wanted_magnitude: f64,
    /// Unwanted components with their expected magnitudes.
    pub unwanted: Vec<(LoadComponent, f64)>,
    /// Temperature range as changes from the reference, °C (low, high).
    pub temperature_range_c: (f64, f64),
    /// Reference temperature, °C.
    pub reference_temperature_c: f64,
    /// The bridge the arrangement goes into: its lead wiring, leads, excitation, instrument,
    /// channel and instrument temperature are kept; the search fills its arms.
    pub template: Bridge,
    /// Completion resistor used where the search puts one.
    pub completion: CompletionResistor,
    /// How well the gauges can be placed (direction and position).
    pub tolerances: InstallationTolerances,
    /// How many ranked entries to return.
    pub keep: usize,
}

/// What one arrangement leaves in the wanted quantity at its rated load, each cause in the
/// wanted quantity's own unit.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ErrorAtRated {
    /// Reading caused by each unwanted load at its expected magnitude.
    pub leakage: Vec<(LoadComponent, f64)>,
    /// Largest apparent reading over the temperature range at no load (gauges, leads and
    /// completion resistors).
    pub temperature: f64,
    /// Departure of the exact circuit from a straight line at the rated load.
    pub nonlinearity: f64,
    /// Noise of the channel over its bandwidth, rms.
    pub noise_rms: f64,
    /// One count of the channel.
    pub resolution: f64,
    /// Standard uncertainty of the reading from the placement tolerances (each gauge's
    /// direction and position, its grids moving together).
    pub placement: f64,
}

impl ErrorAtRated {
    /// The error budget at rated load: the systematic parts added at their worst (every
    /// unwanted load at its magnitude, the worse end of the temperature range, nonlinearity),
    /// plus twice the root sum of squares of the random parts (noise, quantization as one
    /// count over √12, placement), about a 95 % bound for them (common practice).
    pub fn total(&self) -> f64 {
        let leak: f64 = self.leakage.iter().map(|(_, l)| l.abs()).sum();
        let random = (self.noise_rms.powi(2)
            + (self.resolution / 12f64.sqrt()).powi(2)
            + self.placement.powi(2))
        .sqrt();
        leak + self.temperature.abs() + self.nonlinearity.abs() + 2.0 * random
    }
}

/// One ranked arrangement.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RankedArrangement {
    /// Arms 1..4.
    pub arms: [ArmElement; 4],
    /// Output at the rated wanted load, mV/V.
    pub full_scale_mv_per_v: f64,
    /// The rated wanted load, in `unit`.
    pub rated: f64,
    /// Unit of the wanted quantity.
    pub unit: &'static str,
    /// The error at rated load, cause by cause, in `unit`.
    pub error: ErrorAtRated,
    /// Gauges and dummies needed.
    pub gauge_count: usize,
    /// Ranking score (higher is better): see [`score`].
    pub score: f64,
    /// One line in plain words, with the error in the wanted quantity's unit.
    pub reason: String,
}

impl RankedArrangement {
    /// The largest leakage, in the wanted quantity's unit.
    pub fn worst_leakage(&self) -> f64 {
        self.error
            .leakage
            .iter()
            .map(|(_, l)| l.abs())
            .fold(0.0, f64::max)
    }

    /// The error budget at rated load ([`ErrorAtRated::total`]), in the wanted unit.
    pub fn total_error(&self) -> f64 {
        self.error.total()
    }
}

/// What each gauge or dummy costs in the ranking: an arrangement with one more must cut the
/// error at rated load by about this fraction of itself to rank higher (our choice: fewer
/// gauges mean less installation work and fewer things to go wrong, so a gauge has to earn its
/// place; 5 % per gauge).
pub const GAUGE_COST_FRACTION: f64 = 0.05;

/// Ranking score from the error at rated load as a fraction of the rated load and the number
/// of gauges: higher is better, −error × (1 + cost)^gauges. Strictly decreasing in each (for a
/// non-zero error), so an entry that is worse in one and equal in the other always ranks lower.
pub fn score(error_fraction: f64, gauge_count: usize) -> f64 {
    -error_fraction.abs() * (1.0 + GAUGE_COST_FRACTION).powi(gauge_count as i32)
}

/// Ranks every arm assignment of the placed grids for the request.
pub fn choose(
    member: &Member,
    gauges: &[PlacedGauge],
    request: &ChooserRequest,
    quadrature: QuadratureOrder,
) -> Result<Vec<RankedArrangement>, BridgeError> {
    request.template.validate_settings()?;
    if !(request.wanted_magnitude.is_finite() && request.wanted_magnitude != 0.0) {
        return Err(BridgeError::Invalid {
            what: "rated load of the wanted component".into(),
            why: format!(
                "{} is not a usable full scale; give the wanted load a non-zero value in a load case",
                request.wanted_magnitude
            ),
        });
    }
    let screened = screen::screen(member, gauges, request, quadrature)?;
    let mut ranked = exact::evaluate(member, gauges, request, quadrature, screened);
    ranked.sort_by(|a, b| b.score.total_cmp(&a.score));
    // Entries with the same grids in the same arms differ only in their passive arms (dummy or
    // resistor); the best of them stands for all.
    let mut seen: Vec<[Option<crate::gauge::GridRef>; 4]> = Vec::new();
    ranked.retain(|r| {
        let active = r.arms.map(|a| match a {
            ArmElement::Grid(g) => Some(g),
            _ => None,
        });
        let fresh = !seen.contains(&active);
        seen.push(active);
        fresh
    });
    ranked.truncate(request.keep.max(1));
    for r in &mut ranked {
        r.reason = exact::explain(r, gauges);
    }
    Ok(ranked)
}

/// The error one given arrangement leaves at rated load, judged exactly as the search judges
/// its entries: for comparing the bridge as wired with the suggestions. `None` when it does not
/// read the wanted load positively or its full scale is below one count.
pub fn assess(
    member: &Member,
    gauges: &[PlacedGauge],
    request: &ChooserRequest,
    arms: &[ArmElement; 4],
    quadrature: QuadratureOrder,
) -> Result<Option<RankedArrangement>, BridgeError> {
    request.template.validate_settings()?;
    let Some(one) = screen::screen_one(member, gauges, request, quadrature, arms)? else {
        return Ok(None);
    };
    let mut ranked = exact::evaluate(member, gauges, request, quadrature, vec![one]);
    Ok(ranked.pop().map(|mut r| {
        r.reason = exact::explain(&r, gauges);
        r
    }))
}
