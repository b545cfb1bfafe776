//! After the installation: the technician's check-out records compared with the plan, test logs
//! read and reduced (zero, shunt span correction, bridge factor, rosettes, load recovery), and
//! the in-place calibration of a bridge from known load steps.
//!
//! # Conventions
//! - SI units inside, as in the other crates; readings in mV/V (output over excitation × 1000)
//!   once read, strain as a plain ratio, angles in radians.
//! - A channel of a log is a bridge of the plan, matched by its channel number or its name.
//! - Rows of a file are counted as a text editor counts lines: the header is line 1.
pub mod fit;

pub mod calibration;
pub mod checkout;
pub mod cli;
pub mod example;
pub mod log;
pub mod records_csv;
pub mod reduction;
pub mod report;
pub mod report_text;
pub mod rosette_series;
