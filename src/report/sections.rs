//! Three sections of index.html: the local thin areas (a heat map per grid scan, the
//! numbers substituted into each rule, pass or fail), the thinnest spot where nobody
//! measured (the Gumbel plot and the extreme-value estimates, or why there are none)
//! and the design check (the required thickness of every course by both methods of
//! API 650, with its working).
//!
//! Tables show the display units (`--units`); the working shows the tank's own units,
//! in the form the code prints for that system, like the rest of the page's working.
//! Every number comes from the result model or the chart series: nothing is computed
//! here but the formatting.

use std::fmt::Write as _;

use crate::calc::area::{AreaAssessment, AreaLimit, DepthRule, RuleKind, Window};
use crate::calc::constants::{
    VDP_BOTTOM_CONSTANT, VDP_BOTTOM_K_SI, VDP_BOTTOM_K_USC, VDP_L_FACTOR_SI, VDP_L_FACTOR_USC,
    VDP_SECOND_A, VDP_SECOND_B, VDP_SECOND_HIGH, VDP_SECOND_LOW, VDP_X1_HEAD_SI, VDP_X1_HEAD_USC,
    VDP_X1_ROOT, VDP_X2_HEAD_SI, VDP_X2_HEAD_USC, VDP_X3_ROOT,
};
use crate::calc::design::{DesignStress, StressOrigin};
use crate::calc::local::{LocalFillCalc, LocalTminCalc};
use crate::calc::units::{Thickness, UnitSystem};
use crate::calc::vdp::{CourseCalc, SecondRegime, UpperCalc};
use crate::model::required::{RequiredCourse, RequiredShell};
use crate::model::result::Assessment;
use crate::model::series::ReportSeries;
use crate::model::tank::Construction;
use crate::report::chart::{Chart, Place};
use crate::report::html::{Fmt, calc_row, esc, figure, n};
use crate::report::verdict::{scan_name, sg_text};
use crate::report::view::View;

/// The chart at `place` and its figure number (its place in page order).
fn chart_at(charts: &[Chart], place: Place) -> Option<(usize, &Chart)> {
    charts
        .iter()
        .enumerate()
        .find(|(_, c)| c.place == place)
        .map(|(i, c)| (i + 1, c))
}

fn pass_badge(pass: bool) -> &'static str {
    if pass {
        "<span class=\"badge ok\">pass</span>"
    } else {
        "<span class=\"badge below\">fail</span>"
    }
}

fn window_text(w: &Window) -> String {
    format!(
        "column {}, rows {}–{}",
        w.column + 1,
        w.first_row + 1,
        w.last_row() + 1
    )
}

// ---------------------------------------------------------------------------------
// 5 Local thin areas
// ---------------------------------------------------------------------------------

/// Section 5: every grid scan with its heat map, rules and allowable level.
pub fn local_areas(o: &mut String, a: &Assessment, v: &View, charts: &[Chart]) {
    o.push_str("<section id=\"areas\">\n<h2><span class=\"no\">5</span> Local thin areas</h2>\n");
    if a.areas.is_empty() {
        o.push_str(
            "<p>No grid scan of a local thin area (<code>scans/*.csv</code>) in this tank \
             folder: each course is judged by its spot readings (section 3). Where a course's \
             readings vary too much for their mean to stand for it, the warnings (section 8) \
             ask for a scan.</p>\n</section>\n",
        );
        return;
    }
    o.push_str(
        "<p>Each scan is judged by the rules for a locally thinned area of API 653 4.3.2.1 \
         and 4.3.2.2 (from memory of the clauses) at the operating liquid level, with the \
         local t_min of 4.3.3.1: 4.9 D H G / (S E) (USC 2.6), H from the bottom of the area, \
         with no one-foot offset. t2 is the least reading and t1 the least mean of k \
         consecutive rows of one column (the rows within the averaging length L), pits and \
         cells not measured left out; a pit may keep no less than half of t_min, and the pits \
         of a column may add up to no more than 50 mm in any 200 mm (2 in in 8 in). Every \
         thickness rule must still hold after the corrosion expected by the next inspection, \
         N × I (the course's governing rate over the tank's UT interval). Each rule inverted \
         gives the liquid level the area allows.</p>\n",
    );
    for (i, x) in a.areas.iter().enumerate() {
        area_article(o, a, x, i, v, charts);
    }
    o.push_str("</section>\n");
}

fn area_verdict(x: &AreaAssessment, v: &View) -> String {
    let level = v.len_text(x.fill_height);
    match x.acceptable {
        Some(true) => format!("acceptable at {level}"),
        Some(false) => {
            let failed = x.failed_rules();
            let names = match failed.as_slice() {
                [one] => format!("the {one} rule fails"),
                [init @ .., last] => format!("the {} and {last} rules fail", init.join(", ")),
                [] => String::new(),
            };
            format!("not acceptable at {level} ({names})")
        }
        None => format!("not decided at {level} (t1 not computed)"),
    }
}

fn area_article(
    o: &mut String,
    a: &Assessment,
    x: &AreaAssessment,
    i: usize,
    v: &View,
    charts: &[Chart],
) {
    let s = &x.scan;
    let _ = writeln!(
        o,
        "<article class=\"area\" id=\"area-{}\">\n<h3>Scan {}: {} <span>course {} · {} · {}</span></h3>",
        i + 1,
        i + 1,
        esc(&scan_name(&s.file)),
        s.course,
        s.date,
        esc(&area_verdict(x, v))
    );
    if let Some((number, c)) = chart_at(charts, Place::Area(i)) {
        figure(
            o,
            c,
            number,
            "Each cell is one reading at its place on the shell (elevation up, the bottom row \
             at the bottom; circumferential position across), coloured by thickness on the \
             scale at the right: viridis, dark for thin, light for thick, which keeps its order \
             in grey print and for colour-blind readers. Hatched cells were not measured; \
             vermillion cells with a cross are pits, which the rules (and the colour scale) \
             leave out of t1 and t2. The ring marks t2; the solid outline is the t1 window, \
             and a dashed outline the window where the t1 rule has the least margin when that \
             is another one.",
        );
    }
    area_rules_table(o, x, v);
    area_working(o, a, x);
    o.push_str("</article>\n");
}

