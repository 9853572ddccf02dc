//! Terminal output of `assess`: the course table, the verdict, the scanned areas, the
//! extreme-value estimates, hot spots, warnings, the caution.

use std::fmt::Write as _;

use anstyle::{AnsiColor, Style};

use crate::calc::area::{AreaAssessment, DepthRule, RuleKind};
use crate::calc::life::{RemainingLife, Status};
use crate::calc::units::Thickness;
use crate::model::result::Assessment;
use crate::report::caution::CAUTION;
use crate::report::verdict::verdict_sentences;
use crate::report::view::View;

/// Width text paragraphs are wrapped to.
pub const WRAP: usize = 92;

/// Style of a status word.
pub fn status_style(s: Status) -> Style {
    match s {
        Status::BelowMinimum => Style::new().bold().fg_color(Some(AnsiColor::Red.into())),
        Status::Monitor => Style::new().fg_color(Some(AnsiColor::Yellow.into())),
        Status::Ok => Style::new().fg_color(Some(AnsiColor::Green.into())),
    }
}

/// Bold.
pub fn bold() -> Style {
    Style::new().bold()
}

/// Word-wraps `text` to `width` columns with `indent` before every line.
pub fn wrap(text: &str, width: usize, indent: &str) -> String {
    let mut out = String::new();
    let mut line = String::new();
    for word in text.split_whitespace() {
        if !line.is_empty() && indent.len() + line.len() + 1 + word.len() > width {
            let _ = writeln!(out, "{indent}{line}");
            line.clear();
        }
        if !line.is_empty() {
            line.push(' ');
        }
        line.push_str(word);
    }
    if !line.is_empty() {
        let _ = writeln!(out, "{indent}{line}");
    }
    out
}

/// A list item: "- " then the text wrapped with a hanging indent.
pub fn bullet(text: &str) -> String {
    let body = wrap(text, WRAP, "  ");
    let mut s = String::from("-");
    s.push_str(&body[1..]);
    s
}

/// The one-line title of a tank.
pub fn tank_title(a: &Assessment, v: &View) -> String {
    let t = &a.tank;
    let name = t
        .name
        .as_deref()
        .map(|n| format!(" - {n}"))
        .unwrap_or_default();
    format!(
        "Tank {}{name}\nD {}, {} courses, shell height {}, SG {}, max fill height {}, {} construction",
        t.id,
        v.len_text(t.diameter),
        t.courses.len(),
        v.len_text(t.shell_height()),
        crate::report::verdict::sg_text(t.specific_gravity),
        v.len_text(t.max_fill_height),
        t.construction.name()
    )
}

/// The full terminal report. `quiet` leaves out the verdict and warning details.
pub fn render(a: &Assessment, v: &View, quiet: bool) -> String {
    let mut o = String::new();
    let b = bold();
    let _ = writeln!(o, "{b}{}{b:#}", tank_title(a, v));
    let first = a.surveys.first().map(|s| s.date);
    let readings: usize = a.surveys.iter().map(|s| s.readings).sum();
    let mut what_if = Vec::new();
    if let Some(g) = a.overrides.specific_gravity_from_file {
        what_if.push(format!("SG {} instead of {g}", a.tank.specific_gravity));
    }
    if let Some(h) = a.overrides.fill_height_from_file {
        what_if.push(format!(
            "fill height {} instead of {}",
            v.len_text(a.tank.max_fill_height),
            v.len_text(h)
        ));
    }
    let _ = writeln!(
        o,
        "As of {}: {} survey{} from {} to {}, {readings} readings; thickness basis {}, rate basis {}{}",
        a.as_of,
        a.surveys.len(),
        if a.surveys.len() == 1 { "" } else { "s" },
        first.map_or(String::new(), |d| d.to_string()),
        a.latest_survey,
        a.tank.thickness_basis.name(),
        a.tank.rate_basis.name(),
        if what_if.is_empty() {
            String::new()
        } else {
            format!("; what-if: {}", what_if.join(", "))
        }
    );
    o.push('\n');
    o.push_str(&course_table(a, v));
    o.push_str(&shell_checks(a, v));
    o.push('\n');
    if !quiet {
        let _ = writeln!(o, "{b}Verdict{b:#}");
        o.push_str(&wrap(&verdict_sentences(a, v).join(" "), WRAP, ""));
        o.push('\n');
    }
    if !a.areas.is_empty() {
        o.push_str(&local_area_lines(a, v));
        o.push('\n');
    }
    if !quiet {
        if let Some(ev) = extreme_value_lines(a, v) {
            o.push_str(&ev);
            o.push('\n');
        }
        if let Some(hot) = hot_spot_lines(a, v) {
            o.push_str(&hot);
            o.push('\n');
        }
    }
    if !a.warnings.is_empty() {
        if quiet {
            let _ = writeln!(
                o,
                "{} warnings (run without --quiet to list them)",
                a.warnings.len()
            );
        } else {
            let _ = writeln!(o, "{b}Warnings ({}){b:#}", a.warnings.len());
            for w in &a.warnings {
                o.push_str(&bullet(&w.to_string()));
            }
        }
        o.push('\n');
    }
    o.push_str(&wrap(&format!("Caution: {CAUTION}"), WRAP, ""));
    o
}

