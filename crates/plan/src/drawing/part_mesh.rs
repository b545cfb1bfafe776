//! The part as a triangle mesh in space, built from its model: the gaugeable faces finely
//! divided (each vertex knows its surface point, so the colour map is sampled there), the rest
//! of the body (end faces, flange edges, bores, plate edges) and the fixtures (clamp block,
//! pins) coarsely. Global axes as in [`gw_mechanics::surface_geometry`].

use gw_mechanics::{
    Beam, BeamSupport, Face, LoadVector, Member, PlateWithHole, Section, StrainBasis, SurfacePoint,
    SurfaceQuantity, VesselEnds, quantity_of,
};

use std::collections::HashMap;

use gw_mechanics::imported::SurfaceField;

use super::contour::grid_triangles;

/// What a triangle belongs to.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Region {
    /// A face gauges can go on.
    Face(Face),
    /// The rest of the part.
    Body,
    /// A clamp or support, not part of the part.
    Fixture,
}

/// A triangle mesh of a part. Vertices carry outward normals; triangles are unoriented (use
/// the normals to cull back faces).
#[derive(Debug, Clone, Default, PartialEq)]
pub struct PartMesh {
    /// Vertex positions, metres.
    pub positions: Vec<[f64; 3]>,
    /// Unit outward normal at each vertex.
    pub normals: Vec<[f64; 3]>,
    /// The surface point of each vertex of a gaugeable face.
    pub points: Vec<Option<SurfacePoint>>,
    /// Triangles as vertex indices.
    pub triangles: Vec<[u32; 3]>,
    /// What each triangle belongs to.
    pub regions: Vec<Region>,
    /// Feature edges (face outlines, section corners, end rings) as vertex polylines, with
    /// the region each belongs to.
    pub edges: Vec<(Region, Vec<u32>)>,
}

/// Which borders of a patch are edges of the part.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Edges {
    /// The whole border (a flat face).
    Loop,
    /// The first and last rows of nodes (rings of an end face or a hole).
    Rows,
    /// The first and last columns (the end rings of a round face).
    Columns,
    /// None (a closed surface such as a sphere).
    Neither,
}

/// Divisions of the gaugeable faces. The mesh has about `2 × along × around` triangles on a
/// round part.
const ALONG: usize = 96;
const AROUND: usize = 96;
const ACROSS_FLAT: usize = 24;
const PLATE_RADIAL: usize = 28;
const PLATE_AROUND: usize = 144;

impl PartMesh {
    /// The mesh of a member.
    pub fn of(member: &Member) -> Self {
        let mut b = PartMesh::default();
        if let Member::ImportedField(m) = member {
            if let Some(field) = m.surface() {
                b.imported_surface(field);
            }
            return b;
        }
        for extent in member.faces() {
            if extent.hole_radius_m.is_none() {
                b.face_patch(member, extent.face, extent.x_range_m, extent.s_range_m);
            }
        }
        match member {
            Member::Beam(beam) => b.beam_body(beam),
            Member::Shaft(s) => b.round_body(s.length_m, s.radius_m(), s.inner_diameter_m / 2.0),
            Member::ThinCylinder(c) => {
                let ro = c.outer_diameter_m / 2.0;
                let ri = if c.ends == VesselEnds::Closed {
                    0.0
                } else {
                    ro - c.wall_m
                };
                b.round_body(c.length_m, ro, ri);
            }
            Member::ThickCylinder(c) => {
                let ri = if c.ends == VesselEnds::Closed {
                    0.0
                } else {
                    c.inner_diameter_m / 2.0
                };
                b.round_body(c.length_m, c.outer_diameter_m / 2.0, ri);
            }
            Member::ThinSphere(_) => {}
            Member::PlateWithHole(p) => b.plate_body(member, p),
            Member::GivenState(g) => {
                let t = 0.05 * g.length_m.min(g.width_m);
                let (hx, hy) = (g.length_m / 2.0, g.width_m / 2.0);
                b.slab_sides([-hx, -hy, -t], [hx, hy, 0.0], true);
            }
            Member::ImportedField(_) => {}
        }
        b
    }

