//! Every number of the methods, named, with its unit and its origin.
//!
//! Sources are cited as: the published clause (API 650 / API 653 / API 579-1), a fact
//! of physics, "common practice" (a fact of the trade without a printed source), or
//! "from memory" (written from memory of the standard and not checked against the
//! printed edition). Keep that mark wherever the constant is used or tested.

use super::units::{Length, Rate, Stress, Thickness, UnitSystem};

// ---------------------------------------------------------------------------------
// One-foot relation (methods.md s.1 and s.3; API 653 4.3.3.1, API 650 5.6.3.2)
// ---------------------------------------------------------------------------------

/// SI coefficient of t[mm] = 4.9 D[m] (H[m] - 0.3) G / S[MPa]: rho_w g / 2 with
/// rho_w = 1000 kg/m3, g = 9.81 m/s2 and m -> mm (API 653 4.3.3.1, SI form).
pub const ONE_FOOT_COEFFICIENT_SI: f64 = 4.9;
/// USC coefficient of t[in] = 2.6 D[ft] (H[ft] - 1) G / S[psi]: rho_w g / 2 with
/// rho_w = 1.94 slug/ft3, g = 32.2 ft/s2 and ft -> in (API 653 4.3.3.1).
pub const ONE_FOOT_COEFFICIENT_USC: f64 = 2.6;
/// Height above the bottom of a course at which its hoop stress is taken, m
/// (0.3 m, the "one foot"; fact of the trade, common practice; API 650 5.6.3.2).
pub const ONE_FOOT_OFFSET_M: f64 = 0.3;
/// The same offset in ft.
pub const ONE_FOOT_OFFSET_FT: f64 = 1.0;
/// Least t_min of any course, mm (API 653 4.3.3.1: "not less than 2.5 mm").
pub const T_MIN_FLOOR_MM: f64 = 2.5;
/// Least t_min of any course, in (API 653 4.3.3.1: "not less than 0.1 in").
pub const T_MIN_FLOOR_IN: f64 = 0.1;

/// The one-foot relation in the printed form of one unit system.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OneFootForm {
    /// 4.9 (SI) or 2.6 (USC).
    pub coefficient: f64,
    /// 0.3 m or 1 ft.
    pub offset: Length,
    /// 2.5 mm or 0.1 in.
    pub floor: Thickness,
}

impl OneFootForm {
    /// The form for `units`.
    pub fn of(units: UnitSystem) -> Self {
        match units {
            UnitSystem::Si => OneFootForm {
                coefficient: ONE_FOOT_COEFFICIENT_SI,
                offset: Length(ONE_FOOT_OFFSET_M),
                floor: Thickness(T_MIN_FLOOR_MM),
            },
            UnitSystem::Usc => OneFootForm {
                coefficient: ONE_FOOT_COEFFICIENT_USC,
                offset: Length(ONE_FOOT_OFFSET_FT),
                floor: Thickness(T_MIN_FLOOR_IN),
            },
        }
    }
}

// ---------------------------------------------------------------------------------
// Allowable stress in service (methods.md s.3; API 653 table 4.1, from memory)
// ---------------------------------------------------------------------------------

/// Number of bottom courses that take the lower stress factors (API 653 table 4.1).
pub const LOWER_COURSE_COUNT: u32 = 2;
/// S = min(0.80 Y, 0.429 T) for the lower two courses of a welded tank: yield factor
/// (API 653 4.3.3.1 / table 4.1, from memory).
pub const LOWER_YIELD_FACTOR: f64 = 0.80;
/// Tensile factor of the lower two courses (API 653 table 4.1, from memory).
pub const LOWER_TENSILE_FACTOR: f64 = 0.429;
/// S = min(0.88 Y, 0.472 T) for every other course: yield factor (API 653 table 4.1,
/// from memory).
pub const UPPER_YIELD_FACTOR: f64 = 0.88;
/// Tensile factor of the upper courses (API 653 table 4.1, from memory).
pub const UPPER_TENSILE_FACTOR: f64 = 0.472;
/// Cap on the tensile strength used, psi (API 653 table 4.1 note, from memory).
pub const TENSILE_CAP_PSI: f64 = 80_000.0;
/// Cap on the tensile strength used, MPa (API 653 table 4.1 note, from memory).
pub const TENSILE_CAP_MPA: f64 = 552.0;
/// Yield strength when the material is not known, psi (API 653 table 4.1, from memory).
pub const UNKNOWN_YIELD_PSI: f64 = 30_000.0;
/// Yield strength when the material is not known, MPa (API 653 table 4.1, from memory).
pub const UNKNOWN_YIELD_MPA: f64 = 205.0;
/// Tensile strength when the material is not known, psi (API 653 table 4.1, from memory).
pub const UNKNOWN_TENSILE_PSI: f64 = 55_000.0;
/// Tensile strength when the material is not known, MPa (API 653 table 4.1, from memory).
pub const UNKNOWN_TENSILE_MPA: f64 = 380.0;
/// Allowable stress of a riveted tank, psi (API 653 4.3.4, from memory).
pub const RIVETED_STRESS_PSI: f64 = 21_000.0;
/// Allowable stress of a riveted tank, MPa (API 653 4.3.4, from memory).
pub const RIVETED_STRESS_MPA: f64 = 145.0;

