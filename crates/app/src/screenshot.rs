//! `--screenshot PATH`: render a few frames, save the window to PNG, close.

use std::path::PathBuf;
use std::sync::{Arc, Mutex};

/// Frames drawn before the screenshot is requested, so that layout has settled.
const SETTLE_FRAMES: u32 = 5;

/// What became of the screenshot: `None` until it is taken, then saved or the reason it failed.
#[derive(Clone, Default)]
pub struct ScreenshotOutcome(Arc<Mutex<Option<Result<(), String>>>>, Arc<Mutex<f32>>);

impl ScreenshotOutcome {
    /// Takes the outcome out.
    pub fn take(&self) -> Option<Result<(), String>> {
        self.0.lock().ok().and_then(|mut o| o.take())
    }

    /// How far, in points, the centre view's content ran past an edge of its panel in the
    /// frame that was saved (0 when it fits).
    pub fn view_overflow(&self) -> f32 {
        self.1.lock().map_or(0.0, |o| *o)
    }

    fn set(&self, value: Result<(), String>) {
        if let Ok(mut o) = self.0.lock() {
            *o = Some(value);
        }
    }

    fn set_overflow(&self, points: f32) {
        if let Ok(mut o) = self.1.lock() {
            *o = points;
        }
    }
}

/// A pending request to screenshot the window.
pub struct ScreenshotRequest {
    path: PathBuf,
    frames: u32,
    requested: bool,
    outcome: ScreenshotOutcome,
}

impl ScreenshotRequest {
    /// A request to save the window to `path`.
    pub fn new(path: PathBuf) -> Self {
        Self {
            path,
            frames: 0,
            requested: false,
            outcome: ScreenshotOutcome::default(),
        }
    }

    /// Shared handle to the outcome, readable after the window closes.
    pub fn outcome(&self) -> ScreenshotOutcome {
        self.outcome.clone()
    }

    /// Call once per frame, with how far the centre view's content ran past its panel.
    pub fn on_frame(&mut self, ctx: &egui::Context, view_overflow: f32) {
        self.frames += 1;
        ctx.request_repaint();
        if self.requested || self.frames < SETTLE_FRAMES {
            return;
        }
        self.outcome.set_overflow(view_overflow);
        self.requested = true;
        let path = self.path.clone();
        let outcome = self.outcome.clone();
        let ctx_for_close = ctx.clone();
        ctx.request_screenshot(move |image| {
            outcome.set(save_png(&path, &image));
            ctx_for_close.send_viewport_cmd(egui::ViewportCommand::Close);
            ctx_for_close.request_repaint();
        });
    }
}

fn save_png(path: &std::path::Path, image: &egui::ColorImage) -> Result<(), String> {
    let [w, h] = image.size;
    let bytes: Vec<u8> = image.pixels.iter().flat_map(|c| c.to_array()).collect();
    let buffer = image::RgbaImage::from_raw(w as u32, h as u32, bytes)
        .ok_or_else(|| format!("the screenshot of {w}×{h} pixels had the wrong size"))?;
    buffer
        .save(path)
        .map_err(|e| format!("could not save the screenshot to {}: {e}", path.display()))
}
