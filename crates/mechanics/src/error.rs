//! Typed errors of the mechanics crate. Every message names the offending value and the way out.

use thiserror::Error;

/// Lengths in messages are shown in millimetres, the unit engineers read drawings in.
fn mm(value_m: f64) -> String {
    let text = format!("{:.4}", value_m * 1e3);
    let text = text.trim_end_matches('0').trim_end_matches('.');
    format!("{text} mm")
}

/// Why a model could not be built or evaluated.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum MechanicsError {
    /// A number was NaN or infinite.
    #[error("{name} is not a finite number ({value}); enter a real value")]
    NotFinite { name: &'static str, value: f64 },

    /// A length, modulus or other strictly positive quantity was zero or negative.
    #[error("{name} must be greater than zero, got {value}; enter a positive value")]
    NotPositive { name: &'static str, value: f64 },

    /// A dimension (metres) that must be positive was zero or negative.
    #[error("{name} must be greater than zero, got {shown}; enter a positive dimension", shown = mm(*value_m))]
    NonPositiveDimension { name: &'static str, value_m: f64 },

    /// A value far outside anything a part can have: a typo or a slip of unit.
    #[error("{name} of {value} {unit} is not plausible (at most {limit} {unit}); check the unit")]
    NotPlausible {
        name: &'static str,
        value: f64,
        limit: f64,
        unit: &'static str,
    },

    /// An inner dimension is not smaller than the outer one it sits in.
    #[error(
        "{inner_name} {inner} must be smaller than {outer_name} {outer}; reduce the {inner_name} or enlarge the {outer_name}",
        inner = mm(*inner_m),
        outer = mm(*outer_m)
    )]
    InnerNotSmaller {
        inner_name: &'static str,
        inner_m: f64,
        outer_name: &'static str,
        outer_m: f64,
    },

    /// Poisson's ratio outside the range allowed for an isotropic solid.
    #[error("Poisson's ratio {value} is outside 0 to 0.5; typical metals are 0.26 to 0.35")]
    PoissonOutOfRange { value: f64 },

    /// A point or a grid does not lie on the part's surface.
    #[error("{what} is off the part: {detail}")]
    PointOffPart { what: &'static str, detail: String },

    /// A thin-wall vessel formula used where the wall is too thick for it.
    #[error(
        "mean radius / wall thickness = {ratio:.2} is below {limit} where the thin-wall formulas hold; \
         use the thick-walled cylinder model (Lamé) instead"
    )]
    ThinWallOutsideValidity { ratio: f64, limit: f64 },

    /// A load position on a beam lies outside its span.
    #[error("load position {position} lies outside the span 0 to {span}; place the load on the beam", position = mm(*position_m), span = mm(*span_m))]
    LoadOutsideSpan { position_m: f64, span_m: f64 },

    /// A beam without a load point.
    #[error("the beam has no load point; add one where the vertical and lateral forces act")]
    NoLoadPoint,

    /// Three rosette angles that do not determine a plane strain state.
    #[error(
        "rosette angles {angles_deg:?}° do not determine the strain state; two grids share a direction"
    )]
    SingularRosette { angles_deg: [f64; 3] },

    /// A load the member's model does not carry (a torque on a beam, a pressure on a shaft):
    /// refused rather than taken as zero.
    #[error("a {member} carries no {load}; {way_out}")]
    LoadNotCarried {
        member: &'static str,
        load: &'static str,
        way_out: String,
    },

    /// A transverse sensitivity at or beyond ±1, for which no correction exists.
    #[error(
        "transverse sensitivity {value} must lie strictly between -1 and 1; typical grids are within ±0.05"
    )]
    TransverseSensitivityOutOfRange { value: f64 },

    /// An imported finite-element field that cannot be used as it stands.
    #[error("the imported field cannot be used: {detail}")]
    ImportedField { detail: String },
}

/// Result type of the mechanics crate.
pub type Result<T> = std::result::Result<T, MechanicsError>;

/// Checks that `value` is finite.
pub(crate) fn finite(name: &'static str, value: f64) -> Result<f64> {
    if value.is_finite() {
        Ok(value)
    } else {
        Err(MechanicsError::NotFinite { name, value })
    }
}

/// Checks that a dimension in metres is finite and strictly positive.
pub(crate) fn positive_dimension(name: &'static str, value_m: f64) -> Result<f64> {
    finite(name, value_m)?;
    if value_m <= 0.0 {
        return Err(MechanicsError::NonPositiveDimension { name, value_m });
    }
    at_most(name, value_m, LARGEST_DIMENSION_M, "m")
}

/// The largest dimension of a part, m: a kilometre is far beyond any gauged part, so a larger
/// value is a typo or a slip of unit.
pub const LARGEST_DIMENSION_M: f64 = 1000.0;

/// Checks that a finite magnitude is at most `limit` (in `unit`).
pub(crate) fn at_most(
    name: &'static str,
    value: f64,
    limit: f64,
    unit: &'static str,
) -> Result<f64> {
    if value.abs() <= limit {
        Ok(value)
    } else {
        Err(MechanicsError::NotPlausible {
            name,
            value,
            limit,
            unit,
        })
    }
}

/// Checks that a quantity is finite and strictly positive.
pub(crate) fn positive(name: &'static str, value: f64) -> Result<f64> {
    finite(name, value)?;
    if value > 0.0 {
        Ok(value)
    } else {
        Err(MechanicsError::NotPositive { name, value })
    }
}

/// Checks that `inner` is strictly smaller than `outer`.
pub(crate) fn inner_smaller(
    inner_name: &'static str,
    inner_m: f64,
    outer_name: &'static str,
    outer_m: f64,
) -> Result<()> {
    if inner_m < outer_m {
        Ok(())
    } else {
        Err(MechanicsError::InnerNotSmaller {
            inner_name,
            inner_m,
            outer_name,
            outer_m,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn inner_not_smaller_message_names_both_values_in_mm() {
        let e = MechanicsError::InnerNotSmaller {
            inner_name: "inner diameter",
            inner_m: 0.052,
            outer_name: "outer diameter",
            outer_m: 0.050,
        };
        assert_eq!(
            e.to_string(),
            "inner diameter 52 mm must be smaller than outer diameter 50 mm; \
             reduce the inner diameter or enlarge the outer diameter"
        );
    }

    #[test]
    fn zero_dimension_is_rejected_with_its_name() {
        let e = positive_dimension("wall thickness", 0.0).unwrap_err();
        assert_eq!(
            e.to_string(),
            "wall thickness must be greater than zero, got 0 mm; enter a positive dimension"
        );
    }
}
