//! Engineering findings and data remarks that are not errors.
//!
//! Each warning is typed and renders as one actionable sentence; every output format
//! shows them (formats.md `warnings`).

use std::fmt;

use chrono::NaiveDate;

use crate::calc::rates::RateFallback;
use crate::calc::survey::SuspectKind;
use crate::calc::units::{Rate, Thickness, UnitSystem};
use crate::model::tank::RateBasis;

/// A number with the unit it is in, for messages.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Shown {
    /// The number.
    pub value: f64,
    /// Its unit text.
    pub unit: &'static str,
    /// Decimals to print.
    pub decimals: usize,
}

impl Shown {
    /// A thickness in the unit of `units`.
    pub fn thickness(t: Thickness, units: UnitSystem) -> Self {
        Shown {
            value: t.0,
            unit: units.thickness_unit(),
            decimals: thickness_decimals(units),
        }
    }
    /// A rate in the unit of `units`.
    pub fn rate(r: Rate, units: UnitSystem) -> Self {
        Shown {
            value: r.0,
            unit: units.rate_unit(),
            decimals: rate_decimals(units),
        }
    }
}

/// Decimals of a thickness as gauges read it: 0.01 mm, 0.001 in (common practice).
pub fn thickness_decimals(units: UnitSystem) -> usize {
    match units {
        UnitSystem::Si => 2,
        UnitSystem::Usc => 3,
    }
}

/// Decimals of a corrosion rate: 0.001 mm/y, 0.0001 in/y.
pub fn rate_decimals(units: UnitSystem) -> usize {
    match units {
        UnitSystem::Si => 3,
        UnitSystem::Usc => 4,
    }
}

impl fmt::Display for Shown {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{:.*} {}", self.decimals, self.value, self.unit)
    }
}

/// One warning.
#[derive(Debug, Clone, PartialEq)]
pub enum Warning {
    /// The governing rate came out negative and was taken as zero.
    ApparentThickening {
        /// Course.
        course: u32,
        /// The negative rate.
        rate: Shown,
    },
    /// The requested rate basis could not be used.
    RateBasisFallback {
        /// Course.
        course: u32,
        /// Asked for.
        requested: RateBasis,
        /// Used instead.
        used: RateBasis,
        /// Why.
        reason: RateFallback,
    },
    /// One survey only: the long-term rate assumes the nominal thickness when new.
    AssumedNominal {
        /// Course.
        course: u32,
        /// Nominal thickness.
        nominal: Shown,
        /// In-service date.
        since: NaiveDate,
    },
    /// No rate can be computed for a course.
    NoRate {
        /// Course.
        course: u32,
    },
    /// A reading more than 10 % above nominal or under half of it.
    SuspectReading {
        /// file:line.
        location: String,
        /// Course.
        course: u32,
        /// The reading.
        thickness: Shown,
        /// The course's nominal thickness.
        nominal: Shown,
        /// Which test it failed.
        kind: SuspectKind,
    },
    /// The same point and date appear twice with the same value; counted once.
    DuplicateReading {
        /// file:line of the repeat.
        location: String,
        /// file:line of the first occurrence.
        first: String,
        /// Point id.
        point: String,
        /// Date.
        date: NaiveDate,
    },
    /// A course was not measured in the latest survey; its own last survey is used.
    NotInLatestSurvey {
        /// Course.
        course: u32,
        /// Its last survey date.
        last: NaiveDate,
        /// The tank's latest survey date.
        latest: NaiveDate,
    },
    /// A course has no readings at all up to the assessment date.
    NoReadings {
        /// Course.
        course: u32,
    },
    /// A course is thinner than the absolute floor of t_min.
    BelowFloor {
        /// Course.
        course: u32,
        /// Its basis thickness.
        thickness: Shown,
        /// The floor.
        floor: Shown,
    },
    /// The allowable level at the next inspection cannot be computed.
    NextFillHeightUnknown {
        /// Courses without a rate.
        courses: Vec<u32>,
    },
    /// The allowable level ignores courses that have no readings.
    FillHeightIgnoresUnmeasured {
        /// Courses without readings.
        courses: Vec<u32>,
    },
    /// An entry of surveys/ that is not a .csv file and was not read.
    NotRead {
        /// The entry, as displayed.
        path: String,
        /// True for a folder.
        folder: bool,
    },
    /// Readings after the `--as-of` date were left out.
    ReadingsAfterAsOf {
        /// How many.
        count: usize,
        /// The as-of date.
        as_of: NaiveDate,
    },
}

