//! The fleet result: one line per tank folder, as `strake fleet` lists them.

use chrono::NaiveDate;

use crate::calc::life::RemainingLife;
use crate::calc::units::{Length, UnitSystem};

/// The worst condition of a tank's courses.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord)]
pub enum TankStatus {
    /// A course is below t_min.
    BelowMinimum,
    /// A course has no readings: its fitness cannot be shown.
    NoReadings,
    /// A course has less than 10 years of remaining life.
    Monitor,
    /// Every course is measured, at or above t_min, with 10 years or more.
    Ok,
}

impl TankStatus {
    /// Name used in every output.
    pub fn name(self) -> &'static str {
        match self {
            TankStatus::BelowMinimum => "below-minimum",
            TankStatus::NoReadings => "no-readings",
            TankStatus::Monitor => "monitor",
            TankStatus::Ok => "ok",
        }
    }
}

/// One assessed tank, reduced to what fleet planning needs.
#[derive(Debug, Clone, PartialEq)]
pub struct FleetTank {
    /// The tank folder, as found below the fleet folder.
    pub folder: String,
    /// Tank id.
    pub tank_id: String,
    /// Tank name, if given.
    pub name: Option<String>,
    /// The tank's unit system (every length below is in it).
    pub units: UnitSystem,
    /// Latest survey date.
    pub latest_survey: NaiveDate,
    /// Worst course status.
    pub status: TankStatus,
    /// The earlier of the next UT survey and the next external inspection.
    pub next_due: Option<NaiveDate>,
    /// Next UT thickness survey.
    pub next_ut_inspection: Option<NaiveDate>,
    /// Next external inspection.
    pub next_external_inspection: Option<NaiveDate>,
    /// Course with the least remaining life.
    pub governing_course: Option<u32>,
    /// Its remaining life.
    pub remaining_life: Option<RemainingLife>,
    /// Allowable liquid level now: the least over measured courses, at most the shell
    /// height.
    pub allowable_fill_height: Option<Length>,
    /// The course that sets it (None when the shell height does).
    pub allowable_fill_height_course: Option<u32>,
    /// Allowable liquid level at the next UT survey, at most the shell height.
    pub allowable_fill_height_next: Option<Length>,
    /// Maximum operating liquid level of the tank file.
    pub operating_fill_height: Length,
    /// Shell height.
    pub shell_height: Length,
    /// True when the allowable level now is below the operating maximum.
    pub fill_restricted: bool,
    /// True when the allowable level at the next UT survey is below the operating
    /// maximum.
    pub fill_restricted_next: bool,
    /// Courses below t_min.
    pub below_minimum: Vec<u32>,
    /// Number of warnings of the assessment.
    pub warnings: usize,
    /// The tank's report folder inside the fleet report folder (`fleet --out`), when
    /// one was written.
    pub report: Option<String>,
}

/// One tank folder of the fleet.
#[derive(Debug, Clone, PartialEq)]
pub enum FleetEntry {
    /// Assessed.
    Tank(Box<FleetTank>),
    /// Could not be assessed.
    Failed {
        /// The tank folder.
        folder: String,
        /// Tank id, when its tank.toml could be read.
        tank_id: Option<String>,
        /// The error, with file, line and value.
        message: String,
    },
}

impl FleetEntry {
    /// The folder.
    pub fn folder(&self) -> &str {
        match self {
            FleetEntry::Tank(t) => &t.folder,
            FleetEntry::Failed { folder, .. } => folder,
        }
    }
}

/// Every tank folder below a folder, in planning order.
#[derive(Debug, Clone, PartialEq)]
pub struct Fleet {
    /// The folder searched, as given.
    pub root: String,
    /// Assessed tanks by next due date (earliest first; ties by tank id, then
    /// folder), then the folders that failed, by folder.
    pub entries: Vec<FleetEntry>,
}

impl Fleet {
    /// The tanks assessed, in the fleet's order (failed folders left out).
    pub fn tanks(&self) -> impl Iterator<Item = &FleetTank> {
        self.entries.iter().filter_map(|e| match e {
            FleetEntry::Tank(t) => Some(t.as_ref()),
            FleetEntry::Failed { .. } => None,
        })
    }
    /// Number of tanks assessed.
    pub fn assessed(&self) -> usize {
        self.tanks().count()
    }
    /// Number of folders that failed.
    pub fn failed(&self) -> usize {
        self.entries.len() - self.assessed()
    }
}

/// Inspections falling due in one calendar month.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct DueMonth {
    /// The first day of the month.
    pub month: NaiveDate,
    /// Next UT thickness surveys due that month.
    pub ut: usize,
    /// Next external inspections due that month.
    pub external: usize,
}

/// Inspections falling due in one calendar year.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct DueYear {
    /// The year.
    pub year: i32,
    /// Next UT thickness surveys due that year.
    pub ut: usize,
    /// Next external inspections due that year.
    pub external: usize,
}

/// One tank's governing course and its remaining life.
#[derive(Debug, Clone, PartialEq)]
pub struct LifeBar {
    /// Tank id.
    pub tank_id: String,
    /// The tank folder.
    pub folder: String,
    /// The governing course.
    pub governing_course: Option<u32>,
    /// Its remaining life (None: no course has a rate).
    pub life: Option<RemainingLife>,
    /// The tank's status.
    pub status: TankStatus,
}

/// What the fleet page's charts draw, from the assessed tanks of a [`Fleet`].
#[derive(Debug, Clone, PartialEq)]
pub struct FleetSeries {
    /// Every calendar month from the first month with a due date to the last, in
    /// order (months with nothing due included, with zero counts).
    pub due_months: Vec<DueMonth>,
    /// The same counts per calendar year, over the same span.
    pub due_years: Vec<DueYear>,
    /// Tanks by remaining life of their governing course, least first (no measurable
    /// loss after every finite life, not computed last; ties by tank id, then folder).
    pub lives: Vec<LifeBar>,
    /// Remaining life under which a course's status is `monitor`, years.
    pub monitor_years: f64,
}
