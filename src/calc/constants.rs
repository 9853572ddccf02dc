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

/// SI coefficient of `t[mm] = 4.9 D[m] (H[m] - 0.3) G / S[MPa]`: rho_w g / 2 with
/// rho_w = 1000 kg/m3, g = 9.81 m/s2 and m -> mm (API 653 4.3.3.1, SI form).
pub const ONE_FOOT_COEFFICIENT_SI: f64 = 4.9;
/// USC coefficient of `t[in] = 2.6 D[ft] (H[ft] - 1) G / S[psi]`: rho_w g / 2 with
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
/// Hydrotest stress S_t in service, lower two courses: min(0.88 Y, 0.472 T): yield
/// factor (API 653 4.3.3.2 / table 4.1, from memory).
pub const HYDROTEST_LOWER_YIELD_FACTOR: f64 = 0.88;
/// Hydrotest tensile factor, lower two courses (API 653 table 4.1, from memory).
pub const HYDROTEST_LOWER_TENSILE_FACTOR: f64 = 0.472;
/// Hydrotest stress S_t in service, other courses: min(0.9 Y, 0.519 T): yield factor
/// (API 653 table 4.1, from memory).
pub const HYDROTEST_UPPER_YIELD_FACTOR: f64 = 0.9;
/// Hydrotest tensile factor, other courses (API 653 table 4.1, from memory).
pub const HYDROTEST_UPPER_TENSILE_FACTOR: f64 = 0.519;
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
/// A reading whose elevation lies outside its course's band by more than this
/// fraction of the course height is flagged: the course number or the elevation is
/// wrong (the project's judgement, common practice: a gauge position is read to a few
/// centimetres, and readings beside a horizontal weld sit at the band's edge).
pub const ELEVATION_BAND_TOLERANCE: f64 = 0.1;
/// The least spacing of a scan grid's rows or columns, mm: an ultrasonic probe is
/// several millimetres across and grids are scanned at 10 mm or more, so a smaller
/// pitch is a unit mistake (metres typed for millimetres; common practice).
pub const MIN_SCAN_PITCH_MM: f64 = 1.0;
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
// New-construction design (methods.md s.2 and s.7; API 650 5.6, from memory)
// ---------------------------------------------------------------------------------

/// Design stress S_d = min(2/3 Y, 2/5 T): yield factor (API 650 5.6.2.1 table basis,
/// from memory).
pub const DESIGN_YIELD_FACTOR: f64 = 2.0 / 3.0;
/// Design stress tensile factor 2/5 (API 650 5.6.2.1, from memory).
pub const DESIGN_TENSILE_FACTOR: f64 = 2.0 / 5.0;
/// Hydrostatic test stress S_t = min(3/4 Y, 3/7 T): yield factor (API 650 5.6.2.2,
/// from memory).
pub const TEST_YIELD_FACTOR: f64 = 3.0 / 4.0;
/// Hydrostatic test stress tensile factor 3/7 (API 650 5.6.2.2, from memory).
pub const TEST_TENSILE_FACTOR: f64 = 3.0 / 7.0;
/// Largest diameter for the one-foot method, m (API 650 5.6.3.1).
pub const ONE_FOOT_MAX_DIAMETER_M: f64 = 61.0;
/// Largest diameter for the one-foot method, ft (API 650 5.6.3.1).
pub const ONE_FOOT_MAX_DIAMETER_FT: f64 = 200.0;
/// Minimum nominal shell thickness by diameter, SI: (diameter below which it applies,
/// m; thickness, mm). D < 15 m: 5 mm; 15 to < 36 m: 6 mm; 36 to 60 m: 8 mm; over
/// 60 m: 10 mm (API 650 5.6.1.1, from memory).
pub const MIN_NOMINAL_SI: [(f64, f64); 4] =
    [(15.0, 5.0), (36.0, 6.0), (60.0, 8.0), (f64::INFINITY, 10.0)];
/// Minimum nominal shell thickness by diameter, USC: D < 50 ft: 3/16 in; 50 to < 120 ft:
/// 1/4 in; 120 to 200 ft: 5/16 in; over 200 ft: 3/8 in (API 650 5.6.1.1, from memory).
pub const MIN_NOMINAL_USC: [(f64, f64); 4] = [
    (50.0, 3.0 / 16.0),
    (120.0, 0.25),
    (200.0, 5.0 / 16.0),
    (f64::INFINITY, 0.375),
];

