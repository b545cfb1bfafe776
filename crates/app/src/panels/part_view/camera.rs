//! An orthographic camera orbiting a target: yaw about the vertical z axis, pitch above the
//! horizon, a scale in pixels per metre. Orthographic because engineering views are: parallel
//! edges stay parallel and a scale is a scale.

use egui::{Pos2, Rect, Vec2, pos2};

type V3 = [f64; 3];

fn dot(a: V3, b: V3) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

/// The preset views.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Preset {
    /// Looking at the front face (from −y): x to the right, z up.
    Front,
    /// Looking down (from +z): x to the right, y up.
    Top,
    /// Looking at the x = L end (from +x): y to the right, z up.
    End,
    /// From the front, above and the far end.
    Isometric,
}

impl Preset {
    /// All presets, in toolbar order.
    pub const ALL: [Preset; 4] = [Preset::Isometric, Preset::Front, Preset::Top, Preset::End];

    /// Button label.
    pub fn name(self) -> &'static str {
        match self {
            Preset::Front => "Front",
            Preset::Top => "Top",
            Preset::End => "End",
            Preset::Isometric => "Isometric",
        }
    }

    /// (yaw, pitch) in radians.
    fn angles(self) -> (f64, f64) {
        match self {
            Preset::Front => (0.0, 0.0),
            Preset::Top => (0.0, std::f64::consts::FRAC_PI_2),
            Preset::End => (std::f64::consts::FRAC_PI_2, 0.0),
            // The true isometric elevation, atan(1/√2) ≈ 35.26°, at 40° round from the front.
            Preset::Isometric => (40f64.to_radians(), (1.0 / 2f64.sqrt()).atan()),
        }
    }
}

/// The camera.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Camera {
    /// Turn about z, radians (0: looking from −y).
    pub yaw: f64,
    /// Elevation, radians (0: horizontal, π/2: from above).
    pub pitch: f64,
    /// Pixels per metre.
    pub scale: f64,
    /// The point shown at the centre of the view, metres.
    pub target: V3,
}

impl Default for Camera {
    fn default() -> Self {
        let (yaw, pitch) = Preset::Isometric.angles();
        Self {
            yaw,
            pitch,
            scale: 1000.0,
            target: [0.0; 3],
        }
    }
}

impl Camera {
    /// Screen right, screen up, and the direction from the target towards the eye.
    pub fn basis(&self) -> (V3, V3, V3) {
        let (sy, cy) = self.yaw.sin_cos();
        let (sp, cp) = self.pitch.sin_cos();
        let eye = [cp * sy, -cp * cy, sp];
        let right = [cy, sy, 0.0];
        // up = eye × right
        let up = [
            eye[1] * right[2] - eye[2] * right[1],
            eye[2] * right[0] - eye[0] * right[2],
            eye[0] * right[1] - eye[1] * right[0],
        ];
        (right, up, eye)
    }

    /// Turns to a preset view.
    pub fn set_preset(&mut self, preset: Preset) {
        (self.yaw, self.pitch) = preset.angles();
    }

    /// Screen position of `p` in a view centred on `centre`, and its depth (larger is nearer
    /// the eye).
    pub fn project(&self, p: V3, centre: Pos2) -> (Pos2, f32) {
        let (right, up, eye) = self.basis();
        let d = [
            p[0] - self.target[0],
            p[1] - self.target[1],
            p[2] - self.target[2],
        ];
        (
            pos2(
                centre.x + (dot(d, right) * self.scale) as f32,
                centre.y - (dot(d, up) * self.scale) as f32,
            ),
            dot(d, eye) as f32,
        )
    }

