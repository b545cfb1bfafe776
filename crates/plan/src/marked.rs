//! Messages whose quantities read in the reader's unit system.
//!
//! A finding is written once, when the plan is evaluated, but read in SI in one window and in
//! US customary units in another. Its quantities are therefore written as marks — the SI value
//! at full precision with its kind and how to round it — and [`render`] turns the marks into
//! numbers with units for the unit system at hand. Text without marks renders as itself.
//!
//! A message figure is coarser than a field's: whole millimetres from 10 mm up and tenths
//! below (hundredths of an inch from 1 in up, thousandths below); temperatures in whole
//! degrees; loads at the quantity's resolution ([`Units::format`]).

use crate::units::{Quantity, Units, number_text};

/// Opens a mark (a private-use character: never typed in a name).
const OPEN: char = '\u{E000}';
/// Closes a mark.
const CLOSE: char = '\u{E001}';

/// How a marked figure is rounded to the digit shown.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Rounding {
    /// To the nearest shown digit.
    Nearest,
    /// Up (away from zero): a clearance that must still be kept after rounding.
    Up,
    /// Down (towards zero).
    Down,
    /// A difference (a span, an error): scaled without the temperature offset.
    Difference,
}

impl Rounding {
    fn code(self) -> char {
        match self {
            Rounding::Nearest => 'n',
            Rounding::Up => 'u',
            Rounding::Down => 'w',
            Rounding::Difference => 'd',
        }
    }

    fn from_code(c: char) -> Option<Rounding> {
        [
            Rounding::Nearest,
            Rounding::Up,
            Rounding::Down,
            Rounding::Difference,
        ]
        .into_iter()
        .find(|r| r.code() == c)
    }
}

/// A quantity in a message, rounded to the nearest shown digit.
pub fn mark(q: Quantity, si: f64) -> String {
    mark_rounded(q, si, Rounding::Nearest)
}

/// A quantity in a message with its rounding.
pub fn mark_rounded(q: Quantity, si: f64, rounding: Rounding) -> String {
    let index = Quantity::ALL.iter().position(|&k| k == q).unwrap_or(0);
    // `{:?}` of an f64 is the shortest text that reads back as the same value.
    format!("{OPEN}{index}{}{si:?}{CLOSE}", rounding.code())
}

/// The message with every mark shown in `units`. A damaged mark is shown as "—".
pub fn render(text: &str, units: Units) -> String {
    let mut out = String::with_capacity(text.len());
    let mut rest = text;
    while let Some(start) = rest.find(OPEN) {
        out.push_str(&rest[..start]);
        let after = &rest[start + OPEN.len_utf8()..];
        let Some(end) = after.find(CLOSE) else {
            out.push('—');
            return out;
        };
        out.push_str(&figure(&after[..end], units).unwrap_or_else(|| "—".to_owned()));
        rest = &after[end + CLOSE.len_utf8()..];
    }
    out.push_str(rest);
    out
}

/// Whether a text holds marks.
pub fn has_marks(text: &str) -> bool {
    text.contains(OPEN)
}

/// One mark's body ("0n0.0125") as a figure with its unit.
fn figure(body: &str, units: Units) -> Option<String> {
    let code_at = body.find(|c: char| !c.is_ascii_digit())?;
    let q = *Quantity::ALL.get(body[..code_at].parse::<usize>().ok()?)?;
    let code = body[code_at..].chars().next()?;
    let rounding = Rounding::from_code(code)?;
    let si: f64 = body[code_at + code.len_utf8()..].parse().ok()?;
    Some(shown(q, si, rounding, units))
}

fn shown(q: Quantity, si: f64, rounding: Rounding, units: Units) -> String {
    let value = if rounding == Rounding::Difference {
        units.scale_to_display(q, si)
    } else {
        units.to_display(q, si)
    };
    let unit = units.label(q);
    let step = match message_step(q, units, value) {
        Some(step) => step,
        None if rounding == Rounding::Difference => return units.format_difference(q, si),
        None => return units.format(q, si),
    };
    let steps = value / step;
    // Float noise must not push an exact figure to the next step.
    let rounded = match rounding {
        Rounding::Up => (steps.abs() - 1e-9).ceil().copysign(steps),
        Rounding::Down => (steps.abs() + 1e-9).floor().copysign(steps),
        Rounding::Nearest | Rounding::Difference => steps.round(),
    } * step;
    let decimals = if step >= 1.0 {
        0
    } else {
        (-step.log10()).round() as usize
    };
    format!("{} {unit}", number_text(rounded + 0.0, decimals))
}

