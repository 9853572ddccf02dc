//! Projections the report's charts draw: a course's thickness carried forward at a
//! constant corrosion rate, the date it meets t_min, and the allowable liquid level
//! of every course over the coming years.
//!
//! Sources:
//! - the straight-line projection behind remaining life (API 653 4.4.5 and 6.3, from
//!   memory; methods.md s.6): t(y) = t_0 - N y, which meets t_min after
//!   (t_0 - t_min) / N years, the same arithmetic as the remaining life;
//! - the one-foot relation inverted (API 653 4.3.3.1, methods.md s.4) applied to the
//!   projected thickness: H_max(y) = S E t(y) / (4.9 D G) + 0.3 + z_bottom
//!   [USC: 2.6, 1 ft], least over courses;
//! - a scanned area's level: its local rules inverted (API 653 4.3.2 with the local
//!   t_min of 4.3.3.1, area.rs `area_fill_limit`), its thicknesses less N y;
//! - the operating maximum liquid level stays allowed while every course under it
//!   keeps t >= t_min at that level, that is until the earliest retirement date of
//!   those courses (the round trip t_min(H_max(t)) = t of methods.md s.4), and while
//!   every scanned area's level stays at or above it.
//!
//! How far ahead the charts look and the step of the outlook are this project's
//! presentation choices (constants.rs, "Chart projections"), not a method.
//!
//! Symbols: t_0 thickness at the start (tank thickness unit), N corrosion rate
//! (thinning positive, thickness unit per year), y years after the start.

use chrono::{Duration, NaiveDate};

use super::area::{AreaAssessment, area_fill_limit};
use super::constants::{
    CHART_HORIZON_MAX_YEARS, CHART_HORIZON_MIN_YEARS, DAYS_PER_YEAR, OUTLOOK_STEP_YEARS,
};
use super::life::add_years;
use super::rates::years_between;
use super::shell::max_fill_height;
use super::units::{Length, Rate, Thickness};
use crate::model::result::{Assessment, CourseCondition};
use crate::model::series::{
    AreaOutlook, CourseOutlook, FillOutlook, LevelDate, OutlookLimit, ThicknessLine,
};

/// The last date the charts carry projections to: at least
/// [`CHART_HORIZON_MIN_YEARS`] after the latest survey, and long enough to show the
/// shortest remaining life (plus one year) when that is at most
/// [`CHART_HORIZON_MAX_YEARS`].
pub fn chart_horizon(latest: NaiveDate, least_life_years: Option<f64>) -> NaiveDate {
    let years = match least_life_years {
        Some(y) if y.is_finite() && (0.0..=CHART_HORIZON_MAX_YEARS).contains(&y) => {
            (y.ceil() + 1.0).clamp(CHART_HORIZON_MIN_YEARS, CHART_HORIZON_MAX_YEARS)
        }
        _ => CHART_HORIZON_MIN_YEARS,
    };
    add_years(latest, years).unwrap_or(latest)
}

/// The straight line t(y) = t_0 - N y from `start`, carried until it meets `t_min`
/// or reaches `horizon`, whichever comes first. A line that starts below t_min, or
/// does not thin (N <= 0), never "meets" it and runs to the horizon.
pub fn trend_line(
    start: NaiveDate,
    t0: Thickness,
    rate: Rate,
    t_min: Thickness,
    horizon: NaiveDate,
) -> ThicknessLine {
    let horizon = horizon.max(start);
    let reaches_t_min = if rate.0 > 0.0 && t0.0 >= t_min.0 {
        add_years(start, (t0.0 - t_min.0) / rate.0).filter(|d| *d <= horizon)
    } else {
        None
    };
    let end = match reaches_t_min {
        Some(d) => (d, t_min),
        None => (horizon, t0.after(rate, years_between(start, horizon))),
    };
    ThicknessLine {
        start: (start, t0),
        end,
        reaches_t_min,
    }
}

/// The dates of the outlook: `start`, then every [`OUTLOOK_STEP_YEARS`] (as days,
/// step x 365.25, rounded), the last one on `horizon` (a step less than half a step
/// before the horizon is dropped).
pub fn outlook_dates(start: NaiveDate, horizon: NaiveDate) -> Vec<NaiveDate> {
    let span = years_between(start, horizon);
    let mut dates = vec![start];
    if span <= 0.0 {
        return dates;
    }
    let step_days = OUTLOOK_STEP_YEARS * DAYS_PER_YEAR;
    for i in 1.. {
        let date = start + Duration::days((i as f64 * step_days).round() as i64);
        // A step closer to the horizon than half a step is left to the horizon itself.
        if ((horizon - date).num_days() as f64) < step_days / 2.0 {
            break;
        }
        dates.push(date);
    }
    dates.push(horizon);
    dates
}