/// Tensile cap in the stress unit of `units`.
pub fn tensile_cap(units: UnitSystem) -> Stress {
    match units {
        UnitSystem::Si => Stress(TENSILE_CAP_MPA),
        UnitSystem::Usc => Stress(TENSILE_CAP_PSI),
    }
}

/// Riveted-tank allowable stress in the stress unit of `units`.
pub fn riveted_stress(units: UnitSystem) -> Stress {
    match units {
        UnitSystem::Si => Stress(RIVETED_STRESS_MPA),
        UnitSystem::Usc => Stress(RIVETED_STRESS_PSI),
    }
}

// ---------------------------------------------------------------------------------
// Corrosion rates, remaining life and intervals (methods.md s.6)
// ---------------------------------------------------------------------------------

/// Days in a year for elapsed time between surveys (methods.md s.6: days / 365.25).
pub const DAYS_PER_YEAR: f64 = 365.25;
/// One-sided confidence of the regression upper bound (methods.md s.6: 95 %).
pub const REGRESSION_CONFIDENCE: f64 = 0.95;
/// Least number of surveys for a regression rate (methods.md s.6).
pub const REGRESSION_MIN_SURVEYS: usize = 3;
/// UT thickness survey interval when no rate is known, years (API 653 6.3.3).
pub const UT_INTERVAL_NO_RATE_YEARS: f64 = 5.0;
/// Longest UT thickness survey interval, years (API 653 6.3.3).
pub const UT_INTERVAL_MAX_YEARS: f64 = 15.0;
/// UT interval = RCA / (2 N) (API 653 6.3.3).
pub const UT_INTERVAL_DIVISOR: f64 = 2.0;
/// Longest external inspection interval, years (API 653 6.3.2).
pub const EXTERNAL_INTERVAL_MAX_YEARS: f64 = 5.0;
/// External interval = RCA / (4 N) (API 653 6.3.2).
pub const EXTERNAL_INTERVAL_DIVISOR: f64 = 4.0;
/// Remaining life under which a course is flagged `monitor`, years (this project's
/// status rule, formats.md).
pub const MONITOR_REMAINING_LIFE_YEARS: f64 = 10.0;

// ---------------------------------------------------------------------------------
// Reading plausibility (common practice) and uniformity (API 579-1 Part 4, from memory)
// ---------------------------------------------------------------------------------

/// A reading more than 10 % above nominal is flagged as suspect (mill tolerance,
/// coating or a gauge error; common practice).
pub const SUSPECT_ABOVE_NOMINAL_FACTOR: f64 = 1.10;
/// A reading below half of nominal is flagged as suspect (a lamination, a doubled
/// echo, or a real hole; common practice).
pub const SUSPECT_BELOW_NOMINAL_FACTOR: f64 = 0.5;
/// A reading over three times nominal is rejected as a unit mistake (common practice:
/// mm typed into an inch file gives 25x).
pub const UNIT_MISTAKE_FACTOR: f64 = 3.0;
/// COV above which the average must not represent the course (API 579-1 Part 4,
/// point thickness readings, from memory).
pub const COV_UNIFORM_LIMIT: f64 = 0.10;
/// Highest specific gravity accepted (caustic and acid solutions stay under 1.5;
/// common practice; anything over 3 is a typing error).
pub const MAX_SPECIFIC_GRAVITY: f64 = 3.0;

/// A rate of zero, for readability.
pub const NO_LOSS: Rate = Rate(0.0);

// ---------------------------------------------------------------------------------
// Chart projections (this project's presentation choices, not a method)
// ---------------------------------------------------------------------------------

/// Least number of years the charts carry projections beyond the latest survey: the
/// longest UT thickness survey interval (API 653 6.3.3), so the next survey is
/// always on the chart.
pub const CHART_HORIZON_MIN_YEARS: f64 = UT_INTERVAL_MAX_YEARS;
/// Most years the charts look ahead to show where the shortest-lived course meets
/// t_min (this project's choice: beyond 30 years a straight-line projection says
/// little).
pub const CHART_HORIZON_MAX_YEARS: f64 = 30.0;
/// Step of the allowable-fill-height outlook, years (this project's choice: a
/// quarter year keeps the governing envelope's corners sharp on an A4 chart).
pub const OUTLOOK_STEP_YEARS: f64 = 0.25;
