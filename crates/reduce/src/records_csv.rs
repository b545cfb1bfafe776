//! The check-out records as CSV: a template written from the plan (one row per grid and per
//! bridge, with the expected values filled in and the measured columns empty), and the reader
//! that takes the filled-in file back into the project.
//!
//! Columns, by header name (any order; columns whose name starts with `expected` or `planned`,
//! and `part` and `note`, are for the reader of the sheet and are not read back):
//! - `kind`: `grid` or `bridge`;
//! - `item`: gauge id (grid rows) or bridge name (bridge rows); `grid`: grid number, 1-based;
//! - grid rows: `serial`, `resistance_ohm`, `insulation_gohm`;
//! - bridge rows: `lead_ohm` (one conductor), `insulation_gohm`, `zero_mv_per_v`,
//!   `zero_again_mv_per_v` (after warm-up), `shunt_microstrain` (the step as displayed),
//!   `known_load_steps` (loads applied in the first test, in the SI unit of the bridge's wanted
//!   load, separated by spaces or semicolons);
//! - both: `date`, `initials`.
//!
//! An empty cell means "not measured". Lines are counted as a text editor counts them.

use std::fmt::Write;
use std::path::Path;

use gw_plan::document::Project;
use gw_plan::evaluate::Evaluation;
use gw_plan::installation::InstallationRecords;

/// Header of the template, in order.
pub const HEADER: [&str; 18] = [
    "kind",
    "part",
    "item",
    "grid",
    "expected_resistance",
    "serial",
    "resistance_ohm",
    "insulation_gohm",
    "planned_lead_ohm",
    "lead_ohm",
    "expected_zero_mv_per_v",
    "zero_mv_per_v",
    "zero_again_mv_per_v",
    "expected_shunt_microstrain",
    "shunt_microstrain",
    "known_load_steps",
    "date",
    "initials",
];

/// A problem with a records file, naming the line and the way out.
#[derive(Debug, thiserror::Error)]
pub enum RecordsError {
    /// The file could not be read.
    #[error("could not read {path}: {source}")]
    Io {
        /// The file.
        path: String,
        /// Why.
        source: std::io::Error,
    },
    /// The CSV itself is malformed.
    #[error("line {line}: {why}")]
    Malformed {
        /// Line in the file.
        line: u64,
        /// What is wrong.
        why: String,
    },
    /// A required column is missing.
    #[error(
        "the header has no \"{column}\" column: is this a check-out records file? Start from the \
         records template (File › Write check-out records template…, or `gaugewright checkout \
         PLAN --template OUT.csv`)"
    )]
    MissingColumn {
        /// The column.
        column: &'static str,
    },
    /// A cell holds something that is not a value.
    #[error(
        "line {line}, column \"{column}\": \"{text}\" is not a number; write a plain number (a decimal point, no unit) or leave the cell empty"
    )]
    NotNumber {
        /// Line in the file.
        line: u64,
        /// Column name.
        column: String,
        /// The text found.
        text: String,
    },
    /// A row names something the plan does not hold.
    #[error("line {line}: {why}")]
    Unknown {
        /// Line in the file.
        line: u64,
        /// What was not found, and the names that exist.
        why: String,
    },
}

fn field(s: &str) -> String {
    if s.contains([',', '"', '\n']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_owned()
    }
}

