//! The rows of the results tables: margins closest to failing first, the uncertainty budget
//! largest first with each source's share, and what cancels what (sensitivities per a readable
//! unit, the rejection of unwanted loads at a load case, the multi-bridge recovery matrix),
//! formatted in the display units. The app lays these out; the arithmetic lives here.
//!
//! # Conventions
//! - Inputs are the evaluation's SI values; every text is in the display units given.
//! - Percentages of a reading compare magnitudes: the sign of a leak does not matter for how
//!   much of the reading it spoils.
//! - A table cell reads "0" for exact zero, "< 0.001" below what the table shows, "—" where
//!   there is no figure.

use gw_bridge::margins::{Margin, MarginKind, MarginStatus};
use gw_bridge::multi_axis::MultiAxis;
use gw_bridge::uncertainty::GumBudget;
use gw_mechanics::LoadComponent;

use crate::accuracy::AccuracyCheck;
use crate::evaluate::{BridgeEvaluation, PartEvaluation};
use crate::units::{Quantity, Units, number_text};

/// Utilisation beyond which a margin is not worth a longer bar (400 %).
pub const BAR_CAP_PERCENT: f64 = 400.0;

/// One limit's utilisation at a load case.
#[derive(Debug, Clone, PartialEq)]
pub struct MarginRow {
    /// What is compared ("grid strain vs strain limit").
    pub name: String,
    /// value / limit × 100; infinite when there is no usable limit.
    pub percent: f64,
    /// Pass, warn or fail.
    pub status: MarginStatus,
    /// What is compared, with the value and the limit in SI.
    pub margin: Margin,
}

impl MarginRow {
    fn of(m: &Margin) -> MarginRow {
        MarginRow {
            name: m.kind.name().to_owned(),
            percent: m.utilisation * 100.0,
            status: m.status,
            margin: m.clone(),
        }
    }

    /// The value against its limit in the display units: "644.1 of 3000.0 µε",
    /// "118.4 of 350.0 MPa"; the predicted error in the wanted load's unit.
    pub fn figures_text(&self, units: Units, wanted: LoadComponent) -> String {
        let m = &self.margin;
        let q = match m.kind {
            MarginKind::GridStrainLimit | MarginKind::GridFatigue | MarginKind::Resolution => {
                Some(Quantity::Strain)
            }
            MarginKind::StressAtGauge | MarginKind::PeakStressInPart => Some(Quantity::Stress),
            MarginKind::SelfHeating => Some(Quantity::PowerDensity),
            MarginKind::Accuracy => Some(Quantity::of(wanted)),
            MarginKind::InputRange => None,
        };
        // Magnitudes and a limit: scale only, no offset.
        let number = |v: f64| match q {
            Some(q) => {
                let shown = units.scale_to_display(q, v);
                number_text(shown, units.decimals(q, shown).max(two_figures(shown)))
            }
            None => number_text(v, 3),
        };
        let unit = q.map_or("V", |q| units.label(q));
        if m.limit > 0.0 && m.limit.is_finite() {
            format!("{} of {} {unit}", number(m.value.abs()), number(m.limit))
        } else {
            format!("{} {unit}, no limit", number(m.value.abs()))
        }
    }

    /// "87.3 %", or "—" without a usable limit.
    pub fn percent_text(&self) -> String {
        if self.percent.is_finite() {
            format!("{} %", number_text(self.percent, 1))
        } else {
            "—".to_owned()
        }
    }
}

/// Decimals that keep two significant figures of a value below 1 (a resolution of 0.042 µε
/// must not read "0.0").
fn two_figures(shown: f64) -> usize {
    if shown == 0.0 || !shown.is_finite() || shown.abs() >= 1.0 {
        0
    } else {
        (1 - shown.abs().log10().floor() as i32).clamp(0, 9) as usize
    }
}

