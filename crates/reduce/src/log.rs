//! A logged test read from a CSV file: one time column and any number of channel readings and
//! reference loads, one sample per row.
//!
//! # File format
//!
//! ```text
//! # load test of the left-hand lug, 2026-03-14        <- optional comment lines
//! # excitation 5 V
//! time [ms],bridge 1 [mV/V],rosette a [µε],reference [kN]   <- the header row
//! 0,0.0012,3.1,0.00                                    <- one sample per row
//! 100,0.1534,412.8,2.50
//! 200,0.3051,826.0,5.00
//! ```
//!
//! - Text in UTF-8 (a leading byte-order mark is ignored), values separated by commas, lines
//!   ending in LF or CR LF. A field may be quoted (`"…"`) when it contains a comma.
//! - Lines whose first character is `#` are comments and blank lines are skipped, wherever they
//!   are. Everything else is read: no data row is ever dropped or reordered. Either every row
//!   is read, or reading fails with an error that names the first problem and says how many
//!   other rows have problems, so that all of them can be fixed in one pass.
//! - The first row that is not a comment is the header. Every header is `name [unit]`: the name,
//!   then the unit in square brackets; spaces around either are trimmed. Names must differ from
//!   one another, compared without regard to case.
//! - The first column is the time, in `s` or `ms`; it is stored in seconds and must increase
//!   strictly from row to row.
//! - Every other column is one of:
//!   - a channel reading: `mV/V` (bridge output over excitation, × 1000), `V` or `mV` (bridge
//!     output voltage, stored in volts), `µε`, `ue` or `microstrain` (the strain the instrument
//!     displays, stored as written, in µε);
//!   - a load applied by a reference, stored in its SI unit: `N`, `kN`; `N·m` (also written
//!     `N*m`, `Nm`, `N.m`), `kN·m` (same variants); `Pa`, `kPa`, `MPa`, `bar`; `N/m`.
//!
//!   Unit letters are case-sensitive (`MV/V` would be megavolts per volt).
//! - Every row has one value per column: a decimal number with a decimal point (`0.25`,
//!   `-1.5e-3`), spaces around it allowed. Empty fields, text, `NaN` and infinities are refused.
//!
//! Line numbers in errors are counted as a text editor counts them: comment and blank lines
//! count, so the header is line 1 only when the file has no comments.
//!
//! [`write_log`] writes the same format back; [`read_log`] of its output gives the log again.

use std::collections::VecDeque;
use std::io::{self, BufRead, BufReader, Read};
use std::path::{Path, PathBuf};

/// The units accepted for a channel or load column, as listed in error messages.
const ACCEPTED_UNITS: &str = "mV/V, V, mV, µε (also ue, microstrain), N, kN, N·m (also N*m, Nm, \
     N.m), kN·m (same variants), Pa, kPa, MPa, bar, N/m";

/// What a column other than the time holds, and how its values are stored.
#[derive(Debug, Clone, Copy, PartialEq, serde::Serialize)]
pub enum ColumnUnit {
    /// A bridge reading in mV/V (output over excitation × 1000), stored as written.
    MvPerV,
    /// A bridge output voltage, stored in volts (a column written in mV is divided by 1000).
    Volt,
    /// The strain an instrument displays, stored as written, in µε.
    Microstrain,
    /// A load, with the factor to its SI unit and the SI unit text.
    Load {
        /// Factor from the written unit to the SI unit (1000 for kN).
        to_si: f64,
        /// The SI unit the values are stored in: `N`, `N·m`, `Pa` or `N/m`.
        si_unit: &'static str,
    },
}

/// One column of a log other than the time.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct LogColumn {
    /// The header text without the unit, trimmed.
    pub name: String,
    /// What the column holds.
    pub unit: ColumnUnit,
    /// The unit as written in the header, without the brackets.
    pub unit_text: String,
    /// One value per row. Readings as written (volts for a `mV` column); loads in their SI unit.
    pub values: Vec<f64>,
}

