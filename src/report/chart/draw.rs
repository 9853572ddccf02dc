//! Drawing helpers shared by the charts: the embedded font, the palette, strokes and
//! markers, a legend laid out below the plot, labels kept apart in a margin. Layout
//! is in logical pixels (the SVG's); `Pen::s` scales to the backend (2 for the PNG).

use std::sync::OnceLock;

use chrono::{Datelike, NaiveDate};
use plotters::chart::MeshStyle;
use plotters::coord::Shift;
use plotters::coord::ranged1d::ValueFormatter;
use plotters::coord::types::RangedCoordf64;
use plotters::element::DashedPathElement;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, Pos, VPos};

use crate::calc::units::{Length, Thickness};
use crate::report::view::View;

/// The embedded font: DejaVu Sans 2.37 (Bitstream Vera licence, see
/// src/report/fonts/LICENSE-DejaVu.txt).
static FONT: &[u8] = include_bytes!("../fonts/DejaVuSans.ttf");

/// The font family every text of a chart uses. plotters measures (SVG) and draws
/// (PNG) with the embedded font registered under this name; in an SVG shown by a
/// browser the name is a CSS font list, so a browser without DejaVu Sans uses a
/// font of similar width.
pub const FAMILY: &str = "DejaVu Sans, Verdana, sans-serif";

/// Registers the embedded font for every style used, once, before any drawing.
pub fn register_font() -> Result<(), String> {
    static DONE: OnceLock<Result<(), String>> = OnceLock::new();
    DONE.get_or_init(|| {
        for style in [FontStyle::Normal, FontStyle::Bold] {
            plotters::style::register_font(FAMILY, style, FONT)
                .map_err(|_| "the embedded chart font cannot be read".to_string())?;
        }
        Ok(())
    })
    .clone()
}

/// Okabe and Ito (2008), "Color Universal Design": eight colours told apart with
/// every common colour-vision deficiency. Yellow is left out (too light on white).
pub mod palette {
    use plotters::style::RGBColor;
    /// Black.
    pub const INK: RGBColor = RGBColor(0, 0, 0);
    /// Orange.
    pub const ORANGE: RGBColor = RGBColor(230, 159, 0);
    /// Sky blue.
    pub const SKY: RGBColor = RGBColor(86, 180, 233);
    /// Bluish green.
    pub const BLUISH_GREEN: RGBColor = RGBColor(0, 158, 115);
    /// Blue.
    pub const DEEP_BLUE: RGBColor = RGBColor(0, 114, 178);
    /// Vermillion: limits (t_min, the operating level) and suspect readings.
    pub const VERMILLION: RGBColor = RGBColor(213, 94, 0);
    /// Reddish purple.
    pub const PURPLE: RGBColor = RGBColor(204, 121, 167);
    /// Mid grey: secondary lines and text.
    pub const GREY: RGBColor = RGBColor(110, 110, 110);
    /// Light grey: individual readings, course boundaries.
    pub const LIGHT: RGBColor = RGBColor(175, 175, 175);
    /// Grid lines.
    pub const GRID: RGBColor = RGBColor(232, 232, 232);
}
use palette::*;

/// Dash pattern of a line (tells series apart in grey print).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Dash {
    /// Continuous.
    Solid,
    /// Long dashes.
    Long,
    /// Short dashes.
    Short,
    /// Dots.
    Dot,
}

/// How a line is drawn.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Stroke {
    /// Colour.
    pub color: RGBColor,
    /// Width, logical pixels.
    pub width: f64,
    /// Dash pattern.
    pub dash: Dash,
}

impl Stroke {
    /// A stroke.
    pub const fn new(color: RGBColor, width: f64, dash: Dash) -> Self {
        Stroke { color, width, dash }
    }
}

/// Marker shapes.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Shape {
    /// Circle.
    Circle,
    /// Square.
    Square,
    /// Triangle, point up.
    Triangle,
    /// Diamond.
    Diamond,
    /// Diagonal cross.
    Cross,
}

/// A point marker.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Marker {
    /// Shape.
    pub shape: Shape,
    /// Colour.
    pub color: RGBColor,
    /// Filled, or outlined on white.
    pub filled: bool,
    /// Half-width, logical pixels.
    pub size: f64,
    /// An outlined marker hides what lies under it (white inside); off for dense
    /// point clouds, where overlapping outlines should stay visible.
    pub knockout: bool,
}