/// The rules with their numbers, in display units (the JSON `areas` fields).
fn area_rules_table(o: &mut String, x: &AreaAssessment, v: &View) {
    let (lu, tu) = (v.to.length_unit(), v.to.thickness_unit());
    let td = v.thk_decimals();
    let t = |th: Thickness| n(v.thk(th), td);
    let _ = writeln!(
        o,
        "<div class=\"wide\">\n<table class=\"num rules\">\n<caption>Rules at the operating level {}: measured ≥ \
         fraction × local t_min at H + N × I (z: the window's lowest row for t1, the grid's \
         bottom row for t2 and the pits)</caption>\n<thead><tr><th>Rule</th><th>Where</th>\
         <th>z</th><th>H</th><th>Local t_min</th><th>Fraction</th><th>N × I</th>\
         <th>Required</th><th>Measured</th><th>Result</th></tr>\n<tr class=\"units\"><th></th>\
         <th></th><th>{lu}</th><th>{lu}</th><th>{tu}</th><th></th><th>{tu}</th><th>{tu}</th>\
         <th>{tu}</th><th></th></tr></thead>\n<tbody>",
        v.len_text(x.fill_height)
    );
    let depth_row = |o: &mut String, name: &str, place: String, r: &DepthRule| {
        let _ = writeln!(
            o,
            "<tr><td class=\"text\">{name}</td><td class=\"text wrap\">{place}</td><td>{}</td>\
             <td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td></tr>",
            n(v.len(r.t_min.load.bottom_elevation), 2),
            n(v.len(r.t_min.liquid_height), 2),
            t(r.t_min.value),
            r.fraction,
            t(r.future_loss),
            t(r.required),
            t(r.measured),
            pass_badge(r.pass)
        );
    };
    match x.t1_rule {
        Some(r) => {
            let place = x.windows.windows.get(r.window).map_or(String::new(), |w| {
                if x.t1 == Some(r.window) {
                    format!("{} (t1 window)", window_text(w))
                } else {
                    format!("{} (critical window)", window_text(w))
                }
            });
            depth_row(o, "t1", place, &r.rule);
        }
        None => {
            let _ = writeln!(
                o,
                "<tr><td class=\"text\">t1</td><td class=\"text\" colspan=\"9\">not computed: \
                 no window of {} rows has half its cells measured</td></tr>",
                x.windows.rows_per_window
            );
        }
    }
    depth_row(
        o,
        "t2",
        format!("row {}, column {}", x.t2.row + 1, x.t2.column + 1),
        &x.t2_rule,
    );
    if let (Some(r), Some(p)) = (&x.pit_depth_rule, x.least_pit) {
        depth_row(
            o,
            "pit depth",
            format!("row {}, column {}", p.row + 1, p.column + 1),
            r,
        );
    }
    let sp = &x.pit_spacing;
    let _ = writeln!(
        o,
        "<tr><td class=\"text\">pit spacing</td><td class=\"text wrap\">{}</td><td>-</td><td>-</td>\
         <td>-</td><td>-</td><td>-</td><td>≤ {} in {}</td><td>{}</td><td>{}</td></tr>",
        sp.worst.map_or("no pits".to_string(), |w| format!(
            "column {}, rows {}–{}",
            w.column + 1,
            w.first_row + 1,
            w.first_row + w.rows
        )),
        t(sp.limit),
        t(sp.span),
        t(sp.worst.map_or(Thickness(0.0), |w| w.length)),
        pass_badge(sp.pass)
    );
    o.push_str("</tbody>\n</table>\n</div>\n");
}

fn local_t_min_text(m: &LocalTminCalc, fill: f64, f: &Fmt) -> String {
    let (lu, tu) = (f.lu(), f.tu());
    let l = &m.load;
    let mut s = format!(
        "H = {} − z = {} − {} = {} {lu}; t_min = {} D H G / (S E) = {} × {} × {} × {} / ({} × \
         {:.2}) = {} {tu}",
        f.len(fill),
        f.len(fill),
        f.len(l.bottom_elevation.0),
        f.len(m.liquid_height.0),
        m.form.coefficient,
        m.form.coefficient,
        f.len(l.diameter.0),
        f.len(m.liquid_height.0.max(0.0)),
        sg_text(l.specific_gravity),
        f.stress(l.stress.0),
        l.joint_efficiency,
        f.thk_result(m.formula.0)
    );
    if m.floor_governs {
        let _ = write!(
            s,
            ", below the floor: t_min = {} {tu}",
            f.thk_result(m.value.0)
        );
    }
    s
}

fn depth_working(r: &DepthRule, fill: f64, f: &Fmt) -> String {
    let tu = f.tu();
    format!(
        "{}; required = {} × t_min + N × I = {} × {} + {} = {} {tu}; measured {} {tu} {} {} \
         {tu}: <b>{}</b>",
        local_t_min_text(&r.t_min, fill, f),
        r.fraction,
        r.fraction,
        f.thk_result(r.t_min.value.0),
        f.thk_result(r.future_loss.0),
        f.thk_result(r.required.0),
        f.thk_result(r.measured.0),
        if r.pass { "≥" } else { "&lt;" },
        f.thk_result(r.required.0),
        if r.pass { "pass" } else { "fail" }
    )
}

fn level_working(l: &AreaLimit, x: &AreaAssessment, f: &Fmt, label: &str) -> String {
    let (lu, tu) = (f.lu(), f.tu());
    let c: &LocalFillCalc = &l.calc;
    let which = match (l.kind, l.window.and_then(|i| x.windows.windows.get(i))) {
        (RuleKind::T1, Some(w)) => format!("t1 rule, {}", window_text(w)),
        (k, _) => format!("{} rule", k.name()),
    };
    if c.below_floor {
        return format!(
            "{label}t' = {} {tu} is below {} × the floor {} {tu}: no level satisfies the {which}; \
             the level is limited to the bottom of the area, <b>{} {lu}</b>",
            f.thk_result(c.thickness.0),
            c.fraction,
            f.thk(c.form.floor.0),
            f.len(c.value.0)
        );
    }
    format!(
        "{label}H_max = S E t' / (f {} D G) + z = {} × {:.2} × {} / ({} × {} × {} × {}) + {} = {} + \
         {} = <b>{} {lu}</b> (the least over the rules: {which})",
        c.form.coefficient,
        f.stress(c.load.stress.0),
        c.load.joint_efficiency,
        f.thk_result(c.thickness.0),
        c.fraction,
        c.form.coefficient,
        f.len(c.load.diameter.0),
        sg_text(c.load.specific_gravity),
        f.len(c.load.bottom_elevation.0),
        f.len(c.head.0),
        f.len(c.load.bottom_elevation.0),
        f.len(c.value.0)
    )
}

