//! The command-line subcommands, as functions that return their output and exit status so
//! they can be tested without a process.
//!
//! Exit status of every subcommand: 0 when nothing fails, 1 when a margin fails or something
//! could not be computed (the output is still complete), 2 when the project file is broken or
//! unreadable, or an output file cannot be written.
//!
//! The human summaries and the build sheet speak the unit system asked for (SI unless told);
//! the JSON of `eval --json` and the channel list's SI columns stay SI.

use std::fmt::Write;
use std::path::Path;

use crate::demo::demo_project;
use crate::document::Project;
use crate::evaluate::{
    BridgeEvaluation, EvalOptions, Evaluation, Severity, UncertaintyDepth, evaluate,
};
use crate::io::{PlanError, load_project, save_project};
use crate::sheet::finding_text;
use crate::units::{Quantity, Units, fixed_text, microstrain};

/// What a subcommand prints and returns.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct CliOutput {
    /// Exit status: 0 fine, 1 a margin fails, 2 the file is broken or unreadable.
    pub code: i32,
    /// Standard output.
    pub stdout: String,
    /// Standard error.
    pub stderr: String,
}

fn broken(path: &Path, e: &PlanError) -> CliOutput {
    // A file error already names its file.
    let stderr = match e {
        PlanError::Io { .. } => format!("error: {e}\n"),
        _ => format!("error: {}: {e}\n", path.display()),
    };
    CliOutput {
        code: 2,
        stdout: String::new(),
        stderr,
    }
}

/// Microstrain text.
fn ue(strain: f64) -> String {
    microstrain(strain)
}

/// `gaugewright check FILE`: validates and prints margins and warnings in SI; status 1 when
/// any margin fails.
pub fn check(path: &Path) -> CliOutput {
    check_in(path, Units::Si)
}

/// `gaugewright check FILE --units …`: as [`check`], every figure in `units`.
pub fn check_in(path: &Path, units: Units) -> CliOutput {
    let project = match load_project(path) {
        Ok(p) => p,
        Err(e) => return broken(path, &e),
    };
    // With the GUM budgets: a required accuracy is checked with the expanded uncertainty, as
    // in the app, `eval` and on the build sheet.
    let ev = evaluate(&project, &EvalOptions::default());
    summary_output(&project, &ev, Detail::Margins, units)
}

/// The human summary of an evaluation, with the closing verdict, and its exit status.
fn summary_output(project: &Project, ev: &Evaluation, detail: Detail, units: Units) -> CliOutput {
    let mut out = String::new();
    let _ = writeln!(out, "{} — {} part(s)", project.name, project.parts.len());
    write_summary(&mut out, ev, detail, units);
    let code = status(ev);
    let _ = writeln!(
        out,
        "\n{}",
        if code == 0 {
            "No margin fails. This is a planning result, not a certification of safety."
        } else {
            "AT LEAST ONE MARGIN FAILS OR SOMETHING COULD NOT BE COMPUTED — see above."
        }
    );
    CliOutput {
        code,
        stdout: out,
        stderr: String::new(),
    }
}

/// 1 when a margin fails or something could not be computed, else 0.
fn status(ev: &Evaluation) -> i32 {
    if ev.has_failures() { 1 } else { 0 }
}

/// How much the human summary says about each bridge.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Detail {
    /// Readings per load case, margins and the shunt check (`check`).
    Margins,
    /// Also the instrument settings, rejection of unwanted loads, the signal chain and the
    /// uncertainty budget when computed (`eval`).
    Everything,
}