impl Marker {
    /// A marker.
    pub const fn new(shape: Shape, color: RGBColor, filled: bool, size: f64) -> Self {
        Marker {
            shape,
            color,
            filled,
            size,
            knockout: true,
        }
    }
    /// The same marker, outlined without a white inside.
    pub const fn see_through(self) -> Self {
        Marker {
            knockout: false,
            ..self
        }
    }
}

/// The look of the n-th course's line where many courses share a chart: colour,
/// dash and marker all change, so each course reads in colour and in grey.
pub fn course_look(index: usize) -> (Stroke, Marker) {
    const COLORS: [RGBColor; 6] = [DEEP_BLUE, ORANGE, BLUISH_GREEN, PURPLE, SKY, GREY];
    const DASHES: [Dash; 4] = [Dash::Solid, Dash::Long, Dash::Short, Dash::Dot];
    const SHAPES: [Shape; 5] = [
        Shape::Circle,
        Shape::Square,
        Shape::Triangle,
        Shape::Diamond,
        Shape::Cross,
    ];
    let color = COLORS[index % COLORS.len()];
    (
        Stroke::new(color, 2.0, DASHES[index % DASHES.len()]),
        Marker::new(
            SHAPES[index % SHAPES.len()],
            color,
            index.is_multiple_of(2),
            4.5,
        ),
    )
}

/// The drawing result of a backend.
pub type DrawResult<DB> = Result<(), DrawingAreaErrorKind<<DB as DrawingBackend>::ErrorType>>;

/// A font of the chart family at a logical size.
pub fn font(size: f64) -> FontDesc<'static> {
    FontDesc::new(FontFamily::Name(FAMILY), size, FontStyle::Normal)
}

/// Width of `text` at logical `size`, logical pixels (measured with the embedded font).
pub fn text_width(text: &str, size: f64) -> f64 {
    font(size)
        .box_size(text)
        .map_or(text.len() as f64 * size * 0.6, |(w, _)| f64::from(w))
}

/// Decimal year of a date, for time axes: year + days into the year / days in it.
pub fn year_of(d: NaiveDate) -> f64 {
    let days = if d.leap_year() { 366.0 } else { 365.0 };
    f64::from(d.year()) + f64::from(d.ordinal0()) / days
}

/// Draws on a whole backend area in logical pixels scaled by `k`.
pub struct Pen<'a, DB: DrawingBackend> {
    /// The whole picture.
    pub root: &'a DrawingArea<DB, Shift>,
    /// Backend pixels per logical pixel.
    pub k: f64,
}