/// The working of one scan, in the tank's own units.
fn area_working(o: &mut String, a: &Assessment, x: &AreaAssessment) {
    let f = Fmt { u: a.tank.units };
    let (lu, tu) = (f.lu(), f.tu());
    let s = &x.scan;
    let units = a.tank.units;
    o.push_str(
        "<table class=\"working\">\n<thead><tr><th>Quantity</th><th>Working</th><th>Source</th>\
         </tr></thead>\n<tbody>\n",
    );
    calc_row(
        o,
        "File",
        &format!("<span class=\"path\">{}</span>", esc(&s.file)),
        "scans/",
    );
    let pits = match s.pit_threshold {
        None => "no pit threshold given: no reading is a pit".to_string(),
        Some(p) => format!(
            "{} pit{} (readings below the pit threshold {} {tu})",
            s.pits(),
            if s.pits() == 1 { "" } else { "s" },
            f.thk(p.0)
        ),
    };
    calc_row(
        o,
        "Grid",
        &format!(
            "{} rows × {} columns, {} × {} {tu} apart; rows from {} {lu} (row 1) to {} {lu} (row \
             {}); {} readings, {} not measured, {pits}",
            s.rows(),
            s.columns(),
            f.thk(s.row_pitch.0),
            f.thk(s.column_pitch.0),
            f.len(s.bottom_elevation.0),
            f.len(s.top_elevation(units).0),
            s.rows(),
            s.readings(),
            s.not_measured()
        ),
        "the scan file",
    );
    calc_row(
        o,
        "t2",
        &format!(
            "the least reading, pits left out: <b>{} {tu}</b> (row {}, column {})",
            f.thk(x.t2.value.0),
            x.t2.row + 1,
            x.t2.column + 1
        ),
        "API 653 4.3.2.1 (from memory)",
    );
    let l = &x.averaging_length;
    let (d_text, d_unit) = match units {
        UnitSystem::Si => (format!("{:.0}", l.diameter_in_formula), "mm"),
        UnitSystem::Usc => (f.len(l.diameter_in_formula), "ft"),
    };
    calc_row(
        o,
        "Averaging length L",
        &format!(
            "L = {} √(D t2) = {} × √({d_text} {d_unit} × {} {tu}) = {} {tu}{}",
            l.form.averaging_coefficient,
            l.form.averaging_coefficient,
            f.thk(l.t2.0),
            f.thk_result(l.formula.0),
            if l.capped {
                format!(
                    ", more than the cap: <b>L = {} {tu}</b>",
                    f.thk(l.form.averaging_cap.0)
                )
            } else {
                format!(
                    " (not more than the cap of {} {tu}): <b>L = {} {tu}</b>",
                    f.thk(l.form.averaging_cap.0),
                    f.thk_result(l.value.0)
                )
            }
        ),
        "API 653 4.3.2.1 (from memory); USC 3.7 √(D[ft] t2[in]), SI in consistent units \
         (methods.md s.5)",
    );
    calc_row(
        o,
        "Rows per window k",
        &format!(
            "k = floor(L / row pitch) + 1 = floor({} / {}) + 1 = <b>{}</b>; {} windows of {} rows \
             used, {} skipped (fewer than half their cells valid)",
            f.thk_result(l.value.0),
            f.thk(s.row_pitch.0),
            x.windows.rows_per_window,
            x.windows.windows.len(),
            x.windows.rows_per_window.min(s.rows()),
            x.windows.skipped
        ),
        "this project's window rule",
    );
    calc_row(
        o,
        "t1",
        &x.t1_window().map_or(
            "not computed: no window has half its cells measured".to_string(),
            |w| {
                format!(
                    "the least window mean: <b>{} {tu}</b>, {} ({} to {} {lu}, {} readings)",
                    f.thk_result(w.mean.0),
                    window_text(w),
                    f.len(w.bottom_elevation.0),
                    f.len(w.top_elevation.0),
                    w.valid
                )
            },
        ),
        "API 653 4.3.2.1 (from memory)",
    );
    let fut = &x.future;
    calc_row(
        o,
        "Corrosion to the next inspection",
        &match fut.rate {
            Some(r) => format!(
                "N × I = {} {} × {} y (the tank's UT interval) = <b>{} {tu}</b>",
                f.rate(r.0),
                f.ru(),
                n(fut.years, 2),
                f.thk_result(fut.loss.0)
            ),
            None => format!(
                "no corrosion rate for course {}: the rules are checked as measured (N × I = 0)",
                s.course
            ),
        },
        "API 653 4.3.2 with 6.3.3 (from memory)",
    );
    let fill = x.fill_height.0;
    if let Some(r) = &x.t1_rule {
        let w = x.windows.windows.get(r.window);
        let critical = if x.t1 == Some(r.window) {
            "at the t1 window, which is also where the margin is least".to_string()
        } else {
            w.map_or(String::new(), |w| {
                format!(
                    "at the critical window ({}): a lower window's higher t_min leaves it the \
                     least margin",
                    window_text(w)
                )
            })
        };
        calc_row(
            o,
            "t1 rule",
            &format!(
                "every window mean ≥ t_min(z of its lowest row) + N × I; {critical}: {}",
                depth_working(&r.rule, fill, &f)
            ),
            "API 653 4.3.2.1 with 4.3.3.1 (from memory)",
        );
    }
    calc_row(
        o,
        "t2 rule",
        &format!(
            "t2 ≥ 0.6 t_min(z of the bottom row) + N × I: {}",
            depth_working(&x.t2_rule, fill, &f)
        ),
        "API 653 4.3.2.1 (from memory)",
    );
    if let Some(r) = &x.pit_depth_rule {
        calc_row(
            o,
            "Pit depth",
            &format!(
                "least pit ≥ 0.5 t_min(z of the bottom row) + N × I: {}",
                depth_working(r, fill, &f)
            ),
            "API 653 4.3.2.2 a (from memory)",
        );
    }
    let sp = &x.pit_spacing;
    calc_row(
        o,
        "Pit spacing",
        &match sp.worst {
            None => format!(
                "no pits: nothing to add up (at most {} {tu} in any {} {tu}): <b>pass</b>",
                f.thk(sp.limit.0),
                f.thk(sp.span.0)
            ),
            Some(w) => format!(
                "a pit reading stands for one row pitch of its column; every run of \
                 ceil({} / {}) = {} rows of a column; the most: {} pit{} × {} = {} {tu} in \
                 column {}, rows {}–{}; {} {} {} {tu}: <b>{}</b>",
                f.thk(sp.span.0),
                f.thk(s.row_pitch.0),
                sp.rows_per_span,
                w.pits,
                if w.pits == 1 { "" } else { "s" },
                f.thk(s.row_pitch.0),
                f.thk(w.length.0),
                w.column + 1,
                w.first_row + 1,
                w.first_row + w.rows,
                f.thk(w.length.0),
                if sp.pass { "≤" } else { "&gt;" },
                f.thk(sp.limit.0),
                if sp.pass { "pass" } else { "fail" }
            ),
        },
        "API 653 4.3.2.2 b (from memory); pit length convention this project's",
    );
    calc_row(
        o,
        "Allowable level now",
        &level_working(&x.max_fill_height, x, &f, ""),
        "methods.md s.4, local form: each rule solved for the liquid level",
    );
    if let Some(next) = &x.max_fill_height_next {
        calc_row(
            o,
            "… at the next inspection",
            &level_working(
                next,
                x,
                &f,
                &format!(
                    "thicknesses less N × I = {} {tu}; ",
                    f.thk_result(x.future.loss.0)
                ),
            ),
            "as above, after the corrosion to the next inspection",
        );
    }
    let own = View::new(a.tank.units, None);
    calc_row(
        o,
        "Verdict",
        &format!("<b>{}</b>", esc(&area_verdict(x, &own))),
        "every rule must pass",
    );
    o.push_str("</tbody>\n</table>\n");
}

