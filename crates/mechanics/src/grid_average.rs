//! What a gauge grid of finite size actually reads: the surface field averaged over the grid
//! area by Gauss–Legendre quadrature.

use serde::{Deserialize, Serialize};

use crate::error::{MechanicsError, Result, finite, positive_dimension};
use crate::load::LoadVector;
use crate::member::Member;
use crate::surface::SurfacePoint;
use crate::surface_state::SurfaceState;

/// A grid's active area on the surface: a rectangle centred on `center`, its length along
/// `angle_rad` (from local x towards local y).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct GridFootprint {
    /// Centre of the active grid area.
    pub center: SurfacePoint,
    /// Grid direction, radians from local x.
    pub angle_rad: f64,
    /// Active grid length along the grid direction, metres.
    pub length_m: f64,
    /// Active grid width across it, metres.
    pub width_m: f64,
}

/// Quadrature points along and across the grid. Default 8 × 4: exact for polynomial fields up
/// to degree 15 along and 7 across.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct QuadratureOrder {
    /// Points along the grid.
    pub along: usize,
    /// Points across the grid.
    pub across: usize,
}

impl Default for QuadratureOrder {
    fn default() -> Self {
        Self {
            along: 8,
            across: 4,
        }
    }
}

/// Gauss–Legendre nodes and weights on [−1, 1], by Newton iteration on Pₙ.
///
/// Source: Press et al., *Numerical Recipes*, 3rd ed., §4.6 (routine `gauleg`).
/// ```
/// # use gw_mechanics::grid_average::gauss_legendre;
/// // Two-point rule: nodes ±1/√3, weights 1 (Abramowitz & Stegun, Table 25.4).
/// let (x, w) = gauss_legendre(2);
/// assert!((x[1] - 1.0 / 3f64.sqrt()).abs() < 1e-15 && (w[0] - 1.0).abs() < 1e-15);
/// ```
pub fn gauss_legendre(n: usize) -> (Vec<f64>, Vec<f64>) {
    let n = n.max(1);
    let mut nodes = vec![0.0; n];
    let mut weights = vec![0.0; n];
    let m = n.div_ceil(2);
    for i in 0..m {
        let mut z = (std::f64::consts::PI * (i as f64 + 0.75) / (n as f64 + 0.5)).cos();
        let mut derivative = 1.0;
        for _ in 0..100 {
            let (mut p1, mut p2) = (1.0, 0.0);
            for j in 0..n {
                let p3 = p2;
                p2 = p1;
                p1 = ((2.0 * j as f64 + 1.0) * z * p2 - j as f64 * p3) / (j as f64 + 1.0);
            }
            derivative = n as f64 * (z * p1 - p2) / (z * z - 1.0);
            let step = p1 / derivative;
            z -= step;
            if step.abs() < 1e-15 {
                break;
            }
        }
        nodes[i] = -z;
        nodes[n - 1 - i] = z;
        let w = 2.0 / ((1.0 - z * z) * derivative * derivative);
        weights[i] = w;
        weights[n - 1 - i] = w;
    }
    (nodes, weights)
}

/// Orders up to this one keep their nodes and weights after the first use.
const CACHED_ORDERS: usize = 16;

/// The Gauss–Legendre rule of order `n`, computed once per order (grids are averaged for every
/// reading of every evaluation).
fn rule(n: usize) -> std::borrow::Cow<'static, (Vec<f64>, Vec<f64>)> {
    static RULES: std::sync::OnceLock<Vec<(Vec<f64>, Vec<f64>)>> = std::sync::OnceLock::new();
    let n = n.max(1);
    if n > CACHED_ORDERS {
        return std::borrow::Cow::Owned(gauss_legendre(n));
    }
    let rules = RULES.get_or_init(|| (1..=CACHED_ORDERS).map(gauss_legendre).collect());
    std::borrow::Cow::Borrowed(&rules[n - 1])
}

impl GridFootprint {
    /// Checks the footprint's numbers.
    pub fn validate(&self) -> Result<()> {
        positive_dimension("grid length", self.length_m)?;
        positive_dimension("grid width", self.width_m)?;
        finite("grid angle", self.angle_rad)?;
        finite("grid position x", self.center.x_m)?;
        finite("grid position s", self.center.s_m)?;
        Ok(())
    }

    /// The surface point at grid coordinates (u along, v across), metres from the centre.
    pub fn point(&self, u_m: f64, v_m: f64) -> SurfacePoint {
        let (sin, cos) = self.angle_rad.sin_cos();
        SurfacePoint::new(
            self.center.face,
            self.center.x_m + u_m * cos - v_m * sin,
            self.center.s_m + u_m * sin + v_m * cos,
        )
    }

