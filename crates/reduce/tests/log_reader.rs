//! Reading and writing test logs: the format, unit conversions, round trips and the errors a
//! user sees for a damaged file.

use approx::assert_relative_eq;
use gw_reduce::log::{
    ColumnUnit, LogError, RowProblem, TestLog, read_log, read_log_file, write_log,
};

fn read(text: &str) -> Result<TestLog, LogError> {
    read_log(text.as_bytes())
}

/// The message of the error a text must give.
fn error_message(text: &str) -> String {
    match read(text) {
        Ok(log) => panic!("expected an error, read {} rows", log.len()),
        Err(error) => error.to_string(),
    }
}

fn assert_mentions(message: &str, parts: &[&str]) {
    for part in parts {
        assert!(
            message.contains(part),
            "{message:?} should mention {part:?}"
        );
    }
}

const EVERY_UNIT: &str = "\
# load test, left-hand lug
# excitation 5 V
time [ms],bridge [mV/V],output [V],output small [mV],strain a [µε],strain b [ue],strain c [microstrain],force [N],force k [kN],moment [N·m],moment star [N*m],moment k [kN·m],moment k dot [kN.m],pressure [Pa],pressure k [kPa],pressure m [MPa],pressure bar [bar],line load [N/m]
0,0.5,0.0025,2.5,100,200,300,10,1.5,20,30,2,3,100,1.5,2,1.5,40
250,-0.25, 0.001 ,-1.25,-50,-100,-150,-5,-0.75,-10,-15,-1,-1.5,-50,-0.75,-1,-0.75,-20
";

#[test]
fn every_unit_kind_is_read_and_loads_are_converted_to_si() {
    let log = read(EVERY_UNIT).expect("a valid log");
    assert_eq!(log.len(), 2);
    assert!(!log.is_empty());
    assert_eq!(log.columns.len(), 17);
    // 1 ms = 1e-3 s: SI Brochure, 9th ed. (BIPM 2019), Table 7 (SI prefixes).
    assert_relative_eq!(log.time_s[0], 0.0);
    assert_relative_eq!(log.time_s[1], 0.25, max_relative = 1e-15);

    let column = |name: &str| log.column(name).expect(name);
    // Readings are kept as written.
    assert_eq!(column("bridge").unit, ColumnUnit::MvPerV);
    assert_eq!(column("bridge").values, [0.5, -0.25]);
    assert_eq!(column("output").unit, ColumnUnit::Volt);
    assert_eq!(column("output").values, [0.0025, 0.001]);
    // A bridge output in mV is stored in volts: 1 mV = 1e-3 V, SI Brochure, 9th ed., Table 7.
    assert_eq!(column("output small").unit, ColumnUnit::Volt);
    assert_eq!(column("output small").unit_text, "mV");
    assert_relative_eq!(
        column("output small").values[0],
        2.5e-3,
        max_relative = 1e-15
    );
    assert_relative_eq!(
        column("output small").values[1],
        -1.25e-3,
        max_relative = 1e-15
    );
    for (name, unit_text, values) in [
        ("strain a", "µε", [100.0, -50.0]),
        ("strain b", "ue", [200.0, -100.0]),
        ("strain c", "microstrain", [300.0, -150.0]),
    ] {
        assert_eq!(column(name).unit, ColumnUnit::Microstrain, "{name}");
        assert_eq!(column(name).unit_text, unit_text);
        assert_eq!(column(name).values, values, "{name}");
    }

    // Loads in their SI unit. Prefixes k = 1e3 and M = 1e6: SI Brochure, 9th ed., Table 7.
    // 1 bar = 1e5 Pa: SI Brochure, 8th ed. (BIPM 2006), Table 8; NIST SP 811 (2008), B.8.
    let expected_loads: [(&str, f64, &str, [f64; 2]); 11] = [
        ("force", 1.0, "N", [10.0, -5.0]),
        ("force k", 1e3, "N", [1500.0, -750.0]),
        ("moment", 1.0, "N·m", [20.0, -10.0]),
        ("moment star", 1.0, "N·m", [30.0, -15.0]),
        ("moment k", 1e3, "N·m", [2000.0, -1000.0]),
        ("moment k dot", 1e3, "N·m", [3000.0, -1500.0]),
        ("pressure", 1.0, "Pa", [100.0, -50.0]),
        ("pressure k", 1e3, "Pa", [1500.0, -750.0]),
        ("pressure m", 1e6, "Pa", [2.0e6, -1.0e6]),
        ("pressure bar", 1e5, "Pa", [1.5e5, -0.75e5]),
        ("line load", 1.0, "N/m", [40.0, -20.0]),
    ];
    for (name, factor, si_unit, values) in expected_loads {
        let column = column(name);
        let ColumnUnit::Load {
            to_si,
            si_unit: unit,
        } = column.unit
        else {
            panic!("{name} should be a load, is {:?}", column.unit);
        };
        assert_relative_eq!(to_si, factor);
        assert_eq!(unit, si_unit, "{name}");
        for (read, expected) in column.values.iter().zip(values) {
            assert_relative_eq!(*read, expected, max_relative = 1e-15);
        }
    }
}

