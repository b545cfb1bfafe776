//! What the inspector edits: one description per field of the document (label, unit, help,
//! how to read and write it), grouped per item. Adding a field to the document means adding
//! one line here; the inspector draws, validates and undoes it like every other.

use gw_plan::Project;

use crate::units::{Quantity, Units};

/// How a number is shown.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Unit {
    /// A quantity whose unit follows the chosen unit system.
    Of(Quantity),
    /// A fixed scale and suffix: shown = stored × scale.
    Scaled(f64, &'static str),
}

impl Unit {
    /// Stored value to shown value.
    pub fn show(self, units: Units, v: f64) -> f64 {
        match self {
            Unit::Of(q) => units.to_display(q, v),
            Unit::Scaled(k, _) => v * k,
        }
    }

    /// Shown value to stored value.
    pub fn store(self, units: Units, v: f64) -> f64 {
        match self {
            Unit::Of(q) => units.from_display(q, v),
            Unit::Scaled(k, _) => v / k,
        }
    }

    /// Suffix shown after the number.
    pub fn suffix(self, units: Units) -> &'static str {
        match self {
            Unit::Of(q) => units.label(q),
            Unit::Scaled(_, s) => s,
        }
    }
}

/// Millimetres or inches.
pub const LENGTH: Unit = Unit::Of(Quantity::Length);
/// A fraction shown in per cent.
pub const PERCENT: Unit = Unit::Scaled(100.0, "%");
/// A strain shown in µε.
pub const MICROSTRAIN: Unit = Unit::Scaled(1e6, "µε");
/// A plain number.
pub const PLAIN: Unit = Unit::Scaled(1.0, "");
/// Ohms.
pub const OHM: Unit = Unit::Scaled(1.0, "Ω");
/// Volts.
pub const VOLT: Unit = Unit::Scaled(1.0, "V");
/// A relative change per degree: ppm/°C or ppm/°F.
pub const PPM_PER_DEGREE: Unit = Unit::Of(Quantity::ExpansionCoefficient);
/// Radians shown in degrees.
pub const DEGREES: Unit = Unit::Scaled(180.0 / std::f64::consts::PI, "°");

type Get<T, V> = Box<dyn Fn(&T) -> V>;
type Set<T, V> = Box<dyn Fn(&mut T, V)>;

/// How a field is edited.
pub enum Editor<T> {
    /// A real number.
    Number {
        unit: Unit,
        get: Get<T, f64>,
        set: Set<T, f64>,
    },
    /// A whole number within a range.
    Whole {
        range: (u64, u64),
        get: Get<T, u64>,
        set: Set<T, u64>,
    },
    /// Text (one line or several).
    Text {
        multiline: bool,
        get: Get<T, String>,
        set: Set<T, String>,
    },
    /// Yes or no.
    Flag {
        get: Get<T, bool>,
        set: Set<T, bool>,
    },
    /// One of several options, by position.
    Choice {
        options: Vec<String>,
        get: Get<T, Option<usize>>,
        set: Set<T, usize>,
    },
    /// Text read into the item when committed; the reader may refuse it, with the reason
    /// (optional numbers, where an empty field means "not measured"; lists of numbers).
    Parsed {
        get: Get<T, String>,
        parse: Parse<T>,
    },
    /// A value shown but not edited here (derived, or edited elsewhere), with why.
    Info(String),
}

type Parse<T> = Box<dyn Fn(&mut T, &str) -> Result<(), String>>;

/// One field of an item.
pub struct Field<T> {
    /// Where it sits in the item as the file stores it (dots between names; the coverage
    /// test compares these with the document).
    pub path: &'static str,
    /// Label before the control.
    pub label: String,
    /// Tooltip.
    pub help: &'static str,
    /// Editor.
    pub editor: Editor<T>,
}

/// Fields under one heading.
pub struct Group<T> {
    /// Heading.
    pub title: String,
    /// Fields.
    pub fields: Vec<Field<T>>,
}

/// What field builders may look at besides the item itself.
pub struct Ctx<'a> {
    /// The whole project (names of stock types, gauges of the part).
    pub project: &'a Project,
    /// The part the item belongs to, if any.
    pub part: Option<usize>,
    /// Display units.
    pub units: Units,
}

/// A number field.
pub fn num<T>(
    path: &'static str,
    label: &str,
    unit: Unit,
    help: &'static str,
    get: impl Fn(&T) -> f64 + 'static,
    set: impl Fn(&mut T, f64) + 'static,
) -> Field<T> {
    Field {
        path,
        label: label.to_owned(),
        help,
        editor: Editor::Number {
            unit,
            get: Box::new(get),
            set: Box::new(set),
        },
    }
}

/// A whole-number field.
pub fn whole<T>(
    path: &'static str,
    label: &str,
    range: (u64, u64),
    help: &'static str,
    get: impl Fn(&T) -> u64 + 'static,
    set: impl Fn(&mut T, u64) + 'static,
) -> Field<T> {
    Field {
        path,
        label: label.to_owned(),
        help,
        editor: Editor::Whole {
            range,
            get: Box::new(get),
            set: Box::new(set),
        },
    }
}

