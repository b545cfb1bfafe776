//! The Gaugewright desktop app: panels over the project, live results from `gw-plan`, and the
//! check-out and test results from `gw-reduce`.
//!
//! # Conventions
//! - The app holds no physics: it formats and lays out what `gw-plan` evaluates and what
//!   `gw-reduce` derives from the records and the test log ([`measured`]).
//! - Panels hold only view state and emit [`command::Command`]s; [`state::DocumentState`]
//!   applies them after drawing (undo/redo, dirty tracking) and re-evaluates once.
//! - Stored values are SI; [`units`] converts at the display edge.

pub mod app;
pub mod command;
pub mod measured;
pub mod panels;
pub mod screenshot;
pub mod settings;
pub mod state;
pub mod test_files;
pub mod units;

pub use app::GaugewrightApp;