/// The per-course table.
pub fn course_table(a: &Assessment, v: &View) -> String {
    let u = v.to;
    let headers = [
        "course", "nominal", "t_actual", "t_min", "rate", "life", "max fill", "status",
    ];
    let rate_unit = u.rate_unit();
    let units = [
        "",
        u.thickness_unit(),
        u.thickness_unit(),
        u.thickness_unit(),
        rate_unit,
        "y",
        u.length_unit(),
        "",
    ];
    let td = v.thk_decimals();
    let rd = v.rate_decimals();
    let mut rows: Vec<[String; 8]> = Vec::new();
    let mut statuses = Vec::new();
    for c in &a.courses {
        let k = c.condition.as_ref();
        let dash = || "-".to_string();
        let life = match k.map(|k| k.remaining_life) {
            Some(RemainingLife::Years(y)) => format!("{y:.1}"),
            Some(RemainingLife::NoMeasurableLoss) => "no loss".to_string(),
            _ => dash(),
        };
        rows.push([
            c.number.to_string(),
            format!("{:.*}", td, v.thk(c.nominal_thickness)),
            k.map_or_else(dash, |k| format!("{:.*}", td, v.thk(k.t_actual()))),
            format!("{:.*}", td, v.thk(c.t_min.value)),
            k.and_then(|k| k.rate_value())
                .map_or_else(dash, |r| format!("{:.*}", rd, v.rate(r))),
            life,
            k.map_or_else(dash, |k| format!("{:.2}", v.len(k.max_fill_height.value))),
            k.map_or("no readings", |k| k.status.name()).to_string(),
        ]);
        statuses.push(k.map(|k| k.status));
    }
    let mut widths = [0usize; 8];
    for (i, h) in headers.iter().enumerate() {
        widths[i] = h.len().max(units[i].len());
        for r in &rows {
            widths[i] = widths[i].max(r[i].chars().count());
        }
    }
    let mut o = String::new();
    let b = bold();
    let _ = writeln!(o, "{b}{}{b:#}", row_text(&headers, &widths));
    let _ = writeln!(o, "{}", row_text(&units, &widths));
    for (r, st) in rows.iter().zip(&statuses) {
        let cells: Vec<&str> = r.iter().map(String::as_str).collect();
        let numbers = row_text(&cells[..7], &widths);
        let status = match st {
            Some(st) => {
                let style = status_style(*st);
                format!("{style}{}{style:#}", r[7])
            }
            None => r[7].clone(),
        };
        let _ = writeln!(o, "{numbers}  {status}");
    }
    let shell = a.tank.shell_height();
    let above = a
        .courses
        .iter()
        .filter_map(|c| c.condition.as_ref())
        .any(|k| k.max_fill_height.value.0 > shell.0);
    if above {
        let _ = writeln!(
            o,
            "max fill: the liquid level each course alone allows; above the shell height ({}) \
             it does not limit.",
            v.len_text(shell)
        );
    }
    o
}

