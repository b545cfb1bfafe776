//! The `reduce` and `checkout` subcommands, as functions that return their output and exit
//! status (the same [`CliOutput`] as the plan's subcommands).
//!
//! Exit status: 0 when nothing fails; 1 when a channel fails its check-out (`checkout`) or a
//! calibration could not be fitted (`reduce`); 2 when a file is broken or unreadable, or an
//! output cannot be written.

use std::fmt::Write;
use std::path::Path;

use gw_plan::cli::CliOutput;
use gw_plan::document::Project;
use gw_plan::evaluate::{EvalOptions, Evaluation, evaluate};
use gw_plan::io::load_project;
use gw_plan::safe_write::{Backup, same_file, write_file};

use crate::calibration::{CalibrationError, CalibrationFit, calibrate_all};
use crate::checkout::check_out;
use crate::log::read_log_file;
use crate::records_csv::{read_records_file, records_template};
use crate::reduction::{ReduceOptions, Reduction, reduce};
use crate::report::{ReportInput, report_pdf};
use crate::report_text::{reduction_csv, reduction_summary};

fn failed(stderr: String) -> CliOutput {
    CliOutput {
        code: 2,
        stdout: String::new(),
        stderr,
    }
}

/// The plan and its evaluation, with records from `records` in place of the project's own when
/// given.
fn plan_with_records(
    plan: &Path,
    records: Option<&Path>,
) -> Result<(Project, Evaluation), CliOutput> {
    let mut project = load_project(plan).map_err(|e| {
        failed(match e {
            gw_plan::PlanError::Io { .. } => format!("error: {e}\n"),
            _ => format!("error: {}: {e}\n", plan.display()),
        })
    })?;
    if let Some(path) = records {
        project.records = read_records_file(path, &project)
            .map_err(|e| failed(format!("error: {}: {e}\n", path.display())))?;
    }
    let ev = evaluate(&project, &EvalOptions::default());
    Ok((project, ev))
}

/// `gaugewright checkout PLAN [RECORDS.csv] [--template OUT.csv]`: the verdict of every
/// channel from the records (the file's, or the project's own when none is given); status 1
/// when a channel fails. With `template`, writes the records template to fill in instead.
pub fn checkout(plan: &Path, records: Option<&Path>, template: Option<&Path>) -> CliOutput {
    let (project, ev) = match plan_with_records(plan, records) {
        Ok(x) => x,
        Err(out) => return out,
    };
    if let Some(out) = template {
        if same_file(out, plan) || records.is_some_and(|r| same_file(out, r)) {
            return failed(format!(
                "error: {}: is a file being read; choose another name for the template\n",
                out.display()
            ));
        }
        return match write_file(
            out,
            records_template(&project, &ev).as_bytes(),
            Backup::Replace,
        ) {
            Ok(()) => CliOutput {
                code: 0,
                stdout: format!(
                    "wrote the check-out records template to {}\n",
                    out.display()
                ),
                stderr: String::new(),
            },
            Err(e) => failed(format!("error: {e}\n")),
        };
    }
    let result = check_out(&project, &ev);
    let mut stdout = result.text();
    if result.is_unrecorded() {
        stdout.push_str(
            "\nNothing recorded yet: write the template with --template, fill it in, and give \
             it as RECORDS.\n",
        );
    }
    CliOutput {
        code: if result.has_failures() { 1 } else { 0 },
        stdout,
        stderr: String::new(),
    }
}

/// What `reduce` writes.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ReduceFormat {
    /// One row per sample, one column per series, units in the headers.
    Csv,
    /// Everything (series, rosettes, recovered loads, calibration fits) as JSON.
    Json,
}

/// The files `reduce` reads and writes.
#[derive(Debug, Clone, Copy)]
pub struct ReduceFiles<'a> {
    /// Project file.
    pub plan: &'a Path,
    /// The logged test.
    pub data: &'a Path,
    /// Result file.
    pub out: &'a Path,
    /// Records to use instead of the project's own.
    pub records: Option<&'a Path>,
    /// Report PDF to write beside the result.
    pub report: Option<&'a Path>,
}