// ---------------------------------------------------------------------------------
// 6 Extreme values
// ---------------------------------------------------------------------------------

/// Section 6: the Gumbel plot and the extreme-value estimate of every course, or why
/// there is none.
pub fn extreme_values(o: &mut String, a: &Assessment, v: &View, charts: &[Chart]) {
    o.push_str(
        "<section id=\"extreme-values\">\n<h2><span class=\"no\">6</span> Thinnest spot where \
         nobody measured</h2>\n<p>Spot readings sample only part of a course. Where a course's \
         readings come in equal blocks (the readings of one drop that lie on the course), the \
         greatest wall loss of each block (nominal − least reading) is fitted with a Gumbel \
         (largest extreme value) distribution, and the loss expected somewhere on the whole \
         course is read off at the return period T = course area / block area: x_T = u + a \
         y_T, y_T = −ln(−ln(1 − 1/T)) (ASTM G16 practice, from memory; methods.md s.8). The \
         estimate stands beside the least reading measured, never in its place; r, the \
         correlation of the Gumbel plot, near 1 says the maxima lie on the straight line a \
         Gumbel population gives.</p>\n",
    );
    if let Some((number, c)) = chart_at(charts, Place::ExtremeValues) {
        figure(
            o,
            c,
            number,
            "One panel per course with an estimate. Blue dots are the drops' greatest wall \
             losses in ascending order at their reduced variates (plotting position i / (n + \
             1)); the orange line is the fitted loss = u + a y, carried out to y_T, where the \
             diamond marks x_T, the greatest loss expected over the whole course. The dashed \
             vermillion line, where shown, is the loss that would leave t_min.",
        );
    }
    if a.courses.iter().all(|c| c.extreme_value.is_err()) {
        let reasons: Vec<String> = a
            .courses
            .iter()
            .filter_map(|c| c.extreme_value.as_ref().err().map(ToString::to_string))
            .collect();
        match reasons.first() {
            Some(first) if reasons.iter().all(|r| r == first) => {
                let _ = writeln!(
                    o,
                    "<p><b>Not estimated for any course:</b> {}.</p>",
                    esc(first)
                );
            }
            _ => {
                o.push_str("<p><b>Not estimated for any course:</b></p>\n<ul>\n");
                for c in &a.courses {
                    if let Err(why) = &c.extreme_value {
                        let _ =
                            writeln!(o, "<li>course {}: {}</li>", c.number, esc(&why.to_string()));
                    }
                }
                o.push_str("</ul>\n");
            }
        }
        o.push_str("</section>\n");
        return;
    }
    let (tu, td) = (v.to.thickness_unit(), v.thk_decimals());
    let t = |x: Thickness| n(v.thk(x), td);
    let _ = writeln!(
        o,
        "<div class=\"wide\">\n<table class=\"num extreme\">\n<caption>Extreme-value estimate by course (latest \
         survey of each course)</caption>\n<thead><tr><th>Course</th><th>Drops</th><th>T</th>\
         <th>y_T</th><th>Fit</th><th>u</th><th>a</th><th>x_T</th><th>Estimate</th>\
         <th>Least measured</th><th>t_min</th><th>r</th></tr>\n<tr class=\"units\"><th></th>\
         <th></th><th></th><th></th><th></th><th>{tu}</th><th>{tu}</th><th>{tu}</th><th>{tu}</th>\
         <th>{tu}</th><th>{tu}</th><th></th></tr></thead>\n<tbody>"
    );
    for c in &a.courses {
        match &c.extreme_value {
            Ok(e) => {
                let _ = writeln!(
                    o,
                    "<tr><td>{}</td><td>{} × {}</td><td>{:.0}</td><td>{}</td><td class=\"text\">{}</td>\
                     <td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td></tr>",
                    c.number,
                    e.blocks.len(),
                    e.blocks.first().map_or(0, |b| b.readings),
                    e.return_period,
                    n(e.reduced_variate, 3),
                    e.method.name(),
                    n(v.thk(Thickness(e.fit.location)), td + 1),
                    n(v.thk(Thickness(e.fit.scale)), td + 1),
                    t(e.loss),
                    t(e.estimated_least),
                    t(e.measured_least),
                    t(c.t_min.value),
                    n(e.plot_correlation, 3)
                );
            }
            Err(why) => {
                let _ = writeln!(
                    o,
                    "<tr><td>{}</td><td class=\"text\" colspan=\"11\">not estimated: {}</td></tr>",
                    c.number,
                    esc(&why.to_string())
                );
            }
        }
    }
    o.push_str("</tbody>\n</table>\n</div>\n");
    let estimated: Vec<_> = a
        .courses
        .iter()
        .filter_map(|c| c.extreme_value.as_ref().ok().map(|e| (c, e)))
        .collect();
    if !estimated.is_empty() {
        let f = Fmt { u: a.tank.units };
        let (lu, tu) = (f.lu(), f.tu());
        o.push_str(
            "<table class=\"working\">\n<thead><tr><th>Course</th><th>Working</th><th>Source</th>\
             </tr></thead>\n<tbody>\n",
        );
        for (c, e) in estimated {
            let ml = e.max_likelihood.map_or(
                "maximum likelihood did not settle: the moments fit is used".to_string(),
                |m| {
                    format!(
                        "maximum likelihood (Newton, {} steps): u = {}, a = {}",
                        m.iterations,
                        f.thk_result(m.fit.location),
                        f.thk_result(m.fit.scale)
                    )
                },
            );
            calc_row(
                o,
                &format!("Course {}", c.number),
                &format!(
                    "{} blocks of {} readings; moments: u = {}, a = {}; {ml}; T = π D h / (w h) \
                     = {} {lu}² / {} {lu}² = {:.1}; y_T = −ln(−ln(1 − 1/T)) = {}; x_T = u + a \
                     y_T = {} + {} × {} = {} {tu}; estimate = nominal − x_T = {} − {} = <b>{} \
                     {tu}</b>, beside the least reading {} {tu} and t_min {} {tu}",
                    e.blocks.len(),
                    e.blocks.first().map_or(0, |b| b.readings),
                    f.thk_result(e.moments.location),
                    f.thk_result(e.moments.scale),
                    f.len(e.course_area),
                    f.len(e.block_area),
                    e.return_period,
                    n(e.reduced_variate, 4),
                    f.thk_result(e.fit.location),
                    f.thk_result(e.fit.scale),
                    n(e.reduced_variate, 4),
                    f.thk_result(e.loss.0),
                    f.thk(e.nominal.0),
                    f.thk_result(e.loss.0),
                    f.thk_result(e.estimated_least.0),
                    f.thk(e.measured_least.0),
                    f.thk_result(c.t_min.value.0)
                ),
                "ASTM G16 practice (from memory); blocks and their width this project's",
            );
        }
        o.push_str("</tbody>\n</table>\n");
    }
    o.push_str("</section>\n");
}

