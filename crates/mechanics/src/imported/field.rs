//! The imported surface with its unit-load fields: where a point is, its frame, and the
//! surface state there under any combination of the unit loads.

use crate::error::{MechanicsError, Result};
use crate::load::{LoadComponent, LoadVector};
use crate::material::Material;
use crate::surface::{Face, FaceExtent, SurfacePoint};
use crate::surface_geometry::SurfaceFrame;
use crate::surface_state::{SurfaceState, SurfaceStrain};

use super::mesh::{RawMesh, bad_mesh};
use super::patches::{Patch, ReferenceAxis, cross, dot, split, sub, unit};
use super::units::TensorQuantity;

/// One unit load's field as read: the tensor at every point of the mesh, SI (m/m or Pa),
/// order xx, yy, zz, xy, yz, zx with tensor shear components.
#[derive(Debug, Clone, PartialEq)]
pub struct UnitField {
    /// The load component this field is the response to, per unit of its SI value.
    pub component: LoadComponent,
    /// Strain or stress.
    pub quantity: TensorQuantity,
    /// One tensor per mesh point.
    pub values: Vec<[f64; 6]>,
}

/// A point found on the surface: its face, the triangle under it and where in that triangle.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Located {
    /// Face number (index into the faces).
    pub face: usize,
    /// Triangle number within the face.
    pub triangle: usize,
    /// Barycentric coordinates in that triangle.
    pub weights: [f64; 3],
}

/// The outer surface of an imported mesh, split into faces, with the unit-load fields at its
/// nodes.
#[derive(Debug, Clone, PartialEq)]
pub struct SurfaceField {
    nodes_m: Vec<[f64; 3]>,
    triangles: Vec<[u32; 3]>,
    facet: Vec<u32>,
    patches: Vec<Patch>,
    fields: Vec<(LoadComponent, TensorQuantity, Vec<[f64; 6]>)>,
    node_home: Vec<(u32, [f64; 2])>,
    /// Per unit field, the norm of each node's deviatoric tensor (the peak search's bound).
    deviator_norms: Vec<Vec<f64>>,
    /// Per unit field, the nodes in falling order of that norm.
    deviator_order: Vec<Vec<u32>>,
    from_solid: bool,
    mesh_points: usize,
    digest: u64,
}

/// The tensor (xx, yy, zz, xy, yz, zx) as a symmetric matrix.
fn matrix(t: &[f64; 6]) -> [[f64; 3]; 3] {
    [[t[0], t[3], t[5]], [t[3], t[1], t[4]], [t[5], t[4], t[2]]]
}

/// aᵀ T b.
fn quadratic(t: &[f64; 6], a: [f64; 3], b: [f64; 3]) -> f64 {
    let m = matrix(t);
    (0..3)
        .map(|i| (0..3).map(|j| a[i] * m[i][j] * b[j]).sum::<f64>())
        .sum()
}

/// Strain tensor from a stress tensor (isotropic Hooke): ε = ((1 + ν) σ − ν tr σ I) / E
/// (Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., §6).
pub fn strain_from_stress(s: &[f64; 6], m: &Material) -> [f64; 6] {
    let (e, nu) = (m.youngs_modulus_pa, m.poisson_ratio);
    let tr = s[0] + s[1] + s[2];
    std::array::from_fn(|k| {
        let diag = if k < 3 { nu * tr } else { 0.0 };
        ((1.0 + nu) * s[k] - diag) / e
    })
}

/// Stress tensor from a strain tensor (tensor shear): σ = λ tr ε I + 2 μ ε (same source).
pub fn stress_from_strain(t: &[f64; 6], m: &Material) -> [f64; 6] {
    let (e, nu) = (m.youngs_modulus_pa, m.poisson_ratio);
    let lambda = e * nu / ((1.0 + nu) * (1.0 - 2.0 * nu));
    let mu = e / (2.0 * (1.0 + nu));
    let tr = t[0] + t[1] + t[2];
    std::array::from_fn(|k| if k < 3 { lambda * tr } else { 0.0 } + 2.0 * mu * t[k])
}

/// Von Mises equivalent of a full stress tensor:
/// √(½[(σxx−σyy)² + (σyy−σzz)² + (σzz−σxx)²] + 3(τxy² + τyz² + τzx²))
/// (Budynas & Nisbett, *Shigley's*, 10th ed., §5-5).
pub fn von_mises_tensor(s: &[f64; 6]) -> f64 {
    (0.5 * ((s[0] - s[1]).powi(2) + (s[1] - s[2]).powi(2) + (s[2] - s[0]).powi(2))
        + 3.0 * (s[3].powi(2) + s[4].powi(2) + s[5].powi(2)))
    .sqrt()
}

/// The Frobenius norm of the deviatoric part of a symmetric tensor (xx, yy, zz, xy, yz, zx
/// with tensor shear): √(Σ dᵢᵢ² + 2(t_xy² + t_yz² + t_zx²)), dᵢᵢ = tᵢᵢ − tr/3.
fn deviator_norm(t: &[f64; 6]) -> f64 {
    let mean = (t[0] + t[1] + t[2]) / 3.0;
    let d = [t[0] - mean, t[1] - mean, t[2] - mean];
    (d[0] * d[0] + d[1] * d[1] + d[2] * d[2] + 2.0 * (t[3] * t[3] + t[4] * t[4] + t[5] * t[5]))
        .sqrt()
}

/// Folds one 64-bit word into a running hash (FNV-1a's step on words, then a rotation so that
/// every bit reaches the low bits).
fn mix(hash: &mut u64, word: u64) {
    *hash = (*hash ^ word)
        .wrapping_mul(0x0000_0100_0000_01b3)
        .rotate_left(29);
}

/// One edge of a face's outline, in the face's flat coordinates (x, s), metres.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OutlineEdge {
    /// Where the edge starts.
    pub from: [f64; 2],
    /// Where it ends.
    pub to: [f64; 2],
    /// The face beyond it (None: the surface ends there).
    pub beyond: Option<usize>,
    /// The surface nodes it runs between (`from`, `to`).
    pub nodes: [u32; 2],
}

