//! One function evaluates a whole plan into one result structure. The app, the command line
//! and the build sheet read only this.

use gw_bridge::bridge_uncertainty::{BridgeUncertainty, bridge_uncertainty};
use gw_bridge::margins::{Margin, MarginKind, MarginStatus};
use gw_bridge::multi_axis::{MultiAxis, multi_axis};
use gw_bridge::shunt::{ShuntCalibration, shunt_calibration};
use gw_bridge::signal_chain::{ChannelFigures, adc_volts, channel_figures};
use gw_bridge::temperature::ThermalPoint;
use gw_bridge::zero_band::{ZeroBand, ZeroBandLimit, zero_band_of_model};
use gw_bridge::{ArmElement, BridgeModel, Reading, Setup};
use gw_mechanics::{LoadComponent, LoadVector, QuadratureOrder};
use serde::Serialize;

use crate::cautions::{Caution, cautions};
use crate::document::{Part, Project};
use crate::validate::{bridge_from_plan, bridge_with_factor, expected_magnitudes, validate_part};

/// How much to compute. Default: everything but Monte Carlo.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum UncertaintyDepth {
    /// No uncertainty budget.
    Off,
    /// GUM linear propagation only.
    Gum,
    /// GUM and Monte Carlo (slow: thousands of circuit solutions per bridge).
    GumAndMonteCarlo,
}

/// Evaluation options.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct EvalOptions {
    /// Uncertainty depth.
    pub uncertainty: UncertaintyDepth,
    /// Monte Carlo trials when enabled (overrides the part's setting if > 0).
    pub monte_carlo_trials: usize,
    /// Grid-averaging quadrature.
    pub quadrature: QuadratureOrder,
    /// Samples per face side for the part's peak stress.
    pub peak_samples: usize,
    /// Points of the temperature sweep.
    pub temperature_steps: usize,
}

impl Default for EvalOptions {
    fn default() -> Self {
        Self {
            uncertainty: UncertaintyDepth::Gum,
            monte_carlo_trials: 0,
            quadrature: QuadratureOrder::default(),
            peak_samples: 24,
            temperature_steps: 60,
        }
    }
}

/// How serious a finding is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Serialize)]
pub enum Severity {
    /// Something could not be computed.
    Error,
    /// A margin fails.
    Fail,
    /// A margin is close to its limit, or a model is near the edge of its validity.
    Warn,
}

/// What a finding is about, so the app can select it.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum Target {
    /// A part (index).
    Part { part: usize },
    /// A load case of a part.
    LoadCase { part: usize, case: usize },
    /// A gauge of a part.
    Gauge { part: usize, gauge: usize },
    /// A bridge of a part.
    Bridge { part: usize, bridge: usize },
}

/// One validation problem or failed margin.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Finding {
    /// Severity.
    pub severity: Severity,
    /// Plain message with the numbers, in SI.
    pub message: String,
    /// What it is about.
    pub target: Target,
    /// The message with its quantities marked for either unit system ([`crate::marked`]);
    /// empty when it holds none.
    #[serde(skip)]
    pub marked: String,
}

impl Finding {
    /// A finding whose message holds marked quantities.
    pub fn marked(severity: Severity, marked: String, target: Target) -> Finding {
        Finding {
            severity,
            message: crate::marked::render(&marked, crate::units::Units::Si),
            target,
            marked,
        }
    }

    /// The message in a unit system.
    pub fn text(&self, units: crate::units::Units) -> String {
        if self.marked.is_empty() {
            self.message.clone()
        } else {
            crate::marked::render(&self.marked, units)
        }
    }
}

/// A point of the output-versus-load plot.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RampPoint {
    /// Fraction of the full load case.
    pub fraction: f64,
    /// Value of the wanted component at this point (SI).
    pub wanted_value: f64,
    /// Displayed strain from the exact circuit, m/m.
    pub displayed_strain: f64,
    /// The straight line through zero and the full-load reading, m/m.
    pub linear_strain: f64,
}

/// One bridge at one load case.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct BridgeCase {
    /// Load case name.
    pub case: String,
    /// The reading.
    pub reading: Reading,
    /// Voltage at the ADC including the zero offset, V.
    pub adc_v: f64,
    /// Margins.
    pub margins: Vec<Margin>,
    /// Output against load over the ramp.
    pub ramp: Vec<RampPoint>,
    /// The share of the displayed strain the case's temperature change causes (thermal
    /// output, drifts, leads warming with the part): the reading less the same loads at the
    /// reference temperature, m/m.
    pub from_temperature_strain: f64,
}

/// Response of a bridge to one unit of one load component.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Sensitivity {
    /// Component.
    pub component: LoadComponent,
    /// Displayed strain per unit (SI unit of the component).
    pub displayed_per_unit: f64,
    /// Output per unit, mV/V.
    pub mv_per_v_per_unit: f64,
}

/// How much of an unwanted component reaches the reading.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Rejection {
    /// Unwanted component.
    pub component: LoadComponent,
    /// Its expected magnitude (largest over the load cases), SI.
    pub expected: f64,
    /// Its output at that magnitude over the wanted output at the wanted magnitude (listed only
    /// where the wanted load has a full scale).
    pub leakage_fraction: f64,
    /// 20 log10(1 / leakage), dB (capped at 200 dB for exact cancellation).
    pub rejection_db: f64,
}

