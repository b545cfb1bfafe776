//! Transverse shear in a solid rectangular section by the elasticity solution (Saint-Venant
//! flexure), which is what a gauge on a face reads: on the faces parallel to the shear force
//! the stress is higher than the mean across the width V·Q/(I·b) of elementary beam theory, by
//! a factor that grows with the width-to-depth ratio and with ν.
//!
//! # Conventions
//! - The shear force V acts along u. The section spans −a ≤ u ≤ a along it (depth 2a) and
//!   −c ≤ w ≤ c across it (width 2c); origin at the centroid.
//! - Stresses are the component along the force on the cross-section, per newton of V, Pa/N,
//!   with the sign of V (the same convention as V·Q/(I·b)).
//!
//! # The solution
//! Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., §119 (bending of a cantilever) and
//! §124 (rectangular cross-section): with the stress function φ, zero on the boundary and
//! ∇²φ = ν/(1 + ν)·V·w/I, the shear along the force is τ = ∂φ/∂w + V (a² − u²)/(2I). The first
//! term only redistributes the stress across the width (φ vanishes on both side faces), so the
//! mean across the width stays V·Q/(I·b). Writing φ = ν/(1 + ν)·(V/I)·ψ with ∇²ψ = w gives
//!
//! τ / V = 1.5/A · [(1 − u²/a²) + 2ν/(1 + ν) · ∂ψ/∂w / a²],
//!
//! with ∂ψ/∂w from either of two series, both exact:
//! - modes across the width (sin(mπw/c), m = 1, 2, …):
//!   ∂ψ/∂w = (3w² − c²)/6 + (2c²/π²) Σ (−1)^(m+1) cos(mπw/c) cosh(mπu/c) / (m² cosh(mπa/c));
//! - modes along the force (cos(λu), λ = nπ/(2a), n = 1, 3, 5, …):
//!   ∂ψ/∂w = c Σ βₙ/λ · cosh(λw)/sinh(λc) · cos(λu) − (a² − u²)/2, βₙ = 4(−1)^((n−1)/2)/(nπ).
//!
//! Near the face w = c (second series) or the corner u = a (first) their terms fall only as
//! 1/m². The slow part, the sum with the hyperbolic ratio replaced by its exponential
//! asymptote, is a dilogarithm of a complex argument (on the face itself a Clausen function);
//! it is summed in closed form and only the fast remainder term by term. The first series then
//! converges at least as e^(−mπa/c) and the second as e^(−nπc/(2a)), so the first is used for
//! c ≤ a and the second for c > a: a dozen terms either way.

use std::f64::consts::PI;
use std::ops::{Add, Mul, Sub};

/// A solid rectangular section carrying a shear force along one of its sides.
///
/// ```
/// # use gw_mechanics::rectangle_shear::RectangleShear;
/// // Square section, ν = 1/4: on the side face at the neutral axis the shear is 1.126 times
/// // the mean 3V/(2A) (Timoshenko & Goodier, Theory of Elasticity, 3rd ed., §124, table;
/// // value from memory, given there to three decimals).
/// let square = RectangleShear { depth_m: 0.04, width_m: 0.04, poisson_ratio: 0.25 };
/// let mean = 1.5 / (0.04 * 0.04);
/// assert!((square.face_stress_per_newton(0.0) / mean - 1.126).abs() < 6e-4);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RectangleShear {
    /// Depth along the shear force (2a), metres.
    pub depth_m: f64,
    /// Width across the shear force (2c), metres.
    pub width_m: f64,
    /// Poisson's ratio of the material.
    pub poisson_ratio: f64,
}

impl RectangleShear {
    /// The mean across the width at `u_m` from the centroid along the force, per newton, Pa/N:
    /// V·Q/(I·b) (Jourawski; Gere & Goodno, *Mechanics of Materials*, 7th ed., §5.8).
    /// Zero outside the section or when the section has no positive size.
    pub fn mean_stress_per_newton(&self, u_m: f64) -> f64 {
        let Some((a, c)) = self.half_sides() else {
            return 0.0;
        };
        let t = (u_m.abs() / a).min(1.0);
        finite_or_zero(1.5 / (4.0 * a * c) * (1.0 - t * t))
    }

