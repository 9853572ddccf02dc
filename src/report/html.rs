//! `index.html`: one self-contained page (inline CSS and SVG, no script, nothing
//! fetched) that answers first whether the tank is fit, until when, up to what level
//! and when to look again, then shows every input, the per-course results, the
//! charts, the local thin areas, the extreme-value estimates, hot spots, warnings, the
//! design check, how each number was obtained (every formula with its numbers
//! substituted and its source), the caution and a sign-off block. A print stylesheet
//! gives clean A4 pages. The sections on scans, extreme values and the design check
//! are in `sections.rs`.
//!
//! Rendered from the result model, the chart series and the drawn charts; nothing
//! here computes an engineering value. Every text that comes from a user's file is
//! escaped.

use std::fmt::Write as _;

use crate::calc::life::{IntervalBasis, IntervalCalc, IntervalKind, RemainingLife, Status};
use crate::calc::rates::{GoverningRate, RateCalc, RateUnavailable, RegressionCalc};
use crate::calc::shell::{FillHeightCalc, TminCalc};
use crate::calc::stress::{AllowableStress, StressRule};
use crate::calc::units::UnitSystem;
use crate::model::result::{Assessment, CourseCondition, CourseResult, FillLimit};
use crate::model::series::ReportSeries;
use crate::model::tank::{Material, RateBasis, ThicknessBasis};
use crate::report::caution::CAUTION;
use crate::report::chart::{Chart, Place};
use crate::report::folder::ReportContext;
use crate::report::sections;
use crate::report::text::shell_checks;
use crate::report::verdict::{interval_text, scan_name, sg_text, verdict_sentences};
use crate::report::view::View;

/// Escapes text for HTML element content and quoted attribute values.
pub fn esc(s: &str) -> String {
    let mut o = String::with_capacity(s.len());
    for c in s.chars() {
        match c {
            '&' => o.push_str("&amp;"),
            '<' => o.push_str("&lt;"),
            '>' => o.push_str("&gt;"),
            '"' => o.push_str("&quot;"),
            '\'' => o.push_str("&#39;"),
            c => o.push(c),
        }
    }
    o
}

/// A number with `d` decimals.
pub(super) fn n(x: f64, d: usize) -> String {
    format!("{x:.d$}")
}

/// The whole page.
pub fn render(
    a: &Assessment,
    s: &ReportSeries,
    v: &View,
    charts: &[Chart],
    ctx: ReportContext,
) -> String {
    let mut o =
        String::with_capacity(64 * 1024 + charts.iter().map(|c| c.svg.len()).sum::<usize>());
    let t = &a.tank;
    let name = t.name.as_deref().map(esc);
    let _ = write!(
        o,
        "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n\
         <meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n\
         <meta name=\"generator\" content=\"strake {}\">\n\
         <title>Shell assessment {} as of {}</title>\n<style>\n{}</style>\n</head>\n<body>\n",
        env!("CARGO_PKG_VERSION"),
        esc(&t.id),
        a.as_of,
        STYLE
    );
    masthead(&mut o, a, v, name.as_deref(), ctx);
    verdict(&mut o, a, s, v);
    inputs(&mut o, a, v, ctx);
    results(&mut o, a, v);
    figures(&mut o, s, v, charts);
    sections::local_areas(&mut o, a, v, charts);
    sections::extreme_values(&mut o, a, v, charts);
    hot_spots(&mut o, a, v);
    warnings(&mut o, a);
    sections::design_check(&mut o, a, s, v, charts);
    derivations(&mut o, a);
    sign_off(&mut o, a);
    o.push_str("</body>\n</html>\n");
    o
}

fn masthead(o: &mut String, a: &Assessment, v: &View, name: Option<&str>, ctx: ReportContext) {
    let t = &a.tank;
    let first = a.surveys.first().map(|s| s.date);
    let readings: usize = a.surveys.iter().map(|s| s.readings).sum();
    let _ = write!(
        o,
        "<header class=\"masthead\">\n<p class=\"kicker\">Above-ground storage tank · shell \
         thickness assessment</p>\n<h1>Tank {}{}</h1>\n<p class=\"meta\">Assessed as of \
         <b>{}</b> from {} survey{} ({}), {readings} readings · numbers in {} units{} · \
         strake {}{}</p>\n",
        esc(&t.id),
        name.map(|n| format!(" <span class=\"name\">{n}</span>"))
            .unwrap_or_default(),
        a.as_of,
        a.surveys.len(),
        if a.surveys.len() == 1 { "" } else { "s" },
        match first {
            Some(d) if d != a.latest_survey => format!("{d} to {}", a.latest_survey),
            _ => a.latest_survey.to_string(),
        },
        v.to.name(),
        if v.to == v.from {
            String::new()
        } else {
            format!(
                " (the tank's own: {}; the working of each number uses them)",
                v.from.name()
            )
        },
        env!("CARGO_PKG_VERSION"),
        ctx.stamp
            .map(|s| format!(" · generated {}", esc(s)))
            .unwrap_or_default(),
    );
    o.push_str(
        "<nav class=\"toc\" aria-label=\"Contents\"><ol>\
         <li><a href=\"#verdict\">Verdict</a></li>\
         <li><a href=\"#inputs\">Tank and inputs</a></li>\
         <li><a href=\"#results\">Results by course</a></li>\
         <li><a href=\"#charts\">Charts</a></li>\
         <li><a href=\"#areas\">Local thin areas</a></li>\
         <li><a href=\"#extreme-values\">Thinnest spot where nobody measured</a></li>\
         <li><a href=\"#hot-spots\">Hot spots</a></li>\
         <li><a href=\"#warnings\">Warnings</a></li>\
         <li><a href=\"#design-check\">Design check</a></li>\
         <li><a href=\"#working\">How each number was obtained</a></li>\
         <li><a href=\"#sign-off\">Caution and sign-off</a></li>\
         </ol></nav>\n</header>\n",
    );
}

/// Where the verdict stands, for its colour band (always spelled out in words too).
#[derive(Clone, Copy, PartialEq, Eq)]
enum Standing {
    Fit,
    Watch,
    Act,
}

/// Who sets a limit: a course, or a scanned area on a course.
fn setter(course: u32, area: Option<usize>, a: &Assessment) -> String {
    match area.and_then(|i| a.areas.get(i)) {
        Some(x) => format!(
            "the scanned area on course {course} ({})",
            scan_name(&x.scan.file)
        ),
        None => format!("course {course}"),
    }
}

fn level_text(l: FillLimit, area: Option<usize>, a: &Assessment, v: &View) -> String {
    let shell = a.tank.shell_height();
    let who = setter(l.course, area, a);
    if l.level.0 >= shell.0 {
        format!(
            "{} (the full shell; {who} alone would allow {})",
            v.len_text(shell),
            v.len_text(l.level)
        )
    } else {
        format!("{} (set by {who})", v.len_text(l.level))
    }
}

