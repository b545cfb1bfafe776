//! A finite-element mesh as read from a file, and its outer surface.
//!
//! Only the corner nodes of a cell are used (a quadratic cell's mid-side nodes are left out of
//! the surface, which is then drawn and interpolated linearly between corners). The free surface
//! of a solid mesh is made of the cell faces that belong to one cell only; a mesh of shell
//! cells (triangles and quadrilaterals) is its own surface.

use crate::error::{MechanicsError, Result};

/// The kinds of cell read, by their corner nodes in the open VTK node order.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum CellKind {
    /// Three corners (a shell or a surface facet).
    Triangle,
    /// Four corners in order round the edge (a shell or a surface facet).
    Quad,
    /// Four corners.
    Tetra,
    /// Eight corners: the bottom four, then the top four above them.
    Hexa,
    /// Six corners: the bottom triangle, then the top triangle above it.
    Wedge,
    /// Five corners: the base quadrilateral, then the apex.
    Pyramid,
}

impl CellKind {
    /// Number of corner nodes.
    pub fn corners(self) -> usize {
        match self {
            CellKind::Triangle => 3,
            CellKind::Quad | CellKind::Tetra => 4,
            CellKind::Pyramid => 5,
            CellKind::Wedge => 6,
            CellKind::Hexa => 8,
        }
    }

    /// True for cells with a volume.
    pub fn is_solid(self) -> bool {
        !matches!(self, CellKind::Triangle | CellKind::Quad)
    }

    /// The faces of a solid cell as lists of its local corner numbers (orientation is fixed
    /// later from the cell's centroid, so the order round each face only has to be cyclic).
    fn faces(self) -> &'static [&'static [usize]] {
        match self {
            CellKind::Triangle => &[&[0, 1, 2]],
            CellKind::Quad => &[&[0, 1, 2, 3]],
            CellKind::Tetra => &[&[0, 2, 1], &[0, 1, 3], &[1, 2, 3], &[0, 3, 2]],
            CellKind::Hexa => &[
                &[0, 3, 2, 1],
                &[4, 5, 6, 7],
                &[0, 1, 5, 4],
                &[1, 2, 6, 5],
                &[2, 3, 7, 6],
                &[3, 0, 4, 7],
            ],
            CellKind::Wedge => &[
                &[0, 2, 1],
                &[3, 4, 5],
                &[0, 1, 4, 3],
                &[1, 2, 5, 4],
                &[2, 0, 3, 5],
            ],
            CellKind::Pyramid => &[
                &[0, 3, 2, 1],
                &[0, 1, 4],
                &[1, 2, 4],
                &[2, 3, 4],
                &[3, 0, 4],
            ],
        }
    }
}

/// One cell: its kind and its corner nodes (indices into the mesh's points).
#[derive(Debug, Clone, PartialEq)]
pub struct Cell {
    /// Kind of cell.
    pub kind: CellKind,
    /// Corner node indices, as many as the kind has corners.
    pub nodes: Vec<u32>,
}

impl Cell {
    /// The hexahedron of a structured grid whose node at grid position (i, j, k) is
    /// `node(i, j, k)`: the cell from (i, j, k) to (i + 1, j + 1, k + 1), its corners in the
    /// order of a hexahedron (the lower ring, then the upper one).
    pub fn grid_hexahedron(node: impl Fn(u32, u32, u32) -> u32, i: u32, j: u32, k: u32) -> Self {
        Self {
            kind: CellKind::Hexa,
            nodes: vec![
                node(i, j, k),
                node(i + 1, j, k),
                node(i + 1, j + 1, k),
                node(i, j + 1, k),
                node(i, j, k + 1),
                node(i + 1, j, k + 1),
                node(i + 1, j + 1, k + 1),
                node(i, j + 1, k + 1),
            ],
        }
    }
}

/// A mesh as read: points in metres and cells.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct RawMesh {
    /// Node positions, metres, in the model's own axes.
    pub points_m: Vec<[f64; 3]>,
    /// Cells.
    pub cells: Vec<Cell>,
}

