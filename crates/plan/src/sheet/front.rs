//! The first page: whether the plan may go ahead, the channels at a glance, and the cautions.

use super::layout::{Area, line_pitch, wrap};
use super::writer::{BODY, Writer};
use super::{bridge_section, failure_lines_in, load_per, units_words};
use crate::document::Project;
use crate::evaluate::Evaluation;
use crate::units::Units;

/// The banner of failing margins and missed accuracies, in a ruled box.
fn failure_banner(w: &mut Writer, failures: &[String]) {
    let title = "MARGIN FAILS — DO NOT INSTALL OR TEST UNTIL THE PLAN IS CHANGED";
    let inner = w.column() - 12.0;
    let title_lines = wrap(title, 11.0, true, inner).len() as f32;
    let body_lines: usize = failures
        .iter()
        .map(|f| wrap(f, 8.0, true, inner).len())
        .sum();
    let h = title_lines * line_pitch(11.0, true) + body_lines as f32 * line_pitch(8.0, true) + 18.0;
    w.room(h + 10.0);
    let top = w.y;
    w.rect(Area::new(w.left(), top, w.right(), top + h), Some(225), 2.0);
    let x = w.left() + 6.0;
    let mut y = w.wrapped(x, top + 6.0, inner, 11.0, true, title) + 4.0;
    for f in failures {
        y = w.wrapped(x, y, inner, 8.0, true, f);
    }
    w.y = top + h + 8.0;
}

/// One row per bridge: where it is, what it measures, its full-scale reading.
fn channel_rows(project: &Project, ev: &Evaluation, units: Units) -> Vec<Vec<String>> {
    let mut rows = vec![
        [
            "Channel",
            "Part / bridge",
            "Measures",
            "Largest reading",
            "Load per mV/V",
            "Zero expected (mV/V)",
        ]
        .map(String::from)
        .to_vec(),
    ];
    for pe in &ev.parts {
        let Some(part) = project.parts.get(pe.part_index) else {
            continue;
        };
        for be in &pe.bridges {
            let largest = be
                .cases
                .iter()
                .map(|c| c.reading.mv_per_v)
                .max_by(|a, b| a.abs().total_cmp(&b.abs()))
                .map(|v| format!("{v:.4} mV/V"))
                .unwrap_or_default();
            rows.push(vec![
                be.channel_number.to_string(),
                format!("{} / {}", part.name, be.name),
                be.wanted.name().to_owned(),
                largest,
                be.wanted_per_mv_per_v
                    .map(|k| load_per(units, be.wanted, k))
                    .unwrap_or_else(|| "none".to_owned()),
                bridge_section::zero_expected(be),
            ]);
        }
    }
    rows
}

/// The first page.
pub(crate) fn draw(w: &mut Writer, project: &Project, ev: &Evaluation) {
    w.heading("Strain-gauge installation build sheet");
    w.para(
        9.0,
        true,
        &format!(
            "Units: {}. Strain in µε; bridge output in mV/V.",
            units_words(w.units)
        ),
    );
    let failures = failure_lines_in(ev, w.units);
    if failures.is_empty() {
        w.para(
            9.0,
            false,
            "Every margin of this plan passes at its load cases, and every stated accuracy is \
             met. This is a planning result, not a certification that the part or the test is \
             safe.",
        );
    } else {
        failure_banner(w, &failures);
    }
    w.subheading("Channels");
    let rows = channel_rows(project, ev, w.units);
    if rows.len() > 1 {
        w.table(&[0.75, 2.0, 1.5, 1.1, 1.0, 2.0], &rows);
    } else {
        w.para(
            BODY,
            false,
            "No bridges planned yet: the sheet shows the parts and gauges only.",
        );
    }
    w.subheading("Cautions");
    for c in &ev.cautions {
        w.para(9.0, true, &c.title);
        w.para(BODY, false, &c.text);
    }
}
