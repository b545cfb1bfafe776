//! What the part view draws, in two caches: the scene (mesh, map values and colours, contour
//! lines, load glyphs), rebuilt when the project, the part, the load case or the map choice
//! changes; and its projection (screen positions, visible triangles far to near, the egui
//! mesh), rebuilt when the camera or the view's size changes.

use std::sync::Arc;

use egui::{Color32, Pos2, Rect, epaint};
use gw_mechanics::{LoadVector, Member};
use gw_plan::drawing::contour::contour_segments;
use gw_plan::drawing::load_glyphs::{GlyphShape, LoadGlyph, load_glyphs};
use gw_plan::drawing::part_mesh::{PartMesh, Region};

use super::camera::Camera;
use crate::panels::map::MapSettings;
use crate::units::Units;

/// What the scene was built for.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SceneKey {
    /// Evaluation count of the document.
    pub evaluations: u64,
    /// Part index.
    pub part: usize,
    /// Load case index.
    pub case: usize,
    /// Map choice.
    pub map: MapSettings,
    /// Units: the contours lie at the legend's ticks, round in the unit shown.
    pub units: Units,
}

/// A contour segment in space with the normal of the surface it lies on.
pub type ContourSegment = ([f64; 3], [f64; 3], [f64; 3]);

/// The part in space with its map.
pub struct Scene {
    /// What it was built for.
    pub key: SceneKey,
    /// The mesh.
    pub mesh: PartMesh,
    /// Map value per vertex.
    pub values: Vec<Option<f64>>,
    /// Smallest and largest value on the part.
    pub found: Option<(f64, f64)>,
    /// Unshaded colour per vertex.
    pub colours: Vec<Color32>,
    /// Contour lines at the legend's ticks.
    pub contours: Vec<ContourSegment>,
    /// The loads of the case.
    pub glyphs: Vec<LoadGlyph>,
    /// Counts rebuilds, so that projections know when to follow.
    pub generation: u64,
    /// The mesh's bounding box (smallest and largest x, y, z), metres.
    pub bounds: ([f64; 3], [f64; 3]),
}

/// Our body and fixture greys.
const BODY: Color32 = Color32::from_rgb(196, 198, 200);
const FIXTURE: Color32 = Color32::from_rgb(112, 118, 128);

impl Scene {
    /// Points of the part and its load arrows, for fitting the view.
    pub fn extent_points(&self) -> Vec<[f64; 3]> {
        let mut points = self.mesh.positions.clone();
        for g in &self.glyphs {
            match &g.shape {
                GlyphShape::Arrows(list) => points.extend(list.iter().flatten()),
                GlyphShape::Couple {
                    centre, radius_m, ..
                } => {
                    points.push(centre.map(|c| c - radius_m));
                    points.push(centre.map(|c| c + radius_m));
                }
            }
        }
        points
    }

    /// Builds the scene of `member` under `loads`.
    pub fn build(key: SceneKey, member: &Member, loads: &LoadVector, generation: u64) -> Self {
        let map = key.map;
        let mesh = PartMesh::of(member);
        let values = mesh.values(member, loads, (map.surface(), map.basis));
        let found = values
            .iter()
            .flatten()
            .fold(None, |acc: Option<(f64, f64)>, &v| {
                Some(acc.map_or((v, v), |(lo, hi)| (lo.min(v), hi.max(v))))
            });
        let range = map.scale_range(found.unwrap_or((0.0, 0.0)));
        let colours = mesh.triangles.iter().zip(&mesh.regions).fold(
            vec![BODY; mesh.positions.len()],
            |mut c, (t, r)| {
                for &k in t {
                    c[k as usize] = match (r, values[k as usize]) {
                        (Region::Face(_), Some(v)) => map.colour(v, range),
                        (Region::Fixture, _) => FIXTURE,
                        _ => BODY,
                    };
                }
                c
            },
        );
        let contours = if map.contours {
            contour_lines(&mesh, &values, range, &map.levels(range, key.units))
        } else {
            Vec::new()
        };
        Self {
            key,
            glyphs: load_glyphs(member, loads),
            bounds: mesh.bounds(),
            mesh,
            values,
            found,
            colours,
            contours,
            generation,
        }
    }
}

/// Contour segments of the face triangles at every legend tick except zero's neighbours on a
/// stress map (where zero is the floor).
fn contour_lines(
    mesh: &PartMesh,
    values: &[Option<f64>],
    range: (f64, f64),
    levels: &[f64],
) -> Vec<ContourSegment> {
    let faces: Vec<[u32; 3]> = mesh
        .triangles
        .iter()
        .zip(&mesh.regions)
        .filter(|(_, r)| matches!(r, Region::Face(_)))
        .map(|(t, _)| *t)
        .collect();
    let mut out = Vec::new();
    for &level in levels {
        if level <= range.0 || level >= range.1 {
            continue;
        }
        for [a, b] in contour_segments(values, &faces, level) {
            let n = mesh.normals[a.a as usize];
            out.push((a.point(&mesh.positions), b.point(&mesh.positions), n));
        }
    }
    out
}

