//! Thickness readings as read from survey files.

use chrono::NaiveDate;

use crate::calc::units::{Length, Thickness};
use crate::model::scan::Scan;

/// Where a reading came from: an index into the list of files read, and the 1-based
/// line of the row.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub struct Origin {
    /// Index into [`ReadingSet::files`].
    pub file: u32,
    /// 1-based line number of the row.
    pub line: u64,
}

/// One ultrasonic thickness reading.
#[derive(Debug, Clone, PartialEq)]
pub struct Reading {
    /// Survey date.
    pub date: NaiveDate,
    /// Course number, 1 = bottom.
    pub course: u32,
    /// Measured wall thickness, in the tank's thickness unit.
    pub thickness: Thickness,
    /// Stable location id, re-measured at every survey.
    pub point: Option<Box<str>>,
    /// Height above the tank bottom, in the tank's length unit.
    pub elevation: Option<Length>,
    /// Degrees clockwise from the tank's 0 mark.
    pub azimuth: Option<f64>,
    /// Free text.
    pub note: Option<Box<str>>,
    /// File and line.
    pub origin: Origin,
}

/// Every reading of a tank, with the files they came from.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct ReadingSet {
    /// Files read, as displayed in messages (the path as the user gave it).
    pub files: Vec<String>,
    /// Readings in file order, then line order.
    pub readings: Vec<Reading>,
    /// Grid scans of local thin areas (`scans/*.csv`), in file-name order.
    pub scans: Vec<Scan>,
}

impl ReadingSet {
    /// Display name of the file a reading came from.
    pub fn file_of(&self, origin: Origin) -> &str {
        self.files
            .get(origin.file as usize)
            .map(String::as_str)
            .unwrap_or("?")
    }
    /// `file:line` of a reading.
    pub fn locate(&self, origin: Origin) -> String {
        format!("{}:{}", self.file_of(origin), origin.line)
    }
}
