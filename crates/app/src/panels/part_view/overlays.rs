//! What the part view draws over the shaded part: edges, contours, gauges, loads, supports,
//! the datum and the axes, with labels that keep clear of each other.

use egui::{Align2, Color32, FontId, Painter, Pos2, Rect, Shape, Stroke, Vec2, pos2, vec2};
use gw_bridge::PlacedGauge;
use gw_mechanics::{BeamSupport, Face, Member, SurfacePoint};
use gw_plan::drawing::load_glyphs::GlyphShape;
use gw_plan::drawing::part_mesh::Region;

use super::camera::Camera;
use super::scene::{Projection, Scene};
use crate::panels::{capitalise, palette};
use crate::units::{Quantity, Units};

/// Our colours for the things drawn over the part.
pub mod colours {
    use egui::Color32;
    /// Part edges.
    pub const EDGE: Color32 = Color32::from_rgb(40, 44, 52);
    /// Contour lines.
    pub const CONTOUR: Color32 = Color32::from_rgba_premultiplied(30, 30, 30, 120);
    /// Loads.
    pub const LOAD: Color32 = Color32::from_rgb(206, 52, 96);
    /// The face under the cursor.
    pub const HOVER: Color32 = Color32::from_rgb(255, 214, 90);
    /// Axes x, y, z.
    pub const AXES: [Color32; 3] = [
        Color32::from_rgb(214, 92, 72),
        Color32::from_rgb(92, 170, 100),
        Color32::from_rgb(96, 140, 226),
    ];
}

/// Labels placed so far, so that a new one keeps clear of them.
#[derive(Default)]
pub struct Labels {
    taken: Vec<Rect>,
    /// The middle of the drawing: labels look for room away from it first, off the part.
    middle: Option<Pos2>,
}

impl Labels {
    /// Labels start looking for room on the side away from `middle`.
    pub fn away_from(middle: Pos2) -> Self {
        Self {
            taken: Vec::new(),
            middle: Some(middle),
        }
    }

    /// Marks a region as taken (a toolbar, the legend).
    pub fn reserve(&mut self, rect: Rect) {
        self.taken.push(rect);
    }

    /// Marks the line through `points` as taken, as small squares every few pixels.
    pub fn reserve_path(&mut self, points: &[Pos2]) {
        for w in points.windows(2) {
            let d = w[1] - w[0];
            let steps = (d.length() / 6.0).ceil().max(1.0) as usize;
            for k in 0..=steps {
                let p = w[0] + d * (k as f32 / steps as f32);
                self.taken.push(Rect::from_center_size(p, Vec2::splat(6.0)));
            }
        }
    }

    /// Draws `text` near `anchor` at the first free spot among a few around it; with `always`
    /// it is drawn at the first spot even when all collide. Returns where it went.
    pub fn place(
        &mut self,
        painter: &Painter,
        anchor: Pos2,
        text: &str,
        colour: Color32,
        always: bool,
    ) -> Option<Rect> {
        let galley = painter.layout_no_wrap(text.to_owned(), FontId::proportional(12.5), colour);
        let size = galley.size() + vec2(6.0, 2.0);
        let near = [
            vec2(8.0, -8.0 - size.y),
            vec2(8.0, 8.0),
            vec2(-8.0 - size.x, -8.0 - size.y),
            vec2(-8.0 - size.x, 8.0),
            vec2(-size.x / 2.0, -14.0 - size.y),
            vec2(-size.x / 2.0, 14.0),
        ];
        // Then the same directions further out; the nearest ring first, and within a ring
        // the spots facing away from the middle of the drawing first.
        let mut offsets: Vec<(usize, Vec2)> = near
            .iter()
            .map(|o| (0, *o))
            .chain(near.iter().map(|o| (1, *o + o.normalized() * 22.0)))
            .chain(near.iter().map(|o| (2, *o + o.normalized() * 48.0)))
            .collect();
        if let Some(m) = self.middle {
            let out = (anchor - m).normalized();
            offsets.sort_by(|(ra, a), (rb, b)| {
                let facing = |o: &Vec2| -(*o + size / 2.0).normalized().dot(out);
                ra.cmp(rb).then(facing(a).total_cmp(&facing(b)))
            });
        }
        let offsets: Vec<Vec2> = offsets.into_iter().map(|(_, o)| o).collect();
        let clip = painter.clip_rect();
        let free = offsets
            .iter()
            .map(|o| Rect::from_min_size(anchor + *o, size))
            .find(|r| clip.contains_rect(*r) && !self.taken.iter().any(|t| t.intersects(*r)));
        let rect = match free {
            Some(r) => r,
            None if always => Rect::from_min_size(anchor + offsets[0], size),
            None => return None,
        };
        self.taken.push(rect);
        painter.rect_filled(rect, 3.0, Color32::from_black_alpha(150));
        painter.galley(rect.min + vec2(3.0, 1.0), galley, colour);
        Some(rect)
    }
}