fn course_list(courses: &[u32]) -> String {
    courses
        .iter()
        .map(u32::to_string)
        .collect::<Vec<_>>()
        .join(", ")
}

impl fmt::Display for Warning {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Warning::ApparentThickening { course, rate } => write!(
                f,
                "course {course}: apparent thickening ({rate}) treated as 0; \
                 check the gauge calibration and the readings of both surveys"
            ),
            Warning::RateBasisFallback {
                course,
                requested,
                used,
                reason,
            } => {
                let why = match reason {
                    RateFallback::TooFewSurveysForRegression => {
                        "a regression needs 3 or more surveys"
                    }
                    RateFallback::TooFewSurveys => "it needs 2 or more surveys",
                };
                write!(
                    f,
                    "course {course}: rate basis \"{}\" not available ({why}); \"{}\" used",
                    requested.name(),
                    used.name()
                )
            }
            Warning::AssumedNominal {
                course,
                nominal,
                since,
            } => write!(
                f,
                "course {course}: one survey only: long-term rate from the nominal {nominal} \
                 at the in-service date {since} (initial thickness assumed = nominal)"
            ),
            Warning::NoRate { course } => write!(
                f,
                "course {course}: no corrosion rate (one survey and no in_service_since in \
                 tank.toml): remaining life unknown; add the in-service date or a second survey"
            ),
            Warning::SuspectReading {
                location,
                course,
                thickness,
                nominal,
                kind,
            } => {
                let what = match kind {
                    SuspectKind::AboveNominal => "more than 10 % above",
                    SuspectKind::BelowHalfNominal => "below half of",
                };
                write!(
                    f,
                    "{location}: course {course}: reading {thickness} is {what} the nominal \
                     {nominal}; kept: re-measure or confirm"
                )
            }
            Warning::DuplicateReading {
                location,
                first,
                point,
                date,
            } => write!(
                f,
                "{location}: point \"{point}\" on {date} repeats {first} with the same value; \
                 counted once"
            ),
            Warning::NotInLatestSurvey {
                course,
                last,
                latest,
            } => write!(
                f,
                "course {course}: no reading in the latest survey ({latest}); its last survey \
                 ({last}) is used"
            ),
            Warning::NoReadings { course } => write!(
                f,
                "course {course}: no readings: thickness, rate and remaining life cannot be \
                 assessed; survey this course"
            ),
            Warning::BelowFloor {
                course,
                thickness,
                floor,
            } => write!(
                f,
                "course {course}: {thickness} is below the absolute minimum {floor}: repair \
                 before service; the liquid level is limited to the bottom of the course"
            ),
            Warning::NextFillHeightUnknown { courses } => write!(
                f,
                "allowable level at the next inspection not computed: no corrosion rate for \
                 course {}",
                course_list(courses)
            ),
            Warning::FillHeightIgnoresUnmeasured { courses } => write!(
                f,
                "allowable level covers measured courses only: course {} has no readings",
                course_list(courses)
            ),
            Warning::NotRead { path, folder } => {
                if *folder {
                    write!(
                        f,
                        "{path}: a folder inside surveys/, not read: survey files are read \
                         from surveys/ itself"
                    )
                } else {
                    write!(
                        f,
                        "{path}: not a .csv file, not read: export the survey as CSV to \
                         include it"
                    )
                }
            }
            Warning::ReadingsAfterAsOf { count, as_of } => {
                write!(f, "{count} readings dated after {as_of} left out (--as-of)")
            }
        }
    }
}
