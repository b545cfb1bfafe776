//! Accuracy as a margin: what a bridge's reading, converted to its wanted load, is predicted to
//! be off by in each load case, against the accuracy the engineer requires of it.
//!
//! The reading is converted as an engineer reduces test data from the plan: the displayed
//! strain over the part's strain per unit of the wanted load (the bridge's target, combined by
//! arm sign and divided by the bridge factor). What that differs from the applied load is the
//! error breakdown of the reading — unwanted loads the arrangement leaks, temperature, leads
//! and amplifier loading, and the rest (grid averaging, transverse sensitivity, gauge factor
//! setting, nonlinearity) — to which the expanded uncertainty at that case is added.

use gw_bridge::bridge_uncertainty::{BridgeUncertainty, bridge_uncertainty};
use gw_bridge::margins::{Margin, MarginKind};
use gw_bridge::signal_chain::ChannelFigures;
use gw_bridge::{BridgeError, BridgeModel};
use gw_mechanics::{LoadComponent, LoadVector, QuadratureOrder};
use serde::Serialize;

use crate::document::{LoadCase, Part, RequiredAccuracy};
use crate::marked::{Rounding, mark, mark_rounded, render};
use crate::units::{Quantity, Units};

/// The accuracy check of one load case, every figure in the wanted load's SI unit.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct AccuracyCheck {
    /// Load case name.
    pub case: String,
    /// The wanted load the case applies.
    pub applied: f64,
    /// What the reading converts to.
    pub inferred: f64,
    /// Share of inferred − applied from unwanted loads.
    pub leakage: f64,
    /// Share from temperature (thermal output, gauge-factor drift, completion drift).
    pub temperature: f64,
    /// Share from lead resistance, amplifier loading and excitation regulation.
    pub leads: f64,
    /// Share from the gauges and the bridge themselves: grid averaging, transverse
    /// sensitivity, gauge factor setting and nonlinearity ("gauge effects").
    pub other: f64,
    /// Expanded uncertainty at this case (0 when no budget could be formed).
    pub expanded_uncertainty: f64,
    /// How the coverage factor was chosen ("k = 1.96 (…)"), empty without a budget.
    pub coverage: String,
    /// What the engineer asked for.
    pub required: RequiredAccuracy,
    /// The error allowed.
    pub allowed: f64,
    /// Predicted error against allowed.
    pub margin: Margin,
}

impl AccuracyCheck {
    /// What to do about a miss, by what dominates it: the uncertainty, or the known errors.
    pub fn advice(&self) -> &'static str {
        if self.expanded_uncertainty >= (self.inferred - self.applied).abs() {
            "most of it is uncertainty: its budget names the largest input (often the lot's \
             gauge-factor tolerance, which a calibration of the bridge removes), or relax the \
             requirement"
        } else {
            "most of it is known error: choose an arrangement that cancels what leaks, shorten or \
             compensate the leads, or relax the requirement"
        }
    }

    /// |inferred − applied| + expanded uncertainty.
    pub fn predicted(&self) -> f64 {
        (self.inferred - self.applied).abs() + self.expanded_uncertainty
    }

    /// One line: the prediction by cause against the requirement, in the wanted load's
    /// display unit (`wanted` is the component the bridge measures).
    pub fn describe(&self, wanted: LoadComponent, units: Units) -> String {
        render(&self.describe_marked(wanted), units)
    }

    /// [`AccuracyCheck::describe`] with its figures marked for either unit system.
    pub fn describe_marked(&self, wanted: LoadComponent) -> String {
        let q = Quantity::of(wanted);
        let size = |v: f64| mark_rounded(q, v, Rounding::Difference);
        let load = |v: f64| mark(q, v);
        let asked = match self.required {
            RequiredAccuracy::PercentOfReading(p) => {
                format!(" ({p} % of {})", load(self.applied.abs()))
            }
            RequiredAccuracy::InMeasuredUnit(_) => String::new(),
        };
        let mut parts = Vec::new();
        // Below a millionth of the load a share is rounding, not a cause.
        let negligible = 1e-6 * self.applied.abs().max(self.allowed);
        for (name, v) in [
            ("leakage", self.leakage),
            ("temperature", self.temperature),
            ("leads", self.leads),
            ("gauge effects", self.other),
        ] {
            if v.abs() > negligible {
                parts.push(format!("{name} {}", size(v)));
            }
        }
        let mut line = format!(
            "predicted error ±{} against the required ±{}{asked}: reads {} for {}",
            size(self.predicted()),
            size(self.allowed),
            load(self.inferred),
            load(self.applied),
        );
        if !parts.is_empty() {
            line += &format!(" ({})", parts.join(", "));
        }
        if self.expanded_uncertainty > 0.0 {
            line += &format!(
                ", uncertainty ±{} with {}",
                size(self.expanded_uncertainty),
                self.coverage
            );
        }
        line
    }
}