impl<DB: DrawingBackend> Pen<'_, DB> {
    /// Logical to backend pixels.
    pub fn s(&self, x: f64) -> i32 {
        (x * self.k).round() as i32
    }
    /// A logical point in backend pixels.
    pub fn p(&self, x: f64, y: f64) -> (i32, i32) {
        (self.s(x), self.s(y))
    }
    /// A font at logical size, scaled.
    pub fn font(&self, size: f64) -> FontDesc<'static> {
        font(size * self.k)
    }
    /// The area of a logical rectangle, for a plotters chart.
    pub fn area(&self, x: f64, y: f64, w: f64, h: f64) -> DrawingArea<DB, Shift> {
        self.root.clone().shrink(
            (self.s(x), self.s(y)),
            (self.s(w).max(1) as u32, self.s(h).max(1) as u32),
        )
    }
    /// The area of a plot of logical height `h` across the whole chart, below the
    /// title block.
    pub fn plot_area(&self, h: f64) -> DrawingArea<DB, Shift> {
        self.area(SIDE, TITLE_HEIGHT, f64::from(super::WIDTH) - 2.0 * SIDE, h)
    }
    /// Text at a backend position.
    pub fn text_px(
        &self,
        text: &str,
        at: (i32, i32),
        size: f64,
        color: RGBColor,
        anchor: (HPos, VPos),
    ) -> DrawResult<DB> {
        let style = self
            .font(size)
            .color(&color)
            .pos(Pos::new(anchor.0, anchor.1));
        self.root.draw_text(text, &style, at)
    }
    /// Text at a logical position.
    pub fn text(
        &self,
        text: &str,
        x: f64,
        y: f64,
        size: f64,
        color: RGBColor,
        anchor: (HPos, VPos),
    ) -> DrawResult<DB> {
        self.text_px(text, self.p(x, y), size, color, anchor)
    }
    /// A polyline through backend points.
    pub fn line(&self, points: &[(i32, i32)], stroke: &Stroke) -> DrawResult<DB> {
        if points.len() < 2 {
            return Ok(());
        }
        let style = ShapeStyle {
            color: stroke.color.to_rgba(),
            filled: false,
            stroke_width: self.s(stroke.width).max(1) as u32,
        };
        let (on, off) = match stroke.dash {
            Dash::Solid => return self.root.draw(&PathElement::new(points.to_vec(), style)),
            Dash::Long => (10.0, 6.0),
            Dash::Short => (4.5, 4.0),
            Dash::Dot => (1.5, 4.0),
        };
        self.root.draw(&DashedPathElement::new(
            points.iter().copied(),
            self.s(on).max(1),
            self.s(off).max(1),
            style,
        ))
    }
    /// A marker centred on a backend point.
    pub fn marker(&self, at: (i32, i32), m: &Marker) -> DrawResult<DB> {
        let r = f64::from(self.s(m.size).max(1));
        let (x, y) = (f64::from(at.0), f64::from(at.1));
        let pt = |dx: f64, dy: f64| ((x + dx).round() as i32, (y + dy).round() as i32);
        let outline = ShapeStyle {
            color: m.color.to_rgba(),
            filled: false,
            stroke_width: self.s(1.6).max(1) as u32,
        };
        let fill = if m.filled {
            Some(m.color.filled())
        } else if m.knockout {
            Some(WHITE.filled())
        } else {
            None
        };
        let corners: Vec<(i32, i32)> = match m.shape {
            Shape::Circle => {
                let r = r as i32;
                if let Some(fill) = fill {
                    self.root.draw(&Circle::new(at, r, fill))?;
                }
                return self.root.draw(&Circle::new(at, r, outline));
            }
            Shape::Cross => {
                let c = r * 0.9;
                self.root
                    .draw(&PathElement::new(vec![pt(-c, -c), pt(c, c)], outline))?;
                return self
                    .root
                    .draw(&PathElement::new(vec![pt(-c, c), pt(c, -c)], outline));
            }
            Shape::Square => {
                let c = r * 0.85;
                vec![pt(-c, -c), pt(c, -c), pt(c, c), pt(-c, c)]
            }
            Shape::Triangle => vec![
                pt(0.0, -r * 1.2),
                pt(r * 1.05, r * 0.8),
                pt(-r * 1.05, r * 0.8),
            ],
            Shape::Diamond => vec![
                pt(0.0, -r * 1.25),
                pt(r, 0.0),
                pt(0.0, r * 1.25),
                pt(-r, 0.0),
            ],
        };
        if let Some(fill) = fill {
            self.root.draw(&Polygon::new(corners.clone(), fill))?;
        }
        let mut closed = corners.clone();
        closed.push(corners[0]);
        self.root.draw(&PathElement::new(closed, outline))
    }
    /// A filled or outlined rectangle between two backend corners.
    pub fn rect(
        &self,
        a: (i32, i32),
        b: (i32, i32),
        fill: Option<RGBColor>,
        stroke: Option<&Stroke>,
    ) -> DrawResult<DB> {
        if let Some(c) = fill {
            self.root.draw(&Rectangle::new([a, b], c.filled()))?;
        }
        if let Some(s) = stroke {
            self.line(&[a, (b.0, a.1), b, (a.0, b.1), a], s)?;
        }
        Ok(())
    }
    /// A heat-map cell between two backend corners: its fill and its mark. `bleed`
    /// (backend pixels) widens the fill to the right and downwards, under the next
    /// cell, so that no seam of background shows between neighbours where a browser
    /// scales the SVG; the mark keeps to the cell.
    pub fn cell(
        &self,
        a: (i32, i32),
        b: (i32, i32),
        sw: &Swatch,
        bleed: (i32, i32),
    ) -> DrawResult<DB> {
        let (x0, x1) = (a.0.min(b.0), a.0.max(b.0));
        let (y0, y1) = (a.1.min(b.1), a.1.max(b.1));
        self.root.draw(&Rectangle::new(
            [(x0, y0), (x1 + bleed.0, y1 + bleed.1)],
            sw.fill.filled(),
        ))?;
        // The mark keeps off the cell's edges, so neighbouring marks stay apart.
        let inset = ((x1 - x0).min(y1 - y0) / 5).max(1);
        let (x0, x1, y0, y1) = (x0 + inset, x1 - inset, y0 + inset, y1 - inset);
        match sw.mark {
            CellMark::Plain => Ok(()),
            CellMark::Diagonal => self.line(
                &[(x0, y1), (x1, y0)],
                &Stroke::new(sw.ink, 1.2, Dash::Solid),
            ),
            CellMark::Cross => {
                let s = Stroke::new(sw.ink, 2.2, Dash::Solid);
                self.line(&[(x0, y0), (x1, y1)], &s)?;
                self.line(&[(x0, y1), (x1, y0)], &s)
            }
        }
    }
    /// The chart's title and its second line, top left.
    pub fn title(&self, title: &str, subtitle: &str) -> DrawResult<DB> {
        self.text(title, 14.0, 10.0, TITLE_SIZE, INK, (HPos::Left, VPos::Top))?;
        self.text(
            subtitle,
            14.0,
            36.0,
            SMALL_SIZE,
            GREY,
            (HPos::Left, VPos::Top),
        )
    }
}

