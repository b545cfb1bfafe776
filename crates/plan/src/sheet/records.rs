//! The technician's records: one ruled row per gauge and per bridge to write the measured
//! values in, and the installation checklist.

use super::layout::{Area, line_pitch, wrap};
use super::writer::{BODY, Writer};
use crate::document::Project;
use crate::evaluate::Evaluation;

/// Insulation resistance a bonded grid should show to the part, GΩ, measured at no more than
/// 50 V (common practice for static measurements).
pub(crate) const INSULATION_ACCEPT_GOHM: f64 = 1.0;

/// Inner padding of a ruled cell, points.
const PAD: f32 = 2.5;

/// A table with every cell ruled, for writing in by hand: `head` in bold, then `rows`, each at
/// least `min_height` tall so there is room to write. Cells wrap within their column.
pub(crate) fn ruled_table(
    w: &mut Writer,
    widths: &[f32],
    head: &[String],
    rows: &[Vec<String>],
    min_height: f32,
) {
    let total: f32 = widths.iter().sum::<f32>().max(1e-6);
    let mut xs = vec![w.left()];
    for share in widths {
        let last = xs[xs.len() - 1];
        xs.push(last + share / total * w.column());
    }
    ruled_row(w, &xs, head, true, 0.0);
    for row in rows {
        let h = row_height(&xs, row, false, min_height);
        if w.y + h > w.bottom() {
            w.new_page();
            ruled_row(w, &xs, head, true, 0.0);
        }
        ruled_row(w, &xs, row, false, min_height);
    }
    w.y += 8.0;
}

fn row_height(xs: &[f32], row: &[String], bold: bool, min_height: f32) -> f32 {
    let lines = row
        .iter()
        .zip(xs.windows(2))
        .map(|(cell, x)| wrap(cell, BODY, bold, x[1] - x[0] - 2.0 * PAD).len())
        .max()
        .unwrap_or(1);
    (lines as f32 * line_pitch(BODY, bold) + 2.0 * PAD).max(min_height)
}

fn ruled_row(w: &mut Writer, xs: &[f32], row: &[String], bold: bool, min_height: f32) {
    let h = row_height(xs, row, bold, min_height);
    w.room(h + if bold { 40.0 } else { 0.0 });
    let top = w.y;
    let fill = bold.then_some(235);
    let (l, r) = (xs[0], xs[xs.len() - 1]);
    w.rect(Area::new(l, top, r, top + h), fill, 0.6);
    for x in &xs[1..xs.len() - 1] {
        w.line([*x, top], [*x, top + h], 0.6, 0);
    }
    for (cell, x) in row.iter().zip(xs.windows(2)) {
        w.wrapped(
            x[0] + PAD,
            top + PAD,
            x[1] - x[0] - 2.0 * PAD,
            BODY,
            bold,
            cell,
        );
    }
    w.y = top + h;
}

fn strings(items: &[&str]) -> Vec<String> {
    items.iter().map(|s| (*s).to_owned()).collect()
}

/// One row per gauge: lot and serial, resistance expected and measured, insulation to the part,
/// initials and date.
pub(crate) fn gauge_records(w: &mut Writer, project: &Project) {
    w.heading("Record: each gauge");
    w.para(
        BODY,
        false,
        &format!(
            "Measure each grid after bonding, before wiring into the bridge. Resistance: within \
             the tolerance the gauge data give for the nominal value. Insulation from grid to \
             part: at least {INSULATION_ACCEPT_GOHM:.0} GΩ, measured at no more than 50 V \
             (common practice; a lower reading means moisture or a damaged carrier: dry the \
             installation and measure again before wiring)."
        ),
    );
    let head = strings(&[
        "Part / gauge",
        "Lot",
        "Serial",
        "Resistance expected",
        "Measured (Ω)",
        "Insulation (GΩ), accept ≥ 1",
        "Initials / date",
    ]);
    let mut rows = Vec::new();
    for part in &project.parts {
        for g in project.placed_gauges(part) {
            let lot = part
                .gauges
                .iter()
                .find(|pg| pg.id == g.id)
                .and_then(|pg| pg.lot.as_ref())
                .map(|l| l.lot_number.clone())
                .unwrap_or_default();
            let s = &g.spec;
            for e in 0..g.element_count() {
                let id = if g.element_count() > 1 {
                    format!("{} / {} grid {}", part.name, g.id, e + 1)
                } else {
                    format!("{} / {}", part.name, g.id)
                };
                rows.push(vec![
                    id,
                    lot.clone(),
                    String::new(),
                    format!(
                        "{:.1} Ω ± {:.2} %",
                        s.resistance_ohm,
                        s.resistance_tolerance * 100.0
                    ),
                    String::new(),
                    String::new(),
                    String::new(),
                ]);
            }
        }
    }
    ruled_table(w, &[2.2, 1.0, 1.0, 1.6, 1.1, 1.3, 1.3], &head, &rows, 20.0);
}

