//! Strain gauges: pattern, grid geometry, electrical and thermal properties, and placement.

use gw_mechanics::transverse::CALIBRATION_POISSON_RATIO;
use gw_mechanics::{GridFootprint, SurfacePoint};
use serde::{Deserialize, Serialize};

use crate::error::{BridgeError, check_fraction, check_plausible, check_positive};

/// The layout of grids in one gauge. Element angles are measured from the gauge's reference
/// direction.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum GaugePattern {
    /// One grid along the reference direction.
    SingleGrid,
    /// Two grids at 0° and 90° (the second for Poisson strain).
    TwoElement90,
    /// Three grids at 0°, 45°, 90°.
    RectangularRosette,
    /// Three grids at 0°, 60°, 120°.
    DeltaRosette,
    /// Two grids at +45° and −45° (shear and torque).
    ShearPair,
}

impl GaugePattern {
    /// Element angles, degrees.
    pub fn element_angles_deg(self) -> &'static [f64] {
        match self {
            GaugePattern::SingleGrid => &[0.0],
            GaugePattern::TwoElement90 => &[0.0, 90.0],
            GaugePattern::RectangularRosette => &[0.0, 45.0, 90.0],
            GaugePattern::DeltaRosette => &[0.0, 60.0, 120.0],
            GaugePattern::ShearPair => &[45.0, -45.0],
        }
    }

    /// Plain name.
    pub fn name(self) -> &'static str {
        match self {
            GaugePattern::SingleGrid => "single grid",
            GaugePattern::TwoElement90 => "two-element 90°",
            GaugePattern::RectangularRosette => "rectangular rosette 0/45/90",
            GaugePattern::DeltaRosette => "delta rosette 0/60/120",
            GaugePattern::ShearPair => "±45° shear pair",
        }
    }

    /// Every pattern, for pickers.
    pub const ALL: [GaugePattern; 5] = [
        GaugePattern::SingleGrid,
        GaugePattern::TwoElement90,
        GaugePattern::RectangularRosette,
        GaugePattern::DeltaRosette,
        GaugePattern::ShearPair,
    ];
}

/// Thermal output (apparent strain) of a grid bonded to a part.
///
/// The gauge lot is characterised on the material it is matched to; on a part with another
/// expansion coefficient the mismatch adds (α_part − α_matched)·ΔT·(1 + Kt)/(1 − ν0 Kt) — the
/// mismatch strain is equal-biaxial, so the grid reads it with its transverse sensitivity
/// (Dally & Riley, *Experimental Stress Analysis*, 3rd ed., Ch. 6, temperature compensation;
/// from memory for the exact form).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ThermalOutput {
    /// Expansion coefficient of the material the gauge is matched to, 1/°C.
    pub matched_cte_per_c: f64,
    /// Lot polynomial on the matched material: apparent strain = Σ cₖ Tᵏ (T in °C), m/m, as
    /// indicated with the instrument set to `reference_gauge_factor`. It is recorded on the
    /// grid as it is, so it already holds everything the grid's resistance does with
    /// temperature on that material, its gauge factor's change included. Empty means no
    /// residual thermal output on the matched material.
    pub lot_polynomial: Vec<f64>,
    /// Gauge factor the instrument was set to when the lot's curve was recorded. The curve is
    /// an indicated strain, i.e. ΔR/R ÷ that factor, so on a grid of another gauge factor the
    /// same resistance change is the curve × reference ÷ actual (data-sheet correction, from
    /// memory). `None`: the curve was recorded at the grid's own gauge factor.
    #[serde(default)]
    pub reference_gauge_factor: Option<f64>,
    /// Temperatures between which the curve was measured, °C (`None`: not stated). Outside
    /// this range the polynomial is an extrapolation.
    #[serde(default)]
    pub valid_range_c: Option<(f64, f64)>,
}

impl ThermalOutput {
    /// Apparent strain at part temperature `t_c` relative to `reference_c`, for a part of
    /// expansion `part_cte_per_c` and a grid of transverse sensitivity `kt` and gauge factor
    /// `gauge_factor`, m/m, as a strain of that grid at the reference temperature's gauge
    /// factor: ΔR/R = gauge_factor × result when the gauge factor does not change with
    /// temperature. When it does, only the mismatch part is read at the gauge factor of the
    /// moment (see [`ThermalOutput::curve_resistance_change`]).
    pub fn apparent_strain(
        &self,
        part_cte_per_c: f64,
        kt: f64,
        gauge_factor: f64,
        reference_c: f64,
        t_c: f64,
    ) -> f64 {
        self.curve_strain(reference_c, t_c) * self.lot_scale(gauge_factor)
            + self.mismatch_strain(part_cte_per_c, kt, reference_c, t_c)
    }