/// Everything computed for one bridge.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct BridgeEvaluation {
    /// Bridge name.
    pub name: String,
    /// Arrangement name.
    pub arrangement: String,
    /// Wanted component.
    pub wanted: LoadComponent,
    /// Acquisition channel number.
    pub channel_number: u32,
    /// Set excitation as a bridge voltage, V.
    pub excitation_v: f64,
    /// Gauge factor set on the instrument.
    pub gauge_factor_setting: f64,
    /// Bridge factor set on the instrument.
    pub bridge_factor: f64,
    /// Lead wiring, in words.
    pub wiring: String,
    /// Per load case.
    pub cases: Vec<BridgeCase>,
    /// Per unit of each component the part carries.
    pub sensitivities: Vec<Sensitivity>,
    /// Rejection of each unwanted component.
    pub rejection: Vec<Rejection>,
    /// Apparent strain against temperature (range of the first load case).
    pub temperature: Vec<ThermalPoint>,
    /// Signal-chain figures.
    pub channel: ChannelFigures,
    /// Shunt calibration.
    pub shunt: Option<ShuntCalibration>,
    /// Uncertainty at the load case with the largest wanted load.
    pub uncertainty: Option<BridgeUncertainty>,
    /// Load case the uncertainty refers to.
    pub uncertainty_case: Option<String>,
    /// The reading against the required accuracy, per load case (empty when none is stated).
    pub accuracy: Vec<crate::accuracy::AccuracyCheck>,
    /// The zero reading expected at no load and its spread from the arms' resistance
    /// tolerances (statistical and worst case), judged against the full scale.
    pub zero_band: ZeroBand,
    /// The wanted load per mV/V of output (N per mV/V, N·m per mV/V, …) from the bridge's
    /// sensitivity at zero load; `None` (left out of the JSON) when the bridge does not
    /// respond to it.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub wanted_per_mv_per_v: Option<f64>,
    /// Expected resistance between connector pins (with leads), Ω.
    pub pin_resistances: Vec<(String, f64)>,
    /// The in-place calibration that replaces the predicted sensitivity in the channel list,
    /// when the plan holds one.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub calibration: Option<crate::installation::InPlaceCalibration>,
}

impl BridgeEvaluation {
    /// The wanted load per mV/V the channel list gives: the in-place calibration's when there
    /// is one, else the predicted one.
    pub fn channel_load_per_mv_per_v(&self) -> Option<f64> {
        match &self.calibration {
            Some(c) => Some(c.load_per_mv_per_v),
            None => self.wanted_per_mv_per_v,
        }
    }
}

/// A load case's part-level figures.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct CaseFigures {
    /// Load case name.
    pub case: String,
    /// Largest von Mises stress in the part, Pa.
    pub peak_von_mises_pa: f64,
    /// Where the largest stress is, in words (a face point, or the bore of a vessel), in SI.
    pub peak_location: String,
    /// The same with its lengths marked for either unit system ([`crate::marked`]).
    #[serde(skip)]
    pub peak_location_marked: String,
    /// Yield strength over the peak stress (`None` when the case leaves the part unstressed).
    pub safety_factor_to_yield: Option<f64>,
    /// Thin-walled vessels: the hoop stress at the mean radius (membrane, the design figure),
    /// Pa.
    pub membrane_hoop_pa: Option<f64>,
    /// Thin-walled vessels: the hoop stress on the outer surface, where the gauges sit, Pa.
    pub outer_hoop_pa: Option<f64>,
}

impl CaseFigures {
    /// Where the largest stress is, in a unit system.
    pub fn peak_location_text(&self, units: crate::units::Units) -> String {
        crate::marked::render(&self.peak_location_marked, units)
    }

    /// "2.32 × below yield", or that the case leaves the part unstressed.
    pub fn yield_words(&self) -> String {
        match self.safety_factor_to_yield {
            Some(f) => format!("{f:.2} × below yield"),
            None => "no stress from this case".to_owned(),
        }
    }
}

/// Everything computed for one part.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PartEvaluation {
    /// Index of the part in the project.
    pub part_index: usize,
    /// Part name.
    pub name: String,
    /// Member kind.
    pub kind: String,
    /// Per load case.
    pub cases: Vec<CaseFigures>,
    /// Bridges that could be evaluated (others appear as findings).
    pub bridges: Vec<BridgeEvaluation>,
    /// Index in the part's bridge list of each evaluated bridge.
    pub bridge_indices: Vec<usize>,
    /// Multi-bridge analysis when the part has two or more bridges.
    pub multi_axis: Option<MultiAxis>,
}

/// The whole plan evaluated.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Evaluation {
    /// Project name.
    pub project: String,
    /// Parts.
    pub parts: Vec<PartEvaluation>,
    /// Problems and failed or close margins, most serious first.
    pub findings: Vec<Finding>,
    /// Cautions that apply to this plan.
    pub cautions: Vec<Caution>,
}

impl Evaluation {
    /// True when any margin fails or anything could not be computed.
    pub fn has_failures(&self) -> bool {
        self.findings
            .iter()
            .any(|f| matches!(f.severity, Severity::Fail | Severity::Error))
    }
}