    /// The elasticity value at (`u_m`, `w_m`) from the centroid, along and across the force, per
    /// newton, Pa/N. Points beyond the section are taken on its boundary; zero when the section
    /// has no positive size. A Poisson's ratio outside −1 < ν ≤ 0.5 (no isotropic solid) gives
    /// the mean.
    pub fn stress_per_newton(&self, u_m: f64, w_m: f64) -> f64 {
        let Some((a, c)) = self.half_sides() else {
            return 0.0;
        };
        if !u_m.is_finite() || !w_m.is_finite() {
            return 0.0;
        }
        let t = (u_m.abs() / a).min(1.0);
        let nu = self.poisson_ratio;
        let coupling = if nu > -1.0 && nu <= 0.5 {
            2.0 * nu / (1.0 + nu)
        } else {
            0.0
        };
        // Lengths in units of a: only the ratio c/a shapes the solution.
        let ratio = c / a;
        // Should an absurd ratio overflow the series, the correction is dropped, not the mean.
        let gradient = if coupling == 0.0 {
            0.0
        } else {
            finite_or_zero(psi_gradient(ratio, t, (w_m.abs() / a).min(ratio)))
        };
        finite_or_zero(1.5 / (4.0 * a * c) * ((1.0 - t * t) + coupling * gradient))
    }

    /// The elasticity value on the faces parallel to the force (w = ±c) at `u_m` from the
    /// centroid along the force, per newton, Pa/N: what a gauge there reads.
    pub fn face_stress_per_newton(&self, u_m: f64) -> f64 {
        self.stress_per_newton(u_m, self.width_m / 2.0)
    }

    /// Half depth a and half width c, if both are positive and finite.
    fn half_sides(&self) -> Option<(f64, f64)> {
        let (a, c) = (self.depth_m / 2.0, self.width_m / 2.0);
        let ok = |x: f64| x.is_finite() && x > 0.0;
        (ok(a) && ok(c)).then_some((a, c))
    }
}

fn finite_or_zero(x: f64) -> f64 {
    if x.is_finite() { x } else { 0.0 }
}

/// Terms of a remainder series below this are dropped; the sums they join are of order one.
const NEGLIGIBLE: f64 = 1e-18;

/// Remainder terms at most; each series needs a dozen where it is used.
const MAX_TERMS: usize = 200;

/// ∂ψ/∂w with ∇²ψ = w, ψ = 0 on the boundary of |u| ≤ 1, |w| ≤ `c` (lengths in units of the half
/// depth a), at 0 ≤ u ≤ 1, 0 ≤ w ≤ c.
fn psi_gradient(c: f64, u: f64, w: f64) -> f64 {
    if c <= 1.0 {
        modes_across(c, u, w)
    } else {
        modes_along(c, u, w)
    }
}

/// The series in sin(mπw/c) (see the module notes), half depth 1. Its slow part,
/// Σ (−1)^(m+1) cos(mα) xᵐ/m² = −Re Li₂(−x e^(iα)) with x = e^(−π(1 − u)/c), α = πw/c, is
/// the asymptote of cosh(mπu/c)/cosh(mπ/c); the rest, (e^(−mπ(1+u)/c) − e^(−mπ(3−u)/c)) /
/// (1 + e^(−2mπ/c)), is below e^(−mπ/c).
fn modes_across(c: f64, u: f64, w: f64) -> f64 {
    let alpha = PI * w / c;
    let x = (-PI * (1.0 - u) / c).exp();
    let slow = -dilog(Complex::polar(-x, alpha)).re;
    let (q1, q2, q3) = (
        (-PI * (1.0 + u) / c).exp(),
        (-PI * (3.0 - u) / c).exp(),
        (-2.0 * PI / c).exp(),
    );
    let (mut p1, mut p2, mut p3) = (1.0, 1.0, 1.0);
    let mut rest = 0.0;
    for m in 1..=MAX_TERMS {
        p1 *= q1;
        p2 *= q2;
        p3 *= q3;
        if p1 < NEGLIGIBLE {
            break;
        }
        let sign = if m % 2 == 1 { 1.0 } else { -1.0 };
        let m = m as f64;
        rest += sign * (m * alpha).cos() * (p1 - p2) / ((1.0 + p3) * m * m);
    }
    (3.0 * w * w - c * c) / 6.0 + 2.0 * c * c / (PI * PI) * (slow + rest)
}