/// A logged test: the time of every sample and the columns sampled.
#[derive(Debug, Clone, PartialEq, serde::Serialize)]
pub struct TestLog {
    /// Time of each row, in seconds, strictly increasing.
    pub time_s: Vec<f64>,
    /// The columns after the time, in file order; each has one value per row.
    pub columns: Vec<LogColumn>,
}

impl TestLog {
    /// Number of rows (samples).
    pub fn len(&self) -> usize {
        self.time_s.len()
    }

    /// Whether the log has no rows.
    pub fn is_empty(&self) -> bool {
        self.time_s.is_empty()
    }

    /// The column of that name, compared trimmed and without regard to case.
    pub fn column(&self, name: &str) -> Option<&LogColumn> {
        let wanted = name.trim();
        self.columns
            .iter()
            .find(|column| column.name.trim().to_lowercase() == wanted.to_lowercase())
    }
}

/// Why a log could not be read. Every message names the line (counted as a text editor counts
/// them) and the column concerned, and says how to put it right.
#[derive(Debug, thiserror::Error)]
pub enum LogError {
    /// The file could not be opened or read.
    #[error("could not read the test log {}: {source}", path.display())]
    Io {
        /// The file concerned.
        path: PathBuf,
        /// What the system reported.
        source: io::Error,
    },
    /// Reading the stream failed part way through.
    #[error("could not read the test log after line {after_line}: {source}")]
    Read {
        /// The last line read completely.
        after_line: u64,
        /// What the system reported.
        source: io::Error,
    },
    /// Nothing but comments and blank lines.
    #[error(
        "the test log has no header row: after any `#` comment lines it must start with a \
         header such as `time [s],bridge 1 [mV/V]`, followed by one row per sample"
    )]
    NoHeader,
    /// A header without a unit in square brackets.
    #[error(
        "line {line}, column {column_number} '{header}': the header has no unit; write it as \
         `name [unit]`, for example `bridge 1 [mV/V]`{hint}",
        hint = if header.is_empty() { " (an empty header often comes from a comma at the end of the line: remove it)" } else { "" }
    )]
    HeaderWithoutUnit {
        /// Line of the header.
        line: u64,
        /// Column number, counted from 1.
        column_number: usize,
        /// The header as written, trimmed.
        header: String,
    },
    /// A header with a unit but no name.
    #[error(
        "line {line}, column {column_number} '{header}': the header has no name before its unit; \
         write it as `name [unit]`, for example `bridge 1 [mV/V]`"
    )]
    HeaderWithoutName {
        /// Line of the header.
        line: u64,
        /// Column number, counted from 1.
        column_number: usize,
        /// The header as written, trimmed.
        header: String,
    },
    /// A unit that is not accepted.
    #[error(
        "line {line}, column '{header}': unit '{unit}' is not accepted{hint}; accepted units are \
         {ACCEPTED_UNITS}",
        hint = unit_hint(unit)
    )]
    UnknownUnit {
        /// Line of the header.
        line: u64,
        /// The header as written, trimmed.
        header: String,
        /// The unit as written.
        unit: String,
    },
    /// Two columns with the same name.
    #[error(
        "line {line}: columns {first_column_number} and {second_column_number} are both named \
         '{name}' (names are compared without regard to case); rename one of them"
    )]
    DuplicateColumn {
        /// Line of the header.
        line: u64,
        /// The repeated name, as written in the second column.
        name: String,
        /// Number of the first column with that name, counted from 1.
        first_column_number: usize,
        /// Number of the second column with that name, counted from 1.
        second_column_number: usize,
    },
    /// The first column is not the time.
    #[error(
        "line {line}: the first column '{header}' must be the time, in s or ms, for example \
         `time [s]`; move the time column first"
    )]
    FirstColumnNotTime {
        /// Line of the header.
        line: u64,
        /// The first header as written, trimmed.
        header: String,
    },
    /// A header and no samples.
    #[error(
        "the test log has a header on line {header_line} but no data rows after it; add one row \
         per sample"
    )]
    NoDataRows {
        /// Line of the header.
        header_line: u64,
    },
    /// One or more rows could not be read; the first is described.
    #[error("{first}{}", more_rows_text(*more_rows))]
    Rows {
        /// The first problem in the file.
        first: RowProblem,
        /// How many other rows have problems (each row counted once).
        more_rows: usize,
    },
}

