//! `--format csv` and `courses.csv`: one row per course with the fields of the JSON
//! `courses[]` records, written by the csv crate (serde).

use crate::model::result::Assessment;
use crate::report::json::course;
use crate::report::view::View;

/// The course table as CSV text.
pub fn courses_csv(a: &Assessment, v: &View) -> Result<String, csv::Error> {
    let mut w = csv::Writer::from_writer(Vec::new());
    for c in &a.courses {
        w.serialize(course(a, c, v))?;
    }
    let bytes = w
        .into_inner()
        .map_err(|e| csv::Error::from(e.into_error()))?;
    Ok(String::from_utf8_lossy(&bytes).into_owned())
}
