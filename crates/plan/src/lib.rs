//! The Gaugewright project document, whole-plan evaluation, checks and command line.
//!
//! A [`Project`] holds parts; each part has a mechanics model, load cases, placed gauges and
//! bridges. [`evaluate`] turns a project into one [`Evaluation`]: the app, the command line and
//! the build sheet read only that.
//!
//! # Conventions
//! - SI units inside, as in `gw-mechanics` and `gw-bridge`.
//! - Files are RON with a `format_version`; [`io`] reads, migrates and validates them, and
//!   saves atomically with a backup.
//! - Gauges are referred to by their id in bridges ("G1", grid 2), never by list position.

pub mod accuracy;
pub mod arrangements;
pub mod blank;
pub mod bracket_example;
pub mod cautions;
pub mod channel_list;
pub mod cli;
pub mod conflicts;
pub mod connector;
pub mod demo;
pub mod document;
pub mod drawing;
pub mod edit;
pub mod evaluate;
pub mod finite;
pub mod gallery;
pub mod import;
pub mod imported_part;
pub mod installation;
pub mod io;
pub mod large_example;
pub mod marked;
pub mod migrate;
pub mod parse_errors;
pub mod placement;
pub mod result_series;
pub mod result_tables;
pub mod safe_write;
pub mod sheet;
pub mod surface_cache;
pub mod units;
pub mod validate;
pub mod wiring;

pub use document::{BridgePlan, GaugeLot, LoadCase, Part, PlanArm, PlanGauge, Project, StockGauge};
pub use evaluate::{EvalOptions, Evaluation, evaluate};
pub use io::{PlanError, load_project, project_from_str, project_to_string, save_project};
