//! Reads survey CSV files (formats.md "Survey CSV") row by row into readings.
//!
//! - Header row required; names are case-insensitive; unknown and repeated names are
//!   refused (with the nearest known name suggested).
//! - `,` `;` and tab delimiters are detected from the header line; with `;` or tab a
//!   decimal comma is accepted. A UTF-8 byte-order mark and CRLF line ends are
//!   tolerated; lines starting with `#` are comments; blank lines and rows of empty
//!   fields (",,," from a spreadsheet) hold no reading and are skipped.
//! - The whole file must be UTF-8 (checked as it is read, the first line before the
//!   header is read and each buffer before its rows, so the message gives the line and
//!   column of the first bad byte). A value with a line break in it is refused: in a
//!   survey it is a quote left open, which would swallow the rows after it.
//! - A header column without a name is allowed while its cells are empty.
//! - Unit-suffixed columns (`thickness_mm`, `thickness_in`, `elevation_m`,
//!   `elevation_ft`) are converted to the tank's units.
//! - Every row is either handed on or refused with its line, column and value; values
//!   echoed in messages are shortened and escaped ([`echo`]).
//!
//! csv-core, the csv crate's parser, splits the rows (through `input::records`); this
//! module only decides what each field means.
//!
//! Streaming: the file is read through a buffer and each row is parsed in place
//! (fields stay in the record reader's buffers, nothing is allocated per row) and
//! handed to a [`ReadingSink`] at once; memory does not grow with the number of rows.

use std::cell::RefCell;
use std::io::Read;

use chrono::{Datelike, NaiveDate};

use super::error::{InputError, InputErrorKind, Location, echo, nearest, number_text};
use super::limits::{ALL_THIN_FACTOR, EARLIEST_SURVEY_YEAR, MAX_POINT_CHARS};
use super::records::{Record, Records, bad_byte_of};
use crate::calc::constants::UNIT_MISTAKE_FACTOR;
use crate::calc::units::{Length, Thickness, UnitSystem};
use crate::model::reading::{
    Origin, PointKey, PointNames, PointRef, ReadingRef, ReadingSink, same_bytes,
};
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

impl Columns {
    /// Per column, the slot of its text in [`RowParser::quick`].
    fn roles(&self) -> Vec<Option<u8>> {
        let mut roles = vec![None; self.names.len()];
        let mut put = |column: Option<usize>, slot: u8| {
            if let Some(role) = column.and_then(|c| roles.get_mut(c)) {
                *role = Some(slot);
            }
        };
        put(Some(self.date), 0);
        put(Some(self.course), 1);
        put(Some(self.thickness.0), 2);
        put(self.point, 3);
        put(self.elevation.map(|e| e.0), 4);
        put(self.azimuth, 5);
        put(self.note, 6);
        roles
    }
}

pub use super::records::BOM;

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

/// Exact powers of ten as f64 (every one up to 1e22 is representable).
const POW10: [f64; 23] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16,
    1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

/// A plain decimal (`-?digits[.digits]`, at most 15 digits) read without the general
/// parser: the digits as an integer m (exact, m < 2^53) divided by 10^k (exact,
/// k <= 22) is one correctly rounded IEEE division, which is the fast path of
/// Clinger's algorithm that Rust's own parser takes for such text: the same bits
/// (checked against `str::parse` in the tests below). None for any other text.
#[inline(always)]
fn plain_decimal(b: &[u8]) -> Option<f64> {
    let (negative, digits) = match b.split_first() {
        Some((b'-', rest)) => (true, rest),
        _ => (false, b),
    };
    // At most 15 digits and one point: anything longer is left to the general parser
    // (and the mantissa below cannot overflow: at most 16 digits are ever taken).
    if digits.len() > 16 {
        return None;
    }
    // The whole part, then the fraction after a point (each digit as it comes).
    let n = digits.len();
    let mut mantissa: u64 = 0;
    let mut i = 0;
    while i < n {
        let d = digits[i].wrapping_sub(b'0');
        if d >= 10 {
            break;
        }
        mantissa = mantissa * 10 + u64::from(d);
        i += 1;
    }
    let point = i < n;
    let k = if point {
        if digits[i] != b'.' {
            return None;
        }
        i += 1;
        let first = i;
        while i < n {
            let d = digits[i].wrapping_sub(b'0');
            if d >= 10 {
                return None;
            }
            mantissa = mantissa * 10 + u64::from(d);
            i += 1;
        }
        n - first
    } else {
        0
    };
    let count = n - usize::from(point);
    if count == 0 || count > 15 {
        return None;
    }
    // (mantissa < 10^15 < 2^53: exact as i64 and as f64.)
    // (A whole number needs no division: x / 1 is x.)
    let v = if k == 0 {
        mantissa as i64 as f64
    } else {
        mantissa as i64 as f64 / POW10[k]
    };
    Some(if negative { -v } else { v })
}

/// A field of a record without surrounding ASCII white space (the csv crate's
/// `Trim::All` does the same, but copies every record to do it).
#[inline]
fn field(record: &Record, i: usize) -> &[u8] {
    record.get(i).unwrap_or(&[]).trim_ascii()
}

/// A field without surrounding ASCII white space: the first and last bytes are looked
/// at, and only a field that has some is trimmed.
#[inline]
fn trimmed(f: &[u8]) -> &[u8] {
    match (f.first(), f.last()) {
        (Some(a), Some(z)) if !a.is_ascii_whitespace() && !z.is_ascii_whitespace() => f,
        _ => f.trim_ascii(),
    }
}

