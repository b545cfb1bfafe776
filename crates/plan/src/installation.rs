//! What comes back from the installation: the values the technician records per grid and per
//! bridge, the known load steps of the first test, and an in-place calibration that can stand
//! in for a bridge's predicted sensitivity. Stored in the project beside the plan; compared with
//! the plan by `gw-reduce`.

use serde::{Deserialize, Serialize};

/// Every record of the installation. Empty until the technician's values are entered or
/// imported.
#[derive(Debug, Clone, PartialEq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct InstallationRecords {
    /// One record per grid (a rosette has one per grid).
    #[serde(default)]
    pub grids: Vec<GridRecord>,
    /// One record per bridge.
    #[serde(default)]
    pub bridges: Vec<BridgeRecord>,
    /// The first test's log (CSV), as a path relative to the project file or absolute; the app
    /// reads it again when the project is opened.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub log_path: Option<String>,
}

impl InstallationRecords {
    /// True when nothing has been recorded.
    pub fn is_empty(&self) -> bool {
        self.grids.is_empty() && self.bridges.is_empty() && self.log_path.is_none()
    }

    /// The record of grid `grid` (1-based) of gauge `gauge`.
    pub fn grid(&self, gauge: &str, grid: usize) -> Option<&GridRecord> {
        self.grids
            .iter()
            .find(|r| r.gauge == gauge && r.grid == grid)
    }

    /// The record of the bridge named `bridge`.
    pub fn bridge(&self, bridge: &str) -> Option<&BridgeRecord> {
        self.bridges.iter().find(|r| r.bridge == bridge)
    }

    /// The record of grid `grid` of gauge `gauge`, added empty when there is none.
    pub fn grid_mut(&mut self, gauge: &str, grid: usize) -> &mut GridRecord {
        let index = match self
            .grids
            .iter()
            .position(|r| r.gauge == gauge && r.grid == grid)
        {
            Some(i) => i,
            None => {
                self.grids.push(GridRecord {
                    gauge: gauge.to_owned(),
                    grid,
                    ..GridRecord::default()
                });
                self.grids.len() - 1
            }
        };
        &mut self.grids[index]
    }

    /// The record of the bridge named `bridge`, added empty when there is none.
    pub fn bridge_mut(&mut self, bridge: &str) -> &mut BridgeRecord {
        let index = match self.bridges.iter().position(|r| r.bridge == bridge) {
            Some(i) => i,
            None => {
                self.bridges.push(BridgeRecord {
                    bridge: bridge.to_owned(),
                    ..BridgeRecord::default()
                });
                self.bridges.len() - 1
            }
        };
        &mut self.bridges[index]
    }
}

/// What was measured on one grid after bonding, before wiring.
#[derive(Debug, Clone, PartialEq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct GridRecord {
    /// Gauge id, e.g. "A1".
    pub gauge: String,
    /// Grid number, 1-based.
    pub grid: usize,
    /// Serial or lot written down at installation.
    #[serde(default)]
    pub serial: String,
    /// Grid resistance measured at its tabs, Ω.
    #[serde(default)]
    pub resistance_ohm: Option<f64>,
    /// Insulation resistance from grid to part, Ω.
    #[serde(default)]
    pub insulation_ohm: Option<f64>,
    /// Date of the measurement (free text).
    #[serde(default)]
    pub date: String,
    /// Initials of who measured.
    #[serde(default)]
    pub initials: String,
}

/// What was measured on one bridge after wiring, and the known load steps of its first test.
#[derive(Debug, Clone, PartialEq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct BridgeRecord {
    /// Bridge name, as in the plan.
    pub bridge: String,
    /// Resistance of one lead conductor, measured end to end, Ω.
    #[serde(default)]
    pub lead_ohm: Option<f64>,
    /// Insulation from all pins joined together to the part, Ω.
    #[serde(default)]
    pub insulation_ohm: Option<f64>,
    /// Zero reading with the part unloaded, mV/V.
    #[serde(default)]
    pub zero_mv_per_v: Option<f64>,
    /// Zero read again after the bridge has been excited for a while (15 min is common
    /// practice), mV/V: the difference is the drift.
    #[serde(default)]
    pub zero_again_mv_per_v: Option<f64>,
    /// Shunt step: the reading with the shunt connected less the zero, as the instrument
    /// displays it (strain, m/m, with the plan's gauge factor setting and bridge factor).
    #[serde(default)]
    pub shunt_step_strain: Option<f64>,
    /// Known loads applied in the first test, in order, SI unit of the bridge's wanted load
    /// (each step is held long enough to show as a plateau in the log).
    #[serde(default)]
    pub known_load_steps: Vec<f64>,
    /// Date of the measurement (free text).
    #[serde(default)]
    pub date: String,
    /// Initials of who measured.
    #[serde(default)]
    pub initials: String,
}

/// A sensitivity found by loading the installed bridge with known loads; when present it
/// replaces the predicted one in the channel list.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct InPlaceCalibration {
    /// Wanted load per mV/V, SI unit of the wanted load per mV/V.
    pub load_per_mv_per_v: f64,
    /// Standard uncertainty of that figure, same unit.
    pub standard_uncertainty: f64,
    /// Zero of the fit (reading at no load), mV/V.
    pub zero_mv_per_v: f64,
    /// Where it came from (log file, date), for the channel list and the report.
    #[serde(default)]
    pub source: String,
}
