//! Nothing the tool writes can cost the user a project: a failed write leaves the file and its
//! backups as they were and no temporary file behind; backups rotate by renaming, not copying;
//! permissions and symlinks survive a save; and the command line will not write a build sheet,
//! a channel list or a demo over the project being read or over another project.

use std::io::Write;
use std::path::{Path, PathBuf};

use gw_plan::cli::{sheet, write_demo};
use gw_plan::demo::demo_project;
use gw_plan::safe_write::{Backup, backup_path, older_backup_path, write_file, write_file_with};
use gw_plan::{load_project, save_project};

fn folder(test: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-file-safety-{}-{test}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

fn read(path: &Path) -> String {
    std::fs::read_to_string(path).unwrap()
}

/// Names in the folder that look like temporary files.
fn temporaries(dir: &Path) -> Vec<String> {
    std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .filter(|n| n.ends_with(".tmp"))
        .collect()
}

#[test]
fn a_write_that_fails_half_way_leaves_the_file_its_backups_and_the_folder_as_they_were() {
    // A full disk part-way through a save, simulated by a writer that gives up after some
    // bytes.
    let dir = folder("failed");
    let path = dir.join("plan.ron");
    write_file(&path, b"version 1", Backup::Keep).unwrap();
    write_file(&path, b"version 2", Backup::Keep).unwrap();
    let err = write_file_with(&path, Backup::Keep, |f| {
        f.write_all(b"version 3, cut sh")?;
        Err(std::io::Error::other("no space left on the device"))
    })
    .unwrap_err();
    let text = err.to_string();
    assert!(text.contains("no space left"), "{text}");
    assert!(text.contains("unchanged"), "{text}");
    assert_eq!(read(&path), "version 2");
    assert_eq!(read(&backup_path(&path)), "version 1");
    assert!(temporaries(&dir).is_empty(), "{:?}", temporaries(&dir));
}

#[test]
fn backups_rotate_two_generations() {
    let dir = folder("rotate");
    let path = dir.join("plan.ron");
    for v in ["one", "two", "three"] {
        write_file(&path, v.as_bytes(), Backup::Keep).unwrap();
    }
    assert_eq!(read(&path), "three");
    assert_eq!(read(&backup_path(&path)), "two");
    assert_eq!(read(&older_backup_path(&path)), "one");
    assert!(temporaries(&dir).is_empty());
}

#[cfg(unix)]
#[test]
fn a_save_keeps_the_files_permissions_and_writes_through_a_symlink() {
    use std::os::unix::fs::PermissionsExt;
    let dir = folder("links");
    let real = dir.join("real.ron");
    save_project(&demo_project(), &real).unwrap();
    std::fs::set_permissions(&real, std::fs::Permissions::from_mode(0o640)).unwrap();
    let link = dir.join("link.ron");
    std::os::unix::fs::symlink(&real, &link).unwrap();
    let mut p = demo_project();
    p.name = "Renamed through the link".into();
    save_project(&p, &link).unwrap();
    assert!(
        std::fs::symlink_metadata(&link)
            .unwrap()
            .file_type()
            .is_symlink(),
        "the link is still a link"
    );
    assert_eq!(
        load_project(&real).unwrap().name,
        "Renamed through the link"
    );
    let mode = std::fs::metadata(&real).unwrap().permissions().mode() & 0o777;
    assert_eq!(mode, 0o640);
}

#[test]
fn a_folder_is_not_a_file_to_write() {
    let dir = folder("folder");
    let err = write_file(&dir, b"x", Backup::Replace).unwrap_err();
    assert!(err.to_string().contains("not a regular file"), "{err}");
}

#[test]
fn the_build_sheet_never_lands_on_the_project_it_reads() {
    let dir = folder("sheet-input");
    let project = dir.join("plan.ron");
    save_project(&demo_project(), &project).unwrap();
    let before = read(&project);
    for force in [false, true] {
        let out = sheet(&project, &project, None, force);
        assert_eq!(out.code, 2, "{}", out.stdout);
        assert!(out.stderr.contains("project being read"), "{}", out.stderr);
        let csv = sheet(&project, &dir.join("s.pdf"), Some(&project), force);
        assert_eq!(csv.code, 2);
    }
    assert_eq!(read(&project), before);
}

#[test]
fn the_build_sheet_replaces_another_project_only_when_forced() {
    let dir = folder("sheet-other");
    let project = dir.join("plan.ron");
    let other = dir.join("other.ron");
    save_project(&demo_project(), &project).unwrap();
    save_project(&demo_project(), &other).unwrap();
    let out = sheet(&project, &other, None, false);
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("--force"), "{}", out.stderr);
    assert!(load_project(&other).is_ok(), "the other project is intact");
    let forced = sheet(&project, &other, None, true);
    assert!(forced.code < 2, "{}", forced.stderr);
    assert!(std::fs::read(&other).unwrap().starts_with(b"%PDF"));
}

#[test]
fn one_file_for_both_sheet_and_channel_list_is_an_error() {
    let dir = folder("same-out");
    let project = dir.join("plan.ron");
    save_project(&demo_project(), &project).unwrap();
    let out_path = dir.join("out.pdf");
    let out = sheet(&project, &out_path, Some(&out_path), false);
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("each its own file"), "{}", out.stderr);
    assert!(!out_path.exists());
}

#[test]
fn the_demo_replaces_an_existing_project_only_when_forced_and_keeps_it_as_backup() {
    let dir = folder("demo");
    let path = dir.join("mine.ron");
    let mut mine = demo_project();
    mine.name = "My own plan".into();
    save_project(&mine, &path).unwrap();
    let out = write_demo(&path, false);
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("existing project"), "{}", out.stderr);
    assert_eq!(load_project(&path).unwrap().name, "My own plan");
    let forced = write_demo(&path, true);
    assert_eq!(forced.code, 0, "{}", forced.stderr);
    assert_eq!(load_project(&path).unwrap().name, demo_project().name);
    assert_eq!(
        load_project(&backup_path(&path)).unwrap().name,
        "My own plan"
    );
}
