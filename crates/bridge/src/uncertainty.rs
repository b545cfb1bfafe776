//! Measurement uncertainty: linear propagation per the GUM (JCGM 100:2008) and Monte Carlo
//! propagation per JCGM 101:2008, for any model y = f(x₁ … xₙ).

pub mod coverage;

use rand::SeedableRng;
use rand_distr::{Distribution, Normal, Uniform};
use rand_xoshiro::Xoshiro256PlusPlus;
use serde::Serialize;

pub use coverage::{COVERAGE_PROBABILITY, Coverage, CoverageMethod};

use crate::error::BridgeError;

/// The probability distribution assigned to an input quantity.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum InputDistribution {
    /// Gaussian with the given standard uncertainty.
    Normal,
    /// Rectangular of half-width √3 u (a ± tolerance with no further knowledge).
    Rectangular,
}

/// One input quantity: best estimate and standard uncertainty.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct InputQuantity {
    /// Plain name, e.g. "gauge factor of the lot".
    pub name: String,
    /// Unit for display.
    pub unit: String,
    /// Best estimate.
    pub value: f64,
    /// Standard uncertainty (same unit).
    pub standard_uncertainty: f64,
    /// Distribution.
    pub distribution: InputDistribution,
    /// Degrees of freedom of the standard uncertainty (JCGM 100:2008, G.3 and G.4.2): n − 1
    /// for the mean of n observations; `None` for infinitely many, as for an input known by
    /// its bounds (every Type B input here). Set with
    /// [`InputQuantity::with_degrees_of_freedom`].
    pub degrees_of_freedom: Option<f64>,
}

impl InputQuantity {
    /// The same input with `dof` degrees of freedom (`f64::INFINITY` is the same as none).
    /// [`gum`] refuses a value that is not a positive number, naming the input.
    pub fn with_degrees_of_freedom(self, dof: f64) -> Self {
        Self {
            degrees_of_freedom: Some(dof),
            ..self
        }
    }

    /// A rectangular input from a ± half-width: u = a / √3 (JCGM 100:2008, 4.3.7).
    pub fn rectangular(name: &str, unit: &str, value: f64, half_width: f64) -> Self {
        Self {
            name: name.to_owned(),
            unit: unit.to_owned(),
            value,
            standard_uncertainty: half_width.abs() / 3f64.sqrt(),
            distribution: InputDistribution::Rectangular,
            degrees_of_freedom: None,
        }
    }

    /// A normal input with standard uncertainty `u`.
    pub fn normal(name: &str, unit: &str, value: f64, u: f64) -> Self {
        Self {
            name: name.to_owned(),
            unit: unit.to_owned(),
            value,
            standard_uncertainty: u.abs(),
            distribution: InputDistribution::Normal,
            degrees_of_freedom: None,
        }
    }
}

/// One row of an uncertainty budget.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct BudgetRow {
    /// Input name.
    pub name: String,
    /// Input unit.
    pub unit: String,
    /// Standard uncertainty of the input.
    pub standard_uncertainty: f64,
    /// Distribution of the input.
    pub distribution: InputDistribution,
    /// Degrees of freedom of the input's standard uncertainty (`None`: infinite).
    pub degrees_of_freedom: Option<f64>,
    /// Sensitivity coefficient ∂f/∂xᵢ.
    pub sensitivity: f64,
    /// Contribution |cᵢ| u(xᵢ).
    pub contribution: f64,
}

/// A GUM budget.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct GumBudget {
    /// Model value at the best estimates.
    pub value: f64,
    /// Rows, largest contribution first.
    pub rows: Vec<BudgetRow>,
    /// Combined standard uncertainty uc = √Σ(cᵢ uᵢ)² (uncorrelated inputs).
    pub combined: f64,
    /// Coverage factor k, chosen from the budget (see [`GumBudget::coverage`]).
    pub coverage_factor: f64,
    /// Coverage probability of the expanded uncertainty (0.95).
    pub coverage_probability: f64,
    /// Effective degrees of freedom of uc by Welch–Satterthwaite (`None`: infinite).
    pub effective_degrees_of_freedom: Option<f64>,
    /// How the coverage factor was chosen.
    pub coverage_method: CoverageMethod,
    /// Expanded uncertainty U = k uc.
    pub expanded: f64,
}

impl GumBudget {
    /// Why k is what it is, in a few words ("one rectangular input dominates").
    pub fn coverage_reason(&self) -> String {
        self.coverage_method
            .reason(self.effective_degrees_of_freedom)
    }

