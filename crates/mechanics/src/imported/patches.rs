//! The outer surface split into faces, each with flat coordinates of its own.
//!
//! A face (a patch) grows from a seed triangle across edges where the surface turns by less
//! than [`CREASE_DEG`], and takes no triangle whose normal leans more than [`SPREAD_DEG`] from
//! the seed's. Its coordinates are the projection onto its mean plane: `x` along the
//! reference axis projected onto that plane, `s` at right angles so that x, s and the outward
//! normal are right-handed. On a flat face the projection is exact; on a curved one a length
//! across the curvature reads short by at most 1 − cos(`SPREAD_DEG`) (about 6 %) at the face's
//! edge.

/// Largest turn of the surface across an edge inside one face, degrees (sharper edges split
/// faces).
pub const CREASE_DEG: f64 = 25.0;
/// Largest lean of a triangle's normal from the face's first triangle, degrees.
pub const SPREAD_DEG: f64 = 20.0;

pub(crate) fn sub(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
}

pub(crate) fn cross(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [
        a[1] * b[2] - a[2] * b[1],
        a[2] * b[0] - a[0] * b[2],
        a[0] * b[1] - a[1] * b[0],
    ]
}

pub(crate) fn dot(a: [f64; 3], b: [f64; 3]) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

pub(crate) fn unit(a: [f64; 3]) -> [f64; 3] {
    let n = dot(a, a).sqrt();
    if n > 0.0 { a.map(|v| v / n) } else { a }
}

/// A face of the imported surface: its triangles and its flat coordinates.
#[derive(Debug, Clone, PartialEq)]
pub struct Patch {
    /// Origin of the face's coordinates (the area centroid), metres.
    pub origin_m: [f64; 3],
    /// Direction of growing x.
    pub axis_x: [f64; 3],
    /// Direction of growing s.
    pub axis_s: [f64; 3],
    /// Mean outward normal.
    pub normal: [f64; 3],
    /// Triangles of the face (indices into the surface's triangle list).
    pub triangles: Vec<u32>,
    /// Flat coordinates (x, s) of each triangle's corners, metres.
    pub corners: Vec<[[f64; 2]; 3]>,
    /// Outward normal at each triangle's corners (the mean of the face's triangles there).
    pub corner_normals: Vec<[[f64; 3]; 3]>,
    /// Area, square metres.
    pub area_m2: f64,
    /// Ranges of x and s, metres.
    pub x_range_m: (f64, f64),
    /// Range of s, metres.
    pub s_range_m: (f64, f64),
    index: Buckets,
}

/// Triangles sorted into square cells of the face's coordinates, for finding the one under a
/// point.
#[derive(Debug, Clone, PartialEq, Default)]
struct Buckets {
    origin: [f64; 2],
    size_m: f64,
    nx: usize,
    ns: usize,
    starts: Vec<u32>,
    items: Vec<u32>,
}

impl Buckets {
    fn new(corners: &[[[f64; 2]; 3]], x: (f64, f64), s: (f64, f64)) -> Self {
        let n = corners.len().max(1) as f64;
        let extent = (x.1 - x.0).max(s.1 - s.0).max(1e-12);
        let size_m = (((x.1 - x.0).max(1e-12) * (s.1 - s.0).max(1e-12)) / n).sqrt() * 2.0;
        let size_m = size_m.max(extent / 2048.0);
        let nx = (((x.1 - x.0) / size_m).floor() as usize + 1).min(4096);
        let ns = (((s.1 - s.0) / size_m).floor() as usize + 1).min(4096);
        let mut b = Buckets {
            origin: [x.0, s.0],
            size_m,
            nx,
            ns,
            starts: vec![0; nx * ns + 1],
            items: Vec::new(),
        };
        let ranges: Vec<_> = corners.iter().map(|c| b.cell_range(c)).collect();
        for r in &ranges {
            for j in r.2..=r.3 {
                for i in r.0..=r.1 {
                    b.starts[j * nx + i + 1] += 1;
                }
            }
        }
        for k in 1..b.starts.len() {
            b.starts[k] += b.starts[k - 1];
        }
        let mut fill = b.starts.clone();
        b.items = vec![0; *b.starts.last().unwrap_or(&0) as usize];
        for (t, r) in ranges.iter().enumerate() {
            for j in r.2..=r.3 {
                for i in r.0..=r.1 {
                    let slot = &mut fill[j * nx + i];
                    b.items[*slot as usize] = t as u32;
                    *slot += 1;
                }
            }
        }
        b
    }