/// The outline's edges joined into closed rings of points (the last point joins the first),
/// each ring one boundary of the face: its outer edge, or the edge of a hole in it. A region
/// filled by the even–odd rule over every ring is the face. Edges are joined end to end by the
/// nodes they share, whichever way each runs.
pub fn outline_rings(edges: &[OutlineEdge]) -> Vec<Vec<[f64; 2]>> {
    // (node, edge) for both ends of every edge, sorted by node.
    let mut ends: Vec<(u32, usize)> = edges
        .iter()
        .enumerate()
        .flat_map(|(i, e)| [(e.nodes[0], i), (e.nodes[1], i)])
        .collect();
    ends.sort_unstable();
    let mut used = vec![false; edges.len()];
    let mut rings = Vec::new();
    for first in 0..edges.len() {
        if used[first] {
            continue;
        }
        let start = edges[first].nodes[0];
        let mut ring = vec![edges[first].from];
        let (mut edge, mut at) = (first, start);
        loop {
            used[edge] = true;
            let e = &edges[edge];
            let (next_node, point) = if e.nodes[0] == at {
                (e.nodes[1], e.to)
            } else {
                (e.nodes[0], e.from)
            };
            at = next_node;
            if at == start {
                break;
            }
            ring.push(point);
            let lo = ends.partition_point(|&(n, _)| n < at);
            match ends[lo..]
                .iter()
                .take_while(|&&(n, _)| n == at)
                .find(|&&(_, j)| !used[j])
            {
                Some(&(_, j)) => edge = j,
                None => break,
            }
        }
        rings.push(ring);
    }
    rings
}

/// The outer surface of a mesh as triangles with the unit fields at their nodes, before it is
/// split into faces: what the surface is built from, and what a cache of it keeps.
#[derive(Debug, Clone, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct SurfaceMesh {
    /// Surface nodes, metres.
    pub nodes_m: Vec<[f64; 3]>,
    /// Triangles by surface node, wound outward.
    pub triangles: Vec<[u32; 3]>,
    /// The element face each triangle comes from.
    pub facet: Vec<u32>,
    /// Each unit load's tensors at the surface nodes (SI, tensor shear).
    pub fields: Vec<(LoadComponent, TensorQuantity, Vec<[f64; 6]>)>,
    /// Whether the surface is the free surface of solid cells (else a shell mesh).
    pub from_solid: bool,
    /// Points of the mesh it came from.
    pub mesh_points: usize,
}

impl SurfaceMesh {
    /// The outer surface of `mesh` (faces of solid cells used once, or the shell cells) with
    /// the unit fields at its nodes. Errors name the load and the point at fault.
    pub fn of(mesh: &RawMesh, fields: Vec<UnitField>) -> Result<Self> {
        let surface = mesh.free_surface()?;
        check_fields(mesh, &fields)?;
        let mut compact = vec![u32::MAX; mesh.points_m.len()];
        let mut nodes_m = Vec::new();
        let triangles: Vec<[u32; 3]> = surface
            .triangles
            .iter()
            .map(|t| {
                t.map(|v| {
                    if compact[v as usize] == u32::MAX {
                        compact[v as usize] = nodes_m.len() as u32;
                        nodes_m.push(mesh.points_m[v as usize]);
                    }
                    compact[v as usize]
                })
            })
            .collect();
        let pick = |values: &[[f64; 6]]| {
            let mut out = vec![[0.0; 6]; nodes_m.len()];
            for (i, &c) in compact.iter().enumerate() {
                if c != u32::MAX {
                    out[c as usize] = values[i];
                }
            }
            out
        };
        let fields: Vec<_> = fields
            .iter()
            .map(|f| (f.component, f.quantity, pick(&f.values)))
            .collect();
        Ok(Self {
            nodes_m,
            triangles,
            facet: surface.facet,
            fields,
            from_solid: surface.from_solid,
            mesh_points: mesh.points_m.len(),
        })
    }
}

impl SurfaceField {
    /// The surface of `mesh` with the unit fields at its points; faces take their x axes from
    /// `reference`. Errors name the load and the point at fault.
    pub fn new(mesh: &RawMesh, fields: Vec<UnitField>, reference: ReferenceAxis) -> Result<Self> {
        Self::from_surface(SurfaceMesh::of(mesh, fields)?, reference)
    }

    /// The surface split into faces whose x axes come from `reference`.
    pub fn from_surface(surface: SurfaceMesh, reference: ReferenceAxis) -> Result<Self> {
        if surface
            .fields
            .iter()
            .any(|f| f.2.len() != surface.nodes_m.len())
            || surface.facet.len() != surface.triangles.len()
            || surface
                .triangles
                .iter()
                .flatten()
                .any(|&v| v as usize >= surface.nodes_m.len())
            || surface.nodes_m.iter().flatten().any(|v| !v.is_finite())
            || surface
                .fields
                .iter()
                .flat_map(|f| f.2.iter().flatten())
                .any(|v| !v.is_finite())
        {
            return Err(bad_mesh(
                "the surface's triangles, faces and values do not fit together",
            ));
        }
        let SurfaceMesh {
            nodes_m,
            triangles,
            facet,
            fields,
            from_solid,
            mesh_points,
        } = surface;
        let (normals, areas): (Vec<_>, Vec<_>) = triangles
            .iter()
            .map(|t| {
                let [a, b, c] = t.map(|v| nodes_m[v as usize]);
                let n = cross(sub(b, a), sub(c, a));
                let len = dot(n, n).sqrt();
                (unit(n), 0.5 * len)
            })
            .unzip();
        let (patches, _) = split(&nodes_m, &triangles, &normals, &areas, reference);
        if patches.is_empty() {
            return Err(bad_mesh(
                "every surface triangle has zero area; check the coordinates",
            ));
        }
        let node_home = home_of_nodes(nodes_m.len(), &triangles, &patches);
        let deviator_norms: Vec<Vec<f64>> = fields
            .iter()
            .map(|(_, _, values)| values.iter().map(deviator_norm).collect())
            .collect();
        let deviator_order = deviator_norms
            .iter()
            .map(|norms| {
                let mut order: Vec<u32> = (0..norms.len() as u32).collect();
                order.sort_unstable_by(|&a, &b| norms[b as usize].total_cmp(&norms[a as usize]));
                order
            })
            .collect();
        let digest = digest_of(&nodes_m, &triangles, &fields, reference);
        Ok(Self {
            nodes_m,
            triangles,
            facet,
            patches,
            fields,
            node_home,
            deviator_norms,
            deviator_order,
            from_solid,
            mesh_points,
            digest,
        })
    }

