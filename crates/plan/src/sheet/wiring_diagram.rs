//! The wiring schematic of one bridge, drawn for the technician who wires it: the arms at the
//! gauge site in one dashed box, the cable's conductors with their colours and resistance, the
//! connector with its pin numbers, and the instrument's side (completion resistors, where
//! each pin goes, the shield's ground) in another dashed box.
//!
//! The four corners are drawn as rows, top to bottom in the order they go round the bridge:
//! excitation +, output +, excitation −, output −. Arms 2, 1 and 4 then join neighbouring
//! rows in one column, and arm 3 closes the loop in an outer column, so no wire crosses an
//! arm.

use gw_bridge::circuit::{ARM_CORNERS, LeadWiring};
use gw_bridge::units::si;
use gw_mechanics::LoadComponent;

use super::layout::{Area, ascent, line_pitch, text_width, wrap};
use super::writer::Writer;
use crate::connector::{
    ArmSign, CORNER_CONDUCTORS, Pinout, arm_signs, bridge_model, output_sign_from_marks,
    shunt_place, shunt_place_words,
};
use crate::document::{BridgePlan, Part, PlanArm, Project};
use crate::units::{Quantity, Units};

/// Text size of labels, points.
const SIZE: f32 = 7.5;
/// Size of the + / − marks on the arms, points.
const SIGN_SIZE: f32 = 11.0;
/// An arm's resistor body, points.
const BODY_W: f32 = 8.0;
const BODY_H: f32 = 22.0;
/// A shunt's resistor body, points.
const SHUNT_W: f32 = 6.0;
const SHUNT_H: f32 = 16.0;
/// A shunt beside its arm stands this far from the arm's column, points.
const SHUNT_DX: f32 = 14.0;
/// A sense conductor runs this far below its corner's row, points.
const SENSE_DY: f32 = 18.0;
/// Width of the connector, points.
const CONNECTOR_W: f32 = 24.0;
/// The word under the connector.
const CONNECTOR_CAPTION: &str = "connector";
/// Clear space between the connector's caption and the instrument's dashed outline, points.
const CAPTION_GAP: f32 = 8.0;
/// Radius of a terminal at the gauge site and of a junction dot, points.
const PAD_R: f32 = 2.4;
const DOT_R: f32 = 1.5;

/// The row (0 at the top) of each corner, in the circuit's corner order (excitation +,
/// excitation −, output +, output −).
const SLOT: [usize; 4] = [0, 2, 1, 3];
/// Arm 3 (index 2) closes the loop in the outer column; the others form the chain.
const OUTER: usize = 2;

/// The two boxes of the drawing: the gauge site and the instrument.
#[derive(Debug, Clone, Copy, PartialEq)]
enum Side {
    Gauge,
    Instrument,
}

/// What the schematic shows, worked out from the plan before anything is placed.
struct Facts {
    at_gauge: [bool; 4],
    signs: [ArmSign; 4],
    sign_note: Option<String>,
    pinout: Pinout,
    /// Per corner: whether a separate sense conductor runs from it.
    sense: [bool; 4],
    lead_ohm: f64,
    /// The cable's length in the sheet's units ("5.0 m", "16.4 ft").
    lead_length: String,
    wiring: LeadWiring,
    wanted: LoadComponent,
    /// Arm index, resistance (`None` when it could not be worked out) and where it sits.
    shunt: Option<(usize, Option<f64>, Side)>,
    /// Where the shunt goes, in the words the bridge's checks use too.
    shunt_words: Option<String>,
    arm_text: [Vec<String>; 4],
}

fn facts(project: &Project, part: &Part, plan: &BridgePlan, units: Units) -> Facts {
    let at_gauge = plan.arms.each_ref().map(crate::connector::at_gauge);
    let pinout = Pinout::for_bridge(plan, &project.lead_colours);
    let sense = CORNER_CONDUCTORS.map(|c| pinout.pin(&format!("sense {c}")).is_some());
    let model = bridge_model(project, part, plan);
    let (signs, sign_note) = match &model {
        Ok(m) => (arm_signs(m), None),
        Err(e) => (
            [ArmSign::NotActive; 4],
            Some(format!("Strain signs not worked out: {e}")),
        ),
    };
    let shunt = shunt_place(plan).map(|(arm, at_gauge_end)| {
        let ohm = model
            .as_ref()
            .ok()
            .and_then(|m| gw_bridge::shunt::shunt_calibration(m).ok().flatten())
            .map(|c| c.e96_ohm);
        let side = if at_gauge_end {
            Side::Gauge
        } else {
            Side::Instrument
        };
        (arm, ohm, side)
    });
    let arm_text = std::array::from_fn(|k| arm_words(&plan.arms[k], signs[k], plan.wanted, units));
    Facts {
        at_gauge,
        signs,
        sign_note,
        pinout,
        sense,
        lead_ohm: plan.lead.length_m * plan.lead.ohm_per_m,
        lead_length: units.format(Quantity::CableLength, plan.lead.length_m),
        wiring: plan.wiring,
        wanted: plan.wanted,
        shunt,
        shunt_words: shunt_place_words(plan, &project.lead_colours),
        arm_text,
    }
}

