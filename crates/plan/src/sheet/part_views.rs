//! The part as a whole: views with its supports, loads and axes.

use super::writer::Writer;
use crate::document::Part;

/// Draws the part in views that show where it is held and loaded, from `w.y` down.
pub(crate) fn draw(_w: &mut Writer, _part: &Part) {}
