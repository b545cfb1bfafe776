//! The inspector's fields for each kind of item: project header, gauge stock type, part,
//! load case, gauge and bridge. One line per field of the document.

use gw_bridge::signal_chain::LowPassFilter;
use gw_bridge::{
    Excitation, GaugePattern, GaugeSpec, InstrumentTemperature, LeadWiring, ShuntLocation,
    ShuntPlan, ThermalOutput,
};
use gw_mechanics::{
    BeamSupport, GivenQuantity, LoadComponent, LoadPoint, Material, Member, Section, SurfaceStrain,
    VesselEnds,
};
use gw_plan::blank::ModelKind;
use gw_plan::document::{BridgeFactorOverride, GaugeLot, PaperSize, RequiredAccuracy};
use gw_plan::{BridgePlan, LoadCase, Part, PlanArm, PlanGauge, Project, StockGauge};

use super::fields::*;
use crate::units::{Quantity, Units};

/// Project header, reference temperature, warning level, lead colours and notes.
pub fn project_groups() -> Vec<Group<Project>> {
    vec![
        Group {
            title: "Project".into(),
            fields: header_fields(),
        },
        Group {
            title: "Lead colours (the project's own scheme; edit to the site's practice)".into(),
            fields: lead_colour_fields(),
        },
        Group {
            title: "Check-out and test".into(),
            fields: vec![info(
                "records",
                "Records",
                "Values recorded at installation and the first test's log: edited under \
                 \"Check-out and test\" in the plan tree, imported from the File menu",
                "Select \"Check-out and test\" in the plan tree".into(),
            )],
        },
    ]
}

/// The lead colour of each conductor role.
fn lead_colour_fields() -> Vec<Field<Project>> {
    vec![
        text(
            "lead_colours.excitation_pos",
            "Excitation +",
            "Colour of the excitation + lead",
            |p: &Project| p.lead_colours.excitation_pos.clone(),
            |p, v| p.lead_colours.excitation_pos = v,
        ),
        text(
            "lead_colours.excitation_neg",
            "Excitation −",
            "Colour of the excitation − lead",
            |p: &Project| p.lead_colours.excitation_neg.clone(),
            |p, v| p.lead_colours.excitation_neg = v,
        ),
        text(
            "lead_colours.output_pos",
            "Output +",
            "Colour of the output + lead",
            |p: &Project| p.lead_colours.output_pos.clone(),
            |p, v| p.lead_colours.output_pos = v,
        ),
        text(
            "lead_colours.output_neg",
            "Output −",
            "Colour of the output − lead",
            |p: &Project| p.lead_colours.output_neg.clone(),
            |p, v| p.lead_colours.output_neg = v,
        ),
        text(
            "lead_colours.sense",
            "Sense",
            "Colour of sense leads",
            |p: &Project| p.lead_colours.sense.clone(),
            |p, v| p.lead_colours.sense = v,
        ),
        text(
            "lead_colours.shield",
            "Shield",
            "Shield or drain wire",
            |p: &Project| p.lead_colours.shield.clone(),
            |p, v| p.lead_colours.shield = v,
        ),
    ]
}

/// The project header, reference temperature, warning level and notes.
fn header_fields() -> Vec<Field<Project>> {
    vec![
        text(
            "name",
            "Name",
            "Project name, printed on every page of the build sheet",
            |p: &Project| p.name.clone(),
            |p, v| p.name = v,
        ),
        text(
            "revision",
            "Revision",
            "Revision label of this plan",
            |p: &Project| p.revision.clone(),
            |p, v| p.revision = v,
        ),
        text(
            "date",
            "Date",
            "Date of this revision",
            |p: &Project| p.date.clone(),
            |p, v| p.date = v,
        ),
        text(
            "prepared_by",
            "Prepared by",
            "Who prepared the plan",
            |p: &Project| p.prepared_by.clone(),
            |p, v| p.prepared_by = v,
        ),
        text(
            "checked_by",
            "Checked by",
            "Who checked the plan",
            |p: &Project| p.checked_by.clone(),
            |p, v| p.checked_by = v,
        ),
        pick(
            "paper",
            "Paper",
            "Paper size of the build sheet",
            &[(PaperSize::A4, "A4"), (PaperSize::Letter, "Letter")],
            |p: &Project| p.paper,
            |p, v| p.paper = v,
        ),
        pick(
            "marking_templates",
            "Marking templates",
            "Whether the build sheet ends with a 1:1 marking template of each face with gauges \
             (print at 100 % and check the 50 mm bar before marking out)",
            &[(true, "included"), (false, "left out")],
            |p: &Project| p.marking_templates,
            |p, v| p.marking_templates = v,
        ),
        num(
            "reference_temperature_c",
            "Reference temperature",
            Unit::Of(Quantity::Temperature),
            "Temperature at which bridges are zeroed and gauge data apply",
            |p: &Project| p.reference_temperature_c,
            |p, v| p.reference_temperature_c = v,
        ),
        num(
            "warn_utilisation",
            "Warn above",
            PERCENT,
            "Utilisation of a limit above which a margin warns",
            |p: &Project| p.warn_utilisation,
            |p, v| p.warn_utilisation = v,
        ),
        num(
            "zero_band_fraction",
            "Zero band above",
            PERCENT,
            "Fraction of a bridge's full scale its zero band may take before a finding notes it \
             (10 % is common practice)",
            |p: &Project| p.zero_band_fraction,
            |p, v| p.zero_band_fraction = v,
        ),
        Field {
            path: "notes",
            label: "Notes".into(),
            help: "Free notes",
            editor: Editor::Text {
                multiline: true,
                get: Box::new(|p: &Project| p.notes.clone()),
                set: Box::new(|p, v| p.notes = v),
            },
        },
    ]
}

const PATTERNS: [(GaugePattern, &str); 5] = [
    (GaugePattern::SingleGrid, "single grid"),
    (GaugePattern::TwoElement90, "two-element 90°"),
    (
        GaugePattern::RectangularRosette,
        "rectangular rosette 0/45/90",
    ),
    (GaugePattern::DeltaRosette, "delta rosette 0/60/120"),
    (GaugePattern::ShearPair, "±45° shear pair"),
];

/// The thermal-output fields of a gauge type or lot, reached through `at`.
fn thermal_fields<T: 'static>(
    prefix: &'static [&'static str; 4],
    at: fn(&T) -> &ThermalOutput,
    at_mut: fn(&mut T) -> &mut ThermalOutput,
) -> Vec<Field<T>> {
    let mut out = vec![num(
        prefix[0],
        "Matched expansion",
        PPM_PER_DEGREE,
        "Expansion coefficient of the material the gauge is matched to",
        move |t: &T| at(t).matched_cte_per_c,
        move |t, v| at_mut(t).matched_cte_per_c = v,
    )];
    let names = [
        "Thermal output c0 (T in °C)",
        "c1 (per °C)",
        "c2 (per °C²)",
        "c3 (per °C³)",
    ];
    let helps: [&'static str; 4] = [
        "Lot curve: apparent strain = c0 + c1·T + c2·T² + c3·T³ (T in °C), µε, on the matched material",
        "Coefficient of T, µε/°C",
        "Coefficient of T², µε/°C²",
        "Coefficient of T³, µε/°C³",
    ];
    for (k, name) in names.iter().enumerate() {
        out.push(num(
            prefix[1],
            name,
            THERMAL_COEFFICIENT,
            helps[k],
            move |t: &T| at(t).lot_polynomial.get(k).copied().unwrap_or(0.0),
            move |t, v| {
                let poly = &mut at_mut(t).lot_polynomial;
                if poly.len() <= k {
                    poly.resize(k + 1, 0.0);
                }
                poly[k] = v;
                while poly.last() == Some(&0.0) {
                    poly.pop();
                }
            },
        ));
    }
    out.push(flag(prefix[2], "Curve recorded at a set gauge factor", "Data sheets give the curve as read with the instrument at a stated gauge factor (often 2.00)", move |t: &T| at(t).reference_gauge_factor.is_some(), move |t, on| at_mut(t).reference_gauge_factor = on.then_some(2.0)));
    if_some(
        &mut out,
        prefix[2],
        "Curve's gauge factor",
        PLAIN,
        "Gauge factor the curve was recorded at",
        move |t: &T| at(t).reference_gauge_factor,
        move |t, v| at_mut(t).reference_gauge_factor = Some(v),
    );
    out.push(flag(prefix[3], "Curve's temperature range stated", "The temperatures between which the curve was measured; outside them it is an extrapolation", move |t: &T| at(t).valid_range_c.is_some(), move |t, on| at_mut(t).valid_range_c = on.then_some((-30.0, 120.0))));
    if_some(
        &mut out,
        prefix[3],
        "Curve valid from",
        Unit::Of(Quantity::Temperature),
        "Low end of the curve's range",
        move |t: &T| at(t).valid_range_c.map(|r| r.0),
        move |t, v| {
            if let Some(r) = &mut at_mut(t).valid_range_c {
                r.0 = v
            }
        },
    );
    if_some(
        &mut out,
        prefix[3],
        "Curve valid to",
        Unit::Of(Quantity::Temperature),
        "High end of the curve's range",
        move |t: &T| at(t).valid_range_c.map(|r| r.1),
        move |t, v| {
            if let Some(r) = &mut at_mut(t).valid_range_c {
                r.1 = v
            }
        },
    );
    out
}

