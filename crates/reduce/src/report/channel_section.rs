//! Measured against predicted, channel by channel: a table at each channel's peak and a plot of
//! the measured and predicted readings against the applied load (or against time).

use gw_plan::sheet::report_page::{BODY_SIZE, PageBox, ReportWriter};

use super::numbers::{ABSENT, difference_percent, fixed, peak, quantity, scale_for};
use super::plot::{self, Plot, Series, Style};
use crate::reduction::{AppliedLoad, ChannelSeries, Reduction};

/// Height of one channel plot, points.
const PLOT_HEIGHT: f32 = 165.0;
/// Most markers drawn for a measured series.
const MARKERS: usize = 70;

/// One table row: the channel at its peak.
fn row(r: &Reduction, c: &ChannelSeries) -> Vec<String> {
    let at_peak = peak(&c.mv_per_v);
    let (peak_text, time_text) = match at_peak {
        Some((i, v)) => (
            fixed(v, 4),
            format!(
                "{} s",
                fixed(r.time_s.get(i).copied().unwrap_or(f64::NAN), 1)
            ),
        ),
        None => (ABSENT.to_owned(), ABSENT.to_owned()),
    };
    let load = match (at_peak, &c.load) {
        (Some((i, _)), Some(l)) => quantity(l.get(i).copied().unwrap_or(f64::NAN), c.wanted.unit()),
        _ => ABSENT.to_owned(),
    };
    let predicted = at_peak.and_then(|(i, _)| {
        let p = c.predicted_mv_per_v.as_ref()?.get(i).copied()?;
        Some((p, at_peak.map_or(f64::NAN, |(_, v)| v)))
    });
    vec![
        c.channel.to_string(),
        format!("{} ({})", c.bridge, c.part),
        fixed(c.zero_mv_per_v, 4),
        format!("× {} — {}", fixed(c.span_factor, 4), c.span_source),
        format!("{peak_text} at {time_text}"),
        format!("{}: {load}", c.wanted.name()),
        predicted.map_or(ABSENT.to_owned(), |(p, _)| fixed(p, 4)),
        predicted.map_or(ABSENT.to_owned(), |(p, m)| difference_percent(m, p)),
    ]
}

/// The table of every channel.
fn table(w: &mut ReportWriter, r: &Reduction) {
    let mut rows = vec![
        [
            "Ch.",
            "Bridge (part)",
            "Zero taken off (mV/V)",
            "Span factor and its source",
            "Peak reading (mV/V)",
            "Wanted load at the peak",
            "Predicted there (mV/V)",
            "Difference",
        ]
        .map(String::from)
        .to_vec(),
    ];
    rows.extend(r.channels.iter().map(|c| row(r, c)));
    w.table(&[0.35, 1.3, 0.75, 1.95, 1.0, 1.3, 0.85, 1.0], &rows, 7.5);
}

/// The applied load a channel is plotted against: the one it measures on its part, else
/// another on the same part.
fn applied_for<'a>(r: &'a Reduction, c: &ChannelSeries) -> Option<&'a AppliedLoad> {
    r.applied_load(&c.part, c.wanted)
        .or_else(|| r.applied.iter().find(|a| a.part == c.part))
}

/// The plot of one channel.
fn channel_plot(r: &Reduction, c: &ChannelSeries) -> Plot {
    let (x_title, x): (String, Vec<f64>) = match applied_for(r, c) {
        Some(a) => {
            let largest = a.values.iter().fold(0.0f64, |m, v| m.max(v.abs()));
            let (k, unit) = scale_for(largest, a.component.unit());
            (
                format!(
                    "applied {} ({unit}), column \"{}\"",
                    a.component.name(),
                    a.column
                ),
                a.values.iter().map(|v| v * k).collect(),
            )
        }
        None => ("time (s)".to_owned(), r.time_s.clone()),
    };
    let mut series = vec![Series {
        name: "measured".to_owned(),
        x: plot::thin(&x, MARKERS),
        y: plot::thin(&c.mv_per_v, MARKERS),
        style: Style::Circles,
    }];
    if let Some(p) = &c.predicted_mv_per_v {
        series.push(Series {
            name: "predicted by the plan".to_owned(),
            x: x.clone(),
            y: p.clone(),
            style: Style::Line,
        });
    }
    Plot {
        title: format!("Ch. {} {} ({})", c.channel, c.bridge, c.part),
        x_title,
        y_title: "reading, zeroed and span-corrected (mV/V)".to_owned(),
        series,
    }
}

/// The section: table, then the plots two abreast.
pub(super) fn draw(w: &mut ReportWriter, r: &Reduction) {
    w.heading("Measured against predicted");
    w.para(
        BODY_SIZE,
        false,
        "Each channel at the sample of its largest reading. The zero is taken off and the span \
         corrected as stated; the wanted load uses the in-place calibration where the plan \
         holds one, else the predicted load per mV/V. Difference = (measured − predicted) / \
         |predicted|.",
    );
    if r.channels.is_empty() {
        w.para(
            BODY_SIZE,
            false,
            "No column of the log names a bridge of the plan.",
        );
        return;
    }
    table(w, r);
    let gap = 14.0;
    let width = 0.5 * (w.column() - gap);
    for pair in r.channels.chunks(2) {
        w.room(PLOT_HEIGHT + 6.0);
        let top = w.y() + 4.0;
        for (k, c) in pair.iter().enumerate() {
            let x0 = w.left() + k as f32 * (width + gap);
            let bounds = PageBox::new(x0, top, x0 + width, top + PLOT_HEIGHT);
            plot::draw(w, &channel_plot(r, c), bounds);
        }
        w.set_y(top + PLOT_HEIGHT + 6.0);
    }
}
