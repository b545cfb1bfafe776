//! The files of the check-out and the first test, as the File menu reads and writes them: the
//! records template, the filled-in records and the test log. A file that cannot be read or
//! written leaves the project as it was and says why, naming the line where there is one.

use std::path::Path;

use gw_plan::safe_write::{Backup, holds_a_project, same_file, write_file};
use gw_reduce::log::read_log_file;
use gw_reduce::records_csv::{RecordsError, read_records_file, records_template};

use crate::command::Command;
use crate::state::{DocumentState, Notice};

fn notice(doc: &mut DocumentState, is_error: bool, text: String) {
    doc.notice = Some(Notice { is_error, text });
}

/// Reads filled-in check-out records into the project (one undo step).
pub fn import_records(doc: &mut DocumentState, path: &Path) {
    match read_records_file(path, &doc.project) {
        Ok(records) => {
            let (grids, bridges) = (records.grids.len(), records.bridges.len());
            doc.apply_all(vec![Command::SetRecords(Box::new(records))]);
            notice(
                doc,
                false,
                format!(
                    "Imported {grids} grid and {bridges} bridge records from {}; the plan tree's \
                     Check-out and test shows the verdicts (Ctrl+Z undoes the import).",
                    path.display()
                ),
            );
        }
        Err(e) => {
            let way_out = match e {
                RecordsError::MissingColumn { .. } => {
                    " File › Write check-out records template… writes a file with every column."
                }
                _ => "",
            };
            notice(
                doc,
                true,
                format!(
                    "Could not import the check-out records from {}: {e}. The project is \
                     unchanged.{way_out}",
                    path.display()
                ),
            );
        }
    }
}

/// Writes the records template; it may not land on the open project or another project.
pub fn write_template(doc: &mut DocumentState, path: &Path) {
    let on_project = doc.path.as_deref().is_some_and(|o| same_file(path, o));
    if on_project || holds_a_project(path) {
        notice(
            doc,
            true,
            format!(
                "Did not write the template: {} is a project file and would be lost. Choose \
                 another name.",
                path.display()
            ),
        );
        return;
    }
    let text = records_template(&doc.project, &doc.evaluation);
    match write_file(path, text.as_bytes(), Backup::Replace) {
        Ok(()) => notice(
            doc,
            false,
            format!(
                "Wrote the check-out records template to {}: fill in the measured columns, then \
                 File › Import check-out records….",
                path.display()
            ),
        ),
        Err(e) => notice(
            doc,
            true,
            format!("Could not write the template: {e}. Choose another folder."),
        ),
    }
}

/// Reads a test log; the project stores its path (one undo step) and the app keeps the samples.
pub fn import_log(doc: &mut DocumentState, path: &Path) {
    match read_log_file(path) {
        Ok(log) => doc.import_log(path, log),
        Err(e) => notice(
            doc,
            true,
            format!("Could not import the test log: {e}. The project is unchanged."),
        ),
    }
}
