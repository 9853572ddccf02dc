//! Screening of readings before assessment (`strake check`): counts per course and
//! date, and suspect readings (more than 10 % above nominal, below half of nominal, an
//! elevation outside the reading's course; common practice, see survey.rs).

use std::collections::BTreeMap;

use chrono::NaiveDate;

use super::survey::{outside_course_band, suspect_reading};
use crate::model::reading::ReadingSet;
use crate::model::tank::Tank;
use crate::model::warning::{Shown, Warning};

/// What the screening found.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Screening {
    /// Readings per (date, course).
    pub counts: BTreeMap<(NaiveDate, u32), usize>,
    /// Suspect readings, in file order.
    pub suspects: Vec<Warning>,
}

impl Screening {
    /// Survey dates, oldest first.
    pub fn dates(&self) -> Vec<NaiveDate> {
        let mut d: Vec<NaiveDate> = self.counts.keys().map(|(d, _)| *d).collect();
        d.dedup();
        d
    }
    /// Courses that have readings, bottom first.
    pub fn courses(&self) -> Vec<u32> {
        let mut c: Vec<u32> = self.counts.keys().map(|(_, c)| *c).collect();
        c.sort_unstable();
        c.dedup();
        c
    }
}

/// Counts the readings and flags suspect ones (the latter only with a tank, whose
/// nominal thicknesses they are judged against).
pub fn screen(tank: Option<&Tank>, set: &ReadingSet) -> Screening {
    let mut s = Screening::default();
    for r in &set.readings {
        *s.counts.entry((r.date, r.course)).or_default() += 1;
        let Some(t) = tank else { continue };
        let Some(course) = t.course(r.course) else {
            continue;
        };
        if let Some(kind) = suspect_reading(r.thickness, course.nominal_thickness) {
            s.suspects.push(Warning::SuspectReading {
                location: set.locate(r.origin),
                course: r.course,
                thickness: Shown::thickness(r.thickness, t.units).significant(),
                nominal: Shown::thickness(course.nominal_thickness, t.units),
                kind,
            });
        }
        if let Some(e) = r.elevation
            && outside_course_band(e, course.bottom_elevation, course.height)
        {
            s.suspects.push(Warning::ElevationOutsideCourse {
                location: set.locate(r.origin),
                course: r.course,
                elevation: Shown::length(e, t.units),
                bottom: Shown::length(course.bottom_elevation, t.units),
                top: Shown::length(
                    crate::calc::units::Length(course.bottom_elevation.0 + course.height.0),
                    t.units,
                ),
            });
        }
    }
    s
}
