//! Allowable liquid level over the coming years: the level each course allows as it
//! thins at its governing rate, their least (the tank's allowable level), the
//! operating maximum liquid level and the top of the shell.

use plotters::prelude::*;

use super::draw::{
    Dash, DrawResult, LegendEntry, MarginLabel, Marker, Pen, Shape, Stroke, course_look,
    draw_margin_labels, extent, figure_size, legend_below, mesh, padded, palette::*, tick_format,
    year_of,
};
use super::{Figure, Inputs};

/// The chart.
pub struct FillOutlookChart<'a>(pub Inputs<'a>);

const PLOT_H: f64 = 560.0;
const RIGHT: f64 = 180.0;
/// A course marker every this many outlook steps.
const MARK_EVERY: usize = 8;

const ENVELOPE: Stroke = Stroke::new(INK, 3.8, Dash::Solid);
const OPERATING: Stroke = Stroke::new(VERMILLION, 2.6, Dash::Long);
const SHELL: Stroke = Stroke::new(GREY, 2.0, Dash::Dot);
const NEXT_UT: Stroke = Stroke::new(GREY, 1.6, Dash::Short);
const UNTIL: Marker = Marker::new(Shape::Diamond, VERMILLION, true, 6.5);
const UNTIL_LINE: Stroke = Stroke::new(VERMILLION, 1.3, Dash::Dot);

impl FillOutlookChart<'_> {
    fn legend(&self) -> Vec<LegendEntry> {
        let Inputs { a, s, v } = self.0;
        let o = &s.fill_outlook;
        let mut e: Vec<LegendEntry> = self
            .series()
            .into_iter()
            .enumerate()
            .map(|(i, (label, _))| {
                let (stroke, marker) = course_look(i);
                LegendEntry::line(label, stroke, Some(marker))
            })
            .collect();
        e.push(LegendEntry::line(
            if o.areas.is_empty() {
                "tank: least over courses"
            } else {
                "tank: least over courses and areas"
            },
            ENVELOPE,
            None,
        ));
        e.push(LegendEntry::line(
            format!("operating maximum {}", v.len_text(a.tank.max_fill_height)),
            OPERATING,
            None,
        ));
        e.push(LegendEntry::line(
            format!("top of the shell {}", v.len_text(a.tank.shell_height())),
            SHELL,
            None,
        ));
        if let Some(d) = a.summary.next_ut_inspection.filter(|d| *d <= s.horizon) {
            e.push(LegendEntry::vertical(
                format!("next UT survey due {d}"),
                NEXT_UT,
            ));
        }
        if let Some(u) = o.operating_level_until.filter(|u| u.date <= s.horizon) {
            e.push(LegendEntry::marker(
                format!(
                    "operating maximum no longer allowed from about {} ({})",
                    u.date.format("%Y-%m"),
                    if u.area.is_some() {
                        format!("scanned area, course {}", u.course)
                    } else {
                        format!("course {}", u.course)
                    }
                ),
                UNTIL,
            ));
        }
        e
    }

    /// Every line of the chart but the tank's: each course, then each scanned area,
    /// with its label and its levels.
    fn series(&self) -> Vec<(String, &[Option<crate::calc::units::Length>])> {
        let o = &self.0.s.fill_outlook;
        o.courses
            .iter()
            .map(|c| (format!("course {}", c.course), c.levels.as_slice()))
            .chain(o.areas.iter().map(|x| {
                (
                    format!("scanned area, course {}", x.course),
                    x.levels.as_slice(),
                )
            }))
            .collect()
    }
}