fn write_summary(out: &mut String, ev: &Evaluation, detail: Detail, units: Units) {
    let stress = |pa: f64| units.format_stress(pa);
    for part in &ev.parts {
        let _ = writeln!(out, "\n{} ({})", part.name, part.kind);
        for c in &part.cases {
            let _ = writeln!(
                out,
                "  {}: peak von Mises {} {}, {}",
                c.case,
                stress(c.peak_von_mises_pa),
                c.peak_location_text(units),
                c.yield_words()
            );
            if let (Some(membrane), Some(outer)) = (c.membrane_hoop_pa, c.outer_hoop_pa) {
                let _ = writeln!(
                    out,
                    "    hoop stress {} at the mean radius (membrane, the design figure), \
                     {} on the outer surface where the gauges read",
                    stress(membrane),
                    stress(outer)
                );
            }
        }
        write_bridges(out, part, detail, units);
    }
    write_findings_and_cautions(out, ev, units);
}

/// Each bridge of a part: settings (with `Detail::Everything`), readings, margins, accuracy,
/// the shunt check, and with `Detail::Everything` rejection, noise and uncertainty.
fn write_bridges(
    out: &mut String,
    part: &crate::evaluate::PartEvaluation,
    detail: Detail,
    units: Units,
) {
    for b in &part.bridges {
        let _ = writeln!(
            out,
            "  bridge \"{}\" ({}), measures {}",
            b.name,
            b.arrangement,
            b.wanted.name()
        );
        if detail == Detail::Everything {
            write_settings(out, b);
        }
        for c in &b.cases {
            let _ = writeln!(
                out,
                "    {}: {} mV/V, displays {}, target {}",
                c.case,
                fixed_text(c.reading.mv_per_v, 4),
                ue(c.reading.displayed_strain),
                ue(c.reading.target_strain)
            );
            for m in &c.margins {
                let _ = writeln!(
                    out,
                    "      {:<42} {:>6.1} %  {}",
                    m.kind.name(),
                    m.utilisation * 100.0,
                    m.status.word()
                );
            }
            if let Some(a) = b.accuracy.iter().find(|a| a.case == c.case) {
                let _ = writeln!(out, "        {}", a.describe(b.wanted, units));
            }
        }
        if let Some(s) = &b.shunt {
            let _ = writeln!(
                out,
                "    shunt {:.0} Ω across arm {}: expect {}",
                s.e96_ohm,
                s.arm + 1,
                ue(s.expected_reading_strain)
            );
        }
        if detail == Detail::Everything {
            write_rejection_and_noise(out, b, units);
            write_uncertainty(out, b, units);
        }
    }
}

/// The findings and cautions after the parts.
fn write_findings_and_cautions(out: &mut String, ev: &Evaluation, units: Units) {
    if !ev.findings.is_empty() {
        let _ = writeln!(out, "\nFindings:");
        for f in &ev.findings {
            let word = match f.severity {
                Severity::Error => "ERROR",
                Severity::Fail => "FAIL",
                Severity::Warn => "warn",
            };
            let _ = writeln!(out, "  {word}: {}", finding_text(f, units));
        }
    }
    if !ev.cautions.is_empty() {
        let _ = writeln!(out, "\nCautions:");
        for c in &ev.cautions {
            let _ = writeln!(out, "  {}: {}", c.title, c.text);
        }
    }
}

/// Instrument settings of one bridge, on one line.
fn write_settings(out: &mut String, b: &BridgeEvaluation) {
    let _ = writeln!(
        out,
        "    channel {}, excitation {:.2} V, gauge factor {:.3}, bridge factor {:.3}, {}",
        b.channel_number, b.excitation_v, b.gauge_factor_setting, b.bridge_factor, b.wiring
    );
}