/// Left and right margin of a chart's plot, logical pixels.
pub const SIDE: f64 = 10.0;

/// Left edge of the legend, logical pixels.
pub const LEGEND_X: f64 = 18.0;

/// Width of the legend, logical pixels.
pub fn legend_width() -> f64 {
    f64::from(super::WIDTH) - 2.0 * LEGEND_X
}

/// Logical height of the title block.
pub const TITLE_HEIGHT: f64 = 62.0;
/// Title size.
pub const TITLE_SIZE: f64 = 21.0;
/// Axis tick label size.
pub const TICK_SIZE: f64 = 15.0;
/// Axis title size.
pub const AXIS_SIZE: f64 = 16.0;
/// Legend and annotation size.
pub const LABEL_SIZE: f64 = 15.0;
/// Secondary text size.
pub const SMALL_SIZE: f64 = 14.0;

/// What is drawn over a filled cell of a heat map.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum CellMark {
    /// Nothing.
    Plain,
    /// One diagonal line, bottom left to top right (a cell not measured).
    Diagonal,
    /// A bold diagonal cross (a pit).
    Cross,
}

/// A filled cell of a heat map, or its legend sample.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Swatch {
    /// Fill.
    pub fill: RGBColor,
    /// Mark over the fill.
    pub mark: CellMark,
    /// Colour of the mark.
    pub ink: RGBColor,
}

/// One legend entry: a sample of the line and/or marker, and its label.
#[derive(Debug, Clone, PartialEq)]
pub struct LegendEntry {
    /// Label.
    pub label: String,
    /// Line sample, if the series is a line.
    pub stroke: Option<Stroke>,
    /// Marker sample, if the series has markers.
    pub marker: Option<Marker>,
    /// A vertical line sample (a date marked on a time axis).
    pub vertical: bool,
    /// A filled cell sample (heat maps).
    pub swatch: Option<Swatch>,
}

impl LegendEntry {
    /// A line (with an optional marker).
    pub fn line(label: impl Into<String>, stroke: Stroke, marker: Option<Marker>) -> Self {
        LegendEntry {
            label: label.into(),
            stroke: Some(stroke),
            marker,
            vertical: false,
            swatch: None,
        }
    }
    /// A marker alone.
    pub fn marker(label: impl Into<String>, marker: Marker) -> Self {
        LegendEntry {
            label: label.into(),
            stroke: None,
            marker: Some(marker),
            vertical: false,
            swatch: None,
        }
    }
    /// A vertical line (a date).
    pub fn vertical(label: impl Into<String>, stroke: Stroke) -> Self {
        LegendEntry {
            label: label.into(),
            stroke: Some(stroke),
            marker: None,
            vertical: true,
            swatch: None,
        }
    }
    /// A filled cell (heat maps), with an optional outline sample around it.
    pub fn swatch(label: impl Into<String>, swatch: Swatch) -> Self {
        LegendEntry {
            label: label.into(),
            stroke: None,
            marker: None,
            vertical: false,
            swatch: Some(swatch),
        }
    }
}

const SAMPLE_W: f64 = 40.0;
const SAMPLE_GAP: f64 = 8.0;
const ENTRY_GAP: f64 = 24.0;
const ROW_H: f64 = 25.0;

/// Where each legend entry goes: its column and row on a grid of equal columns, and
/// how many columns it spans.
#[derive(Debug, Clone, PartialEq)]
pub struct LegendGrid {
    /// Number of columns.
    pub cols: usize,
    /// (column, row, span) of each entry.
    pub cells: Vec<(usize, usize, usize)>,
    /// Number of rows.
    pub rows: usize,
}

impl LegendGrid {
    /// Logical height.
    pub fn height(&self) -> f64 {
        self.rows as f64 * ROW_H + 10.0
    }
}

