//! The project parser's messages in the user's words: the names a user sees in the file, never
//! the program's type names; a misspelt field or choice answered with the nearest known one; no
//! advice meant for programmers; no token so long that it buries the message.

/// The message for a parse error.
pub fn user_words(code: &ron::Error) -> String {
    use ron::Error::*;
    match code {
        ExceededRecursionLimit => "the file is nested too deeply to be a project (brackets \
                                   inside brackets, hundreds deep)"
            .to_owned(),
        Eof => "the file ends before the project does: it may have been cut short".to_owned(),
        NoSuchStructField {
            expected,
            found,
            outer,
        } => unknown("field", found, expected, outer.as_deref()),
        NoSuchEnumVariant {
            expected,
            found,
            outer,
        } => unknown("choice", found, expected, outer.as_deref()),
        MissingStructField { field, outer } => format!(
            "`{field}` is missing from {}; add it (a new project written by the app shows every \
             field)",
            place(outer.as_deref())
        ),
        DuplicateStructField { field, outer } => format!(
            "`{field}` is given twice in {}; keep one",
            place(outer.as_deref())
        ),
        other => {
            let text = other
                .to_string()
                .replace(
                    "struct `VersionProbe`",
                    &format!(
                        "a project, `(format_version: {}, …)`,",
                        crate::document::FORMAT_VERSION
                    ),
                )
                .replace("`VersionProbe`", "the project");
            shorten_quoted(&text, 40)
        }
    }
}

/// An unknown field or choice with the nearest known one and the full list.
fn unknown(kind: &str, found: &str, expected: &[&str], outer: Option<&str>) -> String {
    let shown = shorten_quoted(&format!("`{found}`"), 40);
    let nearest = expected
        .iter()
        .map(|e| (strsim::damerau_levenshtein(found, e), *e))
        .min();
    let mut text = format!("{shown} is not a {kind} of {}", place(outer));
    // A suggestion only when it is near: at most a third of the word differs.
    if let Some((d, e)) = nearest
        && d <= (found.chars().count().max(3) / 3).max(1)
    {
        text += &format!("; did you mean `{e}`?");
    }
    let list: Vec<String> = expected.iter().map(|e| format!("`{e}`")).collect();
    text += &format!(" The {kind}s here are: {}", list.join(", "));
    text
}

/// Where a field sits, in the user's words: the item of the document, not the type behind it.
fn place(outer: Option<&str>) -> String {
    let words = match outer.unwrap_or("") {
        "Project" | "ProjectV1" | "VersionProbe" => "the project",
        "Part" | "PartV1" => "a part",
        "LoadCase" => "a load case",
        "PlanGauge" | "GaugeV1" => "a gauge",
        "GaugeLot" => "a gauge's lot values",
        "StockGauge" => "a gauge type of the stock",
        "GaugeSpec" => "the gauge data",
        "ThermalOutput" => "the thermal output",
        "BridgePlan" | "BridgePlanV1" => "a bridge",
        "BridgeFactorOverride" => "the typed bridge factor",
        "LeadWire" => "the leads",
        "SignalChain" => "the channel",
        "ShuntPlan" => "the shunt calibration",
        "CompletionResistor" => "a completion resistor",
        "InstallationTolerances" => "how well the installation is known",
        "LeadColours" => "the lead colours",
        "Material" => "the material",
        "Beam" => "the beam",
        "LoadPoint" => "a load point",
        "Shaft" => "the shaft",
        "ThinCylinder" | "ThickCylinder" => "the cylinder",
        "ThinSphere" => "the sphere",
        "PlateWithHole" => "the plate",
        "GivenState" => "the given state",
        "SurfacePoint" => "a position",
        "LoadComponent" => "the load components",
        "Member" => "the model kinds",
        "Section" => "the sections",
        "BeamSupport" => "the supports",
        "VesselEnds" => "the vessel ends",
        "Face" => "the faces",
        "GivenQuantity" => "the given quantities",
        "GaugePattern" => "the gauge patterns",
        "PlanArm" | "ArmElement" => "what an arm holds",
        "LeadWiring" => "the lead wirings",
        "Excitation" => "the excitations",
        "InstrumentTemperature" => "the instrument temperatures",
        "ShuntLocation" => "the shunt connections",
        "LowPassFilter" => "the filters",
        "RequiredAccuracy" => "the required accuracies",
        "PaperSize" => "the paper sizes",
        _ => "this item",
    };
    words.to_owned()
}

/// Every `quoted` token longer than `limit` characters cut to its start and end.
pub fn shorten_quoted(text: &str, limit: usize) -> String {
    text.split('`')
        .enumerate()
        .map(|(i, p)| {
            let n = p.chars().count();
            if i % 2 == 1 && n > limit {
                let head: String = p.chars().take(limit / 2).collect();
                let tail: String = p.chars().skip(n - limit / 4).collect();
                format!("{head}…{tail} ({n} characters)")
            } else {
                p.to_owned()
            }
        })
        .collect::<Vec<_>>()
        .join("`")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_misspelt_field_gets_the_nearest_name_and_no_type_name() {
        let e = ron::Error::NoSuchStructField {
            expected: &["name", "warn_utilisation", "parts"],
            found: "warn_utilisaton".into(),
            outer: Some("Project".into()),
        };
        let text = user_words(&e);
        assert!(text.contains("did you mean `warn_utilisation`?"), "{text}");
        assert!(text.contains("the project"), "{text}");
        assert!(!text.contains("`Project`"), "{text}");
    }

    #[test]
    fn a_field_unlike_any_gets_the_list_but_no_guess() {
        let e = ron::Error::NoSuchStructField {
            expected: &["name", "parts"],
            found: "colour_of_the_sky".into(),
            outer: Some("Part".into()),
        };
        let text = user_words(&e);
        assert!(!text.contains("did you mean"), "{text}");
        assert!(text.contains("`name`, `parts`"), "{text}");
    }

    #[test]
    fn a_long_token_is_shortened() {
        let long = "x".repeat(5000);
        let text = shorten_quoted(&format!("found `{long}` here"), 40);
        assert!(text.len() < 200, "{text}");
        assert!(text.contains("(5000 characters)"), "{text}");
    }
}