// Variable-design-point method (API 650 5.6.4, from memory; methods.md s.7).

/// Bottom course: t1 = (1.06 - k D/H sqrt(H G / S)) (one-foot coefficient H D G / S);
/// k = 0.0696 in SI (D, H in m, S in MPa).
pub const VDP_BOTTOM_K_SI: f64 = 0.0696;
/// The same factor in USC (D, H in ft, S in psi).
pub const VDP_BOTTOM_K_USC: f64 = 0.463;
/// The constant term 1.06 of the bottom-course formula.
pub const VDP_BOTTOM_CONSTANT: f64 = 1.06;
/// Applicability: L / H <= 1000/6 with L = sqrt(500 D t) in mm, H in m (SI).
pub const VDP_RATIO_LIMIT_SI: f64 = 1000.0 / 6.0;
/// Applicability in USC: L / H <= 2 with L = sqrt(6 D t) in in, H in ft.
pub const VDP_RATIO_LIMIT_USC: f64 = 2.0;
/// L = sqrt(factor D t): 500 in SI (D m, t mm -> L mm).
pub const VDP_L_FACTOR_SI: f64 = 500.0;
/// L = sqrt(factor D t): 6 in USC (D ft, t in -> L in).
pub const VDP_L_FACTOR_USC: f64 = 6.0;
/// Second course: ratio h1 / sqrt(r t1) at or below which t2 = t1.
pub const VDP_SECOND_LOW: f64 = 1.375;
/// Second course: ratio at or above which t2 = t2a.
pub const VDP_SECOND_HIGH: f64 = 2.625;
/// Second course interpolation t2 = t2a + (t1 - t2a)(2.1 - h1 / (1.25 sqrt(r t1))).
pub const VDP_SECOND_A: f64 = 2.1;
/// The 1.25 of the interpolation.
pub const VDP_SECOND_B: f64 = 1.25;
/// Upper courses: x1 = 0.61 sqrt(r t_u) + c1 C H.
pub const VDP_X1_ROOT: f64 = 0.61;
/// x1's head factor: 320 in SI (x mm, H m).
pub const VDP_X1_HEAD_SI: f64 = 320.0;
/// x1's head factor: 3.84 in USC (x in, H ft).
pub const VDP_X1_HEAD_USC: f64 = 3.84;
/// x2 = c2 C H: 1000 in SI.
pub const VDP_X2_HEAD_SI: f64 = 1000.0;
/// x2 = c2 C H: 12 in USC.
pub const VDP_X2_HEAD_USC: f64 = 12.0;
/// x3 = 1.22 sqrt(r t_u).
pub const VDP_X3_ROOT: f64 = 1.22;
/// Most iterations of the upper-course design point (API 650 says two or three
/// usually suffice).
pub const VDP_MAX_ITERATIONS: usize = 100;
/// The iteration stops when t_x changes by less than this, in thickness units
/// relative to t_x.
pub const VDP_TOLERANCE: f64 = 1e-9;
// Locally thinned areas from grid scans (methods.md s.3, s.4, s.5; API 653 4.3.2,
// from memory of the clauses)
// ---------------------------------------------------------------------------------