fn verdict(o: &mut String, a: &Assessment, series: &ReportSeries, v: &View) {
    let s = &a.summary;
    let op = a.tank.max_fill_height;
    let sg = sg_text(a.tank.specific_gravity);
    let gov = s
        .governing_course
        .and_then(|g| a.courses.iter().find(|c| c.number == g));
    let gov_k = gov.and_then(|c| c.condition.as_ref());
    let restricted_now = s.max_fill_height.is_some_and(|l| l.level.0 < op.0);
    let restricted_next = s.max_fill_height_next.is_some_and(|l| l.level.0 < op.0);
    let monitor: Vec<u32> = a
        .courses
        .iter()
        .filter(|c| {
            c.condition
                .as_ref()
                .is_some_and(|k| k.status == Status::Monitor)
        })
        .map(|c| c.number)
        .collect();
    let list = |ns: &[u32]| ns.iter().map(u32::to_string).collect::<Vec<_>>().join(", ");
    let (standing, headline) = if !s.below_minimum.is_empty() {
        (
            Standing::Act,
            format!(
                "Not fit at the operating level: course {} below t_min.",
                list(&s.below_minimum)
            ),
        )
    } else if restricted_now {
        (
            Standing::Act,
            format!(
                "Restrict the fill height: the shell allows {}, below the operating maximum of {}.",
                s.max_fill_height
                    .map_or("-".into(), |l| v.len_text(l.level)),
                v.len_text(op)
            ),
        )
    } else if restricted_next {
        (
            Standing::Watch,
            format!(
                "Fit for service now, but the operating level of {} will not be allowed at \
                 the next UT survey{}: plan a repair or a lower fill height.",
                v.len_text(op),
                s.next_ut_inspection
                    .map(|d| format!(" ({d})"))
                    .unwrap_or_default()
            ),
        )
    } else if !monitor.is_empty() {
        (
            Standing::Watch,
            format!(
                "Fit for service now; course {} {} under ten years of remaining life: plan \
                 the repair or re-rating.",
                list(&monitor),
                if monitor.len() == 1 { "has" } else { "have" }
            ),
        )
    } else {
        (
            Standing::Fit,
            "Fit for continued service at the operating level.".to_string(),
        )
    };
    let (class, word) = match standing {
        Standing::Fit => ("fit", "FIT"),
        Standing::Watch => ("watch", "FIT, WATCH"),
        Standing::Act => ("act", "ACTION NEEDED"),
    };
    let measured = a.courses.iter().filter(|c| c.condition.is_some()).count();
    let fit_now = if s.below_minimum.is_empty() {
        let which = if measured == a.courses.len() {
            format!("all {measured} courses are")
        } else {
            format!(
                "the {measured} measured courses (of {}) are",
                a.courses.len()
            )
        };
        format!(
            "Yes: {which} at or above t_min for SG {sg} at {}.",
            v.len_text(op)
        )
    } else {
        format!("No: course {} below t_min.", list(&s.below_minimum))
    };
    let until = match (gov, gov_k.map(|k| k.remaining_life)) {
        (Some(c), Some(RemainingLife::Years(y))) if y <= 0.0 => {
            format!("Now: course {} has no corrosion allowance left.", c.number)
        }
        (Some(c), Some(RemainingLife::Years(y))) => {
            let k = c.condition.as_ref();
            let when = k
                .and_then(|k| k.retirement_date)
                .map_or("-".to_string(), |d| d.format("%Y-%m").to_string());
            let rate = k
                .and_then(|k| k.rate)
                .map(|r| format!(" at {}", v.rate_text(r.value)))
                .unwrap_or_default();
            format!(
                "About {when}: course {} reaches t_min in {y:.1} years{rate}.",
                c.number
            )
        }
        (Some(_), Some(RemainingLife::NoMeasurableLoss)) => {
            "No end projected: no measurable thinning on any course.".to_string()
        }
        _ => "Not projected: no corrosion rate is known (one survey, no in-service date)."
            .to_string(),
    };
    // The operating level stops being allowed before the governing course retires
    // when a scanned area limits it first.
    let until = match series.fill_outlook.operating_level_until {
        Some(u) if u.area.is_some() && u.date <= series.horizon => format!(
            "The operating level of {} is allowed until about {} ({}). {until}",
            v.len_text(op),
            u.date.format("%Y-%m"),
            setter(u.course, u.area, a)
        ),
        _ => until,
    };
    let level = match s.max_fill_height {
        None => "Not computed: no course has readings.".to_string(),
        Some(now) => {
            let mut t = format!("Now {}.", level_text(now, s.max_fill_height_area, a, v));
            if let Some(next) = s.max_fill_height_next {
                let _ = write!(
                    t,
                    " At the next UT survey{}: {}.",
                    s.next_ut_inspection
                        .map(|d| format!(" ({d})"))
                        .unwrap_or_default(),
                    level_text(next, s.max_fill_height_next_area, a, v)
                );
            }
            let _ = write!(t, " Operating maximum {}.", v.len_text(op));
            t
        }
    };
    let due =
        |d: Option<chrono::NaiveDate>| d.map_or("not computed".to_string(), |d| d.to_string());
    let look = format!(
        "UT thickness survey by {} ({}). External inspection by {} ({}).",
        due(s.next_ut_inspection),
        interval_text(&s.ut_interval),
        due(s.next_external_inspection),
        interval_text(&s.external_interval)
    );
    let _ = write!(
        o,
        "<main>\n<section id=\"verdict\" class=\"verdict {class}\">\n<h2><span class=\"no\">1</span> \
         Verdict</h2>\n<p class=\"headline\"><span class=\"standing\">{word}</span> {}</p>\n\
         <dl class=\"answers\">\n\
         <div><dt>Fit now?</dt><dd>{}</dd></div>\n\
         <div><dt>Until when?</dt><dd>{}</dd></div>\n\
         <div><dt>Up to what level?</dt><dd>{}</dd></div>\n\
         <div><dt>When to look again?</dt><dd>{}</dd></div>\n</dl>\n\
         <p class=\"sentences\">{}</p>\n<p class=\"note\">A screening aid: read the caution \
         in section 11 before relying on it.</p>\n</section>\n",
        esc(&headline),
        esc(&fit_now),
        esc(&until),
        esc(&level),
        esc(&look),
        esc(&verdict_sentences(a, v).join(" "))
    );
}

fn row(o: &mut String, key: &str, value: &str) {
    let _ = writeln!(o, "<tr><th scope=\"row\">{key}</th><td>{value}</td></tr>");
}