/// The series in cos(nπu/2) (see the module notes), half depth 1, βₙ/λ = 8(−1)^j/(nπ)²,
/// n = 2j + 1. Its slow part, Σ (−1)^j yⁿ cos(nθ)/n² = Re Ti₂(y e^(iθ)) with y = e^(−π(c − w)/2),
/// θ = πu/2, is the asymptote of cosh(λw)/sinh(λc); the rest, (e^(−λ(c+w)) + e^(−λ(3c−w))) /
/// (1 − e^(−2λc)), is below 2e^(−λc)/(1 − e^(−π)) for c > 1.
fn modes_along(c: f64, u: f64, w: f64) -> f64 {
    let theta = PI * u / 2.0;
    let y = (-PI * (c - w) / 2.0).exp();
    // Ti₂(z) = (Li₂(iz) − Li₂(−iz)) / (2i), so Re Ti₂(z) = Im (Li₂(iz) − Li₂(−iz)) / 2.
    let iz = Complex::polar(y, theta + PI / 2.0);
    let slow = 0.5 * (dilog(iz).im - dilog(Complex::new(-iz.re, -iz.im)).im);
    let (q1, q2, q3) = (
        (-PI * (c + w) / 2.0).exp(),
        (-PI * (3.0 * c - w) / 2.0).exp(),
        (-PI * c).exp(),
    );
    // Powers for n = 1, 3, 5, …: start at n = 1 and step by the square.
    let (mut p1, mut p2, mut p3) = (q1, q2, q3);
    let mut rest = 0.0;
    for j in 0..MAX_TERMS {
        if p1 < NEGLIGIBLE {
            break;
        }
        let n = (2 * j + 1) as f64;
        let sign = if j % 2 == 0 { 1.0 } else { -1.0 };
        rest += sign * (n * theta).cos() * (p1 + p2) / ((1.0 - p3) * n * n);
        p1 *= q1 * q1;
        p2 *= q2 * q2;
        p3 *= q3 * q3;
    }
    8.0 * c / (PI * PI) * (slow + rest) - (1.0 - u * u) / 2.0
}

/// A complex number, only as much as the dilogarithm needs.
#[derive(Debug, Clone, Copy, PartialEq)]
struct Complex {
    re: f64,
    im: f64,
}

impl Complex {
    const fn new(re: f64, im: f64) -> Self {
        Self { re, im }
    }

    fn polar(r: f64, angle: f64) -> Self {
        let (sin, cos) = angle.sin_cos();
        Self::new(r * cos, r * sin)
    }

    fn norm(self) -> f64 {
        self.re.hypot(self.im)
    }

    /// Principal logarithm.
    fn ln(self) -> Self {
        Self::new(self.norm().ln(), self.im.atan2(self.re))
    }

    fn scale(self, k: f64) -> Self {
        Self::new(self.re * k, self.im * k)
    }
}

impl Add for Complex {
    type Output = Self;
    fn add(self, o: Self) -> Self {
        Self::new(self.re + o.re, self.im + o.im)
    }
}

impl Sub for Complex {
    type Output = Self;
    fn sub(self, o: Self) -> Self {
        Self::new(self.re - o.re, self.im - o.im)
    }
}

impl Mul for Complex {
    type Output = Self;
    fn mul(self, o: Self) -> Self {
        Self::new(
            self.re * o.re - self.im * o.im,
            self.re * o.im + self.im * o.re,
        )
    }
}

const ONE: Complex = Complex::new(1.0, 0.0);