// ---------------------------------------------------------------------------------
// 9 Design check
// ---------------------------------------------------------------------------------

fn design_stress_text(s: &DesignStress, factors: (&str, &str), f: &Fmt) -> String {
    let su = f.su();
    match s.origin {
        StressOrigin::Given => format!("{} {su} (given in tank.toml)", f.stress(s.value.0)),
        StressOrigin::Material {
            yield_strength,
            tensile_strength,
            yield_term,
            tensile_term,
        } => format!(
            "min({} Y, {} T) = min({} × {}, {} × {}) = min({}, {}) = {} {su}",
            factors.0,
            factors.1,
            factors.0,
            f.stress(yield_strength.0),
            factors.1,
            f.stress(tensile_strength.0),
            f.stress(yield_term.0),
            f.stress(tensile_term.0),
            f.stress(s.value.0)
        ),
    }
}

/// Section 9: the required thickness by both methods of API 650, beside the
/// in-service assessment.
pub fn design_check(o: &mut String, a: &Assessment, s: &ReportSeries, v: &View, charts: &[Chart]) {
    let d = &s.design;
    let what_if = a.overrides.specific_gravity_from_file.is_some()
        || a.overrides.fill_height_from_file.is_some();
    let _ = writeln!(
        o,
        "<section id=\"design-check\">\n<h2><span class=\"no\">9</span> Design check: required \
         thickness by both methods</h2>\n<p class=\"callout\"><b>A design / re-rating check \
         beside the in-service assessment, not a replacement for it.</b> It sizes the shell as \
         API 650 would for a new tank at the design liquid level {} and SG {}{}: with the \
         design stress S_d and the hydrotest stress S_t of each course's material, the design \
         corrosion allowance of tank.toml (<code>corrosion_allowance</code>, 0 when not given) \
         and the minimum nominal thickness for the diameter, and compares the result with the \
         nominal plate. Whether the shell is fit today is the in-service assessment above (API \
         653: measured thickness against t_min), which this check does not change.{}</p>",
        v.len_text(d.fill_height),
        sg_text(d.specific_gravity),
        if what_if {
            " (the what-if values of this assessment)"
        } else {
            " (the operating values of tank.toml)"
        },
        if a.tank.construction == Construction::Riveted {
            " This tank is riveted: API 650 sizes welded shells, so for it the check is a \
             comparison only."
        } else {
            ""
        }
    );
    design_applicability(o, d, v);
    if let Some((number, c)) = chart_at(charts, Place::Design) {
        figure(
            o,
            c,
            number,
            "Each course from its bottom to its top: the thickness each method requires (the \
             largest of its design thickness, its hydrotest thickness and the minimum nominal \
             thickness), with the design and hydrotest thicknesses as markers (one-foot above, \
             variable design point below the middle of the course), the minimum nominal \
             thickness for the diameter, the nominal plate and the design liquid level \
             (shaded). Where the nominal line stands right of the required lines, the plate \
             is thick enough by design.",
        );
    }
    design_table(o, d, v);
    design_points_table(o, d, v);
    if !d.warnings.is_empty() {
        o.push_str("<ul class=\"design-warnings\">\n");
        for w in &d.warnings {
            let _ = writeln!(o, "<li>{}</li>", esc(&w.to_string()));
        }
        o.push_str("</ul>\n");
    }
    design_working(o, d);
    o.push_str("</section>\n");
}

