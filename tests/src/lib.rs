//! Cross-crate verification suite: published references and external cross-checks that span
//! more than one crate live in `tests/tests/`. This library holds the shared helper for
//! external tools.

use std::process::Command;

/// Whether an external tool is available. When it is not: on a developer machine the caller
/// prints a notice and skips; in CI (`CI=true`, set by `.ci/run`) this panics so the check
/// cannot silently vanish.
pub fn require_tool(program: &str, probe_arg: &str, debian_package: &str) -> bool {
    let found = Command::new(program)
        .arg(probe_arg)
        .output()
        .map(|o| o.status.success() || !o.stdout.is_empty() || !o.stderr.is_empty())
        .unwrap_or(false);
    if found {
        return true;
    }
    let in_ci = std::env::var("CI").is_ok_and(|v| v == "true" || v == "1");
    assert!(
        !in_ci,
        "{program} is required in CI but was not found; .ci/run installs the Debian package {debian_package}"
    );
    println!(
        "SKIPPED: {program} not found; install the Debian package {debian_package} to run this check"
    );
    false
}
