//! Locally thinned areas from grid scans: averaging length, t1, t2, pits, the
//! acceptance rules with future corrosion, and the liquid level an area allows.
//!
//! Sources: API 653 4.3.2.1 and 4.3.2.2 (from memory of the clauses), methods.md s.3,
//! s.4 and s.5. Symbols and units (the tank's own system, [SI | USC]):
//!
//! - t2: the least reading of the grid, pits excluded [mm | in].
//! - L, the averaging length: USC L = 3.7 sqrt(D t2) with D in ft, t2 in in, L in in,
//!   L <= 40 in; SI, in consistent units, L = 1.068 sqrt(D t2) with D and t2 in mm,
//!   L <= 1000 mm (methods.md s.5). Both forms give the same L (3.7 / sqrt(12) =
//!   1.068); the caps differ by the rounding of 40 in = 1016 mm to 1000 mm.
//! - k = floor(L / row pitch) + 1: the most consecutive rows whose readings lie within
//!   a vertical length L ((k - 1) pitches <= L).
//! - Windows: every run of k consecutive rows in every column (the whole column when
//!   the grid has fewer than k rows). A window's mean is over its valid cells (not
//!   empty, not a pit); a window with fewer than half its cells valid is skipped.
//! - t1: the least window mean. Its z is the elevation of the window's lowest row.
//! - Local t_min (local.rs): 4.9 D H G / (S E) [USC 2.6], H from z to the maximum
//!   liquid level, floor 2.5 mm | 0.1 in.
//! - Future corrosion to the next inspection: N I, N the course's governing rate, I the
//!   tank's ultrasonic thickness survey interval (API 653 6.3.3).
//! - Rules (each passes when "measured >= required"):
//!   - t1: window mean >= t_min(z of the window) + N I, checked at every window; the
//!     critical window is the one with the least margin (normally the t1 window; a
//!     lower window can be critical because its t_min is higher);
//!   - t2: t2 >= 0.6 t_min(z of the grid's bottom row) + N I;
//!   - pit depth: least pit reading >= 0.5 t_min(z of the grid's bottom row) + N I
//!     ("remaining thickness exclusive of the corrosion allowance", API 653 4.3.2.2 a:
//!     the pit must keep half of t_min after the corrosion expected by the next
//!     inspection);
//!   - pit spacing: at most 50 mm of pits in any 200 mm of a column [2 in in 8 in].
//!     Convention: a pit reading stands for one row pitch of its column; the rule is
//!     checked over every run of ceil(200 mm / row pitch) consecutive rows (at least
//!     200 mm of column), pit length = pit cells x row pitch.
//! - Allowable liquid level of the area (local.rs, inverted rules): the least over
//!   every window (t1 rule), t2 and the least pit, each with its thickness as measured
//!   ("now") and less N I ("next").
//!
//! Every comparison at a limit allows a relative 1e-9 for binary rounding.

use super::constants::{
    LocalAreaForm, PIT_FRACTION_OF_T_MIN, RULE_RELATIVE_TOLERANCE, T2_FRACTION_OF_T_MIN,
    WINDOW_MIN_VALID_FRACTION,
};
use super::local::{LocalFillCalc, LocalTminCalc, local_max_fill_height, local_t_min};
use super::shell::CourseLoad;
use super::units::{Length, MM_PER_M, Rate, Thickness, UnitSystem};
use crate::model::scan::Scan;

/// The averaging length L with its terms.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AveragingLength {
    /// The printed form (coefficient, cap).
    pub form: LocalAreaForm,
    /// D as the tank gives it (m or ft).
    pub diameter: Length,
    /// D as it enters the formula: mm (SI, consistent form) or ft (USC printed form).
    pub diameter_in_formula: f64,
    /// t2.
    pub t2: Thickness,
    /// coefficient x sqrt(D t2), before the cap.
    pub formula: Thickness,
    /// True when the cap governs.
    pub capped: bool,
    /// L = min(formula, cap).
    pub value: Thickness,
}

/// `L = 3.7 sqrt(D[ft] t2[in]) <= 40 in` (USC), `L = 1.068 sqrt(D[mm] t2[mm]) <= 1000 mm`
/// (SI) (API 653 4.3.2.1, from memory; methods.md s.5).
pub fn averaging_length(units: UnitSystem, diameter: Length, t2: Thickness) -> AveragingLength {
    let form = LocalAreaForm::of(units);
    let diameter_in_formula = match units {
        UnitSystem::Si => diameter.0 * MM_PER_M,
        UnitSystem::Usc => diameter.0,
    };
    let formula =
        Thickness(form.averaging_coefficient * (diameter_in_formula * t2.0.max(0.0)).sqrt());
    let capped = formula.0 > form.averaging_cap.0;
    AveragingLength {
        form,
        diameter,
        diameter_in_formula,
        t2,
        formula,
        capped,
        value: if capped { form.averaging_cap } else { formula },
    }
}

