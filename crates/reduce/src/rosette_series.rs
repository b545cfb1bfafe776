//! A three-grid rosette read by three channels, reduced sample by sample to principal strains,
//! principal stresses, the principal angle and the maximum shear strain, after correcting each
//! grid for its transverse sensitivity.
//!
//! The correction and the strain state both come from `gw_mechanics` (`transverse::
//! correct_rosette`, `rosette::strain_from_three`); both are linear in the readings, so they are
//! applied to the three unit readings once and the resulting 3 × 3 map is used for every sample.

use gw_bridge::PlacedGauge;
use gw_mechanics::transverse::{CALIBRATION_POISSON_RATIO, correct_rosette};
use gw_mechanics::{Material, rosette::strain_from_three};
use gw_plan::document::Part;
use serde::Serialize;

use crate::reduction::ChannelSeries;

/// One rosette reduced over the log.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RosetteSeries {
    /// Part name.
    pub part: String,
    /// Gauge id.
    pub gauge: String,
    /// Bridges reading grids 1, 2 and 3.
    pub bridges: [String; 3],
    /// Angle of grid 1 from the part's local x axis, rad.
    pub orientation_rad: f64,
    /// Transverse sensitivity corrected for.
    pub transverse_sensitivity: f64,
    /// Measured.
    pub measured: PrincipalSeries,
    /// Predicted from the plan under the log's applied loads, when it carries them.
    pub predicted: Option<PrincipalSeries>,
}

/// Principal values over time.
#[derive(Debug, Clone, PartialEq, Default, Serialize)]
pub struct PrincipalSeries {
    /// Larger principal strain, m/m.
    pub strain_1: Vec<f64>,
    /// Smaller principal strain, m/m.
    pub strain_2: Vec<f64>,
    /// Angle from grid 1 to the direction of the larger principal strain, counter-clockwise,
    /// rad, in (−π/2, π/2].
    pub angle_rad: Vec<f64>,
    /// Maximum in-plane engineering shear strain ε1 − ε2.
    pub max_shear_strain: Vec<f64>,
    /// Larger principal stress (plane-stress Hooke), Pa.
    pub stress_1_pa: Vec<f64>,
    /// Smaller principal stress, Pa.
    pub stress_2_pa: Vec<f64>,
}

impl RosetteSeries {
    /// The sample a summary shows: the largest predicted state when the log carries the applied
    /// loads (the largest measured value leans towards a noise spike), else the measured peak.
    pub fn summary_index(&self) -> Option<usize> {
        self.predicted
            .as_ref()
            .and_then(PrincipalSeries::peak_index)
            .or_else(|| self.measured.peak_index())
    }
}

impl PrincipalSeries {
    /// The index of the sample with the largest |ε1| or |ε2|.
    pub fn peak_index(&self) -> Option<usize> {
        (0..self.strain_1.len()).max_by(|&a, &b| {
            let m = |i: usize| self.strain_1[i].abs().max(self.strain_2[i].abs());
            m(a).total_cmp(&m(b))
        })
    }
}

/// The linear map from the three indicated readings to (εx, εy, γxy) in the rosette's axes,
/// with each grid corrected for transverse sensitivity `kt`.
pub fn reading_map(angles_deg: [f64; 3], kt: f64) -> Result<[[f64; 3]; 3], String> {
    let angles = angles_deg.map(f64::to_radians);
    let mut map = [[0.0; 3]; 3];
    for unit in 0..3 {
        let mut reading = [0.0; 3];
        reading[unit] = 1.0;
        let corrected = correct_rosette(angles, reading, kt, CALIBRATION_POISSON_RATIO)
            .map_err(|e| e.to_string())?;
        let s = strain_from_three(angles, corrected).map_err(|e| e.to_string())?;
        map[0][unit] = s.normal_x;
        map[1][unit] = s.normal_y;
        map[2][unit] = s.shear_xy;
    }
    Ok(map)
}

/// Principal values of every sample of three element-strain series.
pub fn principal_series(
    map: &[[f64; 3]; 3],
    elements: [&[f64]; 3],
    material: &Material,
) -> PrincipalSeries {
    let len = elements.iter().map(|e| e.len()).min().unwrap_or(0);
    let mut out = PrincipalSeries {
        strain_1: Vec::with_capacity(len),
        strain_2: Vec::with_capacity(len),
        angle_rad: Vec::with_capacity(len),
        max_shear_strain: Vec::with_capacity(len),
        stress_1_pa: Vec::with_capacity(len),
        stress_2_pa: Vec::with_capacity(len),
    };
    let nu = material.poisson_ratio;
    let k = material.youngs_modulus_pa / (1.0 - nu * nu);
    let samples = elements[0]
        .iter()
        .zip(elements[1])
        .zip(elements[2])
        .take(len);
    for ((&a, &b), &c) in samples {
        let r = [a, b, c];
        let row = |m: &[f64; 3]| m[0] * r[0] + m[1] * r[1] + m[2] * r[2];
        let (ex, ey, gxy) = (row(&map[0]), row(&map[1]), row(&map[2]));
        let mean = 0.5 * (ex + ey);
        let half_diff = 0.5 * (ex - ey);
        // Strains are far from where squaring over- or underflows, so the plain root serves
        // (`hypot` guards against that at several times the cost of a square root).
        let radius = (half_diff * half_diff + 0.25 * gxy * gxy).sqrt();
        let mut angle = 0.5 * (0.5 * gxy).atan2(half_diff);
        if angle <= -std::f64::consts::FRAC_PI_2 {
            angle += std::f64::consts::PI;
        }
        let (e1, e2) = (mean + radius, mean - radius);
        out.strain_1.push(e1);
        out.strain_2.push(e2);
        out.angle_rad.push(angle);
        out.max_shear_strain.push(e1 - e2);
        out.stress_1_pa.push(k * (e1 + nu * e2));
        out.stress_2_pa.push(k * (e2 + nu * e1));
    }
    out
}

/// Reduces the rosette `gauge` of `part` read by `channels` (grids 1, 2, 3 in order). Each
/// channel's displayed strain is its grid's indicated strain (a quarter bridge with bridge
/// factor ±1 shows the grid's own strain, sign included).
pub fn rosette_series(
    part: &Part,
    gauge: &PlacedGauge,
    channels: [&ChannelSeries; 3],
) -> Result<RosetteSeries, String> {
    let angles: [f64; 3] = gauge
        .spec
        .pattern
        .element_angles_deg()
        .try_into()
        .map_err(|_| "the gauge is not a three-grid rosette".to_owned())?;
    let kt = gauge.spec.transverse_sensitivity;
    let map = reading_map(angles, kt)?;
    let material = part.member.material();
    let measured = principal_series(&map, channels.map(|c| c.strain.as_slice()), material);
    let predicted = match channels.map(|c| c.predicted_mv_per_v.as_ref()) {
        [Some(a), Some(b), Some(c)] => {
            // Each grid's strain per mV/V folded into the map's columns: the predicted readings
            // go in as they are, without a strain copy of each.
            let per = channels.map(|c| c.strain_per_mv_per_v);
            let scaled = map.map(|row| [row[0] * per[0], row[1] * per[1], row[2] * per[2]]);
            Some(principal_series(&scaled, [a, b, c], material))
        }
        _ => None,
    };
    Ok(RosetteSeries {
        part: part.name.clone(),
        gauge: gauge.id.clone(),
        bridges: channels.map(|c| c.bridge.clone()),
        orientation_rad: gauge.angle_rad,
        transverse_sensitivity: kt,
        measured,
        predicted,
    })
}
