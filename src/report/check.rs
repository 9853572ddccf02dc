//! Output of `strake check`.

use std::fmt::Write as _;

use serde::Serialize;

use crate::calc::screen::Screening;
use crate::calc::units::UnitSystem;
use crate::input::survey_csv::SurveyFileInfo;
use crate::model::scan::Scan;
use crate::model::tank::Tank;
use crate::model::warning::Warning;
use crate::report::text::{bold, bullet};

/// What `check` found for one path.
#[derive(Debug)]
pub enum Checked {
    /// A tank folder that reads without error.
    Tank {
        /// Folder.
        dir: String,
        /// The tank.
        tank: Box<Tank>,
        /// Files read.
        files: Vec<SurveyFileInfo>,
        /// Counts and suspects.
        screening: Screening,
        /// Repeats and other remarks made while reading.
        remarks: Vec<Warning>,
        /// Grid scans read (scans/*.csv).
        scans: Vec<Scan>,
    },
    /// A lone grid scan file.
    Scan {
        /// The scan.
        scan: Box<Scan>,
        /// The id and units of the tank it was checked against (None without a
        /// tank.toml above).
        tank: Option<(String, UnitSystem)>,
    },
    /// A lone survey file.
    File {
        /// The file.
        info: SurveyFileInfo,
        /// Counts (no suspects without a tank).
        screening: Screening,
    },
    /// A path that failed.
    Failed {
        /// The path as given.
        path: String,
        /// The error message (with file, line and value).
        message: String,
    },
}

fn count_table(s: &Screening, out: &mut String) {
    let courses = s.courses();
    let mut head = format!("  {:<10}", "date");
    for c in &courses {
        let _ = write!(head, " {:>5}", format!("c{c}"));
    }
    let _ = writeln!(out, "{head} {:>6}", "total");
    for d in s.dates() {
        let mut line = format!("  {:<10}", d.to_string());
        let mut total = 0;
        for c in &courses {
            let n = s.counts.get(&(d, *c)).copied().unwrap_or(0);
            total += n;
            let _ = write!(line, " {n:>5}");
        }
        let _ = writeln!(out, "{line} {total:>6}");
    }
}

/// One line about a scan: course, date, grid, readings, pits, delimiter (with units
/// when the tank is known).
fn scan_line(s: &Scan, units: Option<UnitSystem>) -> String {
    let (lu, tu) = units.map_or(("", ""), |u| (u.length_unit(), u.thickness_unit()));
    let sp = |unit: &str| if unit.is_empty() { "" } else { " " };
    let pits = match s.pit_threshold {
        Some(p) => format!(
            ", {} pit{} (below {}{}{tu})",
            s.pits(),
            if s.pits() == 1 { "" } else { "s" },
            p.0,
            sp(tu)
        ),
        None => String::new(),
    };
    format!(
        "course {}, {}, {} rows x {} columns, bottom row at {}{}{lu}, row pitch {}{}{tu}, column \
         pitch {}{}{tu}, {} readings, {} not measured{pits}, delimiter {}",
        s.course,
        s.date,
        s.rows(),
        s.columns(),
        s.bottom_elevation.0,
        sp(lu),
        s.row_pitch.0,
        sp(tu),
        s.column_pitch.0,
        sp(tu),
        s.readings(),
        s.not_measured(),
        delimiter_name(s.delimiter)
    )
}

