//! `--format json` and `result.json`: the contract of formats.md, field for field and
//! in its order, followed by documented extra fields. A value that cannot be computed
//! is `null`. Numbers carry 6 significant digits.
//!
//! Extras for local areas (README "Output formats"): each course record ends with
//! `extreme_value` (an object, or null) and `extreme_value_reason` (why it is null);
//! the tank block ends with the scan that sets each allowable level; the document ends
//! with `areas`, one record per scan. Rows and columns of a grid are numbered from 1,
//! row 1 the bottom row.

use serde::Serialize;

use crate::calc::area::{AreaAssessment, AreaLimit, DepthRule};
use crate::calc::extreme::ExtremeValue;
use crate::calc::life::RemainingLife;
use crate::calc::units::{Length, Thickness};
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
    hydrotest_stress: Option<f64>,
    hydrotest_height: Option<f64>,
    t_min_variable_point: Option<f64>,
}

/// The extreme-value estimate of a course (methods.md s.8).
#[derive(Debug, Serialize)]
pub struct JsonExtreme {
    blocks: usize,
    readings_per_block: usize,
    readings_without_azimuth: usize,
    block_width: f64,
    block_area: f64,
    course_area: f64,
    return_period: f64,
    fit: &'static str,
    location: f64,
    scale: f64,
    location_moments: f64,
    scale_moments: f64,
    location_max_likelihood: Option<f64>,
    scale_max_likelihood: Option<f64>,
    reduced_variate: f64,
    loss: f64,
    estimated_least_thickness: f64,
    measured_least_thickness: f64,
    plot_correlation: f64,
    maxima: Vec<f64>,
}

/// A course record of the JSON document: the CSV record, then the estimate.
#[derive(Debug, Serialize)]
pub struct JsonCourseFull {
    #[serde(flatten)]
    course: JsonCourse,
    extreme_value: Option<JsonExtreme>,
    extreme_value_reason: Option<String>,
}

/// A local-area thickness rule: measured >= fraction x t_min + future_loss.
#[derive(Debug, Serialize)]
pub struct JsonDepthRule {
    elevation: f64,
    liquid_height: f64,
    t_min: f64,
    t_min_floor_governs: bool,
    measured: f64,
    fraction: f64,
    future_loss: f64,
    required: f64,
    pass: bool,
}

/// The t1 rule at its critical window.
#[derive(Debug, Serialize)]
pub struct JsonWindowRule {
    column: usize,
    first_row: usize,
    last_row: usize,
    #[serde(flatten)]
    rule: JsonDepthRule,
}

/// The pit spacing rule.
#[derive(Debug, Serialize)]
pub struct JsonPitSpacing {
    span: f64,
    limit: f64,
    rows_per_span: usize,
    worst_length: f64,
    worst_column: Option<usize>,
    worst_first_row: Option<usize>,
    worst_last_row: Option<usize>,
    pass: bool,
}

/// One scanned area.
#[derive(Debug, Serialize)]
pub struct JsonArea {
    file: String,
    course: u32,
    date: String,
    rows: usize,
    columns: usize,
    bottom_elevation: f64,
    top_elevation: f64,
    row_pitch: f64,
    column_pitch: f64,
    pit_threshold: Option<f64>,
    readings: usize,
    not_measured: usize,
    pits: usize,
    t2: f64,
    t2_row: usize,
    t2_column: usize,
    least_pit: Option<f64>,
    averaging_length: f64,
    averaging_length_uncapped: f64,
    averaging_length_capped: bool,
    window_rows: usize,
    windows_used: usize,
    windows_skipped: usize,
    t1: Option<f64>,
    t1_column: Option<usize>,
    t1_first_row: Option<usize>,
    t1_last_row: Option<usize>,
    t1_bottom_elevation: Option<f64>,
    rate: Option<f64>,
    interval_years: f64,
    future_loss: f64,
    fill_height: f64,
    t1_rule: Option<JsonWindowRule>,
    t2_rule: JsonDepthRule,
    pit_depth_rule: Option<JsonDepthRule>,
    pit_spacing_rule: JsonPitSpacing,
    acceptable: Option<bool>,
    max_fill_height: f64,
    max_fill_height_rule: &'static str,
    max_fill_height_next: Option<f64>,
    max_fill_height_next_rule: Option<&'static str>,
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
    hydrotest_height: Option<f64>,
    hydrotest_height_course: Option<u32>,
    max_fill_height_scan: Option<String>,
    max_fill_height_next_scan: Option<String>,
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
    courses: Vec<JsonCourseFull>,
    tank: JsonTank,
    warnings: Vec<String>,
    caution: &'static str,
    // extras
    hot_spots: Vec<JsonPoint>,
    areas: Vec<JsonArea>,
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
pub fn course(a: &Assessment, c: &CourseResult, v: &View) -> JsonCourse {
    let index = a.courses.iter().position(|x| x.number == c.number);
    let hydro = index.and_then(|i| a.hydrotest.courses.get(i));
    let vdp = index.and_then(|i| {
        a.variable_point
            .as_ref()
            .and_then(|p| p.thickness.get(i).copied().flatten())
    });
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
        rate_basis: k.and_then(|k| k.rate.map(|r| r.basis.name())),
        retirement_date: k.and_then(|k| k.retirement_date.map(|d| d.to_string())),
        max_fill_height_next: k.and_then(|k| k.max_fill_height_next.map(|h| sig6(v.len(h.value)))),
        ut_interval_years: k.map(|k| sig6(k.ut_interval.years)),
        external_interval_years: k.map(|k| sig6(k.external_interval.years)),
        hydrotest_stress: hydro
            .and_then(|h| h.stress.as_ref())
            .map(|s| sig6(v.stress(s.value))),
        hydrotest_height: hydro.and_then(|h| h.height).map(|h| sig6(v.len(h.value))),
        t_min_variable_point: vdp.map(|t| sig6(v.thk(t))),
    }
}

