//! Fleet planning: each tank's assessment reduced to one line, and the lines put in
//! planning order.
//!
//! No method of its own: the values come from the assessment (assess.rs). Rules of
//! this project:
//! - next due date = the earlier of the next UT survey and the next external
//!   inspection (API 653 6.3 intervals, life.rs);
//! - tank status = the worst course status: below-minimum, then no-readings (a course
//!   never measured cannot be shown fit), then monitor, then ok;
//! - allowable fill height = the least over measured courses (shell.rs), at most the
//!   shell height; restricted when it is below the operating maximum;
//! - order: next due date, earliest first; ties by tank id, then folder; folders that
//!   failed last, by folder.

use chrono::{Datelike, NaiveDate};

use super::constants::MONITOR_REMAINING_LIFE_YEARS;
use super::life::Status;
use super::units::Length;
use crate::model::fleet::{
    DueMonth, DueYear, Fleet, FleetEntry, FleetSeries, FleetTank, LifeBar, TankStatus,
};
use crate::model::result::{Assessment, FillLimit};

fn capped(limit: Option<FillLimit>, shell: Length) -> Option<Length> {
    limit.map(|l| Length(l.level.0.min(shell.0)))
}

/// One tank's line from its assessment.
pub fn fleet_tank(folder: String, a: &Assessment) -> FleetTank {
    let s = &a.summary;
    let shell = a.tank.shell_height();
    let status = a
        .courses
        .iter()
        .map(|c| match &c.condition {
            None => TankStatus::NoReadings,
            Some(k) => match k.status {
                Status::BelowMinimum => TankStatus::BelowMinimum,
                Status::Monitor => TankStatus::Monitor,
                Status::Ok => TankStatus::Ok,
            },
        })
        .min()
        .unwrap_or(TankStatus::NoReadings);
    let next_due = match (s.next_ut_inspection, s.next_external_inspection) {
        (Some(u), Some(e)) => Some(u.min(e)),
        (u, e) => u.or(e),
    };
    let allowable = capped(s.max_fill_height, shell);
    FleetTank {
        folder,
        tank_id: a.tank.id.clone(),
        name: a.tank.name.clone(),
        units: a.tank.units,
        latest_survey: a.latest_survey,
        status,
        next_due,
        next_ut_inspection: s.next_ut_inspection,
        next_external_inspection: s.next_external_inspection,
        governing_course: s.governing_course,
        remaining_life: s.remaining_life,
        allowable_fill_height: allowable,
        allowable_fill_height_course: s
            .max_fill_height
            .filter(|l| l.level.0 < shell.0)
            .map(|l| l.course),
        allowable_fill_height_next: capped(s.max_fill_height_next, shell),
        operating_fill_height: a.tank.max_fill_height,
        shell_height: shell,
        fill_restricted: allowable.is_some_and(|h| h.0 < a.tank.max_fill_height.0),
        fill_restricted_next: capped(s.max_fill_height_next, shell)
            .is_some_and(|h| h.0 < a.tank.max_fill_height.0),
        below_minimum: s.below_minimum.clone(),
        warnings: a.warnings.len(),
        report: None,
    }
}

/// The first day of the month of `d`.
fn month_of(d: NaiveDate) -> NaiveDate {
    d.with_day(1).unwrap_or(d)
}

/// The first day of the month after `m`.
fn next_month(m: NaiveDate) -> NaiveDate {
    m.checked_add_months(chrono::Months::new(1))
        .unwrap_or(NaiveDate::MAX)
}

