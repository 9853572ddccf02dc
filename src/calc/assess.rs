//! Assessment of a whole tank: every method of methods.md s.3, s.4 and s.6 applied to
//! each course, then the tank-level verdict.
//!
//! Order of work (each step is a function of the modules beside this one):
//! 1. group readings by course and survey date, reduce each group (survey.rs); this
//!    is done while the readings stream past (tally.rs), so that no reading is kept;
//! 2. per course: S (stress.rs), t_min and H_max (shell.rs), rates (rates.rs),
//!    remaining life, status and intervals (life.rs);
//! 3. tank: the least UT and external intervals over courses with a known rate
//!    (API 653 6.3), due dates from the latest survey, the governing course (least
//!    remaining life, the lower course on a tie), the allowable liquid level now and
//!    after the UT interval at each course's governing rate;
//! 4. points: per-location rates and the hot spots (points.rs);
//! 5. scanned areas (area.rs): the local-area rules with corrosion at the course's
//!    governing rate over the tank's UT interval, and the level each area allows, which
//!    joins the courses' in the tank's allowable level; per course, the extreme-value
//!    estimate of its thinnest spot from its drops (extreme.rs) and the uniformity
//!    check of its readings (COV, methods.md s.5).

use std::collections::BTreeMap;

use chrono::NaiveDate;

use super::area::{AreaAssessment, FutureLoss, assess_area};
use super::constants::COV_UNIFORM_LIMIT;
use super::extreme::extreme_value;
use super::life::{
    IntervalBasis, IntervalKind, RemainingLife, add_years, interval, remaining_life, status,
};
use super::points::{hot_spots, point_result_of};
use super::rates::{BasisPoint, governing_rate, long_term, regression, short_term};
use super::shell::{CourseLoad, max_fill_height, whole_course_t_min};
use super::stress::in_service_stress;
use super::survey::{CourseSurvey, course_survey_of};
use super::tally::Tally;
use super::units::{Length, Thickness};
use crate::calc::life::Status;
use crate::model::reading::{PointNames, ReadingSet, ReadingSink};
use crate::model::result::{
    Assessment, CourseCondition, CourseResult, FillLimit, Overrides, SurveyInfo, TankInterval,
    TankSummary,
};
use crate::model::scan::Scan;
use crate::model::tank::{Construction, Material, RateBasis, Tank};
use crate::model::warning::{Shown, Warning};

/// What-if values and the assessment date.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct AssessOptions {
    /// Use only surveys up to this date.
    pub as_of: Option<NaiveDate>,
    /// Specific gravity instead of the tank file's.
    pub specific_gravity: Option<f64>,
    /// Maximum liquid level instead of the tank file's.
    pub fill_height: Option<Length>,
    /// Leave out the per-point results (`points`, `hot_spots` stay empty): for callers
    /// that show none of them, such as the fleet table. Every other value is the same.
    pub skip_points: bool,
}

/// Why a tank cannot be assessed at all.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum AssessError {
    /// No readings at all.
    #[error("no thickness readings: put survey files (*.csv) in the tank's surveys/ folder")]
    NoReadings,
    /// No readings up to the as-of date.
    #[error("no survey on or before {as_of} (--as-of); the earliest survey is {earliest}")]
    NoneBeforeAsOf {
        /// The as-of date.
        as_of: NaiveDate,
        /// The earliest survey.
        earliest: NaiveDate,
    },
}

/// Assesses `tank` from `readings` (kept in memory; see [`assess_tally`] for readings
/// gathered while they stream past).
pub fn assess(
    tank: &Tank,
    readings: &ReadingSet,
    options: AssessOptions,
) -> Result<Assessment, AssessError> {
    let mut tally = Tally::new(tank, options);
    let mut names = PointNames::default();
    for r in &readings.readings {
        tally.accept(&r.borrow(&mut names));
    }
    assess_tally(tank, &tally, &names, &readings.files, &readings.scans)
}