fn thk(v: &View, t: f64) -> f64 {
    sig6(v.thk(Thickness(t)))
}

fn extreme(e: &ExtremeValue, v: &View) -> JsonExtreme {
    let ml = e.max_likelihood.map(|m| m.fit);
    let width = v.len(e.strip_width);
    let height = v.len(e.course_height);
    JsonExtreme {
        blocks: e.blocks.len(),
        readings_per_block: e.blocks.first().map_or(0, |b| b.readings),
        readings_without_azimuth: e.readings_without_azimuth,
        block_width: sig6(width),
        block_area: sig6(width * height),
        course_area: sig6(v.len(e.circumference) * height),
        return_period: sig6(e.return_period),
        fit: e.method.name(),
        location: thk(v, e.fit.location),
        scale: thk(v, e.fit.scale),
        location_moments: thk(v, e.moments.location),
        scale_moments: thk(v, e.moments.scale),
        location_max_likelihood: ml.map(|f| thk(v, f.location)),
        scale_max_likelihood: ml.map(|f| thk(v, f.scale)),
        reduced_variate: sig6(e.reduced_variate),
        loss: sig6(v.thk(e.loss)),
        estimated_least_thickness: sig6(v.thk(e.estimated_least)),
        measured_least_thickness: sig6(v.thk(e.measured_least)),
        plot_correlation: sig6(e.plot_correlation),
        maxima: e.plot.iter().map(|p| sig6(v.thk(p.loss))).collect(),
    }
}

/// The JSON course record: the CSV fields, then the extreme-value estimate.
pub fn course_full(a: &Assessment, c: &CourseResult, v: &View) -> JsonCourseFull {
    JsonCourseFull {
        course: course(a, c, v),
        extreme_value: c.extreme_value.as_ref().ok().map(|e| extreme(e, v)),
        extreme_value_reason: c.extreme_value.as_ref().err().map(ToString::to_string),
    }
}

fn depth_rule(r: &DepthRule, v: &View) -> JsonDepthRule {
    JsonDepthRule {
        elevation: sig6(v.len(r.t_min.load.bottom_elevation)),
        liquid_height: sig6(v.len(r.t_min.liquid_height)),
        t_min: sig6(v.thk(r.t_min.value)),
        t_min_floor_governs: r.t_min.floor_governs,
        measured: sig6(v.thk(r.measured)),
        fraction: r.fraction,
        future_loss: sig6(v.thk(r.future_loss)),
        required: sig6(v.thk(r.required)),
        pass: r.pass,
    }
}

fn limit_rule(l: &AreaLimit) -> &'static str {
    l.kind.name()
}

