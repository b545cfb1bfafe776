//! The build sheet for the technician: a printable PDF with embedded fonts, readable in black
//! and white. Every number comes from the same [`Evaluation`] the app shows.

use gw_mechanics::{Face, Member};
use krilla::Document;
use krilla::color::luma;
use krilla::geom::{PathBuilder, Point};
use krilla::num::NormalizedF32;
use krilla::page::PageSettings;
use krilla::paint::{Fill, Stroke};
use krilla::text::{Font, TextDirection};

use crate::document::{PaperSize, Part, PlanArm, Project};
use crate::evaluate::{BridgeEvaluation, Evaluation, Severity};

/// A drawing operation on a page (points, y down from the top).
#[derive(Debug, Clone)]
enum Op {
    Text {
        x: f32,
        y: f32,
        size: f32,
        bold: bool,
        text: String,
    },
    Line {
        x1: f32,
        y1: f32,
        x2: f32,
        y2: f32,
        width: f32,
        grey: u8,
    },
    Rect {
        x: f32,
        y: f32,
        w: f32,
        h: f32,
        fill: Option<u8>,
        stroke: f32,
    },
}

const MARGIN: f32 = 40.0;
const HEADER: f32 = 58.0;
const LINE: f32 = 13.0;

/// Lays pages out top to bottom.
struct Writer {
    width: f32,
    height: f32,
    pages: Vec<Vec<Op>>,
    y: f32,
}

impl Writer {
    fn new(paper: PaperSize) -> Self {
        let (width, height) = match paper {
            PaperSize::A4 => (595.0, 842.0),
            PaperSize::Letter => (612.0, 792.0),
        };
        Self {
            width,
            height,
            pages: vec![Vec::new()],
            y: MARGIN + HEADER,
        }
    }

    fn ops(&mut self) -> &mut Vec<Op> {
        if self.pages.is_empty() {
            self.pages.push(Vec::new());
        }
        let n = self.pages.len() - 1;
        &mut self.pages[n]
    }

    fn new_page(&mut self) {
        self.pages.push(Vec::new());
        self.y = MARGIN + HEADER;
    }

    fn room(&mut self, h: f32) {
        if self.y + h > self.height - MARGIN {
            self.new_page();
        }
    }

    fn text_at(&mut self, x: f32, y: f32, size: f32, bold: bool, text: impl Into<String>) {
        self.ops().push(Op::Text {
            x,
            y,
            size,
            bold,
            text: text.into(),
        });
    }

    fn para(&mut self, size: f32, bold: bool, text: &str) {
        // Wrap at roughly the characters that fit the width.
        let max = ((self.width - 2.0 * MARGIN) / (size * 0.5)) as usize;
        let mut line = String::new();
        for word in text.split_whitespace() {
            if line.len() + word.len() + 1 > max && !line.is_empty() {
                self.room(LINE);
                let y = self.y;
                self.text_at(MARGIN, y, size, bold, std::mem::take(&mut line));
                self.y += size + 3.0;
            }
            if !line.is_empty() {
                line.push(' ');
            }
            line.push_str(word);
        }
        if !line.is_empty() {
            self.room(LINE);
            let y = self.y;
            self.text_at(MARGIN, y, size, bold, line);
            self.y += size + 3.0;
        }
    }

    fn heading(&mut self, text: &str) {
        self.room(3.0 * LINE);
        self.y += 6.0;
        let y = self.y;
        self.text_at(MARGIN, y, 13.0, true, text);
        self.y += 17.0;
    }

    /// A table with column x offsets; the first row is bold.
    fn table(&mut self, columns: &[f32], rows: &[Vec<String>]) {
        for (i, row) in rows.iter().enumerate() {
            self.room(LINE);
            let y = self.y;
            for (c, cell) in row.iter().enumerate() {
                let x = MARGIN + columns.get(c).copied().unwrap_or(0.0);
                self.text_at(x, y, 8.5, i == 0, cell.clone());
            }
            self.y += 11.5;
            if i == 0 {
                let y = self.y - 8.0;
                let w = self.width;
                self.ops().push(Op::Line {
                    x1: MARGIN,
                    y1: y,
                    x2: w - MARGIN,
                    y2: y,
                    width: 0.5,
                    grey: 0,
                });
            }
        }
        self.y += 4.0;
    }

    fn checkbox_line(&mut self, text: &str, blank: &str) {
        self.room(16.0);
        let y = self.y;
        self.ops().push(Op::Rect {
            x: MARGIN,
            y: y - 8.5,
            w: 9.0,
            h: 9.0,
            fill: None,
            stroke: 0.8,
        });
        self.text_at(MARGIN + 15.0, y, 9.0, false, text);
        if !blank.is_empty() {
            let x = self.width - MARGIN - 170.0;
            self.text_at(x, y, 8.0, false, blank);
            let w = self.width;
            self.ops().push(Op::Line {
                x1: x + 60.0,
                y1: y + 2.0,
                x2: w - MARGIN,
                y2: y + 2.0,
                width: 0.5,
                grey: 0,
            });
        }
        self.y += 16.0;
    }
}

