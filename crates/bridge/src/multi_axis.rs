//! Several bridges on one part: the sensitivity matrix, its condition number, the matrix that
//! recovers loads from readings, and the cross-talk left from loads not in the set.

use gw_mechanics::LoadComponent;
use nalgebra::DMatrix;
use serde::Serialize;

use crate::error::BridgeError;
use crate::model::BridgeModel;

/// The multi-bridge analysis.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MultiAxis {
    /// Bridge names (rows).
    pub bridges: Vec<String>,
    /// Components solved for (columns of the sensitivity matrix): each bridge's wanted one.
    pub components: Vec<LoadComponent>,
    /// Displayed strain per unit of each component, rows = bridges.
    pub sensitivity: Vec<Vec<f64>>,
    /// Ratio of largest to smallest singular value (after scaling each column to unit norm).
    pub condition_number: f64,
    /// Least-squares recovery matrix: loads = recovery × readings; rows = components.
    pub recovery: Vec<Vec<f64>>,
    /// Other components the part carries, and what one unit of each puts into every recovered
    /// load (rows = those components, columns = recovered components).
    pub cross_talk: Vec<(LoadComponent, Vec<f64>)>,
}

/// Builds the analysis from prepared bridge models (two or more).
pub fn multi_axis(
    models: &[BridgeModel],
    part_components: &[LoadComponent],
) -> Result<Option<MultiAxis>, BridgeError> {
    if models.len() < 2 {
        return Ok(None);
    }
    let mut components: Vec<LoadComponent> = Vec::new();
    for m in models {
        if !components.contains(&m.bridge().wanted) {
            components.push(m.bridge().wanted);
        }
    }
    let others: Vec<LoadComponent> = part_components
        .iter()
        .copied()
        .filter(|c| !components.contains(c) && *c != LoadComponent::TemperatureChange)
        .collect();
    let rows = models.len();
    let mut s = DMatrix::<f64>::zeros(rows, components.len());
    let mut s_other = DMatrix::<f64>::zeros(rows, others.len());
    for (i, m) in models.iter().enumerate() {
        for (j, &c) in components.iter().enumerate() {
            s[(i, j)] = m.sensitivity(c)?;
        }
        for (j, &c) in others.iter().enumerate() {
            s_other[(i, j)] = m.sensitivity(c)?;
        }
    }
    // Condition number of the column-scaled matrix, so unit choices do not dominate it.
    let mut scaled = s.clone();
    for mut col in scaled.column_iter_mut() {
        let norm = col.norm();
        if norm > 0.0 {
            col /= norm;
        }
    }
    let sv = scaled.singular_values();
    let max = sv.iter().copied().fold(0.0, f64::max);
    let min = sv.iter().copied().fold(f64::INFINITY, f64::min);
    let condition_number = max / min;
    if !(min > 0.0 && condition_number.is_finite()) {
        return Err(BridgeError::Invalid {
            what: "multi-bridge matrix".into(),
            why: "the bridges do not separate the loads: together they read fewer independent \
                  loads than they measure (a bridge that reads nothing, or two that read the \
                  same combination)"
                .into(),
        });
    }
    let recovery = s
        .clone()
        .pseudo_inverse(1e-30)
        .map_err(|e| BridgeError::Invalid {
            what: "multi-bridge matrix".into(),
            why: format!("cannot be inverted ({e}); the bridges do not separate the loads"),
        })?;
    let leak = &recovery * &s_other;
    let to_rows = |m: &DMatrix<f64>| -> Vec<Vec<f64>> {
        (0..m.nrows())
            .map(|i| m.row(i).iter().copied().collect())
            .collect()
    };
    let cross_talk = others
        .iter()
        .enumerate()
        .map(|(j, &c)| (c, leak.column(j).iter().copied().collect()))
        .collect();
    Ok(Some(MultiAxis {
        bridges: models.iter().map(|m| m.bridge().name.clone()).collect(),
        components,
        sensitivity: to_rows(&s),
        condition_number,
        recovery: to_rows(&recovery),
        cross_talk,
    }))
}
