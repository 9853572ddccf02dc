//! The series the report's charts draw, computed by `calc::series` from the result
//! model and the readings. The chart code only draws these: every projected
//! thickness, every future allowable level and every quartile is computed in `calc`.

use chrono::NaiveDate;

use crate::calc::survey::SuspectKind;
use crate::calc::units::{Length, Thickness};
use crate::model::required::RequiredShell;

/// Everything the charts of one tank need beyond the [`Assessment`](super::result::Assessment).
#[derive(Debug, Clone, PartialEq)]
pub struct ReportSeries {
    /// The latest survey of the tank: projections start here.
    pub start: NaiveDate,
    /// The last date the projections are carried to.
    pub horizon: NaiveDate,
    /// Per course, bottom first (every course of the tank, measured or not).
    pub courses: Vec<CourseSeries>,
    /// Allowable liquid level from the latest survey to the horizon.
    pub fill_outlook: FillOutlook,
    /// The design check beside the in-service assessment: the required thickness of
    /// every course by the one-foot and the variable-design-point methods of API 650
    /// (`calc::required::required_shell`, the numbers of `strake required`), for the
    /// assessed tank's liquid level and specific gravity.
    pub design: RequiredShell,
}

/// The readings of one course at one survey date.
#[derive(Debug, Clone, PartialEq)]
pub struct SurveyReadings {
    /// Survey date.
    pub date: NaiveDate,
    /// Every reading of the course on that date, in file order.
    pub readings: Vec<Thickness>,
    /// The basis thickness of that survey (minimum or mean).
    pub basis: Thickness,
}

/// One reading of a course's latest survey, with its plausibility flag.
#[derive(Debug, Clone, PartialEq)]
pub struct LatestReading {
    /// The reading.
    pub thickness: Thickness,
    /// Its monitoring point, when given.
    pub point: Option<String>,
    /// Its elevation above the tank bottom, when given.
    pub elevation: Option<Length>,
    /// More than 10 % above nominal or under half of it (kept, flagged).
    pub suspect: Option<SuspectKind>,
}

/// Least, lower quartile, median, upper quartile and greatest of a set of readings.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FiveNumbers {
    /// Least reading.
    pub min: Thickness,
    /// Lower quartile.
    pub q1: Thickness,
    /// Median.
    pub median: Thickness,
    /// Upper quartile.
    pub q3: Thickness,
    /// Greatest reading.
    pub max: Thickness,
}

/// A straight thickness trend between two dated thicknesses.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ThicknessLine {
    /// Where the line starts.
    pub start: (NaiveDate, Thickness),
    /// Where it ends: its meeting with t_min, or the horizon, whichever comes first.
    pub end: (NaiveDate, Thickness),
    /// The date it meets t_min, when that lies after its start and within the
    /// horizon.
    pub reaches_t_min: Option<NaiveDate>,
}

/// The series of one course.
#[derive(Debug, Clone, PartialEq)]
pub struct CourseSeries {
    /// Course number, 1 = bottom.
    pub course: u32,
    /// Every survey of the course up to the assessment date, oldest first.
    pub surveys: Vec<SurveyReadings>,
    /// With a single survey and a known in-service date: the assumed initial point
    /// (in-service date, nominal thickness) the long-term rate starts from.
    pub assumed_initial: Option<(NaiveDate, Thickness)>,
    /// From the latest basis thickness forward at the governing rate.
    pub projection: Option<ThicknessLine>,
    /// The least-squares line through the basis thicknesses (3 or more surveys),
    /// from the first survey forward.
    pub regression_line: Option<ThicknessLine>,
    /// The readings of the latest survey, in file order.
    pub latest: Vec<LatestReading>,
    /// Their five-number summary.
    pub spread: Option<FiveNumbers>,
}

/// One course's allowable liquid level at each step of the outlook.
#[derive(Debug, Clone, PartialEq)]
pub struct CourseOutlook {
    /// Course number.
    pub course: u32,
    /// Allowable level at each step (None where it cannot be computed: no rate).
    pub levels: Vec<Option<Length>>,
}

/// One scanned area's allowable liquid level at each step of the outlook.
#[derive(Debug, Clone, PartialEq)]
pub struct AreaOutlook {
    /// Index into `Assessment::areas`.
    pub area: usize,
    /// The course the area is on.
    pub course: u32,
    /// Allowable level at each step (None where it cannot be computed: no rate).
    pub levels: Vec<Option<Length>>,
}

/// The least allowable level at one step, and what sets it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OutlookLimit {
    /// The level.
    pub level: Length,
    /// The course that sets it (or the course of the area that sets it).
    pub course: u32,
    /// The scanned area that sets it (index into `Assessment::areas`), if one does.
    pub area: Option<usize>,
}

/// Allowable liquid level over the coming years.
#[derive(Debug, Clone, PartialEq)]
pub struct FillOutlook {
    /// The dates of the steps, from the latest survey to the horizon.
    pub dates: Vec<NaiveDate>,
    /// Per measured course.
    pub courses: Vec<CourseOutlook>,
    /// Per scanned area.
    pub areas: Vec<AreaOutlook>,
    /// The least over courses and areas at each step (None when one of them has no
    /// level there).
    pub envelope: Vec<Option<OutlookLimit>>,
    /// The first date on which the operating maximum liquid level is no longer
    /// allowed, and what sets it (None when that does not happen: no course or area
    /// under the level thins, or, for areas, not before the horizon).
    pub operating_level_until: Option<LevelDate>,
}

/// A date set by a course or a scanned area.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct LevelDate {
    /// The date.
    pub date: NaiveDate,
    /// The course that sets it (or the course of the area).
    pub course: u32,
    /// The scanned area that sets it, if one does.
    pub area: Option<usize>,
}
