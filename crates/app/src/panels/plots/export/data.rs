//! A plot's numbers as a CSV file: one header row with units, then the rows, UTF-8.

use std::path::Path;

use gw_plan::safe_write::{Backup, write_file};

use super::PlotTable;

/// The table as CSV text. A row shorter than the header is filled with empty cells, so every
/// reader sees whole columns; a longer row is written as it is rather than cut.
pub fn table_csv(table: &PlotTable) -> Result<Vec<u8>, String> {
    let mut writer = csv::WriterBuilder::new()
        .flexible(true)
        .from_writer(Vec::new());
    let width = table.columns.len();
    writer
        .write_record(&table.columns)
        .map_err(|e| e.to_string())?;
    for row in &table.rows {
        let filler = width.saturating_sub(row.len());
        let cells = row
            .iter()
            .map(String::as_str)
            .chain(std::iter::repeat_n("", filler));
        writer.write_record(cells).map_err(|e| e.to_string())?;
    }
    writer.into_inner().map_err(|e| e.to_string())
}

/// Writes the table to `path` through the safe writer: a failed write leaves any file there as
/// it was.
pub fn write_table_csv(table: &PlotTable, path: &Path) -> Result<(), String> {
    let bytes = table_csv(table)?;
    write_file(path, &bytes, Backup::Replace).map_err(|e| e.to_string())
}

#[cfg(test)]
mod tests {
    use super::*;

    fn read_back(bytes: &[u8]) -> (Vec<String>, Vec<Vec<String>>) {
        let mut reader = csv::ReaderBuilder::new().flexible(true).from_reader(bytes);
        let headers = reader
            .headers()
            .unwrap()
            .iter()
            .map(str::to_owned)
            .collect();
        let rows = reader
            .records()
            .map(|r| r.unwrap().iter().map(str::to_owned).collect())
            .collect();
        (headers, rows)
    }

    #[test]
    fn quotes_commas_and_keeps_units() {
        let table = PlotTable {
            columns: vec!["Load (kN)".into(), "Strain, displayed (µε)".into()],
            rows: vec![
                vec!["0".into(), "0.0".into()],
                vec!["12.5".into(), "say \"high\"".into()],
            ],
        };
        let bytes = table_csv(&table).unwrap();
        let text = String::from_utf8(bytes.clone()).unwrap();
        assert!(
            text.starts_with("Load (kN),\"Strain, displayed (µε)\"\n"),
            "{text}"
        );
        let (headers, rows) = read_back(&bytes);
        assert_eq!(headers, table.columns);
        assert_eq!(rows, table.rows);
    }

    #[test]
    fn short_rows_are_filled_long_rows_kept() {
        let table = PlotTable {
            columns: vec!["a".into(), "b".into(), "c".into()],
            rows: vec![
                vec!["1".into()],
                vec!["1".into(), "2".into(), "3".into(), "4".into()],
            ],
        };
        let (_, rows) = read_back(&table_csv(&table).unwrap());
        assert_eq!(rows[0], vec!["1", "", ""]);
        assert_eq!(rows[1], vec!["1", "2", "3", "4"]);
    }

    #[test]
    fn an_empty_table_is_a_header_line() {
        let table = PlotTable {
            columns: vec!["x (mm)".into()],
            rows: vec![],
        };
        assert_eq!(table_csv(&table).unwrap(), b"x (mm)\n");
    }

    #[test]
    fn a_missing_folder_is_an_error_naming_the_path() {
        let path = std::env::temp_dir()
            .join(format!("gw-no-such-folder-{}", std::process::id()))
            .join("plot.csv");
        let table = PlotTable {
            columns: vec!["x (mm)".into()],
            rows: vec![vec!["1".into()]],
        };
        let e = write_table_csv(&table, &path).unwrap_err();
        assert!(e.contains("plot.csv"), "{e}");
        assert!(!path.exists());
    }
}