/// A number field that only reads when the value is present (the get returns `None` for an
/// absent value, and the field is then not shown by the inspector).
fn if_some<T: 'static>(
    out: &mut Vec<Field<T>>,
    path: &'static str,
    label: &str,
    unit: Unit,
    help: &'static str,
    get: impl Fn(&T) -> Option<f64> + 'static,
    set: impl Fn(&mut T, f64) + 'static,
) {
    out.push(Field {
        path,
        label: label.to_owned(),
        help,
        editor: Editor::Number {
            unit,
            get: Box::new(move |t| get(t).unwrap_or(f64::NAN)),
            set: Box::new(set),
        },
    });
}

/// A gauge type of the stock.
pub fn stock_groups() -> Vec<Group<StockGauge>> {
    fn spec(s: &StockGauge) -> &GaugeSpec {
        &s.spec
    }
    fn f(s: &StockGauge) -> &ThermalOutput {
        &s.spec.thermal_output
    }
    fn f_mut(s: &mut StockGauge) -> &mut ThermalOutput {
        &mut s.spec.thermal_output
    }
    let _ = spec;
    vec![
        Group {
            title: "Gauge type".into(),
            fields: stock_type_fields(),
        },
        Group {
            title: "Limits".into(),
            fields: stock_limit_fields(),
        },
        Group {
            title: "Thermal output".into(),
            fields: thermal_fields(
                &[
                    "spec.thermal_output.matched_cte_per_c",
                    "spec.thermal_output.lot_polynomial",
                    "spec.thermal_output.reference_gauge_factor",
                    "spec.thermal_output.valid_range_c",
                ],
                f,
                f_mut,
            ),
        },
    ]
}

/// Strain, fatigue and self-heating limits of a stock type.
fn stock_limit_fields() -> Vec<Field<StockGauge>> {
    vec![
        num(
            "spec.strain_limit",
            "Strain limit",
            MICROSTRAIN,
            "Largest strain the grid survives once",
            |s: &StockGauge| s.spec.strain_limit,
            |s, v| s.spec.strain_limit = v,
        ),
        num(
            "spec.fatigue_strain_limit",
            "Fatigue strain limit",
            MICROSTRAIN,
            "Strain amplitude the grid survives for the rated cycles",
            |s: &StockGauge| s.spec.fatigue_strain_limit,
            |s, v| s.spec.fatigue_strain_limit = v,
        ),
        num(
            "spec.max_power_density_w_m2",
            "Allowed power density",
            Unit::Of(Quantity::PowerDensity),
            "Self-heating limit; depends on the part's heat sinking (common practice: about 3 kW/m², 2 W/in², on thick steel)",
            |s: &StockGauge| s.spec.max_power_density_w_m2,
            |s, v| s.spec.max_power_density_w_m2 = v,
        ),
    ]
}

/// Pattern, grid, resistance and gauge factor of a stock type.
fn stock_type_fields() -> Vec<Field<StockGauge>> {
    vec![
        text(
            "name",
            "Name",
            "Name the placed gauges refer to",
            |s: &StockGauge| s.name.clone(),
            |s, v| s.name = v,
        ),
        pick(
            "spec.pattern",
            "Pattern",
            "Layout of the grids",
            &PATTERNS,
            |s: &StockGauge| s.spec.pattern,
            |s, v| s.spec.pattern = v,
        ),
        num(
            "spec.grid_length_m",
            "Grid length",
            LENGTH,
            "Active grid length",
            |s: &StockGauge| s.spec.grid_length_m,
            |s, v| s.spec.grid_length_m = v,
        ),
        num(
            "spec.grid_width_m",
            "Grid width",
            LENGTH,
            "Active grid width",
            |s: &StockGauge| s.spec.grid_width_m,
            |s, v| s.spec.grid_width_m = v,
        ),
        num(
            "spec.resistance_ohm",
            "Resistance",
            OHM,
            "Nominal grid resistance (120, 350, 1000 Ω or any)",
            |s: &StockGauge| s.spec.resistance_ohm,
            |s, v| s.spec.resistance_ohm = v,
        ),
        num(
            "spec.resistance_tolerance",
            "Resistance tolerance",
            PERCENT,
            "± tolerance of the grid resistance",
            |s: &StockGauge| s.spec.resistance_tolerance,
            |s, v| s.spec.resistance_tolerance = v,
        ),
        num(
            "spec.gauge_factor",
            "Gauge factor",
            GAUGE_FACTOR,
            "Gauge factor at the reference temperature",
            |s: &StockGauge| s.spec.gauge_factor,
            |s, v| s.spec.gauge_factor = v,
        ),
        num(
            "spec.gauge_factor_tolerance",
            "Gauge-factor tolerance",
            PERCENT,
            "± tolerance of the gauge factor",
            |s: &StockGauge| s.spec.gauge_factor_tolerance,
            |s, v| s.spec.gauge_factor_tolerance = v,
        ),
        num(
            "spec.transverse_sensitivity",
            "Transverse sensitivity",
            PERCENT,
            "Kt of the grid",
            |s: &StockGauge| s.spec.transverse_sensitivity,
            |s, v| s.spec.transverse_sensitivity = v,
        ),
        num(
            "spec.gauge_factor_temp_coeff_per_c",
            "Gauge-factor drift",
            PPM_PER_DEGREE,
            "Relative change of the gauge factor per degree of temperature",
            |s: &StockGauge| s.spec.gauge_factor_temp_coeff_per_c,
            |s, v| s.spec.gauge_factor_temp_coeff_per_c = v,
        ),
    ]
}

fn member_of(p: &Part) -> &Member {
    &p.member
}

/// Reads a dimension of the part's member through `get`, NaN when the member is another kind.
fn dim<M: 'static>(
    path: &'static str,
    label: &str,
    help: &'static str,
    view: fn(&Member) -> Option<&M>,
    edit: fn(&mut Member) -> Option<&mut M>,
    get: fn(&M) -> f64,
    set: fn(&mut M, f64),
) -> Field<Part> {
    num(
        path,
        label,
        LENGTH,
        help,
        move |p: &Part| view(member_of(p)).map(get).unwrap_or(f64::NAN),
        move |p, v| {
            if let Some(m) = edit(&mut p.member) {
                set(m, v)
            }
        },
    )
}

macro_rules! kind_access {
    ($view:ident, $edit:ident, $variant:ident, $ty:ty) => {
        fn $view(m: &Member) -> Option<&$ty> {
            match m {
                Member::$variant(x) => Some(x),
                _ => None,
            }
        }
        fn $edit(m: &mut Member) -> Option<&mut $ty> {
            match m {
                Member::$variant(x) => Some(x),
                _ => None,
            }
        }
    };
}
kind_access!(beam, beam_mut, Beam, gw_mechanics::Beam);
kind_access!(shaft, shaft_mut, Shaft, gw_mechanics::Shaft);
kind_access!(thin, thin_mut, ThinCylinder, gw_mechanics::ThinCylinder);
kind_access!(sphere, sphere_mut, ThinSphere, gw_mechanics::ThinSphere);
kind_access!(thick, thick_mut, ThickCylinder, gw_mechanics::ThickCylinder);
kind_access!(plate, plate_mut, PlateWithHole, gw_mechanics::PlateWithHole);
kind_access!(given, given_mut, GivenState, gw_mechanics::GivenState);

const SECTIONS: [&str; 5] = [
    "solid rectangle",
    "solid round",
    "round tube",
    "rectangular tube",
    "I section",
];

/// A section of kind `k` with about the size of `s`.
fn section_like(s: &Section, k: usize) -> Section {
    let (w, h) = (s.width_m(), s.height_m());
    match k {
        0 => Section::Rectangle {
            width_m: w,
            height_m: h,
        },
        1 => Section::SolidRound { diameter_m: h },
        2 => Section::RoundTube {
            outer_diameter_m: h,
            inner_diameter_m: 0.7 * h,
        },
        3 => Section::RectangularTube {
            width_m: w,
            height_m: h,
            wall_m: 0.1 * w.min(h),
        },
        _ => Section::IBeam {
            flange_width_m: w,
            depth_m: h,
            flange_thickness_m: 0.1 * h,
            web_thickness_m: 0.1 * w,
        },
    }
}

fn section_index(s: &Section) -> usize {
    match s {
        Section::Rectangle { .. } => 0,
        Section::SolidRound { .. } => 1,
        Section::RoundTube { .. } => 2,
        Section::RectangularTube { .. } => 3,
        Section::IBeam { .. } => 4,
    }
}