/// How many fields of a row [`Row`] splits at once (a file uses at most seven known
/// columns, so only a file with unnamed columns among them has fields past these).
const ROW_FIELDS: usize = 8;

/// The fields of one record, split and trimmed in one pass (as [`field`] would give
/// them one by one).
struct Row<'r> {
    record: &'r Record,
    fields: [&'r [u8]; ROW_FIELDS],
}

impl<'r> Row<'r> {
    #[inline]
    fn new(record: &'r Record) -> Self {
        let mut fields: [&[u8]; ROW_FIELDS] = [&[]; ROW_FIELDS];
        for (slot, f) in fields.iter_mut().zip(record.iter()) {
            *slot = trimmed(f);
        }
        Row { record, fields }
    }
    /// Field `i`, trimmed; empty when the record has no such field.
    #[inline(always)]
    fn get(&self, i: usize) -> &'r [u8] {
        match self.fields.get(i) {
            Some(f) => f,
            None => field(self.record, i),
        }
    }
}

thread_local! {
    /// The record reader of this thread, kept for the next file (its buffer and
    /// parsers are made once).
    static RECORDS: RefCell<Option<Records>> = const { RefCell::new(None) };
}

/// Runs `f` with this thread's record reader (or a new one when it is in use).
fn with_records<T>(f: impl FnOnce(&mut Records) -> T) -> T {
    let mut records = RECORDS.with(|r| r.borrow_mut().take()).unwrap_or_default();
    let out = f(&mut records);
    // Let go of the file now; keep the reader.
    records.release();
    RECORDS.with(|r| *r.borrow_mut() = Some(records));
    out
}

/// Reads one survey file from `input`, handing each reading to `sink` as soon as its
/// row is parsed, with `file_index` as its origin. Point ids get their keys from
/// `points` (one interner per tank). Returns what was found.
pub fn read_survey<R: Read + 'static>(
    path: &str,
    input: R,
    file_index: u32,
    ctx: &SurveyContext,
    points: &mut PointNames,
    sink: &mut impl ReadingSink,
) -> Result<SurveyFileInfo, InputError> {
    with_records(|reader| {
        let head = reader
            .open(Box::new(input))
            .map_err(|e| match bad_byte_of(&e) {
                Some(_) => read_error(path, e),
                None => InputError::new(Location::file(path), InputErrorKind::Io(e)),
            })?;
        let delimiter = detect_delimiter(head);
        reader.records(delimiter);
        read_rows(path, reader, delimiter, file_index, ctx, points, sink)
    })
}

fn read_rows(
    path: &str,
    reader: &mut Records,
    delimiter: u8,
    file_index: u32,
    ctx: &SurveyContext,
    points: &mut PointNames,
    sink: &mut impl ReadingSink,
) -> Result<SurveyFileInfo, InputError> {
    let mut record = Record::default();
    let at = |line: u64| Location::line(path, line);
    let read = |reader: &mut Records, record: &mut Record| {
        next_record(reader, record).map_err(|e| read_error(path, e))
    };
    if !read(reader, &mut record)? {
        return Err(InputError::new(at(1), InputErrorKind::EmptyFile));
    }
    let header_line = record.line();
    single_lines(path, header_line, &record, None)?;
    let cols = header(path, header_line, &record)?;
    let mut row_parser = RowParser {
        path,
        ctx,
        cols: &cols,
        delimiter,
        date_cache: None,
        elevation_cache: TextCache::default(),
        roles: cols.roles(),
    };
    let mut rows = 0usize;
    let mut thin = ThinCheck::default();
    while read(reader, &mut record)? {
        let line = record.line();
        // The common row at once; anything else checked step by step, each problem
        // with its message.
        let reading = match row_parser.quick(&record, points) {
            Some(q) => row_parser.reading(q, line, file_index, points),
            None => {
                whole_row_checks(path, line, &record, &cols, delimiter)?;
                row_parser.full(&Row::new(&record), line, file_index, points)?
            }
        };
        thin.see(ctx, &reading);
        sink.accept(&reading);
        rows += 1;
    }
    if rows == 0 {
        return Err(InputError::new(at(header_line), InputErrorKind::HeaderOnly));
    }
    thin.check(path, ctx, cols.thickness.1)?;
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

/// The next record that holds something, or false at the end of the file. A row of
/// empty fields (a blank line, or ",,," from a spreadsheet) holds no reading: skipped.
#[inline(always)]
fn next_record(reader: &mut Records, record: &mut Record) -> std::io::Result<bool> {
    loop {
        let more = reader.read(record)?;
        // (Every field empty after trimming <=> every byte of the record is white
        // space: one pass over the record's bytes.)
        if !more || !record.as_slice().iter().all(u8::is_ascii_whitespace) {
            return Ok(more);
        }
    }
}

/// The message for a record that could not be read (the file could not be read, or
/// held a byte that is not UTF-8).
#[cold]
fn read_error(path: &str, e: std::io::Error) -> InputError {
    if let Some(bad) = bad_byte_of(&e) {
        return InputError::new(
            Location {
                path: path.to_string(),
                line: Some(bad.line),
                column: Some(bad.column),
            },
            InputErrorKind::NotUtf8 {
                column: None,
                byte: Some(bad.byte),
            },
        );
    }
    // (Where in the file a read failed is not known: its first line, as the csv
    // crate gave it.)
    InputError::new(
        Location::line(path, 1),
        InputErrorKind::Io(std::io::Error::other(e.to_string())),
    )
}

/// The checks of a row as a whole, before its fields are read: no line break in a
/// value, as many fields as the header names, nothing under an unnamed column.
fn whole_row_checks(
    path: &str,
    line: u64,
    record: &Record,
    cols: &Columns,
    delimiter: u8,
) -> Result<(), InputError> {
    let at = |line: u64| Location::line(path, line);
    single_lines(path, line, record, Some(&cols.names))?;
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
        let value = field(record, i);
        if !value.is_empty() {
            return Err(InputError::new(
                at(line),
                InputErrorKind::UnnamedColumn {
                    position: i + 1,
                    value: echo(&String::from_utf8_lossy(value)),
                },
            ));
        }
    }
    Ok(())
}

