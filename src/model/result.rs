//! The one result model: everything an assessment found, with every intermediate
//! value kept so that each output (table, JSON, CSV, HTML, charts) can show how a
//! number was obtained without computing anything itself.

use chrono::NaiveDate;

use crate::calc::area::AreaAssessment;
use crate::calc::extreme::{ExtremeValue, NotApplicable};
use crate::calc::life::{IntervalBasis, IntervalCalc, RemainingLife, Status};
use crate::calc::rates::{GoverningRate, RateCalc, RegressionCalc};
use crate::calc::shell::{FillHeightCalc, TminCalc};
use crate::calc::stress::AllowableStress;
use crate::calc::survey::CourseSurvey;
use crate::calc::units::{Length, Rate, Thickness};
use crate::model::tank::Tank;
use crate::model::warning::Warning;

/// What-if values given on the command line instead of the tank file's.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Overrides {
    /// `--sg`: the tank file's value it replaced.
    pub specific_gravity_from_file: Option<f64>,
    /// `--fill-height`: the tank file's value it replaced.
    pub fill_height_from_file: Option<Length>,
}

/// One survey date of the tank.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SurveyInfo {
    /// Date.
    pub date: NaiveDate,
    /// Readings used from that date.
    pub readings: usize,
}

/// The measured condition of a course (absent when the course has no readings).
#[derive(Debug, Clone, PartialEq)]
pub struct CourseCondition {
    /// Every survey of the course, oldest first.
    pub history: Vec<CourseSurvey>,
    /// The course's latest survey (t_actual = `latest.basis`).
    pub latest: CourseSurvey,
    /// Long-term rate.
    pub long_term: Option<RateCalc>,
    /// Short-term rate.
    pub short_term: Option<RateCalc>,
    /// Regression and its upper bound.
    pub regression: Option<RegressionCalc>,
    /// The governing rate (None when the chosen basis cannot be computed).
    pub rate: Option<GoverningRate>,
    /// Why `rate` is missing.
    pub rate_missing: Option<crate::calc::rates::RateUnavailable>,
    /// Remaining life.
    pub remaining_life: RemainingLife,
    /// Date the course reaches t_min at the governing rate.
    pub retirement_date: Option<NaiveDate>,
    /// ok / monitor / below-minimum.
    pub status: Status,
    /// Allowable liquid level by this course now.
    pub max_fill_height: FillHeightCalc,
    /// Allowable liquid level by this course after the tank's UT interval.
    pub max_fill_height_next: Option<FillHeightCalc>,
    /// UT thickness interval of this course.
    pub ut_interval: IntervalCalc,
    /// External inspection interval of this course.
    pub external_interval: IntervalCalc,
}

impl CourseCondition {
    /// t_actual: the basis thickness of the latest survey.
    pub fn t_actual(&self) -> Thickness {
        self.latest.basis
    }
    /// The governing rate after clamping, when known.
    pub fn rate_value(&self) -> Option<Rate> {
        self.rate.map(|r| r.value)
    }
}

/// One course's result.
#[derive(Debug, Clone, PartialEq)]
pub struct CourseResult {
    /// Course number, 1 = bottom.
    pub number: u32,
    /// Elevation of its bottom.
    pub bottom_elevation: Length,
    /// Height.
    pub height: Length,
    /// Nominal thickness.
    pub nominal_thickness: Thickness,
    /// Allowable stress S and its derivation.
    pub stress: AllowableStress,
    /// Joint efficiency E used.
    pub joint_efficiency: f64,
    /// Whole-course t_min and its derivation.
    pub t_min: TminCalc,
    /// Measured condition; None when the course has no readings.
    pub condition: Option<CourseCondition>,
    /// Extreme-value estimate of the course's thinnest spot from its drops at the
    /// latest survey (methods.md s.8), or why there is none. An estimate beside the
    /// measured minimum, never used in its place.
    pub extreme_value: Result<ExtremeValue, NotApplicable>,
}