#[test]
fn moment_unit_spellings_are_all_accepted() {
    for unit in ["N·m", "N*m", "Nm", "N.m", "kN·m", "kN*m", "kNm", "kN.m"] {
        let log = read(&format!("time [s],torque [{unit}]\n0,1\n"))
            .unwrap_or_else(|error| panic!("{unit}: {error}"));
        let ColumnUnit::Load { si_unit, .. } = log.columns[0].unit else {
            panic!("{unit} should be a load");
        };
        assert_eq!(si_unit, "N·m", "{unit}");
    }
}

#[test]
fn column_lookup_ignores_case_and_surrounding_spaces() {
    let log = read("time [s] ,  Bridge One   [ mV/V ]\n0,1\n").expect("a valid log");
    assert_eq!(log.columns[0].name, "Bridge One");
    assert_eq!(log.columns[0].unit_text, "mV/V");
    assert!(log.column("  bridge one ").is_some());
    assert!(log.column("BRIDGE ONE").is_some());
    assert!(log.column("bridge two").is_none());
}

#[test]
fn a_valid_file_gives_exactly_the_rows_written() {
    let rows = 1000;
    let mut text = String::from("# generated\r\ntime [s],bridge [mV/V],load [kN]\r\n");
    for row in 0..rows {
        text.push_str(&format!(
            "{},{},{}\r\n",
            row as f64 * 0.01,
            row as f64 * 1e-4,
            row
        ));
    }
    text.push_str("\r\n   \r\n\r\n");
    let log = read(&text).expect("a valid log");
    assert_eq!(log.len(), rows);
    assert_eq!(log.columns[0].values.len(), rows);
    assert_eq!(log.columns[1].values.len(), rows);
    // Order kept: the last row is the last one written.
    assert_relative_eq!(log.time_s[rows - 1], 9.99, max_relative = 1e-12);
    assert_relative_eq!(log.columns[1].values[rows - 1], 999e3, max_relative = 1e-15);
}

#[test]
fn a_byte_order_mark_and_quoted_headers_are_accepted() {
    let log = read("\u{feff}time [s],\"left, upper [mV/V]\"\n0,1\n").expect("a valid log");
    assert_eq!(log.columns[0].name, "left, upper");
}

#[test]
fn write_then_read_gives_the_same_log() {
    let original = read(EVERY_UNIT).expect("a valid log");
    let text = write_log(&original);
    assert!(text.starts_with("time [s],bridge [mV/V],"), "{text}");
    assert!(text.contains(",force k [kN],"), "{text}");
    let again = read(&text).unwrap_or_else(|error| panic!("{error}\n{text}"));
    assert_eq!(again.len(), original.len());
    assert_eq!(again.columns.len(), original.columns.len());
    for (a, b) in original.time_s.iter().zip(&again.time_s) {
        assert_relative_eq!(*a, *b, max_relative = 1e-15);
    }
    for (a, b) in original.columns.iter().zip(&again.columns) {
        assert_eq!(a.name, b.name);
        assert_eq!(a.unit, b.unit);
        assert_eq!(a.unit_text, b.unit_text);
        for (x, y) in a.values.iter().zip(&b.values) {
            assert_relative_eq!(*x, *y, max_relative = 1e-15);
        }
    }
}

