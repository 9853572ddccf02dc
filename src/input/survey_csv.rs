//! Reads survey CSV files (formats.md "Survey CSV") into [`Reading`]s.
//!
//! - Header row required; names are case-insensitive; unknown and repeated names are
//!   refused (with the nearest known name suggested).
//! - `,` `;` and tab delimiters are detected from the header line; with `;` or tab a
//!   decimal comma is accepted. A UTF-8 byte-order mark and CRLF line ends are
//!   tolerated; lines starting with `#` are comments; blank lines and rows of empty
//!   fields (",,," from a spreadsheet) hold no reading and are skipped.
//! - The whole file must be UTF-8 (checked first, so the message gives the line and
//!   column of the first bad byte). A value with a line break in it is refused: in a
//!   survey it is a quote left open, which would swallow the rows after it.
//! - A header column without a name is allowed while its cells are empty.
//! - Unit-suffixed columns (`thickness_mm`, `thickness_in`, `elevation_m`,
//!   `elevation_ft`) are converted to the tank's units.
//! - Every row is either returned or refused with its line, column and value; values
//!   echoed in messages are shortened and escaped ([`echo`]).
//!
//! The csv crate does the CSV; this module only decides what each field means.

use chrono::{Datelike, NaiveDate};

use super::error::{InputError, InputErrorKind, Location, echo, nearest, number_text};
use super::limits::{ALL_THIN_FACTOR, EARLIEST_SURVEY_YEAR, MAX_POINT_CHARS};
use crate::calc::constants::UNIT_MISTAKE_FACTOR;
use crate::calc::units::{Length, Thickness, UnitSystem};
use crate::model::reading::{Origin, Reading};
use crate::model::warning::Shown;

/// Every column name the reader knows.
pub const KNOWN_COLUMNS: &[&str] = &[
    "date",
    "course",
    "thickness",
    "thickness_mm",
    "thickness_in",
    "point",
    "elevation",
    "elevation_m",
    "elevation_ft",
    "azimuth",
    "note",
];

/// What the reader knows about the tank the file belongs to. Without a tank (a lone
/// file given to `strake check`), only the checks that need no tank are made.
#[derive(Debug, Clone)]
pub struct SurveyContext {
    /// The tank's unit system, when known.
    pub units: Option<UnitSystem>,
    /// Nominal thickness of each course, bottom first, when known.
    pub nominal: Vec<Thickness>,
    /// The tank's shell height, when known.
    pub shell_height: Option<Length>,
    /// In-service date, when known.
    pub in_service_since: Option<NaiveDate>,
    /// Today: no survey can be later.
    pub today: NaiveDate,
}

/// What was found in one file.
#[derive(Debug, Clone, PartialEq)]
pub struct SurveyFileInfo {
    /// The file, as displayed.
    pub path: String,
    /// The detected delimiter.
    pub delimiter: char,
    /// Header names as written.
    pub columns: Vec<String>,
    /// Data rows read.
    pub rows: usize,
    /// Unit of the thickness column ("mm", "in", or the tank's when unsuffixed).
    pub thickness_unit: Option<&'static str>,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Suffix {
    None,
    Si,
    Usc,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Field {
    Date,
    Course,
    Thickness(Suffix),
    Point,
    Elevation(Suffix),
    Azimuth,
    Note,
}

impl Field {
    fn parse(name: &str) -> Option<Field> {
        Some(match name {
            "date" => Field::Date,
            "course" => Field::Course,
            "thickness" => Field::Thickness(Suffix::None),
            "thickness_mm" => Field::Thickness(Suffix::Si),
            "thickness_in" => Field::Thickness(Suffix::Usc),
            "point" => Field::Point,
            "elevation" => Field::Elevation(Suffix::None),
            "elevation_m" => Field::Elevation(Suffix::Si),
            "elevation_ft" => Field::Elevation(Suffix::Usc),
            "azimuth" => Field::Azimuth,
            "note" => Field::Note,
            _ => return None,
        })
    }
    /// The quantity, for the mixed-unit check.
    fn quantity(self) -> &'static str {
        match self {
            Field::Thickness(_) => "thickness",
            Field::Elevation(_) => "elevation",
            Field::Date => "date",
            Field::Course => "course",
            Field::Point => "point",
            Field::Azimuth => "azimuth",
            Field::Note => "note",
        }
    }
}

