//! Output of `strake required`: the two methods side by side.

use std::fmt::Write as _;

use serde::Serialize;

use crate::calc::vdp::CourseCalc;
use crate::model::required::{RequiredCourse, RequiredShell};
use crate::report::caution::CAUTION;
use crate::report::text::{WRAP, bold, bullet, wrap};
use crate::report::verdict::sg_text;
use crate::report::view::{View, sig6};

fn title(s: &RequiredShell, v: &View) -> String {
    let who = match (&s.tank_id, &s.tank_name) {
        (Some(id), Some(name)) => format!("Tank {id} - {name}"),
        (Some(id), None) => format!("Tank {id}"),
        _ => "Shell given on the command line".to_string(),
    };
    format!(
        "{who}\nRequired shell thickness: D {}, design liquid level {}, SG {}, {} courses",
        v.len_text(s.diameter),
        v.len_text(s.fill_height),
        sg_text(s.specific_gravity),
        s.courses.len()
    )
}

fn iterations(c: &Option<CourseCalc>) -> Option<usize> {
    match c {
        Some(CourseCalc::Upper(u)) => Some(u.steps.len()),
        Some(CourseCalc::Second(s)) => Some(s.t2a.steps.len()),
        _ => None,
    }
}

/// Terminal text.
pub fn render_text(s: &RequiredShell, v: &View) -> String {
    let mut o = String::new();
    let b = bold();
    let _ = writeln!(o, "{b}{}{b:#}", title(s, v));
    let limit = match s.units {
        crate::calc::units::UnitSystem::Si => "61 m",
        crate::calc::units::UnitSystem::Usc => "200 ft",
    };
    let _ = writeln!(
        o,
        "One-foot method (API 650 5.6.3): {}",
        if s.one_foot_applies {
            format!("applies (D up to {limit})")
        } else {
            format!("beyond its limit of D {limit}: shown for comparison only")
        }
    );
    let a = &s.vdp_applicability;
    let _ = writeln!(
        o,
        "Variable-design-point method (API 650 5.6.4): L/H = {:.1} (limit {:.1}): {}",
        a.ratio,
        a.limit,
        if a.holds { "applies" } else { "does not apply" }
    );
    o.push('\n');
    let tu = v.to.thickness_unit();
    let head = [
        "course", "1ft dsgn", "1ft test", "VDP dsgn", "VDP test", "min nom", "req 1ft", "req VDP",
        "nominal", "1ft-VDP",
    ];
    let td = v.thk_decimals();
    let f = |t: Option<crate::calc::units::Thickness>| {
        t.map_or("-".to_string(), |t| format!("{:.*}", td, v.thk(t)))
    };
    let rows: Vec<Vec<String>> = s
        .courses
        .iter()
        .map(|c: &RequiredCourse| {
            vec![
                c.number.to_string(),
                f(Some(c.one_foot.design)),
                f(Some(c.one_foot.test)),
                f(c.vdp_design_thickness()),
                f(c.vdp_test_thickness()),
                f(Some(c.minimum_nominal)),
                f(Some(c.required_one_foot)),
                f(c.required_vdp),
                f(c.nominal),
                f(c.difference()),
            ]
        })
        .collect();
    let widths: Vec<usize> = (0..head.len())
        .map(|i| {
            rows.iter()
                .map(|r| r[i].len())
                .chain([head[i].len()])
                .max()
                .unwrap_or(0)
        })
        .collect();
    let line = |cells: Vec<String>| {
        cells
            .iter()
            .zip(&widths)
            .map(|(c, w)| format!("{c:>w$}"))
            .collect::<Vec<_>>()
            .join("  ")
    };
    let _ = writeln!(
        o,
        "{b}{}{b:#}",
        line(head.iter().map(|h| h.to_string()).collect())
    );
    let mut units_row = vec![String::new()];
    units_row.extend(std::iter::repeat_n(tu.to_string(), head.len() - 1));
    let _ = writeln!(o, "{}", line(units_row));
    for r in rows {
        let _ = writeln!(o, "{}", line(r));
    }
    o.push('\n');
    o.push_str(&wrap(
        &format!(
            "design = product at SG {} with S_d, plus CA; test = water with S_t; required = the \
             largest of design, test and the minimum nominal thickness for the diameter (API \
             650 5.6.1.1). 1ft-VDP: the steel the variable-design-point method saves.",
            sg_text(s.specific_gravity)
        ),
        WRAP,
        "",
    ));
    if !s.warnings.is_empty() {
        o.push('\n');
        let _ = writeln!(o, "{b}Warnings ({}){b:#}", s.warnings.len());
        for w in &s.warnings {
            o.push_str(&bullet(&w.to_string()));
        }
    }
    o.push('\n');
    o.push_str(&wrap(&format!("Caution: {CAUTION}"), WRAP, ""));
    o
}