fn design_applicability(o: &mut String, d: &RequiredShell, v: &View) {
    let f = Fmt { u: d.units };
    let (lu, tu) = (f.lu(), f.tu());
    let (limit, l_factor, ratio_limit) = match d.units {
        UnitSystem::Si => ("61 m", VDP_L_FACTOR_SI, "1000/6 = 166.7"),
        UnitSystem::Usc => ("200 ft", VDP_L_FACTOR_USC, "2"),
    };
    let ap = &d.vdp_applicability;
    let _ = writeln!(
        o,
        "<table class=\"working applicability\">\n<caption>Which method applies</caption>\n\
         <thead><tr><th>Method</th><th>Check</th><th>Source</th></tr></thead>\n<tbody>"
    );
    calc_row(
        o,
        "One-foot method",
        &format!(
            "D = {} {lu} {} {limit}: <b>{}</b>",
            f.len(d.diameter.0),
            if d.one_foot_applies { "≤" } else { "&gt;" },
            if d.one_foot_applies {
                "applies"
            } else {
                "beyond its limit; shown for comparison only"
            }
        ),
        "API 650 5.6.3.1 (from memory)",
    );
    calc_row(
        o,
        "Variable-design-point method",
        &format!(
            "L = √({l_factor} D t) = √({l_factor} × {} × {}) = {} {tu} (t: the bottom course's \
             thickness by this method, the larger of design less CA and hydrotest); L / H = {} / \
             {} = {} {} {ratio_limit}: <b>{}</b>",
            f.len(d.diameter.0),
            f.thk_result(ap.bottom_thickness.0),
            n(ap.l, 1),
            n(ap.l, 1),
            f.len(ap.liquid_level.0),
            n(ap.ratio, 2),
            if ap.holds { "≤" } else { "&gt;" },
            if ap.holds {
                "applies"
            } else {
                "does not apply; the one-foot result stands"
            }
        ),
        "API 650 5.6.4.1 (from memory)",
    );
    o.push_str("</tbody>\n</table>\n");
    let _ = v;
}

/// The per-course table: the fields of `strake required --format json`, in display
/// units.
fn design_table(o: &mut String, d: &RequiredShell, v: &View) {
    let (tu, su) = (v.to.thickness_unit(), v.to.stress_unit());
    let td = v.thk_decimals();
    let t = |x: Option<Thickness>| x.map_or("-".to_string(), |x| n(v.thk(x), td));
    let stress = |x: crate::calc::units::Stress| match v.to {
        UnitSystem::Si => n(v.stress(x), 1),
        UnitSystem::Usc => n(v.stress(x), 0),
    };
    let _ = writeln!(
        o,
        "<div class=\"wide\">\n<table class=\"num design\">\n<caption>Required thickness by course (the numbers of \
         <code>strake required</code>)</caption>\n<thead><tr><th>Course</th><th>CA</th>\
         <th>S_d</th><th>S_t</th><th>One-foot design</th><th>One-foot test</th><th>VDP \
         design</th><th>VDP test</th><th>Minimum nominal</th><th>Required, one-foot</th>\
         <th>Required, VDP</th><th>Nominal</th><th>One-foot − VDP</th></tr>\n<tr \
         class=\"units\"><th></th><th>{tu}</th><th>{su}</th><th>{su}</th><th>{tu}</th>\
         <th>{tu}</th><th>{tu}</th><th>{tu}</th><th>{tu}</th><th>{tu}</th><th>{tu}</th>\
         <th>{tu}</th><th>{tu}</th></tr></thead>\n<tbody>"
    );
    for c in &d.courses {
        let short = c
            .nominal
            .is_some_and(|nom| nom.0 < c.required_one_foot.0 && d.one_foot_applies);
        let _ = writeln!(
            o,
            "<tr{}><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td>\
             <td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td></tr>",
            if short { " class=\"short\"" } else { "" },
            c.number,
            t(Some(c.corrosion_allowance)),
            stress(c.design_stress.value),
            stress(c.test_stress.value),
            t(Some(c.one_foot.design)),
            t(Some(c.one_foot.test)),
            t(c.vdp_design_thickness()),
            t(c.vdp_test_thickness()),
            t(Some(c.minimum_nominal)),
            t(Some(c.required_one_foot)),
            t(c.required_vdp),
            t(c.nominal),
            t(c.difference())
        );
    }
    o.push_str("</tbody>\n</table>\n</div>\n");
    o.push_str(
        "<p class=\"note\">design = the product at its SG with S_d, plus CA; test = water \
         with S_t, no CA; required = the largest of design, test and the minimum nominal \
         thickness (API 650 5.6.1.1). One-foot − VDP: the steel the variable-design-point \
         method saves.</p>\n",
    );
}

