//! Checks a project's values before anything is computed. Every message names the place
//! (part, load case, gauge, bridge) and the value.

use gw_bridge::{ArmElement, Bridge, GridRef, InstrumentSetting, PlacedGauge};
use gw_mechanics::{LoadComponent, LoadVector};

use crate::document::{BridgePlan, Part, PlanArm, Project, StockGauge};
use crate::io::PlanError;

fn invalid(path: String, message: impl Into<String>) -> PlanError {
    PlanError::Invalid {
        path,
        message: message.into(),
    }
}

/// Absolute zero, °C: no temperature of a plan lies below it.
const ABSOLUTE_ZERO_C: f64 = -273.15;

/// Checks the whole project.
pub fn validate_project(project: &Project) -> Result<(), PlanError> {
    let t_ref = project.reference_temperature_c;
    if !(t_ref.is_finite() && (ABSOLUTE_ZERO_C..=1000.0).contains(&t_ref)) {
        return Err(invalid(
            "project".into(),
            format!("reference temperature {t_ref} °C must lie between −273.15 °C and 1000 °C"),
        ));
    }
    if !(project.warn_utilisation > 0.0 && project.warn_utilisation <= 1.0) {
        return Err(invalid(
            "project".into(),
            format!(
                "warning level {} must lie between 0 and 1 (e.g. 0.8)",
                project.warn_utilisation
            ),
        ));
    }
    let f = project.zero_band_fraction;
    if !(f > 0.0 && f <= 1.0) {
        return Err(invalid(
            "project".into(),
            format!(
                "zero band fraction {f} of full scale must lie above 0 and at most 1 \
                 (e.g. 0.1 for a tenth)"
            ),
        ));
    }
    within_limit("project", "parts", project.parts.len(), LIMITS.parts)?;
    within_limit(
        "project",
        "gauge types in the stock",
        project.gauge_stock.len(),
        LIMITS.stock,
    )?;
    validate_stock(&project.gauge_stock)?;
    for part in &project.parts {
        validate_part(part, &project.gauge_stock)?;
        validate_temperatures(part, t_ref)?;
    }
    Ok(())
}

/// No load case takes the part below absolute zero, by its temperature change or its range.
pub fn validate_temperatures(part: &Part, t_ref: f64) -> Result<(), PlanError> {
    for case in &part.load_cases {
        let dt = case.value(LoadComponent::TemperatureChange);
        let lowest = (t_ref + dt)
            .min(case.temperature_range_c.0)
            .min(case.temperature_range_c.1);
        if lowest < ABSOLUTE_ZERO_C {
            return Err(invalid(
                format!("part \"{}\" › load case \"{}\"", part.name, case.name),
                format!(
                    "takes the part to {lowest:.2} °C, below absolute zero (−273.15 °C); the \
                     temperature change counts from the reference {t_ref} °C, the range is the \
                     part's own temperature"
                ),
            ));
        }
    }
    Ok(())
}

/// The largest magnitude a load component may have, in its SI unit: far beyond any part
/// (a gigatonne-force, ten gigapascals, a thousand degrees), so that a value above it is a typo.
fn plausible_load(c: LoadComponent) -> f64 {
    use LoadComponent::*;
    match c {
        InternalPressure | ExternalPressure | RemoteStressX | RemoteStressY | RemoteShearXY => 1e10,
        TemperatureChange => 1000.0,
        GivenStateFactor => 1e6,
        _ => 1e10,
    }
}

/// How much one project may ask of the tool: far above any real plan, low enough that a file
/// cannot make it work for minutes or allocate without bound.
pub struct Limits {
    /// Parts in a project.
    pub parts: usize,
    /// Gauge types in the stock.
    pub stock: usize,
    /// Load cases of a part.
    pub load_cases: usize,
    /// Gauges on a part.
    pub gauges: usize,
    /// Bridges of a part.
    pub bridges: usize,
    /// Monte Carlo trials of an uncertainty budget.
    pub monte_carlo_trials: usize,
}

/// The limits every project is checked against.
pub const LIMITS: Limits = Limits {
    parts: 100,
    stock: 200,
    load_cases: 100,
    gauges: 500,
    bridges: 100,
    monte_carlo_trials: 1_000_000,
};

fn within_limit(at: &str, what: &str, n: usize, limit: usize) -> Result<(), PlanError> {
    if n > limit {
        return Err(invalid(
            at.to_owned(),
            format!("{n} {what} is more than the {limit} a project may hold; split the plan"),
        ));
    }
    Ok(())
}

