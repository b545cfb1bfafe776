//! The wiring schematic of one bridge.

use super::layout::{MARGIN, Op};
use super::writer::Writer;
use crate::document::{Part, PlanArm, Project};
use crate::evaluate::BridgeEvaluation;

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

pub(crate) fn draw(
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