/// Allowable liquid level of every measured course and every scanned area at each of
/// `dates`, and their least. A course's thickness is carried forward from its own
/// latest survey at its governing rate and put through the inverted one-foot relation
/// (methods.md s.4); an area's thicknesses (every window, t2, the least pit) lose
/// N x years from the first date at its course's rate and go through the inverted
/// local rules (area.rs, `area_fill_limit`). Without a rate, a course or area has its
/// level of today at the first date only; later levels cannot be projected and are
/// missing (None), and so is the envelope on those dates.
pub fn fill_outlook(a: &Assessment, dates: &[NaiveDate]) -> FillOutlook {
    let start = dates.first().copied().unwrap_or(a.latest_survey);
    let courses: Vec<CourseOutlook> = a
        .courses
        .iter()
        .filter_map(|c| {
            let k = c.condition.as_ref()?;
            let levels = dates
                .iter()
                .enumerate()
                .map(|(i, &d)| course_level(k, d).or((i == 0).then_some(k.max_fill_height.value)))
                .collect();
            Some(CourseOutlook {
                course: c.number,
                levels,
            })
        })
        .collect();
    let areas: Vec<AreaOutlook> = a
        .areas
        .iter()
        .enumerate()
        .map(|(i, area)| AreaOutlook {
            area: i,
            course: area.scan.course,
            levels: dates
                .iter()
                .enumerate()
                .map(|(j, &d)| {
                    let years = if j == 0 {
                        Some(0.0)
                    } else {
                        area.future.rate.map(|_| years_between(start, d))
                    };
                    years.and_then(|y| area_level(area, y))
                })
                .collect(),
        })
        .collect();
    let envelope = (0..dates.len())
        .map(|i| {
            let candidates = courses
                .iter()
                .map(|c| (c.levels[i], c.course, None))
                .chain(areas.iter().map(|x| (x.levels[i], x.course, Some(x.area))));
            let mut best: Option<OutlookLimit> = None;
            for (level, course, area) in candidates {
                let level = level?;
                if best.is_none_or(|b| level.0 < b.level.0) {
                    best = Some(OutlookLimit {
                        level,
                        course,
                        area,
                    });
                }
            }
            best
        })
        .collect();
    let horizon = dates.last().copied().unwrap_or(start);
    FillOutlook {
        dates: dates.to_vec(),
        courses,
        areas,
        envelope,
        operating_level_until: operating_level_until(a, start, horizon),
    }
}

/// A course's allowable level on `date`, its thickness carried from its own latest
/// survey at its governing rate (None without a rate).
fn course_level(k: &CourseCondition, date: NaiveDate) -> Option<Length> {
    let n = k.rate_value()?;
    let y = years_between(k.latest.date, date).max(0.0);
    Some(max_fill_height(k.max_fill_height.load, k.t_actual().after(n, y)).value)
}

/// An area's allowable level after `years` of corrosion at its course's rate.
fn area_level(area: &AreaAssessment, years: f64) -> Option<Length> {
    let loss = Thickness(area.future.rate.map_or(0.0, |n| n.0.max(0.0)) * years.max(0.0));
    area_fill_limit(area, area.load.specific_gravity, loss).map(|l| l.calc.value)
}

