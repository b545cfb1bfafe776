//! Errors of the measurement core.

use thiserror::Error;

use crate::network::NetworkError;

/// Why a bridge or a gauge could not be evaluated.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum BridgeError {
    /// An input value is out of range.
    #[error("{what}: {why}")]
    Invalid { what: String, why: String },
    /// The part's mechanics refused the request.
    #[error(transparent)]
    Mechanics(#[from] gw_mechanics::MechanicsError),
    /// The circuit could not be solved.
    #[error(transparent)]
    Network(#[from] NetworkError),
}

pub(crate) fn check_positive(what: &str, value: f64) -> Result<(), BridgeError> {
    if value.is_finite() && value > 0.0 {
        Ok(())
    } else {
        Err(BridgeError::Invalid {
            what: what.to_owned(),
            why: format!("must be a positive number, got {value}"),
        })
    }
}

pub(crate) fn check_fraction(what: &str, value: f64, lo: f64, hi: f64) -> Result<(), BridgeError> {
    if value.is_finite() && (lo..=hi).contains(&value) {
        Ok(())
    } else {
        Err(BridgeError::Invalid {
            what: what.to_owned(),
            why: format!("{value} is outside {lo} to {hi}"),
        })
    }
}

/// A value that must lie in a plausible range for its quantity: outside it, it is a typo or a
/// slip of unit, not a plan. `unit` follows the numbers in the message.
pub(crate) fn check_plausible(
    what: &str,
    value: f64,
    (lo, hi): (f64, f64),
    unit: &str,
) -> Result<(), BridgeError> {
    if value.is_finite() && (lo..=hi).contains(&value) {
        Ok(())
    } else {
        Err(BridgeError::Invalid {
            what: what.to_owned(),
            why: format!(
                "{value}{unit} is not plausible: enter a value between {lo}{unit} and {hi}{unit} \
                 (check the unit)"
            ),
        })
    }
}
