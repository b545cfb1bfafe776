//! Cross-crate verification suite: published references and external cross-checks that span
//! more than one crate live in `tests/tests/`.