/// A problem in one data row.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum RowProblem {
    /// A row with more or fewer values than the header has columns.
    #[error(
        "line {line} has {found} values but the header on line {header_line} has {expected} \
         columns ({}); give every row one value per column{}",
        if found < expected { format!("nothing under '{column}'") } else { format!("more after '{column}'") },
        if found > expected { " — a decimal comma, or a comma inside an unquoted value, splits a value in two: use a decimal point" } else { "" }
    )]
    WrongFieldCount {
        /// Line of the row.
        line: u64,
        /// Line of the header.
        header_line: u64,
        /// Values in the row.
        found: usize,
        /// Columns in the header.
        expected: usize,
        /// The header of the first column without a value when values are missing, or of the
        /// last column when there are too many.
        column: String,
    },
    /// An empty field.
    #[error(
        "line {line}: no value under '{column}'; every row needs a number in every column — \
         fill in the reading or remove the row"
    )]
    MissingValue {
        /// Line of the row.
        line: u64,
        /// The header of the column.
        column: String,
    },
    /// A field that is not a number.
    #[error(
        "line {line}: '{text}' under '{column}' is not a number; write a number with a decimal \
         point, such as 0.25 or -1.5e-3{}",
        if text.contains(',') { " (this one has a decimal comma)" } else { "" }
    )]
    NotANumber {
        /// Line of the row.
        line: u64,
        /// The header of the column.
        column: String,
        /// The field as written, trimmed.
        text: String,
    },
    /// A NaN or infinite value.
    #[error(
        "line {line}: '{text}' under '{column}' is not a finite number (a logger writes this for \
         a sample it could not take or an input out of range); replace it with the reading or \
         remove the row"
    )]
    NotFinite {
        /// Line of the row.
        line: u64,
        /// The header of the column.
        column: String,
        /// The field as written, trimmed.
        text: String,
    },
    /// A time not after the time of the row before.
    #[error(
        "line {line}: time {time} {unit} under '{column}' is not after {previous_time} {unit} on \
         line {previous_line}; times must increase strictly from row to row — look for a \
         restarted clock, a repeated row or rows out of order"
    )]
    TimeNotIncreasing {
        /// Line of the row.
        line: u64,
        /// The header of the time column.
        column: String,
        /// The time of this row, in the unit written.
        time: f64,
        /// Line of the row before.
        previous_line: u64,
        /// The time of the row before, in the unit written.
        previous_time: f64,
        /// The time unit as written.
        unit: String,
    },
}

impl RowProblem {
    /// The line of the row concerned.
    pub fn line(&self) -> u64 {
        match self {
            Self::WrongFieldCount { line, .. }
            | Self::MissingValue { line, .. }
            | Self::NotANumber { line, .. }
            | Self::NotFinite { line, .. }
            | Self::TimeNotIncreasing { line, .. } => *line,
        }
    }
}

fn more_rows_text(more_rows: usize) -> String {
    match more_rows {
        0 => String::new(),
        1 => "; and 1 more row with problems".to_owned(),
        n => format!("; and {n} more rows with problems"),
    }
}

/// A hint for a unit of time after the first column, or one that differs from an accepted
/// unit only in letter case.
fn unit_hint(unit: &str) -> String {
    const SPELLINGS: [&str; 16] = [
        "s",
        "ms",
        "mV/V",
        "V",
        "mV",
        "ue",
        "microstrain",
        "N",
        "kN",
        "N·m",
        "kN·m",
        "Pa",
        "kPa",
        "MPa",
        "bar",
        "N/m",
    ];
    if let Some(UnitKind::Time { .. }) = parse_unit(unit) {
        return " (the time belongs in the first column only)".to_owned();
    }
    match SPELLINGS
        .iter()
        .find(|accepted| accepted.eq_ignore_ascii_case(unit))
    {
        Some(accepted) if *accepted != unit => format!(" (did you mean '{accepted}'?)"),
        _ => String::new(),
    }
}