/// Evaluates the whole project. Never panics on bad data: what cannot be computed becomes a
/// finding and the rest is still evaluated.
pub fn evaluate(project: &Project, options: &EvalOptions) -> Evaluation {
    let mut findings = Vec::new();
    let mut parts = Vec::new();
    for (pi, part) in project.parts.iter().enumerate() {
        let checked = validate_part(part, &project.gauge_stock)
            .and_then(|()| {
                crate::validate::validate_temperatures(part, project.reference_temperature_c)
            })
            .and_then(|()| crate::imported_part::readiness(part));
        if let Err(e) = checked {
            findings.push(Finding {
                severity: Severity::Error,
                message: e.to_string(),
                target: Target::Part { part: pi },
                marked: String::new(),
            });
            continue;
        }
        parts.push(evaluate_part(project, pi, part, options, &mut findings));
    }
    findings.extend(crate::conflicts::bridge_conflicts(project));
    findings.sort_by_key(|f| f.severity);
    let ev = Evaluation {
        project: project.name.clone(),
        parts,
        findings,
        cautions: cautions(project),
    };
    // Every figure that can reach a screen or a sheet is a number.
    debug_assert!(
        crate::finite::first_non_finite(&ev).is_none(),
        "a figure of the evaluation is not finite: {:?}",
        crate::finite::first_non_finite(&ev)
    );
    ev
}

fn evaluate_part(
    project: &Project,
    pi: usize,
    part: &Part,
    options: &EvalOptions,
    findings: &mut Vec<Finding>,
) -> PartEvaluation {
    let member = &part.member;
    for w in member.warnings() {
        findings.push(Finding {
            severity: Severity::Warn,
            message: format!("part \"{}\": {w}", part.name),
            target: Target::Part { part: pi },
            marked: String::new(),
        });
    }
    let cases = case_figures(project, pi, part, options, findings);
    let gauges = project.placed_gauges(part);
    curve_range_findings(pi, part, &gauges, findings);
    crate::placement::placement_findings(pi, part, &gauges, options.quadrature, findings);
    let setup = Setup {
        member,
        gauges: &gauges,
        reference_temperature_c: project.reference_temperature_c,
        quadrature: options.quadrature,
    };
    let expected = expected_magnitudes(part);
    let mut bridges = Vec::new();
    let mut bridge_indices = Vec::new();
    let mut models = Vec::new();
    for (bi, plan) in part.bridges.iter().enumerate() {
        let target = Target::Bridge {
            part: pi,
            bridge: bi,
        };
        if !bridge_plan_findings(part, plan, target, findings) {
            continue;
        }
        let result = model_of(part, &gauges, plan, &setup).and_then(|model| {
            evaluate_bridge(project, part, &model, &expected, options, pi, bi, findings)
                .map(|ev| (ev, model))
                .map_err(|e| e.to_string())
        });
        match result {
            Ok((ev, model)) => {
                bridges.push(ev);
                bridge_indices.push(bi);
                if plan.recovery == crate::document::LoadRecovery::Included {
                    models.push(model);
                }
            }
            Err(message) => findings.push(Finding {
                severity: Severity::Error,
                message: format!(
                    "part \"{}\", bridge \"{}\": {message}",
                    part.name, plan.name
                ),
                target,
                marked: String::new(),
            }),
        }
    }
    PartEvaluation {
        part_index: pi,
        name: part.name.clone(),
        kind: member.kind_name().to_owned(),
        cases,
        bridges,
        bridge_indices,
        multi_axis: multi_axis_of(&models, part, pi, findings),
    }
}

/// The largest stress of each load case against yield, its margin added to the findings.
fn case_figures(
    project: &Project,
    pi: usize,
    part: &Part,
    options: &EvalOptions,
    findings: &mut Vec<Finding>,
) -> Vec<CaseFigures> {
    let member = &part.member;
    let material = member.material();
    let mut cases = Vec::new();
    for (ci, case) in part.load_cases.iter().enumerate() {
        let loads = case.load_vector();
        match member.peak_von_mises(&loads, options.peak_samples) {
            Ok((peak, at)) => {
                let m = Margin::new(
                    MarginKind::PeakStressInPart,
                    peak,
                    material.yield_strength_pa,
                    project.warn_utilisation,
                );
                push_margin(
                    findings,
                    &m,
                    format!(
                        "part \"{}\", {} (peak {})",
                        part.name,
                        case.name,
                        peak_marked(&at)
                    ),
                    Target::LoadCase { part: pi, case: ci },
                );
                let hoop = member.vessel_hoop_stresses(&loads);
                cases.push(CaseFigures {
                    case: case.name.clone(),
                    peak_von_mises_pa: peak,
                    peak_location: crate::marked::render(
                        &peak_marked(&at),
                        crate::units::Units::Si,
                    ),
                    peak_location_marked: peak_marked(&at),
                    safety_factor_to_yield: (peak > 0.0).then(|| m.safety_factor()),
                    membrane_hoop_pa: hoop.map(|h| h.0),
                    outer_hoop_pa: hoop.map(|h| h.1),
                });
            }
            Err(e) => findings.push(Finding {
                severity: Severity::Error,
                message: format!("part \"{}\", {}: {e}", part.name, case.name),
                target: Target::LoadCase { part: pi, case: ci },
                marked: String::new(),
            }),
        }
    }
    cases
}

