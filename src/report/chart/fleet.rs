//! The fleet page's two charts, drawn from the fleet series (`model::fleet`,
//! counted and ordered in `calc::fleet`): inspections due by month, and the remaining
//! life of each tank's governing course with the life under which a course is to be
//! monitored. Same font, palette, sizes and legend as the tank report's charts; bars
//! differ by colour and by lightness, so they read in grey print.

use chrono::{Datelike, NaiveDate};
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, VPos};

use super::draw::{
    Dash, DrawResult, LABEL_SIZE, LegendEntry, Marker, Pen, SMALL_SIZE, Shape, Stroke, TICK_SIZE,
    figure_size, legend_below, mesh, palette::*, register_font, text_width, year_of,
};
use super::{Chart, ChartError, Figure, Place, render};
use crate::calc::life::RemainingLife;
use crate::model::fleet::{FleetSeries, LifeBar, TankStatus};

/// File name of the due-date chart's PNG copy.
pub const DUE_FILE: &str = "inspections-due-by-month.png";
/// File name of the remaining-life chart's PNG copy.
pub const LIFE_FILE: &str = "remaining-life.png";

/// Renders the two charts (SVG and PNG each), due dates first.
pub fn render_fleet(s: &FleetSeries) -> Result<Vec<Chart>, ChartError> {
    register_font().map_err(|message| ChartError {
        chart: "font".to_string(),
        message,
    })?;
    let names = |id: &str, file: &str, title: &str| (id.into(), file.into(), title.into());
    Ok(vec![
        render(
            &DueChart(s),
            Place::Fleet,
            names(DueChart::ID, DUE_FILE, DueChart::TITLE),
        )?,
        render(
            &LifeChart(s),
            Place::Fleet,
            names(LifeChart::ID, LIFE_FILE, LifeChart::TITLE),
        )?,
    ])
}

const UT_FILL: RGBColor = DEEP_BLUE;
const EXTERNAL_FILL: RGBColor = ORANGE;
const UT_KEY: Marker = Marker::new(Shape::Square, UT_FILL, true, 6.0);
const EXTERNAL_KEY: Marker = Marker::new(Shape::Square, EXTERNAL_FILL, true, 6.0);

/// Inspections due per calendar month, stacked: UT surveys below, external
/// inspections above.
pub struct DueChart<'a>(pub &'a FleetSeries);

const DUE_PLOT_H: f64 = 430.0;

impl DueChart<'_> {
    fn legend(&self) -> Vec<LegendEntry> {
        vec![
            LegendEntry::marker("next UT thickness survey due", UT_KEY),
            LegendEntry::marker("next external inspection due", EXTERNAL_KEY),
        ]
    }
}

/// The first day of the month after `m`.
fn next_month(m: NaiveDate) -> NaiveDate {
    m.checked_add_months(chrono::Months::new(1)).unwrap_or(m)
}