/// Lays a legend out `width` wide: entries in reading order on a grid of 1 to 4 equal
/// columns, a long entry spanning as many columns as it needs; the column count that
/// needs the fewest rows wins (the fewer columns on a tie).
pub fn legend_layout(entries: &[LegendEntry], width: f64) -> LegendGrid {
    let widths: Vec<f64> = entries
        .iter()
        .map(|e| SAMPLE_W + SAMPLE_GAP + text_width(&e.label, LABEL_SIZE) + ENTRY_GAP)
        .collect();
    let mut best: Option<LegendGrid> = None;
    for cols in 1..=4usize {
        let col_w = width / cols as f64;
        let mut cells = Vec::with_capacity(entries.len());
        let (mut col, mut row) = (0usize, 0usize);
        for w in &widths {
            let span = ((w / col_w).ceil() as usize).clamp(1, cols);
            if col + span > cols {
                col = 0;
                row += 1;
            }
            cells.push((col, row, span));
            col += span;
        }
        let rows = if entries.is_empty() { 0 } else { row + 1 };
        if best.as_ref().is_none_or(|b| rows < b.rows) {
            best = Some(LegendGrid { cols, cells, rows });
        }
    }
    best.unwrap_or(LegendGrid {
        cols: 1,
        cells: Vec::new(),
        rows: 0,
    })
}

/// Draws a legend in the logical box (x, y, width): a frame-less grid below the plot.
pub fn draw_legend<DB: DrawingBackend>(
    pen: &Pen<DB>,
    entries: &[LegendEntry],
    x: f64,
    y: f64,
    width: f64,
) -> DrawResult<DB> {
    let grid = legend_layout(entries, width);
    let col_w = width / grid.cols as f64;
    for (e, &(col, row, _)) in entries.iter().zip(&grid.cells) {
        let ex = x + col as f64 * col_w;
        let ey = y + 5.0 + row as f64 * ROW_H + ROW_H / 2.0;
        if let Some(sw) = &e.swatch {
            let mid = ex + SAMPLE_W / 2.0;
            pen.cell(
                pen.p(mid - 9.0, ey - 9.0),
                pen.p(mid + 9.0, ey + 9.0),
                sw,
                (0, 0),
            )?;
            pen.rect(
                pen.p(mid - 9.0, ey - 9.0),
                pen.p(mid + 9.0, ey + 9.0),
                None,
                Some(&Stroke::new(GREY, 1.0, Dash::Solid)),
            )?;
        }
        if let Some(s) = &e.stroke {
            if e.vertical {
                let mid = ex + SAMPLE_W / 2.0;
                pen.line(&[pen.p(mid, ey - 9.0), pen.p(mid, ey + 9.0)], s)?;
            } else {
                pen.line(&[pen.p(ex, ey), pen.p(ex + SAMPLE_W, ey)], s)?;
            }
        }
        if let Some(m) = &e.marker {
            pen.marker(pen.p(ex + SAMPLE_W / 2.0, ey), m)?;
        }
        pen.text(
            &e.label,
            ex + SAMPLE_W + SAMPLE_GAP,
            ey,
            LABEL_SIZE,
            INK,
            (HPos::Left, VPos::Center),
        )?;
    }
    Ok(())
}

/// A chart's logical size: the whole width; the title block, a plot `plot_h` high
/// and the legend below it.
pub fn figure_size(plot_h: f64, legend: &[LegendEntry]) -> (u32, u32) {
    let legend_h = legend_layout(legend, legend_width()).height();
    (
        super::WIDTH,
        (TITLE_HEIGHT + plot_h + legend_h + 8.0).ceil() as u32,
    )
}

/// Draws the legend below a plot `plot_h` high (see [`figure_size`]).
pub fn legend_below<DB: DrawingBackend>(
    pen: &Pen<DB>,
    legend: &[LegendEntry],
    plot_h: f64,
) -> DrawResult<DB> {
    draw_legend(pen, legend, LEGEND_X, TITLE_HEIGHT + plot_h, legend_width())
}

/// The mesh of a chart, styled as every chart's: tick labels and axis titles in the
/// chart font, grid lines at the labelled ticks only, grey axes, short ticks. The
/// caller adds what differs (axis titles, label counts and formats, meshes left out)
/// and draws it.
pub fn mesh<'a, 'b, X, Y, XT, YT, DB>(
    pen: &Pen<DB>,
    chart: &'b mut ChartContext<'a, DB, Cartesian2d<X, Y>>,
) -> MeshStyle<'a, 'b, X, Y, DB>
where
    X: Ranged<ValueType = XT> + ValueFormatter<XT>,
    Y: Ranged<ValueType = YT> + ValueFormatter<YT>,
    DB: DrawingBackend,
{
    let mut mesh = chart.configure_mesh();
    mesh.label_style(pen.font(TICK_SIZE))
        .axis_desc_style(pen.font(AXIS_SIZE))
        .light_line_style(WHITE)
        .bold_line_style(GRID)
        .axis_style(GREY)
        .set_all_tick_mark_size(pen.s(4.0));
    mesh
}

