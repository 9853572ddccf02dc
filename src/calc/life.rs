//! Remaining life, status and inspection intervals.
//!
//! Sources: API 653 4.4.5 / 6.3 (from memory of the clauses) and methods.md s.6.
//!
//! - Remaining life RL = (t_actual - t_min) / N; none when N = 0; 0 (and status
//!   below-minimum) when t_actual < t_min.
//! - Ultrasonic thickness survey interval (API 653 6.3.3): 5 years when no rate is
//!   known, else min(RCA / (2 N), 15 years).
//! - External inspection interval (API 653 6.3.2): min(RCA / (4 N), 5 years).
//! - RCA = t_actual - t_min (remaining corrosion allowance); RCA <= 0: interval 0,
//!   action now, whether a rate is known or not. The tank's interval is the least over
//!   courses with a known rate or no allowance left.
//!
//! Symbols: t_actual basis thickness of the latest survey, t_min whole-course minimum,
//! N governing corrosion rate (thickness unit per year), intervals in years.

use chrono::{Duration, NaiveDate};

use super::constants::{
    DAYS_PER_YEAR, EXTERNAL_INTERVAL_DIVISOR, EXTERNAL_INTERVAL_MAX_YEARS,
    MONITOR_REMAINING_LIFE_YEARS, UT_INTERVAL_DIVISOR, UT_INTERVAL_MAX_YEARS,
    UT_INTERVAL_NO_RATE_YEARS,
};
use super::units::{Rate, Thickness};

/// Remaining life of a course.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum RemainingLife {
    /// A finite number of years (0 when already below t_min).
    Years(f64),
    /// The governing rate is zero: no end of life can be projected.
    NoMeasurableLoss,
    /// No rate is known (one survey and no in-service date).
    Unknown,
}

impl RemainingLife {
    /// Years, when finite.
    pub fn years(self) -> Option<f64> {
        match self {
            RemainingLife::Years(y) => Some(y),
            _ => None,
        }
    }
    /// Ordering key: shorter life first; no measurable loss after every finite life;
    /// unknown last.
    pub fn sort_key(self) -> (u8, f64) {
        match self {
            RemainingLife::Years(y) => (0, y),
            RemainingLife::NoMeasurableLoss => (1, 0.0),
            RemainingLife::Unknown => (2, 0.0),
        }
    }
}

/// RL = (t_actual - t_min) / N.
pub fn remaining_life(t_actual: Thickness, t_min: Thickness, rate: Option<Rate>) -> RemainingLife {
    let margin = t_actual.0 - t_min.0;
    if margin < 0.0 {
        return RemainingLife::Years(0.0);
    }
    match rate {
        None => RemainingLife::Unknown,
        Some(n) if n.0 <= 0.0 => RemainingLife::NoMeasurableLoss,
        Some(n) => RemainingLife::Years(margin / n.0),
    }
}

/// Condition of a course.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord)]
pub enum Status {
    /// t_actual < t_min.
    BelowMinimum,
    /// Remaining life under 10 years.
    Monitor,
    /// Neither.
    Ok,
}

impl Status {
    /// Name used in every output (formats.md).
    pub fn name(self) -> &'static str {
        match self {
            Status::BelowMinimum => "below-minimum",
            Status::Monitor => "monitor",
            Status::Ok => "ok",
        }
    }
}

/// Status from the thicknesses and remaining life (formats.md).
pub fn status(t_actual: Thickness, t_min: Thickness, life: RemainingLife) -> Status {
    if t_actual.0 < t_min.0 {
        Status::BelowMinimum
    } else if matches!(life, RemainingLife::Years(y) if y < MONITOR_REMAINING_LIFE_YEARS) {
        Status::Monitor
    } else {
        Status::Ok
    }
}

/// Which inspection an interval is for.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum IntervalKind {
    /// Ultrasonic thickness survey (API 653 6.3.3).
    UltrasonicThickness,
    /// External inspection (API 653 6.3.2).
    External,
}