fn inputs(o: &mut String, a: &Assessment, v: &View, ctx: ReportContext) {
    let t = &a.tank;
    o.push_str(
        "<section id=\"inputs\">\n<h2><span class=\"no\">2</span> Tank and inputs</h2>\n\
         <div class=\"cols\">\n<table class=\"kv\">\n<caption>Tank (tank.toml)</caption>\n<tbody>\n",
    );
    row(o, "Tank id", &esc(&t.id));
    row(o, "Name", &t.name.as_deref().map_or("-".into(), esc));
    row(o, "Unit system", t.units.name());
    row(o, "Nominal diameter D", &v.len_text(t.diameter));
    let what_if = |from: Option<String>| {
        from.map(|f| format!(" <span class=\"whatif\">what-if; tank.toml: {f}</span>"))
            .unwrap_or_default()
    };
    row(
        o,
        "Operating maximum liquid level",
        &format!(
            "{}{}",
            v.len_text(t.max_fill_height),
            what_if(a.overrides.fill_height_from_file.map(|h| v.len_text(h)))
        ),
    );
    row(
        o,
        "Specific gravity G",
        &format!(
            "{}{}",
            sg_text(t.specific_gravity),
            what_if(a.overrides.specific_gravity_from_file.map(sg_text))
        ),
    );
    row(o, "Construction", t.construction.name());
    row(o, "Joint efficiency E (tank)", &n(t.joint_efficiency, 2));
    row(
        o,
        "In service since",
        &t.in_service_since
            .map_or("not given".into(), |d| d.to_string()),
    );
    row(o, "Thickness basis", t.thickness_basis.name());
    row(o, "Rate basis", t.rate_basis.name());
    row(
        o,
        "Shell height (sum of courses)",
        &v.len_text(t.shell_height()),
    );
    row(o, "Assessment date", &a.as_of.to_string());
    o.push_str("</tbody>\n</table>\n");

    o.push_str(
        "<table class=\"num courses\">\n<caption>Courses (tank.toml)</caption>\n<thead><tr>\
         <th>Course</th><th>Bottom z</th><th>Height</th><th>Nominal</th><th>Material</th>\
         <th>Y</th><th>T</th><th>E</th></tr>\n",
    );
    let (lu, tu, su) = (
        v.to.length_unit(),
        v.to.thickness_unit(),
        v.to.stress_unit(),
    );
    let _ = writeln!(
        o,
        "<tr class=\"units\"><th></th><th>{lu}</th><th>{lu}</th><th>{tu}</th><th></th>\
         <th>{su}</th><th>{su}</th><th></th></tr></thead>\n<tbody>"
    );
    let td = v.thk_decimals();
    for c in &a.courses {
        let course = t.course(c.number);
        let material = course.map_or("-".to_string(), |k| match &k.material {
            Material::Grade(g) => esc(g.name),
            Material::Explicit { .. } => "given as Y and T".to_string(),
            Material::NotGiven => "not given".to_string(),
        });
        let stress = |s: Option<crate::calc::units::Stress>| {
            s.map_or("-".to_string(), |s| stress_number(v.stress(s), v.to))
        };
        let _ = writeln!(
            o,
            "<tr><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td class=\"text\">{material}</td>\
             <td>{}</td><td>{}</td><td>{}</td></tr>",
            c.number,
            n(v.len(c.bottom_elevation), 2),
            n(v.len(c.height), 2),
            n(v.thk(c.nominal_thickness), td),
            stress(c.stress.yield_strength),
            stress(c.stress.tensile_strength),
            n(c.joint_efficiency, 2)
        );
    }
    o.push_str("</tbody>\n</table>\n</div>\n");

    o.push_str(
        "<table class=\"files\">\n<caption>Survey files read</caption>\n<thead><tr><th>File</th>\
         <th>Rows</th><th>Delimiter</th><th>Thickness unit</th><th>Columns</th></tr></thead>\n<tbody>\n",
    );
    if ctx.files.is_empty() {
        o.push_str("<tr><td colspan=\"5\">none</td></tr>\n");
    }
    for f in ctx.files {
        let _ = writeln!(
            o,
            "<tr><td class=\"path\">{}</td><td class=\"n\">{}</td><td>{}</td><td>{}</td><td>{}</td></tr>",
            esc(&f.path),
            f.rows,
            match f.delimiter {
                ';' => "semicolon",
                '\t' => "tab",
                _ => "comma",
            },
            esc(f.thickness_unit.unwrap_or("?")),
            esc(&f.columns.join(", "))
        );
    }
    o.push_str("</tbody>\n</table>\n");
    if !a.areas.is_empty() {
        let tu = v.to.thickness_unit();
        o.push_str(
            "<table class=\"files\">\n<caption>Grid scans read</caption>\n<thead><tr>\
             <th>File</th><th>Course</th><th>Date</th><th>Grid</th><th>Bottom row</th>\
             <th>Pit threshold</th></tr></thead>\n<tbody>\n",
        );
        for x in &a.areas {
            let sc = &x.scan;
            let _ = writeln!(
                o,
                "<tr><td class=\"path\">{}</td><td class=\"n\">{}</td><td>{}</td><td>{} rows \
                 × {} columns, {} × {} {tu} apart</td><td>{}</td><td>{}</td></tr>",
                esc(&sc.file),
                sc.course,
                sc.date,
                sc.rows(),
                sc.columns(),
                n(v.thk(sc.row_pitch), v.thk_decimals()),
                n(v.thk(sc.column_pitch), v.thk_decimals()),
                v.len_text(sc.bottom_elevation),
                sc.pit_threshold
                    .map_or("none".to_string(), |p| v.thk_text(p))
            );
        }
        o.push_str("</tbody>\n</table>\n");
    }
    o.push_str("</section>\n");
}

/// The basis thickness of every course at every survey (what the rates are made of).
fn survey_table(o: &mut String, a: &Assessment, f: &Fmt) {
    let t = &a.tank;
    let tu = f.tu();
    let _ = writeln!(
        o,
        "<div class=\"wide\">\n<table class=\"num\">\n<caption>Readings of each course at each survey: the basis \
         thickness is the {} reading</caption>\n<thead><tr><th>Course</th><th>Survey</th>\
         <th>Readings</th><th>Least</th><th>Mean</th><th>s</th><th>COV</th><th>Basis</th></tr>\n\
         <tr class=\"units\"><th></th><th></th><th></th><th>{tu}</th><th>{tu}</th><th>{tu}</th>\
         <th></th><th>{tu}</th></tr></thead>\n<tbody>",
        match t.thickness_basis {
            ThicknessBasis::Minimum => "least",
            ThicknessBasis::Average => "mean",
        }
    );
    for c in &a.courses {
        let Some(k) = &c.condition else {
            let _ = writeln!(
                o,
                "<tr><td>{}</td><td class=\"text\" colspan=\"7\">no readings</td></tr>",
                c.number
            );
            continue;
        };
        for sv in &k.history {
            let _ = writeln!(
                o,
                "<tr><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td>\
                 <td>{}</td></tr>",
                c.number,
                sv.date,
                sv.count,
                f.thk(sv.minimum.0),
                f.thk(sv.mean.0),
                sv.std_dev.map_or("-".into(), |s| f.thk_result(s)),
                sv.cov.map_or("-".into(), |c| n(c, 3)),
                f.thk(sv.basis.0)
            );
        }
    }
    o.push_str("</tbody>\n</table>\n</div>\n");
}

fn stress_number(x: f64, u: UnitSystem) -> String {
    match u {
        UnitSystem::Si => n(x, 1),
        UnitSystem::Usc => n(x, 0),
    }
}

fn status_badge(st: Option<Status>) -> String {
    let (class, text) = match st {
        Some(Status::BelowMinimum) => ("below", "below t_min"),
        Some(Status::Monitor) => ("monitor", "monitor"),
        Some(Status::Ok) => ("ok", "ok"),
        None => ("none", "no readings"),
    };
    format!("<span class=\"badge {class}\">{text}</span>")
}

fn life_text(l: RemainingLife) -> String {
    match l {
        RemainingLife::Years(y) => n(y, 1),
        RemainingLife::NoMeasurableLoss => "no loss".into(),
        RemainingLife::Unknown => "-".into(),
    }
}

