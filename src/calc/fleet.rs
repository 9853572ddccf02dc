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

use super::life::Status;
use super::units::Length;
use crate::model::fleet::{FleetEntry, FleetTank, TankStatus};
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
        below_minimum: s.below_minimum.clone(),
        warnings: a.warnings.len(),
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
            below_minimum: Vec::new(),
            warnings: 0,
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