/// What an arm is, in short lines (before wrapping).
fn arm_words(arm: &PlanArm, sign: ArmSign, wanted: LoadComponent, units: Units) -> Vec<String> {
    let mut out = vec![];
    match arm {
        PlanArm::Grid { gauge, grid } => {
            out.push(format!("{gauge} grid {grid}"));
            match sign {
                ArmSign::Unstrained => out.push(format!("no strain from {}", wanted.name())),
                ArmSign::NotActive => {}
                s => out.push(s.words().to_owned()),
            }
        }
        PlanArm::Dummy { gauge, grid } => {
            out.push(format!("dummy like {gauge} grid {grid}"));
            out.push("unstrained".to_owned());
        }
        PlanArm::Completion(c) => {
            out.push(format!("{} resistor", si(c.ohm, "Ω")));
            // A resistance's change per degree converts as an expansion coefficient does.
            let per_degree = Quantity::ExpansionCoefficient;
            out.push(format!(
                "±{} %, {} {}",
                trim_number(c.tolerance * 100.0, 3),
                trim_number(units.scale_to_display(per_degree, c.tcr_per_c), 2),
                units.label(per_degree)
            ));
        }
    }
    out
}

/// A number with as many decimals as it needs, up to `places` ("0.05", "5", "2.5").
fn trim_number(v: f64, places: usize) -> String {
    let s = format!("{v:.places$}");
    s.trim_end_matches('0').trim_end_matches('.').to_owned()
}

/// One vertical element of a box: an arm, or a shunt standing in an arm's place.
#[derive(Debug, Clone)]
struct Element {
    x: f32,
    /// Rows of its two ends (upper first).
    rows: (usize, usize),
    /// Arm index (for a shunt, the arm it is across).
    arm: usize,
    shunt_in_place: bool,
    /// A shunt drawn beside this arm.
    shunt_beside: bool,
    /// Its label, wrapped.
    label: Vec<String>,
}

/// Rows an arm joins, upper first.
fn arm_rows(arm: usize) -> (usize, usize) {
    let (p, q) = ARM_CORNERS[arm];
    let (a, b) = (SLOT[p], SLOT[q]);
    (a.min(b), a.max(b))
}

/// Label of an element: the arm's number and words, or the shunt's, wrapped to `width`.
fn element_label(
    f: &Facts,
    arm: usize,
    shunt_in_place: bool,
    beside: bool,
    width: f32,
) -> Vec<String> {
    let shunt_ohm = || match f.shunt {
        Some((_, Some(ohm), ..)) => si(ohm, "Ω"),
        _ => "value not worked out".to_owned(),
    };
    let mut words = if shunt_in_place {
        vec![
            "shunt".to_owned(),
            shunt_ohm(),
            format!("across arm {}", arm + 1),
            "(switched in to check)".to_owned(),
        ]
    } else {
        let mut w = vec![format!("arm {}", arm + 1)];
        w.extend(f.arm_text[arm].iter().cloned());
        w
    };
    if beside {
        words.push(format!("shunt {} beside,", shunt_ohm()));
        words.push("switched in to check".to_owned());
    }
    words
        .iter()
        .flat_map(|l| wrap(l, SIZE, false, width))
        .collect()
}

/// Horizontal room an element takes from its column to the end of its label.
fn element_extent(e: &Element) -> f32 {
    let label = e
        .label
        .iter()
        .map(|l| text_width(l, SIZE, false))
        .fold(0.0, f32::max);
    let beside = if e.shunt_beside { SHUNT_DX } else { 0.0 };
    beside + 5.0 + sign_width() + 3.0 + label + 8.0
}

fn sign_width() -> f32 {
    text_width("+", SIGN_SIZE, true)
}

fn label_height(e: &Element) -> f32 {
    e.label.len() as f32 * line_pitch(SIZE, false)
}

/// The elements of one side, before they are given their x.
fn side_elements(f: &Facts, side: Side, width: f32) -> Vec<Element> {
    let mut out = Vec::new();
    for arm in 0..4 {
        let here = f.at_gauge[arm] == (side == Side::Gauge);
        let shunt_here = matches!(f.shunt, Some((a, _, s)) if a == arm && s == side);
        if here {
            out.push(Element {
                x: 0.0,
                rows: arm_rows(arm),
                arm,
                shunt_in_place: false,
                shunt_beside: shunt_here,
                label: element_label(f, arm, false, shunt_here, width),
            });
        } else if shunt_here {
            out.push(Element {
                x: 0.0,
                rows: arm_rows(arm),
                arm,
                shunt_in_place: true,
                shunt_beside: false,
                label: element_label(f, arm, true, false, width),
            });
        }
    }
    out
}

/// Everything placed: rows, columns and the boxes.
struct Geometry {
    top: f32,
    /// y of each row (0 at the top).
    row_y: [f32; 4],
    shield_y: f32,
    box_bottom: f32,
    gauge: (f32, f32),
    pad_x: f32,
    connector_x: f32,
    instrument: (f32, f32),
    /// Where the instrument's terminals end (destination words above them).
    terminal_x: f32,
    gauge_elements: Vec<Element>,
    instrument_elements: Vec<Element>,
    cable_labels: Vec<(f32, String)>,
    destinations: Vec<(f32, String)>,
}