/// The scene as seen by one camera in one rectangle.
pub struct Projection {
    /// What it was built for.
    pub key: (Camera, Rect, u64),
    /// Screen position per vertex.
    pub screen: Vec<Pos2>,
    /// Depth per vertex (larger is nearer).
    pub depth: Vec<f32>,
    /// Front-facing triangles, far to near.
    pub order: Vec<u32>,
    /// The shaded, sorted mesh.
    pub mesh: Arc<epaint::Mesh>,
    /// Which visible triangles lie over each part of the rectangle.
    cells: ScreenCells,
}

/// Cells across the longer side of the view's rectangle.
const CELLS: f32 = 64.0;

/// The visible triangles by the cells of a grid over the view's rectangle that their screen
/// boxes touch, so that finding what lies under a point looks at a few triangles, not all:
/// for each cell, the triangles' ranks in the far-to-near order, rising.
#[derive(Debug, Clone, Default)]
struct ScreenCells {
    origin: Pos2,
    size: f32,
    nx: usize,
    ny: usize,
    /// Where each cell's ranks start in `ranks` (one more entry than cells).
    start: Vec<u32>,
    ranks: Vec<u32>,
}

impl ScreenCells {
    fn build(rect: Rect, screen: &[Pos2], triangles: &[[u32; 3]], order: &[u32]) -> Self {
        let size = (rect.width().max(rect.height()) / CELLS).max(1.0);
        let nx = (rect.width() / size).ceil().max(1.0) as usize;
        let ny = (rect.height() / size).ceil().max(1.0) as usize;
        let mut cells = Self {
            origin: rect.min,
            size,
            nx,
            ny,
            start: vec![0; nx * ny + 1],
            ranks: Vec::new(),
        };
        // Each triangle's cells, found once: (x from, x to, y from, y to), None off the view.
        let spans: Vec<Option<(u16, u16, u16, u16)>> = order
            .iter()
            .map(|&i| {
                let t = triangles[i as usize].map(|k| screen[k as usize]);
                let (lo, hi) = (t[0].min(t[1]).min(t[2]), t[0].max(t[1]).max(t[2]));
                cells
                    .range(lo, hi)
                    .map(|(x0, x1, y0, y1)| (x0 as u16, x1 as u16, y0 as u16, y1 as u16))
            })
            .collect();
        let cells_of = |span: (u16, u16, u16, u16)| {
            let (x0, x1, y0, y1) = span;
            (y0..=y1)
                .flat_map(move |y| (x0..=x1).map(move |x| usize::from(y) * nx + usize::from(x)))
        };
        let mut count = vec![0u32; nx * ny];
        for span in spans.iter().flatten() {
            for c in cells_of(*span) {
                count[c] += 1;
            }
        }
        let mut start = vec![0u32; nx * ny + 1];
        for c in 0..nx * ny {
            start[c + 1] = start[c] + count[c];
        }
        let mut next = start.clone();
        let mut ranks = vec![0u32; start[nx * ny] as usize];
        for (rank, span) in spans.iter().enumerate() {
            if let Some(span) = span {
                for c in cells_of(*span) {
                    ranks[next[c] as usize] = rank as u32;
                    next[c] += 1;
                }
            }
        }
        cells.start = start;
        cells.ranks = ranks;
        cells
    }

    /// The cells a screen box touches (x from, x to, y from, y to); None when it lies off the
    /// rectangle or is not a number.
    fn range(&self, lo: Pos2, hi: Pos2) -> Option<(usize, usize, usize, usize)> {
        let fx = |v: f32| (v - self.origin.x) / self.size;
        let fy = |v: f32| (v - self.origin.y) / self.size;
        let (x0, x1, y0, y1) = (fx(lo.x), fx(hi.x), fy(lo.y), fy(hi.y));
        let (w, h) = (self.nx as f32, self.ny as f32);
        if !(x1 >= 0.0 && y1 >= 0.0 && x0 < w && y0 < h) {
            return None;
        }
        let clamp = |v: f32, n: usize| (v.max(0.0) as usize).min(n - 1);
        Some((
            clamp(x0, self.nx),
            clamp(x1, self.nx),
            clamp(y0, self.ny),
            clamp(y1, self.ny),
        ))
    }

    /// The ranks of the triangles whose boxes touch the cell under `p`, far to near.
    fn under(&self, p: Pos2) -> &[u32] {
        match self.range(p, p) {
            Some((x, _, y, _)) => {
                let c = y * self.nx + x;
                &self.ranks[self.start[c] as usize..self.start[c + 1] as usize]
            }
            None => &[],
        }
    }
}