/// k = floor(L / row pitch) + 1 (at least 1).
pub fn window_rows(length: Thickness, row_pitch: Thickness) -> usize {
    if row_pitch.0 <= 0.0 || !length.0.is_finite() {
        return 1;
    }
    let ratio = length.0 / row_pitch.0;
    (ratio * (1.0 + RULE_RELATIVE_TOLERANCE)).floor().max(0.0) as usize + 1
}

/// One cell of a grid (row 0 = bottom, column 0 = first in the file).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Cell {
    /// 0-based row from the bottom.
    pub row: usize,
    /// 0-based column.
    pub column: usize,
    /// The reading.
    pub value: Thickness,
}

/// t2: the least valid reading (pits and empty cells excluded); on a tie the lowest
/// row, then the first column.
pub fn least_reading(scan: &Scan) -> Option<Cell> {
    least_cell(scan, |r, c| scan.valid(r, c))
}

/// The least pit reading; on a tie the lowest row, then the first column.
pub fn least_pit(scan: &Scan) -> Option<Cell> {
    least_cell(scan, |r, c| scan.pit(r, c))
}

fn least_cell(scan: &Scan, pick: impl Fn(usize, usize) -> Option<Thickness>) -> Option<Cell> {
    let mut best: Option<Cell> = None;
    for row in 0..scan.rows() {
        for column in 0..scan.columns() {
            if let Some(value) = pick(row, column)
                && best.is_none_or(|b| value.0 < b.value.0)
            {
                best = Some(Cell { row, column, value });
            }
        }
    }
    best
}

/// One averaging window: consecutive rows of one column.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Window {
    /// 0-based column.
    pub column: usize,
    /// 0-based first (lowest) row.
    pub first_row: usize,
    /// Rows in the window (k, or the grid's rows when fewer).
    pub rows: usize,
    /// Valid cells averaged.
    pub valid: usize,
    /// Mean of the valid cells.
    pub mean: Thickness,
    /// z: elevation of the window's lowest row.
    pub bottom_elevation: Length,
    /// Elevation of the window's top row.
    pub top_elevation: Length,
}

impl Window {
    /// 0-based last (highest) row.
    pub fn last_row(&self) -> usize {
        self.first_row + self.rows - 1
    }
}

/// Every window of a grid.
#[derive(Debug, Clone, PartialEq)]
pub struct Windows {
    /// k.
    pub rows_per_window: usize,
    /// Windows with at least half their cells valid, column by column, bottom first.
    pub windows: Vec<Window>,
    /// Windows skipped for having fewer than half their cells valid.
    pub skipped: usize,
}

/// Every window of `k` rows (the whole column when the grid has fewer rows).
pub fn averaging_windows(scan: &Scan, k: usize, units: UnitSystem) -> Windows {
    let rows = scan.rows();
    let len = k.max(1).min(rows);
    let mut windows = Vec::new();
    let mut skipped = 0;
    if len == 0 {
        return Windows {
            rows_per_window: k,
            windows,
            skipped,
        };
    }
    for column in 0..scan.columns() {
        for first_row in 0..=rows - len {
            let values: Vec<f64> = (first_row..first_row + len)
                .filter_map(|r| scan.valid(r, column).map(|t| t.0))
                .collect();
            if (values.len() as f64) < WINDOW_MIN_VALID_FRACTION * len as f64 {
                skipped += 1;
                continue;
            }
            windows.push(Window {
                column,
                first_row,
                rows: len,
                valid: values.len(),
                mean: Thickness(values.iter().sum::<f64>() / values.len() as f64),
                bottom_elevation: scan.row_elevation(first_row, units),
                top_elevation: scan.row_elevation(first_row + len - 1, units),
            });
        }
    }
    Windows {
        rows_per_window: k,
        windows,
        skipped,
    }
}

/// Index of the window with the least mean (t1); the first on a tie.
pub fn least_window(windows: &[Window]) -> Option<usize> {
    let mut best: Option<usize> = None;
    for (i, w) in windows.iter().enumerate() {
        if best.is_none_or(|b| w.mean.0 < windows[b].mean.0) {
            best = Some(i);
        }
    }
    best
}

/// The run of rows with the most pit length in one column.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PitRun {
    /// 0-based column.
    pub column: usize,
    /// 0-based first row.
    pub first_row: usize,
    /// Rows in the run.
    pub rows: usize,
    /// Pit cells in it.
    pub pits: usize,
    /// pits x row pitch.
    pub length: Thickness,
}

/// The pit spacing rule (API 653 4.3.2.2 b, from memory).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PitSpacing {
    /// The span of the rule (200 mm | 8 in).
    pub span: Thickness,
    /// Most pit length in a span (50 mm | 2 in).
    pub limit: Thickness,
    /// ceil(span / row pitch), at least 1: rows checked together.
    pub rows_per_span: usize,
    /// The run with the most pit length (None without pits).
    pub worst: Option<PitRun>,
    /// worst length <= limit.
    pub pass: bool,
}

