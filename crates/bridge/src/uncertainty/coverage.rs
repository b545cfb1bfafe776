//! The coverage factor of a GUM budget (JCGM 100:2008, Annex G): Student's t at the effective
//! degrees of freedom, or, when one rectangular input dominates, the factor of the actual
//! output distribution (that rectangle convolved with a normal of the rest).

use serde::Serialize;
use statrs::distribution::{ContinuousCDF, Normal, StudentsT};
use statrs::function::erf::erf;

use crate::error::BridgeError;

/// Coverage probability of the expanded uncertainty everywhere in the product: 95 %.
pub const COVERAGE_PROBABILITY: f64 = 0.95;

/// Above this many effective degrees of freedom the t factor is the normal one (they differ by
/// less than 10⁻⁶ relative).
const NORMAL_ABOVE_DOF: f64 = 1e7;

/// How the coverage factor of a budget was chosen.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum CoverageMethod {
    /// Student's t at the effective degrees of freedom (Welch–Satterthwaite, JCGM 100:2008,
    /// G.4.1 and G.6.4); the normal factor when they are infinite (every input known by bounds
    /// or from many observations).
    StudentT,
    /// One rectangular input dominates the budget: the factor of the actual output
    /// distribution, that rectangle convolved with a normal of the other inputs
    /// (JCGM 100:2008, G.2.3 and G.6.5).
    DominantRectangular,
}

impl CoverageMethod {
    /// Why the factor is what it is, in a few words, e.g. "one rectangular input dominates".
    pub fn reason(self, effective_degrees_of_freedom: Option<f64>) -> String {
        match (self, effective_degrees_of_freedom) {
            (CoverageMethod::DominantRectangular, _) => "one rectangular input dominates".into(),
            (CoverageMethod::StudentT, None) => {
                "normal: every input known by bounds or from many observations".into()
            }
            (CoverageMethod::StudentT, Some(nu)) => {
                format!("Student's t, {nu:.1} effective degrees of freedom")
            }
        }
    }
}

/// The coverage of one budget: factor, probability, effective degrees of freedom and method.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Coverage {
    /// Coverage factor k.
    pub factor: f64,
    /// Coverage probability p.
    pub probability: f64,
    /// Effective degrees of freedom of the combined standard uncertainty (`None`: infinite).
    pub effective_degrees_of_freedom: Option<f64>,
    /// How the factor was chosen.
    pub method: CoverageMethod,
}

/// One contribution to a budget, as the coverage needs it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Contribution {
    /// |cᵢ| u(xᵢ), in the output's unit.
    pub standard_uncertainty: f64,
    /// Degrees of freedom of u(xᵢ) (`None`: infinite).
    pub degrees_of_freedom: Option<f64>,
    /// Whether the input is rectangular.
    pub rectangular: bool,
}

/// Checks a coverage probability: strictly between 0 and 1.
pub fn check_probability(probability: f64) -> Result<(), BridgeError> {
    if probability.is_finite() && probability > 0.0 && probability < 1.0 {
        Ok(())
    } else {
        Err(BridgeError::Invalid {
            what: "coverage probability".into(),
            why: format!("{probability} must lie strictly between 0 and 1, e.g. 0.95"),
        })
    }
}

/// Effective degrees of freedom by the Welch–Satterthwaite formula,
/// ν_eff = u_c⁴ / Σ (cᵢ uᵢ)⁴ / νᵢ (JCGM 100:2008, G.4.1, eq. (G.2b)); `None` when infinite
/// (every contributing input has infinite degrees of freedom, or nothing contributes).
pub fn effective_degrees_of_freedom(contributions: &[Contribution]) -> Option<f64> {
    let variance: f64 = contributions
        .iter()
        .map(|c| c.standard_uncertainty.powi(2))
        .sum();
    let denominator: f64 = contributions
        .iter()
        .filter_map(|c| {
            c.degrees_of_freedom
                .map(|nu| c.standard_uncertainty.powi(4) / nu)
        })
        .sum();
    (variance > 0.0 && denominator > 0.0).then(|| variance * variance / denominator)
}

/// Student's t factor for coverage `probability` at `dof` degrees of freedom (`None`:
/// infinite, the normal factor): t_p(ν) with P(|T| ≤ t_p) = p (JCGM 100:2008, G.3 and
/// Table G.2). A non-integer ν is truncated to the next lower integer (G.4.1), down to no
/// fewer than one; below one it is used as it is.
pub fn t_factor(probability: f64, dof: Option<f64>) -> Result<f64, BridgeError> {
    check_probability(probability)?;
    let upper = 0.5 * (1.0 + probability);
    match dof {
        Some(nu) if nu.is_finite() && nu > 0.0 && nu <= NORMAL_ABOVE_DOF => {
            let nu = if nu >= 1.0 { nu.floor() } else { nu };
            let t = StudentsT::new(0.0, 1.0, nu).map_err(|e| BridgeError::Invalid {
                what: "effective degrees of freedom".into(),
                why: format!("{nu}: {e}"),
            })?;
            Ok(t.inverse_cdf(upper))
        }
        Some(nu) if nu.is_nan() || nu <= 0.0 => Err(BridgeError::Invalid {
            what: "effective degrees of freedom".into(),
            why: format!("{nu} must be a positive number"),
        }),
        _ => Ok(standard_normal().inverse_cdf(upper)),
    }
}

fn standard_normal() -> Normal {
    // Mean 0 and standard deviation 1 are always accepted.
    Normal::standard()
}

