//! The "New project" dialog: the first part of a blank project in one short form, beside a small
//! drawing of the part to scale.
//!
//! The dialog holds the member being described (SI, as the project will store it), so the form,
//! the validation message and the drawing all read one value, and "Create" hands exactly that
//! member to [`gw_plan::blank`].

use egui::{Align2, Color32, FontId, Pos2, Rect, Sense, Shape, Stroke, StrokeKind, pos2, vec2};
use gw_mechanics::{
    Beam, BeamSupport, GivenQuantity, GivenState, LoadPoint, MATERIAL_LIBRARY, Member,
    PlateWithHole, Section,
};
use gw_plan::blank::{ModelKind, blank_project, default_material, new_part};

use crate::panels::palette;
use crate::units::{Quantity, Units, number_text};

/// View state of the dialog: the choices so far.
pub struct NewProjectDialog {
    /// Name of the first part.
    part_name: String,
    /// The first part's member: kind, supports, section, sizes and material, SI.
    member: Member,
    /// Library key of the chosen material (`None` only if the library were empty).
    material_key: Option<&'static str>,
}

/// What the user decided.
#[derive(Debug)]
pub enum NewProjectOutcome {
    /// Start this project; whether it replaces the open one is the app's decision.
    Create(Box<gw_plan::Project>),
    /// Close the dialog without creating anything.
    Cancel,
}

impl Default for NewProjectDialog {
    /// A cantilever beam of solid rectangular section, in carbon steel from the library.
    fn default() -> Self {
        Self {
            part_name: "Part 1".to_owned(),
            member: ModelKind::Beam.default_member(&default_material()),
            material_key: MATERIAL_LIBRARY.first().map(|m| m.key),
        }
    }
}

/// Width of the combo boxes and the name field, so the form's second column lines up.
const CONTROL_WIDTH: f32 = 190.0;
/// Size of the drawing.
const PREVIEW_SIZE: egui::Vec2 = egui::Vec2::new(260.0, 150.0);

impl NewProjectDialog {
    /// Draws the dialog; returns what the user decided, if anything this frame.
    pub fn ui(&mut self, ctx: &egui::Context, units: Units) -> Option<NewProjectOutcome> {
        // Escape cancels, unless it is closing a drop-down or leaving a field (read before
        // drawing, while last frame's popup and focus still tell us which).
        let escape = ctx.input(|i| i.key_pressed(egui::Key::Escape))
            && !egui::Popup::is_any_open(ctx)
            && ctx.memory(|m| m.focused().is_none());
        let mut outcome = None;
        egui::Window::new("New project")
            .collapsible(false)
            .resizable(false)
            .anchor(Align2::CENTER_CENTER, [0.0, 0.0])
            .show(ctx, |ui| outcome = self.contents_ui(ui, units));
        if escape && outcome.is_none() {
            outcome = Some(NewProjectOutcome::Cancel);
        }
        outcome
    }

    /// The project the Create button makes, or why it cannot be made yet.
    fn build(&self) -> Result<gw_plan::Project, String> {
        let Self {
            part_name,
            member,
            material_key,
        } = self;
        let name = part_name.trim();
        if name.is_empty() {
            return Err("Give the part a name.".to_owned());
        }
        member.validate().map_err(|e| sentence(&e.to_string()))?;
        let part = new_part(name, member.clone(), material_key.map(str::to_owned));
        let project = blank_project(part);
        gw_plan::validate::validate_project(&project).map_err(|e| sentence(&e.to_string()))?;
        Ok(project)
    }

    fn contents_ui(&mut self, ui: &mut egui::Ui, units: Units) -> Option<NewProjectOutcome> {
        ui.horizontal_top(|ui| {
            ui.vertical(|ui| {
                ui.set_max_width(2.0 * CONTROL_WIDTH);
                self.form_ui(ui, units);
            });
            ui.add_space(8.0);
            preview_ui(ui, &self.member, units);
        });
        let built = self.build();
        if let Err(message) = &built {
            ui.add_space(4.0);
            ui.add(egui::Label::new(egui::RichText::new(message).color(palette::FAIL)).wrap());
        }
        ui.separator();
        buttons_ui(ui, built)
    }

    fn form_ui(&mut self, ui: &mut egui::Ui, units: Units) {
        let Self {
            part_name,
            member,
            material_key,
        } = self;
        egui::Grid::new("new_project_form")
            .num_columns(2)
            .spacing([12.0, 6.0])
            .show(ui, |ui| {
                name_row(ui, part_name);
                let kind = ModelKind::of(member);
                if let Some(k) = choice_row(ui, "Model", MODEL_HELP, kind, &ModelKind::ALL, |k| {
                    (k.name(), model_help(k))
                }) {
                    switch_kind(member, k);
                }
                if let Member::Beam(beam) = member {
                    beam_choice_rows(ui, beam);
                }
                size_rows(ui, member, units);
                material_row(ui, member, material_key);
            });
    }
}

/// Switches to another model kind, with that kind's default sizes in the same material.
fn switch_kind(member: &mut Member, kind: ModelKind) {
    if ModelKind::of(member) != kind {
        *member = kind.default_member(member.material());
    }
}

/// Uses the library material `key`; an unknown key changes nothing.
fn use_material(member: &mut Member, material_key: &mut Option<&'static str>, key: &str) {
    if let Some(entry) = gw_mechanics::library_material(key) {
        *member.material_mut() = entry.material();
        *material_key = Some(entry.key);
    }
}