/// Bernoulli numbers B₂, B₄, …, B₃₀ (Abramowitz & Stegun, *Handbook of Mathematical
/// Functions*, Table 23.2).
const BERNOULLI_EVEN: [f64; 15] = [
    1.0 / 6.0,
    -1.0 / 30.0,
    1.0 / 42.0,
    -1.0 / 30.0,
    5.0 / 66.0,
    -691.0 / 2730.0,
    7.0 / 6.0,
    -3617.0 / 510.0,
    43867.0 / 798.0,
    -174611.0 / 330.0,
    854513.0 / 138.0,
    -236364091.0 / 2730.0,
    8553103.0 / 6.0,
    -23749461029.0 / 870.0,
    8615841276005.0 / 14322.0,
];

/// The dilogarithm Li₂(z) = Σ zᵐ/m² for |z| ≤ 1.
///
/// Small |z|: the defining series. Re z > 1/2: Euler's reflection
/// Li₂(z) = π²/6 − ln z · ln(1 − z) − Li₂(1 − z), which brings the argument into the rest of the
/// disc. There: Li₂(z) = Σ Bₖ vᵏ⁺¹/(k + 1)! with v = −ln(1 − z), |v| < 1.3 (Lewin,
/// *Polylogarithms and Associated Functions*, ch. 1, from memory for the chapter), whose terms
/// fall as (|v|/2π)²ᵏ.
fn dilog(z: Complex) -> Complex {
    if z.re <= 0.5 {
        return dilog_near_zero(z);
    }
    let w = ONE - z;
    if w.norm() == 0.0 {
        return Complex::new(PI * PI / 6.0, 0.0);
    }
    Complex::new(PI * PI / 6.0, 0.0) - z.ln() * w.ln() - dilog_near_zero(w)
}

