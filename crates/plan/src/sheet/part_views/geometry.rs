//! Orthographic views of the part: the projection of each view, a depth buffer that tells a
//! hidden line from a seen one, and the silhouettes of round surfaces, which a mesh's feature
//! edges do not contain.

use gw_mechanics::{Member, VesselEnds};

use crate::drawing::part_mesh::{PartMesh, Region};
use crate::sheet::layout::Area;

/// A point or direction in the member axes, metres.
pub(super) type V3 = [f64; 3];

pub(super) fn dot(a: V3, b: V3) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

fn lerp(a: V3, b: V3, t: f64) -> V3 {
    std::array::from_fn(|i| a[i] + t * (b[i] - a[i]))
}

pub(super) fn dist2(a: [f32; 2], b: [f32; 2]) -> f32 {
    (a[0] - b[0]).hypot(a[1] - b[1])
}

/// Which way a view looks: page right, page up, and the direction towards the viewer, each
/// a unit axis of the member (right × up = toward).
#[derive(Debug, Clone)]
pub(super) struct View {
    pub title: &'static str,
    pub right: V3,
    pub up: V3,
    pub toward: V3,
    /// True for the view along the member's axis.
    pub along_axis: bool,
}

impl View {
    pub fn side(title: &'static str) -> Self {
        Self {
            title,
            right: [1.0, 0.0, 0.0],
            up: [0.0, 0.0, 1.0],
            toward: [0.0, -1.0, 0.0],
            along_axis: false,
        }
    }

    pub fn top(title: &'static str) -> Self {
        Self {
            title,
            right: [1.0, 0.0, 0.0],
            up: [0.0, 1.0, 0.0],
            toward: [0.0, 0.0, 1.0],
            along_axis: false,
        }
    }

    /// Seen from the front, right and above at once (isometric: the three axes equally
    /// foreshortened), for parts with no main axis.
    pub fn isometric(title: &'static str) -> Self {
        let (a, b, c) = (
            std::f64::consts::FRAC_1_SQRT_2,
            1.0 / 6f64.sqrt(),
            1.0 / 3f64.sqrt(),
        );
        Self {
            title,
            right: [a, a, 0.0],
            up: [-b, b, 2.0 * b],
            toward: [c, -c, c],
            along_axis: false,
        }
    }

    pub fn end(title: &'static str) -> Self {
        Self {
            title,
            right: [0.0, 1.0, 0.0],
            up: [0.0, 0.0, 1.0],
            toward: [1.0, 0.0, 0.0],
            along_axis: true,
        }
    }

    /// Smallest and largest (right, up) of the box from `lo` to `hi`.
    pub fn extent(&self, (lo, hi): (V3, V3)) -> ([f64; 2], [f64; 2]) {
        let mut min = [f64::INFINITY; 2];
        let mut max = [f64::NEG_INFINITY; 2];
        for c in 0..8 {
            let p: V3 = std::array::from_fn(|i| if c >> i & 1 == 0 { lo[i] } else { hi[i] });
            for (k, axis) in [self.right, self.up].into_iter().enumerate() {
                min[k] = min[k].min(dot(p, axis));
                max[k] = max[k].max(dot(p, axis));
            }
        }
        (min, max)
    }
}

/// A view placed on the page at `k` points per metre, its drawing box's top left at `at`.
#[derive(Debug, Clone)]
pub(super) struct Placed {
    pub view: View,
    pub k: f64,
    pub at: [f32; 2],
    origin: [f64; 2],
    pub size: [f32; 2],
}

impl Placed {
    pub fn new(view: View, k: f64, at: [f32; 2], bounds: (V3, V3)) -> Self {
        let (min, max) = view.extent(bounds);
        Self {
            view,
            k,
            at,
            origin: [min[0], max[1]],
            size: [
                ((max[0] - min[0]) * k) as f32,
                ((max[1] - min[1]) * k) as f32,
            ],
        }
    }

    pub fn page(&self, p: V3) -> [f32; 2] {
        [
            self.at[0] + ((dot(p, self.view.right) - self.origin[0]) * self.k) as f32,
            self.at[1] + ((self.origin[1] - dot(p, self.view.up)) * self.k) as f32,
        ]
    }

    /// A direction of the member on the page (not normalised; y down).
    pub fn direction(&self, d: V3) -> [f32; 2] {
        [dot(d, self.view.right) as f32, -dot(d, self.view.up) as f32]
    }

    pub fn depth(&self, p: V3) -> f64 {
        dot(p, self.view.toward)
    }