impl Geometry {
    fn width(&self) -> f32 {
        self.instrument.1 - self.gauge.0
    }

    fn bottom(&self) -> f32 {
        self.shield_y + 10.0 + line_pitch(SIZE, false) + 2.0
    }
}

/// Gives the chain and outer columns their x from `x0` rightwards (gauge side: outer first;
/// instrument side: chain first); returns the x where the last label ends.
fn place_columns(elements: &mut [Element], x0: f32, outer_first: bool) -> f32 {
    let chain_w = elements
        .iter()
        .filter(|e| e.arm != OUTER)
        .map(element_extent)
        .fold(None, |m: Option<f32>, w| Some(m.map_or(w, |m| m.max(w))));
    let outer_w = elements
        .iter()
        .filter(|e| e.arm == OUTER)
        .map(element_extent)
        .fold(None, |m: Option<f32>, w| Some(m.map_or(w, |m| m.max(w))));
    let order = if outer_first {
        [(true, outer_w), (false, chain_w)]
    } else {
        [(false, chain_w), (true, outer_w)]
    };
    let mut x = x0;
    for (outer, w) in order {
        let Some(w) = w else { continue };
        for e in elements.iter_mut().filter(|e| (e.arm == OUTER) == outer) {
            e.x = x;
        }
        x += w;
    }
    x
}

/// Rows' y from the labels that must fit between them and the sense conductors under them.
fn row_positions(f: &Facts, top: f32, elements: &[&Element]) -> [f32; 4] {
    let corner_at = |slot: usize| SLOT.iter().position(|&s| s == slot).unwrap_or(0);
    let mut y = [top + 30.0; 4];
    for s in 0..3 {
        let label = elements
            .iter()
            .filter(|e| e.rows == (s, s + 1))
            .map(|e| label_height(e))
            .fold(0.0, f32::max);
        let sense = if f.sense[corner_at(s)] { SENSE_DY } else { 0.0 };
        let gap = (label + 14.0)
            .max(BODY_H + 18.0)
            .max(sense + 30.0)
            .max(46.0);
        y[s + 1] = y[s] + gap;
    }
    // The outer arm's label sits halfway down; widen the middle gap if it needs more room.
    let outer = elements
        .iter()
        .filter(|e| e.arm == OUTER)
        .map(|e| label_height(e))
        .fold(0.0, f32::max);
    let short = outer + 12.0 - (y[2] - y[1]);
    if short > 0.0 {
        y[2] += short;
        y[3] += short;
    }
    y
}

/// The words above each cable conductor (role, colour, resistance) and at the instrument
/// end (where it goes there).
/// Words per conductor: the circuit's name of the conductor and what is written by it.
type ConductorWords = Vec<(String, String)>;

fn conductor_words(f: &Facts) -> (ConductorWords, ConductorWords) {
    let mut cable = Vec::new();
    let mut dest = Vec::new();
    for pin in f.pinout.conductor_pins() {
        cable.push((
            pin.conductor.clone(),
            format!("{} · {} · {:.2} Ω", pin.role, pin.colour, f.lead_ohm),
        ));
    }
    if let Some(shield) = f.pinout.shield() {
        cable.push((
            shield.conductor.clone(),
            format!("{} · {}", shield.role, shield.colour),
        ));
    }
    for (c, name) in CORNER_CONDUCTORS.iter().enumerate() {
        let word = destination(c, f.sense[c]);
        dest.push(((*name).to_owned(), word.to_owned()));
        if f.sense[c] {
            let s = [
                "supply sense +",
                "supply sense −",
                "amplifier +",
                "amplifier −",
            ][c];
            dest.push((format!("sense {name}"), s.to_owned()));
        }
    }
    dest.push(("shield".to_owned(), "ground here".to_owned()));
    (cable, dest)
}

/// Where a corner's current-carrying conductor goes in the instrument: the supply for the
/// excitation corners, the amplifier for the output corners unless a separate sense
/// conductor takes that (the circuit's [`gw_bridge::BridgeCircuit::network`]).
fn destination(corner: usize, sense: bool) -> &'static str {
    match (corner, sense) {
        (0, _) => "supply +",
        (1, _) => "supply −",
        (2, false) => "amplifier +",
        (3, false) => "amplifier −",
        _ => "",
    }
}

