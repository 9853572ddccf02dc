//! Heat map of one grid scan of a local thin area: every cell coloured by its reading
//! on the viridis scale (thin dark, thick light), cells not measured hatched, pits
//! filled in their own colour and crossed (the method leaves pits out of t1 and t2, so
//! they are left out of the colour scale too), the cell of t2 ringed, and the t1
//! window and the critical window of the t1 rule outlined. Elevation runs up (the
//! grid's bottom row at the bottom), circumferential position across; cells are drawn
//! to scale where the grid fits.
//!
//! The colour scale: viridis (van der Walt and Smith, matplotlib 2.0, 2015), whose
//! lightness rises steadily from one end to the other, so that it reads in grey print
//! and for the common colour-vision deficiencies; plotters' `ViridisRGB` interpolates
//! eight of its published control points (#440154 ... #fde725). The unit test below
//! checks it against the published end and middle colours and that its luminance
//! rises.

use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, VPos};

use super::draw::{
    AXIS_SIZE, CellMark, Dash, DrawResult, LegendEntry, Marker, Pen, SIDE, SMALL_SIZE, Shape,
    Stroke, Swatch, TICK_SIZE, TITLE_HEIGHT, extent, figure_size, legend_below, palette::*,
    text_width, tick_format,
};
use super::{Figure, Inputs, WIDTH};
use crate::calc::area::{AreaAssessment, Window};
use crate::calc::units::Thickness;
use crate::report::verdict::scan_name;

/// The heat map of `Assessment::areas[area]`.
pub struct HeatMap<'a> {
    /// What every chart shares.
    pub inputs: Inputs<'a>,
    /// Index into `Assessment::areas`.
    pub area: usize,
}

/// Left of the grid: the elevation axis.
const LEFT: f64 = 84.0;
/// Below the grid: the position axis.
const BOTTOM: f64 = 58.0;
/// Above the grid: the column numbers.
const TOP: f64 = 30.0;
/// Right of the grid: row numbers, the colour bar and its labels.
const RIGHT: f64 = 215.0;
/// Largest grid, logical pixels.
const MAX_GRID_W: f64 = WIDTH as f64 - 2.0 * SIDE - LEFT - RIGHT;
const MAX_GRID_H: f64 = 620.0;
/// Cell size limits, logical pixels (a tiny grid is not blown up, a huge one is not
/// drawn in slivers thinner than this unless it must).
const MIN_CELL: f64 = 5.0;
const MAX_CELL: f64 = 56.0;
/// Least height of the colour bar.
const MIN_BAR_H: f64 = 220.0;
const BAR_W: f64 = 20.0;
/// From the grid's right edge to the colour bar.
const BAR_GAP: f64 = 46.0;

/// A cell not measured: a light fill with one diagonal line.
pub const EMPTY: Swatch = Swatch {
    fill: RGBColor(246, 246, 246),
    mark: CellMark::Diagonal,
    ink: GREY,
};
/// A pit: vermillion (a colour viridis does not hold) with a cross (for grey print).
pub const PIT: Swatch = Swatch {
    fill: VERMILLION,
    mark: CellMark::Cross,
    ink: INK,
};
const HALO: Stroke = Stroke::new(WHITE_RGB, 6.0, Dash::Solid);
const T1_WINDOW: Stroke = Stroke::new(INK, 2.6, Dash::Solid);
const CRITICAL: Stroke = Stroke::new(INK, 2.6, Dash::Short);
const CELL_EDGE: Stroke = Stroke::new(GREY, 1.0, Dash::Solid);
const WHITE_RGB: RGBColor = RGBColor(255, 255, 255);

/// The colour of thickness `t` on a scale from `lo` (darkest) to `hi` (lightest):
/// viridis. A value outside is held at the nearer end; an empty scale gives the
/// middle colour.
pub fn thickness_color(t: f64, lo: f64, hi: f64) -> RGBColor {
    let f = if hi > lo && t.is_finite() {
        ((t - lo) / (hi - lo)).clamp(0.0, 1.0)
    } else {
        0.5
    };
    ColorMap::<RGBColor, f64>::get_color(&ViridisRGB, f)
}

