//! The colour map of the face, its contour lines at the legend's ticks, and the short strokes
//! along the principal directions.

use egui::{Color32, Painter, Pos2, Rect, Stroke, TextureHandle, pos2, vec2};
use gw_mechanics::{Face, Member, SurfacePoint, surface_map};
use gw_plan::drawing::contour::{contour_segments, grid_triangles};
use gw_plan::drawing::probe::principal_strain_at;

use super::{FaceView, Scene, View};
use crate::panels::map::MapSettings;
use crate::units::Units;

const MAP_NX: usize = 192;
const MAP_NS: usize = 96;
/// Spacing of the principal-direction strokes, points.
const MARK_SPACING: f32 = 34.0;
/// Length of a principal-direction stroke, points.
const MARK_LENGTH: f32 = 16.0;

/// What the map was made for: evaluation count, part, load case, face, settings and the units
/// (the contours follow the legend's ticks, round in the unit shown).
type MapKey = (u64, usize, usize, Face, MapSettings, Units);

/// The sampled map of the face as a texture, with its value range and contour segments.
pub(super) struct MapLayer {
    key: MapKey,
    texture: TextureHandle,
    /// Smallest and largest value found on the face.
    pub(super) found: (f64, f64),
    /// Contour segments in face coordinates (x, s), metres.
    contours: Vec<[(f64, f64); 2]>,
}

impl FaceView {
    /// Samples the map again when the project, part, case, face or map choice changed.
    pub(super) fn map_layer(&mut self, ui: &egui::Ui, scene: &Scene, settings: &MapSettings) {
        let key: MapKey = (
            scene.doc.evaluations,
            scene.sel.part,
            scene.sel.case,
            scene.face,
            *settings,
            scene.units,
        );
        if self.map.as_ref().is_some_and(|m| m.key == key) {
            return;
        }
        self.map = MapLayer::sample(ui, scene, settings, key);
    }
}

impl MapLayer {
    fn sample(ui: &egui::Ui, scene: &Scene, settings: &MapSettings, key: MapKey) -> Option<Self> {
        let map = surface_map(
            &scene.part.member,
            scene.face,
            &scene.loads,
            settings.surface(),
            settings.basis,
            MAP_NX,
            MAP_NS,
        )
        .ok()?;
        let found = map.range().unwrap_or((0.0, 0.0));
        let range = settings.scale_range(found);
        let mut pixels = Vec::with_capacity(MAP_NX * MAP_NS);
        // Image rows run top to bottom; s increases upward.
        for j in (0..MAP_NS).rev() {
            for i in 0..MAP_NX {
                pixels.push(match map.values.get(j * MAP_NX + i).copied().flatten() {
                    None => Color32::TRANSPARENT,
                    Some(v) => settings.colour(v, range),
                });
            }
        }
        let image = egui::ColorImage::new([MAP_NX, MAP_NS], pixels);
        let texture = ui
            .ctx()
            .load_texture("face map", image, egui::TextureOptions::LINEAR);
        let contours = if settings.contours {
            contours_of(&map, &settings.levels(range, scene.units))
        } else {
            Vec::new()
        };
        Some(Self {
            key,
            texture,
            found,
            contours,
        })
    }

    /// Paints the map and its contours over the face, once per period on a round face.
    pub(super) fn paint(&self, painter: &Painter, scene: &Scene, view: View) {
        let e = &scene.extent;
        let face_rect = view.face_rect(&scene.bounds);
        let painter = painter.with_clip_rect(painter.clip_rect().intersect(face_rect));
        let stroke = Stroke::new(1.0, Color32::from_rgba_unmultiplied(40, 40, 45, 150));
        for shift in shifts(scene) {
            let rect = view.rect(e.x_range_m, (e.s_range_m.0 + shift, e.s_range_m.1 + shift));
            if !rect.intersects(painter.clip_rect()) {
                continue;
            }
            painter.image(
                self.texture.id(),
                rect,
                Rect::from_min_max(pos2(0.0, 0.0), pos2(1.0, 1.0)),
                Color32::WHITE,
            );
            for [a, b] in &self.contours {
                let (p, q) = (view.pos(a.0, a.1 + shift), view.pos(b.0, b.1 + shift));
                if painter.clip_rect().intersects(Rect::from_two_pos(p, q)) {
                    painter.line_segment([p, q], stroke);
                }
            }
        }
    }
}

