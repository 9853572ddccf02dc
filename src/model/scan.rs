//! A grid scan of a local thin area, as read from `scans/*.csv` (README "Scan CSV").

use chrono::NaiveDate;

use crate::calc::units::{Length, Thickness, UnitSystem};

/// One grid scan: readings on a rectangular grid over a thin area of one course.
///
/// Rows are elevations, bottom row first (row 0 is the first row of the file's grid);
/// columns are circumferential positions, in the order of the file. Pitches are
/// distances along the shell given in the thickness unit (mm or in), as the scan
/// format has them; elevations are in the length unit (m or ft).
#[derive(Debug, Clone, PartialEq)]
pub struct Scan {
    /// The file, as displayed in messages.
    pub file: String,
    /// Course number, 1 = bottom.
    pub course: u32,
    /// Date of the scan.
    pub date: NaiveDate,
    /// Elevation of the grid's first (bottom) row above the tank bottom.
    pub bottom_elevation: Length,
    /// Vertical distance between rows, in the thickness unit (mm or in).
    pub row_pitch: Thickness,
    /// Horizontal distance between columns, in the thickness unit (mm or in).
    pub column_pitch: Thickness,
    /// Readings below this value are pits (none when not given).
    pub pit_threshold: Option<Thickness>,
    /// `cells[row][column]`, row 0 = bottom; `None` = not measured.
    pub cells: Vec<Vec<Option<Thickness>>>,
    /// 1-based line of each row in the file.
    pub lines: Vec<u64>,
    /// The delimiter of the grid.
    pub delimiter: char,
}

impl Scan {
    /// Number of rows.
    pub fn rows(&self) -> usize {
        self.cells.len()
    }
    /// Number of columns.
    pub fn columns(&self) -> usize {
        self.cells.first().map_or(0, Vec::len)
    }
    /// True when `t` is a pit: below the pit threshold.
    pub fn is_pit(&self, t: Thickness) -> bool {
        self.pit_threshold.is_some_and(|p| t.0 < p.0)
    }
    /// The reading at (row, column) when it is measured and not a pit.
    pub fn valid(&self, row: usize, column: usize) -> Option<Thickness> {
        self.cells
            .get(row)
            .and_then(|r| r.get(column))
            .copied()
            .flatten()
            .filter(|t| !self.is_pit(*t))
    }
    /// The reading at (row, column) when it is a pit.
    pub fn pit(&self, row: usize, column: usize) -> Option<Thickness> {
        self.cells
            .get(row)
            .and_then(|r| r.get(column))
            .copied()
            .flatten()
            .filter(|t| self.is_pit(*t))
    }
    /// Cells holding a reading.
    pub fn readings(&self) -> usize {
        self.cells.iter().flatten().filter(|c| c.is_some()).count()
    }
    /// Cells left empty.
    pub fn not_measured(&self) -> usize {
        self.rows() * self.columns() - self.readings()
    }
    /// Readings below the pit threshold.
    pub fn pits(&self) -> usize {
        self.cells
            .iter()
            .flatten()
            .flatten()
            .filter(|t| self.is_pit(**t))
            .count()
    }
    /// Elevation of row `row` (0 = bottom): bottom_elevation + row x row_pitch, the
    /// pitch converted from the thickness unit to the length unit of `units`.
    pub fn row_elevation(&self, row: usize, units: UnitSystem) -> Length {
        let rise = units.as_length(Thickness(self.row_pitch.0 * row as f64));
        Length(self.bottom_elevation.0 + rise.0)
    }
    /// Elevation of the top row.
    pub fn top_elevation(&self, units: UnitSystem) -> Length {
        self.row_elevation(self.rows().saturating_sub(1), units)
    }
}
