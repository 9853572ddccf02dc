//! Input errors: each names the file, the line (and column or key), the bad value and
//! what was expected.

use std::fmt;

/// Where in which file.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Location {
    /// The path as the user gave it (joined with the file's name inside a folder).
    pub path: String,
    /// 1-based line.
    pub line: Option<u64>,
    /// 1-based column (character count), for TOML.
    pub column: Option<u64>,
}

impl Location {
    /// A whole file.
    pub fn file(path: impl Into<String>) -> Self {
        Location {
            path: path.into(),
            line: None,
            column: None,
        }
    }
    /// A line of a file.
    pub fn line(path: impl Into<String>, line: u64) -> Self {
        Location {
            path: path.into(),
            line: Some(line),
            column: None,
        }
    }
    /// The line and column of byte `offset` in `text` (both 1-based).
    pub fn at_offset(path: impl Into<String>, text: &str, offset: usize) -> Self {
        let (line, column) = line_column(text, offset);
        Location {
            path: path.into(),
            line: Some(line),
            column: Some(column),
        }
    }
}

/// 1-based line and column (in characters) of byte `offset` of `text`. The one place
/// where 0-based offsets become 1-based positions.
pub fn line_column(text: &str, offset: usize) -> (u64, u64) {
    let mut end = offset.min(text.len());
    while !text.is_char_boundary(end) {
        end -= 1;
    }
    let before = &text[..end];
    let line = before.matches('\n').count() as u64 + 1;
    let line_start = before.rfind('\n').map_or(0, |i| i + 1);
    let column = before[line_start..].chars().count() as u64 + 1;
    (line, column)
}

impl fmt::Display for Location {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.path)?;
        if let Some(line) = self.line {
            write!(f, ":{line}")?;
            if let Some(column) = self.column {
                write!(f, ":{column}")?;
            }
        }
        Ok(())
    }
}

