//! The second pass of the chooser: each screened assignment put into the bridge it is for and
//! solved on the exact circuit, its error at rated load worked out cause by cause.

use gw_mechanics::{LoadComponent, LoadVector, Member, QuadratureOrder};

use super::screen::Screened;
use super::{ChooserRequest, ErrorAtRated, RankedArrangement, score};
use crate::bridge::ArmElement;
use crate::gauge::PlacedGauge;
use crate::model::{BridgeModel, Setup};
use crate::signal_chain::channel_figures;
use crate::units::si;

/// Exact figures of every screened assignment; those that cannot be solved, that do not read
/// the wanted load positively or whose full scale is below one count are left out.
pub(super) fn evaluate(
    member: &Member,
    gauges: &[PlacedGauge],
    request: &ChooserRequest,
    quadrature: QuadratureOrder,
    screened: Vec<Screened>,
) -> Vec<RankedArrangement> {
    let setup = Setup {
        member,
        gauges,
        reference_temperature_c: request.reference_temperature_c,
        quadrature,
    };
    screened
        .into_iter()
        .filter_map(|s| one(&setup, request, s))
        .collect()
}

fn one(setup: &Setup<'_>, request: &ChooserRequest, s: Screened) -> Option<RankedArrangement> {
    let mut bridge = request.template.clone();
    bridge.arms = s.arms;
    bridge.wanted = request.wanted;
    bridge.shunt = None;
    let model = BridgeModel::new(setup, &bridge).ok()?;
    let rated = request.wanted_magnitude.abs();
    let per_unit = model.sensitivity(request.wanted).ok()?;
    let channel = channel_figures(&model).ok()?;
    // Displayed strain over the wanted load's sensitivity: a reading in the wanted unit.
    let in_units = |displayed: f64| displayed / per_unit;
    if !(per_unit > 0.0 && per_unit * rated > channel.resolution_strain) {
        return None;
    }
    let leakage = request
        .unwanted
        .iter()
        .filter(|(c, _)| *c != LoadComponent::TemperatureChange)
        .map(|&(c, m)| Some((c, in_units(model.sensitivity(c).ok()? * m))))
        .collect::<Option<Vec<_>>>()?;
    let at_temperature = |dt: f64| -> Option<f64> {
        let mut l = LoadVector::ZERO;
        l[LoadComponent::TemperatureChange] = dt;
        Some(in_units(model.displayed(&l).ok()?))
    };
    let (lo, hi) = request.temperature_range_c;
    let (t_lo, t_hi) = (at_temperature(lo)?, at_temperature(hi)?);
    let temperature = if t_lo.abs() > t_hi.abs() { t_lo } else { t_hi };
    let full = model
        .displayed(&LoadVector::unit(request.wanted).scaled(rated))
        .ok()?;
    let error = ErrorAtRated {
        leakage,
        temperature,
        nonlinearity: in_units(full) - rated,
        noise_rms: in_units(channel.noise_strain_rms),
        resolution: in_units(channel.resolution_strain),
        placement: s.placement,
    };
    let total = error.total();
    if !total.is_finite() {
        return None;
    }
    let ratio =
        full * bridge.instrument.gauge_factor * bridge.instrument.bridge_factor * (1.0 / 4.0);
    Some(RankedArrangement {
        arms: s.arms,
        full_scale_mv_per_v: ratio * 1e3,
        rated,
        unit: request.wanted.unit(),
        score: score(total / rated, s.gauge_count),
        error,
        gauge_count: s.gauge_count,
        reason: String::new(),
    })
}

/// One line in plain words: what the arrangement uses, its output, what it cancels and the
/// error it leaves at rated load, cause by cause, in the wanted unit.
pub(super) fn explain(r: &RankedArrangement, gauges: &[PlacedGauge]) -> String {
    let unit = r.unit;
    let active = r
        .arms
        .iter()
        .filter(|a| matches!(a, ArmElement::Grid(_)))
        .count();
    let dummies = r
        .arms
        .iter()
        .filter(|a| matches!(a, ArmElement::Dummy(_)))
        .count();
    let names: Vec<String> = r
        .arms
        .iter()
        .map(|a| match a {
            ArmElement::Grid(g) => gauges
                .get(g.gauge)
                .map(|p| format!("{}/{}", p.id, g.element + 1))
                .unwrap_or_default(),
            ArmElement::Dummy(g) => gauges
                .get(g.gauge)
                .map(|p| format!("dummy like {}/{}", p.id, g.element + 1))
                .unwrap_or_else(|| "dummy".into()),
            ArmElement::Completion(_) => "resistor".into(),
        })
        .collect();
    let total = r.total_error();
    let mut line = format!(
        "{active} active grid(s){} [{}]; {:.3} mV/V at {}; error at rated load ±{} ({:.2} %)",
        match dummies {
            0 => String::new(),
            1 => " and a dummy".to_owned(),
            n => format!(" and {n} dummies"),
        },
        names.join(", "),
        r.full_scale_mv_per_v,
        si(r.rated, unit),
        si(total, unit),
        100.0 * total / r.rated,
    );
    // A cause below a thousandth of the error budget (or of the rated load) is cancelled.
    let negligible = (1e-3 * total).max(1e-6 * r.rated);
    let mut cancels = Vec::new();
    let mut parts = Vec::new();
    for (c, l) in &r.error.leakage {
        if l.abs() < negligible {
            cancels.push(c.name());
        } else {
            parts.push(format!("{} {}", c.name(), si(l.abs(), unit)));
        }
    }
    let e = &r.error;
    for (name, v) in [
        ("temperature", e.temperature),
        ("nonlinearity", e.nonlinearity),
        ("noise (rms)", e.noise_rms),
        ("one count", e.resolution),
        ("placement (1 σ)", e.placement),
    ] {
        if v.abs() >= negligible {
            parts.push(format!("{name} {}", si(v.abs(), unit)));
        } else if name == "temperature" {
            cancels.push("temperature");
        }
    }
    if !parts.is_empty() {
        line += &format!(": {}", parts.join(", "));
    }
    if !cancels.is_empty() {
        line += &format!("; cancels {}", cancels.join(", "));
    }
    line
}