/// Terminal text.
pub fn render_text(items: &[Checked]) -> String {
    let mut o = String::new();
    let b = bold();
    let mut ok = 0;
    for item in items {
        match item {
            Checked::Tank {
                dir,
                tank,
                files,
                screening,
                remarks,
                scans,
            } => {
                ok += 1;
                let readings: usize = screening.counts.values().sum();
                let _ = writeln!(
                    o,
                    "{b}{dir}{b:#}: tank {}{}, {}, {}, D {} {}",
                    tank.id,
                    tank.name
                        .as_deref()
                        .map(|n| format!(" - {n}"))
                        .unwrap_or_default(),
                    tank.units,
                    plural(tank.courses.len(), "course"),
                    tank.diameter.0,
                    tank.units.length_unit()
                );
                let _ = writeln!(
                    o,
                    "  {} survey file{}, {readings} readings, {} survey date{}",
                    files.len(),
                    if files.len() == 1 { "" } else { "s" },
                    screening.dates().len(),
                    if screening.dates().len() == 1 {
                        ""
                    } else {
                        "s"
                    }
                );
                for f in files {
                    let _ = writeln!(
                        o,
                        "    {}: {} rows, delimiter {}, thickness in {}",
                        f.path,
                        f.rows,
                        delimiter_name(f.delimiter),
                        f.thickness_unit.unwrap_or("?")
                    );
                }
                let missing: Vec<String> = tank
                    .courses
                    .iter()
                    .filter(|c| !screening.courses().contains(&c.number))
                    .map(|c| c.number.to_string())
                    .collect();
                if !screening.counts.is_empty() {
                    let _ = writeln!(o, "  readings per course and date:");
                    count_table(screening, &mut o);
                }
                if !scans.is_empty() {
                    let _ = writeln!(
                        o,
                        "  {} grid scan{}:",
                        scans.len(),
                        if scans.len() == 1 { "" } else { "s" },
                    );
                    for sc in scans {
                        let line = format!("{}: {}", sc.file, scan_line(sc, Some(tank.units)));
                        for line in bullet(&line).lines() {
                            let _ = writeln!(o, "  {line}");
                        }
                    }
                }
                if !missing.is_empty() {
                    let _ = writeln!(o, "  courses without any reading: {}", missing.join(", "));
                }
                if screening.suspects.is_empty() && remarks.is_empty() {
                    let _ = writeln!(o, "  suspect readings: none");
                } else {
                    let _ = writeln!(
                        o,
                        "  suspect readings and repeats ({}):",
                        screening.suspects.len() + remarks.len()
                    );
                    for w in screening.suspects.iter().chain(remarks) {
                        for line in bullet(&w.to_string()).lines() {
                            let _ = writeln!(o, "  {line}");
                        }
                    }
                }
            }
            Checked::File { info, screening } => {
                ok += 1;
                let readings: usize = screening.counts.values().sum();
                let courses: Vec<String> = screening.courses().iter().map(u32::to_string).collect();
                let _ = writeln!(
                    o,
                    "{b}{}{b:#}: {readings} readings, {} survey date{}, courses {}, delimiter {}",
                    info.path,
                    screening.dates().len(),
                    if screening.dates().len() == 1 {
                        ""
                    } else {
                        "s"
                    },
                    courses.join(", "),
                    delimiter_name(info.delimiter)
                );
                count_table(screening, &mut o);
                let _ = writeln!(
                    o,
                    "  no tank.toml above this file: course range, units and nominal-based \
                     checks were not made"
                );
            }
            Checked::Scan { scan, tank } => {
                ok += 1;
                let _ = writeln!(o, "{b}{}{b:#}: grid scan", scan.file);
                let line = scan_line(scan, tank.as_ref().map(|t| t.1));
                o.push_str(&crate::report::text::wrap(&line, 92, "  "));
                match tank {
                    Some((id, _)) => {
                        let _ = writeln!(
                            o,
                            "  checked against tank {id} (course, elevations, nominal thickness)"
                        );
                    }
                    None => {
                        let _ = writeln!(
                            o,
                            "  no tank.toml above this file: course range, units and nominal-based \
                             checks were not made"
                        );
                    }
                }
            }
            Checked::Failed { path, .. } => {
                let _ = writeln!(
                    o,
                    "{b}{path}{b:#}: not readable (the error is on standard error)"
                );
            }
        }
        o.push('\n');
    }
    let failed = items.len() - ok;
    let _ = writeln!(
        o,
        "checked {} path{}: {ok} readable, {failed} with errors",
        items.len(),
        if items.len() == 1 { "" } else { "s" }
    );
    o.push('\n');
    o.push_str(&crate::report::text::wrap(
        &format!("Caution: {}", crate::report::caution::CAUTION),
        crate::report::text::WRAP,
        "",
    ));
    o
}

/// "1 course", "3 courses".
pub fn plural(n: usize, word: &str) -> String {
    if n == 1 {
        format!("{n} {word}")
    } else {
        format!("{n} {word}s")
    }
}

fn delimiter_name(d: char) -> &'static str {
    match d {
        ';' => "semicolon",
        '\t' => "tab",
        _ => "comma",
    }
}

#[derive(Serialize)]
struct JsonCount {
    date: String,
    course: u32,
    readings: usize,
}

#[derive(Serialize)]
struct JsonChecked {
    path: String,
    ok: bool,
    tank_id: Option<String>,
    files: Vec<String>,
    readings: usize,
    counts: Vec<JsonCount>,
    suspects: Vec<String>,
    error: Option<String>,
    scans: Vec<String>,
}

/// JSON text: one record per path.
pub fn render_json(items: &[Checked]) -> String {
    let records: Vec<JsonChecked> = items
        .iter()
        .map(|item| match item {
            Checked::Tank {
                dir,
                tank,
                files,
                screening,
                remarks,
                scans,
            } => JsonChecked {
                path: dir.clone(),
                ok: true,
                tank_id: Some(tank.id.clone()),
                files: files.iter().map(|f| f.path.clone()).collect(),
                readings: screening.counts.values().sum(),
                counts: counts(screening),
                suspects: screening
                    .suspects
                    .iter()
                    .chain(remarks)
                    .map(ToString::to_string)
                    .collect(),
                error: None,
                scans: scans.iter().map(|x| x.file.clone()).collect(),
            },
            Checked::File { info, screening } => JsonChecked {
                path: info.path.clone(),
                ok: true,
                tank_id: None,
                files: vec![info.path.clone()],
                readings: screening.counts.values().sum(),
                counts: counts(screening),
                suspects: Vec::new(),
                error: None,
                scans: Vec::new(),
            },
            Checked::Scan { scan, tank } => JsonChecked {
                path: scan.file.clone(),
                ok: true,
                tank_id: tank.as_ref().map(|t| t.0.clone()),
                files: Vec::new(),
                readings: scan.readings(),
                counts: Vec::new(),
                suspects: Vec::new(),
                error: None,
                scans: vec![scan.file.clone()],
            },
            Checked::Failed { path, message } => JsonChecked {
                path: path.clone(),
                ok: false,
                tank_id: None,
                files: Vec::new(),
                readings: 0,
                counts: Vec::new(),
                suspects: Vec::new(),
                error: Some(message.clone()),
                scans: Vec::new(),
            },
        })
        .collect();
    #[derive(Serialize)]
    struct Document {
        paths: Vec<JsonChecked>,
        caution: &'static str,
    }
    let doc = Document {
        paths: records,
        caution: crate::report::caution::CAUTION,
    };
    let mut s = serde_json::to_string_pretty(&doc).unwrap_or_default();
    s.push('\n');
    s
}

fn counts(s: &Screening) -> Vec<JsonCount> {
    s.counts
        .iter()
        .map(|((d, c), n)| JsonCount {
            date: d.to_string(),
            course: *c,
            readings: *n,
        })
        .collect()
}