/// What is wrong.
#[derive(Debug, thiserror::Error)]
pub enum InputErrorKind {
    /// The file or folder cannot be read.
    #[error("cannot read: {0}")]
    Io(#[source] std::io::Error),
    /// A tank folder without tank.toml.
    #[error("no tank.toml here: a tank folder holds tank.toml and surveys/*.csv")]
    NoTankFile,
    /// A fleet folder without any tank folder below it.
    #[error("no tank folder (a folder holding tank.toml) below this folder")]
    NoTankFolders,
    /// A file given where a tank folder is expected.
    #[error("not a folder: give the tank folder that holds tank.toml and surveys/*.csv")]
    NotATankFolder,
    /// A path that is neither a tank folder nor a CSV file.
    #[error("not a tank folder (with tank.toml) nor a .csv file")]
    NotATankOrCsv,
    /// Bytes that are not UTF-8.
    #[error(
        "{}{}is not valid UTF-8 text: binary data, or a file saved in another encoding? \
         (save it as UTF-8)",
        column_prefix(.column),
        byte_text(.byte)
    )]
    NotUtf8 {
        /// Column name, when known.
        column: Option<String>,
        /// The first byte that is not UTF-8, when known.
        byte: Option<u8>,
    },
    /// A file with no content.
    #[error(
        "the file is empty (or holds only blank and # comment lines): expected a header row \
         such as \"date,course,thickness\""
    )]
    EmptyFile,
    /// A header and no data rows.
    #[error("no readings: the file has a header row only, expected one reading per row below it")]
    HeaderOnly,
    /// A required column is absent.
    #[error("missing required column \"{column}\" (the header has: {found})")]
    MissingColumn {
        /// The column.
        column: &'static str,
        /// The header as read.
        found: String,
    },
    /// A header name that is not known.
    #[error("unknown column \"{column}\"{}; known columns: {known}", paren_suggestion(.suggestion))]
    UnknownColumn {
        /// The name.
        column: String,
        /// Nearest known name.
        suggestion: Option<String>,
        /// Every known name.
        known: String,
    },
    /// The same column twice.
    #[error("column \"{column}\" appears twice (columns {first} and {second})")]
    DuplicateColumn {
        /// Name.
        column: String,
        /// 1-based position of the first.
        first: usize,
        /// 1-based position of the second.
        second: usize,
    },
    /// Two columns give the same quantity in different units.
    #[error(
        "columns \"{first}\" and \"{second}\" both give the {quantity}: keep one column (one unit) per file"
    )]
    MixedUnits {
        /// Quantity.
        quantity: &'static str,
        /// First column.
        first: String,
        /// Second column.
        second: String,
    },
    /// A row with the wrong number of fields.
    #[error(
        "{found} field{}, expected {expected} as in the header (check the delimiter and \
         quotes): \"{row}\"",
        if *.found == 1 { "" } else { "s" }
    )]
    FieldCount {
        /// Fields in the row.
        found: usize,
        /// Fields in the header.
        expected: usize,
        /// The row as read (shortened).
        row: String,
    },
    /// Every reading of a file far under nominal: a unit mistake.
    #[error(
        "every reading of this file ({count}) is under a fifth of its course's nominal \
         thickness, the first {first} on course {course} (nominal {nominal}): a unit mistake? \
         {hint}"
    )]
    AllThin {
        /// Readings in the file.
        count: usize,
        /// The first reading, as shown.
        first: String,
        /// Its course.
        course: u32,
        /// Its course's nominal thickness, as shown.
        nominal: String,
        /// What to do.
        hint: &'static str,
    },
    /// A header column without a name that holds a value in some row.
    #[error(
        "column {position} has no name in the header but holds \"{value}\": name it (e.g. \
         \"note\") or delete the value"
    )]
    UnnamedColumn {
        /// 1-based position.
        position: usize,
        /// The value found.
        value: String,
    },
    /// A quoted value that runs over several lines: a quote not closed, which would
    /// swallow the rows after it.
    #[error(
        "{}a quoted value runs from line {first} to line {last}: a quote not closed? The rows \
         inside it would be lost; close the quote or remove the line break (\"{value}\")",
        column_prefix(.column)
    )]
    MultiLineValue {
        /// Column name, when known.
        column: Option<String>,
        /// Line where the value starts.
        first: u64,
        /// Line where it ends.
        last: u64,
        /// The value (shortened).
        value: String,
    },
    /// A value that does not parse.
    #[error("column \"{column}\": \"{value}\" is not {what} (expected {expected})")]
    BadValue {
        /// Column.
        column: String,
        /// Raw text.
        value: String,
        /// What it failed to be ("a number", "an ISO date").
        what: &'static str,
        /// What was expected, as a phrase ("a thickness in mm, e.g. 12.40").
        expected: String,
    },
    /// An empty cell where a value is required.
    #[error("column \"{column}\": empty, expected {expected}")]
    EmptyValue {
        /// Column.
        column: String,
        /// What was expected.
        expected: String,
    },
    /// A value outside its range.
    #[error("column \"{column}\": {value} {problem}")]
    OutOfRange {
        /// Column.
        column: String,
        /// The value as shown.
        value: String,
        /// What is wrong and what was expected.
        problem: String,
    },
    /// The same point read twice on one date with different values.
    #[error(
        "point \"{point}\" on {date} is read twice with different values: {first_value} at {first} \
         and {value} here; keep the reading you trust and delete the other, or give the repeat \
         its own point id"
    )]
    ConflictingDuplicate {
        /// Point id.
        point: String,
        /// Date.
        date: chrono::NaiveDate,
        /// file:line of the first reading.
        first: String,
        /// First value, as shown.
        first_value: String,
        /// This value, as shown.
        value: String,
    },
    /// A scan file with nothing in it.
    #[error(
        "the file is empty: expected a header block of \"# key = value\" lines (course, date, \
         bottom_elevation, row_pitch, column_pitch) and a grid of readings below it"
    )]
    EmptyScan,
    /// A scan with a header block and no grid.
    #[error("no readings: the scan has a header block and no grid of readings below it")]
    NoGrid,
    /// A grid whose every cell is empty.
    #[error("no readings: every cell of the grid is empty")]
    EmptyGrid,
    /// A key line below the first row of the grid.
    #[error(
        "key line \"# {key} = ...\" below the first row of the grid (line {grid_line}): put every \
         key line in the header block above the grid"
    )]
    KeyAfterGrid {
        /// The key as written.
        key: String,
        /// Line of the grid's first row.
        grid_line: u64,
    },
    /// A grid row with a different number of cells from the first row.
    #[error(
        "{found} cell{}, expected {expected} as in the first row of the grid (line {first_line}); \
         leave a cell empty for a point not measured",
        if *.found == 1 { "" } else { "s" }
    )]
    GridWidth {
        /// Cells in this row.
        found: usize,
        /// Cells in the first row.
        expected: usize,
        /// Line of the first row.
        first_line: u64,
    },
    /// A grid cell that does not parse.
    #[error("grid column {column}: \"{value}\" is not {what} (expected {expected})")]
    BadCell {
        /// 1-based column of the grid.
        column: usize,
        /// Raw text.
        value: String,
        /// What it failed to be.
        what: &'static str,
        /// What was expected.
        expected: String,
    },
    /// A grid cell outside its range.
    #[error("grid column {column}: {value} {problem}")]
    CellOutOfRange {
        /// 1-based column of the grid.
        column: usize,
        /// The value as shown.
        value: String,
        /// What is wrong and what was expected.
        problem: String,
    },
    /// TOML syntax.
    #[error("TOML syntax: {0}")]
    TomlSyntax(String),
    /// A tank file with nothing in it.
    #[error(
        "the file is empty: expected the tank's description (id, units, diameter, \
         max_fill_height, specific_gravity and one [[course]] table per course)"
    )]
    EmptyTankFile,
    /// A required key is absent.
    #[error("missing required key \"{key}\"{}, expected {expected}", table_text(.table))]
    MissingKey {
        /// Key.
        key: &'static str,
        /// Table, when not the top level.
        table: Option<String>,
        /// What was expected there.
        expected: String,
    },
    /// A tank key written inside a table, below a `[table]` header.
    #[error(
        "key \"{key}\" is inside {table}, where it does not belong: the tank's keys go above \
         the first [table] or [[course]] header (expected {expected})"
    )]
    MisplacedKey {
        /// Key.
        key: &'static str,
        /// The table it is in, as a message names it.
        table: String,
        /// What was expected.
        expected: String,
    },
    /// A key that is not known.
    #[error(
        "unknown key \"{key}\"{}{}",
        table_text(.table),
        suggestion_or_known(.suggestion, .known)
    )]
    UnknownKey {
        /// Key.
        key: String,
        /// Table, when not the top level.
        table: Option<String>,
        /// Nearest known key.
        suggestion: Option<String>,
        /// The known keys of that table.
        known: String,
    },
    /// A key with a value of the wrong type.
    #[error("{key}: {found} {value}, expected {expected}")]
    WrongType {
        /// The key, as a phrase: `key "units"` or `course 2, key "height"`.
        key: String,
        /// Type found.
        found: &'static str,
        /// The value as written.
        value: String,
        /// What was expected.
        expected: String,
    },
    /// A key with a value outside its range.
    #[error("{key}: {value} {problem}")]
    InvalidValue {
        /// The key, as a phrase: `key "units"` or `course 2, key "height"`.
        key: String,
        /// The value as written.
        value: String,
        /// What is wrong and what was expected.
        problem: String,
    },
}