/// What a header's unit makes of its column.
#[derive(Debug, Clone, Copy, PartialEq)]
enum UnitKind {
    /// The time, with the factor from the written unit to seconds.
    Time { to_s: f64 },
    /// A channel or load, with the factor from the written unit to the stored values.
    Column { unit: ColumnUnit, to_stored: f64 },
}

/// The meaning of a unit as written between the brackets (already trimmed).
fn parse_unit(unit: &str) -> Option<UnitKind> {
    let column = |unit, to_stored| Some(UnitKind::Column { unit, to_stored });
    let load = |to_si, si_unit| column(ColumnUnit::Load { to_si, si_unit }, to_si);
    match unit {
        "s" => Some(UnitKind::Time { to_s: 1.0 }),
        "ms" => Some(UnitKind::Time { to_s: 1e-3 }),
        "mV/V" => column(ColumnUnit::MvPerV, 1.0),
        "V" => column(ColumnUnit::Volt, 1.0),
        "mV" => column(ColumnUnit::Volt, 1e-3),
        // U+00B5 micro sign or U+03BC Greek mu, then U+03B5 epsilon.
        "µε" | "με" | "ue" | "microstrain" => column(ColumnUnit::Microstrain, 1.0),
        "N" => load(1.0, "N"),
        "kN" => load(1e3, "N"),
        "N·m" | "N⋅m" | "N*m" | "Nm" | "N.m" => load(1.0, "N·m"),
        "kN·m" | "kN⋅m" | "kN*m" | "kNm" | "kN.m" => load(1e3, "N·m"),
        "Pa" => load(1.0, "Pa"),
        "kPa" => load(1e3, "Pa"),
        "MPa" => load(1e6, "Pa"),
        "bar" => load(1e5, "Pa"),
        "N/m" => load(1.0, "N/m"),
        _ => None,
    }
}

/// Reads a test log in the format described in the [module documentation](self).
///
/// Every row is read, or an error names the first problem and how many other rows have one.
pub fn read_log(reader: impl Read) -> Result<TestLog, LogError> {
    read_log_with_size_hint(reader, None)
}

/// Reads a test log from a file; see [`read_log`]. An I/O error names the path.
pub fn read_log_file(path: &Path) -> Result<TestLog, LogError> {
    let io_error = |source| LogError::Io {
        path: path.to_owned(),
        source,
    };
    let file = std::fs::File::open(path).map_err(io_error)?;
    let size_hint = file.metadata().ok().map(|metadata| metadata.len());
    read_log_with_size_hint(file, size_hint).map_err(|error| match error {
        LogError::Read { source, .. } => io_error(source),
        other => other,
    })
}

/// The header once understood: one entry per column, the time first.
struct Header {
    /// Header text of each column as written, trimmed, for messages.
    texts: Vec<String>,
    time_to_s: f64,
    time_unit: String,
    columns: Vec<(LogColumn, f64)>,
}