    /// The surface before it was split into faces (what a cache keeps).
    pub fn surface_mesh(&self) -> SurfaceMesh {
        SurfaceMesh {
            nodes_m: self.nodes_m.clone(),
            triangles: self.triangles.clone(),
            facet: self.facet.clone(),
            fields: self.fields.clone(),
            from_solid: self.from_solid,
            mesh_points: self.mesh_points,
        }
    }

    /// The same surface with its faces' x axes from another reference axis.
    pub fn with_reference(&self, reference: ReferenceAxis) -> Result<Self> {
        Self::from_surface(self.surface_mesh(), reference)
    }

    /// A number that changes with any node, triangle or value (not a security hash).
    pub fn digest(&self) -> u64 {
        self.digest
    }

    /// Number of surface nodes.
    pub fn node_count(&self) -> usize {
        self.nodes_m.len()
    }

    /// Number of points of the mesh the field was read from.
    pub fn mesh_point_count(&self) -> usize {
        self.mesh_points
    }

    /// Number of surface triangles.
    pub fn triangle_count(&self) -> usize {
        self.triangles.len()
    }

    /// True when the surface came from solid cells (false: a shell mesh).
    pub fn from_solid(&self) -> bool {
        self.from_solid
    }

    /// The faces.
    pub fn patches(&self) -> &[Patch] {
        &self.patches
    }

    /// Surface node positions, metres.
    pub fn nodes_m(&self) -> &[[f64; 3]] {
        &self.nodes_m
    }

    /// Surface triangles over the surface nodes.
    pub fn triangles(&self) -> &[[u32; 3]] {
        &self.triangles
    }

    /// The load components with a field.
    pub fn components(&self) -> Vec<LoadComponent> {
        self.fields.iter().map(|f| f.0).collect()
    }

    /// The faces as extents (x and s ranges of each face's own coordinates).
    pub fn faces(&self) -> Vec<FaceExtent> {
        self.patches
            .iter()
            .enumerate()
            .map(|(k, p)| FaceExtent {
                face: Face::Patch(k as u16),
                x_range_m: p.x_range_m,
                s_range_m: p.s_range_m,
                wraps: false,
                hole_radius_m: None,
            })
            .collect()
    }

    /// Finds a point on its face; an error says why it is off.
    pub fn locate(&self, point: &SurfacePoint) -> Result<Located> {
        let off = |detail: String| MechanicsError::PointOffPart {
            what: "the point",
            detail,
        };
        let Face::Patch(k) = point.face else {
            return Err(off(format!(
                "an imported surface has no {}; use one of its faces 1 to {}",
                point.face.name(),
                self.patches.len()
            )));
        };
        let Some(patch) = self.patches.get(k as usize) else {
            return Err(off(format!(
                "the imported surface has faces 1 to {}, not face {}",
                self.patches.len(),
                k as usize + 1
            )));
        };
        if !point.x_m.is_finite() || !point.s_m.is_finite() {
            return Err(off(format!(
                "its coordinates ({}, {}) are not finite numbers",
                point.x_m, point.s_m
            )));
        }
        let size =
            (patch.x_range_m.1 - patch.x_range_m.0).max(patch.s_range_m.1 - patch.s_range_m.0);
        let tolerance = 1e-6 * size.max(1e-3);
        let (triangle, weights) = patch.find([point.x_m, point.s_m], tolerance).ok_or_else(
            || {
                off(format!(
                    "x = {:.2} mm, s = {:.2} mm is not on face {} (it lies beyond the face's edge \
                 or in an opening); move it onto the face",
                    point.x_m * 1e3,
                    point.s_m * 1e3,
                    k as usize + 1
                ))
            },
        )?;
        Ok(Located {
            face: k as usize,
            triangle,
            weights,
        })
    }

    /// The frame at a located point: position, interpolated outward normal, and local x along
    /// the face's x axis turned into the tangent plane there.
    pub fn frame_at(&self, at: &Located) -> SurfaceFrame {
        let patch = &self.patches[at.face];
        let tri = self.triangles[patch.triangles[at.triangle] as usize];
        let w = at.weights;
        let position = std::array::from_fn(|k| {
            (0..3)
                .map(|c| w[c] * self.nodes_m[tri[c] as usize][k])
                .sum::<f64>()
        });
        let normals = patch.corner_normals[at.triangle];
        let normal = unit(std::array::from_fn(|k| {
            (0..3).map(|c| w[c] * normals[c][k]).sum()
        }));
        let along = dot(patch.axis_x, normal);
        let axis_x = unit(std::array::from_fn(|k| patch.axis_x[k] - along * normal[k]));
        SurfaceFrame {
            position,
            normal,
            axis_x,
            axis_y: cross(normal, axis_x),
        }
    }

    /// Where a point of a face lies, even a little past its edge (for drawing); `None` off the
    /// surface.
    pub fn frame(&self, point: &SurfacePoint) -> Option<SurfaceFrame> {
        let at = self.locate(point).ok()?;
        Some(self.frame_at(&at))
    }

    /// The strain tensor (tensor shear) at a located point under `loads`.
    pub fn strain_tensor(&self, at: &Located, loads: &LoadVector, material: &Material) -> [f64; 6] {
        let patch = &self.patches[at.face];
        let tri = self.triangles[patch.triangles[at.triangle] as usize];
        let mut total = [0.0; 6];
        for (c, quantity, values) in &self.fields {
            let l = loads[*c];
            if l == 0.0 {
                continue;
            }
            let v: [f64; 6] = std::array::from_fn(|k| {
                (0..3)
                    .map(|i| at.weights[i] * values[tri[i] as usize][k])
                    .sum()
            });
            let strain = match quantity {
                TensorQuantity::Strain => v,
                TensorQuantity::Stress => strain_from_stress(&v, material),
            };
            (0..6).for_each(|k| total[k] += l * strain[k]);
        }
        total
    }