/// Rejection of unwanted loads, noise and resolution, the zero band and the conversion to the
/// wanted load's unit.
fn write_rejection_and_noise(out: &mut String, b: &BridgeEvaluation, units: Units) {
    if !b.rejection.is_empty() {
        let list: Vec<String> = b
            .rejection
            .iter()
            .map(|r| {
                // Evaluation caps the figure at 200 dB where the arrangement cancels exactly.
                if r.rejection_db >= 200.0 {
                    format!("{} completely", r.component.name())
                } else {
                    format!("{} by {:.0} dB", r.component.name(), r.rejection_db)
                }
            })
            .collect();
        let _ = writeln!(out, "    rejects {}", list.join(", "));
    }
    let _ = writeln!(
        out,
        "    noise {} rms, resolution {} per count",
        ue_small(b.channel.noise_strain_rms),
        ue_small(b.channel.resolution_strain),
    );
    let z = &b.zero_band;
    let _ = writeln!(
        out,
        "    zero at no load {} mV/V: ± {} mV/V from resistance tolerances (k = {}), \
         {} to {} mV/V at worst",
        fixed_text(z.centre_mv_per_v, 4),
        fixed_text(z.statistical_mv_per_v, 4),
        z.coverage_k,
        fixed_text(z.worst_low_mv_per_v, 4),
        fixed_text(z.worst_high_mv_per_v, 4)
    );
    if let Some(note) = z.note() {
        let _ = writeln!(out, "    {note}");
    }
    if let Some(f) = b.wanted_per_mv_per_v {
        let _ = writeln!(
            out,
            "    {} per mV/V: {}",
            b.wanted.name(),
            units.format_difference(Quantity::of(b.wanted), f)
        );
    }
}

/// The uncertainty of the wanted load inferred from the reading, when it was computed.
fn write_uncertainty(out: &mut String, b: &BridgeEvaluation, units: Units) {
    let Some(u) = &b.uncertainty else { return };
    let q = Quantity::of(b.wanted);
    let value = |v: f64| units.format(q, v);
    let case = b.uncertainty_case.as_deref().unwrap_or("—");
    let _ = writeln!(
        out,
        "    uncertainty at \"{case}\": {} ± {} (GUM, {:.0} % coverage)",
        value(u.gum.value),
        units.format_difference(q, u.gum.expanded),
        u.gum.coverage_probability * 100.0
    );
    let _ = writeln!(out, "      {}", u.gum.coverage_text());
    if let Some(top) = u.gum.rows.first() {
        let _ = writeln!(out, "      largest contribution: {}", top.name);
    }
    // Without --monte-carlo the propagation runs one trial, which gives no interval.
    let mc = &u.monte_carlo;
    if mc.trials > 1 {
        let _ = writeln!(
            out,
            "      Monte Carlo, {} trials: 95 % interval {} to {}",
            mc.trials,
            value(mc.interval_95.0),
            value(mc.interval_95.1)
        );
    }
}

/// Microstrain text with three significant figures, for noise and resolution (often far
/// below 1 µε).
fn ue_small(strain: f64) -> String {
    let ue = strain * 1e6;
    let decimals = if ue == 0.0 || !ue.is_finite() {
        1
    } else {
        (2 - ue.abs().log10().floor() as i32).clamp(0, 9) as usize
    };
    format!("{ue:.decimals$} µε")
}

fn load_and_evaluate(path: &Path, monte_carlo: bool) -> Result<(Project, Evaluation), CliOutput> {
    let project = load_project(path).map_err(|e| broken(path, &e))?;
    let options = EvalOptions {
        uncertainty: if monte_carlo {
            UncertaintyDepth::GumAndMonteCarlo
        } else {
            UncertaintyDepth::Gum
        },
        ..EvalOptions::default()
    };
    let ev = evaluate(&project, &options);
    Ok((project, ev))
}

/// `gaugewright eval FILE`: the human summary of every bridge (settings, readings per load
/// case in mV/V and displayed µε, margins, rejection, noise, uncertainty), then findings and
/// cautions, in SI. Status as for [`check`].
pub fn eval_summary(path: &Path, monte_carlo: bool) -> CliOutput {
    eval_summary_in(path, monte_carlo, Units::Si)
}

/// `gaugewright eval FILE --units …`: as [`eval_summary`], every figure in `units`.
pub fn eval_summary_in(path: &Path, monte_carlo: bool, units: Units) -> CliOutput {
    match load_and_evaluate(path, monte_carlo) {
        Ok((project, ev)) => summary_output(&project, &ev, Detail::Everything, units),
        Err(out) => out,
    }
}