/// The rest of the `strake required` course fields: where each course is, and the
/// design point x of the variable-design-point method with its steps, per condition.
fn design_points_table(o: &mut String, d: &RequiredShell, v: &View) {
    if !d.vdp_applicability.holds {
        return;
    }
    let (lu, tu) = (v.to.length_unit(), v.to.thickness_unit());
    let xd = match v.to {
        UnitSystem::Si => 1,
        UnitSystem::Usc => 2,
    };
    let x = |c: &Option<CourseCalc>| {
        c.as_ref()
            .and_then(CourseCalc::design_point)
            .map_or("-".to_string(), |x| n(v.thk(Thickness(x)), xd))
    };
    let steps = |c: &Option<CourseCalc>| match c {
        Some(CourseCalc::Upper(u)) => u.steps.len().to_string(),
        Some(CourseCalc::Second(s)) => s.t2a.steps.len().to_string(),
        _ => "-".to_string(),
    };
    let _ = writeln!(
        o,
        "<div class=\"wide\">\n<table class=\"num design-points\">\n<caption>Design point x of the \
         variable-design-point method (above the bottom of the course; the second course's \
         is that of t2a)</caption>\n<thead><tr><th>Course</th><th>Bottom z</th>\
         <th>Height</th><th>x, design</th><th>Steps, design</th><th>x, test</th>\
         <th>Steps, test</th></tr>\n<tr class=\"units\"><th></th><th>{lu}</th><th>{lu}</th>\
         <th>{tu}</th><th></th><th>{tu}</th><th></th></tr></thead>\n<tbody>"
    );
    for c in &d.courses {
        let _ = writeln!(
            o,
            "<tr><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td></tr>",
            c.number,
            n(v.len(c.bottom_elevation), 2),
            n(v.len(c.height), 2),
            x(&c.vdp_design),
            steps(&c.vdp_design),
            x(&c.vdp_test),
            steps(&c.vdp_test)
        );
    }
    o.push_str("</tbody>\n</table>\n</div>\n");
}

fn upper_steps(o: &mut String, u: &UpperCalc, f: &Fmt) {
    let tu = f.tu();
    let _ = writeln!(
        o,
        "<table class=\"num steps\">\n<thead><tr><th>Step</th><th>t_u</th><th>K</th><th>C</th>\
         <th>x1</th><th>x2</th><th>x3</th><th>x</th><th>t_x</th></tr>\n<tr class=\"units\">\
         <th></th><th>{tu}</th><th></th><th></th><th>{tu}</th><th>{tu}</th><th>{tu}</th>\
         <th>{tu}</th><th>{tu}</th></tr></thead>\n<tbody>"
    );
    let d = match f.u {
        UnitSystem::Si => 1,
        UnitSystem::Usc => 3,
    };
    for (i, st) in u.steps.iter().enumerate() {
        let _ = writeln!(
            o,
            "<tr><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td><td>{}</td>\
             <td>{}</td><td>{}</td></tr>",
            i + 1,
            f.thk_result(st.t_u.0),
            n(st.k, 4),
            n(st.c, 4),
            n(st.x[0], d),
            n(st.x[1], d),
            n(st.x[2], d),
            n(st.x_min, d),
            f.thk_result(st.t_x.0)
        );
    }
    o.push_str("</tbody>\n</table>\n");
}