    /// An imported surface as it was meshed: every face with its own vertices (shared by its
    /// triangles; a node on an edge between faces is a vertex of each, so that the shading
    /// breaks there) and its outline (the edges used by one of its triangles).
    fn imported_surface(&mut self, field: &SurfaceField) {
        let nodes = field.nodes_m();
        let mut vertex_of = vec![u32::MAX; nodes.len()];
        for (k, patch) in field.patches().iter().enumerate() {
            let face = Face::Patch(k as u16);
            let mut touched = Vec::new();
            let mut outline: HashMap<(u32, u32), (u32, u32, u32)> = HashMap::new();
            for (local, &t) in patch.triangles.iter().enumerate() {
                let tri = field.triangles()[t as usize];
                let corner = |c: usize| tri[c] as usize;
                let mut ids = [0u32; 3];
                for c in 0..3 {
                    if vertex_of[corner(c)] == u32::MAX {
                        vertex_of[corner(c)] = self.positions.len() as u32;
                        touched.push(corner(c));
                        self.positions.push(nodes[corner(c)]);
                        self.normals.push(patch.corner_normals[local][c]);
                        let [x, s] = patch.corners[local][c];
                        self.points.push(Some(SurfacePoint::new(face, x, s)));
                    }
                    ids[c] = vertex_of[corner(c)];
                }
                self.triangles.push(ids);
                self.regions.push(Region::Face(face));
                for c in 0..3 {
                    let (a, b) = (tri[c], tri[(c + 1) % 3]);
                    let entry = outline.entry((a.min(b), a.max(b))).or_insert((
                        0,
                        ids[c],
                        ids[(c + 1) % 3],
                    ));
                    entry.0 += 1;
                }
            }
            for n in touched {
                vertex_of[n] = u32::MAX;
            }
            let mut lines: Vec<_> = outline
                .into_values()
                .filter(|e| e.0 == 1)
                .map(|(_, a, b)| (Region::Face(face), vec![a, b]))
                .collect();
            lines.sort_by_key(|l| l.1[0]);
            self.edges.extend(lines);
        }
    }

    /// Smallest and largest corner of the box around the mesh.
    pub fn bounds(&self) -> ([f64; 3], [f64; 3]) {
        let mut lo = [f64::INFINITY; 3];
        let mut hi = [f64::NEG_INFINITY; 3];
        for p in &self.positions {
            for k in 0..3 {
                lo[k] = lo[k].min(p[k]);
                hi[k] = hi[k].max(p[k]);
            }
        }
        (lo, hi)
    }

    /// The map quantity at every vertex of a gaugeable face (`None` elsewhere, and everywhere
    /// when a load is not a finite number).
    pub fn values(
        &self,
        member: &Member,
        loads: &LoadVector,
        (quantity, basis): (SurfaceQuantity, StrainBasis),
    ) -> Vec<Option<f64>> {
        if loads.first_non_finite().is_some() {
            return vec![None; self.points.len()];
        }
        let material = member.material();
        self.points
            .iter()
            .map(|p| {
                let p = member.locate(p.as_ref()?).ok()?;
                quantity_of(
                    &member.state_unchecked(&p, loads),
                    material,
                    quantity,
                    basis,
                )
            })
            .collect()
    }

    /// A patch of `us × vs` nodes; `at(u, v)` gives position, normal and surface point.
    fn patch(
        &mut self,
        (us, vs): (&[f64], &[f64]),
        region: Region,
        edges: Edges,
        at: impl Fn(f64, f64) -> ([f64; 3], [f64; 3], Option<SurfacePoint>),
    ) {
        let base = self.positions.len() as u32;
        for &v in vs {
            for &u in us {
                let (p, n, sp) = at(u, v);
                self.positions.push(p);
                self.normals.push(n);
                self.points.push(sp);
            }
        }
        let (nu, nv) = (us.len(), vs.len());
        for t in grid_triangles(nu, nv) {
            self.triangles.push(t.map(|k| k + base));
            self.regions.push(region);
        }
        let idx = |i: usize, j: usize| base + (j * nu + i) as u32;
        let row = |j: usize| (0..nu).map(|i| idx(i, j)).collect::<Vec<u32>>();
        let column = |i: usize| (0..nv).map(|j| idx(i, j)).collect::<Vec<u32>>();
        let lines = match edges {
            Edges::Loop => {
                let mut outline = row(0);
                outline.extend((1..nv).map(|j| idx(nu - 1, j)));
                outline.extend((0..nu - 1).rev().map(|i| idx(i, nv - 1)));
                outline.extend((0..nv - 1).rev().map(|j| idx(0, j)));
                vec![outline]
            }
            Edges::Rows => vec![row(0), row(nv - 1)],
            Edges::Columns => vec![column(0), column(nu - 1)],
            Edges::Neither => Vec::new(),
        };
        self.edges.extend(lines.into_iter().map(|l| (region, l)));
    }