    /// The box the part itself takes on the page.
    pub fn drawing(&self) -> Area {
        Area::new(
            self.at[0],
            self.at[1],
            self.at[0] + self.size[0],
            self.at[1] + self.size[1],
        )
    }
}

/// `p` turned by `angle` (radians, right-handed) about the line through `centre` along the
/// unit vector `axis` (Rodrigues' rotation formula).
pub(super) fn rotated(p: V3, centre: V3, axis: V3, angle: f64) -> V3 {
    let d: V3 = std::array::from_fn(|i| p[i] - centre[i]);
    let (sin, cos) = angle.sin_cos();
    let cross = [
        axis[1] * d[2] - axis[2] * d[1],
        axis[2] * d[0] - axis[0] * d[2],
        axis[0] * d[1] - axis[1] * d[0],
    ];
    let along = dot(axis, d) * (1.0 - cos);
    std::array::from_fn(|i| centre[i] + d[i] * cos + cross[i] * sin + axis[i] * along)
}

/// Side of a cell of the depth buffer, points.
const CELL: f32 = 0.5;

/// The nearest depth of the part at each cell of a view.
pub(super) struct Depth {
    x0: f32,
    y0: f32,
    nx: usize,
    ny: usize,
    cells: Vec<f64>,
    tolerance: f64,
}

impl Depth {
    /// The depth buffer of the mesh (fixtures left out) in view `v`.
    pub fn of(mesh: &PartMesh, v: &Placed) -> Self {
        let b = v.drawing().grown(2.0);
        let nx = ((b.x1 - b.x0) / CELL).ceil() as usize + 1;
        let ny = ((b.y1 - b.y0) / CELL).ceil() as usize + 1;
        let (lo, hi) = part_bounds(mesh);
        let size = (0..3).map(|i| hi[i] - lo[i]).fold(0.0, f64::max);
        let mut d = Self {
            x0: b.x0,
            y0: b.y0,
            nx,
            ny,
            cells: vec![f64::NEG_INFINITY; nx * ny],
            tolerance: 2e-3 * size,
        };
        for (t, r) in mesh.triangles.iter().zip(&mesh.regions) {
            if *r == Region::Fixture {
                continue;
            }
            let p = t.map(|i| mesh.positions[i as usize]);
            d.fill(p.map(|p| v.page(p)), p.map(|p| v.depth(p)));
        }
        d
    }

    /// Rasterises one triangle, keeping the nearest depth in each cell.
    fn fill(&mut self, q: [[f32; 2]; 3], z: [f64; 3]) {
        let area =
            (q[1][0] - q[0][0]) * (q[2][1] - q[0][1]) - (q[2][0] - q[0][0]) * (q[1][1] - q[0][1]);
        if area.abs() < 1e-6 {
            return;
        }
        let cell = |v: f32, o: f32| ((v - o) / CELL).round();
        let (xs, ys) = (
            q.map(|p| cell(p[0], self.x0)),
            q.map(|p| cell(p[1], self.y0)),
        );
        let lo = |a: [f32; 3]| a.into_iter().fold(f32::MAX, f32::min).max(0.0) as usize;
        let hi = |a: [f32; 3], n: usize| {
            (a.into_iter().fold(f32::MIN, f32::max).max(0.0) as usize).min(n - 1)
        };
        for j in lo(ys)..=hi(ys, self.ny) {
            for i in lo(xs)..=hi(xs, self.nx) {
                let p = [self.x0 + i as f32 * CELL, self.y0 + j as f32 * CELL];
                let w = |a: [f32; 2], b: [f32; 2]| {
                    ((b[0] - a[0]) * (p[1] - a[1]) - (p[0] - a[0]) * (b[1] - a[1])) / area
                };
                let (w0, w1, w2) = (w(q[1], q[2]), w(q[2], q[0]), w(q[0], q[1]));
                if w0 < -1e-3 || w1 < -1e-3 || w2 < -1e-3 {
                    continue;
                }
                let depth = f64::from(w0) * z[0] + f64::from(w1) * z[1] + f64::from(w2) * z[2];
                let c = &mut self.cells[j * self.nx + i];
                *c = c.max(depth);
            }
        }
    }

    /// True when the part covers the page point `at`.
    pub fn covers(&self, at: [f32; 2]) -> bool {
        let i = ((at[0] - self.x0) / CELL).round();
        let j = ((at[1] - self.y0) / CELL).round();
        if i < 0.0 || j < 0.0 || i >= self.nx as f32 || j >= self.ny as f32 {
            return false;
        }
        self.cells[j as usize * self.nx + i as usize] > f64::NEG_INFINITY
    }