fn section_dim(path: &'static str, label: &str, help: &'static str, k: usize) -> Field<Part> {
    fn dims(s: &mut Section) -> Vec<&mut f64> {
        match s {
            Section::Rectangle { width_m, height_m } => vec![width_m, height_m],
            Section::SolidRound { diameter_m } => vec![diameter_m],
            Section::RoundTube {
                outer_diameter_m,
                inner_diameter_m,
            } => vec![outer_diameter_m, inner_diameter_m],
            Section::RectangularTube {
                width_m,
                height_m,
                wall_m,
            } => vec![width_m, height_m, wall_m],
            Section::IBeam {
                flange_width_m,
                depth_m,
                flange_thickness_m,
                web_thickness_m,
            } => vec![flange_width_m, depth_m, flange_thickness_m, web_thickness_m],
        }
    }
    num(
        path,
        label,
        LENGTH,
        help,
        move |p: &Part| {
            beam(&p.member)
                .map(|b| {
                    let mut s = b.section;
                    dims(&mut s).get(k).map(|v| **v).unwrap_or(f64::NAN)
                })
                .unwrap_or(f64::NAN)
        },
        move |p, v| {
            if let Some(b) = beam_mut(&mut p.member)
                && let Some(d) = dims(&mut b.section).into_iter().nth(k)
            {
                *d = v
            }
        },
    )
}

fn section_fields(s: &Section) -> Vec<Field<Part>> {
    match s {
        Section::Rectangle { .. } => vec![
            section_dim(
                "member.Beam.section.Rectangle.width_m",
                "Section width",
                "Width across the beam (y)",
                0,
            ),
            section_dim(
                "member.Beam.section.Rectangle.height_m",
                "Section height",
                "Height in the plane of vertical bending (z)",
                1,
            ),
        ],
        Section::SolidRound { .. } => vec![section_dim(
            "member.Beam.section.SolidRound.diameter_m",
            "Diameter",
            "Diameter of the round bar",
            0,
        )],
        Section::RoundTube { .. } => vec![
            section_dim(
                "member.Beam.section.RoundTube.outer_diameter_m",
                "Outer diameter",
                "Outer diameter of the tube",
                0,
            ),
            section_dim(
                "member.Beam.section.RoundTube.inner_diameter_m",
                "Inner diameter",
                "Bore; smaller than the outer diameter",
                1,
            ),
        ],
        Section::RectangularTube { .. } => vec![
            section_dim(
                "member.Beam.section.RectangularTube.width_m",
                "Section width",
                "Outside width",
                0,
            ),
            section_dim(
                "member.Beam.section.RectangularTube.height_m",
                "Section height",
                "Outside height",
                1,
            ),
            section_dim(
                "member.Beam.section.RectangularTube.wall_m",
                "Wall thickness",
                "Uniform wall thickness",
                2,
            ),
        ],
        Section::IBeam { .. } => vec![
            section_dim(
                "member.Beam.section.IBeam.flange_width_m",
                "Flange width",
                "Width of each flange",
                0,
            ),
            section_dim(
                "member.Beam.section.IBeam.depth_m",
                "Depth",
                "Overall depth",
                1,
            ),
            section_dim(
                "member.Beam.section.IBeam.flange_thickness_m",
                "Flange thickness",
                "Thickness of each flange",
                2,
            ),
            section_dim(
                "member.Beam.section.IBeam.web_thickness_m",
                "Web thickness",
                "Thickness of the web",
                3,
            ),
        ],
    }
}

fn beam_fields(b: &gw_mechanics::Beam) -> Vec<Field<Part>> {
    let mut out = vec![
        dim(
            "member.Beam.length_m",
            "Length",
            "Length of the beam (span)",
            beam,
            beam_mut,
            |b| b.length_m,
            |b, v| b.length_m = v,
        ),
        pick(
            "member.Beam.support",
            "Support",
            "How the beam is held",
            &[
                (BeamSupport::Cantilever, "cantilever (fixed at x = 0)"),
                (
                    BeamSupport::SimplySupported,
                    "simply supported (pins at both ends)",
                ),
            ],
            |p: &Part| beam(&p.member).map(|b| b.support).unwrap_or_default(),
            |p, v| {
                if let Some(b) = beam_mut(&mut p.member) {
                    b.support = v
                }
            },
        ),
        choice(
            "member.Beam.section.(kind)",
            "Section",
            "Shape of the cross-section",
            SECTIONS.iter().map(|s| s.to_string()).collect(),
            |p: &Part| beam(&p.member).map(|b| section_index(&b.section)),
            |p, k| {
                if let Some(b) = beam_mut(&mut p.member) {
                    b.section = section_like(&b.section, k)
                }
            },
        ),
    ];
    out.extend(section_fields(&b.section));
    for k in 0..b.load_points.len() {
        out.push(num(
            "member.Beam.load_points",
            &format!("Load point {} at", k + 1),
            LENGTH,
            "Where the vertical and lateral forces act, from x = 0",
            move |p: &Part| {
                beam(&p.member)
                    .and_then(|b| b.load_points.get(k))
                    .map(|l| l.position_m)
                    .unwrap_or(f64::NAN)
            },
            move |p, v| {
                if let Some(l) = beam_mut(&mut p.member).and_then(|b| b.load_points.get_mut(k)) {
                    l.position_m = v
                }
            },
        ));
        out.push(num("member.Beam.load_points", &format!("Load point {} multiple", k + 1), PLAIN, "Multiple of the force components applied here (1 for a single load; 0.5 and 0.5 for four-point bending with a total force)", move |p: &Part| beam(&p.member).and_then(|b| b.load_points.get(k)).map(|l| l.multiple).unwrap_or(f64::NAN), move |p, v| if let Some(l) = beam_mut(&mut p.member).and_then(|b| b.load_points.get_mut(k)) { l.multiple = v }));
    }
    out.push(whole(
        "member.Beam.load_points",
        "Load points",
        (1, 8),
        "How many points the forces act at",
        |p: &Part| {
            beam(&p.member)
                .map(|b| b.load_points.len() as u64)
                .unwrap_or(1)
        },
        |p, n| {
            if let Some(b) = beam_mut(&mut p.member) {
                let n = n.clamp(1, 8) as usize;
                while b.load_points.len() < n {
                    b.load_points.push(LoadPoint {
                        position_m: b.length_m / 2.0,
                        multiple: 1.0,
                    });
                }
                b.load_points.truncate(n);
            }
        },
    ));
    out
}

const ENDS: [(VesselEnds, &str); 2] = [
    (VesselEnds::Closed, "closed (capped)"),
    (VesselEnds::Open, "open (no axial pressure load)"),
];

fn model_fields(m: &Member) -> Vec<Field<Part>> {
    match m {
        Member::Beam(b) => beam_fields(b),
        Member::Shaft(_) => shaft_fields(),
        Member::ThinCylinder(_) => thin_cylinder_fields(),
        Member::ThinSphere(_) => thin_sphere_fields(),
        Member::ThickCylinder(_) => thick_cylinder_fields(),
        Member::PlateWithHole(_) => plate_fields(),
        Member::GivenState(g) => given_fields(g),
        Member::ImportedField(f) => super::imported_fields::imported_fields(f),
    }
}

/// A plate with a hole: its sizes.
fn plate_fields() -> Vec<Field<Part>> {
    vec![
        dim(
            "member.PlateWithHole.hole_diameter_m",
            "Hole diameter",
            "Diameter of the circular hole",
            plate,
            plate_mut,
            |s| s.hole_diameter_m,
            |s, v| s.hole_diameter_m = v,
        ),
        dim(
            "member.PlateWithHole.width_m",
            "Plate width",
            "Width along x",
            plate,
            plate_mut,
            |s| s.width_m,
            |s, v| s.width_m = v,
        ),
        dim(
            "member.PlateWithHole.height_m",
            "Plate height",
            "Height along y",
            plate,
            plate_mut,
            |s| s.height_m,
            |s, v| s.height_m = v,
        ),
        dim(
            "member.PlateWithHole.thickness_m",
            "Plate thickness",
            "Thickness",
            plate,
            plate_mut,
            |s| s.thickness_m,
            |s, v| s.thickness_m = v,
        ),
    ]
}

/// A thick-walled cylinder's sizes and ends.
fn thick_cylinder_fields() -> Vec<Field<Part>> {
    vec![
        dim(
            "member.ThickCylinder.length_m",
            "Length",
            "Length shown",
            thick,
            thick_mut,
            |s| s.length_m,
            |s, v| s.length_m = v,
        ),
        dim(
            "member.ThickCylinder.outer_diameter_m",
            "Outer diameter",
            "Outer diameter",
            thick,
            thick_mut,
            |s| s.outer_diameter_m,
            |s, v| s.outer_diameter_m = v,
        ),
        dim(
            "member.ThickCylinder.inner_diameter_m",
            "Inner diameter",
            "Bore diameter",
            thick,
            thick_mut,
            |s| s.inner_diameter_m,
            |s, v| s.inner_diameter_m = v,
        ),
        pick(
            "member.ThickCylinder.ends",
            "Ends",
            "Whether pressure on end caps loads the wall axially",
            &ENDS,
            |p: &Part| thick(&p.member).map(|c| c.ends).unwrap_or_default(),
            |p, v| {
                if let Some(c) = thick_mut(&mut p.member) {
                    c.ends = v
                }
            },
        ),
    ]
}

