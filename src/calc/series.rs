//! The series of the report's charts, built from an assessment and the readings it
//! was made from (methods: projection.rs, spread.rs, survey.rs).
//!
//! Per course: every reading of every survey with the survey's basis thickness; the
//! assumed initial point when the long-term rate starts from the nominal thickness;
//! the governing-rate projection from the latest basis thickness; the regression
//! line; the latest survey's readings with their plausibility flags and their
//! five-number summary. For the tank: the allowable liquid level of each course and
//! their least (the governing envelope) from the latest survey to the horizon. The
//! design check of the shell (required.rs: API 650 one-foot and variable-design-point
//! thickness of every course) for the report's design-check section and chart.

use std::collections::BTreeMap;

use chrono::NaiveDate;

use super::projection::{chart_horizon, fill_outlook, outlook_dates, trend_line};
use super::rates::RegressionCalc;
use super::required::required_shell;
use super::spread::five_numbers;
use super::survey::suspect_reading;
use super::units::{Rate, Thickness};
use crate::model::reading::{Reading, ReadingSet};
use crate::model::result::{Assessment, CourseResult};
use crate::model::series::{CourseSeries, LatestReading, ReportSeries, SurveyReadings};

/// Builds the chart series of `a`, whose readings are `readings` (those dated after
/// the assessment date are left out, as the assessment left them out).
pub fn report_series(a: &Assessment, readings: &ReadingSet) -> ReportSeries {
    let least_life = a
        .courses
        .iter()
        .filter_map(|c| c.condition.as_ref()?.remaining_life.years())
        .reduce(f64::min);
    let start = a.latest_survey;
    let horizon = chart_horizon(start, least_life);
    let mut by_course: BTreeMap<u32, BTreeMap<NaiveDate, Vec<&Reading>>> = BTreeMap::new();
    for r in readings.readings.iter().filter(|r| r.date <= a.as_of) {
        by_course
            .entry(r.course)
            .or_default()
            .entry(r.date)
            .or_default()
            .push(r);
    }
    let courses = a
        .courses
        .iter()
        .map(|c| course_series(c, by_course.get(&c.number), horizon))
        .collect();
    ReportSeries {
        start,
        horizon,
        courses,
        fill_outlook: fill_outlook(a, &outlook_dates(start, horizon)),
        design: required_shell(&a.tank, true),
    }
}

fn course_series(
    c: &CourseResult,
    dates: Option<&BTreeMap<NaiveDate, Vec<&Reading>>>,
    horizon: NaiveDate,
) -> CourseSeries {
    let mut out = CourseSeries {
        course: c.number,
        surveys: Vec::new(),
        assumed_initial: None,
        projection: None,
        regression_line: None,
        latest: Vec::new(),
        spread: None,
    };
    let Some(k) = c.condition.as_ref() else {
        return out;
    };
    let t_min = c.t_min.value;
    out.surveys = k
        .history
        .iter()
        .map(|s| SurveyReadings {
            date: s.date,
            readings: dates
                .and_then(|m| m.get(&s.date))
                .map(|rs| rs.iter().map(|r| r.thickness).collect())
                .unwrap_or_default(),
            basis: s.basis,
        })
        .collect();
    out.assumed_initial = k
        .long_term
        .filter(|lt| lt.from_nominal)
        .map(|lt| (lt.from, lt.t_from));
    out.projection = k
        .rate
        .map(|r| trend_line(k.latest.date, k.t_actual(), r.value, t_min, horizon));
    out.regression_line = k.regression.map(|g| regression_line(&g, t_min, horizon));
    let latest: &[&Reading] = dates
        .and_then(|m| m.get(&k.latest.date))
        .map_or(&[], Vec::as_slice);
    out.latest = latest
        .iter()
        .map(|r| LatestReading {
            thickness: r.thickness,
            point: r.point.as_deref().map(str::to_string),
            elevation: r.elevation,
            suspect: suspect_reading(r.thickness, c.nominal_thickness),
        })
        .collect();
    let values: Vec<f64> = latest.iter().map(|r| r.thickness.0).collect();
    out.spread = five_numbers(&values);
    out
}