#[test]
fn loads_are_written_in_their_written_unit() {
    let log = read("time [s],load [kN],pressure [bar]\n0,2.5,1.5\n").expect("a valid log");
    let text = write_log(&log);
    assert_eq!(text, "time [s],load [kN],pressure [bar]\n0,2.5,1.5\n");
}

#[test]
fn an_empty_file_has_no_header() {
    assert_mentions(&error_message(""), &["no header row", "time [s]"]);
    let message = error_message("# only a comment\n\n");
    assert_mentions(&message, &["no header row"]);
}

#[test]
fn a_header_without_unit_is_named() {
    let message = error_message("# c\ntime [s],bridge 1\n0,1\n");
    assert_mentions(&message, &["line 2", "column 2", "'bridge 1'", "[unit]"]);
    let message = error_message("time [s],bridge 1 [mV/V],\n0,1,\n");
    assert_mentions(&message, &["line 1", "column 3", "comma at the end"]);
}

#[test]
fn an_unknown_unit_lists_the_accepted_ones() {
    let message = error_message("time [s],bridge [mv/v]\n0,1\n");
    assert_mentions(
        &message,
        &[
            "line 1",
            "'bridge [mv/v]'",
            "'mv/v'",
            "did you mean 'mV/V'",
            "kN·m",
            "bar",
            "microstrain",
        ],
    );
    let message = error_message("time [s],temperature [°C]\n0,1\n");
    assert_mentions(&message, &["'°C'", "accepted units are"]);
    let message = error_message("time [s],again [ms]\n0,1\n");
    assert_mentions(&message, &["'again [ms]'", "first column only"]);
}

#[test]
fn duplicate_column_names_are_refused() {
    let message = error_message("time [s],Bridge [mV/V],load [kN],bridge [V]\n0,1,2,3\n");
    assert_mentions(
        &message,
        &["line 1", "columns 2 and 4", "'bridge'", "rename"],
    );
}

#[test]
fn the_first_column_must_be_the_time() {
    let message = error_message("# c\n# d\nbridge [mV/V],time [s]\n1,0\n");
    assert_mentions(&message, &["line 3", "'bridge [mV/V]'", "must be the time"]);
}

#[test]
fn a_header_alone_has_no_data_rows() {
    let message = error_message("# c\ntime [s],bridge [mV/V]\n\n");
    assert_mentions(&message, &["line 2", "no data rows"]);
}

const GOOD_HEAD: &str = "# rig 3\ntime [s],bridge [mV/V],load [kN]\n0.0,0.1,1\n";

#[test]
fn a_missing_value_names_line_and_column() {
    // Lines: 1 comment, 2 header, 3 and 4 good, 5 missing the load.
    let text = format!("{GOOD_HEAD}0.1,0.2,2\n0.2,0.3,\n");
    let message = error_message(&text);
    assert_mentions(&message, &["line 5", "no value", "'load [kN]'"]);
    let Err(LogError::Rows { first, more_rows }) = read(&text) else {
        panic!("a row error");
    };
    assert_eq!(
        first,
        RowProblem::MissingValue {
            line: 5,
            column: "load [kN]".to_owned()
        }
    );
    assert_eq!(more_rows, 0);
}

#[test]
fn text_in_a_field_is_quoted() {
    let message = error_message(&format!("{GOOD_HEAD}0.1,abc,2\n"));
    assert_mentions(
        &message,
        &["line 4", "'abc'", "'bridge [mV/V]'", "not a number"],
    );
    let message = error_message(&format!("{GOOD_HEAD}0.1,\"0,5\",2\n"));
    assert_mentions(&message, &["line 4", "'0,5'", "decimal comma"]);
}