/// One row per bridge: zero and shunt readings expected and measured, the pin check, initials
/// and date.
pub(crate) fn bridge_records(w: &mut Writer, project: &Project, ev: &Evaluation) {
    if ev.parts.iter().all(|p| p.bridges.is_empty()) {
        return;
    }
    w.heading("Record: each bridge");
    w.para(
        BODY,
        false,
        "First, with the instrument disconnected and no excitation: check the pin-to-pin \
         resistances listed with the bridge, the resistance of one lead conductor end to end \
         (\"Lead\"), and the insulation from all pins joined together to the part (at least 1 GΩ at no more than 50 V, common practice; never apply an \
         insulation tester to an excited bridge or a connected instrument). Then connect the \
         instrument, excite the bridge with the part unloaded, read zero, read it again after 15 \
         minutes (common practice: the difference is the drift), apply the shunt resistor between \
         the pins named and read again. Compare with the expected values; a \
         zero outside its band or a shunt reading more than 0.5 % from the expected value \
         (common practice) means a wiring or bonding fault to find before testing. The same \
         values can go into the records file Gaugewright writes (\"Write check-out \
         records template\"), which compares each with the plan and names the likely fault.",
    );
    let head = strings(&[
        "Part / bridge (channel)",
        "Lead (Ω)",
        "Zero expected (mV/V)",
        "Zero read (mV/V)",
        "Zero after 15 min",
        "Shunt expected",
        "Shunt read",
        "Pins (tick)",
        "Insulation (GΩ), accept ≥ 1",
        "Initials / date",
    ]);
    let mut rows = Vec::new();
    for pe in &ev.parts {
        let Some(part) = project.parts.get(pe.part_index) else {
            continue;
        };
        for be in &pe.bridges {
            let lead = part
                .bridges
                .iter()
                .find(|b| b.name == be.name)
                .map(|b| format!("planned {:.2}", b.lead.length_m * b.lead.ohm_per_m))
                .unwrap_or_default();
            rows.push(vec![
                format!("{} / {} ({})", part.name, be.name, be.channel_number),
                lead,
                super::bridge_section::zero_expected(be),
                String::new(),
                String::new(),
                be.shunt
                    .as_ref()
                    .map(|s| super::um(s.expected_reading_strain))
                    .unwrap_or_else(|| "no shunt planned".to_owned()),
                String::new(),
                String::new(),
                String::new(),
                String::new(),
            ]);
        }
    }
    ruled_table(
        w,
        &[1.8, 0.9, 1.6, 0.9, 0.9, 1.0, 0.8, 0.8, 1.3, 1.0],
        &head,
        &rows,
        20.0,
    );
}

/// The installation steps in order, each with a tick box and who did it.
pub(crate) fn checklist(w: &mut Writer) {
    let cure = format!(
        "cure (h / {}):",
        w.units.label(crate::units::Quantity::Temperature)
    );
    w.heading("Installation checklist");
    w.para(
        BODY,
        false,
        "Tick each step as it is done. Follow the gauge and adhesive makers' instructions and \
         the site's procedures where they differ from these steps.",
    );
    for (step, field) in [
        (
            "Layout marked from the datum with the face drawings or the 1:1 templates; positions \
             and angles checked against the gauge table",
            "checked by:",
        ),
        (
            "Surface prepared: degreased, abraded, layout lines burnished, conditioned and \
             neutralised",
            "initials:",
        ),
        (
            "Gauges bonded with the solder tabs at the end the face drawing shows; adhesive cured \
             for the time and temperature its instructions give",
            cure.as_str(),
        ),
        (
            "Each gauge's resistance and insulation recorded in \"Record: each gauge\"",
            "initials:",
        ),
        (
            "Lead wires attached, strain relief fitted, conductors on the connector pins as the \
             wiring diagram of each bridge shows",
            "initials:",
        ),
        (
            "Protective coating applied over gauges and terminals",
            "initials:",
        ),
        (
            "Pin-to-pin resistances and insulation (instrument disconnected, no excitation), then \
             zero and shunt readings, recorded in \"Record: each bridge\"",
            "initials:",
        ),
        ("Installation complete", "signed / date:"),
    ] {
        w.checkbox_line(step, field);
    }
}
