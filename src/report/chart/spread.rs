//! Distribution of the readings of each course at its latest survey: every reading
//! as a dot (suspect readings marked), a box of the quartiles with the median and
//! whiskers to the least and greatest reading, the nominal thickness and t_min.

use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, VPos};

use super::draw::{
    Dash, DrawResult, LegendEntry, Marker, Pen, SMALL_SIZE, Shape, Stroke, TICK_SIZE, extent,
    figure_size, legend_below, mesh, padded, palette::*, tick_format,
};
use super::{Figure, Inputs};

/// The chart.
pub struct Spread<'a>(pub Inputs<'a>);

const ROW_H: f64 = 74.0;
const AXES_H: f64 = 66.0;
const RIGHT: f64 = 170.0;
const LEFT: f64 = 96.0;
/// Rows of dots under the box, so that equal readings do not hide each other.
const LANES: usize = 4;

const DOT: Marker = Marker::new(Shape::Circle, GREY, false, 3.0).see_through();
const SUSPECT: Marker = Marker::new(Shape::Triangle, VERMILLION, true, 5.5);
const BOX: Stroke = Stroke::new(DEEP_BLUE, 1.8, Dash::Solid);
const BOX_FILL: RGBColor = RGBColor(221, 236, 247);
const MEDIAN: Stroke = Stroke::new(INK, 2.6, Dash::Solid);
const NOMINAL: Stroke = Stroke::new(GREY, 2.0, Dash::Long);
const T_MIN: Stroke = Stroke::new(VERMILLION, 3.0, Dash::Solid);
const BAND: Stroke = Stroke::new(GRID, 1.0, Dash::Solid);

impl Spread<'_> {
    fn legend(&self) -> Vec<LegendEntry> {
        vec![
            LegendEntry::marker("reading", DOT),
            LegendEntry::marker(
                "suspect reading (over 110 % or under 50 % of nominal), kept",
                SUSPECT,
            ),
            LegendEntry::line(
                "quartiles (box), median (bar), least and greatest (whiskers)",
                BOX,
                Some(Marker::new(Shape::Square, DEEP_BLUE, false, 5.0)),
            ),
            LegendEntry::line("nominal thickness", NOMINAL, None),
            LegendEntry::line("t_min", T_MIN, None),
        ]
    }
    fn plot_h(&self) -> f64 {
        self.0.a.courses.len().max(1) as f64 * ROW_H + AXES_H
    }
}