fn results(o: &mut String, a: &Assessment, v: &View) {
    let (lu, tu, ru) = (v.to.length_unit(), v.to.thickness_unit(), v.to.rate_unit());
    let _ = writeln!(
        o,
        "<section id=\"results\">\n<h2><span class=\"no\">3</span> Results by course</h2>\n\
         <div class=\"wide\">\n<table class=\"num results\">\n<thead><tr><th>Course</th><th>Nominal</th><th>t_actual</th>\
         <th>t_min</th><th>Rate</th><th>Rate basis</th><th>Remaining life</th><th>Meets t_min</th>\
         <th>Allowable level now</th><th>… at next UT</th><th>UT interval</th><th>External \
         interval</th><th>Status</th></tr>\n<tr class=\"units\"><th></th><th>{tu}</th><th>{tu}</th>\
         <th>{tu}</th><th>{ru}</th><th></th><th>y</th><th></th><th>{lu}</th><th>{lu}</th><th>y</th>\
         <th>y</th><th></th></tr></thead>\n<tbody>"
    );
    let td = v.thk_decimals();
    for c in &a.courses {
        let k = c.condition.as_ref();
        let gov = a.summary.governing_course == Some(c.number);
        let dash = || "-".to_string();
        let _ = writeln!(
            o,
            "<tr{}><td>{}{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td class=\"text\">{}</td>\
             <td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td class=\"text\">{}</td></tr>",
            if gov { " class=\"governing\"" } else { "" },
            c.number,
            if gov {
                " <span class=\"tag\">governs</span>"
            } else {
                ""
            },
            n(v.thk(c.nominal_thickness), td),
            k.map_or_else(dash, |k| n(v.thk(k.t_actual()), td)),
            n(v.thk(c.t_min.value), td),
            k.and_then(|k| k.rate_value())
                .map_or_else(dash, |r| n(v.rate(r), v.rate_decimals())),
            k.and_then(|k| k.rate.map(|r| r.basis.name()))
                .unwrap_or("-"),
            k.map_or_else(dash, |k| life_text(k.remaining_life)),
            k.and_then(|k| k.retirement_date)
                .map_or_else(dash, |d| d.format("%Y-%m").to_string()),
            k.map_or_else(dash, |k| n(v.len(k.max_fill_height.value), 2)),
            k.and_then(|k| k.max_fill_height_next)
                .map_or_else(dash, |h| n(v.len(h.value), 2)),
            k.map_or_else(dash, |k| n(k.ut_interval.years, 1)),
            k.map_or_else(dash, |k| n(k.external_interval.years, 1)),
            status_badge(k.map(|k| k.status))
        );
    }
    o.push_str("</tbody>\n</table>\n</div>\n");
    let shell = a.tank.shell_height();
    let _ = writeln!(
        o,
        "<p class=\"note\">t_actual is the basis thickness of the course's latest survey; \
         \"allowable level\" is the liquid level each course alone allows (above the top of \
         the shell, {}, it does not limit); \"meets t_min\" is the date the governing rate \
         brings t_actual down to t_min. Status: below t_min; monitor = under 10 years of \
         remaining life; ok. The same numbers are in courses.csv and result.json beside this \
         page.</p>",
        v.len_text(shell)
    );
    if !a.areas.is_empty() {
        let _ = writeln!(
            o,
            "<div class=\"wide\">\n<table class=\"num\">\n<caption>Scanned local thin areas (API 653 4.3.2; the \
             working is in section 5)</caption>\n<thead><tr><th>Scan</th><th>Course</th>\
             <th>Date</th><th>Rules at the operating level</th><th>Allowable level now</th>\
             <th>… at next UT</th></tr>\n<tr class=\"units\"><th></th><th></th><th></th><th></th>\
             <th>{lu}</th><th>{lu}</th></tr></thead>\n<tbody>"
        );
        for x in &a.areas {
            let rules = match x.acceptable {
                Some(true) => "<span class=\"badge ok\">pass</span>".to_string(),
                Some(false) => format!(
                    "<span class=\"badge below\">fail</span> {}",
                    esc(&x.failed_rules().join(", "))
                ),
                None => "<span class=\"badge none\">t1 not computed</span>".to_string(),
            };
            let limit = |l: Option<&crate::calc::area::AreaLimit>| {
                l.map_or("-".to_string(), |l| {
                    format!("{} ({})", n(v.len(l.calc.value), 2), l.kind.name())
                })
            };
            let _ = writeln!(
                o,
                "<tr><td class=\"text\">{}</td><td>{}</td><td>{}</td><td class=\"text\">{rules}</td>\
                 <td>{}</td><td>{}</td></tr>",
                esc(&scan_name(&x.scan.file)),
                x.scan.course,
                x.scan.date,
                limit(Some(&x.max_fill_height)),
                limit(x.max_fill_height_next.as_ref())
            );
        }
        o.push_str("</tbody>\n</table>\n</div>\n");
    }
    let checks = plain(&shell_checks(a, v));
    if !checks.trim().is_empty() {
        let _ = writeln!(o, "<p class=\"note\">{}</p>", esc(checks.trim()));
    }
    o.push_str("</section>\n");
}

/// Text output without its terminal styles (bold, colours).
fn plain(text: &str) -> String {
    anstream::adapter::strip_str(text).to_string()
}

/// What each chart shows and how to read it.
fn chart_caption(id: &str) -> &'static str {
    match id {
        "chart-history" => {
            "One panel per course. Grey circles are the readings of each survey and black \
             dots the survey's basis thickness; the orange line carries the latest basis \
             thickness forward at the governing corrosion rate, and a diamond marks where it \
             meets t_min (the short-dashed line). The blue dashed line is the least-squares \
             fit through the basis thicknesses where there are three or more surveys."
        }
        "chart-profile" => {
            "Each course from its bottom to its top: the nominal plate, the least and the mean \
             reading of its latest survey, and t_min for the operating liquid level (shaded). \
             Where the least reading comes close to t_min, the course governs."
        }
        "chart-fill" => {
            "The liquid level each course allows as it keeps thinning at its governing rate, \
             and their least (heavy line), which is the tank's allowable level. Where the \
             heavy line falls below the operating maximum, the operating level is no longer \
             allowed."
        }
        _ => {
            "Every reading of each course at its latest survey (dots, suspect readings as \
             triangles), with the box from the lower to the upper quartile, the median as a \
             bar and whiskers to the least and greatest reading; t_min and the nominal \
             thickness are marked on each row."
        }
    }
}

fn figures(o: &mut String, s: &ReportSeries, v: &View, charts: &[Chart]) {
    let _ = writeln!(
        o,
        "<section id=\"charts\">\n<h2><span class=\"no\">4</span> Charts</h2>\n<p class=\"note\">\
         Projections run from the latest survey ({}) to {} at each course's governing rate; \
         numbers in {} units. Each chart is also beside this page as a PNG file for other \
         documents.</p>",
        s.start,
        s.horizon,
        v.to.name()
    );
    for (i, c) in charts.iter().enumerate() {
        if c.place == Place::Overview {
            figure(o, c, i + 1, chart_caption(&c.id));
        }
    }
    o.push_str("</section>\n");
}

/// One chart as a figure: its SVG inline (with an id and a title for screen readers),
/// its number, title and caption, and a link to its PNG copy.
pub(super) fn figure(o: &mut String, c: &Chart, number: usize, caption: &str) {
    let svg = c.svg.replacen(
        "<svg ",
        &format!(
            "<svg id=\"{}\" class=\"chart\" role=\"img\" aria-labelledby=\"{}-title\" ",
            c.id, c.id
        ),
        1,
    );
    let svg = match svg.find('>') {
        Some(end) => format!(
            "{}<title id=\"{}-title\">{}</title>{}",
            &svg[..=end],
            c.id,
            esc(&c.title),
            &svg[end + 1..]
        ),
        None => svg,
    };
    let _ = writeln!(
        o,
        "<figure id=\"fig-{}\">\n{}<figcaption><b>Figure {number}. {}.</b> {caption} <a \
         href=\"{}\">PNG copy</a></figcaption>\n</figure>",
        c.id.strip_prefix("chart-").unwrap_or(&c.id),
        svg.trim_end(),
        esc(&c.title),
        esc(&c.file)
    );
}

fn hot_spots(o: &mut String, a: &Assessment, v: &View) {
    let (lu, tu, ru) = (v.to.length_unit(), v.to.thickness_unit(), v.to.rate_unit());
    let _ = writeln!(
        o,
        "<section id=\"hot-spots\">\n<h2><span class=\"no\">7</span> Hot spots</h2>\n<p>The \
         monitoring points with the least remaining life (each point's own rate from its first \
         to its last reading, against its course's t_min). All {} points are in points.csv.</p>",
        a.points.len()
    );
    if a.hot_spots.is_empty() {
        o.push_str("<p>None: no monitoring point shows thinning.</p>\n</section>\n");
        return;
    }
    let _ = writeln!(
        o,
        "<div class=\"wide\">\n<table class=\"num\">\n<thead><tr><th>Point</th><th>Course</th><th>Elevation</th>\
         <th>Azimuth</th><th>First reading</th><th>Last reading</th><th>Rate</th>\
         <th>Remaining life</th></tr>\n<tr class=\"units\"><th></th><th></th><th>{lu}</th>\
         <th>°</th><th>{tu}</th><th>{tu}</th><th>{ru}</th><th>y</th></tr></thead>\n<tbody>"
    );
    let td = v.thk_decimals();
    for &i in &a.hot_spots {
        let Some(p) = a.points.get(i) else { continue };
        let _ = writeln!(
            o,
            "<tr><td class=\"text\">{}</td><td>{}</td><td>{}</td><td>{}</td><td>{} on {}</td>\
             <td>{} on {}</td><td>{}</td><td>{}</td></tr>",
            esc(&p.point),
            p.course,
            p.elevation.map_or("-".into(), |e| n(v.len(e), 2)),
            p.azimuth.map_or("-".into(), |z| n(z, 0)),
            n(v.thk(p.first.1), td),
            p.first.0,
            n(v.thk(p.last.1), td),
            p.last.0,
            p.rate
                .map_or("-".into(), |r| n(v.rate(r), v.rate_decimals())),
            life_text(p.remaining_life)
        );
    }
    o.push_str("</tbody>\n</table>\n</div>\n</section>\n");
}