/// Column positions of one file.
#[derive(Debug)]
struct Columns {
    date: usize,
    course: usize,
    thickness: (usize, Suffix),
    point: Option<usize>,
    elevation: Option<(usize, Suffix)>,
    azimuth: Option<usize>,
    note: Option<usize>,
    names: Vec<String>,
    /// Columns with an empty header name: their cells must be empty.
    unnamed: Vec<usize>,
}

const BOM: &[u8] = b"\xEF\xBB\xBF";

/// The delimiter of the first non-blank, non-comment line: the most frequent of
/// `,` `;` and tab (`,` on a tie or when there is none).
pub fn detect_delimiter(bytes: &[u8]) -> u8 {
    let line = bytes
        .split(|&b| b == b'\n')
        .map(|l| l.strip_suffix(b"\r").unwrap_or(l))
        .find(|l| !l.iter().all(u8::is_ascii_whitespace) && !l.starts_with(b"#"))
        .unwrap_or(&[]);
    let count = |d: u8| line.iter().filter(|&&b| b == d).count();
    let (comma, semi, tab) = (count(b','), count(b';'), count(b'\t'));
    if semi > comma && semi >= tab {
        b';'
    } else if tab > comma && tab > semi {
        b'\t'
    } else {
        b','
    }
}

/// Reads one survey file from its bytes. Readings are appended to `out` with
/// `file_index` as their origin; returns what was found.
pub fn read_survey(
    path: &str,
    bytes: &[u8],
    file_index: u32,
    ctx: &SurveyContext,
    out: &mut Vec<Reading>,
) -> Result<SurveyFileInfo, InputError> {
    let bytes = bytes.strip_prefix(BOM).unwrap_or(bytes);
    // The whole file must be UTF-8: checked first, so that the message points at the
    // line and column of the first bad byte, wherever it is (comment lines included).
    if let Err(e) = std::str::from_utf8(bytes) {
        let offset = e.valid_up_to();
        let valid = String::from_utf8_lossy(&bytes[..offset]);
        return Err(InputError::new(
            Location::at_offset(path, &valid, offset),
            InputErrorKind::NotUtf8 {
                column: None,
                byte: bytes.get(offset).copied(),
            },
        ));
    }
    let delimiter = detect_delimiter(bytes);
    let mut reader = csv::ReaderBuilder::new()
        .has_headers(false)
        .flexible(true)
        .delimiter(delimiter)
        .comment(Some(b'#'))
        .trim(csv::Trim::All)
        .from_reader(bytes);
    let mut record = csv::ByteRecord::new();
    let at = |line: u64| Location::line(path, line);
    let read = |reader: &mut csv::Reader<&[u8]>, record: &mut csv::ByteRecord| loop {
        let more = reader.read_byte_record(record).map_err(|e| {
            let line = e.position().map_or(1, |p| p.line());
            InputError::new(
                at(line),
                InputErrorKind::Io(std::io::Error::other(e.to_string())),
            )
        })?;
        // A row of empty fields (a blank line, or ",,," from a spreadsheet) holds no
        // reading: skipped.
        if !more || record.iter().any(|f| !f.is_empty()) {
            return Ok::<bool, InputError>(more);
        }
    };
    if !read(&mut reader, &mut record)? {
        return Err(InputError::new(at(1), InputErrorKind::EmptyFile));
    }
    let header_line = record.position().map_or(1, csv::Position::line);
    single_lines(path, header_line, &record, None)?;
    let cols = header(path, header_line, &record)?;
    let mut row_parser = RowParser {
        path,
        ctx,
        cols: &cols,
        delimiter,
        date_cache: None,
    };
    let mut rows = 0usize;
    let first_new = out.len();
    while read(&mut reader, &mut record)? {
        let line = record.position().map_or(0, csv::Position::line);
        single_lines(path, line, &record, Some(&cols.names))?;
        if record.len() != cols.names.len() {
            let row: Vec<String> = record
                .iter()
                .map(|f| String::from_utf8_lossy(f).into_owned())
                .collect();
            return Err(InputError::new(
                at(line),
                InputErrorKind::FieldCount {
                    found: record.len(),
                    expected: cols.names.len(),
                    row: echo(&row.join(&char::from(delimiter).to_string())),
                },
            ));
        }
        for &i in &cols.unnamed {
            if let Some(value) = record.get(i).filter(|v| !v.is_empty()) {
                return Err(InputError::new(
                    at(line),
                    InputErrorKind::UnnamedColumn {
                        position: i + 1,
                        value: echo(&String::from_utf8_lossy(value)),
                    },
                ));
            }
        }
        out.push(row_parser.parse(&record, line, file_index)?);
        rows += 1;
    }
    if rows == 0 {
        return Err(InputError::new(at(header_line), InputErrorKind::HeaderOnly));
    }
    all_thin(path, ctx, cols.thickness.1, &out[first_new..])?;
    let thickness_unit = match cols.thickness.1 {
        Suffix::Si => Some("mm"),
        Suffix::Usc => Some("in"),
        Suffix::None => ctx.units.map(UnitSystem::thickness_unit),
    };
    Ok(SurveyFileInfo {
        path: path.to_string(),
        delimiter: char::from(delimiter),
        columns: cols.names,
        rows,
        thickness_unit,
    })
}