/// Watches whether every reading of a file is under [`ALL_THIN_FACTOR`] of its
/// course's nominal thickness: inches read as mm give about 1/25 of nominal, while no
/// real survey finds a whole shell worn to a fifth of its plate. Kept while the rows
/// stream past: the first reading and whether all so far were that thin.
#[derive(Debug, Default)]
struct ThinCheck {
    count: usize,
    all_thin: bool,
    first: Option<(Origin, u32, Thickness)>,
}

impl ThinCheck {
    #[inline]
    fn see(&mut self, ctx: &SurveyContext, r: &ReadingRef<'_>) {
        self.count += 1;
        // (Once one reading is not that thin, the file is not all thin.)
        if self.count > 1 && !self.all_thin {
            return;
        }
        let thin = ctx
            .nominal
            .get((r.course as usize).wrapping_sub(1))
            .is_some_and(|n| r.thickness.0 < ALL_THIN_FACTOR * n.0);
        if self.count == 1 {
            self.all_thin = thin;
            self.first = Some((r.origin, r.course, r.thickness));
        } else {
            self.all_thin &= thin;
        }
    }

    fn check(&self, path: &str, ctx: &SurveyContext, suffix: Suffix) -> Result<(), InputError> {
        let (Some(units), Some((origin, course, thickness))) = (ctx.units, self.first) else {
            return Ok(());
        };
        if !self.all_thin {
            return Ok(());
        }
        let nominal = ctx
            .nominal
            .get((course as usize).wrapping_sub(1))
            .copied()
            .unwrap_or(Thickness(f64::NAN));
        Err(InputError::new(
            Location::line(path, origin.line),
            InputErrorKind::AllThin {
                count: self.count,
                // As written in the file, and in the tank's unit when the column names
                // another.
                first: match suffix_system(suffix) {
                    Some(file_units) if file_units != units => format!(
                        "{} {} ({})",
                        number_text(thickness.convert(units, file_units).0),
                        file_units.thickness_unit(),
                        Shown::thickness(thickness, units).significant()
                    ),
                    _ => format!("{} {}", number_text(thickness.0), units.thickness_unit()),
                },
                nominal: Shown::thickness(nominal, units).to_string(),
                course,
                hint: match suffix {
                    Suffix::None => "name the column thickness_in or thickness_mm to say the unit",
                    _ => "the column name gives the unit: are the readings in another one?",
                },
            },
        ))
    }
}

/// True when `bytes` holds a byte below 0x0E (tab, line feed, carriage return and
/// the control characters before them), looked at eight (or four) bytes at a time: for a word x,
/// (x - 0x0E0E..) & !x & 0x8080.. is non-zero exactly when a byte of x is below 0x0E
/// ("hasless(x, n)", S. E. Anderson, Bit Twiddling Hacks, for n <= 128).
#[inline]
fn has_control_byte(bytes: &[u8]) -> bool {
    const LOW: u64 = u64::from_ne_bytes([0x0E; 8]);
    const HIGH: u64 = u64::from_ne_bytes([0x80; 8]);
    let test = |x: &[u8; 8]| {
        let x = u64::from_ne_bytes(*x);
        x.wrapping_sub(LOW) & !x & HIGH
    };
    let Some(last) = bytes.last_chunk::<8>() else {
        // (Four to seven bytes: the first four and the last four, as two words.)
        return match (bytes.first_chunk::<4>(), bytes.last_chunk::<4>()) {
            (Some(a), Some(z)) => {
                const LOW4: u32 = u32::from_ne_bytes([0x0E; 4]);
                const HIGH4: u32 = u32::from_ne_bytes([0x80; 4]);
                let test4 = |x: &[u8; 4]| {
                    let x = u32::from_ne_bytes(*x);
                    x.wrapping_sub(LOW4) & !x & HIGH4
                };
                test4(a) | test4(z) != 0
            }
            _ => bytes.iter().any(|&b| b < 0x0E),
        };
    };
    // Whole words, then the last eight bytes (overlapping the words when the length is
    // not a multiple of eight).
    let (words, _) = bytes.as_chunks::<8>();
    words.iter().fold(test(last), |hit, w| hit | test(w)) != 0
}

/// True when `text` has white space at either end.
#[inline]
fn padded(text: &[u8]) -> bool {
    text.first().is_some_and(u8::is_ascii_whitespace)
        || text.last().is_some_and(u8::is_ascii_whitespace)
}