/// A thin-walled sphere's sizes.
fn thin_sphere_fields() -> Vec<Field<Part>> {
    vec![
        dim(
            "member.ThinSphere.outer_diameter_m",
            "Outer diameter",
            "Outer diameter",
            sphere,
            sphere_mut,
            |s| s.outer_diameter_m,
            |s, v| s.outer_diameter_m = v,
        ),
        dim(
            "member.ThinSphere.wall_m",
            "Wall thickness",
            "Wall thickness",
            sphere,
            sphere_mut,
            |s| s.wall_m,
            |s, v| s.wall_m = v,
        ),
    ]
}

/// A thin-walled cylinder's sizes and ends.
fn thin_cylinder_fields() -> Vec<Field<Part>> {
    vec![
        dim(
            "member.ThinCylinder.length_m",
            "Length",
            "Length of the shell shown",
            thin,
            thin_mut,
            |s| s.length_m,
            |s, v| s.length_m = v,
        ),
        dim(
            "member.ThinCylinder.outer_diameter_m",
            "Outer diameter",
            "Outer diameter",
            thin,
            thin_mut,
            |s| s.outer_diameter_m,
            |s, v| s.outer_diameter_m = v,
        ),
        dim(
            "member.ThinCylinder.wall_m",
            "Wall thickness",
            "Thin-wall formulas need mean radius ≥ 10 × wall",
            thin,
            thin_mut,
            |s| s.wall_m,
            |s, v| s.wall_m = v,
        ),
        pick(
            "member.ThinCylinder.ends",
            "Ends",
            "Whether pressure on end caps loads the wall axially",
            &ENDS,
            |p: &Part| thin(&p.member).map(|c| c.ends).unwrap_or_default(),
            |p, v| {
                if let Some(c) = thin_mut(&mut p.member) {
                    c.ends = v
                }
            },
        ),
    ]
}

/// A round shaft's sizes.
fn shaft_fields() -> Vec<Field<Part>> {
    vec![
        dim(
            "member.Shaft.length_m",
            "Length",
            "Length of shaft available for gauges",
            shaft,
            shaft_mut,
            |s| s.length_m,
            |s, v| s.length_m = v,
        ),
        dim(
            "member.Shaft.outer_diameter_m",
            "Outer diameter",
            "Outer diameter",
            shaft,
            shaft_mut,
            |s| s.outer_diameter_m,
            |s, v| s.outer_diameter_m = v,
        ),
        dim(
            "member.Shaft.inner_diameter_m",
            "Bore diameter",
            "Bore; 0 for a solid shaft",
            shaft,
            shaft_mut,
            |s| s.inner_diameter_m,
            |s, v| s.inner_diameter_m = v,
        ),
    ]
}

fn given_fields(g: &gw_mechanics::GivenState) -> Vec<Field<Part>> {
    let mut out = vec![
        dim(
            "member.GivenState.length_m",
            "Patch length",
            "Length of the region with the given state",
            given,
            given_mut,
            |s| s.length_m,
            |s, v| s.length_m = v,
        ),
        dim(
            "member.GivenState.width_m",
            "Patch width",
            "Width of the region with the given state",
            given,
            given_mut,
            |s| s.width_m,
            |s, v| s.width_m = v,
        ),
        choice(
            "member.GivenState.quantity.(kind)",
            "Given as",
            "Whether the state is given as strains or as stresses",
            vec!["strains".into(), "stresses".into()],
            |p: &Part| {
                given(&p.member)
                    .map(|g| usize::from(matches!(g.quantity, GivenQuantity::Stress { .. })))
            },
            |p, k| {
                if let Some(g) = given_mut(&mut p.member) {
                    g.quantity = if k == 0 {
                        GivenQuantity::Strain(SurfaceStrain::new(0.0, 0.0, 0.0))
                    } else {
                        GivenQuantity::Stress {
                            normal_x_pa: 0.0,
                            normal_y_pa: 0.0,
                            shear_xy_pa: 0.0,
                        }
                    };
                }
            },
        ),
    ];
    let labels = ["along x", "along y", "shear xy"];
    for (k, l) in labels.iter().enumerate() {
        let stress = matches!(g.quantity, GivenQuantity::Stress { .. });
        let unit = if stress {
            Unit::Of(Quantity::Pressure)
        } else {
            MICROSTRAIN
        };
        let label = if stress {
            format!("Stress {l}")
        } else {
            format!("Strain {l}")
        };
        let path = if stress {
            "member.GivenState.quantity.Stress"
        } else {
            "member.GivenState.quantity.Strain"
        };
        out.push(num(
            path,
            &label,
            unit,
            "The state at factor 1 (engineering shear strain γ)",
            move |p: &Part| {
                given(&p.member)
                    .map(|g| given_values(&g.quantity)[k])
                    .unwrap_or(f64::NAN)
            },
            move |p, v| {
                if let Some(g) = given_mut(&mut p.member) {
                    let mut vals = given_values(&g.quantity);
                    vals[k] = v;
                    g.quantity = match g.quantity {
                        GivenQuantity::Strain(_) => {
                            GivenQuantity::Strain(SurfaceStrain::new(vals[0], vals[1], vals[2]))
                        }
                        GivenQuantity::Stress { .. } => GivenQuantity::Stress {
                            normal_x_pa: vals[0],
                            normal_y_pa: vals[1],
                            shear_xy_pa: vals[2],
                        },
                    };
                }
            },
        ));
    }
    out
}

fn given_values(q: &GivenQuantity) -> [f64; 3] {
    match *q {
        GivenQuantity::Strain(s) => [s.normal_x, s.normal_y, s.shear_xy],
        GivenQuantity::Stress {
            normal_x_pa,
            normal_y_pa,
            shear_xy_pa,
        } => [normal_x_pa, normal_y_pa, shear_xy_pa],
    }
}

fn material_field(
    path: &'static str,
    label: &str,
    unit: Unit,
    help: &'static str,
    get: fn(&Material) -> f64,
    set: fn(&mut Material, f64),
) -> Field<Part> {
    num(
        path,
        label,
        unit,
        help,
        move |p: &Part| get(p.member.material()),
        move |p, v| {
            set(p.member.material_mut(), v);
            p.material_key = None;
        },
    )
}

fn material_fields() -> Vec<Field<Part>> {
    let library: Vec<String> = gw_mechanics::MATERIAL_LIBRARY
        .iter()
        .map(|m| m.name.to_owned())
        .collect();
    vec![
        choice(
            "material_key",
            "Library material",
            "Pick a library material (typical values); edit the values below for the certificate's",
            library,
            |p: &Part| {
                p.material_key.as_deref().and_then(|k| {
                    gw_mechanics::MATERIAL_LIBRARY
                        .iter()
                        .position(|m| m.key == k)
                })
            },
            |p, i| {
                if let Some(m) = gw_mechanics::MATERIAL_LIBRARY.get(i) {
                    *p.member.material_mut() = m.material();
                    p.material_key = Some(m.key.to_owned());
                }
            },
        ),
        text(
            "member.*.material.name",
            "Material name",
            "Name printed on the build sheet",
            |p: &Part| p.member.material().name.clone(),
            |p, v| {
                p.member.material_mut().name = v;
                p.material_key = None;
            },
        ),
        material_field(
            "member.*.material.youngs_modulus_pa",
            "Young's modulus",
            Unit::Of(Quantity::Modulus),
            "Young's modulus E",
            |m| m.youngs_modulus_pa,
            |m, v| m.youngs_modulus_pa = v,
        ),
        material_field(
            "member.*.material.poisson_ratio",
            "Poisson's ratio",
            PLAIN,
            "Poisson's ratio ν (0 to 0.5)",
            |m| m.poisson_ratio,
            |m, v| m.poisson_ratio = v,
        ),
        material_field(
            "member.*.material.cte_per_c",
            "Expansion",
            PPM_PER_DEGREE,
            "Coefficient of thermal expansion",
            |m| m.cte_per_c,
            |m, v| m.cte_per_c = v,
        ),
        material_field(
            "member.*.material.yield_strength_pa",
            "Yield strength",
            Unit::Of(Quantity::Stress),
            "0.2 % yield strength",
            |m| m.yield_strength_pa,
            |m, v| m.yield_strength_pa = v,
        ),
    ]
}

/// A part: name, model and its sizes, material, requirements, tolerances and datum.
pub fn part_groups(part: &Part) -> Vec<Group<Part>> {
    // An imported part's kind is offered as it is (it is made by importing, not chosen here).
    let mut kinds: Vec<String> = ModelKind::ALL.iter().map(|k| k.name().to_owned()).collect();
    if ModelKind::of(&part.member) == ModelKind::ImportedField {
        kinds.push(part.member.kind_name().to_owned());
    }
    let mut model = vec![
        text(
            "name",
            "Name",
            "Name of the part",
            |p: &Part| p.name.clone(),
            |p, v| p.name = v,
        ),
        choice(
            "member.(kind)",
            "Model",
            "How the part's surface strains are computed; changing it keeps the material and resets the sizes",
            kinds,
            |p: &Part| {
                let kind = ModelKind::of(&p.member);
                ModelKind::ALL
                    .iter()
                    .position(|k| *k == kind)
                    .or((kind == ModelKind::ImportedField).then_some(ModelKind::ALL.len()))
            },
            |p, i| {
                if let Some(k) = ModelKind::ALL.get(i)
                    && *k != ModelKind::of(&p.member)
                {
                    let material = p.member.material().clone();
                    p.member = k.default_member(&material);
                }
            },
        ),
    ];
    model.extend(model_fields(&part.member));
    let t = |p: &Part| p.tolerances;
    let _ = t;
    vec![
        Group {
            title: "Part and model".into(),
            fields: model,
        },
        Group {
            title: "Material".into(),
            fields: material_fields(),
        },
        Group {
            title: "Requirements and datum".into(),
            fields: requirement_fields(),
        },
        Group {
            title: "How well the installation is known".into(),
            fields: tolerance_fields(),
        },
    ]
}