fn read_log_with_size_hint(reader: impl Read, size_hint: Option<u64>) -> Result<TestLog, LogError> {
    const BYTE_ORDER_MARK: &[u8] = b"\xEF\xBB\xBF";
    let mut buffered = BufReader::new(reader);
    let starts_with_mark = buffered
        .fill_buf()
        .map_err(|source| LogError::Read {
            after_line: 0,
            source,
        })?
        .starts_with(BYTE_ORDER_MARK);
    if starts_with_mark {
        buffered.consume(BYTE_ORDER_MARK.len());
    }
    let mut csv_reader = csv::ReaderBuilder::new()
        .has_headers(false)
        .flexible(true)
        .comment(Some(b'#'))
        .from_reader(LineCounter::new(buffered));

    let mut record = csv::ByteRecord::new();
    let mut last_line = 0;
    let header_line = loop {
        if !next_record(&mut csv_reader, &mut record, last_line)? {
            return Err(LogError::NoHeader);
        }
        let line = record_line(&mut csv_reader, &record);
        last_line = line;
        if !is_blank(&record) {
            break line;
        }
    };
    let header = parse_header(&record, header_line)?;

    let expected = header.texts.len();
    let header_bytes: usize = record.as_slice().len() + expected;
    let capacity = size_hint.map_or(0, |bytes| {
        let row_bytes = header_bytes.max(4 * expected).max(1) as u64;
        usize::try_from(bytes / row_bytes)
            .unwrap_or(0)
            .min((1 << 24) / expected)
    });
    let mut time_s = Vec::with_capacity(capacity);
    let Header {
        texts,
        time_to_s,
        time_unit,
        mut columns,
    } = header;
    for (column, _) in &mut columns {
        column.values.reserve(capacity);
    }

    let mut first_problem: Option<RowProblem> = None;
    let mut more_rows = 0_usize;
    let mut previous_time: Option<(f64, u64)> = None;
    while next_record(&mut csv_reader, &mut record, last_line)? {
        let line = record_line(&mut csv_reader, &record);
        last_line = line;
        if is_blank(&record) {
            continue;
        }
        let problem = check_row(
            &record,
            line,
            header_line,
            &texts,
            &time_unit,
            &mut previous_time,
        );
        match problem {
            Some(problem) => {
                if first_problem.is_none() {
                    first_problem = Some(problem);
                    // Nothing more will be returned: free the values read so far.
                    time_s = Vec::new();
                    for (column, _) in &mut columns {
                        column.values = Vec::new();
                    }
                } else {
                    more_rows += 1;
                }
            }
            None if first_problem.is_none() => {
                store_row(&record, time_to_s, &mut time_s, &mut columns);
            }
            None => {}
        }
    }
    if let Some(first) = first_problem {
        return Err(LogError::Rows { first, more_rows });
    }
    if time_s.is_empty() {
        return Err(LogError::NoDataRows { header_line });
    }
    Ok(TestLog {
        time_s,
        columns: columns.into_iter().map(|(column, _)| column).collect(),
    })
}

fn next_record<R: Read>(
    reader: &mut csv::Reader<R>,
    record: &mut csv::ByteRecord,
    last_line: u64,
) -> Result<bool, LogError> {
    reader.read_byte_record(record).map_err(|error| {
        let source = match error.into_kind() {
            csv::ErrorKind::Io(source) => source,
            other => io::Error::other(format!("{other:?}")),
        };
        LogError::Read {
            after_line: last_line,
            source,
        }
    })
}

/// A whitespace-only line: csv reads it as one field of spaces; it is a blank line, not a row.
fn is_blank(record: &csv::ByteRecord) -> bool {
    record.len() == 1 && record.as_slice().trim_ascii().is_empty()
}

fn field_text(field: &[u8]) -> String {
    String::from_utf8_lossy(field).trim().to_owned()
}

fn parse_header(record: &csv::ByteRecord, line: u64) -> Result<Header, LogError> {
    let texts: Vec<String> = record.iter().map(field_text).collect();
    let mut names: Vec<String> = Vec::with_capacity(texts.len());
    let mut time: Option<(f64, String)> = None;
    let mut columns = Vec::with_capacity(texts.len().saturating_sub(1));
    for (index, header) in texts.iter().enumerate() {
        let column_number = index + 1;
        let without_unit = || LogError::HeaderWithoutUnit {
            line,
            column_number,
            header: header.clone(),
        };
        let Some(before_close) = header.strip_suffix(']') else {
            return Err(without_unit());
        };
        let Some(open) = before_close.rfind('[') else {
            return Err(without_unit());
        };
        let name = before_close[..open].trim();
        let unit = before_close[open + 1..].trim();
        if unit.is_empty() {
            return Err(without_unit());
        }
        if name.is_empty() {
            return Err(LogError::HeaderWithoutName {
                line,
                column_number,
                header: header.clone(),
            });
        }
        let lower = name.to_lowercase();
        if let Some(first) = names.iter().position(|other| *other == lower) {
            return Err(LogError::DuplicateColumn {
                line,
                name: name.to_owned(),
                first_column_number: first + 1,
                second_column_number: column_number,
            });
        }
        names.push(lower);
        let kind = parse_unit(unit);
        match (index, kind) {
            (0, Some(UnitKind::Time { to_s })) => time = Some((to_s, unit.to_owned())),
            (0, _) => {
                return Err(LogError::FirstColumnNotTime {
                    line,
                    header: header.clone(),
                });
            }
            (
                _,
                Some(UnitKind::Column {
                    unit: kind,
                    to_stored,
                }),
            ) => columns.push((
                LogColumn {
                    name: name.to_owned(),
                    unit: kind,
                    unit_text: unit.to_owned(),
                    values: Vec::new(),
                },
                to_stored,
            )),
            (_, Some(UnitKind::Time { .. }) | None) => {
                return Err(LogError::UnknownUnit {
                    line,
                    header: header.clone(),
                    unit: unit.to_owned(),
                });
            }
        }
    }
    let Some((time_to_s, time_unit)) = time else {
        return Err(LogError::NoHeader);
    };
    Ok(Header {
        texts,
        time_to_s,
        time_unit,
        columns,
    })
}

