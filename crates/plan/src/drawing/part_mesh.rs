//! The part as a triangle mesh in space (filled in below).