fn material_row(ui: &mut egui::Ui, member: &mut Member, material_key: &mut Option<&'static str>) {
    let keys: Vec<&'static str> = MATERIAL_LIBRARY.iter().map(|m| m.key).collect();
    let Some(current) = material_key.or(keys.first().copied()) else {
        return;
    };
    let picked = choice_row(ui, "Material", MATERIAL_HELP, current, &keys, |key| {
        gw_mechanics::library_material(key).map_or((key, ""), |m| (m.name, m.source))
    });
    if let Some(key) = picked {
        use_material(member, material_key, key);
    }
}

const NAME_HELP: &str = "Name of the first part; more parts can be added to the project later.";
const MODEL_HELP: &str =
    "How the part carries its loads; this decides which loads and faces it has.";
const SUPPORT_HELP: &str = "How the beam is held: fixed at one end, or pinned at both ends.";
const SECTION_HELP: &str =
    "Shape of the beam's cross-section; a new shape starts at the same overall size.";
const MATERIAL_HELP: &str =
    "Library material with typical values; edit them later for the real material certificate.";
const LOAD_POSITION_HELP: &str =
    "Where the point load acts, measured from the fixed end of a cantilever or the left support.";

fn model_help(kind: ModelKind) -> &'static str {
    match kind {
        ModelKind::Beam => "A prismatic bar in bending, shear and tension.",
        ModelKind::Shaft => "A round shaft, solid or bored, in torsion, bending and tension.",
        ModelKind::ThinCylinder => "A pressure vessel shell whose wall is thin beside its radius.",
        ModelKind::ThinSphere => "A spherical pressure vessel with a thin wall.",
        ModelKind::ThickCylinder => "A cylinder whose wall is thick beside its radius (Lamé).",
        ModelKind::PlateWithHole => "A plate with a round hole under remote stress (Kirsch).",
        ModelKind::GivenState => "A uniform surface state you enter, for a part solved elsewhere.",
        ModelKind::ImportedField => {
            "Strain or stress results of a finite-element model, one file per unit load."
        }
    }
}

/// A labelled drop-down over `options`, each described by `(name, tooltip)`; returns the
/// option picked this frame, if it differs from `current`. Ends the grid row.
fn choice_row<T: Copy + PartialEq>(
    ui: &mut egui::Ui,
    label: &str,
    help: &str,
    current: T,
    options: &[T],
    describe: impl Fn(T) -> (&'static str, &'static str),
) -> Option<T> {
    let label_id = ui.label(label).id;
    let mut picked = None;
    egui::ComboBox::from_id_salt(("new_project", label))
        .width(CONTROL_WIDTH)
        .selected_text(describe(current).0)
        .show_ui(ui, |ui| {
            for &option in options {
                let (name, tip) = describe(option);
                let item = ui.selectable_label(option == current, name);
                let item = if tip.is_empty() {
                    item
                } else {
                    item.on_hover_text(tip)
                };
                if item.clicked() && option != current {
                    picked = Some(option);
                }
            }
        })
        .response
        .labelled_by(label_id)
        .on_hover_text(help);
    ui.end_row();
    picked
}

fn name_row(ui: &mut egui::Ui, part_name: &mut String) {
    let label_id = ui.label("Part name").id;
    ui.add(egui::TextEdit::singleline(part_name).desired_width(CONTROL_WIDTH))
        .labelled_by(label_id)
        .on_hover_text(NAME_HELP);
    ui.end_row();
}

/// Support and section of a beam.
fn beam_choice_rows(ui: &mut egui::Ui, beam: &mut Beam) {
    let supports = [BeamSupport::Cantilever, BeamSupport::SimplySupported];
    if let Some(support) = choice_row(ui, "Support", SUPPORT_HELP, beam.support, &supports, |s| {
        (support_name(s), support_help(s))
    }) {
        beam.support = support;
        beam.load_points = vec![LoadPoint::whole(default_load_position_m(
            support,
            beam.length_m,
        ))];
    }
    let shape = SectionShape::of(&beam.section);
    if let Some(shape) = choice_row(
        ui,
        "Section",
        SECTION_HELP,
        shape,
        &SectionShape::ALL,
        |s| (s.name(), ""),
    ) {
        let (width_m, height_m) = overall_size_m(&beam.section);
        beam.section = shape.sized(width_m, height_m);
    }
}

fn support_name(support: BeamSupport) -> &'static str {
    match support {
        BeamSupport::Cantilever => "cantilever",
        BeamSupport::SimplySupported => "simply supported",
    }
}

fn support_help(support: BeamSupport) -> &'static str {
    match support {
        BeamSupport::Cantilever => "Fixed at one end, free at the other.",
        BeamSupport::SimplySupported => "Pinned at both ends.",
    }
}

/// Where the one load point starts: the free end of a cantilever, mid-span between pins.
fn default_load_position_m(support: BeamSupport, length_m: f64) -> f64 {
    match support {
        BeamSupport::Cantilever => length_m,
        BeamSupport::SimplySupported => length_m / 2.0,
    }
}

/// After the length changed from `old_length_m`: a load that sat at its default place (free end
/// or mid-span) moves with it; a load the user placed stays where it was put.
fn keep_load_at_default(beam: &mut Beam, old_length_m: f64) {
    let old_default = default_load_position_m(beam.support, old_length_m);
    let new_default = default_load_position_m(beam.support, beam.length_m);
    for point in &mut beam.load_points {
        if (point.position_m - old_default).abs() <= 1e-9 * old_length_m.abs().max(1.0) {
            point.position_m = new_default;
        }
    }
}