/// How the expanded uncertainty of each case is found: not at all (an evaluation without
/// budgets), or by a GUM budget per case, reusing the one already formed at `known`'s case.
#[derive(Clone, Copy)]
pub enum Budgets<'a> {
    /// No uncertainty: the check stands on the error breakdown alone.
    Off,
    /// A GUM budget per case; the named case's budget is given.
    PerCase {
        /// A budget already formed, and the case it belongs to.
        known: Option<(&'a BridgeUncertainty, &'a str)>,
    },
}

/// The accuracy checks of a bridge with a required accuracy, one per load case it applies to
/// (a percentage of reading applies where the case applies the wanted load; an amount in the
/// unit applies in every case). Empty when no accuracy is required.
pub fn accuracy_checks(
    part: &Part,
    required: Option<RequiredAccuracy>,
    model: &BridgeModel,
    channel: &ChannelFigures,
    warn_at: f64,
    budgets: Budgets<'_>,
) -> Result<Vec<AccuracyCheck>, BridgeError> {
    let Some(required) = required else {
        return Ok(Vec::new());
    };
    let wanted = model.bridge().wanted;
    let per_unit = model.reading(&LoadVector::unit(wanted))?.target_strain;
    if per_unit == 0.0 || !per_unit.is_finite() {
        // A bridge that does not respond is a failure reported on its own.
        return Ok(Vec::new());
    }
    let mut out = Vec::new();
    for case in &part.load_cases {
        let applied = case.value(wanted);
        if applied == 0.0 && matches!(required, RequiredAccuracy::PercentOfReading(_)) {
            continue;
        }
        let budget = match budgets {
            Budgets::Off => Budget::None,
            Budgets::PerCase {
                known: Some((u, name)),
            } if name == case.name => Budget::Known(u),
            Budgets::PerCase { .. } => Budget::Form,
        };
        out.push(one_case(
            part, case, required, model, channel, per_unit, warn_at, budget,
        )?);
    }
    Ok(out)
}

/// The budget of one case: none, one already formed, or one to form.
enum Budget<'a> {
    None,
    Known(&'a BridgeUncertainty),
    Form,
}

#[allow(clippy::too_many_arguments)]
fn one_case(
    part: &Part,
    case: &LoadCase,
    required: RequiredAccuracy,
    model: &BridgeModel,
    channel: &ChannelFigures,
    per_unit: f64,
    warn_at: f64,
    budget: Budget<'_>,
) -> Result<AccuracyCheck, BridgeError> {
    let wanted = model.bridge().wanted;
    let loads = case.load_vector();
    let reading = model.reading(&loads)?;
    let e = reading.error;
    let applied = case.value(wanted);
    let in_units = |strain: f64| strain / per_unit;
    let mut tol = part.tolerances;
    tol.monte_carlo_trials = 0;
    let mut l = loads;
    l[LoadComponent::TemperatureChange] = case.value(LoadComponent::TemperatureChange);
    // A budget needs a reading to divide by; without one the check stands on the error alone.
    let formed = match budget {
        Budget::Form if applied != 0.0 => bridge_uncertainty(
            &part.member,
            model,
            &l,
            channel,
            &tol,
            QuadratureOrder::default(),
        )
        .ok(),
        _ => None,
    };
    let used = match budget {
        Budget::Known(u) => Some(u),
        _ => formed.as_ref(),
    };
    let (expanded_uncertainty, coverage) = used
        .map(|u| (u.gum.expanded, u.gum.coverage_text()))
        .unwrap_or((0.0, String::new()));
    let allowed = required.allowed(applied);
    let mut check = AccuracyCheck {
        case: case.name.clone(),
        applied,
        inferred: in_units(reading.displayed_strain),
        leakage: in_units(e.leakage),
        temperature: in_units(e.temperature),
        leads: in_units(e.leads_and_loading),
        other: in_units(
            e.grid_averaging + e.transverse_sensitivity + e.gauge_factor_setting + e.nonlinearity,
        ),
        expanded_uncertainty,
        coverage,
        required,
        allowed,
        margin: Margin::new(MarginKind::Accuracy, 0.0, allowed, warn_at),
    };
    check.margin = Margin::new(MarginKind::Accuracy, check.predicted(), allowed, warn_at);
    Ok(check)
}
