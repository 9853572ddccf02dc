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
    /// A path that is neither a tank folder nor a CSV file.
    #[error("not a tank folder (with tank.toml) nor a .csv file")]
    NotATankOrCsv,
    /// Bytes that are not UTF-8.
    #[error("{}text is not valid UTF-8 (save the file as UTF-8)", column_prefix(.column))]
    NotUtf8 {
        /// Column name, when known.
        column: Option<String>,
    },
    /// A file with no content.
    #[error("the file is empty: expected a header row such as \"date,course,thickness\"")]
    EmptyFile,
    /// A header and no data rows.
    #[error("no readings: the file has a header row only")]
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
        "{found} fields, expected {expected} as in the header (check the delimiter and quotes)"
    )]
    FieldCount {
        /// Fields in the row.
        found: usize,
        /// Fields in the header.
        expected: usize,
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
    /// A required key is absent.
    #[error("missing required key \"{key}\"{}", table_text(.table))]
    MissingKey {
        /// Key.
        key: &'static str,
        /// Table, when not the top level.
        table: Option<String>,
    },
    /// A key that is not known.
    #[error("unknown key \"{key}\"{}{}", table_text(.table), suggestion_text(.suggestion))]
    UnknownKey {
        /// Key.
        key: String,
        /// Table, when not the top level.
        table: Option<String>,
        /// Nearest known key.
        suggestion: Option<String>,
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

fn suggestion_text(s: &Option<String>) -> String {
    s.as_ref()
        .map(|s| format!("; did you mean \"{s}\"?"))
        .unwrap_or_default()
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

/// The known name nearest to `name` (Jaro-Winkler similarity from strsim), when it is
/// close enough to be a likely typo.
pub fn nearest<'a>(name: &str, known: impl IntoIterator<Item = &'a str>) -> Option<String> {
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
    fn suggestions() {
        let keys = ["diameter", "max_fill_height", "specific_gravity"];
        assert_eq!(nearest("diamter", keys), Some("diameter".into()));
        assert_eq!(nearest("fill_height", keys), Some("max_fill_height".into()));
        assert_eq!(nearest("zzz", keys), None);
    }
}