/// Positions and sizes, logical pixels.
#[derive(Debug, Clone, Copy)]
struct Layout {
    cell_w: f64,
    cell_h: f64,
    grid_w: f64,
    grid_h: f64,
    bar_h: f64,
    /// Height of the plot block (column numbers, grid, axis).
    block_h: f64,
}

impl HeatMap<'_> {
    fn area(&self) -> Option<&AreaAssessment> {
        self.inputs.a.areas.get(self.area)
    }

    fn layout(&self) -> Layout {
        let (rows, cols, rp, cp) = self.area().map_or((1, 1, 1.0, 1.0), |x| {
            let s = &x.scan;
            (
                s.rows().max(1),
                s.columns().max(1),
                s.row_pitch.0,
                s.column_pitch.0,
            )
        });
        let (rows, cols) = (rows as f64, cols as f64);
        let (rp, cp) = (positive(rp), positive(cp));
        // To scale: the same pixels per thickness unit across and up.
        let scale = (MAX_GRID_W / (cols * cp)).min(MAX_GRID_H / (rows * rp));
        let size = |pitch: f64, n: f64, most: f64| {
            (pitch * scale)
                .clamp(MIN_CELL, MAX_CELL)
                .min(most / n)
                .max(1.0)
        };
        let cell_w = size(cp, cols, MAX_GRID_W);
        let cell_h = size(rp, rows, MAX_GRID_H);
        let (grid_w, grid_h) = (cell_w * cols, cell_h * rows);
        let bar_h = grid_h.max(MIN_BAR_H);
        Layout {
            cell_w,
            cell_h,
            grid_w,
            grid_h,
            bar_h,
            block_h: TOP + (grid_h + BOTTOM).max(bar_h + 24.0),
        }
    }

    fn legend(&self) -> Vec<LegendEntry> {
        let Some(x) = self.area() else {
            return Vec::new();
        };
        let v = self.inputs.v;
        let mut e = vec![LegendEntry::swatch("not measured", EMPTY)];
        if let Some(p) = x.scan.pit_threshold {
            e.push(LegendEntry::swatch(
                format!(
                    "pit: reading below {} (left out of t1, t2 and the colour scale)",
                    v.thk_text(p)
                ),
                PIT,
            ));
        }
        e.push(LegendEntry::marker(
            format!(
                "t2 = {}: least reading, pits left out (row {}, column {})",
                v.thk_text(x.t2.value),
                x.t2.row + 1,
                x.t2.column + 1
            ),
            t2_marker(10.0),
        ));
        let t1 = x.t1_window();
        let critical = x.critical_window();
        if let Some(w) = t1 {
            let same = critical == Some(w);
            e.push(LegendEntry::line(
                format!(
                    "t1 window{}: least mean over L, {} ({})",
                    if same {
                        ", also the critical window of the t1 rule"
                    } else {
                        ""
                    },
                    v.thk_text(w.mean),
                    where_text(w)
                ),
                T1_WINDOW,
                None,
            ));
        }
        if let Some(w) = critical.filter(|w| Some(*w) != t1) {
            e.push(LegendEntry::line(
                format!(
                    "critical window of the t1 rule (least margin): mean {} ({})",
                    v.thk_text(w.mean),
                    where_text(w)
                ),
                CRITICAL,
                None,
            ));
        }
        e
    }
}

fn positive(x: f64) -> f64 {
    if x.is_finite() && x > 0.0 { x } else { 1.0 }
}

fn where_text(w: &Window) -> String {
    format!(
        "column {}, rows {}-{}",
        w.column + 1,
        w.first_row + 1,
        w.last_row() + 1
    )
}

fn t2_marker(size: f64) -> Marker {
    Marker::new(Shape::Circle, INK, false, size.clamp(3.0, 6.0))
}

/// The least of 1, 2, 5, 10, 20, 50, ... whose multiple of `cell` is at least `need`.
fn label_step(cell: f64, need: f64) -> usize {
    let mut base = 1usize;
    loop {
        for m in [1, 2, 5] {
            let step = base * m;
            if step as f64 * cell >= need || step >= 1_000_000 {
                return step;
            }
        }
        base *= 10;
    }
}