fn warnings(o: &mut String, a: &Assessment) {
    let _ = writeln!(
        o,
        "<section id=\"warnings\">\n<h2><span class=\"no\">8</span> Warnings ({})</h2>",
        a.warnings.len()
    );
    if a.warnings.is_empty() {
        o.push_str("<p>None.</p>\n");
    } else {
        o.push_str("<ol class=\"warnings\">\n");
        for w in &a.warnings {
            let _ = writeln!(o, "<li>{}</li>", esc(&w.to_string()));
        }
        o.push_str("</ol>\n");
    }
    o.push_str("</section>\n");
}

/// Formulas with their numbers, in the tank's own units (the form the code prints for
/// that system).
pub(super) struct Fmt {
    pub(super) u: UnitSystem,
}

impl Fmt {
    pub(super) fn len(&self, x: f64) -> String {
        n(x, 2)
    }
    pub(super) fn thk(&self, x: f64) -> String {
        match self.u {
            UnitSystem::Si => n(x, 2),
            UnitSystem::Usc => n(x, 4),
        }
    }
    /// A computed thickness, one decimal more than a reading.
    pub(super) fn thk_result(&self, x: f64) -> String {
        match self.u {
            UnitSystem::Si => n(x, 3),
            UnitSystem::Usc => n(x, 4),
        }
    }
    pub(super) fn stress(&self, x: f64) -> String {
        stress_number(x, self.u)
    }
    pub(super) fn rate(&self, x: f64) -> String {
        match self.u {
            UnitSystem::Si => n(x, 4),
            UnitSystem::Usc => n(x, 6),
        }
    }
    pub(super) fn lu(&self) -> &'static str {
        self.u.length_unit()
    }
    pub(super) fn tu(&self) -> &'static str {
        self.u.thickness_unit()
    }
    pub(super) fn su(&self) -> &'static str {
        self.u.stress_unit()
    }
    pub(super) fn ru(&self) -> &'static str {
        self.u.rate_unit()
    }
}

pub(super) fn calc_row(o: &mut String, what: &str, working: &str, source: &str) {
    let _ = writeln!(
        o,
        "<tr><th scope=\"row\">{what}</th><td class=\"working\">{working}</td><td class=\"source\">{source}</td></tr>"
    );
}

fn derivations(o: &mut String, a: &Assessment) {
    let f = Fmt { u: a.tank.units };
    let _ = writeln!(
        o,
        "<section id=\"working\">\n<h2><span class=\"no\">10</span> How each number was \
         obtained</h2>\n<p>Every formula with its numbers substituted, in the tank's own units \
         ({}: lengths in {}, thicknesses in {}, stresses in {}), in the form the code prints \
         for that system. Intermediate values are shown rounded; the results were computed \
         unrounded. \"From memory\" marks a clause or value written from memory of the \
         standard and not checked against the printed edition. The local thin areas are \
         worked in section 5, the extreme-value estimates in section 6 and the design check \
         in section 9.</p>",
        f.u.name(),
        f.lu(),
        f.tu(),
        f.su()
    );
    survey_table(o, a, &f);
    for c in &a.courses {
        course_working(o, a, c, &f);
    }
    tank_working(o, a, &f);
    o.push_str("</section>\n");
}

fn stress_working(s: &AllowableStress, f: &Fmt, material: &str) -> (String, &'static str) {
    let su = f.su();
    match (s.rule, s.rule.factors()) {
        (StressRule::Riveted, _) | (_, None) => (
            format!(
                "S = {} {su} for every course of a riveted shell",
                f.stress(s.value.0)
            ),
            "API 653 4.3.4 (from memory)",
        ),
        (rule, Some((fy, ft))) => {
            let (y, t, tu) = (
                s.yield_strength.map_or(0.0, |x| x.0),
                s.tensile_strength.map_or(0.0, |x| x.0),
                s.tensile_used.map_or(0.0, |x| x.0),
            );
            let courses = match rule {
                StressRule::WeldedLowerCourses => "course 1 or 2 of a welded shell",
                _ => "course 3 and up of a welded shell",
            };
            let cap = if tu < t {
                format!(" (T capped at {} {su})", f.stress(tu))
            } else {
                String::new()
            };
            (
                format!(
                    "{material}: Y = {} {su}, T = {} {su}{cap}; {courses}: S = min({fy:.2} Y, \
                     {ft:.3} T) = min({fy:.2} × {}, {ft:.3} × {}) = min({}, {}) = <b>{} {su}</b>",
                    f.stress(y),
                    f.stress(t),
                    f.stress(y),
                    f.stress(tu),
                    f.stress(s.yield_term.map_or(0.0, |x| x.0)),
                    f.stress(s.tensile_term.map_or(0.0, |x| x.0)),
                    f.stress(s.value.0)
                ),
                "API 653 4.3.3.1 and table 4.1 (from memory); specified minimum Y and T: ASTM \
                 (from memory)",
            )
        }
    }
}

fn t_min_working(t: &TminCalc, a: &Assessment, f: &Fmt) -> String {
    let (lu, tu) = (f.lu(), f.tu());
    let l = &t.load;
    let mut s = format!(
        "H = operating level − z = {} − {} = {} {lu}; t_min = {} D (H − {}) G / (S E) = {} × {} × \
         ({} − {}) × {} / ({} × {:.2}) = {} {tu}",
        f.len(a.tank.max_fill_height.0),
        f.len(l.bottom_elevation.0),
        f.len(t.liquid_height.0),
        t.form.coefficient,
        f.len(t.form.offset.0),
        t.form.coefficient,
        f.len(l.diameter.0),
        f.len(t.liquid_height.0),
        f.len(t.form.offset.0),
        sg_text(l.specific_gravity),
        f.stress(l.stress.0),
        l.joint_efficiency,
        f.thk_result(t.formula.0)
    );
    if t.liquid_height.0 < t.form.offset.0 {
        let _ = write!(s, " (H − {} below 0 is taken as 0)", f.len(t.form.offset.0));
    }
    if t.floor_governs {
        let _ = write!(
            s,
            "; less than the floor of {} {tu}, so <b>t_min = {} {tu}</b>",
            f.thk(t.form.floor.0),
            f.thk_result(t.value.0)
        );
    } else {
        let _ = write!(
            s,
            "; not less than the floor of {} {tu}: <b>t_min = {} {tu}</b>",
            f.thk(t.form.floor.0),
            f.thk_result(t.value.0)
        );
    }
    s
}

fn fill_working(h: &FillHeightCalc, f: &Fmt, label: &str) -> String {
    let (lu, tu) = (f.lu(), f.tu());
    let l = &h.load;
    if h.below_floor {
        return format!(
            "{label}t = {} {tu} is below the floor of {} {tu}: no level is acceptable and the \
             level is limited to the course bottom, <b>{} {lu}</b>",
            f.thk(h.thickness.0),
            f.thk(h.form.floor.0),
            f.len(h.value.0)
        );
    }
    format!(
        "{label}H_max = S E t / ({} D G) + {} + z = {} × {:.2} × {} / ({} × {} × {}) + {} + {} = {} \
         + {} + {} = <b>{} {lu}</b>",
        h.form.coefficient,
        f.len(h.form.offset.0),
        f.stress(l.stress.0),
        l.joint_efficiency,
        f.thk_result(h.thickness.0),
        h.form.coefficient,
        f.len(l.diameter.0),
        sg_text(l.specific_gravity),
        f.len(h.form.offset.0),
        f.len(l.bottom_elevation.0),
        f.len(h.head.0),
        f.len(h.form.offset.0),
        f.len(l.bottom_elevation.0),
        f.len(h.value.0)
    )
}