    /// True when a point at `depth` drawn at `at` is not behind the part: its cell shows
    /// nothing nearer, or a covered cell beside it does not (a line along the edge of a face
    /// seen at a grazing angle).
    pub fn seen(&self, at: [f32; 2], depth: f64) -> bool {
        let ci = ((at[0] - self.x0) / CELL).round() as i64;
        let cj = ((at[1] - self.y0) / CELL).round() as i64;
        let cell = |i: i64, j: i64| {
            if i < 0 || j < 0 || i >= self.nx as i64 || j >= self.ny as i64 {
                f64::NEG_INFINITY
            } else {
                self.cells[j as usize * self.nx + i as usize]
            }
        };
        let own = cell(ci, cj);
        if own == f64::NEG_INFINITY || own <= depth + self.tolerance {
            return true;
        }
        [(1, 0), (-1, 0), (0, 1), (0, -1)].iter().any(|(di, dj)| {
            let z = cell(ci + di, cj + dj);
            z > f64::NEG_INFINITY && z <= depth + self.tolerance
        })
    }
}

/// A line on the page, seen or hidden.
pub(super) struct Run {
    pub points: Vec<[f32; 2]>,
    pub hidden: bool,
}

/// A polyline of the member cut into seen and hidden runs (`depth` `None`: all seen).
pub(super) fn runs(line: &[V3], v: &Placed, depth: Option<&Depth>) -> Vec<Run> {
    let mut out: Vec<Run> = Vec::new();
    let mut current: Option<Run> = None;
    for seg in line.windows(2) {
        let (pa, pb) = (v.page(seg[0]), v.page(seg[1]));
        let n = dist2(pa, pb).ceil().max(1.0) as usize;
        for i in 0..=n {
            let p3 = lerp(seg[0], seg[1], i as f64 / n as f64);
            let p = v.page(p3);
            let hidden = depth.is_some_and(|d| !d.seen(p, v.depth(p3)));
            match current.as_mut() {
                Some(r) if r.hidden == hidden => {
                    if i == n {
                        r.points.push(p);
                    }
                }
                _ => {
                    if let Some(mut r) = current.take() {
                        r.points.push(p);
                        out.push(r);
                    }
                    current = Some(Run {
                        points: vec![p],
                        hidden,
                    });
                }
            }
        }
    }
    out.extend(current);
    out.retain(|r| r.points.windows(2).map(|s| dist2(s[0], s[1])).sum::<f32>() > 0.5);
    out
}

/// Smallest and largest corner of the part without its fixtures.
pub(super) fn part_bounds(mesh: &PartMesh) -> (V3, V3) {
    let mut used = vec![false; mesh.positions.len()];
    for (t, r) in mesh.triangles.iter().zip(&mesh.regions) {
        if *r != Region::Fixture {
            for &i in t {
                used[i as usize] = true;
            }
        }
    }
    let mut lo = [f64::INFINITY; 3];
    let mut hi = [f64::NEG_INFINITY; 3];
    for (p, _) in mesh.positions.iter().zip(&used).filter(|(_, u)| **u) {
        for k in 0..3 {
            lo[k] = lo[k].min(p[k]);
            hi[k] = hi[k].max(p[k]);
        }
    }
    (lo, hi)
}

/// A line of the drawing in the member axes, and whether it is always seen (an outer
/// silhouette, which lies on the edge of the part's own depth buffer).
pub(super) type Outline = (Vec<V3>, bool);

/// The two lines along a cylinder about `axis` (0 = x, 2 = z) where its surface turns away
/// from the viewer, from `a` to `b` along the axis.
fn cylinder_silhouette(
    axis: usize,
    r: f64,
    (a, b): (f64, f64),
    v: &View,
    seen: bool,
) -> Vec<Outline> {
    if v.toward[axis].abs() > 0.99 || r <= 0.0 {
        return Vec::new();
    }
    // The unit direction across the axis and across the line of sight.
    let across: V3 = {
        let mut e = [0.0; 3];
        e[axis] = 1.0;
        let c = [
            e[1] * v.toward[2] - e[2] * v.toward[1],
            e[2] * v.toward[0] - e[0] * v.toward[2],
            e[0] * v.toward[1] - e[1] * v.toward[0],
        ];
        let n = dot(c, c).sqrt();
        c.map(|x| x / n)
    };
    [1.0, -1.0]
        .into_iter()
        .map(|sign| {
            let at = |t: f64| {
                let mut p = across.map(|c| sign * r * c);
                p[axis] = t;
                p
            };
            (vec![at(a), at(b)], seen)
        })
        .collect()
}