/// Cells right-aligned to `widths`, two spaces apart; the last column of a full row
/// (the status word) is left-aligned; trailing spaces trimmed.
fn row_text(cells: &[&str], widths: &[usize]) -> String {
    let mut s = String::new();
    for (i, cell) in cells.iter().enumerate() {
        if i > 0 {
            s.push_str("  ");
        }
        if i == widths.len() - 1 {
            s.push_str(cell);
        } else {
            let _ = write!(s, "{cell:>w$}", w = widths[i]);
        }
    }
    s.trim_end().to_string()
}

/// Hydrotest height and, over the one-foot limit, the variable-design-point comparison.
pub fn shell_checks(a: &Assessment, v: &View) -> String {
    let mut o = String::new();
    if let Some(h) = a.hydrotest.tank {
        let shell = a.tank.shell_height();
        if h.level.0 >= shell.0 {
            let _ = writeln!(
                o,
                "hydrotest (water, API 653 4.3.3.2): to the full shell height {} (course {} would carry {})",
                v.len_text(shell),
                h.course,
                v.len_text(h.level)
            );
        } else {
            let _ = writeln!(
                o,
                "hydrotest height (water, API 653 4.3.3.2): {}, set by course {}",
                v.len_text(h.level),
                h.course
            );
        }
    }
    if let Some(p) = &a.variable_point {
        let ap = &p.applicability;
        if ap.holds {
            let list: Vec<String> = a
                .courses
                .iter()
                .zip(&p.thickness)
                .filter_map(|(c, t)| {
                    t.map(|t| {
                        format!(
                            "{} {:.*} vs {:.*}",
                            c.number,
                            v.thk_decimals(),
                            v.thk(t),
                            v.thk_decimals(),
                            v.thk(c.t_min.value)
                        )
                    })
                })
                .collect();
            o.push_str(&wrap(
                &format!(
                    "comparison only (D over the one-foot limit): variable-design-point \
                     thickness vs one-foot t_min, {}, by course: {}",
                    v.to.thickness_unit(),
                    list.join("; ")
                ),
                WRAP,
                "",
            ));
        } else {
            let _ = writeln!(
                o,
                "comparison only: the variable-design-point method does not apply (L/H = {:.1} over {:.1})",
                ap.ratio, ap.limit
            );
        }
    }
    o
}

fn hot_spot_lines(a: &Assessment, v: &View) -> Option<String> {
    if a.hot_spots.is_empty() {
        return None;
    }
    let mut o = String::new();
    let b = bold();
    let _ = writeln!(
        o,
        "{b}Hot spots{b:#} (monitoring points with the least remaining life)"
    );
    for &i in a.hot_spots.iter().take(5) {
        let p = &a.points[i];
        let life = match p.remaining_life {
            RemainingLife::Years(y) => format!("{y:.1} y"),
            RemainingLife::NoMeasurableLoss => "no loss".into(),
            RemainingLife::Unknown => "-".into(),
        };
        let _ = writeln!(
            o,
            "- {} (course {}): {} on {}, {}, remaining life {life}",
            p.point,
            p.course,
            v.thk_text(p.last.1),
            p.last.0,
            p.rate.map_or("-".to_string(), |r| v.rate_text(r)),
        );
    }
    Some(o)
}

/// "pass" in green or "FAIL" in bold red.
fn pass_word(pass: bool) -> String {
    let style = status_style(if pass {
        Status::Ok
    } else {
        Status::BelowMinimum
    });
    format!("{style}{}{style:#}", if pass { "pass" } else { "FAIL" })
}

/// A thickness without its unit, at gauge resolution.
fn num(v: &View, t: Thickness) -> String {
    format!("{:.*}", v.thk_decimals(), v.thk(t))
}