fn two_point_working(name: &str, r: &RateCalc, f: &Fmt) -> String {
    let (tu, ru) = (f.tu(), f.ru());
    let from = if r.from_nominal {
        format!(
            "nominal {} {tu} at the in-service date {}",
            f.thk(r.t_from.0),
            r.from
        )
    } else {
        format!("{} {tu} on {}", f.thk(r.t_from.0), r.from)
    };
    format!(
        "from {from} to {} {tu} on {}: Δy = days / 365.25 = {} y; {name} = ({} − {}) / {} = <b>{} \
         {ru}</b>{}",
        f.thk(r.t_to.0),
        r.to,
        n(r.years, 3),
        f.thk(r.t_from.0),
        f.thk(r.t_to.0),
        n(r.years, 3),
        f.rate(r.rate.0),
        if r.rate.0 < 0.0 {
            " (negative: apparent thickening)"
        } else {
            ""
        }
    )
}

fn regression_working(g: &RegressionCalc, f: &Fmt) -> String {
    let ru = f.ru();
    format!(
        "least squares of the basis thickness t on y = years since {} over n = {} surveys: t = {} \
         {} {} y; SE(slope) = {}; rate = −slope = <b>{} {ru}</b>; one-sided 95 % upper bound = \
         −slope + t(0.95, {}) × SE = {} + {} × {} = <b>{} {ru}</b>",
        g.origin,
        g.n,
        f.thk_result(g.intercept.0),
        if g.slope <= 0.0 { "−" } else { "+" },
        f.rate(g.slope.abs()),
        f.rate(g.slope_std_error),
        f.rate(g.rate.0),
        g.degrees_of_freedom,
        f.rate(g.rate.0),
        n(g.t_quantile, 3),
        f.rate(g.slope_std_error),
        f.rate(g.rate_upper.0)
    )
}

fn governing_working(r: &GoverningRate, k: &CourseCondition, f: &Fmt) -> String {
    let ru = f.ru();
    let lt = k.long_term.map(|x| x.rate.0);
    let st = k.short_term.map(|x| x.rate.0);
    let mut s = match r.basis {
        RateBasis::Conservative => match (lt, st) {
            (Some(l), Some(s)) => format!(
                "conservative: N = max(LT, ST) = max({}, {})",
                f.rate(l),
                f.rate(s)
            ),
            (Some(_), None) => "conservative, no short-term rate: N = LT".to_string(),
            _ => "conservative, no long-term rate: N = ST".to_string(),
        },
        RateBasis::LongTerm => "long-term: N = LT".to_string(),
        RateBasis::ShortTerm => "short-term: N = ST".to_string(),
        RateBasis::Regression => "regression: N = −slope".to_string(),
        RateBasis::RegressionUpper => "regression upper bound: N = −slope + t × SE".to_string(),
    };
    if r.clamped() {
        let _ = write!(
            s,
            " = {} {ru}, negative (apparent thickening): taken as <b>N = 0</b>",
            f.rate(r.raw.0)
        );
    } else {
        let _ = write!(s, " = <b>{} {ru}</b>", f.rate(r.value.0));
    }
    s
}

fn life_working(c: &CourseResult, k: &CourseCondition, f: &Fmt) -> String {
    let tu = f.tu();
    let (ta, tm) = (k.t_actual().0, c.t_min.value.0);
    let when = k
        .retirement_date
        .map(|d| format!("; meets t_min about <b>{d}</b> ({} + RL)", k.latest.date))
        .unwrap_or_default();
    match (k.remaining_life, k.rate_value()) {
        (RemainingLife::Years(y), _) if ta < tm => format!(
            "t_actual {} {tu} &lt; t_min {} {tu}: <b>RL = {y:.1} y</b>, below t_min now",
            f.thk(ta),
            f.thk_result(tm)
        ),
        (RemainingLife::Years(y), Some(nr)) => format!(
            "RL = (t_actual − t_min) / N = ({} − {}) / {} = <b>{} y</b>{when}",
            f.thk(ta),
            f.thk_result(tm),
            f.rate(nr.0),
            n(y, 2)
        ),
        (RemainingLife::NoMeasurableLoss, _) => {
            "N = 0: no end of life can be projected".to_string()
        }
        _ => "no corrosion rate: remaining life unknown".to_string(),
    }
}

fn interval_working(i: &IntervalCalc, f: &Fmt) -> String {
    let (tu, ru) = (f.tu(), f.ru());
    let (k, cap) = i.kind.rule();
    match i.basis {
        IntervalBasis::NoAllowanceLeft => format!(
            "RCA = t_actual − t_min = {} {tu} ≤ 0: <b>0 years, act now</b>",
            f.thk_result(i.rca.0)
        ),
        IntervalBasis::NoRateKnown => format!(
            "no rate known: <b>{} years</b>",
            n(i.kind.without_rate(), 0)
        ),
        IntervalBasis::Cap if i.from_rate.is_none() => {
            format!("N = 0: the maximum, <b>{} years</b>", n(cap, 0))
        }
        _ => format!(
            "RCA = t_actual − t_min = {} {tu}; min(RCA / ({k:.0} N), {cap:.0}) = min({} / ({k:.0} × \
             {} {ru}), {cap:.0}) = min({}, {cap:.0}) = <b>{} years</b>",
            f.thk_result(i.rca.0),
            f.thk_result(i.rca.0),
            i.rate.map_or("-".into(), |r| f.rate(r.0)),
            i.from_rate.map_or("-".into(), |y| n(y, 2)),
            n(i.years, 2)
        ),
    }
}