impl IntervalKind {
    /// (divisor of RCA / (k N), cap in years).
    pub fn rule(self) -> (f64, f64) {
        match self {
            IntervalKind::UltrasonicThickness => (UT_INTERVAL_DIVISOR, UT_INTERVAL_MAX_YEARS),
            IntervalKind::External => (EXTERNAL_INTERVAL_DIVISOR, EXTERNAL_INTERVAL_MAX_YEARS),
        }
    }
    /// Interval when no rate is known.
    pub fn without_rate(self) -> f64 {
        match self {
            IntervalKind::UltrasonicThickness => UT_INTERVAL_NO_RATE_YEARS,
            IntervalKind::External => EXTERNAL_INTERVAL_MAX_YEARS,
        }
    }
}

/// How an interval was decided.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum IntervalBasis {
    /// No rate known: the default interval.
    NoRateKnown,
    /// RCA <= 0: act now.
    NoAllowanceLeft,
    /// RCA / (k N) is below the cap.
    FromRate,
    /// The cap governs (including a zero rate).
    Cap,
}

/// An inspection interval with its inputs.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct IntervalCalc {
    /// UT or external.
    pub kind: IntervalKind,
    /// RCA = t_actual - t_min.
    pub rca: Thickness,
    /// N, when known.
    pub rate: Option<Rate>,
    /// RCA / (k N), when N > 0 and RCA > 0.
    pub from_rate: Option<f64>,
    /// How it was decided.
    pub basis: IntervalBasis,
    /// Years.
    pub years: f64,
}

/// Interval for one course (API 653 6.3.2 / 6.3.3).
pub fn interval(kind: IntervalKind, rca: Thickness, rate: Option<Rate>) -> IntervalCalc {
    let (divisor, cap) = kind.rule();
    let (from_rate, basis, years) = match rate {
        _ if rca.0 <= 0.0 => (None, IntervalBasis::NoAllowanceLeft, 0.0),
        None => (None, IntervalBasis::NoRateKnown, kind.without_rate()),
        Some(n) if n.0 <= 0.0 => (None, IntervalBasis::Cap, cap),
        Some(n) => {
            let y = rca.0 / (divisor * n.0);
            if y < cap {
                (Some(y), IntervalBasis::FromRate, y)
            } else {
                (Some(y), IntervalBasis::Cap, cap)
            }
        }
    };
    IntervalCalc {
        kind,
        rca,
        rate,
        from_rate,
        basis,
        years,
    }
}

