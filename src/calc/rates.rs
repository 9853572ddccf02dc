//! Corrosion rates of a course from its dated basis thicknesses.
//!
//! Source: API 653 4.4.5 and 6.3 (rates from successive surveys), pressure-equipment
//! practice of API 510 / API 570 7.1 for the conservative choice (the greater of
//! long-term and short-term), and methods.md s.6 (from memory of the clauses).
//!
//! - Long-term  LT = (t_first - t_last) / years(first, last); with one survey and a
//!   known in-service date, LT = (t_nominal - t_last) / years(in service, last),
//!   flagged "initial thickness assumed = nominal".
//! - Short-term ST = (t_previous - t_last) / years(previous, last).
//! - Regression (3 or more surveys): ordinary least squares of t on time; rate =
//!   -slope; one-sided 95 % upper bound = -slope + t(0.95, n-2) SE(slope), Student's t
//!   from statrs.
//! - years(a, b) = days between a and b / 365.25.
//!
//! Symbols: t basis thickness of a survey (tank thickness unit); rates in thickness
//! unit per year; SE standard error of the slope.

use chrono::NaiveDate;
use statrs::distribution::{ContinuousCDF, StudentsT};
use statrs::statistics::Statistics;

use super::constants::{DAYS_PER_YEAR, REGRESSION_CONFIDENCE, REGRESSION_MIN_SURVEYS};
use super::units::{Rate, Thickness};
use crate::model::tank::RateBasis;

/// The basis thickness of one course at one survey date.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BasisPoint {
    /// Survey date.
    pub date: NaiveDate,
    /// Basis thickness (minimum or mean of the readings).
    pub thickness: Thickness,
}

/// Elapsed years between two dates: days / 365.25 (methods.md s.6).
pub fn years_between(from: NaiveDate, to: NaiveDate) -> f64 {
    (to - from).num_days() as f64 / DAYS_PER_YEAR
}

/// A two-point rate with its inputs.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RateCalc {
    /// Earlier date (the in-service date when `from_nominal`).
    pub from: NaiveDate,
    /// Later date.
    pub to: NaiveDate,
    /// Thickness at `from` (the nominal thickness when `from_nominal`).
    pub t_from: Thickness,
    /// Thickness at `to`.
    pub t_to: Thickness,
    /// Elapsed years.
    pub years: f64,
    /// (t_from - t_to) / years; negative means apparent thickening.
    pub rate: Rate,
    /// True when the initial thickness was assumed equal to nominal.
    pub from_nominal: bool,
}

fn two_point(a: BasisPoint, b: BasisPoint, from_nominal: bool) -> Option<RateCalc> {
    let years = years_between(a.date, b.date);
    if years <= 0.0 {
        return None;
    }
    Some(RateCalc {
        from: a.date,
        to: b.date,
        t_from: a.thickness,
        t_to: b.thickness,
        years,
        rate: Rate((a.thickness.0 - b.thickness.0) / years),
        from_nominal,
    })
}

/// Long-term rate over `history` (sorted by date, one point per date). With a single
/// survey, from the nominal thickness at `in_service` when that date is known.
pub fn long_term(
    history: &[BasisPoint],
    nominal: Thickness,
    in_service: Option<NaiveDate>,
) -> Option<RateCalc> {
    match history {
        [] => None,
        [only] => {
            let since = in_service?;
            let start = BasisPoint {
                date: since,
                thickness: nominal,
            };
            two_point(start, *only, true)
        }
        [first, .., last] => two_point(*first, *last, false),
    }
}

/// Short-term rate: the last two surveys of `history` (sorted by date).
pub fn short_term(history: &[BasisPoint]) -> Option<RateCalc> {
    match history {
        [.., previous, last] => two_point(*previous, *last, false),
        _ => None,
    }
}