fn dot(a: [f64; 3], b: [f64; 3]) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

/// Feature edges on the side facing the viewer; those of the hovered face highlighted.
pub fn edges(
    painter: &Painter,
    scene: &Scene,
    proj: &Projection,
    eye: [f64; 3],
    hovered: Option<Face>,
) {
    let m = &scene.mesh;
    let facing = |k: u32| dot(m.normals[k as usize], eye) > -0.02;
    for (region, line) in &m.edges {
        let hot = matches!(region, Region::Face(f) if Some(*f) == hovered);
        let stroke = if hot {
            Stroke::new(2.5, colours::HOVER)
        } else {
            Stroke::new(1.0, colours::EDGE)
        };
        for w in line.windows(2) {
            if facing(w[0]) && facing(w[1]) {
                painter.line_segment(
                    [proj.screen[w[0] as usize], proj.screen[w[1] as usize]],
                    stroke,
                );
            }
        }
    }
}

/// Contour lines on the side facing the viewer.
pub fn contours(painter: &Painter, scene: &Scene, camera: &Camera, centre: Pos2, eye: [f64; 3]) {
    let stroke = Stroke::new(0.8, colours::CONTOUR);
    for (a, b, n) in &scene.contours {
        if dot(*n, eye) > 0.0 {
            painter.line_segment(
                [camera.project(*a, centre).0, camera.project(*b, centre).0],
                stroke,
            );
        }
    }
}

/// A surface point lifted a little off the surface, so overlays are not hidden by it.
fn lifted(member: &Member, p: &SurfacePoint, lift: f64) -> Option<([f64; 3], [f64; 3])> {
    let f = member.surface_frame(p)?;
    Some((
        std::array::from_fn(|i| f.position[i] + lift * f.normal[i]),
        f.normal,
    ))
}

/// How a gauge came out on screen: its centre and whether it is visible.
pub struct DrawnGauge {
    /// Screen centre.
    pub centre: Pos2,
    /// Length of the grid on screen, pixels.
    pub length_px: f32,
}

