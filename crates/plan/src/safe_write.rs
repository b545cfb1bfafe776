//! The one way every file the tool writes reaches the disk (projects, autosaves, build sheets,
//! channel lists): into a uniquely named temporary file in the target's folder, flushed to the
//! disk, then renamed over the target and the folder flushed, so that a reader sees the old file
//! or the new one and never a part of either. The previous version of a project is kept as
//! `<file>.bak` by a second name for the same data, not by a copy that a full disk could leave
//! cut short, and the one before as `<file>.bak2`. A write that fails leaves the target, its
//! backups and the folder as they were. A symlink is written through to its target, and the
//! replaced file's permissions are kept.

use std::fs::{self, File, OpenOptions};
use std::io::{self, Write};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicU64, Ordering};

use crate::io::PlanError;

/// Whether the previous version is kept.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Backup {
    /// Replace it (build sheets, channel lists: they can be written again from the project).
    Replace,
    /// Keep it as `<file>.bak`, and the one before as `<file>.bak2`.
    Keep,
}

/// The first backup beside `path`: `<file>.bak`.
pub fn backup_path(path: &Path) -> PathBuf {
    suffixed(path, ".bak")
}

/// The older backup beside `path`: `<file>.bak2`.
pub fn older_backup_path(path: &Path) -> PathBuf {
    suffixed(path, ".bak2")
}

fn suffixed(path: &Path, suffix: &str) -> PathBuf {
    let mut p = path.as_os_str().to_owned();
    p.push(suffix);
    PathBuf::from(p)
}

/// Writes `bytes` to `path` safely (see the module notes).
pub fn write_file(path: &Path, bytes: &[u8], backup: Backup) -> Result<(), PlanError> {
    write_file_with(path, backup, |f| f.write_all(bytes))
}

/// Writes what `fill` puts into the temporary file to `path` safely; `fill` failing (a full
/// disk, say) leaves everything as it was.
pub fn write_file_with(
    path: &Path,
    backup: Backup,
    fill: impl FnOnce(&mut File) -> io::Result<()>,
) -> Result<(), PlanError> {
    let target = resolve_link(path);
    let io_error = |what: &str, e: io::Error| PlanError::Io {
        path: target.display().to_string(),
        message: format!("{what} ({e}); the file on disk is unchanged"),
    };
    if let Ok(meta) = fs::metadata(&target)
        && !meta.is_file()
    {
        return Err(PlanError::Io {
            path: target.display().to_string(),
            message: "is not a regular file (a folder, a device or a pipe); choose a file name"
                .into(),
        });
    }
    let (temp, mut file) = create_temp(&target).map_err(|e| io_error("could not create", e))?;
    let written = fill(&mut file)
        .and_then(|()| file.sync_all())
        .and_then(|()| keep_permissions(&target, &temp));
    drop(file);
    if let Err(e) = written {
        let _ = fs::remove_file(&temp);
        return Err(io_error("could not write", e));
    }
    let replaced = match backup {
        Backup::Keep => keep_backup_then_replace(&target, &temp),
        Backup::Replace => fs::rename(&temp, &target),
    };
    if let Err(e) = replaced {
        let _ = fs::remove_file(&temp);
        return Err(io_error("could not replace", e));
    }
    sync_folder(&target);
    Ok(())
}

/// A symlink's final target (so the link stays a link); the path itself otherwise, or when the
/// link cannot be followed.
fn resolve_link(path: &Path) -> PathBuf {
    let is_link = fs::symlink_metadata(path)
        .map(|m| m.file_type().is_symlink())
        .unwrap_or(false);
    if !is_link {
        return path.to_owned();
    }
    fs::canonicalize(path).unwrap_or_else(|_| match fs::read_link(path) {
        Ok(to) if to.is_absolute() => to,
        Ok(to) => path.parent().unwrap_or(Path::new(".")).join(to),
        Err(_) => path.to_owned(),
    })
}

fn folder_of(target: &Path) -> PathBuf {
    match target.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_owned(),
        _ => PathBuf::from("."),
    }
}

/// A new file beside the target that no other writer uses: `.<name>.<process>.<n>.tmp`.
fn create_temp(target: &Path) -> io::Result<(PathBuf, File)> {
    static NEXT: AtomicU64 = AtomicU64::new(0);
    let name = target
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| "file".to_owned());
    let folder = folder_of(target);
    loop {
        let n = NEXT.fetch_add(1, Ordering::Relaxed);
        let temp = folder.join(format!(".{name}.{}.{n}.tmp", std::process::id()));
        match OpenOptions::new().write(true).create_new(true).open(&temp) {
            Ok(f) => return Ok((temp, f)),
            Err(e) if e.kind() == io::ErrorKind::AlreadyExists => continue,
            Err(e) => return Err(e),
        }
    }
}

/// The replaced file's permissions on the new one.
fn keep_permissions(target: &Path, temp: &Path) -> io::Result<()> {
    match fs::metadata(target) {
        Ok(meta) => fs::set_permissions(temp, meta.permissions()),
        Err(_) => Ok(()),
    }
}

/// `.bak` becomes `.bak2`; the current file gets the second name `.bak` (a hard link, or a
/// rename where the file system has no links); then the new file takes the name.
fn keep_backup_then_replace(target: &Path, temp: &Path) -> io::Result<()> {
    if !target.exists() {
        return fs::rename(temp, target);
    }
    let bak = backup_path(target);
    if bak.exists() {
        fs::rename(&bak, older_backup_path(target))?;
    }
    match fs::hard_link(target, &bak) {
        Ok(()) => fs::rename(temp, target),
        Err(_) => {
            fs::rename(target, &bak)?;
            fs::rename(temp, target)
        }
    }
}

/// Flushes the folder so that the rename itself survives a power cut (where the system allows
/// opening a folder; elsewhere the rename is as durable as the system makes it).
fn sync_folder(target: &Path) {
    if let Ok(dir) = File::open(folder_of(target)) {
        let _ = dir.sync_all();
    }
}

/// True when `path` is an existing file that holds a project (its first few kilobytes name a
/// format version).
pub fn holds_a_project(path: &Path) -> bool {
    use std::io::Read;
    let Ok(meta) = fs::metadata(path) else {
        return false;
    };
    if !meta.is_file() {
        return false;
    }
    let mut head = Vec::new();
    File::open(path)
        .and_then(|f| f.take(4096).read_to_end(&mut head))
        .map(|_| String::from_utf8_lossy(&head).contains("format_version"))
        .unwrap_or(false)
}

/// True when the two paths name the same file (after following links), or the same path when
/// neither exists yet.
pub fn same_file(a: &Path, b: &Path) -> bool {
    match (fs::canonicalize(a), fs::canonicalize(b)) {
        (Ok(x), Ok(y)) => x == y,
        _ => a == b,
    }
}