/// `gaugewright reduce PLAN DATA.csv -o RESULT.csv [--json] [--records RECORDS.csv]
/// [--report REPORT.pdf]`: reduces the log against the plan, writes the result (and the
/// report) and prints a summary.
pub fn reduce_command(
    files: &ReduceFiles<'_>,
    format: ReduceFormat,
    options: &ReduceOptions,
) -> CliOutput {
    let inputs = [Some(files.plan), Some(files.data), files.records];
    for out in std::iter::once(files.out).chain(files.report) {
        if inputs.iter().flatten().any(|input| same_file(out, input)) {
            return failed(format!(
                "error: {}: is a file being read; writing there would destroy it. Choose another \
                 name for the output\n",
                out.display()
            ));
        }
    }
    if files.report.is_some_and(|r| same_file(r, files.out)) {
        return failed(format!(
            "error: {}: the result and the report cannot be the same file\n",
            files.out.display()
        ));
    }
    let (project, ev) = match plan_with_records(files.plan, files.records) {
        Ok(x) => x,
        Err(o) => return o,
    };
    let log = match read_log_file(files.data) {
        Ok(l) => l,
        Err(e) => return failed(format!("error: {e}\n{}", records_hint(files.data))),
    };
    let reduction = match reduce(&project, &ev, &log, options) {
        Ok(r) => r,
        Err(e) => return failed(format!("error: {}: {e}\n", files.data.display())),
    };
    let (fits, fit_errors) = calibrate_all(&project, &ev, &reduction);
    if let Err(e) = write_result(files.out, format, &reduction, &fits, &fit_errors) {
        return failed(e);
    }
    let mut stdout = reduction_summary(&reduction, &fits);
    if let Some(path) = files.report {
        let input = ReportInput {
            project: &project,
            ev: &ev,
            checkout: &check_out(&project, &ev),
            reduction: Some(&reduction),
            fits: &fits,
            log_name: &files.data.display().to_string(),
        };
        let written = report_pdf(&input)
            .and_then(|bytes| write_file(path, &bytes, Backup::Replace).map_err(|e| e.to_string()));
        match written {
            Ok(()) => {
                let _ = writeln!(stdout, "wrote the report to {}", path.display());
            }
            Err(e) => return failed(format!("error: {}: {e}\n", path.display())),
        }
    }
    let mut stderr = String::new();
    for e in &fit_errors {
        let _ = writeln!(stderr, "calibration: {e}");
    }
    let _ = writeln!(
        stdout,
        "\nwrote {} samples to {}",
        reduction.time_s.len(),
        files.out.display()
    );
    CliOutput {
        code: if fit_errors.is_empty() { 0 } else { 1 },
        stdout,
        stderr,
    }
}

/// A hint when the file given as the log looks like a check-out records file.
fn records_hint(data: &Path) -> String {
    let first = std::fs::read_to_string(data)
        .ok()
        .and_then(|t| t.lines().next().map(str::to_owned))
        .unwrap_or_default();
    if first.trim_start_matches('\u{feff}').starts_with("kind,") {
        "hint: this looks like a check-out records file; give it with --records, and the test \
         log as DATA\n"
            .to_owned()
    } else {
        String::new()
    }
}

/// Writes the result file: one row per sample, or everything as JSON.
fn write_result(
    out: &Path,
    format: ReduceFormat,
    reduction: &Reduction,
    fits: &[CalibrationFit],
    fit_errors: &[CalibrationError],
) -> Result<(), String> {
    let body = match format {
        ReduceFormat::Csv => reduction_csv(reduction),
        ReduceFormat::Json => {
            let problems: Vec<String> = fit_errors.iter().map(|e| e.to_string()).collect();
            let value = serde_json::json!({
                "reduction": reduction,
                "calibrations": fits,
                "calibration_problems": problems,
            });
            serde_json::to_string(&value)
                .map(|s| s + "\n")
                .map_err(|e| format!("error: could not write JSON: {e}\n"))?
        }
    };
    write_file(out, body.as_bytes(), Backup::Replace).map_err(|e| format!("error: {e}\n"))
}