/// The fitted line from the first survey forward: t(y) = intercept + slope y, the
/// rate being -slope (rates.rs).
fn regression_line(
    g: &RegressionCalc,
    t_min: Thickness,
    horizon: NaiveDate,
) -> crate::model::series::ThicknessLine {
    trend_line(g.origin, g.intercept, Rate(-g.slope), t_min, horizon)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::calc::assess::{AssessOptions, assess};
    use crate::calc::rates::years_between;
    use crate::calc::survey::SuspectKind;
    use crate::calc::units::{Length, UnitSystem};
    use crate::model::reading::Origin;
    use crate::model::tank::{Construction, Course, Material, RateBasis, Tank, ThicknessBasis};

    fn d(y: i32, m: u32, day: u32) -> NaiveDate {
        NaiveDate::from_ymd_opt(y, m, day).expect("valid test date")
    }

    /// Riveted SI tank (S = 145 MPa for every course, API 653 4.3.4 from memory):
    /// D 40 m, G 1.0, E 1.0, two 6 m courses (nominal 16 and 8 mm), operating level
    /// 10 m, in service 2000-01-01.
    fn tank() -> Tank {
        let course = |number: u32, bottom: f64, nominal: f64| Course {
            number,
            height: Length(6.0),
            bottom_elevation: Length(bottom),
            nominal_thickness: Thickness(nominal),
            material: Material::NotGiven,
            joint_efficiency: None,
            corrosion_allowance: Thickness(0.0),
            design_stress: None,
            test_stress: None,
        };
        Tank {
            id: "T".into(),
            name: None,
            units: UnitSystem::Si,
            diameter: Length(40.0),
            max_fill_height: Length(10.0),
            specific_gravity: 1.0,
            construction: Construction::Riveted,
            joint_efficiency: 1.0,
            in_service_since: Some(d(2000, 1, 1)),
            thickness_basis: ThicknessBasis::Minimum,
            rate_basis: RateBasis::Conservative,
            courses: vec![course(1, 0.0, 16.0), course(2, 6.0, 8.0)],
        }
    }

    fn readings(rows: &[(NaiveDate, u32, f64)]) -> ReadingSet {
        ReadingSet {
            scans: Vec::new(),
            files: vec!["s.csv".into()],
            readings: rows
                .iter()
                .enumerate()
                .map(|(i, &(date, course, t))| Reading {
                    date,
                    course,
                    thickness: Thickness(t),
                    point: Some(format!("P{course}-{}", i % 2).into()),
                    elevation: None,
                    azimuth: None,
                    note: None,
                    origin: Origin {
                        file: 0,
                        line: i as u64 + 2,
                    },
                })
                .collect(),
        }
    }

    fn sample() -> (Assessment, ReadingSet) {
        let set = readings(&[
            (d(2010, 1, 1), 1, 15.0),
            (d(2010, 1, 1), 1, 15.4),
            (d(2010, 1, 1), 2, 7.5),
            (d(2020, 1, 1), 1, 14.0),
            (d(2020, 1, 1), 1, 14.6),
            (d(2020, 1, 1), 2, 7.0),
            (d(2020, 1, 1), 2, 9.0),
        ]);
        let a = assess(&tank(), &set, AssessOptions::default()).expect("assessable");
        (a, set)
    }

    /// Hand calculation (API 653 4.3.3.1 SI form, methods.md s.4 and s.6):
    /// course 1: t_min = 4.9 x 40 x (10 - 0.3) x 1.0 / 145 = 196 x 9.7 / 145 = 13.111724;
    /// basis 15.0 (2010-01-01) -> 14.0 (2020-01-01), 3652 days = 9.998631 y,
    /// N = 1.0 / 9.998631 = 0.1000137; RL = (14.0 - 13.111724) / 0.1000137 = 8.88154 y.
    /// course 2: t_min = 196 x (10 - 6 - 0.3) / 145 = 5.001379; N = 0.5 / 9.998631 =
    /// 0.0500068; RL = (7.0 - 5.001379) / 0.0500068 = 39.967 y.
    /// Horizon: ceil(8.88) + 1 = 10 -> at least 15 y -> 2035-01-01.
    /// Allowable level now: course 1 145 x 14.0 / 196 + 0.3 = 10.657143 m;
    /// course 2 145 x 7.0 / 196 + 0.3 + 6 = 11.478571 m.
    /// At the horizon (2020-01-01 to 2035-01-01 = 5479 days = 15.000684 y):
    /// course 1 t = 14.0 - 0.1000137 x 15.000684 = 12.499726, level
    /// 145 x 12.499726 / 196 + 0.3 = 9.547247 m; course 2 t = 7.0 - 0.0500068 x
    /// 15.000684 = 6.249863, level 145 x 6.249863 / 196 + 6.3 = 10.923623 m;
    /// envelope 9.547247 m (course 1).
    #[test]
    fn series_by_hand() {
        let (a, set) = sample();
        let s = report_series(&a, &set);
        assert_eq!(s.start, d(2020, 1, 1));
        assert_eq!(s.horizon, d(2035, 1, 1));
        let k1 = a.courses[0].condition.as_ref().expect("measured");
        assert!((a.courses[0].t_min.value.0 - 13.111_724).abs() < 1e-6);
        assert!((k1.remaining_life.years().expect("finite") - 8.881_54).abs() < 1e-4);

        let c1 = &s.courses[0];
        assert_eq!(c1.surveys.len(), 2);
        assert_eq!(c1.surveys[0].readings, [Thickness(15.0), Thickness(15.4)]);
        assert_eq!(c1.surveys[1].basis, Thickness(14.0));
        assert_eq!(c1.assumed_initial, None);
        // The projection meets t_min on the retirement date the assessment gives.
        let p = c1.projection.expect("rate known");
        assert_eq!(p.start, (d(2020, 1, 1), Thickness(14.0)));
        assert_eq!(p.reaches_t_min, k1.retirement_date);
        assert_eq!(p.end.1, a.courses[0].t_min.value);
        assert_eq!(c1.regression_line, None, "two surveys: no regression");

        let o = &s.fill_outlook;
        assert_eq!(o.dates.first(), Some(&d(2020, 1, 1)));
        assert_eq!(o.dates.last(), Some(&d(2035, 1, 1)));
        let now = |c: usize| o.courses[c].levels[0].expect("now").0;
        assert!((now(0) - 10.657_143).abs() < 1e-6, "{}", now(0));
        assert!((now(1) - 11.478_571).abs() < 1e-6, "{}", now(1));
        let last = o.dates.len() - 1;
        let end = |c: usize| o.courses[c].levels[last].expect("rate").0;
        assert!((end(0) - 9.547_247).abs() < 1e-5, "{}", end(0));
        assert!((end(1) - 10.923_623).abs() < 1e-5, "{}", end(1));
        let env = o.envelope[last].expect("every course has a rate");
        assert_eq!(env.course, 1);
        assert!((env.level.0 - 9.547_247).abs() < 1e-5);
        // The operating level (10 m) is allowed until course 1 reaches t_min, and on
        // that date course 1's level is the operating level (round trip, s.4).
        let until = o.operating_level_until.expect("course 1 thins");
        assert_eq!(
            (Some(until.date), until.course, until.area),
            (k1.retirement_date, 1, None)
        );
        let t = k1.t_actual().after(
            k1.rate_value().expect("rate"),
            years_between(k1.latest.date, until.date),
        );
        let h = crate::calc::shell::max_fill_height(k1.max_fill_height.load, t);
        assert!((h.value.0 - 10.0).abs() < 1e-3, "{}", h.value.0);
    }

    /// The latest survey's readings keep file order, carry their flags (9.0 mm on an
    /// 8 mm course is more than 10 % above nominal: 9.0 > 8.8, common practice), and
    /// their five-number summary covers exactly them.
    #[test]
    fn latest_readings_and_flags() {
        let (a, set) = sample();
        let s = report_series(&a, &set);
        let c2 = &s.courses[1];
        let flags: Vec<_> = c2.latest.iter().map(|r| (r.thickness, r.suspect)).collect();
        assert_eq!(
            flags,
            [
                (Thickness(7.0), None),
                (Thickness(9.0), Some(SuspectKind::AboveNominal))
            ]
        );
        let f = c2.spread.expect("readings");
        assert_eq!(
            (f.min, f.max, f.median),
            (Thickness(7.0), Thickness(9.0), Thickness(8.0))
        );
        assert_eq!(
            c2.latest.len(),
            a.courses[1]
                .condition
                .as_ref()
                .expect("measured")
                .latest
                .count
        );
    }

    /// One survey and an in-service date: the assumed initial point is (in-service
    /// date, nominal); an --as-of before the last survey leaves the later readings out.
    #[test]
    fn assumed_initial_and_as_of() {
        let (_, set) = sample();
        let options = AssessOptions {
            as_of: Some(d(2015, 1, 1)),
            ..AssessOptions::default()
        };
        let a = assess(&tank(), &set, options).expect("assessable");
        let s = report_series(&a, &set);
        assert_eq!(
            s.courses[0].assumed_initial,
            Some((d(2000, 1, 1), Thickness(16.0)))
        );
        assert_eq!(s.courses[0].surveys.len(), 1);
        assert!(s.courses[0].latest.iter().all(|r| r.thickness.0 >= 15.0));
    }

    /// A scanned area in the outlook (API 653 4.3.2 local rules, local t_min of
    /// 4.3.3.1 without the one-foot offset; by hand): a 3 x 2 grid of 13.0 mm on
    /// course 1 from z = 0.5 m, rows 50 mm apart. Every window mean and t2 are 13.0;
    /// the lowest window (z = 0.5 m) under the t1 rule (f = 1) sets the level:
    /// H = S E t / (4.9 D G) + z = 145 x 13.0 / 196 + 0.5 = 9.617347 + 0.5 =
    /// 10.117347 m now, below course 1's 10.657143 m, so the area sets the envelope.
    /// With N = 0.1000137 mm/y (course 1) it stops allowing the 10 m operating level
    /// when 13.0 - N y = 9.5 x 196 / 145 = 12.841379 mm: N y = 0.158621 mm, y =
    /// 1.585993 y = 579.28 days: day 579 still allows it, day 580 does not:
    /// 2020-01-01 + 580 days = 2021-08-03 (366 days to 2021-01-01, then 214).
    #[test]
    fn scanned_area_by_hand() {
        let (_, mut set) = sample();
        set.scans.push(crate::model::scan::Scan {
            file: "scan.csv".into(),
            course: 1,
            date: d(2020, 1, 1),
            bottom_elevation: Length(0.5),
            row_pitch: Thickness(50.0),
            column_pitch: Thickness(50.0),
            pit_threshold: None,
            cells: vec![vec![Some(Thickness(13.0)); 2]; 3],
            lines: vec![5, 6, 7],
            delimiter: ',',
        });
        let a = assess(&tank(), &set, AssessOptions::default()).expect("assessable");
        assert_eq!(a.areas.len(), 1);
        let o = report_series(&a, &set).fill_outlook;
        let now = o.areas[0].levels[0].expect("now").0;
        assert!((now - 10.117_347).abs() < 1e-6, "{now}");
        let env = o.envelope[0].expect("levels");
        assert_eq!((env.course, env.area), (1, Some(0)));
        assert!((env.level.0 - a.summary.max_fill_height.expect("level").level.0).abs() < 1e-9);
        let until = o.operating_level_until.expect("the area thins");
        assert_eq!(
            (until.date, until.course, until.area),
            (d(2021, 8, 3), 1, Some(0))
        );
    }

    /// The design check rides with the series, computed for the tank as assessed
    /// (what-if values included). Hand calculation (API 650 5.6.2 and 5.6.3.2, from
    /// memory; methods.md s.2): no material given, so the code's unknown-material
    /// properties Y = 205 MPa, T = 380 MPa: S_d = min(2/3 x 205, 2/5 x 380) =
    /// min(136.667, 152) = 136.667 MPa; S_t = min(3/4 x 205, 3/7 x 380) =
    /// min(153.75, 162.857) = 153.75 MPa. Course 1, D 40 m, H 10 m, CA 0:
    /// t_d = 4.9 x 40 x (10 - 0.3) x G / 136.667 = 1901.2 G / 136.667 = 13.9112 mm at
    /// G 1.0 and 11.1290 mm at the what-if G 0.8; t_t = 1901.2 / 153.75 = 12.3655 mm
    /// (water, G does not enter). Minimum nominal for 36 m <= D <= 60 m: 8 mm (API 650
    /// 5.6.1.1, from memory).
    #[test]
    fn design_check_of_the_assessed_tank() {
        let (a, set) = sample();
        let s = report_series(&a, &set);
        assert_eq!(s.design, required_shell(&a.tank, true));
        let c1 = &s.design.courses[0];
        assert!((c1.one_foot.design.0 - 13.911_2).abs() < 1e-4, "{c1:?}");
        assert!((c1.one_foot.test.0 - 12.365_5).abs() < 1e-4);
        assert_eq!(c1.minimum_nominal, Thickness(8.0));
        assert_eq!(c1.required_one_foot, c1.one_foot.design);
        assert_eq!(c1.nominal, Some(Thickness(16.0)));
        let options = AssessOptions {
            specific_gravity: Some(0.8),
            ..AssessOptions::default()
        };
        let a = assess(&tank(), &set, options).expect("assessable");
        let c1 = &report_series(&a, &set).design.courses[0];
        assert!((c1.one_foot.design.0 - 11.129_0).abs() < 1e-4, "{c1:?}");
        assert!((c1.one_foot.test.0 - 12.365_5).abs() < 1e-4);
        assert_eq!(c1.required_one_foot, c1.one_foot.test);
    }

    /// A course without readings has empty series and no outlook line.
    #[test]
    fn unmeasured_course() {
        let set = readings(&[(d(2010, 1, 1), 1, 15.0), (d(2020, 1, 1), 1, 14.0)]);
        let a = assess(&tank(), &set, AssessOptions::default()).expect("assessable");
        let s = report_series(&a, &set);
        assert!(s.courses[1].surveys.is_empty() && s.courses[1].projection.is_none());
        assert_eq!(s.fill_outlook.courses.len(), 1);
    }
}