    fn cell_of(&self, p: [f64; 2]) -> (usize, usize) {
        let i = ((p[0] - self.origin[0]) / self.size_m).floor();
        let j = ((p[1] - self.origin[1]) / self.size_m).floor();
        (
            i.clamp(0.0, (self.nx - 1) as f64) as usize,
            j.clamp(0.0, (self.ns - 1) as f64) as usize,
        )
    }

    fn cell_range(&self, c: &[[f64; 2]; 3]) -> (usize, usize, usize, usize) {
        let lo = [0, 1].map(|k| c.iter().map(|p| p[k]).fold(f64::INFINITY, f64::min));
        let hi = [0, 1].map(|k| c.iter().map(|p| p[k]).fold(f64::NEG_INFINITY, f64::max));
        let (i0, j0) = self.cell_of(lo);
        let (i1, j1) = self.cell_of(hi);
        (i0, i1, j0, j1)
    }

    /// Triangles (face-local numbers) in the cells within `ring` cells of the point.
    fn near(&self, p: [f64; 2], ring: usize) -> impl Iterator<Item = u32> + '_ {
        let (i, j) = self.cell_of(p);
        let (i0, i1) = (i.saturating_sub(ring), (i + ring).min(self.nx - 1));
        let (j0, j1) = (j.saturating_sub(ring), (j + ring).min(self.ns - 1));
        (j0..=j1).flat_map(move |jj| {
            (i0..=i1).flat_map(move |ii| {
                let c = jj * self.nx + ii;
                self.items[self.starts[c] as usize..self.starts[c + 1] as usize]
                    .iter()
                    .copied()
            })
        })
    }
}

/// Barycentric coordinates of `p` in the flat triangle `c` (None for a degenerate one).
pub(crate) fn barycentric(c: &[[f64; 2]; 3], p: [f64; 2]) -> Option<[f64; 3]> {
    let d = (c[1][1] - c[2][1]) * (c[0][0] - c[2][0]) + (c[2][0] - c[1][0]) * (c[0][1] - c[2][1]);
    if d.abs() < 1e-300 {
        return None;
    }
    let a = ((c[1][1] - c[2][1]) * (p[0] - c[2][0]) + (c[2][0] - c[1][0]) * (p[1] - c[2][1])) / d;
    let b = ((c[2][1] - c[0][1]) * (p[0] - c[2][0]) + (c[0][0] - c[2][0]) * (p[1] - c[2][1])) / d;
    Some([a, b, 1.0 - a - b])
}

impl Patch {
    /// The triangle under (x, s) as (face-local triangle number, barycentric coordinates). A
    /// point just off the face's edge (within `tolerance_m`) is taken to the nearest triangle.
    pub fn find(&self, p: [f64; 2], tolerance_m: f64) -> Option<(usize, [f64; 3])> {
        let mut best: Option<(usize, [f64; 3], f64)> = None;
        for ring in [0usize, 1] {
            for t in self.index.near(p, ring) {
                let c = &self.corners[t as usize];
                let Some(b) = barycentric(c, p) else { continue };
                let worst = b.iter().copied().fold(f64::INFINITY, f64::min);
                if worst >= -1e-12 {
                    return Some((t as usize, b));
                }
                if best.as_ref().is_none_or(|x| worst > x.2) {
                    best = Some((t as usize, b, worst));
                }
            }
        }
        let (t, b, _) = best?;
        let c = &self.corners[t];
        let clamped = clamp_barycentric(b);
        let q = [0, 1].map(|k| clamped[0] * c[0][k] + clamped[1] * c[1][k] + clamped[2] * c[2][k]);
        ((q[0] - p[0]).hypot(q[1] - p[1]) <= tolerance_m).then_some((t, clamped))
    }
}

fn clamp_barycentric(b: [f64; 3]) -> [f64; 3] {
    let c = b.map(|v| v.max(0.0));
    let sum: f64 = c.iter().sum();
    if sum > 0.0 {
        c.map(|v| v / sum)
    } else {
        [1.0 / 3.0; 3]
    }
}