#[test]
fn nan_and_infinity_are_refused() {
    let message = error_message(&format!("{GOOD_HEAD}0.1,0.2,2\n0.2,0.3,3\n0.3,NaN,4\n"));
    assert_mentions(
        &message,
        &["line 6", "'NaN'", "'bridge [mV/V]'", "not a finite number"],
    );
    for text in ["inf", "-infinity", "nan"] {
        let message = error_message(&format!("{GOOD_HEAD}0.1,0.2,{text}\n"));
        assert_mentions(
            &message,
            &["line 4", &format!("'{text}'"), "'load [kN]'", "finite"],
        );
    }
}

#[test]
fn time_going_back_names_both_times() {
    // Lines 3..6 good, line 7 goes back to 0.25 s after 0.4 s.
    let text = format!("{GOOD_HEAD}0.1,0,0\n0.3,0,0\n0.4,0,0\n0.25,0,0\n0.5,0,0\n");
    let message = error_message(&text);
    assert_mentions(
        &message,
        &["line 7", "time 0.25 s", "0.4 s on line 6", "'time [s]'"],
    );
    // A repeated time is not an increase either.
    let message = error_message(&format!("{GOOD_HEAD}0.0,0,0\n"));
    assert_mentions(&message, &["line 4", "time 0 s", "line 3"]);
    // One row out of order is one problem, not one for every row after it.
    let Err(LogError::Rows { more_rows, .. }) = read(&text) else {
        panic!("a row error");
    };
    assert_eq!(more_rows, 0);
}

#[test]
fn a_wrong_number_of_fields_is_named() {
    let message = error_message(&format!("{GOOD_HEAD}0.1,0.2\n"));
    assert_mentions(
        &message,
        &[
            "line 4",
            "2 values",
            "3 columns",
            "line 2",
            "nothing under 'load [kN]'",
        ],
    );
    let message = error_message(&format!("{GOOD_HEAD}0.1,0,2,2\n"));
    assert_mentions(
        &message,
        &[
            "line 4",
            "4 values",
            "more after 'load [kN]'",
            "decimal comma",
        ],
    );
}

#[test]
fn several_bad_rows_report_the_first_and_count_the_others() {
    let text = format!(
        "{GOOD_HEAD}0.1,x,2\n0.2,0.2,\n0.3,0.3,3\n0.35,nan,y\n0.4,1\n0.5,0.5,5\n0.45,0.6,6\n"
    );
    let message = error_message(&text);
    assert_mentions(
        &message,
        &["line 4", "'x'", "and 4 more rows with problems"],
    );
    let Err(LogError::Rows { first, more_rows }) = read(&text) else {
        panic!("a row error");
    };
    assert_eq!(first.line(), 4);
    assert_eq!(more_rows, 4);

    let message = error_message(&format!("{GOOD_HEAD}0.1,x,2\n0.2,y,2\n"));
    assert_mentions(&message, &["line 4", "and 1 more row with problems"]);
}

#[test]
fn line_numbers_count_comments_and_blank_lines_with_crlf_endings() {
    let text = "# a\r\n# b\r\ntime [s],bridge [mV/V]\r\n0,1\r\n\r\n# paused\r\n1,x\r\n";
    let message = error_message(text);
    assert_mentions(&message, &["line 7", "'x'"]);
}

#[test]
fn a_quoted_line_break_is_counted() {
    let text = "time [s],\"bridge\nleft [mV/V]\"\n0,1\n1,x\n";
    let message = error_message(text);
    assert_mentions(&message, &["line 4", "'x'"]);
}

#[test]
fn a_file_that_cannot_be_opened_names_its_path() {
    let path = std::env::temp_dir()
        .join("gw-reduce-no-such-dir")
        .join("run 12.csv");
    let Err(error) = read_log_file(&path) else {
        panic!("the file does not exist");
    };
    assert!(matches!(error, LogError::Io { .. }));
    assert_mentions(&error.to_string(), &["run 12.csv"]);
}

#[test]
fn a_file_is_read_like_a_stream() {
    let path = std::env::temp_dir().join(format!("gw-reduce-log-{}.csv", std::process::id()));
    std::fs::write(&path, EVERY_UNIT).expect("temporary file");
    let from_file = read_log_file(&path);
    let _ = std::fs::remove_file(&path);
    assert_eq!(
        from_file.expect("a valid log"),
        read(EVERY_UNIT).expect("a valid log")
    );
}