    /// The lot's curve between `reference_c` and `t_c`: the strain indicated on the matched
    /// material with the instrument at [`ThermalOutput::curve_gauge_factor`], m/m.
    pub fn curve_strain(&self, reference_c: f64, t_c: f64) -> f64 {
        let poly = |t: f64| {
            self.lot_polynomial
                .iter()
                .rev()
                .fold(0.0, |acc, c| acc * t + c)
        };
        poly(t_c) - poly(reference_c)
    }

    /// The gauge factor the curve was indicated at: the stated reference, or the grid's nominal
    /// `gauge_factor` when none is stated.
    pub fn curve_gauge_factor(&self, gauge_factor: f64) -> f64 {
        self.reference_gauge_factor.unwrap_or(gauge_factor)
    }

    /// ΔR/R of a grid of nominal `gauge_factor` on the matched material between `reference_c`
    /// and `t_c`: the curve × the gauge factor it was indicated at. The curve was recorded on
    /// the grid as it is, so it already holds the change of the grid's gauge factor with
    /// temperature; no drift factor applies to it.
    pub fn curve_resistance_change(&self, gauge_factor: f64, reference_c: f64, t_c: f64) -> f64 {
        self.curve_strain(reference_c, t_c) * self.curve_gauge_factor(gauge_factor)
    }

    /// Strain the grid sees from the expansion mismatch between the part and the matched
    /// material, (α_part − α_matched)·ΔT·(1 + Kt)/(1 − ν0 Kt), m/m: a real strain, which the
    /// grid reads at its gauge factor of the moment.
    pub fn mismatch_strain(&self, part_cte_per_c: f64, kt: f64, reference_c: f64, t_c: f64) -> f64 {
        let transverse = (1.0 + kt) / (1.0 - CALIBRATION_POISSON_RATIO * kt);
        (part_cte_per_c - self.matched_cte_per_c) * (t_c - reference_c) * transverse
    }

    /// Factor from the recorded curve to a strain of a grid of `gauge_factor`:
    /// reference gauge factor ÷ gauge factor (1 when no reference is stated).
    pub fn lot_scale(&self, gauge_factor: f64) -> f64 {
        match self.reference_gauge_factor {
            Some(reference) if gauge_factor > 0.0 => reference / gauge_factor,
            _ => 1.0,
        }
    }

    /// Whether the curve covers `t_c` (true when no range is stated).
    pub fn covers(&self, t_c: f64) -> bool {
        self.valid_range_c
            .is_none_or(|(lo, hi)| (lo - 1e-9..=hi + 1e-9).contains(&t_c))
    }
}

/// A gauge type: what a data sheet gives for one gauge lot.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct GaugeSpec {
    /// Grid layout.
    pub pattern: GaugePattern,
    /// Active grid length, m.
    pub grid_length_m: f64,
    /// Active grid width, m.
    pub grid_width_m: f64,
    /// Nominal grid resistance, Ω (120, 350, 1000 or any).
    pub resistance_ohm: f64,
    /// Resistance tolerance of the lot, ± fraction (default ±0.3 %, common practice).
    #[serde(default = "default_resistance_tolerance")]
    pub resistance_tolerance: f64,
    /// Gauge factor at the reference temperature.
    pub gauge_factor: f64,
    /// Gauge-factor tolerance, ± fraction (0.01 = ±1 %).
    pub gauge_factor_tolerance: f64,
    /// Transverse sensitivity Kt, fraction.
    pub transverse_sensitivity: f64,
    /// Largest strain the grid survives in one application, m/m.
    pub strain_limit: f64,
    /// Strain amplitude the grid survives for the rated number of cycles, m/m.
    pub fatigue_strain_limit: f64,
    /// Thermal output.
    pub thermal_output: ThermalOutput,
    /// Relative change of gauge factor per °C, 1/°C.
    pub gauge_factor_temp_coeff_per_c: f64,
    /// Allowed grid power per grid area, W/m² (depends on the part's heat sinking; editable).
    pub max_power_density_w_m2: f64,
}

fn default_resistance_tolerance() -> f64 {
    0.003
}