/// Assesses `tank` from the tally of its readings; `names` holds the point ids the
/// tally's keys stand for, `files` the files the readings came from (index =
/// `Origin::file`), for the warnings; `all_scans` the tank's grid scans.
pub fn assess_tally(
    tank: &Tank,
    tally: &Tally,
    names: &PointNames,
    files: &[String],
    all_scans: &[Scan],
) -> Result<Assessment, AssessError> {
    let options = tally.options;
    let mut tank = tank.clone();
    let mut overrides = Overrides::default();
    if let Some(g) = options.specific_gravity {
        overrides.specific_gravity_from_file = Some(tank.specific_gravity);
        tank.specific_gravity = g;
    }
    if let Some(h) = options.fill_height {
        overrides.fill_height_from_file = Some(tank.max_fill_height);
        tank.max_fill_height = h;
    }
    let units = tank.units;
    let mut warnings = Vec::new();

    // 1. Readings up to the as-of date, grouped by course and date (tally.rs).
    let latest_survey = match (
        tally.groups().map(|g| g.date).max(),
        options.as_of,
        tally.earliest,
    ) {
        (Some(d), _, _) => d,
        (None, Some(as_of), Some(earliest)) => {
            return Err(AssessError::NoneBeforeAsOf { as_of, earliest });
        }
        _ => return Err(AssessError::NoReadings),
    };
    let as_of = options.as_of.unwrap_or(latest_survey);
    if tally.excluded > 0 {
        warnings.push(Warning::ReadingsAfterAsOf {
            count: tally.excluded,
            as_of,
        });
    }
    let locate = |origin: crate::model::reading::Origin| {
        let file = files.get(origin.file as usize).map_or("?", String::as_str);
        format!("{file}:{}", origin.line)
    };
    for s in &tally.suspects {
        warnings.push(Warning::SuspectReading {
            location: locate(s.origin),
            course: s.course,
            thickness: Shown::thickness(s.thickness, units).significant(),
            nominal: Shown::thickness(s.nominal, units),
            kind: s.kind,
        });
    }
    for m in &tally.misplaced {
        warnings.push(Warning::ElevationOutsideCourse {
            location: locate(m.origin),
            course: m.course,
            elevation: Shown::length(m.elevation, units),
            bottom: Shown::length(m.bottom, units),
            top: Shown::length(m.top, units),
        });
    }
    let mut per_date: BTreeMap<NaiveDate, usize> = BTreeMap::new();
    for g in tally.groups() {
        *per_date.entry(g.date).or_default() += g.stats.count();
    }
    let surveys = per_date
        .iter()
        .map(|(&date, &n)| SurveyInfo { date, readings: n })
        .collect();

    // Scans up to the as-of date (all of them without --as-of).
    let scans: Vec<_> = all_scans
        .iter()
        .filter(|s| options.as_of.is_none_or(|d| s.date <= d))
        .collect();
    let late_scans = all_scans.len() - scans.len();
    if late_scans > 0 {
        warnings.push(Warning::ScansAfterAsOf {
            count: late_scans,
            as_of,
        });
    }
    let scanned = |course: u32| scans.iter().any(|s| s.course == course);

    // 2. Per course, everything that does not depend on the tank's interval.
    let mut courses: Vec<CourseResult> = Vec::with_capacity(tank.courses.len());
    let mut loads: Vec<CourseLoad> = Vec::with_capacity(tank.courses.len());
    for course in &tank.courses {
        let stress = in_service_stress(units, tank.construction, course.number, &course.material);
        let e = tank.joint_efficiency_of(course);
        let load = CourseLoad {
            units,
            diameter: tank.diameter,
            specific_gravity: tank.specific_gravity,
            stress: stress.value,
            joint_efficiency: e,
            bottom_elevation: course.bottom_elevation,
        };
        let t_min = whole_course_t_min(load, tank.max_fill_height);
        let history: Vec<CourseSurvey> = tally
            .course_groups(course.number)
            .filter_map(|g| course_survey_of(g.date, &g.stats, tank.thickness_basis))
            .collect();
        let condition = history.last().copied().map(|latest| {
            let basis: Vec<BasisPoint> = history
                .iter()
                .map(|s| BasisPoint {
                    date: s.date,
                    thickness: s.basis,
                })
                .collect();
            let lt = long_term(&basis, course.nominal_thickness, tank.in_service_since);
            let st = short_term(&basis);
            let reg = regression(&basis);
            let governing = governing_rate(tank.rate_basis, lt.as_ref(), st.as_ref(), reg.as_ref());
            let (rate, rate_missing) = match governing {
                Ok(r) => (Some(r), None),
                Err(why) => (None, Some(why)),
            };
            let n = rate.map(|r| r.value);
            let t_actual = latest.basis;
            let life = remaining_life(t_actual, t_min.value, n);
            let rca = Thickness(t_actual.0 - t_min.value.0);
            CourseCondition {
                retirement_date: life.years().and_then(|y| add_years(latest.date, y)),
                status: status(t_actual, t_min.value, life),
                max_fill_height: max_fill_height(load, t_actual),
                max_fill_height_next: None,
                ut_interval: interval(IntervalKind::UltrasonicThickness, rca, n),
                external_interval: interval(IntervalKind::External, rca, n),
                history: history.clone(),
                latest,
                long_term: lt,
                short_term: st,
                regression: reg,
                rate,
                rate_missing,
                remaining_life: life,
            }
        });
        course_warnings(
            &tank,
            course.number,
            condition.as_ref(),
            latest_survey,
            &t_min,
            &mut warnings,
        );
        let no_drops = super::extreme::Drops::default();
        let latest_drops = condition
            .as_ref()
            .and_then(|k| tally.drops(course.number, k.latest.date))
            .unwrap_or(&no_drops);
        let extreme = extreme_value(
            units,
            tank.diameter,
            course.height,
            course.nominal_thickness,
            latest_drops,
        );
        if let Some(k) = condition.as_ref() {
            if let Some(cov) = k.latest.cov
                && cov > COV_UNIFORM_LIMIT
            {
                warnings.push(Warning::NonUniform {
                    course: course.number,
                    cov,
                    scanned: scanned(course.number),
                });
            }
            if let Ok(ev) = &extreme
                && ev.estimated_least.0 < t_min.value.0
            {
                warnings.push(Warning::ExtremeBelowMinimum {
                    course: course.number,
                    estimate: Shown::thickness(ev.estimated_least, units),
                    t_min: Shown::thickness(t_min.value, units),
                    scanned: scanned(course.number),
                });
            }
        }
        loads.push(load);
        courses.push(CourseResult {
            number: course.number,
            bottom_elevation: course.bottom_elevation,
            height: course.height,
            nominal_thickness: course.nominal_thickness,
            stress,
            joint_efficiency: e,
            t_min,
            condition,
            extreme_value: extreme,
        });
    }

    // 3. Tank level.
    let ut_interval = tank_interval(
        &courses,
        |c| c.ut_interval,
        IntervalKind::UltrasonicThickness,
    );
    let external_interval =
        tank_interval(&courses, |c| c.external_interval, IntervalKind::External);
    for c in &mut courses {
        if let Some(cond) = c.condition.as_mut() {
            cond.max_fill_height_next = cond.rate.map(|r| {
                let load = cond.max_fill_height.load;
                max_fill_height(load, cond.t_actual().after(r.value, ut_interval.years))
            });
        }
    }
    let measured: Vec<(u32, &CourseCondition)> = courses
        .iter()
        .filter_map(|c| c.condition.as_ref().map(|k| (c.number, k)))
        .collect();
    let unmeasured: Vec<u32> = courses
        .iter()
        .filter(|c| c.condition.is_none())
        .map(|c| c.number)
        .collect();
    if !unmeasured.is_empty() {
        warnings.push(Warning::FillHeightIgnoresUnmeasured {
            courses: unmeasured,
        });
    }
    let governing = measured
        .iter()
        .filter(|(_, k)| matches!(k.remaining_life, RemainingLife::Years(_)))
        .min_by(|a, b| {
            a.1.remaining_life
                .sort_key()
                .partial_cmp(&b.1.remaining_life.sort_key())
                .unwrap_or(std::cmp::Ordering::Equal)
        });
    let least = |f: &dyn Fn(&CourseCondition) -> Option<Length>| -> Option<FillLimit> {
        let mut best: Option<FillLimit> = None;
        for (n, k) in &measured {
            let level = f(k)?;
            if best.is_none_or(|b| level.0 < b.level.0) {
                best = Some(FillLimit { level, course: *n });
            }
        }
        best
    };
    let mut max_fill_now = least(&|k| Some(k.max_fill_height.value));
    let mut max_fill_next = least(&|k| k.max_fill_height_next.map(|h| h.value));

    // 5. Scanned areas: rules with corrosion to the next inspection; their levels join
    // the courses' (a tie stays with the course).
    let mut areas: Vec<AreaAssessment> = Vec::new();
    for scan in &scans {
        let Some(i) = tank.courses.iter().position(|c| c.number == scan.course) else {
            continue;
        };
        let rate = courses[i].condition.as_ref().and_then(|k| k.rate_value());
        let future = FutureLoss::new(rate, ut_interval.years);
        let Some(area) = assess_area(scan, loads[i], tank.max_fill_height, future) else {
            continue;
        };
        if rate.is_none() {
            warnings.push(Warning::AreaNoRate {
                file: scan.file.clone(),
                course: scan.course,
            });
        }
        if area.t1.is_none() {
            warnings.push(Warning::AreaNoWindow {
                file: scan.file.clone(),
                rows_per_window: area.windows.rows_per_window,
            });
        }
        areas.push(area);
    }
    let mut max_fill_area = None;
    let mut max_fill_next_area = None;
    for (i, a) in areas.iter().enumerate() {
        let level = a.max_fill_height.calc.value;
        if max_fill_now.is_none_or(|b| level.0 < b.level.0) {
            max_fill_now = Some(FillLimit {
                level,
                course: a.scan.course,
            });
            max_fill_area = Some(i);
        }
        match (a.max_fill_height_next, max_fill_next) {
            (None, _) => {
                max_fill_next = None;
                max_fill_next_area = None;
            }
            (Some(n), Some(b)) if n.calc.value.0 < b.level.0 => {
                max_fill_next = Some(FillLimit {
                    level: n.calc.value,
                    course: a.scan.course,
                });
                max_fill_next_area = Some(i);
            }
            _ => {}
        }
    }
    let no_rate: Vec<u32> = measured
        .iter()
        .filter(|(_, k)| k.rate.is_none())
        .map(|(n, _)| *n)
        .collect();
    if !no_rate.is_empty() && !measured.is_empty() {
        warnings.push(Warning::NextFillHeightUnknown { courses: no_rate });
    }
    let summary = TankSummary {
        governing_course: governing.map(|(n, _)| *n),
        remaining_life: governing.map(|(_, k)| k.remaining_life),
        max_fill_height: max_fill_now,
        max_fill_height_next: max_fill_next,
        next_ut_inspection: add_years(latest_survey, ut_interval.years),
        next_external_inspection: add_years(latest_survey, external_interval.years),
        ut_interval,
        external_interval,
        below_minimum: measured
            .iter()
            .filter(|(_, k)| k.status == Status::BelowMinimum)
            .map(|(n, _)| *n)
            .collect(),
        max_fill_height_area: max_fill_area,
        max_fill_height_next_area: max_fill_next_area,
    };

    // 4. Points (unless the caller shows none).
    let name = |k: crate::model::reading::PointKey| names.name(k).unwrap_or("");
    let mut spans: Vec<_> = tally.points().iter().map(|(k, p)| (name(*k), p)).collect();
    // (course, id) is unique: an unstable sort gives the one order.
    spans.sort_unstable_by(|a, b| (a.1.course, a.0).cmp(&(b.1.course, b.0)));
    let points: Vec<_> = spans
        .into_iter()
        .filter_map(|(id, p)| {
            let t_min = courses.iter().find(|c| c.number == p.course)?.t_min.value;
            Some(point_result_of(id.to_string(), p, t_min))
        })
        .collect();
    let hot = hot_spots(&points);
    let hydrotest = super::hydrotest::hydrotest(&tank, &courses);
    let variable_point = super::hydrotest::variable_point_comparison(&tank, &courses);

    Ok(Assessment {
        tank,
        overrides,
        as_of,
        latest_survey,
        surveys,
        courses,
        summary,
        points,
        hot_spots: hot,
        warnings,
        hydrotest,
        variable_point,
        areas,
    })
}

