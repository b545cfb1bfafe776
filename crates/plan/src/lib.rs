//! The Gaugewright project document, whole-plan evaluation, checks and build sheet.
//!
//! # Conventions
//! SI units inside, as in `gw-mechanics`; the document is stored as RON.