/// Checks the pit spacing rule over every run of `ceil(span / row pitch)` rows of
/// every column (the whole column when the grid has fewer rows).
pub fn pit_spacing(scan: &Scan, units: UnitSystem) -> PitSpacing {
    let form = LocalAreaForm::of(units);
    let ratio = form.pit_span.0 / scan.row_pitch.0;
    let rows_per_span = ((ratio * (1.0 - RULE_RELATIVE_TOLERANCE)).ceil().max(1.0)) as usize;
    let rows = scan.rows();
    let len = rows_per_span.min(rows);
    let mut worst: Option<PitRun> = None;
    if len > 0 {
        for column in 0..scan.columns() {
            for first_row in 0..=rows - len {
                let pits = (first_row..first_row + len)
                    .filter(|&r| scan.pit(r, column).is_some())
                    .count();
                if pits > 0 && worst.is_none_or(|w| pits > w.pits) {
                    worst = Some(PitRun {
                        column,
                        first_row,
                        rows: len,
                        pits,
                        length: Thickness(pits as f64 * scan.row_pitch.0),
                    });
                }
            }
        }
    }
    let pass = worst.is_none_or(|w| at_most(w.length.0, form.pit_length_limit.0));
    PitSpacing {
        span: form.pit_span,
        limit: form.pit_length_limit,
        rows_per_span,
        worst,
        pass,
    }
}

/// `a >= b`, allowing a relative 1e-9 for binary rounding.
fn at_least(a: f64, b: f64) -> bool {
    a >= b - RULE_RELATIVE_TOLERANCE * b.abs()
}

/// `a <= b`, allowing a relative 1e-9 for binary rounding.
fn at_most(a: f64, b: f64) -> bool {
    a <= b + RULE_RELATIVE_TOLERANCE * b.abs()
}

/// Corrosion expected by the next inspection: N I.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FutureLoss {
    /// N, the course's governing rate (None when no rate is known: the rules are then
    /// checked as measured and the level at the next inspection is not computed).
    pub rate: Option<Rate>,
    /// I, years to the next inspection (the tank's UT interval).
    pub years: f64,
    /// N I (0 without a rate).
    pub loss: Thickness,
}

impl FutureLoss {
    /// N I at `rate` over `years`.
    pub fn new(rate: Option<Rate>, years: f64) -> Self {
        FutureLoss {
            rate,
            years,
            loss: Thickness(rate.map_or(0.0, |n| n.0.max(0.0) * years.max(0.0))),
        }
    }
}

/// Which local-area rule.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum RuleKind {
    /// t1 >= t_min + N I.
    T1,
    /// t2 >= 0.6 t_min + N I.
    T2,
    /// least pit >= 0.5 t_min + N I.
    PitDepth,
}

impl RuleKind {
    /// f: the fraction of t_min the rule asks for.
    pub fn fraction(self) -> f64 {
        match self {
            RuleKind::T1 => 1.0,
            RuleKind::T2 => T2_FRACTION_OF_T_MIN,
            RuleKind::PitDepth => PIT_FRACTION_OF_T_MIN,
        }
    }
    /// Name in every output.
    pub fn name(self) -> &'static str {
        match self {
            RuleKind::T1 => "t1",
            RuleKind::T2 => "t2",
            RuleKind::PitDepth => "pit depth",
        }
    }
}

/// One thickness rule with its numbers: measured >= f x t_min + N I.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DepthRule {
    /// Which rule.
    pub kind: RuleKind,
    /// The thickness judged (a window mean, t2, the least pit).
    pub measured: Thickness,
    /// f.
    pub fraction: f64,
    /// The local t_min at the rule's z.
    pub t_min: LocalTminCalc,
    /// N I.
    pub future_loss: Thickness,
    /// f x t_min + N I.
    pub required: Thickness,
    /// measured - required.
    pub margin: Thickness,
    /// measured >= required.
    pub pass: bool,
}

/// Checks `measured >= f t_min(z) + N I` with z = `load.bottom_elevation`.
pub fn depth_rule(
    kind: RuleKind,
    measured: Thickness,
    load: CourseLoad,
    fill_height: Length,
    future_loss: Thickness,
) -> DepthRule {
    let t_min = local_t_min(load, fill_height);
    let fraction = kind.fraction();
    let required = Thickness(fraction * t_min.value.0 + future_loss.0);
    DepthRule {
        kind,
        measured,
        fraction,
        t_min,
        future_loss,
        required,
        margin: Thickness(measured.0 - required.0),
        pass: at_least(measured.0, required.0),
    }
}

/// The t1 rule at one window.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct WindowRule {
    /// Index into `Windows::windows`.
    pub window: usize,
    /// The rule with its numbers.
    pub rule: DepthRule,
}

/// A liquid level an area allows, and what sets it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AreaLimit {
    /// The rule that sets it.
    pub kind: RuleKind,
    /// The window, for the t1 rule.
    pub window: Option<usize>,
    /// The inverted rule with its numbers.
    pub calc: LocalFillCalc,
}