impl Figure for Spread<'_> {
    const ID: &'static str = "chart-spread";
    const TITLE: &'static str = "Readings of each course at its latest survey";

    fn size(&self) -> (u32, u32) {
        figure_size(self.plot_h(), &self.legend())
    }

    fn draw<DB: DrawingBackend>(&self, pen: &Pen<DB>) -> DrawResult<DB> {
        let Inputs { a, s, v } = self.0;
        pen.title(
            Self::TITLE,
            &format!(
                "Tank {} · one row per course, bottom course at the bottom · thickness in {}",
                a.tank.id,
                v.to.thickness_unit()
            ),
        )?;
        let n = a.courses.len().max(1);
        let mut xs: Vec<f64> = Vec::new();
        for (c, cs) in a.courses.iter().zip(&s.courses) {
            xs.push(v.thk(c.nominal_thickness));
            xs.push(v.thk(c.t_min.value));
            xs.extend(cs.latest.iter().map(|r| v.thk(r.thickness)));
        }
        let (lo, hi) = extent(&xs);
        let (x0, x1) = padded(lo, hi, 0.04, hi.abs() * 0.01 + 1e-9);
        let (y0, y1) = (0.5, n as f64 + 0.5);
        let plot_h = self.plot_h();
        let area = pen.plot_area(plot_h);
        let mut chart = ChartBuilder::on(&area)
            .margin_right(pen.s(RIGHT))
            .margin_top(pen.s(6.0))
            .x_label_area_size(pen.s(50.0))
            .y_label_area_size(pen.s(LEFT))
            .build_cartesian_2d(x0..x1, y0..y1)?;
        let xfmt = tick_format(x1 - x0);
        mesh(pen, &mut chart)
            .x_desc(format!("Thickness ({})", v.to.thickness_unit()))
            .x_labels(10)
            .y_labels(0)
            .x_label_formatter(&xfmt)
            .draw()?;
        let plot = chart.plotting_area();
        let m = |x: f64, y: f64| plot.map_coordinate(&(x, y));
        for (c, cs) in a.courses.iter().zip(&s.courses) {
            let y = f64::from(c.number);
            pen.line(&[m(x0, y - 0.5), m(x1, y - 0.5)], &BAND)?;
            let nominal = v.thk(c.nominal_thickness);
            let t_min = v.thk(c.t_min.value);
            pen.line(&[m(nominal, y - 0.44), m(nominal, y + 0.44)], &NOMINAL)?;
            pen.line(&[m(t_min, y - 0.44), m(t_min, y + 0.44)], &T_MIN)?;
            if let Some(f) = cs.spread {
                let (q1, q3) = (v.thk(f.q1), v.thk(f.q3));
                let (mn, md, mx) = (v.thk(f.min), v.thk(f.median), v.thk(f.max));
                let (b0, b1, mid) = (y + 0.08, y + 0.38, y + 0.23);
                pen.line(&[m(mn, mid), m(q1, mid)], &BOX)?;
                pen.line(&[m(q3, mid), m(mx, mid)], &BOX)?;
                for w in [mn, mx] {
                    pen.line(&[m(w, mid - 0.08), m(w, mid + 0.08)], &BOX)?;
                }
                pen.rect(m(q1, b1), m(q3, b0), Some(BOX_FILL), Some(&BOX))?;
                pen.line(&[m(md, b0), m(md, b1)], &MEDIAN)?;
            }
            for (i, r) in cs.latest.iter().enumerate() {
                if r.suspect.is_none() {
                    let lane = y - 0.1 - 0.09 * (i % LANES) as f64;
                    pen.marker(m(v.thk(r.thickness), lane), &DOT)?;
                }
            }
            let mut suspects = 0;
            for (i, r) in cs.latest.iter().enumerate() {
                if r.suspect.is_some() {
                    suspects += 1;
                    let lane = y - 0.1 - 0.09 * (i % LANES) as f64;
                    pen.marker(m(v.thk(r.thickness), lane), &SUSPECT)?;
                }
            }
            let (lx, ly) = m(x0, y);
            pen.text_px(
                &format!("course {}", c.number),
                (lx - pen.s(12.0), ly),
                TICK_SIZE,
                INK,
                (HPos::Right, VPos::Center),
            )?;
            let mut lines: Vec<(String, RGBColor)> = Vec::new();
            match c.condition.as_ref() {
                None => lines.push(("no readings".to_string(), INK)),
                Some(k) => {
                    let date = k.latest.date.format("%Y-%m-%d");
                    lines.push((format!("{} readings, {date}", k.latest.count), INK));
                    if let Some(cov) = k.latest.cov {
                        lines.push((format!("COV {cov:.3}"), GREY));
                    }
                    if suspects > 0 {
                        lines.push((format!("{suspects} suspect"), VERMILLION));
                    }
                }
            }
            let (rx, ry) = m(x1, y);
            let first = -9.0 * (lines.len() as f64 - 1.0);
            for (j, (line, color)) in lines.iter().enumerate() {
                pen.text_px(
                    line,
                    (rx + pen.s(10.0), ry + pen.s(first + 18.0 * j as f64)),
                    SMALL_SIZE,
                    *color,
                    (HPos::Left, VPos::Center),
                )?;
            }
        }
        legend_below(pen, &self.legend(), plot_h)
    }
}