/// Warnings about a bridge's plan itself (a typed bridge factor without a reason, no grid
/// wired); false when the bridge is not wired and cannot be evaluated.
fn bridge_plan_findings(
    part: &Part,
    plan: &crate::document::BridgePlan,
    target: Target,
    findings: &mut Vec<Finding>,
) -> bool {
    if let Some(o) = &plan.bridge_factor_override
        && o.reason.trim().is_empty()
    {
        findings.push(Finding {
            severity: Severity::Warn,
            message: format!(
                "part \"{}\", bridge \"{}\": the bridge factor {} is typed without a reason; \
                 say why the computed one is not used",
                part.name, plan.name, o.value
            ),
            target,
            marked: String::new(),
        });
    }
    if !plan.is_wired() {
        findings.push(Finding {
            severity: Severity::Warn,
            message: format!(
                "part \"{}\", bridge \"{}\": not wired yet; put a grid in at least one arm",
                part.name, plan.name
            ),
            target,
            marked: String::new(),
        });
        return false;
    }
    true
}

/// The measurement model of a wired bridge, with its bridge factor (typed or computed).
fn model_of(
    part: &Part,
    gauges: &[gw_bridge::PlacedGauge],
    plan: &crate::document::BridgePlan,
    setup: &Setup,
) -> Result<BridgeModel, String> {
    let bridge = bridge_from_plan(part, gauges, plan).map_err(|e| e.to_string())?;
    let mut model = BridgeModel::new(setup, &bridge).map_err(|e| e.to_string())?;
    // One model serves both: the factor only changes the displayed conversion.
    let factor = match &plan.bridge_factor_override {
        Some(o) => o.value,
        None => crate::arrangements::bridge_factor_of_model(&model),
    };
    model.set_bridge_factor(factor);
    Ok(model)
}

/// The loads the part's bridges solve for together, with a warning when they separate them
/// poorly or cannot.
fn multi_axis_of(
    models: &[BridgeModel],
    part: &Part,
    pi: usize,
    findings: &mut Vec<Finding>,
) -> Option<MultiAxis> {
    let multi = match multi_axis(models, &part.member.components()) {
        Ok(m) => m,
        Err(e) => {
            findings.push(Finding {
                severity: Severity::Warn,
                message: format!("part \"{}\": {e}", part.name),
                target: Target::Part { part: pi },
                marked: String::new(),
            });
            None
        }
    };
    if let Some(m) = &multi
        && m.condition_number > 100.0
    {
        findings.push(Finding {
            severity: Severity::Warn,
            message: format!(
                "part \"{}\": the bridges separate the loads poorly (condition number {:.0}); \
                 small reading errors become large load errors",
                part.name, m.condition_number
            ),
            target: Target::Part { part: pi },
            marked: String::new(),
        });
    }
    multi
}

/// Warns where a load case's temperatures leave the range a gauge's thermal-output curve was
/// measured over: the apparent strain there is an extrapolation of the polynomial.
fn curve_range_findings(
    pi: usize,
    part: &Part,
    gauges: &[gw_bridge::PlacedGauge],
    findings: &mut Vec<Finding>,
) {
    for (gi, g) in gauges.iter().enumerate() {
        let Some((lo, hi)) = g.spec.thermal_output.valid_range_c else {
            continue;
        };
        for case in &part.load_cases {
            let (t0, t1) = case.temperature_range_c;
            if !(g.spec.thermal_output.covers(t0) && g.spec.thermal_output.covers(t1)) {
                let t = |c: f64| crate::marked::mark(crate::units::Quantity::Temperature, c);
                findings.push(Finding::marked(
                    Severity::Warn,
                    format!(
                        "part \"{}\", gauge {}: its thermal-output curve is given from {} to {}, \
                         but load case \"{}\" runs from {} to {}; the apparent strain outside \
                         the curve's range is extrapolated",
                        part.name,
                        g.id,
                        t(lo),
                        t(hi),
                        case.name,
                        t(t0),
                        t(t1)
                    ),
                    Target::Gauge {
                        part: pi,
                        gauge: gi,
                    },
                ));
            }
        }
    }
}

fn push_margin(findings: &mut Vec<Finding>, m: &Margin, place: String, target: Target) {
    let severity = match m.status {
        MarginStatus::Pass => return,
        MarginStatus::Warn => Severity::Warn,
        MarginStatus::Fail => Severity::Fail,
    };
    findings.push(Finding::marked(
        severity,
        format!(
            "{place}: {} at {:.0} % ({} {})",
            m.kind.name(),
            m.utilisation * 100.0,
            m.status.word(),
            if m.status == MarginStatus::Fail {
                "— change the plan before testing"
            } else {
                "— little margin left"
            }
        ),
        target,
    ));
}

/// Where the largest stress is, its lengths marked for either unit system.
fn peak_marked(at: &gw_mechanics::PeakLocation) -> String {
    use crate::marked::mark;
    use crate::units::Quantity::Length;
    match at {
        gw_mechanics::PeakLocation::Surface(p) => format!(
            "on the {} at x = {}, s = {}",
            p.face.name(),
            mark(Length, p.x_m),
            mark(Length, p.s_m)
        ),
        gw_mechanics::PeakLocation::Bore { radius_m } => {
            format!("at the bore (r = {})", mark(Length, *radius_m))
        }
    }
}