/// Everything found about one scanned area.
#[derive(Debug, Clone, PartialEq)]
pub struct AreaAssessment {
    /// The scan.
    pub scan: Scan,
    /// The course's load (D, G, S, E) with `bottom_elevation` = the grid's bottom row.
    pub load: CourseLoad,
    /// The liquid level the rules are checked at (the tank's maximum fill height).
    pub fill_height: Length,
    /// t2 and where.
    pub t2: Cell,
    /// The least pit and where (None without pits).
    pub least_pit: Option<Cell>,
    /// L.
    pub averaging_length: AveragingLength,
    /// Every window of k rows.
    pub windows: Windows,
    /// Index of the t1 window (None when every window was skipped).
    pub t1: Option<usize>,
    /// N I.
    pub future: FutureLoss,
    /// The t1 rule at its critical window (least margin); None without windows.
    pub t1_rule: Option<WindowRule>,
    /// The t2 rule.
    pub t2_rule: DepthRule,
    /// The pit depth rule (None without pits).
    pub pit_depth_rule: Option<DepthRule>,
    /// The pit spacing rule.
    pub pit_spacing: PitSpacing,
    /// Allowable liquid level with the thicknesses as measured.
    pub max_fill_height: AreaLimit,
    /// Allowable liquid level with N I taken off (None when no rate is known).
    pub max_fill_height_next: Option<AreaLimit>,
    /// Every rule passes; None when t1 could not be computed and every other rule
    /// passes.
    pub acceptable: Option<bool>,
}

impl AreaAssessment {
    /// The t1 window.
    pub fn t1_window(&self) -> Option<&Window> {
        self.t1.and_then(|i| self.windows.windows.get(i))
    }
    /// The critical window of the t1 rule.
    pub fn critical_window(&self) -> Option<&Window> {
        self.t1_rule
            .and_then(|r| self.windows.windows.get(r.window))
    }
    /// The rules that fail, in the order t1, t2, pit depth, pit spacing.
    pub fn failed_rules(&self) -> Vec<&'static str> {
        let mut out = Vec::new();
        if self.t1_rule.is_some_and(|r| !r.rule.pass) {
            out.push(RuleKind::T1.name());
        }
        if !self.t2_rule.pass {
            out.push(RuleKind::T2.name());
        }
        if self.pit_depth_rule.is_some_and(|r| !r.pass) {
            out.push(RuleKind::PitDepth.name());
        }
        if !self.pit_spacing.pass {
            out.push("pit spacing");
        }
        out
    }
}

fn at_z(load: CourseLoad, z: Length) -> CourseLoad {
    CourseLoad {
        bottom_elevation: z,
        ..load
    }
}

/// Assesses one scanned area of a course whose load is `load` (its own
/// `bottom_elevation` is ignored), at the liquid level `fill_height`, with `future`
/// corrosion to the next inspection. None when the grid holds no valid reading.
pub fn assess_area(
    scan: &Scan,
    load: CourseLoad,
    fill_height: Length,
    future: FutureLoss,
) -> Option<AreaAssessment> {
    let units = load.units;
    let grid_load = at_z(load, scan.bottom_elevation);
    let t2 = least_reading(scan)?;
    let least_pit = least_pit(scan);
    let averaging_length = averaging_length(units, load.diameter, t2.value);
    let k = window_rows(averaging_length.value, scan.row_pitch);
    let windows = averaging_windows(scan, k, units);
    let t1 = least_window(&windows.windows);
    let mut t1_rule: Option<WindowRule> = None;
    for (i, w) in windows.windows.iter().enumerate() {
        let rule = depth_rule(
            RuleKind::T1,
            w.mean,
            at_z(load, w.bottom_elevation),
            fill_height,
            future.loss,
        );
        if t1_rule.is_none_or(|r| rule.margin.0 < r.rule.margin.0) {
            t1_rule = Some(WindowRule { window: i, rule });
        }
    }
    let t2_rule = depth_rule(RuleKind::T2, t2.value, grid_load, fill_height, future.loss);
    let pit_depth_rule = least_pit.map(|p| {
        depth_rule(
            RuleKind::PitDepth,
            p.value,
            grid_load,
            fill_height,
            future.loss,
        )
    });
    let pit_spacing = pit_spacing(scan, units);
    let mut area = AreaAssessment {
        scan: scan.clone(),
        load: grid_load,
        fill_height,
        t2,
        least_pit,
        averaging_length,
        windows,
        t1,
        future,
        t1_rule,
        t2_rule,
        pit_depth_rule,
        pit_spacing,
        max_fill_height: AreaLimit {
            kind: RuleKind::T2,
            window: None,
            calc: local_max_fill_height(grid_load, t2.value, RuleKind::T2.fraction()),
        },
        max_fill_height_next: None,
        acceptable: None,
    };
    let g = load.specific_gravity;
    if let Some(now) = area_fill_limit(&area, g, Thickness(0.0)) {
        area.max_fill_height = now;
    }
    if future.rate.is_some() {
        area.max_fill_height_next = area_fill_limit(&area, g, future.loss);
    }
    let others_pass =
        area.t2_rule.pass && area.pit_depth_rule.is_none_or(|r| r.pass) && area.pit_spacing.pass;
    area.acceptable = match area.t1_rule {
        _ if !others_pass => Some(false),
        Some(r) => Some(r.rule.pass),
        None => None,
    };
    Some(area)
}

