//! Thickness history and projection, one panel per course: every reading of every
//! survey, the basis thickness of each survey, the least-squares line (3 or more
//! surveys), the projection at the governing rate from the latest basis thickness,
//! t_min, the nominal thickness, and the date the projection meets t_min.

use plotters::coord::Shift;
use plotters::prelude::*;

use super::draw::{
    Dash, DrawResult, LegendEntry, Marker, Panels, Pen, Shape, Stroke, extent, figure_size,
    legend_below, mesh, padded, palette::*, tick_format, year_of,
};
use super::{Figure, Inputs};
use crate::calc::life::{RemainingLife, Status};
use crate::model::result::CourseResult;
use crate::model::series::CourseSeries;

/// The chart.
pub struct History<'a>(pub Inputs<'a>);

const PANEL_H: f64 = 285.0;

const READING: Marker = Marker::new(Shape::Circle, LIGHT, false, 2.6).see_through();
const BASIS: Marker = Marker::new(Shape::Circle, INK, true, 4.2);
const BASIS_LINE: Stroke = Stroke::new(INK, 1.3, Dash::Solid);
const INITIAL: Marker = Marker::new(Shape::Square, INK, false, 4.5);
const INITIAL_LINE: Stroke = Stroke::new(GREY, 1.3, Dash::Dot);
const NOMINAL: Stroke = Stroke::new(GREY, 1.5, Dash::Long);
const T_MIN: Stroke = Stroke::new(VERMILLION, 2.2, Dash::Short);
const FIT: Stroke = Stroke::new(DEEP_BLUE, 2.2, Dash::Long);
const PROJECTION: Stroke = Stroke::new(ORANGE, 3.0, Dash::Solid);
const MEETS: Marker = Marker::new(Shape::Diamond, VERMILLION, true, 6.0);
const MEETS_LINE: Stroke = Stroke::new(VERMILLION, 1.5, Dash::Short);

impl History<'_> {
    fn panels(&self) -> Panels {
        Panels {
            count: self.0.a.courses.len(),
            height: PANEL_H,
        }
    }
    fn legend(&self) -> Vec<LegendEntry> {
        let s = self.0.s;
        let basis = match self.0.a.tank.thickness_basis {
            crate::model::tank::ThicknessBasis::Minimum => "least reading",
            crate::model::tank::ThicknessBasis::Average => "mean reading",
        };
        let mut e = vec![
            LegendEntry::marker("reading", READING),
            LegendEntry::line(
                format!("basis thickness of a survey ({basis})"),
                BASIS_LINE,
                Some(BASIS),
            ),
        ];
        if s.courses.iter().any(|c| c.assumed_initial.is_some()) {
            e.push(LegendEntry::line(
                "nominal assumed at the in-service date",
                INITIAL_LINE,
                Some(INITIAL),
            ));
        }
        if s.courses.iter().any(|c| c.regression_line.is_some()) {
            e.push(LegendEntry::line(
                "least-squares fit, carried forward",
                FIT,
                None,
            ));
        }
        if s.courses.iter().any(|c| c.projection.is_some()) {
            e.push(LegendEntry::line(
                "projection at the governing rate",
                PROJECTION,
                None,
            ));
        }
        e.push(LegendEntry::line("t_min", T_MIN, None));
        if s.courses
            .iter()
            .any(|c| c.projection.is_some_and(|p| p.reaches_t_min.is_some()))
        {
            e.push(LegendEntry::marker("projection meets t_min", MEETS));
        }
        e.push(LegendEntry::line("nominal thickness", NOMINAL, None));
        e
    }
}

impl Figure for History<'_> {
    const ID: &'static str = "chart-history";
    const TITLE: &'static str = "Thickness history and projection, by course";

    fn size(&self) -> (u32, u32) {
        figure_size(self.panels().plot_h(), &self.legend())
    }

    fn draw<DB: DrawingBackend>(&self, pen: &Pen<DB>) -> DrawResult<DB> {
        let Inputs { a, v, .. } = self.0;
        pen.title(
            Self::TITLE,
            &format!(
                "Tank {} · surveys to {} · thickness in {}",
                a.tank.id,
                a.latest_survey,
                v.to.thickness_unit()
            ),
        )?;
        let panels = self.panels();
        for (i, (c, cs)) in a.courses.iter().zip(&self.0.s.courses).enumerate() {
            let area = panels.panel(pen, panels.cell(i), &self.caption(c, cs))?;
            self.panel(pen, c, cs, &area)?;
        }
        legend_below(pen, &self.legend(), panels.plot_h())
    }
}

