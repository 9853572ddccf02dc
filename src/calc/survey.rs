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
//!
//! The statistics are gathered one reading at a time ([`ReadingStats`]), with statrs's
//! single-pass Welford accumulator (`OnlineMoments`), the very arithmetic statrs uses
//! for the mean and standard deviation of a slice: no reading has to be kept.

use chrono::NaiveDate;
use statrs::statistics::{Accumulate, OnlineVariance};

use super::constants::{
    ELEVATION_BAND_TOLERANCE, SUSPECT_ABOVE_NOMINAL_FACTOR, SUSPECT_BELOW_NOMINAL_FACTOR,
};
use super::units::{Length, Thickness};
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

/// Running statistics of the readings of one course at one survey: the count, the
/// least reading, and the Welford moments (statrs) for the mean and the sample
/// standard deviation.
#[derive(Default)]
pub struct ReadingStats {
    minimum: f64,
    moments: OnlineVariance,
}

impl std::fmt::Debug for ReadingStats {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_struct("ReadingStats")
            .field("count", &self.count())
            .field("minimum", &self.minimum)
            .field("mean", &self.moments.mean())
            .finish()
    }
}

impl ReadingStats {
    /// Adds one reading.
    pub fn push(&mut self, reading: f64) {
        if self.moments.count == 0 || reading < self.minimum {
            self.minimum = reading;
        }
        self.moments = std::mem::take(&mut self.moments).push(reading);
    }
    /// Number of readings.
    pub fn count(&self) -> usize {
        self.moments.count as usize
    }
}

/// Reduces the readings of one course at one date. None when there are none.
pub fn course_survey(
    date: NaiveDate,
    readings: &[f64],
    basis: ThicknessBasis,
) -> Option<CourseSurvey> {
    let mut stats = ReadingStats::default();
    for &r in readings {
        stats.push(r);
    }
    course_survey_of(date, &stats, basis)
}

/// [`course_survey`] from statistics gathered one reading at a time.
pub fn course_survey_of(
    date: NaiveDate,
    stats: &ReadingStats,
    basis: ThicknessBasis,
) -> Option<CourseSurvey> {
    let mean = stats.moments.mean()?;
    let minimum = stats.minimum;
    let std_dev = stats.moments.std_dev();
    let cov = std_dev.map(|s| s / mean);
    Some(CourseSurvey {
        date,
        count: stats.count(),
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

/// True when a reading's `elevation` lies outside the band of a course from
/// `bottom` to `bottom + height`, by more than [`ELEVATION_BAND_TOLERANCE`] of the
/// height (common practice, see constants.rs).
pub fn outside_course_band(elevation: Length, bottom: Length, height: Length) -> bool {
    let tolerance = ELEVATION_BAND_TOLERANCE * height.0;
    elevation.0 < bottom.0 - tolerance || elevation.0 > bottom.0 + height.0 + tolerance
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

    /// The running statistics are statrs's own slice statistics, bit for bit (statrs
    /// `Statistics::min`, `mean`, `std_dev` as the independent reference), so gathering
    /// readings while they stream changes no output.
    #[test]
    fn running_statistics_equal_statrs_slice_statistics() {
        use statrs::statistics::Statistics;
        let mut x = 0x2545_f491_u64;
        for n in 1..60 {
            let values: Vec<f64> = (0..n)
                .map(|_| {
                    x = x.wrapping_mul(6_364_136_223_846_793_005).wrapping_add(1);
                    5.0 + (x >> 40) as f64 / 1.0e5
                })
                .collect();
            let s = course_survey(date(), &values, ThicknessBasis::Minimum).expect("n >= 1");
            assert_eq!(
                s.minimum.0.to_bits(),
                Statistics::min(values.iter()).to_bits()
            );
            assert_eq!(s.mean.0.to_bits(), values.iter().mean().to_bits());
            if n >= 2 {
                let sd = values.iter().std_dev();
                assert_eq!(s.std_dev.expect("n >= 2").to_bits(), sd.to_bits());
            }
        }
    }

    #[test]
    fn single_and_empty() {
        let s = course_survey(date(), &[9.5], ThicknessBasis::Minimum).expect("1");
        assert_eq!((s.std_dev, s.cov), (None, None));
        assert_eq!(course_survey(date(), &[], ThicknessBasis::Minimum), None);
    }

    /// Limits: nominal 10: 11.0 is not above 10 % (11.0 > 11.0 is false), 11.01 is;
    /// 5.0 is not below half, 4.99 is (common practice thresholds).
    /// A course from 2.4 m to 4.8 m (height 2.4 m): the tolerance is 0.24 m, so the
    /// band stretches from 2.16 m to 5.04 m (constants.rs, common practice).
    #[test]
    fn course_band_limits() {
        let (bottom, height) = (Length(2.4), Length(2.4));
        for (e, outside) in [
            (2.4, false),
            (4.8, false),
            (2.17, false),
            (5.03, false),
            (2.15, true),
            (5.05, true),
            (0.3, true),
            (30.0, true),
        ] {
            assert_eq!(
                outside_course_band(Length(e), bottom, height),
                outside,
                "{e}"
            );
        }
    }

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