/// `gaugewright eval FILE --json`: every computed figure as JSON, in SI units whatever the
/// display units (m, N, N·m, Pa, °C, strain as a ratio).
pub fn eval_json(path: &Path, monte_carlo: bool) -> CliOutput {
    let ev = match load_and_evaluate(path, monte_carlo) {
        Ok((_, ev)) => ev,
        Err(out) => return out,
    };
    match serde_json::to_string_pretty(&ev) {
        Ok(json) => CliOutput {
            code: status(&ev),
            stdout: json + "\n",
            stderr: String::new(),
        },
        Err(e) => CliOutput {
            code: 2,
            stdout: String::new(),
            stderr: format!("error: could not write the evaluation as JSON: {e}\n"),
        },
    }
}

/// `gaugewright demo OUT [--force]`: writes the bundled demo project; an existing project at
/// OUT is replaced only with `force` (and then kept as its backup).
pub fn write_demo(path: &Path, force: bool) -> CliOutput {
    write_example(path, &demo_project(), "the demo project", force)
}

/// `gaugewright demo --gallery OUT [--force]`: one part of every model kind and beam section.
pub fn write_gallery(path: &Path, force: bool) -> CliOutput {
    write_example(
        path,
        &crate::gallery::model_gallery(),
        "the model gallery",
        force,
    )
}

/// A refusal to write over a file the user may need, with the way out.
fn refused(path: &Path, why: &str) -> CliOutput {
    CliOutput {
        code: 2,
        stdout: String::new(),
        stderr: format!("error: {}: {why}\n", path.display()),
    }
}

/// Refuses an output that is the input itself (always) or an existing project (unless
/// `force`).
fn guard_output(out: &Path, input: Option<&Path>, force: bool) -> Option<CliOutput> {
    use crate::safe_write::{holds_a_project, same_file};
    if input.is_some_and(|i| same_file(out, i)) {
        return Some(refused(
            out,
            "is the project being read; writing there would destroy it. Choose another file name",
        ));
    }
    if !force && holds_a_project(out) {
        return Some(refused(
            out,
            "is an existing project; writing there would replace it. Choose another file name, \
             or add --force to replace it (the old file is kept as its .bak)",
        ));
    }
    None
}

fn write_example(path: &Path, project: &crate::Project, what: &str, force: bool) -> CliOutput {
    if let Some(no) = guard_output(path, None, force) {
        return no;
    }
    match save_project(project, path) {
        Ok(()) => CliOutput {
            code: 0,
            stdout: format!("wrote {what} to {}\n", path.display()),
            stderr: String::new(),
        },
        Err(e) => broken(path, &e),
    }
}

/// `gaugewright sheet FILE -o OUT.pdf [--csv OUT.csv] [--force]`: the build sheet and channel
/// list, in SI. Neither may be the project itself, nor (without `force`) another project, nor
/// the same file as each other.
pub fn sheet(path: &Path, pdf: &Path, csv: Option<&Path>, force: bool) -> CliOutput {
    sheet_in(path, pdf, csv, force, Units::Si)
}