/// The value of a field, or why it has none.
fn parse_field(field: &[u8], line: u64, column: &str) -> Result<f64, RowProblem> {
    let trimmed = field.trim_ascii();
    if trimmed.is_empty() {
        return Err(RowProblem::MissingValue {
            line,
            column: column.to_owned(),
        });
    }
    let not_a_number = || RowProblem::NotANumber {
        line,
        column: column.to_owned(),
        text: field_text(trimmed),
    };
    let Ok(text) = std::str::from_utf8(trimmed) else {
        return Err(not_a_number());
    };
    let Ok(value) = text.parse::<f64>() else {
        return Err(not_a_number());
    };
    // `str::parse` accepts "NaN", "inf" and "infinity": a log must not carry them.
    if !value.is_finite() {
        return Err(RowProblem::NotFinite {
            line,
            column: column.to_owned(),
            text: text.to_owned(),
        });
    }
    Ok(value)
}

/// The first problem of a row, if any. Each valid time becomes the previous time, so one row
/// out of order is reported once, not together with every row after it.
fn check_row(
    record: &csv::ByteRecord,
    line: u64,
    header_line: u64,
    texts: &[String],
    time_unit: &str,
    previous_time: &mut Option<(f64, u64)>,
) -> Option<RowProblem> {
    let expected = texts.len();
    let found = record.len();
    if found != expected {
        let column = texts
            .get(found.min(expected.saturating_sub(1)))
            .cloned()
            .unwrap_or_default();
        return Some(RowProblem::WrongFieldCount {
            line,
            header_line,
            found,
            expected,
            column,
        });
    }
    let mut problem = None;
    for (index, (field, column)) in record.iter().zip(texts).enumerate() {
        match parse_field(field, line, column) {
            Ok(time) if index == 0 => {
                if let Some((previous, previous_line)) = *previous_time
                    && time <= previous
                {
                    problem = Some(RowProblem::TimeNotIncreasing {
                        line,
                        column: column.clone(),
                        time,
                        previous_line,
                        previous_time: previous,
                        unit: time_unit.to_owned(),
                    });
                }
                *previous_time = Some((time, line));
            }
            Ok(_) => {}
            Err(field_problem) => {
                return Some(problem.unwrap_or(field_problem));
            }
        }
    }
    problem
}

/// Stores a row already checked by [`check_row`].
fn store_row(
    record: &csv::ByteRecord,
    time_to_s: f64,
    time_s: &mut Vec<f64>,
    columns: &mut [(LogColumn, f64)],
) {
    let mut fields = record.iter().map(|field| {
        std::str::from_utf8(field.trim_ascii())
            .ok()
            .and_then(|text| text.parse::<f64>().ok())
            .unwrap_or(f64::NAN)
    });
    let time = fields.next().unwrap_or(f64::NAN);
    time_s.push(to_stored(time, time_to_s));
    for ((column, factor), value) in columns.iter_mut().zip(fields) {
        column.values.push(to_stored(value, *factor));
    }
}

/// Converts a written value: a factor below one is applied as a division by its reciprocal,
/// which is exact for a written value that is exact in the stored unit (250 ms → 0.25 s).
fn to_stored(value: f64, factor: f64) -> f64 {
    if factor < 1.0 {
        value / factor.recip()
    } else {
        value * factor
    }
}