/// Least-squares line through the basis thicknesses, with its upper-bound rate.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct RegressionCalc {
    /// Number of surveys.
    pub n: usize,
    /// Time origin (the first survey date); x = years since this date.
    pub origin: NaiveDate,
    /// Fitted thickness at the origin.
    pub intercept: Thickness,
    /// Fitted slope, thickness unit per year (negative when thinning).
    pub slope: f64,
    /// Standard error of the slope.
    pub slope_std_error: f64,
    /// Degrees of freedom, n - 2.
    pub degrees_of_freedom: f64,
    /// Student's t quantile at the one-sided confidence (0.95).
    pub t_quantile: f64,
    /// -slope.
    pub rate: Rate,
    /// -slope + t x SE.
    pub rate_upper: Rate,
}

impl RegressionCalc {
    /// Fitted thickness at a date.
    pub fn thickness_at(&self, date: NaiveDate) -> Thickness {
        Thickness(self.intercept.0 + self.slope * years_between(self.origin, date))
    }
}

/// Ordinary least squares of thickness on time (3 or more surveys).
pub fn regression(history: &[BasisPoint]) -> Option<RegressionCalc> {
    let n = history.len();
    if n < REGRESSION_MIN_SURVEYS {
        return None;
    }
    let origin = history.first()?.date;
    let x: Vec<f64> = history
        .iter()
        .map(|p| years_between(origin, p.date))
        .collect();
    let y: Vec<f64> = history.iter().map(|p| p.thickness.0).collect();
    let x_mean = x.iter().mean();
    let y_mean = y.iter().mean();
    let sxx: f64 = x.iter().map(|xi| (xi - x_mean).powi(2)).sum();
    if sxx <= 0.0 {
        return None;
    }
    let sxy: f64 = x
        .iter()
        .zip(&y)
        .map(|(xi, yi)| (xi - x_mean) * (yi - y_mean))
        .sum();
    let slope = sxy / sxx;
    let intercept = y_mean - slope * x_mean;
    let sse: f64 = x
        .iter()
        .zip(&y)
        .map(|(xi, yi)| (yi - intercept - slope * xi).powi(2))
        .sum();
    let dof = (n - 2) as f64;
    let slope_std_error = (sse / dof / sxx).sqrt();
    let t_quantile = student_t_quantile(REGRESSION_CONFIDENCE, dof)?;
    Some(RegressionCalc {
        n,
        origin,
        intercept: Thickness(intercept),
        slope,
        slope_std_error,
        degrees_of_freedom: dof,
        t_quantile,
        rate: Rate(-slope),
        rate_upper: Rate(-slope + t_quantile * slope_std_error),
    })
}

/// Quantile `p` of Student's t distribution with `dof` degrees of freedom (statrs).
///
/// statrs inverts the distribution function by iteration (tens of thousands of
/// instructions), and a fleet asks for the same few quantiles for every course of
/// every tank: each (p, dof) is computed once per thread and remembered (the same
/// function of the same numbers, so the same bits).
pub fn student_t_quantile(p: f64, dof: f64) -> Option<f64> {
    type Known = Vec<((u64, u64), Option<f64>)>;
    thread_local! {
        static KNOWN: std::cell::RefCell<Known> = const { std::cell::RefCell::new(Vec::new()) };
    }
    /// Enough for every number of surveys a tank has; beyond it, computed each time.
    const KEEP: usize = 64;
    let key = (p.to_bits(), dof.to_bits());
    KNOWN.with(|known| {
        if let Some(&(_, q)) = known.borrow().iter().find(|(k, _)| *k == key) {
            return q;
        }
        let q = StudentsT::new(0.0, 1.0, dof).ok().map(|d| d.inverse_cdf(p));
        let mut known = known.borrow_mut();
        if known.len() < KEEP {
            known.push((key, q));
        }
        q
    })
}

/// Why the chosen rate basis cannot be computed.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum RateUnavailable {
    /// The regression needs 3 or more surveys.
    TooFewSurveysForRegression,
    /// A two-point rate needs 2 or more surveys (or one and an in-service date).
    TooFewSurveys,
}