/// One gauge drawn on its face: outline, grid lines, solder tabs and a direction mark per
/// grid. `None` when it faces away or something nearer hides it.
pub fn gauge(
    painter: &Painter,
    ctx: (&Member, &Camera, Pos2, &Scene, &Projection),
    g: &PlacedGauge,
    lift: f64,
    selected: bool,
) -> Option<DrawnGauge> {
    let (member, camera, centre, scene, proj) = ctx;
    let (_, _, eye) = camera.basis();
    let (c3, n) = lifted(member, &g.position, lift)?;
    if dot(n, eye) <= 0.05 {
        return None;
    }
    let (c2, depth) = camera.project(c3, centre);
    if proj.occluded(scene, c2, depth, lift as f32) {
        return None;
    }
    let colour = if selected {
        palette::SELECTED
    } else {
        palette::GAUGE
    };
    let to_screen =
        |p: SurfacePoint| lifted(member, &p, lift).map(|(q, _)| camera.project(q, centre).0);
    let mut length_px = 0.0f32;
    for e in 0..g.element_count() {
        length_px = length_px.max(grid_ui(
            painter,
            &to_screen,
            &g.footprint(e),
            colour,
            selected,
        ));
    }
    // One direction mark per gauge: its reference direction, from the centre out past the
    // grid, so a turned rosette shows which way it points even as a dot.
    let reference = gw_mechanics::GridFootprint {
        angle_rad: g.angle_rad,
        ..g.footprint(0)
    };
    let reach = 0.5 * reference.length_m.max(reference.width_m);
    if let (Some(p), Some(q)) = (
        to_screen(reference.point(0.0, 0.0)),
        to_screen(reference.point(reach, 0.0)),
    ) {
        let d = q - p;
        let len = d.length();
        if len > 1e-3 {
            let tip = p + d / len * (len * 1.7).max(14.0);
            let from = p + d / len * len.min(6.0);
            arrow(painter, from, tip, Stroke::new(1.8, colour));
        }
    }
    if length_px < 5.0 {
        // Too small to draw to scale at this zoom: a dot, with its id beside it.
        painter.circle(c2, 4.5, colour, Stroke::new(1.5, Color32::from_gray(235)));
    }
    Some(DrawnGauge {
        centre: c2,
        length_px,
    })
}

/// One grid drawn to scale: its outline following the face, grid lines and solder tabs at the
/// −u end. Returns its length on screen (nothing is drawn below 5 px).
fn grid_ui(
    painter: &Painter,
    to_screen: &dyn Fn(SurfacePoint) -> Option<Pos2>,
    fp: &gw_mechanics::GridFootprint,
    colour: Color32,
    selected: bool,
) -> f32 {
    let (l, w) = (fp.length_m / 2.0, fp.width_m / 2.0);
    let (Some(a), Some(b)) = (to_screen(fp.point(-l, 0.0)), to_screen(fp.point(l, 0.0))) else {
        return 0.0;
    };
    let length = (b - a).length();
    if length < 5.0 {
        return length;
    }
    // Each side in four steps, so the outline follows a curved face.
    let corners = [(-l, -w), (l, -w), (l, w), (-l, w)];
    let outline: Vec<Pos2> = (0..4)
        .flat_map(|i| {
            let ((u0, v0), (u1, v1)) = (corners[i], corners[(i + 1) % 4]);
            (0..4).map(move |k| {
                let t = f64::from(k) / 4.0;
                (u0 + (u1 - u0) * t, v0 + (v1 - v0) * t)
            })
        })
        .filter_map(|(u, v)| to_screen(fp.point(u, v)))
        .collect();
    painter.add(Shape::convex_polygon(
        outline.clone(),
        Color32::from_rgba_unmultiplied(250, 250, 245, 70),
        Stroke::NONE,
    ));
    painter.add(Shape::closed_line(
        outline,
        Stroke::new(if selected { 2.0 } else { 1.3 }, colour),
    ));
    for k in 1..5 {
        let v = -w + 2.0 * w * f64::from(k) / 5.0;
        if let (Some(p), Some(q)) = (to_screen(fp.point(-l, v)), to_screen(fp.point(l, v))) {
            painter.line_segment([p, q], Stroke::new(0.8, colour));
        }
    }
    let tab: Vec<Pos2> = [(-l, -w), (-l - 0.45 * l, -w), (-l - 0.45 * l, w), (-l, w)]
        .iter()
        .filter_map(|&(u, v)| to_screen(fp.point(u, v)))
        .collect();
    painter.add(Shape::convex_polygon(tab, colour, Stroke::NONE));
    length
}