/// Standard uncertainties of the installation and the Monte Carlo settings.
fn tolerance_fields() -> Vec<Field<Part>> {
    vec![
        num(
            "tolerances.misalignment_rad",
            "Misalignment",
            DEGREES,
            "Standard uncertainty of a grid's direction",
            |p: &Part| p.tolerances.misalignment_rad,
            |p, v| p.tolerances.misalignment_rad = v,
        ),
        num(
            "tolerances.position_m",
            "Position",
            LENGTH,
            "Standard uncertainty of a gauge's position",
            |p: &Part| p.tolerances.position_m,
            |p, v| p.tolerances.position_m = v,
        ),
        num(
            "tolerances.transverse_sensitivity",
            "Transverse sensitivity",
            PERCENT,
            "Standard uncertainty of Kt",
            |p: &Part| p.tolerances.transverse_sensitivity,
            |p, v| p.tolerances.transverse_sensitivity = v,
        ),
        num(
            "tolerances.lead_resistance_fraction",
            "Lead resistance",
            PERCENT,
            "Standard uncertainty of the lead resistance, fraction of it",
            |p: &Part| p.tolerances.lead_resistance_fraction,
            |p, v| p.tolerances.lead_resistance_fraction = v,
        ),
        num(
            "tolerances.temperature_c",
            "Temperature",
            Unit::Of(Quantity::TemperatureChange),
            "Standard uncertainty of the part's temperature",
            |p: &Part| p.tolerances.temperature_c,
            |p, v| p.tolerances.temperature_c = v,
        ),
        whole(
            "tolerances.monte_carlo_trials",
            "Monte Carlo trials",
            (1000, gw_plan::validate::LIMITS.monte_carlo_trials as u64),
            "Trials of the Monte Carlo check (JCGM 101)",
            |p: &Part| p.tolerances.monte_carlo_trials as u64,
            |p, v| p.tolerances.monte_carlo_trials = v as usize,
        ),
        whole(
            "tolerances.seed",
            "Random seed",
            (0, u64::MAX),
            "Seed of the Monte Carlo sampler (same seed, same result)",
            |p: &Part| p.tolerances.seed,
            |p, v| p.tolerances.seed = v,
        ),
    ]
}

/// Required resolution and the drawing datum.
fn requirement_fields() -> Vec<Field<Part>> {
    vec![
        num(
            "required_resolution_strain",
            "Required resolution",
            MICROSTRAIN,
            "Smallest strain change the measurement must resolve",
            |p: &Part| p.required_resolution_strain,
            |p, v| p.required_resolution_strain = v,
        ),
        num(
            "datum_m",
            "Datum x",
            LENGTH,
            "Dimension datum on drawings, along the member",
            |p: &Part| p.datum_m.0,
            |p, v| p.datum_m.0 = v,
        ),
        num(
            "datum_m",
            "Datum s",
            LENGTH,
            "Dimension datum on drawings, across the face",
            |p: &Part| p.datum_m.1,
            |p, v| p.datum_m.1 = v,
        ),
    ]
}

/// A load case: name, the value of each load the part carries, ramp, temperatures, flags.
pub fn load_case_groups(member: &Member) -> Vec<Group<LoadCase>> {
    let mut loads = vec![text(
        "name",
        "Name",
        "Name of the load case",
        |c: &LoadCase| c.name.clone(),
        |c, v| c.name = v,
    )];
    for &component in member.components().iter() {
        let q = if component == LoadComponent::TemperatureChange {
            Quantity::TemperatureChange
        } else {
            Quantity::of(component)
        };
        loads.push(num(
            "loads",
            &super::capitalise(component.name()),
            Unit::Of(q),
            "Value at full load of this case",
            move |c: &LoadCase| c.value(component),
            move |c, v| c.set_value(component, v),
        ));
    }
    vec![
        Group {
            title: "Loads at full load".into(),
            fields: loads,
        },
        Group {
            title: "Plots and use".into(),
            fields: vec![
                whole(
                    "ramp_steps",
                    "Ramp points",
                    (1, 1000),
                    "Points from zero to full load in the output plot",
                    |c: &LoadCase| u64::from(c.ramp_steps),
                    |c, v| c.ramp_steps = v as u32,
                ),
                num(
                    "temperature_range_c",
                    "Temperature from",
                    Unit::Of(Quantity::Temperature),
                    "Lowest part temperature of this case (low end of the apparent-strain plot)",
                    |c: &LoadCase| c.temperature_range_c.0,
                    |c, v| c.temperature_range_c.0 = v,
                ),
                num(
                    "temperature_range_c",
                    "Temperature to",
                    Unit::Of(Quantity::Temperature),
                    "Highest part temperature of this case (high end of the apparent-strain plot)",
                    |c: &LoadCase| c.temperature_range_c.1,
                    |c, v| c.temperature_range_c.1 = v,
                ),
                flag(
                    "cycled",
                    "Cycled",
                    "Applied many times: fatigue margins apply",
                    |c: &LoadCase| c.cycled,
                    |c, v| c.cycled = v,
                ),
                flag(
                    "proof_test",
                    "Proof load or pressure test",
                    "The case is a proof load or pressure test: the cautions in Help apply",
                    |c: &LoadCase| c.proof_test,
                    |c, v| c.proof_test = v,
                ),
            ],
        },
    ]
}

fn lot_thermal(g: &PlanGauge) -> &ThermalOutput {
    static NONE: std::sync::OnceLock<ThermalOutput> = std::sync::OnceLock::new();
    g.lot
        .as_ref()
        .map(|l| &l.thermal_output)
        .unwrap_or_else(|| {
            NONE.get_or_init(|| ThermalOutput {
                matched_cte_per_c: f64::NAN,
                lot_polynomial: Vec::new(),
                reference_gauge_factor: None,
                valid_range_c: None,
            })
        })
}

fn lot_thermal_mut(g: &mut PlanGauge) -> &mut ThermalOutput {
    &mut g
        .lot
        .get_or_insert_with(|| {
            GaugeLot::from_spec(&gw_plan::document::default_gauge_spec(
                GaugePattern::SingleGrid,
            ))
        })
        .thermal_output
}

fn lot_num(
    path: &'static str,
    label: &str,
    unit: Unit,
    help: &'static str,
    get: fn(&GaugeLot) -> f64,
    set: fn(&mut GaugeLot, f64),
) -> Field<PlanGauge> {
    num(
        path,
        label,
        unit,
        help,
        move |g: &PlanGauge| g.lot.as_ref().map(get).unwrap_or(f64::NAN),
        move |g, v| {
            if let Some(l) = &mut g.lot {
                set(l, v)
            }
        },
    )
}

/// A placed gauge: id, stock type, where and how it sits, and its lot where it differs.
pub fn gauge_groups(project: &Project, part: &Part, gauge: &PlanGauge) -> Vec<Group<PlanGauge>> {
    let stock: Vec<String> = project.gauge_stock.iter().map(|s| s.name.clone()).collect();
    let stock2 = stock.clone();
    let faces: Vec<gw_mechanics::Face> = part.member.faces().iter().map(|f| f.face).collect();
    let faces2 = faces.clone();
    let spec = project.stock_entry(&gauge.stock).map(|s| s.spec.clone());
    let mut groups = vec![Group {
        title: "Gauge".into(),
        fields: vec![
            text(
                "id",
                "Id",
                "Short identifier on drawings and the build sheet; bridges follow a new id",
                |g: &PlanGauge| g.id.clone(),
                |g, v| g.id = v,
            ),
            choice(
                "stock",
                "Gauge type",
                "The stock type of this gauge (edit types under Gauge stock)",
                stock,
                move |g: &PlanGauge| stock2.iter().position(|s| *s == g.stock),
                {
                    let names: Vec<String> =
                        project.gauge_stock.iter().map(|s| s.name.clone()).collect();
                    move |g: &mut PlanGauge, i| {
                        if let Some(n) = names.get(i) {
                            g.stock = n.clone()
                        }
                    }
                },
            ),
            choice(
                "position.face",
                "Face",
                "The face the gauge sits on",
                faces.iter().map(|f| f.name().into_owned()).collect(),
                move |g: &PlanGauge| faces2.iter().position(|f| *f == g.position.face),
                {
                    let faces = faces.clone();
                    move |g: &mut PlanGauge, i| {
                        if let Some(f) = faces.get(i) {
                            g.position.face = *f
                        }
                    }
                },
            ),
            num(
                "position.x_m",
                "Along (x)",
                LENGTH,
                "Position of the grid centre along the member (plate: x from the hole centre)",
                |g: &PlanGauge| g.position.x_m,
                |g, v| g.position.x_m = v,
            ),
            num(
                "position.s_m",
                "Across (s)",
                LENGTH,
                "Position across the face (arc length on round faces; plate: y)",
                |g: &PlanGauge| g.position.s_m,
                |g, v| g.position.s_m = v,
            ),
            num(
                "angle_rad",
                "Angle",
                DEGREES,
                "Direction of the gauge from the member axis, counter-clockwise seen from outside",
                |g: &PlanGauge| g.angle_rad,
                |g, v| g.angle_rad = v,
            ),
        ],
    }];
    let mut lot = vec![flag(
        "lot.(present)",
        "Lot differs from the gauge type",
        "Give this gauge's own lot values (gauge factor, resistance, thermal output) from its packet",
        |g: &PlanGauge| g.lot.is_some(),
        move |g, on| {
            g.lot = if on {
                spec.as_ref().map(GaugeLot::from_spec)
            } else {
                None
            };
        },
    )];
    if gauge.lot.is_some() {
        lot.extend(lot_value_fields());
    }
    groups.push(Group {
        title: "Lot".into(),
        fields: lot,
    });
    groups
}