/// Refuses a record with a line break inside a value: in a survey file that is a quote
/// left open, and the rows it swallowed would be lost without a word.
#[inline]
fn single_lines(
    path: &str,
    line: u64,
    record: &Record,
    names: Option<&[String]>,
) -> Result<(), InputError> {
    // Nearly every record has no control character at all, so no line break: one
    // pass over its bytes (the fields one after the other, eight at a time) settles
    // it; only a record with one is looked at field by field.
    if has_control_byte(record.as_slice()) {
        line_breaks(path, line, record, names)
    } else {
        Ok(())
    }
}

/// [`single_lines`] field by field.
#[cold]
#[inline(never)]
fn line_breaks(
    path: &str,
    line: u64,
    record: &Record,
    names: Option<&[String]>,
) -> Result<(), InputError> {
    for (i, field) in record.iter().enumerate() {
        let field = field.trim_ascii();
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

fn header(path: &str, line: u64, record: &Record) -> Result<Columns, InputError> {
    let at = || Location::line(path, line);
    // (Each known column with its place; its name is names[place].)
    let mut seen: Vec<(Field, usize)> = Vec::with_capacity(record.len());
    let mut names = Vec::with_capacity(record.len());
    let mut unnamed = Vec::new();
    for (i, raw) in record.iter().enumerate() {
        let name = std::str::from_utf8(raw.trim_ascii()).map_err(|_| {
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
        let lower: std::borrow::Cow<str> = if name.bytes().any(|b| b.is_ascii_uppercase()) {
            name.to_ascii_lowercase().into()
        } else {
            name.into()
        };
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
        if let Some(&(_, first)) = seen.iter().find(|(f, _)| *f == field) {
            return Err(InputError::new(
                at(),
                InputErrorKind::DuplicateColumn {
                    column: echo(&names[first]),
                    first: first + 1,
                    second: i + 1,
                },
            ));
        }
        if let Some(&(_, first)) = seen.iter().find(|(f, _)| f.quantity() == field.quantity()) {
            return Err(InputError::new(
                at(),
                InputErrorKind::MixedUnits {
                    quantity: field.quantity(),
                    first: echo(&names[first]),
                    second: echo(name),
                },
            ));
        }
        seen.push((field, i));
    }
    let find = |want: fn(Field) -> bool| seen.iter().find(|(f, _)| want(*f)).copied();
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

/// How the text of a field reads as a number.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum NumberText {
    /// Nothing there.
    Empty,
    /// A finite number.
    Value(f64),
    /// A number that is not finite (NaN, inf).
    NotFinite,
    /// Not a number.
    NotANumber,
    /// A decimal comma in a comma-delimited file.
    CommaNeedsSemicolon,
}

/// What to add to "expected ..." after [`NumberText::CommaNeedsSemicolon`].
pub const COMMA_HINT: &str = "; a decimal comma is accepted only in files delimited by ; or tab";

/// Reads `s` as a number; a decimal comma is accepted when the file's `delimiter` is
/// `;` or tab (one comma, no point).
pub fn read_number(s: &str, delimiter: u8) -> NumberText {
    if s.is_empty() {
        return NumberText::Empty;
    }
    let parsed = if s.contains(',') {
        if delimiter == b',' {
            return NumberText::CommaNeedsSemicolon;
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
        Some(v) if v.is_finite() => NumberText::Value(v),
        Some(_) => NumberText::NotFinite,
        None => NumberText::NotANumber,
    }
}

/// A short text (at most 16 bytes) and the value it was read as.
#[derive(Debug, Default)]
struct TextCache<T> {
    text: [u8; 16],
    /// Bytes of `text` in use; 0 when nothing is kept.
    len: usize,
    value: T,
}

impl<T: Copy> TextCache<T> {
    /// True when `text` is the text kept.
    #[inline(always)]
    fn holds(&self, text: &[u8]) -> bool {
        self.len > 0 && text.len() == self.len && same_bytes(&self.text[..self.len], text)
    }
    /// Keeps `text` (when short enough) with `value`.
    #[inline]
    fn keep(&mut self, text: &[u8], value: T) {
        match self.text.get_mut(..text.len()) {
            Some(slot) if !text.is_empty() => {
                slot.copy_from_slice(text);
                self.len = text.len();
                self.value = value;
            }
            _ => self.len = 0,
        }
    }
}

/// The fields of a row read by [`RowParser::quick`].
struct QuickRow<'r> {
    date: NaiveDate,
    course: u32,
    thickness: Thickness,
    point: Option<PointKey>,
    elevation: Option<Length>,
    azimuth: Option<f64>,
    note: Option<&'r str>,
}

struct RowParser<'a> {
    path: &'a str,
    ctx: &'a SurveyContext,
    cols: &'a Columns,
    delimiter: u8,
    /// The last date text and its value: survey files repeat one date many times.
    /// (Every valid date text is ten bytes, YYYY-MM-DD: kept as an array, compared
    /// without a call.)
    date_cache: Option<([u8; 10], NaiveDate)>,
    /// The last elevation text [`Self::quick`] read, and its value.
    elevation_cache: TextCache<Length>,
    /// Per column, where [`Self::quick`] puts its text: 0 date, 1 course, 2 thickness,
    /// 3 point, 4 elevation, 5 azimuth, 6 note; None for an unnamed column.
    roles: Vec<Option<u8>>,
}

impl RowParser<'_> {
    fn at(&self, line: u64) -> Location {
        Location::line(self.path, line)
    }

    fn text<'r>(&self, row: &Row<'r>, i: usize, line: u64) -> Result<&'r str, InputError> {
        std::str::from_utf8(row.get(i)).map_err(|_| {
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
    /// `expected` describes the value for messages (made only when one is needed).
    #[inline(always)]
    fn number(
        &self,
        row: &Row<'_>,
        i: usize,
        line: u64,
        expected: &dyn Fn() -> String,
    ) -> Result<Option<f64>, InputError> {
        let raw = row.get(i);
        if raw.is_empty() {
            return Ok(None);
        }
        // Fast path for plain decimals; anything else (exponents, decimal comma,
        // errors) takes the path below with its messages.
        if let Some(v) = plain_decimal(raw) {
            return Ok(Some(v));
        }
        self.general_number(row, i, line, expected)
    }

    /// [`Self::number`] for text that is not a plain decimal.
    #[cold]
    #[inline(never)]
    fn general_number(
        &self,
        row: &Row<'_>,
        i: usize,
        line: u64,
        expected: &dyn Fn() -> String,
    ) -> Result<Option<f64>, InputError> {
        let expected = expected();
        let s = self.text(row, i, line)?;
        match read_number(s, self.delimiter) {
            NumberText::Empty => Ok(None),
            NumberText::Value(v) => Ok(Some(v)),
            NumberText::NotFinite => {
                Err(self.bad(line, i, s, "a finite number", expected.to_string()))
            }
            NumberText::NotANumber => Err(self.bad(line, i, s, "a number", expected.to_string())),
            NumberText::CommaNeedsSemicolon => {
                Err(self.bad(line, i, s, "a number", format!("{expected}{COMMA_HINT}")))
            }
        }
    }

    /// The reading of a row [`Self::quick`] took.
    #[inline(always)]
    fn reading<'r>(
        &self,
        q: QuickRow<'r>,
        line: u64,
        file_index: u32,
        points: &'r PointNames,
    ) -> ReadingRef<'r> {
        ReadingRef {
            date: q.date,
            course: q.course,
            thickness: q.thickness,
            // (A key just given out always has its text.)
            point: q.point.and_then(|key| {
                Some(PointRef {
                    key,
                    id: points.name(key)?,
                })
            }),
            elevation: q.elevation,
            azimuth: q.azimuth,
            note: q.note,
            origin: Origin {
                file: file_index,
                line,
            },
        }
    }

    /// The common row, read with no message at hand: as many fields as the header
    /// names, nothing under an unnamed column, every value in its plain form (the date
    /// as the row before, one or two digits for the course, plain decimals, a point id
    /// no longer than allowed and a note, neither with white space around it nor a
    /// byte below 0x0E, a line break among them, in it) and within its bounds. None for anything else, which the
    /// whole-row checks and [`Self::full`] then read, with their messages: the two
    /// agree on every row this accepts (the same conversions, the same checks). The
    /// point is looked up last, so a row this leaves has given no point a key; the
    /// only thing kept from such a row is its elevation, read and checked in full,
    /// for the next row.
    #[inline(always)]
    fn quick<'r>(&mut self, record: &'r Record, points: &mut PointNames) -> Option<QuickRow<'r>> {
        let ctx = self.ctx;
        let cols = self.cols;
        // The fields, taken in one pass over the record by what their column holds.
        if record.len() != self.roles.len() {
            return None;
        }
        let mut text: [&[u8]; 7] = [&[]; 7];
        // (White space around a value is left to the full reader: the date, course and
        // numbers below take none, and the point and note are looked at for it.)
        let (bytes, ends) = record.parts();
        let mut start = 0;
        for (&end, role) in ends.iter().zip(&self.roles) {
            let field = bytes.get(start..end)?;
            start = end;
            match role {
                Some(slot) => text[*slot as usize] = field,
                None if field.is_empty() => {}
                None => return None,
            }
        }
        let [
            date_text,
            course_text,
            thickness_text,
            point_text,
            elevation_text,
            azimuth_text,
            note_text,
        ] = text;
        let date = match &self.date_cache {
            // (Compared as arrays: no call.)
            Some((cached, date))
                if date_text.len() == 10 && date_text.first_chunk() == Some(cached) =>
            {
                *date
            }
            _ => return None,
        };
        let course: u32 = match course_text {
            [d @ b'1'..=b'9'] => u32::from(d - b'0'),
            [a @ b'1'..=b'9', b @ b'0'..=b'9'] => u32::from(a - b'0') * 10 + u32::from(b - b'0'),
            _ => return None,
        };
        let n_courses = ctx.nominal.len() as u32;
        if n_courses > 0 && course > n_courses {
            return None;
        }
        let raw = plain_decimal(thickness_text)?;
        if raw <= 0.0 {
            return None;
        }
        let thickness = convert_thickness(raw, cols.thickness.1, ctx.units);
        if let (Some(_), Some(nominal)) = (ctx.units, ctx.nominal.get(course as usize - 1))
            && thickness.0 > UNIT_MISTAKE_FACTOR * nominal.0
        {
            return None;
        }
        let elevation = match cols.elevation {
            Some((_, suffix)) => match elevation_text {
                [] => None,
                // The same text as the row before (drops round the shell share their
                // elevations): its value, read and checked then.
                text if self.elevation_cache.holds(text) => Some(self.elevation_cache.value),
                text => {
                    let v = plain_decimal(text)?;
                    if v < 0.0 {
                        return None;
                    }
                    let e = convert_length(v, suffix, ctx.units);
                    if let (Some(_), Some(shell)) = (ctx.units, ctx.shell_height)
                        && e.0 > shell.0 * 1.0001
                    {
                        return None;
                    }
                    self.elevation_cache.keep(text, e);
                    Some(e)
                }
            },
            None => None,
        };
        let azimuth = match azimuth_text {
            [] => None,
            text => {
                let a = plain_decimal(text)?;
                if !(0.0..=360.0).contains(&a) {
                    return None;
                }
                Some(a)
            }
        };
        // (Every other field is known by now to hold no line break: digits, a point,
        // a minus sign, or the cached date's text.)
        let note = match note_text {
            [] => None,
            text if has_control_byte(text) || padded(text) => return None,
            text => Some(std::str::from_utf8(text).ok()?),
        };
        let point = match point_text {
            [] => None,
            raw if has_control_byte(raw) || padded(raw) => return None,
            // (A text of at most that many bytes has at most that many characters.)
            raw if raw.len() <= MAX_POINT_CHARS => Some(points.key_of_bytes(raw).ok()?),
            _ => return None,
        };
        Some(QuickRow {
            date,
            course,
            thickness,
            point,
            elevation,
            azimuth,
            note,
        })
    }

    fn full<'r>(
        &mut self,
        row: &Row<'r>,
        line: u64,
        file_index: u32,
        points: &'r mut PointNames,
    ) -> Result<ReadingRef<'r>, InputError> {
        let ctx = self.ctx;
        let cols = self.cols;
        let date = self.date(row, line)?;

        // course
        let ci = cols.course;
        // One or two digits without a leading zero read at once; anything else through
        // `str::parse` and its messages.
        let course: u32 = match row.get(ci) {
            [d @ b'1'..=b'9'] => u32::from(d - b'0'),
            [a @ b'1'..=b'9', b @ b'0'..=b'9'] => u32::from(a - b'0') * 10 + u32::from(b - b'0'),
            _ => {
                let course_text = self.text(row, ci, line)?;
                if course_text.is_empty() {
                    return Err(self.empty(line, ci, "a course number (1 = bottom course)".into()));
                }
                course_text.parse().map_err(|_| {
                    self.bad(
                        line,
                        ci,
                        course_text,
                        "a course number",
                        "a whole number, 1 = bottom course".into(),
                    )
                })?
            }
        };
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
        // (The unit's name is only needed for messages.)
        let unit_name = || suffix_unit(suffix, ctx.units, true);
        let expected = || {
            let unit_name = unit_name();
            format!(
                "a thickness in {unit_name}, e.g. {}",
                example_thickness(unit_name)
            )
        };
        let raw = self
            .number(row, ti, line, &expected)?
            .ok_or_else(|| self.empty(line, ti, expected()))?;
        if raw <= 0.0 {
            let expected = expected();
            return Err(self.range(
                line,
                ti,
                format!("{} {}", number_text(raw), unit_name()),
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
                format!("{} {}", number_text(raw), unit_name()),
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
        // The point's key. Its text is taken from the interner at the end: an id seen
        // before is recognised by its bytes, with no UTF-8 check of its own (the text
        // was checked when the id was first seen).
        let point = match cols.point {
            Some(i) => {
                let raw = row.get(i);
                match raw.len() {
                    0 => None,
                    // (A text of at most that many bytes has at most that many characters.)
                    n if n <= MAX_POINT_CHARS
                        && let Ok(key) = points.key_of_bytes(raw) =>
                    {
                        Some(key)
                    }
                    _ => {
                        let p = self.text(row, i, line)?;
                        if p.chars().count() > MAX_POINT_CHARS {
                            return Err(self.range(
                                line,
                                i,
                                format!("\"{}\"", echo(p)),
                                format!(
                                    "is too long for a point id, expected at most \
                                     {MAX_POINT_CHARS} characters (e.g. \"D5-C1-L\")"
                                ),
                            ));
                        }
                        Some(points.key(p))
                    }
                }
            }
            None => None,
        };
        let elevation = match cols.elevation {
            Some((i, suffix)) => {
                let unit_name = || suffix_unit(suffix, ctx.units, false);
                let expected = || format!("a height above the tank bottom in {}", unit_name());
                match self.number(row, i, line, &expected)? {
                    None => None,
                    Some(v) if v < 0.0 => {
                        let expected = expected();
                        return Err(self.range(
                            line,
                            i,
                            format!("{} {}", number_text(v), unit_name()),
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
                                format!("{} {}", number_text(v), unit_name()),
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
            Some(i) => match self.number(row, i, line, &|| "degrees from 0 to 360".to_string())? {
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
            Some(i) if !row.get(i).is_empty() => Some(self.text(row, i, line)?),
            _ => None,
        };
        let points: &'r PointNames = points;
        Ok(ReadingRef {
            date,
            course,
            thickness,
            // (A key just given out always has its text.)
            point: point.and_then(|key| {
                Some(PointRef {
                    key,
                    id: points.name(key)?,
                })
            }),
            elevation,
            azimuth,
            note,
            origin: Origin {
                file: file_index,
                line,
            },
        })
    }

    fn date(&mut self, row: &Row<'_>, line: u64) -> Result<NaiveDate, InputError> {
        let i = self.cols.date;
        let raw = row.get(i);
        if let Some((text, date)) = &self.date_cache
            && raw.len() == 10
            && raw.first_chunk::<10>() == Some(text)
        {
            return Ok(*date);
        }
        let s = self.text(row, i, line)?;
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
        if let Ok(text) = <[u8; 10]>::try_from(raw) {
            self.date_cache = Some((text, date));
        }
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

/// An example reading in `unit`, for messages.
pub fn example_thickness(unit: &str) -> &'static str {
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

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    /// Reference: Rust's own `f64::from_str`. Whatever the fast path reads, the
    /// standard parser reads to the same bits, so taking it changes no value and no
    /// message.
    fn agrees(text: &str) {
        if let Some(v) = super::plain_decimal(text.as_bytes()) {
            let std: f64 = text
                .parse()
                .unwrap_or_else(|_| panic!("fast-float read {text:?}, std refuses it"));
            assert_eq!(v.to_bits(), std.to_bits(), "{text:?}");
        }
    }

    #[test]
    fn fast_numbers_are_std_numbers_on_edge_cases() {
        for t in [
            "0",
            "-0",
            "+1",
            "1.",
            ".5",
            "-.5",
            "1e5",
            "1E-5",
            "1e",
            "e5",
            ".",
            "-",
            "+",
            "1.2.3",
            "1,5",
            "0x10",
            "1_000",
            "inf",
            "-infinity",
            "NaN",
            "1e400",
            "1e-400",
            "00012.50",
            "12.345678901234567890",
            "9007199254740993",
            " 1",
            "1 ",
            // Once found by the proptest below (kept here rather than in a regressions file).
            "20000.000000000000000",
            // Each place of the point, two points, none.
            ".1234567",
            "1.234567",
            "123456.7",
            "1234567.",
            "-9.05",
            "..5",
            "1..",
            "00000000",
        ] {
            agrees(t);
        }
    }

    /// The word-at-a-time test agrees with the plain definition, a byte below 0x0E
    /// anywhere (reference: the byte loop itself).
    fn control_agrees(bytes: &[u8]) {
        assert_eq!(
            super::has_control_byte(bytes),
            bytes.iter().any(|&b| b < 0x0E),
            "{bytes:?}"
        );
    }

    #[test]
    fn control_bytes_on_edge_cases() {
        for b in [
            &b""[..],
            b"\n",
            b"\r",
            b"\t",
            b"2024-01-01D1-C1-L12.40",
            b"2024-01-01D1-C1-L12.4\r",
            b"\x0D\x0E\x0F\x80\xFF\x8D\x8E\x00\x7F",
            b"\x8D\x8D\x8D\x8D\x8D\x8D\x8D\x8D",
            b"\xFF\xFF\xFF\xFF\xFF\xFF\xFF\x0D",
            b"\x0E\x0E\x0E\x0E\x0E\x0E\x0E\x0E",
            b"\x0E\x0E\x0E\x0E\x0E\x0E\x0E\x0D",
            "Tänk 7, Durchmesser 30 m".as_bytes(),
        ] {
            control_agrees(b);
        }
    }

    proptest! {
        #[test]
        fn control_bytes_word_at_a_time(bytes in proptest::collection::vec(any::<u8>(), 0..40)) {
            control_agrees(&bytes);
        }

        #[test]
        fn fast_numbers_are_std_numbers(text in "[-+]?[0-9]{0,20}(\\.[0-9]{0,20})?([eE][-+]?[0-9]{1,3})?") {
            agrees(&text);
        }

        #[test]
        fn fast_numbers_are_std_numbers_on_plain_decimals(text in "-?[0-9]{0,9}\\.?[0-9]{0,9}") {
            agrees(&text);
        }

        #[test]
        fn fast_numbers_are_std_numbers_on_any_text(text in "[-+.,eE0-9a-z ]{0,12}") {
            agrees(&text);
        }
    }
    /// The quick path against the full reader (the reference, which gives every
    /// message): on every row the quick path takes, both give the same reading, bit
    /// for bit, and the same point key. Rows are drawn from field texts that are plain,
    /// padded, out of bounds or in other forms; columns with and without unit
    /// suffixes, for a tank and without one.
    mod quick_agrees_with_full {
        use super::super::*;
        use proptest::prelude::*;

        const FIELDS: [&[&str]; 7] = [
            &["2020-05-01", "2020-05-02", " 2020-05-01", "2020-5-1", ""],
            &["1", "2", "3", "5", "10", "01", "0", " 2", "", "x", "99"],
            &[
                "12.4", "0.5", "0", "-1", "1e1", "12,4", "  9.9", "80", "1.", ".5", "", "0.0001",
            ],
            &[
                "D1-C1-L",
                "D2-C1-M",
                " P",
                "",
                "\u{c9}3",
                "abcdefghijklmnopqrstuvwxyz0123456789abcdefghij",
                "D1\nC2",
                "D1\r",
            ],
            &["0.5", "2.4", "-0.0", "-1", "30", "", "1e0", " 1.2"],
            &["0", "45", "360", "361", "-0", "", "12.5"],
            &["", "tape", "note with text", " x ", "two\nlines", "a\rb"],
        ];

        /// Which of [`FIELDS`] each known column takes its text from.
        const SOURCE: [usize; 11] = [0, 1, 2, 2, 2, 3, 4, 4, 4, 5, 6];

        fn header(suffixed: bool, with: [bool; 4]) -> Vec<&'static str> {
            let thickness = if suffixed {
                "thickness_mm"
            } else {
                "thickness"
            };
            let elevation = if suffixed { "elevation_m" } else { "elevation" };
            let mut names = vec!["date", "course", thickness];
            for (on, name) in with.iter().zip(["point", elevation, "azimuth", "note"]) {
                if *on {
                    names.push(name);
                }
            }
            names
        }

        fn context(for_tank: bool) -> SurveyContext {
            SurveyContext {
                units: for_tank.then_some(UnitSystem::Usc),
                nominal: if for_tank {
                    vec![Thickness(0.5), Thickness(0.375), Thickness(0.25)]
                } else {
                    vec![]
                },
                shell_height: for_tank.then_some(Length(24.0)),
                in_service_since: None,
                today: NaiveDate::from_ymd_opt(2026, 1, 1).unwrap(),
            }
        }

        /// Reads `rows` with both paths; returns how many the quick path took.
        fn compare(ctx: &SurveyContext, names: &[&str], rows: &[Vec<&str>]) -> usize {
            let head = Record::from_fields(names);
            let cols = super::super::header("f.csv", 1, &head).unwrap();
            let mut parser = RowParser {
                path: "f.csv",
                ctx,
                cols: &cols,
                delimiter: b',',
                date_cache: None,
                elevation_cache: TextCache::default(),
                roles: cols.roles(),
            };
            // Both paths start every row from the same interner (the reader stops at
            // the first error, so what an error left behind never matters).
            let mut names = PointNames::default();
            let mut taken = 0;
            for (n, row) in rows.iter().enumerate() {
                let record = Record::from_fields(row);
                // A row with a field too many or too few is never taken.
                let longer = record.with_field(b"");
                assert!(parser.quick(&longer, &mut names.clone()).is_none());
                let shorter = Record::from_fields(&row[1..]);
                assert!(parser.quick(&shorter, &mut names.clone()).is_none());
                let before = names.len();
                let mut quick_names = names.clone();
                let quick = parser.quick(&record, &mut quick_names);
                // The reader checks the row as a whole, then reads its fields.
                let line = n as u64 + 2;
                let full = whole_row_checks("f.csv", line, &record, &cols, b',')
                    .and_then(|()| parser.full(&Row::new(&record), line, 0, &mut names));
                match (quick, full) {
                    (Some(q), Ok(full)) => {
                        taken += 1;
                        assert_eq!(q.date, full.date, "{row:?}");
                        assert_eq!(q.course, full.course, "{row:?}");
                        assert_eq!(q.thickness.0.to_bits(), full.thickness.0.to_bits());
                        let bits = |l: Option<Length>| l.map(|l| l.0.to_bits());
                        assert_eq!(bits(q.elevation), bits(full.elevation), "{row:?}");
                        let bits = |a: Option<f64>| a.map(f64::to_bits);
                        assert_eq!(bits(q.azimuth), bits(full.azimuth), "{row:?}");
                        assert_eq!(q.note, full.note, "{row:?}");
                        assert_eq!(q.point, full.point.map(|p| p.key), "{row:?}");
                        assert_eq!(quick_names.len(), names.len(), "{row:?}");
                    }
                    (Some(_), Err(e)) => panic!("quick took {row:?}, the full reader says {e}"),
                    // Left to the full reader: the quick path gave no point a key.
                    (None, _) => {
                        assert_eq!(quick_names.len(), before, "{row:?}");
                    }
                }
            }
            taken
        }

        /// The plain rows of a survey are taken by the quick path (so the property
        /// below compares something), the first of each date by the full reader.
        #[test]
        fn plain_rows_take_the_quick_path() {
            let names = header(true, [true; 4]);
            let rows: Vec<Vec<&str>> = [
                ["2020-05-01", "1", "12.4", "D1-C1-L", "0.5", "0", ""],
                ["2020-05-01", "2", "9.5", "D2-C1-M", "2.4", "45", "tape"],
                ["2020-05-01", "3", "6.1", "D1-C1-L", "", "360", ""],
            ]
            .iter()
            .map(|r| r.to_vec())
            .collect();
            assert_eq!(compare(&context(true), &names, &rows), 2);
            assert_eq!(compare(&context(false), &names, &rows), 2);
        }

        proptest! {
            #[test]
            fn on_drawn_rows(
                suffixed in any::<bool>(),
                for_tank in any::<bool>(),
                with in any::<[bool; 4]>(),
                picks in proptest::collection::vec(any::<[prop::sample::Index; 7]>(), 1..12),
            ) {
                let names = header(suffixed, with);
                let rows: Vec<Vec<&str>> = picks
                    .iter()
                    .map(|pick| {
                        names
                            .iter()
                            .map(|name| {
                                let k = KNOWN_COLUMNS.iter().position(|c| c == name).unwrap();
                                let source = SOURCE[k];
                                *pick[source].get(FIELDS[source])
                            })
                            .collect()
                    })
                    .collect();
                compare(&context(for_tank), &names, &rows);
            }
        }
    }
}