impl Figure for DueChart<'_> {
    const ID: &'static str = "chart-due";
    const TITLE: &'static str = "Inspections due by month";

    fn size(&self) -> (u32, u32) {
        figure_size(DUE_PLOT_H, &self.legend())
    }

    fn draw<DB: DrawingBackend>(&self, pen: &Pen<DB>) -> DrawResult<DB> {
        let months = &self.0.due_months;
        let (Some(first), Some(last)) = (months.first(), months.last()) else {
            pen.title(Self::TITLE, "no tank has a due date")?;
            return Ok(());
        };
        let total: usize = months.iter().map(|m| m.ut + m.external).sum();
        pen.title(
            Self::TITLE,
            &format!(
                "{total} inspections from {} to {} · each tank's next UT survey and next \
                 external inspection",
                first.month.format("%Y-%m"),
                last.month.format("%Y-%m")
            ),
        )?;
        let most = months
            .iter()
            .map(|m| m.ut + m.external)
            .max()
            .unwrap_or(0)
            .max(1) as i32;
        let top = most + (most / 8).max(1);
        let (x0, x1) = (year_of(first.month), year_of(next_month(last.month)));
        let pad = (x1 - x0) * 0.01;
        let (x0, x1) = (x0 - pad, x1 + pad);
        let area = pen.plot_area(DUE_PLOT_H);
        let mut chart = ChartBuilder::on(&area)
            .margin_right(pen.s(24.0))
            .margin_top(pen.s(6.0))
            .x_label_area_size(pen.s(54.0))
            .y_label_area_size(pen.s(70.0))
            .build_cartesian_2d(x0..x1, 0i32..top)?;
        mesh(pen, &mut chart)
            .y_desc("Inspections due")
            .x_desc(if months.len() <= 36 { "Month" } else { "Year" })
            .x_labels(0)
            .y_labels((top as usize + 1).min(10))
            .y_label_formatter(&|v: &i32| v.to_string())
            .disable_x_mesh()
            .draw()?;
        let plot = chart.plotting_area();
        let m = |x: f64, y: i32| plot.map_coordinate(&(x, y));
        // Time ticks: every month (short spans, every third past a year), else every
        // January.
        let step = match months.len() {
            0..=12 => 1,
            13..=36 => 3,
            _ => 0,
        };
        for (i, dm) in months.iter().enumerate() {
            // Years: each January, and the first month when the next January is more
            // than half a year away (else the two labels would run into each other).
            let label = if step > 0 {
                (i % step == 0).then(|| dm.month.format("%Y-%m").to_string())
            } else {
                (dm.month.month() == 1 || (i == 0 && dm.month.month() <= 6))
                    .then(|| dm.month.year().to_string())
            };
            let Some(label) = label else { continue };
            let x = year_of(dm.month);
            let (px, py) = m(x, 0);
            pen.line(
                &[(px, py), (px, py + pen.s(5.0))],
                &Stroke::new(GREY, 1.0, Dash::Solid),
            )?;
            if step == 0 && i > 0 {
                pen.line(&[m(x, 0), m(x, top)], &Stroke::new(GRID, 1.0, Dash::Solid))?;
            }
            pen.text_px(
                &label,
                (px, py + pen.s(8.0)),
                TICK_SIZE,
                INK,
                (HPos::Center, VPos::Top),
            )?;
        }
        let labels = months.len() <= 36;
        for dm in months {
            let (a, b) = (year_of(dm.month), year_of(next_month(dm.month)));
            let gap = (b - a) * 0.12;
            let (a, b) = (a + gap, b - gap);
            let ut = dm.ut as i32;
            let all = ut + dm.external as i32;
            if dm.ut > 0 {
                pen.rect(m(a, 0), m(b, ut), Some(UT_FILL), None)?;
            }
            if dm.external > 0 {
                pen.rect(m(a, ut), m(b, all), Some(EXTERNAL_FILL), None)?;
            }
            if labels && all > 0 {
                let (px, py) = m((a + b) / 2.0, all);
                pen.text_px(
                    &all.to_string(),
                    (px, py - pen.s(4.0)),
                    SMALL_SIZE,
                    INK,
                    (HPos::Center, VPos::Bottom),
                )?;
            }
        }
        legend_below(pen, &self.legend(), DUE_PLOT_H)
    }
}

/// Each tank's governing course and its remaining life, least first, with the life
/// under which a course is to be monitored. Up to [`LABELLED_MAX`] tanks as one
/// labelled row each; more as a ranked profile without names.
pub struct LifeChart<'a>(pub &'a FleetSeries);

/// Most tanks drawn as labelled rows.
pub const LABELLED_MAX: usize = 40;
const ROW_H: f64 = 26.0;
const LIFE_AXES_H: f64 = 70.0;
const RANKED_PLOT_H: f64 = 460.0;
const LABEL_W: f64 = 150.0;
const VALUE_W: f64 = 230.0;

/// Courses to monitor: vermillion, dark in grey print.
const MONITOR_FILL: RGBColor = VERMILLION;
/// The others: a light tint of the palette's sky blue, light in grey print.
const OK_FILL: RGBColor = RGBColor(176, 214, 238);
const MONITOR_LINE: Stroke = Stroke::new(INK, 2.0, Dash::Long);
const BELOW: Marker = Marker::new(Shape::Triangle, VERMILLION, true, 6.0);
const MONITOR_KEY: Marker = Marker::new(Shape::Square, MONITOR_FILL, true, 6.0);
const OK_KEY: Marker = Marker::new(Shape::Square, OK_FILL, true, 6.0);