/// A required accuracy that the prediction misses or nearly misses, with the prediction by
/// cause in the wanted load's unit.
fn accuracy_finding(
    check: &crate::accuracy::AccuracyCheck,
    plan: &crate::document::BridgePlan,
    place: &str,
    target: Target,
    findings: &mut Vec<Finding>,
) {
    let (severity, advice) = match check.margin.status {
        MarginStatus::Pass => return,
        MarginStatus::Warn => (Severity::Warn, "little margin left"),
        MarginStatus::Fail => (Severity::Fail, check.advice()),
    };
    findings.push(Finding::marked(
        severity,
        format!("{place}: {} — {advice}", check.describe_marked(plan.wanted)),
        target,
    ));
}

#[allow(clippy::too_many_arguments)]
fn evaluate_bridge(
    project: &Project,
    part: &Part,
    model: &BridgeModel,
    expected: &[(LoadComponent, f64)],
    options: &EvalOptions,
    pi: usize,
    bi: usize,
    findings: &mut Vec<Finding>,
) -> Result<BridgeEvaluation, gw_bridge::BridgeError> {
    let plan = &part.bridges[bi];
    let b = model.bridge();
    let member = &part.member;
    let warn = project.warn_utilisation;
    let channel = channel_figures(model)?;
    let target = Target::Bridge {
        part: pi,
        bridge: bi,
    };
    let place = |case: &str| format!("part \"{}\", bridge \"{}\", {case}", part.name, plan.name);

    let mut cases = bridge_cases(project, part, model, &channel, &place, target, findings)?;

    let vex = model.nominal_excitation_v();
    let gf_bf = b.instrument.gauge_factor * b.instrument.bridge_factor;
    let sensitivities = sensitivities_of(model, member, gf_bf)?;
    let (s_w, m_w) = wanted_figures(&sensitivities, expected, b.wanted);
    no_response_finding(
        model,
        &channel,
        (s_w, m_w),
        &place("wanted load"),
        target,
        findings,
    );
    let rejection = rejections(&sensitivities, expected, b.wanted, s_w, m_w);
    let full_case = part
        .load_cases
        .iter()
        .max_by(|a, b2| a.value(b.wanted).abs().total_cmp(&b2.value(b.wanted).abs()));
    let temperature = temperature_sweep(project, part, model, options, full_case)?;
    let shunt = shunt_calibration(model)?;
    let uncertainty = uncertainty_at(
        part, model, &channel, options, full_case, &place, target, findings,
    );
    let uncertainty_case = uncertainty.as_ref().and(full_case.map(|c| c.name.clone()));
    let accuracy = accuracy_of(
        (part, plan, model, &channel),
        options,
        (uncertainty.as_ref(), uncertainty_case.as_deref()),
        (&place, target),
        (&mut cases, findings),
        warn,
    )?;
    let zero_band = zero_band_of(model, &cases, project.zero_band_fraction)?;
    let wanted_per_mv_per_v = wanted_per_mv_per_v(&sensitivities, b.wanted, m_w, &channel);
    let pin_resistances = crate::wiring::pin_resistances(model);
    Ok(BridgeEvaluation {
        name: plan.name.clone(),
        arrangement: plan.arrangement.clone(),
        wanted: b.wanted,
        channel_number: plan.channel,
        excitation_v: vex,
        gauge_factor_setting: b.instrument.gauge_factor,
        bridge_factor: b.instrument.bridge_factor,
        wiring: b.wiring.trade_name(b.arms.map(|a| a.at_gauge())),
        cases,
        sensitivities,
        rejection,
        temperature,
        channel,
        shunt,
        uncertainty,
        uncertainty_case,
        accuracy,
        zero_band,
        wanted_per_mv_per_v,
        pin_resistances,
        calibration: plan.calibration.clone(),
    })
}

/// The wanted load's displayed strain per unit and its expected magnitude (0 where absent).
fn wanted_figures(
    sensitivities: &[Sensitivity],
    expected: &[(LoadComponent, f64)],
    wanted: LoadComponent,
) -> (f64, f64) {
    let s_w = sensitivities
        .iter()
        .find(|s| s.component == wanted)
        .map_or(0.0, |s| s.displayed_per_unit);
    let m_w = expected
        .iter()
        .find(|(c, _)| *c == wanted)
        .map_or(0.0, |(_, m)| *m);
    (s_w, m_w)
}

/// Apparent strain over the part temperatures of every load case, the reference among them,
/// at the loads of `full_case` (none: unloaded). The cases' ranges are part temperatures; the
/// bridge model works in changes from the reference.
fn temperature_sweep(
    project: &Project,
    part: &Part,
    model: &BridgeModel,
    options: &EvalOptions,
    full_case: Option<&crate::document::LoadCase>,
) -> Result<Vec<ThermalPoint>, gw_bridge::BridgeError> {
    let t_ref = project.reference_temperature_c;
    let (lo, hi) = crate::document::temperature_span(&part.load_cases)
        .map_or((-20.0, 40.0), |(a, b)| (a - t_ref, b - t_ref));
    let full = full_case
        .map(|c| c.load_vector())
        .unwrap_or(LoadVector::ZERO);
    let changes = gw_bridge::temperature::sweep_changes(lo, hi, options.temperature_steps);
    gw_bridge::temperature::thermal_sweep_at(model, &changes, &full)
}