/// `gaugewright sheet … --units …`: as [`sheet`], the sheet and the channel list's wanted load
/// per mV/V in `units`.
pub fn sheet_in(
    path: &Path,
    pdf: &Path,
    csv: Option<&Path>,
    force: bool,
    units: Units,
) -> CliOutput {
    for out in std::iter::once(pdf).chain(csv) {
        if let Some(no) = guard_output(out, Some(path), force) {
            return no;
        }
    }
    if csv.is_some_and(|c| crate::safe_write::same_file(c, pdf)) {
        return refused(
            pdf,
            "is given for both the build sheet (-o) and the channel list (--csv); give each its own file",
        );
    }
    let project = match load_project(path) {
        Ok(p) => p,
        Err(e) => return broken(path, &e),
    };
    let ev = evaluate(&project, &EvalOptions::default());
    let mut stdout = String::new();
    match crate::sheet::build_sheet_pdf_in(&project, &ev, units) {
        Ok(bytes) => {
            let written =
                crate::safe_write::write_file(pdf, &bytes, crate::safe_write::Backup::Replace);
            if let Err(e) = written {
                return CliOutput {
                    code: 2,
                    stdout,
                    stderr: format!("error: {e}\n"),
                };
            }
            let _ = writeln!(stdout, "wrote the build sheet to {}", pdf.display());
        }
        Err(e) => {
            return CliOutput {
                code: 2,
                stdout,
                stderr: format!("error: {e}\n"),
            };
        }
    }
    if let Some(csv) = csv {
        let text = crate::channel_list::channel_list_csv_in(&ev, units);
        let written =
            crate::safe_write::write_file(csv, text.as_bytes(), crate::safe_write::Backup::Replace);
        if let Err(e) = written {
            return CliOutput {
                code: 2,
                stdout,
                stderr: format!("error: {e}\n"),
            };
        }
        let _ = writeln!(stdout, "wrote the channel list to {}", csv.display());
    }
    if ev.has_failures() {
        let _ = writeln!(
            stdout,
            "AT LEAST ONE MARGIN FAILS — the sheet says so on its first page."
        );
    }
    CliOutput {
        code: if ev.has_failures() { 1 } else { 0 },
        stdout,
        stderr: String::new(),
    }
}

#[cfg(test)]
mod tests {
    use super::ue_small;
    use gw_bridge::units::si;

    #[test]
    fn si_picks_a_prefix_and_keeps_four_significant_figures() {
        assert_eq!(si(12_345.0, "N"), "12.35 kN");
        assert_eq!(si(-3.2e6, "Pa"), "-3.200 MPa");
        assert_eq!(si(0.5, "N·m"), "500.0 mN·m");
        assert_eq!(si(250.0, "N/m"), "250.0 N/m");
        assert_eq!(si(0.0, "N"), "0.000 N");
    }

    #[test]
    fn si_leaves_temperatures_and_plain_numbers_unprefixed() {
        assert_eq!(si(1500.0, "°C"), "1500.0 °C");
        assert_eq!(si(0.75, ""), "0.750");
    }

    #[test]
    fn the_summary_speaks_the_units_asked_for() {
        use crate::units::Units;
        let dir = std::env::temp_dir().join(format!("gw-cli-units-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let path = dir.join("demo.ron");
        assert_eq!(super::write_demo(&path, true).code, 0);
        let us = super::eval_summary_in(&path, false, Units::UsCustomary);
        let si = super::eval_summary(&path, false);
        assert_eq!((us.code, si.code), (0, 0));
        // The shell's hoop stress on the outer surface: the same figure, once in MPa and once
        // in ksi (1 ksi = 6.894 757 MPa, NIST SP 811 Appendix B).
        let hoop = |text: &str, unit: &str| -> f64 {
            let line = text.lines().find(|l| l.contains("hoop stress")).unwrap();
            let before = line.split(&format!(" {unit} on the outer")).next().unwrap();
            before.rsplit(' ').next().unwrap().parse().unwrap()
        };
        let (mpa, ksi) = (hoop(&si.stdout, "MPa"), hoop(&us.stdout, "ksi"));
        assert!(
            (mpa / 6.894_757 - ksi).abs() < 2e-3 * ksi,
            "{mpa} MPa, {ksi} ksi"
        );
        assert!(!us.stdout.contains("MPa") && !us.stdout.contains(" mm"));
        let _ = std::fs::remove_dir_all(&dir);
    }

    #[test]
    fn small_microstrain_keeps_three_significant_figures() {
        assert_eq!(ue_small(2.34e-8), "0.0234 µε");
        assert_eq!(ue_small(1.2e-10), "0.000120 µε");
        assert_eq!(ue_small(3.456e-6), "3.46 µε");
        assert_eq!(ue_small(0.0), "0.0 µε");
    }
}