/// Places everything for labels wrapped to `label_w`.
fn geometry(f: &Facts, left: f32, top: f32, label_w: f32) -> Geometry {
    let mut gauge_elements = side_elements(f, Side::Gauge, label_w);
    let mut instrument_elements = side_elements(f, Side::Instrument, label_w);
    let gauge_x0 = left;
    let pad_x = place_columns(&mut gauge_elements, gauge_x0 + 10.0, true).max(gauge_x0 + 40.0);
    let gauge = (gauge_x0, pad_x + 10.0);
    let (cable, dest) = conductor_words(f);
    let cable_w = cable
        .iter()
        .map(|(_, t)| text_width(t, SIZE, false))
        .chain([text_width(&cable_caption(f), SIZE, false)])
        .fold(0.0, f32::max)
        + 16.0;
    let connector_x = gauge.1 + cable_w.max(60.0);
    // Room beside the connector for the caption under it, clear of the instrument's outline.
    let caption_half = text_width(CONNECTOR_CAPTION, SIZE, false) / 2.0;
    let inst_x0 =
        connector_x + (CONNECTOR_W / 2.0 + caption_half + CAPTION_GAP).max(CONNECTOR_W + 12.0);
    let dest_w = dest
        .iter()
        .map(|(_, t)| text_width(t, SIZE, false))
        .chain([text_width("instrument", SIZE, true)])
        .fold(0.0, f32::max);
    let terminal_x = inst_x0 + 6.0 + dest_w + 4.0;
    let chain_x = terminal_x + 12.0;
    let end = place_columns(&mut instrument_elements, chain_x, false);
    let instrument = (inst_x0, end.max(chain_x) + 4.0);
    let all: Vec<&Element> = gauge_elements.iter().chain(&instrument_elements).collect();
    let row_y = row_positions(f, top, &all);
    let last_sense = if f.sense[3] { SENSE_DY } else { 0.0 };
    let shield_y = row_y[3] + last_sense + 28.0;
    let y_of = |name: &str| conductor_y(&row_y, shield_y, name);
    Geometry {
        top,
        row_y,
        shield_y,
        box_bottom: shield_y + 14.0,
        gauge,
        pad_x,
        connector_x,
        instrument,
        terminal_x,
        cable_labels: cable.iter().map(|(c, t)| (y_of(c), t.clone())).collect(),
        destinations: dest.iter().map(|(c, t)| (y_of(c), t.clone())).collect(),
        gauge_elements,
        instrument_elements,
    }
}

/// y of a conductor by the circuit's name.
fn conductor_y(row_y: &[f32; 4], shield_y: f32, name: &str) -> f32 {
    if name == crate::connector::SHIELD {
        return shield_y;
    }
    let (sense, corner) = match name.strip_prefix("sense ") {
        Some(c) => (SENSE_DY, c),
        None => (0.0, name),
    };
    let c = CORNER_CONDUCTORS
        .iter()
        .position(|n| *n == corner)
        .unwrap_or(0);
    row_y[SLOT[c]] + sense
}

fn cable_caption(f: &Facts) -> String {
    format!(
        "cable: {} conductors + shield, {}",
        f.pinout.conductor_pins().count(),
        f.lead_length
    )
}

/// Draws the wiring schematic of bridge `plan` of `part` at the writer's position, with its
/// notes below it.
pub(crate) fn draw_plan(w: &mut Writer, project: &Project, part: &Part, plan: &BridgePlan) {
    let f = facts(project, part, plan, w.units);
    // The widest labels that keep the drawing within the column.
    let label_w = (10..22)
        .rev()
        .map(|n| n as f32 * 4.0)
        .find(|lw| geometry(&f, w.left() + 1.0, 0.0, *lw).width() <= w.column() - 2.0)
        .unwrap_or(40.0);
    let height = geometry(&f, w.left() + 1.0, 0.0, label_w).bottom();
    w.room(height + 70.0);
    let g = geometry(&f, w.left() + 1.0, w.y, label_w);
    draw_boxes(w, &f, &g);
    draw_side(w, &f, &g, Side::Gauge);
    draw_side(w, &f, &g, Side::Instrument);
    draw_cable(w, &f, &g);
    w.y = g.bottom() + 4.0;
    notes(w, &f);
}

/// The dashed outlines of the gauge site and the instrument, the connector, and captions.
fn draw_boxes(w: &mut Writer, f: &Facts, g: &Geometry) {
    for (x0, x1) in [g.gauge, g.instrument] {
        dashed_rect(w, Area::new(x0, g.top, x1, g.box_bottom));
    }
    w.text_top(g.gauge.0 + 4.0, g.top + 3.0, SIZE, true, "gauge site");
    w.text_top(g.instrument.0 + 4.0, g.top + 3.0, SIZE, true, "instrument");
    w.text_top(g.gauge.1 + 6.0, g.top + 3.0, SIZE, false, &cable_caption(f));
    let c = Area::new(
        g.connector_x,
        g.row_y[0] - 12.0,
        g.connector_x + CONNECTOR_W,
        g.shield_y + 8.0,
    );
    w.rect(c, Some(245), 1.0);
    let cw = text_width(CONNECTOR_CAPTION, SIZE, false);
    w.text_top(
        g.connector_x + CONNECTOR_W / 2.0 - cw / 2.0,
        g.shield_y + 10.0,
        SIZE,
        false,
        CONNECTOR_CAPTION,
    );
}