    /// A flat quad from corner `a` spanned by `du` and `dv`.
    fn quad(&mut self, a: [f64; 3], du: [f64; 3], dv: [f64; 3], normal: [f64; 3], region: Region) {
        self.strip(a, (du, dv), normal, region, 1);
    }

    /// A flat quad cut into `n` strips along `du`. Long body faces are cut so that sorting
    /// triangles by depth sees them where they are, not at one far-away centre.
    fn strip(
        &mut self,
        a: [f64; 3],
        (du, dv): ([f64; 3], [f64; 3]),
        normal: [f64; 3],
        region: Region,
        n: usize,
    ) {
        self.patch(
            (&nodes((0.0, 1.0), n), &[0.0, 1.0]),
            region,
            Edges::Loop,
            |u, v| {
                (
                    std::array::from_fn(|k| a[k] + u * du[k] + v * dv[k]),
                    normal,
                    None,
                )
            },
        );
    }

    /// A gaugeable face, finely divided.
    fn face_patch(&mut self, member: &Member, face: Face, xr: (f64, f64), sr: (f64, f64)) {
        let across = if face == Face::Round {
            AROUND
        } else {
            ACROSS_FLAT
        };
        let along = if matches!(member, Member::ThinSphere(_)) {
            AROUND / 2
        } else {
            ALONG
        };
        let xs = nodes(xr, along);
        let ss = nodes(sr, across);
        let edges = match member {
            Member::ThinSphere(_) => Edges::Neither,
            _ if face == Face::Round => Edges::Columns,
            _ => Edges::Loop,
        };
        self.patch((&xs, &ss), Region::Face(face), edges, |x, s| {
            let p = SurfacePoint::new(face, x, s);
            let f = member.surface_frame(&p);
            let (pos, n) = f.map_or(([x, s, 0.0], [0.0, 0.0, 1.0]), |f| (f.position, f.normal));
            (pos, n, Some(p))
        });
    }

    /// An axis-aligned box from `lo` to `hi`, six outward faces, each cut into a grid of
    /// `n × n` so that depth sorting orders it against the part it holds.
    fn cuboid(&mut self, lo: [f64; 3], hi: [f64; 3], region: Region, n: usize) {
        let grid = nodes((0.0, 1.0), n);
        for axis in 0..3 {
            let (u, v) = ((axis + 1) % 3, (axis + 2) % 3);
            for (at, sign) in [(lo[axis], -1.0), (hi[axis], 1.0)] {
                let mut normal = [0.0; 3];
                normal[axis] = sign;
                self.patch((&grid, &grid), region, Edges::Loop, |a, b| {
                    let mut p = [0.0; 3];
                    p[axis] = at;
                    p[u] = lo[u] + a * (hi[u] - lo[u]);
                    p[v] = lo[v] + b * (hi[v] - lo[v]);
                    (p, normal, None)
                });
            }
        }
    }

    /// The four vertical sides of a slab from `lo` to `hi`, and its bottom when `bottom`.
    fn slab_sides(&mut self, lo: [f64; 3], hi: [f64; 3], bottom: bool) {
        let d = [hi[0] - lo[0], hi[1] - lo[1], hi[2] - lo[2]];
        let (ex, ey, ez) = ([d[0], 0.0, 0.0], [0.0, d[1], 0.0], [0.0, 0.0, d[2]]);
        let body = Region::Body;
        let n = ALONG / 6;
        self.strip(lo, (ey, ez), [-1.0, 0.0, 0.0], body, n);
        self.strip([hi[0], lo[1], lo[2]], (ey, ez), [1.0, 0.0, 0.0], body, n);
        self.strip(lo, (ex, ez), [0.0, -1.0, 0.0], body, n);
        self.strip([lo[0], hi[1], lo[2]], (ex, ez), [0.0, 1.0, 0.0], body, n);
        if bottom {
            self.quad(lo, ex, ey, [0.0, 0.0, -1.0], body);
        }
    }