/// The section shapes offered for a beam.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum SectionShape {
    Rectangle,
    SolidRound,
    RoundTube,
    RectangularTube,
    IBeam,
}

impl SectionShape {
    const ALL: [SectionShape; 5] = [
        SectionShape::Rectangle,
        SectionShape::SolidRound,
        SectionShape::RoundTube,
        SectionShape::RectangularTube,
        SectionShape::IBeam,
    ];

    fn of(section: &Section) -> SectionShape {
        match section {
            Section::Rectangle { .. } => SectionShape::Rectangle,
            Section::SolidRound { .. } => SectionShape::SolidRound,
            Section::RoundTube { .. } => SectionShape::RoundTube,
            Section::RectangularTube { .. } => SectionShape::RectangularTube,
            Section::IBeam { .. } => SectionShape::IBeam,
        }
    }

    fn name(self) -> &'static str {
        self.sized(0.03, 0.05).shape_name()
    }

    /// A section of this shape filling `width_m` × `height_m`, with walls and flanges of
    /// ordinary proportions (a tenth of the smaller side). Round shapes take the height as
    /// their diameter, so the beam keeps its depth.
    fn sized(self, width_m: f64, height_m: f64) -> Section {
        let wall_m = tenth_mm(width_m.min(height_m) / 10.0);
        match self {
            SectionShape::Rectangle => Section::Rectangle { width_m, height_m },
            SectionShape::SolidRound => Section::SolidRound {
                diameter_m: height_m,
            },
            SectionShape::RoundTube => Section::RoundTube {
                outer_diameter_m: height_m,
                inner_diameter_m: height_m - 2.0 * tenth_mm(height_m / 10.0),
            },
            SectionShape::RectangularTube => Section::RectangularTube {
                width_m,
                height_m,
                wall_m,
            },
            SectionShape::IBeam => Section::IBeam {
                flange_width_m: width_m,
                depth_m: height_m,
                flange_thickness_m: tenth_mm(height_m / 10.0),
                web_thickness_m: wall_m,
            },
        }
    }
}

/// Rounded to 0.1 mm, unless that would make it zero.
fn tenth_mm(length_m: f64) -> f64 {
    let rounded = (length_m * 1e4).round() / 1e4;
    if rounded > 0.0 { rounded } else { length_m }
}

/// Width (y) and height (z) of the box a section fills, metres.
fn overall_size_m(section: &Section) -> (f64, f64) {
    match *section {
        Section::Rectangle { width_m, height_m }
        | Section::RectangularTube {
            width_m, height_m, ..
        } => (width_m, height_m),
        Section::SolidRound { diameter_m } => (diameter_m, diameter_m),
        Section::RoundTube {
            outer_diameter_m, ..
        } => (outer_diameter_m, outer_diameter_m),
        Section::IBeam {
            flange_width_m,
            depth_m,
            ..
        } => (flange_width_m, depth_m),
    }
}

/// One size the form offers, bound to the value it edits.
struct Dimension<'a> {
    label: &'static str,
    help: &'static str,
    value_m: &'a mut f64,
}

fn dim<'a>(label: &'static str, help: &'static str, value_m: &'a mut f64) -> Dimension<'a> {
    Dimension {
        label,
        help,
        value_m,
    }
}

/// The main sizes of a section.
fn section_dimensions(section: &mut Section) -> Vec<Dimension<'_>> {
    match section {
        Section::Rectangle { width_m, height_m } => vec![
            dim("Section width", "Width across the beam.", width_m),
            dim(
                "Section height",
                "Height in the plane of bending.",
                height_m,
            ),
        ],
        Section::SolidRound { diameter_m } => {
            vec![dim("Diameter", "Diameter of the round bar.", diameter_m)]
        }
        Section::RoundTube {
            outer_diameter_m,
            inner_diameter_m,
        } => vec![
            dim(
                "Outer diameter",
                "Outer diameter of the tube.",
                outer_diameter_m,
            ),
            dim(
                "Inner diameter",
                "Bore; smaller than the outer diameter.",
                inner_diameter_m,
            ),
        ],
        Section::RectangularTube {
            width_m,
            height_m,
            wall_m,
        } => vec![
            dim("Section width", "Outside width across the beam.", width_m),
            dim(
                "Section height",
                "Outside height in the plane of bending.",
                height_m,
            ),
            dim("Wall thickness", "Uniform wall thickness.", wall_m),
        ],
        Section::IBeam {
            flange_width_m,
            depth_m,
            flange_thickness_m,
            web_thickness_m,
        } => vec![
            dim("Flange width", "Width of each flange.", flange_width_m),
            dim("Depth", "Overall depth, flange to flange.", depth_m),
            dim(
                "Flange thickness",
                "Thickness of each flange.",
                flange_thickness_m,
            ),
            dim("Web thickness", "Thickness of the web.", web_thickness_m),
        ],
    }
}