/// The margins of a bridge at load case `case` (the first case when that one is missing),
/// the required accuracy among them, closest to failing first: (case name, rows).
/// `None` when the bridge has no load case.
pub fn margin_rows(be: &BridgeEvaluation, case: usize) -> Option<(String, Vec<MarginRow>)> {
    let bc = be.cases.get(case).or(be.cases.first())?;
    let mut rows: Vec<MarginRow> = bc.margins.iter().map(MarginRow::of).collect();
    // The accuracy is one of the case's margins when the evaluation judged it there; else it
    // joins them from the bridge's accuracy checks.
    let judged = bc.margins.iter().any(|m| m.kind == MarginKind::Accuracy);
    if let Some(a) = accuracy_at(be, &bc.case).filter(|_| !judged) {
        rows.push(MarginRow::of(&a.margin));
    }
    // No usable limit (infinite) sorts first: it cannot be shown to pass.
    rows.sort_by(|a, b| closeness(b).total_cmp(&closeness(a)));
    Some((bc.case.clone(), rows))
}

fn closeness(r: &MarginRow) -> f64 {
    if r.percent.is_nan() {
        f64::INFINITY
    } else {
        r.percent
    }
}

/// The bridge's accuracy check at the named case.
pub fn accuracy_at<'a>(be: &'a BridgeEvaluation, case: &str) -> Option<&'a AccuracyCheck> {
    be.accuracy.iter().find(|a| a.case == case)
}

/// "Closest to its limit: grid strain vs strain limit at 87.3 %." from rows sorted as
/// [`margin_rows`] sorts them.
pub fn closest_sentence(rows: &[MarginRow]) -> String {
    match rows.first() {
        Some(r) if r.percent.is_finite() => format!(
            "Closest to its limit: {} at {} ({}).",
            r.name,
            r.percent_text(),
            r.status.word()
        ),
        Some(r) => format!("Closest to its limit: {} has no usable limit.", r.name),
        None => "No margins at this load case.".to_owned(),
    }
}

/// The accuracy check in the display units: "predicted error ±0.812 kN against the required
/// ±1.000 kN (81.2 %)".
pub fn accuracy_sentence(a: &AccuracyCheck, units: Units, q: Quantity) -> String {
    format!(
        "Accuracy at {}: predicted error ±{} against the required ±{} ({} of the allowed error, {}).",
        a.case,
        units.format_difference(q, a.predicted()),
        units.format_difference(q, a.allowed),
        MarginRow::of(&a.margin).percent_text(),
        a.margin.status.word()
    )
}

/// One source of an uncertainty budget.
#[derive(Debug, Clone, PartialEq)]
pub struct ContributionRow {
    /// Source name.
    pub name: String,
    /// Its contribution |cᵢ| u(xᵢ) to the measured load, SI.
    pub contribution: f64,
    /// Its share of the combined variance, (cᵢ uᵢ)² / Σ (cⱼ uⱼ)² × 100; `None` when the
    /// budget is all zero.
    pub variance_percent: Option<f64>,
}

/// The budget's sources, largest first, with their share of the combined variance. The shares
/// of uncorrelated sources add to 100 % (GUM, JCGM 100:2008, 5.1.2), which is why the variance
/// is shared out and not the standard uncertainty.
pub fn contribution_rows(gum: &GumBudget) -> Vec<ContributionRow> {
    let total: f64 = gum
        .rows
        .iter()
        .map(|r| r.contribution * r.contribution)
        .filter(|v| v.is_finite())
        .sum();
    let mut rows: Vec<ContributionRow> = gum
        .rows
        .iter()
        .map(|r| ContributionRow {
            name: r.name.clone(),
            contribution: r.contribution.abs(),
            variance_percent: (total > 0.0 && r.contribution.is_finite())
                .then(|| r.contribution * r.contribution / total * 100.0),
        })
        .collect();
    rows.sort_by(|a, b| b.contribution.total_cmp(&a.contribution));
    rows
}

/// "Dominant source: excitation, 64.0 % of the variance (0.123 kN)."
pub fn dominant_sentence(rows: &[ContributionRow], units: Units, q: Quantity) -> String {
    match rows.first() {
        Some(r) => format!(
            "Dominant source: {}, {} of the variance ({}).",
            r.name,
            share_text(r.variance_percent),
            units.format_difference(q, r.contribution)
        ),
        None => "The budget has no sources.".to_owned(),
    }
}