/// Preferred direction of each face's x axis, in the model's global axes.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, Hash, Default, serde::Serialize, serde::Deserialize,
)]
pub enum ReferenceAxis {
    /// Global X.
    #[default]
    X,
    /// Global Y.
    Y,
    /// Global Z.
    Z,
}

impl ReferenceAxis {
    /// Every axis.
    pub const ALL: [ReferenceAxis; 3] = [ReferenceAxis::X, ReferenceAxis::Y, ReferenceAxis::Z];

    /// Unit vector.
    pub fn vector(self) -> [f64; 3] {
        match self {
            ReferenceAxis::X => [1.0, 0.0, 0.0],
            ReferenceAxis::Y => [0.0, 1.0, 0.0],
            ReferenceAxis::Z => [0.0, 0.0, 1.0],
        }
    }

    /// Name.
    pub fn name(self) -> &'static str {
        match self {
            ReferenceAxis::X => "global X",
            ReferenceAxis::Y => "global Y",
            ReferenceAxis::Z => "global Z",
        }
    }
}

/// The x axis of a face with mean normal `n`: the reference axis projected onto the face; where
/// it lies within 30° of the normal, the next global axis (X, Y, Z in turn) that does not.
pub fn face_axis_x(n: [f64; 3], reference: ReferenceAxis) -> [f64; 3] {
    let project = |a: [f64; 3]| {
        let d = dot(a, n);
        [a[0] - d * n[0], a[1] - d * n[1], a[2] - d * n[2]]
    };
    let mut candidates = vec![reference];
    candidates.extend(ReferenceAxis::ALL.into_iter().filter(|&a| a != reference));
    let mut best = (project(reference.vector()), 0.0);
    for a in candidates {
        let p = project(a.vector());
        let len = dot(p, p).sqrt();
        if len >= 0.5 {
            return unit(p);
        }
        if len > best.1 {
            best = (p, len);
        }
    }
    unit(best.0)
}

/// Splits the surface into faces. `normals` and `areas` are per triangle.
pub(crate) fn split(
    nodes: &[[f64; 3]],
    triangles: &[[u32; 3]],
    normals: &[[f64; 3]],
    areas: &[f64],
    reference: ReferenceAxis,
) -> (Vec<Patch>, Vec<u32>) {
    let neighbours = edge_neighbours(triangles);
    let crease = CREASE_DEG.to_radians().cos();
    let spread = SPREAD_DEG.to_radians().cos();
    let mut owner = vec![u32::MAX; triangles.len()];
    let mut groups: Vec<Vec<u32>> = Vec::new();
    let mut stack = Vec::new();
    for seed in 0..triangles.len() {
        if owner[seed] != u32::MAX || areas[seed] <= 0.0 {
            continue;
        }
        let g = groups.len() as u32;
        owner[seed] = g;
        let mut members = vec![seed as u32];
        stack.push(seed);
        while let Some(t) = stack.pop() {
            for &nb in neighbours.of(t) {
                let nb = nb as usize;
                if owner[nb] == u32::MAX
                    && areas[nb] > 0.0
                    && dot(normals[t], normals[nb]) >= crease
                    && dot(normals[seed], normals[nb]) >= spread
                {
                    owner[nb] = g;
                    members.push(nb as u32);
                    stack.push(nb);
                }
            }
        }
        groups.push(members);
    }
    let mut scratch = NodeNormals {
        sum: vec![[0.0; 3]; nodes.len()],
        stamp: vec![u32::MAX; nodes.len()],
    };
    let mut patches: Vec<Patch> = groups
        .into_iter()
        .enumerate()
        .map(|(k, g)| {
            build_patch(
                nodes,
                triangles,
                (normals, areas),
                g,
                reference,
                (k as u32, &mut scratch),
            )
        })
        .collect();
    patches.sort_by(|a, b| b.area_m2.total_cmp(&a.area_m2));
    let mut patch_of = vec![u32::MAX; triangles.len()];
    for (k, p) in patches.iter().enumerate() {
        for &t in &p.triangles {
            patch_of[t as usize] = k as u32;
        }
    }
    (patches, patch_of)
}

/// For each triangle, the triangles sharing an edge with it, as offsets into one list (found
/// by sorting the edges: the triangles of one edge sort together).
pub(crate) struct Neighbours {
    starts: Vec<u32>,
    items: Vec<u32>,
}