/// The main sizes of a member, as the form lists them (a beam's load position apart).
fn dimensions(member: &mut Member) -> Vec<Dimension<'_>> {
    match member {
        Member::Beam(b) => {
            let mut out = vec![dim("Length", "Length of the beam (span).", &mut b.length_m)];
            out.extend(section_dimensions(&mut b.section));
            out
        }
        Member::Shaft(s) => vec![
            dim(
                "Outer diameter",
                "Outer diameter of the shaft.",
                &mut s.outer_diameter_m,
            ),
            dim(
                "Bore diameter",
                "Bore; 0 for a solid shaft.",
                &mut s.inner_diameter_m,
            ),
            dim(
                "Length",
                "Length of shaft available for gauges.",
                &mut s.length_m,
            ),
        ],
        Member::ThinCylinder(c) => vec![
            dim(
                "Outer diameter",
                "Outer diameter of the shell.",
                &mut c.outer_diameter_m,
            ),
            dim(
                "Wall thickness",
                "Wall thickness; thin-wall formulas need a mean radius of at least 10 walls.",
                &mut c.wall_m,
            ),
            dim(
                "Length",
                "Length of the cylindrical shell.",
                &mut c.length_m,
            ),
        ],
        Member::ThinSphere(s) => vec![
            dim(
                "Outer diameter",
                "Outer diameter of the sphere.",
                &mut s.outer_diameter_m,
            ),
            dim(
                "Wall thickness",
                "Wall thickness of the sphere.",
                &mut s.wall_m,
            ),
        ],
        Member::ThickCylinder(c) => vec![
            dim(
                "Outer diameter",
                "Outer diameter of the cylinder.",
                &mut c.outer_diameter_m,
            ),
            dim(
                "Inner diameter",
                "Bore; smaller than the outer diameter.",
                &mut c.inner_diameter_m,
            ),
            dim("Length", "Length of the cylinder.", &mut c.length_m),
        ],
        Member::PlateWithHole(p) => vec![
            dim(
                "Hole diameter",
                "Diameter of the round hole.",
                &mut p.hole_diameter_m,
            ),
            dim("Plate width", "Width of the plate along x.", &mut p.width_m),
            dim(
                "Plate height",
                "Height of the plate along y.",
                &mut p.height_m,
            ),
            dim(
                "Plate thickness",
                "Thickness of the plate.",
                &mut p.thickness_m,
            ),
        ],
        Member::GivenState(g) => vec![
            dim(
                "Patch length",
                "Length of the region with the given state.",
                &mut g.length_m,
            ),
            dim(
                "Patch width",
                "Width of the region with the given state.",
                &mut g.width_m,
            ),
        ],
        // Its size is the mesh's: nothing to type.
        Member::ImportedField(_) => Vec::new(),
    }
}

/// The "Size" rows: every main dimension, then a beam's load position.
fn size_rows(ui: &mut egui::Ui, member: &mut Member, units: Units) {
    ui.strong("Size");
    ui.end_row();
    let old_beam_length_m = match member {
        Member::Beam(b) => Some(b.length_m),
        _ => None,
    };
    for d in dimensions(member) {
        length_row(ui, units, d);
    }
    if let Member::Beam(beam) = member {
        if let Some(old) = old_beam_length_m
            && old != beam.length_m
        {
            keep_load_at_default(beam, old);
        }
        if let Some(point) = beam.load_points.first_mut() {
            length_row(
                ui,
                units,
                dim("Load position", LOAD_POSITION_HELP, &mut point.position_m),
            );
        }
    }
}

/// A labelled length in display units; writes the SI value back when the user changes it.
fn length_row(ui: &mut egui::Ui, units: Units, d: Dimension<'_>) {
    let q = Quantity::Length;
    let label_id = ui.label(d.label).id;
    let mut shown = units.to_display(q, *d.value_m);
    let speed = (shown.abs() * 0.005).max(0.01);
    let changed = ui
        .add(
            egui::DragValue::new(&mut shown)
                .speed(speed)
                .update_while_editing(false)
                .range(0.0..=f64::MAX)
                .max_decimals(4)
                // The length's own resolution, as in the inspector ("500.00 mm", "19.685 in").
                .custom_formatter(|v, _| number_text(v, units.decimals(q, v)))
                .suffix(format!(" {}", units.label(q))),
        )
        .labelled_by(label_id)
        .on_hover_text(d.help)
        .changed();
    if changed && shown.is_finite() {
        *d.value_m = units.from_display(q, shown);
    }
    ui.end_row();
}

fn buttons_ui(
    ui: &mut egui::Ui,
    built: Result<gw_plan::Project, String>,
) -> Option<NewProjectOutcome> {
    ui.horizontal(|ui| {
        let create = ui
            .add_enabled(built.is_ok(), egui::Button::new("Create"))
            .on_hover_text("Start a new project with this part.")
            .on_disabled_hover_text("Correct the form first; the message above says what.");
        let cancel = ui
            .button("Cancel")
            .on_hover_text("Close without creating a project.");
        if cancel.clicked() {
            Some(NewProjectOutcome::Cancel)
        } else if create.clicked() {
            built
                .ok()
                .map(|project| NewProjectOutcome::Create(Box::new(project)))
        } else {
            None
        }
    })
    .inner
}

/// An error message as a sentence: capital first letter, full stop.
fn sentence(message: &str) -> String {
    let mut chars = message.trim().chars();
    let Some(first) = chars.next() else {
        return String::new();
    };
    let mut out: String = first.to_uppercase().chain(chars).collect();
    if !out.ends_with('.') {
        out.push('.');
    }
    out
}

/// A length for a drawing label: "500 mm", "12.5 mm", "1.97 in"; "—" if it is not a number.
fn length_text(units: Units, length_m: f64) -> String {
    let v = units.to_display(Quantity::Length, length_m);
    if !v.is_finite() {
        return "—".to_owned();
    }
    let decimals = if v.abs() >= 100.0 {
        0
    } else if v.abs() >= 10.0 {
        1
    } else {
        2
    };
    let text = format!("{v:.decimals$}");
    let text = if text.contains('.') {
        text.trim_end_matches('0').trim_end_matches('.')
    } else {
        &text
    };
    format!("{text} {}", units.label(Quantity::Length))
}

