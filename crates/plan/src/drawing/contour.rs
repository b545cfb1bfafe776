//! Contour lines over values sampled at the vertices of a triangle mesh (marching triangles).
//!
//! The value is taken as linear over each triangle, so a level crosses a triangle in at most
//! one straight segment. A segment is given as two edge crossings, each an interpolation
//! between two vertices: callers map them into whatever space they draw in (face coordinates,
//! 3-D positions, screen pixels).

/// Where a level crosses the edge from vertex `a` to vertex `b`: at `a + t (b − a)`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Crossing {
    /// First vertex of the edge.
    pub a: u32,
    /// Second vertex of the edge.
    pub b: u32,
    /// Fraction of the way from `a` to `b`, 0…1.
    pub t: f64,
}

impl Crossing {
    /// The crossing's point by linear interpolation of `points`.
    pub fn point<const N: usize>(&self, points: &[[f64; N]]) -> [f64; N] {
        let (p, q) = (points[self.a as usize], points[self.b as usize]);
        std::array::from_fn(|i| p[i] + self.t * (q[i] - p[i]))
    }
}

/// The segments of the contour at `level`. Triangles with a vertex without a value (off the
/// part) are skipped. A vertex exactly at the level counts as above it, so a level through a
/// vertex gives one segment, not a doubled one.
pub fn contour_segments(
    values: &[Option<f64>],
    triangles: &[[u32; 3]],
    level: f64,
) -> Vec<[Crossing; 2]> {
    let mut out = Vec::new();
    for tri in triangles {
        let Some(v) = tri
            .iter()
            .map(|&i| values.get(i as usize).copied().flatten())
            .collect::<Option<Vec<f64>>>()
        else {
            continue;
        };
        let above = |k: usize| v[k] >= level;
        let mut cut = [None, None];
        let mut n = 0;
        for (k, m) in [(0, 1), (1, 2), (2, 0)] {
            if above(k) != above(m) && n < 2 {
                let t = (level - v[k]) / (v[m] - v[k]);
                cut[n] = Some(Crossing {
                    a: tri[k],
                    b: tri[m],
                    t: t.clamp(0.0, 1.0),
                });
                n += 1;
            }
        }
        if let [Some(p), Some(q)] = cut {
            out.push([p, q]);
        }
    }
    out
}

/// Triangles of a regular grid of `nx × ns` nodes stored row-major (`j * nx + i`), two per
/// cell.
pub fn grid_triangles(nx: usize, ns: usize) -> Vec<[u32; 3]> {
    let mut out = Vec::with_capacity(2 * nx.saturating_sub(1) * ns.saturating_sub(1));
    for j in 0..ns.saturating_sub(1) {
        for i in 0..nx.saturating_sub(1) {
            let k = (j * nx + i) as u32;
            let (right, up) = (k + 1, k + nx as u32);
            out.push([k, right, up + 1]);
            out.push([k, up + 1, up]);
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A linear field f = x + 2y sampled on a grid: every contour point lies exactly on its
    /// level (marching triangles is exact for a field linear over each triangle), and the
    /// total length of the level line across the unit square is the analytic chord length.
    #[test]
    fn contours_of_a_linear_field_are_exact() {
        let (nx, ns) = (11, 9);
        let points: Vec<[f64; 2]> = (0..ns)
            .flat_map(|j| (0..nx).map(move |i| [i as f64 / 10.0, j as f64 / 8.0]))
            .collect();
        let values: Vec<Option<f64>> = points.iter().map(|p| Some(p[0] + 2.0 * p[1])).collect();
        let tris = grid_triangles(nx, ns);
        assert_eq!(tris.len(), 2 * 10 * 8);
        let level = 1.3;
        let segs = contour_segments(&values, &tris, level);
        assert!(!segs.is_empty());
        let mut length = 0.0;
        for [p, q] in &segs {
            let (a, b) = (p.point(&points), q.point(&points));
            assert!((a[0] + 2.0 * a[1] - level).abs() < 1e-12);
            assert!((b[0] + 2.0 * b[1] - level).abs() < 1e-12);
            length += ((a[0] - b[0]).powi(2) + (a[1] - b[1]).powi(2)).sqrt();
        }
        // x + 2y = 1.3 inside the unit square runs from (0, 0.65) to (1, 0.15).
        let expected = (1.0f64 + 0.5 * 0.5).sqrt();
        assert!((length - expected).abs() < 1e-9, "{length} vs {expected}");
    }

    #[test]
    fn triangles_off_the_part_draw_nothing() {
        let values = [Some(0.0), Some(1.0), None, Some(1.0)];
        let segs = contour_segments(&values, &[[0, 1, 2], [0, 1, 3]], 0.5);
        assert_eq!(segs.len(), 1);
    }
}
