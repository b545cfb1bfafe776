//! The first pass of the chooser: every assignment of the grids to the arms, judged with the
//! linear small-signal bridge so that thousands can be looked at; the best go on to the exact
//! circuit.

use gw_mechanics::transverse::CALIBRATION_POISSON_RATIO;
use gw_mechanics::{
    GridFootprint, LoadComponent, LoadVector, Member, QuadratureOrder, grid_average_state,
};

use super::ChooserRequest;
use crate::bridge::ArmElement;
use crate::circuit::Excitation;
use crate::error::BridgeError;
use crate::gauge::{GaugeSpec, GridRef, PlacedGauge};
use crate::model::ARM_SIGNS;

/// How many screened assignments go on to the exact circuit, at least.
const EXACT_AT_LEAST: usize = 24;

/// How many variants of one set of active arms (differing in dummies and resistors) go on.
const PASSIVE_VARIANTS: usize = 3;

/// One candidate element for an arm, with its precomputed response.
#[derive(Debug, Clone)]
struct Candidate {
    element: ArmElement,
    /// ΔR/R per unit of each component (temperature excluded).
    per_unit: [f64; LoadComponent::COUNT],
    /// ΔR/R at the low and high temperature, no load.
    thermal: (f64, f64),
    /// ΔR/R per radian of turn, per metre along the part and per metre across the face, at
    /// the rated loads.
    placement: [f64; 3],
    /// Gauge-count contribution.
    count: usize,
    /// The gauge that carries it (grids of one carrier move together).
    carrier: Option<usize>,
}

/// An assignment that passed the linear screen.
#[derive(Debug, Clone)]
pub(super) struct Screened {
    pub arms: [ArmElement; 4],
    /// Standard uncertainty of the reading from placement, in the wanted unit.
    pub placement: f64,
    pub gauge_count: usize,
    /// Linear estimate of the error at rated load, fraction of rated.
    estimate: f64,
}

/// Linear responses of every grid, a dummy and a completion resistor.
fn candidates(
    member: &Member,
    gauges: &[PlacedGauge],
    request: &ChooserRequest,
    quadrature: QuadratureOrder,
) -> Result<Vec<Candidate>, BridgeError> {
    let cte = member.material().cte_per_c;
    let (t_lo, t_hi) = request.temperature_range_c;
    let t_ref = request.reference_temperature_c;
    let rated = rated_loads(request);
    let mut out = Vec::new();
    for (gi, gauge) in gauges.iter().enumerate() {
        gauge.spec.validate()?;
        let spec = &gauge.spec;
        // The lot's curve is a ΔR/R already (recorded at its reference gauge factor); the
        // expansion mismatch is a strain read at the grid's gauge factor at that temperature.
        let thermal = |dt: f64| {
            let t = t_ref + dt;
            let kt = spec.transverse_sensitivity;
            let curve_only = spec.thermal_output.apparent_strain(
                spec.thermal_output.matched_cte_per_c,
                kt,
                spec.gauge_factor,
                t_ref,
                t,
            );
            let mismatch =
                spec.thermal_output
                    .apparent_strain(cte, kt, spec.gauge_factor, t_ref, t)
                    - curve_only;
            spec.gauge_factor * curve_only + spec.gauge_factor_at(t_ref, t) * mismatch
        };
        for element in 0..gauge.element_count() {
            let footprint = gauge.footprint(element);
            let mut per_unit = [0.0; LoadComponent::COUNT];
            for &c in member.components().iter() {
                if c != LoadComponent::TemperatureChange {
                    per_unit[c.index()] =
                        response(member, spec, &footprint, &LoadVector::unit(c), quadrature)?;
                }
            }
            out.push(Candidate {
                element: ArmElement::Grid(GridRef { gauge: gi, element }),
                per_unit,
                thermal: (thermal(t_lo), thermal(t_hi)),
                placement: placement_derivatives(member, spec, &footprint, &rated, quadrature)?,
                count: 1,
                carrier: Some(gi),
            });
        }
    }
    // One dummy for each kind of grid that behaves differently with temperature (another lot,
    // another resistance): a dummy cancels the temperature of a grid only if it is like it.
    let mut dummies: Vec<Candidate> = Vec::new();
    for grid in &out {
        let ArmElement::Grid(g) = grid.element else {
            continue;
        };
        let ohm = gauges[g.gauge].spec.resistance_ohm;
        let alike = |d: &Candidate| {
            let ArmElement::Dummy(h) = d.element else {
                return false;
            };
            d.thermal == grid.thermal && gauges[h.gauge].spec.resistance_ohm == ohm
        };
        if !dummies.iter().any(alike) {
            dummies.push(Candidate {
                element: ArmElement::Dummy(g),
                per_unit: [0.0; LoadComponent::COUNT],
                placement: [0.0; 3],
                carrier: None,
                ..grid.clone()
            });
        }
    }
    if !out.is_empty() {
        out.extend(dummies);
        out.push(Candidate {
            element: ArmElement::Completion(request.completion),
            per_unit: [0.0; LoadComponent::COUNT],
            thermal: (0.0, 0.0),
            placement: [0.0; 3],
            count: 0,
            carrier: None,
        });
    }
    Ok(out)
}