impl History<'_> {
    fn caption(&self, c: &CourseResult, cs: &CourseSeries) -> String {
        let Inputs { v, .. } = self.0;
        let n = c.number;
        let t_min = v.thk_text(c.t_min.value);
        let Some(k) = c.condition.as_ref() else {
            return format!("Course {n} · t_min {t_min} · no readings");
        };
        if k.status == Status::BelowMinimum {
            return format!("Course {n} · t_min {t_min} · below t_min now");
        }
        match (k.remaining_life, k.retirement_date) {
            (RemainingLife::Years(_), Some(d)) => {
                if cs.projection.is_some_and(|p| p.reaches_t_min.is_some()) {
                    format!(
                        "Course {n} · t_min {t_min} · meets it ≈{}",
                        d.format("%Y-%m")
                    )
                } else {
                    format!("Course {n} · t_min {t_min} · meets it ≈{}", d.format("%Y"))
                }
            }
            (RemainingLife::NoMeasurableLoss, _) => {
                format!("Course {n} · t_min {t_min} · no thinning")
            }
            _ => format!("Course {n} · t_min {t_min} · no rate"),
        }
    }

    fn panel<DB: DrawingBackend>(
        &self,
        pen: &Pen<DB>,
        c: &CourseResult,
        cs: &CourseSeries,
        area: &DrawingArea<DB, Shift>,
    ) -> DrawResult<DB> {
        let Inputs { s, v, .. } = self.0;
        let t_min = v.thk(c.t_min.value);
        let nominal = v.thk(c.nominal_thickness);
        // Ranges: every value drawn.
        let mut ys = vec![t_min, nominal];
        let mut x0 = year_of(s.start);
        for sv in &cs.surveys {
            x0 = x0.min(year_of(sv.date));
            ys.extend(sv.readings.iter().map(|t| v.thk(*t)));
            ys.push(v.thk(sv.basis));
        }
        if let Some((d, t)) = cs.assumed_initial {
            x0 = x0.min(year_of(d));
            ys.push(v.thk(t));
        }
        for l in [cs.projection, cs.regression_line].into_iter().flatten() {
            ys.push(v.thk(l.start.1));
            ys.push(v.thk(l.end.1));
        }
        let (lo, hi) = extent(&ys);
        let (y0, y1) = padded(lo, hi, 0.08, hi.abs() * 0.01 + 1e-9);
        let x1 = year_of(s.horizon);
        let (x0, x1) = padded(x0, x1, 0.03, 0.5);
        let mut chart = ChartBuilder::on(area)
            .margin_right(pen.s(14.0))
            .margin_top(pen.s(4.0))
            .x_label_area_size(pen.s(46.0))
            .y_label_area_size(pen.s(70.0))
            .build_cartesian_2d(x0..x1, y0..y1)?;
        let yfmt = tick_format(y1 - y0);
        let xfmt = |t: &f64| format!("{t:.0}");
        mesh(pen, &mut chart)
            .x_desc("Year")
            .y_desc(format!("Thickness ({})", v.to.thickness_unit()))
            .x_labels(6)
            .y_labels(6)
            .x_label_formatter(&xfmt)
            .y_label_formatter(&yfmt)
            .draw()?;
        let plot = chart.plotting_area();
        let m = |xv: f64, yv: f64| plot.map_coordinate(&(xv, yv));
        pen.line(&[m(x0, nominal), m(x1, nominal)], &NOMINAL)?;
        pen.line(&[m(x0, t_min), m(x1, t_min)], &T_MIN)?;
        for sv in &cs.surveys {
            for t in &sv.readings {
                pen.marker(m(year_of(sv.date), v.thk(*t)), &READING)?;
            }
        }
        if let (Some((d, t)), Some(first)) = (cs.assumed_initial, cs.surveys.first()) {
            let a0 = m(year_of(d), v.thk(t));
            pen.line(
                &[a0, m(year_of(first.date), v.thk(first.basis))],
                &INITIAL_LINE,
            )?;
            pen.marker(a0, &INITIAL)?;
        }
        let basis: Vec<(i32, i32)> = cs
            .surveys
            .iter()
            .map(|sv| m(year_of(sv.date), v.thk(sv.basis)))
            .collect();
        pen.line(&basis, &BASIS_LINE)?;
        if let Some(l) = cs.regression_line {
            pen.line(
                &[
                    m(year_of(l.start.0), v.thk(l.start.1)),
                    m(year_of(l.end.0), v.thk(l.end.1)),
                ],
                &FIT,
            )?;
        }
        if let Some(l) = cs.projection {
            pen.line(
                &[
                    m(year_of(l.start.0), v.thk(l.start.1)),
                    m(year_of(l.end.0), v.thk(l.end.1)),
                ],
                &PROJECTION,
            )?;
        }
        for p in &basis {
            pen.marker(*p, &BASIS)?;
        }
        if let Some(d) = cs.projection.and_then(|p| p.reaches_t_min) {
            let at = m(year_of(d), t_min);
            pen.line(&[m(year_of(d), y0), at], &MEETS_LINE)?;
            pen.marker(at, &MEETS)?;
        }
        Ok(())
    }
}