impl LifeChart<'_> {
    fn labelled(&self) -> bool {
        self.0.lives.len() <= LABELLED_MAX
    }
    fn plot_h(&self) -> f64 {
        if self.labelled() {
            self.0.lives.len().max(1) as f64 * ROW_H + LIFE_AXES_H
        } else {
            RANKED_PLOT_H
        }
    }
    fn legend(&self) -> Vec<LegendEntry> {
        let y = self.0.monitor_years;
        let mut e = vec![
            LegendEntry::marker(format!("under {y:.0} years: monitor"), MONITOR_KEY),
            LegendEntry::marker(format!("{y:.0} years or more"), OK_KEY),
            LegendEntry::line(format!("{y:.0} years"), MONITOR_LINE, None),
        ];
        if self
            .0
            .lives
            .iter()
            .any(|l| l.status == TankStatus::BelowMinimum)
        {
            e.push(LegendEntry::marker("a course below t_min", BELOW));
        }
        e
    }
    /// The longest life the axis shows: at least twice the monitoring life, at most
    /// ten times it, rounded up to ten years; longer bars are cut there and marked.
    fn axis_years(&self) -> f64 {
        let y = self.0.monitor_years;
        let longest = self
            .0
            .lives
            .iter()
            .filter_map(|l| l.life.and_then(RemainingLife::years))
            .fold(0.0, f64::max);
        ((longest.clamp(2.0 * y, 10.0 * y) / 10.0).ceil() * 10.0).max(10.0)
    }
}

/// The text beside a tank's bar.
fn life_label(l: &LifeBar) -> String {
    let course = l
        .governing_course
        .map(|c| format!(", course {c}"))
        .unwrap_or_default();
    match l.life {
        Some(RemainingLife::Years(y)) if l.status == TankStatus::BelowMinimum && y <= 0.0 => {
            format!("0 y: below t_min{course}")
        }
        Some(RemainingLife::Years(y)) => format!("{y:.1} y{course}"),
        Some(RemainingLife::NoMeasurableLoss) => "no measurable loss".to_string(),
        _ => "not computed (no corrosion rate)".to_string(),
    }
}

/// A label cut to `max` logical pixels at `size`, with an ellipsis.
fn fit_text(text: &str, size: f64, max: f64) -> String {
    if text_width(text, size) <= max {
        return text.to_string();
    }
    let mut t: String = text.to_string();
    while !t.is_empty() && text_width(&format!("{t}…"), size) > max {
        t.pop();
    }
    format!("{t}…")
}

