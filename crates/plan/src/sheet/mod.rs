//! The build sheet for the technician: a printable PDF with embedded fonts, readable in black
//! and white. Every number comes from the same [`Evaluation`] the app shows.

use gw_mechanics::Member;

mod face_drawings;
mod layout;
mod part_views;
mod pdf;
mod wiring_diagram;
mod writer;

use layout::{MARGIN, Op};
use writer::{Header, Writer};

use crate::document::{Part, Project};
use crate::evaluate::{Evaluation, Severity};

pub(crate) fn um(strain: f64) -> String {
    format!("{:.1} µε", strain * 1e6)
}

pub(crate) fn mm(m: f64) -> String {
    format!("{:.1} mm", m * 1e3)
}

/// Text of the printed failure banner (also shown by the app and the CLI).
pub fn failure_lines(ev: &Evaluation) -> Vec<String> {
    ev.findings
        .iter()
        .filter(|f| matches!(f.severity, Severity::Fail | Severity::Error))
        .map(|f| f.message.clone())
        .collect()
}

fn part_description(part: &Part) -> String {
    let m = &part.member;
    let material = m.material();
    let dims = match m {
        Member::Beam(b) => format!(
            "{:?} beam, length {}, {} section {} × {}, load at {}",
            b.support,
            mm(b.length_m),
            b.section.shape_name(),
            mm(b.section.width_m()),
            mm(b.section.height_m()),
            b.load_points
                .iter()
                .map(|p| if (p.multiple - 1.0).abs() < 1e-12 {
                    mm(p.position_m)
                } else {
                    format!("{} (× {})", mm(p.position_m), p.multiple)
                })
                .collect::<Vec<_>>()
                .join(", ")
        ),
        Member::Shaft(s) => format!(
            "shaft, outer diameter {}, bore {}, length {}",
            mm(s.outer_diameter_m),
            mm(s.inner_diameter_m),
            mm(s.length_m)
        ),
        Member::ThinCylinder(v) => format!(
            "thin cylinder, outer diameter {}, wall {}, length {}, {:?} ends",
            mm(v.outer_diameter_m),
            mm(v.wall_m),
            mm(v.length_m),
            v.ends
        ),
        Member::ThinSphere(v) => format!(
            "thin sphere, outer diameter {}, wall {}",
            mm(v.outer_diameter_m),
            mm(v.wall_m)
        ),
        Member::ThickCylinder(v) => format!(
            "thick cylinder, outer diameter {}, bore {}, length {}",
            mm(v.outer_diameter_m),
            mm(v.inner_diameter_m),
            mm(v.length_m)
        ),
        Member::PlateWithHole(p) => format!(
            "plate {} × {} × {}, hole {}",
            mm(p.width_m),
            mm(p.height_m),
            mm(p.thickness_m),
            mm(p.hole_diameter_m)
        ),
        Member::GivenState(g) => format!(
            "given surface state over {} × {}",
            mm(g.length_m),
            mm(g.width_m)
        ),
    };
    format!(
        "{dims}; material {} (yield {:.0} MPa)",
        material.name,
        material.yield_strength_pa / 1e6
    )
}

/// Renders the build sheet to PDF bytes.
pub fn build_sheet_pdf(project: &Project, ev: &Evaluation) -> Result<Vec<u8>, String> {
    pdf::render(&compose(project, ev), true)
}

/// The build sheet with its drawings, rules and boxes but no text: rendered beside the whole
/// sheet, it shows whether any drawn line runs through a text (the pixels under each word must
/// be blank here).
pub fn build_sheet_graphics_only_pdf(
    project: &Project,
    ev: &Evaluation,
) -> Result<Vec<u8>, String> {
    pdf::render(&compose(project, ev), false)
}

/// Layout problems of every page of the sheet (overlapping text, lines through text, anything
/// past a margin), each with its page number; empty for a clean sheet.
pub fn build_sheet_layout_problems(project: &Project, ev: &Evaluation) -> Vec<String> {
    let w = compose(project, ev);
    w.pages
        .iter()
        .enumerate()
        .flat_map(|(i, ops)| {
            layout::problems(ops, w.width, w.height)
                .into_iter()
                .map(move |p| format!("page {}: {p}", i + 1))
        })
        .collect()
}

/// Every text the build sheet prints, page by page, one item per line: what a reader of the
/// sheet sees, for checks that need no PDF reader.
pub fn build_sheet_text(project: &Project, ev: &Evaluation) -> String {
    let w = compose(project, ev);
    let mut out = String::new();
    for op in w.pages.iter().flatten() {
        if let Op::Text { text, .. } = op {
            out.push_str(text);
            out.push('\n');
        }
    }
    out
}

