//! Display units: the plan crate's, so that the app, the command line and the build sheet
//! format a quantity the same way. Stored values stay SI.

pub use gw_plan::units::{Quantity, Resolution, Units, fixed_text, microstrain, number_text};