/// Refuses a file whose every reading is under [`ALL_THIN_FACTOR`] of its course's
/// nominal thickness: inches read as mm give about 1/25 of nominal, while no real
/// survey finds a whole shell worn to a fifth of its plate.
fn all_thin(
    path: &str,
    ctx: &SurveyContext,
    suffix: Suffix,
    readings: &[Reading],
) -> Result<(), InputError> {
    let Some(units) = ctx.units else {
        return Ok(());
    };
    let nominal_of = |r: &Reading| ctx.nominal.get(r.course as usize - 1).copied();
    let thin = |r: &Reading| nominal_of(r).is_some_and(|n| r.thickness.0 < ALL_THIN_FACTOR * n.0);
    let Some(first) = readings.first() else {
        return Ok(());
    };
    if !readings.iter().all(thin) {
        return Ok(());
    }
    let nominal = nominal_of(first).unwrap_or(Thickness(f64::NAN));
    Err(InputError::new(
        Location::line(path, first.origin.line),
        InputErrorKind::AllThin {
            count: readings.len(),
            first: format!(
                "{} {}",
                number_text(first.thickness.0),
                units.thickness_unit()
            ),
            nominal: Shown::thickness(nominal, units).to_string(),
            course: first.course,
            hint: match suffix {
                Suffix::None => "name the column thickness_in or thickness_mm to say the unit",
                _ => "the column name gives the unit: are the readings in another one?",
            },
        },
    ))
}

/// Refuses a record with a line break inside a value: in a survey file that is a quote
/// left open, and the rows it swallowed would be lost without a word.
fn single_lines(
    path: &str,
    line: u64,
    record: &csv::ByteRecord,
    names: Option<&[String]>,
) -> Result<(), InputError> {
    for (i, field) in record.iter().enumerate() {
        if field.contains(&b'\n') || field.contains(&b'\r') {
            let breaks = field.iter().filter(|&&b| b == b'\n').count() as u64;
            return Err(InputError::new(
                Location::line(path, line),
                InputErrorKind::MultiLineValue {
                    column: names.and_then(|n| n.get(i)).cloned(),
                    first: line,
                    last: line + breaks.max(1),
                    value: echo(&String::from_utf8_lossy(field)),
                },
            ));
        }
    }
    Ok(())
}