/// The page header: the project's name, and its parts, revision, date and signatures (blank
/// lines where the project leaves them empty).
fn header(project: &Project) -> Header {
    let or_blank = |s: &str, blank: &'static str| {
        if s.trim().is_empty() {
            blank.to_owned()
        } else {
            s.to_owned()
        }
    };
    Header {
        title: project.name.clone(),
        details: format!(
            "Parts: {}   Revision: {}   Date: {}   Prepared by: {}   Checked by: {}",
            project
                .parts
                .iter()
                .map(|p| p.name.as_str())
                .collect::<Vec<_>>()
                .join(", "),
            or_blank(&project.revision, "____"),
            or_blank(&project.date, "____"),
            or_blank(&project.prepared_by, "________"),
            or_blank(&project.checked_by, "________"),
        ),
    }
}

/// Lays out the whole sheet.
fn compose(project: &Project, ev: &Evaluation) -> Writer {
    let mut w = Writer::new(project.paper, header(project));
    w.heading("Strain-gauge installation build sheet");
    let failures = failure_lines(ev);
    if !failures.is_empty() {
        let h = 22.0 + 12.0 * failures.len() as f32;
        let y = w.y;
        let width = w.width;
        w.ops().push(Op::Rect {
            x: MARGIN - 4.0,
            y: y - 12.0,
            w: width - 2.0 * MARGIN + 8.0,
            h,
            fill: Some(225),
            stroke: 2.0,
        });
        w.text_at(
            MARGIN,
            y,
            11.0,
            true,
            "MARGIN FAILS — DO NOT INSTALL OR TEST UNTIL THE PLAN IS CHANGED",
        );
        w.y += 14.0;
        for f in &failures {
            w.para(8.0, true, f);
        }
        w.y += 8.0;
    } else {
        w.para(9.0, false, "Every margin of this plan passes at its load cases. This is a planning result, not a certification that the part or the test is safe.");
    }
    w.heading("Cautions");
    for c in &ev.cautions {
        w.para(9.0, true, &c.title);
        w.para(8.5, false, &c.text);
    }
    for (pi, part) in project.parts.iter().enumerate() {
        let Some(pe) = ev.parts.iter().find(|p| p.part_index == pi) else {
            continue;
        };
        w.new_page();
        w.heading(&format!("Part: {}", part.name));
        w.para(9.0, false, &part_description(part));
        for c in &pe.cases {
            w.para(
                8.5,
                false,
                &format!(
                    "{}: largest von Mises stress {:.1} MPa {} ({}).",
                    c.case,
                    c.peak_von_mises_pa / 1e6,
                    c.peak_location,
                    c.yield_words()
                ),
            );
            if let (Some(membrane), Some(outer)) = (c.membrane_hoop_pa, c.outer_hoop_pa) {
                w.para(
                    8.5,
                    false,
                    &format!(
                        "Hoop stress {:.1} MPa at the mean radius (membrane, the design figure); \
                         {:.1} MPa on the outer surface, which is what the gauges read.",
                        membrane / 1e6,
                        outer / 1e6
                    ),
                );
            }
        }
        part_views::draw(&mut w, part);
        face_drawings::draw(&mut w, part, &project.placed_gauges(part));
        w.heading("Gauges");
        let mut rows = vec![
            vec![
                "ID",
                "Pattern",
                "Grid",
                "R",
                "GF",
                "Face",
                "x (datum)",
                "s (datum)",
                "Angle",
                "Prepare",
            ]
            .into_iter()
            .map(String::from)
            .collect::<Vec<_>>(),
        ];
        for g in &project.placed_gauges(part) {
            let s = &g.spec;
            rows.push(vec![
                g.id.clone(),
                s.pattern.name().to_owned(),
                mm(s.grid_length_m),
                format!("{:.1} Ω", s.resistance_ohm),
                format!("{:.3}", s.gauge_factor),
                g.position.face.name().to_owned(),
                mm(g.position.x_m - part.datum_m.0),
                mm(g.position.s_m - part.datum_m.1),
                format!("{:.1}°", g.angle_rad.to_degrees()),
                // Grid plus 10 mm all round for abrading and cleaning: common practice.
                format!(
                    "{:.0} × {:.0} mm",
                    s.grid_length_m * 1e3 + 20.0,
                    s.grid_width_m * 1e3 + 20.0
                ),
            ]);
        }
        w.table(
            &[
                0.0, 24.0, 108.0, 142.0, 184.0, 214.0, 272.0, 332.0, 392.0, 430.0,
            ],
            &rows,
        );
        for (k, be) in pe.bridges.iter().enumerate() {
            let Some(plan) = pe.bridge_indices.get(k).and_then(|&i| part.bridges.get(i)) else {
                continue;
            };
            w.room(330.0);
            w.heading(&format!(
                "Bridge \"{}\", channel {}",
                be.name, be.channel_number
            ));
            w.para(
                9.0,
                false,
                &format!(
                    "Arrangement: {}",
                    if be.arrangement.is_empty() {
                        "custom"
                    } else {
                        &be.arrangement
                    }
                ),
            );
            wiring_diagram::draw(&mut w, project, part, be, &plan.arms);
            w.para(8.5, false, &format!(
                "Measures {}. Excitation {:.2} V. Instrument: gauge factor {:.3}, bridge factor {:.4}, gain {:.0}, input range ±{:.1} V. Expected zero offset within ±{:.3} mV/V from resistance tolerances.",
                be.wanted.name(), be.excitation_v, be.gauge_factor_setting, be.bridge_factor, plan.signal.gain, plan.signal.input_range_v, be.zero_offset_band_mv_per_v
            ));
            if let Some(o) = &plan.bridge_factor_override {
                w.para(
                    8.5,
                    false,
                    &format!(
                        "The bridge factor is set by hand, not computed from the arrangement: {}",
                        if o.reason.trim().is_empty() {
                            "no reason given"
                        } else {
                            o.reason.as_str()
                        }
                    ),
                );
            }
            let mut rows = vec![vec![
                "Load case".to_owned(),
                "Output".to_owned(),
                "Displayed".to_owned(),
                "Target".to_owned(),
            ]];
            for c in &be.cases {
                rows.push(vec![
                    c.case.clone(),
                    format!("{:.4} mV/V", c.reading.mv_per_v),
                    um(c.reading.displayed_strain),
                    um(c.reading.target_strain),
                ]);
            }
            w.table(&[0.0, 140.0, 240.0, 330.0], &rows);
            for a in &be.accuracy {
                w.para(
                    8.5,
                    a.margin.status != gw_bridge::margins::MarginStatus::Pass,
                    &format!(
                        "Accuracy, {}: {} — {}.",
                        a.case,
                        a.describe(be.wanted.unit()),
                        a.margin.status.word()
                    ),
                );
            }
            if let Some(s) = &be.shunt {
                w.para(
                    8.5,
                    true,
                    &format!(
                        "Shunt calibration: {:.0} Ω (E96) across arm {} at the {}; expect {}.",
                        s.e96_ohm,
                        s.arm + 1,
                        match plan.shunt.map(|p| p.location) {
                            Some(gw_bridge::ShuntLocation::GaugeEnd) => "gauge",
                            _ => "instrument",
                        },
                        um(s.expected_reading_strain)
                    ),
                );
            }
            let mut rows = vec![vec![
                "Pin pair (instrument disconnected)".to_owned(),
                "Expect".to_owned(),
            ]];
            for (name, r) in &be.pin_resistances {
                rows.push(vec![name.clone(), format!("{:.2} Ω", r)]);
            }
            w.table(&[0.0, 330.0], &rows);
        }
    }
    w.new_page();
    w.heading("Installation checklist");
    w.para(8.5, false, "Tick each step and record the values. Acceptance values are common practice; follow the gauge and adhesive makers' instructions and the site's procedures where they differ.");
    for (step, blank) in [
        (
            "Layout marked from the datum; positions and angles checked against the gauge table",
            "checked by:",
        ),
        (
            "Surface prepared: degreased, abraded, layout lines burnished, conditioned and neutralised",
            "initials:",
        ),
        (
            "Gauges bonded; adhesive cured for the time and temperature its instructions give",
            "cure (h / °C):",
        ),
        (
            "Lead wires attached, strain relief fitted, colours as in the wiring diagrams",
            "initials:",
        ),
        (
            "Protective coating applied over gauges and terminals",
            "initials:",
        ),
        (
            "Grid resistance within ±0.5 % of nominal at each gauge (common practice)",
            "measured (Ω):",
        ),
        (
            "Resistance between connector pins as listed for each bridge",
            "measured (Ω):",
        ),
        (
            "Insulation resistance grid to part at least 1 GΩ at 50 V or less (common practice)",
            "measured (GΩ):",
        ),
        (
            "Zero reading within the expected zero offset band; recorded",
            "zero (mV/V):",
        ),
        (
            "Shunt reading within 0.5 % of the expected value (common practice)",
            "shunt (µε):",
        ),
        ("Installation complete and recorded", "signed / date:"),
    ] {
        w.checkbox_line(step, blank);
    }
    w.finish();
    w
}
