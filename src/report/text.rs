//! Terminal output of `assess`: the course table, the verdict, warnings, the caution.

use std::fmt::Write as _;

use anstyle::{AnsiColor, Style};

use crate::calc::life::{RemainingLife, Status};
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
fn shell_checks(a: &Assessment, v: &View) -> String {
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
