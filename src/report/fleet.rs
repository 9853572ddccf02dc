//! Output of `strake fleet`: the planning table, JSON and CSV, rendered from the
//! fleet model (model::fleet); nothing here computes a value, it only converts units
//! for display and formats.
//!
//! JSON and CSV records share their field names (README, "Output formats").

use std::fmt::Write as _;

use anstyle::{AnsiColor, Style};
use serde::Serialize;

use crate::calc::life::RemainingLife;
use crate::calc::units::{Length, UnitSystem};
use crate::model::fleet::{Fleet, FleetEntry, FleetTank, TankStatus};
use crate::report::caution::CAUTION;
use crate::report::text::{WRAP, bold, bullet, wrap};
use crate::report::view::{View, sig6};

/// Style of a tank status word (`None`: the folder failed).
fn status_style(s: Option<TankStatus>) -> Style {
    match s {
        Some(TankStatus::BelowMinimum) | None => {
            Style::new().bold().fg_color(Some(AnsiColor::Red.into()))
        }
        Some(TankStatus::NoReadings) | Some(TankStatus::Monitor) => {
            Style::new().fg_color(Some(AnsiColor::Yellow.into()))
        }
        Some(TankStatus::Ok) => Style::new().fg_color(Some(AnsiColor::Green.into())),
    }
}

pub(crate) fn view(t: &FleetTank, units: Option<UnitSystem>) -> View {
    View::new(t.units, units)
}

pub(crate) fn length_text(v: &View, h: Option<Length>) -> String {
    h.map_or_else(
        || "-".to_string(),
        |h| format!("{:.2} {}", v.len(h), v.to.length_unit()),
    )
}

pub(crate) fn life_text(l: Option<RemainingLife>) -> String {
    match l {
        Some(RemainingLife::Years(y)) => format!("{y:.1}"),
        Some(RemainingLife::NoMeasurableLoss) => "no loss".to_string(),
        _ => "-".to_string(),
    }
}

pub(crate) fn date_text(d: Option<chrono::NaiveDate>) -> String {
    d.map_or_else(|| "-".to_string(), |d| d.to_string())
}

const HEADERS: [&str; 11] = [
    "tank",
    "next due",
    "next UT",
    "next external",
    "course",
    "life",
    "fill now",
    "fill at UT",
    "max fill",
    "status",
    "folder",
];
const UNITS: [&str; 11] = ["", "", "", "", "", "y", "", "", "", "", ""];
/// Columns aligned left (the others are numbers and dates, aligned right).
const LEFT: [bool; 11] = [
    true, false, false, false, false, false, false, false, false, true, true,
];

