//! Output of `strake fill-height`.

use std::fmt::Write as _;

use serde::Serialize;

use crate::calc::fill_height::FillScenario;
use crate::model::result::Assessment;
use crate::report::caution::CAUTION;
use crate::report::text::{WRAP, bold, tank_title, wrap};
use crate::report::view::{View, sig6};

/// Terminal text.
pub fn render_text(a: &Assessment, scenarios: &[FillScenario], years: f64, v: &View) -> String {
    let mut o = String::new();
    let b = bold();
    let lu = v.to.length_unit();
    let _ = writeln!(o, "{b}{}{b:#}", tank_title(a, v));
    let _ = writeln!(
        o,
        "Allowable liquid level by the one-foot relation (API 653 4.3.3.1 inverted), as of {}; \
         'later' = after {years:.1} years at each course's governing rate",
        a.as_of
    );
    o.push('\n');
    let _ = writeln!(
        o,
        "{b}{:>6}  {:<14}  {:>9}  {:>6}  {:>9}  {:>6}{b:#}",
        "SG", "product", "now", "course", "later", "course"
    );
    let _ = writeln!(
        o,
        "{:>6}  {:<14}  {:>9}  {:>6}  {:>9}  {:>6}",
        "", "", lu, "", lu, ""
    );
    for s in scenarios {
        let label = if s.stored_product {
            "stored product"
        } else {
            "what-if"
        };
        let who = |f: crate::model::result::FillLimit, area: Option<usize>| {
            if area.is_some() {
                format!("{} scan", f.course)
            } else {
                f.course.to_string()
            }
        };
        let now = s.now.map_or(("-".to_string(), "-".to_string()), |f| {
            (format!("{:.2}", v.len(f.level)), who(f, s.now_area))
        });
        let later = s.later.map_or(("-".to_string(), "-".to_string()), |f| {
            (format!("{:.2}", v.len(f.level)), who(f, s.later_area))
        });
        let _ = writeln!(
            o,
            "{:>6}  {:<14}  {:>9}  {:>6}  {:>9}  {:>6}",
            format!("{:.3}", s.specific_gravity),
            label,
            now.0,
            now.1,
            later.0,
            later.1
        );
    }
    o.push('\n');
    o.push_str(&wrap(
        &format!(
            "Operating maximum in tank.toml: {}; shell height {}. A level above the shell \
             height means the shell does not limit: the tank may be filled to its top.",
            v.len_text(a.tank.max_fill_height),
            v.len_text(a.tank.shell_height())
        ),
        WRAP,
        "",
    ));
    let mut scans: Vec<usize> = scenarios
        .iter()
        .flat_map(|s| [s.now_area, s.later_area])
        .flatten()
        .collect();
    scans.sort_unstable();
    scans.dedup();
    for i in scans {
        if let Some(x) = a.areas.get(i) {
            o.push_str(&wrap(
                &format!(
                    "'N scan': set by the scanned area of course N, {} (local form, API 653 \
                     4.3.2).",
                    x.scan.file
                ),
                WRAP,
                "",
            ));
        }
    }
    if scenarios
        .iter()
        .any(|s| s.later.is_none() && s.now.is_some())
    {
        let _ = writeln!(
            o,
            "'later' is not computed where a course has no corrosion rate."
        );
    }
    o.push('\n');
    o.push_str(&wrap(&format!("Caution: {CAUTION}"), WRAP, ""));
    o
}

#[derive(Serialize)]
struct JsonScenario {
    specific_gravity: f64,
    stored_product: bool,
    max_fill_height: Option<f64>,
    governing_course: Option<u32>,
    max_fill_height_later: Option<f64>,
    governing_course_later: Option<u32>,
    courses: Vec<JsonCourseFill>,
    governing_scan: Option<String>,
    governing_scan_later: Option<String>,
    areas: Vec<JsonAreaFill>,
}

#[derive(Serialize)]
struct JsonAreaFill {
    file: String,
    course: u32,
    max_fill_height: f64,
    max_fill_height_later: Option<f64>,
}