/// How well the installation is known: each a standard uncertainty that is a number, not
/// negative and plausible (a misalignment of more than 30° or a position known only to 50 mm
/// is a typo, not a plan), and a trial count the machine can run.
fn validate_tolerances(
    here: &str,
    t: &gw_bridge::bridge_uncertainty::InstallationTolerances,
) -> Result<(), PlanError> {
    let at = format!("{here} › how well the installation is known");
    let checks = [
        ("misalignment", t.misalignment_rad.to_degrees(), 30.0, "°"),
        ("position", t.position_m * 1e3, 50.0, " mm"),
        (
            "transverse sensitivity",
            t.transverse_sensitivity * 100.0,
            20.0,
            " %",
        ),
        (
            "lead resistance",
            t.lead_resistance_fraction * 100.0,
            100.0,
            " %",
        ),
        ("temperature", t.temperature_c, 100.0, " °C"),
    ];
    for (name, v, max, unit) in checks {
        if !(v.is_finite() && (0.0..=max).contains(&v)) {
            return Err(invalid(
                at.clone(),
                format!("{name} {v}{unit} must lie between 0 and {max}{unit}"),
            ));
        }
    }
    let trials = t.monte_carlo_trials;
    if !(1000..=LIMITS.monte_carlo_trials).contains(&trials) {
        return Err(invalid(
            at,
            format!(
                "Monte Carlo trials {trials} must lie between 1000 and {} (JCGM 101 asks for \
                 enough trials for a stable interval; more only takes longer)",
                LIMITS.monte_carlo_trials
            ),
        ));
    }
    Ok(())
}

/// Checks the gauge stock: names present and distinct, data valid.
pub fn validate_stock(stock: &[StockGauge]) -> Result<(), PlanError> {
    for (k, entry) in stock.iter().enumerate() {
        let at = format!("gauge stock › \"{}\"", entry.name);
        if entry.name.trim().is_empty() {
            return Err(invalid(
                format!("gauge stock › entry {}", k + 1),
                "a stock type has no name; give it one, e.g. \"3 mm single grid, 350 Ω\"",
            ));
        }
        if stock[..k].iter().any(|s| s.name == entry.name) {
            return Err(invalid(
                at,
                "this name is used twice; give each stock type its own",
            ));
        }
        entry
            .spec
            .validate()
            .map_err(|e| invalid(at.clone(), e.to_string()))?;
    }
    Ok(())
}

/// Checks one part against the project's gauge stock.
pub fn validate_part(part: &Part, stock: &[StockGauge]) -> Result<(), PlanError> {
    let here = format!("part \"{}\"", part.name);
    part.member
        .validate()
        .map_err(|e| invalid(here.clone(), e.to_string()))?;
    if !(part.required_resolution_strain.is_finite() && part.required_resolution_strain > 0.0) {
        return Err(invalid(
            here.clone(),
            format!(
                "required resolution {} must be a positive strain (e.g. 1e-6 for 1 µε)",
                part.required_resolution_strain
            ),
        ));
    }
    within_limit(
        &here,
        "load cases",
        part.load_cases.len(),
        LIMITS.load_cases,
    )?;
    within_limit(&here, "gauges", part.gauges.len(), LIMITS.gauges)?;
    within_limit(&here, "bridges", part.bridges.len(), LIMITS.bridges)?;
    validate_tolerances(&here, &part.tolerances)?;
    let (dx, ds) = part.datum_m;
    if !(dx.is_finite() && ds.is_finite() && dx.abs() <= 1000.0 && ds.abs() <= 1000.0) {
        return Err(invalid(
            here.clone(),
            "the datum is not a number or lies more than a kilometre off; give its x and s in \
             millimetres on the part",
        ));
    }
    validate_load_cases(part, &here)?;
    validate_gauges(part, stock, &here)?;
    validate_bridges(part, stock, &here)
}