fn dashed_rect(w: &mut Writer, a: Area) {
    let corners = [[a.x0, a.y0], [a.x1, a.y0], [a.x1, a.y1], [a.x0, a.y1]];
    for k in 0..4 {
        let (p, q) = (corners[k], corners[(k + 1) % 4]);
        let len = ((q[0] - p[0]).powi(2) + (q[1] - p[1]).powi(2)).sqrt();
        let n = (len / 7.0).floor().max(1.0) as usize;
        for i in 0..n {
            let t0 = i as f32 / n as f32;
            let t1 = t0 + 4.0 / 7.0 / n as f32;
            let at = |t: f32| [p[0] + (q[0] - p[0]) * t, p[1] + (q[1] - p[1]) * t];
            w.line(at(t0), at(t1), 0.6, 0);
        }
    }
}

/// A terminal: an open ring (short lines: drawn paths are not measured by the page check).
fn ring(w: &mut Writer, c: [f32; 2], r: f32) {
    let p = circle_points(c, r);
    for k in 0..p.len() {
        w.line(p[k], p[(k + 1) % p.len()], 0.7, 0);
    }
}

/// A junction: a small filled square, which reads as a dot at print size.
fn dot(w: &mut Writer, c: [f32; 2]) {
    let r = DOT_R;
    w.rect(
        Area::new(c[0] - r, c[1] - r, c[0] + r, c[1] + r),
        Some(0),
        0.0,
    );
}

fn circle_points(c: [f32; 2], r: f32) -> Vec<[f32; 2]> {
    (0..12)
        .map(|i| {
            let a = i as f32 * std::f32::consts::TAU / 12.0;
            [c[0] + r * a.cos(), c[1] + r * a.sin()]
        })
        .collect()
}

/// A resistor body of `size` centred on `(x, yc)` with its wire up to `ya` and down to `yb`.
fn resistor(w: &mut Writer, x: f32, ya: f32, yb: f32, size: (f32, f32), fill: Option<u8>) {
    let yc = (ya + yb) / 2.0;
    let (bw, bh) = size;
    w.line([x, ya], [x, yc - bh / 2.0], 0.8, 0);
    w.line([x, yc + bh / 2.0], [x, yb], 0.8, 0);
    w.rect(
        Area::new(x - bw / 2.0, yc - bh / 2.0, x + bw / 2.0, yc + bh / 2.0),
        fill,
        0.9,
    );
}

/// An element's resistor(s), its + / − mark and its label.
fn draw_element(w: &mut Writer, f: &Facts, g: &Geometry, e: &Element) {
    let (ya, yb) = (g.row_y[e.rows.0], g.row_y[e.rows.1]);
    let yc = (ya + yb) / 2.0;
    if e.shunt_in_place {
        resistor(w, e.x, ya, yb, (SHUNT_W, SHUNT_H), None);
    } else {
        // Grids on the part shaded, dummies lighter, resistors white.
        let fill = match f.signs[e.arm] {
            ArmSign::NotActive if f.at_gauge[e.arm] => 225,
            ArmSign::NotActive => 255,
            _ => 170,
        };
        resistor(w, e.x, ya, yb, (BODY_W, BODY_H), Some(fill));
    }
    let mut x = e.x;
    if e.shunt_beside {
        x += SHUNT_DX;
        resistor(w, x, ya, yb, (SHUNT_W, SHUNT_H), None);
    }
    let sign_x = x + 5.0;
    let mark = if e.shunt_in_place {
        ""
    } else {
        f.signs[e.arm].mark()
    };
    if !mark.is_empty() {
        let top = yc - ascent(SIGN_SIZE, true) * 0.75;
        w.text_top(sign_x, top, SIGN_SIZE, true, mark);
    }
    let label_x = sign_x + sign_width() + 3.0;
    let mut top = yc - label_height(e) / 2.0;
    for line in &e.label {
        w.text_top(label_x, top, SIZE, false, line);
        top += line_pitch(SIZE, false);
    }
}

/// Columns (x) of the elements of `list` that end on row `slot`, with how many wires leave
/// each point vertically.
fn touches(list: &[Element], slot: usize) -> Vec<f32> {
    let mut xs = Vec::new();
    for e in list.iter().filter(|e| e.rows.0 == slot || e.rows.1 == slot) {
        xs.push(e.x);
        if e.shunt_beside {
            xs.push(e.x + SHUNT_DX);
        }
    }
    xs
}

/// One side's arms, the rows joining them and the terminals.
fn draw_side(w: &mut Writer, f: &Facts, g: &Geometry, side: Side) {
    let list = match side {
        Side::Gauge => &g.gauge_elements,
        Side::Instrument => &g.instrument_elements,
    };
    for e in list {
        draw_element(w, f, g, e);
    }
    for (c, name) in CORNER_CONDUCTORS.iter().enumerate() {
        let y = g.row_y[SLOT[c]];
        let xs = touches(list, SLOT[c]);
        let wired = f.pinout.pin(name).is_some();
        let mut ends = xs.clone();
        match side {
            Side::Gauge if xs.is_empty() => continue,
            Side::Gauge if wired => ends.push(g.pad_x - PAD_R),
            Side::Gauge => {}
            Side::Instrument => {
                let start = if wired {
                    g.connector_x + CONNECTOR_W
                } else {
                    g.instrument.0 + 6.0
                };
                ends.push(start);
                if xs.is_empty() {
                    ends.push(g.terminal_x);
                }
            }
        }
        let lo = ends.iter().copied().fold(f32::MAX, f32::min);
        let hi = ends.iter().copied().fold(f32::MIN, f32::max);
        if hi > lo {
            w.line([lo, y], [hi, y], 0.8, 0);
        }
        junction_dots(w, &xs, (lo, hi), y);
        match side {
            Side::Gauge if wired => ring(w, [g.pad_x, y], PAD_R),
            Side::Instrument if !wired => dot(w, [lo, y]),
            Side::Instrument if xs.is_empty() => dot(w, [hi, y]),
            _ => {}
        }
    }
}