/// A share of the variance: "64.0 %", "< 0.1 %" for a share that would round to zero, "0 %"
/// for none, "—" without a budget.
pub fn share_text(percent: Option<f64>) -> String {
    match percent {
        Some(p) if p > 0.0 && p < 0.05 => "< 0.1 %".to_owned(),
        Some(p) if p.is_finite() => format!("{} %", number_text(p, 1)),
        _ => "—".to_owned(),
    }
}

/// A table with a frozen first column: row names, column headers with units, cells as text.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct ResultTable {
    /// Header of the first column ("Bridge").
    pub corner: String,
    /// Headers of the other columns, each with its unit.
    pub columns: Vec<String>,
    /// Rows: name, cells (one per column) and the column to stress, if any.
    pub rows: Vec<TableRow>,
}

/// A row of a [`ResultTable`].
#[derive(Debug, Clone, PartialEq, Default)]
pub struct TableRow {
    /// The row's name (with its unit where the row has one).
    pub name: String,
    /// One cell per column.
    pub cells: Vec<String>,
    /// The column shown in bold (the bridge's wanted load).
    pub stressed: Option<usize>,
}

/// The components any of the part's bridges responds to, in the order of
/// [`LoadComponent::ALL`].
fn part_components(pe: &PartEvaluation) -> Vec<LoadComponent> {
    LoadComponent::ALL
        .into_iter()
        .filter(|c| {
            pe.bridges
                .iter()
                .any(|b| b.sensitivities.iter().any(|s| s.component == *c))
        })
        .collect()
}

fn capitalised(s: &str) -> String {
    let mut c = s.chars();
    c.next()
        .map(|f| f.to_uppercase().collect::<String>() + c.as_str())
        .unwrap_or_default()
}

/// A plain table number: "0", "< 0.001", four significant digits, never e-notation.
fn table_number(units: Units, value: f64) -> String {
    units.format_table_number(Quantity::Plain, value)
}

/// Displayed strain per one readable unit of each load component (µε per kN, per kN·m, per
/// MPa, per °C; per kip, per kip·in, per ksi, per °F): a row per bridge, the wanted
/// component stressed.
pub fn sensitivity_table(pe: &PartEvaluation, units: Units) -> ResultTable {
    let components = part_components(pe);
    let columns = components
        .iter()
        .map(|&c| {
            let (_, per) = units.per_unit(Quantity::of(c));
            format!("{} (µε per {per})", capitalised(c.name()))
        })
        .collect();
    let rows = pe
        .bridges
        .iter()
        .map(|b| TableRow {
            name: b.name.clone(),
            cells: components
                .iter()
                .map(|&c| {
                    b.sensitivities.iter().find(|s| s.component == c).map_or(
                        "—".to_owned(),
                        |s| {
                            let (size, _) = units.per_unit(Quantity::of(c));
                            table_number(units, s.displayed_per_unit * size * 1e6)
                        },
                    )
                })
                .collect(),
            stressed: components.iter().position(|&c| c == b.wanted),
        })
        .collect();
    ResultTable {
        corner: "Bridge".to_owned(),
        columns,
        rows,
    }
}

/// How much of a reading one unwanted load puts in.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Leak {
    /// The case does not apply the wanted load: nothing to compare with.
    NoWantedReading,
    /// The case does not apply this load.
    NotLoaded,
    /// The unwanted load's reading over the wanted load's reading.
    Fraction(f64),
}

/// The leak of an unwanted load into the reading at a load case:
/// |s_u · L_u| / |s_w · L_w|, where s are the bridge's displayed strain per unit of each
/// load and L the case's loads (superposition: each load's share of the reading is its
/// sensitivity times its value). In decibels the rejection is −20 log₁₀ of that fraction
/// (a ratio of readings, which are amplitudes).
pub fn leak(s_wanted: f64, l_wanted: f64, s_unwanted: f64, l_unwanted: f64) -> Leak {
    let wanted = (s_wanted * l_wanted).abs();
    if !(wanted > 0.0 && wanted.is_finite()) {
        return Leak::NoWantedReading;
    }
    if l_unwanted == 0.0 {
        return Leak::NotLoaded;
    }
    let f = (s_unwanted * l_unwanted).abs() / wanted;
    if f.is_finite() {
        Leak::Fraction(f)
    } else {
        Leak::NoWantedReading
    }
}

