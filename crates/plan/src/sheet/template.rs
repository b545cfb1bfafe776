//! The 1:1 marking template of a face.