    /// End faces, flange edges and inner walls of a beam, and its clamp or pins.
    fn beam_body(&mut self, beam: &Beam) {
        let l = beam.length_m;
        if let Some((ro, ri)) = beam.section.radii_m() {
            self.round_body(l, ro, ri);
        } else {
            for r in section_rects(&beam.section) {
                for (x, n) in [(0.0, -1.0), (l, 1.0)] {
                    self.quad(
                        [x, r[0], r[2]],
                        [0.0, r[1] - r[0], 0.0],
                        [0.0, 0.0, r[3] - r[2]],
                        [n, 0.0, 0.0],
                        Region::Body,
                    );
                }
            }
            for (a, dv, n) in hidden_sides(&beam.section) {
                self.strip(a, ([l, 0.0, 0.0], dv), n, Region::Body, ALONG / 4);
            }
        }
        let (w, h) = (beam.section.width_m(), beam.section.height_m());
        let c = w.max(h);
        match beam.support {
            BeamSupport::Cantilever => {
                let depth = (0.5 * c).min(0.25 * l);
                self.cuboid(
                    [-depth, -0.5 * w - 0.35 * c, -0.5 * h - 0.35 * c],
                    [0.0, 0.5 * w + 0.35 * c, 0.5 * h + 0.35 * c],
                    Region::Fixture,
                    12,
                );
            }
            BeamSupport::SimplySupported => {
                for x in [0.0, l] {
                    self.pin(x, -0.5 * h, 0.45 * c, w + 0.4 * c);
                }
            }
        }
    }

    /// A wedge-shaped pin under the beam with its edge at (x, 0, z_top).
    fn pin(&mut self, x: f64, z_top: f64, size: f64, width: f64) {
        let (hw, half) = (width / 2.0, 0.6 * size);
        let zb = z_top - size;
        let slope = |s: f64| {
            let n = [s * size, 0.0, half];
            let len = (n[0] * n[0] + n[2] * n[2]).sqrt();
            n.map(|c| c / len)
        };
        let apex = [x, -hw, z_top];
        self.quad(
            apex,
            [0.0, width, 0.0],
            [-half, 0.0, -size],
            slope(-1.0),
            Region::Fixture,
        );
        self.quad(
            apex,
            [0.0, width, 0.0],
            [half, 0.0, -size],
            slope(1.0),
            Region::Fixture,
        );
        self.quad(
            [x - half, -hw, zb],
            [2.0 * half, 0.0, 0.0],
            [0.0, width, 0.0],
            [0.0, 0.0, -1.0],
            Region::Fixture,
        );
        for (y, n) in [(-hw, -1.0), (hw, 1.0)] {
            // A triangle as a quad with two corners together.
            self.patch(
                (&[0.0, 1.0], &[0.0, 1.0]),
                Region::Fixture,
                Edges::Loop,
                |u, v| {
                    let base = [x - half + 2.0 * half * u, y, zb];
                    let p = [base[0] + v * (x - base[0]), y, zb + v * size];
                    (p, [0.0, n, 0.0], None)
                },
            );
        }
    }

    /// End faces (annulus or disc) and bore of a round part along x.
    fn round_body(&mut self, length_m: f64, ro: f64, ri: f64) {
        let angles = nodes((0.0, std::f64::consts::TAU), AROUND);
        let radii = [ri, ro];
        for (x, n) in [(0.0, -1.0), (length_m, 1.0)] {
            self.patch((&angles, &radii), Region::Body, Edges::Rows, |t, r| {
                ([x, r * t.sin(), r * t.cos()], [n, 0.0, 0.0], None)
            });
        }
        if ri > 0.0 {
            self.patch(
                (&[0.0, length_m], &angles),
                Region::Body,
                Edges::Columns,
                |x, t| {
                    let (s, c) = t.sin_cos();
                    ([x, ri * s, ri * c], [0.0, -s, -c], None)
                },
            );
        }
    }