/// A liquid level limit and the course that sets it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FillLimit {
    /// Allowable liquid level above the tank bottom.
    pub level: Length,
    /// The governing course.
    pub course: u32,
}

/// A tank-level interval: the least over courses with a known rate.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TankInterval {
    /// Years.
    pub years: f64,
    /// The course that sets it (None when no rate is known anywhere).
    pub course: Option<u32>,
    /// How it was decided.
    pub basis: IntervalBasis,
}

/// Tank-level verdict.
#[derive(Debug, Clone, PartialEq)]
pub struct TankSummary {
    /// Course with the least finite remaining life (the lower on a tie); None when no
    /// course has one (no rate known, or no measurable corrosion anywhere).
    pub governing_course: Option<u32>,
    /// Remaining life of the governing course.
    pub remaining_life: Option<RemainingLife>,
    /// Allowable liquid level now: the least over measured courses and scanned areas.
    pub max_fill_height: Option<FillLimit>,
    /// Allowable liquid level at the next UT inspection (courses and areas).
    pub max_fill_height_next: Option<FillLimit>,
    /// UT thickness survey interval.
    pub ut_interval: TankInterval,
    /// External inspection interval.
    pub external_interval: TankInterval,
    /// Due date of the next UT thickness survey.
    pub next_ut_inspection: Option<NaiveDate>,
    /// Due date of the next external inspection.
    pub next_external_inspection: Option<NaiveDate>,
    /// Courses below t_min.
    pub below_minimum: Vec<u32>,
    /// Index into `Assessment::areas` of the scanned area that sets
    /// `max_fill_height` (None when a course sets it).
    pub max_fill_height_area: Option<usize>,
    /// The same for `max_fill_height_next`.
    pub max_fill_height_next_area: Option<usize>,
}

/// The history of one thickness monitoring location.
#[derive(Debug, Clone, PartialEq)]
pub struct PointResult {
    /// Point id.
    pub point: String,
    /// Course.
    pub course: u32,
    /// Elevation of the latest reading, when given.
    pub elevation: Option<Length>,
    /// Azimuth of the latest reading, when given.
    pub azimuth: Option<f64>,
    /// Number of dated readings.
    pub surveys: usize,
    /// First date and reading.
    pub first: (NaiveDate, Thickness),
    /// Last date and reading.
    pub last: (NaiveDate, Thickness),
    /// (first - last) / years; None with a single date. Negative: apparent thickening.
    pub rate: Option<Rate>,
    /// Remaining life at max(rate, 0) against the course's t_min.
    pub remaining_life: RemainingLife,
}

/// The result of assessing one tank.
#[derive(Debug, Clone, PartialEq)]
pub struct Assessment {
    /// The tank as assessed (with any what-if overrides applied).
    pub tank: Tank,
    /// Which values came from the command line.
    pub overrides: Overrides,
    /// Assessment date: `--as-of`, else the latest survey date.
    pub as_of: NaiveDate,
    /// Latest survey date used.
    pub latest_survey: NaiveDate,
    /// Every survey date used, oldest first.
    pub surveys: Vec<SurveyInfo>,
    /// Per course, bottom first.
    pub courses: Vec<CourseResult>,
    /// Tank-level verdict.
    pub summary: TankSummary,
    /// Every monitoring point, by course then id.
    pub points: Vec<PointResult>,
    /// Indices into `points` of the worst points, worst first.
    pub hot_spots: Vec<usize>,
    /// Findings and data remarks.
    pub warnings: Vec<Warning>,
    /// Hydrostatic test heights (API 653 4.3.3.2).
    pub hydrotest: crate::calc::hydrotest::Hydrotest,
    /// For tanks over the one-foot limit: the variable-design-point comparison.
    pub variable_point: Option<crate::calc::hydrotest::VariablePointComparison>,
    /// Scanned local thin areas (`scans/*.csv`), in file-name order.
    pub areas: Vec<AreaAssessment>,
}
