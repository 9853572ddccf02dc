//! `--format json` and `result.json`: the contract of formats.md, field for field and
//! in its order, followed by documented extra fields. A value that cannot be computed
//! is `null`. Numbers carry 6 significant digits.

use serde::Serialize;

use crate::calc::life::RemainingLife;
use crate::model::result::{Assessment, CourseResult, PointResult};
use crate::report::caution::CAUTION;
use crate::report::view::{View, sig6};

/// Units block.
#[derive(Debug, Serialize)]
pub struct Units {
    /// m or ft.
    pub length: &'static str,
    /// mm or in.
    pub thickness: &'static str,
    /// MPa or psi.
    pub stress: &'static str,
    /// mm/y or in/y.
    pub rate: &'static str,
}

/// One course (contract fields, then extras).
#[derive(Debug, Serialize)]
pub struct JsonCourse {
    course: u32,
    bottom_elevation: f64,
    nominal_thickness: f64,
    allowable_stress: f64,
    joint_efficiency: f64,
    t_min: f64,
    t_actual: Option<f64>,
    t_average: Option<f64>,
    cov: Option<f64>,
    rate_long_term: Option<f64>,
    rate_short_term: Option<f64>,
    rate_regression: Option<f64>,
    rate_regression_upper: Option<f64>,
    rate: Option<f64>,
    remaining_life_years: Option<f64>,
    max_fill_height: Option<f64>,
    status: &'static str,
    // extras
    height: f64,
    survey_date: Option<String>,
    readings: usize,
    t_minimum: Option<f64>,
    rate_basis: Option<&'static str>,
    retirement_date: Option<String>,
    max_fill_height_next: Option<f64>,
    ut_interval_years: Option<f64>,
    external_interval_years: Option<f64>,
}

/// Tank block (contract fields, then extras).
#[derive(Debug, Serialize)]
pub struct JsonTank {
    governing_course: Option<u32>,
    remaining_life_years: Option<f64>,
    max_fill_height: Option<f64>,
    max_fill_height_next: Option<f64>,
    ut_interval_years: f64,
    external_interval_years: f64,
    next_ut_inspection: Option<String>,
    next_external_inspection: Option<String>,
    // extras
    latest_survey: String,
    max_fill_height_course: Option<u32>,
    max_fill_height_next_course: Option<u32>,
    operating_fill_height: f64,
    specific_gravity: f64,
    below_minimum: Vec<u32>,
}

/// One monitoring point.
#[derive(Debug, Serialize)]
pub struct JsonPoint {
    point: String,
    course: u32,
    elevation: Option<f64>,
    azimuth: Option<f64>,
    surveys: usize,
    first_date: String,
    first_thickness: f64,
    last_date: String,
    last_thickness: f64,
    rate: Option<f64>,
    remaining_life_years: Option<f64>,
}

/// The whole document.
#[derive(Debug, Serialize)]
pub struct JsonResult {
    tank_id: String,
    as_of: String,
    units: Units,
    courses: Vec<JsonCourse>,
    tank: JsonTank,
    warnings: Vec<String>,
    caution: &'static str,
    // extras
    hot_spots: Vec<JsonPoint>,
}

/// Units block for the display system of `v`.
pub fn units(v: &View) -> Units {
    Units {
        length: v.to.length_unit(),
        thickness: v.to.thickness_unit(),
        stress: v.to.stress_unit(),
        rate: v.to.rate_unit(),
    }
}

fn life_years(l: RemainingLife) -> Option<f64> {
    l.years().map(sig6)
}