impl MapLayer {
    /// Paints the map into the overview strip; `to_strip` maps face points into it.
    pub(super) fn paint_overview(
        &self,
        painter: &Painter,
        scene: &Scene,
        strip: Rect,
        to_strip: &dyn Fn(f64, f64) -> Pos2,
    ) {
        let painter = painter.with_clip_rect(strip);
        let e = &scene.extent;
        for shift in shifts(scene) {
            let rect = Rect::from_two_pos(
                to_strip(e.x_range_m.0, e.s_range_m.0 + shift),
                to_strip(e.x_range_m.1, e.s_range_m.1 + shift),
            );
            painter.image(
                self.texture.id(),
                rect,
                Rect::from_min_max(pos2(0.0, 0.0), pos2(1.0, 1.0)),
                Color32::WHITE,
            );
        }
    }
}

/// The shifts (multiples of the period) at which a round face's map is drawn so that it
/// covers the drawn range; one shift of zero on a flat face.
fn shifts(scene: &Scene) -> Vec<f64> {
    let Some(p) = scene.period_m else {
        return vec![0.0];
    };
    let (s0, s1) = scene.extent.s_range_m;
    (-2..=2)
        .map(|k| k as f64 * p)
        .filter(|d| s0 + d < scene.bounds.s_m.1 && s1 + d > scene.bounds.s_m.0)
        .collect()
}

/// Contour segments at the legend's ticks, over the map's sample points.
fn contours_of(map: &gw_mechanics::SurfaceMap, levels: &[f64]) -> Vec<[(f64, f64); 2]> {
    let points: Vec<[f64; 2]> = map
        .s_m
        .iter()
        .flat_map(|&s| map.x_m.iter().map(move |&x| [x, s]))
        .collect();
    let triangles = grid_triangles(map.x_m.len(), map.s_m.len());
    let mut out = Vec::new();
    for &level in levels {
        for [p, q] in contour_segments(&map.values, &triangles, level) {
            let (a, b) = (p.point(&points), q.point(&points));
            out.push([(a[0], a[1]), (b[0], b[1])]);
        }
    }
    out
}

/// Short strokes along the larger principal strain on a regular lattice of the visible face,
/// dark for tension and light for compression.
pub(super) fn principal_marks_ui(
    painter: &Painter,
    scene: &Scene,
    settings: &MapSettings,
    view: View,
) {
    if !settings.principal_marks {
        return;
    }
    let face_rect = view.face_rect(&scene.bounds).intersect(view.area);
    if !face_rect.is_positive() {
        return;
    }
    let member: &Member = &scene.part.member;
    let nx = (face_rect.width() / MARK_SPACING).floor().max(1.0) as usize;
    let ny = (face_rect.height() / MARK_SPACING).floor().max(1.0) as usize;
    let cell = vec2(
        face_rect.width() / nx as f32,
        face_rect.height() / ny as f32,
    );
    let mut marks: Vec<(Pos2, f64, f64)> = Vec::with_capacity(nx * ny);
    let mut peak = 0f64;
    for j in 0..ny {
        for i in 0..nx {
            let c = face_rect.min + vec2((i as f32 + 0.5) * cell.x, (j as f32 + 0.5) * cell.y);
            let (x, s) = view.face_point(c);
            let point = SurfacePoint::new(scene.face, x, s);
            let Some(p) = principal_strain_at(member, &scene.loads, &point, settings.basis) else {
                continue;
            };
            peak = peak.max(p.max.abs()).max(p.min.abs());
            marks.push((c, p.max, p.angle_rad));
        }
    }
    let tension = Color32::from_rgb(25, 25, 30);
    let compression = Color32::from_rgb(250, 250, 250);
    for (c, value, angle) in marks {
        // No direction where the strain is nearly nil (a neutral axis, an unloaded region).
        if peak <= 0.0 || value.abs() < 0.02 * peak {
            continue;
        }
        let d = vec2(angle.cos() as f32, -(angle.sin() as f32)) * (MARK_LENGTH / 2.0);
        let colour = if value >= 0.0 { tension } else { compression };
        painter.line_segment([c - d, c + d], Stroke::new(1.6, colour));
    }
}