    /// The coverage factor with its reason, e.g. "k = 1.78 (one rectangular input dominates)".
    pub fn coverage_text(&self) -> String {
        format!(
            "k = {:.2} ({})",
            self.coverage_factor,
            self.coverage_reason()
        )
    }
}

/// Linear propagation (JCGM 100:2008, 5.1.2, eq. (10)) with sensitivity coefficients from
/// central differences at ±uᵢ/100, and the expanded uncertainty for `coverage_probability`
/// (use [`COVERAGE_PROBABILITY`]) with k from the budget itself: Student's t at the
/// Welch–Satterthwaite degrees of freedom, or the rectangle-and-normal factor when one
/// rectangular input dominates (see [`coverage::coverage`]).
///
/// Errors: a coverage probability outside (0, 1), or an input whose degrees of freedom are
/// not a positive number (the message names the input).
pub fn gum(
    inputs: &[InputQuantity],
    f: &dyn Fn(&[f64]) -> f64,
    coverage_probability: f64,
) -> Result<GumBudget, BridgeError> {
    for input in inputs {
        if let Some(nu) = input.degrees_of_freedom
            && (nu.is_nan() || nu <= 0.0)
        {
            return Err(BridgeError::Invalid {
                what: format!("degrees of freedom of \"{}\"", input.name),
                why: format!("{nu} must be a positive number (n − 1 for n observations)"),
            });
        }
    }
    let x0: Vec<f64> = inputs.iter().map(|i| i.value).collect();
    let value = f(&x0);
    let mut rows: Vec<BudgetRow> = inputs
        .iter()
        .enumerate()
        .map(|(k, input)| {
            let u = input.standard_uncertainty;
            let sensitivity = if u > 0.0 {
                let h = u / 100.0;
                let mut up = x0.clone();
                let mut down = x0.clone();
                up[k] += h;
                down[k] -= h;
                (f(&up) - f(&down)) / (2.0 * h)
            } else {
                0.0
            };
            BudgetRow {
                name: input.name.clone(),
                unit: input.unit.clone(),
                standard_uncertainty: u,
                distribution: input.distribution,
                degrees_of_freedom: input.degrees_of_freedom,
                sensitivity,
                contribution: (sensitivity * u).abs(),
            }
        })
        .collect();
    rows.sort_by(|a, b| b.contribution.total_cmp(&a.contribution));
    let combined = rows
        .iter()
        .map(|r| r.contribution.powi(2))
        .sum::<f64>()
        .sqrt();
    let contributions: Vec<coverage::Contribution> = rows
        .iter()
        .map(|r| coverage::Contribution {
            standard_uncertainty: r.contribution,
            degrees_of_freedom: r.degrees_of_freedom,
            rectangular: r.distribution == InputDistribution::Rectangular,
        })
        .collect();
    let k = coverage::coverage(&contributions, coverage_probability)?;
    Ok(GumBudget {
        value,
        rows,
        combined,
        coverage_factor: k.factor,
        coverage_probability: k.probability,
        effective_degrees_of_freedom: k.effective_degrees_of_freedom,
        coverage_method: k.method,
        expanded: k.factor * combined,
    })
}

/// Result of a Monte Carlo propagation.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MonteCarloResult {
    /// Number of trials.
    pub trials: usize,
    /// Mean of the output values.
    pub mean: f64,
    /// Standard deviation of the output values.
    pub standard_deviation: f64,
    /// Probabilistically symmetric 95 % coverage interval (2.5 % and 97.5 % quantiles).
    pub interval_95: (f64, f64),
    /// Histogram: lower edge of the first bin, bin width, counts.
    pub histogram: (f64, f64, Vec<u32>),
}

/// Draws `trials` samples of the inputs with a fixed `seed`, evaluates `f` and summarises
/// (JCGM 101:2008, 5.9 and 7.7).
pub fn monte_carlo(
    inputs: &[InputQuantity],
    f: &dyn Fn(&[f64]) -> f64,
    trials: usize,
    seed: u64,
    bins: usize,
) -> MonteCarloResult {
    let mut rng = Xoshiro256PlusPlus::seed_from_u64(seed);
    let samplers: Vec<Sampler> = inputs.iter().map(Sampler::new).collect();
    let mut x = vec![0.0; inputs.len()];
    let mut ys = Vec::with_capacity(trials.max(1));
    for _ in 0..trials.max(1) {
        for (xi, s) in x.iter_mut().zip(&samplers) {
            *xi = s.sample(&mut rng);
        }
        let y = f(&x);
        if y.is_finite() {
            ys.push(y);
        }
    }
    summarise(&mut ys, bins)
}

