//! A plot's picture: a screenshot of the window, cropped to the plot and saved as PNG.

use std::path::PathBuf;
use std::sync::{Arc, Mutex};

use gw_plan::safe_write::{Backup, write_file};

use crate::state::Notice;

/// Frames drawn with no dialog or menu open before the screenshot is asked for, so that the
/// picture shows the plot and not the dialog that chose its file.
const CLEAR_FRAMES: u32 = 2;

/// Frames to wait for the screenshot after asking; a window that cannot give one (no
/// renderer) is reported rather than waited on for ever.
const ANSWER_FRAMES: u32 = 120;

/// The pixel rows and columns of `rect` (points) in an image of `size` pixels taken at
/// `pixels_per_point`: `(corner, size)`, widened to whole pixels and clamped to the image.
/// `None` when nothing of the rect lies on the image.
pub fn pixel_region(
    rect: egui::Rect,
    pixels_per_point: f32,
    size: [usize; 2],
) -> Option<([usize; 2], [usize; 2])> {
    let scaled = [
        rect.min.x * pixels_per_point,
        rect.min.y * pixels_per_point,
        rect.max.x * pixels_per_point,
        rect.max.y * pixels_per_point,
    ];
    if !scaled.iter().all(|v| v.is_finite()) || pixels_per_point <= 0.0 {
        return None;
    }
    let clamp = |v: f32, limit: usize| (v.max(0.0) as usize).min(limit);
    let x0 = clamp(scaled[0].floor(), size[0]);
    let y0 = clamp(scaled[1].floor(), size[1]);
    let x1 = clamp(scaled[2].ceil(), size[0]);
    let y1 = clamp(scaled[3].ceil(), size[1]);
    (x1 > x0 && y1 > y0).then_some(([x0, y0], [x1 - x0, y1 - y0]))
}

/// The part of `image` under `rect` (points), or `None` when the rect is off the image.
pub fn crop_to_rect(
    image: &egui::ColorImage,
    rect: egui::Rect,
    pixels_per_point: f32,
) -> Option<egui::ColorImage> {
    let (corner, size) = pixel_region(rect, pixels_per_point, image.size)?;
    Some(image.region_by_pixels(corner, size))
}

/// The image as PNG bytes.
pub fn png_bytes(image: &egui::ColorImage) -> Result<Vec<u8>, String> {
    let [w, h] = image.size;
    let rgba: Vec<u8> = image.pixels.iter().flat_map(|c| c.to_array()).collect();
    let buffer = image::RgbaImage::from_raw(w as u32, h as u32, rgba)
        .ok_or_else(|| format!("the picture of {w}×{h} pixels had the wrong size"))?;
    let mut bytes = Vec::new();
    buffer
        .write_to(
            &mut std::io::Cursor::new(&mut bytes),
            image::ImageFormat::Png,
        )
        .map_err(|e| e.to_string())?;
    Ok(bytes)
}

/// The screenshot as it arrives from the window.
type Arrival = Arc<Mutex<Option<Arc<egui::ColorImage>>>>;

/// A picture whose file is chosen, waiting for the window's screenshot.
pub(super) struct PictureShot {
    name: String,
    rect: egui::Rect,
    path: PathBuf,
    clear_frames: u32,
    /// Frames since the screenshot was asked for, and the pixels per point then.
    asked: Option<(u32, f32)>,
    arrival: Arrival,
}

impl PictureShot {
    pub(super) fn new(name: String, rect: egui::Rect, path: PathBuf) -> Self {
        Self {
            name,
            rect,
            path,
            clear_frames: 0,
            asked: None,
            arrival: Arrival::default(),
        }
    }