fn course_working(o: &mut String, a: &Assessment, c: &CourseResult, f: &Fmt) {
    let lu = f.lu();
    let _ = writeln!(
        o,
        "<article class=\"course-calc\">\n<h3>Course {} <span>z = {} to {} {lu}, nominal {} {}</span></h3>\n\
         <table class=\"working\">\n<thead><tr><th>Quantity</th><th>Working</th><th>Source</th></tr></thead>\n<tbody>",
        c.number,
        f.len(c.bottom_elevation.0),
        f.len(c.bottom_elevation.0 + c.height.0),
        f.thk(c.nominal_thickness.0),
        f.tu()
    );
    let material = a
        .tank
        .course(c.number)
        .map_or("-".to_string(), |k| match &k.material {
            Material::Grade(g) => format!("material {}", esc(g.name)),
            Material::Explicit { .. } => "Y and T from tank.toml".to_string(),
            Material::NotGiven => "material not given".to_string(),
        });
    let (sw, ss) = stress_working(&c.stress, f, &material);
    calc_row(o, "Allowable stress S", &sw, ss);
    calc_row(
        o,
        "Joint efficiency E",
        &format!(
            "{}{}",
            n(c.joint_efficiency, 2),
            if a.tank
                .course(c.number)
                .and_then(|k| k.joint_efficiency)
                .is_some()
            {
                " (this course's value in tank.toml)"
            } else {
                " (the tank's value)"
            }
        ),
        "API 653 4.3.3.1; tank.toml",
    );
    calc_row(
        o,
        "t_min (whole course)",
        &t_min_working(&c.t_min, a, f),
        "API 653 4.3.3.1, one-foot relation (from memory); coefficient = ρ_w g / 2 with unit \
         changes",
    );
    let Some(k) = &c.condition else {
        calc_row(
            o,
            "Measured condition",
            "no readings: thickness, rates, remaining life and the allowable level of this \
             course are not computed",
            "-",
        );
        o.push_str("</tbody>\n</table>\n</article>\n");
        return;
    };
    let l = &k.latest;
    let basis = match a.tank.thickness_basis {
        ThicknessBasis::Minimum => format!("least of the {} readings", l.count),
        ThicknessBasis::Average => format!("mean of the {} readings", l.count),
    };
    let cov = match (l.std_dev, l.cov) {
        (Some(sd), Some(cv)) => format!(
            "; mean {} {tu}, s = {} {tu}, COV = s / mean = {} / {} = {}{}",
            f.thk(l.mean.0),
            f.thk_result(sd),
            f.thk_result(sd),
            f.thk(l.mean.0),
            n(cv, 4),
            if cv <= crate::calc::constants::COV_UNIFORM_LIMIT {
                " (at most 0.10: the mean may represent general metal loss)"
            } else {
                " (above 0.10: treat as local metal loss and scan the area)"
            },
            tu = f.tu()
        ),
        _ => " (one reading: no spread)".to_string(),
    };
    calc_row(
        o,
        "t_actual",
        &format!(
            "{basis} on {}: <b>{} {}</b>{cov}",
            l.date,
            f.thk(l.basis.0),
            f.tu()
        ),
        "API 653 4.3.2 (basis thickness); API 579-1 Part 4 for the COV (from memory)",
    );
    calc_row(
        o,
        "Long-term rate LT",
        &k.long_term.map_or(
            "needs two surveys, or one survey and the in-service date".to_string(),
            |r| two_point_working("LT", &r, f),
        ),
        "API 653 4.4.5 and 6.3 (from memory)",
    );
    calc_row(
        o,
        "Short-term rate ST",
        &k.short_term.map_or("needs two surveys".to_string(), |r| {
            two_point_working("ST", &r, f)
        }),
        "API 653 4.4.5 and 6.3 (from memory)",
    );
    calc_row(
        o,
        "Regression",
        &k.regression
            .map_or("needs three or more surveys".to_string(), |g| {
                regression_working(&g, f)
            }),
        "ordinary least squares; one-sided Student's t quantile (statrs)",
    );
    calc_row(
        o,
        "Governing rate N",
        &k.rate.map_or_else(
            || {
                match k.rate_missing {
                    Some(RateUnavailable::TooFewSurveysForRegression) => {
                        "the chosen regression basis needs three or more surveys: no rate"
                    }
                    Some(RateUnavailable::TooFewSurveys) => {
                        "needs two surveys, or one survey and the in-service date: no rate"
                    }
                    None => "no rate can be computed",
                }
                .to_string()
            },
            |r| governing_working(&r, k, f),
        ),
        "rate basis of tank.toml; conservative = API 510 / 570 practice (from memory); a \
         negative rate is scatter, taken as 0",
    );
    calc_row(
        o,
        "Remaining life RL",
        &life_working(c, k, f),
        "API 653 4.4.5 and 6.3 (from memory)",
    );
    calc_row(
        o,
        "Allowable level now",
        &fill_working(&k.max_fill_height, f, ""),
        "API 653 4.3.3.1 solved for the liquid level",
    );
    if let Some(next) = &k.max_fill_height_next {
        let label = format!(
            "after the tank's UT interval of {} y: t = t_actual − N × {} = {} {tu}; ",
            n(a.summary.ut_interval.years, 2),
            n(a.summary.ut_interval.years, 2),
            f.thk_result(next.thickness.0),
            tu = f.tu()
        );
        calc_row(
            o,
            "Allowable level at the next UT survey",
            &fill_working(next, f, &label),
            "API 653 4.3.3.1 solved for the liquid level, with the thickness after corrosion",
        );
    }
    calc_row(
        o,
        "UT thickness interval",
        &interval_working(&k.ut_interval, f),
        "API 653 6.3.3 (from memory)",
    );
    calc_row(
        o,
        "External inspection interval",
        &interval_working(&k.external_interval, f),
        "API 653 6.3.2 (from memory)",
    );
    o.push_str("</tbody>\n</table>\n</article>\n");
}

fn tank_working(o: &mut String, a: &Assessment, f: &Fmt) {
    let s = &a.summary;
    let lu = f.lu();
    o.push_str(
        "<article class=\"course-calc\">\n<h3>The tank</h3>\n<table class=\"working\">\n<thead><tr>\
         <th>Quantity</th><th>Working</th><th>Source</th></tr></thead>\n<tbody>\n",
    );
    let gov = match (s.governing_course, s.remaining_life) {
        (Some(g), Some(l)) => format!(
            "the course with the least remaining life (the lower on a tie): <b>course {g}</b>, {}",
            match l {
                RemainingLife::Years(y) => format!("{y:.1} years"),
                RemainingLife::NoMeasurableLoss => "no measurable loss".into(),
                RemainingLife::Unknown => "unknown".into(),
            }
        ),
        _ => "none: no course has a known rate".to_string(),
    };
    calc_row(
        o,
        "Governing course",
        &gov,
        "this project's rule (formats.md)",
    );
    let over = if a.areas.is_empty() {
        "measured courses"
    } else {
        "measured courses and scanned areas"
    };
    let level = |l: Option<FillLimit>, area: Option<usize>| {
        l.map_or("not computed".to_string(), |l| {
            format!(
                "least over {over} = <b>{} {lu}</b> ({}){}",
                f.len(l.level.0),
                esc(&setter(l.course, area, a)),
                if l.level.0 >= a.tank.shell_height().0 {
                    format!(
                        "; above the top of the shell ({} {lu}), which is the limit",
                        f.len(a.tank.shell_height().0)
                    )
                } else {
                    String::new()
                }
            )
        })
    };
    calc_row(
        o,
        "Allowable liquid level now",
        &level(s.max_fill_height, s.max_fill_height_area),
        "API 653 4.3.3.1 solved for the liquid level (courses); API 653 4.3.2 rules \
         solved for it (areas); the least",
    );
    calc_row(
        o,
        "… at the next UT survey",
        &level(s.max_fill_height_next, s.max_fill_height_next_area),
        "as above, after the UT interval at each course's rate",
    );
    let interval = |i: &crate::model::result::TankInterval,
                    due: Option<chrono::NaiveDate>,
                    kind: IntervalKind| {
        let what = match kind {
            IntervalKind::UltrasonicThickness => "UT",
            IntervalKind::External => "external",
        };
        format!(
            "least {what} interval over courses with a known rate = {} y ({}); due = latest \
             survey {} + {} y = <b>{}</b>",
            n(i.years, 2),
            esc(&interval_text(i)),
            a.latest_survey,
            n(i.years, 2),
            due.map_or("not computed".to_string(), |d| d.to_string())
        )
    };
    calc_row(
        o,
        "Next UT thickness survey",
        &interval(
            &s.ut_interval,
            s.next_ut_inspection,
            IntervalKind::UltrasonicThickness,
        ),
        "API 653 6.3.3 (from memory); whole years as calendar years, the fraction as days",
    );
    calc_row(
        o,
        "Next external inspection",
        &interval(
            &s.external_interval,
            s.next_external_inspection,
            IntervalKind::External,
        ),
        "API 653 6.3.2 (from memory)",
    );
    o.push_str("</tbody>\n</table>\n</article>\n");
}

fn sign_off(o: &mut String, a: &Assessment) {
    let _ = writeln!(
        o,
        "<section id=\"sign-off\">\n<h2><span class=\"no\">11</span> Caution and sign-off</h2>\n\
         <p class=\"caution\"><b>Caution.</b> {}</p>\n<div class=\"signatures\">",
        esc(CAUTION)
    );
    for role in ["Inspector", "Engineer"] {
        let _ = writeln!(
            o,
            "<table class=\"sign\">\n<caption>{role}</caption>\n<tbody>\n\
             <tr><th scope=\"row\">Name</th><td></td></tr>\n\
             <tr><th scope=\"row\">Certificate no.</th><td></td></tr>\n\
             <tr><th scope=\"row\">Date</th><td></td></tr>\n\
             <tr><th scope=\"row\">Signature</th><td class=\"signature\"></td></tr>\n\
             </tbody>\n</table>"
        );
    }
    let _ = writeln!(
        o,
        "</div>\n<p class=\"note\">Tank {} · assessed as of {} · strake {}.</p>\n</section>\n</main>",
        esc(&a.tank.id),
        a.as_of,
        env!("CARGO_PKG_VERSION")
    );
}

/// The stylesheet: screen first, then print (A4).
const STYLE: &str = r#":root { --ink: #1c232b; --muted: #5b6570; --rule: #d5dbe1; --band: #f3f6f8;
  --accent: #0b5c8a; --fit: #1f7a4d; --watch: #9a6500; --act: #b3261e; }
