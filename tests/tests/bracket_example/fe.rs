//! A small linear-elastic finite-element solution on a structured mesh of box-shaped
//! 8-node hexahedra (trilinear, 2 × 2 × 2 Gauss points), assembled into a sparse matrix and
//! solved by conjugate gradients with a Jacobi preconditioner. Made for the example field; the
//! test beside it checks it against beam theory.

/// A mesh of axis-aligned boxes: grid lines along each axis and which cells exist.
pub struct BoxMesh {
    /// Grid lines along x, y, z, metres.
    pub lines: [Vec<f64>; 3],
    /// The grid node of each mesh node.
    pub nodes: Vec<[usize; 3]>,
    /// The cells: their grid corner (i, j, k) and their 8 nodes in VTK order.
    pub cells: Vec<([usize; 3], [usize; 8])>,
}

/// Corner signs of the VTK hexahedron.
pub const CORNERS: [[f64; 3]; 8] = [
    [-1.0, -1.0, -1.0],
    [1.0, -1.0, -1.0],
    [1.0, 1.0, -1.0],
    [-1.0, 1.0, -1.0],
    [-1.0, -1.0, 1.0],
    [1.0, -1.0, 1.0],
    [1.0, 1.0, 1.0],
    [-1.0, 1.0, 1.0],
];

impl BoxMesh {
    /// The mesh of the cells for which `keep(centre)` holds.
    pub fn new(lines: [Vec<f64>; 3], keep: impl Fn([f64; 3]) -> bool) -> Self {
        let n = [lines[0].len() - 1, lines[1].len() - 1, lines[2].len() - 1];
        let grid = |i: usize, j: usize, k: usize| (k * (n[1] + 1) + j) * (n[0] + 1) + i;
        let mut index = vec![usize::MAX; (n[0] + 1) * (n[1] + 1) * (n[2] + 1)];
        let mut nodes = Vec::new();
        let mut cells = Vec::new();
        for k in 0..n[2] {
            for j in 0..n[1] {
                for i in 0..n[0] {
                    let c = [
                        0.5 * (lines[0][i] + lines[0][i + 1]),
                        0.5 * (lines[1][j] + lines[1][j + 1]),
                        0.5 * (lines[2][k] + lines[2][k + 1]),
                    ];
                    if !keep(c) {
                        continue;
                    }
                    let mut ids = [0; 8];
                    for (a, s) in CORNERS.iter().enumerate() {
                        let g = [
                            i + usize::from(s[0] > 0.0),
                            j + usize::from(s[1] > 0.0),
                            k + usize::from(s[2] > 0.0),
                        ];
                        let slot = &mut index[grid(g[0], g[1], g[2])];
                        if *slot == usize::MAX {
                            *slot = nodes.len();
                            nodes.push(g);
                        }
                        ids[a] = *slot;
                    }
                    cells.push(([i, j, k], ids));
                }
            }
        }
        Self {
            lines,
            nodes,
            cells,
        }
    }

    /// Position of a mesh node, metres.
    pub fn position(&self, node: usize) -> [f64; 3] {
        let g = self.nodes[node];
        [
            self.lines[0][g[0]],
            self.lines[1][g[1]],
            self.lines[2][g[2]],
        ]
    }

    /// Size of a cell, metres.
    pub fn size(&self, c: [usize; 3]) -> [f64; 3] {
        std::array::from_fn(|d| self.lines[d][c[d] + 1] - self.lines[d][c[d]])
    }
}

/// Isotropic elasticity matrix (engineering shear strains).
fn elasticity(e: f64, nu: f64) -> [[f64; 6]; 6] {
    let lambda = e * nu / ((1.0 + nu) * (1.0 - 2.0 * nu));
    let mu = e / (2.0 * (1.0 + nu));
    let mut d = [[0.0; 6]; 6];
    for a in 0..3 {
        d[a][..3].fill(lambda);
        d[a][a] = lambda + 2.0 * mu;
        d[a + 3][a + 3] = mu;
    }
    d
}

