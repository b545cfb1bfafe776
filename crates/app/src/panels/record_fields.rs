//! What the inspector edits of the check-out records: one description per recorded value of a
//! grid and of a bridge. An empty number field means "not measured".

use gw_mechanics::LoadComponent;
use gw_plan::installation::{BridgeRecord, GridRecord};

use super::fields::{
    Digits, Field, Group, MICROSTRAIN, OHM, Unit, optional_number, parsed, read_optional,
    show_optional, text,
};
use crate::units::{Quantity, Units};

/// Insulation, entered in GΩ.
const GIGAOHM: Unit = Unit::Scaled(1e-9, "GΩ", Digits::Places(0, 2));
/// A bridge reading in mV/V.
const MV_PER_V: Unit = Unit::Scaled(1.0, "mV/V", Digits::Places(0, 4));

fn date_and_initials<T: 'static>(
    date: fn(&T) -> &String,
    date_mut: fn(&mut T) -> &mut String,
    initials: fn(&T) -> &String,
    initials_mut: fn(&mut T) -> &mut String,
) -> [Field<T>; 2] {
    [
        text(
            "date",
            "Date",
            "When it was measured",
            move |r: &T| date(r).clone(),
            move |r, v| *date_mut(r) = v,
        ),
        text(
            "initials",
            "Initials",
            "Who measured",
            move |r: &T| initials(r).clone(),
            move |r, v| *initials_mut(r) = v,
        ),
    ]
}

/// The fields of one grid's record, under `title`.
pub fn grid_record_groups(title: String, units: Units) -> Vec<Group<GridRecord>> {
    let mut fields = vec![
        optional_number(
            "resistance_ohm",
            "Resistance",
            OHM,
            units,
            "Grid resistance at its tabs after bonding, before wiring",
            |r: &GridRecord| r.resistance_ohm,
            |r, v| r.resistance_ohm = v,
        ),
        optional_number(
            "insulation_ohm",
            "Insulation",
            GIGAOHM,
            units,
            "Insulation from the grid to the part, at no more than 50 V",
            |r: &GridRecord| r.insulation_ohm,
            |r, v| r.insulation_ohm = v,
        ),
        text(
            "serial",
            "Serial or lot",
            "Serial or lot written down at installation",
            |r: &GridRecord| r.serial.clone(),
            |r, v| r.serial = v,
        ),
    ];
    fields.extend(date_and_initials(
        |r: &GridRecord| &r.date,
        |r| &mut r.date,
        |r| &r.initials,
        |r| &mut r.initials,
    ));
    vec![Group { title, fields }]
}

/// Known load steps as typed: numbers in the display unit, separated by spaces or semicolons.
fn load_steps_field(wanted: LoadComponent, units: Units) -> Field<BridgeRecord> {
    let unit = Unit::Of(Quantity::of(wanted));
    let label = format!("Known load steps ({})", unit.suffix(units));
    parsed(
        "known_load_steps",
        &label,
        "Loads applied in the first test, in order, separated by spaces or semicolons; each \
         held long enough to show as a plateau in the log",
        move |r: &BridgeRecord| {
            let shown: Vec<String> = r
                .known_load_steps
                .iter()
                .map(|v| show_optional(Some(*v), unit, units))
                .collect();
            shown.join(" ")
        },
        move |r, typed| {
            let mut steps = Vec::new();
            for word in typed.split([' ', ';']).filter(|w| !w.trim().is_empty()) {
                if let Some(v) = read_optional(word, unit, units)? {
                    steps.push(v);
                }
            }
            r.known_load_steps = steps;
            Ok(())
        },
    )
}

/// The fields of one bridge's record.
pub fn bridge_record_groups(wanted: LoadComponent, units: Units) -> Vec<Group<BridgeRecord>> {
    let mut fields = vec![
        optional_number(
            "lead_ohm",
            "Lead, one conductor",
            OHM,
            units,
            "Resistance of one lead conductor, measured end to end",
            |r: &BridgeRecord| r.lead_ohm,
            |r, v| r.lead_ohm = v,
        ),
        optional_number(
            "insulation_ohm",
            "Insulation",
            GIGAOHM,
            units,
            "Insulation from all pins joined together to the part",
            |r: &BridgeRecord| r.insulation_ohm,
            |r, v| r.insulation_ohm = v,
        ),
        optional_number(
            "zero_mv_per_v",
            "Zero",
            MV_PER_V,
            units,
            "Reading with the part unloaded",
            |r: &BridgeRecord| r.zero_mv_per_v,
            |r, v| r.zero_mv_per_v = v,
        ),
        optional_number(
            "zero_again_mv_per_v",
            "Zero after warm-up",
            MV_PER_V,
            units,
            "The zero read again after the bridge has been excited for a while (15 min is \
             common practice); the difference is the drift",
            |r: &BridgeRecord| r.zero_again_mv_per_v,
            |r, v| r.zero_again_mv_per_v = v,
        ),
        optional_number(
            "shunt_step_strain",
            "Shunt step",
            MICROSTRAIN,
            units,
            "Reading with the shunt connected less the zero, as the instrument displays it",
            |r: &BridgeRecord| r.shunt_step_strain,
            |r, v| r.shunt_step_strain = v,
        ),
        load_steps_field(wanted, units),
    ];
    fields.extend(date_and_initials(
        |r: &BridgeRecord| &r.date,
        |r| &mut r.date,
        |r| &r.initials,
        |r| &mut r.initials,
    ));
    vec![Group {
        title: "Bridge record".into(),
        fields,
    }]
}
