//! The `gaugewright` binary as a user runs it from a shell: view names, `eval` with and without
//! `--json`, output into a pipe that closes early, and a project file given to the desktop app.

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

const BIN: &str = env!("CARGO_BIN_EXE_gaugewright");

/// A fresh scratch folder for one test.
fn scratch(test: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-cli-{}-{test}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

/// The binary with no display, so that a command line wrongly taken for the desktop app fails
/// at once instead of opening a window.
fn gaugewright() -> Command {
    let mut c = Command::new(BIN);
    c.env_remove("DISPLAY").env_remove("WAYLAND_DISPLAY");
    c
}

fn text(bytes: &[u8]) -> String {
    String::from_utf8_lossy(bytes).into_owned()
}

fn describe(o: &Output) -> String {
    format!(
        "status {:?}\nstdout {}\nstderr {}",
        o.status,
        text(&o.stdout),
        text(&o.stderr)
    )
}

/// Writes the demo with `gaugewright demo`, as a new user would.
fn write_demo(dir: &Path) -> PathBuf {
    let path = dir.join("demo.ron");
    let o = gaugewright().arg("demo").arg(&path).output().unwrap();
    assert!(o.status.success(), "{}", describe(&o));
    path
}

fn demo_bridge_names() -> Vec<String> {
    gw_plan::demo::demo_project()
        .parts
        .iter()
        .flat_map(|p| p.bridges.iter().map(|b| b.name.clone()))
        .collect()
}

#[test]
fn an_unknown_view_is_refused_naming_the_valid_views() {
    let o = gaugewright().args(["--view", "bogus"]).output().unwrap();
    assert!(!o.status.success(), "{}", describe(&o));
    let err = text(&o.stderr);
    assert!(err.contains("bogus"), "{err}");
    for view in ["part", "face", "bridges", "results", "help"] {
        assert!(err.contains(view), "{view} not named in: {err}");
    }
    assert!(
        !err.contains("Gaugewright window"),
        "the app was started: {err}"
    );
}

#[test]
fn a_part_number_below_one_and_an_unknown_camera_are_refused() {
    let o = gaugewright().args(["--part", "0"]).output().unwrap();
    assert!(!o.status.success(), "{}", describe(&o));
    assert!(text(&o.stderr).contains("--part"), "{}", describe(&o));
    let o = gaugewright()
        .args(["--camera", "sideways"])
        .output()
        .unwrap();
    assert!(!o.status.success(), "{}", describe(&o));
    let err = text(&o.stderr);
    for from in ["isometric", "front", "top", "end"] {
        assert!(err.contains(from), "{from} not named in: {err}");
    }
    let o = gaugewright()
        .args(["--part", "2", "check", "x.ron"])
        .output()
        .unwrap();
    assert!(!o.status.success(), "{}", describe(&o));
    assert!(
        text(&o.stderr).contains("--part is for the desktop app"),
        "{}",
        describe(&o)
    );
}

#[test]
fn subcommands_are_not_taken_for_a_project_file() {
    let dir = scratch("subcommands");
    let demo = write_demo(&dir);
    let o = gaugewright().arg("check").arg(&demo).output().unwrap();
    assert_eq!(o.status.code(), Some(0), "{}", describe(&o));
    assert!(text(&o.stdout).contains("not a certification of safety"));
    // The app's options belong to the app, not to a subcommand.
    let o = gaugewright()
        .args(["--view", "bridges", "check"])
        .arg(&demo)
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2), "{}", describe(&o));
    assert!(
        text(&o.stderr).contains("cannot be used with"),
        "{}",
        describe(&o)
    );
    let o = gaugewright()
        .arg(&demo)
        .arg("check")
        .arg(&demo)
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2), "{}", describe(&o));
    assert!(
        text(&o.stderr).contains("cannot be used with"),
        "{}",
        describe(&o)
    );
    // A mistyped subcommand is named as one, not opened as a missing file.
    let o = gaugewright().arg("chek").arg(&demo).output().unwrap();
    assert_eq!(o.status.code(), Some(2), "{}", describe(&o));
    let err = text(&o.stderr);
    assert!(
        err.contains("'chek'") && err.contains("check, eval"),
        "{err}"
    );
}

#[test]
fn eval_without_json_prints_a_summary_of_every_bridge() {
    let dir = scratch("summary");
    let demo = write_demo(&dir);
    let o = gaugewright().arg("eval").arg(&demo).output().unwrap();
    assert_eq!(o.status.code(), Some(0), "{}", describe(&o));
    let out = text(&o.stdout);
    assert!(
        !out.trim_start().starts_with('{'),
        "JSON without --json:\n{out}"
    );
    for name in demo_bridge_names() {
        assert!(
            out.contains(&format!("bridge \"{name}\"")),
            "{name}:\n{out}"
        );
    }
    for expected in [
        "mV/V",
        "displays",
        "µε",
        "excitation",
        "uncertainty at",
        "not a certification of safety",
    ] {
        assert!(out.contains(expected), "{expected}:\n{out}");
    }
}

