//! What the app remembers between runs: recent files and units. Stored as RON in the user's
//! configuration directory.

use std::path::{Path, PathBuf};

use serde::{Deserialize, Serialize};

use crate::units::Units;

/// Remembered settings.
#[derive(Debug, Clone, PartialEq, Default, Serialize, Deserialize)]
pub struct Settings {
    /// Most recent first.
    pub recent_files: Vec<PathBuf>,
    /// Display units.
    #[serde(default)]
    pub units: Units,
    /// True once the app has run (the first run opens the demo).
    #[serde(default)]
    pub has_run: bool,
}

/// Where the app keeps its files; `None` keeps nothing (tests).
#[derive(Debug, Clone, Default)]
pub struct AppPaths {
    /// Settings file.
    pub settings: Option<PathBuf>,
    /// Autosave recovery file.
    pub recovery: Option<PathBuf>,
}

impl AppPaths {
    /// The user's directories: `$XDG_CONFIG_HOME` (or `~/.config`) and `$XDG_DATA_HOME`
    /// (or `~/.local/share`), each with a `gaugewright` folder.
    pub fn user() -> Self {
        let home = std::env::var_os("HOME").map(PathBuf::from);
        let dir = |var: &str, fallback: &str| {
            std::env::var_os(var)
                .map(PathBuf::from)
                .or_else(|| home.as_ref().map(|h| h.join(fallback)))
                .map(|d| d.join("gaugewright"))
        };
        Self {
            settings: dir("XDG_CONFIG_HOME", ".config").map(|d| d.join("settings.ron")),
            recovery: dir("XDG_DATA_HOME", ".local/share").map(|d| d.join("recovery.ron")),
        }
    }
}

impl Settings {
    /// Loads settings, or defaults if there are none or they cannot be read.
    pub fn load(path: Option<&Path>) -> Self {
        path.and_then(|p| std::fs::read_to_string(p).ok())
            .and_then(|t| ron::from_str(&t).ok())
            .unwrap_or_default()
    }

    /// Saves settings; failures are ignored (settings are a convenience).
    pub fn save(&self, path: Option<&Path>) {
        let Some(p) = path else { return };
        if let Some(dir) = p.parent() {
            let _ = std::fs::create_dir_all(dir);
        }
        if let Ok(text) = ron::ser::to_string_pretty(self, ron::ser::PrettyConfig::default()) {
            let _ = gw_plan::safe_write::write_file(
                p,
                text.as_bytes(),
                gw_plan::safe_write::Backup::Replace,
            );
        }
    }

    /// Puts `path` first in the recent list (at most eight).
    pub fn remember(&mut self, path: &Path) {
        self.recent_files.retain(|p| p != path);
        self.recent_files.insert(0, path.to_owned());
        self.recent_files.truncate(8);
    }
}