/// The planning table, the fill-height restrictions, the errors, the caution.
/// `quiet` leaves out the restriction notes and the error details (errors are also on
/// standard error).
pub fn render_text(fleet: &Fleet, units: Option<UnitSystem>, quiet: bool) -> String {
    let mut rows: Vec<([String; 11], Option<TankStatus>)> = Vec::new();
    let mut restricted = Vec::new();
    let mut errors = Vec::new();
    for e in &fleet.entries {
        match e {
            FleetEntry::Tank(t) => {
                let v = view(t, units);
                rows.push((
                    [
                        t.tank_id.clone(),
                        date_text(t.next_due),
                        date_text(t.next_ut_inspection),
                        date_text(t.next_external_inspection),
                        t.governing_course
                            .map_or_else(|| "-".to_string(), |c| c.to_string()),
                        life_text(t.remaining_life),
                        length_text(&v, t.allowable_fill_height),
                        length_text(&v, t.allowable_fill_height_next),
                        length_text(&v, Some(t.operating_fill_height)),
                        t.status.name().to_string(),
                        t.folder.clone(),
                    ],
                    Some(t.status),
                ));
                if t.fill_restricted {
                    restricted.push(format!(
                        "{}: {} allowed now{}, below the operating maximum {}",
                        t.tank_id,
                        length_text(&v, t.allowable_fill_height),
                        t.allowable_fill_height_course
                            .map(|c| format!(" (set by course {c})"))
                            .unwrap_or_default(),
                        length_text(&v, Some(t.operating_fill_height)),
                    ));
                }
            }
            FleetEntry::Failed {
                folder,
                tank_id,
                message,
            } => {
                let dash = || "-".to_string();
                rows.push((
                    [
                        tank_id.clone().unwrap_or_else(dash),
                        dash(),
                        dash(),
                        dash(),
                        dash(),
                        dash(),
                        dash(),
                        dash(),
                        dash(),
                        "error".to_string(),
                        folder.clone(),
                    ],
                    None,
                ));
                errors.push(message.clone());
            }
        }
    }
    let mut widths = [0usize; 11];
    for i in 0..11 {
        widths[i] = HEADERS[i].len().max(UNITS[i].len());
        for (r, _) in &rows {
            widths[i] = widths[i].max(r[i].chars().count());
        }
    }
    let mut o = String::new();
    let b = bold();
    let n = fleet.entries.len();
    let _ = writeln!(
        o,
        "{b}Fleet {}{b:#}: {n} tank folder{}, {} assessed, {} with errors",
        fleet.root,
        if n == 1 { "" } else { "s" },
        fleet.assessed(),
        fleet.failed()
    );
    o.push_str(&wrap(
        "Ordered by next due date (the earlier of the next UT survey and the next external \
         inspection). fill now, fill at UT: allowable liquid level now and at the next UT \
         survey (least over the courses, at most the shell height); max fill: operating \
         maximum.",
        WRAP,
        "",
    ));
    o.push('\n');
    let _ = writeln!(o, "{b}{}{b:#}", row_text(&HEADERS, &widths));
    let _ = writeln!(o, "{}", row_text(&UNITS, &widths));
    for (r, st) in &rows {
        let style = status_style(*st);
        let cells: Vec<&str> = r.iter().map(String::as_str).collect();
        let before = row_text(&cells[..9], &widths[..9]);
        let status = format!("{:<w$}", r[9], w = widths[9]);
        let _ = writeln!(o, "{before}  {style}{status}{style:#}  {}", r[10]);
    }
    if !quiet && !restricted.is_empty() {
        o.push('\n');
        let _ = writeln!(
            o,
            "{b}Allowable level below the operating maximum ({}){b:#}",
            restricted.len()
        );
        for r in &restricted {
            o.push_str(&bullet(r));
        }
    }
    if !quiet && !errors.is_empty() {
        o.push('\n');
        let _ = writeln!(o, "{b}Errors ({}){b:#}", errors.len());
        for e in &errors {
            o.push_str(&bullet(e));
        }
    }
    o.push('\n');
    o.push_str(&wrap(&format!("Caution: {CAUTION}"), WRAP, ""));
    o
}

/// Cells padded to `widths`, two spaces apart, left or right as [`LEFT`] says;
/// trailing spaces trimmed.
fn row_text(cells: &[&str], widths: &[usize]) -> String {
    let mut s = String::new();
    for (i, cell) in cells.iter().enumerate() {
        if i > 0 {
            s.push_str("  ");
        }
        if LEFT[i] {
            let _ = write!(s, "{cell:<w$}", w = widths[i]);
        } else {
            let _ = write!(s, "{cell:>w$}", w = widths[i]);
        }
    }
    s.trim_end().to_string()
}

/// One tank folder, for JSON and CSV (`B`: how the list of courses below t_min is
/// written: an array in JSON, a space-separated text in CSV).
#[derive(Debug, Serialize)]
pub struct FleetRecord<B> {
    tank_id: Option<String>,
    name: Option<String>,
    folder: String,
    status: &'static str,
    next_due: Option<String>,
    next_ut_inspection: Option<String>,
    next_external_inspection: Option<String>,
    governing_course: Option<u32>,
    remaining_life_years: Option<f64>,
    length_unit: Option<&'static str>,
    allowable_fill_height: Option<f64>,
    allowable_fill_height_course: Option<u32>,
    allowable_fill_height_next: Option<f64>,
    operating_fill_height: Option<f64>,
    shell_height: Option<f64>,
    fill_restricted: Option<bool>,
    latest_survey: Option<String>,
    courses_below_minimum: B,
    warnings: Option<usize>,
    error: Option<String>,
}

