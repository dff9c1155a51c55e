//! The bundled demo data: an invented point-count table (see `demo/README.md`), compiled in
//! so that the demo runs from any folder.

use crate::error::Result;
use crate::input::{CountReader, ReadOptions};
use crate::petrofacies::Table;
use crate::report::ReportOptions;

/// The demo table's name in messages and reports.
pub const DEMO_NAME: &str = "kessra-basin-counts.csv (invented demo data)";

/// The demo count table: 40 invented samples of the invented Kessra Basin.
pub const DEMO_COUNTS: &str = include_str!("../../demo/kessra-basin-counts.csv");

/// The demo table, read.
///
/// # Example
/// ```
/// let d = provenance_core::demo::dataset().unwrap();
/// assert_eq!(d.samples.len(), 40);
/// assert!(d.metadata.contains(&"formation".to_string()));
/// ```
pub fn dataset() -> Result<Table> {
    let reader =
        CountReader::from_reader(DEMO_NAME, DEMO_COUNTS.as_bytes(), ReadOptions::default())?;
    Table::read(reader)
}

/// The report options the demo uses: grouped by formation, with the stratigraphic height.
///
/// # Example
/// ```
/// assert_eq!(provenance_core::demo::report_options().by.as_deref(), Some("formation"));
/// ```
pub fn report_options() -> ReportOptions {
    ReportOptions {
        by: Some("formation".into()),
        height: Some("height_m".into()),
        fields: Vec::new(),
        model: None,
    }
}