/// The zero band of a bridge judged against its full scale (the largest |reading| over its load
/// cases); a band wider than `fraction` of it carries a note (`ZeroBand::note`).
fn zero_band_of(
    model: &BridgeModel,
    cases: &[BridgeCase],
    fraction: f64,
) -> Result<ZeroBand, gw_bridge::BridgeError> {
    let full_scale_mv_per_v = cases
        .iter()
        .map(|c| c.reading.mv_per_v.abs())
        .fold(0.0, f64::max);
    zero_band_of_model(
        model,
        ZeroBandLimit {
            full_scale_mv_per_v,
            fraction,
        },
    )
}

/// The wanted load per mV/V of output, from the sensitivity to the wanted component at zero
/// load. `None` when the bridge does not respond to it: a sensitivity of zero, or a response at
/// the largest wanted load (`largest`) below what the channel resolves, where the factor would
/// only scale noise.
fn wanted_per_mv_per_v(
    sensitivities: &[Sensitivity],
    wanted: LoadComponent,
    largest: f64,
    channel: &ChannelFigures,
) -> Option<f64> {
    let s = sensitivities.iter().find(|s| s.component == wanted)?;
    let resolvable = channel.resolution_strain.max(channel.noise_strain_rms);
    if largest != 0.0 && (s.displayed_per_unit * largest).abs() < resolvable {
        return None;
    }
    Some(1.0 / s.mv_per_v_per_unit).filter(|f| f.is_finite())
}

/// Displayed strain from zero to the case's full load in `steps` steps, with the straight line
/// through the ends for the nonlinearity plot. The case's temperature is its condition, not
/// ramped with the load.
fn ramp_of(
    model: &BridgeModel,
    loads: &LoadVector,
    steps: u32,
) -> Result<Vec<RampPoint>, gw_bridge::BridgeError> {
    let wanted = model.bridge().wanted;
    let steps = steps.max(1);
    let mut ramp = Vec::with_capacity(steps as usize + 1);
    for i in 0..=steps {
        let fraction = i as f64 / steps as f64;
        let mut l = loads.scaled(fraction);
        l[LoadComponent::TemperatureChange] = loads[LoadComponent::TemperatureChange];
        ramp.push(RampPoint {
            fraction,
            wanted_value: loads[wanted] * fraction,
            displayed_strain: model.displayed(&l)?,
            linear_strain: 0.0,
        });
    }
    let (first, last) = (
        ramp[0].displayed_strain,
        ramp[ramp.len() - 1].displayed_strain,
    );
    for p in &mut ramp {
        p.linear_strain = first + (last - first) * p.fraction;
    }
    Ok(ramp)
}

/// The required accuracy of a bridge checked in each case, its margins added to the cases and
/// its misses to the findings (the budget at the largest load is reused).
fn accuracy_of(
    (part, plan, model, channel): (
        &Part,
        &crate::document::BridgePlan,
        &BridgeModel,
        &ChannelFigures,
    ),
    options: &EvalOptions,
    (uncertainty, uncertainty_case): (Option<&BridgeUncertainty>, Option<&str>),
    (place, target): (&dyn Fn(&str) -> String, Target),
    (cases, findings): (&mut [BridgeCase], &mut Vec<Finding>),
    warn: f64,
) -> Result<Vec<crate::accuracy::AccuracyCheck>, gw_bridge::BridgeError> {
    let budgets = match options.uncertainty {
        UncertaintyDepth::Off => crate::accuracy::Budgets::Off,
        _ => crate::accuracy::Budgets::PerCase {
            known: uncertainty.zip(uncertainty_case),
        },
    };
    let accuracy = crate::accuracy::accuracy_checks(
        part,
        plan.required_accuracy,
        model,
        channel,
        warn,
        budgets,
    )?;
    for check in &accuracy {
        accuracy_finding(check, plan, &place(&check.case), target, findings);
        if let Some(c) = cases.iter_mut().find(|c| c.case == check.case) {
            c.margins.push(check.margin.clone());
        }
    }
    Ok(accuracy)
}

/// What the grids of a bridge may take: the lowest strain and fatigue limits of its grids and
/// the arm nearest its power limit (density, limit).
struct GridLimits {
    grids: Vec<usize>,
    strain_limit: f64,
    fatigue_limit: f64,
    power_util: (f64, f64),
}

fn grid_limits(model: &BridgeModel, channel: &ChannelFigures) -> GridLimits {
    let b = model.bridge();
    // Grids of this bridge, for strain and stress margins.
    let grids: Vec<usize> = (0..4)
        .filter(|&k| matches!(b.arms[k], ArmElement::Grid(_)))
        .collect();
    let strain_limit = grids
        .iter()
        .filter_map(|&k| model.spec(k).map(|s| s.strain_limit))
        .fold(f64::INFINITY, f64::min);
    let fatigue_limit = grids
        .iter()
        .filter_map(|&k| model.spec(k).map(|s| s.fatigue_strain_limit))
        .fold(f64::INFINITY, f64::min);
    let power_util = (0..4)
        .filter(|&k| channel.arm_power_limit_w_m2[k] > 0.0)
        .map(|k| {
            (
                channel.arm_power_density_w_m2[k],
                channel.arm_power_limit_w_m2[k],
            )
        })
        .fold((0.0, f64::INFINITY), |(d, l), (dk, lk)| {
            if dk / lk > d / l { (dk, lk) } else { (d, l) }
        });

    GridLimits {
        grids,
        strain_limit,
        fatigue_limit,
        power_util,
    }
}