fn column_prefix(column: &Option<String>) -> String {
    column
        .as_ref()
        .map(|c| format!("column \"{c}\": "))
        .unwrap_or_default()
}

fn byte_text(b: &Option<u8>) -> String {
    match b {
        Some(b) => format!("byte 0x{b:02X} "),
        None => "text ".to_string(),
    }
}

fn suggestion_or_known(s: &Option<String>, known: &str) -> String {
    match s {
        Some(s) => format!("; did you mean \"{s}\"?"),
        None => format!("; known keys: {known}"),
    }
}

fn paren_suggestion(s: &Option<String>) -> String {
    s.as_ref()
        .map(|s| format!(" (did you mean \"{s}\"?)"))
        .unwrap_or_default()
}

fn table_text(t: &Option<String>) -> String {
    t.as_ref().map(|t| format!(" in {t}")).unwrap_or_default()
}

/// An input error at a location.
#[derive(Debug, thiserror::Error)]
#[error("{location}: {kind}")]
pub struct InputError {
    /// File, line, column.
    pub location: Location,
    /// What is wrong (boxed: errors travel through many `Result`s).
    pub kind: Box<InputErrorKind>,
}

impl InputError {
    /// An error at `location`.
    pub fn new(location: Location, kind: InputErrorKind) -> Self {
        InputError {
            location,
            kind: Box::new(kind),
        }
    }
}