* { box-sizing: border-box; }
body { margin: 0; color: var(--ink); background: #fff;
  font: 15px/1.45 "DejaVu Sans", Verdana, "Segoe UI", Arial, sans-serif; }
header.masthead, main { max-width: 1000px; margin: 0 auto; padding: 0 24px; }
header.masthead { padding-top: 20px; }
header.masthead::after { content: ""; display: block; border-bottom: 3px solid var(--accent); }
.kicker { margin: 0; color: var(--accent); font-size: 12px; letter-spacing: .08em; text-transform: uppercase; }
h1 { margin: 4px 0 6px; font-size: 26px; }
h1 .name { display: block; font-size: 17px; font-weight: normal; color: var(--muted); }
.meta { margin: 0 0 10px; color: var(--muted); font-size: 13px; }
nav.toc ol { display: flex; flex-wrap: wrap; gap: 4px 18px; margin: 0 0 12px; padding: 0;
  list-style: none; counter-reset: toc; font-size: 13px; }
nav.toc li { counter-increment: toc; }
nav.toc li::before { content: counter(toc) " "; color: var(--muted); }
nav.toc a { color: var(--accent); text-decoration: none; }
section { margin: 26px 0; }
h2 { font-size: 20px; margin: 0 0 10px; padding-bottom: 4px; border-bottom: 1px solid var(--rule); }
h2 .no { display: inline-block; min-width: 1.6em; color: var(--accent); }
h3 { font-size: 16px; margin: 18px 0 6px; }
h3 span { font-weight: normal; color: var(--muted); font-size: 14px; margin-left: 8px; }
.verdict { border-left: 8px solid var(--fit); background: var(--band); padding: 12px 18px 8px; }
.verdict.watch { border-left-color: var(--watch); }
.verdict.act { border-left-color: var(--act); }
.verdict h2 { border-bottom: none; }
.headline { font-size: 19px; font-weight: bold; margin: 0 0 12px; }
.standing { display: inline-block; padding: 1px 8px; margin-right: 6px; border-radius: 3px;
  color: #fff; background: var(--fit); font-size: 13px; letter-spacing: .05em; vertical-align: 2px; }
.watch .standing { background: var(--watch); }
.act .standing { background: var(--act); }
dl.answers { display: grid; grid-template-columns: repeat(2, 1fr); gap: 10px; margin: 0 0 12px; }
dl.answers div { background: #fff; border: 1px solid var(--rule); padding: 8px 12px; }
dl.answers dt { font-size: 12px; text-transform: uppercase; letter-spacing: .06em; color: var(--muted); }
dl.answers dd { margin: 2px 0 0; }
.sentences { margin: 0 0 8px; }
.note { color: var(--muted); font-size: 13px; }
table { border-collapse: collapse; margin: 10px 0 16px; font-size: 13.5px; }
caption { text-align: left; font-weight: bold; padding: 4px 0; }
th, td { padding: 3px 8px; border-bottom: 1px solid var(--rule); vertical-align: top; }
thead th { background: var(--band); text-align: right; font-weight: bold; }
thead tr.units th { font-weight: normal; color: var(--muted); font-size: 12px; }
table.num td { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
table.num td.text, table.num th:first-child { text-align: left; }
table.kv th { text-align: left; font-weight: normal; color: var(--muted); padding-right: 16px; }
table.files { width: 100%; }
table.files th { text-align: left; }
td.path { word-break: break-all; }
table.results { font-size: 13px; }
table.results th, table.results td { padding: 3px 6px; }
.wide { max-width: 100%; overflow-x: auto; }
td.n { text-align: right; }
.cols { display: flex; flex-wrap: wrap; gap: 0 28px; align-items: flex-start; }
tr.governing td { background: #fff7e0; }
.tag { font-size: 11px; color: var(--watch); border: 1px solid var(--watch); border-radius: 3px; padding: 0 3px; }
.badge { font-size: 12px; padding: 0 6px; border-radius: 3px; border: 1px solid; }
.badge.ok { color: var(--fit); }
.badge.monitor { color: var(--watch); font-weight: bold; }
.badge.below { color: #fff; background: var(--act); border-color: var(--act); font-weight: bold; }
.badge.none { color: var(--muted); }
.results { width: 100%; }
.whatif { color: var(--act); font-size: 12px; }
figure { margin: 18px 0 26px; }
svg.chart { display: block; width: 100%; height: auto; border: 1px solid var(--rule); }
figcaption { font-size: 13px; margin-top: 6px; color: var(--ink); }
figcaption a { color: var(--accent); }
ol.warnings li { margin-bottom: 4px; }
article.area { margin: 14px 0 26px; }
.callout { border-left: 4px solid var(--accent); background: var(--band); padding: 8px 14px; }
table.rules, table.design, table.extreme { width: 100%; }
table.num td.wrap { white-space: normal; }
table.design tr.short td { background: #fdecea; }
table.steps { margin: 6px 0; font-size: 12px; }
ul.design-warnings li { margin-bottom: 4px; }
code { font: 12px "DejaVu Sans Mono", Menlo, Consolas, monospace; }
table.working { width: 100%; font-size: 13px; }
table.working th[scope=row] { text-align: left; font-weight: bold; width: 11em; }
table.working thead th { text-align: left; }
td.working { font-variant-numeric: tabular-nums; }
td.source { color: var(--muted); font-size: 12px; width: 15em; }
pre.working { font: 12px/1.4 "DejaVu Sans Mono", Menlo, Consolas, monospace; background: var(--band);
  border: 1px solid var(--rule); padding: 8px 10px; white-space: pre-wrap; }
.caution { border: 1px solid var(--rule); background: var(--band); padding: 10px 14px; }
.signatures { display: flex; flex-wrap: wrap; gap: 0 32px; }
table.sign { flex: 1 1 300px; }
table.sign th { text-align: left; font-weight: normal; color: var(--muted); width: 9em; }
table.sign td { border-bottom: 1px solid var(--ink); height: 2.2em; }
table.sign td.signature { height: 4em; }
@media (max-width: 700px) { dl.answers { grid-template-columns: 1fr; } }
@page { size: A4; margin: 15mm 14mm 16mm;
  @bottom-right { content: "page " counter(page) " of " counter(pages); font: 8pt "DejaVu Sans", Verdana, sans-serif; color: #5b6570; } }
@media print {
  body { font-size: 10pt; }
  header.masthead, main { max-width: none; padding: 0; }
  .wide { overflow: visible; }
  nav.toc { display: none; }
  .verdict, .badge, .standing, thead th, tr.governing td, .caution, .callout,
  table.design tr.short td {
    -webkit-print-color-adjust: exact; print-color-adjust: exact; }
  section { margin: 14px 0; }
  h2, h3 { break-after: avoid; page-break-after: avoid; }
  table, table.results { font-size: 8.5pt; }
  pre.working { font-size: 7.5pt; }
  thead { display: table-header-group; }
  tr, .verdict, dl.answers div, article.course-calc, .signatures, #sign-off, table.results,
  table.kv, table.files, table.sign, table.courses { break-inside: avoid; page-break-inside: avoid; }
  caption { break-after: avoid; page-break-after: avoid; }
  #charts, #working { break-before: page; page-break-before: always; }
  figure { break-inside: avoid; page-break-inside: avoid; margin: 0 0 8mm; }
  #charts figure + figure { break-before: page; page-break-before: always; }
  svg.chart { border: none; max-height: 95vh; }
  a { color: inherit; text-decoration: none; }
}
"#;

#[cfg(test)]
mod tests {
    use super::*;

    /// The five characters HTML gives meaning to (HTML Living Standard, 13.1.2 and
    /// 13.2.5.72 character references), in text and in quoted attribute values.
    #[test]
    fn escapes_markup() {
        assert_eq!(
            esc("<script>alert(1)</script> & \"x\" 'y'"),
            "&lt;script&gt;alert(1)&lt;/script&gt; &amp; &quot;x&quot; &#39;y&#39;"
        );
        assert_eq!(esc("Tänk 7 · 13.80 m"), "Tänk 7 · 13.80 m");
    }
}
