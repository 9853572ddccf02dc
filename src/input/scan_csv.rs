//! Reads grid scan files (`scans/*.csv`, README "Scan CSV") into a [`Scan`].
//!
//! A scan is a header block of `# key = value` lines, then a plain grid of readings:
//! each row one elevation (bottom row first), each column one circumferential
//! position, an empty cell for a point not measured.
//!
//! - Header: a `#` line holding `=` is a key line; other `#` lines are free comments.
//!   Keys are case-insensitive; unknown and repeated keys are refused (the nearest
//!   known key is suggested). Required: `course`, `date`, `bottom_elevation` (of the
//!   first grid row, in the tank's length unit), `row_pitch` and `column_pitch` (in the
//!   tank's thickness unit); optional: `pit_threshold` (readings below it are pits).
//! - Grid: read by the csv crate. The delimiter is `;` when the first grid line holds
//!   one, else tab when it holds one, else `,` (a grid has no header row to count
//!   delimiters in, and its decimal commas would outnumber them); with `;` or tab a
//!   decimal comma is accepted (the survey reader's number rule, shared). Blank lines
//!   are skipped; every row has as many cells as the first.
//! - Every problem is refused with the file, the line (and the column of a header
//!   value or of the grid), the value and what was expected.

use chrono::NaiveDate;

use super::error::echo;
use super::error::{InputError, InputErrorKind, Location, nearest};
use super::survey_csv::{BOM, COMMA_HINT, NumberText, example_thickness, read_number};
use crate::calc::constants::{MIN_SCAN_PITCH_MM, UNIT_MISTAKE_FACTOR};
use crate::calc::units::{Length, Thickness, UnitSystem};
use crate::model::scan::Scan;
use crate::model::tank::Tank;
use crate::model::warning::Shown;

/// Every key of a scan header.
pub const SCAN_KEYS: &[&str] = &[
    "course",
    "date",
    "bottom_elevation",
    "row_pitch",
    "column_pitch",
    "pit_threshold",
];

/// How messages name the header block.
const HEADER: &str = "the scan header";

/// Tolerance on elevations compared with the course bounds (the grid's top row may sit
/// on the course joint).
const ELEVATION_TOLERANCE: f64 = 1e-9;

/// One `# key = value` line.
#[derive(Debug, Clone, Copy)]
struct KeyLine<'a> {
    key: &'static str,
    value: &'a str,
    line: u64,
    /// 1-based character column of the value.
    column: u64,
}

/// True when the leading `#` lines of `bytes` hold a `# key = value` line with a scan
/// key: how a lone file given to `strake check` is told from a survey file (besides
/// being in a scans/ folder).
pub fn looks_like_scan(bytes: &[u8]) -> bool {
    let bytes = bytes.strip_prefix(BOM).unwrap_or(bytes);
    bytes
        .split(|&b| b == b'\n')
        .map(<[u8]>::trim_ascii)
        .filter(|l| !l.is_empty())
        .take_while(|l| l.starts_with(b"#"))
        .any(|l| {
            let text = String::from_utf8_lossy(&l[1..]);
            text.split_once('=')
                .is_some_and(|(k, _)| SCAN_KEYS.contains(&k.trim().to_ascii_lowercase().as_str()))
        })
}

/// The delimiter of a grid line: `;` when it holds one, else tab, else `,`.
pub fn grid_delimiter(line: &str) -> u8 {
    if line.contains(';') {
        b';'
    } else if line.contains('\t') {
        b'\t'
    } else {
        b','
    }
}

/// 1-based character column of `part` (a slice of `line`) within `line`.
fn column_of(line: &str, part: &str) -> u64 {
    let start = (part.as_ptr() as usize).saturating_sub(line.as_ptr() as usize);
    let start = start.min(line.len());
    line.get(..start).map_or(0, |s| s.chars().count()) as u64 + 1
}

