//! Cautions that apply to a plan. They defer to local codes, standards and licensed
//! engineering practice and never state that anything is safe.

use gw_mechanics::{LoadComponent, Member};
use serde::Serialize;

use crate::document::Project;

/// One caution.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Caution {
    /// Short title.
    pub title: String,
    /// What to heed.
    pub text: String,
}

const DEFER: &str = "Local codes, standards, the equipment owner's procedures and licensed \
     engineering practice govern; this plan does not certify that the part or the test is safe.";

fn caution(title: &str, text: &str) -> Caution {
    Caution {
        title: title.to_owned(),
        text: format!("{text} {DEFER}"),
    }
}

/// The cautions relevant to `project`.
pub fn cautions(project: &Project) -> Vec<Caution> {
    let mut out = Vec::new();
    let pressure = project.parts.iter().any(|p| {
        matches!(
            p.member,
            Member::ThinCylinder(_) | Member::ThinSphere(_) | Member::ThickCylinder(_)
        ) && p.load_cases.iter().any(|c| {
            c.value(LoadComponent::InternalPressure) != 0.0
                || c.value(LoadComponent::ExternalPressure) != 0.0
        })
    });
    if pressure {
        out.push(caution(
            "Stored energy in pressure tests",
            "A pressurised vessel stores energy that a leak or rupture releases at once. Keep people \
             out of the test area while pressure is applied, prefer liquid to gas as the test medium, \
             and never work on gauges or fittings while the vessel is under pressure.",
        ));
    }
    if project
        .parts
        .iter()
        .any(|p| p.load_cases.iter().any(|c| c.proof_test))
    {
        out.push(caution(
            "Proof loads",
            "A proof load is meant to approach the limits of the part and its fixtures. Restrain or \
             guard against sudden release, keep people clear of the load path, and apply the load \
             in steps while watching the readings for unexpected behaviour.",
        ));
    }
    out.push(caution(
        "Excitation wiring in hazardous areas",
        "Bridge excitation and leads are electrical circuits. In an area with flammable gas, vapour \
         or dust use only equipment and barriers approved for that area, and disconnect excitation \
         before working on gauges on energised equipment.",
    ));
    out.push(caution(
        "Adhesives and solvents",
        "Bonding adhesives, primers and cleaning solvents can be toxic, flammable or sensitising. \
         Follow each product's safety data sheet, ventilate, and wear the gloves and eye protection \
         it calls for.",
    ));
    out.push(caution(
        "Hot work",
        "Soldering lead wires and curing adhesives with heat are sources of ignition and burns. Keep \
         them away from solvents and obtain any hot-work permit the site requires.",
    ));
    out
}