/// A dot where three or more wires meet on a row running from `span.0` to `span.1`.
fn junction_dots(w: &mut Writer, xs: &[f32], span: (f32, f32), y: f32) {
    let mut done: Vec<f32> = Vec::new();
    for &x in xs {
        if done.iter().any(|d| (d - x).abs() < 0.1) {
            continue;
        }
        done.push(x);
        let vertical = xs.iter().filter(|o| (*o - x).abs() < 0.1).count();
        let along = if x > span.0 + 0.1 && x < span.1 - 0.1 {
            2
        } else {
            1
        };
        if vertical + along >= 3 {
            dot(w, [x, y]);
        }
    }
}

/// The cable's conductors from the gauge site's terminals to the connector, their words,
/// the pin numbers, the instrument's terminals for sense and shield, and the shield's ends.
fn draw_cable(w: &mut Writer, f: &Facts, g: &Geometry) {
    let inside = g.connector_x + CONNECTOR_W;
    for pin in f.pinout.pins.iter() {
        let y = conductor_y(&g.row_y, g.shield_y, &pin.conductor);
        match pin.conductor.strip_prefix("sense ") {
            _ if pin.conductor == crate::connector::SHIELD => {}
            Some(corner) => {
                let main = conductor_y(&g.row_y, g.shield_y, corner);
                w.line([g.pad_x, main + PAD_R], [g.pad_x, y], 0.8, 0);
                w.line([g.pad_x, y], [g.connector_x, y], 0.8, 0);
            }
            None => w.line([g.pad_x + PAD_R, y], [g.connector_x, y], 0.8, 0),
        }
        if pin.conductor != crate::connector::SHIELD && pin.conductor.starts_with("sense ") {
            w.line([inside, y], [g.terminal_x, y], 0.8, 0);
            dot(w, [g.terminal_x, y]);
        }
        let number = pin.number.to_string();
        let nw = text_width(&number, SIZE, true);
        let baseline = y + (ascent(SIZE, true) - super::layout::descent(SIZE, true)) / 2.0;
        w.text_at(
            g.connector_x + (CONNECTOR_W - nw) / 2.0,
            baseline,
            SIZE,
            true,
            number,
        );
    }
    for (y, text) in &g.cable_labels {
        w.text_at(g.gauge.1 + 6.0, y - 3.0, SIZE, false, text.clone());
    }
    for (y, text) in g.destinations.iter().filter(|(_, t)| !t.is_empty()) {
        w.text_at(g.instrument.0 + 6.0, y - 3.0, SIZE, false, text.clone());
    }
    // The shield: cut back at the gauge end, to ground at the instrument.
    let sy = g.shield_y;
    let start = g.gauge.1 + 6.0;
    w.line([start, sy], [g.connector_x, sy], 0.8, 0);
    w.line([start, sy - 3.0], [start, sy + 3.0], 1.2, 0);
    w.text_top(start + 4.0, sy + 3.0, SIZE, false, "not connected");
    let t = g.terminal_x;
    w.line([inside, sy], [t, sy], 0.8, 0);
    w.line([t, sy], [t, sy + 4.0], 0.8, 0);
    for (dy, half) in [(4.0, 5.0), (6.5, 3.0), (9.0, 1.0)] {
        w.line([t - half, sy + dy], [t + half, sy + dy], 0.8, 0);
    }
}

/// The notes under the drawing: arm numbering and marks, leads, shield, sense, shunt.
fn notes(w: &mut Writer, f: &Facts) {
    let mut lines = vec![format!(
        "Arm 1 joins excitation − to output +, arm 2 output + to excitation +, arm 3 \
         excitation + to output −, arm 4 output − to excitation −; tension in arm 1 or 3 raises \
         the output, in arm 2 or 4 lowers it. Shaded: grids on the part \
         (+ tension, − compression under a positive {}{}); light: dummies; white: resistors.",
        f.wanted.name(),
        match output_sign_from_marks(&f.signs) {
            Some(s) if s > 0.0 => ", so the output rises with the load",
            Some(_) => ", so the output falls as the load rises",
            None => "",
        }
    )];
    lines.push(pin_list(&f.pinout));
    let conductors = f.pinout.conductor_pins().count();
    lines.push(format!(
        "Leads: {}, {conductors} conductors of {}, {:.2} Ω each, plus the shield.",
        f.wiring.trade_name(f.at_gauge),
        f.lead_length,
        f.lead_ohm
    ));
    if let Some(shield) = f.pinout.shield() {
        lines.push(format!(
            "Shield (drain) on pin {}: connected to ground at the instrument end only; cut \
             back and insulated at the gauge end (common practice).",
            shield.number
        ));
    }
    let sense: Vec<String> = f
        .pinout
        .conductor_pins()
        .filter(|p| p.conductor.starts_with("sense "))
        .map(|p| p.number.to_string())
        .collect();
    if sense.len() > 1 {
        lines.push(format!(
            "The sense conductors (pins {}) share one colour: mark each end with its pin number.",
            sense.join(", ")
        ));
    }
    if let (Some((_, ohm, _)), Some(place)) = (f.shunt, &f.shunt_words) {
        let value = ohm.map_or("a resistor (value not worked out)".to_owned(), |o| {
            si(o, "Ω")
        });
        lines.push(format!("Shunt calibration: {value} {place}."));
    }
    lines.extend(f.sign_note.clone());
    for l in lines {
        w.para(8.0, false, &l);
    }
}