fn dot(a: [f64; 3], b: [f64; 3]) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

impl Projection {
    /// Projects `scene` with `camera` into `rect`.
    pub fn build(scene: &Scene, camera: &Camera, rect: Rect) -> Self {
        let centre = rect.center();
        let m = &scene.mesh;
        let (screen, depth): (Vec<Pos2>, Vec<f32>) = m
            .positions
            .iter()
            .map(|p| camera.project(*p, centre))
            .unzip();
        let (right, up, eye) = camera.basis();
        // A light from over the viewer's left shoulder.
        let light = {
            let l: [f64; 3] = std::array::from_fn(|i| eye[i] + 0.5 * up[i] - 0.35 * right[i]);
            let n = dot(l, l).sqrt();
            l.map(|c| c / n)
        };
        // Far to near: the depth sum's bits made to sort as unsigned integers (the sign bit
        // flipped for positives, every bit for negatives), the triangle's number below them.
        let sortable = |d: f32| {
            let bits = d.to_bits();
            if bits >> 31 == 1 {
                !bits
            } else {
                bits | 1 << 31
            }
        };
        let mut order: Vec<u64> = m
            .triangles
            .iter()
            .enumerate()
            .filter(|(_, t)| {
                let n: [f64; 3] =
                    std::array::from_fn(|i| t.iter().map(|&k| m.normals[k as usize][i]).sum());
                dot(n, eye) > 1e-9
            })
            .map(|(i, t)| {
                let d = t.iter().map(|&k| depth[k as usize]).sum::<f32>();
                (u64::from(sortable(d)) << 32) | i as u64
            })
            .collect();
        order.sort_unstable();
        let order: Vec<u32> = order.into_iter().map(|k| k as u32).collect();
        let mut mesh = epaint::Mesh::default();
        mesh.reserve_vertices(screen.len());
        for (k, p) in screen.iter().enumerate() {
            let shade = 0.58 + 0.42 * dot(m.normals[k], light).max(0.0) as f32;
            let c = scene.colours[k];
            let s = |v: u8| (f32::from(v) * shade).round().clamp(0.0, 255.0) as u8;
            mesh.colored_vertex(*p, Color32::from_rgb(s(c.r()), s(c.g()), s(c.b())));
        }
        mesh.reserve_triangles(order.len());
        for &i in &order {
            let [a, b, c] = m.triangles[i as usize];
            mesh.add_triangle(a, b, c);
        }
        let cells = ScreenCells::build(rect, &screen, &m.triangles, &order);
        Self {
            key: (*camera, rect, scene.generation),
            screen,
            depth,
            order,
            mesh: Arc::new(mesh),
            cells,
        }
    }

    /// The nearest visible triangle under `p`, with the barycentric weights of `p` in it.
    pub fn pick(&self, scene: &Scene, p: Pos2) -> Option<(usize, [f32; 3])> {
        self.cells.under(p).iter().rev().find_map(|&rank| {
            let i = self.order[rank as usize];
            let t = scene.mesh.triangles[i as usize];
            barycentric(p, t.map(|k| self.screen[k as usize])).map(|w| (i as usize, w))
        })
    }

    /// True when a visible triangle nearer than `depth` covers `p`.
    pub fn occluded(&self, scene: &Scene, p: Pos2, depth: f32, tolerance: f32) -> bool {
        self.cells.under(p).iter().any(|&rank| {
            let i = self.order[rank as usize];
            let t = scene.mesh.triangles[i as usize];
            barycentric(p, t.map(|k| self.screen[k as usize])).is_some_and(|w| {
                let d: f32 = (0..3).map(|j| w[j] * self.depth[t[j] as usize]).sum();
                d > depth + tolerance
            })
        })
    }
}

/// Barycentric weights of `p` in the screen triangle `t`, if inside.
fn barycentric(p: Pos2, t: [Pos2; 3]) -> Option<[f32; 3]> {
    let (min, max) = (t[0].min(t[1]).min(t[2]), t[0].max(t[1]).max(t[2]));
    if p.x < min.x || p.x > max.x || p.y < min.y || p.y > max.y {
        return None;
    }
    let v0 = t[1] - t[0];
    let v1 = t[2] - t[0];
    let v2 = p - t[0];
    let den = v0.x * v1.y - v1.x * v0.y;
    if den.abs() < 1e-12 {
        return None;
    }
    let b = (v2.x * v1.y - v1.x * v2.y) / den;
    let c = (v0.x * v2.y - v2.x * v0.y) / den;
    let a = 1.0 - b - c;
    let eps = -1e-4;
    (a >= eps && b >= eps && c >= eps).then_some([a, b, c])
}