/// The values of a gauge's own lot (shown while the gauge has one).
fn lot_value_fields() -> Vec<Field<PlanGauge>> {
    let mut out = Vec::new();
    out.push(text(
        "lot.lot_number",
        "Lot number",
        "Lot number on the packet",
        |g: &PlanGauge| {
            g.lot
                .as_ref()
                .map(|l| l.lot_number.clone())
                .unwrap_or_default()
        },
        |g, v| {
            if let Some(l) = &mut g.lot {
                l.lot_number = v
            }
        },
    ));
    out.push(lot_num(
        "lot.resistance_ohm",
        "Resistance",
        OHM,
        "Nominal resistance of the lot",
        |l| l.resistance_ohm,
        |l, v| l.resistance_ohm = v,
    ));
    out.push(lot_num(
        "lot.gauge_factor",
        "Gauge factor",
        GAUGE_FACTOR,
        "Gauge factor of the lot",
        |l| l.gauge_factor,
        |l, v| l.gauge_factor = v,
    ));
    out.push(lot_num(
        "lot.gauge_factor_tolerance",
        "Gauge-factor tolerance",
        PERCENT,
        "± tolerance of the lot's gauge factor",
        |l| l.gauge_factor_tolerance,
        |l, v| l.gauge_factor_tolerance = v,
    ));
    out.push(lot_num(
        "lot.transverse_sensitivity",
        "Transverse sensitivity",
        PERCENT,
        "Kt of the lot",
        |l| l.transverse_sensitivity,
        |l, v| l.transverse_sensitivity = v,
    ));
    out.extend(thermal_fields(
        &[
            "lot.thermal_output.matched_cte_per_c",
            "lot.thermal_output.lot_polynomial",
            "lot.thermal_output.reference_gauge_factor",
            "lot.thermal_output.valid_range_c",
        ],
        lot_thermal,
        lot_thermal_mut,
    ));
    out
}

/// What can go in an arm of a bridge on `part`: each grid, a dummy like each gauge's first
/// grid, or a completion resistor.
pub fn arm_choices(project: &Project, part: &Part) -> Vec<PlanArm> {
    let gauges = project.placed_gauges(part);
    let mut out = Vec::new();
    for g in &gauges {
        for k in 0..g.element_count() {
            out.push(PlanArm::Grid {
                gauge: g.id.clone(),
                grid: k + 1,
            });
        }
    }
    for g in &gauges {
        out.push(PlanArm::Dummy {
            gauge: g.id.clone(),
            grid: 1,
        });
    }
    let ohm = gauges
        .first()
        .map(|g| g.spec.resistance_ohm)
        .unwrap_or(350.0);
    out.push(gw_plan::edit::completion(ohm));
    out
}

/// How an arm reads in lists.
pub fn arm_text(arm: &PlanArm) -> String {
    match arm {
        PlanArm::Grid { gauge, grid } => format!("{gauge} grid {grid}"),
        PlanArm::Dummy { gauge, grid } => format!("dummy like {gauge} grid {grid}"),
        PlanArm::Completion(c) => format!("{} completion resistor", ohm_text(c.ohm)),
    }
}

/// A resistance in words, at the resistance fields' digits: "350 Ω", "349.5 Ω".
pub fn ohm_text(ohm: f64) -> String {
    format!(
        "{} {}",
        OHM.number_text(Units::Si, ohm),
        OHM.suffix(Units::Si)
    )
}

fn arm_field(k: usize, choices: &[PlanArm]) -> Field<BridgePlan> {
    let names: Vec<String> = choices.iter().map(arm_text).collect();
    let a = choices.to_vec();
    let b = choices.to_vec();
    choice(
        "arms.Grid|arms.Dummy",
        &format!("Arm {}", k + 1),
        "What sits in this arm: a grid, a dummy grid or a completion resistor",
        names,
        move |p: &BridgePlan| {
            a.iter().position(|c| match (c, &p.arms[k]) {
                (PlanArm::Completion(_), PlanArm::Completion(_)) => true,
                (x, y) => x == y,
            })
        },
        move |p, i| {
            if let Some(c) = b.get(i)
                && !matches!(
                    (c, &p.arms[k]),
                    (PlanArm::Completion(_), PlanArm::Completion(_))
                )
            {
                p.arms[k] = c.clone();
                p.arrangement = "Custom".into();
            }
        },
    )
}

fn completion_fields(k: usize) -> Vec<Field<BridgePlan>> {
    fn get(p: &BridgePlan, k: usize) -> Option<&gw_bridge::CompletionResistor> {
        match &p.arms[k] {
            PlanArm::Completion(c) => Some(c),
            _ => None,
        }
    }
    fn get_mut(p: &mut BridgePlan, k: usize) -> Option<&mut gw_bridge::CompletionResistor> {
        match &mut p.arms[k] {
            PlanArm::Completion(c) => Some(c),
            _ => None,
        }
    }
    vec![
        num(
            "arms.Completion.ohm",
            &format!("Arm {} resistor", k + 1),
            OHM,
            "Value of the completion resistor",
            move |p: &BridgePlan| get(p, k).map(|c| c.ohm).unwrap_or(f64::NAN),
            move |p, v| {
                if let Some(c) = get_mut(p, k) {
                    c.ohm = v
                }
            },
        ),
        num(
            "arms.Completion.tolerance",
            &format!("Arm {} tolerance", k + 1),
            PERCENT,
            "± tolerance of the completion resistor",
            move |p: &BridgePlan| get(p, k).map(|c| c.tolerance).unwrap_or(f64::NAN),
            move |p, v| {
                if let Some(c) = get_mut(p, k) {
                    c.tolerance = v
                }
            },
        ),
        num(
            "arms.Completion.tcr_per_c",
            &format!("Arm {} drift", k + 1),
            PPM_PER_DEGREE,
            "Temperature coefficient of the completion resistor",
            move |p: &BridgePlan| get(p, k).map(|c| c.tcr_per_c).unwrap_or(f64::NAN),
            move |p, v| {
                if let Some(c) = get_mut(p, k) {
                    c.tcr_per_c = v
                }
            },
        ),
    ]
}

fn wiring_field(plan: &BridgePlan) -> Field<BridgePlan> {
    let at_gauge = plan
        .arms
        .clone()
        .map(|a| !matches!(a, PlanArm::Completion(_)));
    let count = at_gauge.iter().filter(|a| **a).count();
    let options = LeadWiring::choices(count);
    let names: Vec<String> = options.iter().map(|w| w.trade_name(at_gauge)).collect();
    let names2 = names.clone();
    choice(
        "wiring",
        "Wiring",
        "How leads join the gauge site to the instrument",
        names,
        move |p: &BridgePlan| {
            let now = p
                .wiring
                .trade_name(p.arms.clone().map(|a| !matches!(a, PlanArm::Completion(_))));
            names2.iter().position(|n| *n == now)
        },
        move |p, i| {
            if let Some(w) = options.get(i) {
                p.wiring = *w
            }
        },
    )
}

/// Load recovery and the in-place calibration.
fn installed_fields(plan: &BridgePlan) -> Vec<Field<BridgePlan>> {
    use gw_plan::document::LoadRecovery;
    let load = Quantity::of(plan.wanted);
    let calibration = plan.calibration.as_ref().map(|c| {
        let source = if c.source.is_empty() {
            "no source".to_owned()
        } else {
            c.source.clone()
        };
        (c.load_per_mv_per_v, source)
    });
    // A load per mV/V is a ratio: it converts by the load's scale alone.
    let calibration = move |units: Units| match &calibration {
        Some((per_mv_per_v, source)) => format!(
            "fitted: {} per mV/V ({source})",
            units.format_difference(load, *per_mv_per_v)
        ),
        None => "predicted".to_owned(),
    };
    vec![
        pick(
            "recovery",
            "Load recovery",
            "Whether this bridge's reading is one of the equations the part's loads are solved \
             from",
            &[
                (LoadRecovery::Included, "included"),
                (LoadRecovery::LeftOut, "left out"),
            ],
            |p: &BridgePlan| p.recovery,
            |p, v| p.recovery = v,
        ),
        info_in_units(
            "calibration",
            "Sensitivity used",
            "Set or cleared from Results › Measured › Calibration",
            calibration,
        ),
    ]
}

