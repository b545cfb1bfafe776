//! Margins: how close each quantity comes to its limit, with pass / warn / fail.

use serde::{Deserialize, Serialize};

/// Utilisation above which a margin is flagged before it fails (our default, editable in the
/// plan).
pub const DEFAULT_WARN_UTILISATION: f64 = 0.8;

/// Outcome of one margin check.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum MarginStatus {
    /// Well inside the limit.
    Pass,
    /// Inside the limit but above the warning level.
    Warn,
    /// Beyond the limit.
    Fail,
}

impl MarginStatus {
    /// Plain word.
    pub fn word(self) -> &'static str {
        match self {
            MarginStatus::Pass => "pass",
            MarginStatus::Warn => "warn",
            MarginStatus::Fail => "fail",
        }
    }
}

/// What a margin compares.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum MarginKind {
    /// Grid strain against the gauge's strain limit.
    GridStrainLimit,
    /// Grid strain, taken as a fully reversed amplitude, against the fatigue strain limit.
    GridFatigue,
    /// Von Mises stress at the gauge against yield.
    StressAtGauge,
    /// Largest von Mises stress in the part against yield.
    PeakStressInPart,
    /// ADC voltage against the input range.
    InputRange,
    /// Resolution against the resolution the engineer requires.
    Resolution,
    /// Grid power density against the allowed density (self-heating).
    SelfHeating,
    /// Predicted error of the reading in the wanted load (its error breakdown plus the
    /// expanded uncertainty) against the accuracy the engineer requires.
    Accuracy,
}

impl MarginKind {
    /// Plain name.
    pub fn name(self) -> &'static str {
        match self {
            MarginKind::GridStrainLimit => "grid strain vs strain limit",
            MarginKind::GridFatigue => "grid strain vs fatigue limit (if cycled)",
            MarginKind::StressAtGauge => "stress at gauge vs yield",
            MarginKind::PeakStressInPart => "peak stress in part vs yield",
            MarginKind::InputRange => "output vs input range",
            MarginKind::Resolution => "resolution vs required",
            MarginKind::SelfHeating => "grid power vs self-heating limit",
            MarginKind::Accuracy => "predicted error vs required accuracy",
        }
    }
}

/// One margin with its numbers.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Margin {
    /// What is compared.
    pub kind: MarginKind,
    /// The quantity (SI unit of the limit).
    pub value: f64,
    /// The limit.
    pub limit: f64,
    /// value / limit.
    pub utilisation: f64,
    /// Outcome.
    pub status: MarginStatus,
}

impl Margin {
    /// A margin from value and limit; `warn_at` is the utilisation that starts a warning.
    pub fn new(kind: MarginKind, value: f64, limit: f64, warn_at: f64) -> Self {
        let utilisation = if limit > 0.0 && value.is_finite() {
            value.abs() / limit
        } else {
            f64::INFINITY
        };
        let status = if utilisation > 1.0 {
            MarginStatus::Fail
        } else if utilisation > warn_at {
            MarginStatus::Warn
        } else {
            MarginStatus::Pass
        };
        Self {
            kind,
            value,
            limit,
            utilisation,
            status,
        }
    }

    /// Safety factor limit / value (infinite when the value is zero).
    pub fn safety_factor(&self) -> f64 {
        if self.value == 0.0 {
            f64::INFINITY
        } else {
            self.limit / self.value.abs()
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn status_bands() {
        assert_eq!(
            Margin::new(MarginKind::InputRange, 0.5, 1.0, 0.8).status,
            MarginStatus::Pass
        );
        assert_eq!(
            Margin::new(MarginKind::InputRange, 0.9, 1.0, 0.8).status,
            MarginStatus::Warn
        );
        assert_eq!(
            Margin::new(MarginKind::InputRange, -1.2, 1.0, 0.8).status,
            MarginStatus::Fail
        );
    }
}