impl Figure for LifeChart<'_> {
    const ID: &'static str = "chart-life";
    const TITLE: &'static str = "Remaining life of each tank's governing course";

    fn size(&self) -> (u32, u32) {
        figure_size(self.plot_h(), &self.legend())
    }

    fn draw<DB: DrawingBackend>(&self, pen: &Pen<DB>) -> DrawResult<DB> {
        let lives = &self.0.lives;
        let monitor = self.0.monitor_years;
        let under = lives
            .iter()
            .filter(|l| {
                l.life
                    .and_then(RemainingLife::years)
                    .is_some_and(|y| y < monitor)
            })
            .count();
        let subtitle = match lives.len() {
            0 => "no tank assessed".to_string(),
            1 => format!("1 tank · {under} under {monitor:.0} years"),
            n => format!("{n} tanks, least first · {under} under {monitor:.0} years"),
        };
        pen.title(Self::TITLE, &subtitle)?;
        let axis = self.axis_years();
        let plot_h = self.plot_h();
        let area = pen.plot_area(plot_h);
        let fill_of = |y: f64| if y < monitor { MONITOR_FILL } else { OK_FILL };
        if self.labelled() {
            let n = lives.len().max(1) as f64;
            let mut chart = ChartBuilder::on(&area)
                .margin_right(pen.s(VALUE_W))
                .margin_top(pen.s(6.0))
                .x_label_area_size(pen.s(50.0))
                .y_label_area_size(pen.s(LABEL_W))
                .build_cartesian_2d(0.0..axis, 0.5..n + 0.5)?;
            mesh(pen, &mut chart)
                .x_desc("Remaining life of the governing course (years)")
                .x_labels(10)
                .y_labels(0)
                .x_label_formatter(&|t: &f64| format!("{t:.0}"))
                .disable_y_mesh()
                .draw()?;
            let plot = chart.plotting_area();
            let m = |x: f64, y: f64| plot.map_coordinate(&(x, y));
            for (i, l) in lives.iter().enumerate() {
                let row = n - i as f64;
                let (lx, ly) = m(0.0, row);
                pen.text_px(
                    &fit_text(&l.tank_id, TICK_SIZE, LABEL_W - 18.0),
                    (lx - pen.s(10.0), ly),
                    TICK_SIZE,
                    INK,
                    (HPos::Right, VPos::Center),
                )?;
                let mut end = m(0.0, row).0;
                if let Some(y) = l.life.and_then(RemainingLife::years) {
                    let shown = y.clamp(0.0, axis);
                    if shown > 0.0 {
                        pen.rect(
                            m(0.0, row - 0.32),
                            m(shown, row + 0.32),
                            Some(fill_of(y)),
                            None,
                        )?;
                        end = m(shown, row).0;
                    }
                    if l.status == TankStatus::BelowMinimum {
                        pen.marker(m(0.0, row), &BELOW)?;
                    }
                }
                let cut = l
                    .life
                    .and_then(RemainingLife::years)
                    .is_some_and(|y| y > axis);
                let text = format!("{}{}", if cut { "» " } else { "" }, life_label(l));
                // Clear of the monitoring line when the label would cross it.
                let line_x = m(monitor, row).0;
                let mut start = end + pen.s(8.0);
                let width = pen.s(text_width(&text, SMALL_SIZE));
                if start <= line_x + pen.s(3.0) && start + width >= line_x - pen.s(3.0) {
                    start = start.max(line_x + pen.s(8.0));
                }
                pen.text_px(
                    &text,
                    (start, ly),
                    SMALL_SIZE,
                    if l.life.and_then(RemainingLife::years).is_some() {
                        INK
                    } else {
                        GREY
                    },
                    (HPos::Left, VPos::Center),
                )?;
            }
            let (mx, top) = m(monitor, n + 0.5);
            pen.line(&[(mx, top), m(monitor, 0.5)], &MONITOR_LINE)?;
        } else {
            let n = lives.len() as f64;
            let mut chart = ChartBuilder::on(&area)
                .margin_right(pen.s(24.0))
                .margin_top(pen.s(6.0))
                .x_label_area_size(pen.s(50.0))
                .y_label_area_size(pen.s(70.0))
                .build_cartesian_2d(0.5..n + 0.5, 0.0..axis)?;
            mesh(pen, &mut chart)
                .x_desc("Tanks, least remaining life first (rank)")
                .y_desc("Remaining life (years)")
                .x_labels(10)
                .y_labels(10)
                .x_label_formatter(&|t: &f64| format!("{t:.0}"))
                .y_label_formatter(&|t: &f64| format!("{t:.0}"))
                .draw()?;
            let plot = chart.plotting_area();
            let m = |x: f64, y: f64| plot.map_coordinate(&(x, y));
            for (i, l) in lives.iter().enumerate() {
                let x = i as f64 + 1.0;
                if let Some(y) = l.life.and_then(RemainingLife::years) {
                    let shown = y.clamp(0.0, axis);
                    if shown > 0.0 {
                        pen.rect(m(x - 0.5, 0.0), m(x + 0.5, shown), Some(fill_of(y)), None)?;
                    }
                }
            }
            pen.line(&[m(0.5, monitor), m(n + 0.5, monitor)], &MONITOR_LINE)?;
            let (rx, ry) = m(n + 0.5, monitor);
            pen.text_px(
                &format!("{monitor:.0} years"),
                (rx - pen.s(4.0), ry - pen.s(4.0)),
                LABEL_SIZE,
                INK,
                (HPos::Right, VPos::Bottom),
            )?;
            let not_finite = lives
                .iter()
                .filter(|l| l.life.and_then(RemainingLife::years).is_none())
                .count();
            let beyond = lives
                .iter()
                .filter(|l| {
                    l.life
                        .and_then(RemainingLife::years)
                        .is_some_and(|y| y > axis)
                })
                .count();
            let (lx, ly) = m(0.5, axis);
            pen.text_px(
                &format!(
                    "bars cut at {axis:.0} years: {beyond} longer; {not_finite} with no \
                     measurable loss or no rate (no bar)"
                ),
                (lx + pen.s(8.0), ly + pen.s(6.0)),
                SMALL_SIZE,
                GREY,
                (HPos::Left, VPos::Top),
            )?;
        }
        legend_below(pen, &self.legend(), plot_h)
    }
}