/// Every pin of the connector in order, the ones this wiring leaves empty as "not used"
/// (each role has its fixed pin on every channel).
fn pin_list(pinout: &Pinout) -> String {
    let mut items: Vec<(usize, String)> = pinout
        .pins
        .iter()
        .map(|p| (p.number, format!("{} {} ({})", p.number, p.role, p.colour)))
        .collect();
    items.extend(
        pinout
            .unused()
            .into_iter()
            .map(|(n, role)| (n, format!("{n} not used ({role})"))),
    );
    items.sort_by_key(|(n, _)| *n);
    let items: Vec<String> = items.into_iter().map(|(_, t)| t).collect();
    format!("Connector pins: {}.", items.join("; "))
}

#[cfg(test)]
mod tests {
    use super::super::layout::{Op, problems};
    use super::super::writer::Header;
    use super::*;
    use crate::demo::demo_project;
    use crate::gallery::model_gallery;
    use gw_bridge::CompletionResistor;
    use gw_bridge::bridge::ShuntPlan;
    use gw_bridge::circuit::ShuntLocation;

    fn fresh(project: &Project) -> Writer {
        Writer::new(
            project.paper,
            Header {
                title: "wiring".into(),
                details: "diagram check".into(),
            },
        )
    }

    /// Draws one bridge on a fresh page and returns the page's problems, the drawing's
    /// height and its texts.
    fn drawn(project: &Project, part: &Part, plan: &BridgePlan) -> (Vec<String>, f32, Vec<String>) {
        let mut w = fresh(project);
        let top = w.y;
        draw_plan(&mut w, project, part, plan);
        assert_eq!(w.pages.len(), 1, "{}", plan.name);
        let height = w.y - top;
        let mut texts = Vec::new();
        for op in w.current() {
            if let Op::Text { text, size, .. } = op {
                assert!(*size >= 7.0, "{text} at {size} pt");
                texts.push(text.clone());
            }
        }
        (problems(w.current(), w.width, w.height), height, texts)
    }

    #[test]
    fn every_bridge_of_the_demo_and_the_gallery_draws_clear() {
        for project in [demo_project(), model_gallery()] {
            for part in &project.parts {
                for plan in part.bridges.iter().filter(|b| b.is_wired()) {
                    let (bad, height, _) = drawn(&project, part, plan);
                    assert!(bad.is_empty(), "{}: {bad:#?}", plan.name);
                    assert!((150.0..=420.0).contains(&height), "{}: {height}", plan.name);
                }
            }
        }
    }

    fn completion() -> PlanArm {
        PlanArm::Completion(CompletionResistor {
            ohm: 350.0,
            tolerance: 0.0005,
            tcr_per_c: 5e-6,
        })
    }

    #[test]
    fn every_arm_split_wiring_and_shunt_place_draws_clear() {
        let project = demo_project();
        let part = &project.parts[0];
        let base = &part.bridges[0];
        let splits: [[bool; 4]; 8] = [
            [true; 4],
            [true, true, false, false],
            [false, false, true, true],
            [true, false, true, false],
            [true, false, false, false],
            [false, true, false, false],
            [false, false, true, false],
            [false, false, false, true],
        ];
        for split in splits {
            for wiring in [
                LeadWiring::TwoWire,
                LeadWiring::ThreeWire,
                LeadWiring::RemoteSense,
            ] {
                let shunts = (0..4).flat_map(|arm| {
                    [ShuntLocation::GaugeEnd, ShuntLocation::InstrumentEnd].map(|location| {
                        Some(ShuntPlan {
                            arm,
                            target_strain: 5e-4,
                            location,
                        })
                    })
                });
                for shunt in std::iter::once(None).chain(shunts) {
                    let mut plan = base.clone();
                    for (k, keep) in split.iter().enumerate() {
                        if !keep {
                            plan.arms[k] = completion();
                        }
                    }
                    plan.wiring = wiring;
                    plan.shunt = shunt;
                    let (bad, _, _) = drawn(&project, part, &plan);
                    assert!(bad.is_empty(), "{split:?} {wiring:?} {shunt:?}: {bad:#?}");
                }
            }
        }
    }