impl Leak {
    /// "60.0 dB, 0.100 %"; exact cancellation "no leak (0 %)"; "—" without a figure.
    pub fn text(self) -> String {
        match self {
            Leak::NoWantedReading => "—".to_owned(),
            Leak::NotLoaded => "not loaded".to_owned(),
            Leak::Fraction(0.0) => "no leak (0 %)".to_owned(),
            Leak::Fraction(f) => {
                let percent = f * 100.0;
                let shown = if percent < 0.001 {
                    "< 0.001 %".to_owned()
                } else {
                    format!("{} %", number_text(percent, percent_decimals(percent)))
                };
                // Below 1e-10 (200 dB) a leak is rounding in the model, not a figure.
                let db = if f < 1e-10 {
                    "> 200 dB".to_owned()
                } else {
                    format!("{} dB", number_text(-20.0 * f.log10(), 1))
                };
                format!("{db}, {shown}")
            }
        }
    }
}

/// Three significant digits for small percentages, one decimal from 10 % up.
fn percent_decimals(percent: f64) -> usize {
    if percent >= 10.0 {
        1
    } else {
        (2 - percent.log10().floor() as i32).clamp(1, 3) as usize
    }
}

/// The rejection of every unwanted load at a load case (`loads` are the case's, SI): a row
/// per bridge, one column per load the part carries; the bridge's own wanted load reads
/// "wanted".
pub fn rejection_table(pe: &PartEvaluation, loads: &[(LoadComponent, f64)]) -> ResultTable {
    let components = part_components(pe);
    let value = |c: LoadComponent| {
        loads
            .iter()
            .filter(|(k, _)| *k == c)
            .map(|(_, v)| *v)
            .sum::<f64>()
    };
    let rows = pe
        .bridges
        .iter()
        .map(|b| {
            let s = |c: LoadComponent| {
                b.sensitivities
                    .iter()
                    .find(|s| s.component == c)
                    .map_or(0.0, |s| s.displayed_per_unit)
            };
            TableRow {
                name: b.name.clone(),
                cells: components
                    .iter()
                    .map(|&c| {
                        if c == b.wanted {
                            "wanted".to_owned()
                        } else {
                            leak(s(b.wanted), value(b.wanted), s(c), value(c)).text()
                        }
                    })
                    .collect(),
                stressed: components.iter().position(|&c| c == b.wanted),
            }
        })
        .collect();
    ResultTable {
        corner: "Bridge".to_owned(),
        columns: components
            .iter()
            .map(|c| format!("{} (dB, % of reading)", capitalised(c.name())))
            .collect(),
        rows,
    }
}

/// The unit a recovered load is given in per µε: the readable unit (kN, kip) unless the
/// row's numbers would all be below 0.1 of it, then the display unit (N, lbf). (size in SI,
/// label).
fn recovery_unit(units: Units, q: Quantity, row_si_per_strain: &[f64]) -> (f64, &'static str) {
    let (size, label) = units.per_unit(q);
    let largest = row_si_per_strain
        .iter()
        .map(|v| (v * 1e-6 / size).abs())
        .filter(|v| v.is_finite())
        .fold(0.0, f64::max);
    if largest < 0.1 {
        (1.0 / units.spec(q).0, units.label(q))
    } else {
        (size, label)
    }
}

/// The recovery matrix, loads = matrix × displayed strains: a row per recovered load in
/// load per µε ("Axial force (kN per µε)"), a column per bridge.
pub fn recovery_table(m: &MultiAxis, units: Units) -> ResultTable {
    let rows = m
        .recovery
        .iter()
        .zip(&m.components)
        .map(|(row, &c)| {
            let (size, label) = recovery_unit(units, Quantity::of(c), row);
            TableRow {
                name: format!("{} ({label} per µε)", capitalised(c.name())),
                cells: row
                    .iter()
                    .map(|v| table_number(units, v * 1e-6 / size))
                    .collect(),
                stressed: None,
            }
        })
        .collect();
    ResultTable {
        corner: "Recovered load".to_owned(),
        columns: m.bridges.iter().map(|b| format!("{b} (per µε)")).collect(),
        rows,
    }
}