/// What the fleet page's charts draw (no method of its own: counts and an order):
/// - inspections due per calendar month and year: each assessed tank's next UT
///   survey and next external inspection, counted in the month they fall due, over
///   every month from the first due date to the last;
/// - each assessed tank's governing course and remaining life, least first, with the
///   remaining life under which a course is to be monitored (life.rs).
pub fn fleet_series(fleet: &Fleet) -> FleetSeries {
    let tanks: Vec<&FleetTank> = fleet.tanks().collect();
    let dues: Vec<(NaiveDate, bool)> = tanks
        .iter()
        .flat_map(|t| {
            [
                t.next_ut_inspection.map(|d| (month_of(d), true)),
                t.next_external_inspection.map(|d| (month_of(d), false)),
            ]
        })
        .flatten()
        .collect();
    let mut counts: std::collections::BTreeMap<NaiveDate, (usize, usize)> = Default::default();
    for (month, ut) in dues {
        let c = counts.entry(month).or_default();
        if ut {
            c.0 += 1;
        } else {
            c.1 += 1;
        }
    }
    let mut due_months = Vec::new();
    if let (Some(&first), Some(&last)) = (counts.keys().next(), counts.keys().next_back()) {
        let mut m = first;
        while m <= last {
            let (ut, external) = counts.get(&m).copied().unwrap_or_default();
            due_months.push(DueMonth {
                month: m,
                ut,
                external,
            });
            m = next_month(m);
        }
    }
    let mut due_years: Vec<DueYear> = Vec::new();
    for m in &due_months {
        match due_years.last_mut() {
            Some(y) if y.year == m.month.year() => {
                y.ut += m.ut;
                y.external += m.external;
            }
            _ => due_years.push(DueYear {
                year: m.month.year(),
                ut: m.ut,
                external: m.external,
            }),
        }
    }
    let mut lives: Vec<LifeBar> = tanks
        .iter()
        .map(|t| LifeBar {
            tank_id: t.tank_id.clone(),
            folder: t.folder.clone(),
            governing_course: t.governing_course,
            life: t.remaining_life,
            status: t.status,
        })
        .collect();
    lives.sort_by(|a, b| {
        let key = |l: &LifeBar| l.life.map_or((3, 0.0), |r| r.sort_key());
        let (ka, kb) = (key(a), key(b));
        ka.0.cmp(&kb.0)
            .then_with(|| ka.1.total_cmp(&kb.1))
            .then_with(|| a.tank_id.cmp(&b.tank_id))
            .then_with(|| a.folder.cmp(&b.folder))
    });
    FleetSeries {
        due_months,
        due_years,
        lives,
        monitor_years: MONITOR_REMAINING_LIFE_YEARS,
    }
}

/// Puts fleet entries in planning order (see the module note). The order depends
/// only on the entries, never on the order they were assessed in.
pub fn order_fleet(entries: &mut [FleetEntry]) {
    entries.sort_by(|a, b| match (a, b) {
        (FleetEntry::Tank(x), FleetEntry::Tank(y)) => {
            let due = |t: &FleetTank| (t.next_due.is_none(), t.next_due);
            due(x)
                .cmp(&due(y))
                .then_with(|| x.tank_id.cmp(&y.tank_id))
                .then_with(|| x.folder.cmp(&y.folder))
        }
        (FleetEntry::Tank(_), FleetEntry::Failed { .. }) => std::cmp::Ordering::Less,
        (FleetEntry::Failed { .. }, FleetEntry::Tank(_)) => std::cmp::Ordering::Greater,
        (FleetEntry::Failed { folder: x, .. }, FleetEntry::Failed { folder: y, .. }) => x.cmp(y),
    });
}

#[cfg(test)]
mod tests {
    use chrono::NaiveDate;

    use super::*;
    use crate::calc::life::RemainingLife;
    use crate::calc::units::UnitSystem;

    fn line(id: &str, folder: &str, due: Option<(i32, u32, u32)>) -> FleetEntry {
        let d = due.and_then(|(y, m, d)| NaiveDate::from_ymd_opt(y, m, d));
        FleetEntry::Tank(Box::new(FleetTank {
            folder: folder.into(),
            tank_id: id.into(),
            name: None,
            units: UnitSystem::Si,
            latest_survey: NaiveDate::from_ymd_opt(2020, 1, 1).expect("date"),
            status: TankStatus::Ok,
            next_due: d,
            next_ut_inspection: d,
            next_external_inspection: d,
            governing_course: Some(1),
            remaining_life: None,
            allowable_fill_height: None,
            allowable_fill_height_course: None,
            allowable_fill_height_next: None,
            operating_fill_height: Length(10.0),
            shell_height: Length(12.0),
            fill_restricted: false,
            fill_restricted_next: false,
            below_minimum: Vec::new(),
            warnings: 0,
            report: None,
        }))
    }

    fn failed(folder: &str) -> FleetEntry {
        FleetEntry::Failed {
            folder: folder.into(),
            tank_id: None,
            message: "broken".into(),
        }
    }