/// A text field.
pub fn text<T>(
    path: &'static str,
    label: &str,
    help: &'static str,
    get: impl Fn(&T) -> String + 'static,
    set: impl Fn(&mut T, String) + 'static,
) -> Field<T> {
    Field {
        path,
        label: label.to_owned(),
        help,
        editor: Editor::Text {
            multiline: false,
            get: Box::new(get),
            set: Box::new(set),
        },
    }
}

/// A yes/no field.
pub fn flag<T>(
    path: &'static str,
    label: &str,
    help: &'static str,
    get: impl Fn(&T) -> bool + 'static,
    set: impl Fn(&mut T, bool) + 'static,
) -> Field<T> {
    Field {
        path,
        label: label.to_owned(),
        help,
        editor: Editor::Flag {
            get: Box::new(get),
            set: Box::new(set),
        },
    }
}

/// A choice among `options`.
pub fn choice<T>(
    path: &'static str,
    label: &str,
    help: &'static str,
    options: Vec<String>,
    get: impl Fn(&T) -> Option<usize> + 'static,
    set: impl Fn(&mut T, usize) + 'static,
) -> Field<T> {
    Field {
        path,
        label: label.to_owned(),
        help,
        editor: Editor::Choice {
            options,
            get: Box::new(get),
            set: Box::new(set),
        },
    }
}

/// A choice among the values of a small enum, by their names.
pub fn pick<T, V: Copy + PartialEq + 'static>(
    path: &'static str,
    label: &str,
    help: &'static str,
    values: &[(V, &str)],
    get: impl Fn(&T) -> V + 'static,
    set: impl Fn(&mut T, V) + 'static,
) -> Field<T> {
    let list: Vec<V> = values.iter().map(|(v, _)| *v).collect();
    let list2 = list.clone();
    choice(
        path,
        label,
        help,
        values.iter().map(|(_, n)| (*n).to_owned()).collect(),
        move |t| list.iter().position(|v| *v == get(t)),
        move |t, i| {
            if let Some(v) = list2.get(i) {
                set(t, *v);
            }
        },
    )
}

/// A read-only line.
pub fn info<T>(path: &'static str, label: &str, help: &'static str, value: String) -> Field<T> {
    Field {
        path,
        label: label.to_owned(),
        help,
        editor: Editor::Info(value),
    }
}

/// A field of text read by `parse` when committed.
pub fn parsed<T>(
    path: &'static str,
    label: &str,
    help: &'static str,
    get: impl Fn(&T) -> String + 'static,
    parse: impl Fn(&mut T, &str) -> Result<(), String> + 'static,
) -> Field<T> {
    Field {
        path,
        label: label.to_owned(),
        help,
        editor: Editor::Parsed {
            get: Box::new(get),
            parse: Box::new(parse),
        },
    }
}

/// Reads a typed number shown in `unit` (empty: none).
pub fn read_optional(text: &str, unit: Unit, units: Units) -> Result<Option<f64>, String> {
    let t = text.trim();
    if t.is_empty() {
        return Ok(None);
    }
    let t = t.strip_suffix(unit.suffix(units)).unwrap_or(t).trim();
    match t.replace(',', ".").parse::<f64>() {
        Ok(v) if v.is_finite() => Ok(Some(unit.store(units, v))),
        _ => Err(format!(
            "\"{text}\" is not a number; type a plain number in {} or leave the field empty \
             for \"not measured\"",
            unit.suffix(units)
        )),
    }
}

/// A stored optional number as typed text (empty: none), rounded to 12 significant digits so
/// the unit conversion's last-bit noise (6.6000000000000005 GΩ) does not show.
pub fn show_optional(v: Option<f64>, unit: Unit, units: Units) -> String {
    match v {
        Some(v) if v.is_finite() => {
            let shown = unit.show(units, v);
            let rounded = format!("{shown:.11e}").parse::<f64>().unwrap_or(shown);
            format!("{rounded}")
        }
        _ => String::new(),
    }
}

/// An optional number typed as text: empty means "not measured".
pub fn optional_number<T>(
    path: &'static str,
    label: &str,
    unit: Unit,
    units: Units,
    help: &'static str,
    get: impl Fn(&T) -> Option<f64> + 'static,
    set: impl Fn(&mut T, Option<f64>) + 'static,
) -> Field<T> {
    let mut field = parsed(
        path,
        label,
        help,
        move |t| show_optional(get(t), unit, units),
        move |t, text| {
            set(t, read_optional(text, unit, units)?);
            Ok(())
        },
    );
    let suffix = unit.suffix(units);
    if !suffix.is_empty() {
        field.label = format!("{label} ({suffix})");
    }
    field
}

#[cfg(test)]
mod tests {
    use super::{Unit, read_optional, show_optional};
    use crate::units::Units;

    #[test]
    fn a_stored_value_shows_as_typed_without_conversion_noise() {
        let gigaohm = Unit::Scaled(1e-9, "GΩ");
        let microstrain = Unit::Scaled(1e6, "µε");
        for (typed, unit) in [("6.6", gigaohm), ("15.6", gigaohm), ("-127.9", microstrain)] {
            let stored = read_optional(typed, unit, Units::Si).unwrap();
            assert_eq!(show_optional(stored, unit, Units::Si), typed);
        }
        assert_eq!(show_optional(None, gigaohm, Units::Si), "");
    }
}