    /// The plate's gaugeable face as a ring from the hole edge to the outline, its underside,
    /// edges and hole wall.
    fn plate_body(&mut self, member: &Member, plate: &PlateWithHole) {
        let a = plate.hole_diameter_m / 2.0;
        let (hw, hh, ht) = (
            plate.width_m / 2.0,
            plate.height_m / 2.0,
            plate.thickness_m / 2.0,
        );
        // Angles round the hole, with the outline's corners among them so the ring meets the
        // rectangle exactly.
        let mut angles = nodes((0.0, std::f64::consts::TAU), PLATE_AROUND);
        for (y, x) in [(hh, hw), (hh, -hw), (-hh, -hw), (-hh, hw)] {
            angles.push(y.atan2(x).rem_euclid(std::f64::consts::TAU));
        }
        angles.sort_by(f64::total_cmp);
        angles.dedup_by(|p, q| (*p - *q).abs() < 1e-12);
        // Finer near the hole, where the field changes fastest.
        let radial: Vec<f64> = nodes((0.0, 1.0), PLATE_RADIAL)
            .into_iter()
            .map(|t| t.powf(1.6))
            .collect();
        let plan = |t: f64, r: f64| {
            let (s, c) = t.sin_cos();
            let reach = (hw / c.abs().max(1e-12)).min(hh / s.abs().max(1e-12));
            let k = a + r * (reach - a);
            (k * c, k * s)
        };
        self.patch(
            (&angles, &radial),
            Region::Face(Face::Plate),
            Edges::Rows,
            |t, r| {
                let (x, y) = plan(t, r);
                let p = SurfacePoint::new(Face::Plate, x, y);
                let pos = member.surface_frame(&p).map_or([x, y, ht], |f| f.position);
                (pos, [0.0, 0.0, 1.0], Some(p))
            },
        );
        self.patch((&angles, &radial), Region::Body, Edges::Rows, |t, r| {
            let (x, y) = plan(t, r);
            ([x, y, -ht], [0.0, 0.0, -1.0], None)
        });
        self.patch((&angles, &[-ht, ht]), Region::Body, Edges::Rows, |t, z| {
            let (s, c) = t.sin_cos();
            ([a * c, a * s, z], [-c, -s, 0.0], None)
        });
        self.slab_sides([-hw, -hh, -ht], [hw, hh, ht], false);
    }
}

/// `n + 1` evenly spaced nodes from `a` to `b`, both included.
fn nodes((a, b): (f64, f64), n: usize) -> Vec<f64> {
    let n = n.max(1);
    (0..=n).map(|i| a + (b - a) * i as f64 / n as f64).collect()
}

/// The rectangles of a non-round section, `[y0, y1, z0, z1]`.
fn section_rects(section: &Section) -> Vec<[f64; 4]> {
    match *section {
        Section::Rectangle { width_m, height_m } => {
            vec![[
                -width_m / 2.0,
                width_m / 2.0,
                -height_m / 2.0,
                height_m / 2.0,
            ]]
        }
        Section::RectangularTube {
            width_m,
            height_m,
            wall_m,
        } => {
            let (hw, hh) = (width_m / 2.0, height_m / 2.0);
            vec![
                [-hw, hw, hh - wall_m, hh],
                [-hw, hw, -hh, -hh + wall_m],
                [-hw, -hw + wall_m, -hh + wall_m, hh - wall_m],
                [hw - wall_m, hw, -hh + wall_m, hh - wall_m],
            ]
        }
        Section::IBeam {
            flange_width_m,
            depth_m,
            flange_thickness_m,
            web_thickness_m,
        } => {
            let (hb, hd, tf, hw) = (
                flange_width_m / 2.0,
                depth_m / 2.0,
                flange_thickness_m,
                web_thickness_m / 2.0,
            );
            vec![
                [-hb, hb, hd - tf, hd],
                [-hb, hb, -hd, -hd + tf],
                [-hw, hw, -hd + tf, hd - tf],
            ]
        }
        Section::SolidRound { .. } | Section::RoundTube { .. } => Vec::new(),
    }
}