    /// The surface state at a located point: the strain tensor turned into the local axes, the
    /// stress normal to the surface from Hooke's law, and the free thermal strain of a
    /// temperature change.
    pub fn state_at(&self, at: &Located, loads: &LoadVector, material: &Material) -> SurfaceState {
        let t = self.strain_tensor(at, loads, material);
        let f = self.frame_at(at);
        let strain = SurfaceStrain::new(
            quadratic(&t, f.axis_x, f.axis_x),
            quadratic(&t, f.axis_y, f.axis_y),
            2.0 * quadratic(&t, f.axis_x, f.axis_y),
        );
        let stress = stress_from_strain(&t, material);
        let state = SurfaceState {
            strain,
            thermal_strain: 0.0,
            normal_stress_pa: quadratic(&stress, f.normal, f.normal),
        };
        state.with_free_thermal(material.cte_per_c * loads[LoadComponent::TemperatureChange])
    }

    /// The largest von Mises stress over the surface nodes (the full tensor, the stress normal
    /// to the surface included) and the node's place on its face (the first such node where
    /// several share the largest value).
    ///
    /// Von Mises stress is √(3/2) times the norm of the deviatoric stress, a seminorm, so at a
    /// node it is at most Σ |Lᵢ| vmᵢ over the unit loads (the triangle inequality); with
    /// isotropic Hooke the deviatoric stress of a strain field is 2μ times its deviatoric
    /// strain. Nodes whose bound is below the largest value found are never evaluated.
    pub fn peak_von_mises(
        &self,
        loads: &LoadVector,
        material: &Material,
    ) -> Option<(f64, SurfacePoint)> {
        let mu = material.youngs_modulus_pa / (2.0 * (1.0 + material.poisson_ratio));
        // Per loaded unit field: its index, the bound's weight √(3/2)·|L|·k and the signed
        // factor L·k that turns its deviatoric tensor into deviatoric stress (k = 2μ for a
        // strain, 1 for a stress).
        let weights: Vec<(usize, f64, f64)> = self
            .fields
            .iter()
            .enumerate()
            .filter(|(_, (c, _, _))| loads[*c] != 0.0)
            .map(|(i, (c, quantity, _))| {
                let per_unit = match quantity {
                    TensorQuantity::Strain => 2.0 * mu,
                    TensorQuantity::Stress => 1.0,
                };
                let l = loads[*c];
                (i, (1.5f64).sqrt() * l.abs() * per_unit, l * per_unit)
            })
            .collect();
        // Von Mises at a node from the summed deviatoric stress: √(3/2 · s:s).
        let von_mises = |node: usize| -> f64 {
            let mut d = [0.0; 6];
            for &(i, _, factor) in &weights {
                let t = &self.fields[i].2[node];
                let mean = (t[0] + t[1] + t[2]) / 3.0;
                for k in 0..3 {
                    d[k] += factor * (t[k] - mean);
                    d[k + 3] += factor * t[k + 3];
                }
            }
            let ss = d[0] * d[0]
                + d[1] * d[1]
                + d[2] * d[2]
                + 2.0 * (d[3] * d[3] + d[4] * d[4] + d[5] * d[5]);
            (1.5 * ss).sqrt()
        };
        let mut best: Option<(f64, usize)> = None;
        let consider = |node: usize, best: &mut Option<(f64, usize)>| {
            let vm = von_mises(node);
            let better = match *best {
                None => true,
                Some((b, at)) => vm > b || (vm == b && node < at),
            };
            if vm.is_finite() && better {
                *best = Some((vm, node));
            }
        };
        if weights.is_empty() {
            // No load: every node reads zero, the first is taken.
            consider(0, &mut best);
        }
        // Down each unit field's nodes in falling order of their bound at once (a threshold
        // search): a node not reached yet is bounded by the sum of the bounds at the current
        // rank, and the search ends once that sum is below the largest value found (with a
        // margin for rounding, so that ties are all seen).
        for rank in 0..self.nodes_m.len() {
            let mut threshold = 0.0;
            for &(i, w, _) in &weights {
                let node = self.deviator_order[i][rank] as usize;
                consider(node, &mut best);
                threshold += w * self.deviator_norms[i][node];
            }
            if best.is_some_and(|(b, _)| threshold < b * (1.0 - 1e-9)) {
                break;
            }
        }
        let (vm, node) = best?;
        let (face, [x, s]) = self.node_home[node];
        Some((vm, SurfacePoint::new(Face::Patch(face as u16), x, s)))
    }

    /// The surface point nearest to a position in space (within `tolerance_m` of the
    /// surface), on the face whose plane it lies nearest to: how a position known in the
    /// model's axes (a closed-form twin, a point picked in 3-D) becomes a gauge position.
    pub fn point_at(&self, position_m: [f64; 3], tolerance_m: f64) -> Option<SurfacePoint> {
        let mut best: Option<(f64, SurfacePoint)> = None;
        for (k, p) in self.patches.iter().enumerate() {
            let d = sub(position_m, p.origin_m);
            let flat = [dot(d, p.axis_x), dot(d, p.axis_s)];
            let Some((triangle, weights)) = p.find(flat, tolerance_m) else {
                continue;
            };
            let at = Located {
                face: k,
                triangle,
                weights,
            };
            let q = self.frame_at(&at).position;
            let gap = dot(sub(q, position_m), sub(q, position_m)).sqrt();
            if gap <= tolerance_m && best.as_ref().is_none_or(|b| gap < b.0) {
                best = Some((
                    gap,
                    SurfacePoint::new(Face::Patch(k as u16), flat[0], flat[1]),
                ));
            }
        }
        best.map(|b| b.1)
    }