impl Figure for HeatMap<'_> {
    const ID: &'static str = "chart-scan";
    const TITLE: &'static str = "Local thin area: thickness over grid scan";

    fn size(&self) -> (u32, u32) {
        figure_size(self.layout().block_h, &self.legend())
    }

    fn draw<DB: DrawingBackend>(&self, pen: &Pen<DB>) -> DrawResult<DB> {
        let Some(x) = self.area() else {
            return Ok(());
        };
        let (a, v) = (self.inputs.a, self.inputs.v);
        let s = &x.scan;
        let units = a.tank.units;
        let (tu, lu) = (v.to.thickness_unit(), v.to.length_unit());
        pen.title(
            &format!("{} {}", Self::TITLE, self.area + 1),
            &format!(
                "{} · course {} · {} · {} rows × {} columns, {} × {} {tu} apart",
                scan_name(&s.file),
                s.course,
                s.date,
                s.rows(),
                s.columns(),
                trim(v.thk(s.row_pitch)),
                trim(v.thk(s.column_pitch)),
            ),
        )?;
        let l = self.layout();
        let (rows, cols) = (s.rows(), s.columns());
        if rows == 0 || cols == 0 {
            return Ok(());
        }
        let cp = v.thk(s.column_pitch);
        let rp_len = v.len(units.as_length(s.row_pitch));
        let z = |row: usize| v.len(s.row_elevation(row, units));
        let (x0, x1) = (-cp / 2.0, (cols as f64 - 0.5) * cp);
        let (y0, y1) = (z(0) - rp_len / 2.0, z(rows - 1) + rp_len / 2.0);
        let area = pen.area(
            SIDE,
            TITLE_HEIGHT,
            LEFT + l.grid_w + RIGHT,
            TOP + l.grid_h + BOTTOM,
        );
        let mut chart = ChartBuilder::on(&area)
            .margin_top(pen.s(TOP))
            .margin_right(pen.s(RIGHT))
            .x_label_area_size(pen.s(BOTTOM))
            .y_label_area_size(pen.s(LEFT))
            .build_cartesian_2d(x0..x1, y0..y1)?;
        let xfmt = tick_format(x1 - x0);
        let yfmt = tick_format(y1 - y0);
        // At most one position label per 50 logical pixels of grid.
        let x_labels = ((l.grid_w / 50.0) as usize).clamp(2, 10);
        chart
            .configure_mesh()
            .disable_x_mesh()
            .disable_y_mesh()
            .y_desc(format!("Elevation above the tank bottom ({lu})"))
            .label_style(pen.font(TICK_SIZE))
            .axis_desc_style(pen.font(AXIS_SIZE))
            .x_labels(x_labels)
            .y_labels(8)
            .x_label_formatter(&xfmt)
            .y_label_formatter(&yfmt)
            .axis_style(GREY)
            .set_all_tick_mark_size(pen.s(4.0))
            .draw()?;
        let plot = chart.plotting_area();
        let m = |xv: f64, yv: f64| plot.map_coordinate(&(xv, yv));
        // Cell corners: column c spans (c -+ 0.5) pitches, row r spans z(r) -+ pitch/2.
        let corners = |row: usize, col: usize, rows_up: usize| {
            let cx = col as f64 * cp;
            (
                m(cx - cp / 2.0, z(row + rows_up - 1) + rp_len / 2.0),
                m(cx + cp / 2.0, z(row) - rp_len / 2.0),
            )
        };
        let (lo, hi) = self.scale_range();
        for (row, cells) in s.cells.iter().enumerate() {
            for (col, cell) in cells.iter().enumerate() {
                let (p, q) = corners(row, col, 1);
                let sw = match cell {
                    None => EMPTY,
                    Some(t) if s.is_pit(*t) => PIT,
                    Some(t) => Swatch {
                        fill: thickness_color(v.thk(*t), lo, hi),
                        mark: CellMark::Plain,
                        ink: INK,
                    },
                };
                // Interior cells reach under their right and lower neighbours.
                let bleed = (i32::from(col + 1 < cols), i32::from(row > 0));
                pen.cell(p, q, &sw, bleed)?;
            }
        }
        let (tl, br) = (m(x0, y1), m(x1, y0));
        pen.rect(tl, br, None, Some(&CELL_EDGE))?;
        // The position axis's title under the grid, kept on the picture when the grid
        // is narrower than the title.
        let desc = format!("Circumferential position from the first column ({tu})");
        let desc_w = text_width(&desc, AXIS_SIZE);
        let centre = f64::from(tl.0 + br.0) / 2.0 / pen.k;
        pen.text(
            &desc,
            (centre - desc_w / 2.0).max(SIDE + 4.0),
            f64::from(br.1) / pen.k + BOTTOM - 8.0,
            AXIS_SIZE,
            INK,
            (HPos::Left, VPos::Bottom),
        )?;
        // t2, ringed.
        let ring = t2_marker(l.cell_w.min(l.cell_h) * 0.3);
        let (p, q) = corners(x.t2.row, x.t2.column, 1);
        pen.marker(((p.0 + q.0) / 2, (p.1 + q.1) / 2), &ring)?;
        // The windows: a white halo under a black outline, so they show on every colour.
        let t1 = x.t1_window();
        let critical = x.critical_window().filter(|w| Some(*w) != t1);
        // The critical window is drawn a little inside its cells, so that where it
        // shares a column with the t1 window both outlines show.
        for (w, stroke, inset) in [(t1, &T1_WINDOW, 0.0), (critical, &CRITICAL, 5.0)] {
            if let Some(w) = w {
                let (p, q) = corners(w.first_row, w.column, w.rows);
                let d = pen.s(inset);
                let (p, q) = ((p.0 + d, p.1 + d), (q.0 - d, q.1 - d));
                pen.rect(p, q, None, Some(&HALO))?;
                pen.rect(p, q, None, Some(stroke))?;
            }
        }
        // Column numbers above the grid, row numbers right of it.
        let col_step = label_step(l.cell_w, 24.0);
        let (gx0, gy0) = tl;
        let (gx1, gy1) = br;
        pen.text_px(
            "column",
            (gx0 - pen.s(8.0), gy0 - pen.s(6.0)),
            SMALL_SIZE,
            GREY,
            (HPos::Right, VPos::Bottom),
        )?;
        for col in (0..cols).filter(|c| (c + 1) % col_step == 0 || *c == 0) {
            let cx = m(col as f64 * cp, y1).0;
            pen.text_px(
                &(col + 1).to_string(),
                (cx, gy0 - pen.s(6.0)),
                SMALL_SIZE,
                GREY,
                (HPos::Center, VPos::Bottom),
            )?;
        }
        let row_step = label_step(l.cell_h, 17.0);
        pen.text_px(
            "row",
            (gx1 + pen.s(6.0), gy0 - pen.s(6.0)),
            SMALL_SIZE,
            GREY,
            (HPos::Left, VPos::Bottom),
        )?;
        for row in (0..rows).filter(|r| (r + 1) % row_step == 0 || *r == 0) {
            let cy = m(x1, z(row)).1;
            pen.text_px(
                &(row + 1).to_string(),
                (gx1 + pen.s(6.0), cy),
                SMALL_SIZE,
                GREY,
                (HPos::Left, VPos::Center),
            )?;
        }
        let _ = gy1;
        self.colour_bar(pen, &l, (lo, hi), gx1, gy0)?;
        legend_below(pen, &self.legend(), l.block_h)
    }
}