/// The working of the design check, in the shell's own units: the stresses and the
/// one-foot thickness of the bottom course, the variable design point of the bottom
/// course, the second course's ratio and regime, and one upper course's iteration.
fn design_working(o: &mut String, d: &RequiredShell) {
    let f = Fmt { u: d.units };
    let (lu, tu, su) = (f.lu(), f.tu(), f.su());
    let (x1_head, x2_head, per_length, bottom_k) = match d.units {
        UnitSystem::Si => (VDP_X1_HEAD_SI, VDP_X2_HEAD_SI, "1000", VDP_BOTTOM_K_SI),
        UnitSystem::Usc => (VDP_X1_HEAD_USC, VDP_X2_HEAD_USC, "12", VDP_BOTTOM_K_USC),
    };
    o.push_str(
        "<article class=\"course-calc\">\n<h3>How the required thickness was obtained \
         <span>design condition in full; the hydrotest condition repeats it with water (G = \
         1), S_t and no CA</span></h3>\n<table class=\"working\">\n<thead><tr><th>Quantity</th>\
         <th>Working</th><th>Source</th></tr></thead>\n<tbody>\n",
    );
    let Some(c1) = d.courses.first() else {
        o.push_str("</tbody>\n</table>\n</article>\n");
        return;
    };
    calc_row(
        o,
        "Stresses, course 1",
        &format!(
            "S_d = {}; S_t = {}",
            design_stress_text(&c1.design_stress, ("2/3", "2/5"), &f),
            design_stress_text(&c1.test_stress, ("3/4", "3/7"), &f)
        ),
        "API 650 5.6.2 (from memory of the table basis); Y and T: ASTM minimums (from memory)",
    );
    let of = &c1.one_foot;
    calc_row(
        o,
        "One-foot, course 1",
        &format!(
            "H = {} {lu}; t_d = {} D (H − {}) G / S_d + CA = {} × {} × ({} − {}) × {} / {} + {} = \
             <b>{} {tu}</b>; t_t = {} D (H − {}) / S_t = {} × {} × {} / {} = <b>{} {tu}</b>; \
             minimum nominal {} {tu}; required = max = <b>{} {tu}</b>",
            f.len(of.liquid_height.0),
            of.form.coefficient,
            f.len(of.form.offset.0),
            of.form.coefficient,
            f.len(d.diameter.0),
            f.len(of.liquid_height.0),
            f.len(of.form.offset.0),
            sg_text(d.specific_gravity),
            f.stress(c1.design_stress.value.0),
            f.thk(c1.corrosion_allowance.0),
            f.thk_result(of.design.0),
            of.form.coefficient,
            f.len(of.form.offset.0),
            of.form.coefficient,
            f.len(d.diameter.0),
            f.len(of.head.0),
            f.stress(c1.test_stress.value.0),
            f.thk_result(of.test.0),
            f.thk(c1.minimum_nominal.0),
            f.thk_result(c1.required_one_foot.0)
        ),
        "API 650 5.6.3.2 (from memory); 5.6.1.1 for the minimum nominal thickness",
    );
    if !d.vdp_applicability.holds {
        calc_row(
            o,
            "Variable design point",
            "not applied: L / H is above its limit (see above)",
            "API 650 5.6.4.1 (from memory)",
        );
        o.push_str("</tbody>\n</table>\n</article>\n");
        return;
    }
    if let Some(CourseCalc::Bottom(b)) = &c1.vdp_design {
        calc_row(
            o,
            "Variable design point, course 1",
            &format!(
                "t1 = ({} − {} D/H √(H G / S_d)) ({} H D G / S_d) = ({} − {} × {} / {} × √({} × {} \
                 / {})) × ({} × {} × {} × {} / {}) = {} × {} = {} {tu}; not more than the \
                 one-foot {} {tu}: t1 = <b>{} {tu}</b> (+ CA {} = {} {tu})",
                VDP_BOTTOM_CONSTANT,
                bottom_k,
                of.form.coefficient,
                VDP_BOTTOM_CONSTANT,
                bottom_k,
                f.len(d.diameter.0),
                f.len(b.liquid_height.0),
                f.len(b.liquid_height.0),
                sg_text(d.specific_gravity),
                f.stress(c1.design_stress.value.0),
                of.form.coefficient,
                f.len(b.liquid_height.0),
                f.len(d.diameter.0),
                sg_text(d.specific_gravity),
                f.stress(c1.design_stress.value.0),
                n(b.factor, 4),
                f.thk_result(b.full_head.0),
                f.thk_result(b.variable_point.0),
                f.thk_result(b.one_foot.0),
                f.thk_result(b.value.0),
                f.thk(c1.corrosion_allowance.0),
                f.thk_result(b.value.0 + c1.corrosion_allowance.0)
            ),
            "API 650 5.6.4, bottom course (from memory)",
        );
    }
    if let Some(c2) = d.courses.get(1)
        && let Some(CourseCalc::Second(sc)) = &c2.vdp_design
    {
        let regime = match sc.regime {
            SecondRegime::AsBottom => format!("≤ {VDP_SECOND_LOW}: t2 = t1"),
            SecondRegime::AsUpper => format!(
                "≥ {VDP_SECOND_HIGH}: t2 = t2a, the course sized as an upper course ({} steps)",
                sc.t2a.steps.len()
            ),
            SecondRegime::Interpolated => format!(
                "between {VDP_SECOND_LOW} and {VDP_SECOND_HIGH}: t2 = t2a + (t1 − t2a)({} − h1 / \
                 ({} √(r t1))) = {} + ({} − {}) × ({} − {} / ({} × √({} × {})))",
                VDP_SECOND_A,
                VDP_SECOND_B,
                f.thk_result(sc.t2a.value.0),
                f.thk_result(sc.t1.0),
                f.thk_result(sc.t2a.value.0),
                VDP_SECOND_A,
                n(sc.h1, 1),
                VDP_SECOND_B,
                n(sc.r, 1),
                f.thk_result(sc.t1.0)
            ),
        };
        calc_row(
            o,
            "Variable design point, course 2",
            &format!(
                "h1 = {} {tu}, r = {} {tu}; h1 / √(r t1) = {} / √({} × {}) = {} {regime}; t2a = {} \
                 {tu}: t2 = <b>{} {tu}</b> (+ CA {} = {} {tu})",
                n(sc.h1, 1),
                n(sc.r, 1),
                n(sc.h1, 1),
                n(sc.r, 1),
                f.thk_result(sc.t1.0),
                n(sc.ratio, 3),
                f.thk_result(sc.t2a.value.0),
                f.thk_result(sc.value.0),
                f.thk(c2.corrosion_allowance.0),
                f.thk_result(sc.value.0 + c2.corrosion_allowance.0)
            ),
            "API 650 5.6.4, second course (from memory)",
        );
    }
    // One upper course in full: the third (or the second's t2a when there are two).
    let upper: Option<(&RequiredCourse, &UpperCalc)> = d
        .courses
        .iter()
        .find_map(|c| match &c.vdp_design {
            Some(CourseCalc::Upper(u)) => Some((c, u)),
            _ => None,
        })
        .or_else(|| {
            d.courses.get(1).and_then(|c| match &c.vdp_design {
                Some(CourseCalc::Second(s)) => Some((c, &s.t2a)),
                _ => None,
            })
        });
    if let Some((c, u)) = upper {
        let first = u.steps.first();
        let intro = format!(
            "course {}: H = {} {lu}, S_d = {} {su}, t_L (course below) = {} {tu}; start from the \
             one-foot t_u = {} {tu}; K = t_L / t_u; C = √K (K − 1) / (1 + K^1.5); x1 = {} √(r \
             t_u) + {} C H; x2 = {} C H; x3 = {} √(r t_u); x = min(x1, x2, x3); t_x = {} D (H − \
             x/{per_length}) G / S_d; repeat with t_u = t_x until t_x settles{}",
            c.number,
            f.len(u.liquid_height.0),
            f.stress(c.design_stress.value.0),
            f.thk_result(u.t_lower.0),
            f.thk_result(u.start.0),
            VDP_X1_ROOT,
            x1_head,
            x2_head,
            VDP_X3_ROOT,
            of.form.coefficient,
            first.map_or(String::new(), |st| format!(
                ". Step 1: K = {} / {} = {}; C = {}; x1 = {}, x2 = {}, x3 = {}; x = {} {tu}; t_x = \
                 {} × {} × ({} − {} / {per_length}) × {} / {} = {} {tu}",
                f.thk_result(u.t_lower.0),
                f.thk_result(st.t_u.0),
                n(st.k, 4),
                n(st.c, 4),
                n(st.x[0], 1),
                n(st.x[1], 1),
                n(st.x[2], 1),
                n(st.x_min, 1),
                of.form.coefficient,
                f.len(d.diameter.0),
                f.len(u.liquid_height.0),
                n(st.x_min, 1),
                sg_text(d.specific_gravity),
                f.stress(c.design_stress.value.0),
                f.thk_result(st.t_x.0)
            ))
        );
        let end = format!(
            "{} after {} step{}: t = <b>{} {tu}</b>",
            if u.converged {
                "settled"
            } else {
                "did not settle"
            },
            u.steps.len(),
            if u.steps.len() == 1 { "" } else { "s" },
            f.thk_result(u.value.0)
        );
        let _ = writeln!(
            o,
            "<tr><th scope=\"row\">Variable design point, upper course (iteration)</th><td \
             class=\"working\">{intro}.\n"
        );
        upper_steps(o, u, &f);
        let _ = writeln!(
            o,
            "{end}</td><td class=\"source\">API 650 5.6.4, upper courses (from memory)</td></tr>"
        );
    }
    o.push_str("</tbody>\n</table>\n</article>\n");
}
