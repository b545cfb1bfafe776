//! One part on the build sheet: what it is, how hard it is loaded, its views and face
//! drawings, and its gauges.

use gw_mechanics::{BeamSupport, LoadPoint, Member, Section, VesselEnds};

use super::writer::{BODY, Writer};
use super::{face_drawings, len, part_views};
use crate::document::{Part, Project};
use crate::evaluate::PartEvaluation;
use crate::units::{Quantity, Units, number_text};

pub(crate) fn part_description(part: &Part, units: Units) -> String {
    let mm = |v: f64| len(units, v);
    let m = &part.member;
    let material = m.material();
    let dims = match m {
        Member::Beam(b) => format!(
            "{}, length {}, {}; {}",
            match b.support {
                BeamSupport::Cantilever =>
                    "Cantilever beam, clamped at x = 0, free at the other end",
                BeamSupport::SimplySupported => "Simply supported beam, pinned at both ends",
            },
            mm(b.length_m),
            section_words(&b.section, units),
            load_point_words(&b.load_points, units)
        ),
        Member::Shaft(s) => format!(
            "Shaft, outer diameter {}, bore {}, length {}",
            mm(s.outer_diameter_m),
            if s.inner_diameter_m > 0.0 {
                mm(s.inner_diameter_m)
            } else {
                "none (solid)".to_owned()
            },
            mm(s.length_m)
        ),
        Member::ThinCylinder(v) => format!(
            "Thin-walled cylinder, outer diameter {}, wall {}, length {}, {} ends",
            mm(v.outer_diameter_m),
            mm(v.wall_m),
            mm(v.length_m),
            match v.ends {
                VesselEnds::Closed => "closed",
                VesselEnds::Open => "open",
            }
        ),
        Member::ThinSphere(v) => format!(
            "Thin-walled sphere, outer diameter {}, wall {}",
            mm(v.outer_diameter_m),
            mm(v.wall_m)
        ),
        Member::ThickCylinder(v) => format!(
            "Thick-walled cylinder, outer diameter {}, bore {}, length {}",
            mm(v.outer_diameter_m),
            mm(v.inner_diameter_m),
            mm(v.length_m)
        ),
        Member::PlateWithHole(p) => format!(
            "Plate {} wide × {} high × {} thick, hole of diameter {} at its centre",
            mm(p.width_m),
            mm(p.height_m),
            mm(p.thickness_m),
            mm(p.hole_diameter_m)
        ),
        Member::GivenState(g) => format!(
            "A region of a larger part with a given surface state, {} × {}",
            mm(g.length_m),
            mm(g.width_m)
        ),
        Member::ImportedField(f) => imported_words(f, units),
    };
    format!(
        "{dims}. Material {} (yield {}).",
        material.name,
        units.format_stress(material.yield_strength_pa)
    )
}

/// A beam section in the words and sizes a technician can check with a calliper.
fn section_words(section: &Section, units: Units) -> String {
    let mm = |v: f64| len(units, v);
    match section {
        Section::Rectangle { width_m, height_m } => format!(
            "solid rectangular section {} wide × {} high",
            mm(*width_m),
            mm(*height_m)
        ),
        Section::SolidRound { diameter_m } => {
            format!("solid round section, diameter {}", mm(*diameter_m))
        }
        Section::RoundTube {
            outer_diameter_m,
            inner_diameter_m,
        } => format!(
            "round tube, outer diameter {}, wall {}",
            mm(*outer_diameter_m),
            mm((outer_diameter_m - inner_diameter_m) / 2.0)
        ),
        Section::RectangularTube {
            width_m,
            height_m,
            wall_m,
        } => format!(
            "rectangular tube {} wide × {} high, wall {}",
            mm(*width_m),
            mm(*height_m),
            mm(*wall_m)
        ),
        Section::IBeam {
            flange_width_m,
            depth_m,
            flange_thickness_m,
            web_thickness_m,
        } => format!(
            "I section {} deep, flanges {} wide × {} thick, web {} thick",
            mm(*depth_m),
            mm(*flange_width_m),
            mm(*flange_thickness_m),
            mm(*web_thickness_m)
        ),
    }
}

/// Where the load acts along a beam, with the share of it at each point.
fn load_point_words(points: &[LoadPoint], units: Units) -> String {
    let mm = |v: f64| len(units, v);
    let at: Vec<String> = points
        .iter()
        .map(|p| {
            if (p.multiple - 1.0).abs() < 1e-12 {
                format!("x = {}", mm(p.position_m))
            } else {
                format!(
                    "x = {} ({:.0} % of it)",
                    mm(p.position_m),
                    p.multiple * 100.0
                )
            }
        })
        .collect();
    format!("the load acts at {}", at.join(", "))
}

