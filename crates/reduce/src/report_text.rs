//! A reduction as text: the result CSV (one row per sample) and the summary the command line
//! prints (and the report reuses): each channel's zero and span, the largest load, each
//! rosette at its peak, the recovered loads against the applied ones, and the calibration fits.

use std::fmt::Write;

use gw_bridge::units::si;

use crate::calibration::{CalibrationFit, StepSource};
use crate::reduction::Reduction;
use crate::rosette_series::PrincipalSeries;

/// One named series of the result file.
struct Column<'a> {
    header: String,
    values: &'a [f64],
    scale: f64,
}

fn col(header: String, values: &[f64], scale: f64) -> Column<'_> {
    Column {
        header,
        values,
        scale,
    }
}

fn principal_columns<'a>(cols: &mut Vec<Column<'a>>, name: &str, s: &'a PrincipalSeries) {
    let degrees = 180.0 / std::f64::consts::PI;
    cols.push(col(format!("{name} ε1 [µε]"), &s.strain_1, 1e6));
    cols.push(col(format!("{name} ε2 [µε]"), &s.strain_2, 1e6));
    cols.push(col(
        format!("{name} angle of ε1 from grid 1 [°]"),
        &s.angle_rad,
        degrees,
    ));
    cols.push(col(
        format!("{name} max shear strain [µε]"),
        &s.max_shear_strain,
        1e6,
    ));
    cols.push(col(format!("{name} σ1 [MPa]"), &s.stress_1_pa, 1e-6));
    cols.push(col(format!("{name} σ2 [MPa]"), &s.stress_2_pa, 1e-6));
}

fn columns(r: &Reduction) -> Vec<Column<'_>> {
    let mut cols = Vec::new();
    for a in &r.applied {
        let header = format!(
            "{}: applied {} [{}]",
            a.part,
            a.component.name(),
            a.component.unit()
        );
        cols.push(col(header, &a.values, 1.0));
    }
    for c in &r.channels {
        cols.push(col(format!("{} [mV/V]", c.bridge), &c.mv_per_v, 1.0));
        cols.push(col(format!("{} strain [µε]", c.bridge), &c.strain, 1e6));
        if let Some(load) = &c.load {
            let header = format!("{} {} [{}]", c.bridge, c.wanted.name(), c.wanted.unit());
            cols.push(col(header, load, 1.0));
        }
        if let Some(p) = &c.predicted_mv_per_v {
            cols.push(col(format!("{} predicted [mV/V]", c.bridge), p, 1.0));
        }
    }
    for ro in &r.rosettes {
        let name = format!("{} {}", ro.part, ro.gauge);
        principal_columns(&mut cols, &name, &ro.measured);
        if let Some(p) = &ro.predicted {
            principal_columns(&mut cols, &format!("{name} predicted"), p);
        }
    }
    for rec in &r.recovered {
        for (c, v) in rec.components.iter().zip(&rec.values) {
            let header = format!("{}: recovered {} [{}]", rec.part, c.name(), c.unit());
            cols.push(col(header, v, 1.0));
        }
    }
    cols
}

fn csv_field(s: &str) -> String {
    if s.contains([',', '"', '\n']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_owned()
    }
}

/// The result file: `time [s]` then every series, one row per sample, each header
/// `name [unit]` as in a log.
pub fn reduction_csv(r: &Reduction) -> String {
    let cols = columns(r);
    let mut out = String::with_capacity(r.time_s.len() * (cols.len() + 1) * 12);
    out.push_str("time [s]");
    for c in &cols {
        out.push(',');
        out.push_str(&csv_field(&c.header));
    }
    out.push('\n');
    for (i, t) in r.time_s.iter().enumerate() {
        let _ = write!(out, "{t}");
        for c in &cols {
            let v = c.values.get(i).copied().unwrap_or(f64::NAN) * c.scale;
            let _ = write!(out, ",{v:.6e}");
        }
        out.push('\n');
    }
    out
}

/// The summary printed by `reduce`.
pub fn reduction_summary(r: &Reduction, fits: &[CalibrationFit]) -> String {
    let mut out = String::new();
    let duration =
        r.time_s.last().copied().unwrap_or(0.0) - r.time_s.first().copied().unwrap_or(0.0);
    let _ = writeln!(
        out,
        "{} samples over {:.1} s; {} channels, {} applied loads, {} rosettes",
        r.time_s.len(),
        duration,
        r.channels.len(),
        r.applied.len(),
        r.rosettes.len()
    );
    channels_text(&mut out, r);
    rosettes_text(&mut out, r);
    recovered_text(&mut out, r);
    calibration_text(&mut out, fits);
    if !r.notes.is_empty() {
        let _ = writeln!(out, "\nNotes:");
        for n in &r.notes {
            let _ = writeln!(out, "  {n}");
        }
    }
    out
}