/// A distance or thickness with at most the gauge's decimals and no trailing zeros
/// (50, 0.5, 12.62).
fn short(v: &View, t: Thickness) -> String {
    let s = num(v, t);
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

/// ">= 12.67 + 0.46 = 13.13 mm", ">= 0.6 x 12.67 + 0.46 = 8.07 mm": the required side
/// of a rule, fraction x t_min + corrosion to the next inspection.
fn rule_numbers(r: &DepthRule, v: &View) -> String {
    let factor = if r.kind == RuleKind::T1 {
        String::new()
    } else {
        format!("{} x ", r.fraction)
    };
    format!(
        ">= {factor}{} + {} = {} {}",
        num(v, r.t_min.value),
        num(v, r.future_loss),
        num(v, r.required),
        v.to.thickness_unit()
    )
}

/// The "Local areas" section: per scan, what was measured, L and k, t1 and t2, each
/// rule with its numbers, and the liquid level the area allows.
pub fn local_area_lines(a: &Assessment, v: &View) -> String {
    let mut o = String::new();
    let b = bold();
    let _ = writeln!(
        o,
        "{b}Local areas{b:#} (grid scans; API 653 4.3.2 with the local t_min of 4.3.3.1, no \
         one-foot offset)"
    );
    for area in &a.areas {
        o.push_str(&area_lines(area, v));
    }
    o
}

fn area_lines(area: &AreaAssessment, v: &View) -> String {
    let mut o = String::new();
    let s = &area.scan;
    let units = area.load.units;
    let tu = v.to.thickness_unit();
    let _ = writeln!(o, "{}: course {}, {}", s.file, s.course, s.date);
    let pits = match s.pit_threshold {
        None => "no pit_threshold (no reading is taken as a pit)".to_string(),
        Some(p) => format!(
            "{} pit{} (below {})",
            s.pits(),
            if s.pits() == 1 { "" } else { "s" },
            v.thk_text(p)
        ),
    };
    o.push_str(&wrap(
        &format!(
            "{} rows x {} columns at {} x {} {tu}, rows from {} to {}; {} readings, {} not \
             measured, {pits}",
            s.rows(),
            s.columns(),
            short(v, s.row_pitch),
            short(v, s.column_pitch),
            v.len_text(s.bottom_elevation),
            v.len_text(s.top_elevation(units)),
            s.readings(),
            s.not_measured(),
        ),
        WRAP,
        "  ",
    ));
    let l = &area.averaging_length;
    let formula = if v.from == v.to {
        let (d_unit, d) = match units {
            crate::calc::units::UnitSystem::Si => ("mm", format!("{:.0}", l.diameter_in_formula)),
            crate::calc::units::UnitSystem::Usc => ("ft", format!("{}", l.diameter_in_formula)),
        };
        format!(
            " = {} x sqrt({d} {d_unit} x {} {tu}){}",
            l.form.averaging_coefficient,
            num(v, l.t2),
            if l.capped {
                format!(
                    " = {} {tu}, capped at {}",
                    num(v, l.formula),
                    num(v, l.form.averaging_cap)
                )
            } else {
                String::new()
            }
        )
    } else {
        String::new()
    };
    o.push_str(&wrap(
        &format!(
            "t2 {} (row {}, column {}); L{formula} = {} {tu}; k = {} rows per window",
            v.thk_text(area.t2.value),
            area.t2.row + 1,
            area.t2.column + 1,
            num(v, l.value),
            area.windows.rows_per_window,
        ),
        WRAP,
        "  ",
    ));
    match area.t1_window() {
        Some(w) => {
            let _ = writeln!(
                o,
                "  t1 {} (column {}, rows {}-{}, {} to {}, {} readings); {} windows, {} skipped",
                v.thk_text(w.mean),
                w.column + 1,
                w.first_row + 1,
                w.last_row() + 1,
                v.len_text(w.bottom_elevation),
                v.len_text(w.top_elevation),
                w.valid,
                area.windows.windows.len(),
                area.windows.skipped
            );
        }
        None => {
            let _ = writeln!(
                o,
                "  t1 not computed: no window of {} rows has half its cells measured",
                area.windows.rows_per_window
            );
        }
    }
    let f = &area.future;
    let future = match f.rate {
        Some(n) => format!(
            "corrosion to the next inspection: {} x {:.1} y (the tank's UT interval) = {}",
            v.rate_text(n),
            f.years,
            v.thk_text(f.loss)
        ),
        None => format!(
            "no corrosion rate for course {}: the rules are checked as measured",
            s.course
        ),
    };
    o.push_str(&wrap(&future, WRAP, "  "));
    let _ = writeln!(
        o,
        "  rules: measured >= fraction x local t_min at H + that corrosion (API 653 4.3.2):"
    );
    let mut rows: Vec<(&str, String, String, bool, String)> = Vec::new();
    if let Some(r) = area.t1_rule {
        let where_ = area
            .windows
            .windows
            .get(r.window)
            .map_or(String::new(), |w| {
                let critical = if area.t1 == Some(r.window) {
                    ""
                } else {
                    "critical: "
                };
                format!(
                    "{critical}column {}, rows {}-{}, H {}",
                    w.column + 1,
                    w.first_row + 1,
                    w.last_row() + 1,
                    v.len_text(r.rule.t_min.liquid_height)
                )
            });
        rows.push((
            "t1",
            num(v, r.rule.measured),
            rule_numbers(&r.rule, v),
            r.rule.pass,
            where_,
        ));
    }
    let t2 = &area.t2_rule;
    rows.push((
        "t2",
        num(v, t2.measured),
        rule_numbers(t2, v),
        t2.pass,
        format!("bottom row, H {}", v.len_text(t2.t_min.liquid_height)),
    ));
    if let Some(p) = &area.pit_depth_rule {
        rows.push((
            "pit depth",
            num(v, p.measured),
            rule_numbers(p, v),
            p.pass,
            area.least_pit.map_or(String::new(), |c| {
                format!("row {}, column {}", c.row + 1, c.column + 1)
            }),
        ));
    }
    let sp = &area.pit_spacing;
    let length = sp.worst.map_or(Thickness(0.0), |w| w.length);
    rows.push((
        "pit spacing",
        short(v, length),
        format!(
            "<= {} {tu} within any {} {tu}",
            short(v, sp.limit),
            short(v, sp.span)
        ),
        sp.pass,
        sp.worst.map_or("no pits".to_string(), |w| {
            format!(
                "column {}, rows {}-{}",
                w.column + 1,
                w.first_row + 1,
                w.first_row + w.rows
            )
        }),
    ));
    let w1 = rows.iter().map(|r| r.1.chars().count()).max().unwrap_or(0);
    let w2 = rows.iter().map(|r| r.2.chars().count()).max().unwrap_or(0);
    for (name, measured, required, pass, note) in &rows {
        let _ = writeln!(
            o,
            "  {name:<11}  {measured:>w1$} {required:<w2$}  {}  {note}",
            pass_word(*pass)
        );
    }
    let level = v.len_text(area.fill_height);
    let verdict = match area.acceptable {
        Some(true) => format!("acceptable at {level}"),
        Some(false) => {
            let failed = area.failed_rules();
            let names = match failed.as_slice() {
                [one] => format!("the {one} rule fails"),
                [init @ .., last] => format!("the {} and {last} rules fail", init.join(", ")),
                [] => String::new(),
            };
            format!("not acceptable at {level} ({names})")
        }
        None => format!("not decided at {level} (t1 not computed)"),
    };
    let limit = |l: &crate::calc::area::AreaLimit| {
        let which = match (l.kind, l.window.and_then(|i| area.windows.windows.get(i))) {
            (RuleKind::T1, Some(w)) => format!("t1 rule, column {}", w.column + 1),
            (k, _) => format!("{} rule", k.name()),
        };
        format!("{} ({which})", v.len_text(l.calc.value))
    };
    let next = area
        .max_fill_height_next
        .as_ref()
        .map_or("not computed without a rate".to_string(), &limit);
    let spacing = if area.pit_spacing.pass {
        ""
    } else {
        "; the pits are too close together to be ignored: no liquid level cures that, repair \
         them or assess the pitted zone as part of the thin area"
    };
    o.push_str(&wrap(
        &format!(
            "{verdict}; allowable liquid level {} now, {next} at the next inspection{spacing}",
            limit(&area.max_fill_height)
        ),
        WRAP,
        "  ",
    ));
    o
}

/// The extreme-value estimates per course, when any course has one.
pub fn extreme_value_lines(a: &Assessment, v: &View) -> Option<String> {
    let b = bold();
    let mut o = String::new();
    let estimated: Vec<_> = a
        .courses
        .iter()
        .filter_map(|c| c.extreme_value.as_ref().ok().map(|e| (c, e)))
        .collect();
    let _ = writeln!(
        o,
        "{b}Thinnest spot where nobody measured{b:#} (extreme values, ASTM G16 practice; \
         estimates only)"
    );
    if estimated.is_empty() {
        let reasons: Vec<String> = a
            .courses
            .iter()
            .filter_map(|c| c.extreme_value.as_ref().err().map(ToString::to_string))
            .collect();
        let first = reasons.first()?;
        if reasons.iter().all(|r| r == first) {
            o.push_str(&wrap(
                &format!("not estimated for any course: {first}"),
                WRAP,
                "",
            ));
        } else {
            for (c, why) in a.courses.iter().zip(&reasons) {
                o.push_str(&wrap(
                    &format!("course {}: not estimated: {why}", c.number),
                    WRAP,
                    "",
                ));
            }
        }
        return Some(o);
    }
    let tu = v.to.thickness_unit();
    let headers = [
        "course", "drops", "T", "loss", "estimate", "measured", "t_min", "fit r",
    ];
    let units = ["", "", "", tu, tu, tu, tu, ""];
    let td = v.thk_decimals();
    let rows: Vec<[String; 8]> = estimated
        .iter()
        .map(|(c, e)| {
            [
                c.number.to_string(),
                format!(
                    "{} x {}",
                    e.blocks.len(),
                    e.blocks.first().map_or(0, |b| b.readings)
                ),
                format!("{:.0}", e.return_period),
                format!("{:.*}", td, v.thk(e.loss)),
                format!("{:.*}", td, v.thk(e.estimated_least)),
                format!("{:.*}", td, v.thk(e.measured_least)),
                format!("{:.*}", td, v.thk(c.t_min.value)),
                format!("{:.3}", e.plot_correlation),
            ]
        })
        .collect();
    let mut widths = [0usize; 8];
    for (i, h) in headers.iter().enumerate() {
        widths[i] = h.len().max(units[i].len());
        for r in &rows {
            widths[i] = widths[i].max(r[i].chars().count());
        }
    }
    let line = |cells: &[&str]| {
        cells
            .iter()
            .zip(widths)
            .map(|(c, w)| format!("{c:>w$}"))
            .collect::<Vec<_>>()
            .join("  ")
            .trim_end()
            .to_string()
    };
    let _ = writeln!(o, "{b}{}{b:#}", line(&headers));
    let _ = writeln!(o, "{}", line(&units));
    for r in &rows {
        let cells: Vec<&str> = r.iter().map(String::as_str).collect();
        let _ = writeln!(o, "{}", line(&cells));
    }
    let fits: Vec<&str> = estimated.iter().map(|(_, e)| e.method.name()).collect();
    let method = if fits.iter().all(|m| *m == fits[0]) {
        format!("{} fit", fits[0])
    } else {
        "fits as listed in the JSON output".to_string()
    };
    o.push_str(&wrap(
        &format!(
            "drops = blocks x readings each (readings sharing an azimuth at the course's latest \
             survey); a Gumbel distribution fitted to each drop's greatest loss ({method}); \
             T = course area / block area, a block {} wide over the course height; loss = \
             u + a y_T; estimate = nominal - loss, beside the least reading measured.",
            v.len_text(estimated[0].1.strip_width)
        ),
        WRAP,
        "",
    ));
    for c in &a.courses {
        if let Err(why) = &c.extreme_value
            && !estimated.is_empty()
        {
            o.push_str(&wrap(
                &format!("course {}: not estimated: {why}", c.number),
                WRAP,
                "",
            ));
        }
    }
    Some(o)
}