impl Neighbours {
    fn of(&self, t: usize) -> &[u32] {
        &self.items[self.starts[t] as usize..self.starts[t + 1] as usize]
    }
}

fn edge_neighbours(triangles: &[[u32; 3]]) -> Neighbours {
    let mut edges: Vec<(u64, u32)> = Vec::with_capacity(triangles.len() * 3);
    for (t, tri) in triangles.iter().enumerate() {
        for k in 0..3 {
            let (a, b) = (tri[k], tri[(k + 1) % 3]);
            edges.push(((u64::from(a.min(b)) << 32) | u64::from(a.max(b)), t as u32));
        }
    }
    edges.sort_unstable();
    let mut pairs: Vec<(u32, u32)> = Vec::with_capacity(edges.len());
    let mut i = 0;
    while i < edges.len() {
        let mut j = i + 1;
        while j < edges.len() && edges[j].0 == edges[i].0 {
            j += 1;
        }
        for a in &edges[i..j] {
            for b in &edges[i..j] {
                if a.1 != b.1 {
                    pairs.push((a.1, b.1));
                }
            }
        }
        i = j;
    }
    pairs.sort_unstable();
    let mut starts = vec![0u32; triangles.len() + 1];
    for &(a, _) in &pairs {
        starts[a as usize + 1] += 1;
    }
    for k in 1..starts.len() {
        starts[k] += starts[k - 1];
    }
    Neighbours {
        starts,
        items: pairs.into_iter().map(|p| p.1).collect(),
    }
}

/// Area-weighted normal sums per node, reused from face to face (a node's sum is reset the
/// first time a face touches it).
struct NodeNormals {
    sum: Vec<[f64; 3]>,
    stamp: Vec<u32>,
}

fn build_patch(
    nodes: &[[f64; 3]],
    triangles: &[[u32; 3]],
    (normals, areas): (&[[f64; 3]], &[f64]),
    members: Vec<u32>,
    reference: ReferenceAxis,
    (id, node_n): (u32, &mut NodeNormals),
) -> Patch {
    let mut area = 0.0;
    let mut centre = [0.0; 3];
    let mut mean_n = [0.0; 3];
    for &t in &members {
        let (tri, a, n) = (
            triangles[t as usize],
            areas[t as usize],
            normals[t as usize],
        );
        area += a;
        for k in 0..3 {
            let c =
                (nodes[tri[0] as usize][k] + nodes[tri[1] as usize][k] + nodes[tri[2] as usize][k])
                    / 3.0;
            centre[k] += a * c;
            mean_n[k] += a * n[k];
        }
        for v in tri {
            let v = v as usize;
            if node_n.stamp[v] != id {
                node_n.stamp[v] = id;
                node_n.sum[v] = [0.0; 3];
            }
            (0..3).for_each(|k| node_n.sum[v][k] += a * n[k]);
        }
    }
    let origin_m = centre.map(|c| c / area.max(f64::MIN_POSITIVE));
    let normal = unit(mean_n);
    let axis_x = face_axis_x(normal, reference);
    let axis_s = cross(normal, axis_x);
    let flat = |p: [f64; 3]| {
        let d = sub(p, origin_m);
        [dot(d, axis_x), dot(d, axis_s)]
    };
    let corners: Vec<[[f64; 2]; 3]> = members
        .iter()
        .map(|&t| triangles[t as usize].map(|v| flat(nodes[v as usize])))
        .collect();
    let corner_normals = members
        .iter()
        .map(|&t| triangles[t as usize].map(|v| unit(node_n.sum[v as usize])))
        .collect();
    let x_range_m = range(corners.iter().flatten().map(|c| c[0]));
    let s_range_m = range(corners.iter().flatten().map(|c| c[1]));
    let index = Buckets::new(&corners, x_range_m, s_range_m);
    Patch {
        origin_m,
        axis_x,
        axis_s,
        normal,
        triangles: members,
        corners,
        corner_normals,
        area_m2: area,
        x_range_m,
        s_range_m,
        index,
    }
}

fn range(values: impl Iterator<Item = f64>) -> (f64, f64) {
    values.fold((f64::INFINITY, f64::NEG_INFINITY), |(lo, hi), v| {
        (lo.min(v), hi.max(v))
    })
}