/// The least interval over courses with a known rate (or no allowance left); the
/// no-rate default when there is none (API 653 6.3).
fn tank_interval(
    courses: &[CourseResult],
    pick: impl Fn(&CourseCondition) -> super::life::IntervalCalc,
    kind: IntervalKind,
) -> TankInterval {
    let mut best: Option<TankInterval> = None;
    for c in courses {
        let Some(k) = c.condition.as_ref() else {
            continue;
        };
        let i = pick(k);
        if i.basis == IntervalBasis::NoRateKnown {
            continue;
        }
        if best.is_none_or(|b| i.years < b.years) {
            best = Some(TankInterval {
                years: i.years,
                course: Some(c.number),
                basis: i.basis,
            });
        }
    }
    best.unwrap_or(TankInterval {
        years: kind.without_rate(),
        course: None,
        basis: IntervalBasis::NoRateKnown,
    })
}

fn course_warnings(
    tank: &Tank,
    number: u32,
    condition: Option<&CourseCondition>,
    latest_survey: NaiveDate,
    t_min: &super::shell::TminCalc,
    out: &mut Vec<Warning>,
) {
    let units = tank.units;
    if tank.construction == Construction::Welded
        && tank
            .course(number)
            .is_some_and(|c| c.material == Material::NotGiven)
    {
        out.push(Warning::MaterialNotGiven { course: number });
    }
    let Some(k) = condition else {
        out.push(Warning::NoReadings { course: number });
        return;
    };
    if k.latest.date < latest_survey {
        out.push(Warning::NotInLatestSurvey {
            course: number,
            last: k.latest.date,
            latest: latest_survey,
        });
    }
    match (&k.rate, &k.long_term) {
        (None, _) => match (k.rate_missing, tank.rate_basis) {
            (Some(reason), basis)
                if basis != RateBasis::Conservative
                    && (k.long_term.is_some() || k.short_term.is_some()) =>
            {
                out.push(Warning::RateBasisUnavailable {
                    course: number,
                    basis,
                    reason,
                })
            }
            _ => out.push(Warning::NoRate { course: number }),
        },
        (Some(r), lt) => {
            if r.clamped() {
                out.push(Warning::ApparentThickening {
                    course: number,
                    rate: Shown::rate(r.raw, units),
                });
            }
            if let (Some(lt), Some(since)) = (lt, tank.in_service_since)
                && lt.from_nominal
            {
                out.push(Warning::AssumedNominal {
                    course: number,
                    nominal: Shown::thickness(lt.t_from, units),
                    since,
                });
            }
        }
    }
    if k.max_fill_height.below_floor {
        out.push(Warning::BelowFloor {
            course: number,
            thickness: Shown::thickness(k.t_actual(), units).significant(),
            floor: Shown::thickness(t_min.form.floor, units),
        });
    }
}
