//! The command-line subcommands, as functions that return their output and exit status so
//! they can be tested without a process.

use std::fmt::Write;
use std::path::Path;

use crate::demo::demo_project;
use crate::evaluate::{EvalOptions, Evaluation, Severity, UncertaintyDepth, evaluate};
use crate::io::{PlanError, load_project, save_project};

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
    CliOutput {
        code: 2,
        stdout: String::new(),
        stderr: format!("error: {}: {e}\n", path.display()),
    }
}

/// Microstrain text.
fn ue(strain: f64) -> String {
    format!("{:.1} µε", strain * 1e6)
}

/// `gaugewright check FILE`: validates and prints margins and warnings; status 1 when any
/// margin fails.
pub fn check(path: &Path) -> CliOutput {
    let project = match load_project(path) {
        Ok(p) => p,
        Err(e) => return broken(path, &e),
    };
    let options = EvalOptions {
        uncertainty: UncertaintyDepth::Off,
        ..EvalOptions::default()
    };
    let ev = evaluate(&project, &options);
    let mut out = String::new();
    let _ = writeln!(out, "{} — {} part(s)", project.name, project.parts.len());
    write_summary(&mut out, &ev);
    let code = if ev.has_failures() { 1 } else { 0 };
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

fn write_summary(out: &mut String, ev: &Evaluation) {
    for part in &ev.parts {
        let _ = writeln!(out, "\n{} ({})", part.name, part.kind);
        for c in &part.cases {
            let _ = writeln!(
                out,
                "  {}: peak von Mises {:.1} MPa, {:.2} × below yield",
                c.case,
                c.peak_von_mises_pa / 1e6,
                c.safety_factor_to_yield
            );
        }
        for b in &part.bridges {
            let _ = writeln!(
                out,
                "  bridge \"{}\" ({}), measures {}",
                b.name,
                b.arrangement,
                b.wanted.name()
            );
            for c in &b.cases {
                let _ = writeln!(
                    out,
                    "    {}: {:.4} mV/V, displays {}, target {}",
                    c.case,
                    c.reading.mv_per_v,
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
        }
    }
    if !ev.findings.is_empty() {
        let _ = writeln!(out, "\nFindings:");
        for f in &ev.findings {
            let word = match f.severity {
                Severity::Error => "ERROR",
                Severity::Fail => "FAIL",
                Severity::Warn => "warn",
            };
            let _ = writeln!(out, "  {word}: {}", f.message);
        }
    }
    if !ev.cautions.is_empty() {
        let _ = writeln!(out, "\nCautions:");
        for c in &ev.cautions {
            let _ = writeln!(out, "  {}: {}", c.title, c.text);
        }
    }
}

/// `gaugewright eval FILE --json`: every computed figure as JSON.
pub fn eval_json(path: &Path, monte_carlo: bool) -> CliOutput {
    let project = match load_project(path) {
        Ok(p) => p,
        Err(e) => return broken(path, &e),
    };
    let options = EvalOptions {
        uncertainty: if monte_carlo {
            UncertaintyDepth::GumAndMonteCarlo
        } else {
            UncertaintyDepth::Gum
        },
        ..EvalOptions::default()
    };
    let ev = evaluate(&project, &options);
    match serde_json::to_string_pretty(&ev) {
        Ok(json) => CliOutput {
            code: if ev.has_failures() { 1 } else { 0 },
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

/// `gaugewright demo OUT`: writes the bundled demo project.
pub fn write_demo(path: &Path) -> CliOutput {
    match save_project(&demo_project(), path) {
        Ok(()) => CliOutput {
            code: 0,
            stdout: format!("wrote the demo project to {}\n", path.display()),
            stderr: String::new(),
        },
        Err(e) => broken(path, &e),
    }
}

/// `gaugewright sheet FILE -o OUT.pdf [--csv OUT.csv]`: the build sheet and channel list.
pub fn sheet(path: &Path, pdf: &Path, csv: Option<&Path>) -> CliOutput {
    let project = match load_project(path) {
        Ok(p) => p,
        Err(e) => return broken(path, &e),
    };
    let ev = evaluate(&project, &EvalOptions::default());
    let mut stdout = String::new();
    match crate::sheet::build_sheet_pdf(&project, &ev) {
        Ok(bytes) => {
            if let Err(e) = std::fs::write(pdf, bytes) {
                return CliOutput {
                    code: 2,
                    stdout,
                    stderr: format!("error: could not write {}: {e}\n", pdf.display()),
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
        if let Err(e) = std::fs::write(csv, crate::channel_list::channel_list_csv(&ev)) {
            return CliOutput {
                code: 2,
                stdout,
                stderr: format!("error: could not write {}: {e}\n", csv.display()),
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