/// The template: every grid and bridge of the plan with its expected values, the measured
/// columns empty (or filled from records already in the project).
pub fn records_template(project: &Project, ev: &Evaluation) -> String {
    let mut out = HEADER.join(",");
    out.push('\n');
    let r = &project.records;
    let num = |v: Option<f64>, scale: f64, digits: usize| {
        v.map(|x| format!("{:.digits$}", x * scale))
            .unwrap_or_default()
    };
    for part in &project.parts {
        for g in project.placed_gauges(part) {
            for e in 1..=g.element_count() {
                let rec = r.grid(&g.id, e);
                let _ = writeln!(
                    out,
                    "grid,{},{},{},{:.1} Ω ± {:.2} %,{},{},{},,,,,,,,,{},{}",
                    field(&part.name),
                    field(&g.id),
                    e,
                    g.spec.resistance_ohm,
                    g.spec.resistance_tolerance * 100.0,
                    field(&rec.map(|x| x.serial.clone()).unwrap_or_default()),
                    num(rec.and_then(|x| x.resistance_ohm), 1.0, 2),
                    num(rec.and_then(|x| x.insulation_ohm), 1e-9, 2),
                    field(&rec.map(|x| x.date.clone()).unwrap_or_default()),
                    field(&rec.map(|x| x.initials.clone()).unwrap_or_default()),
                );
            }
        }
    }
    for (part, plan, be) in crate::checkout::evaluated_bridges(project, ev) {
        let rec = r.bridge(&plan.name);
        let z = &be.zero_band;
        let steps = rec
            .map(|x| {
                x.known_load_steps
                    .iter()
                    .map(|v| format!("{v}"))
                    .collect::<Vec<_>>()
                    .join(" ")
            })
            .unwrap_or_default();
        let _ = writeln!(
            out,
            "bridge,{},{},,,,,{},{:.3},{},{},{},{},{},{},{},{},{}",
            field(&part.name),
            field(&plan.name),
            num(rec.and_then(|x| x.insulation_ohm), 1e-9, 2),
            plan.lead.length_m * plan.lead.ohm_per_m,
            num(rec.and_then(|x| x.lead_ohm), 1.0, 3),
            field(&format!(
                "{:.4} ({:.4} to {:.4})",
                z.centre_mv_per_v, z.worst_low_mv_per_v, z.worst_high_mv_per_v
            )),
            num(rec.and_then(|x| x.zero_mv_per_v), 1.0, 4),
            num(rec.and_then(|x| x.zero_again_mv_per_v), 1.0, 4),
            be.shunt
                .as_ref()
                .map(|s| format!("{:.1}", s.expected_reading_strain * 1e6))
                .unwrap_or_default(),
            num(rec.and_then(|x| x.shunt_step_strain), 1e6, 1),
            steps,
            field(&rec.map(|x| x.date.clone()).unwrap_or_default()),
            field(&rec.map(|x| x.initials.clone()).unwrap_or_default()),
        );
    }
    out
}

/// Reads a filled-in records file against the plan (names are checked against it).
pub fn read_records_file(
    path: &Path,
    project: &Project,
) -> Result<InstallationRecords, RecordsError> {
    let text = std::fs::read_to_string(path).map_err(|source| RecordsError::Io {
        path: path.display().to_string(),
        source,
    })?;
    read_records(&text, project)
}

/// The columns the reader looks up, by position in the file's header.
struct Columns {
    kind: usize,
    item: usize,
    grid: Option<usize>,
    named: Vec<(&'static str, usize)>,
}

impl Columns {
    fn of(header: &csv::StringRecord) -> Result<Self, RecordsError> {
        let find = |name: &str| {
            header
                .iter()
                .position(|h| h.trim().eq_ignore_ascii_case(name))
        };
        let kind = find("kind").ok_or(RecordsError::MissingColumn { column: "kind" })?;
        let item = find("item").ok_or(RecordsError::MissingColumn { column: "item" })?;
        let named = [
            "serial",
            "resistance_ohm",
            "insulation_gohm",
            "lead_ohm",
            "zero_mv_per_v",
            "zero_again_mv_per_v",
            "shunt_microstrain",
            "known_load_steps",
            "date",
            "initials",
        ]
        .into_iter()
        .filter_map(|n| find(n).map(|i| (n, i)))
        .collect();
        Ok(Self {
            kind,
            item,
            grid: find("grid"),
            named,
        })
    }

    fn text<'r>(&self, row: &'r csv::StringRecord, name: &str) -> &'r str {
        self.named
            .iter()
            .find(|(n, _)| *n == name)
            .and_then(|(_, i)| row.get(*i))
            .map(str::trim)
            .unwrap_or("")
    }

    fn number(
        &self,
        row: &csv::StringRecord,
        name: &str,
        line: u64,
    ) -> Result<Option<f64>, RecordsError> {
        parse_number(self.text(row, name), name, line)
    }
}

fn parse_number(text: &str, column: &str, line: u64) -> Result<Option<f64>, RecordsError> {
    if text.is_empty() {
        return Ok(None);
    }
    match text.parse::<f64>() {
        Ok(v) if v.is_finite() => Ok(Some(v)),
        _ => Err(RecordsError::NotNumber {
            line,
            column: column.to_owned(),
            text: text.to_owned(),
        }),
    }
}

