//! Corrosion rates of individual thickness monitoring locations, and hot spots.
//!
//! Source: API 653 4.4.5 / 6.3 (rates from successive readings at the same location,
//! from memory) and methods.md s.6 "Point level".
//!
//! - point rate = (t_first - t_last) / years(first, last), from the point's own
//!   readings (two or more dates);
//! - point remaining life = (t_last - t_min of its course) / max(rate, 0);
//! - hot spots: the points with the least remaining life, then the fastest rate.

use chrono::NaiveDate;

use super::life::{RemainingLife, remaining_life};
use super::rates::years_between;
use super::units::{Length, Rate, Thickness};
use crate::model::result::PointResult;

/// Most hot spots listed.
pub const HOT_SPOT_COUNT: usize = 10;

/// The dated readings of one point, oldest first (one per date).
#[derive(Debug, Clone, PartialEq)]
pub struct PointHistory {
    /// Point id.
    pub point: String,
    /// Course.
    pub course: u32,
    /// (date, thickness), oldest first.
    pub readings: Vec<(NaiveDate, Thickness)>,
    /// Elevation of the latest reading, when given.
    pub elevation: Option<Length>,
    /// Azimuth of the latest reading, when given.
    pub azimuth: Option<f64>,
}

/// What the point method needs of one point: its earliest and latest readings and
/// how many dated readings it has. Gathered one reading at a time with [`PointSpan::add`],
/// so a point's readings need not be kept.
#[derive(Debug, Clone, PartialEq)]
pub struct PointSpan {
    /// Course.
    pub course: u32,
    /// Number of dated readings.
    pub surveys: usize,
    /// Earliest date and its reading (the first seen among equal dates).
    pub first: (NaiveDate, Thickness),
    /// Latest date and its reading (the last seen among equal dates).
    pub last: (NaiveDate, Thickness),
    /// Elevation of the latest reading that gives one.
    pub elevation: Option<Length>,
    /// Azimuth of the latest reading that gives one.
    pub azimuth: Option<f64>,
}

impl PointSpan {
    /// A point seen once.
    pub fn new(
        course: u32,
        reading: (NaiveDate, Thickness),
        elevation: Option<Length>,
        azimuth: Option<f64>,
    ) -> Self {
        PointSpan {
            course,
            surveys: 1,
            first: reading,
            last: reading,
            elevation,
            azimuth,
        }
    }
    /// One more reading of the point; a reading at least as late as every earlier one
    /// updates the position (elevation, azimuth) where it gives one.
    pub fn add(
        &mut self,
        reading: (NaiveDate, Thickness),
        elevation: Option<Length>,
        azimuth: Option<f64>,
    ) {
        self.surveys += 1;
        if reading.0 < self.first.0 {
            self.first = reading;
        }
        if reading.0 >= self.last.0 {
            self.last = reading;
            self.elevation = elevation.or(self.elevation);
            self.azimuth = azimuth.or(self.azimuth);
        }
    }
}

/// Rate and remaining life of one point, against its course's `t_min`.
pub fn point_result(history: &PointHistory, t_min: Thickness) -> Option<PointResult> {
    let span = PointSpan {
        course: history.course,
        surveys: history.readings.len(),
        first: *history.readings.first()?,
        last: *history.readings.last()?,
        elevation: history.elevation,
        azimuth: history.azimuth,
    };
    Some(point_result_of(history.point.clone(), &span, t_min))
}

/// [`point_result`] of the point `point` gathered as a [`PointSpan`].
pub fn point_result_of(point: String, span: &PointSpan, t_min: Thickness) -> PointResult {
    let (first, last) = (span.first, span.last);
    let years = years_between(first.0, last.0);
    let rate = (span.surveys >= 2 && years > 0.0).then(|| Rate((first.1.0 - last.1.0) / years));
    let life = remaining_life(last.1, t_min, rate.map(|r| Rate(r.0.max(0.0))));
    PointResult {
        point,
        course: span.course,
        elevation: span.elevation,
        azimuth: span.azimuth,
        surveys: span.surveys,
        first,
        last,
        rate,
        remaining_life: life,
    }
}

/// Indices of the worst points: thinning points ordered by remaining life, then by
/// rate (fastest first), at most [`HOT_SPOT_COUNT`].
pub fn hot_spots(points: &[PointResult]) -> Vec<usize> {
    let mut idx: Vec<usize> = points
        .iter()
        .enumerate()
        .filter(|(_, p)| {
            p.rate.is_some_and(|r| r.0 > 0.0) || p.remaining_life == RemainingLife::Years(0.0)
        })
        .map(|(i, _)| i)
        .collect();
    idx.sort_by(|&a, &b| {
        let (pa, pb) = (&points[a], &points[b]);
        pa.remaining_life
            .sort_key()
            .partial_cmp(&pb.remaining_life.sort_key())
            .unwrap_or(std::cmp::Ordering::Equal)
            .then_with(|| {
                let ra = pa.rate.map_or(0.0, |r| r.0);
                let rb = pb.rate.map_or(0.0, |r| r.0);
                rb.partial_cmp(&ra).unwrap_or(std::cmp::Ordering::Equal)
            })
            .then_with(|| (pa.course, &pa.point).cmp(&(pb.course, &pb.point)))
    });
    idx.truncate(HOT_SPOT_COUNT);
    idx
}

#[cfg(test)]
mod tests {
    use super::*;

    fn d(y: i32) -> NaiveDate {
        NaiveDate::from_ymd_opt(y, 6, 1).expect("date")
    }

    fn hist(id: &str, r: &[(i32, f64)]) -> PointHistory {
        PointHistory {
            point: id.to_string(),
            course: 1,
            readings: r.iter().map(|&(y, t)| (d(y), Thickness(t))).collect(),
            elevation: None,
            azimuth: None,
        }
    }

    /// Hand: 2004 12.0 -> 2024 11.0 over 7305 days = 20 y: rate 0.05 mm/y;
    /// t_min 10.0: RL = (11.0 - 10.0) / 0.05 = 20 y.
    #[test]
    fn point_rate_by_hand() {
        let p = point_result(
            &hist("A1", &[(2004, 12.0), (2014, 11.6), (2024, 11.0)]),
            Thickness(10.0),
        )
        .expect("readings");
        assert!((p.rate.expect("two dates").0 - 0.05).abs() < 1e-12);
        assert!((p.remaining_life.years().expect("finite") - 20.0).abs() < 1e-9);
        let single = point_result(&hist("A2", &[(2024, 11.0)]), Thickness(10.0)).expect("one");
        assert_eq!(single.rate, None);
        assert_eq!(single.remaining_life, RemainingLife::Unknown);
    }

    #[test]
    fn hot_spots_order() {
        let t_min = Thickness(10.0);
        let pts: Vec<PointResult> = [
            hist("slow", &[(2004, 12.0), (2024, 11.8)]),
            hist("fast", &[(2004, 12.0), (2024, 10.5)]),
            hist("thick", &[(2004, 12.0), (2024, 12.2)]),
            hist("below", &[(2004, 10.2), (2024, 9.9)]),
        ]
        .iter()
        .filter_map(|h| point_result(h, t_min))
        .collect();
        let order: Vec<&str> = hot_spots(&pts)
            .iter()
            .map(|&i| pts[i].point.as_str())
            .collect();
        assert_eq!(order, ["below", "fast", "slow"]);
    }
}