/// The step a message shows a quantity to, where it is coarser than a field's resolution.
fn message_step(q: Quantity, units: Units, shown: f64) -> Option<f64> {
    let big = |limit: f64, coarse: f64, fine: f64| {
        if shown.abs() >= limit || shown == 0.0 {
            coarse
        } else {
            fine
        }
    };
    match (q, units) {
        (Quantity::Length, Units::Si) => Some(big(10.0, 1.0, 0.1)),
        (Quantity::Length, Units::UsCustomary) => Some(big(1.0, 0.01, 0.001)),
        (Quantity::Temperature | Quantity::TemperatureChange, _) => Some(1.0),
        _ => None,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_message_reads_in_either_system() {
        let text = format!(
            "move it at least {} away; the case runs to {}",
            mark_rounded(Quantity::Length, 0.04267, Rounding::Up),
            mark(Quantity::Temperature, 60.0)
        );
        assert_eq!(
            render(&text, Units::Si),
            "move it at least 43 mm away; the case runs to 60 °C"
        );
        // 42.67 mm / 25.4 mm per in = 1.6799 in, up to 1.68 in; 60 °C = 140 °F
        // (NIST SP 811, Appendix B: 1 in = 25.4 mm exactly; °F = 1.8 °C + 32).
        assert_eq!(
            render(&text, Units::UsCustomary),
            "move it at least 1.68 in away; the case runs to 140 °F"
        );
    }

    #[test]
    fn rounding_keeps_a_clearance_and_small_lengths_keep_a_tenth() {
        let up = |m| render(&mark_rounded(Quantity::Length, m, Rounding::Up), Units::Si);
        let down = |m| {
            render(
                &mark_rounded(Quantity::Length, m, Rounding::Down),
                Units::Si,
            )
        };
        assert_eq!(up(0.04267), "43 mm");
        assert_eq!(down(0.04267), "42 mm");
        assert_eq!(up(0.06), "60 mm");
        assert_eq!(up(0.00512), "5.2 mm");
        assert_eq!(render(&mark(Quantity::Length, 0.0), Units::Si), "0 mm");
        assert_eq!(render(&mark(Quantity::Length, -0.0), Units::Si), "0 mm");
        // 5.12 mm = 0.20157 in, shown to the thousandth and rounded up: 0.202 in.
        assert_eq!(
            render(
                &mark_rounded(Quantity::Length, 0.00512, Rounding::Up),
                Units::UsCustomary
            ),
            "0.202 in"
        );
    }

    #[test]
    fn loads_use_the_quantitys_resolution_and_differences_drop_the_offset() {
        // 10 kN = 2248 lbf (1 lbf = 4.448 221 615 260 5 N, NIST SP 811 Appendix B).
        assert_eq!(
            render(&mark(Quantity::Force, 10_000.0), Units::UsCustomary),
            "2248 lbf"
        );
        // A span of 50 °C is 90 °F, not 122 °F.
        assert_eq!(
            render(
                &mark_rounded(Quantity::TemperatureChange, 50.0, Rounding::Difference),
                Units::UsCustomary
            ),
            "90 °F"
        );
    }

    #[test]
    fn plain_and_damaged_text() {
        assert_eq!(
            render("no figures here", Units::UsCustomary),
            "no figures here"
        );
        assert!(!has_marks("no figures here"));
        assert_eq!(render("cut \u{E000}0n1.0", Units::Si), "cut —");
        assert_eq!(render("odd \u{E000}99n1.0\u{E001}.", Units::Si), "odd —.");
        assert_eq!(render("odd \u{E000}0zx\u{E001}.", Units::Si), "odd —.");
    }
}