impl Figure for FillOutlookChart<'_> {
    const ID: &'static str = "chart-fill";
    const TITLE: &'static str = "Allowable liquid level over the coming years";

    fn size(&self) -> (u32, u32) {
        figure_size(PLOT_H, &self.legend())
    }

    fn draw<DB: DrawingBackend>(&self, pen: &Pen<DB>) -> DrawResult<DB> {
        let Inputs { a, s, v } = self.0;
        let o = &s.fill_outlook;
        pen.title(
            Self::TITLE,
            &format!(
                "Tank {} · SG {} · each course thinning at its governing rate from {}",
                a.tank.id,
                crate::report::verdict::sg_text(a.tank.specific_gravity),
                s.start
            ),
        )?;
        let operating = v.len(a.tank.max_fill_height);
        let shell = v.len(a.tank.shell_height());
        let mut ys = vec![operating, shell];
        for (_, levels) in self.series() {
            ys.extend(levels.iter().flatten().map(|l| v.len(*l)));
        }
        let (lo, hi) = extent(&ys);
        let (y0, y1) = padded(lo, hi, 0.06, 0.5);
        let y0 = y0.max(0.0);
        let (x0, x1) = (year_of(s.start), year_of(s.horizon));
        let (x0, x1) = (x0 - 0.3, x1 + 0.3);
        let area = pen.plot_area(PLOT_H);
        let mut chart = ChartBuilder::on(&area)
            .margin_right(pen.s(RIGHT))
            .margin_top(pen.s(6.0))
            .x_label_area_size(pen.s(50.0))
            .y_label_area_size(pen.s(76.0))
            .build_cartesian_2d(x0..x1, y0..y1)?;
        let yfmt = tick_format(y1 - y0);
        let xfmt = |t: &f64| format!("{t:.0}");
        mesh(pen, &mut chart)
            .x_desc("Year")
            .y_desc(format!(
                "Liquid level above the tank bottom ({})",
                v.to.length_unit()
            ))
            .x_labels(10)
            .y_labels(10)
            .x_label_formatter(&xfmt)
            .y_label_formatter(&yfmt)
            .draw()?;
        let plot = chart.plotting_area();
        let m = |x: f64, y: f64| plot.map_coordinate(&(x, y));
        pen.line(&[m(x0, shell), m(x1, shell)], &SHELL)?;
        pen.line(&[m(x0, operating), m(x1, operating)], &OPERATING)?;
        if let Some(d) = a.summary.next_ut_inspection.filter(|d| *d <= s.horizon) {
            pen.line(&[m(year_of(d), y0), m(year_of(d), y1)], &NEXT_UT)?;
        }
        let xs: Vec<f64> = o.dates.iter().map(|d| year_of(*d)).collect();
        let mut labels: Vec<MarginLabel> = Vec::new();
        for (i, (label, levels)) in self.series().into_iter().enumerate() {
            let (stroke, marker) = course_look(i);
            let pts: Vec<(i32, i32)> = xs
                .iter()
                .zip(levels)
                .filter_map(|(x, l)| l.map(|l| m(*x, v.len(l))))
                .collect();
            pen.line(&pts, &stroke)?;
            // Markers staggered by series so that they do not sit on one another.
            let offset = (i * 3) % MARK_EVERY;
            for (j, p) in pts.iter().enumerate() {
                if j % MARK_EVERY == offset || pts.len() == 1 {
                    pen.marker(*p, &marker)?;
                }
            }
            if let Some(last) = pts.last() {
                labels.push(MarginLabel {
                    text: label.replace("scanned area, course", "area, course"),
                    y: last.1,
                    color: INK,
                    marker: Some(marker),
                });
            }
        }
        let env: Vec<(i32, i32)> = xs
            .iter()
            .zip(&o.envelope)
            .filter_map(|(x, l)| l.map(|l| m(*x, v.len(l.level))))
            .collect();
        pen.line(&env, &ENVELOPE)?;
        if let Some(u) = o.operating_level_until.filter(|u| u.date <= s.horizon) {
            let at = m(year_of(u.date), operating);
            pen.line(&[m(year_of(u.date), y0), at], &UNTIL_LINE)?;
            pen.marker(at, &UNTIL)?;
        }
        labels.push(MarginLabel {
            text: format!("operating {}", v.len_text(a.tank.max_fill_height)),
            y: m(x1, operating).1,
            color: VERMILLION,
            marker: None,
        });
        labels.push(MarginLabel {
            text: format!("shell top {}", v.len_text(a.tank.shell_height())),
            y: m(x1, shell).1,
            color: GREY,
            marker: None,
        });
        draw_margin_labels(
            pen,
            &labels,
            m(x1, y0).0 + pen.s(10.0),
            (m(x1, y1).1, m(x1, y0).1),
        )?;
        legend_below(pen, &self.legend(), PLOT_H)
    }
}
