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

/// Header of `points.csv` (the field names of [`crate::report::json::JsonPoint`]),
/// written alone when the tank has no monitoring points.
const POINT_FIELDS: [&str; 11] = [
    "point",
    "course",
    "elevation",
    "azimuth",
    "surveys",
    "first_date",
    "first_thickness",
    "last_date",
    "last_thickness",
    "rate",
    "remaining_life_years",
];

/// `points.csv`: every monitoring point (not only the hot spots), one row each, with
/// the fields of the JSON `hot_spots[]` records.
pub fn points_csv(a: &Assessment, v: &View) -> Result<String, csv::Error> {
    let mut w = csv::Writer::from_writer(Vec::new());
    if a.points.is_empty() {
        w.write_record(POINT_FIELDS)?;
    }
    for p in &a.points {
        w.serialize(crate::report::json::point(p, v))?;
    }
    let bytes = w
        .into_inner()
        .map_err(|e| csv::Error::from(e.into_error()))?;
    Ok(String::from_utf8_lossy(&bytes).into_owned())
}