/// Li₂(z) for Re z ≤ 1/2, |z| ≤ 1.
fn dilog_near_zero(z: Complex) -> Complex {
    let r = z.norm();
    if r < 0.25 {
        let mut power = z;
        let mut sum = z;
        for m in 2..=MAX_TERMS {
            power = power * z;
            if r.powi(m as i32) < NEGLIGIBLE {
                break;
            }
            sum = sum + power.scale(1.0 / (m * m) as f64);
        }
        return sum;
    }
    let v = (ONE - z).ln().scale(-1.0);
    let v2 = v * v;
    let mut power = v;
    let mut sum = v - v2.scale(0.25);
    for (k, b) in BERNOULLI_EVEN.iter().enumerate() {
        let k = 2.0 * (k + 1) as f64;
        power = power * v2.scale(1.0 / (k * (k + 1.0)));
        sum = sum + power.scale(*b);
    }
    sum
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Catalan's constant G (Abramowitz & Stegun, 23.2.23 gives its series; value from memory).
    const CATALAN: f64 = 0.915_965_594_177_219;

    fn close(a: f64, b: f64, tol: f64) -> bool {
        (a - b).abs() <= tol
    }

    #[test]
    fn dilogarithm_meets_its_known_values() {
        // Li₂(1) = π²/6, Li₂(−1) = −π²/12, Li₂(1/2) = π²/12 − (ln 2)²/2 (Euler), Li₂(i) =
        // −π²/48 + iG (Lewin, Polylogarithms and Associated Functions, ch. 1, from memory).
        let ln2 = 2f64.ln();
        let pi2 = PI * PI;
        assert!(close(dilog(ONE).re, pi2 / 6.0, 1e-15));
        assert!(close(dilog(Complex::new(-1.0, 0.0)).re, -pi2 / 12.0, 1e-15));
        let half = dilog(Complex::new(0.5, 0.0));
        assert!(close(half.re, pi2 / 12.0 - ln2 * ln2 / 2.0, 1e-15));
        let i = dilog(Complex::new(0.0, 1.0));
        assert!(close(i.re, -pi2 / 48.0, 1e-15), "{i:?}");
        assert!(close(i.im, CATALAN, 1e-15), "{i:?}");
        // Clausen's function Cl₂(θ) = Im Li₂(e^(iθ)) peaks at θ = π/3 with 1.0149416064096536
        // (Abramowitz & Stegun, Table 27.6, from memory for the digits beyond the table's).
        let peak = dilog(Complex::polar(1.0, PI / 3.0)).im;
        assert!(close(peak, 1.014_941_606_409_653_6, 1e-15), "{peak}");
    }

    #[test]
    fn dilogarithm_matches_its_defining_series_inside_the_disc() {
        // Li₂(z) = Σ zᵐ/m² directly, where it converges quickly (|z| ≤ 0.8: 200 terms).
        for (r, angle) in [(0.3, 0.4), (0.6, 2.0), (0.8, -1.1), (0.55, 0.1), (0.7, 3.0)] {
            let z = Complex::polar(r, angle);
            let mut power = ONE;
            let mut direct = Complex::new(0.0, 0.0);
            for m in 1..=200 {
                power = power * z;
                direct = direct + power.scale(1.0 / (m * m) as f64);
            }
            let got = dilog(z);
            assert!(
                (got - direct).norm() < 1e-14,
                "z = {z:?}: {got:?} vs {direct:?}"
            );
        }
    }

    #[test]
    fn both_series_agree_wherever_both_converge() {
        // The two expansions are of one function; each is exact at any ratio, only slower away
        // from its own range. Comparing them checks the closed-form parts of both.
        for c in [0.6, 0.9, 1.0, 1.2, 1.7] {
            for u in [0.0, 0.4, 0.8, 0.97, 1.0] {
                for w in [0.0, 0.5 * c, 0.95 * c, c] {
                    let (across, along) = (modes_across(c, u, w), modes_along(c, u, w));
                    assert!(
                        close(across, along, 1e-13),
                        "c = {c}, u = {u}, w = {w}: {across} vs {along}"
                    );
                }
            }
        }
    }

    #[test]
    fn square_face_at_the_neutral_axis_has_the_closed_form_with_catalan() {
        // At u = 0 on the face of a square (c = a = 1) the second series' slow part is
        // Σ (−1)^j/n² = G, and its rest Σ (−1)^j 2e^(−nπ)/(n²(1 − e^(−nπ))) is summed here to
        // n = 15, beyond which terms are below 1e-20.
        let rest: f64 = (0..8)
            .map(|j| {
                let n = (2 * j + 1) as f64;
                let sign = if j % 2 == 0 { 1.0 } else { -1.0 };
                sign * 2.0 * (-n * PI).exp() / (n * n * (1.0 - (-n * PI).exp()))
            })
            .sum();
        let expected = 8.0 / (PI * PI) * (CATALAN + rest) - 0.5;
        assert!(close(psi_gradient(1.0, 0.0, 1.0), expected, 1e-12));
    }

    #[test]
    fn no_poisson_effect_leaves_the_mean() {
        let s = RectangleShear {
            depth_m: 0.05,
            width_m: 0.08,
            poisson_ratio: 0.0,
        };
        for u in [0.0, 0.01, 0.02, 0.025] {
            assert_eq!(s.face_stress_per_newton(u), s.mean_stress_per_newton(u));
        }
    }

    #[test]
    fn bad_input_gives_finite_numbers() {
        let nan = f64::NAN;
        let inf = f64::INFINITY;
        for (d, b, nu) in [
            (0.0, 0.02, 0.3),
            (-0.01, 0.02, 0.3),
            (nan, 0.02, 0.3),
            (0.02, inf, 0.3),
            (0.02, 0.03, nan),
            (0.02, 0.03, -1.0),
            (0.02, 0.03, 7.0),
            (1e-200, 1e200, 0.3),
            (1e200, 1e-200, 0.3),
            (1e-300, 1e-300, 0.3),
        ] {
            let s = RectangleShear {
                depth_m: d,
                width_m: b,
                poisson_ratio: nu,
            };
            for (u, w) in [
                (0.0, 0.0),
                (0.01, 1.0),
                (nan, 0.0),
                (0.0, inf),
                (-0.05, -0.05),
            ] {
                let tau = s.stress_per_newton(u, w);
                assert!(tau.is_finite(), "{s:?} at ({u}, {w}): {tau}");
                assert!(s.mean_stress_per_newton(u).is_finite());
            }
        }
    }
}