// ---------------------------------------------------------------------------------------------
// The drawing: a side view and an end view, each to scale, in plain outline and one fill.

/// Where a drawing goes and the few colours it uses.
struct Sketch {
    painter: egui::Painter,
    ink: Stroke,
    fill: Color32,
    paper: Color32,
}

/// The boxes of a drawing: side view, end view, and the caption line under both.
struct Views {
    side: Rect,
    end: Rect,
    caption: Rect,
}

fn preview_ui(ui: &mut egui::Ui, member: &Member, units: Units) {
    let (response, painter) = ui.allocate_painter(PREVIEW_SIZE, Sense::hover());
    let rect = response.rect;
    let visuals = ui.visuals();
    let sketch = Sketch {
        painter,
        ink: Stroke::new(1.0, visuals.text_color()),
        fill: visuals.widgets.inactive.bg_fill,
        paper: visuals.extreme_bg_color,
    };
    sketch.painter.rect_filled(rect, 4.0, sketch.paper);
    if member.validate().is_ok() {
        draw_member(&sketch, member, units, rect.shrink(8.0));
        response.on_hover_text("The part to scale: side view, and the section or end view.");
    } else {
        sketch.painter.text(
            rect.center(),
            Align2::CENTER_CENTER,
            "The drawing appears\nwhen the sizes are valid.",
            FontId::proportional(12.0),
            visuals.weak_text_color(),
        );
    }
}

fn draw_member(sk: &Sketch, member: &Member, units: Units, area: Rect) {
    let views = split(area);
    match member {
        Member::Beam(b) => draw_beam(sk, b, units, &views),
        Member::Shaft(s) => {
            draw_round(
                sk,
                &views,
                s.length_m,
                s.outer_diameter_m,
                s.inner_diameter_m,
            );
            let text = format!(
                "Ø {}, length {}",
                length_text(units, s.outer_diameter_m),
                length_text(units, s.length_m)
            );
            sk.caption(views.caption, &text);
        }
        Member::ThinCylinder(c) => {
            let inner_m = c.outer_diameter_m - 2.0 * c.wall_m;
            draw_round(sk, &views, c.length_m, c.outer_diameter_m, inner_m);
            sk.caption(
                views.caption,
                &diameter_and_wall(units, c.outer_diameter_m, c.wall_m),
            );
        }
        Member::ThickCylinder(c) => {
            draw_round(
                sk,
                &views,
                c.length_m,
                c.outer_diameter_m,
                c.inner_diameter_m,
            );
            let wall_m = (c.outer_diameter_m - c.inner_diameter_m) / 2.0;
            sk.caption(
                views.caption,
                &diameter_and_wall(units, c.outer_diameter_m, wall_m),
            );
        }
        Member::ThinSphere(s) => {
            let views_area = area.with_max_y(views.caption.top() - 4.0);
            let inner_m = s.outer_diameter_m - 2.0 * s.wall_m;
            draw_rings(sk, views_area, s.outer_diameter_m, inner_m);
            sk.caption(
                views.caption,
                &diameter_and_wall(units, s.outer_diameter_m, s.wall_m),
            );
        }
        Member::PlateWithHole(p) => draw_plate(sk, p, units, area, views.caption),
        Member::GivenState(g) => draw_patch(sk, g, units, area, views.caption),
        Member::ImportedField(_) => {}
    }
}

fn diameter_and_wall(units: Units, outer_m: f64, wall_m: f64) -> String {
    format!(
        "Ø {}, wall {}",
        length_text(units, outer_m),
        length_text(units, wall_m)
    )
}

/// Side view on the left (about two thirds), end view on the right, caption along the bottom.
fn split(area: Rect) -> Views {
    let caption = Rect::from_min_max(pos2(area.left(), area.bottom() - 14.0), area.max);
    let views = area.with_max_y(caption.top() - 4.0);
    let side_width = views.width() * 0.68;
    Views {
        side: views.with_max_x(views.left() + side_width),
        end: views.with_min_x(views.left() + side_width + 10.0),
        caption,
    }
}

/// The rectangle of `width_m` × `height_m` (metres) at the largest scale that fits in `frame`,
/// centred in it, with the scale in pixels per metre.
fn fit(frame: Rect, width_m: f64, height_m: f64) -> (Rect, f32) {
    let scale = (f64::from(frame.width()) / width_m).min(f64::from(frame.height()) / height_m);
    if !(scale.is_finite() && scale > 0.0 && width_m.is_finite() && height_m.is_finite()) {
        return (
            Rect::from_center_size(frame.center(), egui::Vec2::ZERO),
            0.0,
        );
    }
    let scale = scale as f32;
    let size = vec2(width_m as f32 * scale, height_m as f32 * scale);
    (Rect::from_center_size(frame.center(), size), scale)
}