#[derive(Serialize)]
struct JsonCourseFill {
    course: u32,
    max_fill_height: f64,
    max_fill_height_later: Option<f64>,
}

#[derive(Serialize)]
struct JsonFill {
    tank_id: String,
    as_of: String,
    units: crate::report::json::Units,
    years: f64,
    operating_fill_height: f64,
    scenarios: Vec<JsonScenario>,
    caution: &'static str,
}

fn scan_file(a: &Assessment, area: Option<usize>) -> Option<String> {
    area.and_then(|i| a.areas.get(i))
        .map(|x| x.scan.file.clone())
}

fn scenario(a: &Assessment, s: &FillScenario, v: &View) -> JsonScenario {
    JsonScenario {
        specific_gravity: s.specific_gravity,
        stored_product: s.stored_product,
        max_fill_height: s.now.map(|f| sig6(v.len(f.level))),
        governing_course: s.now.map(|f| f.course),
        max_fill_height_later: s.later.map(|f| sig6(v.len(f.level))),
        governing_course_later: s.later.map(|f| f.course),
        courses: s
            .courses
            .iter()
            .map(|c| JsonCourseFill {
                course: c.course,
                max_fill_height: sig6(v.len(c.now.value)),
                max_fill_height_later: c.later.map(|l| sig6(v.len(l.value))),
            })
            .collect(),
        governing_scan: scan_file(a, s.now_area),
        governing_scan_later: scan_file(a, s.later_area),
        areas: s
            .areas
            .iter()
            .filter_map(|f| {
                let x = a.areas.get(f.area)?;
                Some(JsonAreaFill {
                    file: x.scan.file.clone(),
                    course: x.scan.course,
                    max_fill_height: sig6(v.len(f.now.calc.value)),
                    max_fill_height_later: f.later.map(|l| sig6(v.len(l.calc.value))),
                })
            })
            .collect(),
    }
}

/// JSON text.
pub fn render_json(a: &Assessment, scenarios: &[FillScenario], years: f64, v: &View) -> String {
    let doc = JsonFill {
        tank_id: a.tank.id.clone(),
        as_of: a.as_of.to_string(),
        units: crate::report::json::units(v),
        years: sig6(years),
        operating_fill_height: sig6(v.len(a.tank.max_fill_height)),
        scenarios: scenarios.iter().map(|s| scenario(a, s, v)).collect(),
        caution: CAUTION,
    };
    let mut s = serde_json::to_string_pretty(&doc).unwrap_or_default();
    s.push('\n');
    s
}

#[derive(Serialize)]
struct CsvRow {
    specific_gravity: f64,
    stored_product: bool,
    max_fill_height: Option<f64>,
    governing_course: Option<u32>,
    max_fill_height_later: Option<f64>,
    governing_course_later: Option<u32>,
    years: f64,
    governing_scan: Option<String>,
    governing_scan_later: Option<String>,
}

/// CSV text: one row per specific gravity.
pub fn render_csv(
    a: &Assessment,
    scenarios: &[FillScenario],
    years: f64,
    v: &View,
) -> Result<String, csv::Error> {
    let mut w = csv::Writer::from_writer(Vec::new());
    for s in scenarios {
        w.serialize(CsvRow {
            specific_gravity: s.specific_gravity,
            stored_product: s.stored_product,
            max_fill_height: s.now.map(|f| sig6(v.len(f.level))),
            governing_course: s.now.map(|f| f.course),
            max_fill_height_later: s.later.map(|f| sig6(v.len(f.level))),
            governing_course_later: s.later.map(|f| f.course),
            years: sig6(years),
            governing_scan: scan_file(a, s.now_area),
            governing_scan_later: scan_file(a, s.later_area),
        })?;
    }
    let bytes = w
        .into_inner()
        .map_err(|e| csv::Error::from(e.into_error()))?;
    Ok(String::from_utf8_lossy(&bytes).into_owned())
}
