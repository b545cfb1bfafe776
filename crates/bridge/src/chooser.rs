//! The automatic arrangement chooser: searches every assignment of the placed grids (and
//! dummies and completion resistors) to the four arms and ranks them.
//!
//! The search uses the linear small-signal bridge on grid-averaged, transverse-corrected
//! strains (exact for ranking purposes; the chosen bridge is then evaluated on the exact
//! circuit). Arms 1 and 3 add, arms 2 and 4 subtract, so an assignment is fixed by the
//! unordered pair in arms 1/3 and the unordered pair in arms 2/4; entries whose output for the
//! wanted load would be negative are the mirror of another entry and are skipped.

use gw_mechanics::transverse::CALIBRATION_POISSON_RATIO;
use gw_mechanics::{LoadComponent, LoadVector, Member, QuadratureOrder, grid_average_state};
use serde::Serialize;

use crate::bridge::{ArmElement, CompletionResistor};
use crate::error::BridgeError;
use crate::gauge::{GridRef, PlacedGauge};

/// What the engineer asks of the chooser.
#[derive(Debug, Clone, PartialEq)]
pub struct ChooserRequest {
    /// The load component to measure.
    pub wanted: LoadComponent,
    /// Its full-scale magnitude (SI unit of the component).
    pub wanted_magnitude: f64,
    /// Unwanted components with their expected magnitudes.
    pub unwanted: Vec<(LoadComponent, f64)>,
    /// Temperature range as changes from the reference, °C (low, high).
    pub temperature_range_c: (f64, f64),
    /// Reference temperature, °C.
    pub reference_temperature_c: f64,
    /// Completion resistor used where the search puts one.
    pub completion: CompletionResistor,
    /// How many ranked entries to return.
    pub keep: usize,
}

/// One ranked arrangement.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RankedArrangement {
    /// Arms 1..4.
    pub arms: [ArmElement; 4],
    /// Output at full scale of the wanted load, mV/V.
    pub full_scale_mv_per_v: f64,
    /// Leakage of each unwanted component at its expected magnitude, as a fraction of the
    /// full-scale output.
    pub leakage: Vec<(LoadComponent, f64)>,
    /// Largest apparent output over the temperature range, as a fraction of full scale.
    pub thermal_fraction: f64,
    /// Nonlinearity at full scale, fraction.
    pub nonlinearity: f64,
    /// Gauges and dummies needed.
    pub gauge_count: usize,
    /// Ranking score (higher is better).
    pub score: f64,
    /// One line in plain words.
    pub reason: String,
}

impl RankedArrangement {
    /// The largest leakage fraction.
    pub fn worst_leakage(&self) -> f64 {
        self.leakage.iter().map(|(_, l)| *l).fold(0.0, f64::max)
    }
}

/// Ranking score: larger sensitivity is better; leakage, apparent strain, nonlinearity and
/// gauge count are worse. Strictly monotone in each, so an entry that is worse in one criterion
/// and equal in the others always ranks lower.
pub fn score(
    full_scale_mv_per_v: f64,
    worst_leakage: f64,
    total_leakage: f64,
    thermal_fraction: f64,
    nonlinearity: f64,
    gauge_count: usize,
) -> f64 {
    let error = worst_leakage + total_leakage + thermal_fraction + nonlinearity;
    full_scale_mv_per_v.abs().max(1e-12).log10()
        - 2.0 * (error + 1e-5).log10()
        - 0.02 * gauge_count as f64
}

/// One candidate element for an arm, with its precomputed response.
#[derive(Debug, Clone)]
struct Candidate {
    element: ArmElement,
    /// ΔR/R per unit of each component (temperature excluded).
    per_unit: [f64; LoadComponent::COUNT],
    /// ΔR/R at the low and high temperature.
    thermal: (f64, f64),
    /// Gauge-count contribution.
    count: usize,
    /// Grid id for duplicate checks.
    grid: Option<GridRef>,
}