    /// Moves on by one frame; the notice when the picture is saved or failed.
    pub(super) fn on_frame(&mut self, ctx: &egui::Context, dialog_open: bool) -> Option<Notice> {
        ctx.request_repaint();
        if let Some((frames, pixels_per_point)) = self.asked {
            let arrived = self.arrival.lock().ok().and_then(|mut a| a.take());
            if let Some(image) = arrived {
                return Some(self.save(&image, pixels_per_point));
            }
            self.asked = Some((frames + 1, pixels_per_point));
            return (frames + 1 > ANSWER_FRAMES).then(|| Notice {
                is_error: true,
                text: format!(
                    "Could not save the picture of \"{}\": the window gave no screenshot. \
                     Save the data as CSV instead, or try again.",
                    self.name
                ),
            });
        }
        if dialog_open || egui::Popup::is_any_open(ctx) {
            self.clear_frames = 0;
            return None;
        }
        self.clear_frames += 1;
        if self.clear_frames >= CLEAR_FRAMES {
            self.asked = Some((0, ctx.pixels_per_point()));
            let arrival = self.arrival.clone();
            let repaint = ctx.clone();
            ctx.request_screenshot(move |image| {
                if let Ok(mut a) = arrival.lock() {
                    *a = Some(image);
                }
                repaint.request_repaint();
            });
        }
        None
    }

    fn save(&self, image: &egui::ColorImage, pixels_per_point: f32) -> Notice {
        let written = crop_to_rect(image, self.rect, pixels_per_point)
            .ok_or_else(|| "the plot is not on the screen".to_owned())
            .and_then(|picture| png_bytes(&picture))
            .and_then(|bytes| {
                write_file(&self.path, &bytes, Backup::Replace).map_err(|e| e.to_string())
            });
        match written {
            Ok(()) => Notice {
                is_error: false,
                text: format!(
                    "Saved the picture of \"{}\" to {}",
                    self.name,
                    self.path.display()
                ),
            },
            Err(e) => Notice {
                is_error: true,
                text: format!(
                    "Could not save the picture of \"{}\": {e}. The project is unchanged; \
                     choose another folder.",
                    self.name
                ),
            },
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use egui::{Color32, ColorImage, Rect, pos2};

    #[test]
    fn region_scales_by_pixels_per_point_and_widens_to_whole_pixels() {
        let r = Rect::from_min_max(pos2(10.2, 20.0), pos2(30.0, 25.5));
        // 2 pixels per point: x 20.4 → 20, 60; y 40, 51.
        assert_eq!(pixel_region(r, 2.0, [200, 100]), Some(([20, 40], [40, 11])));
        assert_eq!(pixel_region(r, 1.0, [200, 100]), Some(([10, 20], [20, 6])));
    }

    #[test]
    fn region_is_clamped_to_the_image() {
        let r = Rect::from_min_max(pos2(-50.0, -5.0), pos2(500.0, 40.0));
        assert_eq!(pixel_region(r, 1.0, [120, 30]), Some(([0, 0], [120, 30])));
    }

    #[test]
    fn region_off_the_image_or_bad_is_none() {
        let off = Rect::from_min_max(pos2(130.0, 0.0), pos2(140.0, 10.0));
        assert_eq!(pixel_region(off, 1.0, [120, 30]), None);
        let nan = Rect::from_min_max(pos2(f32::NAN, 0.0), pos2(10.0, 10.0));
        assert_eq!(pixel_region(nan, 1.0, [120, 30]), None);
        let inside = Rect::from_min_max(pos2(0.0, 0.0), pos2(10.0, 10.0));
        assert_eq!(pixel_region(inside, 0.0, [120, 30]), None);
    }

    #[test]
    fn crop_keeps_the_pixels_under_the_rect() {
        // A 6×4 image whose pixel at (x, y) has red = x and green = y.
        let pixels = (0..4u8)
            .flat_map(|y| (0..6u8).map(move |x| Color32::from_rgb(x, y, 0)))
            .collect();
        let image = ColorImage::new([6, 4], pixels);
        let r = Rect::from_min_max(pos2(1.0, 0.5), pos2(2.0, 2.0));
        let crop = crop_to_rect(&image, r, 2.0).expect("on the image");
        assert_eq!(crop.size, [2, 3]);
        assert_eq!(crop.pixels[0], Color32::from_rgb(2, 1, 0));
        assert_eq!(crop.pixels[5], Color32::from_rgb(3, 3, 0));
    }

    #[test]
    fn png_bytes_read_back_as_the_same_picture() {
        let image = ColorImage::new([3, 2], vec![Color32::from_rgb(10, 200, 30); 6]);
        let bytes = png_bytes(&image).unwrap();
        let back = image::load_from_memory(&bytes).unwrap().to_rgba8();
        assert_eq!(back.dimensions(), (3, 2));
        assert_eq!(back.get_pixel(2, 1).0, [10, 200, 30, 255]);
    }
}