impl GaugeSpec {
    /// Checks every value; the message names the field and the way out.
    pub fn validate(&self) -> Result<(), BridgeError> {
        check_positive("grid length", self.grid_length_m)?;
        check_positive("grid width", self.grid_width_m)?;
        check_positive("grid resistance", self.resistance_ohm)?;
        check_fraction("resistance tolerance", self.resistance_tolerance, 0.0, 0.1)?;
        check_positive("gauge factor", self.gauge_factor)?;
        check_fraction(
            "gauge-factor tolerance",
            self.gauge_factor_tolerance,
            0.0,
            0.5,
        )?;
        check_fraction(
            "transverse sensitivity",
            self.transverse_sensitivity,
            -0.5,
            0.5,
        )?;
        check_positive("strain limit", self.strain_limit)?;
        check_positive("fatigue strain limit", self.fatigue_strain_limit)?;
        check_positive("allowed power density", self.max_power_density_w_m2)?;
        self.validate_plausible()?;
        if let Some(reference) = self.thermal_output.reference_gauge_factor {
            check_positive(
                "reference gauge factor of the thermal-output curve",
                reference,
            )?;
        }
        if let Some((lo, hi)) = self.thermal_output.valid_range_c
            && !(lo.is_finite() && hi.is_finite() && lo < hi && lo >= -273.15)
        {
            return Err(BridgeError::Invalid {
                what: "temperature range of the thermal-output curve".into(),
                why: format!("{lo} to {hi} °C must run from low to high, above absolute zero"),
            });
        }
        if !self.gauge_factor_temp_coeff_per_c.is_finite()
            || !self.thermal_output.matched_cte_per_c.is_finite()
            || self
                .thermal_output
                .lot_polynomial
                .iter()
                .any(|c| !c.is_finite())
        {
            return Err(BridgeError::Invalid {
                what: "thermal data of the gauge".into(),
                why: "a value is not a finite number; enter real numbers".into(),
            });
        }
        Ok(())
    }

    /// Ranges outside which a value is a typo or a slip of unit, not a gauge: a strain limit
    /// of 80 or a grid a metre long. The bounds are wide (semiconductor grids reach gauge
    /// factors above 100; post-yield grids strain 20 %) and ours, not a maker's.
    fn validate_plausible(&self) -> Result<(), BridgeError> {
        check_plausible("grid length", self.grid_length_m * 1e3, (0.0, 200.0), " mm")?;
        check_plausible("grid width", self.grid_width_m * 1e3, (0.0, 200.0), " mm")?;
        check_plausible(
            "grid resistance",
            self.resistance_ohm,
            (0.0, 100_000.0),
            " Ω",
        )?;
        check_plausible("gauge factor", self.gauge_factor, (0.0, 200.0), "")?;
        check_plausible("strain limit", self.strain_limit, (0.0, 0.3), "")?;
        check_plausible(
            "fatigue strain limit",
            self.fatigue_strain_limit,
            (0.0, 0.3),
            "",
        )?;
        check_plausible(
            "allowed power density",
            self.max_power_density_w_m2 / 1e3,
            (0.0, 1000.0),
            " kW/m²",
        )?;
        check_plausible(
            "gauge-factor drift",
            self.gauge_factor_temp_coeff_per_c,
            (-0.01, 0.01),
            " /°C",
        )?;
        check_plausible(
            "expansion of the matched material",
            self.thermal_output.matched_cte_per_c * 1e6,
            (-50.0, 100.0),
            " ppm/°C",
        )
    }

    /// Gauge factor at `t_c` given the reference temperature.
    pub fn gauge_factor_at(&self, reference_c: f64, t_c: f64) -> f64 {
        self.gauge_factor * (1.0 + self.gauge_factor_temp_coeff_per_c * (t_c - reference_c))
    }

    /// Active grid area, m².
    pub fn grid_area_m2(&self) -> f64 {
        self.grid_length_m * self.grid_width_m
    }
}

/// A gauge placed on the part.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PlacedGauge {
    /// Short identifier shown on drawings and the build sheet, e.g. "G1".
    pub id: String,
    /// The gauge type.
    pub spec: GaugeSpec,
    /// Centre of the grid area on the part's surface.
    pub position: SurfacePoint,
    /// Reference direction, radians from the local surface x axis.
    pub angle_rad: f64,
}

impl PlacedGauge {
    /// Number of grids.
    pub fn element_count(&self) -> usize {
        self.spec.pattern.element_angles_deg().len()
    }

    /// Direction of grid `element`, radians from local x.
    pub fn element_angle_rad(&self, element: usize) -> f64 {
        let angles = self.spec.pattern.element_angles_deg();
        self.angle_rad + angles.get(element).copied().unwrap_or(0.0).to_radians()
    }

    /// Footprint of grid `element` (elements of a rosette are stacked on one centre).
    pub fn footprint(&self, element: usize) -> GridFootprint {
        GridFootprint {
            center: self.position,
            angle_rad: self.element_angle_rad(element),
            length_m: self.spec.grid_length_m,
            width_m: self.spec.grid_width_m,
        }
    }
}

/// One grid of one placed gauge: (gauge index, element index).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct GridRef {
    /// Index into the gauge list.
    pub gauge: usize,
    /// Element of that gauge.
    pub element: usize,
}