/// Ranks every arm assignment of the placed grids for the request.
pub fn choose(
    member: &Member,
    gauges: &[PlacedGauge],
    request: &ChooserRequest,
    quadrature: QuadratureOrder,
) -> Result<Vec<RankedArrangement>, BridgeError> {
    let mut grids = Vec::new();
    let cte = member.material().cte_per_c;
    let (t_lo, t_hi) = request.temperature_range_c;
    let t_ref = request.reference_temperature_c;
    for (gi, gauge) in gauges.iter().enumerate() {
        gauge.spec.validate()?;
        let spec = &gauge.spec;
        let kt = spec.transverse_sensitivity;
        let thermal = |dt: f64| {
            spec.gauge_factor_at(t_ref, t_ref + dt)
                * spec
                    .thermal_output
                    .apparent_strain(cte, kt, spec.gauge_factor, t_ref, t_ref + dt)
        };
        for element in 0..gauge.element_count() {
            let footprint = gauge.footprint(element);
            let mut per_unit = [0.0; LoadComponent::COUNT];
            for &c in member.components() {
                if c == LoadComponent::TemperatureChange {
                    continue;
                }
                let st = grid_average_state(member, &footprint, &LoadVector::unit(c), quadrature)?
                    .mechanical_strain();
                let a = st.along(footprint.angle_rad);
                let t = st.along(footprint.angle_rad + std::f64::consts::FRAC_PI_2);
                per_unit[c.index()] =
                    spec.gauge_factor * (a + kt * t) / (1.0 - CALIBRATION_POISSON_RATIO * kt);
            }
            let grid = GridRef { gauge: gi, element };
            grids.push(Candidate {
                element: ArmElement::Grid(grid),
                per_unit,
                thermal: (thermal(t_lo), thermal(t_hi)),
                count: 1,
                grid: Some(grid),
            });
        }
    }
    let Some(first) = grids.first().cloned() else {
        return Ok(Vec::new());
    };
    let dummy = Candidate {
        element: ArmElement::Dummy(first.grid.unwrap_or(GridRef {
            gauge: 0,
            element: 0,
        })),
        per_unit: [0.0; LoadComponent::COUNT],
        thermal: first.thermal,
        count: 1,
        grid: None,
    };
    let completion = Candidate {
        element: ArmElement::Completion(request.completion),
        per_unit: [0.0; LoadComponent::COUNT],
        thermal: (0.0, 0.0),
        count: 0,
        grid: None,
    };
    let mut options = grids.clone();
    options.push(dummy);
    options.push(completion);
    let n = options.len();
    let fixed = grids.len(); // indices ≥ fixed (dummy, completion) may repeat
    let mut pairs = Vec::new();
    for i in 0..n {
        for j in i..n {
            if i == j && i < fixed {
                continue;
            }
            pairs.push((i, j));
        }
    }
    let w = request.wanted;
    let mut ranked = Vec::new();
    for &(p1, p3) in &pairs {
        for &(p2, p4) in &pairs {
            let idx = [p1, p2, p3, p4];
            if idx.iter().all(|&k| k >= fixed) {
                continue;
            }
            // A grid may sit in one arm only.
            let mut used = [usize::MAX; 4];
            let mut clash = false;
            for (slot, &k) in idx.iter().enumerate() {
                if k < fixed {
                    if used.contains(&k) {
                        clash = true;
                    }
                    used[slot] = k;
                }
            }
            if clash {
                continue;
            }
            let opts = idx.map(|k| &options[k]);
            let signed =
                |f: &dyn Fn(&Candidate) -> f64| f(opts[0]) - f(opts[1]) + f(opts[2]) - f(opts[3]);
            let sens_w = signed(&|o| o.per_unit[w.index()]) / 4.0;
            if sens_w <= 0.0 {
                continue;
            }
            let full = sens_w * request.wanted_magnitude.abs();
            if full <= 0.0 {
                continue;
            }
            let leakage: Vec<(LoadComponent, f64)> = request
                .unwanted
                .iter()
                .map(|&(c, m)| {
                    (
                        c,
                        (signed(&|o| o.per_unit[c.index()]) / 4.0 * m).abs() / full,
                    )
                })
                .collect();
            let thermal_lo = (signed(&|o| o.thermal.0) / 4.0).abs();
            let thermal_hi = (signed(&|o| o.thermal.1) / 4.0).abs();
            let thermal_fraction = thermal_lo.max(thermal_hi) / full;
            // Nonlinearity: exact divider against the linear sum at full scale.
            let deltas: Vec<f64> = opts
                .iter()
                .map(|o| o.per_unit[w.index()] * request.wanted_magnitude.abs())
                .collect();
            let r: Vec<f64> = deltas.iter().map(|d| 1.0 + d).collect();
            let exact = r[0] / (r[0] + r[1]) - r[3] / (r[2] + r[3]);
            let nonlinearity = ((exact - full) / full).abs();
            let gauge_count = opts.iter().map(|o| o.count).sum();
            let worst = leakage.iter().map(|(_, l)| *l).fold(0.0, f64::max);
            let total: f64 = leakage.iter().map(|(_, l)| *l).sum();
            let sc = score(
                full * 1e3,
                worst,
                total,
                thermal_fraction,
                nonlinearity,
                gauge_count,
            );
            ranked.push(RankedArrangement {
                arms: opts.map(|o| o.element),
                full_scale_mv_per_v: full * 1e3,
                leakage,
                thermal_fraction,
                nonlinearity,
                gauge_count,
                score: sc,
                reason: String::new(),
            });
        }
    }
    ranked.sort_by(|a, b| b.score.total_cmp(&a.score));
    ranked.truncate(request.keep.max(1));
    for r in &mut ranked {
        r.reason = explain(r, gauges);
    }
    Ok(ranked)
}

/// One line in plain words.
fn explain(r: &RankedArrangement, gauges: &[PlacedGauge]) -> String {
    let active = r
        .arms
        .iter()
        .filter(|a| matches!(a, ArmElement::Grid(_)))
        .count();
    let dummies = r
        .arms
        .iter()
        .filter(|a| matches!(a, ArmElement::Dummy(_)))
        .count();
    let mut cancels = Vec::new();
    let mut leaks = Vec::new();
    for (c, l) in &r.leakage {
        if *l < 1e-4 {
            cancels.push(c.name());
        } else {
            leaks.push(format!("{} {:.2} %", c.name(), l * 100.0));
        }
    }
    let grids: Vec<String> = r
        .arms
        .iter()
        .map(|a| match a {
            ArmElement::Grid(g) => gauges
                .get(g.gauge)
                .map(|p| format!("{}/{}", p.id, g.element + 1))
                .unwrap_or_default(),
            ArmElement::Dummy(_) => "dummy".into(),
            ArmElement::Completion(_) => "resistor".into(),
        })
        .collect();
    let mut line = format!(
        "{active} active grid(s){} [{}]; {:.3} mV/V at full scale",
        if dummies > 0 { " and a dummy" } else { "" },
        grids.join(", "),
        r.full_scale_mv_per_v
    );
    if !cancels.is_empty() {
        line += &format!("; cancels {}", cancels.join(", "));
    }
    if !leaks.is_empty() {
        line += &format!("; leaks {}", leaks.join(", "));
    }
    line += &format!(
        "; temperature {:.2} % of full scale",
        r.thermal_fraction * 100.0
    );
    if r.nonlinearity > 1e-4 {
        line += &format!("; nonlinearity {:.2} %", r.nonlinearity * 100.0);
    }
    line
}