/// Reads one scan file from its bytes. With the tank (`Some`), the course, the
/// elevations and the readings are checked against it; without (a lone file given to
/// `strake check`), only what needs no tank. `today` bounds the date.
pub fn read_scan(
    path: &str,
    bytes: &[u8],
    tank: Option<&Tank>,
    today: NaiveDate,
) -> Result<Scan, InputError> {
    let bytes = bytes.strip_prefix(BOM).unwrap_or(bytes);
    let text = std::str::from_utf8(bytes).map_err(|e| {
        let offset = e.valid_up_to();
        let valid = std::str::from_utf8(&bytes[..offset]).unwrap_or("");
        InputError::new(
            Location::at_offset(path, valid, offset),
            InputErrorKind::NotUtf8 {
                column: None,
                byte: bytes.get(offset).copied(),
            },
        )
    })?;
    if text.trim().is_empty() {
        return Err(InputError::new(
            Location::file(path),
            InputErrorKind::EmptyScan,
        ));
    }

    // 1. The header block: every line up to the first that is neither blank nor `#`.
    let mut keys: Vec<KeyLine<'_>> = Vec::new();
    let mut offset = 0usize;
    let mut line_no = 0u64;
    let mut grid_start: Option<(usize, u64, &str)> = None;
    for raw in text.split_inclusive('\n') {
        line_no += 1;
        let line = raw.trim_end_matches(['\n', '\r']);
        let trimmed = line.trim();
        if trimmed.is_empty() {
            offset += raw.len();
            continue;
        }
        let Some(rest) = trimmed.strip_prefix('#') else {
            grid_start = Some((offset, line_no, line));
            break;
        };
        offset += raw.len();
        let Some((k, v)) = rest.split_once('=') else {
            continue; // a free comment
        };
        let (k, v) = (k.trim(), v.trim());
        let lower = k.to_ascii_lowercase();
        let Some(key) = SCAN_KEYS.iter().copied().find(|known| *known == lower) else {
            return Err(InputError::new(
                Location {
                    path: path.to_string(),
                    line: Some(line_no),
                    column: Some(column_of(line, k)),
                },
                InputErrorKind::UnknownKey {
                    key: echo(k),
                    table: Some(HEADER.into()),
                    suggestion: nearest(&lower, SCAN_KEYS.iter().copied()),
                    known: SCAN_KEYS.join(", "),
                },
            ));
        };
        let this = KeyLine {
            key,
            value: v,
            line: line_no,
            column: column_of(line, v),
        };
        if let Some(first) = keys.iter().find(|kl| kl.key == key) {
            return Err(invalid(
                path,
                &this,
                &format!("repeats the key of line {}: give each key once", first.line),
            ));
        }
        keys.push(this);
    }
    let Some((grid_offset, grid_line, first_grid_line)) = grid_start else {
        return Err(InputError::new(
            Location::file(path),
            InputErrorKind::NoGrid,
        ));
    };
    let grid_text = &text[grid_offset..];
    for (i, raw) in grid_text.lines().enumerate() {
        if let Some(rest) = raw.trim().strip_prefix('#')
            && let Some((k, _)) = rest.split_once('=')
        {
            return Err(InputError::new(
                Location::line(path, grid_line + i as u64),
                InputErrorKind::KeyAfterGrid {
                    key: echo(k.trim()),
                    grid_line,
                },
            ));
        }
    }
    let delimiter = grid_delimiter(first_grid_line);

    // 2. The header values.
    let units = tank.map(|t| t.units);
    let tu = units.map_or("the tank's thickness unit", |u| u.thickness_unit());
    let lu = units.map_or("the tank's length unit", |u| u.length_unit());
    let need = |key: &'static str| -> Result<KeyLine<'_>, InputError> {
        keys.iter()
            .copied()
            .find(|kl| kl.key == key)
            .ok_or_else(|| {
                InputError::new(
                    Location::file(path),
                    InputErrorKind::MissingKey {
                        key,
                        table: Some(HEADER.into()),
                        expected: scan_key_expected(key).to_string(),
                    },
                )
            })
    };

    let course_line = need("course")?;
    let n_courses = tank.map_or(0, |t| t.courses.len() as u32);
    let range = if n_courses > 0 {
        format!("1 to {n_courses}")
    } else {
        "1 or more".to_string()
    };
    let course: u32 = match course_line.value.parse::<u32>() {
        Ok(c) if c >= 1 && (n_courses == 0 || c <= n_courses) => c,
        Ok(_) => {
            return Err(invalid(
                path,
                &course_line,
                &format!("is not a course of this tank, expected {range} (1 = bottom course)"),
            ));
        }
        Err(_) => {
            return Err(invalid(
                path,
                &course_line,
                &format!(
                    "is not a course number, expected a whole number, {range} (1 = bottom course)"
                ),
            ));
        }
    };

    let date_line = need("date")?;
    let date = parse_date(path, &date_line, tank, today)?;

    let bottom_line = need("bottom_elevation")?;
    let bottom = number(
        path,
        &bottom_line,
        delimiter,
        &format!("a height above the tank bottom in {lu}, e.g. 0.35"),
    )?;
    if bottom < 0.0 {
        return Err(invalid(
            path,
            &bottom_line,
            &format!("is negative, expected a height above the tank bottom in {lu}"),
        ));
    }

    let pitch = |key: &'static str| -> Result<(KeyLine<'_>, f64), InputError> {
        let kl = need(key)?;
        let v = number(
            path,
            &kl,
            delimiter,
            &format!("a distance in {tu}, e.g. 50"),
        )?;
        if v <= 0.0 {
            return Err(invalid(
                path,
                &kl,
                &format!("is not positive, expected a distance in {tu} above 0"),
            ));
        }
        // The least pitch in the tank's unit (unknown without a tank: not checked).
        let least = units.map_or(0.0, |u| {
            Thickness(MIN_SCAN_PITCH_MM).convert(UnitSystem::Si, u).0
        });
        if v < least {
            return Err(invalid(
                path,
                &kl,
                &format!(
                    "is below {} {tu}, the least spacing a probe can be stepped at: a unit \
                     mistake? expected the distance in {tu}, e.g. 50",
                    round_for_message(least)
                ),
            ));
        }
        Ok((kl, v))
    };
    let (_, row_pitch) = pitch("row_pitch")?;
    let (_, column_pitch) = pitch("column_pitch")?;

    let pit_line = keys.iter().copied().find(|kl| kl.key == "pit_threshold");
    let pit_threshold = match &pit_line {
        None => None,
        Some(kl) => {
            let v = number(path, kl, delimiter, &format!("a thickness in {tu}"))?;
            if v <= 0.0 {
                return Err(invalid(
                    path,
                    kl,
                    &format!(
                        "is not positive, expected a thickness in {tu} below which a reading is a pit"
                    ),
                ));
            }
            Some(Thickness(v))
        }
    };

    // 3. The grid.
    let nominal = tank
        .and_then(|t| t.course(course))
        .map(|c| c.nominal_thickness);
    let mut reader = csv::ReaderBuilder::new()
        .has_headers(false)
        .flexible(true)
        .delimiter(delimiter)
        .comment(Some(b'#'))
        .trim(csv::Trim::All)
        .from_reader(grid_text.as_bytes());
    let mut record = csv::StringRecord::new();
    let mut cells: Vec<Vec<Option<Thickness>>> = Vec::new();
    let mut lines: Vec<u64> = Vec::new();
    let file_line = |relative: u64| grid_line + relative.saturating_sub(1);
    let expected = format!(
        "a thickness in {tu}, e.g. {}",
        example_thickness(units.map_or("mm", |u| u.thickness_unit()))
    );
    loop {
        match reader.read_record(&mut record) {
            Ok(false) => break,
            Ok(true) => {}
            Err(e) => {
                let line = file_line(e.position().map_or(1, csv::Position::line));
                return Err(InputError::new(
                    Location::line(path, line),
                    InputErrorKind::Io(std::io::Error::other(e.to_string())),
                ));
            }
        }
        let line = file_line(record.position().map_or(1, csv::Position::line));
        if record.len() == 1 && record.get(0).is_some_and(str::is_empty) {
            continue;
        }
        if let Some(first) = cells.first()
            && record.len() != first.len()
        {
            return Err(InputError::new(
                Location::line(path, line),
                InputErrorKind::GridWidth {
                    found: record.len(),
                    expected: first.len(),
                    first_line: lines[0],
                },
            ));
        }
        let mut row = Vec::with_capacity(record.len());
        for (j, cell) in record.iter().enumerate() {
            let at = Location::line(path, line);
            let bad = |what: &'static str, expected: String| {
                InputError::new(
                    at.clone(),
                    InputErrorKind::BadCell {
                        column: j + 1,
                        value: echo(cell),
                        what,
                        expected,
                    },
                )
            };
            let out_of_range = |value: String, problem: String| {
                InputError::new(
                    at.clone(),
                    InputErrorKind::CellOutOfRange {
                        column: j + 1,
                        value,
                        problem,
                    },
                )
            };
            let v = match read_number(cell, delimiter) {
                NumberText::Empty => {
                    row.push(None);
                    continue;
                }
                NumberText::Value(v) => v,
                NumberText::NotFinite => return Err(bad("a finite number", expected.clone())),
                NumberText::NotANumber => return Err(bad("a number", expected.clone())),
                NumberText::CommaNeedsSemicolon => {
                    return Err(bad("a number", format!("{expected}{COMMA_HINT}")));
                }
            };
            if v <= 0.0 {
                return Err(out_of_range(
                    format!("{v} {tu}"),
                    format!(
                        "is not positive, expected {expected}, or an empty cell for a point not measured"
                    ),
                ));
            }
            if let (Some(u), Some(n)) = (units, nominal)
                && v > UNIT_MISTAKE_FACTOR * n.0
            {
                return Err(out_of_range(
                    format!("{v} {tu}"),
                    format!(
                        "is more than 3 x the nominal {} of course {course}: a unit mistake? \
                         scan readings are in the tank's thickness unit ({tu})",
                        Shown::thickness(n, u)
                    ),
                ));
            }
            row.push(Some(Thickness(v)));
        }
        cells.push(row);
        lines.push(line);
    }
    let scan = Scan {
        file: path.to_string(),
        course,
        date,
        bottom_elevation: Length(bottom),
        row_pitch: Thickness(row_pitch),
        column_pitch: Thickness(column_pitch),
        pit_threshold,
        cells,
        lines,
        delimiter: char::from(delimiter),
    };
    if scan.readings() == 0 {
        return Err(InputError::new(
            Location::file(path),
            InputErrorKind::EmptyGrid,
        ));
    }
    if let (Some(kl), Some(p)) = (&pit_line, pit_threshold)
        && scan.readings() == scan.pits()
    {
        let thickest = scan
            .cells
            .iter()
            .flatten()
            .flatten()
            .map(|t| t.0)
            .fold(f64::NEG_INFINITY, f64::max);
        return Err(invalid(
            path,
            kl,
            &format!(
                "leaves no reading for t2: every reading of the grid is below {} {tu} (the \
                 thickest is {thickest} {tu}); expected the thickness below which a reading \
                 counts as a pit",
                p.0
            ),
        ));
    }
    if let Some(t) = tank
        && let Some(c) = t.course(course)
    {
        let low = c.bottom_elevation.0;
        let high = c.bottom_elevation.0 + c.height.0;
        let top = scan.top_elevation(t.units).0;
        let tol = ELEVATION_TOLERANCE * high.max(1.0);
        if bottom < low - tol || top > high + tol {
            return Err(invalid(
                path,
                &bottom_line,
                &format!(
                    "puts the grid ({} row{} at {row_pitch} {tu}, from {bottom} {lu} to {} {lu}) \
                     outside course {course}, which spans {low} {lu} to {high} {lu}; expected the \
                     elevation of the bottom row, with the whole grid within the course (split a \
                     scan that crosses a joint)",
                    scan.rows(),
                    if scan.rows() == 1 { "" } else { "s" },
                    round_for_message(top),
                ),
            ));
        }
    }
    Ok(scan)
}