fn um(strain: f64) -> String {
    format!("{:.1} µε", strain * 1e6)
}

fn mm(m: f64) -> String {
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

/// Draws each face that carries gauges, to scale (round faces unrolled: axial position across,
/// arc length up), with the gauges, their ids and grid directions.
fn drawing(w: &mut Writer, part: &Part, placed: &[gw_bridge::PlacedGauge]) {
    let faces = part.member.faces();
    for extent in faces {
        let gauges: Vec<_> = placed
            .iter()
            .filter(|g| g.position.face == extent.face)
            .collect();
        if gauges.is_empty() {
            continue;
        }
        let (x0, x1) = extent.x_range_m;
        let (s0, s1) = extent.s_range_m;
        let avail_w = w.width - 2.0 * MARGIN;
        let scale = (avail_w as f64 / (x1 - x0)).min(160.0 / (s1 - s0));
        let h = ((s1 - s0) * scale) as f32;
        w.room(h + 40.0);
        let y0 = w.y;
        let title = if extent.face == Face::Round {
            format!(
                "{} (unrolled: axial position across, arc length up), scale 1:{:.1}",
                extent.face.name(),
                1.0 / (scale / 2834.6)
            )
        } else {
            format!(
                "{}, scale 1:{:.1}",
                extent.face.name(),
                1.0 / (scale / 2834.6)
            )
        };
        w.text_at(MARGIN, y0, 9.0, true, title);
        let top = y0 + 6.0;
        let to = |x: f64, s: f64| -> (f32, f32) {
            (
                MARGIN + ((x - x0) * scale) as f32,
                top + ((s1 - s) * scale) as f32,
            )
        };
        w.ops().push(Op::Rect {
            x: MARGIN,
            y: top,
            w: ((x1 - x0) * scale) as f32,
            h,
            fill: Some(245),
            stroke: 0.8,
        });
        if let Some(a) = extent.hole_radius_m {
            let (cx, cy) = to(0.0, 0.0);
            let r = (a * scale) as f32;
            w.ops().push(Op::Rect {
                x: cx - r,
                y: cy - r,
                w: 2.0 * r,
                h: 2.0 * r,
                fill: Some(255),
                stroke: 0.8,
            });
        }
        let (dx, ds) = part.datum_m;
        let (ux, uy) = to(dx, ds);
        w.ops().push(Op::Line {
            x1: ux - 5.0,
            y1: uy,
            x2: ux + 5.0,
            y2: uy,
            width: 0.8,
            grey: 0,
        });
        w.ops().push(Op::Line {
            x1: ux,
            y1: uy - 5.0,
            x2: ux,
            y2: uy + 5.0,
            width: 0.8,
            grey: 0,
        });
        for g in &gauges {
            for e in 0..g.element_count() {
                let fp = g.footprint(e);
                let c = fp.corners();
                for k in 0..4 {
                    let (ax, ay) = to(c[k].x_m, c[k].s_m);
                    let (bx, by) = to(c[(k + 1) % 4].x_m, c[(k + 1) % 4].s_m);
                    w.ops().push(Op::Line {
                        x1: ax,
                        y1: ay,
                        x2: bx,
                        y2: by,
                        width: 0.9,
                        grey: 0,
                    });
                }
                let (sin, cos) = fp.angle_rad.sin_cos();
                let half = fp.length_m;
                let (ax, ay) = to(fp.center.x_m - half * cos, fp.center.s_m - half * sin);
                let (bx, by) = to(fp.center.x_m + half * cos, fp.center.s_m + half * sin);
                w.ops().push(Op::Line {
                    x1: ax,
                    y1: ay,
                    x2: bx,
                    y2: by,
                    width: 0.4,
                    grey: 80,
                });
            }
            let (gx, gy) = to(g.position.x_m, g.position.s_m);
            w.text_at(gx + 4.0, gy - 4.0, 8.0, true, g.id.clone());
            // Dimensions from the datum beside each gauge.
            w.text_at(
                gx + 4.0,
                gy + 6.0,
                6.5,
                false,
                format!(
                    "{:.1} / {:.1} mm",
                    (g.position.x_m - dx) * 1e3,
                    (g.position.s_m - ds) * 1e3
                ),
            );
        }
        w.y = top + h + 14.0;
        w.para(
            8.0,
            false,
            &format!(
                "Datum (+) at x = {}, s = {}. Positions below are measured from the datum.",
                mm(dx),
                mm(ds)
            ),
        );
    }
}

fn arm_name(arm: &PlanArm) -> String {
    match arm {
        PlanArm::Grid { gauge, grid } => format!("{gauge} grid {grid}"),
        PlanArm::Dummy { gauge, grid } => format!("dummy like {gauge} grid {grid}"),
        PlanArm::Completion(c) => format!(
            "{:.1} Ω ±{:.2} % resistor, {:.0} ppm/°C",
            c.ohm,
            c.tolerance * 100.0,
            c.tcr_per_c * 1e6
        ),
    }
}

fn wiring_diagram(
    w: &mut Writer,
    project: &Project,
    part: &Part,
    be: &BridgeEvaluation,
    arms: &[PlanArm; 4],
) {
    w.room(190.0);
    let top = w.y;
    let cx = MARGIN + 150.0;
    let (t, b, l, r) = (
        (cx, top + 20.0),
        (cx, top + 160.0),
        (cx - 90.0, top + 90.0),
        (cx + 90.0, top + 90.0),
    );
    let segs = [(l, b), (t, l), (t, r), (r, b)];
    for (k, (p, q)) in segs.iter().enumerate() {
        let at_gauge = !matches!(arms[k], PlanArm::Completion(_));
        w.ops().push(Op::Line {
            x1: p.0,
            y1: p.1,
            x2: q.0,
            y2: q.1,
            width: if at_gauge { 2.2 } else { 0.9 },
            grey: 0,
        });
        let (mx, my) = ((p.0 + q.0) / 2.0, (p.1 + q.1) / 2.0);
        let ox = if mx < cx { -118.0 } else { 8.0 };
        w.text_at(
            mx + ox,
            my,
            7.5,
            false,
            format!("arm {}: {}", k + 1, arm_name(&arms[k])),
        );
    }
    let colours = &project.lead_colours;
    w.text_at(
        t.0 - 30.0,
        t.1 - 6.0,
        8.0,
        true,
        format!("excitation + ({})", colours.excitation_pos),
    );
    w.text_at(
        b.0 - 30.0,
        b.1 + 12.0,
        8.0,
        true,
        format!("excitation − ({})", colours.excitation_neg),
    );
    w.text_at(
        l.0 - 40.0,
        l.1 - 8.0,
        8.0,
        true,
        format!("output + ({})", colours.output_pos),
    );
    w.text_at(
        r.0 + 4.0,
        r.1 - 8.0,
        8.0,
        true,
        format!("output − ({})", colours.output_neg),
    );
    let x = MARGIN + 330.0;
    let lines = [
        if be.wiring.contains("remote sense") {
            format!("Wiring: {}; sense leads {}", be.wiring, colours.sense)
        } else {
            format!("Wiring: {}", be.wiring)
        },
        format!(
            "Shield: {} (one end only, at the instrument)",
            colours.shield
        ),
        "Thick arms: grids at the gauge site; thin: in the instrument.".to_owned(),
        format!("Part: {}", part.name),
    ];
    // Above the level of arm 3's label, which runs to the right towards this column.
    for (i, s) in lines.iter().enumerate() {
        w.text_at(x, top + 8.0 + 11.0 * i as f32, 7.5, false, s.clone());
    }
    w.y = top + 185.0;
}

/// Renders the build sheet to PDF bytes.
pub fn build_sheet_pdf(project: &Project, ev: &Evaluation) -> Result<Vec<u8>, String> {
    render(project, &compose(project, ev))
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

/// Lays out the whole sheet.
fn compose(project: &Project, ev: &Evaluation) -> Writer {
    let mut w = Writer::new(project.paper);
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
        drawing(&mut w, part, &project.placed_gauges(part));
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
            wiring_diagram(&mut w, project, part, be, &plan.arms);
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
    w
}

/// The characters of the sheet's text that its fonts cannot print, each with the first text
/// it occurs in: a name in a script the embedded fonts do not cover would print as empty boxes.
fn unprintable(w: &Writer) -> Vec<(char, String)> {
    use skrifa::MetadataProvider;
    let maps = [
        epaint_default_fonts::UBUNTU_LIGHT,
        epaint_default_fonts::HACK_REGULAR,
    ]
    .map(|data| skrifa::FontRef::new(data).ok());
    let mut out: Vec<(char, String)> = Vec::new();
    for op in w.pages.iter().flatten() {
        let Op::Text { bold, text, .. } = op else {
            continue;
        };
        let Some(font) = &maps[usize::from(*bold)] else {
            continue;
        };
        let charmap = font.charmap();
        for c in text.chars() {
            if !c.is_whitespace() && charmap.map(c).is_none() && out.iter().all(|(d, _)| *d != c) {
                out.push((c, text.clone()));
            }
        }
    }
    out
}

fn render(project: &Project, w: &Writer) -> Result<Vec<u8>, String> {
    let missing = unprintable(w);
    if !missing.is_empty() {
        let chars: String = missing.iter().map(|(c, _)| *c).collect();
        let shown: String = missing[0].1.chars().take(60).collect();
        return Err(format!(
            "the build sheet's fonts cannot print {chars} (first in \"{shown}\"); the sheet prints \
             Latin, Greek and Cyrillic letters: spell names in those, or the sheet would show \
             empty boxes where they stand"
        ));
    }
    let regular = Font::new(epaint_default_fonts::UBUNTU_LIGHT.into(), 0)
        .ok_or("the embedded font could not be read")?;
    let bold = Font::new(epaint_default_fonts::HACK_REGULAR.into(), 0)
        .ok_or("the embedded font could not be read")?;
    let mut doc = Document::new();
    let total = w.pages.len();
    for (i, ops) in w.pages.iter().enumerate() {
        let settings = PageSettings::from_wh(w.width, w.height).ok_or("bad page size")?;
        let mut page = doc.start_page_with(settings);
        let mut surface = page.surface();
        let black = Fill {
            paint: luma::Color::black().into(),
            opacity: NormalizedF32::ONE,
            rule: Default::default(),
        };
        let text = |surface: &mut krilla::surface::Surface,
                    x: f32,
                    y: f32,
                    size: f32,
                    is_bold: bool,
                    s: &str| {
            surface.set_fill(Some(black.clone()));
            surface.set_stroke(None);
            surface.draw_text(
                Point::from_xy(x, y),
                if is_bold {
                    bold.clone()
                } else {
                    regular.clone()
                },
                size,
                s,
                false,
                TextDirection::Auto,
            );
        };
        // Header on every page.
        text(&mut surface, MARGIN, MARGIN, 12.0, true, &project.name);
        text(
            &mut surface,
            w.width - MARGIN - 70.0,
            MARGIN,
            9.0,
            false,
            &format!("page {} of {}", i + 1, total),
        );
        text(
            &mut surface,
            MARGIN,
            MARGIN + 14.0,
            8.5,
            false,
            &format!(
                "Parts: {}   Revision: {}   Date: {}   Prepared by: {}   Checked by: {}",
                project
                    .parts
                    .iter()
                    .map(|p| p.name.as_str())
                    .collect::<Vec<_>>()
                    .join(", "),
                if project.revision.is_empty() {
                    "____"
                } else {
                    &project.revision
                },
                if project.date.is_empty() {
                    "____"
                } else {
                    &project.date
                },
                if project.prepared_by.is_empty() {
                    "________"
                } else {
                    &project.prepared_by
                },
                if project.checked_by.is_empty() {
                    "________"
                } else {
                    &project.checked_by
                },
            ),
        );
        let rule = |surface: &mut krilla::surface::Surface,
                    x1: f32,
                    y1: f32,
                    x2: f32,
                    y2: f32,
                    width: f32,
                    grey: u8| {
            let mut pb = PathBuilder::new();
            pb.move_to(x1, y1);
            pb.line_to(x2, y2);
            if let Some(path) = pb.finish() {
                surface.set_fill(None);
                surface.set_stroke(Some(Stroke {
                    paint: luma::Color::new(grey).into(),
                    width,
                    ..Stroke::default()
                }));
                surface.draw_path(&path);
            }
        };
        rule(
            &mut surface,
            MARGIN,
            MARGIN + 22.0,
            w.width - MARGIN,
            MARGIN + 22.0,
            0.8,
            0,
        );
        for op in ops {
            match op {
                Op::Text {
                    x,
                    y,
                    size,
                    bold: b,
                    text: s,
                } => text(&mut surface, *x, *y, *size, *b, s),
                Op::Line {
                    x1,
                    y1,
                    x2,
                    y2,
                    width,
                    grey,
                } => rule(&mut surface, *x1, *y1, *x2, *y2, *width, *grey),
                Op::Rect {
                    x,
                    y,
                    w: rw,
                    h,
                    fill,
                    stroke,
                } => {
                    let mut pb = PathBuilder::new();
                    if let Some(r) = krilla::geom::Rect::from_xywh(*x, *y, *rw, *h) {
                        pb.push_rect(r);
                    }
                    if let Some(path) = pb.finish() {
                        surface.set_fill(fill.map(|g| Fill {
                            paint: luma::Color::new(g).into(),
                            opacity: NormalizedF32::ONE,
                            rule: Default::default(),
                        }));
                        surface.set_stroke((*stroke > 0.0).then(|| Stroke {
                            width: *stroke,
                            ..Stroke::default()
                        }));
                        surface.draw_path(&path);
                    }
                }
            }
        }
        surface.finish();
        page.finish();
    }
    doc.finish()
        .map_err(|e| format!("could not write the PDF: {e:?}"))
}