    #[test]
    fn the_drawing_names_pins_colours_resistance_signs_and_the_shunt() {
        let project = demo_project();
        let part = &project.parts[0];
        let plan = &part.bridges[0];
        let (_, _, texts) = drawn(&project, part, plan);
        // The notes wrap at spaces: joined with spaces they read as written.
        let all = texts.join(" ");
        // 12 m of 0.13 Ω/m: 1.56 Ω a conductor.
        for want in [
            "excitation + · orange · 1.56 Ω",
            "excitation − sense · pink · 1.56 Ω",
            "shield (drain) · bare",
            "A1 grid 1",
            "tension",
            "compression",
            "ground here",
        ] {
            assert!(all.contains(want), "{want} missing from\n{all}");
        }
        // Six conductors and the shield on their fixed pins; the output sense pins are empty.
        for n in 1..=9 {
            let drawn = texts.iter().any(|t| t == &n.to_string());
            assert_eq!(drawn, !matches!(n, 7 | 8), "pin {n}");
        }
        for want in [
            "Connector pins: 1 excitation + (orange);",
            "7 not used (output + sense); 8 not used (output − sense); 9 shield (drain) (bare).",
            "Shield (drain) on pin 9",
            "The sense conductors (pins 5, 6)",
        ] {
            assert!(all.contains(want), "{want} missing from\n{all}");
        }
        assert_eq!(texts.iter().filter(|t| *t == "+").count(), 2);
        assert_eq!(texts.iter().filter(|t| *t == "−").count(), 2);
        assert!(all.contains(
            "across arm 1 at the instrument end, between pin 3 (output +) and pin 2 (excitation −)"
        ));
    }

    /// The plan of the demo's first bridge with the arms not in `split` made completion
    /// resistors and the given wiring.
    fn variant(base: &BridgePlan, split: [bool; 4], wiring: LeadWiring) -> BridgePlan {
        let mut plan = base.clone();
        for (k, keep) in split.iter().enumerate() {
            if !keep {
                plan.arms[k] = completion();
            }
        }
        plan.wiring = wiring;
        plan
    }

    #[test]
    fn a_two_wire_quarter_bridge_uses_the_same_pins_as_every_other_channel() {
        let project = demo_project();
        let part = &project.parts[0];
        let base = &part.bridges[0];
        let plan = variant(base, [true, false, false, false], LeadWiring::TwoWire);
        let (bad, _, texts) = drawn(&project, part, &plan);
        assert!(bad.is_empty(), "{bad:#?}");
        let all = texts.join(" ");
        // Excitation − on 2 and output + on 3, as on the full bridge; the shield on 9.
        for n in 1..=9 {
            let drawn = texts.iter().any(|t| t == &n.to_string());
            assert_eq!(drawn, matches!(n, 2 | 3 | 9), "pin {n}");
        }
        for want in [
            "Connector pins: 1 not used (excitation +); 2 excitation − (brown); 3 output + \
             (violet); 4 not used (output −);",
            "Shield (drain) on pin 9",
            "across arm 1 at the instrument end, between pin 3 (output +) and pin 2 (excitation −)",
        ] {
            assert!(all.contains(want), "{want} missing from\n{all}");
        }
        // The full bridge's notes give arm 1's shunt the same words.
        let (_, _, full) = drawn(&project, part, base);
        assert!(full.join(" ").contains(
            "across arm 1 at the instrument end, between pin 3 (output +) and pin 2 (excitation −)"
        ));
    }

    /// The smallest distance between two boxes (0 when they touch or overlap), points.
    fn gap_between(a: &Area, b: &Area) -> f32 {
        let dx = (b.x0 - a.x1).max(a.x0 - b.x1).max(0.0);
        let dy = (b.y0 - a.y1).max(a.y0 - b.y1).max(0.0);
        dx.hypot(dy)
    }

    #[test]
    fn the_connector_caption_keeps_clear_of_the_dashed_boxes() {
        let project = demo_project();
        let part = &project.parts[0];
        for split in [
            [true; 4],
            [true, true, false, false],
            [true, false, false, false],
            [false, false, false, true],
        ] {
            for wiring in [
                LeadWiring::TwoWire,
                LeadWiring::ThreeWire,
                LeadWiring::RemoteSense,
            ] {
                let plan = variant(&part.bridges[0], split, wiring);
                let mut w = fresh(&project);
                draw_plan(&mut w, &project, part, &plan);
                let ops = w.current();
                let caption = ops
                    .iter()
                    .find(|op| matches!(op, Op::Text { text, .. } if text == CONNECTOR_CAPTION))
                    .map(super::super::layout::op_area)
                    .expect("the connector has its caption");
                // Every drawn line (the dashed outlines are short lines) at least 2 pt from
                // the caption's box, half the 0.6 pt stroke included.
                let nearest = ops
                    .iter()
                    .filter(|op| matches!(op, Op::Line { .. }))
                    .map(|op| gap_between(&caption, &super::super::layout::op_area(op)) - 0.3)
                    .fold(f32::MAX, f32::min);
                assert!(nearest >= 2.0, "{split:?} {wiring:?}: {nearest} pt");
            }
        }
    }
}