/// Tick labels over a span, with decimals enough that neighbouring ticks differ.
pub fn tick_format(span: f64) -> impl Fn(&f64) -> String {
    let decimals = tick_decimals(span);
    move |t: &f64| format!("{t:.decimals$}")
}

/// Decimals for tick labels over a span, so neighbouring ticks differ.
fn tick_decimals(span: f64) -> usize {
    if !(span.is_finite() && span > 0.0) {
        return 1;
    }
    let step = span / 6.0;
    (-(step.log10().floor())).clamp(0.0, 4.0) as usize
}

/// Small multiples: `count` panels `height` high below the title block, one column
/// for a single panel, else two.
#[derive(Debug, Clone, Copy)]
pub struct Panels {
    /// Number of panels.
    pub count: usize,
    /// Logical height of a panel.
    pub height: f64,
}

/// Logical height of a panel's caption.
const CAPTION_H: f64 = 28.0;

impl Panels {
    fn columns(&self) -> usize {
        if self.count <= 1 { 1 } else { 2 }
    }
    /// Logical height of all the panels (at least one row).
    pub fn plot_h(&self) -> f64 {
        self.count.div_ceil(self.columns()).max(1) as f64 * self.height
    }
    /// The logical box (x, y, width) of panel `i`, in reading order.
    pub fn cell(&self, i: usize) -> (f64, f64, f64) {
        let cols = self.columns();
        let w = (f64::from(super::WIDTH) - 2.0 * SIDE) / cols as f64;
        (
            SIDE + (i % cols) as f64 * w,
            TITLE_HEIGHT + (i / cols) as f64 * self.height,
            w,
        )
    }
    /// Draws a panel's caption at the top of its box and returns the area of its plot
    /// below.
    pub fn panel<DB: DrawingBackend>(
        &self,
        pen: &Pen<DB>,
        (x, y, w): (f64, f64, f64),
        caption: &str,
    ) -> Result<DrawingArea<DB, Shift>, DrawingAreaErrorKind<DB::ErrorType>> {
        pen.text(
            caption,
            x + 12.0,
            y + 6.0,
            LABEL_SIZE,
            INK,
            (HPos::Left, VPos::Top),
        )?;
        Ok(pen.area(x, y + CAPTION_H, w, self.height - CAPTION_H - 6.0))
    }
}

/// One course on an elevation axis, display units.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CourseSpan {
    /// Course number.
    pub number: u32,
    /// Elevation of its bottom.
    pub bottom: f64,
    /// Its height.
    pub height: f64,
}

impl CourseSpan {
    /// The elevation a fraction `f` of the course's height above its bottom.
    pub fn at(&self, f: f64) -> f64 {
        self.bottom + self.height * f
    }
    /// The elevation of its top.
    pub fn top(&self) -> f64 {
        self.bottom + self.height
    }
    /// The elevation of its middle.
    pub fn mid(&self) -> f64 {
        self.bottom + self.height / 2.0
    }
}

/// The liquid below the level, shaded.
const LIQUID: RGBColor = RGBColor(232, 243, 251);
/// The top of each course.
const BOUNDARY: Stroke = Stroke::new(LIGHT, 1.0, Dash::Solid);
/// The liquid level line.
pub const LIQUID_LEVEL: Stroke = Stroke::new(SKY, 2.6, Dash::Long);
/// Right margin of an elevation plot (course and level labels), logical pixels.
const ELEVATION_RIGHT: f64 = 190.0;

/// The plot of a thickness-against-elevation chart (shell profile, design check):
/// thickness across from 0, elevation up from the tank bottom, the courses and a
/// liquid level.
pub struct ElevationPlot<DB: DrawingBackend> {
    plot: DrawingArea<DB, Cartesian2d<RangedCoordf64, RangedCoordf64>>,
    courses: Vec<CourseSpan>,
    x1: f64,
    y1: f64,
    level: f64,
}