fn draw_beam(sk: &Sketch, beam: &Beam, units: Units, views: &Views) {
    // Room for the wall or pins below and left, and the load arrow above.
    let room = Rect::from_min_max(
        views.side.min + vec2(10.0, 22.0),
        views.side.max - vec2(2.0, 12.0),
    );
    let (_, height_m) = overall_size_m(&beam.section);
    let (body, scale) = fit(room, beam.length_m, height_m);
    let body = body.translate(vec2(room.left() - body.left(), 0.0));
    sk.solid(body);
    match beam.support {
        BeamSupport::Cantilever => sk.wall(body.left(), body.top() - 6.0, body.bottom() + 6.0),
        BeamSupport::SimplySupported => {
            sk.pin(body.left_bottom());
            sk.pin(body.right_bottom());
        }
    }
    for point in &beam.load_points {
        let x = body.left() + point.position_m as f32 * scale;
        sk.arrow(pos2(x, body.top() - 20.0), pos2(x, body.top() - 1.0));
    }
    draw_section(sk, &beam.section, views.end.shrink(4.0));
    let text = format!("length {}", length_text(units, beam.length_m));
    sk.caption(views.caption, &text);
}

fn draw_section(sk: &Sketch, section: &Section, frame: Rect) {
    let (width_m, height_m) = overall_size_m(section);
    let (outline, scale) = fit(frame, width_m, height_m);
    match *section {
        Section::Rectangle { .. } => sk.solid(outline),
        Section::SolidRound { diameter_m } => draw_rings(sk, frame, diameter_m, 0.0),
        Section::RoundTube {
            outer_diameter_m,
            inner_diameter_m,
        } => draw_rings(sk, frame, outer_diameter_m, inner_diameter_m),
        Section::RectangularTube { wall_m, .. } => {
            sk.solid(outline);
            sk.hole_rect(outline.shrink(wall_m as f32 * scale));
        }
        Section::IBeam {
            flange_thickness_m,
            web_thickness_m,
            ..
        } => draw_i_section(
            sk,
            outline,
            flange_thickness_m as f32 * scale,
            web_thickness_m as f32 * scale,
        ),
    }
}

/// An I section filling `outline`, flanges `flange` thick and the web `web` thick (pixels).
fn draw_i_section(sk: &Sketch, outline: Rect, flange: f32, web: f32) {
    let (l, r, t, b) = (
        outline.left(),
        outline.right(),
        outline.top(),
        outline.bottom(),
    );
    let (c, e) = (outline.center().x, web / 2.0);
    let top = Rect::from_min_max(pos2(l, t), pos2(r, t + flange));
    let bottom = Rect::from_min_max(pos2(l, b - flange), pos2(r, b));
    let web_rect = Rect::from_min_max(pos2(c - e, t + flange), pos2(c + e, b - flange));
    for part in [top, bottom, web_rect] {
        sk.painter.rect_filled(part, 0.0, sk.fill);
    }
    let points = vec![
        pos2(l, t),
        pos2(r, t),
        pos2(r, t + flange),
        pos2(c + e, t + flange),
        pos2(c + e, b - flange),
        pos2(r, b - flange),
        pos2(r, b),
        pos2(l, b),
        pos2(l, b - flange),
        pos2(c - e, b - flange),
        pos2(c - e, t + flange),
        pos2(l, t + flange),
    ];
    sk.painter.add(Shape::closed_line(points, sk.ink));
}

/// A round bar or vessel: side view with the bore as hidden lines, end view as rings.
fn draw_round(sk: &Sketch, views: &Views, length_m: f64, outer_m: f64, inner_m: f64) {
    let (body, scale) = fit(views.side.shrink(2.0), length_m, outer_m);
    sk.solid(body);
    if inner_m > 0.0 {
        let half = inner_m as f32 * scale / 2.0;
        for y in [body.center().y - half, body.center().y + half] {
            let line = [pos2(body.left(), y), pos2(body.right(), y)];
            sk.painter
                .extend(Shape::dashed_line(&line, sk.ink, 4.0, 3.0));
        }
    }
    draw_rings(sk, views.end.shrink(2.0), outer_m, inner_m);
}

/// A solid circle of `outer_m`, or a ring when `inner_m` is positive, fitted to `frame`.
fn draw_rings(sk: &Sketch, frame: Rect, outer_m: f64, inner_m: f64) {
    let (outline, scale) = fit(frame, outer_m, outer_m);
    let centre = outline.center();
    let outer = outline.width() / 2.0;
    sk.painter.circle(centre, outer, sk.fill, sk.ink);
    if inner_m > 0.0 {
        sk.painter
            .circle(centre, inner_m as f32 * scale / 2.0, sk.paper, sk.ink);
    }
}

fn draw_plate(sk: &Sketch, plate: &PlateWithHole, units: Units, area: Rect, caption: Rect) {
    let frame = area.with_max_y(caption.top() - 4.0);
    let (outline, scale) = fit(frame, plate.width_m, plate.height_m);
    sk.solid(outline);
    let hole = plate.hole_diameter_m as f32 * scale / 2.0;
    sk.painter.circle(outline.center(), hole, sk.paper, sk.ink);
    let text = format!(
        "{} × {}, hole Ø {}",
        length_text(units, plate.width_m),
        length_text(units, plate.height_m),
        length_text(units, plate.hole_diameter_m)
    );
    sk.caption(caption, &text);
}

fn draw_patch(sk: &Sketch, patch: &GivenState, units: Units, area: Rect, caption: Rect) {
    // Leave room all round for the arrows.
    let frame = area.with_max_y(caption.top() - 4.0).shrink(24.0);
    let (outline, _) = fit(frame, patch.length_m, patch.width_m);
    sk.solid(outline);
    let (along_x, along_y) = match patch.quantity {
        GivenQuantity::Strain(s) => (s.normal_x, s.normal_y),
        GivenQuantity::Stress {
            normal_x_pa,
            normal_y_pa,
            ..
        } => (normal_x_pa, normal_y_pa),
    };
    let c = outline.center();
    let (hx, hy) = (outline.width() / 2.0, outline.height() / 2.0);
    sk.stretch(c, vec2(hx, 0.0), along_x);
    sk.stretch(c, vec2(0.0, hy), along_y);
    let text = format!(
        "patch {} × {}",
        length_text(units, patch.length_m),
        length_text(units, patch.width_m)
    );
    sk.caption(caption, &text);
}