fn peak(values: &[f64]) -> (usize, f64) {
    values
        .iter()
        .copied()
        .enumerate()
        .max_by(|a, b| a.1.abs().total_cmp(&b.1.abs()))
        .unwrap_or((0, 0.0))
}

fn channels_text(out: &mut String, r: &Reduction) {
    let _ = writeln!(out, "\nChannels:");
    for c in &r.channels {
        let (i, p) = peak(&c.mv_per_v);
        let _ = write!(
            out,
            "  ch{} {} ({}): zero {:.4} mV/V, span ×{:.4} ({}); peak {:.4} mV/V at {:.1} s",
            c.channel,
            c.bridge,
            c.part,
            c.zero_mv_per_v,
            c.span_factor,
            c.span_source,
            p,
            r.time_s.get(i).copied().unwrap_or(0.0)
        );
        if let Some(load) = &c.load {
            let _ = write!(out, " = {}", si(load[i], c.wanted.unit()));
        }
        if let Some(pred) = &c.predicted_mv_per_v {
            let _ = write!(out, "; predicted {:.4} mV/V", pred[i]);
        }
        out.push('\n');
    }
}

fn principal_line(s: &PrincipalSeries, i: usize, orientation_rad: f64) -> String {
    format!(
        "ε1 {:.1} µε, ε2 {:.1} µε, ε1 at {:.1}° from grid 1 ({:.1}° from the part's x axis), \
         max shear {:.1} µε, σ1 {:.1} MPa, σ2 {:.1} MPa",
        s.strain_1[i] * 1e6,
        s.strain_2[i] * 1e6,
        s.angle_rad[i].to_degrees(),
        (s.angle_rad[i] + orientation_rad).to_degrees(),
        s.max_shear_strain[i] * 1e6,
        s.stress_1_pa[i] * 1e-6,
        s.stress_2_pa[i] * 1e-6
    )
}

fn rosettes_text(out: &mut String, r: &Reduction) {
    if r.rosettes.is_empty() {
        return;
    }
    let _ = writeln!(out, "\nRosettes (transverse sensitivity corrected):");
    for ro in &r.rosettes {
        let Some(i) = ro.summary_index() else {
            continue;
        };
        let _ = writeln!(
            out,
            "  {} on {} at its peak ({:.1} s): {}",
            ro.gauge,
            ro.part,
            r.time_s.get(i).copied().unwrap_or(0.0),
            principal_line(&ro.measured, i, ro.orientation_rad)
        );
        if let Some(p) = &ro.predicted {
            let _ = writeln!(
                out,
                "    predicted there: {}",
                principal_line(p, i, ro.orientation_rad)
            );
        }
    }
}

fn recovered_text(out: &mut String, r: &Reduction) {
    if r.recovered.is_empty() {
        return;
    }
    let _ = writeln!(out, "\nLoads recovered from several bridges:");
    for rec in &r.recovered {
        for (c, v) in rec.components.iter().zip(&rec.values) {
            let (i, p) = peak(v);
            let _ = write!(
                out,
                "  {}: {} peak {} at {:.1} s (from {})",
                rec.part,
                c.name(),
                si(p, c.unit()),
                r.time_s.get(i).copied().unwrap_or(0.0),
                rec.bridges.join(", ")
            );
            if let Some(a) = r.applied_load(&rec.part, *c) {
                let _ = write!(out, "; applied {}", si(a.values[i], c.unit()));
            }
            out.push('\n');
        }
    }
}

fn calibration_text(out: &mut String, fits: &[CalibrationFit]) {
    if fits.is_empty() {
        return;
    }
    let _ = writeln!(
        out,
        "\nIn-place calibration (straight line through the load steps):"
    );
    for f in fits {
        let unit = f.wanted.unit();
        let (per, per_u) = f.load_per_mv_per_v();
        let source = match &f.source {
            StepSource::ReferenceColumn(c) => format!("loads from column \"{c}\""),
            StepSource::EnteredSteps => "loads as entered".to_owned(),
        };
        let _ = writeln!(
            out,
            "  {} ({}), {} points, {source}:\n    sensitivity {:.6e} ± {:.1e} mV/V per {unit} \
             (predicted {:.6e}; ratio {:.4} ± {:.4}, standard uncertainties)\n    zero {:.4} ± \
             {:.5} mV/V; {} per mV/V: {} ± {}; nonlinearity {:.3} % of full scale; hysteresis {}",
            f.bridge,
            f.part,
            f.points.len(),
            f.sensitivity,
            f.sensitivity_u,
            f.predicted_sensitivity,
            f.ratio,
            f.ratio_u,
            f.zero_mv_per_v,
            f.zero_u,
            unit,
            si(per, unit),
            si(per_u, unit),
            f.nonlinearity * 100.0,
            match (f.hysteresis, f.hysteresis_u) {
                (Some(h), Some(u)) =>
                    format!("{:.3} ± {:.3} % of full scale", h * 100.0, u * 100.0),
                _ => "not measured (no load met both ways)".to_owned(),
            }
        );
    }
}
