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

fn syntax(e: &ron::error::SpannedError) -> PlanError {
    PlanError::Syntax {
        line: e.span.start.line,
        column: e.span.start.col,
        message: e.code.to_string(),
    }
}

/// Reads a document of format version `from`, upgrading older versions
/// (see [`crate::migrate`]); later versions add their step here.
fn parse_version(text: &str, from: u32) -> Result<Project, PlanError> {
    match from {
        1 => {
            let v1: crate::migrate::ProjectV1 = ron::from_str(text).map_err(|e| syntax(&e))?;
            Ok(v1.upgrade())
        }
        FORMAT_VERSION => ron::from_str(text).map_err(|e| syntax(&e)),
        found => Err(PlanError::UnknownVersion {
            found,
            supported: FORMAT_VERSION,
        }),
    }
}

/// Parses and validates a project from RON text.
pub fn project_from_str(text: &str) -> Result<Project, PlanError> {
    let probe: VersionProbe = ron::from_str(text).map_err(|e| syntax(&e))?;
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

/// Reads a project file.
pub fn load_project(path: &Path) -> Result<Project, PlanError> {
    let text = std::fs::read_to_string(path).map_err(|e| PlanError::Io {
        path: path.display().to_string(),
        message: format!("could not read the file ({e})"),
    })?;
    project_from_str(&text)
}

pub use crate::safe_write::backup_path;

/// Saves through the safe writer ([`crate::safe_write`]): the previous version is kept as
/// `<file>.bak` and the one before as `<file>.bak2`; a failed save leaves them and the file as
/// they were.
pub fn save_project(project: &Project, path: &Path) -> Result<(), PlanError> {
    let text = project_to_string(project)?;
    crate::safe_write::write_file(path, text.as_bytes(), crate::safe_write::Backup::Keep)
}