/// Reads a filled-in records CSV (see the module doc for its columns).
pub fn read_records(text: &str, project: &Project) -> Result<InstallationRecords, RecordsError> {
    let mut reader = csv::ReaderBuilder::new()
        .flexible(false)
        .comment(Some(b'#'))
        .from_reader(text.as_bytes());
    let header = reader.headers().map_err(malformed)?.clone();
    let cols = Columns::of(&header)?;
    let mut records = InstallationRecords::default();
    for row in reader.records() {
        let row = row.map_err(malformed)?;
        let line = row.position().map(|p| p.line()).unwrap_or(0);
        let kind = row.get(cols.kind).unwrap_or("").trim().to_ascii_lowercase();
        let item = row.get(cols.item).unwrap_or("").trim().to_owned();
        match kind.as_str() {
            "grid" => read_grid_row(&cols, &row, line, &item, project, &mut records)?,
            "bridge" => read_bridge_row(&cols, &row, line, &item, project, &mut records)?,
            "" if row.iter().all(|c| c.trim().is_empty()) => {}
            other => {
                return Err(RecordsError::Unknown {
                    line,
                    why: format!(
                        "kind \"{other}\" is neither \"grid\" nor \"bridge\"; use one of those"
                    ),
                });
            }
        }
    }
    Ok(records)
}

fn malformed(e: csv::Error) -> RecordsError {
    let line = e.position().map(|p| p.line()).unwrap_or(0);
    let why = match e.kind() {
        csv::ErrorKind::UnequalLengths {
            expected_len, len, ..
        } => format!(
            "{len} fields where the header has {expected_len}; every row needs one field per \
             column (empty fields are fine)"
        ),
        _ => e.to_string(),
    };
    RecordsError::Malformed { line, why }
}

fn read_grid_row(
    cols: &Columns,
    row: &csv::StringRecord,
    line: u64,
    gauge: &str,
    project: &Project,
    records: &mut InstallationRecords,
) -> Result<(), RecordsError> {
    let elements = project
        .parts
        .iter()
        .flat_map(|p| project.placed_gauges(p))
        .find(|g| g.id == gauge)
        .map(|g| g.element_count())
        .ok_or_else(|| RecordsError::Unknown {
            line,
            why: format!("the plan has no gauge \"{gauge}\"; use a gauge id from the plan"),
        })?;
    let grid_text = cols.grid.and_then(|i| row.get(i)).unwrap_or("").trim();
    let grid = if grid_text.is_empty() {
        1
    } else {
        grid_text
            .parse::<usize>()
            .map_err(|_| RecordsError::NotNumber {
                line,
                column: "grid".into(),
                text: grid_text.into(),
            })?
    };
    if grid == 0 || grid > elements {
        return Err(RecordsError::Unknown {
            line,
            why: format!("gauge \"{gauge}\" has grids 1 to {elements}, not {grid}"),
        });
    }
    let resistance = cols.number(row, "resistance_ohm", line)?;
    let insulation = cols.number(row, "insulation_gohm", line)?.map(|g| g * 1e9);
    let r = records.grid_mut(gauge, grid);
    r.serial = cols.text(row, "serial").to_owned();
    r.resistance_ohm = resistance;
    r.insulation_ohm = insulation;
    r.date = cols.text(row, "date").to_owned();
    r.initials = cols.text(row, "initials").to_owned();
    Ok(())
}

fn read_bridge_row(
    cols: &Columns,
    row: &csv::StringRecord,
    line: u64,
    bridge: &str,
    project: &Project,
    records: &mut InstallationRecords,
) -> Result<(), RecordsError> {
    if !project
        .parts
        .iter()
        .any(|p| p.bridges.iter().any(|b| b.name == bridge))
    {
        return Err(RecordsError::Unknown {
            line,
            why: format!("the plan has no bridge \"{bridge}\"; use a bridge name from the plan"),
        });
    }
    let lead = cols.number(row, "lead_ohm", line)?;
    let insulation = cols.number(row, "insulation_gohm", line)?.map(|g| g * 1e9);
    let zero = cols.number(row, "zero_mv_per_v", line)?;
    let zero_again = cols.number(row, "zero_again_mv_per_v", line)?;
    let shunt = cols
        .number(row, "shunt_microstrain", line)?
        .map(|u| u * 1e-6);
    let mut steps = Vec::new();
    for word in cols
        .text(row, "known_load_steps")
        .split([' ', ';'])
        .filter(|w| !w.is_empty())
    {
        if let Some(v) = parse_number(word, "known_load_steps", line)? {
            steps.push(v);
        }
    }
    let r = records.bridge_mut(bridge);
    r.lead_ohm = lead;
    r.insulation_ohm = insulation;
    r.zero_mv_per_v = zero;
    r.zero_again_mv_per_v = zero_again;
    r.shunt_step_strain = shunt;
    r.known_load_steps = steps;
    r.date = cols.text(row, "date").to_owned();
    r.initials = cols.text(row, "initials").to_owned();
    Ok(())
}