/// The rate that governs remaining life and intervals.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct GoverningRate {
    /// The basis chosen in tank.toml.
    pub basis: RateBasis,
    /// The rate by that basis, before clamping.
    pub raw: Rate,
    /// max(raw, 0): a negative rate is measurement scatter (methods.md s.6).
    pub value: Rate,
}

impl GoverningRate {
    /// Whether a negative rate was clamped to zero.
    pub fn clamped(&self) -> bool {
        self.raw.0 < 0.0
    }
}

/// The rate of one basis, when it can be computed.
pub fn rate_by(
    basis: RateBasis,
    long: Option<&RateCalc>,
    short: Option<&RateCalc>,
    reg: Option<&RegressionCalc>,
) -> Option<Rate> {
    match basis {
        RateBasis::Conservative => match (long, short) {
            (Some(l), Some(s)) => Some(Rate(l.rate.0.max(s.rate.0))),
            (Some(l), None) => Some(l.rate),
            (None, Some(s)) => Some(s.rate),
            (None, None) => None,
        },
        RateBasis::LongTerm => long.map(|r| r.rate),
        RateBasis::ShortTerm => short.map(|r| r.rate),
        RateBasis::Regression => reg.map(|r| r.rate),
        RateBasis::RegressionUpper => reg.map(|r| r.rate_upper),
    }
}