/// The least liquid level over the area's windows (t1 rule), t2 and the least pit,
/// for specific gravity `specific_gravity`, each thickness less `loss`.
pub fn area_fill_limit(
    area: &AreaAssessment,
    specific_gravity: f64,
    loss: Thickness,
) -> Option<AreaLimit> {
    let load = CourseLoad {
        specific_gravity,
        ..area.load
    };
    let mut candidates: Vec<AreaLimit> = area
        .windows
        .windows
        .iter()
        .enumerate()
        .map(|(i, w)| AreaLimit {
            kind: RuleKind::T1,
            window: Some(i),
            calc: local_max_fill_height(
                at_z(load, w.bottom_elevation),
                Thickness(w.mean.0 - loss.0),
                RuleKind::T1.fraction(),
            ),
        })
        .collect();
    candidates.push(AreaLimit {
        kind: RuleKind::T2,
        window: None,
        calc: local_max_fill_height(
            load,
            Thickness(area.t2.value.0 - loss.0),
            RuleKind::T2.fraction(),
        ),
    });
    if let Some(p) = area.least_pit {
        candidates.push(AreaLimit {
            kind: RuleKind::PitDepth,
            window: None,
            calc: local_max_fill_height(
                load,
                Thickness(p.value.0 - loss.0),
                RuleKind::PitDepth.fraction(),
            ),
        });
    }
    let mut best: Option<AreaLimit> = None;
    for c in candidates {
        if best.is_none_or(|b| c.calc.value.0 < b.calc.value.0) {
            best = Some(c);
        }
    }
    best
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::calc::units::Stress;
    use chrono::NaiveDate;

    fn t(v: f64) -> Option<Thickness> {
        Some(Thickness(v))
    }

    /// A scan from rows written bottom row first.
    fn scan(rows: Vec<Vec<Option<Thickness>>>, pitch: f64, bottom: f64, pit: Option<f64>) -> Scan {
        let n = rows.len();
        Scan {
            file: "test.csv".into(),
            course: 1,
            date: NaiveDate::from_ymd_opt(2026, 5, 19).expect("date"),
            bottom_elevation: Length(bottom),
            row_pitch: Thickness(pitch),
            column_pitch: Thickness(pitch),
            pit_threshold: pit.map(Thickness),
            cells: rows,
            lines: (1..=n as u64).collect(),
            delimiter: ',',
        }
    }

    /// SI load of the worked grid: D 10 m, G 1.0, S 100 MPa, E 1.0.
    fn load() -> CourseLoad {
        CourseLoad {
            units: UnitSystem::Si,
            diameter: Length(10.0),
            specific_gravity: 1.0,
            stress: Stress(100.0),
            joint_efficiency: 1.0,
            bottom_elevation: Length(0.0),
        }
    }

    /// SI by hand (methods.md s.5, consistent form): D 36 m = 36,000 mm, t2 11.9 mm:
    /// L = 1.068 x sqrt(36,000 x 11.9) = 1.068 x sqrt(428,400) = 1.068 x 654.5227 =
    /// 699.0303 mm (< 1000, not capped).
    /// USC by hand (API 653 4.3.2.1 printed form): D 120 ft, t2 0.5 in:
    /// L = 3.7 x sqrt(120 x 0.5) = 3.7 x 7.745967 = 28.66008 in (< 40).
    #[test]
    fn averaging_length_by_hand() {
        let l = averaging_length(UnitSystem::Si, Length(36.0), Thickness(11.9));
        assert!((l.value.0 - 699.030_3).abs() < 1e-3, "{}", l.value.0);
        assert!(!l.capped);
        let l = averaging_length(UnitSystem::Usc, Length(120.0), Thickness(0.5));
        assert!((l.value.0 - 28.660_08).abs() < 1e-4, "{}", l.value.0);
    }

    /// The same tank and t2 in both systems give the same L (methods.md s.5): D 36 m =
    /// 118.1102 ft, t2 11.9 mm = 0.468504 in. USC: 3.7 sqrt(118.1102 x 0.468504) =
    /// 3.7 x 7.43880 = 27.5236 in = 699.10 mm; SI 699.03 mm: they differ by
    /// 1.068 / (3.7 / sqrt 12) - 1 = -0.009 %, the rounding of the printed 1.068.
    /// The caps: D 60 m, t2 20 mm: SI 1.068 sqrt(1,200,000) = 1169.93 -> 1000 mm; USC
    /// 3.7 sqrt(196.85 x 0.7874) = 46.06 -> 40 in = 1016 mm; 40 in rounds to 1000 mm
    /// in the SI form, a 1.6 % difference both systems print.
    #[test]
    fn si_and_usc_agree_and_cap() {
        use crate::calc::units::UnitSystem::{Si, Usc};
        for (d, t2) in [(36.0, 11.9), (12.0, 6.0), (60.0, 8.0)] {
            let si = averaging_length(Si, Length(d), Thickness(t2));
            let usc = averaging_length(
                Usc,
                Length(d).convert(Si, Usc),
                Thickness(t2).convert(Si, Usc),
            );
            let usc_mm = usc.value.convert(Usc, Si).0;
            assert!((si.value.0 / usc_mm - 1.0).abs() < 1.5e-4, "{d} {t2}");
        }
        let si = averaging_length(Si, Length(60.0), Thickness(20.0));
        let usc = averaging_length(
            Usc,
            Length(60.0).convert(Si, Usc),
            Thickness(20.0).convert(Si, Usc),
        );
        assert!(si.capped && usc.capped);
        assert!((si.formula.0 - 1169.93).abs() < 0.01, "{}", si.formula.0);
        assert_eq!((si.value.0, usc.value.0), (1000.0, 40.0));
        assert!((usc.value.convert(Usc, Si).0 / si.value.0 - 1.016).abs() < 1e-12);
    }

    /// k = floor(L / pitch) + 1: 699.03 / 50 = 13.98 -> 14; 150 / 50 = 3 exactly -> 4
    /// (3 pitches fit in L exactly, so 4 rows); 40 / 1 -> 41.
    #[test]
    fn window_rows_by_hand() {
        assert_eq!(window_rows(Thickness(699.03), Thickness(50.0)), 14);
        assert_eq!(window_rows(Thickness(150.0), Thickness(50.0)), 4);
        assert_eq!(window_rows(Thickness(0.3 * 500.0), Thickness(50.0)), 4);
        assert_eq!(window_rows(Thickness(40.0), Thickness(1.0)), 41);
        assert_eq!(window_rows(Thickness(30.0), Thickness(50.0)), 1);
    }

    /// Window choice by hand, k = 3, pit threshold 8.0 (rows bottom first):
    /// column 1: 10.0, 9.0, 9.5, 10.0, [7.0 pit]
    ///   rows 1-3: (10.0 + 9.0 + 9.5) / 3 = 9.5; rows 2-4: (9.0 + 9.5 + 10.0) / 3 = 9.5;
    ///   rows 3-5: pit excluded, (9.5 + 10.0) / 2 = 9.75 (2 of 3 valid >= half).
    /// column 2: 10.0, -, 8.6, -, 10.0
    ///   rows 1-3: (10.0 + 8.6) / 2 = 9.3; rows 2-4: one valid of 3 < 1.5 -> skipped;
    ///   rows 3-5: (8.6 + 10.0) / 2 = 9.3.
    /// t1 = 9.3, the first of the two (column 2, rows 1-3); t2 = 8.6 (column 2, row 3);
    /// the pit 7.0 is neither.
    #[test]
    fn t1_window_choice_by_hand() {
        let s = scan(
            vec![
                vec![t(10.0), t(10.0)],
                vec![t(9.0), None],
                vec![t(9.5), t(8.6)],
                vec![t(10.0), None],
                vec![t(7.0), t(10.0)],
            ],
            50.0,
            0.0,
            Some(8.0),
        );
        let w = averaging_windows(&s, 3, UnitSystem::Si);
        assert_eq!((w.windows.len(), w.skipped), (5, 1));
        let means: Vec<f64> = w.windows.iter().map(|w| w.mean.0).collect();
        let expect = [9.5, 9.5, 9.75, 9.3, 9.3];
        for (m, e) in means.iter().zip(expect) {
            assert!((m - e).abs() < 1e-12, "{means:?}");
        }
        let i = least_window(&w.windows).expect("windows");
        assert_eq!((w.windows[i].column, w.windows[i].first_row), (1, 0));
        assert_eq!(w.windows[i].valid, 2);
        let t2 = least_reading(&s).expect("t2");
        assert_eq!((t2.row, t2.column, t2.value), (2, 1, Thickness(8.6)));
        assert_eq!(least_pit(&s).map(|p| p.value), Some(Thickness(7.0)));
        // A grid shorter than k: each column is one window.
        let w = averaging_windows(&s, 9, UnitSystem::Si);
        assert_eq!(w.windows.len(), 2);
        assert_eq!(w.windows[0].rows, 5);
        // Exactly half valid is kept: 2 rows, one empty.
        let half = scan(vec![vec![t(9.0)], vec![None]], 50.0, 0.0, None);
        let w = averaging_windows(&half, 2, UnitSystem::Si);
        assert_eq!((w.windows.len(), w.skipped), (1, 0));
    }

    fn column(pits_at: &[usize], rows: usize) -> Vec<Vec<Option<Thickness>>> {
        (0..rows)
            .map(|r| vec![if pits_at.contains(&r) { t(3.0) } else { t(9.0) }])
            .collect()
    }

    /// Pit spacing at its limits (API 653 4.3.2.2 b, from memory; methods.md s.5).
    /// SI, pitch 50 mm: ceil(200 / 50) = 4 rows per span; one pit = 50 mm <= 50 passes
    /// (exactly at the limit); pits in rows 1 and 5 are never within 4 rows (each run
    /// holds one: 50 mm) -> pass; rows 1 and 4 are in rows 1-4 together: 100 mm -> fail.
    /// Pitch 30 mm: ceil(6.67) = 7 rows; one pit = 30 mm -> pass.
    /// USC, pitch 1 in: 8 rows per 8 in span; 2 pits = 2 in <= 2 passes (at the limit);
    /// 3 pits within 8 rows = 3 in -> fail.
    #[test]
    fn pit_spacing_at_its_limits() {
        let si = |pits: &[usize], pitch: f64| {
            pit_spacing(
                &scan(column(pits, 10), pitch, 0.0, Some(5.0)),
                UnitSystem::Si,
            )
        };
        let one = si(&[2], 50.0);
        assert_eq!(one.rows_per_span, 4);
        assert_eq!(one.worst.map(|w| w.length), Some(Thickness(50.0)));
        assert!(one.pass);
        assert!(si(&[0, 4], 50.0).pass);
        let two = si(&[0, 3], 50.0);
        assert!(!two.pass);
        assert_eq!(two.worst.map(|w| (w.first_row, w.pits)), Some((0, 2)));
        let fine = si(&[5], 30.0);
        assert_eq!((fine.rows_per_span, fine.pass), (7, true));
        assert!(si(&[], 50.0).pass);
        let usc = |pits: &[usize]| {
            pit_spacing(
                &scan(column(pits, 12), 1.0, 0.0, Some(5.0)),
                UnitSystem::Usc,
            )
        };
        let at_limit = usc(&[1, 8]);
        assert_eq!(at_limit.rows_per_span, 8);
        assert!(at_limit.pass, "{at_limit:?}");
        assert!(!usc(&[1, 4, 8]).pass);
        assert!(
            usc(&[0, 4, 8]).pass,
            "rows 1 and 9 are 8 rows apart: never together"
        );
    }

    /// Pit depth exactly at its limit (API 653 4.3.2.2 a, from memory): t_min at z
    /// 0.5 m, level 10 m on the load above: 4.9 x 10 x 9.5 x 1.0 / 100 = 4.655 mm;
    /// required = 0.5 x 4.655 + 0.5 = 2.8275 mm: 2.8275 passes, 2.8274 fails.
    #[test]
    fn pit_depth_at_its_limit() {
        let l = at_z(load(), Length(0.5));
        let at = depth_rule(
            RuleKind::PitDepth,
            Thickness(2.8275),
            l,
            Length(10.0),
            Thickness(0.5),
        );
        assert!((at.required.0 - 2.8275).abs() < 1e-12);
        assert!(at.pass);
        let below = depth_rule(
            RuleKind::PitDepth,
            Thickness(2.8274),
            l,
            Length(10.0),
            Thickness(0.5),
        );
        assert!(!below.pass);
    }

    /// The worked grid: SI, D 10 m, G 1.0, S 100 MPa, E 1.0, level 10.0 m, rate 0.1 mm/y
    /// over I = 5 y: N I = 0.5 mm. Grid from z = 0.50 m, pitch 50 mm, pit threshold 3.5.
    ///
    /// row (z m)   col 1  col 2
    ///   6 (0.75)  6.2    6.0
    ///   5 (0.70)  5.8    5.5
    ///   4 (0.65)  5.4    5.7
    ///   3 (0.60)  5.2    3.0 pit
    ///   2 (0.55)  5.6    5.9
    ///   1 (0.50)  6.0    6.0
    ///
    /// t2 = 5.2 (col 1, row 3). L = 1.068 sqrt(10,000 x 5.2) = 1.068 x 228.0351 =
    /// 243.5415 mm; k = floor(243.5415 / 50 = 4.87) + 1 = 5 rows; 2 windows per column.
    /// col 1: rows 1-5 (6.0 + 5.6 + 5.2 + 5.4 + 5.8) / 5 = 5.6; rows 2-6 28.2 / 5 = 5.64;
    /// col 2: rows 1-5 (6.0 + 5.9 + 5.7 + 5.5) / 4 = 5.775; rows 2-6 23.1 / 4 = 5.775.
    /// t1 = 5.6 (col 1, rows 1-5, z 0.50).
    /// t_min(z) = 4.9 x 10 x (10 - z) x 1 / 100 = 0.49 (10 - z): z 0.50 -> 4.655 mm,
    /// z 0.55 -> 4.6305 mm.
    /// t1 rule margins: col 1 rows 1-5: 5.6 - (4.655 + 0.5) = 0.445 (critical);
    ///   col 1 rows 2-6: 5.64 - 5.1305 = 0.5095; col 2: 0.62, 0.6445. Pass.
    /// t2 rule: 5.2 >= 0.6 x 4.655 + 0.5 = 3.293: pass.
    /// Pit depth: 3.0 >= 0.5 x 4.655 + 0.5 = 2.8275: pass.
    /// Pit spacing: 4 rows per 200 mm, one pit = 50 mm <= 50: pass. Acceptable.
    /// Levels, S E / (4.9 D G) = 100 / 49 = 2.0408163 m per mm:
    ///   now: t1 col 1 rows 1-5 2.0408163 x 5.6 + 0.50 = 11.928571 m (least);
    ///        pit 2.0408163 x 3.0 / 0.5 + 0.50 = 12.744898; t2 x 5.2 / 0.6 + 0.5 = 18.187075.
    ///   next: t1 2.0408163 x 5.1 + 0.5 = 10.908163; pit 2.0408163 x 2.5 / 0.5 + 0.5 =
    ///        10.704082 m (least: the pit governs after corrosion).
    #[test]
    fn worked_grid_by_hand() {
        let s = scan(
            vec![
                vec![t(6.0), t(6.0)],
                vec![t(5.6), t(5.9)],
                vec![t(5.2), t(3.0)],
                vec![t(5.4), t(5.7)],
                vec![t(5.8), t(5.5)],
                vec![t(6.2), t(6.0)],
            ],
            50.0,
            0.5,
            Some(3.5),
        );
        let future = FutureLoss::new(Some(Rate(0.1)), 5.0);
        assert!((future.loss.0 - 0.5).abs() < 1e-12);
        let a = assess_area(&s, load(), Length(10.0), future).expect("valid readings");
        assert_eq!((a.t2.row, a.t2.column, a.t2.value), (2, 0, Thickness(5.2)));
        assert!((a.averaging_length.value.0 - 243.541_5).abs() < 1e-3);
        assert_eq!(a.windows.rows_per_window, 5);
        let t1 = a.t1_window().expect("t1");
        assert_eq!((t1.column, t1.first_row), (0, 0));
        assert!((t1.mean.0 - 5.6).abs() < 1e-12);
        let r = a.t1_rule.expect("windows");
        assert_eq!(a.critical_window(), Some(t1));
        assert!((r.rule.t_min.value.0 - 4.655).abs() < 1e-12);
        assert!((r.rule.margin.0 - 0.445).abs() < 1e-12);
        assert!(r.rule.pass);
        assert!((a.t2_rule.required.0 - 3.293).abs() < 1e-12 && a.t2_rule.pass);
        let pit = a.pit_depth_rule.expect("a pit");
        assert!((pit.required.0 - 2.8275).abs() < 1e-12 && pit.pass);
        assert!(a.pit_spacing.pass);
        assert_eq!(a.acceptable, Some(true));
        assert!(a.failed_rules().is_empty());
        assert_eq!(a.max_fill_height.kind, RuleKind::T1);
        assert!((a.max_fill_height.calc.value.0 - 11.928_571).abs() < 1e-6);
        let next = a.max_fill_height_next.expect("rate known");
        assert_eq!(next.kind, RuleKind::PitDepth);
        assert!((next.calc.value.0 - 10.704_082).abs() < 1e-6);
    }

    /// A lower window can be critical although its mean is not the least: on the
    /// worked load, col 1 rows 1-2 (z 0.50) mean 5.600 and col 2 rows 2-3 (z 0.55) mean
    /// 5.590, k = 2 forced by a coarse check: margins 5.600 - 5.155 = 0.445 and
    /// 5.590 - 5.1305 = 0.4595: t1 = 5.590 (col 2) but col 1 is critical.
    #[test]
    fn critical_window_can_differ_from_t1() {
        let s = scan(
            vec![
                vec![t(5.6), t(9.0)],
                vec![t(5.6), t(5.59)],
                vec![t(9.0), t(5.59)],
            ],
            50.0,
            0.5,
            None,
        );
        let w = averaging_windows(&s, 2, UnitSystem::Si);
        let t1 = &w.windows[least_window(&w.windows).expect("t1")];
        assert_eq!((t1.column, t1.first_row), (1, 1));
        let margin = |w: &Window| {
            depth_rule(
                RuleKind::T1,
                w.mean,
                at_z(load(), w.bottom_elevation),
                Length(10.0),
                Thickness(0.5),
            )
            .margin
            .0
        };
        let low = &w.windows[0];
        assert!((margin(low) - 0.445).abs() < 1e-9);
        assert!((margin(t1) - 0.4595).abs() < 1e-9);
        assert!(margin(low) < margin(t1));
    }

    /// No rate: the rules are checked as measured (N I = 0) and no "next" level.
    /// Every window skipped: t1 unknown, the area's verdict unknown unless another
    /// rule fails.
    #[test]
    fn no_rate_and_no_window() {
        let s = scan(
            vec![vec![t(6.0)], vec![None], vec![None], vec![None]],
            50.0,
            0.5,
            None,
        );
        let a = assess_area(&s, load(), Length(10.0), FutureLoss::new(None, 5.0)).expect("t2");
        assert_eq!(a.future.loss, Thickness(0.0));
        assert_eq!(a.max_fill_height_next, None);
        // L = 1.068 sqrt(10,000 x 6.0) = 261.6 mm: k = 6 > 4 rows, one window per
        // column, 1 valid of 4 < 2: skipped.
        assert_eq!(a.windows.rows_per_window, 6);
        assert_eq!(a.windows.skipped, 1);
        assert_eq!((a.t1, a.t1_rule.is_none()), (None, true));
        assert_eq!(a.acceptable, None);
        assert_eq!(a.max_fill_height.kind, RuleKind::T2);
    }
}