impl HeatMap<'_> {
    /// The colour scale's range: the least and greatest reading that is not a pit, in
    /// display units (a scale of one value is widened so that it has a span).
    fn scale_range(&self) -> (f64, f64) {
        let Some(x) = self.area() else {
            return (0.0, 1.0);
        };
        let v = self.inputs.v;
        let s = &x.scan;
        let values: Vec<f64> = s
            .cells
            .iter()
            .flatten()
            .flatten()
            .filter(|t| !s.is_pit(**t))
            .map(|t| v.thk(*t))
            .collect();
        let (lo, hi) = extent(&values);
        if !(lo.is_finite() && hi.is_finite()) {
            return (0.0, 1.0);
        }
        if hi > lo {
            (lo, hi)
        } else {
            let pad = (lo.abs() * 0.01).max(v.thk(Thickness(0.0)) + 1e-3);
            (lo - pad, hi + pad)
        }
    }

    /// The colour bar right of the grid, its tick labels and its unit.
    fn colour_bar<DB: DrawingBackend>(
        &self,
        pen: &Pen<DB>,
        l: &Layout,
        (lo, hi): (f64, f64),
        grid_right_px: i32,
        grid_top_px: i32,
    ) -> DrawResult<DB> {
        let v = self.inputs.v;
        let bx = f64::from(grid_right_px) / pen.k + BAR_GAP;
        let by = f64::from(grid_top_px) / pen.k;
        let area = pen.area(bx, by, BAR_W + 80.0, l.bar_h);
        let mut bar = ChartBuilder::on(&area)
            .right_y_label_area_size(pen.s(80.0))
            .build_cartesian_2d(0.0..1.0, lo..hi)?;
        let fmt = tick_format(hi - lo);
        bar.configure_mesh()
            .disable_x_mesh()
            .disable_y_mesh()
            .disable_x_axis()
            .label_style(pen.font(TICK_SIZE))
            .y_labels(7)
            .y_label_formatter(&fmt)
            .axis_style(GREY)
            .set_all_tick_mark_size(pen.s(4.0))
            .draw()?;
        let plot = bar.plotting_area();
        let m = |x: f64, y: f64| plot.map_coordinate(&(x, y));
        const STRIPS: usize = 96;
        for i in 0..STRIPS {
            let (a, b) = (i as f64 / STRIPS as f64, (i + 1) as f64 / STRIPS as f64);
            let t = lo + (hi - lo) * (a + b) / 2.0;
            let swatch = Swatch {
                fill: thickness_color(t, lo, hi),
                mark: CellMark::Plain,
                ink: INK,
            };
            pen.cell(
                m(0.0, lo + (hi - lo) * b),
                m(1.0, lo + (hi - lo) * a),
                &swatch,
                (0, i32::from(i > 0)),
            )?;
        }
        pen.rect(m(0.0, hi), m(1.0, lo), None, Some(&CELL_EDGE))?;
        pen.text(
            &format!("thickness ({})", v.to.thickness_unit()),
            bx,
            by - 14.0,
            SMALL_SIZE,
            INK,
            (HPos::Left, VPos::Bottom),
        )
    }
}