/// Strain–displacement matrix of a box of size `h` at natural point `p` (6 × 24).
fn strain_matrix(h: [f64; 3], p: [f64; 3]) -> [[f64; 24]; 6] {
    let mut b = [[0.0; 24]; 6];
    for (a, s) in CORNERS.iter().enumerate() {
        let f = |d: usize| 1.0 + s[d] * p[d];
        let dn = [
            s[0] * f(1) * f(2) / 8.0 * 2.0 / h[0],
            f(0) * s[1] * f(2) / 8.0 * 2.0 / h[1],
            f(0) * f(1) * s[2] / 8.0 * 2.0 / h[2],
        ];
        let (x, y, z) = (3 * a, 3 * a + 1, 3 * a + 2);
        b[0][x] = dn[0];
        b[1][y] = dn[1];
        b[2][z] = dn[2];
        b[3][x] = dn[1];
        b[3][y] = dn[0];
        b[4][y] = dn[2];
        b[4][z] = dn[1];
        b[5][x] = dn[2];
        b[5][z] = dn[0];
    }
    b
}

/// Element stiffness of a box (2 × 2 × 2 Gauss–Legendre points).
fn element_stiffness(h: [f64; 3], d: &[[f64; 6]; 6]) -> Vec<f64> {
    let g = 1.0 / 3f64.sqrt();
    let weight = h[0] * h[1] * h[2] / 8.0;
    let mut k = vec![0.0; 24 * 24];
    for gp in CORNERS {
        let b = strain_matrix(h, gp.map(|s| s * g));
        let mut db = [[0.0; 24]; 6];
        for r in 0..6 {
            for c in 0..24 {
                db[r][c] = (0..6).map(|m| d[r][m] * b[m][c]).sum();
            }
        }
        for r in 0..24 {
            for c in 0..24 {
                k[r * 24 + c] += weight * (0..6).map(|m| b[m][r] * db[m][c]).sum::<f64>();
            }
        }
    }
    k
}

/// A sparse symmetric matrix in compressed rows.
pub struct Sparse {
    starts: Vec<usize>,
    cols: Vec<usize>,
    vals: Vec<f64>,
}

impl Sparse {
    fn mul(&self, x: &[f64], y: &mut [f64]) {
        for (r, yr) in y.iter_mut().enumerate() {
            *yr = (self.starts[r]..self.starts[r + 1])
                .map(|k| self.vals[k] * x[self.cols[k]])
                .sum();
        }
    }

    /// One row of K times `x`.
    pub fn row_times(&self, r: usize, x: &[f64]) -> f64 {
        (self.starts[r]..self.starts[r + 1])
            .map(|k| self.vals[k] * x[self.cols[k]])
            .sum()
    }

    fn diagonal(&self) -> Vec<f64> {
        (0..self.starts.len() - 1)
            .map(|r| {
                (self.starts[r]..self.starts[r + 1])
                    .find(|&k| self.cols[k] == r)
                    .map_or(1.0, |k| self.vals[k])
            })
            .collect()
    }
}

/// The assembled stiffness of the mesh.
pub fn stiffness(mesh: &BoxMesh, e: f64, nu: f64) -> Sparse {
    let d = elasticity(e, nu);
    let mut cache: Vec<([u64; 3], Vec<f64>)> = Vec::new();
    let mut triplets: Vec<(usize, usize, f64)> = Vec::with_capacity(mesh.cells.len() * 576);
    for (c, ids) in &mesh.cells {
        let h = mesh.size(*c);
        let key = h.map(f64::to_bits);
        let k = match cache.iter().find(|e| e.0 == key) {
            Some(e) => &e.1,
            None => {
                cache.push((key, element_stiffness(h, &d)));
                &cache.last().unwrap().1
            }
        };
        for a in 0..24 {
            for b in 0..24 {
                triplets.push((
                    3 * ids[a / 3] + a % 3,
                    3 * ids[b / 3] + b % 3,
                    k[a * 24 + b],
                ));
            }
        }
    }
    triplets.sort_unstable_by_key(|t| (t.0, t.1));
    let n = 3 * mesh.nodes.len();
    let mut starts = vec![0; n + 1];
    let (mut cols, mut vals): (Vec<usize>, Vec<f64>) = (Vec::new(), Vec::new());
    let mut last = None;
    for (r, c, v) in triplets {
        if last == Some((r, c)) {
            *vals.last_mut().unwrap() += v;
        } else {
            cols.push(c);
            vals.push(v);
            starts[r + 1] += 1;
            last = Some((r, c));
        }
    }
    for r in 1..=n {
        starts[r] += starts[r - 1];
    }
    Sparse { starts, cols, vals }
}