    /// Planning order (this project's rule): earliest due date first, ties by tank id
    /// then folder, no due date after every date, failed folders last by folder; the
    /// result does not depend on the input order.
    #[test]
    fn planning_order() {
        let mut a = vec![
            failed("z"),
            line("T2", "b", Some((2030, 1, 1))),
            line("T9", "a", Some((2027, 5, 1))),
            failed("c"),
            line("T1", "d", Some((2030, 1, 1))),
            line("T1", "a", Some((2030, 1, 1))),
            line("T0", "e", None),
        ];
        let mut b = a.clone();
        b.reverse();
        order_fleet(&mut a);
        order_fleet(&mut b);
        assert_eq!(a, b);
        let folders: Vec<&str> = a.iter().map(FleetEntry::folder).collect();
        assert_eq!(folders, ["a", "a", "d", "b", "e", "c", "z"]);
    }

    fn tank(
        id: &str,
        ut: Option<(i32, u32, u32)>,
        ext: Option<(i32, u32, u32)>,
        life: Option<RemainingLife>,
    ) -> FleetEntry {
        let d =
            |x: Option<(i32, u32, u32)>| x.and_then(|(y, m, d)| NaiveDate::from_ymd_opt(y, m, d));
        let mut e = line(id, id, None);
        if let FleetEntry::Tank(t) = &mut e {
            t.next_ut_inspection = d(ut);
            t.next_external_inspection = d(ext);
            t.remaining_life = life;
        }
        e
    }

    /// Counted by hand: A (UT 2027-03-31, external 2026-12-15), B (UT 2027-03-02,
    /// external 2027-01-10), C (external 2026-12-01, no UT date), a failed folder (not
    /// counted). Months December 2026 to March 2027: Dec 0 UT + 2 external (A, C),
    /// Jan 0 + 1 (B), Feb 0 + 0, Mar 2 + 0 (A, B); years 2026: 0 + 2, 2027: 2 + 1.
    #[test]
    fn due_dates_counted_by_month_and_year() {
        let fleet = Fleet {
            root: "r".into(),
            entries: vec![
                tank("A", Some((2027, 3, 31)), Some((2026, 12, 15)), None),
                tank("B", Some((2027, 3, 2)), Some((2027, 1, 10)), None),
                tank("C", None, Some((2026, 12, 1)), None),
                failed("z"),
            ],
        };
        let s = fleet_series(&fleet);
        let m = |y, mo| NaiveDate::from_ymd_opt(y, mo, 1).expect("date");
        let got: Vec<(NaiveDate, usize, usize)> = s
            .due_months
            .iter()
            .map(|d| (d.month, d.ut, d.external))
            .collect();
        assert_eq!(
            got,
            [
                (m(2026, 12), 0, 2),
                (m(2027, 1), 0, 1),
                (m(2027, 2), 0, 0),
                (m(2027, 3), 2, 0)
            ]
        );
        let years: Vec<(i32, usize, usize)> = s
            .due_years
            .iter()
            .map(|y| (y.year, y.ut, y.external))
            .collect();
        assert_eq!(years, [(2026, 0, 2), (2027, 2, 1)]);
        // Every due date is counted once.
        let total: usize = s.due_months.iter().map(|d| d.ut + d.external).sum();
        assert_eq!(total, 5);
        assert_eq!(s.monitor_years, 10.0);
    }

    /// Least remaining life first; no measurable loss after every finite life; no
    /// rate (or no course with one) last; ties by tank id.
    #[test]
    fn lives_sorted_least_first() {
        let fleet = Fleet {
            root: "r".into(),
            entries: vec![
                tank("N", None, None, Some(RemainingLife::NoMeasurableLoss)),
                tank("U", None, None, Some(RemainingLife::Unknown)),
                tank("X", None, None, None),
                tank("B", None, None, Some(RemainingLife::Years(12.5))),
                tank("A", None, None, Some(RemainingLife::Years(12.5))),
                tank("Z", None, None, Some(RemainingLife::Years(0.0))),
                failed("f"),
            ],
        };
        let s = fleet_series(&fleet);
        let ids: Vec<&str> = s.lives.iter().map(|l| l.tank_id.as_str()).collect();
        assert_eq!(ids, ["Z", "A", "B", "N", "U", "X"]);
        assert!(s.due_months.is_empty() && s.due_years.is_empty());
    }

    /// Worst status first: below-minimum, no-readings, monitor, ok.
    #[test]
    fn status_rank() {
        let mut s = [
            TankStatus::Ok,
            TankStatus::Monitor,
            TankStatus::NoReadings,
            TankStatus::BelowMinimum,
        ];
        s.sort();
        assert_eq!(
            s.map(TankStatus::name),
            ["below-minimum", "no-readings", "monitor", "ok"]
        );
    }
}