/// The first date on which the operating maximum liquid level is no longer allowed.
///
/// - A course whose bottom lies below that level stops allowing it on its retirement
///   date (the round trip t_min(H_max(t)) = t of methods.md s.4); a course wholly
///   above the liquid never limits it.
/// - A scanned area stops allowing it on the first day its level, after corrosion
///   from `start`, falls below it: found by halving the days between `start` and
///   `horizon` (the level only falls as the area thins); `start` when it is below
///   already, None when it still allows the level at the horizon.
///
/// The earliest of these, or None.
pub fn operating_level_until(
    a: &Assessment,
    start: NaiveDate,
    horizon: NaiveDate,
) -> Option<LevelDate> {
    let op = a.tank.max_fill_height;
    let from_courses = a
        .courses
        .iter()
        .filter(|c| c.bottom_elevation.0 < op.0)
        .filter_map(|c| {
            let date = c.condition.as_ref()?.retirement_date?;
            Some(LevelDate {
                date,
                course: c.number,
                area: None,
            })
        });
    let from_areas = a.areas.iter().enumerate().filter_map(|(i, area)| {
        let below = |days: i64| {
            let y = days as f64 / DAYS_PER_YEAR;
            area_level(area, y).is_some_and(|l| l.0 < op.0)
        };
        let date = if below(0) {
            start
        } else {
            area.future.rate?;
            let mut hi = (horizon - start).num_days();
            if hi <= 0 || !below(hi) {
                return None;
            }
            let mut lo = 0;
            while hi - lo > 1 {
                let mid = lo + (hi - lo) / 2;
                if below(mid) { hi = mid } else { lo = mid }
            }
            start + Duration::days(hi)
        };
        Some(LevelDate {
            date,
            course: area.scan.course,
            area: Some(i),
        })
    });
    from_courses
        .chain(from_areas)
        .min_by_key(|d| (d.date, d.course, d.area))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn d(y: i32, m: u32, day: u32) -> NaiveDate {
        NaiveDate::from_ymd_opt(y, m, day).expect("valid test date")
    }

    /// Horizon: least life 9.5 y -> ceil 10 + 1 = 11 -> at least 15 -> 2041-05-19;
    /// 20.2 y -> 21 + 1 = 22 -> 2048-05-19; 29.5 -> 31 -> capped at 30; 45 y and no
    /// life -> 15 y.
    #[test]
    fn horizon_by_hand() {
        let latest = d(2026, 5, 19);
        assert_eq!(chart_horizon(latest, Some(9.5)), d(2041, 5, 19));
        assert_eq!(chart_horizon(latest, Some(20.2)), d(2048, 5, 19));
        assert_eq!(chart_horizon(latest, Some(29.5)), d(2056, 5, 19));
        assert_eq!(chart_horizon(latest, Some(45.0)), d(2041, 5, 19));
        assert_eq!(chart_horizon(latest, None), d(2041, 5, 19));
    }

    /// Hand: t_0 13.41 mm on 2026-05-19, N 0.097 mm/y, t_min 12.49 mm:
    /// (13.41 - 12.49) / 0.097 = 0.92 / 0.097 = 9.48454 y -> 9 calendar years to
    /// 2035-05-19, then 0.48454 x 365.25 = 176.98 -> 177 days: May 19 + 12 = May 31,
    /// + 30 June, + 31 July, + 31 Aug, + 30 Sept, + 31 Oct = 165 days, + 12 = Nov 12.
    #[test]
    fn meets_t_min_by_hand() {
        let l = trend_line(
            d(2026, 5, 19),
            Thickness(13.41),
            Rate(0.097),
            Thickness(12.49),
            d(2041, 5, 19),
        );
        assert_eq!(l.reaches_t_min, Some(d(2035, 11, 12)));
        assert_eq!(l.end, (d(2035, 11, 12), Thickness(12.49)));
        assert_eq!(l.start, (d(2026, 5, 19), Thickness(13.41)));
    }

    /// Hand: N 0.01 mm/y meets t_min after 92 y, beyond the horizon; the line ends on
    /// the horizon: 2026-05-19 to 2041-05-19 is 15 x 365 + 4 leap days (2028, 2032,
    /// 2036, 2040) = 5479 days = 15.000684 y; 13.41 - 0.01 x 15.000684 = 13.259993.
    #[test]
    fn runs_to_the_horizon_by_hand() {
        let l = trend_line(
            d(2026, 5, 19),
            Thickness(13.41),
            Rate(0.01),
            Thickness(12.49),
            d(2041, 5, 19),
        );
        assert_eq!(l.reaches_t_min, None);
        assert_eq!(l.end.0, d(2041, 5, 19));
        assert!((l.end.1.0 - 13.259_993).abs() < 1e-6, "{}", l.end.1.0);
    }

    /// Edge cases: zero rate is flat; a start below t_min never "meets" it; a horizon
    /// before the start collapses onto the start.
    #[test]
    fn trend_edges() {
        let flat = trend_line(
            d(2020, 1, 1),
            Thickness(10.0),
            Rate(0.0),
            Thickness(8.0),
            d(2035, 1, 1),
        );
        assert_eq!(flat.end, (d(2035, 1, 1), Thickness(10.0)));
        assert_eq!(flat.reaches_t_min, None);
        let below = trend_line(
            d(2020, 1, 1),
            Thickness(7.9),
            Rate(0.1),
            Thickness(8.0),
            d(2035, 1, 1),
        );
        assert_eq!(below.reaches_t_min, None);
        assert_eq!(below.end.0, d(2035, 1, 1));
        let back = trend_line(
            d(2020, 1, 1),
            Thickness(10.0),
            Rate(0.1),
            Thickness(8.0),
            d(2019, 1, 1),
        );
        assert_eq!(back.end, (d(2020, 1, 1), Thickness(10.0)));
    }

    /// Steps: one year from 2020-01-01 in quarters: round(0.25 x 365.25) = 91 days ->
    /// 2020-04-01 (2020 is a leap year: 31 + 29 + 31 = 91); 183 days -> 2020-07-02;
    /// 274 days -> 2020-10-01; 365 days -> 2020-12-31 is one day before the horizon
    /// (less than half a step) and gives way to the horizon itself.
    #[test]
    fn outlook_steps_by_hand() {
        let dates = outlook_dates(d(2020, 1, 1), d(2021, 1, 1));
        assert_eq!(
            dates,
            [
                d(2020, 1, 1),
                d(2020, 4, 1),
                d(2020, 7, 2),
                d(2020, 10, 1),
                d(2021, 1, 1)
            ]
        );
        assert_eq!(outlook_dates(d(2020, 1, 1), d(2020, 1, 1)), [d(2020, 1, 1)]);
    }
}