/// An elevation for a message: at most 4 decimals, without trailing zeros.
fn round_for_message(v: f64) -> String {
    let s = format!("{v:.4}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    s.to_string()
}

fn invalid(path: &str, kl: &KeyLine<'_>, problem: &str) -> InputError {
    InputError::new(
        Location {
            path: path.to_string(),
            line: Some(kl.line),
            column: Some(kl.column),
        },
        InputErrorKind::InvalidValue {
            key: format!("key \"{}\"", kl.key),
            value: format!("\"{}\"", echo(kl.value)),
            problem: problem.to_string(),
        },
    )
}

fn number(path: &str, kl: &KeyLine<'_>, delimiter: u8, expected: &str) -> Result<f64, InputError> {
    match read_number(kl.value, delimiter) {
        NumberText::Value(v) => Ok(v),
        NumberText::Empty => Err(invalid(path, kl, &format!("is empty, expected {expected}"))),
        NumberText::NotFinite => Err(invalid(
            path,
            kl,
            &format!("is not a finite number, expected {expected}"),
        )),
        NumberText::NotANumber => Err(invalid(
            path,
            kl,
            &format!("is not a number, expected {expected}"),
        )),
        NumberText::CommaNeedsSemicolon => Err(invalid(
            path,
            kl,
            &format!("is not a number, expected {expected}{COMMA_HINT} (the grid's delimiter)"),
        )),
    }
}

fn parse_date(
    path: &str,
    kl: &KeyLine<'_>,
    tank: Option<&Tank>,
    today: NaiveDate,
) -> Result<NaiveDate, InputError> {
    let s = kl.value;
    let iso_shape = s.len() == 10
        && s.bytes().enumerate().all(|(k, b)| {
            if k == 4 || k == 7 {
                b == b'-'
            } else {
                b.is_ascii_digit()
            }
        });
    if !iso_shape {
        return Err(invalid(
            path,
            kl,
            "is not an ISO date, expected YYYY-MM-DD, e.g. 2024-05-17",
        ));
    }
    let date = NaiveDate::parse_from_str(s, "%Y-%m-%d").map_err(|_| {
        invalid(
            path,
            kl,
            "is not a calendar date, expected a day that exists, as YYYY-MM-DD",
        )
    })?;
    if date > today {
        return Err(invalid(
            path,
            kl,
            &format!("is after today ({today}), expected the date the scan was made"),
        ));
    }
    if let Some(since) = tank.and_then(|t| t.in_service_since)
        && date < since
    {
        return Err(invalid(
            path,
            kl,
            &format!(
                "is before the tank went into service ({since}, in_service_since in tank.toml)"
            ),
        ));
    }
    Ok(date)
}

/// What each header key of a scan holds, for "missing key" messages.
fn scan_key_expected(key: &str) -> &'static str {
    match key {
        "course" => "the course number of the scanned area (1 = bottom course)",
        "date" => "the date of the scan, as YYYY-MM-DD",
        "bottom_elevation" => "the elevation of the grid's first row above the tank bottom",
        "row_pitch" => "the spacing of the grid's rows, in the thickness unit (mm or in)",
        "column_pitch" => "the spacing of the grid's columns, in the thickness unit (mm or in)",
        _ => "a value",
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn today() -> NaiveDate {
        NaiveDate::from_ymd_opt(2026, 12, 1).expect("date")
    }

    #[test]
    fn reads_a_small_grid_bottom_row_first() {
        let text = "# a free comment\n# course = 2\n# Date = 2024-05-01\n\
                    # bottom_elevation = 0,5\n# row_pitch = 50\n# column_pitch = 40\n\
                    # pit_threshold = 6\n\n9,1;9,2;\n8,5;;5,5\n";
        let s = read_scan("s.csv", text.as_bytes(), None, today()).expect("reads");
        assert_eq!((s.course, s.rows(), s.columns()), (2, 2, 3));
        assert_eq!(s.delimiter, ';');
        assert_eq!(s.bottom_elevation, Length(0.5));
        assert_eq!(
            s.cells[0],
            vec![Some(Thickness(9.1)), Some(Thickness(9.2)), None]
        );
        assert_eq!(s.cells[1][2], Some(Thickness(5.5)));
        assert_eq!(s.lines, vec![9, 10]);
        assert_eq!((s.readings(), s.not_measured(), s.pits()), (4, 2, 1));
    }

    #[test]
    fn delimiters_of_a_grid_line() {
        assert_eq!(grid_delimiter("9,1;9,2"), b';');
        assert_eq!(grid_delimiter("9,1\t9,2"), b'\t');
        assert_eq!(grid_delimiter("9.1,9.2"), b',');
        assert_eq!(grid_delimiter("9.1"), b',');
    }

    #[test]
    fn tells_a_scan_from_a_survey() {
        assert!(looks_like_scan(b"\n# course = 1\n9.1,9.2\n"));
        assert!(looks_like_scan(b"# made up\n# Row_Pitch = 50\n9.1,9.2\n"));
        assert!(!looks_like_scan(b"# a = b\ndate,course,thickness\n"));
        assert!(!looks_like_scan(b"# exported\ndate,course,thickness\n"));
        assert!(!looks_like_scan(b"date,course,thickness\n"));
    }
}