#[test]
fn eval_json_is_valid_json_with_every_bridge() {
    let dir = scratch("json");
    let demo = write_demo(&dir);
    let o = gaugewright()
        .arg("eval")
        .arg(&demo)
        .arg("--json")
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(0), "{}", describe(&o));
    let json: serde_json::Value = serde_json::from_slice(&o.stdout).expect("valid JSON");
    let names: Vec<&str> = json["parts"]
        .as_array()
        .expect("a list of parts")
        .iter()
        .flat_map(|p| p["bridges"].as_array().into_iter().flatten())
        .filter_map(|b| b["name"].as_str())
        .collect();
    assert_eq!(names, demo_bridge_names());
}

#[test]
fn eval_json_into_head_ends_quietly_with_the_commands_status() {
    let dir = scratch("head");
    let demo = write_demo(&dir);
    let full = gaugewright()
        .arg("eval")
        .arg(&demo)
        .arg("--json")
        .output()
        .unwrap();
    // Larger than a pipe's buffer (64 KiB on Linux), so the writer is still writing when
    // `head` goes away: the closed pipe is met, not raced.
    assert!(full.stdout.len() > 65_536, "{} bytes", full.stdout.len());
    let status_file = dir.join("status");
    let o = Command::new("sh")
        .arg("-c")
        .arg(r#"("$0" eval "$1" --json; echo $? > "$2") | head -c 100"#)
        .arg(BIN)
        .arg(&demo)
        .arg(&status_file)
        .output()
        .unwrap();
    assert!(o.status.success(), "{}", describe(&o));
    assert_eq!(o.stdout, full.stdout[..100]);
    let err = text(&o.stderr);
    assert!(!err.contains("panicked"), "{err}");
    assert!(!err.contains("failed printing"), "{err}");
    assert!(err.is_empty(), "{err}");
    let status = std::fs::read_to_string(&status_file).unwrap();
    assert_eq!(status.trim(), "0", "the demo fails no margin");
}

#[test]
fn a_closed_pipe_ends_check_and_eval_quietly() {
    let dir = scratch("closed");
    let demo = write_demo(&dir);
    for args in [&["check"][..], &["eval"][..], &["eval", "--json"][..]] {
        // A pipe whose reading end is already closed: the first write meets it.
        let (reader, writer) = std::io::pipe().unwrap();
        drop(reader);
        let o = gaugewright()
            .arg(args[0])
            .arg(&demo)
            .args(&args[1..])
            .stdout(writer)
            .output()
            .unwrap();
        let err = text(&o.stderr);
        assert!(err.is_empty(), "{args:?}: {err}");
        assert_eq!(o.status.code(), Some(0), "{args:?}: {}", describe(&o));
    }
}

#[test]
fn the_app_opens_a_file_given_on_the_command_line() {
    if !gw_verify::require_tool("xvfb-run", "--help", "xvfb") {
        return;
    }
    let dir = scratch("open");
    let runtime = dir.join("xdg");
    std::fs::create_dir_all(&runtime).unwrap();
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        std::fs::set_permissions(&runtime, std::fs::Permissions::from_mode(0o700)).unwrap();
    }
    let demo = write_demo(&dir);
    let saved = std::fs::read_to_string(&demo).unwrap();
    let demo_name = gw_plan::demo::demo_project().name;
    let renamed = saved.replacen(
        &format!("name: \"{demo_name}\""),
        "name: \"Hoist rig, second build\"",
        1,
    );
    assert_ne!(renamed, saved, "the project name line was not found");
    let file = dir.join("hoist.ron");
    std::fs::write(&file, renamed).unwrap();
    assert_eq!(
        gw_plan::load_project(&file).unwrap().name,
        "Hoist rig, second build"
    );

    let screenshot = |png: &Path, file: Option<&Path>| {
        let mut c = Command::new("xvfb-run");
        c.args(["-a", "-s", "-screen 0 1440x900x24"]).arg(BIN);
        if let Some(f) = file {
            c.arg(f);
        }
        let o = c
            .arg("--screenshot")
            .arg(png)
            .env("XDG_RUNTIME_DIR", &runtime)
            .output()
            .expect("xvfb-run starts");
        assert_eq!(o.status.code(), Some(0), "{}", describe(&o));
        image::open(png).expect("a PNG was written").to_rgb8()
    };
    let opened = screenshot(&dir.join("opened.png"), Some(&file));
    let plain = screenshot(&dir.join("plain.png"), None);
    // Without the file the app shows the demo; with it, the window says which file it opened.
    assert_eq!(opened.dimensions(), plain.dimensions());
    let changed = opened
        .pixels()
        .zip(plain.pixels())
        .filter(|(a, b)| a != b)
        .count();
    assert!(
        changed > 200,
        "only {changed} pixels differ from the app without a file"
    );
}