impl Sketch {
    /// A filled, outlined rectangle.
    fn solid(&self, rect: Rect) {
        self.painter.rect_filled(rect, 0.0, self.fill);
        self.painter
            .rect_stroke(rect, 0.0, self.ink, StrokeKind::Middle);
    }

    /// A rectangular hole cut from a solid.
    fn hole_rect(&self, rect: Rect) {
        self.painter.rect_filled(rect, 0.0, self.paper);
        self.painter
            .rect_stroke(rect, 0.0, self.ink, StrokeKind::Middle);
    }

    /// A clamped end: a wall face at `x` with hatching behind it.
    fn wall(&self, x: f32, top: f32, bottom: f32) {
        self.painter
            .line_segment([pos2(x, top), pos2(x, bottom)], self.ink);
        let mut y = top;
        while y < bottom {
            let depth = (bottom - y).min(6.0);
            self.painter
                .line_segment([pos2(x, y), pos2(x - depth, y + depth)], self.ink);
            y += 4.0;
        }
    }

    /// A pin support under `at`: a small triangle on a ground line.
    fn pin(&self, at: Pos2) {
        let triangle = vec![at, at + vec2(-5.0, 8.0), at + vec2(5.0, 8.0)];
        self.painter
            .add(Shape::convex_polygon(triangle, self.paper, self.ink));
        self.painter
            .line_segment([at + vec2(-8.0, 8.0), at + vec2(8.0, 8.0)], self.ink);
    }

    /// Arrows on both sides of `centre` at ±`half`, pointing out for a positive `sign`
    /// (tension), in for a negative one; none for zero.
    fn stretch(&self, centre: Pos2, half: egui::Vec2, sign: f64) {
        if sign == 0.0 || !sign.is_finite() {
            return;
        }
        let unit = half.normalized();
        for side in [1.0, -1.0] {
            let edge = centre + half * side;
            let (start, end) = (edge + unit * side * 4.0, edge + unit * side * 20.0);
            let (from, to) = if sign > 0.0 {
                (start, end)
            } else {
                (end, start)
            };
            self.arrow(from, to);
        }
    }

    /// An arrow from `from` to the head at `to`, with a head of fixed size.
    fn arrow(&self, from: Pos2, to: Pos2) {
        let stroke = Stroke::new(1.5, self.ink.color);
        let back = (from - to).normalized() * 7.0;
        let side = back.rot90() * 0.5;
        self.painter.line_segment([from, to], stroke);
        self.painter.line_segment([to, to + back + side], stroke);
        self.painter.line_segment([to, to + back - side], stroke);
    }

