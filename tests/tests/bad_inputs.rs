//! The bad-input table: each row is a file a user might hand the tool, made from the demo by one
//! change, and the outcome it must give — a clear message naming the problem, or a correct
//! load. No row may panic, hang or load a project that cannot be evaluated.

use std::path::{Path, PathBuf};

use gw_plan::demo::demo_project;
use gw_plan::document::FORMAT_VERSION;
use gw_plan::{load_project, project_to_string};

/// What a row must give.
enum Expect {
    /// Loads.
    Loads,
    /// Is refused with a message containing every one of these words.
    Refused(&'static [&'static str]),
}

fn folder() -> PathBuf {
    let dir = std::env::temp_dir().join(format!("gw-bad-inputs-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

fn demo_text() -> String {
    project_to_string(&demo_project()).unwrap()
}

/// The demo's text with the first `from` replaced by `to` (the row is wrong if `from` is
/// missing, so a change of format cannot make a row pass by doing nothing).
fn edited(from: &str, to: &str) -> Vec<u8> {
    let text = demo_text();
    assert!(text.contains(from), "the demo's text has no {from:?}");
    text.replacen(from, to, 1).into_bytes()
}

/// The table: (row name, file bytes, outcome).
fn rows() -> Vec<(&'static str, Vec<u8>, Expect)> {
    let mut rows = text_rows();
    rows.extend(value_rows());
    rows
}

/// Rows about the text itself: encoding, structure, names.
fn text_rows() -> Vec<(&'static str, Vec<u8>, Expect)> {
    use Expect::*;
    let mut bom = b"\xEF\xBB\xBF".to_vec();
    bom.extend(demo_text().into_bytes());
    vec![
        ("the demo as written", demo_text().into_bytes(), Loads),
        ("a byte-order mark before the text", bom, Loads),
        (
            "a byte that is not UTF-8 in a name",
            edited("name: \"Reaction arm\"", "name: \"Reaction \u{0}arm\"")
                .into_iter()
                .map(|b| if b == 0 { 0xFF } else { b })
                .collect(),
            Refused(&["UTF-8", "byte", "line"]),
        ),
        (
            "a file cut short",
            {
                // Cut at the end of a line half-way through, as a full disk would leave it.
                let text = demo_text();
                let at = text[..text.len() / 2].rfind('\n').unwrap_or(0);
                text.as_bytes()[..at].to_vec()
            },
            Refused(&["cut short", "line"]),
        ),
        (
            "no format version",
            edited(&format!("format_version: {FORMAT_VERSION},"), ""),
            Refused(&["format_version"]),
        ),
        (
            "not a project at all",
            b"format_version: 2".to_vec(),
            Refused(&["a project"]),
        ),
        (
            "brackets nested thousands deep",
            format!("(format_version: 2, name: {})", "[".repeat(5000)).into_bytes(),
            Refused(&["nested too deeply"]),
        ),
        (
            "a misspelt field",
            edited("warn_utilisation:", "warn_utilisaton:"),
            Refused(&["did you mean `warn_utilisation`?", "the project"]),
        ),
        (
            "a misspelt load",
            edited("VerticalForce", "VerticalForse"),
            Refused(&["did you mean `VerticalForce`?", "load components"]),
        ),
        (
            "a field the format does not have",
            edited("notes:", "colour_of_the_sky: 3, notes:"),
            Refused(&["`colour_of_the_sky` is not a field", "`notes`"]),
        ),
    ]
}

/// Rows whose values are numbers no plan can have: the place and the value are named.
fn value_rows() -> Vec<(&'static str, Vec<u8>, Expect)> {
    use Expect::*;
    vec![
        (
            "a misalignment of a billion radians",
            edited(
                "misalignment_rad: 0.017453292519943295",
                "misalignment_rad: 1e9",
            ),
            Refused(&["misalignment", "between 0 and 30"]),
        ),
        (
            "a negative position uncertainty",
            edited("position_m: 0.0005", "position_m: -0.0005"),
            Refused(&["position", "between 0 and 50"]),
        ),
        (
            "a temperature uncertainty that is not a number",
            edited("temperature_c: 2.0", "temperature_c: NaN"),
            Refused(&["temperature", "between 0 and 100"]),
        ),
        (
            "a billion Monte Carlo trials",
            edited(
                "monte_carlo_trials: 20000",
                "monte_carlo_trials: 1000000000",
            ),
            Refused(&["Monte Carlo trials", "1000000"]),
        ),
        (
            "a lead drift that is not a number",
            edited("tcr_per_c: 0.0039", "tcr_per_c: NaN"),
            Refused(&["lead drift", "not plausible"]),
        ),
        (
            "an excitation accuracy of 500 %",
            edited("excitation_accuracy: 0.0005", "excitation_accuracy: 5.0"),
            Refused(&["excitation accuracy", "not plausible"]),
        ),
        (
            "an amplifier noise of one volt per root hertz",
            edited(
                "amplifier_noise_v_per_rt_hz: 8e-9",
                "amplifier_noise_v_per_rt_hz: 1.0",
            ),
            Refused(&["amplifier noise density", "not plausible"]),
        ),
        (
            "a shunt target beyond what any shunt can simulate",
            edited("target_strain: 0.0005", "target_strain: 0.6"),
            Refused(&["shunt target strain", "not plausible"]),
        ),
        (
            "a strain limit of 80",
            edited("strain_limit: 0.03", "strain_limit: 80.0"),
            Refused(&["strain limit", "not plausible"]),
        ),
        (
            "a gauge turned a billion radians",
            edited("angle_rad: 0.0", "angle_rad: 1e9"),
            Refused(&["angle", "not plausible"]),
        ),
        (
            "a load case below absolute zero",
            edited(
                "temperature_range_c: (-10.0, 40.0)",
                "temperature_range_c: (-400.0, 40.0)",
            ),
            Refused(&["below absolute zero"]),
        ),
        (
            "a section 3e298 metres wide",
            edited("width_m: 0.03", "width_m: 3e298"),
            Refused(&["not plausible", "check the unit"]),
        ),
        (
            "a load of 6e303 newtons",
            edited("(VerticalForce, 6000.0)", "(VerticalForce, 6e303)"),
            Refused(&["vertical force", "not plausible"]),
        ),
        (
            "a datum that is not a number",
            edited("datum_m: (0.0, 0.0)", "datum_m: (NaN, 0.0)"),
            Refused(&["datum", "not a number"]),
        ),
    ]
}

fn outcome(path: &Path) -> Result<(), String> {
    load_project(path).map(|_| ()).map_err(|e| e.to_string())
}

fn check_row(name: &str, path: &Path, expect: &Expect) {
    match (outcome(path), expect) {
        (Ok(()), Expect::Loads) => {}
        (Err(e), Expect::Refused(words)) => {
            for w in *words {
                assert!(e.contains(w), "{name}: {e:?} lacks {w:?}");
            }
            for internal in [
                "VersionProbe",
                "`Project`",
                "`LoadComponent`",
                "recursion_limit",
            ] {
                assert!(!e.contains(internal), "{name}: {internal} in {e:?}");
            }
        }
        (Ok(()), Expect::Refused(_)) => panic!("{name}: loaded but should be refused"),
        (Err(e), Expect::Loads) => panic!("{name}: refused: {e}"),
    }
}

#[test]
fn every_row_of_the_table_gives_its_outcome() {
    let dir = folder();
    for (k, (name, bytes, expect)) in rows().iter().enumerate() {
        let path = dir.join(format!("row-{k}.ron"));
        std::fs::write(&path, bytes).unwrap();
        check_row(name, &path, expect);
    }
}

#[test]
fn a_file_larger_than_a_project_can_be_is_refused_without_reading_it() {
    // A sparse file: 65 MiB long, nothing on the disk.
    let path = folder().join("huge.ron");
    let f = std::fs::File::create(&path).unwrap();
    f.set_len(65 << 20).unwrap();
    check_row(
        "a 65 MiB file",
        &path,
        &Expect::Refused(&["at most 64 MiB"]),
    );
}

#[test]
fn a_folder_is_refused() {
    let path = folder().join("a-folder.ron");
    std::fs::create_dir_all(&path).unwrap();
    check_row("a folder", &path, &Expect::Refused(&["not a regular file"]));
}

#[cfg(unix)]
#[test]
fn a_pipe_is_refused_at_once_instead_of_waiting_for_a_writer() {
    let path = folder().join("a-pipe.ron");
    let _ = std::fs::remove_file(&path);
    if !gw_verify::require_tool("mkfifo", "--version", "coreutils") {
        return;
    }
    let made = std::process::Command::new("mkfifo").arg(&path).status();
    assert!(
        made.map(|s| s.success()).unwrap_or(false),
        "mkfifo made the pipe"
    );
    // Opening a pipe with no writer would block; the loader must not open it.
    check_row("a pipe", &path, &Expect::Refused(&["not a regular file"]));
}
