//! The help view: method, assumptions and cautions.

use gw_plan::cautions::cautions;

use crate::state::DocumentState;

/// Method and assumptions, in our words.
const METHOD: &[(&str, &str)] = &[
    (
        "Mechanics",
        "Each part is a textbook model: Euler–Bernoulli beams (one or several load points) with transverse shear by the elasticity solution at the surface of solid round and solid rectangular sections and by the mean τ = VQ/(Ib) in tubes and webs, plus the thin-wall shear flow in flanges and tube walls (no torsion of beam sections), round shafts (τ = Tr/J), thin-walled vessels (membrane stresses as the design figures, the outer surface's value from the thick-wall solutions as the reading, valid for mean radius ≥ 10 × wall), thick cylinders (Lamé), and an infinite plate with a circular hole (Kirsch). Strains are those of the free outer surface; the peak stress against yield includes the hole edge and the bore of a vessel.",
    ),
    (
        "Grids",
        "A grid reads the strain along its direction averaged over its area (numerical quadrature), plus its transverse sensitivity. Near steep gradients the reading is lower than the peak.",
    ),
    (
        "Bridges",
        "Every bridge is solved as a real circuit with its leads, wiring, excitation, amplifier input and shunt. Readings are after zero balance at no load and the reference temperature; the instrument converts with its set gauge factor and bridge factor.",
    ),
    (
        "Temperature",
        "Apparent strain comes from the gauge lot's thermal output, the mismatch between the part's expansion and the gauge's match, gauge-factor drift, lead resistance (leads follow the part temperature) and completion-resistor drift. The lot's curve counts as recorded (it already holds the gauge factor's own drift on the matched material); the mismatch and the load's strain are read at the gauge factor of the temperature.",
    ),
    (
        "Noise",
        "Johnson noise of the bridge's output resistance and the amplifier's noise density, over the channel filter's equivalent noise bandwidth: π/2 × the bandwidth for a first-order RC (taken when no filter is given), 1.11 × for a two-pole Butterworth, 1.03 × for four poles. Quantization is its own row in the uncertainty budget.",
    ),
    (
        "Uncertainty",
        "Linear propagation per JCGM 100:2008 with the inputs listed in the budget; the expanded uncertainty covers 95 %, with k from the budget itself (JCGM 100:2008, Annex G): Student's t at the Welch–Satterthwaite degrees of freedom (1.96 when every input is known by its bounds), or, when one rectangular input carries at least half the variance, the factor of that rectangle convolved with a normal of the rest (down to 1.65 for a rectangle alone). Monte Carlo per JCGM 101:2008 on request.",
    ),
    (
        "Suggestions",
        "Suggest arrangements tries every assignment of the placed grids to the four arms and ranks them by the error each leaves in the wanted load at its rated value, in the load's own unit: unwanted loads, temperature (leads and completion resistors included) and nonlinearity at their worst, plus twice the root sum of squares of noise, quantization and placement tolerance. An arrangement whose full-scale output is below one count of the channel is left out; the catalogue offers only the arrangements that read the wanted load on this part.",
    ),
    (
        "Accuracy",
        "A bridge may state the accuracy it needs (± % of reading, or ± in the measured unit). In each load case its reading is converted to the wanted load with the part's strain per unit load; the error of that figure (leakage, temperature, leads, gauge effects) plus the expanded uncertainty at that case must fit inside the requirement, a margin like the others.",
    ),
    (
        "Margins",
        "Pass below the warning level (80 % by default), warn up to 100 %, fail above. Limits for grid strain, fatigue and power density come from the gauge data; edit them to your gauge lot.",
    ),
];

/// Where the user guide is: the copy beside the sources of this build.
const GUIDE_URL: &str = concat!(
    "file://",
    env!("CARGO_MANIFEST_DIR"),
    "/../../docs/guide.md"
);

/// Help view state.
#[derive(Default)]
pub struct HelpPanel;

impl HelpPanel {
    /// Draws the help.
    pub fn help_ui(&mut self, ui: &mut egui::Ui, doc: &DocumentState) {
        let Self = self;
        egui::ScrollArea::vertical().show(ui, |ui| {
            ui.heading("Getting started");
            ui.label(
                "New in the File menu asks for your first part. The plan tree on the left holds the parts, \
                 their load cases, gauges and bridges, and the project's gauge stock: select an \
                 item to edit every value of it in the inspector on the right; Add, Duplicate, \
                 Rename (F2) and Delete sit above the tree, and Undo in the Edit menu takes any change back.",
            );
            ui.horizontal_wrapped(|ui| {
                ui.label("The user guide walks from a new project to the build sheet and lists each model's limits:");
                ui.hyperlink_to("docs/guide.md", GUIDE_URL)
                    .on_hover_text("The user guide in the project's documentation folder");
            });
            ui.add_space(4.0);
            ui.heading("How Gaugewright computes");
            for (title, text) in METHOD {
                ui.strong(*title);
                ui.label(*text);
                ui.add_space(4.0);
            }
            ui.separator();
            ui.heading("Cautions");
            for c in cautions(&doc.project) {
                ui.strong(&c.title);
                ui.label(&c.text);
                ui.add_space(4.0);
            }
        });
    }
}