/// What one readable unit of each load the bridges are not solved for puts into every
/// recovered load: a row per such load ("Torque (per 1 kN·m)"), a column per recovered load in
/// its readable unit.
pub fn cross_talk_table(m: &MultiAxis, units: Units) -> ResultTable {
    let size = |c: LoadComponent| units.per_unit(Quantity::of(c));
    let rows = m
        .cross_talk
        .iter()
        .map(|(c, row)| {
            let (from_size, from_label) = size(*c);
            TableRow {
                name: format!("{} (per 1 {from_label})", capitalised(c.name())),
                cells: row
                    .iter()
                    .zip(&m.components)
                    .map(|(v, &k)| table_number(units, v * from_size / size(k).0))
                    .collect(),
                stressed: None,
            }
        })
        .collect();
    ResultTable {
        corner: "Unsolved load".to_owned(),
        columns: m
            .components
            .iter()
            .map(|&k| format!("{} ({})", capitalised(k.name()), size(k).1))
            .collect(),
        rows,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_leak_of_one_in_a_thousand_is_sixty_decibels_and_a_tenth_of_a_percent() {
        // The unwanted load reads 1/1000 of the wanted one: 20 log10(1000) = 60 dB and
        // 1/1000 = 0.1 %, by the definitions of the decibel for amplitudes and of percent.
        let l = leak(2e-6, 5000.0, 2e-9, 5000.0);
        let Leak::Fraction(f) = l else {
            panic!("{l:?}")
        };
        assert!((f - 1e-3).abs() < 1e-15);
        assert_eq!(l.text(), "60.0 dB, 0.100 %");
        // A sign does not matter, and a load ten times larger leaks ten times more: 40 dB, 1 %.
        assert_eq!(
            leak(2e-6, 5000.0, -2e-9, 50_000.0).text(),
            "40.0 dB, 1.00 %"
        );
    }

    #[test]
    fn leaks_without_a_figure_say_so() {
        assert_eq!(leak(1e-6, 0.0, 1e-6, 10.0), Leak::NoWantedReading);
        assert_eq!(leak(0.0, 10.0, 1e-6, 10.0).text(), "—");
        assert_eq!(leak(1e-6, 10.0, 1e-6, 0.0).text(), "not loaded");
        assert_eq!(leak(1e-6, 10.0, 0.0, 10.0).text(), "no leak (0 %)");
        assert_eq!(leak(f64::NAN, 10.0, 1e-6, 10.0), Leak::NoWantedReading);
        assert_eq!(leak(1e-6, 1.0, 1e-17, 1.0).text(), "> 200 dB, < 0.001 %");
        // 1e-5 %: 20 log10(1e7) = 140 dB.
        assert_eq!(leak(1e-6, 1.0, 1e-13, 1.0).text(), "140.0 dB, < 0.001 %");
    }

    fn sensitivity(c: LoadComponent, per_unit: f64) -> crate::evaluate::Sensitivity {
        crate::evaluate::Sensitivity {
            component: c,
            displayed_per_unit: per_unit,
            mv_per_v_per_unit: 0.0,
        }
    }

    fn part_with(bridges: Vec<BridgeEvaluation>) -> PartEvaluation {
        PartEvaluation {
            part_index: 0,
            name: "arm".into(),
            kind: "beam".into(),
            cases: Vec::new(),
            bridge_indices: (0..bridges.len()).collect(),
            bridges,
            multi_axis: None,
        }
    }

    fn bridge(name: &str, wanted: LoadComponent, s: Vec<(LoadComponent, f64)>) -> BridgeEvaluation {
        let project = crate::demo::demo_project();
        let ev = crate::evaluate(&project, &crate::EvalOptions::default());
        let mut b = ev.parts[0].bridges[0].clone();
        b.name = name.into();
        b.wanted = wanted;
        b.sensitivities = s.into_iter().map(|(c, v)| sensitivity(c, v)).collect();
        b
    }

    #[test]
    fn sensitivities_read_per_kilonewton_and_zero_reads_zero() {
        use LoadComponent as C;
        // 2 µε per kN is 2e-9 per N; one kip is 4.448 kN (NIST SP 811, Appendix B), so
        // 8.896 µε per kip.
        let b = bridge(
            "Pull",
            C::VerticalForce,
            vec![
                (C::VerticalForce, 2e-9),
                (C::AxialForce, 0.0),
                (C::Torque, 1e-16),
            ],
        );
        let pe = part_with(vec![b]);
        let si = sensitivity_table(&pe, Units::Si);
        assert_eq!(
            si.columns,
            [
                "Axial force (µε per kN)",
                "Vertical force (µε per kN)",
                "Torque (µε per kN·m)"
            ]
        );
        assert_eq!(si.rows[0].cells, ["0", "2.000", "< 0.001"]);
        assert_eq!(si.rows[0].stressed, Some(1));
        let us = sensitivity_table(&pe, Units::UsCustomary);
        assert_eq!(us.columns[1], "Vertical force (µε per kip)");
        assert_eq!(us.rows[0].cells[1], "8.896");
    }

    #[test]
    fn rejection_at_a_case_compares_readings_of_that_case() {
        use LoadComponent as C;
        // Sensitivities 1 : 1000 and loads 10 kN each: the axial force leaks 0.1 %, 60 dB.
        let b = bridge(
            "Pull",
            C::VerticalForce,
            vec![(C::VerticalForce, 1e-6), (C::AxialForce, 1e-9)],
        );
        let pe = part_with(vec![b]);
        let t = rejection_table(&pe, &[(C::VerticalForce, 1e4), (C::AxialForce, 1e4)]);
        assert_eq!(t.rows[0].cells, ["60.0 dB, 0.100 %", "wanted"]);
        assert_eq!(t.columns[0], "Axial force (dB, % of reading)");
        let none = rejection_table(&pe, &[(C::AxialForce, 1e4)]);
        assert_eq!(none.rows[0].cells[0], "—");
    }

    #[test]
    fn recovery_reads_in_load_per_microstrain() {
        use LoadComponent as C;
        // A bridge reading 2 µε per kN recovers 0.5 kN per µε: 5e8 N per unit strain.
        let m = MultiAxis {
            bridges: vec!["Pull".into(), "Twist".into()],
            components: vec![C::VerticalForce, C::Torque],
            sensitivity: vec![vec![2e-9, 0.0], vec![0.0, 1e-5]],
            condition_number: 1.0,
            recovery: vec![vec![5e8, 0.0], vec![0.0, 1e5]],
            cross_talk: vec![(C::AxialForce, vec![1e-3, 0.0])],
        };
        let t = recovery_table(&m, Units::Si);
        assert_eq!(t.rows[0].name, "Vertical force (kN per µε)");
        assert_eq!(t.rows[0].cells, ["0.5000", "0"]);
        // 1e5 N·m per unit strain is 0.1 N·m per µε, below 0.1 kN·m: shown in N·m.
        assert_eq!(t.rows[1].name, "Torque (N·m per µε)");
        assert_eq!(t.rows[1].cells, ["0", "0.1000"]);
        let us = recovery_table(&m, Units::UsCustomary);
        // 500 N = 0.1124 kip (500 / 4448.222, NIST SP 811).
        assert_eq!(us.rows[0].name, "Vertical force (kip per µε)");
        assert_eq!(us.rows[0].cells[0], "0.1124");
        let x = cross_talk_table(&m, Units::Si);
        assert_eq!(x.rows[0].name, "Axial force (per 1 kN)");
        // 1e-3 N recovered per N: 1 N per kN is 0.001 kN per kN.
        assert_eq!(x.rows[0].cells, ["0.001000", "0"]);
    }

    #[test]
    fn margins_put_the_closest_to_failing_first_with_the_accuracy() {
        let project = crate::demo::demo_project();
        let ev = crate::evaluate(&project, &crate::EvalOptions::default());
        for be in ev.parts.iter().flat_map(|p| &p.bridges) {
            let (case, rows) = margin_rows(be, 0).expect("a case");
            assert_eq!(case, be.cases[0].case);
            // Each limit once, the accuracy among them when one is required.
            let mut names: Vec<&str> = rows.iter().map(|r| r.name.as_str()).collect();
            names.sort();
            names.dedup();
            assert_eq!(names.len(), rows.len());
            assert!(rows.len() >= be.cases[0].margins.len());
            if accuracy_at(be, &case).is_some() {
                assert!(names.contains(&"predicted error vs required accuracy"));
            }
            let largest = be.cases[0]
                .margins
                .iter()
                .map(|m| m.utilisation * 100.0)
                .chain(accuracy_at(be, &case).map(|a| a.margin.utilisation * 100.0))
                .fold(f64::NEG_INFINITY, f64::max);
            assert_eq!(rows[0].percent, largest);
            assert!(rows.windows(2).all(|w| w[0].percent >= w[1].percent));
            assert!(closest_sentence(&rows).starts_with("Closest to its limit: "));
        }
    }

    #[test]
    fn a_margin_shows_its_value_against_its_limit_in_the_display_units() {
        let row = |kind, value, limit| MarginRow::of(&Margin::new(kind, value, limit, 0.8));
        let force = LoadComponent::VerticalForce;
        let strain = row(MarginKind::GridStrainLimit, -644.1e-6, 3000e-6);
        assert_eq!(strain.figures_text(Units::Si, force), "644.1 of 3000.0 µε");
        // 134 MPa = 19.435 ksi and 350 MPa = 50.763 ksi (1 psi = 6894.757 Pa, NIST SP 811
        // Appendix B).
        let stress = row(MarginKind::StressAtGauge, 134e6, 350e6);
        assert_eq!(
            stress.figures_text(Units::UsCustomary, force),
            "19.44 of 50.76 ksi"
        );
        // 120 N = 26.98 lbf (1 lbf = 4.448 221 615 260 5 N).
        let accuracy = row(MarginKind::Accuracy, 59.11, 120.0);
        assert_eq!(
            accuracy.figures_text(Units::UsCustomary, force),
            "13.29 of 26.98 lbf"
        );
        // A resolution finer than the strain display step keeps two significant figures.
        let fine = row(MarginKind::Resolution, 0.0421e-6, 1e-6);
        assert_eq!(fine.figures_text(Units::Si, force), "0.042 of 1.0 µε");
        let range = row(MarginKind::InputRange, 1.5832, 10.0);
        assert_eq!(range.figures_text(Units::Si, force), "1.583 of 10.000 V");
        let unlimited = row(MarginKind::SelfHeating, 2.0e3, 0.0);
        assert_eq!(
            unlimited.figures_text(Units::Si, force),
            "2.00 kW/m², no limit"
        );
    }

    #[test]
    fn variance_shares_add_to_one_hundred_percent() {
        // Contributions 3 and 4 combine to 5 (root sum of squares); their variance shares are
        // 9/25 = 36 % and 16/25 = 64 %.
        let project = crate::demo::demo_project();
        let ev = crate::evaluate(&project, &crate::EvalOptions::default());
        let mut gum = ev.parts[0].bridges[0]
            .uncertainty
            .as_ref()
            .expect("the demo's budget")
            .gum
            .clone();
        gum.rows.truncate(2);
        gum.rows[0].name = "a".into();
        gum.rows[0].contribution = 3.0;
        gum.rows[1].name = "b".into();
        gum.rows[1].contribution = 4.0;
        let rows = contribution_rows(&gum);
        assert_eq!(rows[0].name, "b");
        assert!((rows[0].variance_percent.unwrap() - 64.0).abs() < 1e-12);
        assert!((rows[1].variance_percent.unwrap() - 36.0).abs() < 1e-12);
        assert_eq!(
            dominant_sentence(&rows, Units::Si, Quantity::Force),
            "Dominant source: b, 64.0 % of the variance (4.000 N)."
        );
        gum.rows[0].contribution = 0.0;
        gum.rows[1].contribution = 0.0;
        assert_eq!(share_text(contribution_rows(&gum)[0].variance_percent), "—");
        assert_eq!(share_text(Some(0.01)), "< 0.1 %");
        assert_eq!(share_text(Some(0.0)), "0 %");
    }
}