/// The gauge's angle, and each grid's direction on a gauge with several grids.
fn grid_angles(g: &gw_bridge::PlacedGauge) -> String {
    let n = g.element_count();
    if n <= 1 {
        return format!("{:.1}°", g.angle_rad.to_degrees());
    }
    (0..n)
        .map(|k| {
            let deg =
                crate::drawing::face_layout::normalised_deg(g.element_angle_rad(k).to_degrees());
            format!("grid {}: {deg:.1}°", k + 1)
        })
        .collect::<Vec<_>>()
        .join("\n")
}

/// The gauge table: what each gauge is and where it goes.
fn gauge_rows(project: &Project, part: &Part, units: Units) -> Vec<Vec<String>> {
    let mm = |v: f64| len(units, v);
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
            "Angle from x",
            "Area to prepare, along × across the gauge",
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
            g.position.face.name().into_owned(),
            mm(g.position.x_m - part.datum_m.0),
            mm(g.position.s_m - part.datum_m.1),
            grid_angles(g),
            // Grid plus 10 mm all round for abrading and cleaning: common practice.
            prepared_area(units, s.grid_length_m + 0.02, s.grid_width_m + 0.02),
        ]);
    }
    rows
}

/// The area to prepare, "along × across": a rough size, to whole millimetres or hundredths of
/// an inch.
fn prepared_area(units: Units, along_m: f64, across_m: f64) -> String {
    let q = Quantity::Length;
    let places = match units {
        Units::Si => 0,
        Units::UsCustomary => 2,
    };
    let shown = |m: f64| number_text(units.to_display(q, m), places);
    format!(
        "{} × {} {}",
        shown(along_m),
        shown(across_m),
        units.label(q)
    )
}

/// Everything about one part, before its bridges.
pub(crate) fn draw(w: &mut Writer, project: &Project, part: &Part, pe: &PartEvaluation) {
    w.new_page();
    w.heading(&format!("Part: {}", part.name));
    let units = w.units;
    w.para(9.0, false, &part_description(part, units));
    let stress = |pa: f64| units.format_stress(pa);
    for c in &pe.cases {
        w.para(
            BODY,
            false,
            &format!(
                "{}: largest von Mises stress {} {} ({}).",
                c.case,
                stress(c.peak_von_mises_pa),
                c.peak_location_text(units),
                c.yield_words()
            ),
        );
        if let (Some(membrane), Some(outer)) = (c.membrane_hoop_pa, c.outer_hoop_pa) {
            w.para(
                BODY,
                false,
                &format!(
                    "Hoop stress {} at the mean radius (membrane, the design figure); \
                     {} on the outer surface, which is what the gauges read.",
                    stress(membrane),
                    stress(outer)
                ),
            );
        }
    }
    part_views::draw(w, part);
    let placed = project.placed_gauges(part);
    face_drawings::draw(w, part, &placed);
    super::close_ups::draw(w, part, &placed);
    w.heading("Gauges");
    w.table(
        &[0.6, 1.3, 0.7, 0.9, 0.7, 1.1, 0.9, 0.9, 1.2, 1.3],
        &gauge_rows(project, part, units),
    );
}

/// An imported part in words: its size, mesh and the results it rests on.
fn imported_words(f: &gw_mechanics::imported::ImportedSurface, units: Units) -> String {
    let Some(field) = f.surface() else {
        return "A part from imported finite-element results (not read)".to_owned();
    };
    let (lo, hi) = field.nodes_m().iter().fold(
        ([f64::INFINITY; 3], [f64::NEG_INFINITY; 3]),
        |(lo, hi), p| {
            (
                std::array::from_fn(|k| lo[k].min(p[k])),
                std::array::from_fn(|k| hi[k].max(p[k])),
            )
        },
    );
    let results: Vec<String> = f
        .loads
        .iter()
        .map(|l| {
            let name = if l.name.is_empty() {
                l.component.name()
            } else {
                l.name.as_str()
            };
            format!("{name} ({}, per {})", l.file, l.component.unit())
        })
        .collect();
    format!(
        "A part from imported finite-element results, {} × {} × {} overall, {} surface nodes on \
         {} faces; results: {}",
        len(units, hi[0] - lo[0]),
        len(units, hi[1] - lo[1]),
        len(units, hi[2] - lo[2]),
        field.node_count(),
        field.patches().len(),
        results.join("; ")
    )
}