/// The rated load case: the wanted load at its magnitude and every unwanted one at its own.
fn rated_loads(request: &ChooserRequest) -> LoadVector {
    let mut loads = LoadVector::unit(request.wanted).scaled(request.wanted_magnitude.abs());
    for &(c, m) in &request.unwanted {
        if c != LoadComponent::TemperatureChange {
            loads[c] = m;
        }
    }
    loads
}

/// ΔR/R of a grid of `spec` on `footprint` under `loads` (grid-averaged, transverse-corrected).
fn response(
    member: &Member,
    spec: &GaugeSpec,
    footprint: &GridFootprint,
    loads: &LoadVector,
    quadrature: QuadratureOrder,
) -> Result<f64, BridgeError> {
    let st = grid_average_state(member, footprint, loads, quadrature)?.mechanical_strain();
    let a = st.along(footprint.angle_rad);
    let t = st.along(footprint.angle_rad + std::f64::consts::FRAC_PI_2);
    let kt = spec.transverse_sensitivity;
    Ok(spec.gauge_factor * (a + kt * t) / (1.0 - CALIBRATION_POISSON_RATIO * kt))
}

/// dΔR/R per radian of turn, per metre along and per metre across, by central differences
/// (one-sided at the edge of a face; zero where the grid cannot move either way).
fn placement_derivatives(
    member: &Member,
    spec: &GaugeSpec,
    footprint: &GridFootprint,
    loads: &LoadVector,
    quadrature: QuadratureOrder,
) -> Result<[f64; 3], BridgeError> {
    let at = |f: GridFootprint| response(member, spec, &f, loads, quadrature);
    let centre = at(*footprint)?;
    let moved = |kind: usize, h: f64| {
        let mut f = *footprint;
        match kind {
            0 => f.angle_rad += h,
            1 => f.center.x_m += h,
            _ => f.center.s_m += h,
        }
        at(f)
    };
    let mut out = [0.0; 3];
    for (kind, slot) in out.iter_mut().enumerate() {
        let h = if kind == 0 {
            0.5f64.to_radians()
        } else {
            0.5e-3
        };
        *slot = match (moved(kind, h), moved(kind, -h)) {
            (Ok(p), Ok(m)) => (p - m) / (2.0 * h),
            (Ok(p), Err(_)) => (p - centre) / h,
            (Err(_), Ok(m)) => (centre - m) / h,
            (Err(_), Err(_)) => 0.0,
        };
    }
    Ok(out)
}

/// Every admissible assignment as indices into the candidates: each grid in one arm at most,
/// at least one grid, dummies and completion resistors free to repeat.
fn assignments(n: usize, grids: usize) -> Vec<[usize; 4]> {
    let mut pairs = Vec::new();
    for i in 0..n {
        for j in i..n {
            if !(i == j && i < grids) {
                pairs.push((i, j));
            }
        }
    }
    let mut out = Vec::new();
    for &(p1, p3) in &pairs {
        for &(p2, p4) in &pairs {
            let idx = [p1, p2, p3, p4];
            let grid_slots: Vec<usize> = idx.iter().copied().filter(|&k| k < grids).collect();
            let distinct = grid_slots
                .iter()
                .enumerate()
                .all(|(a, k)| !grid_slots[..a].contains(k));
            if !grid_slots.is_empty() && distinct {
                out.push(idx);
            }
        }
    }
    out
}

/// The linear screen: every assignment whose wanted output is positive, judged by its linear
/// error at rated load; the best few go on to the exact circuit.
pub(super) fn screen(
    member: &Member,
    gauges: &[PlacedGauge],
    request: &ChooserRequest,
    quadrature: QuadratureOrder,
) -> Result<Vec<Screened>, BridgeError> {
    let options = candidates(member, gauges, request, quadrature)?;
    let grids = options
        .iter()
        .filter(|o| matches!(o.element, ArmElement::Grid(_)))
        .count();
    let floor = channel_floor_ratio(request);
    let mut out: Vec<Screened> = assignments(options.len(), grids)
        .into_iter()
        .filter_map(|idx| judge(&idx.map(|k| &options[k]), request, floor))
        .collect();
    out.sort_by(|a, b| a.estimate.total_cmp(&b.estimate));
    // The same grids in the same arms with other passive arms (dummies, resistors) are one
    // entry in the end: a few of each go on, so that the list is not filled by variants of one.
    let mut seen: Vec<([Option<GridRef>; 4], usize)> = Vec::new();
    out.retain(|s| {
        let active = s.arms.map(|a| match a {
            ArmElement::Grid(g) => Some(g),
            _ => None,
        });
        match seen.iter_mut().find(|(a, _)| *a == active) {
            Some((_, n)) if *n >= PASSIVE_VARIANTS => false,
            Some((_, n)) => {
                *n += 1;
                true
            }
            None => {
                seen.push((active, 1));
                true
            }
        }
    });
    out.truncate(EXACT_AT_LEAST.max(3 * request.keep));
    Ok(out)
}

