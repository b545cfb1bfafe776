//! One part on the build sheet: what it is, how hard it is loaded, its views and face
//! drawings, and its gauges.

use gw_mechanics::Member;

use super::writer::{BODY, Writer};
use super::{face_drawings, mm, part_views};
use crate::document::{Part, Project};
use crate::evaluate::PartEvaluation;

pub(crate) fn part_description(part: &Part) -> String {
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

/// The gauge table: what each gauge is and where it goes.
fn gauge_rows(project: &Project, part: &Part) -> Vec<Vec<String>> {
    let mut rows = vec![
        [
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
        .map(String::from)
        .to_vec(),
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
    rows
}

/// Everything about one part, before its bridges.
pub(crate) fn draw(w: &mut Writer, project: &Project, part: &Part, pe: &PartEvaluation) {
    w.new_page();
    w.heading(&format!("Part: {}", part.name));
    w.para(9.0, false, &part_description(part));
    for c in &pe.cases {
        w.para(
            BODY,
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
                BODY,
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
    part_views::draw(w, part);
    face_drawings::draw(w, part, &project.placed_gauges(part));
    w.heading("Gauges");
    w.table(
        &[0.7, 1.5, 0.8, 0.9, 0.7, 1.2, 0.9, 0.9, 0.7, 1.2],
        &gauge_rows(project, part),
    );
}