/// A straight arrow from `a` to `b` with a filled head at `b`.
pub fn arrow(painter: &Painter, a: Pos2, b: Pos2, stroke: Stroke) {
    let d = b - a;
    let len = d.length();
    if len < 1.0 {
        return;
    }
    let u = d / len;
    let head = (3.5 * stroke.width + 4.0).min(0.45 * len);
    let side = Vec2::new(-u.y, u.x) * head * 0.45;
    painter.line_segment([a, b - u * head * 0.8], stroke);
    painter.add(Shape::convex_polygon(
        vec![b, b - u * head + side, b - u * head - side],
        stroke.color,
        Stroke::NONE,
    ));
}

/// A label waiting to be placed: where it belongs and what it says.
pub type PendingLabel = (Pos2, String);

/// Every load of the case as arrows or turning arrows. An arrow hidden behind the part is left
/// out. The space the arrows take is reserved, so labels placed later keep off them; the
/// labels, each with the load's value, are returned to be placed once the gauges have theirs.
pub fn load_arrows(
    painter: &Painter,
    (camera, centre, proj): (&Camera, Pos2, &Projection),
    scene: &Scene,
    units: Units,
    labels: &mut Labels,
) -> Vec<PendingLabel> {
    let stroke = Stroke::new(2.2, colours::LOAD);
    let (lo, hi) = scene.bounds;
    let tolerance = 1e-3 * (0..3).map(|i| hi[i] - lo[i]).fold(0.0, f64::max) as f32;
    let mut pending = Vec::new();
    for g in &scene.glyphs {
        let mut drawn = false;
        match &g.shape {
            GlyphShape::Arrows(list) => {
                for [t, h] in list {
                    let (a, da) = camera.project(*t, centre);
                    let (b, db) = camera.project(*h, centre);
                    let mid = camera.project(std::array::from_fn(|i| 0.5 * (t[i] + h[i])), centre);
                    let hidden = proj.occluded(scene, mid.0, mid.1, tolerance)
                        && (proj.occluded(scene, a, da, tolerance)
                            || proj.occluded(scene, b, db, tolerance));
                    if !hidden {
                        arrow(painter, a, b, stroke);
                        labels.reserve_path(&[a, b]);
                        drawn = true;
                    }
                }
            }
            GlyphShape::Couple {
                centre: c,
                axis,
                radius_m,
            } => {
                let path = couple(painter, camera, centre, (*c, *axis, *radius_m), stroke);
                labels.reserve_path(&path);
                drawn = true;
            }
        }
        if drawn {
            let text = format!(
                "{} {}",
                capitalise(g.component.name()),
                units.format(Quantity::of(g.component), g.value.abs())
            );
            pending.push((camera.project(g.label_at, centre).0, text));
        }
    }
    pending
}

/// A turning arrow: three quarters of a circle about `axis`, head at the end.
fn couple(
    painter: &Painter,
    camera: &Camera,
    centre: Pos2,
    (c, axis, r): ([f64; 3], [f64; 3], f64),
    stroke: Stroke,
) -> Vec<Pos2> {
    // Two unit vectors across the axis with e1 × e2 = axis, so growing t turns right-handed.
    let helper = if axis[0].abs() < 0.9 {
        [1.0, 0.0, 0.0]
    } else {
        [0.0, 0.0, 1.0]
    };
    let cross = |a: [f64; 3], b: [f64; 3]| {
        [
            a[1] * b[2] - a[2] * b[1],
            a[2] * b[0] - a[0] * b[2],
            a[0] * b[1] - a[1] * b[0],
        ]
    };
    let e1 = {
        let v = cross(helper, axis);
        let n = dot(v, v).sqrt();
        v.map(|x| x / n)
    };
    let e2 = cross(axis, e1);
    let pts: Vec<Pos2> = (0..=28)
        .map(|k| {
            let t = 1.5 * std::f64::consts::PI * k as f64 / 28.0;
            let (s, co) = t.sin_cos();
            camera
                .project(
                    std::array::from_fn(|i| c[i] + r * (co * e1[i] + s * e2[i])),
                    centre,
                )
                .0
        })
        .collect();
    if let [.., a, b] = pts.as_slice() {
        arrow(painter, *a, *b, stroke);
    }
    painter.add(Shape::line(pts.clone(), stroke));
    pts
}

