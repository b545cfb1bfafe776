//! What the inspector edits: one description per field of the document (label, unit, help,
//! how to read and write it), grouped per item. Adding a field to the document means adding
//! one line here; the inspector draws, validates and undoes it like every other.

use gw_plan::Project;

use crate::units::{Quantity, Units, number_text};

/// How a number is shown.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Unit {
    /// A quantity whose unit follows the chosen unit system, at the quantity's resolution.
    Of(Quantity),
    /// A quantity whose unit follows the chosen unit system, with digits of its own (a
    /// temperature coefficient reads "3900 ppm/°C", not "3900.00 ppm/°C").
    OfDigits(Quantity, Digits),
    /// A fixed scale and suffix: shown = stored × scale, with its digits.
    Scaled(f64, &'static str, Digits),
    /// A fixed unit of each system, SI first then US customary, for a quantity the shared
    /// unit list does not name (a resistance per cable length): shown = stored × scale.
    PerSystem([(f64, &'static str); 2], Digits),
}

/// How many decimals a number in a fixed unit shows.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Digits {
    /// As many decimals as the value needs, at least the first and at most the second: a
    /// gauge factor reads "2.10" or "2.125", an angle "45" or "12.5".
    Places(usize, usize),
    /// Significant digits, trailing zeros dropped, for values that range over decades
    /// ("0.13 Ω/m", "0.0396 Ω/ft").
    Significant(u32),
}

impl Digits {
    /// The number alone: never "-0", "—" when not finite.
    pub fn text(self, shown: f64) -> String {
        let (min, max) = match self {
            Digits::Places(min, max) => (min, max),
            Digits::Significant(n) => {
                let magnitude = if shown == 0.0 || !shown.is_finite() {
                    0
                } else {
                    shown.abs().log10().floor() as i32
                };
                (0, (n as i32 - 1 - magnitude).clamp(0, 9) as usize)
            }
        };
        let full = number_text(shown, max);
        let Some(point) = full.find('.') else {
            return full;
        };
        let keep = full.trim_end_matches('0').len().max(point + 1 + min);
        full[..keep].trim_end_matches('.').to_owned()
    }
}

impl Unit {
    /// Stored value to shown value.
    pub fn show(self, units: Units, v: f64) -> f64 {
        match self {
            Unit::Of(q) | Unit::OfDigits(q, _) => units.to_display(q, v),
            Unit::Scaled(k, _, _) => v * k,
            Unit::PerSystem(each, _) => v * each[system(units)].0,
        }
    }

    /// Shown value to stored value.
    pub fn store(self, units: Units, v: f64) -> f64 {
        match self {
            Unit::Of(q) | Unit::OfDigits(q, _) => units.from_display(q, v),
            Unit::Scaled(k, _, _) => v / k,
            Unit::PerSystem(each, _) => v / each[system(units)].0,
        }
    }

    /// Suffix shown after the number.
    pub fn suffix(self, units: Units) -> &'static str {
        match self {
            Unit::Of(q) | Unit::OfDigits(q, _) => units.label(q),
            Unit::Scaled(_, s, _) => s,
            Unit::PerSystem(each, _) => each[system(units)].1,
        }
    }

    /// A shown value as text, without the suffix, at the unit's resolution.
    pub fn number_text(self, units: Units, shown: f64) -> String {
        match self {
            Unit::Of(q) => number_text(shown, units.decimals(q, shown)),
            Unit::OfDigits(_, digits) | Unit::Scaled(_, _, digits) | Unit::PerSystem(_, digits) => {
                digits.text(shown)
            }
        }
    }
}

/// The position of a unit system in a [`Unit::PerSystem`] pair.
fn system(units: Units) -> usize {
    match units {
        Units::Si => 0,
        Units::UsCustomary => 1,
    }
}

/// Millimetres or inches.
pub const LENGTH: Unit = Unit::Of(Quantity::Length);
/// A fraction shown in per cent ("80 %", "0.35 %").
pub const PERCENT: Unit = Unit::Scaled(100.0, "%", Digits::Places(0, 3));
/// A strain shown in µε.
pub const MICROSTRAIN: Unit = Unit::Scaled(1e6, "µε", Digits::Places(0, 1));
/// A coefficient of a thermal-output curve, µε per power of °C, to four significant digits:
/// the higher terms are small ("-32", "2.2", "-0.035", "0.00014").
pub const THERMAL_COEFFICIENT: Unit = Unit::Scaled(1e6, "µε", Digits::Significant(4));
/// A plain number (a multiple, a bridge factor).
pub const PLAIN: Unit = Unit::Scaled(1.0, "", Digits::Places(0, 3));
/// A bridge factor: one decimal, up to three where the value has them ("4.0", "2.6", "2.598").
pub const BRIDGE_FACTOR: Unit = Unit::Scaled(1.0, "", Digits::Places(1, 3));
/// A gauge factor: two decimals, a third where the value has one ("2.10", "2.125").
pub const GAUGE_FACTOR: Unit = Unit::Scaled(1.0, "", Digits::Places(2, 3));
/// An amplifier gain ("1000", "12.5").
pub const GAIN: Unit = Unit::Scaled(1.0, "", Digits::Places(0, 2));
/// Ohms.
pub const OHM: Unit = Unit::Scaled(1.0, "Ω", Digits::Places(0, 2));
/// Volts.
pub const VOLT: Unit = Unit::Scaled(1.0, "V", Digits::Places(0, 3));
/// A relative change per degree: ppm/°C or ppm/°F, to three significant digits and whole
/// ppm at least ("11.7 ppm/°C", "6.83 ppm/°F", "2167 ppm/°F" for copper leads).
pub const PPM_PER_DEGREE: Unit =
    Unit::OfDigits(Quantity::ExpansionCoefficient, Digits::Significant(3));
/// Radians shown in degrees, to a tenth of a degree ("0", "45", "12.5").
pub const DEGREES: Unit = Unit::Scaled(180.0 / std::f64::consts::PI, "°", Digits::Places(0, 1));
/// Metres in a foot, exact by definition (NIST SP 811, 2008, Appendix B): a resistance per
/// metre times this is the resistance per foot.
pub const METRES_PER_FOOT: f64 = 0.3048;
/// Resistance per length of a lead: Ω/m, or Ω/ft in US customary units (stored per metre).
pub const OHM_PER_CABLE_LENGTH: Unit = Unit::PerSystem(
    [(1.0, "Ω/m"), (METRES_PER_FOOT, "Ω/ft")],
    Digits::Significant(3),
);

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
    /// Like [`Editor::Info`], written in the display units when drawn.
    InfoInUnits(Box<dyn Fn(Units) -> String>),
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

/// A read-only line written in the display units when drawn.
pub fn info_in_units<T>(
    path: &'static str,
    label: &str,
    help: &'static str,
    value: impl Fn(Units) -> String + 'static,
) -> Field<T> {
    Field {
        path,
        label: label.to_owned(),
        help,
        editor: Editor::InfoInUnits(Box::new(value)),
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
    use super::{
        DEGREES, Digits, GAUGE_FACTOR, OHM_PER_CABLE_LENGTH, Unit, read_optional, show_optional,
    };
    use crate::units::Units;

    #[test]
    fn a_stored_value_shows_as_typed_without_conversion_noise() {
        let gigaohm = Unit::Scaled(1e-9, "GΩ", Digits::Places(0, 2));
        let microstrain = Unit::Scaled(1e6, "µε", Digits::Places(0, 1));
        for (typed, unit) in [("6.6", gigaohm), ("15.6", gigaohm), ("-127.9", microstrain)] {
            let stored = read_optional(typed, unit, Units::Si).unwrap();
            assert_eq!(show_optional(stored, unit, Units::Si), typed);
        }
        assert_eq!(show_optional(None, gigaohm, Units::Si), "");
    }

    #[test]
    fn fixed_units_show_the_digits_the_value_needs() {
        let shown = |unit: Unit, stored: f64| {
            let units = Units::Si;
            unit.number_text(units, unit.show(units, stored))
        };
        // π/4 rad is 45° (definition of the radian); a whole angle shows no decimals.
        assert_eq!(shown(DEGREES, std::f64::consts::FRAC_PI_4), "45");
        assert_eq!(shown(DEGREES, 0.0), "0");
        assert_eq!(shown(DEGREES, 12.5f64.to_radians()), "12.5");
        assert_eq!(shown(DEGREES, -1e-12), "0");
        assert_eq!(shown(GAUGE_FACTOR, 2.1), "2.10");
        assert_eq!(shown(GAUGE_FACTOR, 4.0), "4.00");
        assert_eq!(shown(GAUGE_FACTOR, 2.125), "2.125");
        assert_eq!(Digits::Places(0, 1).text(f64::NAN), "—");
        assert_eq!(Digits::Places(0, 1).text(1000.0), "1000");
        assert_eq!(Digits::Significant(3).text(0.1300), "0.13");
        assert_eq!(Digits::Significant(3).text(1234.6), "1235");
    }

    #[test]
    fn lead_resistance_per_foot_in_us_customary_units() {
        // 1 ft = 0.3048 m exactly (NIST SP 811, Appendix B): 0.13 Ω/m is 0.039 624 Ω/ft.
        let us = Units::UsCustomary;
        let per_ft = OHM_PER_CABLE_LENGTH.show(us, 0.13);
        assert!((per_ft - 0.039_624).abs() < 1e-12, "{per_ft}");
        assert_eq!(OHM_PER_CABLE_LENGTH.suffix(us), "Ω/ft");
        assert_eq!(OHM_PER_CABLE_LENGTH.number_text(us, per_ft), "0.0396");
        assert!((OHM_PER_CABLE_LENGTH.store(us, 0.039_624) - 0.13).abs() < 1e-12);
        assert_eq!(OHM_PER_CABLE_LENGTH.suffix(Units::Si), "Ω/m");
        assert_eq!(OHM_PER_CABLE_LENGTH.show(Units::Si, 0.13), 0.13);
    }
}