    /// The surface under a point of a grid's tangent plane: on the grid's own face (`home`)
    /// where the point lies over it, else on whichever face lies nearest within `reach_m` (a
    /// grid may run over a rounded edge onto the next face).
    pub fn locate_near(&self, home: usize, position_m: [f64; 3], reach_m: f64) -> Option<Located> {
        if let Some(p) = self.patches.get(home) {
            let d = sub(position_m, p.origin_m);
            if let Some((triangle, weights)) = p.find([dot(d, p.axis_x), dot(d, p.axis_s)], 0.0) {
                return Some(Located {
                    face: home,
                    triangle,
                    weights,
                });
            }
        }
        let point = self.point_at(position_m, reach_m)?;
        self.locate(&point).ok()
    }

    /// The state at a located point in the axes `(axis_x, axis_y)` of another frame (a grid's
    /// centre) laid onto the tangent plane there: how a grid that runs over a curved surface
    /// sums what it reads in its own directions.
    pub fn state_in_axes(
        &self,
        at: &Located,
        (axis_x, axis_y): ([f64; 3], [f64; 3]),
        loads: &LoadVector,
        material: &Material,
    ) -> SurfaceState {
        let t = self.strain_tensor(at, loads, material);
        let f = self.frame_at(at);
        let onto = |a: [f64; 3]| {
            let d = dot(a, f.normal);
            unit([
                a[0] - d * f.normal[0],
                a[1] - d * f.normal[1],
                a[2] - d * f.normal[2],
            ])
        };
        let ex = onto(axis_x);
        let ey = {
            let y = onto(axis_y);
            let d = dot(y, ex);
            unit([y[0] - d * ex[0], y[1] - d * ex[1], y[2] - d * ex[2]])
        };
        let stress = stress_from_strain(&t, material);
        SurfaceState {
            strain: SurfaceStrain::new(
                quadratic(&t, ex, ex),
                quadratic(&t, ey, ey),
                2.0 * quadratic(&t, ex, ey),
            ),
            thermal_strain: 0.0,
            normal_stress_pa: quadratic(&stress, f.normal, f.normal),
        }
        .with_free_thermal(material.cte_per_c * loads[LoadComponent::TemperatureChange])
    }

    /// How many surface facets (element faces) the given points of one face fall on.
    pub fn facets_under(&self, points: &[SurfacePoint]) -> usize {
        let mut seen: Vec<u32> = points
            .iter()
            .filter_map(|p| self.locate(p).ok())
            .map(|at| self.facet[self.patches[at.face].triangles[at.triangle] as usize])
            .collect();
        seen.sort_unstable();
        seen.dedup();
        seen.len()
    }

    /// The outline of a face in its flat coordinates: the triangle edges it does not share
    /// with itself, each with the face beyond it (None where the surface ends, as at a shell's
    /// free edge). Empty for a face that does not exist.
    pub fn outline(&self, face: usize) -> Vec<OutlineEdge> {
        let Some(p) = self.patches.get(face) else {
            return Vec::new();
        };
        let key = |a: u32, b: u32| (a.min(b), a.max(b));
        // (edge, triangle of the face, corner the edge starts at)
        let mut edges: Vec<((u32, u32), usize, usize)> = Vec::with_capacity(3 * p.triangles.len());
        for (i, &t) in p.triangles.iter().enumerate() {
            let tri = self.triangles[t as usize];
            for k in 0..3 {
                edges.push((key(tri[k], tri[(k + 1) % 3]), i, k));
            }
        }
        edges.sort_unstable_by_key(|e| e.0);
        let mut once = Vec::new();
        for run in edges.chunk_by(|a, b| a.0 == b.0) {
            if let [only] = run {
                once.push(*only);
            }
        }
        let mut owner = vec![u32::MAX; self.triangles.len()];
        for (k, q) in self.patches.iter().enumerate() {
            for &t in &q.triangles {
                owner[t as usize] = k as u32;
            }
        }
        let mut beyond = vec![None; once.len()];
        for (t, tri) in self.triangles.iter().enumerate() {
            if owner[t] as usize == face {
                continue;
            }
            for k in 0..3 {
                if let Ok(j) = once.binary_search_by_key(&key(tri[k], tri[(k + 1) % 3]), |e| e.0) {
                    beyond[j] = Some(owner[t] as usize);
                }
            }
        }
        once.iter()
            .zip(beyond)
            .map(|(&(_, i, k), beyond)| {
                let tri = self.triangles[p.triangles[i] as usize];
                OutlineEdge {
                    from: p.corners[i][k],
                    to: p.corners[i][(k + 1) % 3],
                    beyond,
                    nodes: [tri[k], tri[(k + 1) % 3]],
                }
            })
            .collect()
    }

    /// The element face (facet) triangle `triangle` of face `face` comes from.
    pub fn facet_of(&self, face: usize, triangle: usize) -> Option<u32> {
        let t = *self.patches.get(face)?.triangles.get(triangle)?;
        self.facet.get(t as usize).copied()
    }

    /// Typical edge length of the surface triangles of a face, metres (the mesh size there).
    pub fn mesh_size_m(&self, face: usize) -> Option<f64> {
        let p = self.patches.get(face)?;
        Some((2.0 * p.area_m2 / p.triangles.len().max(1) as f64).sqrt())
    }
}

fn check_fields(mesh: &RawMesh, fields: &[UnitField]) -> Result<()> {
    if fields.is_empty() {
        return Err(bad_mesh(
            "no unit load is given; import at least one result file",
        ));
    }
    for (i, f) in fields.iter().enumerate() {
        if f.component == LoadComponent::TemperatureChange {
            return Err(bad_mesh(
                "a temperature change cannot be an imported unit load (the free thermal \
                 expansion is added from the material); name a mechanical load",
            ));
        }
        if fields[..i].iter().any(|g| g.component == f.component) {
            return Err(bad_mesh(&format!(
                "two results are given for the {}; give one result per load",
                f.component.name()
            )));
        }
        if f.values.len() != mesh.points_m.len() {
            return Err(bad_mesh(&format!(
                "the result for the {} has {} values but the mesh has {} points; the field \
                 and the mesh do not belong together",
                f.component.name(),
                f.values.len(),
                mesh.points_m.len()
            )));
        }
        if let Some(n) = f
            .values
            .iter()
            .position(|v| v.iter().any(|x| !x.is_finite()))
        {
            return Err(bad_mesh(&format!(
                "the result for the {} is not a number at point {}; repair the export",
                f.component.name(),
                n + 1
            )));
        }
    }
    Ok(())
}