    /// The four corners, in order round the rectangle.
    pub fn corners(&self) -> [SurfacePoint; 4] {
        let (l, w) = (self.length_m / 2.0, self.width_m / 2.0);
        [
            self.point(-l, -w),
            self.point(l, -w),
            self.point(l, w),
            self.point(-l, w),
        ]
    }
}

/// The surface state averaged over the grid area. Linear in `loads`, so it superposes.
/// Exact for fields that are polynomials of low degree over the grid (uniform, linear, …).
pub fn grid_average_state(
    member: &Member,
    grid: &GridFootprint,
    loads: &LoadVector,
    order: QuadratureOrder,
) -> Result<SurfaceState> {
    grid.validate()?;
    member.check_loads(loads)?;
    // One check of the centre gives the user the clearest message when the whole grid is off.
    member.locate(&grid.center)?;
    let faces = member.faces();
    let Some(extent) = faces.iter().find(|f| f.face == grid.center.face) else {
        return Err(MechanicsError::PointOffPart {
            what: "the grid",
            detail: format!(
                "a {} has no {}",
                member.kind_name(),
                grid.center.face.name()
            ),
        });
    };
    let along = rule(order.along);
    let across = rule(order.across);
    let ((ua, wa), (va, wb)) = (along.as_ref(), across.as_ref());
    if let Member::ImportedField(m) = member {
        return imported_average(m, grid, loads, (ua, wa), (va, wb));
    }
    let mut sum = SurfaceState::default();
    for (u, wu) in ua.iter().zip(wa) {
        for (v, wv) in va.iter().zip(wb) {
            let p = grid.point(u * grid.length_m / 2.0, v * grid.width_m / 2.0);
            let located = extent
                .locate(&p)
                .map_err(|detail| MechanicsError::PointOffPart {
                    what: "part of the grid",
                    detail: format!("{detail}; move the gauge or choose a shorter grid"),
                })?;
            sum = sum + member.state_unchecked(&located, loads) * (wu * wv / 4.0);
        }
    }
    Ok(sum)
}

/// The average over a grid on an imported surface: each quadrature point laid out on the
/// tangent plane at the grid's centre (true lengths, whatever the face's flat coordinates do),
/// found on the surface under it (on the next face where the grid runs over an edge), and read
/// in the centre's axes laid onto the surface there.
fn imported_average(
    m: &crate::imported::ImportedSurface,
    grid: &GridFootprint,
    loads: &LoadVector,
    (ua, wa): (&[f64], &[f64]),
    (va, wb): (&[f64], &[f64]),
) -> Result<SurfaceState> {
    let field = m.loaded()?;
    let home = field.locate(&grid.center)?;
    let frame = field.frame_at(&home);
    let (sin, cos) = grid.angle_rad.sin_cos();
    let along: [f64; 3] = std::array::from_fn(|k| cos * frame.axis_x[k] + sin * frame.axis_y[k]);
    let across: [f64; 3] = std::array::from_fn(|k| -sin * frame.axis_x[k] + cos * frame.axis_y[k]);
    let reach = 0.5 * grid.length_m.max(grid.width_m);
    let mut sum = SurfaceState::default();
    for (u, wu) in ua.iter().zip(wa) {
        for (v, wv) in va.iter().zip(wb) {
            let (du, dv) = (u * grid.length_m / 2.0, v * grid.width_m / 2.0);
            let p: [f64; 3] =
                std::array::from_fn(|k| frame.position[k] + du * along[k] + dv * across[k]);
            let at = field.locate_near(home.face, p, reach).ok_or_else(|| {
                MechanicsError::PointOffPart {
                    what: "part of the grid",
                    detail: format!(
                        "it runs off the surface of {} near its edge; move the gauge or choose \
                         a shorter grid",
                        grid.center.face.name()
                    ),
                }
            })?;
            let state = field.state_in_axes(&at, (frame.axis_x, frame.axis_y), loads, &m.material);
            sum = sum + state * (wu * wv / 4.0);
        }
    }
    Ok(sum)
}

/// The strain the grid reads along its own direction, averaged over its area (no transverse
/// sensitivity; see [`crate::transverse`]).
pub fn grid_average_strain(
    member: &Member,
    grid: &GridFootprint,
    loads: &LoadVector,
    order: QuadratureOrder,
) -> Result<f64> {
    Ok(grid_average_state(member, grid, loads, order)?
        .strain
        .along(grid.angle_rad))
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn gauss_legendre_integrates_x_to_the_ninth_with_five_points() {
        // An n-point rule is exact to degree 2n − 1 (Abramowitz & Stegun §25.4.29).
        let (x, w) = gauss_legendre(5);
        let integral: f64 = x.iter().zip(&w).map(|(x, w)| w * x.powi(8)).sum();
        assert_relative_eq!(integral, 2.0 / 9.0, max_relative = 1e-13);
        let weights: f64 = w.iter().sum();
        assert_relative_eq!(weights, 2.0, max_relative = 1e-14);
    }
}