/// Longest echo of a value from an input file in a message, in characters.
pub const ECHO_CHARS: usize = 60;

/// A value from an input file as echoed in a message: control characters escaped (so
/// a message stays one line and prints no terminal codes) and cut to [`ECHO_CHARS`]
/// characters with "..." (a 10 MB line is never echoed whole).
pub fn echo(raw: &str) -> String {
    let long = raw.chars().nth(ECHO_CHARS).is_some();
    let mut out = String::new();
    for (n, c) in raw.chars().enumerate() {
        if long && n >= ECHO_CHARS - 3 {
            out.push_str("...");
            break;
        }
        if c.is_control() {
            out.extend(c.escape_default());
        } else {
            out.push(c);
        }
    }
    out
}

/// A number computed from input values, for a message: at most 9 significant digits,
/// so that sums such as 2.4 x 6 print as 14.4, and an exponent for magnitudes that
/// would otherwise print hundreds of digits.
pub fn number_text(v: f64) -> String {
    if !v.is_finite() {
        return v.to_string();
    }
    let a = v.abs();
    if a != 0.0 && !(1e-6..1e12).contains(&a) {
        return format!("{v:e}");
    }
    let rounded: f64 = format!("{v:.8e}").parse().unwrap_or(v);
    rounded.to_string()
}

/// Longest name for which a nearest known name is sought.
const NEAREST_MAX_LEN: usize = 64;

/// The known name nearest to `name` (Jaro-Winkler similarity from strsim), when it is
/// close enough to be a likely typo.
pub fn nearest<'a>(name: &str, known: impl IntoIterator<Item = &'a str>) -> Option<String> {
    // No typo of a short name is this long; and the similarity's cost grows with the
    // length (a 10 MB header line took most of a minute).
    if name.len() > NEAREST_MAX_LEN {
        return None;
    }
    let lower = name.to_ascii_lowercase();
    known
        .into_iter()
        .map(|k| (strsim::jaro_winkler(&lower, &k.to_ascii_lowercase()), k))
        .filter(|(score, _)| *score >= 0.75)
        .max_by(|a, b| a.0.partial_cmp(&b.0).unwrap_or(std::cmp::Ordering::Equal))
        .map(|(_, k)| k.to_string())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn positions_are_one_based() {
        let text = "a = 1\nbé = 2\n";
        assert_eq!(line_column(text, 0), (1, 1));
        assert_eq!(line_column(text, 6), (2, 1));
        // 'b' 'é'(2 bytes) ' ' -> byte 10 is the '=' at character column 4
        assert_eq!(line_column(text, 10), (2, 4));
        assert_eq!(line_column(text, 999), (3, 1));
    }

    #[test]
    fn echoes_are_short_and_one_line() {
        assert_eq!(echo("4,2x"), "4,2x");
        assert_eq!(echo("9\u{0}\n"), "9\\u{0}\\n");
        let long = "9".repeat(10_000_000);
        let e = echo(&long);
        assert_eq!(e.chars().count(), ECHO_CHARS);
        assert!(e.ends_with("..."));
        assert_eq!(echo(&"x".repeat(ECHO_CHARS)), "x".repeat(ECHO_CHARS));
    }

    #[test]
    fn numbers_in_messages() {
        assert_eq!(number_text(2.4 * 6.0), "14.4");
        assert_eq!(number_text(6.0), "6");
        assert_eq!(number_text(1e-300), "1e-300");
        assert_eq!(number_text(1e300), "1e300");
        assert_eq!(number_text(0.0), "0");
    }

    #[test]
    fn suggestions() {
        let keys = ["diameter", "max_fill_height", "specific_gravity"];
        assert_eq!(nearest("diamter", keys), Some("diameter".into()));
        assert_eq!(nearest("fill_height", keys), Some("max_fill_height".into()));
        assert_eq!(nearest("zzz", keys), None);
        assert_eq!(nearest(&"diameter".repeat(1000), keys), None);
    }
}
