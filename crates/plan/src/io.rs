//! Reading and writing project files: RON with a format version, clear messages for broken
//! files, atomic saves with a backup.

use std::path::Path;

use serde::Deserialize;
use thiserror::Error;

use crate::document::{FORMAT_VERSION, Project};
use crate::validate::validate_project;

/// Why a project could not be read or written.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum PlanError {
    /// The file could not be read or written.
    #[error("{path}: {message}")]
    Io { path: String, message: String },
    /// The text is not a valid project (syntax or wrong type), with its position.
    #[error("line {line}, column {column}: {message}; correct the file or open its backup (.bak)")]
    Syntax {
        line: usize,
        column: usize,
        message: String,
    },
    /// The file was written by a newer or unknown format.
    #[error(
        "format version {found} is not known to this Gaugewright, which reads versions 1 to {supported}; \
         open it with a newer Gaugewright"
    )]
    UnknownVersion { found: u32, supported: u32 },
    /// A value is out of range.
    #[error("{path}: {message}")]
    Invalid { path: String, message: String },
}

#[derive(Deserialize)]
struct VersionProbe {
    format_version: u32,
}

fn syntax(e: &ron::error::SpannedError, text: &str) -> PlanError {
    PlanError::Syntax {
        line: e.span.start.line,
        column: e.span.start.col,
        message: if at_end(e, text) {
            crate::parse_errors::user_words(&ron::Error::Eof)
        } else {
            crate::parse_errors::user_words(&e.code)
        },
    }
}

/// True when a parse error stands at the very end of the text, or is a string the file never
/// closes: the file was cut short, whatever the parser expected there.
fn at_end(e: &ron::error::SpannedError, text: &str) -> bool {
    if matches!(e.code, ron::Error::ExpectedStringEnd) {
        return true;
    }
    let trimmed = text.trim_end();
    let last_line = trimmed.lines().count().max(1);
    let last_col = trimmed.lines().last().map_or(0, |l| l.chars().count()) + 1;
    let end = &e.span.end;
    end.line > last_line || (end.line == last_line && end.col >= last_col)
}

/// Reads a document of format version `from`, upgrading older versions
/// (see [`crate::migrate`]); later versions add their step here.
fn parse_version(text: &str, from: u32) -> Result<Project, PlanError> {
    match from {
        1 => {
            let v1: crate::migrate::ProjectV1 =
                ron::from_str(text).map_err(|e| syntax(&e, text))?;
            let mut project = v1.upgrade();
            crate::migrate::ranges_to_part_temperatures(&mut project);
            Ok(project)
        }
        2 => {
            let mut project: Project = ron::from_str(text).map_err(|e| syntax(&e, text))?;
            crate::migrate::ranges_to_part_temperatures(&mut project);
            Ok(project)
        }
        FORMAT_VERSION => ron::from_str(text).map_err(|e| syntax(&e, text)),
        found => Err(PlanError::UnknownVersion {
            found,
            supported: FORMAT_VERSION,
        }),
    }
}

/// Parses and validates a project from RON text.
pub fn project_from_str(text: &str) -> Result<Project, PlanError> {
    let probe: VersionProbe = ron::from_str(text).map_err(|e| syntax(&e, text))?;
    if probe.format_version == 0 || probe.format_version > FORMAT_VERSION {
        return Err(PlanError::UnknownVersion {
            found: probe.format_version,
            supported: FORMAT_VERSION,
        });
    }
    let project = parse_version(text, probe.format_version)?;
    validate_project(&project)?;
    Ok(project)
}

/// Serialises a project to pretty RON.
pub fn project_to_string(project: &Project) -> Result<String, PlanError> {
    let config = ron::ser::PrettyConfig::new()
        .depth_limit(12)
        .struct_names(false)
        .indentor("  ");
    ron::ser::to_string_pretty(project, config).map_err(|e| PlanError::Io {
        path: "project".into(),
        message: format!("could not write the project as text: {e}"),
    })
}

/// The largest project file read, bytes (64 MiB: far above any real plan, small enough to read
/// at once).
pub const MAX_PROJECT_BYTES: u64 = 64 << 20;

/// Reads a project file: a regular file of at most [`MAX_PROJECT_BYTES`], UTF-8 (a byte-order
/// mark is allowed). The results of imported parts are then read from their files (names
/// relative to the project's folder); a part whose results cannot be read keeps the reason.
pub fn load_project(path: &Path) -> Result<Project, PlanError> {
    let text = read_project_text(path)?;
    let mut project = project_from_str(&text)?;
    crate::imported_part::attach_fields(&mut project, Some(path));
    Ok(project)
}

/// The text of a project file, bounded and checked before anything is parsed.
pub fn read_project_text(path: &Path) -> Result<String, PlanError> {
    use std::io::Read;
    let io = |message: String| PlanError::Io {
        path: path.display().to_string(),
        message,
    };
    // Looked at before opening: opening a pipe would wait for a writer.
    let meta = std::fs::metadata(path).map_err(|e| io(format!("could not read the file ({e})")))?;
    if !meta.is_file() {
        return Err(io(
            "is not a regular file (a folder, a device or a pipe); open a project file".into(),
        ));
    }
    let too_big = |n: u64| {
        io(format!(
            "is {n} bytes; a project file is at most {} MiB, so this is not one",
            MAX_PROJECT_BYTES >> 20
        ))
    };
    if meta.len() > MAX_PROJECT_BYTES {
        return Err(too_big(meta.len()));
    }
    let mut bytes = Vec::new();
    std::fs::File::open(path)
        .and_then(|f| f.take(MAX_PROJECT_BYTES + 1).read_to_end(&mut bytes))
        .map_err(|e| io(format!("could not read the file ({e})")))?;
    if bytes.len() as u64 > MAX_PROJECT_BYTES {
        return Err(too_big(bytes.len() as u64));
    }
    let body = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(&bytes);
    String::from_utf8(body.to_vec()).map_err(|e| {
        let at = e.utf8_error().valid_up_to();
        let line = body[..at].iter().filter(|b| **b == b'\n').count() + 1;
        io(format!(
            "is not text in UTF-8: byte {} (line {line}) is not a character; save the file as \
             UTF-8 or open its backup (.bak)",
            at + 1
        ))
    })
}

pub use crate::safe_write::backup_path;

/// Saves through the safe writer ([`crate::safe_write`]): the previous version is kept as
/// `<file>.bak` and the one before as `<file>.bak2`; a failed save leaves them and the file as
/// they were.
pub fn save_project(project: &Project, path: &Path) -> Result<(), PlanError> {
    let text = project_to_string(project)?;
    crate::safe_write::write_file(path, text.as_bytes(), crate::safe_write::Backup::Keep)
}