/// Coefficient of the averaging length in its USC printed form, L = 3.7 sqrt(D t2)
/// with D in ft, t2 in in and L in in (API 653 4.3.2.1, from memory).
pub const AVERAGING_COEFFICIENT_USC: f64 = 3.7;
/// Coefficient of the averaging length with D and t2 in one unit, L = 1.068 sqrt(D t2)
/// (methods.md s.5: 3.7 / sqrt(12 in/ft) = 1.0681, printed rounded to 1.068); used for
/// SI with D in mm.
pub const AVERAGING_COEFFICIENT_CONSISTENT: f64 = 1.068;
/// Longest averaging length, in (API 653 4.3.2.1: "L <= 40 in", from memory).
pub const AVERAGING_LENGTH_CAP_IN: f64 = 40.0;
/// Longest averaging length, mm (methods.md s.5: 1000 mm in SI; 40 in is 1016 mm, the
/// SI edition rounds it down).
pub const AVERAGING_LENGTH_CAP_MM: f64 = 1000.0;
/// t2 must be at least this fraction of t_min (API 653 4.3.2.1, "60 % of t_min", from
/// memory; methods.md s.5).
pub const T2_FRACTION_OF_T_MIN: f64 = 0.6;
/// A pit may leave no less than this fraction of t_min (API 653 4.3.2.2 a, "one-half
/// t_min exclusive of the corrosion allowance", from memory; methods.md s.5).
pub const PIT_FRACTION_OF_T_MIN: f64 = 0.5;
/// Most pit length along a vertical line in one span, in (API 653 4.3.2.2 b, "2 in in
/// an 8 in length", from memory).
pub const PIT_LENGTH_LIMIT_IN: f64 = 2.0;
/// The span of that rule, in (API 653 4.3.2.2 b, from memory).
pub const PIT_SPAN_IN: f64 = 8.0;
/// Most pit length along a vertical line in one span, mm (methods.md s.5: 50 mm in
/// 200 mm, the SI form of 2 in in 8 in).
pub const PIT_LENGTH_LIMIT_MM: f64 = 50.0;
/// The span of that rule, mm (methods.md s.5).
pub const PIT_SPAN_MM: f64 = 200.0;
/// An averaging window is used only when at least this fraction of its cells holds a
/// valid reading (not empty, not a pit); this project's rule, so that a mean is never
/// taken over a few scattered cells.
pub const WINDOW_MIN_VALID_FRACTION: f64 = 0.5;
/// Relative tolerance of every "at least" / "at most" comparison of the local-area
/// rules, so that a value equal to its limit on paper passes despite binary rounding
/// (this project's rule).
pub const RULE_RELATIVE_TOLERANCE: f64 = 1e-9;

/// A local-area rule's two limits in one unit system.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LocalAreaForm {
    /// Coefficient of L (3.7 USC with D in ft; 1.068 SI with D in mm).
    pub averaging_coefficient: f64,
    /// Cap of L (40 in, 1000 mm).
    pub averaging_cap: Thickness,
    /// Most pit length in one span (2 in, 50 mm).
    pub pit_length_limit: Thickness,
    /// The span (8 in, 200 mm).
    pub pit_span: Thickness,
}

impl LocalAreaForm {
    /// The form for `units`.
    pub fn of(units: UnitSystem) -> Self {
        match units {
            UnitSystem::Si => LocalAreaForm {
                averaging_coefficient: AVERAGING_COEFFICIENT_CONSISTENT,
                averaging_cap: Thickness(AVERAGING_LENGTH_CAP_MM),
                pit_length_limit: Thickness(PIT_LENGTH_LIMIT_MM),
                pit_span: Thickness(PIT_SPAN_MM),
            },
            UnitSystem::Usc => LocalAreaForm {
                averaging_coefficient: AVERAGING_COEFFICIENT_USC,
                averaging_cap: Thickness(AVERAGING_LENGTH_CAP_IN),
                pit_length_limit: Thickness(PIT_LENGTH_LIMIT_IN),
                pit_span: Thickness(PIT_SPAN_IN),
            },
        }
    }
}

// ---------------------------------------------------------------------------------
// Extreme values for partial coverage (methods.md s.8; ASTM G16 practice, from memory)
// ---------------------------------------------------------------------------------

/// Euler-Mascheroni constant (mathematics): the mean of the standard Gumbel
/// distribution, used by the method of moments (u = mean - gamma a).
pub const EULER_GAMMA: f64 = statrs::consts::EULER_MASCHERONI;
/// Width of the strip of shell a drop's readings stand for, m: the block area is this
/// width times the course height (this project's convention, not from a standard:
/// +/- 0.15 m either side of the drop line, the band an inspector looks over when
/// placing the probe).
pub const DROP_STRIP_WIDTH_M: f64 = 0.3;
/// The same width in ft (this project's convention).
pub const DROP_STRIP_WIDTH_FT: f64 = 1.0;
/// Fewest blocks for a fit: with two parameters, four maxima leave two degrees of
/// freedom to see whether they lie on a line of the Gumbel plot (this project's floor;
/// common practice asks for more).
pub const EXTREME_MIN_BLOCKS: usize = 4;
/// Most Newton steps of the maximum-likelihood fit (converges in a handful).
pub const GUMBEL_ML_MAX_ITERATIONS: usize = 100;
/// Relative step at which the maximum-likelihood iteration stops.
pub const GUMBEL_ML_RELATIVE_STEP: f64 = 1e-12;

/// Drop strip width in the length unit of `units`.
pub fn drop_strip_width(units: UnitSystem) -> Length {
    match units {
        UnitSystem::Si => Length(DROP_STRIP_WIDTH_M),
        UnitSystem::Usc => Length(DROP_STRIP_WIDTH_FT),
    }
}

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