/// The outer surface of a mesh: triangles over the mesh's own node numbers, each with the
/// surface facet (a cell face or a shell cell) it was cut from.
#[derive(Debug, Clone, PartialEq)]
pub struct SurfaceTriangles {
    /// Triangles, corners counter-clockwise seen from outside.
    pub triangles: Vec<[u32; 3]>,
    /// For each triangle, the number of the facet it belongs to (a quadrilateral facet gives
    /// two triangles with the same number).
    pub facet: Vec<u32>,
    /// True when the surface came from solid cells (its outward side is known); false for a
    /// shell mesh, whose outward side is the one its cells' node order points to.
    pub from_solid: bool,
}

fn sub(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
}

fn cross(a: [f64; 3], b: [f64; 3]) -> [f64; 3] {
    [
        a[1] * b[2] - a[2] * b[1],
        a[2] * b[0] - a[0] * b[2],
        a[0] * b[1] - a[1] * b[0],
    ]
}

fn dot(a: [f64; 3], b: [f64; 3]) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

fn centroid(points: &[[f64; 3]], nodes: impl Iterator<Item = u32> + Clone) -> [f64; 3] {
    let n = nodes.clone().count().max(1) as f64;
    let mut c = [0.0; 3];
    for i in nodes {
        let p = points[i as usize];
        (0..3).for_each(|k| c[k] += p[k] / n);
    }
    c
}

/// The area vector of a polygon (Newell's method): its direction follows the node order.
fn area_vector(points: &[[f64; 3]], nodes: &[u32]) -> [f64; 3] {
    let c = centroid(points, nodes.iter().copied());
    let mut a = [0.0; 3];
    for k in 0..nodes.len() {
        let p = sub(points[nodes[k] as usize], c);
        let q = sub(points[nodes[(k + 1) % nodes.len()] as usize], c);
        let x = cross(p, q);
        (0..3).for_each(|i| a[i] += 0.5 * x[i]);
    }
    a
}

impl RawMesh {
    /// Checks node numbers, corner counts and coordinates; the message names the cell or point.
    pub fn validate(&self) -> Result<()> {
        let n = self.points_m.len();
        if n == 0 {
            return Err(bad_mesh(
                "the mesh has no points; export the nodes with the result",
            ));
        }
        if let Some((i, p)) = self
            .points_m
            .iter()
            .enumerate()
            .find(|(_, p)| p.iter().any(|v| !v.is_finite()))
        {
            return Err(bad_mesh(&format!(
                "point {} has a coordinate that is not a number ({:?}); repair the export",
                i + 1,
                p
            )));
        }
        for (c, cell) in self.cells.iter().enumerate() {
            if cell.nodes.len() != cell.kind.corners() {
                return Err(bad_mesh(&format!(
                    "cell {} ({:?}) has {} corner nodes instead of {}",
                    c + 1,
                    cell.kind,
                    cell.nodes.len(),
                    cell.kind.corners()
                )));
            }
            if let Some(&bad) = cell.nodes.iter().find(|&&v| v as usize >= n) {
                return Err(bad_mesh(&format!(
                    "cell {} refers to node {} but the mesh has {} points; the node count and \
                     the cells do not belong together",
                    c + 1,
                    bad as u64 + 1,
                    n
                )));
            }
        }
        Ok(())
    }

    /// The outer surface: the faces of solid cells used by one cell only, turned to face
    /// outwards; or, for a mesh of shell cells only, the shells themselves.
    pub fn free_surface(&self) -> Result<SurfaceTriangles> {
        self.validate()?;
        let solid = self.cells.iter().any(|c| c.kind.is_solid());
        let mut facets: Vec<Vec<u32>> = Vec::new();
        if solid {
            facets = free_faces(&self.points_m, &self.cells);
        } else {
            facets.extend(self.cells.iter().map(|c| c.nodes.clone()));
        }
        let mut triangles = Vec::with_capacity(facets.len() * 2);
        let mut facet = Vec::with_capacity(facets.len() * 2);
        for (f, nodes) in facets.iter().enumerate() {
            for k in 1..nodes.len() - 1 {
                triangles.push([nodes[0], nodes[k], nodes[k + 1]]);
                facet.push(f as u32);
            }
        }
        if triangles.is_empty() {
            return Err(bad_mesh(
                "the mesh has no outer surface (no cells, or every face is shared by two \
                 cells); export the solid or shell cells with the result",
            ));
        }
        Ok(SurfaceTriangles {
            triangles,
            facet,
            from_solid: solid,
        })
    }
}