/// P(|R + N| ≤ y) for R rectangular on ±`half_width` and N normal with standard deviation
/// `sigma`, both centred: the integral over R of the normal's probability of landing within
/// ±y, in closed form with G(x) = x·erf(x/√2) + 2φ(x), an antiderivative of 2Φ(x) − 1.
fn rectangular_normal_probability(y: f64, half_width: f64, sigma: f64) -> f64 {
    if sigma <= half_width * 1e-12 {
        return (y / half_width).min(1.0);
    }
    let g = |x: f64| {
        x * erf(x / std::f64::consts::SQRT_2)
            + 2.0 * (-0.5 * x * x).exp() / (2.0 * std::f64::consts::PI).sqrt()
    };
    let p =
        sigma / (2.0 * half_width) * (g((y + half_width) / sigma) - g((y - half_width) / sigma));
    p.clamp(0.0, 1.0)
}

/// The half-width y of the symmetric interval holding `probability` of R + N (R rectangular on
/// ±`half_width`, N normal of standard deviation `sigma`), found by bisection: the probability
/// rises monotonically with y. A pure rectangle gives y = p·a (JCGM 100:2008, G.1.3 and
/// G.2.3: k = √3·p, 1.65 for 95 %).
pub fn rectangular_normal_half_width(probability: f64, half_width: f64, sigma: f64) -> f64 {
    let (mut lo, mut hi) = (0.0, half_width + 10.0 * sigma);
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if rectangular_normal_probability(mid, half_width, sigma) < probability {
            lo = mid;
        } else {
            hi = mid;
        }
        if hi - lo <= 1e-15 * hi {
            break;
        }
    }
    0.5 * (lo + hi)
}

/// The coverage of a budget made of `contributions`.
///
/// One rectangular input dominates when it has the largest contribution and the others
/// together have a combined standard uncertainty no larger than its own (it carries at least
/// half the variance). Our criterion: JCGM 100:2008, G.6.5 leaves "dominates" to judgement.
/// Past it, the convolution's factor and the normal one differ by under 2 % (1.92 against
/// 1.96 at the boundary), while below it they part quickly (1.65 for a pure rectangle); the
/// rest is then taken as normal, which the sum of several inputs is close to.
pub fn coverage(contributions: &[Contribution], probability: f64) -> Result<Coverage, BridgeError> {
    check_probability(probability)?;
    let variance: f64 = contributions
        .iter()
        .map(|c| c.standard_uncertainty.powi(2))
        .sum();
    let combined = variance.sqrt();
    let effective_degrees_of_freedom = effective_degrees_of_freedom(contributions);
    let largest = contributions
        .iter()
        .max_by(|a, b| a.standard_uncertainty.total_cmp(&b.standard_uncertainty));
    if let Some(top) = largest
        && top.rectangular
        && top.standard_uncertainty > 0.0
    {
        let rest = (variance - top.standard_uncertainty.powi(2))
            .max(0.0)
            .sqrt();
        if rest <= top.standard_uncertainty {
            let half_width = 3f64.sqrt() * top.standard_uncertainty;
            let y = rectangular_normal_half_width(probability, half_width, rest);
            return Ok(Coverage {
                factor: y / combined,
                probability,
                effective_degrees_of_freedom,
                method: CoverageMethod::DominantRectangular,
            });
        }
    }
    Ok(Coverage {
        factor: t_factor(probability, effective_degrees_of_freedom)?,
        probability,
        effective_degrees_of_freedom,
        method: CoverageMethod::StudentT,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn rect(u: f64) -> Contribution {
        Contribution {
            standard_uncertainty: u,
            degrees_of_freedom: None,
            rectangular: true,
        }
    }

    fn normal(u: f64, dof: Option<f64>) -> Contribution {
        Contribution {
            standard_uncertainty: u,
            degrees_of_freedom: dof,
            rectangular: false,
        }
    }

    #[test]
    fn the_normal_factor_for_ninety_five_percent_is_one_point_nine_six() {
        // JCGM 100:2008, Table G.1: p = 95 % → k = 1.960 for a normal distribution.
        let c = coverage(&[normal(1.0, None), normal(0.5, None)], 0.95).unwrap();
        assert!((c.factor - 1.960).abs() < 5e-4, "{c:?}");
        assert_eq!(c.method, CoverageMethod::StudentT);
        assert_eq!(c.effective_degrees_of_freedom, None);
    }

    #[test]
    fn a_rectangle_with_a_small_normal_remainder_lies_between_rectangle_and_normal() {
        let c = coverage(&[rect(1.0), normal(0.5, None)], 0.95).unwrap();
        assert_eq!(c.method, CoverageMethod::DominantRectangular);
        assert!(c.factor > 0.95 * 3f64.sqrt() && c.factor < 1.96, "{c:?}");
        // Past the criterion the t route takes over.
        let c = coverage(&[rect(1.0), normal(1.1, None)], 0.95).unwrap();
        assert_eq!(c.method, CoverageMethod::StudentT);
    }

    #[test]
    fn nothing_uncertain_gives_the_normal_factor_not_nan() {
        let c = coverage(&[normal(0.0, Some(3.0)), rect(0.0)], 0.95).unwrap();
        assert!(c.factor.is_finite());
        let c = coverage(&[], 0.95).unwrap();
        assert!(c.factor.is_finite());
    }

    #[test]
    fn a_probability_outside_zero_to_one_is_refused() {
        for p in [0.0, 1.0, 1.5, -0.1, f64::NAN] {
            let e = coverage(&[normal(1.0, None)], p).unwrap_err();
            assert!(e.to_string().contains("coverage probability"), "{e}");
        }
    }
}