/// Each load case's reading, margins and ramp of one bridge; failed or close margins become
/// findings.
fn bridge_cases(
    project: &Project,
    part: &Part,
    model: &BridgeModel,
    channel: &ChannelFigures,
    place: &dyn Fn(&str) -> String,
    target: Target,
    findings: &mut Vec<Finding>,
) -> Result<Vec<BridgeCase>, gw_bridge::BridgeError> {
    let limits = grid_limits(model, channel);
    let mut cases = Vec::new();
    for case in &part.load_cases {
        let loads = case.load_vector();
        let reading = model.reading(&loads)?;
        let adc_v = adc_volts(model, &reading);
        let margins = case_margins(
            (project, part, model, channel),
            &limits,
            case.cycled,
            &loads,
            (&reading, adc_v),
        );
        for m in &margins {
            push_margin(findings, m, place(&case.name), target);
        }
        let ramp = ramp_of(model, &loads, case.ramp_steps)?;
        let from_temperature_strain = if loads[LoadComponent::TemperatureChange] == 0.0 {
            0.0
        } else {
            let mut isothermal = loads;
            isothermal[LoadComponent::TemperatureChange] = 0.0;
            reading.displayed_strain - model.displayed(&isothermal)?
        };
        cases.push(BridgeCase {
            case: case.name.clone(),
            reading,
            adc_v,
            margins,
            ramp,
            from_temperature_strain,
        });
    }

    Ok(cases)
}

/// The margins of one load case: grid strain (and fatigue when cycled), stress at the gauges,
/// input range, resolution and self-heating.
fn case_margins(
    (project, part, model, channel): (&Project, &Part, &BridgeModel, &ChannelFigures),
    limits: &GridLimits,
    cycled: bool,
    loads: &LoadVector,
    (reading, adc_v): (&Reading, f64),
) -> Vec<Margin> {
    let b = model.bridge();
    let member = &part.member;
    let material = member.material();
    let warn = project.warn_utilisation;
    let GridLimits {
        grids,
        strain_limit,
        fatigue_limit,
        power_util,
    } = limits;
    let (strain_limit, fatigue_limit) = (*strain_limit, *fatigue_limit);
    let mut margins = Vec::new();
    margins.push(Margin::new(
        MarginKind::GridStrainLimit,
        reading.max_grid_strain,
        strain_limit,
        warn,
    ));
    if cycled {
        margins.push(Margin::new(
            MarginKind::GridFatigue,
            reading.max_grid_strain,
            fatigue_limit,
            warn,
        ));
    }
    let stress_at_gauge = grids
        .iter()
        .filter_map(|&k| model.footprint(k))
        .filter_map(|f| member.state(&f.center, loads).ok())
        .map(|s| s.von_mises_pa(material))
        .fold(0.0, f64::max);
    margins.push(Margin::new(
        MarginKind::StressAtGauge,
        stress_at_gauge,
        material.yield_strength_pa,
        warn,
    ));
    margins.push(Margin::new(
        MarginKind::InputRange,
        adc_v,
        b.signal.input_range_v,
        warn,
    ));
    // The smallest change the channel resolves: one count or the noise floor, whichever
    // is larger.
    let resolvable = channel.resolution_strain.max(channel.noise_strain_rms);
    margins.push(Margin::new(
        MarginKind::Resolution,
        resolvable,
        part.required_resolution_strain,
        warn,
    ));
    if power_util.1.is_finite() {
        margins.push(Margin::new(
            MarginKind::SelfHeating,
            power_util.0,
            power_util.1,
            warn,
        ));
    }
    margins
}

/// Displayed strain and output per unit of every component the part carries.
fn sensitivities_of(
    model: &BridgeModel,
    member: &gw_mechanics::Member,
    gf_bf: f64,
) -> Result<Vec<Sensitivity>, gw_bridge::BridgeError> {
    let mut sensitivities = Vec::new();
    for &c in member.components().iter() {
        let s = model.sensitivity(c)?;
        sensitivities.push(Sensitivity {
            component: c,
            displayed_per_unit: s,
            mv_per_v_per_unit: s * gf_bf / 4.0 * 1e3,
        });
    }
    Ok(sensitivities)
}