/// Converts a stored value back to its written unit; the inverse of [`to_stored`].
fn to_written(value: f64, factor: f64) -> f64 {
    if factor < 1.0 {
        value * factor.recip()
    } else {
        value / factor
    }
}

/// The line a record starts on, as a text editor counts it.
fn record_line<R: Read>(reader: &mut csv::Reader<LineCounter<R>>, record: &csv::ByteRecord) -> u64 {
    // csv's own line count skips comment lines of CR LF files, so count newlines ourselves:
    // the record ends just before the reader's byte position.
    let end_byte = reader.position().byte();
    let last_line = reader.get_mut().last_line_before(end_byte);
    let newlines_inside = record
        .as_slice()
        .iter()
        .filter(|&&byte| byte == b'\n')
        .count() as u64;
    last_line.saturating_sub(newlines_inside)
}

/// A reader that notes where each newline is, so a record's line can be found from its end.
struct LineCounter<R> {
    inner: R,
    /// Bytes read so far.
    offset: u64,
    /// Offsets of the newlines read and not yet passed by a record.
    newlines: VecDeque<u64>,
    /// Newlines already passed.
    passed: u64,
}

impl<R> LineCounter<R> {
    fn new(inner: R) -> Self {
        Self {
            inner,
            offset: 0,
            newlines: VecDeque::new(),
            passed: 0,
        }
    }

    /// The line holding the last byte before `end_byte` (not counting a newline that ends it).
    fn last_line_before(&mut self, end_byte: u64) -> u64 {
        let mut ends_with_newline = false;
        while let Some(&offset) = self.newlines.front() {
            if offset >= end_byte {
                break;
            }
            ends_with_newline = offset + 1 == end_byte;
            self.passed += 1;
            self.newlines.pop_front();
        }
        // A record that ends with its newline lies on the line that newline closes.
        if ends_with_newline {
            self.passed
        } else {
            self.passed + 1
        }
    }
}

impl<R: Read> Read for LineCounter<R> {
    fn read(&mut self, buf: &mut [u8]) -> io::Result<usize> {
        let count = self.inner.read(buf)?;
        let start = self.offset;
        self.newlines.extend(
            buf[..count]
                .iter()
                .enumerate()
                .filter(|(_, byte)| **byte == b'\n')
                .map(|(index, _)| start + index as u64),
        );
        self.offset += count as u64;
        Ok(count)
    }
}

/// Writes a log in the format [`read_log`] reads: the time as `time [s]`, every other column
/// as `name [unit_text]` with its values converted back to that unit.
///
/// Values are written in the shortest form that reads back to the same number, so a log read
/// from this text equals the one written, up to the last digit of a converted unit (kN, mV, …).
/// A log with no rows gives a header only, which [`read_log`] refuses.
pub fn write_log(log: &TestLog) -> String {
    use std::fmt::Write as _;
    let mut text = String::new();
    text.push_str("time [s]");
    for column in &log.columns {
        text.push(',');
        text.push_str(&quoted(&format!("{} [{}]", column.name, column.unit_text)));
    }
    text.push('\n');
    let factors: Vec<f64> = log
        .columns
        .iter()
        .map(|column| match parse_unit(column.unit_text.trim()) {
            Some(UnitKind::Column { to_stored, .. }) => to_stored,
            _ => match column.unit {
                ColumnUnit::Load { to_si, .. } => to_si,
                ColumnUnit::MvPerV | ColumnUnit::Volt | ColumnUnit::Microstrain => 1.0,
            },
        })
        .collect();
    for (row, time) in log.time_s.iter().enumerate() {
        // Writing to a String cannot fail.
        let _ = write!(text, "{time}");
        for (column, factor) in log.columns.iter().zip(&factors) {
            text.push(',');
            // A column shorter than the time leaves the field empty; reading names it.
            if let Some(value) = column.values.get(row) {
                let _ = write!(text, "{}", to_written(*value, *factor));
            }
        }
        text.push('\n');
    }
    text
}

/// A header field quoted when it holds a comma, a quote or a line break.
fn quoted(field: &str) -> String {
    if field.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", field.replace('"', "\"\""))
    } else {
        field.to_owned()
    }
}
