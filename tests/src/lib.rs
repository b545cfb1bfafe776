//! Cross-crate verification suite; the checks live in `tests/tests/`.
