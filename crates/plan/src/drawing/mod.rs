//! Drawing geometry shared by the app's views and the build sheet: the part as a triangle
//! mesh in space, contour lines over sampled values, and the layout helpers of a face drawn to
//! scale. Pure geometry: no egui, no PDF.

pub mod contour;
pub mod face_layout;
pub mod load_glyphs;
pub mod part_mesh;
pub mod probe;