/// `date` plus `years`: whole years as calendar years (so a 5-year interval from
/// 2023-08-30 ends on 2028-08-30), the fraction as days (fraction x 365.25, rounded).
/// None past the calendar's end.
pub fn add_years(date: NaiveDate, years: f64) -> Option<NaiveDate> {
    if !years.is_finite() || years.abs() > 10_000.0 {
        return None;
    }
    let whole = years.trunc();
    let days = ((years - whole) * DAYS_PER_YEAR).round() as i64;
    let months = chrono::Months::new((whole.abs() as u32).checked_mul(12)?);
    let shifted = if whole >= 0.0 {
        date.checked_add_months(months)?
    } else {
        date.checked_sub_months(months)?
    };
    shifted.checked_add_signed(Duration::days(days))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Hand: t_actual 13.1, t_min 12.49, N 0.08 -> RL = 0.61 / 0.08 = 7.625 y (monitor).
    #[test]
    fn remaining_life_by_hand() {
        let rl = remaining_life(Thickness(13.1), Thickness(12.49), Some(Rate(0.08)));
        let y = rl.years().expect("finite");
        assert!((y - 7.625).abs() < 1e-9);
        assert_eq!(
            status(Thickness(13.1), Thickness(12.49), rl),
            Status::Monitor
        );
    }

    #[test]
    fn edge_cases() {
        // Zero rate: no end of life; status ok.
        let rl = remaining_life(Thickness(13.0), Thickness(12.0), Some(Rate(0.0)));
        assert_eq!(rl, RemainingLife::NoMeasurableLoss);
        assert_eq!(status(Thickness(13.0), Thickness(12.0), rl), Status::Ok);
        // No rate: unknown.
        let rl = remaining_life(Thickness(13.0), Thickness(12.0), None);
        assert_eq!(rl, RemainingLife::Unknown);
        // Below t_min: 0 and below-minimum, whatever the rate.
        let rl = remaining_life(Thickness(11.9), Thickness(12.0), None);
        assert_eq!(rl, RemainingLife::Years(0.0));
        assert_eq!(
            status(Thickness(11.9), Thickness(12.0), rl),
            Status::BelowMinimum
        );
    }

    /// API 653 6.3.3: RCA 0.61 mm, N 0.08 -> 0.61 / (2 x 0.08) = 3.8125 y (< 15).
    /// External 6.3.2: 0.61 / (4 x 0.08) = 1.90625 y (< 5).
    #[test]
    fn intervals_by_hand() {
        let ut = interval(
            IntervalKind::UltrasonicThickness,
            Thickness(0.61),
            Some(Rate(0.08)),
        );
        assert!((ut.years - 3.8125).abs() < 1e-12);
        assert_eq!(ut.basis, IntervalBasis::FromRate);
        let ext = interval(IntervalKind::External, Thickness(0.61), Some(Rate(0.08)));
        assert!((ext.years - 1.906_25).abs() < 1e-12);
    }

    #[test]
    fn interval_caps_and_defaults() {
        // Slow rate: 3.0 / (2 x 0.01) = 150 y -> cap 15; external 3.0 / 0.04 = 75 -> 5.
        let ut = interval(
            IntervalKind::UltrasonicThickness,
            Thickness(3.0),
            Some(Rate(0.01)),
        );
        assert_eq!((ut.years, ut.basis), (15.0, IntervalBasis::Cap));
        let ext = interval(IntervalKind::External, Thickness(3.0), Some(Rate(0.01)));
        assert_eq!(ext.years, 5.0);
        // Zero rate: the caps.
        assert_eq!(
            interval(
                IntervalKind::UltrasonicThickness,
                Thickness(3.0),
                Some(Rate(0.0))
            )
            .years,
            15.0
        );
        // No rate: 5 years for UT (API 653 6.3.3) and 5 for external.
        assert_eq!(
            interval(IntervalKind::UltrasonicThickness, Thickness(3.0), None).years,
            5.0
        );
        assert_eq!(
            interval(IntervalKind::External, Thickness(3.0), None).years,
            5.0
        );
        // No allowance left: 0, act now.
        let now = interval(
            IntervalKind::UltrasonicThickness,
            Thickness(-0.1),
            Some(Rate(0.1)),
        );
        assert_eq!(
            (now.years, now.basis),
            (0.0, IntervalBasis::NoAllowanceLeft)
        );
        let now = interval(IntervalKind::External, Thickness(0.0), None);
        assert_eq!(
            (now.years, now.basis),
            (0.0, IntervalBasis::NoAllowanceLeft)
        );
    }

    /// 15 years after 2026-06-11 is 2041-06-11 (the formats.md example); 4.7 years
    /// after 2026-05-19: 4 calendar years -> 2030-05-19, then round(0.7 x 365.25) =
    /// 256 days -> 2031-01-30.
    #[test]
    fn due_dates() {
        let d = NaiveDate::from_ymd_opt(2026, 6, 11).expect("date");
        assert_eq!(add_years(d, 15.0), NaiveDate::from_ymd_opt(2041, 6, 11));
        assert_eq!(add_years(d, 5.0), NaiveDate::from_ymd_opt(2031, 6, 11));
        assert_eq!(add_years(d, 0.0), Some(d));
        assert_eq!(add_years(d, f64::INFINITY), None);
        let d = NaiveDate::from_ymd_opt(2026, 5, 19).expect("date");
        assert_eq!(add_years(d, 4.7), NaiveDate::from_ymd_opt(2031, 1, 30));
        // Leap day: 2024-02-29 plus one year is 2025-02-28 (chrono clamps the day).
        let leap = NaiveDate::from_ymd_opt(2024, 2, 29).expect("date");
        assert_eq!(add_years(leap, 1.0), NaiveDate::from_ymd_opt(2025, 2, 28));
    }
}