    fn caption(&self, rect: Rect, text: &str) {
        self.painter.text(
            rect.left_center(),
            Align2::LEFT_CENTER,
            text,
            FontId::proportional(12.0),
            self.ink.color,
        );
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn dialog_with(member: Member) -> NewProjectDialog {
        NewProjectDialog {
            member,
            ..NewProjectDialog::default()
        }
    }

    #[test]
    fn starts_with_a_cantilever_of_solid_rectangle_in_carbon_steel_loaded_at_the_free_end() {
        let d = NewProjectDialog::default();
        assert_eq!(d.material_key, Some("carbon_steel"));
        let Member::Beam(beam) = &d.member else {
            panic!("not a beam: {:?}", d.member);
        };
        assert_eq!(beam.support, BeamSupport::Cantilever);
        assert_eq!(SectionShape::of(&beam.section), SectionShape::Rectangle);
        assert_eq!(beam.load_points, vec![LoadPoint::whole(beam.length_m)]);
        let project = d.build().unwrap();
        assert_eq!(project.parts[0].name, "Part 1");
        assert_eq!(
            project.parts[0].material_key.as_deref(),
            Some("carbon_steel")
        );
    }

    #[test]
    fn every_model_kind_builds_a_valid_project() {
        for kind in ModelKind::ALL {
            let mut d = NewProjectDialog::default();
            switch_kind(&mut d.member, kind);
            let project = d.build().unwrap_or_else(|e| panic!("{}: {e}", kind.name()));
            gw_plan::validate::validate_project(&project).unwrap();
            assert_eq!(project.parts.len(), 1);
            assert_eq!(ModelKind::of(&project.parts[0].member), kind);
        }
    }

    #[test]
    fn an_inner_diameter_larger_than_the_outer_is_refused_with_a_message() {
        let mut member = ModelKind::ThickCylinder.default_member(&default_material());
        if let Member::ThickCylinder(c) = &mut member {
            c.outer_diameter_m = 0.050;
            c.inner_diameter_m = 0.052;
        }
        let err = dialog_with(member).build().unwrap_err();
        assert!(err.contains("must be smaller than"), "{err}");
        assert!(err.contains("52 mm") && err.contains("50 mm"), "{err}");
        assert!(err.starts_with('I'), "{err}");

        let mut shaft = ModelKind::Shaft.default_member(&default_material());
        if let Member::Shaft(s) = &mut shaft {
            s.inner_diameter_m = 0.06;
        }
        assert!(dialog_with(shaft).build().is_err());
    }

    #[test]
    fn an_empty_part_name_is_refused() {
        let d = NewProjectDialog {
            part_name: "  ".into(),
            ..NewProjectDialog::default()
        };
        assert_eq!(d.build().unwrap_err(), "Give the part a name.");
    }

    #[test]
    fn a_zero_size_is_refused_and_never_yields_a_project() {
        let mut member = ModelKind::PlateWithHole.default_member(&default_material());
        for d in dimensions(&mut member) {
            *d.value_m = 0.0;
        }
        let err = dialog_with(member).build().unwrap_err();
        assert!(err.contains("greater than zero"), "{err}");
    }

    #[test]
    fn the_material_choice_sets_the_key_and_the_properties() {
        let mut d = NewProjectDialog::default();
        use_material(&mut d.member, &mut d.material_key, "aluminium_wrought");
        let project = d.build().unwrap();
        let part = &project.parts[0];
        assert_eq!(part.material_key.as_deref(), Some("aluminium_wrought"));
        assert!((part.member.material().youngs_modulus_pa - 71.7e9).abs() < 1.0);
        // A key not in the library changes nothing.
        use_material(&mut d.member, &mut d.material_key, "unobtainium");
        assert_eq!(d.material_key, Some("aluminium_wrought"));
    }

    #[test]
    fn changing_the_model_keeps_the_material() {
        let mut d = NewProjectDialog::default();
        use_material(&mut d.member, &mut d.material_key, "brass");
        switch_kind(&mut d.member, ModelKind::Shaft);
        assert_eq!(d.member.material().name, "Brass");
        assert_eq!(d.material_key, Some("brass"));
    }

    #[test]
    fn each_section_shape_keeps_the_overall_size_and_is_valid() {
        let (width_m, height_m) = (0.03, 0.05);
        for shape in SectionShape::ALL {
            let s = shape.sized(width_m, height_m);
            s.validate()
                .unwrap_or_else(|e| panic!("{}: {e}", s.shape_name()));
            assert_eq!(SectionShape::of(&s), shape);
            let (w, h) = overall_size_m(&s);
            assert!((h - height_m).abs() < 1e-12, "{s:?}");
            let expected_w = if s.is_round() { height_m } else { width_m };
            assert!((w - expected_w).abs() < 1e-12, "{s:?}");
        }
        // Small sections keep positive walls.
        for shape in SectionShape::ALL {
            shape.sized(0.0004, 0.0006).validate().unwrap();
        }
    }

    #[test]
    fn the_load_follows_the_free_end_or_mid_span_unless_placed() {
        let Member::Beam(mut beam) = ModelKind::Beam.default_member(&default_material()) else {
            unreachable!("the beam kind makes a beam");
        };
        beam.length_m = 0.8;
        keep_load_at_default(&mut beam, 0.5);
        assert!((beam.load_points[0].position_m - 0.8).abs() < 1e-12);

        beam.support = BeamSupport::SimplySupported;
        beam.load_points = vec![LoadPoint::whole(default_load_position_m(beam.support, 0.8))];
        beam.length_m = 1.0;
        keep_load_at_default(&mut beam, 0.8);
        assert!((beam.load_points[0].position_m - 0.5).abs() < 1e-12);

        beam.load_points[0].position_m = 0.3;
        beam.length_m = 1.2;
        keep_load_at_default(&mut beam, 1.0);
        assert!((beam.load_points[0].position_m - 0.3).abs() < 1e-12);
    }

    #[test]
    fn a_load_beyond_a_shortened_beam_is_refused() {
        let Member::Beam(mut beam) = ModelKind::Beam.default_member(&default_material()) else {
            unreachable!("the beam kind makes a beam");
        };
        beam.load_points[0].position_m = 0.4;
        beam.length_m = 0.3;
        let err = dialog_with(Member::Beam(beam)).build().unwrap_err();
        assert!(err.contains("outside the span"), "{err}");
    }

    #[test]
    fn drawing_labels_read_in_the_chosen_units() {
        assert_eq!(length_text(Units::Si, 0.5), "500 mm");
        assert_eq!(length_text(Units::Si, 0.0125), "12.5 mm");
        assert_eq!(length_text(Units::Si, 0.008), "8 mm");
        // 0.05 m = 1.9685 in (1 in = 25.4 mm exactly, NIST SP 811).
        assert_eq!(length_text(Units::UsCustomary, 0.05), "1.97 in");
        assert_eq!(length_text(Units::Si, f64::NAN), "—");
    }

    #[test]
    fn fitting_a_degenerate_size_gives_an_empty_drawing_not_nan() {
        let frame = Rect::from_min_size(Pos2::ZERO, vec2(100.0, 50.0));
        for (w, h) in [(0.0, 0.0), (f64::NAN, 1.0), (1.0, f64::INFINITY)] {
            let (rect, scale) = fit(frame, w, h);
            assert!(rect.is_finite() && scale.is_finite(), "{w} {h}: {rect:?}");
        }
        let (rect, _) = fit(frame, 2.0, 1.0);
        assert!((rect.width() - 100.0).abs() < 1e-3 && (rect.height() - 50.0).abs() < 1e-3);
    }

    #[test]
    fn error_messages_read_as_sentences() {
        assert_eq!(
            sentence("depth must be positive"),
            "Depth must be positive."
        );
        assert_eq!(sentence("Done."), "Done.");
        assert_eq!(sentence(""), "");
    }
}