/// The clamp or pins named beside them.
pub fn supports(
    painter: &Painter,
    camera: &Camera,
    centre: Pos2,
    member: &Member,
    labels: &mut Labels,
) {
    let Member::Beam(b) = member else {
        return;
    };
    let (w, h) = (b.section.width_m(), b.section.height_m());
    let c = w.max(h);
    let text = |labels: &mut Labels, p: [f64; 3], t: &str| {
        labels.place(
            painter,
            camera.project(p, centre).0,
            t,
            palette::SELECTED,
            true,
        );
    };
    match b.support {
        BeamSupport::Cantilever => {
            let depth = (0.5 * c).min(0.25 * b.length_m);
            text(
                labels,
                [-depth, 0.0, 0.5 * h + 0.35 * c],
                "clamped at x = 0",
            );
        }
        BeamSupport::SimplySupported => {
            text(labels, [0.0, 0.0, -0.5 * h - 0.45 * c], "pin at x = 0");
            text(
                labels,
                [b.length_m, 0.0, -0.5 * h - 0.45 * c],
                "pin at x = L",
            );
        }
    }
}

/// The datum: a small cross on every face that can show it, named once.
pub fn datum(
    painter: &Painter,
    ctx: (&Member, &Camera, Pos2, &Scene, &Projection),
    datum_m: (f64, f64),
    size: f64,
    labels: &mut Labels,
) {
    let (member, camera, centre, scene, proj) = ctx;
    let (_, _, eye) = camera.basis();
    let stroke = Stroke::new(1.6, palette::SELECTED);
    let mut named = false;
    for f in member.faces() {
        let p = SurfacePoint::new(f.face, datum_m.0, datum_m.1);
        let Ok(p) = member.locate(&p) else {
            continue;
        };
        let Some(fr) = member.surface_frame(&p) else {
            continue;
        };
        if dot(fr.normal, eye) <= 0.05 {
            continue;
        }
        let lift = 0.004 * size;
        let (c2, depth) = camera.project(fr.position, centre);
        let lifted_depth = depth + (lift * dot(fr.normal, eye)) as f32;
        if proj.occluded(scene, c2, lifted_depth, lift as f32) {
            continue;
        }
        let at = |u: f64, v: f64| {
            let q = fr.offset(u, v);
            camera
                .project(
                    std::array::from_fn(|i| q[i] + 0.002 * size * fr.normal[i]),
                    centre,
                )
                .0
        };
        let k = 0.04 * size;
        painter.line_segment([at(-k, 0.0), at(k, 0.0)], stroke);
        painter.line_segment([at(0.0, -k), at(0.0, k)], stroke);
        if !named {
            named = labels
                .place(painter, at(0.0, 0.0), "datum", palette::SELECTED, false)
                .is_some();
        }
    }
}

/// The x, y, z triad in the lower left corner, turning with the camera.
pub fn axes(painter: &Painter, camera: &Camera, rect: Rect) {
    let (right, up, eye) = camera.basis();
    let origin = pos2(rect.left() + 46.0, rect.bottom() - 46.0);
    painter.circle_filled(origin, 44.0, Color32::from_black_alpha(140));
    let mut order: Vec<usize> = vec![0, 1, 2];
    // Far axes first, so the near one is drawn over them.
    order.sort_by(|&a, &b| eye[a].total_cmp(&eye[b]));
    for i in order {
        let tip = origin + vec2(right[i] as f32, -up[i] as f32) * 34.0;
        arrow(painter, origin, tip, Stroke::new(2.0, colours::AXES[i]));
        let away = (tip - origin).normalized() * 9.0;
        painter.text(
            tip + away,
            Align2::CENTER_CENTER,
            ["x", "y", "z"][i],
            FontId::proportional(13.0),
            colours::AXES[i],
        );
    }
}