/// The linear figures of one given assignment (for judging a bridge as wired), or `None` when
/// it does not read the wanted load positively or is below one count.
pub(super) fn screen_one(
    member: &Member,
    gauges: &[PlacedGauge],
    request: &ChooserRequest,
    quadrature: QuadratureOrder,
    arms: &[ArmElement; 4],
) -> Result<Option<Screened>, BridgeError> {
    let options = candidates(member, gauges, request, quadrature)?;
    let pick = |arm: &ArmElement| -> Option<Candidate> {
        match arm {
            ArmElement::Completion(c) => Some(Candidate {
                element: ArmElement::Completion(*c),
                per_unit: [0.0; LoadComponent::COUNT],
                thermal: (0.0, 0.0),
                placement: [0.0; 3],
                count: 0,
                carrier: None,
            }),
            ArmElement::Grid(_) => options.iter().find(|o| o.element == *arm).cloned(),
            ArmElement::Dummy(g) => options
                .iter()
                .find(|o| o.element == ArmElement::Grid(*g))
                .map(|o| Candidate {
                    element: *arm,
                    per_unit: [0.0; LoadComponent::COUNT],
                    placement: [0.0; 3],
                    carrier: None,
                    ..o.clone()
                }),
        }
    };
    let Some([a, b, c, d]) = arms
        .iter()
        .map(pick)
        .collect::<Option<Vec<_>>>()
        .and_then(|v| <[Candidate; 4]>::try_from(v).ok())
    else {
        return Ok(None);
    };
    Ok(judge(
        &[&a, &b, &c, &d],
        request,
        channel_floor_ratio(request),
    ))
}

/// Output ratio (V/V) of one channel count and of its noise, roughly, for the screen: the
/// exact figures come from the circuit afterwards.
fn channel_floor_ratio(request: &ChooserRequest) -> (f64, f64) {
    let s = &request.template.signal;
    let vex = match request.template.excitation {
        Excitation::Voltage { volts } => volts,
        Excitation::Current { amps } => amps * request.completion.ohm,
    };
    let count = 2.0 * s.input_range_v / 2f64.powi(s.adc_bits as i32) / s.gain;
    let noise = s.amplifier_noise_v_per_rt_hz * s.bandwidth_hz.sqrt();
    (count / vex, noise / vex)
}

/// The linear figures of one assignment, or `None` when it does not read the wanted load
/// positively or its full scale is below one count.
fn judge(
    opts: &[&Candidate; 4],
    request: &ChooserRequest,
    (count, noise): (f64, f64),
) -> Option<Screened> {
    let signed = |f: &dyn Fn(&Candidate) -> f64| -> f64 {
        opts.iter()
            .zip(ARM_SIGNS)
            .map(|(o, s)| s * f(o))
            .sum::<f64>()
            / 4.0
    };
    let w = request.wanted.index();
    let per_unit = signed(&|o| o.per_unit[w]);
    let rated = request.wanted_magnitude.abs();
    let full = per_unit * rated;
    if !(per_unit > 0.0 && full > count) {
        return None;
    }
    let leak: f64 = request
        .unwanted
        .iter()
        .map(|&(c, m)| (signed(&|o| o.per_unit[c.index()]) * m).abs())
        .sum();
    let thermal = signed(&|o| o.thermal.0)
        .abs()
        .max(signed(&|o| o.thermal.1).abs());
    let placement = placement_ratio(opts, &request.tolerances) / per_unit;
    let random = (noise.powi(2) + count.powi(2) / 12.0).sqrt() / per_unit;
    let gauge_count = opts.iter().map(|o| o.count).sum();
    let estimate = -super::score(
        ((leak + thermal) / per_unit + 2.0 * random.hypot(placement)) / rated,
        gauge_count,
    );
    Some(Screened {
        arms: opts.map(|o| o.element),
        placement,
        gauge_count,
        estimate,
    })
}

/// Standard uncertainty of the output ratio from placement: per carrier, its grids' derivatives
/// summed with their arm signs (they turn and shift together), carriers independent.
fn placement_ratio(
    opts: &[&Candidate; 4],
    tol: &crate::bridge_uncertainty::InstallationTolerances,
) -> f64 {
    let mut carriers: Vec<(usize, [f64; 3])> = Vec::new();
    for (o, sign) in opts.iter().zip(ARM_SIGNS) {
        let Some(c) = o.carrier else { continue };
        let d = o.placement.map(|v| sign * v / 4.0);
        match carriers.iter_mut().find(|(k, _)| *k == c) {
            Some((_, sum)) => (0..3).for_each(|i| sum[i] += d[i]),
            None => carriers.push((c, d)),
        }
    }
    let u = [tol.misalignment_rad, tol.position_m, tol.position_m];
    carriers
        .iter()
        .map(|(_, d)| (0..3).map(|i| (d[i] * u[i]).powi(2)).sum::<f64>())
        .sum::<f64>()
        .sqrt()
}