/// Each load case: loads that are numbers, plausible, carried by the model and listed once; a
/// temperature range from low to high; a ramp of 1 to 1000 steps.
fn validate_load_cases(part: &Part, here: &str) -> Result<(), PlanError> {
    let carried = part.member.components();
    for case in &part.load_cases {
        let at = format!("{here} › load case \"{}\"", case.name);
        for (k, (c, v)) in case.loads.iter().enumerate() {
            if case.loads[..k].iter().any(|(d, _)| d == c) {
                return Err(invalid(
                    at.clone(),
                    format!("{} is listed twice; keep one value", c.name()),
                ));
            }
            if !v.is_finite() {
                return Err(invalid(at.clone(), format!("{} is not a number", c.name())));
            }
            let limit = plausible_load(*c);
            if v.abs() > limit {
                return Err(invalid(
                    at.clone(),
                    format!(
                        "{} of {v} {} is not plausible (more than {limit:e} {}); check the unit",
                        c.name(),
                        c.unit(),
                        c.unit()
                    ),
                ));
            }
            if !carried.contains(c) {
                let names: Vec<&str> = carried.iter().map(|c| c.name()).collect();
                return Err(invalid(
                    at.clone(),
                    format!(
                        "a {} carries no {}; use one of: {}",
                        part.member.kind_name(),
                        c.name(),
                        names.join(", ")
                    ),
                ));
            }
        }
        let (lo, hi) = case.temperature_range_c;
        if !(lo.is_finite() && hi.is_finite() && lo <= hi && lo >= -1000.0 && hi <= 1000.0) {
            return Err(invalid(
                at,
                format!(
                    "part temperature range {lo} to {hi} °C must run from low to high, within \
                     −1000 to 1000 °C"
                ),
            ));
        }
        if case.ramp_steps == 0 || case.ramp_steps > 1000 {
            return Err(invalid(
                format!("{here} › load case \"{}\"", case.name),
                format!("ramp steps {} must lie between 1 and 1000", case.ramp_steps),
            ));
        }
    }
    Ok(())
}

/// Each gauge: an id of its own, a stock type that exists, valid lot values, a place on the
/// part and a plausible angle.
fn validate_gauges(part: &Part, stock: &[StockGauge], here: &str) -> Result<(), PlanError> {
    let mut ids: Vec<&str> = Vec::new();
    for gauge in &part.gauges {
        let at = format!("{here} › gauge \"{}\"", gauge.id);
        if gauge.id.trim().is_empty() {
            return Err(invalid(
                here.to_owned(),
                "a gauge has no identifier; give every gauge a short id such as G1",
            ));
        }
        if ids.contains(&gauge.id.as_str()) {
            return Err(invalid(
                at,
                "this identifier is used twice; give each gauge its own",
            ));
        }
        ids.push(&gauge.id);
        let Some(placed) = gauge.resolve(stock) else {
            let names: Vec<&str> = stock.iter().map(|s| s.name.as_str()).collect();
            return Err(invalid(
                at,
                format!(
                    "refers to stock type \"{}\", which the project's gauge stock does not hold; \
                     pick one of: {}",
                    gauge.stock,
                    if names.is_empty() {
                        "(the stock is empty; add a type)".to_owned()
                    } else {
                        names.join(", ")
                    }
                ),
            ));
        };
        placed
            .spec
            .validate()
            .map_err(|e| invalid(format!("{at} › lot values"), e.to_string()))?;
        // Where the results of an imported part are not read, its gauges cannot be placed on
        // them: the evaluation says so at the part, and the file stays editable.
        if crate::imported_part::is_ready(&part.member) {
            part.member
                .state(&gauge.position, &LoadVector::ZERO)
                .map_err(|e| invalid(at.clone(), e.to_string()))?;
        }
        let degrees = gauge.angle_rad.to_degrees();
        if !(degrees.is_finite() && degrees.abs() <= 360.0) {
            return Err(invalid(
                at,
                format!("angle {degrees}° is not plausible: enter an angle between −360° and 360°"),
            ));
        }
    }
    Ok(())
}

/// Each bridge: its arms resolve, its settings (and its circuit when wired) are valid, a typed
/// bridge factor and a required accuracy are positive, and the part carries its wanted load.
fn validate_bridges(part: &Part, stock: &[StockGauge], here: &str) -> Result<(), PlanError> {
    let carried = part.member.components();
    let gauges = crate::document::placed_gauges(stock, part);
    for plan in &part.bridges {
        let bridge = bridge_from_plan(part, &gauges, plan)?;
        // A bridge with no grid yet is a plan in progress: its settings are checked, and the
        // evaluation reports it as not wired.
        let checked = if bridge.is_wired() {
            bridge.validate(&gauges)
        } else {
            bridge.validate_settings()
        };
        checked
            .map_err(|e| invalid(format!("{here} › bridge \"{}\"", plan.name), e.to_string()))?;
        if let Some(o) = &plan.bridge_factor_override {
            let at = format!("{here} › bridge \"{}\" › bridge factor", plan.name);
            if !(o.value.is_finite() && o.value > 0.0) {
                return Err(invalid(
                    at,
                    format!(
                        "{} must be a positive number (e.g. 2 for two active grids)",
                        o.value
                    ),
                ));
            }
            // An empty reason is allowed while the engineer types it; the evaluation asks
            // for it as a finding.
        }
        if let Some(a) = plan.required_accuracy
            && !(a.amount().is_finite() && a.amount() > 0.0)
        {
            return Err(invalid(
                format!("{here} › bridge \"{}\" › required accuracy", plan.name),
                format!(
                    "{} must be a positive number (e.g. 1 for ±1 % of reading); clear it to state none",
                    a.amount()
                ),
            ));
        }
        if !carried.contains(&plan.wanted) {
            return Err(invalid(
                format!("{here} › bridge \"{}\"", plan.name),
                format!(
                    "measures {}, which a {} does not carry",
                    plan.wanted.name(),
                    part.member.kind_name()
                ),
            ));
        }
    }
    Ok(())
}