/// Long sides of a section that are not gaugeable faces: corner at x = 0, the span across
/// the section and the outward normal. (Flange tips and undersides of an I, the inner walls of
/// a rectangular tube.)
fn hidden_sides(section: &Section) -> Vec<([f64; 3], [f64; 3], [f64; 3])> {
    match *section {
        Section::IBeam {
            flange_width_m,
            depth_m,
            flange_thickness_m,
            web_thickness_m,
        } => {
            let (hb, hd, tf, hw) = (
                flange_width_m / 2.0,
                depth_m / 2.0,
                flange_thickness_m,
                web_thickness_m / 2.0,
            );
            let mut out = Vec::new();
            for (y, n) in [(-hb, -1.0), (hb, 1.0)] {
                for z0 in [hd - tf, -hd] {
                    out.push(([0.0, y, z0], [0.0, 0.0, tf], [0.0, n, 0.0]));
                }
            }
            for (z, n) in [(hd - tf, -1.0), (-hd + tf, 1.0)] {
                out.push(([0.0, -hb, z], [0.0, hb - hw, 0.0], [0.0, 0.0, n]));
                out.push(([0.0, hw, z], [0.0, hb - hw, 0.0], [0.0, 0.0, n]));
            }
            out
        }
        Section::RectangularTube {
            width_m,
            height_m,
            wall_m,
        } => {
            let (iw, ih) = (width_m / 2.0 - wall_m, height_m / 2.0 - wall_m);
            vec![
                ([0.0, -iw, ih], [0.0, 2.0 * iw, 0.0], [0.0, 0.0, -1.0]),
                ([0.0, -iw, -ih], [0.0, 2.0 * iw, 0.0], [0.0, 0.0, 1.0]),
                ([0.0, -iw, -ih], [0.0, 0.0, 2.0 * ih], [0.0, 1.0, 0.0]),
                ([0.0, iw, -ih], [0.0, 0.0, 2.0 * ih], [0.0, -1.0, 0.0]),
            ]
        }
        _ => Vec::new(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use gw_mechanics::{Material, PlateWithHole, Shaft, ThinCylinder, ThinSphere};
    use std::f64::consts::PI;

    fn steel() -> Material {
        Material::new("m", 200e9, 0.3, 12e-6, 300e6).unwrap()
    }

    fn sub(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
        std::array::from_fn(|i| a[i] - b[i])
    }

    fn cross(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
        [
            a[1] * b[2] - a[2] * b[1],
            a[2] * b[0] - a[0] * b[2],
            a[0] * b[1] - a[1] * b[0],
        ]
    }

    fn dot(a: [f64; 3], b: [f64; 3]) -> f64 {
        a.iter().zip(b).map(|(p, q)| p * q).sum()
    }

    /// Area of the triangles in `keep`, and the volume they enclose by the divergence theorem
    /// (each triangle oriented by its vertex normals): a route independent of how the mesh is
    /// built, so a missing or inward-facing patch shows as a wrong volume.
    fn area_and_volume(mesh: &PartMesh, keep: impl Fn(Region) -> bool) -> (f64, f64) {
        let (mut area, mut volume) = (0.0, 0.0);
        for (t, r) in mesh.triangles.iter().zip(&mesh.regions) {
            if !keep(*r) {
                continue;
            }
            let p = t.map(|k| mesh.positions[k as usize]);
            let n: [f64; 3] = std::array::from_fn(|i| {
                t.iter().map(|&k| mesh.normals[k as usize][i]).sum::<f64>()
            });
            let c = cross(sub(p[1], p[0]), sub(p[2], p[0]));
            let a2 = dot(c, c).sqrt();
            area += a2 / 2.0;
            let oriented = if dot(c, n) < 0.0 { -1.0 } else { 1.0 };
            volume += oriented * dot(p[0], c) / 6.0;
        }
        (area, volume)
    }

    fn beam(section: Section) -> Member {
        Member::Beam(Beam::new(section, steel(), 0.4, BeamSupport::Cantilever, 0.4).unwrap())
    }

    #[test]
    fn every_part_is_closed_with_its_own_volume() {
        let l = 0.4;
        let cases: Vec<(Member, f64)> = vec![
            (
                beam(Section::Rectangle {
                    width_m: 0.03,
                    height_m: 0.06,
                }),
                0.03 * 0.06 * l,
            ),
            (
                beam(Section::IBeam {
                    flange_width_m: 0.08,
                    depth_m: 0.12,
                    flange_thickness_m: 0.01,
                    web_thickness_m: 0.006,
                }),
                (2.0 * 0.08 * 0.01 + 0.006 * 0.10) * l,
            ),
            (
                beam(Section::RectangularTube {
                    width_m: 0.05,
                    height_m: 0.08,
                    wall_m: 0.004,
                }),
                (0.05 * 0.08 - 0.042 * 0.072) * l,
            ),
            (
                Member::Shaft(Shaft::new(0.05, 0.02, 0.3, steel()).unwrap()),
                PI * (0.025f64.powi(2) - 0.01f64.powi(2)) * 0.3,
            ),
            (
                Member::ThinCylinder(
                    ThinCylinder::new(0.2, 0.004, 0.5, VesselEnds::Closed, steel()).unwrap(),
                ),
                PI * 0.1f64.powi(2) * 0.5,
            ),
            (
                Member::ThinSphere(ThinSphere::new(0.6, 0.005, steel()).unwrap()),
                4.0 / 3.0 * PI * 0.3f64.powi(3),
            ),
            (
                Member::PlateWithHole(PlateWithHole::new(0.02, 0.2, 0.1, 0.005, steel()).unwrap()),
                (0.2 * 0.1 - PI * 0.01f64.powi(2)) * 0.005,
            ),
        ];
        for (m, expected) in cases {
            let mesh = PartMesh::of(&m);
            let (_, v) = area_and_volume(&mesh, |r| r != Region::Fixture);
            // Polygons of 96 sides hold (sin 2π/96)/(2π/96) = 0.9993 of a circle's area.
            assert!(
                (v / expected - 1.0).abs() < 2e-3,
                "{}: volume {v} vs {expected}",
                m.kind_name()
            );
        }
    }

    #[test]
    fn gaugeable_area_is_the_faces_area() {
        let m = Member::PlateWithHole(PlateWithHole::new(0.02, 0.2, 0.1, 0.005, steel()).unwrap());
        let mesh = PartMesh::of(&m);
        let (a, _) = area_and_volume(&mesh, |r| r == Region::Face(Face::Plate));
        let expected = 0.2 * 0.1 - PI * 0.01f64.powi(2);
        assert!((a / expected - 1.0).abs() < 1e-3, "{a} vs {expected}");
        let sphere = Member::ThinSphere(ThinSphere::new(0.6, 0.005, steel()).unwrap());
        let (a, _) = area_and_volume(&PartMesh::of(&sphere), |r| r == Region::Face(Face::Round));
        assert!((a / (4.0 * PI * 0.09) - 1.0).abs() < 2e-3, "{a}");
    }

    #[test]
    fn map_values_follow_the_surface_points() {
        let m = beam(Section::Rectangle {
            width_m: 0.03,
            height_m: 0.06,
        });
        let mesh = PartMesh::of(&m);
        let loads = LoadVector::from_pairs(&[(gw_mechanics::LoadComponent::VerticalForce, 1000.0)]);
        let q = (SurfaceQuantity::StrainAlong(0.0), StrainBasis::Mechanical);
        let values = mesh.values(&m, &loads, q);
        // Cantilever root, top fibre: σ = P L c / I = 6 P L / (b h²) (Gere & Goodno §5.5).
        let expected = 6.0 * 1000.0 * 0.4 / (0.03 * 0.06f64.powi(2)) / 200e9;
        let root_top = mesh
            .points
            .iter()
            .zip(&values)
            .filter_map(|(p, v)| Some((p.as_ref()?, (*v)?)))
            .find(|(p, _)| p.face == Face::Top && p.x_m == 0.0)
            .map(|(_, v)| v)
            .unwrap();
        assert!(
            (root_top / expected - 1.0).abs() < 1e-9,
            "{root_top} vs {expected}"
        );
        let nan = LoadVector::from_pairs(&[(gw_mechanics::LoadComponent::VerticalForce, f64::NAN)]);
        assert!(mesh.values(&m, &nan, q).iter().all(Option::is_none));
    }
}