fn signal_fields(plan: &BridgePlan) -> Vec<Field<BridgePlan>> {
    let mut out = vec![
        num(
            "signal.gain",
            "Gain",
            GAIN,
            "Amplifier voltage gain",
            |p: &BridgePlan| p.signal.gain,
            |p, v| p.signal.gain = v,
        ),
        num(
            "signal.input_range_v",
            "Input range",
            VOLT,
            "± range at the converter, after the gain",
            |p: &BridgePlan| p.signal.input_range_v,
            |p, v| p.signal.input_range_v = v,
        ),
        whole(
            "signal.adc_bits",
            "Converter bits",
            (1, 32),
            "Resolution of the analogue-to-digital converter",
            |p: &BridgePlan| u64::from(p.signal.adc_bits),
            |p, v| p.signal.adc_bits = v as u32,
        ),
        num(
            "signal.amplifier_noise_v_per_rt_hz",
            "Noise density",
            Unit::Scaled(1e9, "nV/√Hz", Digits::Places(0, 1)),
            "Amplifier input voltage noise density",
            |p: &BridgePlan| p.signal.amplifier_noise_v_per_rt_hz,
            |p, v| p.signal.amplifier_noise_v_per_rt_hz = v,
        ),
        num(
            "signal.bandwidth_hz",
            "Bandwidth",
            Unit::Scaled(1.0, "Hz", Digits::Places(0, 1)),
            "Measurement bandwidth",
            |p: &BridgePlan| p.signal.bandwidth_hz,
            |p, v| p.signal.bandwidth_hz = v,
        ),
    ];
    out.extend(filter_fields(plan));
    out.extend([
        num(
            "signal.excitation_accuracy",
            "Excitation accuracy",
            PERCENT,
            "± accuracy of the excitation",
            |p: &BridgePlan| p.signal.excitation_accuracy,
            |p, v| p.signal.excitation_accuracy = v,
        ),
        num(
            "signal.gain_accuracy",
            "Gain accuracy",
            PERCENT,
            "± accuracy of the gain",
            |p: &BridgePlan| p.signal.gain_accuracy,
            |p, v| p.signal.gain_accuracy = v,
        ),
        flag(
            "amplifier_input_ohm.(present)",
            "Amplifier input resistance stated",
            "Give the amplifier's differential input resistance; without it the input is taken as ideal (infinite)",
            |p: &BridgePlan| p.amplifier_input_ohm.is_some(),
            |p, on| p.amplifier_input_ohm = on.then_some(10e6),
        ),
        // Shown only while stated: an absent value reads NaN and the inspector hides it.
        num(
            "amplifier_input_ohm",
            "Amplifier input",
            Unit::Scaled(1e-6, "MΩ", Digits::Places(0, 2)),
            "Differential input resistance of the amplifier",
            |p: &BridgePlan| p.amplifier_input_ohm.unwrap_or(f64::NAN),
            |p, v| p.amplifier_input_ohm = Some(v),
        ),
        pick(
            "instrument_temperature",
            "Instrument temperature",
            "Whether the completion resistors see the part's temperature changes",
            &[
                (InstrumentTemperature::Fixed, "stays at the reference"),
                (InstrumentTemperature::FollowsPart, "follows the part"),
            ],
            |p: &BridgePlan| p.instrument_temperature,
            |p, v| p.instrument_temperature = v,
        ),
    ]);
    out
}

/// The channel's low-pass filter, and its order when it is a Butterworth.
fn filter_fields(plan: &BridgePlan) -> Vec<Field<BridgePlan>> {
    let mut out = vec![choice(
        "signal.filter",
        "Filter",
        "Low-pass filter whose cut-off the bandwidth is; noise is taken over its noise bandwidth (π/2 × the cut-off for one pole)",
        vec![
            "first-order RC".into(),
            "Butterworth".into(),
            "brick wall (noise bandwidth as entered)".into(),
        ],
        |p: &BridgePlan| {
            Some(match p.signal.filter {
                LowPassFilter::FirstOrderRc => 0,
                LowPassFilter::Butterworth { .. } => 1,
                LowPassFilter::BrickWall => 2,
            })
        },
        |p, i| {
            p.signal.filter = match (i, p.signal.filter) {
                (0, _) => LowPassFilter::FirstOrderRc,
                (1, LowPassFilter::Butterworth { order }) => LowPassFilter::Butterworth { order },
                (1, _) => LowPassFilter::Butterworth {
                    order: LowPassFilter::USUAL_BUTTERWORTH_ORDER,
                },
                (2, _) => LowPassFilter::BrickWall,
                (_, f) => f,
            }
        },
    )];
    if matches!(plan.signal.filter, LowPassFilter::Butterworth { .. }) {
        out.push(whole(
            "signal.filter.Butterworth.order",
            "Filter poles",
            (1, u64::from(LowPassFilter::MAX_ORDER)),
            "Order of the Butterworth filter (number of poles)",
            |p: &BridgePlan| match p.signal.filter {
                LowPassFilter::Butterworth { order } => u64::from(order),
                _ => 0,
            },
            |p, v| {
                if let LowPassFilter::Butterworth { order } = &mut p.signal.filter {
                    *order = u32::try_from(v).unwrap_or(LowPassFilter::MAX_ORDER)
                }
            },
        ));
    }
    out
}

fn excitation_fields() -> Vec<Field<BridgePlan>> {
    vec![
        choice(
            "excitation.(kind)",
            "Excitation kind",
            "Constant voltage or constant current",
            vec!["constant voltage".into(), "constant current".into()],
            |p: &BridgePlan| {
                Some(usize::from(matches!(
                    p.excitation,
                    Excitation::Current { .. }
                )))
            },
            |p, i| {
                p.excitation = match (i, p.excitation) {
                    (0, Excitation::Current { .. }) => Excitation::Voltage { volts: 5.0 },
                    (1, Excitation::Voltage { .. }) => Excitation::Current { amps: 0.01 },
                    (_, e) => e,
                }
            },
        ),
        num(
            "excitation.Voltage.volts",
            "Excitation",
            VOLT,
            "Bridge excitation voltage (constant voltage)",
            |p: &BridgePlan| match p.excitation {
                Excitation::Voltage { volts } => volts,
                Excitation::Current { .. } => f64::NAN,
            },
            |p, v| {
                if let Excitation::Voltage { volts } = &mut p.excitation {
                    *volts = v
                }
            },
        ),
        num(
            "excitation.Current.amps",
            "Excitation current",
            Unit::Scaled(1e3, "mA", Digits::Places(0, 3)),
            "Bridge excitation current (constant current)",
            |p: &BridgePlan| match p.excitation {
                Excitation::Current { amps } => amps,
                Excitation::Voltage { .. } => f64::NAN,
            },
            |p, v| {
                if let Excitation::Current { amps } = &mut p.excitation {
                    *amps = v
                }
            },
        ),
    ]
}

fn shunt_fields(plan: &BridgePlan) -> Vec<Field<BridgePlan>> {
    let mut out = vec![flag(
        "shunt.(present)",
        "Shunt calibration",
        "Plan a shunt resistor to check each channel's span",
        |p: &BridgePlan| p.shunt.is_some(),
        |p, on| {
            p.shunt = on.then_some(ShuntPlan {
                arm: 0,
                target_strain: 500e-6,
                location: ShuntLocation::InstrumentEnd,
            });
        },
    )];
    if plan.shunt.is_some() {
        out.push(choice(
            "shunt.arm",
            "Shunt across",
            "The arm the resistor goes across",
            (1..=4).map(|k| format!("arm {k}")).collect(),
            |p: &BridgePlan| p.shunt.map(|s| s.arm),
            |p, i| {
                if let Some(s) = &mut p.shunt {
                    s.arm = i
                }
            },
        ));
        out.push(num(
            "shunt.target_strain",
            "Shunt simulates",
            MICROSTRAIN,
            "Strain the shunt should simulate in that arm",
            |p: &BridgePlan| p.shunt.map(|s| s.target_strain).unwrap_or(f64::NAN),
            |p, v| {
                if let Some(s) = &mut p.shunt {
                    s.target_strain = v
                }
            },
        ));
        out.push(pick(
            "shunt.location",
            "Shunt connected",
            "Where the resistor is connected",
            &[
                (ShuntLocation::InstrumentEnd, "at the instrument end"),
                (ShuntLocation::GaugeEnd, "at the gauge"),
            ],
            |p: &BridgePlan| p.shunt.map(|s| s.location).unwrap_or_default(),
            |p, v| {
                if let Some(s) = &mut p.shunt {
                    s.location = v
                }
            },
        ));
    }
    out
}