fn header(path: &str, line: u64, record: &csv::ByteRecord) -> Result<Columns, InputError> {
    let at = || Location::line(path, line);
    let mut seen: Vec<(Field, usize, String)> = Vec::new();
    let mut names = Vec::with_capacity(record.len());
    let mut unnamed = Vec::new();
    for (i, raw) in record.iter().enumerate() {
        let name = std::str::from_utf8(raw).map_err(|_| {
            InputError::new(
                at(),
                InputErrorKind::NotUtf8 {
                    column: None,
                    byte: None,
                },
            )
        })?;
        names.push(name.to_string());
        if name.is_empty() {
            // A spreadsheet's trailing empty column: allowed while its cells are empty.
            unnamed.push(i);
            continue;
        }
        let lower = name.to_ascii_lowercase();
        let Some(field) = Field::parse(&lower) else {
            return Err(InputError::new(
                at(),
                InputErrorKind::UnknownColumn {
                    column: echo(name),
                    suggestion: nearest(&lower, KNOWN_COLUMNS.iter().copied()),
                    known: KNOWN_COLUMNS.join(", "),
                },
            ));
        };
        if let Some((_, first, first_name)) = seen.iter().find(|(f, _, _)| *f == field) {
            return Err(InputError::new(
                at(),
                InputErrorKind::DuplicateColumn {
                    column: echo(first_name),
                    first: first + 1,
                    second: i + 1,
                },
            ));
        }
        if let Some((_, _, first_name)) = seen
            .iter()
            .find(|(f, _, _)| f.quantity() == field.quantity())
        {
            return Err(InputError::new(
                at(),
                InputErrorKind::MixedUnits {
                    quantity: field.quantity(),
                    first: echo(first_name),
                    second: echo(name),
                },
            ));
        }
        seen.push((field, i, name.to_string()));
    }
    let find = |want: fn(Field) -> bool| {
        seen.iter()
            .find(|(f, _, _)| want(*f))
            .map(|(f, i, _)| (*f, *i))
    };
    let missing = |column: &'static str| {
        InputError::new(
            at(),
            InputErrorKind::MissingColumn {
                column,
                found: echo(&names.join(", ")),
            },
        )
    };
    let date = find(|f| f == Field::Date).ok_or_else(|| missing("date"))?.1;
    let course = find(|f| f == Field::Course)
        .ok_or_else(|| missing("course"))?
        .1;
    let thickness = match find(|f| matches!(f, Field::Thickness(_))) {
        Some((Field::Thickness(s), i)) => (i, s),
        _ => return Err(missing("thickness")),
    };
    let elevation = match find(|f| matches!(f, Field::Elevation(_))) {
        Some((Field::Elevation(s), i)) => Some((i, s)),
        _ => None,
    };
    Ok(Columns {
        date,
        course,
        thickness,
        point: find(|f| f == Field::Point).map(|x| x.1),
        elevation,
        azimuth: find(|f| f == Field::Azimuth).map(|x| x.1),
        note: find(|f| f == Field::Note).map(|x| x.1),
        names,
        unnamed,
    })
}

struct RowParser<'a> {
    path: &'a str,
    ctx: &'a SurveyContext,
    cols: &'a Columns,
    delimiter: u8,
    /// The last date text and its value: survey files repeat one date many times.
    date_cache: Option<(Vec<u8>, NaiveDate)>,
}

