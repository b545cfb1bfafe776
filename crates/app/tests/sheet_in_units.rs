//! The build sheet and channel list written from the app follow the app's unit switch: with US
//! customary units chosen, the channel list gives each bridge's load per mV/V in lbf (and the
//! sheet is written without error); in SI the same column is in N and the two agree by the
//! pound-force's definition.

mod support;

use support::{app_on, menu, temp_dir};

/// The channel list's wanted unit and load per mV/V of the first row.
fn first_channel(csv: &std::path::Path) -> (String, f64) {
    let mut reader = csv::Reader::from_path(csv).expect("the channel list was written");
    let headers = reader.headers().unwrap().clone();
    let row = reader.records().next().unwrap().unwrap();
    let at = |name: &str| {
        let i = headers.iter().position(|h| h == name).unwrap();
        row[i].to_owned()
    };
    (
        at("wanted_unit"),
        at("wanted_per_mv_per_v").parse().unwrap(),
    )
}

#[test]
fn the_sheet_written_from_the_app_is_in_the_chosen_units() {
    let dir = temp_dir("sheet_in_units");
    let mut h = app_on(gw_plan::demo::demo_project());
    let si_pdf = dir.join("si.pdf");
    h.state_mut().export_sheet(&si_pdf);
    let (si_unit, si_value) = first_channel(&si_pdf.with_extension("csv"));
    assert_eq!(si_unit, "N");

    menu(&mut h, "Units", "US customary (in, lbf, psi, °F)");
    let us_pdf = dir.join("us.pdf");
    h.state_mut().export_sheet(&us_pdf);
    let notice = h.state().doc.notice.clone().expect("a notice");
    assert!(!notice.is_error, "{}", notice.text);
    assert!(std::fs::metadata(&us_pdf).unwrap().len() > 10_000);
    let (us_unit, us_value) = first_channel(&us_pdf.with_extension("csv"));
    assert_eq!(us_unit, "lbf");
    // 1 lbf = 4.448 221 615 260 5 N exactly (NIST SP 811, Appendix B); both columns are
    // rounded to six significant figures or so, hence the tolerance.
    let expected = si_value / 4.448_221_615_260_5;
    assert!(
        (us_value - expected).abs() < 1e-4 * expected,
        "{us_value} lbf against {expected} lbf"
    );
}
