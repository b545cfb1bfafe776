//! The editable dimensions of each member kind, as a list the part panel shows.

use gw_mechanics::{Member, Section};

use crate::units::Quantity;

/// One editable dimension.
pub struct Field {
    /// Label.
    pub label: &'static str,
    /// Quantity for units.
    pub quantity: Quantity,
    /// Current SI value.
    pub value: f64,
    /// Tooltip.
    pub help: &'static str,
}

fn f(label: &'static str, quantity: Quantity, value: f64, help: &'static str) -> Field {
    Field {
        label,
        quantity,
        value,
        help,
    }
}

fn section_fields(s: &Section, out: &mut Vec<Field>) {
    use Quantity::Length as L;
    match *s {
        Section::Rectangle { width_m, height_m } => {
            out.push(f(
                "Section width",
                L,
                width_m,
                "Width of the solid rectangle, across the beam (y).",
            ));
            out.push(f(
                "Section height",
                L,
                height_m,
                "Height of the solid rectangle, in the plane of vertical bending (z).",
            ));
        }
        Section::SolidRound { diameter_m } => out.push(f(
            "Diameter",
            L,
            diameter_m,
            "Diameter of the solid round bar.",
        )),
        Section::RoundTube {
            outer_diameter_m,
            inner_diameter_m,
        } => {
            out.push(f(
                "Outer diameter",
                L,
                outer_diameter_m,
                "Outer diameter of the tube.",
            ));
            out.push(f(
                "Inner diameter",
                L,
                inner_diameter_m,
                "Bore of the tube; must be smaller than the outer diameter.",
            ));
        }
        Section::RectangularTube {
            width_m,
            height_m,
            wall_m,
        } => {
            out.push(f(
                "Section width",
                L,
                width_m,
                "Outside width of the hollow section.",
            ));
            out.push(f(
                "Section height",
                L,
                height_m,
                "Outside height of the hollow section.",
            ));
            out.push(f("Wall thickness", L, wall_m, "Uniform wall thickness."));
        }
        Section::IBeam {
            flange_width_m,
            depth_m,
            flange_thickness_m,
            web_thickness_m,
        } => {
            out.push(f(
                "Flange width",
                L,
                flange_width_m,
                "Width of each flange.",
            ));
            out.push(f("Depth", L, depth_m, "Overall depth of the I section."));
            out.push(f(
                "Flange thickness",
                L,
                flange_thickness_m,
                "Thickness of each flange.",
            ));
            out.push(f(
                "Web thickness",
                L,
                web_thickness_m,
                "Thickness of the web.",
            ));
        }
    }
}

fn set_section(s: &mut Section, i: usize, v: f64) {
    match s {
        Section::Rectangle { width_m, height_m } => *[width_m, height_m][i.min(1)] = v,
        Section::SolidRound { diameter_m } => *diameter_m = v,
        Section::RoundTube {
            outer_diameter_m,
            inner_diameter_m,
        } => *[outer_diameter_m, inner_diameter_m][i.min(1)] = v,
        Section::RectangularTube {
            width_m,
            height_m,
            wall_m,
        } => *[width_m, height_m, wall_m][i.min(2)] = v,
        Section::IBeam {
            flange_width_m,
            depth_m,
            flange_thickness_m,
            web_thickness_m,
        } => *[flange_width_m, depth_m, flange_thickness_m, web_thickness_m][i.min(3)] = v,
    }
}

/// The member's editable dimensions, SI.
pub fn fields(m: &Member) -> Vec<Field> {
    use Quantity::Length as L;
    let mut out = Vec::new();
    match m {
        Member::Beam(b) => {
            out.push(f("Length", L, b.length_m, "Length of the beam (span)."));
            out.push(f(
                "Load position",
                L,
                b.load_position_m,
                "Where the point load acts, from the fixed end or left support.",
            ));
            section_fields(&b.section, &mut out);
        }
        Member::Shaft(s) => {
            out.push(f(
                "Length",
                L,
                s.length_m,
                "Length of shaft shown and available for gauges.",
            ));
            out.push(f(
                "Outer diameter",
                L,
                s.outer_diameter_m,
                "Outer diameter of the shaft.",
            ));
            out.push(f(
                "Bore diameter",
                L,
                s.inner_diameter_m,
                "Bore diameter; 0 for a solid shaft.",
            ));
        }
        Member::ThinCylinder(v) => {
            out.push(f(
                "Length",
                L,
                v.length_m,
                "Length of the cylindrical shell shown.",
            ));
            out.push(f(
                "Outer diameter",
                L,
                v.outer_diameter_m,
                "Outer diameter of the shell.",
            ));
            out.push(f(
                "Wall thickness",
                L,
                v.wall_m,
                "Wall thickness; thin-wall formulas need mean radius ≥ 10 × wall.",
            ));
        }
        Member::ThinSphere(v) => {
            out.push(f(
                "Outer diameter",
                L,
                v.outer_diameter_m,
                "Outer diameter of the sphere.",
            ));
            out.push(f("Wall thickness", L, v.wall_m, "Wall thickness."));
        }
        Member::ThickCylinder(v) => {
            out.push(f("Length", L, v.length_m, "Length shown."));
            out.push(f(
                "Outer diameter",
                L,
                v.outer_diameter_m,
                "Outer diameter.",
            ));
            out.push(f("Inner diameter", L, v.inner_diameter_m, "Bore diameter."));
        }
        Member::PlateWithHole(p) => {
            out.push(f(
                "Hole diameter",
                L,
                p.hole_diameter_m,
                "Diameter of the circular hole.",
            ));
            out.push(f("Plate width", L, p.width_m, "Plate width along x."));
            out.push(f("Plate height", L, p.height_m, "Plate height along y."));
            out.push(f("Plate thickness", L, p.thickness_m, "Plate thickness."));
        }
        Member::GivenState(g) => {
            out.push(f(
                "Patch length",
                L,
                g.length_m,
                "Length of the region with the given state.",
            ));
            out.push(f(
                "Patch width",
                L,
                g.width_m,
                "Width of the region with the given state.",
            ));
        }
    }
    out
}

/// A copy of the member with field `i` set to `v` (SI). The caller validates it.
pub fn with_field(m: &Member, i: usize, v: f64) -> Member {
    let mut m = m.clone();
    match &mut m {
        Member::Beam(b) => match i {
            0 => b.length_m = v,
            1 => b.load_position_m = v,
            k => set_section(&mut b.section, k - 2, v),
        },
        Member::Shaft(s) => {
            *[
                &mut s.length_m,
                &mut s.outer_diameter_m,
                &mut s.inner_diameter_m,
            ][i.min(2)] = v
        }
        Member::ThinCylinder(c) => {
            *[&mut c.length_m, &mut c.outer_diameter_m, &mut c.wall_m][i.min(2)] = v
        }
        Member::ThinSphere(c) => *[&mut c.outer_diameter_m, &mut c.wall_m][i.min(1)] = v,
        Member::ThickCylinder(c) => {
            *[
                &mut c.length_m,
                &mut c.outer_diameter_m,
                &mut c.inner_diameter_m,
            ][i.min(2)] = v
        }
        Member::PlateWithHole(p) => {
            *[
                &mut p.hole_diameter_m,
                &mut p.width_m,
                &mut p.height_m,
                &mut p.thickness_m,
            ][i.min(3)] = v
        }
        Member::GivenState(g) => *[&mut g.length_m, &mut g.width_m][i.min(1)] = v,
    }
    m
}