/// A circle about `axis` through `centre` of radius `r`.
pub(super) fn ring(centre: V3, axis: usize, r: f64) -> Vec<V3> {
    let (u, w) = ((axis + 1) % 3, (axis + 2) % 3);
    (0..=96)
        .map(|k| {
            let t = std::f64::consts::TAU * k as f64 / 96.0;
            let mut p = centre;
            p[u] += r * t.cos();
            p[w] += r * t.sin();
            p
        })
        .collect()
}

/// Radii of the outer surface and bore of a round part along x, its length, and whether its
/// ends are closed.
pub(super) fn round_along_x(member: &Member) -> Option<(f64, f64, f64, bool)> {
    match member {
        Member::Beam(b) => b
            .section
            .radii_m()
            .map(|(ro, ri)| (ro, ri, b.length_m, false)),
        Member::Shaft(s) => Some((s.radius_m(), s.inner_diameter_m / 2.0, s.length_m, false)),
        Member::ThinCylinder(c) => {
            let ro = c.outer_diameter_m / 2.0;
            Some((ro, ro - c.wall_m, c.length_m, c.ends == VesselEnds::Closed))
        }
        Member::ThickCylinder(c) => Some((
            c.outer_diameter_m / 2.0,
            c.inner_diameter_m / 2.0,
            c.length_m,
            c.ends == VesselEnds::Closed,
        )),
        _ => None,
    }
}

/// Silhouettes and hidden bores of round surfaces in view `v`.
pub(super) fn silhouettes(member: &Member, v: &View) -> Vec<Outline> {
    let mut out = Vec::new();
    if let Some((ro, ri, l, closed)) = round_along_x(member) {
        out.extend(cylinder_silhouette(0, ro, (0.0, l), v, true));
        out.extend(cylinder_silhouette(0, ri, (0.0, l), v, false));
        if closed && v.along_axis && ri > 0.0 {
            // The bore behind a closed end, seen through it as a hidden circle.
            out.push((ring([l - (ro - ri), 0.0, 0.0], 0, ri), false));
        }
    }
    match member {
        Member::ThinSphere(s) => {
            let r = s.outer_diameter_m / 2.0;
            let circle = (0..=96)
                .map(|k| {
                    let (sin, cos) = (std::f64::consts::TAU * k as f64 / 96.0).sin_cos();
                    std::array::from_fn(|i| r * (cos * v.right[i] + sin * v.up[i]))
                })
                .collect();
            out.push((circle, true));
        }
        Member::PlateWithHole(p) => {
            let ht = p.thickness_m / 2.0;
            out.extend(cylinder_silhouette(
                2,
                p.hole_diameter_m / 2.0,
                (-ht, ht),
                v,
                false,
            ));
        }
        _ => {}
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use gw_mechanics::{Beam, BeamSupport, Material, Section};

    /// A rectangular tube seen from the side: its outer top edge is seen, a line inside it,
    /// behind the front wall, is hidden (the depth buffer, not the edge list, decides).
    #[test]
    fn a_line_inside_a_tube_is_hidden_and_its_outer_edge_seen() {
        let m = Member::Beam(
            Beam::new(
                Section::RectangularTube {
                    width_m: 0.05,
                    height_m: 0.08,
                    wall_m: 0.004,
                },
                Material::new("m", 200e9, 0.3, 12e-6, 300e6).unwrap(),
                0.5,
                BeamSupport::SimplySupported,
                0.25,
            )
            .unwrap(),
        );
        let mesh = PartMesh::of(&m);
        let v = Placed::new(View::side("s"), 1000.0, [100.0, 100.0], part_bounds(&mesh));
        let depth = Depth::of(&mesh, &v);
        let outer = runs(
            &[[0.0, -0.025, 0.04], [0.5, -0.025, 0.04]],
            &v,
            Some(&depth),
        );
        assert!(outer.iter().all(|r| !r.hidden), "outer edge seen");
        let inner = runs(&[[0.0, 0.0, 0.036], [0.5, 0.0, 0.036]], &v, Some(&depth));
        assert!(
            !inner.is_empty() && inner.iter().all(|r| r.hidden),
            "inner wall hidden"
        );
        // The page box is the part's length and height at the scale.
        assert!((v.size[0] - 500.0).abs() < 1e-3 && (v.size[1] - 80.0).abs() < 1e-3);
    }
}