/// The course record (shared with the CSV output).
pub fn course(c: &CourseResult, v: &View) -> JsonCourse {
    let k = c.condition.as_ref();
    let rate_of = |r: Option<crate::calc::units::Rate>| r.map(|r| sig6(v.rate(r)));
    JsonCourse {
        course: c.number,
        bottom_elevation: sig6(v.len(c.bottom_elevation)),
        nominal_thickness: sig6(v.thk(c.nominal_thickness)),
        allowable_stress: sig6(v.stress(c.stress.value)),
        joint_efficiency: c.joint_efficiency,
        t_min: sig6(v.thk(c.t_min.value)),
        t_actual: k.map(|k| sig6(v.thk(k.t_actual()))),
        t_average: k.map(|k| sig6(v.thk(k.latest.mean))),
        cov: k.and_then(|k| k.latest.cov).map(sig6),
        rate_long_term: rate_of(k.and_then(|k| k.long_term.map(|r| r.rate))),
        rate_short_term: rate_of(k.and_then(|k| k.short_term.map(|r| r.rate))),
        rate_regression: rate_of(k.and_then(|k| k.regression.map(|r| r.rate))),
        rate_regression_upper: rate_of(k.and_then(|k| k.regression.map(|r| r.rate_upper))),
        rate: rate_of(k.and_then(|k| k.rate_value())),
        remaining_life_years: k.and_then(|k| life_years(k.remaining_life)),
        max_fill_height: k.map(|k| sig6(v.len(k.max_fill_height.value))),
        status: k.map_or("no-readings", |k| k.status.name()),
        height: sig6(v.len(c.height)),
        survey_date: k.map(|k| k.latest.date.to_string()),
        readings: k.map_or(0, |k| k.latest.count),
        t_minimum: k.map(|k| sig6(v.thk(k.latest.minimum))),
        rate_basis: k.and_then(|k| k.rate.map(|r| r.used.name())),
        retirement_date: k.and_then(|k| k.retirement_date.map(|d| d.to_string())),
        max_fill_height_next: k.and_then(|k| k.max_fill_height_next.map(|h| sig6(v.len(h.value)))),
        ut_interval_years: k.map(|k| sig6(k.ut_interval.years)),
        external_interval_years: k.map(|k| sig6(k.external_interval.years)),
    }
}

/// The record of one monitoring point (shared with `points.csv`).
pub fn point(p: &PointResult, v: &View) -> JsonPoint {
    JsonPoint {
        point: p.point.clone(),
        course: p.course,
        elevation: p.elevation.map(|e| sig6(v.len(e))),
        azimuth: p.azimuth,
        surveys: p.surveys,
        first_date: p.first.0.to_string(),
        first_thickness: sig6(v.thk(p.first.1)),
        last_date: p.last.0.to_string(),
        last_thickness: sig6(v.thk(p.last.1)),
        rate: p.rate.map(|r| sig6(v.rate(r))),
        remaining_life_years: life_years(p.remaining_life),
    }
}

/// Builds the JSON document.
pub fn document(a: &Assessment, v: &View) -> JsonResult {
    let s = &a.summary;
    JsonResult {
        tank_id: a.tank.id.clone(),
        as_of: a.as_of.to_string(),
        units: units(v),
        courses: a.courses.iter().map(|c| course(c, v)).collect(),
        tank: JsonTank {
            governing_course: s.governing_course,
            remaining_life_years: s.remaining_life.and_then(life_years),
            max_fill_height: s.max_fill_height.map(|f| sig6(v.len(f.level))),
            max_fill_height_next: s.max_fill_height_next.map(|f| sig6(v.len(f.level))),
            ut_interval_years: sig6(s.ut_interval.years),
            external_interval_years: sig6(s.external_interval.years),
            next_ut_inspection: s.next_ut_inspection.map(|d| d.to_string()),
            next_external_inspection: s.next_external_inspection.map(|d| d.to_string()),
            latest_survey: a.latest_survey.to_string(),
            max_fill_height_course: s.max_fill_height.map(|f| f.course),
            max_fill_height_next_course: s.max_fill_height_next.map(|f| f.course),
            operating_fill_height: sig6(v.len(a.tank.max_fill_height)),
            specific_gravity: a.tank.specific_gravity,
            below_minimum: s.below_minimum.clone(),
        },
        warnings: a.warnings.iter().map(ToString::to_string).collect(),
        caution: CAUTION,
        hot_spots: a
            .hot_spots
            .iter()
            .map(|&i| point(&a.points[i], v))
            .collect(),
    }
}

/// Pretty JSON text with a final newline.
pub fn render(a: &Assessment, v: &View) -> String {
    let mut s = serde_json::to_string_pretty(&document(a, v))
        .unwrap_or_else(|e| format!("{{\"error\": \"JSON serialisation failed: {e}\"}}"));
    s.push('\n');
    s
}