/// Summary statistics of output samples (sorted in place).
pub fn summarise(ys: &mut [f64], bins: usize) -> MonteCarloResult {
    let n = ys.len().max(1) as f64;
    let mean = ys.iter().sum::<f64>() / n;
    let var = ys.iter().map(|y| (y - mean).powi(2)).sum::<f64>() / (n - 1.0).max(1.0);
    ys.sort_by(f64::total_cmp);
    let q = |p: f64| -> f64 {
        if ys.is_empty() {
            return 0.0;
        }
        let idx = ((ys.len() - 1) as f64 * p).round() as usize;
        ys[idx.min(ys.len() - 1)]
    };
    let (lo, hi) = (q(0.0), q(1.0));
    let bins = bins.max(1);
    let width = if hi > lo {
        (hi - lo) / bins as f64
    } else {
        1.0
    };
    let mut counts = vec![0u32; bins];
    for y in ys.iter() {
        let b = (((y - lo) / width) as usize).min(bins - 1);
        counts[b] += 1;
    }
    MonteCarloResult {
        trials: ys.len(),
        mean,
        standard_deviation: var.sqrt(),
        interval_95: (q(0.025), q(0.975)),
        histogram: (lo, width, counts),
    }
}

/// A sampler for one input.
pub enum Sampler {
    /// Gaussian.
    Normal(Normal<f64>),
    /// Rectangular.
    Uniform(Uniform<f64>),
    /// A fixed value (zero uncertainty).
    Fixed(f64),
}

impl Sampler {
    /// The sampler for an input's distribution.
    pub fn new(input: &InputQuantity) -> Self {
        let u = input.standard_uncertainty;
        if u <= 0.0 || !u.is_finite() {
            return Sampler::Fixed(input.value);
        }
        match input.distribution {
            InputDistribution::Normal => Normal::new(input.value, u)
                .map(Sampler::Normal)
                .unwrap_or(Sampler::Fixed(input.value)),
            InputDistribution::Rectangular => {
                let a = 3f64.sqrt() * u;
                Uniform::new(input.value - a, input.value + a)
                    .map(Sampler::Uniform)
                    .unwrap_or(Sampler::Fixed(input.value))
            }
        }
    }

    /// One draw.
    pub fn sample<R: rand::Rng + ?Sized>(&self, rng: &mut R) -> f64 {
        match self {
            Sampler::Normal(d) => d.sample(rng),
            Sampler::Uniform(d) => d.sample(rng),
            Sampler::Fixed(v) => *v,
        }
    }
}

/// The benchmark case of a full bridge: strains, gauge factor and tolerances (± fractions,
/// rectangular).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FullBridgeCase {
    /// Strain of each arm's grid, m/m.
    pub strains: [f64; 4],
    /// Nominal gauge factor.
    pub gauge_factor: f64,
    /// Gauge-factor tolerance (common to the lot).
    pub gauge_factor_tolerance: f64,
    /// Tolerance of each arm's resistance (independent).
    pub arm_tolerance: f64,
    /// Excitation, V.
    pub excitation_v: f64,
    /// Excitation tolerance.
    pub excitation_tolerance: f64,
}

/// Monte Carlo of a full bridge with arm, gauge-factor and excitation tolerances:
/// Vo = Vex (R1/(R1+R2) − R4/(R3+R4)), Rₖ = R (1 + tₖ)(1 + GF εₖ); summary in V.
pub fn full_bridge_monte_carlo(
    case: &FullBridgeCase,
    trials: usize,
    seed: u64,
) -> MonteCarloResult {
    let mut rng = Xoshiro256PlusPlus::seed_from_u64(seed);
    let Ok(unit) = Uniform::new(-1.0, 1.0) else {
        return summarise(&mut [], 1);
    };
    let mut ys = Vec::with_capacity(trials);
    for _ in 0..trials {
        let gf = case.gauge_factor * (1.0 + case.gauge_factor_tolerance * unit.sample(&mut rng));
        let vex = case.excitation_v * (1.0 + case.excitation_tolerance * unit.sample(&mut rng));
        let mut r = [0.0; 4];
        for (k, rk) in r.iter_mut().enumerate() {
            *rk = (1.0 + case.arm_tolerance * unit.sample(&mut rng)) * (1.0 + gf * case.strains[k]);
        }
        ys.push(vex * (r[0] / (r[0] + r[1]) - r[3] / (r[2] + r[3])));
    }
    summarise(&mut ys, 50)
}