impl RowParser<'_> {
    fn at(&self, line: u64) -> Location {
        Location::line(self.path, line)
    }

    fn text<'r>(
        &self,
        record: &'r csv::ByteRecord,
        i: usize,
        line: u64,
    ) -> Result<&'r str, InputError> {
        let raw = record.get(i).unwrap_or(&[]);
        std::str::from_utf8(raw).map_err(|_| {
            InputError::new(
                self.at(line),
                InputErrorKind::NotUtf8 {
                    column: Some(self.cols.names[i].clone()),
                    byte: None,
                },
            )
        })
    }

    fn bad(
        &self,
        line: u64,
        i: usize,
        value: &str,
        what: &'static str,
        expected: String,
    ) -> InputError {
        InputError::new(
            self.at(line),
            InputErrorKind::BadValue {
                column: self.cols.names[i].clone(),
                value: echo(value),
                what,
                expected,
            },
        )
    }

    fn range(&self, line: u64, i: usize, value: String, problem: String) -> InputError {
        InputError::new(
            self.at(line),
            InputErrorKind::OutOfRange {
                column: self.cols.names[i].clone(),
                // Numbers and dates as shown; a text value comes quoted and echoed.
                value,
                problem,
            },
        )
    }

    fn empty(&self, line: u64, i: usize, expected: String) -> InputError {
        InputError::new(
            self.at(line),
            InputErrorKind::EmptyValue {
                column: self.cols.names[i].clone(),
                expected,
            },
        )
    }

    /// A finite number; decimal comma accepted when the delimiter is `;` or tab.
    fn number(
        &self,
        record: &csv::ByteRecord,
        i: usize,
        line: u64,
        expected: &str,
    ) -> Result<Option<f64>, InputError> {
        let s = self.text(record, i, line)?;
        if s.is_empty() {
            return Ok(None);
        }
        let parsed = if s.contains(',') {
            if self.delimiter == b',' {
                return Err(self.bad(
                    line,
                    i,
                    s,
                    "a number",
                    format!("{expected}; a decimal comma is accepted only in files delimited by ; or tab"),
                ));
            }
            if s.contains('.') || s.matches(',').count() > 1 {
                None
            } else {
                s.replace(',', ".").parse::<f64>().ok()
            }
        } else {
            s.parse::<f64>().ok()
        };
        match parsed {
            Some(v) if v.is_finite() => Ok(Some(v)),
            Some(_) => Err(self.bad(line, i, s, "a finite number", expected.to_string())),
            None => Err(self.bad(line, i, s, "a number", expected.to_string())),
        }
    }

    fn parse(
        &mut self,
        record: &csv::ByteRecord,
        line: u64,
        file_index: u32,
    ) -> Result<Reading, InputError> {
        let ctx = self.ctx;
        let cols = self.cols;
        let date = self.date(record, line)?;

        // course
        let ci = cols.course;
        let course_text = self.text(record, ci, line)?;
        if course_text.is_empty() {
            return Err(self.empty(line, ci, "a course number (1 = bottom course)".into()));
        }
        let course: u32 = course_text.parse().map_err(|_| {
            self.bad(
                line,
                ci,
                course_text,
                "a course number",
                "a whole number, 1 = bottom course".into(),
            )
        })?;
        let n_courses = ctx.nominal.len() as u32;
        if course == 0 || (n_courses > 0 && course > n_courses) {
            let problem = if n_courses > 0 {
                format!(
                    "is not a course of this tank, expected 1 to {n_courses} (1 = bottom course)"
                )
            } else {
                "is not a course number, expected 1 or more (1 = bottom course)".into()
            };
            return Err(self.range(line, ci, course.to_string(), problem));
        }

        // thickness
        let (ti, suffix) = cols.thickness;
        let unit_name = suffix_unit(suffix, ctx.units, true);
        let expected = format!(
            "a thickness in {unit_name}, e.g. {}",
            example_thickness(unit_name)
        );
        let raw = self
            .number(record, ti, line, &expected)?
            .ok_or_else(|| self.empty(line, ti, expected.clone()))?;
        if raw <= 0.0 {
            return Err(self.range(
                line,
                ti,
                format!("{} {unit_name}", number_text(raw)),
                format!("is not positive, expected {expected}"),
            ));
        }
        let thickness = convert_thickness(raw, suffix, ctx.units);
        if let (Some(units), Some(nominal)) = (ctx.units, ctx.nominal.get(course as usize - 1))
            && thickness.0 > UNIT_MISTAKE_FACTOR * nominal.0
        {
            return Err(self.range(
                line,
                ti,
                format!("{} {unit_name}", number_text(raw)),
                format!(
                    "is more than 3 x the nominal {} of course {course}: a unit mistake? {}",
                    Shown::thickness(*nominal, units),
                    match suffix {
                        Suffix::None =>
                            "name the column thickness_mm or thickness_in to say the unit",
                        _ => "the column name gives the unit: are the readings in another one?",
                    }
                ),
            ));
        }

        // optional columns
        let point = match cols.point {
            Some(i) => {
                let p = self.text(record, i, line)?;
                if p.chars().count() > MAX_POINT_CHARS {
                    return Err(self.range(
                        line,
                        i,
                        format!("\"{}\"", echo(p)),
                        format!(
                            "is too long for a point id, expected at most {MAX_POINT_CHARS} \
                             characters (e.g. \"D5-C1-L\")"
                        ),
                    ));
                }
                Some(p).filter(|s| !s.is_empty()).map(Box::from)
            }
            None => None,
        };
        let elevation = match cols.elevation {
            Some((i, suffix)) => {
                let unit_name = suffix_unit(suffix, ctx.units, false);
                let expected = format!("a height above the tank bottom in {unit_name}");
                match self.number(record, i, line, &expected)? {
                    None => None,
                    Some(v) if v < 0.0 => {
                        return Err(self.range(
                            line,
                            i,
                            format!("{} {unit_name}", number_text(v)),
                            format!("is negative, expected {expected}"),
                        ));
                    }
                    Some(v) => {
                        let e = convert_length(v, suffix, ctx.units);
                        if let (Some(units), Some(shell)) = (ctx.units, ctx.shell_height)
                            && e.0 > shell.0 * 1.0001
                        {
                            let lu = units.length_unit();
                            return Err(self.range(
                                line,
                                i,
                                format!("{} {unit_name}", number_text(v)),
                                format!(
                                    "is above the shell height {} {lu}: a unit mistake? {}",
                                    number_text(shell.0),
                                    match suffix {
                                        Suffix::None => {
                                            "name the column elevation_m or elevation_ft to \
                                             say the unit"
                                        }
                                        _ => {
                                            "the column name gives the unit: are the values \
                                             in another one?"
                                        }
                                    }
                                ),
                            ));
                        }
                        Some(e)
                    }
                }
            }
            None => None,
        };
        let azimuth = match cols.azimuth {
            Some(i) => match self.number(record, i, line, "degrees from 0 to 360")? {
                None => None,
                Some(a) if (0.0..=360.0).contains(&a) => Some(a),
                Some(a) => {
                    return Err(self.range(
                        line,
                        i,
                        number_text(a),
                        "is outside 0 to 360 degrees".into(),
                    ));
                }
            },
            None => None,
        };
        let note = match cols.note {
            Some(i) => Some(self.text(record, i, line)?)
                .filter(|s| !s.is_empty())
                .map(Box::from),
            None => None,
        };
        Ok(Reading {
            date,
            course,
            thickness,
            point,
            elevation,
            azimuth,
            note,
            origin: Origin {
                file: file_index,
                line,
            },
        })
    }

    fn date(&mut self, record: &csv::ByteRecord, line: u64) -> Result<NaiveDate, InputError> {
        let i = self.cols.date;
        let raw = record.get(i).unwrap_or(&[]);
        if let Some((text, date)) = &self.date_cache
            && text.as_slice() == raw
        {
            return Ok(*date);
        }
        let s = self.text(record, i, line)?;
        if s.is_empty() {
            return Err(self.empty(line, i, "a date as YYYY-MM-DD".into()));
        }
        let iso_shape = s.len() == 10
            && s.bytes().enumerate().all(|(k, b)| {
                if k == 4 || k == 7 {
                    b == b'-'
                } else {
                    b.is_ascii_digit()
                }
            });
        if !iso_shape {
            return Err(self.bad(
                line,
                i,
                s,
                "an ISO date",
                "YYYY-MM-DD, e.g. 2024-05-17".into(),
            ));
        }
        let date = NaiveDate::parse_from_str(s, "%Y-%m-%d").map_err(|_| {
            self.bad(
                line,
                i,
                s,
                "a calendar date",
                "a day that exists, as YYYY-MM-DD".into(),
            )
        })?;
        if date > self.ctx.today {
            return Err(self.range(
                line,
                i,
                s.to_string(),
                format!(
                    "is after today ({}), expected the date the survey was made",
                    self.ctx.today
                ),
            ));
        }
        if date.year() < EARLIEST_SURVEY_YEAR {
            return Err(self.range(
                line,
                i,
                s.to_string(),
                format!(
                    "is before {EARLIEST_SURVEY_YEAR}: no thickness survey is that old; a \
                     typing slip? expected the date the survey was made"
                ),
            ));
        }
        if let Some(since) = self.ctx.in_service_since
            && date < since
        {
            return Err(self.range(
                line,
                i,
                s.to_string(),
                format!(
                    "is before the tank went into service ({since}, in_service_since in tank.toml)"
                ),
            ));
        }
        self.date_cache = Some((raw.to_vec(), date));
        Ok(date)
    }
}

