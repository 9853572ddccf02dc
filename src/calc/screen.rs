//! Screening of readings before assessment (`strake check`): counts per course and
//! date, and suspect readings (more than 10 % above nominal, below half of nominal;
//! common practice, see survey.rs).

use std::collections::BTreeMap;

use chrono::NaiveDate;

use super::survey::suspect_reading;
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
                thickness: Shown::thickness(r.thickness, t.units),
                nominal: Shown::thickness(course.nominal_thickness, t.units),
                kind,
            });
        }
    }
    s
}