    /// Centres and scales the view so that `points` fill `rect` with a margin: the part's own
    /// outline, not its bounding box, so a slender part seen at an angle still fills the view.
    pub fn fit(&mut self, points: impl IntoIterator<Item = V3>, rect: Rect) {
        let (right, up, eye) = self.basis();
        let mut lo = [f64::INFINITY; 3];
        let mut hi = [f64::NEG_INFINITY; 3];
        for p in points {
            for (k, axis) in [right, up, eye].iter().enumerate() {
                let c = dot(p, *axis);
                lo[k] = lo[k].min(c);
                hi[k] = hi[k].max(c);
            }
        }
        if !lo.iter().chain(&hi).all(|c| c.is_finite()) {
            return;
        }
        let mid: V3 = std::array::from_fn(|k| (lo[k] + hi[k]) / 2.0);
        self.target = std::array::from_fn(|i| mid[0] * right[i] + mid[1] * up[i] + mid[2] * eye[i]);
        // A margin round the part for the labels of supports, loads and gauges.
        let sx = f64::from(rect.width() - 120.0).max(40.0) / (hi[0] - lo[0]).max(1e-9);
        let sy = f64::from(rect.height() - 80.0).max(40.0) / (hi[1] - lo[1]).max(1e-9);
        self.scale = sx.min(sy).clamp(1e-3, 1e9);
    }

    /// Turns the camera by a drag of `delta` pixels.
    pub fn orbit(&mut self, delta: Vec2) {
        self.yaw -= f64::from(delta.x) * 0.008;
        self.pitch = (self.pitch + f64::from(delta.y) * 0.008)
            .clamp(-std::f64::consts::FRAC_PI_2, std::f64::consts::FRAC_PI_2);
    }

    /// Slides the view by a drag of `delta` pixels.
    pub fn pan(&mut self, delta: Vec2) {
        let (right, up, _) = self.basis();
        let (dx, dy) = (
            f64::from(delta.x) / self.scale,
            f64::from(delta.y) / self.scale,
        );
        self.target = std::array::from_fn(|i| self.target[i] - dx * right[i] + dy * up[i]);
    }

    /// Zooms by `factor` keeping the point under `cursor` where it is.
    pub fn zoom_at(&mut self, factor: f64, cursor: Pos2, centre: Pos2) {
        let (right, up, _) = self.basis();
        let new_scale = (self.scale * factor).clamp(1e-3, 1e9);
        let o = cursor - centre;
        let k = 1.0 / self.scale - 1.0 / new_scale;
        let (ox, oy) = (f64::from(o.x) * k, f64::from(o.y) * k);
        self.target = std::array::from_fn(|i| self.target[i] + ox * right[i] - oy * up[i]);
        self.scale = new_scale;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn presets_look_along_the_named_axes() {
        let mut c = Camera::default();
        let centre = pos2(100.0, 100.0);
        c.scale = 10.0;
        c.set_preset(Preset::Front);
        // +x goes right, +z goes up, +y goes away (less depth).
        assert!(c.project([1.0, 0.0, 0.0], centre).0.x > 100.0);
        assert!(c.project([0.0, 0.0, 1.0], centre).0.y < 100.0);
        assert!(c.project([0.0, 1.0, 0.0], centre).1 < 0.0);
        c.set_preset(Preset::Top);
        assert!(c.project([0.0, 1.0, 0.0], centre).0.y < 100.0);
        assert!(c.project([0.0, 0.0, 1.0], centre).1 > 0.0);
        c.set_preset(Preset::End);
        assert!(c.project([1.0, 0.0, 0.0], centre).1 > 0.0);
        assert!(c.project([0.0, 1.0, 0.0], centre).0.x > 100.0);
    }

    #[test]
    fn zoom_keeps_the_point_under_the_cursor() {
        let mut c = Camera {
            scale: 500.0,
            ..Camera::default()
        };
        let centre = pos2(300.0, 200.0);
        let p = [0.05, -0.02, 0.01];
        let before = c.project(p, centre).0;
        c.zoom_at(2.5, before, centre);
        let after = c.project(p, centre).0;
        assert!((before - after).length() < 1e-3, "{before:?} {after:?}");
    }
}
