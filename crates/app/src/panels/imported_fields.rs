//! The inspector's fields of a part made from imported finite-element results: what was read,
//! the name of each unit load, and where its file is.

use gw_mechanics::Member;
use gw_mechanics::imported::{FieldState, ImportedSurface, ReferenceAxis};
use gw_plan::Part;
use gw_plan::imported_part::set_reference_axis;

use super::fields::{Editor, Field};

fn imported(m: &Member) -> Option<&ImportedSurface> {
    match m {
        Member::ImportedField(f) => Some(f),
        _ => None,
    }
}

fn imported_mut(m: &mut Member) -> Option<&mut ImportedSurface> {
    match m {
        Member::ImportedField(f) => Some(f),
        _ => None,
    }
}

/// What was read, in one line.
pub fn surface_summary(f: &ImportedSurface) -> String {
    match &f.field {
        FieldState::Loaded(s) => format!(
            "{} surface nodes, {} triangles, {} faces ({})",
            s.node_count(),
            s.triangle_count(),
            s.patches().len(),
            if s.from_solid() {
                "outer surface of the solid cells"
            } else {
                "shell cells"
            }
        ),
        FieldState::Failed(why) => format!("not read: {why}"),
        FieldState::NotLoaded => "not read yet".to_owned(),
    }
}

fn info(path: &'static str, label: &str, help: &'static str, text: String) -> Field<Part> {
    Field {
        path,
        label: label.to_owned(),
        help,
        editor: Editor::Info(text),
    }
}

/// The global axis the faces' x axes follow: a choice once the results are read (the gauges
/// keep their places and directions on the part when it changes), else shown only.
fn reference_axis_field(f: &ImportedSurface) -> Field<Part> {
    const PATH: &str = "member.ImportedField.reference_axis";
    const HELP: &str = "Each face's x axis is this global axis projected onto the face (the \
                        next axis where it stands square to the face); gauge positions and \
                        angles are measured in these axes. Changing it keeps every gauge where \
                        it is on the part.";
    if f.surface().is_none() {
        return info(
            PATH,
            "Face x axes follow",
            HELP,
            f.reference_axis.name().to_owned(),
        );
    }
    Field {
        path: PATH,
        label: "Face x axes follow".to_owned(),
        help: HELP,
        editor: Editor::Choice {
            options: ReferenceAxis::ALL
                .iter()
                .map(|a| a.name().to_owned())
                .collect(),
            get: Box::new(|p: &Part| {
                imported(&p.member).and_then(|f| {
                    ReferenceAxis::ALL
                        .iter()
                        .position(|&a| a == f.reference_axis)
                })
            }),
            set: Box::new(|p, k| {
                // Refused only when the results are not read, where this choice is not shown.
                let _ = set_reference_axis(p, ReferenceAxis::ALL[k]);
            }),
        },
    }
}

/// The fields of an imported part.
pub fn imported_fields(f: &ImportedSurface) -> Vec<Field<Part>> {
    let mut out = vec![info(
        "member.ImportedField.field",
        "Surface",
        "What was read from the result files",
        surface_summary(f),
    )];
    out.push(reference_axis_field(f));
    if let Some(mesh) = &f.mesh_file {
        out.push(info(
            "member.ImportedField.mesh_file",
            "Cells from",
            "The mesh whose cells the CSV results are read on",
            mesh.clone(),
        ));
    }
    for (k, load) in f.loads.iter().enumerate() {
        out.push(Field {
            path: "member.ImportedField.loads.name",
            label: format!("Load {} name", k + 1),
            help: "What you call this load (shown beside its component)",
            editor: Editor::Text {
                multiline: false,
                get: Box::new(move |p: &Part| {
                    imported(&p.member)
                        .and_then(|f| f.loads.get(k))
                        .map(|l| l.name.clone())
                        .unwrap_or_default()
                }),
                set: Box::new(move |p, v| {
                    if let Some(l) = imported_mut(&mut p.member).and_then(|f| f.loads.get_mut(k)) {
                        l.name = v;
                    }
                }),
            },
        });
        let array = load
            .array
            .as_ref()
            .map(|a| format!(" (array \"{a}\")"))
            .unwrap_or_default();
        out.push(info(
            "member.ImportedField.loads.file|member.ImportedField.loads.component|\
             member.ImportedField.loads.array",
            &format!("Load {} file", k + 1),
            "The result file of this unit load (per 1 N, 1 N·m or 1 Pa of its component)",
            format!(
                "{}{array}, per 1 {} of {}",
                load.file,
                load.component.unit(),
                load.component.name()
            ),
        ));
        out.push(info(
            "member.ImportedField.loads.units",
            &format!("Load {} units", k + 1),
            "The units the file is read in (stated when importing, or by the file itself)",
            load.units
                .map(|u| u.describe())
                .unwrap_or_else(|| "as stated in the file".to_owned()),
        ));
        out.push(info(
            "member.ImportedField.loads.checksum",
            &format!("Load {} checksum", k + 1),
            "The file's SHA-256 when it was imported: a file changed since is named in the findings",
            load.checksum
                .as_ref()
                .map(|c| c.chars().take(23).collect::<String>() + "…")
                .unwrap_or_else(|| "not recorded".to_owned()),
        ));
    }
    out
}