/// How much of each unwanted component (at its expected magnitude) reaches the reading, against
/// the wanted load's full scale.
fn rejections(
    sensitivities: &[Sensitivity],
    expected: &[(LoadComponent, f64)],
    wanted: LoadComponent,
    s_w: f64,
    m_w: f64,
) -> Vec<Rejection> {
    sensitivities
        .iter()
        .filter(|s| s.component != wanted)
        .filter_map(|s| {
            let m = expected
                .iter()
                .find(|(c, _)| *c == s.component)
                .map(|(_, m)| *m)?;
            // Without a full-scale output there is nothing to compare a leak with: no figure
            // (the missing wanted load is a finding of its own).
            let full = (s_w * m_w).abs();
            let leakage_fraction = (full > 0.0)
                .then(|| (s.displayed_per_unit * m).abs() / full)
                .filter(|f| f.is_finite())?;
            Some(Rejection {
                component: s.component,
                expected: m,
                leakage_fraction,
                rejection_db: if leakage_fraction > 1e-10 {
                    -20.0 * leakage_fraction.log10()
                } else {
                    200.0
                },
            })
        })
        .collect()
}

/// The uncertainty budget at the load case with the largest wanted load (GUM, with Monte Carlo
/// when asked); a budget that cannot be formed is a warning.
#[allow(clippy::too_many_arguments)]
fn uncertainty_at(
    part: &Part,
    model: &BridgeModel,
    channel: &ChannelFigures,
    options: &EvalOptions,
    full_case: Option<&crate::LoadCase>,
    place: &dyn Fn(&str) -> String,
    target: Target,
    findings: &mut Vec<Finding>,
) -> Option<BridgeUncertainty> {
    let member = &part.member;
    match (options.uncertainty, full_case) {
        (UncertaintyDepth::Off, _) | (_, None) => None,
        (depth, Some(case)) => {
            let mut tol = part.tolerances;
            tol.monte_carlo_trials = match depth {
                UncertaintyDepth::Gum => 0,
                _ if options.monte_carlo_trials > 0 => options.monte_carlo_trials,
                _ => tol.monte_carlo_trials,
            };
            let mut l = case.load_vector();
            l[LoadComponent::TemperatureChange] = case.value(LoadComponent::TemperatureChange);
            // A budget that cannot be formed (a bridge that does not respond to its wanted
            // load has no sensitivity to divide by) is reported; the rest of the bridge stands.
            match bridge_uncertainty(member, model, &l, channel, &tol, options.quadrature) {
                Ok(u) => Some(u),
                Err(e) => {
                    findings.push(Finding {
                        severity: Severity::Warn,
                        message: format!("{}: no uncertainty budget: {e}", place(&case.name)),
                        target,
                        marked: String::new(),
                    });
                    None
                }
            }
        }
    }
}

/// A bridge whose output at the largest wanted load is below what its channel resolves does not
/// measure what it is for: a failure, with the rest of the bridge still evaluated.
fn no_response_finding(
    model: &BridgeModel,
    channel: &ChannelFigures,
    (per_unit, largest): (f64, f64),
    place: &str,
    target: Target,
    findings: &mut Vec<Finding>,
) {
    let wanted = model.bridge().wanted;
    let resolvable = channel.resolution_strain.max(channel.noise_strain_rms);
    let full_scale = (per_unit * largest).abs();
    if largest == 0.0 {
        findings.push(Finding {
            severity: Severity::Warn,
            message: format!(
                "{place}: no load case applies the {} the bridge is to measure, so its response \
                 cannot be checked; add the {} to the rated case",
                wanted.name(),
                wanted.name()
            ),
            target,
            marked: String::new(),
        });
        return;
    }
    if full_scale >= resolvable {
        return;
    }
    findings.push(Finding {
        severity: Severity::Fail,
        message: format!(
            "{place}: the bridge does not respond to the {} it is to measure: at the largest \
             {} of the load cases it shows {:.3} µε, below the {:.3} µε the channel resolves; \
             wire an arrangement that reads the {} (the bridges view suggests some) or change \
             what the bridge measures",
            wanted.name(),
            wanted.name(),
            full_scale * 1e6,
            resolvable * 1e6,
            wanted.name()
        ),
        target,
        marked: String::new(),
    });
}

/// The uncertainty budget of one bridge with Monte Carlo (`trials` trials), at the load case
/// with the largest wanted load. For the app's on-demand button.
pub fn monte_carlo_for(
    project: &Project,
    part: usize,
    bridge: usize,
    trials: usize,
) -> Result<BridgeUncertainty, String> {
    let p = project.parts.get(part).ok_or("no such part")?;
    let plan = p.bridges.get(bridge).ok_or("no such bridge")?;
    let gauges = project.placed_gauges(p);
    let b = bridge_with_factor(p, &gauges, plan, project.reference_temperature_c)
        .map_err(|e| e.to_string())?;
    let options = EvalOptions::default();
    let setup = Setup {
        member: &p.member,
        gauges: &gauges,
        reference_temperature_c: project.reference_temperature_c,
        quadrature: options.quadrature,
    };
    let model = BridgeModel::new(&setup, &b).map_err(|e| e.to_string())?;
    let channel = channel_figures(&model).map_err(|e| e.to_string())?;
    let case = p
        .load_cases
        .iter()
        .max_by(|a, c| a.value(b.wanted).abs().total_cmp(&c.value(b.wanted).abs()))
        .ok_or("the part has no load case")?;
    let mut tol = p.tolerances;
    tol.monte_carlo_trials = trials;
    bridge_uncertainty(
        &p.member,
        &model,
        &case.load_vector(),
        &channel,
        &tol,
        options.quadrature,
    )
    .map_err(|e| e.to_string())
}