/// One course record (JSON and CSV).
#[derive(Debug, Serialize)]
pub struct JsonRequiredCourse {
    course: u32,
    onefoot_design: f64,
    onefoot_test: f64,
    vdp_design: Option<f64>,
    vdp_test: Option<f64>,
    minimum_nominal: f64,
    required_onefoot: f64,
    required_vdp: Option<f64>,
    // extras
    height: f64,
    bottom_elevation: f64,
    nominal_thickness: Option<f64>,
    difference: Option<f64>,
    corrosion_allowance: f64,
    design_stress: f64,
    test_stress: f64,
    vdp_design_point_design: Option<f64>,
    vdp_design_point_test: Option<f64>,
    vdp_iterations_design: Option<usize>,
    vdp_iterations_test: Option<usize>,
}

fn course(c: &RequiredCourse, v: &View) -> JsonRequiredCourse {
    let t = |x: crate::calc::units::Thickness| sig6(v.thk(x));
    let per = |x: f64| sig6(v.thk(crate::calc::units::Thickness(x)));
    JsonRequiredCourse {
        course: c.number,
        onefoot_design: t(c.one_foot.design),
        onefoot_test: t(c.one_foot.test),
        vdp_design: c.vdp_design_thickness().map(t),
        vdp_test: c.vdp_test_thickness().map(t),
        minimum_nominal: t(c.minimum_nominal),
        required_onefoot: t(c.required_one_foot),
        required_vdp: c.required_vdp.map(t),
        height: sig6(v.len(c.height)),
        bottom_elevation: sig6(v.len(c.bottom_elevation)),
        nominal_thickness: c.nominal.map(t),
        difference: c.difference().map(t),
        corrosion_allowance: t(c.corrosion_allowance),
        design_stress: sig6(v.stress(c.design_stress.value)),
        test_stress: sig6(v.stress(c.test_stress.value)),
        vdp_design_point_design: c
            .vdp_design
            .as_ref()
            .and_then(CourseCalc::design_point)
            .map(per),
        vdp_design_point_test: c
            .vdp_test
            .as_ref()
            .and_then(CourseCalc::design_point)
            .map(per),
        vdp_iterations_design: iterations(&c.vdp_design),
        vdp_iterations_test: iterations(&c.vdp_test),
    }
}

#[derive(Serialize)]
struct Applicability {
    applies: bool,
    l: f64,
    liquid_level: f64,
    ratio: f64,
    limit: f64,
    bottom_thickness: f64,
}

#[derive(Serialize)]
struct JsonRequired {
    courses: Vec<JsonRequiredCourse>,
    warnings: Vec<String>,
    caution: &'static str,
    // extras
    tank_id: Option<String>,
    units: crate::report::json::Units,
    diameter: f64,
    fill_height: f64,
    specific_gravity: f64,
    onefoot_applies: bool,
    variable_design_point: Applicability,
}

/// JSON text.
pub fn render_json(s: &RequiredShell, v: &View) -> String {
    let a = &s.vdp_applicability;
    let doc = JsonRequired {
        courses: s.courses.iter().map(|c| course(c, v)).collect(),
        warnings: s.warnings.iter().map(ToString::to_string).collect(),
        caution: CAUTION,
        tank_id: s.tank_id.clone(),
        units: crate::report::json::units(v),
        diameter: sig6(v.len(s.diameter)),
        fill_height: sig6(v.len(s.fill_height)),
        specific_gravity: s.specific_gravity,
        onefoot_applies: s.one_foot_applies,
        variable_design_point: Applicability {
            applies: a.holds,
            l: sig6(v.thk(crate::calc::units::Thickness(a.l))),
            liquid_level: sig6(v.len(a.liquid_level)),
            ratio: sig6(a.ratio),
            limit: sig6(a.limit),
            bottom_thickness: sig6(v.thk(a.bottom_thickness)),
        },
    };
    let mut out = serde_json::to_string_pretty(&doc).unwrap_or_default();
    out.push('\n');
    out
}

/// CSV text: one row per course.
pub fn render_csv(s: &RequiredShell, v: &View) -> Result<String, csv::Error> {
    let mut w = csv::Writer::from_writer(Vec::new());
    for c in &s.courses {
        w.serialize(course(c, v))?;
    }
    let bytes = w
        .into_inner()
        .map_err(|e| csv::Error::from(e.into_error()))?;
    Ok(String::from_utf8_lossy(&bytes).into_owned())
}