/// Each node's face and flat coordinates (from the first face that uses it).
fn home_of_nodes(n: usize, triangles: &[[u32; 3]], patches: &[Patch]) -> Vec<(u32, [f64; 2])> {
    let mut home = vec![(u32::MAX, [0.0; 2]); n];
    for (k, p) in patches.iter().enumerate() {
        for (local, &t) in p.triangles.iter().enumerate() {
            for (c, &v) in triangles[t as usize].iter().enumerate() {
                if home[v as usize].0 == u32::MAX {
                    home[v as usize] = (k as u32, p.corners[local][c]);
                }
            }
        }
    }
    home.iter()
        .map(|h| if h.0 == u32::MAX { (0, [0.0; 2]) } else { *h })
        .collect()
}

fn digest_of(
    nodes: &[[f64; 3]],
    triangles: &[[u32; 3]],
    fields: &[(LoadComponent, TensorQuantity, Vec<[f64; 6]>)],
    reference: ReferenceAxis,
) -> u64 {
    let mut h = 0xcbf2_9ce4_8422_2325_u64;
    for p in nodes {
        p.iter().for_each(|v| mix(&mut h, v.to_bits()));
    }
    for t in triangles {
        t.iter().for_each(|&v| mix(&mut h, u64::from(v)));
    }
    for (c, q, values) in fields {
        mix(
            &mut h,
            ((c.index() as u64) << 16) | ((*q as u64) << 8) | reference as u64,
        );
        for v in values {
            v.iter().for_each(|x| mix(&mut h, x.to_bits()));
        }
    }
    h
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::imported::mesh::{Cell, CellKind};

    /// A block of `n × n × n` hexahedra, `size` on each side, from the origin.
    fn block(n: u32, size: [f64; 3]) -> RawMesh {
        let id = |i: u32, j: u32, k: u32| (k * (n + 1) + j) * (n + 1) + i;
        let mut points_m = Vec::new();
        for k in 0..=n {
            for j in 0..=n {
                for i in 0..=n {
                    let f = |c: u32, s: f64| c as f64 / n as f64 * s;
                    points_m.push([f(i, size[0]), f(j, size[1]), f(k, size[2])]);
                }
            }
        }
        let mut cells = Vec::new();
        for k in 0..n {
            for j in 0..n {
                for i in 0..n {
                    let nodes = vec![
                        id(i, j, k),
                        id(i + 1, j, k),
                        id(i + 1, j + 1, k),
                        id(i, j + 1, k),
                        id(i, j, k + 1),
                        id(i + 1, j, k + 1),
                        id(i + 1, j + 1, k + 1),
                        id(i, j + 1, k + 1),
                    ];
                    cells.push(Cell {
                        kind: CellKind::Hexa,
                        nodes,
                    });
                }
            }
        }
        RawMesh { points_m, cells }
    }

    fn steel() -> Material {
        Material::new("m", 200e9, 0.3, 12e-6, 300e6).unwrap()
    }

    /// A uniform stress σxx = 1 Pa per unit load, given as stress.
    fn uniaxial(mesh: &RawMesh) -> UnitField {
        UnitField {
            component: LoadComponent::AxialForce,
            quantity: TensorQuantity::Stress,
            values: vec![[1.0, 0.0, 0.0, 0.0, 0.0, 0.0]; mesh.points_m.len()],
        }
    }

    #[test]
    fn a_block_has_six_faces_with_outward_normals() {
        let mesh = block(3, [0.3, 0.2, 0.1]);
        let f = SurfaceField::new(&mesh, vec![uniaxial(&mesh)], ReferenceAxis::X).unwrap();
        assert_eq!(f.patches().len(), 6);
        // Largest first: the two 0.3 × 0.2 faces (normals ±z).
        assert!(f.patches()[0].normal[2].abs() > 0.999);
        assert!((f.patches()[0].area_m2 - 0.06).abs() < 1e-12);
        for p in f.patches() {
            // The normal points away from the block's centre (0.15, 0.1, 0.05).
            let out = sub(p.origin_m, [0.15, 0.1, 0.05]);
            assert!(dot(out, p.normal) > 0.0);
            // x, s and the normal are right-handed.
            assert!(dot(cross(p.axis_x, p.axis_s), p.normal) > 0.999);
        }
    }

    #[test]
    fn a_face_outline_is_its_rectangle_with_the_four_side_faces_beyond() {
        let mesh = block(3, [0.3, 0.2, 0.1]);
        let f = SurfaceField::new(&mesh, vec![uniaxial(&mesh)], ReferenceAxis::X).unwrap();
        let top = &f.patches()[0];
        let outline = f.outline(0);
        // Three element edges along each side of the 0.3 × 0.2 face.
        assert_eq!(outline.len(), 12);
        let length: f64 = outline
            .iter()
            .map(|e| (e.to[0] - e.from[0]).hypot(e.to[1] - e.from[1]))
            .sum();
        assert!((length - 1.0).abs() < 1e-12, "perimeter {length}");
        // Every edge lies on the face's bounding rectangle.
        let on_edge = |p: [f64; 2]| {
            let near = |v: f64, (a, b): (f64, f64)| (v - a).abs() < 1e-12 || (v - b).abs() < 1e-12;
            near(p[0], top.x_range_m) || near(p[1], top.s_range_m)
        };
        assert!(outline.iter().all(|e| on_edge(e.from) && on_edge(e.to)));
        // Beyond them: the four faces whose normals are square to this one's.
        let mut beyond: Vec<usize> = outline.iter().map(|e| e.beyond.unwrap()).collect();
        beyond.sort_unstable();
        beyond.dedup();
        assert_eq!(beyond.len(), 4);
        assert!(
            beyond
                .iter()
                .all(|&k| dot(f.patches()[k].normal, top.normal).abs() < 1e-9)
        );
        assert!(f.outline(99).is_empty());
    }

    /// Twice the signed area of a ring (shoelace).
    fn ring_area(ring: &[[f64; 2]]) -> f64 {
        (0..ring.len())
            .map(|i| {
                let (a, b) = (ring[i], ring[(i + 1) % ring.len()]);
                a[0] * b[1] - b[0] * a[1]
            })
            .sum::<f64>()
            / 2.0
    }

    /// A 0.5 m square plate 0.05 m thick (5 × 5 × 5 hexahedra; the cells' thickness does not
    /// matter) with the middle column of cells taken out: a 0.1 m square hole through it.
    fn holed_plate() -> RawMesh {
        let mut mesh = block(5, [0.5, 0.5, 0.05]);
        let n = 5;
        let cells: Vec<Cell> = mesh
            .cells
            .iter()
            .enumerate()
            .filter(|(c, _)| {
                let (i, j) = (c % n, (c / n) % n);
                !(i == 2 && j == 2)
            })
            .map(|(_, c)| c.clone())
            .collect();
        mesh.cells = cells;
        mesh
    }

    #[test]
    fn a_map_of_a_face_with_a_hole_has_no_value_in_the_hole() {
        use crate::imported::{FieldState, ImportedSurface};
        use crate::surface_map::{StrainBasis, SurfaceQuantity, surface_map};
        let mesh = holed_plate();
        let f = SurfaceField::new(&mesh, vec![uniaxial(&mesh)], ReferenceAxis::X).unwrap();
        let top = f.patches()[0].clone();
        let member = crate::Member::ImportedField(ImportedSurface {
            material: steel(),
            reference_axis: ReferenceAxis::X,
            loads: Vec::new(),
            mesh_file: None,
            field: FieldState::Loaded(std::sync::Arc::new(f)),
            read_notes: Vec::new(),
        });
        let mut loads = LoadVector::default();
        loads[LoadComponent::AxialForce] = 1.0;
        let (nx, ns) = (50, 50);
        let map = surface_map(
            &member,
            crate::Face::Patch(0),
            &loads,
            SurfaceQuantity::StrainAlong(0.0),
            StrainBasis::Mechanical,
            nx,
            ns,
        )
        .unwrap();
        // Cell centres in the hole (the middle fifth each way) have none; the rest read the
        // uniform stress: σxx = 1 Pa, so the strain along x is 1/E (Hooke's law).
        let (x0, s0) = (top.x_range_m.0, top.s_range_m.0);
        for j in 0..ns {
            for i in 0..nx {
                let v = map.values[j * nx + i];
                let (x, s) = (map.x_m[i] - x0, map.s_m[j] - s0);
                let in_hole = (0.2..0.3).contains(&x) && (0.2..0.3).contains(&s);
                match v {
                    None => assert!(in_hole, "no value at ({x}, {s})"),
                    Some(e) => {
                        assert!(!in_hole, "a value in the hole at ({x}, {s})");
                        assert!((e * 200e9 - 1.0).abs() < 1e-9, "{e}");
                    }
                }
            }
        }
    }

    #[test]
    fn the_outline_of_a_plate_with_a_square_hole_is_two_rings() {
        let mesh = holed_plate();
        let f = SurfaceField::new(&mesh, vec![uniaxial(&mesh)], ReferenceAxis::X).unwrap();
        let top = &f.patches()[0];
        assert!(top.normal[2].abs() > 0.999);
        // Plane geometry: 0.5² − 0.1² = 0.24 m².
        assert!((top.area_m2 - 0.24).abs() < 1e-12, "{}", top.area_m2);
        let mut rings = outline_rings(&f.outline(0));
        rings.sort_by(|a, b| ring_area(a).abs().total_cmp(&ring_area(b).abs()));
        assert_eq!(rings.len(), 2);
        // The hole: one element edge a side; the outer edge: five a side.
        assert_eq!(rings[0].len(), 4);
        assert_eq!(rings[1].len(), 20);
        assert!((ring_area(&rings[0]).abs() - 0.01).abs() < 1e-12);
        assert!((ring_area(&rings[1]).abs() - 0.25).abs() < 1e-12);
        // Each ring is closed by its own edges: consecutive points are one element apart.
        for ring in &rings {
            for i in 0..ring.len() {
                let (a, b) = (ring[i], ring[(i + 1) % ring.len()]);
                assert!(((a[0] - b[0]).hypot(a[1] - b[1]) - 0.1).abs() < 1e-12);
            }
        }
    }

    #[test]
    fn a_point_found_in_space_comes_back_to_the_same_place() {
        let mesh = block(4, [0.4, 0.2, 0.1]);
        let f = SurfaceField::new(&mesh, vec![uniaxial(&mesh)], ReferenceAxis::X).unwrap();
        let top = [0.13, 0.07, 0.1];
        let p = f.point_at(top, 1e-9).unwrap();
        let frame = f.frame(&p).unwrap();
        for (got, want) in frame.position.iter().zip(top) {
            assert!((got - want).abs() < 1e-12);
        }
        assert_eq!(frame.normal, [0.0, 0.0, 1.0]);
        // Off the surface (inside the block) there is no point.
        assert!(f.point_at([0.2, 0.1, 0.05], 1e-6).is_none());
        // A point beyond a face's edge is refused with the face named.
        let off = SurfacePoint::new(p.face, 5.0, 0.0);
        let e = f.locate(&off).unwrap_err().to_string();
        assert!(e.contains("is not on face"), "{e}");
    }

    #[test]
    fn a_grid_at_an_angle_reads_the_stretch_of_a_segment() {
        // Independent route: the affine displacement u = ε·X of the uniform strain stretches a
        // short segment along d by |ε·d + d| − 1 (definition of normal strain, Gere & Goodno,
        // *Mechanics of Materials*, §1.2), against the code's tensor turned into the face.
        let m = steel();
        let mesh = block(2, [0.2, 0.2, 0.2]);
        let f = SurfaceField::new(&mesh, vec![uniaxial(&mesh)], ReferenceAxis::X).unwrap();
        let top = f.point_at([0.1, 0.1, 0.2], 1e-9).unwrap();
        let at = f.locate(&top).unwrap();
        let loads = LoadVector::unit(LoadComponent::AxialForce).scaled(100e6);
        let state = f.state_at(&at, &loads, &m);
        // ε = σ/E along X, −νσ/E across (Hooke), as a small displacement gradient.
        let (ex, et) = (100e6 / 200e9, -0.3 * 100e6 / 200e9);
        for deg in [0.0_f64, 30.0, 45.0, 90.0, 135.0] {
            let (s, c) = deg.to_radians().sin_cos();
            let stretched = [c * (1.0 + ex), s * (1.0 + et), 0.0];
            let expected = dot(stretched, stretched).sqrt() - 1.0;
            let got = state.strain.along(deg.to_radians());
            // The segment's stretch carries second-order terms of order ε² (2.5e-7 here); the
            // small-strain reading leaves them out.
            assert!(
                (got - expected).abs() < ex * ex,
                "{deg}°: {got} vs {expected}"
            );
        }
        // The free top surface carries no normal stress.
        assert!(state.normal_stress_pa.abs() < 1e-6);
    }

    #[test]
    fn results_that_do_not_fit_the_mesh_are_refused_with_the_place() {
        let mesh = block(1, [0.1, 0.1, 0.1]);
        let mut short = uniaxial(&mesh);
        short.values.pop();
        let e = SurfaceField::new(&mesh, vec![short], ReferenceAxis::X).unwrap_err();
        assert!(
            e.to_string().contains("7 values but the mesh has 8 points"),
            "{e}"
        );
        let mut nan = uniaxial(&mesh);
        nan.values[4][2] = f64::NAN;
        let e = SurfaceField::new(&mesh, vec![nan], ReferenceAxis::X).unwrap_err();
        assert!(e.to_string().contains("not a number at point 5"), "{e}");
    }

    /// The von Mises stress at a surface node under the loads, the long way: the unit
    /// fields turned into strain, summed, turned into stress by Hooke's law and taken through
    /// the full von Mises formula.
    fn von_mises_at(f: &SurfaceField, node: usize, loads: &LoadVector, material: &Material) -> f64 {
        let mut total = [0.0; 6];
        for (c, quantity, values) in &f.fields {
            let l = loads[*c];
            if l == 0.0 {
                continue;
            }
            let strain = match quantity {
                TensorQuantity::Strain => values[node],
                TensorQuantity::Stress => strain_from_stress(&values[node], material),
            };
            (0..6).for_each(|k| total[k] += l * strain[k]);
        }
        von_mises_tensor(&stress_from_strain(&total, material))
    }

    #[test]
    fn the_peak_search_finds_the_node_a_search_of_every_node_finds() {
        let m = steel();
        let mesh = block(4, [0.2, 0.1, 0.1]);
        // Values from a fixed linear congruential sequence, one strain and one stress field.
        let mut seed = 12345u64;
        let mut next = || {
            seed = seed
                .wrapping_mul(6364136223846793005)
                .wrapping_add(1442695040888963407);
            (seed >> 11) as f64 / (1u64 << 53) as f64 - 0.5
        };
        let n = mesh.points_m.len();
        let strain: Vec<[f64; 6]> = (0..n)
            .map(|_| std::array::from_fn(|_| 1e-6 * next()))
            .collect();
        let stress: Vec<[f64; 6]> = (0..n).map(|_| std::array::from_fn(|_| next())).collect();
        let fields = vec![
            UnitField {
                component: LoadComponent::VerticalForce,
                quantity: TensorQuantity::Strain,
                values: strain,
            },
            UnitField {
                component: LoadComponent::Torque,
                quantity: TensorQuantity::Stress,
                values: stress,
            },
        ];
        let f = SurfaceField::new(&mesh, fields, ReferenceAxis::X).unwrap();
        for (force, torque) in [(1e3, 0.0), (0.0, -5e5), (-2e3, 4e5), (700.0, 1e5)] {
            let loads = LoadVector::from_pairs(&[
                (LoadComponent::VerticalForce, force),
                (LoadComponent::Torque, torque),
            ]);
            let every = (0..f.node_count())
                .map(|node| (von_mises_at(&f, node, &loads, &m), node))
                .fold(None, |best: Option<(f64, usize)>, (vm, node)| match best {
                    Some((b, _)) if vm <= b => best,
                    _ => Some((vm, node)),
                })
                .unwrap();
            let (vm, p) = f.peak_von_mises(&loads, &m).unwrap();
            assert!(
                (vm - every.0).abs() <= 1e-12 * every.0,
                "loads {force}, {torque}: {vm} against {}",
                every.0
            );
            let home = f.node_home[every.1];
            assert_eq!(
                p,
                SurfacePoint::new(Face::Patch(home.0 as u16), home.1[0], home.1[1])
            );
        }
    }

    #[test]
    fn the_peak_von_mises_is_found_at_a_node() {
        let m = steel();
        let mesh = block(2, [0.2, 0.2, 0.2]);
        let mut field = uniaxial(&mesh);
        field.values[13] = [3.0, 0.0, 0.0, 0.0, 0.0, 0.0]; // the centre node: inside
        field.values[0] = [2.0, 0.0, 0.0, 0.0, 0.0, 0.0]; // a corner: on the surface
        let f = SurfaceField::new(&mesh, vec![field], ReferenceAxis::X).unwrap();
        let loads = LoadVector::unit(LoadComponent::AxialForce).scaled(10e6);
        let (vm, p) = f.peak_von_mises(&loads, &m).unwrap();
        // Uniaxial stress: von Mises equals it (Shigley's §5-5); the inner node is not seen.
        assert!((vm - 20e6).abs() < 1.0, "{vm}");
        let pos = f.frame(&p).unwrap().position;
        assert!(pos.iter().all(|v| v.abs() < 1e-12), "{pos:?}");
    }
}