fn record<B>(
    e: &FleetEntry,
    units: Option<UnitSystem>,
    below: impl Fn(&[u32]) -> B,
) -> FleetRecord<B> {
    match e {
        FleetEntry::Tank(t) => {
            let v = view(t, units);
            let len = |h: Option<Length>| h.map(|h| sig6(v.len(h)));
            FleetRecord {
                tank_id: Some(t.tank_id.clone()),
                name: t.name.clone(),
                folder: t.folder.clone(),
                status: t.status.name(),
                next_due: t.next_due.map(|d| d.to_string()),
                next_ut_inspection: t.next_ut_inspection.map(|d| d.to_string()),
                next_external_inspection: t.next_external_inspection.map(|d| d.to_string()),
                governing_course: t.governing_course,
                remaining_life_years: t.remaining_life.and_then(RemainingLife::years).map(sig6),
                length_unit: Some(v.to.length_unit()),
                allowable_fill_height: len(t.allowable_fill_height),
                allowable_fill_height_course: t.allowable_fill_height_course,
                allowable_fill_height_next: len(t.allowable_fill_height_next),
                operating_fill_height: len(Some(t.operating_fill_height)),
                shell_height: len(Some(t.shell_height)),
                fill_restricted: Some(t.fill_restricted),
                latest_survey: Some(t.latest_survey.to_string()),
                courses_below_minimum: below(&t.below_minimum),
                warnings: Some(t.warnings),
                error: None,
            }
        }
        FleetEntry::Failed {
            folder,
            tank_id,
            message,
        } => FleetRecord {
            tank_id: tank_id.clone(),
            name: None,
            folder: folder.clone(),
            status: "error",
            next_due: None,
            next_ut_inspection: None,
            next_external_inspection: None,
            governing_course: None,
            remaining_life_years: None,
            length_unit: None,
            allowable_fill_height: None,
            allowable_fill_height_course: None,
            allowable_fill_height_next: None,
            operating_fill_height: None,
            shell_height: None,
            fill_restricted: None,
            latest_survey: None,
            courses_below_minimum: below(&[]),
            warnings: None,
            error: Some(message.clone()),
        },
    }
}

/// The JSON document.
#[derive(Debug, Serialize)]
pub struct FleetDocument {
    root: String,
    tank_folders: usize,
    assessed: usize,
    failed: usize,
    tanks: Vec<FleetRecord<Vec<u32>>>,
    caution: &'static str,
}

/// Pretty JSON text with a final newline.
pub fn render_json(fleet: &Fleet, units: Option<UnitSystem>) -> String {
    let doc = FleetDocument {
        root: fleet.root.clone(),
        tank_folders: fleet.entries.len(),
        assessed: fleet.assessed(),
        failed: fleet.failed(),
        tanks: fleet
            .entries
            .iter()
            .map(|e| record(e, units, <[u32]>::to_vec))
            .collect(),
        caution: CAUTION,
    };
    let mut s = serde_json::to_string_pretty(&doc)
        .unwrap_or_else(|e| format!("{{\"error\": \"JSON serialisation failed: {e}\"}}"));
    s.push('\n');
    s
}

/// CSV, one row per tank folder, with the JSON record's field names.
pub fn render_csv(fleet: &Fleet, units: Option<UnitSystem>) -> Result<String, csv::Error> {
    let mut w = csv::Writer::from_writer(Vec::new());
    for e in &fleet.entries {
        w.serialize(record(e, units, |b| {
            b.iter().map(u32::to_string).collect::<Vec<_>>().join(" ")
        }))?;
    }
    let bytes = w
        .into_inner()
        .map_err(|e| csv::Error::from(e.into_error()))?;
    Ok(String::from_utf8_lossy(&bytes).into_owned())
}