impl<DB: DrawingBackend> ElevationPlot<DB> {
    /// Draws the axes (thickness 0 to `x1`, elevation 0 to `y1`, display units) on a
    /// plot `plot_h` high below the title, the liquid below `level` shaded and the
    /// top of each course as a thin line. `courses`: each course's number, bottom
    /// elevation and height, bottom first.
    pub fn draw(
        pen: &Pen<DB>,
        v: &View,
        courses: impl IntoIterator<Item = (u32, Length, Length)>,
        (x1, y1): (f64, f64),
        level: f64,
        plot_h: f64,
    ) -> Result<Self, DrawingAreaErrorKind<DB::ErrorType>> {
        let courses = courses
            .into_iter()
            .map(|(number, bottom, height)| CourseSpan {
                number,
                bottom: v.len(bottom),
                height: v.len(height),
            })
            .collect();
        let area = pen.plot_area(plot_h);
        let mut chart = ChartBuilder::on(&area)
            .margin_right(pen.s(ELEVATION_RIGHT))
            .margin_top(pen.s(6.0))
            .x_label_area_size(pen.s(50.0))
            .y_label_area_size(pen.s(76.0))
            .build_cartesian_2d(0.0..x1, 0.0..y1)?;
        let xfmt = tick_format(x1);
        let yfmt = tick_format(y1);
        mesh(pen, &mut chart)
            .x_desc(format!("Thickness ({})", v.to.thickness_unit()))
            .y_desc(format!(
                "Elevation above the tank bottom ({})",
                v.to.length_unit()
            ))
            .x_labels(10)
            .y_labels(10)
            .x_label_formatter(&xfmt)
            .y_label_formatter(&yfmt)
            .draw()?;
        let e = ElevationPlot {
            plot: chart.plotting_area().clone(),
            courses,
            x1,
            y1,
            level,
        };
        pen.rect(e.m(0.0, level), e.m(x1, 0.0), Some(LIQUID), None)?;
        for c in &e.courses {
            pen.line(&[e.m(0.0, c.top()), e.m(x1, c.top())], &BOUNDARY)?;
        }
        Ok(e)
    }
    /// A point (thickness, elevation) in backend pixels.
    pub fn m(&self, x: f64, y: f64) -> (i32, i32) {
        self.plot.map_coordinate(&(x, y))
    }
    /// The courses, bottom first.
    pub fn courses(&self) -> &[CourseSpan] {
        &self.courses
    }
    /// A step line through each course at its thickness (one per course, bottom
    /// first), broken where a course has none: one path per unbroken run.
    pub fn steps(
        &self,
        v: &View,
        thickness: impl IntoIterator<Item = Option<Thickness>>,
    ) -> Vec<Vec<(i32, i32)>> {
        let mut paths: Vec<Vec<(i32, i32)>> = vec![Vec::new()];
        for (c, t) in self.courses.iter().zip(thickness) {
            match t {
                Some(t) => {
                    let x = v.thk(t);
                    if let Some(p) = paths.last_mut() {
                        p.push(self.m(x, c.bottom));
                        p.push(self.m(x, c.top()));
                    }
                }
                None => paths.push(Vec::new()),
            }
        }
        paths
    }
    /// The liquid level line across the plot.
    pub fn level_line(&self, pen: &Pen<DB>) -> DrawResult<DB> {
        pen.line(
            &[self.m(0.0, self.level), self.m(self.x1, self.level)],
            &LIQUID_LEVEL,
        )
    }
    /// The labels in the right margin: each course at its mid-height, and the liquid
    /// level as `level_text`.
    pub fn margin_labels(&self, pen: &Pen<DB>, level_text: String) -> DrawResult<DB> {
        let x1 = self.x1;
        let mut labels: Vec<MarginLabel> = self
            .courses
            .iter()
            .map(|c| MarginLabel {
                text: format!("course {}", c.number),
                y: self.m(x1, c.mid()).1,
                color: INK,
                marker: None,
            })
            .collect();
        labels.push(MarginLabel {
            text: level_text,
            y: self.m(x1, self.level).1,
            color: DEEP_BLUE,
            marker: None,
        });
        draw_margin_labels(
            pen,
            &labels,
            self.m(x1, 0.0).0 + pen.s(12.0),
            (self.m(x1, self.y1).1, self.m(x1, 0.0).1),
        )
    }
}

/// A label in a chart's right margin.
#[derive(Debug, Clone, PartialEq)]
pub struct MarginLabel {
    /// Text.
    pub text: String,
    /// Wanted vertical position, backend pixels.
    pub y: i32,
    /// Text colour.
    pub color: RGBColor,
    /// A marker drawn before the text (the series' own), if any.
    pub marker: Option<Marker>,
}