/// Solves K u = f with the dofs in `fixed` held at zero (CG, Jacobi preconditioner), to a
/// relative residual of 1e-10.
pub fn solve(k: &Sparse, f: &[f64], fixed: &[bool]) -> Vec<f64> {
    let n = f.len();
    let diag = k.diagonal();
    let mask = |v: &mut [f64]| {
        v.iter_mut().zip(fixed).for_each(|(x, &fx)| {
            if fx {
                *x = 0.0
            }
        })
    };
    let mut u = vec![0.0; n];
    let mut r = f.to_vec();
    mask(&mut r);
    let mut z: Vec<f64> = r.iter().zip(&diag).map(|(a, d)| a / d).collect();
    let mut p = z.clone();
    let mut rz: f64 = r.iter().zip(&z).map(|(a, b)| a * b).sum();
    let norm0 = r.iter().map(|v| v * v).sum::<f64>().sqrt();
    let mut q = vec![0.0; n];
    for _ in 0..20 * n {
        k.mul(&p, &mut q);
        mask(&mut q);
        let alpha = rz / p.iter().zip(&q).map(|(a, b)| a * b).sum::<f64>();
        u.iter_mut().zip(&p).for_each(|(x, pv)| *x += alpha * pv);
        r.iter_mut().zip(&q).for_each(|(x, qv)| *x -= alpha * qv);
        if r.iter().map(|v| v * v).sum::<f64>().sqrt() <= 1e-10 * norm0 {
            break;
        }
        z.iter_mut()
            .zip(r.iter().zip(&diag))
            .for_each(|(zv, (rv, d))| *zv = rv / d);
        let rz_new: f64 = r.iter().zip(&z).map(|(a, b)| a * b).sum();
        let beta = rz_new / rz;
        rz = rz_new;
        p.iter_mut()
            .zip(&z)
            .for_each(|(pv, zv)| *pv = zv + beta * *pv);
    }
    u
}

/// The strain tensor at each node (xx, yy, zz, xy, yz, zx; tensor shear), the mean of the
/// values its cells give at their corners.
pub fn nodal_strains(mesh: &BoxMesh, u: &[f64]) -> Vec<[f64; 6]> {
    let mut sum = vec![[0.0; 6]; mesh.nodes.len()];
    let mut count = vec![0.0; mesh.nodes.len()];
    for (c, ids) in &mesh.cells {
        let h = mesh.size(*c);
        let ue: Vec<f64> = (0..24).map(|a| u[3 * ids[a / 3] + a % 3]).collect();
        for (corner, s) in CORNERS.iter().enumerate() {
            let b = strain_matrix(h, *s);
            let e: [f64; 6] = std::array::from_fn(|r| (0..24).map(|m| b[r][m] * ue[m]).sum());
            let node = ids[corner];
            let t = [e[0], e[1], e[2], 0.5 * e[3], 0.5 * e[4], 0.5 * e[5]];
            (0..6).for_each(|m| sum[node][m] += t[m]);
            count[node] += 1.0;
        }
    }
    sum.iter()
        .zip(&count)
        .map(|(s, c)| s.map(|v| v / c))
        .collect()
}

/// Nodal forces of a total force `total` spread evenly over the cell faces lying on the plane
/// `axis = at` (each face's share to its four corners).
pub fn face_load(mesh: &BoxMesh, axis: usize, at: f64, total: [f64; 3]) -> Vec<f64> {
    let mut f = vec![0.0; 3 * mesh.nodes.len()];
    let mut faces = Vec::new();
    for (c, ids) in &mesh.cells {
        let corners: Vec<usize> = (0..8)
            .filter(|&a| (mesh.position(ids[a])[axis] - at).abs() < 1e-12)
            .map(|a| ids[a])
            .collect();
        if corners.len() == 4 {
            let h = mesh.size(*c);
            let area: f64 = (0..3).filter(|&d| d != axis).map(|d| h[d]).product();
            faces.push((corners, area));
        }
    }
    let total_area: f64 = faces.iter().map(|f| f.1).sum();
    for (corners, area) in faces {
        for n in corners {
            for d in 0..3 {
                f[3 * n + d] += total[d] * area / total_area / 4.0;
            }
        }
    }
    f
}