fn factor_fields(project: &Project, part: &Part, plan: &BridgePlan) -> Vec<Field<BridgePlan>> {
    let gauges = project.placed_gauges(part);
    let computed = gw_plan::arrangements::bridge_factor_for(
        part,
        &gauges,
        plan,
        project.reference_temperature_c,
    );
    let mut out = vec![
        num(
            "gauge_factor_setting",
            "Instrument gauge factor",
            GAUGE_FACTOR,
            "Gauge factor set on the instrument",
            |p: &BridgePlan| p.gauge_factor_setting,
            |p, v| p.gauge_factor_setting = v,
        ),
        info(
            "bridge_factor_override.(computed)",
            "Bridge factor, computed",
            "From the arrangement and the part: the instrument then shows the first active grid's strain",
            BRIDGE_FACTOR.number_text(Units::Si, computed),
        ),
        flag(
            "bridge_factor_override.(present)",
            "Type the bridge factor",
            "Use a bridge factor of your own instead of the computed one (say why)",
            |p: &BridgePlan| p.bridge_factor_override.is_some(),
            move |p, on| {
                p.bridge_factor_override = on.then(|| BridgeFactorOverride {
                    value: computed,
                    reason: String::new(),
                });
            },
        ),
    ];
    if plan.bridge_factor_override.is_some() {
        out.push(num(
            "bridge_factor_override.value",
            "Bridge factor",
            BRIDGE_FACTOR,
            "The bridge factor the instrument is set to",
            |p: &BridgePlan| {
                p.bridge_factor_override
                    .as_ref()
                    .map(|o| o.value)
                    .unwrap_or(f64::NAN)
            },
            |p, v| {
                if let Some(o) = &mut p.bridge_factor_override {
                    o.value = v
                }
            },
        ));
        out.push(text(
            "bridge_factor_override.reason",
            "Reason",
            "Why the computed factor is not used (printed on the build sheet)",
            |p: &BridgePlan| {
                p.bridge_factor_override
                    .as_ref()
                    .map(|o| o.reason.clone())
                    .unwrap_or_default()
            },
            |p, v| {
                if let Some(o) = &mut p.bridge_factor_override {
                    o.reason = v
                }
            },
        ));
    }
    out
}

/// A bridge: what it measures, its arms, wiring and leads, excitation, instrument, channel,
/// shunt.
pub fn bridge_groups(project: &Project, part: &Part, plan: &BridgePlan) -> Vec<Group<BridgePlan>> {
    let wanted: Vec<LoadComponent> = part
        .member
        .components()
        .iter()
        .copied()
        .filter(|c| *c != LoadComponent::TemperatureChange)
        .collect();
    let wanted_names: Vec<String> = wanted.iter().map(|c| super::capitalise(c.name())).collect();
    let w2 = wanted.clone();
    let choices = arm_choices(project, part);
    let mut arms: Vec<Field<BridgePlan>> = Vec::new();
    for k in 0..4 {
        arms.push(arm_field(k, &choices));
        if matches!(plan.arms[k], PlanArm::Completion(_)) {
            arms.extend(completion_fields(k));
        }
    }
    arms.push(wiring_field(plan));
    vec![
        Group {
            title: "Bridge".into(),
            fields: vec![
                text(
                    "name",
                    "Name",
                    "Name shown everywhere",
                    |p: &BridgePlan| p.name.clone(),
                    |p, v| p.name = v,
                ),
                choice(
                    "wanted",
                    "Measures",
                    "The load this bridge is meant to measure",
                    wanted_names,
                    move |p: &BridgePlan| wanted.iter().position(|c| *c == p.wanted),
                    move |p, i| {
                        if let Some(c) = w2.get(i) {
                            p.wanted = *c
                        }
                    },
                ),
                whole(
                    "channel",
                    "Channel",
                    (0, 9999),
                    "Acquisition channel number on the instrument",
                    |p: &BridgePlan| u64::from(p.channel),
                    |p, v| p.channel = v as u32,
                ),
                text(
                    "arrangement",
                    "Arrangement",
                    "Name of the arrangement (set by the catalogue; free text)",
                    |p: &BridgePlan| p.arrangement.clone(),
                    |p, v| p.arrangement = v,
                ),
            ],
        },
        Group {
            title: "Arms and wiring".into(),
            fields: arms,
        },
        Group {
            title: "Leads".into(),
            fields: lead_fields(),
        },
        Group {
            title: "Excitation".into(),
            fields: excitation_fields(),
        },
        Group {
            title: "Instrument".into(),
            fields: factor_fields(project, part, plan),
        },
        Group {
            title: "Channel".into(),
            fields: signal_fields(plan),
        },
        Group {
            title: "After installation".into(),
            fields: installed_fields(plan),
        },
        Group {
            title: "Shunt calibration".into(),
            fields: shunt_fields(plan),
        },
        Group {
            title: "Accuracy".into(),
            fields: accuracy_fields(part, plan),
        },
    ]
}

/// The accuracy the engineer requires of the bridge: none, a percentage of reading, or an
/// amount in the measured unit.
fn accuracy_fields(part: &Part, plan: &BridgePlan) -> Vec<Field<BridgePlan>> {
    // A first amount in the unit: 1 % of the largest wanted load the cases apply (common
    // practice as a starting point), so the choice does not fail at once on a tiny default.
    let largest = part
        .load_cases
        .iter()
        .map(|c| c.value(plan.wanted).abs())
        .fold(0.0, f64::max);
    let first_amount = if largest > 0.0 { largest / 100.0 } else { 1.0 };
    let mut out = vec![choice(
        "required_accuracy",
        "Required accuracy",
        "How closely the bridge must read its wanted load; the predicted error (leakage, temperature, leads and the rest) plus the expanded uncertainty must fit inside it in every load case",
        vec![
            "none stated".into(),
            "± % of reading".into(),
            "± in the measured unit".into(),
        ],
        |p: &BridgePlan| {
            Some(match p.required_accuracy {
                None => 0,
                Some(RequiredAccuracy::PercentOfReading(_)) => 1,
                Some(RequiredAccuracy::InMeasuredUnit(_)) => 2,
            })
        },
        move |p, i| {
            let kept = p.required_accuracy;
            p.required_accuracy = match (i, kept) {
                (1, Some(RequiredAccuracy::PercentOfReading(v))) => {
                    Some(RequiredAccuracy::PercentOfReading(v))
                }
                // 1 % of reading: a usual first requirement for a load measurement (common
                // practice); the engineer sets their own.
                (1, _) => Some(RequiredAccuracy::PercentOfReading(1.0)),
                (2, Some(RequiredAccuracy::InMeasuredUnit(v))) => {
                    Some(RequiredAccuracy::InMeasuredUnit(v))
                }
                (2, _) => Some(RequiredAccuracy::InMeasuredUnit(first_amount)),
                _ => None,
            }
        },
    )];
    match plan.required_accuracy {
        Some(RequiredAccuracy::PercentOfReading(_)) => out.push(num(
            "required_accuracy.PercentOfReading",
            "Within ±",
            Unit::Scaled(1.0, "% of reading", Digits::Places(0, 3)),
            "The error allowed, as a percentage of the wanted load in each load case",
            |p: &BridgePlan| p.required_accuracy.map(|a| a.amount()).unwrap_or(f64::NAN),
            |p, v| p.required_accuracy = Some(RequiredAccuracy::PercentOfReading(v)),
        )),
        Some(RequiredAccuracy::InMeasuredUnit(_)) => out.push(num(
            "required_accuracy.InMeasuredUnit",
            "Within ±",
            Unit::Of(Quantity::of(plan.wanted)),
            "The error allowed, in the unit of the wanted load, in every load case",
            |p: &BridgePlan| p.required_accuracy.map(|a| a.amount()).unwrap_or(f64::NAN),
            |p, v| p.required_accuracy = Some(RequiredAccuracy::InMeasuredUnit(v)),
        )),
        None => {}
    }
    out
}

/// Length, resistance and drift of the lead wires.
fn lead_fields() -> Vec<Field<BridgePlan>> {
    vec![
        num(
            "lead.length_m",
            "Lead length",
            Unit::Of(Quantity::CableLength),
            "Length of each lead wire",
            |p: &BridgePlan| p.lead.length_m,
            |p, v| p.lead.length_m = v,
        ),
        num(
            "lead.ohm_per_m",
            "Lead resistance",
            OHM_PER_CABLE_LENGTH,
            "Resistance per length of one lead (per metre, or per foot in US customary units)",
            |p: &BridgePlan| p.lead.ohm_per_m,
            |p, v| p.lead.ohm_per_m = v,
        ),
        num(
            "lead.tcr_per_c",
            "Lead drift",
            PPM_PER_DEGREE,
            "Temperature coefficient of the lead resistance (copper about 3900 ppm/°C, 2170 ppm/°F, from memory)",
            |p: &BridgePlan| p.lead.tcr_per_c,
            |p, v| p.lead.tcr_per_c = v,
        ),
    ]
}
