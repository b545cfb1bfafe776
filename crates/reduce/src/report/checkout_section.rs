//! The check-out: each channel's verdict, the items that are not a pass with their measured and
//! expected values and the likely cause, and a count of what was not recorded.

use gw_plan::sheet::report_page::{BODY_SIZE, ReportWriter};

use crate::checkout::{ChannelCheck, Checkout, Verdict};

fn count(c: &ChannelCheck, v: Verdict) -> usize {
    c.items.iter().filter(|i| i.verdict == v).count()
}

/// One row per channel.
fn verdict_rows(checkout: &Checkout) -> Vec<Vec<String>> {
    let mut rows = vec![
        [
            "Ch.",
            "Part / bridge",
            "Verdict",
            "Items: pass / check / fail / not recorded",
        ]
        .map(String::from)
        .to_vec(),
    ];
    for c in &checkout.channels {
        rows.push(vec![
            c.channel.to_string(),
            format!("{} / {}", c.part, c.bridge),
            c.verdict().word().to_owned(),
            format!(
                "{} / {} / {} / {}",
                count(c, Verdict::Pass),
                count(c, Verdict::Check),
                count(c, Verdict::Fail),
                count(c, Verdict::NotRecorded)
            ),
        ]);
    }
    rows
}

/// One row per item that is a check or a fail.
fn finding_rows(checkout: &Checkout) -> Vec<Vec<String>> {
    let mut rows = vec![
        [
            "Ch.",
            "Item",
            "Verdict",
            "Measured",
            "Expected",
            "Likely cause and what to do",
        ]
        .map(String::from)
        .to_vec(),
    ];
    for c in &checkout.channels {
        for i in c
            .items
            .iter()
            .filter(|i| matches!(i.verdict, Verdict::Check | Verdict::Fail))
        {
            rows.push(vec![
                c.channel.to_string(),
                i.quantity.clone(),
                i.verdict.word().to_owned(),
                i.measured.clone(),
                i.expected.clone(),
                i.cause.clone(),
            ]);
        }
    }
    rows
}

/// The sentence that sums up what was not recorded, or `None` when everything was.
fn unrecorded_summary(checkout: &Checkout) -> Option<String> {
    let per_channel: Vec<String> = checkout
        .channels
        .iter()
        .filter_map(|c| {
            let n = count(c, Verdict::NotRecorded);
            (n > 0).then(|| format!("ch. {} {} ({n})", c.channel, c.bridge))
        })
        .collect();
    let total: usize = checkout
        .channels
        .iter()
        .map(|c| count(c, Verdict::NotRecorded))
        .sum();
    (total > 0).then(|| {
        format!(
            "{total} item{} not recorded: {}. Record them (the check-out template lists them) \
             before relying on these channels.",
            if total == 1 { " was" } else { "s were" },
            per_channel.join(", ")
        )
    })
}

/// The section.
pub(super) fn draw(w: &mut ReportWriter, checkout: &Checkout) {
    w.heading("Check-out");
    if checkout.channels.is_empty() {
        w.para(
            BODY_SIZE,
            false,
            "The plan has no bridges: there is nothing to check out.",
        );
        return;
    }
    if checkout.is_unrecorded() {
        w.para(
            BODY_SIZE,
            true,
            "Nothing was recorded at check-out: no channel has a verdict yet.",
        );
    }
    w.table(&[0.4, 2.6, 0.9, 2.2], &verdict_rows(checkout), BODY_SIZE);
    let findings = finding_rows(checkout);
    if findings.len() > 1 {
        w.subheading("Items that are not a pass");
        w.table(&[0.35, 1.4, 0.65, 0.9, 1.6, 3.2], &findings, 7.5);
    } else if !checkout.is_unrecorded() {
        w.para(BODY_SIZE, false, "Every recorded item passes.");
    }
    if let Some(s) = unrecorded_summary(checkout) {
        w.para(BODY_SIZE, false, &s);
    }
}