/// The faces of the solid cells that belong to one cell only, turned to face outwards (found
/// by sorting the faces by their sorted corner numbers: a face shared by two cells sorts next
/// to its twin).
fn free_faces(points: &[[f64; 3]], cells: &[Cell]) -> Vec<Vec<u32>> {
    let mut faces: Vec<([u32; 4], [u32; 4], u8)> = Vec::new();
    for cell in cells.iter().filter(|c| c.kind.is_solid()) {
        let centre = centroid(points, cell.nodes.iter().copied());
        for local in cell.kind.faces() {
            let mut face = [u32::MAX; 4];
            for (k, &c) in local.iter().enumerate() {
                face[k] = cell.nodes[c];
            }
            let n = local.len();
            let fc = centroid(points, face[..n].iter().copied());
            if dot(area_vector(points, &face[..n]), sub(fc, centre)) < 0.0 {
                face[..n].reverse();
            }
            let mut key = face;
            key[..n].sort_unstable();
            faces.push((key, face, n as u8));
        }
    }
    faces.sort_unstable_by_key(|f| f.0);
    let mut out = Vec::new();
    let mut i = 0;
    while i < faces.len() {
        let mut j = i + 1;
        while j < faces.len() && faces[j].0 == faces[i].0 {
            j += 1;
        }
        if j - i == 1 {
            out.push(faces[i].1[..faces[i].2 as usize].to_vec());
        }
        i = j;
    }
    out
}

/// An error about the mesh itself.
pub(crate) fn bad_mesh(detail: &str) -> MechanicsError {
    MechanicsError::ImportedField {
        detail: detail.to_owned(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A unit cube of 2 × 1 × 1 hexahedra.
    fn two_cubes() -> RawMesh {
        let mut points_m = Vec::new();
        for z in 0..2 {
            for y in 0..2 {
                for x in 0..3 {
                    points_m.push([x as f64, y as f64, z as f64]);
                }
            }
        }
        let id = |x: u32, y: u32, z: u32| z * 6 + y * 3 + x;
        let hex = |x: u32| Cell {
            kind: CellKind::Hexa,
            nodes: vec![
                id(x, 0, 0),
                id(x + 1, 0, 0),
                id(x + 1, 1, 0),
                id(x, 1, 0),
                id(x, 0, 1),
                id(x + 1, 0, 1),
                id(x + 1, 1, 1),
                id(x, 1, 1),
            ],
        };
        RawMesh {
            points_m,
            cells: vec![hex(0), hex(1)],
        }
    }

    #[test]
    fn two_hexahedra_share_one_face_and_show_ten() {
        let s = two_cubes().free_surface().unwrap();
        // 12 faces in all, 2 of them the shared one: 10 facets, 20 triangles.
        assert_eq!(s.triangles.len(), 20);
        assert_eq!(s.facet.iter().max(), Some(&9));
        // The closed surface encloses the volume 2 (divergence theorem, common practice).
        let m = two_cubes();
        let volume: f64 = s
            .triangles
            .iter()
            .map(|t| {
                let [a, b, c] = t.map(|i| m.points_m[i as usize]);
                dot(a, cross(b, c)) / 6.0
            })
            .sum();
        assert!((volume - 2.0).abs() < 1e-12, "{volume}");
    }

    #[test]
    fn a_cell_pointing_past_the_points_is_refused_with_its_number() {
        let mut m = two_cubes();
        m.cells[1].nodes[3] = 40;
        let e = m.free_surface().unwrap_err().to_string();
        assert!(e.contains("cell 2 refers to node 41"), "{e}");
    }

    #[test]
    fn a_mesh_without_cells_has_no_surface() {
        let m = RawMesh {
            points_m: vec![[0.0; 3]; 4],
            cells: vec![],
        };
        let e = m.free_surface().unwrap_err().to_string();
        assert!(e.contains("no outer surface"), "{e}");
    }
}