/// Draws labels in the margin right of `x_px`, moved apart so they never overlap.
pub fn draw_margin_labels<DB: DrawingBackend>(
    pen: &Pen<DB>,
    labels: &[MarginLabel],
    x_px: i32,
    (top, bottom): (i32, i32),
) -> DrawResult<DB> {
    let wanted: Vec<i32> = labels.iter().map(|l| l.y).collect();
    let placed = spread_labels(&wanted, pen.s(19.0), top, bottom);
    for (l, y) in labels.iter().zip(placed) {
        let mut x = x_px;
        if let Some(m) = &l.marker {
            pen.marker((x + pen.s(6.0), y), m)?;
            x += pen.s(16.0);
        }
        pen.text_px(
            &l.text,
            (x, y),
            SMALL_SIZE,
            l.color,
            (HPos::Left, VPos::Center),
        )?;
    }
    Ok(())
}

/// Vertical positions for labels wanted at `wanted` (backend pixels), moved apart
/// so that no two are closer than `gap`, keeping their order and staying within
/// `lo..=hi` where possible.
pub fn spread_labels(wanted: &[i32], gap: i32, lo: i32, hi: i32) -> Vec<i32> {
    let mut order: Vec<usize> = (0..wanted.len()).collect();
    order.sort_by_key(|&i| (wanted[i], i));
    let mut placed: Vec<i32> = order.iter().map(|&i| wanted[i].clamp(lo, hi)).collect();
    for j in 1..placed.len() {
        placed[j] = placed[j].max(placed[j - 1] + gap);
    }
    if let Some(&last) = placed.last()
        && last > hi
    {
        let shift = last - hi;
        for p in placed.iter_mut() {
            *p -= shift;
        }
        for j in (0..placed.len().saturating_sub(1)).rev() {
            placed[j] = placed[j].min(placed[j + 1] - gap);
        }
    }
    let mut out = vec![0; wanted.len()];
    for (slot, &i) in order.iter().enumerate() {
        out[i] = placed[slot];
    }
    out
}

/// The least and greatest of `values` (infinite, the wrong way round, when there
/// are none).
pub fn extent(values: &[f64]) -> (f64, f64) {
    let lo = values.iter().copied().fold(f64::INFINITY, f64::min);
    let hi = values.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    (lo, hi)
}

/// Pads a range by a fraction of its span (or by `min_pad` when it is empty).
pub fn padded(lo: f64, hi: f64, fraction: f64, min_pad: f64) -> (f64, f64) {
    let pad = ((hi - lo) * fraction).max(min_pad);
    (lo - pad, hi + pad)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn labels_keep_apart_and_order() {
        let y = spread_labels(&[100, 104, 300, 98], 20, 0, 400);
        // Sorted wanted: 98 (#3), 100 (#0), 104 (#1), 300 (#2).
        assert_eq!(y, [118, 138, 300, 98]);
        let y = spread_labels(&[395, 398], 20, 0, 400);
        assert_eq!(y, [380, 400]);
    }

    #[test]
    fn decimal_years() {
        let d = |y, m, dd| NaiveDate::from_ymd_opt(y, m, dd).expect("date");
        assert_eq!(year_of(d(2026, 1, 1)), 2026.0);
        // 2024 is a leap year: 1 July is day 182 (0-based) of 366.
        assert!((year_of(d(2024, 7, 1)) - (2024.0 + 182.0 / 366.0)).abs() < 1e-12);
    }

    /// Short entries share a row; a long one spans the columns it needs; no entry
    /// is wider than its cells.
    #[test]
    fn legend_grid() {
        register_font().expect("font");
        let e =
            |label: &str| LegendEntry::marker(label, Marker::new(Shape::Circle, INK, true, 3.0));
        let entries = [e("a"), e("b"), e("c"), e(&"long label ".repeat(8))];
        let width = 900.0;
        let g = legend_layout(&entries, width);
        let col_w = width / g.cols as f64;
        for (entry, &(col, _, span)) in entries.iter().zip(&g.cells) {
            assert!(col + span <= g.cols);
            let need = SAMPLE_W + SAMPLE_GAP + text_width(&entry.label, LABEL_SIZE) + ENTRY_GAP;
            assert!(need <= col_w * span as f64 + 1e-9, "{}", entry.label);
        }
        assert_eq!(g.cells[0].1, 0);
        assert!(g.rows >= 2, "the long entry needs a row of its own");
    }

    #[test]
    fn font_is_embedded_and_measures() {
        register_font().expect("font");
        assert!(text_width("Course 1", 15.0) > 30.0);
    }
}
