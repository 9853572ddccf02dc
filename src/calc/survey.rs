//! The readings of one course at one survey, reduced to the numbers the methods use.
//!
//! Sources: methods.md s.5 and s.6; API 653 4.3.2 (basis thickness), API 579-1 Part 4
//! (coefficient of variation of point thickness readings, from memory).
//!
//! - minimum and mean of the readings; sample standard deviation s (n - 1), from statrs;
//! - COV = s / mean; COV <= 0.10 means the average may represent general metal loss;
//! - basis thickness t_c = the minimum (default) or the mean (`average` basis).
//! - A reading more than 10 % above nominal or below half of nominal is suspect
//!   (common practice): it is kept and flagged, never discarded.

use chrono::NaiveDate;
use statrs::statistics::Statistics;

use super::constants::{SUSPECT_ABOVE_NOMINAL_FACTOR, SUSPECT_BELOW_NOMINAL_FACTOR};
use super::units::Thickness;
use crate::model::tank::ThicknessBasis;

/// One course at one survey date.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CourseSurvey {
    /// Survey date.
    pub date: NaiveDate,
    /// Number of readings.
    pub count: usize,
    /// Least reading.
    pub minimum: Thickness,
    /// Mean of the readings.
    pub mean: Thickness,
    /// Sample standard deviation (n - 1); None for a single reading.
    pub std_dev: Option<f64>,
    /// s / mean; None for a single reading.
    pub cov: Option<f64>,
    /// The basis thickness t_c (minimum or mean).
    pub basis: Thickness,
}

/// Reduces the readings of one course at one date. None when there are none.
pub fn course_survey(
    date: NaiveDate,
    readings: &[f64],
    basis: ThicknessBasis,
) -> Option<CourseSurvey> {
    if readings.is_empty() {
        return None;
    }
    let minimum = Statistics::min(readings.iter());
    let mean = readings.iter().mean();
    let std_dev = if readings.len() >= 2 {
        Some(readings.iter().std_dev())
    } else {
        None
    };
    let cov = std_dev.map(|s| s / mean);
    Some(CourseSurvey {
        date,
        count: readings.len(),
        minimum: Thickness(minimum),
        mean: Thickness(mean),
        std_dev,
        cov,
        basis: Thickness(match basis {
            ThicknessBasis::Minimum => minimum,
            ThicknessBasis::Average => mean,
        }),
    })
}

/// Why a reading looks wrong.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SuspectKind {
    /// More than 10 % above nominal.
    AboveNominal,
    /// Below half of nominal.
    BelowHalfNominal,
}

/// Flags a reading that is implausible against the course's nominal thickness.
pub fn suspect_reading(thickness: Thickness, nominal: Thickness) -> Option<SuspectKind> {
    if thickness.0 > nominal.0 * SUSPECT_ABOVE_NOMINAL_FACTOR {
        Some(SuspectKind::AboveNominal)
    } else if thickness.0 < nominal.0 * SUSPECT_BELOW_NOMINAL_FACTOR {
        Some(SuspectKind::BelowHalfNominal)
    } else {
        None
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn date() -> NaiveDate {
        NaiveDate::from_ymd_opt(2024, 6, 1).expect("date")
    }

    /// Hand: readings 10, 11, 12 -> min 10, mean 11, s = sqrt(((1 + 0 + 1) / 2)) = 1,
    /// COV = 1 / 11 = 0.090909 (sample standard deviation, any statistics text).
    #[test]
    fn statistics_by_hand() {
        let s = course_survey(date(), &[10.0, 11.0, 12.0], ThicknessBasis::Minimum).expect("3");
        assert_eq!(
            (s.count, s.minimum, s.mean),
            (3, Thickness(10.0), Thickness(11.0))
        );
        assert!((s.std_dev.expect("n>1") - 1.0).abs() < 1e-12);
        assert!((s.cov.expect("n>1") - 1.0 / 11.0).abs() < 1e-12);
        assert_eq!(s.basis, Thickness(10.0));
        let a = course_survey(date(), &[10.0, 11.0, 12.0], ThicknessBasis::Average).expect("3");
        assert_eq!(a.basis, Thickness(11.0));
    }

    #[test]
    fn single_and_empty() {
        let s = course_survey(date(), &[9.5], ThicknessBasis::Minimum).expect("1");
        assert_eq!((s.std_dev, s.cov), (None, None));
        assert_eq!(course_survey(date(), &[], ThicknessBasis::Minimum), None);
    }

    /// Limits: nominal 10: 11.0 is not above 10 % (11.0 > 11.0 is false), 11.01 is;
    /// 5.0 is not below half, 4.99 is (common practice thresholds).
    #[test]
    fn suspect_limits() {
        let n = Thickness(10.0);
        assert_eq!(suspect_reading(Thickness(11.0), n), None);
        assert_eq!(
            suspect_reading(Thickness(11.01), n),
            Some(SuspectKind::AboveNominal)
        );
        assert_eq!(suspect_reading(Thickness(5.0), n), None);
        assert_eq!(
            suspect_reading(Thickness(4.99), n),
            Some(SuspectKind::BelowHalfNominal)
        );
    }
}