/// Resolves gauge ids into indices of `gauges` (the part's resolved gauges): the bridge as the
/// measurement core sees it, with a bridge factor of 1 (see [`bridge_with_factor`]).
pub fn bridge_from_plan(
    part: &Part,
    gauges: &[PlacedGauge],
    plan: &BridgePlan,
) -> Result<Bridge, PlanError> {
    let here = format!("part \"{}\" › bridge \"{}\"", part.name, plan.name);
    let resolve = |k: usize, gauge: &str, grid: usize| -> Result<GridRef, PlanError> {
        let Some(index) = gauges.iter().position(|g| g.id == gauge) else {
            return Err(invalid(
                here.clone(),
                format!(
                    "arm {} refers to gauge \"{gauge}\", which is not on this part",
                    k + 1
                ),
            ));
        };
        if grid == 0 || grid > gauges[index].element_count() {
            return Err(invalid(
                here.clone(),
                format!(
                    "arm {} refers to grid {grid} of gauge \"{gauge}\", which has {} grid(s)",
                    k + 1,
                    gauges[index].element_count()
                ),
            ));
        }
        Ok(GridRef {
            gauge: index,
            element: grid - 1,
        })
    };
    let mut bridge = bridge_settings(plan);
    for (k, arm) in plan.arms.iter().enumerate() {
        bridge.arms[k] = match arm {
            PlanArm::Grid { gauge, grid } => ArmElement::Grid(resolve(k, gauge, *grid)?),
            PlanArm::Dummy { gauge, grid } => ArmElement::Dummy(resolve(k, gauge, *grid)?),
            PlanArm::Completion(c) => ArmElement::Completion(*c),
        };
    }
    Ok(bridge)
}

/// The bridge's settings (wiring, leads, excitation, instrument, channel, shunt) with
/// completion resistors in every arm: what a search fills with grids.
pub fn bridge_settings(plan: &BridgePlan) -> Bridge {
    Bridge {
        name: plan.name.clone(),
        arms: [ArmElement::Completion(gw_bridge::CompletionResistor {
            ohm: 350.0,
            tolerance: 0.0,
            tcr_per_c: 0.0,
        }); 4],
        wiring: plan.wiring,
        lead: plan.lead,
        excitation: plan.excitation,
        amplifier_input_ohm: plan.amplifier_input_ohm,
        instrument: InstrumentSetting {
            gauge_factor: plan.gauge_factor_setting,
            bridge_factor: 1.0,
        },
        signal: plan.signal,
        wanted: plan.wanted,
        instrument_temperature: plan.instrument_temperature,
        shunt: plan.shunt,
    }
}

/// The bridge with the bridge factor the instrument is set to: the engineer's override, or
/// the one computed from the arrangement and the part
/// ([`crate::arrangements::bridge_factor_for`]).
pub fn bridge_with_factor(
    part: &Part,
    gauges: &[PlacedGauge],
    plan: &BridgePlan,
    reference_temperature_c: f64,
) -> Result<Bridge, PlanError> {
    let mut bridge = bridge_from_plan(part, gauges, plan)?;
    bridge.instrument.bridge_factor = match &plan.bridge_factor_override {
        Some(o) => o.value,
        None => {
            crate::arrangements::bridge_factor_of(part, gauges, &bridge, reference_temperature_c)
        }
    };
    Ok(bridge)
}

/// The largest magnitude of each component over a part's load cases (for rejection ratios).
pub fn expected_magnitudes(part: &Part) -> Vec<(LoadComponent, f64)> {
    let mut out: Vec<(LoadComponent, f64)> = Vec::new();
    for case in &part.load_cases {
        for (c, v) in &case.loads {
            match out.iter_mut().find(|(k, _)| k == c) {
                Some(entry) => entry.1 = entry.1.max(v.abs()),
                None => out.push((*c, v.abs())),
            }
        }
    }
    out
}