/// The governing rate by `basis`. When that basis cannot be computed the rate is
/// missing, with the reason: it is never replaced by another basis.
pub fn governing_rate(
    basis: RateBasis,
    long: Option<&RateCalc>,
    short: Option<&RateCalc>,
    reg: Option<&RegressionCalc>,
) -> Result<GoverningRate, RateUnavailable> {
    match rate_by(basis, long, short, reg) {
        Some(raw) => Ok(GoverningRate {
            basis,
            raw,
            value: Rate(raw.0.max(0.0)),
        }),
        None => Err(match basis {
            RateBasis::Regression | RateBasis::RegressionUpper => {
                RateUnavailable::TooFewSurveysForRegression
            }
            _ => RateUnavailable::TooFewSurveys,
        }),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn d(y: i32, m: u32, day: u32) -> NaiveDate {
        NaiveDate::from_ymd_opt(y, m, day).expect("valid test date")
    }
    fn p(y: i32, t: f64) -> BasisPoint {
        BasisPoint {
            date: d(y, 6, 1),
            thickness: Thickness(t),
        }
    }

    /// Student's t quantiles against any statistics handbook table (e.g. NIST/SEMATECH
    /// e-Handbook of Statistical Methods, 1.3.6.7.2): t(0.95, 3) = 2.353,
    /// t(0.975, 3) = 3.182, t(0.95, 1) = 6.314.
    #[test]
    fn student_t_table_values() {
        let q = |p, dof| student_t_quantile(p, dof).expect("valid dof");
        assert!((q(0.95, 3.0) - 2.353).abs() < 5e-4);
        assert!((q(0.975, 3.0) - 3.182).abs() < 5e-4);
        assert!((q(0.95, 1.0) - 6.314).abs() < 5e-4);
    }

    /// Hand: 2004-06-01 12.0 mm to 2024-06-01 11.0 mm; 7305 days / 365.25 = 20.0 y;
    /// LT = 1.0 / 20.0 = 0.05 mm/y. Short term 2019-06-01 11.4 -> 11.0 over
    /// 1827 days = 5.0021 y: 0.4 / 5.0021 = 0.079967 mm/y.
    #[test]
    fn long_and_short_term_by_hand() {
        let h = [p(2004, 12.0), p(2014, 11.7), p(2019, 11.4), p(2024, 11.0)];
        let lt = long_term(&h, Thickness(12.5), None).expect("two surveys");
        assert!((lt.years - 20.0).abs() < 1e-12);
        assert!((lt.rate.0 - 0.05).abs() < 1e-12);
        let st = short_term(&h).expect("two surveys");
        assert!((st.years - 1827.0 / 365.25).abs() < 1e-12);
        assert!((st.rate.0 - 0.4 / (1827.0 / 365.25)).abs() < 1e-12);
    }

    /// One survey, in service 1994-06-01, nominal 14.0, 2024-06-01 at 12.5:
    /// 10958 days = 30.0014 y; LT = 1.5 / 30.0014 = 0.049998 mm/y, from nominal.
    #[test]
    fn one_survey_uses_nominal_and_in_service_date() {
        let h = [p(2024, 12.5)];
        let lt = long_term(&h, Thickness(14.0), Some(d(1994, 6, 1))).expect("in service");
        assert!(lt.from_nominal);
        assert!((lt.rate.0 - 1.5 / (10958.0 / 365.25)).abs() < 1e-12);
        assert_eq!(long_term(&h, Thickness(14.0), None), None);
        assert_eq!(short_term(&h), None);
        assert_eq!(regression(&h), None);
    }

    /// Zero elapsed time gives no rate rather than a division by zero.
    #[test]
    fn zero_elapsed_time() {
        let h = [p(2024, 12.5)];
        assert_eq!(long_term(&h, Thickness(14.0), Some(d(2024, 6, 1))), None);
    }

    /// Exact line: t = 12 - 0.05 x, the fitted rate is 0.05 and SE = 0.
    #[test]
    fn regression_on_an_exact_line() {
        let h = [
            BasisPoint {
                date: d(2000, 1, 1),
                thickness: Thickness(12.0),
            },
            BasisPoint {
                date: d(2000, 1, 1) + chrono::Duration::days(3653),
                thickness: Thickness(12.0 - 0.05 * 3653.0 / 365.25),
            },
            BasisPoint {
                date: d(2000, 1, 1) + chrono::Duration::days(7305),
                thickness: Thickness(12.0 - 0.05 * 20.0),
            },
        ];
        let r = regression(&h).expect("three surveys");
        assert!((r.rate.0 - 0.05).abs() < 1e-12);
        assert!(r.slope_std_error < 1e-9);
        assert!((r.rate_upper.0 - 0.05).abs() < 1e-8);
    }

    #[test]
    fn governing_choices() {
        let h = [p(2004, 12.0), p(2019, 11.4), p(2024, 11.0)];
        let lt = long_term(&h, Thickness(12.5), None);
        let st = short_term(&h);
        let reg = regression(&h);
        let g = governing_rate(
            RateBasis::Conservative,
            lt.as_ref(),
            st.as_ref(),
            reg.as_ref(),
        )
        .expect("rates known");
        // max(LT = 1.0/20.0 = 0.05, ST = 0.4/5.0021 = 0.07997) = ST
        assert_eq!(g.value, st.map(|s| s.rate).expect("st"));
        // Regression asked with two surveys: missing, with the reason.
        let two = [p(2019, 11.4), p(2024, 11.0)];
        let g = governing_rate(
            RateBasis::Regression,
            long_term(&two, Thickness(12.5), None).as_ref(),
            short_term(&two).as_ref(),
            regression(&two).as_ref(),
        );
        assert_eq!(g, Err(RateUnavailable::TooFewSurveysForRegression));
    }

    /// Apparent thickening: raw rate negative, governing value 0.
    #[test]
    fn negative_rate_is_clamped() {
        let h = [p(2019, 11.0), p(2024, 11.1)];
        let lt = long_term(&h, Thickness(12.5), None);
        let g = governing_rate(RateBasis::LongTerm, lt.as_ref(), None, None).expect("lt");
        assert!(g.raw.0 < 0.0);
        assert!(g.clamped());
        assert_eq!(g.value, Rate(0.0));
    }
}