/// One area record.
pub fn area(a: &AreaAssessment, v: &View) -> JsonArea {
    let s = &a.scan;
    let units = a.load.units;
    let t1 = a.t1_window();
    let len = |l: Length| sig6(v.len(l));
    JsonArea {
        file: s.file.clone(),
        course: s.course,
        date: s.date.to_string(),
        rows: s.rows(),
        columns: s.columns(),
        bottom_elevation: len(s.bottom_elevation),
        top_elevation: len(s.top_elevation(units)),
        row_pitch: sig6(v.thk(s.row_pitch)),
        column_pitch: sig6(v.thk(s.column_pitch)),
        pit_threshold: s.pit_threshold.map(|p| sig6(v.thk(p))),
        readings: s.readings(),
        not_measured: s.not_measured(),
        pits: s.pits(),
        t2: sig6(v.thk(a.t2.value)),
        t2_row: a.t2.row + 1,
        t2_column: a.t2.column + 1,
        least_pit: a.least_pit.map(|p| sig6(v.thk(p.value))),
        averaging_length: sig6(v.thk(a.averaging_length.value)),
        averaging_length_uncapped: sig6(v.thk(a.averaging_length.formula)),
        averaging_length_capped: a.averaging_length.capped,
        window_rows: a.windows.rows_per_window,
        windows_used: a.windows.windows.len(),
        windows_skipped: a.windows.skipped,
        t1: t1.map(|w| sig6(v.thk(w.mean))),
        t1_column: t1.map(|w| w.column + 1),
        t1_first_row: t1.map(|w| w.first_row + 1),
        t1_last_row: t1.map(|w| w.last_row() + 1),
        t1_bottom_elevation: t1.map(|w| len(w.bottom_elevation)),
        rate: a.future.rate.map(|r| sig6(v.rate(r))),
        interval_years: sig6(a.future.years),
        future_loss: sig6(v.thk(a.future.loss)),
        fill_height: len(a.fill_height),
        t1_rule: a.t1_rule.and_then(|r| {
            let w = a.windows.windows.get(r.window)?;
            Some(JsonWindowRule {
                column: w.column + 1,
                first_row: w.first_row + 1,
                last_row: w.last_row() + 1,
                rule: depth_rule(&r.rule, v),
            })
        }),
        t2_rule: depth_rule(&a.t2_rule, v),
        pit_depth_rule: a.pit_depth_rule.as_ref().map(|r| depth_rule(r, v)),
        pit_spacing_rule: JsonPitSpacing {
            span: sig6(v.thk(a.pit_spacing.span)),
            limit: sig6(v.thk(a.pit_spacing.limit)),
            rows_per_span: a.pit_spacing.rows_per_span,
            worst_length: a.pit_spacing.worst.map_or(0.0, |w| sig6(v.thk(w.length))),
            worst_column: a.pit_spacing.worst.map(|w| w.column + 1),
            worst_first_row: a.pit_spacing.worst.map(|w| w.first_row + 1),
            worst_last_row: a.pit_spacing.worst.map(|w| w.first_row + w.rows),
            pass: a.pit_spacing.pass,
        },
        acceptable: a.acceptable,
        max_fill_height: len(a.max_fill_height.calc.value),
        max_fill_height_rule: limit_rule(&a.max_fill_height),
        max_fill_height_next: a.max_fill_height_next.map(|l| len(l.calc.value)),
        max_fill_height_next_rule: a.max_fill_height_next.as_ref().map(limit_rule),
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
        courses: a.courses.iter().map(|c| course_full(a, c, v)).collect(),
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
            hydrotest_height: a.hydrotest.tank.map(|f| sig6(v.len(f.level))),
            hydrotest_height_course: a.hydrotest.tank.map(|f| f.course),
            max_fill_height_scan: s
                .max_fill_height_area
                .and_then(|i| a.areas.get(i))
                .map(|x| x.scan.file.clone()),
            max_fill_height_next_scan: s
                .max_fill_height_next_area
                .and_then(|i| a.areas.get(i))
                .map(|x| x.scan.file.clone()),
        },
        warnings: a.warnings.iter().map(ToString::to_string).collect(),
        caution: CAUTION,
        hot_spots: a
            .hot_spots
            .iter()
            .map(|&i| point(&a.points[i], v))
            .collect(),
        areas: a.areas.iter().map(|x| area(x, v)).collect(),
    }
}

/// Pretty JSON text with a final newline.
pub fn render(a: &Assessment, v: &View) -> String {
    let mut s = serde_json::to_string_pretty(&document(a, v))
        .unwrap_or_else(|e| format!("{{\"error\": \"JSON serialisation failed: {e}\"}}"));
    s.push('\n');
    s
}