#[test]
fn eval_and_check_speak_us_customary_units_when_asked() {
    let dir = scratch("units-us");
    let demo = write_demo(&dir);
    for subcommand in ["eval", "check"] {
        let o = gaugewright()
            .arg(subcommand)
            .arg(&demo)
            .args(["--units", "us"])
            .output()
            .unwrap();
        assert_eq!(o.status.code(), Some(0), "{}", describe(&o));
        let out = text(&o.stdout);
        // The peak stress of every case in ksi, where it is in inches.
        for unit in [" ksi ", " in, s = "] {
            assert!(out.contains(unit), "{subcommand}: no \"{unit}\":\n{out}");
        }
        for unit in ["MPa", " mm", " N·m", "kN", "°C"] {
            assert!(!out.contains(unit), "{subcommand}: \"{unit}\" in:\n{out}");
        }
    }
    let o = gaugewright()
        .arg("eval")
        .arg(&demo)
        .args(["--units", "us"])
        .output()
        .unwrap();
    let out = text(&o.stdout);
    // Loads per mV/V and the uncertainty of each wanted load: a force in lbf, a torque in
    // lbf·in, a pressure in psi.
    for unit in [" lbf", " lbf·in", " psi"] {
        assert!(out.contains(unit), "no \"{unit}\":\n{out}");
    }
    // The same summary in SI by default.
    let si = gaugewright().arg("eval").arg(&demo).output().unwrap();
    let si = text(&si.stdout);
    assert!(
        si.contains(" MPa ") && si.contains(" mm") && !si.contains("lbf"),
        "{si}"
    );
}

#[test]
fn a_unit_system_that_does_not_exist_is_refused_naming_the_choices() {
    let dir = scratch("units-bad");
    let demo = write_demo(&dir);
    let pdf = dir.join("x.pdf");
    for subcommand in ["check", "eval", "sheet"] {
        let mut c = gaugewright();
        c.arg(subcommand).arg(&demo);
        if subcommand == "sheet" {
            c.arg("-o").arg(&pdf);
        }
        let o = c.args(["--units", "imperial"]).output().unwrap();
        assert_eq!(o.status.code(), Some(2), "{}", describe(&o));
        let err = text(&o.stderr);
        assert!(
            err.contains("imperial") && err.contains("si") && err.contains("us"),
            "{subcommand}: {err}"
        );
        assert!(!pdf.exists());
    }
    // Before the subcommand, --units is the desktop app's: the way to write it is named.
    let o = gaugewright()
        .args(["--units", "us", "eval"])
        .arg(&demo)
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2), "{}", describe(&o));
    assert!(
        text(&o.stderr).contains("goes after the subcommand"),
        "{}",
        describe(&o)
    );
}

#[test]
fn sheet_writes_a_us_customary_sheet_and_channel_list() {
    let dir = scratch("units-sheet");
    let demo = write_demo(&dir);
    let (pdf, csv) = (dir.join("us.pdf"), dir.join("us.csv"));
    let o = gaugewright()
        .arg("sheet")
        .arg(&demo)
        .arg("-o")
        .arg(&pdf)
        .arg("--csv")
        .arg(&csv)
        .args(["--units", "us"])
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(0), "{}", describe(&o));
    let bytes = std::fs::read(&pdf).unwrap();
    assert!(bytes.starts_with(b"%PDF"), "not a PDF");
    let list = std::fs::read_to_string(&csv).unwrap();
    assert!(list.contains(",lbf,") && !list.contains(",N,"), "{list}");
}

#[test]
fn eval_in_us_units_gives_temperatures_in_fahrenheit_with_the_offset() {
    // A load case that runs past the range the gauges' thermal-output curve was measured over:
    // the warning names both ranges. −40 °C is −40 °F, 100 °C is 212 °F and 150 °C is 302 °F
    // (°F = 1.8 °C + 32, NIST SP 811 Appendix B).
    let dir = scratch("units-fahrenheit");
    let mut p = gw_plan::demo::demo_project();
    for s in &mut p.gauge_stock {
        s.spec.thermal_output.valid_range_c = Some((-40.0, 100.0));
    }
    p.parts[0].load_cases[0].temperature_range_c = (-40.0, 150.0);
    let path = dir.join("hot.ron");
    gw_plan::io::save_project(&p, &path).unwrap();
    let o = gaugewright()
        .arg("eval")
        .arg(&path)
        .args(["--units", "us"])
        .output()
        .unwrap();
    let out = text(&o.stdout);
    let warning = out
        .lines()
        .find(|l| l.contains("thermal-output curve"))
        .unwrap_or_else(|| panic!("no warning:\n{out}"));
    for t in ["-40 °F", "212 °F", "302 °F"] {
        assert!(warning.contains(t), "{t} missing: {warning}");
    }
    assert!(!warning.contains("°C"), "{warning}");
}