fn suffix_unit(suffix: Suffix, units: Option<UnitSystem>, thickness: bool) -> &'static str {
    let system = match suffix {
        Suffix::Si => Some(UnitSystem::Si),
        Suffix::Usc => Some(UnitSystem::Usc),
        Suffix::None => units,
    };
    match (system, thickness) {
        (Some(s), true) => s.thickness_unit(),
        (Some(s), false) => s.length_unit(),
        (None, true) => "the tank's thickness unit",
        (None, false) => "the tank's length unit",
    }
}

fn example_thickness(unit: &str) -> &'static str {
    if unit == "in" { "0.375" } else { "12.40" }
}

fn suffix_system(suffix: Suffix) -> Option<UnitSystem> {
    match suffix {
        Suffix::Si => Some(UnitSystem::Si),
        Suffix::Usc => Some(UnitSystem::Usc),
        Suffix::None => None,
    }
}

fn convert_thickness(v: f64, suffix: Suffix, units: Option<UnitSystem>) -> Thickness {
    match (suffix_system(suffix), units) {
        (Some(from), Some(to)) => Thickness(v).convert(from, to),
        _ => Thickness(v),
    }
}

fn convert_length(v: f64, suffix: Suffix, units: Option<UnitSystem>) -> Length {
    match (suffix_system(suffix), units) {
        (Some(from), Some(to)) => Length(v).convert(from, to),
        _ => Length(v),
    }
}
