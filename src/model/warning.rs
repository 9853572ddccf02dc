//! Engineering findings and data remarks that are not errors.
//!
//! Each warning is typed and renders as one actionable sentence; every output format
//! shows them (formats.md `warnings`).

use std::fmt;

use chrono::NaiveDate;

use crate::calc::rates::RateUnavailable;
use crate::calc::survey::SuspectKind;
use crate::calc::units::{Length, Rate, Thickness, UnitSystem};
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
    /// One more decimal, for comparing two close values.
    pub fn finer(mut self) -> Self {
        self.decimals += 1;
        self
    }
    /// A length or elevation in the unit of `units`, to 0.01 m or 0.01 ft.
    pub fn length(l: Length, units: UnitSystem) -> Self {
        Shown {
            value: l.0,
            unit: units.length_unit(),
            decimals: 2,
        }
    }
    /// With as many more decimals as a small value other than zero needs to show two
    /// significant digits (a reading of 0.0001 in is not shown as 0.000 in).
    pub fn significant(mut self) -> Self {
        let magnitude = self.value.abs();
        if magnitude > 0.0
            && magnitude.is_finite()
            && magnitude < 10f64.powi(1 - self.decimals as i32)
        {
            self.decimals = (1.0 - magnitude.log10().floor()) as usize;
        }
        self
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
    /// The chosen rate basis cannot be computed for a course.
    RateBasisUnavailable {
        /// Course.
        course: u32,
        /// The basis chosen in tank.toml.
        basis: RateBasis,
        /// Why.
        reason: RateUnavailable,
    },
    /// A welded course without a material: the code's defaults for a material not
    /// known are used.
    MaterialNotGiven {
        /// Course.
        course: u32,
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
    /// A reading whose elevation lies outside its course's band.
    ElevationOutsideCourse {
        /// file:line.
        location: String,
        /// Course given in the row.
        course: u32,
        /// The elevation given in the row.
        elevation: Shown,
        /// Bottom of the course.
        bottom: Shown,
        /// Top of the course.
        top: Shown,
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
    /// The one-foot method is used beyond its diameter limit.
    OneFootBeyondLimit {
        /// Diameter as shown.
        diameter: String,
        /// Limit as shown.
        limit: String,
    },
    /// The variable-design-point method does not apply (L / H over its limit).
    VariablePointNotApplicable {
        /// L / H.
        ratio: f64,
        /// The limit.
        limit: f64,
        /// Whether the one-foot method is within its diameter limit.
        one_foot_applies: bool,
    },
    /// The design point fell below the course's bottom joint (K < 1: the course is
    /// weaker than the one below it).
    VariablePointBelowJoint {
        /// Course.
        course: u32,
    },
    /// The design-point iteration did not settle within its step limit.
    VariablePointNotSettled {
        /// Course.
        course: u32,
    },
    /// A course's nominal thickness is below what a method requires.
    NominalBelowRequired {
        /// Course.
        course: u32,
        /// Nominal.
        nominal: Shown,
        /// Required.
        required: Shown,
        /// Which method.
        method: &'static str,
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
    /// The readings of a course vary too much for their mean to represent it
    /// (COV > 0.10, API 579-1 Part 4, from memory).
    NonUniform {
        /// Course.
        course: u32,
        /// s / mean of its latest survey.
        cov: f64,
        /// Whether a scan of the course is assessed.
        scanned: bool,
    },
    /// Scans dated after the `--as-of` date were left out.
    ScansAfterAsOf {
        /// How many.
        count: usize,
        /// The as-of date.
        as_of: NaiveDate,
    },
    /// A scanned course has no corrosion rate: its area is judged as measured.
    AreaNoRate {
        /// The scan file.
        file: String,
        /// Course.
        course: u32,
    },
    /// No averaging window of a scan had half its cells valid: no t1.
    AreaNoWindow {
        /// The scan file.
        file: String,
        /// k.
        rows_per_window: usize,
    },
    /// The extreme-value estimate of a course's thinnest spot is below its t_min.
    ExtremeBelowMinimum {
        /// Course.
        course: u32,
        /// The estimated least thickness.
        estimate: Shown,
        /// The course's t_min.
        t_min: Shown,
        /// Whether a scan of the course is assessed.
        scanned: bool,
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
            Warning::RateBasisUnavailable {
                course,
                basis,
                reason,
            } => {
                let why = match reason {
                    RateUnavailable::TooFewSurveysForRegression => {
                        "a regression needs 3 or more surveys"
                    }
                    RateUnavailable::TooFewSurveys => "it needs 2 or more surveys",
                };
                write!(
                    f,
                    "course {course}: rate basis \"{}\" cannot be computed ({why}): no \
                     governing rate, remaining life not computed; add surveys or choose \
                     rate_basis = \"conservative\"",
                    basis.name()
                )
            }
            Warning::MaterialNotGiven { course } => write!(
                f,
                "course {course}: no material in tank.toml: the code's properties for a material \
                 not known are used (Y = 30,000 psi / 205 MPa, T = 55,000 psi / 380 MPa); give \
                 `material` if it is known"
            ),
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
            Warning::ElevationOutsideCourse {
                location,
                course,
                elevation,
                bottom,
                top,
            } => write!(
                f,
                "{location}: course {course}: reading at elevation {elevation} lies outside \
                 the course ({bottom} to {top}); kept on course {course}: check the course \
                 number or the elevation"
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
            Warning::OneFootBeyondLimit { diameter, limit } => write!(
                f,
                "D {diameter} is over the one-foot method's limit of {limit} (API 650 5.6.3.1): \
                 its thicknesses are shown for comparison only"
            ),
            Warning::VariablePointNotApplicable {
                ratio,
                limit,
                one_foot_applies,
            } => {
                let instead = if *one_foot_applies {
                    "the one-foot method applies"
                } else {
                    "neither method applies: an elastic analysis is needed (API 650 5.6.5)"
                };
                write!(
                    f,
                    "variable-design-point method not applied: L/H = {ratio:.3} is over its \
                     limit {limit:.3} (API 650 5.6.4.1); {instead}"
                )
            }
            Warning::VariablePointBelowJoint { course } => write!(
                f,
                "course {course}: the variable design point falls below the course's bottom \
                 joint (K = t_L / t_u < 1: this course needs more than the one below it); the \
                 method's formulas are applied as printed, but a lower course should be no \
                 thinner than the course above it (API 650 5.6.1.3, from memory): check the \
                 plate grades or use an elastic analysis"
            ),
            Warning::VariablePointNotSettled { course } => write!(
                f,
                "course {course}: the variable-design-point iteration did not settle within \
                 its step limit; its last value is shown"
            ),
            Warning::NominalBelowRequired {
                course,
                nominal,
                required,
                method,
            } => write!(
                f,
                "course {course}: nominal {nominal} is below the {required} required by the \
                 {method} method"
            ),
            Warning::NonUniform {
                course,
                cov,
                scanned,
            } => {
                let then = if *scanned {
                    "judge it on the scan of this course (Local areas)"
                } else {
                    "no scan of this course in scans/: scan a grid over its thinnest area"
                };
                write!(
                    f,
                    "course {course}: the readings vary too much for their average to represent \
                     the course (COV {cov:.3} > 0.10, API 579-1 Part 4, from memory): treat the \
                     loss as local; {then}"
                )
            }
            Warning::ScansAfterAsOf { count, as_of } => write!(
                f,
                "{count} scan{} dated after {as_of} left out (--as-of)",
                if *count == 1 { "" } else { "s" }
            ),
            Warning::AreaNoRate { file, course } => write!(
                f,
                "{file}: course {course} has no corrosion rate: the local-area rules are checked \
                 as measured, without corrosion to the next inspection, and the area's level at \
                 the next inspection is not computed"
            ),
            Warning::AreaNoWindow {
                file,
                rows_per_window,
            } => write!(
                f,
                "{file}: no averaging window of {rows_per_window} rows has half its cells \
                 measured: t1 not computed; fill the gaps or scan at a finer pitch"
            ),
            Warning::ExtremeBelowMinimum {
                course,
                estimate,
                t_min,
                scanned,
            } => {
                let then = if *scanned {
                    "compare it with the scan of this course"
                } else {
                    "scan the course where its drops read thinnest"
                };
                write!(
                    f,
                    "course {course}: the extreme-value estimate of its thinnest spot, {estimate}, \
                     is below t_min {t_min} (an estimate, not a measurement): {then}"
                )
            }
        }
    }
}