/// A pitch without trailing zeros (50, 0.5, 1.25).
fn trim(x: f64) -> String {
    let s = format!("{x:.3}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    s.to_string()
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The colour scale against the published viridis colours (matplotlib's
    /// `_viridis_data`, van der Walt and Smith 2015): #440154 at 0, #21918c at 0.5,
    /// #fde725 at 1; plotters interpolates eight control points, so within 2 per
    /// channel. Its relative luminance (ITU-R BT.709 weights 0.2126, 0.7152, 0.0722)
    /// rises at every step of 1/40, so thicker always prints lighter in grey.
    #[test]
    fn viridis_scale_is_the_published_one_and_reads_in_grey() {
        let near = |c: RGBColor, hex: [u8; 3]| {
            (c.0.abs_diff(hex[0]) <= 2)
                && (c.1.abs_diff(hex[1]) <= 2)
                && (c.2.abs_diff(hex[2]) <= 2)
        };
        assert!(near(thickness_color(10.0, 10.0, 20.0), [0x44, 0x01, 0x54]));
        assert!(near(thickness_color(15.0, 10.0, 20.0), [0x21, 0x91, 0x8c]));
        assert!(near(thickness_color(20.0, 10.0, 20.0), [0xfd, 0xe7, 0x25]));
        let lum = |c: RGBColor| {
            0.2126 * f64::from(c.0) + 0.7152 * f64::from(c.1) + 0.0722 * f64::from(c.2)
        };
        let mut last = -1.0;
        for i in 0..=40 {
            let l = lum(thickness_color(f64::from(i), 0.0, 40.0));
            assert!(l > last, "step {i}: {l} after {last}");
            last = l;
        }
        // Outside the range: held at the ends; an empty range: the middle; never a panic.
        assert_eq!(
            thickness_color(5.0, 10.0, 20.0),
            thickness_color(10.0, 10.0, 20.0)
        );
        assert_eq!(
            thickness_color(12.0, 12.0, 12.0),
            thickness_color(0.5, 0.0, 1.0)
        );
        assert_eq!(
            thickness_color(f64::NAN, 0.0, 1.0),
            thickness_color(0.5, 0.0, 1.0)
        );
    }

    #[test]
    fn label_steps() {
        assert_eq!(label_step(30.0, 24.0), 1);
        assert_eq!(label_step(15.0, 24.0), 2);
        assert_eq!(label_step(6.0, 24.0), 5);
        assert_eq!(label_step(2.0, 24.0), 20);
    }
}
